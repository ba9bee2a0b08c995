/* Feasibility screen (src/analysis/screen.c).
 *
 * Sources: METHODS 6.3 case (i) and 6.4-6.5 (constant alpha = 2.5, zf 0.5, xd 0.95, xb 0.05:
 * R_min = 1.1000, Fenske N_min = 6.4269, computed for the brief [H]) and Underwood's closed form
 * for a saturated-liquid feed, R_min = [xd/zf - alpha (1 - xd)/(1 - zf)]/(alpha - 1) (Underwood
 * 1948, from memory); 1-propanol/water with the SVNA 7th ed. NRTL parameters (METHODS 5.5, 7.1).
 * The 1.1 alpha threshold is common practice; 0.05-0.10 is METHODS 5.4's rule of thumb. */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/screen.h>
#include <stdio.h>
#include <string.h>

#define P_ATM 101325.0

static pw_component antoine(const char *name, double A, double B, double C, const char *T_unit)
{
    return pw_test_antoine(name, A, B, C, PW_LN, "kPa", T_unit, NAN, NAN);
}

/* Ideal liquid (Margules with zero parameters) and ln P_i = A_i - B/T with the same B: then
 * alpha12 = exp(A1 - A2) exactly, at every T (identity). */
static pw_system constant_alpha(double alpha)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("light", 14.0 + log(alpha), 3800.0, 0.0, "K");
    s.comp[1] = antoine("heavy", 14.0, 3800.0, 0.0, "K");
    s.model = &pw_model_margules;
    s.T_ref_K = 350.0;
    return s;
}

static bool has_reason(const pw_screen_result *r, pw_screen_reason_code c)
{
    for (size_t i = 0; i < r->n_reasons; i++)
        if (r->reasons[i].code == c)
            return true;
    return false;
}

static void feasible_constant_alpha(void **state)
{
    (void)state;
    pw_system s = constant_alpha(2.5);
    pw_screen_result r;
    assert_int_equal(pw_screen_run(&s, P_ATM, 0.95, 0.05, NAN, NULL, &r), PW_OK);
    assert_int_equal(r.verdict, PW_VERDICT_FEASIBLE);
    assert_true(r.zf_default);
    pw_assert_close(r.zf, 0.5, 0.0, 0.0, "default zf");
    pw_assert_close(r.alpha_min, 2.5, 1e-9, 0.0, "alpha_min = exp(A1 - A2)");
    assert_int_equal(r.az.n, 0);
    assert_true(r.column_ran && r.column.feasible);
    pw_assert_close(r.column.r_min, 1.1000, 0.0, 1e-4, "R_min METHODS 6.3(i) [H]");
    pw_assert_close(r.r_min_underwood, 1.1000, 0.0, 1e-4, "Underwood METHODS 6.5 [H]");
    pw_assert_close(r.n_fenske, 6.4269, 0.0, 1e-4, "Fenske METHODS 6.4 [H]");
    assert_true(has_reason(&r, PW_REASON_EASY));
    assert_false(r.scanned); /* no azeotrope: no pressure scan */
}

static void difficult_low_alpha(void **state)
{
    (void)state;
    const double alpha = 1.05, xd = 0.9, xb = 0.1, zf = 0.4;
    pw_system s = constant_alpha(alpha);
    pw_screen_result r;
    assert_int_equal(pw_screen_run(&s, P_ATM, xd, xb, zf, NULL, &r), PW_OK);
    assert_int_equal(r.verdict, PW_VERDICT_DIFFICULT);
    assert_true(has_reason(&r, PW_REASON_LOW_ALPHA));
    double rmin = (xd / zf - alpha * (1.0 - xd) / (1.0 - zf)) / (alpha - 1.0);
    pw_assert_close(r.r_min_underwood, rmin, 1e-8, 0.0, "Underwood closed form, q = 1");
    pw_assert_close(r.column.r_min, rmin, 1e-5, 0.0, "column R_min on a constant-alpha curve");
    /* Fenske: ln[(xd/(1-xd))((1-xb)/xb)]/ln(alpha) (Fenske 1932) */
    pw_assert_close(r.n_fenske, log(81.0) / log(alpha), 1e-10, 0.0, "Fenske closed form");
}

