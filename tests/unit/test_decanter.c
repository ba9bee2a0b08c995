/* The decanter scheme and its stripping columns (src/analysis/decanter.c).
 *
 *  - Kremser (1930) closed form for a stripping column on a linear curve y* = K x (the partial
 *    reboiler is an equilibrium stage whose entering vapor is, by the bottom balance, y = x_B):
 *    (x0 - xB)/(x0 - xB/K) = (E^(N+1) - E)/(E^(N+1) - 1), E = K V/L = K S/(S + 1); x_B is chosen
 *    so that N is a whole number, where the fractional-step count must equal it. Minimum boil-up
 *    on that curve: r(x) = (x - xB)/((K-1) x) rises to the top, S_min = (x0 - xB)/((K-1) x0).
 *  - stage counts against an independent stepping written here (closed-form inverse x = y/K);
 *  - a curve with an interior (tangent) pinch and seeded random curves against a brute-force
 *    maximum of (x - xB)/(y* - x) on 200,001 points;
 *  - the worked NRTL 1-butanol/water case of METHODS2 4.5 (computed there: boil-ups to 1e-4
 *    relative, stages to 1e-2), the mass balance closing to 1e-12, and the refusals. */
#include "pw_test.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/decanter.h>
#include <string.h>

typedef struct lin {
    double K;
} lin;

static pw_status lin_y(void *ctx, double x, double *y)
{
    const lin *l = ctx;
    *y = fmin(1.0, l->K * x);
    return PW_OK;
}

/* y = x + x (a (x - m)^2 + b): above the diagonal for x > 0, an interior minimum of the driving
 * force near m when b is small. */
typedef struct bump {
    double a, m, b;
} bump;

static pw_status bump_y(void *ctx, double x, double *y)
{
    const bump *c = ctx;
    *y = x + x * (1.0 - x) * (c->a * (x - c->m) * (x - c->m) + c->b);
    return PW_OK;
}

static double kremser_fraction(double E, double N)
{
    return (pow(E, N + 1.0) - E) / (pow(E, N + 1.0) - 1.0);
}

/* Independent stepping on y = K x (x = y/K), same counting convention. */
static double step_linear(double K, double x0, double xB, double S)
{
    double x = x0;
    for (int n = 0; n < 1000; n++) {
        double y = x + (x - xB) / S;
        double xn = y / K;
        if (xn <= xB)
            return n + (x - xB) / (x - xn);
        x = xn;
    }
    return NAN;
}

static void kremser_linear(void **state)
{
    (void)state;
    lin l = {8.0};
    pw_curve c = {lin_y, &l};
    const double x0 = 0.05, S = 0.5;
    double E = l.K * S / (S + 1.0);
    for (int N = 2; N <= 6; N++) {
        double phi = kremser_fraction(E, N);
        double xB = x0 * (1.0 - phi) / (1.0 - phi / l.K);
        pw_stripper_spec sp = {x0, xB};
        double n;
        assert_int_equal(pw_stripper_stages(&c, &sp, S, 500, &n), PW_OK);
        pw_assert_close(n, N, 0.0, 1e-8, "Kremser whole number of stages");
    }
    pw_stripper_spec sp = {x0, 0.001};
    pw_stripper_result r;
    assert_int_equal(pw_stripper_solve(&c, &sp, NULL, &r), PW_OK);
    assert_true(r.feasible);
    assert_false(r.tangent);
    pw_assert_close(r.boilup_min, (x0 - 0.001) / ((l.K - 1.0) * x0), 1e-12, 0.0, "S_min top pinch");
    for (size_t i = 0; i < r.n_design; i++)
        pw_assert_close(r.design[i].stages, step_linear(l.K, x0, 0.001, r.design[i].boilup), 1e-9,
                        0.0, "stages against an independent stepping");
    /* total boil-up: y = x, x_{n+1} = x_n / K: n_min = log(x0/xB)/log K at whole numbers */
    pw_stripper_spec sp2 = {x0, x0 / (l.K * l.K * l.K)};
    double n;
    assert_int_equal(pw_stripper_stages(&c, &sp2, INFINITY, 500, &n), PW_OK);
    pw_assert_close(n, 3.0, 0.0, 1e-9, "n_min on y = K x");
    /* below the minimum the stepping makes no progress */
    assert_int_equal(pw_stripper_stages(&c, &sp, 0.5 * r.boilup_min, 500, &n), PW_EINFEASIBLE);
}

