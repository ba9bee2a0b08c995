/* Uncertainty propagation: identities of the sampler and of the two propagation routes, and the
 * AICc classes of the model comparison. Column and fit cases are in test_uncertainty_column.c.
 * Quantiles quoted below are standard table values (normal: Abramowitz & Stegun 1964, Table
 * 26.1; Student t: e.g. any statistics text's t table), from memory. */
#include "pw_test.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include "analysis/uncertainty_internal.h"

#include <pinchwise/uncertainty.h>
#include <stdio.h>
#include <string.h>

static pw_system model_system(const pw_model_type *m, double p0, double p1, double p2)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.model = m;
    s.params[0] = p0;
    s.params[1] = p1;
    s.params[2] = p2;
    s.T_ref_K = 350.0;
    return s;
}

/* Sample mean and covariance of draws match theta_hat and C within 4 standard errors
 * (SE of a mean: sqrt(C_ii/n); of a covariance: sqrt((C_ii C_jj + C_ij^2)/n), normal theory). */
static void draws_match_mean_and_covariance(void **state)
{
    (void)state;
    pw_system s = model_system(&pw_model_nrtl, 100.0, 300.0, 0.3);
    const double sd[3] = {20.0, 30.0, 0.02};
    const double rho[3][3] = {{1.0, 0.8, -0.4}, {0.8, 1.0, -0.2}, {-0.4, -0.2, 1.0}};
    double C[PW_MAX_PARAMS][PW_MAX_PARAMS] = {{0.0}};
    for (int i = 0; i < 3; i++)
        for (int j = 0; j < 3; j++)
            C[i][j] = rho[i][j] * sd[i] * sd[j];
    const bool fitted[PW_MAX_PARAMS] = {true, true, true};
    pw_unc_sampler sm;
    assert_int_equal(pw_unc_sampler_init(&sm, &s, fitted, &C[0][0], 0.0), PW_OK);
    assert_false(sm.eigen);
    assert_int_equal(sm.rank, 3);
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 7);
    enum { N = 20000 };
    double mean[3] = {0}, m2[3][3] = {{0}};
    static double d[N][PW_MAX_PARAMS];
    for (int n = 0; n < N; n++) {
        assert_int_equal(pw_unc_sampler_draw(&sm, rng, 100, d[n], NULL), PW_OK);
        for (int i = 0; i < 3; i++)
            mean[i] += d[n][i] / N;
    }
    for (int n = 0; n < N; n++)
        for (int i = 0; i < 3; i++)
            for (int j = 0; j < 3; j++)
                m2[i][j] += (d[n][i] - mean[i]) * (d[n][j] - mean[j]) / (N - 1);
    gsl_rng_free(rng);
    for (int i = 0; i < 3; i++) {
        pw_assert_close(mean[i], s.params[i], 0.0, 4.0 * sd[i] / sqrt((double)N), "draw mean");
        for (int j = 0; j < 3; j++) {
            double se = sqrt((C[i][i] * C[j][j] + C[i][j] * C[i][j]) / N);
            pw_assert_close(m2[i][j], C[i][j], 0.0, 4.0 * se, "draw covariance");
        }
    }
}

/* A rank-one C (the second parameter is twice the first) is not Cholesky-factorable: the eigen
 * route must give draws on the line, with the right variance. */
