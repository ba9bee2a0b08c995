/* Azeotrope search at fixed P or T: a branch and bound over the cells of a coarse table of
 * ln alpha12 that proves every cell free of roots or holding exactly one (under a checked bound
 * on the curvature), Brent on every root, Brent minimisation on every interior minimum of
 * |ln alpha12| it meets, extremum classification.
 * See include/pinchwise/azeotrope.h and docs/azeotrope.md. */
#include <pinchwise/azeotrope.h>

#include <float.h>
#include <math.h>
#include <stdbool.h>
#include <stdlib.h>
#include <string.h>

#include "analysis/az_internal.h"
#include "base/solve1d.h"

pw_az_options pw_azeotrope_default_options(void)
{
    pw_az_options o;
    o.grid = 64;
    o.x_edge = 1e-6;
    o.xtol_abs = 1e-12;
    o.xtol_rel = 64.0 * DBL_EPSILON;
    o.max_iter = 200;
    o.touch_tol = 1e-3;
    o.h_class = 1e-3;
    o.skip_x1[0] = o.skip_x1[1] = NAN;
    return o;
}

const char *pw_az_kind_name(pw_az_kind kind)
{
    return kind == PW_AZ_MAXIMUM_BOILING ? "maximum-boiling" : "minimum-boiling";
}

static pw_status check_options(const pw_az_options *o)
{
    if (o->grid < 8 || o->grid > 10000000)
        return PW_EINVAL;
    if (!(o->x_edge > 0.0 && o->x_edge < 0.01))
        return PW_EINVAL;
    if (!(o->xtol_abs >= 0.0) || !(o->xtol_rel >= 0.0) || o->xtol_abs + o->xtol_rel <= 0.0)
        return PW_EINVAL;
    if (o->max_iter < 1 || !(o->touch_tol >= 0.0) || !(o->h_class > 0.0 && o->h_class < 0.1))
        return PW_EINVAL;
    if (!isnan(o->skip_x1[0]) || !isnan(o->skip_x1[1])) /* both set, ordered, inside [0, 1] */
        if (!(o->skip_x1[0] >= 0.0 && o->skip_x1[0] < o->skip_x1[1] && o->skip_x1[1] <= 1.0))
            return PW_EINVAL;
    return PW_OK;
}

static void note_T(pw_az_ctx *c, double T_K)
{
    if (T_K < c->T_lo_K)
        c->T_lo_K = T_K;
    if (T_K > c->T_hi_K)
        c->T_hi_K = T_K;
}

static pw_status ln_alpha_at(const pw_system *s, pw_az_mode mode, double fixed, double x1,
                             double T_guess_K, double *ln_alpha, pw_eq_point *bubble);

pw_status pw_az_ctx_eval(pw_az_ctx *c, double x1, double *f, pw_eq_point *eq)
{
    pw_status st = !(x1 >= 0.0 && x1 <= 1.0) || !(c->fixed > 0.0) || !isfinite(c->fixed)
                       ? PW_EINVAL
                       : ln_alpha_at(c->s, c->mode, c->fixed, x1, c->T_warm_K, f, eq);
    c->n_evals++;
    if (st == PW_OK && c->mode == PW_AZ_ISOBARIC)
        c->T_warm_K = eq->T_K;
    if (st != PW_OK) {
        if (c->status == PW_OK) {
            c->status = st;
            c->fail_x1 = x1;
        }
        return st;
    }
    note_T(c, eq->T_K);
    return PW_OK;
}

pw_status pw_azeotrope_ln_alpha(const pw_system *s, pw_az_mode mode, double fixed, double x1,
                                double *ln_alpha, pw_eq_point *bubble)
{
    if (!s || !ln_alpha || !bubble || !(x1 >= 0.0 && x1 <= 1.0) || !(fixed > 0.0) ||
        !isfinite(fixed))
        return PW_EINVAL;
    return ln_alpha_at(s, mode, fixed, x1, NAN, ln_alpha, bubble);
}

static pw_status ln_alpha_at(const pw_system *s, pw_az_mode mode, double fixed, double x1,
                             double T_guess_K, double *ln_alpha, pw_eq_point *bubble)
{
    pw_status st = mode == PW_AZ_ISOBARIC ? pw_bubble_T_from(s, fixed, x1, T_guess_K, bubble)
                                          : pw_bubble_P(s, fixed, x1, bubble);
    if (st != PW_OK)
        return st;
    double num = bubble->gamma[0] * bubble->Psat_Pa[0];
    double den = bubble->gamma[1] * bubble->Psat_Pa[1];
    if (!(num > 0.0) || !(den > 0.0) || !isfinite(num) || !isfinite(den))
        return PW_EDOM;
    *ln_alpha = log(num / den);
    return PW_OK;
}

