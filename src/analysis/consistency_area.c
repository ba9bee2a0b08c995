/* Area tests: Redlich & Kister (1948) for isothermal data and Herington (1947, 1951) for
 * isobaric data. ln(gamma1/gamma2) from the data is smoothed by a polynomial in x1 (degree 3
 * for 5-7 points, 4 for 8 or more), integrated over [0, 1] piecewise between its real roots:
 * A = area above the axis, B = |area below|, D = 100 |A - B| / (A + B).
 * Across a two-liquid gap (three-phase points left out, options.gap_x1) each liquid branch is
 * smoothed on its own and the gap is bridged: the integral of ln(gamma1/gamma2) over
 * [x_a, x_b] is g(x_b) - g(x_a), g = G^E/RT = x1 ln gamma1 + x2 ln gamma2 (d g/dx1 =
 * ln(gamma1/gamma2) at constant T and P: exact for isothermal data; for isobaric data the
 * H^E dT part is left out, as docs/consistency.md says), measured at the one-liquid points x_a,
 * x_b beside the gap. */
#include "consistency_internal.h"

#include <math.h>
#include <stdlib.h>

/* Degree for one liquid branch of n >= 1 points: the smoothing degree, lower (interpolating,
 * a constant for one point) below 5 points. */
static int branch_degree(size_t n)
{
    return n >= 5 ? pw_cs_smoothing_degree(n) : (int)n - 1;
}

/* A and B of the branch points (x, v)[0..m) smoothed over [a, b]: fitted in t = (x - mid) /
 * half over the points' own span (well conditioned on a narrow branch), areas scaled by
 * dx = half dt. */
static pw_status branch_areas(const double *x, const double *v, size_t m, double a, double b,
                              int *deg, double *A, double *B)
{
    double lo = x[0], hi = x[0];
    for (size_t i = 1; i < m; i++)
        lo = fmin(lo, x[i]), hi = fmax(hi, x[i]);
    double mid = 0.5 * (lo + hi), half = hi > lo ? 0.5 * (hi - lo) : 1.0;
    double *t = malloc((m ? m : 1) * sizeof *t);
    if (!t)
        return PW_ENOMEM;
    for (size_t i = 0; i < m; i++)
        t[i] = (x[i] - mid) / half;
    double c[8];
    *deg = branch_degree(m);
    pw_status st = pw_cs_polyfit(t, v, m, *deg, c);
    free(t);
    if (st == PW_OK)
        st = pw_cs_poly_areas_on(c, *deg, (a - mid) / half, (b - mid) / half, A, B);
    *A *= half;
    *B *= half;
    return st;
}

/* The points (x, v) of one liquid branch, below or above cut, into (bx, bv); their count. */
static size_t branch(const double *x, const double *v, size_t n, bool below, double cut,
                     double *bx, double *bv)
{
    size_t m = 0;
    for (size_t i = 0; i < n; i++)
        if (below ? x[i] < cut : x[i] > cut)
            bx[m] = x[i], bv[m++] = v[i];
    return m;
}

/* The areas with options.gap_x1 bridged (see the top of the file); *bridged false, and nothing
 * set, when there is no gap, a branch has no point or a one-liquid point lies inside the gap. */
static pw_status bridged_areas(const cs_data *d, const double *x, const double *lr,
                               const double *gx, size_t n, pw_consistency_result *r, double *A,
                               double *B, bool *bridged)
{
    *bridged = false;
    const double *gap = d->opt->gap_x1;
    if (!(gap[0] <= gap[1]))
        return PW_OK;
    size_t na = 0, nb = 0, ia = 0, ib = 0;
    for (size_t i = 0; i < n; i++) {
        if (x[i] < gap[0]) {
            if (!na++ || x[i] > x[ia])
                ia = i;
        } else if (x[i] > gap[1]) {
            if (!nb++ || x[i] < x[ib])
                ib = i;
        } else {
            return PW_OK;
        }
    }
    if (!na || !nb)
        return PW_OK;
    double *bx = malloc(n * sizeof *bx), *bv = malloc(n * sizeof *bv);
    if (!bx || !bv) {
        free(bx), free(bv);
        return PW_ENOMEM;
    }
    double Aa = 0, Ba = 0, Ab = 0, Bb = 0;
    int deg_a = -1, deg_b = -1;
    pw_status st = branch_areas(bx, bv, branch(x, lr, n, true, gap[0], bx, bv), 0.0, x[ia],
                                &deg_a, &Aa, &Ba);
    if (st == PW_OK)
        st = branch_areas(bx, bv, branch(x, lr, n, false, gap[1], bx, bv), x[ib], 1.0, &deg_b,
                          &Ab, &Bb);
    free(bx), free(bv);
    if (st != PW_OK)
        return st;
    const double ga = gx[ia] * x[ia] * (1.0 - x[ia]), gb = gx[ib] * x[ib] * (1.0 - x[ib]);
    const double step = gb - ga;
    *A = Aa + Ab + fmax(step, 0.0);
    *B = Ba + Bb + fmax(-step, 0.0);
    r->area_degree = deg_a;
    r->area_degree_upper = deg_b;
    r->gap_bridge = step;
    r->gap_bridge_x1[0] = x[ia];
    r->gap_bridge_x1[1] = x[ib];
    *bridged = true;
    return PW_OK;
}

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
        bool bridged;
        st = bridged_areas(d, x, lr, gx, n, r, &A, &B, &bridged);
        if (st == PW_OK && !bridged) {
            st = pw_cs_polyfit(x, lr, n, deg, c);
            if (st == PW_OK)
                st = pw_cs_poly_areas(c, deg, &A, &B);
            r->area_degree = deg;
        }
        if (st == PW_OK) {
            r->area_A = A;
            r->area_B = B;
            /* Areas at rounding level (exactly ideal data: ln(gamma1/gamma2) ~ 1e-16 everywhere)
             * make D = 100 |A - B|/(A + B) a ratio of rounding errors: D is then 0, the data
             * balance to working precision. */
            double vmax = 0.0;
            for (size_t i = 0; i < n; i++)
                vmax = fmax(vmax, fabs(lr[i]));
            if (bridged)
                vmax = fmax(vmax, fabs(r->gap_bridge));
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
    for (int k = 0; k < 2; k++) /* the three-phase points left out (fmin/fmax skip NAN) */
        Tmin = fmin(Tmin, d->opt->gap_T_K[k]), Tmax = fmax(Tmax, d->opt->gap_T_K[k]);
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
