/* Binary VLE by modified Raoult's law, y_i P = x_i gamma_i(x, T) P_i^sat(T): bubble and dew
 * points and the liquid-stability scan. Solvers, brackets and tolerances: docs/thermo.md. */
#include <pinchwise/equilibrium.h>
#include <pinchwise/units.h>

#include "thermo_internal.h"

#include <float.h>
#include "base/solve1d.h"

#include <math.h>

/* Bubble T converged when the Newton step (or the Brent bracket) is below
 * T_EPSABS + T_EPSREL |T|. */
#define T_EPSABS 1e-10
#define T_EPSREL (4.0 * DBL_EPSILON)
#define NEWTON_MAXIT 30
#define NEWTON_MAX_STEP_K 25.0
#define BRENT_MAXIT 200
#define BRACKET_BELOW_K 60.0 /* search from min pure Tsat - 60 K ... */
#define BRACKET_ABOVE_K 10.0 /* ... to max pure Tsat + 10 K */
#define BRACKET_WIDEN_STEPS 8
/* |ln(sum x gamma Psat / P)| accepted at a Brent root; larger means a discontinuity. */
#define BUBBLE_RESID_MAX 1e-8
/* Dew points: Newton-bisection on x1 stops when the step or the bracket is below X_EPS. */
#define X_EPS 1e-13
#define DEW_MAXIT 100
#define DEW_RESID_MAX 1e-9
#define STAB_GRID 499
#define STAB_MAXIT 100
/* Geometric points at each end between STAB_TAIL_MIN and the first point of the even grid. */
#define STAB_TAIL 48
#define STAB_TAIL_MIN 1e-12

/* Everything evaluated at one (x1, T). */
typedef struct {
    pw_activity act;
    double Ps[2], dlnPs[2];
    double k[2]; /* x_i gamma_i Psat_i / Phi_i */
    double Phi[2]; /* vapor correction factors (1 for the ideal vapor) */
    double sum;  /* k1 + k2 = bubble pressure */
    double f;    /* ln(sum / P) */
    double df;   /* df/dT at constant x */
} tpoint;

static bool state_ok(const pw_system *s) { return s && s->model && s->model->eval; }

static bool frac_ok(double x) { return isfinite(x) && x >= 0.0 && x <= 1.0; }

pw_status pw_system_activity(const pw_system *s, double x1, double T_K, pw_activity *out)
{
    if (!state_ok(s) || !out)
        return PW_EINVAL;
    return s->model->eval(s->params, s->T_ref_K, x1, T_K, out);
}

/* Virial vapor: Phi_i depend on y and P, so k_i = x_i gamma_i Psat_i / Phi_i(y, P) is solved by
 * successive substitution from the ideal-vapor k_i (contraction factor about B P / RT, below
 * 0.1 at 1 atm and 0.3 at 10 bar). P is the specified pressure, or NAN when the pressure is the
 * bubble pressure sum k_i itself. d ln Phi / dT is neglected in df (Newton then converges a little
 * slower; the root is the same). */
#define PHI_MAXIT 60
#define PHI_TOL 1e-15
static pw_status apply_virial(const pw_system *s, double T, double P, const double kid[2],
                              tpoint *tp)
{
    double B[3];
    pw_status st = pw_virial_B(&s->comp[0], &s->comp[1], T, B);
    if (st != PW_OK)
        return st == PW_ENOTFOUND ? PW_EINVAL : st;
    double y1 = kid[0] / (kid[0] + kid[1]), Pu = isfinite(P) ? P : kid[0] + kid[1];
    for (int it = 0; it < PHI_MAXIT; it++) {
        pw_vapor_phi(PW_VAPOR_VIRIAL, B, T, Pu, y1, tp->Ps, tp->Phi);
        tp->k[0] = kid[0] / tp->Phi[0];
        tp->k[1] = kid[1] / tp->Phi[1];
        tp->sum = tp->k[0] + tp->k[1];
        if (!(tp->sum > 0.0) || !isfinite(tp->sum))
            return PW_EDOM;
        double yn = tp->k[0] / tp->sum, Pn = isfinite(P) ? P : tp->sum;
        bool done = fabs(yn - y1) <= PHI_TOL && fabs(Pn - Pu) <= PHI_TOL * Pu;
        y1 = yn;
        Pu = Pn;
        if (done)
            return PW_OK;
    }
    return PW_ENOCONV;
}

/* f = ln(sum/P) (0 when P is NAN) and its T derivative df from tp's k, d ln gamma/dT and
 * d ln Psat/dT. */
