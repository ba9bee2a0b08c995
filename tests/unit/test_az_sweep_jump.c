/* The heterogeneous sweep's "line jumps" kind (PW_AZ_BOUNDARY_LINE_JUMPS,
 * src/analysis/az_scan_het.c): a model with two separate two-liquid regions at one temperature.
 *
 * The case: NRTL (Renon & Prausnitz 1968, AIChE J. 14:135) with dg12 = 1639.2 K,
 * dg21 = 1888.0 K, alpha = 0.409, and two invented components whose vapor pressures keep the
 * ratio P1sat/P2sat = 1/2 at every temperature. At each temperature from 350 to 410 K the liquid
 * splits twice: a region poor in component 1 (layers near 0.003 and 0.38, pair A) and one rich in
 * it (near 0.61 and 0.99, pair B), each a common tangent of Gmix/RT on the lower convex hull. The
 * three-phase state at fixed T (pw_three_phase_at_T) is that of the wider pair
 * (include/pinchwise/lle.h): B below T* and A above it, where the two widths are equal. With the
 * vapor-pressure ratio 1/2, A's vapor lies between A's layers (a heterogeneous azeotrope) and
 * B's vapor lies below both of B's layers (no azeotrope), so the label changes at T* and the
 * distance of the vapor from the layers jumps there: both lines go on through T*, neither ends
 * and on neither does the vapor reach a layer.
 *
 * Checks, with their sources (all computed here, not by the library's solvers):
 *  - NRTL ln gamma_i and Gmix/RT from the published equations (Renon & Prausnitz 1968), the two
 *    pairs from equal activities of both components in both layers (METHODS2 2.2, the phase
 *    equilibrium condition) by GSL's hybrid solver from fixed starts, one per branch;
 *  - both pairs are stable at T*: Gmix/RT lies nowhere below either common tangent (the
 *    tangent-plane condition, Michelsen 1982) on 40,000 points;
 *  - T* by GSL Brent on width(A) - width(B); y3 = a1 P1sat / (a1 P1sat + a2 P2sat) (modified
 *    Raoult's law at the three-phase condition, METHODS2 3.2) on each branch;
 *  - the scan over temperature reports one change, of kind "line jumps", at T*, with pair A on
 *    its heterogeneous side; the library's three-phase states at the two ends of its bracket are
 *    pair B and pair A as solved here;
 *  - the scan over pressure of the same model: at fixed P the three-phase search follows the
 *    wider pair's P3(T), which jumps at T* from P3_B to P3_A; between those pressures it finds no
 *    three-phase state and fails, so the change is reported as not located (PW_ENOCONV) in a
 *    bracket that holds [P3_B(T*), P3_A(T*)] (the behaviour documented in docs/heterogeneous.md
 *    section 2).
 * The parameters and vapor-pressure constants are a model case, not data. */
#include "pw_test.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_multiroots.h>
#include <gsl/gsl_roots.h>
#include <gsl/gsl_vector.h>
#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/lle.h>
#include <stdlib.h>
#include <string.h>

#define DG12 1639.2
#define DG21 1888.0
#define ALPHA 0.409
/* ln(Psat_i / kPa) = A_i - B / T: the ratio P1sat/P2sat = exp(A1 - A2) = 1/2 */
#define A2 14.8
#define A1 (14.8 - 0.69314718055994531) /* ln 2 */
#define B_K 4000.0

/* ---- NRTL, written here ---- */

static void nrtl_lngamma(double x1, double T, double lng[2])
{
    double x2 = 1.0 - x1, t12 = DG12 / T, t21 = DG21 / T;
    double G12 = exp(-ALPHA * t12), G21 = exp(-ALPHA * t21);
    double d1 = x1 + x2 * G21, d2 = x2 + x1 * G12;
    lng[0] = x2 * x2 * (t21 * (G21 / d1) * (G21 / d1) + t12 * G12 / (d2 * d2));
    lng[1] = x1 * x1 * (t12 * (G12 / d2) * (G12 / d2) + t21 * G21 / (d1 * d1));
}

static double gmix(double x1, double T)
{
    double x2 = 1.0 - x1, t12 = DG12 / T, t21 = DG21 / T;
    double G12 = exp(-ALPHA * t12), G21 = exp(-ALPHA * t21);
    return x1 * log(x1) + x2 * log(x2) +
           x1 * x2 * (t21 * G21 / (x1 + x2 * G21) + t12 * G12 / (x2 + x1 * G12));
}

