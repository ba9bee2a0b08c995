/* The one model-ranking rule (include/pinchwise/assess.h): classes after Burnham & Anderson (2002,
 * sec. 2.6), unsound fits last, Akaike weights, refusal of fits of different data; and the model
 * risk flags against a direct computation on fits of a published data set (ethanol/water at 1 atm,
 * Perry's table; datasets/ethanol_water_1atm.csv). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/assess.h>
#include <pinchwise/dataset.h>
#include <string.h>

static void classes_and_weights(void **state)
{
    (void)state;
    static pw_fit_result f[5];
    const double aicc[5] = {101.5, 100.0, 105.0, 120.0, 95.0};
    const pw_fit_result *fp[5];
    for (int i = 0; i < 5; i++) {
        memset(&f[i], 0, sizeof f[i]);
        f[i].sys.model = &pw_model_margules;
        f[i].aicc = aicc[i];
        f[i].n_residuals = 30;
        f[i].converged = i != 4; /* the lowest AICc did not converge: ranks last */
        fp[i] = &f[i];
    }
    pw_ranking rk;
    assert_int_equal(pw_rank_fits(fp, 5, &rk), PW_OK);
    static const size_t order[5] = {1, 0, 2, 3, 4};
    static const pw_rank_class cls[5] = {PW_RANK_BEST, PW_RANK_EQUAL, PW_RANK_CONSIDERED,
                                         PW_RANK_DROPPED, PW_RANK_UNSOUND};
    double wsum = 0.0;
    for (int i = 0; i < 5; i++) {
        assert_int_equal(rk.rows[i].index, order[i]);
        assert_int_equal(rk.rows[i].cls, cls[i]);
        wsum += rk.rows[i].weight;
    }
    assert_int_equal(rk.n_considered, 3);
    pw_assert_close(wsum, 1.0, 1e-15, 0, "weights sum to one");
    pw_assert_close(rk.rows[0].weight, 1.0 / (1.0 + exp(-0.75) + exp(-2.5)), 1e-14, 0, "Akaike weight");
    pw_assert_close(rk.rows[3].delta_aicc, 20.0, 0, 0, "delta");
    assert_true(rk.rows[3].weight == 0.0 && rk.rows[4].weight == 0.0);
    f[2].split = true; /* a predicted liquid split makes a fit unsound too */
    assert_int_equal(pw_rank_fits(fp, 5, &rk), PW_OK);
    /* sound: 1, 0, 3; then the unsound by AICc: 4 (95), 2 (105) */
    assert_int_equal(rk.rows[2].index, 3);
    assert_int_equal(rk.rows[2].cls, PW_RANK_DROPPED);
    assert_int_equal(rk.rows[4].index, 2);
    assert_int_equal(rk.rows[4].cls, PW_RANK_UNSOUND);
    f[3].n_residuals = 28; /* different data */
    assert_int_equal(pw_rank_fits(fp, 5, &rk), PW_EINVAL);
    assert_int_equal(pw_rank_fits(fp, 0, &rk), PW_EINVAL);
}

static void model_risk_flags_match_direct_search(void **state)
{
    (void)state;
    char path[1024], comps[1024];
    pw_test_path(path, sizeof path, "datasets/ethanol_water_1atm.csv");
    pw_test_path(comps, sizeof comps, "datasets/components.csv");
    pw_dataset ds;
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    assert_int_equal(pw_complib_read(&lib, comps, &err), PW_OK);
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    const pw_component *c1 = pw_complib_find(&lib, ds.names[0]), *c2 = pw_complib_find(&lib, ds.names[1]);
    static const char *const names[] = {"margules", "vanlaar", "wilson", "nrtl"};
    static pw_fit_result f[4];
    const pw_fit_result *fp[4];
    for (int i = 0; i < 4; i++) {
        pw_fit_options o = pw_fit_default_options();
        assert_int_equal(pw_fit_run(&ds, c1, c2, pw_model_find(names[i]), &o, &f[i], &err), PW_OK);
        fp[i] = &f[i];
    }
    pw_rank_column col = {{0.80, 0.05, 0.30, 1.0}, 101325.0};
    static pw_ranking rk;
    assert_int_equal(pw_rank_assess(fp, 4, &col, &rk), PW_OK);
    double xlo = INFINITY, xhi = -INFINITY, rlo = INFINITY, rhi = -INFINITY;
    for (size_t i = 0; i < rk.n; i++) {
        const pw_rank_row *w = &rk.rows[i];
        pw_az_result az;
        assert_int_equal(pw_azeotrope_find(&w->fit->sys, PW_AZ_ISOBARIC, 101325.0, NULL, &az), PW_OK);
        assert_int_equal(w->az_status, PW_OK);
        assert_int_equal(w->az.n, az.n);
        if (az.n)
            pw_assert_close(w->az.az[0].x1, az.az[0].x1, 0, 0, "same azeotrope");
        assert_int_equal(w->col_status, PW_OK);
        if (w->cls <= PW_RANK_CONSIDERED && az.n) {
            xlo = fmin(xlo, az.az[0].x1);
            xhi = fmax(xhi, az.az[0].x1);
        }
        if (w->cls <= PW_RANK_CONSIDERED && w->col.feasible) {
            rlo = fmin(rlo, w->col.r_min);
            rhi = fmax(rhi, w->col.r_min);
        }
    }
    assert_true(rk.az_place_differs == (xhi - xlo > PW_AZ_DISAGREE_X));
    pw_assert_close(rk.rmin_lo, rlo, 0, 0, "R_min low");
    assert_true(rk.rmin_differs == (rhi - rlo > PW_RMIN_DISAGREE_REL * rlo));
    for (int i = 0; i < 4; i++)
        pw_fit_result_free(&f[i]);
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(classes_and_weights),
        cmocka_unit_test(model_risk_flags_match_direct_search),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
