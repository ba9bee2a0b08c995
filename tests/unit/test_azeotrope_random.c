/* The azeotrope search (src/analysis/azeotrope.c) against independent computations on seeded
 * random systems: it must find every root and every near-tangential point whatever the table.
 *
 *   - Two-parameter Margules with constant vapor pressures at fixed T: ln alpha12 is the quadratic
 *     A12 + 2 (A21 - 2 A12) x + 3 (A12 - A21) x^2 + ln(P1/P2) (identity, expanded from
 *     ln gamma1 = x2^2 [A12 + 2 (A21 - A12) x1], ln gamma2 = x1^2 [A21 + 2 (A12 - A21) x2]),
 *     whose roots GSL's gsl_poly_solve_quadratic gives in closed form. Among the draws: pairs of
 *     roots 2e-5 .. 2e-2 apart (far inside one cell of the search's table) and near-touching
 *     minima of |ln alpha| between 1e-9 and 5e-4 that must come out as near-tangential points.
 *   - NRTL with random parameters, at fixed T (constant vapor pressures) and at 1 atm (the
 *     1-propanol/water Antoine rows of SVNA Table B.2, METHODS 2.5): roots against a dense
 *     20,001-point scan of pw_azeotrope_ln_alpha with bisection written here. */
#include "pw_test.h"

#include <gsl/gsl_poly.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/azeotrope.h>
#include <string.h>

#define X_EDGE 1e-6

static pw_component antoine(const char *name, double A, double B, double C, const char *T_unit)
{
    return pw_test_antoine(name, A, B, C, PW_LN, "kPa", T_unit, NAN, NAN);
}

static pw_system const_psat(const pw_model_type *m, double P1_kPa, double P2_kPa)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = antoine("one", log(P1_kPa), 0.0, 0.0, "K");
    s.comp[1] = antoine("two", log(P2_kPa), 0.0, 0.0, "K");
    s.model = m;
    s.T_ref_K = 350.0;
    return s;
}

/* Margules ln alpha12 = c0 + c1 x + c2 x^2 at fixed T with constant vapor pressures. */
static void margules_coef(double A12, double A21, double lnr, double c[3])
{
    c[0] = A12 + lnr;
    c[1] = 2.0 * (A21 - 2.0 * A12);
    c[2] = 3.0 * (A12 - A21);
}

static void margules_random(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261202UL);
    size_t n_roots = 0, n_pairs = 0, n_touch = 0;
    for (int t = 0; t < 600; t++) {
        double A12 = -3.0 + 6.0 * gsl_rng_uniform(rng);
        double A21 = -3.0 + 6.0 * gsl_rng_uniform(rng);
        double lnr = -1.5 + 3.0 * gsl_rng_uniform(rng);
        double c[3];
        margules_coef(A12, A21, 0.0, c);
        const int kind = t % 3; /* 0: plain draw; 1: a close pair; 2: a near touch */
        double v = NAN, delta = NAN, depth = NAN;
        if (kind != 0 && fabs(c[2]) > 0.2) {
            v = -c[1] / (2.0 * c[2]); /* the vertex of the quadratic */
            if (!(v > 0.05 && v < 0.95))
                continue;
            double pv = c[0] + c[1] * v + c[2] * v * v; /* value at the vertex without ln r */
            if (kind == 1) {
                delta = pow(10.0, -4.7 + 2.7 * gsl_rng_uniform(rng)); /* half the separation */
                lnr = -c[2] * delta * delta - pv; /* roots at v +/- delta */
            } else {
                depth = pow(10.0, -9.0 + 5.7 * gsl_rng_uniform(rng));
                lnr = (c[2] > 0.0 ? depth : -depth) - pv; /* |ln alpha| >= depth, min at v */
            }
        } else if (kind != 0) {
            continue;
        }
        margules_coef(A12, A21, lnr, c);
        pw_system s = const_psat(&pw_model_margules, 100.0 * exp(lnr), 100.0);
        s.params[0] = A12;
        s.params[1] = A21;
        pw_az_result r;
        assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, NULL, &r), PW_OK);
        double x0, x1;
        int nq = gsl_poly_solve_quadratic(c[2], c[1], c[0], &x0, &x1);
        double xs[2] = {x0, x1};
        size_t want = 0;
        double expect[2];
        for (int k = 0; k < nq; k++)
            if (xs[k] > X_EDGE + 1e-7 && xs[k] < 1.0 - X_EDGE - 1e-7 &&
                (want == 0 || xs[k] != expect[0]))
                expect[want++] = xs[k];
        if (kind == 1) {
            assert_int_equal(want, 2);
            n_pairs++;
        }
        if (r.n != want)
            fail_msg("draw %d: A12 %.17g A21 %.17g ln r %.17g: %zu roots, closed form %zu", t,
                     A12, A21, lnr, r.n, want);
        for (size_t k = 0; k < want; k++) {
            /* root precision: ln alpha noise over the slope at the root */
            double slope = fabs(c[1] + 2.0 * c[2] * expect[k]);
            pw_assert_close(r.az[k].x1, expect[k], 1e-10 + 1e-13 / slope, 0.0, "root");
        }
        n_roots += want;
        if (kind == 2) {
            assert_int_equal(r.n, 0);
            if (depth < 1e-3) {
                assert_int_equal(r.n_touch, 1);
                pw_assert_close(r.touch[0].x1, v, 1e-5, 0.0, "touch position");
                pw_assert_close(fabs(r.touch[0].ln_alpha), depth, 1e-12, 1e-9, "touch depth");
                n_touch++;
            }
        }
    }
    gsl_rng_free(rng);
    /* the draws really exercised what they are meant to */
    assert_true(n_roots > 300);
    assert_true(n_pairs > 50);
    assert_true(n_touch > 40);
}

