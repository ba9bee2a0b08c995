/* Residuals and analytic Jacobian of the bubble-point objectives (docs/fitting.md).
 *
 * Isobaric point (x, P): T_calc solves F(T) = ln(sum_i x_i gamma_i P_i^sat(T)) - ln P = 0.
 * By the implicit-function theorem, with y_i = x_i gamma_i P_i^sat / P at the solution,
 *   dT/dp_j  = -(sum_i y_i dln gamma_i/dp_j) / (sum_i y_i (dln gamma_i/dT + dln P_i^sat/dT))
 *   dy1/dp_j = y1 (dln gamma1/dp_j + (dln gamma1/dT + dln P1^sat/dT) dT/dp_j).
 * Isothermal point (x, T): P_calc = sum_i x_i gamma_i P_i^sat explicitly,
 *   dP/dp_j = P sum_i y_i dln gamma_i/dp_j,  dy1/dp_j = y1 (dln gamma1/dp_j - dln P/dp_j).
 * The residuals come from the lean bubble-point kernel (ln gamma and its T derivative only, no
 * parameter derivatives in the Newton steps, Newton started from the measured temperature);
 * the Jacobian takes the parameter derivatives once, at the converged root (docs/fitting.md,
 * "Lean bubble-point kernel"). */
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

void fit_roots_reset(const fit_problem *fp)
{
    if (fp->roots)
        for (size_t i = 0; i < fp->n_pts; i++)
            fp->roots[i].ok = false;
}

/* Rows of J of one point from its root b: isobaric (x, P) or isothermal (x, T). */
static pw_status jac_rows(const fit_problem *fp, const pw_system *s, const pw_point *pt,
                          const pw_bubble_lean *b, bool isobaric, double *J)
{
    pw_activity a;
    pw_status st = pw_system_activity(s, pt->x1, b->T_K, &a);
    if (st != PW_OK)
        return st;
    double y[2] = {b->y1, 1.0 - b->y1};
    size_t nf = fp->n_fit;
    if (isobaric) {
        /* d ln k_i/dT at the root, as the full evaluation there gives it */
        double dlnk[2] = {a.dlngamma_dT[0] + b->dlnPs[0], a.dlngamma_dT[1] + b->dlnPs[1]};
        bool with_y = fp->objective == PW_OBJ_TXY;
        double dFdT = y[0] * dlnk[0] + y[1] * dlnk[1];
        if (!(fabs(dFdT) > 0.0))
            return PW_ESINGULAR;
        for (size_t j = 0; j < nf; j++) {
            size_t k = fp->idx[j];
            double dFdp = y[0] * a.dlngamma_dp[0][k] + y[1] * a.dlngamma_dp[1][k];
            double dTdp = -dFdp / dFdT * fp->scale[j];
            J[j] = dTdp / fp->sigma_T_K;
            if (with_y) {
                double dy = y[0] * (a.dlngamma_dp[0][k] * fp->scale[j] + dlnk[0] * dTdp);
                J[nf + j] = dy / fp->sigma_y;
            }
        }
        return PW_OK;
    }
    bool with_y = fp->objective == PW_OBJ_PXY;
    double sP = sigma_P(fp, pt->P_Pa);
    for (size_t j = 0; j < nf; j++) {
        size_t k = fp->idx[j];
        double dlnP = (y[0] * a.dlngamma_dp[0][k] + y[1] * a.dlngamma_dp[1][k]) * fp->scale[j];
        J[j] = b->P_Pa * dlnP / sP;
        if (with_y)
            J[nf + j] = y[0] * (a.dlngamma_dp[0][k] * fp->scale[j] - dlnP) / fp->sigma_y;
    }
    return PW_OK;
}

/* One point: residuals (T or P, [y]) from the lean kernel, its root kept in fp->roots[i], and
 * its rows of J when J is not NULL. */