static pw_status point_slope(tpoint *tp, double P)
{
    double dsum = 0.0;
    for (int i = 0; i < 2; i++)
        dsum += tp->k[i] * (tp->act.dlngamma_dT[i] + tp->dlnPs[i]);
    if (!(tp->sum > 0.0) || !isfinite(tp->sum) || !isfinite(dsum))
        return PW_EDOM;
    tp->f = isfinite(P) ? log(tp->sum / P) : 0.0;
    tp->df = dsum / tp->sum;
    return PW_OK;
}

/* Evaluates at (x1, T); P is the specified pressure (used for f and the vapor correction), or
 * NAN when the pressure is the bubble pressure (then f = 0). */
static pw_status eval_point(const pw_system *s, double x1, double T, double P, tpoint *tp)
{
    pw_status st = pw_system_activity(s, x1, T, &tp->act);
    if (st != PW_OK)
        return st;
    double x[2] = {x1, 1.0 - x1};
    tp->sum = 0.0;
    for (int i = 0; i < 2; i++) {
        st = pw_psat(&s->comp[i], T, &tp->Ps[i], &tp->dlnPs[i]);
        if (st != PW_OK)
            return st;
        tp->k[i] = x[i] * exp(tp->act.lngamma[i]) * tp->Ps[i];
        tp->sum += tp->k[i];
        tp->Phi[i] = 1.0;
    }
    if (s->vapor == PW_VAPOR_VIRIAL) {
        double kid[2] = {tp->k[0], tp->k[1]};
        if ((st = apply_virial(s, T, P, kid, tp)) != PW_OK)
            return st;
    }
    return point_slope(tp, P);
}

/* pw_psat's Antoine branch, the same operations in the same order (the same bits), without
 * the unit lookup and the argument checks. */
static pw_status kernel_psat(const pw_kernel_antoine *a, double T_K, double *P_Pa,
                             double *dlnP_dT)
{
    double T_u = T_K / a->Ts - a->To;
    double den = T_u + a->C;
    if (!(den > 0.0))
        return PW_EDOM; /* at or beyond the Antoine pole */
    double P_u = exp(a->base * (a->A - a->B / den));
    if (!isfinite(P_u) || P_u <= 0.0)
        return PW_EDOM;
    double P = (P_u + a->Po) * a->Ps;
    if (!isfinite(P) || P <= 0.0)
        return PW_EDOM;
    *P_Pa = P;
    double dTu_dTK = 1.0 / a->Ts;
    *dlnP_dT = a->base * a->B / (den * den) * dTu_dTK;
    return PW_OK;
}

/* The lean evaluation (pw_thermo_kernel): the model's eval_lean (or eval when it has none) and
 * the vapor pressures from the kernel's Antoine constants (pw_psat otherwise), the same values
 * as eval_point's. xt: the model's terms at x1 from its lean_x (then eval_lean_x, the same
 * values as eval_lean), or NULL. Fills lngamma and dlngamma_dT of tp->act, Ps, dlnPs, k, sum, f
 * and df. The virial vapor, and a null kernel, take eval_point. */
static pw_status eval_point_lean(const pw_system *s, const pw_thermo_kernel *kern,
                                 const double *xt, double x1, double T, double P, tpoint *tp)
{
    if (!kern || s->vapor == PW_VAPOR_VIRIAL)
        return eval_point(s, x1, T, P, tp);
    pw_status st;
    if (xt) {
        if (!(T > 0.0) || !isfinite(T))
            return PW_EDOM;
        st = s->model->eval_lean_x(s->params, s->T_ref_K, x1, xt, T, tp->act.lngamma,
                                   tp->act.dlngamma_dT);
    } else if (s->model->eval_lean) {
        if (!(T > 0.0) || !isfinite(T))
            return PW_EDOM;
        st = s->model->eval_lean(s->params, s->T_ref_K, x1, T, tp->act.lngamma,
                                 tp->act.dlngamma_dT);
    } else {
        st = pw_system_activity(s, x1, T, &tp->act);
    }
    if (st != PW_OK)
        return st;
    double x[2] = {x1, 1.0 - x1};
    tp->sum = 0.0;
    for (int i = 0; i < 2; i++) {
        st = kern->antoine[i] ? kernel_psat(&kern->an[i], T, &tp->Ps[i], &tp->dlnPs[i])
                              : pw_psat(&s->comp[i], T, &tp->Ps[i], &tp->dlnPs[i]);
        if (st != PW_OK)
            return st;
        tp->k[i] = x[i] * exp(tp->act.lngamma[i]) * tp->Ps[i];
        tp->sum += tp->k[i];
        tp->Phi[i] = 1.0;
    }
    return point_slope(tp, P);
}

