/* Fit diagnostics as data (include/pinchwise/fit_diagnostics.h): every kind is triggered by a
 * small invented data set (or, for the kinds that describe the fit's own classification, by
 * that state of a fit result: the classification itself is tested in test_fit_convergence.c)
 * and absent on a clean one; the JSON array carries the same list.
 * All data here are invented (generated from the model with a fixed pseudo-noise); the Antoine
 * constants are Smith, Van Ness & Abbott, 7th ed., Table B.2 (methanol from memory). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/fit.h>
#include <pinchwise/fit_diagnostics.h>
#include <pinchwise/fitjson.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static pw_component methanol(void)
{
    return pw_test_antoine("methanol", 16.5785, 3638.27, 239.500, PW_LN, "kPa", "C", 250.0, 450.0);
}
static pw_component water(void)
{
    return pw_test_antoine("water", 16.3872, 3885.70, 230.170, PW_LN, "kPa", "C", 250.0, 450.0);
}

/* Invented T-x-y data at 1 atm from Margules (A12, A21) with a deterministic noise of about the
 * stated uncertainties (0.1 K, 0.004 in y), n points at x1 = lo..hi. */
static void make_data(pw_dataset *ds, const pw_component *c1, const pw_component *c2, double A12,
                      double A21, size_t n, double lo, double hi, double noise, size_t extra)
{
    pw_system s = {.comp = {*c1, *c2}, .model = &pw_model_margules, .T_ref_K = 350.0};
    s.params[0] = A12;
    s.params[1] = A21;
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "invented.csv");
    snprintf(ds->names[0], sizeof ds->names[0], "%s", c1->name);
    snprintf(ds->names[1], sizeof ds->names[1], "%s", c2->name);
    ds->kind = PW_DATA_ISOBARIC;
    ds->has_y = true;
    ds->P_fixed_Pa = 101325.0;
    ds->T_fixed_K = NAN;
    ds->sigma_T_K = 0.1, ds->sigma_P_rel = 1e-3, ds->sigma_P_abs_Pa = NAN, ds->sigma_y = 0.004;
    ds->sigma_x = 0.001;
    ds->pts = calloc(n + extra, sizeof *ds->pts);
    assert_non_null(ds->pts);
    ds->n = n;
    for (size_t i = 0; i < n; i++) {
        double x = lo + (hi - lo) * (double)i / (double)(n - 1);
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(&s, 101325.0, x, &e), PW_OK);
        ds->pts[i].x1 = x;
        ds->pts[i].y1 = e.y1 + noise * 0.004 * sin(3.7 * (double)i + 1.0);
        ds->pts[i].T_K = e.T_K + noise * 0.1 * cos(2.3 * (double)i);
        ds->pts[i].P_Pa = 101325.0;
        ds->pts[i].line = (long)i + 4;
    }
}

static void add_point(pw_dataset *ds, double x1, double y1, double T_K)
{
    pw_point *p = &ds->pts[ds->n];
    p->x1 = x1;
    p->y1 = y1;
    p->T_K = T_K;
    p->P_Pa = 101325.0;
    p->line = ds->n > 0 ? ds->pts[ds->n - 1].line + 1 : 4;
    ds->n++;
}

static void fit_and_diagnose(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                             pw_fit_result *r, pw_fit_diags *d)
{
    pw_fit_options o = pw_fit_default_options();
    pw_error err;
    pw_status st = pw_fit_run(ds, c1, c2, &pw_model_margules, &o, r, &err);
    if (st != PW_OK)
        fail_msg("fit: %s", err.msg);
    assert_int_equal(pw_fit_diagnose(r, d), PW_OK);
}

static size_t count_kind(const pw_fit_diags *d, pw_fit_diag_kind k)
{
    size_t n = 0;
    for (size_t i = 0; i < d->n; i++)
        n += d->items[i].kind == k;
    return n;
}

static const pw_fit_diag *find_kind(const pw_fit_diags *d, pw_fit_diag_kind k)
{
    for (size_t i = 0; i < d->n; i++)
        if (d->items[i].kind == k)
            return &d->items[i];
    return NULL;
}

/* The clean data set: full range, noise of the stated size, nothing to say. */
static void clean_data_has_no_diagnostics(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 12, 0.04, 0.96, 1.0, 0);
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    for (size_t i = 0; i < d.n; i++)
        print_message("unexpected: %s: %s\n", pw_fit_diag_kind_name(d.items[i].kind),
                      d.items[i].message);
    assert_int_equal(d.n, 0);
    json_t *arr = pw_fit_diagnostics_json(&r);
    assert_non_null(arr);
    assert_int_equal(json_array_size(arr), 0);
    json_decref(arr);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

