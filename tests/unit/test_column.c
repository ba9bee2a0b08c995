/* Column module: minimum reflux, pinch kind and section, stepping, against closed forms
 * (Underwood 1948, Fenske 1932), identities (mass balances, reflection symmetry, tangency on a
 * dense grid) and the [H] check values of METHODS 6.3-6.6 (computed for that brief, not read
 * from a publication; re-derived here by the identities). */
#include "pw_test.h"

#include "column_curves.h"

#include <math.h>
#include <pinchwise/column.h>
#include <string.h>

static pw_curve alpha_curve(tc_alpha *c)
{
    pw_curve k = {tc_alpha_fn, c};
    return k;
}

/* Operating-line y at x for reflux R (rectifying above the intersection, stripping below). */
static double y_operating(const pw_column_spec *s, double R, double x)
{
    double D = (s->zf - s->xb) / (s->xd - s->xb), B = 1.0 - D;
    double S = ((R + 1.0) * D - (1.0 - s->q)) / B;
    double m = R / (R + 1.0), sl = (S + 1.0) / S;
    double xi = ((1.0 - m) * s->xd + (sl - 1.0) * s->xb) / (sl - m);
    return x >= xi ? m * x + (1.0 - m) * s->xd : sl * x - (sl - 1.0) * s->xb;
}

/* min over 20001 points of [xb, xd] of y*(x) - y_op(x), computed independently of the library. */
static double dense_gap(const pw_curve *c, const pw_column_spec *s, double R)
{
    double g = INFINITY;
    for (int i = 0; i <= 20000; i++) {
        double x = s->xb + (s->xd - s->xb) * i / 20000.0, y;
        assert_int_equal(c->y_of_x(c->ctx, x, &y), PW_OK);
        double d = y - y_operating(s, R, x);
        if (d < g)
            g = d;
    }
    return g;
}

/* Tangency checks shared by the two tangent-pinch cases: at R_min the operating lines touch
 * the curve but do not cross it; at 0.999 R_min they cross. */
static void check_touch(const pw_curve *c, const pw_column_spec *s, const pw_column_result *r)
{
    assert_true(dense_gap(c, s, r->r_min) >= -1e-9);
    double y;
    assert_int_equal(c->y_of_x(c->ctx, r->pinch.x, &y), PW_OK);
    pw_assert_close(y, r->pinch.y, 0, 1e-14, "pinch y on the curve");
    pw_assert_close(y - y_operating(s, r->r_min, r->pinch.x), 0.0, 0, 1e-9, "gap at the pinch");
    assert_true(dense_gap(c, s, 0.999 * r->r_min) < 0.0);
}

/* Constant alpha = 2.5, zf 0.5, xd 0.95, xb 0.05 (METHODS 6.3 (i), 6.5): R_min equals
 * Underwood's closed form (Underwood 1948) for every q, the pinch is at the feed. */
static void test_rmin_constant_alpha_vs_underwood(void **state)
{
    (void)state;
    tc_alpha a = {2.5, 0.0};
    pw_curve c = alpha_curve(&a);
    const double qs[] = {0.0, 0.5, 1.0, 1.5, -0.3, 3.0};
    for (size_t i = 0; i < sizeof qs / sizeof qs[0]; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = qs[i]};
        pw_column_result r;
        assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
        assert_true(r.feasible);
        double ru;
        assert_int_equal(pw_underwood_rmin(2.5, 0.5, 0.95, qs[i], &ru), PW_OK);
        pw_assert_close(r.r_min, ru, 1e-8, 0, "R_min vs Underwood");
        pw_assert_close(r.r_feed, ru, 1e-8, 0, "feed-pinch R vs Underwood");
        assert_int_equal(r.pinch.kind, PW_PINCH_FEED);
        pw_assert_close(r.pinch.x, r.x_q, 0, 1e-15, "pinch at the q-line point");
        /* (x_q, y_q) on the q-line: q x - (q - 1) y = zf (McCabe & Thiele 1925). */
        pw_assert_close(qs[i] * r.x_q - (qs[i] - 1.0) * r.y_q, 0.5, 0, 1e-12, "q-line");
        /* s_min identity: the stripping line through (xb, xb) with slope (S+1)/S passes the
         * feed pinch too (both lines meet on the curve), and S = [(R+1)D - (1-q)F]/B. */
        double sl = (r.s_min + 1.0) / r.s_min;
        pw_assert_close(sl, (r.y_q - 0.05) / (r.x_q - 0.05), 1e-9, 0, "stripping slope");
        double D = 0.5, B = 0.5;
        pw_assert_close(r.s_min, ((r.r_min + 1.0) * D - (1.0 - qs[i])) / B, 1e-12, 0, "S_min");
    }
}