void pw_thermo_kernel_init(const pw_system *s, pw_thermo_kernel *k)
{
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &s->comp[i];
        /* Antoine with its units resolved (pw_component_prepare) */
        k->antoine[i] = c->equation != PW_PSAT_IAPWS_IF97 && c->T_scale > 0.0 && c->P_scale > 0.0;
        pw_kernel_antoine *a = &k->an[i];
        a->A = c->A;
        a->B = c->B;
        a->C = c->C;
        a->base = c->log == PW_LN ? 1.0 : 2.302585092994045684;
        a->Ts = c->T_scale;
        a->To = c->T_offset;
        a->Ps = c->P_scale;
        a->Po = c->P_offset;
    }
}

static void fill_point(const tpoint *tp, double x1, double T, double P, int iters,
                       pw_eq_point *out)
{
    out->x1 = x1;
    out->y1 = tp->k[0] / tp->sum;
    out->T_K = T;
    out->P_Pa = P;
    for (int i = 0; i < 2; i++) {
        out->gamma[i] = exp(tp->act.lngamma[i]);
        out->Psat_Pa[i] = tp->Ps[i];
        out->Phi[i] = tp->Phi[i];
    }
    out->iterations = iters;
}

/* Temperatures where every component's vapor pressure can be evaluated. */
static void eval_limits(const pw_system *s, double *lo, double *hi)
{
    *lo = 1.0;
    *hi = INFINITY;
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &s->comp[i];
        if (c->equation == PW_PSAT_IAPWS_IF97) {
            *lo = fmax(*lo, 273.15);
            *hi = fmin(*hi, 647.096);
        } else {
            double pole;
            if (c->T_scale > 0.0) { /* prepared component: no unit lookup */
                pole = (-c->C + c->T_offset) * c->T_scale;
                if (pole > 0.0)
                    *lo = fmax(*lo, pole + 1.0);
            } else if (pw_units_to_si(PW_QTY_TEMPERATURE, -c->C, c->T_unit, &pole) == PW_OK) {
                *lo = fmax(*lo, pole + 1.0);
            }
        }
    }
}

typedef struct {
    const pw_system *s;
    double P, x1;
    pw_status status;
} brent_ctx;

static double brent_f(double T, void *vp)
{
    brent_ctx *c = vp;
    tpoint tp;
    pw_status st = eval_point(c->s, c->x1, T, c->P, &tp);
    if (st != PW_OK) {
        c->status = st;
        return (double)NAN;
    }
    return tp.f;
}

static pw_status brent_fn1d(void *vp, double T, double *f)
{
    brent_ctx *c = vp;
    tpoint tp;
    pw_status st = eval_point(c->s, c->x1, T, c->P, &tp);
    if (st == PW_OK)
        *f = tp.f;
    return st;
}

/* Moves the end *end of the bracket until f has the wanted sign there (sign -1 below the
 * root, +1 above). Where f cannot be evaluated (beyond an Antoine pole, outside IF97) it first
 * steps halfway towards inner; then, while f has the wrong sign, it widens by step, clipped to
 * [lim_lo, lim_hi], at most BRACKET_WIDEN_STEPS times. */
static pw_status bracket_end(brent_ctx *c, double *end, double inner, double step, int sign,
                             double lim_lo, double lim_hi)
{
    double T = *end, f = NAN;
    for (int k = 0; k < 40; k++) {
        c->status = PW_OK;
        f = brent_f(T, c);
        if (c->status == PW_OK && isfinite(f))
            break;
        T = 0.5 * (T + inner);
    }
    if (c->status != PW_OK || !isfinite(f))
        return c->status != PW_OK ? c->status : PW_EDOM;
    for (int w = 0;; w++) {
        if (f == 0.0 || (sign < 0) == (f < 0.0)) {
            *end = T;
            return PW_OK;
        }
        double next = fmin(fmax(T + step, lim_lo), lim_hi);
        if (next == T || w >= BRACKET_WIDEN_STEPS)
            return PW_ENOBRACKET;
        T = next;
        c->status = PW_OK;
        f = brent_f(T, c);
        if (c->status != PW_OK || !isfinite(f))
            return PW_ENOBRACKET;
    }
}

static pw_status brent_bubble(const pw_system *s, double P, double x1, double a, double b,
                              double lim_lo, double lim_hi, bool a_ok, bool b_ok, double *root,
                              int *iters)
{
    brent_ctx c = {s, P, x1, PW_OK};
    double mid = 0.5 * (a + b);
    pw_status st;
    if (!a_ok && (st = bracket_end(&c, &a, mid, -BRACKET_BELOW_K, -1, lim_lo, lim_hi)) != PW_OK)
        return st;
    if (!b_ok && (st = bracket_end(&c, &b, fmax(mid, a), BRACKET_ABOVE_K * 3.0, +1, lim_lo,
                                   lim_hi)) != PW_OK)
        return st;
    if (!(a < b))
        return PW_ENOBRACKET;
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = T_EPSABS;
    o.xtol_rel = T_EPSREL;
    o.max_iter = BRENT_MAXIT;
    unsigned n = 0;
    st = pw_root1d(brent_fn1d, &c, a, b, NAN, NAN, &o, root, &n);
    *iters += (int)n;
    return st;
}

