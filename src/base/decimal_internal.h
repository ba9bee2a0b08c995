/* Private to the library: the one syntax check for a plain decimal number, shared by the unit
 * parser (src/base/units.c) and the CSV readers (src/data/csvrows.c). */
#ifndef PW_DECIMAL_INTERNAL_H
#define PW_DECIMAL_INTERNAL_H

#include <stdbool.h>

/* True when text is an optional sign, digits with an optional '.', and an optional exponent,
 * nothing else (no hex, inf or nan spellings, no blanks). The caller converts with strtod. */
bool pw_decimal_syntax_ok(const char *text);

#endif
