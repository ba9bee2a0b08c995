/* A design-grade binary column on a fitted system at fixed pressure: design rows with stage
 * profiles (constant molal overflow or energy balances), the energy-balance minimum reflux
 * (Ponchon-Savarit difference points), and rating a given column.
 *
 * Conventions as in column.h: mole fractions of component 1, xb < zf < xd, total condenser
 * (not counted), partial reboiler counted as the last stage, stages numbered from the top, flows
 * per mole of feed. Energies in J per mole of feed inside the library. See docs/column.md. */
#ifndef PINCHWISE_DESIGN_H
#define PINCHWISE_DESIGN_H

#include <pinchwise/column.h>
#include <pinchwise/enthalpy.h>
#include <pinchwise/equilibrium.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum { PW_BALANCE_CMO = 0, PW_BALANCE_ENERGY = 1 } pw_balance;

/* "constant-molal-overflow" or "energy". */
const char *pw_balance_name(pw_balance b);

/* One equilibrium stage: the liquid and vapor leaving it and their flows per mole of feed. */
typedef struct pw_stage {
    double x, y, T_K;
    double L, V;
} pw_stage;

/* Stages 1..n from the top; stage[n-1] is the partial reboiler. In a stepped design the last
 * stage's liquid lies at or beyond xb (the step that reaches xb; `stages` counts it
 * fractionally). */
typedef struct pw_profile {
    pw_stage *stage;
    size_t n, cap;
    double stages;  /* equilibrium stages, fractional last step (stepping) or n (rating) */
    int feed_stage; /* 1-based */
} pw_profile;

/* Frees the stages; accepts a zeroed or already freed profile. */
void pw_profile_free(pw_profile *p);

/* The lowest and highest stage temperature of p (stages whose T is not finite are passed over;
 * in a column they are the top and the reboiler, but no order is assumed). PW_EINVAL for NULL
 * arguments or a profile without a finite stage temperature. In src/fit/fit_ranges.c. */
pw_status pw_profile_T_range(const pw_profile *p, double *T_lo_K, double *T_hi_K);

/* One row of a design table at R = factor R_min. reachable = false when stepping cannot reach
 * xb (a pinch at this reflux: why = PW_EINFEASIBLE, or more than max_stages: PW_EMAXITER); the
 * row is then reported as such, not as an error. */
typedef struct pw_design_case {
    double factor, R, boilup; /* boilup = Vbar/B below the feed (at the reboiler) */
    bool reachable;
    pw_status why;
    double stages;
    int feed_stage;
    double Q_C, Q_R;         /* J per mol feed (condenser removes, reboiler adds); NAN for CMO */
    double gilliland_stages; /* Molokanov et al. (1972) form, for comparison (column.h) */
    pw_profile profile;
} pw_design_case;

typedef struct pw_design_table {
    pw_balance balance;
    pw_design_case row[PW_COLUMN_MAX_FACTORS];
    size_t n;
} pw_design_table;

void pw_design_table_free(pw_design_table *t);

/* Steps a constant-molal-overflow column at reflux R with the optimal feed stage and records
 * the profile (x, y, T, flows). Either split direction: with xd < zf < xb (component 1 to the
 * bottoms) it steps on the mirrored curve (column_direction.h) and records fractions of
 * component 1. PW_EINFEASIBLE when the operating line meets the curve before xb,
 * PW_EMAXITER beyond max_stages, PW_EINVAL for R < 0, a non-positive boil-up or a bad spec. */
pw_status pw_cmo_profile(const pw_system *sys, double P_Pa, const pw_column_spec *spec, double R,
                         size_t max_stages, pw_profile *out);

/* The design table of constant molal overflow at factors x r_min (opt's factors and
 * max_stages; NULL = defaults). r_min must be positive; n_min (stages at total reflux) feeds the
 * Gilliland comparison. Unreachable rows are marked, not errors. */
pw_status pw_design_cmo(const pw_system *sys, double P_Pa, const pw_column_spec *spec, double r_min,
                        double n_min, const pw_column_options *opt, pw_design_table *out);

/* ---- Energy balances (Ponchon 1921; Savarit 1922) ---- */