pw_status pw_az_end_ln_alpha(const pw_system *s, pw_az_mode mode, double fixed, int end,
                             double *ln_alpha, double *T_K, double *P_Pa)
{
    /* Pure liquid `end` (x1 = end): its own boiling point, the other at infinite dilution. */
    const pw_component *pure = &s->comp[end ? 0 : 1];
    double T = fixed, P = fixed;
    pw_status st = PW_OK;
    if (mode == PW_AZ_ISOBARIC)
        st = pw_tsat(pure, P, &T);
    if (st != PW_OK)
        return st;
    double Ps[2];
    for (int i = 0; i < 2 && st == PW_OK; i++)
        st = pw_psat(&s->comp[i], T, &Ps[i], NULL);
    if (st != PW_OK)
        return st;
    if (mode == PW_AZ_ISOTHERMAL)
        P = Ps[end ? 0 : 1];
    pw_activity a;
    st = pw_system_activity(s, end ? 1.0 : 0.0, T, &a);
    if (st != PW_OK)
        return st;
    double f = a.lngamma[0] - a.lngamma[1] + log(Ps[0] / Ps[1]);
    if (!isfinite(f))
        return PW_EDOM;
    *ln_alpha = f;
    if (T_K)
        *T_K = T;
    if (P_Pa)
        *P_Pa = P;
    return PW_OK;
}

static pw_status root_fn(void *params, double x, double *f)
{
    pw_eq_point eq;
    return pw_az_ctx_eval(params, x, f, &eq);
}

static pw_status min_fn(void *params, double x, double *f)
{
    pw_az_ctx *c = params;
    pw_status st = root_fn(params, x, f);
    if (st == PW_OK)
        *f *= c->sign;
    return st;
}

static pw_solve1d_opts az_opts(const pw_az_ctx *c, double xtol_abs, double xtol_rel)
{
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = xtol_abs;
    o.xtol_rel = xtol_rel;
    o.max_iter = c->opt.max_iter > 100000 ? 100000u : (unsigned)c->opt.max_iter;
    return o;
}

pw_status pw_az_brent_root(pw_az_ctx *c, double a, double b, double *root)
{
    pw_solve1d_opts o = az_opts(c, c->opt.xtol_abs, c->opt.xtol_rel);
    pw_status st = pw_root1d(root_fn, c, a, b, NAN, NAN, &o, root, NULL);
    return c->status != PW_OK ? c->status : st; /* an earlier failure of this search stands */
}

/* Minimises sign*f on [a, b] from the interior guess m (sign*f(m) below both ends). */
static pw_status brent_min(pw_az_ctx *c, double a, double m, double b, double fm, double fa,
                           double fb, double *xm)
{
    /* A minimum is flat: its position is known to about sqrt(DBL_EPSILON) relative. Stop as soon
     * as the function crosses zero: the caller then brackets two roots. */
    pw_solve1d_opts o = az_opts(c, 1e-10, 0.0);
    o.f_stop = 0.0;
    double fmin;
    pw_status st = pw_min1d(min_fn, c, a, m, b, c->sign * fa, c->sign * fm, c->sign * fb, &o, xm,
                            &fmin, NULL);
    return c->status != PW_OK ? c->status : st;
}

static int sgn(double v)
{
    return (v > 0.0) - (v < 0.0);
}

static void add_root(pw_az_result *out, double x, size_t *count, double *roots)
{
    for (size_t i = 0; i < *count; i++)
        if (fabs(roots[i] - x) < 1e-9)
            return;
    if (*count >= PW_AZ_MAX) {
        out->truncated = true;
        return;
    }
    roots[(*count)++] = x;
}

/* Bubble T (isobaric) or P (isothermal) at x. */
static pw_status bubble_value(pw_az_ctx *c, double x, double *v, double *f)
{
    pw_eq_point eq;
    pw_status st = pw_az_ctx_eval(c, x, f, &eq);
    if (st == PW_OK)
        *v = c->mode == PW_AZ_ISOBARIC ? eq.T_K : eq.P_Pa;
    return st;
}

