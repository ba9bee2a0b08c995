/* Stripping columns fed on top, the decanter scheme for heterogeneous binaries, and the single
 * column's refusal to cross a heterogeneous azeotrope. See include/pinchwise/decanter.h and
 * docs/heterogeneous.md. */
#include "analysis/staircase_internal.h"

#include <pinchwise/units.h>
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>
#include <pinchwise/enthalpy.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static pw_status curve_y(const pw_curve *c, double x, double *y)
{
    if (!(x >= 0.0 && x <= 1.0))
        return PW_EDOM;
    pw_status st = c->y_of_x(c->ctx, x, y);
    if (st == PW_OK && !isfinite(*y))
        return PW_EDOM;
    return st;
}

typedef struct inv_ctx {
    const pw_curve *curve;
    double y;
    pw_status st;
} inv_ctx;

static double inv_fn(double x, void *p)
{
    inv_ctx *c = p;
    double y;
    pw_status st = curve_y(c->curve, x, &y);
    if (st != PW_OK) {
        if (c->st == PW_OK)
            c->st = st;
        return GSL_NAN;
    }
    return y - c->y;
}

/* x*(y) on the branch from x_from (the current stage's liquid, on the top's side of the answer)
 * towards the pure end beyond x_bottom: the first sign change of y*(x) - y met walking from x_from
 * in cells of width |end - x_top|/400, refined by Brent. Below x_from the answer cannot lie: the
 * curve rises with x where one liquid is stable (a binary at fixed pressure). */
static pw_status x_of_y(const pw_curve *curve, const pw_stripper_spec *sp, double y, double x_from,
                        double *x)
{
    double end = sp->x_bottom > sp->x_top ? 1.0 : 0.0;
    double h = (end - sp->x_top) / 400.0;
    int cells = (int)ceil((end - x_from) / h);
    if (cells < 1)
        cells = 1;
    inv_ctx c = {curve, y, PW_OK};
    double xa = x_from, fa = inv_fn(xa, &c);
    if (c.st != PW_OK)
        return c.st;
    if (fa == 0.0) {
        *x = xa;
        return PW_OK;
    }
    for (int k = 1; k <= cells; k++) {
        double xb = k == cells ? end : x_from + h * k;
        double fb = inv_fn(xb, &c);
        if (c.st != PW_OK)
            return c.st;
        if ((fa < 0.0) != (fb < 0.0) || fb == 0.0) {
            if (fb == 0.0) {
                *x = xb;
                return PW_OK;
            }
            gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
            if (!s)
                return PW_ENOMEM;
            gsl_function F = {inv_fn, &c};
            double lo = fmin(xa, xb), hi = fmax(xa, xb);
            gsl_root_fsolver_set(s, &F, lo, hi);
            pw_status st = PW_EMAXITER;
            for (int it = 0; it < 200; it++) {
                if (gsl_root_fsolver_iterate(s) != GSL_SUCCESS || c.st != PW_OK) {
                    st = c.st != PW_OK ? c.st : PW_ENOCONV;
                    break;
                }
                if (gsl_root_test_interval(gsl_root_fsolver_x_lower(s), gsl_root_fsolver_x_upper(s),
                                           1e-15, 1e-13) == GSL_SUCCESS) {
                    st = PW_OK;
                    break;
                }
            }
            *x = gsl_root_fsolver_root(s);
            gsl_root_fsolver_free(s);
            return st;
        }
        xa = xb;
        fa = fb;
    }
    return PW_ENOBRACKET;
}

pw_status pw_stripper_stages(const pw_curve *curve, const pw_stripper_spec *sp, double S,
                             size_t max_stages, double *stages)
{
    return pw_stripper_stages_trace(curve, sp, S, max_stages, stages, NULL);
}