static void noise_free_data_are_exact(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 10, 0.05, 0.95, 0.0, 0);
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    assert_int_equal(r.fit_class, PW_FIT_EXACT);
    assert_int_equal(count_kind(&d, PW_DIAG_EXACT), 1);
    assert_int_equal(find_kind(&d, PW_DIAG_EXACT)->severity, PW_DIAG_NOTE);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Data above water's stated vapor-pressure range (invented range 250-360 K). */
static void range_beyond_vapor_pressure(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    b.T_max_K = 360.0;
    a.T_min_K = 340.0; /* and below methanol's (invented) */
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 12, 0.04, 0.96, 1.0, 0);
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_RANGE_ABOVE);
    assert_non_null(g);
    assert_int_equal(g->comp, 1);
    pw_assert_close(g->value, r.T_max_K - 360.0, 1e-12, 0, "K above");
    assert_string_equal(g->value_unit, "K");
    assert_non_null(strstr(g->message, "above the vapor-pressure range of water"));
    g = find_kind(&d, PW_DIAG_RANGE_BELOW);
    assert_non_null(g);
    assert_int_equal(g->comp, 0);
    pw_assert_close(g->value, 340.0 - r.T_min_K, 1e-12, 0, "K below");
    assert_int_equal(count_kind(&d, PW_DIAG_RANGE_ABOVE) + count_kind(&d, PW_DIAG_RANGE_BELOW), 2);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Pure-component rows at the other component's boiling point: the names are swapped. */
static void swapped_components(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 10, 0.1, 0.9, 1.0, 2);
    double Tb_m, Tb_w;
    assert_int_equal(pw_tsat(&a, 101325.0, &Tb_m), PW_OK);
    assert_int_equal(pw_tsat(&b, 101325.0, &Tb_w), PW_OK);
    add_point(&ds, 1.0, 1.0, Tb_w); /* "pure methanol" boiling like water: line 14 */
    add_point(&ds, 0.0, 0.0, Tb_m);
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_SWAPPED);
    assert_non_null(g);
    assert_int_equal(count_kind(&d, PW_DIAG_PURE_MISS), 0);
    pw_assert_close(g->value, fabs(Tb_w - Tb_m), 1e-9, 0, "miss as labelled");
    assert_true(g->value2 < 1e-6); /* exchanged: exact */
    assert_true(g->line == 14 || g->line == 15);
    assert_non_null(strstr(g->message, "swapped"));
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* A pure-component row 5 K off both boiling points: a miss, not a swap. */
static void pure_point_miss(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 10, 0.1, 0.9, 1.0, 1);
    double Tb_m;
    assert_int_equal(pw_tsat(&a, 101325.0, &Tb_m), PW_OK);
    add_point(&ds, 1.0, 1.0, Tb_m + 5.0);
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_PURE_MISS);
    assert_non_null(g);
    assert_int_equal(count_kind(&d, PW_DIAG_SWAPPED), 0);
    assert_int_equal(g->line, 14);
    pw_assert_close(g->value, 5.0, 1e-9, 0, "5 K miss");
    /* at the 2 K threshold (common practice) a 1.5 K miss says nothing */
    r.pts[r.n_pts - 1].meas.T_K = Tb_m + 1.5;
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    assert_int_equal(count_kind(&d, PW_DIAG_PURE_MISS), 0);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

static void duplicated_points(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 10, 0.05, 0.95, 1.0, 2);
    pw_point p3 = ds.pts[3];
    add_point(&ds, p3.x1, p3.y1, p3.T_K); /* line 14 repeats line 7 */
    add_point(&ds, p3.x1, p3.y1, p3.T_K); /* line 15 too */
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_DUPLICATES);
    assert_non_null(g);
    assert_int_equal(g->count, 2);
    assert_int_equal(g->line2, 7);
    assert_int_equal(g->line, 14);
    assert_int_equal(g->severity, PW_DIAG_NOTE);
    /* a point differing in the last digit of y is no repeat */
    r.pts[r.n_pts - 1].meas.y1 = nextafter(p3.y1, 1.0);
    r.pts[r.n_pts - 2].meas.T_K = nextafter(p3.T_K, 0.0);
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    assert_int_equal(count_kind(&d, PW_DIAG_DUPLICATES), 0);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

