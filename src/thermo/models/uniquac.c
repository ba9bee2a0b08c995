/* UNIQUAC equation (Abrams & Prausnitz 1975, AIChE J. 21:116), binary, coordination number
 * z = 10, in the Staverman-Guggenheim form of the combinatorial part:
 *   ln gamma_i = ln(J_i) + 1 - J_i - (z/2) q_i [ln(J_i/L_i) + 1 - J_i/L_i]       (combinatorial)
 *              + q_i [1 - ln(sum_j theta_j tau_ji)
 *                     - sum_j theta_j tau_ij / sum_k theta_k tau_kj]                (residual)
 * with J_i = r_i / sum_j r_j x_j (= Phi_i/x_i), L_i = q_i / sum_j q_j x_j (= theta_i/x_i),
 * tau_ij = exp(-du_ij_K/T), du_ij_K = (u_ij - u_jj)/R in kelvin (fitted), and the pure-component
 * volume and area parameters r_i, q_i taken from the component data and held fixed.
 * Parameters: du12_K, du21_K, r1, q1, r2, q2. Derivations in docs/thermo.md. */
#include "model_common.h"

#include <math.h>
#include <string.h>

#define Z_HALF 5.0 /* z/2, coordination number z = 10 (Abrams & Prausnitz 1975) */

static const char *const names[] = {"du12_K", "du21_K", "r1", "q1", "r2", "q2"};
static const char *const units[] = {"K", "K", "-", "-", "-", "-"};
static const double defaults[] = {0.0, 0.0, 1.0, 1.0, 1.0, 1.0};
static const bool fitted[] = {true, true, false, false, false, false};
/* Starts for the multistart fit: tau_ij from about exp(-4) to exp(2) near 350 K. */
static const double starts[][2] = {{-600.0, 1500.0}, {-600.0, 1500.0}, {0.5, 10.0},
                                   {0.5, 10.0},      {0.5, 10.0},      {0.5, 10.0}};

/* r and q of both components from the component data (columns r and q). */
static pw_status from_components(const pw_component *c1, const pw_component *c2, double *p,
                                 pw_error *err)
{
    const pw_component *c[2] = {c1, c2};
    for (int i = 0; i < 2; i++) {
        pw_status st = pw_component_require(c[i], PW_PROP_R, &p[2 + 2 * i], err);
        if (st == PW_OK)
            st = pw_component_require(c[i], PW_PROP_Q, &p[3 + 2 * i], err);
        if (st != PW_OK)
            return st;
    }
    return PW_OK;
}

static pw_status check(const double *p)
{
    if (!pw_model_params_finite(p, 6))
        return PW_EDOM;
    for (int k = 2; k < 6; k++)
        if (!(p[k] > 0.0))
            return PW_EDOM;
    return PW_OK;
}

/* The terms eval, eval_lean, eval_lean_x and the scan function share, in one order (the same
 * bits for all). At x1 alone (uniquac_xterms): the sums Rb = sum r_j x_j, Qb = sum q_j x_j, the
 * combinatorial part and ln Qb. At x1 and T (uniquac_terms): tau_ij, A = Qb (theta1 + theta2
 * tau21), B = Qb (theta2 + theta1 tau12), the residual part, ln gamma_i, the partial derivatives
 * of ln gamma_i in tau_ij and d ln gamma_i/dT. */
typedef struct uniquac_xterms {
    double Rb, Qb, JL1, JL2, S1, S2, c1, c2, lnQb;
} uniquac_xterms;
_Static_assert(sizeof(uniquac_xterms) <= PW_LEAN_XTERMS * sizeof(double),
               "uniquac_xterms fits in PW_LEAN_XTERMS doubles");

typedef struct uniquac_terms {
    double t12, t21, A, B, F1, F2;
    double lng[2], dT[2];
    double g1_t12, g1_t21, g2_t21, g2_t12;
} uniquac_terms;

/* tau12 = exp(-du12/T), tau21 = exp(-du21/T); PW_EDOM unless both are finite and positive. */
static pw_status taus_at(const double *p, double T_K, double *t12, double *t21)
{
    *t12 = exp(-p[0] / T_K), *t21 = exp(-p[1] / T_K);
    if (!isfinite(*t12) || !isfinite(*t21) || !(*t12 > 0.0) || !(*t21 > 0.0))
        return PW_EDOM;
    return PW_OK;
}

