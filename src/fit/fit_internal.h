/* Private interface of the fitting module. */
#ifndef PW_FIT_INTERNAL_H
#define PW_FIT_INTERNAL_H

#include <pinchwise/fit.h>

#include "thermo/thermo_internal.h"

/* The last bubble point of one used point (the lean kernel, objective.c): at the same
 * parameters, the root the Jacobian is taken at. */
typedef struct fit_root {
    pw_bubble_lean b;
    bool ok;
} fit_root;

/* The regression problem: which points and parameters, the weights, the fixed values. */
typedef struct fit_problem {
    pw_system sys;              /* parameters here are the current full vector */
    pw_objective objective;
    const pw_point *pts;        /* the used points only */
    size_t n_pts;
    size_t idx[PW_MAX_PARAMS];  /* full-vector index of each fitted parameter */
    double scale[PW_MAX_PARAMS];/* fitted value = scale * internal unknown */
    size_t n_fit;
    size_t n_res;               /* residuals: 1 or 2 per point */
    double sigma_T_K, sigma_P_rel, sigma_P_abs_Pa, sigma_y;
    double P_fixed_Pa, T_fixed_K;
    /* Partly miscible liquids (objective_het.c): which used points are three-phase points
     * (NULL: none) with a temperature guess for their three-phase state, and the tie lines. */
    const bool *three_phase;
    double T3_guess_K;          /* NAN: no measured three-phase point (tie lines only) */
    /* Points inside the model's layers keep their one-liquid scoring (a fit file written before
     * they were scored by the three-phase state, pw_fit_result.layers_scored false). */
    bool one_liquid_inside;
    /* The last three-phase temperature found within the current LM run, the next evaluation's
     * start (NULL or NAN: T3_guess_K). Reset before every run and before the final evaluation,
     * so that each run and the reported state start from T3_guess_K. */
    double *T3_warm_K;
    const pw_tie_line *ties;
    size_t n_ties;
    double sigma_x_lle;
    /* The vapor-pressure constants of the lean bubble-point kernel (fit_build_problem). */
    pw_thermo_kernel kern;
    /* One entry per used point (NULL: none kept): the roots of the latest evaluation, written by
     * every fit_eval (Newton itself always starts from the measured temperature: a start from
     * the previous root was tried and saved nothing). Reset (fit_roots_reset) before every LM
     * run, every screened start and the final evaluation. */
    fit_root *roots;
} fit_problem;

/* Forgets the kept roots (the next evaluation starts from the measured values). */
void fit_roots_reset(const fit_problem *fp);

/* The Jacobian (row-major n_res x n_fit, internal unknowns) at params from the roots the latest
 * fit_eval at the same params kept: one full model evaluation per point for d ln gamma/dp, no
 * bubble-point solve. Only for problems without three-phase points and tie lines, with roots. */
pw_status fit_jacobian_at_roots(const fit_problem *fp, const double *params, double *J);

/* A pure-component row (x1 = 0 or 1): no information on the activity parameters. */
static inline bool fit_is_pure(const pw_point *p) { return p->x1 <= 0.0 || p->x1 >= 1.0; }

/* Liquid-stability screen (METHODS 1.6): the smallest d2(Gmix/RT)/dx1^2 over 0 < x1 < 1 at five
 * temperatures spanning [T_lo, T_hi], where it lies, and at which temperature. *min_D is
 * INFINITY (x, T NAN) when no temperature could be screened. */
void fit_stability_screen(const pw_system *s, double T_lo, double T_hi, double *min_D,
                          double *x_at_min, double *T_at_min);

/* The temperature range of the stability screen: the data's, else the reference temperature. */
void fit_screen_range(const pw_fit_result *r, double *lo, double *hi);

/* pw_fit_evaluate for a fit just read from a file, whose points hold the file's T_calc_K,
 * P_calc_Pa, y_calc and whose split fields hold the file's liquid-stability screen: everything is
 * recomputed, except that the file's screen is kept (*reused true) when it cannot be stale: the
 * recomputed per-point values equal the file's to the last bit on every point (at least one of
 * them a finite mixture value), which they do only for the parameters, components and reference
 * temperature the file was written from, the file's data range is the fit's (lowest and highest
 * temperature of the points not excluded), and the screen is one the five-temperature screen over
 * that range can give (a screened temperature, predicted = min_D < 0). Otherwise
 * the screen is recomputed as well. Returns what pw_fit_evaluate returns. */
pw_status fit_evaluate_reusing_screen(pw_fit_result *r, bool *reused);

/* Replaces the components of r that lib names (keeping r's spelling of the names) and the fixed
 * parameters taken from their data (fit_components.c); recomputes nothing: fit_derive does.
 * changed[i] (may be NULL): component i's vapor-pressure correlation differs. */
pw_status fit_swap_components(pw_fit_result *r, const pw_complib *lib, bool changed[2]);

/* Everything derived from the parameters and components of r (pw_fit_evaluate), keeping the
 * fit's own chi2; per-point solve failures are NAN, not errors. name labels an error. */
pw_status fit_derive(pw_fit_result *r, const char *name, pw_error *err);

/* fit_derive through fit_evaluate_reusing_screen (a fit as read from its file, components not
 * replaced). */
pw_status fit_derive_read(pw_fit_result *r, const char *name, pw_error *err);

/* Residual count of one point for the objective. */
size_t fit_residuals_per_point(pw_objective obj);

/* Full parameter vector from the internal unknowns u (n_fit values). */
void fit_unpack(const fit_problem *fp, const double *u, double *params);

/* Weighted residuals f (n_res) and, when J is not NULL, their Jacobian in the internal
 * unknowns, row-major n_res x n_fit. Returns the first failing status of a point. */
pw_status fit_eval(const fit_problem *fp, const double *params, double *f, double *J);

