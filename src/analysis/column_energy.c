/* Binary column with an energy balance on every stage (Ponchon 1921; Savarit 1922): difference
 * points DeltaD = (xd, h_D + Q_C/D) and DeltaB = (xb, h_B - Q_R/B), collinear with the feed
 * point (zf, h_F); stage-to-stage stepping along the lines through them; minimum reflux from the
 * tie lines of both sections extended to the products, with a stepping check just above the
 * answer. The enthalpy model is enthalpy.h's. See docs/column.md ("Energy balances").
 *
 * Minimum reflux. A tie line (x, h_L) - (y*, H_V) at the bubble point of x, extended to x = xd,
 * meets it at v_r(x) = h_L + (H_V - h_L)(xd - x)/(y* - x); the rectifying section needs
 * h_DeltaD >= v_r(x) for every liquid x it holds, [x_f, xd], where x_f is the liquid of the tie
 * line through the feed point. Likewise the stripping section needs h_DeltaB <= v_s(x) (the tie
 * line extended to xb) on [xb, x_f], which maps through the feed point onto h_DeltaD. The search:
 * a scan of each section (both ends included), every interior local extremum refined by Brent's
 * method, an inward probe beside the feed end; then the column is stepped at (1 + 1e-5) R_min:
 * a staircase cannot jump over a point where the operating curve touches the equilibrium curve
 * (the stage map is increasing, so it cannot pass one of its fixed points), so a pinch the scan
 * missed stops the stepping, and the search is repeated around where it stopped. */
#include "analysis/design_internal.h"

#include "base/solve1d.h"

#include <float.h>
#include <math.h>
#include <pinchwise/curve.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define MIN_ITER 100
#define ROOT_ITER 200
#define CERT_REL 1e-5 /* stepping check at (1 + CERT_REL) R_min */
#define CERT_MAX_STAGES 20000
#define CERT_REPAIRS 4
#define PROBE_REL 1e-9

typedef struct en {
    pw_eqp e;
    const pw_heat_data *h;
    pw_column_spec s;
    double D, B, h_F, h_D, h_B, H_top;
    pw_status cb;
} en;

/* ---- enthalpies along the saturation curves ---- */

/* The tie line at liquid x: y*, the bubble temperature, h_L, H_V. */
static pw_status tie(en *c, double x, double *y, double *T, double *hL, double *HV)
{
    pw_status st = pw_eqp_bubble(&c->e, x, y, T);
    if (st == PW_OK)
        st = pw_enthalpy_liquid(c->e.sys, c->h, x, *T, hL);
    if (st == PW_OK)
        *HV = pw_enthalpy_vapor(c->h, *y, *T);
    return st;
}

