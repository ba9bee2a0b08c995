/* Closed-form shortcuts for constant relative volatility: Underwood (1948) minimum reflux,
 * Fenske (1932) total-reflux stages; Gilliland-type stage correlations of Molokanov et al.
 * (1972) and Eduljee (1975). See docs/column.md. */
#include <pinchwise/column.h>

#include "base/solve1d.h"

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

static pw_status underwood_fn1d(void *p, double theta, double *f)
{
    *f = underwood_feed_fn(theta, p);
    return PW_OK;
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
    pw_solve1d_opts o = pw_solve1d_default_opts();
    double theta = NAN;
    pw_status st = pw_root1d(underwood_fn1d, &u, lo, hi, NAN, NAN, &o, &theta, NULL);
    if (st != PW_OK)
        return st;
    *r_min = alpha * xd / (alpha - theta) + (1.0 - xd) / (1.0 - theta) - 1.0;
    return PW_OK;
}

pw_status pw_fenske_nmin(double alpha, double xd, double xb, double *n_min)
{
    if (!n_min || !(alpha > 1.0) || !isfinite(alpha) || !(xb > 0.0 && xb < xd && xd < 1.0))
        return PW_EINVAL;
    *n_min = log((xd / (1.0 - xd)) * ((1.0 - xb) / xb)) / log(alpha);
    return PW_OK;
}

/* Gilliland abscissa X = (R - R_min)/(R + 1); PW_EINVAL for invalid input. */
static pw_status gilliland_x(double n_min, double R, double r_min, double *X)
{
    if (!(n_min >= 0.0) || !isfinite(n_min) || !(r_min >= 0.0) || !isfinite(R) || !(R >= r_min))
        return PW_EINVAL;
    *X = (R - r_min) / (R + 1.0);
    return PW_OK;
}

/* N from Y = (N - N_min)/(N + 1). */
static double stages_of_y(double Y, double n_min) { return (Y + n_min) / (1.0 - Y); }

pw_status pw_gilliland_molokanov(double n_min, double R, double r_min, double *stages)
{
    double X;
    if (!stages || gilliland_x(n_min, R, r_min, &X) != PW_OK)
        return PW_EINVAL;
    if (X <= 0.0) {
        *stages = INFINITY; /* at minimum reflux */
        return PW_OK;
    }
    double Y = 1.0 - exp((1.0 + 54.4 * X) / (11.0 + 117.2 * X) * (X - 1.0) / sqrt(X));
    *stages = stages_of_y(Y, n_min);
    return PW_OK;
}

pw_status pw_gilliland_eduljee(double n_min, double R, double r_min, double *stages)
{
    double X;
    if (!stages || gilliland_x(n_min, R, r_min, &X) != PW_OK)
        return PW_EINVAL;
    *stages = stages_of_y(0.75 * (1.0 - pow(X, 0.5668)), n_min);
    return PW_OK;
}
