/* Model risk: the same result from every model fitted to the same data, grouped by the AICc
 * difference to the best (Burnham & Anderson 2002, sec. 2.6: delta < 2 substantial support,
 * 4-7 considerably less, > 10 essentially none). Akaike weights w_i = exp(-delta_i/2) / sum over
 * the considered models. */
#include <pinchwise/uncertainty.h>

#include <math.h>
#include <string.h>

#define DELTA_EQUAL 2.0
#define DELTA_CONSIDERED 10.0

static bool same_data(const pw_fit_result *a, const pw_fit_result *b)
{
    if (a->n_residuals != b->n_residuals || a->objective != b->objective)
        return false;
    if (a->dataset_sha256[0] && b->dataset_sha256[0])
        return strcmp(a->dataset_sha256, b->dataset_sha256) == 0;
    return true;
}

pw_status pw_unc_compare_models(const pw_fit_result *const *fits, size_t n, pw_unc_fn fn,
                                void *ctx, size_t n_out, pw_unc_models *out)
{
    if (!fits || !fn || !out || n == 0 || n > PW_UNC_MAX_MODELS || n_out == 0 ||
        n_out > PW_UNC_MAX_OUTPUTS)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->n = n;
    out->n_out = n_out;
    for (size_t i = 0; i < n; i++) {
        if (!fits[i] || !fits[i]->sys.model || !same_data(fits[i], fits[0]))
            return PW_EINVAL;
        out->rows[i].model = fits[i]->sys.model;
        out->rows[i].aicc = isfinite(fits[i]->aicc) ? fits[i]->aicc : (double)INFINITY;
        if (out->rows[i].aicc < out->rows[out->best].aicc)
            out->best = i;
    }
    if (!isfinite(out->rows[out->best].aicc))
        return PW_EINVAL; /* no model has a usable AICc */
    double wsum = 0.0;
    for (size_t j = 0; j < n_out; j++) {
        out->lo[j] = INFINITY;
        out->hi[j] = -INFINITY;
    }
    bool any_feasible = false, any_infeasible = false;
    for (size_t i = 0; i < n; i++) {
        pw_unc_model_row *r = &out->rows[i];
        r->delta_aicc = r->aicc - out->rows[out->best].aicc;
        r->cls = i == out->best                      ? PW_UNC_MODEL_BEST
                 : r->delta_aicc < DELTA_EQUAL       ? PW_UNC_MODEL_EQUAL
                 : r->delta_aicc < DELTA_CONSIDERED  ? PW_UNC_MODEL_CONSIDERED
                                                     : PW_UNC_MODEL_DROPPED;
        for (size_t j = 0; j < PW_UNC_MAX_OUTPUTS; j++)
            r->out[j] = NAN;
        double v[PW_UNC_MAX_OUTPUTS];
        r->status = fits[i]->sys.model->check(fits[i]->sys.params);
        if (r->status == PW_OK)
            r->status = fn(ctx, &fits[i]->sys, v);
        if (r->status == PW_OK)
            memcpy(r->out, v, sizeof(double) * n_out);
        if (r->cls == PW_UNC_MODEL_DROPPED)
            continue;
        out->n_considered++;
        wsum += exp(-0.5 * r->delta_aicc);
        any_feasible |= r->status == PW_OK;
        any_infeasible |= r->status == PW_EINFEASIBLE;
        if (r->status != PW_OK)
            continue;
        out->n_considered_ok++;
        for (size_t j = 0; j < n_out; j++) {
            out->lo[j] = fmin(out->lo[j], r->out[j]);
            out->hi[j] = fmax(out->hi[j], r->out[j]);
        }
    }
    for (size_t i = 0; i < n; i++) {
        pw_unc_model_row *r = &out->rows[i];
        r->weight = r->cls == PW_UNC_MODEL_DROPPED ? 0.0 : exp(-0.5 * r->delta_aicc) / wsum;
    }
    if (out->n_considered_ok == 0)
        for (size_t j = 0; j < n_out; j++)
            out->lo[j] = out->hi[j] = NAN;
    out->feasibility_differs = any_feasible && any_infeasible;
    return PW_OK;
}