/* Saturated vapor of composition y: its enthalpy (at its dew point) and the liquid x*(y). */
static pw_status sat_vapor(en *c, double y, double *H, double *x, double *T)
{
    pw_status st = pw_eqp_x_of_y(&c->e, y, x, T);
    if (st == PW_OK)
        *H = pw_enthalpy_vapor(c->h, y, *T);
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

/* Maximises sign*f on [a, b] from m (values known, fm at least both ends'). A triple that does
 * not strictly enclose a maximum (a flat stretch) or an iteration limit keeps the best point
 * found: the answer is then that point's value, never above the true maximum. */
static pw_status refine_max(en *c, en_fn f, void *p, double sign, double a, double m, double b,
                            double fa, double fm, double fb, double *x, double *v)
{
    adapt t = {c, f, p, -sign};
    if (a > b) {
        double tx = a, tv = fa;
        a = b;
        fa = fb;
        b = tx;
        fb = tv;
    }
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = 1e-12;
    o.xtol_rel = 0.0;
    o.max_iter = MIN_ITER;
    double xm = m, fmin = -sign * fm;
    pw_status st =
        pw_min1d(adapt_fn, &t, a, m, b, -sign * fa, -sign * fm, -sign * fb, &o, &xm, &fmin, NULL);
    if (st != PW_OK && st != PW_ENOBRACKET && st != PW_EMAXITER)
        return st;
    *x = xm;
    *v = -fmin * sign; /* the value of f itself */
    return PW_OK;
}

/* ---- the section values ---- */

/* The tie line at x extended to x = *(double *)p (xd: rectifying, xb: stripping). */
static double extended_tie(en *c, double x, void *p)
{
    const double xe = *(const double *)p;
    double y, T, hL, HV;
    pw_status st = tie(c, x, &y, &T, &hL, &HV);
    if (st != PW_OK) {
        if (c->cb == PW_OK)
            c->cb = st;
        return NAN;
    }
    if (!(y > x)) {
        if (c->cb == PW_OK)
            c->cb = PW_EINFEASIBLE;
        return NAN;
    }
    return hL + (HV - hL) * (xe - x) / (y - x);
}

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
    if ((st = pw_eqp_x_of_y(&c->e, s->zf, &xz, &Tz)) != PW_OK)
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

/* Extremum of sign * v over [a, b] (sign = +1 max, -1 min), the end `fe` (a or b) being the feed
 * end. Scan of n points, every interior local extremum refined, inward probe at the feed end. */
static pw_status section_extremum(en *c, double xe, double sign, double a, double b, bool feed_at_a,
                                  size_t n, double *x_best, double *v_best, bool *at_feed)
{
    if (n < 3)
        return PW_EINVAL;
    double *xs = calloc(2 * n, sizeof *xs);
    if (!xs)
        return PW_ENOMEM;
    double *vs = xs + n;
    pw_status st = PW_OK;
    for (size_t j = 0; j < n && st == PW_OK; j++) {
        xs[j] = j + 1 == n ? b : a + (b - a) * (double)j / (double)(n - 1);
        vs[j] = sign * ev(c, extended_tie, &xe, xs[j], &st);
    }
    if (st != PW_OK) {
        free(xs);
        return st;
    }
    size_t ef = feed_at_a ? 0 : n - 1;
    *x_best = xs[ef];
    double best = vs[ef];
    *at_feed = true;
    for (size_t j = 0; j < n && st == PW_OK; j++) {
        bool interior = j > 0 && j + 1 < n;
        if (!interior) {
            if (j != ef && vs[j] > best) { /* the product end (never limits in practice) */
                best = vs[j];
                *x_best = xs[j];
                *at_feed = false;
            }
            continue;
        }
        if (!(vs[j] >= vs[j - 1] && vs[j] >= vs[j + 1]))
            continue;
        double xr, vr;
        st = refine_max(c, extended_tie, &xe, sign, xs[j - 1], xs[j], xs[j + 1], sign * vs[j - 1],
                        sign * vs[j], sign * vs[j + 1], &xr, &vr);
        if (st == PW_OK && sign * vr > best) {
            best = sign * vr;
            *x_best = xr;
            *at_feed = false;
        }
    }
    /* Rising just inside the feed end, below the grid's resolution? */
    if (st == PW_OK) {
        size_t nb = feed_at_a ? 1 : n - 2;
        double d = xs[nb] - xs[ef];
        double xp = xs[ef] + PROBE_REL * (b - a) * (d > 0 ? 1.0 : -1.0);
        double vp = sign * ev(c, extended_tie, &xe, xp, &st);
        if (st == PW_OK && vp > vs[ef] && vs[nb] < vp) {
            double xo = xs[nb], vo = vs[nb];
            for (int i = 1; i < 60 && st == PW_OK; i++) {
                double xm = xs[ef] + d * ldexp(1.0, -i);
                double vm = sign * ev(c, extended_tie, &xe, xm, &st);
                if (st == PW_OK && vm > vs[ef] && vm > vo) {
                    double xr, vr;
                    st = refine_max(c, extended_tie, &xe, sign, xs[ef], xm, xo, sign * vs[ef],
                                    sign * vm, sign * vo, &xr, &vr);
                    if (st == PW_OK && sign * vr > best) {
                        best = sign * vr;
                        *x_best = xr;
                        *at_feed = false;
                    }
                    break;
                }
                xo = xm;
                vo = vm;
            }
        }
    }
    free(xs);
    *v_best = sign * best;
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
    pw_eq_point d;
    pw_status st = pw_dew_T(c->e.sys, c->e.P_Pa, y, &d);
    if (st != PW_OK) {
        if (c->cb == PW_OK)
            c->cb = st;
        return NAN;
    }
    const double H = pw_enthalpy_vapor(c->h, y, d.T_K);
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
        if ((st = pw_eqp_x_of_y(&c->e, y, &g.x, &g.T_K)) != PW_OK)
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
        if ((st = pw_enthalpy_liquid(c->e.sys, c->h, g.x, g.T_K, &hn)) != PW_OK)
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

static pw_status en_init(en *c, const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                         const pw_column_spec *spec)
{
    memset(c, 0, sizeof *c);
    pw_status st = pw_eqp_init(&c->e, sys, P_Pa);
    if (st != PW_OK)
        return st;
    c->h = heat;
    c->s = *spec;
    c->D = (spec->zf - spec->xb) / (spec->xd - spec->xb);
    c->B = 1.0 - c->D;
    /* h_F = H_V - q (H_V - h_L) (pw_enthalpy_feed), from this context's own saturated states so
     * that q = 1 puts the feed point exactly on the liquid curve and q = 0 on the vapor curve. */
    double T, y, hLz, HVz, HVz_T, xz;
    if ((st = tie(c, spec->zf, &y, &T, &hLz, &HVz_T)) != PW_OK ||
        (st = sat_vapor(c, spec->zf, &HVz, &xz, &T)) != PW_OK)
        return st;
    c->h_F = HVz - spec->q * (HVz - hLz);
    if ((st = pw_eqp_bubble(&c->e, spec->xd, &y, &T)) != PW_OK ||
        (st = pw_enthalpy_liquid(sys, heat, spec->xd, T, &c->h_D)) != PW_OK)
        return st;
    if ((st = pw_eqp_bubble(&c->e, spec->xb, &y, &T)) != PW_OK ||
        (st = pw_enthalpy_liquid(sys, heat, spec->xb, T, &c->h_B)) != PW_OK)
        return st;
    double x1;
    return sat_vapor(c, spec->xd, &c->H_top, &x1, &T);
}

static void en_free(en *c)
{
    pw_eqp_free(&c->e);
}

static bool spec_ok(const pw_column_spec *s)
{
    return s && isfinite(s->q) && s->xb >= 0.0 && s->xb < s->zf && s->zf < s->xd && s->xd <= 1.0;
}

pw_status pw_energy_profile(const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                            const pw_column_spec *spec, double R, size_t max_stages,
                            pw_profile *out, double *Q_C, double *Q_R)
{
    if (!out || !heat || !spec_ok(spec) || max_stages == 0)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    en c;
    pw_status st = en_init(&c, sys, heat, P_Pa, spec);
    double xs;
    if (st == PW_OK)
        st = step(&c, R, max_stages, out, &xs);
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

static pw_status rmin_search(en *c, size_t grid, pw_energy_result *out)
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
        if ((st = pw_eqp_bubble(&c->e, xf, &out->y_feed, &T)) != PW_OK)
            return st;
    }
    /* A feed tie line below xb leaves the whole column to the rectifying section (the reboiler
     * duty's floor, zero, may then limit: see below); above xd, to the stripping section (and
     * R >= 0 may limit). */
    double xr = xf, vr = -INFINITY, xs_ = xf, vs_ = INFINITY;
    bool fr = false, fs = false;
    if (side <= 0 &&
        (st = section_extremum(c, s->xd, 1.0, xf, s->xd, true, grid, &xr, &vr, &fr)) != PW_OK)
        return st;
    if (side >= 0 &&
        (st = section_extremum(c, s->xb, -1.0, s->xb, xf, false, grid, &xs_, &vs_, &fs)) != PW_OK)
        return st;
    if (side != 0) {
        fr = fs = false; /* the end of the scan is a product, not a feed point */
    }
    /* The stepping check: a pinch the scan missed stops the staircase just above R_min. */
    for (int rep = 0;; rep++) {
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
        if ((st = pw_eqp_bubble(&c->e, out->pinch.x, &out->pinch.y, &T)) != PW_OK)
            return st;
        if (out->reflux_limited || out->boilup_limited || rep == CERT_REPAIRS)
            return PW_OK;
        double x_stop = NAN;
        double Rc = out->r_min * (1.0 + CERT_REL) + 1e-12;
        st = step(c, Rc, CERT_MAX_STAGES, NULL, &x_stop);
        if (st == PW_OK)
            return PW_OK;
        if (st != PW_EINFEASIBLE && st != PW_EMAXITER)
            return st;
        /* Search again around where the staircase stopped, in the section it was in. */
        double w = 2.0 * (s->xd - s->xb) / (double)(grid - 1);
        bool in_rect = x_stop > xf;
        double a = in_rect ? fmax(xf, x_stop - w) : fmax(s->xb, x_stop - w);
        double b = in_rect ? fmin(s->xd, x_stop + w) : fmin(xf, x_stop + w);
        double xn, vn;
        bool fn;
        if (in_rect) {
            if ((st = section_extremum(c, s->xd, 1.0, a, b, a == xf, grid, &xn, &vn, &fn)) != PW_OK)
                return st;
            if (!(vn > vr))
                return PW_OK; /* nothing higher: the stepping limit, not a missed pinch */
            vr = vn;
            xr = xn;
            fr = fn && a == xf;
        } else {
            if ((st = section_extremum(c, s->xb, -1.0, a, b, b != xf, grid, &xn, &vn, &fn)) !=
                PW_OK)
                return st;
            if (!(vn < vs_))
                return PW_OK;
            vs_ = vn;
            xs_ = xn;
            fs = fn && b == xf;
        }
    }
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
        st = pw_column_solve(&curve, spec, &oc, &col);
    }
    if (st != PW_OK && !col.reason[0])
        return st;
    if (st != PW_OK || !col.feasible) {
        snprintf(out->reason, sizeof out->reason, "%s", col.reason);
        return st;
    }
    out->n_min = col.n_min;
    en c;
    st = en_init(&c, sys, heat, P_Pa, spec);
    if (st == PW_OK) {
        out->h_F = c.h_F;
        out->h_D = c.h_D;
        out->h_B = c.h_B;
        out->H_top = c.H_top;
        st = rmin_search(&c, o.grid, out);
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
    if ((st = pw_eqp_bubble(&c->e, xd, &y, &T)) != PW_OK ||
        (st = pw_enthalpy_liquid(c->e.sys, c->h, xd, T, &hD)) != PW_OK ||
        (st = sat_vapor(c, xd, &Htop, &xx, &T)) != PW_OK)
        return st;
    if ((st = pw_eqp_bubble(&c->e, xb, &y, &T)) != PW_OK ||
        (st = pw_enthalpy_liquid(c->e.sys, c->h, xb, T, &hB)) != PW_OK)
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
        if ((st = pw_eqp_x_of_y(&c->e, yv, &g.x, &g.T_K)) != PW_OK)
            return st;
        x = g.x;
        if (n < K) {
            double hn;
            if ((st = pw_enthalpy_liquid(c->e.sys, c->h, g.x, g.T_K, &hn)) != PW_OK)
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

#define RATE_SCAN 48

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
    st = en_init(&q.c, sys, heat, P_Pa, &s0);
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
    /* Energy balances can give more than one steady state: scan the unknown, solve every
     * bracketed sign change, report the first and how many there were. */
    double wv[RATE_SCAN], rv[RATE_SCAN];
    for (int i = 0; i < RATE_SCAN; i++) {
        wv[i] = lo + (hi - lo) * (double)i / (RATE_SCAN - 1);
        rv[i] = NAN;
        pw_status si = rate_residual(&q, wv[i], &rv[i]);
        if (si != PW_OK)
            rv[i] = NAN;
        if (si != PW_OK && si != PW_EINFEASIBLE && si != PW_ENOBRACKET) {
            st = si;
            break;
        }
    }
    double w_sol = NAN;
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = 1e-300; /* a product near 0 is resolved to full relative precision */
    o.xtol_rel = 4.0 * DBL_EPSILON;
    o.max_iter = ROOT_ITER;
    for (int i = 0; st == PW_OK && i + 1 < RATE_SCAN; i++) {
        if (!isfinite(rv[i]) || !isfinite(rv[i + 1]))
            continue;
        if (!((rv[i] <= 0.0 && rv[i + 1] > 0.0) || (rv[i] >= 0.0 && rv[i + 1] < 0.0)))
            continue;
        double w = NAN;
        if (pw_root1d(rate_residual, &q, wv[i], wv[i + 1], rv[i], rv[i + 1], &o, &w, NULL) != PW_OK)
            continue;
        if (!isfinite(w_sol))
            w_sol = w;
        (*n_roots)++;
    }
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
    if (st != PW_OK) {
        pw_rate_result_free(out);
        if (st == PW_ENOBRACKET)
            return pw_error_set(err, PW_EINFEASIBLE, NULL, 0,
                                "rating with energy balances: no steady state found (no reboiler "
                                "duty, or no products the stages can make at this reflux and "
                                "distillate rate)");
        return pw_error_set(err, st, NULL, 0, "rating with energy balances: %s", pw_strerror(st));
    }
    return PW_OK;
}
