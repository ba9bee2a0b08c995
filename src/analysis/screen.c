/* Feasibility screen of a binary split: relative volatility along the column, azeotrope
 * barrier, azeotrope shift with pressure, rough R_min and stage counts.
 * See include/pinchwise/screen.h and docs/screen.md. */
#include <pinchwise/units.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>
#include <pinchwise/screen.h>

#include <math.h>
#include <pinchwise/lle.h>
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

pw_screen_options pw_screen_default_options(void)
{
    pw_screen_options o;
    o.alpha_difficult = 1.1; /* common practice */
    o.shift_low = 0.05;      /* METHODS 5.4 rule of thumb (common practice) */
    o.shift_high = 0.10;
    o.P_lo_Pa = 20e3;
    o.P_hi_Pa = 500e3;
    o.scan_points = 9;
    o.grid = 400;
    o.az = pw_azeotrope_default_options();
    o.column = pw_column_default_options();
    o.q = 1.0;
    return o;
}

const char *pw_verdict_name(pw_verdict v)
{
    switch (v) {
    case PW_VERDICT_FEASIBLE:
        return "feasible";
    case PW_VERDICT_DIFFICULT:
        return "difficult";
    default:
        return "infeasible";
    }
}

const char *pw_screen_reason_key(pw_screen_reason_code c)
{
    static const char *const keys[] = {"azeotrope-barrier", "beyond-azeotrope", "low-volatility",
                                       "near-pinch",        "pressure-swing",   "shift-small",
                                       "azeotrope-vanishes", "tangent-pinch",   "volatility-ok",
                                       "two-liquids-unmodelled"};
    return (size_t)c < sizeof keys / sizeof keys[0] ? keys[c] : "unknown";
}

static void reason(pw_screen_result *r, pw_screen_reason_code code, const char *fmt, ...)
    __attribute__((format(printf, 3, 4)));
static void reason(pw_screen_result *r, pw_screen_reason_code code, const char *fmt, ...)
{
    if (r->n_reasons >= PW_SCREEN_MAX_REASONS)
        return;
    pw_screen_reason *q = &r->reasons[r->n_reasons++];
    q->code = code;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(q->text, sizeof q->text, fmt, ap);
    va_end(ap);
}

static void note_T(pw_screen_result *r, double lo, double hi)
{
    if (isfinite(lo) && (isnan(r->T_lo_K) || lo < r->T_lo_K))
        r->T_lo_K = lo;
    if (isfinite(hi) && (isnan(r->T_hi_K) || hi > r->T_hi_K))
        r->T_hi_K = hi;
}

static pw_status check(const pw_screen_options *o, double P, double xd, double xb, double zf)
{
    double lo = fmin(xb, xd), hi = fmax(xb, xd);
    if (!(lo > 0.0 && lo < hi && hi < 1.0) || !(zf > lo && zf < hi) || !(P > 0.0) || !isfinite(P))
        return PW_EINVAL;
    if (!isfinite(o->q))
        return PW_EINVAL;
    if (!(o->alpha_difficult > 1.0) || !(o->shift_low > 0.0) || !(o->shift_high >= o->shift_low))
        return PW_EINVAL;
    if (!(o->P_lo_Pa > 0.0) || !(o->P_hi_Pa > o->P_lo_Pa) || o->scan_points < 2 || o->grid < 10)
        return PW_EINVAL;
    return PW_OK;
}

/* The overhead component's relative volatility (alpha12, or alpha21 = 1/alpha12 when component 1
 * leaves with the bottoms) from xb to xd on o->grid points. */
/* The relative volatility on n points from xb to xd, leaving out the points strictly inside
 * the three-phase layers tp (when it exists): a liquid there boils as two layers, and its
 * one-liquid volatility means nothing (a strongly non-ideal model may have no one-liquid bubble
 * point there at all). */
