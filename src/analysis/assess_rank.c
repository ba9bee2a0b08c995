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
static bool is_sound(const pw_fit_result *r)
{
    bool measured_split = r->n_three_phase > 0 || r->n_tie_lines > 0;
    return r->converged && (!r->split || measured_split) && isfinite(r->aicc);
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
        r->az_status = pw_azeotrope_find(&f->sys, iso ? PW_AZ_ISOTHERMAL : PW_AZ_ISOBARIC,
                                         iso ? f->T_fixed_K : f->P_fixed_Pa, NULL, &r->az);
        if (col)
            solve_column(r, col);
        if (r->cls > PW_RANK_CONSIDERED)
            continue;
        if (r->az_status == PW_OK) {
            if (r->az.n == 0)
                without++;
            else {
                with++;
                xlo = fmin(xlo, r->az.az[0].x1);
                xhi = fmax(xhi, r->az.az[0].x1);
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
