/* Regression of activity-model parameters to measured binary VLE data.
 *
 * Objectives (chosen from the data type):
 *   T-x-y (isobaric):   residuals (T_calc - T)/sigma_T and (y_calc - y)/sigma_y
 *   P-x-y (isothermal): residuals (P_calc - P)/sigma_P and (y_calc - y)/sigma_y
 *   P-x (isothermal, no y): Barker's method, residuals (P_calc - P)/sigma_P only
 *   T-x (isobaric, no y):   Barker's method analogue, (T_calc - T)/sigma_T only
 * with T_calc, y_calc from bubble-T at the measured x and P, P_calc, y_calc from bubble-P.
 * Minimised with GSL's trust-region Levenberg-Marquardt (gsl_multifit_nlinear) with analytic
 * Jacobians, from several starting points. See docs/fitting.md. */
#ifndef PINCHWISE_FIT_H
#define PINCHWISE_FIT_H

#include <pinchwise/component.h>
#include <pinchwise/dataset.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/lledata.h>
#include <pinchwise/model.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum { PW_OBJ_TXY = 0, PW_OBJ_PXY = 1, PW_OBJ_PX = 2, PW_OBJ_TX = 3 } pw_objective;

typedef enum {
    PW_STOP_NONE = 0,   /* not run */
    PW_STOP_STEP,       /* relative step below xtol */
    PW_STOP_GRADIENT,   /* scaled gradient below gtol */
    PW_STOP_MAXITER,    /* iteration limit: not converged */
    PW_STOP_FAILED,     /* a model evaluation or linear solve failed */
    PW_STOP_NOPROG,     /* GSL found no step that lowers chi2 from the start point (GSL_ENOPROG
                           on the first iteration); a minimum only if the gradient test holds */
    PW_STOP_MACHINE     /* GSL_ETOLX/ETOLG/ETOLF: converged to machine precision */
} pw_stop_reason;

/* What the chosen parameters are (docs/fitting.md, "Convergence classes"). */
typedef enum {
    PW_FIT_NOT_RUN = 0,
    PW_FIT_MINIMUM,        /* converged at an interior minimum, every parameter identifiable */
    PW_FIT_EXACT,          /* residuals at rounding level: rms weighted residual <= PW_FIT_EXACT_RMS */
    PW_FIT_UNIDENTIFIABLE, /* converged, but the information matrix is near-singular */
    PW_FIT_RUNAWAY,        /* a parameter beyond the model's physical bound: not converged */
    PW_FIT_MAXITER,        /* iteration limit reached: not converged */
    PW_FIT_FAILED          /* no run produced an evaluable stationary point */
} pw_fit_class;

/* rms of the weighted residuals (in units of the stated uncertainties) at or below which a fit
 * is exact: a millionth of the measurement uncertainty, far below any measurement's resolution. */
#define PW_FIT_EXACT_RMS 1e-6
/* A combination of parameters is not identifiable when its singular value of the weighted
 * Jacobian is below this fraction of the largest (condition of J^T J above 1e12). */
#define PW_FIT_IDENT_SV_RATIO 1e-6
/* ... or when its 95 % half-width for some parameter exceeds 10 in ln-gamma units (|A_ij|, or an
 * energy in K divided by T_ref): gamma_inf would be unknown within a factor e^10 = 22 000. */
#define PW_FIT_UNFIXED_HALFWIDTH 10.0
/* Runaway bounds: |A_ij| <= 30 for dimensionless constants; |a_ij/T_ref|, |b_ij/T_ref| <= 30 for
 * energies in K; van Laar: 1/100 <= A12/A21 <= 100. */
#define PW_FIT_BOUND_LNGAMMA 30.0
#define PW_FIT_BOUND_VANLAAR_RATIO 100.0

#define PW_FIT_MAX_EXCLUDE 256
#define PW_FIT_MAX_MINIMA 8

