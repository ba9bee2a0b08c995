/* pinchwise decanter: the decanter and two stripping columns for a partly miscible binary with a
 * heterogeneous azeotrope. Parses, calls src/analysis/decanter.c and prints. */
#include "analysis_common.h"
#include "azeo_uncert.h"
#include "cli.h"
#include "cli_units.h"
#include "cli_options.h"

#include <math.h>
#include <pinchwise/commands.h>
#include <pinchwise/decanter.h>
#include <stdio.h>
#include <string.h>

#define CMD "decanter"

typedef struct args {
    bool help; /* --help was asked for: nothing else is set */
    const char *fit_path, *components, *minimum;
    pw_decanter_spec spec;
    pw_column_options opt;
    bool have_P, have_z, have_rich, have_lean, json;
    cli_azeo_uncert unc; /* --uncertainty, --samples, --seed (the azeotrope command's parser) */
    pw_basis basis[3]; /* of --zf, --x1-rich, --x1-lean as given (mole, or mass: wt, wt%) */
    pw_display_units units; /* --show-in */
} args;

/* Design boil-up ratios: above the minimum. */
static pw_status check_boilup_factors(cli_value *v, pw_error *err)
{
    if (v->n_list > PW_COLUMN_MAX_FACTORS)
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "%s %s: expected up to %d comma-separated numbers above 1", v->spelt,
                            v->text, PW_COLUMN_MAX_FACTORS);
    for (size_t i = 0; i < v->n_list; i++)
        if (!(v->list[i] > 1.0))
            return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: expected numbers above 1",
                                v->spelt, v->text);
    return PW_OK;
}

static const cli_option decanter_options[] = {
    {.name = "--x1-rich", .kind = CLI_FRACTION, .metavar = "X",
     .help = "bottoms of column A (above the layer rich in component 1): a mole\n"
             "fraction, or with mol%, wt or wt%"},
    {.name = "--x1-lean", .kind = CLI_FRACTION, .metavar = "X",
     .help = "bottoms of column B (below the other layer), as --x1-rich"},
    {.name = "--decanter-temperature", .kind = CLI_QUANTITY, .unit = PW_QTY_TEMPERATURE,
     .metavar = "T",
     .help = "a cooled decanter at T (at or below the three-phase temperature,\n"
             "e.g. 35C): its layers at T, each reheated to its bubble point\n"
             "before it tops its column (default: at the three-phase temperature)"},
    {.name = "--factors", .kind = CLI_LIST, .metavar = "F,F,...", .check = check_boilup_factors,
     .help = "design boil-up as multiples of the minimum (default 1.2,1.3,1.5)"},
    CLI_END,
};

static const cli_option *const decanter_blocks[] = {
    cli_block_pressure, cli_block_feed, decanter_options, cli_block_uncertainty,
    cli_block_components, cli_block_minimum, cli_block_show_in, cli_block_json, NULL,
};

static const cli_spec decanter_spec = {
    .cmd = CMD,
    .synopsis =
        "usage: pinchwise decanter FIT.json --pressure P --zf X --x1-rich X --x1-lean X [--q Q]\n"
        "                          [options]\n"
        "\n"
        "Fresh feed and both condensed overheads enter one decanter at the three-phase\n"
        "temperature (or, cooled, at --decanter-temperature); its layer rich in component 1\n"
        "tops stripping column A (bottoms --x1-rich), the other layer tops stripping column B\n"
        "(bottoms --x1-lean). Each column has a partial reboiler and no condenser of its own;\n"
        "constant molal overflow. The feed enters the decanter, so --q changes no flow or\n"
        "stage count, only the condenser duty. Duties need the components' heat data.\n",
    .blocks = decanter_blocks,
    .max_positional = 1,
    .positional = "one fit file",
};

