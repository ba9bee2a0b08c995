/* Liquid-liquid splits with a layer very close to a pure component (src/thermo/lle.c): seeded
 * random parameter sets of Margules, van Laar, NRTL and UNIQUAC drawn so that their layers lie
 * from about 1e-2 to beyond 1e-12 of a pure end, each checked against an independent computation
 * here; a regression of the NRTL second minimum of the shipped MEK/toluene data; the binodal scan
 * and the three-phase state on the same models.
 *
 * The independent checks use only the model's ln gamma_i (never the solver) on a 10,001-point
 * grid uniform in the logit u = ln[x/(1 - x)] from -40 to 40 (x from 4e-18 to 1 - 4e-18, so
 * graded toward both ends; the complement 1 - x is kept exactly):
 *  - a split: equal activities, |ln a_i(I) - ln a_i(II)| <= 1e-9 (a_i <= 1, so also |delta a_i|
 *    <= 1e-9), with ln a2 of each layer from its exact complement x2; and the tangent-plane
 *    distance in Michelsen's form (Michelsen 1982, Fluid Phase Equilib. 9:1-19)
 *        tpd(x) = x [ln x + ln gamma1(x) - ln a1] + (1 - x) [ln(1 - x) + ln gamma2(x) - ln a2]
 *    (Gmix/RT minus the common tangent x ln a1 + (1 - x) ln a2, free of cancellation) is
 *    >= -1e-10 at every grid point;
 *  - no split: G'(x) = u + ln gamma1 - ln gamma2 does not decrease along the grid (Gmix/RT convex
 *    there, so no tangent-plane violation at any grid point);
 *  - a refusal (PW_ERANGE): the composition at the floor on that side, x = 1e-12 or 1 - 1e-12, is
 *    unstable: its own tangent-plane distance (the formula above with a_i at the floor) is
 *    negative somewhere on the grid (for a binary, a composition is inside the binodal iff it is
 *    unstable, so a layer lies beyond the floor); and the pair the solver describes has a layer
 *    beyond 1e-12 and equal activities (it describes none only where d2(Gmix/RT)/dx2 < 0 at the
 *    floor itself or beyond it, checked here).
 * Never PW_ENOCONV. */
#include "pw_test.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/lle.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define N_RANDOM 1200
#define GRID 10001
#define U_GRID 40.0
#define FLOOR 1e-12 /* PW_LLE_X_MIN, the documented floor */

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

/* x and 1 - x from the logit, both to full relative precision. */
static void from_logit(double u, double *x, double *xc)
{
    double e = exp(-fabs(u));
    double big = 1.0 / (1.0 + e), small = e / (1.0 + e);
    *x = u > 0.0 ? big : small;
    *xc = u > 0.0 ? small : big;
}

typedef struct gpt {
    double x, xc, lg1, lg2;
} gpt;

static gpt grid_pt(const pw_system *s, double T, double x, double xc)
{
    pw_activity a;
    assert_int_equal(pw_system_activity(s, x, T, &a), PW_OK);
    return (gpt){x, xc, a.lngamma[0], a.lngamma[1]};
}

/* ln a_i at (x, xc) */
static void lna(const pw_system *s, double T, double x, double xc, double *l1, double *l2)
{
    gpt g = grid_pt(s, T, x, xc);
    *l1 = log(x) + g.lg1;
    *l2 = log(xc) + g.lg2;
}

/* Michelsen's tangent-plane distance of grid point g from the tangent with ln a_i = la1, la2. */
static double tpd(const gpt *g, double la1, double la2)
{
    return g->x * (log(g->x) + g->lg1 - la1) + g->xc * (log(g->xc) + g->lg2 - la2);
}

static gpt G_[GRID];

static void fill_grid(const pw_system *s, double T)
{
    for (int k = 0; k < GRID; k++) {
        double x, xc;
        from_logit(-U_GRID + 2.0 * U_GRID * k / (GRID - 1), &x, &xc);
        G_[k] = grid_pt(s, T, x, xc);
    }
}

