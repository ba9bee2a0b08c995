/* The area test across a two-liquid gap (docs/consistency.md, "Across a two-liquid gap").
 *
 * Identity: at constant T (and P), d(G^E/RT)/dx1 = ln(gamma1/gamma2), so the integral of
 * ln(gamma1/gamma2) over [0, 1] is g(1) - g(0) = 0, and over the gap [x_a, x_b] it is
 * g(x_b) - g(x_a) with g = x1 ln gamma1 + x2 ln gamma2. Noise-free isothermal P-x-y data of a
 * liquid that splits are therefore balanced (D = 0 up to the smoothing of each branch) once the
 * gap is bridged by that step, whatever the one-liquid function does inside the gap, which no
 * point measures.
 *
 * The data: NRTL (Renon & Prausnitz 1968, alpha 0.3, written out in pw_test.c, independent of
 * src/thermo) whose two parameters are solved (GSL hybrid solver) so that chosen layers x_I,
 * x_II coexist at 330 K; one-liquid points outside the layers, three-phase points (the layers'
 * pressure and vapor) inside. Vapor pressures: the Antoine rows of 1-propanol and water of
 * Smith, Van Ness & Abbott 7th ed. Table B.2 (pw_test_svna). INVENTED round-trip data, seeded. */
#include "pw_test.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/hetcheck.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define ALPHA 0.3
#define T_K 330.0

typedef struct {
    double x_I, x_II;
} layers;

static void nrtl(const double tau[2], double x1, double lg[2])
{
    pw_test_nrtl_ln_gamma(tau[0], tau[1], ALPHA, x1, lg);
}

/* tau12, tau21 with x_I and x_II coexisting (pw_test.c). */
static void tau_from_layers(const layers *l, double tau[2])
{
    pw_test_nrtl_tau_from_layers(l->x_I, l->x_II, ALPHA, tau);
}

typedef struct gapset {
    pw_dataset ds;
    pw_component c[2];
    double tau[2];
    double x_a, x_b; /* the one-liquid points beside the gap */
} gapset;

/* P and y1 of a liquid x1 in one phase (modified Raoult's law). */
static void bubble(const gapset *g, double x1, double *P, double *y1)
{
    double lg[2], Ps[2];
    nrtl(g->tau, x1, lg);
    for (int k = 0; k < 2; k++)
        assert_int_equal(pw_psat(&g->c[k], T_K, &Ps[k], NULL), PW_OK);
    double p1 = x1 * exp(lg[0]) * Ps[0], p2 = (1.0 - x1) * exp(lg[1]) * Ps[1];
    *P = p1 + p2;
    *y1 = p1 / *P;
}

/* The bubble temperature of x1 at P (isobaric data), by bisection to 1e-12 K. */
static double bubble_T(const gapset *g, double x1, double P, double *y1);

/* n_lo points on (0, x_I), n_hi on (x_II, 1), n_gap three-phase points inside, pure rows;
 * isothermal at T_K, or isobaric at 101.325 kPa. ln gamma does not depend on T (H^E = 0), so
 * the isobaric data obey the constant-T identity exactly too. */
static void make_kind(gapset *g, const layers *l, size_t n_lo, size_t n_hi, size_t n_gap,
                      bool isobaric);

static void make(gapset *g, const layers *l, size_t n_lo, size_t n_hi, size_t n_gap)
{
    make_kind(g, l, n_lo, n_hi, n_gap, false);
}

