#include "fit_common.h"

#include "cli.h"

#include <errno.h>
#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/composition.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fitjson.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

/* File name without folder and extension. */
static void file_stem(const char *path, char *out, size_t n)
{
    const char *base = strrchr(path, '/');
    base = base ? base + 1 : path;
    snprintf(out, n, "%s", base);
    char *dot = strrchr(out, '.');
    if (dot && dot != out)
        *dot = '\0';
}

static pw_status find_component(const pw_complib *lib, const pw_dataset *ds, int i,
                                pw_component out[2], const pw_component **c, pw_error *err)
{
    *c = pw_complib_find(lib, ds->names[i]);
    if (*c) {
        /* Keep the dataset's spelling (it may be an alias or differ in case): the fit file and
         * every later output then name the components as the user did. */
        out[i] = **c;
        snprintf(out[i].name, sizeof out[i].name, "%s", ds->names[i]);
        *c = &out[i];
        return PW_OK;
    }
    const char *sugg[3];
    size_t n = pw_complib_suggest(lib, ds->names[i], sugg, 3);
    char hint[300] = "";
    if (n > 0) {
        size_t len = (size_t)snprintf(hint, sizeof hint, "; did you mean ");
        for (size_t k = 0; k < n && len < sizeof hint; k++)
            len += (size_t)snprintf(hint + len, sizeof hint - len, "%s'%s'",
                                    k == 0 ? "" : (k + 1 == n ? " or " : ", "), sugg[k]);
        if (len < sizeof hint)
            snprintf(hint + len, sizeof hint - len, "?");
    }
    return pw_error_set(err, PW_ENOTFOUND, ds->path, 0,
                        "component '%s' is not in the component library (add it with --components "
                        "FILE%s)",
                        ds->names[i], hint);
}

static void warn_ranges(const pw_fit_result *r, const char *input)
{
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &r->sys.comp[i];
        double lo = pw_component_range_excess_K(c, r->T_min_K);
        double hi = pw_component_range_excess_K(c, r->T_max_K);
        if (lo < 0.0)
            pw_cli_warnf("fit", "%s: the data reach %.1f K below the vapor-pressure range of %s",
                         input, -lo, c->name);
        if (hi > 0.0)
            pw_cli_warnf("fit", "%s: the data reach %.1f K above the vapor-pressure range of %s",
                         input, hi, c->name);
    }
}

/* Pure-component points (x1 = 0 or 1) against the vapor-pressure correlations: a large miss at
 * both ends that vanishes when the names are exchanged means the components are listed in the
 * wrong order. */
static double pure_miss(const pw_fit_result *r, const pw_point *m, int comp)
{
    const pw_component *c = &r->sys.comp[comp];
    if (r->kind == PW_DATA_ISOBARIC) {
        double T;
        return pw_tsat(c, m->P_Pa, &T) == PW_OK ? fabs(T - m->T_K) : (double)NAN;
    }
    double P;
    return pw_psat(c, m->T_K, &P, NULL) == PW_OK ? fabs(log(P / m->P_Pa)) * 100.0 : (double)NAN;
}

static void warn_pure_points(const pw_fit_result *r, const char *input)
{
    /* miss[as labelled / exchanged]: largest deviation in K (isobaric) or % (isothermal) */
    double miss[2] = {0.0, 0.0};
    long line = 0;
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_point *m = &r->pts[i].meas;
        if (m->x1 > 0.0 && m->x1 < 1.0)
            continue;
        int comp = m->x1 >= 1.0 ? 0 : 1;
        double a = pure_miss(r, m, comp), b = pure_miss(r, m, 1 - comp);
        if (isfinite(a) && a > miss[0]) {
            miss[0] = a;
            line = m->line;
        }
        if (isfinite(b))
            miss[1] = fmax(miss[1], b);
    }
    bool isobaric = r->kind == PW_DATA_ISOBARIC;
    double limit = isobaric ? 2.0 : 5.0; /* K or %: well beyond measurement error (common practice) */
    if (!(miss[0] > limit))
        return;
    pw_cli_warnf("fit", "%s:%ld: a pure-component point misses the vapor pressure by %.1f %s%s",
                 input, line, miss[0], isobaric ? "K" : "%",
                 miss[1] < 0.25 * miss[0]
                     ? "; the components look swapped (x1 must be the mole fraction of the first "
                       "name in '# components:')"
                     : "; check the component names and their vapor-pressure constants");
}

/* Points that repeat another point exactly are kept and fitted as replicate measurements. */
static int cmp_point(const void *a, const void *b)
{
    const pw_point *p = &((const pw_fit_point *)a)->meas, *q = &((const pw_fit_point *)b)->meas;
    double d[4] = {p->x1 - q->x1, p->T_K - q->T_K, p->P_Pa - q->P_Pa,
                   (isnan(p->y1) ? -1.0 : p->y1) - (isnan(q->y1) ? -1.0 : q->y1)};
    for (int k = 0; k < 4; k++)
        if (d[k] != 0.0)
            return d[k] < 0.0 ? -1 : 1;
    return (p->line > q->line) - (p->line < q->line);
}

