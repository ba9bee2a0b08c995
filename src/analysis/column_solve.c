/* The whole binary column analysis: feasibility, q-line, global minimum-reflux search in both
 * sections, total-reflux stages (stepped and Fenske) and the design table. See docs/column.md. */
#include "analysis/column_internal.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

pw_column_options pw_column_default_options(void)
{
    pw_column_options o = {.rtol = 1e-10, .grid = 200, .n_factors = 3, .max_stages = 500};
    /* R/R_min = 1.2-1.5: common practice (METHODS 6.7). */
    o.factors[0] = 1.2;
    o.factors[1] = 1.3;
    o.factors[2] = 1.5;
    return o;
}

static pw_status check_options(const pw_column_options *o)
{
    if (!(o->rtol > 0.0 && o->rtol <= 1e-4) || o->grid < 16 || o->grid > 10000000 ||
        o->n_factors > PW_COLUMN_MAX_FACTORS || o->max_stages == 0)
        return PW_EINVAL;
    for (size_t i = 0; i < o->n_factors; i++)
        if (!(o->factors[i] > 1.0) || !isfinite(o->factors[i]))
            return PW_EINVAL;
    return PW_OK;
}

static void clear_result(pw_column_result *r)
{
    memset(r, 0, sizeof *r);
    r->feasible = false;
    r->x_q = r->y_q = r->r_min = r->s_min = r->r_feed = NAN;
    r->pinch.x = r->pinch.y = NAN;
    r->n_min = r->n_fenske = r->alpha_top = r->alpha_bottom = NAN;
}

/* R_min equal to the feed-point value within this relative tolerance (10^3 times the default
 * rtol of the search) is a feed pinch. */
#define FEED_MATCH_RTOL 1e-7

typedef struct col_buffers {
    double *xg, *yg, *fg, *dg; /* dg: slopes (NULL without them) */
    size_t n, cap;             /* points tabulated; room for */
} col_buffers;

/* With the curve's slope the table is coarse, grid/8 points (at least 9; each carries a value
 * and a slope), refined where it does not resolve the curvature (docs/column.md section 3). */
#define DY_GRID_DIV 8
#define DY_GRID_MIN 9
#define DY_CAP_FACTOR 8
#define DY_CAP_EXTRA 64

static size_t dy_n0(size_t grid)
{
    size_t n0 = (grid + DY_GRID_DIV - 1) / DY_GRID_DIV;
    return n0 < DY_GRID_MIN ? DY_GRID_MIN : n0;
}

static pw_status tabulate(pw_column_ws *w, const pw_column_spec *s, size_t grid, col_buffers *b)
{
    if (b->dg)
        return pw_column_tabulate_dy(w, s->xb, s->xd, dy_n0(grid), b->cap, b->xg, b->yg, b->dg,
                                     &b->n);
    const size_t n = grid;
    b->n = n;
    for (size_t j = 0; j < n; j++) {
        b->xg[j] = j + 1 == n ? s->xd : s->xb + (s->xd - s->xb) * (double)j / (double)(n - 1);
        pw_status st = pw_column_y(w, b->xg[j], &b->yg[j]);
        if (st != PW_OK)
            return st;
    }
    return PW_OK;
}

/* Reflux and boil-up cannot be negative. When the pinch limits give an R below zero, or a boil-up
 * below zero, the limit is a flow, not a pinch: R_min is 0 (a stripping column with the feed on
 * top makes the distillate) or the R at which the boil-up vanishes (the feed brings all the vapor
 * the rectifying section needs). gap(R) grows with R, so the largest of these bounds is R_min. */
static void apply_flow_limits(const pw_column_spec *s, double y_xb, pw_column_result *out)
{
    if (!(out->r_min > 0.0)) {
        out->r_min = 0.0;
        out->reflux_limited = true;
    }
    if (pw_column_boilup(s, out->r_min) < 0.0) {
        out->r_min = pw_column_reflux_of_boilup(s, 0.0);
        out->reflux_limited = false;
        out->boilup_limited = true;
        out->pinch.kind = PW_PINCH_FEED;
        out->pinch.section = PW_SECTION_STRIPPING;
        /* no pinch: zero boil-up limits. The stripping line has turned vertical at x = xb and
         * meets the curve at the reboiler, (xb, y*(xb)), the point reported; the operating lines
         * themselves meet the q-line at (xb, y_q(xb)) below the curve. */
        out->pinch.x = s->xb;
        out->pinch.y = y_xb;
    }
    out->s_min = fmax(pw_column_boilup(s, out->r_min), 0.0);
}