static void associating_vapor(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    snprintf(a.name, sizeof a.name, "invented Acid"); /* the name is what the check reads */
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 12, 0.04, 0.96, 1.0, 0);
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_VAPOR_ASSOCIATION);
    assert_non_null(g);
    assert_int_equal(g->comp, 0);
    assert_true(pw_component_vapor_associates(&a));
    assert_false(pw_component_vapor_associates(&b));
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Data only at the dilute end of component 1: A12 and A21 are fixed only together. */
static void correlated_parameters(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 8, 0.01, 0.05, 1.0, 0);
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_CORRELATED);
    if (!g)
        fail_msg("no correlation diagnostic (corr = %g, identifiable %d)", r.corr[0][1],
                 (int)r.identifiable);
    assert_int_equal(g->param, 0);
    assert_int_equal(g->param2, 1);
    pw_assert_close(g->value, r.corr[0][1], 0, 0, "correlation");
    assert_true(fabs(g->value) > PW_DIAG_CORRELATION);
    json_t *arr = pw_fit_diagnostics_json(&r);
    json_t *o = NULL;
    for (size_t i = 0; i < json_array_size(arr); i++)
        if (!strcmp(json_string_value(json_object_get(json_array_get(arr, i), "kind")),
                    "correlated-parameters"))
            o = json_array_get(arr, i);
    assert_non_null(o);
    assert_string_equal(json_string_value(json_array_get(json_object_get(o, "parameters"), 1)),
                        "A21");
    assert_string_equal(json_string_value(json_object_get(o, "severity")), "warning");
    json_decref(arr);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Margules A = 2.6 > 2 splits the liquid (symmetric Margules: critical A = 2, a textbook
 * identity); fitted to data generated from it, the parameters predict the split. */
static void liquid_split(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 2.6, 2.6, 6, 0.02, 0.08, 1.0, 0);
    pw_fit_result r;
    pw_fit_diags d;
    pw_fit_options o = pw_fit_default_options();
    o.three_phase_points = false;
    pw_error err;
    assert_int_equal(pw_fit_run(&ds, &a, &b, &pw_model_margules, &o, &r, &err), PW_OK);
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    if (!r.split)
        fail_msg("fit does not split: A12 %g A21 %g", r.sys.params[0], r.sys.params[1]);
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_LIQUID_SPLIT);
    assert_non_null(g);
    assert_true(g->value < 0.0);
    pw_assert_close(g->value2, r.split_x, 0, 0, "x at split");
    /* with three-phase points fitted as such, the note replaces the warning */
    r.n_three_phase = 2;
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    assert_int_equal(count_kind(&d, PW_DIAG_LIQUID_SPLIT), 0);
    g = find_kind(&d, PW_DIAG_HETEROGENEOUS);
    assert_non_null(g);
    assert_int_equal(g->count, 2);
    assert_non_null(strstr(g->message, "2 three-phase points and 0 tie lines"));
    /* a model that can never split (Wilson's equation): the same points left out, a warning
     * naming the model, never "fitted as such" */
    const pw_model_type *fitted = r.sys.model;
    r.sys.model = &pw_model_wilson;
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    g = find_kind(&d, PW_DIAG_HETEROGENEOUS);
    assert_non_null(g);
    assert_int_equal(g->severity, PW_DIAG_WARNING);
    assert_non_null(strstr(g->message, "that the wilson model cannot represent"));
    assert_null(strstr(g->message, "fitted as such"));
    r.sys.model = fitted;
    /* two tie lines at one temperature must give one pair of layers (phase rule): layers more
     * than 3 sigma_x apart are flagged with their LLE-file lines; other temperatures, or layers
     * within 3 sigma_x, are not */
    r.n_tie_lines = 2;
    r.sigma_x_lle = 0.003;
    r.ties = calloc(2, sizeof *r.ties);
    assert_non_null(r.ties);
    r.ties[0] = (pw_fit_tie){4, 298.15, 0.019, 0.488, 0.02, 0.49};
    r.ties[1] = (pw_fit_tie){5, 298.17, 0.3, 0.5, 0.02, 0.49};
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    g = find_kind(&d, PW_DIAG_TIES_DISAGREE);
    assert_non_null(g);
    assert_int_equal(g->severity, PW_DIAG_WARNING);
    assert_int_equal(g->count, 4);
    assert_int_equal(g->count2, 5);
    assert_int_equal(g->line, 0);
    pw_assert_close(g->value, 0.3 - 0.019, 0.0, 1e-15, "largest layer difference");
    r.ties[1].T_K = 308.15;
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    assert_int_equal(count_kind(&d, PW_DIAG_TIES_DISAGREE), 0);
    r.ties[1] = (pw_fit_tie){5, 298.15, 0.019 + 0.0089, 0.488 - 0.0089, 0.02, 0.49};
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    assert_int_equal(count_kind(&d, PW_DIAG_TIES_DISAGREE), 0);
    r.ties[1].x_II = 0.488 - 0.0091;
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    assert_int_equal(count_kind(&d, PW_DIAG_TIES_DISAGREE), 1);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Too few iterations: the fit stops at the iteration limit. */
static void not_converged(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 12, 0.04, 0.96, 1.0, 0);
    pw_fit_options o = pw_fit_default_options();
    o.max_iter = 1;
    o.n_starts = 1;
    pw_fit_result r;
    pw_fit_diags d;
    pw_error err;
    assert_int_equal(pw_fit_run(&ds, &a, &b, &pw_model_margules, &o, &r, &err), PW_OK);
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    if (r.converged)
        skip(); /* one step already converged: nothing to test with this data */
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_NOT_CONVERGED);
    assert_non_null(g);
    assert_int_equal(g->severity, PW_DIAG_SEVERE);
    assert_non_null(strstr(g->message, "did NOT converge"));
    /* the correlations of a fit that did not converge are still listed only when identifiable */
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* The states of a fit result that only the fit's classification makes (tested in
 * test_fit_convergence.c): each gives its record, with the parameter named. */
