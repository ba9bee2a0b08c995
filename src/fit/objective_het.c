/* Residuals and analytic Jacobian rows of three-phase points and liquid-liquid tie lines
 * (docs/heterogeneous.md, section 4).
 *
 * Tie line at T: the layers solve F1 = ln a1(x_I) - ln a1(x_II) = 0, F2 = ln a2(x_I) -
 * ln a2(x_II) = 0; by the implicit-function theorem dx/dp = -(dF/dx)^-1 dF/dp with
 * dF/dx = [[dln a1/dx(x_I), -dln a1/dx(x_II)], [dln a2/dx(x_I), -dln a2/dx(x_II)]].
 * Three-phase state at fixed P: unknowns (T, x_I, x_II) with F1, F2 and
 * F3 = ln[a1(x_I) P1sat(T) + a2(x_I) P2sat(T)] - ln P = 0; y3 = a1 P1sat/P. At fixed T: the
 * layers as for a tie line, P3 = a1 P1sat + a2 P2sat, y3 = a1 P1sat/P3. Linear systems by
 * LAPACK (dgesv). */
#include "fit_internal.h"

#include <lapacke.h>
#include <math.h>
#include <pinchwise/lle.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define TPD_FIT 1000

typedef struct layer {
    pw_activity a;
    double x, dlna[2]; /* d ln a_i / dx at constant T */
} layer;

static pw_status layer_at(const pw_system *s, double x, double T, layer *l)
{
    pw_status st = pw_system_activity(s, x, T, &l->a);
    if (st != PW_OK)
        return st;
    l->x = x;
    l->dlna[0] = 1.0 / x + l->a.dlngamma_dx1[0];
    l->dlna[1] = -1.0 / (1.0 - x) + l->a.dlngamma_dx1[1];
    return PW_OK;
}

/* dx_I/du_j, dx_II/du_j at fixed T for every fitted parameter; extra: d(row3)/dp handled by
 * the caller. */
static pw_status layer_derivs(const fit_problem *fp, const layer *L1, const layer *L2,
                              double dxI[PW_MAX_PARAMS], double dxII[PW_MAX_PARAMS])
{
    size_t nf = fp->n_fit;
    double A[4] = {L1->dlna[0], -L2->dlna[0], L1->dlna[1], -L2->dlna[1]};
    double B[2 * PW_MAX_PARAMS];
    for (size_t j = 0; j < nf; j++) {
        size_t k = fp->idx[j];
        B[0 * nf + j] = -(L1->a.dlngamma_dp[0][k] - L2->a.dlngamma_dp[0][k]) * fp->scale[j];
        B[1 * nf + j] = -(L1->a.dlngamma_dp[1][k] - L2->a.dlngamma_dp[1][k]) * fp->scale[j];
    }
    lapack_int piv[2];
    if (LAPACKE_dgesv(LAPACK_ROW_MAJOR, 2, (lapack_int)nf, A, 2, piv, B, (lapack_int)nf) != 0)
        return PW_ESINGULAR;
    for (size_t j = 0; j < nf; j++) {
        dxI[j] = B[j];
        dxII[j] = B[nf + j];
    }
    return PW_OK;
}

pw_status fit_ties_eval(const fit_problem *fp, const pw_system *s, double *f, double *J)
{
    size_t nf = fp->n_fit;
    for (size_t t = 0; t < fp->n_ties; t++) {
        const pw_tie_line *tl = &fp->ties[t];
        double *Jt = J ? J + 2 * t * nf : NULL;
        pw_lle_result r;
        pw_status st = pw_lle_solve_n(s, tl->T_K, TPD_FIT, &r);
        if (st == PW_ERANGE) {
            /* beyond the solubility floor: layers at the pure ends, no derivative */
            r.split = true;
            r.x[0] = 0.0;
            r.x[1] = 1.0;
            f[2 * t] = (r.x[0] - tl->x_I) / fp->sigma_x_lle;
            f[2 * t + 1] = (r.x[1] - tl->x_II) / fp->sigma_x_lle;
            if (Jt)
                memset(Jt, 0, 2 * nf * sizeof *Jt);
            continue;
        }
        if (st != PW_OK)
            return st;
        if (!r.split) {
            double xc = isfinite(r.x_min_D) ? r.x_min_D : 0.5;
            f[2 * t] = (xc - tl->x_I) / fp->sigma_x_lle;
            f[2 * t + 1] = (xc - tl->x_II) / fp->sigma_x_lle;
            if (Jt)
                memset(Jt, 0, 2 * nf * sizeof *Jt);
            continue;
        }
        f[2 * t] = (r.x[0] - tl->x_I) / fp->sigma_x_lle;
        f[2 * t + 1] = (r.x[1] - tl->x_II) / fp->sigma_x_lle;
        if (!Jt)
            continue;
        layer L1, L2;
        st = layer_at(s, r.x[0], tl->T_K, &L1);
        if (st == PW_OK)
            st = layer_at(s, r.x[1], tl->T_K, &L2);
        double dxI[PW_MAX_PARAMS], dxII[PW_MAX_PARAMS];
        if (st == PW_OK)
            st = layer_derivs(fp, &L1, &L2, dxI, dxII);
        if (st != PW_OK)
            return st;
        for (size_t j = 0; j < nf; j++) {
            Jt[j] = dxI[j] / fp->sigma_x_lle;
            Jt[nf + j] = dxII[j] / fp->sigma_x_lle;
        }
    }
    return PW_OK;
}

