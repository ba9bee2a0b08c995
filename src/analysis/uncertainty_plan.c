/* Measurement planning: which range of x1, measured with more points, narrows the linearised
 * interval of a result most. Information adds (Bates & Watts 1988, sec. 2.1; Seber & Wild 1989,
 * sec. 5.13 on design): with s^2 the fit's chi2_red and J_new the weighted Jacobian rows of the
 * hypothetical points, C_new = (C^-1 + J_new^T J_new / s^2)^-1, and the result's standard
 * deviation becomes sqrt(g^T C_new g) (g from pw_unc_propagate). Nothing is refitted: the
 * prediction assumes the new points agree with the current model. */
#include <pinchwise/uncertainty.h>

#include "fit/fit_design.h"

#include <lapacke.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

/* In-place inverse of the symmetric positive-definite p x p matrix a (row-major, lda p). */
static pw_status spd_inverse(double *a, size_t p)
{
    lapack_int n = (lapack_int)p;
    if (LAPACKE_dpotrf(LAPACK_ROW_MAJOR, 'L', n, a, n) != 0)
        return PW_ESINGULAR;
    if (LAPACKE_dpotri(LAPACK_ROW_MAJOR, 'L', n, a, n) != 0)
        return PW_ESINGULAR;
    for (size_t i = 0; i < p; i++)
        for (size_t j = i + 1; j < p; j++)
            a[i * p + j] = a[j * p + i];
    return PW_OK;
}

/* The planned covariance for one bin; out in the full space. */
static pw_status bin_covariance(const pw_fit_result *fit, const size_t *idx, size_t p,
                                const double *cinv, double x_lo, double x_hi, size_t m,
                                double cov[PW_MAX_PARAMS][PW_MAX_PARAMS])
{
    pw_point pts[64];
    if (m > sizeof pts / sizeof pts[0])
        return PW_EINVAL;
    for (size_t j = 0; j < m; j++) {
        double x = x_lo + (x_hi - x_lo) * ((double)j + 0.5) / (double)m;
        pw_status st = fit_hypothetical_point(fit, x, &pts[j]);
        if (st != PW_OK)
            return st;
    }
    double info[PW_MAX_PARAMS][PW_MAX_PARAMS];
    pw_status st = fit_information(fit, pts, m, info);
    if (st != PW_OK)
        return st;
    const double s2 = fit->chi2_red > 0.0 ? fit->chi2_red : 1.0;
    double a[PW_MAX_PARAMS * PW_MAX_PARAMS];
    for (size_t i = 0; i < p; i++)
        for (size_t j = 0; j < p; j++)
            a[i * p + j] = cinv[i * p + j] + info[idx[i]][idx[j]] / s2;
    st = spd_inverse(a, p);
    if (st != PW_OK)
        return st;
    memset(cov, 0, sizeof(double) * PW_MAX_PARAMS * PW_MAX_PARAMS);
    for (size_t i = 0; i < p; i++)
        for (size_t j = 0; j < p; j++)
            cov[idx[i]][idx[j]] = a[i * p + j];
    return PW_OK;
}

pw_status pw_unc_plan_measurements(const pw_fit_result *fit, const double grad[PW_MAX_PARAMS],
                                   size_t n_bins, size_t points_per_bin, pw_unc_plan *out)
{
    if (!fit || !fit->sys.model || !grad || !out || n_bins < 2 || n_bins > PW_UNC_MAX_BINS ||
        points_per_bin == 0 || points_per_bin > 64)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->n_bins = n_bins;
    out->points_per_bin = points_per_bin;
    size_t idx[PW_MAX_PARAMS], p = 0;
    for (size_t k = 0; k < fit->sys.model->n_params; k++)
        if (fit->fitted[k])
            idx[p++] = k;
    if (p == 0)
        return PW_EINVAL;
    double cinv[PW_MAX_PARAMS * PW_MAX_PARAMS];
    for (size_t i = 0; i < p; i++)
        for (size_t j = 0; j < p; j++)
            cinv[i * p + j] = fit->cov[idx[i]][idx[j]];
    pw_status st = spd_inverse(cinv, p);
    if (st != PW_OK)
        return st;
    out->sd_now = pw_unc_delta_sd(grad, fit->fitted, &fit->cov[0][0]);
    double best = -INFINITY;
    for (size_t b = 0; b < n_bins; b++) {
        pw_unc_plan_bin *bin = &out->bins[b];
        bin->x_lo = (double)b / (double)n_bins;
        bin->x_hi = (double)(b + 1) / (double)n_bins;
        bin->sd_new = bin->reduction = NAN;
        double cov[PW_MAX_PARAMS][PW_MAX_PARAMS];
        st = bin_covariance(fit, idx, p, cinv, bin->x_lo, bin->x_hi, points_per_bin, cov);
        if (st == PW_ENOMEM)
            return st;
        if (st != PW_OK)
            continue; /* a bin where the model cannot be evaluated is not recommended */
        bin->ok = true;
        bin->sd_new = pw_unc_delta_sd(grad, fit->fitted, &cov[0][0]);
        bin->reduction = out->sd_now > 0.0 ? 1.0 - bin->sd_new / out->sd_now : 0.0;
        if (bin->reduction > best) {
            best = bin->reduction;
            out->best = b;
            out->have_best = true;
        }
    }
    return PW_OK;
}

const char *pw_unc_plan_words(const pw_unc_plan *plan, const char *quantity, char *buf,
                              size_t len)
{
    if (!buf || len == 0)
        return buf;
    buf[0] = '\0';
    const char *q = quantity ? quantity : "the result";
    if (!plan || !plan->have_best || !(plan->sd_now > 0.0)) {
        snprintf(buf, len, "no composition range was found where more points would narrow the "
                           "interval of %s", q);
        return buf;
    }
    const pw_unc_plan_bin *b = &plan->bins[plan->best];
    snprintf(buf, len,
             "measuring %zu more points with x1 between %.2f and %.2f would narrow the interval "
             "of %s most: its standard deviation would fall by about %.0f %% (from %.3g to %.3g), "
             "if the new points agree with the present fit",
             plan->points_per_bin, b->x_lo, b->x_hi, q, 100.0 * b->reduction, plan->sd_now,
             b->sd_new);
    return buf;
}
