/* Rating a given binary column (constant molal overflow): the products of N equilibrium stages
 * with the feed on stage K at reflux R and distillate D/F. Shooting on xd: the rectifying
 * section is stepped down from the top (y1 = xd) to the feed stage's liquid, the stripping
 * section up from the reboiler (x_N = xb from the component balance) to the same liquid; the
 * mismatch r(xd) = x_K(top) - x_K(bottom) is strictly increasing in xd, because x*(y) and y*(x)
 * are increasing for a stable liquid and every operating relation is increasing in its
 * arguments. So the root is unique, and the physical range of xd brackets it (r <= 0 at its low
 * end, r >= 0 at its high end): Brent's method on that bracket cannot miss it. See
 * docs/column.md ("Rating a given column"). */
#include "analysis/design_internal.h"

#include "base/solve1d.h"

#include <pinchwise/decanter.h>
#include <pinchwise/lle.h>
#include <stdio.h>

#include <float.h>
#include <math.h>
#include <string.h>

#define RATE_MAX_ITER 300
#define RATE_MAX_STAGES 5000 /* far beyond any real column; bounds the work of a hostile input */
/* A steady state matches the two sections' liquids at the feed stage; a larger mismatch at the
 * end of the search is a jump across zero, not a root (see pw_rate_verify). */
#define RATE_MISMATCH_TOL 1e-8

typedef struct rate_ctx {
    pw_eqp *e;
    const pw_rate_spec *s;
    double D, B, L, V, Lb, Vb;
    bool by_xb; /* the unknown is xb (when xb can reach 0), else xd */
} rate_ctx;

/* Both products from the unknown w. The unknown is the product that can become very pure
 * (xb -> 0), so that its composition is resolved to full relative precision, not to 1e-16 of
 * the other product's. */
static void products(const rate_ctx *c, double w, double *xd, double *xb)
{
    const double z = c->s->zf;
    if (c->by_xb) {
        *xb = w;
        *xd = fmin(1.0, fmax(0.0, (z - c->B * w) / c->D));
    } else {
        *xd = w;
        *xb = fmin(1.0, fmax(0.0, (z - c->D * w) / c->B));
    }
}

/* Liquid leaving the feed stage from the top (stepping down) and from the bottom (stepping up).
 * With prof != NULL the stages are recorded (top: 1..K, bottom: K+1..N). */
static pw_status sections(rate_ctx *c, double xd, double xb, double *x_top, double *x_bot,
                          pw_profile *prof)
{
    const pw_rate_spec *s = c->s;
    const int N = s->n_stages, K = s->feed_stage;
    double y = xd, x = NAN, T;
    for (int n = 1; n <= K; n++) {
        pw_status st = pw_eqp_x_of_y(c->e, y, &x, &T);
        if (st != PW_OK)
            return st;
        if (prof) {
            pw_stage g = {x, y, T, n < K ? c->L : (K == N ? c->B : c->Lb), c->V};
            if ((st = pw_profile_push(prof, &g)) != PW_OK)
                return st;
        }
        y = fmin(1.0, fmax(0.0, (c->L * x + c->D * xd) / c->V));
    }
    *x_top = x;
    double xs = xb;
    size_t first = prof ? prof->n : 0;
    for (int n = N; n > K; n--) {
        double yy;
        pw_status st = pw_eqp_bubble(c->e, xs, &yy, &T);
        if (st != PW_OK)
            return st;
        if (prof) {
            pw_stage g = {xs, yy, T, n == N ? c->B : c->Lb, c->Vb};
            if ((st = pw_profile_push(prof, &g)) != PW_OK)
                return st;
        }
        xs = fmin(1.0, fmax(0.0, (c->Vb * yy + c->B * xb) / c->Lb));
    }
    *x_bot = xs;
    if (prof) { /* the bottom stages were pushed from N upwards: reverse them */
        for (size_t i = first, j = prof->n - 1; i < j; i++, j--) {
            pw_stage t = prof->stage[i];
            prof->stage[i] = prof->stage[j];
            prof->stage[j] = t;
        }
    }
    return PW_OK;
}

static pw_status residual_fn(void *p, double w, double *f)
{
    rate_ctx *c = p;
    double a, b, xd, xb;
    products(c, w, &xd, &xb);
    pw_status st = sections(c, xd, xb, &a, &b, NULL);
    if (st == PW_OK)
        *f = c->by_xb ? b - a : a - b; /* increasing in the unknown */
    return st;
}

