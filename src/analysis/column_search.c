/* The limiting slope of one column section by a search that cannot miss a pinch (under the stated
 * bound on the curve's convexity): the tabulated curve gives a coarse bracket, every cell of it -
 * the cells at the product end and at the q-line end included - is bounded from above, cells whose
 * bound exceeds the best value found are halved until the bound falls below it, and GSL Brent
 * (base/solve1d) refines every local maximum met on the way. See docs/column.md, section 3.
 *
 * The branch and bound itself (pw_section_maximise) works through a seam of callbacks (sample,
 * value, cell bound, tolerance, coarse points; column_internal.h), so that the energy-balance
 * column (column_energy.c) runs the same proof on its tie-line values. */
#include "analysis/column_internal.h"
#include "base/solve1d.h"

#include <float.h>
#include <math.h>
#include <stdbool.h>
#include <stdlib.h>

#define CONV_SAFETY 4.0    /* K = 4 x the largest second difference of the table ... */
#define CONV_FLOOR 1e-6    /* ... plus this (a straight table still gets a bound) */
#define STACK_MAX 256      /* depth-first cells pending; the depth is at most ~50 halvings */
#define MAX_RESTARTS 8     /* K raised when a midpoint shows more convexity than K allows */
#define MAX_EVALS 20000    /* per section: a safety net, far above any case met */
#define MIN_CELL_REL 1e-13 /* cells narrower than this (relative to xd - xb) are not halved */
#define MIN_MAX_ITER 100

/* The curvature estimates of the cubic Hermite interpolant of the cell [x0, x1] (values and
 * slopes at both ends) at its two ends: the straight line through them is the linear function with
 * the same integral and first moment over the cell as y*'' itself. */
static void hermite_curv(double x0, double y0, double d0, double x1, double y1, double d1,
                         double *c0, double *c1)
{
    const double h = x1 - x0, sl = (y1 - y0) / h;
    *c0 = (6.0 * sl - 4.0 * d0 - 2.0 * d1) / h;
    *c1 = (2.0 * d0 + 4.0 * d1 - 6.0 * sl) / h;
}

static double hermite_bound(const double *x, const double *y, const double *d, size_t n)
{
    double cmax = 0.0;
    for (size_t j = 0; j + 1 < n; j++) {
        double c0, c1;
        hermite_curv(x[j], y[j], d[j], x[j + 1], y[j + 1], d[j + 1], &c0, &c1);
        cmax = fmax(cmax, fmax(c0, c1));
    }
    return CONV_SAFETY * cmax + CONV_FLOOR;
}

#define REFINE_ROUNDS 16
#define REFINE_MIN_REL (1.0 / 4096.0) /* cells narrower than this (of xd - xb) are not halved */

pw_status pw_column_tabulate_dy(pw_column_ws *w, double xb, double xd, size_t n0, size_t cap,
                                double *x, double *y, double *d, size_t *n_out)
{
    if (n0 < 3 || cap < n0 || !w->dy)
        return PW_EINVAL;
    size_t n = n0;
    for (size_t j = 0; j < n; j++) {
        x[j] = j + 1 == n ? xd : xb + (xd - xb) * (double)j / (double)(n - 1);
        pw_status st = pw_column_y_dy(w, x[j], &y[j], &d[j]);
        if (st != PW_OK)
            return st;
    }
    const double min_w = REFINE_MIN_REL * (xd - xb);
    for (int round = 0; round < REFINE_ROUNDS; round++) {
        const double K = hermite_bound(x, y, d, n);
        /* Point i (interior) is resolved when its two one-sided estimates cL, cR of y*'' satisfy
         * max(cL, cR) + |cL - cR| <= K; else both cells beside it are halved (not below min_w).
         * The table then grows in place from the right. */
        bool *split = calloc(n, sizeof *split);
        if (!split)
            return PW_ENOMEM;
        size_t n_split = 0;
        for (size_t i = 1; i + 1 < n; i++) {
            double a0, a1, b0, b1;
            hermite_curv(x[i - 1], y[i - 1], d[i - 1], x[i], y[i], d[i], &a0, &a1);
            hermite_curv(x[i], y[i], d[i], x[i + 1], y[i + 1], d[i + 1], &b0, &b1);
            if (fmax(a1, b0) + fabs(a1 - b0) > K) {
                split[i - 1] = true;
                split[i] = true;
            }
        }
        for (size_t j = 0; j + 1 < n; j++)
            if (split[j] && !(x[j + 1] - x[j] > 2.0 * min_w))
                split[j] = false;
        for (size_t j = 0; j + 1 < n; j++)
            n_split += split[j];
        if (n_split == 0 || n + n_split > cap) {
            free(split);
            break; /* resolved, or the table is full (the search's midpoint checks remain) */
        }
        size_t k = n + n_split; /* new count */
        size_t dst = k;
        pw_status st = PW_OK;
        for (size_t jj = n; jj-- > 0 && st == PW_OK;) {
            /* point jj, and before it the midpoint of cell jj - 1 when halved */
            dst--;
            x[dst] = x[jj];
            y[dst] = y[jj];
            d[dst] = d[jj];
            if (jj > 0 && split[jj - 1]) {
                dst--;
                x[dst] = x[jj - 1] + 0.5 * (x[jj] - x[jj - 1]);
                st = pw_column_y_dy(w, x[dst], &y[dst], &d[dst]);
            }
        }
        free(split);
        if (st != PW_OK)
            return st;
        n = k;
    }
    *n_out = n;
    w->conv_bound = hermite_bound(x, y, d, n);
    return PW_OK;
}

