/* Activity-coefficient models (src/thermo/models): analytic derivatives against finite
 * differences, Gibbs-Duhem, closed forms from the published equations, stability. */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/model.h>
#include <stdio.h>
#include <string.h>

#define R PW_GAS_CONSTANT
#define R_SVNA 1.987 /* cal/(mol K), the R of SVNA's cal/mol parameter tables (METHODS 1) */
#define T_REF 340.0

typedef struct {
    const pw_model_type *m;
    double p[PW_MAX_PARAMS];
    bool smooth_in_p; /* false at van Laar's ideal point (no derivative in the parameters) */
} model_case;

static const model_case cases[] = {
    {&pw_model_margules, {0.8, 1.5}, true},
    {&pw_model_margules, {-0.6, -0.3}, true},
    {&pw_model_margules, {1.2, -0.4}, true},
    {&pw_model_margules, {0.0, 0.0}, true},
    {&pw_model_vanlaar, {0.9, 1.6}, true},
    {&pw_model_vanlaar, {-0.5, -1.2}, true},
    {&pw_model_vanlaar, {2.5, 0.4}, true},
    {&pw_model_vanlaar, {0.0, 0.0}, false},
    {&pw_model_wilson, {300.0, 600.0, 0.24}, true},
    {&pw_model_wilson, {-150.0, 500.0, 1.0}, true},
    {&pw_model_wilson, {800.0, -100.0, 3.0}, true},
    {&pw_model_nrtl, {-127.8, 425.4, 0.3}, true},
    {&pw_model_nrtl, {251.8, 823.6, 0.5081}, true},
    {&pw_model_nrtl, {600.0, 150.0, 0.2}, true},
};
static const double xs[] = {0.0, 1e-3, 0.1, 0.25, 0.5, 0.75, 0.9, 0.999, 1.0};
static const double Ts[] = {300.0, 350.0, 420.0};

static pw_activity ev(const pw_model_type *m, const double *p, double x1, double T)
{
    pw_activity a;
    pw_status st = m->eval(p, T_REF, x1, T, &a);
    if (st != PW_OK)
        fail_msg("%s eval at x1=%g T=%g: status %d", m->name, x1, T, (int)st);
    return a;
}

/* Derivative in x1 of q(x1) by a three-point stencil: central inside, one-sided at the ends
 * of [0, 1] (all second order). */
typedef double (*pick_fn)(const pw_activity *a);
static double fd_x(const pw_model_type *m, const double *p, double x, double T, pick_fn q)
{
    const double h = 1e-5;
    if (x - h < 0.0) {
        pw_activity a0 = ev(m, p, x, T), a1 = ev(m, p, x + h, T), a2 = ev(m, p, x + 2 * h, T);
        return (-3 * q(&a0) + 4 * q(&a1) - q(&a2)) / (2 * h);
    }
    if (x + h > 1.0) {
        pw_activity a0 = ev(m, p, x, T), a1 = ev(m, p, x - h, T), a2 = ev(m, p, x - 2 * h, T);
        return (3 * q(&a0) - 4 * q(&a1) + q(&a2)) / (2 * h);
    }
    pw_activity ap = ev(m, p, x + h, T), am = ev(m, p, x - h, T);
    return (q(&ap) - q(&am)) / (2 * h);
}
static double q_lng1(const pw_activity *a) { return a->lngamma[0]; }
static double q_lng2(const pw_activity *a) { return a->lngamma[1]; }
static double q_gp(const pw_activity *a) { return a->lngamma[0] - a->lngamma[1]; } /* = dg/dx1 */

/* Every analytic field against central finite differences, over models x parameter sets x
 * compositions (ends included) x temperatures (identity checks). */