static pw_status het_isothermal(const fit_problem *fp, const pw_system *s, bool want_J,
                                fit_het_state *h)
{
    pw_three_phase tp;
    pw_status st = pw_three_phase_at_T(s, fp->T_fixed_K, &tp);
    if (st != PW_OK || !tp.exists)
        return st;
    h->exists = true;
    h->T_K = tp.T_K;
    h->P_Pa = tp.P_Pa;
    h->y1 = tp.y1;
    h->x_lo = fmin(tp.x[0], tp.x[1]);
    h->x_hi = fmax(tp.x[0], tp.x[1]);
    if (!want_J)
        return PW_OK;
    layer L1, L2;
    st = layer_at(s, tp.x[0], tp.T_K, &L1);
    if (st == PW_OK)
        st = layer_at(s, tp.x[1], tp.T_K, &L2);
    double dxI[PW_MAX_PARAMS], dxII[PW_MAX_PARAMS];
    if (st == PW_OK)
        st = layer_derivs(fp, &L1, &L2, dxI, dxII);
    if (st != PW_OK)
        return st;
    double p1 = tp.a[0] * tp.Psat_Pa[0], p2 = tp.a[1] * tp.Psat_Pa[1];
    for (size_t j = 0; j < fp->n_fit; j++) {
        size_t k = fp->idx[j];
        double dlna1 = L1.dlna[0] * dxI[j] + L1.a.dlngamma_dp[0][k] * fp->scale[j];
        double dlna2 = L1.dlna[1] * dxI[j] + L1.a.dlngamma_dp[1][k] * fp->scale[j];
        double dP = p1 * dlna1 + p2 * dlna2;
        h->dM[j] = dP;
        h->dy[j] = tp.y1 * (dlna1 - dP / tp.P_Pa);
    }
    return PW_OK;
}

static pw_status het_isobaric(const fit_problem *fp, const pw_system *s, bool want_J,
                              fit_het_state *h)
{
    pw_three_phase tp;
    bool warm = fp->T3_warm_K && isfinite(*fp->T3_warm_K);
    double guess = warm ? *fp->T3_warm_K : fp->T3_guess_K;
    /* no measured three-phase temperature to start from (tie lines only): the full search */
    pw_status st = isfinite(guess) ? pw_three_phase_at_P_near(s, fp->P_fixed_Pa, guess, &tp)
                                   : pw_three_phase_at_P(s, fp->P_fixed_Pa, &tp);
    if (st != PW_OK || !tp.exists)
        return st;
    if (fp->T3_warm_K)
        *fp->T3_warm_K = tp.T_K;
    h->exists = true;
    h->T_K = tp.T_K;
    h->P_Pa = fp->P_fixed_Pa;
    h->y1 = tp.y1;
    h->x_lo = fmin(tp.x[0], tp.x[1]);
    h->x_hi = fmax(tp.x[0], tp.x[1]);
    if (!want_J)
        return PW_OK;
    layer L1, L2;
    st = layer_at(s, tp.x[0], tp.T_K, &L1);
    if (st == PW_OK)
        st = layer_at(s, tp.x[1], tp.T_K, &L2);
    double dlnP[2];
    for (int i = 0; i < 2 && st == PW_OK; i++)
        st = pw_psat(&s->comp[i], tp.T_K, NULL, &dlnP[i]);
    if (st != PW_OK)
        return st;
    double p1 = tp.a[0] * tp.Psat_Pa[0], p2 = tp.a[1] * tp.Psat_Pa[1], S = p1 + p2;
    double k1 = p1 / S, k2 = p2 / S;
    /* unknowns (T, x_I, x_II); rows F1, F2, F3 */
    double A[9] = {
        L1.a.dlngamma_dT[0] - L2.a.dlngamma_dT[0], L1.dlna[0], -L2.dlna[0],
        L1.a.dlngamma_dT[1] - L2.a.dlngamma_dT[1], L1.dlna[1], -L2.dlna[1],
        k1 * (L1.a.dlngamma_dT[0] + dlnP[0]) + k2 * (L1.a.dlngamma_dT[1] + dlnP[1]),
        k1 * L1.dlna[0] + k2 * L1.dlna[1], 0.0};
    size_t nf = fp->n_fit;
    double B[3 * PW_MAX_PARAMS];
    for (size_t j = 0; j < nf; j++) {
        size_t k = fp->idx[j];
        double sc = fp->scale[j];
        B[0 * nf + j] = -(L1.a.dlngamma_dp[0][k] - L2.a.dlngamma_dp[0][k]) * sc;
        B[1 * nf + j] = -(L1.a.dlngamma_dp[1][k] - L2.a.dlngamma_dp[1][k]) * sc;
        B[2 * nf + j] = -(k1 * L1.a.dlngamma_dp[0][k] + k2 * L1.a.dlngamma_dp[1][k]) * sc;
    }
    lapack_int piv[3];
    if (LAPACKE_dgesv(LAPACK_ROW_MAJOR, 3, (lapack_int)nf, A, 3, piv, B, (lapack_int)nf) != 0)
        return PW_ESINGULAR;
    for (size_t j = 0; j < nf; j++) {
        size_t k = fp->idx[j];
        double dT = B[j], dxI = B[nf + j];
        h->dM[j] = dT;
        h->dy[j] = tp.y1 * (L1.dlna[0] * dxI + (L1.a.dlngamma_dT[0] + dlnP[0]) * dT
                            + L1.a.dlngamma_dp[0][k] * fp->scale[j]);
    }
    return PW_OK;
}

