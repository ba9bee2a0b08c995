/* The vapor phase: ideal gas, or the virial equation truncated after the second coefficient.
 *
 * With the virial vapor the equilibrium condition is the gamma-phi form
 *     y_i Phi_i P = x_i gamma_i P_i^sat,
 *     Phi_i = exp[(B_ii (P - P_i^sat) + P y_j^2 delta_12) / (R T)],  delta_12 = 2 B_12 - B_11 - B_22
 * (Poynting factor taken as 1), second virial coefficients from Tsonopoulos (1974, AIChE J.
 * 20:263-272) with its polar term where the component data give tsonopoulos_a / tsonopoulos_b,
 * the cross coefficient by the combining rules of Smith, Van Ness & Abbott (Introduction to
 * Chemical Engineering Thermodynamics, 7th ed., 2005, eq. 11.70-11.73; from memory) with
 * k12 = 0 and no polar term for the cross pair. Units SI: B in m3/mol. See docs/thermo.md. */
#ifndef PINCHWISE_VAPOR_H
#define PINCHWISE_VAPOR_H

#include <pinchwise/component.h>
#include <pinchwise/status.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum { PW_VAPOR_IDEAL = 0, PW_VAPOR_VIRIAL = 1 } pw_vapor_model;

/* "ideal" or "virial"; and back (PW_EINVAL for any other name, case-insensitive). */
const char *pw_vapor_name(pw_vapor_model v);
pw_status pw_vapor_parse(const char *name, pw_vapor_model *v);

/* PW_OK when both components carry what the vapor model needs (virial: Tc_K, Pc_kPa, omega,
 * Zc, Vc_cm3_mol); otherwise PW_ENOTFOUND with err naming the component and the column. */
pw_status pw_vapor_check(pw_vapor_model v, const pw_component *c1, const pw_component *c2,
                         pw_error *err);

/* Tsonopoulos second virial coefficient of a pure component [m3/mol] at T [K].
 * PW_ENOTFOUND when Tc, Pc or omega is unknown; PW_EDOM for T <= 0. */
pw_status pw_virial_B_pure(const pw_component *c, double T_K, double *B);

/* B_11, B_22 and the cross coefficient B_12 [m3/mol] at T. */
pw_status pw_virial_B(const pw_component *c1, const pw_component *c2, double T_K, double B[3]);

/* Phi_1, Phi_2 of the form above at T, P and vapor y1, with P_i^sat given; for the ideal vapor
 * both are 1. B as from pw_virial_B (ignored for the ideal vapor). */
void pw_vapor_phi(pw_vapor_model v, const double B[3], double T_K, double P_Pa, double y1,
                  const double Psat_Pa[2], double Phi[2]);

#ifdef __cplusplus
}
#endif
#endif
