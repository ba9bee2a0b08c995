/* The report's numbers: model curves from the fitted system, azeotropes located on them, the
 * column analysis with its stage steps, and the consistency tests of the measured points. */
#include "report/report_internal.h"

#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/curve.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/lle.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static const double PI = 3.14159265358979323846;

/* Bubble point of liquid x at the fixed pressure (isobaric) or temperature (isothermal). */
static pw_status bubble(const pw_system *s, bool isothermal, double fixed, double x, pw_eq_point *e)
{
    return isothermal ? pw_bubble_P(s, fixed, x, e) : pw_bubble_T(s, fixed, x, e);
}

/* The azeotropes, from the azeotrope module (Brent on ln alpha12, see azeotrope.h); *from_module
 * is false when its search failed (the page then says so; no other search is made here). */
static size_t azeotropes(const pw_system *s, bool isothermal, double fixed, pw_report_az *out,
                         size_t max, bool *from_module, pw_az_result *kept)
{
    pw_az_result res;
    pw_status st = pw_azeotrope_find(s, isothermal ? PW_AZ_ISOTHERMAL : PW_AZ_ISOBARIC, fixed, NULL,
                                     &res);
    *from_module = st == PW_OK;
    if (st == PW_OK)
        *kept = res;
    if (st != PW_OK)
        return 0;
    /* partly miscible liquids: drop crossings inside the two-liquid region, add a heterogeneous
     * azeotrope (docs/heterogeneous.md) */
    pw_three_phase tp = {.exists = false};
    if (pw_model_can_split(s->model)
        && pw_azeotrope_heterogeneous(s, isothermal ? PW_AZ_ISOTHERMAL : PW_AZ_ISOBARIC, fixed,
                                      &res, &tp, NULL) == PW_OK)
        *kept = res;
    size_t k = 0;
    for (size_t i = 0; i < res.n && k < max; i++, k++) {
        out[k].x1 = res.az[i].x1;
        out[k].T_K = res.az[i].T_K;
        out[k].P_Pa = res.az[i].P_Pa;
        out[k].min_boiling = res.az[i].kind == PW_AZ_MINIMUM_BOILING;
        out[k].tangential = res.az[i].tangential;
    }
    if (tp.exists && tp.heterogeneous_azeotrope && k < max) {
        out[k].x1 = tp.y1;
        out[k].T_K = tp.T_K;
        out[k].P_Pa = tp.P_Pa;
        out[k].min_boiling = true;
        out[k].tangential = false;
        k++;
    }
    return k;
}

static void data_curves(pw_report_curves *c)
{
    const pw_fit_result *r = c->fit;
    const pw_system *s = &r->sys;
    double fixed = c->isothermal ? r->T_fixed_K : r->P_fixed_Pa;
    /* an overall liquid inside the two-liquid region boils at the three-phase condition: the
     * bubble curve is flat there (docs/heterogeneous.md) */
    pw_three_phase tp = {.exists = false};
    if (pw_model_can_split(s->model)
        && (c->isothermal ? pw_three_phase_at_T(s, fixed, &tp) : pw_three_phase_at_P(s, fixed, &tp))
               != PW_OK)
        tp.exists = false;
    for (size_t i = 0; i < PW_REPORT_GRID; i++) {
        double x = c->x[i];
        pw_eq_point e;
        c->bub_T[i] = c->bub_P[i] = c->bub_y[i] = PW_NAN;
        c->lg1[i] = c->lg2[i] = PW_NAN;
        if (tp.exists && x > tp.x[0] && x < tp.x[1]) {
            c->bub_T[i] = tp.T_K;
            c->bub_P[i] = tp.P_Pa;
            c->bub_y[i] = tp.y1;
        } else if (bubble(s, c->isothermal, fixed, x, &e) == PW_OK) {
            c->bub_T[i] = e.T_K;
            c->bub_P[i] = e.P_Pa;
            c->bub_y[i] = e.y1;
        } else {
            c->n_failed++;
        }
        double T = c->isothermal ? r->T_fixed_K : c->bub_T[i];
        pw_activity act;
        if (isfinite(T) && pw_system_activity(s, x, T, &act) == PW_OK) {
            c->lg1[i] = act.lngamma[0];
            c->lg2[i] = act.lngamma[1];
        }
        /* dew curve on the same spacing of y */
        double y = x;
        c->dew_y[i] = y;
        c->dew_T[i] = c->dew_P[i] = PW_NAN;
        pw_status st = c->isothermal ? pw_dew_P(s, fixed, y, &e) : pw_dew_T(s, fixed, y, &e);
        if (st == PW_OK) {
            c->dew_T[i] = e.T_K;
            c->dew_P[i] = e.P_Pa;
        } else {
            c->n_failed++;
        }
    }
    c->n_az = azeotropes(s, c->isothermal, fixed, c->az, PW_REPORT_MAX_AZ, &c->az_from_module,
                         &c->az_res);
    c->az_res_ok = c->az_from_module;
}