static double brute_max(const pw_curve *c, double x_top, double xB, double *x_at)
{
    double best = -INFINITY;
    for (int k = 1; k <= 200000; k++) {
        double x = xB + (x_top - xB) * k / 200000.0, y;
        c->y_of_x(c->ctx, x, &y);
        double r = (x - xB) / (y - x);
        if (r > best) {
            best = r;
            *x_at = x;
        }
    }
    return best;
}

static void tangent_and_random(void **state)
{
    (void)state;
    bump b = {40.0, 0.25, 0.02};
    pw_curve c = {bump_y, &b};
    pw_stripper_spec sp = {0.45, 0.01};
    pw_stripper_result r;
    assert_int_equal(pw_stripper_solve(&c, &sp, NULL, &r), PW_OK);
    assert_true(r.feasible);
    assert_true(r.tangent);
    double xa, want = brute_max(&c, sp.x_top, sp.x_bottom, &xa);
    pw_assert_close(r.boilup_min, want, 1e-7, 0.0, "tangent pinch S_min");
    pw_assert_close(r.x_pinch, xa, 0.0, 1e-4, "tangent pinch x");
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 14UL);
    for (int t = 0; t < 60; t++) {
        bump bb = {60.0 * gsl_rng_uniform(rng), 0.05 + 0.6 * gsl_rng_uniform(rng),
                   0.005 + 0.5 * gsl_rng_uniform(rng)};
        pw_curve cc = {bump_y, &bb};
        pw_stripper_spec s2 = {0.1 + 0.6 * gsl_rng_uniform(rng), 0.0};
        s2.x_bottom = s2.x_top * 0.5 * gsl_rng_uniform(rng);
        assert_int_equal(pw_stripper_solve(&cc, &s2, NULL, &r), PW_OK);
        assert_true(r.feasible);
        double w = brute_max(&cc, s2.x_top, s2.x_bottom, &xa);
        if (fabs(r.boilup_min - w) > 1e-7 * w)
            fail_msg("case %d: S_min %.12g, brute force %.12g", t, r.boilup_min, w);
        /* at 1.0001 S_min the stepping reaches the bottoms; below S_min no operating line can */
        double n;
        assert_int_equal(pw_stripper_stages(&cc, &s2, 1.0001 * r.boilup_min, 5000, &n), PW_OK);
    }
    gsl_rng_free(rng);
}

static pw_complib lib;

static pw_system butanol_water(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *pw_complib_find(&lib, "1-butanol");
    s.comp[1] = *pw_complib_find(&lib, "water");
    s.model = &pw_model_nrtl;
    s.params[0] = 360.0; /* METHODS2 4.5: not a published set */
    s.params[1] = 1296.0;
    s.params[2] = 0.47;
    s.T_ref_K = 360.0;
    return s;
}