static void classification_states(void **state)
{
    (void)state;
    pw_component a = methanol(), b = water();
    pw_dataset ds;
    make_data(&ds, &a, &b, 0.70, 0.45, 12, 0.04, 0.96, 1.0, 0);
    pw_fit_result r;
    pw_fit_diags d;
    fit_and_diagnose(&ds, &a, &b, &r, &d);
    assert_int_equal(d.n, 0);

    pw_fit_result u = r;
    u.converged = false;
    u.fit_class = PW_FIT_RUNAWAY;
    u.runaway_param = 1;
    assert_int_equal(pw_fit_diagnose(&u, &d), PW_OK);
    assert_int_equal(count_kind(&d, PW_DIAG_RUNAWAY), 1);
    assert_int_equal(count_kind(&d, PW_DIAG_NOT_CONVERGED), 0);
    assert_int_equal(find_kind(&d, PW_DIAG_RUNAWAY)->param, 1);
    assert_non_null(strstr(find_kind(&d, PW_DIAG_RUNAWAY)->message, "A21 ran beyond"));

    u = r;
    u.fit_class = PW_FIT_UNIDENTIFIABLE;
    u.identifiable = false;
    u.weak_dir[0] = 1.0;
    u.weak_dir[1] = -0.5;
    u.corr[0][1] = u.corr[1][0] = 0.999; /* not meaningful then: no correlation record */
    assert_int_equal(pw_fit_diagnose(&u, &d), PW_OK);
    const pw_fit_diag *g = find_kind(&d, PW_DIAG_UNIDENTIFIABLE);
    assert_non_null(g);
    assert_non_null(strstr(g->message, "(1 A12 - 0.5 A21)"));
    assert_int_equal(count_kind(&d, PW_DIAG_CORRELATED), 0);

    u = r;
    u.n_minima = 2;
    u.minima[0].chi2 = 10.0;
    u.minima[1].chi2 = 10.05;
    assert_int_equal(pw_fit_diagnose(&u, &d), PW_OK);
    g = find_kind(&d, PW_DIAG_COMPETING_MINIMA);
    assert_non_null(g);
    assert_int_equal(g->count, 2);
    u.minima[1].chi2 = 30.0; /* clearly worse: no competition */
    assert_int_equal(pw_fit_diagnose(&u, &d), PW_OK);
    assert_int_equal(count_kind(&d, PW_DIAG_COMPETING_MINIMA), 0);

    assert_int_equal(pw_fit_diagnose(NULL, &d), PW_EINVAL);
    assert_int_equal(pw_fit_diagnose(&r, NULL), PW_EINVAL);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Every kind and severity has its own machine name. */
static void names_are_distinct(void **state)
{
    (void)state;
    for (int k = 0; k < PW_DIAG_KIND_COUNT; k++) {
        const char *n = pw_fit_diag_kind_name((pw_fit_diag_kind)k);
        assert_true(strcmp(n, "unknown") != 0 && n[0]);
        for (int j = 0; j < k; j++)
            assert_true(strcmp(n, pw_fit_diag_kind_name((pw_fit_diag_kind)j)) != 0);
    }
    assert_string_equal(pw_fit_diag_kind_name(PW_DIAG_KIND_COUNT), "unknown");
    assert_string_equal(pw_fit_diag_severity_name(PW_DIAG_SEVERE), "severe");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(clean_data_has_no_diagnostics),
        cmocka_unit_test(noise_free_data_are_exact),
        cmocka_unit_test(range_beyond_vapor_pressure),
        cmocka_unit_test(swapped_components),
        cmocka_unit_test(pure_point_miss),
        cmocka_unit_test(duplicated_points),
        cmocka_unit_test(associating_vapor),
        cmocka_unit_test(correlated_parameters),
        cmocka_unit_test(liquid_split),
        cmocka_unit_test(not_converged),
        cmocka_unit_test(classification_states),
        cmocka_unit_test(names_are_distinct),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
