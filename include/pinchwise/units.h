/* Units of temperature and pressure, as the file formats and the command line write them.
 *
 * Temperature: K, C, F (also degC, degF and the degree sign: "\u00b0C", "\u00b0F").
 * Pressure: Pa, kPa, MPa, bar, atm, mmHg, psia (also bara = bar, torr = mmHg, psi = psia;
 * all absolute). Unit names match case-insensitively ("kpa" is kPa). Inside the library
 * everything is SI: T in K, P in Pa. One parser serves data files and the command line: a
 * quantity is a number, optional blanks, then its unit ("101.325kPa", "1 atm", "50 \u00b0C"). */
#ifndef PINCHWISE_UNITS_H
#define PINCHWISE_UNITS_H

#include <pinchwise/status.h>
#include <stddef.h>

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

/* Parses a quantity written as a number followed by its unit ("101.325kPa", "50C", "1 atm",
 * "350 K", "78.3 degC"; blanks between number and unit are allowed, none needed). A bare number
 * is refused. On failure fills err->msg with what was wrong and the list of units. */
pw_status pw_units_parse_quantity(pw_quantity q, const char *text, double *si, pw_error *err);

/* The accepted units of q as a static list, e.g. "K, C, F (also degC, ...)". */
const char *pw_units_list(pw_quantity q);

/* The canonical spelling of a known unit ("C" for "degC", "mmHg" for "torr"), NULL if unknown. */
const char *pw_units_canonical(pw_quantity q, const char *unit);

typedef enum {
    PW_SPLIT_OK,        /* a number and a unit */
    PW_SPLIT_NO_NUMBER, /* no plain finite decimal number at the start */
    PW_SPLIT_NO_UNIT,   /* a number and nothing after it */
    PW_SPLIT_BAD_UNIT   /* a unit with blanks inside, or longer than unit_cap - 1 */
} pw_units_split_result;

/* Splits "VALUE UNIT" or "VALUEUNIT" (blanks around and between optional) into the number and
 * the unit text; the unit starts at the first blank, '%', letter (other than an exponent's e) or
 * non-ASCII byte (a degree sign) after the number. The unit is not checked against any table. */
pw_units_split_result pw_units_split(const char *text, double *value, char *unit, size_t unit_cap);

/* A temperature difference (an uncertainty): a positive number with K, C or F (or an alias);
 * 1 C = 1 K, 1 F = 5/9 K (the offset does not apply to a difference). */
pw_status pw_units_parse_temperature_difference(const char *text, double *K, pw_error *err);

/* A pressure uncertainty: a positive number with % (relative; *rel set, *abs_Pa NAN) or with a
 * pressure unit (absolute; *abs_Pa set, *rel NAN): "0.2%", "0.05kPa", "0.4 mmHg". */
pw_status pw_units_parse_pressure_uncertainty(const char *text, double *rel, double *abs_Pa,
                                              pw_error *err);

/* Basis of a composition. */
typedef enum { PW_BASIS_MOLE = 0, PW_BASIS_MASS = 1 } pw_basis;

/* A composition of component 1: a bare number is a mole fraction; suffixes (blanks before them
 * allowed): "mol%" mole percent, "mol" mole fraction, "wt" mass fraction, "wt%" mass percent.
 * *value is the fraction (0..1) on *basis; converting mass to mole needs the molar masses
 * (pw_units_mass_to_mole). A bare "%" is refused (which percent?); a bare number in (1, 100]
 * is refused with a hint that it looks like a percentage. */
pw_status pw_units_parse_composition(const char *text, double *value, pw_basis *basis,
                                     pw_error *err);

/* Mass fraction w of component 1 to its mole fraction, and back, with the molar masses M1, M2 (any
 * one unit): x = (w/M1) / (w/M1 + (1-w)/M2). Exact at 0 and 1. */
double pw_units_mass_to_mole(double w, double M1, double M2);
double pw_units_mole_to_mass(double x, double M1, double M2);

/* Units chosen for display (text and the report); computation and JSON stay in K and Pa.
 * T and P hold canonical spellings (pw_units_canonical), for example "C" and "bar". */
typedef struct pw_display_units {
    char T[8];
    char P[8];
} pw_display_units;

/* K and kPa. */
pw_display_units pw_units_display_default(void);
/* Parses a comma-separated list of one temperature and/or one pressure unit, in any order
 * ("C,bar", "degF", "kPa,K", "\u00b0C, atm"; blanks around items allowed); a quantity not named
 * keeps its default. PW_EINVAL naming the item for an unknown unit, an empty item, or two units
 * of the same quantity. */
pw_status pw_units_display_parse(const char *text, pw_display_units *out, pw_error *err);
/* A temperature in K, a temperature difference in K, a pressure in Pa, in the display units. */
double pw_units_display_T(const pw_display_units *u, double T_K);
double pw_units_display_dT(const pw_display_units *u, double dT_K);
double pw_units_display_P(const pw_display_units *u, double P_Pa);
/* The symbol to print after a displayed value: "K", "\u00b0C", "\u00b0F"; "kPa", "bar", ...
 * (UTF-8, static). */
const char *pw_units_display_T_symbol(const pw_display_units *u);
const char *pw_units_display_P_symbol(const pw_display_units *u);
/* The symbol after a displayed temperature difference: "K" for K and C (a kelvin is a Celsius
 * degree), "\u00b0F" for F. */
const char *pw_units_display_dT_symbol(const pw_display_units *u);

/* What a displayed quantity is. */
typedef enum { PW_SHOW_T, PW_SHOW_DT, PW_SHOW_P } pw_show_kind;

/* One value in SI (K, K, Pa) as "<number> <symbol>" in the display units (u NULL: K and kPa),
 * the number written with the printf conversion spec ("%" + spec, for example ".2f", ".4g").
 * Returns out (always terminated; "?" for a spec that is not one of [.digits]f/g/e). */
char *pw_units_display_value(const pw_display_units *u, pw_show_kind kind, const char *spec,
                             double si, char *out, size_t n);

/* Quantities inside library text (reasons, warnings): a library message that quotes a
 * temperature or a pressure writes it as a marked SI value, so that the caller, not the
 * library, chooses the unit it is shown in. In a format string:
 *     snprintf(buf, n, "azeotrope at T = " PW_TEXT_T(".2f") " ...", T_K);
 * marks T_K (kelvin, printed later with %.2f in the display unit and its symbol). PW_TEXT_DT
 * marks a temperature difference in K, PW_TEXT_P a pressure in Pa. The mark is
 * 0x1e, the kind letter, the spec, 0x1f, the value with 17 digits, 0x1d; it never reaches a
 * reader: every place that shows such a text (the command line, the report, the JSON
 * documents and the fit file) passes it through pw_units_display_text first. */
#define PW_TEXT_T(spec) "\x1e" "T" spec "\x1f" "%.17g" "\x1d"
#define PW_TEXT_DT(spec) "\x1e" "D" spec "\x1f" "%.17g" "\x1d"
#define PW_TEXT_P(spec) "\x1e" "P" spec "\x1f" "%.17g" "\x1d"

/* text with its marked values written in the display units (u NULL: K and kPa, the text as it
 * reads in JSON) into out (n bytes, always terminated; a mark cut short by truncation is
 * dropped). Text without marks is copied unchanged. Returns out. */
char *pw_units_display_text(const pw_display_units *u, const char *text, char *out, size_t n);

#ifdef __cplusplus
}
#endif
#endif
