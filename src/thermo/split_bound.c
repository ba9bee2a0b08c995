/* A proof that a binary liquid cannot split anywhere in a temperature range, without solving the
 * liquid-liquid equilibrium: D(x, T) = d2(Gmix/RT)/dx^2 = 1/(x (1 - x)) + d2(gE/RT)/dx^2 > 0 on
 * the whole box (0, 1) x [T_a, T_b] means Gmix/RT is strictly convex in x at every T of the range,
 * so no common tangent (no split) exists (METHODS2 2.2; docs/heterogeneous.md, "Excluding a
 * split"). Branch and bound on boxes [x_a, x_b] x [T_a, T_b] with a lower bound of D from
 * interval arithmetic on each factor of the model's D (every factor is monotone in x or T, or
 * bilinear in two of them, so its range over a box is taken at the corners). A box whose bound is
 * not positive is split in two; a box whose centre has D <= 0, or too many boxes, ends the search
 * with "not proven" and the caller runs its full search. See thermo_internal.h. */
#include "thermo_internal.h"

#include <math.h>
#include <pinchwise/lle.h>
#include <pinchwise/model.h>

#define BOX_MAX 4096   /* boxes examined before giving up (not proven) */
#define STACK_MAX 64   /* depth of the box stack */
#define REL_MARGIN 1e-9 /* a bound counts as positive above this share of its terms' size */

typedef struct box {
    double xa, xb, Ta, Tb;
} box;

/* Smallest 1/(x (1 - x)) on [xa, xb] (0 <= xa < xb <= 1): 4 when the box holds 1/2, else at the
 * end nearer 1/2; +inf at a pure end. */
static double ideal_min(double xa, double xb)
{
    if (xa <= 0.5 && xb >= 0.5)
        return 4.0;
    double x = xb < 0.5 ? xb : xa;
    return 1.0 / (x * (1.0 - x));
}

static double min4(double a, double b, double c, double d) { return fmin(fmin(a, b), fmin(c, d)); }
static double max4(double a, double b, double c, double d) { return fmax(fmax(a, b), fmax(c, d)); }

/* An upper bound of 2 tau G^2 / L^3 over the box, with tau = d/T, G = exp(-alpha tau) and
 * L = x_own + (1 - x_own) G, where x_own runs over [ua, ub] (x1 for the tau21 term, x2 for the
 * tau12 term). tau is monotone in T, G monotone in tau, L bilinear in (x_own, G) and positive. */
static double nrtl_term_ub(double d, double alpha, double ua, double ub, double Ta, double Tb,
                           double *mag)
{
    double t1 = d / Ta, t2 = d / Tb;
    double tlo = fmin(t1, t2), thi = fmax(t1, t2);
    double Glo = exp(-alpha * thi), Ghi = exp(-alpha * tlo);
    double Llo = min4(ua + (1.0 - ua) * Glo, ua + (1.0 - ua) * Ghi, ub + (1.0 - ub) * Glo,
                      ub + (1.0 - ub) * Ghi);
    double Lhi = max4(ua + (1.0 - ua) * Glo, ua + (1.0 - ua) * Ghi, ub + (1.0 - ub) * Glo,
                      ub + (1.0 - ub) * Ghi);
    double v = thi > 0.0 ? 2.0 * thi * Ghi * Ghi / (Llo * Llo * Llo)
                         : 2.0 * thi * Glo * Glo / (Lhi * Lhi * Lhi);
    *mag += fabs(v);
    return v;
}

/* A lower bound of (tau - 1)(tau/A^2 + 1/A) over the box, with A = tau + theta (1 - tau) (tau
 * in [tlo, thi], theta in [ua, ub]): A is bilinear in (theta, tau) and positive, so its range is
 * at the corners; tau/A^2 + 1/A is positive, monotone in tau and in A; the product of the two
 * factors' ranges bounds the term (each factor bounded on its own: valid, if not tight). */
