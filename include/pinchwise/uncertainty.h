/* Design results under parameter uncertainty: how sure is a minimum reflux ratio, a boil-up,
 * a stage count or an azeotrope computed from a fitted model?
 *
 * The fitted parameters theta (the fit's `fitted[]` entries only) are uncertain with covariance C
 * (pw_fit_result.cov). Any result computed from a pw_system is propagated two ways:
 *   linearised   Var f = g^T C g, g = df/dtheta by central finite differences of the whole
 *                calculation (the delta method; Bates & Watts 1988, sec. 2.3; Seber & Wild 1989)
 *   sampled      theta drawn from N(theta_hat, C) (or the multivariate t with the fit's degrees
 *                of freedom), C factored by Cholesky (LAPACK dpotrf) or, when only positive
 *                semi-definite, by its eigen-decomposition (dsyev); the result recomputed for every
 *                draw; 95 % interval from the 2.5 / 97.5 % sample percentiles (JCGM 101:2008).
 * The two intervals "disagree" when either end differs by more than disagree_frac (default 25 %)
 * of the sampled interval's width; the quoted interval is then the sampled one.
 * See docs/uncertainty.md for the methods, their limits and their sources.
 *
 * Nothing here prints, exits or keeps global state; each call owns its random-number generator,
 * so calls may run in parallel threads. */
#ifndef PINCHWISE_UNCERTAINTY_H
#define PINCHWISE_UNCERTAINTY_H

#include <pinchwise/azeotrope.h>
#include <pinchwise/column.h>
#include <pinchwise/decanter.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/fit.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

#define PW_UNC_MAX_OUTPUTS 8

/* A result computed from one parameter set. Fills out[0 .. n_out-1] and returns PW_OK; returns
 * PW_EINFEASIBLE when the result does not exist for this set (the split cannot be made, the
 * azeotrope has vanished): this is an outcome, counted, not an error. Any other status is a
 * failed evaluation. sys is the caller's; the callback must not keep it. ctx is the callback's
 * own (read-only during a call is not required: calls are sequential within one propagation). */
typedef pw_status (*pw_unc_fn)(void *ctx, const pw_system *sys, double *out);

/* What to propagate: the estimate, which parameters are uncertain, their covariance (full
 * parameter space, units of the parameters), and the result function. */
typedef struct pw_unc_problem {
    pw_system sys;                             /* parameters at the estimate theta_hat */
    bool fitted[PW_MAX_PARAMS];                /* uncertain parameters; the others stay fixed */
    double cov[PW_MAX_PARAMS][PW_MAX_PARAMS];  /* rows/columns of fixed parameters are ignored */
    double dof;      /* residual degrees of freedom of the fit (t quantiles, multivariate t);
                        0 = C known exactly (normal quantiles and draws) */
    size_t n_out;    /* 1 .. PW_UNC_MAX_OUTPUTS */
    pw_unc_fn fn;
    void *ctx;
} pw_unc_problem;

/* Fills pb from a fit (sys, fitted[], cov, dof) and the result function. PW_EINVAL for NULL
 * arguments, n_out out of range, or a fit without a model. */
pw_status pw_unc_problem_from_fit(pw_unc_problem *pb, const pw_fit_result *fit, pw_unc_fn fn,
                                  void *ctx, size_t n_out);

typedef struct pw_unc_options {
    size_t samples;        /* Monte Carlo draws; default 400; 0 = linearised only */
    unsigned long seed;    /* GSL mt19937 seed; default 1 (documented in docs/uncertainty.md) */
    bool linearised;       /* compute the delta-method interval (default true) */
    double fd_step;        /* central-difference step as a fraction of each parameter's
                              standard error; default 0.05 */
    double level;          /* coverage of the intervals; default 0.95 */
    double disagree_frac;  /* disagreement rule (see above); default 0.25 */
    size_t max_redraws;    /* draws outside the model's domain are redrawn; at most this many
                              redraws in total (default 10 * samples + 100), then PW_EDOM */
    pw_progress_fn progress; /* called after each draw with (draws done, samples); NULL = none.
                                A status other than PW_OK stops pw_unc_propagate with it. */
    void *progress_ctx;
} pw_unc_options;

pw_unc_options pw_unc_default_options(void);

/* One propagated result. Entries that could not be computed are NAN (and the *_ok flag false). */
typedef struct pw_unc_output {
    double value;                  /* at the estimate */
    double grad[PW_MAX_PARAMS];    /* d value / d theta_k for fitted k; 0 for fixed ones */
    bool lin_ok;
    double sd_lin, ci_lin[2];      /* value -/+ q sd_lin, q = t(dof) or normal quantile */
    bool mc_ok;                    /* at least 20 feasible draws */
    size_t n_mc;                   /* feasible draws that gave this output */
    double mean_mc, sd_mc, ci_mc[2]; /* sample mean, sd, percentile interval (feasible draws) */
    bool disagree;                 /* the rule above fired (both intervals available) */
    bool ci_sampled;               /* ci below is the sampled one */
    double ci[2];                  /* the interval to quote */
} pw_unc_output;

