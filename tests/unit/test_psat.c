/* Vapor pressure: IAPWS-IF97 region 4 and Antoine (src/thermo/psat.c). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/component.h>
#include <stdio.h>
#include <string.h>

static pw_component antoine(const char *name, double A, double B, double C, pw_log_base lb,
                            const char *P_unit, const char *T_unit)
{
    return pw_test_antoine(name, A, B, C, lb, P_unit, T_unit, NAN, NAN);
}

/* SVNA 7th ed. Table B.2, ln(P/kPa) = A - B/(t/C + C); water and 1-propanol confirmed, acetone
 * and methanol from memory (METHODS 2.5). */
static pw_component svna(const char *name) { return pw_test_svna(name); }

/* IAPWS R7-97(2012), Table 35 (psat) and Table 36 (Tsat) verification values. */
static void if97_verification_values(void **state)
{
    (void)state;
    static const struct {
        double T_K, P_MPa;
    } psat_table[] = {{300.0, 0.353658941e-2}, {500.0, 0.263889776e1}, {600.0, 0.123443146e2}};
    static const struct {
        double P_MPa, T_K;
    } tsat_table[] = {{0.1, 0.372755919e3}, {1.0, 0.453035632e3}, {10.0, 0.584149488e3}};
    for (size_t i = 0; i < 3; i++) {
        double P;
        assert_int_equal(pw_iapws97_psat(psat_table[i].T_K, &P), PW_OK);
        pw_assert_close(P / 1e6, psat_table[i].P_MPa, 1e-8, 0.0, "IF97 psat (R7-97 Table 35)");
        double T;
        assert_int_equal(pw_iapws97_tsat(tsat_table[i].P_MPa * 1e6, &T), PW_OK);
        pw_assert_close(T, tsat_table[i].T_K, 1e-8, 0.0, "IF97 Tsat (R7-97 Table 36)");
    }
    /* METHODS 2.4 [H]: Tsat(101.325 kPa) = 373.1243 K (computed). */
    double T;
    assert_int_equal(pw_iapws97_tsat(101325.0, &T), PW_OK);
    pw_assert_close(T, 373.1243, 0.0, 6e-5, "IF97 normal boiling point (computed)");
}

static void if97_range_and_identities(void **state)
{
    (void)state;
    double P, T, d;
    assert_int_equal(pw_iapws97_psat(273.0, &P), PW_ERANGE);
    assert_int_equal(pw_iapws97_psat(647.2, &P), PW_ERANGE);
    assert_int_equal(pw_iapws97_psat(NAN, &P), PW_ERANGE);
    assert_int_equal(pw_iapws97_tsat(600.0, &T), PW_ERANGE);
    assert_int_equal(pw_iapws97_tsat(22.1e6, &T), PW_ERANGE);
    /* Range ends of R7-97: 273.15 K and 647.096 K are accepted. */
    assert_int_equal(pw_iapws97_psat(273.15, &P), PW_OK);
    pw_assert_close(P, 611.213, 0.0, 1e-3, "IF97 psat(273.15 K) = 611.213 Pa (R7-97)");
    assert_int_equal(pw_iapws97_tsat(P, &T), PW_OK);
    assert_int_equal(pw_iapws97_psat(647.096, &P), PW_OK);
    pw_assert_close(P, 22.064e6, 1e-4, 0.0, "IF97 psat at the critical temperature (R7-97)");

    pw_component w;
    memset(&w, 0, sizeof w);
    w.equation = PW_PSAT_IAPWS_IF97;
    for (double t = 280.0; t < 640.0; t += 40.0) {
        /* identity: the backward equation inverts the forward one (R7-97 states consistency
         * far below 1e-5 K; we see round-off only). */
        assert_int_equal(pw_psat(&w, t, &P, &d), PW_OK);
        assert_int_equal(pw_tsat(&w, P, &T), PW_OK);
        pw_assert_close(T, t, 0.0, 1e-6, "IF97 Tsat(psat(T)) = T");
        /* identity: analytic d ln P/dT against a central difference */
        double Pp, Pm, h = 1e-3;
        assert_int_equal(pw_psat(&w, t + h, &Pp, NULL), PW_OK);
        assert_int_equal(pw_psat(&w, t - h, &Pm, NULL), PW_OK);
        pw_assert_close(d, (log(Pp) - log(Pm)) / (2 * h), 1e-7, 0.0, "IF97 dlnP/dT");
    }
    assert_int_equal(pw_psat(&w, 700.0, &P, NULL), PW_ERANGE);
}

/* SVNA Table B.2 constants give the boiling points at 101.325 kPa that METHODS 2.5 lists
 * (computed values [H] from those constants; printed to 0.001 C). */
static void antoine_svna_boiling_points(void **state)
{
    (void)state;
    static const struct {
        const char *name;
        double tb_C;
    } table[] = {{"water", 99.998}, {"1-propanol", 97.198}, {"acetone", 56.199}, {"methanol", 64.699}};
    for (size_t i = 0; i < 4; i++) {
        pw_component c = svna(table[i].name);
        double T, P;
        assert_int_equal(pw_tsat(&c, 101325.0, &T), PW_OK);
        pw_assert_close(T - 273.15, table[i].tb_C, 0.0, 6e-4, table[i].name);
        assert_int_equal(pw_psat(&c, T, &P, NULL), PW_OK);
        pw_assert_close(P, 101325.0, 1e-12, 0.0, "psat(tsat(P)) = P");
    }
    /* Water in the classic log10 mmHg / C form, A = 8.07131, B = 1730.63, C = 233.426 (valid
     * 1-100 C; from memory, Lange's Handbook): about 760 mmHg at 100 C. */
    pw_component w = antoine("water", 8.07131, 1730.63, 233.426, PW_LOG10, "mmHg", "C");
    double P;
    assert_int_equal(pw_psat(&w, 373.15, &P, NULL), PW_OK);
    pw_assert_close(P, 101325.0, 1e-3, 0.0, "water 1 atm at 100 C (log10 mmHg row, from memory)");
}

