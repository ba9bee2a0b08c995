/* Closed-form shortcuts for constant relative volatility: Underwood (1948) minimum reflux,
 * Fenske (1932) total-reflux stages; Gilliland-type stage correlations of Molokanov et al.
 * (1972) and Eduljee (1975). See docs/column.md. */
#include <pinchwise/column.h>

#include <float.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
#include <math.h>

typedef struct underwood_feed {
    double alpha, zf, q;
} underwood_feed;

/* sum_i alpha_i z_i / (alpha_i - theta) - (1 - q), binary, heavy key alpha = 1. Increasing in
 * theta on (1, alpha), from -inf to +inf. */
static double underwood_feed_fn(double theta, void *p)
{
    const underwood_feed *u = p;
    return u->alpha * u->zf / (u->alpha - theta) + (1.0 - u->zf) / (1.0 - theta) - (1.0 - u->q);
}

pw_status pw_underwood_rmin(double alpha, double zf, double xd, double q, double *r_min)
{
    if (!r_min || !(alpha > 1.0) || !isfinite(alpha) || !(zf > 0.0 && zf < 1.0) ||
        !(xd > zf && xd <= 1.0) || !isfinite(q))
        return PW_EINVAL;
    underwood_feed u = {alpha, zf, q};
    double span = alpha - 1.0;
    double lo = 1.0 + 1e-14 * span, hi = alpha - 1e-14 * span;
    if (!(underwood_feed_fn(lo, &u) < 0.0 && underwood_feed_fn(hi, &u) > 0.0))
        return PW_ENOBRACKET;
    gsl_function F = {underwood_feed_fn, &u};
    gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!s)
        return PW_ENOMEM;
    pw_status st = PW_EMAXITER;
    double theta = NAN;
    if (gsl_root_fsolver_set(s, &F, lo, hi) != GSL_SUCCESS) {
        st = PW_ENOBRACKET;
    } else {
        for (int it = 0; it < 200; it++) {
            if (gsl_root_fsolver_iterate(s) != GSL_SUCCESS) {
                st = PW_ENOCONV;
                break;
            }
            double a = gsl_root_fsolver_x_lower(s), b = gsl_root_fsolver_x_upper(s);
            if (gsl_root_test_interval(a, b, 0.0, 4.0 * DBL_EPSILON) == GSL_SUCCESS) {
                theta = gsl_root_fsolver_root(s);
                st = PW_OK;
                break;
            }
        }
    }
    gsl_root_fsolver_free(s);
    if (st != PW_OK)
        return st;
    *r_min = alpha * xd / (alpha - theta) + (1.0 - xd) / (1.0 - theta) - 1.0;
    return PW_OK;
}

double pw_fenske_nmin(double alpha, double xd, double xb)
{
    if (!(alpha > 1.0) || !isfinite(alpha) || !(xb > 0.0 && xb < xd && xd < 1.0))
        return NAN;
    return log((xd / (1.0 - xd)) * ((1.0 - xb) / xb)) / log(alpha);
}

/* Gilliland abscissa X = (R - R_min)/(R + 1); NAN for invalid input. */
static double gilliland_x(double n_min, double R, double r_min)
{
    if (!(n_min >= 0.0) || !isfinite(n_min) || !(r_min >= 0.0) || !isfinite(R) || !(R >= r_min))
        return NAN;
    return (R - r_min) / (R + 1.0);
}

/* N from Y = (N - N_min)/(N + 1). */
static double stages_of_y(double Y, double n_min) { return (Y + n_min) / (1.0 - Y); }

double pw_gilliland_molokanov(double n_min, double R, double r_min)
{
    double X = gilliland_x(n_min, R, r_min);
    if (isnan(X))
        return NAN;
    if (X <= 0.0)
        return INFINITY; /* at minimum reflux */
    double Y = 1.0 - exp((1.0 + 54.4 * X) / (11.0 + 117.2 * X) * (X - 1.0) / sqrt(X));
    return stages_of_y(Y, n_min);
}

double pw_gilliland_eduljee(double n_min, double R, double r_min)
{
    double X = gilliland_x(n_min, R, r_min);
    if (isnan(X))
        return NAN;
    double Y = 0.75 * (1.0 - pow(X, 0.5668));
    return stages_of_y(Y, n_min);
}
