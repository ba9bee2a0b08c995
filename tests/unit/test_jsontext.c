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

/* The C library's shortest form, as pinchwise wrote it before the exact-integer formatter: the
 * first of %.15g, %.16g, %.17g that strtod reads back, ".0" appended to an integer. */
static void libc_form(double v, char *b, size_t cap)
{
    for (int p = 15; p <= 17; p++) {
        snprintf(b, cap, "%.*g", p, v);
        if (p == 17 || strtod(b, NULL) == v)
            break;
    }
    if (!strpbrk(b, ".eEn"))
        strcat(b, ".0");
}

static void same_as_libc(double v)
{
    char b[40], c[40];
    pw_json_format_real(v, b, sizeof b);
    libc_form(v, c, sizeof c);
    if (strcmp(b, c) != 0 || strtod(b, NULL) != v) {
        print_error("%.17g written as %s, the C library's form %s\n", v, b, c);
        fail();
    }
    /* and the CSV writers' 17 digits: printf's "%.17g" to the byte */
    pw_format_g17(v, b, sizeof b);
    snprintf(c, sizeof c, "%.17g", v);
    if (strcmp(b, c) != 0) {
        print_error("%%.17g of %.17g written as %s\n", v, b);
        fail();
    }
}

/* The same text as the C library's formatting and reading (so fit files stay byte-identical;
 * and pw_format_g17 the same as "%.17g", so the report's CSV files do),
 * on seeded random doubles: every bit pattern, log-uniform over 1e-30..1e30 (where the exact
 * integer path runs), decimals of 1 to 17 digits at every scale (the values people and data
 * files write, many of them shortest at 15 digits or fewer), integers up to 2^64, the doubles
 * next to powers of ten and to the 2^53 boundary of the fast read-back, and both signs. */
static void same_text_as_c_library(void **state)
{
    (void)state;
    uint64_t s = 0x2026120214000001ULL;
    for (int i = 0; i < 200000; i++) {
        uint64_t bits = next(&s);
        double v;
        memcpy(&v, &bits, sizeof v);
        if (isfinite(v))
            same_as_libc(v);
        double u = (double)(next(&s) >> 11) / 9007199254740992.0; /* [0, 1) */
        double w = pow(10.0, -30.0 + 60.0 * u) * (next(&s) & 1 ? 1.0 : -1.0);
        same_as_libc(w);
        int nd = 1 + (int)(next(&s) % 17), e = -25 + (int)(next(&s) % 50);
        uint64_t digits = next(&s) % 100000000000000000ULL;
        for (int k = nd; k < 17; k++)
            digits /= 10;
        char t[64];
        snprintf(t, sizeof t, "%llue%d", (unsigned long long)digits, e);
        double d = strtod(t, NULL);
        same_as_libc(d);
        same_as_libc(nextafter(d, INFINITY));
        same_as_libc(nextafter(d, -INFINITY));
        same_as_libc((double)(next(&s) >> (next(&s) % 64)));
    }
    for (int e = -300; e <= 300; e++) {
        char t[16];
        snprintf(t, sizeof t, "1e%d", e);
        double p10 = strtod(t, NULL);
        same_as_libc(p10);
        same_as_libc(nextafter(p10, 0.0));
        same_as_libc(nextafter(p10, INFINITY));
        same_as_libc(-p10);
    }
    for (int k = -60; k <= 60; k++) {
        double b53 = 9007199254740992.0 * pow(10.0, (double)k);
        same_as_libc(b53);
        same_as_libc(nextafter(b53, 0.0));
        same_as_libc(nextafter(b53, INFINITY));
    }
    const double special[] = {0.0, -0.0, 5e-324, 2.2250738585072014e-308, 1e-290, 1e290,
                              1.7976931348623157e308, 0.1, 0.3, 1.0 / 3.0, 101325.0, 1e15, 1e16,
                              1e17, 1e21, 1e22, 1e23, 123456789012345678.0, 9.999999999999999e22};
    for (size_t i = 0; i < sizeof special / sizeof special[0]; i++) {
        same_as_libc(special[i]);
        same_as_libc(-special[i]);
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
        cmocka_unit_test(same_text_as_c_library),
        cmocka_unit_test(text_rewrite),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
