/* Driver of the consistency check: options, running every test the data allow, the verdict. */
#include "consistency_internal.h"

#include <math.h>
#include <pinchwise/units.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

pw_consistency_options pw_consistency_default_options(void)
{
    return (pw_consistency_options){
        .area_D_max = 10.0,
        .herington_max = 10.0,
        .point_dy_max = 0.01,
        .dilution_I_max = 30.0,
        .slope_d_max = 5.0,
        .endpoint_P_rel_max = 0.005,
        .endpoint_T_max_K = 0.2,
        .legendre_terms_min = 3,
        .legendre_terms_max = 5,
        .legendre_choice = PW_LEGENDRE_BY_AICC,
        .outlier_k = 3.0,
        .outlier_floor_y = 0.001,
        .outlier_floor_lnratio = 0.01,
        .outlier_floor_T_K = 0.05,
        .outlier_floor_P_rel = 5e-4,
        .dilution_min_lngamma = 0.05,
        .sigma_y = NAN,
        .sigma_x = NAN,
        .sigma_T_K = NAN,
        .sigma_P_rel = NAN,
        .point_confidence = 0.99,
        .gap_x1 = {NAN, NAN},
        .gap_T_K = {NAN, NAN},
        .strict_verdict = false,
    };
}

static pw_status check_options(const pw_consistency_options *o, pw_error *err)
{
    const double pos[] = {o->area_D_max, o->herington_max, o->point_dy_max, o->dilution_I_max,
                          o->slope_d_max, o->endpoint_P_rel_max, o->endpoint_T_max_K, o->outlier_k};
    for (size_t i = 0; i < sizeof pos / sizeof pos[0]; i++)
        if (!(pos[i] > 0.0) || !isfinite(pos[i]))
            return pw_error_set(err, PW_EINVAL, NULL, 0, "consistency limits must be positive and finite");
    const double nonneg[] = {o->outlier_floor_y, o->outlier_floor_lnratio, o->outlier_floor_T_K,
                             o->outlier_floor_P_rel, o->dilution_min_lngamma};
    for (size_t i = 0; i < sizeof nonneg / sizeof nonneg[0]; i++)
        if (!(nonneg[i] >= 0.0) || !isfinite(nonneg[i]))
            return pw_error_set(err, PW_EINVAL, NULL, 0, "outlier floors must be >= 0 and finite");
    if (o->legendre_terms_min < 1 || o->legendre_terms_max > PW_CONSISTENCY_MAX_TERMS ||
        o->legendre_terms_min > o->legendre_terms_max)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "Legendre terms must satisfy 1 <= min <= max <= %d",
                            PW_CONSISTENCY_MAX_TERMS);
    const double sig[] = {o->sigma_y, o->sigma_x, o->sigma_T_K, o->sigma_P_rel};
    for (size_t i = 0; i < sizeof sig / sizeof sig[0]; i++)
        if (!isnan(sig[i]) && !(sig[i] > 0.0 && isfinite(sig[i])))
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "stated uncertainties must be positive and finite (or unset)");
    if (!isnan(o->sigma_y) && !(o->sigma_y < 1.0))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "sigma_y %g: must lie between 0 and 1",
                            o->sigma_y);
    if (!(o->point_confidence >= 0.5 && o->point_confidence < 1.0))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "point_confidence must lie in [0.5, 1)");
    if (o->legendre_choice != PW_LEGENDRE_BY_AICC && o->legendre_choice != PW_LEGENDRE_BY_RESIDUAL)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "unknown Legendre order choice");
    return PW_OK;
}

static void add_reason(pw_consistency_result *r, const char *fmt, ...) __attribute__((format(printf, 2, 3)));
static void add_reason(pw_consistency_result *r, const char *fmt, ...)
{
    if (r->n_reasons >= PW_CONSISTENCY_MAX_REASONS)
        return;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(r->reasons[r->n_reasons++], PW_CONSISTENCY_REASON_MAX, fmt, ap);
    va_end(ap);
}

/* The verdict (docs/consistency.md). Primary tests: the point test, which alone compares the
 * redundant measured quantity y with what Gibbs-Duhem implies from P-x or T-x (Van Ness, Byer &
 * Gibbs 1973), and the end points. When the point test cannot run, the area and Kojima tests
 * take its place. Secondary failures are reported as warnings and lower the quality factor;
 * with strict_verdict every test that ran must pass. */
static bool is_primary(const pw_consistency_result *r, int i, bool strict)
{
    if (strict || i == PW_CTEST_ENDPOINT || i == PW_CTEST_POINT || i == PW_CTEST_SCATTER)
        return true;
    return !r->tests[PW_CTEST_POINT].ran;
}

