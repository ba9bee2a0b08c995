/* Kojima, Moon & Ochi (1990) tests. Two functions of the data are smoothed separately by
 * polynomials in x1: g/(x1 x2) (degree 3) and ln(gamma1/gamma2) (degree 3 or 4, as the area
 * test). Infinite-dilution test:
 *     I1 = 100 |(G(0) - R(0)) / R(0)|,   I2 = 100 |(G(1) + R(1)) / R(1)|
 * with G the smoothed g/(x1 x2) and R the smoothed ln(gamma1/gamma2); both must be below 30.
 * Slope point test (isothermal data only): the slope of the smoothed g, s = d(x1 x2 G)/dx1,
 * against ln(gamma1/gamma2) of each point, d = 100 sum |s - r| / sum |r| (this implementation's
 * reading of the "mean percentage deviation"; see docs/consistency.md), below 5. */
#include "consistency_internal.h"

#include <math.h>
#include <stdlib.h>

pw_status pw_cs_dilution_tests(const cs_data *d, pw_consistency_result *r)
{
    pw_ctest *ti = &r->tests[PW_CTEST_DILUTION], *ts = &r->tests[PW_CTEST_SLOPE];
    ti->limit = d->opt->dilution_I_max;
    ts->limit = d->opt->slope_d_max;
    r->I1 = r->I2 = r->lngamma1_inf = r->lngamma2_inf = NAN;
    if (!d->ds->has_y) {
        pw_cs_not_run(ti, "the data set has no y column");
        pw_cs_not_run(ts, "the data set has no y column");
        return PW_OK;
    }
    double *x, *lr, *gx;
    size_t n;
    if (pw_cs_gamma_arrays(d, &x, &lr, &gx, &n) != PW_OK)
        return PW_ENOMEM;
    int deg_r = pw_cs_smoothing_degree(n), deg_g = deg_r < 0 ? -1 : 3;
    double cg[8], cr[8];
    pw_status st = PW_OK;
    if (deg_r < 0) {
        pw_cs_not_run(ti, "%zu interior points with y; at least 5 are needed", n);
        pw_cs_not_run(ts, "%zu interior points with y; at least 5 are needed", n);
        goto done;
    }
    st = pw_cs_polyfit(x, gx, n, deg_g, cg);
    if (st == PW_OK)
        st = pw_cs_polyfit(x, lr, n, deg_r, cr);
    if (st != PW_OK) {
        pw_cs_not_run(ti, "smoothing failed (%s)", pw_strerror(st));
        pw_cs_not_run(ts, "smoothing failed (%s)", pw_strerror(st));
        st = PW_OK;
        goto done;
    }
    /* slope point test */
    if (d->ds->kind != PW_DATA_ISOTHERMAL) {
        pw_cs_not_run(ts, "isobaric data: the slope test would need H^E (not applied to isobaric "
                          "sets, as in Kang et al. 2010)");
    } else {
        double num = 0.0, den = 0.0, vmax = 0.0;
        for (size_t i = 0; i < n; i++) {
            vmax = fmax(vmax, fabs(lr[i]));
            double G = pw_cs_polyval(cg, deg_g, x[i]);
            double dG = 0.0;
            for (int j = deg_g; j >= 1; j--)
                dG = dG * x[i] + (double)j * cg[j];
            double s = (1.0 - 2.0 * x[i]) * G + x[i] * (1.0 - x[i]) * dG;
            num += fabs(s - lr[i]);
            den += fabs(lr[i]);
        }
        if (!(den > pw_cs_rounding_level(n, vmax))) {
            /* ln(gamma1/gamma2) at rounding level everywhere (exactly ideal data): the ratio of
             * sums is a ratio of rounding errors; the slopes agree to working precision. */
            r->slope_at_rounding = true;
            ts->ran = true;
            ts->value = 0.0;
            ts->pass = ts->value < ts->limit;
        } else {
            ts->ran = true;
            ts->value = 100.0 * num / den;
            ts->pass = ts->value < ts->limit;
        }
    }
    /* infinite-dilution test */
    double xmin = x[0], xmax = x[0];
    for (size_t i = 1; i < n; i++)
        xmin = fmin(xmin, x[i]), xmax = fmax(xmax, x[i]);
    if (xmin > 0.1 || xmax < 0.9) {
        pw_cs_not_run(ti, "the data reach x1 = %.3g..%.3g; the extrapolation to infinite dilution "
                          "needs points at x1 <= 0.1 and x1 >= 0.9", xmin, xmax);
        goto done;
    }
    double G0 = pw_cs_polyval(cg, deg_g, 0.0), G1 = pw_cs_polyval(cg, deg_g, 1.0);
    double R0 = pw_cs_polyval(cr, deg_r, 0.0), R1 = pw_cs_polyval(cr, deg_r, 1.0);
    r->lngamma1_inf = G0;
    r->lngamma2_inf = G1;
    double lim = d->opt->dilution_min_lngamma;
    if (fabs(R0) < lim || fabs(R1) < lim) {
        pw_cs_not_run(ti, "|ln gamma_inf| from ln(gamma1/gamma2) is %.3g and %.3g, below %.3g: the "
                          "ratio I is ill-conditioned for nearly ideal systems", fabs(R0), fabs(R1), lim);
        goto done;
    }
    r->I1 = 100.0 * fabs((G0 - R0) / R0);
    r->I2 = 100.0 * fabs((G1 + R1) / R1);
    ti->ran = true;
    ti->value = fmax(r->I1, r->I2);
    ti->pass = r->I1 < ti->limit && r->I2 < ti->limit;
done:
    free(x), free(lr), free(gx);
    return st;
}
