/* What to draw (src/analysis/drawing_*.c, include/pinchwise/drawing.h), checked by identities
 * and against independent computations:
 *  - the staircase: every corner lies on the equilibrium curve or on an operating line (the
 *    rectifying line above the feed stage, the stripping line below), in both split directions;
 *    its stage count and feed stage equal the column module's (pw_column_step_any) and, on a
 *    constant-relative-volatility curve, an independent McCabe-Thiele stepping written here with
 *    the closed-form inverse x = y / (alpha - (alpha - 1) y) (McCabe & Thiele 1925);
 *  - the pinch lies on the curve and on the operating lines at R_min; R_min equals Underwood's
 *    (1948) closed form for a saturated-liquid feed, x_pinch = zF (a feed pinch), and the
 *    enlarged window holds it;
 *  - the curves equal pw_bubble_T / pw_dew_T / pw_bubble_P at sampled points; the azeotropes
 *    have y = x at their bubble point;
 *  - liquids that split: the bubble curve is flat at the three-phase temperature between the
 *    layers, every binodal pair has equal activities of both components, the decanter's two
 *    stripping staircases lie on the curve and on y = x + (x - xB)/S and count what
 *    pw_stripper_stages counts;
 *  - seeded random specifications (100 on constant-alpha curves) for the stepping identities.
 * The ideal systems' Antoine constants are invented for the tests (design_systems.h); the
 * butanol/water NRTL set is the one of test_decanter.c (METHODS2 4.5, not a published set). */
#include "design_systems.h"
#include "pw_test.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/component.h>
#include <pinchwise/curve.h>
#include <pinchwise/drawing.h>
#include <stdlib.h>
#include <string.h>

static const double P_TEST = 101325.0;

/* The curve of s at P through the column adapter (what the column module steps on). */
static double curve_y(const pw_system *s, double P, double x)
{
    pw_eq_point e;
    assert_int_equal(pw_bubble_T(s, P, x, &e), PW_OK);
    return e.y1;
}

/* Every corner of a single-column staircase on the curve or on its operating line. */
static void check_single_stairs(const pw_system *s, const pw_draw_column *d, double tol)
{
    const pw_draw_stairs *st = &d->stairs;
    const pw_column_spec *sp = &d->spec;
    const double R = d->r_op;
    assert_int_equal(st->status, PW_OK);
    assert_true(st->n >= 3);
    assert_false(st->truncated);
    pw_assert_close(st->x[0], sp->xd, 0.0, 1e-15, "staircase starts at xD");
    pw_assert_close(st->y[0], sp->xd, 0.0, 1e-15, "staircase starts on the diagonal");
    /* the meeting point of the operating lines (the same in either frame) */
    double xi = ((R + 1.0) * sp->zf + (sp->q - 1.0) * sp->xd) / (R + sp->q);
    double yi = (R * xi + sp->xd) / (R + 1.0);
    for (size_t i = 1; i < st->n; i++) {
        if (i % 2 == 1) { /* (x_n, y_{n-1}): liquid leaving stage n, on the curve */
            pw_assert_close(curve_y(s, d->P_Pa, st->x[i]), st->y[i], 0.0, tol, "corner on curve");
            pw_assert_close(st->y[i], st->y[i - 1], 0.0, 0.0, "horizontal step");
        } else {          /* (x_n, y_n): vapor from below, on an operating line */
            int stage = (int)(i / 2);
            double x = st->x[i];
            double y_rect = (R * x + sp->xd) / (R + 1.0);
            double y_strip = sp->xb + (yi - sp->xb) / (xi - sp->xb) * (x - sp->xb);
            double want = stage < st->feed_stage ? y_rect : y_strip;
            pw_assert_close(st->y[i], want, 0.0, 1e-12, "corner on the operating line");
            pw_assert_close(st->x[i], st->x[i - 1], 0.0, 0.0, "vertical step");
        }
    }
    /* the last liquid is at or beyond the bottoms target */
    double last = st->x[st->n - 1];
    assert_true(sp->xd > sp->xb ? last <= sp->xb + 1e-12 : last >= sp->xb - 1e-12);
    /* stages as the column module counts them */
    pw_system_curve sc;
    assert_int_equal(pw_system_curve_init(&sc, s, d->P_Pa), PW_OK);
    pw_curve c = pw_system_curve_bind(&sc);
    double n;
    int feed;
    assert_int_equal(pw_column_step_any(&c, sp, R, 500, &n, &feed), PW_OK);
    pw_assert_close(st->stages, n, 1e-12, 0.0, "stages equal the column module's");
    assert_int_equal(st->feed_stage, feed);
    /* one horizontal and one vertical step per whole stage, the last one fractional */
    assert_int_equal((int)st->n, 2 * (int)ceil(n));
}