static pw_status alpha_profile(const pw_system *s, const pw_three_phase *tp, pw_screen_result *r,
                               size_t n)
{
    r->alpha_min = INFINITY;
    r->x_alpha_min = r->alpha_bottom = r->alpha_top = NAN;
    r->alpha_points_in_layers = 0;
    for (size_t i = 0; i < n; i++) {
        double x = r->xb + (r->xd - r->xb) * (double)i / (double)(n - 1), f;
        if (tp->exists && x > tp->x[0] && x < tp->x[1]) {
            r->alpha_points_in_layers++;
            continue;
        }
        pw_eq_point eq;
        pw_status st = pw_azeotrope_ln_alpha(s, PW_AZ_ISOBARIC, r->P_Pa, x, &f, &eq);
        if (st != PW_OK)
            return st;
        note_T(r, eq.T_K, eq.T_K);
        double a = exp(r->xd < r->xb ? -f : f);
        if (a < r->alpha_min) {
            r->alpha_min = a;
            r->x_alpha_min = x;
        }
        if (i == 0)
            r->alpha_bottom = a;
        if (i + 1 == n)
            r->alpha_top = a;
    }
    if (isinf(r->alpha_min)) /* every point inside the layers */
        r->alpha_min = NAN;
    r->alpha_mean = sqrt(r->alpha_top * r->alpha_bottom); /* NAN when either end is */
    return PW_OK;
}

/* x1 of the azeotrope of res nearest to x_ref, NAN when res has none. */
static double nearest(const pw_az_result *res, double x_ref)
{
    double best = NAN;
    for (size_t i = 0; i < res->n; i++)
        if (isnan(best) || fabs(res->az[i].x1 - x_ref) < fabs(best - x_ref))
            best = res->az[i].x1;
    return best;
}

static void pressure_scan(const pw_system *s, const pw_screen_options *o, pw_screen_result *r,
                          double x_ref)
{
    pw_az_scan *sc = pw_az_scan_alloc(o->scan_points);
    if (!sc)
        return;
    if (pw_azeotrope_scan(s, PW_AZ_ISOBARIC, o->P_lo_Pa, o->P_hi_Pa, &o->az, sc) == PW_OK) {
        r->scanned = true;
        r->x_az_lo = nearest(&sc->points[0], x_ref);
        r->x_az_hi = nearest(&sc->points[sc->n_points - 1], x_ref);
        if (isfinite(r->x_az_lo) && isfinite(r->x_az_hi))
            r->shift = fabs(r->x_az_hi - r->x_az_lo);
        else
            r->shift = sc->x1_shift;
        if (sc->n_boundaries > 0) {
            r->vanishes = true;
            r->P_vanish_Pa = sc->boundaries[0].at;
        }
        for (size_t k = 0; k < sc->n_points; k++)
            note_T(r, sc->points[k].T_lo_K, sc->points[k].T_hi_K);
    }
    pw_az_scan_free(sc);
}

static void swing_reasons(const pw_screen_options *o, pw_screen_result *r)
{
    if (!r->scanned)
        return;
    double lo = r->P_lo_Pa, hi = r->P_hi_Pa;
    if (r->vanishes)
        reason(r, PW_REASON_VANISHES,
               "the azeotrope reaches a pure end at about " PW_TEXT_P(".4g") " within "
               PW_TEXT_P(".4g") " to " PW_TEXT_P(".4g") ": a column pressure beyond that point "
               "avoids it",
               r->P_vanish_Pa, lo, hi);
    if (isfinite(r->shift) && r->shift >= o->shift_low)
        reason(r, PW_REASON_SWING,
               "the azeotrope moves by %.3f in x1 between " PW_TEXT_P(".4g") " and "
               PW_TEXT_P(".4g") ": pressure swing is "
               "worth a look (%.2f-%.2f in mole fraction, rule of thumb, common "
               "practice)%s",
               r->shift, lo, hi, o->shift_low, o->shift_high,
               r->shift >= o->shift_high ? "; above the upper end" : "");
    else if (isfinite(r->shift))
        reason(r, PW_REASON_SWING_SMALL,
               "the azeotrope moves only %.3f in x1 between " PW_TEXT_P(".4g") " and "
               PW_TEXT_P(".4g") ": below %.2f, "
               "pressure swing is unlikely to pay (rule of thumb, common practice; docs/screen.md); "
               "consider an entrainer",
               r->shift, lo, hi, o->shift_low);
}

