/* Private: a small SVG writer for the report's plots.
 *
 * Output goes into a growing string buffer (pw_sbuf); every append checks its allocation and
 * a failed append latches the buffer into a failed state, so a caller may append many pieces
 * and check once (pw_sbuf_status). Coordinates: data units on the axes, pixels in the SVG
 * (origin top left). Nothing here ever writes NaN or Inf: non-finite points are skipped
 * (markers) or break the line (polylines). Text is XML-escaped.
 *
 * Styles use a palette of our own that stays legible for colour-blind readers and in greyscale:
 * neighbouring entries differ in lightness, dash pattern and marker shape, not hue alone. */
#ifndef PW_REPORT_SVG_H
#define PW_REPORT_SVG_H

#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

/* ---- growing string buffer ---- */

typedef struct pw_sbuf {
    char *data;   /* NUL-terminated when len > 0 or after the first append; owned */
    size_t len, cap;
    bool failed;  /* an allocation failed; later appends are ignored */
} pw_sbuf;

void pw_sbuf_init(pw_sbuf *b);
/* Frees the text; b is left empty and reusable. Accepts NULL. */
void pw_sbuf_free(pw_sbuf *b);
/* PW_ENOMEM once any append has failed, else PW_OK. */
pw_status pw_sbuf_status(const pw_sbuf *b);
/* The text so far ("" when empty); owned by b. */
const char *pw_sbuf_str(const pw_sbuf *b);
pw_status pw_sbuf_putn(pw_sbuf *b, const char *s, size_t n);
pw_status pw_sbuf_puts(pw_sbuf *b, const char *s);
pw_status pw_sbuf_printf(pw_sbuf *b, const char *fmt, ...) __attribute__((format(printf, 2, 3)));
/* Appends s with & < > " ' replaced by entities and control characters other than tab and
 * newline dropped (they are not allowed in XML). NULL appends nothing. */
pw_status pw_sbuf_escape(pw_sbuf *b, const char *s);
/* Appends a number as a pixel coordinate (two decimals, no "-0"); a non-finite value appends
 * "0" and marks nothing: callers must not pass one (the drawing functions never do). */
pw_status pw_sbuf_coord(pw_sbuf *b, double v);

/* ---- axis ticks ---- */

#define PW_SVG_MAX_TICKS 24

typedef struct pw_ticks {
    double step;               /* 1, 2 or 5 times a power of ten */
    double v[PW_SVG_MAX_TICKS];
    size_t n;
    int decimals;              /* digits after the point that show the step exactly */
} pw_ticks;

/* "Nice" ticks covering [lo, hi] with about target intervals (1-2-5 steps): every multiple of
 * step inside [lo, hi] (with a tolerance of 1e-9 step at the ends). PW_EINVAL when lo, hi are not
 * finite, hi <= lo, or target is 0. */
pw_status pw_svg_ticks(double lo, double hi, size_t target, pw_ticks *t);

/* Widens [*lo, *hi] outward to multiples of the nice step for about target intervals; a zero-
 * width range is opened around its value first. Non-finite input gives [0, 1]. */
void pw_svg_nice_range(double *lo, double *hi, size_t target);

/* Formats a tick value with the given decimals into buf ("-0" shown as "0", U+2212 minus). */
const char *pw_svg_format_tick(double v, int decimals, char *buf, size_t len);

/* ---- styles ---- */

typedef enum {
    PW_MARK_NONE = 0,
    PW_MARK_CIRCLE,
    PW_MARK_SQUARE,
    PW_MARK_TRIANGLE,
    PW_MARK_DIAMOND,
    PW_MARK_TRIANGLE_DOWN,
    PW_MARK_CROSS,
    PW_MARK_PLUS,
    PW_MARK_STAR
} pw_marker;

typedef struct pw_style {
    const char *stroke;   /* colour, e.g. "#1b2f4b"; NULL = none */
    double width;         /* stroke width in px */
    const char *dash;     /* SVG dasharray ("6 3"), NULL = solid */
    pw_marker marker;
    bool filled;          /* markers filled with the stroke colour, else white inside */
    double size;          /* marker size in px (about its diameter) */
    double opacity;       /* stroke opacity; 0 means 1 */
} pw_style;

/* The palette: PW_PALETTE_N colours ordered so that consecutive ones differ strongly in
 * lightness (see docs/report.md). */
#define PW_PALETTE_N 6
extern const char *const pw_palette[PW_PALETTE_N];
#define PW_INK "#1e2430"     /* axis and text colour */
#define PW_GRID "#e3e6ea"    /* grid lines */

/* Series style k of a plot: colour, dash and marker all change with k. */
pw_style pw_style_series(size_t k);

/* ---- plot frame ---- */