/* Roots of ln alpha12 by a dense scan and bisection; returns the count, -1 when the scan meets
 * a minimum of |ln alpha| too shallow to decide (a pair closer than the scan could hide). */
static int dense_roots(const pw_system *s, pw_az_mode mode, double fixed, double *roots, int max)
{
    const int n = 20001;
    const double span = 1.0 - 2.0 * X_EDGE;
    double xp = X_EDGE, fp, fpp = NAN;
    pw_eq_point eq;
    assert_int_equal(pw_azeotrope_ln_alpha(s, mode, fixed, xp, &fp, &eq), PW_OK);
    int count = 0;
    for (int i = 1; i < n; i++) {
        double x = i + 1 == n ? 1.0 - X_EDGE : X_EDGE + span * i / (n - 1.0), f;
        assert_int_equal(pw_azeotrope_ln_alpha(s, mode, fixed, x, &f, &eq), PW_OK);
        if ((f > 0.0) != (fp > 0.0)) {
            double a = xp, b = x, fa = fp;
            for (int k = 0; k < 100 && b - a > 1e-15; k++) {
                double m = 0.5 * (a + b), fm;
                assert_int_equal(pw_azeotrope_ln_alpha(s, mode, fixed, m, &fm, &eq), PW_OK);
                if ((fm > 0.0) == (fa > 0.0)) {
                    a = m;
                    fa = fm;
                } else {
                    b = m;
                }
            }
            if (count >= max)
                return -1;
            roots[count++] = 0.5 * (a + b);
        } else if (isfinite(fpp) && fabs(fp) < fabs(fpp) && fabs(fp) < fabs(f) &&
                   fabs(fp) < 1e-5) {
            return -1;
        }
        fpp = fp;
        xp = x;
        fp = f;
    }
    return count;
}

static void nrtl_random(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 4242UL);
    int compared = 0, with_roots = 0;
    for (int t = 0; t < 48; t++) {
        const bool isobaric = t % 2 == 1;
        pw_system s;
        if (isobaric) { /* SVNA Table B.2 rows (METHODS 2.5) */
            memset(&s, 0, sizeof s);
            s.comp[0] = antoine("1-propanol", 16.1154, 3483.67, 205.807, "C");
            s.comp[1] = antoine("water", 16.3872, 3885.70, 230.170, "C");
            s.model = &pw_model_nrtl;
            s.T_ref_K = 360.0;
        } else {
            s = const_psat(&pw_model_nrtl, 100.0 * exp(-1.0 + 2.0 * gsl_rng_uniform(rng)), 100.0);
        }
        s.params[0] = -300.0 + 1300.0 * gsl_rng_uniform(rng);
        s.params[1] = -300.0 + 1300.0 * gsl_rng_uniform(rng);
        s.params[2] = 0.1 + 0.4 * gsl_rng_uniform(rng);
        const pw_az_mode mode = isobaric ? PW_AZ_ISOBARIC : PW_AZ_ISOTHERMAL;
        const double fixed = isobaric ? 101325.0 : 350.0;
        pw_az_result r;
        pw_status st = pw_azeotrope_find(&s, mode, fixed, NULL, &r);
        if (st != PW_OK)
            continue; /* e.g. a bubble point that does not exist at these parameters */
        double roots[PW_AZ_MAX];
        int n = dense_roots(&s, mode, fixed, roots, PW_AZ_MAX);
        if (n < 0)
            continue;
        if ((size_t)n != r.n)
            fail_msg("draw %d: %zu roots, dense scan %d (dg12 %.17g dg21 %.17g alpha %.17g)", t,
                     r.n, n, s.params[0], s.params[1], s.params[2]);
        for (int k = 0; k < n; k++)
            pw_assert_close(r.az[k].x1, roots[k], 1e-9, 0.0, "root against the dense scan");
        compared++;
        with_roots += n > 0;
    }
    gsl_rng_free(rng);
    assert_true(compared >= 40);
    assert_true(with_roots >= 10);
}

