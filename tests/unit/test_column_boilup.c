/* Vapor-rich dilute feeds: when the q-line meets the equilibrium curve below xb, the minimum
 * reflux is where the boil-up falls to zero (mass balance identity: R = (1 - q)F/D - 1), unless
 * a rectifying tangent pinch lies above it. Curves: constant relative volatility (identity). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/column.h>

static pw_status alpha_curve(void *ctx, double x, double *y)
{
    double a = *(const double *)ctx;
    *y = a * x / (1.0 + (a - 1.0) * x);
    return PW_OK;
}

static void zero_boilup_limit(void **state)
{
    (void)state;
    double alpha = 30.0; /* very volatile light component: y*(0.02) = 0.38 */
    pw_curve c = {alpha_curve, &alpha};
    const double qs[] = {0.0, 0.5, -0.2};
    for (int i = 0; i < 3; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.02, .zf = 0.10, .q = qs[i]};
        pw_column_result r;
        assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
        assert_true(r.feasible);
        assert_true(r.boilup_limited);
        double D = (s.zf - s.xb) / (s.xd - s.xb);
        double R0 = (1.0 - s.q) / D - 1.0; /* Vbar = (R + 1) D - (1 - q) F = 0 */
        pw_assert_close(r.r_min, R0, 1e-12, 0.0, "R_min at zero boil-up");
        pw_assert_close(r.s_min, 0.0, 0.0, 1e-9, "boil-up");
        /* Slightly above R_min the rectifying line stays below the curve on [xb, xd]. */
        double R = r.r_min * (1.0 + 1e-6), m = R / (R + 1.0);
        for (int k = 0; k <= 2000; k++) {
            double x = s.xb + (s.xd - s.xb) * k / 2000.0, y;
            alpha_curve(&alpha, x, &y);
            assert_true(y >= m * x + (1.0 - m) * s.xd - 1e-12);
        }
        assert_true(r.n_design == 3 && r.design[0].stages > r.n_min);
    }
}

/* A feed rich in component 1 (zf = 0.9 for xd = 0.95): Underwood's R_min (1948) is negative for
 * q = 1, 2, 3, 6, i.e. no reflux is needed; for q = 3 and 6 the q-line meets the curve above xd.
 * pinchwise reports R_min = 0 with the flag set, and at R = 0 the stripping line through (xb, xb)
 * and the q-line point at y = xd stays below the curve (mass balance identity). */
static void no_reflux_needed(void **state)
{
    (void)state;
    double alpha = 2.5;
    pw_curve c = {alpha_curve, &alpha};
    const double qs[] = {1.0, 2.0, 3.0, 6.0};
    for (int i = 0; i < 4; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.90, .q = qs[i]};
        double u;
        assert_int_equal(pw_underwood_rmin(alpha, s.zf, s.xd, s.q, &u), PW_OK);
        assert_true(u < 0.0);
        pw_column_result r;
        assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
        assert_true(r.feasible);
        assert_true(r.reflux_limited);
        pw_assert_close(r.r_min, 0.0, 0.0, 0.0, "R_min");
        assert_int_equal(r.n_design, 0);
        assert_true(r.n_min > 1.0);
        double xi = s.q == 1.0 ? s.zf : ((s.q - 1.0) * s.xd + s.zf) / s.q;
        double slope = (s.xd - s.xb) / (xi - s.xb);
        for (int k = 0; k <= 1000; k++) {
            double x = s.xb + (xi - s.xb) * k / 1000.0, y;
            alpha_curve(&alpha, x, &y);
            assert_true(y >= s.xb + slope * (x - s.xb) - 1e-12);
        }
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {cmocka_unit_test(zero_boilup_limit),
                                       cmocka_unit_test(no_reflux_needed)};
    return cmocka_run_group_tests(tests, NULL, NULL);
}
