/* Choosing another minimum of a fit (fit_minimum.h). Identity: choosing minimum 1 of a fit whose
 * driver chose minimum 1 reproduces the driver's parameters, chi-square and covariance (the same
 * Bates & Watts covariance recomputed from the fit's own points). Then every recorded minimum can
 * be chosen, its chi-square matches the one the multistart recorded, and an index out of range is
 * refused naming the range. Data: the shipped ethanol/water (Perry's) and MEK/toluene sets (sources
 * in their files). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fit_minimum.h>
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

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {cmocka_unit_test(same_minimum_reproduces_the_driver)};
    return cmocka_run_group_tests(tests, NULL, NULL);
}