static pw_status eval_point_res(const fit_problem *fp, const pw_system *s, size_t i,
                                bool isobaric, double *f, double *J)
{
    const pw_point *pt = &fp->pts[i];
    fit_root *keep = fp->roots ? &fp->roots[i] : NULL;
    pw_bubble_lean b;
    pw_status st;
    if (isobaric) {
        st = pw_thermo_bubble_T_lean(s, &fp->kern, pt->P_Pa, pt->x1, pt->T_K, &b);
    } else {
        st = pw_thermo_bubble_P_lean(s, &fp->kern, pt->T_K, pt->x1, &b);
    }
    if (keep)
        keep->ok = false;
    if (st != PW_OK)
        return st;
    if (keep) {
        keep->b = b;
        keep->ok = true;
    }
    bool with_y = fp->objective == PW_OBJ_TXY || fp->objective == PW_OBJ_PXY;
    f[0] = isobaric ? (b.T_K - pt->T_K) / fp->sigma_T_K
                    : (b.P_Pa - pt->P_Pa) / sigma_P(fp, pt->P_Pa);
    if (with_y)
        f[1] = (b.y1 - pt->y1) / fp->sigma_y;
    return J ? jac_rows(fp, s, pt, &b, isobaric, J) : PW_OK;
}

static void system_at(const fit_problem *fp, const double *params, pw_system *s)
{
    *s = fp->sys;
    for (size_t k = 0; k < PW_MAX_PARAMS; k++)
        s->params[k] = params[k];
}

pw_status fit_jacobian_at_roots(const fit_problem *fp, const double *params, double *J)
{
    if (!fp->roots || fp->three_phase || fp->n_ties)
        return PW_EINVAL;
    pw_system s;
    system_at(fp, params, &s);
    size_t m = fit_residuals_per_point(fp->objective);
    bool isobaric = fp->objective == PW_OBJ_TXY || fp->objective == PW_OBJ_TX;
    for (size_t i = 0; i < fp->n_pts; i++) {
        if (!fp->roots[i].ok)
            return PW_EINVAL;
        pw_status st = jac_rows(fp, &s, &fp->pts[i], &fp->roots[i].b, isobaric,
                                J + i * m * fp->n_fit);
        if (st != PW_OK)
            return st;
    }
    return PW_OK;
}

pw_status fit_eval(const fit_problem *fp, const double *params, double *f, double *J)
{
    pw_system s;
    system_at(fp, params, &s);
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
        /* a three-phase point, or a one-liquid point inside the model's layers: both are
         * scored by the state the model predicts for them, the three-phase one (the one-liquid
         * bubble point inside the layers is metastable; docs/heterogeneous.md 4) */
        if (fp->three_phase && het.exists &&
            (fp->three_phase[i] ||
             (!fp->one_liquid_inside && fit_het_inside(&het, fp->pts[i].x1)))) {
            fit_het_point(fp, &het, &fp->pts[i], f + i * m, Ji);
            continue;
        }
        st = eval_point_res(fp, &s, i, isobaric, f + i * m, Ji);
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

bool fit_chi2_continue(const fit_problem *fp, const double *params, size_t end, double cap,
                       size_t *next, double *sum, double *work)
{
    pw_system s;
    system_at(fp, params, &s);
    if (s.model->check(s.params) != PW_OK)
        return false;
    size_t m = fit_residuals_per_point(fp->objective);
    bool isobaric = fp->objective == PW_OBJ_TXY || fp->objective == PW_OBJ_TX;
    if (end > fp->n_pts)
        end = fp->n_pts;
    while (*next < end) {
        if (eval_point_res(fp, &s, (*next)++, isobaric, work, NULL) != PW_OK)
            return false;
        for (size_t r = 0; r < m; r++)
            *sum += work[r] * work[r];
        if (!isfinite(*sum))
            return false;
        if (*sum > cap)
            return true; /* already above the cap: the rest cannot bring it below */
    }
    return true;
}
