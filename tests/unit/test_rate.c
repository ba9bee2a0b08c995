/* Rating a given column (constant molal overflow): check values for constant relative
 * volatility, the total-reflux limit (Fenske 1932), mass balances of every stage, a design
 * stepped at some R and rated with its stages, feed stage and R giving back its products, seeded
 * random columns against an independent closed-form shooting residual, and refusals. */
#include "design_systems.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
#include <pinchwise/design.h>
#include <stdlib.h>

#define P_PA 101325.0

static void rate_ok(const pw_system *sys, pw_rate_spec s, pw_rate_result *r)
{
    pw_error err;
    pw_error_clear(&err);
    pw_status st = pw_rate_cmo(sys, P_PA, &s, r, &err);
    if (st != PW_OK)
        fail_msg("rate: %s", err.msg);
}

/* METHODS2 6.4 (values computed by the methods brief with two independent strategies, agreeing
 * to 1e-10), z = 0.5, alpha = 2.5. Our bubble points hold y* to about 1e-10. */
static void test_constant_alpha_values(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(2.5);
    struct {
        int N, K;
        double R, D, q, xd, xb;
    } c[] = {
        {10, 5, 1.5, 0.5, 1.0, 0.9256129418, 0.0743870582},
        {10, 5, 1.5, 0.5, 0.0, 0.8051516177, 0.1948483823},
        {20, 10, 2.0, 0.5, 1.0, 0.9951318069, 0.0048681931},
        {10, 5, 1.5, 0.4, 1.0, 0.9432570077, 0.2044953282},
    };
    for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
        pw_rate_result r;
        rate_ok(&sys, (pw_rate_spec){c[i].N, c[i].K, c[i].R, 0.5, c[i].q, c[i].D}, &r);
        pw_assert_close(r.xd, c[i].xd, 0, 2e-9, "xd (METHODS2 6.4, computed)");
        pw_assert_close(r.xb, c[i].xb, 0, 2e-9, "xb (METHODS2 6.4, computed)");
        assert_int_equal((int)r.profile.n, c[i].N);
        pw_rate_result_free(&r);
    }
    /* Total-reflux limit, N = 10 with the reboiler, D/F = 0.5, z = 0.5: symmetric products with
     * xd/(1-xd) = alpha^5 xb/(1-xb)... = 1/(1 + alpha^-5) (Fenske 1932); R = 1000 gives
     * 0.98981458 (METHODS2 6.4, computed). */
    pw_rate_result r;
    rate_ok(&sys, (pw_rate_spec){10, 5, 1000.0, 0.5, 1.0, 0.5}, &r);
    pw_assert_close(r.xd, 0.98981458, 0, 2e-8, "R = 1000");
    pw_assert_close(r.xd, 1.0 / (1.0 + pow(2.5, -5.0)), 0, 1e-4, "near the Fenske limit");
    pw_rate_result_free(&r);
}

/* Every stage's component and total balance, feed stage and reboiler included; products close
 * the overall balance. */
static void check_balances(const pw_rate_spec *s, const pw_rate_result *r)
{
    const pw_profile *p = &r->profile;
    const double D = s->d_frac, B = 1.0 - D;
    pw_assert_close(D * r->xd + B * r->xb, s->zf, 0, 1e-14, "overall balance");
    for (size_t k = 0; k < p->n; k++) {
        int n = (int)k + 1;
        double Lin = k == 0 ? s->R * D : p->stage[k - 1].L;
        double xin = k == 0 ? r->xd : p->stage[k - 1].x;
        double Vin = k + 1 < p->n ? p->stage[k + 1].V : 0.0;
        double yin = k + 1 < p->n ? p->stage[k + 1].y : 0.0;
        double F = n == s->feed_stage ? 1.0 : 0.0;
        double in = Lin * xin + Vin * yin + F * s->zf;
        double out = p->stage[k].L * p->stage[k].x + p->stage[k].V * p->stage[k].y;
        pw_assert_close(in, out, 0, 1e-9, "stage component balance");
        pw_assert_close(Lin + Vin + F, p->stage[k].L + p->stage[k].V, 0, 1e-12,
                        "stage total balance");
    }
    pw_assert_close(p->stage[0].y, r->xd, 0, 0, "total condenser: y1 = xd");
    /* (feed on the reboiler: its liquid is the top section's, within the feed-stage mismatch) */
    pw_assert_close(p->stage[p->n - 1].x, r->xb, 0, 1e-12 + fabs(r->residual),
                    "reboiler = bottoms");
}