/* ln a_i = ln x_i + ln gamma_i */
static void ln_act(double x1, double T, double la[2])
{
    double g[2];
    nrtl_lngamma(x1, T, g);
    la[0] = log(x1) + g[0];
    la[1] = log1p(-x1) + g[1];
}

static double logistic(double u) { return 1.0 / (1.0 + exp(-u)); }

typedef struct {
    double T;
} eq_ctx;

/* equal activities in the two layers, in logit variables */
static int eq_f(const gsl_vector *v, void *p, gsl_vector *f)
{
    double T = ((const eq_ctx *)p)->T;
    double la[2], lb[2];
    ln_act(logistic(gsl_vector_get(v, 0)), T, la);
    ln_act(logistic(gsl_vector_get(v, 1)), T, lb);
    gsl_vector_set(f, 0, la[0] - lb[0]);
    gsl_vector_set(f, 1, la[1] - lb[1]);
    return GSL_SUCCESS;
}

typedef struct {
    double x[2]; /* layers, x[0] < x[1] */
    double la[2];
} pair;

/* The pair of one branch at T from fixed starts (the branch's layers near 370 K). */
static pair solve_pair(double T, double x_lo, double x_hi)
{
    eq_ctx c = {T};
    gsl_multiroot_function F = {eq_f, 2, &c};
    gsl_vector *v = gsl_vector_alloc(2);
    assert_non_null(v);
    gsl_vector_set(v, 0, log(x_lo / (1.0 - x_lo)));
    gsl_vector_set(v, 1, log(x_hi / (1.0 - x_hi)));
    gsl_multiroot_fsolver *s = gsl_multiroot_fsolver_alloc(gsl_multiroot_fsolver_hybrids, 2);
    assert_non_null(s);
    assert_int_equal(gsl_multiroot_fsolver_set(s, &F, v), GSL_SUCCESS);
    int st = GSL_CONTINUE;
    for (int it = 0; it < 500 && st == GSL_CONTINUE; it++) {
        if (gsl_multiroot_fsolver_iterate(s) != GSL_SUCCESS)
            break;
        st = gsl_multiroot_test_residual(s->f, 1e-14);
    }
    assert_int_equal(st, GSL_SUCCESS);
    pair p;
    p.x[0] = logistic(gsl_vector_get(s->x, 0));
    p.x[1] = logistic(gsl_vector_get(s->x, 1));
    gsl_multiroot_fsolver_free(s);
    gsl_vector_free(v);
    assert_true(p.x[1] - p.x[0] > 0.1); /* not the trivial solution */
    ln_act(p.x[0], T, p.la);
    return p;
}

static pair pair_A(double T) { return solve_pair(T, 0.003, 0.38); }
static pair pair_B(double T) { return solve_pair(T, 0.61, 0.99); }

static double psat_Pa(double A, double T) { return 1000.0 * exp(A - B_K / T); }

static double y3_of(const pair *p, double T)
{
    double p1 = exp(p->la[0]) * psat_Pa(A1, T), p2 = exp(p->la[1]) * psat_Pa(A2, T);
    return p1 / (p1 + p2);
}

static double P3_of(const pair *p, double T)
{
    return exp(p->la[0]) * psat_Pa(A1, T) + exp(p->la[1]) * psat_Pa(A2, T);
}

/* G = min(y3 - x_I, x_II - y3): positive when the vapor lies between the layers */
static double G_of(const pair *p, double T)
{
    double y = y3_of(p, T);
    return fmin(y - p->x[0], p->x[1] - y);
}

static double width_diff(double T, void *unused)
{
    (void)unused;
    pair a = pair_A(T), b = pair_B(T);
    return (a.x[1] - a.x[0]) - (b.x[1] - b.x[0]);
}

static double T_star(void)
{
    gsl_function F = {width_diff, NULL};
    gsl_root_fsolver *rs = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    assert_non_null(rs);
    assert_true(width_diff(365.0, NULL) < 0.0 && width_diff(395.0, NULL) > 0.0);
    assert_int_equal(gsl_root_fsolver_set(rs, &F, 365.0, 395.0), GSL_SUCCESS);
    double r = NAN;
    for (int it = 0; it < 200; it++) {
        gsl_root_fsolver_iterate(rs);
        r = gsl_root_fsolver_root(rs);
        if (gsl_root_test_interval(gsl_root_fsolver_x_lower(rs), gsl_root_fsolver_x_upper(rs),
                                   1e-11, 0.0) == GSL_SUCCESS)
            break;
    }
    gsl_root_fsolver_free(rs);
    return r;
}

