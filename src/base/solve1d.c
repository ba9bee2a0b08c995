/* Bracketed 1-D root and minimum by GSL's Brent solvers behind a boundary that never reaches GSL's
 * error handler. See solve1d.h and docs/hardening.md. */
#include "base/solve1d.h"

#include <float.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_min.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <stdalign.h>
#include <stdbool.h>
#include <stddef.h>
#include <stdlib.h>

/* Room for the Brent states (root 64 bytes, minimiser 48 bytes in GSL 2.x); checked at run time. */
#define STATE_BYTES 256

pw_solve1d_opts pw_solve1d_default_opts(void)
{
    pw_solve1d_opts o = {
        .xtol_abs = 0.0, .xtol_rel = 4.0 * DBL_EPSILON, .max_iter = 200, .f_stop = -INFINITY};
    return o;
}

pw_status pw_gsl_status(int gsl_code)
{
    switch (gsl_code) {
    case GSL_SUCCESS:
        return PW_OK;
    case GSL_EMAXITER:
        return PW_EMAXITER;
    case GSL_ENOMEM:
        return PW_ENOMEM;
    case GSL_EINVAL:
    case GSL_EBADLEN:
    case GSL_EBADTOL:
        return PW_EINVAL;
    case GSL_EDOM:
    case GSL_EBADFUNC:
    case GSL_EZERODIV:
    case GSL_EOVRFLW:
    case GSL_EUNDRFLW:
        return PW_EDOM;
    case GSL_ERANGE:
        return PW_ERANGE;
    case GSL_ESING:
        return PW_ESINGULAR;
    default: /* GSL_CONTINUE, GSL_ENOPROG, GSL_ENOPROGJ, GSL_ETOL..., GSL_FAILURE */
        return PW_ENOCONV;
    }
}

typedef struct tramp {
    pw_fn1d f;
    void *ctx;
    pw_status st;    /* first failure */
    double fallback; /* finite value handed to GSL after a failure */
    double xa, fa, xb, fb; /* known values (GSL's set evaluates the ends again): not recomputed */
} tramp;

static double tramp_fn(double x, void *p)
{
    tramp *t = p;
    if (t->st != PW_OK)
        return t->fallback;
    if (x == t->xa)
        return t->fa;
    if (x == t->xb)
        return t->fb;
    double v = 0.0;
    pw_status st = isfinite(x) ? t->f(t->ctx, x, &v) : PW_EDOM;
    if (st == PW_OK && !isfinite(v))
        st = PW_EDOM;
    if (st != PW_OK) {
        t->st = st;
        return t->fallback;
    }
    return v;
}

static pw_status eval(tramp *t, double x, double *v)
{
    pw_status st = t->f(t->ctx, x, v);
    if (st == PW_OK && !isfinite(*v))
        st = PW_EDOM;
    return st;
}

static bool opts_ok(const pw_solve1d_opts *o)
{
    return o->xtol_abs >= 0.0 && o->xtol_rel >= 0.0 && isfinite(o->xtol_abs) &&
           isfinite(o->xtol_rel) && (o->xtol_abs > 0.0 || o->xtol_rel > 0.0) && o->max_iter > 0 &&
           !isnan(o->f_stop);
}

/* GSL's gsl_root_test_interval / gsl_min_test_interval, without its error paths. */
static bool interval_done(double lo, double hi, const pw_solve1d_opts *o)
{
    double min_abs =
        (lo > 0.0 && hi > 0.0) || (lo < 0.0 && hi < 0.0) ? fmin(fabs(lo), fabs(hi)) : 0.0;
    return fabs(hi - lo) < o->xtol_abs + o->xtol_rel * min_abs;
}

