/* Shortest round-trip reals in JSON text (jsontext.h): identities (every rewritten real reads
 * back to the identical double, seeded random doubles over the whole exponent range), the
 * examples of the issue (0.8, not 0.80000000000000004), reals kept reals, integers and strings
 * untouched, and jansson reading the result back to the same values. */
#include "pw_test.h"

#include <jansson.h>
#include <math.h>
#include <pinchwise/jsontext.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

static void examples(void **state)
{
    (void)state;
    char b[40];
    assert_string_equal(pw_json_format_real(0.8, b, sizeof b), "0.8");
    assert_string_equal(pw_json_format_real(0.1 + 0.2, b, sizeof b), "0.30000000000000004");
    assert_string_equal(pw_json_format_real(2.0, b, sizeof b), "2.0");
    assert_string_equal(pw_json_format_real(-0.0, b, sizeof b), "-0.0");
    assert_string_equal(pw_json_format_real(101.325, b, sizeof b), "101.325");
    assert_string_equal(pw_json_format_real(1.1, b, sizeof b), "1.1");
    assert_string_equal(pw_json_format_real(1e-5, b, sizeof b), "1e-05");
    assert_true(strtod(pw_json_format_real(5e-324, b, sizeof b), NULL) == 5e-324);
    assert_true(strtod(pw_json_format_real(1.7976931348623157e308, b, sizeof b), NULL) ==
                1.7976931348623157e308);
}

static uint64_t next(uint64_t *s)
{
    *s ^= *s << 13;
    *s ^= *s >> 7;
    *s ^= *s << 17;
    return *s;
}

static void random_doubles_round_trip(void **state)
{
    (void)state;
    uint64_t s = 0x2026120207000001ULL;
    for (int i = 0; i < 100000; i++) {
        uint64_t bits = next(&s);
        double v;
        memcpy(&v, &bits, sizeof v);
        if (!isfinite(v))
            continue;
        char b[40];
        pw_json_format_real(v, b, sizeof b);
        if (strtod(b, NULL) != v) {
            print_error("%.17g written as %s\n", v, b);
            fail();
        }
        assert_non_null(strpbrk(b, ".e"));
        /* the 15-digit form is taken whenever it reads back */
        char c[40];
        snprintf(c, sizeof c, "%.15g", v);
        if (strtod(c, NULL) == v)
            assert_true(strncmp(b, c, strlen(c)) == 0);
    }
}

static void text_rewrite(void **state)
{
    (void)state;
    json_t *o = json_pack("{s:f,s:f,s:i,s:s,s:[f,f],s:f}", "xd", 0.8, "q", 1.0, "n", 12, "note",
                          "0.80000000000000004 \"1.10000000000000009\" stays", "pair", 0.1, 0.7,
                          "tiny", 1e-300);
    char *full = json_dumps(o, JSON_INDENT(2) | JSON_REAL_PRECISION(17) | JSON_PRESERVE_ORDER);
    char *t = pw_json_shortest_reals(full);
    assert_non_null(t);
    assert_non_null(strstr(full, "0.80000000000000004")); /* what jansson alone writes */
    assert_non_null(strstr(t, "\"xd\": 0.8,"));
    assert_non_null(strstr(t, "\"q\": 1.0,"));
    assert_non_null(strstr(t, "\"n\": 12,"));
    assert_non_null(strstr(t, "0.80000000000000004 \\\"1.10000000000000009\\\" stays"));
    assert_non_null(strstr(t, "0.1,"));
    assert_non_null(strstr(t, "1e-300"));
    json_error_t e;
    json_t *back = json_loads(t, 0, &e);
    assert_non_null(back);
    assert_true(json_equal(o, back));
    assert_true(json_is_real(json_object_get(back, "q")));
    assert_true(json_is_integer(json_object_get(back, "n")));
    json_decref(back);
    json_decref(o);
    free(full);
    free(t);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(examples),
        cmocka_unit_test(random_doubles_round_trip),
        cmocka_unit_test(text_rewrite),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
