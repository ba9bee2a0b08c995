/* Column feasibility and the Gilliland-type correlations.
 * Azeotropic curves: one-parameter Margules liquid at constant T with P1sat/P2sat = 1.5, so
 * alpha(x) = 1.5 exp[A(1 - 2x)] and x_az = [1 + ln(1.5)/A]/2: A = +1 gives a minimum-boiling
 * azeotrope at 0.702733, A = -1 a maximum-boiling one at 0.297267 (METHODS 5.6, [H] closed form;
 * re-derived here from the formula). */
#include "pw_test.h"

#include "column_curves.h"

#include <math.h>
#include <pinchwise/column.h>
#include <string.h>

static const double any_q[] = {-0.3, 0.0, 0.5, 1.0, 1.5};

static void expect_infeasible(pw_curve *c, pw_column_spec s, const char *must1, const char *must2)
{
    for (size_t i = 0; i < sizeof any_q / sizeof any_q[0]; i++) {
        s.q = any_q[i];
        pw_column_result r;
        assert_int_equal(pw_column_solve(c, &s, NULL, &r), PW_OK);
        assert_false(r.feasible);
        assert_true(isnan(r.r_min) && isnan(r.n_min));
        if (!strstr(r.reason, must1) || (must2 && !strstr(r.reason, must2)))
            fail_msg("reason \"%s\" lacks \"%s\" / \"%s\"", r.reason, must1, must2 ? must2 : "");
    }
}

static void test_minimum_boiling_azeotrope(void **state)
{
    (void)state;
    tc_alpha a = {1.5, 1.0};
    pw_assert_close(0.5 * (1.0 + log(1.5)), 0.702733, 0, 5e-7, "x_az closed form [H]");
    pw_curve c = {tc_alpha_fn, &a};
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.4};
    expect_infeasible(&c, s, "azeotrope near x = 0.7027", "distillate target lies beyond");
    /* Below the azeotrope the split is feasible. */
    pw_column_spec ok = {.xd = 0.65, .xb = 0.05, .zf = 0.4, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &ok, NULL, &r), PW_OK);
    assert_true(r.feasible);
    assert_string_equal(r.reason, "");
    assert_true(r.r_min > 0.0 && r.n_min > 0.0);
}

static void test_maximum_boiling_azeotrope(void **state)
{
    (void)state;
    tc_alpha a = {1.5, -1.0};
    pw_assert_close(0.5 * (1.0 - log(1.5)), 0.297267, 0, 5e-7, "x_az closed form [H]");
    pw_curve c = {tc_alpha_fn, &a};
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5};
    expect_infeasible(&c, s, "azeotrope near x = 0.2973", "bottoms target lies beyond");
    pw_column_spec ok = {.xd = 0.95, .xb = 0.40, .zf = 0.6, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &ok, NULL, &r), PW_OK);
    assert_true(r.feasible);
}

/* alpha(x) = 1 + 4 (x - 0.6)^2 equals 1 only at x = 0.6: y* touches the diagonal there. */
static void test_touching_curve(void **state)
{
    (void)state;
    tc_touch t = {4.0, 0.6};
    pw_curve c = {tc_touch_fn, &t};
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.4};
    expect_infeasible(&c, s, "touches the diagonal at x = 0.6", NULL);
}

/* A pure product (x = 0 or 1) or a product at the azeotrope: pinch at a product composition. */
static void test_pinch_at_product(void **state)
{
    (void)state;
    tc_alpha a = {2.5, 0.0};
    pw_curve c = {tc_alpha_fn, &a};
    expect_infeasible(&c, (pw_column_spec){.xd = 0.95, .xb = 0.0, .zf = 0.5},
                      "pinch at a product composition", "bottoms");
    expect_infeasible(&c, (pw_column_spec){.xd = 1.0, .xb = 0.05, .zf = 0.5},
                      "pinch at a product composition", "distillate");
    tc_alpha az = {1.0, 1.0}; /* x_az = 0.5 exactly */
    pw_curve ca = {tc_alpha_fn, &az};
    expect_infeasible(&ca, (pw_column_spec){.xd = 0.5, .xb = 0.05, .zf = 0.3},
                      "pinch at a product composition", NULL);
    /* Component order reversed: y* < x everywhere. */
    tc_alpha rev = {0.4, 0.0};
    pw_curve cr = {tc_alpha_fn, &rev};
    expect_infeasible(&cr, (pw_column_spec){.xd = 0.95, .xb = 0.05, .zf = 0.5},
                      "not the more volatile", NULL);
}

static void test_invalid_spec(void **state)
{
    (void)state;
    tc_alpha a = {2.5, 0.0};
    pw_curve c = {tc_alpha_fn, &a};
    pw_column_result r;
    const pw_column_spec bad[] = {
        {.xd = 0.95, .xb = 0.5, .zf = 0.5, .q = 1.0},  {.xd = 0.5, .xb = 0.05, .zf = 0.5, .q = 1.0},
        {.xd = 1.2, .xb = 0.05, .zf = 0.5, .q = 1.0},  {.xd = 0.95, .xb = -0.1, .zf = 0.5, .q = 1.0},
        {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = NAN},
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++)
        assert_int_equal(pw_column_solve(&c, &bad[i], NULL, &r), PW_EINVAL);
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 1.0};
    pw_column_options o = pw_column_default_options();
    o.rtol = -1.0;
    assert_int_equal(pw_column_solve(&c, &s, &o, &r), PW_EINVAL);
    o = pw_column_default_options();
    o.factors[1] = 0.9;
    assert_int_equal(pw_column_solve(&c, &s, &o, &r), PW_EINVAL);
}

