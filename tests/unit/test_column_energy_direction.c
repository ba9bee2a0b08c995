/* The energy-balance column with component 1 leaving with the bottoms (xd < zf < xb), against
 * the same column with the components named the other way round (component 1 overhead): the
 * system with its components, NRTL parameters (dg12 <-> dg21) and heat data swapped is the same
 * liquid, so R_min, the pinch (x -> 1 - x), the design rows (stages, feed stage, duties, every
 * stage of the profile) must agree. Also the constant-overflow identity in that direction: with
 * no enthalpy effects R_min equals pw_column_solve_any's. Invented liquids and heats. */
#include "design_systems.h"

#include <pinchwise/column_direction.h>
#include <pinchwise/curve.h>
#include <pinchwise/design.h>
#include <stdlib.h>

#define P_PA 101325.0

static pw_heat_data heats(const pw_system *sys, double l1, double l2, double cpL1, double cpL2,
                          double cpV1, double cpV2)
{
    pw_heat_data h = {.dHvap = {l1, l2}, .cpL = {cpL1, cpL2}, .cpV = {cpV1, cpV2}};
    for (int i = 0; i < 2; i++)
        assert_int_equal(pw_tsat(&sys->comp[i], P_PA, &h.Tb_K[i]), PW_OK);
    return h;
}

static double urand(double a, double b)
{
    return a + (b - a) * rand() / (double)RAND_MAX;
}

static pw_system nrtl(double alpha, double b12, double b21)
{
    pw_system s = design_ideal_system(alpha);
    s.model = &pw_model_nrtl;
    s.params[0] = b12;
    s.params[1] = b21;
    s.params[2] = 0.3;
    return s;
}

/* The same liquid with the components named the other way round. */
static pw_system swapped(const pw_system *s)
{
    pw_system w = *s;
    w.comp[0] = s->comp[1];
    w.comp[1] = s->comp[0];
    w.params[0] = s->params[1];
    w.params[1] = s->params[0];
    return w;
}

static pw_heat_data swapped_heat(const pw_heat_data *h)
{
    pw_heat_data w;
    for (int i = 0; i < 2; i++) {
        w.Tb_K[i] = h->Tb_K[1 - i];
        w.dHvap[i] = h->dHvap[1 - i];
        w.cpL[i] = h->cpL[1 - i];
        w.cpV[i] = h->cpV[1 - i];
    }
    return w;
}

