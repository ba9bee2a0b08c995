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
    /* the regression problem of the fit (scale 1: the covariance does not depend on it) */
    fit_problem fp;
    memset(&fp, 0, sizeof fp);
    fp.sys = r->sys;
    memcpy(fp.sys.params, p, sizeof fp.sys.params);
    fp.objective = r->objective;
    fp.sigma_T_K = r->sigma_T_K;
    fp.sigma_P_rel = r->sigma_P_rel;
    fp.sigma_P_abs_Pa = NAN;
    fp.sigma_y = r->sigma_y;
    fp.P_fixed_Pa = r->P_fixed_Pa;
    fp.T_fixed_K = r->T_fixed_K;
    for (size_t k = 0; k < r->sys.model->n_params; k++)
        if (r->fitted[k]) {
            fp.idx[fp.n_fit] = k;
            fp.scale[fp.n_fit] = 1.0;
            fp.n_fit++;
        }
    pw_point *used = malloc(sizeof *used * (r->n_pts ? r->n_pts : 1));
    if (!used)
        return pw_error_set(err, PW_ENOMEM, NULL, 0, "out of memory");
    for (size_t i = 0; i < r->n_pts; i++)
        if (!r->pts[i].excluded && !fit_is_pure(&r->pts[i].meas))
            used[fp.n_pts++] = r->pts[i].meas;
    fp.pts = used;
    fp.n_res = fp.n_pts * fit_residuals_per_point(fp.objective);
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
        for (size_t j = 0; j < PW_MAX_PARAMS; j++)
            r->cov[k][j] = r->corr[k][j] = 0.0;
    }
    if (r->dof > 0 && fit_covariance(&fp, J, fp.n_res, chi2 / (double)r->dof, r->cov) == PW_OK) {
        double t = gsl_cdf_tdist_Pinv(0.975, (double)r->dof);
        for (size_t j = 0; j < fp.n_fit; j++) {
            size_t k = fp.idx[j];
            r->stderr_[k] = sqrt(r->cov[k][k]);
            r->ci95[k][0] = p[k] - t * r->stderr_[k];
            r->ci95[k][1] = p[k] + t * r->stderr_[k];
        }
        for (size_t a = 0; a < fp.n_fit; a++)
            for (size_t b = 0; b < fp.n_fit; b++) {
                size_t ka = fp.idx[a], kb = fp.idx[b];
                double d = r->stderr_[ka] * r->stderr_[kb];
                r->corr[ka][kb] = d > 0.0 ? r->cov[ka][kb] / d : (ka == kb ? 1.0 : 0.0);
            }
    }
    free(f);
    free(used);
    st = pw_fit_evaluate(r);
    if (st != PW_OK)
        return pw_error_set(err, st, r->dataset_path, 0, "minimum %zu: %s", n, pw_strerror(st));
    return PW_OK;
}