static void derivatives_match_finite_differences(void **state)
{
    (void)state;
    char label[160];
    for (size_t c = 0; c < sizeof cases / sizeof *cases; c++) {
        const pw_model_type *m = cases[c].m;
        const double *p = cases[c].p;
        for (size_t ti = 0; ti < 3; ti++) {
            for (size_t xi = 0; xi < sizeof xs / sizeof *xs; xi++) {
                double x = xs[xi], T = Ts[ti];
                snprintf(label, sizeof label, "%s set %zu x1=%g T=%g", m->name, c, x, T);
                pw_activity a = ev(m, p, x, T);
                /* d ln gamma_i / dx1 and d2g/dx1^2 = d(ln gamma1 - ln gamma2)/dx1 */
                pw_assert_close(a.dlngamma_dx1[0], fd_x(m, p, x, T, q_lng1), 1e-6, 1e-7, label);
                pw_assert_close(a.dlngamma_dx1[1], fd_x(m, p, x, T, q_lng2), 1e-6, 1e-7, label);
                pw_assert_close(a.d2gE_dx2, fd_x(m, p, x, T, q_gp), 1e-6, 1e-7, label);
                if (x > 0.01 && x < 0.99) { /* second difference of g itself */
                    const double h = 1e-4;
                    pw_activity ap = ev(m, p, x + h, T), am = ev(m, p, x - h, T);
                    double d2 = (ap.gE_RT - 2 * a.gE_RT + am.gE_RT) / (h * h);
                    pw_assert_close(a.d2gE_dx2, d2, 1e-5, 1e-5, label);
                }
                /* d/dT, and H^E = -R T^2 d(g)/dT (Gibbs-Helmholtz, METHODS 1.5) */
                const double hT = 1e-3;
                pw_activity tp = ev(m, p, x, T + hT), tm = ev(m, p, x, T - hT);
                for (int i = 0; i < 2; i++)
                    pw_assert_close(a.dlngamma_dT[i],
                                    (tp.lngamma[i] - tm.lngamma[i]) / (2 * hT), 1e-6, 1e-10,
                                    label);
                pw_assert_close(a.hE_Jmol, -R * T * T * (tp.gE_RT - tm.gE_RT) / (2 * hT), 1e-6,
                                1e-6, label);
                /* each parameter */
                if (cases[c].smooth_in_p) {
                    for (size_t j = 0; j < m->n_params; j++) {
                        double pp[PW_MAX_PARAMS], pm[PW_MAX_PARAMS];
                        memcpy(pp, p, sizeof pp);
                        memcpy(pm, p, sizeof pm);
                        double h = 1e-6 * fmax(1.0, fabs(p[j]));
                        pp[j] += h;
                        pm[j] -= h;
                        pw_activity ap = ev(m, pp, x, T), am = ev(m, pm, x, T);
                        for (int i = 0; i < 2; i++)
                            pw_assert_close(a.dlngamma_dp[i][j],
                                            (ap.lngamma[i] - am.lngamma[i]) / (2 * h), 1e-6,
                                            1e-9, label);
                    }
                }
                for (size_t j = m->n_params; j < PW_MAX_PARAMS; j++)
                    assert_true(a.dlngamma_dp[0][j] == 0.0 && a.dlngamma_dp[1][j] == 0.0);
                /* Gibbs-Duhem at constant T, P (METHODS 1): analytic to 1e-9, FD to 1e-6 */
                double x2 = 1.0 - x;
                pw_assert_close(x * a.dlngamma_dx1[0] + x2 * a.dlngamma_dx1[1], 0.0, 0.0, 1e-9,
                                label);
                pw_assert_close(x * fd_x(m, p, x, T, q_lng1) + x2 * fd_x(m, p, x, T, q_lng2),
                                0.0, 0.0, 1e-6, label);
                /* g = x1 ln gamma1 + x2 ln gamma2 (METHODS 1) */
                pw_assert_close(a.gE_RT, x * a.lngamma[0] + x2 * a.lngamma[1], 1e-12, 1e-14,
                                label);
            }
        }
    }
}

/* Infinite-dilution closed forms: METHODS 1.1 (Margules), 1.2 (van Laar), 1.3 (Wilson, [H]
 * verified numerically there), 1.4 (NRTL, [H] verified numerically there). */
static void infinite_dilution_closed_forms(void **state)
{
    (void)state;
    for (size_t c = 0; c < sizeof cases / sizeof *cases; c++) {
        const pw_model_type *m = cases[c].m;
        const double *p = cases[c].p;
        for (size_t ti = 0; ti < 3; ti++) {
            double T = Ts[ti], want1, want2;
            if (m == &pw_model_margules || m == &pw_model_vanlaar) {
                want1 = p[0] * T_REF / T;
                want2 = p[1] * T_REF / T;
            } else if (m == &pw_model_wilson) {
                double L12 = p[2] * exp(-p[0] / T), L21 = exp(-p[1] / T) / p[2];
                want1 = 1.0 - log(L12) - L21;
                want2 = 1.0 - log(L21) - L12;
            } else {
                double t12 = p[0] / T, t21 = p[1] / T;
                want1 = t21 + t12 * exp(-p[2] * t12);
                want2 = t12 + t21 * exp(-p[2] * t21);
            }
            pw_assert_close(ev(m, p, 0.0, T).lngamma[0], want1, 1e-12, 1e-14, m->name);
            pw_assert_close(ev(m, p, 1.0, T).lngamma[1], want2, 1e-12, 1e-14, m->name);
            /* and the pure component is its own reference state */
            pw_assert_close(ev(m, p, 1.0, T).lngamma[0], 0.0, 0.0, 1e-15, m->name);
            pw_assert_close(ev(m, p, 0.0, T).lngamma[1], 0.0, 0.0, 1e-15, m->name);
        }
    }
}