static void test_bottoms_equals_swapped(void **state)
{
    (void)state;
    srand(4711u);
    /* component 1 is the heavy one here: alpha < 1 */
    pw_system sys[2] = {nrtl(1.0 / 3.0, 100.0, 150.0), nrtl(0.5, 300.0, 120.0)};
    int compared = 0, tangent = 0;
    for (int t = 0; t < 12; t++) {
        const pw_system *s1 = &sys[t % 2];
        pw_system s2 = swapped(s1);
        pw_heat_data h1 =
            heats(s1, urand(30000.0, 44000.0), urand(30000.0, 44000.0), urand(60.0, 160.0),
                  urand(60.0, 110.0), urand(30.0, 90.0), urand(30.0, 50.0));
        pw_heat_data h2 = swapped_heat(&h1);
        pw_column_spec s;
        /* component 1 (heavy) is scarce in the distillate (the second liquid: above its
         * minimum-boiling azeotrope near x1 = 0.1536, from the column module's reason text) ... */
        s.xd = t % 2 ? urand(0.16, 0.3) : urand(0.01, 0.12);
        s.xb = urand(0.85, 0.99); /* ... and rich in the bottoms */
        s.zf = s.xd + (s.xb - s.xd) * urand(0.2, 0.8);
        s.q = urand(0.2, 1.3);
        pw_column_spec m = pw_column_spec_mirror(&s);
        pw_energy_result r1, r2;
        pw_design_table t1, t2;
        assert_int_equal(pw_energy_column_solve(s1, &h1, P_PA, &s, NULL, &r1, &t1), PW_OK);
        assert_int_equal(pw_energy_column_solve(&s2, &h2, P_PA, &m, NULL, &r2, &t2), PW_OK);
        assert_int_equal(r1.feasible, r2.feasible);
        if (!r1.feasible)
            fail_msg("case %d: %s", t, r1.reason);
        pw_assert_close(r1.r_min, r2.r_min, 1e-8, 1e-10, "R_min, both namings");
        assert_int_equal(r1.pinch.kind, r2.pinch.kind);
        assert_int_equal(r1.pinch.section, r2.pinch.section);
        pw_assert_close(r1.pinch.x, 1.0 - r2.pinch.x, 0, 1e-5, "pinch x in component 1");
        pw_assert_close(r1.h_F, r2.h_F, 1e-12, 1e-9, "h_F");
        assert_int_equal(t1.n, t2.n);
        for (size_t k = 0; k < t1.n; k++) {
            const pw_design_case *a = &t1.row[k], *b = &t2.row[k];
            assert_int_equal(a->reachable, b->reachable);
            if (!a->reachable)
                continue;
            pw_assert_close(a->stages, b->stages, 1e-6, 1e-8, "stages");
            assert_int_equal(a->feed_stage, b->feed_stage);
            pw_assert_close(a->Q_C, b->Q_C, 1e-8, 1e-6, "condenser duty");
            pw_assert_close(a->Q_R, b->Q_R, 1e-8, 1e-6, "reboiler duty");
            assert_int_equal(a->profile.n, b->profile.n);
            for (size_t i = 0; i < a->profile.n; i++) {
                pw_assert_close(a->profile.stage[i].x, 1.0 - b->profile.stage[i].x, 0, 1e-9,
                                "stage liquid, component 1");
                pw_assert_close(a->profile.stage[i].y, 1.0 - b->profile.stage[i].y, 0, 1e-9,
                                "stage vapor, component 1");
                pw_assert_close(a->profile.stage[i].T_K, b->profile.stage[i].T_K, 0, 1e-7,
                                "stage temperature");
            }
            /* the first stage's vapor is the distillate, in component 1 */
            pw_assert_close(a->profile.stage[0].y, s.xd, 0, 1e-12, "top vapor = xd");
        }
        compared++;
        tangent += r1.pinch.kind == PW_PINCH_TANGENT;
        pw_design_table_free(&t1);
        pw_design_table_free(&t2);
    }
    print_message("component 1 to the bottoms: %d specifications = swapped naming, %d tangent\n",
                  compared, tangent);
    assert_true(compared >= 10);
}

/* No enthalpy effects (ideal liquid, equal heats, no heat capacities): the constant-overflow
 * column's R_min in the bottoms direction, which is Underwood's (1948) for component 2 over 1. */
static void test_bottoms_identity(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(1.0 / 2.5);
    pw_heat_data h = heats(&sys, 32000.0, 32000.0, 0, 0, 0, 0);
    const double qs[] = {1.0, 0.0, 0.5, 1.3};
    for (size_t i = 0; i < 4; i++) {
        pw_column_spec s = {.xd = 0.05, .xb = 0.95, .zf = 0.5, .q = qs[i]};
        pw_energy_result r;
        assert_int_equal(pw_energy_column_solve(&sys, &h, P_PA, &s, NULL, &r, NULL), PW_OK);
        assert_true(r.feasible);
        double ru;
        assert_int_equal(pw_underwood_rmin(2.5, 1.0 - s.zf, 1.0 - s.xd, s.q, &ru), PW_OK);
        pw_assert_close(r.r_min, ru, 1e-7, 0, "R_min = Underwood (1948), component 2 overhead");
        pw_system_curve sc;
        assert_int_equal(pw_system_curve_init(&sc, &sys, P_PA), PW_OK);
        pw_curve c = pw_system_curve_bind(&sc);
        pw_column_result col;
        assert_int_equal(pw_column_solve_any(&c, &s, NULL, &col), PW_OK);
        pw_assert_close(r.r_min, col.r_min, 1e-8, 0, "R_min = constant overflow");
        pw_assert_close(r.pinch.x, col.pinch.x, 0, 1e-6, "pinch in component 1");
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_bottoms_equals_swapped),
        cmocka_unit_test(test_bottoms_identity),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
