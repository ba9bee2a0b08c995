/* Vapor models: ideal gas and the truncated virial equation with Tsonopoulos coefficients.
 * Equations and sources: include/pinchwise/vapor.h and docs/thermo.md. */
#include <pinchwise/model.h>
#include <pinchwise/vapor.h>

#include <math.h>
#include <strings.h>

const char *pw_vapor_name(pw_vapor_model v) { return v == PW_VAPOR_VIRIAL ? "virial" : "ideal"; }

pw_status pw_vapor_parse(const char *name, pw_vapor_model *v)
{
    if (name && !strcasecmp(name, "ideal"))
        *v = PW_VAPOR_IDEAL;
    else if (name && !strcasecmp(name, "virial"))
        *v = PW_VAPOR_VIRIAL;
    else
        return PW_EINVAL;
    return PW_OK;
}

static const pw_comp_prop needed[] = {PW_PROP_TC, PW_PROP_PC, PW_PROP_OMEGA, PW_PROP_ZC,
                                      PW_PROP_VC};

pw_status pw_vapor_check(pw_vapor_model v, const pw_component *c1, const pw_component *c2,
                         pw_error *err)
{
    if (v == PW_VAPOR_IDEAL)
        return PW_OK;
    const pw_component *c[2] = {c1, c2};
    for (int i = 0; i < 2; i++)
        for (size_t k = 0; k < sizeof needed / sizeof needed[0]; k++) {
            pw_status st = pw_component_require(c[i], needed[k], NULL, err);
            if (st != PW_OK)
                return st;
        }
    return PW_OK;
}

/* B Pc / (R Tc) of Tsonopoulos (1974): f0 + omega f1 + a/Tr^6 - b/Tr^8. */
static double tsonopoulos_reduced(double Tr, double omega, double a, double b)
{
    double i1 = 1.0 / Tr, i2 = i1 * i1, i3 = i2 * i1, i6 = i3 * i3, i8 = i6 * i2;
    double f0 = 0.1445 - 0.330 * i1 - 0.1385 * i2 - 0.0121 * i3 - 0.000607 * i8;
    double f1 = 0.0637 + 0.331 * i2 - 0.423 * i3 - 0.008 * i8;
    return f0 + omega * f1 + a * i6 - b * i8;
}

/* The polar parameters default to 0 (the non-polar part alone) when unknown. */
static double polar(const pw_component *c, pw_comp_prop p)
{
    double v;
    return pw_component_require(c, p, &v, NULL) == PW_OK ? v : 0.0;
}

pw_status pw_virial_B_pure(const pw_component *c, double T_K, double *B)
{
    double Tc, Pc, omega;
    pw_status st;
    if ((st = pw_component_require(c, PW_PROP_TC, &Tc, NULL)) ||
        (st = pw_component_require(c, PW_PROP_PC, &Pc, NULL)) ||
        (st = pw_component_require(c, PW_PROP_OMEGA, &omega, NULL)))
        return st;
    if (!(T_K > 0.0) || !isfinite(T_K))
        return PW_EDOM;
    double red = tsonopoulos_reduced(T_K / Tc, omega, polar(c, PW_PROP_TS_A), polar(c, PW_PROP_TS_B));
    *B = red * PW_GAS_CONSTANT * Tc / Pc;
    return PW_OK;
}

pw_status pw_virial_B(const pw_component *c1, const pw_component *c2, double T_K, double B[3])
{
    pw_status st;
    if ((st = pw_virial_B_pure(c1, T_K, &B[0])) || (st = pw_virial_B_pure(c2, T_K, &B[1])))
        return st;
    double Tc[2], omega[2], Zc[2], Vc[2];
    const pw_component *c[2] = {c1, c2};
    for (int i = 0; i < 2; i++)
        if ((st = pw_component_require(c[i], PW_PROP_TC, &Tc[i], NULL)) ||
            (st = pw_component_require(c[i], PW_PROP_OMEGA, &omega[i], NULL)) ||
            (st = pw_component_require(c[i], PW_PROP_ZC, &Zc[i], NULL)) ||
            (st = pw_component_require(c[i], PW_PROP_VC, &Vc[i], NULL)))
            return st;
    /* combining rules with k12 = 0 */
    double Tc12 = sqrt(Tc[0] * Tc[1]);
    double omega12 = 0.5 * (omega[0] + omega[1]);
    double Zc12 = 0.5 * (Zc[0] + Zc[1]);
    double v = 0.5 * (cbrt(Vc[0]) + cbrt(Vc[1]));
    double Vc12 = v * v * v;
    double Pc12 = Zc12 * PW_GAS_CONSTANT * Tc12 / Vc12;
    B[2] = tsonopoulos_reduced(T_K / Tc12, omega12, 0.0, 0.0) * PW_GAS_CONSTANT * Tc12 / Pc12;
    return PW_OK;
}

void pw_vapor_phi(pw_vapor_model v, const double B[3], double T_K, double P_Pa, double y1,
                  const double Psat_Pa[2], double Phi[2])
{
    if (v != PW_VAPOR_VIRIAL) {
        Phi[0] = Phi[1] = 1.0;
        return;
    }
    double d12 = 2.0 * B[2] - B[0] - B[1], RT = PW_GAS_CONSTANT * T_K, y2 = 1.0 - y1;
    Phi[0] = exp((B[0] * (P_Pa - Psat_Pa[0]) + P_Pa * y2 * y2 * d12) / RT);
    Phi[1] = exp((B[1] * (P_Pa - Psat_Pa[1]) + P_Pa * y1 * y1 * d12) / RT);
}
