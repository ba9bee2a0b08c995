/* Consistency tests on exact and on noisy data (docs/consistency.md, "Exact data" and "Stated
 * uncertainties").
 *
 * Data are generated here from modified Raoult's law with a temperature-independent Margules G^E
 * (H^E = 0, so the isobaric data obey the isothermal Gibbs-Duhem area rule too): Gibbs-Duhem
 * consistent by construction (METHODS 4.9 self-test recipe). A12 = A21 = 0 is Raoult's law
 * (ideal). Vapor pressures: the Antoine rows of datasets/components.csv, ln(P/kPa) = A - B/(t/C +
 * C) (Smith, Van Ness & Abbott, 7th ed. 2005, Table B.2, from memory). All generated data are
 * INVENTED round-trip data; the offsets and the noise are deliberate. */
#include "pw_test.h"

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/consistency.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#ifndef M_PI
#define M_PI 3.14159265358979323846
#endif

static pw_component antoine(const char *name, double A, double B, double C)
{
    return pw_test_antoine(name, A, B, C, PW_LN, "kPa", "C", 200.0, 500.0);
}

typedef struct sys {
    const char *n1, *n2;
    double a1[3], a2[3];
    double A12, A21;
} sys;

/* Pairs of shipped Antoine rows with Margules constants of typical size (invented). */
static const sys systems[] = {
    {"benzene", "toluene", {13.7819, 2726.81, 217.572}, {13.932, 3056.96, 217.625}, 0.0, 0.0},
    {"benzene", "toluene", {13.7819, 2726.81, 217.572}, {13.932, 3056.96, 217.625}, 0.3, 0.5},
    {"methanol",
     "water-antoine",
     {16.5785, 3638.27, 239.500},
     {16.3872, 3885.70, 230.170},
     0.8,
     0.45},
    {"acetone",
     "water-antoine",
     {14.3145, 2756.22, 228.060},
     {16.3872, 3885.70, 230.170},
     2.0,
     1.5},
    {"chloroform", "acetone", {13.7324, 2548.74, 218.552}, {14.3145, 2756.22, 228.060}, -0.7, -0.5},
};

typedef struct gen {
    pw_data_kind kind;
    double T_K;          /* isothermal */
    size_t n;            /* interior points; the two pure rows are added */
    double dT_K, dP_rel; /* systematic offset on the mixture rows */
    double noise_y, noise_T_K;
    unsigned long seed;
    double sigma_y, sigma_T_K; /* stated in the "file" (NAN: not stated) */
} gen;

/* Margules constants at 350 K in the 1/T form of the point test's isobaric reduction
 * (G^E/RT proportional to 1/T: docs/consistency.md), so that noise-free data satisfy the
 * method's own assumptions exactly. */
static double lng1(const sys *s, double x, double T)
{
    return 350.0 / T * (1 - x) * (1 - x) * (s->A12 + 2 * (s->A21 - s->A12) * x);
}
static double lng2(const sys *s, double x, double T)
{
    return 350.0 / T * x * x * (s->A21 + 2 * (s->A12 - s->A21) * (1 - x));
}

static double ptot(const sys *s, const pw_component *c, double x, double T)
{
    double P1, P2;
    assert_int_equal(pw_psat(&c[0], T, &P1, NULL), PW_OK);
    assert_int_equal(pw_psat(&c[1], T, &P2, NULL), PW_OK);
    return x * exp(lng1(s, x, T)) * P1 + (1 - x) * exp(lng2(s, x, T)) * P2;
}

