/* UNIQUAC (src/thermo/models/uniquac.c) like the other models in test_models.c: analytic
 * derivatives in x1, T and every parameter against finite differences, Gibbs-Duhem,
 * G^E/RT = sum x_i ln gamma_i, H^E against finite differences of G^E/T (Gibbs-Helmholtz), the
 * infinite-dilution closed forms, and an independent evaluation in the other published form of
 * the equation (Abrams & Prausnitz 1975, eq. with l_i = (z/2)(r_i - q_i) - (r_i - 1)).
 * No published UNIQUAC parameter set with printed activity coefficients could be recalled
 * reliably enough to serve as a check; the r and q below are the shipped library's values
 * (Bondi group sums, docs/inputs.md) and the interaction energies are chosen to span the
 * range met in fits (they are test inputs, not data). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/component.h>
#include <pinchwise/fit.h>
#include <pinchwise/model.h>
#include <stdio.h>
#include <string.h>

#define R PW_GAS_CONSTANT
#define T_REF 340.0

static const pw_model_type *const M = &pw_model_uniquac;

/* du12_K, du21_K, r1, q1, r2, q2 */
static const double cases[][6] = {
    {-50.0, 400.0, 2.1055, 1.972, 0.92, 1.40},     /* ethanol / water r, q */
    {300.0, 150.0, 2.5735, 2.336, 0.92, 1.40},     /* acetone / water r, q */
    {-120.0, 180.0, 3.1878, 2.400, 5.1742, 4.396}, /* benzene / n-heptane r, q */
    {0.0, 0.0, 2.0, 1.8, 2.0, 1.8},                /* identical molecules, no interaction */
    {900.0, -250.0, 1.4311, 1.432, 4.4998, 3.856}, /* methanol / n-hexane r, q */
};
enum { N_CASES = sizeof cases / sizeof cases[0] };
static const double xs[] = {0.0, 1e-3, 0.1, 0.25, 0.5, 0.75, 0.9, 0.999, 1.0};
static const double Ts[] = {300.0, 350.0, 420.0};

static pw_activity ev(const double *p, double x1, double T)
{
    pw_activity a;
    pw_status st = M->eval(p, T_REF, x1, T, &a);
    if (st != PW_OK)
        fail_msg("uniquac eval at x1=%g T=%g: status %d", x1, T, (int)st);
    return a;
}

typedef double (*pick_fn)(const pw_activity *a);
static double q_lng1(const pw_activity *a)
{
    return a->lngamma[0];
}
static double q_lng2(const pw_activity *a)
{
    return a->lngamma[1];
}
static double q_gp(const pw_activity *a)
{
    return a->lngamma[0] - a->lngamma[1];
}

/* three-point stencil in x1 with step h, one-sided at the ends of [0, 1] (second order) */
static double fd_step(const double *p, double x, double T, pick_fn q, double h)
{
    if (x - h < 0.0) {
        pw_activity a0 = ev(p, x, T), a1 = ev(p, x + h, T), a2 = ev(p, x + 2 * h, T);
        return (-3 * q(&a0) + 4 * q(&a1) - q(&a2)) / (2 * h);
    }
    if (x + h > 1.0) {
        pw_activity a0 = ev(p, x, T), a1 = ev(p, x - h, T), a2 = ev(p, x - 2 * h, T);
        return (3 * q(&a0) - 4 * q(&a1) + q(&a2)) / (2 * h);
    }
    pw_activity ap = ev(p, x + h, T), am = ev(p, x - h, T);
    return (q(&ap) - q(&am)) / (2 * h);
}

/* Richardson extrapolation of two second-order stencils (fourth order): the strongly
 * non-ideal sets curve too much near the ends for a plain stencil to reach 1e-6. */
static double fd_x(const double *p, double x, double T, pick_fn q)
{
    const double h = 2e-5;
    return (4.0 * fd_step(p, x, T, q, h / 2) - fd_step(p, x, T, q, h)) / 3.0;
}