static void verdict(const cs_data *d, pw_consistency_result *r)
{
    size_t n_ran = 0, n_fail = 0, n_gd = 0, n_warn = 0;
    bool strict = d->opt->strict_verdict;
    for (int i = 0; i < PW_CTEST_COUNT; i++) {
        const pw_ctest *t = &r->tests[i];
        if (!t->ran)
            continue;
        n_ran++;
        bool primary = is_primary(r, i, strict);
        r->primary[i] = primary;
        n_gd += primary && i != PW_CTEST_ENDPOINT;
        /* the value with its unit: % for the area and Kojima tests, a mole fraction for the point
         * test, a multiple of the stated uncertainties for the scatter test, K or % of P_sat for
         * the pure-component end points */
        double sc = 1.0;
        const char *u = i == PW_CTEST_POINT ? " (mole fraction)"
                        : i == PW_CTEST_SCATTER ? " x stated"
                        : i == PW_CTEST_HERINGTON ? " % points"
                        : i == PW_CTEST_ENDPOINT ? (r->kind == PW_DATA_ISOTHERMAL ? " % of P_sat" : " K")
                                                 : " %";
        if (i == PW_CTEST_ENDPOINT && r->kind == PW_DATA_ISOTHERMAL)
            sc = 100.0;
        /* a temperature difference is a marked quantity (pinchwise/units.h) */
        bool dT = i == PW_CTEST_ENDPOINT && r->kind != PW_DATA_ISOTHERMAL;
        if (!t->pass && primary && dT) {
            n_fail++;
            add_reason(r, "%s failed (" PW_TEXT_DT(".4g") ", limit " PW_TEXT_DT(".4g") "): %s",
                       t->name, t->value, t->limit, t->meaning);
        } else if (!t->pass && dT) {
            n_warn++;
            add_reason(r, "warning: %s failed (" PW_TEXT_DT(".4g") ", limit " PW_TEXT_DT(".4g")
                       "), a secondary test: %s",
                       t->name, t->value, t->limit, t->meaning);
        } else if (!t->pass && primary) {
            n_fail++;
            add_reason(r, "%s failed (%.4g%s, limit %.4g%s): %s", t->name, t->value * sc, u,
                       t->limit * sc, u, t->meaning);
        } else if (!t->pass) {
            n_warn++;
            add_reason(r, "warning: %s failed (%.4g%s, limit %.4g%s), a secondary test: %s",
                       t->name, t->value * sc, u, t->limit * sc, u, t->meaning);
        }
    }
    r->consistent = n_gd > 0 && n_fail == 0;
    if (n_gd == 0)
        add_reason(r, "no Gibbs-Duhem test could run (%s): the data can be reduced but not tested",
                   d->ds->has_y ? "too few points" : "no y column");
    else if (n_fail == 0)
        add_reason(r, "%s (%zu of %zu tests that ran passed)",
                   r->tests[PW_CTEST_POINT].ran
                       ? "the measured y agree with the y implied by Gibbs-Duhem from the P-x or T-x data"
                       : "the area and Kojima tests passed (the point test could not run)",
                   n_ran - n_warn, n_ran);
    if (r->n_flagged > 0) {
        char lines[160] = "";
        size_t len = 0;
        for (size_t i = 0; i < r->n_pts && len + 12 < sizeof lines; i++)
            if (r->pts[i].flagged)
                len += (size_t)snprintf(lines + len, sizeof lines - len, "%s%ld", len ? ", " : "",
                                        r->pts[i].line);
        add_reason(r, "%zu point(s) flagged as outliers of the point test, line(s) %s", r->n_flagged,
                   lines);
    }
}

pw_status pw_consistency_run(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                             const pw_consistency_options *opt, pw_consistency_result *out,
                             pw_error *err)
{
    if (!ds || !c1 || !c2 || !out)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "missing argument to the consistency check");
    if (ds->mass_x || ds->mass_y)
        return pw_error_set(err, PW_EINVAL, ds->path, ds->composition_line,
                            "the dataset's compositions are mass fractions (convert them with "
                            "pw_dataset_to_mole first)");
    memset(out, 0, sizeof *out);
    pw_consistency_options o = opt ? *opt : pw_consistency_default_options();
    pw_status st = check_options(&o, err);
    if (st != PW_OK)
        return st;
    cs_data d;
    st = pw_cs_prepare(&d, ds, c1, c2, &o, err);
    if (st != PW_OK)
        return st;
    out->kind = ds->kind;
    for (int i = 0; i < PW_CTEST_COUNT; i++)
        pw_cs_test_init(&out->tests[i], (pw_ctest_id)i);
    out->pts = calloc(d.n_in ? d.n_in : 1, sizeof *out->pts);
    if (!out->pts) {
        pw_cs_release(&d);
        return pw_error_set(err, PW_ENOMEM, ds->path, 0, "out of memory");
    }
    out->n_pts = d.n_in;
    for (size_t i = 0; i < d.n_in; i++) {
        pw_cpoint *p = &out->pts[i];
        p->line = d.in[i].line;
        p->x1 = d.in[i].x1;
        p->y_exp = d.in[i].y1;
        p->y_calc = p->dy = p->dlnratio = p->dT_K = p->dP_rel = NAN;
    }
    out->area_A = out->area_B = out->herington_D = out->herington_J = NAN;
    out->herington_theta_K = out->herington_Tmin_K = out->legendre_rms = out->rms_dlnratio = NAN;
    out->area_degree = out->area_degree_upper = -1;
    out->gap_bridge = out->gap_bridge_x1[0] = out->gap_bridge_x1[1] = NAN;
    out->sigma_y_used = out->sigma_x_used = out->sigma_T_used_K = out->sigma_P_used_rel = NAN;
    out->point_dy_limit_sigma = out->scatter_chi2 = NAN;
    st = pw_cs_area_test(&d, out);
    if (st == PW_OK)
        st = pw_cs_herington_test(&d, out);
    if (st == PW_OK)
        st = pw_cs_point_test(&d, out);
    if (st == PW_OK)
        st = pw_cs_scatter_test(&d, out);
    if (st == PW_OK)
        st = pw_cs_dilution_tests(&d, out);
    if (st == PW_OK)
        st = pw_cs_endpoint_test(&d, out);
    if (st == PW_OK) {
        pw_cs_outliers(&d, out);
        pw_cs_quality(&d, out);
        verdict(&d, out);
    }
    pw_cs_release(&d);
    if (st != PW_OK) {
        pw_consistency_result_free(out);
        return pw_error_set(err, st, ds->path, 0, "consistency check failed: %s", pw_strerror(st));
    }
    return PW_OK;
}

void pw_consistency_result_free(pw_consistency_result *out)
{
    if (!out)
        return;
    free(out->pts);
    out->pts = NULL;
    out->n_pts = out->n_flagged = 0;
}
