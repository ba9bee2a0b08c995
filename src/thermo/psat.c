/* Pure-component vapor pressure: Antoine (log10 or ln form, in the component's own units) and
 * IAPWS-IF97 region 4 for water (IAPWS R7-97(2012), equations 30 and 31). See docs/thermo.md. */
#include <pinchwise/component.h>
#include <pinchwise/units.h>

#include <math.h>

#define LN10 2.302585092994045684

/* IAPWS R7-97(2012), Table 34: coefficients n1..n10 of the saturation-line equation. */
static const double n[11] = {
    0.0,
    0.11670521452767e4,  -0.72421316703206e6, -0.17073846940092e2, 0.12020824702470e5,
    -0.32325550322333e7, 0.14915108613530e2,  -0.48232657361591e4, 0.40511340542057e6,
    -0.23855557567849,   0.65017534844798e3,
};

#define IF97_T_MIN 273.15
#define IF97_T_MAX 647.096
/* psat(273.15 K) from equation 30 itself (611.2127 Pa; the release rounds it to 611.213 Pa), so
 * that pw_iapws97_tsat accepts every value pw_iapws97_psat returns. */
#define IF97_P_MIN 611.212677
#define IF97_P_MAX 22.064e6

/* Equation 30 with its T-derivative: beta = (p/1 MPa)^(1/4) solves A beta^2 + B beta + C = 0. */
static pw_status if97_psat(double T_K, double *P_Pa, double *dlnP_dT)
{
    if (!isfinite(T_K) || T_K < IF97_T_MIN || T_K > IF97_T_MAX)
        return PW_ERANGE;
    double d = T_K - n[10];
    double th = T_K + n[9] / d;
    double A = th * th + n[1] * th + n[2];
    double B = n[3] * th * th + n[4] * th + n[5];
    double C = n[6] * th * th + n[7] * th + n[8];
    double beta = 2.0 * C / (-B + sqrt(B * B - 4.0 * A * C));
    double b2 = beta * beta;
    if (P_Pa)
        *P_Pa = b2 * b2 * 1e6;
    if (dlnP_dT) {
        /* Implicit differentiation of A beta^2 + B beta + C = 0 in theta. */
        double dA = 2.0 * th + n[1], dB = 2.0 * n[3] * th + n[4], dC = 2.0 * n[6] * th + n[7];
        double dbeta_dth = -(dA * b2 + dB * beta + dC) / (2.0 * A * beta + B);
        double dth_dT = 1.0 - n[9] / (d * d);
        *dlnP_dT = 4.0 / beta * dbeta_dth * dth_dT;
    }
    return PW_OK;
}

pw_status pw_iapws97_psat(double T_K, double *P_Pa)
{
    if (!P_Pa)
        return PW_EINVAL;
    return if97_psat(T_K, P_Pa, NULL);
}

/* Equation 31, the backward equation T(p). */
pw_status pw_iapws97_tsat(double P_Pa, double *T_K)
{
    if (!T_K)
        return PW_EINVAL;
    if (!isfinite(P_Pa) || P_Pa < IF97_P_MIN || P_Pa > IF97_P_MAX)
        return PW_ERANGE;
    double beta = sqrt(sqrt(P_Pa / 1e6));
    double E = beta * beta + n[3] * beta + n[6];
    double F = n[1] * beta * beta + n[4] * beta + n[7];
    double G = n[2] * beta * beta + n[5] * beta + n[8];
    double D = 2.0 * G / (-F - sqrt(F * F - 4.0 * E * G));
    double s = n[10] + D;
    *T_K = 0.5 * (s - sqrt(s * s - 4.0 * (n[9] + n[10] * D)));
    return PW_OK;
}

