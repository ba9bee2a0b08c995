/* Seeded randomised check of the column solve with the curve's slope (pw_column_solve_dy: the
 * coarse table with slopes, the derivative-root refinement of tangent points, Newton stage
 * inversion) against computations written here, independent of the library's search:
 *   - R_min and the pinch from a dense scan of both sections' limiting values on a 20,001-point
 *     grid of [xb, xd], each refined by golden-section search in the grid cells beside the best
 *     grid point (McCabe & Thiele 1925: R_min is where an operating line first touches y*(x);
 *     the rectifying line through (xd, xd), the stripping line through (xb, xb));
 *   - N_min and the design rows by stepping written here, each stage's liquid found by
 *     bisection on y*(x) - y to 1e-15;
 *   - everything also against the solve without the slope (the fixed-table search), whose
 *     feasibility verdicts and flow limits it must repeat.
 * Systems: real components of the shipped library (Antoine rows) with random Margules, van
 * Laar, Wilson and NRTL parameters (the library's model forms), 1 atm; specifications drawn
 * inside a region where y* > x, often right beside an azeotrope (1e-2 ... 1e-5 away) or near a
 * pure product, random feed and q. Systems whose liquid splits are skipped (the single column
 * does not apply there). The slope itself is checked against a central difference.
 * Agreement demanded: R_min 1e-9 relative (the search's rtol is 1e-10). */
#include "pw_test.h"

#include "analysis/column_internal.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/column.h>
#include <pinchwise/component.h>
#include <pinchwise/curve.h>
#include <pinchwise/equilibrium.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define N_CASES 300
#define DENSE 20000
#define SCAN 400

static pw_complib lib;

static double curve_y(pw_system_curve *sc, double x)
{
    double y;
    pw_status st = pw_system_curve_y(sc, x, &y);
    assert_int_equal(st, PW_OK);
    return y;
}

/* the value maximised: rectifying (xd - y)/(xd - x), stripping (xb - y)/(x - xb) */
static double value(pw_system_curve *sc, const pw_column_spec *s, bool rect, double x)
{
    double y = curve_y(sc, x);
    return rect ? (s->xd - y) / (s->xd - x) : (s->xb - y) / (x - s->xb);
}

/* golden-section maximum of the value on [a, b] */
static double golden(pw_system_curve *sc, const pw_column_spec *s, bool rect, double a, double b,
                     double *x_at)
{
    const double g = 0.5 * (sqrt(5.0) - 1.0);
    double c = b - g * (b - a), d = a + g * (b - a);
    double fc = value(sc, s, rect, c), fd = value(sc, s, rect, d);
    while (b - a > 1e-13) {
        if (fc > fd) {
            b = d;
            d = c;
            fd = fc;
            c = b - g * (b - a);
            fc = value(sc, s, rect, c);
        } else {
            a = c;
            c = d;
            fc = fd;
            d = a + g * (b - a);
            fd = value(sc, s, rect, d);
        }
    }
    *x_at = fc > fd ? c : d;
    return fmax(fc, fd);
}

/* max of the value over [lo, hi] (the pole excluded) by the dense grid and golden refinement of
 * the best grid point's cells; the end x_end (the q-line point) is a candidate itself. */
static double dense_max(pw_system_curve *sc, const pw_column_spec *s, bool rect, double lo,
                        double hi, double *x_at)
{
    size_t ibest = 0;
    double vbest = -INFINITY;
    double *v = malloc((DENSE + 1) * sizeof *v);
    assert_non_null(v);
    for (size_t i = 0; i <= DENSE; i++) {
        double x = lo + (hi - lo) * (double)i / DENSE;
        if ((rect && i == DENSE) || (!rect && i == 0)) {
            v[i] = -INFINITY; /* the pole */
            continue;
        }
        v[i] = value(sc, s, rect, x);
        if (v[i] > vbest) {
            vbest = v[i];
            ibest = i;
        }
    }
    *x_at = lo + (hi - lo) * (double)ibest / DENSE;
    double best = vbest;
    for (int side = -1; side <= 1; side += 2) {
        long j = (long)ibest + side;
        if (j < 0 || j > DENSE || !isfinite(v[j]))
            continue;
        double a = lo + (hi - lo) * (double)(side < 0 ? j : (long)ibest) / DENSE;
        double b = lo + (hi - lo) * (double)(side < 0 ? (long)ibest : j) / DENSE;
        double xg, vg = golden(sc, s, rect, a, b, &xg);
        if (vg > best) {
            best = vg;
            *x_at = xg;
        }
    }
    free(v);
    return best;
}