#define PW_SVG_ID_MAX 40
#define PW_SVG_LABEL_MAX 160

typedef struct pw_frame {
    char id[PW_SVG_ID_MAX];        /* unique within one HTML page; [a-z0-9-] */
    double width, height;          /* whole picture, px */
    double ml, mr, mt, mb;         /* margins, px */
    double x_lo, x_hi, y_lo, y_hi; /* data range shown */
    pw_ticks xt, yt;
} pw_frame;

/* Sets up a frame of width x height px showing [x_lo,x_hi] x [y_lo,y_hi] with ticks for about
 * nx and ny intervals. id must be non-empty and only [A-Za-z0-9_-]. PW_EINVAL for bad ranges
 * (non-finite, empty) or a bad id, sizes too small for the margins. */
pw_status pw_frame_init(pw_frame *f, const char *id, double width, double height, double x_lo,
                        double x_hi, double y_lo, double y_hi, size_t nx, size_t ny);

/* Data -> pixel. Linear; values outside the range map outside the plot area. */
double pw_frame_px(const pw_frame *f, double x);
double pw_frame_py(const pw_frame *f, double y);

/* Opens the <svg> element (with title for screen readers) and draws the background, grid,
 * ticks, tick labels and the axis labels (which should carry their units, e.g. "T / K").
 * Then opens the group where series go (lines are clipped to the plot area, markers not). */
pw_status pw_svg_begin(pw_sbuf *b, const pw_frame *f, const char *title, const char *xlabel,
                       const char *ylabel);
/* Closes the series group (call once, after the series and before legend/annotations). */
pw_status pw_svg_end_data(pw_sbuf *b);
/* Draws the frame border and closes </svg>. */
pw_status pw_svg_end(pw_sbuf *b, const pw_frame *f);

/* Polyline through (x[i], y[i]) in data units; a non-finite point breaks the line, runs of
 * one point are dropped. cls (may be NULL) is written as the path's class attribute. Appends
 * nothing when no segment remains. */
pw_status pw_svg_polyline(pw_sbuf *b, const pw_frame *f, const double *x, const double *y,
                          size_t n, const pw_style *s, const char *cls);
/* Straight segment between two data points (skipped if either is not finite). */
pw_status pw_svg_segment(pw_sbuf *b, const pw_frame *f, double x0, double y0, double x1,
                         double y1, const pw_style *s, const char *cls);
/* A marker of style s at every finite (x[i], y[i]). */
pw_status pw_svg_markers(pw_sbuf *b, const pw_frame *f, const double *x, const double *y,
                         size_t n, const pw_style *s, const char *cls);
/* One marker at pixel position (px, py). */
pw_status pw_svg_marker_px(pw_sbuf *b, double px, double py, const pw_style *s);

/* Text at a pixel position. anchor: "start", "middle" or "end". size in px; bold if weight. */
pw_status pw_svg_text_px(pw_sbuf *b, double px, double py, const char *anchor, double size,
                         bool bold, const char *fill, const char *text, const char *cls);

/* An annotation: a ring at data point (x, y), a leader line and the label placed dx, dy px
 * away (on a white halo so it stays readable over curves). anchor "start"/"end"/"middle", or
 * NULL to choose by the sign of dx. Skipped for a non-finite point. */
pw_status pw_svg_annotate(pw_sbuf *b, const pw_frame *f, double x, double y, double dx, double dy,
                          const char *anchor, const char *text, const char *colour);

/* ---- legend ---- */

#define PW_LEGEND_MAX 12

typedef struct pw_legend_entry {
    char label[PW_SVG_LABEL_MAX];
    pw_style style;
    bool line;    /* draw a line sample */
} pw_legend_entry;

typedef struct pw_legend {
    pw_legend_entry e[PW_LEGEND_MAX];
    size_t n;
} pw_legend;

/* Adds an entry (ignored once full). */
void pw_legend_add(pw_legend *l, const char *label, const pw_style *s, bool line);

typedef enum { PW_CORNER_TL, PW_CORNER_TR, PW_CORNER_BL, PW_CORNER_BR, PW_LEGEND_BELOW } pw_corner;

/* Extra height (px) that pw_frame_reserve_legend adds for a legend of n entries below the plot. */
double pw_legend_below_height(size_t n);
/* Grows the picture and its bottom margin so a PW_LEGEND_BELOW legend of n entries fits. */
void pw_frame_reserve_legend(pw_frame *f, size_t n);

/* Draws the legend as a boxed list inside the plot area at the given corner, or (BELOW) in one
 * column under the axis label, in the room made by pw_frame_reserve_legend. */
pw_status pw_svg_legend(pw_sbuf *b, const pw_frame *f, const pw_legend *l, pw_corner corner);

#endif
