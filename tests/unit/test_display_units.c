/* Display units (pw_units_display_*, src/base/units.c): parsing the choice and converting for
 * display. Check values are the definitions of the units: 0 degC = 273.15 K and
 * t/degF = 1.8 t/degC + 32 (ITS-90 usage, BIPM SI Brochure 9th ed. 2019, section 2.3.1 and
 * NIST SP 811 (2008) appendix B.8); 1 atm = 101325 Pa, 1 bar = 1e5 Pa, 1 mmHg = 101325/760 Pa
 * (NIST SP 811 B.8). */
#include "pw_test.h"

#include <pinchwise/units.h>
#include <string.h>

static void defaults_and_parsing(void **state)
{
    (void)state;
    pw_display_units u = pw_units_display_default();
    assert_string_equal(u.T, "K");
    assert_string_equal(u.P, "kPa");
    pw_error err;
    assert_int_equal(pw_units_display_parse("C,bar", &u, &err), PW_OK);
    assert_string_equal(u.T, "C");
    assert_string_equal(u.P, "bar");
    assert_int_equal(pw_units_display_parse(" atm , degF ", &u, &err), PW_OK);
    assert_string_equal(u.T, "F");
    assert_string_equal(u.P, "atm");
    assert_int_equal(pw_units_display_parse("\xc2\xb0" "C", &u, &err), PW_OK);
    assert_string_equal(u.T, "C");
    assert_string_equal(u.P, "kPa"); /* not named: the default */
    assert_int_equal(pw_units_display_parse("torr", &u, &err), PW_OK);
    assert_string_equal(u.P, "mmHg");
    assert_string_equal(u.T, "K");
    /* refusals name what was wrong and leave out untouched */
    pw_display_units keep = u;
    assert_int_equal(pw_units_display_parse("C,furlong", &u, &err), PW_EINVAL);
    assert_non_null(strstr(err.msg, "furlong"));
    assert_int_equal(pw_units_display_parse("C,K", &u, &err), PW_EINVAL);
    assert_non_null(strstr(err.msg, "two temperature"));
    assert_int_equal(pw_units_display_parse("C,,bar", &u, &err), PW_EINVAL);
    assert_int_equal(pw_units_display_parse("", &u, &err), PW_EINVAL);
    assert_memory_equal(&u, &keep, sizeof u);
}

static void conversions(void **state)
{
    (void)state;
    pw_display_units u;
    pw_error err;
    assert_int_equal(pw_units_display_parse("C,bar", &u, &err), PW_OK);
    pw_assert_close(pw_units_display_T(&u, 373.15), 100.0, 0.0, 1e-12, "373.15 K in degC");
    pw_assert_close(pw_units_display_dT(&u, 2.5), 2.5, 0.0, 1e-15, "a difference in degC");
    pw_assert_close(pw_units_display_P(&u, 101325.0), 1.01325, 1e-15, 0.0, "1 atm in bar");
    assert_string_equal(pw_units_display_T_symbol(&u), "\xc2\xb0" "C");
    assert_string_equal(pw_units_display_P_symbol(&u), "bar");
    assert_int_equal(pw_units_display_parse("F,mmHg", &u, &err), PW_OK);
    pw_assert_close(pw_units_display_T(&u, 373.15), 212.0, 0.0, 1e-12, "boiling water in degF");
    pw_assert_close(pw_units_display_T(&u, 273.15), 32.0, 0.0, 1e-12, "ice point in degF");
    pw_assert_close(pw_units_display_dT(&u, 1.0), 1.8, 1e-15, 0.0, "1 K as a degF difference");
    pw_assert_close(pw_units_display_P(&u, 101325.0), 760.0, 1e-15, 0.0, "1 atm in mmHg");
    assert_string_equal(pw_units_display_T_symbol(&u), "\xc2\xb0" "F");
    u = pw_units_display_default();
    pw_assert_close(pw_units_display_T(&u, 351.44), 351.44, 0.0, 0.0, "kelvin unchanged");
    pw_assert_close(pw_units_display_P(&u, 101325.0), 101.325, 1e-15, 0.0, "kPa");
    assert_string_equal(pw_units_display_T_symbol(&u), "K");
    /* a zeroed struct (a caller that did not set units) shows K and kPa */
    pw_display_units z;
    memset(&z, 0, sizeof z);
    pw_assert_close(pw_units_display_T(&z, 300.0), 300.0, 0.0, 0.0, "zeroed: K");
    pw_assert_close(pw_units_display_P(&z, 2000.0), 2.0, 0.0, 0.0, "zeroed: kPa");
    assert_string_equal(pw_units_display_P_symbol(&z), "kPa");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(defaults_and_parsing),
        cmocka_unit_test(conversions),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
