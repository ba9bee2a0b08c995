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

#include <gsl/gsl_errno.h>
#include <gsl/gsl_rng.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <pinchwise/decanter.h>
#include <pinchwise/enthalpy.h>
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

/* The stage liquid on column cs's branch in equilibrium with vapor y: Brent on y*(x) - y between
 * the top layer and the bottoms, written here (the library steps cells from the top). */
typedef struct inv {
    const pw_system *s;
    double y;
} inv;

static double inv_f(double x, void *p)
{
    const inv *c = p;
    pw_eq_point e;
    if (pw_bubble_T(c->s, 101325.0, x, &e) != PW_OK)
        return GSL_NAN;
    return e.y1 - c->y;
}

static double stage_T(const pw_system *s, double x_top, double x_bottom, double y)
{
    inv c = {s, y};
    gsl_function F = {inv_f, &c};
    gsl_root_fsolver *r = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    gsl_root_fsolver_set(r, &F, fmin(x_top, x_bottom), fmax(x_top, x_bottom));
    for (int it = 0; it < 200; it++) {
        gsl_root_fsolver_iterate(r);
        if (gsl_root_test_interval(gsl_root_fsolver_x_lower(r), gsl_root_fsolver_x_upper(r), 1e-15,
                                   1e-14) == GSL_SUCCESS)
            break;
    }
    double x = gsl_root_fsolver_root(r);
    gsl_root_fsolver_free(r);
    pw_eq_point e;
    assert_int_equal(pw_bubble_T(s, 101325.0, x, &e), PW_OK);
    return e.T_K;
}

/* A cooled decanter (spec.T_decanter_K). At T3 (or 0: the default) the scheme is the default one
 * to the bit; below T3 the column tops are pw_lle_solve's layers at that temperature, outside
 * the layers boiling at T3, each top pinch obeys S_min = (x_t - x_B)/(y*(x_t) - x_t), and the
 * decanter's balance closes. Duties (J per mole of feed) against an independent evaluation of
 * their definitions with the enthalpy model, the pure-bottoms limit (the reboiler's duty per
 * mole of vapor is the bottoms' heat of vaporization, 40.65 kJ/mol for water at 100 C from the
 * steam tables, IAPWS-IF97, and 43.29 kJ/mol for 1-butanol at its boiling point, CRC Handbook;
 * both from memory and both in datasets/components.csv), q moving only the condenser's duty,
 * by the feed's heat of vaporization, and the refusals. The pure-bottoms limit is an identity of
 * the enthalpy model (H_V - h_L of a pure component at its boiling point is the heat of
 * vaporization it is given), checked here as plumbing, not as an outside check of the duties. */
