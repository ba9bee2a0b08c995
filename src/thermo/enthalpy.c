/* Liquid and vapor enthalpies of a binary for energy balances; see include/pinchwise/enthalpy.h
 * and docs/thermo.md (section "Enthalpies"). */
#include <math.h>
#include <pinchwise/enthalpy.h>

#define P_NORMAL_PA 101325.0

pw_status pw_heat_data_from_system(const pw_system *sys, pw_heat_data *h, pw_error *err)
{
    if (!sys || !h)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "no system");
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &sys->comp[i];
        pw_status st = pw_component_require(c, PW_PROP_DHVAP, &h->dHvap[i], err);
        if (st == PW_OK)
            st = pw_component_require(c, PW_PROP_CPL, &h->cpL[i], err);
        if (st == PW_OK)
            st = pw_component_require(c, PW_PROP_CPV, &h->cpV[i], err);
        if (st != PW_OK)
            return st;
        st = pw_tsat(c, P_NORMAL_PA, &h->Tb_K[i]);
        if (st != PW_OK)
            return pw_error_set(err, st, NULL, 0,
                                "component '%s': no normal boiling point from its vapor-pressure "
                                "equation (%s)",
                                c->name, pw_strerror(st));
    }
    return PW_OK;
}

pw_status pw_enthalpy_liquid(const pw_system *sys, const pw_heat_data *h, double x1, double T_K,
                             double *h_Jmol)
{
    pw_activity a;
    pw_status st = pw_system_activity(sys, x1, T_K, &a);
    if (st != PW_OK)
        return st;
    double v = (x1 * h->cpL[0] + (1.0 - x1) * h->cpL[1]) * (T_K - PW_T0_ENTHALPY_K) + a.hE_Jmol;
    if (!isfinite(v))
        return PW_EDOM;
    *h_Jmol = v;
    return PW_OK;
}

double pw_enthalpy_vapor_pure(const pw_heat_data *h, int i, double T_K)
{
    return h->cpL[i] * (h->Tb_K[i] - PW_T0_ENTHALPY_K) + h->dHvap[i] +
           h->cpV[i] * (T_K - h->Tb_K[i]);
}

double pw_enthalpy_vapor(const pw_heat_data *h, double y1, double T_K)
{
    return y1 * pw_enthalpy_vapor_pure(h, 0, T_K) + (1.0 - y1) * pw_enthalpy_vapor_pure(h, 1, T_K);
}

pw_status pw_enthalpy_sat_liquid(const pw_system *sys, const pw_heat_data *h, double P_Pa,
                                 double x1, double *h_Jmol, double *T_K)
{
    pw_eq_point e;
    pw_status st = pw_bubble_T(sys, P_Pa, x1, &e);
    if (st != PW_OK)
        return st;
    if (T_K)
        *T_K = e.T_K;
    return pw_enthalpy_liquid(sys, h, x1, e.T_K, h_Jmol);
}

pw_status pw_enthalpy_sat_vapor(const pw_system *sys, const pw_heat_data *h, double P_Pa, double y1,
                                double *H_Jmol, double *T_K)
{
    pw_eq_point e;
    pw_status st = pw_dew_T(sys, P_Pa, y1, &e);
    if (st != PW_OK)
        return st;
    if (T_K)
        *T_K = e.T_K;
    *H_Jmol = pw_enthalpy_vapor(h, y1, e.T_K);
    return PW_OK;
}

pw_status pw_enthalpy_feed(const pw_system *sys, const pw_heat_data *h, double P_Pa, double z,
                           double q, double *h_F)
{
    double hl, hv;
    pw_status st = pw_enthalpy_sat_liquid(sys, h, P_Pa, z, &hl, NULL);
    if (st == PW_OK)
        st = pw_enthalpy_sat_vapor(sys, h, P_Pa, z, &hv, NULL);
    if (st == PW_OK)
        *h_F = hv - q * (hv - hl);
    return st;
}

double pw_latent_heat_mismatch(const pw_system *sys)
{
    double a, b;
    if (!sys || pw_component_require(&sys->comp[0], PW_PROP_DHVAP, &a, NULL) != PW_OK ||
        pw_component_require(&sys->comp[1], PW_PROP_DHVAP, &b, NULL) != PW_OK)
        return NAN;
    return fabs(a - b) / fmin(a, b);
}

bool pw_cmo_doubtful(const pw_system *sys)
{
    return pw_latent_heat_mismatch(sys) > PW_CMO_MISMATCH_MAX; /* NAN compares false */
}