static void derivatives_match_finite_differences(void **state)
{
    (void)state;
    char label[160];
    for (size_t c = 0; c < N_CASES; c++) {
        const double *p = cases[c];
        for (size_t ti = 0; ti < 3; ti++) {
            for (size_t xi = 0; xi < sizeof xs / sizeof *xs; xi++) {
                double x = xs[xi], T = Ts[ti], x2 = 1.0 - x;
                snprintf(label, sizeof label, "uniquac set %zu x1=%g T=%g", c, x, T);
                pw_activity a = ev(p, x, T);
                pw_assert_close(a.dlngamma_dx1[0], fd_x(p, x, T, q_lng1), 1e-6, 1e-7, label);
                pw_assert_close(a.dlngamma_dx1[1], fd_x(p, x, T, q_lng2), 1e-6, 1e-7, label);
                pw_assert_close(a.d2gE_dx2, fd_x(p, x, T, q_gp), 1e-6, 1e-7, label);
                if (x > 0.01 && x < 0.99) {
                    const double h = 1e-4;
                    pw_activity ap = ev(p, x + h, T), am = ev(p, x - h, T);
                    double d2 = (ap.gE_RT - 2 * a.gE_RT + am.gE_RT) / (h * h);
                    pw_assert_close(a.d2gE_dx2, d2, 1e-5, 1e-5, label);
                }
                const double hT = 1e-3;
                pw_activity tp = ev(p, x, T + hT), tm = ev(p, x, T - hT);
                for (int i = 0; i < 2; i++)
                    pw_assert_close(a.dlngamma_dT[i], (tp.lngamma[i] - tm.lngamma[i]) / (2 * hT),
                                    1e-6, 1e-10, label);
                /* Gibbs-Helmholtz: H^E = -R T^2 d(G^E/RT)/dT */
                pw_assert_close(a.hE_Jmol, -R * T * T * (tp.gE_RT - tm.gE_RT) / (2 * hT), 1e-6,
                                1e-6, label);
                for (size_t j = 0; j < M->n_params; j++) {
                    /* central differences with steps h and h/2, Richardson-extrapolated */
                    double d[2][2];
                    for (int s = 0; s < 2; s++) {
                        double pp[PW_MAX_PARAMS] = {0}, pm[PW_MAX_PARAMS] = {0};
                        memcpy(pp, p, sizeof(double) * 6);
                        memcpy(pm, p, sizeof(double) * 6);
                        double h = (s ? 0.5e-4 : 1e-4) * fmax(1.0, fabs(p[j]));
                        pp[j] += h;
                        pm[j] -= h;
                        pw_activity ap = ev(pp, x, T), am = ev(pm, x, T);
                        for (int i = 0; i < 2; i++)
                            d[s][i] = (ap.lngamma[i] - am.lngamma[i]) / (2 * h);
                    }
                    for (int i = 0; i < 2; i++)
                        pw_assert_close(a.dlngamma_dp[i][j], (4.0 * d[1][i] - d[0][i]) / 3.0, 1e-6,
                                        1e-9, label);
                }
                /* Gibbs-Duhem at constant T, P: analytic, and with finite differences */
                pw_assert_close(x * a.dlngamma_dx1[0] + x2 * a.dlngamma_dx1[1], 0.0, 0.0, 1e-9,
                                label);
                pw_assert_close(x * fd_x(p, x, T, q_lng1) + x2 * fd_x(p, x, T, q_lng2), 0.0, 0.0,
                                1e-6, label);
                pw_assert_close(a.gE_RT, x * a.lngamma[0] + x2 * a.lngamma[1], 1e-12, 1e-14, label);
            }
        }
    }
}

/* Abrams & Prausnitz (1975) form: ln gamma_i = ln(Phi_i/x_i) + (z/2) q_i ln(theta_i/Phi_i)
 * + l_i - (Phi_i/x_i) sum_j x_j l_j - q_i ln(sum_j theta_j tau_ji)
 * + q_i - q_i sum_j theta_j tau_ij / sum_k theta_k tau_kj, for 0 < x1 < 1. */