static pw_status rough_column(const pw_system *s, const pw_screen_options *o, pw_screen_result *r)
{
    pw_column_spec spec = {r->xd, r->xb, r->zf, o->q};
    /* refused inside the two-liquid region, as every single column is */
    pw_status st = pw_column_solve_system(s, r->P_Pa, &spec, &o->column, &r->column, NULL, NULL);
    if (st != PW_OK)
        return st;
    r->column_ran = true;
    if (r->alpha_mean > 1.0) {
        /* in fractions of the component that goes overhead */
        pw_column_spec u = r->xd < r->xb ? pw_column_spec_mirror(&spec) : spec;
        double rm;
        if (pw_underwood_rmin(r->alpha_mean, u.zf, u.xd, o->q, &rm) == PW_OK)
            r->r_min_underwood = rm;
        if (pw_fenske_nmin(r->alpha_mean, u.xd, u.xb, &r->n_fenske) != PW_OK)
            r->n_fenske = NAN; /* compositions outside Fenske's range */
    }
    return PW_OK;
}

static void init_result(pw_screen_result *r, double P, double xd, double xb, double zf,
                        const pw_screen_options *o)
{
    memset(r, 0, sizeof *r);
    r->P_Pa = P;
    r->xd = xd;
    r->xb = xb;
    r->zf = zf;
    r->x_barrier = r->x_az_lo = r->x_az_hi = r->shift = r->P_vanish_Pa = NAN;
    r->r_min_underwood = r->n_fenske = NAN;
    r->T_lo_K = r->T_hi_K = NAN;
    r->P_lo_Pa = o->P_lo_Pa;
    r->P_hi_Pa = o->P_hi_Pa;
}

