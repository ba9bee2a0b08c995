/* Minimum reflux with a product right beside an azeotrope (1e-3, 1e-4, 1e-5 away), where the
 * limiting tangent pinch sits within about 1 % of (xd - xb) of the product: the library against
 * an independent envelope computation on 200,001 points per section (column_envelope.h), and the
 * operating path at R_min (1 + 1e-6) on or below the curve, at R_min (1 - 1e-4) across it, on a
 * 100,001-point grid. Curves: the one-parameter Margules liquid with constant vapour-pressure ratio
 * r, alpha(x) = r exp[A (1 - 2x)], azeotrope at x = [1 + ln(r)/A]/2 (METHODS 5.6; A > 0 minimum
 * boiling, A < 0 maximum boiling). */
#include "pw_test.h"

#include "column_curves.h"
#include "column_envelope.h"

#include <math.h>
#include <pinchwise/column.h>
#include <stdio.h>
#include <string.h>

#define ENV_N 200000
#define GRID_N 100000

static double curve_y(const void *c, double x)
{
    return tc_alpha_y(c, x);
}

static double azeotrope_x(const tc_alpha *c)
{
    return 0.5 * (1.0 + log(c->r) / c->A);
}

typedef struct edge_stats {
    int n, n_tangent, n_near_product;
} edge_stats;

static void check_case(const tc_alpha *a, const pw_column_spec *s, edge_stats *st)
{
    pw_curve c = {tc_alpha_fn, (void *)a};
    pw_column_result r;
    pw_status status = pw_column_solve(&c, s, NULL, &r);
    char label[200];
    snprintf(label, sizeof label, "r %g A %g xd %.7g xb %.7g zf %g q %g", a->r, a->A, s->xd, s->xb,
             s->zf, s->q);
    if (status != PW_OK || !r.feasible)
        fail_msg("%s: status %d feasible %d (%s)", label, (int)status, (int)r.feasible, r.reason);
    env_result e = env_rmin(curve_y, a, s, ENV_N);
    pw_assert_close(r.r_min, e.r_min, 1e-9, 0, label);
    /* the envelope's grid can only see less than the true maximum */
    assert_true(r.r_min >= e.r_min * (1.0 - 1e-12));
    double extra[2] = {r.pinch.x, isfinite(r.x_q) ? r.x_q : r.pinch.x};
    double above = env_path_gap(curve_y, a, s, r.r_min * (1.0 + 1e-6), GRID_N, extra, 2, NULL);
    double below = env_path_gap(curve_y, a, s, r.r_min * (1.0 - 1e-4), GRID_N, extra, 2, NULL);
    if (!(above >= -1e-14) || !(below < 0.0))
        fail_msg("%s: gap %.3g at R_min(1+1e-6), %.3g at R_min(1-1e-4)", label, above, below);
    st->n++;
    if (r.pinch.kind == PW_PINCH_TANGENT) {
        st->n_tangent++;
        double edge =
            r.pinch.section == PW_SECTION_RECTIFYING ? s->xd - r.pinch.x : r.pinch.x - s->xb;
        if (edge < 0.02 * (s->xd - s->xb))
            st->n_near_product++;
    }
}

/* Distillate 1e-3, 1e-4, 1e-5 below a minimum-boiling azeotrope, q = 1 and 0.5. */
static void test_distillate_beside_min_boiling_azeotrope(void **state)
{
    (void)state;
    const tc_alpha curves[] = {{1.5, 1.0}, {2.0, 1.2}, {3.0, 2.0}, {5.0, 2.5}, {1.3, 0.8}};
    const double gaps[] = {1e-3, 1e-4, 1e-5}, qs[] = {1.0, 0.5};
    edge_stats st = {0};
    for (size_t k = 0; k < sizeof curves / sizeof curves[0]; k++) {
        double xaz = azeotrope_x(&curves[k]);
        for (size_t g = 0; g < 3; g++)
            for (size_t i = 0; i < 2; i++) {
                pw_column_spec s = {.xd = xaz - gaps[g], .xb = 0.02, .zf = 0.45 * xaz, .q = qs[i]};
                check_case(&curves[k], &s, &st);
            }
    }
    print_message("min-boiling: %d cases, %d tangent pinches, %d within 2 %% of the product\n",
                  st.n, st.n_tangent, st.n_near_product);
    /* the point of these cases: most limit at a tangent pinch beside the product */
    assert_true(st.n_near_product >= st.n / 2);
}

