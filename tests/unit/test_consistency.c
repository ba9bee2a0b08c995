/* Consistency tests (src/analysis/consistency*.c) against identities and one textbook set.
 *
 * Sources of the check values:
 *  - Gibbs-Duhem at constant T and P, x1 dln(gamma1)/dx1 + x2 dln(gamma2)/dx1 = 0, and
 *    g = x1 ln gamma1 + x2 ln gamma2 (any thermodynamics text, e.g. SVNA 7th ed. ch. 11-12).
 *  - Explicit Legendre polynomials L2 = (3z^2 - 1)/2, L3 = (5z^3 - 3z)/2,
 *    L4 = (35z^4 - 30z^2 + 3)/8 (Abramowitz & Stegun 1964, Table 22.9 explicit forms; from memory).
 *  - Van Ness (1995), Pure Appl. Chem. 67:859: index scale, METHODS 4.3 [M].
 *  - Self-test recipe METHODS 4.9 [H: suggested]: data generated without noise from an
 *    activity model are consistent by construction; corrupted data must fail. These data are
 *    generated here (invented, no laboratory behind them).
 *  - SVNA 7th ed. (Smith, Van Ness & Abbott 2005), ch. 12: methyl ethyl ketone(1)/toluene(2)
 *    at 50 C, presented there as consistent. The numbers are FROM MEMORY [M].
 * Vapor pressures of the synthetic sets: methanol [M] and water [S] Antoine constants of SVNA
 * Table B.2 as given in METHODS 2.5, ln(P/kPa) = A - B/(t/C + C). */
#include "pw_test.h"

#include "analysis/consistency_internal.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <pinchwise/consistency.h>
#include <pinchwise/model.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static pw_component antoine(const char *name, double A, double B, double C)
{
    return pw_test_antoine(name, A, B, C, PW_LN, "kPa", "C", 250.0, 450.0);
}

static pw_component methanol(void) { return antoine("methanol", 16.5785, 3638.27, 239.500); }
static pw_component water(void) { return antoine("water", 16.3872, 3885.70, 230.170); }

#define NGRID 21 /* x1 = 0, 0.05, ..., 1: 19 interior points */

typedef struct gen_case {
    const char *model;
    double p[PW_MAX_PARAMS];
} gen_case;

/* Parameters chosen for these invented sets (no azeotrope needed, moderate nonideality). */
static const gen_case cases[] = {
    {"margules", {0.8, 0.5}},
    {"vanlaar", {0.9, 0.6}},
    {"wilson", {150.0, 250.0, 1.0}},
    {"nrtl", {200.0, 300.0, 0.3}},
};

typedef struct tb {
    const pw_component *c[2];
    double xg[2], P;
} tb;

static double tb_f(double T, void *vp)
{
    tb *t = vp;
    double P1, P2;
    pw_psat(t->c[0], T, &P1, NULL);
    pw_psat(t->c[1], T, &P2, NULL);
    return t->xg[0] * P1 + t->xg[1] * P2 - t->P;
}

/* Noise-free data: isothermal at T_K (P from modified Raoult's law) or isobaric at P_Pa with the
 * model evaluated at the fixed T_ref = 330 K (temperature-independent g, H^E = 0). */
