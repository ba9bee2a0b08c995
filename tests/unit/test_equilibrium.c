/* Bubble and dew points, modified Raoult's law (src/thermo/equilibrium.c). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/equilibrium.h>
#include <stdio.h>
#include <string.h>

#include "thermo/thermo_internal.h"

#define R_SVNA 1.987 /* cal/(mol K): SVNA's cal/mol parameters are used with this R (METHODS 1) */
#define P_ATM 101325.0

static pw_component antoine(const char *name, double A, double B, double C)
{
    return pw_test_antoine(name, A, B, C, PW_LN, "kPa", "C", NAN, NAN);
}

/* SVNA 7th ed. Table B.2, ln(P/kPa) = A - B/(t/C + C) (METHODS 2.5: water and 1-propanol
 * confirmed, acetone and methanol from memory). */
static pw_component svna(const char *name) { return pw_test_svna(name); }

/* SVNA 7th ed. Table 12.5 parameters (METHODS 7.1; 1-propanol/water NRTL confirmed, the rest
 * from memory), cal/mol converted to K with R = 1.987. light(1)/water(2). */
static pw_system svna_system(const char *light, const pw_model_type *m)
{
    static const struct {
        const char *name;
        double wa12, wa21, V1, V2, b12, b21, alpha;
    } t[] = {
        {"1-propanol", 775.48, 1351.90, 75.14, 18.07, 500.40, 1636.57, 0.5081},
        {"acetone", 291.27, 1448.01, 74.05, 18.07, 631.05, 1197.41, 0.5343},
        {"methanol", 107.38, 469.55, 40.73, 18.07, -253.88, 845.21, 0.2994},
    };
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = svna(light);
    s.comp[1] = svna("water");
    s.model = m;
    s.T_ref_K = 350.0;
    for (size_t i = 0; i < 3; i++) {
        if (strcmp(t[i].name, light) != 0)
            continue;
        if (m == &pw_model_wilson) {
            s.params[0] = t[i].wa12 / R_SVNA;
            s.params[1] = t[i].wa21 / R_SVNA;
            s.params[2] = t[i].V2 / t[i].V1;
        } else {
            s.params[0] = t[i].b12 / R_SVNA;
            s.params[1] = t[i].b21 / R_SVNA;
            s.params[2] = t[i].alpha;
        }
    }
    return s;
}

/* The point satisfies y_i P = x_i gamma_i Psat_i for both components (identity). */
static void assert_equilibrium(const pw_eq_point *e, const pw_system *s)
{
    pw_activity a;
    assert_int_equal(pw_system_activity(s, e->x1, e->T_K, &a), PW_OK);
    double x[2] = {e->x1, 1 - e->x1}, y[2] = {e->y1, 1 - e->y1};
    for (int i = 0; i < 2; i++) {
        double Ps;
        assert_int_equal(pw_psat(&s->comp[i], e->T_K, &Ps, NULL), PW_OK);
        pw_assert_close(e->Psat_Pa[i], Ps, 1e-14, 0.0, "Psat filled");
        pw_assert_close(e->gamma[i], exp(a.lngamma[i]), 1e-14, 0.0, "gamma filled");
        pw_assert_close(y[i] * e->P_Pa, x[i] * e->gamma[i] * Ps, 1e-9, 1e-9 * e->P_Pa,
                        "y_i P = x_i gamma_i Psat_i");
    }
}

/* METHODS 7.1 [H]: computed bubble points at 101.325 kPa from the SVNA parameters and Antoine
 * constants above (values computed for that brief, printed to 0.001 C and 0.0001 in y). */
