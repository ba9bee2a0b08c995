/* The point test against stated uncertainties (docs/consistency.md, "Stated uncertainties").
 *
 * Van Ness, Byer & Gibbs (1973) judge the point test's residuals by whether they "scatter about
 * zero with a size matching the experimental error"; with stated standard uncertainties this is
 * made quantitative in two ways, both at the one-sided confidence point_confidence (0.99):
 *
 * 1. legendre_point: for consistent data with Gaussian errors each dy_k = y_calc - y_exp has
 *    standard deviation s_k = sqrt(sigma_y^2 + (dy_calc/dx1 sigma_x)^2 + g_k^T C g_k), the last
 *    term the uncertainty of y_calc from the Barker fit (g_k = dy_calc,k/da, C = (J^T W J)^-1
 *    the covariance of the Legendre coefficients with weights W = 1/u_k^2 below, a-priori
 *    variance factor 1; Bates & Watts 1988 ch. 2), so |dy_k| is half-normal
 *    with mean sqrt(2/pi) s_k and variance (1 - 2/pi) s_k^2 (a standard result); the mean of n
 *    of them is then below  s (sqrt(2/pi) + z sqrt((1 - 2/pi)/n)),  s the mean s_k, z the normal
 *    quantile, with the chosen confidence (central limit theorem). The limit is the smaller of
 *    this and the classic 0.01 (Fredenslund et al. 1977), so stated uncertainties can only
 *    tighten the test.
 * 2. point_scatter: chi2 = sum_k (dy_k/s_k)^2 + sum_k (r_k/u_k)^2, r_k the Barker residual
 *    (T_calc - T, or (P_calc - P)/P) and u_k = sqrt(sigma_T^2 + (dT_calc/dx1 sigma_x)^2) (or the
 *    relative sigma_P likewise), with dof = n_y + n - m (y is not fitted; m Legendre terms are);
 *    value sqrt(chi2/dof) (the Birge ratio), limit sqrt(chi2_p(dof)/dof) (GSL's chi-square
 *    quantile).
 * The slopes dy_calc/dx1 and dT_calc/dx1 are central differences of the fitted series (step 1e-6)
 * and are needed only when sigma_x is stated; otherwise x is taken as exact. J and g_k are
 * central differences in the coefficients (step 1e-6 max(1, |a_j|)); C is inverted by Cholesky
 * (LAPACK dpotrf/dpotri). */
#include "consistency_internal.h"

#include <gsl/gsl_cdf.h>
#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#ifndef M_PI
#define M_PI 3.14159265358979323846
#endif

static double pick(double option, bool stated, double from_file)
{
    if (!isnan(option))
        return option;
    return stated ? from_file : (double)NAN;
}

/* Sensitivities of the Barker residual (calc in K, or relative P) and of y_calc to each Legendre
 * coefficient at point q, by central differences. */
static pw_status coef_derivs(const cs_data *d, const pw_consistency_result *r, const cs_point *q,
                             double *dres, double *dy)
{
    size_t m = r->legendre_terms;
    double a[PW_CONSISTENCY_MAX_TERMS];
    memcpy(a, r->legendre_a, sizeof a);
    double scale = d->ds->kind == PW_DATA_ISOTHERMAL ? 1.0 / q->P_Pa : 1.0;
    for (size_t j = 0; j < m; j++) {
        double h = 1e-6 * fmax(1.0, fabs(a[j])), yp, ym, cp, cm;
        double aj = a[j];
        a[j] = aj + h;
        pw_status st = pw_cs_legendre_bubble(d, m, a, q, q->x1, &yp, &cp);
        a[j] = aj - h;
        if (st == PW_OK)
            st = pw_cs_legendre_bubble(d, m, a, q, q->x1, &ym, &cm);
        a[j] = aj;
        if (st != PW_OK)
            return st;
        dres[j] = (cp - cm) / (2.0 * h) * scale;
        dy[j] = (yp - ym) / (2.0 * h);
    }
    return PW_OK;
}