pw_status fit_het_state_eval(const fit_problem *fp, const pw_system *s, bool want_J,
                             fit_het_state *h)
{
    memset(h, 0, sizeof *h);
    bool isobaric = fp->objective == PW_OBJ_TXY || fp->objective == PW_OBJ_TX;
    pw_status st = isobaric ? het_isobaric(fp, s, want_J, h) : het_isothermal(fp, s, want_J, h);
    if (st == PW_ERANGE) { /* practically immiscible trial: treat the points as one-liquid */
        h->exists = false;
        return PW_OK;
    }
    /* Without measured three-phase points (tie lines only) the state serves only the points
     * inside the layers: a trial set whose state cannot be computed keeps them one-liquid, as
     * the fit did before it scored them (a failure is not new to such a fit). */
    if (st != PW_OK && st != PW_ENOMEM && !isfinite(fp->T3_guess_K)) {
        memset(h, 0, sizeof *h);
        return PW_OK;
    }
    return st;
}

fit_het_plan fit_het_plan_of(const pw_fit_result *r)
{
    fit_het_plan p = {.state = false, .inside = false, .T3_guess_K = NAN};
    double T3 = 0.0;
    size_t n = 0;
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_fit_point *q = &r->pts[i];
        if (q->three_phase && !q->excluded && !fit_is_pure(&q->meas)) {
            T3 += q->meas.T_K;
            n++;
        }
    }
    if (n)
        p.T3_guess_K = T3 / (double)n;
    p.inside = r->layers_scored && pw_model_can_split(r->sys.model) && (n || r->n_tie_lines);
    p.state = n || p.inside;
    return p;
}

bool fit_het_inside(const fit_het_state *h, double x1)
{
    return h->exists && x1 > h->x_lo && x1 < h->x_hi;
}

void fit_het_point(const fit_problem *fp, const fit_het_state *h, const pw_point *pt, double *f,
                   double *J)
{
    bool isobaric = fp->objective == PW_OBJ_TXY || fp->objective == PW_OBJ_TX;
    bool with_y = fp->objective == PW_OBJ_TXY || fp->objective == PW_OBJ_PXY;
    double sM = isobaric ? fp->sigma_T_K
                         : (isfinite(fp->sigma_P_abs_Pa) ? fp->sigma_P_abs_Pa
                                                         : fp->sigma_P_rel * pt->P_Pa);
    f[0] = isobaric ? (h->T_K - pt->T_K) / sM : (h->P_Pa - pt->P_Pa) / sM;
    if (with_y)
        f[1] = (h->y1 - pt->y1) / fp->sigma_y;
    if (!J)
        return;
    size_t nf = fp->n_fit;
    for (size_t j = 0; j < nf; j++) {
        J[j] = h->dM[j] / sM;
        if (with_y)
            J[nf + j] = h->dy[j] / fp->sigma_y;
    }
}

