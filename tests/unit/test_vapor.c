/* Vapor models: Tsonopoulos second virial coefficients against published values, the gamma-phi
 * equilibrium as an identity, the ideal-vapor limit, and a fit with the virial vapor (round trip
 * on invented noise-free data, and a first-order optimality check on perturbed data). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/fit.h>
#include <pinchwise/vapor.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define CM3 1e-6 /* m3 per cm3 */

/* Critical constants in SI; polar parameters a, b (0 for none). */
static void constants(pw_component *c, double Tc, double Pc_MPa, double omega, double Zc,
                      double Vc_cm3, double a, double b)
{
    pw_component_props_clear(c);
    c->prop[PW_PROP_TC] = Tc;
    c->prop[PW_PROP_PC] = Pc_MPa * 1e6;
    c->prop[PW_PROP_OMEGA] = omega;
    c->prop[PW_PROP_ZC] = Zc;
    c->prop[PW_PROP_VC] = Vc_cm3 * CM3;
    c->prop[PW_PROP_TS_A] = a;
    c->prop[PW_PROP_TS_B] = b;
}

/* Water: Tc, Pc of IAPWS R6-95; omega 0.3443 (this project's methods brief 2.2, from memory);
 * Zc 0.229, Vc 55.9 cm3/mol (Poling, Prausnitz & O'Connell, 5th ed., App. A, from memory);
 * a = -0.0109, b = 0 (Tsonopoulos & Heidman 1990, from memory). Antoine: SVNA Table B.2. */
static pw_component water(void)
{
    pw_component c = pw_test_antoine("water", 16.3872, 3885.70, 230.170, PW_LN, "kPa", "C", 273.15,
                                     473.15);
    constants(&c, 647.096, 22.064, 0.3443, 0.229, 55.9, -0.0109, 0.0);
    return c;
}

/* Methanol: Tc 512.6 K, Pc 8.097 MPa, omega 0.564, Zc 0.224, Vc 118 cm3/mol (SVNA 7th ed.
 * Table B.1, from memory); a = 0.0878, b = 0.0702 (1-alkanol rule of Tsonopoulos & Dymond 1997
 * with mu = 1.70 D: methods brief part 2, 7.1, computed). Antoine: SVNA Table B.2 (from memory). */
static pw_component methanol(void)
{
    pw_component c = pw_test_antoine("methanol", 16.5785, 3638.27, 239.500, PW_LN, "kPa", "C",
                                     250.0, 450.0);
    constants(&c, 512.6, 8.097, 0.564, 0.224, 118.0, 0.0878, 0.0702);
    return c;
}

static void water_B_against_steam_tables(void **state)
{
    (void)state;
    /* Reference: Haar, Gallagher & Kell, NBS/NRC Steam Tables (1984), pp. 24-25, -27.81,
     * -20.83, -16.21 cm3/g (methods brief 2.2, [S]); Tsonopoulos itself: -507.8, -376.6,
     * -292.5 cm3/mol (methods brief 2.2, computed there with the same constants). */
    static const struct {
        double T, ref, tsonopoulos;
    } rows[] = {{363.15, -501.0, -507.8}, {393.15, -375.3, -376.6}, {423.15, -292.0, -292.5}};
    pw_component w = water();
    for (size_t i = 0; i < sizeof rows / sizeof rows[0]; i++) {
        double B;
        assert_int_equal(pw_virial_B_pure(&w, rows[i].T, &B), PW_OK);
        pw_assert_close(B / CM3, rows[i].tsonopoulos, 2e-3, 0, "water B, Tsonopoulos");
        pw_assert_close(B / CM3, rows[i].ref, 0.015, 0, "water B, steam tables");
    }
    /* without the polar term |B| is 15-20 % smaller (methods brief 2.2: -423 cm3/mol at 363.15 K) */
    w.prop[PW_PROP_TS_A] = NAN;
    double B;
    assert_int_equal(pw_virial_B_pure(&w, 363.15, &B), PW_OK);
    pw_assert_close(B / CM3, -423.0, 3e-3, 0, "water B, non-polar part");
}

static void benzene_and_acetone_B(void **state)
{
    (void)state;
    /* Benzene, Tc 562.05 K, Pc 4.895 MPa, omega 0.210 (methods brief 2.2, from memory): about
     * -1000 cm3/mol near 353 K (from memory), Tsonopoulos -995.8 (methods brief, computed). */
    pw_component bz;
    memset(&bz, 0, sizeof bz);
    constants(&bz, 562.05, 4.895, 0.210, 0.268, 256.0, NAN, NAN);
    double B;
    assert_int_equal(pw_virial_B_pure(&bz, 353.15, &B), PW_OK);
    pw_assert_close(B / CM3, -995.8, 2e-3, 0, "benzene B");
    /* Acetone against the CRC Handbook's "Virial coefficients of selected gases" equation
     * (methods brief part 2, 7.2, [S]): -1355, -1075, -683 cm3/mol at 329.4, 350, 400 K.
     * Constants: Tc 508.2 K, Pc 4.701 MPa, omega 0.307 (SVNA Table B.1, from memory); polar a
     * from the ketone rule a = -2.14e-4 mu_r - 4.308e-21 mu_r^8, mu = 2.88 D (computed). */
    pw_component ac;
    memset(&ac, 0, sizeof ac);
    double Pc_atm = 4.701e6 / 101325.0, mu_r = 1e5 * 2.88 * 2.88 * Pc_atm / (508.2 * 508.2);
    double a = -2.14e-4 * mu_r - 4.308e-21 * pow(mu_r, 8);
    constants(&ac, 508.2, 4.701, 0.307, 0.233, 209.0, a, 0.0);
    static const double T[] = {329.4, 350.0, 400.0}, crc[] = {-1355.0, -1075.0, -683.0};
    for (int i = 0; i < 3; i++) {
        assert_int_equal(pw_virial_B_pure(&ac, T[i], &B), PW_OK);
        pw_assert_close(B / CM3, crc[i], 0.03, 0, "acetone B against CRC");
    }
}