static void make(pw_dataset *ds, const sys *s, pw_component *c, const gen *g)
{
    c[0] = antoine(s->n1, s->a1[0], s->a1[1], s->a1[2]);
    c[1] = antoine(s->n2, s->a2[0], s->a2[1], s->a2[2]);
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "invented-%s-%s.csv", s->n1, s->n2);
    snprintf(ds->names[0], PW_NAME_MAX, "%s", s->n1);
    snprintf(ds->names[1], PW_NAME_MAX, "%s", s->n2);
    ds->kind = g->kind;
    ds->has_y = true;
    ds->P_fixed_Pa = g->kind == PW_DATA_ISOBARIC ? 101325.0 : NAN;
    ds->T_fixed_K = g->kind == PW_DATA_ISOTHERMAL ? g->T_K : NAN;
    ds->sigma_T_K = isfinite(g->sigma_T_K) ? g->sigma_T_K : 0.1;
    ds->sigma_P_rel = 0.001, ds->sigma_P_abs_Pa = NAN;
    ds->sigma_y = isfinite(g->sigma_y) ? g->sigma_y : 0.004;
    ds->sigma_y_stated = isfinite(g->sigma_y);
    ds->sigma_x = 0.001;
    ds->n = g->n + 2;
    ds->pts = calloc(ds->n, sizeof *ds->pts);
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, g->seed);
    for (size_t i = 0; i < ds->n; i++) {
        double x = (double)i / (double)(ds->n - 1);
        double T = g->T_K;
        if (g->kind == PW_DATA_ISOBARIC) { /* bubble T by bisection to 1e-12 K */
            double lo = 200.0, hi = 500.0;
            for (int k = 0; k < 200 && hi - lo > 1e-12; k++) {
                double mid = 0.5 * (lo + hi);
                if (ptot(s, c, x, mid) > ds->P_fixed_Pa)
                    hi = mid;
                else
                    lo = mid;
            }
            T = 0.5 * (lo + hi);
        }
        double P1;
        assert_int_equal(pw_psat(&c[0], T, &P1, NULL), PW_OK);
        double P = ptot(s, c, x, T);
        double y = x * exp(lng1(s, x, T)) * P1 / P;
        bool pure = i == 0 || i == ds->n - 1;
        if (!pure) {
            y += g->noise_y * gsl_ran_gaussian(rng, 1.0);
            y = fmin(fmax(y, 1e-6), 1.0 - 1e-6);
        }
        double Tm = T + (pure ? 0.0 : g->dT_K + g->noise_T_K * gsl_ran_gaussian(rng, 1.0));
        double Pm =
            g->kind == PW_DATA_ISOBARIC ? ds->P_fixed_Pa : P * (pure ? 1.0 : 1.0 + g->dP_rel);
        ds->pts[i] = (pw_point){x, pure ? x : y, Tm, Pm, (long)i + 6};
    }
    gsl_rng_free(rng);
}

static pw_consistency_result check(const pw_dataset *ds, const pw_component *c, bool strict,
                                   double sigma_y_option)
{
    pw_consistency_options o = pw_consistency_default_options();
    o.strict_verdict = strict;
    o.sigma_y = sigma_y_option;
    pw_consistency_result r;
    pw_error err;
    pw_status st = pw_consistency_run(ds, &c[0], &c[1], &o, &r, &err);
    if (st != PW_OK)
        fail_msg("pw_consistency_run: %s", err.msg);
    return r;
}

/* Noise-free data from every system, isothermal and isobaric, with and without stated
 * uncertainties: every test that ran passes, so the verdict is "consistent" with and without
 * strict. For Raoult's law the area tests see areas at rounding level and report D = 0 (Herington:
 * D - J = -J); the Kojima slope ratio likewise 0. */
static void exact_data_consistent_with_and_without_strict(void **state)
{
    (void)state;
    for (size_t k = 0; k < sizeof systems / sizeof systems[0]; k++)
        for (int kind = 0; kind < 2; kind++)
            for (int stated = 0; stated < 2; stated++) {
                gen g = {kind ? PW_DATA_ISOTHERMAL : PW_DATA_ISOBARIC,
                         333.15,
                         15,
                         0,
                         0,
                         0,
                         0,
                         1,
                         stated ? 0.002 : NAN,
                         stated ? 0.05 : NAN};
                pw_dataset ds;
                pw_component c[2];
                make(&ds, &systems[k], c, &g);
                for (int strict = 0; strict < 2; strict++) {
                    pw_consistency_result r = check(&ds, c, strict, NAN);
                    for (int i = 0; i < PW_CTEST_COUNT; i++)
                        if (r.tests[i].ran && !r.tests[i].pass)
                            fail_msg("%s/%s kind %d stated %d strict %d: %s = %g (limit %g) failed",
                                     systems[k].n1, systems[k].n2, kind, stated, strict,
                                     r.tests[i].name, r.tests[i].value, r.tests[i].limit);
                    assert_true(r.consistent);
                    assert_true(r.tests[PW_CTEST_POINT].ran);
                    assert_int_equal(r.tests[PW_CTEST_SCATTER].ran, stated);
                    assert_int_equal(r.uncertainty_based, stated);
                    if (systems[k].A12 == 0.0 && systems[k].A21 == 0.0) {
                        assert_true(r.areas_at_rounding);
                        const pw_ctest *area = &r.tests[kind ? PW_CTEST_AREA : PW_CTEST_HERINGTON];
                        assert_true(area->ran);
                        pw_assert_close(area->value, kind ? 0.0 : -r.herington_J, 0.0, 1e-12,
                                        "ideal: D = 0");
                        if (kind)
                            pw_assert_close(r.tests[PW_CTEST_SLOPE].value, 0.0, 0.0, 0.0, "slope");
                    } else {
                        assert_false(r.areas_at_rounding);
                    }
                    pw_consistency_result_free(&r);
                }
                pw_dataset_free(&ds);
            }
}

