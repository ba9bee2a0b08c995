/* Either split direction for the column module.
 *
 * The column module (column.h) works with component 1 as the component that goes overhead:
 * xb < zf < xd. When component 1 leaves with the bottoms instead (xd < zf < xb: for example
 * 2-propanol recovered as the bottoms of a column above its azeotrope with water), the same
 * column is solved on the mirrored curve
 *
 *     x' = 1 - x,  y'(x') = 1 - y(1 - x'),  and xd' = 1 - xd, xb' = 1 - xb, zf' = 1 - zf, q' = q,
 *
 * in which component 2 goes overhead, and the results are mapped back: compositions
 * (pinch x and y, the q-line point) become fractions of component 1 again; R_min, boil-up, stage
 * counts, feed stages and the design table are the same numbers (the mass balances are linear,
 * so the operating lines are unchanged by the mirror). alpha_top and alpha_bottom are the relative
 * volatility of the component that goes overhead to the other one, in either direction; the
 * reason of an infeasible split says when its compositions are those of component 2.
 * This file is the one place where the mirror happens; every caller that solves a column from
 * user targets goes through these functions. */
#ifndef PINCHWISE_COLUMN_DIRECTION_H
#define PINCHWISE_COLUMN_DIRECTION_H

#include <pinchwise/column.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum {
    PW_DIRECTION_OVERHEAD = 0, /* xb < zf < xd: component 1 goes overhead */
    PW_DIRECTION_BOTTOMS = 1,  /* xd < zf < xb: component 1 leaves with the bottoms */
    PW_DIRECTION_NONE = 2      /* the feed does not lie strictly between the products */
} pw_column_direction;

/* Which way the spec splits component 1 (no range checks beyond the ordering). */
pw_column_direction pw_column_direction_of(const pw_column_spec *spec);

/* A curve that evaluates y'(x') = 1 - y(1 - x') of the borrowed curve m->inner. */
typedef struct pw_curve_mirror {
    pw_curve inner;
    pw_curve_dy_fn inner_dy; /* the inner curve's slope function, or NULL */
} pw_curve_mirror;

/* Binds m (which must outlive the returned curve) to curve. */
pw_curve pw_curve_mirror_bind(pw_curve_mirror *m, const pw_curve *curve);

/* The spec with every composition replaced by 1 - x (q unchanged). */
pw_column_spec pw_column_spec_mirror(const pw_column_spec *spec);

/* pw_column_solve in either direction (see above). PW_EINVAL when the feed is not strictly
 * between the products. */
pw_status pw_column_solve_any(const pw_curve *curve, const pw_column_spec *spec,
                              const pw_column_options *opt, pw_column_result *out);
/* The same with the curve's slope function (may be NULL): pw_column_solve_dy either way. */
pw_status pw_column_solve_any_dy(const pw_curve *curve, pw_curve_dy_fn dy,
                                 const pw_column_spec *spec, const pw_column_options *opt,
                                 pw_column_result *out);

/* pw_column_step in either direction (stages from the top at reflux R, optimal feed stage). */
pw_status pw_column_step_any(const pw_curve *curve, const pw_column_spec *spec, double R,
                             size_t max_stages, double *stages, int *feed_stage);

/* pw_column_total_reflux in either direction (xd < xb allowed). */
pw_status pw_column_total_reflux_any(const pw_curve *curve, double xd, double xb, size_t max_stages,
                                     double *stages);

#ifdef __cplusplus
}
#endif
#endif
