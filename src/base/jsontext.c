/* Shortest round-trip reals in JSON text; see include/pinchwise/jsontext.h. */
#include <pinchwise/jsontext.h>

#include <math.h>
#include <stdbool.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* The C library's way, and the reference: the first of %.15g, %.16g, %.17g that strtod reads
 * back to v (with ".0" appended where it would read as an integer). */
static char *format_real_libc(double v, char *buf, size_t cap)
{
    for (int p = 15; p <= 17; p++) {
        snprintf(buf, cap, "%.*g", p, v);
        if (p == 17 || strtod(buf, NULL) == v)
            break;
    }
    if (!strpbrk(buf, ".eEn")) { /* keep it a real: 2 -> 2.0 */
        size_t n = strlen(buf);
        if (n + 2 < cap)
            memcpy(buf + n, ".0", 3);
    }
    return buf;
}

/* Exact integer arithmetic (unsigned 128-bit) for the digits. The same text as
 * format_real_libc, computed without the C library's formatting and reading: for
 * v = m 2^k (m < 2^53), the correctly rounded p-digit decimal D 10^(X - p + 1) is
 * round-half-even(m 2^k 10^s), s = p - 1 - X, computed exactly as m 5^s 2^(k+s) (s >= 0) or
 * m 2^(k-s') / 5^s' (s' = -s > 0), when every intermediate fits in 128 bits; then D reads back
 * to v (the decimal's nearest double is v) by one correctly rounded IEEE operation, D times or
 * divided by 10^|e|, where D < 2^53 and |e| <= 22 (both exactly representable: the fast path of
 * Clinger, PLDI 1990), else through strtod. Whatever falls outside these ranges (zero,
 * subnormal, huge) takes format_real_libc. */
#if defined(__SIZEOF_INT128__)
__extension__ typedef unsigned __int128 u128;

static const u128 U128_MAX = ~(u128)0;

static u128 pow5(int n)
{
    u128 r = 1;
    while (n-- > 0)
        r *= 5;
    return r;
}

/* round-half-even(m 2^k 10^s) into *out; false when it does not fit the arithmetic. */
static bool scaled_round(uint64_t m, int k, int s, u128 *out)
{
    if (s >= 0) {
        if (s > 32)
            return false;
        u128 num = (u128)m * pow5(s); /* m < 2^53, 5^32 < 2^75: num < 2^128 */
        int sh = k + s;
        if (sh >= 0) {
            if (sh > 127 || num > (U128_MAX >> sh))
                return false;
            *out = num << sh;
            return true;
        }
        if (-sh > 126)
            return false;
        int r = -sh;
        u128 q = num >> r, rem = num & (((u128)1 << r) - 1), half = (u128)1 << (r - 1);
        if (rem > half || (rem == half && (q & 1)))
            q++;
        *out = q;
        return true;
    }
    int t = -s;
    if (t > 54)
        return false; /* 5^54 < 2^126 */
    u128 den = pow5(t);
    int sh = k - t;
    u128 num;
    if (sh >= 0) {
        if (sh > 74)
            return false;
        num = (u128)m << sh;
    } else {
        num = m;
        if (-sh > 127 || den > (U128_MAX >> -sh) >> 1)
            return false;
        den <<= -sh;
    }
    u128 q = num / den, rem = num % den;
    if (rem > den - rem || (rem == den - rem && (q & 1)))
        q++;
    *out = q;
    return true;
}

static const double POW10_EXACT[23] = {1e0,  1e1,  1e2,  1e3,  1e4,  1e5,  1e6,  1e7,
                                       1e8,  1e9,  1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
                                       1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};

static u128 pow10_u(int n)
{
    u128 r = 1;
    while (n-- > 0)
        r *= 10;
    return r;
}

/* The p-digit decimal of |v| = m 2^k: digits D (10^(p-1) <= D < 10^p) and exponent X. */
static bool digits_of(uint64_t m, int k, int X0, int p, u128 *D, int *X)
{
    u128 lo = pow10_u(p - 1), hi = lo * 10;
    for (int X1 = X0 - 1; X1 <= X0 + 1; X1++) {
        u128 q;
        if (!scaled_round(m, k, p - 1 - X1, &q))
            return false;
        if (q == hi) { /* rounded up to the next power of ten */
            *D = lo;
            *X = X1 + 1;
            return true;
        }
        if (q >= lo && q < hi) {
            *D = q;
            *X = X1;
            return true;
        }
    }
    return false;
}

/* Whether D 10^e reads back to the double a (positive): 1 yes, 0 no, -1 not decided here. */
static int reads_back(u128 D, int e, double a)
{
    if (D > ((u128)1 << 53) || e > 22 || e < -22)
        return -1;
    double d = (double)(uint64_t)D;
    return (e >= 0 ? d * POW10_EXACT[e] : d / POW10_EXACT[-e]) == a;
}

/* %.{p}g of the value with digits D (p of them) and exponent X, sign neg; then ".0" if needed
 * and real. */