typedef struct pw_unc_result {
    size_t n_out;
    pw_unc_output out[PW_UNC_MAX_OUTPUTS];
    pw_status point_status;  /* the function at the estimate: PW_OK or PW_EINFEASIBLE */
    pw_status lin_status;    /* PW_OK, or why there is no linearised interval */
    size_t n_samples;        /* draws evaluated */
    size_t n_feasible, n_infeasible, n_failed; /* outcomes of the draws */
    size_t n_redrawn;        /* draws rejected for being outside the model's domain */
    double p_feasible;       /* n_feasible / (n_feasible + n_infeasible); NAN without draws */
    bool sampler_eigen;      /* C was only semi-definite: eigen-decomposition used */
    size_t rank;             /* rank of C used for drawing */
} pw_unc_result;

/* Propagates pb's covariance into its outputs (linearised and/or sampled, per opt; NULL =
 * defaults). A point estimate that is infeasible is not an error: point_status says so, the
 * linearised interval is skipped (lin_status = PW_EINFEASIBLE) and the draws still give
 * p_feasible. Errors: PW_EINVAL (bad problem or options, C not positive semi-definite),
 * PW_EDOM (draws kept falling outside the model's domain), PW_ENOMEM, and any failure of the
 * function at the estimate itself. */
pw_status pw_unc_propagate(const pw_unc_problem *pb, const pw_unc_options *opt,
                           pw_unc_result *res);

/* sqrt(g^T C g) over the fitted parameters: the delta-method standard deviation for another
 * covariance (used by measurement planning). cov points to a PW_MAX_PARAMS x PW_MAX_PARAMS
 * row-major matrix (pass &c[0][0]). */
double pw_unc_delta_sd(const double grad[PW_MAX_PARAMS], const bool fitted[PW_MAX_PARAMS],
                       const double *cov);

/* ---- Drawing parameter sets ---------------------------------------------------------------- */

/* n parameter sets drawn with seed (for plotting bands of curves): out is caller-owned, n rows. */
pw_status pw_unc_draw_params(const pw_unc_problem *pb, unsigned long seed, size_t n,
                             double (*out)[PW_MAX_PARAMS], size_t *redrawn);

/* Equilibrium curves y*(x) at pressure P_Pa for n_curves parameter sets drawn with seed (for a
 * band of curves near a pinch): x has n_x points evenly on [x_lo, x_hi] (0 <= x_lo < x_hi <= 1),
 * y receives n_curves rows of n_x values (caller-owned, row-major), NAN where a bubble point
 * failed. Errors as pw_unc_draw_params, PW_EINVAL for a bad window. */
pw_status pw_unc_curve_band(const pw_unc_problem *pb, unsigned long seed, double P_Pa,
                            size_t n_curves, double x_lo, double x_hi, size_t n_x, double *x,
                            double *y);

/* ---- Column results ------------------------------------------------------------------------ */

/* Outputs of pw_unc_column_fn, in this order. */
enum { PW_UNC_RMIN = 0, PW_UNC_SMIN = 1, PW_UNC_STAGES = 2, PW_UNC_COLUMN_NOUT = 3 };

typedef struct pw_unc_column_ctx {
    double P_Pa;                 /* column pressure */
    pw_column_spec spec;
    pw_column_options opt;       /* grid, tolerances; the design factor is set from factor */
    double factor;               /* operating reflux R = factor * R_min (default 1.3) */
    const struct pw_heat_data *heat; /* NULL (default): constant molal overflow; else energy
                                        balances with these heat data (enthalpy.h), boil-up NAN */
} pw_unc_column_ctx;

/* Defaults: column defaults, factor 1.3 (common practice, R/R_min 1.2-1.5). */
pw_unc_column_ctx pw_unc_column_ctx_make(double P_Pa, const pw_column_spec *spec);

/* R_min, boil-up at R_min, stages at factor * R_min; PW_EINFEASIBLE when pw_column_solve finds
 * the split infeasible. ctx is a pw_unc_column_ctx. */
pw_status pw_unc_column_fn(void *ctx, const pw_system *sys, double *out);

/* The feasibility risk in words into buf, e.g. "in 12 % of parameter sets drawn from the fit's
 * uncertainty the split cannot be made: ...". Returns buf. */
