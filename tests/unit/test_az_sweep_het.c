/* Where a heterogeneous azeotrope turns homogeneous inside a scan
 * (pw_azeotrope_scan_heterogeneous, src/analysis/az_scan_het.c).
 *
 * Checks, with their sources:
 *  - symmetric Margules, gE/RT = A(T) x1 x2 with A(T) = A0 Tref/T (the library's Margules with
 *    A12 = A21): the liquid splits exactly while A(T) > 2, i.e. below Tc = A0 Tref/2, into the
 *    layers x_I and 1 - x_I with ln[x/(1 - x)] = A(2x - 1) and equal activities
 *    a = x_I exp(A (1 - x_I)^2), so P3 = a (P1sat + P2sat) and y3 = P1sat/(P1sat + P2sat)
 *    (METHODS2 3.3, re-derived here; an identity of the model). The layer is solved here by
 *    GSL Brent on that equation, not by the library's LLE solver;
 *  - with identical vapor pressures y3 = 1/2 = x_c: the vapor stays between the layers up to the
 *    critical point, so the label changes exactly at Tc (closed form), in a pressure scan at
 *    Pc = e^(1/2) Psat(Tc) (a = e^(1/2)/2 at A = 2);
 *  - with vapor pressures whose ratio moves with T, y3 meets the layer x_I at T* solving
 *    y3(T) = x_I(T) (GSL Brent here on the equations above), in a pressure scan at
 *    P* = a(T*) (P1sat + P2sat)(T*);
 *  - seeded random symmetric cases (random A0, Tref, vapor pressures, scan range and number of
 *    points, both modes): every interval whose ends carry different labels (labels computed
 *    here from the equations above) holds exactly one located change, none other is reported,
 *    the located value matches the change found here (a 4,000-point table of G and Brent),
 *    and the labels here just outside the reported bracket differ;
 *  - seeded random asymmetric Margules cases (no closed form): the located value satisfies the
 *    event equation y3 = x_layer on the library's own three-phase state there, and the labels at
 *    the reported bracket's ends differ;
 *  - a model whose evaluation fails inside the interval holding the change: the change is
 *    reported as not located, in a bracket that holds T* (above), and the scan succeeds.
 * The vapor-pressure constants and parameters are model cases, not data. */
#include "pw_test.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_rng.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/lle.h>
#include <string.h>

/* ---- the symmetric model, computed here ---- */

typedef struct sym {
    pw_system s;
    double A0, Tref;       /* A(T) = A0 Tref / T */
    double a1, b1, a2, b2; /* ln(Psat_i/kPa) = a_i - b_i/T */
} sym;

static sym make_sym(double A0, double Tref, double a1, double b1, double a2, double b2)
{
    sym m;
    memset(&m, 0, sizeof m);
    m.A0 = A0;
    m.Tref = Tref;
    m.a1 = a1;
    m.b1 = b1;
    m.a2 = a2;
    m.b2 = b2;
    m.s.comp[0] = pw_test_antoine("one (invented)", a1, b1, 0.0, PW_LN, "kPa", "K", NAN, NAN);
    m.s.comp[1] = pw_test_antoine("two (invented)", a2, b2, 0.0, PW_LN, "kPa", "K", NAN, NAN);
    m.s.model = &pw_model_margules;
    m.s.params[0] = m.s.params[1] = A0;
    m.s.T_ref_K = Tref;
    return m;
}

static double brent(double (*f)(double, void *), void *c, double lo, double hi, double epsabs,
                    double epsrel)
{
    gsl_function F = {f, c};
    gsl_root_fsolver *rs = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    assert_non_null(rs);
    assert_int_equal(gsl_root_fsolver_set(rs, &F, lo, hi), GSL_SUCCESS);
    double r = NAN;
    for (int it = 0; it < 400; it++) {
        gsl_root_fsolver_iterate(rs);
        r = gsl_root_fsolver_root(rs);
        if (gsl_root_test_interval(gsl_root_fsolver_x_lower(rs), gsl_root_fsolver_x_upper(rs),
                                   epsabs, epsrel) == GSL_SUCCESS)
            break;
    }
    gsl_root_fsolver_free(rs);
    return r;
}