static void warn_duplicates(const pw_fit_result *r, const char *input)
{
    if (r->n_pts < 2)
        return;
    pw_fit_point *c = malloc(r->n_pts * sizeof *c);
    if (!c)
        return;
    memcpy(c, r->pts, r->n_pts * sizeof *c);
    qsort(c, r->n_pts, sizeof *c, cmp_point);
    size_t dup = 0;
    long first = 0, of = 0;
    for (size_t i = 1; i < r->n_pts; i++) {
        const pw_point *p = &c[i - 1].meas, *q = &c[i].meas;
        bool same = p->x1 == q->x1 && p->T_K == q->T_K && p->P_Pa == q->P_Pa &&
                    (p->y1 == q->y1 || (isnan(p->y1) && isnan(q->y1)));
        if (same && dup++ == 0) {
            first = q->line;
            of = p->line;
        }
    }
    free(c);
    if (dup)
        pw_cli_warnf("fit", "%s:%ld: %zu duplicated point%s (line %ld repeats line %ld); fitted as "
                     "replicate measurements, each with full weight",
                     input, first, dup, dup == 1 ? "" : "s", first, of);
}

static void warn_fit(const pw_fit_result *r, const char *input)
{
    pw_cli_warn_vapor_association("fit", &r->sys);
    if (!r->converged)
        pw_cli_warnf("fit", "%s: the %s fit did NOT converge (%s); do not design with it", input,
                     r->sys.model->name, pw_fit_stop_name(r->stop));
    if (r->split)
        pw_cli_warnf("fit",
                     "%s: the %s parameters predict a liquid-liquid split (d2(Gmix/RT)/dx1^2 = %.3g "
                     "at x1 = %.3f, %.1f K); if the liquids are known to mix, the fit is spurious",
                     input, r->sys.model->name, r->split_min_D, r->split_x, r->split_T_K);
    size_t competing = pw_fit_competing_minima(r);
    if (competing > 1)
        pw_cli_warnf("fit", "%s: %zu distinct minima fit the data about equally well (delta-AICc < 2); "
                     "the one without a liquid split and lowest chi2 is used, all are in the fit file",
                     input, competing);
    for (size_t a = 0; a < r->sys.model->n_params; a++)
        for (size_t b = a + 1; b < r->sys.model->n_params; b++)
            if (r->fitted[a] && r->fitted[b] && fabs(r->corr[a][b]) > 0.95)
                pw_cli_warnf("fit", "%s: parameters %s and %s are correlated (%.3f): poorly "
                             "identifiable from these data",
                             input, r->sys.model->param_names[a], r->sys.model->param_names[b],
                             r->corr[a][b]);
}

static int ensure_dir(const char *dir, pw_error *err)
{
    if (mkdir(dir, 0755) == 0 || errno == EEXIST)
        return 0;
    pw_error_set(err, PW_EIO, dir, 0, "cannot create folder: %s", strerror(errno));
    return pw_status_exit_code(PW_EIO);
}

int pw_fit_one(const char *input, const pw_model_type *model, const char *out, const char *out_dir,
               const pw_fit_cli_opts *co, pw_fit_result *r, char *path, size_t path_len,
               pw_error *err)
{
    memset(r, 0, sizeof *r);
    pw_dataset ds;
    pw_status st = pw_dataset_read(input, &ds, err);
    if (st != PW_OK)
        return pw_status_exit_code(st);
    const pw_component *c1 = NULL, *c2 = NULL;
    pw_component found[2];
    st = find_component(co->lib, &ds, 0, found, &c1, err);
    if (st == PW_OK)
        st = find_component(co->lib, &ds, 1, found, &c2, err);
    if (st == PW_OK)
        st = pw_dataset_to_mole(&ds, c1, c2, err); /* w1, wy1 columns */
    if (st == PW_OK) {
        char stem[PW_PATH_MAX];
        file_stem(input, stem, sizeof stem);
        int n;
        if (out)
            n = snprintf(path, path_len, "%s", out);
        else
            n = snprintf(path, path_len, "%s/%s.%s.json", out_dir ? out_dir : "fits", stem,
                         model->name);
        if (n < 0 || (size_t)n >= path_len)
            st = pw_error_set(err, PW_EINVAL, input, 0, "output path too long");
    }
    if (st == PW_OK && !out && ensure_dir(out_dir ? out_dir : "fits", err) != 0)
        st = err->status;
    /* Refuse early, before the work, when the fit file exists. */
    if (st == PW_OK && !co->force) {
        struct stat sb;
        if (stat(path, &sb) == 0)
            st = pw_error_set(err, PW_EEXIST, path, 0,
                              "fit file exists (pass --force to replace it, or choose another --out)");
    }
    if (st == PW_OK)
        st = pw_fit_run(&ds, c1, c2, model, &co->fit, r, err);
    pw_dataset_free(&ds);
    if (st != PW_OK)
        return pw_status_exit_code(st);
    if (!co->quiet) {
        if (!co->no_range_warning)
            warn_ranges(r, input);
        warn_pure_points(r, input);
        warn_duplicates(r, input);
        warn_fit(r, input);
    }
    st = pw_fitfile_write(path, r, co->force, err);
    if (st != PW_OK) {
        pw_fit_result_free(r);
        return pw_status_exit_code(st);
    }
    return 0;
}