const char *pw_unc_risk_words(const pw_unc_result *r, char *buf, size_t len);

/* ---- Azeotropes --------------------------------------------------------------------------- */

/* Outputs of pw_unc_azeo_fn: composition, and T [K] at fixed P or P [kPa] at fixed T. */
enum { PW_UNC_AZ_X1 = 0, PW_UNC_AZ_TP = 1, PW_UNC_AZ_NOUT = 2 };

typedef struct pw_unc_azeo_ctx {
    pw_az_mode mode;
    double fixed;          /* P in Pa (isobaric) or T in K (isothermal) */
    pw_az_options opt;
    double x_ref;          /* the azeotrope followed: at the estimate */
    pw_az_kind kind;
} pw_unc_azeo_ctx;

/* Follows the azeotrope az of the estimate (search options opt, NULL = defaults). */
pw_unc_azeo_ctx pw_unc_azeo_ctx_make(pw_az_mode mode, double fixed, const pw_az_options *opt,
                                     const pw_azeotrope *az);

/* The azeotrope of the same kind nearest x_ref; PW_EINFEASIBLE when the parameter set has none
 * of that kind (the azeotrope has vanished). ctx is a pw_unc_azeo_ctx. */
pw_status pw_unc_azeo_fn(void *ctx, const pw_system *sys, double *out);

/* Propagates every azeotrope of r (found at the estimate of fit) into res[0 .. r->n - 1]
 * (outputs PW_UNC_AZ_X1, PW_UNC_AZ_TP). On failure *failed (may be NULL) is the index of the
 * azeotrope that failed; the results before it are filled. Errors as pw_unc_propagate. */
pw_status pw_unc_azeo_assess(const pw_fit_result *fit, const pw_az_result *r,
                             const pw_unc_options *opt, pw_unc_result res[PW_AZ_MAX],
                             size_t *failed);

/* ---- Heterogeneous azeotrope and the decanter scheme (src/analysis/uncertainty_het.c) ----- */

/* Outputs of pw_unc_het_fn: the three-phase temperature [K] at fixed P (pressure [kPa] at fixed
 * T), the vapor y3 (the heterogeneous azeotrope's composition), the layers x_I < x_II boiling at
 * it; with the decanter also the minimum boil-up V/B of column A (bottoms rich in 1) and of
 * column B, and the decanter's own layers, lean and rich in 1, that top columns B and A (those
 * of a cooled decanter, pw_decanter_spec.T_decanter_K; else the boiling layers again). */
enum {
    PW_UNC_HET_TP = 0, PW_UNC_HET_Y = 1, PW_UNC_HET_XI = 2, PW_UNC_HET_XII = 3,
    PW_UNC_HET_NOUT = 4,
    PW_UNC_DEC_SA = 4, PW_UNC_DEC_SB = 5, PW_UNC_DEC_TOP_LEAN = 6, PW_UNC_DEC_TOP_RICH = 7,
    PW_UNC_DEC_NOUT = 8
};

typedef struct pw_unc_het_ctx {
    bool decanter;           /* false: the heterogeneous azeotrope; true: the decanter scheme */
    pw_az_mode mode;         /* the azeotrope's condition (the decanter is always at spec.P_Pa) */
    double fixed;            /* P in Pa (isobaric) or T in K (isothermal) */
    pw_decanter_spec spec;   /* decanter only */
    pw_column_options opt;   /* decanter only: grid and stage limits; design rows are not needed */
} pw_unc_het_ctx;

/* The heterogeneous azeotrope at (mode, fixed). */
pw_unc_het_ctx pw_unc_het_azeo_ctx(pw_az_mode mode, double fixed);
/* The decanter scheme of spec (opt NULL = column defaults; its design factors are dropped). */
pw_unc_het_ctx pw_unc_decanter_ctx(const pw_decanter_spec *spec, const pw_column_options *opt);

/* Fills out[0 .. PW_UNC_HET_NOUT - 1] (and the two boil-ups for the decanter). PW_EINFEASIBLE,
 * counted as an outcome, when the parameter set has no split at the three-phase condition, a
 * heterogeneous non-azeotrope (y3 outside the layers), or (decanter) an infeasible scheme for
 * the given products. ctx is a pw_unc_het_ctx. */
pw_status pw_unc_het_fn(void *ctx, const pw_system *sys, double *out);

/* Propagates the fit's covariance into the heterogeneous azeotrope (n_out PW_UNC_HET_NOUT) or
 * the decanter scheme (PW_UNC_DEC_NOUT), per ctx. Errors as pw_unc_propagate; a point estimate
 * without the split is res->point_status PW_EINFEASIBLE, not an error. */
