/* Detection of three-phase points in a VLE set (include/pinchwise/lledata.h). */
#include <math.h>
#include <pinchwise/lledata.h>
#include <stdlib.h>

#define X_SPAN_MIN 0.05

static size_t root_of(size_t *parent, size_t i)
{
    while (parent[i] != i)
        i = parent[i] = parent[parent[i]];
    return i;
}

size_t pw_three_phase_detect(const pw_point *pts, size_t n, bool isobaric, bool has_y,
                             double sigma_T_K, double sigma_P_rel, double sigma_y, bool *flags)
{
    if (!pts || !flags)
        return 0;
    for (size_t i = 0; i < n; i++)
        flags[i] = false;
    if (!has_y || n < 2)
        return 0;
    size_t *parent = malloc(n * sizeof *parent);
    double *lo = malloc(n * sizeof *lo), *hi = malloc(n * sizeof *hi);
    size_t count = 0;
    if (!parent || !lo || !hi)
        goto done;
    double tolT = fmax(isfinite(sigma_T_K) ? sigma_T_K : 0.0, 0.05);
    double tolP = fmax(isfinite(sigma_P_rel) ? sigma_P_rel : 0.0, 1e-4);
    double toly = fmax(isfinite(sigma_y) ? sigma_y : 0.0, 0.002);
    for (size_t i = 0; i < n; i++)
        parent[i] = i;
    for (size_t i = 0; i < n; i++) {
        const pw_point *a = &pts[i];
        if (!(a->x1 > 0.0 && a->x1 < 1.0) || !isfinite(a->y1))
            continue;
        for (size_t j = i + 1; j < n; j++) {
            const pw_point *b = &pts[j];
            if (!(b->x1 > 0.0 && b->x1 < 1.0) || !isfinite(b->y1))
                continue;
            bool close = isobaric ? fabs(a->T_K - b->T_K) <= tolT
                                  : fabs(a->P_Pa - b->P_Pa) <= tolP * fmax(a->P_Pa, b->P_Pa);
            if (close && fabs(a->y1 - b->y1) <= toly) {
                size_t ra = root_of(parent, i), rb = root_of(parent, j);
                if (ra != rb)
                    parent[ra] = rb;
            }
        }
    }
    for (size_t i = 0; i < n; i++) {
        lo[i] = INFINITY;
        hi[i] = -INFINITY;
    }
    for (size_t i = 0; i < n; i++) {
        size_t r = root_of(parent, i);
        lo[r] = fmin(lo[r], pts[i].x1);
        hi[r] = fmax(hi[r], pts[i].x1);
    }
    for (size_t i = 0; i < n; i++) {
        size_t r = root_of(parent, i);
        if (hi[r] - lo[r] >= X_SPAN_MIN) {
            flags[i] = true;
            count++;
        }
    }
done:
    free(parent);
    free(lo);
    free(hi);
    return count;
}