/* METHODS 6.3 (i) [H]: q = 1 gives R_min 1.1000, Vbar/B 2.1000; the vertical q-line exactly. */
static void test_constant_alpha_q1_values(void **state)
{
    (void)state;
    tc_alpha a = {2.5, 0.0};
    pw_curve c = alpha_curve(&a);
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
    assert_true(r.x_q == 0.5);
    pw_assert_close(r.r_min, 1.1, 1e-10, 0, "R_min [H]");
    pw_assert_close(r.s_min, 2.1, 1e-10, 0, "Vbar/B [H]");
    pw_assert_close(r.n_fenske, 6.4269, 0, 5e-5, "Fenske [H]");
    pw_assert_close(r.alpha_top, 2.5, 1e-12, 0, "alpha_top");
    pw_assert_close(r.alpha_bottom, 2.5, 1e-12, 0, "alpha_bottom");
}

/* Underwood (1948) for a binary, METHODS 6.5 [H] table, and the q = 1 and q = 0 closed forms. */
static void test_underwood_closed_forms(void **state)
{
    (void)state;
    double r;
    assert_int_equal(pw_underwood_rmin(2.5, 0.5, 0.95, 1.0, &r), PW_OK);
    pw_assert_close(r, 1.1, 0, 5e-5, "q=1 [H]");
    pw_assert_close(r, (0.95 / 0.5 - 2.5 * 0.05 / 0.5) / 1.5, 1e-12, 0, "q=1 closed form");
    assert_int_equal(pw_underwood_rmin(2.5, 0.5, 0.95, 0.0, &r), PW_OK);
    pw_assert_close(r, 2.1, 0, 5e-5, "q=0 [H]");
    pw_assert_close(r, (2.5 * 0.95 / 0.5 - 0.05 / 0.5) / 1.5 - 1.0, 1e-12, 0, "q=0 closed form");
    assert_int_equal(pw_underwood_rmin(2.5, 0.5, 0.95, 0.5, &r), PW_OK);
    pw_assert_close(r, 1.49868, 0, 5e-6, "q=0.5 [H]");
    assert_int_equal(pw_underwood_rmin(1.0, 0.5, 0.95, 1.0, &r), PW_EINVAL);
    assert_int_equal(pw_underwood_rmin(2.5, 0.5, 0.4, 1.0, &r), PW_EINVAL);
}

/* Stages at total reflux for constant alpha: x_k/(1-x_k) = [xd/(1-xd)] alpha^-k (Fenske 1932),
 * so the stepped count has integer part ceil(N) - 1 and the fraction of the CONTRACT rule. */
