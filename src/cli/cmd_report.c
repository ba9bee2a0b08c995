/* pinchwise report: one self-contained HTML page of a fit (and a column), optionally the plots
 * as separate SVG files and the curves behind them as CSV. */
#include "azeo_uncert.h"
#include "cli.h"
#include "cli_units.h"
#include "cli_options.h"

#include <math.h>
#include <pinchwise/enthalpy.h>
#include <pinchwise/fileio.h>
#include <pinchwise/report.h>
#include <stdio.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

/* The report draws one operating line: one factor, above 1 and at most 100. */
static pw_status check_one_factor(cli_value *v, pw_error *err)
{
    if (v->n_list != 1)
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "%s %s: the report draws one operating line; give one factor",
                            v->spelt, v->text);
    if (!(v->list[0] > 1.0 && v->list[0] <= 100.0))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "%s %s: R / R_min must be greater than 1 and at most 100", v->spelt,
                            v->text);
    return PW_OK;
}

static const cli_option report_options[] = {
    {.name = "--out", .kind = CLI_STRING, .metavar = "FILE",
     .help = "the page to write (refused if it exists, unless --force)"},
    {.name = "--factors", .alias = "--operating-factor", .kind = CLI_LIST, .metavar = "F",
     .check = check_one_factor,
     .help = "R / R_min of the drawn operating line (default 1.3; one value)"},
    {.name = "--energy", .kind = CLI_FLAG,
     .help = "with the column: also the energy-balance column (needs heat\n"
             "data in the component rows)"},
    {.name = "--decanter-temperature", .kind = CLI_QUANTITY, .unit = PW_QTY_TEMPERATURE,
     .metavar = "T",
     .help = "with the column, where a decanter scheme is drawn: its decanter\n"
             "cooled to T (as decanter --decanter-temperature)"},
    {.name = "--svg", .kind = CLI_STRING, .metavar = "DIR",
     .help = "also write each plot as DIR/<name>.svg"},
    {.name = "--csv", .kind = CLI_STRING, .metavar = "DIR",
     .help = "also write the curves behind the plots as DIR/<name>.csv"},
    {.name = "--compare", .kind = CLI_STRING, .metavar = "FIT.json", .repeatable = true,
     .help = "another model of the same data for the side-by-side table\n"
             "(default: the <stem>.<model>.json files beside FIT.json that\n"
             "`fit --model all` writes)"},
    {.name = "--force", .kind = CLI_FLAG, .help = "replace existing output files"},
    CLI_END,
};

static const cli_option report_json[] = {
    {.name = "--json", .kind = CLI_FLAG,
     .help = "print {\"report\": path, \"plots\": N} on stdout"},
    CLI_END,
};

static const cli_option *const report_blocks[] = {
    report_options, cli_block_pressure, cli_block_products, cli_block_feed,
    cli_block_uncertainty, cli_block_components, cli_block_minimum, cli_block_show_in,
    report_json, NULL,
};

static const cli_spec report_spec = {
    .cmd = "report",
    .synopsis =
        "usage: pinchwise report FIT.json --out REPORT.html [options]\n"
        "\n"
        "Writes one self-contained HTML page (inline SVG plots, no scripts, nothing fetched).\n"
        "With --pressure, --xd, --xb and --zf (all four) it adds the column section: the x-y\n"
        "construction at minimum and operating reflux. With --uncertainty: the azeotrope\n"
        "intervals and, with the column, a \"how sure\" table and a band of sampled\n"
        "equilibrium curves near the pinch.\n",
    .blocks = report_blocks,
    .max_positional = 1,
    .positional = "one fit file",
};

typedef struct report_args {
    bool help; /* --help was asked for: nothing else is set */
    const char *fit, *out, *svg, *csv, *components, *minimum;
    pw_display_units units;  /* --show-in */
    bool json, force, energy;
    double decanter_T_K; /* --decanter-temperature, 0 when not given */
    bool have_P, have_xd, have_xb, have_zf;
    double P_Pa, factor;
    pw_column_spec spec;
    pw_basis basis[3];    /* of xd, xb, zf as given */
    cli_azeo_uncert unc;   /* --uncertainty, --samples, --seed (parsed as the azeotrope command) */
    const char *compare[8]; /* --compare FIT.json (repeatable): other models of the same data */
    size_t n_compare;
} report_args;

#define REPORT_MAX_OTHERS 8

/* Other fit files of the same data: those named by --compare, else the siblings that `fit
 * --model all` writes (<dir>/<stem>.<model>.json beside the fit file). Only files whose dataset
 * SHA-256 equals the report's are kept (a stale sibling would mislead). Returns how many. */