/* smallest tpd on the grid from the tangent at (la1, la2) */
static double grid_tpd_min(double la1, double la2)
{
    double m = INFINITY;
    for (int k = 0; k < GRID; k++)
        m = fmin(m, tpd(&G_[k], la1, la2));
    return m;
}

typedef struct tally {
    int split, none, refused, near6, near10, band; /* band: nearest end 1e-10 .. 1e-2 */
} tally;

/* Checks one solve; returns 0 or 1 with the reason in why. */
static int check_one(const pw_system *s, double T, pw_status st, const pw_lle_result *r,
                     tally *t, char *why, size_t n)
{
    fill_grid(s, T);
    if (st == PW_OK && r->split) {
        double a1, a2, b1, b2;
        lna(s, T, r->x[0], r->x2[0], &a1, &a2);
        lna(s, T, r->x[1], r->x2[1], &b1, &b2);
        if (fabs(a1 - b1) > 1e-9 || fabs(a2 - b2) > 1e-9) {
            snprintf(why, n, "ln activities differ: %.3g %.3g", a1 - b1, a2 - b2);
            return 1;
        }
        if (!(log(r->x[1] / r->x2[1]) - log(r->x[0] / r->x2[0]) > 1e-6)) {
            snprintf(why, n, "trivial pair");
            return 1;
        }
        if (r->x[0] < FLOOR || r->x2[1] < FLOOR) {
            snprintf(why, n, "a layer beyond the floor reported as a split");
            return 1;
        }
        double m = grid_tpd_min(a1, a2);
        if (m < -1e-10) {
            snprintf(why, n, "grid point below the common tangent by %.3g", m);
            return 1;
        }
        double near = fmin(r->x[0], r->x2[1]);
        t->split++;
        t->near6 += near < 1e-6;
        t->near10 += near < 1e-10;
        t->band += near >= 1e-10 && near <= 1e-2;
        return 0;
    }
    if (st == PW_OK) {
        for (int k = 1; k < GRID; k++) {
            double d0 = log(G_[k - 1].x) - log(G_[k - 1].xc) + G_[k - 1].lg1 - G_[k - 1].lg2;
            double d1 = log(G_[k].x) - log(G_[k].xc) + G_[k].lg1 - G_[k].lg2;
            if (d1 < d0 - 1e-12 * (1.0 + fabs(d0))) {
                snprintf(why, n, "no split reported, but G' decreases at x = %.6g (by %.3g)",
                         G_[k].x, d0 - d1);
                return 1;
            }
        }
        t->none++;
        return 0;
    }
    if (st == PW_ERANGE) {
        /* the floor composition on one side is unstable */
        double f1, f2, g1, g2;
        lna(s, T, FLOOR, 1.0 - FLOOR, &f1, &f2);
        lna(s, T, 1.0 - FLOOR, FLOOR, &g1, &g2);
        double m0 = grid_tpd_min(f1, f2), m1 = grid_tpd_min(g1, g2);
        if (!(fmin(m0, m1) < -1e-14)) {
            snprintf(why, n, "refused, but both floor compositions are stable (%.3g, %.3g)", m0,
                     m1);
            return 1;
        }
        if (isnan(r->x[0]) && isnan(r->x2[1])) {
            /* not described: only when the unstable region itself reaches the floor, or lies
             * beyond it */
            pw_activity a0, a1;
            assert_int_equal(pw_system_activity(s, FLOOR, T, &a0), PW_OK);
            assert_int_equal(pw_system_activity(s, 1.0 - FLOOR, T, &a1), PW_OK);
            double D0 = 1.0 / (FLOOR * (1.0 - FLOOR)) + a0.d2gE_dx2;
            double D1 = 1.0 / (FLOOR * (1.0 - FLOOR)) + a1.d2gE_dx2;
            bool beyond = false; /* G' decreasing on the grid beyond a floor */
            for (int k = 1; k < GRID; k++) {
                if (G_[k].x >= FLOOR && G_[k - 1].xc >= FLOOR)
                    continue;
                double d0 = log(G_[k - 1].x) - log(G_[k - 1].xc) + G_[k - 1].lg1 - G_[k - 1].lg2;
                double d1 = log(G_[k].x) - log(G_[k].xc) + G_[k].lg1 - G_[k].lg2;
                beyond = beyond || d1 < d0;
            }
            if (!(D0 < 0.0 || D1 < 0.0 || beyond)) {
                snprintf(why, n, "refused pair not described (d2G/dx2 at the floors %.3g %.3g)",
                         D0, D1);
                return 1;
            }
            t->refused++;
            return 0;
        }
        if (!(r->x[0] < FLOOR || r->x2[1] < FLOOR)) {
            snprintf(why, n, "refused, but the described layers %.6g and 1 - %.6g are inside",
                     r->x[0], r->x2[1]);
            return 1;
        }
        double a1, a2, b1, b2;
        lna(s, T, r->x[0], r->x2[0], &a1, &a2);
        lna(s, T, r->x[1], r->x2[1], &b1, &b2);
        if (fabs(a1 - b1) > 1e-9 || fabs(a2 - b2) > 1e-9) {
            snprintf(why, n, "refused pair: ln activities differ: %.3g %.3g", a1 - b1, a2 - b2);
            return 1;
        }
        t->refused++;
        return 0;
    }
    snprintf(why, n, "status %s", pw_strerror(st));
    return 1;
}

