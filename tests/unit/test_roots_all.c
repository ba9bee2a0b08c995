/* Every root of a smooth function on an interval (pw_roots1d_all, src/base/solve1d.h), the search
 * under a checked curvature bound that rating with energy balances uses to find every steady state.
 * Checked against:
 * - polynomials built from seeded random real roots (the roots are known by construction), some
 *   in close pairs, and the same polynomials' real roots from GSL's companion-matrix solver
 *   (gsl_poly_complex_solve, an independent reference library);
 * - sin(k x), whose roots are n pi / k (identity);
 * - functions undefined on part of the interval (the roots outside the hole are found, none
 *   inside it), a failing callback (its status is returned), more roots than room (PW_ERANGE),
 *   invalid arguments (PW_EINVAL). */
#include "pw_test.h"

#include "base/solve1d.h"

#include <gsl/gsl_math.h>
#include <gsl/gsl_poly.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <stdbool.h>
#include <stdlib.h>
#include <string.h>

#define MAXDEG 8

typedef struct poly {
    double root[MAXDEG];
    int n;
    double scale;
    double hole_lo, hole_hi; /* undefined on (hole_lo, hole_hi) when hole_lo < hole_hi */
    pw_status hole_status;
    long fail_after; /* > 0: PW_ENOMEM from this evaluation on */
    long calls;
} poly;

static pw_status poly_fn(void *ctx, double x, double *f)
{
    poly *p = ctx;
    if (p->fail_after > 0 && ++p->calls >= p->fail_after)
        return PW_ENOMEM;
    if (p->hole_lo < p->hole_hi && x > p->hole_lo && x < p->hole_hi)
        return p->hole_status;
    double v = p->scale;
    for (int i = 0; i < p->n; i++)
        v *= x - p->root[i];
    *f = v;
    return PW_OK;
}

static int cmp_d(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

/* The monomial coefficients of scale * prod (x - r_i), lowest degree first. */
static void poly_coeffs(const poly *p, double *c)
{
    memset(c, 0, (MAXDEG + 1) * sizeof *c);
    c[0] = p->scale;
    for (int i = 0; i < p->n; i++) {
        for (int k = i + 1; k > 0; k--)
            c[k] = c[k - 1] - p->root[i] * c[k];
        c[0] = -p->root[i] * c[0];
    }
}

/* Real roots of the polynomial in [lo, hi] from GSL's companion-matrix solver. */
static int gsl_real_roots(const poly *p, double lo, double hi, double *out)
{
    double c[MAXDEG + 1], z[2 * MAXDEG];
    poly_coeffs(p, c);
    gsl_poly_complex_workspace *w = gsl_poly_complex_workspace_alloc((size_t)p->n + 1);
    assert_non_null(w);
    assert_int_equal(gsl_poly_complex_solve(c, (size_t)p->n + 1, w, z), GSL_SUCCESS);
    gsl_poly_complex_workspace_free(w);
    int m = 0;
    for (int i = 0; i < p->n; i++)
        if (fabs(z[2 * i + 1]) < 1e-7 && z[2 * i] >= lo && z[2 * i] <= hi)
            out[m++] = z[2 * i];
    qsort(out, (size_t)m, sizeof *out, cmp_d);
    return m;
}

static void random_polynomials_match_their_construction_and_gsl(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261202);
    /* The curvature bound is one K for the whole interval, so a close pair where |f| is far below
     * its largest value needs many halvings: up to about 12,300 evaluations on these trials
     * (degree 8, two close pairs); the rating's default budget is 3,000 for its tamer mismatch. */
    pw_roots1d_opts o = pw_roots1d_default_opts();
    o.max_evals = 20000;
    int total = 0;
    for (int trial = 0; trial < 400; trial++) {
        poly p = {.n = 1 + (int)gsl_rng_uniform_int(rng, MAXDEG)};
        p.scale = gsl_rng_uniform(rng) < 0.5 ? -1.0 : 1.0;
        /* roots at least 0.05 apart, except that every third one sits 1e-3 to 1e-2 beside the
         * one before (a close pair); then scaled so that max |f| on [0, 1] is 10^U(-2, 2), well
         * above the search's stated noise */
        for (int i = 0; i < p.n; i++) {
            if (i > 0 && i % 3 == 0) {
                p.root[i] = p.root[i - 1] + (gsl_rng_uniform(rng) < 0.5 ? -1 : 1) *
                                                 (1e-3 + 9e-3 * gsl_rng_uniform(rng));
                continue;
            }
            bool apart;
            do {
                p.root[i] = gsl_rng_uniform(rng);
                apart = true;
                for (int k = 0; k < i; k++)
                    apart = apart && fabs(p.root[i] - p.root[k]) > 0.05;
            } while (!apart);
        }
        double fmax = 0.0;
        for (int k = 0; k <= 1000; k++) {
            double v = 0.0;
            poly_fn(&p, k / 1000.0, &v);
            fmax = fmax > fabs(v) ? fmax : fabs(v);
        }
        p.scale *= pow(10.0, 4.0 * gsl_rng_uniform(rng) - 2.0) / fmax;
        double want[MAXDEG];
        int nw = 0;
        for (int i = 0; i < p.n; i++)
            if (p.root[i] > 0.0 && p.root[i] < 1.0)
                want[nw++] = p.root[i];
        qsort(want, (size_t)nw, sizeof *want, cmp_d);
        /* distinct roots only: a random pair never coincides to 1e-10 */
        double got[MAXDEG + 2];
        size_t n = 0;
        unsigned long ev = 0;
        pw_status st = pw_roots1d_all(poly_fn, &p, 0.0, 1.0, &o, got, MAXDEG + 2, &n, &ev);
        assert_int_equal(st, PW_OK);
        assert_int_equal((int)n, nw);
        assert_true(ev <= o.max_evals);
        double ref[MAXDEG];
        int nr = gsl_real_roots(&p, 0.0, 1.0, ref);
        for (size_t i = 0; i < n; i++) {
            pw_assert_close(got[i], want[i], 0.0, 1e-11, "root against its construction");
            assert_int_equal(nr, nw);
            pw_assert_close(got[i], ref[i], 0.0, 1e-6, "root against gsl_poly_complex_solve");
        }
        total += nw;
    }
    assert_true(total > 1000); /* the trials did exercise many roots */
    gsl_rng_free(rng);
}