static double uniquac_term_lb(double tlo, double thi, double ua, double ub, double *mag)
{
    double Alo = min4(tlo + ua * (1.0 - tlo), tlo + ub * (1.0 - tlo), thi + ua * (1.0 - thi),
                      thi + ub * (1.0 - thi));
    double Ahi = max4(tlo + ua * (1.0 - tlo), tlo + ub * (1.0 - tlo), thi + ua * (1.0 - thi),
                      thi + ub * (1.0 - thi));
    double wlo = tlo / (Ahi * Ahi) + 1.0 / Ahi, whi = thi / (Alo * Alo) + 1.0 / Alo;
    double flo = tlo - 1.0, fhi = thi - 1.0;
    double lo = min4(flo * wlo, flo * whi, fhi * wlo, fhi * whi);
    *mag += max4(fabs(flo * wlo), fabs(flo * whi), fabs(fhi * wlo), fabs(fhi * whi));
    return lo;
}

/* UNIQUAC (src/thermo/models/uniquac.c; docs/heterogeneous.md, "Excluding a split"): with
 * R = r1 x1 + r2 x2, Q = q1 x1 + q2 x2, theta = q1 x1 / Q, A = tau21 + theta (1 - tau21),
 * B = tau12 + (1 - theta)(1 - tau12),
 *   D = 1/(x1 x2) + (r1 - r2)^2 / R^2 - (z/2) (q1 r2 - q2 r1)^2 / (R^2 Q)
 *       + (q1 q2)^2 / Q^3 [(tau21 - 1)(tau21/A^2 + 1/A) + (tau12 - 1)(tau12/B^2 + 1/B)].
 * The residual part is the perspective Q h(theta) of h = -theta ln A - (1 - theta) ln B, whose
 * second derivative in x is h''(theta) (q1 q2)^2 / Q^3. R, Q and theta are monotone in x,
 * tau_ij in T. */
static double uniquac_lower(const double *p, const box *b, double id, double *mag)
{
    const double r1 = p[2], q1 = p[3], r2 = p[4], q2 = p[5];
    if (!(r1 > 0.0 && q1 > 0.0 && r2 > 0.0 && q2 > 0.0))
        return NAN;
    double Ra = r2 + (r1 - r2) * b->xa, Rb = r2 + (r1 - r2) * b->xb;
    double Qa = q2 + (q1 - q2) * b->xa, Qb = q2 + (q1 - q2) * b->xb;
    double Rlo = fmin(Ra, Rb), Rhi = fmax(Ra, Rb), Qlo = fmin(Qa, Qb), Qhi = fmax(Qa, Qb);
    double fh = (r1 - r2) * (r1 - r2) / (Rhi * Rhi);
    double k = q1 * r2 - q2 * r1;
    double sg = 5.0 * k * k / (Rlo * Rlo * Qlo); /* z/2 = 5 */
    double tha = q1 * b->xa / Qa, thb = q1 * b->xb / Qb;
    double t12a = exp(-p[0] / b->Ta), t12b = exp(-p[0] / b->Tb);
    double t21a = exp(-p[1] / b->Ta), t21b = exp(-p[1] / b->Tb);
    if (!(isfinite(t12a) && isfinite(t12b) && isfinite(t21a) && isfinite(t21b)) ||
        !(fmin(t12a, t12b) > 0.0 && fmin(t21a, t21b) > 0.0))
        return NAN;
    double rm = 0.0;
    double s = uniquac_term_lb(fmin(t21a, t21b), fmax(t21a, t21b), tha, thb, &rm) +
               uniquac_term_lb(fmin(t12a, t12b), fmax(t12a, t12b), 1.0 - thb, 1.0 - tha, &rm);
    double q12 = q1 * q2 * q1 * q2;
    double clo = q12 / (Qhi * Qhi * Qhi), chi = q12 / (Qlo * Qlo * Qlo);
    double res = s >= 0.0 ? clo * s : chi * s;
    *mag += fh + sg + chi * rm;
    return id + fh - sg + res;
}

/* Lower bound of D over the box, or NAN when the model has no bound here. *mag receives the size
 * of the terms (for the rounding margin). */