/* Smallest height of Gmix/RT above the line through the pair's layers, on 40,000 points
 * (uniform, and geometric towards both ends). */
static double tangent_plane_min(const pair *p, double T)
{
    double g0 = gmix(p->x[0], T), g1 = gmix(p->x[1], T);
    double m = (g1 - g0) / (p->x[1] - p->x[0]), lo = INFINITY;
    for (int k = 1; k < 40000; k++) {
        double x = k < 20000 ? (double)k / 20000.0 : 0.0;
        if (k >= 20000) { /* 1e-12 .. 1e-2 from either end */
            int j = k - 20000;
            double e = pow(10.0, -12.0 + 10.0 * (double)(j / 2) / 9999.0);
            x = j % 2 ? 1.0 - e : e;
        }
        lo = fmin(lo, gmix(x, T) - (g0 + m * (x - p->x[0])));
    }
    return lo;
}

static pw_system make_system(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = pw_test_antoine("one (invented)", A1, B_K, 0.0, PW_LN, "kPa", "K", NAN, NAN);
    s.comp[1] = pw_test_antoine("two (invented)", A2, B_K, 0.0, PW_LN, "kPa", "K", NAN, NAN);
    s.model = &pw_model_nrtl;
    s.params[0] = DG12;
    s.params[1] = DG21;
    s.params[2] = ALPHA;
    s.T_ref_K = 350.0;
    return s;
}

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

static const pw_az_boundary *only_het(const pw_az_scan *sc)
{
    const pw_az_boundary *b = NULL;
    size_t n = 0;
    for (size_t k = 0; k < sc->n_boundaries; k++)
        if (sc->boundaries[k].kind != PW_AZ_BOUNDARY_PURE_END) {
            b = &sc->boundaries[k];
            n++;
        }
    assert_int_equal(n, 1);
    return b;
}

/* The two branches, computed here: why the line jumps. */
static void two_branches(void **state)
{
    (void)state;
    double Ts = T_star();
    assert_true(Ts > 370.0 && Ts < 390.0);
    pair a = pair_A(Ts), b = pair_B(Ts);
    pw_assert_close(a.x[1] - a.x[0], b.x[1] - b.x[0], 0.0, 1e-10, "equal widths at T*");
    /* two separate regions, both stable: neither line ends at T* */
    assert_true(a.x[1] < 0.5 && b.x[0] > 0.5);
    assert_true(tangent_plane_min(&a, Ts) > -1e-10);
    assert_true(tangent_plane_min(&b, Ts) > -1e-10);
    for (double dT = -5.0; dT <= 5.0; dT += 10.0) {
        pair a2 = pair_A(Ts + dT), b2 = pair_B(Ts + dT);
        assert_true(fabs(a2.x[0] - a.x[0]) < 0.01 && fabs(b2.x[1] - b.x[1]) < 0.01);
    }
    /* A's vapor between its layers, B's below both of B's: the vapor is far from a layer on
     * both sides, the distance jumps by far more than the scan's threshold */
    double GA = G_of(&a, Ts), GB = G_of(&b, Ts);
    assert_true(GA > 0.05);
    assert_true(GB < -0.1 && y3_of(&b, Ts) < b.x[0]);
    /* the library's states at T* -+ 0.5 K: the wider pair, B below T* and A above */
    pw_system s = make_system();
    pw_three_phase lo, hi;
    assert_int_equal(pw_three_phase_at_T(&s, Ts - 0.5, &lo), PW_OK);
    assert_int_equal(pw_three_phase_at_T(&s, Ts + 0.5, &hi), PW_OK);
    pair bl = pair_B(Ts - 0.5), ah = pair_A(Ts + 0.5);
    pw_assert_close(lo.x[0], bl.x[0], 0.0, 1e-8, "below T*: pair B, x_I");
    pw_assert_close(lo.x[1], bl.x[1], 0.0, 1e-8, "below T*: pair B, x_II");
    pw_assert_close(hi.x[0], ah.x[0], 0.0, 1e-8, "above T*: pair A, x_I");
    pw_assert_close(hi.x[1], ah.x[1], 0.0, 1e-8, "above T*: pair A, x_II");
    assert_false(lo.heterogeneous_azeotrope);
    assert_true(hi.heterogeneous_azeotrope);
}