/* The pure-component boiling points at P and the bracket [lo, hi] they give (METHODS 2.5). */
static pw_status pure_bracket(const pw_system *s, double P, double Ts[2], double *lo, double *hi,
                              double lim_lo, double lim_hi)
{
    for (int i = 0; i < 2; i++) {
        pw_status st = pw_tsat(&s->comp[i], P, &Ts[i]);
        if (st != PW_OK)
            return st;
    }
    *lo = fmax(fmin(Ts[0], Ts[1]) - BRACKET_BELOW_K, lim_lo);
    *hi = fmin(fmax(Ts[0], Ts[1]) + BRACKET_ABOVE_K, lim_hi);
    return PW_OK;
}

/* Bubble T at P for liquid x1, starting from T_guess (NAN: from the pure Tsat). Fills tp at
 * the returned T. kern: the lean evaluation in the Newton steps (eval_point_lean, with the
 * model's terms at x1 xt when not NULL); NULL: eval_point. */
static pw_status bubble_T_core(const pw_system *s, double P, double x1, double T_guess,
                               bool newton, double *T_out, tpoint *tp, int *iters,
                               const pw_thermo_kernel *kern, const double *xt)
{
    double lim_lo, lim_hi;
    eval_limits(s, &lim_lo, &lim_hi);
    /* The pure boiling points set the start (without a guess) and the fallback bracket; with a
     * guess they are needed only if Newton fails. */
    double Ts[2] = {NAN, NAN}, lo = lim_lo, hi = lim_hi;
    bool have_Ts = false;
    if (!isfinite(T_guess) || !newton) {
        pw_status st = pure_bracket(s, P, Ts, &lo, &hi, lim_lo, lim_hi);
        if (st != PW_OK)
            return st;
        have_Ts = true;
    }
    double T = isfinite(T_guess) ? T_guess : x1 * Ts[0] + (1.0 - x1) * Ts[1];
    T = fmin(fmax(T, lo), hi);

    /* Fast path: Newton on f(T) = ln(sum x_i gamma_i Psat_i / P), step-limited, remembering
     * the largest T seen with f < 0 and the smallest with f > 0. */
    double neg = -INFINITY, pos = INFINITY;
    *iters = 0;
    for (int it = 0; newton && it < NEWTON_MAXIT; it++) {
        (*iters)++;
        if ((kern ? eval_point_lean(s, kern, xt, x1, T, P, tp) : eval_point(s, x1, T, P, tp)) !=
            PW_OK)
            break;
        if (tp->f == 0.0) {
            *T_out = T;
            return PW_OK;
        }
        if (tp->f < 0.0)
            neg = fmax(neg, T);
        else
            pos = fmin(pos, T);
        if (!(tp->df > 0.0) || !isfinite(tp->df))
            break;
        double dT = -tp->f / tp->df;
        if (fabs(dT) <= T_EPSABS + T_EPSREL * fabs(T)) {
            *T_out = T;
            return PW_OK;
        }
        dT = fmax(fmin(dT, NEWTON_MAX_STEP_K), -NEWTON_MAX_STEP_K);
        double Tn = T + dT;
        if (Tn <= neg || Tn >= pos) {
            if (!isfinite(neg) || !isfinite(pos))
                break;
            Tn = 0.5 * (neg + pos);
        }
        if (Tn < lim_lo || Tn > lim_hi)
            break;
        T = Tn;
    }

    /* Fallback: Brent (GSL) inside a bracket that is checked and widened if needed. */
    if (!have_Ts) {
        pw_status st = pure_bracket(s, P, Ts, &lo, &hi, lim_lo, lim_hi);
        if (st != PW_OK)
            return st;
    }
    bool a_ok = isfinite(neg), b_ok = isfinite(pos);
    double a = a_ok ? neg : fmin(lo, b_ok ? pos : lo);
    double b = b_ok ? pos : fmax(hi, a_ok ? neg : hi);
    double root = NAN;
    pw_status st = brent_bubble(s, P, x1, a, b, lim_lo, lim_hi, a_ok, b_ok, &root, iters);
    if (st != PW_OK)
        return st;
    st = eval_point(s, x1, root, P, tp);
    if (st != PW_OK)
        return st;
    if (!(fabs(tp->f) <= BUBBLE_RESID_MAX))
        return PW_ENOCONV;
    *T_out = root;
    return PW_OK;
}

