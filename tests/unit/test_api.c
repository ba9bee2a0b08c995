/* The flat API of pinchwise/api.h (identities and refusals): a fit's text and the fit file it
 * writes give the same documents; azeotrope without a condition uses the data's own; every
 * failure leaves *doc NULL and names file, line and problem; lle, decanter, rate and reflux with
 * energy balances likewise. Datasets: the invented demo and the published methanol/water and
 * 1-butanol/water sets in datasets/. */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/api.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

static char demo[1024], tmpdir[] = "/tmp/pw-test-api-XXXXXX";

static int setup(void **state)
{
    (void)state;
    pw_test_path(demo, sizeof demo, "datasets/demo_acetone_water.csv");
    return mkdtemp(tmpdir) ? 0 : -1;
}

static int teardown(void **state)
{
    (void)state;
    char p[1100];
    snprintf(p, sizeof p, "%s/demo.json", tmpdir);
    unlink(p);
    return rmdir(tmpdir);
}

static void test_text_and_file_agree(void **state)
{
    (void)state;
    pw_error err;
    char out[1100], *doc = NULL, *text = NULL;
    snprintf(out, sizeof out, "%s/demo.json", tmpdir);
    assert_int_equal(pw_api_fit(demo, "nrtl", NULL, out, 1, &doc, &text, &err), PW_OK);
    assert_non_null(strstr(doc, "\"fit_file\": \""));
    pw_api_free(doc);
    /* the same split from the file written and from the text returned */
    char *a = NULL, *b = NULL;
    assert_int_equal(pw_api_reflux(out, NULL, NULL, NULL, "101.325kPa", 0.95, 0.02, 0.10, 1.0, 0,
                                   -1, -1, &a, &err),
                     PW_OK);
    assert_int_equal(
        pw_api_reflux(NULL, text, "demo", NULL, "1atm", 0.95, 0.02, 0.10, 1.0, 0, -1, -1, &b, &err),
        PW_OK);
    assert_string_equal(a, b);
    assert_non_null(strstr(a, "\"r_min\": "));
    pw_api_free(a);
    pw_api_free(b);
    /* azeotrope: the data's own condition (101.325 kPa) when none is given */
    assert_int_equal(pw_api_azeotrope(NULL, text, "demo", NULL, NULL, NULL, 0, -1, -1, &a, &err),
                     PW_OK);
    assert_int_equal(pw_api_azeotrope(out, NULL, NULL, NULL, "760mmHg", NULL, 0, -1, -1, &b, &err),
                     PW_OK);
    assert_string_equal(a, b);
    pw_api_free(a);
    pw_api_free(b);
    /* --uncertainty: the same draws from the text and from the file (seeded) */
    assert_int_equal(
        pw_api_reflux(out, NULL, NULL, NULL, "1atm", 0.95, 0.02, 0.10, 1.0, 1, 30, 7, &a, &err),
        PW_OK);
    assert_int_equal(
        pw_api_reflux(NULL, text, "demo", NULL, "1atm", 0.95, 0.02, 0.10, 1.0, 0, 30, 7, &b, &err),
        PW_OK);
    assert_string_equal(a, b);
    assert_non_null(strstr(a, "\"r_min_ci95\": ["));
    assert_non_null(strstr(a, "\"seed\": 7"));
    pw_api_free(a);
    pw_api_free(b);
    /* without an output file nothing is written and fit_file is null */
    assert_int_equal(pw_api_fit(demo, "wilson", NULL, NULL, 0, &doc, NULL, &err), PW_OK);
    assert_non_null(strstr(doc, "\"fit_file\": null"));
    pw_api_free(doc);
    pw_api_free(text);
}