static void svna_regression_points(void **state)
{
    (void)state;
    static const struct {
        const char *light;
        int nrtl;
        double x1, t_C, y1;
    } t[] = {
        {"methanol", 1, 0.5, 73.462, 0.7829},   {"methanol", 0, 0.5, 73.481, 0.7837},
        {"acetone", 1, 0.5, 60.661, 0.8330},    {"acetone", 0, 0.5, 60.510, 0.8344},
        {"1-propanol", 1, 0.5, 87.560, 0.4622}, {"1-propanol", 0, 0.5, 87.759, 0.4678},
        {"1-propanol", 1, 0.1, 88.599, 0.3773}, {"1-propanol", 1, 0.9, 92.292, 0.7536},
        {"methanol", 1, 0.1, 88.094, 0.4140},   {"methanol", 1, 0.9, 66.266, 0.9596},
        {"acetone", 1, 0.1, 68.973, 0.7243},    {"acetone", 1, 0.9, 56.857, 0.9363},
    };
    char label[128];
    for (size_t i = 0; i < sizeof t / sizeof *t; i++) {
        pw_system s = svna_system(t[i].light, t[i].nrtl ? &pw_model_nrtl : &pw_model_wilson);
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(&s, P_ATM, t[i].x1, &e), PW_OK);
        snprintf(label, sizeof label, "%s/water %s x1=%g (computed)", t[i].light,
                 t[i].nrtl ? "NRTL" : "Wilson", t[i].x1);
        pw_assert_close(e.T_K - 273.15, t[i].t_C, 0.0, 6e-4, label);
        pw_assert_close(e.y1, t[i].y1, 0.0, 6e-5, label);
        assert_equilibrium(&e, &s);
        assert_true(e.iterations > 0);
    }
}

/* bubble T, then dew T of the resulting vapor, gives back x and T (and the same for P). */
static void bubble_dew_round_trip(void **state)
{
    (void)state;
    static const char *lights[] = {"methanol", "acetone", "1-propanol"};
    const pw_model_type *models[] = {&pw_model_nrtl, &pw_model_wilson};
    static const double xs[] = {0.0, 1e-4, 0.02, 0.1, 0.3, 0.5, 0.7, 0.9, 0.98, 1.0};
    char label[128];
    for (size_t l = 0; l < 3; l++)
        for (size_t m = 0; m < 2; m++)
            for (size_t k = 0; k < sizeof xs / sizeof *xs; k++) {
                pw_system s = svna_system(lights[l], models[m]);
                snprintf(label, sizeof label, "%s %s x1=%g", lights[l], models[m]->name, xs[k]);
                for (double P = 30e3; P < 400e3; P *= 3.3) {
                    pw_eq_point b, d;
                    assert_int_equal(pw_bubble_T(&s, P, xs[k], &b), PW_OK);
                    assert_int_equal(pw_dew_T(&s, P, b.y1, &d), PW_OK);
                    pw_assert_close(d.x1, xs[k], 0.0, 1e-9, label);
                    pw_assert_close(d.T_K, b.T_K, 0.0, 1e-8, label);
                    pw_assert_close(d.y1, b.y1, 0.0, 0.0, label);
                    assert_equilibrium(&b, &s);
                    assert_equilibrium(&d, &s);
                }
                double T = 340.0;
                pw_eq_point b, d;
                assert_int_equal(pw_bubble_P(&s, T, xs[k], &b), PW_OK);
                assert_int_equal(pw_dew_P(&s, T, b.y1, &d), PW_OK);
                pw_assert_close(d.x1, xs[k], 0.0, 1e-9, label);
                pw_assert_close(d.P_Pa, b.P_Pa, 1e-9, 0.0, label);
                assert_equilibrium(&b, &s);
                assert_equilibrium(&d, &s);
            }
}