static pw_status classify(pw_az_ctx *c, double x, pw_azeotrope *az)
{
    double f0;
    pw_eq_point eq;
    pw_status st = pw_az_ctx_eval(c, x, &f0, &eq);
    if (st != PW_OK)
        return st;
    az->x1 = x;
    az->T_K = eq.T_K;
    az->P_Pa = eq.P_Pa;
    for (int i = 0; i < 2; i++) {
        az->gamma[i] = eq.gamma[i];
        az->Psat_Pa[i] = eq.Psat_Pa[i];
    }
    /* Central probes x -/+ h; beside a skipped interval (whose bubble points may not exist)
     * that a probe would reach, one-sided probes x + s h, x + 2 s h away from it (s = -1 when the
     * interval lies to the right): the slope by the one-sided second-order formula, the
     * curvature by the second difference of the three values. */
    const double *skip = c->opt.skip_x1;
    const int s = x <= skip[0] ? -1 : x >= skip[1] ? 1 : 0; /* 0: no interval (NAN) */
    const double d_skip = s < 0 ? skip[0] - x : s > 0 ? x - skip[1] : (double)INFINITY;
    double h = fmin(c->opt.h_class, 0.5 * fmin(x, 1.0 - x));
    const bool one_sided = s != 0 && d_skip < h;
    if (one_sided)
        h = fmin(c->opt.h_class, 0.25 * (s < 0 ? x : 1.0 - x));
    double v0 = c->mode == PW_AZ_ISOBARIC ? eq.T_K : eq.P_Pa;
    double v1, v2, f1, f2;
    st = bubble_value(c, one_sided ? x + s * h : x - h, &v1, &f1);
    if (st == PW_OK)
        st = bubble_value(c, one_sided ? x + 2.0 * s * h : x + h, &v2, &f2);
    if (st != PW_OK)
        return st;
    if (one_sided) {
        az->slope = s * (-3.0 * f0 + 4.0 * f1 - f2) / (2.0 * h);
        az->curvature = v0 + v2 - 2.0 * v1;
    } else {
        az->slope = (f2 - f1) / (2.0 * h);
        az->curvature = v1 + v2 - 2.0 * v0;
    }
    /* Gibbs-Konovalov: y1 > x1 where the bubble T falls (P rises) with x1, so ln alpha12
     * falling through zero marks a T minimum / P maximum: minimum-boiling. */
    pw_az_kind by_slope = az->slope < 0.0 ? PW_AZ_MINIMUM_BOILING : PW_AZ_MAXIMUM_BOILING;
    double scale = fabs(v0) * 64.0 * DBL_EPSILON;
    pw_az_kind by_extremum = by_slope;
    bool has_extremum = fabs(az->curvature) > scale;
    if (has_extremum) {
        bool minimum = az->curvature > 0.0;
        if (c->mode == PW_AZ_ISOBARIC)
            by_extremum = minimum ? PW_AZ_MINIMUM_BOILING : PW_AZ_MAXIMUM_BOILING;
        else
            by_extremum = minimum ? PW_AZ_MAXIMUM_BOILING : PW_AZ_MINIMUM_BOILING;
    }
    az->kind = by_extremum;
    az->tangential = !has_extremum || by_extremum != by_slope || fabs(az->slope) < 1e-6;
    return PW_OK;
}

void pw_az_result_clear(pw_az_result *out, pw_az_mode mode, double fixed)
{
    memset(out, 0, sizeof *out);
    out->mode = mode;
    out->fixed = fixed;
    out->ln_alpha_end[0] = out->ln_alpha_end[1] = NAN;
    out->bubble_end[0] = out->bubble_end[1] = NAN;
    out->T_lo_K = out->T_hi_K = NAN;
    out->fail_x1 = NAN;
}

/* ---- the search: branch and bound over the cells of a coarse table ----
 *
 * Assumption (checked wherever the search samples): |f''| <= K on [x_edge, 1 - x_edge], with K
 * four times the largest second divided difference of the table plus a floor; a midpoint further
 * from its chord than K h^2/8 (+ 2 eps) raises K and the search starts again. Under it, on a
 * cell [a, b] of width h with chord slope s:
 *   - |f' - s| <= K h/2 everywhere on the cell, so |s| > K h/2 (+ noise) proves f strictly
 *     monotone there: exactly one root when the ends differ in sign, none otherwise, and no
 *     interior extremum of |f|;
 *   - f lies within K h^2/8 of its chord, so ends of one sign with min |f| > K h^2/8 + eps prove
 *     the cell free of roots, and min |f| > touch_tol + K h^2/8 + eps free of near-tangential
 *     points too.
 * Every other cell is halved (one evaluation), or, when its midpoint lies below both ends in
 * |f|, Brent's minimiser finds the interior minimum of |f| and the cell is cut there.
 * docs/azeotrope.md, "Search". */

