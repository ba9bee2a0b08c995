/* What a fit's data say beyond its parameters: the two liquids the data show (their three-phase
 * points) and the ranges a later calculation should stay inside (the components' vapor-pressure
 * ranges and the fitted data's temperatures). Commands render these; they compute nothing. */
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

pw_status pw_fit_range_check(const pw_fit_result *r, double T_lo_K, double T_hi_K,
                             pw_range_check *out)
{
    if (!r || !out || !isfinite(T_lo_K) || !isfinite(T_hi_K) || T_lo_K > T_hi_K)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->T_lo_K = T_lo_K;
    out->T_hi_K = T_hi_K;
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &r->sys.comp[i];
        out->below_K[i] = fmax(0.0, -pw_component_range_excess_K(c, T_lo_K));
        out->above_K[i] = fmax(0.0, pw_component_range_excess_K(c, T_hi_K));
    }
    out->data_T_min_K = r->T_min_K;
    out->data_T_max_K = r->T_max_K;
    out->outside_data = isfinite(r->T_min_K) && isfinite(r->T_max_K) &&
                        (T_lo_K < r->T_min_K - PW_RANGE_DATA_MARGIN_K ||
                         T_hi_K > r->T_max_K + PW_RANGE_DATA_MARGIN_K);
    return PW_OK;
}

bool pw_range_check_any(const pw_range_check *c)
{
    return c && (c->outside_data || c->below_K[0] > 0.0 || c->below_K[1] > 0.0 ||
                 c->above_K[0] > 0.0 || c->above_K[1] > 0.0);
}