static void generate(pw_dataset *ds, const gen_case *gc, pw_data_kind kind, const pw_component *c1,
                     const pw_component *c2)
{
    const pw_model_type *m = pw_model_find(gc->model);
    assert_non_null(m);
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "invented-%s.csv", gc->model);
    snprintf(ds->names[0], PW_NAME_MAX, "%s", c1->name);
    snprintf(ds->names[1], PW_NAME_MAX, "%s", c2->name);
    ds->kind = kind;
    ds->has_y = true;
    ds->sigma_T_K = 0.1, ds->sigma_P_rel = 0.001, ds->sigma_P_abs_Pa = NAN;
    ds->sigma_y = 0.004, ds->sigma_x = 0.001;
    ds->T_fixed_K = kind == PW_DATA_ISOTHERMAL ? 323.15 : NAN;
    ds->P_fixed_Pa = kind == PW_DATA_ISOBARIC ? 101325.0 : NAN;
    ds->pts = calloc(NGRID, sizeof *ds->pts);
    ds->n = NGRID;
    const double T_ref = 330.0;
    for (int i = 0; i < NGRID; i++) {
        double x = i / (double)(NGRID - 1);
        pw_activity a;
        double T = kind == PW_DATA_ISOTHERMAL ? ds->T_fixed_K : T_ref;
        assert_int_equal(m->eval(gc->p, T_ref, x, T, &a), PW_OK);
        double xg[2] = {x * exp(a.lngamma[0]), (1.0 - x) * exp(a.lngamma[1])};
        /* isobaric: ln gamma in the 1/T form about T_ref, the point test's isobaric assumption
         * (docs/consistency.md), so that noise-free data are consistent by construction */
        for (int rep = 0; kind == PW_DATA_ISOBARIC && rep < 60; rep++) {
            double f = T_ref / T;
            xg[0] = x * exp(f * a.lngamma[0]);
            xg[1] = (1.0 - x) * exp(f * a.lngamma[1]);
            tb t = {{c1, c2}, {xg[0], xg[1]}, ds->P_fixed_Pa};
            gsl_function F = {tb_f, &t};
            gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
            gsl_root_fsolver_set(s, &F, 250.0, 420.0);
            for (int it = 0; it < 200; it++) {
                gsl_root_fsolver_iterate(s);
                if (gsl_root_test_interval(gsl_root_fsolver_x_lower(s), gsl_root_fsolver_x_upper(s),
                                           1e-12, 0.0) == GSL_SUCCESS)
                    break;
            }
            T = gsl_root_fsolver_root(s);
            gsl_root_fsolver_free(s);
        }
        double P1, P2;
        pw_psat(c1, T, &P1, NULL);
        pw_psat(c2, T, &P2, NULL);
        double P = xg[0] * P1 + xg[1] * P2;
        ds->pts[i] = (pw_point){x, xg[0] * P1 / P, T, kind == PW_DATA_ISOTHERMAL ? P : ds->P_fixed_Pa,
                                i + 3};
    }
}

static pw_consistency_result run(const pw_dataset *ds, const pw_component *c1, const pw_component *c2)
{
    pw_consistency_result r;
    pw_error err;
    pw_error_clear(&err);
    pw_status st = pw_consistency_run(ds, c1, c2, NULL, &r, &err);
    if (st != PW_OK)
        fail_msg("pw_consistency_run: %s", err.msg);
    return r;
}

/* ---------------------------------------------------------------- Legendre model identities */

