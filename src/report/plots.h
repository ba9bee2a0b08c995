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
    const char *id;               /* svg id; NULL = "plot-xy" */
    const char *name1;            /* component 1, for the axis labels */
    const char *condition;        /* e.g. "101.3 kPa" (shown in the title) */
    bool zoom;                    /* an enlarged view: only the window below is shown, no
                                     targets' labels, measured points outside it are left out */
    double win_x[2], win_y[2];    /* the window (zoom only) */
    const char *title;            /* zoom only: the title (NULL: "Near the pinch, enlarged") */
    pw_xyset curve;               /* model y*(x) */
    pw_xyset three_phase;         /* the three-phase vapor over the two-liquid region (flat);
                                     n = 0 for none */
    pw_xyset measured;            /* measured (x, y); n = 0 for none */
    const char *measured_label;   /* legend text of the measured points */
    pw_xyset azeotropes;          /* x = y points; n = 0 for none */
    bool column;                  /* draw the column construction below */
    pw_column_spec spec;
    bool feasible;
    double r_min, r_op, factor;   /* R_min, operating R, R/R_min */
    pw_pinch pinch;
    pw_xyset qline;               /* 2 points: (zF, zF) to where it meets the curve */
    pw_xyset op_min, op;          /* operating lines at R_min and at R: 3 points each */
    pw_xyset steps;               /* staircase vertices at r_op (alternating horizontal/vertical) */
    double stages;                /* stages counted at r_op (label) */
    /* the decanter scheme (a heterogeneous azeotrope between the targets) */
    bool decanter;
    double layers[2];             /* x_I, x_II of the decanter at the three-phase T */
    double y3;                    /* the three-phase vapor */
    pw_xyset dec_op[2], dec_steps[2]; /* each stripping column's operating line and staircase */
    double dec_boilup[2], dec_stages[2];
    int dec_only;                 /* 0: both columns; 1: column A only; 2: column B only */
} pw_plot_xy_in;

/* The x-y (McCabe-Thiele) diagram: diagonal, curve, data, and with column: q-line, operating
 * lines at R_min (dashed) and at the operating R, the stage steps, the targets xb, zf, xd, and
 * the pinch point labelled by kind, drawn last so no data marker covers it. With decanter: the
 * two-liquid region between the layers, the three-phase vapor, both stripping columns' operating
 * lines and staircases. With zoom: the same inside the window. */
pw_status pw_plot_xy(pw_sbuf *b, const pw_plot_xy_in *in);

typedef struct pw_plot_phase_in {
    const char *name1;
    const char *condition;        /* "at 101.3 kPa" / "at 50 C" */
    bool isothermal;              /* true: P-x-y; false: T-x-y */
    const char *unit;             /* symbol of T or P as drawn ("K", "\u00b0C", "kPa", "bar") */
    pw_xyset bubble;              /* (x1, T or P) */
    pw_xyset dew;                 /* (y1, T or P) */
    pw_xyset meas_liquid;         /* (x1, measured T or P) */
    pw_xyset meas_vapor;          /* (y1, measured T or P); n = 0 without y */
    pw_xyset azeotropes;          /* (x1, T or P) */
    pw_xyset binodal[2];          /* the layers x_I(T), x_II(T) below the three-phase line;
                                     n = 0 for none */
    pw_xyset layers;              /* the two layers on the three-phase line; n = 0 for none */
} pw_plot_phase_in;

/* T-x-y or P-x-y: bubble and dew curves of the model, measured liquid and vapor points,
 * azeotropes marked and labelled, and for liquids that split the layers and the binodal. */
pw_status pw_plot_phase(pw_sbuf *b, const pw_plot_phase_in *in);

#define PW_PLOT_MAX_MODELS 6

typedef struct pw_plot_models_in {
    const char *name1;
    const char *condition;
    bool isothermal;
    const char *unit;
    size_t n;                     /* models, at most PW_PLOT_MAX_MODELS */
    const char *label[PW_PLOT_MAX_MODELS];
    pw_xyset bubble[PW_PLOT_MAX_MODELS], dew[PW_PLOT_MAX_MODELS];
    pw_xyset meas_liquid, meas_vapor;
} pw_plot_models_in;

/* Every fitted model's bubble (solid) and dew (thin, same colour and dash) curves overlaid on one
 * T-x-y or P-x-y plot with the measured points; each model has its own colour and dash. */
pw_status pw_plot_models(pw_sbuf *b, const pw_plot_models_in *in);

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
