/* The fit's lean bubble-point kernel against the full path it replaces (identities: the same
 * arithmetic, so the same numbers to the bit; docs/fitting.md, "Lean bubble-point kernel"):
 *  - each model's eval_lean gives eval's ln gamma_i and d ln gamma_i/dT, and its d2gE_dx2 scan
 *    function eval's d2(G^E/RT)/dx1^2, at seeded random parameters, compositions and
 *    temperatures (every model; the parameters taken from the components, Wilson's volume ratio
 *    and UNIQUAC's r and q, are drawn too); where the model splits eval_lean in two (lean_x,
 *    eval_lean_x: UNIQUAC), the two parts give eval_lean's values and status to the bit;
 *  - pw_thermo_bubble_T_lean gives pw_bubble_T_from's T and y1 (and the same status), and
 *    pw_thermo_bubble_P_lean pw_bubble_P's P and y1, for every model on real pairs from the
 *    component library, one with the IAPWS-IF97 water (pw_psat) and one of two Antoine
 *    components (the kernel's own vapor pressures);
 *  - pw_stability_min through the model's scan function: its minimum is at or below the
 *    point-by-point scan over eval on the same grid, and is eval's value at the x it returns
 *    (NRTL and UNIQUAC);
 *  - whole fits: each shipped data set and seeded INVENTED ones fitted with UNIQUAC through its
 *    lean evaluation and scan function, and through a copy of the model without them (the full
 *    path: eval in every Newton step and in the stability scan), give the same minima, chi2,
 *    parameters, starts, iteration counts and stability screen to the bit. */
#include "pw_test.h"

#include "thermo/thermo_internal.h"

#include <dirent.h>
#include <math.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
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

static bool same_bits(double a, double b)
{
    return memcmp(&a, &b, sizeof a) == 0;
}

/* The parameters a fit holds fixed at the components' values (Wilson's volume ratio, UNIQUAC's
 * r and q), drawn from their start ranges. */
static void random_fixed_params(const pw_model_type *m, double *p)
{
    for (size_t k = 0; k < m->n_params; k++)
        if (!m->fitted_default[k] && m->start_range)
            p[k] = uniform(m->start_range[k][0], m->start_range[k][1]);
}