static void missing_constants_are_named(void **state)
{
    (void)state;
    pw_component w = water(), m = methanol();
    m.prop[PW_PROP_VC] = NAN;
    pw_error err;
    assert_int_equal(pw_vapor_check(PW_VAPOR_VIRIAL, &w, &m, &err), PW_ENOTFOUND);
    assert_non_null(strstr(err.msg, "component 'methanol' has no Vc_cm3_mol"));
    assert_int_equal(pw_vapor_check(PW_VAPOR_IDEAL, &w, &m, &err), PW_OK);
    pw_vapor_model v;
    assert_int_equal(pw_vapor_parse("Virial", &v), PW_OK);
    assert_int_equal(v, PW_VAPOR_VIRIAL);
    assert_int_equal(pw_vapor_parse("ideal-gas", &v), PW_EINVAL);
}

static pw_system nrtl_system(pw_vapor_model v)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = methanol();
    s.comp[1] = water();
    s.model = pw_model_find("nrtl");
    s.params[0] = -120.0;
    s.params[1] = 420.0;
    s.params[2] = 0.3;
    s.T_ref_K = 345.0;
    s.vapor = v;
    return s;
}

/* The solvers' results satisfy y_i Phi_i P = x_i gamma_i Psat_i with Phi_i from the vapor model
 * evaluated independently here, at every kind of point. */
static void gamma_phi_identity(void **state)
{
    (void)state;
    pw_system s = nrtl_system(PW_VAPOR_VIRIAL);
    for (int k = 1; k < 20; k++) {
        double x = k / 20.0;
        pw_eq_point e[4];
        assert_int_equal(pw_bubble_T(&s, 101325.0, x, &e[0]), PW_OK);
        assert_int_equal(pw_bubble_P(&s, 340.0, x, &e[1]), PW_OK);
        assert_int_equal(pw_dew_T(&s, 101325.0, x, &e[2]), PW_OK);
        assert_int_equal(pw_dew_P(&s, 340.0, x, &e[3]), PW_OK);
        for (int j = 0; j < 4; j++) {
            double B[3], Phi[2];
            assert_int_equal(pw_virial_B(&s.comp[0], &s.comp[1], e[j].T_K, B), PW_OK);
            pw_vapor_phi(PW_VAPOR_VIRIAL, B, e[j].T_K, e[j].P_Pa, e[j].y1, e[j].Psat_Pa, Phi);
            double x1 = e[j].x1, y1 = e[j].y1;
            pw_assert_close(y1 * Phi[0] * e[j].P_Pa, x1 * e[j].gamma[0] * e[j].Psat_Pa[0], 1e-9,
                            1e-9, "component 1");
            pw_assert_close((1 - y1) * Phi[1] * e[j].P_Pa, (1 - x1) * e[j].gamma[1] * e[j].Psat_Pa[1],
                            1e-9, 1e-9, "component 2");
            pw_assert_close(e[j].Phi[0], Phi[0], 1e-12, 0, "reported Phi1");
            assert_true(Phi[0] != 1.0); /* the correction is really applied */
        }
        /* the dew point of the bubble vapor gives back the liquid */
        pw_eq_point d;
        assert_int_equal(pw_dew_T(&s, 101325.0, e[0].y1, &d), PW_OK);
        pw_assert_close(d.x1, x, 1e-8, 1e-10, "dew(bubble) x");
        pw_assert_close(d.T_K, e[0].T_K, 1e-10, 0, "dew(bubble) T");
    }
}

/* As the pressure falls the virial vapor tends to the ideal one: |y_virial - y_ideal| shrinks in
 * proportion to P (Phi - 1 is of order B P / RT). */