/* The q-line meets the curve above xd (a subcooled feed rich in component 1): at R = 0 the
 * operating lines meet on the q-line at y = xd; the stripping section, scanned up to that point,
 * decides whether any reflux is needed. */
static pw_status reflux_limited_rmin(pw_column_ws *w, const pw_column_spec *s, col_buffers *b,
                                     double x_i0, double y_i0, pw_column_result *out)
{
    double s_lim, xs, ys;
    bool at_end;
    pw_status st = pw_column_section_search(w, s, PW_SECTION_STRIPPING, s->xb, b->yg[0], x_i0,
                                            y_i0, x_i0, s->xd, &s_lim, &xs, &ys, &at_end);
    if (st != PW_OK)
        return st;
    out->x_q = NAN;
    out->y_q = NAN;
    out->r_feed = NAN;
    out->r_min = at_end ? 0.0 : pw_column_reflux_of_boilup(s, 1.0 / (s_lim - 1.0));
    out->pinch.kind = PW_PINCH_TANGENT;
    out->pinch.section = PW_SECTION_STRIPPING;
    out->pinch.x = xs;
    out->pinch.y = ys;
    apply_flow_limits(s, b->yg[0], out);
    return PW_OK;
}

/* Limiting slopes of both sections, each searched over its whole range [x_q, xd] and [xb, x_q];
 * the larger R limits. */
static pw_status find_rmin(pw_column_ws *w, const pw_column_spec *s, size_t n, col_buffers *b,
                           pw_column_result *out)
{
    const double xq = out->x_q, yq = out->y_q;
    double m_lim, xr, yr;
    bool feed_r;
    pw_status st = pw_column_section_search(w, s, PW_SECTION_RECTIFYING, xq, yq, s->xd,
                                            b->yg[n - 1], xq, yq, &m_lim, &xr, &yr, &feed_r);
    if (st != PW_OK)
        return st;
    double s_lim, xs, ys;
    bool feed_s;
    st = pw_column_section_search(w, s, PW_SECTION_STRIPPING, s->xb, b->yg[0], xq, yq, xq, yq,
                                  &s_lim, &xs, &ys, &feed_s);
    if (st != PW_OK)
        return st;

    const double r_rect = m_lim / (1.0 - m_lim);
    const double r_strip = pw_column_reflux_of_boilup(s, 1.0 / (s_lim - 1.0));
    const double m_feed = (s->xd - yq) / (s->xd - xq);
    out->r_feed = m_feed / (1.0 - m_feed);
    /* A feed pinch is shared by both sections; it is reported as rectifying. */
    bool rect = r_rect >= r_strip || (feed_r && feed_s);
    out->r_min = fmax(r_rect, r_strip);
    out->pinch.section = rect ? PW_SECTION_RECTIFYING : PW_SECTION_STRIPPING;
    out->pinch.kind = (rect ? feed_r : feed_s) ? PW_PINCH_FEED : PW_PINCH_TANGENT;
    out->pinch.x = rect ? xr : xs;
    out->pinch.y = rect ? yr : ys;
    /* The limiting point is the q-line intersection whenever R_min is the feed-point value (within
     * the search's tolerance): a feed pinch, whatever point of a flat neighbourhood the search
     * stopped at. */
    if (fabs(out->r_min - out->r_feed) <= FEED_MATCH_RTOL * fmax(1.0, fabs(out->r_feed))) {
        out->pinch.kind = PW_PINCH_FEED;
        out->pinch.section = PW_SECTION_RECTIFYING;
        out->pinch.x = xq;
        out->pinch.y = yq;
    }
    apply_flow_limits(s, b->yg[0], out);
    return PW_OK;
}

/* The q-line meets the curve below xb: every admissible intersection of the operating lines lies
 * on the q-line right of the curve, and the least reflux puts it at x = xb, where the stripping
 * line turns vertical (zero boil-up: the feed's vapor is all the rectifying section receives).
 * A rectifying tangent pinch over [xb, xd) may still limit; the scan includes the point
 * (xb, y_i) as its "feed" end. */