pw_status pw_unc_het_assess(const pw_fit_result *fit, const pw_unc_het_ctx *ctx,
                            const pw_unc_options *opt, pw_unc_result *res);

/* ---- Model risk ---------------------------------------------------------------------------- */

/* AICc classes (Burnham & Anderson 2002): delta < 2 indistinguishable, < 10 considered. */
typedef enum { PW_UNC_MODEL_BEST = 0, PW_UNC_MODEL_EQUAL = 1, PW_UNC_MODEL_CONSIDERED = 2,
               PW_UNC_MODEL_DROPPED = 3 } pw_unc_model_class;

#define PW_UNC_MAX_MODELS 16

typedef struct pw_unc_model_row {
    const pw_model_type *model;
    double aicc, delta_aicc, weight;  /* Akaike weight among the considered models */
    pw_unc_model_class cls;
    pw_status status;                 /* of the result function: PW_OK, PW_EINFEASIBLE, ... */
    double out[PW_UNC_MAX_OUTPUTS];   /* NAN unless status == PW_OK */
} pw_unc_model_row;

typedef struct pw_unc_models {
    size_t n, n_out;
    pw_unc_model_row rows[PW_UNC_MAX_MODELS]; /* in the order given */
    size_t best;
    double lo[PW_UNC_MAX_OUTPUTS], hi[PW_UNC_MAX_OUTPUTS]; /* spread over considered models */
    size_t n_considered, n_considered_ok;
    bool feasibility_differs;  /* some considered models find it feasible, others not */
} pw_unc_models;

/* Evaluates fn for every fit (same data: equal residual counts, and equal dataset hashes when
 * both are recorded; else PW_EINVAL) and classifies them by delta-AICc. */
pw_status pw_unc_compare_models(const pw_fit_result *const *fits, size_t n, pw_unc_fn fn,
                                void *ctx, size_t n_out, pw_unc_models *out);

/* ---- Measurement planning ------------------------------------------------------------------ */

#define PW_UNC_MAX_BINS 20

typedef struct pw_unc_plan_bin {
    double x_lo, x_hi;
    bool ok;            /* hypothetical points could be evaluated */
    double sd_new;      /* delta-method sd of the output with the added points */
    double reduction;   /* 1 - sd_new / sd_now */
} pw_unc_plan_bin;

typedef struct pw_unc_plan {
    size_t n_bins, points_per_bin, best;   /* best = index of the largest reduction */
    double sd_now;
    pw_unc_plan_bin bins[PW_UNC_MAX_BINS];
    bool have_best;
} pw_unc_plan;

/* For each of n_bins equal bins of x1 in (0,1), adds points_per_bin hypothetical measurements
 * (evenly inside the bin, at the fit's fixed P or T, with the fit's sigmas) to the information
 * matrix, C_new = (C^-1 + J_new^T J_new / s^2)^-1 with s^2 = the fit's chi2_red, and evaluates
 * sqrt(g^T C_new g) for the gradient grad of one output (from pw_unc_propagate). Errors:
 * PW_EINVAL, PW_ESINGULAR (C not invertible), PW_ENOMEM. */
pw_status pw_unc_plan_measurements(const pw_fit_result *fit, const double grad[PW_MAX_PARAMS],
                                   size_t n_bins, size_t points_per_bin, pw_unc_plan *out);

/* The recommendation as one sentence into buf, naming the composition range; quantity names
 * the output (e.g. "R_min"). Returns buf. */
const char *pw_unc_plan_words(const pw_unc_plan *plan, const char *quantity, char *buf,
                              size_t len);

/* ---- Column results with their measurement plan ------------------------------------------ */

/* The column propagation with its measurement plan, in one call (as the reflux command and the
 * report use it). */
typedef struct pw_unc_column_assessment {
    pw_unc_result res;         /* outputs PW_UNC_RMIN, PW_UNC_SMIN, PW_UNC_STAGES */
    pw_status plan_status;     /* PW_OK when plan holds a recommendation for R_min; else why not
                                  (PW_EINVAL when R_min has no linearised gradient) */
    pw_unc_plan plan;
} pw_unc_column_assessment;

/* Propagates the fit's covariance into the column results of col (pw_unc_column_fn), then, when
 * R_min has a linearised gradient, plans plan_bins bins of plan_points hypothetical points each
 * (pw_unc_plan_measurements). col must stay valid during the call. Errors as pw_unc_propagate;
 * a failed plan is not an error (plan_status). */
pw_status pw_unc_column_assess(const pw_fit_result *fit, const pw_unc_column_ctx *col,
                               const pw_unc_options *opt, size_t plan_bins, size_t plan_points,
                               pw_unc_column_assessment *out);

#ifdef __cplusplus
}
#endif
#endif
