/* NRTL equation (Renon & Prausnitz 1968, AIChE J. 14:135), index convention of Renon-Prausnitz
 * and SVNA: tau12 = (g12 - g22)/RT = dg12_K/T, tau21 = (g21 - g11)/RT = dg21_K/T (dg_ij_K is
 * Delta g_ij/R in kelvin; fit files written before the rename call them b12_K, b21_K),
 * G_ij = exp(-alpha tau_ij), one alpha for the pair:
 *   g = x1 x2 [tau21 G21/(x1 + x2 G21) + tau12 G12/(x2 + x1 G12)].
 * Derivations in docs/thermo.md. */
#include "model_common.h"

#include <math.h>
#include <string.h>

static const char *const names[] = {"dg12_K", "dg21_K", "alpha"};
static const char *const aliases[] = {"b12_K", "b21_K", NULL};
static const char *const units[] = {"K", "K", "-"};
static const double defaults[] = {0.0, 0.0, 0.3};
static const bool fitted[] = {true, true, false};
/* Starts for the multistart fit: tau_ij from about -2 to 7 near 350 K; alpha over the range
 * Renon & Prausnitz (1968) found for real mixtures. */
static const double starts[][2] = {{-700.0, 2500.0}, {-700.0, 2500.0}, {0.1, 0.6}};

static pw_status check(const double *p)
{
    if (!pw_model_params_finite(p, 3) || !(p[2] > 0.0))
        return PW_EDOM;
    return PW_OK;
}

/* The terms eval and eval_lean share, in one order (the same bits for both): tau_ij, G_ij,
 * ln gamma_i, the partial derivatives in G_ij and the total ones in tau_ij. */
typedef struct nrtl_terms {
    double t12, t21, G12, G21, D1, D2, D1c, D2c;
    double lng[2];
    double g1_G12, g1_G21, g2_G12, g2_G21;
    double d1_t12, d1_t21, d2_t12, d2_t21;
} nrtl_terms;

static pw_status terms_at(const double *p, double x1, double T_K, nrtl_terms *t)
{
    double x2 = 1.0 - x1;
    double al = p[2];
    double t12 = p[0] / T_K, t21 = p[1] / T_K;
    double G12 = exp(-al * t12), G21 = exp(-al * t21);
    if (!isfinite(G12) || !isfinite(G21) || !(G12 > 0.0) || !(G21 > 0.0))
        return PW_EDOM;
    double D1 = x1 + x2 * G21, D2 = x2 + x1 * G12;
    double D1s = D1 * D1, D2s = D2 * D2, D1c = D1s * D1, D2c = D2s * D2;
    double xx1 = x1 * x1, xx2 = x2 * x2;
    *t = (nrtl_terms){.t12 = t12, .t21 = t21, .G12 = G12, .G21 = G21, .D1 = D1, .D2 = D2,
                      .D1c = D1c, .D2c = D2c};
    t->lng[0] = xx2 * (t21 * G21 * G21 / D1s + t12 * G12 / D2s);
    t->lng[1] = xx1 * (t12 * G12 * G12 / D2s + t21 * G21 / D1s);
    /* Partial derivatives at constant x in tau_ij and G_ij taken as independent. */
    double g1_t21 = xx2 * G21 * G21 / D1s, g1_G21 = xx2 * 2.0 * t21 * G21 * x1 / D1c;
    double g1_t12 = xx2 * G12 / D2s, g1_G12 = xx2 * t12 * (x2 - G12 * x1) / D2c;
    double g2_t12 = xx1 * G12 * G12 / D2s, g2_G12 = xx1 * 2.0 * t12 * G12 * x2 / D2c;
    double g2_t21 = xx1 * G21 / D1s, g2_G21 = xx1 * t21 * (x1 - G21 * x2) / D1c;
    t->g1_G12 = g1_G12, t->g1_G21 = g1_G21, t->g2_G12 = g2_G12, t->g2_G21 = g2_G21;
    /* Total derivatives in tau_ij at fixed alpha (dG_ij/dtau_ij = -alpha G_ij). */
    t->d1_t12 = g1_t12 - al * G12 * g1_G12, t->d1_t21 = g1_t21 - al * G21 * g1_G21;
    t->d2_t12 = g2_t12 - al * G12 * g2_G12, t->d2_t21 = g2_t21 - al * G21 * g2_G21;
    return PW_OK;
}

