/* Azeotrope over a range of pressures (or temperatures), and where it enters or leaves the
 * composition range: the value at which ln alpha12 at a pure end crosses zero, by GSL Brent.
 * See include/pinchwise/azeotrope.h and docs/azeotrope.md (pressure dependence). */
#include <pinchwise/azeotrope.h>
#include <pinchwise/lle.h>

#include <math.h>
#include <stdlib.h>

#include "analysis/az_internal.h"
#include "base/solve1d.h"

pw_az_scan *pw_az_scan_alloc(size_t n_points)
{
    if (n_points < 2 || n_points > 100000)
        return NULL;
    pw_az_scan *sc = calloc(1, sizeof *sc);
    if (!sc)
        return NULL;
    sc->n_points = n_points;
    sc->max_boundaries = 3 * n_points;
    sc->at = calloc(n_points, sizeof *sc->at);
    sc->points = calloc(n_points, sizeof *sc->points);
    sc->boundaries = calloc(sc->max_boundaries, sizeof *sc->boundaries);
    sc->three_phase = calloc(n_points, sizeof *sc->three_phase);
    sc->three_phase_known = calloc(n_points, sizeof *sc->three_phase_known);
    if (!sc->at || !sc->points || !sc->boundaries || !sc->three_phase || !sc->three_phase_known) {
        pw_az_scan_free(sc);
        return NULL;
    }
    return sc;
}

pw_status pw_az_T_range(const pw_az_result *r, const pw_az_scan *scan, double *T_lo_K,
                        double *T_hi_K)
{
    if (!r || !T_lo_K || !T_hi_K || (scan && scan->n_points && !scan->points))
        return PW_EINVAL;
    double lo = isfinite(r->T_lo_K) ? r->T_lo_K : (double)INFINITY;
    double hi = isfinite(r->T_hi_K) ? r->T_hi_K : -(double)INFINITY;
    for (size_t k = 0; scan && k < scan->n_points; k++) {
        if (isfinite(scan->points[k].T_lo_K))
            lo = fmin(lo, scan->points[k].T_lo_K);
        if (isfinite(scan->points[k].T_hi_K))
            hi = fmax(hi, scan->points[k].T_hi_K);
    }
    if (!(lo <= hi))
        return PW_EINVAL;
    *T_lo_K = lo;
    *T_hi_K = hi;
    return PW_OK;
}

void pw_az_scan_free(pw_az_scan *scan)
{
    if (!scan)
        return;
    free(scan->at);
    free(scan->points);
    free(scan->boundaries);
    free(scan->three_phase);
    free(scan->three_phase_known);
    free(scan);
}

typedef struct end_ctx {
    const pw_system *s;
    pw_az_mode mode;
    int end;
    pw_status status;
} end_ctx;

static pw_status end_fn(void *params, double v, double *f)
{
    end_ctx *c = params;
    pw_status st = pw_az_end_ln_alpha(c->s, c->mode, v, c->end, f, NULL, NULL);
    if (st != PW_OK && c->status == PW_OK)
        c->status = st;
    return st;
}

/* Brent on the scanned variable v in [a, b] for ln alpha12(end; v) = 0. */
static pw_status locate(const pw_system *s, pw_az_mode mode, int end, double a, double b,
                        const pw_az_options *o, double *v)
{
    end_ctx c = {s, mode, end, PW_OK};
    /* relative tolerance on P or T: 1e-12 is far below any Antoine uncertainty */
    pw_solve1d_opts so = pw_solve1d_default_opts();
    so.xtol_abs = 0.0;
    so.xtol_rel = 1e-12;
    so.max_iter = o->max_iter > 100000 ? 100000u : (unsigned)o->max_iter;
    return pw_root1d(end_fn, &c, fmin(a, b), fmax(a, b), NAN, NAN, &so, v, NULL);
}

