/* The report's uncertainty content: the column results under the fit's parameter covariance with
 * the measurement plan (pw_unc_column_assess), the azeotropes' intervals (pw_unc_azeo_assess), and
 * a band of equilibrium curves drawn from the same covariance near the limiting pinch
 * (pw_unc_curve_band). See docs/uncertainty.md and docs/report.md. */
#include "report/report_internal.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

#define PLAN_BINS 10   /* as the reflux command: ten bins of x1 ... */
#define PLAN_POINTS 5  /* ... of five hypothetical points each */

/* The window of the band: pinch x +/- PW_REPORT_BAND_HALF, clipped to the products' range. */
static void band_window(const pw_report_curves *c, double *lo, double *hi)
{
    double xp = c->dc.col.pinch.x;
    *lo = fmax(fmin(c->spec.xb, c->spec.xd), xp - PW_REPORT_BAND_HALF);
    *hi = fmin(fmax(c->spec.xb, c->spec.xd), xp + PW_REPORT_BAND_HALF);
}

static pw_status band(pw_report_curves *c, const pw_report_input *in, pw_unc_column_ctx *col)
{
    c->band_status = PW_EINVAL;
    if (!c->dc.drawn || !isfinite(c->dc.col.pinch.x))
        return PW_OK;
    double lo, hi;
    band_window(c, &lo, &hi);
    if (!(hi > lo))
        return PW_OK;
    size_t n = in->band_curves ? in->band_curves : PW_REPORT_BAND_CURVES;
    c->band_y = malloc(sizeof *c->band_y * n * PW_REPORT_BAND_NX);
    if (!c->band_y)
        return PW_ENOMEM;
    pw_unc_problem pb;
    pw_status st = pw_unc_problem_from_fit(&pb, c->fit, pw_unc_column_fn, col, PW_UNC_COLUMN_NOUT);
    if (st == PW_OK)
        st = pw_unc_curve_band(&pb, c->unc_opt.seed, c->P_col_Pa, n, lo, hi, PW_REPORT_BAND_NX,
                               c->band_x, c->band_y);
    if (st == PW_ENOMEM)
        return st;
    c->band_status = st;
    if (st != PW_OK)
        return PW_OK;
    double xs[PW_REPORT_BAND_NX];
    st = pw_draw_curve_window(&c->fit->sys, c->P_col_Pa, lo, hi, PW_REPORT_BAND_NX, xs,
                              c->band_best);
    if (st != PW_OK) {
        c->band_status = st;
        return PW_OK;
    }
    c->band_n = n;
    c->band_lo = lo;
    c->band_hi = hi;
    return PW_OK;
}

/* Intervals of the azeotropes of one table: only when the table came from the azeotrope module
 * (the same list, in the same order). */
static pw_status azeo(const pw_report_curves *c, const pw_az_result *r, bool ok,
                      pw_unc_result *res, pw_status *status)
{
    *status = PW_EINVAL;
    if (!ok || r->n == 0)
        return PW_OK;
    pw_az_result head = *r;
    if (head.n > PW_REPORT_MAX_AZ)
        head.n = PW_REPORT_MAX_AZ;
    *status = pw_unc_azeo_assess(c->fit, &head, &c->unc_opt, res, NULL);
    return *status == PW_ENOMEM ? PW_ENOMEM : PW_OK;
}

pw_status pw_report_unc_compute(pw_report_curves *c, const pw_report_input *in)
{
    c->unc = true;
    c->unc_opt = in->unc;
    c->unc_col_status = PW_EINVAL;
    c->band_status = PW_EINVAL;
    pw_status st = azeo(c, &c->phase.az.found, c->phase.az.status == PW_OK, c->unc_az,
                        &c->unc_az_status);
    if (st == PW_OK && c->column)
        st = azeo(c, &c->xy.az.found, c->xy.az.status == PW_OK, c->unc_col_az,
                  &c->unc_col_az_status);
    if (st != PW_OK || !c->column)
        return st;
    pw_unc_column_ctx col = pw_unc_column_ctx_make(c->P_col_Pa, &c->spec);
    col.factor = c->factor;
    c->unc_factor = c->factor;
    c->unc_col_status = pw_unc_column_assess(c->fit, &col, &c->unc_opt, PLAN_BINS, PLAN_POINTS,
                                             &c->unc_col);
    if (c->unc_col_status == PW_ENOMEM)
        return PW_ENOMEM;
    return band(c, in, &col);
}
