/* Binary vapor-liquid equilibrium: y_i Phi_i P = x_i gamma_i P_i^sat, with Phi_i = 1 for the
 * ideal vapor (modified Raoult's law) or from the virial equation (include/pinchwise/vapor.h).
 *
 * A pw_system is a plain value: two components, an activity model and its parameters. All
 * solvers are bracketed and safeguarded (GSL roots); each returns a status and never a silent
 * unconverged number. T in K, P in Pa, mole fractions of component 1. */
#ifndef PINCHWISE_EQUILIBRIUM_H
#define PINCHWISE_EQUILIBRIUM_H

#include <pinchwise/component.h>
#include <pinchwise/model.h>
#include <pinchwise/status.h>
#include <pinchwise/vapor.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Two liquids that the fitted data show: the three-phase points of the data set (a run of points
 * boiling at one temperature with one vapor, docs/heterogeneous.md section 4), whether the model
 * represents them or not. Their overall compositions span [x_lo, x_hi]; the layers themselves lie
 * at or beyond these ends. T_K and P_Pa: the mean measured condition of those points. n = 0 (a
 * zeroed struct, the default): the data show none, or the system was not built from a fit. */
typedef struct pw_measured_split {
    size_t n;
    double x_lo, x_hi;
    double T_K, P_Pa;
} pw_measured_split;

typedef struct pw_system {
    pw_component comp[2];
    const pw_model_type *model;
    double params[PW_MAX_PARAMS];
    double T_ref_K; /* reference temperature of the Margules / van Laar temperature form */
    pw_vapor_model vapor; /* PW_VAPOR_IDEAL (0, the default) or PW_VAPOR_VIRIAL */
    pw_measured_split measured; /* filled from the fit (pw_fit_measured_split); used by the
                                 * single column's guard (pw_column_solve_system) */
} pw_system;

/* One equilibrium state. */
typedef struct pw_eq_point {
    double x1, y1, T_K, P_Pa;
    double gamma[2], Psat_Pa[2];
    int iterations;
    double Phi[2]; /* vapor correction factors (1 for the ideal vapor) */
} pw_eq_point;

/* Activity of the liquid at (x1, T); forwards the model's status. */
pw_status pw_system_activity(const pw_system *s, double x1, double T_K, pw_activity *out);

/* Bubble temperature at P for liquid x1 (and the vapor y1). PW_ENOBRACKET when no temperature
 * in the search range satisfies the equation, PW_EMAXITER / PW_ENOCONV otherwise. */
pw_status pw_bubble_T(const pw_system *s, double P_Pa, double x1, pw_eq_point *out);
/* The same, with the Newton iteration started at T_guess_K (e.g. a measured temperature or the
 * previous point of a curve); NAN or a non-positive guess means none. Same result, fewer steps. */
pw_status pw_bubble_T_from(const pw_system *s, double P_Pa, double x1, double T_guess_K,
                           pw_eq_point *out);
/* pw_bubble_T_from (the same point, to the bit) and the slope dy1/dx1 of the isobaric y*(x) there,
 * by implicit differentiation of the bubble-point condition (docs/thermo.md). Exact for the ideal
 * vapor; for the virial vapor the fugacity coefficients are held constant in the derivative. */
pw_status pw_bubble_T_slope_from(const pw_system *s, double P_Pa, double x1, double T_guess_K,
                                 pw_eq_point *out, double *dy1_dx1);
/* Bubble pressure at T for liquid x1 (explicit; no iteration). */
pw_status pw_bubble_P(const pw_system *s, double T_K, double x1, pw_eq_point *out);
/* Dew temperature at P for vapor y1 (and the liquid x1). */
pw_status pw_dew_T(const pw_system *s, double P_Pa, double y1, pw_eq_point *out);
/* Dew pressure at T for vapor y1. */
pw_status pw_dew_P(const pw_system *s, double T_K, double y1, pw_eq_point *out);
/* The same two, with the safeguarded Newton iteration on the liquid x1 started at x_guess (and,
 * at fixed P, the inner bubble-point Newton at T_guess_K), e.g. interpolated from a tabulated
 * bubble curve; NAN (or a guess outside (0, 1), or a non-positive T) means none, as above. The
 * same root to the solver's tolerance (|dx1| <= 1e-13), fewer steps. */
pw_status pw_dew_T_from(const pw_system *s, double P_Pa, double y1, double x_guess,
                        double T_guess_K, pw_eq_point *out);
pw_status pw_dew_P_from(const pw_system *s, double T_K, double y1, double x_guess,
                        pw_eq_point *out);

/* Liquid-phase stability at T: scans D(x1) = d^2(G_mix/RT)/dx1^2 = 1/(x1 x2) + d^2(G^E/RT)/dx1^2
 * over 0 < x1 < 1 (grid of at least 400 points, refined at the minimum) and returns the
 * minimum and where it is. min_D < 0 means the model predicts a liquid-liquid split. */
pw_status pw_stability_min(const pw_system *s, double T_K, double *min_D, double *x_at_min);

#ifdef __cplusplus
}
#endif
#endif
