/* Private to the analysis floor: the corners of a stage staircase, recorded by the column
 * module's own stepping (column_step.c, decanter.c) for the drawing module (drawing_*.c), so the
 * staircase drawn is the one counted. Not installed. */
#ifndef PW_ANALYSIS_STAIRCASE_INTERNAL_H
#define PW_ANALYSIS_STAIRCASE_INTERNAL_H

#include "analysis/column_internal.h"

#include <pinchwise/decanter.h>
#include <stdbool.h>
#include <stddef.h>

/* Corners (x[i], y[i]) of a staircase, in the order stepped; the caller owns the arrays. When
 * cap is reached further corners are dropped and truncated is set (the count is unaffected). */
typedef struct pw_stair_trace {
    double *x, *y;
    size_t cap, n;
    bool truncated;
} pw_stair_trace;

static inline void pw_stair_trace_add(pw_stair_trace *t, double x, double y)
{
    if (!t)
        return;
    if (t->n >= t->cap) {
        t->truncated = true;
        return;
    }
    t->x[t->n] = x;
    t->y[t->n] = y;
    t->n++;
}

/* pw_column_step_ws that also records the corners: (xd, xd), then for each stage the liquid it
 * leaves on the same vapor (x_n, y_{n-1}) and the vapor from below on the operating line
 * (x_n, y_n); the last corner is the last stage's liquid, at or beyond xb. trace may be NULL. */
pw_status pw_column_step_trace_ws(pw_column_ws *w, const pw_column_spec *s, bool total, double R,
                                  size_t max_stages, double *stages, int *feed_stage,
                                  pw_stair_trace *trace);

/* pw_stripper_stages that also records the corners: (x_top, y on the operating line), then per
 * stage (x_n, y_{n-1}) and (x_n, y_n) on the operating line; trace may be NULL. */
pw_status pw_stripper_stages_trace(const pw_curve *curve, const pw_stripper_spec *spec, double S,
                                   size_t max_stages, double *stages, pw_stair_trace *trace);

#endif
