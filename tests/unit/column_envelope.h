/* An independent minimum-reflux computation for the column tests (test code only): no library
 * code, no GSL. The operating lines' limiting slopes are taken over a dense uniform grid of each
 * section (the envelope of the lines through the product points and the curve), the best grid
 * point is polished by golden-section search, and R follows from the constant-molal-overflow
 * balances (McCabe & Thiele 1925; written out again here). Also the check that the operating
 * path at a given R stays on or below the curve. */
#ifndef PW_TEST_COLUMN_ENVELOPE_H
#define PW_TEST_COLUMN_ENVELOPE_H

#include <math.h>
#include <pinchwise/column.h>
#include <stdbool.h>

typedef double (*env_curve)(const void *ctx, double x);

/* where the q-line meets the curve: scan from zf away (towards xb for q < 1, xd for q > 1) in
 * steps of 1e-5 (xd - xb), then bisection to rounding level. NAN when not inside (xb, xd). */
static inline double env_xq(env_curve y, const void *c, const pw_column_spec *s)
{
    if (s->q == 1.0)
        return s->zf;
    double dir = s->q < 1.0 ? -1.0 : 1.0, step = 1e-5 * (s->xd - s->xb);
#define PW_ENV_H(x) (s->q * (x) + (1.0 - s->q) * y(c, (x)) - s->zf)
    double a = s->zf, ha = PW_ENV_H(a);
    for (;;) {
        double b = a + dir * step;
        if (b <= s->xb || b >= s->xd)
            return NAN;
        double hb = PW_ENV_H(b);
        if ((ha > 0.0) != (hb > 0.0) || hb == 0.0) {
            for (int i = 0; i < 200; i++) {
                double m = 0.5 * (a + b), hm = PW_ENV_H(m);
                if (m == a || m == b)
                    break;
                if ((hm > 0.0) == (ha > 0.0)) {
                    a = m;
                    ha = hm;
                } else {
                    b = m;
                }
            }
            return 0.5 * (a + b);
        }
        a = b;
        ha = hb;
    }
#undef PW_ENV_H
}

/* (p - y(x))/|p - x|: m* (p = xd) or -s* (p = xb); maximised. */
static inline double env_val(env_curve y, const void *c, double p, double x)
{
    return (p - y(c, x)) / fabs(p - x);
}

/* max of env_val over n + 1 uniform points of [a, b] (the point at the pole p left out), the best
 * polished by golden-section search between its neighbours. */
static inline double env_max(env_curve y, const void *c, double p, double a, double b, int n,
                             double *x_at)
{
    double best = -INFINITY, xb = a;
    int ib = 0;
    for (int i = 0; i <= n; i++) {
        double x = a + (b - a) * i / n;
        if (x == p)
            continue;
        double v = env_val(y, c, p, x);
        if (v > best) {
            best = v;
            xb = x;
            ib = i;
        }
    }
    if (ib > 0 && ib < n) {
        const double g = 0.5 * (sqrt(5.0) - 1.0);
        double lo = a + (b - a) * (ib - 1) / n, hi = a + (b - a) * (ib + 1) / n;
        if (lo == p)
            lo = xb - 0.5 * (xb - lo);
        if (hi == p)
            hi = xb + 0.5 * (hi - xb);
        double x1 = hi - g * (hi - lo), x2 = lo + g * (hi - lo);
        double f1 = env_val(y, c, p, x1), f2 = env_val(y, c, p, x2);
        for (int it = 0; it < 200 && hi - lo > 1e-15; it++) {
            if (f1 > f2) {
                hi = x2;
                x2 = x1;
                f2 = f1;
                x1 = hi - g * (hi - lo);
                f1 = env_val(y, c, p, x1);
            } else {
                lo = x1;
                x1 = x2;
                f1 = f2;
                x2 = lo + g * (hi - lo);
                f2 = env_val(y, c, p, x2);
            }
        }
        double xm = 0.5 * (lo + hi), vm = env_val(y, c, p, xm);
        if (vm > best) {
            best = vm;
            xb = xm;
        }
    }
    if (x_at)
        *x_at = xb;
    return best;
}

typedef struct env_result {
    double x_q, r_rect, r_strip, r_min, x_rect, x_strip;
} env_result;

/* Minimum reflux from the envelope of each section on n points: [x_q, xd] and [xb, x_q]. */
static inline env_result env_rmin(env_curve y, const void *c, const pw_column_spec *s, int n)
{
    env_result e;
    e.x_q = env_xq(y, c, s);
    double D = (s->zf - s->xb) / (s->xd - s->xb), B = 1.0 - D;
    double m = env_max(y, c, s->xd, e.x_q, s->xd, n, &e.x_rect);
    double sl = -env_max(y, c, s->xb, s->xb, e.x_q, n, &e.x_strip);
    e.r_rect = m / (1.0 - m);                     /* L/D from L/V */
    double S = 1.0 / (sl - 1.0);                  /* Vbar/B from Lbar/Vbar = (S + 1)/S */
    e.r_strip = (S * B + (1.0 - s->q)) / D - 1.0; /* V = Vbar + (1 - q) F, R = V/D - 1 */
    e.r_min = fmax(e.r_rect, e.r_strip);
    return e;
}

/* min over the n + 1 uniform points of [xb, xd], and the extra points given, of y*(x) minus the
 * operating path at reflux R (rectifying line right of the lines' intersection, stripping line
 * left of it). *ok = false when the boil-up is not positive (no two-section column). */
static inline double env_path_gap(env_curve y, const void *c, const pw_column_spec *s, double R,
                                  int n, const double *extra, int n_extra, const double *ytab)
{
    double D = (s->zf - s->xb) / (s->xd - s->xb), B = 1.0 - D;
    double S = ((R + 1.0) * D - (1.0 - s->q)) / B;
    double m = R / (R + 1.0), sl = (S + 1.0) / S;
    double xi = ((1.0 - m) * s->xd + (sl - 1.0) * s->xb) / (sl - m);
    double g = INFINITY;
    for (int i = 0; i <= n + n_extra; i++) {
        double x = i <= n ? s->xb + (s->xd - s->xb) * i / n : extra[i - n - 1];
        double yy = i <= n && ytab ? ytab[i] : y(c, x);
        double line = x >= xi ? m * x + (1.0 - m) * s->xd : sl * x - (sl - 1.0) * s->xb;
        g = fmin(g, yy - line);
    }
    return g;
}

#endif
