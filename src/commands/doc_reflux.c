/* The reflux command's column and its `reflux --json` document (moved from src/cli/cmd_reflux.c
 * and src/cli/reflux_common.c). */
#include <math.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/commands.h>
#include <pinchwise/decanter.h>
#include <pinchwise/lle.h>
#include <pinchwise/curve.h>
#include <pinchwise/equilibrium.h>
#include <string.h>

static const char *pinch_kind(pw_pinch_kind k) { return k == PW_PINCH_FEED ? "feed" : "tangent"; }
static const char *section(pw_section s)
{
    return s == PW_SECTION_RECTIFYING ? "rectifying" : "stripping";
}

pw_status pw_reflux_solve(const pw_system *sys, double P_Pa, const pw_column_spec *spec,
                          const pw_column_options *opt, const char *where, pw_column_result *col,
                          double *T_top_K, double *T_bottom_K, pw_error *err)
{
    memset(col, 0, sizeof *col);
    *T_top_K = *T_bottom_K = (double)NAN;
    /* either split direction; refused when the targets reach into the two-liquid region (a
     * heterogeneous azeotrope between them included): the decanter scheme */
    pw_three_phase tp;
    pw_status st = pw_column_solve_system(sys, P_Pa, spec, opt, col, &tp, NULL);
    if (st != PW_OK) {
        pw_error_set(err, st, where, 0, "%s%s%s", pw_strerror(st),
                     col->reason[0] ? ": " : "", col->reason);
        return st;
    }
    pw_eq_point e;
    *T_top_K = pw_bubble_T(sys, P_Pa, spec->xd, &e) == PW_OK ? e.T_K : (double)NAN;
    *T_bottom_K = pw_bubble_T(sys, P_Pa, spec->xb, &e) == PW_OK ? e.T_K : (double)NAN;
    /* a product inside the two-liquid region is two layers, which boil at the three-phase
     * temperature (not at the metastable single liquid's bubble point) */
    if (tp.exists && spec->xd > tp.x[0] && spec->xd < tp.x[1])
        *T_top_K = tp.T_K;
    if (tp.exists && spec->xb > tp.x[0] && spec->xb < tp.x[1])
        *T_bottom_K = tp.T_K;
    return PW_OK;
}

json_t *pw_reflux_doc(const pw_column_result *c, double P_Pa, const pw_column_spec *spec,
                      double T_top_K, double T_bottom_K)
{
    json_t *o = json_object();
    json_object_set_new(o, "feasible", json_boolean(c->feasible));
    json_object_set_new(o, "reason", c->feasible ? json_null() : pw_json_reason(c->reason));
    json_object_set_new(o, "r_min", c->feasible ? pw_json_num(c->r_min) : json_null());
    /* the contract: a pinch object whenever feasible (also when a flow, not a pinch, limits:
     * "limit" then says which and what the point is) */
    if (c->feasible) {
        json_t *p = json_object();
        json_object_set_new(p, "kind", json_string(pinch_kind(c->pinch.kind)));
        json_object_set_new(p, "section", json_string(section(c->pinch.section)));
        json_object_set_new(p, "x", pw_json_num(c->pinch.x));
        json_object_set_new(p, "y", pw_json_num(c->pinch.y));
        json_object_set_new(o, "pinch", p);
    } else {
        json_object_set_new(o, "pinch", json_null());
    }
    json_object_set_new(o, "n_min", c->feasible ? pw_json_num(c->n_min) : json_null());
    if (c->feasible && c->n_min_status != PW_OK)
        json_object_set_new(o, "n_min_note", json_string(pw_strerror(c->n_min_status)));
    json_object_set_new(o, "limit",
                        !c->feasible ? json_null()
                        : c->reflux_limited
                            ? json_string("no reflux needed: at R = 0 the operating lines clear the "
                                          "equilibrium curve (a stripping column with the feed on "
                                          "top makes the distillate); no pinch limits: pinch is where "
                                          "the operating lines come closest to the curve, which "
                                          "they would touch only at a negative reflux")
                        : c->boilup_limited && c->pinch.kind == PW_PINCH_FEED
                            ? json_string("zero boil-up: the feed's vapor is all the rectifying "
                                          "section gets (R_min = (1 - q) F / D - 1); the "
                                          "operating lines meet on the q-line at xb, below the "
                                          "curve, and pinch is the reboiler's point (xb, y*(xb)) "
                                          "where the vertical stripping line meets the curve")
                            : json_string("pinch"));
    json_object_set_new(o, "boilup_min", c->feasible ? pw_json_num(c->s_min) : json_null());
    json_object_set_new(o, "r_min_feed_point_only", c->feasible ? pw_json_num(c->r_feed) : json_null());
    json_object_set_new(o, "q_line_point", json_pack("{s:o,s:o}", "x", pw_json_num(c->x_q), "y",
                                                     pw_json_num(c->y_q)));
    json_object_set_new(o, "n_fenske", c->feasible ? pw_json_num(c->n_fenske) : json_null());
    json_object_set_new(o, "alpha_top", pw_json_num(c->alpha_top));
    json_object_set_new(o, "alpha_bottom", pw_json_num(c->alpha_bottom));
    json_t *d = json_array();
    for (size_t i = 0; c->feasible && i < c->n_design; i++) {
        const pw_design_row *r = &c->design[i];
        json_t *row = json_object();
        json_object_set_new(row, "factor", pw_json_num(r->factor));
        json_object_set_new(row, "R", pw_json_num(r->R));
        json_object_set_new(row, "boilup", pw_json_num(r->boilup));
        json_object_set_new(row, "stages", pw_json_num(r->stages));
        json_object_set_new(row, "feed_stage", json_integer(r->feed_stage));
        json_object_set_new(row, "gilliland_stages", pw_json_num(r->gilliland_stages));
        json_object_set_new(row, "reached", json_boolean(r->status == PW_OK));
        if (r->status != PW_OK)
            json_object_set_new(row, "note", json_string(pw_strerror(r->status)));
        json_array_append_new(d, row);
    }
    json_object_set_new(o, "design", d);
    json_object_set_new(o, "stage_convention",
                        json_string("equilibrium stages counted from the top, the partial reboiler "
                                    "as one stage, last step fractional"));
    json_object_set_new(o, "gilliland_form", json_string("Molokanov et al. (1972)"));
    json_object_set_new(o, "design_factor_basis",
                        json_string("operating reflux of 1.2-1.5 times R_min (common practice)"));
    json_t *sj = json_object();
    json_object_set_new(sj, "P_kPa", pw_json_num(P_Pa / 1e3));
    json_object_set_new(sj, "xd", pw_json_num(spec->xd));
    json_object_set_new(sj, "xb", pw_json_num(spec->xb));
    json_object_set_new(sj, "zf", pw_json_num(spec->zf));
    json_object_set_new(sj, "q", pw_json_num(spec->q));
    json_object_set_new(o, "spec", sj);
    json_object_set_new(o, "T_top_K", pw_json_num(T_top_K));
    json_object_set_new(o, "T_bottom_K", pw_json_num(T_bottom_K));
    json_object_set_new(o, "caution",
                        json_string("Screening estimate (constant molal overflow, fitted model). "
                                    "Stage counts near R_min, above all near a tangent pinch, are "
                                    "very sensitive to the model. Verify with rigorous simulation "
                                    "and pilot data; design per local codes under licensed review."));
    return o;
}