void pw_column_set_conv_bound(pw_column_ws *w)
{
    if (w->tab_d) {
        w->conv_bound = hermite_bound(w->tab_x, w->tab_y, w->tab_d, w->tab_n);
        return;
    }
    double d2max = 0.0;
    const double *x = w->tab_x, *y = w->tab_y;
    for (size_t j = 1; j + 1 < w->tab_n; j++) {
        double s1 = (y[j] - y[j - 1]) / (x[j] - x[j - 1]);
        double s2 = (y[j + 1] - y[j]) / (x[j + 1] - x[j]);
        double d2 = 2.0 * (s2 - s1) / (x[j + 1] - x[j - 1]);
        if (d2 > d2max)
            d2max = d2;
    }
    w->conv_bound = CONV_SAFETY * d2max + CONV_FLOOR;
}

void pw_section_conv_init(pw_section_fn *f, size_t n, const double *floor)
{
    for (size_t k = 0; k < f->nq; k++) {
        double d2max = 0.0;
        pw_section_pt p0, p1, p2;
        if (n >= 3) {
            f->point(f->ctx, 0, &p0);
            f->point(f->ctx, 1, &p1);
        }
        for (size_t j = 1; j + 1 < n; j++) {
            f->point(f->ctx, j + 1, &p2);
            double s1 = (p1.q[k] - p0.q[k]) / (p1.x - p0.x);
            double s2 = (p2.q[k] - p1.q[k]) / (p2.x - p1.x);
            double d2 = 2.0 * (s2 - s1) / (p2.x - p0.x);
            if (f->two_sided)
                d2 = fabs(d2);
            if (d2 > d2max)
                d2max = d2;
            p0 = p1;
            p1 = p2;
        }
        f->K[k] = CONV_SAFETY * d2max + floor[k];
    }
}

/* ---- the engine ---- */

typedef struct bb {
    pw_section_fn *f;
    double best;
    pw_section_pt at;
    bool end;     /* the end candidate is the best */
    bool restart; /* a K was raised: search again */
    /* the best point the current Brent run has seen */
    pw_section_pt brent_pt;
    double brent_v;
} bb;

typedef struct cell {
    pw_section_pt a, b;
} cell;

static double val(const bb *c, const pw_section_pt *p)
{
    return c->f->value(c->f->ctx, p->x, p->q);
}

static void offer(bb *c, const pw_section_pt *p, double v)
{
    if (v > c->best + 4.0 * DBL_EPSILON * fmax(1.0, fabs(c->best))) {
        c->best = v;
        c->at = *p;
        c->end = false;
    }
}

static pw_status eval(bb *c, double x, pw_section_pt *p, double *v)
{
    if (++c->f->evals > MAX_EVALS)
        return PW_ENOCONV;
    p->x = x;
    pw_status st = c->f->sample(c->f->ctx, x, p->q);
    if (st == PW_OK)
        *v = val(c, p);
    return st;
}