pw_status pw_rate_check_spec(const pw_rate_spec *s, pw_error *err)
{
    if (!(s->n_stages >= 1 && s->n_stages <= RATE_MAX_STAGES))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "--stages %d: expected 1 to %d", s->n_stages,
                            RATE_MAX_STAGES);
    if (!(s->feed_stage >= 1 && s->feed_stage <= s->n_stages))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "--feed-stage %d: expected a stage from 1 (top) to %d (the reboiler)",
                            s->feed_stage, s->n_stages);
    if (!(s->R >= 0.0) || !isfinite(s->R))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "--reflux %g: expected a ratio >= 0", s->R);
    if (!(s->zf > 0.0 && s->zf < 1.0))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "--zf %g: expected a mole fraction strictly between 0 and 1", s->zf);
    if (!isfinite(s->q))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "--q: expected a finite number");
    if (!(s->d_frac > 0.0 && s->d_frac < 1.0) || !isfinite(s->d_frac))
        return pw_error_set(err, PW_EINFEASIBLE, NULL, 0,
                            "--distillate %g: the feed cannot supply it (expected D/F strictly "
                            "between 0 and 1 mole per mole of feed)",
                            s->d_frac);
    const double D = s->d_frac, V = (s->R + 1.0) * D, Vb = V - (1.0 - s->q);
    if (!(Vb > 0.0))
        return pw_error_set(err, PW_EINFEASIBLE, NULL, 0,
                            "no vapor below the feed: boil-up Vbar/F = (R + 1) D/F - (1 - q) = %g "
                            "is not positive (the feed's vapor alone exceeds what the top "
                            "needs); raise the reflux or the distillate, or cool the feed",
                            Vb);
    if (s->feed_stage < s->n_stages && !(s->R * D + s->q > 0.0))
        return pw_error_set(err, PW_EINFEASIBLE, NULL, 0,
                            "no liquid below the feed: Lbar/F = R D/F + q = %g is not positive",
                            s->R * D + s->q);
    return PW_OK;
}

pw_status pw_rate_cmo(const pw_system *sys, double P_Pa, const pw_rate_spec *spec,
                      pw_rate_result *out, pw_error *err)
{
    if (!out || !spec)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "no specification");
    memset(out, 0, sizeof *out);
    out->xd = out->xb = out->residual = NAN;
    pw_status st = pw_rate_check_spec(spec, err);
    if (st != PW_OK)
        return st;
    pw_eqp e;
    if ((st = pw_eqp_init(&e, sys, P_Pa)) != PW_OK)
        return pw_error_set(err, st, NULL, 0, "rating: %s", pw_strerror(st));
    rate_ctx c = {.e = &e, .s = spec, .D = spec->d_frac, .B = 1.0 - spec->d_frac};
    c.L = spec->R * c.D;
    c.V = c.L + c.D;
    c.Lb = c.L + spec->q;
    c.Vb = c.V - (1.0 - spec->q);
    if (spec->feed_stage == spec->n_stages)
        c.Lb = c.B; /* no stripping stage: only the bottoms leave the feed stage */
    /* The physical range of the unknown: both products' compositions in [0, 1]. xd rises as xb
     * falls; the mismatch rises with xd. */
    c.by_xb = spec->zf / c.D <= 1.0;
    double lo, hi;
    if (c.by_xb) {
        lo = 0.0;
        hi = fmin(1.0, spec->zf / c.B);
    } else {
        lo = fmax(0.0, (spec->zf - c.B) / c.D);
        hi = 1.0;
    }
    double flo = NAN, fhi = NAN, w = NAN;
    st = residual_fn(&c, lo, &flo);
    if (st == PW_OK)
        st = residual_fn(&c, hi, &fhi);
    if (st == PW_OK && (flo == 0.0 || fhi == 0.0)) {
        w = flo == 0.0 ? lo : hi;
    } else if (st == PW_OK && (flo > 0.0 || fhi < 0.0)) {
        st = PW_ENOBRACKET; /* only for an unstable liquid, whose y*(x) is not increasing */
    } else if (st == PW_OK) {
        pw_solve1d_opts o = pw_solve1d_default_opts();
        o.xtol_abs = 1e-300; /* a product near 0 is resolved to full relative precision */
        o.xtol_rel = 4.0 * DBL_EPSILON;
        o.max_iter = RATE_MAX_ITER;
        unsigned it = 0;
        st = pw_root1d(residual_fn, &c, lo, hi, flo, fhi, &o, &w, &it);
        out->iterations = (int)it;
    }
    if (st == PW_ENOBRACKET) {
        /* no sign change over the whole range: the profile at the end nearer zero tells
         * whether the liquids entered a two-liquid region (then refused as such below) */
        w = fabs(flo) <= fabs(fhi) ? lo : hi;
    }
    if (st == PW_OK || st == PW_ENOBRACKET) {
        double a, b, xd, xb;
        products(&c, w, &xd, &xb);
        pw_status ps = sections(&c, xd, xb, &a, &b, &out->profile);
        if (ps != PW_OK)
            st = ps;
        out->residual = a - b;
        out->xd = xd;
        out->xb = xb;
        out->profile.stages = spec->n_stages;
        out->profile.feed_stage = spec->feed_stage;
    }
    pw_eqp_free(&e);
    if (st == PW_OK || st == PW_ENOBRACKET) {
        pw_status vs = pw_rate_verify(sys, P_Pa, out, "rating", err);
        if (vs != PW_OK)
            return vs; /* out freed */
    }
    if (st != PW_OK) {
        pw_rate_result_free(out);
        return pw_error_set(err, st, NULL, 0, "rating: %s (shooting on the distillate composition)",
                            pw_strerror(st));
    }
    return PW_OK;
}

