/* Liquid-liquid equilibrium (src/thermo/lle.c): closed forms, published check values and a seeded
 * randomised test against an independent tangent-plane computation.
 *
 * Identity (derived here): symmetric Margules, ln gamma1 = A x2^2, ln gamma2 = A x1^2. The pair
 * (x, 1 - x) has equal activities of both components iff ln x + A (1-x)^2 = ln(1-x) + A x^2, i.e.
 *     ln[x/(1 - x)] = A (2x - 1),
 * which has a root x != 1/2 iff A > 2 (the slope of the left side at 1/2 is 4, of the right 2A).
 * Spinodal: D = 1/(x(1-x)) - 2A = 0, x_s = [1 - sqrt(1 - 2/A)]/2. Check values of METHODS2 2.8
 * (computed there; re-derived here by the identity itself). */
#include "pw_test.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/lle.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define N_RANDOM 1200
#define CHECK_GRID 10001

static pw_system make_sys(const pw_model_type *m, const double *p, size_t n)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.model = m;
    for (size_t i = 0; i < PW_MAX_PARAMS; i++)
        s.params[i] = m->defaults[i < m->n_params ? i : 0];
    for (size_t i = 0; i < n; i++)
        s.params[i] = p[i];
    s.T_ref_K = 300.0;
    return s;
}

/* Gmix/RT from the model, computed here (not through the solver). */
static double gmix(const pw_system *s, double T, double x)
{
    pw_activity a;
    assert_int_equal(pw_system_activity(s, x, T, &a), PW_OK);
    return x * log(x) + (1.0 - x) * log1p(-x) + a.gE_RT;
}

static void lna(const pw_system *s, double T, double x, double *l1, double *l2)
{
    pw_activity a;
    assert_int_equal(pw_system_activity(s, x, T, &a), PW_OK);
    *l1 = log(x) + a.lngamma[0];
    *l2 = log1p(-x) + a.lngamma[1];
}

static int check_one(const pw_system *s, double T, const pw_lle_result *r, char *why, size_t n);

static void symmetric_margules(void **state)
{
    (void)state;
    /* METHODS2 2.8 table (computed): A, lean layer, spinodal */
    static const double tab[][3] = {
        {2.05, 0.366075, 0.421913}, {2.1, 0.314647, 0.390891}, {2.2, 0.248530, 0.349244},
        {2.5, 0.144794, 0.276393},  {3.0, 0.070720, 0.211325}, {3.5, 0.037874, 0.172673},
        {4.0, 0.021248, 0.146447},  {5.0, 0.007188, 0.112702},
    };
    for (size_t i = 0; i < sizeof tab / sizeof tab[0]; i++) {
        double A = tab[i][0], p[2] = {A, A};
        pw_system s = make_sys(&pw_model_margules, p, 2);
        pw_lle_result r;
        assert_int_equal(pw_lle_solve(&s, 300.0, &r), PW_OK);
        assert_true(r.split);
        pw_assert_close(r.x[0] + r.x[1], 1.0, 0.0, 1e-10, "symmetric layers");
        pw_assert_close(log(r.x[0] / (1.0 - r.x[0])), A * (2.0 * r.x[0] - 1.0), 0.0, 1e-10,
                        "ln[x/(1-x)] = A(2x-1)");
        pw_assert_close(r.x[0], tab[i][1], 0.0, 1.5e-6, "METHODS2 2.8 lean layer");
        pw_assert_close(r.spinodal[0], tab[i][2], 0.0, 1e-6, "spinodal");
        pw_assert_close(r.spinodal[0], 0.5 * (1.0 - sqrt(1.0 - 2.0 / A)), 0.0, 1e-9,
                        "spinodal closed form");
    }
    /* A <= 2: no split (and A = 2 exactly is the critical point) */
    for (double A = 0.0; A <= 2.0; A += 0.25) {
        double p[2] = {A, A};
        pw_system s = make_sys(&pw_model_margules, p, 2);
        pw_lle_result r;
        assert_int_equal(pw_lle_solve(&s, 300.0, &r), PW_OK);
        assert_false(r.split);
        assert_true(isnan(r.x[0]));
    }
}

/* UCST of g = (a/T) x1 x2 (symmetric Margules with A = A0 T_ref/T): T_c = a/2 and the binodal
 * T(x) = a (2x - 1)/ln[x/(1-x)] (METHODS2 2.6, computed; follows from the identity above). */