json_t *pw_fit_cli_json(const pw_fit_result *r, const char *path)
{
    json_t *o = pw_fitfile_to_json(r);
    json_object_del(o, "data");
    json_object_del(o, "component_data");
    json_object_del(o, "format");
    json_object_del(o, "format_version");
    json_object_set_new(o, "fit_file", json_string(path));
    return o;
}

typedef struct ranked {
    const pw_model_type *model;
    pw_fit_result r;
    pw_az_result az;
    bool az_ok;
    char path[PW_PATH_MAX];
    int rc;
    pw_error err;
} ranked;

static int cmp_aicc(const void *a, const void *b)
{
    const ranked *x = a, *y = b;
    if (x->rc != y->rc)
        return x->rc == 0 ? -1 : 1;
    if (x->rc != 0)
        return 0;
    /* non-converged or split fits rank after the sound ones */
    int bx = !x->r.converged || x->r.split, by = !y->r.converged || y->r.split;
    if (bx != by)
        return bx - by;
    double ax = x->r.aicc, ay = y->r.aicc;
    return (ax > ay) - (ax < ay);
}

int pw_fit_all_models(const char *input, const char *out_dir, const pw_fit_cli_opts *co)
{
    size_t n;
    const pw_model_type *const *models = pw_model_all(&n);
    ranked *res = calloc(n, sizeof *res);
    if (!res)
        return pw_cli_failf("fit", pw_status_exit_code(PW_ENOMEM), "out of memory");
    size_t ok = 0;
    for (size_t i = 0; i < n; i++) {
        res[i].model = models[i];
        pw_error_clear(&res[i].err);
        pw_fit_cli_opts one = *co;
        one.no_range_warning = ok > 0; /* the data's range is the same for every model */
        res[i].rc = pw_fit_one(input, models[i], NULL, out_dir, &one, &res[i].r, res[i].path,
                               sizeof res[i].path, &res[i].err);
        ok += res[i].rc == 0;
        char what[64];
        snprintf(what, sizeof what, "models (%s %s)", models[i]->name,
                 res[i].rc == 0 ? "fitted" : "failed");
        pw_cli_progress_line("fit", what, i + 1, n);
    }
    for (size_t i = 0; i < n; i++)
        if (res[i].rc == 0) {
            const pw_fit_result *r = &res[i].r;
            bool isobaric = r->kind == PW_DATA_ISOBARIC;
            res[i].az_ok = pw_azeotrope_find(&r->sys, isobaric ? PW_AZ_ISOBARIC : PW_AZ_ISOTHERMAL,
                                             isobaric ? r->P_fixed_Pa : r->T_fixed_K, NULL,
                                             &res[i].az) == PW_OK;
        }
    qsort(res, n, sizeof *res, cmp_aicc);
    /* Judge the models where the design is decided: the azeotrope. Models within delta-AICc < 10
     * of the best that place it more than 0.01 apart in x1 (or disagree on its existence) are a
     * model risk worth a warning. */
    double xlo = INFINITY, xhi = -INFINITY;
    size_t with = 0, without = 0;
    for (size_t i = 0; i < n; i++) {
        if (res[i].rc != 0 || !res[i].az_ok || !(res[i].r.aicc - res[0].r.aicc < 10.0))
            continue;
        if (res[i].az.n == 0)
            without++;
        for (size_t k = 0; k < res[i].az.n; k++) {
            with += k == 0;
            xlo = fmin(xlo, res[i].az.az[k].x1);
            xhi = fmax(xhi, res[i].az.az[k].x1);
        }
    }
    if (with && without)
        pw_cli_warnf("fit", "%s: models that fit about equally well disagree on whether an azeotrope "
                     "exists at the data's condition", input);
    else if (with > 1 && xhi - xlo > 0.01)
        pw_cli_warnf("fit", "%s: models that fit about equally well place the azeotrope between x1 = "
                     "%.3f and %.3f: judge them near the azeotrope, not by AAD alone",
                     input, xlo, xhi);
    int rc = 0;
    double best_aicc = res[0].rc == 0 ? res[0].r.aicc : (double)NAN;
    if (co->json) {
        json_t *o = json_object();
        json_object_set_new(o, "ranking", json_string("AICc (Hurvich & Tsai 1989); fits that did not "
                                                      "converge or predict a liquid split rank last"));
        json_t *arr = json_array(), *failed = json_array();
        for (size_t i = 0; i < n; i++) {
            if (res[i].rc != 0) {
                char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
                json_t *f = json_object();
                json_object_set_new(f, "model", json_string(res[i].model->name));
                json_object_set_new(f, "error", json_string(pw_error_format(&res[i].err, buf, sizeof buf)));
                json_array_append_new(failed, f);
                continue;
            }
            json_t *m = pw_fit_cli_json(&res[i].r, res[i].path);
            json_object_set_new(m, "rank", json_integer((json_int_t)i + 1));
            json_object_set_new(m, "delta_aicc", pw_cli_json_num(res[i].r.aicc - best_aicc));
            json_t *azs = json_array();
            for (size_t k = 0; res[i].az_ok && k < res[i].az.n; k++)
                json_array_append_new(azs, json_pack("{s:o,s:o,s:o,s:s}", "x1",
                                                     pw_cli_json_num(res[i].az.az[k].x1), "T_K",
                                                     pw_cli_json_num(res[i].az.az[k].T_K), "P_kPa",
                                                     pw_cli_json_num(res[i].az.az[k].P_Pa / 1e3),
                                                     "kind",
                                                     res[i].az.az[k].kind == PW_AZ_MINIMUM_BOILING
                                                         ? "minimum-boiling"
                                                         : "maximum-boiling"));
            json_object_set_new(m, "azeotropes_at_data_condition",
                                res[i].az_ok ? azs : (json_decref(azs), json_null()));
            json_array_append_new(arr, m);
        }
        json_object_set_new(o, "models", arr);
        json_object_set_new(o, "failed", failed);
        json_object_set_new(o, "best", ok ? json_string(res[0].model->name) : json_null());
        rc = pw_cli_print_json(o);
    } else {
        printf("models ranked by AICc (lower is better; delta < 2: indistinguishable, > 10: no "
               "support; Burnham & Anderson 2002)\n");
        printf("  %-4s %-9s %9s %10s %10s %10s %10s  %s\n", "rank", "model", "dAICc", "AAD y",
               "AAD T/K", "AAD P/kPa", "x1 azeo.", "notes");
        for (size_t i = 0; i < n; i++) {
            if (res[i].rc != 0) {
                char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
                printf("  %-4s %-9s  failed: %s\n", "-", res[i].model->name,
                       pw_error_format(&res[i].err, buf, sizeof buf));
                continue;
            }
            const pw_fit_result *r = &res[i].r;
            char cy[16], cT[16], cP[16];
            snprintf(cy, sizeof cy, isfinite(r->dev_y.aad) ? "%.4f" : "-", r->dev_y.aad);
            snprintf(cT, sizeof cT, isfinite(r->dev_T_K.aad) ? "%.3f" : "-", r->dev_T_K.aad);
            snprintf(cP, sizeof cP, isfinite(r->dev_P_Pa.aad) ? "%.4f" : "-", r->dev_P_Pa.aad / 1e3);
            char ca[32] = "none";
            if (!res[i].az_ok)
                snprintf(ca, sizeof ca, "?");
            else if (res[i].az.n == 1)
                snprintf(ca, sizeof ca, "%.4f", res[i].az.az[0].x1);
            else if (res[i].az.n > 1)
                snprintf(ca, sizeof ca, "%.3f,%.3f", res[i].az.az[0].x1, res[i].az.az[1].x1);
            printf("  %-4zu %-9s %9.2f %10s %10s %10s %10s  %s%s\n", i + 1, r->sys.model->name,
                   r->aicc - best_aicc, cy, cT, cP, ca, r->converged ? "" : "not converged ",
                   r->split ? "liquid split predicted" : "");
        }
        bool negative = false;
        for (size_t i = 0; i < n; i++)
            negative = negative || (res[i].rc == 0 && res[i].r.aicc < best_aicc);
        printf("  dAICc = AICc - AICc of rank 1 (positive: fits worse than rank 1)%s\n",
               negative ? "; a negative value is a fit with a lower AICc ranked below rank 1 "
                          "because it did not converge or predicts a liquid split"
                        : "");
        for (size_t i = 0; i < n; i++)
            if (res[i].rc == 0)
                printf("  fit file: %s\n", res[i].path);
    }
    if (ok == 0) {
        rc = pw_cli_fail("fit", &res[0].err);
    }
    for (size_t i = 0; i < n; i++)
        pw_fit_result_free(&res[i].r);
    free(res);
    return rc;
}
