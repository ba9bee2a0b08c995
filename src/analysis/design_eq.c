/* Equilibrium at fixed pressure for the design-grade column: y*(x) by bubble points and its
 * inverse x*(y) (dew point, polished by a bracketed Brent solve on the bubble curve through the
 * library's 1-D driver), and the growable stage profiles. */
#include "analysis/design_internal.h"

#include "base/solve1d.h"

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#define ROOT_MAX_ITER 200
#define Y_TOL 1e-14

const char *pw_balance_name(pw_balance b)
{
    return b == PW_BALANCE_ENERGY ? "energy" : "constant-molal-overflow";
}

void pw_profile_free(pw_profile *p)
{
    if (!p)
        return;
    free(p->stage);
    p->stage = NULL;
    p->n = p->cap = 0;
}

pw_status pw_profile_push(pw_profile *p, const pw_stage *s)
{
    if (p->n == p->cap) {
        size_t cap = p->cap ? 2 * p->cap : 32;
        pw_stage *m = realloc(p->stage, cap * sizeof *m);
        if (!m)
            return PW_ENOMEM;
        p->stage = m;
        p->cap = cap;
    }
    p->stage[p->n++] = *s;
    return PW_OK;
}

void pw_design_table_free(pw_design_table *t)
{
    if (!t)
        return;
    for (size_t i = 0; i < PW_COLUMN_MAX_FACTORS; i++)
        pw_profile_free(&t->row[i].profile);
    t->n = 0;
}

pw_status pw_eqp_init(pw_eqp *e, const pw_system *sys, double P_Pa)
{
    memset(e, 0, sizeof *e);
    if (!sys || !sys->model || !(P_Pa > 0.0) || !isfinite(P_Pa))
        return PW_EINVAL;
    e->sys = sys;
    e->P_Pa = P_Pa;
    e->T_last = NAN;
    e->x_last = e->y_last = e->slope_last = NAN;
    e->x_end = e->curv_last = NAN;
    return PW_OK;
}

void pw_eqp_free(pw_eqp *e)
{
    (void)e; /* nothing allocated; kept for symmetry */
}

/* pw_eqp_bubble, and with d non-NULL also the slope dy* / dx there (pw_bubble_T_slope_from: the
 * same point to the bit). */
static pw_status bubble(pw_eqp *e, double x, double *y, double *d, double *T_K)
{
    if (!(x >= 0.0 && x <= 1.0))
        return PW_EDOM;
    pw_eq_point p;
    e->n_bubble++;
    pw_status st = d ? pw_bubble_T_slope_from(e->sys, e->P_Pa, x, e->T_last, &p, d)
                     : pw_bubble_T_from(e->sys, e->P_Pa, x, e->T_last, &p);
    if (st != PW_OK)
        return st;
    if (!isfinite(p.y1) || !isfinite(p.T_K))
        return PW_EDOM;
    e->T_last = p.T_K;
    /* y from the normalised K-values at the converged T: the bubble solve's small residual in
     * sum(y) then moves y only through the relative volatility's (weak) T dependence. */
    double k1 = x * p.gamma[0] * p.Psat_Pa[0], k2 = (1.0 - x) * p.gamma[1] * p.Psat_Pa[1];
    double yn = k1 / (k1 + k2);
    *y = isfinite(yn) ? yn : fmin(1.0, fmax(0.0, p.y1));
    e->x_last = x;
    e->y_last = *y;
    if (T_K)
        *T_K = p.T_K;
    return PW_OK;
}

pw_status pw_eqp_bubble(pw_eqp *e, double x, double *y, double *T_K)
{
    return bubble(e, x, y, NULL, T_K);
}

typedef struct inv_ctx {
    pw_eqp *e;
    double target;
} inv_ctx;

static pw_status inv_f(void *params, double x, double *f)
{
    inv_ctx *c = params;
    double y;
    pw_status st = pw_eqp_bubble(c->e, x, &y, NULL);
    if (st == PW_OK)
        *f = y - c->target;
    return st;
}

/* Root of y*(x) - y on [a, b] by the library's bracketed Brent driver (src/base/solve1d.h). */
static pw_status brent(inv_ctx *c, double a, double b, double *x)
{
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = 4.0 * DBL_EPSILON;
    o.xtol_rel = 4.0 * DBL_EPSILON;
    o.max_iter = ROOT_MAX_ITER;
    return pw_root1d(inv_f, c, a, b, NAN, NAN, &o, x, NULL);
}

/* The liquid x* of vapor y at constant relative volatility alpha. */
static double x_const_alpha(double alpha, double y)
{
    return y / (alpha - (alpha - 1.0) * y);
}

/* The fast inverse: x with |y*(x) - y| <= Y_TOL from the latest bubble point (x_l, y_l) (a
 * stage stepped from the one before has a nearby liquid): the first step along the slope dy/dx
 * of the latest inverse (else at the latest point's relative volatility), then Newton steps with
 * the analytic slope dy* / dx of each bubble point (ideal vapor; secant steps starting from
 * (x_l, y_l), which costs no evaluation, otherwise), kept inside the bracket once the residual
 * has changed sign (where a step leaves it: the step at the latest point's relative volatility,
 * else bisection). false when it does not get there in 12 evaluations (8 with secant steps):
 * the caller then takes the dew point and Brent's bracketed solve, which always do. */