/* The scan over temperature: one change, "line jumps", at T*. */
static void sweep_over_T(void **state)
{
    (void)state;
    double Ts = T_star();
    pw_system s = make_system();
    pw_three_phase *tps;
    pw_az_scan *sc = run_scan(&s, PW_AZ_ISOTHERMAL, 350.0, 410.0, 4, &tps);
    for (size_t k = 0; k < sc->n_points; k++) {
        assert_true(tps[k].exists);
        assert_true(tps[k].heterogeneous_azeotrope == (sc->at[k] > Ts));
    }
    const pw_az_boundary *b = only_het(sc);
    assert_int_equal(b->kind, PW_AZ_BOUNDARY_LINE_JUMPS);
    assert_int_equal(b->status, PW_OK);
    assert_true(b->present_above);
    assert_int_equal(b->layer, -1);
    assert_int_equal(b->end, -1);
    pw_assert_close(b->at, Ts, 0.0, 1e-6, "T* where the wider pair changes");
    assert_true(b->bracket[0] <= b->at && b->at <= b->bracket[1]);
    assert_true(b->bracket[0] - 1e-8 <= Ts && Ts <= b->bracket[1] + 1e-8);
    assert_true(b->bracket[1] - b->bracket[0] < 1e-6);
    /* the heterogeneous side is pair A */
    pair a = pair_A(b->bracket[1]);
    pw_assert_close(b->x_layers[0], a.x[0], 0.0, 1e-8, "x_I on the heterogeneous side");
    pw_assert_close(b->x_layers[1], a.x[1], 0.0, 1e-8, "x_II on the heterogeneous side");
    pw_assert_close(b->y3, y3_of(&a, b->bracket[1]), 0.0, 1e-8, "y3 on the heterogeneous side");
    /* the other end of the bracket is pair B, as solved here */
    pw_three_phase tb;
    assert_int_equal(pw_three_phase_at_T(&s, b->bracket[0], &tb), PW_OK);
    pair pb = pair_B(b->bracket[0]);
    pw_assert_close(tb.x[0], pb.x[0], 0.0, 1e-8, "pair B at the bracket's lower end");
    pw_assert_close(tb.x[1], pb.x[1], 0.0, 1e-8, "pair B there, x_II");
    free(tps);
    pw_az_scan_free(sc);

    /* downwards, with another number of points: the same change */
    sc = run_scan(&s, PW_AZ_ISOTHERMAL, 405.0, 355.0, 7, &tps);
    b = only_het(sc);
    assert_int_equal(b->kind, PW_AZ_BOUNDARY_LINE_JUMPS);
    assert_true(b->present_above);
    pw_assert_close(b->at, Ts, 0.0, 1e-6, "T* (downward scan)");
    free(tps);
    pw_az_scan_free(sc);
}

/* The scan over pressure: the wider pair's P3 jumps at T*, no three-phase state in between. */
static void sweep_over_P(void **state)
{
    (void)state;
    double Ts = T_star();
    pair a = pair_A(Ts), b = pair_B(Ts);
    double PB = P3_of(&b, Ts), PA = P3_of(&a, Ts);
    assert_true(PB < 0.95 * PA); /* a gap of pressures: about 91.1 to 97.0 kPa */
    pw_system s = make_system();
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&s, 0.5 * (PA + PB), &tp), PW_ENOCONV);
    pw_three_phase *tps;
    pw_az_scan *sc = run_scan(&s, PW_AZ_ISOBARIC, 20e3, 200e3, 5, &tps);
    const pw_az_boundary *bd = only_het(sc);
    assert_int_equal(bd->kind, PW_AZ_BOUNDARY_NOT_LOCATED);
    assert_int_equal(bd->status, PW_ENOCONV);
    assert_true(isnan(bd->at));
    assert_true(bd->present_above);
    assert_true(bd->bracket[0] <= PB * (1.0 + 1e-9) && bd->bracket[1] >= PA * (1.0 - 1e-9));
    free(tps);
    pw_az_scan_free(sc);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(two_branches),
        cmocka_unit_test(sweep_over_T),
        cmocka_unit_test(sweep_over_P),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
