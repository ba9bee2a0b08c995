/* Private interface of the fitting module. */
#ifndef PW_FIT_INTERNAL_H
#define PW_FIT_INTERNAL_H

#include <pinchwise/fit.h>

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
} fit_problem;

/* A pure-component row (x1 = 0 or 1): no information on the activity parameters. */
static inline bool fit_is_pure(const pw_point *p) { return p->x1 <= 0.0 || p->x1 >= 1.0; }

/* Liquid-stability screen (METHODS 1.6): the smallest d2(Gmix/RT)/dx1^2 over 0 < x1 < 1 at five
 * temperatures spanning [T_lo, T_hi], where it lies, and at which temperature. *min_D is
 * INFINITY (x, T NAN) when no temperature could be screened. */
void fit_stability_screen(const pw_system *s, double T_lo, double T_hi, double *min_D,
                          double *x_at_min, double *T_at_min);

/* Residual count of one point for the objective. */
size_t fit_residuals_per_point(pw_objective obj);

/* Full parameter vector from the internal unknowns u (n_fit values). */
void fit_unpack(const fit_problem *fp, const double *u, double *params);

/* Weighted residuals f (n_res) and, when J is not NULL, their Jacobian in the internal
 * unknowns, row-major n_res x n_fit. Returns the first failing status of a point. */
pw_status fit_eval(const fit_problem *fp, const double *params, double *f, double *J);

/* Sum of squares of the weighted residuals at params; INFINITY when a point fails. */
double fit_chi2(const fit_problem *fp, const double *params, double *work);

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

/* The model's ideal-solution point (G^E = 0 at T_ref) with s's fixed parameters: zero
 * interaction constants and energies, Wilson a12 = T_ref ln(V2_V1) = -a21. false when the model
 * has none the fit could start from (fit_class.c). */
bool fit_ideal_point(const pw_system *s, double *params);

#endif