pw_status pw_root1d(pw_fn1d f, void *ctx, double a, double b, double fa, double fb,
                    const pw_solve1d_opts *o, double *root, unsigned *iters)
{
    if (iters)
        *iters = 0;
    if (!f || !root || !o || !opts_ok(o) || !isfinite(a) || !isfinite(b) || !(a < b))
        return PW_EINVAL;
    tramp t = {f, ctx, PW_OK, 0.0, NAN, NAN, NAN, NAN};
    pw_status st;
    if (isnan(fa) && (st = eval(&t, a, &fa)) != PW_OK)
        return st;
    if (isnan(fb) && (st = eval(&t, b, &fb)) != PW_OK)
        return st;
    if (!isfinite(fa) || !isfinite(fb))
        return PW_EDOM;
    if (fa == 0.0) {
        *root = a;
        return PW_OK;
    }
    if (fb == 0.0) {
        *root = b;
        return PW_OK;
    }
    if ((fa > 0.0) == (fb > 0.0))
        return PW_ENOBRACKET;
    const gsl_root_fsolver_type *T = gsl_root_fsolver_brent;
    alignas(max_align_t) unsigned char state[STATE_BYTES];
    if (T->size > sizeof state)
        return PW_ENOMEM;
    t.xa = a;
    t.fa = fa;
    t.xb = b;
    t.fb = fb;
    gsl_function F = {tramp_fn, &t};
    gsl_root_fsolver s = {
        .type = T, .function = &F, .root = 0.0, .x_lower = a, .x_upper = b, .state = state};
    /* What gsl_root_fsolver_set does, on a solver that lives here. GSL asks for the values at the
     * ends again: they are answered from what is known. A callback that fails answers 0, which
     * never trips GSL's straddle check, and the recorded failure is returned. */
    int gs = T->set(s.state, s.function, &s.root, a, b);
    if (t.st != PW_OK)
        return t.st;
    if (gs != GSL_SUCCESS)
        return pw_gsl_status(gs);
    for (unsigned it = 1; it <= o->max_iter; it++) {
        if (iters)
            *iters = it;
        gs = T->iterate(s.state, s.function, &s.root, &s.x_lower, &s.x_upper);
        if (t.st != PW_OK)
            return t.st;
        if (gs != GSL_SUCCESS)
            return pw_gsl_status(gs);
        if (interval_done(s.x_lower, s.x_upper, o)) {
            *root = s.root;
            return PW_OK;
        }
    }
    return PW_EMAXITER;
}

pw_status pw_min1d(pw_fn1d f, void *ctx, double a, double m, double b, double fa, double fm,
                   double fb, const pw_solve1d_opts *o, double *xmin, double *fmin, unsigned *iters)
{
    if (iters)
        *iters = 0;
    if (!f || !xmin || !fmin || !o || !opts_ok(o) || !isfinite(a) || !isfinite(m) || !isfinite(b) ||
        !(a < m && m < b))
        return PW_EINVAL;
    tramp t = {f, ctx, PW_OK, 0.0, NAN, NAN, NAN, NAN};
    pw_status st;
    if (isnan(fm) && (st = eval(&t, m, &fm)) != PW_OK)
        return st;
    *xmin = m;
    *fmin = fm;
    if (isnan(fa) && (st = eval(&t, a, &fa)) != PW_OK)
        return st;
    if (isnan(fb) && (st = eval(&t, b, &fb)) != PW_OK)
        return st;
    if (!isfinite(fa) || !isfinite(fm) || !isfinite(fb))
        return PW_EDOM;
    if (!(fm < fa && fm < fb))
        return PW_ENOBRACKET;
    const gsl_min_fminimizer_type *T = gsl_min_fminimizer_brent;
    alignas(max_align_t) unsigned char state[STATE_BYTES];
    if (T->size > sizeof state)
        return PW_ENOMEM;
    t.fallback = fm;
    gsl_function F = {tramp_fn, &t};
    gsl_min_fminimizer s = {.type = T,
                            .function = &F,
                            .x_minimum = m,
                            .f_minimum = fm,
                            .x_lower = a,
                            .f_lower = fa,
                            .x_upper = b,
                            .f_upper = fb,
                            .state = state};
    /* What gsl_min_fminimizer_set_with_values does once its checks (made above) pass. */
    int gs = T->set(s.state, s.function, m, fm, a, fa, b, fb);
    if (gs != GSL_SUCCESS)
        return pw_gsl_status(gs);
    for (unsigned it = 1; it <= o->max_iter; it++) {
        if (iters)
            *iters = it;
        gs = T->iterate(s.state, s.function, &s.x_minimum, &s.f_minimum, &s.x_lower, &s.f_lower,
                        &s.x_upper, &s.f_upper);
        if (t.st != PW_OK)
            return t.st;
        if (gs != GSL_SUCCESS)
            return pw_gsl_status(gs);
        *xmin = s.x_minimum;
        *fmin = s.f_minimum;
        if (s.f_minimum < o->f_stop || interval_done(s.x_lower, s.x_upper, o))
            return PW_OK;
    }
    return PW_EMAXITER;
}

