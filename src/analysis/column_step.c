/* Stage-by-stage stepping on the x-y diagram (McCabe & Thiele 1925), total condenser and
 * partial reboiler (the reboiler is the last stage), fractional last step. See docs/column.md. */
#include "analysis/staircase_internal.h"

#include <math.h>

static bool spec_ok(const pw_column_spec *s)
{
    return s && isfinite(s->q) && s->xb >= 0.0 && s->xb < s->zf && s->zf < s->xd && s->xd <= 1.0;
}

pw_status pw_column_step_ws(pw_column_ws *w, const pw_column_spec *s, bool total, double R,
                            size_t max_stages, double *stages, int *feed_stage)
{
    return pw_column_step_trace_ws(w, s, total, R, max_stages, stages, feed_stage, NULL);
}

pw_status pw_column_step_trace_ws(pw_column_ws *w, const pw_column_spec *s, bool total, double R,
                                  size_t max_stages, double *stages, int *feed_stage,
                                  pw_stair_trace *trace)
{
    const double xd = s->xd, xb = s->xb;
    double m = 1.0, sl = 1.0, xi = NAN;
    if (!total) {
        double S = pw_column_boilup(s, R);
        if (!(R >= 0.0) || !isfinite(R) || !(S > 0.0))
            return PW_EINVAL; /* no reflux, or no boil-up: not a two-section column */
        m = R / (R + 1.0);
        sl = (S + 1.0) / S;
        /* Where the operating lines cross (on the q-line): optimal feed location. */
        xi = ((1.0 - m) * xd + (sl - 1.0) * xb) / (sl - m);
    }
    double x_prev = xd, y = xd;
    int feed = 0;
    pw_stair_trace_add(trace, xd, xd);
    for (size_t n = 1; n <= max_stages; n++) {
        double x;
        pw_status st = pw_column_x_of_y(w, y, xb, &x);
        if (st != PW_OK)
            return st;
        pw_stair_trace_add(trace, x, y);
        if (x <= xb) {
            *stages = (double)(n - 1) + (x_prev - xb) / (x_prev - x);
            if (feed_stage)
                *feed_stage = feed ? feed : (int)n;
            return PW_OK;
        }
        if (!(x < x_prev))
            return PW_EINFEASIBLE; /* the operating line lies on or above the curve here */
        if (total) {
            y = x;
        } else {
            if (!feed && x < xi)
                feed = (int)n;
            y = feed ? sl * x - (sl - 1.0) * xb : m * x + (1.0 - m) * xd;
        }
        pw_stair_trace_add(trace, x, y);
        x_prev = x;
    }
    return PW_EMAXITER;
}

pw_status pw_column_step(const pw_curve *curve, const pw_column_spec *spec, double R,
                         size_t max_stages, double *stages, int *feed_stage)
{
    if (!curve || !curve->y_of_x || !spec_ok(spec) || !stages || !feed_stage || max_stages == 0)
        return PW_EINVAL;
    pw_column_ws w = {0};
    pw_status st = pw_column_ws_init(&w, curve, 1e-10);
    if (st != PW_OK)
        return st;
    st = pw_column_step_ws(&w, spec, false, R, max_stages, stages, feed_stage);
    pw_column_ws_free(&w);
    return st;
}

pw_status pw_column_total_reflux(const pw_curve *curve, double xd, double xb, size_t max_stages,
                                 double *stages)
{
    if (!curve || !curve->y_of_x || !stages || max_stages == 0 || !(xb >= 0.0 && xb < xd) ||
        !(xd <= 1.0))
        return PW_EINVAL;
    /* The feed plays no part at total reflux; any zf between the products will do. */
    pw_column_spec s = {.xd = xd, .xb = xb, .zf = 0.5 * (xd + xb), .q = 1.0};
    pw_column_ws w = {0};
    pw_status st = pw_column_ws_init(&w, curve, 1e-10);
    if (st != PW_OK)
        return st;
    st = pw_column_step_ws(&w, &s, true, INFINITY, max_stages, stages, NULL);
    pw_column_ws_free(&w);
    return st;
}
