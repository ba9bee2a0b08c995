/* Uncertainty of column results from fitted models.
 *
 * All VLE data here are INVENTED: generated from a chosen Margules model with Gaussian noise of
 * known size (seeded), so that the true minimum reflux is known. Vapour pressures use the
 * Antoine constants of Smith, Van Ness & Abbott, 7th ed. (2005), Table B.2 (methanol from memory,
 * as this project's methods brief tags it; water read), ln(P/kPa) = A - B/(t/C + C). */
#include "pw_test.h"

#include "fit/fit_design.h"

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/uncertainty.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define P_COL 101325.0

static pw_component antoine(const char *name, double A, double B, double C)
{
    return pw_test_antoine(name, A, B, C, PW_LN, "kPa", "C", 250.0, 450.0);
}

static pw_system margules_system(double A12, double A21)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("methanol", 16.5785, 3638.27, 239.500);
    s.comp[1] = antoine("water", 16.3872, 3885.70, 230.170);
    s.model = &pw_model_margules;
    s.params[0] = A12;
    s.params[1] = A21;
    s.T_ref_K = 350.0;
    return s;
}

/* Invented isobaric T-x-y data from s with noise sigma_T, sigma_y (rng NULL: no noise). */
static void make_data(pw_dataset *ds, const pw_system *s, size_t n, gsl_rng *rng)
{
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "invented.csv");
    snprintf(ds->names[0], sizeof ds->names[0], "%s", s->comp[0].name);
    snprintf(ds->names[1], sizeof ds->names[1], "%s", s->comp[1].name);
    ds->kind = PW_DATA_ISOBARIC;
    ds->has_y = true;
    ds->P_fixed_Pa = P_COL;
    ds->T_fixed_K = NAN;
    ds->sigma_T_K = 0.1, ds->sigma_P_rel = 1e-3, ds->sigma_P_abs_Pa = NAN, ds->sigma_y = 0.004;
    ds->sigma_x = 0.001;
    ds->pts = calloc(n, sizeof *ds->pts);
    ds->n = n;
    for (size_t i = 0; i < n; i++) {
        double x = (double)(i + 1) / (double)(n + 1);
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(s, P_COL, x, &e), PW_OK);
        double dT = rng ? gsl_ran_gaussian(rng, ds->sigma_T_K) : 0.0;
        double dy = rng ? gsl_ran_gaussian(rng, ds->sigma_y) : 0.0;
        ds->pts[i].x1 = x;
        ds->pts[i].y1 = fmin(fmax(e.y1 + dy, 1e-6), 1.0 - 1e-6);
        ds->pts[i].T_K = e.T_K + dT;
        ds->pts[i].P_Pa = P_COL;
        ds->pts[i].line = (long)i + 5;
    }
}

static pw_unc_column_ctx cheap_column(double xd, double xb, double zf)
{
    pw_column_spec spec = {.xd = xd, .xb = xb, .zf = zf, .q = 1.0};
    pw_unc_column_ctx c = pw_unc_column_ctx_make(P_COL, &spec);
    c.opt.grid = 200;
    c.opt.rtol = 1e-8;
    return c;
}

static void fit_margules(const pw_dataset *ds, const pw_system *s, size_t starts,
                         pw_fit_result *fr)
{
    pw_fit_options o = pw_fit_default_options();
    o.n_starts = starts;
    pw_error err;
    assert_int_equal(pw_fit_run(ds, &s->comp[0], &s->comp[1], &pw_model_margules, &o, fr, &err),
                     PW_OK);
    assert_true(fr->converged);
}

/* Coverage: over 200 seeded repetitions of (data with known noise, fit, delta method), the 95 %
 * interval of R_min must contain the true R_min in 90-99 % of them (binomial sd at 95 %: 1.5 %). */