static double layer_eq(double x, void *vp)
{
    double A = *(const double *)vp;
    return log(x / (1.0 - x)) - A * (2.0 * x - 1.0);
}

/* The lower layer of the symmetric split at A > 2. */
static double sym_layer(double A)
{
    /* layer_eq < 0 near 0; > 0 at the spinodal 1/2 - sqrt(1/4 - 1/(2A)) and above, up to 1/2 */
    double hi = 0.5 - sqrt(0.25 - 0.5 / A), lo = 1e-300;
    if (!(layer_eq(hi, &A) > 0.0))
        hi = 0.5 * (hi + 0.5);
    return brent(layer_eq, &A, lo, hi, 0.0, 1e-15);
}

static double sym_Tc(const sym *m) { return 0.5 * m->A0 * m->Tref; }

static double sym_y3(const sym *m, double T)
{
    return 1.0 / (1.0 + exp((m->a2 - m->b2 / T) - (m->a1 - m->b1 / T)));
}

/* G(T) = min(y3 - x_I, x_II - y3) below Tc; -1 at and above it (no split). */
static double sym_G_T(const sym *m, double T)
{
    if (!(T < sym_Tc(m)))
        return -1.0;
    double A = m->A0 * m->Tref / T, x = sym_layer(A), y = sym_y3(m, T);
    return fmin(y - x, (1.0 - x) - y);
}

/* P3(T) below Tc (at Tc: the critical liquid, a = e^(1/2)/2). */
static double sym_P3(const sym *m, double T)
{
    double A = m->A0 * m->Tref / T;
    double x = A > 2.0 ? sym_layer(A) : 0.5, a = x * exp(A > 2.0 ? A * (1.0 - x) * (1.0 - x) : 0.5);
    return a * 1000.0 * (exp(m->a1 - m->b1 / T) + exp(m->a2 - m->b2 / T));
}

typedef struct {
    const sym *m;
    double P;
} p3_ctx;

static double p3_fn(double T, void *vp)
{
    const p3_ctx *c = vp;
    return sym_P3(c->m, T) - c->P;
}

/* G at fixed P: the three-phase temperature where P3(T) = P below Tc (P3 rises with T in the
 * cases used: checked by the caller), -1 when P lies above P3(Tc) (no three-phase state). */
static double sym_G_P(const sym *m, double P, double T_floor)
{
    double Tc = sym_Tc(m);
    if (!(P < sym_P3(m, Tc)))
        return -1.0;
    if (!(P > sym_P3(m, T_floor)))
        return NAN; /* outside what the case covers */
    p3_ctx c = {m, P};
    double T = brent(p3_fn, &c, T_floor, Tc, 1e-11, 0.0);
    return sym_G_T(m, T);
}

typedef struct {
    const sym *m;
    bool isobaric;
    double T_floor;
} g_ctx;

static double g_fn(double v, void *vp)
{
    const g_ctx *c = vp;
    return c->isobaric ? sym_G_P(c->m, v, c->T_floor) : sym_G_T(c->m, v);
}

/* ---- the library's scan ---- */

static pw_az_scan *run_scan(const pw_system *s, pw_az_mode mode, double from, double to,
                            size_t n, pw_three_phase **tps)
{
    pw_az_scan *sc = pw_az_scan_alloc(n);
    assert_non_null(sc);
    assert_int_equal(pw_azeotrope_scan(s, mode, from, to, NULL, sc), PW_OK);
    *tps = calloc(n, sizeof **tps);
    assert_non_null(*tps);
    assert_int_equal(pw_azeotrope_scan_heterogeneous(s, sc, *tps), PW_OK);
    return sc;
}

