/* Column workspace: tolerances, safe curve evaluation, bracketed roots (base/solve1d), x*(y), and
 * the constant-molal-overflow balances (McCabe & Thiele 1925). */
#include "analysis/column_internal.h"
#include "base/solve1d.h"

#include <float.h>
#include <math.h>

#define ROOT_MAX_ITER 200
/* Absolute precision assumed of a curve value y*(x): a bubble point converged by Newton gives
 * y to a few units of DBL_EPSILON; this leaves a wide margin (docs/column.md). */
#define CURVE_Y_NOISE 1e-13

pw_status pw_column_ws_init(pw_column_ws *w, const pw_curve *curve, double rtol)
{
    w->curve = curve;
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
        return invert_in_cell(w, y, j, fa, fb, x);
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