#define AZ_SAFETY 4.0      /* K = 4 x the table's largest |second difference| ... */
#define AZ_K_FLOOR 1e-6    /* ... plus this */
#define AZ_EPS 1e-11       /* absolute precision assumed of an f value (bubble T to ~1e-13 K) */
#define AZ_MIN_WIDTH 1e-13 /* cells narrower than this are not halved */
#define AZ_MAX_RESTARTS 8
#define AZ_SLIVER 1e-7     /* a table part shorter than this share of the range: one cell */
#define AZ_STACK 512

typedef struct az_cell {
    double a, b, fa, fb;
} az_cell;

typedef struct az_bb {
    pw_az_ctx *c;
    pw_az_result *out;
    double K;
    double roots[PW_AZ_MAX];
    size_t nr;
    bool restart;
    double *sx, *sf; /* every point the search evaluated (not Brent's inner ones) */
    size_t ns, cap;
    double h_touch;  /* root-free cells narrower than this are not halved for touches */
} az_bb;

static pw_status bb_eval(az_bb *bb, double x, double *f, pw_eq_point *eq)
{
    pw_status st = pw_az_ctx_eval(bb->c, x, f, eq);
    if (st != PW_OK)
        return st;
    if (*f == 0.0)
        add_root(bb->out, x, &bb->nr, bb->roots);
    if (bb->ns == bb->cap) {
        size_t cap = bb->cap ? 2 * bb->cap : 256;
        double *sx = realloc(bb->sx, cap * sizeof *sx);
        if (!sx)
            return PW_ENOMEM;
        bb->sx = sx;
        double *sf = realloc(bb->sf, cap * sizeof *sf);
        if (!sf)
            return PW_ENOMEM;
        bb->sf = sf;
        bb->cap = cap;
    }
    bb->sx[bb->ns] = x;
    bb->sf[bb->ns++] = *f;
    return PW_OK;
}

static bool cell_monotone(const az_bb *bb, const az_cell *e)
{
    const double h = e->b - e->a;
    return fabs(e->fb - e->fa) > 0.5 * bb->K * h * h + 2.0 * AZ_EPS;
}

/* A lower bound of |f| on a cell whose ends have one sign (not zero). */
static double cell_floor(const az_bb *bb, const az_cell *e)
{
    const double h = e->b - e->a;
    return fmin(fabs(e->fa), fabs(e->fb)) - bb->K * h * h / 8.0 - AZ_EPS;
}

static bool curvature_ok(az_bb *bb, const az_cell *e, double fm)
{
    const double h = e->b - e->a;
    double off = fabs(fm - 0.5 * (e->fa + e->fb));
    if (off <= bb->K * h * h / 8.0 + 2.0 * AZ_EPS)
        return true;
    bb->K = fmax(2.0 * bb->K, AZ_SAFETY * 8.0 * off / (h * h));
    return false;
}

/* Adds a near-tangential point unless one lies within `apart` of it. */
static void add_touch(pw_az_result *out, double x, double f, const pw_eq_point *eq, double apart)
{
    for (size_t k = 0; k < out->n_touch; k++)
        if (fabs(out->touch[k].x1 - x) < apart)
            return;
    if (out->n_touch >= PW_AZ_MAX)
        return;
    pw_az_touch *t = &out->touch[out->n_touch++];
    t->x1 = x;
    t->ln_alpha = f;
    t->T_K = eq->T_K;
    t->P_Pa = eq->P_Pa;
}

/* The interior minimum of |f| in a cell whose midpoint m lies below both ends; *xm, *fxm the
 * point Brent ends at (where f crosses zero, when it does). */
static pw_status cell_minimum(az_bb *bb, const az_cell *e, double m, double fm, double *xm,
                              double *fxm, pw_eq_point *eq)
{
    pw_az_ctx *c = bb->c;
    c->sign = fm > 0.0 ? 1.0 : -1.0;
    pw_status st = brent_min(c, e->a, m, e->b, fm, e->fa, e->fb, xm);
    if (st != PW_OK && st != PW_EMAXITER)
        return st;
    if (!(*xm > e->a && *xm < e->b))
        *xm = m;
    return bb_eval(bb, *xm, fxm, eq);
}