static size_t n_het(const pw_az_scan *sc)
{
    size_t n = 0;
    for (size_t k = 0; k < sc->n_boundaries; k++)
        n += sc->boundaries[k].kind != PW_AZ_BOUNDARY_PURE_END;
    return n;
}

static const pw_az_boundary *first_het(const pw_az_scan *sc)
{
    for (size_t k = 0; k < sc->n_boundaries; k++)
        if (sc->boundaries[k].kind != PW_AZ_BOUNDARY_PURE_END)
            return &sc->boundaries[k];
    return NULL;
}

/* The sweep points' labels agree with the three-phase states handed back. */
static void labels_match_states(const pw_az_scan *sc, const pw_three_phase *tps)
{
    for (size_t k = 0; k < sc->n_points; k++)
        if (tps[k].exists)
            assert_true(tps[k].heterogeneous_azeotrope ==
                        (tps[k].x[0] < tps[k].y1 && tps[k].y1 < tps[k].x[1]));
}

/* Identical vapor pressures: y3 = 1/2, the label changes at the critical point (closed form). */
static void layers_merge_closed_form(void **state)
{
    (void)state;
    /* Tc = 2.6 * 300 / 2 = 390 K */
    sym m = make_sym(2.6, 300.0, 14.0, 3500.0, 14.0, 3500.0);
    const double Tc = 390.0;
    pw_three_phase *tps;
    pw_az_scan *sc = run_scan(&m.s, PW_AZ_ISOTHERMAL, 340.0, 420.0, 5, &tps);
    labels_match_states(sc, tps);
    assert_int_equal(n_het(sc), 1);
    const pw_az_boundary *b = first_het(sc);
    assert_int_equal(b->kind, PW_AZ_BOUNDARY_LINE_ENDS);
    assert_false(b->present_above);
    assert_int_equal(b->end, -1);
    /* the library sees the split up to within 1e-6 K of Tc (its layers then differ by ~1e-4) */
    pw_assert_close(b->at, Tc, 0.0, 1e-6, "T where the layers merge = Tc");
    assert_true(b->bracket[0] <= b->at && b->at <= b->bracket[1]);
    pw_assert_close(b->y3, 0.5, 0.0, 1e-12, "y3 = 1/2");
    free(tps);
    pw_az_scan_free(sc);

    /* the same at fixed pressures: Pc = e^(1/2) Psat(Tc) */
    double Pc = exp(0.5) * 1000.0 * exp(14.0 - 3500.0 / Tc);
    sc = run_scan(&m.s, PW_AZ_ISOBARIC, 0.3 * Pc, 3.0 * Pc, 6, &tps);
    labels_match_states(sc, tps);
    assert_int_equal(n_het(sc), 1);
    b = first_het(sc);
    assert_int_equal(b->kind, PW_AZ_BOUNDARY_LINE_ENDS);
    assert_false(b->present_above);
    pw_assert_close(b->at, Pc, 1e-8, 0.0, "P where the layers merge");
    pw_assert_close(b->T_K, Tc, 0.0, 1e-6, "T3 there = Tc");
    free(tps);
    pw_az_scan_free(sc);
}

