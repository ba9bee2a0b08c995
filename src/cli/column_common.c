#include "column_common.h"

#include "cli.h"
#include "cli_units.h"
#include "cli_options.h"

#include <math.h>
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>
#include <pinchwise/design_doc.h>
#include <pinchwise/column_direction.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* The reflux command's own options; the shared blocks follow (cli_options.h). */
static const cli_option reflux_options[] = {
    {.name = "--energy", .kind = CLI_FLAG,
     .help = "energy balance on every stage (heats of vaporization and heat\n"
             "capacities from the component data) instead of constant molal\n"
             "overflow; adds condenser and reboiler duties"},
    {.name = "--compare", .kind = CLI_STRING, .metavar = "FIT.json", .repeatable = true,
     .help = "another model's fit of the same data: R_min side by side, ranked\n"
             "by AICc"},
    CLI_END,
};

static const cli_option *const reflux_blocks[] = {
    cli_block_pressure, cli_block_products, cli_block_feed, cli_block_factors,
    reflux_options, cli_block_uncertainty, cli_block_components, cli_block_minimum,
    cli_block_verdict, cli_block_show_in, cli_block_json, NULL,
};

const cli_spec cli_reflux_spec = {
    .cmd = "reflux",
    .synopsis =
        "usage: pinchwise reflux FIT.json --pressure P --xd X --xb X --zf X [--q Q] [options]\n"
        "\n"
        "Binary column, constant molal overflow (or energy balances with --energy), total\n"
        "condenser, partial reboiler: minimum reflux with the limiting pinch, stages at total\n"
        "reflux, and the design table at each factor. With --uncertainty: intervals of R_min,\n"
        "boil-up and stages from the fit's parameter covariance, the feasibility risk, and\n"
        "where to measure next.\n",
    .blocks = reflux_blocks,
    .max_positional = 1,
    .positional = "one fit file",
};

pw_status cli_column_args_from(const cli_args *p, const char *fit_path, cli_column_args *a,
                              pw_error *err)
{
    memset(a, 0, sizeof *a);
    a->fit_path = fit_path;
    a->opt = pw_column_default_options();
    a->json = cli_has(p, "--json");
    a->energy = cli_has(p, "--energy");
    a->exit_verdict = cli_has(p, "--exit-verdict");
    a->components = cli_text(p, "--components");
    a->minimum = cli_text(p, "--minimum");
    a->units = cli_show_in_get(p);
    const cli_value *v = cli_get(p, "--factors");
    if (v) {
        if (v->n_list > PW_COLUMN_MAX_FACTORS)
            return pw_error_set(err, PW_EINVAL, NULL, 0, "%s: at most %d values", v->spelt,
                                PW_COLUMN_MAX_FACTORS);
        a->opt.n_factors = v->n_list;
        memcpy(a->opt.factors, v->list, v->n_list * sizeof v->list[0]);
    }
    /* the uncertainty step (column_uncert.c) takes these as parsed */
    a->uncertainty = cli_has(p, "--uncertainty");
    a->unc = cli_uncertainty_get(p);
    for (v = cli_next(p, "--compare", NULL); v; v = cli_next(p, "--compare", v)) {
        if (a->n_compare == CLI_MAX_COMPARE)
            return pw_error_set(err, PW_EINVAL, NULL, 0, "--compare: at most %d fit files",
                                CLI_MAX_COMPARE);
        a->compare[a->n_compare++] = v->text;
    }
    cli_targets tg;
    cli_targets_get(p, &tg, a->given);
    a->P_Pa = tg.P_Pa;
    a->spec = (pw_column_spec){.xd = tg.xd, .xb = tg.xb, .zf = tg.zf, .q = tg.q};
    a->have_P = tg.have_P, a->have_xd = tg.have_xd, a->have_xb = tg.have_xb;
    a->have_zf = tg.have_zf;
    memcpy(a->basis, tg.basis, sizeof a->basis);
    if (!a->fit_path || !a->have_P || !a->have_xd || !a->have_xb || !a->have_zf)
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "a fit file and --pressure, --xd, --xb, --zf are required");
    return PW_OK;
}

pw_status cli_reflux_parse_args(int argc, char **argv, cli_column_args *a, pw_error *err)
{
    cli_args p;
    memset(a, 0, sizeof *a);
    pw_status st = cli_parse(&cli_reflux_spec, argc, argv, &p, err);
    if (st != PW_OK || (a->help = p.help))
        return st;
    return cli_column_args_from(&p, p.n_pos ? p.pos[0] : NULL, a, err);
}

/* The targets in mole fractions: xb < zf < xd, or xd < zf < xb (component 1 to the bottoms). */
static pw_status check_targets(const pw_column_spec *s, pw_error *err)
{
    if (pw_column_direction_of(s) == PW_DIRECTION_NONE) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "the feed must lie between the products: xb < zf < xd (component 1 goes "
                     "overhead) or xd < zf < xb (component 1 leaves with the bottoms); got xb %g, "
                     "zf %g, xd %g as mole fractions of component 1",
                     s->xb, s->zf, s->xd);
        return PW_EINVAL;
    }
    return PW_OK;
}

