/* Private to the column module: a workspace holding the GSL solvers (allocated once per call,
 * reused in every inner loop), safe curve evaluation, the inverse curve x*(y), and the
 * constant-molal-overflow mass balances. Not installed. */
#ifndef PW_ANALYSIS_COLUMN_INTERNAL_H
#define PW_ANALYSIS_COLUMN_INTERNAL_H

#include <gsl/gsl_errno.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_roots.h>
#include <pinchwise/column.h>

/* Absolute floor under which y* - x counts as zero (a pinch with no driving force). */
#define PW_COLUMN_TOUCH_TOL 1e-10

typedef struct pw_column_ws {
    const pw_curve *curve;
    gsl_root_fsolver *root;   /* Brent, bracketed */
    gsl_min_fminimizer *min;  /* Brent minimiser */
    double root_xtol;         /* absolute x tolerance of root solves */
    double min_xtol;          /* absolute x tolerance of minimisations */
    pw_status cb_status;      /* first failure inside a GSL callback */
    unsigned long n_eval;     /* curve evaluations (benchmarks, diagnostics) */
    const double *tab_x, *tab_y; /* y*(x) tabulated on [xb, xd] (NULL when not yet): brackets */
    size_t tab_n;                /* the inversions x*(y) between neighbouring grid points */
} pw_column_ws;

/* Allocates the solvers; rtol is the relative tolerance on R_min (see docs/column.md for how
 * it maps to x tolerances). PW_ENOMEM on allocation failure (nothing left allocated). */
pw_status pw_column_ws_init(pw_column_ws *w, const pw_curve *curve, double rtol);
/* Frees the solvers; accepts a zeroed or already freed workspace. */
void pw_column_ws_free(pw_column_ws *w);

/* y*(x) through the callback; PW_EDOM for x outside [0,1] or a non-finite answer. */
pw_status pw_column_y(pw_column_ws *w, double x, double *y);

/* Root of f(x) = 0 bracketed by [a, b] with fa = f(a), fb = f(b) of opposite signs (or one
 * zero), by GSL Brent. f returns a status through the workspace. */
typedef pw_status (*pw_column_scalar_fn)(pw_column_ws *w, void *p, double x, double *f);
pw_status pw_column_root(pw_column_ws *w, pw_column_scalar_fn f, void *p, double a, double b,
                         double fa, double fb, double *x);

/* x*(y): the liquid in equilibrium with vapour y, for y in (0, 1]. The root is looked for in
 * [xlo, y] first (the curve lies above the diagonal there), then in [0, xlo]. PW_ENOBRACKET when
 * neither interval holds it. */
pw_status pw_column_x_of_y(pw_column_ws *w, double y, double xlo, double *x);

/* Stepping shared by the public functions. total = true: operating line is the diagonal (R is
 * ignored, feed_stage may be NULL). */
pw_status pw_column_step_ws(pw_column_ws *w, const pw_column_spec *s, bool total, double R,
                            size_t max_stages, double *stages, int *feed_stage);

/* Feasibility on a tabulated curve: xg[0] = xb ... xg[n-1] = xd, yg = y*(xg); fg (n, scratch)
 * receives y* - x. *ok = false with a reason in words when y* - x > PW_COLUMN_TOUCH_TOL fails
 * anywhere on [xb, xd] (grid minima are refined). Errors only for curve failures. */
pw_status pw_column_check_feasible(pw_column_ws *w, const double *xg, const double *yg, double *fg,
                                   size_t n, bool *ok, char *reason, size_t len);

/* Where the q-line meets the curve, x_q strictly inside (xb, xd); q = 1 gives x_q = zf exactly.
 * PW_ERANGE when the intersection lies outside (extreme feed conditions). */
pw_status pw_column_qline(pw_column_ws *w, const pw_column_spec *s, const double *xg,
                          const double *yg, size_t n, double *xq, double *yq);

/* The limiting slope of one section over its tabulated points px/py (n_pts, sorted in x, the
 * q-line point at index 0 for the rectifying section and at n_pts-1 for the stripping section):
 * rectifying max of (xd - y*)/(xd - x), stripping min of (y* - xb)/(x - xb), refined by GSL
 * Brent minimisation. *at_feed is true when the extremum is the q-line point. */
pw_status pw_column_section_limit(pw_column_ws *w, const pw_column_spec *s, pw_section sec,
                                  const double *px, const double *py, size_t n_pts, double *slope,
                                  double *x_lim, double *y_lim, bool *at_feed);

/* D/F and B/F from the component balance. */
double pw_column_d_frac(const pw_column_spec *s);
double pw_column_b_frac(const pw_column_spec *s);
/* Boil-up ratio Vbar/B at reflux R: [(R+1) D - (1-q) F] / B. */
double pw_column_boilup(const pw_column_spec *s, double R);
/* Reflux ratio from boil-up S: [S B + (1-q) F] / D - 1. */
double pw_column_reflux_of_boilup(const pw_column_spec *s, double S);
/* Relative volatility y(1-x)/(x(1-y)); NAN where undefined (x or y at 0 or 1). */
double pw_column_alpha(double x, double y);

#endif