static void make_kind(gapset *g, const layers *l, size_t n_lo, size_t n_hi, size_t n_gap,
                      bool isobaric)
{
    memset(g, 0, sizeof *g);
    g->c[0] = pw_test_svna("1-propanol");
    g->c[1] = pw_test_svna("water");
    tau_from_layers(l, g->tau);
    pw_dataset *ds = &g->ds;
    snprintf(ds->path, sizeof ds->path, "invented-gap.csv");
    snprintf(ds->names[0], PW_NAME_MAX, "1-propanol");
    snprintf(ds->names[1], PW_NAME_MAX, "water");
    ds->kind = isobaric ? PW_DATA_ISOBARIC : PW_DATA_ISOTHERMAL;
    ds->has_y = true;
    ds->T_fixed_K = isobaric ? NAN : T_K;
    ds->P_fixed_Pa = isobaric ? 101325.0 : NAN;
    ds->sigma_T_K = 0.1;
    ds->sigma_P_rel = 1e-4; /* noise-free data: the detection's floors (0.01 %, 0.002) */
    ds->sigma_P_abs_Pa = NAN;
    ds->sigma_y = 0.002;
    ds->sigma_x = 0.001;
    ds->n = n_lo + n_hi + n_gap + 2;
    ds->pts = calloc(ds->n, sizeof *ds->pts);
    assert_non_null(ds->pts);
    size_t k = 0;
    /* one row: isothermal (T_K, bubble P) or isobaric (bubble T, 101.325 kPa) */
#define ROW(xv, line)                                                                          \
    do {                                                                                       \
        double P_, y_, T_ = T_K;                                                               \
        if (isobaric) {                                                                        \
            T_ = bubble_T(g, (xv), 101325.0, &y_);                                             \
            P_ = 101325.0;                                                                     \
        } else {                                                                               \
            bubble(g, (xv), &P_, &y_);                                                         \
        }                                                                                      \
        ds->pts[k++] = (pw_point){(xv), (xv) == 0.0 || (xv) == 1.0 ? (xv) : y_, T_, P_, (line)}; \
    } while (0)
    ROW(0.0, 6);
    for (size_t i = 0; i < n_lo; i++) { /* up to 0.9 x_I, geometric: dilute points as measured */
        double f = n_lo > 1 ? (double)(n_lo - 1 - i) / (double)(n_lo - 1) : 0.5;
        double x = l->x_I * 0.9 * pow(0.05, f);
        ROW(x, (long)k + 7);
        g->x_a = x;
    }
    /* the three-phase state: both layers boil at it with one vapor */
    double P3 = 101325.0, y3, T3 = T_K;
    if (isobaric)
        T3 = bubble_T(g, l->x_I, 101325.0, &y3);
    else
        bubble(g, l->x_I, &P3, &y3);
    for (size_t i = 0; i < n_gap; i++) {
        double x = l->x_I + (l->x_II - l->x_I) * (double)(i + 1) / (double)(n_gap + 1);
        ds->pts[k++] = (pw_point){x, y3, T3, P3, (long)k + 7};
    }
    for (size_t i = 0; i < n_hi; i++) {
        double f = n_hi > 1 ? (double)i / (double)(n_hi - 1) : 0.5;
        double x = l->x_II + (0.98 - l->x_II) * (0.1 + 0.9 * f);
        ROW(x, (long)k + 7);
        if (i == 0)
            g->x_b = x;
    }
    ROW(1.0, (long)k + 7);
#undef ROW
    assert_int_equal(k, ds->n);
}

static double bubble_T(const gapset *g, double x1, double P, double *y1)
{
    double lg[2];
    nrtl(g->tau, x1, lg);
    double lo = 250.0, hi = 450.0, Ps[2];
    for (int it = 0; it < 200 && hi - lo > 1e-12; it++) {
        double mid = 0.5 * (lo + hi);
        for (int c = 0; c < 2; c++)
            assert_int_equal(pw_psat(&g->c[c], mid, &Ps[c], NULL), PW_OK);
        if (x1 * exp(lg[0]) * Ps[0] + (1.0 - x1) * exp(lg[1]) * Ps[1] > P)
            hi = mid;
        else
            lo = mid;
    }
    double T = 0.5 * (lo + hi);
    for (int c = 0; c < 2; c++)
        assert_int_equal(pw_psat(&g->c[c], T, &Ps[c], NULL), PW_OK);
    *y1 = x1 * exp(lg[0]) * Ps[0] / P;
    return T;
}

static double g_of(const gapset *g, double x)
{
    double lg[2];
    nrtl(g->tau, x, lg);
    return x * lg[0] + (1.0 - x) * lg[1];
}

/* pw_check_data: the three-phase points found and left out, the gap bridged at the points
 * beside it by the exact step of G^E/RT, and the areas balanced. */