/* Rectifying and stripping lines at R meet on the q-line at (xi, yi). */
static void op_meet(const pw_column_spec *sp, double R, double *xi, double *yi)
{
    *xi = ((R + 1.0) * sp->zf + (sp->q - 1.0) * sp->xd) / (R + sp->q);
    *yi = (R * *xi + sp->xd) / (R + 1.0);
}

/* The staircase at reflux R from the top, switching to the stripping line at the feed (the
 * optimal feed stage: the step that crosses the lines' meeting point). Liquid in equilibrium
 * with vapor y from the dew point at the column pressure. */
static void staircase(pw_report_curves *c, double R)
{
    /* Component 1 to the bottoms: step in the mirrored frame (fractions of component 2, which
     * goes overhead; column_direction.h) and store the corners as fractions of component 1. */
    bool down = pw_column_direction_of(&c->spec) == PW_DIRECTION_BOTTOMS;
    const pw_column_spec mirrored = pw_column_spec_mirror(&c->spec);
    const pw_column_spec *sp = down ? &mirrored : &c->spec;
    double xi, yi;
    op_meet(sp, R, &xi, &yi);
    if (!isfinite(xi) || !(xi > sp->xb))
        return;
    double slope_s = (yi - sp->xb) / (xi - sp->xb);
    size_t k = 0;
    double y = sp->xd, xprev = sp->xd;
    c->step_x[k] = sp->xd;
    c->step_y[k++] = sp->xd;
    for (size_t stage = 0; stage < PW_REPORT_MAX_STEPS; stage++) {
        pw_eq_point e;
        if (pw_dew_T(&c->fit->sys, c->P_col_Pa, down ? 1.0 - y : y, &e) != PW_OK ||
            !isfinite(e.x1))
            break;
        double x = down ? 1.0 - e.x1 : e.x1;
        c->step_x[k] = x;
        c->step_y[k++] = y;
        if (x <= sp->xb || x >= xprev)
            break;
        y = x > xi ? (R * x + sp->xd) / (R + 1.0) : sp->xb + slope_s * (x - sp->xb);
        c->step_x[k] = x;
        c->step_y[k++] = y;
        xprev = x;
    }
    c->n_step = k;
    for (size_t i = 0; down && i < k; i++) {
        c->step_x[i] = 1.0 - c->step_x[i];
        c->step_y[i] = 1.0 - c->step_y[i];
    }
}

