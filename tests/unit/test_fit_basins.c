/* The multistart's known-basin rule (docs/fitting.md, "Multistart"): an LM run whose iterate
 * enters the neighbourhood of a minimum already found, with an objective not below that
 * minimum's, is stopped and counted as one more start ending there. Checked against the
 * exhaustive multistart (pw_fit_options.exhaustive_starts: every start run to its end), which is
 * the independent computation here: the same distinct minima in the same order with the same
 * start counts, the same chosen minimum and chi2, the same convergence class, the same counts of
 * LM runs and runaways, and never more LM iterations.
 * Data: every shipped data set (datasets/*.csv, sources in their files) with every model, and
 * seeded INVENTED data sets of the 200-set benchmark's kind (tools/bench.sh: NRTL energies drawn
 * in [-100, 400] K, 30 points at 101.325 kPa, Gaussian noise in T and y), for more pairs.
 * Agreement is required to the LM's own tolerances (chi2 to 1e-9 relative, parameters to 1e-6
 * relative): where an exhaustive run would have polished a known minimum in its last digits, the
 * recorded minimum is the first run's. The seed is fixed; a failure names the case. */
#include "pw_test.h"

#include <dirent.h>
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#ifndef M_PI
#define M_PI 3.14159265358979323846
#endif

#define N_INVENTED 40

static pw_complib lib;
static const char *const models[] = {"margules", "vanlaar", "wilson", "nrtl", "uniquac"};
static size_t iters_exhaustive, iters_basin, n_fits;

static bool close_rel(double a, double b, double rel, double abs_)
{
    if (isnan(a) || isnan(b))
        return isnan(a) && isnan(b);
    return fabs(a - b) <= rel * fmax(fabs(a), fabs(b)) + abs_;
}

/* Fits ds with model both ways and compares; label names the case. */
static void compare(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                    const pw_model_type *m, const char *label)
{
    pw_fit_options o = pw_fit_default_options();
    pw_fit_result a, b;
    pw_error ea, eb;
    o.exhaustive_starts = true;
    pw_status sa = pw_fit_run(ds, c1, c2, m, &o, &a, &ea);
    o.exhaustive_starts = false;
    pw_status sb = pw_fit_run(ds, c1, c2, m, &o, &b, &eb);
    if (sa != sb)
        fail_msg("%s %s: status %d exhaustive, %d with known basins", label, m->name, sa, sb);
    if (sa != PW_OK)
        return;
    bool ok = a.n_minima == b.n_minima && a.fit_class == b.fit_class && a.n_runs == b.n_runs &&
              a.n_runaway_runs == b.n_runaway_runs && a.converged == b.converged &&
              close_rel(a.chi2, b.chi2, 1e-9, 1e-12) && b.iterations <= a.iterations;
    for (size_t k = 0; ok && k < m->n_params; k++)
        ok = close_rel(a.sys.params[k], b.sys.params[k], 1e-6, 1e-7);
    for (size_t i = 0; ok && i < a.n_minima; i++) {
        ok = a.minima[i].hits == b.minima[i].hits &&
             close_rel(a.minima[i].chi2, b.minima[i].chi2, 1e-9, 1e-12);
        for (size_t k = 0; ok && k < m->n_params; k++)
            ok = close_rel(a.minima[i].params[k], b.minima[i].params[k], 1e-6, 1e-7);
    }
    if (!ok) {
        printf("%s %s: exhaustive chi2 %.12g class %d minima %zu runs %zu iters %zu; "
               "known basins chi2 %.12g class %d minima %zu runs %zu iters %zu\n",
               label, m->name, a.chi2, (int)a.fit_class, a.n_minima, a.n_runs, a.iterations,
               b.chi2, (int)b.fit_class, b.n_minima, b.n_runs, b.iterations);
        for (size_t i = 0; i < a.n_minima || i < b.n_minima; i++)
            printf("  minimum %zu: %.12g (%zu starts) | %.12g (%zu starts)\n", i + 1,
                   i < a.n_minima ? a.minima[i].chi2 : NAN, i < a.n_minima ? a.minima[i].hits : 0,
                   i < b.n_minima ? b.minima[i].chi2 : NAN, i < b.n_minima ? b.minima[i].hits : 0);
    }
    iters_exhaustive += a.iterations;
    iters_basin += b.iterations;
    n_fits++;
    pw_fit_result_free(&a);
    pw_fit_result_free(&b);
    if (!ok)
        fail_msg("%s %s: the known-basin multistart differs from the exhaustive one", label,
                 m->name);
}