static size_t load_others(const report_args *a, const pw_fit_result *fit, pw_fit_result *out,
                          pw_outset *set)
{
    char paths[REPORT_MAX_OTHERS][PW_PATH_MAX];
    size_t np = 0;
    bool explicit_list = a->n_compare > 0;
    for (size_t i = 0; i < a->n_compare; i++)
        snprintf(paths[np++], PW_PATH_MAX, "%s", a->compare[i]);
    if (!explicit_list) {
        const char *model = fit->sys.model->name;
        size_t len = strlen(a->fit), ml = strlen(model);
        /* ".<model>.json" at the end of the fit file's name */
        if (len > ml + 6 && !strcmp(a->fit + len - 5, ".json") && a->fit[len - ml - 6] == '.' &&
            !strncmp(a->fit + len - ml - 5, model, ml)) {
            size_t nm;
            const pw_model_type *const *all = pw_model_all(&nm);
            for (size_t k = 0; k < nm && np < REPORT_MAX_OTHERS; k++)
                if (all[k] != fit->sys.model)
                    snprintf(paths[np++], PW_PATH_MAX, "%.*s.%s.json", (int)(len - ml - 6), a->fit,
                             all[k]->name);
        }
    }
    size_t n = 0;
    for (size_t i = 0; i < np; i++) {
        if (!explicit_list && access(paths[i], R_OK) != 0)
            continue;
        pw_error err;
        pw_outset_protect(set, paths[i], NULL); /* an input: no output may replace it */
        /* the same component replacement as the report's own fit: one set of vapor pressures */
        if (pw_fitfile_load(paths[i], a->components, &out[n], NULL, &err) != PW_OK) {
            char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
            cli_warnf("report", "%s", pw_error_format(&err, buf, sizeof buf));
            continue;
        }
        if (strcmp(out[n].dataset_sha256, fit->dataset_sha256) != 0) {
            cli_warnf("report", "%s was fitted to other data (dataset SHA-256 differs): left out",
                         paths[i]);
            pw_fit_result_free(&out[n]);
            continue;
        }
        n++;
    }
    return n;
}

/* PW_OK (a->help set when --help was asked for), or PW_EINVAL with err filled. */
static pw_status parse(int argc, char **argv, report_args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    cli_args p;
    if (cli_parse(&report_spec, argc, argv, &p, err) != PW_OK)
        return PW_EINVAL;
    if ((a->help = p.help))
        return PW_OK;
    a->json = cli_has(&p, "--json");
    a->force = cli_has(&p, "--force");
    a->energy = cli_has(&p, "--energy");
    const cli_value *dT = cli_get(&p, "--decanter-temperature");
    if (dT) {
        if (!(dT->num > 0.0)) {
            pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: expected a temperature above absolute "
                         "zero", dT->spelt, dT->text);
            return PW_EINVAL;
        }
        a->decanter_T_K = dT->num;
    }
    cli_azeo_uncert_from(&p, &a->unc);
    a->out = cli_text(&p, "--out");
    a->svg = cli_text(&p, "--svg");
    a->csv = cli_text(&p, "--csv");
    a->components = cli_text(&p, "--components");
    a->minimum = cli_text(&p, "--minimum");
    a->units = cli_show_in_get(&p);
    for (const cli_value *v = cli_next(&p, "--compare", NULL); v;
         v = cli_next(&p, "--compare", v)) {
        if (a->n_compare == REPORT_MAX_OTHERS) {
            pw_error_set(err, PW_EINVAL, NULL, 0, "--compare: at most %d fit files",
                         REPORT_MAX_OTHERS);
            return PW_EINVAL;
        }
        a->compare[a->n_compare++] = v->text;
    }
    const cli_value *f = cli_get(&p, "--factors");
    if (f)
        a->factor = f->list[0];
    a->fit = p.n_pos ? p.pos[0] : NULL;
    cli_targets tg;
    cli_targets_get(&p, &tg, NULL);
    a->P_Pa = tg.P_Pa;
    a->spec = (pw_column_spec){.xd = tg.xd, .xb = tg.xb, .zf = tg.zf, .q = tg.q};
    a->have_P = tg.have_P, a->have_xd = tg.have_xd, a->have_xb = tg.have_xb;
    a->have_zf = tg.have_zf;
    if (!a->fit || !a->out) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "a fit file and --out REPORT.html are required");
        return PW_EINVAL;
    }
    int n_col = a->have_P + a->have_xd + a->have_xb + a->have_zf;
    if (n_col != 0 && n_col != 4) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "the column section needs all of --pressure, --xd, --xb and --zf");
        return PW_EINVAL;
    }
    if (a->energy && n_col == 0) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--energy needs the column options");
        return PW_EINVAL;
    }
    if (a->decanter_T_K > 0.0 && n_col == 0) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--decanter-temperature needs the column options");
        return PW_EINVAL;
    }
    memcpy(a->basis, tg.basis, sizeof a->basis);
    if (a->factor != 0.0 && n_col == 0) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--operating-factor needs the column options");
        return PW_EINVAL;
    }
    return PW_OK;
}

static void progress(const char *what)
{
    if (isatty(STDERR_FILENO))
        fprintf(stderr, "pinchwise report: %s\n", what);
}