/* Bubble pressure is explicit: P = x1 gamma1 Psat1 + x2 gamma2 Psat2 (modified Raoult). */
static void bubble_P_explicit(void **state)
{
    (void)state;
    pw_system s = svna_system("acetone", &pw_model_nrtl);
    pw_eq_point e;
    assert_int_equal(pw_bubble_P(&s, 330.0, 0.37, &e), PW_OK);
    pw_activity a;
    assert_int_equal(pw_system_activity(&s, 0.37, 330.0, &a), PW_OK);
    double P1, P2;
    assert_int_equal(pw_psat(&s.comp[0], 330.0, &P1, NULL), PW_OK);
    assert_int_equal(pw_psat(&s.comp[1], 330.0, &P2, NULL), PW_OK);
    double P = 0.37 * exp(a.lngamma[0]) * P1 + 0.63 * exp(a.lngamma[1]) * P2;
    pw_assert_close(e.P_Pa, P, 1e-14, 0.0, "bubble P");
    pw_assert_close(e.y1, 0.37 * exp(a.lngamma[0]) * P1 / P, 1e-14, 0.0, "bubble y1");
    assert_int_equal(e.iterations, 0);
}

/* Ideal solution (Margules A = 0), two Antoine sets with the same B and C: Psat1/Psat2 =
 * exp(A1 - A2) = alpha is constant and Raoult's law has closed forms (identity):
 *   bubble: Psat2(T) = P/(alpha x1 + x2);   dew: Psat2(T) = P (y1/alpha + y2). */
static void ideal_solution_closed_forms(void **state)
{
    (void)state;
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("light", 14.9, 3000.0, 220.0);
    s.comp[1] = antoine("heavy", 14.0, 3000.0, 220.0);
    s.model = &pw_model_margules;
    s.T_ref_K = 350.0;
    const double alpha = exp(0.9), P = 80e3;
    for (double x = 0.0; x <= 1.0 + 1e-12; x += 0.125) {
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(&s, P, x, &e), PW_OK);
        double lnP2 = log(P / 1e3 / (alpha * x + (1 - x)));
        double T = 3000.0 / (14.0 - lnP2) - 220.0 + 273.15;
        pw_assert_close(e.T_K, T, 0.0, 1e-9, "ideal bubble T");
        pw_assert_close(e.y1, alpha * x / (alpha * x + 1 - x), 0.0, 1e-12, "ideal y1");
        assert_int_equal(pw_dew_T(&s, P, x, &e), PW_OK);
        lnP2 = log(P / 1e3 * (x / alpha + (1 - x)));
        T = 3000.0 / (14.0 - lnP2) - 220.0 + 273.15;
        pw_assert_close(e.T_K, T, 0.0, 1e-9, "ideal dew T");
        pw_assert_close(e.x1, (x / alpha) / (x / alpha + 1 - x), 0.0, 1e-11, "ideal dew x1");
        double P1, P2;
        assert_int_equal(pw_psat(&s.comp[0], 360.0, &P1, NULL), PW_OK);
        assert_int_equal(pw_psat(&s.comp[1], 360.0, &P2, NULL), PW_OK);
        assert_int_equal(pw_bubble_P(&s, 360.0, x, &e), PW_OK);
        pw_assert_close(e.P_Pa, x * P1 + (1 - x) * P2, 1e-14, 0.0, "ideal bubble P");
        assert_int_equal(pw_dew_P(&s, 360.0, x, &e), PW_OK);
        pw_assert_close(e.P_Pa, 1.0 / (x / P1 + (1 - x) / P2), 1e-10, 0.0, "ideal dew P");
    }
}

/* A minimum-boiling azeotrope: bubble T below both pure boiling points (METHODS 9, item 9).
 * 1-propanol/water boils at about 87.5 C near x1 = 0.4 (computed with the SVNA sets). */
static void minimum_boiling_system(void **state)
{
    (void)state;
    pw_system s = svna_system("1-propanol", &pw_model_nrtl);
    double Tb1, Tb2;
    assert_int_equal(pw_tsat(&s.comp[0], P_ATM, &Tb1), PW_OK);
    assert_int_equal(pw_tsat(&s.comp[1], P_ATM, &Tb2), PW_OK);
    pw_eq_point e;
    assert_int_equal(pw_bubble_T(&s, P_ATM, 0.4, &e), PW_OK);
    assert_true(e.T_K < Tb1 - 5.0 && e.T_K < Tb2 - 5.0);
    /* y - x changes sign across the azeotrope; dew T of y = x at the azeotrope region works */
    pw_eq_point a, b;
    assert_int_equal(pw_bubble_T(&s, P_ATM, 0.2, &a), PW_OK);
    assert_int_equal(pw_bubble_T(&s, P_ATM, 0.7, &b), PW_OK);
    assert_true(a.y1 > a.x1 && b.y1 < b.x1);
    for (double y = 0.05; y < 1.0; y += 0.05) {
        pw_eq_point d;
        assert_int_equal(pw_dew_T(&s, P_ATM, y, &d), PW_OK);
        assert_equilibrium(&d, &s);
    }
}