/* Bottoms 1e-3, 1e-4, 1e-5 above a maximum-boiling azeotrope, q = 1 and 0.5. */
static void test_bottoms_beside_max_boiling_azeotrope(void **state)
{
    (void)state;
    const tc_alpha curves[] = {{1.3, -0.5}, {1.5, -0.8}, {2.0, -1.2}, {3.0, -1.5}, {5.0, -2.0}};
    const double gaps[] = {1e-3, 1e-4, 1e-5}, qs[] = {1.0, 0.5};
    edge_stats st = {0};
    for (size_t k = 0; k < sizeof curves / sizeof curves[0]; k++) {
        double xaz = azeotrope_x(&curves[k]);
        for (size_t g = 0; g < 3; g++)
            for (size_t i = 0; i < 2; i++) {
                pw_column_spec s = {
                    .xd = 0.98, .xb = xaz + gaps[g], .zf = xaz + 0.55 * (0.98 - xaz), .q = qs[i]};
                check_case(&curves[k], &s, &st);
            }
    }
    print_message("max-boiling: %d cases, %d tangent pinches, %d within 2 %% of the product\n",
                  st.n, st.n_tangent, st.n_near_product);
    assert_true(st.n_near_product >= st.n / 2);
}

/* A stage limit the stepping cannot meet: R_min stands, N_min and every design row are flagged
 * (PW_EMAXITER, stages NAN), the solve succeeds. Constant alpha 2.5, xd 0.95, xb 0.05: Fenske
 * gives N_min = ln(19^2)/ln(2.5) = 6.4, so a limit of 3 stages cannot be met. */
static void test_unreachable_rows_are_flagged(void **state)
{
    (void)state;
    tc_alpha a = {2.5, 0.0};
    pw_curve c = {tc_alpha_fn, &a};
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 1.0};
    pw_column_options o = pw_column_default_options();
    o.max_stages = 3;
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, &o, &r), PW_OK);
    assert_true(r.feasible);
    double ru;
    assert_int_equal(pw_underwood_rmin(2.5, 0.5, 0.95, 1.0, &ru), PW_OK);
    pw_assert_close(r.r_min, ru, 1e-8, 0, "R_min vs Underwood (1948)");
    assert_int_equal(r.n_min_status, PW_EMAXITER);
    assert_true(isnan(r.n_min));
    assert_int_equal(r.n_design, 3);
    for (size_t i = 0; i < r.n_design; i++) {
        assert_int_equal(r.design[i].status, PW_EMAXITER);
        assert_true(isnan(r.design[i].stages));
    }
    o.max_stages = 500;
    assert_int_equal(pw_column_solve(&c, &s, &o, &r), PW_OK);
    assert_int_equal(r.n_min_status, PW_OK);
    for (size_t i = 0; i < r.n_design; i++)
        assert_int_equal(r.design[i].status, PW_OK);
}

/* A curve that touches the diagonal inside the last cell of the table, where the table shows no
 * interior minimum (y* - x falls all the way to xd): alpha = 1 + c (x - x0)^2 with x0 0.3 of a
 * cell below xd. The split needs infinitely many stages; the feasibility proof of section 1 finds
 * the touch (the grid minima alone would not). */
static void test_touch_inside_the_product_cell(void **state)
{
    (void)state;
    const double xb = 0.05, xd = 0.95, h = (xd - xb) / 199.0;
    tc_touch t = {10.0, xd - 0.3 * h};
    pw_curve c = {tc_touch_fn, &t};
    pw_column_spec s = {.xd = xd, .xb = xb, .zf = 0.5, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
    assert_false(r.feasible);
    assert_non_null(strstr(r.reason, "touches the diagonal"));
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_distillate_beside_min_boiling_azeotrope),
        cmocka_unit_test(test_bottoms_beside_max_boiling_azeotrope),
        cmocka_unit_test(test_unreachable_rows_are_flagged),
        cmocka_unit_test(test_touch_inside_the_product_cell),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