/* McCabe-Thiele stepping on y = a x / (1 + (a - 1) x) with the closed-form inverse, optimal feed
 * stage, fractional last step, overhead direction (independent of the library). */
static double crv_stages(double a, const pw_column_spec *sp, double R, int *feed_stage)
{
    double xi = ((R + 1.0) * sp->zf + (sp->q - 1.0) * sp->xd) / (R + sp->q);
    double yi = (R * xi + sp->xd) / (R + 1.0);
    double y = sp->xd, xprev = sp->xd;
    int feed = 0;
    for (int n = 1; n < 1000; n++) {
        double x = design_crv_x(a, y);
        if (x <= sp->xb) {
            *feed_stage = feed ? feed : n;
            return (n - 1) + (xprev - sp->xb) / (xprev - x);
        }
        if (!feed && x < xi)
            feed = n;
        y = feed ? sp->xb + (yi - sp->xb) / (xi - sp->xb) * (x - sp->xb) : (R * x + sp->xd) / (R + 1.0);
        xprev = x;
    }
    return NAN;
}

static void staircase_constant_alpha(void **state)
{
    (void)state;
    const double a = 2.5;
    pw_system s = design_ideal_system(a);
    pw_column_spec sp = {.xd = 0.95, .xb = 0.05, .zf = 0.4, .q = 1.0};
    pw_draw_column d;
    assert_int_equal(pw_draw_column_compute(&s, P_TEST, &sp, 1.3, NULL, &d), PW_OK);
    assert_true(d.drawn);
    assert_false(d.hetero_blocked);
    /* R_min: Underwood (1948), saturated liquid feed on a constant-alpha curve */
    double rmin;
    assert_int_equal(pw_underwood_rmin(a, sp.zf, sp.xd, 1.0, &rmin), PW_OK);
    pw_assert_close(d.col.r_min, rmin, 1e-7, 0.0, "R_min (Underwood 1948)");
    pw_assert_close(d.r_op, 1.3 * d.col.r_min, 1e-15, 0.0, "operating R");
    /* the pinch: on the curve, on both operating lines at R_min, at the feed */
    assert_int_equal(d.col.pinch.kind, PW_PINCH_FEED);
    pw_assert_close(d.col.pinch.x, sp.zf, 0.0, 1e-7, "feed pinch at zF");
    pw_assert_close(d.col.pinch.y, design_crv_y(a, d.col.pinch.x), 0.0, 1e-7, "pinch on the curve");
    pw_assert_close(d.op_min_y[1], (d.col.r_min * d.op_min_x[1] + sp.xd) / (d.col.r_min + 1.0),
                    0.0, 1e-14, "meeting point on the rectifying line");
    pw_assert_close(d.op_min_x[1], d.col.pinch.x, 0.0, 1e-7, "the lines meet at the pinch");
    /* q = 1: a vertical q-line from (zF, zF) to the curve */
    pw_assert_close(d.qline_x[1], sp.zf, 0.0, 1e-12, "vertical q-line");
    pw_assert_close(d.qline_y[1], design_crv_y(a, sp.zf), 0.0, 1e-7, "q-line ends on the curve");
    /* the window holds the pinch */
    assert_true(d.zoom_x[0] < d.col.pinch.x && d.col.pinch.x < d.zoom_x[1]);
    assert_true(d.zoom_y[0] < d.col.pinch.y && d.col.pinch.y < d.zoom_y[1]);
    check_single_stairs(&s, &d, 1e-8);
    int feed;
    double n = crv_stages(a, &sp, d.r_op, &feed);
    pw_assert_close(d.stairs.stages, n, 1e-6, 0.0, "stages (independent McCabe-Thiele stepping)");
    assert_int_equal(d.stairs.feed_stage, feed);
}