/* A skipped interval (pw_az_options.skip_x1, the three-phase layers in pw_azeotrope_search):
 * random Margules at fixed T as above, a random interval [a, b], some of them with a root just
 * outside an end (1e-9 .. 1e-3 away) or inside: the search must return exactly the closed-form
 * roots outside [a, b], each part searched with the same guarantee as the whole range. */
static void margules_skip_random(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261203UL);
    size_t n_kept = 0, n_skipped = 0, n_close = 0, n_kind = 0, n_kind_close = 0;
    for (int t = 0; t < 600; t++) {
        double A12 = -3.0 + 6.0 * gsl_rng_uniform(rng);
        double A21 = -3.0 + 6.0 * gsl_rng_uniform(rng);
        double lnr = -1.5 + 3.0 * gsl_rng_uniform(rng);
        double c[3];
        margules_coef(A12, A21, lnr, c);
        double x0, x1;
        int nq = gsl_poly_solve_quadratic(c[2], c[1], c[0], &x0, &x1);
        double xs[2] = {x0, x1};
        double a = 0.9 * gsl_rng_uniform(rng), b = a + (0.999 - a) * gsl_rng_uniform(rng);
        if (t % 3 == 1 && nq > 0 && xs[0] > 0.01 && xs[0] < 0.99) { /* an end beside a root */
            double d = pow(10.0, -9.0 + 6.0 * gsl_rng_uniform(rng));
            if (gsl_rng_uniform(rng) < 0.5) {
                a = xs[0] + d; /* the root just left of the interval */
                b = fmin(a + 0.5, 0.999);
            } else {
                b = xs[0] - d; /* just right of it */
                a = fmax(b - 0.5, 0.001);
            }
            n_close++;
        }
        if (!(a < b))
            continue;
        pw_system s = const_psat(&pw_model_margules, 100.0 * exp(lnr), 100.0);
        s.params[0] = A12;
        s.params[1] = A21;
        pw_az_options o = pw_azeotrope_default_options();
        o.skip_x1[0] = a;
        o.skip_x1[1] = b;
        pw_az_result r;
        assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, &o, &r), PW_OK);
        size_t want = 0;
        double expect[2];
        for (int k = 0; k < nq; k++) {
            if (!(xs[k] > X_EDGE + 1e-7 && xs[k] < 1.0 - X_EDGE - 1e-7) ||
                (want > 0 && xs[k] == expect[0]))
                continue;
            if (xs[k] > a && xs[k] < b) {
                n_skipped++;
                continue;
            }
            expect[want++] = xs[k];
        }
        if (r.n != want)
            fail_msg("draw %d: A12 %.17g A21 %.17g ln r %.17g, skip [%.17g, %.17g]: %zu roots, "
                     "closed form %zu", t, A12, A21, lnr, a, b, r.n, want);
        for (size_t k = 0; k < want; k++) {
            double slope = fabs(c[1] + 2.0 * c[2] * expect[k]);
            pw_assert_close(r.az[k].x1, expect[k], 1e-10 + 1e-13 / slope, 0.0, "root");
            assert_false(r.az[k].x1 > a && r.az[k].x1 < b);
            /* the kind, from the sign of d ln alpha12/dx1 (Gibbs-Konovalov), also where the
             * classification's probes had to stay short of the interval, */
            double d_skip = fmin(fabs(expect[k] - a), fabs(expect[k] - b));
            /* only for a stable liquid: inside the spinodal d ln a1/dx1 < 0 reverses the rule.
             * Stability of one liquid: 1/(x1 x2) + d2(G^E/RT)/dx1^2 > 0, with
             * G^E/RT = x1 x2 (A12 + (A21 - A12) x1) for this Margules form. */
            const double xk = expect[k], Bm = A21 - A12;
            const double stab = 1.0 / (xk * (1.0 - xk)) + 2.0 * Bm - 2.0 * A12 - 6.0 * Bm * xk;
            if (slope > 1e-3 && stab > 0.1) {
                pw_az_kind want_kind = c[1] + 2.0 * c[2] * expect[k] < 0.0
                                           ? PW_AZ_MINIMUM_BOILING
                                           : PW_AZ_MAXIMUM_BOILING;
                /* a simple root, not a double one, however close the interval */
                if (r.az[k].tangential)
                    fail_msg("draw %d: simple root %.17g flagged tangential (skip [%.17g, "
                             "%.17g], d %.3g, slope %g)", t, expect[k], a, b, d_skip,
                             c[1] + 2.0 * c[2] * expect[k]);
                if (r.az[k].kind != want_kind)
                    fail_msg("draw %d: root %.17g (skip [%.17g, %.17g], d %.3g): kind %d, want %d "
                             "(slope %g, tangential %d)", t, expect[k], a, b, d_skip,
                             (int)r.az[k].kind, (int)want_kind, c[1] + 2.0 * c[2] * expect[k],
                             (int)r.az[k].tangential);
                n_kind += d_skip < 1e-3;
                n_kind_close += d_skip < 1e-6;
            }
        }
        n_kept += want;
    }
    gsl_rng_free(rng);
    assert_true(n_kept > 150);
    assert_true(n_skipped > 50);
    assert_true(n_close > 100);
    assert_true(n_kind > 20); /* kinds checked on roots within 1e-3 of the interval */
    assert_true(n_kind_close > 5); /* ... and within 1e-6 */
}

