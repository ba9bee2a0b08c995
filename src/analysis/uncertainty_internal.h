/* Private interface of the uncertainty module: the parameter sampler behind pw_unc_propagate,
 * pw_unc_draw_params and pw_unc_curve_band (uncertainty_sample.c). Not installed: a library
 * user draws parameter sets through those public calls, never with a random generator of its
 * own. */
#ifndef PW_ANALYSIS_UNCERTAINTY_INTERNAL_H
#define PW_ANALYSIS_UNCERTAINTY_INTERNAL_H

#include <gsl/gsl_rng.h>
#include <pinchwise/uncertainty.h>

/* theta = center + sqrt(w) * L z, z ~ N(0, I) (w = dof / chi^2_dof for the t form, else 1). */
typedef struct pw_unc_sampler {
    const pw_model_type *model;
    double center[PW_MAX_PARAMS];
    size_t p, idx[PW_MAX_PARAMS];           /* fitted parameters with non-zero variance */
    double L[PW_MAX_PARAMS][PW_MAX_PARAMS]; /* p x p factor, L L^T = C (reduced) */
    size_t rank;
    bool eigen;
    double dof;
} pw_unc_sampler;

/* Factors C. Cholesky (dpotrf) of the correlation form D^-1 C D^-1 first; on failure the
 * eigen-decomposition (dsyev), with eigenvalues below -1e-8 (relative to the largest) refused
 * (PW_EINVAL: not a covariance) and small negative ones set to zero. cov as for
 * pw_unc_delta_sd (full space, row-major). */
pw_status pw_unc_sampler_init(pw_unc_sampler *s, const pw_system *sys,
                              const bool fitted[PW_MAX_PARAMS], const double *cov, double dof);

/* One draw into params (full vector). Draws outside the model's domain (model->check) are
 * redrawn, at most max_tries times; *redrawn (may be NULL) is incremented per rejection.
 * PW_EDOM when every try was rejected. rng is the caller's. */
pw_status pw_unc_sampler_draw(const pw_unc_sampler *s, gsl_rng *rng, size_t max_tries,
                              double params[PW_MAX_PARAMS], size_t *redrawn);

#endif
