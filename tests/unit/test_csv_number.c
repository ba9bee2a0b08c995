/* Numbers of the CSV readers (pw_csvrows_number, src/data/csvrows.c): the value is strtod's, to
 * the bit, whether the fast exact path (at most 15 significant digits, 10^|e| <= 10^22) or
 * strtod itself gives it. Identity check on seeded random decimals of every shape the syntax
 * allows (sign, leading and trailing zeros, a point anywhere, exponents), and the refusals. */
#include "pw_test.h"

#include "data/csvrows.h"

#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static uint64_t next(uint64_t *s)
{
    *s ^= *s << 13;
    *s ^= *s >> 7;
    *s ^= *s << 17;
    return *s;
}

static void same_as_strtod(const char *t)
{
    double v = NAN;
    assert_true(pw_csvrows_number(t, &v));
    double w = strtod(t, NULL);
    if (memcmp(&v, &w, sizeof v) != 0) {
        print_error("%s read as %.17g, strtod %.17g\n", t, v, w);
        fail();
    }
}

static void random_decimals(void **state)
{
    (void)state;
    uint64_t s = 0x2026120214300001ULL;
    char t[96];
    for (int i = 0; i < 300000; i++) {
        size_t n = 0;
        uint64_t r = next(&s);
        if (r & 1)
            t[n++] = '-';
        else if (r & 2)
            t[n++] = '+';
        int lead = (int)(r >> 2 & 3), nd = 1 + (int)(next(&s) % 20);
        int point = (int)(next(&s) % (unsigned)(lead + nd + 2)) - 1; /* -1: none */
        for (int k = 0; k < lead + nd; k++) {
            if (k == point)
                t[n++] = '.';
            t[n++] = k < lead ? '0' : (char)('0' + next(&s) % 10);
        }
        if (point == lead + nd)
            t[n++] = '.';
        if (n == 0 || t[n - 1] == '-' || t[n - 1] == '+')
            t[n++] = '7';
        if (next(&s) % 3 == 0)
            n += (size_t)snprintf(t + n, sizeof t - n, "%c%d", next(&s) & 1 ? 'e' : 'E',
                                  (int)(next(&s) % 81) - 40);
        t[n] = '\0';
        same_as_strtod(t);
    }
    const char *edge[] = {"0", "-0", "0.0", "-0.000e5", "1e22", "1e23", "1e-22", "1e-23",
                          "999999999999999", "9999999999999999", "123456789012345e-22",
                          "0.000000000000000000000000001", "101.325", "1.", ".5", "-.5e+3",
                          "9007199254740993", "4.9e-324", "1.7976931348623157e308"};
    for (size_t i = 0; i < sizeof edge / sizeof edge[0]; i++)
        same_as_strtod(edge[i]);
    double v;
    const char *bad[] = {"", "-", "1e", "0x10", "inf", "nan", "1 ", "1,5", "1e400", "--1"};
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++)
        assert_false(pw_csvrows_number(bad[i], &v));
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(random_decimals),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
