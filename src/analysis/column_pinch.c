/* q-line intersection and the per-section pinch search (METHODS 6.2-6.3): the limiting slope of
 * each section over its whole composition range, feed point included, so that a tangent pinch
 * anywhere in either section is found, not only a pinch at the feed. See docs/column.md. */
#include "analysis/column_internal.h"

#include <math.h>

#define MAX_REFINE 4
#define MIN_MAX_ITER 100
#define PROBE_REL 1e-9   /* inward probe beside the q-line point, relative to xd - xb */
#define SHRINK_MAX 60

/* h(x) = q x + (1 - q) y*(x) - zf: zero on the q-line. */
static pw_status qline_fn(pw_column_ws *w, void *p, double x, double *h)
{
    const pw_column_spec *s = p;
    double y;
    pw_status st = pw_column_y(w, x, &y);
    if (st == PW_OK)
        *h = s->q * x + (1.0 - s->q) * y - s->zf;
    return st;
}

pw_status pw_column_qline(pw_column_ws *w, const pw_column_spec *s, const double *xg,
                          const double *yg, size_t n, double *xq, double *yq)
{
    if (s->q == 1.0) { /* vertical q-line: exact */
        *xq = s->zf;
        return pw_column_y(w, s->zf, yq);
    }
    double h_prev;
    pw_status st = qline_fn(w, (void *)s, s->zf, &h_prev);
    if (st != PW_OK)
        return st;
    double x_prev = s->zf;
    /* h(zf) = (1 - q)(y*(zf) - zf): > 0 for q < 1 (root below zf), < 0 for q > 1 (above). */
    bool down = s->q < 1.0;
    size_t j0 = 0;
    while (j0 + 1 < n && xg[j0 + 1] <= s->zf)
        j0++;
    for (size_t k = 0; k < n; k++) {
        size_t j;
        if (down) {
            if (k > j0)
                break;
            j = j0 - k;
        } else {
            j = j0 + 1 + k;
            if (j >= n)
                break;
        }
        if (xg[j] == s->zf)
            continue;
        double h = s->q * xg[j] + (1.0 - s->q) * yg[j] - s->zf;
        if ((h > 0.0) != (h_prev > 0.0) || h == 0.0) {
            st = pw_column_root(w, qline_fn, (void *)s, x_prev, xg[j], h_prev, h, xq);
            if (st != PW_OK)
                return st;
            if (!(*xq > xg[0] && *xq < xg[n - 1]))
                return PW_ERANGE;
            return pw_column_y(w, *xq, yq);
        }
        x_prev = xg[j];
        h_prev = h;
    }
    return PW_ERANGE;
}

typedef struct section_fn_ctx {
    pw_column_ws *w;
    const pw_column_spec *s;
    pw_section sec;
} section_fn_ctx;

/* The quantity maximised: m* (rectifying) or -s* (stripping). */
static double section_value(const pw_column_spec *s, pw_section sec, double x, double y)
{
    if (sec == PW_SECTION_RECTIFYING)
        return (s->xd - y) / (s->xd - x);
    return -(y - s->xb) / (x - s->xb);
}

static pw_status section_eval(section_fn_ctx *c, double x, double *v)
{
    double y;
    pw_status st = pw_column_y(c->w, x, &y);
    if (st == PW_OK)
        *v = section_value(c->s, c->sec, x, y);
    return st;
}

static double section_min_fn(double x, void *params)
{
    section_fn_ctx *c = params;
    double v;
    pw_status st = section_eval(c, x, &v);
    if (st != PW_OK) {
        if (c->w->cb_status == PW_OK)
            c->w->cb_status = st;
        return GSL_NAN;
    }
    return -v;
}

/* Maximises the section value on [a, b] from m, with va, vm, vb known and vm > va, vb. */
static pw_status refine_max(section_fn_ctx *c, double a, double m, double b, double va, double vm,
                            double vb, double *x_best, double *v_best)
{
    pw_column_ws *w = c->w;
    gsl_function F = {section_min_fn, c};
    w->cb_status = PW_OK;
    if (a > b) {
        double t = a, tv = va;
        a = b;
        va = vb;
        b = t;
        vb = tv;
    }
    if (gsl_min_fminimizer_set_with_values(w->min, &F, m, -vm, a, -va, b, -vb) != GSL_SUCCESS)
        return PW_ENOCONV;
    int it;
    for (it = 0; it < MIN_MAX_ITER; it++) {
        int gs = gsl_min_fminimizer_iterate(w->min);
        if (w->cb_status != PW_OK)
            return w->cb_status;
        if (gs != GSL_SUCCESS)
            return PW_ENOCONV;
        double lo = gsl_min_fminimizer_x_lower(w->min), hi = gsl_min_fminimizer_x_upper(w->min);
        if (gsl_min_test_interval(lo, hi, w->min_xtol, 0.0) == GSL_SUCCESS)
            break;
    }
    if (it == MIN_MAX_ITER)
        return PW_EMAXITER;
    *x_best = gsl_min_fminimizer_x_minimum(w->min);
    *v_best = -gsl_min_fminimizer_f_minimum(w->min);
    return PW_OK;
}

