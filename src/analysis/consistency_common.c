/* Shared parts of the consistency tests: experimental activity coefficients, polynomial
 * smoothing (GSL linear least squares), polynomial areas (GSL polynomial roots), robust scale,
 * and the static description of each test. */
#include "consistency_internal.h"

#include <float.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_multifit.h>
#include <gsl/gsl_poly.h>
#include <gsl/gsl_sort.h>
#include <gsl/gsl_statistics_double.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static const struct {
    const char *name, *title, *source, *criterion, *meaning;
} descriptions[PW_CTEST_COUNT] = {
    [PW_CTEST_AREA] = {"rk_area", "Redlich-Kister area test",
                       "Redlich & Kister (1948), Ind. Eng. Chem. 40:345; Herington (1947), Nature 160:610",
                       "D = 100 |A - B| / (A + B) < limit",
                       "the areas above and below zero of ln(gamma1/gamma2) against x1 do not balance: "
                       "y or the vapor pressures carry a systematic error (errors in P are not seen by "
                       "this test)"},
    [PW_CTEST_HERINGTON] = {"herington", "Herington area test for isobaric data",
                            "Herington (1947), Nature 160:610; Herington (1951), J. Inst. Petrol. 37:457",
                            "D - J < limit, J = 150 |T_max - T_min| / T_min",
                            "the ln(gamma1/gamma2) areas differ by more than heats of mixing of the usual "
                            "size can explain: y, T or the vapor pressures are likely biased"},
    [PW_CTEST_POINT] = {"legendre_point", "Point test with a Legendre G^E fitted to P-x or T-x",
                        "Van Ness, Byer & Gibbs (1973), AIChE J. 19:238; Legendre series of "
                        "Fredenslund, Gmehling & Rasmussen (1977), Vapor-Liquid Equilibria Using "
                        "UNIFAC; Barker (1953), Aust. J. Chem. 6:207",
                        "mean |y_calc - y_exp| < limit",
                        "the measured y disagree with the y that Gibbs-Duhem implies from the measured "
                        "P-x or T-x: y (or T, P) carry systematic errors, or the vapor pressures are off"},
    [PW_CTEST_DILUTION] = {"kojima_dilution", "Infinite-dilution test",
                           "Kojima, Moon & Ochi (1990), Fluid Phase Equilib. 56:269",
                           "I1 < limit and I2 < limit (value = max(I1, I2)) [%]",
                           "g/(x1 x2) and ln(gamma1/gamma2) extrapolate to different ln gamma at "
                           "infinite dilution: the dilute-end points are inconsistent or too few"},
    [PW_CTEST_SLOPE] = {"kojima_slope", "Slope point test",
                        "Kojima, Moon & Ochi (1990), Fluid Phase Equilib. 56:269",
                        "100 sum |dg/dx1 - ln(gamma1/gamma2)| / sum |ln(gamma1/gamma2)| < limit [%]",
                        "the slope of the smoothed G^E/RT does not match ln(gamma1/gamma2) point by "
                        "point: scatter or bias in y"},
    [PW_CTEST_ENDPOINT] = {"pure_endpoints", "Pure-component end points against the vapor pressures",
                           "this project's screening thresholds (common practice, not from a published "
                           "source); pure-component check as in Kang et al. (2010), J. Chem. Eng. "
                           "Data 55:3631",
                           "max |P_meas - P_sat| / P_sat < limit (isothermal) or max |T_meas - T_sat| "
                           "< limit [K] (isobaric)",
                           "the measured pure-component points disagree with the vapor-pressure "
                           "correlation: wrong component, impure sample, calibration error, or a "
                           "correlation used outside its range; every other test inherits this error"},
    [PW_CTEST_SCATTER] = {"point_scatter", "Point-test residuals against the stated uncertainties",
                          "Van Ness, Byer & Gibbs (1973), AIChE J. 19:238 (residuals must match the "
                          "experimental error); chi-square test of residuals against stated standard "
                          "uncertainties (Bevington & Robinson 2003, Data Reduction and Error "
                          "Analysis, 3rd ed., ch. 11, from memory)",
                          "sqrt(chi2/dof) < sqrt(chi2_0.99(dof)/dof), chi2 over dy/sigma_y and the "
                          "Barker residual over sigma_T (or sigma_P)",
                          "the residuals of the point test exceed what the stated uncertainties allow: "
                          "y, T or P carry systematic errors (a thermometer offset, for instance), or "
                          "the stated uncertainties are too small"},
};

