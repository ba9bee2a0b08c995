/* Seeded dew points (pw_dew_T_from, pw_dew_P_from; src/thermo/equilibrium.c) against the
 * unseeded solver and against the bubble point they invert.
 *
 * System: 1-propanol/water with the NRTL parameters of Smith, Van Ness & Abbott, 7th ed.,
 * Table 12.5 and the Antoine rows of their Table B.2 (METHODS 2.5, 5.5; confirmed), at 1 atm and
 * at 360 K. Identities checked: (1) a start changes the number of steps, never the root: with
 * good, poor, outside and missing starts the dew T (P) and liquid agree with the unseeded solve
 * to the solver's tolerance; (2) the bubble point of the returned liquid gives back the vapor and
 * the temperature (pressure). */
#include "pw_test.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/equilibrium.h>
#include <string.h>

#define R_SVNA 1.987

static pw_system propanol_water(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = pw_test_antoine("1-propanol", 16.1154, 3483.67, 205.807, PW_LN, "kPa", "C", NAN,
                                NAN);
    s.comp[1] = pw_test_antoine("water", 16.3872, 3885.70, 230.170, PW_LN, "kPa", "C", NAN, NAN);
    s.model = &pw_model_nrtl;
    s.T_ref_K = 360.0;
    s.params[0] = 500.40 / R_SVNA;
    s.params[1] = 1636.57 / R_SVNA;
    s.params[2] = 0.5081;
    return s;
}

static void seeded_equals_unseeded(void **state)
{
    (void)state;
    const pw_system s = propanol_water();
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 77UL);
    int n = 0;
    for (int k = 0; k < 400; k++) {
        const bool isobaric = k % 2 == 0;
        const double y = 1e-4 + (1.0 - 2e-4) * gsl_rng_uniform(rng);
        pw_eq_point ref, e, b;
        pw_status st = isobaric ? pw_dew_T(&s, 101325.0, y, &ref) : pw_dew_P(&s, 360.0, y, &ref);
        assert_int_equal(st, PW_OK);
        /* starts: near the root, a poor one, outside (0, 1), none */
        const double xg[4] = {ref.x1 * (1.0 + 0.02 * (gsl_rng_uniform(rng) - 0.5)),
                              gsl_rng_uniform(rng), 1.5, NAN};
        const double Tg[4] = {ref.T_K + 0.3, ref.T_K - 20.0, -1.0, NAN};
        for (int g = 0; g < 4; g++) {
            st = isobaric ? pw_dew_T_from(&s, 101325.0, y, xg[g], Tg[g], &e)
                          : pw_dew_P_from(&s, 360.0, y, xg[g], &e);
            assert_int_equal(st, PW_OK);
            pw_assert_close(e.x1, ref.x1, 1e-12, 1e-10, "liquid, seeded against unseeded");
            /* the liquid converges to 1e-13 and the inner bubble T to 1e-10 K (docs/thermo.md) */
            pw_assert_close(e.T_K, ref.T_K, 0.0, 5e-10, "dew T, seeded against unseeded");
            pw_assert_close(e.P_Pa, ref.P_Pa, 1e-11, 1e-9, "dew P, seeded against unseeded");
            assert_true(e.y1 == y);
        }
        /* the bubble point of the dew liquid gives the vapor back */
        st = isobaric ? pw_bubble_T(&s, 101325.0, e.x1, &b) : pw_bubble_P(&s, 360.0, e.x1, &b);
        assert_int_equal(st, PW_OK);
        pw_assert_close(b.y1, y, 1e-11, 1e-9, "bubble y of the dew liquid");
        pw_assert_close(b.T_K, e.T_K, 0.0, 5e-10, "bubble T of the dew liquid");
        pw_assert_close(b.P_Pa, e.P_Pa, 1e-11, 1e-9, "bubble P of the dew liquid");
        n++;
    }
    gsl_rng_free(rng);
    assert_int_equal(n, 400);
}

static void bad_arguments(void **state)
{
    (void)state;
    const pw_system s = propanol_water();
    pw_eq_point e;
    assert_int_equal(pw_dew_T_from(NULL, 101325.0, 0.5, 0.5, 360.0, &e), PW_EINVAL);
    assert_int_equal(pw_dew_T_from(&s, 101325.0, 0.5, 0.5, 360.0, NULL), PW_EINVAL);
    assert_int_equal(pw_dew_T_from(&s, -1.0, 0.5, 0.5, 360.0, &e), PW_EDOM);
    assert_int_equal(pw_dew_P_from(&s, 360.0, 1.5, 0.5, &e), PW_EDOM);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(seeded_equals_unseeded),
        cmocka_unit_test(bad_arguments),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
