/* The fit file is written without building its points as a JSON tree (src/fit/fitfile_write.c):
 * its text must be exactly the dump of pw_fitfile_to_json (indent 1, shortest round-trip reals)
 * with a final newline, as before. Checked on a fit of the invented demo data, then with points
 * that carry every special case the writer formats by hand (excluded, three-phase, non-finite,
 * signed zero, subnormal and huge reals, large line numbers) and with no points at all. */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/commands.h>
#include <pinchwise/component.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fileio.h>
#include <pinchwise/fit.h>
#include <pinchwise/fitjson.h>
#include <pinchwise/jsontext.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

static char dir[64];

static int setup(void **state)
{
    (void)state;
    snprintf(dir, sizeof dir, "/tmp/pw_fitstream_XXXXXX");
    return mkdtemp(dir) ? 0 : -1;
}

static int teardown(void **state)
{
    (void)state;
    char p[128];
    snprintf(p, sizeof p, "%s/f.json", dir);
    unlink(p);
    return rmdir(dir);
}

/* The text the fit file had when it was dumped whole from the tree. */
static char *tree_text(const pw_fit_result *r)
{
    json_t *o = pw_fitfile_to_json(r);
    assert_non_null(o);
    char *full = json_dumps(o, JSON_INDENT(1) | JSON_REAL_PRECISION(17) | JSON_PRESERVE_ORDER);
    json_decref(o);
    char *text = pw_json_shortest_reals(full);
    free(full);
    assert_non_null(text);
    size_t n = strlen(text);
    char *withnl = realloc(text, n + 2);
    assert_non_null(withnl);
    memcpy(withnl + n, "\n", 2);
    return withnl;
}

static void written_equals_tree(const pw_fit_result *r)
{
    char path[128];
    snprintf(path, sizeof path, "%s/f.json", dir);
    pw_error err;
    if (pw_fitfile_write(path, r, true, &err) != PW_OK)
        fail_msg("write: %s", err.msg);
    char *got = NULL;
    size_t n = 0;
    assert_int_equal(pw_read_file(path, 1u << 26, &got, &n, &err), PW_OK);
    char *want = tree_text(r);
    assert_int_equal(n, strlen(want));
    assert_string_equal(got, want);
    free(got);
    free(want);
}

static void demo_fit(pw_fit_result *r)
{
    char data[512], comps[512];
    pw_test_path(data, sizeof data, "datasets/demo_acetone_water.csv");
    pw_test_path(comps, sizeof comps, "datasets/components.csv");
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    assert_int_equal(pw_complib_read(&lib, comps, &err), PW_OK);
    pw_dataset ds;
    assert_int_equal(pw_dataset_read(data, &ds, &err), PW_OK);
    pw_component c[2];
    assert_int_equal(pw_dataset_components(&lib, &ds, c, &err), PW_OK);
    pw_fit_options o = pw_fit_default_options();
    o.n_starts = 1;
    if (pw_fit_run(&ds, &c[0], &c[1], pw_model_find("nrtl"), &o, r, &err) != PW_OK)
        fail_msg("fit: %s", err.msg);
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
}

static void demo_fit_file_is_the_tree_dump(void **state)
{
    (void)state;
    pw_fit_result r;
    demo_fit(&r);
    assert_true(r.n_pts > 20);
    written_equals_tree(&r);
    pw_fit_result_free(&r);
}

static void special_points_are_formatted_as_jansson_does(void **state)
{
    (void)state;
    pw_fit_result r;
    demo_fit(&r);
    assert_true(r.n_pts >= 8);
    const double odd[] = {NAN, INFINITY, -INFINITY, -0.0, 0.0, 5e-324, 2.2250738585072014e-308,
                          1e21, 1e22, 123456789012345680000.0, 0.1, 1.0 / 3.0, -1e-5, 1e100,
                          -2.0, 1e-7, 100.0};
    const size_t n_odd = sizeof odd / sizeof odd[0];
    for (size_t i = 0; i < r.n_pts; i++) {
        pw_fit_point *p = &r.pts[i];
        p->excluded = i % 3 == 1;
        p->three_phase = i % 4 == 2;
        p->T_calc_K = odd[i % n_odd];
        p->y_calc = odd[(i + 5) % n_odd];
        p->lngamma_exp[0] = odd[(i + 9) % n_odd];
        p->lngamma_exp[1] = odd[(i + 13) % n_odd];
        p->meas.P_Pa = odd[(i + 2) % n_odd];
    }
    r.pts[0].meas.line = 2147483647L;
    r.pts[1].meas.line = 0;
    written_equals_tree(&r);

    /* no points: an empty array */
    size_t n = r.n_pts;
    r.n_pts = 0;
    written_equals_tree(&r);
    r.n_pts = n;
    pw_fit_result_free(&r);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test_setup_teardown(demo_fit_file_is_the_tree_dump, setup, teardown),
        cmocka_unit_test_setup_teardown(special_points_are_formatted_as_jansson_does, setup,
                                        teardown),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
