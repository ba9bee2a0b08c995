/* Model risk: the same result from every model fitted to the same data, grouped by the one
 * ranking rule of include/pinchwise/assess.h (sound fits by AICc; Burnham & Anderson 2002 classes;
 * Akaike weights over the considered fits). Unsound fits count as dropped here. */
#include <pinchwise/assess.h>
#include <pinchwise/uncertainty.h>

#include <math.h>
#include <string.h>

static pw_unc_model_class unc_class(pw_rank_class c)
{
    switch (c) {
    case PW_RANK_BEST:
        return PW_UNC_MODEL_BEST;
    case PW_RANK_EQUAL:
        return PW_UNC_MODEL_EQUAL;
    case PW_RANK_CONSIDERED:
        return PW_UNC_MODEL_CONSIDERED;
    default:
        return PW_UNC_MODEL_DROPPED;
    }
}

pw_status pw_unc_compare_models(const pw_fit_result *const *fits, size_t n, pw_unc_fn fn,
                                void *ctx, size_t n_out, pw_unc_models *out)
{
    if (!fits || !fn || !out || n == 0 || n > PW_UNC_MAX_MODELS || n > PW_RANK_MAX || n_out == 0 ||
        n_out > PW_UNC_MAX_OUTPUTS)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    pw_ranking rk;
    pw_status st = pw_rank_fits(fits, n, &rk);
    if (st != PW_OK)
        return st;
    if (rk.rows[0].cls != PW_RANK_BEST)
        return PW_EINVAL; /* no sound fit to compare against */
    out->n = n;
    out->n_out = n_out;
    out->best = rk.rows[0].index;
    for (size_t j = 0; j < n_out; j++) {
        out->lo[j] = INFINITY;
        out->hi[j] = -INFINITY;
    }
    bool any_feasible = false, any_infeasible = false;
    for (size_t k = 0; k < n; k++) {
        const pw_rank_row *w = &rk.rows[k];
        pw_unc_model_row *r = &out->rows[w->index];
        r->model = w->fit->sys.model;
        r->aicc = isfinite(w->fit->aicc) ? w->fit->aicc : (double)INFINITY;
        r->delta_aicc = isfinite(w->delta_aicc) ? w->delta_aicc : (double)INFINITY;
        r->cls = unc_class(w->cls);
        r->weight = w->weight;
        for (size_t j = 0; j < PW_UNC_MAX_OUTPUTS; j++)
            r->out[j] = NAN;
        double v[PW_UNC_MAX_OUTPUTS];
        r->status = w->fit->sys.model->check(w->fit->sys.params);
        if (r->status == PW_OK)
            r->status = fn(ctx, &w->fit->sys, v);
        if (r->status == PW_OK)
            memcpy(r->out, v, sizeof(double) * n_out);
        if (r->cls == PW_UNC_MODEL_DROPPED)
            continue;
        out->n_considered++;
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
    if (out->n_considered_ok == 0)
        for (size_t j = 0; j < n_out; j++)
            out->lo[j] = out->hi[j] = NAN;
    out->feasibility_differs = any_feasible && any_infeasible;
    return PW_OK;
}
