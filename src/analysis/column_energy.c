/* Binary column with an energy balance on every stage (Ponchon 1921; Savarit 1922): difference
 * points DeltaD = (xd, h_D + Q_C/D) and DeltaB = (xb, h_B - Q_R/B), collinear with the feed
 * point (zf, h_F); stage-to-stage stepping along the lines through them; minimum reflux from the
 * tie lines of both sections extended to the products. The enthalpy model is enthalpy.h's. See docs/column.md ("Energy balances").
 *
 * Minimum reflux. A tie line (x, h_L) - (y*, H_V) at the bubble point of x, extended to x = xd,
 * meets it at v_r(x) = h_L + (H_V - h_L)(xd - x)/(y* - x); the rectifying section needs
 * h_DeltaD >= v_r(x) for every liquid x it holds, [x_f, xd], where x_f is the liquid of the tie
 * line through the feed point. Likewise the stripping section needs h_DeltaB <= v_s(x) (the tie
 * line extended to xb) on [xb, x_f], which maps through the feed point onto h_DeltaD. Each
 * section's extremum is found by the column module's branch and bound (column_search.c, through
 * its seam) with a cell bound on the tie-line value from curvature bounds on y*, h_L and the
 * latent heat: every cell of the section, both ends included, is proved or halved, so no pinch
 * is missed under the stated assumption (docs/column.md, section 9). */
#include "analysis/column_internal.h"
#include "analysis/design_internal.h"

#include "base/solve1d.h"

#include <float.h>
#include <math.h>
#include <pinchwise/units.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/curve.h>
#include <pinchwise/lle.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define ROOT_ITER 200
#define SECT_MIN_CELL_REL 1e-13 /* cells narrower than this (relative to xd - xb) are not halved */
#define SECT_Y_NOISE 1e-13      /* absolute precision of y* (as the column module's) */
#define SECT_H_NOISE 1e-6       /* J/mol: of h_L and the latent heat (T to ~1e-10 K, rounding) */

typedef struct en {
    pw_eqp e;
    const pw_heat_data *h;
    pw_column_spec s;
    double D, B, h_F, h_D, h_B, H_top;
    pw_status cb;
    bool mirror; /* component 1 to the bottoms: x, y here are fractions of component 2 */
} en;

/* ---- the equilibrium and the enthalpies in the column's frame ----
 * With component 1 leaving with the bottoms (xd < zf < xb) the column is solved in the mirrored
 * frame x -> 1 - x, in which the overhead component is the "light" one; enthalpies do not depend
 * on the frame. The mirror happens only in these five functions. */

static pw_status e_bubble(en *c, double x, double *y, double *T)
{
    if (!c->mirror)
        return pw_eqp_bubble(&c->e, x, y, T);
    double yr;
    pw_status st = pw_eqp_bubble(&c->e, 1.0 - x, &yr, T);
    if (st == PW_OK)
        *y = 1.0 - yr;
    return st;
}

static pw_status e_x_of_y(en *c, double y, double *x, double *T)
{
    if (!c->mirror)
        return pw_eqp_x_of_y(&c->e, y, x, T);
    double xr;
    pw_status st = pw_eqp_x_of_y(&c->e, 1.0 - y, &xr, T);
    if (st == PW_OK)
        *x = 1.0 - xr;
    return st;
}

static pw_status e_dew(en *c, double y, double *T)
{
    pw_eq_point d;
    pw_status st = pw_dew_T(c->e.sys, c->e.P_Pa, c->mirror ? 1.0 - y : y, &d);
    if (st == PW_OK)
        *T = d.T_K;
    return st;
}

static pw_status e_hL(en *c, double x, double T, double *h)
{
    return pw_enthalpy_liquid(c->e.sys, c->h, c->mirror ? 1.0 - x : x, T, h);
}

static double e_HV(const en *c, double y, double T)
{
    return pw_enthalpy_vapor(c->h, c->mirror ? 1.0 - y : y, T);
}

/* ---- enthalpies along the saturation curves ---- */

/* The tie line at liquid x: y*, the bubble temperature, h_L, H_V. */
static pw_status tie(en *c, double x, double *y, double *T, double *hL, double *HV)
{
    pw_status st = e_bubble(c, x, y, T);
    if (st == PW_OK)
        st = e_hL(c, x, *T, hL);
    if (st == PW_OK)
        *HV = e_HV(c, *y, *T);
    return st;
}

/* Saturated vapor of composition y: its enthalpy (at its dew point) and the liquid x*(y). */
static pw_status sat_vapor(en *c, double y, double *H, double *x, double *T)
{
    pw_status st = e_x_of_y(c, y, x, T);
    if (st == PW_OK)
        *H = e_HV(c, y, *T);
    return st;
}

/* ---- 1-D solves through the library's Brent driver (src/base/solve1d.h) ---- */

/* The section functions return a value and leave a failure in c->cb; the adapter hands the
 * driver a status and a finite value, times sign. */
typedef double (*en_fn)(en *c, double x, void *p);
typedef struct adapt {
    en *c;
    en_fn f;
    void *p;
    double sign;
} adapt;

static pw_status adapt_fn(void *ctx, double x, double *v)
{
    adapt *t = ctx;
    t->c->cb = PW_OK;
    double r = t->f(t->c, x, t->p);
    if (t->c->cb != PW_OK)
        return t->c->cb;
    if (!isfinite(r))
        return PW_EDOM;
    *v = t->sign * r;
    return PW_OK;
}

