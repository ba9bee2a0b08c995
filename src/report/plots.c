/* The report's plots: x-y diagram with the column construction, T-x-y / P-x-y, residuals,
 * ln gamma, and a band of sampled curves. See plots.h. */
#include "report/plots.h"

#include <math.h>

#define PW_NAN ((double)NAN)
#include <stdio.h>
#include <string.h>

#define W_SQUARE 540.0
#define H_SQUARE 540.0
#define W_WIDE 640.0
#define H_WIDE 440.0
#define H_SHORT 320.0
#define W_ZOOM 420.0

/* Named roles drawn from the palette (see docs/report.md). */
static pw_style st_line(const char *colour, double width, const char *dash)
{
    pw_style s = {colour, width, dash, PW_MARK_NONE, false, 0.0, 1.0};
    return s;
}

static pw_style st_mark(const char *colour, pw_marker m, bool filled, double size)
{
    pw_style s = {colour, 1.4, NULL, m, filled, size, 1.0};
    return s;
}

#define C_INK pw_palette[0]
#define C_AMBER pw_palette[1]
#define C_TEAL pw_palette[2]
#define C_BRICK pw_palette[3]
#define C_SKY pw_palette[4]
#define C_GRAPHITE pw_palette[5]

/* Extends [*lo, *hi] by the finite y values of s. */
static void span_y(const pw_xyset *s, double *lo, double *hi)
{
    for (size_t i = 0; i < s->n; i++)
        if (isfinite(s->x[i]) && isfinite(s->y[i])) {
            if (s->y[i] < *lo)
                *lo = s->y[i];
            if (s->y[i] > *hi)
                *hi = s->y[i];
        }
}

static void draw_set(pw_sbuf *b, const pw_frame *f, const pw_xyset *s, const pw_style *st,
                     bool line, const char *cls)
{
    if (s->n == 0 || !s->x || !s->y)
        return;
    if (line)
        pw_svg_polyline(b, f, s->x, s->y, s->n, st, cls);
    else
        pw_svg_markers(b, f, s->x, s->y, s->n, st, cls);
}

/* The measured liquid (filled circles) and vapor (open triangles) of a phase diagram, with their
 * legend rows; size is the circles' (the triangles are one unit larger). */
static void draw_measured(pw_sbuf *b, const pw_frame *f, pw_legend *lg, const pw_xyset *liquid,
                          const pw_xyset *vapor, double size)
{
    pw_style ml = st_mark(C_INK, PW_MARK_CIRCLE, true, size);
    pw_style mv = st_mark(C_BRICK, PW_MARK_TRIANGLE, false, size + 1.0);
    if (liquid->n) {
        draw_set(b, f, liquid, &ml, false, "pw-points pw-measured-liquid");
        pw_legend_add(lg, "measured liquid x\xe2\x82\x81", &ml, false);
    }
    if (vapor->n) {
        draw_set(b, f, vapor, &mv, false, "pw-points pw-measured-vapor");
        pw_legend_add(lg, "measured vapor y\xe2\x82\x81", &mv, false);
    }
}

static const char *pinch_kind_name(pw_pinch_kind k)
{
    return k == PW_PINCH_TANGENT ? "tangent" : "feed";
}

static const char *section_name(pw_section s)
{
    return s == PW_SECTION_STRIPPING ? "stripping" : "rectifying";
}

/* Markers of s that lie inside the frame's window (the zoomed view leaves the others out). */
static void draw_inside(pw_sbuf *b, const pw_frame *f, const pw_xyset *s, const pw_style *st,
                        const char *cls)
{
    double x[64], y[64];
    size_t k = 0;
    for (size_t i = 0; i < s->n; i++) {
        if (!(s->x[i] >= f->x_lo && s->x[i] <= f->x_hi && s->y[i] >= f->y_lo && s->y[i] <= f->y_hi))
            continue;
        x[k] = s->x[i];
        y[k++] = s->y[i];
        if (k == 64) {
            pw_svg_markers(b, f, x, y, k, st, cls);
            k = 0;
        }
    }
    if (k)
        pw_svg_markers(b, f, x, y, k, st, cls);
}

static bool inside(const pw_frame *f, double x, double y)
{
    return x >= f->x_lo && x <= f->x_hi && y >= f->y_lo && y <= f->y_hi;
}