static void model_functions(void **state)
{
    (void)state;
    size_t n_models, n_checked = 0, n_fixed_drawn = 0, n_split_checked = 0;
    const pw_model_type *const *models = pw_model_all(&n_models);
    for (size_t im = 0; im < n_models; im++) {
        const pw_model_type *m = models[im];
        assert_non_null(m->eval_lean);
        assert_non_null(m->d2gE_dx2);
        /* trials 2000-3999 of a model with component parameters draw those too */
        int n_trials = m->from_components ? 4000 : 2000;
        for (int trial = 0; trial < n_trials; trial++) {
            double p[PW_MAX_PARAMS];
            random_params(m, p);
            if (trial >= 2000) {
                random_fixed_params(m, p);
                n_fixed_drawn++;
            }
            if (m->check(p) != PW_OK)
                continue;
            double x1 = trial % 50 == 0 ? (trial % 100 == 0 ? 0.0 : 1.0) : urand();
            double T = uniform(250.0, 450.0), T_ref = uniform(300.0, 400.0);
            pw_activity a;
            pw_status st = m->eval(p, T_ref, x1, T, &a);
            if (m->eval_lean) {
                double lg[2], dT[2];
                pw_status sl = m->eval_lean(p, T_ref, x1, T, lg, dT);
                if (m->lean_x) {
                    double xt[PW_LEAN_XTERMS], lgx[2], dTx[2];
                    assert_non_null(m->eval_lean_x);
                    m->lean_x(p, x1, xt);
                    assert_int_equal(m->eval_lean_x(p, T_ref, x1, xt, T, lgx, dTx), sl);
                    for (int i = 0; sl == PW_OK && i < 2; i++) {
                        assert_true(same_bits(lgx[i], lg[i]));
                        assert_true(same_bits(dTx[i], dT[i]));
                    }
                    n_split_checked += sl == PW_OK;
                }
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
    assert_true(n_fixed_drawn >= 4000); /* Wilson and UNIQUAC */
    assert_true(n_split_checked > 1000); /* UNIQUAC */
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
    const pw_model_type *const scanned[] = {&pw_model_nrtl, &pw_model_uniquac};
    for (size_t im = 0; im < sizeof scanned / sizeof scanned[0]; im++) {
        pw_system s;
        memset(&s, 0, sizeof s);
        s.comp[0] = *pw_complib_find(&lib, "acetone");
        s.comp[1] = *pw_complib_find(&lib, "water");
        s.model = scanned[im];
        int n_split = 0;
        for (int trial = 0; trial < 200; trial++) {
            random_params(s.model, s.params);
            if (s.model->from_components)
                assert_int_equal(s.model->from_components(&s.comp[0], &s.comp[1], s.params, NULL),
                                 PW_OK);
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
}

/* A copy of m without its lean evaluations and scan function: the solvers then take eval. */
static pw_model_type full_path_copy(const pw_model_type *m)
{
    pw_model_type f = *m;
    f.eval_lean = NULL;
    f.lean_x = NULL;
    f.eval_lean_x = NULL;
    f.d2gE_dx2 = NULL;
    return f;
}

/* Fits ds with m through its lean functions and through the full path; every result the same
 * to the bit. */
static void compare_fits(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                         const pw_model_type *m, const char *label)
{
    pw_model_type full = full_path_copy(m);
    pw_fit_options o = pw_fit_default_options();
    pw_fit_result a, b;
    pw_error ea, eb;
    pw_status sa = pw_fit_run(ds, c1, c2, m, &o, &a, &ea);
    pw_status sb = pw_fit_run(ds, c1, c2, &full, &o, &b, &eb);
    if (sa != sb)
        fail_msg("%s %s: status %d lean, %d full", label, m->name, sa, sb);
    if (sa != PW_OK)
        return;
    bool ok = a.fit_class == b.fit_class && a.n_minima == b.n_minima && a.n_runs == b.n_runs &&
              a.iterations == b.iterations && a.n_fev == b.n_fev && a.n_jev == b.n_jev &&
              a.minimum_default == b.minimum_default && a.split == b.split &&
              same_bits(a.chi2, b.chi2) && same_bits(a.split_min_D, b.split_min_D) &&
              same_bits(a.split_x, b.split_x) && same_bits(a.split_T_K, b.split_T_K);
    for (size_t k = 0; ok && k < m->n_params; k++)
        ok = same_bits(a.sys.params[k], b.sys.params[k]) && same_bits(a.stderr_[k], b.stderr_[k]);
    for (size_t i = 0; ok && i < a.n_minima; i++) {
        ok = a.minima[i].hits == b.minima[i].hits && same_bits(a.minima[i].chi2, b.minima[i].chi2);
        for (size_t k = 0; ok && k < m->n_params; k++)
            ok = same_bits(a.minima[i].params[k], b.minima[i].params[k]);
    }
    for (size_t i = 0; ok && i < a.n_pts; i++)
        ok = same_bits(a.pts[i].y_calc, b.pts[i].y_calc) &&
             same_bits(a.pts[i].T_calc_K, b.pts[i].T_calc_K) &&
             same_bits(a.pts[i].P_calc_Pa, b.pts[i].P_calc_Pa);
    if (!ok)
        printf("%s %s: lean chi2 %.17g minima %zu iters %zu; full chi2 %.17g minima %zu iters %zu\n",
               label, m->name, a.chi2, a.n_minima, a.iterations, b.chi2, b.n_minima, b.iterations);
    pw_fit_result_free(&a);
    pw_fit_result_free(&b);
    if (!ok)
        fail_msg("%s %s: the fit through the lean functions differs from the full path", label,
                 m->name);
}

/* UNIQUAC on every shipped data set, and on seeded INVENTED isobaric sets from NRTL (acetone/
 * methanol, energies of the benchmark's kind), lean against full. */
static void fitted_minima(void **state)
{
    (void)state;
    char dir[1024];
    pw_test_path(dir, sizeof dir, "datasets");
    DIR *d = opendir(dir);
    assert_non_null(d);
    size_t n_sets = 0, n_fits = 0;
    struct dirent *e;
    while ((e = readdir(d))) {
        size_t len = strlen(e->d_name);
        if (!(len > 4 && !strcmp(e->d_name + len - 4, ".csv") && strcmp(e->d_name, "components.csv")))
            continue;
        char path[1400];
        snprintf(path, sizeof path, "%s/%s", dir, e->d_name);
        pw_dataset ds;
        pw_error err;
        assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
        const pw_component *c1 = pw_complib_find(&lib, ds.names[0]);
        const pw_component *c2 = pw_complib_find(&lib, ds.names[1]);
        assert_non_null(c1);
        assert_non_null(c2);
        compare_fits(&ds, c1, c2, &pw_model_uniquac, e->d_name);
        pw_dataset_free(&ds);
        n_sets++, n_fits++;
    }
    closedir(d);
    assert_true(n_sets >= 7); /* the shipped sets listed in datasets/README.md */

    const pw_component *c1 = pw_complib_find(&lib, "acetone"), *c2 = pw_complib_find(&lib, "methanol");
    assert_non_null(c1);
    assert_non_null(c2);
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *c1;
    s.comp[1] = *c2;
    s.model = &pw_model_nrtl;
    s.T_ref_K = 340.0;
    for (int set = 0; set < 12; set++) {
        s.params[0] = uniform(-100.0, 400.0);
        s.params[1] = uniform(-100.0, 400.0);
        s.params[2] = 0.3;
        pw_dataset ds;
        pw_test_invented_isobaric(&ds, &s, 30);
        char label[96];
        snprintf(label, sizeof label, "invented set %d (NRTL %.1f K, %.1f K)", set, s.params[0],
                 s.params[1]);
        compare_fits(&ds, c1, c2, &pw_model_uniquac, label);
        pw_dataset_free(&ds);
        n_fits++;
    }
    assert_true(n_fits >= 19);
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
        cmocka_unit_test(fitted_minima),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