/* d ln gamma_i/dT from the terms (dtau_ij/dT = -tau_ij/T). */
static void terms_dT(const nrtl_terms *t, double T_K, double dT[2])
{
    dT[0] = -(t->t12 * t->d1_t12 + t->t21 * t->d1_t21) / T_K;
    dT[1] = -(t->t12 * t->d2_t12 + t->t21 * t->d2_t21) / T_K;
}

static pw_status eval(const double *p, double T_ref_K, double x1, double T_K, pw_activity *out)
{
    (void)T_ref_K;
    if (!out || check(p) != PW_OK || !pw_model_state_ok(x1, T_K))
        return PW_EDOM;
    memset(out, 0, sizeof *out);
    nrtl_terms t;
    if (terms_at(p, x1, T_K, &t) != PW_OK)
        return PW_EDOM;
    double x2 = 1.0 - x1;
    out->lngamma[0] = t.lng[0];
    out->lngamma[1] = t.lng[1];
    out->gE_RT = x1 * x2 * (t.t21 * t.G21 / t.D1 + t.t12 * t.G12 / t.D2);
    out->d2gE_dx2 = -2.0 * t.t21 * t.G21 * t.G21 / t.D1c - 2.0 * t.t12 * t.G12 * t.G12 / t.D2c;
    /* in tau_ij (per 1/T), and in alpha (dG_ij/dalpha = -tau_ij G_ij) */
    out->dlngamma_dp[0][0] = t.d1_t12 / T_K;
    out->dlngamma_dp[0][1] = t.d1_t21 / T_K;
    out->dlngamma_dp[0][2] = -t.t12 * t.G12 * t.g1_G12 - t.t21 * t.G21 * t.g1_G21;
    out->dlngamma_dp[1][0] = t.d2_t12 / T_K;
    out->dlngamma_dp[1][1] = t.d2_t21 / T_K;
    out->dlngamma_dp[1][2] = -t.t12 * t.G12 * t.g2_G12 - t.t21 * t.G21 * t.g2_G21;
    terms_dT(&t, T_K, out->dlngamma_dT);
    return pw_model_finish(out, x1, T_K);
}

/* ln gamma_i and d ln gamma_i/dT only (pw_model_type.eval_lean): eval's terms. */
static pw_status eval_lean(const double *p, double T_ref_K, double x1, double T_K,
                           double lngamma[2], double dlngamma_dT[2])
{
    (void)T_ref_K;
    if (!pw_model_state_ok(x1, T_K))
        return PW_EDOM;
    nrtl_terms t;
    if (terms_at(p, x1, T_K, &t) != PW_OK)
        return PW_EDOM;
    lngamma[0] = t.lng[0];
    lngamma[1] = t.lng[1];
    terms_dT(&t, T_K, dlngamma_dT);
    return pw_model_lean_finish(lngamma, dlngamma_dT);
}

/* d2(G^E/RT)/dx1^2 at n compositions, one T: G12, G21 once. */
static pw_status d2gE(const double *p, double T_ref_K, double T_K, size_t n, const double *x,
                      double *out)
{
    (void)T_ref_K;
    if (!pw_model_state_ok(0.5, T_K))
        return PW_EDOM;
    double al = p[2];
    double t12 = p[0] / T_K, t21 = p[1] / T_K;
    double G12 = exp(-al * t12), G21 = exp(-al * t21);
    if (!isfinite(G12) || !isfinite(G21) || !(G12 > 0.0) || !(G21 > 0.0))
        return PW_EDOM;
    for (size_t k = 0; k < n; k++) {
        double x1 = x[k], x2 = 1.0 - x1;
        if (!pw_model_state_ok(x1, T_K))
            return PW_EDOM;
        double D1 = x1 + x2 * G21, D2 = x2 + x1 * G12;
        double D1s = D1 * D1, D2s = D2 * D2, D1c = D1s * D1, D2c = D2s * D2;
        out[k] = -2.0 * t21 * G21 * G21 / D1c - 2.0 * t12 * G12 * G12 / D2c;
        if (!isfinite(out[k]))
            return PW_EDOM;
    }
    return PW_OK;
}

const pw_model_type pw_model_nrtl = {
    .name = "nrtl",
    .title = "NRTL (Renon & Prausnitz 1968), tau_ij = dg_ij/T, one alpha",
    .n_params = 3,
    .param_names = names,
    .param_units = units,
    .defaults = defaults,
    .fitted_default = fitted,
    .check = check,
    .eval = eval,
    .start_range = starts,
    .param_aliases = aliases,
    .eval_lean = eval_lean,
    .d2gE_dx2 = d2gE,
};