pw_status pw_stripper_stages_trace(const pw_curve *curve, const pw_stripper_spec *sp, double S,
                                   size_t max_stages, double *stages, pw_stair_trace *trace)
{
    if (!curve || !sp || !stages || !(S > 0.0) || max_stages == 0)
        return PW_EINVAL;
    double dir = sp->x_bottom > sp->x_top ? 1.0 : -1.0;
    double x = sp->x_top;
    for (size_t n = 0; n < max_stages; n++) {
        double y = isinf(S) ? x : x + (x - sp->x_bottom) / S;
        pw_stair_trace_add(trace, x, y);
        double xn;
        pw_status st = x_of_y(curve, sp, y, x, &xn);
        if (st == PW_ENOBRACKET)
            return PW_EINFEASIBLE; /* the operating line has crossed the curve: below S_min */
        if (st != PW_OK)
            return st;
        if (!(dir * (xn - x) > 0.0))
            return PW_EINFEASIBLE; /* no progress: at or below the minimum boil-up */
        pw_stair_trace_add(trace, xn, y);
        if (dir * (xn - sp->x_bottom) >= 0.0) {
            *stages = (double)n + (x - sp->x_bottom) / (x - xn);
            return PW_OK;
        }
        x = xn;
    }
    return PW_EMAXITER;
}

/* The curve seen from a column whose bottoms lies on the left of its top: y*(x) itself, or for a
 * bottoms on the right the mirror image x -> 1 - x, y -> 1 - y (the ratio (x - xB)/(y* - x) is
 * unchanged by it). */
typedef struct mirror {
    const pw_curve *curve;
    bool flip;
} mirror;

static pw_status mirror_y(void *ctx, double x, double *y)
{
    const mirror *m = ctx;
    if (!m->flip)
        return m->curve->y_of_x(m->curve->ctx, x, y);
    double yy;
    pw_status st = m->curve->y_of_x(m->curve->ctx, 1.0 - x, &yy);
    *y = 1.0 - yy;
    return st;
}

static void infeasible_touch(pw_stripper_result *out, const pw_stripper_spec *sp, double x_at)
{
    out->feasible = false;
    snprintf(out->reason, sizeof out->reason,
             "the equilibrium curve reaches y = x (at x1 = %.5g) between the top layer (%.5g) and "
             "the bottoms (%.5g): a homogeneous azeotrope or pinch blocks this column, no finite "
             "boil-up reaches the bottoms",
             x_at, sp->x_top, sp->x_bottom);
}