static pw_consistency_result checked(const gapset *g, size_t n_gap)
{
    pw_het_check het;
    pw_consistency_result r;
    pw_error err;
    if (pw_check_data(&g->ds, &g->c[0], &g->c[1], NULL, &het, &r, &err) != PW_OK)
        fail_msg("pw_check_data: %s", err.msg);
    assert_int_equal(het.n, n_gap);
    pw_het_check_free(&het, NULL);
    return r;
}

static void one_case_bridged(const gapset *g, size_t n_gap, double D_max)
{
    pw_consistency_result r = checked(g, n_gap);
    const pw_ctest *t = &r.tests[PW_CTEST_AREA];
    assert_true(t->ran);
    assert_true(isfinite(r.gap_bridge));
    pw_assert_close(r.gap_bridge_x1[0], g->x_a, 0.0, 0.0, "x_a");
    pw_assert_close(r.gap_bridge_x1[1], g->x_b, 0.0, 0.0, "x_b");
    pw_assert_close(r.gap_bridge, g_of(g, g->x_b) - g_of(g, g->x_a), 1e-9, 1e-9, "G^E/RT step");
    if (!(t->value < D_max))
        fail_msg("layers D = %g %% (limit %g): bridged areas %g / %g", t->value, D_max, r.area_A,
                 r.area_B);
    assert_true(t->pass);
    pw_consistency_result_free(&r);
}

/* The butanol-like gap of the prototype: bridged D below 0.01 %; the single polynomial over
 * both branches (the one-liquid points alone, no gap given) misreads the gap it never saw by
 * several per cent (3.5 % in the design check of this test, computed). */
static void bridged_against_single_polynomial(void **state)
{
    (void)state;
    layers l = {0.017, 0.53};
    gapset g;
    make(&g, &l, 8, 10, 5);
    one_case_bridged(&g, 5, 0.01);
    /* the same one-liquid points without the gap: one polynomial across */
    pw_het_check het;
    pw_dataset one;
    assert_int_equal(pw_het_check_run(&g.ds, &g.c[0], &g.c[1], &one, &het), PW_OK);
    pw_consistency_options o = pw_consistency_default_options();
    pw_consistency_result r;
    pw_error err;
    assert_int_equal(pw_consistency_run(&one, &g.c[0], &g.c[1], &o, &r, &err), PW_OK);
    assert_true(r.tests[PW_CTEST_AREA].ran);
    assert_false(isfinite(r.gap_bridge));
    assert_int_equal(r.area_degree_upper, -1);
    if (!(r.tests[PW_CTEST_AREA].value > 1.0))
        fail_msg("single polynomial D = %g %%: expected a visible imbalance",
                 r.tests[PW_CTEST_AREA].value);
    pw_consistency_result_free(&r);
    pw_het_check_free(&het, &one);
    pw_dataset_free(&g.ds);
}

/* Seeded random gaps and point counts (branches of 5 to 12 points, 3 to 6 three-phase
 * points): the bridge is always the exact step, and D stays at the smoothing level. */
static void random_gaps(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261203UL);
    for (int c = 0; c < 40; c++) {
        layers l = {0.005 + 0.09 * gsl_rng_uniform(rng), 0.40 + 0.45 * gsl_rng_uniform(rng)};
        size_t n_lo = 5 + gsl_rng_uniform_int(rng, 8), n_hi = 5 + gsl_rng_uniform_int(rng, 8);
        size_t n_gap = 3 + gsl_rng_uniform_int(rng, 4); /* a plateau: at least 3 points */
        gapset g;
        make(&g, &l, n_lo, n_hi, n_gap);
        one_case_bridged(&g, n_gap, 0.05);
        pw_dataset_free(&g.ds);
    }
    gsl_rng_free(rng);
}

/* A one-liquid point inside the gap's x range (a three-phase run split in two by it) leaves
 * the gap unbridged: one polynomial, as before. */
