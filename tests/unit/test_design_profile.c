/* Design rows with stage profiles (constant molal overflow): the profile against an independent
 * stepping in closed form for constant relative volatility (McCabe & Thiele 1925), against the
 * column module's own stepping on the same curve, stage mass balances, and rows the column
 * cannot reach. */
#include "design_systems.h"

#include <pinchwise/curve.h>
#include <pinchwise/design.h>

#define ALPHA 2.5
#define P_PA 101325.0

/* Independent McCabe-Thiele stepping in closed form (x*(y) explicit), same conventions. */
static double closed_form_stages(const pw_column_spec *s, double R, int *feed, double *x_last)
{
    const double D = (s->zf - s->xb) / (s->xd - s->xb), B = 1.0 - D;
    const double S = ((R + 1.0) * D - (1.0 - s->q)) / B;
    const double m = R / (R + 1.0), sl = (S + 1.0) / S;
    const double xi = ((1.0 - m) * s->xd + (sl - 1.0) * s->xb) / (sl - m);
    double y = s->xd, xp = s->xd;
    *feed = 0;
    for (int n = 1; n < 1000; n++) {
        double x = design_crv_x(ALPHA, y);
        if (x <= s->xb) {
            if (!*feed)
                *feed = n;
            *x_last = x;
            return n - 1 + (xp - s->xb) / (xp - x);
        }
        if (!*feed && x < xi)
            *feed = n;
        y = *feed ? sl * x - (sl - 1.0) * s->xb : m * x + (1.0 - m) * s->xd;
        xp = x;
    }
    return NAN;
}

static void test_profile_closed_form(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(ALPHA);
    const double qs[] = {1.0, 0.0, 0.5, 1.3};
    for (size_t i = 0; i < sizeof qs / sizeof qs[0]; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = qs[i]};
        double rmin;
        assert_int_equal(pw_underwood_rmin(ALPHA, s.zf, s.xd, s.q, &rmin), PW_OK);
        pw_profile p;
        const double R = 1.3 * rmin;
        assert_int_equal(pw_cmo_profile(&sys, P_PA, &s, R, 500, &p), PW_OK);
        int feed;
        double x_last;
        double n_cf = closed_form_stages(&s, R, &feed, &x_last);
        /* Bubble points are solved to about 1e-10 in y; stage counts agree to that order. */
        pw_assert_close(p.stages, n_cf, 1e-6, 0, "stages vs closed-form stepping");
        assert_int_equal(p.feed_stage, feed);
        assert_int_equal((int)p.n, (int)ceil(n_cf));
        pw_assert_close(p.stage[p.n - 1].x, x_last, 1e-6, 1e-9, "last liquid");
        /* Every stage in equilibrium and at its bubble temperature. */
        for (size_t k = 0; k < p.n; k++) {
            pw_assert_close(p.stage[k].y, design_crv_y(ALPHA, p.stage[k].x), 1e-8, 1e-12,
                            "stage equilibrium");
            pw_eq_point e;
            assert_int_equal(pw_bubble_T(&sys, P_PA, p.stage[k].x, &e), PW_OK);
            pw_assert_close(p.stage[k].T_K, e.T_K, 1e-9, 0, "stage temperature");
        }
        /* Mass balance of every stage but the reboiler (whose liquid overshoots xb): liquid from
         * above (reflux xd for stage 1) + vapor from below + feed = liquid + vapor leaving. */
        const double D = (s.zf - s.xb) / (s.xd - s.xb);
        for (size_t k = 0; k + 1 < p.n; k++) {
            double in = (k == 0 ? R * D * s.xd : p.stage[k - 1].L * p.stage[k - 1].x) +
                        p.stage[k + 1].V * p.stage[k + 1].y +
                        ((int)k + 1 == p.feed_stage ? s.zf : 0.0);
            double tot_in = (k == 0 ? R * D : p.stage[k - 1].L) + p.stage[k + 1].V +
                            ((int)k + 1 == p.feed_stage ? 1.0 : 0.0);
            double out = p.stage[k].L * p.stage[k].x + p.stage[k].V * p.stage[k].y;
            double tot_out = p.stage[k].L + p.stage[k].V;
            pw_assert_close(in, out, 1e-12, 1e-13, "stage component balance");
            pw_assert_close(tot_in, tot_out, 1e-12, 1e-13, "stage total balance");
        }
        pw_profile_free(&p);
    }
}

