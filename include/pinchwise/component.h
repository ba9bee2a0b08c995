/* Pure components: vapor-pressure correlations and the component library.
 *
 * A component file is CSV with the header row
 *     name,A,B,C,log,P_unit,T_unit,T_min,T_max,source
 * and optional further columns after these, which pinchwise reads when present:
 *     equation   "antoine" (default) or "iapws-if97" (water only: IAPWS-IF97 region 4)
 *     V_L        liquid molar volume in cm3/mol near 25 C (used by Wilson's volume ratio)
 *     aliases    other names the component is found by, ";"-separated (e.g. "IPA; isopropanol")
 *     Tc_K, Pc_bar, omega   critical constants (informational; for later vapor corrections)
 * Antoine: log10(P) = A - B/(T + C) or ln(P) = A - B/(T + C), P in P_unit, T in T_unit. */
#ifndef PINCHWISE_COMPONENT_H
#define PINCHWISE_COMPONENT_H

#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

#define PW_NAME_MAX 80
#define PW_SOURCE_MAX 1024
#define PW_UNIT_MAX 8

typedef enum { PW_PSAT_ANTOINE = 0, PW_PSAT_IAPWS_IF97 = 1 } pw_psat_equation;
typedef enum { PW_LOG10 = 0, PW_LN = 1 } pw_log_base;

/* One pure component. A plain value: copy it freely. */
typedef struct pw_component {
    char name[PW_NAME_MAX];
    pw_psat_equation equation;
    double A, B, C;          /* Antoine constants in the units below */
    pw_log_base log;
    char P_unit[PW_UNIT_MAX]; /* as written in the file, e.g. "kPa" */
    char T_unit[PW_UNIT_MAX]; /* "K", "C" or "F" */
    double T_min_K, T_max_K; /* validity range, converted to K */
    double V_L_cm3mol;       /* liquid molar volume, NAN when unknown */
    char source[PW_SOURCE_MAX];
    char aliases[256];       /* other names, ";"-separated (optional column "aliases") */
    /* The units as affine maps to SI (si = (value + offset) * scale), filled by
     * pw_component_prepare so that pw_psat needs no unit lookup; 0 means not prepared (pw_psat
     * then looks the units up). The readers prepare every component they return. */
    double T_scale, T_offset, P_scale, P_offset;
} pw_component;

/* Fills the cached unit maps of c from its T_unit and P_unit; PW_EINVAL for an unknown unit.
 * Call again after changing the units. */
pw_status pw_component_prepare(pw_component *c);

/* Saturation pressure P [Pa] at T [K] and d(ln P)/dT [1/K] (either output may be NULL).
 * Evaluates outside the validity range too (use pw_component_range_excess_K to know);
 * returns PW_EDOM for T <= 0, T at or beyond the Antoine pole (T + C <= 0), or a result
 * that is not finite; for IAPWS-IF97 PW_ERANGE outside 273.15-647.096 K. */
pw_status pw_psat(const pw_component *c, double T_K, double *P_Pa, double *dlnP_dT);

/* Saturation temperature [K] at P [Pa] (inverse of pw_psat, closed form for Antoine). */
pw_status pw_tsat(const pw_component *c, double P_Pa, double *T_K);

/* By how many kelvin T lies outside the component's validity range: negative below T_min,
 * positive above T_max, 0 inside. */
double pw_component_range_excess_K(const pw_component *c, double T_K);

/* IAPWS-IF97 region 4 (IAPWS R7-97(2012)): saturation pressure of water [Pa] from T [K] and
 * saturation temperature [K] from P [Pa]. PW_ERANGE outside 273.15 K..647.096 K
 * (611.213 Pa..22.064 MPa). */
pw_status pw_iapws97_psat(double T_K, double *P_Pa);
pw_status pw_iapws97_tsat(double P_Pa, double *T_K);

/* A list of components read from one or more files. Later rows take precedence. */
typedef struct pw_complib {
    pw_component *items;
    size_t n, cap;
} pw_complib;

/* Initialises an empty library (no allocation). */
void pw_complib_init(pw_complib *lib);

/* Reads a component file and appends its rows. On failure nothing is appended and err names
 * file, line and problem (PW_EIO, PW_EPARSE, PW_ENOMEM). */
pw_status pw_complib_read(pw_complib *lib, const char *path, pw_error *err);

/* Same, from a buffer in memory; name is used in error messages. */
pw_status pw_complib_parse(pw_complib *lib, const char *buf, size_t len, const char *name,
                           pw_error *err);

/* The component called name (case-insensitive; the last row read wins), else the last row that
 * lists name among its aliases, or NULL. */
const pw_component *pw_complib_find(const pw_complib *lib, const char *name);

/* Up to max names closest to name (edit distance), written to out (pointers into lib).
 * Returns how many were written. */
size_t pw_complib_suggest(const pw_complib *lib, const char *name, const char **out, size_t max);

/* Frees the rows; lib is left empty and reusable. Accepts NULL. */
void pw_complib_free(pw_complib *lib);

/* The shipped component library (components.csv): $PINCHWISE_COMPONENTS when set and readable,
 * else the installed copy found from where this code lives (<prefix>/share/pinchwise beside the
 * library's or the program's folder), else the copy in the source tree the library was built
 * from, else the configured install location. Writes the path into path; false when none is
 * readable. */
bool pw_complib_default_path(char *path, size_t len);

/* Initialises lib with the shipped component library, then reads extra_path (may be NULL), whose
 * rows take precedence. On failure lib is left empty and err says what is missing or wrong. */
pw_status pw_complib_load_default(pw_complib *lib, const char *extra_path, pw_error *err);

#ifdef __cplusplus
}
#endif
#endif