/* Component 1 to the bottoms (alpha < 1): stepped in the mirrored frame, drawn in fractions of
 * component 1. */
static void staircase_bottoms_direction(void **state)
{
    (void)state;
    const double a = 0.4;
    pw_system s = design_ideal_system(a);
    pw_column_spec sp = {.xd = 0.05, .xb = 0.95, .zf = 0.6, .q = 1.0};
    pw_draw_column d;
    assert_int_equal(pw_draw_column_compute(&s, P_TEST, &sp, 1.5, NULL, &d), PW_OK);
    assert_true(d.drawn);
    check_single_stairs(&s, &d, 1e-8);
    /* the mirrored problem is the overhead one with alpha' = 1/a */
    pw_column_spec m = {1.0 - sp.xd, 1.0 - sp.xb, 1.0 - sp.zf, sp.q};
    int feed;
    double n = crv_stages(1.0 / a, &m, d.r_op, &feed);
    pw_assert_close(d.stairs.stages, n, 1e-6, 0.0, "stages, component 1 to the bottoms");
}

static void staircase_random(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261202UL);
    for (int k = 0; k < 100; k++) {
        double a = 1.5 + 3.0 * gsl_rng_uniform(rng);
        double xb = 0.01 + 0.2 * gsl_rng_uniform(rng);
        double xd = 0.75 + 0.24 * gsl_rng_uniform(rng);
        double zf = xb + (xd - xb) * (0.2 + 0.6 * gsl_rng_uniform(rng));
        double q = 0.2 + 1.0 * gsl_rng_uniform(rng);
        double factor = 1.1 + 0.9 * gsl_rng_uniform(rng);
        pw_system s = design_ideal_system(a);
        pw_column_spec sp = {xd, xb, zf, q};
        pw_draw_column d;
        assert_int_equal(pw_draw_column_compute(&s, P_TEST, &sp, factor, NULL, &d), PW_OK);
        if (!d.drawn)
            continue;
        if (d.stairs.status != PW_OK || d.stairs.truncated)
            continue;
        check_single_stairs(&s, &d, 1e-8);
        int feed;
        double n = crv_stages(a, &sp, d.r_op, &feed);
        pw_assert_close(d.stairs.stages, n, 1e-6, 0.0, "random case: independent stepping");
    }
    gsl_rng_free(rng);
}

static void curves_equal_bubble_points(void **state)
{
    (void)state;
    pw_system s = design_ideal_system(2.0);
    s.params[0] = 1.2; /* a positive deviation: an azeotrope near the middle */
    s.params[1] = 1.2;
    pw_draw_phase ph;
    assert_int_equal(pw_draw_phase_compute(&s, false, P_TEST, &ph), PW_OK);
    assert_int_equal(ph.n_failed, 0);
    for (size_t k = 0; k < PW_DRAW_GRID; k += 8) {
        pw_eq_point e, w;
        assert_int_equal(pw_bubble_T(&s, P_TEST, ph.x[k], &e), PW_OK);
        pw_assert_close(ph.bub_T[k], e.T_K, 1e-12, 0.0, "bubble T");
        pw_assert_close(ph.bub_y[k], e.y1, 0.0, 1e-12, "bubble y");
        assert_int_equal(pw_dew_T(&s, P_TEST, ph.x[k], &w), PW_OK);
        pw_assert_close(ph.dew_T[k], w.T_K, 1e-12, 0.0, "dew T");
        pw_assert_close(pw_draw_grid_x(k), ph.x[k], 0.0, 0.0, "grid");
    }
    pw_assert_close(ph.x[0], 0.0, 0.0, 0.0, "grid starts at 0");
    pw_assert_close(ph.x[PW_DRAW_GRID - 1], 1.0, 0.0, 0.0, "grid ends at 1");
    /* the azeotropes: y = x at their bubble point, and those of the azeotrope module */
    pw_az_result az;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOBARIC, P_TEST, NULL, &az), PW_OK);
    assert_int_equal(ph.az.status, PW_OK);
    assert_int_equal(ph.az.n, az.n);
    assert_true(ph.az.n >= 1);
    for (size_t i = 0; i < ph.az.n; i++) {
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(&s, P_TEST, ph.az.az[i].x1, &e), PW_OK);
        pw_assert_close(e.y1, ph.az.az[i].x1, 0.0, 1e-7, "azeotrope: y = x");
        pw_assert_close(e.T_K, ph.az.az[i].T_K, 0.0, 1e-6, "azeotrope temperature");
        assert_true(ph.az.az[i].min_boiling);
        assert_false(ph.az.az[i].heterogeneous);
    }
    assert_false(ph.az.three_phase.exists);
    assert_int_equal(ph.n_binodal, 0);
    /* the column curve */
    pw_draw_xy xy;
    assert_int_equal(pw_draw_xy_compute(&s, 80000.0, &xy), PW_OK);
    for (size_t k = 0; k < PW_DRAW_GRID; k += 10)
        pw_assert_close(xy.y[k], curve_y(&s, 80000.0, xy.x[k]), 0.0, 1e-12, "x-y curve");
    /* isothermal: bubble pressures */
    assert_int_equal(pw_draw_phase_compute(&s, true, 340.0, &ph), PW_OK);
    for (size_t k = 0; k < PW_DRAW_GRID; k += 16) {
        pw_eq_point e;
        assert_int_equal(pw_bubble_P(&s, 340.0, ph.x[k], &e), PW_OK);
        pw_assert_close(ph.bub_P[k], e.P_Pa, 1e-12, 0.0, "bubble P");
    }
    /* the window beside a band of curves */
    double x[11], y[11];
    assert_int_equal(pw_draw_curve_window(&s, P_TEST, 0.2, 0.4, 11, x, y), PW_OK);
    pw_assert_close(x[10], 0.4, 0.0, 1e-15, "window end");
    pw_assert_close(y[5], curve_y(&s, P_TEST, x[5]), 0.0, 1e-12, "window curve");
}

