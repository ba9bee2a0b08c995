/* Equilibrium at fixed pressure for the design-grade column: y*(x) by bubble points and its
 * inverse x*(y) (dew point, polished by a bracketed Brent solve on the bubble curve), and the
 * growable stage profiles. */
#include "analysis/design_internal.h"

#include <float.h>
#include <gsl/gsl_errno.h>
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
    e->root = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    return e->root ? PW_OK : PW_ENOMEM;
}

void pw_eqp_free(pw_eqp *e)
{
    if (e->root)
        gsl_root_fsolver_free(e->root);
    e->root = NULL;
}

pw_status pw_eqp_bubble(pw_eqp *e, double x, double *y, double *T_K)
{
    if (!(x >= 0.0 && x <= 1.0))
        return PW_EDOM;
    pw_eq_point p;
    e->n_bubble++;
    pw_status st = pw_bubble_T_from(e->sys, e->P_Pa, x, e->T_last, &p);
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
    if (T_K)
        *T_K = p.T_K;
    return PW_OK;
}

typedef struct inv_ctx {
    pw_eqp *e;
    double target;
} inv_ctx;

static double inv_fn(double x, void *params)
{
    inv_ctx *c = params;
    double y;
    pw_status st = pw_eqp_bubble(c->e, x, &y, NULL);
    if (st != PW_OK) {
        if (c->e->cb_status == PW_OK)
            c->e->cb_status = st;
        return GSL_NAN;
    }
    return y - c->target;
}

static pw_status brent(pw_eqp *e, inv_ctx *c, double a, double b, double *x)
{
    gsl_function F = {inv_fn, c};
    e->cb_status = PW_OK;
    if (gsl_root_fsolver_set(e->root, &F, a, b) != GSL_SUCCESS)
        return e->cb_status != PW_OK ? e->cb_status : PW_ENOBRACKET;
    for (int it = 0; it < ROOT_MAX_ITER; it++) {
        int gs = gsl_root_fsolver_iterate(e->root);
        if (e->cb_status != PW_OK)
            return e->cb_status;
        if (gs != GSL_SUCCESS)
            return PW_ENOCONV;
        double lo = gsl_root_fsolver_x_lower(e->root), hi = gsl_root_fsolver_x_upper(e->root);
        if (gsl_root_test_interval(lo, hi, 4.0 * DBL_EPSILON, 4.0 * DBL_EPSILON) == GSL_SUCCESS) {
            *x = gsl_root_fsolver_root(e->root);
            return PW_OK;
        }
    }
    return PW_EMAXITER;
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
            double fo = o == 1.0 ? 1.0 - y : o == 0.0 ? -y : inv_fn(o, &c);
            if (e->cb_status != PW_OK)
                return e->cb_status;
            if ((fo > 0.0) != (f0 > 0.0) || fo == 0.0) {
                a = fmin(x0, o);
                b = fmax(x0, o);
                break;
            }
            x0 = o;
            f0 = fo;
        }
    }
    pw_status st = brent(e, &c, a, b, x);
    if (st == PW_ENOBRACKET && (a > 0.0 || b < 1.0))
        st = brent(e, &c, 0.0, 1.0, x); /* the local bracket was lost to round-off */
    if (st != PW_OK)
        return st;
    double yy;
    return pw_eqp_bubble(e, *x, &yy, T_K);
}