pw_status pw_stripper_solve(const pw_curve *curve, const pw_stripper_spec *sp,
                            const pw_column_options *opt, pw_stripper_result *out)
{
    if (!curve || !curve->y_of_x || !sp || !out)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->boilup_min = out->n_min = out->x_pinch = out->y_pinch = out->y_top_min = NAN;
    if (!(sp->x_top > 0.0 && sp->x_top < 1.0 && sp->x_bottom >= 0.0 && sp->x_bottom <= 1.0)
        || sp->x_top == sp->x_bottom)
        return PW_EINVAL;
    pw_column_options o = opt ? *opt : pw_column_default_options();
    if (!(o.rtol > 0.0 && o.rtol <= 1e-4) || o.grid < 16 || o.grid > 10000000)
        return PW_EINVAL;
    if (sp->x_bottom <= 0.0 || sp->x_bottom >= 1.0) {
        snprintf(out->reason, sizeof out->reason,
                 "a pure bottoms product (x1 = %g) needs infinitely many stages: give a purity "
                 "short of 0 or 1",
                 sp->x_bottom);
        return PW_OK;
    }
    /* Work with the bottoms on the left (mirrored for a bottoms rich in 1): the section search of
     * the single column's stripping section, pole xb' = the bottoms, range [xb', xt'], the top as
     * the end candidate. It returns s_lim = min over the range of (y* - xb')/(x - xb'), proved
     * (docs/column.md section 3); S_min = 1/(s_lim - 1) = max of (x - xB)/(y* - x). */
    const bool flip = sp->x_bottom > sp->x_top;
    const double xb = flip ? 1.0 - sp->x_bottom : sp->x_bottom;
    const double xt = flip ? 1.0 - sp->x_top : sp->x_top;
    mirror m = {curve, flip};
    pw_curve mc = {mirror_y, &m};
    pw_column_ws w;
    pw_status st = pw_column_ws_init(&w, &mc, o.rtol);
    if (st != PW_OK)
        return st;
    const size_t n = o.grid;
    double *xg = malloc(2 * n * sizeof *xg);
    if (!xg)
        return PW_ENOMEM;
    double *yg = xg + n;
    for (size_t k = 0; st == PW_OK && k < n; k++) {
        xg[k] = k + 1 == n ? xt : xb + (xt - xb) * (double)k / (double)(n - 1);
        st = pw_column_y(&w, xg[k], &yg[k]);
    }
    double slope = NAN, x_lim = NAN, y_lim = NAN;
    bool at_top = false;
    if (st == PW_OK) {
        w.tab_x = xg;
        w.tab_y = yg;
        w.tab_n = n;
        pw_column_spec cs = {.xd = xt, .xb = xb, .zf = xt, .q = 1.0};
        st = pw_column_section_search(&w, &cs, PW_SECTION_STRIPPING, xb, yg[0], xt, yg[n - 1], xt,
                                      yg[n - 1], &slope, &x_lim, &y_lim, &at_top);
    }
    free(xg);
    if (st != PW_OK)
        return st;
    if (flip) {
        x_lim = 1.0 - x_lim;
        y_lim = 1.0 - y_lim;
    }
    /* s_lim <= 1: somewhere y* <= x (the vapor no longer leans away from the bottoms) */
    if (!(slope > 1.0) || !isfinite(1.0 / (slope - 1.0))) {
        infeasible_touch(out, sp, x_lim);
        return PW_OK;
    }
    const double best_r = 1.0 / (slope - 1.0);
    out->feasible = true;
    out->boilup_min = best_r;
    out->tangent = !at_top;
    out->x_pinch = at_top ? sp->x_top : x_lim;
    st = curve_y(curve, out->x_pinch, &out->y_pinch);
    if (st != PW_OK)
        return st;
    out->y_top_min = sp->x_top + (sp->x_top - sp->x_bottom) / best_r;
    st = pw_stripper_stages(curve, sp, INFINITY, o.max_stages, &out->n_min);
    for (size_t i = 0; st == PW_OK && i < o.n_factors && i < PW_COLUMN_MAX_FACTORS; i++) {
        double S = o.factors[i] * best_r;
        out->design[i].factor = o.factors[i];
        out->design[i].boilup = S;
        out->design[i].y_top = sp->x_top + (sp->x_top - sp->x_bottom) / S;
        st = pw_stripper_stages(curve, sp, S, o.max_stages, &out->design[i].stages);
        if (st == PW_OK)
            out->n_design++;
    }
    if (st == PW_EMAXITER || st == PW_EINFEASIBLE) {
        out->feasible = false;
        snprintf(out->reason, sizeof out->reason,
                 "%s: the bottoms x1 = %.6g is out of reach within %zu stages",
                 st == PW_EMAXITER ? "too many stages" : "the stepping stalls",
                 sp->x_bottom, o.max_stages);
        return PW_OK;
    }
    return st;
}

pw_status pw_column_hetero_block(const pw_system *s, double P_Pa, double x_a, double x_b,
                                 pw_three_phase *tp, bool *blocked, char *reason, size_t len)
{
    if (!s || !tp || !blocked || !reason || len == 0)
        return PW_EINVAL;
    *blocked = false;
    reason[0] = '\0';
    if (!pw_model_can_split(s->model)) {
        memset(tp, 0, sizeof *tp);
        return PW_OK;
    }
    pw_status st = pw_three_phase_at_P(s, P_Pa, tp);
    if (st != PW_OK)
        return st;
    double lo = fmin(x_a, x_b), hi = fmax(x_a, x_b);
    if (tp->exists && tp->heterogeneous_azeotrope && lo < tp->y1 && tp->y1 < hi) {
        *blocked = true;
        snprintf(reason, len,
                 "a heterogeneous azeotrope (x1 = %.4f at " PW_TEXT_T(".2f")
                 ", liquid layers x1 = %.4f and %.4f) "
                 "lies between the bottoms and distillate targets: one column cannot cross it; use "
                 "the decanter scheme (decanter plus two stripping columns: pinchwise decanter)",
                 tp->y1, tp->T_K, tp->x[0], tp->x[1]);
    }
    return PW_OK;
}

