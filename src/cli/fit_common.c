#include "fit_common.h"

#include "cli.h"

#include <errno.h>
#include <math.h>
#include <pinchwise/assess.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/composition.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fileio.h>
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

void cli_fit_print_diags(const char *input, const pw_fit_diags *d, bool ranges,
                         const pw_display_units *u)
{
    char msg[PW_FIT_DIAG_MSG_MAX + 64];
    for (size_t i = 0; i < d->n; i++) {
        const pw_fit_diag *g = &d->items[i];
        if (!ranges && (g->kind == PW_DIAG_RANGE_BELOW || g->kind == PW_DIAG_RANGE_ABOVE))
            continue;
        /* the library's sentence names no command; the program adds where to go next */
        const char *next = g->kind == PW_DIAG_HETEROGENEOUS   ? "; see pinchwise lle and decanter"
                           : g->kind == PW_DIAG_LIQUID_IN_GAP ? "; see pinchwise fit --lle"
                                                              : "";
        pw_units_display_text(u, g->message, msg, sizeof msg);
        if (g->line > 0)
            cli_warnf("fit", "%s:%ld: %s%s", input, g->line, msg, next);
        else
            cli_warnf("fit", "%s: %s%s", input, msg, next);
    }
}

pw_status cli_fit_one(const char *input, const pw_model_type *model, const char *out, const char *out_dir,
               const cli_fit_opts *co, pw_fit_result *r, char *path, size_t path_len,
               pw_error *err)
{
    memset(r, 0, sizeof *r);
    pw_dataset ds;
    pw_status st = pw_dataset_read(input, &ds, err);
    if (st != PW_OK)
        return st;
    pw_component found[2];
    const pw_component *c1 = &found[0], *c2 = &found[1];
    st = pw_dataset_components(co->lib, &ds, found, err);
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
    /* The fit file may not be any input (by identity: links count), whatever --force says;
     * without --force it may not exist. Checked early, before the work, and again on writing. */
    pw_outset *set = NULL;
    if (st == PW_OK)
        st = pw_outset_new(co->force, cli_tmp_hooks(), &set, err);
    if (st == PW_OK && !out) /* made by the set: removed again if nothing is written */
        st = pw_outset_mkdir(set, out_dir ? out_dir : "fits", err);
    if (st == PW_OK)
        st = pw_outset_protect(set, input, err);
    for (size_t k = 0; st == PW_OK && k < co->n_inputs; k++)
        st = pw_outset_protect(set, co->inputs[k], err);
    if (st == PW_OK)
        st = pw_outset_check(set, path, err);
    pw_fit_options fo = co->fit;
    pw_tie_line *swapped = NULL;
    if (st == PW_OK && co->lle) /* tie lines: same components, in either order */
        st = pw_fit_attach_tie_lines_ex(co->lle, &ds, c1, c2, &fo, &swapped, err);
    if (st == PW_OK)
        st = pw_fit_run(&ds, c1, c2, model, &fo, r, err);
    free(swapped);
    pw_dataset_free(&ds);
    if (st != PW_OK) {
        pw_outset_free(set);
        return st;
    }
    if (!co->quiet || co->diags) {
        pw_fit_diags *d = co->diags ? co->diags : malloc(sizeof *d);
        st = d ? pw_fit_diagnose(r, d) : PW_ENOMEM;
        if (st == PW_OK && !co->quiet)
            cli_fit_print_diags(input, d, !co->no_range_warning, &co->units);
        if (d != co->diags)
            free(d);
        if (st != PW_OK) {
            pw_error_set(err, st, input, 0, "fit diagnostics: %s", pw_strerror(st));
            pw_outset_free(set);
            pw_fit_result_free(r);
            return st;
        }
    }
    st = pw_fitfile_stage(set, path, r, err);
    if (st == PW_OK)
        st = pw_outset_commit(set, err);
    pw_outset_free(set);
    if (st != PW_OK) {
        pw_fit_result_free(r);
        return st;
    }
    return PW_OK;
}

json_t *cli_fit_json(const pw_fit_result *r, const char *path)
{
    return pw_fit_doc(r, path);
}

