/* Column workspace: tolerances, safe curve evaluation, bracketed roots (base/solve1d), x*(y), and
 * the constant-molal-overflow balances (McCabe & Thiele 1925). */
#include "analysis/column_internal.h"
#include "base/solve1d.h"

#include <float.h>
#include <math.h>
#include <stdbool.h>

#define ROOT_MAX_ITER 200
/* Absolute precision assumed of a curve value y*(x): a bubble point converged by Newton gives
 * y to a few units of DBL_EPSILON; this leaves a wide margin (docs/column.md). */
#define CURVE_Y_NOISE 1e-13

pw_status pw_column_ws_init(pw_column_ws *w, const pw_curve *curve, double rtol)
{
    w->curve = curve;
    w->dy = NULL;
    w->tab_x = w->tab_y = w->tab_d = NULL;
    w->tab_n = 0;
    w->rtol = rtol;
    w->n_eval = 0;
    /* x tolerances: roots to well below rtol (a root error enters R linearly); minimisers to
     * about sqrt of that, since the extremal value is quadratic in the x error. */
    w->root_xtol = fmax(4.0 * DBL_EPSILON, 1e-3 * rtol);
    w->min_xtol = fmax(2.0 * sqrt(DBL_EPSILON), 1e-3 * sqrt(rtol));
    w->conv_bound = NAN;
    w->y_noise = CURVE_Y_NOISE;
    return PW_OK;
}

void pw_column_ws_free(pw_column_ws *w) { (void)w; }

pw_status pw_column_y(pw_column_ws *w, double x, double *y)
{
    if (!(x >= 0.0 && x <= 1.0))
        return PW_EDOM;
    w->n_eval++;
    pw_status st = w->curve->y_of_x(w->curve->ctx, x, y);
    if (st != PW_OK)
        return st;
    if (!isfinite(*y))
        return PW_EDOM;
    return PW_OK;
}

pw_status pw_column_y_dy(pw_column_ws *w, double x, double *y, double *d)
{
    if (!w->dy)
        return PW_EINVAL;
    if (!(x >= 0.0 && x <= 1.0))
        return PW_EDOM;
    w->n_eval++;
    pw_status st = w->dy(w->curve->ctx, x, y, d);
    if (st != PW_OK)
        return st;
    if (!isfinite(*y) || !isfinite(*d))
        return PW_EDOM;
    return PW_OK;
}

typedef struct root_ctx {
    pw_column_ws *w;
    pw_column_scalar_fn f;
    void *p;
} root_ctx;

static pw_status root_adapter(void *ctx, double x, double *v)
{
    root_ctx *c = ctx;
    return c->f(c->w, c->p, x, v);
}

pw_status pw_column_root(pw_column_ws *w, pw_column_scalar_fn f, void *p, double a, double b,
                         double fa, double fb, double *x)
{
    if (fa == 0.0) {
        *x = a;
        return PW_OK;
    }
    if (fb == 0.0) {
        *x = b;
        return PW_OK;
    }
    if ((fa > 0.0) == (fb > 0.0))
        return PW_ENOBRACKET;
    if (a > b) {
        double t = a, tf = fa;
        a = b;
        fa = fb;
        b = t;
        fb = tf;
    }
    root_ctx c = {w, f, p};
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = w->root_xtol;
    o.max_iter = ROOT_MAX_ITER;
    return pw_root1d(root_adapter, &c, a, b, fa, fb, &o, x, NULL);
}

static pw_status curve_minus_target(pw_column_ws *w, void *p, double x, double *f)
{
    double y;
    pw_status st = pw_column_y(w, x, &y);
    if (st != PW_OK)
        return st;
    *f = y - *(const double *)p;
    return PW_OK;
}

/* With the tabulated curve: the grid cell [x_j, x_j+1] whose y* values straddle y, found by
 * bisection on the table. The table is increasing on a feasible range; a cell that does not
 * straddle (a non-monotone stretch) makes the caller fall back to the wide bracket. */
