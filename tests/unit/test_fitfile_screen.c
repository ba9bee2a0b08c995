/* Derived data never stale, when the reader keeps the file's liquid-stability screen
 * (fit_evaluate_reusing_screen): a fit file read back gives the same screen as computing it
 * afresh (pw_fit_evaluate) from the parameters read, whether the file's screen is its own,
 * left over from other parameters (a hand edit of one parameter), placed at a temperature the
 * screen never visits, or the file's components were replaced. Identity checks (a value against
 * its own recomputation); the data are INVENTED, the Antoine constants Smith, Van Ness &
 * Abbott, 7th ed., Table B.2 (methanol from memory). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/fileio.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>


/* A fit of invented methanol/water data with the NRTL parameters dg12, dg21 put in place of the
 * fitted ones and everything derived from them (pw_fit_evaluate), as text of its fit file. */
static char *fit_text(double dg12, double dg21)
{
    pw_component c1 = pw_test_antoine("methanol", 16.5785, 3638.27, 239.500, PW_LN, "kPa", "C",
                                      250.0, 450.0),
                 c2 = pw_test_antoine("water", 16.3872, 3885.70, 230.170, PW_LN, "kPa", "C", 250.0,
                                      450.0);
    pw_system s = {.comp = {c1, c2}, .model = &pw_model_nrtl, .T_ref_K = 350.0};
    s.params[0] = 100.0, s.params[1] = 300.0, s.params[2] = 0.3;
    pw_dataset ds;
    pw_test_invented_isobaric(&ds, &s, 11);
    pw_fit_options o = pw_fit_default_options();
    o.n_starts = 1;
    pw_fit_result r;
    pw_error err;
    if (pw_fit_run(&ds, &c1, &c2, &pw_model_nrtl, &o, &r, &err) != PW_OK)
        fail_msg("fit: %s", err.msg);
    r.sys.params[0] = dg12;
    r.sys.params[1] = dg21;
    (void)pw_fit_evaluate(&r);
    char path[64];
    snprintf(path, sizeof path, "/tmp/pw_fitscreen_XXXXXX");
    int fd = mkstemp(path);
    assert_true(fd >= 0);
    close(fd);
    assert_int_equal(pw_fitfile_write(path, &r, true, &err), PW_OK);
    char *buf;
    size_t len;
    assert_int_equal(pw_read_file(path, 1u << 24, &buf, &len, &err), PW_OK);
    unlink(path);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
    return buf;
}

/* The text with the first number after "key": replaced by value (a hand edit). */
static char *edit_number(const char *text, const char *key, const char *value)
{
    const char *k = strstr(text, key);
    assert_non_null(k);
    const char *v = strchr(k, ':') + 1;
    while (*v == ' ')
        v++;
    const char *e = v + strspn(v, "-+.0123456789eE");
    size_t head = (size_t)(v - text), vl = strlen(value);
    char *out = malloc(strlen(text) + vl + 1);
    assert_non_null(out);
    memcpy(out, text, head);
    memcpy(out + head, value, vl);
    strcpy(out + head + vl, e);
    return out;
}

/* Reads text and checks the screen (and every derived value) against a fresh pw_fit_evaluate
 * of the result read; returns the result (caller frees). */
static pw_fit_result read_and_check(const char *text)
{
    pw_fit_result r, fresh;
    pw_error err;
    if (pw_fitfile_parse(text, strlen(text), "edited.json", &r, &err) != PW_OK)
        fail_msg("read: %s", err.msg);
    assert_int_equal(pw_fit_result_copy(&fresh, &r), PW_OK);
    fresh.split_min_D = fresh.split_x = fresh.split_T_K = NAN;
    fresh.split = !r.split;
    double chi2 = fresh.chi2;
    (void)pw_fit_evaluate(&fresh);
    fresh.chi2 = chi2;
    assert_true(r.split == fresh.split);
    assert_true(r.split_min_D == fresh.split_min_D);
    assert_true(r.split_x == fresh.split_x || (isnan(r.split_x) && isnan(fresh.split_x)));
    assert_true(r.split_T_K == fresh.split_T_K || (isnan(r.split_T_K) && isnan(fresh.split_T_K)));
    for (size_t i = 0; i < r.n_pts; i++) {
        assert_true(r.pts[i].T_calc_K == fresh.pts[i].T_calc_K);
        assert_true(r.pts[i].y_calc == fresh.pts[i].y_calc);
    }
    pw_fit_result_free(&fresh);
    return r;
}

/* A screen that predicts a split (tau near 2.9 and 2.3 at 1 atm: the NRTL spinodal region of
 * alpha 0.3) and one that does not, each read back as written and with the other's parameters
 * edited in (the file's screen is then left over from the old parameters). */
static void screen_never_stale(void **state)
{
    (void)state;
    char *split = fit_text(1050.0, 800.0), *none = fit_text(100.0, 300.0);
    pw_fit_result a = read_and_check(split), b = read_and_check(none);
    assert_true(a.split && a.split_min_D < 0.0); /* the edits below can fail */
    assert_false(b.split);
    assert_true(b.split_min_D > 0.0);
    pw_fit_result_free(&a);
    pw_fit_result_free(&b);

    /* the split file with the parameters of the one without: no split any more */
    char *e1 = edit_number(split, "\"dg12_K\"", "100.0");
    char *e2 = edit_number(e1, "\"dg21_K\"", "300.0");
    pw_fit_result c = read_and_check(e2);
    assert_false(c.split);
    pw_fit_result_free(&c);
    free(e1);
    free(e2);
    /* and the other way */
    e1 = edit_number(none, "\"dg12_K\"", "1050.0");
    e2 = edit_number(e1, "\"dg21_K\"", "800.0");
    c = read_and_check(e2);
    assert_true(c.split);
    pw_fit_result_free(&c);
    free(e1);
    free(e2);
    /* one parameter moved in its last digits */
    e1 = edit_number(none, "\"dg12_K\"", "100.00000000001");
    c = read_and_check(e1);
    pw_fit_result_free(&c);
    free(e1);

    /* the file's screen itself edited: at a temperature the screen never visits, or a value
     * that contradicts "predicted" */
    e1 = edit_number(none, "\"T_K_at_min\"", "351.123");
    c = read_and_check(e1);
    pw_fit_result_free(&c);
    free(e1);
    e1 = edit_number(none, "\"min_D\"", "-0.5");
    c = read_and_check(e1);
    assert_false(c.split);
    pw_fit_result_free(&c);
    free(e1);
    /* the data range moved: the screened temperatures move with it */
    e1 = edit_number(split, "\"T_max_K\"", "400.0");
    c = read_and_check(e1);
    pw_fit_result_free(&c);
    free(e1);
    e1 = edit_number(split, "\"T_min_K\"", "300.0");
    c = read_and_check(e1);
    pw_fit_result_free(&c);
    free(e1);
    free(split);
    free(none);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(screen_never_stale),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
