/* The split-exclusion proof (src/thermo/split_bound.c) and the shortcuts of the three-phase
 * search built on it (src/thermo/three_phase.c), against independent computations:
 *  - the bound itself: on a box of one point it equals D = 1/(x(1-x)) + d2(gE/RT)/dx2 from the
 *    model's own evaluation (an identity that checks the bound's algebra, UNIQUAC's perspective
 *    form included), and on random boxes it never exceeds D at random points inside;
 *  - seeded random parameter sets of NRTL, two-parameter Margules, van Laar and UNIQUAC: wherever the proof
 *    says "no split on [T_a, T_b]", the full liquid-liquid solve (2,241-point stability grid with
 *    refinement, pw_lle_solve) finds no split at 25 temperatures of the range and the dense
 *    stability scan (pw_stability_min) finds d2(Gmix/RT)/dx2 > 0; wherever the full solve finds
 *    a split, the proof must not claim otherwise; the proof is also required to be tight enough
 *    to matter (it proves most of the sets the dense scan finds miscible);
 *  - closed forms: symmetric Margules splits iff A(T) > 2 (METHODS2 2.2, an identity of
 *    D = 1/(x(1-x)) - 2A at x = 1/2), so the proof must hold for A T_ref/T < 2 on the whole range
 *    and fail when 2 is crossed; Wilson's equation never splits (Wilson 1964);
 *  - the fast pw_three_phase_at_P against the full 1 K scan (every grid temperature solved, no
 *    proof) on seeded random systems of real components: the same state to the last bit. */
#include "pw_test.h"

#include "thermo/thermo_internal.h"

#include <math.h>
#include <pinchwise/lle.h>
#include <string.h>

static pw_complib lib;

static unsigned long long rng_state;
static double urand(void)
{
    rng_state ^= rng_state << 13;
    rng_state ^= rng_state >> 7;
    rng_state ^= rng_state << 17;
    return (double)(rng_state >> 11) / 9007199254740992.0;
}
static double uniform(double a, double b) { return a + (b - a) * urand(); }

static pw_component comp(const char *name)
{
    const pw_component *c = pw_complib_find(&lib, name);
    assert_non_null(c);
    return *c;
}

static pw_system sys_of(const pw_model_type *m, double p0, double p1, double p2)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = comp("acetone");
    s.comp[1] = comp("water");
    s.model = m;
    s.params[0] = p0;
    s.params[1] = p1;
    s.params[2] = p2;
    s.T_ref_K = 350.0;
    return s;
}

/* The full solve at n temperatures of [Ta, Tb]: true when any of them splits (or cannot be
 * solved: treated as a split, so that it never confirms a false "excluded"). *all_convex is
 * true when the dense stability scan finds D > 0 at every one. */
static bool full_scan_splits(const pw_system *s, double Ta, double Tb, int n, bool *all_convex)
{
    bool split = false;
    *all_convex = true;
    for (int k = 0; k < n; k++) {
        double T = Ta + (Tb - Ta) * k / (n - 1);
        pw_lle_result r;
        pw_status st = pw_lle_solve(s, T, &r);
        if (st != PW_OK || r.split)
            split = true;
        double D, x;
        if (pw_stability_min(s, T, &D, &x) != PW_OK || !(D > 0.0))
            *all_convex = false;
    }
    return split;
}

/* UNIQUAC with r, q of the sizes real molecules have (about 0.9-6; q about 0.7-1.1 r) and
 * du_ij from attraction to strong repulsion. */
static pw_system uniquac_random(void)
{
    pw_system s = sys_of(&pw_model_uniquac, uniform(-300.0, 700.0), uniform(-300.0, 700.0), 0.0);
    for (int i = 0; i < 2; i++) {
        double r = uniform(0.9, 6.0);
        s.params[2 + 2 * i] = r;
        s.params[3 + 2 * i] = r * uniform(0.7, 1.1);
    }
    return s;
}

/* A random parameter set of one of the four models that can split. */
static pw_system random_system(const pw_model_type *m)
{
    if (m == &pw_model_nrtl)
        return sys_of(m, uniform(-400.0, 1200.0), uniform(-400.0, 1200.0), uniform(0.1, 0.6));
    if (m == &pw_model_margules)
        return sys_of(m, uniform(-1.5, 3.5), uniform(-1.5, 3.5), 0.0);
    if (m == &pw_model_vanlaar)
        return sys_of(m, uniform(0.1, 4.0), uniform(0.1, 4.0), 0.0);
    return uniquac_random();
}

