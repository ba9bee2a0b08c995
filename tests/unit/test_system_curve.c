/* Column driven by a pw_system through pw_system_curve (bubble points at fixed P).
 * An ideal liquid (Margules with A12 = A21 = 0) whose two Antoine equations share B and C has a
 * constant relative volatility alpha = P1sat/P2sat = exp(A1 - A2) at every temperature, so the
 * minimum reflux must equal Underwood's closed form (Underwood 1948) and N_min Fenske's (1932),
 * up to the bubble-point tolerance. The Antoine constants are invented for the test. */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/curve.h>
#include <stdio.h>
#include <string.h>

static pw_component invented(const char *name, double A)
{
    return pw_test_antoine(name, A, 3000.0, -50.0, PW_LN, "kPa", "K", 250.0, 500.0);
}

static pw_system ideal_system(double alpha)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = invented("light (invented)", 14.0 + log(alpha));
    s.comp[1] = invented("heavy (invented)", 14.0);
    s.model = &pw_model_margules;
    s.T_ref_K = 350.0;
    return s;
}

static void test_ideal_constant_alpha(void **state)
{
    (void)state;
    pw_system sys = ideal_system(2.5);
    pw_system_curve sc;
    assert_int_equal(pw_system_curve_init(&sc, &sys, 101325.0), PW_OK);
    pw_curve c = pw_system_curve_bind(&sc);
    double y;
    assert_int_equal(c.y_of_x(c.ctx, 0.4, &y), PW_OK);
    pw_assert_close(y, 2.5 * 0.4 / (1.0 + 1.5 * 0.4), 1e-7, 0, "y* constant alpha");
    const double qs[] = {1.0, 0.0, 0.5, 1.5};
    for (size_t i = 0; i < sizeof qs / sizeof qs[0]; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = qs[i]};
        pw_column_result r;
        assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
        assert_true(r.feasible);
        double ru;
        assert_int_equal(pw_underwood_rmin(2.5, 0.5, 0.95, qs[i], &ru), PW_OK);
        pw_assert_close(r.r_min, ru, 1e-6, 0, "R_min vs Underwood");
        assert_int_equal(r.pinch.kind, PW_PINCH_FEED);
        double nf = NAN;
        assert_int_equal(pw_fenske_nmin(2.5, 0.95, 0.05, &nf), PW_OK);
        pw_assert_close(r.n_fenske, nf, 1e-6, 0, "Fenske");
    }
    assert_true(sc.n_eval > 0);
    assert_int_equal(c.y_of_x(c.ctx, 1.5, &y), PW_EDOM);
    assert_int_equal(pw_system_curve_init(&sc, &sys, -1.0), PW_EINVAL);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_ideal_constant_alpha),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