/* H^E closed forms: Margules and van Laar with A ~ 1/T give H^E = G^E (METHODS 1.5); Wilson
 * and NRTL formulas of METHODS 1.3 and 1.4 ([H] derived there). */
static void excess_enthalpy_closed_forms(void **state)
{
    (void)state;
    for (size_t c = 0; c < sizeof cases / sizeof *cases; c++) {
        const pw_model_type *m = cases[c].m;
        const double *p = cases[c].p;
        for (size_t xi = 0; xi < sizeof xs / sizeof *xs; xi++) {
            double x1 = xs[xi], x2 = 1.0 - x1, T = 345.0, want;
            pw_activity a = ev(m, p, x1, T);
            if (m == &pw_model_margules || m == &pw_model_vanlaar) {
                want = R * T * a.gE_RT;
            } else if (m == &pw_model_wilson) {
                double L12 = p[2] * exp(-p[0] / T), L21 = exp(-p[1] / T) / p[2];
                want = R * x1 * x2
                       * (p[0] * L12 / (x1 + L12 * x2) + p[1] * L21 / (x2 + L21 * x1));
            } else {
                double t12 = p[0] / T, t21 = p[1] / T, al = p[2];
                double G12 = exp(-al * t12), G21 = exp(-al * t21);
                double D1 = x1 + x2 * G21, D2 = x2 + x1 * G12;
                want = R * x1 * x2
                       * ((G21 / D1) * (1 - al * t21 * x1 / D1) * p[1]
                          + (G12 / D2) * (1 - al * t12 * x2 / D2) * p[0]);
            }
            pw_assert_close(a.hE_Jmol, want, 1e-10, 1e-9, m->name);
        }
    }
}

/* SVNA 7th ed. Table 12.5 parameters for 1-propanol(1)/water(2) (METHODS 1.4, 7.1: NRTL
 * confirmed [S], Wilson from memory [M]), cal/mol with R = 1.987. */
static pw_system propanol_water(const pw_model_type *m)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.model = m;
    s.T_ref_K = T_REF;
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

/* METHODS 1.5 [H]: at 360 K, x1 = 0.5, NRTL gives H^E = 104 cal/mol and Wilson 290 cal/mol
 * (computed values from the SVNA parameters). */
static void excess_enthalpy_propanol_water(void **state)
{
    (void)state;
    pw_system n = propanol_water(&pw_model_nrtl), w = propanol_water(&pw_model_wilson);
    pw_activity a;
    assert_int_equal(pw_system_activity(&n, 0.5, 360.0, &a), PW_OK);
    pw_assert_close(a.hE_Jmol / 4.184, 104.0, 0.0, 0.6, "NRTL H^E 1-propanol/water (computed)");
    assert_int_equal(pw_system_activity(&w, 0.5, 360.0, &a), PW_OK);
    pw_assert_close(a.hE_Jmol / 4.184, 290.0, 0.0, 0.6, "Wilson H^E 1-propanol/water (computed)");
}

/* One-parameter Margules, ln gamma1 = A x2^2, splits iff A > 2, critical point x = 0.5
 * (METHODS 1.6, textbook [M]); here D(0.5) = 4 - 2A exactly. */