/* eval, keeping the best point the current Brent run has seen. */
static pw_status eval_brent(bb *c, double x, pw_section_pt *p, double *v)
{
    pw_status st = eval(c, x, p, v);
    if (st == PW_OK && *v > c->brent_v) {
        c->brent_v = *v;
        c->brent_pt = *p;
    }
    return st;
}

static pw_status neg_value(void *ctx, double x, double *f)
{
    pw_section_pt p;
    double v;
    pw_status st = eval_brent(ctx, x, &p, &v);
    if (st == PW_OK)
        *f = -v;
    return st;
}

static double dval(const bb *c, const pw_section_pt *p)
{
    return c->f->dvalue ? c->f->dvalue(c->f->ctx, p->x, p->q) : (double)NAN;
}

static pw_status dvalue_fn(void *ctx, double x, double *f)
{
    bb *c = ctx;
    pw_section_pt p;
    double v;
    pw_status st = eval_brent(c, x, &p, &v);
    if (st != PW_OK)
        return st;
    *f = dval(c, &p);
    return isfinite(*f) ? PW_OK : PW_EDOM;
}

/* With the derivative: the local maximum inside [a, b] with dv(a) > 0 > dv(b) as the root of dv
 * by GSL Brent's root solver (superlinear; the value's derivative is smooth where the curve is). */
static pw_status refine_root(bb *c, const pw_section_pt *a, const pw_section_pt *b, double da,
                             double db, const pw_section_pt *seed, double vseed, pw_section_pt *pm)
{
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = c->f->xtol;
    o.xtol_rel = 0.0;
    o.max_iter = MIN_MAX_ITER;
    c->brent_pt = *seed;
    c->brent_v = vseed;
    double xr;
    pw_status st = pw_root1d(dvalue_fn, c, a->x, b->x, da, db, &o, &xr, NULL);
    if (st != PW_OK && st != PW_EMAXITER)
        return st;
    offer(c, &c->brent_pt, c->brent_v);
    *pm = c->brent_pt;
    return PW_OK;
}

/* GSL Brent on -value over (a, m, b), a bracketed local maximum; the maximum found is offered and
 * returned in *pm. With the value's derivative known at the three points and a sign change of it
 * beside m, the root of the derivative instead. */
static pw_status refine(bb *c, const pw_section_pt *a, const pw_section_pt *m,
                        const pw_section_pt *b, double va, double vm, double vb, pw_section_pt *pm)
{
    const double dm = dval(c, m);
    if (dm == 0.0) {
        *pm = *m;
        return PW_OK;
    }
    if (isfinite(dm)) {
        const pw_section_pt *e = dm > 0.0 ? b : a;
        double de = dval(c, e);
        if (isfinite(de) && (dm > 0.0 ? de < 0.0 : de > 0.0))
            return dm > 0.0 ? refine_root(c, m, b, dm, de, m, vm, pm)
                            : refine_root(c, a, m, de, dm, m, vm, pm);
    }
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = c->f->xtol;
    o.xtol_rel = 0.0;
    o.max_iter = MIN_MAX_ITER;
    c->brent_pt = *m;
    c->brent_v = vm;
    double xmin, fmin;
    pw_status st = pw_min1d(neg_value, c, a->x, m->x, b->x, -va, -vm, -vb, &o, &xmin, &fmin, NULL);
    if (st != PW_OK && st != PW_EMAXITER)
        return st;
    offer(c, &c->brent_pt, c->brent_v);
    *pm = c->brent_pt;
    return PW_OK;
}

/* The assumption, checked where the quantities are sampled: the midpoint may lie off its chord
 * (below it when only convexity is bounded) by at most K h^2/8 (+ the value noise). */
static bool curvature_ok(bb *c, const cell *e, const pw_section_pt *m)
{
    pw_section_fn *f = c->f;
    const double h = e->b.x - e->a.x;
    bool ok = true;
    for (size_t k = 0; k < f->nq; k++) {
        double below = 0.5 * (e->a.q[k] + e->b.q[k]) - m->q[k];
        if (f->two_sided)
            below = fabs(below);
        if (below > f->K[k] * h * h / 8.0 + 2.0 * f->noise[k]) {
            f->K[k] = fmax(2.0 * f->K[k], CONV_SAFETY * 8.0 * below / (h * h));
            ok = false;
        }
    }
    return ok;
}

