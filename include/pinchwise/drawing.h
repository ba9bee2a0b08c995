/* What to draw: the numbers behind the plots of a fitted binary, as plain result structs.
 *
 * A presentation layer (the HTML report, a notebook, a GUI) draws these and computes nothing:
 *  - pw_draw_phase: the model's bubble and dew curves and ln gamma at the data's condition (T-x-y
 *    at fixed P, or P-x-y at fixed T) on a grid of liquid (and vapor) compositions, the azeotropes
 *    there, and for a model whose liquids split the three-phase line (the bubble curve is flat
 *    between the layers) and the two-liquid region below it (the binodal);
 *  - pw_draw_xy: the equilibrium curve y*(x) at a column pressure, with its azeotropes;
 *  - pw_draw_column: the column construction at that pressure, taken from the column module
 *    (column.h, column_direction.h): the q-line, the operating lines at R_min and at the
 *    operating reflux, the limiting pinch, a window around it for an enlarged view, and the stage
 *    staircase recorded by the column module's own stepping (so the steps drawn are the steps
 *    counted); a heterogeneous azeotrope between the targets blocks the single column
 *    (pw_column_hetero_block) and the decanter scheme's layers and both stripping columns'
 *    staircases are drawn instead (decanter.h);
 *  - pw_draw_enthalpy: saturated-liquid and saturated-vapor enthalpies at the column pressure.
 *
 * Grids: PW_DRAW_GRID compositions x_k = (1 - cos(pi k / (PW_DRAW_GRID - 1))) / 2, so the ends
 * are resolved. A solve that fails at one point leaves NAN there (a gap in the drawn line) and is
 * counted in n_failed; it is not an error. Everything is caller-owned and fixed-size: nothing to
 * free. Mole fractions are of component 1; T in K, P in Pa (convert for display with units.h).
 * See docs/report.md ("What to draw"). */
#ifndef PINCHWISE_DRAWING_H
#define PINCHWISE_DRAWING_H

#include <pinchwise/azeotrope.h>
#include <pinchwise/column.h>
#include <pinchwise/decanter.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/lle.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

#define PW_DRAW_GRID 161
#define PW_DRAW_MAX_AZ 4
#define PW_DRAW_BINODAL 41           /* temperatures of the binodal below the three-phase line */
#define PW_DRAW_MAX_STEPS 150        /* stages drawn; more are counted but not drawn */
#define PW_DRAW_CORNERS (2 * PW_DRAW_MAX_STEPS + 2)

/* The grid of compositions shared by every curve here. */
double pw_draw_grid_x(size_t k);

/* One azeotrope as drawn. heterogeneous: the vapor of the three-phase line lies between the
 * layers (x1 is then the vapor's composition, T/P the three-phase condition). */
typedef struct pw_draw_az {
    double x1, T_K, P_Pa;
    bool min_boiling;
    bool tangential;    /* a double root (the azeotrope module's flag) */
    bool heterogeneous;
} pw_draw_az;

/* Azeotropes at one condition: the homogeneous ones of pw_azeotrope_find that lie outside the
 * two-liquid region, then a heterogeneous one (pw_azeotrope_heterogeneous). status is that of
 * pw_azeotrope_find (n = 0 when it failed: no azeotrope is shown, which does not mean none). */
typedef struct pw_draw_azeotropes {
    pw_status status;
    size_t n;
    pw_draw_az az[PW_DRAW_MAX_AZ];
    pw_az_result found;           /* the module's result behind az (for intervals, in order) */
    pw_three_phase three_phase;   /* exists false for a model that does not split here */
} pw_draw_azeotropes;

