/* A scan's points classified against the two-liquid region, and where the heterogeneous
 * azeotrope turns homogeneous (or the reverse) between two of them, by GSL Brent on
 *     G(v) = min(y3 - x_I, x_II - y3)   with the three-phase state at v,   G = -1 where none,
 * whose sign is the label "heterogeneous azeotrope". See include/pinchwise/lle.h
 * (pw_azeotrope_scan_heterogeneous) and docs/heterogeneous.md section 2. */
#include <pinchwise/azeotrope.h>
#include <pinchwise/lle.h>

#include <float.h>
#include <math.h>
#include <string.h>

#include "analysis/az_internal.h"
#include "base/solve1d.h"

/* Relative width in P (or T) to which a change of label is located. The three-phase temperature
 * at fixed P is solved to 1e-10 relative, so G is known far below what this width moves it. */
#define HET_XTOL_REL 1e-9
#define HET_MAX_ITER 200u
/* Evaluations kept for the final bracket: the two ends and one per Brent step. */
#define HET_MAX_EVALS (HET_MAX_ITER + 8)
/* A change of G across the final bracket above this is a jump, not a crossing of zero. */
#define HET_JUMP 1e-4

/* G from a three-phase state (no state: G = -1). An exact zero (the vapor on a layer, not
 * between them: not heterogeneous) is handed to Brent as the smallest negative number, so that
 * the sign is the label everywhere and Brent goes on to the stated width instead of stopping
 * at the zero with a wider bracket of labels. */
static double het_G(const pw_three_phase *tp)
{
    if (!tp->exists)
        return -1.0;
    double G = fmin(tp->y1 - tp->x[0], tp->x[1] - tp->y1);
    return G > 0.0 ? G : fmin(G, -DBL_MIN);
}

typedef struct het_eval {
    double v, G;
    pw_three_phase tp;
} het_eval;

typedef struct het_ctx {
    const pw_system *s;
    pw_az_mode mode;
    size_t n;
    het_eval ev[HET_MAX_EVALS];
} het_ctx;

static pw_status het_fn(void *params, double v, double *f)
{
    het_ctx *c = params;
    pw_three_phase tp;
    pw_status st = pw_three_phase_at(c->s, (int)c->mode, v, &tp);
    if (st != PW_OK)
        return st;
    *f = het_G(&tp);
    if (c->n < HET_MAX_EVALS)
        c->ev[c->n++] = (het_eval){v, *f, tp};
    return PW_OK;
}

/* Locates the change of label between scan points k and k + 1 and appends it. */
static pw_status locate_het(const pw_system *s, pw_az_scan *sc, const pw_three_phase *tps,
                            size_t k, het_ctx *c)
{
    c->s = s;
    c->mode = sc->mode;
    c->n = 0;
    c->ev[c->n++] = (het_eval){sc->at[k], het_G(&tps[k]), tps[k]};
    c->ev[c->n++] = (het_eval){sc->at[k + 1], het_G(&tps[k + 1]), tps[k + 1]};
    double a = sc->at[k], b = sc->at[k + 1], fa = c->ev[0].G, fb = c->ev[1].G;
    if (a > b) {
        double t = a;
        a = b;
        b = t;
        t = fa;
        fa = fb;
        fb = t;
    }
    pw_solve1d_opts so = pw_solve1d_default_opts();
    so.xtol_abs = 0.0;
    so.xtol_rel = HET_XTOL_REL;
    so.max_iter = HET_MAX_ITER;
    double root = NAN;
    pw_status st = pw_root1d(het_fn, c, a, b, fa, fb, &so, &root, NULL);
    if (st == PW_ENOMEM || st == PW_EINVAL)
        return st;
    /* The narrowest pair of evaluated values with different labels (G > 0 and G <= 0): a change
     * of label lies between them whatever G does in between. Brent's own bracket is such a pair. */
    size_t ih = 0, in = 1;
    double best = INFINITY;
    for (size_t i = 0; i < c->n; i++)
        for (size_t j = 0; j < c->n; j++)
            if (c->ev[i].G > 0.0 && !(c->ev[j].G > 0.0) && fabs(c->ev[i].v - c->ev[j].v) < best) {
                best = fabs(c->ev[i].v - c->ev[j].v);
                ih = i;
                in = j;
            }
    const het_eval *h = &c->ev[ih], *nh = &c->ev[in];
    if (sc->n_boundaries >= sc->max_boundaries)
        return PW_OK;
    pw_az_boundary *bd = &sc->boundaries[sc->n_boundaries++];
    memset(bd, 0, sizeof *bd);
    double lo = fmin(h->v, nh->v), hi = fmax(h->v, nh->v);
    bd->at = root >= lo && root <= hi ? root : 0.5 * (lo + hi);
    bd->bracket[0] = lo;
    bd->bracket[1] = hi;
    bd->status = st;
    bd->end = -1;
    bd->present_above = h->v > nh->v;
    bd->T_K = h->tp.T_K;
    bd->P_Pa = h->tp.P_Pa;
    bd->x_layers[0] = h->tp.x[0];
    bd->x_layers[1] = h->tp.x[1];
    bd->y3 = h->tp.y1;
    bd->layer = -1;
    if (st != PW_OK) {
        /* the change lies in [lo, hi] (its ends were evaluated), but not located further */
        bd->kind = PW_AZ_BOUNDARY_NOT_LOCATED;
        bd->at = NAN;
    } else if (!nh->tp.exists) {
        bd->kind = PW_AZ_BOUNDARY_LINE_ENDS;
    } else if (fabs(h->G - nh->G) > HET_JUMP) {
        /* e.g. two separate two-liquid regions at one T, the wider one reported on each side:
         * the state moves to the other three-phase line (tests/unit/test_az_sweep_jump.c) */
        bd->kind = PW_AZ_BOUNDARY_LINE_JUMPS;
    } else {
        bd->kind = PW_AZ_BOUNDARY_VAPOR_AT_LAYER;
        /* the layer the vapor is nearer to on the heterogeneous side */
        bd->layer = h->tp.y1 - h->tp.x[0] <= h->tp.x[1] - h->tp.y1 ? 0 : 1;
    }
    return PW_OK;
}

pw_status pw_azeotrope_scan_heterogeneous(const pw_system *s, pw_az_scan *scan,
                                          pw_three_phase *tps)
{
    if (!s || !scan || !tps || !scan->at || !scan->points || scan->n_points < 2 ||
        (scan->mode != PW_AZ_ISOBARIC && scan->mode != PW_AZ_ISOTHERMAL))
        return PW_EINVAL;
    const size_t n = scan->n_points;
    for (size_t k = 0; k < n; k++) {
        pw_status st;
        if (scan->three_phase_known[k]) { /* pw_azeotrope_scan's, at the same condition */
            tps[k] = scan->three_phase[k];
            st = pw_az_drop_inside(s, &scan->points[k], NULL);
        } else {
            st = pw_azeotrope_heterogeneous(s, (int)scan->mode, scan->at[k], &scan->points[k],
                                            &tps[k], NULL);
        }
        if (st != PW_OK)
            return st;
    }
    het_ctx c; /* about 25 kB of kept evaluations, on the stack of this call only */
    for (size_t k = 0; k + 1 < n; k++) {
        bool h0 = het_G(&tps[k]) > 0.0, h1 = het_G(&tps[k + 1]) > 0.0;
        if (h0 == h1)
            continue;
        pw_status st = locate_het(s, scan, tps, k, &c);
        if (st != PW_OK)
            return st;
    }
    return PW_OK;
}