static pw_status root(en *c, en_fn f, void *p, double a, double b, double fa, double fb, double *x)
{
    if (fa == 0.0 || fb == 0.0) {
        *x = fa == 0.0 ? a : b;
        return PW_OK;
    }
    if ((fa > 0.0) == (fb > 0.0))
        return PW_ENOBRACKET;
    if (a > b) {
        double t = a, tv = fa;
        a = b;
        fa = fb;
        b = t;
        fb = tv;
    }
    adapt t = {c, f, p, 1.0};
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = 1e-15;
    o.xtol_rel = 4.0 * DBL_EPSILON;
    o.max_iter = ROOT_ITER;
    return pw_root1d(adapt_fn, &t, a, b, fa, fb, &o, x, NULL);
}

/* ---- the section values ---- */

/* The tie line through the feed point (z, h_F): zero at x_f. */
static double feed_tie(en *c, double x, void *p)
{
    (void)p;
    double y, T, hL, HV;
    pw_status st = tie(c, x, &y, &T, &hL, &HV);
    if (st != PW_OK) {
        if (c->cb == PW_OK)
            c->cb = st;
        return NAN;
    }
    return (c->h_F - hL) * (y - x) - (HV - hL) * (c->s.zf - x);
}

static double ev(en *c, en_fn f, void *p, double x, pw_status *st)
{
    c->cb = PW_OK;
    double v = f(c, x, p);
    *st = c->cb;
    return v;
}

/* The liquid of the feed's tie line; *side = -1 when it lies at or below xb (a vapor-rich
 * feed: no stripping tie line limits), +1 at or above xd (a cold feed: no rectifying tie line
 * limits), 0 inside. */
static pw_status feed_liquid(en *c, double *xf, int *side)
{
    const pw_column_spec *s = &c->s;
    pw_status st;
    *side = 0;
    if (s->q == 1.0) { /* the feed point is the saturated liquid z: its own tie line */
        *xf = s->zf;
        return PW_OK;
    }
    double xz, Tz;
    if ((st = e_x_of_y(c, s->zf, &xz, &Tz)) != PW_OK)
        return st;
    if (s->q == 0.0) { /* the saturated vapor z: the tie line ending there */
        *xf = xz;
        *side = xz <= s->xb ? -1 : 0;
        return PW_OK;
    }
    double a, b;
    if (s->q > 1.0) {
        a = s->zf;
        b = s->xd;
    } else if (s->q < 0.0) {
        a = fmax(s->xb, 0.0);
        b = xz;
    } else {
        a = fmax(xz, s->xb);
        b = s->zf;
    }
    double fa = ev(c, feed_tie, NULL, a, &st);
    if (st != PW_OK)
        return st;
    double fb = ev(c, feed_tie, NULL, b, &st);
    if (st != PW_OK)
        return st;
    if ((fa > 0.0) == (fb > 0.0) && fa != 0.0 && fb != 0.0) {
        *side = s->q > 1.0 ? 1 : -1; /* no crossing inside: beyond the end the q side points to */
        *xf = s->q > 1.0 ? s->xd : s->xb;
        return PW_OK;
    }
    st = root(c, feed_tie, NULL, a, b, fa, fb, xf);
    if (st != PW_OK)
        return st;
    *side = *xf <= s->xb ? -1 : *xf >= s->xd ? 1 : 0;
    return PW_OK;
}

/* ---- the section search: the column module's branch and bound on the tie-line values ---- */

/* One section's search. The quantities sampled at a liquid x are y*(x), h_L(x) and the tie line's
 * latent heat lambda(x) = H_V(y*) - h_L (both at the bubble point of x); the value maximised is
 * sigma h_L + lambda u/(y* - x), u = |p - x|: v_r(x) with sigma = +1, p = xd (rectifying), and
 * -v_s(x) with sigma = -1, p = xb (stripping). */
typedef struct esect {
    en *c;
    double p, sigma, dir; /* pole, sign of h_L, +1 when the pole is right of the section */
    double rtol;
    pw_section_pt *pts; /* the coarse scan */
    size_t n;
} esect;

static pw_status es_sample(void *ctx, double x, double *q)
{
    esect *e = ctx;
    double y, T, hL, HV;
    pw_status st = tie(e->c, x, &y, &T, &hL, &HV);
    if (st != PW_OK)
        return st;
    if (!(y > x))
        return PW_EINFEASIBLE; /* the feasibility check rules this out on [xb, xd] */
    q[0] = y;
    q[1] = hL;
    q[2] = HV - hL;
    return PW_OK;
}

static double es_value(void *ctx, double x, const double *q)
{
    const esect *e = ctx;
    return e->sigma * q[1] + q[2] * fabs(e->p - x) / (q[0] - x);
}

static void es_point(void *ctx, size_t i, pw_section_pt *pt)
{
    const esect *e = ctx;
    *pt = e->pts[i];
}

/* Interval arithmetic for the cell bound. */
typedef struct iv {
    double lo, hi;
} iv;

static iv iv_add(iv a, iv b)
{
    return (iv){a.lo + b.lo, a.hi + b.hi};
}

static iv iv_mul(iv a, iv b)
{
    double p[4] = {a.lo * b.lo, a.lo * b.hi, a.hi * b.lo, a.hi * b.hi};
    iv r = {p[0], p[0]};
    for (int i = 1; i < 4; i++) {
        r.lo = fmin(r.lo, p[i]);
        r.hi = fmax(r.hi, p[i]);
    }
    return r;
}

static iv iv_scale(double k, iv a)
{
    return k >= 0.0 ? (iv){k * a.lo, k * a.hi} : (iv){k * a.hi, k * a.lo};
}

static iv iv_inv_pos(iv a) /* 1/a for a > 0 */
{
    return (iv){1.0 / a.hi, 1.0 / a.lo};
}

/* A quantity with |q''| <= K on [a, b] (values noisy by n): its range and its slope's range. */
static iv iv_range(double qa, double qb, double K, double h, double n)
{
    const double d = K * h * h / 8.0 + n;
    return (iv){fmin(qa, qb) - d, fmax(qa, qb) + d};
}