static void semidefinite_covariance_uses_eigen_route(void **state)
{
    (void)state;
    pw_system s = model_system(&pw_model_margules, 0.5, 0.3, 0.0);
    const double v[2] = {0.1, 0.2};
    double C[PW_MAX_PARAMS][PW_MAX_PARAMS] = {{0.0}};
    for (int i = 0; i < 2; i++)
        for (int j = 0; j < 2; j++)
            C[i][j] = v[i] * v[j];
    const bool fitted[PW_MAX_PARAMS] = {true, true};
    pw_unc_sampler sm;
    assert_int_equal(pw_unc_sampler_init(&sm, &s, fitted, &C[0][0], 0.0), PW_OK);
    assert_true(sm.eigen);
    assert_int_equal(sm.rank, 1);
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 3);
    enum { N = 5000 };
    double var = 0.0;
    for (int n = 0; n < N; n++) {
        double p[PW_MAX_PARAMS];
        assert_int_equal(pw_unc_sampler_draw(&sm, rng, 10, p, NULL), PW_OK);
        pw_assert_close(p[1] - 0.3, 2.0 * (p[0] - 0.5), 0.0, 1e-12, "draw on the line");
        var += (p[0] - 0.5) * (p[0] - 0.5) / N;
    }
    gsl_rng_free(rng);
    pw_assert_close(var, 0.01, 4.0 * sqrt(2.0 / N), 0.0, "variance along the line");
}

static void not_a_covariance_refused(void **state)
{
    (void)state;
    pw_system s = model_system(&pw_model_margules, 0.5, 0.3, 0.0);
    double C[PW_MAX_PARAMS][PW_MAX_PARAMS] = {{0.0}};
    C[0][0] = C[1][1] = 1.0;
    C[0][1] = C[1][0] = 2.0; /* correlation 2 */
    const bool fitted[PW_MAX_PARAMS] = {true, true};
    pw_unc_sampler sm;
    assert_int_equal(pw_unc_sampler_init(&sm, &s, fitted, &C[0][0], 0.0), PW_EINVAL);
    /* three correlations that no covariance can have together (determinant -0.22) */
    double R[3][3] = {{1.0, 0.8, -0.5}, {0.8, 1.0, 0.3}, {-0.5, 0.3, 1.0}};
    pw_system s3 = model_system(&pw_model_nrtl, 100.0, 300.0, 0.3);
    const bool fitted3[PW_MAX_PARAMS] = {true, true, true};
    for (int i = 0; i < 3; i++)
        for (int j = 0; j < 3; j++)
            C[i][j] = R[i][j];
    assert_int_equal(pw_unc_sampler_init(&sm, &s3, fitted3, &C[0][0], 0.0), PW_EINVAL);
    memset(C, 0, sizeof C);
    C[0][0] = 1.0;
    C[1][1] = -1.0;
    assert_int_equal(pw_unc_sampler_init(&sm, &s, fitted, &C[0][0], 0.0), PW_EINVAL);
}

/* van Laar needs A12 and A21 of one sign: draws around (0.1, 0.1) with sd 0.2 often leave the
 * domain; they are redrawn and counted, and every returned set is inside. */
static void draws_outside_domain_are_redrawn(void **state)
{
    (void)state;
    pw_unc_problem pb;
    memset(&pb, 0, sizeof pb);
    pb.sys = model_system(&pw_model_vanlaar, 0.1, 0.1, 0.0);
    pb.fitted[0] = pb.fitted[1] = true;
    pb.cov[0][0] = pb.cov[1][1] = 0.04;
    static double d[500][PW_MAX_PARAMS];
    size_t redrawn = 0;
    assert_int_equal(pw_unc_draw_params(&pb, 11, 500, d, &redrawn), PW_OK);
    assert_true(redrawn > 50); /* P(opposite signs) is about 0.38 here */
    for (int n = 0; n < 500; n++)
        assert_int_equal(pw_model_vanlaar.check(d[n]), PW_OK);
}

/* f = a . theta: the delta method is exact, Var f = a^T C a; the sampled interval approaches
 * value -/+ 1.959964 sd (normal) within percentile sampling error. */
typedef struct lin_ctx {
    double a[3];
} lin_ctx;

static pw_status linear_fn(void *ctx, const pw_system *sys, double *out)
{
    const lin_ctx *c = ctx;
    out[0] = c->a[0] * sys->params[0] + c->a[1] * sys->params[1] + c->a[2] * sys->params[2];
    out[1] = sys->params[0];
    return PW_OK;
}

