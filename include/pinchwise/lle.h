/* Binary liquid-liquid equilibrium and three-phase (liquid-liquid-vapor) equilibrium.
 *
 * Liquid-liquid split at fixed T: the common tangent of Gmix/RT = x ln x + (1-x) ln(1-x) + G^E/RT,
 * i.e. equal activities of both components in the two layers, for any activity-model descriptor
 * (the code never looks at which model it is, except pw_model_can_split). The search depends on
 * no start value and never returns the trivial solution:
 *   1. D(x) = d2(Gmix/RT)/dx^2 is scanned on a sorted grid of fixed size (uniform in x plus
 *      geometric towards both ends, 1e-12 .. 1 - 1e-12, complements exact near x = 1) and every
 *      local minimum is refined (Brent, in the logit); the model splits at T iff D < 0 somewhere
 *      (a binary at fixed T: METHODS2 2.2). A dip of D below zero is found when it makes a
 *      grid-local minimum (at most one minimum per cell). A coarse scan beyond the floor (to
 *      about 1e-300) finds instability there (then a layer lies beyond the floor: PW_ERANGE).
 *   2. The unstable regions (spinodal points by bisection in the logit) cut the range into convex
 *      pieces. The common tangent of two pieces is found by bisection on its slope m:
 *      h(m) = min over A of (G - m x) - min over B of (G - m x) is continuous and strictly
 *      increasing (dh/dm = x_B - x_A > 0, the tangent points clamped at the pieces' ends), so
 *      it has one root (Maxwell's construction); a root clamped at the 1e-12 floor means a layer
 *      beyond it, decided exactly. With one region the pieces are its two sides; with several,
 *      the lower convex hull of G on the grid names them.
 *   3. Newton in logit variables polishes the pair inside its pieces (METHODS2 2.3); the pair is
 *      then verified by the tangent-plane test on 20,000 points (Michelsen 1982): G lies nowhere
 *      below the common tangent by more than 1e-10.
 * Three-phase equilibrium (ideal vapor, modified Raoult's law): a1 = x_I gamma1(x_I) =
 * x_II gamma1(x_II), a2 likewise, P = a1 P1sat(T) + a2 P2sat(T), y3 = a1 P1sat / P. At fixed T it is
 * explicit after the LLE; at fixed P a root in T (bracketed on a 1 K grid, then GSL Brent).
 * T in K, P in Pa, mole fractions of component 1. Methods and sources: docs/heterogeneous.md. */
#ifndef PINCHWISE_LLE_H
#define PINCHWISE_LLE_H

#include <pinchwise/equilibrium.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Smallest solubility the solver resolves: layers closer than this to a pure end are reported
 * as PW_ERANGE (the model is then practically immiscible at this T). */
#define PW_LLE_X_MIN 1e-12
/* Largest number of separate two-liquid regions kept at one T. */
#define PW_LLE_MAX_PAIRS 4

/* False for models that can never split (Wilson's equation: d2(Gmix)/dx2 > 0 for all its
 * parameters, Wilson 1964); true for the others. */
bool pw_model_can_split(const pw_model_type *m);

/* Result at one temperature. */
typedef struct pw_lle_result {
    double T_K;
    bool split;                 /* two liquids coexist at T */
    double x[2];                /* the layers x_I < x_II (the widest pair when there are several);
                                 * NAN when no split */
    double a[2];                /* activities of components 1 and 2 (equal in both layers) */
    size_t n_pairs;             /* separate two-liquid regions (0 when no split) */
    double pairs[PW_LLE_MAX_PAIRS][2];
    double min_D;               /* smallest d2(Gmix/RT)/dx^2 on (0,1), and where */
    double x_min_D;
    double spinodal[2];         /* ends of the region D < 0 holding the reported pair */
    double residual;            /* max |ln a_i(x_I) - ln a_i(x_II)| */
    double min_tpd;             /* smallest height of Gmix/RT above the common tangent (>= -1e-10) */
    double x2[2];               /* 1 - x[i], the layers' mole fractions of component 2, exact
                                 * where x[i] is within rounding of 1 (use them for a2 there) */
} pw_lle_result;

/* Coexisting layers at T. No split is PW_OK with out->split false. Errors: PW_EINVAL (NULL or a
 * system without a model), PW_EDOM (T not positive or model failures), PW_ERANGE (a layer
 * closer than PW_LLE_X_MIN to a pure end: split stays false, but x, x2 and a then describe the
 * pair as far as double precision resolves it, NAN where it could not be described),
 * PW_ENOCONV (the pair failed its verification; not expected for one unstable region). */
pw_status pw_lle_solve(const pw_system *s, double T_K, pw_lle_result *out);
/* The same with the tangent-plane verification on tpd_points (>= 100) points: inner loops that
 * only bracket (temperature searches) use fewer and solve their final state with 20,000. */