static void margules_ucst(void **state)
{
    (void)state;
    double p[2] = {1000.0 / 300.0, 1000.0 / 300.0}; /* a = A T_ref = 1000 K */
    pw_system s = make_sys(&pw_model_margules, p, 2);
    static const double xs[] = {0.05, 0.1, 0.2, 0.3, 0.4};
    static const double Ts[] = {305.661, 364.096, 432.809, 472.089, 493.261}; /* METHODS2 2.6 */
    for (size_t i = 0; i < 5; i++) {
        pw_lle_result r;
        assert_int_equal(pw_lle_solve(&s, Ts[i], &r), PW_OK);
        assert_true(r.split);
        pw_assert_close(r.x[0], xs[i], 0.0, 2e-5, "binodal of g = (a/T) x1 x2");
    }
    pw_lle_scan_point pts[11];
    pw_lle_critical c[PW_LLE_MAX_CRITICAL];
    size_t nc;
    assert_int_equal(pw_lle_scan(&s, 400.0, 600.0, 11, pts, c, &nc), PW_OK);
    assert_int_equal(nc, 1);
    pw_assert_close(c[0].T_K, 500.0, 0.0, 1e-5, "UCST = a/2");
    pw_assert_close(c[0].x1, 0.5, 0.0, 1e-6, "critical composition");
    assert_true(c[0].upper);
    assert_true(pts[0].split);
    assert_false(pts[10].split);
}

/* van Laar critical points, METHODS2 2.8 (computed there and matched to a closed form): the
 * parameters at the critical point give no split, 1 % above them a split near x1c. */
static void vanlaar_critical(void **state)
{
    (void)state;
    static const double tab[][3] = {
        {1.29904, 2.59808, 0.73205}, {0.74201, 2.96804, 0.86852}, {2.59808, 1.29904, 0.26795}};
    for (size_t i = 0; i < 3; i++) {
        double p0[2] = {tab[i][0] * 0.999, tab[i][1] * 0.999};
        pw_system s = make_sys(&pw_model_vanlaar, p0, 2);
        pw_lle_result r;
        assert_int_equal(pw_lle_solve(&s, 300.0, &r), PW_OK);
        assert_false(r.split);
        double p1[2] = {tab[i][0] * 1.001, tab[i][1] * 1.001};
        s = make_sys(&pw_model_vanlaar, p1, 2);
        assert_int_equal(pw_lle_solve(&s, 300.0, &r), PW_OK);
        assert_true(r.split);
        assert_true(r.x[0] < tab[i][2] && r.x[1] > tab[i][2]);
        pw_assert_close(0.5 * (r.spinodal[0] + r.spinodal[1]), tab[i][2], 0.0, 2e-3,
                        "van Laar critical composition");
    }
}

/* NRTL asymmetric set of METHODS2 2.7 (computed there): alpha 0.5, tau12 1, tau21 4. */
static void nrtl_asymmetric(void **state)
{
    (void)state;
    double p[3] = {300.0, 1200.0, 0.5};
    pw_system s = make_sys(&pw_model_nrtl, p, 3);
    pw_lle_result r;
    assert_int_equal(pw_lle_solve(&s, 300.0, &r), PW_OK);
    assert_true(r.split);
    pw_assert_close(r.x[0], 0.00932, 0.0, 1e-5, "NRTL lean layer");
    pw_assert_close(r.x[1], 0.3137, 0.0, 1e-4, "NRTL rich layer");
    /* No rule on alpha replaces the scan (METHODS2 2.7): a symmetric set at alpha = 0.45, above
     * the often-quoted limit, still splits near both ends when tau is large (D < 0 where
     * x ~ exp(-alpha tau); found here, and checked by the tangent plane in check_one). */
    double q[3] = {9.0 * 300.0, 9.0 * 300.0, 0.45};
    s = make_sys(&pw_model_nrtl, q, 3);
    assert_int_equal(pw_lle_solve(&s, 300.0, &r), PW_OK);
    assert_true(r.split);
    char why[200];
    if (check_one(&s, 300.0, &r, why, sizeof why))
        fail_msg("%s", why);
}

static void wilson_never(void **state)
{
    (void)state;
    assert_false(pw_model_can_split(&pw_model_wilson));
    assert_true(pw_model_can_split(&pw_model_nrtl));
    assert_true(pw_model_can_split(&pw_model_margules));
    double p[3] = {1500.0, 1500.0, 1.0};
    pw_system s = make_sys(&pw_model_wilson, p, 3);
    pw_lle_result r;
    assert_int_equal(pw_lle_solve(&s, 300.0, &r), PW_OK);
    assert_false(r.split);
}

/* Independent check of one result on a 10,001-point grid (uniform in x, ends included by
 * 1e-9 and 1 - 1e-9 points): a split has equal activities to 1e-9 and no grid point below the
 * common tangent; no split means Gmix is convex on the grid (every point on or above the chord
 * of its neighbours), which for a one-variable function is the same as no tangent-plane
 * violation at any grid point. */