static void test_balances(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(1.7);
    pw_rate_spec specs[] = {
        {15, 8, 2.2, 0.4, 1.0, 0.45}, {15, 1, 3.0, 0.3, 0.0, 0.3}, {15, 15, 1.0, 0.6, 1.4, 0.55},
        {1, 1, 0.5, 0.5, 1.0, 0.4},   {8, 3, 0.0, 0.5, 1.0, 0.5},
    };
    for (size_t i = 0; i < sizeof specs / sizeof specs[0]; i++) {
        pw_rate_result r;
        rate_ok(&sys, specs[i], &r);
        check_balances(&specs[i], &r);
        pw_rate_result_free(&r);
    }
}

/* An invented non-ideal liquid (NRTL; b12 = 150 K, b21 = 100 K, alpha = 0.3; no azeotrope),
 * used only for identities. */
static pw_system nonideal(void)
{
    pw_system s = design_ideal_system(3.0);
    s.model = &pw_model_nrtl;
    s.params[0] = 150.0;
    s.params[1] = 100.0;
    s.params[2] = 0.3;
    return s;
}

typedef struct design_ctx {
    const pw_system *sys;
    pw_column_spec s;
    double R, N;
    int feed;
} design_ctx;

static double stages_minus_N(double xb, void *p)
{
    design_ctx *c = p;
    c->s.xb = xb;
    pw_profile prof;
    if (pw_cmo_profile(c->sys, P_PA, &c->s, c->R, 500, &prof) != PW_OK)
        return GSL_NAN;
    c->feed = prof.feed_stage;
    pw_profile_free(&prof);
    return prof.stages - c->N;
}

/* Round trip: step a design at R down to the xb that takes exactly N stages, then rate a column
 * with N stages, that feed stage and R at the design's D/F: the products come back. */
static void test_design_round_trip(void **state)
{
    (void)state;
    pw_system sys = nonideal();
    const double qs[] = {1.0, 0.4};
    for (int k = 0; k < 2; k++) {
        design_ctx c = {&sys, {.xd = 0.95, .xb = 0.02, .zf = 0.45, .q = qs[k]}, 3.0, 0.0, 0};
        pw_profile prof;
        assert_int_equal(pw_cmo_profile(&sys, P_PA, &c.s, c.R, 500, &prof), PW_OK);
        c.N = ceil(prof.stages);
        pw_profile_free(&prof);
        /* stages(xb) is continuous and decreasing: bracket [xb for N, 0.02]. */
        gsl_root_fsolver *rs = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
        gsl_function F = {stages_minus_N, &c};
        double lo = 1e-4, hi = 0.02;
        assert_true(stages_minus_N(lo, &c) > 0.0 && stages_minus_N(hi, &c) < 0.0);
        assert_int_equal(gsl_root_fsolver_set(rs, &F, lo, hi), GSL_SUCCESS);
        double xb = NAN;
        for (int it = 0; it < 200; it++) {
            gsl_root_fsolver_iterate(rs);
            double a = gsl_root_fsolver_x_lower(rs), b = gsl_root_fsolver_x_upper(rs);
            if (gsl_root_test_interval(a, b, 1e-15, 1e-13) == GSL_SUCCESS) {
                xb = gsl_root_fsolver_root(rs);
                break;
            }
        }
        gsl_root_fsolver_free(rs);
        assert_true(isfinite(xb));
        stages_minus_N(xb, &c);
        const double D = (c.s.zf - xb) / (c.s.xd - xb);
        pw_rate_result r;
        pw_rate_spec rs_spec = {(int)c.N, c.feed, c.R, c.s.zf, c.s.q, D};
        rate_ok(&sys, rs_spec, &r);
        pw_assert_close(r.xd, c.s.xd, 0, 1e-8, "rated xd = designed xd");
        pw_assert_close(r.xb, xb, 0, 1e-8, "rated xb = designed xb");
        check_balances(&rs_spec, &r);
        pw_rate_result_free(&r);
    }
}

/* Independent residual: the two sections stepped in closed form (constant alpha). */
static double cf_residual2(double a, const pw_rate_spec *s, double xd, double xb)
{
    const double D = s->d_frac, B = 1.0 - D, L = s->R * D, V = L + D;
    const double Lb = s->feed_stage == s->n_stages ? B : L + s->q, Vb = V - (1.0 - s->q);
    double y = xd, x = 0.0;
    for (int n = 1; n <= s->feed_stage; n++) {
        x = design_crv_x(a, y);
        y = (L * x + D * xd) / V;
    }
    double xs = xb;
    for (int n = s->n_stages; n > s->feed_stage; n--)
        xs = (Vb * design_crv_y(a, xs) + B * xb) / Lb;
    return x - xs;
}