/* The phase diagram at the data's condition. */
typedef struct pw_draw_phase {
    bool isothermal;              /* true: P-x-y at T = fixed; false: T-x-y at P = fixed */
    double fixed;                 /* P in Pa (isobaric) or T in K (isothermal) */
    double x[PW_DRAW_GRID];       /* liquid grid; also the vapor grid of the dew curve */
    double bub_T[PW_DRAW_GRID], bub_P[PW_DRAW_GRID], bub_y[PW_DRAW_GRID];
    double dew_T[PW_DRAW_GRID], dew_P[PW_DRAW_GRID];  /* dew point of vapor y = x[k]; NAN also
                                     where the dew liquid would split (no stable state) */
    double lngamma[2][PW_DRAW_GRID];  /* at the bubble temperature (or the fixed T) */
    size_t n_failed;
    pw_draw_azeotropes az;
    /* liquids that split (az.three_phase.exists): the flat part of the bubble curve runs from
     * x_I to x_II at the three-phase T (P); below it, isobaric only, the binodal: at n_binodal
     * temperatures from the three-phase T down, the layers x_I(T), x_II(T) (NAN: no split) */
    size_t n_binodal;
    double bin_T[PW_DRAW_BINODAL], bin_x[2][PW_DRAW_BINODAL];
} pw_draw_phase;

/* Fills out for system s at fixed P (isothermal false; fixed in Pa) or fixed T (true; K).
 * PW_EINVAL for a NULL argument, a system without a model, or fixed not finite and positive;
 * PW_ENOMEM. Point failures are gaps, not errors. */
pw_status pw_draw_phase_compute(const pw_system *s, bool isothermal, double fixed,
                                pw_draw_phase *out);

/* The same, reusing a search already made: known and known_tp are pw_azeotrope_search's results
 * (the homogeneous roots already filtered by the heterogeneous check, and the three-phase state)
 * for s at the same condition (a pw_rank_assess row's az and tp, for example), so neither search
 * is run again; known NULL searches as pw_draw_phase_compute does. PW_EINVAL when only one of
 * the two is given. */
pw_status pw_draw_phase_compute_known(const pw_system *s, bool isothermal, double fixed,
                                      const pw_az_result *known, const pw_three_phase *known_tp,
                                      pw_draw_phase *out);

/* The equilibrium curve at a column pressure: y[k] = y*(x[k]) of the bubble point at P (the
 * curve the column module steps on; inside a two-liquid region the homogeneous, metastable
 * branch). stable_y is the curve as the liquids behave: the three-phase vapor between the
 * layers, y elsewhere; three_y holds the three-phase vapor between the layers and NAN elsewhere.
 * Without a split stable_y equals y and three_y is all NAN. */
typedef struct pw_draw_xy {
    double P_Pa;
    double x[PW_DRAW_GRID], y[PW_DRAW_GRID], stable_y[PW_DRAW_GRID], three_y[PW_DRAW_GRID];
    size_t n_failed;
    pw_draw_azeotropes az;
} pw_draw_xy;

pw_status pw_draw_xy_compute(const pw_system *s, double P_Pa, pw_draw_xy *out);

/* A staircase: corners (x[i], y[i]) alternately on the equilibrium curve and on an operating
 * line; stages and feed_stage as the column module counts them. */
typedef struct pw_draw_stairs {
    pw_status status;             /* of the stepping; the corners are drawn only with PW_OK */
    double x[PW_DRAW_CORNERS], y[PW_DRAW_CORNERS];
    size_t n;
    bool truncated;               /* more stages than PW_DRAW_MAX_STEPS: the rest not drawn */
    double stages;
    int feed_stage;               /* single column only; 0 for a stripping column */
} pw_draw_stairs;

/* The two-column decanter scheme (decanter.h) as drawn. */
typedef struct pw_draw_decanter {
    pw_status status;             /* of pw_decanter_solve */
    pw_decanter_result res;       /* layers, minimum boil-ups, design rows, feasibility */
    double factor;                /* boil-up / minimum of the drawn staircases */
    double boilup[2];             /* S of column A (rich layer) and B (lean layer) as drawn */
    double vapor[2], layer[2];    /* as drawn, per mole of feed: boil-up V = S B and the layer
                                   * L = V + B the decanter returns to the column's top */
    bool duties;                  /* the design row at the drawn factor has duties (heat data
                                   * known): res's reboiler_J, reheat_J and condenser_J at
                                   * duty_row */
    size_t duty_row;
    double op_x[2][2], op_y[2][2];/* each column's operating line from its top to its bottoms */
    pw_draw_stairs stairs[2];
    /* per column (A, B), a window holding its operating line and its whole staircase (margins of
     * 8 % of each span, inside [0, 1]; NAN when the column is not drawn), for an enlarged view:
     * at full scale a column whose bottoms lie near a pure end (x1 below about 0.02) is unreadable */
    double zoom_x[2][2], zoom_y[2][2];
} pw_draw_decanter;

