/* Display units (pw_units_display_*, src/base/units.c): parsing the choice and converting for
 * display. Check values are the definitions of the units: 0 degC = 273.15 K and
 * t/degF = 1.8 t/degC + 32 (ITS-90 usage, BIPM SI Brochure 9th ed. 2019, section 2.3.1 and
 * NIST SP 811 (2008) appendix B.8); 1 atm = 101325 Pa, 1 bar = 1e5 Pa, 1 mmHg = 101325/760 Pa
 * (NIST SP 811 B.8). */
#include "pw_test.h"

#include <pinchwise/units.h>
#include <stdio.h>
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

/* Marked quantities in library text (PW_TEXT_T/DT/P): shown in the display units, and with
 * no units (NULL) exactly as the plain "%.2f K" / "%.4g kPa" text of the JSON documents. */
static void marked_text(void **state)
{
    (void)state;
    char text[256], out[256], plain[256];
    snprintf(text, sizeof text,
             "azeotrope at T = " PW_TEXT_T(".2f") " within " PW_TEXT_P(".4g") ", off by "
             PW_TEXT_DT(".1f") ".",
             351.4567, 101325.0, 2.5);
    assert_null(strchr(pw_units_display_text(NULL, text, out, sizeof out), '\x1e'));
    snprintf(plain, sizeof plain, "azeotrope at T = %.2f K within %.4g kPa, off by %.1f K.",
             351.4567, 101.325, 2.5);
    assert_string_equal(out, plain);
    pw_display_units u;
    pw_error err;
    assert_int_equal(pw_units_display_parse("C,bar", &u, &err), PW_OK);
    pw_units_display_text(&u, text, out, sizeof out);
    /* 351.4567 K - 273.15 = 78.3067 C; 101325 Pa = 1.01325 bar; a difference keeps its kelvin */
    assert_string_equal(out, "azeotrope at T = 78.31 \xc2\xb0" "C within 1.013 bar, off by 2.5 K.");
    assert_int_equal(pw_units_display_parse("F,psia", &u, &err), PW_OK);
    pw_units_display_text(&u, text, out, sizeof out);
    /* 78.3067 C x 1.8 + 32 = 172.95 F; 101325 Pa / 6894.757 = 14.70 psia; 2.5 K x 1.8 = 4.5 F */
    assert_non_null(strstr(out, "172.95 \xc2\xb0" "F"));
    assert_non_null(strstr(out, "14.7 psia"));
    assert_non_null(strstr(out, "off by 4.5 \xc2\xb0" "F."));
    /* plain text passes unchanged; a mark cut short by truncation is dropped, not shown */
    assert_string_equal(pw_units_display_text(&u, "no quantity here", out, sizeof out),
                        "no quantity here");
    text[strlen(text) - 10] = '\0';
    pw_units_display_text(NULL, text, out, sizeof out);
    assert_null(strchr(out, '\x1e'));
    assert_null(strchr(out, '\x1f'));
    /* a small buffer is always terminated */
    pw_units_display_text(NULL, "abcdef", out, 4);
    assert_string_equal(out, "abc");
    char v[32];
    assert_string_equal(pw_units_display_value(NULL, PW_SHOW_T, ".3f", 300.0, v, sizeof v),
                        "300.000 K");
    assert_string_equal(pw_units_display_value(NULL, PW_SHOW_T, "s", 300.0, v, sizeof v), "?");
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(defaults_and_parsing),
        cmocka_unit_test(conversions),
        cmocka_unit_test(marked_text),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