pw_status pw_lle_solve_n(const pw_system *s, double T_K, size_t tpd_points, pw_lle_result *out);

/* Smallest tangent-plane distance of Gmix/RT above the line through (x_I, G(x_I)) and
 * (x_II, G(x_II)), over n points (>= 100) spaced uniformly and geometrically towards both ends. */
pw_status pw_lle_tpd_min(const pw_system *s, double T_K, double x_I, double x_II, size_t n,
                         double *min_tpd, double *x_at);

/* Gmix/RT at x (0 < x < 1) and its first derivative G'(x) = ln[x/(1-x)] + ln gamma1 - ln gamma2. */
pw_status pw_lle_gmix(const pw_system *s, double T_K, double x, double *g, double *dg);

/* Binodal over temperature. */
typedef struct pw_lle_scan_point {
    double T_K;
    bool split;
    double x[2];
    double x2[2];               /* 1 - x[i], exact near x1 = 1 */
    bool beyond_floor;          /* split, with a layer closer than PW_LLE_X_MIN to a pure end
                                 * (x, x2 as far as double precision resolves them) */
} pw_lle_scan_point;

typedef struct pw_lle_critical {
    double T_K, x1;
    bool upper;                 /* true: upper critical solution temperature (layers merge on
                                 * heating); false: lower */
} pw_lle_critical;

#define PW_LLE_MAX_CRITICAL 4

/* Solves the LLE at n (>= 2) temperatures from T_from to T_to (linear; points[] holds n
 * entries), and locates every critical solution temperature between neighbouring points with and
 * without a split, by bisection on min D (to 1e-6 K). A temperature whose split has a layer
 * beyond PW_LLE_X_MIN is a point with split and beyond_floor true, not a failure. */
pw_status pw_lle_scan(const pw_system *s, double T_from, double T_to, size_t n,
                      pw_lle_scan_point *points, pw_lle_critical *crit, size_t *n_crit);

/* Three-phase state. */
typedef struct pw_three_phase {
    bool exists;                /* false: no three-phase state at this condition */
    double T_K, P_Pa;
    double x[2];                /* liquid layers */
    double y1;                  /* vapor */
    double a[2];                /* activities */
    double Psat_Pa[2];
    bool heterogeneous_azeotrope; /* x_I < y1 < x_II */
} pw_three_phase;

/* At fixed T: explicit after the LLE. exists = false when the model does not split at T.
 * PW_ERANGE (a layer beyond PW_LLE_X_MIN): x and a still describe the refused pair (or NAN). */
pw_status pw_three_phase_at_T(const pw_system *s, double T_K, pw_three_phase *out);

/* At fixed P: the temperature where the layers boil. The search runs from 80 K below the lower
 * pure boiling point up to the higher one on a 1 K grid (the LLE re-solved at each grid
 * temperature where the three-phase pressure could reach P, unless no split is proven for the
 * rest of the range: docs/heterogeneous.md section 2); a critical solution temperature between
 * grid temperatures is located by bisection, so a three-phase line anywhere in that range is
 * found (but for a split that begins and ends inside one 1 K cell); exists = false when there is
 * none (the split vanishes first, or there is no split). PW_ERANGE when the state lies where a
 * layer is beyond PW_LLE_X_MIN; PW_ENOCONV when P lies inside a jump of the three-phase pressure
 * (two separate two-liquid regions whose wider pair, the one followed, changes: section 2). */
pw_status pw_three_phase_at_P(const pw_system *s, double P_Pa, pw_three_phase *out);

/* The same from a temperature guess (e.g. a measured three-phase temperature): the root of
 * P3(T) = P is bracketed by steps of 1, 2, 4, ... K away from T_guess_K and refined by GSL
 * Brent; the LLE at each trial uses a 1000-point tangent-plane check. Falls back to
 * pw_three_phase_at_P when the split vanishes inside the stepping. For inner loops (fitting). */
pw_status pw_three_phase_at_P_near(const pw_system *s, double P_Pa, double T_guess_K,
                                   pw_three_phase *out);

/* Bubble point of an overall liquid x1 at fixed P (isobaric) or T: inside the two-liquid region
 * at its three-phase condition it is the three-phase state (*three_phase true, out->y1 = y3);
 * otherwise the homogeneous bubble point. */
pw_status pw_bubble_T_het(const pw_system *s, double P_Pa, double x1, pw_eq_point *out,
                          bool *three_phase);
pw_status pw_bubble_P_het(const pw_system *s, double T_K, double x1, pw_eq_point *out,
                          bool *three_phase);