static pw_status boilup_limited_rmin(pw_column_ws *w, const pw_column_spec *s, size_t n,
                                     col_buffers *b, double y_i, pw_column_result *out)
{
    double m_lim, xr, yr;
    bool at_end;
    pw_status st = pw_column_section_search(w, s, PW_SECTION_RECTIFYING, s->xb, b->yg[0], s->xd,
                                            b->yg[n - 1], s->xb, y_i, &m_lim, &xr, &yr, &at_end);
    if (st != PW_OK)
        return st;
    out->x_q = NAN;
    out->y_q = NAN;
    out->boilup_limited = true;
    out->r_min = m_lim / (1.0 - m_lim);
    out->r_feed = pw_column_reflux_of_boilup(s, 0.0);
    if (at_end) {
        out->r_min = out->r_feed; /* exactly the zero-boil-up reflux */
        out->pinch.kind = PW_PINCH_FEED;
        out->pinch.section = PW_SECTION_STRIPPING;
        out->pinch.x = s->xb; /* zero boil-up: the reboiler's point on the curve (see */
        out->pinch.y = b->yg[0]; /* apply_flow_limits); y_i is the q-line's, below it */
    } else {
        out->pinch.kind = PW_PINCH_TANGENT;
        out->pinch.section = PW_SECTION_RECTIFYING;
        out->pinch.x = xr;
        out->pinch.y = yr;
    }
    out->s_min = fmax(pw_column_boilup(s, out->r_min), 0.0);
    return out->r_min > 0.0 ? PW_OK : PW_ERANGE;
}

/* N_min by stepping at total reflux; more than max_stages is reported in n_min_status. */
static pw_status total_reflux(pw_column_ws *w, const pw_column_spec *s, const pw_column_options *o,
                              pw_column_result *out)
{
    pw_status st = pw_column_step_ws(w, s, true, INFINITY, o->max_stages, &out->n_min, NULL);
    out->n_min_status = st;
    if (st == PW_EMAXITER) {
        out->n_min = NAN;
        return PW_OK;
    }
    return st;
}

static pw_status design_table(pw_column_ws *w, const pw_column_spec *s,
                              const pw_column_options *o, pw_column_result *out)
{
    if (!(out->r_min > 0.0))
        return PW_OK; /* no reflux needed: multiples of zero make no design table */
    for (size_t i = 0; i < o->n_factors; i++) {
        pw_design_row *row = &out->design[i];
        row->factor = o->factors[i];
        row->R = o->factors[i] * out->r_min;
        row->boilup = pw_column_boilup(s, row->R);
        if (pw_gilliland_molokanov(out->n_min, row->R, out->r_min, &row->gilliland_stages) != PW_OK)
            row->gilliland_stages = NAN; /* no N_min: no correlation estimate */
        pw_status st = pw_column_step_ws(w, s, false, row->R, o->max_stages, &row->stages,
                                         &row->feed_stage);
        if (st == PW_ENOMEM)
            return st;
        row->status = st; /* a row the stepping cannot reach is reported, not fatal */
        if (st != PW_OK) {
            row->stages = NAN;
            row->feed_stage = 0;
        }
        out->n_design = i + 1;
    }
    return PW_OK;
}

/* Fenske's N_min at the geometric mean of the end volatilities; NAN where it does not apply
 * (a mean volatility not above 1). */
static void fenske(const pw_column_spec *s, pw_column_result *out)
{
    if (pw_fenske_nmin(sqrt(out->alpha_top * out->alpha_bottom), s->xd, s->xb, &out->n_fenske) !=
        PW_OK)
        out->n_fenske = NAN;
}

