/* Private to the column module: a workspace (tolerances, the table of the curve, the convexity
 * bound the pinch search relies on), safe curve evaluation, bracketed roots through
 * base/solve1d, the inverse curve x*(y), and the constant-molal-overflow mass balances. Not
 * installed. */
#ifndef PW_ANALYSIS_COLUMN_INTERNAL_H
#define PW_ANALYSIS_COLUMN_INTERNAL_H

#include <pinchwise/column.h>
#include <stdbool.h>
#include <stddef.h>

/* Absolute floor under which y* - x counts as zero (a pinch with no driving force). */
#define PW_COLUMN_TOUCH_TOL 1e-10

typedef struct pw_column_ws {
    const pw_curve *curve;
    pw_curve_dy_fn dy;        /* y* and dy* / dx together for curve->ctx, or NULL (no slopes) */
    double rtol;              /* relative tolerance on R_min */
    double root_xtol;         /* absolute x tolerance of root solves */
    double min_xtol;          /* absolute x tolerance of minimisations */
    unsigned long n_eval;     /* curve evaluations (benchmarks, diagnostics) */
    double conv_bound;        /* K >= y*'' on [xb, xd] (the search's assumption; docs/column.md) */
    double y_noise;           /* absolute precision assumed of a curve value */
    const double *tab_x, *tab_y; /* y*(x) tabulated on [xb, xd] (NULL when not yet): brackets */
    size_t tab_n;                /* the inversions x*(y) between neighbouring grid points */
    const double *tab_d;         /* dy* / dx at the table's points (NULL: no slopes) */
} pw_column_ws;

/* Sets the workspace up; rtol is the relative tolerance on R_min (see docs/column.md for how it
 * maps to x tolerances). Allocates nothing (the 1-D solvers of base/solve1d.h live on the stack). */
pw_status pw_column_ws_init(pw_column_ws *w, const pw_curve *curve, double rtol);
/* Kept for symmetry with init; accepts a zeroed workspace. */
void pw_column_ws_free(pw_column_ws *w);

/* y*(x) through the callback; PW_EDOM for x outside [0,1] or a non-finite answer. */
pw_status pw_column_y(pw_column_ws *w, double x, double *y);

/* y*(x) and dy* / dx through w->dy (PW_EINVAL when w->dy is NULL); PW_EDOM as pw_column_y. */
pw_status pw_column_y_dy(pw_column_ws *w, double x, double *y, double *d);

/* The table with slopes (docs/column.md section 3): n0 evenly spaced points of [xb, xd], then
 * cells halved where the two one-sided curvature estimates at a point (from the cubic Hermite
 * interpolant of each neighbouring cell) do not resolve y*'' against K (see
 * pw_column_set_conv_bound); at most cap points in all. x, y, d hold cap entries; *n receives the
 * count. w->conv_bound is set from the final table. */
pw_status pw_column_tabulate_dy(pw_column_ws *w, double xb, double xd, size_t n0, size_t cap,
                                double *x, double *y, double *d, size_t *n);

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

/* K, the bound on the curve's convexity the section search relies on, from the table's second
 * differences (w->tab_* set); see docs/column.md. */
void pw_column_set_conv_bound(pw_column_ws *w);

/* The limiting slope of one section, searched over the whole curve interval [lo, hi] (curve
 * values ylo, yhi at its ends; the table's points inside are used as the coarse bracket): rectifying
 * (pole xd = hi) max of (xd - y*)/(xd - x), stripping (pole xb = lo) min of (y* - xb)/(x - xb).
 * The end point (xe, ye) - the q-line point, or where the operating lines meet when a flow limits -
 * is a candidate too, and wins ties; *at_feed says it limits. A branch-and-bound on the cells with
 * the convexity bound w->conv_bound proves no cell hides a larger value; GSL Brent refines every
 * local maximum it meets. See docs/column.md. */
pw_status pw_column_section_search(pw_column_ws *w, const pw_column_spec *s, pw_section sec,
                                   double lo, double ylo, double hi, double yhi, double xe,
                                   double ye, double *slope, double *x_lim, double *y_lim,
                                   bool *at_feed);

/* ---- The seam of the section search (src/analysis/column_search.c) ----
 *
 * A branch and bound that maximises a value v(x) over [x_0, x_(n-1)] and cannot miss a larger
 * value under a stated bound on the curvature of the sampled quantities (docs/column.md, section
 * 3). The caller samples up to PW_SECTION_MAXQ quantities per point (y* for the constant-overflow
 * column; y*, h_L and the tie line's latent heat for the energy column), computes v from them, and
 * bounds v from above on a cell given per-quantity curvature bounds K. The engine proves every
 * cell, halves the unproved ones at their midpoints (checking there that each quantity lies
 * within K h^2/8 of its chord, and raising K with a restart when it does not), and refines the
 * local maxima it meets with GSL Brent. */
#define PW_SECTION_MAXQ 3

typedef struct pw_section_pt {
    double x;
    double q[PW_SECTION_MAXQ];
} pw_section_pt;

typedef struct pw_section_fn {
    void *ctx;
    size_t nq;      /* quantities sampled per point, 1..PW_SECTION_MAXQ */
    bool two_sided; /* the assumption is |q''| <= K (true) or only q'' <= K (false) */
    /* the quantities at x */
    pw_status (*sample)(void *ctx, double x, double *q);
    /* the value maximised, from the quantities (may be -infinity) */
    double (*value)(void *ctx, double x, const double *q);
    /* an upper bound of the value on the cell [a, b] when each quantity's curvature obeys K */
    double (*bound)(void *ctx, const pw_section_pt *a, const pw_section_pt *b, const double *K);
    /* the tolerance on the value, given the best value and where it is */
    double (*tol)(void *ctx, double best, const pw_section_pt *at);
    /* the coarse bracket: point i of n (the section's ends are points 0 and n - 1) */
    void (*point)(void *ctx, size_t i, pw_section_pt *pt);
    /* optional (NULL: none): dv/dx at a point from its quantities, NAN where unknown; a local
     * maximum bracketed by a sign change of dv/dx is then located as its root (GSL Brent's root
     * solver) instead of by Brent's minimiser */
    double (*dvalue)(void *ctx, double x, const double *q);
    double noise[PW_SECTION_MAXQ]; /* absolute precision of each quantity */
    double K[PW_SECTION_MAXQ];     /* curvature bounds in use; raised by the search (in/out) */
    double xtol;                   /* absolute x tolerance of the Brent refinements */
    double min_width;              /* cells narrower than this are not halved */
    unsigned long evals;           /* samples taken (out) */
} pw_section_fn;

/* K[i] = 4 x the largest second divided difference of quantity i over the coarse points
 * (absolute when two_sided), plus floor[i]. */
void pw_section_conv_init(pw_section_fn *f, size_t n, const double *floor);

/* Maximises the value over the n coarse points' range; the end candidate `end` (a section end or
 * the point where the operating lines meet) is offered first and wins ties (*at_end). PW_ENOCONV
 * when K had to be raised more than 8 times or the sample budget ran out. */
pw_status pw_section_maximise(pw_section_fn *f, size_t n, const pw_section_pt *end,
                              pw_section_pt *best, double *v_best, bool *at_end);

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
