/* Private: the report's computed content (curves, tables' inputs) and the rendered files. */
#ifndef PW_REPORT_INTERNAL_H
#define PW_REPORT_INTERNAL_H

#include "report/svg.h"

#include <math.h>
#include <pinchwise/assess.h>
#include <pinchwise/column.h>
#include <pinchwise/consistency.h>
#include <pinchwise/design.h>
#include <pinchwise/fit.h>
#include <pinchwise/fit_diagnostics.h>
#include <pinchwise/report.h>
#include <pinchwise/uncertainty.h>

/* NAN as a double (the macro is a float, which -Wdouble-promotion flags in ?: ). */
#define PW_NAN ((double)NAN)

#define PW_REPORT_MAX_FILES 12
#define PW_REPORT_MAX_AZ 4
#define PW_REPORT_GRID 161
#define PW_REPORT_MAX_STEPS 120
#define PW_REPORT_BAND_NX 61
#define PW_REPORT_BAND_CURVES 40
#define PW_REPORT_BAND_HALF 0.15

/* One output file held in memory: a plot (svg) or a table of numbers (csv). */
typedef struct pw_report_file {
    char name[64];        /* file name inside the --svg / --csv folder */
    char title[128];      /* caption */
    pw_sbuf text;
} pw_report_file;

/* An azeotrope of the model at a fixed P (T varies) or fixed T (P varies). */
typedef struct pw_report_az {
    double x1, T_K, P_Pa;
    bool min_boiling;
    bool tangential;   /* a double root (the azeotrope module's flag) */
} pw_report_az;

/* Everything computed from the fit (arrays of PW_REPORT_GRID points; NAN where a solve failed). */
typedef struct pw_report_curves {
    const pw_fit_result *fit;
    bool isothermal;
    double x[PW_REPORT_GRID];
    double bub_T[PW_REPORT_GRID], bub_P[PW_REPORT_GRID], bub_y[PW_REPORT_GRID];
    double dew_y[PW_REPORT_GRID], dew_T[PW_REPORT_GRID], dew_P[PW_REPORT_GRID];
    double lg1[PW_REPORT_GRID], lg2[PW_REPORT_GRID];
    size_t n_failed;                 /* equilibrium solves that failed (gaps) */
    pw_report_az az[PW_REPORT_MAX_AZ];
    size_t n_az;
    bool az_from_module;             /* false: the report's fallback search was used */
    /* column (when requested) */
    bool column;
    pw_column_spec spec;
    double P_col_Pa, factor, r_op;
    double col_y[PW_REPORT_GRID];    /* y*(x) at the column pressure */
    pw_report_az col_az[PW_REPORT_MAX_AZ];
    size_t n_col_az;
    pw_column_result col;
    pw_status col_status;            /* of pw_column_solve */
    double stages_op;                /* at r_op (pw_column_step) */
    int feed_stage_op;
    pw_profile profile_op;           /* stage profile at r_op (pw_cmo_profile); n = 0 if none */
    bool energy;                     /* pw_report_input.energy with a column */
    pw_status energy_status;         /* of the heat data, then of pw_energy_column_solve */
    char energy_error[PW_ERROR_MSG_MAX];
    pw_energy_result energy_res;
    pw_design_table energy_design;   /* design rows at the factors and the operating factor */
    double en_hL[PW_REPORT_GRID], en_HV[PW_REPORT_GRID]; /* saturated liquid at x, vapor at y = x,
                                                            J/mol (NAN where a solve failed) */
    double step_x[2 * PW_REPORT_MAX_STEPS + 2], step_y[2 * PW_REPORT_MAX_STEPS + 2];
    size_t n_step;
    double T_top_K, T_bottom_K;      /* bubble T of xd and xb at the column pressure */
    pw_az_result az_res, col_az_res; /* the azeotrope module's results behind az / col_az */
    bool az_res_ok, col_az_res_ok;
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

/* Short words for displaying conditions: "101.3 kPa", "323.15 K". */
void pw_report_condition(const pw_fit_result *r, char *buf, size_t len);

#endif