static iv iv_slope(double qa, double qb, double K, double h, double n)
{
    const double s = (qb - qa) / h, d = 0.5 * K * h + 2.0 * n / h;
    return (iv){s - d, s + d};
}

/* Upper bound of the value on a cell. With |y*''| <= K0, |h_L''| <= K1, |lambda''| <= K2 the
 * value's second derivative, v'' = sigma h_L'' + lambda'' w + 2 lambda' w' + lambda w'' with
 * w = u/g, g = y* - x,
 *     w'  = (u' g - u g')/g^2,   w'' = -2 u' g'/g^2 - u g''/g^2 + 2 u g'^2/g^3,
 * is bounded above by interval arithmetic over the cell (each quantity within K h^2/8 of its
 * chord, its slope within K h/2 of the chord's, its second derivative within +-K). With
 * v'' <= Kc, v <= chord + Kc (x - a)(b - x)/2, whose maximum is closed-form; the noise of the
 * values at the ends is added. A cell where g may vanish gets no bound (it is halved). */
static double es_bound(void *ctx, const pw_section_pt *pa, const pw_section_pt *pb, const double *K)
{
    const esect *e = ctx;
    const double a = pa->x, b = pb->x, h = b - a, n0 = SECT_Y_NOISE, nh = SECT_H_NOISE;
    const iv g = iv_range(pa->q[0] - a, pb->q[0] - b, K[0], h, n0);
    if (!(g.lo > 0.0))
        return INFINITY;
    const iv g1 = iv_slope(pa->q[0] - a, pb->q[0] - b, K[0], h, n0);
    const iv g2 = {-K[0], K[0]};
    const iv h2 = {-K[1], K[1]};
    const iv l0 = iv_range(pa->q[2], pb->q[2], K[2], h, nh);
    const iv l1 = iv_slope(pa->q[2], pb->q[2], K[2], h, nh);
    const iv l2 = {-K[2], K[2]};
    const double ua = fabs(e->p - a), ub = fabs(e->p - b), du = -e->dir; /* u' */
    const iv u = {fmin(ua, ub), fmax(ua, ub)};
    const iv ig = iv_inv_pos(g), ig2 = iv_mul(ig, ig), ig3 = iv_mul(ig2, ig);
    const iv w = iv_mul(u, ig);
    const iv w1 = iv_mul(iv_add(iv_scale(du, g), iv_scale(-1.0, iv_mul(u, g1))), ig2);
    iv g1sq = iv_mul(g1, g1);
    if (g1.lo < 0.0 && g1.hi > 0.0)
        g1sq.lo = 0.0;
    iv w2 = iv_scale(-2.0 * du, iv_mul(g1, ig2));
    w2 = iv_add(w2, iv_scale(-1.0, iv_mul(iv_mul(u, g2), ig2)));
    w2 = iv_add(w2, iv_scale(2.0, iv_mul(iv_mul(u, g1sq), ig3)));
    iv v2 = iv_scale(e->sigma, h2);
    v2 = iv_add(v2, iv_mul(l2, w));
    v2 = iv_add(v2, iv_scale(2.0, iv_mul(l1, w1)));
    v2 = iv_add(v2, iv_mul(l0, w2));
    const double Kc = v2.hi;
    const double va = es_value(ctx, a, pa->q), vb = es_value(ctx, b, pb->q);
    const double noise = nh + nh * u.hi / g.lo + fmax(fabs(l0.lo), fabs(l0.hi)) * u.hi * n0 /
                                                     (g.lo * g.lo);
    if (!isfinite(Kc))
        return INFINITY;
    const double sv = (vb - va) / h;
    double best = fmax(va, vb);
    if (Kc > 0.0) {
        double xs = fmin(b, fmax(a, a + 0.5 * h + sv / Kc));
        best = fmax(best, va + sv * (xs - a) + 0.5 * Kc * (xs - a) * (b - xs));
    }
    return best + noise;
}

/* 0.1 rtol of R (at least of 1) in the value's units, a rounding floor, and the precision of the
 * best value itself. dR/dv = 1/(H_V(xd) - h_D) (rectifying) or f/(H_V(xd) - h_D) with
 * f = (xd - zf)/(zf - xb) (stripping, through the feed point). */
static double es_tol(void *ctx, double best, const pw_section_pt *at)
{
    const esect *e = ctx;
    const en *c = e->c;
    const double lam = c->H_top - c->h_D;
    const double f = e->sigma > 0.0 ? 1.0 : (c->s.xd - c->s.zf) / (c->s.zf - c->s.xb);
    const double hdD =
        e->sigma > 0.0 ? best : c->h_F + (c->h_F + best) * (c->s.xd - c->s.zf) / (c->s.zf - c->s.xb);
    const double R = (hdD - c->H_top) / lam;
    double t = 0.1 * e->rtol * lam * fmax(1.0, fabs(R)) / f;
    t = fmax(t, 16.0 * DBL_EPSILON * fabs(best));
    const double u = fabs(e->p - at->x), g = at->q[0] - at->x;
    return t + SECT_H_NOISE * (1.0 + u / g) + at->q[2] * u * SECT_Y_NOISE / (g * g);
}

/* The extremum of one section over [lo, hi]: the maximum of v_r (rectifying, pole xd) or the
 * minimum of v_s (stripping, pole xb); the feed end (lo for the rectifying section, hi for the
 * stripping one) is the end candidate and wins ties (*at_feed). */