typedef struct sine {
    double k;
} sine;

static pw_status sine_fn(void *ctx, double x, double *f)
{
    *f = sin(((sine *)ctx)->k * x);
    return PW_OK;
}

static void sine_roots_are_n_pi_over_k(void **state)
{
    (void)state;
    const pw_roots1d_opts o = pw_roots1d_default_opts();
    /* up to about 8 roots per 10 scan spacings: the scan must resolve the curvature (solve1d.h) */
    for (double k = 0.5; k <= 4.0; k *= 1.3) {
        sine s = {k};
        const double lo = 0.1, hi = 10.0;
        double got[512];
        size_t n = 0;
        assert_int_equal(pw_roots1d_all(sine_fn, &s, lo, hi, &o, got, 512, &n, NULL), PW_OK);
        int first = (int)ceil(lo * k / M_PI), last = (int)floor(hi * k / M_PI);
        assert_int_equal((int)n, last - first + 1);
        for (size_t i = 0; i < n; i++)
            pw_assert_close(got[i], (first + (int)i) * M_PI / k, 1e-12, 1e-14, "n pi / k");
    }
}

static void hole_in_the_domain(void **state)
{
    (void)state;
    const pw_roots1d_opts o = pw_roots1d_default_opts();
    const pw_status outside[] = {PW_EDOM, PW_EINFEASIBLE, PW_ENOBRACKET};
    for (size_t s = 0; s < sizeof outside / sizeof outside[0]; s++) {
        /* roots 0.1, 0.45 (inside the hole), 0.8; undefined on (0.3, 0.6) */
        poly p = {.n = 3, .scale = 1.0, .root = {0.1, 0.45, 0.8}, .hole_lo = 0.3,
                  .hole_hi = 0.6, .hole_status = outside[s]};
        double got[4];
        size_t n = 0;
        assert_int_equal(pw_roots1d_all(poly_fn, &p, 0.0, 1.0, &o, got, 4, &n, NULL), PW_OK);
        assert_int_equal((int)n, 2);
        pw_assert_close(got[0], 0.1, 0.0, 1e-12, "root left of the hole");
        pw_assert_close(got[1], 0.8, 0.0, 1e-12, "root right of the hole");
    }
    /* nowhere defined: no roots, no error */
    poly none = {.n = 1, .scale = 1.0, .root = {0.5}, .hole_lo = -1.0, .hole_hi = 2.0,
                 .hole_status = PW_EDOM};
    double g[2];
    size_t n = 9;
    assert_int_equal(pw_roots1d_all(poly_fn, &none, 0.0, 1.0, &o, g, 2, &n, NULL), PW_OK);
    assert_int_equal((int)n, 0);
}