static void legendre_identities(void **state)
{
    (void)state;
    for (size_t n = 1; n <= 5; n++) {
        const pw_model_type *m = pw_cs_legendre_model(n);
        assert_non_null(m);
        assert_int_equal(m->n_params, n);
        double p[PW_MAX_PARAMS] = {0.7, -0.3, 0.25, -0.12, 0.05};
        for (double x = 0.0; x <= 1.0; x += 0.125) {
            pw_activity a, ap, am;
            assert_int_equal(m->eval(p, 300.0, x, 300.0, &a), PW_OK);
            /* g = x1 ln gamma1 + x2 ln gamma2 */
            pw_assert_close(x * a.lngamma[0] + (1 - x) * a.lngamma[1], a.gE_RT, 0, 1e-14, "g sum");
            /* Gibbs-Duhem at constant T, P */
            pw_assert_close(x * a.dlngamma_dx1[0] + (1 - x) * a.dlngamma_dx1[1], 0.0, 0, 1e-13, "GD");
            /* finite differences in x1 (central, h = 1e-6) where both sides are in [0, 1] */
            double h = 1e-6;
            if (x > h && x < 1 - h) {
                m->eval(p, 300.0, x + h, 300.0, &ap);
                m->eval(p, 300.0, x - h, 300.0, &am);
                for (int i = 0; i < 2; i++)
                    pw_assert_close((ap.lngamma[i] - am.lngamma[i]) / (2 * h), a.dlngamma_dx1[i], 1e-6,
                                    1e-7, "d ln gamma / dx1");
                pw_assert_close((ap.gE_RT - 2 * a.gE_RT + am.gE_RT) / (h * h), a.d2gE_dx2, 1e-3, 1e-3,
                                "d2g/dx2");
            }
            /* finite differences in each parameter (g is linear in a_k: exact up to rounding) */
            for (size_t k = 0; k < n; k++) {
                double q[PW_MAX_PARAMS];
                memcpy(q, p, sizeof q);
                q[k] += 1e-5;
                m->eval(q, 300.0, x, 300.0, &ap);
                for (int i = 0; i < 2; i++)
                    pw_assert_close((ap.lngamma[i] - a.lngamma[i]) / 1e-5, a.dlngamma_dp[i][k], 1e-7,
                                    1e-9, "d ln gamma / d a_k");
            }
        }
    }
    /* a single a_k: g/(x1 x2) = L_k(z), explicit forms (Abramowitz & Stegun Table 22.9, from memory) */
    const pw_model_type *m5 = pw_cs_legendre_model(5);
    for (double x = 0.1; x < 1.0; x += 0.2) {
        double z = 2 * x - 1, w = x * (1 - x);
        double want[5] = {1.0, z, (3 * z * z - 1) / 2, (5 * z * z * z - 3 * z) / 2,
                          (35 * pow(z, 4) - 30 * z * z + 3) / 8};
        for (int k = 0; k < 5; k++) {
            double p[PW_MAX_PARAMS] = {0};
            p[k] = 1.0;
            pw_activity a;
            m5->eval(p, 300.0, x, 300.0, &a);
            pw_assert_close(a.gE_RT / w, want[k], 1e-13, 1e-14, "L_k");
        }
    }
    /* two terms are the two-parameter Margules equation: a0 = (A12 + A21)/2, a1 = (A21 - A12)/2 */
    const pw_model_type *mg = pw_model_find("margules");
    assert_non_null(mg);
    double A[PW_MAX_PARAMS] = {0.8, 0.5}, a2[PW_MAX_PARAMS] = {0.65, -0.15};
    for (double x = 0.0; x <= 1.0; x += 0.1) {
        pw_activity am, al;
        mg->eval(A, 320.0, x, 320.0, &am);
        pw_cs_legendre_model(2)->eval(a2, 320.0, x, 320.0, &al);
        pw_assert_close(al.lngamma[0], am.lngamma[0], 1e-12, 1e-14, "Margules ln g1");
        pw_assert_close(al.lngamma[1], am.lngamma[1], 1e-12, 1e-14, "Margules ln g2");
    }
    double bad[PW_MAX_PARAMS] = {0};
    pw_activity a;
    assert_int_equal(pw_cs_legendre_model(3)->eval(bad, 300.0, 1.5, 300.0, &a), PW_EDOM);
    assert_null(pw_cs_legendre_model(0));
    assert_null(pw_cs_legendre_model(6));
}

/* ------------------------------------------------------------- helpers against closed forms */