pw_status pw_screen_run(const pw_system *s, double P_Pa, double xd, double xb, double zf,
                        const pw_screen_options *opt, pw_screen_result *out)
{
    if (!s || !out)
        return PW_EINVAL;
    const pw_screen_options o = opt ? *opt : pw_screen_default_options();
    bool zf_default = isnan(zf);
    if (zf_default)
        zf = (fmin(xb, xd) < 0.5 && fmax(xb, xd) > 0.5) ? 0.5 : 0.5 * (xb + xd);
    pw_status st = check(&o, P_Pa, xd, xb, zf);
    if (st != PW_OK)
        return st;
    init_result(out, P_Pa, xd, xb, zf, &o);
    out->zf_default = zf_default;
    /* partly miscible liquids: the search leaves out the three-phase layers and drops the
     * crossings inside the two-liquid region, which are no azeotropes (pw_azeotrope_search) */
    pw_three_phase het; /* exists false for a model that cannot split */
    st = pw_azeotrope_search_opt(s, PW_AZ_ISOBARIC, P_Pa, &o.az, &out->az, &het, NULL, NULL);
    if (st == PW_OK)
        st = alpha_profile(s, &het, out, o.grid);
    if (st != PW_OK)
        return st;
    note_T(out, out->az.T_lo_K, out->az.T_hi_K);

    const double lo = fmin(xb, xd), hi = fmax(xb, xd);
    const bool down = xd < xb; /* component 1 leaves with the bottoms */
    const char *an = down ? "alpha21" : "alpha12";
    /* a heterogeneous azeotrope between the targets calls for the decanter scheme */
    if (het.exists && het.heterogeneous_azeotrope && het.y1 > lo && het.y1 < hi) {
        out->barrier = true;
        out->x_barrier = het.y1;
        reason(out, PW_REASON_BARRIER,
               "heterogeneous azeotrope at x1 = %.4f (T = " PW_TEXT_T(".2f")
               ", liquid layers %.4f and %.4f) "
               "lies between xb and xd: use the decanter scheme (pinchwise decanter)",
               het.y1, het.T_K, het.x[0], het.x[1]);
    }
    out->het = het;
    /* a model that cannot split, on data that show two liquids between the targets: its
     * one-liquid azeotropes and volatilities there decide nothing (the single column refuses) */
    char why[PW_REASON_MAX];
    st = pw_column_measured_split_block(s, xb, xd, &out->measured_split, why, sizeof why);
    if (st != PW_OK)
        return st;
    if (out->measured_split)
        reason(out, PW_REASON_TWO_LIQUIDS, "%s", why);
    for (size_t i = 0; !out->barrier && !out->measured_split && i < out->az.n; i++)
        if (out->az.az[i].x1 > lo && out->az.az[i].x1 < hi) {
            out->barrier = true;
            out->x_barrier = out->az.az[i].x1;
            reason(out, PW_REASON_BARRIER,
                   "%s azeotrope at x1 = %.4f (T = " PW_TEXT_T(".2f")
                   ") lies between xb = %.4g and xd = %.4g: "
                   "simple distillation cannot cross it",
                   pw_az_kind_name(out->az.az[i].kind), out->az.az[i].x1, out->az.az[i].T_K, xb,
                   xd);
            break;
        }
    bool beyond = !out->barrier && !out->measured_split && out->alpha_min <= 1.0;
    if (beyond)
        reason(out, PW_REASON_BEYOND,
               "%s = %.4f <= 1 at x1 = %.4f: component %d, which should go overhead, is not the "
               "lighter one over that part of the range between xb and xd, so the target lies "
               "beyond an azeotrope (or past the pure end)",
               an, out->alpha_min, out->x_alpha_min, down ? 2 : 1);
    bool infeasible = out->barrier || beyond || out->measured_split;
    bool touch = false;
    for (size_t i = 0; i < out->az.n_touch; i++)
        if (out->az.touch[i].x1 > lo && out->az.touch[i].x1 < hi) {
            touch = true;
            reason(out, PW_REASON_NEAR_PINCH,
                   "%s comes within %.2g of 1 at x1 = %.4f without crossing: a near-azeotrope "
                   "(tangential pinch) that needs very many stages",
                   an, fabs(expm1(out->az.touch[i].ln_alpha)), out->az.touch[i].x1);
        }
    bool low = !infeasible && out->alpha_min < o.alpha_difficult;
    if (low)
        reason(out, PW_REASON_LOW_ALPHA,
               "lowest %s = %.4f at x1 = %.4f is below %.2f (threshold: common practice)", an,
               out->alpha_min, out->x_alpha_min, o.alpha_difficult);
    else if (!infeasible)
        reason(out, PW_REASON_EASY,
               "lowest %s = %.4f at x1 = %.4f is at or above %.2f (threshold: common practice)",
               an, out->alpha_min, out->x_alpha_min, o.alpha_difficult);

    if (out->az.n > 0) {
        pressure_scan(s, &o, out, out->barrier ? out->x_barrier : out->az.az[0].x1);
        swing_reasons(&o, out);
    }
    if (!infeasible) {
        st = rough_column(s, &o, out);
        if (st != PW_OK)
            return st;
        if (!out->column.feasible) {
            infeasible = true;
            reason(out, PW_REASON_BEYOND, "column check: %s", out->column.reason);
        } else if (out->column.pinch.kind == PW_PINCH_TANGENT) {
            reason(out, PW_REASON_TANGENT_PINCH,
                   "R_min is set by a tangent pinch at x1 = %.4f, not at the feed: stage counts "
                   "near R_min are very sensitive to the model",
                   out->column.pinch.x);
        }
    }
    out->verdict = infeasible           ? PW_VERDICT_INFEASIBLE
                   : (low || touch)     ? PW_VERDICT_DIFFICULT
                                        : PW_VERDICT_FEASIBLE;
    return PW_OK;
}