/* PW_OK (a->help set when --help was asked for), or PW_EINVAL with err filled. */
static pw_status parse(int argc, char **argv, args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    a->opt = pw_column_default_options();
    cli_args p;
    if (cli_parse(&decanter_spec, argc, argv, &p, err) != PW_OK)
        return PW_EINVAL;
    if ((a->help = p.help))
        return PW_OK;
    a->json = cli_has(&p, "--json");
    a->components = cli_text(&p, "--components");
    a->minimum = cli_text(&p, "--minimum");
    a->units = cli_show_in_get(&p);
    cli_azeo_uncert_from(&p, &a->unc);
    const cli_value *v;
    if ((v = cli_get(&p, "--x1-rich")))
        a->spec.x_rich = v->num, a->basis[1] = v->basis, a->have_rich = true;
    if ((v = cli_get(&p, "--x1-lean")))
        a->spec.x_lean = v->num, a->basis[2] = v->basis, a->have_lean = true;
    if ((v = cli_get(&p, "--decanter-temperature"))) {
        if (!(v->num > 0.0))
            return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: expected a temperature above "
                                "absolute zero", v->spelt, v->text);
        a->spec.T_decanter_K = v->num;
    }
    if ((v = cli_get(&p, "--factors"))) {
        a->opt.n_factors = v->n_list;
        memcpy(a->opt.factors, v->list, v->n_list * sizeof v->list[0]);
    }
    cli_targets tg;
    cli_targets_get(&p, &tg, NULL);
    a->fit_path = p.n_pos ? p.pos[0] : NULL;
    a->spec.P_Pa = tg.P_Pa;
    a->spec.zf = tg.zf;
    a->basis[0] = tg.basis[2];
    a->spec.q = tg.q;
    if (!a->fit_path || !tg.have_P || !tg.have_zf || !a->have_rich || !a->have_lean) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "a fit file and --pressure, --zf, --x1-rich, --x1-lean are required");
        return PW_EINVAL;
    }
    if (!(a->spec.zf > 0.0 && a->spec.zf < 1.0)) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--zf must lie strictly between 0 and 1");
        return PW_EINVAL;
    }
    return PW_OK;
}

static void print_column(const pw_decanter_result *r, int col, double bottom)
{
    const char *name = col == 0 ? "A" : "B";
    const pw_stripper_result *c = &r->col[col];
    double top = r->top_x1[col];
    printf("\n  Column %s: top feed x1 = %.5f, bottoms x1 = %.5g\n", name, top, bottom);
    printf("    minimum boil-up V/B = %.5g (%s pinch at x1 = %.5f, y1 = %.5f)\n", c->boilup_min,
           c->tangent ? "tangent" : "top", c->x_pinch, c->y_pinch);
    printf("    stages at total boil-up: %.3f (partial reboiler counted)\n", c->n_min);
    printf("    %-8s %-10s %-10s %-13s %-10s %-10s %s\n", "factor", "V/B", "stages",
           "top vapor x1", "vapor/F", "layer/F", r->duties ? (r->cooled ? "reboiler, reheat kJ/F"
                                                                         : "reboiler kJ/F")
                                                             : "");
    for (size_t i = 0; i < c->n_design; i++) {
        printf("    %-8.2f %-10.5g %-10.3f %-13.5f %-10.5g %-10.5g", c->design[i].factor,
               c->design[i].boilup, c->design[i].stages, c->design[i].y_top,
               r->vapor_per_mol_feed[col][i], r->layer_per_mol_feed[col][i]);
        if (r->duties && r->cooled)
            printf(" %.4g, %.4g", r->reboiler_J[col][i] / 1e3, r->reheat_J[col][i] / 1e3);
        else if (r->duties)
            printf(" %.4g", r->reboiler_J[col][i] / 1e3);
        printf("\n");
    }
}

