/* The column propagation function with energy balances (pw_unc_column_ctx.heat): with equal heats,
 * no heat capacities and H^E = 0 its R_min and stages are the constant-overflow ones (identity,
 * METHODS2 5.4(a)); an infeasible split is an outcome (PW_EINFEASIBLE), not an error. */
#include "design_systems.h"

#include <pinchwise/design.h>
#include <pinchwise/uncertainty.h>

static void test_energy_fn_identity(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(2.5);
    pw_heat_data h = {.dHvap = {30000.0, 30000.0}};
    for (int i = 0; i < 2; i++)
        assert_int_equal(pw_tsat(&sys.comp[i], 101325.0, &h.Tb_K[i]), PW_OK);
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 0.5};
    pw_unc_column_ctx cmo = pw_unc_column_ctx_make(101325.0, &s), en = cmo;
    en.heat = &h;
    double a[PW_UNC_COLUMN_NOUT], b[PW_UNC_COLUMN_NOUT];
    assert_int_equal(pw_unc_column_fn(&cmo, &sys, a), PW_OK);
    assert_int_equal(pw_unc_column_fn(&en, &sys, b), PW_OK);
    pw_assert_close(b[PW_UNC_RMIN], a[PW_UNC_RMIN], 1e-7, 0, "R_min");
    pw_assert_close(b[PW_UNC_STAGES], a[PW_UNC_STAGES], 1e-5, 0, "stages at 1.3 R_min");
    assert_true(isnan(b[PW_UNC_SMIN]));
    /* An azeotrope between the products (invented NRTL liquid): infeasible, an outcome. */
    sys.model = &pw_model_nrtl;
    sys.params[0] = 300.0;
    sys.params[1] = 150.0;
    sys.params[2] = 0.3;
    s.xd = 0.98;
    en.spec = s;
    assert_int_equal(pw_unc_column_fn(&en, &sys, b), PW_EINFEASIBLE);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {cmocka_unit_test(test_energy_fn_identity)};
    return cmocka_run_group_tests(tests, NULL, NULL);
}
