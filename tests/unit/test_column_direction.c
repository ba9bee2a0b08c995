/* Either split direction (column_direction.h): a column whose component 1 leaves with the bottoms
 * (xd < zf < xb) against closed forms written in the fractions of component 2, which goes
 * overhead, and seeded random curves solved in both orientations.
 *
 * Checks: Underwood (1948) R_min for constant relative volatility, any q; the METHODS 6.3 (i) [H]
 * values for alpha 2.5, xd 0.95, xb 0.05, zf 0.5, q 1 (R_min 1.1000, Vbar/B 2.1000, Fenske
 * 6.4269), read in the mirrored frame; stepping with the closed-form inverse of the constant-alpha
 * curve (written here independently of the library); the q-line q x - (q - 1) y = zf, which the
 * mirror leaves unchanged (McCabe & Thiele 1925). */
#include "pw_test.h"

#include "column_curves.h"

#include <math.h>
#include <pinchwise/column_direction.h>
#include <stdlib.h>
#include <string.h>

/* Component 1 the heavier one with constant relative volatility a of component 2 to component 1:
 * y1 = x1 / (a - (a - 1) x1). */
static pw_status heavy_fn(void *ctx, double x, double *y)
{
    double a = *(const double *)ctx;
    *y = x / (a - (a - 1.0) * x);
    return PW_OK;
}

/* The reflection of a tc_alpha curve written as a closed form: y(x) = 1 - f(1 - x). */
static pw_status reflected_fn(void *ctx, double x, double *y)
{
    *y = 1.0 - tc_alpha_y(ctx, 1.0 - x);
    return PW_OK;
}

static void underwood_when_component_1_goes_down(void **state)
{
    (void)state;
    double a = 2.5;
    pw_curve c = {heavy_fn, &a};
    const double qs[] = {0.0, 0.5, 1.0, 1.5, -0.3, 3.0};
    for (size_t i = 0; i < sizeof qs / sizeof qs[0]; i++) {
        pw_column_spec s = {.xd = 0.05, .xb = 0.95, .zf = 0.5, .q = qs[i]};
        assert_int_equal(pw_column_direction_of(&s), PW_DIRECTION_BOTTOMS);
        pw_column_result r;
        assert_int_equal(pw_column_solve_any(&c, &s, NULL, &r), PW_OK);
        assert_true(r.feasible);
        double ru;
        /* Underwood in component 2: zf 0.5, xd 0.95 */
        assert_int_equal(pw_underwood_rmin(2.5, 0.5, 0.95, qs[i], &ru), PW_OK);
        pw_assert_close(r.r_min, ru, 1e-8, 0, "R_min vs Underwood (component 2 overhead)");
        assert_int_equal(r.pinch.kind, PW_PINCH_FEED);
        pw_assert_close(r.pinch.x, r.x_q, 0, 1e-15, "pinch at the q-line point");
        pw_assert_close(qs[i] * r.x_q - (qs[i] - 1.0) * r.y_q, 0.5, 0, 1e-12, "q-line");
        double y;
        heavy_fn(&a, r.pinch.x, &y);
        pw_assert_close(r.pinch.y, y, 0, 1e-12, "pinch on the curve, in component 1");
        assert_true(r.pinch.y < r.pinch.x); /* component 1 is the heavier one */
    }
    /* METHODS 6.3 (i) [H], q = 1 */
    pw_column_spec s = {.xd = 0.05, .xb = 0.95, .zf = 0.5, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve_any(&c, &s, NULL, &r), PW_OK);
    pw_assert_close(r.r_min, 1.1, 1e-10, 0, "R_min [H]");
    pw_assert_close(r.s_min, 2.1, 1e-10, 0, "Vbar/B [H]");
    pw_assert_close(r.n_fenske, 6.4269, 0, 5e-5, "Fenske [H]");
    pw_assert_close(r.alpha_top, 2.5, 1e-12, 0, "alpha of the overhead component");
    double n;
    assert_int_equal(pw_column_total_reflux_any(&c, 0.05, 0.95, 500, &n), PW_OK);
    pw_assert_close(n, r.n_min, 1e-14, 0, "total reflux either way");
    assert_true(floor(n) == floor(6.4269));
}

/* Independent stepping from the top in component 2 (constant alpha, closed-form inverse). */
static double step_closed_form(double alpha, const pw_column_spec *s, double R, int *feed)
{
    double D = (s->zf - s->xb) / (s->xd - s->xb), B = 1.0 - D;
    double S = ((R + 1.0) * D - (1.0 - s->q)) / B;
    double m = R / (R + 1.0), sl = (S + 1.0) / S;
    double xi = ((1.0 - m) * s->xd + (sl - 1.0) * s->xb) / (sl - m);
    double y = s->xd, xp = s->xd;
    *feed = 0;
    for (int k = 1; k < 1000; k++) {
        double x = y / (alpha - (alpha - 1.0) * y);
        if (x <= s->xb) {
            if (!*feed)
                *feed = k;
            return k - 1 + (xp - s->xb) / (xp - x);
        }
        if (!*feed && x < xi)
            *feed = k;
        y = *feed ? sl * x - (sl - 1.0) * s->xb : m * x + (1.0 - m) * s->xd;
        xp = x;
    }
    return NAN;
}

