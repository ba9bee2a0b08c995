/* Closed-form equilibrium curves for the column tests (test code only).
 *
 * Variable relative volatility alpha(x) = r exp[A(1 - 2x)], y = alpha x / (1 + (alpha - 1) x):
 * A = 0 is constant relative volatility; with r = P1sat/P2sat it is also the one-parameter
 * Margules liquid at constant T (ln gamma1 = A x2^2, ln gamma2 = A x1^2), whose azeotrope is at
 * x = [1 + ln(r)/A]/2 (METHODS 5.6). The reflected curve maps each point (x, y) to
 * (1 - y, 1 - x) (METHODS 6.3 (iii)). */
#ifndef PW_TEST_COLUMN_CURVES_H
#define PW_TEST_COLUMN_CURVES_H

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <pinchwise/column.h>

typedef struct tc_alpha {
    double r, A;
} tc_alpha;

static inline double tc_alpha_y(const tc_alpha *c, double x)
{
    double a = c->r * exp(c->A * (1.0 - 2.0 * x));
    return a * x / (1.0 + (a - 1.0) * x);
}

static inline pw_status tc_alpha_fn(void *ctx, double x, double *y)
{
    *y = tc_alpha_y(ctx, x);
    return PW_OK;
}

/* Touching curve: alpha(x) = 1 + c (x - x0)^2 (equals 1 only at x0). */
typedef struct tc_touch {
    double c, x0;
} tc_touch;

static inline pw_status tc_touch_fn(void *ctx, double x, double *y)
{
    const tc_touch *t = ctx;
    double a = 1.0 + t->c * (x - t->x0) * (x - t->x0);
    *y = a * x / (1.0 + (a - 1.0) * x);
    return PW_OK;
}

/* Inverse of tc_alpha_y by GSL Brent (the curve is increasing for the cases used). */
static inline double tc_inv_fn(double x, void *p)
{
    const double *args = p; /* args[0] = r, args[1] = A, args[2] = target y */
    tc_alpha c = {args[0], args[1]};
    return tc_alpha_y(&c, x) - args[2];
}

static inline pw_status tc_alpha_x_of_y(const tc_alpha *c, double y, double *x)
{
    if (y <= 0.0 || y >= 1.0) {
        *x = y;
        return PW_OK;
    }
    double args[3] = {c->r, c->A, y};
    gsl_function F = {tc_inv_fn, args};
    gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!s)
        return PW_ENOMEM;
    pw_status st = PW_ENOCONV;
    if (gsl_root_fsolver_set(s, &F, 0.0, 1.0) == GSL_SUCCESS) {
        for (int i = 0; i < 200; i++) {
            gsl_root_fsolver_iterate(s);
            double lo = gsl_root_fsolver_x_lower(s), hi = gsl_root_fsolver_x_upper(s);
            if (gsl_root_test_interval(lo, hi, 1e-16, 1e-16) == GSL_SUCCESS) {
                *x = gsl_root_fsolver_root(s);
                st = PW_OK;
                break;
            }
        }
    }
    gsl_root_fsolver_free(s);
    return st;
}

/* Reflected curve: y'(x') = 1 - x*(1 - x') of the original. */
static inline pw_status tc_reflect_fn(void *ctx, double xp, double *yp)
{
    double x;
    pw_status st = tc_alpha_x_of_y(ctx, 1.0 - xp, &x);
    if (st == PW_OK)
        *yp = 1.0 - x;
    return st;
}

#endif
