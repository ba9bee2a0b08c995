/* Model values at the measured points, deviation statistics, information criteria, infinite-
 * dilution activity coefficients and the liquid-stability screen of a fit result. */
#include "fit_internal.h"

#include <math.h>
#include <pinchwise/lle.h>
#include <stdlib.h>
#include <string.h>

static void stat_init(pw_fit_stat *s)
{
    s->aad = s->bias = s->max_abs = 0.0;
    s->max_line = 0;
}

static void stat_add(pw_fit_stat *s, double d, long line)
{
    s->aad += fabs(d);
    s->bias += d;
    if (fabs(d) > s->max_abs) {
        s->max_abs = fabs(d);
        s->max_line = line;
    }
}

static void stat_done(pw_fit_stat *s, size_t n, bool measured)
{
    if (!measured || n == 0) {
        s->aad = s->bias = s->max_abs = NAN;
        s->max_line = 0;
        return;
    }
    s->aad /= (double)n;
    s->bias /= (double)n;
}

/* ln gamma_i from one measurement: gamma_i = y_i Phi_i P / (x_i P_i^sat(T)), Phi_i = 1 for the
 * ideal vapor (modified Raoult's law), else at the measured y, T and P. */
static void lngamma_from_point(const pw_system *s, const pw_point *p, bool has_y, double out[2])
{
    out[0] = out[1] = NAN;
    if (!has_y)
        return;
    double x[2] = {p->x1, 1.0 - p->x1}, y[2] = {p->y1, 1.0 - p->y1}, Ps[2], Phi[2] = {1.0, 1.0};
    for (int i = 0; i < 2; i++)
        if (pw_psat(&s->comp[i], p->T_K, &Ps[i], NULL) != PW_OK)
            return;
    double B[3];
    if (s->vapor == PW_VAPOR_VIRIAL) {
        if (pw_virial_B(&s->comp[0], &s->comp[1], p->T_K, B) != PW_OK)
            return;
        pw_vapor_phi(s->vapor, B, p->T_K, p->P_Pa, p->y1, Ps, Phi);
    }
    for (int i = 0; i < 2; i++)
        if (x[i] > 0.0 && y[i] > 0.0)
            out[i] = log(y[i] * Phi[i] * p->P_Pa / (x[i] * Ps[i]));
}

