/* Convergence classes of the fit (docs/fitting.md, "Convergence classes"): exact fits of
 * noise-free ideal and non-ideal data, interior minima, not-identifiable combinations, runaways,
 * the iteration limit, the number of starts, and the class's round trip through the fit file.
 *
 * The ideal data follow Raoult's law (an identity: ln gamma = 0 for every model at its ideal
 * point) with the Antoine rows of benzene and toluene shipped in datasets/components.csv (Smith,
 * Van Ness & Abbott, 7th ed. 2005, Table B.2, from memory). Non-ideal, runaway and noisy data are
 * INVENTED round-trip data generated here from known parameters. */
#include "pw_test.h"

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <jansson.h>
#include <math.h>
#include <pinchwise/fit.h>
#include <pinchwise/fitjson.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static pw_component benzene(void)
{
    return pw_test_antoine("benzene", 13.7819, 2726.81, 217.572, PW_LN, "kPa", "C", 250.0, 450.0);
}
static pw_component toluene(void)
{
    return pw_test_antoine("toluene", 13.932, 3056.96, 217.625, PW_LN, "kPa", "C", 250.0, 450.0);
}

/* Noise-free points from system s (isobaric at 101.325 kPa or isothermal at T_K), n interior
 * points x = i/(n+1); noise_y/noise_T (K) / noise_P (relative) add seeded Gaussian noise;
 * printed rounds y to 4 decimals and T to 0.001 K, as data files usually print them. */
typedef struct gen {
    pw_data_kind kind;
    bool has_y;
    double T_K;
    size_t n;
    double noise_y, noise_T, noise_P;
    unsigned long seed;
    bool printed;
} gen;

static void make_data(pw_dataset *ds, const pw_system *s, const gen *g)
{
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "generated.csv");
    snprintf(ds->names[0], sizeof ds->names[0], "%s", s->comp[0].name);
    snprintf(ds->names[1], sizeof ds->names[1], "%s", s->comp[1].name);
    ds->kind = g->kind;
    ds->has_y = g->has_y;
    ds->P_fixed_Pa = g->kind == PW_DATA_ISOBARIC ? 101325.0 : NAN;
    ds->T_fixed_K = g->kind == PW_DATA_ISOTHERMAL ? g->T_K : NAN;
    ds->sigma_T_K = 0.1, ds->sigma_P_rel = 1e-3, ds->sigma_P_abs_Pa = NAN, ds->sigma_y = 0.004;
    ds->sigma_x = 0.001;
    ds->pts = calloc(g->n, sizeof *ds->pts);
    ds->n = g->n;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, g->seed);
    for (size_t i = 0; i < g->n; i++) {
        double x = (double)(i + 1) / (double)(g->n + 1);
        pw_eq_point e;
        pw_status st = g->kind == PW_DATA_ISOBARIC ? pw_bubble_T(s, 101325.0, x, &e)
                                                   : pw_bubble_P(s, g->T_K, x, &e);
        assert_int_equal(st, PW_OK);
        ds->pts[i].x1 = x;
        ds->pts[i].y1 = g->has_y ? e.y1 + g->noise_y * gsl_ran_gaussian(rng, 1.0) : NAN;
        ds->pts[i].T_K =
            e.T_K + (g->kind == PW_DATA_ISOBARIC ? g->noise_T * gsl_ran_gaussian(rng, 1.0) : 0.0);
        ds->pts[i].P_Pa =
            e.P_Pa *
            (g->kind == PW_DATA_ISOTHERMAL ? 1.0 + g->noise_P * gsl_ran_gaussian(rng, 1.0) : 1.0);
        ds->pts[i].line = (long)i + 5;
        if (g->printed) {
            ds->pts[i].y1 = round(ds->pts[i].y1 * 1e4) / 1e4;
            ds->pts[i].T_K = round(ds->pts[i].T_K * 1e3) / 1e3;
        }
    }
    gsl_rng_free(rng);
}

static pw_system ideal_system(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = benzene();
    s.comp[1] = toluene();
    s.model = &pw_model_margules; /* A12 = A21 = 0: Raoult's law */
    s.T_ref_K = 353.15;
    return s;
}

static void fit(const pw_dataset *ds, const pw_system *s, const char *model,
                const pw_fit_options *o, pw_fit_result *r)
{
    pw_error err;
    pw_status st = pw_fit_run(ds, &s->comp[0], &s->comp[1], pw_model_find(model), o, r, &err);
    if (st != PW_OK)
        print_error("fit failed: %s\n", err.msg);
    assert_int_equal(st, PW_OK);
}