pw_status pw_plot_xy(pw_sbuf *b, const pw_plot_xy_in *in)
{
    pw_frame f;
    double x0 = 0.0, x1 = 1.0, y0 = 0.0, y1 = 1.0;
    if (in->zoom) {
        x0 = in->win_x[0];
        x1 = in->win_x[1];
        y0 = in->win_y[0];
        y1 = in->win_y[1];
    }
    pw_status st = pw_frame_init(&f, in->id ? in->id : "plot-xy", in->zoom ? W_ZOOM : W_SQUARE,
                                 in->zoom ? W_ZOOM : H_SQUARE, x0, x1, y0, y1, in->zoom ? 5 : 10,
                                 in->zoom ? 5 : 10);
    if (st != PW_OK)
        return st;
    bool col = in->column && in->feasible, dec = in->column && in->decanter;
    /* the legend goes below the square: inside it would cover the construction */
    size_t n_leg = 1 + (col ? 4 : 0) + (dec ? (in->dec_only ? 3 : 4) : 0) + (in->three_phase.n && !dec ? 1 : 0) +
                   (in->measured.n && !in->zoom ? 1 : 0) + (in->azeotropes.n && !in->zoom ? 1 : 0);
    pw_frame_reserve_legend(&f, n_leg);
    char title[PW_SVG_LABEL_MAX], xl[PW_SVG_LABEL_MAX], yl[PW_SVG_LABEL_MAX], lab[PW_SVG_LABEL_MAX];
    if (in->zoom)
        snprintf(title, sizeof title, "%s", in->title ? in->title : "Near the pinch, enlarged");
    else
        snprintf(title, sizeof title, "Vapor against liquid, %s%s", in->column ? "column at " : "",
                 in->condition ? in->condition : "");
    snprintf(xl, sizeof xl, "x\xe2\x82\x81, liquid mole fraction of %s / (mol/mol)", in->name1);
    snprintf(yl, sizeof yl, "y\xe2\x82\x81, vapor mole fraction of %s / (mol/mol)", in->name1);
    if (in->zoom) { /* a narrow plot: shorter labels */
        snprintf(xl, sizeof xl, "x\xe2\x82\x81 / (mol/mol)");
        snprintf(yl, sizeof yl, "y\xe2\x82\x81 / (mol/mol)");
    }
    pw_svg_begin(b, &f, title, xl, yl);
    pw_legend lg = {0};

    pw_style diag = st_line("#9aa1ab", 1.0, NULL);
    pw_svg_segment(b, &f, 0.0, 0.0, 1.0, 1.0, &diag, "pw-diagonal");
    if (dec) { /* the two-liquid region of the decanter: a shaded band between the layers */
        double a = pw_frame_px(&f, fmax(in->layers[0], x0)), c = pw_frame_px(&f, fmin(in->layers[1], x1));
        if (c > a)
            pw_sbuf_printf(b, "<rect class=\"pw-two-liquid\" x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" "
                              "height=\"%.2f\" fill=\"%s\" fill-opacity=\"0.25\"/>\n",
                           a, f.mt, c - a, f.height - f.mt - f.mb, C_SKY);
    }
    pw_style curve = st_line(C_INK, 2.4, NULL);
    draw_set(b, &f, &in->curve, &curve, true, "pw-curve pw-equilibrium");
    pw_legend_add(&lg, "model equilibrium curve", &curve, true);
    pw_style three = st_line(C_GRAPHITE, 2.0, "4 2");
    if (in->three_phase.n) {
        draw_set(b, &f, &in->three_phase, &three, true, "pw-curve pw-three-phase");
        if (!dec)
            pw_legend_add(&lg, "three-phase vapor over two liquids", &three, true);
    }
    if (in->column) {
        const pw_column_spec *sp = &in->spec;
        pw_style tgt = st_line("#9aa1ab", 1.0, "1 3");
        double tx[3] = {sp->xb, sp->zf, sp->xd};
        for (int i = 0; i < 3; i++)
            pw_svg_segment(b, &f, tx[i], 0.0, tx[i], tx[i], &tgt, "pw-target");
        if (col) {
            pw_style steps = st_line(C_TEAL, in->zoom ? 1.4 : 1.6, NULL);
            draw_set(b, &f, &in->steps, &steps, true, "pw-curve pw-steps");
            pw_style qline = st_line(C_GRAPHITE, 1.6, "2 3");
            draw_set(b, &f, &in->qline, &qline, true, "pw-curve pw-qline");
            pw_style rmin = st_line(C_BRICK, 1.8, "7 3");
            draw_set(b, &f, &in->op_min, &rmin, true, "pw-curve pw-oplines-rmin");
            pw_style rop = st_line(C_AMBER, 2.2, NULL);
            draw_set(b, &f, &in->op, &rop, true, "pw-curve pw-oplines-rop");
            if (isfinite(in->stages) && in->steps.n)
                snprintf(lab, sizeof lab, "stage steps at R = %.3g (%.1f stages)", in->r_op,
                         in->stages);
            else
                snprintf(lab, sizeof lab, "no stage steps: the column cannot be stepped at R = %.3g",
                         in->r_op);
            pw_legend_add(&lg, lab, &steps, true);
            pw_legend_add(&lg, "q-line", &qline, true);
            snprintf(lab, sizeof lab, "operating lines at R_min = %.3g", in->r_min);
            pw_legend_add(&lg, lab, &rmin, true);
            snprintf(lab, sizeof lab, "operating lines at R = %.3g (%.2f R_min)", in->r_op, in->factor);
            pw_legend_add(&lg, lab, &rop, true);
        }
        if (dec) {
            const char *nm[2] = {"A", "B"};
            pw_style dsteps[2] = {st_line(C_TEAL, 1.6, NULL), st_line(C_BRICK, 1.6, NULL)};
            pw_style dop[2] = {st_line(C_AMBER, 2.0, NULL), st_line(C_AMBER, 2.0, "7 3")};
            for (int k = 0; k < 2; k++) {
                if (in->dec_only && k != in->dec_only - 1)
                    continue;
                draw_set(b, &f, &in->dec_op[k], &dop[k], true, "pw-curve pw-decanter-opline");
                draw_set(b, &f, &in->dec_steps[k], &dsteps[k], true, "pw-curve pw-decanter-steps");
                snprintf(lab, sizeof lab, "column %s: stage steps (%.1f stages) at V/B = %.3g",
                         nm[k], in->dec_stages[k], in->dec_boilup[k]);
                pw_legend_add(&lg, lab, &dsteps[k], true);
            }
            if (in->dec_only)
                pw_legend_add(&lg, "stripping operating line", &dop[in->dec_only - 1], true);
            else
                pw_legend_add(&lg, "stripping operating lines (A solid, B dashed)", &dop[0], true);
            pw_style band = {C_SKY, 8.0, NULL, PW_MARK_NONE, false, 0.0, 0.5};
            snprintf(lab, sizeof lab, "two liquids: decanter layers x = %.3f and %.3f",
                     in->layers[0], in->layers[1]);
            pw_legend_add(&lg, lab, &band, true);
        }
    }
    pw_style meas = st_mark(C_BRICK, PW_MARK_CIRCLE, false, 7.5);
    if (in->measured.n) {
        if (in->zoom) {
            draw_inside(b, &f, &in->measured, &meas, "pw-points pw-measured");
        } else {
            draw_set(b, &f, &in->measured, &meas, false, "pw-points pw-measured");
            pw_legend_add(&lg, in->measured_label ? in->measured_label : "measured", &meas, false);
        }
    }
    pw_style az = st_mark(C_GRAPHITE, PW_MARK_DIAMOND, true, 9.0);
    if (in->azeotropes.n && !in->zoom) {
        draw_set(b, &f, &in->azeotropes, &az, false, "pw-points pw-azeotrope");
        pw_legend_add(&lg, "azeotrope (model)", &az, false);
    }
    pw_svg_end_data(b);
    if (in->column && !in->zoom) {
        const pw_column_spec *sp = &in->spec;
        /* the decanter scheme has two bottoms and no distillate: name them by their columns
         * (A's bottoms rich in component 1) */
        bool xd_high = sp->xd > sp->xb;
        const char *nm[3] = {"xB", "zF", "xD"};
        if (in->decanter) {
            nm[0] = xd_high ? "B bottoms" : "A bottoms";
            nm[2] = xd_high ? "A bottoms" : "B bottoms";
        }
        double tx[3] = {sp->xb, sp->zf, sp->xd};
        /* above the axis, nudged apart when two targets sit close together */
        double last = -1e9, gap = in->decanter ? 60.0 : 24.0;
        int order[3] = {0, 1, 2};
        for (int i = 0; i < 3; i++)
            for (int j = i + 1; j < 3; j++)
                if (tx[order[j]] < tx[order[i]]) {
                    int t = order[i];
                    order[i] = order[j];
                    order[j] = t;
                }
        for (int k = 0; k < 3; k++) {
            int i = order[k];
            double px = pw_frame_px(&f, tx[i]);
            if (px < last + gap)
                px = last + gap;
            px = fmin(fmax(px, f.ml + 0.5 * gap), f.width - f.mr - 0.5 * gap);
            last = px;
            pw_svg_text_px(b, px, pw_frame_py(&f, 0.0) - 8.0, "middle", 11.0, true, C_GRAPHITE,
                           nm[i], "pw-target-label");
        }
    }
    for (size_t i = 0; i < in->azeotropes.n && !in->zoom; i++) {
        snprintf(lab, sizeof lab, "azeotrope x = %.3f", in->azeotropes.x[i]);
        bool right = in->azeotropes.x[i] > 0.5;
        pw_svg_annotate(b, &f, in->azeotropes.x[i], in->azeotropes.y[i], right ? -30.0 : 30.0, 60.0,
                        right ? "end" : "start", lab, C_GRAPHITE);
    }
    if (col && inside(&f, in->pinch.x, in->pinch.y)) {
        /* the pinch last: above every curve, step and data marker */
        pw_style pin = st_mark(C_BRICK, PW_MARK_STAR, true, in->zoom ? 13.0 : 11.0);
        double px = pw_frame_px(&f, in->pinch.x), py = pw_frame_py(&f, in->pinch.y);
        snprintf(lab, sizeof lab, "%s pinch x = %.3f (%s)", pinch_kind_name(in->pinch.kind),
                 in->pinch.x, section_name(in->pinch.section));
        if (in->zoom) {
            snprintf(lab, sizeof lab, "%s pinch x = %.4f", pinch_kind_name(in->pinch.kind),
                     in->pinch.x);
            /* into the empty lower right, below the operating lines */
            double ty = fmin(f.height - f.mb - 30.0, py + 90.0);
            pw_svg_annotate(b, &f, in->pinch.x, in->pinch.y, 24.0, ty - py, "start", lab, C_BRICK);
        } else {
            /* the label goes into the empty triangle below the diagonal */
            bool right = in->pinch.x > 0.5;
            double lx = right ? fmin(0.97, in->pinch.x + 0.15) : in->pinch.x + 0.1;
            double ly = fmax(0.06, in->pinch.y - 0.35);
            pw_svg_annotate(b, &f, in->pinch.x, in->pinch.y, pw_frame_px(&f, lx) - px,
                            pw_frame_py(&f, ly) - py, right ? "end" : "start", lab, C_BRICK);
        }
        pw_sbuf_puts(b, "<g class=\"pw-pinch\">\n");
        pw_svg_marker_px(b, px, py, &pin);
        pw_sbuf_puts(b, "</g>\n");
    }
    pw_svg_legend(b, &f, &lg, PW_LEGEND_BELOW);
    pw_svg_end(b, &f);
    return pw_sbuf_status(b);
}