typedef struct pw_fit_options {
    bool fit_alpha;        /* NRTL: fit alpha too (default false) */
    double alpha;          /* NRTL fixed alpha (default 0.3, Renon & Prausnitz 1968) */
    double V2_V1;          /* Wilson volume ratio; NAN = from the components' V_L, else 1 */
    size_t n_starts;       /* LM runs, each from its own start (default 8): the model's default
                              start, the ideal-solution point, then the best of 4 n_starts seeded
                              draws screened by one evaluation each */
    unsigned long seed;    /* for the start points (default 1) */
    double sigma_T_K, sigma_P_rel, sigma_y; /* NAN = from the dataset (its metadata or defaults) */
    double sigma_P_abs_Pa; /* absolute pressure uncertainty, used when sigma_P_rel is NAN (NAN = none) */
    size_t max_iter;       /* per start (default 200) */
    double xtol, gtol;     /* GSL tests; defaults sqrt(DBL_EPSILON)-based, see docs/fitting.md */
    long exclude_lines[PW_FIT_MAX_EXCLUDE]; /* file line numbers to leave out */
    size_t n_exclude;
    char exclude_reason[256];
    pw_vapor_model vapor;  /* PW_VAPOR_IDEAL (default) or PW_VAPOR_VIRIAL (needs critical data) */
    /* Partly miscible liquids (docs/heterogeneous.md): measured tie lines fitted together with
     * the VLE data, residuals (x_calc - x)/sigma_x_lle for both layers (NULL / 0: none), and
     * whether three-phase points of the VLE set are detected and modelled (default true). */
    const pw_tie_line *tie_lines;
    size_t n_tie_lines;
    double sigma_x_lle;    /* NAN: PW_LLE_SIGMA_X_DEFAULT */
    bool three_phase_points;
    /* Run every start to its end (default false: a run whose iterate enters the neighbourhood
     * of a minimum already found, with an objective not below that minimum's, is counted as
     * one more start that ends there and stopped; docs/fitting.md, "Multistart"). For tests and
     * checks of that rule; the answer is the same either way up to the LM tolerances
     * (tests/unit/test_fit_basins.c). */
    bool exhaustive_starts;
} pw_fit_options;

/* Defaults as documented above. */
pw_fit_options pw_fit_default_options(void);

/* One measured point with the model's answer at its x (and fixed P or T). */
typedef struct pw_fit_point {
    pw_point meas;
    bool excluded;
    double T_calc_K, P_calc_Pa, y_calc;   /* NAN when the solve failed */
    double lngamma_exp[2];                /* from y, T, P and P^sat; NAN when not derivable */
    bool three_phase;                     /* a point inside the two-liquid region: modelled as
                                           * the three-phase state (T3 or P3 and y3) */
    bool in_layers;                       /* a one-liquid point (not three_phase) whose x1 the
                                           * model puts strictly between its layers at the
                                           * data's three-phase condition (only for data with
                                           * three-phase points or fitted tie lines): modelled,
                                           * and its calculated
                                           * values given, as the three-phase state too */
} pw_fit_point;

/* A distinct local minimum found by the multistart. */
typedef struct pw_fit_minimum {
    double params[PW_MAX_PARAMS];
    double chi2;
    size_t hits;       /* how many starts ended here */
} pw_fit_minimum;

/* Deviation statistics of one quantity (calc - measured) over the points used. */
typedef struct pw_fit_stat {
    double aad, bias, max_abs; /* NAN when the quantity was not measured */
    long max_line;             /* line of the largest deviation */
} pw_fit_stat;

/* One tie line a fit used: measured and calculated layers (mole fractions of component 1; the
 * calculated ones NAN when the model gives no split at T_K, 0 and 1 beyond the solver's floor). */
typedef struct pw_fit_tie {
    long line;                 /* its line in the LLE file (0 when not known) */
    double T_K, x_I, x_II;
    double calc_I, calc_II;
} pw_fit_tie;