/* x*(y) by bisection on [0, 1] (y*(0) = 0 < y < 1 = y*(1) for a stable liquid) */
static double x_of_y(pw_system_curve *sc, double y)
{
    double a = 0.0, b = 1.0;
    while (b - a > 1e-15) {
        double m = 0.5 * (a + b);
        if (curve_y(sc, m) < y)
            a = m;
        else
            b = m;
    }
    return 0.5 * (a + b);
}

/* Stages from the top at R (total: the diagonal), fractional last step, partial reboiler; the
 * definition of docs/column.md section 4. NAN beyond 500 stages. */
static double step(pw_system_curve *sc, const pw_column_spec *s, bool total, double R)
{
    double m = 1.0, sl = 1.0, xi = 0.0;
    if (!total) {
        double D = (s->zf - s->xb) / (s->xd - s->xb), B = 1.0 - D;
        double S = ((R + 1.0) * D - (1.0 - s->q)) / B;
        m = R / (R + 1.0);
        sl = (S + 1.0) / S;
        xi = ((1.0 - m) * s->xd + (sl - 1.0) * s->xb) / (sl - m);
    }
    double x_prev = s->xd, y = s->xd;
    bool below = false;
    for (int n = 1; n <= 500; n++) {
        double x = x_of_y(sc, y);
        if (x <= s->xb)
            return (double)(n - 1) + (x_prev - s->xb) / (x_prev - x);
        if (total)
            y = x;
        else {
            if (!below && x < xi)
                below = true;
            y = below ? sl * x - (sl - 1.0) * s->xb : m * x + (1.0 - m) * s->xd;
        }
        x_prev = x;
    }
    return NAN;
}

typedef struct pair {
    const char *a, *b;
} pair;

static const pair pairs[] = {{"acetone", "water"},     {"methanol", "water"},
                             {"ethanol", "water"},     {"benzene", "toluene"},
                             {"acetone", "methanol"},  {"n-hexane", "n-heptane"},
                             {"methyl acetate", "methanol"}, {"chloroform", "acetone"}};

static void random_model(gsl_rng *r, pw_system *s)
{
    switch (gsl_rng_uniform_int(r, 4)) {
    case 0:
        s->model = &pw_model_margules;
        s->params[0] = -0.8 + 2.6 * gsl_rng_uniform(r);
        s->params[1] = -0.8 + 2.6 * gsl_rng_uniform(r);
        break;
    case 1: {
        s->model = &pw_model_vanlaar;
        double sg = gsl_rng_uniform(r) < 0.8 ? 1.0 : -1.0;
        s->params[0] = sg * (0.05 + 2.0 * gsl_rng_uniform(r));
        s->params[1] = sg * (0.05 + 2.0 * gsl_rng_uniform(r));
        break;
    }
    case 2:
        s->model = &pw_model_wilson;
        s->params[0] = -300.0 + 1300.0 * gsl_rng_uniform(r);
        s->params[1] = -300.0 + 1300.0 * gsl_rng_uniform(r);
        s->params[2] = 0.5 + 1.5 * gsl_rng_uniform(r);
        break;
    default:
        s->model = &pw_model_nrtl;
        s->params[0] = -300.0 + 1100.0 * gsl_rng_uniform(r);
        s->params[1] = -300.0 + 1100.0 * gsl_rng_uniform(r);
        s->params[2] = 0.2 + 0.27 * gsl_rng_uniform(r);
        break;
    }
}

/* A region [A, B] where y* > x with component 1 the lighter, from a scan of [0, 1]; false when
 * none is wide enough or the liquid is not stable (y* not increasing). */
