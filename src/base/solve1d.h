/* One bracketed 1-D root driver and one bracketed 1-D minimiser driver, GSL Brent inside, and the
 * one place where GSL status codes become pw_status. Private to the library (not installed).
 *
 * The boundary towards GSL (docs/hardening.md, "The GSL boundary"):
 * - the callback returns a pw_status; a failing callback, or a non-finite value, is recorded, the
 *   solver stops after the current step and the driver returns that status (PW_EDOM for a
 *   non-finite value). GSL never sees a NaN or an infinity: a failed evaluation is handed to it as
 *   a finite placeholder and its result is thrown away;
 * - every precondition GSL would report through its error handler (an interval given backwards,
 *   endpoints that do not straddle zero, a triple that does not enclose a minimum, a non-finite
 *   value) is checked here first and returned as a status, so GSL's handler is never called and
 *   the result does not depend on which handler the host installed;
 * - the solver state lives on the caller's stack (no gsl_*_alloc, whose failure would reach the
 *   handler), the convergence tests are done here.
 * Thread-safe: no state outside the call. */
#ifndef PW_BASE_SOLVE1D_H
#define PW_BASE_SOLVE1D_H

#include <pinchwise/status.h>

/* f(x) -> *f with a status; *f is used only on PW_OK and must then be finite. */
typedef pw_status (*pw_fn1d)(void *ctx, double x, double *f);

typedef struct pw_solve1d_opts {
    double xtol_abs;   /* converged when the bracket is narrower than */
    double xtol_rel;   /* xtol_abs + xtol_rel * min |x| over it (GSL's interval test) */
    unsigned max_iter; /* Brent steps; then PW_EMAXITER */
    double f_stop;     /* minimiser only: stop once the best value is below this (-INFINITY: off) */
} pw_solve1d_opts;

/* xtol_abs 0, xtol_rel 4 DBL_EPSILON, max_iter 200, f_stop -INFINITY. */
pw_solve1d_opts pw_solve1d_default_opts(void);

/* Root of f in [a, b] (a < b, finite). fa, fb: f(a), f(b) when known, NAN to let the driver
 * evaluate them. A zero at an end is returned at once. Errors: PW_EINVAL (bad interval or options),
 * PW_ENOBRACKET (same sign at both ends), PW_EMAXITER, the callback's status. *iters (may be NULL)
 * receives the number of Brent steps. *root is written only on PW_OK. */
pw_status pw_root1d(pw_fn1d f, void *ctx, double a, double b, double fa, double fb,
                    const pw_solve1d_opts *o, double *root, unsigned *iters);

/* Minimum of f on [a, b] from the interior point m, a < m < b, with f(m) < f(a) and f(m) < f(b)
 * (values given, NAN to evaluate). Errors: PW_EINVAL, PW_ENOBRACKET (the triple does not enclose
 * a minimum), PW_EMAXITER, the callback's status. *xmin, *fmin receive the best point found so far
 * whatever the status (the start triple's middle at worst). */
pw_status pw_min1d(pw_fn1d f, void *ctx, double a, double m, double b, double fa, double fm,
                   double fb, const pw_solve1d_opts *o, double *xmin, double *fmin,
                   unsigned *iters);

/* The one mapping of GSL status codes (gsl_errno.h) to pw_status. */
pw_status pw_gsl_status(int gsl_code);

#endif