/* Depth-first branch and bound over one cell of the coarse bracket. */
static pw_status search_cell(bb *c, const cell *start)
{
    pw_section_fn *f = c->f;
    cell stack[STACK_MAX];
    size_t top = 0;
    stack[top++] = *start;
    while (top > 0) {
        cell e = stack[--top];
        if (!(f->bound(f->ctx, &e.a, &e.b, f->K) > c->best + f->tol(f->ctx, c->best, &c->at)))
            continue; /* no value in this cell can beat the best */
        const double h = e.b.x - e.a.x;
        if (h < f->min_width)
            continue; /* at rounding level: the ends already are the values there */
        pw_section_pt m;
        double vm;
        pw_status st = eval(c, e.a.x + 0.5 * h, &m, &vm);
        if (st != PW_OK)
            return st;
        offer(c, &m, vm);
        if (!curvature_ok(c, &e, &m)) {
            c->restart = true;
            return PW_OK;
        }
        double va = val(c, &e.a), vb = val(c, &e.b);
        pw_section_pt s = m;
        if (vm > va && vm > vb && isfinite(va) && isfinite(vb)) {
            st = refine(c, &e.a, &m, &e.b, va, vm, vb, &s);
            if (st != PW_OK)
                return st;
            if (!(s.x > e.a.x && s.x < e.b.x))
                s = m;
        }
        if (top + 2 > STACK_MAX)
            return PW_ENOCONV;
        stack[top++] = (cell){e.a, s};
        stack[top++] = (cell){s, e.b};
    }
    return PW_OK;
}

pw_status pw_section_maximise(pw_section_fn *f, size_t n, const pw_section_pt *end,
                              pw_section_pt *best, double *v_best, bool *at_end)
{
    if (n < 2 || f->nq < 1 || f->nq > PW_SECTION_MAXQ)
        return PW_EINVAL;
    bb c = {.f = f};
    c.at = *end;
    c.best = val(&c, end);
    c.end = true;
    pw_section_pt p, pl, pr;
    for (size_t i = 0; i < n; i++) {
        f->point(f->ctx, i, &p);
        offer(&c, &p, val(&c, &p));
    }
    /* Brent first on the highest interior local maximum of the coarse points, so that the bounds
     * prune. */
    size_t ibest = 0;
    double vbest = -INFINITY;
    for (size_t i = 1; i + 1 < n; i++) {
        f->point(f->ctx, i, &p);
        double v = val(&c, &p);
        if (v > vbest) {
            vbest = v;
            ibest = i;
        }
    }
    if (f->dvalue) {
        /* Every coarse cell whose ends bracket a local maximum (dv > 0 at the left, < 0 at the
         * right), highest first, unless its bound already falls below the best value. */
        size_t done[8];
        for (size_t pass = 0; pass < 8; pass++) {
            size_t pick = 0;
            double vpick = -INFINITY;
            f->point(f->ctx, 0, &pl);
            for (size_t i = 0; i + 1 < n; i++) {
                f->point(f->ctx, i + 1, &pr);
                double dl = dval(&c, &pl), dr = dval(&c, &pr);
                double hv = fmax(val(&c, &pl), val(&c, &pr));
                bool seen = false;
                for (size_t k = 0; k < pass; k++)
                    seen = seen || done[k] == i + 1;
                if (!seen && dl > 0.0 && dr < 0.0 && pl.x < pr.x && hv > vpick &&
                    f->bound(f->ctx, &pl, &pr, f->K) > c.best + f->tol(f->ctx, c.best, &c.at)) {
                    pick = i + 1;
                    vpick = hv;
                }
                pl = pr;
            }
            if (pick == 0)
                break;
            done[pass] = pick;
            f->point(f->ctx, pick - 1, &pl);
            f->point(f->ctx, pick, &pr);
            double vl = val(&c, &pl), vr = val(&c, &pr);
            pw_section_pt s;
            pw_status st = refine_root(&c, &pl, &pr, dval(&c, &pl), dval(&c, &pr),
                                       vl >= vr ? &pl : &pr, fmax(vl, vr), &s);
            if (st != PW_OK)
                return st;
        }
        ibest = 0; /* the minimiser's first run is not needed */
    }
    if (ibest > 0) {
        f->point(f->ctx, ibest - 1, &pl);
        f->point(f->ctx, ibest, &p);
        f->point(f->ctx, ibest + 1, &pr);
        double va = val(&c, &pl), vb = val(&c, &pr);
        if (vbest > va && vbest > vb && isfinite(va) && isfinite(vb)) {
            pw_section_pt s;
            pw_status st = refine(&c, &pl, &p, &pr, va, vbest, vb, &s);
            if (st != PW_OK)
                return st;
        }
    }
    for (int round = 0;; round++) {
        c.restart = false;
        f->point(f->ctx, 0, &pl);
        for (size_t i = 0; i + 1 < n && !c.restart; i++) {
            f->point(f->ctx, i + 1, &pr);
            cell e = {pl, pr};
            pl = pr;
            if (!(e.a.x < e.b.x))
                continue;
            pw_status st = search_cell(&c, &e);
            if (st != PW_OK)
                return st;
        }
        if (!c.restart)
            break;
        if (round + 1 >= MAX_RESTARTS)
            return PW_ENOCONV;
    }
    *best = c.at;
    *v_best = c.best;
    *at_end = c.end;
    return PW_OK;
}

