/* Binary distillation column: constant molal overflow, total condenser, partial reboiler.
 *
 * The column module knows nothing of thermodynamics: it works on an equilibrium curve y*(x)
 * supplied as a callback (from a fitted model at fixed pressure, or a closed form in tests).
 * Mole fractions are of component 1, the light key; xd > zf > xb. q is the feed's liquid
 * fraction (q > 1 subcooled liquid, q < 0 superheated vapor).
 * Methods: McCabe-Thiele operating lines; global feed/tangent pinch search; stepping. See
 * docs/column.md for the equations and sources. */
#ifndef PINCHWISE_COLUMN_H
#define PINCHWISE_COLUMN_H

#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* y*(x) in equilibrium with liquid x in [0,1]; returns a status (never NaN). */
typedef pw_status (*pw_curve_fn)(void *ctx, double x, double *y);

typedef struct pw_curve {
    pw_curve_fn y_of_x;
    void *ctx;
} pw_curve;

/* Optional: y*(x) and its slope dy* / dx together, for the same ctx; y must be y_of_x's value to
 * the bit and the slope exact to rounding (the search uses it to locate tangent points). */
typedef pw_status (*pw_curve_dy_fn)(void *ctx, double x, double *y, double *dydx);

typedef struct pw_column_spec {
    double xd, xb, zf, q;
} pw_column_spec;

typedef enum { PW_PINCH_FEED = 0, PW_PINCH_TANGENT = 1 } pw_pinch_kind;
typedef enum { PW_SECTION_RECTIFYING = 0, PW_SECTION_STRIPPING = 1 } pw_section;

typedef struct pw_pinch {
    pw_pinch_kind kind;
    pw_section section;
    double x, y;
} pw_pinch;

#define PW_COLUMN_MAX_FACTORS 8

/* One row of the design table: stage-by-stage stepping at R = factor * R_min. */
typedef struct pw_design_row {
    double factor, R, boilup;   /* boilup = Vbar/B */
    double stages;              /* equilibrium stages incl. the partial reboiler, fractional last */
    int feed_stage;             /* optimal feed stage, counted from the top (1 = top stage) */
    double gilliland_stages;    /* Molokanov et al. (1972) form of the Gilliland correlation */
    pw_status status;           /* PW_OK, or why this reflux reaches no stage count (stages NAN,
                                 * feed_stage 0): PW_EMAXITER more than max_stages are needed,
                                 * PW_EINFEASIBLE the stepping stalls, or a curve failure. A row
                                 * that cannot be reached never fails the whole solve. */
} pw_design_row;

typedef struct pw_column_options {
    double rtol;          /* relative tolerance on R_min; default 1e-10 */
    size_t grid;          /* density of the table, the coarse bracket of the pinch search:
                           * without the curve's slope `grid` points, with it max(9, grid/8)
                           * points (values and slopes) refined where the curvature is not
                           * resolved; default 200 (the answer does not depend on it;
                           * docs/column.md sections 1 and 3) */
    double factors[PW_COLUMN_MAX_FACTORS]; /* R/R_min for the design table; default 1.2, 1.3, 1.5 */
    size_t n_factors;
    size_t max_stages;    /* stepping gives up beyond this; default 500 */
} pw_column_options;

pw_column_options pw_column_default_options(void);

#define PW_REASON_MAX 320

typedef struct pw_column_result {
    bool feasible;
    char reason[PW_REASON_MAX]; /* why not, in words; empty when feasible */
    double x_q, y_q;            /* q-line meets the equilibrium curve */
    double r_min;               /* minimum reflux ratio L/D */
    double s_min;               /* boil-up ratio Vbar/B at R_min */
    double r_feed;              /* the R a feed-pinch-only search would give (diagnostic) */
    pw_pinch pinch;
    bool boilup_limited;        /* the q-line meets the curve below xb (vapor-rich, dilute feed):
                                 * R_min is where the boil-up falls to zero, or a rectifying
                                 * tangent pinch above it; pinch then reports (xb, y on the q-line)
                                 * with kind feed and section stripping when zero boil-up limits */
    bool reflux_limited;        /* R_min = 0: no reflux is needed (a stripping column with the feed
                                 * on top makes the distillate); no pinch limits, pinch holds the
                                 * stripping section's closest approach, the design table is empty */
    double n_min;               /* stages at total reflux, stepped on the curve; NAN when
                                 * n_min_status is not PW_OK */
    pw_status n_min_status;     /* PW_OK, or PW_EMAXITER: more than max_stages at total reflux
                                 * (a product right beside an azeotrope); R_min stands */
    double n_fenske;            /* Fenske with the geometric-mean relative volatility */
    double alpha_top, alpha_bottom;
    pw_design_row design[PW_COLUMN_MAX_FACTORS];
    size_t n_design;
    bool measured_split;        /* refused: the data show two liquids between the targets that
                                 * the model cannot represent (pw_column_solve_system) */
} pw_column_result;

/* The whole analysis: feasibility, R_min with the limiting pinch (global search in both
 * sections), N_min by stepping at total reflux, Fenske, and the design table. Infeasible
 * specifications are not an error: the status is PW_OK with feasible = false and a reason.
 * Stage counts the stepping cannot reach are flagged (n_min_status, design[i].status), not errors.
 * Errors: PW_EINVAL for an inconsistent spec (not 0 <= xb < zf < xd <= 1), curve failures. */
pw_status pw_column_solve(const pw_curve *curve, const pw_column_spec *spec,
                          const pw_column_options *opt, pw_column_result *out);

/* The same with the curve's slope (dy may be NULL: then exactly pw_column_solve): the stage
 * inversion takes Newton steps and the pinch search locates tangent points as roots of the
 * value's derivative (docs/column.md sections 3-4). Same answers within the tolerances. */
pw_status pw_column_solve_dy(const pw_curve *curve, pw_curve_dy_fn dy, const pw_column_spec *spec,
                             const pw_column_options *opt, pw_column_result *out);

/* Steps stages from the top at reflux R with the optimal feed stage. */
pw_status pw_column_step(const pw_curve *curve, const pw_column_spec *spec, double R,
                         size_t max_stages, double *stages, int *feed_stage);

/* Stages at total reflux from xd down to xb (partial reboiler counted, fractional last). */
pw_status pw_column_total_reflux(const pw_curve *curve, double xd, double xb, size_t max_stages,
                                 double *stages);

/* Closed forms for constant relative volatility alpha (tests and near-ideal checks):
 * Underwood (1948) R_min for any q; Fenske (1932) N_min = ln[(xd/(1-xd))((1-xb)/xb)]/ln(alpha)
 * into *n_min. PW_EINVAL (the output untouched) unless alpha > 1 is finite and
 * 0 < xb < xd < 1, or for a NULL output. */
pw_status pw_underwood_rmin(double alpha, double zf, double xd, double q, double *r_min);
pw_status pw_fenske_nmin(double alpha, double xd, double xb, double *n_min);

/* Gilliland-type correlations: stages N from N_min, R, R_min into *stages. Molokanov et al.
 * (1972) and Eduljee (1975). At R = R_min Molokanov's N is +infinity (PW_OK: the limit).
 * PW_EINVAL (the output untouched) unless N_min >= 0 and R_min >= 0 are finite and R >= R_min
 * is finite, or for a NULL output. */
pw_status pw_gilliland_molokanov(double n_min, double R, double r_min, double *stages);
pw_status pw_gilliland_eduljee(double n_min, double R, double r_min, double *stages);

#ifdef __cplusplus
}
#endif
#endif
