/* evidence score (weighting after Kang et al.). Structure from Kang et al. (2010, J. Chem. Eng. Data 55:3631):
 *     Q = F_pure x (F_area + F_point + F_slope + F_dilution),  each F between 0.025 and 0.25
 * (0.25 when the test passes), so the sum lies in 0.1..1.
 * This implementation's reading, not confirmed against the paper ([M]):
 *   F = 0.25 when the test passes, else 0.25 x limit/value, bounded below by 0.025; for the
 *   dilution test F = 0.25 x 60/(I1 + I2) within the same bounds (METHODS 4.8 reading);
 *   a test that did not run contributes 0.025 (no credit);
 *   isobaric data: the slope test is not applied (Kang et al.), the other three factors are
 *   summed and scaled by 4/3;
 *   F_pure = 1 when the endpoint test passes, else max(0.1, limit/value); 1 when the data
 *   hold no pure-component rows (not penalised, stated in the note). */
#include "consistency_internal.h"

#include <math.h>
#include <stdio.h>

static double factor(const pw_ctest *t)
{
    if (!t->ran)
        return 0.025;
    if (t->pass)
        return 0.25;
    double f = t->value > 0.0 ? 0.25 * t->limit / t->value : 0.025;
    return fmin(0.25, fmax(0.025, f));
}

void pw_cs_quality(const cs_data *d, pw_consistency_result *r)
{
    pw_cquality *q = &r->quality;
    const pw_ctest *area = &r->tests[d->ds->kind == PW_DATA_ISOTHERMAL ? PW_CTEST_AREA
                                                                       : PW_CTEST_HERINGTON];
    const pw_ctest *dil = &r->tests[PW_CTEST_DILUTION], *end = &r->tests[PW_CTEST_ENDPOINT];
    q->ran = d->ds->has_y;
    if (!q->ran) {
        q->F_area = q->F_point = q->F_slope = q->F_dilution = q->F_pure = q->Q = NAN;
        snprintf(q->note, sizeof q->note, "no y column: the Gibbs-Duhem tests cannot run");
        return;
    }
    q->F_area = factor(area);
    q->F_point = factor(&r->tests[PW_CTEST_POINT]);
    q->F_dilution = 0.025;
    if (dil->ran) {
        double s = r->I1 + r->I2;
        q->F_dilution = s > 0.0 ? fmin(0.25, fmax(0.025, 0.25 * 60.0 / s)) : 0.25;
        if (dil->pass)
            q->F_dilution = 0.25;
    }
    q->slope_used = d->ds->kind == PW_DATA_ISOTHERMAL;
    double sum = q->F_area + q->F_point + q->F_dilution;
    if (q->slope_used) {
        q->F_slope = factor(&r->tests[PW_CTEST_SLOPE]);
        sum += q->F_slope;
    } else {
        q->F_slope = NAN;
        sum *= 4.0 / 3.0;
    }
    if (!end->ran)
        q->F_pure = 1.0;
    else if (end->pass)
        q->F_pure = 1.0;
    else
        q->F_pure = fmax(0.1, end->limit / end->value);
    q->Q = q->F_pure * sum;
    snprintf(q->note, sizeof q->note, "weighting after Kang et al. (2010); part formulas "
             "are this implementation's reading%s%s",
             q->slope_used ? "" : "; isobaric: slope test not applied, sum scaled by 4/3",
             end->ran ? "" : "; no pure-component rows: F_pure taken as 1");
}
