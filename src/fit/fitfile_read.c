/* Reading fit files back into a pw_fit_result, validating structure, names and numbers.
 * Every problem is reported as "FILE: what is wrong (what was expected)"; JSON syntax errors
 * carry jansson's line number. */
#include "fit_internal.h"
#include "fitfile_internal.h"

#include <math.h>
#include <pinchwise/fitjson.h>
#include <stdarg.h>
#include <pinchwise/fileio.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define FITFILE_MAX_BYTES (256u * 1024u * 1024u)

typedef struct reader {
    const char *name;
    pw_error *err;
    pw_status st;
} reader;

static void fail(reader *rd, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

static void fail(reader *rd, const char *fmt, ...)
{
    if (rd->st != PW_OK)
        return;
    char msg[PW_ERROR_MSG_MAX];
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(msg, sizeof msg, fmt, ap);
    va_end(ap);
    rd->st = pw_error_set(rd->err, PW_EPARSE, rd->name, 0, "%s", msg);
}

/* A number (or null meaning NAN when nullable). */
static double get_num(reader *rd, const json_t *obj, const char *key, bool nullable)
{
    const json_t *v = json_object_get(obj, key);
    if (v && json_is_number(v)) {
        double d = json_number_value(v);
        if (isfinite(d))
            return d;
    }
    if (nullable && (!v || json_is_null(v)))
        return NAN;
    fail(rd, "key \"%s\" must be a finite number%s", key, nullable ? " or null" : "");
    return NAN;
}

/* A value the file holds that the reader recomputes anyway: NAN unless a finite number. */
static double stored_num(const json_t *obj, const char *key)
{
    const json_t *v = json_object_get(obj, key);
    double d = v && json_is_number(v) ? json_number_value(v) : (double)NAN;
    return isfinite(d) ? d : (double)NAN;
}

static const char *get_str(reader *rd, const json_t *obj, const char *key)
{
    const json_t *v = json_object_get(obj, key);
    if (v && json_is_string(v))
        return json_string_value(v);
    fail(rd, "key \"%s\" must be a string", key);
    return "";
}

static void copy_str(char *dst, size_t n, const char *src) { snprintf(dst, n, "%s", src); }

/* The optional "data.uncertainties" object (absent in older fit files: data_sigma_known stays
 * false and pw_fit_dataset falls back on the weights): the dataset's own sigma metadata. Each
 * sigma is null or a positive finite number, at least one of the two sigma_P given; the
 * "stated" flags booleans. */
static void read_data_sigmas(reader *rd, const json_t *u, pw_fit_result *r)
{
    if (!u)
        return;
    if (!json_is_object(u)) {
        fail(rd, "key \"data.uncertainties\" must be an object");
        return;
    }
    const char *keys[] = {"sigma_T_K", "sigma_P_relative", "sigma_P_abs_Pa", "sigma_y", "sigma_x"};
    double *dst[] = {&r->data_sigma_T_K, &r->data_sigma_P_rel, &r->data_sigma_P_abs_Pa,
                     &r->data_sigma_y, &r->data_sigma_x};
    for (int k = 0; k < 5 && rd->st == PW_OK; k++) {
        *dst[k] = get_num(rd, u, keys[k], true);
        if (rd->st == PW_OK && !(isnan(*dst[k]) || (*dst[k] > 0.0 && *dst[k] < 1e10)))
            fail(rd, "key \"data.uncertainties.%s\" = %g must be positive (or null)", keys[k],
                 *dst[k]);
    }
    const char *flags[] = {"sigma_y_stated", "sigma_x_stated"};
    bool *fdst[] = {&r->data_sigma_y_stated, &r->data_sigma_x_stated};
    for (int k = 0; k < 2 && rd->st == PW_OK; k++) {
        const json_t *f = json_object_get(u, flags[k]);
        if (!json_is_boolean(f))
            fail(rd, "key \"data.uncertainties.%s\" must be true or false", flags[k]);
        else
            *fdst[k] = json_is_true(f);
    }
    if (rd->st == PW_OK && (r->data_sigma_y_stated && isnan(r->data_sigma_y)))
        fail(rd, "key \"data.uncertainties.sigma_y\" is null but sigma_y_stated is true");
    if (rd->st == PW_OK && (r->data_sigma_x_stated && isnan(r->data_sigma_x)))
        fail(rd, "key \"data.uncertainties.sigma_x\" is null but sigma_x_stated is true");
    r->data_sigma_known = rd->st == PW_OK;
}

/* The optional "constants" object of a component (absent in older fit files): every key must be
 * a column of pw_comp_prop, every value a number inside its plausible range. */
static void read_constants(reader *rd, const json_t *obj, pw_component *out)
{
    pw_component_props_clear(out);
    if (!obj)
        return;
    if (!json_is_object(obj)) {
        fail(rd, "component \"%s\": \"constants\" must be an object", out->name);
        return;
    }
    const char *key;
    const json_t *v;
    json_object_foreach((json_t *)obj, key, v) {
        int p = 0;
        while (p < PW_PROP_COUNT && strcmp(key, pw_comp_prop_column((pw_comp_prop)p)) != 0)
            p++;
        if (p == PW_PROP_COUNT) {
            fail(rd, "component \"%s\": unknown constant \"%s\"", out->name, key);
            return;
        }
        double lo, hi, d = get_num(rd, obj, key, false);
        pw_comp_prop_range((pw_comp_prop)p, &lo, &hi);
        if (rd->st == PW_OK && !(d > lo && d < hi)) {
            fail(rd, "component \"%s\": %s = %g is outside %g to %g", out->name, key, d, lo, hi);
            return;
        }
        out->prop[p] = d * pw_comp_prop_to_si((pw_comp_prop)p);
    }
}

static void read_component(reader *rd, const json_t *c, pw_component *out)
{
    memset(out, 0, sizeof *out);
    if (!json_is_object(c)) {
        fail(rd, "\"component_data\" entries must be objects");
        return;
    }
    copy_str(out->name, sizeof out->name, get_str(rd, c, "name"));
    const char *eq = get_str(rd, c, "equation");
    if (!strcmp(eq, "iapws-if97"))
        out->equation = PW_PSAT_IAPWS_IF97;
    else if (!strcmp(eq, "antoine"))
        out->equation = PW_PSAT_ANTOINE;
    else
        fail(rd, "component equation \"%s\" is unknown (expected antoine or iapws-if97)", eq);
    out->A = get_num(rd, c, "A", false);
    out->B = get_num(rd, c, "B", false);
    out->C = get_num(rd, c, "C", false);
    const char *lg = get_str(rd, c, "log");
    if (!strcmp(lg, "ln"))
        out->log = PW_LN;
    else if (!strcmp(lg, "log10"))
        out->log = PW_LOG10;
    else
        fail(rd, "component log \"%s\" is unknown (expected log10 or ln)", lg);
    copy_str(out->P_unit, sizeof out->P_unit, get_str(rd, c, "P_unit"));
    copy_str(out->T_unit, sizeof out->T_unit, get_str(rd, c, "T_unit"));
    if (rd->st == PW_OK && !pw_units_known(PW_QTY_PRESSURE, out->P_unit))
        fail(rd, "component P_unit \"%s\" is unknown (expected %s)", out->P_unit,
             pw_units_list(PW_QTY_PRESSURE));
    if (rd->st == PW_OK && !pw_units_known(PW_QTY_TEMPERATURE, out->T_unit))
        fail(rd, "component T_unit \"%s\" is unknown (expected %s)", out->T_unit,
             pw_units_list(PW_QTY_TEMPERATURE));
    out->T_min_K = get_num(rd, c, "T_min_K", false);
    out->T_max_K = get_num(rd, c, "T_max_K", false);
    out->V_L_cm3mol = get_num(rd, c, "V_L_cm3mol", true);
    copy_str(out->source, sizeof out->source, get_str(rd, c, "source"));
    read_constants(rd, json_object_get(c, "constants"), out);
    if (rd->st == PW_OK)
        pw_component_prepare(out); /* units were checked above */
    if (rd->st == PW_OK && !(out->T_min_K < out->T_max_K))
        fail(rd, "component \"%s\": T_min_K must be below T_max_K", out->name);
}

/* The optional "vapor" key (absent in older fit files: the ideal vapor). A virial vapor needs the
 * components' critical data, which the file must then carry. */
static void read_vapor(reader *rd, const json_t *v, pw_system *sys)
{
    sys->vapor = PW_VAPOR_IDEAL;
    if (!v || rd->st != PW_OK)
        return;
    if (!json_is_string(v) || pw_vapor_parse(json_string_value(v), &sys->vapor) != PW_OK) {
        fail(rd, "key \"vapor\" must be \"ideal\" or \"virial\"");
        return;
    }
    pw_error e;
    if (pw_vapor_check(sys->vapor, &sys->comp[0], &sys->comp[1], &e) != PW_OK)
        fail(rd, "\"vapor\" is virial but %s", e.msg);
}

/* The key under which obj holds parameter k: its name, else its older name (fit files written
 * before the parameters were renamed), else NULL. */
static const char *param_key(const json_t *obj, const pw_model_type *m, size_t k)
{
    if (json_object_get(obj, m->param_names[k]))
        return m->param_names[k];
    const char *old = m->param_aliases ? m->param_aliases[k] : NULL;
    return old && json_object_get(obj, old) ? old : NULL;
}

static void read_params(reader *rd, const json_t *obj, const pw_model_type *m, double *v,
                        bool required)
{
    if (!json_is_object(obj)) {
        fail(rd, "\"parameters\" must be an object");
        return;
    }
    for (size_t k = 0; k < m->n_params; k++) {
        const char *key = param_key(obj, m, k);
        if (!key) {
            if (required)
                fail(rd, "parameter \"%s\" of model %s is missing", m->param_names[k], m->name);
            continue;
        }
        v[k] = get_num(rd, obj, key, !required);
    }
}

static void read_points(reader *rd, const json_t *data, pw_fit_result *r)
{
    const json_t *pts = json_object_get(data, "points");
    if (!json_is_array(pts) || json_array_size(pts) == 0) {
        fail(rd, "\"data.points\" must be a non-empty array");
        return;
    }
    r->n_pts = json_array_size(pts);
    r->pts = calloc(r->n_pts, sizeof *r->pts);
    if (!r->pts) {
        r->n_pts = 0;
        rd->st = pw_error_set(rd->err, PW_ENOMEM, rd->name, 0, "out of memory");
        return;
    }
    for (size_t i = 0; i < r->n_pts && rd->st == PW_OK; i++) {
        const json_t *p = json_array_get(pts, i);
        pw_fit_point *fp = &r->pts[i];
        if (!json_is_object(p)) {
            fail(rd, "\"data.points\" entries must be objects");
            return;
        }
        const json_t *line = json_object_get(p, "line");
        fp->meas.line = json_is_integer(line) ? (long)json_integer_value(line) : 0;
        fp->meas.x1 = get_num(rd, p, "x1", false);
        fp->meas.y1 = get_num(rd, p, "y1", true);
        fp->meas.T_K = get_num(rd, p, "T_K", false);
        fp->meas.P_Pa = get_num(rd, p, "P_Pa", false);
        /* the file's model values: kept only where they cannot be stale (fit_derive_read) */
        fp->T_calc_K = stored_num(p, "T_calc_K");
        fp->P_calc_Pa = stored_num(p, "P_calc_Pa");
        fp->y_calc = stored_num(p, "y1_calc");
        fp->excluded = json_is_true(json_object_get(p, "excluded"));
        fp->three_phase = json_is_true(json_object_get(p, "three_phase"));
        r->n_three_phase += fp->three_phase; /* left out too, by a model that cannot split */
        if (rd->st == PW_OK && (!(fp->meas.x1 >= 0.0 && fp->meas.x1 <= 1.0) ||
                                !(fp->meas.T_K > 0.0) || !(fp->meas.P_Pa > 0.0)))
            fail(rd, "a data point has x1 outside [0, 1] or non-positive T or P");
        if (rd->st == PW_OK && r->has_y && !(fp->meas.y1 >= 0.0 && fp->meas.y1 <= 1.0))
            fail(rd, "a data point has y1 missing or outside [0, 1]");
    }
}

/* The tie lines a fit used (optional block "lle"): their count, sigma_x, the layer misfit and,
 * from files that keep them, every tie line's measured and calculated layers. Read as stored:
 * refitting needs the LLE file. */
static void read_lle(reader *rd, const json_t *lle, pw_fit_result *r)
{
    if (!lle)
        return;
    const json_t *n = json_object_get(lle, "tie_lines");
    if (!json_is_object(lle) || !json_is_integer(n) || json_integer_value(n) < 1
        || json_integer_value(n) > PW_LLE_MAX_ROWS) {
        fail(rd, "key \"lle\" must be an object with a tie_lines count from 1 to %d",
             PW_LLE_MAX_ROWS);
        return;
    }
    r->n_tie_lines = (size_t)json_integer_value(n);
    r->sigma_x_lle = get_num(rd, lle, "sigma_x", false);
    r->aad_x_lle = get_num(rd, lle, "aad_x", true);
    const json_t *rows = json_object_get(lle, "rows");
    if (!rows)
        return;
    if (!json_is_array(rows) || json_array_size(rows) != r->n_tie_lines) {
        fail(rd, "key \"lle.rows\" must be an array of tie_lines = %zu rows", r->n_tie_lines);
        return;
    }
    r->ties = calloc(r->n_tie_lines, sizeof *r->ties);
    if (!r->ties) {
        fail(rd, "out of memory");
        return;
    }
    for (size_t i = 0; i < r->n_tie_lines && rd->st == PW_OK; i++) {
        const json_t *o = json_array_get(rows, i), *line = json_object_get(o, "line");
        const json_t *x = json_object_get(o, "x1"), *c = json_object_get(o, "x1_calc");
        pw_fit_tie *t = &r->ties[i];
        if (!json_is_object(o) || !json_is_integer(line) || !json_is_array(x)
            || json_array_size(x) != 2 || !json_is_array(c) || json_array_size(c) != 2) {
            fail(rd, "key \"lle.rows\": row %zu must hold line, T_K, x1 [2] and x1_calc [2]", i + 1);
            return;
        }
        t->line = (long)json_integer_value(line);
        t->T_K = get_num(rd, o, "T_K", false);
        const json_t *v[4] = {json_array_get(x, 0), json_array_get(x, 1), json_array_get(c, 0),
                              json_array_get(c, 1)};
        double *dst[4] = {&t->x_I, &t->x_II, &t->calc_I, &t->calc_II};
        for (int k = 0; k < 4; k++) {
            bool ok = json_is_number(v[k]) && isfinite(json_number_value(v[k]))
                      && json_number_value(v[k]) >= 0.0 && json_number_value(v[k]) <= 1.0;
            if (!ok && !(k >= 2 && json_is_null(v[k]))) {
                fail(rd, "key \"lle.rows\": row %zu: compositions must be numbers in [0, 1]%s",
                     i + 1, k >= 2 ? " or null" : "");
                return;
            }
            *dst[k] = ok ? json_number_value(v[k]) : (double)NAN;
        }
    }
}

static void read_matrix(reader *rd, const json_t *o, const char *key, size_t n,
                        double out[PW_MAX_PARAMS][PW_MAX_PARAMS])
{
    const json_t *m = json_object_get(o, key);
    if (!json_is_array(m) || json_array_size(m) != n) {
        fail(rd, "\"%s\" must be a square array of the model's parameter count", key);
        return;
    }
    for (size_t a = 0; a < n; a++) {
        const json_t *row = json_array_get(m, a);
        if (!json_is_array(row) || json_array_size(row) != n) {
            fail(rd, "\"%s\" must be a square array of the model's parameter count", key);
            return;
        }
        for (size_t b = 0; b < n; b++) {
            const json_t *v = json_array_get(row, b);
            out[a][b] = json_is_number(v) ? json_number_value(v) : (double)NAN;
        }
    }
}

static void read_body(reader *rd, const json_t *root, pw_fit_result *r)
{
    if (!json_is_object(root)) {
        fail(rd, "not a pinchwise fit file (expected a JSON object)");
        return;
    }
    const char *fmt = get_str(rd, root, "format");
    if (rd->st == PW_OK && strcmp(fmt, PW_FITFILE_FORMAT) != 0)
        fail(rd, "not a pinchwise fit file (format \"%s\", expected \"%s\")", fmt, PW_FITFILE_FORMAT);
    const json_t *ver = json_object_get(root, "format_version");
    if (rd->st == PW_OK && (!json_is_integer(ver) || json_integer_value(ver) != PW_FITFILE_VERSION))
        fail(rd, "unsupported fit-file format_version (expected 1)");
    const char *mname = get_str(rd, root, "model");
    const pw_model_type *m = pw_model_find(mname);
    char names[256];
    if (rd->st == PW_OK && !m)
        fail(rd, "unknown model \"%s\" (expected one of %s)", mname,
             pw_model_names(names, sizeof names));
    if (rd->st != PW_OK)
        return;
    r->sys.model = m;
    const json_t *comps = json_object_get(root, "component_data");
    if (!json_is_array(comps) || json_array_size(comps) != 2) {
        fail(rd, "\"component_data\" must hold exactly two components");
        return;
    }
    read_component(rd, json_array_get(comps, 0), &r->sys.comp[0]);
    read_component(rd, json_array_get(comps, 1), &r->sys.comp[1]);
    for (size_t k = 0; k < PW_MAX_PARAMS; k++) {
        r->stderr_[k] = NAN;
        r->ci95[k][0] = r->ci95[k][1] = NAN;
    }
    read_params(rd, json_object_get(root, "parameters"), m, r->sys.params, true);
    const json_t *se = json_object_get(root, "stderr");
    if (json_is_object(se))
        read_params(rd, se, m, r->stderr_, false);
    const json_t *fixed = json_object_get(root, "fixed");
    for (size_t k = 0; k < m->n_params; k++)
        r->fitted[k] = true;
    if (json_is_array(fixed)) {
        size_t i;
        const json_t *f;
        json_array_foreach(fixed, i, f) {
            int k = json_is_string(f) ? pw_model_param_lookup(m, json_string_value(f)) : -1;
            if (k < 0)
                fail(rd, "\"fixed\" names an unknown parameter");
            else
                r->fitted[k] = false;
        }
    }
    r->n_fitted = 0;
    for (size_t k = 0; k < m->n_params; k++)
        r->n_fitted += r->fitted[k];
    const json_t *ci = json_object_get(root, "ci95");
    for (size_t k = 0; k < m->n_params && json_is_object(ci); k++) {
        const char *key = param_key(ci, m, k);
        const json_t *pair = key ? json_object_get(ci, key) : NULL;
        if (json_is_array(pair) && json_array_size(pair) == 2) {
            const json_t *lo = json_array_get(pair, 0), *hi = json_array_get(pair, 1);
            r->ci95[k][0] = json_is_number(lo) ? json_number_value(lo) : (double)NAN;
            r->ci95[k][1] = json_is_number(hi) ? json_number_value(hi) : (double)NAN;
        }
    }
    read_matrix(rd, root, "covariance", m->n_params, r->cov);
    read_matrix(rd, root, "correlation", m->n_params, r->corr);
    r->sys.T_ref_K = get_num(rd, root, "T_ref_K", false);
    read_vapor(rd, json_object_get(root, "vapor"), &r->sys);
    r->converged = json_is_true(json_object_get(root, "converged"));
    if (rd->st == PW_OK && m->check(r->sys.params) != PW_OK)
        fail(rd, "the parameters lie outside the domain of model %s", m->name);
    if (rd->st == PW_OK && !(r->sys.T_ref_K > 0.0))
        fail(rd, "T_ref_K must be positive");

    const json_t *data = json_object_get(root, "data");
    if (!json_is_object(data)) {
        fail(rd, "\"data\" must be an object");
        return;
    }
    const char *kind = get_str(rd, data, "kind");
    if (!strcmp(kind, "isobaric"))
        r->kind = PW_DATA_ISOBARIC;
    else if (!strcmp(kind, "isothermal"))
        r->kind = PW_DATA_ISOTHERMAL;
    else
        fail(rd, "data kind \"%s\" is unknown (expected isobaric or isothermal)", kind);
    r->P_fixed_Pa = get_num(rd, data, "P_fixed_Pa", r->kind != PW_DATA_ISOBARIC);
    r->T_fixed_K = get_num(rd, data, "T_fixed_K", r->kind != PW_DATA_ISOTHERMAL);
    r->has_y = json_is_true(json_object_get(data, "has_y"));
    r->objective = r->kind == PW_DATA_ISOBARIC ? (r->has_y ? PW_OBJ_TXY : PW_OBJ_TX)
                                               : (r->has_y ? PW_OBJ_PXY : PW_OBJ_PX);
    read_points(rd, data, r);
    read_data_sigmas(rd, json_object_get(data, "uncertainties"), r);

    const json_t *st = json_object_get(root, "statistics");
    if (json_is_object(st)) {
        r->chi2 = get_num(rd, st, "chi2", true);
        const json_t *n = json_object_get(st, "residuals"), *d = json_object_get(st, "dof");
        r->n_residuals = json_is_integer(n) ? (size_t)json_integer_value(n) : 0;
        r->dof = json_is_integer(d) ? (size_t)json_integer_value(d) : 0;
        const char *counts[] = {"iterations", "function_evaluations", "jacobian_evaluations",
                                "lm_runs"};
        size_t *dst[] = {&r->iterations, &r->n_fev, &r->n_jev, &r->n_runs};
        for (int k = 0; k < 4; k++) {
            const json_t *c = json_object_get(st, counts[k]);
            *dst[k] = json_is_integer(c) && json_integer_value(c) >= 0
                          ? (size_t)json_integer_value(c)
                          : 0;
        }
    }
    const json_t *sig = json_object_get(root, "sigmas");
    if (json_is_object(sig)) {
        r->sigma_T_K = get_num(rd, sig, "T_K", true);
        r->sigma_P_rel = get_num(rd, sig, "P_relative", true);
        r->sigma_y = get_num(rd, sig, "y", true);
    }
    const json_t *mins = json_object_get(root, "minima");
    if (json_is_array(mins)) {
        size_t i;
        const json_t *mi;
        json_array_foreach(mins, i, mi) {
            if (i >= PW_FIT_MAX_MINIMA || !json_is_object(mi))
                break;
            memcpy(r->minima[i].params, r->sys.params, sizeof r->sys.params);
            read_params(rd, json_object_get(mi, "parameters"), m, r->minima[i].params, false);
            r->minima[i].chi2 = get_num(rd, mi, "chi2", true);
            const json_t *h = json_object_get(mi, "starts");
            r->minima[i].hits = json_is_integer(h) ? (size_t)json_integer_value(h) : 0;
            r->n_minima = i + 1;
        }
    }
    /* the file's liquid-stability screen: kept only where it cannot be stale (fit_derive_read) */
    const json_t *split = json_object_get(root, "liquid_split");
    r->split = json_is_true(json_object_get(split, "predicted"));
    r->split_min_D = stored_num(split, "min_D");
    r->split_x = stored_num(split, "x1_at_min");
    r->split_T_K = stored_num(split, "T_K_at_min");
    const json_t *choice = json_object_get(root, "minimum_choice"); /* absent in older files */
    if (json_is_object(choice)) {
        const json_t *k = json_object_get(choice, "minimum"), *s = json_object_get(choice, "split_skipped");
        if (json_is_integer(k) && json_integer_value(k) >= 1 &&
            (size_t)json_integer_value(k) <= r->n_minima)
            r->minimum_default = (size_t)json_integer_value(k);
        if (json_is_integer(s) && json_integer_value(s) >= 0 &&
            (size_t)json_integer_value(s) < r->n_minima)
            r->minimum_split_skipped = (size_t)json_integer_value(s);
    }
    read_lle(rd, json_object_get(root, "lle"), r);
    /* absent in fit files written before the objective scored one-liquid points inside the
     * model's layers by the three-phase state: their values stay the one-liquid ones */
    r->layers_scored = json_is_true(json_object_get(root, "inside_layers_scored"));
    const json_t *range = json_object_get(root, "data_range");
    r->T_min_K = json_is_object(range) ? get_num(rd, range, "T_min_K", true) : (double)NAN;
    r->T_max_K = json_is_object(range) ? get_num(rd, range, "T_max_K", true) : (double)NAN;
    const json_t *ex = json_object_get(root, "excluded");
    if (json_is_object(ex) && json_is_string(json_object_get(ex, "reason")))
        copy_str(r->exclude_reason, sizeof r->exclude_reason,
                 json_string_value(json_object_get(ex, "reason")));
    const json_t *prov = json_object_get(root, "provenance");
    if (json_is_object(prov)) {
        copy_str(r->dataset_path, sizeof r->dataset_path, get_str(rd, prov, "dataset"));
        copy_str(r->dataset_sha256, sizeof r->dataset_sha256, get_str(rd, prov, "dataset_sha256"));
        copy_str(r->source, sizeof r->source, get_str(rd, prov, "source"));
        copy_str(r->version, sizeof r->version, get_str(rd, prov, "version"));
        copy_str(r->created, sizeof r->created, get_str(rd, prov, "created"));
    }
    const char *stop = json_is_string(json_object_get(root, "stop_reason"))
                           ? json_string_value(json_object_get(root, "stop_reason"))
                           : "";
    for (int s = PW_STOP_NONE; s <= PW_STOP_MACHINE; s++)
        if (!strcmp(stop, pw_fit_stop_name((pw_stop_reason)s)))
            r->stop = (pw_stop_reason)s;
    char why[PW_ERROR_MSG_MAX];
    if (rd->st == PW_OK && !pw_fitfile_read_convergence(root, r, why, sizeof why))
        fail(rd, "%s", why);
}

/* buf[0..len) without the blanks and tabs that follow each newline, in a new buffer of *out_len
 * bytes; NULL when out of memory. jansson reads its input a byte at a time (about 64
 * instructions a byte: a call for each byte and its line and column bookkeeping), and the
 * writer's indentation is about 14 % of a fit file (docs/performance.md, "Fit-file reading").
 * The JSON is the same, valid or not: only blanks and tabs right after a newline go, and the
 * newline stays. Where the newline is outside strings, the run removed was whitespace between
 * two tokens and the newline still separates them: the same tokens in the same order. Where it
 * is inside a string, that string holds a raw control character, which JSON forbids, and it
 * still does (quotes and backslashes are never removed, so every string begins and ends where
 * it did). Line numbers are kept too. */
static char *without_indentation(const char *buf, size_t len, size_t *out_len)
{
    char *out = malloc(len + 1);
    if (!out)
        return NULL;
    size_t r = 0, w = 0;
    while (r < len) {
        const char *nl = memchr(buf + r, '\n', len - r);
        size_t seg = nl ? (size_t)(nl - (buf + r)) + 1 : len - r;
        memcpy(out + w, buf + r, seg);
        w += seg;
        r += seg;
        while (nl && r < len && (buf[r] == ' ' || buf[r] == '\t'))
            r++;
    }
    *out_len = w;
    return out;
}

/* Reads and validates the file's text into r; computes nothing (fit_derive does). */
static pw_status parse_only(const char *buf, size_t len, const char *name, pw_fit_result *r,
                            pw_error *err)
{
    memset(r, 0, sizeof *r);
    json_error_t jerr;
    size_t tlen = 0;
    char *text = without_indentation(buf, len, &tlen);
    json_t *root = text ? json_loadb(text, tlen, JSON_REJECT_DUPLICATES, &jerr) : NULL;
    free(text);
    /* Not valid (or out of memory): the text as given, for jansson's own message about it. */
    if (!root)
        root = json_loadb(buf, len, JSON_REJECT_DUPLICATES, &jerr);
    if (!root)
        return pw_error_set(err, PW_EPARSE, name, jerr.line > 0 ? jerr.line : 0,
                            "not valid JSON: %s (expected a pinchwise fit file)", jerr.text);
    reader rd = {.name = name, .err = err, .st = PW_OK};
    read_body(&rd, root, r);
    if (rd.st == PW_OK)
        rd.st = pw_fitfile_check(root, r, name, err);
    json_decref(root);
    if (rd.st != PW_OK)
        pw_fit_result_free(r);
    return rd.st;
}

/* Reads path, replaces the components that the file at components names (NULL: none), then
 * derives once from the final components. */
static pw_status load(const char *buf, size_t len, const char *name, const char *components,
                      pw_fit_result *r, bool changed[2], pw_error *err)
{
    if (changed)
        changed[0] = changed[1] = false;
    pw_status st = parse_only(buf, len, name, r, err);
    if (st != PW_OK)
        return st;
    if (components) {
        pw_complib lib;
        pw_complib_init(&lib);
        st = pw_complib_read(&lib, components, err);
        if (st == PW_OK)
            st = fit_swap_components(r, &lib, changed);
        pw_complib_free(&lib);
    }
    if (st == PW_OK)
        st = components ? fit_derive(r, name, err) : fit_derive_read(r, name, err);
    if (st != PW_OK)
        pw_fit_result_free(r);
    return st;
}

pw_status pw_fitfile_parse(const char *buf, size_t len, const char *name, pw_fit_result *r,
                           pw_error *err)
{
    return load(buf, len, name, NULL, r, NULL, err);
}

pw_status pw_fitfile_load(const char *path, const char *components, pw_fit_result *r,
                          bool changed[2], pw_error *err)
{
    char *buf;
    size_t len;
    memset(r, 0, sizeof *r);
    if (changed)
        changed[0] = changed[1] = false;
    pw_status st = pw_read_file(path, FITFILE_MAX_BYTES, &buf, &len, err);
    if (st != PW_OK)
        return st;
    st = load(buf, len, path, components, r, changed, err);
    free(buf);
    return st;
}

pw_status pw_fitfile_read(const char *path, pw_fit_result *r, pw_error *err)
{
    return pw_fitfile_load(path, NULL, r, NULL, err);
}
