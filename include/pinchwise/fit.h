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

#include <pinchwise/dataset.h>
#include <pinchwise/equilibrium.h>
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
    PW_STOP_FAILED      /* a model evaluation or linear solve failed */
} pw_stop_reason;

#define PW_FIT_MAX_EXCLUDE 256
#define PW_FIT_MAX_MINIMA 8

typedef struct pw_fit_options {
    bool fit_alpha;        /* NRTL: fit alpha too (default false) */
    double alpha;          /* NRTL fixed alpha (default 0.3, Renon & Prausnitz 1968) */
    double V2_V1;          /* Wilson volume ratio; NAN = from the components' V_L, else 1 */
    size_t n_starts;       /* candidate starts screened by one evaluation each (default 32);
                              LM runs from the best until 4 runs in a row add nothing */
    unsigned long seed;    /* for the start points (default 1) */
    double sigma_T_K, sigma_P_rel, sigma_y; /* NAN = from the dataset (its metadata or defaults) */
    double sigma_P_abs_Pa; /* absolute pressure uncertainty, used when sigma_P_rel is NAN (NAN = none) */
    size_t max_iter;       /* per start (default 200) */
    double xtol, gtol;     /* GSL tests; defaults sqrt(DBL_EPSILON)-based, see docs/fitting.md */
    long exclude_lines[PW_FIT_MAX_EXCLUDE]; /* file line numbers to leave out */
    size_t n_exclude;
    char exclude_reason[256];
} pw_fit_options;

/* Defaults as documented above. */
pw_fit_options pw_fit_default_options(void);

/* One measured point with the model's answer at its x (and fixed P or T). */
typedef struct pw_fit_point {
    pw_point meas;
    bool excluded;
    double T_calc_K, P_calc_Pa, y_calc;   /* NAN when the solve failed */
    double lngamma_exp[2];                /* from y, T, P and P^sat; NAN when not derivable */
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
    bool converged;
    pw_stop_reason stop;
    size_t iterations, n_fev, n_jev;
    size_t n_runs;             /* LM runs of the multistart */
    double chi2, chi2_red;     /* weighted sum of squares and per degree of freedom */
    size_t n_residuals, dof;
    double aic, aicc, bic;
    pw_fit_stat dev_y, dev_T_K, dev_P_Pa;
    double lngamma_inf[2];     /* at T_ref: ln gamma1 at x1 -> 0, ln gamma2 at x1 -> 1 */
    pw_fit_minimum minima[PW_FIT_MAX_MINIMA];
    size_t n_minima;
    bool split;                /* parameters predict a liquid-liquid split in 0 < x1 < 1 */
    double split_min_D, split_x, split_T_K;
    double T_min_K, T_max_K;   /* range of the data (validity range of the fit) */
    double sigma_T_K, sigma_P_rel, sigma_y;
    pw_fit_point *pts;         /* all measured points, excluded ones flagged */
    size_t n_pts;
    char exclude_reason[256];
    char dataset_path[PW_PATH_MAX];
    char dataset_sha256[65];
    char source[PW_SOURCE_MAX];
    char version[32];
    char created[40];          /* ISO 8601 UTC */
} pw_fit_result;

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

/* How many of r->minima (sorted by chi2) fit as well as the best: chi2 within a factor
 * max(1.01, exp(2/n)) of it, i.e. delta-AICc < 2 for one model (docs/fitting.md). */
size_t pw_fit_competing_minima(const pw_fit_result *r);

/* Frees r->pts; accepts NULL. */
void pw_fit_result_free(pw_fit_result *r);

/* Deep copy (the points array is duplicated). */
pw_status pw_fit_result_copy(pw_fit_result *dst, const pw_fit_result *src);

/* Fit files (JSON, self-contained): write atomically (temporary file + rename). PW_EEXIST when
 * path exists and force is false. Read validates structure, names and numbers. */
pw_status pw_fitfile_write(const char *path, const pw_fit_result *r, bool force, pw_error *err);
pw_status pw_fitfile_read(const char *path, pw_fit_result *r, pw_error *err);
pw_status pw_fitfile_parse(const char *buf, size_t len, const char *name, pw_fit_result *r,
                           pw_error *err);

#ifdef __cplusplus
}
#endif
#endif