static void refusals(void **state)
{
    (void)state;
    pw_system s = design_ideal_system(2.0);
    pw_draw_phase ph;
    pw_draw_xy xy;
    pw_draw_column d;
    pw_column_spec sp = {.xd = 0.9, .xb = 0.1, .zf = 0.5, .q = 1.0};
    assert_int_equal(pw_draw_phase_compute(&s, false, -1.0, &ph), PW_EINVAL);
    assert_int_equal(pw_draw_phase_compute(NULL, false, P_TEST, &ph), PW_EINVAL);
    assert_int_equal(pw_draw_xy_compute(&s, NAN, &xy), PW_EINVAL);
    assert_int_equal(pw_draw_column_compute(&s, P_TEST, &sp, 1.0, NULL, &d), PW_EINVAL);
    pw_column_spec bad = {.xd = 0.9, .xb = 0.1, .zf = 0.95, .q = 1.0};
    assert_int_equal(pw_draw_column_compute(&s, P_TEST, &bad, 1.3, NULL, &d), PW_EINVAL);
    double x[2], y[2];
    assert_int_equal(pw_draw_curve_window(&s, P_TEST, 0.5, 0.4, 2, x, y), PW_EINVAL);
    /* an azeotrope between the targets: infeasible, nothing drawn, not an error */
    s.params[0] = s.params[1] = 1.2;
    assert_int_equal(pw_draw_column_compute(&s, P_TEST, &sp, 1.3, NULL, &d), PW_OK);
    assert_false(d.col.feasible);
    assert_false(d.drawn);
    assert_int_equal(d.stairs.n, 0);
}

static pw_complib lib;

static pw_system butanol_water(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *pw_complib_find(&lib, "1-butanol");
    s.comp[1] = *pw_complib_find(&lib, "water");
    s.model = &pw_model_nrtl;
    s.params[0] = 360.0; /* METHODS2 4.5: not a published set */
    s.params[1] = 1296.0;
    s.params[2] = 0.47;
    s.T_ref_K = 360.0;
    return s;
}