static pw_status section_search(en *c, bool rect, double lo, double hi, size_t grid, double rtol,
                                double *x_best, double *v_best, bool *at_feed)
{
    if (!(lo < hi))
        return PW_EINVAL;
    esect e = {.c = c,
               .p = rect ? c->s.xd : c->s.xb,
               .sigma = rect ? 1.0 : -1.0,
               .dir = rect ? 1.0 : -1.0,
               .rtol = rtol,
               .n = grid};
    e.pts = calloc(grid, sizeof *e.pts);
    if (!e.pts)
        return PW_ENOMEM;
    pw_status st = PW_OK;
    double scale[PW_SECTION_MAXQ] = {0.0, 0.0, 0.0};
    for (size_t j = 0; j < grid && st == PW_OK; j++) {
        e.pts[j].x = j + 1 == grid ? hi : lo + (hi - lo) * (double)j / (double)(grid - 1);
        st = es_sample(&e, e.pts[j].x, e.pts[j].q);
        for (size_t k = 0; st == PW_OK && k < PW_SECTION_MAXQ; k++)
            scale[k] = fmax(scale[k], fabs(e.pts[j].q[k]));
    }
    if (st == PW_OK) {
        pw_section_fn f = {.ctx = &e,
                           .nq = 3,
                           .two_sided = true,
                           .sample = es_sample,
                           .value = es_value,
                           .bound = es_bound,
                           .tol = es_tol,
                           .point = es_point,
                           .noise = {SECT_Y_NOISE, SECT_H_NOISE, SECT_H_NOISE},
                           .xtol = fmax(2.0 * sqrt(DBL_EPSILON), 1e-3 * sqrt(rtol)),
                           .min_width = SECT_MIN_CELL_REL * (c->s.xd - c->s.xb)};
        const double floor[PW_SECTION_MAXQ] = {1e-6, 1e-6 * (1.0 + scale[1]),
                                               1e-6 * (1.0 + scale[2])};
        pw_section_conv_init(&f, grid, floor);
        pw_section_pt best;
        double v;
        st = pw_section_maximise(&f, grid, rect ? &e.pts[0] : &e.pts[grid - 1], &best, &v,
                                 at_feed);
        if (st == PW_OK) {
            *x_best = best.x;
            *v_best = rect ? v : -v;
        }
    }
    free(e.pts);
    return st;
}

/* ---- stepping ---- */

typedef struct line_ctx {
    double xn, hn, xP, hP; /* liquid point and difference point */
    bool strip;
} line_ctx;

/* Zero where the vapor (y, H_Vsat(y)) lies on the line through the liquid point and the
 * difference point. */
static double line_fn(en *c, double y, void *p)
{
    line_ctx *l = p;
    double Td;
    pw_status st = e_dew(c, y, &Td);
    if (st != PW_OK) {
        if (c->cb == PW_OK)
            c->cb = st;
        return NAN;
    }
    const double H = e_HV(c, y, Td);
    if (l->strip)
        return (H - l->hP) * (l->xn - l->xP) - (l->hn - l->hP) * (y - l->xP);
    return (H - l->hn) * (l->xP - l->xn) - (l->hP - l->hn) * (y - l->xn);
}

/* The line DeltaB-DeltaD meets the saturated-liquid curve: the optimal feed switch. */
typedef struct int_ctx {
    double hdB, hdD;
} int_ctx;

static double int_fn(en *c, double x, void *p)
{
    int_ctx *k = p;
    double y, T, hL, HV;
    pw_status st = tie(c, x, &y, &T, &hL, &HV);
    if (st != PW_OK) {
        if (c->cb == PW_OK)
            c->cb = st;
        return NAN;
    }
    return hL - (k->hdB + (k->hdD - k->hdB) * (x - c->s.xb) / (c->s.xd - c->s.xb));
}

/* h_DeltaD and h_DeltaB at reflux R. */
static void deltas(const en *c, double R, double *hdD, double *hdB)
{
    *hdD = c->h_D + (R + 1.0) * (c->H_top - c->h_D);
    *hdB = c->h_F - (*hdD - c->h_F) * (c->s.zf - c->s.xb) / (c->s.xd - c->s.zf);
}

/* Steps from the top at R. *x_stop receives the last liquid (where a stall happened). */
static pw_status step(en *c, double R, size_t max_stages, pw_profile *out, double *x_stop)
{
    const pw_column_spec *s = &c->s;
    double hdD, hdB;
    deltas(c, R, &hdD, &hdB);
    if (!(R >= 0.0) || !isfinite(R) || !(hdB < c->h_B))
        return PW_EINVAL; /* no reflux, or no reboiler duty */
    int_ctx k = {hdB, hdD};
    pw_status st;
    double ga = c->h_B - hdB, gb = c->h_D - hdD, x_int;
    if ((st = root(c, int_fn, &k, s->xb, s->xd, ga, gb, &x_int)) != PW_OK)
        return st;
    double y = s->xd, x_prev = s->xd;
    int feed = 0;
    if (out) {
        memset(out, 0, sizeof *out);
    }
    double V_next = (R + 1.0) * c->D;
    for (size_t n = 1; n <= max_stages; n++) {
        pw_stage g = {0};
        g.y = y;
        g.V = V_next;
        if ((st = e_x_of_y(c, y, &g.x, &g.T_K)) != PW_OK)
            return st;
        *x_stop = g.x;
        if (g.x <= s->xb) {
            g.L = c->B;
            if (out) {
                if ((st = pw_profile_push(out, &g)) != PW_OK)
                    return st;
                out->stages = (double)(n - 1) + (x_prev - s->xb) / (x_prev - g.x);
                out->feed_stage = feed ? feed : (int)n;
            }
            return PW_OK;
        }
        if (!(g.x < x_prev))
            return PW_EINFEASIBLE;
        if (!feed && g.x < x_int)
            feed = (int)n;
        double hn;
        if ((st = e_hL(c, g.x, g.T_K, &hn)) != PW_OK)
            return st;
        line_ctx l = {g.x, hn, feed ? s->xb : s->xd, feed ? hdB : hdD, feed != 0};
        double a = g.x, b = feed ? 1.0 : s->xd;
        double fa = ev(c, line_fn, &l, a, &st);
        if (st != PW_OK)
            return st;
        double fb = ev(c, line_fn, &l, b, &st);
        if (st != PW_OK)
            return st;
        double yn;
        if ((st = root(c, line_fn, &l, a, b, fa, fb, &yn)) != PW_OK)
            return st == PW_ENOBRACKET ? PW_EINFEASIBLE : st;
        if (feed) {
            V_next = c->B * (g.x - s->xb) / (yn - g.x);
            g.L = V_next + c->B;
        } else {
            g.L = c->D * (s->xd - yn) / (yn - g.x);
            V_next = g.L + c->D;
        }
        if (out && (st = pw_profile_push(out, &g)) != PW_OK)
            return st;
        y = yn;
        x_prev = g.x;
    }
    return PW_EMAXITER;
}

