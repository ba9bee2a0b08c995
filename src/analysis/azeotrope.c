/* Azeotrope search at fixed P or T: grid of ln alpha12, Brent on every sign change, Brent
 * minimisation on every interior minimum of |ln alpha12|, extremum classification.
 * See include/pinchwise/azeotrope.h and docs/azeotrope.md. */
#include <pinchwise/azeotrope.h>

#include <float.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "analysis/az_internal.h"
#include "base/solve1d.h"

pw_az_options pw_azeotrope_default_options(void)
{
    pw_az_options o;
    o.grid = 1000;
    o.x_edge = 1e-6;
    o.xtol_abs = 1e-12;
    o.xtol_rel = 64.0 * DBL_EPSILON;
    o.max_iter = 200;
    o.touch_tol = 1e-3;
    o.h_class = 1e-3;
    return o;
}

const char *pw_az_kind_name(pw_az_kind kind)
{
    return kind == PW_AZ_MAXIMUM_BOILING ? "maximum-boiling" : "minimum-boiling";
}

static pw_status check_options(const pw_az_options *o)
{
    if (o->grid < 50 || o->grid > 10000000)
        return PW_EINVAL;
    if (!(o->x_edge > 0.0 && o->x_edge < 0.01))
        return PW_EINVAL;
    if (!(o->xtol_abs >= 0.0) || !(o->xtol_rel >= 0.0) || o->xtol_abs + o->xtol_rel <= 0.0)
        return PW_EINVAL;
    if (o->max_iter < 1 || !(o->touch_tol >= 0.0) || !(o->h_class > 0.0 && o->h_class < 0.1))
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

/* Refines the interior minimum of |f| at grid index i; adds roots or a touch point. */
static pw_status refine_minimum(pw_az_ctx *c, pw_az_result *out, const double *x,
                                const double *f, size_t i, size_t *nr, double *roots)
{
    c->sign = f[i] > 0.0 ? 1.0 : -1.0;
    double xm;
    pw_status st = brent_min(c, x[i - 1], x[i], x[i + 1], f[i], f[i - 1], f[i + 1], &xm);
    if (st != PW_OK && st != PW_EMAXITER)
        return st;
    double fm;
    pw_eq_point eq;
    st = pw_az_ctx_eval(c, xm, &fm, &eq);
    if (st != PW_OK)
        return st;
    if (sgn(fm) == 0) {
        add_root(out, xm, nr, roots);
        return PW_OK;
    }
    if (sgn(fm) != sgn(f[i])) { /* two roots inside the cell */
        double r1, r2;
        st = pw_az_brent_root(c, x[i - 1], xm, &r1);
        if (st == PW_OK)
            st = pw_az_brent_root(c, xm, x[i + 1], &r2);
        if (st != PW_OK)
            return st;
        add_root(out, r1, nr, roots);
        add_root(out, r2, nr, roots);
        return PW_OK;
    }
    if (fabs(fm) <= c->opt.touch_tol && out->n_touch < PW_AZ_MAX) {
        double dx = x[1] - x[0];
        for (size_t k = 0; k < out->n_touch; k++)
            if (fabs(out->touch[k].x1 - xm) < 2.0 * dx)
                return PW_OK;
        pw_az_touch *t = &out->touch[out->n_touch++];
        t->x1 = xm;
        t->ln_alpha = fm;
        t->T_K = eq.T_K;
        t->P_Pa = eq.P_Pa;
    }
    return PW_OK;
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
    double h = fmin(c->opt.h_class, 0.5 * fmin(x, 1.0 - x));
    double vm, vp, fm, fp;
    st = bubble_value(c, x - h, &vm, &fm);
    if (st == PW_OK)
        st = bubble_value(c, x + h, &vp, &fp);
    if (st != PW_OK)
        return st;
    double v0 = c->mode == PW_AZ_ISOBARIC ? eq.T_K : eq.P_Pa;
    az->slope = (fp - fm) / (2.0 * h);
    az->curvature = vm + vp - 2.0 * v0;
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

static pw_status scan_grid(pw_az_ctx *c, pw_az_result *out, double *x, double *f)
{
    const size_t n = c->opt.grid;
    const double span = 1.0 - 2.0 * c->opt.x_edge;
    for (size_t i = 0; i < n; i++) {
        x[i] = c->opt.x_edge + span * (double)i / (double)(n - 1);
        pw_eq_point eq;
        pw_status st = pw_az_ctx_eval(c, x[i], &f[i], &eq);
        if (st != PW_OK)
            return st;
    }
    double roots[PW_AZ_MAX];
    size_t nr = 0;
    for (size_t i = 0; i < n; i++) {
        pw_status st = PW_OK;
        if (f[i] == 0.0 && (i == 0 || f[i - 1] != 0.0))
            add_root(out, x[i], &nr, roots);
        if (i + 1 < n && sgn(f[i]) * sgn(f[i + 1]) < 0) {
            double r;
            st = pw_az_brent_root(c, x[i], x[i + 1], &r);
            if (st == PW_OK)
                add_root(out, r, &nr, roots);
        }
        if (st == PW_OK && i > 0 && i + 1 < n && sgn(f[i - 1]) == sgn(f[i]) &&
            sgn(f[i]) == sgn(f[i + 1]) && sgn(f[i]) != 0 && fabs(f[i]) < fabs(f[i - 1]) &&
            fabs(f[i]) < fabs(f[i + 1]))
            st = refine_minimum(c, out, x, f, i, &nr, roots);
        if (st != PW_OK)
            return st;
    }
    /* sort (few roots: insertion sort) */
    for (size_t i = 1; i < nr; i++)
        for (size_t j = i; j > 0 && roots[j - 1] > roots[j]; j--) {
            double t = roots[j];
            roots[j] = roots[j - 1];
            roots[j - 1] = t;
        }
    for (size_t i = 0; i < nr; i++) {
        pw_status st = classify(c, roots[i], &out->az[i]);
        if (st != PW_OK)
            return st;
    }
    out->n = nr;
    return PW_OK;
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