pw_status cli_column_compute(const cli_column_args *a, cli_column_run *run, pw_error *err)
{
    memset(run, 0, sizeof *run);
    pw_status st = cli_read_fit("reflux", a->fit_path, a->components, &run->fit, err);
    if (st == PW_OK && (st = cli_apply_minimum("reflux", a->fit_path, &run->fit, a->minimum, &run->minimum,
                                                  err)) != PW_OK)
        pw_fit_result_free(&run->fit);
    if (st != PW_OK)
        return st;
    run->P_Pa = a->P_Pa;
    run->spec = a->spec;
    run->units = a->units;
    if (a->basis[0] == PW_BASIS_MASS || a->basis[1] == PW_BASIS_MASS ||
        a->basis[2] == PW_BASIS_MASS)
        memcpy(run->given, a->given, sizeof run->given);
    st = cli_targets_to_mole(&run->spec.xd, &run->spec.xb, &run->spec.zf, a->basis,
                                &run->fit.sys, err);
    pw_status rc = st == PW_OK ? check_targets(&run->spec, err) : st;
    if (rc != PW_OK) {
        pw_fit_result_free(&run->fit);
        return rc;
    }
    /* The design rows come from pw_reflux_design (stage profiles, a row the column cannot
     * reach marked as such), not from pw_column_solve's own table. */
    pw_column_options o = a->opt;
    o.n_factors = 0;
    st = pw_reflux_solve(&run->fit.sys, a->P_Pa, &run->spec, &o, a->fit_path, &run->col,
                         &run->T_top_K, &run->T_bottom_K, err);
    if (st == PW_OK && a->energy) {
        run->energy = true;
        st = pw_heat_data_from_system(&run->fit.sys, &run->heat, err);
        if (st != PW_OK) {
            char msg[PW_ERROR_MSG_MAX];
            snprintf(msg, sizeof msg, "%s", err->msg);
            pw_error_set(err, st, a->fit_path, 0, "--energy: %s", msg);
        }
    }
    if (st == PW_OK) {
        st = pw_reflux_design(&run->fit.sys, a->P_Pa, &run->spec, &a->opt, &run->col,
                              run->energy ? &run->heat : NULL, &run->design, &run->energy_res);
        char why[PW_REASON_MAX + 64];
        if (st != PW_OK)
            pw_error_set(err, st, a->fit_path, 0, "%s%s%s", pw_strerror(st),
                         run->energy_res.reason[0] ? ": " : "",
                         pw_units_display_text(&a->units, run->energy_res.reason, why,
                                               sizeof why));
    }
    if (st != PW_OK) {
        pw_design_table_free(&run->design);
        pw_fit_result_free(&run->fit);
        return st;
    }
    return PW_OK;
}

void cli_column_run_free(cli_column_run *run)
{
    pw_design_table_free(&run->design);
    pw_fit_result_free(&run->fit);
}

void cli_column_warn(const cli_column_run *run)
{
    const pw_fit_result *r = &run->fit;
    const pw_display_units *u = &run->units;
    char b[4][48];
    pw_range_check end[2], span;
    if (pw_fit_range_check_ends(r, run->T_top_K, run->T_bottom_K, PW_RANGE_COLUMN_MARGIN_K, end,
                                &span) == PW_OK) {
        for (int i = 0; i < 2; i++)
            for (int k = 0; k < 2; k++) {
                /* a single temperature: at most one of the two is positive */
                double below = end[k].below_K[i], above = end[k].above_K[i];
                if (below > 0.0 || above > 0.0)
                    cli_warnf("reflux", "the column %s at %s lies %s %s the vapor-pressure "
                                 "range of %s",
                                 k == 0 ? "top" : "bottom",
                                 pw_units_display_value(u, PW_SHOW_T, ".1f", end[k].T_lo_K, b[0],
                                                        48),
                                 pw_units_display_value(u, PW_SHOW_DT, ".1f",
                                                        below > 0.0 ? below : above, b[1], 48),
                                 below > 0.0 ? "below" : "above", r->sys.comp[i].name);
            }
        if (span.outside_data)
            cli_warnf("reflux", "the column runs at %s to %s, outside the fitted data's %s to %s "
                         "by more than %g K: the model is extrapolated",
                         pw_units_display_value(u, PW_SHOW_T, ".1f", span.T_lo_K, b[0], 48),
                         pw_units_display_value(u, PW_SHOW_T, ".1f", span.T_hi_K, b[1], 48),
                         pw_units_display_value(u, PW_SHOW_T, ".1f", span.data_T_min_K, b[2], 48),
                         pw_units_display_value(u, PW_SHOW_T, ".1f", span.data_T_max_K, b[3], 48),
                         PW_RANGE_COLUMN_MARGIN_K);
    }
    if (!run->energy)
        cli_warn_cmo("reflux", &r->sys, "; consider --energy");
    if (!r->converged)
        cli_warnf("reflux", "%s: the fit did not converge; do not design with it", r->dataset_path);
    cli_warn_vapor_association("reflux", &r->sys);
    if (r->split)
        cli_warnf("reflux", "the fitted model predicts two liquid phases (least stable liquid at "
                            "x1 = %.3f, %s; the layers: pinchwise lle)",
                     r->split_x,
                     pw_units_display_value(u, PW_SHOW_T, ".1f", r->split_T_K, b[0], 48));
    if (run->energy ? run->energy_res.feasible && run->energy_res.pinch.kind == PW_PINCH_TANGENT
                    : run->col.feasible && run->col.pinch.kind == PW_PINCH_TANGENT)
        cli_warnf("reflux", "tangent pinch: stage counts near R_min are very sensitive to the "
                     "model%s",
                     run->with_uncertainty ? " (see the intervals below)" : "; consider --uncertainty");
}
