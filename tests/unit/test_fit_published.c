/* Fits to published data sets shipped in datasets/ (see datasets/README.md for each source). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <string.h>

static void fit_file(const char *dataset, const char *components, const char *model,
                     pw_fit_result *r)
{
    char path[1024], cpath[1024];
    pw_dataset ds;
    pw_complib lib;
    pw_error err;
    pw_complib_init(&lib);
    assert_int_equal(pw_complib_read(&lib, pw_test_path(cpath, sizeof cpath, "datasets/components.csv"), &err), PW_OK);
    if (components)
        assert_int_equal(pw_complib_read(&lib, pw_test_path(cpath, sizeof cpath, components), &err), PW_OK);
    assert_int_equal(pw_dataset_read(pw_test_path(path, sizeof path, dataset), &ds, &err), PW_OK);
    const pw_component *c1 = pw_complib_find(&lib, ds.names[0]);
    const pw_component *c2 = pw_complib_find(&lib, ds.names[1]);
    assert_non_null(c1);
    assert_non_null(c2);
    pw_fit_options o = pw_fit_default_options();
    assert_int_equal(pw_fit_run(&ds, c1, c2, pw_model_find(model), &o, r, &err), PW_OK);
    assert_true(r->converged);
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
}

/* Smith, Van Ness & Abbott, Introduction to Chemical Engineering Thermodynamics, 7th ed. (2005),
 * Example 12.1: 2-butanone(1)/toluene(2) at 50 C. The book's straight-line fit of
 * G^E/(x1 x2 RT) gives A12 = 0.372, A21 = 0.198 (from memory). With the book's own pure-component
 * pressures (36.09 and 12.30 kPa, tests/data/mek_toluene_50C_psat.csv) a bubble-pressure fit of the
 * same data must land close: the objectives differ (P and y residuals instead of the G^E line), so
 * the tolerance is 0.025 in A12 and 0.01 in A21. */
static void svna_mek_toluene_margules(void **state)
{
    (void)state;
    const char *files[] = {"datasets/mek_toluene_50C_pxy.csv", "datasets/mek_toluene_50C_px.csv"};
    for (int i = 0; i < 2; i++) {
        pw_fit_result r;
        fit_file(files[i], "tests/data/mek_toluene_50C_psat.csv", "margules", &r);
        pw_assert_close(r.sys.params[0], 0.372, 0.0, 0.025, "A12 (SVNA Ex. 12.1, from memory)");
        pw_assert_close(r.sys.params[1], 0.198, 0.0, 0.010, "A21 (SVNA Ex. 12.1, from memory)");
        /* the book shows the Margules correlation reproducing P within about 0.1-0.3 kPa */
        assert_true(r.dev_P_Pa.aad < 300.0);
        pw_fit_result_free(&r);
    }
}

/* Ethanol(1)/water(2) and methanol(1)/water(2) at 101.325 kPa, Perry's Chemical Engineers'
 * Handbook VLE tables (sources in datasets/README.md). Wilson and NRTL represent alcohol/water
 * T-x-y data at 1 atm to better than 0.01 in y (the usual expectation for a good correlation,
 * e.g. the DECHEMA VLE collection's mean deviations for such sets; common practice). */
static void alcohol_water_wilson_nrtl(void **state)
{
    (void)state;
    const char *sets[] = {"datasets/ethanol_water_1atm.csv", "datasets/methanol_water_1atm.csv"};
    const char *models[] = {"wilson", "nrtl"};
    for (int i = 0; i < 2; i++)
        for (int m = 0; m < 2; m++) {
            pw_fit_result r;
            fit_file(sets[i], NULL, models[m], &r);
            char label[160];
            snprintf(label, sizeof label, "%s %s AAD y", sets[i], models[m]);
            print_message("%s = %.4f, AAD T = %.3f K\n", label, r.dev_y.aad, r.dev_T_K.aad);
            assert_true(r.dev_y.aad < 0.01);
            assert_true(r.dev_T_K.aad < 0.5);
            assert_false(r.split); /* both pairs are fully miscible */
            pw_fit_result_free(&r);
        }
}

/* The ethanol/water azeotrope at 101.325 kPa: 89.4 mol % ethanol (95.6 wt %), 78.15-78.2 C
 * (handbook azeotrope tables; this project's methods brief, section 5.5, cites Lange's/CRC and
 * encyclopedia values). A Wilson fit to the Perry's T-x-y table must place it within 0.01 in x1
 * and 0.3 K. Other models with a similar AAD place it further away (NRTL with alpha = 0.3 at
 * about 0.93): that spread is the model risk docs/validation.md describes, so only the Wilson
 * result is held to the handbook here, and every model must at least find the azeotrope's
 * temperature within 0.5 K when it finds one. */
static void ethanol_water_azeotrope(void **state)
{
    (void)state;
    pw_fit_result r;
    fit_file("datasets/ethanol_water_1atm.csv", NULL, "wilson", &r);
    pw_az_result az;
    assert_int_equal(pw_azeotrope_find(&r.sys, PW_AZ_ISOBARIC, 101325.0, NULL, &az), PW_OK);
    assert_int_equal(az.n, 1);
    assert_int_equal(az.az[0].kind, PW_AZ_MINIMUM_BOILING);
    pw_assert_close(az.az[0].x1, 0.894, 0.0, 0.01, "x_az (handbook 0.894)");
    pw_assert_close(az.az[0].T_K, 78.15 + 273.15, 0.0, 0.3, "T_az (handbook 78.15 C)");
    pw_fit_result_free(&r);
    const char *others[] = {"vanlaar", "nrtl"};
    for (int m = 0; m < 2; m++) {
        fit_file("datasets/ethanol_water_1atm.csv", NULL, others[m], &r);
        assert_int_equal(pw_azeotrope_find(&r.sys, PW_AZ_ISOBARIC, 101325.0, NULL, &az), PW_OK);
        assert_int_equal(az.n, 1);
        pw_assert_close(az.az[0].T_K, 78.15 + 273.15, 0.0, 0.5, others[m]);
        assert_true(fabs(az.az[0].x1 - 0.894) < 0.05);
        pw_fit_result_free(&r);
    }
}

/* Methanol/water shows no azeotrope at 1 atm (handbook azeotrope tables list none; from memory). */
static void methanol_water_no_azeotrope(void **state)
{
    (void)state;
    const char *models[] = {"margules", "vanlaar", "wilson", "nrtl"};
    for (int m = 0; m < 4; m++) {
        pw_fit_result r;
        fit_file("datasets/methanol_water_1atm.csv", NULL, models[m], &r);
        pw_az_result az;
        assert_int_equal(pw_azeotrope_find(&r.sys, PW_AZ_ISOBARIC, 101325.0, NULL, &az), PW_OK);
        assert_int_equal(az.n, 0);
        pw_fit_result_free(&r);
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(svna_mek_toluene_margules),
        cmocka_unit_test(alcohol_water_wilson_nrtl),
        cmocka_unit_test(ethanol_water_azeotrope),
        cmocka_unit_test(methanol_water_no_azeotrope),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
