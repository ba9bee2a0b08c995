/* SVG writer for the report: string buffer, ticks, frame, series, legend. See svg.h. */
#include "report/svg.h"

#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static const double PI = 3.14159265358979323846;

/* ---- buffer ---- */

void pw_sbuf_init(pw_sbuf *b)
{
    b->data = NULL;
    b->len = b->cap = 0;
    b->failed = false;
}

void pw_sbuf_free(pw_sbuf *b)
{
    if (!b)
        return;
    free(b->data);
    pw_sbuf_init(b);
}

pw_status pw_sbuf_status(const pw_sbuf *b)
{
    return b->failed ? PW_ENOMEM : PW_OK;
}

const char *pw_sbuf_str(const pw_sbuf *b)
{
    return b->data ? b->data : "";
}

static pw_status reserve(pw_sbuf *b, size_t extra)
{
    if (b->failed)
        return PW_ENOMEM;
    if (extra > (size_t)-1 / 2 - b->len - 1) {
        b->failed = true;
        return PW_ENOMEM;
    }
    size_t need = b->len + extra + 1;
    if (need <= b->cap)
        return PW_OK;
    size_t cap = b->cap ? b->cap : 256;
    while (cap < need)
        cap *= 2;
    char *p = realloc(b->data, cap);
    if (!p) {
        b->failed = true;
        return PW_ENOMEM;
    }
    b->data = p;
    b->cap = cap;
    return PW_OK;
}

pw_status pw_sbuf_putn(pw_sbuf *b, const char *s, size_t n)
{
    if (reserve(b, n) != PW_OK)
        return PW_ENOMEM;
    memcpy(b->data + b->len, s, n);
    b->len += n;
    b->data[b->len] = '\0';
    return PW_OK;
}

pw_status pw_sbuf_puts(pw_sbuf *b, const char *s)
{
    return s ? pw_sbuf_putn(b, s, strlen(s)) : pw_sbuf_status(b);
}

pw_status pw_sbuf_printf(pw_sbuf *b, const char *fmt, ...)
{
    if (b->failed)
        return PW_ENOMEM;
    va_list ap;
    va_start(ap, fmt);
    char small[256];
    int n = vsnprintf(small, sizeof small, fmt, ap);
    va_end(ap);
    if (n < 0) {
        b->failed = true;
        return PW_ENOMEM;
    }
    if ((size_t)n < sizeof small)
        return pw_sbuf_putn(b, small, (size_t)n);
    if (reserve(b, (size_t)n) != PW_OK)
        return PW_ENOMEM;
    va_start(ap, fmt);
    vsnprintf(b->data + b->len, (size_t)n + 1, fmt, ap);
    va_end(ap);
    b->len += (size_t)n;
    return PW_OK;
}

pw_status pw_sbuf_escape(pw_sbuf *b, const char *s)
{
    if (!s)
        return pw_sbuf_status(b);
    const char *run = s;
    for (const char *p = s; *p; p++) {
        const char *ent = NULL;
        unsigned char c = (unsigned char)*p;
        switch (c) {
        case '&': ent = "&amp;"; break;
        case '<': ent = "&lt;"; break;
        case '>': ent = "&gt;"; break;
        case '"': ent = "&quot;"; break;
        case '\'': ent = "&#39;"; break;
        default:
            if (c < 0x20 && c != '\t' && c != '\n')
                ent = "";
            break;
        }
        if (ent) {
            pw_sbuf_putn(b, run, (size_t)(p - run));
            pw_sbuf_puts(b, ent);
            run = p + 1;
        }
    }
    pw_sbuf_puts(b, run);
    return pw_sbuf_status(b);
}