static pw_status column(pw_report_curves *c, const pw_report_input *in)
{
    const pw_system *s = &c->fit->sys;
    pw_system_curve sc;
    pw_status st = pw_system_curve_init(&sc, s, c->P_col_Pa);
    if (st != PW_OK)
        return st;
    pw_curve curve = pw_system_curve_bind(&sc);
    for (size_t i = 0; i < PW_REPORT_GRID; i++) {
        double y;
        c->col_y[i] = PW_NAN;
        if (curve.y_of_x(curve.ctx, c->x[i], &y) == PW_OK && isfinite(y)) {
            c->col_y[i] = y;
        } else {
            c->n_failed++;
        }
    }
    bool from_module = false;
    c->n_col_az = azeotropes(s, false, c->P_col_Pa, c->col_az, PW_REPORT_MAX_AZ, &from_module,
                             &c->col_az_res);
    c->col_az_res_ok = from_module;
    c->az_from_module = c->az_from_module && from_module;
    pw_eq_point e;
    c->T_top_K = pw_bubble_T(s, c->P_col_Pa, c->spec.xd, &e) == PW_OK ? e.T_K : PW_NAN;
    c->T_bottom_K = pw_bubble_T(s, c->P_col_Pa, c->spec.xb, &e) == PW_OK ? e.T_K : PW_NAN;

    pw_column_options opt = pw_column_default_options();
    bool have = false;
    for (size_t i = 0; i < opt.n_factors; i++)
        have = have || fabs(opt.factors[i] - c->factor) < 1e-12;
    if (!have && opt.n_factors < PW_COLUMN_MAX_FACTORS)
        opt.factors[opt.n_factors++] = c->factor;
    c->col_status = pw_column_solve_any(&curve, &c->spec, &opt, &c->col);
    c->stages_op = PW_NAN;
    c->feed_stage_op = 0;
    if (c->col_status == PW_OK && c->col.feasible) {
        c->r_op = c->factor * c->col.r_min;
        if (pw_column_step_any(&curve, &c->spec, c->r_op, opt.max_stages, &c->stages_op,
                           &c->feed_stage_op) != PW_OK)
            c->stages_op = PW_NAN;
        staircase(c, c->r_op);
        if (pw_cmo_profile(s, c->P_col_Pa, &c->spec, c->r_op, opt.max_stages, &c->profile_op) !=
            PW_OK)
            pw_profile_free(&c->profile_op);
    }
    if (in->energy && c->col_status == PW_OK && c->col.feasible) {
        c->energy = true;
        pw_heat_data heat;
        pw_error err;
        pw_error_clear(&err);
        c->energy_status = pw_heat_data_from_system(s, &heat, &err);
        if (c->energy_status == PW_OK)
            c->energy_status = pw_energy_column_solve(s, &heat, c->P_col_Pa, &c->spec, &opt,
                                                      &c->energy_res, &c->energy_design);
        else
            snprintf(c->energy_error, sizeof c->energy_error, "%s", err.msg);
        for (size_t i = 0; c->energy_status == PW_OK && i < PW_REPORT_GRID; i++) {
            if (pw_enthalpy_sat_liquid(s, &heat, c->P_col_Pa, c->x[i], &c->en_hL[i], NULL) != PW_OK)
                c->en_hL[i] = PW_NAN;
            if (pw_enthalpy_sat_vapor(s, &heat, c->P_col_Pa, c->x[i], &c->en_HV[i], NULL) != PW_OK)
                c->en_HV[i] = PW_NAN;
        }
    }
    return PW_OK;
}

