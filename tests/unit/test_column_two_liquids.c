/* The single column and the two-liquid region (docs/heterogeneous.md, "The single column and the
 * two-liquid region"). Invented partly miscible liquid: Margules A12 = A21 = 2.4 at 350 K
 * (A > 2 splits, SVNA 7th ed. section 14.4, from memory) on invented vapor pressures with
 * relative volatility 3 (tests/unit/design_systems.h).
 *  - pw_column_solve_system refuses targets whose interval reaches into the layers' gap at P and
 *    names the layers and the decanter scheme; seeded random targets check the physical identity
 *    behind it: every liquid of a column it solves boils at or above the three-phase temperature
 *    (inside the gap only a metastable single liquid boils below it).
 *  - pw_rate_cmo returns either a steady state (feed-stage mismatch ~0, no stage liquid in the
 *    gap) or a status with a reason, never a non-solution (seeded random columns).
 *  - Constant relative volatility, q = 1: the pinch is the feed pinch at the q-line point and
 *    R_min = (xd - y_q) / (y_q - x_q) (McCabe-Thiele geometry, e.g. Seader and Henley,
 *    Separation Process Principles, section 7.2, from memory). */
#include "design_systems.h"

#include <pinchwise/decanter.h>
#include <pinchwise/design.h>
#include <pinchwise/lle.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define P_PA 101325.0

static pw_system split_system(void)
{
    pw_system sys = design_ideal_system(3.0);
    sys.params[0] = sys.params[1] = 2.4;
    return sys;
}

/* a small seeded generator (no global state) */
static double unif(unsigned long long *s)
{
    *s = *s * 6364136223846793005ULL + 1442695040888963407ULL;
    return (double)(*s >> 11) / 9007199254740992.0;
}

static void test_gap_refused(void **state)
{
    (void)state;
    pw_system sys = split_system();
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&sys, P_PA, &tp), PW_OK);
    assert_true(tp.exists && tp.heterogeneous_azeotrope);
    pw_column_result col;
    pw_three_phase got;
    bool het = true;
    /* the distillate inside the gap, below the azeotrope */
    pw_column_spec into = {.xd = 0.5 * (tp.x[0] + tp.y1), .xb = 0.005, .zf = 0.5 * tp.x[0], .q = 1};
    assert_int_equal(pw_column_solve_system(&sys, P_PA, &into, NULL, &col, &got, &het), PW_OK);
    assert_false(col.feasible);
    assert_false(het);
    assert_true(got.exists && got.x[0] == tp.x[0]);
    assert_non_null(strstr(col.reason, "two-liquid region"));
    assert_non_null(strstr(col.reason, "decanter"));
    char layer[32];
    snprintf(layer, sizeof layer, "%.4f", tp.x[0]);
    assert_non_null(strstr(col.reason, layer));
    assert_true(isnan(col.r_min) && isnan(col.pinch.x));
    /* the same in the other direction (component 1 to the bottoms) */
    pw_column_spec down = {.xd = 0.005, .xb = 0.5 * (tp.x[0] + tp.y1), .zf = 0.5 * tp.x[0], .q = 1};
    assert_int_equal(pw_column_solve_system(&sys, P_PA, &down, NULL, &col, NULL, NULL), PW_OK);
    assert_false(col.feasible);
    assert_non_null(strstr(col.reason, "two-liquid region"));
    /* across the heterogeneous azeotrope: its own reason, flagged */
    pw_column_spec across = {.xd = 0.995, .xb = 0.005, .zf = 0.5, .q = 1};
    assert_int_equal(pw_column_solve_system(&sys, P_PA, &across, NULL, &col, NULL, &het), PW_OK);
    assert_false(col.feasible);
    assert_true(het);
    assert_non_null(strstr(col.reason, "heterogeneous azeotrope"));
    /* below the gap: solved, the pinch a point of the curve */
    pw_column_spec below = {.xd = 0.9 * tp.x[0], .xb = 0.005, .zf = 0.5 * tp.x[0], .q = 1};
    assert_int_equal(pw_column_solve_system(&sys, P_PA, &below, NULL, &col, NULL, &het), PW_OK);
    assert_true(col.feasible);
    pw_eq_point e;
    assert_int_equal(pw_bubble_T(&sys, P_PA, col.pinch.x, &e), PW_OK);
    assert_true(fabs(e.y1 - col.pinch.y) < 1e-9);
}

