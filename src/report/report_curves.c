/* The report's compute step: a list of library calls. What to draw comes from
 * include/pinchwise/drawing.h (curves, azeotropes, three-phase line, column construction,
 * decanter scheme, enthalpies); the consistency tests, the ranking, the stage profile and the
 * energy-balance column from their modules. Nothing is solved here. */
#include "report/report_internal.h"

#include <math.h>
#include <pinchwise/enthalpy.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static pw_status column(pw_report_curves *c, const pw_report_input *in)
{
    const pw_system *s = &c->fit->sys;
    pw_status st = pw_draw_xy_compute(s, c->P_col_Pa, &c->xy);
    if (st != PW_OK)
        return st;
    c->n_failed += c->xy.n_failed;
    c->az_from_module = c->az_from_module && c->xy.az.status == PW_OK;
    st = pw_draw_column_compute_ex(s, c->P_col_Pa, &c->spec, c->factor, NULL, in->decanter_T_K,
                                   &c->dc);
    if (st != PW_OK)
        return st;
    pw_column_options opt = pw_column_default_options();
    if (c->dc.drawn &&
        pw_cmo_profile(s, c->P_col_Pa, &c->spec, c->dc.r_op, opt.max_stages, &c->profile_op) !=
            PW_OK)
        pw_profile_free(&c->profile_op);
    if (in->energy && c->dc.drawn) {
        c->energy = true;
        pw_heat_data heat;
        pw_error err;
        pw_error_clear(&err);
        bool have = false;
        for (size_t i = 0; i < opt.n_factors; i++)
            have = have || fabs(opt.factors[i] - c->factor) < 1e-12;
        if (!have && opt.n_factors < PW_COLUMN_MAX_FACTORS)
            opt.factors[opt.n_factors++] = c->factor;
        c->energy_status = pw_heat_data_from_system(s, &heat, &err);
        if (c->energy_status == PW_OK)
            c->energy_status = pw_energy_column_solve(s, &heat, c->P_col_Pa, &c->spec, &opt,
                                                      &c->energy_res, &c->energy_design);
        if (c->energy_status == PW_OK)
            c->energy_status = pw_draw_enthalpy_compute(s, c->P_col_Pa, &c->en, &err);
        if (c->energy_status != PW_OK)
            snprintf(c->energy_error, sizeof c->energy_error, "%s", err.msg);
    }
    return PW_OK;
}

/* The consistency tests exactly as `check` runs them on the data file (pw_check_data): the data
 * set rebuilt from the fit file with its own metadata (pw_fit_dataset), the three-phase points
 * left out, the default options. */
static void consistency(pw_report_curves *c)
{
    pw_dataset ds;
    pw_error err;
    pw_error_clear(&err);
    c->cons_status = pw_fit_dataset(c->fit, &ds);
    if (c->cons_status == PW_OK) {
        c->cons_status = pw_check_data(&ds, &c->fit->sys.comp[0], &c->fit->sys.comp[1], NULL,
                                       &c->cons_het, &c->cons, &err);
        pw_dataset_free(&ds);
    }
    c->cons_ran = c->cons_status == PW_OK;
    if (!c->cons_ran)
        snprintf(c->cons_error, sizeof c->cons_error, "%s",
                 err.msg[0] ? err.msg : pw_strerror(c->cons_status));
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

/* Every model of the same data (same condition) at the data's condition, for the overlay. */
static pw_status other_models(pw_report_curves *c, const pw_report_input *in)
{
    c->n_models = 0;
    if (!in->others || in->n_others == 0)
        return PW_OK;
    c->model_phase = malloc(PW_REPORT_MAX_MODELS * sizeof *c->model_phase);
    if (!c->model_phase)
        return PW_ENOMEM;
    c->model_fit[0] = c->fit;
    c->model_phase[0] = c->phase;
    c->n_models = 1;
    for (size_t i = 0; i < in->n_others && c->n_models < PW_REPORT_MAX_MODELS; i++) {
        const pw_fit_result *o = in->others[i];
        if (!o || !o->sys.model || o->kind != c->fit->kind)
            continue;
        /* the ranking already searched this fit's azeotropes at the data's condition */
        /* (pw_azeotrope_search's results: the homogeneous roots outside the two-liquid region
         * and the three-phase state, as the drawing takes them) */
        const pw_az_result *known = NULL;
        const pw_three_phase *known_tp = NULL;
        for (size_t k = 0; c->rank && c->rank_status == PW_OK && k < c->rank->n; k++) {
            const pw_rank_row *r = &c->rank->rows[k];
            double f = c->isothermal ? o->T_fixed_K : o->P_fixed_Pa;
            if (r->fit == o && r->az_status == PW_OK && f == c->phase.fixed) {
                known = &r->az;
                known_tp = &r->tp;
            }
        }
        pw_status st = pw_draw_phase_compute_known(&o->sys, c->isothermal, c->phase.fixed, known,
                                                   known_tp, &c->model_phase[c->n_models]);
        if (st == PW_ENOMEM)
            return st;
        if (st == PW_OK)
            c->model_fit[c->n_models++] = o;
    }
    return PW_OK;
}

pw_status pw_report_curves_compute(pw_report_curves *c, const pw_report_input *in)
{
    memset(c, 0, sizeof *c);
    /* nothing of the uncertainty content exists until pw_report_unc_compute makes it */
    c->unc_col_status = c->unc_az_status = c->unc_col_az_status = c->band_status = PW_EINVAL;
    c->fit = in->fit;
    c->units = in->units.T[0] && in->units.P[0] ? in->units : pw_units_display_default();
    c->isothermal = in->fit->kind == PW_DATA_ISOTHERMAL;
    double fixed = c->isothermal ? c->fit->T_fixed_K : c->fit->P_fixed_Pa;
    pw_status st = pw_draw_phase_compute(&c->fit->sys, c->isothermal, fixed, &c->phase);
    if (st != PW_OK)
        return st;
    c->n_failed = c->phase.n_failed;
    c->az_from_module = c->phase.az.status == PW_OK;
    c->diag_status = pw_fit_diagnose(c->fit, &c->diags);
    consistency(c);
    if (in->column) {
        c->column = true;
        c->spec = *in->column;
        c->P_col_Pa = in->column_P_Pa;
        c->factor = in->operating_factor > 0.0 ? in->operating_factor : 1.3;
        st = column(c, in);
        if (st != PW_OK)
            return st;
    }
    st = rank_models(c, in);
    return st == PW_OK ? other_models(c, in) : st;
}

void pw_report_curves_free(pw_report_curves *c)
{
    if (!c)
        return;
    if (c->cons_ran) {
        pw_consistency_result_free(&c->cons);
        pw_het_check_free(&c->cons_het, NULL);
    }
    c->cons_ran = false;
    free(c->band_y);
    c->band_y = NULL;
    free(c->rank);
    c->rank = NULL;
    free(c->model_phase);
    c->model_phase = NULL;
    pw_profile_free(&c->profile_op);
    pw_design_table_free(&c->energy_design);
}
