/* pinchwise rate: the products and stage profile of a given column (stages, feed stage, reflux,
 * distillate rate) for a fitted model at a pressure. Parses, calls pw_rate_cmo, prints. */
#include "cli.h"
#include "cli_units.h"
#include "cli_options.h"
#include "design_out.h"

#include <math.h>
#include <pinchwise/commands.h>
#include <stdio.h>
#include <string.h>

#define CMD "rate"

typedef struct rate_args {
    bool help; /* --help was asked for: nothing else is set */
    const char *fit_path, *components, *minimum;
    double P_Pa;
    pw_rate_spec spec;
    bool json, energy, have_N, have_K, have_R, have_D;
    cli_targets tg;
    pw_display_units units; /* --show-in */
} rate_args;

static const cli_option rate_options[] = {
    {.name = "--stages", .kind = CLI_INTEGER, .metavar = "N", .lo = 1.0, .hi = 100000.0,
     .help = "equilibrium stages, counted from the top, the partial reboiler\n"
             "being stage N (the total condenser is not counted)"},
    {.name = "--feed-stage", .kind = CLI_INTEGER, .metavar = "K", .lo = 1.0, .hi = 100000.0,
     .help = "the stage the whole feed enters"},
    {.name = "--reflux", .kind = CLI_NUMBER, .metavar = "R", .help = "reflux ratio L/D"},
    {.name = "--distillate", .kind = CLI_NUMBER, .metavar = "D",
     .help = "distillate, moles per mole of feed"},
    {.name = "--energy", .kind = CLI_FLAG,
     .help = "energy balance on every stage (heat data from the component\n"
             "file) instead of constant molal overflow; adds the duties"},
    CLI_END,
};

static const cli_option *const rate_blocks[] = {
    cli_block_pressure, cli_block_feed, rate_options, cli_block_components, cli_block_minimum,
    cli_block_show_in, cli_block_json, NULL,
};

static const cli_spec rate_spec = {
    .cmd = CMD,
    .synopsis =
        "usage: pinchwise rate FIT.json --pressure P --stages N --feed-stage K --reflux R\n"
        "                      --zf X --distillate D [--q Q] [options]\n"
        "\n"
        "Products of a given binary column, constant molal overflow: N equilibrium stages\n"
        "counted from the top with the partial reboiler as stage N (the total condenser is not\n"
        "counted), the whole feed on stage K, reflux ratio R = L/D, distillate D moles per mole\n"
        "of feed.\n",
    .blocks = rate_blocks,
    .max_positional = 1,
    .positional = "one fit file",
};

/* PW_OK (a->help set when --help was asked for), or PW_EINVAL with err filled. */
static pw_status parse(int argc, char **argv, rate_args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    cli_args p;
    if (cli_parse(&rate_spec, argc, argv, &p, err) != PW_OK)
        return PW_EINVAL;
    if ((a->help = p.help))
        return PW_OK;
    a->json = cli_has(&p, "--json");
    a->energy = cli_has(&p, "--energy");
    a->components = cli_text(&p, "--components");
    a->minimum = cli_text(&p, "--minimum");
    a->units = cli_show_in_get(&p);
    cli_targets_get(&p, &a->tg, NULL);
    const cli_value *v;
    if ((v = cli_get(&p, "--stages")))
        a->spec.n_stages = (int)v->whole, a->have_N = true;
    if ((v = cli_get(&p, "--feed-stage")))
        a->spec.feed_stage = (int)v->whole, a->have_K = true;
    if ((v = cli_get(&p, "--reflux")))
        a->spec.R = v->num, a->have_R = true;
    if ((v = cli_get(&p, "--distillate")))
        a->spec.d_frac = v->num, a->have_D = true;
    a->fit_path = p.n_pos ? p.pos[0] : NULL;
    if (!a->fit_path || !a->tg.have_P || !a->tg.have_zf || !a->have_N || !a->have_K || !a->have_R ||
        !a->have_D) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "a fit file and --pressure, --stages, --feed-stage, --reflux, --zf, "
                     "--distillate are required");
        return PW_EINVAL;
    }
    a->P_Pa = a->tg.P_Pa;
    a->spec.zf = a->tg.zf;
    a->spec.q = a->tg.q;
    return PW_OK;
}

