/* Quick feasibility screen of a binary split by simple distillation at one pressure.
 *
 * For a split (xd, xb, optional zf) of any pw_system at pressure P it reports:
 *   - the lowest relative volatility alpha12 along [xb, xd] and where it is;
 *   - an azeotrope barrier: an azeotrope strictly between xb and xd, or a range where component 1
 *     is the heavier one (a target beyond an azeotrope);
 *   - how far the azeotrope moves over a pressure range (default 20-500 kPa) and whether it
 *     leaves the composition range there (the pressure-swing question);
 *   - a rough R_min (pw_column_solve_any on the model's curve, q from the options, default 1) and
 *     Underwood's value with the geometric-mean alpha, and stage counts at total reflux (stepped
 *     and Fenske).
 * The split may go either way: xb < zf < xd (component 1 overhead) or xd < zf < xb (component 1
 * with the bottoms; column_direction.h). The relative volatility reported is then that of the
 * component that goes overhead to the other one (alpha21 = 1/alpha12).
 * Verdict: infeasible (a barrier, or two liquids the data show between the targets that the
 * model cannot represent: docs/heterogeneous.md section 3), difficult (lowest alpha below alpha_difficult, or a
 * near-tangential pinch of alpha toward 1), else feasible. Thresholds and their origin are in
 * pw_screen_options and docs/screen.md. Screening only: not a design. */
#ifndef PINCHWISE_SCREEN_H
#define PINCHWISE_SCREEN_H

#include <pinchwise/azeotrope.h>
#include <pinchwise/column.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/lle.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum {
    PW_VERDICT_FEASIBLE = 0,
    PW_VERDICT_DIFFICULT = 1,
    PW_VERDICT_INFEASIBLE = 2
} pw_verdict;

typedef struct pw_screen_options {
    double alpha_difficult;  /* default 1.1 (common practice) */
    double shift_low;        /* azeotrope shift worth a look at pressure swing: default 0.05 */
    double shift_high;       /* ... clearly attractive: default 0.10 (METHODS 5.4 rule of thumb,
                              * common practice) */
    double P_lo_Pa, P_hi_Pa; /* range of the pressure scan; default 20 kPa and 500 kPa */
    size_t scan_points;      /* default 9 (geometric in P) */
    size_t grid;             /* alpha scan points on [xb, xd]; default 400 */
    pw_az_options az;
    pw_column_options column;
    double q;                /* feed thermal condition of the rough column; default 1 */
} pw_screen_options;

pw_screen_options pw_screen_default_options(void);

#define PW_SCREEN_MAX_REASONS 10

typedef enum {
    PW_REASON_BARRIER = 0,     /* an azeotrope lies between xb and xd */
    PW_REASON_BEYOND,          /* component 1 is the heavier one over part of [xb, xd] */
    PW_REASON_LOW_ALPHA,       /* lowest alpha below the threshold */
    PW_REASON_NEAR_PINCH,      /* alpha touches close to 1 without crossing */
    PW_REASON_SWING,           /* the azeotrope moves enough for pressure swing */
    PW_REASON_SWING_SMALL,     /* it moves, but too little */
    PW_REASON_VANISHES,        /* it leaves the composition range inside the pressure range */
    PW_REASON_TANGENT_PINCH,   /* the column's R_min is set by a tangent pinch */
    PW_REASON_EASY,            /* lowest alpha at or above the threshold */
    PW_REASON_TWO_LIQUIDS      /* the data show two liquids between xb and xd that the model
                                * cannot represent (pw_column_measured_split_block) */
} pw_screen_reason_code;

typedef struct pw_screen_reason {
    pw_screen_reason_code code;
    char text[PW_REASON_MAX];
} pw_screen_reason;

typedef struct pw_screen_result {
    pw_verdict verdict;
    double xd, xb, zf, P_Pa;       /* zf: as given, or the default used */
    bool zf_default;
    double alpha_min, x_alpha_min; /* lowest alpha (overhead component to the other) between
                                    * the products, and its x1, over the profile's points
                                    * outside the three-phase layers (NAN when none is) */
    double alpha_top, alpha_bottom, alpha_mean; /* at xd, at xb, geometric mean; NAN where that
                                    * product lies inside the three-phase layers (two liquids:
                                    * no one-liquid volatility) */
    size_t alpha_points_in_layers; /* profile points left out as inside those layers */
    pw_az_result az;               /* azeotropes at P */
    pw_three_phase het;            /* the three-phase state at P (exists false when none or
                                    * the model cannot split); a heterogeneous azeotrope when
                                    * het.heterogeneous_azeotrope */
    bool barrier;
    double x_barrier;              /* the azeotrope inside (xb, xd); NAN when none */
    bool measured_split;           /* infeasible: the data show two liquids between the targets
                                    * that the model cannot represent (its azeotropes and alpha
                                    * there are not taken as barriers or verdicts) */
    bool scanned;                  /* the pressure scan ran */
    double P_lo_Pa, P_hi_Pa;
    double x_az_lo, x_az_hi;       /* azeotrope at P_lo and P_hi (NAN when absent) */
    double shift;                  /* |x_az(P_hi) - x_az(P_lo)|, or the scan's spread; NAN */
    bool vanishes;
    double P_vanish_Pa;            /* first boundary of the scan; NAN when none */
    bool column_ran;               /* false when infeasible (not attempted) */
    pw_column_result column;
    double r_min_underwood, n_fenske; /* NAN when not applicable (alpha_mean <= 1) */
    double T_lo_K, T_hi_K;         /* temperatures the screen used (for range warnings) */
    size_t n_reasons;
    pw_screen_reason reasons[PW_SCREEN_MAX_REASONS];
} pw_screen_result;

/* Screens the split. zf NAN means the default: 0.5 when 0.5 lies between xb and xd, else
 * (xb + xd)/2. opt may be NULL. Errors: PW_EINVAL (xb, xd not distinct in (0, 1), zf not between
 * them, P not positive,
 * bad options), failures of the equilibrium or column solvers. A failing pressure scan is not an
 * error: the result says scanned = false. */
pw_status pw_screen_run(const pw_system *s, double P_Pa, double xd, double xb, double zf,
                        const pw_screen_options *opt, pw_screen_result *out);

/* Static names: "feasible", "difficult", "infeasible"; and a short key for a reason code. */
const char *pw_verdict_name(pw_verdict v);
const char *pw_screen_reason_key(pw_screen_reason_code c);

#ifdef __cplusplus
}
#endif
#endif