/* Heterogeneous azeotropes (METHODS2 3.2). Given the homogeneous search result r of
 * pw_azeotrope_find at the same condition (mode/fixed as there: P in Pa or T in K), removes
 * every root whose liquid lies inside the two-liquid region at its own temperature (the bubble
 * curve of an unstable liquid crosses y = x there: an artefact, not an azeotrope) and fills tp
 * with the three-phase state at the condition (tp->exists false when there is none). The
 * three-phase line is a heterogeneous azeotrope when tp->heterogeneous_azeotrope; otherwise
 * (vapor outside the layers) it is no azeotrope. *n_removed (may be NULL) counts the roots
 * dropped. mode is 0 for fixed pressure, 1 for fixed temperature (pw_az_mode). */
struct pw_az_result;
pw_status pw_azeotrope_heterogeneous(const pw_system *s, int mode, double fixed,
                                     struct pw_az_result *r, pw_three_phase *tp,
                                     size_t *n_removed);

/* The three-phase state at a fixed pressure (mode 0, at = P in Pa: pw_three_phase_at_P) or
 * temperature (mode 1, at = T in K: pw_three_phase_at_T); mode as pw_az_mode. */
pw_status pw_three_phase_at(const pw_system *s, int mode, double at, pw_three_phase *tp);

/* Every azeotrope at one condition: the one search that every place listing azeotropes uses
 * (the azeotrope command, the ranking of fit --model all, study and the report). The
 * three-phase state at the condition into tp; the homogeneous roots of pw_azeotrope_find into
 * r, its search leaving out the three-phase layers (pw_az_options.skip_x1: no one-liquid
 * azeotrope lies there, and a strongly non-ideal model may have no one-liquid bubble point
 * inside them); then the roots whose liquid lies inside the two-liquid region at its own
 * temperature dropped from r and counted in *n_removed, as pw_azeotrope_heterogeneous does.
 * A one-liquid root inside the three-phase layers is never seen, even where its own
 * temperature lies beyond a critical solution point (a gap closing with T): a liquid there
 * boils as two layers at the three-phase condition first.
 * tp is cleared first (tp->exists false). *het_failed (may be NULL) is set true when the
 * failure came from a three-phase or liquid-liquid step (r then holds the homogeneous roots,
 * unfiltered; over the whole range when the three-phase state failed); a failure of the
 * homogeneous search leaves r->fail_x1 saying where. */
pw_status pw_azeotrope_search(const pw_system *s, int mode, double fixed, struct pw_az_result *r,
                              pw_three_phase *tp, size_t *n_removed, bool *het_failed);
/* The same with the homogeneous search's options (NULL: the defaults; its skip_x1 is replaced
 * by the three-phase layers when there are any). */
struct pw_az_options;
pw_status pw_azeotrope_search_opt(const pw_system *s, int mode, double fixed,
                                  const struct pw_az_options *opt, struct pw_az_result *r,
                                  pw_three_phase *tp, size_t *n_removed, bool *het_failed);

/* The points of a scan (pw_azeotrope_scan, done first; call this once after it) against the
 * two-liquid region, and where the heterogeneous azeotrope turns homogeneous or the reverse.
 * At every point
 * pw_azeotrope_heterogeneous is run (tps[k], n_points entries owned by the caller, receives the
 * three-phase state; artefact crossings are dropped from scan->points[k]). A point is labelled
 * heterogeneous when tps[k] exists with x_I < y3 < x_II, i.e. when
 *     G(v) = min(y3 - x_I, x_II - y3)   (three-phase state at v;  G = -1 where there is none)
 * is > 0. Between every two neighbouring points whose labels differ, the change is located by
 * GSL Brent on G to a bracket of relative width 1e-9 in P (or T) and appended to
 * scan->boundaries with kind PW_AZ_BOUNDARY_VAPOR_AT_LAYER (G crosses zero continuously: y3
 * reaches a layer), PW_AZ_BOUNDARY_LINE_ENDS (no three-phase state on the homogeneous side: the
 * layers merge, or the line ends) or PW_AZ_BOUNDARY_LINE_JUMPS (an exact zero of G counts as
 * not heterogeneous). Brent keeps a change of sign inside its bracket, so a change of label
 * between two points is always located; two changes inside one interval whose ends carry the
 * same label are not looked for. When the three-phase search fails inside an interval the change
 * is still appended, as PW_AZ_BOUNDARY_NOT_LOCATED with the narrowest bracket evaluated and the
 * failure in `status`. Errors: PW_EINVAL, PW_ENOMEM, the three-phase search's status at a scan
 * point. */
struct pw_az_scan;
pw_status pw_azeotrope_scan_heterogeneous(const pw_system *s, struct pw_az_scan *scan,
                                          pw_three_phase *tps);

#ifdef __cplusplus
}
#endif
#endif
