/* Drawing parameter sets from N(theta_hat, C) or the multivariate t (docs/uncertainty.md).
 *
 * C is scaled to its correlation form R = D^-1 C D^-1 (D = diag(sqrt(C_kk))) so that the
 * definiteness tests do not depend on the parameters' units. R = L0 L0^T by Cholesky (LAPACK
 * dpotrf); when that fails (R only semi-definite, e.g. a parameter that is a linear combination
 * of others), R = V diag(lambda) V^T by dsyev and L0 = V diag(sqrt(max(lambda, 0))). The draw is
 * theta = theta_hat + sqrt(w) D L0 z with z ~ N(0, I); w = 1 for the normal, and
 * w = dof / chi^2_dof for the multivariate t (JCGM 102:2011, 6.5, from memory). */
#include "uncertainty_internal.h"

#include <pinchwise/uncertainty.h>

#include <gsl/gsl_randist.h>
#include <lapacke.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define NEG_EIG_TOL 1e-8   /* relative: eigenvalues below -tol * lambda_max are refused */
#define ZERO_EIG_TOL 1e-12 /* relative: eigenvalues below tol * lambda_max count as zero */

static pw_status factor_eigen(double *r, size_t p, double L[PW_MAX_PARAMS][PW_MAX_PARAMS],
                              size_t *rank)
{
    double w[PW_MAX_PARAMS];
    lapack_int info = LAPACKE_dsyev(LAPACK_ROW_MAJOR, 'V', 'L', (lapack_int)p, r, (lapack_int)p, w);
    if (info != 0)
        return PW_ESINGULAR;
    double wmax = w[p - 1]; /* ascending order */
    if (!(wmax > 0.0)) {
        *rank = 0;
        memset(L, 0, sizeof(double) * PW_MAX_PARAMS * PW_MAX_PARAMS);
        return wmax < 0.0 ? PW_EINVAL : PW_OK;
    }
    *rank = 0;
    for (size_t e = 0; e < p; e++) {
        if (w[e] < -NEG_EIG_TOL * wmax)
            return PW_EINVAL;
        double s = w[e] > ZERO_EIG_TOL * wmax ? sqrt(w[e]) : 0.0;
        *rank += s > 0.0;
        for (size_t i = 0; i < p; i++)
            L[i][e] = r[i * p + e] * s; /* column e of V (row-major: r[i*p + e]) */
    }
    return PW_OK;
}

pw_status pw_unc_sampler_init(pw_unc_sampler *s, const pw_system *sys,
                              const bool fitted[PW_MAX_PARAMS], const double *cov, double dof)
{
    if (!s || !sys || !sys->model || !fitted || !cov || !(dof >= 0.0) || !isfinite(dof))
        return PW_EINVAL;
    memset(s, 0, sizeof *s);
    s->model = sys->model;
    s->dof = dof;
    memcpy(s->center, sys->params, sizeof s->center);
    double d[PW_MAX_PARAMS];
    for (size_t k = 0; k < sys->model->n_params && k < PW_MAX_PARAMS; k++) {
        if (!fitted[k])
            continue;
        if (!isfinite(cov[k * PW_MAX_PARAMS + k]) || cov[k * PW_MAX_PARAMS + k] < 0.0)
            return PW_EINVAL;
        if (cov[k * PW_MAX_PARAMS + k] > 0.0) {
            d[s->p] = sqrt(cov[k * PW_MAX_PARAMS + k]);
            s->idx[s->p++] = k;
        }
    }
    const size_t p = s->p;
    if (p == 0)
        return PW_OK; /* nothing uncertain: every draw is the estimate */
    if (p > PW_MAX_PARAMS) /* cannot happen (the loop above stops there); tells the compiler */
        return PW_EINVAL;
    double r[PW_MAX_PARAMS * PW_MAX_PARAMS];
    for (size_t i = 0; i < p; i++)
        for (size_t j = 0; j < p; j++) {
            double c = cov[s->idx[i] * PW_MAX_PARAMS + s->idx[j]];
            if (!isfinite(c))
                return PW_EINVAL;
            r[i * p + j] = i == j ? 1.0 : c / (d[i] * d[j]);
        }
    double a[PW_MAX_PARAMS * PW_MAX_PARAMS];
    memcpy(a, r, sizeof(double) * p * p);
    lapack_int info = LAPACKE_dpotrf(LAPACK_ROW_MAJOR, 'L', (lapack_int)p, a, (lapack_int)p);
    double L0[PW_MAX_PARAMS][PW_MAX_PARAMS] = {{0.0}};
    if (info == 0) {
        for (size_t i = 0; i < p; i++)
            for (size_t j = 0; j <= i; j++)
                L0[i][j] = a[i * p + j];
        s->rank = p;
    } else if (info > 0) {
        s->eigen = true;
        pw_status st = factor_eigen(r, p, L0, &s->rank);
        if (st != PW_OK)
            return st;
    } else {
        return PW_EINVAL;
    }
    for (size_t i = 0; i < p; i++)
        for (size_t j = 0; j < p; j++)
            s->L[i][j] = d[i] * L0[i][j];
    return PW_OK;
}

