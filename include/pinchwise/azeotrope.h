/* Binary homogeneous azeotropes of a pw_system, at fixed pressure or fixed temperature.
 *
 * The search works on the smooth function
 *     f(x1) = ln alpha12 = ln[gamma1 P1^sat / (gamma2 P2^sat)]   at the bubble point of x1
 * (bubble T at fixed P, or the given T), which is zero exactly where y1 = x1. It tabulates f on a
 * coarse interior table and, under a bound on |f''| checked wherever it samples, decides every
 * cell: free of roots, or holding exactly one (refined by GSL's Brent solver), halving or cutting
 * at a Brent minimum of |f| the cells it cannot yet decide; interior minima of |f| that stay on
 * one side are reported as near-tangential points. Roots at the pure ends x1 = 0 and 1 are never
 * reported. Each root is classified from the extremum of the bubble curve: at fixed P a
 * temperature minimum is minimum-boiling; at fixed T a pressure maximum is minimum-boiling.
 * Units: T in K, P in Pa, mole fractions of component 1. Methods and sources: docs/azeotrope.md. */
#ifndef PINCHWISE_AZEOTROPE_H
#define PINCHWISE_AZEOTROPE_H

#include <pinchwise/equilibrium.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum { PW_AZ_ISOBARIC = 0, PW_AZ_ISOTHERMAL = 1 } pw_az_mode;
typedef enum { PW_AZ_MINIMUM_BOILING = 0, PW_AZ_MAXIMUM_BOILING = 1 } pw_az_kind;

#define PW_AZ_MAX 8

/* Tunables of the search; take pw_azeotrope_default_options() and change what you need. */
typedef struct pw_az_options {
    size_t grid;        /* points of the starting table on [x_edge, 1 - x_edge]; default 64,
                         * minimum 8 (more points tighten the curvature assumption) */
    double x_edge;      /* distance of the first and last grid points from the pure ends;
                         * default 1e-6 */
    double xtol_abs;    /* Brent stops when the bracket width < xtol_abs + xtol_rel*|x|;   */
    double xtol_rel;    /* defaults 1e-12 and 64*DBL_EPSILON                                */
    size_t max_iter;    /* Brent iterations per root; default 200 */
    double touch_tol;   /* a local minimum of |f| (no sign change) below this is reported as a
                         * near-tangential point; default 1e-3 (alpha within 0.1 % of 1) */
    double h_class;     /* half-width in x1 of the three-point extremum test; default 1e-3 */
    double skip_x1[2];  /* an open interval of x1 left out of the search (its one-liquid bubble
                         * points are not evaluated): pw_azeotrope_search passes the layers of
                         * the three-phase state, where no one-liquid azeotrope can be and a
                         * strongly non-ideal model may have no one-liquid bubble point at all;
                         * default NAN, NAN: none. The search's guarantee then holds on each
                         * side (docs/azeotrope.md). */
} pw_az_options;

pw_az_options pw_azeotrope_default_options(void);

/* One azeotrope. */
typedef struct pw_azeotrope {
    double x1;
    double T_K, P_Pa;           /* the bubble point at x1 (one of them is the fixed value) */
    double gamma[2], Psat_Pa[2];
    pw_az_kind kind;
    double slope;               /* d(ln alpha12)/dx1 at the root: < 0 for minimum-boiling */
    double curvature;           /* second difference of T [K] (isobaric) or P [Pa]
                                 * (isothermal) over +/- h_class: > 0 is a minimum */
    bool tangential;            /* slope and extremum disagree or slope ~ 0: a double root */
} pw_azeotrope;

/* An interior minimum of |ln alpha12| that does not reach zero: a near-azeotrope (pinch-like)
 * or a tangential root that rounding keeps off zero. */
typedef struct pw_az_touch {
    double x1, ln_alpha, T_K, P_Pa;
} pw_az_touch;

