/* Optional pure-component constants: reading from a component file (units converted to SI, the
 * older Pc_bar spelling, plausible ranges with file and line), the message naming the missing
 * column, and the library's rows. The "a" and "b" rows are invented and serve only these
 * round-trip tests. */
#include "pw_test.h"

#include "data/complib_io.h"

#include <math.h>
#include <pinchwise/component.h>
#include <string.h>

#define HDR "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source"

static void reads_constants_in_si(void **state)
{
    (void)state;
    const char *text = HDR ",M_g_mol,Pc_kPa,Vc_cm3_mol,dHvap_kJ_mol,cpL_J_molK,r,q,tsonopoulos_a\n"
                           "a,16,3800,230,ln,kPa,C,0,100,s,18.015,22064,55.9,40.65,75.3,0.92,1.40,-0.0109\n"
                           "b,16,3800,230,ln,kPa,C,0,100,s,,,,,,,,\n";
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    assert_int_equal(pw_complib_parse(&lib, text, strlen(text), "c.csv", &err), PW_OK);
    const pw_component *a = pw_complib_find(&lib, "a"), *b = pw_complib_find(&lib, "b");
    double v;
    assert_int_equal(pw_component_require(a, PW_PROP_M, &v, &err), PW_OK);
    pw_assert_close(v, 0.018015, 1e-15, 0, "M in kg/mol");
    assert_int_equal(pw_component_require(a, PW_PROP_PC, &v, &err), PW_OK);
    pw_assert_close(v, 22.064e6, 1e-15, 0, "Pc in Pa");
    assert_int_equal(pw_component_require(a, PW_PROP_VC, &v, &err), PW_OK);
    pw_assert_close(v, 55.9e-6, 1e-15, 0, "Vc in m3/mol");
    assert_int_equal(pw_component_require(a, PW_PROP_DHVAP, &v, &err), PW_OK);
    pw_assert_close(v, 40650.0, 1e-15, 0, "dHvap in J/mol");
    assert_int_equal(pw_component_require(a, PW_PROP_TS_A, &v, &err), PW_OK);
    pw_assert_close(v, -0.0109, 1e-15, 0, "tsonopoulos a");
    assert_int_equal(pw_component_require(a, PW_PROP_TC, &v, &err), PW_ENOTFOUND);
    assert_non_null(strstr(err.msg, "component 'a' has no Tc_K"));
    assert_int_equal(pw_component_require(b, PW_PROP_M, &v, &err), PW_ENOTFOUND);
    assert_non_null(strstr(err.msg, "has no M_g_mol"));
    pw_complib_free(&lib);
}

static void pc_bar_is_converted(void **state)
{
    (void)state;
    const char *text = HDR ",Pc_bar\na,16,3800,230,ln,kPa,C,0,100,s,220.64\n";
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    assert_int_equal(pw_complib_parse(&lib, text, strlen(text), "c.csv", &err), PW_OK);
    double v;
    assert_int_equal(pw_component_require(&lib.items[0], PW_PROP_PC, &v, &err), PW_OK);
    pw_assert_close(v, 22.064e6, 1e-15, 0, "Pc from bar");
    pw_complib_free(&lib);
}

static void bad_constants_name_line_and_column(void **state)
{
    (void)state;
    static const struct {
        const char *text, *fragment;
        long line;
    } cases[] = {
        {HDR ",M_g_mol\na,16,3800,230,ln,kPa,C,0,100,s,0.018\n", "M_g_mol = 0.018 is outside", 2},
        {HDR ",Tc_K\na,16,3800,230,ln,kPa,C,0,100,s,647\nb,16,3800,230,ln,kPa,C,0,100,s,-5\n",
         "Tc_K = -5 is outside", 3},
        {HDR ",omega\na,16,3800,230,ln,kPa,C,0,100,s,x\n", "column omega: 'x' is not a number", 2},
        {HDR ",Pc_bar,Pc_kPa\na,16,3800,230,ln,kPa,C,0,100,s,1,100\n", "Pc_bar and Pc_kPa both", 1},
        {HDR ",r,r\na,16,3800,230,ln,kPa,C,0,100,s,1,1\n", "column 'r' appears twice", 1},
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        pw_complib lib;
        pw_complib_init(&lib);
        pw_error err;
        pw_error_clear(&err);
        assert_int_equal(pw_complib_parse(&lib, cases[i].text, strlen(cases[i].text), "c.csv", &err),
                         PW_EPARSE);
        if (!strstr(err.msg, cases[i].fragment))
            fail_msg("case %zu: '%s' lacks '%s'", i, err.msg, cases[i].fragment);
        assert_int_equal(err.line, cases[i].line);
        assert_int_equal(lib.n, 0);
        pw_complib_free(&lib);
    }
}

/* A component set up with memset knows no constant that cannot be zero. */
static void zeroed_component_knows_nothing(void **state)
{
    (void)state;
    pw_component c;
    memset(&c, 0, sizeof c);
    for (int p = 0; p < PW_PROP_COUNT; p++) {
        if (p == PW_PROP_OMEGA || p == PW_PROP_TS_A || p == PW_PROP_TS_B)
            continue;
        assert_int_equal(pw_component_require(&c, (pw_comp_prop)p, NULL, NULL), PW_ENOTFOUND);
    }
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(reads_constants_in_si),
        cmocka_unit_test(pc_bar_is_converted),
        cmocka_unit_test(bad_constants_name_line_and_column),
        cmocka_unit_test(zeroed_component_knows_nothing),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