static void interval_covers_true_rmin(void **state)
{
    (void)state;
    const pw_system truth = margules_system(0.5, 0.3);
    pw_unc_column_ctx col = cheap_column(0.95, 0.05, 0.40);
    double r_true[PW_UNC_COLUMN_NOUT];
    assert_int_equal(pw_unc_column_fn(&col, &truth, r_true), PW_OK);
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 2024);
    const int reps = 200;
    int covered = 0, covered_s = 0;
    for (int k = 0; k < reps; k++) {
        pw_dataset ds;
        make_data(&ds, &truth, 16, rng);
        pw_fit_result fr;
        fit_margules(&ds, &truth, 2, &fr);
        pw_unc_problem pb;
        assert_int_equal(pw_unc_problem_from_fit(&pb, &fr, pw_unc_column_fn, &col,
                                                 PW_UNC_COLUMN_NOUT), PW_OK);
        pw_unc_options o = pw_unc_default_options();
        o.samples = 0;
        pw_unc_result r;
        assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
        assert_true(r.out[PW_UNC_RMIN].lin_ok);
        const double *ci = r.out[PW_UNC_RMIN].ci;
        covered += ci[0] <= r_true[PW_UNC_RMIN] && r_true[PW_UNC_RMIN] <= ci[1];
        ci = r.out[PW_UNC_SMIN].ci;
        covered_s += ci[0] <= r_true[PW_UNC_SMIN] && r_true[PW_UNC_SMIN] <= ci[1];
        pw_fit_result_free(&fr);
        pw_dataset_free(&ds);
    }
    gsl_rng_free(rng);
    print_message("coverage of R_min %d / %d, of boil-up %d / %d\n", covered, reps, covered_s,
                  reps);
    assert_true(covered >= 180 && covered <= 198);
    assert_true(covered_s >= 180 && covered_s <= 198);
}

/* Nearly linear case: near-ideal data, many points, small covariance. Sampled and linearised
 * intervals must agree: ends within 10 % of the width (percentile sampling error at 400 draws is
 * about 3.5 % of the width, 1 sd). */
static void linearised_and_sampled_agree_when_nearly_linear(void **state)
{
    (void)state;
    const pw_system truth = margules_system(0.10, 0.05);
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 99);
    pw_dataset ds;
    make_data(&ds, &truth, 60, rng);
    gsl_rng_free(rng);
    pw_fit_result fr;
    fit_margules(&ds, &truth, 2, &fr);
    pw_unc_column_ctx col = cheap_column(0.95, 0.05, 0.40);
    pw_unc_problem pb;
    assert_int_equal(pw_unc_problem_from_fit(&pb, &fr, pw_unc_column_fn, &col, PW_UNC_COLUMN_NOUT),
                     PW_OK);
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, NULL, &r), PW_OK);
    assert_int_equal(r.n_samples, 400);
    for (int i = 0; i < PW_UNC_COLUMN_NOUT; i++) {
        const pw_unc_output *u = &r.out[i];
        assert_true(u->lin_ok && u->mc_ok);
        double w = u->ci_lin[1] - u->ci_lin[0];
        assert_true(w > 0.0);
        print_message("output %d: linearised [%.5f, %.5f], sampled [%.5f, %.5f]\n", i,
                      u->ci_lin[0], u->ci_lin[1], u->ci_mc[0], u->ci_mc[1]);
        pw_assert_close(u->ci_mc[0], u->ci_lin[0], 0.0, 0.10 * w, "low ends");
        pw_assert_close(u->ci_mc[1], u->ci_lin[1], 0.0, 0.10 * w, "high ends");
        pw_assert_close(u->sd_mc, u->sd_lin, 0.15, 0.0, "sd");
        assert_false(u->disagree);
    }
    pw_assert_close(r.p_feasible, 1.0, 0.0, 0.0, "always feasible");
    pw_fit_result_free(&fr);
    pw_dataset_free(&ds);
}

/* Two close-boiling invented components with a constant ideal volatility of 1.5 and a
 * symmetric Margules constant A: x_az = [1 + ln(1.5)/A]/2 at constant T (this project's
 * methods brief, 5.6), so A = 0.507 puts the azeotrope near x = 0.90 (just above xd = 0.88).
 * With sd(A) = 0.03 the azeotrope falls below xd in a fair share of the draws. */
static pw_component invented(const char *name, double A)
{
    return pw_test_antoine(name, A, 3000.0, -50.0, PW_LN, "kPa", "K", 250.0, 500.0);
}