pw_status pw_plot_phase(pw_sbuf *b, const pw_plot_phase_in *in)
{
    double lo = INFINITY, hi = -INFINITY;
    span_y(&in->bubble, &lo, &hi);
    span_y(&in->dew, &lo, &hi);
    span_y(&in->meas_liquid, &lo, &hi);
    span_y(&in->meas_vapor, &lo, &hi);
    span_y(&in->binodal[0], &lo, &hi);
    span_y(&in->binodal[1], &lo, &hi);
    if (!(hi >= lo))
        return PW_EINVAL;
    pw_svg_nice_range(&lo, &hi, 6);
    pw_frame f;
    pw_status st = pw_frame_init(&f, in->isothermal ? "plot-pxy" : "plot-txy", W_WIDE, H_WIDE, 0.0,
                                 1.0, lo, hi, 10, 6);
    if (st != PW_OK)
        return st;
    bool split = in->layers.n == 2;
    pw_frame_reserve_legend(&f, 2u + (in->meas_liquid.n ? 1u : 0u) + (in->meas_vapor.n ? 1u : 0u) +
                                    (in->azeotropes.n ? 1u : 0u) + (split ? 1u : 0u) +
                                    (in->binodal[0].n ? 1u : 0u));
    char title[PW_SVG_LABEL_MAX], xl[PW_SVG_LABEL_MAX], yl[PW_SVG_LABEL_MAX], lab[PW_SVG_LABEL_MAX];
    snprintf(title, sizeof title, "%s %s", in->isothermal ? "Pressure-composition" :
                                                           "Temperature-composition",
             in->condition ? in->condition : "");
    snprintf(xl, sizeof xl, "x\xe2\x82\x81 or y\xe2\x82\x81, mole fraction of %s / (mol/mol)",
             in->name1);
    const char *unit = in->unit ? in->unit : (in->isothermal ? "kPa" : "K");
    snprintf(yl, sizeof yl, "%s / %s", in->isothermal ? "P" : "T", unit);
    pw_svg_begin(b, &f, title, xl, yl);
    pw_legend lg = {0};
    pw_style bub = st_line(C_INK, 2.4, NULL), dew = st_line(C_AMBER, 2.4, "8 4");
    draw_set(b, &f, &in->bubble, &bub, true, "pw-curve pw-bubble");
    draw_set(b, &f, &in->dew, &dew, true, "pw-curve pw-dew");
    pw_legend_add(&lg, "bubble curve (model)", &bub, true);
    pw_legend_add(&lg, "dew curve (model)", &dew, true);
    pw_style bin = st_line(C_TEAL, 2.0, "2 3");
    if (in->binodal[0].n) {
        draw_set(b, &f, &in->binodal[0], &bin, true, "pw-curve pw-binodal");
        draw_set(b, &f, &in->binodal[1], &bin, true, "pw-curve pw-binodal");
        pw_legend_add(&lg, "two-liquid region: the layers below the three-phase line", &bin, true);
    }
    pw_style lay = st_mark(C_TEAL, PW_MARK_SQUARE, true, 8.0);
    if (split) {
        draw_set(b, &f, &in->layers, &lay, false, "pw-points pw-layers");
        snprintf(lab, sizeof lab, "two liquid layers, x = %.3f and %.3f", in->layers.x[0],
                 in->layers.x[1]);
        pw_legend_add(&lg, lab, &lay, false);
    }
    draw_measured(b, &f, &lg, &in->meas_liquid, &in->meas_vapor, 7.0);
    pw_style az = st_mark(C_GRAPHITE, PW_MARK_DIAMOND, true, 10.0);
    if (in->azeotropes.n) {
        draw_set(b, &f, &in->azeotropes, &az, false, "pw-points pw-azeotrope");
        pw_legend_add(&lg, "azeotrope (model)", &az, false);
    }
    pw_svg_end_data(b);
    for (size_t i = 0; i < in->azeotropes.n; i++) {
        snprintf(lab, sizeof lab, "azeotrope x = %.3f, %s = %.*f %s", in->azeotropes.x[i],
                 in->isothermal ? "P" : "T", in->isothermal ? 3 : 2, in->azeotropes.y[i], unit);
        bool right = in->azeotropes.x[i] > 0.5;
        pw_svg_annotate(b, &f, in->azeotropes.x[i], in->azeotropes.y[i], right ? -20.0 : 20.0,
                        in->isothermal ? 34.0 : -34.0, right ? "end" : "start", lab, C_GRAPHITE);
    }
    pw_svg_legend(b, &f, &lg, PW_LEGEND_BELOW);
    pw_svg_end(b, &f);
    return pw_sbuf_status(b);
}