static double D_model(const pw_system *s, double x, double T)
{
    pw_activity a;
    assert_int_equal(pw_system_activity(s, x, T, &a), PW_OK);
    return 1.0 / (x * (1.0 - x)) + a.d2gE_dx2;
}

static void bound_is_D_on_a_point_and_below_it_on_a_box(void **state)
{
    (void)state;
    const pw_model_type *models[] = {&pw_model_nrtl, &pw_model_margules, &pw_model_vanlaar,
                                     &pw_model_uniquac};
    rng_state = 0x5851f42d4c957f2dULL;
    for (int mi = 0; mi < 4; mi++)
        for (int t = 0; t < 500; t++) {
            pw_system s = random_system(models[mi]);
            double x = uniform(0.001, 0.999), T = uniform(250.0, 450.0);
            double D = D_model(&s, x, T);
            double lb = pw_thermo_split_D_lower(&s, x, x, T, T);
            pw_assert_close(lb, D, 1e-9, 1e-9, "bound on a one-point box");
            double xa = uniform(0.0, 1.0), xb = uniform(xa, 1.0);
            double Ta = uniform(250.0, 450.0), Tb = uniform(Ta, Ta + 60.0);
            double box_lb = pw_thermo_split_D_lower(&s, xa, xb, Ta, Tb);
            assert_false(isnan(box_lb));
            for (int k = 0; k < 20; k++) {
                double xi = uniform(xa, xb), Ti = uniform(Ta, Tb);
                if (xi <= 0.0 || xi >= 1.0)
                    continue;
                double Di = D_model(&s, xi, Ti);
                if (!(box_lb <= Di + 1e-9 * fabs(Di)))
                    fail_msg("%s p = (%g, %g, %g, %g, %g, %g): bound %.17g above D %.17g at "
                             "x %g T %g in [%g, %g] x [%g, %g]", models[mi]->name, s.params[0],
                             s.params[1], s.params[2], s.params[3], s.params[4], s.params[5],
                             box_lb, Di, xi, Ti, xa, xb, Ta, Tb);
            }
        }
}

static void random_sets(void **state)
{
    (void)state;
    const pw_model_type *models[] = {&pw_model_nrtl, &pw_model_margules, &pw_model_vanlaar,
                                     &pw_model_uniquac};
    for (int mi = 0; mi < 4; mi++) {
        rng_state = 0x9e3779b97f4a7c15ULL + (unsigned long long)mi;
        int n_excluded = 0, n_split = 0, n_convex = 0, n_convex_proved = 0;
        for (int t = 0; t < 60; t++) {
            pw_system s = random_system(models[mi]);
            double Ta = uniform(260.0, 400.0), Tb = Ta + uniform(0.0, 80.0);
            bool excluded = pw_thermo_split_excluded(&s, Ta, Tb), convex;
            bool split = full_scan_splits(&s, Ta, Tb, 25, &convex);
            if (excluded) {
                n_excluded++;
                if (split || !convex)
                    fail_msg("model %s p = (%g, %g, %g), T %g..%g K: proof says no split, the full "
                             "solve disagrees", models[mi]->name, s.params[0], s.params[1],
                             s.params[2], Ta, Tb);
            }
            n_split += split;
            n_convex += convex;
            n_convex_proved += convex && excluded;
        }
        print_message("%s: %d of 60 proved miscible, %d split, %d convex at every sampled T\n",
                      models[mi]->name, n_excluded, n_split, n_convex);
        /* both outcomes occur, so neither branch of the check above is vacuous */
        assert_true(n_excluded >= 10);
        assert_true(n_split >= 5);
        /* tight enough to matter: at most 1 in 10 of the miscible sets left unproved */
        assert_true(10 * n_convex_proved >= 9 * n_convex);
    }
}

