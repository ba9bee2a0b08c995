/* Point test (Van Ness, Byer & Gibbs 1973): a Legendre G^E (Fredenslund, Gmehling & Rasmussen
 * 1977) is fitted by Barker's method (1953) to P-x (isothermal) or T-x (isobaric) ALONE, with
 * GSL's trust-region Levenberg-Marquardt and analytic Jacobians; the y it predicts is compared
 * with the measured y. Residuals: isothermal (P_calc - P)/P, isobaric T_calc - T [K].
 * The number of terms (3-5 by default) is chosen by the lowest AICc (or lowest residual). */
#include "consistency_internal.h"
#include "base/solve1d.h"

#include <float.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_multifit_nlinear.h>
#include <math.h>
#include <string.h>

typedef struct barker {
    const cs_data *d;
    const pw_model_type *m;
    size_t p;
} barker;

/* Bubble state of the Legendre model at interior point q: calc = P [Pa] (isothermal) or T [K]
 * (isobaric), y1, ln gamma_i, and d(calc)/d a_k in dcalc (may be NULL). */
typedef struct bubble_state {
    double calc, y1, lng[2], Psat[2];
} bubble_state;

typedef struct tb_params {
    const pw_component *comp[2];
    double xg[2]; /* x_i gamma_i */
    double lnP;
    pw_status st;
} tb_params;

static double tb_fun(double T, void *vp)
{
    tb_params *tp = vp;
    double s = 0.0;
    for (int c = 0; c < 2; c++) {
        double Ps;
        pw_status st = pw_psat(tp->comp[c], T, &Ps, NULL);
        if (st != PW_OK) {
            tp->st = st;
            return GSL_NAN;
        }
        s += tp->xg[c] * Ps;
    }
    return log(s) - tp->lnP;
}

static pw_status tb_fn1d(void *vp, double T, double *f)
{
    tb_params *tp = vp;
    double v = tb_fun(T, vp);
    if (tp->st != PW_OK)
        return tp->st;
    *f = v;
    return PW_OK;
}

/* T at which x1 g1 P1sat(T) + x2 g2 P2sat(T) = P, for T-independent gammas: the root of
 * f(T) = ln(sum_i x_i g_i P_i^sat(T)) - ln P, strictly increasing in T, so the root is unique.
 * Newton from T0 (the measured temperature: close to the root), f' = sum_i p_i dlnP_i^sat/dT /
 * sum_i p_i, accepted once a step is below 4 DBL_EPSILON of T; when it does not get there in
 * NEWTON_MAX steps or leaves the vapor-pressure range, GSL Brent on an exact bracket: at
 * min_i Tsat_i(P/(x_i g_i)) one term alone reaches P; at min_i Tsat_i(P/(2 x_i g_i)) (over the
 * terms that can reach P/2) neither term exceeds P/2. */
#define NEWTON_MAX 12

static pw_status bubble_T_newton(const cs_data *d, const double xg[2], double P, double T0,
                                 double *T)
{
    if (!(T0 > 0.0) || !isfinite(T0))
        return PW_ENOCONV;
    const double lnP = log(P);
    double t = T0;
    for (int it = 0; it < NEWTON_MAX; it++) {
        double s = 0.0, ds = 0.0;
        for (int c = 0; c < 2; c++) {
            double Ps, dl;
            if (pw_psat(d->comp[c], t, &Ps, &dl) != PW_OK)
                return PW_ENOCONV;
            s += xg[c] * Ps;
            ds += xg[c] * Ps * dl;
        }
        if (!(s > 0.0) || !(ds > 0.0) || !isfinite(s) || !isfinite(ds))
            return PW_ENOCONV;
        double step = (log(s) - lnP) * s / ds;
        if (!isfinite(step) || fabs(step) > 0.2 * t)
            return PW_ENOCONV;
        t -= step;
        if (fabs(step) <= 4.0 * DBL_EPSILON * t) {
            *T = t;
            return PW_OK;
        }
    }
    return PW_ENOCONV;
}