static bool table_bracket(const pw_column_ws *w, double y, double xlo, size_t *j)
{
    const double *ty = w->tab_y;
    size_t n = w->tab_n;
    if (!ty || n < 2 || !(y >= ty[0] && y <= ty[n - 1]))
        return false;
    size_t lo = 0, hi = n - 1;
    while (hi - lo > 1) {
        size_t mid = lo + (hi - lo) / 2;
        if (ty[mid] <= y)
            lo = mid;
        else
            hi = mid;
    }
    if (!(ty[lo] <= y && y <= ty[lo + 1]) || w->tab_x[lo] < xlo)
        return false;
    *j = lo;
    return true;
}

#define NEWTON_MAX 6

/* x*(y) inside table cell j (ty[j] < y < ty[j+1]): Newton from the table. The start is the
 * inverse cubic through up to four neighbouring table points, the first step uses the slope of
 * the forward cubic there, later steps are secant steps; with a start good to about h^4 the answer
 * usually costs two curve evaluations. Every iterate stays inside the cell's bracket, which is
 * narrowed by the signs seen; anything else falls back to GSL Brent on that bracket. */
static pw_status invert_in_cell(pw_column_ws *w, double y, size_t j, double flo, double fhi,
                                double *x)
{
    const double *tx = w->tab_x, *ty = w->tab_y;
    const size_t n = w->tab_n;
    double lo = tx[j], hi = tx[j + 1];
    size_t a = j > 0 ? j - 1 : j, b = j + 2 < n ? j + 2 : j + 1;
    for (size_t k = a; k < b; k++)
        if (!(ty[k + 1] > ty[k])) {
            a = j;
            b = j + 1;
            break;
        }
    double x0 = 0.0, s0 = 0.0;
    for (size_t k = a; k <= b; k++) {
        double lk = 1.0;
        for (size_t m = a; m <= b; m++)
            if (m != k)
                lk *= (y - ty[m]) / (ty[k] - ty[m]);
        x0 += lk * tx[k];
    }
    if (!(x0 > lo && x0 < hi))
        x0 = lo + (hi - lo) * (-flo) / (fhi - flo);
    for (size_t k = a; k <= b; k++) { /* d/dx of the forward interpolant at x0 */
        double dk = 0.0;
        for (size_t i = a; i <= b; i++) {
            if (i == k)
                continue;
            double term = 1.0 / (tx[k] - tx[i]);
            for (size_t m = a; m <= b; m++)
                if (m != k && m != i)
                    term *= (x0 - tx[m]) / (tx[k] - tx[m]);
            dk += term;
        }
        s0 += dk * ty[k];
    }
    double target = y, f0;
    pw_status st = curve_minus_target(w, &target, x0, &f0);
    if (st != PW_OK)
        return st;
    double x1 = x0, f1 = f0;
    for (int it = 0; it < NEWTON_MAX; it++) {
        if (f1 == 0.0) {
            *x = x1;
            return PW_OK;
        }
        if (f1 < 0.0) {
            lo = x1;
            flo = f1;
        } else {
            hi = x1;
            fhi = f1;
        }
        double step = it == 0 ? -f1 / s0 : -f1 * (x1 - x0) / (f1 - f0);
        double x2 = x1 + step;
        if (!isfinite(x2) || !(x2 >= lo && x2 <= hi))
            break;
        if (fabs(step) <= w->root_xtol) {
            *x = x2;
            return PW_OK;
        }
        x0 = x1;
        f0 = f1;
        x1 = x2;
        st = curve_minus_target(w, &target, x1, &f1);
        if (st != PW_OK)
            return st;
    }
    if (flo == 0.0 || fhi == 0.0) {
        *x = flo == 0.0 ? lo : hi;
        return PW_OK;
    }
    return pw_column_root(w, curve_minus_target, &target, lo, hi, flo, fhi, x);
}