static double D_lower(const pw_system *s, const box *b, double *mag)
{
    const pw_model_type *m = s->model;
    const double *p = s->params;
    double id = ideal_min(b->xa, b->xb);
    *mag = isfinite(id) ? id : 0.0;
    if (m == &pw_model_nrtl) {
        /* D = 1/(x1 x2) - 2 tau21 G21^2/(x1 + x2 G21)^3 - 2 tau12 G12^2/(x2 + x1 G12)^3 */
        if (!(p[2] > 0.0))
            return NAN;
        double u21 = nrtl_term_ub(p[1], p[2], b->xa, b->xb, b->Ta, b->Tb, mag);
        double u12 = nrtl_term_ub(p[0], p[2], 1.0 - b->xb, 1.0 - b->xa, b->Ta, b->Tb, mag);
        return id - u21 - u12;
    }
    if (m == &pw_model_margules || m == &pw_model_vanlaar) {
        /* d2(gE/RT)/dx2 = s c(x) with s = T_ref/T in [T_ref/T_b, T_ref/T_a] and c monotone in x:
         * Margules c = 2 A21 (1 - 3x) + 2 A12 (3x - 2) (linear), van Laar
         * c = -2 A12^2 A21^2 / (A12 x + A21 (1 - x))^3 (A12, A21 of one sign). The product's
         * range is at the corners. */
        if (!(s->T_ref_K > 0.0))
            return NAN;
        double ca, cb;
        if (m == &pw_model_margules) {
            ca = 2.0 * p[1] * (1.0 - 3.0 * b->xa) + 2.0 * p[0] * (3.0 * b->xa - 2.0);
            cb = 2.0 * p[1] * (1.0 - 3.0 * b->xb) + 2.0 * p[0] * (3.0 * b->xb - 2.0);
        } else {
            if (p[0] == 0.0 && p[1] == 0.0)
                return id;
            if (!((p[0] > 0.0 && p[1] > 0.0) || (p[0] < 0.0 && p[1] < 0.0)))
                return NAN;
            double La = p[0] * b->xa + p[1] * (1.0 - b->xa), Lb = p[0] * b->xb + p[1] * (1.0 - b->xb);
            double k = -2.0 * p[0] * p[0] * p[1] * p[1];
            ca = k / (La * La * La);
            cb = k / (Lb * Lb * Lb);
        }
        double sa = s->T_ref_K / b->Tb, sb = s->T_ref_K / b->Ta;
        double lo = min4(sa * ca, sa * cb, sb * ca, sb * cb);
        *mag += max4(fabs(sa * ca), fabs(sa * cb), fabs(sb * ca), fabs(sb * cb));
        return id + lo;
    }
    if (m == &pw_model_uniquac)
        return uniquac_lower(p, b, id, mag);
    return NAN;
}

/* D at a point from the model itself. */
static bool D_at(const pw_system *s, double x, double T, double *D)
{
    pw_activity a;
    if (pw_system_activity(s, x, T, &a) != PW_OK)
        return false;
    *D = 1.0 / (x * (1.0 - x)) + a.d2gE_dx2;
    return isfinite(*D);
}

double pw_thermo_split_D_lower(const pw_system *s, double x_a, double x_b, double T_a, double T_b)
{
    if (!s || !s->model || !(0.0 <= x_a && x_a <= x_b && x_b <= 1.0) || !(0.0 < T_a && T_a <= T_b))
        return NAN;
    box b = {x_a, x_b, T_a, T_b};
    double mag;
    return D_lower(s, &b, &mag);
}

bool pw_thermo_split_excluded(const pw_system *s, double T_a, double T_b)
{
    if (!s || !s->model)
        return false;
    if (!pw_model_can_split(s->model))
        return true; /* Wilson's equation (Wilson 1964) */
    if (!(T_a > 0.0) || !(T_b >= T_a) || !isfinite(T_b))
        return false;
    box stack[STACK_MAX];
    size_t n = 0;
    stack[n++] = (box){0.0, 1.0, T_a, T_b};
    for (int examined = 0; n > 0; examined++) {
        if (examined >= BOX_MAX)
            return false;
        box b = stack[--n];
        double mag, lb = D_lower(s, &b, &mag);
        if (isnan(lb))
            return false;
        if (lb > REL_MARGIN * mag)
            continue;
        double xm = 0.5 * (b.xa + b.xb), Tm = 0.5 * (b.Ta + b.Tb), Dm;
        if (!D_at(s, xm, Tm, &Dm) || !(Dm > 0.0))
            return false; /* D <= 0 inside: a split (or a model failure) is possible */
        if (n + 2 > STACK_MAX)
            return false;
        box l = b, r = b;
        /* halve the relatively wider side (T relative to itself, x absolute) */
        if ((b.Tb - b.Ta) / b.Tb > b.xb - b.xa) {
            l.Tb = Tm;
            r.Ta = Tm;
        } else {
            l.xb = xm;
            r.xa = xm;
        }
        stack[n++] = l;
        stack[n++] = r;
    }
    return true;
}