static void cooled_decanter(void **state)
{
    (void)state;
    pw_system s = butanol_water();
    pw_decanter_spec sp = {.P_Pa = 101325.0, .zf = 0.2, .q = 1.0, .x_rich = 0.995, .x_lean = 0.001};
    pw_decanter_result r0, r1, r;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r0), PW_OK);
    assert_true(r0.feasible);
    assert_false(r0.cooled);
    assert_true(r0.T_decanter_K == r0.decanter.T_K);
    sp.T_decanter_K = r0.decanter.T_K;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r1), PW_OK);
    assert_false(r1.cooled);
    for (int i = 0; i < 2; i++) {
        assert_true(r1.col[i].boilup_min == r0.col[i].boilup_min);
        for (size_t k = 0; k < r0.col[i].n_design; k++) {
            assert_true(r1.col[i].design[k].stages == r0.col[i].design[k].stages);
            assert_true(r0.reheat_J[i][k] == 0.0);
        }
    }
    /* Cooled to 30 C, this set's rich layer (x1 = 0.367) is wetter than the one boiling at T3
     * (0.388; the measured layers move the other way, 0.488 at 25 C): refused. */
    sp.T_decanter_K = 303.15;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_false(r.feasible);
    assert_non_null(strstr(r.reason, "column A"));
    /* A set near the NRTL fit of the shipped 1 atm data with the 25 C tie line (fit --lle,
     * rounded), whose layers widen on cooling as measured. */
    s.params[0] = -23.1;
    s.params[1] = 1499.4;
    s.params[2] = 0.3;
    s.T_ref_K = 370.5;
    sp.T_decanter_K = 0.0;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r0), PW_OK);
    assert_true(r0.feasible);
    sp.T_decanter_K = 303.15;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_true(r.feasible);
    assert_true(r.cooled);
    pw_lle_result l;
    assert_int_equal(pw_lle_solve(&s, 303.15, &l), PW_OK);
    assert_true(l.split);
    pw_assert_close(r.top_x1[0], l.x[1], 0.0, 1e-12, "rich layer at 30 C");
    pw_assert_close(r.top_x1[1], l.x[0], 0.0, 1e-12, "lean layer at 30 C");
    assert_true(r.top_x1[0] > r.decanter.x[1] && r.top_x1[1] < r.decanter.x[0]);
    assert_true(r.closure < 1e-12);
    const double xb[2] = {sp.x_rich, sp.x_lean};
    for (int i = 0; i < 2; i++) {
        assert_false(r.col[i].tangent);
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(&s, sp.P_Pa, r.top_x1[i], &e), PW_OK);
        pw_assert_close(r.col[i].boilup_min, (r.top_x1[i] - xb[i]) / (e.y1 - r.top_x1[i]), 1e-9,
                        0.0, "top pinch of the cooled layer");
    }
    /* the cooled layers are purer, so both columns need less boil-up than at T3 */
    assert_true(r.col[1].boilup_min < r0.col[1].boilup_min);
    /* duties, independently from their definitions */
    assert_true(r.duties && r0.duties);
    pw_heat_data h;
    pw_error err;
    assert_int_equal(pw_heat_data_from_system(&s, &h, &err), PW_OK);
    double hF;
    {
        double hI, hII;
        const pw_three_phase *tp = &r.decanter;
        assert_true(sp.zf > tp->x[0] && sp.zf < tp->x[1]); /* a two-liquid feed */
        assert_int_equal(pw_enthalpy_liquid(&s, &h, tp->x[0], tp->T_K, &hI), PW_OK);
        assert_int_equal(pw_enthalpy_liquid(&s, &h, tp->x[1], tp->T_K, &hII), PW_OK);
        double beta = (sp.zf - tp->x[0]) / (tp->x[1] - tp->x[0]);
        hF = (1.0 - beta) * hI + beta * hII;
    }
    for (size_t k = 0; k < r.col[0].n_design; k++) {
        double Qc = hF, E = hF;
        for (int i = 0; i < 2; i++) {
            double V = r.vapor_per_mol_feed[i][k], L = r.layer_per_mol_feed[i][k];
            double y = r.col[i].design[k].y_top, hc, hh;
            pw_eq_point e;
            assert_int_equal(pw_bubble_T(&s, sp.P_Pa, xb[i], &e), PW_OK);
            double hB;
            assert_int_equal(pw_enthalpy_liquid(&s, &h, xb[i], e.T_K, &hB), PW_OK);
            pw_assert_close(r.reboiler_J[i][k], V * (pw_enthalpy_vapor(&h, e.y1, e.T_K) - hB),
                            1e-12, 0.0, "reboiler duty");
            E += r.reboiler_J[i][k] - r.bottoms_per_mol_feed[i] * hB;
            assert_int_equal(pw_enthalpy_liquid(&s, &h, r.top_x1[i], 303.15, &hc), PW_OK);
            assert_int_equal(pw_bubble_T(&s, sp.P_Pa, r.top_x1[i], &e), PW_OK);
            assert_int_equal(pw_enthalpy_liquid(&s, &h, r.top_x1[i], e.T_K, &hh), PW_OK);
            pw_assert_close(r.reheat_J[i][k], L * (hh - hc), 1e-12, 0.0, "reheat duty");
            assert_true(r.reheat_J[i][k] > 0.0);
            double Tt = stage_T(&s, r.top_x1[i], xb[i], y);
            Qc += V * pw_enthalpy_vapor(&h, y, Tt) - L * hc;
            E += r.reheat_J[i][k];
        }
        pw_assert_close(r.condenser_J[k], Qc, 1e-9, 0.0, "condenser duty");
        /* the first-law residual of the constant-molal-overflow flows, as defined */
        E -= r.condenser_J[k];
        pw_assert_close(r.energy_closure_J[k], E, 1e-9, 1e-9, "energy closure");
    }
    /* q = 0: the condenser also condenses the feed, H_V(zf at its dew point) - h_F(q = 1) */
    pw_decanter_spec sq = sp;
    sq.q = 0.0;
    pw_decanter_result rq;
    assert_int_equal(pw_decanter_solve(&s, &sq, NULL, &rq), PW_OK);
    double HV;
    assert_int_equal(pw_enthalpy_sat_vapor(&s, &h, sp.P_Pa, sp.zf, &HV, NULL), PW_OK);
    for (size_t k = 0; k < r.col[0].n_design; k++) {
        pw_assert_close(rq.condenser_J[k] - r.condenser_J[k], HV - hF, 1e-9, 0.0, "q moves Q_C");
        for (int i = 0; i < 2; i++)
            assert_true(rq.reboiler_J[i][k] == r.reboiler_J[i][k]);
    }
    /* nearly pure bottoms: the reboiler's duty per mole of vapor is the heat of vaporization */
    pw_decanter_spec sp3 = {.P_Pa = 101325.0, .zf = 0.2, .q = 1.0, .x_rich = 1.0 - 1e-6,
                            .x_lean = 1e-6};
    assert_int_equal(pw_decanter_solve(&s, &sp3, NULL, &r), PW_OK);
    assert_true(r.feasible && r.duties);
    pw_assert_close(r.reboiler_J[1][0] / r.vapor_per_mol_feed[1][0], 40650.0, 0.005, 0.0,
                    "water's heat of vaporization at 100 C");
    pw_assert_close(r.reboiler_J[0][0] / r.vapor_per_mol_feed[0][0], 43290.0, 0.005, 0.0,
                    "1-butanol's heat of vaporization at its boiling point");
    /* refusals: above T3, a temperature not positive */
    sp.T_decanter_K = r0.decanter.T_K + 1.0;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_false(r.feasible);
    assert_non_null(strstr(r.reason, "above the three-phase"));
    sp.T_decanter_K = -1.0;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_EINVAL);
    /* below water's freezing point (273.15 K): refused, at 273.15 K itself not */
    sp.T_decanter_K = 273.0;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_false(r.feasible);
    assert_non_null(strstr(r.reason, "freezing"));
    sp.T_decanter_K = 273.15;
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, &r), PW_OK);
    assert_null(strstr(r.reason, "freezing"));
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
        cmocka_unit_test(cooled_decanter),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