static void helpers_closed_forms(void **state)
{
    (void)state;
    /* Van Ness (1995) index scale (METHODS 4.3 [M]) */
    assert_int_equal(pw_consistency_van_ness_index(0.0), 1);
    assert_int_equal(pw_consistency_van_ness_index(0.025), 1);
    assert_int_equal(pw_consistency_van_ness_index(0.026), 2);
    assert_int_equal(pw_consistency_van_ness_index(0.05), 2);
    assert_int_equal(pw_consistency_van_ness_index(0.225), 9);
    assert_int_equal(pw_consistency_van_ness_index(0.23), 10);
    assert_int_equal(pw_consistency_van_ness_index(5.0), 10);
    assert_int_equal(pw_consistency_van_ness_index(NAN), 0);
    /* areas of x - 1/4 over [0, 1]: above 9/32, below 1/32 (elementary integrals) */
    double c[2] = {-0.25, 1.0}, A, B;
    assert_int_equal(pw_cs_poly_areas(c, 1, &A, &B), PW_OK);
    pw_assert_close(A, 9.0 / 32.0, 1e-14, 0, "A");
    pw_assert_close(B, 1.0 / 32.0, 1e-14, 0, "B");
    /* (x - 0.2)(x - 0.7) = x^2 - 0.9 x + 0.14: + on [0,0.2], - on [0.2,0.7], + on [0.7,1] */
    double q[3] = {0.14, -0.9, 1.0};
    assert_int_equal(pw_cs_poly_areas(q, 2, &A, &B), PW_OK);
    pw_assert_close(A, 0.2 * 0.2 * 0.2 / 3 - 0.45 * 0.04 + 0.14 * 0.2 +
                           (1.0 / 3 - 0.45 + 0.14) - (0.343 / 3 - 0.45 * 0.49 + 0.14 * 0.7),
                    1e-12, 0, "A quadratic");
    pw_assert_close(B, 0.125 / 6.0, 1e-12, 0, "B quadratic"); /* |integral| = (b-a)^3/6 */
    /* robust scale of {1..9}: median 5, MAD 2 */
    double v[9] = {1, 2, 3, 4, 5, 6, 7, 8, 9}, med, sd;
    pw_cs_robust(v, 9, &med, &sd);
    pw_assert_close(med, 5.0, 0, 0, "median");
    pw_assert_close(sd, 1.4826 * 2.0, 1e-15, 0, "1.4826 MAD");
}

/* ---------------------------------------------------- METHODS 4.9 self-test: noise-free data */

static void noise_free_sets_pass(void **state)
{
    (void)state;
    pw_component c1 = methanol(), c2 = water();
    for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
        for (int kind = 0; kind < 2; kind++) {
            pw_dataset ds;
            generate(&ds, &cases[k], (pw_data_kind)kind, &c1, &c2);
            pw_consistency_result r = run(&ds, &c1, &c2);
            char label[96];
            snprintf(label, sizeof label, "%s %s", cases[k].model, kind ? "isothermal" : "isobaric");
            if (!r.consistent)
                fail_msg("%s: not consistent: %s", label, r.reasons[0]);
            const pw_ctest *pt = &r.tests[PW_CTEST_POINT];
            assert_true(pt->ran);
            if (!(pt->value < 2e-4))
                fail_msg("%s: mean |dy| = %g", label, pt->value);
            if (kind == PW_DATA_ISOTHERMAL) {
                assert_true(r.tests[PW_CTEST_AREA].ran);
                assert_false(r.tests[PW_CTEST_HERINGTON].ran);
                if (!(r.tests[PW_CTEST_AREA].value < 0.5))
                    fail_msg("%s: D = %g", label, r.tests[PW_CTEST_AREA].value);
                assert_true(r.tests[PW_CTEST_SLOPE].ran);
                if (!(r.tests[PW_CTEST_SLOPE].value < 1.0))
                    fail_msg("%s: slope d = %g", label, r.tests[PW_CTEST_SLOPE].value);
            } else {
                assert_true(r.tests[PW_CTEST_HERINGTON].ran);
                /* the 1/T form has H^E = G^E: the area is not zero at constant P, and Herington's
                 * allowance J is what covers it (D - J well below the limit) */
                if (!(r.tests[PW_CTEST_HERINGTON].pass && r.herington_D < r.herington_J))
                    fail_msg("%s: Herington D = %g, J = %g", label, r.herington_D, r.herington_J);
                assert_false(r.tests[PW_CTEST_SLOPE].ran);
            }
            assert_true(r.tests[PW_CTEST_DILUTION].ran);
            if (!(r.I1 < 2.0 && r.I2 < 2.0))
                fail_msg("%s: I1 = %g, I2 = %g", label, r.I1, r.I2);
            assert_true(r.tests[PW_CTEST_ENDPOINT].ran);
            pw_assert_close(r.tests[PW_CTEST_ENDPOINT].value, 0.0, 0, 1e-9, "endpoint");
            assert_int_equal(r.n_flagged, 0);
            assert_int_equal(r.n_pts, NGRID - 2);
            pw_assert_close(r.quality.Q, 1.0, 1e-12, 0, "quality factor");
            /* Margules is the 2-term Legendre series: the Barker fit must recover it */
            if (k == 0) {
                pw_assert_close(r.rms_dlnratio, 0.0, 0, 1e-7, "rms d ln ratio");
                assert_int_equal(r.van_ness_index, 1);
                if (kind == PW_DATA_ISOTHERMAL) {
                    /* thermo's Margules form: A_ij(T) = A_ij T_ref/T with T_ref = 330 K */
                    pw_assert_close(r.legendre_a[0], 0.65 * 330.0 / 323.15, 0, 1e-7, "a0");
                    pw_assert_close(r.legendre_a[1], -0.15 * 330.0 / 323.15, 0, 1e-7, "a1");
                    pw_assert_close(r.area_A - r.area_B, 0.0, 0, 1e-9, "A - B");
                }
            }
            pw_consistency_result_free(&r);
            free(ds.pts);
        }
    }
}