/* NRTL 1-propanol/water is stable along the 101.325 kPa bubble curve: min D = +0.51 at
 * x1 = 0.22 (METHODS 1.6 [H], computed from the SVNA parameters). */
static void nrtl_stable_on_bubble_curve(void **state)
{
    (void)state;
    pw_system s = svna_system("1-propanol", &pw_model_nrtl);
    double Dmin = INFINITY, xmin = NAN;
    for (int k = 1; k < 1000; k++) {
        double x = k / 1000.0;
        pw_eq_point e;
        pw_activity a;
        assert_int_equal(pw_bubble_T(&s, P_ATM, x, &e), PW_OK);
        assert_int_equal(pw_system_activity(&s, x, e.T_K, &a), PW_OK);
        double D = 1.0 / (x * (1 - x)) + a.d2gE_dx2;
        if (D < Dmin) {
            Dmin = D;
            xmin = x;
        }
    }
    pw_assert_close(Dmin, 0.51, 0.0, 6e-3, "min D on the 1-atm bubble curve (computed)");
    pw_assert_close(xmin, 0.22, 0.0, 6e-3, "x1 at min D (computed)");
}

/* The bracketed Brent fallback finds the same bubble points as the Newton fast path
 * (identity), including roots below the first bracket (the bracket is widened). */
static void brent_fallback_agrees(void **state)
{
    (void)state;
    static const char *lights[] = {"methanol", "acetone", "1-propanol"};
    for (size_t l = 0; l < 3; l++)
        for (double x = 0.0; x <= 1.0 + 1e-12; x += 0.1)
            for (double P = 20e3; P < 500e3; P *= 2.5) {
                pw_system s = svna_system(lights[l], &pw_model_nrtl);
                pw_eq_point a, b;
                assert_int_equal(pw_bubble_T(&s, P, x, &a), PW_OK);
                assert_int_equal(pw_thermo_bubble_T_brent(&s, P, x, &b), PW_OK);
                pw_assert_close(b.T_K, a.T_K, 0.0, 2e-10, "Brent vs Newton bubble T");
                pw_assert_close(b.y1, a.y1, 0.0, 1e-11, "Brent vs Newton y1");
                assert_equilibrium(&b, &s);
            }
    /* IF97 water with itself, strong positive deviations: the bubble T lies 70-90 K below the
     * pure boiling point, below the first bracket [Tsat - 60 K, Tsat + 10 K]. */
    pw_system w;
    memset(&w, 0, sizeof w);
    w.comp[0].equation = PW_PSAT_IAPWS_IF97;
    w.comp[1].equation = PW_PSAT_IAPWS_IF97;
    w.model = &pw_model_margules;
    w.T_ref_K = 373.0;
    for (double A = 10.0; A <= 14.0; A += 1.0) {
        w.params[0] = w.params[1] = A;
        pw_eq_point a, b;
        assert_int_equal(pw_bubble_T(&w, P_ATM, 0.5, &a), PW_OK);
        assert_int_equal(pw_thermo_bubble_T_brent(&w, P_ATM, 0.5, &b), PW_OK);
        assert_true(b.T_K < 373.12 - 60.0);
        pw_assert_close(b.T_K, a.T_K, 0.0, 2e-10, "Brent after widening");
        pw_assert_close(b.y1, 0.5, 0.0, 1e-14, "symmetric mixture: y1 = x1");
        assert_equilibrium(&b, &w);
    }
    w.params[0] = w.params[1] = 60.0;
    pw_eq_point e;
    assert_int_equal(pw_thermo_bubble_T_brent(&w, P_ATM, 0.5, &e), PW_ENOBRACKET);
}

