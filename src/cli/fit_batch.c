/* Batch fitting: every *.csv of a folder, two worker threads (the library keeps no global
 * state, so fits run side by side), results reported in file-name order. */
#include "fit_batch.h"

#include "cli.h"

#include <pinchwise/fitjson.h>

#include <dirent.h>
#include <errno.h>
#include <math.h>
#include <pthread.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#define BATCH_THREADS 2

typedef struct job {
    const pw_model_type *model; /* this job's model (every model of the table for --model all) */
    char name[256];
    char input[PW_PATH_MAX];
    char path[PW_PATH_MAX];
    pw_status rc;
    bool converged;
    size_t n_pts;
    double chi2_red, aad_y, aad_T_K, aad_P_Pa;
    pw_fit_diags diags; /* the fit's diagnostics, shown after the table (not by the worker) */
    pw_system sys;      /* names of components and parameters for them */
    pw_error err;
} job;

typedef struct batch {
    job *jobs;
    size_t n, next;
    pthread_mutex_t lock;
    const pw_model_type *model;
    const char *out_dir;
    const cli_fit_opts *co;
    size_t done;
} batch;

static int cmp_names(const void *a, const void *b)
{
    return strcmp(((const job *)a)->name, ((const job *)b)->name);
}

static void *worker(void *arg)
{
    batch *b = arg;
    for (;;) {
        pthread_mutex_lock(&b->lock);
        size_t i = b->next++;
        pthread_mutex_unlock(&b->lock);
        if (i >= b->n)
            return NULL;
        job *j = &b->jobs[i];
        pw_fit_result r;
        pw_error_clear(&j->err);
        cli_fit_opts co = *b->co;
        co.diags = &j->diags;
        j->rc = cli_fit_one(j->input, j->model, NULL, b->out_dir, &co, &r, j->path,
                           sizeof j->path, &j->err);
        j->converged = j->rc == 0 && r.converged;
        if (j->rc == 0) {
            j->n_pts = r.n_pts;
            j->chi2_red = r.chi2_red;
            j->aad_y = r.dev_y.aad;
            j->aad_T_K = r.dev_T_K.aad;
            j->aad_P_Pa = r.dev_P_Pa.aad;
            j->sys = r.sys;
            pw_fit_result_free(&r);
        }
        pthread_mutex_lock(&b->lock);
        b->done++;
        cli_progress("fit", "datasets", b->done, b->n);
        pthread_mutex_unlock(&b->lock);
    }
}

static pw_status list_csv(const char *dir, job **jobs, size_t *n)
{
    DIR *d = opendir(dir);
    if (!d)
        return cli_failf("fit", PW_EIO, "%s: cannot open folder: %s", dir,
                            strerror(errno));
    size_t cap = 16;
    *n = 0;
    *jobs = malloc(cap * sizeof **jobs);
    struct dirent *e;
    while (*jobs && (e = readdir(d))) {
        size_t len = strlen(e->d_name);
        if (len < 5 || strcmp(e->d_name + len - 4, ".csv") != 0 || e->d_name[0] == '.')
            continue;
        if (*n == cap) {
            job *nj = realloc(*jobs, 2 * cap * sizeof **jobs);
            if (!nj) {
                free(*jobs);
                *jobs = NULL;
                break;
            }
            *jobs = nj;
            cap *= 2;
        }
        job *j = &(*jobs)[(*n)++];
        memset(j, 0, sizeof *j);
        snprintf(j->name, sizeof j->name, "%s", e->d_name);
        snprintf(j->input, sizeof j->input, "%s/%s", dir, e->d_name);
    }
    closedir(d);
    if (!*jobs)
        return cli_failf("fit", PW_ENOMEM, "out of memory");
    qsort(*jobs, *n, sizeof **jobs, cmp_names);
    return PW_OK;
}

