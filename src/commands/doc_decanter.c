/* The decanter command's computation and its `--json` document (moved from
 * src/cli/cmd_decanter.c). */
#include <pinchwise/commands.h>
#include <pinchwise/design_doc.h>

pw_status pw_decanter_run(const pw_system *sys, const pw_decanter_spec *spec,
                          const pw_column_options *opt, const char *where, pw_decanter_result *r,
                          pw_error *err)
{
    pw_status st = pw_decanter_solve(sys, spec, opt, r);
    bool cooled = spec->T_decanter_K > 0.0;
    bool if97 = sys->comp[0].equation == PW_PSAT_IAPWS_IF97
                || sys->comp[1].equation == PW_PSAT_IAPWS_IF97;
    if (st == PW_ERANGE)
        pw_error_set(err, st, where, 0,
                     "decanter scheme at P = %.6g kPa: a temperature the scheme needs lies outside "
                     "a component's vapor-pressure range%s: this pressure is too far from the data",
                     spec->P_Pa / 1000.0,
                     if97 ? " (water's IAPWS-IF97 equation, the one that is not extrapolated, "
                            "covers 273.15 to 647.096 K)"
                          : "");
    else if (st == PW_EDOM && cooled)
        pw_error_set(err, st, where, 0,
                     "decanter scheme: the model cannot be evaluated at the decanter temperature "
                     "%.6g K (or at a temperature of the scheme at P = %.6g kPa): %s",
                     spec->T_decanter_K, spec->P_Pa / 1000.0, pw_strerror(st));
    else if (st != PW_OK)
        pw_error_set(err, st, where, 0, "decanter scheme at P = %.6g kPa: %s",
                     spec->P_Pa / 1000.0, pw_strerror(st));
    return st;
}

/* A duty in kJ per mole of feed, or null when the duties were not computed. */
static json_t *kj(const pw_decanter_result *r, double J)
{
    return r->duties ? pw_json_num(J / 1e3) : json_null();
}

static json_t *column_json(const pw_decanter_result *r, int col, double bottom)
{
    const pw_stripper_result *c = &r->col[col];
    double top = r->top_x1[col];
    json_t *d = json_array();
    for (size_t i = 0; i < c->n_design; i++)
        json_array_append_new(
            d, json_pack("{s:o,s:o,s:o,s:o,s:o,s:o,s:o,s:o}", "factor",
                         pw_json_num(c->design[i].factor), "boilup",
                         pw_json_num(c->design[i].boilup), "stages",
                         pw_json_num(c->design[i].stages), "top_vapor_x1",
                         pw_json_num(c->design[i].y_top), "vapor_per_mol_feed",
                         pw_json_num(r->vapor_per_mol_feed[col][i]), "layer_per_mol_feed",
                         pw_json_num(r->layer_per_mol_feed[col][i]), "reboiler_kJ_per_mol_feed",
                         kj(r, r->reboiler_J[col][i]), "reheat_kJ_per_mol_feed",
                         kj(r, r->reheat_J[col][i])));
    return json_pack("{s:o,s:o,s:o,s:o,s:o,s:{s:s,s:o,s:o}}", "bottoms_x1", pw_json_num(bottom),
                     "top_x1", pw_json_num(top), "boilup_min", pw_json_num(c->boilup_min), "n_min",
                     pw_json_num(c->n_min), "design", d, "pinch", "kind",
                     c->tangent ? "tangent" : "top", "x", pw_json_num(c->x_pinch), "y",
                     pw_json_num(c->y_pinch));
}

json_t *pw_decanter_doc(const pw_decanter_result *r, const pw_decanter_spec *spec)
{
    const pw_three_phase *tp = &r->decanter;
    json_t *o = json_object();
    json_object_set_new(o, "feasible", json_boolean(r->feasible));
    json_object_set_new(o, "reason", r->feasible ? json_null() : pw_json_reason(r->reason));
    /* the decanter (at T3 unless cooled) and the three-phase state itself */
    json_object_set_new(o, "decanter",
                        tp->exists
                            ? json_pack("{s:o,s:[o,o],s:o,s:b}", "T_K",
                                        pw_json_num(r->T_decanter_K), "x1_layers",
                                        pw_json_num(r->top_x1[1]), pw_json_num(r->top_x1[0]),
                                        "vapor_x1",
                                        r->cooled ? json_null() : pw_json_num(tp->y1), "cooled",
                                        r->cooled)
                            : json_null());
    json_object_set_new(o, "three_phase",
                        tp->exists
                            ? json_pack("{s:o,s:[o,o],s:o}", "T_K", pw_json_num(tp->T_K),
                                        "x1_layers", pw_json_num(tp->x[0]), pw_json_num(tp->x[1]),
                                        "vapor_x1", pw_json_num(tp->y1))
                            : json_null());
    if (r->feasible) {
        json_object_set_new(o, "columns",
                            json_pack("[o,o]", column_json(r, 0, spec->x_rich),
                                      column_json(r, 1, spec->x_lean)));
        json_object_set_new(o, "bottoms_per_mol_feed",
                            json_pack("[o,o]", pw_json_num(r->bottoms_per_mol_feed[0]),
                                      pw_json_num(r->bottoms_per_mol_feed[1])));
        json_object_set_new(o, "balance_closure", pw_json_num(r->closure));
        json_t *qc = json_array(), *ec = json_array();
        for (size_t k = 0; k < r->n_rows; k++) {
            json_array_append_new(qc, pw_json_num(r->condenser_J[k] / 1e3));
            json_array_append_new(ec, pw_json_num(r->energy_closure_J[k] / 1e3));
        }
        if (r->duties) {
            json_object_set_new(o, "condenser_kJ_per_mol_feed", qc);
            json_object_set_new(o, "energy_closure_kJ_per_mol_feed", ec);
            json_object_set_new(o, "duties_note", json_null());
        } else {
            json_decref(qc);
            json_decref(ec);
            json_object_set_new(o, "condenser_kJ_per_mol_feed", json_null());
            json_object_set_new(o, "energy_closure_kJ_per_mol_feed", json_null());
            json_object_set_new(o, "duties_note", json_string(r->duties_note));
        }
    } else {
        json_object_set_new(o, "columns", json_null());
        json_object_set_new(o, "bottoms_per_mol_feed", json_null());
    }
    json_object_set_new(o, "q", pw_json_num(spec->q));
    json_object_set_new(o, "caution", json_string(pw_caution_text()));
    return o;
}

json_t *pw_decanter_command_doc(const pw_system *sys, const pw_decanter_result *r,
                                const pw_decanter_spec *spec)
{
    json_t *o = pw_decanter_doc(r, spec);
    if (o)
        json_object_set_new(o, "overflow_check", pw_overflow_check_doc(sys, true));
    return o;
}