/* The cubic Hermite interpolant of the table's cell j (values and slopes at both ends) at x. */
static void hermite(const pw_column_ws *w, size_t j, double x, double *p, double *dp)
{
    const double a = w->tab_x[j], h = w->tab_x[j + 1] - a, t = (x - a) / h;
    const double y0 = w->tab_y[j], y1 = w->tab_y[j + 1];
    const double m0 = w->tab_d[j] * h, m1 = w->tab_d[j + 1] * h;
    const double t2 = t * t, t3 = t2 * t;
    *p = (2.0 * t3 - 3.0 * t2 + 1.0) * y0 + (t3 - 2.0 * t2 + t) * m0 + (-2.0 * t3 + 3.0 * t2) * y1 +
         (t3 - t2) * m1;
    *dp = ((6.0 * t2 - 6.0 * t) * y0 + (3.0 * t2 - 4.0 * t + 1.0) * m0 + (-6.0 * t2 + 6.0 * t) * y1 +
           (3.0 * t2 - 2.0 * t) * m1) /
          h;
}

/* Newton steps on y*(x) = y with the analytic slope dy* / dx from xk, every iterate kept inside
 * the bracket [lo, hi] (f = y* - y: flo < 0 < fhi, flo NAN when not known), which the signs seen
 * narrow. It ends at a step of at most root_xtol (the secant path's rule), or earlier when the
 * step's square, scaled by M / (2 |dy* / dx|) (M bounds |y*''| with a margin), is already that
 * small: Newton's error after the step. *done false: give the bracket to a safer solver. */
static pw_status newton_bracketed(pw_column_ws *w, double y, double xk, double M, double *lo,
                                  double *hi, double *flo, double *fhi, double *x, bool *done)
{
    *done = false;
    for (int it = 0; it < NEWTON_MAX; it++) {
        double yk, dk;
        pw_status st = pw_column_y_dy(w, xk, &yk, &dk);
        if (st != PW_OK)
            return st;
        double fk = yk - y;
        if (fk == 0.0) {
            *x = xk;
            *done = true;
            return PW_OK;
        }
        if (fk < 0.0) {
            *lo = xk;
            *flo = fk;
        } else {
            *hi = xk;
            *fhi = fk;
        }
        double step = -fk / dk, xn = xk + step;
        if (!isfinite(xn) || !(xn >= *lo && xn <= *hi))
            return PW_OK;
        if (fabs(step) <= w->root_xtol || 0.5 * M * step * step <= w->root_xtol * fabs(dk)) {
            *x = xn;
            *done = true;
            return PW_OK;
        }
        xk = xn;
    }
    return PW_OK;
}

/* x*(y) inside table cell j (ty[j] < y < ty[j+1]) with the curve's slope: the start solves the
 * cell's cubic Hermite interpolant for y (no curve evaluation; good to about h^4), then
 * newton_bracketed. Usually two curve evaluations. Anything else falls back to GSL Brent on the
 * bracket. */
static pw_status newton_in_cell(pw_column_ws *w, double y, size_t j, double flo, double fhi,
                                double *x)
{
    double lo = w->tab_x[j], hi = w->tab_x[j + 1];
    double xk = lo + (hi - lo) * (-flo) / (fhi - flo);
    for (int it = 0; it < 8; it++) { /* Newton on the interpolant, safeguarded */
        double p, dp;
        hermite(w, j, xk, &p, &dp);
        double xn = xk - (p - y) / dp;
        if (!isfinite(xn) || !(xn > lo && xn < hi))
            break;
        bool small = fabs(xn - xk) <= 1e-3 * w->root_xtol;
        xk = xn;
        if (small)
            break;
    }
    /* |y*''| on the cell: twice the interpolant's end curvatures, at least K */
    const double h = hi - lo, sl = (w->tab_y[j + 1] - w->tab_y[j]) / h;
    const double c0 = (6.0 * sl - 4.0 * w->tab_d[j] - 2.0 * w->tab_d[j + 1]) / h;
    const double c1 = (2.0 * w->tab_d[j] + 4.0 * w->tab_d[j + 1] - 6.0 * sl) / h;
    const double M = fmax(2.0 * fmax(fabs(c0), fabs(c1)), fabs(w->conv_bound));
    bool done;
    pw_status st = newton_bracketed(w, y, xk, M, &lo, &hi, &flo, &fhi, x, &done);
    if (st != PW_OK || done)
        return st;
    if (flo == 0.0 || fhi == 0.0) {
        *x = flo == 0.0 ? lo : hi;
        return PW_OK;
    }
    double target = y;
    return pw_column_root(w, curve_minus_target, &target, lo, hi, flo, fhi, x);
}