/* mirror: the spec is given with component 1 to the bottoms (xd < zf < xb); the context then
 * works in the mirrored frame (c->s mirrored too). */
static pw_status en_init(en *c, const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                         const pw_column_spec *spec, bool mirror)
{
    memset(c, 0, sizeof *c);
    pw_status st = pw_eqp_init(&c->e, sys, P_Pa);
    if (st != PW_OK)
        return st;
    c->h = heat;
    c->mirror = mirror;
    c->s = mirror ? pw_column_spec_mirror(spec) : *spec;
    const pw_column_spec *f = &c->s;
    c->D = (f->zf - f->xb) / (f->xd - f->xb);
    c->B = 1.0 - c->D;
    /* h_F = H_V - q (H_V - h_L) (pw_enthalpy_feed), from this context's own saturated states so
     * that q = 1 puts the feed point exactly on the liquid curve and q = 0 on the vapor curve. */
    double T, y, hLz, HVz, HVz_T, xz;
    if ((st = tie(c, f->zf, &y, &T, &hLz, &HVz_T)) != PW_OK ||
        (st = sat_vapor(c, f->zf, &HVz, &xz, &T)) != PW_OK)
        return st;
    c->h_F = HVz - f->q * (HVz - hLz);
    if ((st = e_bubble(c, f->xd, &y, &T)) != PW_OK || (st = e_hL(c, f->xd, T, &c->h_D)) != PW_OK)
        return st;
    if ((st = e_bubble(c, f->xb, &y, &T)) != PW_OK || (st = e_hL(c, f->xb, T, &c->h_B)) != PW_OK)
        return st;
    double x1;
    return sat_vapor(c, f->xd, &c->H_top, &x1, &T);
}

static void en_free(en *c)
{
    pw_eqp_free(&c->e);
}

/* Either direction: xb < zf < xd, or xd < zf < xb (component 1 to the bottoms). */
static bool spec_ok(const pw_column_spec *s)
{
    return s && isfinite(s->q) && pw_column_direction_of(s) != PW_DIRECTION_NONE &&
           fmin(s->xb, s->xd) >= 0.0 && fmax(s->xb, s->xd) <= 1.0;
}

static bool bottoms(const pw_column_spec *s)
{
    return pw_column_direction_of(s) == PW_DIRECTION_BOTTOMS;
}

pw_status pw_energy_profile(const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                            const pw_column_spec *spec, double R, size_t max_stages,
                            pw_profile *out, double *Q_C, double *Q_R)
{
    if (!out || !heat || !spec_ok(spec) || max_stages == 0)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    en c;
    pw_status st = en_init(&c, sys, heat, P_Pa, spec, bottoms(spec));
    double xs;
    if (st == PW_OK)
        st = step(&c, R, max_stages, out, &xs);
    if (st == PW_OK && c.mirror) /* fractions of component 1 again */
        for (size_t i = 0; i < out->n; i++) {
            out->stage[i].x = 1.0 - out->stage[i].x;
            out->stage[i].y = 1.0 - out->stage[i].y;
        }
    if (st == PW_OK) {
        double hdD, hdB;
        deltas(&c, R, &hdD, &hdB);
        if (Q_C)
            *Q_C = c.D * (hdD - c.h_D);
        if (Q_R)
            *Q_R = c.B * (c.h_B - hdB);
    } else {
        pw_profile_free(out);
    }
    en_free(&c);
    return st;
}

/* R from h_DeltaD. */
static double reflux_of(const en *c, double hdD)
{
    return (hdD - c->H_top) / (c->H_top - c->h_D);
}

/* h_DeltaD from h_DeltaB through the feed point. */
static double hdD_of_hdB(const en *c, double hdB)
{
    return c->h_F + (c->h_F - hdB) * (c->s.xd - c->s.zf) / (c->s.zf - c->s.xb);
}