static void closed_forms(void **state)
{
    (void)state;
    /* symmetric Margules, A(T) = A T_ref/T with T_ref 350 K: splits iff A(T) > 2 */
    pw_system s = sys_of(&pw_model_margules, 2.2, 2.2, 0.0);
    /* A(T) = 2 at T = 385 K: miscible above, split below */
    assert_true(pw_thermo_split_excluded(&s, 386.0, 450.0));
    assert_false(pw_thermo_split_excluded(&s, 380.0, 450.0));
    assert_false(pw_thermo_split_excluded(&s, 300.0, 384.0));
    /* close to the critical point: A(T) = 1.9999 at the lower end */
    assert_true(pw_thermo_split_excluded(&s, 2.2 * 350.0 / 1.9999, 500.0));
    s = sys_of(&pw_model_wilson, 5000.0, 5000.0, 0.0);
    assert_true(pw_thermo_split_excluded(&s, 200.0, 500.0));
    /* UNIQUAC with r1 = r2 = q1 = q2 = q and du12 = du21 (tau12 = tau21 = tau): at x = 1/2 the
     * formula gives D = 4 + 4 q (tau - 1)(3 tau + 1)/(1 + tau)^2 (theta = 1/2, A = B = (1 + tau)/2,
     * the combinatorial part vanishes). du = 0 is the ideal solution: proved miscible. */
    s = sys_of(&pw_model_uniquac, 0.0, 0.0, 0.0);
    s.params[2] = s.params[3] = s.params[4] = s.params[5] = 1.0;
    assert_true(pw_thermo_split_excluded(&s, 250.0, 450.0));
    /* du = 600 K, q = 3 at 300 K: tau = exp(-2), D(1/2) = 4 - 4 x 2.83 < 0, a split the liquid-
     * liquid solve finds; the proof must not claim otherwise */
    s.params[0] = s.params[1] = 600.0;
    s.params[2] = s.params[3] = s.params[4] = s.params[5] = 3.0;
    double tau = exp(-2.0);
    pw_assert_close(pw_thermo_split_D_lower(&s, 0.5, 0.5, 300.0, 300.0),
                    4.0 + 4.0 * 3.0 * (tau - 1.0) * (3.0 * tau + 1.0) / ((1.0 + tau) * (1.0 + tau)),
                    1e-12, 1e-12, "UNIQUAC D(1/2), symmetric closed form");
    pw_lle_result lr;
    assert_int_equal(pw_lle_solve(&s, 300.0, &lr), PW_OK);
    assert_true(lr.split);
    assert_false(pw_thermo_split_excluded(&s, 300.0, 301.0));
    /* van Laar with both parameters negative: gE'' > 0, never splits */
    s = sys_of(&pw_model_vanlaar, -2.0, -5.0, 0.0);
    assert_true(pw_thermo_split_excluded(&s, 250.0, 450.0));
}

static void same_as_full_scan(void **state)
{
    (void)state;
    const char *pairs[][2] = {{"acetone", "water"}, {"1-butanol", "water"}, {"benzene", "water"},
                              {"methanol", "toluene"}};
    rng_state = 0x243f6a8885a308d3ULL;
    int n_exists = 0, n_none = 0;
    for (int t = 0; t < 24; t++) {
        pw_system s;
        memset(&s, 0, sizeof s);
        s.comp[0] = comp(pairs[t % 4][0]);
        s.comp[1] = comp(pairs[t % 4][1]);
        if (t % 3 == 2) {
            /* UNIQUAC with the components' own r and q (component file columns r, q) */
            s.model = &pw_model_uniquac;
            s.params[0] = uniform(-200.0, 700.0);
            s.params[1] = uniform(-200.0, 700.0);
            for (int i = 0; i < 2; i++) {
                assert_int_equal(pw_component_require(&s.comp[i], PW_PROP_R, &s.params[2 + 2 * i],
                                                      NULL), PW_OK);
                assert_int_equal(pw_component_require(&s.comp[i], PW_PROP_Q, &s.params[3 + 2 * i],
                                                      NULL), PW_OK);
            }
        } else if (t % 2 == 0) {
            s.model = &pw_model_nrtl;
            s.params[0] = uniform(-200.0, 1500.0);
            s.params[1] = uniform(-200.0, 1500.0);
            s.params[2] = uniform(0.2, 0.5);
        } else {
            s.model = &pw_model_margules;
            s.T_ref_K = 350.0;
            s.params[0] = uniform(0.5, 4.0);
            s.params[1] = uniform(0.5, 4.0);
        }
        double P = uniform(60e3, 150e3);
        pw_three_phase fast, full;
        pw_status sf = pw_three_phase_at_P(&s, P, &fast);
        pw_status sr = pw_thermo_three_phase_at_P_full(&s, P, &full);
        assert_int_equal(sf, sr);
        if (sf != PW_OK)
            continue;
        assert_int_equal(fast.exists, full.exists);
        if (!full.exists) {
            n_none++;
            continue;
        }
        n_exists++;
        assert_true(fast.T_K == full.T_K);
        assert_true(fast.x[0] == full.x[0] && fast.x[1] == full.x[1]);
        assert_true(fast.y1 == full.y1);
    }
    print_message("three-phase state found in %d systems, none in %d\n", n_exists, n_none);
    assert_true(n_exists >= 3 && n_none >= 3);
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
        cmocka_unit_test(closed_forms),
        cmocka_unit_test(bound_is_D_on_a_point_and_below_it_on_a_box),
        cmocka_unit_test(random_sets),
        cmocka_unit_test(same_as_full_scan),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