static void reference_lngamma(const double *p, double x1, double T, double out[2])
{
    double x[2] = {x1, 1.0 - x1}, r[2] = {p[2], p[4]}, q[2] = {p[3], p[5]};
    double tau[2][2] = {{1.0, exp(-p[0] / T)}, {exp(-p[1] / T), 1.0}}; /* tau[i][j] = tau_ij */
    double sr = r[0] * x[0] + r[1] * x[1], sq = q[0] * x[0] + q[1] * x[1];
    double phi[2], th[2], l[2];
    for (int i = 0; i < 2; i++) {
        phi[i] = r[i] * x[i] / sr;
        th[i] = q[i] * x[i] / sq;
        l[i] = 5.0 * (r[i] - q[i]) - (r[i] - 1.0);
    }
    double sxl = x[0] * l[0] + x[1] * l[1];
    for (int i = 0; i < 2; i++) {
        double s_i = th[0] * tau[0][i] + th[1] * tau[1][i], sum = 0.0;
        for (int j = 0; j < 2; j++)
            sum += th[j] * tau[i][j] / (th[0] * tau[0][j] + th[1] * tau[1][j]);
        out[i] = log(phi[i] / x[i]) + 5.0 * q[i] * log(th[i] / phi[i]) + l[i] -
                 phi[i] / x[i] * sxl - q[i] * log(s_i) + q[i] - q[i] * sum;
    }
}

static void matches_the_published_form(void **state)
{
    (void)state;
    for (size_t c = 0; c < N_CASES; c++)
        for (size_t ti = 0; ti < 3; ti++)
            for (size_t xi = 1; xi + 1 < sizeof xs / sizeof *xs; xi++) {
                double want[2];
                reference_lngamma(cases[c], xs[xi], Ts[ti], want);
                pw_activity a = ev(cases[c], xs[xi], Ts[ti]);
                pw_assert_close(a.lngamma[0], want[0], 1e-11, 1e-12, "ln gamma1 (A&P form)");
                pw_assert_close(a.lngamma[1], want[1], 1e-11, 1e-12, "ln gamma2 (A&P form)");
            }
}

/* x1 -> 0: ln gamma1 = ln(r1/r2) + (z/2) q1 ln(q1 r2/(q2 r1)) + l1 - (r1/r2) l2
 *                      + q1 (1 - ln tau21 - tau12), and symmetrically for x1 -> 1. */
static void infinite_dilution_closed_forms(void **state)
{
    (void)state;
    for (size_t c = 0; c < N_CASES; c++) {
        const double *p = cases[c];
        double r1 = p[2], q1 = p[3], r2 = p[4], q2 = p[5];
        double l1 = 5.0 * (r1 - q1) - (r1 - 1.0), l2 = 5.0 * (r2 - q2) - (r2 - 1.0);
        for (size_t ti = 0; ti < 3; ti++) {
            double T = Ts[ti], t12 = exp(-p[0] / T), t21 = exp(-p[1] / T);
            double want1 = log(r1 / r2) + 5.0 * q1 * log(q1 * r2 / (q2 * r1)) + l1 - r1 / r2 * l2 +
                           q1 * (1.0 - log(t21) - t12);
            double want2 = log(r2 / r1) + 5.0 * q2 * log(q2 * r1 / (q1 * r2)) + l2 - r2 / r1 * l1 +
                           q2 * (1.0 - log(t12) - t21);
            pw_assert_close(ev(p, 0.0, T).lngamma[0], want1, 1e-12, 1e-13, "ln gamma1 inf");
            pw_assert_close(ev(p, 1.0, T).lngamma[1], want2, 1e-12, 1e-13, "ln gamma2 inf");
            pw_assert_close(ev(p, 1.0, T).lngamma[0], 0.0, 0.0, 1e-14, "pure 1 reference");
            pw_assert_close(ev(p, 0.0, T).lngamma[1], 0.0, 0.0, 1e-14, "pure 2 reference");
        }
    }
}

/* Identical molecules without interaction energy form an ideal solution; with du = 0 the
 * residual part vanishes and H^E = 0 (the combinatorial part is athermal). */
