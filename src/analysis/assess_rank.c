/* Model ranking: one rule for every place that compares models (include/pinchwise/assess.h). */
#include <pinchwise/assess.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>

#include <math.h>
#include <stdlib.h>
#include <string.h>

const char *pw_rank_class_name(pw_rank_class c)
{
    switch (c) {
    case PW_RANK_BEST:
        return "best";
    case PW_RANK_EQUAL:
        return "indistinguishable";
    case PW_RANK_CONSIDERED:
        return "considered";
    case PW_RANK_DROPPED:
        return "no support";
    case PW_RANK_UNSOUND:
        return "unsound";
    case PW_RANK_FEWER:
        return "not comparable";
    }
    return "unknown";
}

static bool same_data(const pw_fit_result *a, const pw_fit_result *b)
{
    if (a->objective != b->objective)
        return false;
    if (a->dataset_sha256[0] && b->dataset_sha256[0])
        return strcmp(a->dataset_sha256, b->dataset_sha256) == 0;
    return true;
}

/* Sound: converged, a finite AICc, and no predicted liquid split unless the data themselves show
 * two liquids (three-phase points or tie lines fitted: the split is then measured, not spurious). */
bool pw_rank_split_allowed(const pw_fit_result *r)
{
    return r && (r->n_three_phase > 0 || r->n_tie_lines > 0);
}

static bool is_sound(const pw_fit_result *r)
{
    return r->converged && (!r->split || pw_rank_split_allowed(r)) && isfinite(r->aicc);
}

const char *pw_rank_rule_text(const pw_ranking *rk)
{
    bool allowed = false, fewer = false;
    for (size_t i = 0; rk && i < rk->n; i++) {
        allowed = allowed || pw_rank_split_allowed(rk->rows[i].fit);
        fewer = fewer || rk->rows[i].cls == PW_RANK_FEWER;
    }
    static const char *const text[2][2] = {
        {"sound fits first (converged, a finite AICc, no predicted liquid split: the data show "
         "one liquid), then lowest AICc",
         "sound fits first (converged, a finite AICc, no predicted liquid split: the data show "
         "one liquid), then lowest AICc; fits of fewer residuals are not comparable and rank "
         "last"},
        {"sound fits first (converged, a finite AICc; a predicted liquid split is allowed, since "
         "the data hold three-phase points or tie lines), then lowest AICc",
         "sound fits first (converged, a finite AICc; a predicted liquid split is allowed, since "
         "the data hold three-phase points or tie lines), then lowest AICc; fits of fewer "
         "residuals (a model that cannot split leaves the three-phase points out) are not "
         "comparable and rank last"},
    };
    return text[allowed][fewer];
}

size_t pw_rank_az_list(const pw_az_result *r, const pw_three_phase *tp, pw_rank_az *out)
{
    size_t n = 0;
    for (size_t k = 0; k < r->n && n < PW_AZ_MAX + 1; k++)
        out[n++] = (pw_rank_az){r->az[k].x1, r->az[k].T_K, r->az[k].P_Pa, r->az[k].kind, false};
    if (tp->exists && tp->heterogeneous_azeotrope && n < PW_AZ_MAX + 1)
        out[n++] = (pw_rank_az){tp->y1, tp->T_K, tp->P_Pa, PW_AZ_MINIMUM_BOILING, true};
    return n;
}

/* The row's azeotropes in the azeotrope command's order (include/pinchwise/assess.h). */
static void list_azeotropes(pw_rank_row *r)
{
    r->n_azs = r->az_status == PW_OK ? pw_rank_az_list(&r->az, &r->tp, r->azs) : 0;
}

/* Order: sound, then unsound, then fits of fewer residuals; by AICc within each. */
static int group(const pw_rank_row *r) { return r->cls == PW_RANK_FEWER ? 2 : r->sound ? 0 : 1; }

static int cmp_rows(const void *a, const void *b)
{
    const pw_rank_row *x = a, *y = b;
    if (group(x) != group(y))
        return group(x) - group(y);
    double ax = isfinite(x->fit->aicc) ? x->fit->aicc : (double)INFINITY;
    double ay = isfinite(y->fit->aicc) ? y->fit->aicc : (double)INFINITY;
    if (ax != ay)
        return ax < ay ? -1 : 1;
    return (x->index > y->index) - (x->index < y->index); /* stable: the caller's order */
}