/* pw_fit_evaluate; screen false keeps r's liquid-stability screen as it is. */
static pw_status evaluate(pw_fit_result *r, bool screen)
{
    if (!r || !r->sys.model)
        return PW_EINVAL;
    pw_status st = r->sys.model->check(r->sys.params);
    if (st != PW_OK)
        return st;
    /* the two liquids the data show travel with the system (the single column's guard) */
    r->sys.measured = pw_fit_measured_split(r);
    bool isobaric = r->kind == PW_DATA_ISOBARIC;
    pw_fit_stat dy, dT, dP;
    stat_init(&dy);
    stat_init(&dT);
    stat_init(&dP);
    size_t n_used = 0;
    pw_status first_failure = PW_OK;
    /* three-phase points and points inside the layers (docs/heterogeneous.md): one three-phase
     * state for all of them, as the objective has it (fit_het_plan_of) */
    pw_three_phase tp = {.exists = false};
    fit_het_plan plan = fit_het_plan_of(r);
    double g = plan.T3_guess_K;
    if (plan.state &&
        (isobaric ? (isfinite(g) ? pw_three_phase_at_P_near(&r->sys, r->P_fixed_Pa, g, &tp)
                                 : pw_three_phase_at_P(&r->sys, r->P_fixed_Pa, &tp))
                  : pw_three_phase_at_T(&r->sys, r->T_fixed_K, &tp)) != PW_OK)
        tp.exists = false;
    for (size_t i = 0; i < r->n_pts; i++) {
        pw_fit_point *fpnt = &r->pts[i];
        const pw_point *m = &fpnt->meas;
        pw_eq_point eq;
        pw_status pst;
        /* a one-liquid point inside the model's layers boils, by the model, as two liquids:
         * it is scored by the three-phase state as the fit scored it (objective.c) */
        fpnt->in_layers = plan.inside && !fpnt->three_phase && !fpnt->excluded &&
                          !fit_is_pure(m) && tp.exists &&
                          m->x1 > fmin(tp.x[0], tp.x[1]) && m->x1 < fmax(tp.x[0], tp.x[1]);
        if ((fpnt->three_phase || fpnt->in_layers) && !fpnt->excluded && tp.exists) {
            memset(&eq, 0, sizeof eq);
            eq.T_K = tp.T_K;
            eq.P_Pa = tp.P_Pa;
            eq.y1 = tp.y1;
            pst = PW_OK;
        } else {
            pst = isobaric ? pw_bubble_T_from(&r->sys, m->P_Pa, m->x1, m->T_K, &eq)
                           : pw_bubble_P(&r->sys, m->T_K, m->x1, &eq);
        }
        fpnt->T_calc_K = pst == PW_OK ? eq.T_K : (double)NAN;
        fpnt->P_calc_Pa = pst == PW_OK ? eq.P_Pa : (double)NAN;
        fpnt->y_calc = pst == PW_OK ? eq.y1 : (double)NAN;
        lngamma_from_point(&r->sys, m, r->has_y, fpnt->lngamma_exp);
        if (fpnt->excluded || fit_is_pure(m))
            continue;
        if (pst != PW_OK) {
            if (first_failure == PW_OK)
                first_failure = pst;
            continue;
        }
        n_used++;
        if (r->has_y)
            stat_add(&dy, eq.y1 - m->y1, m->line);
        if (isobaric)
            stat_add(&dT, eq.T_K - m->T_K, m->line);
        else
            stat_add(&dP, eq.P_Pa - m->P_Pa, m->line);
    }
    stat_done(&dy, n_used, r->has_y);
    stat_done(&dT, n_used, isobaric);
    stat_done(&dP, n_used, !isobaric);
    r->dev_y = dy;
    r->dev_T_K = dT;
    r->dev_P_Pa = dP;

    /* Information criteria (least squares, variance estimated: k = fitted parameters + 1;
     * Akaike 1974, Hurvich & Tsai 1989, Schwarz 1978). */
    double n = (double)r->n_residuals, k = (double)r->n_fitted + 1.0;
    if (r->n_residuals > 0 && r->chi2 > 0.0 && isfinite(r->chi2)) {
        r->aic = n * log(r->chi2 / n) + 2.0 * k;
        r->aicc = n - k - 1.0 > 0.0 ? r->aic + 2.0 * k * (k + 1.0) / (n - k - 1.0) : (double)INFINITY;
        r->bic = n * log(r->chi2 / n) + k * log(n);
    } else {
        r->aic = r->aicc = r->bic = NAN;
    }
    r->chi2_red = r->dof > 0 ? r->chi2 / (double)r->dof : (double)NAN;

    pw_activity a0, a1;
    if (pw_system_activity(&r->sys, 0.0, r->sys.T_ref_K, &a0) == PW_OK &&
        pw_system_activity(&r->sys, 1.0, r->sys.T_ref_K, &a1) == PW_OK) {
        r->lngamma_inf[0] = a0.lngamma[0];
        r->lngamma_inf[1] = a1.lngamma[1];
    } else {
        r->lngamma_inf[0] = r->lngamma_inf[1] = NAN;
    }

    /* Liquid-stability screen (METHODS 1.6) over the data's temperature range. */
    if (screen) {
        double lo, hi;
        fit_screen_range(r, &lo, &hi);
        fit_stability_screen(&r->sys, lo, hi, &r->split_min_D, &r->split_x, &r->split_T_K);
        r->split = r->split_min_D < 0.0;
    }
    return first_failure;
}

pw_status pw_fit_evaluate(pw_fit_result *r)
{
    return evaluate(r, true);
}

void fit_screen_range(const pw_fit_result *r, double *lo, double *hi)
{
    *lo = isfinite(r->T_min_K) ? r->T_min_K : r->sys.T_ref_K;
    *hi = isfinite(r->T_max_K) ? r->T_max_K : r->sys.T_ref_K;
}

static bool same_stored(double stored, double now)
{
    return stored == now || (isnan(stored) && isnan(now));
}

/* Whether the screen r holds (as read) is one the five-temperature screen over r's range can
 * have given, that range being the fit's own (the points' temperatures): a screened temperature, a composition inside (0, 1), predicted = (min_D < 0); or
 * no screened temperature at all. */