pw_status pw_plot_models(pw_sbuf *b, const pw_plot_models_in *in)
{
    double lo = INFINITY, hi = -INFINITY;
    size_t n = in->n < PW_PLOT_MAX_MODELS ? in->n : PW_PLOT_MAX_MODELS;
    for (size_t k = 0; k < n; k++) {
        span_y(&in->bubble[k], &lo, &hi);
        span_y(&in->dew[k], &lo, &hi);
    }
    span_y(&in->meas_liquid, &lo, &hi);
    span_y(&in->meas_vapor, &lo, &hi);
    if (!(hi >= lo))
        return PW_EINVAL;
    pw_svg_nice_range(&lo, &hi, 6);
    pw_frame f;
    pw_status st = pw_frame_init(&f, "plot-models", W_WIDE, H_WIDE, 0.0, 1.0, lo, hi, 10, 6);
    if (st != PW_OK)
        return st;
    pw_frame_reserve_legend(&f, n + (in->meas_liquid.n ? 1u : 0u) + (in->meas_vapor.n ? 1u : 0u));
    char title[PW_SVG_LABEL_MAX], xl[PW_SVG_LABEL_MAX], yl[PW_SVG_LABEL_MAX], lab[PW_SVG_LABEL_MAX];
    snprintf(title, sizeof title, "Every fitted model %s", in->condition ? in->condition : "");
    snprintf(xl, sizeof xl, "x\xe2\x82\x81 or y\xe2\x82\x81, mole fraction of %s / (mol/mol)",
             in->name1);
    const char *unit = in->unit ? in->unit : (in->isothermal ? "kPa" : "K");
    snprintf(yl, sizeof yl, "%s / %s", in->isothermal ? "P" : "T", unit);
    pw_svg_begin(b, &f, title, xl, yl);
    pw_legend lg = {0};
    for (size_t k = 0; k < n; k++) {
        pw_style s = pw_style_series(k);
        pw_style line = st_line(s.stroke, 2.2, s.dash), thin = st_line(s.stroke, 1.3, s.dash);
        draw_set(b, &f, &in->bubble[k], &line, true, "pw-curve pw-model-bubble");
        draw_set(b, &f, &in->dew[k], &thin, true, "pw-curve pw-model-dew");
        snprintf(lab, sizeof lab, "%s: bubble (thick) and dew (thin)", in->label[k] ? in->label[k] : "?");
        pw_legend_add(&lg, lab, &line, true);
    }
    draw_measured(b, &f, &lg, &in->meas_liquid, &in->meas_vapor, 6.0);
    pw_svg_end_data(b);
    pw_svg_legend(b, &f, &lg, PW_LEGEND_BELOW);
    pw_svg_end(b, &f);
    return pw_sbuf_status(b);
}