/* Same stepping as the column module on the same fitted curve (the design rows replace its table).
 */
static void test_design_matches_column_step(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(1.8);
    pw_system_curve sc;
    assert_int_equal(pw_system_curve_init(&sc, &sys, P_PA), PW_OK);
    pw_curve c = pw_system_curve_bind(&sc);
    pw_column_spec s = {.xd = 0.98, .xb = 0.03, .zf = 0.4, .q = 0.7};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
    assert_true(r.feasible);
    pw_design_table t;
    assert_int_equal(pw_design_cmo(&sys, P_PA, &s, r.r_min, r.n_min, NULL, &t), PW_OK);
    assert_int_equal((int)t.n, (int)r.n_design);
    assert_int_equal(t.balance, PW_BALANCE_CMO);
    for (size_t i = 0; i < t.n; i++) {
        assert_true(t.row[i].reachable);
        pw_assert_close(t.row[i].stages, r.design[i].stages, 1e-7, 0, "stages as column module");
        assert_int_equal(t.row[i].feed_stage, r.design[i].feed_stage);
        pw_assert_close(t.row[i].boilup, r.design[i].boilup, 1e-13, 0, "boil-up");
        pw_assert_close(t.row[i].gilliland_stages, r.design[i].gilliland_stages, 1e-13, 0,
                        "Gilliland");
        assert_true(isnan(t.row[i].Q_C));
    }
    pw_design_table_free(&t);
}

/* A row the column cannot reach is a marked row, not a failure: below R_min the operating line
 * crosses the curve (pinch); a stage limit smaller than the stages needed. */
static void test_unreachable_rows(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(ALPHA);
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 1.0};
    double rmin;
    assert_int_equal(pw_underwood_rmin(ALPHA, s.zf, s.xd, s.q, &rmin), PW_OK);
    pw_column_options o = pw_column_default_options();
    o.n_factors = 2;
    o.factors[0] = 1.05;
    o.factors[1] = 3.0;
    pw_design_table t;
    /* R_min claimed 1.2 times too high: the first row is at 0.875 of the true R_min. */
    assert_int_equal(pw_design_cmo(&sys, P_PA, &s, rmin / 1.2, 5.0, &o, &t), PW_OK);
    assert_int_equal((int)t.n, 2);
    assert_false(t.row[0].reachable);
    assert_true(t.row[0].why == PW_EINFEASIBLE || t.row[0].why == PW_EMAXITER);
    assert_true(isnan(t.row[0].stages));
    assert_true(t.row[1].reachable);
    pw_design_table_free(&t);
    o.max_stages = 3;
    assert_int_equal(pw_design_cmo(&sys, P_PA, &s, rmin, 5.0, &o, &t), PW_OK);
    assert_false(t.row[0].reachable);
    assert_int_equal(t.row[0].why, PW_EMAXITER);
    pw_design_table_free(&t);
    pw_profile p;
    assert_int_equal(pw_cmo_profile(&sys, P_PA, &s, -1.0, 100, &p), PW_EINVAL);
    pw_column_spec bad = {.xd = 0.3, .xb = 0.05, .zf = 0.5, .q = 1.0};
    assert_int_equal(pw_cmo_profile(&sys, P_PA, &bad, 2.0, 100, &p), PW_EINVAL);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_profile_closed_form),
        cmocka_unit_test(test_design_matches_column_step),
        cmocka_unit_test(test_unreachable_rows),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