/* ---- the constant-overflow column's section: v = (p - y*)/|p - x| ---- */

typedef struct sect {
    pw_column_ws *w;
    double p;   /* pole: xd (rectifying, right of the cells) or xb (stripping, left) */
    double dir; /* +1: pole on the right, -1: on the left */
    double eps; /* curve value precision */
    /* the coarse bracket: lo, the table's points strictly inside, hi */
    double lo, ylo, hi, yhi;
    size_t j0, np;
} sect;

/* The quantity maximised: (p - y)/|p - x|, i.e. m* = (xd - y*)/(xd - x) in the rectifying
 * section and -s* = -(y* - xb)/(x - xb) in the stripping section; -infinity at the pole, where
 * y* > x (the split is feasible). */
static double cmo_value(void *ctx, double x, const double *q)
{
    const sect *c = ctx;
    double u = fabs(c->p - x);
    return u > 0.0 ? (c->p - q[0]) / u : -(double)INFINITY;
}

static pw_status cmo_sample(void *ctx, double x, double *q)
{
    sect *c = ctx;
    if (c->w->dy && c->w->tab_d)
        return pw_column_y_dy(c->w, x, &q[0], &q[1]); /* q[1]: the slope, not a bounded quantity */
    q[1] = NAN;
    return pw_column_y(c->w, x, &q[0]);
}

/* dv/dx of v = (p - y*)/u, u = |p - x| = dir (p - x): (dir (p - y*) - y*' u) / u^2 (NAN without
 * the slope). */
static double cmo_dvalue(void *ctx, double x, const double *q)
{
    const sect *c = ctx;
    double u = fabs(c->p - x);
    if (!(u > 0.0) || !isfinite(q[1]))
        return NAN;
    return (c->dir * (c->p - q[0]) - q[1] * u) / (u * u);
}

/* The table's slope at x when x is one of its ends (the section's ends may be the q-line point,
 * which is not tabulated: NAN). */
static double end_slope(const pw_column_ws *w, double x)
{
    if (!w->tab_d)
        return NAN;
    if (x == w->tab_x[0])
        return w->tab_d[0];
    if (x == w->tab_x[w->tab_n - 1])
        return w->tab_d[w->tab_n - 1];
    return NAN;
}

static void cmo_point(void *ctx, size_t i, pw_section_pt *pt)
{
    const sect *c = ctx;
    if (i == 0) {
        pt->x = c->lo;
        pt->q[0] = c->ylo;
        pt->q[1] = end_slope(c->w, c->lo);
    } else if (i + 1 == c->np) {
        pt->x = c->hi;
        pt->q[0] = c->yhi;
        pt->q[1] = end_slope(c->w, c->hi);
    } else {
        pt->x = c->w->tab_x[c->j0 + i - 1];
        pt->q[0] = c->w->tab_y[c->j0 + i - 1];
        pt->q[1] = c->w->tab_d ? c->w->tab_d[c->j0 + i - 1] : (double)NAN;
    }
}

/* Tolerance on the value: 0.1 rtol of R's sensitivity (R = m/(1-m), S = 1/(s-1)), with a floor at
 * rounding level, plus the precision of the best value itself. */