pw_status cli_fit_batch(const char *dir, const char *out_dir, const pw_model_type *model,
                 const cli_fit_opts *co)
{
    job *jobs = NULL;
    size_t n = 0;
    pw_status rc = list_csv(dir, &jobs, &n);
    if (rc != 0)
        return rc;
    if (n == 0) {
        free(jobs);
        return cli_failf("fit", PW_ENOTFOUND, "%s: no *.csv files", dir);
    }
    bool made_out_dir = mkdir(out_dir, 0777) == 0;
    if (!made_out_dir && errno != EEXIST) {
        free(jobs);
        return cli_failf("fit", PW_EIO, "%s: cannot create folder: %s",
                            out_dir, strerror(errno));
    }
    /* --model all: one job per dataset and model, in file-name order, then the model table's */
    size_t n_models = 1;
    const pw_model_type *const *models = model ? &model : pw_model_all(&n_models);
    job *all = calloc(n * n_models, sizeof *all);
    if (!all) {
        free(jobs);
        return cli_failf("fit", PW_ENOMEM, "out of memory");
    }
    for (size_t i = 0; i < n; i++)
        for (size_t m = 0; m < n_models; m++) {
            all[i * n_models + m] = jobs[i];
            all[i * n_models + m].model = models[m];
        }
    free(jobs);
    jobs = all;
    n *= n_models;
    cli_fit_opts wco = *co;
    wco.quiet = true;
    batch b = {.jobs = jobs, .n = n, .model = model, .out_dir = out_dir, .co = &wco};
    pthread_mutex_init(&b.lock, NULL);
    pthread_t th[BATCH_THREADS];
    size_t started = 0;
    for (size_t t = 0; t < BATCH_THREADS && t < n; t++)
        if (pthread_create(&th[t], NULL, worker, &b) == 0)
            started++;
    if (started == 0)
        worker(&b);
    for (size_t t = 0; t < started; t++)
        pthread_join(th[t], NULL);
    pthread_mutex_destroy(&b.lock);

    size_t ok = 0, conv = 0;
    for (size_t i = 0; i < n; i++) {
        ok += jobs[i].rc == 0;
        conv += jobs[i].converged;
    }
    if (co->json) {
        json_t *o = json_object(), *fits = json_array(), *failed = json_array();
        for (size_t i = 0; i < n; i++) {
            json_t *e = json_object();
            json_object_set_new(e, "dataset", json_string(jobs[i].name));
            json_object_set_new(e, "model", json_string(jobs[i].model->name));
            if (jobs[i].rc == 0) {
                json_object_set_new(e, "converged", json_boolean(jobs[i].converged));
                json_object_set_new(e, "fit_file", json_string(jobs[i].path));
                json_object_set_new(e, "points", json_integer((json_int_t)jobs[i].n_pts));
                json_object_set_new(e, "chi2_per_dof", cli_json_num(jobs[i].chi2_red));
                json_object_set_new(e, "aad_y", cli_json_num(jobs[i].aad_y));
                json_object_set_new(e, "aad_T_K", cli_json_num(jobs[i].aad_T_K));
                json_object_set_new(e, "aad_P_kPa", cli_json_num(jobs[i].aad_P_Pa / 1e3));
                json_object_set_new(e, "diagnostics",
                                    pw_fit_diags_json(&jobs[i].diags, &jobs[i].sys));
                json_array_append_new(fits, e);
            } else {
                char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
                json_object_set_new(e, "error",
                                    json_string(pw_error_format(&jobs[i].err, buf, sizeof buf)));
                json_array_append_new(failed, e);
            }
        }
        json_object_set_new(o, "fits", fits);
        json_object_set_new(o, "failed", failed);
        json_object_set_new(o, "summary",
                            json_pack("{s:I,s:I,s:I,s:I,s:s}", "datasets", (json_int_t)n, "fitted",
                                      (json_int_t)ok, "converged", (json_int_t)conv, "failed",
                                      (json_int_t)(n - ok), "model", model ? model->name : "all"));
        rc = cli_print_json(o);
    } else {
        printf("%zu of %zu %s fitted with %s into %s (%zu converged, %zu failed)\n", ok, n,
               model ? "datasets" : "dataset-model pairs", model ? model->name : "every model",
               out_dir, conv, n - ok);
        char hT[24], hP[24];
        snprintf(hT, sizeof hT, "AAD T/%s", pw_units_display_dT_symbol(&co->units));
        snprintf(hP, sizeof hP, "AAD P/%s", pw_units_display_P_symbol(&co->units));
        printf("  %-32s %-13s %6s %9s %8s %*s %9s  %s\n", "dataset", "status", "points",
               "chi2/dof", "AAD y", cli_width(8, hT), hT, hP, "fit file");
        for (size_t i = 0; i < n; i++) {
            char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
            const job *j = &jobs[i];
            if (j->rc == 0) {
                char cy[16], cT[16], cP[16];
                snprintf(cy, sizeof cy, isfinite(j->aad_y) ? "%.4f" : "-", j->aad_y);
                snprintf(cT, sizeof cT, isfinite(j->aad_T_K) ? "%.3f" : "-",
                         pw_units_display_dT(&co->units, j->aad_T_K));
                snprintf(cP, sizeof cP, isfinite(j->aad_P_Pa) ? "%.4g" : "-",
                         pw_units_display_P(&co->units, j->aad_P_Pa));
                printf("  %-32s %-13s %6zu %9.3g %8s %8s %9s  %s\n", model ? j->name : j->path,
                       j->converged ? "converged" : "NOT converged", j->n_pts, j->chi2_red, cy, cT,
                       cP, j->path);
            } else {
                printf("  %-32s failed: %s\n", j->name, pw_error_format(&j->err, buf, sizeof buf));
            }
        }
    }
    /* the same diagnostics as a single fit (data-range ones once per dataset) */
    if (!co->quiet)
        for (size_t i = 0; i < n; i++)
            if (jobs[i].rc == 0)
                cli_fit_print_diags(jobs[i].input, &jobs[i].diags, i % n_models == 0,
                                    &co->units);
    if (!co->json)
        for (size_t i = 0; i < n; i++)
            if (jobs[i].rc != 0) {
                char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
                fprintf(stderr, "pinchwise fit: %s\n", pw_error_format(&jobs[i].err, buf, sizeof buf));
            }
    /* CONTRACT: exit status 0 only when every file was fitted (the others are still written) */
    pw_status first_failure = PW_OK;
    for (size_t i = 0; i < n && !first_failure; i++)
        first_failure = jobs[i].rc;
    if (first_failure && co->json)
        fprintf(stderr, "pinchwise fit: %zu of %zu datasets failed (listed under \"failed\")\n",
                n - ok, n);
    if (made_out_dir && ok == 0)
        rmdir(out_dir); /* nothing was written: leave no empty folder either */
    free(jobs);
    return rc ? rc : first_failure;
}