static void test_nmin_stepping_vs_fenske(void **state)
{
    (void)state;
    const double alpha = 2.5, xd = 0.95, xb = 0.05;
    tc_alpha a = {alpha, 0.0};
    pw_curve c = alpha_curve(&a);
    double n;
    assert_int_equal(pw_column_total_reflux(&c, xd, xb, 500, &n), PW_OK);
    double nf = NAN;
    assert_int_equal(pw_fenske_nmin(alpha, xd, xb, &nf), PW_OK);
    pw_assert_close(nf, 6.4269, 0, 5e-5, "Fenske [H] METHODS 6.4");
    double k = ceil(nf);
    double r_before = xd / (1.0 - xd) * pow(alpha, -(k - 1.0));
    double r_after = r_before / alpha;
    double x_before = r_before / (1.0 + r_before), x_after = r_after / (1.0 + r_after);
    pw_assert_close(n, k - 1.0 + (x_before - xb) / (x_before - x_after), 1e-10, 0,
                    "stepped with fractional last step");
    assert_true(floor(n) == floor(nf));
    /* xb chosen so that Fenske gives exactly 7 stages: stepping gives 7 too. */
    double rb = xd / (1.0 - xd) * pow(alpha, -7.0);
    double xb7 = rb / (1.0 + rb);
    double nf7 = NAN;
    assert_int_equal(pw_fenske_nmin(alpha, xd, xb7, &nf7), PW_OK);
    pw_assert_close(nf7, 7.0, 1e-12, 0, "Fenske integer");
    assert_int_equal(pw_column_total_reflux(&c, xd, xb7, 500, &n), PW_OK);
    pw_assert_close(n, 7.0, 0, 1e-8, "stepped integer");
    /* pw_column_solve reports the same stepped count. */
    pw_column_spec s = {.xd = xd, .xb = xb, .zf = 0.5, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
    assert_int_equal(pw_column_total_reflux(&c, xd, xb, 500, &n), PW_OK);
    pw_assert_close(r.n_min, n, 1e-14, 0, "solve n_min");
    pw_assert_close(r.n_fenske, nf, 1e-12, 0, "solve Fenske");
    assert_int_equal(pw_column_total_reflux(&c, xd, xb, 3, &n), PW_EMAXITER);
}

/* Independent stepping for constant alpha with the closed-form inverse x = y/(alpha - (alpha-1)y),
 * feed switched at the first stage whose liquid crosses the operating-line intersection. */
static double step_closed_form(double alpha, const pw_column_spec *s, double R, int *feed)
{
    double D = (s->zf - s->xb) / (s->xd - s->xb), B = 1.0 - D;
    double S = ((R + 1.0) * D - (1.0 - s->q)) / B;
    double m = R / (R + 1.0), sl = (S + 1.0) / S;
    double xi = ((1.0 - m) * s->xd + (sl - 1.0) * s->xb) / (sl - m);
    double y = s->xd, xp = s->xd;
    *feed = 0;
    for (int n = 1; n < 1000; n++) {
        double x = y / (alpha - (alpha - 1.0) * y);
        if (x <= s->xb) {
            if (!*feed)
                *feed = n;
            return n - 1 + (xp - s->xb) / (xp - x);
        }
        if (!*feed && x < xi)
            *feed = n;
        y = *feed ? sl * x - (sl - 1.0) * s->xb : m * x + (1.0 - m) * s->xd;
        xp = x;
    }
    return NAN;
}

/* Design table (factors 1.2, 1.3, 1.5: common practice, METHODS 6.7): stepped stages and feed
 * stage agree with the closed-form stepping; boil-up from the balance; Molokanov column. */
static void test_design_table(void **state)
{
    (void)state;
    tc_alpha a = {2.5, 0.0};
    pw_curve c = alpha_curve(&a);
    const double qs[] = {1.0, 0.5, 0.0, 1.3};
    for (size_t i = 0; i < sizeof qs / sizeof qs[0]; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = qs[i]};
        pw_column_result r;
        assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
        assert_int_equal(r.n_design, 3);
        double prev = INFINITY;
        for (size_t k = 0; k < r.n_design; k++) {
            const pw_design_row *d = &r.design[k];
            int feed;
            double n = step_closed_form(2.5, &s, d->R, &feed);
            pw_assert_close(d->R, d->factor * r.r_min, 1e-15, 0, "R");
            pw_assert_close(d->stages, n, 1e-9, 0, "stages vs closed-form stepping");
            assert_int_equal(d->feed_stage, feed);
            assert_true(d->stages > r.n_min && d->stages < prev);
            assert_true(d->feed_stage >= 1 && d->feed_stage <= (int)ceil(d->stages));
            pw_assert_close(d->boilup, (d->R * 0.5 + 0.5 - (1.0 - qs[i])) / 0.5, 1e-12, 0,
                            "boil-up");
            double gm = NAN;
            assert_int_equal(pw_gilliland_molokanov(r.n_min, d->R, r.r_min, &gm), PW_OK);
            pw_assert_close(d->gilliland_stages, gm, 1e-15, 0, "Molokanov column");
            prev = d->stages;
        }
    }
}