static char *print_g(bool neg, u128 D, int p, int X, bool real, char *buf)
{
    char dig[40];
    for (int i = p - 1; i >= 0; i--) {
        dig[i] = (char)('0' + (int)(D % 10));
        D /= 10;
    }
    int nd = p;
    while (nd > 1 && dig[nd - 1] == '0') /* %g drops trailing zeros */
        nd--;
    char *o = buf;
    if (neg)
        *o++ = '-';
    if (X < -4 || X >= p) {
        *o++ = dig[0];
        if (nd > 1) {
            *o++ = '.';
            memcpy(o, dig + 1, (size_t)nd - 1);
            o += nd - 1;
        }
        *o++ = 'e';
        *o++ = X < 0 ? '-' : '+';
        int ax = X < 0 ? -X : X;
        if (ax >= 100)
            *o++ = (char)('0' + ax / 100);
        *o++ = (char)('0' + ax / 10 % 10);
        *o++ = (char)('0' + ax % 10);
        *o = '\0';
        return buf;
    }
    if (X < 0) {
        *o++ = '0';
        *o++ = '.';
        for (int i = -1; i > X; i--)
            *o++ = '0';
        memcpy(o, dig, (size_t)nd);
        o += nd;
    } else {
        int ip = X + 1; /* digits before the point */
        for (int i = 0; i < ip; i++)
            *o++ = i < nd ? dig[i] : '0';
        if (nd > ip) {
            *o++ = '.';
            memcpy(o, dig + ip, (size_t)(nd - ip));
            o += nd - ip;
        } else if (real) {
            *o++ = '.';
            *o++ = '0';
        }
    }
    *o = '\0';
    return buf;
}

/* a (positive, normal) = m 2^k with m < 2^53, and X0 an estimate of its decimal exponent. */
static void split_real(double a, uint64_t *m, int *k, int *X0)
{
    int ex;
    double fr = frexp(a, &ex); /* a = fr 2^ex, 0.5 <= fr < 1 */
    *m = (uint64_t)ldexp(fr, 53);
    *k = ex - 53;
    *X0 = (int)floor(log10(a));
}

char *pw_json_format_real(double v, char *buf, size_t cap)
{
    double a = fabs(v);
    if (!(a >= 1e-290 && a <= 1e290) || cap < 32)
        return format_real_libc(v, buf, cap);
    uint64_t m;
    int k, X0;
    split_real(a, &m, &k, &X0);
    for (int p = 15; p <= 17; p++) {
        u128 D;
        int X;
        if (!digits_of(m, k, X0, p, &D, &X))
            return format_real_libc(v, buf, cap);
        int rb = p == 17 ? 1 : reads_back(D, X - p + 1, a);
        if (rb < 0) {
            print_g(false, D, p, X, true, buf);
            rb = strtod(buf, NULL) == a;
        }
        if (rb)
            return print_g(signbit(v), D, p, X, true, buf);
    }
    return format_real_libc(v, buf, cap); /* not reached: 17 digits always read back */
}

char *pw_format_g17(double v, char *buf, size_t cap)
{
    double a = fabs(v);
    if (!(a >= 1e-290 && a <= 1e290) || cap < 32) {
        snprintf(buf, cap, "%.17g", v);
        return buf;
    }
    uint64_t m;
    int k, X0;
    split_real(a, &m, &k, &X0);
    u128 D;
    int X;
    if (!digits_of(m, k, X0, 17, &D, &X)) {
        snprintf(buf, cap, "%.17g", v);
        return buf;
    }
    return print_g(signbit(v), D, 17, X, false, buf);
}
#else /* no 128-bit integers: the C library's way */
char *pw_json_format_real(double v, char *buf, size_t cap)
{
    return format_real_libc(v, buf, cap);
}

char *pw_format_g17(double v, char *buf, size_t cap)
{
    snprintf(buf, cap, "%.17g", v);
    return buf;
}
#endif

static bool number_char(char c)
{
    return (c >= '0' && c <= '9') || c == '-' || c == '+' || c == '.' || c == 'e' || c == 'E';
}

char *pw_json_shortest_reals(const char *text)
{
    if (!text)
        return NULL;
    size_t len = strlen(text);
    /* a rewritten real grows by at most 2 characters and is at least 3 long: 2 len bounds it */
    char *out = malloc(2 * len + 16);
    if (!out)
        return NULL;
    size_t o = 0;
    bool in_string = false;
    for (size_t i = 0; i < len;) {
        char c = text[i];
        if (in_string) {
            out[o++] = c;
            i++;
            if (c == '\\' && i < len)
                out[o++] = text[i++];
            else if (c == '"')
                in_string = false;
            continue;
        }
        if (c == '"') {
            in_string = true;
            out[o++] = c;
            i++;
            continue;
        }
        if (c == '-' || (c >= '0' && c <= '9')) {
            size_t j = i;
            bool real = false;
            while (j < len && number_char(text[j])) {
                real = real || text[j] == '.' || text[j] == 'e' || text[j] == 'E';
                j++;
            }
            if (real && j - i < 64) {
                char tok[64], buf[40];
                memcpy(tok, text + i, j - i);
                tok[j - i] = '\0';
                pw_json_format_real(strtod(tok, NULL), buf, sizeof buf);
                size_t n = strlen(buf);
                if (n <= j - i + 2) { /* never grows beyond the bound above */
                    memcpy(out + o, buf, n);
                    o += n;
                    i = j;
                    continue;
                }
            }
            memcpy(out + o, text + i, j - i);
            o += j - i;
            i = j;
            continue;
        }
        out[o++] = c;
        i++;
    }
    out[o] = '\0';
    return out;
}