static void test_refusals(void **state)
{
    (void)state;
    pw_error err;
    char *doc = (char *)"untouched", *text = (char *)"untouched";
    char bad[1024];
    pw_test_path(bad, sizeof bad, "tests/bad-inputs/files/nan_T.csv");
    assert_int_equal(pw_api_fit(bad, "nrtl", NULL, NULL, 0, &doc, &text, &err), PW_EPARSE);
    assert_null(doc);
    assert_null(text);
    assert_string_equal(err.file, bad);
    assert_int_equal(err.line, 8);
    assert_non_null(strstr(err.msg, "NaN"));

    doc = (char *)"untouched";
    assert_int_equal(pw_api_fit(demo, "no-such-model", NULL, NULL, 0, &doc, NULL, &err), PW_EINVAL);
    assert_null(doc);
    assert_non_null(strstr(err.msg, "unknown model"));
    assert_non_null(strstr(err.msg, "uniquac")); /* the list comes from the model table */

    assert_int_equal(pw_api_fit(demo, "nrtl", NULL, NULL, 0, NULL, NULL, &err), PW_EINVAL);
    assert_int_equal(pw_api_check(NULL, NULL, 0, &doc, &err), PW_EINVAL);

    char fit[1100];
    snprintf(fit, sizeof fit, "%s/demo.json", tmpdir);
    assert_int_equal(pw_api_reflux(fit, NULL, NULL, NULL, "101.325", 0.95, 0.02, 0.1, 1.0, 0, -1,
                                   -1, &doc, &err),
                     PW_EINVAL);
    assert_non_null(strstr(err.msg, "pressure 101.325"));
    assert_int_equal(
        pw_api_reflux(NULL, NULL, NULL, NULL, "1atm", 0.95, 0.02, 0.1, 1.0, 0, -1, -1, &doc, &err),
        PW_EINVAL);
    assert_int_equal(pw_api_reflux(NULL, "{\"format\": 1", "broken", NULL, "1atm", 0.95, 0.02, 0.1,
                                   1.0, 0, -1, -1, &doc, &err),
                     PW_EPARSE);
    assert_string_equal(err.file, "broken");
    assert_int_equal(pw_api_azeotrope(NULL, "{}", "x", NULL, "1atm", "50C", 0, -1, -1, &doc, &err),
                     PW_EINVAL);
    assert_null(doc);
    assert_int_equal(pw_api_reflux(fit, NULL, NULL, NULL, "1atm", 0.95, 0.02, 0.1, 1.0, 1, 100001,
                                   -1, &doc, &err),
                     PW_EINVAL);
    assert_non_null(strstr(err.msg, "samples 100001"));
    assert_true(pw_api_error_size() == sizeof(pw_error));
    pw_api_free(NULL);
}

/* lle, decanter, rate and reflux with energy balances: the same document from a fit's text and
 * from the fit file written; refusals leave *doc NULL. 1-butanol/water is the published set
 * of datasets/; its NRTL fit splits at 25 C (the shipped data are two-liquid, datasets/README). */