static bool light_region(pw_system_curve *sc, gsl_rng *r, double *A, double *B)
{
    double f[SCAN + 1], yprev = -1.0;
    for (int i = 0; i <= SCAN; i++) {
        double x = (double)i / SCAN, y;
        if (pw_system_curve_y(sc, x, &y) != PW_OK || !(y > yprev))
            return false;
        yprev = y;
        f[i] = y - x;
    }
    /* intervals of f > 0 between sign changes; pick one at random */
    double lo[SCAN], hi[SCAN];
    int n = 0, i = 1;
    while (i < SCAN) {
        if (f[i] > 0.0) {
            int j = i;
            while (j + 1 < SCAN && f[j + 1] > 0.0)
                j++;
            lo[n] = (double)(i - 1) / SCAN;
            hi[n] = (double)(j + 1) / SCAN;
            n++;
            i = j + 1;
        } else {
            i++;
        }
    }
    if (n == 0)
        return false;
    int k = (int)gsl_rng_uniform_int(r, (unsigned long)n);
    *A = lo[k];
    *B = hi[k];
    return *B - *A > 0.05;
}

/* the region's end, pushed to where y* - x changes sign (an azeotrope), or a pure component */
static double edge(pw_system_curve *sc, double inside, double outside)
{
    if (outside <= 0.0 || outside >= 1.0)
        return outside <= 0.0 ? 0.0 : 1.0;
    for (int it = 0; it < 200 && fabs(outside - inside) > 1e-15; it++) {
        double m = 0.5 * (inside + outside);
        if (curve_y(sc, m) - m > 0.0)
            inside = m;
        else
            outside = m;
    }
    return inside;
}