pw_status pw_plot_residuals(pw_sbuf *b, const pw_plot_resid_in *in)
{
    double lo = INFINITY, hi = -INFINITY;
    span_y(&in->used, &lo, &hi);
    span_y(&in->excluded, &lo, &hi);
    if (isfinite(in->band)) {
        lo = fmin(lo, -in->band);
        hi = fmax(hi, in->band);
    }
    if (!(hi >= lo))
        return PW_EINVAL;
    /* symmetric about zero so the sign of the bias is easy to read */
    double m = fmax(fabs(lo), fabs(hi)) * 1.1;
    if (!(m > 0.0))
        m = 1.0;
    lo = -m;
    hi = m;
    pw_svg_nice_range(&lo, &hi, 6);
    pw_frame f;
    pw_status st = pw_frame_init(&f, in->id, W_WIDE, H_SHORT, 0.0, 1.0, lo, hi, 10, 6);
    if (st != PW_OK)
        return st;
    char xl[PW_SVG_LABEL_MAX];
    snprintf(xl, sizeof xl, "x\xe2\x82\x81, liquid mole fraction of %s / (mol/mol)", in->name1);
    pw_svg_begin(b, &f, in->title, xl, in->ylabel);
    pw_legend lg = {0};
    if (isfinite(in->band) && in->band > 0.0) {
        double y0 = pw_frame_py(&f, in->band), y1 = pw_frame_py(&f, -in->band);
        pw_sbuf_printf(b, "<rect class=\"pw-band\" x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" height=\"%.2f\" "
                          "fill=\"%s\" fill-opacity=\"0.35\"/>\n",
                       f.ml, y0, f.width - f.ml - f.mr, y1 - y0, C_SKY);
        pw_style band = {C_SKY, 8.0, NULL, PW_MARK_NONE, false, 0.0, 0.5};
        char lab[PW_SVG_LABEL_MAX];
        snprintf(lab, sizeof lab, "\xc2\xb1 one measurement standard deviation (%.3g)", in->band);
        pw_legend_add(&lg, lab, &band, true);
    }
    pw_style zero = st_line(C_GRAPHITE, 1.2, NULL);
    pw_svg_segment(b, &f, 0.0, 0.0, 1.0, 0.0, &zero, "pw-zero");
    pw_style used = st_mark(C_INK, PW_MARK_CIRCLE, true, 7.0);
    pw_style excl = st_mark(C_BRICK, PW_MARK_CROSS, false, 9.0);
    draw_set(b, &f, &in->used, &used, false, "pw-points pw-residual");
    pw_legend_add(&lg, "calculated \xe2\x88\x92 measured", &used, false);
    if (in->excluded.n) {
        draw_set(b, &f, &in->excluded, &excl, false, "pw-points pw-residual-excluded");
        pw_legend_add(&lg, "left out of the fit", &excl, false);
    }
    pw_svg_end_data(b);
    pw_svg_legend(b, &f, &lg, PW_CORNER_TR);
    pw_svg_end(b, &f);
    return pw_sbuf_status(b);
}