/* ------------------------------------------------------ METHODS 4.9: noise sigma_y = 0.003 */

static void noisy_y_still_passes(void **state)
{
    (void)state;
    pw_component c1 = methanol(), c2 = water();
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
        for (int kind = 0; kind < 2; kind++) {
            gsl_rng_set(rng, 20240601UL + k * 2 + (unsigned long)kind);
            pw_dataset ds;
            generate(&ds, &cases[k], (pw_data_kind)kind, &c1, &c2);
            for (size_t i = 1; i + 1 < ds.n; i++)
                ds.pts[i].y1 = fmin(0.999, fmax(0.001, ds.pts[i].y1 + gsl_ran_gaussian(rng, 0.003)));
            pw_consistency_result r = run(&ds, &c1, &c2);
            const pw_ctest *pt = &r.tests[PW_CTEST_POINT];
            if (!pt->pass)
                fail_msg("%s kind %d: point test failed, mean |dy| = %g", cases[k].model, kind, pt->value);
            /* mean |N(0, s)| = s sqrt(2/pi) = 0.0024 for s = 0.003 */
            if (!(pt->value > 0.0012 && pt->value < 0.0040))
                fail_msg("%s: mean |dy| = %g not near 0.0024", cases[k].model, pt->value);
            const pw_ctest *area = &r.tests[kind == PW_DATA_ISOTHERMAL ? PW_CTEST_AREA : PW_CTEST_HERINGTON];
            if (!area->pass)
                fail_msg("%s kind %d: area test failed (%g)", cases[k].model, kind, area->value);
            pw_consistency_result_free(&r);
            free(ds.pts);
        }
    }
    gsl_rng_free(rng);
}

/* ------------------------------------------ METHODS 4.9 (as briefed): y + 0.03, middle third */