static pw_status search_cells(az_bb *bb, const az_cell *start)
{
    pw_az_ctx *c = bb->c;
    az_cell stack[AZ_STACK];
    size_t top = 0;
    stack[top++] = *start;
    while (top > 0) {
        az_cell e = stack[--top];
        const double h = e.b - e.a;
        const int sa = sgn(e.fa), sb = sgn(e.fb);
        const bool narrow = h < AZ_MIN_WIDTH * fmax(1.0, fabs(e.a));
        bool root_free = false;
        if (sa * sb < 0) {
            if (narrow || cell_monotone(bb, &e)) { /* exactly one root */
                double r;
                pw_status st = pw_az_brent_root(c, e.a, e.b, &r);
                if (st != PW_OK)
                    return st;
                add_root(bb->out, r, &bb->nr, bb->roots);
                continue;
            }
        } else if (sa == 0 || sb == 0) { /* a root at an end (already counted) */
            if (narrow || cell_monotone(bb, &e))
                continue;
        } else {
            double lb = cell_floor(bb, &e);
            root_free = lb > 0.0;
            if (narrow || (root_free && (lb > c->opt.touch_tol || h < bb->h_touch ||
                                         cell_monotone(bb, &e))))
                continue;
        }
        const double m = e.a + 0.5 * h;
        double fm;
        pw_eq_point eq;
        pw_status st = bb_eval(bb, m, &fm, &eq);
        if (st != PW_OK)
            return st;
        if (!curvature_ok(bb, &e, fm)) {
            bb->restart = true;
            return PW_OK;
        }
        double cut = m, fcut = fm;
        if (!root_free && sa != 0 && sa == sb && sgn(fm) == sa && fabs(fm) < fabs(e.fa) &&
            fabs(fm) < fabs(e.fb)) { /* two roots or none: cut where |f| is least */
            double xm, fxm;
            st = cell_minimum(bb, &e, m, fm, &xm, &fxm, &eq);
            if (st != PW_OK)
                return st;
            cut = xm;
            fcut = fxm;
        }
        if (top + 2 > AZ_STACK)
            return PW_ENOCONV;
        stack[top++] = (az_cell){cut, e.b, fcut, e.fb}; /* the left half is searched first */
        stack[top++] = (az_cell){e.a, cut, e.fa, fcut};
    }
    return PW_OK;
}

static void sort_doubles(double *v, size_t n)
{
    for (size_t i = 1; i < n; i++) /* few values: insertion sort */
        for (size_t j = i; j > 0 && v[j - 1] > v[j]; j--) {
            double t = v[j];
            v[j] = v[j - 1];
            v[j - 1] = t;
        }
}

static void sort_touches(pw_az_result *out)
{
    for (size_t i = 1; i < out->n_touch; i++)
        for (size_t j = i; j > 0 && out->touch[j - 1].x1 > out->touch[j].x1; j--) {
            pw_az_touch t = out->touch[j];
            out->touch[j] = out->touch[j - 1];
            out->touch[j - 1] = t;
        }
}

typedef struct az_sample {
    double x, f;
} az_sample;

static int cmp_sample(const void *a, const void *b)
{
    double xa = ((const az_sample *)a)->x, xb = ((const az_sample *)b)->x;
    return (xa > xb) - (xa < xb);
}

static bool near_root(const az_bb *bb, double x, double d)
{
    for (size_t k = 0; k < bb->nr; k++)
        if (fabs(bb->roots[k] - x) < d)
            return true;
    return false;
}

/* Near-tangential points: every interior local minimum of |f| among the points the search
 * evaluated, on one side of zero and within reach of touch_tol under the curvature bound, is
 * refined by Brent's minimiser (a crossing found there adds its two roots). */