/* The same correlation written in four forms must agree: ln kPa/C (SVNA), log10 mmHg/C,
 * ln kPa/K, log10 bar/F. Exact transformations (identity). */
static void antoine_forms_and_units_agree(void **state)
{
    (void)state;
    const double ln10 = log(10.0);
    pw_component a = svna("water");
    /* log10(P/mmHg) = A/ln10 + log10(760/101.325) - (B/ln10)/(t + C) */
    pw_component b = antoine("water", a.A / ln10 + log10(760.0 / 101.325), a.B / ln10, a.C,
                             PW_LOG10, "mmHg", "C");
    /* ln(P/kPa) = A - B/(T - 273.15 + C) */
    pw_component c = antoine("water", a.A, a.B, a.C - 273.15, PW_LN, "kPa", "K");
    /* t_C = (t_F - 32)/1.8: B/(t_C + C) = 1.8 B/(t_F - 32 + 1.8 C); log10(P/bar) */
    pw_component d = antoine("water", a.A / ln10 - 2.0, 1.8 * a.B / ln10, 1.8 * a.C - 32.0,
                             PW_LOG10, "bar", "F");
    for (double T = 280.0; T <= 480.0; T += 25.0) {
        double P[4], dl[4];
        const pw_component *v[4] = {&a, &b, &c, &d};
        for (int i = 0; i < 4; i++)
            assert_int_equal(pw_psat(v[i], T, &P[i], &dl[i]), PW_OK);
        for (int i = 1; i < 4; i++) {
            pw_assert_close(P[i], P[0], 1e-12, 0.0, "same Antoine set in other units");
            pw_assert_close(dl[i], dl[0], 1e-12, 0.0, "same dlnP/dT in other units");
        }
        for (int i = 0; i < 4; i++) {
            double Pp, Pm, h = 1e-3, Tb;
            assert_int_equal(pw_psat(v[i], T + h, &Pp, NULL), PW_OK);
            assert_int_equal(pw_psat(v[i], T - h, &Pm, NULL), PW_OK);
            pw_assert_close(dl[i], (log(Pp) - log(Pm)) / (2 * h), 1e-8, 0.0, "Antoine dlnP/dT");
            assert_int_equal(pw_tsat(v[i], P[i], &Tb), PW_OK);
            pw_assert_close(Tb, T, 0.0, 1e-9, "tsat inverts psat");
        }
    }
}

static void antoine_domain_and_range(void **state)
{
    (void)state;
    pw_component w = svna("water");
    double P, T;
    assert_int_equal(pw_psat(&w, 0.0, &P, NULL), PW_EDOM);
    assert_int_equal(pw_psat(&w, -5.0, &P, NULL), PW_EDOM);
    assert_int_equal(pw_psat(&w, NAN, &P, NULL), PW_EDOM);
    /* pole at t = -C = -230.17 C = 42.98 K */
    assert_int_equal(pw_psat(&w, 273.15 - 230.17, &P, NULL), PW_EDOM);
    assert_int_equal(pw_psat(&w, 40.0, &P, NULL), PW_EDOM);
    assert_int_equal(pw_psat(&w, 50.0, &P, NULL), PW_OK); /* outside validity, still evaluated */
    assert_int_equal(pw_tsat(&w, 0.0, &T), PW_EDOM);
    assert_int_equal(pw_tsat(&w, -1.0, &T), PW_EDOM);
    assert_int_equal(pw_tsat(&w, INFINITY, &T), PW_EDOM);
    /* P >= exp(A) kPa has no temperature (A - ln P <= 0). */
    assert_int_equal(pw_tsat(&w, exp(16.3872) * 1e3 * 1.01, &T), PW_EDOM);
    pw_component bad = antoine("x", 1, 1, 1, PW_LN, "furlong", "C");
    assert_int_equal(pw_psat(&bad, 300.0, &P, NULL), PW_EINVAL);
    assert_int_equal(pw_psat(NULL, 300.0, &P, NULL), PW_EINVAL);

    /* range excess: sign and size (identity; range set here to 0-200 C) */
    w.T_min_K = 273.15;
    w.T_max_K = 473.15;
    pw_assert_close(pw_component_range_excess_K(&w, 250.0), -23.15, 0.0, 1e-12, "below T_min");
    pw_assert_close(pw_component_range_excess_K(&w, 500.0), 26.85, 0.0, 1e-12, "above T_max");
    pw_assert_close(pw_component_range_excess_K(&w, 373.15), 0.0, 0.0, 0.0, "inside");
    pw_assert_close(pw_component_range_excess_K(&w, 273.15), 0.0, 0.0, 0.0, "at T_min");
    w.T_min_K = NAN;
    pw_assert_close(pw_component_range_excess_K(&w, 100.0), 0.0, 0.0, 0.0, "no lower bound");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(if97_verification_values),
        cmocka_unit_test(if97_range_and_identities),
        cmocka_unit_test(antoine_svna_boiling_points),
        cmocka_unit_test(antoine_forms_and_units_agree),
        cmocka_unit_test(antoine_domain_and_range),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