pw_status cli_decanter(int argc, char **argv)
{
    args a;
    pw_error err;
    pw_error_clear(&err);
    if (parse(argc, argv, &a, &err) != PW_OK)
        return cli_fail(CMD, &err);
    if (a.help) {
        cli_help(&decanter_spec, stdout);
        return PW_OK;
    }
    pw_status rc = PW_OK;
    pw_fit_result fit;
    memset(&fit, 0, sizeof fit);
    size_t minimum = 0;
    pw_status st = cli_read_fit_at(CMD, a.fit_path, a.components, a.minimum, &fit, &minimum, &err);
    if (st != PW_OK)
        return cli_fail(CMD, &err);
    /* compositions given by mass: mole fractions with the fit file's molar masses */
    st = cli_composition_to_mole("--zf", &a.spec.zf, a.basis[0], &fit.sys, &err);
    if (st == PW_OK)
        st = cli_composition_to_mole("--x1-rich", &a.spec.x_rich, a.basis[1], &fit.sys, &err);
    if (st == PW_OK)
        st = cli_composition_to_mole("--x1-lean", &a.spec.x_lean, a.basis[2], &fit.sys, &err);
    if (st != PW_OK) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    pw_decanter_result r;
    st = pw_decanter_run(&fit.sys, &a.spec, &a.opt, a.fit_path, &r, &err);
    if (st != PW_OK) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    const pw_three_phase *tp = &r.decanter;
    /* the decanter and the bottoms against the vapor-pressure and fitted ranges */
    cli_warn_T_range(CMD, &fit, r.T_lo_K, r.T_hi_K, "the scheme's temperatures", &a.units);
    cli_warn_layers_contradicted(CMD, &fit, &a.units);
    cli_warn_cmo(CMD, &fit.sys, "; the first-law residual of the flows (with the duties) shows its size");
    if (r.cooled) /* the layers there use the model only: no vapor pressure */
        cli_warn_data_T_range(CMD, &fit, r.T_decanter_K, r.T_decanter_K,
                              "the decanter temperature", &a.units);
    pw_unc_result ures;
    bool unc = a.unc.on && r.feasible;
    if (unc) {
        cli_progress_ctx pc = {CMD, "parameter sets sampled"};
        pw_unc_options o = a.unc.opt;
        cli_progress_attach(&o.progress, &o.progress_ctx, &pc);
        pw_unc_het_ctx c = pw_unc_decanter_ctx(&a.spec, &a.opt);
        if (pw_het_unc_run(&fit, &c, &o, &ures, &err) != PW_OK) {
            pw_fit_result_free(&fit);
            return cli_fail(CMD, &err);
        }
    }
    if (a.json) {
        json_t *doc = pw_decanter_command_doc(&fit.sys, &r, &a.spec);
        if (doc && minimum) /* the minimum used, as azeotrope records it */
            json_object_set_new(doc, "minimum", json_integer((json_int_t)minimum));
        if (unc)
            pw_decanter_unc_doc(doc, &ures, a.unc.opt.seed);
        rc = cli_print_json(doc);
    } else {
        const pw_system *s = &fit.sys;
        const pw_display_units *u = &a.units;
        char b1[48];
        printf("Decanter scheme for %s (1) / %s (2), %s model, at %s\n", s->comp[0].name,
               s->comp[1].name, s->model->name,
               pw_units_display_value(u, PW_SHOW_P, ".6g", a.spec.P_Pa, b1, sizeof b1));
        if (tp->exists)
            printf("  %s at the three-phase temperature %s: layers x1 = %.5f and "
                   "%.5f, vapor x1 = %.5f\n", r.cooled ? "boiling" : "decanter",
                   pw_units_display_value(u, PW_SHOW_T, ".3f", tp->T_K, b1, sizeof b1), tp->x[0],
                   tp->x[1], tp->y1);
        if (r.cooled)
            printf("  decanter cooled to %s: layers x1 = %.5f and %.5f, each reheated to its\n"
                   "  bubble point before it tops its column\n",
                   pw_units_display_value(u, PW_SHOW_T, ".3f", r.T_decanter_K, b1, sizeof b1),
                   r.top_x1[1], r.top_x1[0]);
        if (!r.feasible) {
            char why[PW_REASON_MAX + 64];
            printf("  not feasible: %s\n", pw_units_display_text(u, r.reason, why, sizeof why));
        } else {
            print_column(&r, 0, a.spec.x_rich);
            print_column(&r, 1, a.spec.x_lean);
            printf("\n  bottoms per mole of feed: A %.6f, B %.6f (balance closes to %.1e)\n",
                   r.bottoms_per_mol_feed[0], r.bottoms_per_mol_feed[1], r.closure);
            printf("  vapor/F: boil-up per mole of feed, condensed into the decanter; layer/F: the\n"
                   "  decanter layer returned to the column's top, per mole of feed.\n");
            if (r.duties) {
                printf("  condenser duty, kJ per mole of feed, by design row:");
                for (size_t k = 0; k < r.n_rows; k++)
                    printf(" %.4g (%.2f)", r.condenser_J[k] / 1e3, r.col[0].design[k].factor);
                printf("\n  first-law residual of these flows, kJ per mole of feed:");
                for (size_t k = 0; k < r.n_rows; k++)
                    printf(" %.3g", r.energy_closure_J[k] / 1e3);
                printf("\n  (duties from the components' heat data on the constant-molal-overflow\n"
                       "  flows: screening values; the residual shows how far those flows are from an\n"
                       "  energy balance)\n");
                if (r.condenser_negative)
                    printf("  A negative condenser duty: the feed is cold enough to take up more heat\n"
                           "  than the overhead vapors give off; the decanter then needs heating to stay\n"
                           "  at its temperature, or runs colder (--decanter-temperature).\n");
            } else {
                printf("  %s\n", r.duties_note);
            }
            printf("  q = %g: the feed enters the decanter, so q changes no flow or stage count,\n"
                   "  only the condenser duty.\n",
                   a.spec.q);
            if (!r.cooled)
                printf("  The decanter is taken at the three-phase temperature; a cooled decanter:\n"
                       "  --decanter-temperature.\n");
        }
        if (unc)
            cli_het_uncert_print(&ures, &a.unc.opt, PW_AZ_ISOBARIC, true, r.cooled, u);
        else if (a.unc.on)
            printf("\nThe scheme is not feasible at the estimate: no interval to give.\n");
        cli_print_caution(stdout);
        rc = fflush(stdout) ? PW_EIO : PW_OK;
    }
    pw_fit_result_free(&fit);
    return rc;
}
