/* Choosing another minimum of a fit (fit_minimum.h). Identity: choosing minimum 1 of a fit whose
 * driver chose minimum 1 reproduces the driver's parameters, chi-square and covariance (the same
 * Bates & Watts covariance recomputed from the fit's own points). Then every recorded minimum can
 * be chosen, its chi-square matches the one the multistart recorded, and an index out of range is
 * refused naming the range. Data: the shipped ethanol/water (Perry's) and MEK/toluene sets (sources
 * in their files). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/dataset.h>
#include <jansson.h>
#include <pinchwise/fit_minimum.h>
#include <pinchwise/fitjson.h>
#include <stdlib.h>
#include <string.h>

static void fit(const char *dataset, const char *model, pw_fit_result *r)
{
    char path[1024], cpath[1024];
    pw_error err;
    pw_complib lib;
    pw_dataset ds;
    pw_complib_init(&lib);
    assert_int_equal(
        pw_complib_read(&lib, pw_test_path(cpath, sizeof cpath, "datasets/components.csv"), &err),
        PW_OK);
    assert_int_equal(pw_dataset_read(pw_test_path(path, sizeof path, dataset), &ds, &err), PW_OK);
    pw_fit_options o = pw_fit_default_options();
    assert_int_equal(pw_fit_run(&ds, pw_complib_find(&lib, ds.names[0]),
                                pw_complib_find(&lib, ds.names[1]), pw_model_find(model), &o, r,
                                &err),
                     PW_OK);
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
}

static void same_minimum_reproduces_the_driver(void **state)
{
    (void)state;
    /* with the multistart of fit.c (start ranges from the model descriptors) the MEK/toluene
     * NRTL fits record two minima; the ethanol/water fit one */
    const char *sets[][2] = {{"datasets/ethanol_water_1atm.csv", "nrtl"},
                             {"datasets/mek_toluene_50C_pxy.csv", "nrtl"},
                             {"datasets/mek_toluene_50C_px.csv", "nrtl"}};
    size_t with_two = 0;
    for (size_t s = 0; s < 3; s++) {
        pw_fit_result r, c;
        fit(sets[s][0], sets[s][1], &r);
        assert_true(r.n_minima >= 1);
        with_two += r.n_minima >= 2;
        /* which recorded minimum did the driver choose? */
        size_t chosen = 0;
        for (size_t i = 0; i < r.n_minima; i++)
            if (!memcmp(r.minima[i].params, r.sys.params, sizeof r.sys.params))
                chosen = i + 1;
        assert_true(chosen >= 1);
        assert_int_equal(pw_fit_result_copy(&c, &r), PW_OK);
        pw_error err;
        assert_int_equal(pw_fit_use_minimum(&c, chosen, &err), PW_OK);
        pw_assert_close(c.chi2, r.chi2, 1e-9, 0, "chi2 at the same minimum");
        for (size_t k = 0; k < r.sys.model->n_params; k++) {
            pw_assert_close(c.sys.params[k], r.sys.params[k], 0, 0, "parameters");
            if (r.fitted[k])
                pw_assert_close(c.stderr_[k], r.stderr_[k], 1e-6, 0, "standard error recomputed");
        }
        pw_assert_close(c.aicc, r.aicc, 1e-9, 0, "AICc");
        pw_assert_close(c.dev_y.aad, r.dev_y.aad, 1e-12, 0, "deviations");
        /* every other minimum: its recorded chi-square, finite parameters */
        for (size_t i = 1; i <= r.n_minima; i++) {
            pw_fit_result d;
            assert_int_equal(pw_fit_result_copy(&d, &r), PW_OK);
            assert_int_equal(pw_fit_use_minimum(&d, i, &err), PW_OK);
            pw_assert_close(d.chi2, r.minima[i - 1].chi2, 1e-6, 0, "recorded chi2");
            assert_true(d.chi2 >= r.minima[0].chi2 * (1.0 - 1e-9));
            pw_fit_result_free(&d);
        }
        assert_int_equal(pw_fit_use_minimum(&c, r.n_minima + 1, &err), PW_EINVAL);
        assert_non_null(strstr(err.msg, "lowest chi-square first"));
        assert_int_equal(pw_fit_use_minimum(&c, 0, &err), PW_EINVAL);
        pw_fit_result_free(&c);
        pw_fit_result_free(&r);
    }
    assert_true(with_two >= 1); /* another minimum was actually chosen */
}

/* The default-minimum rule (pw_fit_default_minimum, docs/fitting.md). NRTL with alpha 0.3:
 * tau12 = tau21 = 1500 K / T (about 4.3 at 350 K) splits the liquid (the symmetric NRTL splits
 * once tau exceeds about 1.1 with alpha 0.3: a direct check of d2(Gmix/RT)/dx1^2 at x1 = 0.5, which
 * pw_stability_min reports), while the ethanol/water parameters of the shipped fit (dg12 -60 K,
 * dg21 658 K) do not. The rule must take the non-splitting minimum when its chi-square lies within
 * the factor max(1.01, exp(2/n)) of the lowest, and keep the lowest otherwise, and for data with
 * three-phase points or tie lines (a measured split). */
