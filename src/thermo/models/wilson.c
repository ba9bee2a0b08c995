/* Wilson equation (G. M. Wilson 1964, J. Am. Chem. Soc. 86:127):
 *   g = -x1 ln(x1 + L12 x2) - x2 ln(x2 + L21 x1)
 *   L12 = V2_V1 exp(-dlambda12_K/T),  L21 = exp(-dlambda21_K/T) / V2_V1,
 * dlambda_ij_K = (lambda_ij - lambda_ii)/R in kelvin (called a12_K, a21_K in fit files written
 * before the rename), V2_V1 the ratio of pure-liquid molar volumes
 * (held constant). Derivations in docs/thermo.md. */
#include "model_common.h"

#include <math.h>
#include <string.h>

static const char *const names[] = {"dlambda12_K", "dlambda21_K", "V2_V1"};
static const char *const aliases[] = {"a12_K", "a21_K", NULL};
static const char *const units[] = {"K", "K", "-"};
static const double defaults[] = {0.0, 0.0, 1.0};
static const bool fitted[] = {true, true, false};
/* Starts for the multistart fit (Lambda_ij from about exp(-7) to exp(2) near 350 K); the volume
 * ratio is taken from the components and held fixed. */
static const double starts[][2] = {{-700.0, 2500.0}, {-700.0, 2500.0}, {0.2, 5.0}};

/* V2_V1 from the components' liquid molar volumes (V_L); 1 when either is unknown. */
static pw_status from_components(const pw_component *c1, const pw_component *c2, double *p,
                                 pw_error *err)
{
    (void)err;
    double v1 = c1 ? c1->V_L_cm3mol : (double)NAN, v2 = c2 ? c2->V_L_cm3mol : (double)NAN;
    double r = v2 / v1;
    p[2] = isfinite(r) && r > 0.0 ? r : 1.0;
    return PW_OK;
}

static pw_status check(const double *p)
{
    if (!pw_model_params_finite(p, 3) || !(p[2] > 0.0))
        return PW_EDOM;
    return PW_OK;
}

/* The terms eval and eval_lean share, in one order (the same bits for both): Lambda_ij, the sums
 * S_i, ln gamma_i, the partial derivatives of ln gamma_i in Lambda_ij and d ln gamma_i/dT. */
typedef struct wilson_terms {
    double L12, L21, S1, S2;
    double lng[2], dT[2];
    double g1_L12, g1_L21, g2_L12, g2_L21;
} wilson_terms;

static pw_status terms_at(const double *p, double x1, double T_K, wilson_terms *t)
{
    double x2 = 1.0 - x1;
    double r = p[2];
    double L12 = r * exp(-p[0] / T_K), L21 = exp(-p[1] / T_K) / r;
    if (!isfinite(L12) || !isfinite(L21) || !(L12 > 0.0) || !(L21 > 0.0))
        return PW_EDOM;
    double S1 = x1 + L12 * x2, S2 = x2 + L21 * x1;
    double C = L12 / S1 - L21 / S2;
    *t = (wilson_terms){.L12 = L12, .L21 = L21, .S1 = S1, .S2 = S2};
    t->lng[0] = -log(S1) + x2 * C;
    t->lng[1] = -log(S2) - x1 * C;
    /* Partial derivatives of ln gamma_i in L12 and L21 at constant x. */
    t->g1_L12 = -L12 * x2 * x2 / (S1 * S1), t->g1_L21 = -x2 * x2 / (S2 * S2);
    t->g2_L12 = -x1 * x1 / (S1 * S1), t->g2_L21 = -L21 * x1 * x1 / (S2 * S2);
    /* dL12/dT = L12 a12/T^2, dL21/dT = L21 a21/T^2. */
    double L12_T = L12 * p[0] / (T_K * T_K), L21_T = L21 * p[1] / (T_K * T_K);
    t->dT[0] = t->g1_L12 * L12_T + t->g1_L21 * L21_T;
    t->dT[1] = t->g2_L12 * L12_T + t->g2_L21 * L21_T;
    return PW_OK;
}