/* Rb = r1 x1 + r2 x2 and Qb = q1 x1 + q2 x2. */
static void rq_sums(const double *p, double x1, double x2, double *Rb, double *Qb)
{
    *Rb = p[2] * x1 + p[4] * x2, *Qb = p[3] * x1 + p[5] * x2;
}

/* A = Qb (theta1 + theta2 tau21) = q1 x1 + q2 x2 tau21, B = q2 x2 + q1 x1 tau12. */
static void ab_sums(const double *p, double x1, double x2, double t12, double t21, double *A,
                    double *B)
{
    *A = p[3] * x1 + p[5] * x2 * t21, *B = p[5] * x2 + p[3] * x1 * t12;
}

/* d2(G^E/RT)/dx1^2: G^E/RT = linear(x) - ln Rb + (z/2) Qb (ln Rb - ln Qb)
 * - q1 x1 ln A - q2 x2 ln B + Qb ln Qb (docs/thermo.md). */
static double d2gE_at(const double *p, double x1, double x2, double t12, double t21, double Rb,
                      double Qb, double A, double B)
{
    const double r1 = p[2], q1 = p[3], r2 = p[4], q2 = p[5];
    double dR = r1 - r2, dQ = q1 - q2, dA = q1 - q2 * t21, dB = q1 * t12 - q2;
    double comb = dR * dR / (Rb * Rb) +
                  Z_HALF * (2.0 * dQ * dR / Rb - Qb * dR * dR / (Rb * Rb) - dQ * dQ / Qb);
    double res = -2.0 * q1 * dA / A + q1 * x1 * dA * dA / (A * A) + 2.0 * q2 * dB / B +
                 q2 * x2 * dB * dB / (B * B) + dQ * dQ / Qb;
    return comb + res;
}

static void xterms_at(const double *p, double x1, uniquac_xterms *c)
{
    const double r1 = p[2], q1 = p[3], r2 = p[4], q2 = p[5];
    double x2 = 1.0 - x1;
    double Rb, Qb;
    rq_sums(p, x1, x2, &Rb, &Qb);
    /* combinatorial part, S_i = ln(J_i/L_i) + 1 - J_i/L_i */
    double J1 = r1 / Rb, J2 = r2 / Rb, JL1 = r1 * Qb / (q1 * Rb), JL2 = r2 * Qb / (q2 * Rb);
    double S1 = log(JL1) + 1.0 - JL1, S2 = log(JL2) + 1.0 - JL2;
    *c = (uniquac_xterms){.Rb = Rb, .Qb = Qb, .JL1 = JL1, .JL2 = JL2, .S1 = S1, .S2 = S2};
    c->c1 = log(J1) + 1.0 - J1 - Z_HALF * q1 * S1;
    c->c2 = log(J2) + 1.0 - J2 - Z_HALF * q2 * S2;
    c->lnQb = log(Qb);
}

static pw_status terms_at(const double *p, double x1, double T_K, const uniquac_xterms *c,
                          uniquac_terms *t)
{
    const double q1 = p[3], q2 = p[5];
    double x2 = 1.0 - x1;
    double t12, t21;
    if (taus_at(p, T_K, &t12, &t21) != PW_OK)
        return PW_EDOM;
    double A, B;
    ab_sums(p, x1, x2, t12, t21, &A, &B);
    /* residual part, F_i = 1 - ln(A or B) + ln Qb - ... */
    double F1 = 1.0 - log(A) + c->lnQb - q1 * x1 / A - q2 * x2 * t12 / B;
    double F2 = 1.0 - log(B) + c->lnQb - q2 * x2 / B - q1 * x1 * t21 / A;
    *t = (uniquac_terms){.t12 = t12, .t21 = t21, .A = A, .B = B, .F1 = F1, .F2 = F2};
    t->lng[0] = c->c1 + q1 * F1;
    t->lng[1] = c->c2 + q2 * F2;

    /* in tau12 and tau21 */
    t->g1_t12 = -q1 * q2 * q2 * x2 * x2 / (B * B);
    t->g1_t21 = -q1 * q2 * q2 * x2 * x2 * t21 / (A * A);
    t->g2_t21 = -q2 * q1 * q1 * x1 * x1 / (A * A);
    t->g2_t12 = -q2 * q1 * q1 * x1 * x1 * t12 / (B * B);
    /* dtau_ij/dT = tau_ij du_ij/T^2 */
    double t12_T = t12 * p[0] / (T_K * T_K), t21_T = t21 * p[1] / (T_K * T_K);
    t->dT[0] = t->g1_t12 * t12_T + t->g1_t21 * t21_T;
    t->dT[1] = t->g2_t12 * t12_T + t->g2_t21 * t21_T;
    return PW_OK;
}