static void random_against_dense(void **state)
{
    (void)state;
    gsl_rng *r = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(r, 20261202UL);
    int cases = 0, tangent = 0, beside = 0, pure = 0, flow = 0, infeasible = 0, tries = 0;
    unsigned long ev_slope = 0, ev_table = 0;
    double worst_r = 0.0, worst_n = 0.0, worst_d = 0.0, worst_slope = 0.0;
    char worst_what[200] = "";
    while (cases < N_CASES) {
        assert_true(++tries < 40 * N_CASES);
        const pair *p = &pairs[gsl_rng_uniform_int(r, sizeof pairs / sizeof pairs[0])];
        pw_system s;
        memset(&s, 0, sizeof s);
        s.comp[0] = *pw_complib_find(&lib, p->a);
        s.comp[1] = *pw_complib_find(&lib, p->b);
        s.T_ref_K = 340.0;
        random_model(r, &s);
        double minD, xmin;
        if (pw_stability_min(&s, 330.0, &minD, &xmin) != PW_OK || minD < 0.0)
            continue; /* the liquid splits (or may): the single column does not apply */
        pw_system_curve sc;
        assert_int_equal(pw_system_curve_init(&sc, &s, 101325.0), PW_OK);
        double A, B;
        if (!light_region(&sc, r, &A, &B))
            continue;
        A = edge(&sc, A + 1.0 / SCAN, A);
        B = edge(&sc, B - 1.0 / SCAN, B);
        /* the slope against a central difference at a random point */
        {
            double x = A + (B - A) * (0.1 + 0.8 * gsl_rng_uniform(r)), y, d, yp, ym, hh = 1e-6;
            assert_int_equal(pw_system_curve_y_dy(&sc, x, &y, &d), PW_OK);
            assert_true(y == curve_y(&sc, x)); /* the same point to the bit */
            yp = curve_y(&sc, x + hh);
            ym = curve_y(&sc, x - hh);
            double fd = (yp - ym) / (2.0 * hh), e = fabs(d - fd) / fmax(1.0, fabs(d));
            worst_slope = fmax(worst_slope, e);
            assert_true(e < 1e-6);
        }
        pw_column_spec sp;
        int kind = (int)gsl_rng_uniform_int(r, 3);
        double w = B - A;
        double dist = pow(10.0, -2.0 - 3.0 * gsl_rng_uniform(r));
        sp.xd = B - (kind == 0 ? dist : w * (0.02 + 0.3 * gsl_rng_uniform(r)));
        sp.xb = A + (kind == 1 ? dist : w * (0.02 + 0.3 * gsl_rng_uniform(r)));
        if (!(sp.xd - sp.xb > 0.05 * w))
            continue;
        sp.zf = sp.xb + (sp.xd - sp.xb) * (0.1 + 0.8 * gsl_rng_uniform(r));
        sp.q = gsl_rng_uniform(r) < 0.3 ? 1.0 : -0.3 + 1.8 * gsl_rng_uniform(r);

        pw_column_options o = pw_column_default_options();
        pw_column_result a, b;
        pw_curve c = pw_system_curve_bind(&sc);
        unsigned long e0 = sc.n_eval;
        pw_status sa = pw_column_solve_dy(&c, pw_system_curve_dy(&sc), &sp, &o, &a);
        unsigned long e1 = sc.n_eval;
        pw_status sb = pw_column_solve(&c, &sp, &o, &b);
        unsigned long e2 = sc.n_eval;
        assert_int_equal(sa, sb);
        assert_int_equal(a.feasible, b.feasible);
        if (sa != PW_OK || !a.feasible) {
            infeasible++;
            cases++;
            continue;
        }
        ev_slope += e1 - e0;
        ev_table += e2 - e1;
        char what[200];
        snprintf(what, sizeof what, "case %d (%s/%s, %s, xb %.17g xd %.17g zf %.17g q %.17g)",
                 cases, p->a, p->b, s.model->name, sp.xb, sp.xd, sp.zf, sp.q);
        /* the solve without the slope */
        pw_assert_close(a.r_min, b.r_min, 1e-9, 1e-12, what);
        assert_int_equal(a.boilup_limited, b.boilup_limited);
        assert_int_equal(a.reflux_limited, b.reflux_limited);
        assert_int_equal(a.pinch.kind, b.pinch.kind);
        assert_int_equal(a.pinch.section, b.pinch.section);
        if (a.boilup_limited || a.reflux_limited || !isfinite(a.x_q)) {
            flow++;
            cases++;
            continue;
        }
        /* the dense scan: the rectifying section over [x_q, xd], the stripping over [xb, x_q] */
        double xr, xs;
        double m = dense_max(&sc, &sp, true, a.x_q, sp.xd, &xr);
        double ns = dense_max(&sc, &sp, false, sp.xb, a.x_q, &xs); /* -s */
        double D = (sp.zf - sp.xb) / (sp.xd - sp.xb), Bf = 1.0 - D;
        double r_rect = m / (1.0 - m), S = 1.0 / (-ns - 1.0);
        double r_strip = (S * Bf + (1.0 - sp.q)) / D - 1.0;
        double r_dense = fmax(r_rect, r_strip);
        if (!(r_dense > 0.0)) {
            flow++;
            cases++;
            continue;
        }
        double er = fabs(a.r_min - r_dense) / r_dense;
        if (er > worst_r)
            snprintf(worst_what, sizeof worst_what, "%s", what);
        worst_r = fmax(worst_r, er);
        pw_assert_close(a.r_min, r_dense, 1e-9, 0.0, what);
        double x_dense = r_rect >= r_strip ? xr : xs;
        bool feed = fabs(r_dense - a.r_feed) <= 1e-7 * fmax(1.0, a.r_feed);
        assert_int_equal(a.pinch.kind, feed ? PW_PINCH_FEED : PW_PINCH_TANGENT);
        if (!feed) {
            tangent++;
            assert_true(fabs(a.pinch.x - x_dense) <= 1e-4);
        }
        beside += kind == 0 || kind == 1;
        pure += B == 1.0 || A == 0.0;
        /* N_min and the design rows by the stepping written here */
        if (a.n_min_status == PW_OK) {
            double n = step(&sc, &sp, true, 0.0);
            if (isfinite(n)) {
                worst_n = fmax(worst_n, fabs(a.n_min - n));
                pw_assert_close(a.n_min, n, 1e-6, 1e-6, what);
            }
        }
        for (size_t i = 0; i < a.n_design; i++) {
            assert_int_equal(a.design[i].status, b.design[i].status);
            if (a.design[i].status != PW_OK)
                continue;
            double n = step(&sc, &sp, false, a.design[i].R);
            if (!isfinite(n))
                continue;
            worst_d = fmax(worst_d, fabs(a.design[i].stages - n));
            pw_assert_close(a.design[i].stages, n, 1e-6, 1e-6, what);
            assert_int_equal(a.design[i].feed_stage, b.design[i].feed_stage);
        }
        cases++;
    }
    printf("# %d cases (%d tangent pinches, %d beside an azeotrope or a pure end, %d flow-limited, "
           "%d infeasible) in %d tries; worst: R_min %.2g relative, N_min %.2g, design %.2g "
           "stages, slope %.2g; curve evaluations %lu with the slope, %lu without\n",
           cases, tangent, beside, flow, infeasible, tries, worst_r, worst_n, worst_d, worst_slope,
           ev_slope, ev_table);
    printf("# worst R_min: %s\n", worst_what);
    (void)pure;
    assert_true(tangent >= 20);
    assert_true(ev_slope < ev_table);
    gsl_rng_free(r);
}