static void one_parameter_margules_split(void **state)
{
    (void)state;
    static const double As[] = {0.0, 1.5, 1.99, 2.01, 2.5, 3.0};
    for (size_t k = 0; k < sizeof As / sizeof *As; k++) {
        pw_system s;
        memset(&s, 0, sizeof s);
        s.model = &pw_model_margules;
        s.params[0] = s.params[1] = As[k];
        s.T_ref_K = 330.0;
        double D, x;
        assert_int_equal(pw_stability_min(&s, 330.0, &D, &x), PW_OK);
        pw_assert_close(D, 4.0 - 2.0 * As[k], 1e-9, 1e-9, "one-parameter Margules min D");
        pw_assert_close(x, 0.5, 0.0, 1e-4, "at x1 = 0.5");
        assert_true((D < 0.0) == (As[k] > 2.0));
        /* van Laar with A12 = A21 = A is the same g = A x1 x2 */
        s.model = &pw_model_vanlaar;
        if (As[k] > 0.0) {
            assert_int_equal(pw_stability_min(&s, 330.0, &D, &x), PW_OK);
            pw_assert_close(D, 4.0 - 2.0 * As[k], 1e-9, 1e-9, "van Laar A12 = A21 min D");
        }
    }
}

/* METHODS 1.6 [H] check values (computed from the SVNA parameters). */
static void nrtl_propanol_water_spurious_split(void **state)
{
    (void)state;
    pw_system s = propanol_water(&pw_model_nrtl);
    double D, x;
    assert_int_equal(pw_stability_min(&s, 298.15, &D, &x), PW_OK);
    pw_assert_close(D, -0.221, 0.0, 6e-4, "NRTL min D at 25 C (computed)");
    pw_assert_close(x, 0.144, 0.0, 6e-4, "NRTL x1 at min D, 25 C (computed)");
    pw_activity a; /* D < 0 inside 0.111-0.198, > 0 outside */
    for (double xx = 0.05; xx < 0.95; xx += 0.01) {
        assert_int_equal(pw_system_activity(&s, xx, 298.15, &a), PW_OK);
        double Dx = 1.0 / (xx * (1 - xx)) + a.d2gE_dx2;
        if (xx > 0.115 && xx < 0.195)
            assert_true(Dx < 0.0);
        if (xx < 0.105 || xx > 0.205)
            assert_true(Dx > 0.0);
    }
    assert_int_equal(pw_stability_min(&s, 313.15, &D, &x), PW_OK);
    pw_assert_close(D, 0.020, 0.0, 6e-4, "NRTL min D at 40 C (computed)");
    s = propanol_water(&pw_model_wilson);
    assert_int_equal(pw_stability_min(&s, 298.15, &D, &x), PW_OK);
    pw_assert_close(D, 0.49, 0.0, 6e-3, "Wilson min D at 25 C (computed)");
}

/* Wilson with L12, L21 > 0 has a convex G_mix: no split (Wilson 1964; Prausnitz et al. 1999,
 * from memory, METHODS 1.3). Swept over a wide parameter range. */
static void wilson_never_splits(void **state)
{
    (void)state;
    pw_system s;
    memset(&s, 0, sizeof s);
    s.model = &pw_model_wilson;
    for (double a12 = -1200.0; a12 <= 3000.0; a12 += 600.0)
        for (double a21 = -1200.0; a21 <= 3000.0; a21 += 600.0)
            for (double r = 0.2; r < 6.0; r *= 2.5)
                for (double T = 250.0; T <= 450.0; T += 100.0) {
                    s.params[0] = a12;
                    s.params[1] = a21;
                    s.params[2] = r;
                    double D, x;
                    assert_int_equal(pw_stability_min(&s, T, &D, &x), PW_OK);
                    assert_true(D > 0.0);
                }
}