pw_status pw_plot_lngamma(pw_sbuf *b, const pw_plot_lngamma_in *in)
{
    double lo = 0.0, hi = 0.0;
    span_y(&in->model1, &lo, &hi);
    span_y(&in->model2, &lo, &hi);
    span_y(&in->exp1, &lo, &hi);
    span_y(&in->exp2, &lo, &hi);
    pw_svg_nice_range(&lo, &hi, 6);
    pw_frame f;
    pw_status st = pw_frame_init(&f, "plot-lngamma", W_WIDE, H_WIDE, 0.0, 1.0, lo, hi, 10, 6);
    if (st != PW_OK)
        return st;
    char title[PW_SVG_LABEL_MAX], xl[PW_SVG_LABEL_MAX], lab[PW_SVG_LABEL_MAX];
    snprintf(title, sizeof title, "Activity coefficients %s", in->condition ? in->condition : "");
    snprintf(xl, sizeof xl, "x\xe2\x82\x81, liquid mole fraction of %s / (mol/mol)", in->name1);
    pw_svg_begin(b, &f, title, xl, "ln \xce\xb3 / (dimensionless)");
    pw_legend lg = {0};
    pw_style zero = st_line("#9aa1ab", 1.0, NULL);
    pw_svg_segment(b, &f, 0.0, 0.0, 1.0, 0.0, &zero, "pw-zero");
    pw_style m1 = st_line(C_INK, 2.4, NULL), m2 = st_line(C_BRICK, 2.4, "8 4");
    pw_style e1 = st_mark(C_INK, PW_MARK_CIRCLE, true, 7.0);
    pw_style e2 = st_mark(C_BRICK, PW_MARK_TRIANGLE, false, 8.0);
    draw_set(b, &f, &in->model1, &m1, true, "pw-curve pw-lngamma1");
    draw_set(b, &f, &in->model2, &m2, true, "pw-curve pw-lngamma2");
    draw_set(b, &f, &in->exp1, &e1, false, "pw-points pw-lngamma1-exp");
    draw_set(b, &f, &in->exp2, &e2, false, "pw-points pw-lngamma2-exp");
    snprintf(lab, sizeof lab, "ln \xce\xb3\xe2\x82\x81 (%s), model", in->name1);
    pw_legend_add(&lg, lab, &m1, true);
    snprintf(lab, sizeof lab, "ln \xce\xb3\xe2\x82\x82 (%s), model", in->name2);
    pw_legend_add(&lg, lab, &m2, true);
    if (in->exp1.n) {
        pw_legend_add(&lg, "ln \xce\xb3\xe2\x82\x81 from each measured point", &e1, false);
        pw_legend_add(&lg, "ln \xce\xb3\xe2\x82\x82 from each measured point", &e2, false);
    }
    pw_svg_end_data(b);
    pw_svg_legend(b, &f, &lg, PW_CORNER_TR);
    pw_svg_end(b, &f);
    return pw_sbuf_status(b);
}