static int check_one(const pw_system *s, double T, const pw_lle_result *r, char *why, size_t n)
{
    static double G[CHECK_GRID], X[CHECK_GRID];
    for (int k = 0; k < CHECK_GRID; k++) {
        X[k] = k == 0 ? 1e-9 : (k == CHECK_GRID - 1 ? 1.0 - 1e-9 : (double)k / (CHECK_GRID - 1));
        G[k] = gmix(s, T, X[k]);
    }
    if (r->split) {
        double a1, a2, b1, b2;
        lna(s, T, r->x[0], &a1, &a2);
        lna(s, T, r->x[1], &b1, &b2);
        if (fabs(exp(a1) - exp(b1)) > 1e-9 || fabs(exp(a2) - exp(b2)) > 1e-9) {
            snprintf(why, n, "activities differ: %.3g %.3g", exp(a1) - exp(b1), exp(a2) - exp(b2));
            return 1;
        }
        if (!(r->x[1] - r->x[0] > 1e-6)) {
            snprintf(why, n, "trivial pair");
            return 1;
        }
        double gI = gmix(s, T, r->x[0]), gII = gmix(s, T, r->x[1]);
        double sl = (gII - gI) / (r->x[1] - r->x[0]);
        for (int k = 0; k < CHECK_GRID; k++)
            if (G[k] - (gI + sl * (X[k] - r->x[0])) < -1e-10) {
                snprintf(why, n, "below the tangent at x = %.6g by %.3g", X[k],
                         G[k] - (gI + sl * (X[k] - r->x[0])));
                return 1;
            }
    } else {
        for (int k = 1; k + 1 < CHECK_GRID; k++) {
            double w = (X[k] - X[k - 1]) / (X[k + 1] - X[k - 1]);
            double chord = G[k - 1] + w * (G[k + 1] - G[k - 1]);
            if (G[k] - chord > 1e-13 * (1.0 + fabs(G[k]))) {
                snprintf(why, n, "not convex at x = %.6g (%.3g above the chord)", X[k],
                         G[k] - chord);
                return 1;
            }
        }
    }
    return 0;
}

static void randomised(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261202UL);
    int n_split = 0, n_none = 0, n_range = 0;
    char why[200];
    for (int c = 0; c < N_RANDOM; c++) {
        int kind = c % 3;
        pw_system s;
        const double T = 300.0;
        if (kind == 0) {
            double p[2] = {-1.0 + 6.0 * gsl_rng_uniform(rng), -1.0 + 6.0 * gsl_rng_uniform(rng)};
            s = make_sys(&pw_model_margules, p, 2);
        } else if (kind == 1) {
            double sg = gsl_rng_uniform(rng) < 0.8 ? 1.0 : -1.0;
            double p[2] = {sg * (0.05 + 5.0 * gsl_rng_uniform(rng)),
                           sg * (0.05 + 5.0 * gsl_rng_uniform(rng))};
            s = make_sys(&pw_model_vanlaar, p, 2);
        } else {
            double p[3] = {T * (-1.5 + 6.5 * gsl_rng_uniform(rng)),
                           T * (-1.5 + 6.5 * gsl_rng_uniform(rng)),
                           0.1 + 0.4 * gsl_rng_uniform(rng)};
            s = make_sys(&pw_model_nrtl, p, 3);
        }
        pw_lle_result r;
        pw_status st = pw_lle_solve(&s, T, &r);
        if (st == PW_ERANGE) { /* a layer beyond 1e-12 of a pure end: documented refusal */
            n_range++;
            continue;
        }
        if (st != PW_OK)
            fail_msg("case %d (%s %.6g %.6g %.6g): status %s", c, s.model->name, s.params[0],
                     s.params[1], s.params[2], pw_strerror(st));
        if (check_one(&s, T, &r, why, sizeof why))
            fail_msg("case %d (%s %.9g %.9g %.9g): %s", c, s.model->name, s.params[0],
                     s.params[1], s.params[2], why);
        if (r.split)
            n_split++;
        else
            n_none++;
    }
    gsl_rng_free(rng);
    printf("# %d splits, %d without split, %d beyond the solubility floor\n", n_split, n_none,
           n_range);
    assert_true(n_split > 300 && n_none > 300);
    assert_true(n_range < N_RANDOM / 50);
}

static void bad_arguments(void **state)
{
    (void)state;
    double p[2] = {3.0, 3.0};
    pw_system s = make_sys(&pw_model_margules, p, 2);
    pw_lle_result r;
    assert_int_equal(pw_lle_solve(NULL, 300.0, &r), PW_EINVAL);
    assert_int_equal(pw_lle_solve(&s, -1.0, &r), PW_EDOM);
    assert_int_equal(pw_lle_solve(&s, NAN, &r), PW_EDOM);
    double t;
    assert_int_equal(pw_lle_tpd_min(&s, 300.0, 0.6, 0.4, 1000, &t, NULL), PW_EDOM);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(symmetric_margules), cmocka_unit_test(margules_ucst),
        cmocka_unit_test(vanlaar_critical),   cmocka_unit_test(nrtl_asymmetric),
        cmocka_unit_test(wilson_never),       cmocka_unit_test(randomised),
        cmocka_unit_test(bad_arguments),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