/* Invented curve (constant alpha 2.5 with a narrow dip towards the diagonal, Gaussian, width
 * 0.02 at x = 0.6, half a cell of the default 25-point table): the dip's convex middle makes a
 * rectifying tangent pinch that the unrefined table does not resolve. Value and slope in closed
 * form. */
typedef struct dip {
    double alpha, A, c, w;
} dip;

static void dip_eval(const dip *d, double x, double *y, double *dy)
{
    double den = 1.0 + (d->alpha - 1.0) * x, z = (x - d->c) / d->w, g = d->A * exp(-z * z);
    *y = d->alpha * x / den - g;
    *dy = d->alpha / (den * den) + g * 2.0 * z / d->w;
}

static pw_status dip_y(void *ctx, double x, double *y)
{
    double dy;
    dip_eval(ctx, x, y, &dy);
    return PW_OK;
}

static pw_status dip_y_dy(void *ctx, double x, double *y, double *dy)
{
    dip_eval(ctx, x, y, dy);
    return PW_OK;
}

/* Constant alpha 30 (y = alpha x/(1 + (alpha - 1) x)) with xb = 0.005: y*'' falls from about
 * -1200 at xb to -30 within a few cells, the one-sided estimates of the 25-point table disagree
 * there, and the table is refined beside xb only. R_min for a saturated-liquid feed at constant
 * alpha (a feed pinch): R_min = [xd/zf - alpha (1 - xd)/(1 - zf)]/(alpha - 1) (Underwood 1948;
 * King, Separation Processes, 2nd ed., ch. 5; from memory). */
static void refined_table_steep_end(void **state)
{
    (void)state;
    dip d = {30.0, 0.0, 0.5, 1.0};
    pw_curve c = {dip_y, &d};
    pw_column_spec sp = {.xd = 0.99, .xb = 0.005, .zf = 0.5, .q = 1.0};
    pw_column_ws w;
    assert_int_equal(pw_column_ws_init(&w, &c, 1e-10), PW_OK);
    w.dy = dip_y_dy;
    double x[264], y[264], dd[264];
    size_t n = 0;
    assert_int_equal(pw_column_tabulate_dy(&w, sp.xb, sp.xd, 25, 264, x, y, dd, &n), PW_OK);
    assert_true(n > 25);
    size_t added_low = 0;
    for (size_t i = 0; i < n; i++)
        added_low += x[i] < 0.2;
    assert_true(added_low >= n - 25 + 4); /* 0.005 ... 0.2 holds 4 or 5 of the 25 points */
    for (size_t i = 1; i + 1 < n; i++) {
        double hl = x[i] - x[i - 1], hr = x[i + 1] - x[i];
        double sl = (y[i] - y[i - 1]) / hl, sr = (y[i + 1] - y[i]) / hr;
        double cl = (2.0 * dd[i - 1] + 4.0 * dd[i] - 6.0 * sl) / hl;
        double cr = (6.0 * sr - 4.0 * dd[i] - 2.0 * dd[i + 1]) / hr;
        if (x[i + 1] - x[i - 1] > 4.0 * (sp.xd - sp.xb) / 4096.0)
            assert_true(fmax(cl, cr) + fabs(cl - cr) <= w.conv_bound);
    }
    pw_column_result a;
    pw_column_options o = pw_column_default_options();
    assert_int_equal(pw_column_solve_dy(&c, dip_y_dy, &sp, &o, &a), PW_OK);
    const double al = d.alpha;
    double r = (sp.xd / sp.zf - al * (1.0 - sp.xd) / (1.0 - sp.zf)) / (al - 1.0);
    pw_assert_close(a.r_min, r, 1e-10, 0.0, "alpha 30: R_min vs Underwood");
    assert_int_equal(a.pinch.kind, PW_PINCH_FEED);
    printf("# alpha 30: table %zu points (%zu below x = 0.2)\n", n, added_low);
}