/* y3 falls as T rises, the layer x_I rises to 1/2: they meet at T* below Tc. */
static void vapor_meets_layer(void **state)
{
    (void)state;
    /* Tc = 400 K; ln(P1/P2) = -2.787 + 775.9/T: y3 = 0.45 at 300 K, 0.30 at 400 K */
    sym m = make_sym(8.0 / 3.0, 300.0, 12.213, 3224.1, 15.0, 4000.0);
    g_ctx gc = {&m, false, 0.0};
    double Tstar = brent(g_fn, &gc, 300.0, 399.999, 1e-12, 0.0);
    assert_true(Tstar > 310.0 && Tstar < 399.0);
    double xs = sym_layer(m.A0 * m.Tref / Tstar);
    pw_assert_close(sym_y3(&m, Tstar), xs, 0.0, 1e-9, "independent T*: y3 = x_I");
    pw_three_phase *tps;
    pw_az_scan *sc = run_scan(&m.s, PW_AZ_ISOTHERMAL, 300.0, 420.0, 7, &tps);
    labels_match_states(sc, tps);
    assert_int_equal(n_het(sc), 1);
    const pw_az_boundary *b = first_het(sc);
    assert_int_equal(b->kind, PW_AZ_BOUNDARY_VAPOR_AT_LAYER);
    assert_int_equal(b->layer, 0);
    assert_false(b->present_above);
    pw_assert_close(b->at, Tstar, 2e-9, 0.0, "T* (vapor meets the layer x_I)");
    pw_assert_close(b->y3, xs, 0.0, 1e-8, "y3 there");
    pw_assert_close(b->x_layers[0], xs, 0.0, 1e-8, "x_I there");
    free(tps);
    pw_az_scan_free(sc);

    /* at fixed pressures: P* = a(T*) (P1sat + P2sat)(T*); the scan runs downwards */
    double Pstar = sym_P3(&m, Tstar);
    sc = run_scan(&m.s, PW_AZ_ISOBARIC, 4.0 * Pstar, 0.25 * Pstar, 6, &tps);
    labels_match_states(sc, tps);
    assert_int_equal(n_het(sc), 1);
    b = first_het(sc);
    assert_int_equal(b->kind, PW_AZ_BOUNDARY_VAPOR_AT_LAYER);
    assert_int_equal(b->layer, 0);
    assert_false(b->present_above);
    pw_assert_close(b->at, Pstar, 2e-9, 0.0, "P* (vapor meets the layer x_I)");
    pw_assert_close(b->T_K, Tstar, 2e-9, 0.0, "T3 there = T*");
    assert_true(b->bracket[0] < b->bracket[1] && b->bracket[1] - b->bracket[0] < 1e-8 * Pstar);
    free(tps);
    pw_az_scan_free(sc);
}

