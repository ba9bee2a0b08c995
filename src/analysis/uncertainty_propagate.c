/* Propagation of the parameter covariance into results computed from a pw_system: the delta
 * method with central finite differences, and seeded Monte Carlo with percentile intervals.
 * Methods and sources in docs/uncertainty.md. */
#include "uncertainty_internal.h"

#include <pinchwise/uncertainty.h>

#include <gsl/gsl_cdf.h>
#include <gsl/gsl_sort.h>
#include <gsl/gsl_statistics_double.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define MC_MIN_FEASIBLE 20 /* fewer feasible draws give no sampled interval */
#define FD_HALVINGS 4      /* a step leaving the domain or the feasible region is halved */

pw_unc_options pw_unc_default_options(void)
{
    pw_unc_options o = {.samples = 400, .seed = 1, .linearised = true, .fd_step = 0.05,
                        .level = 0.95, .disagree_frac = 0.25, .max_redraws = 0};
    return o;
}

pw_status pw_unc_problem_from_fit(pw_unc_problem *pb, const pw_fit_result *fit, pw_unc_fn fn,
                                  void *ctx, size_t n_out)
{
    if (!pb || !fit || !fit->sys.model || !fn || n_out == 0 || n_out > PW_UNC_MAX_OUTPUTS)
        return PW_EINVAL;
    memset(pb, 0, sizeof *pb);
    pb->sys = fit->sys;
    memcpy(pb->fitted, fit->fitted, sizeof pb->fitted);
    memcpy(pb->cov, fit->cov, sizeof pb->cov);
    pb->dof = (double)fit->dof;
    pb->fn = fn;
    pb->ctx = ctx;
    pb->n_out = n_out;
    return PW_OK;
}

double pw_unc_delta_sd(const double grad[PW_MAX_PARAMS], const bool fitted[PW_MAX_PARAMS],
                       const double *cov)
{
    double v = 0.0;
    for (size_t i = 0; i < PW_MAX_PARAMS; i++)
        for (size_t j = 0; j < PW_MAX_PARAMS; j++)
            if (fitted[i] && fitted[j])
                v += grad[i] * cov[i * PW_MAX_PARAMS + j] * grad[j];
    return v > 0.0 ? sqrt(v) : 0.0;
}

/* The function at a full parameter vector; PW_EDOM outside the model's domain. */
static pw_status eval_at(const pw_unc_problem *pb, const double *params, double *out)
{
    pw_system s = pb->sys;
    memcpy(s.params, params, sizeof s.params);
    pw_status st = s.model->check(s.params);
    return st != PW_OK ? st : pb->fn(pb->ctx, &s, out);
}

static double quantile_two_sided(double level, double dof)
{
    double p = 0.5 * (1.0 + level);
    return dof > 0.0 ? gsl_cdf_tdist_Pinv(p, dof) : gsl_cdf_ugaussian_Pinv(p);
}

/* Gradient of every output by central differences, step h_k = fd_step * sqrt(C_kk). */
static pw_status linearise(const pw_unc_problem *pb, const pw_unc_options *o, pw_unc_result *res)
{
    const size_t m = pb->n_out;
    for (size_t k = 0; k < pb->sys.model->n_params; k++) {
        if (!pb->fitted[k] || !(pb->cov[k][k] > 0.0))
            continue;
        double h = o->fd_step * sqrt(pb->cov[k][k]);
        pw_status st = PW_OK;
        double fp[PW_UNC_MAX_OUTPUTS], fm[PW_UNC_MAX_OUTPUTS];
        for (int tries = 0; tries <= FD_HALVINGS; tries++, h *= 0.5) {
            double pp[PW_MAX_PARAMS], pm[PW_MAX_PARAMS];
            memcpy(pp, pb->sys.params, sizeof pp);
            memcpy(pm, pb->sys.params, sizeof pm);
            pp[k] += h;
            pm[k] -= h;
            st = eval_at(pb, pp, fp);
            if (st == PW_OK)
                st = eval_at(pb, pm, fm);
            if (st == PW_OK)
                break;
        }
        if (st != PW_OK)
            return st;
        for (size_t i = 0; i < m; i++)
            res->out[i].grad[k] = (fp[i] - fm[i]) / (2.0 * h);
    }
    double q = quantile_two_sided(o->level, pb->dof);
    for (size_t i = 0; i < m; i++) {
        pw_unc_output *u = &res->out[i];
        u->sd_lin = pw_unc_delta_sd(u->grad, pb->fitted, &pb->cov[0][0]);
        u->ci_lin[0] = u->value - q * u->sd_lin;
        u->ci_lin[1] = u->value + q * u->sd_lin;
        u->lin_ok = isfinite(u->sd_lin);
    }
    return PW_OK;
}

