/* Adapter from a fitted binary system to the column module's equilibrium-curve callback. */
#include <pinchwise/curve.h>

#include <math.h>

pw_status pw_system_curve_init(pw_system_curve *sc, const pw_system *sys, double P_Pa)
{
    if (!sc || !sys || !sys->model || !(P_Pa > 0.0) || !isfinite(P_Pa))
        return PW_EINVAL;
    sc->sys = *sys;
    sc->P_Pa = P_Pa;
    sc->n_eval = 0;
    sc->last_status = PW_OK;
    sc->last_x = NAN;
    sc->last_T_K = NAN;
    return PW_OK;
}

pw_status pw_system_curve_y(void *ctx, double x, double *y)
{
    pw_system_curve *sc = ctx;
    if (!sc || !y)
        return PW_EINVAL;
    if (!(x >= 0.0 && x <= 1.0))
        return PW_EDOM;
    pw_eq_point eq;
    sc->n_eval++;
    /* Start Newton from the previous bubble point when it is near (the column scans the curve in
     * small steps); the answer is the same, the iterations fewer. */
    double guess = fabs(x - sc->last_x) <= 0.02 ? sc->last_T_K : (double)NAN;
    pw_status st = pw_bubble_T_from(&sc->sys, sc->P_Pa, x, guess, &eq);
    sc->last_status = st;
    if (st != PW_OK)
        return st;
    sc->last_x = x;
    sc->last_T_K = eq.T_K;
    if (!isfinite(eq.y1))
        return PW_EDOM;
    *y = eq.y1;
    return PW_OK;
}

pw_status pw_system_curve_y_dy(void *ctx, double x, double *y, double *dydx)
{
    pw_system_curve *sc = ctx;
    if (!sc || !y || !dydx || sc->sys.vapor != PW_VAPOR_IDEAL)
        return PW_EINVAL;
    if (!(x >= 0.0 && x <= 1.0))
        return PW_EDOM;
    pw_eq_point eq;
    sc->n_eval++;
    /* the same start as pw_system_curve_y: the same point */
    double guess = fabs(x - sc->last_x) <= 0.02 ? sc->last_T_K : (double)NAN;
    double d;
    pw_status st = pw_bubble_T_slope_from(&sc->sys, sc->P_Pa, x, guess, &eq, &d);
    sc->last_status = st;
    if (st != PW_OK)
        return st;
    sc->last_x = x;
    sc->last_T_K = eq.T_K;
    if (!isfinite(eq.y1) || !isfinite(d))
        return PW_EDOM;
    *y = eq.y1;
    *dydx = d;
    return PW_OK;
}

pw_curve_dy_fn pw_system_curve_dy(const pw_system_curve *sc)
{
    return sc && sc->sys.vapor == PW_VAPOR_IDEAL ? pw_system_curve_y_dy : NULL;
}

pw_curve pw_system_curve_bind(pw_system_curve *sc)
{
    pw_curve c = {pw_system_curve_y, sc};
    return c;
}