static pw_status eval(const double *p, double T_ref_K, double x1, double T_K, pw_activity *out)
{
    (void)T_ref_K;
    if (!out || check(p) != PW_OK || !pw_model_state_ok(x1, T_K))
        return PW_EDOM;
    memset(out, 0, sizeof *out);
    wilson_terms t;
    if (terms_at(p, x1, T_K, &t) != PW_OK)
        return PW_EDOM;
    double x2 = 1.0 - x1;
    double r = p[2], L12 = t.L12, L21 = t.L21, S1 = t.S1, S2 = t.S2;
    double v = 1.0 - L12, u = L21 - 1.0;
    out->lngamma[0] = t.lng[0];
    out->lngamma[1] = t.lng[1];
    out->gE_RT = -x1 * log(S1) - x2 * log(S2);
    out->d2gE_dx2 = -2.0 * v / S1 + x1 * v * v / (S1 * S1) + 2.0 * u / S2
                    + x2 * u * u / (S2 * S2);
    out->dlngamma_dT[0] = t.dT[0];
    out->dlngamma_dT[1] = t.dT[1];
    /* dL12/da12 = -L12/T, dL21/da21 = -L21/T, dL12/dr = L12/r, dL21/dr = -L21/r. */
    out->dlngamma_dp[0][0] = -t.g1_L12 * L12 / T_K;
    out->dlngamma_dp[0][1] = -t.g1_L21 * L21 / T_K;
    out->dlngamma_dp[0][2] = (t.g1_L12 * L12 - t.g1_L21 * L21) / r;
    out->dlngamma_dp[1][0] = -t.g2_L12 * L12 / T_K;
    out->dlngamma_dp[1][1] = -t.g2_L21 * L21 / T_K;
    out->dlngamma_dp[1][2] = (t.g2_L12 * L12 - t.g2_L21 * L21) / r;
    return pw_model_finish(out, x1, T_K);
}

/* ln gamma_i and d ln gamma_i/dT only (pw_model_type.eval_lean): eval's terms. */
static pw_status eval_lean(const double *p, double T_ref_K, double x1, double T_K,
                           double lngamma[2], double dlngamma_dT[2])
{
    (void)T_ref_K;
    if (!pw_model_state_ok(x1, T_K))
        return PW_EDOM;
    wilson_terms t;
    if (terms_at(p, x1, T_K, &t) != PW_OK)
        return PW_EDOM;
    for (int i = 0; i < 2; i++) {
        lngamma[i] = t.lng[i];
        dlngamma_dT[i] = t.dT[i];
    }
    return pw_model_lean_finish(lngamma, dlngamma_dT);
}

/* d2(G^E/RT)/dx1^2 at n compositions (pw_model_type.d2gE_dx2): L12, L21 once. */
static pw_status d2gE(const double *p, double T_ref_K, double T_K, size_t n, const double *x,
                      double *out)
{
    (void)T_ref_K;
    if (!pw_model_state_ok(0.5, T_K))
        return PW_EDOM;
    double r = p[2];
    double L12 = r * exp(-p[0] / T_K), L21 = exp(-p[1] / T_K) / r;
    if (!isfinite(L12) || !isfinite(L21) || !(L12 > 0.0) || !(L21 > 0.0))
        return PW_EDOM;
    double v = 1.0 - L12, u = L21 - 1.0;
    for (size_t k = 0; k < n; k++) {
        double x1 = x[k], x2 = 1.0 - x1;
        if (!pw_model_state_ok(x1, T_K))
            return PW_EDOM;
        double S1 = x1 + L12 * x2, S2 = x2 + L21 * x1;
        out[k] = -2.0 * v / S1 + x1 * v * v / (S1 * S1) + 2.0 * u / S2
                 + x2 * u * u / (S2 * S2);
        if (!isfinite(out[k]))
            return PW_EDOM;
    }
    return PW_OK;
}

const pw_model_type pw_model_wilson = {
    .name = "wilson",
    .title = "Wilson (Wilson 1964), L12 = V2_V1 exp(-dlambda12/T), L21 = exp(-dlambda21/T)/V2_V1",
    .n_params = 3,
    .param_names = names,
    .param_units = units,
    .defaults = defaults,
    .fitted_default = fitted,
    .check = check,
    .eval = eval,
    .start_range = starts,
    .param_aliases = aliases,
    .from_components = from_components,
    .eval_lean = eval_lean,
    .d2gE_dx2 = d2gE,
};