static bool x_of_y_seeded(pw_eqp *e, double y, double *x, double *T_K)
{
    /* the slope is exact for the ideal vapor only; with the virial vapor Newton would converge
     * linearly, the secant converges faster */
    const bool use_d = e->sys->vapor == PW_VAPOR_IDEAL;
    double xl = e->x_last, yl = e->y_last;
    if (!(xl > 0.0 && xl < 1.0 && yl > 0.0 && yl < 1.0))
        return false;
    double alpha = yl * (1.0 - xl) / (xl * (1.0 - yl));
    if (!(alpha > 0.0) || !isfinite(alpha))
        return false;
    double xk = e->slope_last > 0.0 && isfinite(e->slope_last)
                    ? xl + (y - yl) / e->slope_last
                    : x_const_alpha(alpha, y);
    if (use_d && e->slope_last > 0.0 && isfinite(e->curv_last) && e->x_end == xl) {
        /* second order: yl + d t + c t^2/2 = y, the root nearer t = 0 */
        double d = e->slope_last, c = e->curv_last, disc = d * d + 2.0 * c * (y - yl);
        if (disc > 0.0 && c != 0.0) {
            double t = 2.0 * (y - yl) / (d + sqrt(disc));
            if (isfinite(t))
                xk = xl + t;
        }
    }
    double a = 0.0, b = 1.0, fb = 1.0 - y; /* y*(0) = 0, y*(1) = 1 */
    double xp = xl, fp = yl - y;
    for (int k = 0; k < (use_d ? 12 : 8); k++) {
        if (!(xk > a && xk < b)) /* a long step: the latest point's volatility, else bisection */
            xk = x_const_alpha(fp + y > 0.0 && fp + y < 1.0
                                   ? (fp + y) * (1.0 - xp) / (xp * (1.0 - fp - y))
                                   : alpha,
                               y);
        if (!(xk > a && xk < b))
            xk = 0.5 * (a + b);
        double yk, Tk, dk = NAN;
        if (bubble(e, xk, &yk, use_d ? &dk : NULL, &Tk) != PW_OK)
            return false;
        double fk = yk - y;
        if (fabs(fk) <= Y_TOL) {
            if (dk > 0.0 && isfinite(dk)) {
                e->curv_last = isfinite(e->x_end) && e->x_end != xk && e->slope_last > 0.0
                                   ? (dk - e->slope_last) / (xk - e->x_end)
                                   : (double)NAN;
                e->slope_last = dk;
                e->x_end = xk;
            } else if (xk != xp && fk != fp)
                e->slope_last = (fk - fp) / (xk - xp);
            *x = xk;
            if (T_K)
                *T_K = Tk;
            return true;
        }
        if ((fk > 0.0) == (fb > 0.0)) {
            b = xk;
            fb = fk;
        } else {
            a = xk;
        }
        /* Newton with the analytic slope (the secant where the slope is not usable) */
        double xn = dk > 0.0 && isfinite(dk) ? xk - fk / dk
                    : fk != fp              ? xk - fk * (xk - xp) / (fk - fp)
                                            : 0.5 * (a + b);
        xp = xk;
        fp = fk;
        xk = xn;
    }
    return false;
}

pw_status pw_eqp_x_of_y(pw_eqp *e, double y, double *x, double *T_K)
{
    if (!(y >= 0.0 && y <= 1.0))
        return PW_EDOM;
    if (y == 0.0 || y == 1.0) {
        *x = y;
        double yy;
        return pw_eqp_bubble(e, y, &yy, T_K);
    }
    if (x_of_y_seeded(e, y, x, T_K))
        return PW_OK;
    inv_ctx c = {e, y};
    double x0 = NAN, f0 = NAN;
    pw_eq_point d;
    if (pw_dew_T(e->sys, e->P_Pa, y, &d) == PW_OK && d.x1 >= 0.0 && d.x1 <= 1.0) {
        x0 = d.x1;
        e->T_last = d.T_K;
        double y0;
        pw_status st = pw_eqp_bubble(e, x0, &y0, T_K);
        if (st != PW_OK)
            return st;
        f0 = y0 - y;
        if (fabs(f0) <= Y_TOL) {
            *x = x0;
            return PW_OK;
        }
    }
    double a = 0.0, b = 1.0;
    if (isfinite(f0)) {
        /* Bracket beside the dew-point answer, widening; [0, 1] always brackets (y*(0) = 0,
         * y*(1) = 1). */
        for (double h = 1e-9; h < 0.5; h *= 16.0) {
            double o = f0 < 0.0 ? fmin(1.0, x0 + h) : fmax(0.0, x0 - h);
            double fo = o == 1.0 ? 1.0 - y : -y;
            if (o > 0.0 && o < 1.0) {
                pw_status st = inv_f(&c, o, &fo);
                if (st != PW_OK)
                    return st;
            }
            if ((fo > 0.0) != (f0 > 0.0) || fo == 0.0) {
                a = fmin(x0, o);
                b = fmax(x0, o);
                break;
            }
            x0 = o;
            f0 = fo;
        }
    }
    pw_status st = brent(&c, a, b, x);
    if (st == PW_ENOBRACKET && (a > 0.0 || b < 1.0))
        st = brent(&c, 0.0, 1.0, x); /* the local bracket was lost to round-off */
    if (st != PW_OK)
        return st;
    double yy;
    return pw_eqp_bubble(e, *x, &yy, T_K);
}