static void linear_function_exact(void **state)
{
    (void)state;
    lin_ctx c = {{2.0, -1.0, 0.5}};
    pw_unc_problem pb;
    memset(&pb, 0, sizeof pb);
    pb.sys = model_system(&pw_model_nrtl, 100.0, 300.0, 0.3);
    pb.fitted[0] = pb.fitted[1] = true; /* alpha fixed: its covariance entries are ignored */
    pb.cov[0][0] = 400.0;
    pb.cov[1][1] = 900.0;
    pb.cov[0][1] = pb.cov[1][0] = 240.0;
    pb.cov[2][2] = 1e6;
    pb.fn = linear_fn;
    pb.ctx = &c;
    pb.n_out = 2;
    pw_unc_options o = pw_unc_default_options();
    o.samples = 20000;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    double sd = sqrt(4.0 * 400.0 + 900.0 - 4.0 * 240.0);
    const pw_unc_output *u = &r.out[0];
    assert_true(u->lin_ok && u->mc_ok);
    pw_assert_close(u->value, 200.0 - 300.0 + 0.15, 1e-14, 0.0, "value");
    pw_assert_close(u->grad[0], 2.0, 1e-9, 0.0, "gradient 0");
    pw_assert_close(u->grad[1], -1.0, 1e-9, 0.0, "gradient 1");
    assert_true(u->grad[2] == 0.0);
    pw_assert_close(u->sd_lin, sd, 1e-9, 0.0, "delta-method sd");
    pw_assert_close(u->ci_lin[1] - u->value, 1.959964 * sd, 1e-6, 0.0, "normal quantile");
    /* sd of a 2.5 % sample quantile: sqrt(p(1-p)/n)/phi(1.96) sd = 0.0191 sd at n = 20000 */
    pw_assert_close(u->ci_mc[0], u->ci_lin[0], 0.0, 4.0 * 0.0191 * sd, "sampled low end");
    pw_assert_close(u->ci_mc[1], u->ci_lin[1], 0.0, 4.0 * 0.0191 * sd, "sampled high end");
    assert_false(u->disagree);
    assert_false(u->ci_sampled);
    assert_int_equal(r.n_feasible, 20000);
    pw_assert_close(r.p_feasible, 1.0, 0.0, 0.0, "all feasible");
    /* With the fit's degrees of freedom the quantile is Student's t: t(0.975, 10) = 2.228139. */
    pb.dof = 10.0;
    o.samples = 0;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    pw_assert_close(r.out[0].ci_lin[1] - r.out[0].value, 2.228139 * sd, 1e-6, 0.0, "t quantile");
}

/* The progress callback: called once per draw, in order; a status other than PW_OK stops the
 * propagation with that status. */
typedef struct progress_log {
    size_t calls, last_done, total, stop_at;
} progress_log;

static pw_status count_progress(void *ctx, size_t done, size_t total)
{
    progress_log *p = ctx;
    if (done != p->last_done + 1)
        return PW_EDOM; /* out of order: fails the test through the status below */
    p->calls++;
    p->last_done = done;
    p->total = total;
    return p->stop_at && done == p->stop_at ? PW_EINVAL : PW_OK;
}

static void progress_called_per_draw(void **state)
{
    (void)state;
    lin_ctx c = {{2.0, -1.0, 0.5}};
    pw_unc_problem pb;
    memset(&pb, 0, sizeof pb);
    pb.sys = model_system(&pw_model_nrtl, 100.0, 300.0, 0.3);
    pb.fitted[0] = pb.fitted[1] = true;
    pb.cov[0][0] = 400.0;
    pb.cov[1][1] = 900.0;
    pb.fn = linear_fn;
    pb.ctx = &c;
    pb.n_out = 1;
    pw_unc_options o = pw_unc_default_options();
    o.samples = 30;
    progress_log log = {0};
    o.progress = count_progress;
    o.progress_ctx = &log;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    assert_int_equal(log.calls, 30);
    assert_int_equal(log.total, 30);
    memset(&log, 0, sizeof log);
    log.stop_at = 7;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_EINVAL);
    assert_int_equal(log.calls, 7);
    assert_int_equal(r.n_samples, 7);
}