static void worked_case(void **state)
{
    (void)state;
    pw_system s = butanol_water();
    pw_column_options o = pw_column_default_options();
    o.n_factors = 3;
    o.factors[0] = 1.2;
    o.factors[1] = 1.5;
    o.factors[2] = 2.0;
    pw_decanter_spec sp = {.P_Pa = 101325.0, .zf = 0.2, .q = 1.0, .x_rich = 0.995, .x_lean = 0.001};
    pw_decanter_result r;
    assert_int_equal(pw_decanter_solve(&s, &sp, &o, &r), PW_OK);
    assert_true(r.feasible);
    /* METHODS2 4.5 (computed there) */
    pw_assert_close(r.bottoms_per_mol_feed[0], 0.200201, 0.0, 1e-6, "B_rich");
    pw_assert_close(r.bottoms_per_mol_feed[0] + r.bottoms_per_mol_feed[1], 1.0, 0.0, 1e-15, "B sum");
    pw_assert_close(r.col[0].boilup_min, 4.22216, 1e-4, 0.0, "A boilup_min");
    pw_assert_close(r.col[0].n_min, 2.9645, 0.0, 1e-2, "A n_min");
    pw_assert_close(r.col[0].design[0].stages, 4.1359, 0.0, 1e-2, "A stages 1.2");
    pw_assert_close(r.col[0].design[0].y_top, 0.26787, 0.0, 1e-5, "A top y 1.2");
    pw_assert_close(r.col[0].design[1].stages, 3.8394, 0.0, 1e-2, "A stages 1.5");
    pw_assert_close(r.col[0].design[2].stages, 3.6269, 0.0, 1e-2, "A stages 2.0");
    pw_assert_close(r.col[1].boilup_min, 0.08004, 1e-3, 0.0, "B boilup_min");
    pw_assert_close(r.col[1].n_min, 0.9807, 0.0, 1e-2, "B n_min (< 1 is legitimate)");
    pw_assert_close(r.col[1].design[0].stages, 3.7134, 0.0, 1e-2, "B stages 1.2");
    pw_assert_close(r.col[1].design[1].stages, 2.8261, 0.0, 1e-2, "B stages 1.5");
    pw_assert_close(r.col[1].design[2].stages, 2.2582, 0.0, 1e-2, "B stages 2.0");
    assert_false(r.col[0].tangent);
    assert_false(r.col[1].tangent);
    /* both top pinches sit on the three-phase vapor */
    pw_assert_close(r.col[0].y_top_min, r.decanter.y1, 0.0, 1e-7, "A top vapor at S_min = y3");
    pw_assert_close(r.col[1].y_top_min, r.decanter.y1, 0.0, 1e-7, "B top vapor at S_min = y3");
    assert_true(r.closure < 1e-12);
    /* (V_A + V_B)/F at f = 1.2: 1.09116 (METHODS2 4.5) */
    double V = r.col[0].design[0].boilup * r.bottoms_per_mol_feed[0]
               + r.col[1].design[0].boilup * r.bottoms_per_mol_feed[1];
    pw_assert_close(V, 1.09116, 1e-4, 0.0, "total boil-up per mole of feed");
    /* the streams of every row: V = S B, L = V + B, and the decanter's split of everything that
     * enters it (fresh feed and both condensed top vapors, whose compositions are the operating
     * lines at the layers) by the lever rule between the layers */
    for (size_t k = 0; k < 3; k++) {
        double in = 1.0, in1 = sp.zf, L = 0.0;
        const double xt[2] = {r.decanter.x[1], r.decanter.x[0]}, xb[2] = {sp.x_rich, sp.x_lean};
        for (int i = 0; i < 2; i++) {
            double S = r.col[i].design[k].boilup, B = r.bottoms_per_mol_feed[i];
            pw_assert_close(r.vapor_per_mol_feed[i][k], S * B, 1e-15, 0.0, "V = S B");
            pw_assert_close(r.layer_per_mol_feed[i][k], S * B + B, 1e-15, 0.0, "L = V + B");
            double y = xt[i] + (xt[i] - xb[i]) / S;
            pw_assert_close(r.col[i].design[k].y_top, y, 0.0, 1e-12, "top vapor on the operating line");
            in += S * B;
            in1 += S * B * y;
            L += r.layer_per_mol_feed[i][k];
        }
        pw_assert_close(L, in, 1e-14, 0.0, "decanter total balance");
        double z = in1 / in;
        double lever = (z - r.decanter.x[0]) / (r.decanter.x[1] - r.decanter.x[0]);
        pw_assert_close(r.layer_per_mol_feed[0][k] / L, lever, 0.0, 1e-12, "lever rule");
    }
    /* second case of METHODS2 4.5 */
    pw_decanter_spec sp2 = {.P_Pa = 101325.0, .zf = 0.1, .q = 1.0, .x_rich = 0.99, .x_lean = 0.0005};
    assert_int_equal(pw_decanter_solve(&s, &sp2, &o, &r), PW_OK);
    pw_assert_close(r.bottoms_per_mol_feed[0], 0.100556, 0.0, 1e-6, "B_rich case 2");
    pw_assert_close(r.col[0].boilup_min, 4.18740, 1e-4, 0.0, "A boilup_min case 2");
    pw_assert_close(r.col[0].n_min, 2.8010, 0.0, 1e-2, "A n_min case 2");
    pw_assert_close(r.col[0].design[0].stages, 3.8769, 0.0, 1e-2, "A stages case 2");
    pw_assert_close(r.col[1].boilup_min, 0.08227, 1e-3, 0.0, "B boilup_min case 2");
    pw_assert_close(r.col[1].n_min, 1.2343, 0.0, 1e-2, "B n_min case 2");
    pw_assert_close(r.col[1].design[0].stages, 4.3976, 0.0, 1e-2, "B stages case 2");
    /* q changes no flow */
    sp2.q = 0.0;
    pw_decanter_result r2;
    assert_int_equal(pw_decanter_solve(&s, &sp2, &o, &r2), PW_OK);
    pw_assert_close(r2.col[0].boilup_min, r.col[0].boilup_min, 1e-15, 0.0, "q-independent");
}

