/* Diagnostics of a fit as data: what deserves a second look before the fitted model is used.
 *
 * One call (pw_fit_diagnose) inspects a fit result and returns a plain list of records; the
 * command line, batch fits, the JSON documents and the report all show this one list, worded
 * here once. Each record carries its kind, a severity, the data-file line it concerns (0 when
 * none), the numbers behind it and a sentence without file name or program options (the caller
 * prefixes the data file's name and line).
 *
 * Thresholds (their source beside each):
 *   pure-component points: a miss of the vapor-pressure correlation larger than 2 K (isobaric
 *     data) or 5 % in pressure (isothermal) is well beyond measurement error (common practice);
 *     the components look swapped when the miss with the names exchanged is below a quarter of
 *     it (this project's choice);
 *   parameter correlation |r| > 0.95: poorly identifiable pair (common practice in regression
 *     diagnostics, e.g. Bates & Watts 1988, Nonlinear Regression Analysis, sec. 2.3, from
 *     memory);
 *   identifiability and convergence classes: PW_FIT_IDENT_SV_RATIO, PW_FIT_UNFIXED_HALFWIDTH,
 *     PW_FIT_EXACT_RMS (include/pinchwise/fit.h, docs/fitting.md);
 *   competing minima: delta-AICc < 2 (Burnham & Anderson 2002, sec. 2.6);
 *   measured one-liquid points inside the model's layers: strictly between the layers of
 *     pw_three_phase_at_P at the point's P (isobaric) or pw_three_phase_at_T at its T
 *     (isothermal), the test pw_bubble_T_het / pw_bubble_P_het use (an identity, no tolerance;
 *     docs/heterogeneous.md section 4). */
#ifndef PINCHWISE_FIT_DIAGNOSTICS_H
#define PINCHWISE_FIT_DIAGNOSTICS_H

#include <pinchwise/fit.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Thresholds named above. */
#define PW_DIAG_PURE_MISS_K 2.0   /* isobaric pure-component point, K (common practice) */
#define PW_DIAG_PURE_MISS_PCT 5.0 /* isothermal pure-component point, % of P (common practice) */
#define PW_DIAG_SWAP_RATIO 0.25   /* exchanged names miss by less than this fraction */
#define PW_DIAG_CORRELATION 0.95  /* |correlation| of two fitted parameters */

typedef enum pw_fit_diag_kind {
    PW_DIAG_RANGE_BELOW = 0,   /* data below a component's vapor-pressure range: comp, value = K */
    PW_DIAG_RANGE_ABOVE,       /* data above it: comp, value = K */
    PW_DIAG_PURE_MISS,         /* a pure-component point misses the vapor pressure: line, value =
                                  miss (unit in value_unit), value2 = miss with names exchanged */
    PW_DIAG_SWAPPED,           /* as PW_DIAG_PURE_MISS, and the names exchanged fit: swapped */
    PW_DIAG_DUPLICATES,        /* count points repeat another exactly: line repeats line2 */
    PW_DIAG_VAPOR_ASSOCIATION, /* comp is a carboxylic acid: the vapor dimerises */
    PW_DIAG_RUNAWAY,           /* did not converge: param ran beyond its bound (-1 unknown) */
    PW_DIAG_NOT_CONVERGED,     /* did not converge otherwise */
    PW_DIAG_EXACT,             /* residuals at rounding level */
    PW_DIAG_UNIDENTIFIABLE,    /* a parameter combination the data do not fix (weak_dir) */
    PW_DIAG_HETEROGENEOUS,     /* three-phase points (count) and tie lines (count2) fitted */
    PW_DIAG_LIQUID_SPLIT,      /* the parameters predict a split: value = D, value2 = x1,
                                  value3 = T_K */
    PW_DIAG_COMPETING_MINIMA,  /* count distinct minima fit about equally well */
    PW_DIAG_CORRELATED,        /* param and param2 correlated: value = correlation */
    PW_DIAG_TIES_DISAGREE,     /* two tie lines at one temperature (value3, K) whose layers
                                * differ by value (> 3 sigma_x): their LLE-file lines in count,
                                * count2 (line, line2 are data-file lines: 0 here) */
    PW_DIAG_LIQUID_IN_GAP,     /* count measured one-liquid points (not three-phase, not
                                * excluded) lie strictly inside the model's two liquid layers at
                                * their three-phase condition: line, line2 the first and last of
                                * them; value, value2 the layers x_I < x_II; value3 their T_K */
    PW_DIAG_KIND_COUNT
} pw_fit_diag_kind;

typedef enum pw_fit_diag_severity {
    PW_DIAG_NOTE = 0,    /* information: the result stands */
    PW_DIAG_WARNING = 1, /* check before relying on the result */
    PW_DIAG_SEVERE = 2   /* do not design with this fit */
} pw_fit_diag_severity;

#define PW_FIT_DIAG_MAX 48
#define PW_FIT_DIAG_MSG_MAX 400

typedef struct pw_fit_diag {
    pw_fit_diag_kind kind;
    pw_fit_diag_severity severity;
    long line, line2;  /* data-file lines, 0 when none */
    int comp;          /* component index 0 or 1, -1 when none */
    int param, param2; /* parameter indices of the model, -1 when none */
    size_t count, count2;
    double value, value2, value3; /* NAN when unused */
    const char *value_unit;       /* unit of value ("K", "%", ""), never NULL */
    char message[PW_FIT_DIAG_MSG_MAX];
} pw_fit_diag;

typedef struct pw_fit_diags {
    pw_fit_diag items[PW_FIT_DIAG_MAX];
    size_t n;
} pw_fit_diags;

/* Inspects r (a fit just made or read back) and fills out with every diagnostic that applies,
 * in the order of the kinds above. PW_EINVAL for NULL arguments or a result without a model,
 * PW_ENOMEM when the duplicate search cannot allocate. out is a plain value: nothing to free. */
pw_status pw_fit_diagnose(const pw_fit_result *r, pw_fit_diags *out);

/* Only the liquid-inside-layers check of pw_fit_diagnose (out holds its one record, or none):
 * for commands whose answers are the model's layers, without the rest of the diagnosis. */
pw_status pw_fit_diagnose_liquid_in_gap(const pw_fit_result *r, pw_fit_diags *out);

/* True when c looks like a carboxylic acid (its name contains "acid", any case): such vapors
 * dimerise, and the ideal-vapor model can then be off by tens of percent even at 1 atm
 * (Marek & Standart 1954; Hayden & O'Connell 1975). */
bool pw_component_vapor_associates(const pw_component *c);

/* Machine names of kinds ("range-below", "pure-point-miss", "components-swapped", ...) and
 * severities ("note", "warning", "severe"); "unknown" out of range. */
const char *pw_fit_diag_kind_name(pw_fit_diag_kind k);
const char *pw_fit_diag_severity_name(pw_fit_diag_severity s);

#ifdef __cplusplus
}
#endif
#endif