static void split_liquids_and_decanter(void **state)
{
    (void)state;
    pw_system s = butanol_water();
    pw_draw_phase ph;
    assert_int_equal(pw_draw_phase_compute(&s, false, P_TEST, &ph), PW_OK);
    const pw_three_phase *tp = &ph.az.three_phase;
    assert_true(tp->exists);
    assert_true(tp->heterogeneous_azeotrope);
    /* flat bubble curve between the layers, at the three-phase temperature and vapor */
    size_t inside = 0;
    for (size_t k = 0; k < PW_DRAW_GRID; k++)
        if (ph.x[k] > tp->x[0] && ph.x[k] < tp->x[1]) {
            pw_assert_close(ph.bub_T[k], tp->T_K, 0.0, 0.0, "flat bubble curve");
            pw_assert_close(ph.bub_y[k], tp->y1, 0.0, 0.0, "three-phase vapor");
            inside++;
        }
    assert_true(inside > 10);
    /* the heterogeneous azeotrope is the one drawn */
    bool het = false;
    for (size_t i = 0; i < ph.az.n; i++)
        het = het || (ph.az.az[i].heterogeneous && ph.az.az[i].x1 == tp->y1);
    assert_true(het);
    /* binodal: equal activities of both components in both layers */
    assert_int_equal(ph.n_binodal, PW_DRAW_BINODAL);
    size_t pairs = 0;
    for (size_t i = 0; i < ph.n_binodal; i++) {
        if (!isfinite(ph.bin_x[0][i]))
            continue;
        pw_activity a1, a2;
        assert_int_equal(pw_system_activity(&s, ph.bin_x[0][i], ph.bin_T[i], &a1), PW_OK);
        assert_int_equal(pw_system_activity(&s, ph.bin_x[1][i], ph.bin_T[i], &a2), PW_OK);
        double xI = ph.bin_x[0][i], xII = ph.bin_x[1][i];
        pw_assert_close(log(xI) + a1.lngamma[0], log(xII) + a2.lngamma[0], 0.0, 1e-7, "ln a1");
        pw_assert_close(log1p(-xI) + a1.lngamma[1], log1p(-xII) + a2.lngamma[1], 0.0, 1e-7, "ln a2");
        assert_true(xI < xII);
        pairs++;
    }
    assert_true(pairs > PW_DRAW_BINODAL / 2);

    /* targets across the heterogeneous azeotrope: the decanter scheme is drawn */
    pw_column_spec sp = {.xd = 0.001, .xb = 0.995, .zf = 0.2, .q = 1.0};
    pw_draw_column d;
    assert_int_equal(pw_draw_column_compute(&s, P_TEST, &sp, 1.3, NULL, &d), PW_OK);
    assert_true(d.hetero_blocked);
    assert_false(d.col.feasible);
    assert_false(d.drawn);
    const pw_draw_decanter *k = &d.decanter;
    assert_int_equal(k->status, PW_OK);
    assert_true(k->res.feasible);
    pw_system_curve sc;
    assert_int_equal(pw_system_curve_init(&sc, &s, P_TEST), PW_OK);
    pw_curve c = pw_system_curve_bind(&sc);
    const double bottoms[2] = {0.995, 0.001};
    for (int j = 0; j < 2; j++) {
        const pw_draw_stairs *st = &k->stairs[j];
        double S = k->boilup[j], xB = bottoms[j];
        pw_assert_close(S, 1.3 * k->res.col[j].boilup_min, 1e-15, 0.0, "boil-up drawn");
        assert_int_equal(st->status, PW_OK);
        assert_true(st->n >= 2);
        pw_assert_close(st->x[0], k->res.top_x1[j], 0.0, 0.0, "starts at the layer");
        for (size_t i = 0; i < st->n; i++) {
            if (i % 2 == 0) /* on the operating line */
                pw_assert_close(st->y[i], st->x[i] + (st->x[i] - xB) / S, 0.0, 1e-12,
                                "stripper corner on its operating line");
            else            /* on the curve */
                pw_assert_close(curve_y(&s, P_TEST, st->x[i]), st->y[i], 0.0, 1e-8,
                                "stripper corner on the curve");
        }
        pw_stripper_spec cs = {k->res.top_x1[j], xB};
        double n;
        assert_int_equal(pw_stripper_stages(&c, &cs, S, 500, &n), PW_OK);
        pw_assert_close(st->stages, n, 1e-12, 0.0, "stripper stages equal the module's");
        pw_assert_close(k->op_y[j][0], k->op_x[j][0] + (k->op_x[j][0] - xB) / S, 0.0, 1e-15,
                        "operating line top");
        /* the enlarged view's window holds every corner and both ends of the operating line,
         * inside [0, 1], with room around them */
        const double *wx = k->zoom_x[j], *wy = k->zoom_y[j];
        assert_true(wx[0] >= 0.0 && wx[1] <= 1.0 && wx[0] < wx[1]);
        assert_true(wy[0] >= 0.0 && wy[1] <= 1.0 && wy[0] < wy[1]);
        for (size_t i = 0; i < st->n; i++) {
            assert_true(st->x[i] >= wx[0] && st->x[i] <= wx[1]);
            assert_true(st->y[i] >= wy[0] && st->y[i] <= wy[1]);
        }
        for (int e = 0; e < 2; e++) {
            assert_true(k->op_x[j][e] >= wx[0] && k->op_x[j][e] <= wx[1]);
            assert_true(k->op_y[j][e] >= wy[0] && k->op_y[j][e] <= wy[1]);
        }
    }
    /* column B runs from the lean layer (x1 about 0.02) to 0.001: its window is a few hundredths
     * wide, an enlargement of at least 20 times in x over the full square */
    assert_true(k->zoom_x[1][1] - k->zoom_x[1][0] < 0.05);
}

