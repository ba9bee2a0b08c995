/* Second pass of the fit-file reader: every field checked as strictly as the dataset reader
 * checks its file (docs/fit-file.md, "What the reader refuses"). A fit file is JSON that people
 * can edit; a hand-edited negative pressure, a reference temperature of 1e-300 K, a negative
 * degree-of-freedom count, a covariance that is not a covariance or a vapor-pressure range that
 * reaches the Antoine pole would otherwise flow into every later result. Each refusal names the
 * file and the key. */
#include "fitfile_internal.h"

#include <lapacke.h>
#include <math.h>
#include <pinchwise/dataset.h>
#include <pinchwise/units.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

typedef struct checker {
    const char *name;
    pw_error *err;
    pw_status st;
} checker;

static void bad(checker *c, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

static void bad(checker *c, const char *fmt, ...)
{
    if (c->st != PW_OK)
        return;
    char msg[PW_ERROR_MSG_MAX];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(msg, sizeof msg, fmt, ap);
    va_end(ap);
    c->st = pw_error_set(c->err, PW_EPARSE, c->name, 0, "%s", msg);
}

static bool plausible_T(double T) { return T >= PW_DATASET_T_MIN_K && T <= PW_DATASET_T_MAX_K; }

/* A key that, when present, must be a whole number in [lo, hi]. */
static void count_key(checker *c, const json_t *obj, const char *where, const char *key,
                      json_int_t lo, json_int_t hi)
{
    const json_t *v = json_object_get(obj, key);
    if (!v)
        return;
    if (!json_is_integer(v) || json_integer_value(v) < lo || json_integer_value(v) > hi)
        bad(c, "key \"%s%s\" must be a whole number from %lld to %lld", where, key, (long long)lo,
            (long long)hi);
}

/* A key that, when present and not null, must be a number in [lo, hi]. */
static void range_key(checker *c, const json_t *obj, const char *where, const char *key, double lo,
                      double hi, const char *what)
{
    const json_t *v = json_object_get(obj, key);
    if (!v || json_is_null(v))
        return;
    if (!json_is_number(v)) {
        bad(c, "key \"%s%s\" must be a number from %g to %g (expected %s)", where, key, lo, hi,
            what);
        return;
    }
    double d = json_number_value(v);
    if (!(d >= lo && d <= hi))
        bad(c, "key \"%s%s\" = %g is outside the plausible range %g to %g (expected %s)", where,
            key, d, lo, hi, what);
}

static void check_bool(checker *c, const json_t *obj, const char *where, const char *key)
{
    const json_t *v = json_object_get(obj, key);
    if (v && !json_is_boolean(v))
        bad(c, "key \"%s%s\" must be true or false", where, key);
}

/* As strict as the component-file reader (src/data/complib.c): a range above absolute zero, B > 0
 * and T + C > 0 over the whole range for Antoine rows, V_L positive when given. */
static void check_component(checker *c, const pw_component *comp, size_t i)
{
    char where[64];
    snprintf(where, sizeof where, "component_data[%zu]", i);
    if (!(comp->T_min_K > 0.0))
        bad(c, "key \"%s.T_min_K\" (%s) = %g K is not above absolute zero", where, comp->name,
            comp->T_min_K);
    if (c->st == PW_OK && isfinite(comp->V_L_cm3mol) && !(comp->V_L_cm3mol > 0.0))
        bad(c, "key \"%s.V_L_cm3mol\" (%s) = %g is not positive", where, comp->name,
            comp->V_L_cm3mol);
    if (c->st != PW_OK || comp->equation != PW_PSAT_ANTOINE)
        return;
    if (!(comp->B > 0.0))
        bad(c, "key \"%s.B\" (%s) = %g is not positive (expected a vapor pressure that rises "
            "with temperature)", where, comp->name, comp->B);
    double tmin_u = NAN;
    if (c->st == PW_OK &&
        (pw_units_from_si(PW_QTY_TEMPERATURE, comp->T_min_K, comp->T_unit, &tmin_u) != PW_OK ||
         !(tmin_u + comp->C > 0.0)))
        bad(c, "key \"%s.C\" (%s): T_min + C = %g %s, so the validity range reaches the Antoine "
            "pole (expected T + C > 0 over the whole range)",
            where, comp->name, tmin_u + comp->C, comp->T_unit);
}

/* The covariance of the fitted parameters: variances >= 0, symmetric (values and nulls), and
 * positive semi-definite (LAPACK dsyev) over the parameters whose entries are all numbers. A
 * null entry means "not available" (e.g. a parameter the data do not fix). */
static void check_covariance(checker *c, const pw_fit_result *r)
{
    const pw_model_type *m = r->sys.model;
    size_t idx[PW_MAX_PARAMS], n = 0;
    for (size_t k = 0; k < m->n_params; k++)
        if (r->fitted[k])
            idx[n++] = k;
    double scale = 0.0;
    for (size_t a = 0; a < n; a++) {
        double d = r->cov[idx[a]][idx[a]];
        if (isfinite(d) && !(d >= 0.0)) {
            bad(c, "key \"covariance\": the variance of %s is %g (expected a value >= 0)",
                m->param_names[idx[a]], d);
            return;
        }
        if (isfinite(d))
            scale = fmax(scale, d);
    }
    for (size_t a = 0; a < n; a++)
        for (size_t b = a + 1; b < n; b++) {
            double x = r->cov[idx[a]][idx[b]], y = r->cov[idx[b]][idx[a]];
            if (isfinite(x) != isfinite(y) || (isfinite(x) && fabs(x - y) > 1e-9 * scale)) {
                bad(c, "key \"covariance\" is not symmetric (%s/%s: %g against %g)",
                    m->param_names[idx[a]], m->param_names[idx[b]], x, y);
                return;
            }
        }
    /* the block of parameters whose variances and covariances with each other are all numbers */
    size_t blk[PW_MAX_PARAMS], nb = 0;
    for (size_t a = 0; a < n; a++) {
        bool all = isfinite(r->cov[idx[a]][idx[a]]);
        for (size_t b = 0; all && b < nb; b++)
            all = isfinite(r->cov[idx[a]][blk[b]]);
        if (all)
            blk[nb++] = idx[a];
    }
    if (nb == 0)
        return;
    double A[PW_MAX_PARAMS * PW_MAX_PARAMS], w[PW_MAX_PARAMS];
    for (size_t a = 0; a < nb; a++)
        for (size_t b = 0; b < nb; b++)
            A[a * nb + b] = 0.5 * (r->cov[blk[a]][blk[b]] + r->cov[blk[b]][blk[a]]);
    lapack_int info =
        LAPACKE_dsyev(LAPACK_ROW_MAJOR, 'N', 'U', (lapack_int)nb, A, (lapack_int)nb, w);
    if (info != 0) {
        bad(c, "key \"covariance\": its eigenvalues cannot be computed (LAPACK dsyev info %d)",
            (int)info);
        return;
    }
    /* rounding of a positive semi-definite matrix written with 17 digits stays far inside this */
    double tol = 1e-10 * fmax(w[nb - 1], 0.0) + 1e-300;
    if (w[0] < -tol)
        bad(c, "key \"covariance\" is not positive semi-definite (smallest eigenvalue %g, largest "
            "%g): not the covariance of any fit",
            w[0], w[nb - 1]);
}

static void check_correlation(checker *c, const pw_fit_result *r)
{
    const pw_model_type *m = r->sys.model;
    for (size_t a = 0; a < m->n_params; a++)
        for (size_t b = 0; b < m->n_params; b++) {
            if (!r->fitted[a] || !r->fitted[b])
                continue;
            double v = r->corr[a][b];
            if (isfinite(v) && !(fabs(v) <= 1.0 + 1e-9))
                bad(c, "key \"correlation\": %s/%s = %g lies outside [-1, 1]", m->param_names[a],
                    m->param_names[b], v);
        }
}

static void check_points(checker *c, const json_t *root)
{
    const json_t *pts = json_object_get(json_object_get(root, "data"), "points");
    if (json_array_size(pts) > PW_DATASET_MAX_POINTS) {
        bad(c, "key \"data.points\" holds %zu points (at most %d)", json_array_size(pts),
            PW_DATASET_MAX_POINTS);
        return;
    }
    size_t i;
    const json_t *p;
    json_array_foreach(pts, i, p) {
        char where[48];
        snprintf(where, sizeof where, "data.points[%zu].", i);
        range_key(c, p, where, "T_K", PW_DATASET_T_MIN_K, PW_DATASET_T_MAX_K, "a temperature in K");
        range_key(c, p, where, "P_Pa", PW_DATASET_P_MIN_PA, PW_DATASET_P_MAX_PA,
                  "a pressure in Pa");
        count_key(c, p, where, "line", 0, (json_int_t)1 << 40);
        check_bool(c, p, where, "excluded");
        if (c->st != PW_OK)
            return;
    }
}

pw_status pw_fitfile_check(const json_t *root, const pw_fit_result *r, const char *name,
                           pw_error *err)
{
    checker c = {.name = name, .err = err, .st = PW_OK};
    for (size_t i = 0; i < 2; i++)
        check_component(&c, &r->sys.comp[i], i);
    if (c.st == PW_OK && !plausible_T(r->sys.T_ref_K))
        bad(&c, "key \"T_ref_K\" = %g K is outside the plausible range %g to %g K", r->sys.T_ref_K,
            PW_DATASET_T_MIN_K, PW_DATASET_T_MAX_K);
    check_bool(&c, root, "", "converged");
    const json_t *data = json_object_get(root, "data");
    if (r->kind == PW_DATA_ISOBARIC)
        range_key(&c, data, "data.", "P_fixed_Pa", PW_DATASET_P_MIN_PA, PW_DATASET_P_MAX_PA,
                  "the pressure of isobaric data, in Pa");
    else
        range_key(&c, data, "data.", "T_fixed_K", PW_DATASET_T_MIN_K, PW_DATASET_T_MAX_K,
                  "the temperature of isothermal data, in K");
    check_bool(&c, data, "data.", "has_y");
    check_points(&c, root);
    const json_t *st = json_object_get(root, "statistics");
    const json_int_t big = (json_int_t)1 << 40;
    count_key(&c, st, "statistics.", "residuals", 0, big);
    count_key(&c, st, "statistics.", "dof", 0, big);
    const char *counts[] = {"iterations", "function_evaluations", "jacobian_evaluations",
                            "lm_runs"};
    for (int k = 0; k < 4; k++)
        count_key(&c, st, "statistics.", counts[k], 0, big);
    range_key(&c, st, "statistics.", "chi2", 0.0, HUGE_VAL, "a sum of squares >= 0");
    if (c.st == PW_OK && r->dof > r->n_residuals)
        bad(&c, "key \"statistics.dof\" = %zu exceeds \"statistics.residuals\" = %zu", r->dof,
            r->n_residuals);
    const json_t *sig = json_object_get(root, "sigmas");
    /* as wide as a dataset's sigma keys allow, less what would overflow the weights */
    range_key(&c, sig, "sigmas.", "T_K", 1e-9, 1e4, "a temperature uncertainty in K");
    range_key(&c, sig, "sigmas.", "P_relative", 1e-12, 1e3, "a relative pressure uncertainty");
    range_key(&c, sig, "sigmas.", "y", 1e-12, 1.0, "a mole-fraction uncertainty below 1");
    const json_t *range = json_object_get(root, "data_range");
    range_key(&c, range, "data_range.", "T_min_K", PW_DATASET_T_MIN_K, PW_DATASET_T_MAX_K,
              "a temperature in K");
    range_key(&c, range, "data_range.", "T_max_K", PW_DATASET_T_MIN_K, PW_DATASET_T_MAX_K,
              "a temperature in K");
    if (c.st == PW_OK && isfinite(r->T_min_K) && isfinite(r->T_max_K) && r->T_min_K > r->T_max_K)
        bad(&c, "key \"data_range\": T_min_K = %g is above T_max_K = %g", r->T_min_K, r->T_max_K);
    const pw_model_type *m = r->sys.model;
    for (size_t k = 0; k < m->n_params && c.st == PW_OK; k++) {
        if (isfinite(r->stderr_[k]) && !(r->stderr_[k] >= 0.0))
            bad(&c, "key \"stderr.%s\" = %g is negative", m->param_names[k], r->stderr_[k]);
        if (isfinite(r->ci95[k][0]) && isfinite(r->ci95[k][1]) && r->ci95[k][0] > r->ci95[k][1])
            bad(&c, "key \"ci95.%s\": the lower end %g is above the upper end %g",
                m->param_names[k], r->ci95[k][0], r->ci95[k][1]);
    }
    const json_t *mins = json_object_get(root, "minima");
    size_t i;
    const json_t *mi;
    json_array_foreach(mins, i, mi) {
        char where[32];
        snprintf(where, sizeof where, "minima[%zu].", i);
        range_key(&c, mi, where, "chi2", 0.0, HUGE_VAL, "a sum of squares >= 0");
        count_key(&c, mi, where, "starts", 0, big);
    }
    if (c.st == PW_OK)
        check_covariance(&c, r);
    if (c.st == PW_OK)
        check_correlation(&c, r);
    return c.st;
}
