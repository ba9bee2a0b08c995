/* Feasibility of a binary split by ordinary distillation (METHODS 6.3 step 1): the equilibrium
 * curve must lie strictly above the diagonal, y*(x) - x > 0, on the whole of [xb, xd]. When it
 * does not, a reason is written in words: an azeotrope between the products, a product beyond an
 * azeotrope, a curve that touches the diagonal, or a pinch at a product composition. */
#include "analysis/column_internal.h"
#include "base/solve1d.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

#define MAX_ROOTS 3
#define MAX_REFINE 4
#define MIN_MAX_ITER 100

static pw_status excess(pw_column_ws *w, void *p, double x, double *f)
{
    (void)p;
    double y;
    pw_status st = pw_column_y(w, x, &y);
    if (st == PW_OK)
        *f = y - x;
    return st;
}

static pw_status excess_fn(void *ctx, double x, double *f) { return excess(ctx, NULL, x, f); }

/* Refines a grid local minimum of f = y* - x in [a, b] around m (f(m) < f(a), f(b)). */
static pw_status refine_min(pw_column_ws *w, double a, double m, double b, double fa, double fm,
                            double fb, double *xmin, double *fmin)
{
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = w->min_xtol;
    o.xtol_rel = 0.0;
    o.max_iter = MIN_MAX_ITER;
    pw_status st = pw_min1d(excess_fn, w, a, m, b, fa, fm, fb, &o, xmin, fmin, NULL);
    return st == PW_EMAXITER ? PW_OK : st; /* the best point so far stands, as before */
}

/* The smallest interior grid minima of f, refined; reports the lowest. */
static pw_status lowest_interior(pw_column_ws *w, const double *xg, const double *fg, size_t n,
                                 double *xmin, double *fmin)
{
    size_t pick[MAX_REFINE];
    size_t np = 0;
    for (size_t j = 1; j + 1 < n; j++) {
        if (!(fg[j] < fg[j - 1] && fg[j] < fg[j + 1]))
            continue;
        if (np < MAX_REFINE) {
            pick[np++] = j;
        } else {
            size_t worst = 0;
            for (size_t k = 1; k < np; k++)
                if (fg[pick[k]] > fg[pick[worst]])
                    worst = k;
            if (fg[j] < fg[pick[worst]])
                pick[worst] = j;
        }
    }
    *fmin = INFINITY;
    *xmin = NAN;
    for (size_t k = 0; k < np; k++) {
        size_t j = pick[k];
        double xm, fm;
        pw_status st = refine_min(w, xg[j - 1], xg[j], xg[j + 1], fg[j - 1], fg[j], fg[j + 1],
                                  &xm, &fm);
        if (st != PW_OK)
            return st;
        if (fm < *fmin) {
            *fmin = fm;
            *xmin = xm;
        }
    }
    return PW_OK;
}

typedef struct fcell {
    double a, fa, b, fb;
} fcell;

/* Proves f = y* - x > tol on every cell of the table, under the convexity bound K of the pinch
 * search (f'' = y*''): on [a, b], f >= chord - K (x - a)(b - x)/2 - eps >= min(fa, fb) - K h^2/8
 * - eps. Cells without that proof are halved (Brent on a bracketed dip); a point with f <= tol
 * is returned in (*x_low, *f_low). A midpoint further below its chord than K allows raises K and
 * the proof starts again. See docs/column.md, section 1. */
static pw_status certify_positive(pw_column_ws *w, const double *xg, const double *fg, size_t n,
                                  double tol, double *x_low, double *f_low)
{
    const double eps = w->y_noise, min_width = 1e-13 * (xg[n - 1] - xg[0]);
    for (int round = 0; round < 8; round++) {
        bool restart = false;
        for (size_t j = 0; j + 1 < n && !restart; j++) {
            fcell stack[128];
            size_t top = 0;
            stack[top++] = (fcell){xg[j], fg[j], xg[j + 1], fg[j + 1]};
            while (top > 0 && !restart) {
                fcell e = stack[--top];
                const double h = e.b - e.a, K = w->conv_bound;
                if (fmin(e.fa, e.fb) - K * h * h / 8.0 - eps > tol || h < min_width)
                    continue;
                double xm = e.a + 0.5 * h, fm;
                pw_status st = excess(w, NULL, xm, &fm);
                if (st != PW_OK)
                    return st;
                if (fm <= tol) {
                    *x_low = xm;
                    *f_low = fm;
                    return PW_OK;
                }
                /* f's chord minus f equals y*'s: the same check as the pinch search's */
                double below = 0.5 * (e.fa + e.fb) - fm;
                if (below > K * h * h / 8.0 + 2.0 * eps) {
                    w->conv_bound = fmax(2.0 * K, 32.0 * below / (h * h));
                    restart = true;
                    break;
                }
                double xs = xm, fs = fm;
                if (fm < e.fa && fm < e.fb) {
                    st = refine_min(w, e.a, xm, e.b, e.fa, fm, e.fb, &xs, &fs);
                    if (st != PW_OK)
                        return st;
                    if (fs <= tol) {
                        *x_low = xs;
                        *f_low = fs;
                        return PW_OK;
                    }
                    if (!(xs > e.a && xs < e.b)) {
                        xs = xm;
                        fs = fm;
                    }
                }
                if (top + 2 > sizeof stack / sizeof stack[0])
                    return PW_ENOCONV;
                stack[top++] = (fcell){e.a, e.fa, xs, fs};
                stack[top++] = (fcell){xs, fs, e.b, e.fb};
            }
        }
        if (!restart)
            return PW_OK;
    }
    return PW_ENOCONV;
}

