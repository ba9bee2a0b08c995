/* The fit's lean bubble-point kernel against the full path it replaces (identities: the same
 * arithmetic, so the same numbers to the bit; docs/fitting.md, "Lean bubble-point kernel"):
 *  - each model's eval_lean gives eval's ln gamma_i and d ln gamma_i/dT, and its d2gE_dx2 scan
 *    function eval's d2(G^E/RT)/dx1^2, at seeded random parameters, compositions and
 *    temperatures (NRTL; models without them are skipped by the kernel);
 *  - pw_thermo_bubble_T_lean gives pw_bubble_T_from's T and y1 (and the same status), and
 *    pw_thermo_bubble_P_lean pw_bubble_P's P and y1, for every model on real pairs from the
 *    component library, one with the IAPWS-IF97 water (pw_psat) and one of two Antoine
 *    components (the kernel's own vapor pressures);
 *  - pw_stability_min through the model's scan function: its minimum is at or below the
 *    point-by-point scan over eval on the same grid, and is eval's value at the x it returns. */
#include "pw_test.h"

#include "thermo/thermo_internal.h"

#include <math.h>
#include <string.h>

static pw_complib lib;

static unsigned long long rng_state = 0x2026120213ULL;
static double urand(void)
{
    rng_state ^= rng_state << 13;
    rng_state ^= rng_state >> 7;
    rng_state ^= rng_state << 17;
    return (double)(rng_state >> 11) / 9007199254740992.0;
}
static double uniform(double a, double b) { return a + (b - a) * urand(); }

/* Random parameters in each model's start ranges (fixed parameters at their defaults). */
static void random_params(const pw_model_type *m, double *p)
{
    for (size_t k = 0; k < PW_MAX_PARAMS; k++)
        p[k] = k < m->n_params ? m->defaults[k] : 0.0;
    double sign = urand() < 0.5 ? -1.0 : 1.0;
    for (size_t k = 0; k < m->n_params; k++) {
        if (!m->fitted_default[k] || !m->start_range)
            continue;
        p[k] = uniform(m->start_range[k][0], m->start_range[k][1]);
        if (m->starts_same_sign)
            p[k] = sign * (0.05 + fabs(p[k]));
    }
}

static void model_functions(void **state)
{
    (void)state;
    size_t n_models, n_checked = 0;
    const pw_model_type *const *models = pw_model_all(&n_models);
    for (size_t im = 0; im < n_models; im++) {
        const pw_model_type *m = models[im];
        if (!m->eval_lean && !m->d2gE_dx2)
            continue;
        for (int trial = 0; trial < 2000; trial++) {
            double p[PW_MAX_PARAMS];
            random_params(m, p);
            if (m->check(p) != PW_OK)
                continue;
            double x1 = trial % 50 == 0 ? (trial % 100 == 0 ? 0.0 : 1.0) : urand();
            double T = uniform(250.0, 450.0), T_ref = uniform(300.0, 400.0);
            pw_activity a;
            pw_status st = m->eval(p, T_ref, x1, T, &a);
            if (m->eval_lean) {
                double lg[2], dT[2];
                pw_status sl = m->eval_lean(p, T_ref, x1, T, lg, dT);
                if (st == PW_OK) {
                    assert_int_equal(sl, PW_OK);
                    for (int i = 0; i < 2; i++) {
                        assert_true(lg[i] == a.lngamma[i]);
                        assert_true(dT[i] == a.dlngamma_dT[i]);
                    }
                    n_checked++;
                }
            }
            if (m->d2gE_dx2 && st == PW_OK) {
                double d2;
                assert_int_equal(m->d2gE_dx2(p, T_ref, T, 1, &x1, &d2), PW_OK);
                assert_true(d2 == a.d2gE_dx2);
            }
        }
    }
    assert_true(n_checked > 1000);
}