pw_status pw_component_prepare(pw_component *c)
{
    if (!c)
        return PW_EINVAL;
    pw_status st = pw_units_affine(PW_QTY_TEMPERATURE, c->T_unit, &c->T_scale, &c->T_offset);
    if (st == PW_OK)
        st = pw_units_affine(PW_QTY_PRESSURE, c->P_unit, &c->P_scale, &c->P_offset);
    if (st != PW_OK)
        c->T_scale = c->T_offset = c->P_scale = c->P_offset = 0.0;
    return st;
}

/* The unit maps of c: cached when prepared, looked up otherwise. */
static pw_status unit_maps(const pw_component *c, double *Ts, double *To, double *Ps, double *Po)
{
    if (c->T_scale > 0.0 && c->P_scale > 0.0) {
        *Ts = c->T_scale, *To = c->T_offset, *Ps = c->P_scale, *Po = c->P_offset;
        return PW_OK;
    }
    pw_status st = pw_units_affine(PW_QTY_TEMPERATURE, c->T_unit, Ts, To);
    return st == PW_OK ? pw_units_affine(PW_QTY_PRESSURE, c->P_unit, Ps, Po) : st;
}

pw_status pw_psat(const pw_component *c, double T_K, double *P_Pa, double *dlnP_dT)
{
    if (!c)
        return PW_EINVAL;
    if (!isfinite(T_K) || T_K <= 0.0)
        return PW_EDOM;
    if (c->equation == PW_PSAT_IAPWS_IF97)
        return if97_psat(T_K, P_Pa, dlnP_dT);

    double Ts, To, Ps, Po;
    pw_status st = unit_maps(c, &Ts, &To, &Ps, &Po);
    if (st != PW_OK)
        return st;
    double T_u = T_K / Ts - To; /* T_K = (T_u + To) * Ts */
    double den = T_u + c->C;
    if (!(den > 0.0))
        return PW_EDOM; /* at or beyond the Antoine pole */
    double base = c->log == PW_LN ? 1.0 : LN10;
    double lnP_u = base * (c->A - c->B / den);
    double P_u = exp(lnP_u);
    if (!isfinite(P_u) || P_u <= 0.0)
        return PW_EDOM;
    double P = (P_u + Po) * Ps;
    if (!isfinite(P) || P <= 0.0)
        return PW_EDOM;
    if (P_Pa)
        *P_Pa = P;
    if (dlnP_dT) {
        double dTu_dTK = 1.0 / Ts; /* 1 for K and C, 9/5 for F */
        *dlnP_dT = base * c->B / (den * den) * dTu_dTK;
    }
    return PW_OK;
}

pw_status pw_tsat(const pw_component *c, double P_Pa, double *T_K)
{
    if (!c || !T_K)
        return PW_EINVAL;
    if (!isfinite(P_Pa) || P_Pa <= 0.0)
        return PW_EDOM;
    if (c->equation == PW_PSAT_IAPWS_IF97)
        return pw_iapws97_tsat(P_Pa, T_K);
    double Ts, To, Ps, Po;
    pw_status st = unit_maps(c, &Ts, &To, &Ps, &Po);
    if (st != PW_OK)
        return st;
    double P_u = P_Pa / Ps - Po;
    if (!(P_u > 0.0))
        return PW_EDOM;
    double lg = c->log == PW_LN ? log(P_u) : log10(P_u);
    double den = c->A - lg;
    if (!(den != 0.0) || !isfinite(den))
        return PW_EDOM;
    double q = c->B / den; /* = T_u + C, must be > 0 */
    if (!(q > 0.0) || !isfinite(q))
        return PW_EDOM;
    double T = (q - c->C + To) * Ts;
    if (!isfinite(T) || T <= 0.0)
        return PW_EDOM;
    *T_K = T;
    return PW_OK;
}

double pw_component_range_excess_K(const pw_component *c, double T_K)
{
    if (!c)
        return 0.0;
    if (isfinite(c->T_min_K) && T_K < c->T_min_K)
        return T_K - c->T_min_K;
    if (isfinite(c->T_max_K) && T_K > c->T_max_K)
        return T_K - c->T_max_K;
    return 0.0;
}