pw_status pw_cs_scatter_test(const cs_data *d, pw_consistency_result *r)
{
    const pw_consistency_options *o = d->opt;
    const pw_dataset *ds = d->ds;
    pw_ctest *t = &r->tests[PW_CTEST_SCATTER];
    pw_ctest *pt = &r->tests[PW_CTEST_POINT];
    t->limit = NAN;
    if (!ds->has_y) {
        pw_cs_not_run(t,
                      "the data set has no y column (P-x or T-x data can be reduced, not tested)");
        return PW_OK;
    }
    double sy = pick(o->sigma_y, ds->sigma_y_stated, ds->sigma_y);
    if (!isfinite(sy)) {
        pw_cs_not_run(t,
                      "no sigma_y stated (a '# sigma_y:' line or check --sigma-y): the point "
                      "test keeps the classic limit %.3g",
                      o->point_dy_max);
        return PW_OK;
    }
    r->uncertainty_based = true;
    double sx = pick(o->sigma_x, ds->sigma_x_stated, ds->sigma_x);
    if (!isfinite(sx))
        sx = 0.0;
    double sT = isnan(o->sigma_T_K) ? ds->sigma_T_K : o->sigma_T_K;
    double sP = isnan(o->sigma_P_rel) ? ds->sigma_P_rel : o->sigma_P_rel; /* NAN: absolute */
    r->sigma_y_used = sy;
    r->sigma_x_used = sx;
    r->sigma_T_used_K = ds->kind == PW_DATA_ISOBARIC ? sT : (double)NAN;
    r->sigma_P_used_rel = ds->kind == PW_DATA_ISOTHERMAL ? sP : (double)NAN;
    if (!pt->ran) {
        pw_cs_not_run(t, "the point test did not run (%s)", pt->why_not);
        return PW_OK;
    }
    bool isothermal = ds->kind == PW_DATA_ISOTHERMAL;
    size_t m = r->legendre_terms, n = d->n_in;
    double *buf = calloc(n * (2 * m + 3) + 1, sizeof(double));
    if (!buf)
        return PW_ENOMEM;
    double *Jr = buf, *G = Jr + n * m, *u = G + n * m, *dydx = u + n, *ures = dydx + n;
    pw_status st = PW_OK;
    /* pass 1: slopes in x, sensitivities, the residual uncertainties u_k */
    for (size_t i = 0; i < n && st == PW_OK; i++) {
        const cs_point *q = &d->in[i];
        double dcdx = 0.0;
        if (sx > 0.0) {
            double h = 1e-6, ya, yb, ca, cb;
            double xa = fmax(q->x1 - h, 0.5 * q->x1), xb = fmin(q->x1 + h, 0.5 * (1.0 + q->x1));
            st = pw_cs_legendre_bubble(d, m, r->legendre_a, q, xa, &ya, &ca);
            if (st == PW_OK)
                st = pw_cs_legendre_bubble(d, m, r->legendre_a, q, xb, &yb, &cb);
            dydx[i] = (yb - ya) / (xb - xa);
            dcdx = (cb - ca) / (xb - xa) / (isothermal ? q->P_Pa : 1.0);
        }
        if (st == PW_OK)
            st = coef_derivs(d, r, q, &Jr[i * m], &G[i * m]);
        double u0 = isothermal ? (isfinite(sP) ? sP : ds->sigma_P_abs_Pa / q->P_Pa) : sT;
        ures[i] = sqrt(u0 * u0 + dcdx * dcdx * sx * sx);
        (void)u;
        if (st != PW_OK)
            pw_cs_not_run(t, "the fitted Legendre series cannot be evaluated beside line %ld (%s)",
                          q->line, pw_strerror(st));
    }
    /* covariance of the coefficients: C = (J^T W J)^-1 */
    double C[PW_CONSISTENCY_MAX_TERMS * PW_CONSISTENCY_MAX_TERMS] = {0};
    bool have_C = false;
    if (st == PW_OK) {
        for (size_t j = 0; j < m; j++)
            for (size_t k = 0; k < m; k++) {
                double s = 0.0;
                for (size_t i = 0; i < n; i++)
                    s += Jr[i * m + j] * Jr[i * m + k] / (ures[i] * ures[i]);
                C[j * m + k] = s;
            }
        have_C = LAPACKE_dpotrf(LAPACK_ROW_MAJOR, 'U', (lapack_int)m, C, (lapack_int)m) == 0 &&
                 LAPACKE_dpotri(LAPACK_ROW_MAJOR, 'U', (lapack_int)m, C, (lapack_int)m) == 0;
        for (size_t j = 0; have_C && j < m; j++)
            for (size_t k = 0; k < j; k++)
                C[j * m + k] = C[k * m + j]; /* dpotri fills the upper triangle */
    }
    if (st != PW_OK) {
        free(buf);
        return PW_OK;
    }
    double chi2 = 0.0, sum_s = 0.0;
    size_t n_y = 0, n_r = 0;
    for (size_t i = 0; i < n; i++) {
        const pw_cpoint *p = &r->pts[i];
        double res = isothermal ? p->dP_rel : p->dT_K;
        if (isfinite(res)) {
            chi2 += (res / ures[i]) * (res / ures[i]);
            n_r++;
        }
        if (isfinite(p->dy)) {
            double vfit = 0.0;
            for (size_t j = 0; have_C && j < m; j++)
                for (size_t k = 0; k < m; k++)
                    vfit += G[i * m + j] * C[j * m + k] * G[i * m + k];
            double s = sqrt(sy * sy + dydx[i] * dydx[i] * sx * sx + fmax(vfit, 0.0));
            chi2 += (p->dy / s) * (p->dy / s);
            sum_s += s;
            n_y++;
        }
    }
    free(buf);
    if (n_y == 0) {
        pw_cs_not_run(t, "no point has a usable y");
        return PW_OK;
    }
    double z = gsl_cdf_ugaussian_Pinv(o->point_confidence);
    double s_mean = sum_s / (double)n_y;
    r->point_dy_limit_sigma =
        s_mean * (sqrt(2.0 / M_PI) + z * sqrt((1.0 - 2.0 / M_PI) / (double)n_y));
    pt->limit = fmin(o->point_dy_max, r->point_dy_limit_sigma);
    pt->pass = pt->value < pt->limit;
    size_t dof = n_y + (n_r > m ? n_r - m : 0);
    r->scatter_chi2 = chi2;
    r->scatter_dof = dof;
    t->ran = true;
    t->value = sqrt(chi2 / (double)dof);
    t->limit = sqrt(gsl_cdf_chisq_Pinv(o->point_confidence, (double)dof) / (double)dof);
    t->pass = t->value < t->limit;
    return PW_OK;
}