static double cf_residual(double a, const pw_rate_spec *s, double xd)
{
    return cf_residual2(a, s, xd, (s->zf - s->d_frac * xd) / (1.0 - s->d_frac));
}

/* Seeded random columns: the returned xd zeroes the closed-form residual and the residual
 * changes sign across it (the root is where the independent computation puts it). */
static void test_random_columns(void **state)
{
    (void)state;
    srand(20261202u);
    for (int t = 0; t < 40; t++) {
        double a = 1.2 + 3.0 * rand() / (double)RAND_MAX;
        pw_system sys = design_ideal_system(a);
        pw_rate_spec s;
        s.n_stages = 2 + rand() % 30;
        s.feed_stage = 1 + rand() % s.n_stages;
        s.zf = 0.05 + 0.9 * rand() / (double)RAND_MAX;
        s.d_frac = 0.05 + 0.9 * rand() / (double)RAND_MAX;
        s.q = -0.3 + 1.8 * rand() / (double)RAND_MAX;
        s.R = 0.2 + 5.0 * rand() / (double)RAND_MAX;
        if (!((s.R + 1.0) * s.d_frac - (1.0 - s.q) > 0.0))
            continue;
        pw_rate_result r;
        rate_ok(&sys, s, &r);
        if (getenv("PW_DEBUG"))
            print_message("a %g N %d K %d zf %g D %g q %g R %g -> xd %.15g res %g it %d\n", a,
                          s.n_stages, s.feed_stage, s.zf, s.d_frac, s.q, s.R, r.xd, r.residual,
                          r.iterations);
        double h = 1e-6;
        double lo = fmax(0.0, (s.zf - (1.0 - s.d_frac)) / s.d_frac);
        double hi = fmin(1.0, s.zf / s.d_frac);
        if (r.xd - h > lo)
            assert_true(cf_residual(a, &s, r.xd - h) < 0.0);
        if (r.xd + h < hi)
            assert_true(cf_residual(a, &s, r.xd + h) > 0.0);
        /* A product within 1e-7 of 1 is resolved only to about 1e-16 absolute, which the stages
         * amplify (up to alpha^N): 1e-7 on the residual, the sign test above is the criterion. */
        pw_assert_close(cf_residual2(a, &s, r.xd, r.xb), 0.0, 0, 1e-7, "closed-form residual");
        check_balances(&s, &r);
        pw_rate_result_free(&r);
    }
}

static void test_refusals(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(2.0);
    pw_rate_result r;
    pw_error err;
    const double bad_D[] = {0.0, 1.0, 1.2, -0.1};
    for (size_t i = 0; i < 4; i++) {
        pw_rate_spec s = {10, 5, 2.0, 0.5, 1.0, bad_D[i]};
        assert_int_equal(pw_rate_cmo(&sys, P_PA, &s, &r, &err), PW_EINFEASIBLE);
        assert_non_null(strstr(err.msg, "feed cannot supply"));
    }
    pw_rate_spec vap = {10, 5, 0.2, 0.5, -1.0, 0.3}; /* superheated feed: no boil-up left */
    assert_int_equal(pw_rate_cmo(&sys, P_PA, &vap, &r, &err), PW_EINFEASIBLE);
    assert_non_null(strstr(err.msg, "boil-up"));
    pw_rate_spec k = {10, 11, 2.0, 0.5, 1.0, 0.5};
    assert_int_equal(pw_rate_cmo(&sys, P_PA, &k, &r, &err), PW_EINVAL);
    pw_rate_spec z = {10, 5, 2.0, 1.0, 1.0, 0.5};
    assert_int_equal(pw_rate_cmo(&sys, P_PA, &z, &r, &err), PW_EINVAL);
    pw_rate_spec n = {0, 1, 2.0, 0.5, 1.0, 0.5};
    assert_int_equal(pw_rate_cmo(&sys, P_PA, &n, &r, &err), PW_EINVAL);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_constant_alpha_values),
        cmocka_unit_test(test_balances),
        cmocka_unit_test(test_design_round_trip),
        cmocka_unit_test(test_random_columns),
        cmocka_unit_test(test_refusals),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