static pw_status bubble_T(const cs_data *d, const double xg[2], double P, double T0, double *T)
{
    if (bubble_T_newton(d, xg, P, T0, T) == PW_OK)
        return PW_OK;
    double hi = INFINITY, lo = INFINITY;
    for (int c = 0; c < 2; c++) {
        double Th, Tl;
        if (xg[c] > 0.0 && pw_tsat(d->comp[c], P / xg[c], &Th) == PW_OK)
            hi = fmin(hi, Th);
        if (xg[c] > 0.0 && pw_tsat(d->comp[c], P / (2.0 * xg[c]), &Tl) == PW_OK)
            lo = fmin(lo, Tl);
    }
    if (!isfinite(hi) || !isfinite(lo) || !(lo < hi))
        return PW_ENOBRACKET;
    tb_params tp = {{d->comp[0], d->comp[1]}, {xg[0], xg[1]}, log(P), PW_OK};
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = 0.0;
    o.xtol_rel = 4.0 * DBL_EPSILON;
    o.max_iter = 200;
    return pw_root1d(tb_fn1d, &tp, lo, hi, NAN, NAN, &o, T, NULL);
}

static pw_status bubble(const cs_data *d, const pw_model_type *m, const double *a,
                        const cs_point *q, bubble_state *b, double *dcalc)
{
    pw_activity act;
    double x[2] = {q->x1, 1.0 - q->x1};
    double T = d->ds->kind == PW_DATA_ISOTHERMAL ? d->ds->T_fixed_K : q->T_K;
    /* isobaric: G^E/RT in the 1/T form about a fixed reference (consistency_legendre.c) */
    double T_ref = d->ds->kind == PW_DATA_ISOTHERMAL ? T : PW_CS_LEGENDRE_T_REF_K;
    pw_status st = m->eval(a, T_ref, q->x1, T, &act);
    if (st != PW_OK)
        return st;
    double xg[2] = {x[0] * exp(act.lngamma[0]), x[1] * exp(act.lngamma[1])};
    double dlnP[2];
    if (d->ds->kind == PW_DATA_ISOTHERMAL) {
        b->Psat[0] = q->Psat_Pa[0];
        b->Psat[1] = q->Psat_Pa[1];
    } else {
        st = bubble_T(d, xg, d->ds->P_fixed_Pa, q->T_K, &T);
        for (int c = 0; c < 2 && st == PW_OK; c++)
            st = pw_psat(d->comp[c], T, &b->Psat[c], &dlnP[c]);
        if (st != PW_OK)
            return st;
    }
    double part[2] = {xg[0] * b->Psat[0], xg[1] * b->Psat[1]};
    double P = part[0] + part[1];
    b->y1 = part[0] / P;
    b->lng[0] = act.lngamma[0];
    b->lng[1] = act.lngamma[1];
    b->calc = d->ds->kind == PW_DATA_ISOTHERMAL ? P : T;
    if (dcalc) {
        for (size_t k = 0; k < m->n_params; k++) {
            double dP = part[0] * act.dlngamma_dp[0][k] + part[1] * act.dlngamma_dp[1][k];
            dcalc[k] = d->ds->kind == PW_DATA_ISOTHERMAL
                           ? dP
                           : -dP / (part[0] * dlnP[0] + part[1] * dlnP[1]); /* implicit dT/da */
        }
    }
    return PW_OK;
}

static int barker_f(const gsl_vector *a, void *vp, gsl_vector *f)
{
    const barker *bk = vp;
    for (size_t i = 0; i < bk->d->n_in; i++) {
        const cs_point *q = &bk->d->in[i];
        bubble_state b;
        if (bubble(bk->d, bk->m, a->data, q, &b, NULL) != PW_OK)
            return GSL_EDOM;
        gsl_vector_set(f, i, bk->d->ds->kind == PW_DATA_ISOTHERMAL ? (b.calc - q->P_Pa) / q->P_Pa
                                                                   : b.calc - q->T_K);
    }
    return GSL_SUCCESS;
}

static int barker_df(const gsl_vector *a, void *vp, gsl_matrix *J)
{
    const barker *bk = vp;
    double dc[PW_MAX_PARAMS];
    for (size_t i = 0; i < bk->d->n_in; i++) {
        const cs_point *q = &bk->d->in[i];
        bubble_state b;
        if (bubble(bk->d, bk->m, a->data, q, &b, dc) != PW_OK)
            return GSL_EDOM;
        double scale = bk->d->ds->kind == PW_DATA_ISOTHERMAL ? 1.0 / q->P_Pa : 1.0;
        for (size_t k = 0; k < bk->p; k++)
            gsl_matrix_set(J, i, k, dc[k] * scale);
    }
    return GSL_SUCCESS;
}

