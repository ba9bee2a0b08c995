/* JSON text with every real number written as the shortest decimal that reads back as the same
 * double (0.8, not 0.80000000000000004 as jansson's JSON_REAL_PRECISION(17) writes it).
 *
 * Every JSON writer of pinchwise (fit files, the command line's --json) dumps with
 * JSON_REAL_PRECISION(17), which round-trips exactly, and passes the text through
 * pw_json_shortest_reals: for each real it tries 15, 16 and 17 significant digits and keeps the
 * first that strtod reads back to the identical double (computed by exact 128-bit integer
 * arithmetic, the same text to the byte; the C library where that does not reach). Reals keep a '.' or an exponent, so they
 * stay reals for a reader that distinguishes them from integers; integers and strings are copied
 * unchanged. */
#ifndef PINCHWISE_JSONTEXT_H
#define PINCHWISE_JSONTEXT_H

#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* The shortest round-trip form of v as a JSON real (finite v), written to buf (cap >= 32).
 * Returns buf. */
char *pw_json_format_real(double v, char *buf, size_t cap);

/* printf's "%.17g" of v (any double), the same text to the byte, from the exact integer
 * arithmetic above where it reaches (the C library elsewhere); for CSV files, whose readers
 * expect every double written with 17 significant digits. Returns buf (cap >= 32). */
char *pw_format_g17(double v, char *buf, size_t cap);

/* A malloc'd copy of the JSON text with every real rewritten by pw_json_format_real; NULL when
 * out of memory. The input must be JSON as jansson writes it (no NaN or Inf). */
char *pw_json_shortest_reals(const char *text);

#ifdef __cplusplus
}
#endif
#endif