static void refusals(void **state)
{
    (void)state;
    pw_system s = butanol_water();
    pw_decanter_result r;
    pw_decanter_spec sp = {.P_Pa = 101325.0, .zf = 0.2, .q = 1.0, .x_rich = 0.3, .x_lean = 0.001};
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_false(r.feasible);
    assert_non_null(strstr(r.reason, "--x1-rich"));
    sp.x_rich = 0.99;
    sp.x_lean = 0.05;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_false(r.feasible);
    assert_non_null(strstr(r.reason, "--x1-lean"));
    sp.x_lean = 0.001;
    sp.zf = 0.999;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_false(r.feasible);
    /* pure products: infinitely many stages, refused with a reason (exit 0 in the CLI) */
    sp.zf = 0.2;
    sp.x_rich = 1.0;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_false(r.feasible);
    assert_non_null(strstr(r.reason, "pure"));
    /* products right beside the layers: feasible, tiny boil-up, a fraction of a stage */
    pw_three_phase t3;
    assert_int_equal(pw_three_phase_at_P(&s, 101325.0, &t3), PW_OK);
    sp.x_rich = t3.x[1] + 1e-6;
    sp.x_lean = t3.x[0] - 1e-6;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_true(r.feasible);
    for (int i = 0; i < 2; i++) {
        assert_true(r.col[i].boilup_min > 0.0 && r.col[i].boilup_min < 1e-3);
        assert_true(r.col[i].n_min > 0.0 && r.col[i].n_min < 1.0);
    }
    sp.x_lean = 0.001;
    /* Wilson cannot split */
    pw_system w = s;
    w.model = &pw_model_wilson;
    w.params[2] = 1.0;
    sp.zf = 0.2;
    assert_int_equal(pw_decanter_solve(&w, &sp, NULL, &r), PW_OK);
    assert_false(r.feasible);
    assert_non_null(strstr(r.reason, "wilson"));
    /* the single column refuses to cross the heterogeneous azeotrope and names the scheme */
    pw_three_phase tp;
    bool blocked;
    char why[PW_REASON_MAX];
    assert_int_equal(pw_column_hetero_block(&s, 101325.0, 0.001, 0.99, &tp, &blocked, why,
                                            sizeof why),
                     PW_OK);
    assert_true(blocked);
    assert_non_null(strstr(why, "decanter"));
    assert_int_equal(pw_column_hetero_block(&s, 101325.0, 0.5, 0.99, &tp, &blocked, why,
                                            sizeof why),
                     PW_OK);
    assert_false(blocked);
}

static int setup(void **state)
{
    (void)state;
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
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(kremser_linear),
        cmocka_unit_test(tangent_and_random),
        cmocka_unit_test(worked_case),
        cmocka_unit_test(refusals),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