static pw_status add_boundary(const pw_system *s, pw_az_mode mode, pw_az_scan *sc, size_t k,
                              int end, const pw_az_options *o)
{
    if (sc->n_boundaries >= sc->max_boundaries)
        return PW_OK;
    double v = sc->at[k + 1];
    pw_status st = PW_OK;
    if (sc->points[k + 1].ln_alpha_end[end] != 0.0)
        st = locate(s, mode, end, sc->at[k], sc->at[k + 1], o, &v);
    if (st != PW_OK)
        return st;
    pw_az_boundary *b = &sc->boundaries[sc->n_boundaries++];
    b->at = v;
    b->end = end;
    b->kind = PW_AZ_BOUNDARY_PURE_END;
    b->status = PW_OK;
    b->bracket[0] = b->bracket[1] = b->x_layers[0] = b->x_layers[1] = b->y3 = NAN;
    b->layer = -1;
    double f;
    st = pw_az_end_ln_alpha(s, mode, v, end, &f, &b->T_K, &b->P_Pa);
    if (st != PW_OK)
        return st;
    /* which side of `at` holds more azeotropes (when the crossing falls on point k+1, compare
     * its neighbours k and k+2) */
    size_t ia = k, ib = k + 1;
    if (sc->points[k + 1].ln_alpha_end[end] == 0.0 && k + 2 < sc->n_points)
        ib = k + 2;
    size_t lo = sc->at[ia] < sc->at[ib] ? ia : ib, hi = lo == ia ? ib : ia;
    b->present_above = sc->points[hi].n > sc->points[lo].n;
    return PW_OK;
}

pw_status pw_azeotrope_scan(const pw_system *s, pw_az_mode mode, double from, double to,
                            const pw_az_options *opt, pw_az_scan *scan)
{
    if (!s || !scan || !scan->at || !scan->points || scan->n_points < 2 || !(from > 0.0) ||
        !(to > 0.0) || !isfinite(from) || !isfinite(to) || from == to ||
        (mode != PW_AZ_ISOBARIC && mode != PW_AZ_ISOTHERMAL))
        return PW_EINVAL;
    pw_az_options o = opt ? *opt : pw_azeotrope_default_options();
    const size_t n = scan->n_points;
    scan->mode = mode;
    scan->n_boundaries = 0;
    scan->x1_shift = NAN;
    for (size_t k = 0; k < n; k++) {
        double t = (double)k / (double)(n - 1);
        scan->at[k] = mode == PW_AZ_ISOBARIC ? from * pow(to / from, t) : from + (to - from) * t;
        pw_az_result_clear(&scan->points[k], mode, scan->at[k]);
    }
    scan->at[n - 1] = to;
    for (size_t k = 0; k < n; k++) {
        /* a model that splits: the three-phase layers at the point are left out of the search,
         * as pw_azeotrope_search does (no one-liquid azeotrope lies there); the state is kept
         * for pw_azeotrope_scan_heterogeneous */
        pw_az_options ok = o;
        const pw_three_phase *tp = &scan->three_phase[k];
        scan->three_phase_known[k] =
            pw_model_can_split(s->model) &&
            pw_three_phase_at(s, (int)mode, scan->at[k], &scan->three_phase[k]) == PW_OK;
        if (scan->three_phase_known[k] && tp->exists) {
            ok.skip_x1[0] = tp->x[0];
            ok.skip_x1[1] = tp->x[1];
        }
        pw_status st = pw_azeotrope_find(s, mode, scan->at[k], &ok, &scan->points[k]);
        if (st == PW_OK && scan->progress)
            st = scan->progress(scan->progress_ctx, k + 1, n);
        if (st != PW_OK)
            return st;
    }
    double xmin = INFINITY, xmax = -INFINITY;
    size_t n_single = 0;
    for (size_t k = 0; k < n; k++) {
        if (scan->points[k].n == 1) {
            xmin = fmin(xmin, scan->points[k].az[0].x1);
            xmax = fmax(xmax, scan->points[k].az[0].x1);
            n_single++;
        }
        if (k + 1 == n)
            break;
        for (int e = 0; e < 2; e++) {
            double f0 = scan->points[k].ln_alpha_end[e], f1 = scan->points[k + 1].ln_alpha_end[e];
            /* a strict sign change, or an exact zero on point k+1 (counted once) */
            if ((f0 < 0.0 && f1 > 0.0) || (f0 > 0.0 && f1 < 0.0) || (f0 != 0.0 && f1 == 0.0)) {
                pw_status st = add_boundary(s, mode, scan, k, e, &o);
                if (st != PW_OK)
                    return st;
            }
        }
    }
    if (n_single >= 2)
        scan->x1_shift = xmax - xmin;
    return PW_OK;
}
