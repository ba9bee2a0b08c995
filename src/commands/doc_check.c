/* The `check --json` document (moved from src/cli/cmd_check.c). */
#include <math.h>
#include <pinchwise/commands.h>
#include <pinchwise/hetcheck.h>
#include <stdio.h>
#include <string.h>

static const char *const cautions[] = {
    "Screening only: consistency tests judge measured data, not a design. Verify any design with "
    "rigorous simulation, validated property methods and pilot or laboratory data.",
    "A failed test means the data (or the vapor pressures used) carry errors; a model fitted to "
    "them may give wrong azeotropes, pinches and stage counts.",
    "Designs based on these results must follow local codes and be reviewed by a qualified "
    "(licensed where required) engineer; consult each chemical's Safety Data Sheet.",
};

const char *const *pw_check_cautions(size_t *n)
{
    *n = sizeof cautions / sizeof cautions[0];
    return cautions;
}

/* The bridged two-liquid gap of the area tests, or null. */
static json_t *gap_bridge(const pw_consistency_result *r)
{
    if (!isfinite(r->gap_bridge))
        return json_null();
    return json_pack("{s:[o,o],s:o,s:[i,i]}", "x1", pw_json_num(r->gap_bridge_x1[0]),
                     pw_json_num(r->gap_bridge_x1[1]), "gE_RT_step", pw_json_num(r->gap_bridge),
                     "branch_degrees", r->area_degree, r->area_degree_upper);
}

static json_t *test_details(const pw_consistency_result *r, const pw_ctest *t)
{
    json_t *d = json_object();
    switch (t->id) {
    case PW_CTEST_AREA:
        json_object_set_new(d, "area_above", pw_json_num(r->area_A));
        json_object_set_new(d, "area_below", pw_json_num(r->area_B));
        json_object_set_new(d, "smoothing_degree", json_integer(r->area_degree));
        json_object_set_new(d, "areas_at_rounding_level", json_boolean(r->areas_at_rounding));
        json_object_set_new(d, "gap_bridge", gap_bridge(r));
        break;
    case PW_CTEST_HERINGTON:
        json_object_set_new(d, "D", pw_json_num(r->herington_D));
        json_object_set_new(d, "J", pw_json_num(r->herington_J));
        json_object_set_new(d, "theta_K", pw_json_num(r->herington_theta_K));
        json_object_set_new(d, "T_min_K", pw_json_num(r->herington_Tmin_K));
        json_object_set_new(d, "area_above", pw_json_num(r->area_A));
        json_object_set_new(d, "area_below", pw_json_num(r->area_B));
        json_object_set_new(d, "areas_at_rounding_level", json_boolean(r->areas_at_rounding));
        json_object_set_new(d, "gap_bridge", gap_bridge(r));
        break;
    case PW_CTEST_POINT:
        json_object_set_new(d, "limit_from_sigma", pw_json_num(r->point_dy_limit_sigma));
        json_object_set_new(d, "legendre_terms", json_integer((json_int_t)r->legendre_terms));
        json_object_set_new(d, "rms_dln_gamma_ratio", pw_json_num(r->rms_dlnratio));
        json_object_set_new(d, "van_ness_index", json_integer(r->van_ness_index));
        break;
    case PW_CTEST_SCATTER:
        json_object_set_new(d, "chi2", pw_json_num(r->scatter_chi2));
        json_object_set_new(d, "dof", json_integer((json_int_t)r->scatter_dof));
        break;
    case PW_CTEST_SLOPE:
        json_object_set_new(d, "at_rounding_level", json_boolean(r->slope_at_rounding));
        break;
    case PW_CTEST_DILUTION:
        json_object_set_new(d, "I1", pw_json_num(r->I1));
        json_object_set_new(d, "I2", pw_json_num(r->I2));
        json_object_set_new(d, "ln_gamma1_inf", pw_json_num(r->lngamma1_inf));
        json_object_set_new(d, "ln_gamma2_inf", pw_json_num(r->lngamma2_inf));
        break;
    case PW_CTEST_ENDPOINT:
        json_object_set_new(d, "deviation_at_x1_0", pw_json_num(r->endpoint_dev[0]));
        json_object_set_new(d, "deviation_at_x1_1", pw_json_num(r->endpoint_dev[1]));
        json_object_set_new(d, "deviation_unit",
                            json_string(r->kind == PW_DATA_ISOTHERMAL ? "relative P" : "K"));
        break;
    default:
        break;
    }
    return d;
}

