/* Parameter covariance and identifiability from the Jacobian at the optimum (Bates & Watts 1988,
 * ch. 2):  Cov(theta) = s^2 (J^T J)^-1,  s^2 = S_min / (n - p),
 * computed through the singular value decomposition J = U diag(sv) V^T (LAPACK dgesdd), so that
 * (J^T J)^-1 = V diag(1/sv^2) V^T without forming the normal equations.
 *
 * Identifiability: a right singular vector v_e is a combination of the parameters that the data
 * do not fix when (a) its singular value is below PW_FIT_IDENT_SV_RATIO times the largest (its
 * variance s^2/sv^2 would be a million million times that of the best-fixed combination or
 * more: numerically singular), or (b) the 95 % half-width it gives some parameter,
 * t s |v_ej| / sv_e, exceeds PW_FIT_UNFIXED_HALFWIDTH in ln-gamma units (A_ij itself, an energy
 * divided by T_ref): the data then cannot tell gamma_inf = 1 from gamma_inf = 20 000. The
 * covariance is then the truncated pseudo-inverse over the identified directions, and a
 * parameter's standard error is meaningful only when the unidentified directions hardly move it:
 * |v_j| <= 0.01 in internal units for each of them (docs/fitting.md). */
#include "fit_internal.h"

#include <float.h>
#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define MEANINGFUL_MAX_COMPONENT 0.01

pw_status fit_identify(const fit_problem *fp, const double *J, size_t n, double s2, double t95,
                      fit_info *info)
{
    size_t p = fp->n_fit;
    memset(info, 0, sizeof *info);
    info->sv_ratio = 1.0;
    for (size_t j = 0; j < PW_MAX_PARAMS; j++)
        info->meaningful[j] = true;
    if (p == 0)
        return PW_OK;
    if (n < p)
        return PW_ESINGULAR;
    double *a = malloc(sizeof(double) * n * p * 2);
    if (!a)
        return PW_ENOMEM;
    double *u = a + n * p;
    memcpy(a, J, sizeof(double) * n * p);
    double sv[PW_MAX_PARAMS], vt[PW_MAX_PARAMS * PW_MAX_PARAMS];
    lapack_int lst = LAPACKE_dgesdd(LAPACK_ROW_MAJOR, 'S', (lapack_int)n, (lapack_int)p, a,
                                    (lapack_int)p, sv, u, (lapack_int)p, vt, (lapack_int)p);
    free(a);
    if (lst != 0 || !(sv[0] > 0.0) || !isfinite(sv[0]))
        return PW_ESINGULAR;
    info->sv_ratio = sv[p - 1] / sv[0];
    bool fixed[PW_MAX_PARAMS];
    size_t rank = 0, weakest = p;
    for (size_t e = 0; e < p; e++) {
        fixed[e] = sv[e] > PW_FIT_IDENT_SV_RATIO * sv[0];
        for (size_t j = 0; j < p && fixed[e]; j++) {
            size_t k = fp->idx[j];
            double unit = strcmp(fp->sys.model->param_units[k], "K") == 0 ? fp->sys.T_ref_K : 1.0;
            double half = t95 * sqrt(s2) * fabs(vt[e * p + j]) * fp->scale[j] / (sv[e] * unit);
            if (!(half <= PW_FIT_UNFIXED_HALFWIDTH))
                fixed[e] = false;
        }
        rank += fixed[e];
        if (!fixed[e])
            weakest = e;
    }
    info->rank = rank;
    if (rank < p) {
        /* the weakest direction, in parameter units (theta_j = scale_j u_j), largest entry +1 */
        const double *v = &vt[weakest * p];
        double big = 0.0;
        for (size_t j = 0; j < p; j++)
            if (fabs(v[j] * fp->scale[j]) > fabs(big))
                big = v[j] * fp->scale[j];
        for (size_t j = 0; j < p; j++)
            info->weak_dir[fp->idx[j]] = v[j] * fp->scale[j] / big;
        for (size_t e = 0; e < p; e++)
            for (size_t j = 0; j < p && !fixed[e]; j++)
                if (fabs(vt[e * p + j]) > MEANINGFUL_MAX_COMPONENT)
                    info->meaningful[fp->idx[j]] = false;
    }
    /* truncated pseudo-inverse: (J^T J)^+ = sum over identified e of v_e v_e^T / sv_e^2 */
    for (size_t i = 0; i < p; i++)
        for (size_t k = 0; k < p; k++) {
            double c = 0.0;
            for (size_t e = 0; e < p; e++)
                if (fixed[e])
                    c += vt[e * p + i] * vt[e * p + k] / (sv[e] * sv[e]);
            info->cov[fp->idx[i]][fp->idx[k]] = s2 * c * fp->scale[i] * fp->scale[k];
        }
    return PW_OK;
}

void fit_store_identify(pw_fit_result *r, const fit_problem *fp, const fit_info *info, double t95)
{
    memcpy(r->cov, info->cov, sizeof r->cov);
    r->sv_ratio = info->sv_ratio;
    r->identifiable = info->rank == fp->n_fit;
    memcpy(r->weak_dir, info->weak_dir, sizeof r->weak_dir);
    for (size_t j = 0; j < fp->n_fit; j++) {
        size_t k = fp->idx[j];
        if (!info->meaningful[k])
            continue;
        r->stderr_meaningful[k] = true;
        r->stderr_[k] = sqrt(r->cov[k][k]);
        r->ci95[k][0] = r->sys.params[k] - t95 * r->stderr_[k];
        r->ci95[k][1] = r->sys.params[k] + t95 * r->stderr_[k];
    }
    for (size_t a = 0; a < fp->n_fit; a++)
        for (size_t b = 0; b < fp->n_fit; b++) {
            size_t ka = fp->idx[a], kb = fp->idx[b];
            double d = sqrt(r->cov[ka][ka] * r->cov[kb][kb]);
            r->corr[ka][kb] = d > 0.0 ? r->cov[ka][kb] / d : (ka == kb ? 1.0 : 0.0);
        }
}