pw_status pw_sbuf_coord(pw_sbuf *b, double v)
{
    if (!isfinite(v))
        return pw_sbuf_puts(b, "0");
    /* keep far-away points bounded: the clip path hides them anyway */
    if (v > 1e6)
        v = 1e6;
    if (v < -1e6)
        v = -1e6;
    /* two decimals, trailing zeros trimmed ("12.5", "12", never "-0"): the digits of
     * k = round(100 v) written directly, the same text as "%.2f" of k / 100 trimmed (k / 100.0 is
     * the double nearest that decimal, |k| <= 1e8), without a formatted print per coordinate */
    long long k = llround(v * 100.0);
    char buf[40], *e = buf + sizeof buf, *q = e;
    *--q = '\0';
    bool neg = k < 0;
    unsigned long long u = (unsigned long long)(neg ? -k : k);
    unsigned frac = (unsigned)(u % 100u);
    u /= 100u;
    if (frac != 0) {
        if (frac % 10u != 0)
            *--q = (char)('0' + frac % 10u);
        *--q = (char)('0' + frac / 10u);
        *--q = '.';
    }
    do {
        *--q = (char)('0' + u % 10u);
        u /= 10u;
    } while (u != 0);
    if (neg)
        *--q = '-';
    return pw_sbuf_puts(b, q);
}

/* ---- ticks ---- */

static double nice_step(double span, size_t target)
{
    double raw = span / (double)target;
    double mag = pow(10.0, floor(log10(raw)));
    double f = raw / mag;
    double m = f < 1.5 ? 1.0 : f < 3.5 ? 2.0 : f < 7.5 ? 5.0 : 10.0;
    return m * mag;
}

static double next_step(double step)
{
    double mag = pow(10.0, floor(log10(step) + 1e-9));
    double m = step / mag;
    return (m < 1.5 ? 2.0 : m < 3.5 ? 5.0 : 10.0) * mag;
}

pw_status pw_svg_ticks(double lo, double hi, size_t target, pw_ticks *t)
{
    t->n = 0;
    t->step = NAN;
    t->decimals = 0;
    if (!isfinite(lo) || !isfinite(hi) || !(hi > lo) || target == 0)
        return PW_EINVAL;
    double step = nice_step(hi - lo, target);
    if (!(step > 0.0) || !isfinite(step))
        return PW_EINVAL;
    /* never more ticks than fit: climb the 1-2-5 ladder */
    while ((hi - lo) / step > (double)(PW_SVG_MAX_TICKS - 1))
        step = next_step(step);
    double eps = 1e-9 * step;
    double k0 = ceil((lo - eps) / step);
    for (double k = k0; t->n < PW_SVG_MAX_TICKS; k += 1.0) {
        double v = k * step;
        if (v > hi + eps)
            break;
        if (fabs(v) < eps)
            v = 0.0;
        t->v[t->n++] = v;
    }
    t->step = step;
    int d = (int)-floor(log10(step) + 1e-9);
    t->decimals = d > 0 ? d : 0;
    return PW_OK;
}

void pw_svg_nice_range(double *lo, double *hi, size_t target)
{
    if (!isfinite(*lo) || !isfinite(*hi)) {
        *lo = 0.0;
        *hi = 1.0;
        return;
    }
    if (*hi < *lo) {
        double t = *lo;
        *lo = *hi;
        *hi = t;
    }
    if (*hi - *lo <= 1e-12 * fmax(1.0, fabs(*lo))) {
        double pad = fabs(*lo) > 0.0 ? 0.05 * fabs(*lo) : 0.5;
        *lo -= pad;
        *hi += pad;
    }
    if (target == 0)
        target = 5;
    double step = nice_step(*hi - *lo, target);
    *lo = floor(*lo / step + 1e-9) * step;
    *hi = ceil(*hi / step - 1e-9) * step;
}

const char *pw_svg_format_tick(double v, int decimals, char *buf, size_t len)
{
    if (!isfinite(v)) {
        snprintf(buf, len, "?");
        return buf;
    }
    if (decimals < 0)
        decimals = 0;
    if (decimals > 12)
        decimals = 12;
    double scale = pow(10.0, decimals);
    double r = round(v * scale) / scale;
    if (r == 0.0)
        r = 0.0;
    if (r < 0.0)
        snprintf(buf, len, "\xe2\x88\x92%.*f", decimals, -r); /* U+2212 MINUS SIGN */
    else
        snprintf(buf, len, "%.*f", decimals, r);
    return buf;
}

/* ---- styles ---- */

/* Ordered dark, light, middle, ... so neighbours differ in lightness as well as hue; the hues
 * keep to blue/orange/teal/brick axes that stay apart for the common colour-vision deficiencies. */
