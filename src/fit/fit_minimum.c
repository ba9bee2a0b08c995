/* Another of a fit's minima as its parameters, with the covariance recomputed there; see
 * include/pinchwise/fit_minimum.h. */
#include "fit_internal.h"

#include <gsl/gsl_cdf.h>
#include <math.h>
#include <pinchwise/fit_minimum.h>
#include <stdlib.h>
#include <string.h>

pw_status pw_fit_use_minimum(pw_fit_result *r, size_t n, pw_error *err)
{
    if (!r || !r->sys.model)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "no fit");
    if (n == 0 || n > r->n_minima)
        return pw_error_set(err, PW_EINVAL, r->dataset_path, 0,
                            "minimum %zu: the fit records %zu distinct minim%s (1 to %zu, lowest "
                            "chi-square first)",
                            n, r->n_minima, r->n_minima == 1 ? "um" : "a", r->n_minima);
    const double *p = r->minima[n - 1].params;
    pw_status st = r->sys.model->check(p);
    if (st != PW_OK)
        return pw_error_set(err, st, r->dataset_path, 0,
                            "minimum %zu: parameters outside the model's "
                            "domain",
                            n);
    if (r->n_tie_lines)
        return pw_error_set(err, PW_EINVAL, r->dataset_path, 0,
                            "minimum %zu: a fit with tie lines (fit --lle) keeps the minimum it "
                            "chose",
                            n);
    /* the regression problem of the fit, as the fit itself built it */
    fit_problem fp;
    pw_point *used = NULL;
    st = fit_build_problem(r, &fp, &used);
    if (st != PW_OK)
        return pw_error_set(err, st, NULL, 0, "out of memory");
    memcpy(fp.sys.params, p, sizeof fp.sys.params);
    double *f = malloc(sizeof(double) * (fp.n_res ? fp.n_res : 1) * (1 + fp.n_fit));
    if (!f) {
        free(used);
        return pw_error_set(err, PW_ENOMEM, NULL, 0, "out of memory");
    }
    double *J = f + fp.n_res;
    st = fit_eval(&fp, fp.sys.params, f, J);
    if (st != PW_OK) {
        free(f);
        free(used);
        return pw_error_set(err, st, r->dataset_path, 0,
                            "minimum %zu: the model cannot be evaluated at every point (%s)", n,
                            pw_strerror(st));
    }
    double chi2 = 0.0;
    for (size_t i = 0; i < fp.n_res; i++)
        chi2 += f[i] * f[i];
    memcpy(r->sys.params, p, sizeof r->sys.params);
    r->chi2 = chi2;
    r->minima[n - 1].chi2 = chi2;
    for (size_t k = 0; k < PW_MAX_PARAMS; k++) {
        r->stderr_[k] = NAN;
        r->ci95[k][0] = r->ci95[k][1] = NAN;
        r->stderr_meaningful[k] = false;
        for (size_t j = 0; j < PW_MAX_PARAMS; j++)
            r->cov[k][j] = r->corr[k][j] = 0.0;
    }
    /* the same covariance as the fit's (covariance.c), at this minimum */
    fit_info info;
    double t = r->dof > 0 ? gsl_cdf_tdist_Pinv(0.975, (double)r->dof) : (double)NAN;
    bool exact = r->fit_class == PW_FIT_EXACT;
    if (r->dof > 0 &&
        fit_identify(&fp, J, fp.n_res, exact ? 1.0 : chi2 / (double)r->dof, t, &info) == PW_OK) {
        fit_store_identify(r, &fp, &info, t);
    }
    free(f);
    free(used);
    st = pw_fit_evaluate(r);
    if (st != PW_OK)
        return pw_error_set(err, st, r->dataset_path, 0, "minimum %zu: %s", n, pw_strerror(st));
    return PW_OK;
}

size_t pw_fit_default_minimum(const pw_fit_result *r, size_t *n_split_skipped)
{
    if (n_split_skipped)
        *n_split_skipped = 0;
    if (!r || r->n_minima == 0 || !r->sys.model)
        return 0;
    size_t competing = pw_fit_competing_minima(r);
    if (r->n_three_phase || r->n_tie_lines) /* partly miscible data: the split is measured */
        competing = 0;
    for (size_t i = 0; competing > 1 && i < competing; i++) {
        pw_system s = r->sys;
        memcpy(s.params, r->minima[i].params, sizeof s.params);
        double D, x, T;
        fit_stability_screen(&s, r->T_min_K, r->T_max_K, &D, &x, &T);
        if (!(D < 0.0)) {
            if (n_split_skipped)
                *n_split_skipped = i;
            return i + 1;
        }
    }
    return 1;
}