pw_status cli_report(int argc, char **argv)
{
    report_args a;
    pw_error err;
    pw_error_clear(&err);
    if (parse(argc, argv, &a, &err) != PW_OK)
        return cli_fail("report", &err);
    if (a.help) {
        cli_help(&report_spec, stdout);
        return PW_OK;
    }
    /* Every output (page, --svg and --csv files) is written all or none, never over an input
     * (by identity: links count), whatever --force says. The page is checked before the work. */
    pw_outset *set = NULL;
    pw_status st = pw_outset_new(a.force, cli_tmp_hooks(), &set, &err);
    const char *inputs[] = {a.fit, a.components};
    for (size_t k = 0; st == PW_OK && k < 2; k++)
        st = pw_outset_protect(set, inputs[k], &err);
    for (size_t k = 0; st == PW_OK && k < a.n_compare; k++)
        st = pw_outset_protect(set, a.compare[k], &err);
    if (st == PW_OK)
        st = pw_outset_check(set, a.out, &err);
    if (st != PW_OK) {
        pw_outset_free(set);
        return cli_fail("report", &err);
    }

    pw_fit_result fit;
    progress("reading the fit file");
    st = cli_read_fit("report", a.fit, a.components, &fit, &err);
    if (st != PW_OK) {
        pw_outset_free(set);
        return cli_fail("report", &err);
    }
    size_t minimum = 0;
    if (cli_apply_minimum("report", a.fit, &fit, a.minimum, &minimum, &err) != PW_OK) {
        pw_fit_result_free(&fit);
        pw_outset_free(set);
        return cli_fail("report", &err);
    }
    if (!fit.converged)
        cli_warnf("report", "%s: the fit did not converge; the report says so on every page", a.fit);
    if (a.have_P) {
        /* targets by mass to mole fractions; the feed between the products, either direction */
        st = cli_targets_to_mole(&a.spec.xd, &a.spec.xb, &a.spec.zf, a.basis, &fit.sys, &err);
        const pw_column_spec *s = &a.spec;
        if (st == PW_OK && !((s->xb < s->zf && s->zf < s->xd) || (s->xd < s->zf && s->zf < s->xb)))
            st = pw_error_set(&err, PW_EINVAL, NULL, 0,
                              "the targets must satisfy xb < zf < xd (component 1 goes overhead) "
                              "or xd < zf < xb (component 1 leaves with the bottoms); got xb %g, "
                              "zf %g, xd %g as mole fractions of component 1",
                              s->xb, s->zf, s->xd);
        if (st != PW_OK) {
            pw_fit_result_free(&fit);
            pw_outset_free(set);
            return cli_fail("report", &err);
        }
    }

    if (a.energy) {
        pw_heat_data heat;
        pw_error herr;
        if (pw_heat_data_from_system(&fit.sys, &heat, &herr) != PW_OK)
            cli_warnf("report", "--energy: %s; the page says so instead of the energy-balance "
                         "column", herr.msg);
    }
    pw_report_input in = pw_report_default_input();
    in.fit = &fit;
    in.fit_path = a.fit;
    in.units = a.units;
    if (a.have_P) {
        in.column = &a.spec;
        in.column_P_Pa = a.P_Pa;
        in.operating_factor = a.factor;
        in.energy = a.energy;
        in.decanter_T_K = a.decanter_T_K;
    }
    cli_progress_ctx pc = {"report", "parameter sets sampled"};
    if (a.unc.on) {
        in.uncertainty = true;
        in.unc = a.unc.opt;
        cli_progress_attach(&in.unc.progress, &in.unc.progress_ctx, &pc);
    }
    pw_fit_result others[REPORT_MAX_OTHERS];
    const pw_fit_result *other_ptr[REPORT_MAX_OTHERS];
    size_t n_others = load_others(&a, &fit, others, set);
    for (size_t i = 0; i < n_others; i++)
        other_ptr[i] = &others[i];
    in.others = other_ptr;
    in.n_others = n_others;
    pw_report *rep = NULL;
    progress("computing curves, tables and plots");
    st = pw_report_build(&in, &rep, &err);
    pw_fit_result_free(&fit);
    for (size_t i = 0; i < n_others; i++)
        pw_fit_result_free(&others[i]);
    if (st != PW_OK) {
        pw_outset_free(set);
        return cli_fail("report", &err);
    }
    progress("writing");
    st = pw_report_stage(rep, set, a.out, a.svg, a.csv, &err);
    if (st == PW_OK)
        st = pw_outset_commit(set, &err);
    pw_outset_free(set);
    size_t plots = pw_report_plot_count(rep);
    pw_report_free(rep);
    if (st != PW_OK)
        return cli_fail("report", &err);
    if (a.json)
        return cli_print_json(a.unc.on ? json_pack("{s:s,s:I,s:b}", "report", a.out, "plots",
                                                      (json_int_t)plots, "uncertainty", 1)
                                          : json_pack("{s:s,s:I}", "report", a.out, "plots",
                                                      (json_int_t)plots));
    progress("done");
    if (!isatty(STDERR_FILENO))
        return PW_OK;
    fprintf(stderr, "pinchwise report: wrote %s with %zu plots\n", a.out, plots);
    return PW_OK;
}