/* A part of the table squeezed beside the interval (layers down to 1e-12 are accepted): the
 * search stays cheap and exact, the sliver part being one cell. */
static void sliver_part(void **state)
{
    (void)state;
    pw_system s = const_psat(&pw_model_margules, 100.0 * exp(0.4), 100.0);
    s.params[0] = 1.2; /* ln alpha12 = 1.6 - 1.2 x - 1.8 x^2: one root in (0, 1), 0.667 */
    s.params[1] = 1.8;
    double c[3];
    margules_coef(1.2, 1.8, 0.4, c);
    double x0, x1;
    assert_int_equal(gsl_poly_solve_quadratic(c[2], c[1], c[0], &x0, &x1), 2);
    const double root = x0 > 0.0 && x0 < 1.0 ? x0 : x1;
    for (int e = 9; e <= 15; e++) {
        for (int side = 0; side < 2; side++) {
            pw_az_options o = pw_azeotrope_default_options();
            double d = pow(10.0, -e);
            if (side == 0) { /* a sliver left of the interval */
                o.skip_x1[0] = X_EDGE + d;
                o.skip_x1[1] = 0.05;
            } else { /* and right of it */
                o.skip_x1[0] = 0.95;
                o.skip_x1[1] = 1.0 - X_EDGE - d;
            }
            pw_az_result r;
            assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, &o, &r), PW_OK);
            assert_int_equal(r.n, 1);
            pw_assert_close(r.az[0].x1, root, 1e-10, 0.0, "root beside a sliver");
            if (r.n_evals > 400)
                fail_msg("sliver 1e-%d on side %d: %zu evaluations", e, side, r.n_evals);
        }
    }
}

/* Bad skip intervals are refused. */
static void skip_options_checked(void **state)
{
    (void)state;
    pw_system s = const_psat(&pw_model_margules, 100.0, 100.0);
    s.params[0] = s.params[1] = 1.0;
    const double bad[][2] = {{0.5, 0.4}, {0.3, 0.3}, {-0.1, 0.5}, {0.5, 1.1}, {NAN, 0.5}};
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        pw_az_options o = pw_azeotrope_default_options();
        o.skip_x1[0] = bad[i][0];
        o.skip_x1[1] = bad[i][1];
        pw_az_result r;
        assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, &o, &r), PW_EINVAL);
    }
    /* the whole range skipped: nothing searched, no root, the ends still evaluated */
    pw_az_options o = pw_azeotrope_default_options();
    o.skip_x1[0] = 0.0;
    o.skip_x1[1] = 1.0;
    pw_az_result r;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 350.0, &o, &r), PW_OK);
    assert_int_equal(r.n, 0);
    assert_true(isfinite(r.ln_alpha_end[0]) && isfinite(r.ln_alpha_end[1]));
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(margules_random),
        cmocka_unit_test(margules_skip_random),
        cmocka_unit_test(skip_options_checked),
        cmocka_unit_test(sliver_part),
        cmocka_unit_test(nrtl_random),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