/* Seeded random symmetric cases against the changes of sign of G found here. */
static void random_symmetric(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    assert_non_null(rng);
    gsl_rng_set(rng, 141414UL);
    size_t n_cases = 0, n_changes = 0, n_layer = 0, n_merge = 0, n_isobaric = 0;
    double dev_layer = 0.0, dev_merge = 0.0; /* largest relative deviations from the roots here */
    for (int it = 0; it < 40; it++) {
        double Tref = 300.0 + 50.0 * gsl_rng_uniform(rng);
        double Tc = 360.0 + 60.0 * gsl_rng_uniform(rng);
        double A0 = 2.0 * Tc / Tref;
        double b2 = 3000.0 + 2000.0 * gsl_rng_uniform(rng);
        double a2 = 10.0 + b2 / 380.0 - 5.0 + 4.0 * gsl_rng_uniform(rng); /* Psat2(380) ~ 1-50 kPa */
        double db = -1500.0 + 3000.0 * gsl_rng_uniform(rng); /* b1 - b2 */
        double lr = -2.0 + 4.0 * gsl_rng_uniform(rng);      /* ln(P1/P2) at 380 K */
        double b1 = b2 + db, a1 = a2 + lr + db / 380.0;
        if (it % 4 == 0) /* y3 = 1/2 = x_c at Tc: the vapor stays between the layers up to Tc */
            a1 = a2 + db / Tc;
        sym m = make_sym(A0, Tref, a1, b1, a2, b2);
        bool isobaric = gsl_rng_uniform(rng) < 0.4;
        size_t n = 3 + gsl_rng_uniform_int(rng, 8);
        double Tlo = Tc - 70.0 + 20.0 * gsl_rng_uniform(rng), Thi = Tc + 5.0 + 20.0 * gsl_rng_uniform(rng);
        g_ctx gc = {&m, isobaric, Tlo - 10.0};
        double from = Tlo, to = Thi;
        if (isobaric) {
            /* P3 must rise with T over the range for the mapping used here: skip cases where not */
            bool rising = true;
            for (double T = Tlo - 10.0; T + 0.5 < Tc && rising; T += 0.5)
                rising = sym_P3(&m, T + 0.5) > sym_P3(&m, T);
            if (!rising)
                continue;
            from = sym_P3(&m, Tlo);
            to = sym_P3(&m, Tc) * (1.5 + gsl_rng_uniform(rng));
            n_isobaric++;
        }
        if (gsl_rng_uniform(rng) < 0.5) {
            double t = from;
            from = to;
            to = t;
        }
        n_cases++;
        pw_three_phase *tps;
        pw_az_scan *sc = run_scan(&m.s, isobaric ? PW_AZ_ISOBARIC : PW_AZ_ISOTHERMAL, from, to, n,
                                  &tps);
        labels_match_states(sc, tps);
        /* labels here and there at every point */
        for (size_t k = 0; k < n; k++) {
            double G = g_fn(sc->at[k], &gc);
            if (fabs(G) < 1e-7)
                continue; /* too close to call */
            bool het = tps[k].exists && tps[k].heterogeneous_azeotrope;
            assert_true(het == (G > 0.0));
        }
        /* every interval: its changes of label, here (a table of G and Brent) and there */
        for (size_t k = 0; k + 1 < n; k++) {
            double lo = fmin(sc->at[k], sc->at[k + 1]), hi = fmax(sc->at[k], sc->at[k + 1]);
            bool l0 = g_fn(sc->at[k], &gc) > 0.0, l1 = g_fn(sc->at[k + 1], &gc) > 0.0;
            size_t found = 0;
            const pw_az_boundary *b = NULL;
            for (size_t j = 0; j < sc->n_boundaries; j++) {
                const pw_az_boundary *c = &sc->boundaries[j];
                if (c->kind != PW_AZ_BOUNDARY_PURE_END && c->at >= lo && c->at <= hi) {
                    found++;
                    b = c;
                }
            }
            assert_int_equal(found, l0 != l1 ? 1 : 0);
            if (!b)
                continue;
            n_changes++;
            assert_true(b->bracket[0] >= lo && b->bracket[1] <= hi);
            assert_true(b->bracket[0] <= b->at && b->at <= b->bracket[1]);
            /* the changes here (a table of G, each change refined by Brent); the nearest one */
            const size_t M = 4000;
            double vprev = lo, gprev = g_fn(lo, &gc), root = NAN;
            for (size_t i = 1; i <= M; i++) {
                double v = lo + (hi - lo) * (double)i / (double)M, g = g_fn(v, &gc);
                if ((gprev > 0.0) != (g > 0.0)) {
                    double r = brent(g_fn, &gc, vprev, v, 0.0, 1e-13);
                    if (isnan(root) || fabs(r - b->at) < fabs(root - b->at))
                        root = r;
                }
                vprev = v;
                gprev = g;
            }
            assert_false(isnan(root));
            double Tc_v = isobaric ? sym_P3(&m, Tc) : Tc;
            bool merge = fabs(root - Tc_v) < 1e-9 * Tc_v;
            if (merge) {
                n_merge++;
                assert_int_equal(b->kind, PW_AZ_BOUNDARY_LINE_ENDS);
                pw_assert_close(b->at, root, 1e-8, 0.0, "critical point");
                dev_merge = fmax(dev_merge, fabs(b->at - root) / root);
            } else {
                n_layer++;
                assert_int_equal(b->kind, PW_AZ_BOUNDARY_VAPOR_AT_LAYER);
                pw_assert_close(b->at, root, 2e-9, 0.0, "vapor meets a layer");
                dev_layer = fmax(dev_layer, fabs(b->at - root) / root);
                /* the event equation on the heterogeneous side of the bracket (its residual is
                 * |dG/dv| times the bracket's width: larger next to a critical point, where
                 * the layers' width changes as the square root of the distance) */
                assert_true(b->layer == 0 ? fabs(b->y3 - b->x_layers[0]) < 1e-6
                                          : fabs(b->y3 - b->x_layers[1]) < 1e-6);
                /* labels here on both sides of the reported bracket differ */
                double w = b->bracket[1] - b->bracket[0] + 1e-6 * fabs(b->at);
                double gl = g_fn(b->at - w, &gc), gh = g_fn(b->at + w, &gc);
                assert_true((gl > 0.0) != (gh > 0.0));
                assert_true(b->present_above == (gh > 0.0));
            }
        }
        free(tps);
        pw_az_scan_free(sc);
    }
    gsl_rng_free(rng);
    print_message("%zu cases (%zu isobaric), %zu changes: %zu vapor at a layer (largest relative "
                  "deviation %.2g), %zu critical (%.2g)\n",
                  n_cases, n_isobaric, n_changes, n_layer, dev_layer, n_merge, dev_merge);
    assert_true(n_cases >= 30 && n_isobaric >= 8 && n_layer >= 10 && n_merge >= 5);
}