/* ---- every root on an interval (solve1d.h, pw_roots1d_all) ---- */

#define ROOTS_STACK 256

pw_roots1d_opts pw_roots1d_default_opts(void)
{
    pw_roots1d_opts o = {.scan = 48,
                         .max_evals = 3000,
                         .restarts = 8,
                         .noise = 1e-12,
                         .edge_rel = 1e-9,
                         .min_cell_rel = 1e-13};
    return o;
}

typedef struct rpt {
    double x, f;
    bool ok; /* inside f's domain */
} rpt;

typedef struct rsearch {
    pw_fn1d f;
    void *ctx;
    const pw_roots1d_opts *o;
    double K, lo, hi;
    double *root;
    size_t max_roots, n_root;
    unsigned long evals;
    bool restart, overflow;
} rsearch;

static pw_status rs_eval(rsearch *z, double x, rpt *p)
{
    if (++z->evals > z->o->max_evals)
        return PW_ENOCONV;
    p->x = x;
    p->f = NAN;
    pw_status st = z->f(z->ctx, x, &p->f);
    p->ok = st == PW_OK && isfinite(p->f);
    if (p->ok || st == PW_OK || st == PW_EINFEASIBLE || st == PW_ENOBRACKET || st == PW_EDOM)
        return PW_OK; /* outside the domain is not a failure */
    return st;
}

static void rs_add(rsearch *z, double x)
{
    for (size_t i = 0; i < z->n_root && i < z->max_roots; i++)
        if (fabs(z->root[i] - x) <= 1e-10 * (z->hi - z->lo))
            return;
    if (z->n_root < z->max_roots)
        z->root[z->n_root] = x;
    else
        z->overflow = true;
    z->n_root++;
}

static pw_status rs_brent(rsearch *z, const rpt *a, const rpt *b)
{
    if (a->f == 0.0 || b->f == 0.0) {
        rs_add(z, a->f == 0.0 ? a->x : b->x);
        return PW_OK;
    }
    pw_solve1d_opts o = pw_solve1d_default_opts();
    o.xtol_abs = 1e-300; /* a root near 0 is resolved to full relative precision */
    o.xtol_rel = 4.0 * DBL_EPSILON;
    double x = NAN;
    pw_status st = pw_root1d(z->f, z->ctx, a->x, b->x, a->f, b->f, &o, &x, NULL);
    if (st != PW_OK && st != PW_EMAXITER)
        return st;
    rs_add(z, x);
    return PW_OK;
}