static void close_pair_beside_a_minimum(void **state)
{
    (void)state;
    /* (x - 0.5)^2 - d^2: two roots 0.5 -+ d, the curve barely crossing zero between them */
    const pw_roots1d_opts o = pw_roots1d_default_opts();
    for (double d = 1e-2; d >= 1e-5; d /= 10.0) {
        poly p = {.n = 2, .scale = 1.0, .root = {0.5 - d, 0.5 + d}};
        double got[4];
        size_t n = 0;
        assert_int_equal(pw_roots1d_all(poly_fn, &p, 0.0, 1.0, &o, got, 4, &n, NULL), PW_OK);
        assert_int_equal((int)n, 2);
        pw_assert_close(got[0], 0.5 - d, 0.0, 1e-12, "lower of the pair");
        pw_assert_close(got[1], 0.5 + d, 0.0, 1e-12, "upper of the pair");
    }
}

static void failures_are_statuses(void **state)
{
    (void)state;
    const pw_roots1d_opts o = pw_roots1d_default_opts();
    double got[3];
    size_t n = 0;
    poly p = {.n = 3, .scale = 1.0, .root = {0.2, 0.5, 0.7}};
    /* more roots than room: the first found are kept, PW_ERANGE */
    assert_int_equal(pw_roots1d_all(poly_fn, &p, 0.0, 1.0, &o, got, 2, &n, NULL), PW_ERANGE);
    assert_int_equal((int)n, 2);
    /* a failing callback stops the search with its status, whichever evaluation fails */
    poly count = p;
    count.fail_after = 1000000;
    assert_int_equal(pw_roots1d_all(poly_fn, &count, 0.0, 1.0, &o, got, 3, &n, NULL), PW_OK);
    assert_true(count.calls > 48);
    for (long after = 1; after <= count.calls; after++) {
        poly q = p;
        q.fail_after = after;
        assert_int_equal(pw_roots1d_all(poly_fn, &q, 0.0, 1.0, &o, got, 2, &n, NULL), PW_ENOMEM);
    }
    /* an evaluation budget too small for the scan */
    pw_roots1d_opts tight = o;
    tight.max_evals = 10;
    assert_int_equal(pw_roots1d_all(poly_fn, &p, 0.0, 1.0, &tight, got, 2, &n, NULL), PW_ENOCONV);
    /* invalid arguments */
    assert_int_equal(pw_roots1d_all(poly_fn, &p, 1.0, 0.0, &o, got, 2, &n, NULL), PW_EINVAL);
    assert_int_equal(pw_roots1d_all(poly_fn, &p, 0.0, NAN, &o, got, 2, &n, NULL), PW_EINVAL);
    assert_int_equal(pw_roots1d_all(NULL, &p, 0.0, 1.0, &o, got, 2, &n, NULL), PW_EINVAL);
    pw_roots1d_opts bad = o;
    bad.scan = 2;
    assert_int_equal(pw_roots1d_all(poly_fn, &p, 0.0, 1.0, &bad, got, 2, &n, NULL), PW_EINVAL);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(random_polynomials_match_their_construction_and_gsl),
        cmocka_unit_test(sine_roots_are_n_pi_over_k),
        cmocka_unit_test(hole_in_the_domain),
        cmocka_unit_test(close_pair_beside_a_minimum),
        cmocka_unit_test(failures_are_statuses),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