static void straddling_feasibility_gives_intermediate_risk(void **state)
{
    (void)state;
    pw_unc_problem pb;
    memset(&pb, 0, sizeof pb);
    pb.sys.comp[0] = invented("light (invented)", 14.0 + log(1.5));
    pb.sys.comp[1] = invented("heavy (invented)", 14.0);
    pb.sys.model = &pw_model_margules;
    pb.sys.T_ref_K = 350.0;
    pb.sys.params[0] = pb.sys.params[1] = 0.507;
    pb.fitted[0] = pb.fitted[1] = true;
    pb.cov[0][0] = pb.cov[1][1] = 0.03 * 0.03;
    pb.cov[0][1] = pb.cov[1][0] = 0.5 * 0.03 * 0.03;
    pw_unc_column_ctx col = cheap_column(0.88, 0.10, 0.50);
    pb.fn = pw_unc_column_fn;
    pb.ctx = &col;
    pb.n_out = PW_UNC_COLUMN_NOUT;
    pw_unc_options o = pw_unc_default_options();
    o.samples = 200;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    assert_int_equal(r.point_status, PW_OK);
    print_message("feasible in %zu of %zu draws (failed %zu)\n", r.n_feasible,
                  r.n_feasible + r.n_infeasible, r.n_failed);
    assert_true(r.p_feasible > 0.0 && r.p_feasible < 1.0);
    assert_true(r.n_infeasible > 0 && r.n_feasible > 0);
    char words[400];
    pw_unc_risk_words(&r, words, sizeof words);
    assert_non_null(strstr(words, "the split cannot be made"));
}

/* Measurement planning. Identity: the fit's covariance is chi2_red (J^T J)^-1 over its own
 * points, so fit_information of those points must reproduce it, and measuring the same points
 * once more halves it (delta-method sd / sqrt(2)). The recommended bin must reduce the sd. */
static void planning_information_identities(void **state)
{
    (void)state;
    const pw_system truth = margules_system(0.5, 0.3);
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 5);
    pw_dataset ds;
    make_data(&ds, &truth, 16, rng);
    gsl_rng_free(rng);
    pw_fit_result fr;
    fit_margules(&ds, &truth, 2, &fr);
    double info[PW_MAX_PARAMS][PW_MAX_PARAMS];
    assert_int_equal(fit_information(&fr, ds.pts, ds.n, info), PW_OK);
    double det = info[0][0] * info[1][1] - info[0][1] * info[1][0];
    double s2 = fr.chi2_red;
    pw_assert_close(s2 * info[1][1] / det, fr.cov[0][0], 1e-6, 0.0, "C00 from information");
    pw_assert_close(s2 * info[0][0] / det, fr.cov[1][1], 1e-6, 0.0, "C11 from information");
    pw_assert_close(-s2 * info[0][1] / det, fr.cov[0][1], 1e-6, 0.0, "C01 from information");

    pw_unc_column_ctx col = cheap_column(0.95, 0.05, 0.40);
    pw_unc_problem pb;
    assert_int_equal(pw_unc_problem_from_fit(&pb, &fr, pw_unc_column_fn, &col, PW_UNC_COLUMN_NOUT),
                     PW_OK);
    pw_unc_options o = pw_unc_default_options();
    o.samples = 0;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    pw_unc_plan plan;
    assert_int_equal(pw_unc_plan_measurements(&fr, r.out[PW_UNC_RMIN].grad, 10, 5, &plan), PW_OK);
    pw_assert_close(plan.sd_now, r.out[PW_UNC_RMIN].sd_lin, 1e-12, 0.0, "sd now");
    assert_true(plan.have_best);
    for (size_t b = 0; b < plan.n_bins; b++) {
        assert_true(plan.bins[b].ok);
        assert_true(plan.bins[b].reduction >= 0.0 && plan.bins[b].reduction < 1.0);
        assert_true(plan.bins[b].reduction <= plan.bins[plan.best].reduction);
    }
    assert_true(plan.bins[plan.best].reduction > 0.0);
    char words[400];
    pw_unc_plan_words(&plan, "R_min", words, sizeof words);
    print_message("%s\n", words);
    assert_non_null(strstr(words, "x1 between"));

    /* Same points again: C/2. Check through the information of the doubled data set. */
    pw_point twice[32];
    for (size_t i = 0; i < ds.n; i++)
        twice[i] = twice[i + ds.n] = ds.pts[i];
    double info2[PW_MAX_PARAMS][PW_MAX_PARAMS];
    assert_int_equal(fit_information(&fr, twice, 2 * ds.n, info2), PW_OK);
    pw_assert_close(info2[0][1], 2.0 * info[0][1], 1e-12, 0.0, "information adds");
    pw_fit_result_free(&fr);
    pw_dataset_free(&ds);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(interval_covers_true_rmin),
        cmocka_unit_test(linearised_and_sampled_agree_when_nearly_linear),
        cmocka_unit_test(straddling_feasibility_gives_intermediate_risk),
        cmocka_unit_test(planning_information_identities),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