typedef struct ranked {
    const pw_model_type *model;
    pw_fit_result r;
    char path[PW_PATH_MAX];
    pw_status rc;
    pw_error err;
} ranked;

pw_status cli_fit_all_models(const char *input, const char *out_dir, const cli_fit_opts *co)
{
    size_t n;
    const pw_model_type *const *models = pw_model_all(&n);
    ranked *res = calloc(n, sizeof *res);
    if (!res)
        return cli_failf("fit", PW_ENOMEM, "out of memory");
    size_t ok = 0;
    for (size_t i = 0; i < n; i++) {
        res[i].model = models[i];
        pw_error_clear(&res[i].err);
        cli_fit_opts one = *co;
        one.no_range_warning = ok > 0; /* the data's range is the same for every model */
        res[i].rc = cli_fit_one(input, models[i], NULL, out_dir, &one, &res[i].r, res[i].path,
                               sizeof res[i].path, &res[i].err);
        ok += res[i].rc == 0;
        char what[64];
        snprintf(what, sizeof what, "models (%s %s)", models[i]->name,
                 res[i].rc == 0 ? "fitted" : "failed");
        cli_progress_line("fit", what, i + 1, n);
    }
    /* One ranking rule (include/pinchwise/assess.h): sound fits by AICc, each model's azeotrope
     * at the data's condition, and the model risk among the considered fits. */
    const pw_fit_result *fits[PW_RANK_MAX];
    size_t nf = 0;
    for (size_t i = 0; i < n && nf < PW_RANK_MAX; i++)
        if (res[i].rc == 0)
            fits[nf++] = &res[i].r;
    pw_ranking *rk = calloc(1, sizeof *rk);
    if (!rk) {
        for (size_t i = 0; i < n; i++)
            pw_fit_result_free(&res[i].r);
        free(res);
        return cli_failf("fit", PW_ENOMEM, "out of memory");
    }
    if (nf > 0 && pw_rank_assess(fits, nf, NULL, rk) != PW_OK)
        rk->n = 0;
    /* fits[k] is res[map[k]] */
    size_t map[PW_RANK_MAX], k = 0;
    for (size_t i = 0; i < n && k < PW_RANK_MAX; i++)
        if (res[i].rc == 0)
            map[k++] = i;
    if (rk->az_existence_differs)
        cli_warnf("fit", "%s: models that fit about equally well disagree on whether an azeotrope "
                     "exists at the data's condition", input);
    else if (rk->az_place_differs)
        cli_warnf("fit", "%s: models that fit about equally well place the azeotrope between x1 = "
                     "%.3f and %.3f: judge them near the azeotrope, not by AAD alone",
                     input, rk->az_x_lo, rk->az_x_hi);
    pw_status rc = PW_OK;
    if (co->json) {
        json_t *o = json_object();
        char rule[512];
        snprintf(rule, sizeof rule,
                 "%s (AICc after Hurvich & Tsai 1989), classes after Burnham & Anderson (2002); "
                 "unsound fits rank below sound ones",
                 pw_rank_rule_text(rk));
        json_object_set_new(o, "ranking", json_string(rule));
        json_t *arr = json_array(), *failed = json_array();
        for (size_t j = 0; j < rk->n; j++) {
            const pw_rank_row *w = &rk->rows[j];
            const ranked *q = &res[map[w->index]];
            json_t *m = cli_fit_json(&q->r, q->path);
            json_object_set_new(m, "rank", json_integer((json_int_t)j + 1));
            json_object_set_new(m, "delta_aicc", cli_json_num(w->delta_aicc));
            json_object_set_new(m, "class", json_string(pw_rank_class_name(w->cls)));
            json_object_set_new(m, "akaike_weight", cli_json_num(w->weight));
            json_object_set_new(m, "azeotropes_at_data_condition",
                                pw_rank_az_json(w->azs, w->n_azs, w->az_status == PW_OK));
            json_array_append_new(arr, m);
        }
        for (size_t i = 0; i < n; i++) {
            if (res[i].rc == 0)
                continue;
            char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
            json_t *f = json_object();
            json_object_set_new(f, "model", json_string(res[i].model->name));
            json_object_set_new(f, "error", json_string(pw_error_format(&res[i].err, buf, sizeof buf)));
            json_array_append_new(failed, f);
        }
        json_object_set_new(o, "models", arr);
        json_object_set_new(o, "failed", failed);
        json_object_set_new(o, "best", rk->n ? json_string(rk->rows[0].fit->sys.model->name) : json_null());
        rc = cli_print_json(o);
    } else {
        printf("models ranked by AICc (dAICc = AICc - AICc of the best; lower is better; < 2: the data "
               "cannot tell them apart, >= 10: no support; Burnham & Anderson 2002)\n");
        char hT[24], hP[24];
        snprintf(hT, sizeof hT, "AAD T/%s", pw_units_display_dT_symbol(&co->units));
        snprintf(hP, sizeof hP, "AAD P/%s", pw_units_display_P_symbol(&co->units));
        printf("  %-4s %-9s %9s %-17s %10s %*s %10s %10s  %s\n", "rank", "model", "dAICc", "class",
               "AAD y", cli_width(10, hT), hT, hP, "x1 azeo.", "notes");
        for (size_t j = 0; j < rk->n; j++) {
            const pw_rank_row *w = &rk->rows[j];
            const pw_fit_result *r = w->fit;
            char cy[16], cT[16], cP[16], cd[16];
            snprintf(cy, sizeof cy, isfinite(r->dev_y.aad) ? "%.4f" : "-", r->dev_y.aad);
            snprintf(cT, sizeof cT, isfinite(r->dev_T_K.aad) ? "%.3f" : "-",
                     pw_units_display_dT(&co->units, r->dev_T_K.aad));
            snprintf(cP, sizeof cP, isfinite(r->dev_P_Pa.aad) ? "%.4g" : "-",
                     pw_units_display_P(&co->units, r->dev_P_Pa.aad));
            snprintf(cd, sizeof cd, isfinite(w->delta_aicc) ? "%.2f" : "-", w->delta_aicc);
            char ca[32] = "none";
            if (w->az_status != PW_OK)
                snprintf(ca, sizeof ca, "?");
            else if (w->n_azs == 1)
                snprintf(ca, sizeof ca, "%.4f%s", w->azs[0].x1, w->azs[0].heterogeneous ? "h" : "");
            else if (w->n_azs > 1)
                snprintf(ca, sizeof ca, "%.3f,%.3f", w->azs[0].x1, w->azs[1].x1);
            printf("  %-4zu %-9s %9s %-17s %10s %10s %10s %10s  %s%s\n", j + 1, r->sys.model->name, cd,
                   pw_rank_class_name(w->cls), cy, cT, cP, ca, r->converged ? "" : "not converged ",
                   !r->split                  ? ""
                   : pw_rank_split_allowed(r) ? "liquid split predicted (allowed: measured)"
                                              : "liquid split predicted");
        }
        bool negative = false;
        for (size_t j = 0; j < rk->n; j++)
            negative = negative || rk->rows[j].delta_aicc < 0.0;
        printf("  rule: %s\n", pw_rank_rule_text(rk));
        for (size_t j = 0; j < rk->n; j++)
            if (rk->rows[j].n_azs && rk->rows[j].azs[0].heterogeneous) {
                printf("  x1 azeo. with h: heterogeneous (the three-phase vapor)\n");
                break;
            }
        printf("  dAICc = AICc - AICc of rank 1 (positive: fits worse than rank 1)%s\n",
               negative ? "; a negative value is a fit with a lower AICc ranked below rank 1 "
                          "(see its class)"
                        : "");
        for (size_t i = 0; i < n; i++) {
            char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
            if (res[i].rc != 0)
                printf("  %-4s %-9s  failed: %s\n", "-", res[i].model->name,
                       pw_error_format(&res[i].err, buf, sizeof buf));
        }
        for (size_t j = 0; j < rk->n; j++)
            printf("  fit file: %s\n", res[map[rk->rows[j].index]].path);
    }
    free(rk);
    if (ok == 0) {
        rc = cli_fail("fit", &res[0].err);
    }
    for (size_t i = 0; i < n; i++)
        pw_fit_result_free(&res[i].r);
    free(res);
    return rc;
}