/* One Levenberg-Marquardt run from a0; on success a and *ssr hold the result. */
static pw_status barker_run(const cs_data *d, size_t p, const double *a0, double *a, double *ssr)
{
    barker bk = {d, pw_cs_legendre_model(p), p};
    size_t n = d->n_in;
    if (n < p) /* GSL's allocator would call its error handler (which may abort) */
        return PW_ETOOFEW;
    gsl_multifit_nlinear_fdf fdf = {0};
    fdf.f = barker_f;
    fdf.df = barker_df;
    fdf.n = n;
    fdf.p = p;
    fdf.params = &bk;
    gsl_multifit_nlinear_parameters fp = gsl_multifit_nlinear_default_parameters();
    gsl_multifit_nlinear_workspace *w =
        gsl_multifit_nlinear_alloc(gsl_multifit_nlinear_trust, &fp, n, p);
    if (!w)
        return PW_ENOMEM;
    gsl_vector_const_view x0 = gsl_vector_const_view_array(a0, p);
    int info = 0;
    int gs = gsl_multifit_nlinear_init(&x0.vector, &fdf, w);
    if (gs == GSL_SUCCESS)
        gs = gsl_multifit_nlinear_driver(200, 1e3 * DBL_EPSILON, 1e3 * DBL_EPSILON, 0.0, NULL, NULL,
                                         &info, w);
    /* GSL's codes mapped explicitly (as in src/fit/fit.c): success (any info: xtol, gtol, ftol
     * or a tolerance at machine precision) is converged; GSL_EMAXITER with info GSL_ENOPROG means
     * no step lowered the cost from the start, which is converged when the start already fits
     * to rounding level (noise-free data from the start's model, e.g. ideal data at a_k = 0);
     * GSL_EMAXITER otherwise is the iteration limit; anything else did not converge. */
    pw_status st = gs == GSL_SUCCESS ? PW_OK : gs == GSL_EMAXITER ? PW_EMAXITER : PW_ENOCONV;
    if (gs == GSL_EMAXITER && info == GSL_ENOPROG) {
        gsl_vector *f0 = gsl_multifit_nlinear_residual(w);
        double s0 = 0.0, scale = 0.0;
        for (size_t i = 0; i < n; i++) {
            s0 += gsl_vector_get(f0, i) * gsl_vector_get(f0, i);
            scale = fmax(scale, d->ds->kind == PW_DATA_ISOTHERMAL ? 1.0 : d->in[i].T_K);
        }
        double tol = 1e3 * DBL_EPSILON * scale;
        st = s0 <= (double)n * tol * tol ? PW_OK : PW_ENOCONV;
    }
    if (st == PW_OK) {
        gsl_vector *x = gsl_multifit_nlinear_position(w);
        gsl_vector *f = gsl_multifit_nlinear_residual(w);
        double s = 0.0;
        for (size_t i = 0; i < n; i++)
            s += gsl_vector_get(f, i) * gsl_vector_get(f, i);
        for (size_t k = 0; k < p; k++)
            a[k] = gsl_vector_get(x, k);
        *ssr = s;
    }
    gsl_multifit_nlinear_free(w);
    return st;
}

int pw_consistency_van_ness_index(double rms)
{
    if (!isfinite(rms) || rms < 0.0)
        return 0;
    int idx = (int)ceil(rms / 0.025 - 1e-12);
    return idx < 1 ? 1 : idx > 10 ? 10 : idx;
}

