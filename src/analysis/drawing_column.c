/* What to draw, part 2: the column construction from the column module (q-line, operating lines,
 * pinch, the staircase its own stepping records), the enlarged window around the pinch, and the
 * decanter scheme when a heterogeneous azeotrope blocks the single column. See
 * include/pinchwise/drawing.h. */
#include "analysis/staircase_internal.h"

#include <math.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/curve.h>
#include <pinchwise/drawing.h>
#include <string.h>

/* Where the operating lines at reflux R meet (on the q-line). The lines and the q-line are the
 * same in the mirrored frame of column_direction.h, so this holds in either direction. */
static void lines_meet(const pw_column_spec *sp, double R, double *xi, double *yi)
{
    *xi = ((R + 1.0) * sp->zf + (sp->q - 1.0) * sp->xd) / (R + sp->q);
    *yi = (R * *xi + sp->xd) / (R + 1.0);
}

static void op_lines(const pw_column_spec *sp, double R, double x[3], double y[3])
{
    double xi, yi;
    lines_meet(sp, R, &xi, &yi);
    x[0] = y[0] = sp->xd;
    x[1] = xi;
    y[1] = yi;
    x[2] = y[2] = sp->xb;
}

/* The staircase at reflux R, recorded by the column module's stepping (column_step.c) in the
 * frame where component 1 or 2 goes overhead, and mapped back to fractions of component 1. */
static void single_stairs(const pw_curve *curve, const pw_column_spec *spec, double R,
                          size_t max_stages, pw_draw_stairs *st)
{
    bool down = pw_column_direction_of(spec) == PW_DIRECTION_BOTTOMS;
    pw_curve_mirror m;
    pw_curve c = down ? pw_curve_mirror_bind(&m, curve) : *curve;
    pw_column_spec sp = down ? pw_column_spec_mirror(spec) : *spec;
    pw_column_ws w = {0};
    pw_stair_trace tr = {st->x, st->y, PW_DRAW_CORNERS, 0, false};
    st->status = pw_column_ws_init(&w, &c, 1e-10);
    if (st->status == PW_OK)
        st->status = pw_column_step_trace_ws(&w, &sp, false, R, max_stages, &st->stages,
                                             &st->feed_stage, &tr);
    pw_column_ws_free(&w);
    st->n = tr.n;
    st->truncated = tr.truncated;
    for (size_t i = 0; down && i < st->n; i++) {
        st->x[i] = 1.0 - st->x[i];
        st->y[i] = 1.0 - st->y[i];
    }
    if (st->status != PW_OK) {
        st->n = 0;
        st->stages = NAN;
        st->feed_stage = 0;
    }
}

/* A square window around the pinch, a tenth of the products' span either side (at least 0.02),
 * moved (not shrunk) to stay inside [0, 1]. */
static void zoom(pw_draw_column *o)
{
    double lo = fmin(o->spec.xb, o->spec.xd), hi = fmax(o->spec.xb, o->spec.xd);
    double h = fmax(0.02, 0.1 * (hi - lo));
    double cx = o->col.pinch.x, cy = o->col.pinch.y;
    double c[2] = {cx, cy};
    for (int k = 0; k < 2; k++) {
        double a = c[k] - h, b = c[k] + h;
        if (a < 0.0) {
            b -= a;
            a = 0.0;
        }
        if (b > 1.0) {
            a -= b - 1.0;
            b = 1.0;
        }
        double *dst = k == 0 ? o->zoom_x : o->zoom_y;
        dst[0] = fmax(0.0, a);
        dst[1] = fmin(1.0, b);
    }
}

/* Each decanter column's enlarged view: the box of its operating line and staircase corners,
 * 8 % of each span added on both sides (at least 0.002), inside [0, 1]. */
