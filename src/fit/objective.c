/* Residuals and analytic Jacobian of the bubble-point objectives (docs/fitting.md).
 *
 * Isobaric point (x, P): T_calc solves F(T) = ln(sum_i x_i gamma_i P_i^sat(T)) - ln P = 0.
 * By the implicit-function theorem, with y_i = x_i gamma_i P_i^sat / P at the solution,
 *   dT/dp_j  = -(sum_i y_i dln gamma_i/dp_j) / (sum_i y_i (dln gamma_i/dT + dln P_i^sat/dT))
 *   dy1/dp_j = y1 (dln gamma1/dp_j + (dln gamma1/dT + dln P1^sat/dT) dT/dp_j).
 * Isothermal point (x, T): P_calc = sum_i x_i gamma_i P_i^sat explicitly,
 *   dP/dp_j = P sum_i y_i dln gamma_i/dp_j,  dy1/dp_j = y1 (dln gamma1/dp_j - dln P/dp_j). */
#include "fit_internal.h"

#include <math.h>

size_t fit_residuals_per_point(pw_objective obj)
{
    return (obj == PW_OBJ_TXY || obj == PW_OBJ_PXY) ? 2 : 1;
}

void fit_unpack(const fit_problem *fp, const double *u, double *params)
{
    for (size_t k = 0; k < PW_MAX_PARAMS; k++)
        params[k] = fp->sys.params[k];
    for (size_t j = 0; j < fp->n_fit; j++)
        params[fp->idx[j]] = u[j] * fp->scale[j];
}

static double sigma_P(const fit_problem *fp, double P_Pa)
{
    return isfinite(fp->sigma_P_abs_Pa) ? fp->sigma_P_abs_Pa : fp->sigma_P_rel * P_Pa;
}

/* One isobaric point: residuals (T, [y]) and their rows of J. */
static pw_status eval_isobaric(const fit_problem *fp, const pw_system *s, const pw_point *pt,
                               double *f, double *J)
{
    pw_eq_point eq;
    pw_status st = pw_bubble_T_from(s, pt->P_Pa, pt->x1, pt->T_K, &eq);
    if (st != PW_OK)
        return st;
    bool with_y = fp->objective == PW_OBJ_TXY;
    f[0] = (eq.T_K - pt->T_K) / fp->sigma_T_K;
    if (with_y)
        f[1] = (eq.y1 - pt->y1) / fp->sigma_y;
    if (!J)
        return PW_OK;
    pw_activity a;
    double dlnP[2];
    st = pw_system_activity(s, pt->x1, eq.T_K, &a);
    for (int i = 0; i < 2 && st == PW_OK; i++)
        st = pw_psat(&s->comp[i], eq.T_K, NULL, &dlnP[i]);
    if (st != PW_OK)
        return st;
    double y[2] = {eq.y1, 1.0 - eq.y1};
    double dFdT = y[0] * (a.dlngamma_dT[0] + dlnP[0]) + y[1] * (a.dlngamma_dT[1] + dlnP[1]);
    if (!(fabs(dFdT) > 0.0))
        return PW_ESINGULAR;
    size_t nf = fp->n_fit;
    for (size_t j = 0; j < nf; j++) {
        size_t k = fp->idx[j];
        double dFdp = y[0] * a.dlngamma_dp[0][k] + y[1] * a.dlngamma_dp[1][k];
        double dTdp = -dFdp / dFdT * fp->scale[j];
        J[j] = dTdp / fp->sigma_T_K;
        if (with_y) {
            double dy = y[0] * (a.dlngamma_dp[0][k] * fp->scale[j] +
                                (a.dlngamma_dT[0] + dlnP[0]) * dTdp);
            J[nf + j] = dy / fp->sigma_y;
        }
    }
    return PW_OK;
}

/* One isothermal point: residuals (P, [y]) and their rows of J. */
static pw_status eval_isothermal(const fit_problem *fp, const pw_system *s, const pw_point *pt,
                                 double *f, double *J)
{
    pw_eq_point eq;
    pw_status st = pw_bubble_P(s, pt->T_K, pt->x1, &eq);
    if (st != PW_OK)
        return st;
    bool with_y = fp->objective == PW_OBJ_PXY;
    double sP = sigma_P(fp, pt->P_Pa);
    f[0] = (eq.P_Pa - pt->P_Pa) / sP;
    if (with_y)
        f[1] = (eq.y1 - pt->y1) / fp->sigma_y;
    if (!J)
        return PW_OK;
    pw_activity a;
    st = pw_system_activity(s, pt->x1, pt->T_K, &a);
    if (st != PW_OK)
        return st;
    double y[2] = {eq.y1, 1.0 - eq.y1};
    size_t nf = fp->n_fit;
    for (size_t j = 0; j < nf; j++) {
        size_t k = fp->idx[j];
        double dlnP = (y[0] * a.dlngamma_dp[0][k] + y[1] * a.dlngamma_dp[1][k]) * fp->scale[j];
        J[j] = eq.P_Pa * dlnP / sP;
        if (with_y)
            J[nf + j] = y[0] * (a.dlngamma_dp[0][k] * fp->scale[j] - dlnP) / fp->sigma_y;
    }
    return PW_OK;
}

pw_status fit_eval(const fit_problem *fp, const double *params, double *f, double *J)
{
    pw_system s = fp->sys;
    for (size_t k = 0; k < PW_MAX_PARAMS; k++)
        s.params[k] = params[k];
    pw_status st = s.model->check(s.params);
    if (st != PW_OK)
        return st;
    size_t m = fit_residuals_per_point(fp->objective);
    bool isobaric = fp->objective == PW_OBJ_TXY || fp->objective == PW_OBJ_TX;
    fit_het_state het = {.exists = false};
    if (fp->three_phase) { /* three-phase points: one state per evaluation (objective_het.c) */
        st = fit_het_state_eval(fp, &s, J != NULL, &het);
        if (st != PW_OK)
            return st;
    }
    for (size_t i = 0; i < fp->n_pts; i++) {
        double *Ji = J ? J + i * m * fp->n_fit : NULL;
        if (fp->three_phase && fp->three_phase[i] && het.exists) {
            fit_het_point(fp, &het, &fp->pts[i], f + i * m, Ji);
            continue;
        }
        st = isobaric ? eval_isobaric(fp, &s, &fp->pts[i], f + i * m, Ji)
                      : eval_isothermal(fp, &s, &fp->pts[i], f + i * m, Ji);
        if (st != PW_OK)
            return st;
    }
    if (fp->n_ties)
        return fit_ties_eval(fp, &s, f + fp->n_pts * m, J ? J + fp->n_pts * m * fp->n_fit : NULL);
    return PW_OK;
}

double fit_chi2(const fit_problem *fp, const double *params, double *work)
{
    if (fit_eval(fp, params, work, NULL) != PW_OK)
        return INFINITY;
    double s = 0.0;
    for (size_t i = 0; i < fp->n_res; i++)
        s += work[i] * work[i];
    return isfinite(s) ? s : (double)INFINITY;
}