static pw_status rmin_search(en *c, size_t grid, double rtol, pw_energy_result *out)
{
    const pw_column_spec *s = &c->s;
    double xf;
    int side;
    pw_status st = feed_liquid(c, &xf, &side);
    if (st != PW_OK)
        return st;
    double T;
    if (side == 0) {
        out->x_feed = xf;
        if ((st = e_bubble(c, xf, &out->y_feed, &T)) != PW_OK)
            return st;
    }
    /* A feed tie line below xb leaves the whole column, [xb, xd], to the rectifying section (the
     * reboiler duty's floor, zero, may then limit: see below); above xd, to the stripping section
     * (and R >= 0 may limit). */
    double xr = xf, vr = -INFINITY, xs_ = xf, vs_ = INFINITY;
    bool fr = false, fs = false;
    if (side <= 0 && (st = section_search(c, true, fmax(xf, s->xb), s->xd, grid, rtol, &xr, &vr,
                                          &fr)) != PW_OK)
        return st;
    if (side >= 0 && (st = section_search(c, false, s->xb, fmin(xf, s->xd), grid, rtol, &xs_,
                                          &vs_, &fs)) != PW_OK)
        return st;
    if (side != 0) {
        fr = fs = false; /* the end of the search is a product, not a feed point */
    }
    out->r_rect = reflux_of(c, vr);
    out->r_strip = reflux_of(c, hdD_of_hdB(c, vs_));
    bool rect = out->r_rect >= out->r_strip || (fr && fs);
    out->r_min = fmax(out->r_rect, out->r_strip);
    out->pinch.section = rect ? PW_SECTION_RECTIFYING : PW_SECTION_STRIPPING;
    out->pinch.kind = (rect ? fr : fs) ? PW_PINCH_FEED : PW_PINCH_TANGENT;
    out->pinch.x = rect ? xr : xs_;
    if (!(out->r_min > 0.0)) {
        out->r_min = 0.0;
        out->reflux_limited = true;
    }
    double hdD, hdB;
    deltas(c, out->r_min, &hdD, &hdB);
    if (!(hdB < c->h_B)) { /* no reboiler duty left: the feed brings the heat */
        out->reflux_limited = false;
        out->boilup_limited = true;
        out->r_min = reflux_of(c, hdD_of_hdB(c, c->h_B));
        out->pinch.kind = PW_PINCH_FEED;
        out->pinch.section = PW_SECTION_STRIPPING;
        out->pinch.x = s->xb;
    }
    return e_bubble(c, out->pinch.x, &out->pinch.y, &T);
}

/* A stage whose liquid lies inside the two-liquid region holds two layers, whose enthalpy (the
 * layers' enthalpies weighted by the lever rule) the energy column does not model yet: refused
 * with a reason (PW_ERANGE) when the column's liquids, between its products, reach into the
 * layers' gap at the three-phase temperature, where every liquid of the gap boils at the column
 * pressure. Models that cannot split are not checked. Every caller (reflux, screen, report, the
 * uncertainty draws) gets the refusal, since it is made here. */
static pw_status two_liquids(const pw_system *sys, double P_Pa, const pw_column_spec *spec,
                                    pw_energy_result *energy)
{
    if (!pw_model_can_split(sys->model))
        return PW_OK;
    pw_three_phase tp;
    pw_status st = pw_three_phase_at_P(sys, P_Pa, &tp);
    if (st != PW_OK)
        return st;
    const double lo = fmin(spec->xb, spec->xd), hi = fmax(spec->xb, spec->xd);
    if (!tp.exists || !(lo < tp.x[1] && hi > tp.x[0]))
        return PW_OK;
    energy->feasible = false;
    snprintf(energy->reason, sizeof energy->reason,
             "liquids x1 %.4g to %.4g reach into the two-liquid region (layers %.4f, %.4f at "
             PW_TEXT_T(".2f") "): a stage there holds two liquids, whose enthalpy --energy does not model "
             "yet (the decanter scheme applies)",
             lo, hi, tp.x[0], tp.x[1], tp.T_K);
    return PW_ERANGE;
}

pw_status pw_energy_column_solve(const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                                 const pw_column_spec *spec, const pw_column_options *opt,
                                 pw_energy_result *out, pw_design_table *design)
{
    if (!out || !heat || !sys)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->r_min = out->s_min = out->n_min = NAN;
    out->x_feed = out->y_feed = out->r_rect = out->r_strip = NAN;
    out->pinch.x = out->pinch.y = NAN;
    if (design) {
        memset(design, 0, sizeof *design);
        design->balance = PW_BALANCE_ENERGY;
    }
    if (!spec_ok(spec))
        return PW_EINVAL;
    const pw_column_options o = opt ? *opt : pw_column_default_options();
    if (o.n_factors > PW_COLUMN_MAX_FACTORS || o.grid < 16 || o.max_stages == 0)
        return PW_EINVAL;
    /* Feasibility and total reflux do not depend on the energy balance: the column module's. */
    pw_system_curve sc;
    pw_status st = pw_system_curve_init(&sc, sys, P_Pa);
    pw_column_result col;
    pw_column_options oc = o;
    oc.n_factors = 0;
    if (st == PW_OK) {
        pw_curve curve = pw_system_curve_bind(&sc);
        st = pw_column_solve_any_dy(&curve, pw_system_curve_dy(&sc), spec, &oc, &col);
    }
    if (st != PW_OK && !col.reason[0])
        return st;
    if (st != PW_OK || !col.feasible) {
        snprintf(out->reason, sizeof out->reason, "%s", col.reason);
        return st;
    }
    out->n_min = col.n_min;
    st = two_liquids(sys, P_Pa, spec, out);
    if (st != PW_OK)
        return st;
    en c;
    st = en_init(&c, sys, heat, P_Pa, spec, bottoms(spec));
    if (st == PW_OK) {
        out->h_F = c.h_F;
        out->h_D = c.h_D;
        out->h_B = c.h_B;
        out->H_top = c.H_top;
        st = rmin_search(&c, o.grid, o.rtol, out);
    }
    if (st == PW_OK && c.mirror) { /* the pinch and the feed's tie line in component 1 again */
        out->pinch.x = 1.0 - out->pinch.x;
        out->pinch.y = 1.0 - out->pinch.y;
        out->x_feed = 1.0 - out->x_feed;
        out->y_feed = 1.0 - out->y_feed;
    }
    en_free(&c);
    if (st != PW_OK || out->reason[0])
        return st;
    out->feasible = true;
    if (!design || !(out->r_min > 0.0))
        return PW_OK;
    for (size_t i = 0; i < o.n_factors; i++) {
        pw_design_case *d = &design->row[i];
        d->factor = o.factors[i];
        d->R = o.factors[i] * out->r_min;
        d->gilliland_stages = NAN;
        design->n = i + 1;
        st = pw_energy_profile(sys, heat, P_Pa, spec, d->R, o.max_stages, &d->profile, &d->Q_C,
                               &d->Q_R);
        if (st == PW_EINFEASIBLE || st == PW_EMAXITER || st == PW_EINVAL) {
            d->reachable = false;
            d->why = st;
            d->stages = d->boilup = d->Q_C = d->Q_R = NAN;
            continue;
        }
        if (st != PW_OK) {
            pw_design_table_free(design);
            return st;
        }
        d->reachable = true;
        d->why = PW_OK;
        d->stages = d->profile.stages;
        d->feed_stage = d->profile.feed_stage;
        const pw_profile *p = &d->profile;
        d->boilup = p->stage[p->n - 1].V / (1.0 - (spec->zf - spec->xb) / (spec->xd - spec->xb));
    }
    return PW_OK;
}