/* Draws, evaluates and summarises. vals holds n_out columns of samples values each. */
static pw_status sample(const pw_unc_problem *pb, const pw_unc_options *o, pw_unc_result *res)
{
    const size_t n = o->samples, m = pb->n_out;
    pw_unc_sampler s;
    pw_status st = pw_unc_sampler_init(&s, &pb->sys, pb->fitted, &pb->cov[0][0], pb->dof);
    if (st != PW_OK)
        return st;
    res->sampler_eigen = s.eigen;
    res->rank = s.rank;
    double *vals = malloc(sizeof(double) * n * m);
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    if (!vals || !rng) {
        free(vals);
        gsl_rng_free(rng);
        return PW_ENOMEM;
    }
    gsl_rng_set(rng, o->seed);
    size_t budget = o->max_redraws ? o->max_redraws : 10 * n + 100;
    for (size_t d = 0; d < n; d++) {
        double params[PW_MAX_PARAMS], out[PW_UNC_MAX_OUTPUTS];
        size_t before = res->n_redrawn;
        st = pw_unc_sampler_draw(&s, rng, budget, params, &res->n_redrawn);
        budget -= res->n_redrawn - before < budget ? res->n_redrawn - before : budget;
        if (st != PW_OK)
            break;
        res->n_samples++;
        pw_status fs = eval_at(pb, params, out);
        if (fs == PW_OK) {
            for (size_t i = 0; i < m; i++)
                vals[i * n + res->n_feasible] = out[i];
            res->n_feasible++;
        } else if (fs == PW_EINFEASIBLE) {
            res->n_infeasible++;
        } else {
            res->n_failed++;
        }
        if (o->progress && (st = o->progress(o->progress_ctx, d + 1, n)) != PW_OK)
            break;
    }
    gsl_rng_free(rng);
    if (st != PW_OK) {
        free(vals);
        return st;
    }
    size_t decided = res->n_feasible + res->n_infeasible;
    res->p_feasible = decided ? (double)res->n_feasible / (double)decided : (double)NAN;
    const size_t nf = res->n_feasible;
    for (size_t i = 0; i < m && nf > 0; i++) {
        pw_unc_output *u = &res->out[i];
        double *v = vals + i * n;
        size_t k = 0;
        for (size_t j = 0; j < nf; j++)
            if (isfinite(v[j]))
                v[k++] = v[j];
        u->n_mc = k;
        if (k < MC_MIN_FEASIBLE)
            continue;
        u->mean_mc = gsl_stats_mean(v, 1, k);
        u->sd_mc = k > 1 ? gsl_stats_sd_m(v, 1, k, u->mean_mc) : 0.0;
        gsl_sort(v, 1, k);
        double a = 0.5 * (1.0 - o->level);
        u->ci_mc[0] = gsl_stats_quantile_from_sorted_data(v, 1, k, a);
        u->ci_mc[1] = gsl_stats_quantile_from_sorted_data(v, 1, k, 1.0 - a);
        u->mc_ok = true;
    }
    free(vals);
    return PW_OK;
}

static pw_status check(const pw_unc_problem *pb, const pw_unc_options *o)
{
    if (!pb || !pb->sys.model || !pb->fn || pb->n_out == 0 || pb->n_out > PW_UNC_MAX_OUTPUTS ||
        !(pb->dof >= 0.0))
        return PW_EINVAL;
    if (!(o->level > 0.0 && o->level < 1.0) || !(o->fd_step > 0.0 && o->fd_step <= 1.0) ||
        !(o->disagree_frac > 0.0) || (!o->linearised && o->samples == 0))
        return PW_EINVAL;
    return PW_OK;
}

pw_status pw_unc_propagate(const pw_unc_problem *pb, const pw_unc_options *opt,
                           pw_unc_result *res)
{
    if (!res)
        return PW_EINVAL;
    const pw_unc_options o = opt ? *opt : pw_unc_default_options();
    memset(res, 0, sizeof *res);
    res->p_feasible = NAN;
    pw_status st = check(pb, &o);
    if (st != PW_OK)
        return st;
    res->n_out = pb->n_out;
    for (size_t i = 0; i < PW_UNC_MAX_OUTPUTS; i++) {
        pw_unc_output *u = &res->out[i];
        u->value = u->sd_lin = u->mean_mc = u->sd_mc = NAN;
        u->ci_lin[0] = u->ci_lin[1] = u->ci_mc[0] = u->ci_mc[1] = u->ci[0] = u->ci[1] = NAN;
    }
    double v[PW_UNC_MAX_OUTPUTS];
    res->point_status = eval_at(pb, pb->sys.params, v);
    if (res->point_status != PW_OK && res->point_status != PW_EINFEASIBLE)
        return res->point_status;
    if (res->point_status == PW_OK)
        for (size_t i = 0; i < pb->n_out; i++)
            res->out[i].value = v[i];
    res->lin_status = !o.linearised                    ? PW_EINVAL
                      : res->point_status != PW_OK ? PW_EINFEASIBLE
                                                   : linearise(pb, &o, res);
    if (o.samples > 0 && (st = sample(pb, &o, res)) != PW_OK)
        return st;
    for (size_t i = 0; i < pb->n_out; i++) {
        pw_unc_output *u = &res->out[i];
        if (u->lin_ok && u->mc_ok) {
            double w = u->ci_mc[1] - u->ci_mc[0];
            double tol = o.disagree_frac * w;
            u->disagree = fabs(u->ci_lin[0] - u->ci_mc[0]) > tol ||
                          fabs(u->ci_lin[1] - u->ci_mc[1]) > tol;
        }
        u->ci_sampled = u->mc_ok && (u->disagree || !u->lin_ok);
        const double *c = u->ci_sampled ? u->ci_mc : u->ci_lin;
        u->ci[0] = c[0];
        u->ci[1] = c[1];
    }
    return PW_OK;
}