static void bad_inputs_are_refused(void **state)
{
    (void)state;
    pw_activity a;
    for (size_t c = 0; c < sizeof cases / sizeof *cases; c++) {
        const pw_model_type *m = cases[c].m;
        const double *p = cases[c].p;
        assert_int_equal(m->check(p), PW_OK);
        assert_int_equal(m->eval(p, T_REF, -1e-12, 300.0, &a), PW_EDOM);
        assert_int_equal(m->eval(p, T_REF, 1.0 + 1e-12, 300.0, &a), PW_EDOM);
        assert_int_equal(m->eval(p, T_REF, NAN, 300.0, &a), PW_EDOM);
        assert_int_equal(m->eval(p, T_REF, 0.5, 0.0, &a), PW_EDOM);
        assert_int_equal(m->eval(p, T_REF, 0.5, -10.0, &a), PW_EDOM);
        assert_int_equal(m->eval(p, T_REF, 0.5, NAN, &a), PW_EDOM);
        assert_int_equal(m->eval(p, T_REF, 0.5, INFINITY, &a), PW_EDOM);
        double q[PW_MAX_PARAMS];
        memcpy(q, p, sizeof q);
        q[0] = NAN;
        assert_int_equal(m->check(q), PW_EDOM);
        assert_int_equal(m->eval(q, T_REF, 0.5, 300.0, &a), PW_EDOM);
    }
    /* van Laar: opposite signs, or one zero (METHODS 1.2) */
    static const double vl_bad[][2] = {{1.0, -1.0}, {-0.5, 2.0}, {0.0, 1.0}, {1.0, 0.0}};
    for (size_t k = 0; k < 4; k++) {
        assert_int_equal(pw_model_vanlaar.check(vl_bad[k]), PW_EDOM);
        assert_int_equal(pw_model_vanlaar.eval(vl_bad[k], T_REF, 0.5, 300.0, &a), PW_EDOM);
    }
    /* van Laar A12 = A21 = 0 is the ideal solution */
    const double zero[2] = {0.0, 0.0};
    assert_int_equal(pw_model_vanlaar.eval(zero, T_REF, 0.3, 300.0, &a), PW_OK);
    assert_true(a.lngamma[0] == 0.0 && a.lngamma[1] == 0.0 && a.gE_RT == 0.0);
    /* Margules and van Laar need a positive reference temperature */
    const double mp[2] = {1.0, 1.0};
    assert_int_equal(pw_model_margules.eval(mp, 0.0, 0.5, 300.0, &a), PW_EDOM);
    assert_int_equal(pw_model_vanlaar.eval(mp, NAN, 0.5, 300.0, &a), PW_EDOM);
    /* NRTL alpha > 0; Wilson V2_V1 > 0 */
    const double n1[3] = {100, 200, 0.0}, n2[3] = {100, 200, -0.3};
    assert_int_equal(pw_model_nrtl.check(n1), PW_EDOM);
    assert_int_equal(pw_model_nrtl.eval(n2, T_REF, 0.5, 300.0, &a), PW_EDOM);
    const double w1[3] = {100, 200, 0.0}, w2[3] = {100, 200, -1.0};
    assert_int_equal(pw_model_wilson.check(w1), PW_EDOM);
    assert_int_equal(pw_model_wilson.eval(w2, T_REF, 0.5, 300.0, &a), PW_EDOM);
    /* overflow is a domain error, not an Inf */
    const double n3[3] = {-1e6, 100, 0.5};
    assert_int_equal(pw_model_nrtl.eval(n3, T_REF, 0.5, 1.0, &a), PW_EDOM);
}

static void model_table(void **state)
{
    (void)state;
    size_t n = 0;
    const pw_model_type *const *all = pw_model_all(&n);
    assert_int_equal(n, 4);
    static const char *names[] = {"margules", "vanlaar", "wilson", "nrtl"};
    for (size_t i = 0; i < n; i++) {
        assert_string_equal(all[i]->name, names[i]);
        assert_ptr_equal(pw_model_find(names[i]), all[i]);
        assert_true(all[i]->n_params <= PW_MAX_PARAMS);
        assert_int_equal(all[i]->check(all[i]->defaults), PW_OK);
        for (size_t j = 0; j < all[i]->n_params; j++)
            assert_int_equal(pw_model_param_index(all[i], all[i]->param_names[j]), (int)j);
    }
    assert_ptr_equal(pw_model_find("NRTL"), &pw_model_nrtl); /* model names in any case */
    assert_null(pw_model_find("uniquac"));
    assert_null(pw_model_find(NULL));
    assert_int_equal(pw_model_param_index(&pw_model_nrtl, "alpha"), 2);
    assert_false(pw_model_nrtl.fitted_default[2]);
    pw_assert_close(pw_model_nrtl.defaults[2], 0.3, 0.0, 0.0, "NRTL default alpha");
    assert_int_equal(pw_model_param_index(&pw_model_wilson, "V2_V1"), 2);
    assert_false(pw_model_wilson.fitted_default[2]);
    assert_int_equal(pw_model_param_index(&pw_model_wilson, "b12_K"), -1);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(derivatives_match_finite_differences),
        cmocka_unit_test(infinite_dilution_closed_forms),
        cmocka_unit_test(excess_enthalpy_closed_forms),
        cmocka_unit_test(excess_enthalpy_propanol_water),
        cmocka_unit_test(one_parameter_margules_split),
        cmocka_unit_test(nrtl_propanol_water_spurious_split),
        cmocka_unit_test(wilson_never_splits),
        cmocka_unit_test(bad_inputs_are_refused),
        cmocka_unit_test(model_table),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
