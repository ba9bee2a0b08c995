/* Bracketed 1-D root and minimum by GSL's Brent solvers behind a boundary that never reaches GSL's
 * error handler. See solve1d.h and docs/hardening.md. */
#include "base/solve1d.h"

#include <float.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <stdalign.h>
#include <stdbool.h>
#include <stddef.h>

/* Room for the Brent states (root 64 bytes, minimiser 48 bytes in GSL 2.x); checked at run time. */
#define STATE_BYTES 256

pw_solve1d_opts pw_solve1d_default_opts(void)
{
    pw_solve1d_opts o = {
        .xtol_abs = 0.0, .xtol_rel = 4.0 * DBL_EPSILON, .max_iter = 200, .f_stop = -INFINITY};
    return o;
}

pw_status pw_gsl_status(int gsl_code)
{
    switch (gsl_code) {
    case GSL_SUCCESS:
        return PW_OK;
    case GSL_EMAXITER:
        return PW_EMAXITER;
    case GSL_ENOMEM:
        return PW_ENOMEM;
    case GSL_EINVAL:
    case GSL_EBADLEN:
    case GSL_EBADTOL:
        return PW_EINVAL;
    case GSL_EDOM:
    case GSL_EBADFUNC:
    case GSL_EZERODIV:
    case GSL_EOVRFLW:
    case GSL_EUNDRFLW:
        return PW_EDOM;
    case GSL_ERANGE:
        return PW_ERANGE;
    case GSL_ESING:
        return PW_ESINGULAR;
    default: /* GSL_CONTINUE, GSL_ENOPROG, GSL_ENOPROGJ, GSL_ETOL..., GSL_FAILURE */
        return PW_ENOCONV;
    }
}

typedef struct tramp {
    pw_fn1d f;
    void *ctx;
    pw_status st;    /* first failure */
    double fallback; /* finite value handed to GSL after a failure */
    double xa, fa, xb, fb; /* known values (GSL's set evaluates the ends again): not recomputed */
} tramp;

static double tramp_fn(double x, void *p)
{
    tramp *t = p;
    if (t->st != PW_OK)
        return t->fallback;
    if (x == t->xa)
        return t->fa;
    if (x == t->xb)
        return t->fb;
    double v = 0.0;
    pw_status st = isfinite(x) ? t->f(t->ctx, x, &v) : PW_EDOM;
    if (st == PW_OK && !isfinite(v))
        st = PW_EDOM;
    if (st != PW_OK) {
        t->st = st;
        return t->fallback;
    }
    return v;
}

static pw_status eval(tramp *t, double x, double *v)
{
    pw_status st = t->f(t->ctx, x, v);
    if (st == PW_OK && !isfinite(*v))
        st = PW_EDOM;
    return st;
}

static bool opts_ok(const pw_solve1d_opts *o)
{
    return o->xtol_abs >= 0.0 && o->xtol_rel >= 0.0 && isfinite(o->xtol_abs) &&
           isfinite(o->xtol_rel) && (o->xtol_abs > 0.0 || o->xtol_rel > 0.0) && o->max_iter > 0 &&
           !isnan(o->f_stop);
}

/* GSL's gsl_root_test_interval / gsl_min_test_interval, without its error paths. */
static bool interval_done(double lo, double hi, const pw_solve1d_opts *o)
{
    double min_abs =
        (lo > 0.0 && hi > 0.0) || (lo < 0.0 && hi < 0.0) ? fmin(fabs(lo), fabs(hi)) : 0.0;
    return fabs(hi - lo) < o->xtol_abs + o->xtol_rel * min_abs;
}