static void default_minimum_rule(void **state)
{
    (void)state;
    pw_fit_result r;
    memset(&r, 0, sizeof r);
    r.sys.model = pw_model_find("nrtl");
    r.sys.T_ref_K = 350.0;
    r.T_min_K = 340.0;
    r.T_max_K = 370.0;
    r.n_residuals = 30; /* exp(2/30) = 1.069 */
    const double split[3] = {1500.0, 1500.0, 0.3}, miscible[3] = {-60.0, 658.0, 0.3};
    memcpy(r.sys.params, split, sizeof split);
    memcpy(r.minima[0].params, split, sizeof split);
    memcpy(r.minima[1].params, miscible, sizeof miscible);
    memcpy(r.minima[2].params, split, sizeof split);
    r.minima[0].chi2 = 100.0;
    r.minima[1].chi2 = 106.0; /* within 100 x 1.069 */
    r.minima[2].chi2 = 300.0;
    r.n_minima = 3;
    /* the premise: minimum 1 splits, minimum 2 does not */
    double D, x;
    pw_system s = r.sys;
    assert_int_equal(pw_stability_min(&s, 350.0, &D, &x), PW_OK);
    assert_true(D < 0.0);
    memcpy(s.params, miscible, sizeof miscible);
    assert_int_equal(pw_stability_min(&s, 350.0, &D, &x), PW_OK);
    assert_true(D > 0.0);

    size_t skipped = 99;
    assert_int_equal(pw_fit_default_minimum(&r, &skipped), 2);
    assert_int_equal(skipped, 1);
    /* just outside the factor: the lowest stays the default */
    r.minima[1].chi2 = 100.0 * exp(2.0 / 30.0) * 1.001;
    assert_int_equal(pw_fit_default_minimum(&r, &skipped), 1);
    assert_int_equal(skipped, 0);
    /* with few residuals the floor 1.01 decides: n = 1000 gives exp(0.002) < 1.01 */
    r.n_residuals = 1000;
    r.minima[1].chi2 = 100.9;
    assert_int_equal(pw_fit_default_minimum(&r, NULL), 2);
    r.minima[1].chi2 = 101.1;
    assert_int_equal(pw_fit_default_minimum(&r, NULL), 1);
    /* a measured split (tie lines, three-phase points): the lowest, split or not */
    r.minima[1].chi2 = 100.5;
    r.n_tie_lines = 2;
    assert_int_equal(pw_fit_default_minimum(&r, NULL), 1);
    r.n_tie_lines = 0;
    r.n_three_phase = 1;
    assert_int_equal(pw_fit_default_minimum(&r, NULL), 1);
    r.n_three_phase = 0;
    assert_int_equal(pw_fit_default_minimum(&r, NULL), 2);
    /* the split minimum fits worse: the physical one is the lowest anyway */
    memcpy(r.minima[0].params, miscible, sizeof miscible);
    memcpy(r.minima[1].params, split, sizeof split);
    assert_int_equal(pw_fit_default_minimum(&r, &skipped), 1);
    assert_int_equal(skipped, 0);
    r.n_minima = 0;
    assert_int_equal(pw_fit_default_minimum(&r, NULL), 0);
}

/* The driver applies the same rule and records it: on the shipped sets the recorded default is
 * pw_fit_default_minimum of the fit, and the fit's parameters are that minimum's. */
static void driver_records_its_choice(void **state)
{
    (void)state;
    const char *sets[][2] = {{"datasets/ethanol_water_1atm.csv", "nrtl"},
                             {"datasets/mek_toluene_50C_pxy.csv", "nrtl"},
                             {"datasets/methanol_water_1atm.csv", "uniquac"}};
    for (size_t i = 0; i < 3; i++) {
        pw_fit_result r;
        fit(sets[i][0], sets[i][1], &r);
        size_t skipped;
        size_t k = pw_fit_default_minimum(&r, &skipped);
        assert_int_equal(r.minimum_default, k);
        assert_int_equal(r.minimum_split_skipped, skipped);
        assert_memory_equal(r.sys.params, r.minima[k - 1].params, sizeof r.sys.params);
        /* the fit file records the choice and reads it back */
        json_t *doc = pw_fitfile_to_json(&r);
        assert_non_null(doc);
        json_t *ch = json_object_get(doc, "minimum_choice");
        assert_non_null(ch);
        assert_int_equal(json_integer_value(json_object_get(ch, "minimum")), (json_int_t)k);
        if (i == 1) { /* MEK/toluene NRTL: two minima; the record of a passed-over split */
            assert_true(r.n_minima >= 2);
            pw_fit_result c = r;
            c.minimum_default = 2;
            c.minimum_split_skipped = 1;
            json_t *d2 = pw_fitfile_to_json(&c);
            json_t *c2 = json_object_get(d2, "minimum_choice");
            assert_int_equal(json_integer_value(json_object_get(c2, "split_skipped")), 1);
            assert_non_null(strstr(json_string_value(json_object_get(c2, "because")),
                                   "predict a liquid-liquid split"));
            char *text = json_dumps(d2, 0);
            pw_fit_result back;
            pw_error err;
            assert_int_equal(pw_fitfile_parse(text, strlen(text), "mem", &back, &err), PW_OK);
            assert_int_equal(back.minimum_default, 2);
            assert_int_equal(back.minimum_split_skipped, 1);
            pw_fit_result_free(&back);
            free(text);
            json_decref(d2);
        }
        json_decref(doc);
        pw_fit_result_free(&r);
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {cmocka_unit_test(same_minimum_reproduces_the_driver),
                                       cmocka_unit_test(default_minimum_rule),
                                       cmocka_unit_test(driver_records_its_choice)};
    return cmocka_run_group_tests(tests, NULL, NULL);
}