static void decanter_windows(pw_draw_decanter *d)
{
    for (int k = 0; k < 2; k++) {
        double xl = INFINITY, xh = -INFINITY, yl = INFINITY, yh = -INFINITY;
        const pw_draw_stairs *t = &d->stairs[k];
        for (size_t i = 0; i < 2; i++) {
            xl = fmin(xl, d->op_x[k][i]), xh = fmax(xh, d->op_x[k][i]);
            yl = fmin(yl, d->op_y[k][i]), yh = fmax(yh, d->op_y[k][i]);
        }
        for (size_t i = 0; i < t->n; i++) {
            xl = fmin(xl, t->x[i]), xh = fmax(xh, t->x[i]);
            yl = fmin(yl, t->y[i]), yh = fmax(yh, t->y[i]);
        }
        if (!(xh >= xl && yh >= yl)) {
            d->zoom_x[k][0] = d->zoom_x[k][1] = d->zoom_y[k][0] = d->zoom_y[k][1] = NAN;
            continue;
        }
        double mx = fmax(0.002, 0.08 * (xh - xl)), my = fmax(0.002, 0.08 * (yh - yl));
        d->zoom_x[k][0] = fmax(0.0, xl - mx);
        d->zoom_x[k][1] = fmin(1.0, xh + mx);
        d->zoom_y[k][0] = fmax(0.0, yl - my);
        d->zoom_y[k][1] = fmin(1.0, yh + my);
    }
}

/* The decanter scheme (decanter.h) for the targets of o, drawn at o->factor times each column's
 * minimum boil-up. */
static pw_status decanter(const pw_system *s, const pw_column_options *opt, double T_decanter_K,
                          pw_draw_column *o)
{
    pw_draw_decanter *d = &o->decanter;
    memset(d, 0, sizeof *d);
    pw_decanter_spec ds = {o->P_Pa, o->spec.zf, o->spec.q, fmax(o->spec.xd, o->spec.xb),
                           fmin(o->spec.xd, o->spec.xb), T_decanter_K};
    d->factor = o->factor;
    d->status = pw_decanter_solve(s, &ds, opt, &d->res);
    if (d->status == PW_ENOMEM)
        return PW_ENOMEM;
    for (int k = 0; k < 2; k++) {
        d->stairs[k].status = PW_EINVAL;
        d->stairs[k].stages = NAN;
        d->boilup[k] = d->vapor[k] = d->layer[k] = NAN;
        d->zoom_x[k][0] = d->zoom_x[k][1] = d->zoom_y[k][0] = d->zoom_y[k][1] = NAN;
    }
    if (d->status != PW_OK || !d->res.feasible)
        return PW_OK;
    pw_system_curve sc;
    pw_status st = pw_system_curve_init(&sc, s, o->P_Pa);
    if (st != PW_OK)
        return st;
    pw_curve curve = pw_system_curve_bind(&sc);
    const double bottoms[2] = {ds.x_rich, ds.x_lean};
    for (int k = 0; k < 2; k++) {
        pw_stripper_spec cs = {d->res.top_x1[k], bottoms[k]};
        double S = o->factor * d->res.col[k].boilup_min;
        d->boilup[k] = S;
        d->vapor[k] = S * d->res.bottoms_per_mol_feed[k];
        d->layer[k] = d->vapor[k] + d->res.bottoms_per_mol_feed[k];
        d->op_x[k][0] = cs.x_top;
        d->op_y[k][0] = cs.x_top + (cs.x_top - cs.x_bottom) / S;
        d->op_x[k][1] = d->op_y[k][1] = cs.x_bottom;
        pw_stair_trace tr = {d->stairs[k].x, d->stairs[k].y, PW_DRAW_CORNERS, 0, false};
        pw_draw_stairs *t = &d->stairs[k];
        t->status = pw_stripper_stages_trace(&curve, &cs, S, opt->max_stages, &t->stages, &tr);
        t->n = t->status == PW_OK ? tr.n : 0;
        t->truncated = tr.truncated;
        if (t->status != PW_OK)
            t->stages = NAN;
    }
    /* the duties of the design row at the drawn factor (the operating factor is among the
     * design factors, pw_draw_column_compute) */
    for (size_t k = 0; d->res.duties && k < d->res.n_rows && !d->duties; k++)
        if (fabs(d->res.col[0].design[k].factor - o->factor) < 1e-12) {
            d->duties = true;
            d->duty_row = k;
        }
    decanter_windows(d);
    return PW_OK;
}