static pw_status eval(const double *p, double T_ref_K, double x1, double T_K, pw_activity *out)
{
    (void)T_ref_K;
    if (!out || check(p) != PW_OK || !pw_model_state_ok(x1, T_K))
        return PW_EDOM;
    memset(out, 0, sizeof *out);
    uniquac_xterms c;
    uniquac_terms t;
    xterms_at(p, x1, &c);
    if (terms_at(p, x1, T_K, &c, &t) != PW_OK)
        return PW_EDOM;
    const double r1 = p[2], q1 = p[3], r2 = p[4], q2 = p[5];
    double x2 = 1.0 - x1;
    double t12 = t.t12, t21 = t.t21, Rb = c.Rb, Qb = c.Qb, A = t.A, B = t.B;
    double JL1 = c.JL1, JL2 = c.JL2, S1 = c.S1, S2 = c.S2, F1 = t.F1, F2 = t.F2;
    out->lngamma[0] = t.lng[0];
    out->lngamma[1] = t.lng[1];
    out->gE_RT = x1 * out->lngamma[0] + x2 * out->lngamma[1];
    out->d2gE_dx2 = d2gE_at(p, x1, x2, t12, t21, Rb, Qb, A, B);

    out->dlngamma_dT[0] = t.dT[0];
    out->dlngamma_dT[1] = t.dT[1];
    /* in du12 and du21: dtau_ij/ddu_ij = -tau_ij/T */
    out->dlngamma_dp[0][0] = -t.g1_t12 * t12 / T_K;
    out->dlngamma_dp[0][1] = -t.g1_t21 * t21 / T_K;
    out->dlngamma_dp[1][0] = -t.g2_t12 * t12 / T_K;
    out->dlngamma_dp[1][1] = -t.g2_t21 * t21 / T_K;

    /* in r1 and r2 (combinatorial part only; dRb/dr_i = x_i) */
    double R2 = Rb * Rb;
    out->dlngamma_dp[0][2] =
        1.0 / r1 - x1 / Rb - 1.0 / Rb + r1 * x1 / R2 -
        Z_HALF * q1 * (1.0 / r1 - x1 / Rb - Qb / (q1 * Rb) + r1 * Qb * x1 / (q1 * R2));
    out->dlngamma_dp[1][2] =
        -x1 / Rb + r2 * x1 / R2 - Z_HALF * q2 * (-x1 / Rb + r2 * Qb * x1 / (q2 * R2));
    out->dlngamma_dp[0][4] =
        -x2 / Rb + r1 * x2 / R2 - Z_HALF * q1 * (-x2 / Rb + r1 * Qb * x2 / (q1 * R2));
    out->dlngamma_dp[1][4] =
        1.0 / r2 - x2 / Rb - 1.0 / Rb + r2 * x2 / R2 -
        Z_HALF * q2 * (1.0 / r2 - x2 / Rb - Qb / (q2 * Rb) + r2 * Qb * x2 / (q2 * R2));
    /* in q1 (dQb = x1, dA = x1, dB = x1 tau12) and q2 (dQb = x2, dA = x2 tau21, dB = x2) */
    double A2 = A * A, B2 = B * B;
    double F1_q1 = -x1 / A + x1 / Qb - x1 * (A - q1 * x1) / A2 + q2 * x2 * x1 * t12 * t12 / B2;
    double F2_q1 =
        -x1 * t12 / B + x1 / Qb + q2 * x2 * x1 * t12 / B2 - x1 * t21 * (A - q1 * x1) / A2;
    double F1_q2 =
        -x2 * t21 / A + x2 / Qb + q1 * x1 * x2 * t21 / A2 - x2 * t12 * (B - q2 * x2) / B2;
    double F2_q2 = -x2 / B + x2 / Qb - x2 * (B - q2 * x2) / B2 + q1 * x1 * x2 * t21 * t21 / A2;
    out->dlngamma_dp[0][3] =
        -Z_HALF * (S1 + q1 * x1 / Qb - 1.0 - r1 * x1 / Rb + JL1) + F1 + q1 * F1_q1;
    out->dlngamma_dp[1][3] = -Z_HALF * q2 * (x1 / Qb - r2 * x1 / (q2 * Rb)) + q2 * F2_q1;
    out->dlngamma_dp[0][5] = -Z_HALF * q1 * (x2 / Qb - r1 * x2 / (q1 * Rb)) + q1 * F1_q2;
    out->dlngamma_dp[1][5] =
        -Z_HALF * (S2 + q2 * x2 / Qb - 1.0 - r2 * x2 / Rb + JL2) + F2 + q2 * F2_q2;
    return pw_model_finish(out, x1, T_K);
}

