/* The azeotrope search on a model whose one-liquid bubble point does not exist inside its
 * two-liquid region (include/pinchwise/lle.h, pw_azeotrope_search).
 *
 * The model: NRTL (alpha 0.3) with the parameters of the NRTL fit of the measured
 * chloroform/water set at 101.30 kPa (datasets/three_phase/chloroform_water_1atm.csv, Hu 2010,
 * fitted 3 December 2026; any strongly non-ideal model of this kind would serve), vapor pressures
 * from the shipped component library. Chloroform's infinite-dilution activity coefficient in
 * water is of order 10^3, and a one-liquid liquid between the layers (x1 0.0005 to 0.99) would
 * boil below 273.15 K, where water's IAPWS-IF97 vapor pressure ends: there is no one-liquid
 * bubble point there, and a search over the whole range fails. The search must leave the
 * three-phase layers out (no one-liquid azeotrope can lie there) and find the heterogeneous
 * azeotrope. Identity: at the reported three-phase state both layers boil at the given pressure
 * with the reported vapor (pw_bubble_P at T3, evaluated here), and the vapor lies between them. */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/lle.h>
#include <string.h>

static pw_complib lib;

static pw_system chloroform_water(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    const pw_component *c1 = pw_complib_find(&lib, "chloroform");
    const pw_component *c2 = pw_complib_find(&lib, "water");
    assert_non_null(c1);
    assert_non_null(c2);
    s.comp[0] = *c1;
    s.comp[1] = *c2;
    s.model = &pw_model_nrtl;
    s.params[0] = 1300.0649347884466; /* dg12 [K] */
    s.params[1] = 2099.309850535819;  /* dg21 [K] */
    s.params[2] = 0.3;
    s.T_ref_K = 346.46923076923065;
    return s;
}

static void search_skips_the_layers(void **state)
{
    (void)state;
    const pw_system s = chloroform_water();
    const double P = 101300.0;
    /* the precondition that makes the case hostile */
    pw_eq_point e;
    assert_int_not_equal(pw_bubble_T(&s, P, 0.01, &e), PW_OK);
    pw_az_result whole;
    assert_int_not_equal(pw_azeotrope_find(&s, PW_AZ_ISOBARIC, P, NULL, &whole), PW_OK);
    /* the search with the layers left out */
    pw_az_result r;
    pw_three_phase tp;
    size_t removed = 99;
    bool het_failed = true;
    assert_int_equal(pw_azeotrope_search(&s, PW_AZ_ISOBARIC, P, &r, &tp, &removed, &het_failed),
                     PW_OK);
    assert_false(het_failed);
    assert_int_equal(r.n, 0); /* no one-liquid azeotrope */
    assert_int_equal(removed, 0);
    assert_true(tp.exists && tp.heterogeneous_azeotrope);
    assert_true(tp.x[0] < tp.y1 && tp.y1 < tp.x[1]);
    for (int k = 0; k < 2; k++) {
        assert_int_equal(pw_bubble_P(&s, tp.T_K, tp.x[k], &e), PW_OK);
        pw_assert_close(e.P_Pa, P, 1e-9, 0.0, "a layer boils at P at T3");
        pw_assert_close(e.y1, tp.y1, 1e-8, 1e-10, "and gives the three-phase vapor");
    }
    /* against the measured set (Hu 2010: 328.95 K, y1 0.855), as a guard on the fit's values */
    pw_assert_close(tp.T_K, 328.95, 0.0, 0.5, "T3 against the measured three-phase points");
    pw_assert_close(tp.y1, 0.855, 0.0, 0.03, "y3 against the measured three-phase points");
    /* the homogeneous roots the same outside the layers: the search's options are honoured */
    pw_az_options o = pw_azeotrope_default_options();
    o.grid = 200;
    pw_az_result r2;
    assert_int_equal(
        pw_azeotrope_search_opt(&s, PW_AZ_ISOBARIC, P, &o, &r2, &tp, NULL, &het_failed), PW_OK);
    assert_int_equal(r2.n, r.n);
    assert_true(r2.n_evals > r.n_evals); /* the larger table was used */
}

static int setup(void **state)
{
    (void)state;
    pw_test_init();
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
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(search_skips_the_layers),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