/* A random parameter set whose split (if any) tends to have a layer from 1e-2 to beyond 1e-12
 * of a pure end: ln gamma at infinite dilution of about 3 to 30 (a layer near exp(-ln gamma_inf)
 * of a pure end; a fifth or so beyond 1e-12). T = T_ref = 300 K, so Margules and van Laar parameters are A_ij. */
static pw_system draw(gsl_rng *rng, int kind)
{
    const double T = 300.0;
    double u1 = gsl_rng_uniform(rng), u2 = gsl_rng_uniform(rng), u3 = gsl_rng_uniform(rng);
    if (kind == 0) {
        double p[2] = {2.5 + 26.0 * u1, 2.5 + 26.0 * u2};
        return make_sys(&pw_model_margules, p, 2);
    }
    if (kind == 1) {
        double p[2] = {2.5 + 26.0 * u1, 2.5 + 26.0 * u2};
        return make_sys(&pw_model_vanlaar, p, 2);
    }
    if (kind == 2) {
        double p[3] = {T * (-3.0 + 33.0 * u1), T * (-3.0 + 33.0 * u2), 0.1 + 0.4 * u3};
        return make_sys(&pw_model_nrtl, p, 3);
    }
    /* UNIQUAC: du_ij from -500 to 3000 K (tau_ij = exp(-du_ij/T) down to e^-10), r and q of the
     * sizes real molecules have (about 0.9-6, q about 0.7-1.1 r) */
    double p[6] = {-500.0 + 3500.0 * u1, -500.0 + 3500.0 * u2, 0, 0, 0, 0};
    for (int i = 0; i < 2; i++) {
        double r = 0.9 + 5.1 * gsl_rng_uniform(rng);
        p[2 + 2 * i] = r;
        p[3 + 2 * i] = r * (0.7 + 0.4 * gsl_rng_uniform(rng));
    }
    return make_sys(&pw_model_uniquac, p, 6);
}

static void randomised_extreme(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261202UL);
    tally t = {0};
    char why[240];
    for (int c = 0; c < N_RANDOM; c++) {
        pw_system s = draw(rng, c % 4);
        pw_lle_result r;
        pw_status st = pw_lle_solve(&s, 300.0, &r);
        if (check_one(&s, 300.0, st, &r, &t, why, sizeof why))
            fail_msg("case %d (%s %.17g %.17g %.17g %.17g %.17g %.17g): %s", c, s.model->name,
                     s.params[0], s.params[1], s.params[2], s.params[3], s.params[4],
                     s.params[5], why);
        /* the stability scan agrees: D < 0 somewhere exactly when the liquid splits (D < 0
         * makes a split; a split within the floor has D < 0 where the scan looks) */
        double D, xD;
        assert_int_equal(pw_stability_min(&s, 300.0, &D, &xD), PW_OK);
        if ((st == PW_OK && r.split && !(D < 0.0)) || (D < 0.0 && !(st == PW_ERANGE || r.split)))
            fail_msg("case %d (%s %.17g %.17g %.17g): stability scan min D %.6g at %.6g, split "
                     "solve status %d split %d", c, s.model->name, s.params[0], s.params[1],
                     s.params[2], D, xD, st, r.split);
    }
    gsl_rng_free(rng);
    printf("# %d splits (%d with a layer 1e-10..1e-2 of a pure end, %d within 1e-6, %d within "
           "1e-10), %d without split, %d refused beyond 1e-12\n",
           t.split, t.band, t.near6, t.near10, t.none, t.refused);
    /* the draw reaches the extremes it is meant to test */
    assert_true(t.band > 400);
    assert_true(t.near6 > 100);
    assert_true(t.near10 > 10);
    assert_true(t.refused > 50);
}

