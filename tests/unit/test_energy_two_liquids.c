/* reflux --energy where the column's liquids reach into the two-liquid region: a stage there
 * holds two layers, whose enthalpy the energy balance does not model yet, so the design is refused
 * with a reason naming the layers (PW_ERANGE; the single column refuses such targets first, for
 * either balance), while a column whose liquids stay outside the gap
 * is solved as usual. Invented liquid: Margules A12 = A21 = 2.4 at 350 K (A ~ 1/T; A > 2 splits,
 * SVNA 7th ed. section 14.4, from memory) on invented vapor pressures with relative volatility 3.
 */
#include "design_systems.h"

#include <pinchwise/commands.h>
#include <pinchwise/design_doc.h>
#include <pinchwise/lle.h>
#include <math.h>
#include <string.h>

#define P_PA 101325.0

static void test_gap_refused(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(3.0);
    sys.params[0] = sys.params[1] = 2.4;
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&sys, P_PA, &tp), PW_OK);
    assert_true(tp.exists && tp.x[0] > 0.1 && tp.x[1] < 0.9);
    pw_heat_data h = {.dHvap = {32000.0, 40000.0}, .cpL = {120.0, 76.0}, .cpV = {70.0, 34.0}};
    for (int i = 0; i < 2; i++)
        assert_int_equal(pw_tsat(&sys.comp[i], P_PA, &h.Tb_K[i]), PW_OK);
    /* 1: liquids from 0.02 to just below the lower layer: solved */
    pw_column_spec below = {.xd = 0.9 * tp.x[0], .xb = 0.005, .zf = 0.5 * tp.x[0], .q = 1.0};
    pw_column_options o = pw_column_default_options();
    o.n_factors = 0;
    pw_column_result col;
    double Tt, Tb;
    pw_error err;
    assert_int_equal(pw_reflux_solve(&sys, P_PA, &below, &o, "t", &col, &Tt, &Tb, &err), PW_OK);
    assert_true(col.feasible);
    pw_design_table t;
    pw_energy_result e;
    pw_status s1 = pw_reflux_design(&sys, P_PA, &below, NULL, &col, &h, &t, &e);
    if (s1 != PW_OK)
        fail_msg("below the gap: status %d: %s", s1, e.reason);
    if (!e.feasible) /* (a column this dilute needs little or no reflux) */
        fail_msg("below the gap: feasible %d, R_min %g, %s", e.feasible, e.r_min, e.reason);
    pw_design_table_free(&t);
    /* 2: the distillate inside the gap (below the heterogeneous azeotrope): refused, named */
    pw_column_spec into = {
        .xd = 0.5 * (tp.x[0] + tp.y1), .xb = 0.005, .zf = 0.5 * tp.x[0], .q = 1.0};
    /* the single (constant-overflow) column refuses first, for both balances: its y*(x) there
     * is a metastable liquid's (docs/heterogeneous.md) */
    assert_int_equal(pw_reflux_solve(&sys, P_PA, &into, &o, "t", &col, &Tt, &Tb, &err), PW_OK);
    assert_false(col.feasible);
    assert_non_null(strstr(col.reason, "two-liquid region"));
    assert_non_null(strstr(col.reason, "decanter"));
    print_message("refused: %s\n", col.reason);
    /* a product inside the gap is two layers, which boil at the three-phase temperature */
    assert_true(fabs(Tt - tp.T_K) < 1e-9);
    /* the energy solver itself refuses (screen, report and the uncertainty draws call it
     * directly, not through pw_reflux_design) */
    pw_energy_result e2;
    assert_int_equal(pw_energy_column_solve(&sys, &h, P_PA, &into, NULL, &e2, NULL), PW_ERANGE);
    assert_false(e2.feasible);
    assert_non_null(strstr(e2.reason, "two-liquid region"));
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {cmocka_unit_test(test_gap_refused)};
    return cmocka_run_group_tests(tests, NULL, NULL);
}