/* The layers the decanter returns: out->top_x1 and T_decanter_K hold the three-phase layers at
 * T3 on entry; a cooled decanter replaces them with pw_lle_solve's at its temperature, checked
 * to lie outside the layers that boil at T3. false with out->reason when the cooled decanter
 * cannot work. */
static pw_status decanter_layers(const pw_system *s, const pw_decanter_spec *sp,
                                 pw_decanter_result *out, bool *ok)
{
    const pw_three_phase *tp = &out->decanter;
    *ok = false;
    double Td = sp->T_decanter_K;
    if (Td == 0.0 || isnan(Td) || fabs(Td - tp->T_K) <= 1e-9 * tp->T_K) {
        *ok = true;
        return PW_OK;
    }
    if (Td > tp->T_K) {
        snprintf(out->reason, sizeof out->reason,
                 "a decanter at " PW_TEXT_T(".2f") " lies above the three-phase temperature "
                 PW_TEXT_T(".2f") ": its liquid would boil; give a decanter temperature at or "
                 "below it",
                 Td, tp->T_K);
        return PW_OK;
    }
    /* water (the one component with its own vapor-pressure equation, IAPWS-IF97) freezes at
     * 273.15 K; a water-rich layer below it would hold ice, which no model here describes */
    for (int i = 0; i < 2; i++)
        if (s->comp[i].equation == PW_PSAT_IAPWS_IF97 && Td < 273.15) {
            snprintf(out->reason, sizeof out->reason,
                     "a decanter at " PW_TEXT_T(".2f") " lies below the freezing point of water "
                     "(273.15 K): the water-rich layer would freeze; give a temperature above it",
                     Td);
            return PW_OK;
        }
    pw_lle_result l;
    pw_status st = pw_lle_solve(s, Td, &l);
    if (st == PW_ERANGE) {
        snprintf(out->reason, sizeof out->reason,
                 "at the decanter temperature " PW_TEXT_T(".2f") " the model puts a layer within "
                 "1e-12 of a pure component: the split cannot be resolved there",
                 Td);
        return PW_OK;
    }
    if (st != PW_OK)
        return st;
    if (!l.split) {
        snprintf(out->reason, sizeof out->reason,
                 "the model predicts one liquid at the decanter temperature " PW_TEXT_T(".2f")
                 ": there is nothing to decant there",
                 Td);
        return PW_OK;
    }
    out->cooled = true;
    out->T_decanter_K = Td;
    out->top_x1[0] = l.x[1];
    out->top_x1[1] = l.x[0];
    if (l.x[1] < tp->x[1] || l.x[0] > tp->x[0]) {
        bool rich = l.x[1] < tp->x[1];
        snprintf(out->reason, sizeof out->reason,
                 "at the decanter's " PW_TEXT_T(".2f") " the layer %s in 1 (x1 = %.5g) lies "
                 "inside the layers boiling at " PW_TEXT_T(".2f") " (%.5g, %.5g): reheated, it "
                 "would boil as two liquids atop column %s (not modelled); warm the decanter",
                 Td, rich ? "rich" : "lean", rich ? l.x[1] : l.x[0], tp->T_K, tp->x[0], tp->x[1],
                 rich ? "A" : "B");
        return PW_OK;
    }
    *ok = true;
    return PW_OK;
}