static void limits(void **state)
{
    (void)state;
    for (size_t xi = 0; xi < sizeof xs / sizeof *xs; xi++) {
        pw_activity a = ev(cases[3], xs[xi], 350.0);
        pw_assert_close(a.lngamma[0], 0.0, 0.0, 1e-14, "ideal 1");
        pw_assert_close(a.lngamma[1], 0.0, 0.0, 1e-14, "ideal 2");
        double athermal[6] = {0.0, 0.0, 2.5735, 2.336, 0.92, 1.40};
        pw_assert_close(ev(athermal, xs[xi], 350.0).hE_Jmol, 0.0, 0.0, 1e-9, "athermal H^E");
    }
}

static void bad_parameters_are_refused(void **state)
{
    (void)state;
    pw_activity a;
    const double zero_r[6] = {0, 0, 0.0, 1.0, 1.0, 1.0}, neg_q[6] = {0, 0, 1.0, 1.0, 1.0, -1.0};
    const double nan_u[6] = {NAN, 0, 1, 1, 1, 1}, huge_u[6] = {-1e6, 0, 1, 1, 1, 1};
    assert_int_equal(M->check(zero_r), PW_EDOM);
    assert_int_equal(M->check(neg_q), PW_EDOM);
    assert_int_equal(M->check(nan_u), PW_EDOM);
    assert_int_equal(M->eval(huge_u, T_REF, 0.5, 300.0, &a), PW_EDOM); /* tau overflows */
    assert_int_equal(M->eval(cases[0], T_REF, 1.5, 300.0, &a), PW_EDOM);
}

/* r and q come from the component data: the library's rows give them, a row without them is
 * refused with the component and the column named. */
static void r_and_q_from_components(void **state)
{
    (void)state;
    pw_complib lib;
    pw_complib_init(&lib);
    char path[1024];
    pw_error err;
    assert_int_equal(
        pw_complib_read(&lib, pw_test_path(path, sizeof path, "datasets/components.csv"), &err),
        PW_OK);
    const pw_component *e = pw_complib_find(&lib, "ethanol"), *w = pw_complib_find(&lib, "water");
    double p[PW_MAX_PARAMS] = {0};
    assert_int_equal(M->from_components(e, w, p, &err), PW_OK);
    pw_assert_close(p[2], 2.1055, 0.0, 1e-12, "r ethanol");
    pw_assert_close(p[3], 1.972, 0.0, 1e-12, "q ethanol");
    pw_assert_close(p[4], 0.92, 0.0, 1e-12, "r water");
    pw_assert_close(p[5], 1.40, 0.0, 1e-12, "q water");
    pw_component bare = *w;
    pw_component_props_clear(&bare);
    strcpy(bare.name, "water-without-q");
    bare.prop[PW_PROP_R] = 0.92;
    pw_error_clear(&err);
    assert_int_equal(M->from_components(e, &bare, p, &err), PW_ENOTFOUND);
    assert_non_null(strstr(err.msg, "'water-without-q' has no q"));
    pw_complib_free(&lib);
}

/* Check values of this project's methods brief (METHODS2 section 1.6, tagged [H]: computed by
 * hand from the equations of Abrams & Prausnitz 1975, synthetic inputs that test the code, not
 * the chemistry): ethanol(1)/water(2) with r1 = 2.1055, q1 = 1.972, r2 = 0.92, q2 = 1.40
 * (molecular values, Abrams & Prausnitz 1975 / Prausnitz et al. 1999 ch. 7, from memory) at
 * 350 K. No published UNIQUAC parameter set with its printed activity coefficients could be
 * read for this project (the brief says so too), so none is claimed here. The infinite-dilution
 * values are also computed in this test in the brief's closed form (section 1.2: the l_i form,
 * not the J_i/L_i form of the code), and exchanging the components together with (u12, u21)
 * must give the mirrored values. */
