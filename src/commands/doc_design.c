/* The design-grade column in the commands' JSON documents (include/pinchwise/design_doc.h). */
#include <math.h>
#include <pinchwise/commands.h>
#include <pinchwise/design_doc.h>
#include <stdio.h>
#include <string.h>

pw_status pw_reflux_design(const pw_system *sys, double P_Pa, const pw_column_spec *spec,
                           const pw_column_options *opt, const pw_column_result *col,
                           const pw_heat_data *heat, pw_design_table *design,
                           pw_energy_result *energy)
{
    memset(design, 0, sizeof *design);
    if (energy)
        memset(energy, 0, sizeof *energy);
    if (heat) {
        design->balance = PW_BALANCE_ENERGY;
        if (!energy)
            return PW_EINVAL;
        if (col->feasible)
            return pw_energy_column_solve(sys, heat, P_Pa, spec, opt, energy, design);
        energy->feasible = false;
        snprintf(energy->reason, sizeof energy->reason, "%s", col->reason);
        return PW_OK;
    }
    design->balance = PW_BALANCE_CMO;
    if (col->feasible && col->r_min > 0.0)
        return pw_design_cmo(sys, P_Pa, spec, col->r_min, col->n_min, opt, design);
    return PW_OK;
}

pw_column_result pw_energy_headline(const pw_column_result *col, const pw_energy_result *e)
{
    pw_column_result c = *col;
    if (!e)
        return c;
    c.feasible = e->feasible;
    snprintf(c.reason, sizeof c.reason, "%s", e->reason);
    c.r_min = e->r_min;
    c.s_min = e->s_min;
    c.pinch = e->pinch;
    c.n_min = e->n_min;
    c.reflux_limited = e->reflux_limited;
    c.boilup_limited = e->boilup_limited;
    c.r_feed = NAN;
    return c;
}

json_t *pw_profile_doc(const pw_profile *p)
{
    json_t *a = json_array();
    for (size_t i = 0; p && i < p->n; i++) {
        const pw_stage *s = &p->stage[i];
        json_t *o = json_object();
        json_object_set_new(o, "stage", json_integer((json_int_t)i + 1));
        json_object_set_new(o, "x1", pw_json_num(s->x));
        json_object_set_new(o, "y1", pw_json_num(s->y));
        json_object_set_new(o, "T_K", pw_json_num(s->T_K));
        json_object_set_new(o, "L", pw_json_num(s->L));
        json_object_set_new(o, "V", pw_json_num(s->V));
        json_array_append_new(a, o);
    }
    return a;
}

const char *pw_design_unreachable_text(pw_status why)
{
    if (why == PW_EMAXITER)
        return "not reached: more stages than the stepping limit at this reflux";
    if (why == PW_EINVAL)
        return "not reached: no boil-up at this reflux (the feed brings all the vapor)";
    return "not reached: the operating line meets the equilibrium curve at this reflux (a pinch)";
}

json_t *pw_design_doc(const pw_design_table *t)
{
    json_t *d = json_array();
    for (size_t i = 0; i < t->n; i++) {
        const pw_design_case *r = &t->row[i];
        json_t *row = json_object();
        json_object_set_new(row, "factor", pw_json_num(r->factor));
        json_object_set_new(row, "R", pw_json_num(r->R));
        json_object_set_new(row, "boilup", pw_json_num(r->boilup));
        json_object_set_new(row, "reached", json_boolean(r->reachable));
        json_object_set_new(row, "stages", r->reachable ? pw_json_num(r->stages) : json_null());
        json_object_set_new(row, "feed_stage",
                            r->reachable ? json_integer(r->feed_stage) : json_null());
        if (!r->reachable) {
            json_object_set_new(row, "note", json_string(pw_strerror(r->why)));
            json_object_set_new(row, "limit", json_string(pw_design_unreachable_text(r->why)));
        }
        if (t->balance == PW_BALANCE_CMO)
            json_object_set_new(row, "gilliland_stages", pw_json_num(r->gilliland_stages));
        if (t->balance == PW_BALANCE_ENERGY) {
            json_object_set_new(row, "condenser_kJ_per_mol_feed",
                                pw_json_num(r->reachable ? r->Q_C / 1e3 : (double)NAN));
            json_object_set_new(row, "reboiler_kJ_per_mol_feed",
                                pw_json_num(r->reachable ? r->Q_R / 1e3 : (double)NAN));
        }
        json_object_set_new(row, "profile", pw_profile_doc(r->reachable ? &r->profile : NULL));
        json_array_append_new(d, row);
    }
    return d;
}

