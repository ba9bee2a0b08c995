/* What a fit's data say beyond its parameters: the two liquids the data show (their three-phase
 * points) and the ranges a later calculation should stay inside (the components' vapor-pressure
 * ranges and the fitted data's temperatures), and the temperature spans the checks take (a data
 * set's, a stage profile's). Commands render these; they compute nothing. */
#include <pinchwise/dataset.h>
#include <pinchwise/design.h>
#include <pinchwise/fit.h>

#include <math.h>
#include <string.h>

pw_measured_split pw_fit_measured_split(const pw_fit_result *r)
{
    pw_measured_split m;
    memset(&m, 0, sizeof m);
    if (!r || !r->pts)
        return m;
    double T = 0.0, P = 0.0;
    m.x_lo = INFINITY;
    m.x_hi = -INFINITY;
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_fit_point *p = &r->pts[i];
        if (!p->three_phase || !isfinite(p->meas.x1))
            continue;
        m.n++;
        m.x_lo = fmin(m.x_lo, p->meas.x1);
        m.x_hi = fmax(m.x_hi, p->meas.x1);
        T += p->meas.T_K;
        P += p->meas.P_Pa;
    }
    if (m.n == 0) {
        memset(&m, 0, sizeof m);
        return m;
    }
    m.T_K = T / (double)m.n;
    m.P_Pa = P / (double)m.n;
    return m;
}

/* Widens [*lo, *hi] to hold v when v is finite (start from lo = INFINITY, hi = -INFINITY). */
static void widen(double v, double *lo, double *hi)
{
    if (isfinite(v)) {
        *lo = fmin(*lo, v);
        *hi = fmax(*hi, v);
    }
}

/* PW_OK with the span when some value was finite; PW_EINVAL otherwise. */
static pw_status span_out(double lo, double hi, double *T_lo_K, double *T_hi_K)
{
    if (!(lo <= hi))
        return PW_EINVAL;
    *T_lo_K = lo;
    *T_hi_K = hi;
    return PW_OK;
}

pw_status pw_dataset_T_range(const pw_dataset *ds, double *T_lo_K, double *T_hi_K)
{
    if (!ds || !T_lo_K || !T_hi_K || (ds->n && !ds->pts))
        return PW_EINVAL;
    double lo = INFINITY, hi = -INFINITY;
    for (size_t i = 0; i < ds->n; i++)
        widen(ds->pts[i].T_K, &lo, &hi);
    return span_out(lo, hi, T_lo_K, T_hi_K);
}

pw_status pw_profile_T_range(const pw_profile *p, double *T_lo_K, double *T_hi_K)
{
    if (!p || !T_lo_K || !T_hi_K || (p->n && !p->stage))
        return PW_EINVAL;
    double lo = INFINITY, hi = -INFINITY;
    for (size_t i = 0; i < p->n; i++)
        widen(p->stage[i].T_K, &lo, &hi);
    return span_out(lo, hi, T_lo_K, T_hi_K);
}

static bool range_ok(double T_lo_K, double T_hi_K)
{
    return isfinite(T_lo_K) && isfinite(T_hi_K) && T_lo_K <= T_hi_K;
}

/* below_K, above_K of the components' vapor-pressure ranges (0 inside). */
static void vapor_ranges(const pw_component *const c[2], double T_lo_K, double T_hi_K,
                         pw_range_check *out)
{
    for (int i = 0; i < 2; i++) {
        out->below_K[i] = fmax(0.0, -pw_component_range_excess_K(c[i], T_lo_K));
        out->above_K[i] = fmax(0.0, pw_component_range_excess_K(c[i], T_hi_K));
    }
}

pw_status pw_component_range_check(const pw_component *c1, const pw_component *c2,
                                   double T_lo_K, double T_hi_K, pw_range_check *out)
{
    if (!c1 || !c2 || !out || !range_ok(T_lo_K, T_hi_K))
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->T_lo_K = T_lo_K;
    out->T_hi_K = T_hi_K;
    const pw_component *c[2] = {c1, c2};
    vapor_ranges(c, T_lo_K, T_hi_K, out);
    out->outside_data = false;
    out->data_T_min_K = out->data_T_max_K = NAN;
    return PW_OK;
}

pw_status pw_fit_range_check_margin(const pw_fit_result *r, double T_lo_K, double T_hi_K,
                                    double margin_K, pw_range_check *out)
{
    if (!r || !out || !range_ok(T_lo_K, T_hi_K) || !(margin_K >= 0.0) || !isfinite(margin_K))
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->T_lo_K = T_lo_K;
    out->T_hi_K = T_hi_K;
    const pw_component *c[2] = {&r->sys.comp[0], &r->sys.comp[1]};
    vapor_ranges(c, T_lo_K, T_hi_K, out);
    out->data_T_min_K = r->T_min_K;
    out->data_T_max_K = r->T_max_K;
    out->outside_data = isfinite(r->T_min_K) && isfinite(r->T_max_K) &&
                        (T_lo_K < r->T_min_K - margin_K || T_hi_K > r->T_max_K + margin_K);
    return PW_OK;
}

pw_status pw_fit_range_check(const pw_fit_result *r, double T_lo_K, double T_hi_K,
                             pw_range_check *out)
{
    return pw_fit_range_check_margin(r, T_lo_K, T_hi_K, PW_RANGE_DATA_MARGIN_K, out);
}

pw_status pw_fit_range_check_ends(const pw_fit_result *r, double T_top_K, double T_bottom_K,
                                  double margin_K, pw_range_check ends[2], pw_range_check *span)
{
    if (!r || !ends || !span || !(margin_K >= 0.0) || !isfinite(margin_K))
        return PW_EINVAL;
    const double T[2] = {T_top_K, T_bottom_K};
    double lo = INFINITY, hi = -INFINITY;
    widen(T[0], &lo, &hi);
    widen(T[1], &lo, &hi);
    if (span_out(lo, hi, &lo, &hi) != PW_OK)
        return PW_EINVAL;
    for (int k = 0; k < 2; k++) {
        if (isfinite(T[k])) {
            pw_status st = pw_fit_range_check(r, T[k], T[k], &ends[k]);
            if (st != PW_OK)
                return st;
        } else {
            memset(&ends[k], 0, sizeof ends[k]);
            ends[k].T_lo_K = ends[k].T_hi_K = NAN;
            ends[k].data_T_min_K = r->T_min_K;
            ends[k].data_T_max_K = r->T_max_K;
        }
    }
    return pw_fit_range_check_margin(r, lo, hi, margin_K, span);
}

bool pw_range_check_any(const pw_range_check *c)
{
    return c && (c->outside_data || c->below_K[0] > 0.0 || c->below_K[1] > 0.0 ||
                 c->above_K[0] > 0.0 || c->above_K[1] > 0.0);
}