static void ideal_limit(void **state)
{
    (void)state;
    pw_system sv = nrtl_system(PW_VAPOR_VIRIAL), si = nrtl_system(PW_VAPOR_IDEAL);
    double prev = INFINITY;
    for (double P = 200e3; P > 1e3; P /= 4.0) {
        pw_eq_point ev, ei;
        assert_int_equal(pw_bubble_T(&sv, P, 0.3, &ev), PW_OK);
        assert_int_equal(pw_bubble_T(&si, P, 0.3, &ei), PW_OK);
        double d = fabs(ev.y1 - ei.y1);
        /* of order B P / RT: shrinks with P (less than in proportion, as |B| grows at the lower
         * boiling temperatures), and is within a few times B11 P / RT */
        double B[3];
        assert_int_equal(pw_virial_B(&sv.comp[0], &sv.comp[1], ev.T_K, B), PW_OK);
        double scale = fabs(B[0]) * P / (PW_GAS_CONSTANT * ev.T_K);
        if (!(d < prev) || !(d < 3.0 * scale))
            fail_msg("P %g: difference %g after %g (B P/RT %g)", P, d, prev, scale);
        prev = d;
        assert_true(ei.Phi[0] == 1.0 && ei.Phi[1] == 1.0);
    }
}

/* Invented data generated from a virial-vapor NRTL system. */
static void make_data(pw_dataset *ds, const pw_system *s, size_t n, double noise)
{
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "generated.csv");
    snprintf(ds->names[0], sizeof ds->names[0], "methanol");
    snprintf(ds->names[1], sizeof ds->names[1], "water");
    ds->kind = PW_DATA_ISOBARIC;
    ds->has_y = true;
    ds->P_fixed_Pa = 101325.0;
    ds->T_fixed_K = NAN;
    ds->sigma_T_K = 0.1, ds->sigma_P_rel = 1e-3, ds->sigma_P_abs_Pa = NAN, ds->sigma_y = 0.004;
    ds->sigma_x = 0.001;
    ds->pts = calloc(n, sizeof *ds->pts);
    ds->n = n;
    for (size_t i = 0; i < n; i++) {
        double x = (double)(i + 1) / (double)(n + 1);
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(s, 101325.0, x, &e), PW_OK);
        double sgn = (i % 2) ? 1.0 : -1.0, sgn2 = (i % 3) ? 1.0 : -1.0;
        ds->pts[i].x1 = x;
        ds->pts[i].y1 = e.y1 + noise * 0.003 * sgn;
        ds->pts[i].T_K = e.T_K + noise * 0.1 * sgn2;
        ds->pts[i].P_Pa = 101325.0;
        ds->pts[i].line = (long)i + 5;
    }
}

static double chi2(const pw_system *s, const pw_dataset *ds)
{
    double c = 0.0;
    for (size_t i = 0; i < ds->n; i++) {
        pw_eq_point e;
        if (pw_bubble_T(s, ds->pts[i].P_Pa, ds->pts[i].x1, &e) != PW_OK)
            return INFINITY;
        double dT = (e.T_K - ds->pts[i].T_K) / ds->sigma_T_K, dy = (e.y1 - ds->pts[i].y1) / ds->sigma_y;
        c += dT * dT + dy * dy;
    }
    return c;
}

static void fit_with_virial_vapor(void **state)
{
    (void)state;
    pw_system s = nrtl_system(PW_VAPOR_VIRIAL);
    for (int noisy = 0; noisy < 2; noisy++) {
        pw_dataset ds;
        make_data(&ds, &s, 15, noisy);
        pw_fit_options o = pw_fit_default_options();
        o.vapor = PW_VAPOR_VIRIAL;
        o.n_starts = 8;
        pw_fit_result r;
        pw_error err;
        assert_int_equal(pw_fit_run(&ds, &s.comp[0], &s.comp[1], s.model, &o, &r, &err), PW_OK);
        assert_true(r.converged);
        assert_int_equal(r.sys.vapor, PW_VAPOR_VIRIAL);
        if (!noisy) {
            pw_assert_close(r.sys.params[0], -120.0, 1e-6, 1e-6, "dg12 round trip");
            pw_assert_close(r.sys.params[1], 420.0, 1e-6, 1e-6, "dg21 round trip");
        } else {
            /* The Jacobian holds Phi constant. First-order optimality of the true chi2 at the
             * result: the Newton step -g/h along each parameter, from central differences, is a
             * negligible fraction of the parameter's standard error. */
            for (int k = 0; k < 2; k++) {
                pw_system p = r.sys;
                double h = 1e-3 * fmax(fabs(p.params[k]), 1.0), c0 = chi2(&p, &ds);
                p.params[k] = r.sys.params[k] + h;
                double cp = chi2(&p, &ds);
                p.params[k] = r.sys.params[k] - h;
                double cm = chi2(&p, &ds);
                double g = (cp - cm) / (2 * h), hh = (cp - 2 * c0 + cm) / (h * h);
                assert_true(hh > 0.0);
                double step = fabs(g / hh);
                if (!(step < 0.01 * r.stderr_[k]))
                    fail_msg("parameter %d: Newton step %g vs stderr %g", k, step, r.stderr_[k]);
            }
        }
        pw_fit_result_free(&r);
        pw_dataset_free(&ds);
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(water_B_against_steam_tables),
        cmocka_unit_test(benzene_and_acetone_B),
        cmocka_unit_test(missing_constants_are_named),
        cmocka_unit_test(gamma_phi_identity),
        cmocka_unit_test(ideal_limit),
        cmocka_unit_test(fit_with_virial_vapor),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
