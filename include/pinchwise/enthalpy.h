/* Enthalpies of a binary liquid and vapor for energy balances (the project's enthalpy model):
 *
 *   h_L(x, T) = sum_i x_i cpL_i (T - T0) + H^E(x, T),           T0 = 298.15 K
 *   H_i^V(T) = cpL_i (Tb_i - T0) + dHvap_i + cpV_i (T - Tb_i),  H_V(y, T) = sum_i y_i H_i^V(T)
 *
 * reference state: pure liquids at T0; H^E from the activity model's temperature dependence
 * (Gibbs-Helmholtz, pw_activity.hE_Jmol); Tb_i where the component's own vapor-pressure
 * equation gives 101.325 kPa; ideal vapor mixing and ideal-gas enthalpies. J/mol, K.
 * See docs/thermo.md. */
#ifndef PINCHWISE_ENTHALPY_H
#define PINCHWISE_ENTHALPY_H

#include <pinchwise/equilibrium.h>
#include <pinchwise/status.h>

#ifdef __cplusplus
extern "C" {
#endif

#define PW_T0_ENTHALPY_K 298.15

typedef struct pw_heat_data {
    double Tb_K[2];        /* normal boiling points from the components' own equations */
    double dHvap[2];       /* J/mol at Tb */
    double cpL[2], cpV[2]; /* J/(mol K) */
} pw_heat_data;

/* Reads dHvap, cpL, cpV of both components and finds Tb. PW_ENOTFOUND with err naming the
 * component and the missing column; the status of pw_tsat otherwise. */
pw_status pw_heat_data_from_system(const pw_system *sys, pw_heat_data *h, pw_error *err);

/* Liquid enthalpy at (x1, T): forwards the activity model's status. */
pw_status pw_enthalpy_liquid(const pw_system *sys, const pw_heat_data *h, double x1, double T_K,
                             double *h_Jmol);

/* Pure vapor i at T and the ideal vapor mixture of composition y1. */
double pw_enthalpy_vapor_pure(const pw_heat_data *h, int i, double T_K);
double pw_enthalpy_vapor(const pw_heat_data *h, double y1, double T_K);

/* Saturated liquid of composition x1 at its bubble point and saturated vapor of composition
 * y1 at its dew point, at P. T_K (may be NULL) receives the temperature. */
pw_status pw_enthalpy_sat_liquid(const pw_system *sys, const pw_heat_data *h, double P_Pa,
                                 double x1, double *h_Jmol, double *T_K);
pw_status pw_enthalpy_sat_vapor(const pw_system *sys, const pw_heat_data *h, double P_Pa, double y1,
                                double *H_Jmol, double *T_K);

/* The feed's enthalpy from its thermal condition q: h_F = H_V - q (H_V - h_L), with h_L the
 * saturated liquid of composition z at its bubble point and H_V the saturated vapor of
 * composition z at its dew point. */
pw_status pw_enthalpy_feed(const pw_system *sys, const pw_heat_data *h, double P_Pa, double z,
                           double q, double *h_F);

/* |dHvap_1 - dHvap_2| / min(dHvap_1, dHvap_2), or NAN when either is unknown: constant molal
 * overflow is doubtful above about PW_CMO_MISMATCH_MAX (common practice). */
double pw_latent_heat_mismatch(const pw_system *sys);

#define PW_CMO_MISMATCH_MAX 0.10

/* Whether the heats of vaporization differ by more than PW_CMO_MISMATCH_MAX (false when either
 * is unknown): the constant-molal-overflow column is then doubtful and the energy balance
 * advisable. */
bool pw_cmo_doubtful(const pw_system *sys);

#ifdef __cplusplus
}
#endif
#endif