/* Zero covariance: both intervals collapse onto the value. */
static void zero_covariance_collapses(void **state)
{
    (void)state;
    lin_ctx c = {{2.0, -1.0, 0.5}};
    pw_unc_problem pb;
    memset(&pb, 0, sizeof pb);
    pb.sys = model_system(&pw_model_nrtl, 100.0, 300.0, 0.3);
    pb.fitted[0] = pb.fitted[1] = true;
    pb.fn = linear_fn;
    pb.ctx = &c;
    pb.n_out = 1;
    pw_unc_options o = pw_unc_default_options();
    o.samples = 50;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    const pw_unc_output *u = &r.out[0];
    assert_true(u->ci_lin[0] == u->value && u->ci_lin[1] == u->value);
    assert_true(u->ci_mc[0] == u->value && u->ci_mc[1] == u->value);
    assert_true(u->ci[0] == u->value && u->ci[1] == u->value);
    assert_int_equal(r.rank, 0);
}

/* A strongly non-linear function (exp of a parameter with sd 1) trips the disagreement rule,
 * and the quoted interval is then the sampled one. */
static pw_status exp_fn(void *ctx, const pw_system *sys, double *out)
{
    (void)ctx;
    out[0] = exp(sys->params[0]);
    return PW_OK;
}

static void disagreement_rule_fires_when_nonlinear(void **state)
{
    (void)state;
    pw_unc_problem pb;
    memset(&pb, 0, sizeof pb);
    pb.sys = model_system(&pw_model_margules, 0.0, 0.0, 0.0);
    pb.fitted[0] = true;
    pb.cov[0][0] = 1.0;
    pb.fn = exp_fn;
    pb.n_out = 1;
    pw_unc_options o = pw_unc_default_options();
    o.samples = 2000;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    const pw_unc_output *u = &r.out[0];
    /* lognormal: exact percentiles exp(-/+1.96) = 0.141, 7.10; linearised 1 -/+ 1.96 */
    assert_true(u->disagree);
    assert_true(u->ci_sampled);
    pw_assert_close(u->ci[1], exp(1.959964), 0.15, 0.0, "lognormal upper percentile");
    pw_assert_close(u->ci[0], exp(-1.959964), 0.15, 0.0, "lognormal lower percentile");
}

/* Infeasible outcomes are counted apart from failures. */
static pw_status half_infeasible_fn(void *ctx, const pw_system *sys, double *out)
{
    (void)ctx;
    if (sys->params[0] > 0.5)
        return PW_EINFEASIBLE;
    if (sys->params[0] < -2.5)
        return PW_ENOCONV;
    out[0] = sys->params[0];
    return PW_OK;
}

static void infeasible_share_counted(void **state)
{
    (void)state;
    pw_unc_problem pb;
    memset(&pb, 0, sizeof pb);
    pb.sys = model_system(&pw_model_margules, 0.0, 0.0, 0.0);
    pb.fitted[0] = true;
    pb.cov[0][0] = 1.0;
    pb.fn = half_infeasible_fn;
    pb.n_out = 1;
    pw_unc_options o = pw_unc_default_options();
    o.samples = 4000;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    /* P(z > 0.5) = 0.3085 (normal table), P(z < -2.5) = 0.0062 */
    double p_inf = 0.3085 / (1.0 - 0.0062);
    pw_assert_close(1.0 - r.p_feasible, p_inf, 0.0, 4.0 * sqrt(p_inf * (1 - p_inf) / 4000.0),
                    "infeasible share");
    assert_true(r.n_failed > 0 && r.n_failed < 60);
    char words[400];
    pw_unc_risk_words(&r, words, sizeof words);
    assert_non_null(strstr(words, "the split cannot be made"));
    char pct[16];
    snprintf(pct, sizeof pct, "in %.0f %% ", round(100.0 * (1.0 - r.p_feasible)));
    assert_non_null(strstr(words, pct));
}