static pw_status bubble_T(const pw_system *s, double P_Pa, double x1, bool newton,
                          double T_guess, pw_eq_point *out)
{
    if (!state_ok(s) || !out)
        return PW_EINVAL;
    if (!isfinite(P_Pa) || P_Pa <= 0.0 || !frac_ok(x1))
        return PW_EDOM;
    tpoint tp;
    double T;
    int iters;
    pw_status st = bubble_T_core(s, P_Pa, x1, T_guess, newton, &T, &tp, &iters, NULL, NULL);
    if (st != PW_OK)
        return st;
    fill_point(&tp, x1, T, P_Pa, iters, out);
    return PW_OK;
}

pw_status pw_bubble_T(const pw_system *s, double P_Pa, double x1, pw_eq_point *out)
{
    return bubble_T(s, P_Pa, x1, true, NAN, out);
}

pw_status pw_bubble_T_from(const pw_system *s, double P_Pa, double x1, double T_guess_K,
                           pw_eq_point *out)
{
    return bubble_T(s, P_Pa, x1, true, isfinite(T_guess_K) && T_guess_K > 0.0 ? T_guess_K : (double)NAN,
                    out);
}

pw_status pw_thermo_bubble_T_brent(const pw_system *s, double P_Pa, double x1, pw_eq_point *out)
{
    return bubble_T(s, P_Pa, x1, false, NAN, out);
}

pw_status pw_thermo_bubble_T_lean(const pw_system *s, const pw_thermo_kernel *k, double P_Pa,
                                  double x1, double T_guess_K, pw_bubble_lean *out)
{
    if (!state_ok(s) || !out)
        return PW_EINVAL;
    if (!isfinite(P_Pa) || P_Pa <= 0.0 || !frac_ok(x1))
        return PW_EDOM;
    tpoint tp;
    int iters;
    double T, guess = isfinite(T_guess_K) && T_guess_K > 0.0 ? T_guess_K : (double)NAN;
    /* x1 is held: the model's terms at x1 alone once (lean_x), for every Newton step */
    double xt_buf[PW_LEAN_XTERMS];
    const double *xt = NULL;
    if (s->model->lean_x) { /* unused where eval_point_lean takes eval_point */
        s->model->lean_x(s->params, x1, xt_buf);
        xt = xt_buf;
    }
    pw_status st = bubble_T_core(s, P_Pa, x1, guess, true, &T, &tp, &iters, k, xt);
    if (st != PW_OK)
        return st;
    out->T_K = T;
    out->P_Pa = P_Pa;
    out->y1 = tp.k[0] / tp.sum;
    for (int i = 0; i < 2; i++)
        out->dlnPs[i] = tp.dlnPs[i];
    out->iterations = iters;
    return PW_OK;
}

pw_status pw_thermo_bubble_P_lean(const pw_system *s, const pw_thermo_kernel *k, double T_K,
                                  double x1, pw_bubble_lean *out)
{
    if (!state_ok(s) || !out)
        return PW_EINVAL;
    if (!isfinite(T_K) || T_K <= 0.0 || !frac_ok(x1))
        return PW_EDOM;
    tpoint tp;
    pw_status st = eval_point_lean(s, k, NULL, x1, T_K, NAN, &tp);
    if (st != PW_OK)
        return st;
    out->T_K = T_K;
    out->P_Pa = tp.sum;
    out->y1 = tp.k[0] / tp.sum;
    for (int i = 0; i < 2; i++)
        out->dlnPs[i] = tp.dlnPs[i];
    out->iterations = 0;
    return PW_OK;
}

pw_status pw_bubble_P(const pw_system *s, double T_K, double x1, pw_eq_point *out)
{
    if (!state_ok(s) || !out)
        return PW_EINVAL;
    if (!isfinite(T_K) || T_K <= 0.0 || !frac_ok(x1))
        return PW_EDOM;
    tpoint tp;
    pw_status st = eval_point(s, x1, T_K, NAN, &tp);
    if (st != PW_OK)
        return st;
    fill_point(&tp, x1, T_K, tp.sum, 0, out);
    return PW_OK;
}

/* dy1/dx1 along the bubble curve at the point tp (x1), by implicit differentiation: at constant
 * P (isobaric) or at constant T. Phi is held constant in the derivative (exact for the ideal
 * vapor; for the virial vapor a slope of the right sign, all the dew point's safeguarded Newton
 * needs). */