/* The NRTL second minimum of `fit datasets/mek_toluene_50C_pxy.csv --model nrtl` (the multistart's
 * minimum 2, chi-square 242.95: dg12 = 9518.204331427642 K, dg21 = 100.50194121224206 K,
 * alpha = 0.3 held), at 323.15 K. Its layers, computed for this test with 50-digit arithmetic
 * (mpmath findroot on equal activities in ln(1 - x) of both layers, from several starts):
 * 1 - x_I = 0.00398238558275515, 1 - x_II = 6.65409729507409e-16, so layer II is beyond the
 * floor: refused with the pair described. It failed with "did not converge" before (an unsorted
 * scan grid saw two unstable regions). At 410 K layer II is at 1 - 1.7e-12: solved. */
static void mek_toluene_second_minimum(void **state)
{
    (void)state;
    double p[3] = {9518.204331427642, 100.50194121224206, 0.3};
    pw_system s = make_sys(&pw_model_nrtl, p, 3);
    s.T_ref_K = 323.15;
    pw_lle_result r;
    tally t = {0};
    char why[240];
    pw_status st = pw_lle_solve(&s, 323.15, &r);
    assert_int_equal(st, PW_ERANGE);
    pw_assert_close(r.x2[0], 0.00398238558275515, 1e-9, 0.0, "1 - x_I (50-digit solve)");
    pw_assert_close(r.x2[1], 6.65409729507409e-16, 1e-6, 0.0, "1 - x_II (50-digit solve)");
    if (check_one(&s, 323.15, st, &r, &t, why, sizeof why))
        fail_msg("323.15 K: %s", why);
    for (double T = 280.0; T <= 440.0; T += 10.0) {
        st = pw_lle_solve(&s, T, &r);
        if (check_one(&s, T, st, &r, &t, why, sizeof why))
            fail_msg("%.2f K: %s", T, why);
    }
    assert_true(t.split > 0 && t.refused > 0);
    st = pw_lle_solve(&s, 410.0, &r);
    assert_int_equal(st, PW_OK);
    assert_true(r.split && r.x2[1] > 1e-12 && r.x2[1] < 1e-11);
    /* the binodal scan runs through the refused temperatures */
    pw_lle_scan_point pts[17];
    pw_lle_critical c[PW_LLE_MAX_CRITICAL];
    size_t nc;
    assert_int_equal(pw_lle_scan(&s, 280.0, 440.0, 17, pts, c, &nc), PW_OK);
    int beyond = 0;
    for (int k = 0; k < 17; k++) {
        assert_true(pts[k].split);
        beyond += pts[k].beyond_floor;
    }
    assert_true(beyond > 0 && beyond < 17);
}

/* Next to a critical point: symmetric Margules A = 2 + 10^-k (critical at A = 2, layers
 * 1/2 -+ d with d^2 = 3 (A - 2)/8 to leading order, from ln[x/(1-x)] = A (2x - 1)). Solved for
 * every k up to 15, never PW_ENOCONV; the identity ln[x/(1-x)] = A (2x - 1) holds to 1e-9 while
 * the layers are more than 1e-2 apart, and the layers lie on either side of 1/2 with equal
 * activities throughout (closer in, double precision no longer resolves them:
 * docs/heterogeneous.md). */
