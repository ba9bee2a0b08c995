/* q-line intersection (METHODS 6.2-6.3); the per-section pinch search that uses it is in
 * column_search.c. See docs/column.md. */
#include "analysis/column_internal.h"

#include <math.h>

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

/* Whether the q-line meets the curve inside a cell [*xa, *xc] whose ends are on the same side of
 * it, under the convexity bound K of the pinch search: with sigma the sign of h at the ends,
 * (sigma h)'' = |1 - q| sigma' y*'' <= |1 - q| K, so sigma h >= min(sigma h_a, sigma h_c)
 * - |1 - q| (K d^2/8 + eps) on a cell of width d. Cells without that proof are halved, the half
 * nearer zf first; a sign change found narrows (*xa, *xc) to bracket the first crossing. */
static pw_status hidden_crossing(pw_column_ws *w, const pw_column_spec *s, double *xa, double *ha,
                                 double *xc, double *hc, bool *cross)
{
    typedef struct {
        double a, fa, b, fb;
    } qcell;
    const double sigma = *ha > 0.0 ? 1.0 : -1.0, g = fabs(1.0 - s->q);
    const double min_width = 1e-13 * (s->xd - s->xb);
    qcell stack[128];
    size_t top = 0;
    stack[top++] = (qcell){*xa, *ha, *xc, *hc};
    *cross = false;
    while (top > 0) {
        qcell e = stack[--top];
        double d = fabs(e.b - e.a);
        if (fmin(sigma * e.fa, sigma * e.fb) - g * (w->conv_bound * d * d / 8.0 + w->y_noise) >
                0.0 ||
            d < min_width)
            continue;
        double xm = 0.5 * (e.a + e.b), hm;
        pw_status st = qline_fn(w, (void *)s, xm, &hm);
        if (st != PW_OK)
            return st;
        if (!(sigma * hm > 0.0)) {
            *xa = e.a;
            *ha = e.fa;
            *xc = xm;
            *hc = hm;
            *cross = true;
            return PW_OK;
        }
        if (top + 2 > sizeof stack / sizeof stack[0])
            return PW_ENOCONV;
        stack[top++] = (qcell){xm, hm, e.b, e.fb}; /* far half: after the near one */
        stack[top++] = (qcell){e.a, e.fa, xm, hm};
    }
    return PW_OK;
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
        double xa = x_prev, ha = h_prev, xc = xg[j], hc = h;
        bool cross = (h > 0.0) != (h_prev > 0.0) || h == 0.0;
        if (!cross) {
            st = hidden_crossing(w, s, &xa, &ha, &xc, &hc, &cross);
            if (st != PW_OK)
                return st;
        }
        if (cross) {
            st = pw_column_root(w, qline_fn, (void *)s, xa, xc, ha, hc, xq);
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