static void biased_y_fails_and_is_flagged(void **state)
{
    (void)state;
    pw_component c1 = methanol(), c2 = water();
    pw_dataset ds;
    generate(&ds, &cases[0], PW_DATA_ISOTHERMAL, &c1, &c2);
    size_t n_bad = 0;
    for (size_t i = 1; i + 1 < ds.n; i++)
        if (ds.pts[i].x1 > 1.0 / 3.0 && ds.pts[i].x1 < 2.0 / 3.0) {
            ds.pts[i].y1 += 0.03;
            n_bad++;
        }
    assert_int_equal(n_bad, 7); /* x1 = 0.35 ... 0.65 */
    pw_consistency_result r = run(&ds, &c1, &c2);
    const pw_ctest *pt = &r.tests[PW_CTEST_POINT];
    assert_true(pt->ran);
    assert_false(pt->pass);
    assert_false(r.consistent);
    /* Barker's fit uses P alone, so it is unchanged: mean |dy| = 0.03 x 7/19 exactly */
    pw_assert_close(pt->value, 0.03 * 7.0 / 19.0, 1e-5, 0, "mean |dy|");
    assert_int_equal(r.n_flagged, n_bad);
    for (size_t i = 0; i < r.n_pts; i++) {
        bool bad = r.pts[i].x1 > 1.0 / 3.0 && r.pts[i].x1 < 2.0 / 3.0;
        if (r.pts[i].flagged != bad)
            fail_msg("line %ld (x1 = %g): flagged %d, corrupted %d", r.pts[i].line, r.pts[i].x1,
                     r.pts[i].flagged, bad);
        if (bad)
            assert_non_null(strstr(r.pts[i].why, "dy"));
    }
    assert_false(r.tests[PW_CTEST_AREA].pass);
    assert_true(r.quality.Q < 1.0);
    pw_consistency_result_free(&r);
    free(ds.pts);
}

/* ------------------------------------ T offset by 2 K at the x1 > 0.5 end (isobaric data) */

static void offset_T_fails_and_is_flagged(void **state)
{
    (void)state;
    pw_component c1 = methanol(), c2 = water();
    pw_dataset ds;
    generate(&ds, &cases[0], PW_DATA_ISOBARIC, &c1, &c2);
    for (size_t i = 1; i + 1 < ds.n; i++)
        if (ds.pts[i].x1 > 0.5)
            ds.pts[i].T_K += 2.0;
    pw_consistency_result r = run(&ds, &c1, &c2);
    const pw_ctest *pt = &r.tests[PW_CTEST_POINT];
    assert_true(pt->ran);
    if (pt->pass)
        fail_msg("point test passed with mean |dy| = %g", pt->value);
    assert_false(r.consistent);
    size_t n_good_flagged = 0, n_bad_flagged = 0;
    for (size_t i = 0; i < r.n_pts; i++) {
        if (r.pts[i].flagged && r.pts[i].x1 > 0.5)
            n_bad_flagged++;
        else if (r.pts[i].flagged)
            n_good_flagged++;
    }
    print_message("T offset: mean |dy| = %.4g, flagged %zu corrupted and %zu clean points\n",
                  pt->value, n_bad_flagged, n_good_flagged);
    if (n_good_flagged != 0 || n_bad_flagged == 0)
        fail_msg("flagged: %zu corrupted, %zu clean", n_bad_flagged, n_good_flagged);
    pw_consistency_result_free(&r);
    free(ds.pts);
}

/* ----------------------------------------------------------------- swapped y columns fail */

static void swapped_y_fails(void **state)
{
    (void)state;
    pw_component c1 = methanol(), c2 = water();
    for (int kind = 0; kind < 2; kind++) {
        pw_dataset ds;
        generate(&ds, &cases[1], (pw_data_kind)kind, &c1, &c2);
        for (size_t i = 0; i < ds.n; i++)
            ds.pts[i].y1 = 1.0 - ds.pts[i].y1;
        pw_consistency_result r = run(&ds, &c1, &c2);
        assert_false(r.tests[PW_CTEST_POINT].pass);
        assert_false(r.consistent);
        pw_consistency_result_free(&r);
        free(ds.pts);
    }
}

/* --------------------------------------------------------- P1sat shifted by 2 % (endpoint) */