pw_status pw_cs_point_test(const cs_data *d, pw_consistency_result *r)
{
    pw_ctest *t = &r->tests[PW_CTEST_POINT];
    const pw_consistency_options *o = d->opt;
    t->limit = o->point_dy_max;
    for (size_t k = 0; k <= PW_CONSISTENCY_MAX_TERMS; k++)
        r->legendre_aicc[k] = NAN;
    if (!d->ds->has_y) {
        pw_cs_not_run(t, "the data set has no y column (P-x or T-x data can be reduced, not tested)");
        return PW_OK;
    }
    size_t n = d->n_in;
    if (n < o->legendre_terms_min + 2) {
        pw_cs_not_run(t, "%zu interior points; a %zu-term Legendre fit needs at least %zu", n,
                      o->legendre_terms_min, o->legendre_terms_min + 2);
        return PW_OK;
    }
    double best_a[PW_CONSISTENCY_MAX_TERMS] = {0}, prev[PW_CONSISTENCY_MAX_TERMS] = {0};
    double best_score = INFINITY, best_ssr = NAN;
    size_t best_p = 0;
    pw_status last = PW_OK;
    for (size_t p = o->legendre_terms_min; p <= o->legendre_terms_max && n >= p + 2; p++) {
        double zero[PW_CONSISTENCY_MAX_TERMS] = {0}, a[PW_CONSISTENCY_MAX_TERMS] = {0}, ssr = INFINITY;
        double a1[PW_CONSISTENCY_MAX_TERMS], s1;
        /* two starts: ideal solution (all a_k = 0) and the previous order's answer */
        const double *starts[2] = {zero, prev};
        for (int s = 0; s < (p == o->legendre_terms_min ? 1 : 2); s++) {
            pw_status st = barker_run(d, p, starts[s], a1, &s1);
            if (st == PW_ENOMEM)
                return st;
            if (st != PW_OK) {
                last = st;
                continue;
            }
            if (s1 < ssr) {
                ssr = s1;
                memcpy(a, a1, sizeof a);
            }
        }
        if (!isfinite(ssr))
            continue;
        double dn = (double)n, dp = (double)p;
        double floor_ssr = dn * 1e-24; /* noise-free data: let the penalty decide */
        double aicc = dn * log(fmax(ssr, floor_ssr) / dn) + 2.0 * dp + 2.0 * dp * (dp + 1.0) / (dn - dp - 1.0);
        r->legendre_aicc[p] = aicc;
        double score = o->legendre_choice == PW_LEGENDRE_BY_AICC ? aicc : ssr;
        if (score < best_score) {
            best_score = score;
            best_ssr = ssr;
            best_p = p;
            memcpy(best_a, a, sizeof best_a);
        }
        for (size_t k = 0; k < PW_CONSISTENCY_MAX_TERMS; k++)
            prev[k] = k < p ? a[k] : 0.0; /* next order starts here, new term at 0 */
    }
    if (best_p == 0) {
        pw_cs_not_run(t, "the Barker fit of the Legendre series did not converge (%s)",
                      pw_strerror(last));
        return PW_OK;
    }
    r->legendre_terms = best_p;
    memcpy(r->legendre_a, best_a, sizeof r->legendre_a);
    r->legendre_rms = sqrt(best_ssr / (double)n);
    const pw_model_type *m = pw_cs_legendre_model(best_p);
    double sum_abs_dy = 0.0, sum_dl2 = 0.0;
    size_t n_y = 0;
    for (size_t i = 0; i < n; i++) {
        const cs_point *q = &d->in[i];
        pw_cpoint *pt = &r->pts[i];
        bubble_state b;
        pw_status st = bubble(d, m, best_a, q, &b, NULL);
        if (st != PW_OK) {
            pw_cs_not_run(t, "the fitted Legendre series cannot be evaluated at line %ld (%s)",
                          q->line, pw_strerror(st));
            return PW_OK;
        }
        pt->y_calc = b.y1;
        if (d->ds->kind == PW_DATA_ISOTHERMAL)
            pt->dP_rel = (b.calc - q->P_Pa) / q->P_Pa;
        else
            pt->dT_K = b.calc - q->T_K;
        if (isfinite(q->lnratio)) {
            pt->dy = b.y1 - q->y1;
            pt->dlnratio = (b.lng[0] - b.lng[1]) - q->lnratio;
            sum_abs_dy += fabs(pt->dy);
            sum_dl2 += pt->dlnratio * pt->dlnratio;
            n_y++;
        }
    }
    if (n_y == 0) {
        pw_cs_not_run(t, "no interior point has a usable y (0 < y1 < 1)");
        return PW_OK;
    }
    r->rms_dlnratio = sqrt(sum_dl2 / (double)n_y);
    r->van_ness_index = pw_consistency_van_ness_index(r->rms_dlnratio);
    t->ran = true;
    t->value = sum_abs_dy / (double)n_y;
    t->pass = t->value < t->limit;
    return PW_OK;
}

pw_status pw_cs_legendre_bubble(const cs_data *d, size_t terms, const double *a,
                                const cs_point *q, double x1, double *y1, double *calc)
{
    const pw_model_type *m = pw_cs_legendre_model(terms);
    if (!m || !(x1 > 0.0 && x1 < 1.0))
        return PW_EDOM;
    cs_point p = *q;
    p.x1 = x1;
    bubble_state b;
    pw_status st = bubble(d, m, a, &p, &b, NULL);
    if (st == PW_OK) {
        *y1 = b.y1;
        *calc = b.calc;
    }
    return st;
}
