/* Area tests: Redlich & Kister (1948) for isothermal data and Herington (1947, 1951) for
 * isobaric data. ln(gamma1/gamma2) from the data is smoothed by a polynomial in x1 (degree 3
 * for 5-7 points, 4 for 8 or more), integrated over [0, 1] piecewise between its real roots:
 * A = area above the axis, B = |area below|, D = 100 |A - B| / (A + B). */
#include "consistency_internal.h"

#include <math.h>
#include <stdlib.h>

/* D of the smoothed ln(gamma1/gamma2); PW_ETOOFEW when the data have too few points. */
static pw_status area_D(const cs_data *d, pw_consistency_result *r, double *D, pw_ctest *t)
{
    double *x, *lr, *gx;
    size_t n;
    if (pw_cs_gamma_arrays(d, &x, &lr, &gx, &n) != PW_OK)
        return PW_ENOMEM;
    int deg = pw_cs_smoothing_degree(n);
    pw_status st = PW_OK;
    if (deg < 0) {
        pw_cs_not_run(t, "%zu interior points with y; the area test needs at least 5", n);
        st = PW_ETOOFEW;
    } else {
        double c[8], A, B;
        st = pw_cs_polyfit(x, lr, n, deg, c);
        if (st == PW_OK)
            st = pw_cs_poly_areas(c, deg, &A, &B);
        if (st == PW_OK) {
            r->area_A = A;
            r->area_B = B;
            r->area_degree = deg;
            /* Areas at rounding level (exactly ideal data: ln(gamma1/gamma2) ~ 1e-16 everywhere)
             * make D = 100 |A - B|/(A + B) a ratio of rounding errors: D is then 0, the data
             * balance to working precision. */
            double vmax = 0.0;
            for (size_t i = 0; i < n; i++)
                vmax = fmax(vmax, fabs(lr[i]));
            r->areas_at_rounding = !(A + B > pw_cs_rounding_level(1, vmax));
            *D = r->areas_at_rounding ? 0.0 : 100.0 * fabs(A - B) / (A + B);
        } else {
            pw_cs_not_run(t, "smoothing ln(gamma1/gamma2) failed (%s)", pw_strerror(st));
        }
    }
    free(x), free(lr), free(gx);
    return st;
}

pw_status pw_cs_area_test(const cs_data *d, pw_consistency_result *r)
{
    pw_ctest *t = &r->tests[PW_CTEST_AREA];
    t->limit = d->opt->area_D_max;
    if (!d->ds->has_y) {
        pw_cs_not_run(t, "the data set has no y column");
        return PW_OK;
    }
    if (d->ds->kind != PW_DATA_ISOTHERMAL) {
        pw_cs_not_run(t, "isobaric data: the area is not zero at constant P (herington applies)");
        return PW_OK;
    }
    double D;
    pw_status st = area_D(d, r, &D, t);
    if (st == PW_ENOMEM)
        return st;
    if (st == PW_OK) {
        t->ran = true;
        t->value = D;
        t->pass = D < t->limit;
    }
    return PW_OK;
}

pw_status pw_cs_herington_test(const cs_data *d, pw_consistency_result *r)
{
    pw_ctest *t = &r->tests[PW_CTEST_HERINGTON];
    t->limit = d->opt->herington_max;
    if (!d->ds->has_y) {
        pw_cs_not_run(t, "the data set has no y column");
        return PW_OK;
    }
    if (d->ds->kind != PW_DATA_ISOBARIC) {
        pw_cs_not_run(t, "isothermal data: the Herington test is for isobaric data (rk_area applies)");
        return PW_OK;
    }
    double D;
    pw_status st = area_D(d, r, &D, t);
    if (st == PW_ENOMEM)
        return st;
    if (st != PW_OK)
        return PW_OK;
    /* theta over the whole system: every measured T and the pure boiling points at P */
    double Tmin = INFINITY, Tmax = -INFINITY;
    for (size_t i = 0; i < d->ds->n; i++) {
        Tmin = fmin(Tmin, d->ds->pts[i].T_K);
        Tmax = fmax(Tmax, d->ds->pts[i].T_K);
    }
    for (int c = 0; c < 2; c++) {
        double Tb;
        if (pw_tsat(d->comp[c], d->ds->P_fixed_Pa, &Tb) == PW_OK) {
            Tmin = fmin(Tmin, Tb);
            Tmax = fmax(Tmax, Tb);
        }
    }
    double J = 150.0 * fabs(Tmax - Tmin) / Tmin;
    r->herington_D = D;
    r->herington_J = J;
    r->herington_theta_K = Tmax - Tmin;
    r->herington_Tmin_K = Tmin;
    t->ran = true;
    t->value = D - J;
    t->pass = t->value < t->limit;
    return PW_OK;
}