static void shipped_datasets(void **state)
{
    (void)state;
    char dir[1024];
    pw_test_path(dir, sizeof dir, "datasets");
    DIR *d = opendir(dir);
    assert_non_null(d);
    size_t n_sets = 0;
    struct dirent *e;
    char names[64][256];
    while ((e = readdir(d)) && n_sets < 64) {
        size_t len = strlen(e->d_name);
        if (len > 4 && !strcmp(e->d_name + len - 4, ".csv") && strcmp(e->d_name, "components.csv"))
            snprintf(names[n_sets++], sizeof names[0], "%s", e->d_name);
    }
    closedir(d);
    assert_true(n_sets >= 7); /* the shipped sets listed in datasets/README.md */
    for (size_t s = 0; s < n_sets; s++) {
        char path[1400];
        snprintf(path, sizeof path, "%s/%s", dir, names[s]);
        pw_dataset ds;
        pw_error err;
        assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
        const pw_component *c1 = pw_complib_find(&lib, ds.names[0]);
        const pw_component *c2 = pw_complib_find(&lib, ds.names[1]);
        assert_non_null(c1);
        assert_non_null(c2);
        for (size_t k = 0; k < sizeof models / sizeof models[0]; k++)
            compare(&ds, c1, c2, pw_model_find(models[k]), names[s]);
        pw_dataset_free(&ds);
    }
}

/* An INVENTED isobaric data set from NRTL (alpha 0.3) with the benchmark's ranges; false when
 * a bubble point fails. */
static bool make_dataset(gsl_rng *r, const pw_component *c1, const pw_component *c2,
                         pw_dataset *ds)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *c1;
    s.comp[1] = *c2;
    s.model = &pw_model_nrtl;
    s.params[0] = gsl_ran_flat(r, -100.0, 400.0);
    s.params[1] = gsl_ran_flat(r, -100.0, 400.0);
    s.params[2] = 0.3;
    s.T_ref_K = 340.0;
    double sT = gsl_ran_flat(r, 0.05, 0.15), sy = gsl_ran_flat(r, 0.002, 0.006);
    const size_t n = 30;
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "invented");
    snprintf(ds->names[0], sizeof ds->names[0], "%s", c1->name);
    snprintf(ds->names[1], sizeof ds->names[1], "%s", c2->name);
    ds->kind = PW_DATA_ISOBARIC;
    ds->P_fixed_Pa = 101325.0;
    ds->T_fixed_K = NAN;
    ds->has_y = true;
    ds->sigma_T_K = sT;
    ds->sigma_P_rel = 1e-3;
    ds->sigma_P_abs_Pa = NAN;
    ds->sigma_y = sy;
    ds->sigma_x = 0.001;
    snprintf(ds->T_unit, sizeof ds->T_unit, "K");
    snprintf(ds->P_unit, sizeof ds->P_unit, "kPa");
    ds->pts = calloc(n, sizeof *ds->pts);
    if (!ds->pts)
        return false;
    for (size_t i = 0; i < n; i++) {
        double x = 0.5 - 0.5 * cos(M_PI * (double)(i + 1) / (double)(n + 1));
        pw_eq_point q;
        if (pw_bubble_T(&s, 101325.0, x, &q) != PW_OK) {
            pw_dataset_free(ds);
            return false;
        }
        pw_point *p = &ds->pts[i];
        p->x1 = x;
        p->y1 = fmin(1.0, fmax(0.0, q.y1 + gsl_ran_gaussian(r, sy)));
        p->T_K = q.T_K + gsl_ran_gaussian(r, sT);
        p->P_Pa = 101325.0;
        p->line = (long)i + 5;
    }
    ds->n = n;
    return true;
}

static void invented_datasets(void **state)
{
    (void)state;
    static const char *const pairs[][2] = {{"acetone", "methanol"}, {"methanol", "water"},
                                           {"benzene", "toluene"}, {"ethanol", "water"}};
    gsl_rng *r = gsl_rng_alloc(gsl_rng_mt19937);
    assert_non_null(r);
    gsl_rng_set(r, 20261202);
    size_t made = 0;
    for (size_t c = 0; made < N_INVENTED && c < 4 * N_INVENTED; c++) {
        const char *const *pr = pairs[c % (sizeof pairs / sizeof pairs[0])];
        const pw_component *c1 = pw_complib_find(&lib, pr[0]), *c2 = pw_complib_find(&lib, pr[1]);
        assert_non_null(c1);
        assert_non_null(c2);
        pw_dataset ds;
        if (!make_dataset(r, c1, c2, &ds))
            continue;
        char label[96];
        snprintf(label, sizeof label, "invented case %zu (%s/%s)", c, pr[0], pr[1]);
        for (size_t k = 0; k < sizeof models / sizeof models[0]; k++)
            compare(&ds, c1, c2, pw_model_find(models[k]), label);
        pw_dataset_free(&ds);
        made++;
    }
    gsl_rng_free(r);
    assert_int_equal(made, N_INVENTED);
    printf("known basins: %zu fits, LM iterations %zu exhaustive, %zu with known basins\n", n_fits,
           iters_exhaustive, iters_basin);
    assert_true(iters_basin < iters_exhaustive);
}

static int setup(void **state)
{
    (void)state;
    pw_test_init();
    return pw_test_read_complib(&lib);
}

static int teardown(void **state)
{
    (void)state;
    pw_complib_free(&lib);
    return 0;
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(shipped_datasets),
        cmocka_unit_test(invented_datasets),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