pw_status pw_plot_enthalpy(pw_sbuf *b, const pw_plot_enthalpy_in *in)
{
    double lo = INFINITY, hi = -INFINITY;
    span_y(&in->liquid, &lo, &hi);
    span_y(&in->vapor, &lo, &hi);
    span_y(&in->feed, &lo, &hi);
    if (!(lo < hi))
        return PW_EINVAL;
    pw_svg_nice_range(&lo, &hi, 6);
    pw_frame f;
    pw_status st = pw_frame_init(&f, "plot-enthalpy", W_WIDE, H_WIDE, 0.0, 1.0, lo, hi, 10, 6);
    if (st != PW_OK)
        return st;
    /* the legend goes below: inside it would cover the vapor curve at the top */
    pw_frame_reserve_legend(&f, 3u + (in->tie.n == 2 ? 1u : 0u));
    char title[PW_SVG_LABEL_MAX], xl[PW_SVG_LABEL_MAX];
    snprintf(title, sizeof title, "Enthalpy and composition %s", in->condition ? in->condition : "");
    snprintf(xl, sizeof xl, "x\xe2\x82\x81, y\xe2\x82\x81, mole fraction of %s / (mol/mol)",
             in->name1);
    pw_svg_begin(b, &f, title, xl, "enthalpy / (kJ/mol), liquids at 298.15 K = 0");
    pw_legend lg = {0};
    pw_style liq = st_line(C_INK, 2.4, NULL), vap = st_line(C_TEAL, 2.4, "8 4");
    pw_style tie = st_line(C_BRICK, 1.8, "7 3");
    pw_style feed = st_mark(C_AMBER, PW_MARK_DIAMOND, true, 10.0);
    draw_set(b, &f, &in->liquid, &liq, true, "pw-curve pw-enthalpy-liquid");
    draw_set(b, &f, &in->vapor, &vap, true, "pw-curve pw-enthalpy-vapor");
    if (in->tie.n == 2)
        draw_set(b, &f, &in->tie, &tie, true, "pw-line pw-enthalpy-tie");
    draw_set(b, &f, &in->feed, &feed, false, "pw-points pw-enthalpy-feed");
    pw_legend_add(&lg, "saturated liquid (bubble point)", &liq, true);
    pw_legend_add(&lg, "saturated vapor (dew point)", &vap, true);
    if (in->tie.n == 2)
        pw_legend_add(&lg, in->tie_label ? in->tie_label : "limiting tie line", &tie, true);
    pw_legend_add(&lg, "feed", &feed, false);
    pw_svg_end_data(b);
    pw_svg_legend(b, &f, &lg, PW_LEGEND_BELOW);
    pw_svg_end(b, &f);
    return pw_sbuf_status(b);
}