/* The three-phase state of the system at the problem's fixed P (or T) with its parameter
 * derivatives, computed once per evaluation. */
typedef struct fit_het_state {
    bool exists;
    double T_K, P_Pa, y1;
    double x_lo, x_hi;         /* the two layers (x1), x_lo < x_hi */
    double dM[PW_MAX_PARAMS];  /* d(T3)/du_j (isobaric) or d(P3)/du_j (isothermal) */
    double dy[PW_MAX_PARAMS];  /* d(y3)/du_j */
} fit_het_state;

/* Fills h at params (with derivatives when want_J). A state that does not exist (no split) is
 * PW_OK with h->exists false: the caller then uses the one-liquid bubble point. */
pw_status fit_het_state_eval(const fit_problem *fp, const pw_system *s, bool want_J,
                             fit_het_state *h);

/* How a fit result's objective treats partly miscible data (objective.c): state, whether the
 * three-phase state enters it (measured three-phase points among the used points, or points
 * inside the layers to score); inside, whether one-liquid points inside the model's layers are
 * scored by it (r->layers_scored, a model that can split, and three-phase points or tie lines:
 * data that say the liquids split); T3_guess_K, the mean measured T of the used three-phase
 * points (NAN when none). The one rule of fit_build_problem, pw_fit_evaluate and the planning. */
typedef struct fit_het_plan {
    bool state, inside;
    double T3_guess_K;
} fit_het_plan;
fit_het_plan fit_het_plan_of(const pw_fit_result *r);

/* Whether a one-liquid point at x1 lies strictly inside the layers of h: the model's stable
 * prediction there is the three-phase state, not the one-liquid bubble point. */
bool fit_het_inside(const fit_het_state *h, double x1);

/* Residuals of one three-phase point from h: (T3 - T)/sigma_T or (P3 - P)/sigma_P, and
 * (y3 - y)/sigma_y when the objective has y; rows of J when J is not NULL. */
void fit_het_point(const fit_problem *fp, const fit_het_state *h, const pw_point *pt, double *f,
                   double *J);

/* Residuals of the tie lines (two per line, both layers) and their rows of J. A trial set that
 * does not split at a tie line's T gets both layers at the composition of the smallest
 * d2(Gmix/RT)/dx^2 (continuous at the critical point) and zero derivative rows. */
pw_status fit_ties_eval(const fit_problem *fp, const pw_system *s, double *f, double *J);

/* After init: refuses tie lines for a model that cannot split, sets sigma_x_lle, and marks the
 * three-phase points of the data (pw_three_phase_detect; with a model that cannot split they are
 * left out instead, and exclude_reason says so). */
pw_status fit_het_setup(const pw_dataset *ds, const pw_fit_options *o, pw_fit_result *r,
                        pw_error *err);
/* After the fit: r->aad_x_lle from the tie lines. */
void fit_het_finish(const fit_problem *fp, pw_fit_result *r);

/* The regression problem of the fit result r (which holds all points): fitted parameters, weights
 * and the used points with their three-phase flags in *used (one block the caller frees); no tie
 * lines. PW_ENOMEM. */
pw_status fit_build_problem(const pw_fit_result *r, fit_problem *fp, pw_point **used);

/* Sum of squares of the weighted residuals at params; INFINITY when a point fails. */
double fit_chi2(const fit_problem *fp, const double *params, double *work);

/* A sum of squares of the weighted residuals in steps: adds the squared residuals of the used
 * points *next, *next + 1, ... up to end (exclusive) to *sum, in fit_chi2's order (a sum
 * carried to n_pts from *next = 0, *sum = 0 is fit_chi2's number to the bit), and stops after
 * the point that takes *sum above cap; *next is where to continue. False when the parameters
 * or a point cannot be evaluated, or the sum is not finite (fit_chi2's INFINITY). work holds
 * one point's residuals. Only for problems without three-phase points and tie lines. */
bool fit_chi2_continue(const fit_problem *fp, const double *params, size_t end, double cap,
                       size_t *next, double *sum, double *work);

/* What the Jacobian at the optimum says about the parameters (covariance.c). */
typedef struct fit_info {
    double cov[PW_MAX_PARAMS][PW_MAX_PARAMS]; /* s2 (J^T J)^+ over the identified directions,
                                                 full parameter space, physical units */
    size_t rank;                /* identified directions (== n_fit when all are) */
    double sv_ratio;            /* smallest / largest singular value */
    double weak_dir[PW_MAX_PARAMS]; /* weakest direction when rank < n_fit (largest entry 1) */
    bool meaningful[PW_MAX_PARAMS]; /* standard error not driven by an unidentified direction */
} fit_info;

/* Covariance and identifiability from the weighted Jacobian J (row-major n x p, in internal
 * unknowns) through an SVD (LAPACK dgesdd); s2 the variance factor, t95 the 97.5 % t quantile.
 * PW_ESINGULAR when J is zero or the SVD fails; PW_ENOMEM. */
pw_status fit_identify(const fit_problem *fp, const double *J, size_t n, double s2, double t95,
                      fit_info *info);

/* Stores info in r at its parameters r->sys.params: covariance, singular-value ratio,
 * identifiability, weak direction, the meaningful standard errors with their 95 % intervals
 * (t95 the t quantile) and the correlation matrix of the fitted parameters. */
void fit_store_identify(pw_fit_result *r, const fit_problem *fp, const fit_info *info, double t95);

/* The model's ideal-solution point (G^E = 0 at T_ref) with s's fixed parameters: zero
 * interaction constants and energies, Wilson a12 = T_ref ln(V2_V1) = -a21. false when the model
 * has none the fit could start from (fit_class.c). */
bool fit_ideal_point(const pw_system *s, double *params);

#endif