typedef struct pw_az_result {
    pw_az_mode mode;
    double fixed;               /* P in Pa (isobaric) or T in K (isothermal) */
    size_t n;                   /* azeotropes found (sorted by x1) */
    pw_azeotrope az[PW_AZ_MAX];
    bool truncated;             /* more than PW_AZ_MAX roots: the rest are not stored */
    size_t n_touch;
    pw_az_touch touch[PW_AZ_MAX];
    double ln_alpha_end[2];     /* ln alpha12 at x1 = 0 and at x1 = 1 (infinite dilution) */
    double bubble_end[2];       /* bubble T [K] (isobaric) or P [Pa] (isothermal) of pure 2, 1 */
    double T_lo_K, T_hi_K;      /* range of the temperatures the search used */
    size_t n_evals;             /* bubble-point evaluations */
    double fail_x1;             /* where an evaluation failed; NAN when none did */
} pw_az_result;

/* Finds every azeotrope of s at fixed P (mode PW_AZ_ISOBARIC, fixed = P in Pa) or fixed T
 * (PW_AZ_ISOTHERMAL, fixed = T in K). opt may be NULL for the defaults. "No azeotrope" is PW_OK
 * with out->n == 0. Errors: PW_EINVAL (bad arguments or options), bubble-point failures passed
 * up (out->fail_x1 says where), PW_ENOCONV / PW_EMAXITER from the refinement. */
pw_status pw_azeotrope_find(const pw_system *s, pw_az_mode mode, double fixed,
                            const pw_az_options *opt, pw_az_result *out);

/* ln alpha12 and the bubble point at x1 in [0,1] (the function the search solves). */
pw_status pw_azeotrope_ln_alpha(const pw_system *s, pw_az_mode mode, double fixed, double x1,
                                double *ln_alpha, pw_eq_point *bubble);

/* What happens at a boundary of a scan. PW_AZ_BOUNDARY_PURE_END is found by pw_azeotrope_scan;
 * the others by pw_azeotrope_scan_heterogeneous (include/pinchwise/lle.h), where the label
 * "heterogeneous azeotrope" (a three-phase state with its vapor strictly between the layers)
 * differs between two neighbouring scan points. */
typedef enum {
    PW_AZ_BOUNDARY_PURE_END = 0,       /* ln alpha12 at the pure end `end` crosses zero: an
                                        * azeotrope enters or leaves the composition range */
    PW_AZ_BOUNDARY_VAPOR_AT_LAYER = 1, /* the three-phase vapor reaches layer `layer` (y3 = x_I
                                        * or y3 = x_II): on the far side the three-phase line is
                                        * a heterogeneous non-azeotrope (an azeotrope there is
                                        * homogeneous, outside the layers) */
    PW_AZ_BOUNDARY_LINE_ENDS = 2,      /* the three-phase line ends with the vapor still between
                                        * the layers (the layers merge at a critical point, or
                                        * no three-phase state is found beyond) */
    PW_AZ_BOUNDARY_LINE_JUMPS = 3,     /* a three-phase state on both sides, but the distance of
                                        * the vapor from the layers jumps: the search lands on
                                        * another three-phase line (two separate two-liquid
                                        * regions at one T: where the other becomes the wider
                                        * one, whose state pw_three_phase_at_T reports;
                                        * docs/heterogeneous.md section 2) */
    PW_AZ_BOUNDARY_NOT_LOCATED = 4,    /* the labels differ across bracket[] but the three-phase
                                        * search failed inside it (`status` says why): at is NAN */
} pw_az_boundary_kind;

/* Where an azeotrope enters or leaves the composition range inside a scan (kind
 * PW_AZ_BOUNDARY_PURE_END: the pressure, or temperature, at which ln alpha12 at the end
 * x1 = end crosses zero), or where a heterogeneous azeotrope turns homogeneous or the reverse
 * (the other kinds). */
