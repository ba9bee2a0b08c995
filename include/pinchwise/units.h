/* Units of temperature and pressure, as the file formats and the command line write them.
 *
 * Temperature: K, C, F.  Pressure: Pa, kPa, MPa, bar, atm, mmHg, psia.
 * Unit names match case-insensitively ("kpa" is kPa). Inside the library everything is SI:
 * T in K, P in Pa. */
#ifndef PINCHWISE_UNITS_H
#define PINCHWISE_UNITS_H

#include <pinchwise/status.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum { PW_QTY_TEMPERATURE, PW_QTY_PRESSURE } pw_quantity;

/* Converts value given in unit to SI (K or Pa). Returns PW_EINVAL for an unknown unit, PW_EDOM
 * when the result is not finite or not positive (absolute T and P must be > 0). */
pw_status pw_units_to_si(pw_quantity q, double value, const char *unit, double *si);

/* Converts an SI value to unit. Returns PW_EINVAL for an unknown unit. */
pw_status pw_units_from_si(pw_quantity q, double si, const char *unit, double *value);

/* The unit as an affine map to SI: si = (value + offset) * scale. PW_EINVAL for an unknown unit. */
pw_status pw_units_affine(pw_quantity q, const char *unit, double *scale, double *offset);

/* True when unit names a known unit of quantity q. */
int pw_units_known(pw_quantity q, const char *unit);

/* Parses a quantity written as a number followed straight by its unit ("101.325kPa", "50C",
 * "1atm", "350K"; no space allowed between them, none needed). A bare number is refused.
 * On failure fills err->msg with what was wrong and the list of units. */
pw_status pw_units_parse_quantity(pw_quantity q, const char *text, double *si, pw_error *err);

/* The accepted units of q as a static comma-separated list, e.g. "K, C, F". */
const char *pw_units_list(pw_quantity q);

#ifdef __cplusplus
}
#endif
#endif