/* Raoult's law data without noise: every model, every data type, reports an exact fit,
 * converged, with ln gamma_inf = 0 to 1e-8 (identity). Wilson and NRTL are not identifiable at
 * the ideal point (their two energies enter ln gamma only through one combination to first
 * order): the fit says so and gives no standard errors for them. Margules is identifiable. */
static void ideal_data_every_model_exact(void **state)
{
    (void)state;
    static const char *const models[] = {"margules", "vanlaar", "wilson", "nrtl"};
    const gen gens[] = {
        {PW_DATA_ISOBARIC, true, NAN, 15, 0, 0, 0, 1},
        {PW_DATA_ISOTHERMAL, true, 353.15, 15, 0, 0, 0, 1},
        {PW_DATA_ISOTHERMAL, false, 353.15, 15, 0, 0, 0, 1},
    };
    pw_system s = ideal_system();
    for (size_t g = 0; g < sizeof gens / sizeof gens[0]; g++) {
        pw_dataset ds;
        make_data(&ds, &s, &gens[g]);
        for (size_t m = 0; m < 4; m++) {
            pw_fit_options o = pw_fit_default_options();
            pw_fit_result r;
            fit(&ds, &s, models[m], &o, &r);
            char label[96];
            snprintf(label, sizeof label, "%s data %zu ln gamma1_inf", models[m], g);
            assert_true(r.converged);
            assert_int_equal(r.fit_class, PW_FIT_EXACT);
            pw_assert_close(r.lngamma_inf[0], 0.0, 0.0, 1e-8, label);
            snprintf(label, sizeof label, "%s data %zu ln gamma2_inf", models[m], g);
            pw_assert_close(r.lngamma_inf[1], 0.0, 0.0, 1e-8, label);
            assert_true(r.chi2 <= (double)r.n_residuals * PW_FIT_EXACT_RMS * PW_FIT_EXACT_RMS);
            assert_int_equal(r.runaway_param, -1);
            if (!strcmp(models[m], "margules")) {
                assert_true(r.identifiable);
                assert_true(isfinite(r.stderr_[0]) && isfinite(r.stderr_[1]));
                assert_true(r.stderr_meaningful[0] && r.stderr_meaningful[1]);
            }
            if (!strcmp(models[m], "wilson") || !strcmp(models[m], "nrtl")) {
                assert_false(r.identifiable);
                assert_true(isnan(r.stderr_[0]) && isnan(r.stderr_[1]));
                assert_false(r.stderr_meaningful[0] || r.stderr_meaningful[1]);
                /* the unfixed combination is a12 - a21 (b12 - b21), equal and opposite */
                pw_assert_close(r.weak_dir[0] * r.weak_dir[1], -1.0, 1e-6, 0.0, "weak direction");
            }
            pw_fit_result_free(&r);
        }
        pw_dataset_free(&ds);
    }
}

/* Noise-free non-ideal isothermal data: exact fits recovering the parameters (round trip). */
static void nonideal_exact_data_recovered(void **state)
{
    (void)state;
    const struct {
        const char *model;
        double p[PW_MAX_PARAMS];
    } cases[] = {
        {"margules", {0.80, 0.45}},
        {"vanlaar", {0.85, 0.50}},
        {"wilson", {150.0, 250.0, 1.0}},
        {"nrtl", {-120.0, 420.0, 0.3}},
    };
    for (size_t c = 0; c < sizeof cases / sizeof cases[0]; c++) {
        pw_system s = ideal_system();
        s.model = pw_model_find(cases[c].model);
        memcpy(s.params, cases[c].p, sizeof s.params);
        gen g = {PW_DATA_ISOTHERMAL, true, 353.15, 15, 0, 0, 0, 1};
        pw_dataset ds;
        make_data(&ds, &s, &g);
        pw_fit_options o = pw_fit_default_options();
        pw_fit_result r;
        fit(&ds, &s, cases[c].model, &o, &r);
        assert_true(r.converged);
        assert_int_equal(r.fit_class, PW_FIT_EXACT);
        assert_true(r.identifiable);
        for (size_t k = 0; k < 2; k++) {
            pw_assert_close(r.sys.params[k], cases[c].p[k], 1e-7, 1e-9, cases[c].model);
            /* exact fit: standard errors from the stated uncertainties (variance factor 1) */
            assert_true(isfinite(r.stderr_[k]) && r.stderr_[k] > 0.0);
        }
        pw_fit_result_free(&r);
        pw_dataset_free(&ds);
    }
}