pw_status cli_rate(int argc, char **argv)
{
    rate_args a;
    pw_error err;
    pw_error_clear(&err);
    if (parse(argc, argv, &a, &err) != PW_OK)
        return cli_fail(CMD, &err);
    if (a.help) {
        cli_help(&rate_spec, stdout);
        return PW_OK;
    }
    pw_status rc = PW_OK;
    pw_fit_result fit;
    memset(&fit, 0, sizeof fit);
    size_t minimum = 0;
    if (cli_read_fit_at(CMD, a.fit_path, a.components, a.minimum, &fit, &minimum, &err) != PW_OK)
        return cli_fail(CMD, &err);
    /* --zf given by mass: a mole fraction with the fit file's molar masses */
    if (cli_composition_to_mole("--zf", &a.spec.zf, a.tg.basis[2], &fit.sys, &err) != PW_OK) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    pw_rate_result r;
    pw_rate_energy_out en;
    pw_status st = pw_rate_run(&fit.sys, a.P_Pa, &a.spec, a.energy, a.fit_path, &r, &en, &err);
    if (st != PW_OK) {
        pw_rate_result_free(&r);
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    if (en.n_roots > 1)
        cli_warnf(CMD,
                     "%zu steady states satisfy this specification with energy balances; "
                     "the one with the lowest distillate purity is shown",
                     en.n_roots);
    cli_warn_vapor_association(CMD, &fit.sys);
    if (!fit.converged)
        cli_warnf(CMD, "%s: the fit did not converge; do not rate with it", a.fit_path);
    double Tlo, Thi;
    pw_range_check range;
    if (pw_profile_T_range(&r.profile, &Tlo, &Thi) == PW_OK &&
        pw_fit_range_check(&fit, Tlo, Thi, &range) == PW_OK) {
        for (int i = 0; i < 2; i++) {
            double ex = fmax(range.below_K[i], range.above_K[i]);
            char b[48];
            if (ex > 0.0)
                cli_warnf(CMD, "the column runs %s outside the vapor-pressure range of %s",
                          pw_units_display_value(&a.units, PW_SHOW_DT, ".1f", ex, b, sizeof b),
                          fit.sys.comp[i].name);
        }
    }
    if (a.json) {
        json_t *doc = pw_rate_doc(&fit.sys, a.P_Pa, &a.spec, a.energy, &r, &en);
        if (doc && minimum) /* the minimum used, as azeotrope records it */
            json_object_set_new(doc, "minimum", json_integer((json_int_t)minimum));
        rc = cli_print_json(doc);
    } else {
        char b[48];
        printf("given column at %s (%s / %s): %d stages, feed on stage %d, R %.4g, "
               "D/F %.4g, zf %.4g, q %.4g\n",
               pw_units_display_value(&a.units, PW_SHOW_P, ".4g", a.P_Pa, b, sizeof b),
               fit.sys.comp[0].name, fit.sys.comp[1].name, a.spec.n_stages,
               a.spec.feed_stage, a.spec.R, a.spec.d_frac, a.spec.zf, a.spec.q);
        printf("  distillate x1 %.8f   bottoms x1 %.8f\n", r.xd, r.xb);
        if (a.energy)
            printf("  energy balances: condenser %.4f kJ, reboiler %.4f kJ per mol feed\n",
                   en.Q_C / 1e3, en.Q_R / 1e3);
        printf("\n");
        cli_profile_print(&r.profile, &a.units);
        printf("\n  Screening estimate only (equilibrium stages, %s): verify\n",
               a.energy ? "energy balances" : "constant molal overflow");
        printf("  with rigorous simulation and plant data; operate per local codes under licensed\n"
               "  engineering review.\n");
        rc = fflush(stdout) ? PW_EIO : PW_OK;
    }
    pw_rate_result_free(&r);
    pw_fit_result_free(&fit);
    return rc;
}