pw_status pw_draw_column_compute(const pw_system *s, double P_Pa, const pw_column_spec *spec,
                                 double factor, const pw_column_options *opt_in,
                                 pw_draw_column *o)
{
    return pw_draw_column_compute_ex(s, P_Pa, spec, factor, opt_in, 0.0, o);
}

pw_status pw_draw_column_compute_ex(const pw_system *s, double P_Pa, const pw_column_spec *spec,
                                    double factor, const pw_column_options *opt_in,
                                    double T_decanter_K, pw_draw_column *o)
{
    if (!s || !s->model || !spec || !o || !(isfinite(P_Pa) && P_Pa > 0.0))
        return PW_EINVAL;
    if (factor == 0.0)
        factor = 1.3;
    if (!(factor > 1.0) || !isfinite(factor) || !isfinite(spec->q) ||
        !(fmin(spec->xb, spec->xd) >= 0.0 && fmax(spec->xb, spec->xd) <= 1.0) ||
        pw_column_direction_of(spec) == PW_DIRECTION_NONE)
        return PW_EINVAL;
    memset(o, 0, sizeof *o);
    o->spec = *spec;
    o->P_Pa = P_Pa;
    o->factor = factor;
    o->r_op = NAN;
    o->stairs.status = PW_EINVAL;
    o->stairs.stages = NAN;
    pw_column_options opt = opt_in ? *opt_in : pw_column_default_options();
    bool have = false;
    for (size_t i = 0; i < opt.n_factors; i++)
        have = have || fabs(opt.factors[i] - factor) < 1e-12;
    if (!have && opt.n_factors < PW_COLUMN_MAX_FACTORS)
        opt.factors[opt.n_factors++] = factor;

    pw_system_curve sc;
    pw_status st = pw_system_curve_init(&sc, s, P_Pa);
    if (st != PW_OK)
        return st;
    pw_curve curve = pw_system_curve_bind(&sc);
    pw_eq_point e;
    o->T_top_K = pw_bubble_T(s, P_Pa, spec->xd, &e) == PW_OK ? e.T_K : (double)NAN;
    o->T_bottom_K = pw_bubble_T(s, P_Pa, spec->xb, &e) == PW_OK ? e.T_K : (double)NAN;
    /* refused when the targets reach into the two-liquid region; a heterogeneous azeotrope
     * between them (one column cannot cross it) draws the decanter scheme */
    bool het_az = false;
    o->status = pw_column_solve_system(s, P_Pa, spec, &opt, &o->col, NULL, &het_az);
    if (o->status == PW_ENOMEM)
        return PW_ENOMEM;
    if (o->status != PW_OK)
        return PW_OK;
    if (het_az) {
        o->hetero_blocked = true;
        return decanter(s, &opt, T_decanter_K, o);
    }
    if (!o->col.feasible)
        return PW_OK;
    o->drawn = true;
    o->r_op = factor * o->col.r_min;
    o->qline_x[0] = o->qline_y[0] = spec->zf;
    o->qline_x[1] = o->col.x_q;
    o->qline_y[1] = o->col.y_q;
    op_lines(spec, o->col.r_min, o->op_min_x, o->op_min_y);
    op_lines(spec, o->r_op, o->op_x, o->op_y);
    single_stairs(&curve, spec, o->r_op, opt.max_stages, &o->stairs);
    zoom(o);
    return PW_OK;
}