json_t *pw_energy_doc(const pw_energy_result *e, double r_min_cmo)
{
    json_t *o = json_object();
    json_object_set_new(o, "r_min_constant_molal_overflow", pw_json_num(r_min_cmo));
    json_object_set_new(o, "r_min_rectifying", pw_json_num(e->r_rect));
    json_object_set_new(o, "r_min_stripping", pw_json_num(e->r_strip));
    json_object_set_new(o, "feed_tie_line",
                        json_pack("{s:o,s:o}", "x", pw_json_num(e->x_feed), "y",
                                  pw_json_num(e->y_feed)));
    json_object_set_new(o, "h_feed_J_mol", pw_json_num(e->h_F));
    json_object_set_new(o, "h_distillate_J_mol", pw_json_num(e->h_D));
    json_object_set_new(o, "h_bottoms_J_mol", pw_json_num(e->h_B));
    json_object_set_new(o, "H_top_vapor_J_mol", pw_json_num(e->H_top));
    json_object_set_new(o, "enthalpy_reference", json_string("pure liquids at 298.15 K"));
    return o;
}

json_t *pw_reflux_design_doc(const pw_column_result *col, const pw_design_table *t,
                             const pw_energy_result *e, double P_Pa, const pw_column_spec *spec,
                             double T_top_K, double T_bottom_K)
{
    const pw_column_result view = pw_energy_headline(col, e);
    json_t *o = pw_reflux_doc(&view, P_Pa, spec, T_top_K, T_bottom_K);
    if (!o)
        return NULL;
    json_object_set_new(o, "balance", json_string(pw_balance_name(t->balance)));
    json_object_set_new(o, "design", view.feasible ? pw_design_doc(t) : json_array());
    if (e) {
        json_object_set_new(o, "energy", pw_energy_doc(e, col->r_min));
        json_object_set_new(
            o, "caution",
            json_string("Screening estimate (energy balances with constant heat capacities, "
                        "ideal-gas vapor enthalpies and the fitted model's H^E, which VLE data fix "
                        "poorly). Stage counts near R_min, above all near a tangent pinch, are "
                        "very sensitive to the model. Verify with rigorous simulation and pilot "
                        "data; design per local codes under licensed review."));
    }
    return o;
}

json_t *pw_overflow_check_doc(const pw_system *sys, bool cmo_used)
{
    const double m = pw_latent_heat_mismatch(sys);
    return json_pack("{s:o,s:o,s:b,s:s}", "latent_heat_mismatch", pw_json_num(m), "limit",
                     pw_json_num(PW_CMO_MISMATCH_MAX), "doubtful",
                     cmo_used && pw_cmo_doubtful(sys), "basis", "common practice");
}

json_t *pw_reflux_command_doc(const pw_system *sys, const pw_column_result *col,
                              const pw_design_table *t, const pw_energy_result *e, double P_Pa,
                              const pw_column_spec *spec, double T_top_K, double T_bottom_K)
{
    json_t *o = pw_reflux_design_doc(col, t, e, P_Pa, spec, T_top_K, T_bottom_K);
    if (o)
        json_object_set_new(o, "overflow_check", pw_overflow_check_doc(sys, e == NULL));
    return o;
}

json_t *pw_screen_energy_doc(const pw_energy_result *e, double r_min_cmo)
{
    return json_pack("{s:b,s:o,s:o,s:s,s:o}", "feasible", e->feasible, "r_min",
                     pw_json_num(e->feasible ? e->r_min : (double)NAN),
                     "r_min_constant_molal_overflow", pw_json_num(r_min_cmo), "pinch_kind",
                     e->pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed", "pinch_x",
                     pw_json_num(e->pinch.x));
}