/* A search already made (pw_azeotrope_search at the same condition, as the ranking makes it)
 * gives the same drawing, bit for bit, as the drawing's own search: homogeneous (the Margules
 * system above) and split liquids (butanol/water: the y = x crossing inside the two-liquid region
 * is dropped by both, the heterogeneous azeotrope drawn by both). */
static void known_azeotropes_give_the_same_drawing(void **state)
{
    (void)state;
    pw_system sys[2] = {design_ideal_system(2.0), butanol_water()};
    sys[0].params[0] = sys[0].params[1] = 1.2;
    for (int i = 0; i < 2; i++) {
        pw_az_result known;
        pw_three_phase tp;
        assert_int_equal(pw_azeotrope_search(&sys[i], PW_AZ_ISOBARIC, P_TEST, &known, &tp, NULL,
                                             NULL),
                         PW_OK);
        assert_true(known.n + (tp.exists && tp.heterogeneous_azeotrope) >= 1);
        pw_draw_phase *a = malloc(sizeof *a), *b = malloc(sizeof *b);
        assert_non_null(a);
        assert_non_null(b);
        assert_int_equal(pw_draw_phase_compute(&sys[i], false, P_TEST, a), PW_OK);
        assert_int_equal(pw_draw_phase_compute_known(&sys[i], false, P_TEST, &known, NULL, b),
                         PW_EINVAL); /* both searches' results, or neither */
        assert_int_equal(pw_draw_phase_compute_known(&sys[i], false, P_TEST, &known, &tp, b),
                         PW_OK);
        assert_int_equal(a->az.n, b->az.n);
        for (size_t k = 0; k < a->az.n; k++) {
            assert_true(a->az.az[k].x1 == b->az.az[k].x1);
            assert_true(a->az.az[k].T_K == b->az.az[k].T_K);
            assert_int_equal(a->az.az[k].heterogeneous, b->az.az[k].heterogeneous);
        }
        assert_int_equal(a->az.three_phase.exists, b->az.three_phase.exists);
        assert_true(a->az.three_phase.T_K == b->az.three_phase.T_K ||
                    (!a->az.three_phase.exists && !b->az.three_phase.exists));
        for (size_t k = 0; k < PW_DRAW_GRID; k++) {
            assert_memory_equal(&a->bub_T[k], &b->bub_T[k], sizeof(double));
            assert_memory_equal(&a->dew_T[k], &b->dew_T[k], sizeof(double));
        }
        free(a);
        free(b);
    }
}

static int setup(void **state)
{
    (void)state;
    return pw_test_read_complib(&lib);
}

static int teardown(void **state)
{
    (void)state;
    pw_complib_free(&lib);
    return 0;
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(staircase_constant_alpha),
        cmocka_unit_test(staircase_bottoms_direction),
        cmocka_unit_test(staircase_random),
        cmocka_unit_test(curves_equal_bubble_points),
        cmocka_unit_test(known_azeotropes_give_the_same_drawing),
        cmocka_unit_test(refusals),
        cmocka_unit_test(split_liquids_and_decanter),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