/* The measured points as a dataset again, for the consistency tests. */
static void consistency(pw_report_curves *c)
{
    const pw_fit_result *r = c->fit;
    pw_dataset ds;
    memset(&ds, 0, sizeof ds);
    snprintf(ds.path, sizeof ds.path, "%s", r->dataset_path[0] ? r->dataset_path : "(fit file)");
    snprintf(ds.names[0], sizeof ds.names[0], "%s", r->sys.comp[0].name);
    snprintf(ds.names[1], sizeof ds.names[1], "%s", r->sys.comp[1].name);
    ds.kind = r->kind;
    ds.P_fixed_Pa = r->P_fixed_Pa;
    ds.T_fixed_K = r->T_fixed_K;
    ds.has_y = r->has_y;
    snprintf(ds.source, sizeof ds.source, "%s", r->source);
    ds.sigma_T_K = r->sigma_T_K;
    ds.sigma_P_rel = r->sigma_P_rel;
    ds.sigma_P_abs_Pa = PW_NAN;
    ds.sigma_y = r->sigma_y;
    ds.sigma_x = 0.001;
    snprintf(ds.T_unit, sizeof ds.T_unit, "K");
    snprintf(ds.P_unit, sizeof ds.P_unit, "kPa");
    ds.n = r->n_pts;
    ds.pts = malloc((r->n_pts ? r->n_pts : 1) * sizeof *ds.pts);
    if (!ds.pts) {
        c->cons_status = PW_ENOMEM;
        snprintf(c->cons_error, sizeof c->cons_error, "%s", pw_strerror(PW_ENOMEM));
        return;
    }
    for (size_t i = 0; i < r->n_pts; i++)
        ds.pts[i] = r->pts[i].meas;
    pw_error err;
    pw_error_clear(&err);
    c->cons_status = pw_consistency_run(&ds, &r->sys.comp[0], &r->sys.comp[1], NULL, &c->cons, &err);
    c->cons_ran = c->cons_status == PW_OK;
    if (!c->cons_ran)
        snprintf(c->cons_error, sizeof c->cons_error, "%s", err.msg[0] ? err.msg : pw_strerror(c->cons_status));
    free(ds.pts);
}

/* The report's fit and the others of the same data, ranked by the library's one rule, each with
 * its azeotrope at the data's condition and, with a column, its R_min. */
static pw_status rank_models(pw_report_curves *c, const pw_report_input *in)
{
    c->rank_status = PW_EINVAL;
    if (!in->others || in->n_others == 0)
        return PW_OK;
    const pw_fit_result *fits[PW_RANK_MAX];
    size_t n = 0;
    fits[n++] = c->fit;
    for (size_t i = 0; i < in->n_others && n < PW_RANK_MAX; i++)
        fits[n++] = in->others[i];
    c->rank = calloc(1, sizeof *c->rank);
    if (!c->rank)
        return PW_ENOMEM;
    pw_rank_column col = {c->spec, c->P_col_Pa};
    c->rank_status = pw_rank_assess(fits, n, c->column ? &col : NULL, c->rank);
    return PW_OK;
}

pw_status pw_report_curves_compute(pw_report_curves *c, const pw_report_input *in)
{
    memset(c, 0, sizeof *c);
    /* nothing of the uncertainty content exists until pw_report_unc_compute makes it */
    c->unc_col_status = c->unc_az_status = c->unc_col_az_status = c->band_status = PW_EINVAL;
    c->fit = in->fit;
    c->isothermal = in->fit->kind == PW_DATA_ISOTHERMAL;
    for (size_t i = 0; i < PW_REPORT_GRID; i++)
        c->x[i] = 0.5 * (1.0 - cos(PI * (double)i / (double)(PW_REPORT_GRID - 1)));
    c->x[0] = 0.0;
    c->x[PW_REPORT_GRID - 1] = 1.0;
    data_curves(c);
    c->diag_status = pw_fit_diagnose(c->fit, &c->diags);
    consistency(c);
    if (in->column) {
        c->column = true;
        c->spec = *in->column;
        c->P_col_Pa = in->column_P_Pa;
        c->factor = in->operating_factor > 0.0 ? in->operating_factor : 1.3;
        pw_status st = column(c, in);
        if (st != PW_OK)
            return st;
    }
    return rank_models(c, in);
}

void pw_report_curves_free(pw_report_curves *c)
{
    if (!c)
        return;
    if (c->cons_ran)
        pw_consistency_result_free(&c->cons);
    c->cons_ran = false;
    free(c->band_y);
    c->band_y = NULL;
    free(c->rank);
    c->rank = NULL;
    pw_profile_free(&c->profile_op);
    pw_design_table_free(&c->energy_design);
}