typedef struct pw_draw_column {
    pw_column_spec spec;          /* either direction (column_direction.h) */
    double P_Pa, factor;          /* factor = R / R_min of the drawn operating line */
    pw_status status;             /* of pw_column_solve_any; the rest holds only with PW_OK */
    pw_column_result col;         /* R_min, pinch, N_min, design table, feasibility */
    bool drawn;                   /* status OK and feasible: the lines below are set */
    double r_op;                  /* factor * R_min */
    double qline_x[2], qline_y[2];/* from (zF, zF) to where it meets the curve */
    double op_min_x[3], op_min_y[3]; /* operating lines at R_min: xD, their meeting point, xB */
    double op_x[3], op_y[3];      /* the same at r_op */
    pw_draw_stairs stairs;        /* at r_op, from the column module's stepping */
    double zoom_x[2], zoom_y[2];  /* a window holding the pinch and its neighbourhood, for an
                                     enlarged view of the staircase there */
    double T_top_K, T_bottom_K;   /* bubble T of xD and xB at P (NAN when a solve failed) */
    /* a heterogeneous azeotrope between the targets: the single column is refused (col.feasible
     * false, its reason names the decanter scheme) and the scheme is drawn */
    bool hetero_blocked;
    pw_draw_decanter decanter;
} pw_draw_column;

/* The column construction at P_Pa for spec (either direction) with the operating line at
 * factor * R_min (factor > 1; 0 means 1.3). opt may be NULL for pw_column_default_options(); the
 * operating factor is added to its design factors when missing. The decanter scheme, when the
 * targets cross a heterogeneous azeotrope, takes x_rich = max(xD, xB), x_lean = min(xD, xB), the
 * feed and q of spec, and draws each stripping column at factor times its minimum boil-up.
 * PW_EINVAL for bad arguments (the feed not strictly between the products, P not positive,
 * factor <= 1); PW_ENOMEM. An infeasible split is PW_OK with col.feasible false. */
pw_status pw_draw_column_compute(const pw_system *s, double P_Pa, const pw_column_spec *spec,
                                 double factor, const pw_column_options *opt,
                                 pw_draw_column *out);
/* The same with the decanter scheme's decanter at T_decanter_K (0: at the three-phase
 * temperature; pw_decanter_spec.T_decanter_K). */
pw_status pw_draw_column_compute_ex(const pw_system *s, double P_Pa, const pw_column_spec *spec,
                                    double factor, const pw_column_options *opt,
                                    double T_decanter_K, pw_draw_column *out);

/* Enthalpies of saturated liquid (at its bubble point) and saturated vapor (at its dew point) on
 * the grid, J/mol, at P_Pa, from the system's heat data (enthalpy.h); NAN where a solve failed.
 * Errors: those of pw_heat_data_from_system (missing heat data), PW_EINVAL. */
typedef struct pw_draw_enthalpy {
    double x[PW_DRAW_GRID], h_liquid[PW_DRAW_GRID], h_vapor[PW_DRAW_GRID];
} pw_draw_enthalpy;

pw_status pw_draw_enthalpy_compute(const pw_system *s, double P_Pa, pw_draw_enthalpy *out,
                                   pw_error *err);

/* y*(x) at P_Pa at n points evenly spaced on [x_lo, x_hi] (NAN where a solve failed): the
 * best-fit curve beside a band of sampled curves. PW_EINVAL for a bad window or n < 2. */
pw_status pw_draw_curve_window(const pw_system *s, double P_Pa, double x_lo, double x_hi,
                               size_t n, double *x, double *y);

#ifdef __cplusplus
}
#endif
#endif