static void refined_table_against_dense(void **state)
{
    (void)state;
    dip d = {2.5, 0.12, 0.6, 0.02};
    pw_curve c = {dip_y, &d};
    pw_column_spec sp = {.xd = 0.95, .xb = 0.05, .zf = 0.3, .q = 1.0};
    /* the table refines beside the dip, and the criterion holds on the result */
    pw_column_ws w;
    assert_int_equal(pw_column_ws_init(&w, &c, 1e-10), PW_OK);
    w.dy = dip_y_dy;
    double x[264], y[264], dd[264];
    size_t n = 0;
    assert_int_equal(pw_column_tabulate_dy(&w, sp.xb, sp.xd, 25, 264, x, y, dd, &n), PW_OK);
    for (size_t i = 1; i + 1 < n; i++) {
        double hl = x[i] - x[i - 1], hr = x[i + 1] - x[i];
        double sl = (y[i] - y[i - 1]) / hl, sr = (y[i + 1] - y[i]) / hr;
        double cl = (2.0 * dd[i - 1] + 4.0 * dd[i] - 6.0 * sl) / hl;
        double cr = (6.0 * sr - 4.0 * dd[i] - 2.0 * dd[i + 1]) / hr;
        assert_true(fmax(cl, cr) + fabs(cl - cr) <= w.conv_bound);
    }
    /* R_min against a dense scan of m* = (xd - y)/(xd - x) on [zf, xd) (q = 1), golden-refined */
    pw_column_result a, b;
    pw_column_options o = pw_column_default_options();
    assert_int_equal(pw_column_solve_dy(&c, dip_y_dy, &sp, &o, &a), PW_OK);
    assert_int_equal(pw_column_solve(&c, &sp, &o, &b), PW_OK);
    const int N = 200000;
    double best = -INFINITY, xbest = 0.0;
    for (int i = 0; i < N; i++) {
        double xx = sp.zf + (sp.xd - sp.zf) * i / N, yy;
        dip_y(&d, xx, &yy);
        double m = (sp.xd - yy) / (sp.xd - xx);
        if (m > best) {
            best = m;
            xbest = xx;
        }
    }
    double lo = xbest - (sp.xd - sp.zf) / N, hi = xbest + (sp.xd - sp.zf) / N;
    const double g = 0.5 * (sqrt(5.0) - 1.0);
    while (hi - lo > 1e-13) {
        double c1 = hi - g * (hi - lo), c2 = lo + g * (hi - lo), y1, y2;
        dip_y(&d, c1, &y1);
        dip_y(&d, c2, &y2);
        if ((sp.xd - y1) / (sp.xd - c1) > (sp.xd - y2) / (sp.xd - c2))
            hi = c2;
        else
            lo = c1;
    }
    double yy;
    dip_y(&d, 0.5 * (lo + hi), &yy);
    best = fmax(best, (sp.xd - yy) / (sp.xd - 0.5 * (lo + hi)));
    double r_dense = best / (1.0 - best);
    assert_int_equal(a.pinch.kind, PW_PINCH_TANGENT);
    pw_assert_close(a.r_min, r_dense, 1e-9, 0.0, "dip: R_min with the slope vs dense");
    pw_assert_close(b.r_min, r_dense, 1e-9, 0.0, "dip: R_min without the slope vs dense");
    pw_assert_close(a.pinch.x, 0.5 * (lo + hi), 0.0, 1e-5, "dip: pinch x");
    pw_assert_close(a.n_min, b.n_min, 1e-9, 1e-9, "dip: N_min with and without the slope");
    for (size_t i = 0; i < a.n_design; i++)
        pw_assert_close(a.design[i].stages, b.design[i].stages, 1e-9, 1e-9, "dip: design row");
    printf("# dip: table %zu points, K %.4g; R_min %.17g (dense %.17g) at x %.6f\n", n,
           w.conv_bound, a.r_min, r_dense, a.pinch.x);
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
        cmocka_unit_test(refined_table_steep_end),
        cmocka_unit_test(refined_table_against_dense),
        cmocka_unit_test(random_against_dense),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