typedef struct pw_fit_result {
    pw_system sys;             /* components, model, fitted parameters, T_ref */
    pw_objective objective;
    pw_data_kind kind;
    double P_fixed_Pa, T_fixed_K;
    bool has_y;
    bool fitted[PW_MAX_PARAMS];
    size_t n_fitted;
    double stderr_[PW_MAX_PARAMS];           /* NAN for fixed parameters */
    double ci95[PW_MAX_PARAMS][2];
    double cov[PW_MAX_PARAMS][PW_MAX_PARAMS]; /* full-size, zero rows for fixed parameters */
    double corr[PW_MAX_PARAMS][PW_MAX_PARAMS];
    bool converged;            /* fit_class is MINIMUM, EXACT or UNIDENTIFIABLE */
    pw_stop_reason stop;
    pw_fit_class fit_class;
    bool identifiable;         /* false: weak_dir is a combination the data do not fix */
    double weak_dir[PW_MAX_PARAMS]; /* in parameter units, largest |coefficient| 1; 0 if fixed */
    double sv_ratio;           /* smallest / largest singular value of the weighted Jacobian */
    bool stderr_meaningful[PW_MAX_PARAMS]; /* false: stderr_ is NAN, the data do not fix it */
    int runaway_param;         /* index of the parameter beyond its bound, -1 if none */
    size_t n_runaway_runs;     /* LM runs that ended beyond a runaway bound */
    double runaway_chi2;       /* lowest chi2 among them (NAN when none); it may lie below chi2:
                                  a runaway is never chosen over a bounded answer */
    size_t iterations, n_fev, n_jev;
    size_t n_runs;             /* LM runs of the multistart */
    double chi2, chi2_red;     /* weighted sum of squares and per degree of freedom */
    size_t n_residuals, dof;
    double aic, aicc, bic;
    pw_fit_stat dev_y, dev_T_K, dev_P_Pa;
    double lngamma_inf[2];     /* at T_ref: ln gamma1 at x1 -> 0, ln gamma2 at x1 -> 1 */
    pw_fit_minimum minima[PW_FIT_MAX_MINIMA];
    size_t n_minima;
    /* the default minimum the fit chose (1-based in minima; 0 when the answer is no stationary
     * point) and how many lower ones it passed over because they predict a liquid split the data
     * do not show (pw_fit_default_minimum, docs/fitting.md) */
    size_t minimum_default, minimum_split_skipped;
    bool split;                /* parameters predict a liquid-liquid split in 0 < x1 < 1 */
    double split_min_D, split_x, split_T_K;
    double T_min_K, T_max_K;   /* range of the data (validity range of the fit) */
    double sigma_T_K, sigma_P_rel, sigma_y;
    /* The dataset's own uncertainty metadata (stated in its file or the reader's defaults), kept
     * apart from the weights above (which fit options may override) so that the consistency
     * tests can be run from the fit file exactly as `check` runs them on the file
     * (pw_fit_dataset). data_sigma_known false: an older fit file without them. */
    bool data_sigma_known;
    double data_sigma_T_K, data_sigma_P_rel, data_sigma_P_abs_Pa, data_sigma_y, data_sigma_x;
    bool data_sigma_y_stated, data_sigma_x_stated;
    pw_fit_point *pts;         /* all measured points, excluded ones flagged */
    size_t n_pts;
    char exclude_reason[256];
    char dataset_path[PW_PATH_MAX];
    char dataset_sha256[65];
    char source[PW_SOURCE_MAX];
    char version[32];
    char created[40];          /* ISO 8601 UTC */
    size_t n_three_phase;      /* points modelled as three-phase points */
    bool layers_scored;        /* one-liquid points inside the model's layers are scored (and
                                * given calculated values) by the three-phase state
                                * (pw_fit_point.in_layers): every fit since 3 December 2026;
                                * false for a fit file written before, whose objective scored
                                * them by one-liquid bubble points ("inside_layers_scored") */
    size_t n_tie_lines;        /* tie lines fitted together with the VLE points */
    double sigma_x_lle;
    double aad_x_lle;          /* mean |x_calc - x| over both layers of every tie line; NAN */
    pw_fit_tie *ties;          /* the n_tie_lines tie lines, measured and calculated (NULL
                                * when none, or from a fit file written before they were kept) */
} pw_fit_result;

/* fit --lle: points fo at the tie lines of lle in the dataset's component order (a swapped copy
 * in *swapped, which the caller frees after the fit, when the LLE file names the components the
 * other way round; NULL otherwise) with the file's sigma_x. PW_EPARSE naming the LLE file's
 * components line when its components are not the dataset's. */
pw_status pw_fit_attach_tie_lines(const pw_lle_dataset *lle, const pw_dataset *ds,
                                  pw_fit_options *fo, pw_tie_line **swapped, pw_error *err);

/* As pw_fit_attach_tie_lines, with the components c1, c2 in the dataset's order (those the fit
 * uses): tie lines given as mass fractions (lle->mass, w1_I / w1_II columns) are converted to mole
 * fractions with their molar masses into the copy *copy (which the caller frees; NULL when the
 * rows are used as they are). Without c1, c2 (both functions) mass-fraction tie lines are
 * PW_EINVAL; a component without a molar mass is PW_ENOTFOUND naming it and the LLE file's
 * header line. */
pw_status pw_fit_attach_tie_lines_ex(const pw_lle_dataset *lle, const pw_dataset *ds,
                                     const pw_component *c1, const pw_component *c2,
                                     pw_fit_options *fo, pw_tie_line **copy, pw_error *err);