static double bubble_slope(const tpoint *tp, double x1, bool isobaric)
{
    double x2 = 1.0 - x1;
    double g1Ps1 = exp(tp->act.lngamma[0]) * tp->Ps[0] / tp->Phi[0];
    double g2Ps2 = exp(tp->act.lngamma[1]) * tp->Ps[1] / tp->Phi[1];
    double dk1 = g1Ps1 * (1.0 + x1 * tp->act.dlngamma_dx1[0]); /* at constant T */
    double dk2 = g2Ps2 * (-1.0 + x2 * tp->act.dlngamma_dx1[1]);
    if (isobaric) {
        /* On the bubble curve sum = P, so dy1/dx1 = (dk1 + k1 dln k1/dT dT/dx1) / P with
         * dT/dx1 = -(dk1 + dk2) / (sum df/dT). */
        double dT_dx = -(dk1 + dk2) / (tp->sum * tp->df);
        return (dk1 + tp->k[0] * (tp->act.dlngamma_dT[0] + tp->dlnPs[0]) * dT_dx) / tp->sum;
    }
    double y1 = tp->k[0] / tp->sum;
    return (dk1 - y1 * (dk1 + dk2)) / tp->sum;
}

pw_status pw_bubble_T_slope_from(const pw_system *s, double P_Pa, double x1, double T_guess_K,
                                 pw_eq_point *out, double *dy1_dx1)
{
    if (!state_ok(s) || !out || !dy1_dx1)
        return PW_EINVAL;
    if (!isfinite(P_Pa) || P_Pa <= 0.0 || !frac_ok(x1))
        return PW_EDOM;
    tpoint tp;
    double T, guess = isfinite(T_guess_K) && T_guess_K > 0.0 ? T_guess_K : (double)NAN;
    int iters;
    pw_status st = bubble_T_core(s, P_Pa, x1, guess, true, &T, &tp, &iters, NULL, NULL);
    if (st != PW_OK)
        return st;
    fill_point(&tp, x1, T, P_Pa, iters, out);
    *dy1_dx1 = bubble_slope(&tp, x1, true);
    return PW_OK;
}

/* Dew points as a root in x1 of h(x1) = y1_bubble(x1) - y1 on [0, 1]. */
typedef struct {
    const pw_system *s;
    bool isobaric;
    double P, T; /* the fixed one is the specification; the other is the latest result */
    tpoint tp;
    int iters;
} dew_ctx;

/* y1 on the bubble curve at x1 and dy1/dx1 along it (implicit differentiation; docs). */
static pw_status dew_eval(dew_ctx *c, double x1, double *y1, double *dy1)
{
    tpoint *tp = &c->tp;
    pw_status st;
    if (c->isobaric) {
        int its = 0;
        st = bubble_T_core(c->s, c->P, x1, c->T, true, &c->T, tp, &its, NULL, NULL);
        c->iters += its;
    } else {
        st = eval_point(c->s, x1, c->T, NAN, tp);
        if (st == PW_OK)
            c->P = tp->sum;
    }
    if (st != PW_OK)
        return st;
    *y1 = tp->k[0] / tp->sum;
    *dy1 = bubble_slope(tp, x1, c->isobaric);
    return PW_OK;
}

/* Newton on h(x1) = y1(x1) - y1_spec, safeguarded by bisection inside [lo, hi], which starts
 * as [0, 1] with h(0) = -y1_spec < 0 < h(1) = 1 - y1_spec. */
static pw_status dew_solve(dew_ctx *c, double y1_spec, double x_guess, double *x_out)
{
    double lo = 0.0, hi = 1.0, x = x_guess, y, dy;
    if (y1_spec == 0.0 || y1_spec == 1.0) {
        *x_out = y1_spec;
        return dew_eval(c, y1_spec, &y, &dy);
    }
    for (int it = 0; it < DEW_MAXIT; it++) {
        c->iters++;
        pw_status st = dew_eval(c, x, &y, &dy);
        if (st != PW_OK)
            return st;
        double h = y - y1_spec;
        if (h == 0.0) {
            *x_out = x;
            return PW_OK;
        }
        if (h < 0.0)
            lo = x;
        else
            hi = x;
        double xn = x - h / dy;
        bool newton = isfinite(xn) && xn > lo && xn < hi;
        if (!newton)
            xn = 0.5 * (lo + hi);
        if ((newton && fabs(xn - x) <= X_EPS) || hi - lo <= X_EPS) {
            if (!(fabs(h) <= DEW_RESID_MAX))
                return PW_ENOCONV;
            *x_out = x;
            return PW_OK;
        }
        x = xn;
    }
    return PW_EMAXITER;
}

/* Raoult's-law estimate of the liquid in equilibrium with vapor y1 at T. */
static pw_status raoult_x(const pw_system *s, double T, double y1, double *x1)
{
    double Ps[2];
    for (int i = 0; i < 2; i++) {
        pw_status st = pw_psat(&s->comp[i], T, &Ps[i], NULL);
        if (st != PW_OK)
            return st;
    }
    double a = y1 / Ps[0], b = (1.0 - y1) / Ps[1];
    *x1 = fmin(fmax(a / (a + b), 1e-6), 1.0 - 1e-6);
    return PW_OK;
}

