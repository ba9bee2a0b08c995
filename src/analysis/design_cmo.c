/* Constant-molal-overflow design rows with stage profiles: stage-by-stage stepping from the top
 * (McCabe & Thiele 1925) with the optimal feed stage, recording x, y, T and the flows of each
 * stage. The stepping rule is the column module's (column.h pw_column_step); this file adds the
 * profile. See docs/column.md. */
#include "analysis/design_internal.h"
#include <pinchwise/column_direction.h>

#include <math.h>
#include <string.h>

static bool spec_ok(const pw_column_spec *s)
{
    return s && isfinite(s->q) && s->xb >= 0.0 && s->xb < s->zf && s->zf < s->xd && s->xd <= 1.0;
}

/* Component 1 to the bottoms (xd < zf < xb): the column is stepped on the mirrored curve
 * x' = 1 - x, y' = 1 - y (pinchwise/column_direction.h) and each stage is mapped back. */
static bool mirrored(const pw_column_spec *s)
{
    return s && s->xd < s->zf && s->zf < s->xb;
}

static pw_column_spec unmirror_spec(const pw_column_spec *s, bool mirror)
{
    return mirror ? pw_column_spec_mirror(s) : *s;
}

/* x of the stage whose vapor is y, in the stepping's coordinates. */
static pw_status x_of_y(pw_eqp *e, bool mirror, double y, double *x, double *T_K)
{
    if (!mirror)
        return pw_eqp_x_of_y(e, y, x, T_K);
    double xr;
    pw_status st = pw_eqp_x_of_y(e, 1.0 - y, &xr, T_K);
    *x = 1.0 - xr;
    return st;
}

/* Fills the flows of a stepped profile: V above and on the feed stage, Vbar below; L above
 * the feed stage, Lbar from it down to the reboiler, B leaving the reboiler. */
static void cmo_flows(pw_profile *p, const pw_column_spec *s, double R)
{
    const double D = (s->zf - s->xb) / (s->xd - s->xb), B = 1.0 - D;
    const double L = R * D, V = (R + 1.0) * D, Lb = L + s->q, Vb = V - (1.0 - s->q);
    for (size_t i = 0; i < p->n; i++) {
        int n = (int)i + 1;
        p->stage[i].V = n <= p->feed_stage ? V : Vb;
        p->stage[i].L = i + 1 == p->n ? B : n < p->feed_stage ? L : Lb;
    }
}

static pw_status step(pw_eqp *e, bool mirror, const pw_column_spec *s, double R,
                      size_t max_stages, pw_profile *out)
{
    const double xd = s->xd, xb = s->xb;
    const double D = (s->zf - xb) / (xd - xb), B = 1.0 - D;
    const double S = ((R + 1.0) * D - (1.0 - s->q)) / B;
    if (!(R >= 0.0) || !isfinite(R) || !(S > 0.0))
        return PW_EINVAL;
    const double m = R / (R + 1.0), sl = (S + 1.0) / S;
    const double xi = ((1.0 - m) * xd + (sl - 1.0) * xb) / (sl - m); /* lines cross: feed */
    double x_prev = xd, y = xd;
    int feed = 0;
    for (size_t n = 1; n <= max_stages; n++) {
        pw_stage st = {0};
        pw_status rc = x_of_y(e, mirror, y, &st.x, &st.T_K);
        if (rc != PW_OK)
            return rc;
        st.y = y;
        pw_stage rec = st; /* recorded as fractions of component 1 */
        if (mirror) {
            rec.x = 1.0 - st.x;
            rec.y = 1.0 - st.y;
        }
        rc = pw_profile_push(out, &rec);
        if (rc != PW_OK)
            return rc;
        if (st.x <= xb) {
            out->stages = (double)(n - 1) + (x_prev - xb) / (x_prev - st.x);
            out->feed_stage = feed ? feed : (int)n;
            cmo_flows(out, s, R);
            return PW_OK;
        }
        if (!(st.x < x_prev))
            return PW_EINFEASIBLE; /* the operating line lies on or above the curve here */
        if (!feed && st.x < xi)
            feed = (int)n;
        y = feed ? sl * st.x - (sl - 1.0) * xb : m * st.x + (1.0 - m) * xd;
        x_prev = st.x;
    }
    return PW_EMAXITER;
}

pw_status pw_cmo_profile(const pw_system *sys, double P_Pa, const pw_column_spec *spec, double R,
                         size_t max_stages, pw_profile *out)
{
    if (!out)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    const bool mirror = mirrored(spec);
    const pw_column_spec s = unmirror_spec(spec, mirror);
    if (!spec_ok(&s) || max_stages == 0)
        return PW_EINVAL;
    pw_eqp e;
    pw_status st = pw_eqp_init(&e, sys, P_Pa);
    if (st == PW_OK)
        st = step(&e, mirror, &s, R, max_stages, out);
    pw_eqp_free(&e);
    return st;
}

pw_status pw_design_cmo(const pw_system *sys, double P_Pa, const pw_column_spec *spec, double r_min,
                        double n_min, const pw_column_options *opt, pw_design_table *out)
{
    if (!out)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->balance = PW_BALANCE_CMO;
    const pw_column_options o = opt ? *opt : pw_column_default_options();
    const pw_column_spec s = unmirror_spec(spec, mirrored(spec));
    if (!spec_ok(&s) || !(r_min > 0.0) || !isfinite(r_min) ||
        o.n_factors > PW_COLUMN_MAX_FACTORS || o.max_stages == 0)
        return PW_EINVAL;
    for (size_t i = 0; i < o.n_factors; i++) {
        pw_design_case *c = &out->row[i];
        c->factor = o.factors[i];
        c->R = o.factors[i] * r_min;
        const double D = (spec->zf - spec->xb) / (spec->xd - spec->xb);
        c->boilup = ((c->R + 1.0) * D - (1.0 - spec->q)) / (1.0 - D);
        c->Q_C = c->Q_R = NAN;
        if (pw_gilliland_molokanov(n_min, c->R, r_min, &c->gilliland_stages) != PW_OK)
            c->gilliland_stages = NAN; /* no N_min: no correlation estimate */
        pw_status st = pw_cmo_profile(sys, P_Pa, spec, c->R, o.max_stages, &c->profile);
        out->n = i + 1;
        if (st == PW_EINFEASIBLE || st == PW_EMAXITER || st == PW_EINVAL) {
            pw_profile_free(&c->profile);
            c->reachable = false;
            c->why = st;
            c->stages = NAN;
            c->feed_stage = 0;
            continue;
        }
        if (st != PW_OK) {
            pw_design_table_free(out);
            return st;
        }
        c->reachable = true;
        c->why = PW_OK;
        c->stages = c->profile.stages;
        c->feed_stage = c->profile.feed_stage;
    }
    return PW_OK;
}
