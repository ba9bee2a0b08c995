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