static void test_random_targets(void **state)
{
    (void)state;
    pw_system sys = split_system();
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&sys, P_PA, &tp), PW_OK);
    unsigned long long seed = 20261202ULL;
    int solved = 0, refused = 0;
    for (int i = 0; i < 60; i++) {
        /* a third of the pairs below the gap, a third above, a third anywhere */
        double l = 0.002, h = 0.998;
        if (i % 3 == 0)
            h = tp.x[0];
        else if (i % 3 == 1)
            l = tp.x[1];
        double a = l + (h - l) * unif(&seed), b = l + (h - l) * unif(&seed);
        if (fabs(a - b) < 0.01)
            continue;
        double lo = fmin(a, b), hi = fmax(a, b);
        pw_column_spec s = {.xd = a, .xb = b, .zf = lo + (hi - lo) * (0.2 + 0.6 * unif(&seed)),
                            .q = 1.0};
        pw_column_result col;
        pw_column_options o = pw_column_default_options();
        o.n_factors = 0;
        pw_status st = pw_column_solve_system(&sys, P_PA, &s, &o, &col, NULL, NULL);
        if (st != PW_OK)
            fail_msg("xd %g xb %g zf %g: status %d (%s)", s.xd, s.xb, s.zf, st, col.reason);
        if (!col.feasible) {
            if (strstr(col.reason, "two-liquid region") || strstr(col.reason, "heterogeneous"))
                refused++;
            continue;
        }
        solved++;
        /* independent of the rule: a stable single liquid boils at or above T3 */
        double xs[3] = {s.xb, s.xd, col.pinch.x};
        for (int k = 0; k < 3; k++) {
            pw_eq_point e;
            assert_int_equal(pw_bubble_T(&sys, P_PA, xs[k], &e), PW_OK);
            if (!(e.T_K >= tp.T_K - 1e-6))
                fail_msg("xd %g xb %g: liquid %g boils at %.4f K below the three-phase %.4f K",
                         s.xd, s.xb, xs[k], e.T_K, tp.T_K);
        }
    }
    print_message("random targets: %d solved, %d refused\n", solved, refused);
    assert_true(solved >= 5 && refused >= 5);
}

static void test_rate_never_a_non_solution(void **state)
{
    (void)state;
    pw_system sys = split_system();
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&sys, P_PA, &tp), PW_OK);
    unsigned long long seed = 7ULL;
    int ok = 0, gap = 0, none = 0;
    for (int i = 0; i < 40; i++) {
        pw_rate_spec s = {.n_stages = 2 + (int)(18 * unif(&seed)), .q = 1.0};
        s.feed_stage = 1 + (int)(s.n_stages * unif(&seed));
        if (s.feed_stage > s.n_stages)
            s.feed_stage = s.n_stages;
        s.R = 0.2 + 5.0 * unif(&seed);
        s.zf = 0.01 + 0.98 * unif(&seed);
        s.d_frac = 0.05 + 0.9 * unif(&seed);
        pw_rate_result r;
        pw_error err;
        pw_error_clear(&err);
        pw_status st = pw_rate_cmo(&sys, P_PA, &s, &r, &err);
        if (st == PW_OK) {
            ok++;
            assert_true(fabs(r.residual) <= 1e-8);
            for (size_t k = 0; k < r.profile.n; k++)
                assert_false(r.profile.stage[k].x > tp.x[0] && r.profile.stage[k].x < tp.x[1]);
        } else if (strstr(err.msg, "two-liquid region")) {
            gap++;
            assert_int_equal(st, PW_EINFEASIBLE);
            assert_non_null(strstr(err.msg, "decanter"));
        } else {
            none++;
            if (!strstr(err.msg, "no steady state") && st != PW_EINFEASIBLE)
                fail_msg("status %d: %s", st, err.msg);
        }
        pw_rate_result_free(&r);
    }
    print_message("rated: %d steady states, %d refused (two liquids), %d none\n", ok, gap, none);
    assert_true(ok >= 3 && gap >= 3);
}

static void test_feed_pinch_constant_alpha(void **state)
{
    (void)state;
    const double alpha = 2.5;
    pw_system sys = design_ideal_system(alpha);
    unsigned long long seed = 42ULL;
    for (int i = 0; i < 12; i++) {
        double zf = 0.1 + 0.8 * unif(&seed);
        pw_column_spec s = {.xd = zf + (0.999 - zf) * (0.3 + 0.7 * unif(&seed)),
                            .xb = zf * 0.7 * unif(&seed), .zf = zf, .q = 1.0};
        pw_column_result col;
        assert_int_equal(pw_column_solve_system(&sys, P_PA, &s, NULL, &col, NULL, NULL), PW_OK);
        assert_true(col.feasible);
        double yq = design_crv_y(alpha, zf), r = fmax(0.0, (s.xd - yq) / (yq - zf));
        assert_int_equal(col.pinch.kind, PW_PINCH_FEED);
        assert_true(fabs(col.pinch.x - zf) < 1e-9 && fabs(col.pinch.y - yq) < 1e-6);
        if (!(fabs(col.r_min - r) < 1e-6 * (1.0 + r)))
            fail_msg("xd %g xb %g zf %g: R_min %.10g, closed form %.10g", s.xd, s.xb, zf,
                     col.r_min, r);
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_gap_refused),
        cmocka_unit_test(test_random_targets),
        cmocka_unit_test(test_rate_never_a_non_solution),
        cmocka_unit_test(test_feed_pinch_constant_alpha),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
