/* What reads a fit file judges the data as `check` judges the data file, and lists the azeotropes
 * the azeotrope command lists:
 *  - pw_fit_dataset + pw_check_data on a fit result (and on the same result written to a fit file
 *    and read back) give the consistency result of pw_check_data on the data file itself, bit for
 *    bit: same stated sigmas, same three-phase points left out (an identity);
 *  - a fit file without data.uncertainties (written before the key existed) is still read;
 *  - the ranking's azeotropes (pw_rank_assess) are pw_azeotrope_search's: on butanol/water at
 *    1 atm (Stockhardt & Hull 1931, datasets/butanol_water_1atm.csv) no listed homogeneous root
 *    lies inside the two-liquid region at its temperature, and the heterogeneous azeotrope is
 *    listed near the measured plateau (y1 about 0.25 at about 366 K, lines 15-21 of the file). */
#include "pw_test.h"

#include <jansson.h>
#include <math.h>
#include <pinchwise/assess.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fitjson.h>
#include <pinchwise/hetcheck.h>
#include <pinchwise/lle.h>
#include <stdlib.h>
#include <string.h>

static pw_complib lib;

static void read_set(const char *rel, pw_dataset *ds, const pw_component **c1,
                     const pw_component **c2)
{
    char path[1024];
    pw_error err;
    pw_test_path(path, sizeof path, rel);
    assert_int_equal(pw_dataset_read(path, ds, &err), PW_OK);
    *c1 = pw_complib_find(&lib, ds->names[0]);
    *c2 = pw_complib_find(&lib, ds->names[1]);
    assert_non_null(*c1);
    assert_non_null(*c2);
}

static void same_result(const pw_consistency_result *a, const pw_het_check *ha,
                        const pw_consistency_result *b, const pw_het_check *hb)
{
    assert_int_equal(a->consistent, b->consistent);
    assert_int_equal(ha->n, hb->n);
    for (size_t i = 0; i < ha->n; i++)
        assert_int_equal(ha->pts[i].line, hb->pts[i].line);
    for (int i = 0; i < PW_CTEST_COUNT; i++) {
        assert_int_equal(a->tests[i].ran, b->tests[i].ran);
        if (!a->tests[i].ran) {
            assert_string_equal(a->tests[i].why_not, b->tests[i].why_not);
            continue;
        }
        assert_true(a->tests[i].value == b->tests[i].value);
        assert_true(a->tests[i].limit == b->tests[i].limit);
        assert_int_equal(a->tests[i].pass, b->tests[i].pass);
    }
}

/* Each shipped VLE set: the fit's data set judged as the file is. */
static void fit_data_judged_as_the_file(void **state)
{
    (void)state;
    static const char *const sets[] = {
        "datasets/butanol_water_1atm.csv", "datasets/butanol_water_25C.csv",
        "datasets/demo_acetone_water.csv", "datasets/ethanol_water_1atm.csv",
        "datasets/mek_toluene_50C_px.csv", "datasets/mek_toluene_50C_pxy.csv",
        "datasets/methanol_water_1atm.csv"};
    for (size_t s = 0; s < sizeof sets / sizeof sets[0]; s++) {
        pw_dataset ds;
        const pw_component *c1, *c2;
        read_set(sets[s], &ds, &c1, &c2);
        pw_error err;
        pw_consistency_result want, got, got2;
        pw_het_check hw, hg, hg2;
        assert_int_equal(pw_check_data(&ds, c1, c2, NULL, &hw, &want, &err), PW_OK);

        pw_fit_result *r = calloc(1, sizeof *r), *back = calloc(1, sizeof *back);
        assert_non_null(r);
        assert_non_null(back);
        pw_fit_options o = pw_fit_default_options();
        assert_int_equal(pw_fit_run(&ds, c1, c2, pw_model_find("nrtl"), &o, r, &err), PW_OK);
        assert_true(r->data_sigma_known);
        assert_int_equal(r->data_sigma_y_stated, ds.sigma_y_stated);

        pw_dataset fd;
        assert_int_equal(pw_fit_dataset(r, &fd), PW_OK);
        assert_int_equal(pw_check_data(&fd, &r->sys.comp[0], &r->sys.comp[1], NULL, &hg, &got,
                                       &err),
                         PW_OK);
        same_result(&want, &hw, &got, &hg);

        /* through the fit file's text */
        json_t *j = pw_fitfile_to_json(r);
        char *text = json_dumps(j, JSON_REAL_PRECISION(17));
        assert_non_null(text);
        assert_int_equal(pw_fitfile_parse(text, strlen(text), "mem.json", back, &err), PW_OK);
        assert_true(back->data_sigma_known);
        pw_dataset fd2;
        assert_int_equal(pw_fit_dataset(back, &fd2), PW_OK);
        assert_int_equal(pw_check_data(&fd2, &back->sys.comp[0], &back->sys.comp[1], NULL, &hg2,
                                       &got2, &err),
                         PW_OK);
        same_result(&want, &hw, &got2, &hg2);
        pw_fit_result_free(back);
        memset(back, 0, sizeof *back);

        /* an older fit file without data.uncertainties: read, nothing stated */
        json_object_del(json_object_get(j, "data"), "uncertainties");
        free(text);
        text = json_dumps(j, JSON_REAL_PRECISION(17));
        assert_int_equal(pw_fitfile_parse(text, strlen(text), "old.json", back, &err), PW_OK);
        assert_false(back->data_sigma_known);
        pw_dataset fd3;
        assert_int_equal(pw_fit_dataset(back, &fd3), PW_OK);
        assert_false(fd3.sigma_y_stated);
        assert_true(fd3.sigma_y == back->sigma_y);

        free(text);
        json_decref(j);
        pw_dataset_free(&fd);
        pw_dataset_free(&fd2);
        pw_dataset_free(&fd3);
        pw_consistency_result_free(&want);
        pw_consistency_result_free(&got);
        pw_consistency_result_free(&got2);
        pw_het_check_free(&hw, NULL);
        pw_het_check_free(&hg, NULL);
        pw_het_check_free(&hg2, NULL);
        pw_fit_result_free(r);
        pw_fit_result_free(back);
        free(r);
        free(back);
        pw_dataset_free(&ds);
    }
}

