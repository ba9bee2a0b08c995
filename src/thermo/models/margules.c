/* Two-parameter Margules equation (Margules 1895; SVNA 7th ed. section 12.1):
 *   g = x1 x2 (A21 x1 + A12 x2),  ln gamma1 = x2^2 [A12 + 2 (A21 - A12) x1],
 *   ln gamma2 = x1^2 [A21 + 2 (A12 - A21) x2],  with A_ij(T) = A_ij T_ref / T.
 * Derivations in docs/thermo.md. */
#include "model_common.h"

#include <math.h>
#include <string.h>

static const char *const names[] = {"A12", "A21"};
static const char *const units[] = {"-", "-"};
static const double defaults[] = {0.0, 0.0};
static const bool fitted[] = {true, true};
/* Starts for the multistart fit: |A_ij| up to about 3 covers the liquids met in practice. */
static const double starts[][2] = {{-2.5, 3.0}, {-2.5, 3.0}};

static pw_status check(const double *p)
{
    return pw_model_params_finite(p, 2) ? PW_OK : PW_EDOM;
}

static pw_status eval(const double *p, double T_ref_K, double x1, double T_K, pw_activity *out)
{
    if (!out || check(p) != PW_OK || !pw_model_state_ok(x1, T_K) || !isfinite(T_ref_K)
        || T_ref_K <= 0.0)
        return PW_EDOM;
    memset(out, 0, sizeof *out);
    double x2 = 1.0 - x1;
    double s = T_ref_K / T_K;
    double a = p[0] * s, b = p[1] * s; /* A12(T), A21(T) */

    out->lngamma[0] = x2 * x2 * (a + 2.0 * (b - a) * x1);
    out->lngamma[1] = x1 * x1 * (b + 2.0 * (a - b) * x2);
    out->gE_RT = x1 * x2 * (b * x1 + a * x2);
    out->d2gE_dx2 = 2.0 * b * (1.0 - 3.0 * x1) + 2.0 * a * (3.0 * x1 - 2.0);
    /* Every term is proportional to 1/T. */
    for (int i = 0; i < 2; i++)
        out->dlngamma_dT[i] = -out->lngamma[i] / T_K;
    out->dlngamma_dp[0][0] = s * x2 * x2 * (1.0 - 2.0 * x1);
    out->dlngamma_dp[0][1] = s * x2 * x2 * 2.0 * x1;
    out->dlngamma_dp[1][0] = s * x1 * x1 * 2.0 * x2;
    out->dlngamma_dp[1][1] = s * x1 * x1 * (1.0 - 2.0 * x2);
    return pw_model_finish(out, x1, T_K);
}

/* ln gamma_i and d ln gamma_i/dT only: eval's expressions (pw_model_type.eval_lean). */
static pw_status eval_lean(const double *p, double T_ref_K, double x1, double T_K,
                           double lngamma[2], double dlngamma_dT[2])
{
    if (!pw_model_state_ok(x1, T_K) || !isfinite(T_ref_K) || T_ref_K <= 0.0)
        return PW_EDOM;
    double x2 = 1.0 - x1;
    double s = T_ref_K / T_K;
    double a = p[0] * s, b = p[1] * s;
    lngamma[0] = x2 * x2 * (a + 2.0 * (b - a) * x1);
    lngamma[1] = x1 * x1 * (b + 2.0 * (a - b) * x2);
    for (int i = 0; i < 2; i++)
        dlngamma_dT[i] = -lngamma[i] / T_K;
    return pw_model_lean_finish(lngamma, dlngamma_dT);
}

/* d2(G^E/RT)/dx1^2 at n compositions (pw_model_type.d2gE_dx2). */
static pw_status d2gE(const double *p, double T_ref_K, double T_K, size_t n, const double *x,
                      double *out)
{
    if (!pw_model_state_ok(0.5, T_K) || !isfinite(T_ref_K) || T_ref_K <= 0.0)
        return PW_EDOM;
    double s = T_ref_K / T_K;
    double a = p[0] * s, b = p[1] * s;
    for (size_t k = 0; k < n; k++) {
        double x1 = x[k];
        if (!pw_model_state_ok(x1, T_K))
            return PW_EDOM;
        out[k] = 2.0 * b * (1.0 - 3.0 * x1) + 2.0 * a * (3.0 * x1 - 2.0);
        if (!isfinite(out[k]))
            return PW_EDOM;
    }
    return PW_OK;
}

const pw_model_type pw_model_margules = {
    .name = "margules",
    .title = "Two-parameter Margules (Margules 1895), A_ij(T) = A_ij T_ref/T",
    .n_params = 2,
    .param_names = names,
    .param_units = units,
    .defaults = defaults,
    .fitted_default = fitted,
    .check = check,
    .eval = eval,
    .start_range = starts,
    .eval_lean = eval_lean,
    .d2gE_dx2 = d2gE,
};
