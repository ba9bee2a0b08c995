/* Information of measurements at the fitted parameters (for measurement planning): the weighted
 * Jacobian of the fit's own objective (objective.c) at given points, with unit scaling so that it
 * is expressed in the parameters' units. Where the fit scores one-liquid points inside the
 * model's layers by the three-phase state (data with three-phase points or tie lines), a planned
 * point there is valued and weighted the same way. */
#include "fit/fit_design.h"

#include "fit/fit_internal.h"

#include <math.h>
#include <pinchwise/lle.h>
#include <stdlib.h>
#include <string.h>

pw_status fit_hypothetical_point(const pw_fit_result *r, double x1, pw_point *pt)
{
    if (!r || !r->sys.model || !pt || !(x1 > 0.0 && x1 < 1.0))
        return PW_EINVAL;
    pw_eq_point eq;
    bool isobaric = r->kind == PW_DATA_ISOBARIC, three = false;
    pw_status st;
    if (fit_het_plan_of(r).inside) /* the stable prediction, as the fit scores a point there */
        st = isobaric ? pw_bubble_T_het(&r->sys, r->P_fixed_Pa, x1, &eq, &three)
                      : pw_bubble_P_het(&r->sys, r->T_fixed_K, x1, &eq, &three);
    else
        st = isobaric ? pw_bubble_T(&r->sys, r->P_fixed_Pa, x1, &eq)
                      : pw_bubble_P(&r->sys, r->T_fixed_K, x1, &eq);
    if (st != PW_OK)
        return st;
    pt->x1 = x1;
    pt->y1 = r->has_y ? eq.y1 : (double)NAN;
    pt->T_K = isobaric ? eq.T_K : r->T_fixed_K;
    pt->P_Pa = isobaric ? r->P_fixed_Pa : eq.P_Pa;
    pt->line = 0;
    return PW_OK;
}

pw_status fit_information(const pw_fit_result *r, const pw_point *pts, size_t n,
                          double info[PW_MAX_PARAMS][PW_MAX_PARAMS])
{
    if (!r || !r->sys.model || !info || (n > 0 && !pts))
        return PW_EINVAL;
    memset(info, 0, sizeof(double) * PW_MAX_PARAMS * PW_MAX_PARAMS);
    fit_problem fp;
    memset(&fp, 0, sizeof fp);
    fp.sys = r->sys;
    fp.objective = r->objective;
    fp.pts = pts;
    fp.n_pts = n;
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
    fp.n_res = n * fit_residuals_per_point(fp.objective);
    if (fp.n_fit == 0 || n == 0)
        return PW_OK;
    /* one block: residuals, Jacobian, and the (all false) three-phase flags of the planned
     * points when the objective scores points inside the layers */
    fit_het_plan plan = fit_het_plan_of(r);
    double *f = malloc(sizeof(double) * fp.n_res * (1 + fp.n_fit) +
                       (plan.inside ? sizeof(bool) * n : 0));
    if (!f)
        return PW_ENOMEM;
    double *J = f + fp.n_res;
    if (plan.inside) {
        bool *flags = (bool *)(J + fp.n_res * fp.n_fit);
        memset(flags, 0, sizeof(bool) * n);
        fp.three_phase = flags; /* fit_eval computes the three-phase state */
        fp.T3_guess_K = plan.T3_guess_K;
    }
    pw_status st = fit_eval(&fp, r->sys.params, f, J);
    if (st == PW_OK)
        for (size_t a = 0; a < fp.n_fit; a++)
            for (size_t b = 0; b < fp.n_fit; b++) {
                double s = 0.0;
                for (size_t i = 0; i < fp.n_res; i++)
                    s += J[i * fp.n_fit + a] * J[i * fp.n_fit + b];
                info[fp.idx[a]][fp.idx[b]] = s;
            }
    free(f);
    return st;
}