static void ranking_lists_the_azeotrope_commands_azeotropes(void **state)
{
    (void)state;
    pw_dataset ds;
    const pw_component *c1, *c2;
    read_set("datasets/butanol_water_1atm.csv", &ds, &c1, &c2);
    static const char *const names[] = {"margules", "vanlaar", "nrtl", "uniquac", "wilson"};
    static pw_fit_result f[5];
    const pw_fit_result *fp[5];
    pw_error err;
    for (int i = 0; i < 5; i++) {
        pw_fit_options o = pw_fit_default_options();
        assert_int_equal(pw_fit_run(&ds, c1, c2, pw_model_find(names[i]), &o, &f[i], &err), PW_OK);
        fp[i] = &f[i];
    }
    static pw_ranking rk;
    assert_int_equal(pw_rank_assess(fp, 5, NULL, &rk), PW_OK);
    /* the data hold three-phase points: a split is allowed, and the rule says so */
    assert_non_null(strstr(pw_rank_rule_text(&rk), "allowed"));
    size_t hetero = 0;
    for (size_t i = 0; i < rk.n; i++) {
        const pw_rank_row *w = &rk.rows[i];
        assert_int_equal(w->az_status, PW_OK);
        pw_az_result az;
        pw_three_phase tp;
        assert_int_equal(pw_azeotrope_search(&w->fit->sys, PW_AZ_ISOBARIC, ds.P_fixed_Pa, &az, &tp,
                                             NULL, NULL),
                         PW_OK);
        pw_rank_az list[PW_AZ_MAX + 1];
        size_t n = pw_rank_az_list(&az, &tp, list);
        assert_int_equal(w->n_azs, n);
        for (size_t k = 0; k < n; k++) {
            assert_true(w->azs[k].x1 == list[k].x1);
            assert_int_equal(w->azs[k].heterogeneous, list[k].heterogeneous);
            if (list[k].heterogeneous) {
                hetero++;
                pw_assert_close(list[k].x1, 0.25, 0, 0.03, "heterogeneous azeotrope y1");
                pw_assert_close(list[k].T_K, 366.0, 0, 1.0, "heterogeneous azeotrope T");
                continue;
            }
            /* a listed homogeneous root lies outside the two-liquid region at its T */
            pw_lle_result l;
            assert_int_equal(pw_lle_solve(&w->fit->sys, list[k].T_K, &l), PW_OK);
            for (size_t p = 0; l.split && p < l.n_pairs; p++)
                assert_false(list[k].x1 > l.pairs[p][0] && list[k].x1 < l.pairs[p][1]);
        }
    }
    assert_true(hetero >= 1);
    for (int i = 0; i < 5; i++)
        pw_fit_result_free(&f[i]);
    pw_dataset_free(&ds);
}

static int setup(void **state)
{
    (void)state;
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
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(fit_data_judged_as_the_file),
        cmocka_unit_test(ranking_lists_the_azeotrope_commands_azeotropes),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