static bool guess_ok(double x)
{
    return x > 0.0 && x < 1.0;
}

pw_status pw_dew_T(const pw_system *s, double P_Pa, double y1, pw_eq_point *out)
{
    return pw_dew_T_from(s, P_Pa, y1, NAN, NAN, out);
}

pw_status pw_dew_T_from(const pw_system *s, double P_Pa, double y1, double x_guess,
                        double T_guess_K, pw_eq_point *out)
{
    if (!state_ok(s) || !out)
        return PW_EINVAL;
    if (!isfinite(P_Pa) || P_Pa <= 0.0 || !frac_ok(y1))
        return PW_EDOM;
    double T0 = T_guess_K, x0 = x_guess;
    if (!(isfinite(T0) && T0 > 0.0)) {
        double Ts[2];
        for (int i = 0; i < 2; i++) {
            pw_status st = pw_tsat(&s->comp[i], P_Pa, &Ts[i]);
            if (st != PW_OK)
                return st;
        }
        T0 = y1 * Ts[0] + (1.0 - y1) * Ts[1];
    }
    if (!guess_ok(x0) && raoult_x(s, T0, y1, &x0) != PW_OK)
        x0 = y1;
    dew_ctx c = {.s = s, .isobaric = true, .P = P_Pa, .T = T0, .iters = 0};
    double x1;
    pw_status st = dew_solve(&c, y1, x0, &x1);
    if (st != PW_OK)
        return st;
    fill_point(&c.tp, x1, c.T, P_Pa, c.iters, out);
    out->y1 = y1;
    return PW_OK;
}

pw_status pw_dew_P(const pw_system *s, double T_K, double y1, pw_eq_point *out)
{
    return pw_dew_P_from(s, T_K, y1, NAN, out);
}

pw_status pw_dew_P_from(const pw_system *s, double T_K, double y1, double x_guess,
                        pw_eq_point *out)
{
    if (!state_ok(s) || !out)
        return PW_EINVAL;
    if (!isfinite(T_K) || T_K <= 0.0 || !frac_ok(y1))
        return PW_EDOM;
    double x0 = x_guess;
    pw_status st = PW_OK;
    if (!guess_ok(x0))
        st = raoult_x(s, T_K, y1, &x0);
    if (st != PW_OK)
        return st;
    dew_ctx c = {.s = s, .isobaric = false, .P = NAN, .T = T_K, .iters = 0};
    double x1;
    st = dew_solve(&c, y1, x0, &x1);
    if (st != PW_OK)
        return st;
    fill_point(&c.tp, x1, T_K, c.P, c.iters, out);
    out->y1 = y1;
    return PW_OK;
}

typedef struct {
    const pw_system *s;
    double T;
    pw_status status;
} stab_ctx;

static double stab_D(double x1, void *vp)
{
    stab_ctx *c = vp;
    if (c->s->model->d2gE_dx2) { /* the model's own scan function: no other derivatives */
        double d2;
        pw_status st = c->s->model->d2gE_dx2(c->s->params, c->s->T_ref_K, c->T, 1, &x1, &d2);
        if (st != PW_OK) {
            c->status = st;
            return (double)NAN;
        }
        return 1.0 / (x1 * (1.0 - x1)) + d2;
    }
    pw_activity a;
    pw_status st = pw_system_activity(c->s, x1, c->T, &a);
    if (st != PW_OK) {
        c->status = st;
        return (double)NAN;
    }
    return 1.0 / (x1 * (1.0 - x1)) + a.d2gE_dx2;
}

static pw_status stab_fn1d(void *vp, double x1, double *D)
{
    stab_ctx *c = vp;
    double v = stab_D(x1, c);
    if (c->status != PW_OK)
        return c->status;
    *D = v;
    return PW_OK;
}

/* D at the n compositions xg: the model's scan function in one call where it has one (NRTL: the
 * temperature's exponentials once; the same values as stab_D point by point), else stab_D. */
static pw_status stab_values(stab_ctx *c, size_t n, const double *xg, double *D)
{
    const pw_system *s = c->s;
    if (s->model->d2gE_dx2) {
        pw_status st = s->model->check(s->params);
        if (st == PW_OK)
            st = s->model->d2gE_dx2(s->params, s->T_ref_K, c->T, n, xg, D);
        if (st != PW_OK)
            return st;
        for (size_t k = 0; k < n; k++)
            D[k] += 1.0 / (xg[k] * (1.0 - xg[k]));
        return PW_OK;
    }
    for (size_t k = 0; k < n; k++) {
        D[k] = stab_D(xg[k], c);
        if (c->status != PW_OK)
            return c->status;
    }
    return PW_OK;
}