static double cmo_tol(void *ctx, double best, const pw_section_pt *at)
{
    const sect *c = ctx;
    double v = fabs(best);
    double scale = fmin(1.0, v * fabs(1.0 - v));
    double d = fmax(0.1 * c->w->rtol * scale, 16.0 * DBL_EPSILON * fmax(1.0, v));
    double ub = fabs(c->p - at->x);
    return d + (ub > 0.0 ? 2.0 * c->eps / ub : 0.0);
}

/* Upper bound of the value on [a, b] when y*'' <= K there and values carry an error up to eps:
 * y* >= L(x) - K (x - a)(b - x)/2 - eps with L the chord, so the value is at most
 * N(x)/u, N = p - L + K (x - a)(b - x)/2 + eps, u = |p - x|. As a function of u this is
 * alpha/u + beta - K u/2 (alpha = N(p)): convex for alpha >= 0 (maximum at an end), concave
 * otherwise with its peak at u = sqrt(-2 alpha/K). */
static double cmo_bound(void *ctx, const pw_section_pt *pa, const pw_section_pt *pb,
                        const double *Kq)
{
    const sect *c = ctx;
    const double a = pa->x, b = pb->x, h = b - a, ya = pa->q[0], sl = (pb->q[0] - ya) / h;
    const double K = Kq[0], p = c->p;
#define PW_N(x) (p - (ya + sl * ((x)-a)) + 0.5 * K * ((x)-a) * (b - (x)) + c->eps)
    const double ua = fabs(p - a), ub = fabs(p - b);
    const double alpha = PW_N(p);
    if (alpha >= 0.0 && (ua == 0.0 || ub == 0.0))
        return INFINITY;
    double bound = -INFINITY;
    if (ua > 0.0)
        bound = fmax(bound, PW_N(a) / ua);
    if (ub > 0.0)
        bound = fmax(bound, PW_N(b) / ub);
    if (alpha < 0.0 && K > 0.0) {
        double us = sqrt(-2.0 * alpha / K);
        if (us > fmin(ua, ub) && us < fmax(ua, ub)) {
            double xs = p - c->dir * us;
            bound = fmax(bound, PW_N(xs) / us);
        }
    }
#undef PW_N
    return bound;
}

pw_status pw_column_section_search(pw_column_ws *w, const pw_column_spec *s, pw_section sec,
                                   double lo, double ylo, double hi, double yhi, double xe,
                                   double ye, double *slope, double *x_lim, double *y_lim,
                                   bool *at_feed)
{
    if (!(lo < hi) || !w->tab_x || w->tab_n < 2)
        return PW_EINVAL;
    if (isnan(w->conv_bound))
        pw_column_set_conv_bound(w);
    const bool rect = sec == PW_SECTION_RECTIFYING;
    sect c = {.w = w,
              .p = rect ? s->xd : s->xb,
              .dir = rect ? 1.0 : -1.0,
              .eps = w->y_noise,
              .lo = lo,
              .ylo = ylo,
              .hi = hi,
              .yhi = yhi};
    /* Coarse bracket: the section's ends and the table's points between them. */
    const double *tx = w->tab_x;
    const size_t n = w->tab_n;
    size_t j0 = 0;
    while (j0 < n && !(tx[j0] > lo))
        j0++;
    size_t j1 = j0;
    while (j1 < n && tx[j1] < hi)
        j1++;
    c.j0 = j0;
    c.np = (j1 - j0) + 2;
    pw_section_fn f = {.ctx = &c,
                       .nq = 1,
                       .two_sided = false,
                       .sample = cmo_sample,
                       .value = cmo_value,
                       .bound = cmo_bound,
                       .tol = cmo_tol,
                       .point = cmo_point,
                       .dvalue = w->dy && w->tab_d ? cmo_dvalue : NULL,
                       .noise = {w->y_noise},
                       .K = {w->conv_bound},
                       .xtol = w->min_xtol,
                       .min_width = MIN_CELL_REL * (s->xd - s->xb)};
    pw_section_pt end = {.x = xe, .q = {ye, NAN}}, best;
    double v;
    pw_status st = pw_section_maximise(&f, c.np, &end, &best, &v, at_feed);
    if (st != PW_OK)
        return st;
    w->conv_bound = fmax(w->conv_bound, f.K[0]); /* keep what was learnt for the other section */
    *slope = rect ? v : -v;
    *x_lim = best.x;
    *y_lim = best.q[0];
    return PW_OK;
}
