/* Units against their definitions: NIST SP 811 (2008), Appendix B.8 and B.9 for the psi and
 * the temperature scales; 1 atm = 101325 Pa exactly (CGPM 1954, as quoted in SP 811);
 * 760 mmHg = 1 atm (the conventional millimetre of mercury taken as the torr, 1/760 atm). */
#include "pw_test.h"

#include <pinchwise/units.h>
#include <string.h>

static double to_si(pw_quantity q, double v, const char *u)
{
    double si = -1.0;
    assert_int_equal(pw_units_to_si(q, v, u, &si), PW_OK);
    return si;
}

static void pressure_units_by_definition(void **state)
{
    (void)state;
    pw_assert_close(to_si(PW_QTY_PRESSURE, 1.0, "Pa"), 1.0, 0, 0, "Pa");
    pw_assert_close(to_si(PW_QTY_PRESSURE, 1.0, "kPa"), 1e3, 0, 0, "kPa");
    pw_assert_close(to_si(PW_QTY_PRESSURE, 1.0, "MPa"), 1e6, 0, 0, "MPa");
    pw_assert_close(to_si(PW_QTY_PRESSURE, 1.0, "bar"), 1e5, 0, 0, "bar (SP 811 B.8)");
    pw_assert_close(to_si(PW_QTY_PRESSURE, 1.0, "atm"), 101325.0, 0, 0, "atm, exact");
    pw_assert_close(to_si(PW_QTY_PRESSURE, 760.0, "mmHg"), 101325.0, 1e-15, 0, "760 mmHg");
    /* NIST SP 811 B.8: pound-force per square inch = 6.894 757 E+03 Pa (the exact value
     * 0.45359237 kg * 9.80665 m/s2 / 0.0254^2 m2 = 6894.757293168... Pa) */
    pw_assert_close(to_si(PW_QTY_PRESSURE, 1.0, "psia"), 0.45359237 * 9.80665 / (0.0254 * 0.0254),
                    1e-15, 0, "psi from its definition");
    pw_assert_close(to_si(PW_QTY_PRESSURE, 14.6959487755, "psia"), 101325.0, 1e-9, 0,
                    "1 atm in psi");
    pw_assert_close(to_si(PW_QTY_PRESSURE, 1.0, "KPA"), 1e3, 0, 0, "case-insensitive");
}

static void temperature_offsets(void **state)
{
    (void)state;
    /* SP 811 B.9: T/K = t/C + 273.15; T/K = (t/F + 459.67)/1.8 */
    pw_assert_close(to_si(PW_QTY_TEMPERATURE, 0.0, "C"), 273.15, 0, 0, "0 C");
    pw_assert_close(to_si(PW_QTY_TEMPERATURE, 100.0, "C"), 373.15, 0, 0, "100 C");
    pw_assert_close(to_si(PW_QTY_TEMPERATURE, 32.0, "F"), 273.15, 1e-15, 0, "32 F");
    pw_assert_close(to_si(PW_QTY_TEMPERATURE, 212.0, "F"), 373.15, 1e-15, 0, "212 F");
    pw_assert_close(to_si(PW_QTY_TEMPERATURE, -40.0, "F"), 233.15, 1e-14, 0, "-40 F = -40 C");
    pw_assert_close(to_si(PW_QTY_TEMPERATURE, 350.0, "K"), 350.0, 0, 0, "K");
    double v;
    assert_int_equal(pw_units_from_si(PW_QTY_TEMPERATURE, 373.15, "F", &v), PW_OK);
    pw_assert_close(v, 212.0, 1e-14, 0, "back to F");
    assert_int_equal(pw_units_from_si(PW_QTY_PRESSURE, 101325.0, "mmHg", &v), PW_OK);
    pw_assert_close(v, 760.0, 1e-15, 0, "back to mmHg");
    assert_int_equal(pw_units_to_si(PW_QTY_TEMPERATURE, -300.0, "C", &v), PW_EDOM);
    assert_int_equal(pw_units_to_si(PW_QTY_PRESSURE, 0.0, "kPa", &v), PW_EDOM);
    assert_int_equal(pw_units_to_si(PW_QTY_PRESSURE, 1.0, "inHg", &v), PW_EINVAL);
    assert_int_equal(pw_units_to_si(PW_QTY_TEMPERATURE, 1.0, "kPa", &v), PW_EINVAL);
    assert_true(pw_units_known(PW_QTY_PRESSURE, "psia"));
    assert_false(pw_units_known(PW_QTY_PRESSURE, "psig"));
    assert_false(pw_units_known(PW_QTY_TEMPERATURE, NULL));
}

static void quantity_parser_accepts_number_and_unit(void **state)
{
    (void)state;
    double si;
    pw_error err;
    assert_int_equal(pw_units_parse_quantity(PW_QTY_PRESSURE, "101.325kPa", &si, &err), PW_OK);
    pw_assert_close(si, 101325.0, 1e-15, 0, "101.325kPa");
    assert_int_equal(pw_units_parse_quantity(PW_QTY_PRESSURE, "1atm", &si, &err), PW_OK);
    pw_assert_close(si, 101325.0, 0, 0, "1atm");
    assert_int_equal(pw_units_parse_quantity(PW_QTY_TEMPERATURE, "50C", &si, &err), PW_OK);
    pw_assert_close(si, 323.15, 0, 0, "50C");
    assert_int_equal(pw_units_parse_quantity(PW_QTY_TEMPERATURE, "3.5e2K", &si, &err), PW_OK);
    pw_assert_close(si, 350.0, 0, 0, "3.5e2K");
}

static void quantity_parser_refuses(void **state)
{
    (void)state;
    static const char *const bad_p[] = {"101.325", "101.3 25kPa", "1 k Pa", "101.325kpascal",
                                        "nankPa",  "infkPa",      "0x10kPa",     "",
                                        "kPa",     "-5kPa",       "1e999kPa"};
    for (size_t i = 0; i < sizeof bad_p / sizeof *bad_p; i++) {
        double si = 0.0;
        pw_error err;
        pw_error_clear(&err);
        pw_status st = pw_units_parse_quantity(PW_QTY_PRESSURE, bad_p[i], &si, &err);
        if (st == PW_OK) {
            print_error("'%s' was accepted\n", bad_p[i]);
            fail();
        }
        assert_true(strlen(err.msg) > 0);
    }
    pw_error err;
    double si;
    assert_int_not_equal(pw_units_parse_quantity(PW_QTY_PRESSURE, "101.325", &si, &err), PW_OK);
    assert_non_null(strstr(err.msg, "no unit"));
    assert_non_null(strstr(err.msg, "kPa")); /* the message lists the units */
    assert_int_not_equal(pw_units_parse_quantity(PW_QTY_TEMPERATURE, "350", &si, &err), PW_OK);
    assert_non_null(strstr(err.msg, "K, C, F"));
    assert_int_not_equal(pw_units_parse_quantity(PW_QTY_TEMPERATURE, "50kPa", &si, &err), PW_OK);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(pressure_units_by_definition),
        cmocka_unit_test(temperature_offsets),
        cmocka_unit_test(quantity_parser_accepts_number_and_unit),
        cmocka_unit_test(quantity_parser_refuses),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