static void bubble_points(void **state)
{
    (void)state;
    static const char *const pairs[][2] = {{"acetone", "water"}, {"acetone", "methanol"}};
    size_t n_models, n_T = 0, n_P = 0;
    const pw_model_type *const *models = pw_model_all(&n_models);
    for (size_t ip = 0; ip < 2; ip++) {
        pw_system s;
        memset(&s, 0, sizeof s);
        const pw_component *c1 = pw_complib_find(&lib, pairs[ip][0]);
        const pw_component *c2 = pw_complib_find(&lib, pairs[ip][1]);
        assert_non_null(c1);
        assert_non_null(c2);
        s.comp[0] = *c1;
        s.comp[1] = *c2;
        pw_thermo_kernel k;
        pw_thermo_kernel_init(&s, &k);
        assert_true(k.antoine[0]);                 /* acetone: the kernel's Antoine */
        assert_true(k.antoine[1] == (ip == 1));   /* water: IAPWS-IF97 through pw_psat */
        for (size_t im = 0; im < n_models; im++) {
            s.model = models[im];
            for (int trial = 0; trial < 150; trial++) {
                random_params(s.model, s.params);
                if (s.model->from_components)
                    s.model->from_components(c1, c2, s.params, NULL);
                if (s.model->check(s.params) != PW_OK)
                    continue;
                s.T_ref_K = uniform(320.0, 370.0);
                double x1 = uniform(0.01, 0.99);
                double P = uniform(40e3, 200e3), guess = uniform(320.0, 380.0);
                pw_eq_point full;
                pw_bubble_lean lean;
                pw_status sf = pw_bubble_T_from(&s, P, x1, guess, &full);
                pw_status sl = pw_thermo_bubble_T_lean(&s, &k, P, x1, guess, &lean);
                assert_int_equal(sl, sf);
                if (sf == PW_OK) {
                    assert_true(lean.T_K == full.T_K);
                    assert_true(lean.y1 == full.y1);
                    n_T++;
                }
                double T = uniform(300.0, 380.0);
                sf = pw_bubble_P(&s, T, x1, &full);
                sl = pw_thermo_bubble_P_lean(&s, &k, T, x1, &lean);
                assert_int_equal(sl, sf);
                if (sf == PW_OK) {
                    assert_true(lean.P_Pa == full.P_Pa);
                    assert_true(lean.y1 == full.y1);
                    n_P++;
                }
            }
        }
    }
    assert_true(n_T > 800 && n_P > 800);
}

/* The scan over eval, point by point, as pw_stability_min did before the scan function. */
static void stability_scan(void **state)
{
    (void)state;
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *pw_complib_find(&lib, "acetone");
    s.comp[1] = *pw_complib_find(&lib, "water");
    s.model = &pw_model_nrtl;
    int n_split = 0;
    for (int trial = 0; trial < 200; trial++) {
        random_params(s.model, s.params);
        double T = uniform(300.0, 400.0), D, x;
        assert_int_equal(pw_stability_min(&s, T, &D, &x), PW_OK);
        double Dg = INFINITY;
        for (int k = 1; k <= 499; k++) {
            pw_activity a;
            double xk = k / 500.0;
            assert_int_equal(pw_system_activity(&s, xk, T, &a), PW_OK);
            Dg = fmin(Dg, 1.0 / (xk * (1.0 - xk)) + a.d2gE_dx2);
        }
        /* the refined minimum is at or below the grid's, and it is eval's value at its x */
        assert_true(D <= Dg);
        pw_activity a;
        assert_int_equal(pw_system_activity(&s, x, T, &a), PW_OK);
        assert_true(D == 1.0 / (x * (1.0 - x)) + a.d2gE_dx2);
        n_split += D < 0.0;
    }
    assert_true(n_split > 0 && n_split < 200); /* both kinds of parameter set were met */
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
        cmocka_unit_test(model_functions),
        cmocka_unit_test(bubble_points),
        cmocka_unit_test(stability_scan),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