/* Without a stated sigma_y the point test keeps the classic limit 0.01 (Fredenslund et al. 1977);
 * with one (file or option) the limit is the smaller of 0.01 and the 99 % bound of mean |dy|,
 * which is at least sigma_y (sqrt(2/pi) + z sqrt((1 - 2/pi)/n)) (the fit's own term only adds). */
static void point_limit_follows_sigma_y(void **state)
{
    (void)state;
    gen g = {PW_DATA_ISOBARIC, NAN, 15, 0, 0, 0, 0, 1, NAN, NAN};
    pw_dataset ds;
    pw_component c[2];
    make(&ds, &systems[1], c, &g);
    pw_consistency_result r = check(&ds, c, false, NAN);
    pw_assert_close(r.tests[PW_CTEST_POINT].limit, 0.01, 0.0, 0.0, "classic limit");
    assert_false(r.tests[PW_CTEST_SCATTER].ran);
    pw_consistency_result_free(&r);
    const double sig[] = {0.001, 0.002, 0.003};
    for (size_t i = 0; i < 3; i++) {
        r = check(&ds, c, false, sig[i]);        /* the option, the file states nothing */
        double n = 15.0, z = 2.3263478740408408; /* normal 0.99 quantile */
        double lo = sig[i] * (sqrt(2.0 / M_PI) + z * sqrt((1.0 - 2.0 / M_PI) / n));
        double lim = r.tests[PW_CTEST_POINT].limit;
        assert_true(lim >= lo * (1.0 - 1e-12) && lim <= 0.01);
        /* the fit's term (sigma_T 0.1 K by default here, carried into y_calc) adds some */
        assert_true(lim <= 2.0 * lo);
        pw_assert_close(r.sigma_y_used, sig[i], 0.0, 0.0, "sigma_y used");
        assert_true(r.tests[PW_CTEST_SCATTER].ran);
        pw_consistency_result_free(&r);
    }
    r = check(&ds, c, false, 0.02); /* large: the classic 0.01 stays the ceiling */
    pw_assert_close(r.tests[PW_CTEST_POINT].limit, 0.01, 0.0, 0.0, "ceiling");
    pw_consistency_result_free(&r);
    pw_dataset_free(&ds);
    /* invalid options are refused */
    pw_consistency_options o = pw_consistency_default_options();
    o.sigma_y = -0.1;
    pw_error err;
    make(&ds, &systems[1], c, &g);
    assert_int_equal(pw_consistency_run(&ds, &c[0], &c[1], &o, &r, &err), PW_EINVAL);
    o.sigma_y = 1.5;
    assert_int_equal(pw_consistency_run(&ds, &c[0], &c[1], &o, &r, &err), PW_EINVAL);
    pw_dataset_free(&ds);
}

/* A 0.5 K thermometer offset on the mixture rows (pure rows right), isobaric, with the stated
 * uncertainties sigma_y = 0.002, sigma_T = 0.05 K: caught on every system, noise-free and (30
 * seeds) with noise of the stated size, in both directions. Without stated uncertainties the
 * classic limit lets the noise-free offsets pass: the reason the stated ones matter. */
