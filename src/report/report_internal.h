/* Private: the report's computed content (curves, tables' inputs) and the rendered files. */
#ifndef PW_REPORT_INTERNAL_H
#define PW_REPORT_INTERNAL_H

#include "report/svg.h"

#include <math.h>
#include <pinchwise/assess.h>
#include <pinchwise/column.h>
#include <pinchwise/consistency.h>
#include <pinchwise/design.h>
#include <pinchwise/drawing.h>
#include <pinchwise/fit.h>
#include <pinchwise/fit_diagnostics.h>
#include <pinchwise/hetcheck.h>
#include <pinchwise/report.h>
#include <pinchwise/uncertainty.h>
#include <pinchwise/units.h>

/* NAN as a double (the macro is a float, which -Wdouble-promotion flags in ?: ). */
#define PW_NAN ((double)NAN)

#define PW_REPORT_MAX_FILES 16
#define PW_REPORT_MAX_AZ PW_DRAW_MAX_AZ
#define PW_REPORT_GRID PW_DRAW_GRID
#define PW_REPORT_MAX_MODELS 9
#define PW_REPORT_BAND_NX 61
#define PW_REPORT_BAND_CURVES 40
#define PW_REPORT_BAND_HALF 0.15

/* One output file held in memory: a plot (svg) or a table of numbers (csv). */
typedef struct pw_report_file {
    char name[64];        /* file name inside the --svg / --csv folder */
    char title[128];      /* caption */
    pw_sbuf text;
} pw_report_file;

/* Everything computed from the fit by the library (include/pinchwise/drawing.h and the
 * assessments): the report only renders it. */
typedef struct pw_report_curves {
    const pw_fit_result *fit;
    bool isothermal;
    pw_display_units units;          /* display units of temperature and pressure */
    pw_draw_phase phase;             /* curves, azeotropes, three-phase line at the data's condition */
    size_t n_failed;                 /* equilibrium solves that failed on the drawn grids (gaps) */
    bool az_from_module;             /* false: an azeotrope search failed (the page says so) */
    /* the other models of the same data, overlaid on one plot (pw_report_input.others) */
    size_t n_models;
    const pw_fit_result *model_fit[PW_REPORT_MAX_MODELS];
    pw_draw_phase *model_phase;      /* n_models entries (owned); [0] is the report's own fit */
    /* column (when requested) */
    bool column;
    pw_column_spec spec;
    double P_col_Pa, factor;
    pw_draw_xy xy;                   /* the curve and azeotropes at the column pressure */
    pw_draw_column dc;               /* construction, staircase, pinch window, decanter scheme */
    pw_profile profile_op;           /* stage profile at the operating R (pw_cmo_profile); n = 0 if none */
    bool energy;                     /* pw_report_input.energy with a column */
    pw_status energy_status;         /* of the heat data, then of pw_energy_column_solve */
    char energy_error[PW_ERROR_MSG_MAX];
    pw_energy_result energy_res;
    pw_design_table energy_design;   /* design rows at the factors and the operating factor */
    pw_draw_enthalpy en;             /* saturated liquid and vapor enthalpies, J/mol */
    /* uncertainty (pw_report_input.uncertainty); see report_unc.c */
    bool unc;
    pw_unc_options unc_opt;
    pw_status unc_col_status;        /* of pw_unc_column_assess; PW_EINVAL when not run */
    pw_unc_column_assessment unc_col;
    double unc_factor;               /* stages at unc_factor * R_min */
    pw_status unc_az_status, unc_col_az_status;
    pw_unc_result unc_az[PW_AZ_MAX], unc_col_az[PW_AZ_MAX];
    pw_status band_status;           /* PW_OK when the band below is drawn */
    size_t band_n;                   /* sampled curves */
    double band_x[PW_REPORT_BAND_NX], band_best[PW_REPORT_BAND_NX];
    double *band_y;                  /* band_n rows of PW_REPORT_BAND_NX (owned) */
    double band_lo, band_hi;         /* window in x */
    /* every model fitted to the same data, ranked (pw_rank_assess; NULL without others) */
    pw_ranking *rank;
    pw_status rank_status;
    /* the fit's diagnostics (pw_fit_diagnose): the list `fit` prints */
    pw_status diag_status;
    pw_fit_diags diags;
    /* consistency of the measured points */
    bool cons_ran;
    pw_status cons_status;
    char cons_error[PW_ERROR_MSG_MAX];
    pw_consistency_result cons;
    pw_het_check cons_het; /* three-phase points left out of the tests (as `check` does) */
} pw_report_curves;

/* Fills c from the fit (and the column input). Per-point solve failures leave NAN. */
pw_status pw_report_curves_compute(pw_report_curves *c, const pw_report_input *in);
void pw_report_curves_free(pw_report_curves *c);

struct pw_report {
    pw_sbuf html;
    pw_report_file svg[PW_REPORT_MAX_FILES];
    size_t n_svg;
    pw_report_file csv[PW_REPORT_MAX_FILES];
    size_t n_csv;
};

/* The uncertainty content of c (when in->uncertainty): column intervals and plan, azeotrope
 * intervals, the band of curves near the pinch. Failures other than PW_ENOMEM are recorded in c
 * for the page, not returned. */
pw_status pw_report_unc_compute(pw_report_curves *c, const pw_report_input *in);

/* Renders the plots of c into rep->svg. */
pw_status pw_report_render_plots(struct pw_report *rep, const pw_report_curves *c);
/* Renders the CSV tables behind the plots into rep->csv. */
pw_status pw_report_render_csv(struct pw_report *rep, const pw_report_curves *c);
/* Assembles the HTML page from c and the already rendered plots. */
pw_status pw_report_render_html(struct pw_report *rep, const pw_report_curves *c,
                                const pw_report_input *in);

/* Short words for displaying conditions in the display units: "101.3 kPa", "50 \u00b0C". */
void pw_report_condition(const pw_fit_result *r, const pw_display_units *u, char *buf, size_t len);
/* A temperature or a pressure with its display unit: "351.4 K", "1.013 bar" (%.*f / %.*g). */
void pw_report_T(const pw_display_units *u, double T_K, int decimals, char *buf, size_t len);
void pw_report_P(const pw_display_units *u, double P_Pa, int digits, char *buf, size_t len);

#endif
