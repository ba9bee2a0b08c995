/* van Laar equation (van Laar 1910; SVNA 7th ed. section 12.2):
 *   g = A12 A21 x1 x2 / (A12 x1 + A21 x2),  ln gamma1 = A12 [A21 x2 / (A12 x1 + A21 x2)]^2,
 *   ln gamma2 = A21 [A12 x1 / (A12 x1 + A21 x2)]^2,  with A_ij(T) = A_ij T_ref / T.
 * A12 and A21 must have one sign (else the denominator vanishes inside (0,1)); A12 = A21 = 0 is
 * the ideal solution. Derivations in docs/thermo.md. */
#include "model_common.h"

#include <math.h>
#include <string.h>

static const char *const names[] = {"A12", "A21"};
static const char *const units[] = {"-", "-"};
static const double defaults[] = {1.0, 1.0};
static const bool fitted[] = {true, true};
/* Starts for the multistart fit; both constants take one sign (starts_same_sign). */
static const double starts[][2] = {{-2.5, 3.0}, {-2.5, 3.0}};

static pw_status check(const double *p)
{
    if (!pw_model_params_finite(p, 2))
        return PW_EDOM;
    if (p[0] == 0.0 && p[1] == 0.0)
        return PW_OK; /* ideal solution */
    if ((p[0] > 0.0 && p[1] > 0.0) || (p[0] < 0.0 && p[1] < 0.0))
        return PW_OK;
    return PW_EDOM;
}

static pw_status eval(const double *p, double T_ref_K, double x1, double T_K, pw_activity *out)
{
    if (!out || check(p) != PW_OK || !pw_model_state_ok(x1, T_K) || !isfinite(T_ref_K)
        || T_ref_K <= 0.0)
        return PW_EDOM;
    memset(out, 0, sizeof *out);
    double x2 = 1.0 - x1;
    double s = T_ref_K / T_K;
    if (p[0] == 0.0 && p[1] == 0.0) {
        /* Ideal solution. g is homogeneous of degree 1 in (A12, A21), so it has no derivative
         * at the origin; we return the directional limit along A12 = A21, which is the same
         * for every point on that diagonal (see docs/thermo.md). */
        out->dlngamma_dp[0][0] = s * x2 * x2 * (x2 - x1);
        out->dlngamma_dp[0][1] = s * 2.0 * x1 * x2 * x2;
        out->dlngamma_dp[1][0] = s * 2.0 * x1 * x1 * x2;
        out->dlngamma_dp[1][1] = s * x1 * x1 * (x1 - x2);
        return pw_model_finish(out, x1, T_K);
    }
    double a = p[0] * s, b = p[1] * s; /* A12(T), A21(T) */
    double D = a * x1 + b * x2;         /* never 0: a, b of one sign */
    double z1 = b * x2 / D, z2 = a * x1 / D;
    double D3 = D * D * D;

    out->lngamma[0] = a * z1 * z1;
    out->lngamma[1] = b * z2 * z2;
    out->gE_RT = a * b * x1 * x2 / D;
    out->d2gE_dx2 = -2.0 * a * a * b * b / D3;
    for (int i = 0; i < 2; i++)
        out->dlngamma_dT[i] = -out->lngamma[i] / T_K; /* g homogeneous of degree 1 in 1/T */
    /* d/da, d/db of the ln gammas at the effective (a, b); these are homogeneous of degree 0,
     * so d/dA_ij = s d/da_ij. */
    out->dlngamma_dp[0][0] = s * b * b * x2 * x2 * (b * x2 - a * x1) / D3;
    out->dlngamma_dp[0][1] = s * 2.0 * a * a * b * x1 * x2 * x2 / D3;
    out->dlngamma_dp[1][0] = s * 2.0 * a * b * b * x1 * x1 * x2 / D3;
    out->dlngamma_dp[1][1] = s * a * a * x1 * x1 * (a * x1 - b * x2) / D3;
    return pw_model_finish(out, x1, T_K);
}

/* ln gamma_i and d ln gamma_i/dT only: eval's expressions (pw_model_type.eval_lean). */
static pw_status eval_lean(const double *p, double T_ref_K, double x1, double T_K,
                           double lngamma[2], double dlngamma_dT[2])
{
    if (!pw_model_state_ok(x1, T_K) || !isfinite(T_ref_K) || T_ref_K <= 0.0)
        return PW_EDOM;
    if (p[0] == 0.0 && p[1] == 0.0) { /* ideal solution */
        lngamma[0] = lngamma[1] = dlngamma_dT[0] = dlngamma_dT[1] = 0.0;
        return PW_OK;
    }
    double x2 = 1.0 - x1;
    double s = T_ref_K / T_K;
    double a = p[0] * s, b = p[1] * s;
    double D = a * x1 + b * x2;
    double z1 = b * x2 / D, z2 = a * x1 / D;
    lngamma[0] = a * z1 * z1;
    lngamma[1] = b * z2 * z2;
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
    bool ideal = p[0] == 0.0 && p[1] == 0.0;
    double s = T_ref_K / T_K;
    double a = p[0] * s, b = p[1] * s;
    for (size_t k = 0; k < n; k++) {
        double x1 = x[k], x2 = 1.0 - x1;
        if (!pw_model_state_ok(x1, T_K))
            return PW_EDOM;
        if (ideal) {
            out[k] = 0.0;
            continue;
        }
        double D = a * x1 + b * x2;
        double D3 = D * D * D;
        out[k] = -2.0 * a * a * b * b / D3;
        if (!isfinite(out[k]))
            return PW_EDOM;
    }
    return PW_OK;
}

const pw_model_type pw_model_vanlaar = {
    .name = "vanlaar",
    .title = "van Laar (van Laar 1910), A_ij(T) = A_ij T_ref/T",
    .n_params = 2,
    .param_names = names,
    .param_units = units,
    .defaults = defaults,
    .fitted_default = fitted,
    .check = check,
    .eval = eval,
    .start_range = starts,
    .starts_same_sign = true,
    .eval_lean = eval_lean,
    .d2gE_dx2 = d2gE,
};