const char *pw_het_check_reason(void)
{
    return "inside the two-liquid region (a plateau of equal T or P and equal y over a range of "
           "x): left out of the consistency tests, which assume one liquid; checked instead "
           "against the activity bound y_i P <= P_i^sat(T) (docs/heterogeneous.md)";
}

static json_t *het_json(const pw_het_check *h)
{
    json_t *pts = json_array();
    for (size_t i = 0; i < h->n; i++)
        json_array_append_new(pts, json_pack("{s:I,s:o,s:o,s:[o,o]}", "line",
                                             (json_int_t)h->pts[i].line, "x1",
                                             pw_json_num(h->pts[i].x1), "y1",
                                             pw_json_num(h->pts[i].y1), "activity_bound",
                                             pw_json_num(h->pts[i].bound[0]),
                                             pw_json_num(h->pts[i].bound[1])));
    return json_pack("{s:o,s:s,s:o,s:b}", "points", pts, "reason", pw_het_check_reason(),
                     "max_activity", pw_json_num(h->max_bound), "activity_bound_ok", h->bound_ok);
}

json_t *pw_check_doc(const pw_dataset *ds, const pw_consistency_result *r, bool strict,
                     const pw_het_check *het)
{
    json_t *o = json_object(), *tests = json_array(), *not_run = json_array();
    for (int i = 0; i < PW_CTEST_COUNT; i++) {
        const pw_ctest *t = &r->tests[i];
        json_t *e = json_object();
        json_object_set_new(e, "name", json_string(t->name));
        if (t->ran) {
            json_object_set_new(e, "value", pw_json_num(t->value));
            json_object_set_new(e, "limit", pw_json_num(t->limit));
            json_object_set_new(e, "pass", json_boolean(t->pass));
            json_object_set_new(e, "source", json_string(t->source));
            json_object_set_new(e, "ran", json_true());
            json_object_set_new(e, "title", json_string(t->title));
            json_object_set_new(e, "criterion", json_string(t->criterion));
            json_object_set_new(e, "meaning", json_string(t->meaning));
            json_object_set_new(e, "primary", json_boolean(r->primary[i]));
            json_object_set_new(e, "details", test_details(r, t));
            json_array_append_new(tests, e);
        } else {
            json_object_set_new(e, "ran", json_false());
            json_object_set_new(e, "reason", json_string(t->why_not));
            json_object_set_new(e, "title", json_string(t->title));
            json_object_set_new(e, "source", json_string(t->source));
            json_array_append_new(not_run, e);
        }
    }
    json_object_set_new(o, "tests", tests);
    json_object_set_new(o, "consistent", json_boolean(r->consistent));
    json_object_set_new(o, "dataset", json_string(ds->path));
    json_object_set_new(o, "components", json_pack("[ss]", ds->names[0], ds->names[1]));
    json_object_set_new(o, "kind", json_string(ds->kind == PW_DATA_ISOTHERMAL ? "isothermal" : "isobaric"));
    json_object_set_new(o, "not_run", not_run);
    json_t *unc = json_object();
    json_object_set_new(unc, "used", json_boolean(r->uncertainty_based));
    json_object_set_new(unc, "sigma_y", pw_json_num(r->sigma_y_used));
    json_object_set_new(unc, "sigma_x", pw_json_num(r->sigma_x_used));
    json_object_set_new(unc, "sigma_T_K", pw_json_num(r->sigma_T_used_K));
    json_object_set_new(unc, "sigma_P_relative", pw_json_num(r->sigma_P_used_rel));
    json_object_set_new(o, "uncertainties", unc);
    json_object_set_new(o, "verdict_rule",
                        json_string(strict ? "strict: every test that ran must pass"
                                           : "primary: legendre_point, point_scatter and "
                                             "pure_endpoints decide "
                                             "(area and Kojima tests when the point test cannot run); "
                                             "other failures are warnings"));
    json_t *reasons = json_array();
    for (size_t i = 0; i < r->n_reasons; i++)
        json_array_append_new(reasons, pw_json_reason(r->reasons[i]));
    json_object_set_new(o, "reasons", reasons);

    json_t *leg = json_object(), *coef = json_array(), *aicc = json_object();
    for (size_t k = 0; k < r->legendre_terms; k++)
        json_array_append_new(coef, pw_json_num(r->legendre_a[k]));
    for (size_t k = 1; k <= PW_CONSISTENCY_MAX_TERMS; k++)
        if (isfinite(r->legendre_aicc[k])) {
            char key[8];
            snprintf(key, sizeof key, "%zu", k);
            json_object_set_new(aicc, key, json_real(r->legendre_aicc[k]));
        }
    json_object_set_new(leg, "terms", json_integer((json_int_t)r->legendre_terms));
    json_object_set_new(leg, "coefficients", coef);
    json_object_set_new(leg, "aicc_by_terms", aicc);
    json_object_set_new(leg, "rms_residual", pw_json_num(r->legendre_rms));
    json_object_set_new(leg, "residual_unit", json_string(ds->kind == PW_DATA_ISOTHERMAL ? "relative P" : "K"));
    json_object_set_new(o, "legendre_fit", leg);
    json_object_set_new(o, "van_ness_index", r->van_ness_index ? json_integer(r->van_ness_index) : json_null());

    const pw_cquality *q = &r->quality;
    json_t *qj = json_object();
    json_object_set_new(qj, "score", pw_json_num(q->Q));
    json_object_set_new(qj, "area_part", pw_json_num(q->F_area));
    json_object_set_new(qj, "point_part", pw_json_num(q->F_point));
    json_object_set_new(qj, "slope_part", pw_json_num(q->F_slope));
    json_object_set_new(qj, "dilution_part", pw_json_num(q->F_dilution));
    json_object_set_new(qj, "pure_part", pw_json_num(q->F_pure));
    json_object_set_new(qj, "note", json_string(q->note));
    json_object_set_new(o, "evidence_score", qj);

    json_t *pts = json_array(), *flagged = json_array();
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_cpoint *p = &r->pts[i];
        json_t *e = json_object();
        json_object_set_new(e, "line", json_integer(p->line));
        json_object_set_new(e, "x1", pw_json_num(p->x1));
        json_object_set_new(e, "y1", pw_json_num(p->y_exp));
        json_object_set_new(e, "y1_calc", pw_json_num(p->y_calc));
        json_object_set_new(e, "dy", pw_json_num(p->dy));
        json_object_set_new(e, "dln_gamma_ratio", pw_json_num(p->dlnratio));
        if (ds->kind == PW_DATA_ISOTHERMAL)
            json_object_set_new(e, "dP_rel", pw_json_num(p->dP_rel));
        else
            json_object_set_new(e, "dT_K", pw_json_num(p->dT_K));
        json_object_set_new(e, "flagged", json_boolean(p->flagged));
        json_array_append_new(pts, e);
        if (p->flagged)
            json_array_append_new(flagged, json_pack("{sI sf ss}", "line", (json_int_t)p->line, "x1",
                                                     p->x1, "why", p->why));
    }
    json_object_set_new(o, "points", pts);
    json_object_set_new(o, "flagged", flagged);
    json_t *cj = json_array();
    for (size_t i = 0; i < sizeof cautions / sizeof cautions[0]; i++)
        json_array_append_new(cj, json_string(cautions[i]));
    json_object_set_new(o, "cautions", cj);
    if (het)
        json_object_set_new(o, "three_phase_points", het_json(het));
    return o;
}