static void shifted_psat_fails_endpoint(void **state)
{
    (void)state;
    pw_component c1 = methanol(), c2 = water();
    for (int kind = 0; kind < 2; kind++) {
        pw_dataset ds;
        generate(&ds, &cases[0], (pw_data_kind)kind, &c1, &c2);
        pw_component shifted = c1;
        shifted.A += log(1.02);
        pw_consistency_result r = run(&ds, &shifted, &c2);
        const pw_ctest *e = &r.tests[PW_CTEST_ENDPOINT];
        assert_true(e->ran);
        assert_false(e->pass);
        if (kind == PW_DATA_ISOTHERMAL)
            pw_assert_close(e->value, 1.0 - 1.0 / 1.02, 1e-9, 0, "|dP|/P at x1 = 1");
        else
            assert_true(e->value > 0.2);
        pw_assert_close(r.endpoint_dev[0], 0.0, 0, 1e-9, "x1 = 0 end unchanged");
        assert_false(r.consistent);
        assert_true(r.quality.F_pure < 1.0);
        pw_consistency_result_free(&r);
        free(ds.pts);
    }
}

/* -------------------------------------------------- data types that do not allow the tests */

static void no_y_runs_endpoint_only(void **state)
{
    (void)state;
    pw_component c1 = methanol(), c2 = water();
    pw_dataset ds;
    generate(&ds, &cases[2], PW_DATA_ISOTHERMAL, &c1, &c2);
    ds.has_y = false;
    for (size_t i = 0; i < ds.n; i++)
        ds.pts[i].y1 = NAN;
    pw_consistency_result r = run(&ds, &c1, &c2);
    for (int i = 0; i < PW_CTEST_COUNT; i++) {
        if (i == PW_CTEST_ENDPOINT) {
            assert_true(r.tests[i].ran);
            continue;
        }
        assert_false(r.tests[i].ran);
        assert_non_null(strstr(r.tests[i].why_not, "no y column"));
    }
    assert_false(r.consistent);
    assert_false(r.quality.ran);
    pw_consistency_result_free(&r);
    free(ds.pts);
    /* too few points: keep x1 = 0, 0.05, 0.1, 1 */
    ds.has_y = true;
    generate(&ds, &cases[0], PW_DATA_ISOTHERMAL, &c1, &c2);
    ds.pts[3] = ds.pts[NGRID - 1];
    ds.n = 4;
    r = run(&ds, &c1, &c2);
    assert_false(r.tests[PW_CTEST_POINT].ran);
    assert_false(r.tests[PW_CTEST_AREA].ran);
    assert_non_null(strstr(r.tests[PW_CTEST_AREA].why_not, "at least 5"));
    assert_false(r.consistent);
    pw_consistency_result_free(&r);
    free(ds.pts);
    /* bad options are refused */
    pw_consistency_options o = pw_consistency_default_options();
    o.legendre_terms_max = 7;
    pw_error err;
    assert_int_equal(pw_consistency_run(&ds, &c1, &c2, &o, &r, &err), PW_EINVAL);
}

/* ------------------------------ SVNA 7th ed. ch. 12, MEK(1)/toluene(2) at 50 C [M: from memory] */