/* The cells of [a0, b0], depth first; sets z->restart (and returns) when K was raised. */
static pw_status rs_cell(rsearch *z, rpt a0, rpt b0)
{
    struct {
        rpt a, b;
    } stack[ROOTS_STACK];
    size_t top = 0;
    stack[top].a = a0;
    stack[top++].b = b0;
    const double range = z->hi - z->lo, noise = z->o->noise;
    while (top > 0) {
        --top;
        const rpt a = stack[top].a, b = stack[top].b;
        const double h = b.x - a.x;
        pw_status st;
        if (!a.ok && !b.ok)
            continue;
        if (a.ok && b.ok) {
            const bool change = (a.f <= 0.0) != (b.f <= 0.0) || a.f == 0.0 || b.f == 0.0;
            const double s = (b.f - a.f) / h, ds = 0.5 * z->K * h + 2.0 * noise / h;
            const bool monotone = fabs(s) > ds;
            if (change && monotone) {
                if ((st = rs_brent(z, &a, &b)) != PW_OK)
                    return st;
                continue;
            }
            if (!change && (monotone || fmin(fabs(a.f), fabs(b.f)) > z->K * h * h / 8.0 + noise))
                continue;
            /* At the resolution limit (the cell no wider than min_cell_rel of the range, or so
             * narrow that the noise term dominates the curvature term, h <= 2 sqrt(noise / K)):
             * a sign change is one root, and roots that f's precision cannot separate (a pair
             * within the noise, a double root) are not resolved further. Without this limit the
             * cells within noise / |f'| of a shallow root would be halved down to rounding level. */
            if (h < z->o->min_cell_rel * range || h * h * z->K <= 4.0 * noise) {
                if (change && (st = rs_brent(z, &a, &b)) != PW_OK)
                    return st;
                continue;
            }
        } else if (h < z->o->edge_rel * range) {
            continue; /* the domain's edge, located */
        }
        rpt m;
        if ((st = rs_eval(z, a.x + 0.5 * h, &m)) != PW_OK)
            return st;
        if (a.ok && b.ok && m.ok) {
            double dev = fabs(0.5 * (a.f + b.f) - m.f);
            if (dev > z->K * h * h / 8.0 + 2.0 * noise) {
                z->K = fmax(2.0 * z->K, 32.0 * dev / (h * h));
                z->restart = true;
                return PW_OK;
            }
        }
        if (top + 2 > ROOTS_STACK)
            return PW_ENOCONV;
        stack[top].a = a;
        stack[top++].b = m;
        stack[top].a = m;
        stack[top++].b = b;
    }
    return PW_OK;
}

static int cmp_double(const void *x, const void *y)
{
    double a = *(const double *)x, b = *(const double *)y;
    return (a > b) - (a < b);
}

pw_status pw_roots1d_all(pw_fn1d f, void *ctx, double lo, double hi, const pw_roots1d_opts *o,
                         double *roots, size_t max_roots, size_t *n_roots, unsigned long *evals)
{
    if (n_roots)
        *n_roots = 0;
    if (evals)
        *evals = 0;
    if (!f || !o || !n_roots || (max_roots > 0 && !roots) || !(isfinite(lo) && isfinite(hi)) ||
        !(lo < hi) || o->scan < 3 || !(o->noise >= 0.0) || !(o->edge_rel > 0.0) ||
        !(o->min_cell_rel > 0.0))
        return PW_EINVAL;
    rpt *p = malloc(o->scan * sizeof *p);
    if (!p)
        return PW_ENOMEM;
    rsearch z = {.f = f, .ctx = ctx, .o = o, .lo = lo, .hi = hi, .root = roots,
                 .max_roots = max_roots};
    pw_status st = PW_OK;
    const unsigned n = o->scan;
    for (unsigned i = 0; i < n && st == PW_OK; i++)
        st = rs_eval(&z, i + 1 == n ? hi : lo + (hi - lo) * (double)i / (n - 1), &p[i]);
    if (st == PW_OK) {
        double d2max = 0.0;
        for (unsigned i = 1; i + 1 < n; i++)
            if (p[i - 1].ok && p[i].ok && p[i + 1].ok) {
                double h = p[i].x - p[i - 1].x;
                d2max = fmax(d2max, fabs(p[i + 1].f - 2.0 * p[i].f + p[i - 1].f) / (h * h));
            }
        z.K = 4.0 * d2max + 1e-6;
    }
    for (unsigned round = 0; st == PW_OK; round++) {
        z.restart = false;
        z.overflow = false;
        z.n_root = 0;
        for (unsigned i = 0; i + 1 < n && !z.restart && st == PW_OK; i++)
            st = rs_cell(&z, p[i], p[i + 1]);
        if (st != PW_OK || !z.restart)
            break;
        if (round + 1 >= o->restarts)
            st = PW_ENOCONV;
    }
    free(p);
    if (evals)
        *evals = z.evals;
    if (st != PW_OK)
        return st;
    size_t kept = z.n_root < max_roots ? z.n_root : max_roots;
    if (kept > 1)
        qsort(roots, kept, sizeof roots[0], cmp_double);
    *n_roots = kept;
    return z.overflow ? PW_ERANGE : PW_OK;
}