/* Saturated liquid feed of overall composition z at P: inside the two-liquid region its two
 * layers at T3 (lever rule), else the one liquid at its bubble point. */
static pw_status feed_liquid_enthalpy(const pw_system *s, const pw_heat_data *h, double P_Pa,
                                      double z, const pw_three_phase *tp, double *hL)
{
    if (tp->exists && z > tp->x[0] && z < tp->x[1]) {
        double hI, hII;
        pw_status st = pw_enthalpy_liquid(s, h, tp->x[0], tp->T_K, &hI);
        if (st == PW_OK)
            st = pw_enthalpy_liquid(s, h, tp->x[1], tp->T_K, &hII);
        double beta = (z - tp->x[0]) / (tp->x[1] - tp->x[0]);
        *hL = (1.0 - beta) * hI + beta * hII;
        return st;
    }
    return pw_enthalpy_sat_liquid(s, h, P_Pa, z, hL, NULL);
}

/* The duties of every design row (see pw_decanter_result). */
static pw_status decanter_duties(const pw_system *s, const pw_decanter_spec *sp,
                                 const pw_curve *curve, const pw_eq_point bottoms[2],
                                 const pw_status bottoms_st[2], pw_decanter_result *out)
{
    pw_heat_data h;
    pw_error err;
    pw_error_clear(&err);
    pw_status st = pw_heat_data_from_system(s, &h, &err);
    if (st == PW_ENOTFOUND) {
        snprintf(out->duties_note, sizeof out->duties_note, "duties not computed: %.*s",
                 (int)(sizeof out->duties_note - 32), err.msg);
        return PW_OK;
    }
    if (st != PW_OK)
        return st;
    const pw_three_phase *tp = &out->decanter;
    double hF, hL;
    st = feed_liquid_enthalpy(s, &h, sp->P_Pa, sp->zf, tp, &hL);
    if (st == PW_OK && sp->q != 1.0) {
        double HV;
        st = pw_enthalpy_sat_vapor(s, &h, sp->P_Pa, sp->zf, &HV, NULL);
        hF = HV - sp->q * (HV - hL);
    } else {
        hF = hL;
    }
    const double xb[2] = {sp->x_rich, sp->x_lean};
    double lat[2] = {NAN, NAN}, lay_hot[2] = {0.0, 0.0}, lay_cold[2], hB[2] = {NAN, NAN};
    for (int i = 0; st == PW_OK && i < 2; i++) {
        /* the reboiler: V moles of its equilibrium vapor raised from the bottoms' liquid */
        const pw_eq_point *eb = &bottoms[i];
        st = bottoms_st[i];
        if (st == PW_OK)
            st = pw_enthalpy_liquid(s, &h, xb[i], eb->T_K, &hB[i]);
        if (st == PW_OK)
            lat[i] = pw_enthalpy_vapor(&h, eb->y1, eb->T_K) - hB[i];
        /* the layer at the decanter and at its bubble point */
        if (st == PW_OK)
            st = pw_enthalpy_liquid(s, &h, out->top_x1[i], out->T_decanter_K, &lay_cold[i]);
        if (st == PW_OK && out->cooled) {
            pw_eq_point e;
            st = pw_bubble_T(s, sp->P_Pa, out->top_x1[i], &e);
            if (st == PW_OK)
                st = pw_enthalpy_liquid(s, &h, out->top_x1[i], e.T_K, &lay_hot[i]);
        }
    }
    for (size_t k = 0; st == PW_OK && k < out->n_rows; k++) {
        double Qc = hF;
        for (int i = 0; st == PW_OK && i < 2; i++) {
            double V = out->vapor_per_mol_feed[i][k], L = out->layer_per_mol_feed[i][k];
            double y = out->col[i].design[k].y_top;
            /* the top vapor at its stage's temperature: the bubble point of the top stage's
             * liquid, the one in equilibrium with y on the column's branch */
            pw_stripper_spec cs = {out->top_x1[i], xb[i]};
            double x1s;
            st = x_of_y(curve, &cs, y, cs.x_top, &x1s);
            pw_eq_point e;
            if (st == PW_OK)
                st = pw_bubble_T(s, sp->P_Pa, x1s, &e);
            if (st != PW_OK)
                break;
            Qc += V * pw_enthalpy_vapor(&h, y, e.T_K) - L * lay_cold[i];
            out->reboiler_J[i][k] = V * lat[i];
            out->reheat_J[i][k] = out->cooled ? L * (lay_hot[i] - lay_cold[i]) : 0.0;
        }
        out->condenser_J[k] = Qc;
        out->condenser_negative = out->condenser_negative || Qc < 0.0;
        double E = hF - Qc;
        for (int i = 0; i < 2; i++)
            E += out->reboiler_J[i][k] + out->reheat_J[i][k]
                 - out->bottoms_per_mol_feed[i] * hB[i];
        out->energy_closure_J[k] = E;
    }
    if (st == PW_OK)
        out->duties = true;
    return st;
}