pw_status pw_rank_fits(const pw_fit_result *const *fits, size_t n, pw_ranking *out)
{
    if (!fits || !out || n == 0 || n > PW_RANK_MAX)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    for (size_t i = 0; i < n; i++)
        if (!fits[i] || !fits[i]->sys.model || !same_data(fits[i], fits[0]))
            return PW_EINVAL;
    size_t most = 0;
    for (size_t i = 0; i < n; i++)
        most = fits[i]->n_residuals > most ? fits[i]->n_residuals : most;
    for (size_t i = 0; i < n; i++) {
        pw_rank_row *r = &out->rows[i];
        r->index = i;
        r->fit = fits[i];
        r->cls = fits[i]->n_residuals < most ? PW_RANK_FEWER : PW_RANK_BEST; /* refined below */
        r->sound = r->cls != PW_RANK_FEWER && is_sound(fits[i]);
        r->az_status = r->col_status = PW_EINVAL; /* not searched */
    }
    out->n = n;
    qsort(out->rows, n, sizeof out->rows[0], cmp_rows);
    double best = out->rows[0].sound ? out->rows[0].fit->aicc : (double)NAN;
    double wsum = 0.0;
    for (size_t i = 0; i < n; i++) {
        pw_rank_row *r = &out->rows[i];
        r->delta_aicc = isfinite(best) && isfinite(r->fit->aicc) && r->cls != PW_RANK_FEWER
                            ? r->fit->aicc - best
                            : (double)NAN;
        if (r->cls == PW_RANK_FEWER)
            continue;
        if (!r->sound)
            r->cls = PW_RANK_UNSOUND;
        else if (i == 0)
            r->cls = PW_RANK_BEST;
        else if (r->delta_aicc < PW_AICC_EQUAL)
            r->cls = PW_RANK_EQUAL;
        else if (r->delta_aicc < PW_AICC_CONSIDERED)
            r->cls = PW_RANK_CONSIDERED;
        else
            r->cls = PW_RANK_DROPPED;
        if (r->cls <= PW_RANK_CONSIDERED) {
            out->n_considered++;
            wsum += exp(-0.5 * r->delta_aicc);
        }
    }
    for (size_t i = 0; i < n; i++) {
        pw_rank_row *r = &out->rows[i];
        r->weight = r->cls <= PW_RANK_CONSIDERED ? exp(-0.5 * r->delta_aicc) / wsum : 0.0;
    }
    out->az_x_lo = out->az_x_hi = out->rmin_lo = out->rmin_hi = NAN;
    return PW_OK;
}

static void solve_column(pw_rank_row *r, const pw_rank_column *col)
{
    r->column = true;
    /* either direction; refused inside the two-liquid region */
    r->col_status = pw_column_solve_system(&r->fit->sys, col->P_Pa, &col->spec, NULL, &r->col,
                                           NULL, NULL);
}

pw_status pw_rank_assess(const pw_fit_result *const *fits, size_t n, const pw_rank_column *col,
                         pw_ranking *out)
{
    pw_status st = pw_rank_fits(fits, n, out);
    if (st != PW_OK)
        return st;
    double xlo = INFINITY, xhi = -INFINITY, rlo = INFINITY, rhi = -INFINITY;
    size_t with = 0, without = 0, feasible = 0, infeasible = 0;
    for (size_t i = 0; i < out->n; i++) {
        pw_rank_row *r = &out->rows[i];
        const pw_fit_result *f = r->fit;
        bool iso = f->kind == PW_DATA_ISOTHERMAL;
        r->az_status = pw_azeotrope_search(&f->sys, iso ? PW_AZ_ISOTHERMAL : PW_AZ_ISOBARIC,
                                           iso ? f->T_fixed_K : f->P_fixed_Pa, &r->az, &r->tp,
                                           NULL, NULL);
        list_azeotropes(r);
        if (col)
            solve_column(r, col);
        if (r->cls > PW_RANK_CONSIDERED)
            continue;
        if (r->az_status == PW_OK) {
            if (r->n_azs == 0)
                without++;
            else {
                with++;
                xlo = fmin(xlo, r->azs[0].x1);
                xhi = fmax(xhi, r->azs[0].x1);
            }
        }
        if (r->column && r->col_status == PW_OK) {
            if (r->col.feasible) {
                feasible++;
                rlo = fmin(rlo, r->col.r_min);
                rhi = fmax(rhi, r->col.r_min);
            } else {
                infeasible++;
            }
        }
    }
    out->az_existence_differs = with > 0 && without > 0;
    if (with > 0) {
        out->az_x_lo = xlo;
        out->az_x_hi = xhi;
        out->az_place_differs = xhi - xlo > PW_AZ_DISAGREE_X;
    }
    out->feasibility_differs = feasible > 0 && infeasible > 0;
    if (feasible > 0) {
        out->rmin_lo = rlo;
        out->rmin_hi = rhi;
        out->rmin_differs = rhi - rlo > PW_RMIN_DISAGREE_REL * rlo;
    }
    return PW_OK;
}