static void svna_mek_toluene_is_consistent(void **state)
{
    (void)state;
    static const double x[] = {0, 0.0895, 0.1981, 0.3193, 0.4232, 0.5119, 0.6096, 0.7135, 0.7934, 0.9102, 1};
    static const double y[] = {0, 0.2716, 0.4565, 0.5934, 0.6815, 0.7440, 0.8050, 0.8639, 0.9048, 0.9590, 1};
    static const double P[] = {12.30, 15.51, 18.61, 21.63, 24.01, 25.92, 27.96, 30.12, 31.75, 34.15, 36.09};
    /* SVNA reduces these data with the measured pure-component pressures P1sat = 36.09 kPa and
     * P2sat = 12.30 kPa. B and C are SVNA Table B.2 values for 2-butanone and toluene (from
     * memory); A is set so that the correlation gives exactly those pressures at 50 C. */
    pw_component mek = antoine("methyl ethyl ketone", 0, 2838.24, 218.690);
    pw_component tol = antoine("toluene", 0, 3056.96, 217.625);
    mek.A = log(36.09) + mek.B / (50.0 + mek.C);
    tol.A = log(12.30) + tol.B / (50.0 + tol.C);
    pw_dataset ds;
    memset(&ds, 0, sizeof ds);
    snprintf(ds.path, sizeof ds.path, "svna-mek-toluene.csv");
    ds.kind = PW_DATA_ISOTHERMAL;
    ds.T_fixed_K = 323.15;
    ds.P_fixed_Pa = NAN;
    ds.has_y = true;
    ds.sigma_y = 0.004;
    ds.n = 11;
    ds.pts = calloc(ds.n, sizeof *ds.pts);
    for (size_t i = 0; i < ds.n; i++)
        ds.pts[i] = (pw_point){x[i], y[i], 323.15, P[i] * 1000.0, (long)i + 5};
    pw_consistency_result r = run(&ds, &mek, &tol);
    for (int i = 0; i < PW_CTEST_COUNT; i++)
        print_message("svna %-16s ran %d value %-10.4g limit %-8.4g pass %d %s\n", r.tests[i].name,
                      r.tests[i].ran, r.tests[i].value, r.tests[i].limit, r.tests[i].pass,
                      r.tests[i].why_not);
    /* SVNA judge these data by the point test (residuals scatter about zero) */
    assert_true(r.tests[PW_CTEST_POINT].pass);
    assert_true(r.tests[PW_CTEST_ENDPOINT].pass);
    assert_true(r.van_ness_index <= 2);
    if (!r.consistent)
        fail_msg("SVNA set judged inconsistent: %s", r.reasons[0]);
    assert_true(r.primary[PW_CTEST_POINT] && !r.primary[PW_CTEST_AREA]);
    /* The area test on the same numbers: D = 13.76 with the degree-4 smoothing, recomputed by an
     * independent pure-Python least-squares fit and midpoint-rule integration [H]. It fails
     * (D > 10): the end extrapolation dominates, the weakness METHODS 4.1 names. The verdict
     * therefore reports it as a secondary warning. */
    assert_int_equal(r.area_degree, 4);
    pw_assert_close(r.tests[PW_CTEST_AREA].value, 13.76, 0, 0.01, "area D [H]");
    assert_false(r.tests[PW_CTEST_AREA].pass);
    /* SVNA's Margules fit gives ln gamma1_inf about 0.37 and ln gamma2_inf about 0.20 (from
     * memory); the cubic extrapolation of g/(x1 x2) gives 0.4247 and 0.2075 (same Python [H]) */
    pw_assert_close(r.lngamma1_inf, 0.4247, 0, 5e-4, "ln gamma1 inf [H]");
    pw_assert_close(r.lngamma2_inf, 0.2075, 0, 5e-4, "ln gamma2 inf [H]");
    pw_assert_close(r.lngamma1_inf, 0.37, 0, 0.08, "ln gamma1 inf [M]");
    pw_assert_close(r.lngamma2_inf, 0.20, 0, 0.08, "ln gamma2 inf [M]");
    /* strict verdict: every test that ran must pass, so the same data are then inconsistent */
    pw_consistency_options o = pw_consistency_default_options();
    o.strict_verdict = true;
    pw_consistency_result_free(&r);
    pw_error err;
    assert_int_equal(pw_consistency_run(&ds, &mek, &tol, &o, &r, &err), PW_OK);
    assert_false(r.consistent);
    pw_consistency_result_free(&r);
    free(ds.pts);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(legendre_identities),
        cmocka_unit_test(helpers_closed_forms),
        cmocka_unit_test(noise_free_sets_pass),
        cmocka_unit_test(noisy_y_still_passes),
        cmocka_unit_test(biased_y_fails_and_is_flagged),
        cmocka_unit_test(offset_T_fails_and_is_flagged),
        cmocka_unit_test(swapped_y_fails),
        cmocka_unit_test(shifted_psat_fails_endpoint),
        cmocka_unit_test(no_y_runs_endpoint_only),
        cmocka_unit_test(svna_mek_toluene_is_consistent),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