static pw_status find_touches(az_bb *bb)
{
    pw_az_ctx *c = bb->c;
    const size_t n = bb->ns;
    az_sample *p = malloc((n ? n : 1) * sizeof *p);
    if (!p)
        return PW_ENOMEM;
    for (size_t i = 0; i < n; i++)
        p[i] = (az_sample){bb->sx[i], bb->sf[i]};
    qsort(p, n, sizeof *p, cmp_sample);
    size_t m = 0;
    for (size_t i = 0; i < n; i++)
        if (m == 0 || p[i].x > p[m - 1].x)
            p[m++] = p[i];
    pw_status st = PW_OK;
    const double *skip = c->opt.skip_x1;
    for (size_t i = 1; i + 1 < m && st == PW_OK; i++) {
        const double f = p[i].f, h = p[i + 1].x - p[i - 1].x;
        if (p[i - 1].x <= skip[0] && p[i + 1].x >= skip[1]) /* spans the skipped interval */
            continue;
        if (sgn(f) == 0 || sgn(p[i - 1].f) != sgn(f) || sgn(p[i + 1].f) != sgn(f) ||
            !(fabs(f) <= fabs(p[i - 1].f) && fabs(f) < fabs(p[i + 1].f)) ||
            fabs(f) - bb->K * h * h / 8.0 - AZ_EPS > c->opt.touch_tol)
            continue;
        c->sign = f > 0.0 ? 1.0 : -1.0;
        double xm = p[i].x, fm; /* a tie with the left neighbour: a rounding-level plateau */
        if (fabs(f) < fabs(p[i - 1].f)) {
            st = brent_min(c, p[i - 1].x, p[i].x, p[i + 1].x, f, p[i - 1].f, p[i + 1].f, &xm);
            if (st != PW_OK && st != PW_EMAXITER)
                break;
        }
        pw_eq_point eq;
        st = pw_az_ctx_eval(c, xm, &fm, &eq);
        if (st != PW_OK)
            break;
        if (sgn(fm) == 0) {
            add_root(bb->out, xm, &bb->nr, bb->roots);
        } else if (sgn(fm) != sgn(f)) { /* two roots the bound did not foresee */
            double r1, r2;
            st = pw_az_brent_root(c, p[i - 1].x, xm, &r1);
            if (st == PW_OK)
                st = pw_az_brent_root(c, xm, p[i + 1].x, &r2);
            if (st == PW_OK) {
                add_root(bb->out, r1, &bb->nr, bb->roots);
                add_root(bb->out, r2, &bb->nr, bb->roots);
            }
        } else if (fabs(fm) <= c->opt.touch_tol && !near_root(bb, xm, 2.0 * bb->h_touch)) {
            add_touch(bb->out, xm, fm, &eq, 2.0 * bb->h_touch);
        }
    }
    free(p);
    return st;
}

/* The starting table: n points on [x_edge, 1 - x_edge], or, with a skipped interval, on the
 * parts of it left and right of that interval (each part's ends included, points shared in
 * proportion to length, at least 4 on a part that has one); *n_left is the number of points
 * left of the interval (n when none is skipped), so no cell of the table spans it. A part
 * shorter than AZ_SLIVER of the range is one cell, its two ends (a table packed into a sliver
 * would turn rounding noise into a huge curvature bound). */
static size_t table_x(const pw_az_options *o, double *x, size_t *n_left)
{
    const size_t n = o->grid;
    const double lo = o->x_edge, hi = 1.0 - o->x_edge;
    double a = o->skip_x1[0], b = o->skip_x1[1];
    if (isnan(a) || b <= lo || a >= hi) { /* nothing skipped inside the range */
        for (size_t i = 0; i < n; i++)
            x[i] = i + 1 == n ? hi : lo + (hi - lo) * (double)i / (double)(n - 1);
        *n_left = n;
        return n;
    }
    const double len_l = a > lo ? a - lo : 0.0, len_r = b < hi ? hi - b : 0.0;
    const double sliver = AZ_SLIVER * (hi - lo);
    size_t nl, nr;
    if (len_l > 0.0 && len_l < sliver) {
        nl = 2;
        nr = len_r > 0.0 ? (len_r < sliver ? 2 : n - 2) : 0;
    } else if (len_r > 0.0 && len_r < sliver) {
        nr = 2;
        nl = len_l > 0.0 ? n - 2 : 0;
    } else {
        nl = len_l > 0.0 ? (size_t)llround((double)n * len_l / (len_l + len_r)) : 0;
        if (len_l > 0.0 && nl < 4)
            nl = 4;
        if (len_r > 0.0 && n - nl < 4)
            nl = n - 4;
        nr = len_r > 0.0 ? n - nl : 0;
    }
    for (size_t i = 0; i < nl; i++)
        x[i] = i + 1 == nl ? a : lo + len_l * (double)i / (double)(nl - 1);
    for (size_t i = 0; i < nr; i++)
        x[nl + i] = i + 1 == nr ? hi : b + len_r * (double)i / (double)(nr - 1);
    *n_left = nl;
    return nl + nr;
}