pw_status fit_het_setup(const pw_dataset *ds, const pw_fit_options *o, pw_fit_result *r,
                        pw_error *err)
{
    const pw_model_type *m = r->sys.model;
    bool can = pw_model_can_split(m);
    if (o->n_tie_lines && !can) {
        /* the models that can split, from the model table */
        char names[160] = "";
        size_t n_all, len = 0;
        const pw_model_type *const *all = pw_model_all(&n_all);
        for (size_t k = 0; k < n_all && len < sizeof names; k++)
            if (pw_model_can_split(all[k]))
                len += (size_t)snprintf(names + len, sizeof names - len, "%s%s",
                                        len ? ", " : "", all[k]->name);
        return pw_error_set(err, PW_EINVAL, ds->path, 0,
                            "the %s model cannot describe two liquid layers (Wilson's equation "
                            "never predicts a split), so it cannot be fitted to tie lines: use "
                            "one of %s",
                            m->name, names);
    }
    if (o->n_tie_lines && !o->tie_lines)
        return pw_error_set(err, PW_EINVAL, ds->path, 0, "tie lines missing");
    r->n_tie_lines = o->n_tie_lines;
    r->sigma_x_lle = isfinite(o->sigma_x_lle) ? o->sigma_x_lle : PW_LLE_SIGMA_X_DEFAULT;
    r->aad_x_lle = NAN;
    if (!(r->sigma_x_lle > 0.0))
        return pw_error_set(err, PW_EINVAL, ds->path, 0, "sigma_x of the tie lines must be positive");
    r->n_three_phase = 0;
    if (!o->three_phase_points || r->n_pts == 0)
        return PW_OK;
    bool flags[PW_DATASET_MAX_POINTS > 4096 ? 4096 : PW_DATASET_MAX_POINTS];
    if (ds->n > sizeof flags / sizeof flags[0])
        return PW_OK; /* very large sets: no plateau search (documented) */
    size_t n = pw_three_phase_detect(ds->pts, ds->n, ds->kind == PW_DATA_ISOBARIC, ds->has_y,
                                     r->sigma_T_K, r->sigma_P_rel, r->sigma_y, flags);
    if (n == 0)
        return PW_OK;
    for (size_t i = 0; i < r->n_pts; i++) {
        if (!flags[i] || r->pts[i].excluded)
            continue;
        /* flagged either way, so the fit file records the two liquids the data show
         * (pw_fit_measured_split) */
        r->pts[i].three_phase = true;
        if (!can)
            r->pts[i].excluded = true; /* a one-liquid model cannot represent them */
        r->n_three_phase++;
    }
    if (!can && r->n_three_phase) {
        size_t len = strlen(r->exclude_reason);
        snprintf(r->exclude_reason + len, sizeof r->exclude_reason - len,
                 "%s%zu three-phase points left out: the %s model cannot split",
                 len ? "; " : "", r->n_three_phase, m->name);
    }
    return PW_OK;
}

void fit_het_finish(const fit_problem *fp, pw_fit_result *r)
{
    if (!fp->n_ties)
        return;
    pw_system s = fp->sys;
    memcpy(s.params, r->sys.params, sizeof s.params);
    double f[2 * 64];
    double sum = 0.0;
    size_t cnt = 0;
    free(r->ties);
    r->ties = calloc(fp->n_ties, sizeof *r->ties); /* NULL (out of memory): counts only */
    for (size_t t0 = 0; t0 < fp->n_ties; t0 += 64) {
        fit_problem part = *fp;
        part.ties = fp->ties + t0;
        part.n_ties = fp->n_ties - t0 < 64 ? fp->n_ties - t0 : 64;
        if (fit_ties_eval(&part, &s, f, NULL) != PW_OK) {
            free(r->ties); /* no half-filled table: counts only */
            r->ties = NULL;
            return;
        }
        for (size_t i = 0; i < 2 * part.n_ties; i++) {
            sum += fabs(f[i]) * fp->sigma_x_lle;
            cnt++;
        }
        for (size_t i = 0; r->ties && i < part.n_ties; i++) {
            const pw_tie_line *tl = &part.ties[i];
            pw_fit_tie *o = &r->ties[t0 + i];
            o->line = tl->line;
            o->T_K = tl->T_K;
            o->x_I = tl->x_I;
            o->x_II = tl->x_II;
            o->calc_I = tl->x_I + f[2 * i] * fp->sigma_x_lle;
            o->calc_II = tl->x_II + f[2 * i + 1] * fp->sigma_x_lle;
            if (!(o->calc_I < o->calc_II)) /* no split at T: one composition stood in for both */
                o->calc_I = o->calc_II = NAN;
        }
    }
    r->aad_x_lle = cnt ? sum / (double)cnt : (double)NAN;
}