static void near_critical(void **state)
{
    (void)state;
    tally t = {0};
    char why[240];
    for (int k = 2; k <= 15; k++) {
        double A = 2.0 + pow(10.0, -k), p[2] = {A, A};
        pw_system s = make_sys(&pw_model_margules, p, 2);
        pw_lle_result r;
        pw_status st = pw_lle_solve(&s, 300.0, &r);
        if (st != PW_OK || !r.split)
            fail_msg("A - 2 = 1e-%d: status %s, split %d", k, pw_strerror(st), r.split);
        assert_true(r.x[0] < 0.5 && r.x[1] > 0.5);
        if (check_one(&s, 300.0, st, &r, &t, why, sizeof why))
            fail_msg("A - 2 = 1e-%d: %s", k, why);
        if (k <= 3)
            for (int i = 0; i < 2; i++)
                pw_assert_close(log(r.x[i] / r.x2[i]), A * (2.0 * r.x[i] - 1.0), 0.0, 1e-9,
                                "ln[x/(1-x)] = A(2x-1)");
        if (k <= 6)
            pw_assert_close(0.5 * (r.x[1] - r.x[0]), sqrt(3.0 * (A - 2.0) / 8.0), 0.01, 0.0,
                            "half-width of the split, leading order");
    }
}

/* The binodal scan and the three-phase state on extreme random models: never a failure other
 * than a refusal beyond the floor (PW_ERANGE) at a single temperature; every three-phase state
 * found has equal activities of its layers and P = a1 P1sat + a2 P2sat. Components: acetone and
 * water of Smith, Van Ness & Abbott's Table B.2 (pw_test_svna); only their vapor pressures
 * matter here. */
static void scan_and_three_phase(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 777UL);
    int n_tp = 0, n_refused = 0, n_scan_beyond = 0;
    for (int c = 0; c < 80; c++) {
        pw_system s = draw(rng, c % 4);
        s.comp[0] = pw_test_svna("acetone");
        s.comp[1] = pw_test_svna("water");
        pw_lle_scan_point pts[9];
        pw_lle_critical cr[PW_LLE_MAX_CRITICAL];
        size_t nc;
        pw_status st = pw_lle_scan(&s, 260.0, 420.0, 9, pts, cr, &nc);
        if (st != PW_OK)
            fail_msg("scan, case %d (%s %.17g %.17g %.17g): %s", c, s.model->name, s.params[0],
                     s.params[1], s.params[2], pw_strerror(st));
        for (int k = 0; k < 9; k++)
            n_scan_beyond += pts[k].beyond_floor;
        pw_three_phase tp;
        st = pw_three_phase_at_P(&s, 101325.0, &tp);
        if (st == PW_ERANGE) {
            n_refused++;
            continue;
        }
        if (st != PW_OK)
            fail_msg("three-phase, case %d (%s %.17g %.17g %.17g): %s", c, s.model->name,
                     s.params[0], s.params[1], s.params[2], pw_strerror(st));
        if (!tp.exists)
            continue;
        n_tp++;
        double a1, a2, b1, b2;
        lna(&s, tp.T_K, tp.x[0], 1.0 - tp.x[0], &a1, &a2);
        lna(&s, tp.T_K, tp.x[1], 1.0 - tp.x[1], &b1, &b2);
        pw_assert_close(exp(a1), exp(b1), 0.0, 1e-9, "three-phase a1");
        pw_assert_close(exp(a1) * tp.Psat_Pa[0] + tp.a[1] * tp.Psat_Pa[1], 101325.0, 1e-6, 0.0,
                        "P = a1 P1sat + a2 P2sat");
    }
    gsl_rng_free(rng);
    printf("# %d three-phase states, %d refused beyond the floor; %d scan points beyond it\n",
           n_tp, n_refused, n_scan_beyond);
    assert_true(n_tp > 10 && n_scan_beyond > 0);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(mek_toluene_second_minimum),
        cmocka_unit_test(randomised_extreme),
        cmocka_unit_test(near_critical),
        cmocka_unit_test(scan_and_three_phase),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