static pw_status scan_grid(pw_az_ctx *c, pw_az_result *out, double *x, double *f)
{
    size_t n_left;
    const size_t n = table_x(&c->opt, x, &n_left);
    const double span = 1.0 - 2.0 * c->opt.x_edge;
    az_bb bb = {.c = c, .out = out, .h_touch = 1e-3 * span};
    pw_status st = PW_OK;
    for (size_t i = 0; i < n && st == PW_OK; i++) {
        pw_eq_point eq;
        st = bb_eval(&bb, x[i], &f[i], &eq);
    }
    if (st != PW_OK)
        goto done;
    double d2max = 0.0;
    for (size_t i = 1; i + 1 < n; i++) {
        if (i == n_left || i + 1 == n_left) /* a triple across the skipped interval */
            continue;
        double s1 = (f[i] - f[i - 1]) / (x[i] - x[i - 1]);
        double s2 = (f[i + 1] - f[i]) / (x[i + 1] - x[i]);
        d2max = fmax(d2max, fabs(2.0 * (s2 - s1) / (x[i + 1] - x[i - 1])));
    }
    bb.K = AZ_SAFETY * d2max + AZ_K_FLOOR;
    for (int round = 0;; round++) {
        bb.restart = false;
        bb.nr = 0;
        out->n_touch = 0;
        out->truncated = false;
        for (size_t i = 0; i < n; i++)
            if (f[i] == 0.0)
                add_root(out, x[i], &bb.nr, bb.roots);
        for (size_t i = 0; i + 1 < n && !bb.restart && st == PW_OK; i++) {
            if (i + 1 == n_left) /* the skipped interval: not a cell */
                continue;
            az_cell e = {x[i], x[i + 1], f[i], f[i + 1]};
            st = search_cells(&bb, &e);
        }
        if (st != PW_OK || !bb.restart)
            break;
        if (round + 1 >= AZ_MAX_RESTARTS) {
            st = PW_ENOCONV;
            break;
        }
    }
    if (st == PW_OK)
        st = find_touches(&bb);
    if (st != PW_OK)
        goto done;
    sort_doubles(bb.roots, bb.nr);
    sort_touches(out);
    for (size_t i = 0; i < bb.nr && st == PW_OK; i++)
        st = classify(c, bb.roots[i], &out->az[i]);
    if (st == PW_OK)
        out->n = bb.nr;
done:
    free(bb.sx);
    free(bb.sf);
    return st;
}

pw_status pw_azeotrope_find(const pw_system *s, pw_az_mode mode, double fixed,
                            const pw_az_options *opt, pw_az_result *out)
{
    if (!s || !out || (mode != PW_AZ_ISOBARIC && mode != PW_AZ_ISOTHERMAL) || !(fixed > 0.0) ||
        !isfinite(fixed))
        return PW_EINVAL;
    pw_az_result_clear(out, mode, fixed);
    pw_az_ctx c = {.s = s, .mode = mode, .fixed = fixed, .status = PW_OK, .fail_x1 = NAN,
                   .T_lo_K = INFINITY, .T_hi_K = -INFINITY};
    c.opt = opt ? *opt : pw_azeotrope_default_options();
    pw_status st = check_options(&c.opt);
    if (st != PW_OK)
        return st;
    for (int e = 0; e < 2 && st == PW_OK; e++) {
        double T, P;
        st = pw_az_end_ln_alpha(s, mode, fixed, e, &out->ln_alpha_end[e], &T, &P);
        if (st == PW_OK) {
            out->bubble_end[e] = mode == PW_AZ_ISOBARIC ? T : P;
            note_T(&c, T);
        } else {
            out->fail_x1 = e;
        }
    }
    if (st != PW_OK)
        return st;
    double *buf = malloc(2 * c.opt.grid * sizeof *buf);
    if (!buf)
        return PW_ENOMEM;
    st = scan_grid(&c, out, buf, buf + c.opt.grid);
    free(buf);
    out->n_evals = c.n_evals;
    out->T_lo_K = c.T_lo_K;
    out->T_hi_K = c.T_hi_K;
    if (st != PW_OK && isnan(out->fail_x1))
        out->fail_x1 = c.fail_x1;
    return st;
}