static void test_new_commands(void **state)
{
    (void)state;
    pw_error err;
    char bw[1024], out[1100], *doc = NULL, *text = NULL, *a = NULL, *b = NULL;
    pw_test_path(bw, sizeof bw, "datasets/butanol_water_1atm.csv");
    snprintf(out, sizeof out, "%s/bw.json", tmpdir);
    assert_int_equal(pw_api_fit(bw, "nrtl", NULL, out, 1, &doc, &text, &err), PW_OK);
    pw_api_free(doc);
    assert_int_equal(pw_api_lle(out, NULL, NULL, NULL, "25C", NULL, NULL, 0, &a, &err), PW_OK);
    assert_int_equal(pw_api_lle(NULL, text, "bw", NULL, "298.15K", NULL, NULL, 0, &b, &err), PW_OK);
    assert_string_equal(a, b);
    assert_non_null(strstr(a, "\"split\": true"));
    assert_null(strstr(a, "\"scan\""));
    pw_api_free(a);
    pw_api_free(b);
    assert_int_equal(pw_api_lle(NULL, text, "bw", NULL, "25C", "20C", "120C", 6, &a, &err), PW_OK);
    assert_non_null(strstr(a, "\"scan\": ["));
    assert_non_null(strstr(a, "\"critical\": ["));
    pw_api_free(a);
    assert_int_equal(
        pw_api_decanter(out, NULL, NULL, NULL, "1atm", 0.3, 0.99, 0.001, 1.0, &a, &err), PW_OK);
    assert_int_equal(
        pw_api_decanter(NULL, text, "bw", NULL, "101.325kPa", 0.3, 0.99, 0.001, 1.0, &b, &err),
        PW_OK);
    assert_string_equal(a, b);
    assert_non_null(strstr(a, "\"feasible\": true"));
    pw_api_free(a);
    pw_api_free(b);
    /* pw_api_decanter is pw_api_decanter_ex without uncertainty; with it, the same draws from
     * the fit file and from its text (tests/python: equal to the command's --json) */
    assert_int_equal(
        pw_api_decanter(out, NULL, NULL, NULL, "1atm", 0.3, 0.99, 0.001, 1.0, &a, &err), PW_OK);
    assert_int_equal(pw_api_decanter_ex(NULL, text, "bw", NULL, "1atm", 0.3, 0.99, 0.001, 1.0, 0,
                                        -1, -1, &b, &err),
                     PW_OK);
    assert_string_equal(a, b);
    assert_null(strstr(a, "\"uncertainty\""));
    pw_api_free(a);
    pw_api_free(b);
    assert_int_equal(pw_api_decanter_ex(out, NULL, NULL, NULL, "1atm", 0.3, 0.99, 0.001, 1.0, 1, 8,
                                        5, &a, &err),
                     PW_OK);
    assert_int_equal(pw_api_decanter_ex(NULL, text, "bw", NULL, "1atm", 0.3, 0.99, 0.001, 1.0, 0,
                                        8, 5, &b, &err),
                     PW_OK);
    assert_string_equal(a, b);
    assert_non_null(strstr(a, "\"boilup_min_ci95\": ["));
    assert_non_null(strstr(a, "\"evaluated\": 8"));
    assert_non_null(strstr(a, "\"seed\": 5"));
    pw_api_free(a);
    pw_api_free(b);
    /* an impossible specification is a document, not an error (and gets no interval) */
    assert_int_equal(
        pw_api_decanter(NULL, text, "bw", NULL, "1atm", 0.3, 0.3, 0.001, 1.0, &a, &err), PW_OK);
    assert_non_null(strstr(a, "\"feasible\": false"));
    pw_api_free(a);
    assert_int_equal(pw_api_decanter_ex(NULL, text, "bw", NULL, "1atm", 0.3, 0.3, 0.001, 1.0, 1, 8,
                                        5, &a, &err),
                     PW_OK);
    assert_non_null(strstr(a, "\"feasible\": false"));
    assert_null(strstr(a, "\"uncertainty\""));
    pw_api_free(a);
    doc = (char *)"untouched";
    assert_int_equal(pw_api_decanter_ex(NULL, text, "bw", NULL, "1atm", 0.3, 0.99, 0.001, 1.0, 1,
                                        200000, -1, &doc, &err),
                     PW_EINVAL);
    assert_null(doc);
    assert_non_null(strstr(err.msg, "samples 200000"));
    unlink(out);

    /* the invented demo: rate both balances, reflux with and without energy balances */
    assert_int_equal(pw_api_fit(demo, "nrtl", NULL, NULL, 0, &doc, &b, &err), PW_OK);
    pw_api_free(doc);
    pw_api_free(text);
    text = b;
    assert_int_equal(
        pw_api_rate(NULL, text, "demo", NULL, "1atm", 12, 9, 0.8, 0.1, 0.09, 1.0, 0, &a, &err),
        PW_OK);
    assert_non_null(strstr(a, "\"balance\": \"constant-molal-overflow\""));
    assert_null(strstr(a, "reboiler_kJ_per_mol_feed"));
    pw_api_free(a);
    assert_int_equal(
        pw_api_rate(NULL, text, "demo", NULL, "1atm", 12, 9, 0.8, 0.1, 0.09, 1.0, 1, &a, &err),
        PW_OK);
    assert_non_null(strstr(a, "\"balance\": \"energy\""));
    assert_non_null(strstr(a, "\"reboiler_kJ_per_mol_feed\": "));
    pw_api_free(a);
    /* pw_api_reflux is pw_api_reflux_ex without energy balances */
    assert_int_equal(
        pw_api_reflux(NULL, text, "demo", NULL, "1atm", 0.95, 0.02, 0.10, 1.0, 0, -1, -1, &a, &err),
        PW_OK);
    assert_int_equal(pw_api_reflux_ex(NULL, text, "demo", NULL, "1atm", 0.95, 0.02, 0.10, 1.0, 0,
                                      -1, -1, 0, &b, &err),
                     PW_OK);
    assert_string_equal(a, b);
    pw_api_free(a);
    pw_api_free(b);
    assert_int_equal(pw_api_reflux_ex(NULL, text, "demo", NULL, "1atm", 0.95, 0.02, 0.10, 1.0, 0,
                                      -1, -1, 1, &a, &err),
                     PW_OK);
    assert_non_null(strstr(a, "\"balance\": \"energy\""));
    assert_non_null(strstr(a, "\"condenser_kJ_per_mol_feed\": "));
    pw_api_free(a);

    /* refusals: *doc NULL, the argument named */
    doc = (char *)"untouched";
    assert_int_equal(pw_api_lle(NULL, text, "demo", NULL, "25", NULL, NULL, 0, &doc, &err),
                     PW_EINVAL);
    assert_null(doc);
    assert_non_null(strstr(err.msg, "temperature 25"));
    doc = (char *)"untouched";
    assert_int_equal(pw_api_lle(NULL, text, "demo", NULL, "25C", "20C", NULL, 5, &doc, &err),
                     PW_EINVAL);
    assert_null(doc);
    assert_int_equal(pw_api_lle(NULL, text, "demo", NULL, "25C", "20C", "30C", 1, &doc, &err),
                     PW_EINVAL);
    assert_non_null(strstr(err.msg, "from 2 to 1000"));
    doc = (char *)"untouched";
    assert_int_equal(
        pw_api_decanter(NULL, text, "demo", NULL, "1atm", 1.0, 0.99, 0.001, 1.0, &doc, &err),
        PW_EINVAL);
    assert_null(doc);
    assert_non_null(strstr(err.msg, "zf 1"));
    assert_int_equal(
        pw_api_decanter(NULL, text, "demo", NULL, "1atm", 0.3, 0.99, NAN, 1.0, &doc, &err),
        PW_EINVAL);
    assert_non_null(strstr(err.msg, "x1_lean"));
    doc = (char *)"untouched";
    assert_int_equal(
        pw_api_rate(NULL, text, "demo", NULL, "1atm", 0, 1, 1.0, 0.1, 0.05, 1.0, 0, &doc, &err),
        PW_EINVAL);
    assert_null(doc);
    assert_non_null(strstr(err.msg, "stages 0"));
    assert_int_equal(
        pw_api_rate(NULL, text, "demo", NULL, "1atm", 10, 11, 1.0, 0.1, 0.05, 1.0, 0, &doc, &err),
        PW_EINVAL);
    assert_null(doc);
    assert_string_equal(err.file, "demo");
    assert_int_equal(
        pw_api_rate(NULL, text, "demo", NULL, "1atm", 10, 5, 1.0, 0.1, 0.05, 11.0, 0, &doc, &err),
        PW_EINVAL);
    assert_non_null(strstr(err.msg, "q 11"));
    assert_int_equal(
        pw_api_rate(NULL, text, "demo", NULL, "1atm", 10, 5, 1.0, 0.1, 0.05, 1.0, 0, NULL, &err),
        PW_EINVAL);
    pw_api_free(text);
}

int main(void)
{
    pw_test_init();
    pw_api_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_text_and_file_agree),
        cmocka_unit_test(test_refusals),
        cmocka_unit_test(test_new_commands),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
