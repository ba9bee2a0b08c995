/* The energy-balance column on methanol(1)/water(2) at 101.325 kPa against the worked example of
 * the methods brief (METHODS2 5.6, values computed there by an independent tie-line scan and
 * stepping): NRTL with the parameters of Smith, Van Ness & Abbott (7th ed.) as recalled in the
 * brief (b12 = -253.88, b21 = 845.21 cal/mol, alpha = 0.2994; from memory), the shipped
 * vapor-pressure rows (methanol Antoine, water IAPWS-IF97), heats from SVNA Table B.2 and the CRC
 * Handbook (from memory): cpL 81.1 and 75.3, cpV 44.1 and 33.6 J/(mol K), dHvap 35.21 and
 * 40.66 kJ/mol. Also Treybal, Mass-Transfer Operations (3rd ed. 1980), Illustration 9.8, in mole
 * fractions with the brief's q for the 26.7 C feed (the book reads its own enthalpy chart; the
 * values here are the brief's computation with this model). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/curve.h>
#include <pinchwise/design.h>
#include <string.h>

#define P_PA 101325.0

static pw_system methanol_water(void)
{
    char path[1024];
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    if (pw_complib_read(&lib, pw_test_path(path, sizeof path, "datasets/components.csv"), &err))
        fail_msg("%s", err.msg);
    pw_system s;
    memset(&s, 0, sizeof s);
    const pw_component *m = pw_complib_find(&lib, "methanol"), *w = pw_complib_find(&lib, "water");
    assert_non_null(m);
    assert_non_null(w);
    s.comp[0] = *m;
    s.comp[1] = *w;
    pw_complib_free(&lib);
    s.model = &pw_model_nrtl;
    s.params[0] = -253.88 / 1.987; /* cal/mol over R in cal/(mol K), as the brief: K */
    s.params[1] = 845.21 / 1.987;
    s.params[2] = 0.2994;
    s.T_ref_K = 350.0;
    return s;
}

static pw_heat_data mw_heats(const pw_system *s)
{
    pw_heat_data h = {.dHvap = {35210.0, 40660.0}, .cpL = {81.1, 75.3}, .cpV = {44.1, 33.6}};
    for (int i = 0; i < 2; i++)
        assert_int_equal(pw_tsat(&s->comp[i], P_PA, &h.Tb_K[i]), PW_OK);
    return h;
}

static void test_worked_example(void **state)
{
    (void)state;
    pw_system s = methanol_water();
    pw_heat_data h = mw_heats(&s);
    pw_assert_close(h.Tb_K[0], 337.849, 0, 5e-4, "Tb methanol (METHODS2 5.6)");
    pw_assert_close(h.Tb_K[1], 373.124, 0, 5e-4, "Tb water (METHODS2 5.6)");
    struct {
        double xd, xb, zf, q, cmo, energy, x_pinch;
    } c[] = {
        {0.95, 0.05, 0.5, 1.0, 0.58916, 0.63893, 0.5},
        {0.99, 0.01, 0.3, 1.0, 0.89003, 1.00543, 0.3},
        {0.95, 0.05, 0.5, 0.0, 1.26743, 1.45080, 0.1450},
        {0.91440, 0.005647, 0.35989, 1.0996, 0.5664, 0.6187, NAN}, /* Treybal Ill. 9.8 */
    };
    for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
        pw_column_spec sp = {c[i].xd, c[i].xb, c[i].zf, c[i].q};
        pw_system_curve sc;
        assert_int_equal(pw_system_curve_init(&sc, &s, P_PA), PW_OK);
        pw_curve cv = pw_system_curve_bind(&sc);
        pw_column_result col;
        assert_int_equal(pw_column_solve(&cv, &sp, NULL, &col), PW_OK);
        double tol = i == 3 ? 5e-5 : 5e-6; /* digits as printed */
        pw_assert_close(col.r_min, c[i].cmo, 0, tol, "R_min constant overflow (METHODS2 5.6)");
        pw_column_options o = pw_column_default_options();
        o.n_factors = 2;
        o.factors[0] = 1.3;
        o.factors[1] = 1.02;
        pw_energy_result r;
        pw_design_table t;
        assert_int_equal(pw_energy_column_solve(&s, &h, P_PA, &sp, &o, &r, &t), PW_OK);
        assert_true(r.feasible);
        pw_assert_close(r.r_min, c[i].energy, 0, tol, "R_min energy (METHODS2 5.6)");
        assert_int_equal(r.pinch.kind, PW_PINCH_FEED);
        if (!isnan(c[i].x_pinch))
            pw_assert_close(r.pinch.x, c[i].x_pinch, 0, 5e-5, "feed tie line liquid");
        if (i == 0) { /* at 1.3 R_min (METHODS2 5.6, computed) */
            pw_assert_close(t.row[0].R, 0.83061, 0, 5e-6, "R");
            pw_assert_close(t.row[0].stages, 9.531, 0, 5e-4, "stages");
            pw_assert_close(t.row[0].Q_C / 1e3, 32.543, 0, 5e-4, "Q_C kJ/mol feed");
            pw_assert_close(t.row[0].Q_R / 1e3, 32.741, 0, 5e-4, "Q_R kJ/mol feed");
            pw_assert_close(r.h_F, 4061.9, 0, 0.05, "h_F");
            pw_assert_close(r.h_D, 3294.4, 0, 0.05, "h_D");
            pw_assert_close(r.h_B, 5225.6, 0, 0.05, "h_B");
            pw_assert_close(t.row[1].stages, 18.47, 0, 5e-3, "stages at 1.02 R_min");
            /* constant molal overflow at 1.3 R_min: R = 0.76591, N = 9.764 (METHODS2 5.6) */
            pw_design_table cmo;
            assert_int_equal(pw_design_cmo(&s, P_PA, &sp, col.r_min, col.n_min, &o, &cmo), PW_OK);
            pw_assert_close(cmo.row[0].R, 0.76591, 0, 5e-6, "R, constant overflow");
            pw_assert_close(cmo.row[0].stages, 9.764, 0, 5e-4, "stages, constant overflow");
            pw_design_table_free(&cmo);
        }
        pw_design_table_free(&t);
    }
}

/* Rating (constant molal overflow) with the same model: METHODS2 6.4, computed there with two
 * independent strategies agreeing to 1e-10. */
static void test_rating_values(void **state)
{
    (void)state;
    pw_system s = methanol_water();
    struct {
        pw_rate_spec spec;
        double xd, xb;
    } c[] = {
        {{10, 6, 1.0, 0.5, 1.0, 0.5}, 0.96812418, 0.03187582},
        {{15, 8, 0.8, 0.5, 1.0, 0.45}, 0.96770513, 0.11733217},
    };
    for (size_t i = 0; i < 2; i++) {
        pw_rate_result r;
        pw_error err;
        if (pw_rate_cmo(&s, P_PA, &c[i].spec, &r, &err) != PW_OK)
            fail_msg("%s", err.msg);
        pw_assert_close(r.xd, c[i].xd, 0, 5e-8, "xd (METHODS2 6.4)");
        pw_assert_close(r.xb, c[i].xb, 0, 5e-8, "xb (METHODS2 6.4)");
        pw_rate_result_free(&r);
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {cmocka_unit_test(test_worked_example),
                                       cmocka_unit_test(test_rating_values)};
    return cmocka_run_group_tests(tests, NULL, NULL);
}