/* Fits model to ds with components c1, c2 (in the dataset's order). out is filled even when
 * the fit does not converge (converged = false, stop says why); the return is then PW_OK.
 * Errors: PW_ETOOFEW (fewer usable points than parameters + 1), PW_EINVAL, PW_ENOMEM.
 * The caller frees out with pw_fit_result_free. */
pw_status pw_fit_run(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                     const pw_model_type *model, const pw_fit_options *opt, pw_fit_result *out,
                     pw_error *err);

/* Recomputes the per-point model values, statistics and the stability screen of r from its
 * current parameters (used after reading a fit file or perturbing parameters). */
pw_status pw_fit_evaluate(pw_fit_result *r);

/* The two liquids r's data show: the points flagged three_phase (modelled as such by a model
 * that can split, or left out by one that cannot), whether excluded or not. Zeroed (n = 0) when
 * there are none. pw_fit_evaluate stores it in r->sys.measured, so every system taken from a fit
 * carries it. */
pw_measured_split pw_fit_measured_split(const pw_fit_result *r);

/* Temperatures a calculation used, against the validity ranges behind it: how far T_lo_K lies
 * below and T_hi_K above each component's vapor-pressure range (0 inside; docs/thermo.md), and
 * whether [T_lo_K, T_hi_K] leaves the fitted data's range [T_min_K, T_max_K] by more than
 * PW_RANGE_DATA_MARGIN_K. One check for every command that renders range warnings. */
#define PW_RANGE_DATA_MARGIN_K 1.0
typedef struct pw_range_check {
    double T_lo_K, T_hi_K;
    double below_K[2], above_K[2]; /* per component, >= 0 */
    bool outside_data;             /* false when the data range is unknown */
    double data_T_min_K, data_T_max_K;
} pw_range_check;

/* Fills out for the range [T_lo_K, T_hi_K] (a single temperature: both equal). PW_EINVAL for
 * NULL arguments or a range that is not finite or not ordered. */
pw_status pw_fit_range_check(const pw_fit_result *r, double T_lo_K, double T_hi_K,
                             pw_range_check *out);

/* The same with the data range widened by margin_K (>= 0, finite; PW_EINVAL otherwise) instead
 * of PW_RANGE_DATA_MARGIN_K: outside_data when T_lo_K < T_min_K - margin_K or
 * T_hi_K > T_max_K + margin_K. */
pw_status pw_fit_range_check_margin(const pw_fit_result *r, double T_lo_K, double T_hi_K,
                                    double margin_K, pw_range_check *out);

/* The margin of a column's end temperatures against the fitted data's range (reflux and the
 * report). The ends are the bubble points of nearly pure products; a data set that stops short
 * of the pure components (or whose pure rows carry no mixture information) leaves them a few
 * kelvin outside its temperatures even when the column runs at the data's pressure, and near a
 * pure end the major component's activity coefficient tends to 1 whatever the parameters, so
 * little is extrapolated there. 5 K lets that case pass and still flags a column run at another
 * pressure than the data's (a few per cent in P moves a boiling point by about 1 K). A choice of
 * this project, not a published value; a calculation at one condition inside the composition
 * range keeps PW_RANGE_DATA_MARGIN_K. */
#define PW_RANGE_COLUMN_MARGIN_K 5.0

/* A column's two end temperatures against the ranges: ends[0] the top at T_top_K and ends[1]
 * the bottom at T_bottom_K, each checked as a single temperature (pw_fit_range_check; an end
 * that is not finite, e.g. a bubble point that failed, is zeroed with T_lo_K = T_hi_K = NAN
 * and warns of nothing), and *span, the range from the lower to the higher finite end, against
 * the data range widened by margin_K (pw_fit_range_check_margin). PW_EINVAL for NULL
 * arguments, a bad margin, or no finite end. */
pw_status pw_fit_range_check_ends(const pw_fit_result *r, double T_top_K, double T_bottom_K,
                                  double margin_K, pw_range_check ends[2], pw_range_check *span);

/* The vapor-pressure ranges alone, for a calculation without a fit (e.g. a data set's
 * temperatures against its two components): below_K and above_K as pw_fit_range_check fills
 * them, outside_data false and the data range NAN. PW_EINVAL for NULL arguments or a range
 * that is not finite or not ordered. */