static void statuses(void **state)
{
    (void)state;
    pw_system s = svna_system("methanol", &pw_model_nrtl);
    pw_eq_point e;
    assert_int_equal(pw_bubble_T(&s, 0.0, 0.5, &e), PW_EDOM);
    assert_int_equal(pw_bubble_T(&s, -1.0, 0.5, &e), PW_EDOM);
    assert_int_equal(pw_bubble_T(&s, NAN, 0.5, &e), PW_EDOM);
    assert_int_equal(pw_bubble_T(&s, P_ATM, -0.01, &e), PW_EDOM);
    assert_int_equal(pw_bubble_T(&s, P_ATM, 1.01, &e), PW_EDOM);
    assert_int_equal(pw_dew_T(&s, 0.0, 0.5, &e), PW_EDOM);
    assert_int_equal(pw_dew_T(&s, P_ATM, 1.5, &e), PW_EDOM);
    assert_int_equal(pw_bubble_P(&s, 0.0, 0.5, &e), PW_EDOM);
    assert_int_equal(pw_bubble_P(&s, 300.0, NAN, &e), PW_EDOM);
    assert_int_equal(pw_dew_P(&s, -3.0, 0.5, &e), PW_EDOM);
    assert_int_equal(pw_dew_P(&s, 300.0, -0.5, &e), PW_EDOM);
    assert_int_equal(pw_bubble_T(NULL, P_ATM, 0.5, &e), PW_EINVAL);
    assert_int_equal(pw_bubble_T(&s, P_ATM, 0.5, NULL), PW_EINVAL);
    pw_system bad = s;
    bad.model = NULL;
    assert_int_equal(pw_bubble_P(&bad, 300.0, 0.5, &e), PW_EINVAL);
    bad = s;
    bad.params[2] = -0.3; /* alpha <= 0: the model's domain error is forwarded */
    assert_int_equal(pw_bubble_T(&bad, P_ATM, 0.5, &e), PW_EDOM);
    assert_int_equal(pw_dew_P(&bad, 300.0, 0.5, &e), PW_EDOM);

    /* Water (IF97) paired with itself under huge positive deviations: the mixture would boil
     * below the lowest temperature IF97 covers, so no bracket exists. */
    pw_system w;
    memset(&w, 0, sizeof w);
    w.comp[0].equation = PW_PSAT_IAPWS_IF97;
    w.comp[1].equation = PW_PSAT_IAPWS_IF97;
    w.model = &pw_model_margules;
    w.params[0] = w.params[1] = 60.0;
    w.T_ref_K = 373.0;
    assert_int_equal(pw_bubble_T(&w, P_ATM, 0.5, &e), PW_ENOBRACKET);
    /* pressure outside IF97 */
    assert_int_equal(pw_bubble_T(&w, 30e6, 0.5, &e), PW_ERANGE);
    /* ... but with A = 0 it is just water: 373.1243 K (METHODS 2.4, computed) */
    w.params[0] = w.params[1] = 0.0;
    assert_int_equal(pw_bubble_T(&w, P_ATM, 0.5, &e), PW_OK);
    pw_assert_close(e.T_K, 373.1243, 0.0, 6e-5, "IF97 water bubble T");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(svna_regression_points),
        cmocka_unit_test(bubble_dew_round_trip),
        cmocka_unit_test(bubble_P_explicit),
        cmocka_unit_test(ideal_solution_closed_forms),
        cmocka_unit_test(minimum_boiling_system),
        cmocka_unit_test(nrtl_stable_on_bubble_curve),
        cmocka_unit_test(brent_fallback_agrees),
        cmocka_unit_test(statuses),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