/* Brent's minimiser on (a, b) around the grid minimum at m (values fa, fm, fb; NAN when not
 * known); *u and *D take its result when it is no larger than *D. */
static pw_status stab_refine(pw_fn1d fn, void *ctx, double a, double m, double b, double fa,
                             double fm, double fb, double *u, double *D, bool *better)
{
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = 1e-10;
    o.xtol_rel = 0.0;
    o.max_iter = STAB_MAXIT;
    double um, Dm;
    pw_status st = pw_min1d(fn, ctx, a, m, b, fa, fm, fb, &o, &um, &Dm, NULL);
    *better = false;
    if (st != PW_OK && st != PW_EMAXITER && st != PW_ENOBRACKET)
        return st;
    if ((st == PW_OK || st == PW_EMAXITER) && isfinite(Dm) && Dm <= *D) {
        *D = Dm;
        *u = um;
        *better = true;
    }
    return PW_OK;
}

/* D at x = e (side 0) or x = 1 - e (side 1), as a function of u = ln e. */
typedef struct {
    stab_ctx *c;
    int side;
} tail_ctx;

static double tail_x(int side, double e)
{
    return side ? 1.0 - e : e;
}

static pw_status tail_fn1d(void *vp, double u, double *D)
{
    tail_ctx *t = vp;
    return stab_fn1d(t->c, tail_x(t->side, exp(u)), D);
}

/* The geometric tails: STAB_TAIL points e_j = STAB_TAIL_MIN r^j (j = 0 .. STAB_TAIL - 1, e_STAB_TAIL
 * = h, the even grid's first point) at each end; every local minimum below *min_D is refined by
 * Brent in ln e between its neighbours. */
static pw_status stability_tails(double h, stab_ctx *c, double *min_D, double *x_at_min)
{
    double r = pow(h / STAB_TAIL_MIN, 1.0 / STAB_TAIL), lr = log(r);
    for (int side = 0; side < 2; side++) {
        double xg[STAB_TAIL + 1], D[STAB_TAIL + 1];
        for (int j = 0; j <= STAB_TAIL; j++)
            xg[j] = tail_x(side, j == STAB_TAIL ? h : STAB_TAIL_MIN * pow(r, (double)j));
        pw_status st = stab_values(c, STAB_TAIL + 1, xg, D);
        if (st != PW_OK)
            return st;
        for (int j = 0; j < STAB_TAIL; j++) {
            if (!(D[j] < *min_D))
                continue;
            *min_D = D[j];
            *x_at_min = xg[j];
            if (j == 0 || !(D[j] < D[j - 1] && D[j] < D[j + 1]))
                continue;
            tail_ctx t = {c, side};
            double ua = log(STAB_TAIL_MIN) + (j - 1) * lr, um;
            bool better;
            st = stab_refine(tail_fn1d, &t, ua, ua + lr, ua + 2.0 * lr, D[j - 1], D[j], D[j + 1],
                             &um, min_D, &better);
            if (st != PW_OK)
                return st;
            if (better)
                *x_at_min = tail_x(side, exp(um));
        }
    }
    return PW_OK;
}

pw_status pw_stability_min(const pw_system *s, double T_K, double *min_D, double *x_at_min)
{
    if (!state_ok(s) || !min_D || !x_at_min)
        return PW_EINVAL;
    if (!isfinite(T_K) || T_K <= 0.0)
        return PW_EDOM;
    stab_ctx c = {s, T_K, PW_OK};
    const double h = 1.0 / (STAB_GRID + 1);
    double xg[STAB_GRID], D[STAB_GRID];
    for (int k = 1; k <= STAB_GRID; k++)
        xg[k - 1] = k * h;
    pw_status st = stab_values(&c, STAB_GRID, xg, D);
    if (st != PW_OK)
        return st;
    int kmin = 1;
    double Dmin = INFINITY;
    for (int k = 1; k <= STAB_GRID; k++)
        if (D[k - 1] < Dmin) {
            Dmin = D[k - 1];
            kmin = k;
        }
    *min_D = Dmin;
    *x_at_min = kmin * h;
    double a = (kmin - 1) * h, b = (kmin + 1) * h;
    if (kmin > 1 && kmin < STAB_GRID && Dmin < stab_D(a, &c) && Dmin < stab_D(b, &c)) {
        /* an interior minimum of the even grid (not flat): refined */
        bool better;
        st = stab_refine(stab_fn1d, &c, a, kmin * h, b, NAN, Dmin, NAN, x_at_min, min_D, &better);
        if (st != PW_OK)
            return st;
    }
    if (c.status != PW_OK)
        return c.status;
    return stability_tails(h, &c, min_D, x_at_min);
}