pw_status pw_component_range_check(const pw_component *c1, const pw_component *c2,
                                   double T_lo_K, double T_hi_K, pw_range_check *out);

/* true when any warning applies (a component's range left, or the data range). */
bool pw_range_check_any(const pw_range_check *c);

/* How many of r->minima (sorted by chi2) fit as well as the best: chi2 within a factor
 * max(1.01, exp(2/n)) of it, i.e. delta-AICc < 2 for one model (docs/fitting.md). */
size_t pw_fit_competing_minima(const pw_fit_result *r);

/* Machine names of the classes ("minimum", "exact", "not-identifiable", "runaway",
 * "iteration-limit", "failed", "not-run") and back; pw_fit_class_from_name returns -1 for an
 * unknown name. */
const char *pw_fit_class_name(pw_fit_class c);
int pw_fit_class_from_name(const char *name);

/* The model's runaway bound check: -1 when every fitted parameter of params lies within the
 * documented bounds (PW_FIT_BOUND_*), else the index of the first one beyond. */
int pw_fit_runaway_param(const pw_model_type *m, const bool *fitted, const double *params,
                         double T_ref_K);

/* The measured data set again from a fit result: names, kind, fixed condition, has_y, source,
 * path, the dataset's uncertainty metadata (data_sigma_*; for an older fit file without them the
 * fit's weights, none stated) and every point (excluded ones too) in file order. ds owns its
 * points (pw_dataset_free). PW_ENOMEM, PW_EINVAL (NULL arguments). */
pw_status pw_fit_dataset(const pw_fit_result *r, pw_dataset *ds);

/* Frees r->pts; accepts NULL. */
void pw_fit_result_free(pw_fit_result *r);

/* Deep copy (the points array is duplicated). */
pw_status pw_fit_result_copy(pw_fit_result *dst, const pw_fit_result *src);

/* Fit files (JSON, self-contained): write atomically (temporary file + rename). PW_EEXIST when
 * path exists and force is false. Read validates structure, names and numbers; the reading
 * itself computes nothing, and the values derived from the parameters and components (per-point
 * model values, statistics, infinite dilution, stability screen; pw_fit_evaluate, the stored
 * chi2 kept) are computed once after it, from the components the result ends up with; without
 * replaced components the file's stability screen is kept where it cannot be stale (every
 * recomputed per-point value equal to the file's to the last bit, the data range the points',
 * the screen one the five-temperature screen can give; docs/fit-file.md). */
pw_status pw_fitfile_write(const char *path, const pw_fit_result *r, bool force, pw_error *err);
pw_status pw_fitfile_read(const char *path, pw_fit_result *r, pw_error *err);
pw_status pw_fitfile_parse(const char *buf, size_t len, const char *name, pw_fit_result *r,
                           pw_error *err);

/* pw_fitfile_read, then (components not NULL) the components that the component file at
 * components names are replaced as by pw_fit_replace_components before anything is derived.
 * changed may be NULL. On failure r holds nothing to free. */
pw_status pw_fitfile_load(const char *path, const char *components, pw_fit_result *r,
                          bool changed[2], pw_error *err);

/* Replaces each component of r that the component file at path names by that file's row (its
 * vapor-pressure correlation and constants; r keeps its spelling of the name) and recomputes
 * everything derived from the components: the fixed parameters taken from component data
 * (Wilson's V2_V1 from V_L, UNIQUAC's r and q; only those that equal what the old components
 * give, so a ratio set by hand stays, and kept when the new rows lack the data), also in the
 * recorded minima, and the per-point values, statistics, infinite-dilution values and the
 * stability screen (pw_fit_evaluate; the fitted chi2 is kept). The activity parameters are not
 * refitted. changed[i] (may be NULL) tells whether component i's vapor-pressure correlation
 * differs from the old one (callers may warn). path NULL: PW_OK, nothing changes. Errors of
 * pw_complib_read; PW_EINVAL without a fit. */
pw_status pw_fit_replace_components(pw_fit_result *r, const char *path, bool changed[2],
                                    pw_error *err);

/* Adds the fit file of r as the target path to an output set (pinchwise/fileio.h): nothing is
 * in place before pw_outset_commit. The same checks as pw_outset_add; PW_ENOMEM. */
struct pw_outset;
pw_status pw_fitfile_stage(struct pw_outset *set, const char *path, const pw_fit_result *r,
                           pw_error *err);

#ifdef __cplusplus
}
#endif
#endif