/* Seeded random asymmetric Margules: the event equation at the located value. */
static void random_asymmetric(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    assert_non_null(rng);
    gsl_rng_set(rng, 272727UL);
    size_t n_changes = 0;
    for (int it = 0; it < 20; it++) {
        double Tref = 330.0;
        double A12 = 2.2 + 1.2 * gsl_rng_uniform(rng), A21 = 2.2 + 1.2 * gsl_rng_uniform(rng);
        double db = -1200.0 + 2400.0 * gsl_rng_uniform(rng);
        double lr = -1.5 + 3.0 * gsl_rng_uniform(rng);
        double b2 = 4000.0, a2 = 15.0, b1 = b2 + db, a1 = a2 + lr + db / 380.0;
        sym m = make_sym(2.0, Tref, a1, b1, a2, b2);
        m.s.params[0] = A12;
        m.s.params[1] = A21;
        bool isobaric = gsl_rng_uniform(rng) < 0.5;
        size_t n = 4 + gsl_rng_uniform_int(rng, 6);
        double from = isobaric ? 5e3 : 300.0, to = isobaric ? 2e6 : 480.0;
        pw_three_phase *tps;
        pw_az_scan *sc = run_scan(&m.s, isobaric ? PW_AZ_ISOBARIC : PW_AZ_ISOTHERMAL, from, to, n,
                                  &tps);
        labels_match_states(sc, tps);
        size_t changes = 0;
        for (size_t k = 0; k + 1 < n; k++)
            changes += (tps[k].exists && tps[k].heterogeneous_azeotrope) !=
                       (tps[k + 1].exists && tps[k + 1].heterogeneous_azeotrope);
        assert_int_equal(n_het(sc), changes);
        for (size_t j = 0; j < sc->n_boundaries; j++) {
            const pw_az_boundary *b = &sc->boundaries[j];
            if (b->kind == PW_AZ_BOUNDARY_PURE_END)
                continue;
            n_changes++;
            pw_three_phase lo, hi;
            pw_status s1 = isobaric ? pw_three_phase_at_P(&m.s, b->bracket[0], &lo)
                                    : pw_three_phase_at_T(&m.s, b->bracket[0], &lo);
            pw_status s2 = isobaric ? pw_three_phase_at_P(&m.s, b->bracket[1], &hi)
                                    : pw_three_phase_at_T(&m.s, b->bracket[1], &hi);
            assert_int_equal(s1, PW_OK);
            assert_int_equal(s2, PW_OK);
            bool hl = lo.exists && lo.heterogeneous_azeotrope, hh = hi.exists && hi.heterogeneous_azeotrope;
            assert_true(hl != hh);
            assert_true(b->present_above == hh);
            if (b->kind == PW_AZ_BOUNDARY_VAPOR_AT_LAYER) {
                assert_true(b->layer == 0 || b->layer == 1);
                /* the event equation: y3 = x_layer */
                assert_true(fabs(b->y3 - b->x_layers[b->layer]) < 1e-6);
                if (!(b->bracket[1] - b->bracket[0] <= 2e-9 * b->bracket[1]))
                    print_message("at %.17g [%.17g, %.17g] y3 %.9g layers %.9g %.9g lo %d %d %.9g %.9g %.9g hi %d %d %.9g %.9g %.9g\n", b->at, b->bracket[0], b->bracket[1], b->y3, b->x_layers[0], b->x_layers[1], lo.exists, lo.heterogeneous_azeotrope, lo.y1, lo.x[0], lo.x[1], hi.exists, hi.heterogeneous_azeotrope, hi.y1, hi.x[0], hi.x[1]);
                assert_true(b->bracket[1] - b->bracket[0] <= 2e-9 * b->bracket[1]);
            } else {
                assert_int_equal(b->kind, PW_AZ_BOUNDARY_LINE_ENDS);
                assert_false(hl ? hi.exists : lo.exists);
            }
        }
        free(tps);
        pw_az_scan_free(sc);
    }
    gsl_rng_free(rng);
    print_message("%zu changes located\n", n_changes);
    assert_true(n_changes >= 8);
}

