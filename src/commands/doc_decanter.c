/* The decanter command's computation and its `--json` document (moved from
 * src/cli/cmd_decanter.c). */
#include <pinchwise/commands.h>

pw_status pw_decanter_run(const pw_system *sys, const pw_decanter_spec *spec,
                          const pw_column_options *opt, const char *where, pw_decanter_result *r,
                          pw_error *err)
{
    pw_status st = pw_decanter_solve(sys, spec, opt, r);
    if (st != PW_OK)
        pw_error_set(err, st, where, 0, "decanter scheme: %s", pw_strerror(st));
    return st;
}

static json_t *column_json(const pw_decanter_result *r, int col, double bottom)
{
    const pw_stripper_result *c = &r->col[col];
    double top = r->top_x1[col];
    json_t *d = json_array();
    for (size_t i = 0; i < c->n_design; i++)
        json_array_append_new(
            d, json_pack("{s:o,s:o,s:o,s:o,s:o,s:o}", "factor", pw_json_num(c->design[i].factor),
                         "boilup", pw_json_num(c->design[i].boilup), "stages",
                         pw_json_num(c->design[i].stages), "top_vapor_x1",
                         pw_json_num(c->design[i].y_top), "vapor_per_mol_feed",
                         pw_json_num(r->vapor_per_mol_feed[col][i]), "layer_per_mol_feed",
                         pw_json_num(r->layer_per_mol_feed[col][i])));
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
    json_object_set_new(o, "decanter",
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
    } else {
        json_object_set_new(o, "columns", json_null());
        json_object_set_new(o, "bottoms_per_mol_feed", json_null());
    }
    json_object_set_new(o, "q", pw_json_num(spec->q));
    json_object_set_new(o, "caution", json_string(pw_caution_text()));
    return o;
}