/* ---- rating with energy balances ---- */

/* The liquid on the line through DeltaB and the vapor (y, H): stage n-1's liquid from stage n's
 * vapor in the stripping section. g(x) > 0 at xb (Q_R > 0), < 0 at y (H_V > h_L). */
typedef struct liq_ctx {
    double y, H, hdB;
} liq_ctx;

static double liq_fn(en *c, double x, void *p)
{
    liq_ctx *l = p;
    double y, T, hL, HV;
    pw_status st = tie(c, x, &y, &T, &hL, &HV);
    if (st != PW_OK) {
        if (c->cb == PW_OK)
            c->cb = st;
        return NAN;
    }
    return (hL - l->hdB) * (l->y - c->s.xb) - (l->H - l->hdB) * (x - c->s.xb);
}

typedef struct rate_en {
    en c;
    const pw_rate_spec *r;
    bool by_xb;
    double Q_C, Q_R;
} rate_en;

static void rate_products(const rate_en *q, double w, double *xd, double *xb)
{
    const double D = q->r->d_frac, B = 1.0 - D, z = q->r->zf;
    if (q->by_xb) {
        *xb = w;
        *xd = fmin(1.0, fmax(0.0, (z - B * w) / D));
    } else {
        *xd = w;
        *xb = fmin(1.0, fmax(0.0, (z - D * w) / B));
    }
}

/* Both sections at products (xd, xb): the feed stage's liquid from each; the profile when asked. */
static pw_status rate_sections(rate_en *q, double xd, double xb, double *x_top, double *x_bot,
                               pw_profile *prof)
{
    en *c = &q->c;
    const pw_rate_spec *r = q->r;
    const int N = r->n_stages, K = r->feed_stage;
    const double D = r->d_frac, B = 1.0 - D;
    c->s.xd = xd;
    c->s.xb = xb;
    pw_status st;
    double y, T, hD, hB, Htop, xx;
    if ((st = e_bubble(c, xd, &y, &T)) != PW_OK ||
        (st = e_hL(c, xd, T, &hD)) != PW_OK ||
        (st = sat_vapor(c, xd, &Htop, &xx, &T)) != PW_OK)
        return st;
    if ((st = e_bubble(c, xb, &y, &T)) != PW_OK ||
        (st = e_hL(c, xb, T, &hB)) != PW_OK)
        return st;
    const double hdD = hD + (r->R + 1.0) * (Htop - hD);
    const double hdB = (c->h_F - D * hdD) / B; /* overall energy balance, F = 1 */
    q->Q_C = D * (hdD - hD);
    q->Q_R = B * (hB - hdB);
    if (!(q->Q_R > 0.0))
        return PW_EINFEASIBLE; /* no reboiler duty at these products */
    /* Top: stages 1..K. */
    double yv = xd, V = (r->R + 1.0) * D, x = NAN;
    size_t first = prof ? prof->n : 0;
    for (int n = 1; n <= K; n++) {
        pw_stage g = {.y = yv, .V = V};
        if ((st = e_x_of_y(c, yv, &g.x, &g.T_K)) != PW_OK)
            return st;
        x = g.x;
        if (n < K) {
            double hn;
            if ((st = e_hL(c, g.x, g.T_K, &hn)) != PW_OK)
                return st;
            line_ctx l = {g.x, hn, xd, hdD, false};
            double fa = ev(c, line_fn, &l, g.x, &st);
            if (st != PW_OK)
                return st;
            double fb = ev(c, line_fn, &l, xd, &st);
            if (st != PW_OK)
                return st;
            double yn;
            if ((st = root(c, line_fn, &l, g.x, xd, fa, fb, &yn)) != PW_OK)
                return st == PW_ENOBRACKET ? PW_EINFEASIBLE : st;
            g.L = D * (xd - yn) / (yn - g.x);
            V = g.L + D;
            yv = yn;
        }
        if (prof && (st = pw_profile_push(prof, &g)) != PW_OK)
            return st;
    }
    *x_top = x;
    /* Bottom: stages N..K+1, upwards. */
    double xs = xb;
    size_t first_bottom = prof ? prof->n : 0;
    for (int n = N; n > K; n--) {
        pw_stage g = {.x = xs};
        double hL, HV;
        if ((st = tie(c, xs, &g.y, &g.T_K, &hL, &HV)) != PW_OK)
            return st;
        liq_ctx l = {g.y, HV, hdB};
        double fa = ev(c, liq_fn, &l, xb, &st);
        if (st != PW_OK)
            return st;
        double fb = ev(c, liq_fn, &l, g.y, &st);
        if (st != PW_OK)
            return st;
        double xn;
        if ((st = root(c, liq_fn, &l, xb, g.y, fa, fb, &xn)) != PW_OK)
            return st == PW_ENOBRACKET ? PW_EINFEASIBLE : st;
        g.V = B * (xn - xb) / (g.y - xn); /* vapor leaving stage n, from the balance below n-1 */
        if (prof && (st = pw_profile_push(prof, &g)) != PW_OK)
            return st;
        xs = xn;
    }
    *x_bot = K == N ? xb : xs;
    if (prof) {
        /* Reverse the bottom stages, then the liquids leaving: L_n = V_{n+1} + B below the feed
         * stage's top side, B from the reboiler. */
        for (size_t i = first_bottom, j = prof->n - 1; i < j && j > 0; i++, j--) {
            pw_stage t = prof->stage[i];
            prof->stage[i] = prof->stage[j];
            prof->stage[j] = t;
        }
        for (size_t i = first + (size_t)K - 1; i < prof->n; i++)
            prof->stage[i].L = i + 1 < prof->n ? prof->stage[i + 1].V + B : B;
    }
    return PW_OK;
}