/* Margules whose evaluation fails between 381 and 383 K (a stand-in for any failure of the
 * three-phase search inside an interval): a test model. */
static pw_status gap_eval(const double *p, double T_ref_K, double x1, double T_K, pw_activity *out)
{
    if (T_K > 381.0 && T_K < 383.0)
        return PW_EDOM;
    return pw_model_margules.eval(p, T_ref_K, x1, T_K, out);
}

/* A failure inside the interval: the change is still reported, in the narrowest bracket of
 * evaluations with different labels, as not located, and the scan itself succeeds. */
static void failure_inside_interval(void **state)
{
    (void)state;
    sym m = make_sym(8.0 / 3.0, 300.0, 12.213, 3224.1, 15.0, 4000.0);
    pw_model_type gap = pw_model_margules;
    gap.eval = gap_eval;
    m.s.model = &gap;
    g_ctx gc = {&m, false, 0.0};
    double Tstar = brent(g_fn, &gc, 300.0, 399.999, 1e-12, 0.0); /* 381.99 K */
    pw_three_phase *tps;
    pw_az_scan *sc = run_scan(&m.s, PW_AZ_ISOTHERMAL, 300.0, 420.0, 7, &tps);
    assert_int_equal(n_het(sc), 1);
    const pw_az_boundary *b = first_het(sc);
    assert_int_equal(b->kind, PW_AZ_BOUNDARY_NOT_LOCATED);
    assert_int_not_equal(b->status, PW_OK);
    assert_true(isnan(b->at));
    assert_true(b->bracket[0] >= 380.0 && b->bracket[1] <= 400.0);
    assert_true(b->bracket[0] < Tstar && Tstar < b->bracket[1]);
    assert_false(b->present_above);
    free(tps);
    pw_az_scan_free(sc);
}

static void bad_arguments(void **state)
{
    (void)state;
    sym m = make_sym(2.6, 300.0, 14.0, 3500.0, 14.0, 3500.0);
    pw_three_phase tps[3];
    pw_az_scan *sc = pw_az_scan_alloc(3);
    assert_int_equal(pw_azeotrope_scan_heterogeneous(NULL, sc, tps), PW_EINVAL);
    assert_int_equal(pw_azeotrope_scan_heterogeneous(&m.s, NULL, tps), PW_EINVAL);
    assert_int_equal(pw_azeotrope_scan_heterogeneous(&m.s, sc, NULL), PW_EINVAL);
    pw_az_scan_free(sc);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(layers_merge_closed_form),
        cmocka_unit_test(vapor_meets_layer),
        cmocka_unit_test(random_symmetric),
        cmocka_unit_test(random_asymmetric),
        cmocka_unit_test(failure_inside_interval),
        cmocka_unit_test(bad_arguments),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