typedef struct pw_energy_result {
    bool feasible;
    char reason[PW_REASON_MAX];
    double r_min;           /* L/D at the top at minimum reflux */
    double s_min;           /* Vbar/B at the reboiler at R_min */
    pw_pinch pinch;         /* kind, section, x = liquid where the limit is reached, y = y*(x) */
    bool reflux_limited;    /* R_min = 0: no tie line limits */
    bool boilup_limited;    /* R_min set by a reboiler duty of zero */
    double n_min;           /* total reflux (the energy balance plays no part there) */
    double x_feed, y_feed;  /* the tie line through the feed point (x, y*) */
    double h_F, h_D, h_B;   /* J/mol: feed, saturated-liquid distillate and bottoms */
    double H_top;           /* J/mol: saturated vapor of composition xd (top vapor) */
    double r_rect, r_strip; /* the limits of each section alone (diagnostics) */
} pw_energy_result;

/* Options: opt->rtol (R_min), opt->grid (the coarse bracket of the section searches; every cell
 * is then proved or halved, so the grid does not decide the answer: docs/column.md section 9),
 * factors and max_stages for the design table. Either direction: xb < zf < xd, or xd < zf < xb
 * (component 1 to the bottoms; results in fractions of component 1). Infeasible splits are PW_OK
 * with feasible = false. */
pw_status pw_energy_column_solve(const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                                 const pw_column_spec *spec, const pw_column_options *opt,
                                 pw_energy_result *out, pw_design_table *design);

/* Steps an energy-balance column at reflux R with the optimal feed stage, recording x, y, T and
 * the flows of every stage; *Q_C, *Q_R in J per mol feed. Statuses as pw_cmo_profile. */
pw_status pw_energy_profile(const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                            const pw_column_spec *spec, double R, size_t max_stages,
                            pw_profile *out, double *Q_C, double *Q_R);

/* ---- Rating a given column ---- */

typedef struct pw_rate_spec {
    int n_stages;   /* N, the partial reboiler included (N >= 1) */
    int feed_stage; /* K in 1..N */
    double R;       /* reflux ratio L/D >= 0 */
    double zf, q;
    double d_frac; /* D/F in (0, 1) */
} pw_rate_spec;

typedef struct pw_rate_result {
    double xd, xb;
    double residual; /* mismatch of the two sections at the feed stage */
    int iterations;
    pw_profile profile;
} pw_rate_result;

/* Solves the column for its products, constant molal overflow: shooting on xd, each section
 * stepped from its own product, matched at the feed stage. The mismatch is strictly increasing
 * in xd (docs/column.md), so the root is unique and bracketed by the physical range of xd.
 * PW_EINFEASIBLE with err naming the problem for specifications no column meets (D/F outside
 * (0,1), a non-positive flow in a section). */
pw_status pw_rate_cmo(const pw_system *sys, double P_Pa, const pw_rate_spec *spec,
                      pw_rate_result *out, pw_error *err);

/* The same with an energy balance on every stage (difference points, docs/column.md): DeltaD
 * from R and the products, DeltaB from the overall energy balance. Energy balances can admit more
 * than one steady state: every root of the feed-stage mismatch is enumerated by a search that
 * cannot miss one under a checked curvature bound (docs/column.md, "Rating a given column");
 * *n_roots says how many there are, out holds the one with the lowest distillate purity (lowest
 * xd, or highest xb); out->iterations counts the residual evaluations. PW_ENOCONV when the
 * enumeration could not be completed.
 * *Q_C, *Q_R in J per mol feed. PW_EINFEASIBLE when no steady state is found. */
pw_status pw_rate_energy(const pw_system *sys, const pw_heat_data *heat, double P_Pa,
                         const pw_rate_spec *spec, pw_rate_result *out, double *Q_C, double *Q_R,
                         size_t *n_roots, pw_error *err);

/* The checks every rating ends with (pw_rate_cmo and pw_rate_energy call it): a stage liquid
 * inside the two-liquid region of a model that splits at P is refused (PW_EINFEASIBLE, the layers
 * and the decanter scheme named), and a feed-stage mismatch above 1e-8 is no steady state
 * (PW_ENOCONV with the reason). On failure out is freed and err says why, prefixed with what. */
pw_status pw_rate_verify(const pw_system *sys, double P_Pa, pw_rate_result *out,
                         const char *what, pw_error *err);

void pw_rate_result_free(pw_rate_result *r);

#ifdef __cplusplus
}
#endif
#endif