/* x*(y) below the table (y < y*(xb): the last stage's liquid lies below xb): Newton from the
 * tangent at xb, inside (0, xb). *done false when it does not get there. */
static pw_status newton_below(pw_column_ws *w, double y, double *x, bool *done)
{
    *done = false;
    const double x0 = w->tab_x[0], y0 = w->tab_y[0], d0 = w->tab_d[0];
    double xk = x0 + (y - y0) / d0;
    if (!(d0 > 0.0) || !(xk > 0.0 && xk < x0))
        return PW_OK;
    double lo = 0.0, hi = x0, flo = NAN, fhi = y0 - y;
    /* no bound on |y*''| below the table (the curve may bend hard towards x = 0): the step rule
     * alone ends it */
    pw_status st = newton_bracketed(w, y, xk, INFINITY, &lo, &hi, &flo, &fhi, x, done);
    if (st == PW_OK && *done && !(*x > 0.0 && *x < x0))
        *done = false;
    return st;
}

pw_status pw_column_x_of_y(pw_column_ws *w, double y, double xlo, double *x)
{
    if (!(y > 0.0 && y <= 1.0) || !(xlo >= 0.0 && xlo < y))
        return PW_EDOM;
    size_t j;
    if (table_bracket(w, y, xlo, &j)) {
        double fa = w->tab_y[j] - y, fb = w->tab_y[j + 1] - y;
        if (fa == 0.0) {
            *x = w->tab_x[j];
            return PW_OK;
        }
        if (fb == 0.0) {
            *x = w->tab_x[j + 1];
            return PW_OK;
        }
        if (w->dy && w->tab_d)
            return newton_in_cell(w, y, j, fa, fb, x);
        return invert_in_cell(w, y, j, fa, fb, x);
    }
    if (w->dy && w->tab_d && w->tab_n >= 2 && y < w->tab_y[0] && xlo == w->tab_x[0]) {
        bool done;
        pw_status st = newton_below(w, y, x, &done);
        if (st != PW_OK || done)
            return st;
    }
    double target = y, flo, fhi;
    pw_status st = curve_minus_target(w, &target, xlo, &flo);
    if (st != PW_OK)
        return st;
    if (flo <= 0.0) {
        st = curve_minus_target(w, &target, y, &fhi);
        if (st != PW_OK)
            return st;
        return pw_column_root(w, curve_minus_target, &target, xlo, y, flo, fhi, x);
    }
    /* The equilibrium liquid lies below xlo (a last step that overshoots xb). */
    double f0;
    st = curve_minus_target(w, &target, 0.0, &f0);
    if (st != PW_OK)
        return st;
    return pw_column_root(w, curve_minus_target, &target, 0.0, xlo, f0, flo, x);
}

double pw_column_d_frac(const pw_column_spec *s) { return (s->zf - s->xb) / (s->xd - s->xb); }

double pw_column_b_frac(const pw_column_spec *s) { return (s->xd - s->zf) / (s->xd - s->xb); }

double pw_column_boilup(const pw_column_spec *s, double R)
{
    return ((R + 1.0) * pw_column_d_frac(s) - (1.0 - s->q)) / pw_column_b_frac(s);
}

double pw_column_reflux_of_boilup(const pw_column_spec *s, double S)
{
    return (S * pw_column_b_frac(s) + (1.0 - s->q)) / pw_column_d_frac(s) - 1.0;
}

double pw_column_alpha(double x, double y)
{
    if (!(x > 0.0 && x < 1.0 && y > 0.0 && y < 1.0))
        return NAN;
    return y * (1.0 - x) / (x * (1.0 - y));
}