static bool screen_shape_ok(const pw_fit_result *r)
{
    /* the range is the fit's: the measured temperatures of the points not excluded */
    double T_lo = INFINITY, T_hi = -INFINITY;
    for (size_t i = 0; i < r->n_pts; i++)
        if (!r->pts[i].excluded) {
            T_lo = fmin(T_lo, r->pts[i].meas.T_K);
            T_hi = fmax(T_hi, r->pts[i].meas.T_K);
        }
    if (!(r->T_min_K == T_lo && r->T_max_K == T_hi))
        return false;
    if (isnan(r->split_min_D) || isinf(r->split_min_D))
        return !r->split && isnan(r->split_x) && isnan(r->split_T_K);
    if (r->split != (r->split_min_D < 0.0) || !(r->split_x > 0.0 && r->split_x < 1.0))
        return false;
    double lo, hi;
    fit_screen_range(r, &lo, &hi);
    for (int i = 0; i < 5; i++)
        if (r->split_T_K == lo + (hi - lo) * i / 4.0)
            return true;
    return false;
}

pw_status fit_evaluate_reusing_screen(pw_fit_result *r, bool *reused)
{
    *reused = false;
    if (!r || !r->sys.model)
        return PW_EINVAL;
    /* the per-point values the file holds, before they are recomputed */
    size_t n = r->n_pts;
    double *was = n ? malloc(sizeof *was * 3 * n) : NULL;
    if (n && !was)
        return pw_fit_evaluate(r);
    size_t n_finite = 0;
    for (size_t i = 0; i < n; i++) {
        was[3 * i] = r->pts[i].T_calc_K;
        was[3 * i + 1] = r->pts[i].P_calc_Pa;
        was[3 * i + 2] = r->pts[i].y_calc;
        n_finite +=
            isfinite(r->pts[i].T_calc_K) && !r->pts[i].excluded && !fit_is_pure(&r->pts[i].meas);
    }
    bool shape = screen_shape_ok(r);
    pw_status st = evaluate(r, false);
    bool same = shape && n_finite > 0 && st == PW_OK;
    for (size_t i = 0; same && i < n; i++)
        same = same_stored(was[3 * i], r->pts[i].T_calc_K) &&
               same_stored(was[3 * i + 1], r->pts[i].P_calc_Pa) &&
               same_stored(was[3 * i + 2], r->pts[i].y_calc);
    free(was);
    if (same) {
        if (isnan(r->split_min_D)) /* written as null: no temperature could be screened */
            r->split_min_D = INFINITY;
        *reused = true;
        return st;
    }
    double lo, hi;
    fit_screen_range(r, &lo, &hi);
    fit_stability_screen(&r->sys, lo, hi, &r->split_min_D, &r->split_x, &r->split_T_K);
    r->split = r->split_min_D < 0.0;
    return st;
}

void fit_stability_screen(const pw_system *s, double T_lo, double T_hi, double *min_D,
                          double *x_at_min, double *T_at_min)
{
    *min_D = INFINITY;
    *x_at_min = NAN;
    *T_at_min = NAN;
    for (int i = 0; i < 5; i++) {
        double T = T_lo + (T_hi - T_lo) * i / 4.0, D, x;
        if (pw_stability_min(s, T, &D, &x) != PW_OK)
            continue;
        if (D < *min_D) {
            *min_D = D;
            *x_at_min = x;
            *T_at_min = T;
        }
    }
}

size_t pw_fit_competing_minima(const pw_fit_result *r)
{
    if (!r || r->n_minima == 0)
        return 0;
    double n = r->n_residuals > 0 ? (double)r->n_residuals : 1.0;
    double limit = r->minima[0].chi2 * fmax(1.01, exp(2.0 / n));
    size_t k = 0;
    while (k < r->n_minima && r->minima[k].chi2 <= limit)
        k++;
    return k;
}

void pw_fit_result_free(pw_fit_result *r)
{
    if (!r)
        return;
    free(r->pts);
    r->pts = NULL;
    r->n_pts = 0;
    free(r->ties);
    r->ties = NULL;
}

pw_status pw_fit_result_copy(pw_fit_result *dst, const pw_fit_result *src)
{
    *dst = *src;
    dst->pts = NULL;
    if (src->n_pts) {
        dst->pts = malloc(sizeof *dst->pts * src->n_pts);
        if (!dst->pts) {
            dst->n_pts = 0;
            return PW_ENOMEM;
        }
        memcpy(dst->pts, src->pts, sizeof *dst->pts * src->n_pts);
    }
    dst->ties = NULL;
    if (src->ties && src->n_tie_lines) {
        dst->ties = malloc(sizeof *dst->ties * src->n_tie_lines);
        if (!dst->ties) {
            pw_fit_result_free(dst);
            return PW_ENOMEM;
        }
        memcpy(dst->ties, src->ties, sizeof *dst->ties * src->n_tie_lines);
    }
    return PW_OK;
}
