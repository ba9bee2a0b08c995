/* Benchmark driver (not a test; run by tools/bench.sh). Times the library in-process.
 *   pw-bench fit [--starts N] [--reps R] FILE...   one line per file: name, median seconds of
 *                                                 pw_fit_run over R repetitions, converged, chi2
 *   pw-bench reflux FIT.json P_kPa xd xb zf q N     median seconds per pw_column_solve call
 *   pw-bench scale FILE                            seconds of one fit and peak resident set
 *   pw-bench basins FILE...                        every model, default multistart against
 *                                                 exhaustive_starts: one line per file and
 *                                                 model, "same" or "DIFFERENT", LM iterations
 *   pw-bench minima FILE...                        every model, default options: one line per
 *                                                 file and model with the class, chosen chi2 and
 *                                                 parameters, every minimum (chi2, starts,
 *                                                 parameters), the stability screen's minimum
 *                                                 D and the LM iterations, to 17 digits; two
 *                                                 builds' outputs are compared by
 *                                                 tests/bench/compare_minima.py */
#include <gsl/gsl_errno.h>
#include <math.h>
#include <pinchwise/column.h>
#include <pinchwise/curve.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/resource.h>
#include <time.h>

static double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

static int cmp_d(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

static double median(double *v, size_t n)
{
    qsort(v, n, sizeof *v, cmp_d);
    return n % 2 ? v[n / 2] : 0.5 * (v[n / 2 - 1] + v[n / 2]);
}

static int fail(const pw_error *e)
{
    fprintf(stderr, "pw-bench: %s:%ld: %s\n", e->file, e->line, e->msg);
    return 1;
}

static int fit_one(const pw_complib *lib, const char *path, size_t starts, size_t reps,
                   bool scale)
{
    pw_dataset ds;
    pw_error err;
    if (pw_dataset_read(path, &ds, &err) != PW_OK)
        return fail(&err);
    const pw_component *c1 = pw_complib_find(lib, ds.names[0]), *c2 = pw_complib_find(lib, ds.names[1]);
    if (!c1 || !c2) {
        fprintf(stderr, "pw-bench: %s: unknown component\n", path);
        return 1;
    }
    pw_fit_options o = pw_fit_default_options();
    if (starts)
        o.n_starts = starts;
    double t[64];
    bool conv = false;
    double chi2 = NAN;
    for (size_t r = 0; r < reps; r++) {
        pw_fit_result res;
        double t0 = now();
        pw_status st = pw_fit_run(&ds, c1, c2, &pw_model_nrtl, &o, &res, &err);
        t[r] = now() - t0;
        if (st != PW_OK) {
            pw_dataset_free(&ds);
            return fail(&err);
        }
        conv = res.converged;
        chi2 = res.chi2;
        pw_fit_result_free(&res);
    }
    const char *base = strrchr(path, '/');
    if (scale) {
        struct rusage ru;
        getrusage(RUSAGE_SELF, &ru);
        printf("%zu\t%.6g\t%ld\t%d\n", ds.n, median(t, reps), ru.ru_maxrss, conv);
    } else {
        printf("%s\t%.6g\t%d\t%.10g\n", base ? base + 1 : path, median(t, reps), conv, chi2);
    }
    pw_dataset_free(&ds);
    return 0;
}

/* Same minima (count, order, starts, chi2 to 1e-9), choice and class with and without the
 * known-basin rule (docs/fitting.md); 1 when they differ. */
static int basins_one(const pw_complib *lib, const char *path, size_t *it_a, size_t *it_b)
{
    static const char *const models[] = {"margules", "vanlaar", "wilson", "nrtl", "uniquac"};
    pw_dataset ds;
    pw_error err;
    if (pw_dataset_read(path, &ds, &err) != PW_OK)
        return fail(&err);
    const pw_component *c1 = pw_complib_find(lib, ds.names[0]), *c2 = pw_complib_find(lib, ds.names[1]);
    int rc = c1 && c2 ? 0 : 1;
    const char *base = strrchr(path, '/');
    for (size_t k = 0; rc == 0 && k < sizeof models / sizeof models[0]; k++) {
        pw_fit_options o = pw_fit_default_options();
        pw_fit_result a, b;
        o.exhaustive_starts = true;
        pw_status sa = pw_fit_run(&ds, c1, c2, pw_model_find(models[k]), &o, &a, &err);
        o.exhaustive_starts = false;
        pw_status sb = pw_fit_run(&ds, c1, c2, pw_model_find(models[k]), &o, &b, &err);
        bool same = sa == sb;
        if (sa == PW_OK && sb == PW_OK) {
            same = a.n_minima == b.n_minima && a.fit_class == b.fit_class &&
                   fabs(a.chi2 - b.chi2) <= 1e-9 * fmax(a.chi2, 1e-3);
            for (size_t i = 0; same && i < a.n_minima; i++)
                same = a.minima[i].hits == b.minima[i].hits &&
                       fabs(a.minima[i].chi2 - b.minima[i].chi2) <= 1e-9 * fmax(a.minima[i].chi2, 1e-3);
            printf("%s\t%s\t%s\t%zu\t%zu\n", base ? base + 1 : path, models[k],
                   same ? "same" : "DIFFERENT", a.iterations, b.iterations);
            *it_a += a.iterations;
            *it_b += b.iterations;
        }
        if (sa == PW_OK)
            pw_fit_result_free(&a);
        if (sb == PW_OK)
            pw_fit_result_free(&b);
        rc = same ? 0 : 1;
    }
    pw_dataset_free(&ds);
    return rc;
}

/* One line per model of the fit of path (pw-bench minima). */
static int minima_one(const pw_complib *lib, const char *path)
{
    pw_dataset ds;
    pw_error err;
    if (pw_dataset_read(path, &ds, &err) != PW_OK)
        return fail(&err);
    const pw_component *c1 = pw_complib_find(lib, ds.names[0]), *c2 = pw_complib_find(lib, ds.names[1]);
    if (!c1 || !c2) {
        pw_dataset_free(&ds);
        return 1;
    }
    const char *base = strrchr(path, '/');
    size_t n_models;
    const pw_model_type *const *models = pw_model_all(&n_models);
    for (size_t k = 0; k < n_models; k++) {
        pw_fit_options o = pw_fit_default_options();
        pw_fit_result r;
        pw_status st = pw_fit_run(&ds, c1, c2, models[k], &o, &r, &err);
        printf("%s\t%s\t%d", base ? base + 1 : path, models[k]->name, (int)st);
        if (st == PW_OK) {
            printf("\t%d\t%.17g\t%zu", (int)r.fit_class, r.chi2, models[k]->n_params);
            for (size_t j = 0; j < models[k]->n_params; j++)
                printf("\t%.17g", r.sys.params[j]);
            printf("\t%.17g\t%zu\t%zu\t%zu", r.split_min_D, r.iterations, r.n_fev, r.n_minima);
            for (size_t i = 0; i < r.n_minima; i++) {
                printf("\t%.17g\t%zu", r.minima[i].chi2, r.minima[i].hits);
                for (size_t j = 0; j < models[k]->n_params; j++)
                    printf("\t%.17g", r.minima[i].params[j]);
            }
            pw_fit_result_free(&r);
        }
        printf("\n");
    }
    pw_dataset_free(&ds);
    return 0;
}

int main(int argc, char **argv)
{
    gsl_set_error_handler_off();
    if (argc < 3) {
        fprintf(stderr, "usage: see the header of tests/bench/bench_fit.c\n");
        return 2;
    }
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    if (pw_complib_read(&lib, PW_BENCH_COMPONENTS, &err) != PW_OK)
        return fail(&err);
    int rc = 0;
    if (!strcmp(argv[1], "fit") || !strcmp(argv[1], "scale")) {
        bool scale = !strcmp(argv[1], "scale");
        size_t starts = 0, reps = scale ? 1 : 5;
        int i = 2;
        for (; i + 1 < argc && argv[i][0] == '-'; i += 2) {
            if (!strcmp(argv[i], "--starts"))
                starts = strtoul(argv[i + 1], NULL, 10);
            else if (!strcmp(argv[i], "--reps"))
                reps = strtoul(argv[i + 1], NULL, 10);
        }
        if (reps < 1 || reps > 64)
            reps = 5;
        for (; i < argc && rc == 0; i++)
            rc = fit_one(&lib, argv[i], starts, reps, scale);
    } else if (!strcmp(argv[1], "basins")) {
        size_t it_a = 0, it_b = 0;
        int bad = 0;
        for (int i = 2; i < argc; i++)
            bad += basins_one(&lib, argv[i], &it_a, &it_b);
        printf("LM iterations: %zu exhaustive, %zu with known basins; %d file(s) differ\n", it_a,
               it_b, bad);
        rc = bad ? 1 : 0;
    } else if (!strcmp(argv[1], "minima")) {
        for (int i = 2; i < argc; i++)
            rc |= minima_one(&lib, argv[i]);
    } else if (!strcmp(argv[1], "reflux") && argc == 9) {
        pw_fit_result r;
        if (pw_fitfile_read(argv[2], &r, &err) != PW_OK)
            return fail(&err);
        pw_system_curve sc;
        pw_system_curve_init(&sc, &r.sys, atof(argv[3]) * 1e3);
        pw_curve curve = pw_system_curve_bind(&sc);
        pw_column_spec sp = {atof(argv[4]), atof(argv[5]), atof(argv[6]), atof(argv[7])};
        pw_column_options opt = pw_column_default_options();
        size_t n = strtoul(argv[8], NULL, 10);
        double *t = malloc((n ? n : 1) * sizeof *t);
        pw_column_result res;
        /* without the slope (the fixed table), then with it (pw_column_solve_system's way) */
        for (int with_dy = 0; with_dy < 2 && rc == 0; with_dy++) {
            pw_curve_dy_fn dy = with_dy ? pw_system_curve_dy(&sc) : NULL;
            unsigned long ev0 = sc.n_eval;
            for (size_t i = 0; i < n && t; i++) {
                double t0 = now();
                if (pw_column_solve_dy(&curve, dy, &sp, &opt, &res) != PW_OK) {
                    rc = 1;
                    break;
                }
                t[i] = now() - t0;
            }
            if (rc == 0 && t && n)
                printf("reflux%s\t%.6g\t%s\tR_min=%.17g\tevaluations_per_call=%lu\n",
                       with_dy ? " (slope)" : "", median(t, n),
                       res.pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed", res.r_min,
                       (sc.n_eval - ev0) / n);
        }
        free(t);
        pw_fit_result_free(&r);
    } else {
        fprintf(stderr, "pw-bench: unknown mode %s\n", argv[1]);
        rc = 2;
    }
    pw_complib_free(&lib);
    return rc;
}