pw_status pw_unc_sampler_draw(const pw_unc_sampler *s, gsl_rng *rng, size_t max_tries,
                              double params[PW_MAX_PARAMS], size_t *redrawn)
{
    if (!s || !rng || !params || !s->model)
        return PW_EINVAL;
    for (size_t t = 0; t <= max_tries; t++) {
        memcpy(params, s->center, sizeof s->center);
        double z[PW_MAX_PARAMS];
        for (size_t j = 0; j < s->p; j++)
            z[j] = gsl_ran_gaussian_ziggurat(rng, 1.0);
        double w = s->dof > 0.0 ? sqrt(s->dof / gsl_ran_chisq(rng, s->dof)) : 1.0;
        for (size_t i = 0; i < s->p; i++) {
            double v = 0.0;
            for (size_t j = 0; j < s->p; j++)
                v += s->L[i][j] * z[j];
            params[s->idx[i]] += w * v;
        }
        if (s->model->check(params) == PW_OK)
            return PW_OK;
        if (redrawn)
            (*redrawn)++;
    }
    return PW_EDOM;
}

pw_status pw_unc_draw_params(const pw_unc_problem *pb, unsigned long seed, size_t n,
                             double (*out)[PW_MAX_PARAMS], size_t *redrawn)
{
    if (!pb || (n > 0 && !out))
        return PW_EINVAL;
    pw_unc_sampler s;
    pw_status st = pw_unc_sampler_init(&s, &pb->sys, pb->fitted, &pb->cov[0][0], pb->dof);
    if (st != PW_OK)
        return st;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    if (!rng)
        return PW_ENOMEM;
    gsl_rng_set(rng, seed);
    size_t rej = 0, budget = 10 * n + 100;
    for (size_t i = 0; i < n && st == PW_OK; i++) {
        size_t before = rej;
        st = pw_unc_sampler_draw(&s, rng, budget, out[i], &rej);
        budget = budget > rej - before ? budget - (rej - before) : 0;
    }
    gsl_rng_free(rng);
    if (redrawn)
        *redrawn = rej;
    return st;
}

pw_status pw_unc_curve_band(const pw_unc_problem *pb, unsigned long seed, double P_Pa,
                            size_t n_curves, double x_lo, double x_hi, size_t n_x, double *x,
                            double *y)
{
    if (!pb || !pb->sys.model || !x || !y || n_x < 2 || n_curves == 0 ||
        !(x_lo >= 0.0 && x_lo < x_hi && x_hi <= 1.0) || !(P_Pa > 0.0))
        return PW_EINVAL;
    double (*draws)[PW_MAX_PARAMS] = malloc(sizeof *draws * n_curves);
    if (!draws)
        return PW_ENOMEM;
    pw_status st = pw_unc_draw_params(pb, seed, n_curves, draws, NULL);
    for (size_t j = 0; j < n_x; j++)
        x[j] = x_lo + (x_hi - x_lo) * (double)j / (double)(n_x - 1);
    for (size_t c = 0; c < n_curves && st == PW_OK; c++) {
        pw_system s = pb->sys;
        memcpy(s.params, draws[c], sizeof s.params);
        for (size_t j = 0; j < n_x; j++) {
            pw_eq_point e;
            y[c * n_x + j] = pw_bubble_T(&s, P_Pa, x[j], &e) == PW_OK ? e.y1 : (double)NAN;
        }
    }
    free(draws);
    return st;
}