pw_status pw_rate_verify(const pw_system *sys, double P_Pa, pw_rate_result *out,
                         const char *what, pw_error *err)
{
    if (pw_model_can_split(sys->model)) {
        pw_three_phase tp;
        pw_status st = pw_three_phase_at_P(sys, P_Pa, &tp);
        if (st != PW_OK) {
            pw_rate_result_free(out);
            return pw_error_set(err, st, NULL, 0, "%s: the three-phase state: %s", what,
                                pw_strerror(st));
        }
        for (size_t i = 0; tp.exists && i < out->profile.n; i++) {
            const pw_stage *g = &out->profile.stage[i];
            if (!(g->x > tp.x[0] && g->x < tp.x[1]))
                continue;
            char msg[PW_ERROR_MSG_MAX];
            snprintf(msg, sizeof msg,
                     "%s: the liquid of stage %zu (x1 = %.4g, as one liquid at %.2f K) lies "
                     "inside the two-liquid region at this pressure (layers x1 = %.4f and %.4f, "
                     "boiling together at %.2f K): a stage there holds two liquids, which the "
                     "single-liquid stage model does not describe, so no steady state of this "
                     "column is given; decant the layers (decanter scheme: pinchwise decanter)",
                     what, i + 1, g->x, g->T_K, tp.x[0], tp.x[1], tp.T_K);
            pw_rate_result_free(out);
            return pw_error_set(err, PW_EINFEASIBLE, NULL, 0, "%s", msg);
        }
    }
    /* a model that cannot split, on data that show two liquids: a stage inside the measured
     * range is not described by it (docs/heterogeneous.md section 3) */
    for (size_t i = 0; pw_system_split_unmodelled(sys) && i < out->profile.n; i++) {
        const pw_stage *g = &out->profile.stage[i];
        if (!pw_measured_split_overlaps(&sys->measured, g->x, g->x))
            continue;
        char msg[PW_ERROR_MSG_MAX];
        snprintf(msg, sizeof msg,
                 "%s: the liquid of stage %zu (x1 = %.4g) lies inside the two liquids the data "
                 "show (x1 %.4g to %.4g at %.2f K, %.2f kPa), which the %s model cannot "
                 "represent: its stage there is not valid; refit with a model that can split "
                 "(fit --lle) and decant the layers (pinchwise decanter)",
                 what, i + 1, g->x, sys->measured.x_lo, sys->measured.x_hi, sys->measured.T_K,
                 sys->measured.P_Pa / 1000.0, sys->model->name);
        pw_rate_result_free(out);
        return pw_error_set(err, PW_EINFEASIBLE, NULL, 0, "%s", msg);
    }
    if (!(fabs(out->residual) <= RATE_MISMATCH_TOL)) {
        double r = out->residual, xd = out->xd, xb = out->xb;
        pw_rate_result_free(out);
        return pw_error_set(err, PW_ENOCONV, NULL, 0,
                            "%s: no steady state found: the two sections' liquids at the feed "
                            "stage still differ by %.3g at the closest products (xd %.17g, xb "
                            "%.3g); the mismatch jumps across zero between neighbouring "
                            "representable products (a product purer than double precision "
                            "resolves, 1 - xd or xb below about 1e-15) or never reaches it",
                            what, r, xd, xb);
    }
    return PW_OK;
}

void pw_rate_result_free(pw_rate_result *r)
{
    if (r)
        pw_profile_free(&r->profile);
}