/* Looks for a maximum just inside the section beside the q-line point e (value ve), whose grid
 * neighbour xn has a lower value: one probe at a tiny inward distance tells whether the value
 * still rises there; if so, halve the distance until a bracketing point is found and refine. */
static pw_status endpoint_inward(section_fn_ctx *c, double xe, double ve, double xn, double vn,
                                 double *x_best, double *v_best)
{
    double span = c->s->xd - c->s->xb;
    double eps = PROBE_REL * span * (xn > xe ? 1.0 : -1.0);
    double vp;
    pw_status st = section_eval(c, xe + eps, &vp);
    if (st != PW_OK)
        return st;
    if (!(vp > ve))
        return PW_OK; /* falls inward: the q-line point is the extremum */
    double xo = xn, vo = vn, d = xn - xe;
    for (int i = 1; i < SHRINK_MAX; i++) {
        double xm = xe + d * ldexp(1.0, -i), vm;
        st = section_eval(c, xm, &vm);
        if (st != PW_OK)
            return st;
        if (vm > ve && vm > vo) {
            double xr, vr;
            st = refine_max(c, xe, xm, xo, ve, vm, vo, &xr, &vr);
            if (st != PW_OK)
                return st;
            if (vr > *v_best) {
                *v_best = vr;
                *x_best = xr;
            }
            return PW_OK;
        }
        xo = xm;
        vo = vm;
    }
    return PW_OK;
}

pw_status pw_column_section_limit(pw_column_ws *w, const pw_column_spec *s, pw_section sec,
                                  const double *px, const double *py, size_t n_pts, double *slope,
                                  double *x_lim, double *y_lim, bool *at_feed)
{
    if (n_pts < 2)
        return PW_EINVAL;
    section_fn_ctx c = {w, s, sec};
    const size_t e = sec == PW_SECTION_RECTIFYING ? 0 : n_pts - 1;
    const size_t nb = sec == PW_SECTION_RECTIFYING ? 1 : n_pts - 2;
    /* Interior grid local maxima: keep the MAX_REFINE highest. */
    size_t pick[MAX_REFINE];
    double pv[MAX_REFINE];
    size_t np = 0;
    double vprev = section_value(s, sec, px[0], py[0]);
    double vcur = section_value(s, sec, px[1], py[1]);
    const double ve = section_value(s, sec, px[e], py[e]);
    const double vn = section_value(s, sec, px[nb], py[nb]);
    for (size_t k = 1; k + 1 < n_pts; k++) {
        double vnext = section_value(s, sec, px[k + 1], py[k + 1]);
        if (vcur > vprev && vcur > vnext) {
            size_t slot = np;
            if (np < MAX_REFINE) {
                np++;
            } else {
                slot = 0;
                for (size_t i = 1; i < MAX_REFINE; i++)
                    if (pv[i] < pv[slot])
                        slot = i;
                if (!(vcur > pv[slot]))
                    slot = MAX_REFINE;
            }
            if (slot < MAX_REFINE) {
                pick[slot] = k;
                pv[slot] = vcur;
            }
        }
        vprev = vcur;
        vcur = vnext;
    }
    double x_best = px[e], v_best = ve;
    bool feed = true;
    for (size_t i = 0; i < np; i++) {
        size_t k = pick[i];
        double xr, vr;
        pw_status st = refine_max(&c, px[k - 1], px[k], px[k + 1],
                                  section_value(s, sec, px[k - 1], py[k - 1]), pv[i],
                                  section_value(s, sec, px[k + 1], py[k + 1]), &xr, &vr);
        if (st != PW_OK)
            return st;
        if (vr > v_best) {
            v_best = vr;
            x_best = xr;
            feed = false;
        }
    }
    if (vn < ve) {
        double v_in = v_best, x_in = x_best;
        pw_status st = endpoint_inward(&c, px[e], ve, px[nb], vn, &x_in, &v_in);
        if (st != PW_OK)
            return st;
        if (v_in > v_best) {
            v_best = v_in;
            x_best = x_in;
            feed = false;
        }
    }
    *at_feed = feed;
    *x_lim = x_best;
    *slope = sec == PW_SECTION_RECTIFYING ? v_best : -v_best;
    if (feed) {
        *y_lim = py[e];
        return PW_OK;
    }
    return pw_column_y(w, x_best, y_lim);
}