pw_status pw_decanter_solve(const pw_system *s, const pw_decanter_spec *sp,
                            const pw_column_options *opt, pw_decanter_result *out)
{
    if (!s || !sp || !out)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->closure = NAN;
    out->T_lo_K = out->T_hi_K = out->T_decanter_K = NAN;
    for (int i = 0; i < 2; i++)
        out->bottoms_per_mol_feed[i] = out->top_x1[i] = NAN;
    for (size_t k = 0; k < PW_COLUMN_MAX_FACTORS; k++) {
        out->condenser_J[k] = out->energy_closure_J[k] = NAN;
        for (int i = 0; i < 2; i++)
            out->reboiler_J[i][k] = out->reheat_J[i][k] = NAN;
    }
    if (!(sp->P_Pa > 0.0) || !isfinite(sp->P_Pa) || !(sp->zf > 0.0 && sp->zf < 1.0)
        || !(sp->x_rich > 0.0 && sp->x_rich <= 1.0) || !(sp->x_lean >= 0.0 && sp->x_lean < 1.0)
        || !isfinite(sp->q) || sp->T_decanter_K < 0.0 || isinf(sp->T_decanter_K))
        return PW_EINVAL;
    if (!pw_model_can_split(s->model)) {
        snprintf(out->reason, sizeof out->reason,
                 "the %s model cannot predict two liquid layers (for any parameters), so it cannot "
                 "describe a decanter; fit NRTL, UNIQUAC, Margules or van Laar",
                 s->model->name);
        return PW_OK;
    }
    pw_status st = pw_three_phase_at_P(s, sp->P_Pa, &out->decanter);
    if (st != PW_OK)
        return st;
    const pw_three_phase *tp = &out->decanter;
    if (tp->exists) {
        out->T_lo_K = out->T_hi_K = out->T_decanter_K = tp->T_K;
        out->top_x1[0] = tp->x[1];
        out->top_x1[1] = tp->x[0];
    }
    if (!tp->exists) {
        snprintf(out->reason, sizeof out->reason,
                 "the model predicts no two-liquid region at its boiling temperatures at this "
                 "pressure: there is nothing to decant");
        return PW_OK;
    }
    if (!tp->heterogeneous_azeotrope) {
        snprintf(out->reason, sizeof out->reason,
                 "the three-phase vapor (x1 = %.4f) lies outside the liquid layers (%.4f, %.4f): a "
                 "heterogeneous non-azeotrope: the decanter scheme does not apply; see pinchwise "
                 "azeotrope and reflux for a single column",
                 tp->y1, tp->x[0], tp->x[1]);
        return PW_OK;
    }
    bool ok;
    st = decanter_layers(s, sp, out, &ok);
    if (st != PW_OK || !ok)
        return st;
    const double lay_rich = out->top_x1[0], lay_lean = out->top_x1[1];
    if (!(sp->x_rich > lay_rich)) {
        snprintf(out->reason, sizeof out->reason,
                 "--x1-rich %.5g must exceed the layer rich in component 1 (x1 = %.5g at "
                 PW_TEXT_T(".2f") ")",
                 sp->x_rich, lay_rich, out->T_decanter_K);
        return PW_OK;
    }
    if (!(sp->x_lean < lay_lean)) {
        snprintf(out->reason, sizeof out->reason,
                 "--x1-lean %.5g must lie below the layer lean in component 1 (x1 = %.5g at "
                 PW_TEXT_T(".2f") ")",
                 sp->x_lean, lay_lean, out->T_decanter_K);
        return PW_OK;
    }
    if (!(sp->x_lean < sp->zf && sp->zf < sp->x_rich)) {
        snprintf(out->reason, sizeof out->reason,
                 "the feed (x1 = %.5g) must lie between the two bottoms (%.5g and %.5g)", sp->zf,
                 sp->x_lean, sp->x_rich);
        return PW_OK;
    }
    pw_system_curve sc;
    st = pw_system_curve_init(&sc, s, sp->P_Pa);
    if (st != PW_OK)
        return st;
    pw_curve curve = pw_system_curve_bind(&sc);
    pw_stripper_spec cs[2] = {{lay_rich, sp->x_rich}, {lay_lean, sp->x_lean}};
    for (int i = 0; i < 2; i++) {
        st = pw_stripper_solve(&curve, &cs[i], opt, &out->col[i]);
        if (st != PW_OK)
            return st;
        if (!out->col[i].feasible) {
            memcpy(out->reason, i == 0 ? "column A: " : "column B: ", 10);
            snprintf(out->reason + 10, sizeof out->reason - 10, "%.*s",
                     (int)(sizeof out->reason - 11), out->col[i].reason);
            return PW_OK;
        }
    }
    double span = sp->x_rich - sp->x_lean;
    double BA = (sp->zf - sp->x_lean) / span, BB = (sp->x_rich - sp->zf) / span;
    out->bottoms_per_mol_feed[0] = BA;
    out->bottoms_per_mol_feed[1] = BB;
    /* the streams of every design row, and the decanter's component balance over them (at the
     * minimum when there are no rows): in, the fresh feed and both condensed top vapors (each
     * column's top vapor from its operating line at the layer); out, the two layers */
    double B[2] = {BA, BB}, xt[2] = {lay_rich, lay_lean}, xb[2] = {sp->x_rich, sp->x_lean};
    size_t nrow = out->col[0].n_design < out->col[1].n_design ? out->col[0].n_design
                                                              : out->col[1].n_design;
    out->n_rows = nrow;
    double worst = 0.0;
    for (size_t k = 0; k < (nrow ? nrow : 1); k++) {
        double in = sp->zf, outf = 0.0;
        for (int i = 0; i < 2; i++) {
            double S = nrow ? out->col[i].design[k].boilup : out->col[i].boilup_min;
            double V = S * B[i], y = xt[i] + (xt[i] - xb[i]) / S;
            if (nrow) {
                out->vapor_per_mol_feed[i][k] = V;
                out->layer_per_mol_feed[i][k] = V + B[i];
            }
            in += V * y;
            outf += (V + B[i]) * xt[i];
        }
        worst = fmax(worst, fabs(in - outf));
    }
    out->closure = worst;
    out->feasible = true;
    /* the bottoms boil above the decanter (each on its single-liquid branch): their bubble
     * points serve the range warnings and the reboilers' duties */
    pw_eq_point eb[2];
    pw_status st_b[2];
    for (int i = 0; i < 2; i++) {
        st_b[i] = pw_bubble_T(s, sp->P_Pa, xb[i], &eb[i]);
        if (st_b[i] == PW_OK) {
            out->T_lo_K = fmin(out->T_lo_K, eb[i].T_K);
            out->T_hi_K = fmax(out->T_hi_K, eb[i].T_K);
        }
    }
    return decanter_duties(s, sp, &curve, eb, st_b, out);
}