static void point_inside_gap_not_bridged(void **state)
{
    (void)state;
    layers l = {0.02, 0.6};
    gapset g;
    make(&g, &l, 6, 6, 3);
    pw_consistency_options o = pw_consistency_default_options();
    o.gap_x1[0] = 0.01; /* reaches below x_a: a one-liquid point lies inside */
    o.gap_x1[1] = 0.59;
    pw_het_check het;
    pw_dataset one;
    assert_int_equal(pw_het_check_run(&g.ds, &g.c[0], &g.c[1], &one, &het), PW_OK);
    pw_consistency_result r;
    pw_error err;
    assert_int_equal(pw_consistency_run(&one, &g.c[0], &g.c[1], &o, &r, &err), PW_OK);
    assert_false(isfinite(r.gap_bridge));
    assert_true(r.area_degree >= 3);
    pw_consistency_result_free(&r);
    pw_het_check_free(&het, &one);
    pw_dataset_free(&g.ds);
}

/* Isobaric noise-free data (ln gamma independent of T, H^E = 0): Herington's D is at the
 * smoothing level once the gap is bridged, and the step is exact. */
static void isobaric_bridged(void **state)
{
    (void)state;
    layers l = {0.03, 0.6};
    gapset g;
    make_kind(&g, &l, 8, 10, 4, true);
    pw_het_check het;
    pw_consistency_result r;
    pw_error err;
    if (pw_check_data(&g.ds, &g.c[0], &g.c[1], NULL, &het, &r, &err) != PW_OK)
        fail_msg("pw_check_data: %s", err.msg);
    assert_int_equal(het.n, 4);
    pw_het_check_free(&het, NULL);
    assert_true(r.tests[PW_CTEST_HERINGTON].ran);
    pw_assert_close(r.gap_bridge, g_of(&g, g.x_b) - g_of(&g, g.x_a), 1e-9, 1e-9, "step");
    if (!(r.herington_D < 0.01))
        fail_msg("isobaric bridged D = %g %%", r.herington_D);
    pw_consistency_result_free(&r);
    pw_dataset_free(&g.ds);
}

/* Short branches (1 to 4 points: an interpolating polynomial, a constant for one point, as
 * both shipped partly miscible sets need) and a branch with two points at one x: the bridge
 * is still the exact step, the degrees are n - 1, and the test runs. With so few points the
 * smoothing itself is rough, so only D's being finite is asked. */
static void short_branches(void **state)
{
    (void)state;
    layers l = {0.04, 0.55};
    for (size_t n_lo = 1; n_lo <= 4; n_lo++)
        for (size_t n_hi = 1; n_hi <= 4; n_hi++) {
            if (n_lo + n_hi < 5) /* the area test needs 5 points in all */
                continue;
            gapset g;
            make(&g, &l, n_lo, n_hi, 3);
            pw_consistency_result r = checked(&g, 3);
            assert_true(r.tests[PW_CTEST_AREA].ran);
            assert_true(isfinite(r.tests[PW_CTEST_AREA].value));
            assert_int_equal(r.area_degree, (int)n_lo - 1);
            assert_int_equal(r.area_degree_upper, (int)n_hi - 1);
            pw_assert_close(r.gap_bridge, g_of(&g, g.x_b) - g_of(&g, g.x_a), 1e-9, 1e-9,
                            "step");
            pw_consistency_result_free(&r);
            pw_dataset_free(&g.ds);
        }
    /* two points of the upper branch at one x (a repeated measurement) */
    gapset g;
    make(&g, &l, 6, 3, 3);
    g.ds.pts[g.ds.n - 2].x1 = g.ds.pts[g.ds.n - 3].x1;
    g.ds.pts[g.ds.n - 2].y1 = g.ds.pts[g.ds.n - 3].y1;
    g.ds.pts[g.ds.n - 2].P_Pa = g.ds.pts[g.ds.n - 3].P_Pa;
    pw_consistency_result r = checked(&g, 3);
    assert_true(r.tests[PW_CTEST_AREA].ran);
    assert_true(isfinite(r.tests[PW_CTEST_AREA].value));
    assert_true(isfinite(r.gap_bridge));
    pw_consistency_result_free(&r);
    pw_dataset_free(&g.ds);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(bridged_against_single_polynomial),
        cmocka_unit_test(random_gaps),
        cmocka_unit_test(point_inside_gap_not_bridged),
        cmocka_unit_test(isobaric_bridged),
        cmocka_unit_test(short_branches),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
