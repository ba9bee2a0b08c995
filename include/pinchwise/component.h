/* Pure components: vapor-pressure correlations and the component library.
 *
 * A component file is CSV with the header row
 *     name,A,B,C,log,P_unit,T_unit,T_min,T_max,source
 * and optional further columns after these, which pinchwise reads when present:
 *     equation   "antoine" (default) or "iapws-if97" (water only: IAPWS-IF97 region 4)
 *     V_L        liquid molar volume in cm3/mol near 25 C (used by Wilson's volume ratio)
 *     aliases    other names the component is found by, ";"-separated (e.g. "IPA; isopropanol")
 *     M_g_mol, Tc_K, Pc_kPa (or Pc_bar), omega, Zc, Vc_cm3_mol, dHvap_kJ_mol, cpL_J_molK,
 *     cpV_J_molK, r, q, tsonopoulos_a, tsonopoulos_b
 *                the pure-component constants of pw_comp_prop below (empty = unknown)
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

/* Optional pure-component constants, one per optional column of a component file. Stored in SI
 * (molar mass kg/mol, temperature K, pressure Pa, volume m3/mol, energy J/mol, heat capacity
 * J/(mol K)); NAN when unknown. */
typedef enum pw_comp_prop {
    PW_PROP_M,      /* M_g_mol: molar mass */
    PW_PROP_TC,     /* Tc_K: critical temperature */
    PW_PROP_PC,     /* Pc_kPa: critical pressure */
    PW_PROP_OMEGA,  /* omega: acentric factor */
    PW_PROP_ZC,     /* Zc: critical compressibility factor */
    PW_PROP_VC,     /* Vc_cm3_mol: critical molar volume */
    PW_PROP_DHVAP,  /* dHvap_kJ_mol: heat of vaporization at the normal boiling point */
    PW_PROP_CPL,    /* cpL_J_molK: liquid molar heat capacity (constant) */
    PW_PROP_CPV,    /* cpV_J_molK: ideal-gas molar heat capacity (constant) */
    PW_PROP_R,      /* r: UNIQUAC volume parameter */
    PW_PROP_Q,      /* q: UNIQUAC area parameter */
    PW_PROP_TS_A,   /* tsonopoulos_a: polar parameter a of the Tsonopoulos correlation */
    PW_PROP_TS_B,   /* tsonopoulos_b: polar parameter b of the Tsonopoulos correlation */
    PW_PROP_COUNT
} pw_comp_prop;

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
    char origin[PW_PATH_MAX]; /* the component file the row came from ("" when built in code) */
    long origin_line;         /* its line there (0: none) */
    char aliases[256];       /* other names, ";"-separated (optional column "aliases") */
    double prop[PW_PROP_COUNT]; /* optional constants in SI, NAN when unknown (pw_comp_prop) */
    /* The units as affine maps to SI (si = (value + offset) * scale), filled by
     * pw_component_prepare so that pw_psat needs no unit lookup; 0 means not prepared (pw_psat
     * then looks the units up). The readers prepare every component they return. */
    double T_scale, T_offset, P_scale, P_offset;
} pw_component;

/* Fills the cached unit maps of c from its T_unit and P_unit; PW_EINVAL for an unknown unit.
 * Call again after changing the units. */
pw_status pw_component_prepare(pw_component *c);

/* Sets every optional constant of c to unknown (NAN). */
void pw_component_props_clear(pw_component *c);

/* The component-file column of an optional constant ("M_g_mol", ...), its factor from the column's
 * unit to SI, and its plausible range in the column's unit; NULL / 0 for p out of range. */
const char *pw_comp_prop_column(pw_comp_prop p);
double pw_comp_prop_to_si(pw_comp_prop p);
void pw_comp_prop_range(pw_comp_prop p, double *lo, double *hi);

/* The constant p of c in SI. PW_ENOTFOUND when c does not know it; err then names the component
 * and the column to add ("component 'water' has no M_g_mol (add the column to a --components
 * file)"). */
pw_status pw_component_require(const pw_component *c, pw_comp_prop p, double *si,
                               pw_error *err);

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