/* Model comparison: Burnham & Anderson (2002) classes and Akaike weights. */
static pw_status first_param_fn(void *ctx, const pw_system *sys, double *out)
{
    (void)ctx;
    if (sys->params[0] > 5.0)
        return PW_EINFEASIBLE;
    out[0] = sys->params[0];
    return PW_OK;
}

static void model_classes_by_aicc(void **state)
{
    (void)state;
    static pw_fit_result f[4];
    const double aicc[4] = {101.5, 100.0, 105.0, 120.0};
    const double p0[4] = {0.8, 0.7, 9.0, 0.1};
    const pw_fit_result *fp[4];
    for (int i = 0; i < 4; i++) {
        memset(&f[i], 0, sizeof f[i]);
        f[i].sys = model_system(&pw_model_margules, p0[i], 0.2, 0.0);
        f[i].aicc = aicc[i];
        f[i].n_residuals = 30;
        f[i].converged = true; /* the ranking rule (assess.h) counts only sound fits */
        fp[i] = &f[i];
    }
    pw_unc_models m;
    assert_int_equal(pw_unc_compare_models(fp, 4, first_param_fn, NULL, 1, &m), PW_OK);
    assert_int_equal(m.best, 1);
    assert_int_equal(m.rows[0].cls, PW_UNC_MODEL_EQUAL);
    assert_int_equal(m.rows[1].cls, PW_UNC_MODEL_BEST);
    assert_int_equal(m.rows[2].cls, PW_UNC_MODEL_CONSIDERED);
    assert_int_equal(m.rows[3].cls, PW_UNC_MODEL_DROPPED);
    assert_int_equal(m.rows[2].status, PW_EINFEASIBLE);
    assert_true(m.feasibility_differs);
    assert_int_equal(m.n_considered, 3);
    pw_assert_close(m.lo[0], 0.7, 0, 0, "spread low");
    pw_assert_close(m.hi[0], 0.8, 0, 0, "spread high (dropped model left out)");
    double wsum = 1.0 + exp(-0.75) + exp(-2.5);
    pw_assert_close(m.rows[1].weight, 1.0 / wsum, 1e-12, 0, "Akaike weight");
    assert_true(m.rows[3].weight == 0.0);
    /* an unsound fit (here: predicts a liquid split) is dropped whatever its AICc */
    f[3].aicc = 90.0;
    f[3].split = true;
    assert_int_equal(pw_unc_compare_models(fp, 4, first_param_fn, NULL, 1, &m), PW_OK);
    assert_int_equal(m.best, 1);
    assert_int_equal(m.rows[3].cls, PW_UNC_MODEL_DROPPED);
    snprintf(f[0].dataset_sha256, sizeof f[0].dataset_sha256, "%064d", 1); /* different data */
    snprintf(f[3].dataset_sha256, sizeof f[3].dataset_sha256, "%064d", 2);
    assert_int_equal(pw_unc_compare_models(fp, 4, first_param_fn, NULL, 1, &m), PW_EINVAL);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(draws_match_mean_and_covariance),
        cmocka_unit_test(semidefinite_covariance_uses_eigen_route),
        cmocka_unit_test(not_a_covariance_refused),
        cmocka_unit_test(draws_outside_domain_are_redrawn),
        cmocka_unit_test(linear_function_exact),
        cmocka_unit_test(zero_covariance_collapses),
        cmocka_unit_test(progress_called_per_draw),
        cmocka_unit_test(disagreement_rule_fires_when_nonlinear),
        cmocka_unit_test(infeasible_share_counted),
        cmocka_unit_test(model_classes_by_aicc),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