/* L/V -> 1 as R -> infinity: stepped stages approach the total-reflux count (common practice
 * limit of the McCabe-Thiele construction). Below R_min stepping cannot pass the pinch. */
static void test_stepping_limits(void **state)
{
    (void)state;
    tc_alpha a = {2.5, 0.0};
    pw_curve c = alpha_curve(&a);
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 1.0};
    double n_tot, n;
    int feed;
    assert_int_equal(pw_column_total_reflux(&c, 0.95, 0.05, 500, &n_tot), PW_OK);
    assert_int_equal(pw_column_step(&c, &s, 1e7, 500, &n, &feed), PW_OK);
    pw_assert_close(n, n_tot, 0, 1e-4, "large R");
    pw_status st = pw_column_step(&c, &s, 0.9 * 1.1, 500, &n, &feed);
    assert_true(st == PW_EINFEASIBLE || st == PW_EMAXITER);
    assert_int_equal(pw_column_step(&c, &s, -1.0, 500, &n, &feed), PW_EINVAL);
}

/* METHODS 6.3 (ii) [H]: alpha(x) = 3 exp[1 - 2x], zf 0.30, q 1, xd 0.95, xb 0.05: rectifying
 * tangent pinch. R_min 1.2687 at x_t 0.8538, feed-pinch R 0.8192, Vbar/B 0.8726. */
static void test_tangent_rectifying(void **state)
{
    (void)state;
    tc_alpha a = {3.0, 1.0};
    pw_curve c = alpha_curve(&a);
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.30, .q = 1.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
    assert_true(r.feasible);
    assert_int_equal(r.pinch.kind, PW_PINCH_TANGENT);
    assert_int_equal(r.pinch.section, PW_SECTION_RECTIFYING);
    pw_assert_close(r.r_min, 1.2687, 0, 5e-5, "R_min [H]");
    pw_assert_close(r.pinch.x, 0.8538, 0, 5e-5, "x_t [H]");
    pw_assert_close(r.r_feed, 0.8192, 0, 5e-5, "feed-pinch R [H]");
    pw_assert_close(r.s_min, 0.8726, 0, 5e-5, "Vbar/B [H]");
    /* R_min = m/(1-m), m the limiting rectifying slope (METHODS 6.2). */
    double m = (0.95 - r.pinch.y) / (0.95 - r.pinch.x);
    pw_assert_close(r.r_min, m / (1.0 - m), 1e-12, 0, "R_min from the limiting slope");
    check_touch(&c, &s, &r);
    /* The design rows step past the tangent pinch. */
    assert_int_equal(r.n_design, 3);
    assert_true(r.design[0].stages > r.design[2].stages && r.design[2].stages > r.n_min);
}

/* METHODS 6.3 (iii) [H]: the reflection (x, y) -> (1 - y, 1 - x) of (ii) with zf 0.70, q 0
 * swaps the sections: a stripping tangent pinch at x' = 0.1038, S_min' = R_min of (ii),
 * R_min' = Vbar/B of (ii). The symmetry is checked to 1e-8 against case (ii) itself. */