static void design_rows_when_component_1_goes_down(void **state)
{
    (void)state;
    double a = 2.5;
    pw_curve c = {heavy_fn, &a};
    pw_column_spec s = {.xd = 0.05, .xb = 0.95, .zf = 0.5, .q = 1.0};
    pw_column_spec up = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 1.0}; /* component 2 */
    pw_column_result r;
    assert_int_equal(pw_column_solve_any(&c, &s, NULL, &r), PW_OK);
    assert_true(r.n_design == 3);
    for (size_t i = 0; i < r.n_design; i++) {
        int feed;
        double want = step_closed_form(2.5, &up, r.design[i].R, &feed);
        pw_assert_close(r.design[i].stages, want, 1e-9, 0, "stages vs closed-form stepping");
        assert_int_equal(r.design[i].feed_stage, feed);
        double st;
        int fs;
        assert_int_equal(pw_column_step_any(&c, &s, r.design[i].R, 500, &st, &fs), PW_OK);
        pw_assert_close(st, want, 1e-9, 0, "pw_column_step_any");
        assert_int_equal(fs, feed);
    }
}

/* Seeded random curves (variable relative volatility, azeotrope-free on the products' range) and
 * specs, solved as given and reflected: the same R_min, boil-up, stages and feed stages, and the
 * pinch mapped x -> 1 - x. The reflected curve is a closed form of its own, not the module's
 * mirror. */
static void random_splits_in_both_orientations(void **state)
{
    (void)state;
    srand(20261202u);
    int solved = 0;
    for (int t = 0; t < 60; t++) {
        double u[6];
        for (int k = 0; k < 6; k++)
            u[k] = rand() / (RAND_MAX + 1.0);
        tc_alpha f = {1.3 + 3.0 * u[0], -0.4 + 1.1 * u[1]};
        double xb = 0.01 + 0.2 * u[2], xd = 0.8 + 0.19 * u[3];
        double zf = xb + (xd - xb) * (0.2 + 0.6 * u[4]);
        double q = -0.3 + 1.8 * u[5];
        pw_curve c = {tc_alpha_fn, &f};
        pw_curve g = {reflected_fn, &f};
        pw_column_spec s = {.xd = xd, .xb = xb, .zf = zf, .q = q};
        pw_column_spec m = {.xd = 1.0 - xd, .xb = 1.0 - xb, .zf = 1.0 - zf, .q = q};
        pw_column_result r1, r2;
        pw_status s1 = pw_column_solve(&c, &s, NULL, &r1);
        pw_status s2 = pw_column_solve_any(&g, &m, NULL, &r2);
        assert_int_equal(s1, s2);
        if (s1 != PW_OK)
            continue;
        assert_int_equal(r1.feasible, r2.feasible);
        if (!r1.feasible) {
            assert_non_null(strstr(r2.reason, "component 1 leaves with the bottoms"));
            continue;
        }
        solved++;
        pw_assert_close(r2.r_min, r1.r_min, 1e-7, 1e-10, "R_min both ways");
        pw_assert_close(r2.s_min, r1.s_min, 1e-7, 1e-10, "boil-up both ways");
        pw_assert_close(r2.n_min, r1.n_min, 1e-9, 0, "N_min both ways");
        assert_int_equal(r2.pinch.kind, r1.pinch.kind);
        assert_int_equal(r2.pinch.section, r1.pinch.section);
        pw_assert_close(r2.pinch.x, 1.0 - r1.pinch.x, 0, 1e-6, "pinch x mirrored");
        pw_assert_close(r2.pinch.y, 1.0 - r1.pinch.y, 0, 1e-6, "pinch y mirrored");
        assert_int_equal(r2.n_design, r1.n_design);
        for (size_t i = 0; i < r1.n_design; i++) {
            pw_assert_close(r2.design[i].stages, r1.design[i].stages, 1e-6, 0, "stages");
            assert_int_equal(r2.design[i].feed_stage, r1.design[i].feed_stage);
        }
    }
    assert_true(solved >= 30); /* the cases are not all refused */
}

static void feed_outside_the_products(void **state)
{
    (void)state;
    double a = 2.5;
    pw_curve c = {heavy_fn, &a};
    const pw_column_spec bad[] = {
        {0.9, 0.1, 0.95, 1.0}, {0.1, 0.9, 0.05, 1.0}, {0.5, 0.5, 0.5, 1.0}, {0.9, 0.1, NAN, 1.0}};
    for (size_t i = 0; i < sizeof bad / sizeof *bad; i++) {
        pw_column_result r;
        assert_int_equal(pw_column_direction_of(&bad[i]), PW_DIRECTION_NONE);
        assert_int_equal(pw_column_solve_any(&c, &bad[i], NULL, &r), PW_EINVAL);
        assert_non_null(strstr(r.reason, "does not lie strictly between"));
    }
    /* the wrong direction for this curve: component 1 is heavy, so it cannot go overhead */
    pw_column_spec up = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve_any(&c, &up, NULL, &r), PW_OK);
    assert_false(r.feasible);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(underwood_when_component_1_goes_down),
        cmocka_unit_test(design_rows_when_component_1_goes_down),
        cmocka_unit_test(random_splits_in_both_orientations),
        cmocka_unit_test(feed_outside_the_products),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