static pw_system propanol_water(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("1-propanol", 16.1154, 3483.67, 205.807, "C");
    s.comp[1] = antoine("water", 16.3872, 3885.70, 230.170, "C");
    s.model = &pw_model_nrtl;
    s.T_ref_K = 360.0;
    s.params[0] = 500.40 / 1.987;
    s.params[1] = 1636.57 / 1.987;
    s.params[2] = 0.5081;
    return s;
}

static void infeasible_barrier(void **state)
{
    (void)state;
    pw_system s = propanol_water();
    pw_screen_result r;
    assert_int_equal(pw_screen_run(&s, P_ATM, 0.9, 0.05, 0.2, NULL, &r), PW_OK);
    assert_int_equal(r.verdict, PW_VERDICT_INFEASIBLE);
    assert_true(r.barrier);
    pw_assert_close(r.x_barrier, 0.4462, 0.0, 1e-4, "barrier at the NRTL azeotrope (METHODS 5.5)");
    assert_true(has_reason(&r, PW_REASON_BARRIER));
    assert_false(r.column_ran);
    /* the azeotrope moves from about 0.40 to 0.48 over 20-500 kPa with these parameters
     * (computed here, [H]): above the 0.05 lower end of the rule of thumb */
    assert_true(r.scanned);
    assert_true(r.shift > 0.05 && r.shift < 0.15);
    assert_true(r.x_az_hi > r.x_az_lo); /* Wrewsky, as in test_azeotrope */
    assert_true(has_reason(&r, PW_REASON_SWING));
    assert_false(r.vanishes);

    /* a split wholly on the propanol-rich side: 1-propanol is the heavier one there */
    assert_int_equal(pw_screen_run(&s, P_ATM, 0.95, 0.6, NAN, NULL, &r), PW_OK);
    assert_int_equal(r.verdict, PW_VERDICT_INFEASIBLE);
    assert_false(r.barrier);
    assert_true(has_reason(&r, PW_REASON_BEYOND));
    assert_true(r.alpha_min < 1.0);
    pw_assert_close(r.zf, 0.775, 0.0, 1e-15, "default zf = (xb + xd)/2 when 0.5 is outside");

    /* on the water-rich side of the azeotrope the split is possible */
    assert_int_equal(pw_screen_run(&s, P_ATM, 0.4, 0.02, 0.1, NULL, &r), PW_OK);
    assert_true(r.verdict != PW_VERDICT_INFEASIBLE);
    assert_true(r.column_ran && r.column.feasible);
}

static void bad_arguments(void **state)
{
    (void)state;
    pw_system s = constant_alpha(2.0);
    pw_screen_result r;
    assert_int_equal(pw_screen_run(&s, P_ATM, 0.5, 0.5, NAN, NULL, &r), PW_EINVAL);
    /* xd < xb is a split with component 1 to the bottoms: here component 1 is the lighter one
     * (alpha12 = 2), so that split is infeasible, not an error */
    assert_int_equal(pw_screen_run(&s, P_ATM, 0.05, 0.95, NAN, NULL, &r), PW_OK);
    assert_int_equal(r.verdict, PW_VERDICT_INFEASIBLE);
    pw_assert_close(r.alpha_min, 0.5, 1e-9, 0, "alpha21 = 1/alpha12");
    assert_int_equal(pw_screen_run(&s, P_ATM, 0.9, 0.1, 0.95, NULL, &r), PW_EINVAL);
    assert_int_equal(pw_screen_run(&s, -1.0, 0.9, 0.1, NAN, NULL, &r), PW_EINVAL);
    pw_screen_options o = pw_screen_default_options();
    o.alpha_difficult = 0.9;
    assert_int_equal(pw_screen_run(&s, P_ATM, 0.9, 0.1, NAN, &o, &r), PW_EINVAL);
    assert_string_equal(pw_verdict_name(PW_VERDICT_DIFFICULT), "difficult");
    assert_string_equal(pw_screen_reason_key(PW_REASON_BARRIER), "azeotrope-barrier");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(feasible_constant_alpha),
        cmocka_unit_test(difficult_low_alpha),
        cmocka_unit_test(infeasible_barrier),
        cmocka_unit_test(bad_arguments),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
