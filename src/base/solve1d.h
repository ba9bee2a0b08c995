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

/* ---- Every root of a smooth function on an interval ----
 * pw_roots1d_all finds every root of f on [lo, hi] under a curvature bound it checks as it goes.
 * Assumption: |f''| <= K where f is defined; K starts as 4 times the largest second difference of
 * an even scan of o->scan points (plus 1e-6) and is raised, with a restart, whenever a midpoint
 * sampled lies further from its chord than K allows. A cell [a, b] with both ends defined holds
 *   - no root when the signs agree and min(|f_a|, |f_b|) > K h^2/8 + noise, or when f' cannot
 *     vanish (f' lies within K h/2 + 2 noise/h of the chord's slope);
 *   - exactly one root when the signs differ and f' cannot vanish (Brent finds it);
 * any other cell is halved. A cell with one undefined end is halved until the domain's edge is
 * located to edge_rel of the range; one with two undefined ends is taken as outside the domain
 * (the stated limit: a domain island narrower than the scan's spacing is missed). At the
 * resolution limit, a cell narrower than min_cell_rel of the range or than 2 sqrt(noise / K), a
 * sign change gives one root, and roots that f's precision cannot separate (a pair within the
 * noise, a double root) are not resolved further. Also stated: K is estimated from the scan, so a
 * function that oscillates between the scan's points (an odd number of roots hidden inside one
 * spacing with f'' beyond the estimate where no midpoint is sampled) can be missed: the scan must
 * resolve f's curvature.
 * f is outside its domain at x when the callback returns PW_EDOM, PW_EINFEASIBLE or
 * PW_ENOBRACKET, or PW_OK with a non-finite value; any other failing status stops the search and
 * is returned. Roots closer than 1e-10 of the range are one root.
 * roots (room for max_roots) receives them sorted ascending, *n_roots their number. Errors:
 * PW_EINVAL (bad interval or options), PW_ENOCONV (more than max_evals evaluations, more than
 * o->restarts raises of K, or the cell stack overflowed), PW_ERANGE (more than max_roots roots;
 * the first max_roots found are kept). *evals (may be NULL) receives the number of evaluations
 * of the scan and the halving (max_evals bounds these; each root's Brent steps come on top, at
 * most 200 each). Thread-safe: no state outside the call. */
typedef struct pw_roots1d_opts {
    unsigned scan;       /* points of the first even scan, >= 3 */
    unsigned long max_evals;
    unsigned restarts;   /* raises of K allowed */
    double noise;        /* absolute precision assumed of f */
    double edge_rel;     /* the domain's edge is located to this fraction of the range */
    double min_cell_rel; /* cells are not split below this fraction of the range */
} pw_roots1d_opts;

/* scan 48, max_evals 3000, restarts 8, noise 1e-12, edge_rel 1e-9, min_cell_rel 1e-13. */
pw_roots1d_opts pw_roots1d_default_opts(void);

pw_status pw_roots1d_all(pw_fn1d f, void *ctx, double lo, double hi, const pw_roots1d_opts *o,
                         double *roots, size_t max_roots, size_t *n_roots, unsigned long *evals);

/* The one mapping of GSL status codes (gsl_errno.h) to pw_status. */
pw_status pw_gsl_status(int gsl_code);

#endif