/* A curve callback that fails passes its status up; nothing is reported as feasible. */
static pw_status failing_fn(void *ctx, double x, double *y)
{
    (void)ctx;
    *y = x;
    return x > 0.7 ? PW_ENOCONV : PW_OK;
}

static void test_curve_failure(void **state)
{
    (void)state;
    pw_curve c = {failing_fn, NULL};
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_ENOCONV);
    assert_false(r.feasible);
}

/* Gilliland (1940) fits: Molokanov et al. (1972) and Eduljee (1975) at N_min 6.4269, R_min 1.1,
 * against the METHODS 6.6 table (computed for that brief [H], 4 significant digits). */
static void test_gilliland_fits(void **state)
{
    (void)state;
    const struct {
        double factor, molokanov, eduljee;
    } rows[] = {{1.2, 15.84, 15.60}, {1.3, 14.42, 14.10}, {1.5, 12.60, 12.32}};
    for (size_t i = 0; i < 3; i++) {
        double R = rows[i].factor * 1.1, nm = NAN, ne = NAN;
        assert_int_equal(pw_gilliland_molokanov(6.4269, R, 1.1, &nm), PW_OK);
        assert_int_equal(pw_gilliland_eduljee(6.4269, R, 1.1, &ne), PW_OK);
        pw_assert_close(nm, rows[i].molokanov, 0, 0.006, "Molokanov [H]");
        pw_assert_close(ne, rows[i].eduljee, 0, 0.006, "Eduljee [H]");
    }
    /* Ends of the correlation: X = 1 gives Y = 0 (N = N_min, Molokanov); R = R_min gives
     * infinitely many stages (Molokanov) and Y = 0.75 (Eduljee: N = (0.75 + N_min)/0.25);
     * invalid input gives PW_EINVAL and leaves the output alone. */
    double v = NAN;
    assert_int_equal(pw_gilliland_molokanov(6.0, 1.1, 1.1, &v), PW_OK);
    assert_true(isinf(v) && v > 0.0);
    assert_int_equal(pw_gilliland_eduljee(6.0, 1.1, 1.1, &v), PW_OK);
    pw_assert_close(v, (0.75 + 6.0) / 0.25, 1e-14, 0, "Eduljee at R_min");
    assert_int_equal(pw_gilliland_molokanov(6.0, 1e12, 0.0, &v), PW_OK);
    pw_assert_close(v, 6.0, 1e-6, 0, "X -> 1");
    v = 42.0;
    assert_int_equal(pw_gilliland_molokanov(6.0, 1.0, 1.1, &v), PW_EINVAL); /* R < R_min */
    assert_int_equal(pw_gilliland_molokanov(NAN, 2.0, 1.1, &v), PW_EINVAL);
    assert_int_equal(pw_gilliland_molokanov(6.0, INFINITY, 1.1, &v), PW_EINVAL);
    assert_int_equal(pw_gilliland_eduljee(-1.0, 2.0, 1.1, &v), PW_EINVAL);
    assert_int_equal(pw_gilliland_eduljee(6.0, 2.0, -0.1, &v), PW_EINVAL);
    assert_int_equal(pw_gilliland_eduljee(6.0, 2.0, 1.1, NULL), PW_EINVAL);
    assert_int_equal(pw_fenske_nmin(1.0, 0.95, 0.05, &v), PW_EINVAL);      /* alpha = 1 */
    assert_int_equal(pw_fenske_nmin(2.0, 0.05, 0.95, &v), PW_EINVAL);      /* xb > xd */
    assert_int_equal(pw_fenske_nmin(2.0, 1.0, 0.05, &v), PW_EINVAL);       /* xd = 1 */
    assert_int_equal(pw_fenske_nmin(2.0, 0.95, 0.0, &v), PW_EINVAL);       /* xb = 0 */
    assert_int_equal(pw_fenske_nmin(INFINITY, 0.95, 0.05, &v), PW_EINVAL);
    assert_int_equal(pw_fenske_nmin(2.0, 0.95, 0.05, NULL), PW_EINVAL);
    assert_true(v == 42.0);
    /* Fenske's closed form: alpha^N = (xd/(1-xd)) ((1-xb)/xb); alpha = 3, xd = 0.9, xb = 0.1
     * gives 81 = 3^4, N = 4 exactly (identity) */
    assert_int_equal(pw_fenske_nmin(3.0, 0.9, 0.1, &v), PW_OK);
    pw_assert_close(v, 4.0, 1e-14, 0, "Fenske 3^4");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_minimum_boiling_azeotrope),
        cmocka_unit_test(test_maximum_boiling_azeotrope),
        cmocka_unit_test(test_touching_curve),
        cmocka_unit_test(test_pinch_at_product),
        cmocka_unit_test(test_invalid_spec),
        cmocka_unit_test(test_curve_failure),
        cmocka_unit_test(test_gilliland_fits),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