/* ln gamma_i and d ln gamma_i/dT only (pw_model_type.eval_lean): eval's terms. */
static pw_status eval_lean(const double *p, double T_ref_K, double x1, double T_K,
                           double lngamma[2], double dlngamma_dT[2])
{
    (void)T_ref_K;
    if (!pw_model_state_ok(x1, T_K))
        return PW_EDOM;
    uniquac_xterms c;
    uniquac_terms t;
    xterms_at(p, x1, &c);
    if (terms_at(p, x1, T_K, &c, &t) != PW_OK)
        return PW_EDOM;
    for (int i = 0; i < 2; i++) {
        lngamma[i] = t.lng[i];
        dlngamma_dT[i] = t.dT[i];
    }
    return pw_model_lean_finish(lngamma, dlngamma_dT);
}

/* The terms at x1 alone (pw_model_type.lean_x): the combinatorial part and ln Qb. */
static void lean_x(const double *p, double x1, double *xt)
{
    uniquac_xterms c;
    xterms_at(p, x1, &c);
    memcpy(xt, &c, sizeof c);
}

/* eval_lean from the terms lean_x stored (pw_model_type.eval_lean_x). */
static pw_status eval_lean_x(const double *p, double T_ref_K, double x1, const double *xt,
                             double T_K, double lngamma[2], double dlngamma_dT[2])
{
    (void)T_ref_K;
    if (!pw_model_state_ok(x1, T_K))
        return PW_EDOM;
    uniquac_xterms c;
    uniquac_terms t;
    memcpy(&c, xt, sizeof c);
    if (terms_at(p, x1, T_K, &c, &t) != PW_OK)
        return PW_EDOM;
    for (int i = 0; i < 2; i++) {
        lngamma[i] = t.lng[i];
        dlngamma_dT[i] = t.dT[i];
    }
    return pw_model_lean_finish(lngamma, dlngamma_dT);
}

/* d2(G^E/RT)/dx1^2 at n compositions (pw_model_type.d2gE_dx2): tau12, tau21 once, eval's
 * formula (d2gE_at) at each x1. */
static pw_status d2gE(const double *p, double T_ref_K, double T_K, size_t n, const double *x,
                      double *out)
{
    (void)T_ref_K;
    if (!pw_model_state_ok(0.5, T_K))
        return PW_EDOM;
    double t12, t21;
    if (taus_at(p, T_K, &t12, &t21) != PW_OK)
        return PW_EDOM;
    for (size_t k = 0; k < n; k++) {
        double x1 = x[k], x2 = 1.0 - x1;
        if (!pw_model_state_ok(x1, T_K))
            return PW_EDOM;
        double Rb, Qb, A, B;
        rq_sums(p, x1, x2, &Rb, &Qb);
        ab_sums(p, x1, x2, t12, t21, &A, &B);
        out[k] = d2gE_at(p, x1, x2, t12, t21, Rb, Qb, A, B);
        if (!isfinite(out[k]))
            return PW_EDOM;
    }
    return PW_OK;
}

const pw_model_type pw_model_uniquac = {
    .name = "uniquac",
    .title = "UNIQUAC (Abrams & Prausnitz 1975), z = 10, tau_ij = exp(-du_ij/T), r and q of the "
             "components",
    .n_params = 6,
    .param_names = names,
    .param_units = units,
    .defaults = defaults,
    .fitted_default = fitted,
    .check = check,
    .eval = eval,
    .start_range = starts,
    .from_components = from_components,
    .eval_lean = eval_lean,
    .d2gE_dx2 = d2gE,
    .lean_x = lean_x,
    .eval_lean_x = eval_lean_x,
};