static void offset_caught_with_stated_uncertainties(void **state)
{
    (void)state;
    for (size_t k = 0; k < sizeof systems / sizeof systems[0]; k++)
        for (int sign = -1; sign <= 1; sign += 2) {
            gen g = {PW_DATA_ISOBARIC, NAN, 15, 0.5 * sign, 0, 0, 0, 1, 0.002, 0.05};
            pw_dataset ds;
            pw_component c[2];
            make(&ds, &systems[k], c, &g);
            pw_consistency_result r = check(&ds, c, false, NAN);
            print_message("offset %+.1f K %s/%s A12 %g: mean|dy| %.4g (limit %.4g), scatter %.3g "
                          "(limit %.3g) -> %s\n",
                          0.5 * sign, systems[k].n1, systems[k].n2, systems[k].A12,
                          r.tests[PW_CTEST_POINT].value, r.tests[PW_CTEST_POINT].limit,
                          r.tests[PW_CTEST_SCATTER].value, r.tests[PW_CTEST_SCATTER].limit,
                          r.consistent ? "consistent" : "caught");
            pw_consistency_result_free(&r);
            pw_dataset_free(&ds);
            size_t caught = 0, n_seeds = 30;
            for (unsigned long seed = 1; seed <= n_seeds; seed++) {
                gen gn = g;
                gn.noise_y = 0.002, gn.noise_T_K = 0.05, gn.seed = seed;
                make(&ds, &systems[k], c, &gn);
                r = check(&ds, c, false, NAN);
                caught += !r.consistent;
                pw_consistency_result_free(&r);
                pw_dataset_free(&ds);
            }
            if (caught < n_seeds * 8 / 10)
                fail_msg("offset %+.1f K on %s/%s: caught in %zu of %zu noisy sets", 0.5 * sign,
                         systems[k].n1, systems[k].n2, caught, n_seeds);
        }
    /* noise-free offset on a non-ideal system: caught only with the stated uncertainties */
    gen g = {PW_DATA_ISOBARIC, NAN, 15, 0.5, 0, 0, 0, 1, 0.002, 0.05};
    pw_dataset ds;
    pw_component c[2];
    make(&ds, &systems[2], c, &g);
    pw_consistency_result r = check(&ds, c, false, NAN);
    assert_false(r.consistent);
    assert_false(r.tests[PW_CTEST_SCATTER].pass);
    pw_consistency_result_free(&r);
    ds.sigma_y_stated = false;
    r = check(&ds, c, false, NAN);
    assert_true(r.consistent); /* classic 0.01: the offset goes unseen */
    pw_consistency_result_free(&r);
    pw_dataset_free(&ds);
}

/* Consistent data with noise of exactly the stated size: the uncertainty-based tests (each at
 * 99 %) fail rarely. 40 seeds per system: at most 3 failures of each test (for a 1 % test the
 * chance of 4 or more is about 0.8 %; the seeds are fixed, so the outcome is reproducible). */
static void consistent_noisy_data_rarely_fail(void **state)
{
    (void)state;
    for (size_t k = 0; k < sizeof systems / sizeof systems[0]; k++)
        for (int kind = 0; kind < 2; kind++) {
            size_t fail_point = 0, fail_scatter = 0, n_seeds = 40;
            for (unsigned long seed = 100; seed < 100 + n_seeds; seed++) {
                gen g = {kind ? PW_DATA_ISOTHERMAL : PW_DATA_ISOBARIC,
                         333.15,
                         15,
                         0,
                         0,
                         0.002,
                         kind ? 0.0 : 0.05,
                         seed,
                         0.002,
                         0.05};
                pw_dataset ds;
                pw_component c[2];
                make(&ds, &systems[k], c, &g);
                pw_consistency_result r = check(&ds, c, false, NAN);
                fail_point += !r.tests[PW_CTEST_POINT].pass;
                fail_scatter += !r.tests[PW_CTEST_SCATTER].pass;
                pw_consistency_result_free(&r);
                pw_dataset_free(&ds);
            }
            print_message("%s/%s kind %d: point failed %zu, scatter failed %zu of %zu\n",
                          systems[k].n1, systems[k].n2, kind, fail_point, fail_scatter, n_seeds);
            assert_true(fail_point <= 3 && fail_scatter <= 3);
        }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(exact_data_consistent_with_and_without_strict),
        cmocka_unit_test(point_limit_follows_sigma_y),
        cmocka_unit_test(offset_caught_with_stated_uncertainties),
        cmocka_unit_test(consistent_noisy_data_rarely_fail),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
