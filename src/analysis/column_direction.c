/* Either split direction: the mirror x -> 1 - x around the column module; see
 * include/pinchwise/column_direction.h. */
#include <pinchwise/column_direction.h>

#include <stdio.h>
#include <string.h>

pw_column_direction pw_column_direction_of(const pw_column_spec *s)
{
    if (!s)
        return PW_DIRECTION_NONE;
    if (s->xb < s->zf && s->zf < s->xd)
        return PW_DIRECTION_OVERHEAD;
    if (s->xd < s->zf && s->zf < s->xb)
        return PW_DIRECTION_BOTTOMS;
    return PW_DIRECTION_NONE;
}

static pw_status mirror_y(void *ctx, double x, double *y)
{
    const pw_curve_mirror *m = ctx;
    double yi;
    pw_status st = m->inner.y_of_x(m->inner.ctx, 1.0 - x, &yi);
    if (st == PW_OK)
        *y = 1.0 - yi;
    return st;
}

/* The mirrored slope: d(1 - y(1 - x))/dx = y'(1 - x). */
static pw_status mirror_y_dy(void *ctx, double x, double *y, double *d)
{
    const pw_curve_mirror *m = ctx;
    double yi;
    pw_status st = m->inner_dy(m->inner.ctx, 1.0 - x, &yi, d);
    if (st == PW_OK)
        *y = 1.0 - yi;
    return st;
}

pw_curve pw_curve_mirror_bind(pw_curve_mirror *m, const pw_curve *curve)
{
    m->inner = *curve;
    m->inner_dy = NULL;
    return (pw_curve){mirror_y, m};
}

pw_column_spec pw_column_spec_mirror(const pw_column_spec *s)
{
    return (pw_column_spec){.xd = 1.0 - s->xd, .xb = 1.0 - s->xb, .zf = 1.0 - s->zf, .q = s->q};
}

/* The mirrored result in terms of component 1 again. */
static void map_back(pw_column_result *r)
{
    r->x_q = 1.0 - r->x_q;
    r->y_q = 1.0 - r->y_q;
    r->pinch.x = 1.0 - r->pinch.x;
    r->pinch.y = 1.0 - r->pinch.y;
    if (r->reason[0]) {
        /* the column module's words are about the component that goes overhead, here 2 */
        for (char *p = strstr(r->reason, "component 1"); p; p = strstr(p, "component 1"))
            p[10] = '2';
        char tmp[PW_REASON_MAX + 128];
        int n = snprintf(tmp, sizeof tmp,
                         "component 1 leaves with the bottoms, so x here is the mole fraction of "
                         "component 2: %s",
                         r->reason);
        size_t len = n < 0 ? 0 : (size_t)n;
        if (len >= sizeof r->reason)
            len = sizeof r->reason - 1;
        memcpy(r->reason, tmp, len);
        r->reason[len] = '\0';
    }
}

pw_status pw_column_solve_any(const pw_curve *curve, const pw_column_spec *spec,
                              const pw_column_options *opt, pw_column_result *out)
{
    return pw_column_solve_any_dy(curve, NULL, spec, opt, out);
}

pw_status pw_column_solve_any_dy(const pw_curve *curve, pw_curve_dy_fn dy,
                                 const pw_column_spec *spec, const pw_column_options *opt,
                                 pw_column_result *out)
{
    if (!curve || !spec || !out)
        return PW_EINVAL;
    switch (pw_column_direction_of(spec)) {
    case PW_DIRECTION_OVERHEAD:
        return pw_column_solve_dy(curve, dy, spec, opt, out);
    case PW_DIRECTION_BOTTOMS: {
        pw_curve_mirror m;
        pw_curve c = pw_curve_mirror_bind(&m, curve);
        m.inner_dy = dy;
        pw_column_spec s = pw_column_spec_mirror(spec);
        pw_status st = pw_column_solve_dy(&c, dy ? mirror_y_dy : NULL, &s, opt, out);
        map_back(out);
        return st;
    }
    case PW_DIRECTION_NONE:
    default:
        memset(out, 0, sizeof *out);
        snprintf(out->reason, sizeof out->reason,
                 "the feed zf = %g does not lie strictly between xb = %g and xd = %g", spec->zf,
                 spec->xb, spec->xd);
        return PW_EINVAL;
    }
}

pw_status pw_column_step_any(const pw_curve *curve, const pw_column_spec *spec, double R,
                             size_t max_stages, double *stages, int *feed_stage)
{
    if (!curve || !spec)
        return PW_EINVAL;
    if (pw_column_direction_of(spec) != PW_DIRECTION_BOTTOMS)
        return pw_column_step(curve, spec, R, max_stages, stages, feed_stage);
    pw_curve_mirror m;
    pw_curve c = pw_curve_mirror_bind(&m, curve);
    pw_column_spec s = pw_column_spec_mirror(spec);
    return pw_column_step(&c, &s, R, max_stages, stages, feed_stage);
}

pw_status pw_column_total_reflux_any(const pw_curve *curve, double xd, double xb, size_t max_stages,
                                     double *stages)
{
    if (!curve)
        return PW_EINVAL;
    if (!(xd < xb))
        return pw_column_total_reflux(curve, xd, xb, max_stages, stages);
    pw_curve_mirror m;
    pw_curve c = pw_curve_mirror_bind(&m, curve);
    return pw_column_total_reflux(&c, 1.0 - xd, 1.0 - xb, max_stages, stages);
}
