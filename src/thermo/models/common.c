/* Helpers shared by the activity models: input checks and the fields that follow from the
 * binary relations ln gamma1 = g + x2 dg/dx1, ln gamma2 = g - x1 dg/dx1 (docs/thermo.md). */
#include "model_common.h"

#include <math.h>

bool pw_model_state_ok(double x1, double T_K)
{
    return isfinite(x1) && x1 >= 0.0 && x1 <= 1.0 && isfinite(T_K) && T_K > 0.0;
}

bool pw_model_params_finite(const double *p, size_t n)
{
    if (!p)
        return false;
    for (size_t i = 0; i < n; i++)
        if (!isfinite(p[i]))
            return false;
    return true;
}

pw_status pw_model_finish(pw_activity *out, double x1, double T_K)
{
    double x2 = 1.0 - x1;
    out->dlngamma_dx1[0] = x2 * out->d2gE_dx2;
    out->dlngamma_dx1[1] = -x1 * out->d2gE_dx2;
    out->hE_Jmol = -PW_GAS_CONSTANT * T_K * T_K
                   * (x1 * out->dlngamma_dT[0] + x2 * out->dlngamma_dT[1]);
    bool ok = isfinite(out->gE_RT) && isfinite(out->d2gE_dx2) && isfinite(out->hE_Jmol);
    for (int i = 0; i < 2; i++) {
        ok = ok && isfinite(out->lngamma[i]) && isfinite(out->dlngamma_dx1[i])
             && isfinite(out->dlngamma_dT[i]);
        for (int j = 0; j < PW_MAX_PARAMS; j++)
            ok = ok && isfinite(out->dlngamma_dp[i][j]);
    }
    return ok ? PW_OK : PW_EDOM;
}

pw_status pw_model_lean_finish(const double lngamma[2], const double dlngamma_dT[2])
{
    bool ok = isfinite(lngamma[0]) && isfinite(lngamma[1]) && isfinite(dlngamma_dT[0]) &&
              isfinite(dlngamma_dT[1]);
    return ok ? PW_OK : PW_EDOM;
}