pw_status pw_root1d(pw_fn1d f, void *ctx, double a, double b, double fa, double fb,
                    const pw_solve1d_opts *o, double *root, unsigned *iters)
{
    if (iters)
        *iters = 0;
    if (!f || !root || !o || !opts_ok(o) || !isfinite(a) || !isfinite(b) || !(a < b))
        return PW_EINVAL;
    tramp t = {f, ctx, PW_OK, 0.0, NAN, NAN, NAN, NAN};
    pw_status st;
    if (isnan(fa) && (st = eval(&t, a, &fa)) != PW_OK)
        return st;
    if (isnan(fb) && (st = eval(&t, b, &fb)) != PW_OK)
        return st;
    if (!isfinite(fa) || !isfinite(fb))
        return PW_EDOM;
    if (fa == 0.0) {
        *root = a;
        return PW_OK;
    }
    if (fb == 0.0) {
        *root = b;
        return PW_OK;
    }
    if ((fa > 0.0) == (fb > 0.0))
        return PW_ENOBRACKET;
    const gsl_root_fsolver_type *T = gsl_root_fsolver_brent;
    alignas(max_align_t) unsigned char state[STATE_BYTES];
    if (T->size > sizeof state)
        return PW_ENOMEM;
    t.xa = a;
    t.fa = fa;
    t.xb = b;
    t.fb = fb;
    gsl_function F = {tramp_fn, &t};
    gsl_root_fsolver s = {
        .type = T, .function = &F, .root = 0.0, .x_lower = a, .x_upper = b, .state = state};
    /* What gsl_root_fsolver_set does, on a solver that lives here. GSL asks for the values at the
     * ends again: they are answered from what is known. A callback that fails answers 0, which
     * never trips GSL's straddle check, and the recorded failure is returned. */
    int gs = T->set(s.state, s.function, &s.root, a, b);
    if (t.st != PW_OK)
        return t.st;
    if (gs != GSL_SUCCESS)
        return pw_gsl_status(gs);
    for (unsigned it = 1; it <= o->max_iter; it++) {
        if (iters)
            *iters = it;
        gs = T->iterate(s.state, s.function, &s.root, &s.x_lower, &s.x_upper);
        if (t.st != PW_OK)
            return t.st;
        if (gs != GSL_SUCCESS)
            return pw_gsl_status(gs);
        if (interval_done(s.x_lower, s.x_upper, o)) {
            *root = s.root;
            return PW_OK;
        }
    }
    return PW_EMAXITER;
}

pw_status pw_min1d(pw_fn1d f, void *ctx, double a, double m, double b, double fa, double fm,
                   double fb, const pw_solve1d_opts *o, double *xmin, double *fmin, unsigned *iters)
{
    if (iters)
        *iters = 0;
    if (!f || !xmin || !fmin || !o || !opts_ok(o) || !isfinite(a) || !isfinite(m) || !isfinite(b) ||
        !(a < m && m < b))
        return PW_EINVAL;
    tramp t = {f, ctx, PW_OK, 0.0, NAN, NAN, NAN, NAN};
    pw_status st;
    if (isnan(fm) && (st = eval(&t, m, &fm)) != PW_OK)
        return st;
    *xmin = m;
    *fmin = fm;
    if (isnan(fa) && (st = eval(&t, a, &fa)) != PW_OK)
        return st;
    if (isnan(fb) && (st = eval(&t, b, &fb)) != PW_OK)
        return st;
    if (!isfinite(fa) || !isfinite(fm) || !isfinite(fb))
        return PW_EDOM;
    if (!(fm < fa && fm < fb))
        return PW_ENOBRACKET;
    const gsl_min_fminimizer_type *T = gsl_min_fminimizer_brent;
    alignas(max_align_t) unsigned char state[STATE_BYTES];
    if (T->size > sizeof state)
        return PW_ENOMEM;
    t.fallback = fm;
    gsl_function F = {tramp_fn, &t};
    gsl_min_fminimizer s = {.type = T,
                            .function = &F,
                            .x_minimum = m,
                            .f_minimum = fm,
                            .x_lower = a,
                            .f_lower = fa,
                            .x_upper = b,
                            .f_upper = fb,
                            .state = state};
    /* What gsl_min_fminimizer_set_with_values does once its checks (made above) pass. */
    int gs = T->set(s.state, s.function, m, fm, a, fa, b, fb);
    if (gs != GSL_SUCCESS)
        return pw_gsl_status(gs);
    for (unsigned it = 1; it <= o->max_iter; it++) {
        if (iters)
            *iters = it;
        gs = T->iterate(s.state, s.function, &s.x_minimum, &s.f_minimum, &s.x_lower, &s.f_lower,
                        &s.x_upper, &s.f_upper);
        if (t.st != PW_OK)
            return t.st;
        if (gs != GSL_SUCCESS)
            return pw_gsl_status(gs);
        *xmin = s.x_minimum;
        *fmin = s.f_minimum;
        if (s.f_minimum < o->f_stop || interval_done(s.x_lower, s.x_upper, o))
            return PW_OK;
    }
    return PW_EMAXITER;
}
