/* Legendre-polynomial G^E of Fredenslund, Gmehling & Rasmussen (1977, Vapor-Liquid Equilibria
 * Using UNIFAC, Elsevier), as an internal activity model for the point test:
 *     g = G^E/RT = x1 x2 S(z),  S(z) = sum_k a_k L_k(z),  z = 2 x1 - 1
 *     dg/dx1 = -z S + (1 - z^2)/2 S'        ln gamma1 = g + x2 dg/dx1, ln gamma2 = g - x1 dg/dx1
 * The a_k are dimensionless and independent of T (so H^E = 0; see docs/consistency.md). */
#include "consistency_internal.h"

#include <math.h>

/* L_k(z), L_k'(z), L_k''(z) for k < n by the three-term recurrence
 * (k+1) L_{k+1} = (2k+1) z L_k - k L_{k-1} and L'_{k+1} = L'_{k-1} + (2k+1) L_k (also for L''). */
static void legendre_basis(double z, size_t n, double *L, double *dL, double *d2L)
{
    for (size_t k = 0; k < n; k++) {
        if (k == 0) {
            L[0] = 1.0, dL[0] = 0.0, d2L[0] = 0.0;
        } else if (k == 1) {
            L[1] = z, dL[1] = 1.0, d2L[1] = 0.0;
        } else {
            double j = (double)(k - 1);
            L[k] = ((2.0 * j + 1.0) * z * L[k - 1] - j * L[k - 2]) / (j + 1.0);
            dL[k] = dL[k - 2] + (2.0 * j + 1.0) * L[k - 1];
            d2L[k] = d2L[k - 2] + (2.0 * j + 1.0) * dL[k - 1];
        }
    }
}

static pw_status legendre_check(const double *p, size_t n)
{
    for (size_t k = 0; k < n; k++)
        if (!isfinite(p[k]))
            return PW_EDOM;
    return PW_OK;
}

static pw_status legendre_eval(const double *p, size_t n, double x1, double T_K, pw_activity *out)
{
    if (!(x1 >= 0.0 && x1 <= 1.0) || !(T_K > 0.0) || !isfinite(T_K) || !out)
        return PW_EDOM;
    if (legendre_check(p, n) != PW_OK)
        return PW_EDOM;
    double L[PW_CONSISTENCY_MAX_TERMS], dL[PW_CONSISTENCY_MAX_TERMS], d2L[PW_CONSISTENCY_MAX_TERMS];
    double z = 2.0 * x1 - 1.0, x2 = 1.0 - x1, w = (1.0 - z * z) / 4.0; /* w = x1 x2 */
    legendre_basis(z, n, L, dL, d2L);
    double S = 0.0, dS = 0.0, d2S = 0.0;
    for (size_t k = 0; k < n; k++) {
        S += p[k] * L[k];
        dS += p[k] * dL[k];
        d2S += p[k] * d2L[k];
    }
    double g = w * S;
    double dg = -z * S + 2.0 * w * dS;                            /* d g / d x1 */
    double d2g = 4.0 * (-S / 2.0 - z * dS + w * d2S);             /* d2 g / d x1^2 */
    *out = (pw_activity){0};
    out->lngamma[0] = g + x2 * dg;
    out->lngamma[1] = g - x1 * dg;
    out->dlngamma_dx1[0] = x2 * d2g;
    out->dlngamma_dx1[1] = -x1 * d2g;
    out->gE_RT = g;
    out->d2gE_dx2 = d2g;
    for (size_t k = 0; k < n; k++) {
        double dgk = w * L[k];
        double ddgk = -z * L[k] + 2.0 * w * dL[k];
        out->dlngamma_dp[0][k] = dgk + x2 * ddgk;
        out->dlngamma_dp[1][k] = dgk - x1 * ddgk;
    }
    return PW_OK;
}

/* The temperature form G^E/RT(x, T) = (T_ref / T) G^E/RT(x, T_ref), the form of this project's
 * Margules and van Laar constants (docs/thermo.md): zero excess entropy, H^E = G^E. Applied when
 * T_ref > 0 (isobaric reductions, whose points span a range of temperatures); T_ref = T leaves the
 * series as it is (isothermal data). */
static void legendre_temperature(pw_activity *out, size_t n, double T_ref_K, double T_K)
{
    if (!(T_ref_K > 0.0) || T_ref_K == T_K)
        return;
    double f = T_ref_K / T_K;
    for (int i = 0; i < 2; i++) {
        out->lngamma[i] *= f;
        out->dlngamma_dx1[i] *= f;
        out->dlngamma_dT[i] = -out->lngamma[i] / T_K;
        for (size_t k = 0; k < n; k++)
            out->dlngamma_dp[i][k] *= f;
    }
    out->gE_RT *= f;
    out->d2gE_dx2 *= f;
    out->hE_Jmol = PW_GAS_CONSTANT * T_K * out->gE_RT;
}

static const char *const legendre_names[PW_MAX_PARAMS] = {"a0", "a1", "a2", "a3", "a4", "a5"};
static const char *const legendre_units[PW_MAX_PARAMS] = {"-", "-", "-", "-", "-", "-"};
static const double legendre_zero[PW_MAX_PARAMS] = {0.0};
static const bool legendre_fitted[PW_MAX_PARAMS] = {true, true, true, true, true, true};
static const double legendre_starts[PW_MAX_PARAMS][2] = {{-2.5, 3.0}, {-2.5, 3.0}, {-2.5, 3.0},
                                                         {-2.5, 3.0}, {-2.5, 3.0}, {-2.5, 3.0}};

#define LEGENDRE_TYPE(N)                                                                          \
    static pw_status legendre_check_##N(const double *p) { return legendre_check(p, N); }        \
    static pw_status legendre_eval_##N(const double *p, double T_ref_K, double x1, double T_K,   \
                                       pw_activity *out)                                          \
    {                                                                                             \
        pw_status st = legendre_eval(p, N, x1, T_K, out);                                         \
        if (st == PW_OK)                                                                          \
            legendre_temperature(out, N, T_ref_K, T_K);                                           \
        return st;                                                                                \
    }                                                                                             \
    static const pw_model_type legendre_##N = {                                                   \
        "legendre" #N, "Legendre series G^E, " #N " terms (Fredenslund, Gmehling & Rasmussen 1977)", \
        N, legendre_names, legendre_units, legendre_zero, legendre_fitted, legendre_check_##N,   \
        legendre_eval_##N, legendre_starts, false, NULL, NULL, NULL, NULL, NULL, NULL};

LEGENDRE_TYPE(1)
LEGENDRE_TYPE(2)
LEGENDRE_TYPE(3)
LEGENDRE_TYPE(4)
LEGENDRE_TYPE(5)

const pw_model_type *pw_cs_legendre_model(size_t n_terms)
{
    static const pw_model_type *const table[] = {NULL, &legendre_1, &legendre_2, &legendre_3,
                                                 &legendre_4, &legendre_5};
    return n_terms >= 1 && n_terms <= PW_CONSISTENCY_MAX_TERMS ? table[n_terms] : NULL;
}