static pw_status solve_feasible(pw_column_ws *w, const pw_column_spec *s,
                                const pw_column_options *o, col_buffers *b,
                                pw_column_result *out)
{
    pw_status st = tabulate(w, s, o->grid, b);
    if (st != PW_OK)
        return st;
    const size_t n = b->n;
    w->tab_x = b->xg;
    w->tab_y = b->yg;
    w->tab_d = b->dg;
    w->tab_n = n;
    pw_column_set_conv_bound(w);
    out->alpha_bottom = pw_column_alpha(b->xg[0], b->yg[0]);
    out->alpha_top = pw_column_alpha(b->xg[n - 1], b->yg[n - 1]);
    bool ok;
    st = pw_column_check_feasible(w, b->xg, b->yg, b->fg, n, &ok, out->reason, sizeof out->reason);
    if (st != PW_OK || !ok)
        return st;
    st = pw_column_qline(w, s, b->xg, b->yg, n, &out->x_q, &out->y_q);
    if (st == PW_ERANGE && s->q > 1.0) {
        double x_i0 = ((s->q - 1.0) * s->xd + s->zf) / s->q; /* q-line at y = xd */
        double y_i0;
        if (pw_column_y(w, x_i0, &y_i0) == PW_OK && y_i0 > s->xd) {
            st = reflux_limited_rmin(w, s, b, x_i0, y_i0, out);
            if (st == PW_OK)
                st = total_reflux(w, s, o, out);
            if (st != PW_OK)
                return st;
            fenske(s, out);
            out->feasible = true;
            return design_table(w, s, o, out);
        }
    }
    if (st == PW_ERANGE && s->q < 1.0) {
        double y_i = (s->q * s->xb - s->zf) / (s->q - 1.0); /* q-line at x = xb */
        if (y_i > s->xb && y_i < b->yg[0]) {
            st = boilup_limited_rmin(w, s, n, b, y_i, out);
            if (st == PW_ERANGE)
                snprintf(out->reason, sizeof out->reason,
                         "the feed (q = %g) brings more vapor than the rectifying section needs "
                         "and no boil-up is needed: no pinch limits this split",
                         s->q);
            if (st == PW_OK)
                st = total_reflux(w, s, o, out);
            if (st != PW_OK)
                return st;
            fenske(s, out);
            out->feasible = true;
            return design_table(w, s, o, out);
        }
    }
    if (st == PW_ERANGE) {
        snprintf(out->reason, sizeof out->reason,
                 "the q-line (q = %g) meets the equilibrium curve outside (xb, xd): the feed's "
                 "thermal condition is outside the range of this method",
                 s->q);
        return st;
    }
    if (st != PW_OK)
        return st;
    st = find_rmin(w, s, n, b, out);
    if (st != PW_OK)
        return st;
    st = total_reflux(w, s, o, out);
    if (st != PW_OK)
        return st;
    fenske(s, out);
    out->feasible = true;
    return design_table(w, s, o, out);
}

pw_status pw_column_solve(const pw_curve *curve, const pw_column_spec *spec,
                          const pw_column_options *opt, pw_column_result *out)
{
    return pw_column_solve_dy(curve, NULL, spec, opt, out);
}

pw_status pw_column_solve_dy(const pw_curve *curve, pw_curve_dy_fn dy, const pw_column_spec *spec,
                             const pw_column_options *opt, pw_column_result *out)
{
    if (!curve || !curve->y_of_x || !spec || !out)
        return PW_EINVAL;
    clear_result(out);
    const pw_column_spec s = *spec;
    if (!(s.xb >= 0.0 && s.xb < s.zf && s.zf < s.xd && s.xd <= 1.0) || !isfinite(s.q))
        return PW_EINVAL;
    const pw_column_options o = opt ? *opt : pw_column_default_options();
    pw_status st = check_options(&o);
    if (st != PW_OK)
        return st;
    const size_t cap = dy ? DY_CAP_FACTOR * dy_n0(o.grid) + DY_CAP_EXTRA : o.grid;
    double *mem = malloc((dy ? 4 : 3) * cap * sizeof *mem);
    if (!mem)
        return PW_ENOMEM;
    col_buffers b = {mem, mem + cap, mem + 2 * cap, dy ? mem + 3 * cap : NULL, 0, cap};
    pw_column_ws w = {0};
    st = pw_column_ws_init(&w, curve, o.rtol);
    w.dy = dy;
    if (st == PW_OK)
        st = solve_feasible(&w, &s, &o, &b, out);
    pw_column_ws_free(&w);
    free(mem);
    if (st != PW_OK)
        out->feasible = false;
    return st;
}