static void methods_brief_check_values(void **state)
{
    (void)state;
    const struct {
        double u12, u21, inf1, inf2;
        double x, lng1, lng2, g, hE;
        double x_b, lng1_b, lng2_b, g_b, hE_b; /* NAN: not tabulated */
    } rows[] = {
        {-50.0, 250.0, 2.019562, 0.955601, 0.3, 0.555076, 0.215247, 0.317196, 383.419, 0.5,
         0.208607, 0.438959, 0.323783, 348.448},
        {300.0, -20.0, 1.936272, 1.558630, 0.3, 0.776109, 0.186829, 0.363613, 435.861, NAN, NAN,
         NAN, NAN, NAN},
    };
    const double r1 = 2.1055, q1 = 1.972, r2 = 0.92, q2 = 1.40, T = 350.0, z2 = 5.0;
    for (size_t i = 0; i < 2; i++) {
        const double p[6] = {rows[i].u12, rows[i].u21, r1, q1, r2, q2};
        const double ps[6] = {rows[i].u21, rows[i].u12, r2, q2, r1, q1}; /* exchanged */
        pw_activity a0 = ev(p, 0.0, T), a1 = ev(p, 1.0, T);
        pw_assert_close(a0.lngamma[0], rows[i].inf1, 0, 5e-7, "ln gamma1 inf [H]");
        pw_assert_close(a1.lngamma[1], rows[i].inf2, 0, 5e-7, "ln gamma2 inf [H]");
        /* METHODS2 1.2 closed form, l_i = (z/2)(r_i - q_i) - (r_i - 1) */
        double t12 = exp(-rows[i].u12 / T), t21 = exp(-rows[i].u21 / T);
        double l1 = z2 * (r1 - q1) - (r1 - 1.0), l2 = z2 * (r2 - q2) - (r2 - 1.0);
        double inf1 = log(r1 / r2) + z2 * q1 * log(q1 * r2 / (q2 * r1)) + l1 - r1 / r2 * l2 -
                      q1 * log(t21) + q1 * (1.0 - t12);
        double inf2 = log(r2 / r1) + z2 * q2 * log(q2 * r1 / (q1 * r2)) + l2 - r2 / r1 * l1 -
                      q2 * log(t12) + q2 * (1.0 - t21);
        pw_assert_close(a0.lngamma[0], inf1, 1e-12, 1e-12, "ln gamma1 inf closed form");
        pw_assert_close(a1.lngamma[1], inf2, 1e-12, 1e-12, "ln gamma2 inf closed form");
        for (int k = 0; k < 2; k++) {
            double x = k ? rows[i].x_b : rows[i].x;
            if (isnan(x))
                continue;
            double want[4] = {k ? rows[i].lng1_b : rows[i].lng1, k ? rows[i].lng2_b : rows[i].lng2,
                              k ? rows[i].g_b : rows[i].g, k ? rows[i].hE_b : rows[i].hE};
            pw_activity a = ev(p, x, T), m = ev(ps, 1.0 - x, T);
            pw_assert_close(a.lngamma[0], want[0], 0, 5e-7, "ln gamma1 [H]");
            pw_assert_close(a.lngamma[1], want[1], 0, 5e-7, "ln gamma2 [H]");
            pw_assert_close(a.gE_RT, want[2], 0, 5e-7, "G^E/RT [H]");
            pw_assert_close(a.hE_Jmol, want[3], 0, 5e-4, "H^E [H]");
            pw_assert_close(m.lngamma[1], a.lngamma[0], 1e-12, 1e-14, "exchanged 1");
            pw_assert_close(m.lngamma[0], a.lngamma[1], 1e-12, 1e-14, "exchanged 2");
            pw_assert_close(m.hE_Jmol, a.hE_Jmol, 1e-12, 1e-12, "exchanged H^E");
        }
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(derivatives_match_finite_differences),
        cmocka_unit_test(matches_the_published_form),
        cmocka_unit_test(infinite_dilution_closed_forms),
        cmocka_unit_test(limits),
        cmocka_unit_test(bad_parameters_are_refused),
        cmocka_unit_test(r_and_q_from_components),
        cmocka_unit_test(methods_brief_check_values),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