static void append(char *buf, size_t len, const char *text)
{
    size_t used = strlen(buf);
    if (used + 1 < len)
        snprintf(buf + used, len - used, "%s", text);
}

pw_status pw_column_check_feasible(pw_column_ws *w, const double *xg, const double *yg, double *fg,
                                   size_t n, bool *ok, char *reason, size_t len)
{
    const double tol = PW_COLUMN_TOUCH_TOL;
    size_t n_bad = 0;
    for (size_t j = 0; j < n; j++) {
        fg[j] = yg[j] - xg[j];
        if (!(fg[j] > tol))
            n_bad++;
    }
    reason[0] = '\0';
    *ok = false;
    const double xb = xg[0], xd = xg[n - 1], fb = fg[0], fd = fg[n - 1];
    char tmp[160];

    if (n_bad == 0) {
        double xm, fm;
        pw_status st = lowest_interior(w, xg, fg, n, &xm, &fm);
        if (st != PW_OK)
            return st;
        if (fm > tol) {
            st = certify_positive(w, xg, fg, n, tol, &xm, &fm);
            if (st != PW_OK)
                return st;
        }
        if (fm > tol) {
            *ok = true;
            return PW_OK;
        }
        snprintf(reason, len,
                 "the equilibrium curve touches the diagonal at x = %.4g (y* - x = %.2g there): "
                 "a pinch with no driving force lies between xb and xd",
                 xm, fm);
        return PW_OK;
    }
    if (n_bad == n) {
        snprintf(reason, len,
                 "y* <= x on the whole range [%.4g, %.4g]: component 1 is not the more volatile "
                 "component there, so it cannot go overhead; the targets must satisfy xb < zf < xd "
                 "(component 1 overhead, where it is the more volatile) or xd < zf < xb "
                 "(component 1 to the bottoms, where it is the less volatile)",
                 xb, xd);
        return PW_OK;
    }
    /* Azeotropes: strict sign changes of f between neighbouring grid points. */
    double roots[MAX_ROOTS];
    size_t nr = 0, n_changes = 0;
    for (size_t j = 0; j + 1 < n; j++) {
        if (!((fg[j] > 0.0 && fg[j + 1] < 0.0) || (fg[j] < 0.0 && fg[j + 1] > 0.0)))
            continue;
        n_changes++;
        if (nr < MAX_ROOTS) {
            pw_status st = pw_column_root(w, excess, NULL, xg[j], xg[j + 1], fg[j], fg[j + 1],
                                          &roots[nr]);
            if (st != PW_OK)
                return st;
            nr++;
        }
    }
    if (fabs(fb) <= tol || fabs(fd) <= tol) {
        bool at_b = fabs(fb) <= tol;
        snprintf(reason, len,
                 "pinch at a product composition: the equilibrium curve meets the diagonal at "
                 "the %s composition x = %.6g (a product at a pure component or an azeotrope "
                 "needs infinitely many stages)",
                 at_b ? "bottoms" : "distillate", at_b ? xb : xd);
        if (nr == 0)
            return PW_OK;
        append(reason, len, "; also ");
    }
    if (nr == 0) {
        /* f <= tol at interior grid points without a strict sign change: a touch. */
        size_t jmin = 1;
        for (size_t j = 1; j + 1 < n; j++)
            if (fg[j] < fg[jmin])
                jmin = j;
        if (fabs(fb) > tol && fabs(fd) > tol) {
            snprintf(tmp, sizeof tmp,
                     "the equilibrium curve touches the diagonal at x = %.4g: a pinch with no "
                     "driving force lies between xb and xd",
                     xg[jmin]);
            append(reason, len, tmp);
        }
        return PW_OK;
    }
    if (n_changes == 1)
        snprintf(tmp, sizeof tmp, "an azeotrope near x = %.4g lies between xb and xd", roots[0]);
    else if (nr == 2)
        snprintf(tmp, sizeof tmp, "azeotropes near x = %.4g and x = %.4g lie between xb and xd",
                 roots[0], roots[1]);
    else
        snprintf(tmp, sizeof tmp, "%zu azeotropes, the first near x = %.4g, lie between xb and xd",
                 n_changes, roots[0]);
    append(reason, len, tmp);
    if (fd < -tol && fb > tol)
        append(reason, len, "; the distillate target lies beyond the azeotrope");
    else if (fb < -tol && fd > tol)
        append(reason, len, "; the bottoms target lies beyond the azeotrope");
    else if (fb < -tol && fd < -tol)
        append(reason, len, "; both product targets lie beyond an azeotrope");
    append(reason, len,
           " (not reachable by ordinary distillation at this pressure; pressure swing or an "
           "entrainer may help)");
    return PW_OK;
}