static void test_tangent_stripping(void **state)
{
    (void)state;
    tc_alpha a = {3.0, 1.0};
    pw_curve c2 = alpha_curve(&a);
    pw_column_spec s2 = {.xd = 0.95, .xb = 0.05, .zf = 0.30, .q = 1.0};
    pw_column_result r2;
    assert_int_equal(pw_column_solve(&c2, &s2, NULL, &r2), PW_OK);

    pw_curve c = {tc_reflect_fn, &a};
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.70, .q = 0.0};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
    assert_true(r.feasible);
    assert_int_equal(r.pinch.kind, PW_PINCH_TANGENT);
    assert_int_equal(r.pinch.section, PW_SECTION_STRIPPING);
    pw_assert_close(r.pinch.x, 0.1038, 0, 5e-5, "x_t' [H]");
    pw_assert_close(r.s_min, 1.2687, 0, 5e-5, "S_min' [H]");
    pw_assert_close(r.r_min, 0.8726, 0, 5e-5, "R_min' [H]");
    pw_assert_close(r.s_min, r2.r_min, 1e-8, 0, "S_min' = R_min (reflection)");
    pw_assert_close(r.r_min, r2.s_min, 1e-8, 0, "R_min' = S_min (reflection)");
    pw_assert_close(r.pinch.x, 1.0 - r2.pinch.y, 0, 1e-7, "x_t' = 1 - y_t");
    /* A feed-pinch-only search gives S' = 0.8192 [H]: S = [(R+1)D - (1-q)F]/B with q' = 0. */
    double D = (0.70 - 0.05) / 0.90, B = 1.0 - D;
    pw_assert_close(((r.r_feed + 1.0) * D - 1.0) / B, 0.8192, 0, 5e-5, "feed-pinch S' [H]");
    pw_assert_close(((r.r_feed + 1.0) * D - 1.0) / B, r2.r_feed, 1e-8, 0, "feed S' = feed R");
    /* S_min = 1/(s - 1), s the limiting stripping slope (METHODS 6.2). */
    double sl = (r.pinch.y - 0.05) / (r.pinch.x - 0.05);
    pw_assert_close(r.s_min, 1.0 / (sl - 1.0), 1e-12, 0, "S_min from the limiting slope");
    check_touch(&c, &s, &r);
}

/* The same tangent cases at other feed conditions still satisfy the touch conditions. */
static void test_tangent_any_q(void **state)
{
    (void)state;
    tc_alpha a = {3.0, 1.0};
    pw_curve c = alpha_curve(&a);
    const double qs[] = {0.0, 0.5, 1.2, -0.05, 4.0};
    for (size_t i = 0; i < sizeof qs / sizeof qs[0]; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.30, .q = qs[i]};
        pw_column_result r;
        assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
        assert_true(r.feasible);
        assert_true(r.r_min >= r.r_feed * (1.0 - 1e-12));
        check_touch(&c, &s, &r);
    }
    /* q = -0.2: the q-line meets the curve below xb; R_min is then at least the zero-boil-up
     * reflux (mass balance, see test_column_boilup.c), or a rectifying tangent pinch above it. */
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.30, .q = -0.2};
    pw_column_result r;
    assert_int_equal(pw_column_solve(&c, &s, NULL, &r), PW_OK);
    assert_true(r.feasible);
    assert_true(r.boilup_limited);
    double D = (s.zf - s.xb) / (s.xd - s.xb);
    assert_true(r.r_min >= (1.0 - s.q) / D - 1.0 - 1e-12);
}

/* The answer does not depend on the scan grid, because the extrema are refined by minimisation:
 * coarse and fine grids give the same R_min (identity to 1e-9). */
static void test_grid_independence(void **state)
{
    (void)state;
    tc_alpha a = {3.0, 1.0};
    pw_curve c = alpha_curve(&a);
    pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.30, .q = 1.0};
    pw_column_result fine, coarse;
    pw_column_options o = pw_column_default_options();
    o.grid = 20000;
    assert_int_equal(pw_column_solve(&c, &s, &o, &fine), PW_OK);
    o.grid = 60;
    o.n_factors = 0;
    assert_int_equal(pw_column_solve(&c, &s, &o, &coarse), PW_OK);
    assert_int_equal(coarse.n_design, 0);
    pw_assert_close(coarse.r_min, fine.r_min, 1e-9, 0, "R_min coarse vs fine grid");
    pw_assert_close(coarse.pinch.x, fine.pinch.x, 0, 1e-6, "pinch x coarse vs fine grid");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_rmin_constant_alpha_vs_underwood),
        cmocka_unit_test(test_constant_alpha_q1_values),
        cmocka_unit_test(test_underwood_closed_forms),
        cmocka_unit_test(test_nmin_stepping_vs_fenske),
        cmocka_unit_test(test_design_table),
        cmocka_unit_test(test_stepping_limits),
        cmocka_unit_test(test_tangent_rectifying),
        cmocka_unit_test(test_tangent_stripping),
        cmocka_unit_test(test_tangent_any_q),
        cmocka_unit_test(test_grid_independence),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