/* Noisy non-ideal data: an interior minimum, identifiable, with finite standard errors. */
static void noisy_data_interior_minimum(void **state)
{
    (void)state;
    pw_system s = ideal_system();
    s.model = &pw_model_nrtl;
    s.params[0] = -120.0, s.params[1] = 420.0, s.params[2] = 0.3;
    gen g = {PW_DATA_ISOTHERMAL, true, 353.15, 15, 0.004, 0.0, 0.001, 7};
    pw_dataset ds;
    make_data(&ds, &s, &g);
    pw_fit_options o = pw_fit_default_options();
    pw_fit_result r;
    fit(&ds, &s, "nrtl", &o, &r);
    assert_true(r.converged);
    assert_int_equal(r.fit_class, PW_FIT_MINIMUM);
    assert_true(r.identifiable);
    assert_true(r.stop == PW_STOP_STEP || r.stop == PW_STOP_GRADIENT || r.stop == PW_STOP_MACHINE);
    assert_true(r.stderr_[0] > 0.0 && r.stderr_[1] > 0.0);
    assert_true(r.sv_ratio > PW_FIT_IDENT_SV_RATIO);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Not identifiable without being exact: NRTL with its alpha fitted too, on noisy data of a
 * symmetric, mildly non-ideal system (INVENTED, Margules A12 = A21 = 0.3). Near tau = 0, alpha
 * enters ln gamma only at second order, so the data cannot fix the direction that mostly moves
 * alpha: the fit converges, says which combination is unfixed and withholds those standard
 * errors. */
static void nrtl_alpha_not_identifiable(void **state)
{
    (void)state;
    pw_system s = ideal_system();
    s.params[0] = 0.3, s.params[1] = 0.3;
    gen g = {PW_DATA_ISOTHERMAL, true, 353.15, 15, 0.004, 0.0, 0.001, 11, false};
    pw_dataset ds;
    make_data(&ds, &s, &g);
    pw_fit_options o = pw_fit_default_options();
    o.fit_alpha = true;
    pw_fit_result r;
    fit(&ds, &s, "nrtl", &o, &r);
    print_message(
        "NRTL + alpha: class %s, b = %g, %g, alpha %g, se %g %g %g, sv ratio %g, weak %g %g %g\n",
        pw_fit_class_name(r.fit_class), r.sys.params[0], r.sys.params[1], r.sys.params[2],
        r.stderr_[0], r.stderr_[1], r.stderr_[2], r.sv_ratio, r.weak_dir[0], r.weak_dir[1],
        r.weak_dir[2]);
    assert_true(r.converged);
    assert_int_equal(r.fit_class, PW_FIT_UNIDENTIFIABLE);
    assert_false(r.identifiable);
    size_t not_meaningful = 0;
    for (size_t k = 0; k < 3; k++)
        not_meaningful += !r.stderr_meaningful[k];
    assert_true(not_meaningful >= 1);
    for (size_t k = 0; k < 3; k++)
        assert_true(r.stderr_meaningful[k] == isfinite(r.stderr_[k]));
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Data with two azeotropes (Margules A12 = 0.3, A21 = -0.3, whose ln(gamma1/gamma2) dips below
 * ln(P2sat/P1sat) in mid-range; INVENTED components with P2sat/P1sat = exp(dA)). van Laar cannot
 * change sign: with dA = 0.1 every run drifts to A12 -> infinity (ln gamma1 -> 0, ln gamma2 ->
 * A21: the infimum lies at infinity). Reported as runaway, never converged, no minimum kept. */
static pw_dataset two_azeotropes(double dA, double dA_fit, pw_system *s)
{
    *s = ideal_system();
    s->comp[0] = pw_test_antoine("invented-one", 14.0, 3000.0, 220.0, PW_LN, "kPa", "C", NAN, NAN);
    s->comp[1] =
        pw_test_antoine("invented-two", 14.0 + dA, 3000.0, 220.0, PW_LN, "kPa", "C", NAN, NAN);
    s->params[0] = 0.3, s->params[1] = -0.3;
    s->T_ref_K = 333.15; /* the fit's T_ref for isothermal data */
    gen g = {PW_DATA_ISOTHERMAL, true, 333.15, 19, 0, 0, 0, 1};
    pw_dataset ds;
    make_data(&ds, s, &g);
    s->comp[1] =
        pw_test_antoine("invented-two", 14.0 + dA_fit, 3000.0, 220.0, PW_LN, "kPa", "C", NAN, NAN);
    return ds;
}

static void runaway_never_converged(void **state)
{
    (void)state;
    pw_system s;
    pw_dataset ds = two_azeotropes(0.1, 0.1, &s);
    pw_fit_options o = pw_fit_default_options();
    pw_fit_result r;
    fit(&ds, &s, "vanlaar", &o, &r);
    assert_false(r.converged);
    assert_int_equal(r.fit_class, PW_FIT_RUNAWAY);
    assert_true(r.runaway_param >= 0);
    assert_true(fabs(r.sys.params[r.runaway_param]) > PW_FIT_BOUND_LNGAMMA ||
                fabs(r.sys.params[0]) > PW_FIT_BOUND_VANLAAR_RATIO * fabs(r.sys.params[1]) ||
                fabs(r.sys.params[1]) > PW_FIT_BOUND_VANLAAR_RATIO * fabs(r.sys.params[0]));
    assert_int_equal(r.n_minima, 0);
    assert_true(r.n_runaway_runs >= 1);
    /* Margules, which can change sign, fits the same data exactly */
    pw_fit_result rm;
    fit(&ds, &s, "margules", &o, &rm);
    assert_int_equal(rm.fit_class, PW_FIT_EXACT);
    pw_assert_close(rm.sys.params[0], 0.3, 1e-7, 0.0, "Margules A12");
    pw_fit_result_free(&rm);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* The same kind of data (dA = 0.05) fitted with vapor pressures that do not match them
 * (dA = 0.1): some van Laar runs still run away, but a bounded minimum exists; it is chosen and
 * the runaways are only counted. */
static void bounded_minimum_beats_runaway(void **state)
{
    (void)state;
    pw_system s;
    pw_dataset ds = two_azeotropes(0.05, 0.1, &s);
    pw_fit_options o = pw_fit_default_options();
    o.n_starts = 12;
    pw_fit_result r;
    fit(&ds, &s, "vanlaar", &o, &r);
    print_message(
        "van Laar, dA 0.05: class %s, A = %g, %g, runaway runs %zu (best chi2 %g), chi2 %g\n",
        pw_fit_class_name(r.fit_class), r.sys.params[0], r.sys.params[1], r.n_runaway_runs,
        r.runaway_chi2, r.chi2);
    assert_true(r.converged);
    assert_int_equal(r.fit_class, PW_FIT_MINIMUM);
    assert_int_equal(r.runaway_param, -1);
    assert_true(r.n_runaway_runs >= 1);
    assert_true(r.n_minima >= 1);
    for (size_t i = 0; i < r.n_minima; i++)
        assert_int_equal(
            pw_fit_runaway_param(r.sys.model, r.fitted, r.minima[i].params, r.sys.T_ref_K), -1);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* The documented bounds themselves (docs/fitting.md). */
static void runaway_bounds(void **state)
{
    (void)state;
    bool f2[PW_MAX_PARAMS] = {true, true};
    double p[PW_MAX_PARAMS] = {29.0, -29.0};
    assert_int_equal(pw_fit_runaway_param(&pw_model_margules, f2, p, 350.0), -1);
    p[1] = -31.0;
    assert_int_equal(pw_fit_runaway_param(&pw_model_margules, f2, p, 350.0), 1);
    double v[PW_MAX_PARAMS] = {1.0, 0.011};
    assert_int_equal(pw_fit_runaway_param(&pw_model_vanlaar, f2, v, 350.0), -1);
    v[1] = 0.009; /* ratio above 100 */
    assert_int_equal(pw_fit_runaway_param(&pw_model_vanlaar, f2, v, 350.0), 1);
    v[0] = 0.0, v[1] = 0.0; /* the ideal solution */
    assert_int_equal(pw_fit_runaway_param(&pw_model_vanlaar, f2, v, 350.0), -1);
    double b[PW_MAX_PARAMS] = {30.0 * 350.0 - 1.0, -30.0 * 350.0 + 1.0, 0.3};
    assert_int_equal(pw_fit_runaway_param(&pw_model_nrtl, f2, b, 350.0), -1);
    b[0] = 30.0 * 350.0 + 1.0;
    assert_int_equal(pw_fit_runaway_param(&pw_model_nrtl, f2, b, 350.0), 0);
}

/* An iteration limit too small to converge: reported as such, never as converged. */
static void iteration_limit_reported(void **state)
{
    (void)state;
    pw_system s = ideal_system();
    s.model = &pw_model_nrtl;
    s.params[0] = -120.0, s.params[1] = 420.0, s.params[2] = 0.3;
    gen g = {PW_DATA_ISOTHERMAL, true, 353.15, 15, 0.004, 0.0, 0.001, 3};
    pw_dataset ds;
    make_data(&ds, &s, &g);
    pw_fit_options o = pw_fit_default_options();
    o.max_iter = 1;
    pw_fit_result r;
    fit(&ds, &s, "nrtl", &o, &r);
    assert_false(r.converged);
    assert_int_equal(r.fit_class, PW_FIT_MAXITER);
    assert_int_equal(r.stop, PW_STOP_MAXITER);
    pw_fit_result_free(&r);
    o.max_iter = 0;
    pw_error err;
    assert_int_equal(pw_fit_run(&ds, &s.comp[0], &s.comp[1], &pw_model_nrtl, &o, &r, &err),
                     PW_EINVAL);
    pw_dataset_free(&ds);
}

/* n_starts is the number of LM runs, above 5 too. */
static void starts_do_what_they_say(void **state)
{
    (void)state;
    pw_system s = ideal_system();
    s.model = &pw_model_nrtl;
    s.params[0] = -120.0, s.params[1] = 420.0, s.params[2] = 0.3;
    gen g = {PW_DATA_ISOTHERMAL, true, 353.15, 15, 0.004, 0.0, 0.001, 5};
    pw_dataset ds;
    make_data(&ds, &s, &g);
    const size_t ns[] = {1, 2, 3, 6, 9, 20};
    for (size_t i = 0; i < sizeof ns / sizeof ns[0]; i++) {
        pw_fit_options o = pw_fit_default_options();
        o.n_starts = ns[i];
        pw_fit_result r;
        fit(&ds, &s, "nrtl", &o, &r);
        assert_int_equal(r.n_runs, ns[i]);
        assert_true(r.converged);
        pw_fit_result_free(&r);
    }
    pw_dataset_free(&ds);
}

/* The class survives the fit file, and the reader refuses a class that contradicts
 * "converged" or an unknown class, naming the key; a file without the object is accepted. */
static void fitfile_round_trip_of_the_class(void **state)
{
    (void)state;
    pw_system s = ideal_system();
    gen g = {PW_DATA_ISOTHERMAL, true, 353.15, 15, 0, 0, 0, 1};
    pw_dataset ds;
    make_data(&ds, &s, &g);
    pw_fit_options o = pw_fit_default_options();
    pw_fit_result r;
    fit(&ds, &s, "nrtl", &o, &r);
    json_t *j = pw_fitfile_to_json(&r);
    char *text = json_dumps(j, JSON_COMPACT);
    pw_fit_result back;
    pw_error err;
    pw_status st = pw_fitfile_parse(text, strlen(text), "rt.json", &back, &err);
    if (st != PW_OK)
        print_error("%s\n", err.msg);
    assert_int_equal(st, PW_OK);
    assert_int_equal(back.fit_class, PW_FIT_EXACT);
    assert_true(back.converged);
    assert_false(back.identifiable);
    pw_assert_close(back.weak_dir[1], r.weak_dir[1], 1e-12, 0.0, "weak direction read back");
    assert_false(back.stderr_meaningful[0]);
    pw_fit_result_free(&back);
    free(text);

    json_t *c = json_object_get(j, "convergence");
    json_object_set_new(c, "class", json_string("runaway"));
    text = json_dumps(j, JSON_COMPACT);
    assert_int_equal(pw_fitfile_parse(text, strlen(text), "bad.json", &back, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "convergence.class"));
    free(text);
    json_object_set_new(c, "class", json_string("fine"));
    text = json_dumps(j, JSON_COMPACT);
    assert_int_equal(pw_fitfile_parse(text, strlen(text), "bad.json", &back, &err), PW_EPARSE);
    assert_non_null(strstr(err.msg, "convergence.class"));
    free(text);
    json_object_del(j, "convergence");
    text = json_dumps(j, JSON_COMPACT);
    assert_int_equal(pw_fitfile_parse(text, strlen(text), "old.json", &back, &err), PW_OK);
    assert_int_equal(back.fit_class, PW_FIT_MINIMUM);
    pw_fit_result_free(&back);
    free(text);
    json_decref(j);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* Seeded random round trips: noise-free isothermal P-x-y data from random parameters of every
 * model (INVENTED; typical ranges, benzene/toluene vapor pressures). The generating parameters fit
 * with chi2 at rounding level, so the multistart must find an exact fit: class exact, converged,
 * and ln gamma_inf equal to the generating model's (closed forms through the model's own eval at
 * x1 = 0 and 1, an independent computation from the fit's). A search that missed the global
 * minimum would fail here. */
static void random_exact_round_trips(void **state)
{
    (void)state;
    static const char *const models[] = {"margules", "vanlaar", "wilson", "nrtl"};
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 20261202);
    size_t n_cases = 48;
    for (size_t c = 0; c < n_cases; c++) {
        const char *name = models[c % 4];
        pw_system s = ideal_system();
        s.model = pw_model_find(name);
        memcpy(s.params, s.model->defaults, sizeof(double) * s.model->n_params);
        double u1 = gsl_rng_uniform(rng), u2 = gsl_rng_uniform(rng);
        if (!strcmp(name, "margules")) {
            s.params[0] = -0.8 + 2.6 * u1, s.params[1] = -0.8 + 2.6 * u2;
        } else if (!strcmp(name, "vanlaar")) {
            double sign = gsl_rng_uniform(rng) < 0.3 ? -1.0 : 1.0;
            s.params[0] = sign * (0.2 + 1.6 * u1), s.params[1] = sign * (0.2 + 1.6 * u2);
        } else if (!strcmp(name, "wilson")) {
            s.params[0] = -150.0 + 700.0 * u1, s.params[1] = -150.0 + 700.0 * u2;
            s.params[2] = 1.0;
        } else {
            s.params[0] = -200.0 + 700.0 * u1, s.params[1] = -200.0 + 700.0 * u2;
            s.params[2] = 0.3;
        }
        s.T_ref_K = 353.15;
        gen g = {PW_DATA_ISOTHERMAL, true, 353.15, 15, 0, 0, 0, 1, false};
        pw_dataset ds;
        make_data(&ds, &s, &g);
        pw_fit_options o = pw_fit_default_options();
        o.seed = 1 + c;
        pw_fit_result r;
        fit(&ds, &s, name, &o, &r);
        pw_activity a0, a1;
        assert_int_equal(s.model->eval(s.params, s.T_ref_K, 0.0, s.T_ref_K, &a0), PW_OK);
        assert_int_equal(s.model->eval(s.params, s.T_ref_K, 1.0, s.T_ref_K, &a1), PW_OK);
        if (r.fit_class != PW_FIT_EXACT)
            fail_msg("case %zu %s (%g, %g): class %s, chi2 %g", c, name, s.params[0], s.params[1],
                     pw_fit_class_name(r.fit_class), r.chi2);
        assert_true(r.converged);
        char label[96];
        snprintf(label, sizeof label, "case %zu %s ln gamma1_inf", c, name);
        pw_assert_close(r.lngamma_inf[0], a0.lngamma[0], 1e-6, 1e-8, label);
        snprintf(label, sizeof label, "case %zu %s ln gamma2_inf", c, name);
        pw_assert_close(r.lngamma_inf[1], a1.lngamma[1], 1e-6, 1e-8, label);
        pw_fit_result_free(&r);
        pw_dataset_free(&ds);
    }
    gsl_rng_free(rng);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(ideal_data_every_model_exact),
        cmocka_unit_test(nonideal_exact_data_recovered),
        cmocka_unit_test(noisy_data_interior_minimum),
        cmocka_unit_test(nrtl_alpha_not_identifiable),
        cmocka_unit_test(runaway_never_converged),
        cmocka_unit_test(bounded_minimum_beats_runaway),
        cmocka_unit_test(runaway_bounds),
        cmocka_unit_test(iteration_limit_reported),
        cmocka_unit_test(starts_do_what_they_say),
        cmocka_unit_test(fitfile_round_trip_of_the_class),
        cmocka_unit_test(random_exact_round_trips),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