const char *const pw_palette[PW_PALETTE_N] = {
    "#17324d", /* deep ink blue   L* ~ 20 */
    "#e08e2b", /* amber           L* ~ 66 */
    "#2b7f7a", /* dark teal       L* ~ 48 */
    "#8c2d19", /* brick           L* ~ 30 */
    "#86acd9", /* sky             L* ~ 69 */
    "#595959", /* graphite        L* ~ 38 */
};

static const char *const dashes[PW_PALETTE_N] = {NULL, "7 3", "2 3", "9 3 2 3", "4 4", "1 2"};
static const pw_marker marks[PW_PALETTE_N] = {PW_MARK_CIRCLE,  PW_MARK_SQUARE,        PW_MARK_TRIANGLE,
                                              PW_MARK_DIAMOND, PW_MARK_TRIANGLE_DOWN, PW_MARK_CROSS};

pw_style pw_style_series(size_t k)
{
    size_t i = k % PW_PALETTE_N;
    pw_style s = {pw_palette[i], 2.0, dashes[i], marks[i], i % 2 == 0, 7.0, 1.0};
    return s;
}

/* ---- frame ---- */

static bool id_ok(const char *id)
{
    if (!id || !id[0] || strlen(id) >= PW_SVG_ID_MAX)
        return false;
    for (const char *p = id; *p; p++) {
        char c = *p;
        if (!((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') ||
              c == '-' || c == '_'))
            return false;
    }
    return true;
}

pw_status pw_frame_init(pw_frame *f, const char *id, double width, double height, double x_lo,
                        double x_hi, double y_lo, double y_hi, size_t nx, size_t ny)
{
    memset(f, 0, sizeof *f);
    if (!id_ok(id))
        return PW_EINVAL;
    snprintf(f->id, sizeof f->id, "%s", id);
    f->width = width;
    f->height = height;
    f->ml = 74.0;
    f->mr = 22.0;
    f->mt = 34.0;
    f->mb = 58.0;
    if (!isfinite(width) || !isfinite(height) || width < f->ml + f->mr + 40.0 ||
        height < f->mt + f->mb + 40.0)
        return PW_EINVAL;
    f->x_lo = x_lo;
    f->x_hi = x_hi;
    f->y_lo = y_lo;
    f->y_hi = y_hi;
    pw_status st = pw_svg_ticks(x_lo, x_hi, nx, &f->xt);
    if (st == PW_OK)
        st = pw_svg_ticks(y_lo, y_hi, ny, &f->yt);
    return st;
}

double pw_frame_px(const pw_frame *f, double x)
{
    double w = f->width - f->ml - f->mr;
    return f->ml + (x - f->x_lo) / (f->x_hi - f->x_lo) * w;
}

double pw_frame_py(const pw_frame *f, double y)
{
    double h = f->height - f->mt - f->mb;
    return f->mt + (f->y_hi - y) / (f->y_hi - f->y_lo) * h;
}

static void put_pt(pw_sbuf *b, double px, double py)
{
    pw_sbuf_coord(b, px);
    pw_sbuf_puts(b, " ");
    pw_sbuf_coord(b, py);
}

static void style_attrs(pw_sbuf *b, const pw_style *s, bool fill_none)
{
    pw_sbuf_printf(b, " stroke=\"%s\" stroke-width=\"%.2f\"", s->stroke ? s->stroke : "none",
                   s->width > 0.0 ? s->width : 1.0);
    if (s->dash)
        pw_sbuf_printf(b, " stroke-dasharray=\"%s\"", s->dash);
    if (s->opacity > 0.0 && s->opacity < 1.0)
        pw_sbuf_printf(b, " stroke-opacity=\"%.2f\"", s->opacity);
    if (fill_none)
        pw_sbuf_puts(b, " fill=\"none\"");
}

pw_status pw_svg_text_px(pw_sbuf *b, double px, double py, const char *anchor, double size,
                         bool bold, const char *fill, const char *text, const char *cls)
{
    if (!isfinite(px) || !isfinite(py))
        return pw_sbuf_status(b);
    pw_sbuf_puts(b, "<text x=\"");
    pw_sbuf_coord(b, px);
    pw_sbuf_puts(b, "\" y=\"");
    pw_sbuf_coord(b, py);
    pw_sbuf_printf(b, "\" text-anchor=\"%s\" font-size=\"%.1f\" fill=\"%s\"",
                   anchor ? anchor : "start", size, fill ? fill : PW_INK);
    if (bold)
        pw_sbuf_puts(b, " font-weight=\"600\"");
    if (cls)
        pw_sbuf_printf(b, " class=\"%s\"", cls);
    pw_sbuf_puts(b, ">");
    pw_sbuf_escape(b, text);
    return pw_sbuf_puts(b, "</text>\n");
}

pw_status pw_svg_begin(pw_sbuf *b, const pw_frame *f, const char *title, const char *xlabel,
                       const char *ylabel)
{
    double x0 = f->ml, x1 = f->width - f->mr, y0 = f->mt, y1 = f->height - f->mb;
    pw_sbuf_printf(b,
                   "<svg xmlns=\"http://www.w3.org/2000/svg\" class=\"pw-plot\" id=\"%s\" "
                   "data-plot=\"%s\" viewBox=\"0 0 %.0f %.0f\" width=\"%.0f\" height=\"%.0f\" "
                   "role=\"img\" aria-labelledby=\"%s-title\" font-family=\"'DejaVu Sans', "
                   "'Liberation Sans', Arial, sans-serif\">\n",
                   f->id, f->id, f->width, f->height, f->width, f->height, f->id);
    pw_sbuf_printf(b, "<title id=\"%s-title\">", f->id);
    pw_sbuf_escape(b, title);
    pw_sbuf_puts(b, "</title>\n");
    pw_sbuf_printf(b, "<defs><clipPath id=\"%s-clip\"><rect x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" "
                      "height=\"%.2f\"/></clipPath></defs>\n",
                   f->id, x0, y0, x1 - x0, y1 - y0);
    pw_sbuf_printf(b, "<rect x=\"0\" y=\"0\" width=\"%.0f\" height=\"%.0f\" fill=\"#ffffff\"/>\n",
                   f->width, f->height);
    pw_sbuf_printf(b, "<rect x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" height=\"%.2f\" fill=\"#fbfaf7\"/>\n",
                   x0, y0, x1 - x0, y1 - y0);
    /* title strip */
    pw_svg_text_px(b, x0, 20.0, "start", 14.0, true, PW_INK, title, "pw-plot-title");
    /* grid and ticks */
    char lab[64];
    pw_sbuf_printf(b, "<g class=\"pw-grid\" stroke=\"%s\" stroke-width=\"1\">\n", PW_GRID);
    for (size_t i = 0; i < f->xt.n; i++) {
        double px = pw_frame_px(f, f->xt.v[i]);
        pw_sbuf_puts(b, "<line x1=\"");
        pw_sbuf_coord(b, px);
        pw_sbuf_printf(b, "\" y1=\"%.2f\" x2=\"", y0);
        pw_sbuf_coord(b, px);
        pw_sbuf_printf(b, "\" y2=\"%.2f\"/>\n", y1);
    }
    for (size_t i = 0; i < f->yt.n; i++) {
        double py = pw_frame_py(f, f->yt.v[i]);
        pw_sbuf_printf(b, "<line x1=\"%.2f\" y1=\"", x0);
        pw_sbuf_coord(b, py);
        pw_sbuf_printf(b, "\" x2=\"%.2f\" y2=\"", x1);
        pw_sbuf_coord(b, py);
        pw_sbuf_puts(b, "\"/>\n");
    }
    pw_sbuf_puts(b, "</g>\n");
    pw_sbuf_printf(b, "<g class=\"pw-ticks\" stroke=\"%s\" stroke-width=\"1\">\n", PW_INK);
    for (size_t i = 0; i < f->xt.n; i++) {
        double px = pw_frame_px(f, f->xt.v[i]);
        pw_sbuf_puts(b, "<line x1=\"");
        pw_sbuf_coord(b, px);
        pw_sbuf_printf(b, "\" y1=\"%.2f\" x2=\"", y1);
        pw_sbuf_coord(b, px);
        pw_sbuf_printf(b, "\" y2=\"%.2f\"/>\n", y1 + 5.0);
    }
    for (size_t i = 0; i < f->yt.n; i++) {
        double py = pw_frame_py(f, f->yt.v[i]);
        pw_sbuf_printf(b, "<line x1=\"%.2f\" y1=\"", x0 - 5.0);
        pw_sbuf_coord(b, py);
        pw_sbuf_printf(b, "\" x2=\"%.2f\" y2=\"", x0);
        pw_sbuf_coord(b, py);
        pw_sbuf_puts(b, "\"/>\n");
    }
    pw_sbuf_puts(b, "</g>\n");
    for (size_t i = 0; i < f->xt.n; i++)
        pw_svg_text_px(b, pw_frame_px(f, f->xt.v[i]), y1 + 19.0, "middle", 12.0, false, PW_INK,
                       pw_svg_format_tick(f->xt.v[i], f->xt.decimals, lab, sizeof lab), "pw-tick");
    for (size_t i = 0; i < f->yt.n; i++)
        pw_svg_text_px(b, x0 - 8.0, pw_frame_py(f, f->yt.v[i]) + 4.0, "end", 12.0, false, PW_INK,
                       pw_svg_format_tick(f->yt.v[i], f->yt.decimals, lab, sizeof lab), "pw-tick");
    /* axis labels */
    pw_svg_text_px(b, (x0 + x1) / 2.0, y1 + 44.0, "middle", 13.0, false, PW_INK, xlabel,
                   "pw-axis-label pw-axis-x");
    double cy = (y0 + y1) / 2.0;
    pw_sbuf_printf(b, "<g transform=\"translate(18 %.2f) rotate(-90)\">\n", cy);
    pw_svg_text_px(b, 0.0, 0.0, "middle", 13.0, false, PW_INK, ylabel, "pw-axis-label pw-axis-y");
    pw_sbuf_puts(b, "</g>\n");
    /* lines are clipped to the plot area one by one; markers are not, so points on the frame
     * (pure components at x = 0 and 1) show whole */
    pw_sbuf_puts(b, "<g class=\"pw-data\" stroke-linejoin=\"round\" stroke-linecap=\"round\">\n");
    return pw_sbuf_status(b);
}

pw_status pw_svg_end_data(pw_sbuf *b)
{
    return pw_sbuf_puts(b, "</g>\n");
}

pw_status pw_svg_end(pw_sbuf *b, const pw_frame *f)
{
    pw_sbuf_printf(b, "<rect x=\"%.2f\" y=\"%.2f\" width=\"%.2f\" height=\"%.2f\" fill=\"none\" "
                      "stroke=\"%s\" stroke-width=\"1.2\"/>\n",
                   f->ml, f->mt, f->width - f->ml - f->mr, f->height - f->mt - f->mb, PW_INK);
    return pw_sbuf_puts(b, "</svg>\n");
}

/* ---- series ---- */

pw_status pw_svg_polyline(pw_sbuf *b, const pw_frame *f, const double *x, const double *y,
                          size_t n, const pw_style *s, const char *cls)
{
    /* first pass: is there any run of two finite points? */
    size_t run = 0;
    bool any = false;
    for (size_t i = 0; i < n && !any; i++) {
        bool ok = isfinite(x[i]) && isfinite(y[i]);
        run = ok ? run + 1 : 0;
        any = run >= 2;
    }
    if (!any)
        return pw_sbuf_status(b);
    pw_sbuf_puts(b, "<path d=\"");
    size_t i = 0;
    bool first_seg = true;
    while (i < n) {
        while (i < n && !(isfinite(x[i]) && isfinite(y[i])))
            i++;
        size_t j = i;
        while (j < n && isfinite(x[j]) && isfinite(y[j]))
            j++;
        if (j - i >= 2) {
            for (size_t k = i; k < j; k++) {
                pw_sbuf_puts(b, k == i ? (first_seg ? "M" : " M") : " L");
                put_pt(b, pw_frame_px(f, x[k]), pw_frame_py(f, y[k]));
            }
            first_seg = false;
        }
        i = j;
    }
    pw_sbuf_printf(b, "\" clip-path=\"url(#%s-clip)\"", f->id);
    style_attrs(b, s, true);
    if (cls)
        pw_sbuf_printf(b, " class=\"%s\"", cls);
    return pw_sbuf_puts(b, "/>\n");
}

pw_status pw_svg_segment(pw_sbuf *b, const pw_frame *f, double x0, double y0, double x1,
                         double y1, const pw_style *s, const char *cls)
{
    double x[2] = {x0, x1}, y[2] = {y0, y1};
    return pw_svg_polyline(b, f, x, y, 2, s, cls);
}

pw_status pw_svg_marker_px(pw_sbuf *b, double px, double py, const pw_style *s)
{
    if (!isfinite(px) || !isfinite(py) || s->marker == PW_MARK_NONE)
        return pw_sbuf_status(b);
    double r = (s->size > 0.0 ? s->size : 7.0) / 2.0;
    const char *col = s->stroke ? s->stroke : PW_INK;
    const char *fill = s->filled ? col : "#ffffff";
    double sw = 1.4;
    switch (s->marker) {
    case PW_MARK_CIRCLE:
        pw_sbuf_puts(b, "<circle cx=\"");
        pw_sbuf_coord(b, px);
        pw_sbuf_puts(b, "\" cy=\"");
        pw_sbuf_coord(b, py);
        pw_sbuf_printf(b, "\" r=\"%.2f\"", r);
        break;
    case PW_MARK_SQUARE:
        r *= 0.9;
        pw_sbuf_puts(b, "<rect x=\"");
        pw_sbuf_coord(b, px - r);
        pw_sbuf_puts(b, "\" y=\"");
        pw_sbuf_coord(b, py - r);
        pw_sbuf_printf(b, "\" width=\"%.2f\" height=\"%.2f\"", 2 * r, 2 * r);
        break;
    case PW_MARK_TRIANGLE:
    case PW_MARK_TRIANGLE_DOWN: {
        double sgn = s->marker == PW_MARK_TRIANGLE ? 1.0 : -1.0;
        r *= 1.15;
        pw_sbuf_puts(b, "<path d=\"M");
        put_pt(b, px, py - sgn * r);
        pw_sbuf_puts(b, " L");
        put_pt(b, px + 0.866 * r, py + sgn * 0.5 * r);
        pw_sbuf_puts(b, " L");
        put_pt(b, px - 0.866 * r, py + sgn * 0.5 * r);
        pw_sbuf_puts(b, " Z\"");
        break;
    }
    case PW_MARK_DIAMOND:
        r *= 1.2;
        pw_sbuf_puts(b, "<path d=\"M");
        put_pt(b, px, py - r);
        pw_sbuf_puts(b, " L");
        put_pt(b, px + r, py);
        pw_sbuf_puts(b, " L");
        put_pt(b, px, py + r);
        pw_sbuf_puts(b, " L");
        put_pt(b, px - r, py);
        pw_sbuf_puts(b, " Z\"");
        break;
    case PW_MARK_CROSS:
    case PW_MARK_PLUS: {
        double a = s->marker == PW_MARK_CROSS ? r * 0.8 : 0.0, c = s->marker == PW_MARK_CROSS ? r * 0.8 : r;
        pw_sbuf_puts(b, "<path d=\"M");
        if (s->marker == PW_MARK_CROSS) {
            put_pt(b, px - a, py - c);
            pw_sbuf_puts(b, " L");
            put_pt(b, px + a, py + c);
            pw_sbuf_puts(b, " M");
            put_pt(b, px - a, py + c);
            pw_sbuf_puts(b, " L");
            put_pt(b, px + a, py - c);
        } else {
            put_pt(b, px - c, py);
            pw_sbuf_puts(b, " L");
            put_pt(b, px + c, py);
            pw_sbuf_puts(b, " M");
            put_pt(b, px, py - c);
            pw_sbuf_puts(b, " L");
            put_pt(b, px, py + c);
        }
        pw_sbuf_puts(b, "\"");
        fill = "none";
        sw = 2.0;
        break;
    }
    case PW_MARK_STAR: {
        pw_sbuf_puts(b, "<path d=\"");
        for (int k = 0; k < 10; k++) {
            double rr = k % 2 ? r * 0.45 : r * 1.25;
            double ang = -PI / 2.0 + k * PI / 5.0;
            pw_sbuf_puts(b, k ? " L" : "M");
            put_pt(b, px + rr * cos(ang), py + rr * sin(ang));
        }
        pw_sbuf_puts(b, " Z\"");
        break;
    }
    case PW_MARK_NONE:
        break;
    }
    return pw_sbuf_printf(b, " fill=\"%s\" stroke=\"%s\" stroke-width=\"%.1f\"/>\n", fill, col, sw);
}

pw_status pw_svg_markers(pw_sbuf *b, const pw_frame *f, const double *x, const double *y,
                         size_t n, const pw_style *s, const char *cls)
{
    pw_sbuf_printf(b, "<g class=\"%s\">\n", cls ? cls : "pw-markers");
    for (size_t i = 0; i < n; i++)
        if (isfinite(x[i]) && isfinite(y[i]))
            pw_svg_marker_px(b, pw_frame_px(f, x[i]), pw_frame_py(f, y[i]), s);
    return pw_sbuf_puts(b, "</g>\n");
}

pw_status pw_svg_annotate(pw_sbuf *b, const pw_frame *f, double x, double y, double dx, double dy,
                          const char *anchor, const char *text, const char *colour)
{
    if (!isfinite(x) || !isfinite(y))
        return pw_sbuf_status(b);
    double px = pw_frame_px(f, x), py = pw_frame_py(f, y);
    double tx = px + dx, ty = py + dy;
    /* keep the label inside the picture */
    double est = 7.4 * (double)strlen(text ? text : ""); /* 12 px bold: about 7.2 px a glyph */
    if (!anchor)
        anchor = dx < 0 ? "end" : "start";
    bool end = !strcmp(anchor, "end"), mid = !strcmp(anchor, "middle");
    double left = end ? tx - est : mid ? tx - est / 2.0 : tx, right = left + est;
    if (right > f->width - 4.0)
        tx -= right - (f->width - 4.0);
    else if (left < 4.0)
        tx += 4.0 - left;
    if (ty < f->mt + 12.0)
        ty = f->mt + 12.0;
    if (ty > f->height - f->mb - 4.0)
        ty = f->height - f->mb - 4.0;
    const char *col = colour ? colour : PW_INK;
    pw_sbuf_puts(b, "<g class=\"pw-annotation\">\n<line x1=\"");
    pw_sbuf_coord(b, px);
    pw_sbuf_puts(b, "\" y1=\"");
    pw_sbuf_coord(b, py);
    pw_sbuf_puts(b, "\" x2=\"");
    pw_sbuf_coord(b, tx);
    pw_sbuf_puts(b, "\" y2=\"");
    pw_sbuf_coord(b, ty - 4.0);
    pw_sbuf_printf(b, "\" stroke=\"%s\" stroke-width=\"1\"/>\n<circle cx=\"", col);
    pw_sbuf_coord(b, px);
    pw_sbuf_puts(b, "\" cy=\"");
    pw_sbuf_coord(b, py);
    pw_sbuf_printf(b, "\" r=\"6\" fill=\"none\" stroke=\"%s\" stroke-width=\"2\"/>\n", col);
    /* halo then text */
    pw_sbuf_puts(b, "<text x=\"");
    pw_sbuf_coord(b, tx);
    pw_sbuf_puts(b, "\" y=\"");
    pw_sbuf_coord(b, ty);
    pw_sbuf_printf(b, "\" text-anchor=\"%s\" font-size=\"12\" stroke=\"#ffffff\" stroke-width=\"4\" "
                      "stroke-linejoin=\"round\" fill=\"#ffffff\" aria-hidden=\"true\">",
                   anchor);
    pw_sbuf_escape(b, text);
    pw_sbuf_puts(b, "</text>\n");
    pw_svg_text_px(b, tx, ty, anchor, 12.0, true, col, text, "pw-annotation-text");
    return pw_sbuf_puts(b, "</g>\n");
}

/* ---- legend ---- */

void pw_legend_add(pw_legend *l, const char *label, const pw_style *s, bool line)
{
    if (l->n >= PW_LEGEND_MAX)
        return;
    pw_legend_entry *e = &l->e[l->n++];
    snprintf(e->label, sizeof e->label, "%s", label ? label : "");
    e->style = *s;
    e->line = line;
}

#define LEGEND_ROW 18.0

double pw_legend_below_height(size_t n)
{
    return n ? LEGEND_ROW * (double)n + 12.0 : 0.0;
}

void pw_frame_reserve_legend(pw_frame *f, size_t n)
{
    double h = pw_legend_below_height(n);
    f->height += h;
    f->mb += h;
}

static pw_status legend_below(pw_sbuf *b, const pw_frame *f, const pw_legend *l)
{
    double x0 = f->ml;
    double top = f->height - pw_legend_below_height(l->n) + 2.0;
    pw_sbuf_puts(b, "<g class=\"pw-legend pw-legend-below\">\n");
    for (size_t i = 0; i < l->n; i++) {
        const pw_legend_entry *e = &l->e[i];
        double lx = x0, cy = top + LEGEND_ROW * (double)i + 6.0;
        if (e->line) {
            pw_sbuf_puts(b, "<line x1=\"");
            pw_sbuf_coord(b, lx);
            pw_sbuf_puts(b, "\" y1=\"");
            pw_sbuf_coord(b, cy);
            pw_sbuf_puts(b, "\" x2=\"");
            pw_sbuf_coord(b, lx + 30.0);
            pw_sbuf_puts(b, "\" y2=\"");
            pw_sbuf_coord(b, cy);
            pw_sbuf_puts(b, "\"");
            style_attrs(b, &e->style, false);
            pw_sbuf_puts(b, "/>\n");
        }
        pw_svg_marker_px(b, lx + 15.0, cy, &e->style);
        pw_svg_text_px(b, lx + 38.0, cy + 4.0, "start", 11.5, false, PW_INK, e->label,
                       "pw-legend-label");
    }
    return pw_sbuf_puts(b, "</g>\n");
}

pw_status pw_svg_legend(pw_sbuf *b, const pw_frame *f, const pw_legend *l, pw_corner corner)
{
    if (l->n == 0)
        return pw_sbuf_status(b);
    if (corner == PW_LEGEND_BELOW)
        return legend_below(b, f, l);
    double row = 18.0, pad = 8.0, sample = 30.0;
    size_t longest = 0;
    for (size_t i = 0; i < l->n; i++) {
        size_t len = strlen(l->e[i].label);
        if (len > longest)
            longest = len;
    }
    double w = pad * 2 + sample + 8.0 + 6.3 * (double)longest;
    double h = pad * 2 + row * (double)l->n - 4.0;
    double x0 = f->ml, x1 = f->width - f->mr, y0 = f->mt, y1 = f->height - f->mb;
    double lx = (corner == PW_CORNER_TL || corner == PW_CORNER_BL) ? x0 + 10.0 : x1 - 10.0 - w;
    double ly = (corner == PW_CORNER_TL || corner == PW_CORNER_TR) ? y0 + 10.0 : y1 - 10.0 - h;
    pw_sbuf_puts(b, "<g class=\"pw-legend\">\n<rect x=\"");
    pw_sbuf_coord(b, lx);
    pw_sbuf_puts(b, "\" y=\"");
    pw_sbuf_coord(b, ly);
    pw_sbuf_printf(b, "\" width=\"%.1f\" height=\"%.1f\" rx=\"3\" fill=\"#ffffff\" fill-opacity=\"0.93\" "
                      "stroke=\"#b8bec7\" stroke-width=\"1\"/>\n",
                   w, h);
    for (size_t i = 0; i < l->n; i++) {
        const pw_legend_entry *e = &l->e[i];
        double cy = ly + pad + row * (double)i + 6.0;
        if (e->line) {
            pw_sbuf_puts(b, "<line x1=\"");
            pw_sbuf_coord(b, lx + pad);
            pw_sbuf_puts(b, "\" y1=\"");
            pw_sbuf_coord(b, cy);
            pw_sbuf_puts(b, "\" x2=\"");
            pw_sbuf_coord(b, lx + pad + sample);
            pw_sbuf_puts(b, "\" y2=\"");
            pw_sbuf_coord(b, cy);
            pw_sbuf_puts(b, "\"");
            style_attrs(b, &e->style, false);
            pw_sbuf_puts(b, "/>\n");
        }
        pw_svg_marker_px(b, lx + pad + sample / 2.0, cy, &e->style);
        pw_svg_text_px(b, lx + pad + sample + 8.0, cy + 4.0, "start", 11.5, false, PW_INK, e->label,
                       "pw-legend-label");
    }
    return pw_sbuf_puts(b, "</g>\n");
}
