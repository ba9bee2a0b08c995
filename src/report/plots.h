/* Private: the report's plot builders. Each takes plain arrays (not owned, not kept) and appends
 * one complete <svg> element to a pw_sbuf. Mole fractions are of component 1; temperatures in K,
 * pressures in kPa (as drawn). Non-finite values in any array are skipped or break the line, so
 * failed equilibrium solves can be passed as NAN. Returns PW_ENOMEM when the buffer failed,
 * PW_EINVAL for an unusable range (for instance every value NAN). */
#ifndef PW_REPORT_PLOTS_H
#define PW_REPORT_PLOTS_H

#include "report/svg.h"

#include <pinchwise/column.h>
#include <stdbool.h>
#include <stddef.h>

/* A curve or point set: n pairs. */
typedef struct pw_xyset {
    const double *x, *y;
    size_t n;
} pw_xyset;

typedef struct pw_plot_xy_in {
    const char *name1;            /* component 1, for the axis labels */
    const char *condition;        /* e.g. "101.3 kPa" (shown in the title) */
    pw_xyset curve;               /* model y*(x) */
    pw_xyset measured;            /* measured (x, y); n = 0 for none */
    const char *measured_label;   /* legend text of the measured points */
    pw_xyset azeotropes;          /* x = y points; n = 0 for none */
    bool column;                  /* draw the column construction below */
    pw_column_spec spec;
    bool feasible;
    double r_min, r_op, factor;   /* R_min, operating R, R/R_min */
    pw_pinch pinch;
    double x_q, y_q;              /* q-line meets the curve */
    pw_xyset steps;               /* staircase vertices at r_op (alternating horizontal/vertical) */
    double stages;                /* stages counted at r_op (label) */
} pw_plot_xy_in;

/* The x-y (McCabe-Thiele) diagram: diagonal, curve, data, and with column: q-line, operating
 * lines at R_min (dashed) and at the operating R, the pinch point labelled by kind, the stage
 * steps, and the targets xb, zf, xd. */
pw_status pw_plot_xy(pw_sbuf *b, const pw_plot_xy_in *in);

typedef struct pw_plot_phase_in {
    const char *name1;
    const char *condition;        /* "at 101.3 kPa" / "at 50 C" */
    bool isothermal;              /* true: P-x-y in kPa; false: T-x-y in K */
    pw_xyset bubble;              /* (x1, T or P) */
    pw_xyset dew;                 /* (y1, T or P) */
    pw_xyset meas_liquid;         /* (x1, measured T or P) */
    pw_xyset meas_vapor;          /* (y1, measured T or P); n = 0 without y */
    pw_xyset azeotropes;          /* (x1, T or P) */
} pw_plot_phase_in;

/* T-x-y or P-x-y: bubble and dew curves of the model, measured liquid and vapor points,
 * azeotropes marked and labelled. */
pw_status pw_plot_phase(pw_sbuf *b, const pw_plot_phase_in *in);

typedef struct pw_plot_resid_in {
    const char *id;               /* SVG id, e.g. "residual-y" */
    const char *title;
    const char *ylabel;           /* with unit, e.g. "T(calc) - T(meas) / K" */
    const char *name1;
    pw_xyset used;                /* (x1, residual) of points in the fit */
    pw_xyset excluded;            /* (x1, residual) of points left out */
    double band;                  /* +/- one measurement sigma drawn as a band; NAN for none */
} pw_plot_resid_in;

/* Residuals (calculated - measured) against x1, zero line and the +/- sigma band. */
pw_status pw_plot_residuals(pw_sbuf *b, const pw_plot_resid_in *in);

typedef struct pw_plot_lngamma_in {
    const char *name1, *name2;
    const char *condition;
    pw_xyset model1, model2;      /* (x1, ln gamma_i) of the model */
    pw_xyset exp1, exp2;          /* (x1, ln gamma_i) derived from each measured point */
} pw_plot_lngamma_in;

/* ln gamma1 and ln gamma2 against x1: model curves and the points from the measurements. */
pw_status pw_plot_lngamma(pw_sbuf *b, const pw_plot_lngamma_in *in);

typedef struct pw_plot_enthalpy_in {
    const char *name1;
    const char *condition;        /* "at 101.3 kPa" */
    pw_xyset liquid;              /* (x1, saturated-liquid enthalpy kJ/mol) */
    pw_xyset vapor;               /* (y1, saturated-vapor enthalpy kJ/mol) */
    pw_xyset feed;                /* (zf, h_F) */
    pw_xyset tie;                 /* the limiting tie line at R_min: 2 points; n = 0 for none */
    const char *tie_label;
} pw_plot_enthalpy_in;

/* Enthalpy-composition diagram of the energy-balance column: saturated liquid and vapor, the
 * feed point, the tie line that limits the reflux. */
pw_status pw_plot_enthalpy(pw_sbuf *b, const pw_plot_enthalpy_in *in);

typedef struct pw_plot_band_in {
    const char *id, *title, *xlabel, *ylabel;
    const pw_xyset *curves;       /* sampled curves (e.g. from parameter draws) */
    size_t n_curves;
    const char *curves_label;     /* legend text of the sampled curves; NULL = "N sampled curves" */
    pw_xyset central;             /* the best-fit curve drawn on top; n = 0 for none */
    double x_lo, x_hi, y_lo, y_hi;/* window; NAN = from the data */
    pw_xyset marks;               /* points to mark (e.g. pinch points); n = 0 for none */
    const char *mark_label;
    pw_xyset line;                /* a straight-line construction (e.g. the operating lines at
                                     R_min), dashed, clipped to the window; n = 0 for none */
    const char *line_label;
} pw_plot_band_in;

/* A band of sampled curves (thin, translucent) with the central curve on top, in a window
 * (for the neighbourhood of a pinch). Entry point for the uncertainty report. */
pw_status pw_plot_band(pw_sbuf *b, const pw_plot_band_in *in);

#endif
