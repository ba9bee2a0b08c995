/* Activity-coefficient models for binary liquids, as const type descriptors.
 *
 * Every model gives, at (x1, T) and parameter vector p, ln gamma_i with their derivatives in x1
 * (at constant T, x2 = 1 - x1), in T (at constant x) and in each parameter, G^E/RT, its second
 * composition derivative (for the phase-stability test) and H^E from Gibbs-Helmholtz.
 * Parameter sets and temperature forms (see docs/thermo.md):
 *   margules  A12, A21 [-] at T_ref;  A_ij(T) = A_ij * T_ref / T
 *   vanlaar   A12, A21 [-] at T_ref;  A_ij(T) = A_ij * T_ref / T
 *   wilson    dlambda12_K, dlambda21_K [K] (Delta lambda_ij/R), V2_V1 [-] (fixed, from V_L);
 *             L12 = V2_V1 exp(-dlambda12/T), L21 = exp(-dlambda21/T)/V2_V1
 *   nrtl      dg12_K, dg21_K [K] (Delta g_ij/R), alpha [-] (fixed by default);
 *             tau_ij = dg_ij/T, G_ij = exp(-alpha tau_ij)
 * (fit files written before the rename hold a12_K, a21_K and b12_K, b21_K; they still read)
 *   uniquac   du12_K, du21_K [K], r1, q1, r2, q2 [-] (fixed, from the components' r and q);
 *             z = 10, tau_ij = exp(-du_ij/T)
 * Everything the rest of the program needs to know of a model comes from its descriptor: names,
 * units, defaults, start ranges of the fit, parameters taken from component data, older names
 * accepted in fit files. Adding a model means one new file in src/thermo/models and one line in
 * the table (src/thermo/model_table.c); no list of model names exists elsewhere. */
#ifndef PINCHWISE_MODEL_H
#define PINCHWISE_MODEL_H

#include <pinchwise/component.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

#define PW_MAX_PARAMS 6
/* Room for a model's terms that do not depend on T (pw_model_type.lean_x). */
#define PW_LEAN_XTERMS 12
#define PW_GAS_CONSTANT 8.314462618 /* J/(mol K), CODATA 2018 exact value */

typedef struct pw_activity {
    double lngamma[2];
    double dlngamma_dx1[2];                 /* at constant T */
    double dlngamma_dT[2];                  /* at constant x, 1/K */
    double dlngamma_dp[2][PW_MAX_PARAMS];   /* at constant x and T */
    double gE_RT;                           /* G^E/(RT) */
    double d2gE_dx2;                        /* d^2(G^E/RT)/dx1^2 */
    double hE_Jmol;                         /* H^E = -R T^2 d(G^E/RT)/dT, J/mol */
} pw_activity;

typedef struct pw_model_type {
    const char *name;   /* command-line name, e.g. "nrtl" (pw_model_names lists them all) */
    const char *title;  /* for reports, with its published origin */
    size_t n_params;
    const char *const *param_names;
    const char *const *param_units;
    const double *defaults;       /* start or fixed values */
    const bool *fitted_default;   /* which parameters a fit adjusts by default */
    /* PW_OK when p is in the model's domain (e.g. van Laar A12, A21 of one sign, alpha > 0). */
    pw_status (*check)(const double *p);
    /* Evaluates at x1 in [0,1], T > 0; PW_EDOM outside or for p outside the domain. */
    pw_status (*eval)(const double *p, double T_ref_K, double x1, double T_K, pw_activity *out);
    /* Range [lo, hi] from which the multistart fit draws each fitted parameter's starts. */
    const double (*start_range)[2];
    /* True when the fitted parameters must share one sign (van Laar): each start draws one sign
     * for all of them and keeps them at least 0.05 away from zero. */
    bool starts_same_sign;
    /* Older names of each parameter (an entry may be NULL; the array may be NULL): fit files
     * written with them still read (pw_model_param_lookup). */
    const char *const *param_aliases;
    /* Sets the parameters that come from pure-component data and are held fixed (Wilson's volume
     * ratio from V_L, UNIQUAC's r and q); NULL when the model takes none. PW_ENOTFOUND, with err
     * naming the component and the missing column, when a needed constant is unknown. */
    pw_status (*from_components)(const pw_component *c1, const pw_component *c2, double *p,
                                 pw_error *err);
    /* Optional lean evaluation for the solvers' inner loops (bubble points of the fit): ln
     * gamma_i and d ln gamma_i/dT at (x1, T), the same values eval gives to the bit, without
     * the parameter and composition derivatives and without eval's parameter check; p must have
     * passed check. PW_EDOM where a result is not finite. NULL: the solvers use eval. */
    pw_status (*eval_lean)(const double *p, double T_ref_K, double x1, double T_K,
                           double lngamma[2], double dlngamma_dT[2]);
    /* Optional: d^2(G^E/RT)/dx1^2 at the n compositions x1[k] at one T (the stability scan),
     * the same values as eval's d2gE_dx2 to the bit; p must have passed check. PW_EDOM where a
     * value is not finite. NULL: the scan uses eval. */
    pw_status (*d2gE_dx2)(const double *p, double T_ref_K, double T_K, size_t n,
                          const double *x1, double *out);
    /* Optional, both or neither, with eval_lean: eval_lean in two parts for a solver that holds
     * x1 while T moves (the bubble temperature's Newton steps). lean_x stores in xt
     * (PW_LEAN_XTERMS doubles) the terms at x1 that do not depend on T; eval_lean_x gives from
     * them eval_lean's values and status at (x1, T_K) to the bit. p must have passed check.
     * NULL: the solvers use eval_lean. */
    void (*lean_x)(const double *p, double x1, double *xt);
    pw_status (*eval_lean_x)(const double *p, double T_ref_K, double x1, const double *xt,
                             double T_K, double lngamma[2], double dlngamma_dT[2]);
} pw_model_type;

extern const pw_model_type pw_model_margules;
extern const pw_model_type pw_model_vanlaar;
extern const pw_model_type pw_model_wilson;
extern const pw_model_type pw_model_nrtl;
extern const pw_model_type pw_model_uniquac;

/* The model called name (any case), or NULL. */
const pw_model_type *pw_model_find(const char *name);

/* Writes the models' names, ", "-separated in table order ("margules, vanlaar, ..."), to buf
 * (truncated to len - 1 characters) and returns buf. For messages and help texts. */
char *pw_model_names(char *buf, size_t len);

/* All models, in a fixed order; *n receives their count. */
const pw_model_type *const *pw_model_all(size_t *n);

/* Index of a parameter by name, or -1. */
int pw_model_param_index(const pw_model_type *m, const char *name);

/* Index of a parameter by name or by one of its older names (param_aliases), or -1. */
int pw_model_param_lookup(const pw_model_type *m, const char *name);

#ifdef __cplusplus
}
#endif
#endif