double pw_cs_rounding_level(size_t n, double vmax)
{
    return 1000.0 * (double)(n ? n : 1) * DBL_EPSILON * (1.0 + fabs(vmax));
}

void pw_cs_test_init(pw_ctest *t, pw_ctest_id id)
{
    memset(t, 0, sizeof *t);
    t->id = id;
    t->name = descriptions[id].name;
    t->title = descriptions[id].title;
    t->source = descriptions[id].source;
    t->criterion = descriptions[id].criterion;
    t->meaning = descriptions[id].meaning;
    t->value = NAN;
    t->limit = NAN;
}

void pw_cs_not_run(pw_ctest *t, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(t->why_not, sizeof t->why_not, fmt, ap);
    va_end(ap);
    t->ran = false;
    t->pass = false;
    t->value = NAN;
}

pw_status pw_cs_prepare(cs_data *d, const pw_dataset *ds, const pw_component *c1,
                        const pw_component *c2, const pw_consistency_options *opt, pw_error *err)
{
    memset(d, 0, sizeof *d);
    d->ds = ds;
    d->comp[0] = c1;
    d->comp[1] = c2;
    d->opt = opt;
    d->in = calloc(ds->n ? ds->n : 1, sizeof *d->in);
    if (!d->in)
        return pw_error_set(err, PW_ENOMEM, ds->path, 0, "out of memory");
    for (size_t i = 0; i < ds->n; i++) {
        const pw_point *p = &ds->pts[i];
        if (!(p->x1 > 0.0 && p->x1 < 1.0))
            continue;
        cs_point *q = &d->in[d->n_in];
        q->line = p->line;
        q->x1 = p->x1;
        q->y1 = ds->has_y ? p->y1 : (double)NAN;
        q->T_K = p->T_K;
        q->P_Pa = p->P_Pa;
        for (int c = 0; c < 2; c++) {
            pw_status st = pw_psat(d->comp[c], q->T_K, &q->Psat_Pa[c], &q->dlnPsat_dT[c]);
            if (st != PW_OK) {
                pw_cs_release(d);
                return pw_error_set(err, st, ds->path, p->line,
                                    "vapor pressure of %s cannot be evaluated at T = %.6g K (%s)",
                                    d->comp[c]->name, p->T_K, pw_strerror(st));
            }
        }
        q->lng[0] = q->lng[1] = q->lnratio = q->gE = NAN;
        if (isfinite(q->y1) && q->y1 > 0.0 && q->y1 < 1.0) {
            q->lng[0] = log(q->y1 * q->P_Pa / (q->x1 * q->Psat_Pa[0]));
            q->lng[1] = log((1.0 - q->y1) * q->P_Pa / ((1.0 - q->x1) * q->Psat_Pa[1]));
            q->lnratio = q->lng[0] - q->lng[1];
            q->gE = q->x1 * q->lng[0] + (1.0 - q->x1) * q->lng[1];
            d->n_gamma++;
        }
        d->n_in++;
    }
    return PW_OK;
}

void pw_cs_release(cs_data *d)
{
    if (!d)
        return;
    free(d->in);
    d->in = NULL;
    d->n_in = d->n_gamma = 0;
}

pw_status pw_cs_gamma_arrays(const cs_data *d, double **x, double **lnratio, double **g_x1x2,
                             size_t *n)
{
    size_t m = d->n_gamma ? d->n_gamma : 1;
    *x = malloc(m * sizeof **x);
    *lnratio = malloc(m * sizeof **lnratio);
    *g_x1x2 = malloc(m * sizeof **g_x1x2);
    if (!*x || !*lnratio || !*g_x1x2) {
        free(*x), free(*lnratio), free(*g_x1x2);
        *x = *lnratio = *g_x1x2 = NULL;
        return PW_ENOMEM;
    }
    size_t k = 0;
    for (size_t i = 0; i < d->n_in; i++) {
        const cs_point *q = &d->in[i];
        if (!isfinite(q->lnratio))
            continue;
        (*x)[k] = q->x1;
        (*lnratio)[k] = q->lnratio;
        (*g_x1x2)[k] = q->gE / (q->x1 * (1.0 - q->x1));
        k++;
    }
    *n = k;
    return PW_OK;
}

int pw_cs_smoothing_degree(size_t n)
{
    return n >= 8 ? 4 : n >= 5 ? 3 : -1;
}