typedef struct pw_az_boundary {
    double at;            /* P in Pa (scan over pressure) or T in K (scan over temperature) */
    int end;              /* 0 or 1: the pure end the azeotrope reaches; -1 for the other kinds */
    double T_K, P_Pa;     /* the pure component's boiling point there; for the other kinds the
                           * three-phase condition at bracket[] end on the heterogeneous side */
    bool present_above;   /* an azeotrope near that end exists just above `at`; for the other
                           * kinds: the azeotrope is heterogeneous just above `at` */
    pw_az_boundary_kind kind;
    /* Only for the kinds other than PW_AZ_BOUNDARY_PURE_END (NAN or -1 otherwise): */
    double bracket[2];    /* the narrowest pair of values evaluated with different labels,
                           * lower first: a change of label lies between them */
    int layer;            /* PW_AZ_BOUNDARY_VAPOR_AT_LAYER: 0 when y3 reaches the layer poorer
                           * in component 1 (x_I), 1 the richer (x_II); -1 otherwise */
    double x_layers[2];   /* the layers and the vapor of the three-phase state at the bracket */
    double y3;            /* end on the heterogeneous side */
    pw_status status;     /* PW_OK, or for PW_AZ_BOUNDARY_NOT_LOCATED the search's failure */
} pw_az_boundary;

/* A scan over the other variable: over pressure for PW_AZ_ISOBARIC, over temperature for
 * PW_AZ_ISOTHERMAL. Points are geometric in P, linear in T. The caller owns points (n_points
 * entries) and boundaries (max_boundaries entries). */
typedef struct pw_az_scan {
    pw_az_mode mode;
    size_t n_points;
    double *at;                  /* the scanned P [Pa] or T [K], n_points entries */
    pw_az_result *points;        /* n_points entries */
    size_t n_boundaries;
    size_t max_boundaries;
    pw_az_boundary *boundaries;
    double x1_shift;             /* max minus min x1 of the azeotrope over the points that have
                                  * exactly one; NAN when fewer than two such points */
    struct pw_three_phase *three_phase; /* n_points entries: the three-phase state at each point,
                                  * valid where three_phase_known[k] (set by pw_azeotrope_scan
                                  * for a model that can split; its layers were left out of the
                                  * point's search), reused by pw_azeotrope_scan_heterogeneous */
    bool *three_phase_known;
    pw_progress_fn progress;     /* set by the caller (NULL after pw_az_scan_alloc): called after
                                  * each point with (points done, n_points); a status other than
                                  * PW_OK stops the scan with it */
    void *progress_ctx;
} pw_az_scan;

/* Allocates a scan of n_points (>= 2) with room for 3*n_points boundaries (two pure ends and one
 * change of the heterogeneous label per interval); NULL on failure. */
pw_az_scan *pw_az_scan_alloc(size_t n_points);
/* Frees a scan; accepts NULL. */
void pw_az_scan_free(pw_az_scan *scan);

/* Runs pw_azeotrope_find at n_points values from `from` to `to` (both > 0, from != to) and
 * locates each boundary by Brent on ln alpha12 at the pure end. Fails with the first failing
 * point's status (points before it are filled). */
pw_status pw_azeotrope_scan(const pw_system *s, pw_az_mode mode, double from, double to,
                            const pw_az_options *opt, pw_az_scan *scan);

/* The temperatures a search used, for the range checks (pw_fit_range_check): r's T_lo_K to
 * T_hi_K, widened by every point of scan (may be NULL). Values that are not finite are passed
 * over. PW_EINVAL for a NULL r or argument, or no finite temperature. */
pw_status pw_az_T_range(const pw_az_result *r, const pw_az_scan *scan, double *T_lo_K,
                        double *T_hi_K);

/* Static name of a kind: "minimum-boiling" or "maximum-boiling". */
const char *pw_az_kind_name(pw_az_kind kind);

#ifdef __cplusplus
}
#endif
#endif
