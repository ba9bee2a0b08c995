/* The limiting slope of one column section by a search that cannot miss a pinch (under the stated
 * bound on the curve's convexity): the tabulated curve gives a coarse bracket, every cell of it -
 * the cells at the product end and at the q-line end included - is bounded from above, cells whose
 * bound exceeds the best value found are halved until the bound falls below it, and GSL Brent
 * (base/solve1d) refines every local maximum met on the way. See docs/column.md, section 3. */
#include "analysis/column_internal.h"
#include "base/solve1d.h"

#include <float.h>
#include <math.h>
#include <stdbool.h>

#define CONV_SAFETY 4.0    /* K = 4 x the largest second difference of the table ... */
#define CONV_FLOOR 1e-6    /* ... plus this (a straight table still gets a bound) */
#define STACK_MAX 256      /* depth-first cells pending; the depth is at most ~50 halvings */
#define MAX_RESTARTS 8     /* K raised when a midpoint shows more convexity than K allows */
#define MAX_EVALS 20000    /* per section: a safety net, far above any case met */
#define MIN_CELL_REL 1e-13 /* cells narrower than this (relative to xd - xb) are not halved */
#define MIN_MAX_ITER 100

void pw_column_set_conv_bound(pw_column_ws *w)
{
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

typedef struct sect {
    pw_column_ws *w;
    const pw_column_spec *spec;
    double p;   /* pole: xd (rectifying, right of the cells) or xb (stripping, left) */
    double dir; /* +1: pole on the right, -1: on the left */
    double K;   /* convexity bound in use */
    double eps; /* curve value precision */
    double best, x_best, y_best;
    double v_end; /* value of the end candidate */
    bool feed;    /* the end candidate is the best */
    bool restart; /* K was raised: search again */
    unsigned long evals;
    /* the best point the current Brent run has seen */
    double brent_x, brent_y, brent_v;
} sect;

typedef struct cell {
    double a, ya, b, yb;
} cell;

/* The quantity maximised: (p - y)/|p - x|, i.e. m* = (xd - y*)/(xd - x) in the rectifying
 * section and -s* = -(y* - xb)/(x - xb) in the stripping section; -infinity at the pole, where
 * y* > x (the split is feasible). */
static double value(const sect *c, double x, double y)
{
    double u = fabs(c->p - x);
    return u > 0.0 ? (c->p - y) / u : -(double)INFINITY;
}

/* Tolerance on the value: 0.1 rtol of R's sensitivity (R = m/(1-m), S = 1/(s-1)), with a floor at
 * rounding level, plus the precision of the best value itself. */
static double tol(const sect *c)
{
    double v = fabs(c->best);
    double scale = fmin(1.0, v * fabs(1.0 - v));
    double d = fmax(0.1 * c->w->rtol * scale, 16.0 * DBL_EPSILON * fmax(1.0, v));
    double ub = fabs(c->p - c->x_best);
    return d + (ub > 0.0 ? 2.0 * c->eps / ub : 0.0);
}

static void offer(sect *c, double x, double y, double v)
{
    if (v > c->best + 4.0 * DBL_EPSILON * fmax(1.0, fabs(c->best))) {
        c->best = v;
        c->x_best = x;
        c->y_best = y;
        c->feed = false;
    }
}

static pw_status eval(sect *c, double x, double *y, double *v)
{
    if (++c->evals > MAX_EVALS)
        return PW_ENOCONV;
    pw_status st = pw_column_y(c->w, x, y);
    if (st == PW_OK)
        *v = value(c, x, *y);
    return st;
}

/* Upper bound of the value on [a, b] when y*'' <= K there and values carry an error up to eps:
 * y* >= L(x) - K (x - a)(b - x)/2 - eps with L the chord, so the value is at most
 * N(x)/u, N = p - L + K (x - a)(b - x)/2 + eps, u = |p - x|. As a function of u this is
 * alpha/u + beta - K u/2 (alpha = N(p)): convex for alpha >= 0 (maximum at an end), concave
 * otherwise with its peak at u = sqrt(-2 alpha/K). */
static double cell_bound(const sect *c, const cell *e)
{
    const double a = e->a, b = e->b, h = b - a, sl = (e->yb - e->ya) / h, K = c->K, p = c->p;
#define PW_N(x) (p - (e->ya + sl * ((x)-a)) + 0.5 * K * ((x)-a) * (b - (x)) + c->eps)
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

static pw_status neg_value(void *ctx, double x, double *f)
{
    sect *c = ctx;
    double y, v;
    pw_status st = eval(c, x, &y, &v);
    if (st != PW_OK)
        return st;
    if (v > c->brent_v) {
        c->brent_v = v;
        c->brent_x = x;
        c->brent_y = y;
    }
    *f = -v;
    return PW_OK;
}

/* GSL Brent on -value over (a, m, b), a bracketed local maximum; the maximum found is offered and
 * returned as (*xm, *ym). */
static pw_status refine(sect *c, double a, double m, double b, double va, double vm, double vb,
                        double ym, double *xm, double *y_m)
{
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = c->w->min_xtol;
    o.xtol_rel = 0.0;
    o.max_iter = MIN_MAX_ITER;
    c->brent_x = m;
    c->brent_y = ym;
    c->brent_v = vm;
    double xmin, fmin;
    pw_status st = pw_min1d(neg_value, c, a, m, b, -va, -vm, -vb, &o, &xmin, &fmin, NULL);
    if (st != PW_OK && st != PW_EMAXITER)
        return st;
    offer(c, c->brent_x, c->brent_y, c->brent_v);
    *xm = c->brent_x;
    *y_m = c->brent_y;
    return PW_OK;
}

/* Depth-first branch and bound over one cell of the table. */
static pw_status search_cell(sect *c, const cell *start, double min_width)
{
    cell stack[STACK_MAX];
    size_t top = 0;
    stack[top++] = *start;
    while (top > 0) {
        cell e = stack[--top];
        if (!(cell_bound(c, &e) > c->best + tol(c)))
            continue; /* no value in this cell can beat the best */
        const double h = e.b - e.a;
        if (h < min_width)
            continue; /* at rounding level: the ends already are the values there */
        double xm = e.a + 0.5 * h, ym, vm;
        pw_status st = eval(c, xm, &ym, &vm);
        if (st != PW_OK)
            return st;
        offer(c, xm, ym, vm);
        /* The assumption, checked where the curve is sampled: the midpoint may lie below the
         * chord by at most K h^2/8 (+ the value noise). */
        double below = 0.5 * (e.ya + e.yb) - ym;
        if (below > c->K * h * h / 8.0 + 2.0 * c->eps) {
            c->K = fmax(2.0 * c->K, CONV_SAFETY * 8.0 * below / (h * h));
            c->restart = true;
            return PW_OK;
        }
        double va = value(c, e.a, e.ya), vb = value(c, e.b, e.yb);
        double xs = xm, ys = ym;
        if (vm > va && vm > vb && isfinite(va) && isfinite(vb)) {
            st = refine(c, e.a, xm, e.b, va, vm, vb, ym, &xs, &ys);
            if (st != PW_OK)
                return st;
            if (!(xs > e.a && xs < e.b)) {
                xs = xm;
                ys = ym;
            }
        }
        if (top + 2 > STACK_MAX)
            return PW_ENOCONV;
        stack[top++] = (cell){e.a, e.ya, xs, ys};
        stack[top++] = (cell){xs, ys, e.b, e.yb};
    }
    return PW_OK;
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
              .spec = s,
              .p = rect ? s->xd : s->xb,
              .dir = rect ? 1.0 : -1.0,
              .K = w->conv_bound,
              .eps = w->y_noise};
    c.v_end = value(&c, xe, ye);
    c.best = c.v_end;
    c.x_best = xe;
    c.y_best = ye;
    c.feed = true;
    /* Coarse bracket: the section's ends and the table's points between them. */
    const double *tx = w->tab_x, *ty = w->tab_y;
    const size_t n = w->tab_n;
    size_t j0 = 0;
    while (j0 < n && !(tx[j0] > lo))
        j0++;
    size_t j1 = j0;
    while (j1 < n && tx[j1] < hi)
        j1++;
    /* points: lo, tx[j0 .. j1-1], hi */
    const size_t np = (j1 - j0) + 2;
#define PT_X(i) ((i) == 0 ? lo : (i) == np - 1 ? hi : tx[j0 + (i)-1])
#define PT_Y(i) ((i) == 0 ? ylo : (i) == np - 1 ? yhi : ty[j0 + (i)-1])
    for (size_t i = 0; i < np; i++)
        offer(&c, PT_X(i), PT_Y(i), value(&c, PT_X(i), PT_Y(i)));
    /* Brent first on the highest interior local maximum of the table, so that the bounds prune. */
    size_t ibest = 0;
    double vbest = -INFINITY;
    for (size_t i = 1; i + 1 < np; i++) {
        double v = value(&c, PT_X(i), PT_Y(i));
        if (v > vbest) {
            vbest = v;
            ibest = i;
        }
    }
    if (ibest > 0) {
        double va = value(&c, PT_X(ibest - 1), PT_Y(ibest - 1));
        double vb = value(&c, PT_X(ibest + 1), PT_Y(ibest + 1));
        if (vbest > va && vbest > vb && isfinite(va) && isfinite(vb)) {
            double xs, ys;
            pw_status st = refine(&c, PT_X(ibest - 1), PT_X(ibest), PT_X(ibest + 1), va, vbest, vb,
                                  PT_Y(ibest), &xs, &ys);
            if (st != PW_OK)
                return st;
        }
    }
    const double min_width = MIN_CELL_REL * (s->xd - s->xb);
    for (int round = 0;; round++) {
        c.restart = false;
        for (size_t i = 0; i + 1 < np && !c.restart; i++) {
            cell e = {PT_X(i), PT_Y(i), PT_X(i + 1), PT_Y(i + 1)};
            if (!(e.a < e.b))
                continue;
            pw_status st = search_cell(&c, &e, min_width);
            if (st != PW_OK)
                return st;
        }
        if (!c.restart)
            break;
        if (round + 1 >= MAX_RESTARTS)
            return PW_ENOCONV;
    }
#undef PT_X
#undef PT_Y
    w->conv_bound = fmax(w->conv_bound, c.K); /* keep what was learnt for the other section */
    *slope = rect ? c.best : -c.best;
    *x_lim = c.x_best;
    *y_lim = c.y_best;
    *at_feed = c.feed;
    return PW_OK;
}