pw_status pw_cs_polyfit(const double *x, const double *y, size_t n, int deg, double *c)
{
    if (deg < 0 || n <= (size_t)deg)
        return PW_ETOOFEW;
    size_t p = (size_t)deg + 1;
    gsl_matrix *X = gsl_matrix_alloc(n, p);
    gsl_vector *yv = gsl_vector_alloc(n), *cv = gsl_vector_alloc(p);
    gsl_matrix *cov = gsl_matrix_alloc(p, p);
    gsl_multifit_linear_workspace *w = gsl_multifit_linear_alloc(n, p);
    pw_status st = PW_ENOMEM;
    if (X && yv && cv && cov && w) {
        for (size_t i = 0; i < n; i++) {
            double v = 1.0;
            for (size_t j = 0; j < p; j++, v *= x[i])
                gsl_matrix_set(X, i, j, v);
            gsl_vector_set(yv, i, y[i]);
        }
        double chisq;
        int gs = gsl_multifit_linear(X, yv, cv, cov, &chisq, w);
        st = gs == GSL_SUCCESS ? PW_OK : PW_ESINGULAR;
        for (size_t j = 0; j < p && st == PW_OK; j++) {
            c[j] = gsl_vector_get(cv, j);
            if (!isfinite(c[j]))
                st = PW_ESINGULAR;
        }
    }
    gsl_multifit_linear_free(w);
    gsl_matrix_free(cov);
    gsl_vector_free(cv);
    gsl_vector_free(yv);
    gsl_matrix_free(X);
    return st;
}

double pw_cs_polyval(const double *c, int deg, double x)
{
    return gsl_poly_eval(c, deg + 1, x);
}

/* Integral of the polynomial from a to b (exact antiderivative). */
static double poly_integral(const double *c, int deg, double a, double b)
{
    double s = 0.0;
    for (int j = 0; j <= deg; j++)
        s += c[j] * (pow(b, j + 1) - pow(a, j + 1)) / (double)(j + 1);
    return s;
}

pw_status pw_cs_poly_areas(const double *c, int deg, double *A, double *B)
{
    return pw_cs_poly_areas_on(c, deg, 0.0, 1.0, A, B);
}

pw_status pw_cs_poly_areas_on(const double *c, int deg, double a, double b, double *A, double *B)
{
    double cuts[8];
    size_t nc = 0;
    cuts[nc++] = a;
    int d = deg;
    while (d > 0 && c[d] == 0.0)
        d--;
    if (d >= 1) {
        double z[16];
        gsl_poly_complex_workspace *w = gsl_poly_complex_workspace_alloc((size_t)d + 1);
        if (!w)
            return PW_ENOMEM;
        int gs = gsl_poly_complex_solve(c, (size_t)d + 1, w, z);
        gsl_poly_complex_workspace_free(w);
        if (gs != GSL_SUCCESS)
            return PW_ENOCONV;
        for (int i = 0; i < d; i++) {
            double re = z[2 * i], im = z[2 * i + 1];
            if (fabs(im) <= 1e-10 * (1.0 + fabs(re)) && re > a && re < b)
                cuts[nc++] = re;
        }
    }
    cuts[nc++] = b;
    gsl_sort(cuts, 1, nc);
    *A = *B = 0.0;
    for (size_t i = 0; i + 1 < nc; i++) {
        double part = poly_integral(c, deg, cuts[i], cuts[i + 1]);
        if (part >= 0.0)
            *A += part;
        else
            *B -= part;
    }
    return PW_OK;
}

void pw_cs_robust(const double *v, size_t n, double *median, double *sd)
{
    *median = *sd = NAN;
    double *a = malloc((n ? n : 1) * sizeof *a);
    if (!a)
        return;
    size_t m = 0;
    for (size_t i = 0; i < n; i++)
        if (isfinite(v[i]))
            a[m++] = v[i];
    if (m > 0) {
        gsl_sort(a, 1, m);
        double med = gsl_stats_median_from_sorted_data(a, 1, m);
        for (size_t i = 0; i < m; i++)
            a[i] = fabs(a[i] - med);
        gsl_sort(a, 1, m);
        *median = med;
        /* 1.4826 = 1/Phi^-1(3/4): MAD of a normal sample estimates 0.6745 sigma */
        *sd = 1.4826 * gsl_stats_median_from_sorted_data(a, 1, m);
    }
    free(a);
}