pw_status pw_plot_band(pw_sbuf *b, const pw_plot_band_in *in)
{
    double xlo = in->x_lo, xhi = in->x_hi, ylo = in->y_lo, yhi = in->y_hi;
    if (!isfinite(ylo) || !isfinite(yhi)) {
        double lo = INFINITY, hi = -INFINITY;
        for (size_t k = 0; k < in->n_curves; k++)
            span_y(&in->curves[k], &lo, &hi);
        span_y(&in->central, &lo, &hi);
        if (!(hi >= lo))
            return PW_EINVAL;
        pw_svg_nice_range(&lo, &hi, 6);
        ylo = isfinite(ylo) ? ylo : lo;
        yhi = isfinite(yhi) ? yhi : hi;
    }
    if (!isfinite(xlo))
        xlo = 0.0;
    if (!isfinite(xhi))
        xhi = 1.0;
    pw_frame f;
    pw_status st = pw_frame_init(&f, in->id ? in->id : "plot-band", W_WIDE, H_WIDE, xlo, xhi, ylo,
                                 yhi, 8, 6);
    if (st != PW_OK)
        return st;
    /* the legend goes below the plot: inside, it would cover the curves it explains */
    pw_frame_reserve_legend(&f, (in->n_curves ? 1u : 0u) + (in->central.n ? 1u : 0u) +
                                    (in->line.n ? 1u : 0u) + (in->marks.n ? 1u : 0u));
    pw_svg_begin(b, &f, in->title, in->xlabel, in->ylabel);
    pw_legend lg = {0};
    pw_style thin = {C_SKY, 1.2, NULL, PW_MARK_NONE, false, 0.0, 0.6};
    for (size_t k = 0; k < in->n_curves; k++)
        draw_set(b, &f, &in->curves[k], &thin, true, "pw-curve pw-sample");
    if (in->n_curves) {
        char lab[PW_SVG_LABEL_MAX];
        snprintf(lab, sizeof lab, "%zu sampled curves", in->n_curves);
        pw_legend_add(&lg, in->curves_label ? in->curves_label : lab, &thin, true);
    }
    pw_style mid = st_line(C_INK, 1.6, NULL);
    if (in->central.n) {
        draw_set(b, &f, &in->central, &mid, true, "pw-curve pw-central");
        pw_legend_add(&lg, "best fit", &mid, true);
    }
    pw_style ln = st_line(C_BRICK, 1.8, "7 3");
    if (in->line.n) {
        draw_set(b, &f, &in->line, &ln, true, "pw-curve pw-band-line");
        pw_legend_add(&lg, in->line_label ? in->line_label : "construction", &ln, true);
    }
    pw_style mk = st_mark(C_BRICK, PW_MARK_STAR, true, 10.0);
    if (in->marks.n) {
        draw_set(b, &f, &in->marks, &mk, false, "pw-points pw-marks");
        pw_legend_add(&lg, in->mark_label ? in->mark_label : "marked points", &mk, false);
    }
    pw_svg_end_data(b);
    pw_svg_legend(b, &f, &lg, PW_LEGEND_BELOW);
    pw_svg_end(b, &f);
    return pw_sbuf_status(b);
}