static pw_status rate_residual(void *p, double w, double *f)
{
    rate_en *q = p;
    double xd, xb, a, b;
    rate_products(q, w, &xd, &xb);
    pw_status st = rate_sections(q, xd, xb, &a, &b, NULL);
    if (st == PW_OK)
        *f = q->by_xb ? b - a : a - b;
    return st;
}

#define RATE_MAX_ROOTS 32

/* ---- every steady state of the rating ----
 * The mismatch r(w) of the two sections at the feed stage is smooth where it is defined (trial
 * products with a reboiler duty and a staircase on both sides). Its roots are enumerated by
 * pw_roots1d_all (src/base/solve1d.h), which cannot miss one under a curvature bound it checks at
 * every midpoint; where r is undefined (no products the stages can make) the search treats the
 * point as outside the domain and locates the domain's edge. */

pw_status pw_rate_energy(const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                         const pw_rate_spec *spec, pw_rate_result *out, double *Q_C, double *Q_R,
                         size_t *n_roots, pw_error *err)
{
    if (!out || !spec || !heat)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "no specification");
    memset(out, 0, sizeof *out);
    out->xd = out->xb = out->residual = NAN;
    *n_roots = 0;
    pw_status st = pw_rate_check_spec(spec, err);
    if (st != PW_OK)
        return st;
    const double D = spec->d_frac, B = 1.0 - D, z = spec->zf;
    /* The feed enthalpy needs a spec; the products are set per evaluation. */
    pw_column_spec s0 = {
        .xd = fmin(1.0, z + 0.5 * (1.0 - z)), .xb = 0.5 * z, .zf = z, .q = spec->q};
    rate_en q = {.r = spec};
    st = en_init(&q.c, sys, heat, P_Pa, &s0, false);
    if (st != PW_OK) {
        en_free(&q.c);
        return pw_error_set(err, st, NULL, 0, "rating: %s", pw_strerror(st));
    }
    q.by_xb = z / D <= 1.0;
    double lo, hi;
    if (q.by_xb) {
        lo = 0.0;
        hi = fmin(1.0, z / B);
    } else {
        lo = fmax(0.0, (z - B) / D);
        hi = 1.0;
    }
    /* Energy balances can give more than one steady state: every root of the mismatch, proved
     * (under the curvature bound) to be all of them; the first is reported with their count. */
    const pw_roots1d_opts ro = pw_roots1d_default_opts();
    double roots[RATE_MAX_ROOTS];
    size_t n_root = 0;
    unsigned long evals = 0;
    st = pw_roots1d_all(rate_residual, &q, lo, hi, &ro, roots, RATE_MAX_ROOTS, &n_root, &evals);
    double w_sol = NAN;
    if (st == PW_OK && n_root > 0) {
        /* the lowest distillate purity: the lowest xd, or the highest xb */
        w_sol = q.by_xb ? roots[n_root - 1] : roots[0];
        *n_roots = n_root;
    }
    out->iterations = (int)evals;
    if (st == PW_OK && !isfinite(w_sol))
        st = PW_ENOBRACKET;
    if (st == PW_OK) {
        double xd, xb, a, b;
        rate_products(&q, w_sol, &xd, &xb);
        st = rate_sections(&q, xd, xb, &a, &b, &out->profile);
        out->xd = xd;
        out->xb = xb;
        out->residual = a - b;
        out->profile.stages = spec->n_stages;
        out->profile.feed_stage = spec->feed_stage;
        if (Q_C)
            *Q_C = q.Q_C;
        if (Q_R)
            *Q_R = q.Q_R;
    }
    en_free(&q.c);
    if (st == PW_OK)
        return pw_rate_verify(sys, P_Pa, out, "rating with energy balances", err);
    if (st != PW_OK) {
        pw_rate_result_free(out);
        if (st == PW_ENOBRACKET)
            return pw_error_set(err, PW_EINFEASIBLE, NULL, 0,
                                "rating with energy balances: no steady state found (no reboiler "
                                "duty, or no products the stages can make at this reflux and "
                                "distillate rate)");
        if (st == PW_ENOCONV)
            return pw_error_set(err, st, NULL, 0,
                                "rating with energy balances: the search for every steady state "
                                "did not complete (the feed-stage mismatch curves too sharply "
                                "for %lu residual evaluations)",
                                ro.max_evals);
        if (st == PW_ERANGE)
            return pw_error_set(err, PW_ENOCONV, NULL, 0,
                                "rating with energy balances: more than %d steady states",
                                RATE_MAX_ROOTS);
        return pw_error_set(err, st, NULL, 0, "rating with energy balances: %s", pw_strerror(st));
    }
    return PW_OK;
}
