/* Parameter covariance from the Jacobian at the optimum (Bates & Watts 1988, ch. 2):
 *   Cov(theta) = s^2 (J^T J)^-1,   s^2 = S_min / (n - p),
 * computed through the singular value decomposition J = U diag(sv) V^T (LAPACK dgesdd), so that
 * (J^T J)^-1 = V diag(1/sv^2) V^T without forming the normal equations. A singular value below
 * n * DBL_EPSILON * sv_max makes the parameters non-identifiable: PW_ESINGULAR. */
#include "fit_internal.h"

#include <float.h>
#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

pw_status fit_covariance(const fit_problem *fp, const double *J, size_t n, double s2,
                         double cov[PW_MAX_PARAMS][PW_MAX_PARAMS])
{
    size_t p = fp->n_fit;
    memset(cov, 0, sizeof(double) * PW_MAX_PARAMS * PW_MAX_PARAMS);
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
    lapack_int info = LAPACKE_dgesdd(LAPACK_ROW_MAJOR, 'S', (lapack_int)n, (lapack_int)p, a,
                                     (lapack_int)p, sv, u, (lapack_int)p, vt, (lapack_int)p);
    free(a);
    if (info != 0)
        return PW_ESINGULAR;
    double tol = (double)n * DBL_EPSILON * sv[0];
    if (!(sv[p - 1] > tol))
        return PW_ESINGULAR;
    /* (J^T J)^-1 = V diag(1/sv^2) V^T; row e of vt is the e-th right singular vector. */
    for (size_t i = 0; i < p; i++)
        for (size_t k = 0; k < p; k++) {
            double c = 0.0;
            for (size_t e = 0; e < p; e++)
                c += vt[e * p + i] * vt[e * p + k] / (sv[e] * sv[e]);
            cov[fp->idx[i]][fp->idx[k]] = s2 * c * fp->scale[i] * fp->scale[k];
        }
    return PW_OK;
}
