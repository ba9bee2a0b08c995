/* pinchwise study: the whole study of one data file and one split in one command.
 *
 * Steps, each done by the library through the same code as the single commands: consistency of
 * the data (check), every model fitted (fit --model all) or the one named, the model chosen by
 * the rule of `fit --model all` (converged fits first, those predicting a liquid split among them
 * only when the data hold three-phase points or tie lines; then lowest AICc; pinchwise/assess.h)
 * unless --model names one, the azeotropes at the data's condition and at the column
 * pressure (azeotrope), the column with its design table (reflux, either split direction),
 * optionally the fit's uncertainty (--uncertainty), and the HTML report with every model side by
 * side (report). One progress display on a terminal, one summary (or one JSON object), one exit
 * status. */
#include "cli.h"
#include "cli_units.h"
#include "cli_options.h"
#include "fit_common.h"
#include "column_common.h"
#include "column_uncert.h"

#include <errno.h>
#include <math.h>
#include <pinchwise/assess.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/commands.h>
#include <pinchwise/composition.h>
#include <pinchwise/consistency.h>
#include <pinchwise/dataset.h>
#include <pinchwise/hetcheck.h>
#include <pinchwise/report.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>

#define CMD "study"
#define STUDY_STEPS 6

static const cli_option study_options[] = {
    {.name = "--model", .kind = CLI_STRING, .metavar = "MODEL",
     .help = "take this model instead of choosing (any model of fit,\n"
             "in any case); default: every model is fitted and rank 1 of\n"
             "the ranking of fit --model all is chosen"},
    {.name = "--out-dir", .kind = CLI_STRING, .metavar = "DIR",
     .help = "folder for the fit files and the report (default: study)"},
    {.name = "--force", .kind = CLI_FLAG, .help = "replace existing fit files and report"},
    {.name = "--lle", .kind = CLI_STRING, .metavar = "LLE.csv",
     .help = "measured tie lines fitted together with the data, as fit --lle\n"
             "(models that cannot split are then left out of the choice)"},
    CLI_END,
};

static const cli_option *const study_blocks[] = {
    cli_block_pressure, cli_block_products, cli_block_feed, study_options,
    cli_block_factors, cli_block_uncertainty, cli_block_components,
    cli_block_verdict, cli_block_show_in, cli_block_json, NULL,
};

static const cli_spec study_spec = {
    .cmd = CMD,
    .synopsis =
        "usage: pinchwise study DATA.csv --pressure P --xd X --xb X --zf X [options]\n"
        "\n"
        "The whole study in one command: consistency of the data, every model fitted and\n"
        "one chosen, azeotropes, minimum reflux with the design table, optionally the\n"
        "uncertainty, and the HTML report, written into one folder.\n",
    .blocks = study_blocks,
    .max_positional = 1,
    .positional = "one data file",
};

typedef struct study_args {
    bool help; /* --help was asked for: nothing else is set */
    const char *data, *model_name, *out_dir, *components, *lle;
    bool json, force, uncertainty, exit_verdict;
    cli_args opts; /* the column options, read again by cli_column_args_from */
} study_args;

/* PW_OK (a->help set when --help was asked for), or PW_EINVAL with err filled. */
static pw_status parse(int argc, char **argv, study_args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    if (cli_parse(&study_spec, argc, argv, &a->opts, err) != PW_OK)
        return PW_EINVAL;
    const cli_args *p = &a->opts;
    if ((a->help = p->help))
        return PW_OK;
    a->json = cli_has(p, "--json");
    a->force = cli_has(p, "--force");
    a->uncertainty = cli_has(p, "--uncertainty");
    a->exit_verdict = cli_has(p, "--exit-verdict");
    a->model_name = cli_text(p, "--model");
    a->out_dir = cli_text(p, "--out-dir");
    if (!a->out_dir)
        a->out_dir = "study";
    a->components = cli_text(p, "--components");
    a->lle = cli_text(p, "--lle");
    a->data = p->n_pos ? p->pos[0] : NULL;
    if (!a->data) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "a data file is required");
        return PW_EINVAL;
    }
    return PW_OK;
}

static void step(const char *what, size_t k)
{
    cli_progress_line(CMD, what, k, STUDY_STEPS);
}

/* Consistency of the data, as `check` runs it. */
static pw_status consistency(const study_args *a, const pw_complib *lib, pw_consistency_result *cr,
                             pw_error *err)
{
    pw_dataset ds;
    pw_status st = pw_dataset_read(a->data, &ds, err);
    if (st != PW_OK)
        return st;
    pw_component comp[2];
    st = pw_dataset_components(lib, &ds, comp, err); /* as `check` finds them */
    if (st == PW_OK)
        st = pw_dataset_to_mole(&ds, &comp[0], &comp[1], err);
    pw_het_check het; /* three-phase points out of the one-liquid tests, as check does */
    if (st == PW_OK && (st = pw_check_data(&ds, &comp[0], &comp[1], NULL, &het, cr, err)) == PW_OK)
        pw_het_check_free(&het, NULL);
    pw_dataset_free(&ds);
    return st;
}

typedef struct model_fit {
    const pw_model_type *model;
    pw_status rc;
    pw_fit_result r;
    char path[PW_PATH_MAX];
    pw_error err;
} model_fit;

/* The azeotropes of one pw_azeotrope_search, as the azeotrope command lists them. */
typedef struct study_az {
    bool ok;
    pw_rank_az az[PW_AZ_MAX + 1];
    size_t n;
} study_az;

static void az_search(const pw_system *s, pw_az_mode mode, double fixed, study_az *out)
{
    pw_az_result r;
    pw_three_phase tp;
    out->ok = pw_azeotrope_search(s, (int)mode, fixed, &r, &tp, NULL, NULL) == PW_OK;
    out->n = out->ok ? pw_rank_az_list(&r, &tp, out->az) : 0;
}

static void az_text(const char *where, const study_az *r, const pw_display_units *u)
{
    char bT[48], bP[48];
    printf("  azeotropes %s: ", where);
    if (!r->ok) {
        printf("not found: the search failed\n");
        return;
    }
    if (r->n == 0)
        printf("none\n");
    for (size_t i = 0; i < r->n; i++)
        printf("%s%s%s at x1 = %.4f, T = %s, P = %s%s", i ? "; " : "",
               pw_az_kind_name(r->az[i].kind), r->az[i].heterogeneous ? " heterogeneous" : "",
               r->az[i].x1,
               pw_units_display_value(u, PW_SHOW_T, ".2f", r->az[i].T_K, bT, sizeof bT),
               pw_units_display_value(u, PW_SHOW_P, ".4g", r->az[i].P_Pa, bP, sizeof bP),
               i + 1 == r->n ? "\n" : "");
}

pw_status cli_study(int argc, char **argv)
{
    study_args a;
    pw_error err;
    pw_error_clear(&err);
    if (parse(argc, argv, &a, &err) != PW_OK)
        return cli_fail(CMD, &err);
    if (a.help) {
        cli_help(&study_spec, stdout);
        return PW_OK;
    }
    pw_status rc = PW_OK;
    const pw_model_type *only = NULL;
    char names[256];
    if (a.model_name && !(only = pw_model_find(a.model_name)))
        return cli_failf(CMD, PW_EINVAL,
                            "unknown model '%s' (expected one of %s)", a.model_name,
                            pw_model_names(names, sizeof names));
    /* the column options are checked before any work, by the reflux parser itself */
    cli_column_args ra;
    if (cli_column_args_from(&a.opts, a.data /* a placeholder */, &ra, &err) != PW_OK)
        return cli_fail(CMD, &err);
    if (mkdir(a.out_dir, 0755) != 0 && errno != EEXIST)
        return cli_failf(CMD, PW_EIO, "%s: cannot create the folder",
                            a.out_dir);

    pw_complib lib;
    if (cli_load_components(&lib, a.components, &err) != PW_OK)
        return cli_fail(CMD, &err);

    /* 1. consistency */
    step("checking the data", 1);
    pw_consistency_result cr;
    memset(&cr, 0, sizeof cr);
    pw_status st = consistency(&a, &lib, &cr, &err);
    if (st != PW_OK) {
        pw_complib_free(&lib);
        return cli_fail(CMD, &err);
    }

    /* 2. fits */
    step("fitting the models", 2);
    size_t n_models = 1;
    const pw_model_type *const *models = only ? &only : pw_model_all(&n_models);
    model_fit *fits = calloc(n_models, sizeof *fits);
    if (!fits) {
        pw_consistency_result_free(&cr);
        pw_complib_free(&lib);
        return cli_failf(CMD, PW_ENOMEM, "out of memory");
    }
    cli_fit_opts co;
    memset(&co, 0, sizeof co);
    co.fit = pw_fit_default_options();
    co.lib = &lib;
    co.force = a.force;
    co.quiet = true;
    pw_lle_dataset ties;
    memset(&ties, 0, sizeof ties);
    if (a.lle) {
        pw_error lerr;
        if (pw_lle_dataset_read(a.lle, &ties, &lerr) != PW_OK) {
            free(fits);
            pw_consistency_result_free(&cr);
            pw_complib_free(&lib);
            return cli_fail(CMD, &lerr);
        }
        co.lle = &ties;
        co.inputs[co.n_inputs++] = a.lle;
    }
    size_t best = 0;
    char chosen_because[512] = "the only model fitted";
    for (size_t i = 0; i < n_models; i++) {
        fits[i].model = models[i];
        pw_error_clear(&fits[i].err);
        fits[i].rc = cli_fit_one(a.data, models[i], NULL, a.out_dir, &co, &fits[i].r, fits[i].path,
                                sizeof fits[i].path, &fits[i].err);
    }
    pw_lle_dataset_free(&ties); /* the fits hold what they need of the tie lines */
    co.lle = NULL;
    /* the one ranking rule of `fit --model all` and the report (pinchwise/assess.h) */
    {
        const pw_fit_result *ok[PW_RANK_MAX];
        size_t map[PW_RANK_MAX], n_ok = 0;
        for (size_t i = 0; i < n_models && n_ok < PW_RANK_MAX; i++)
            if (fits[i].rc == 0) {
                ok[n_ok] = &fits[i].r;
                map[n_ok++] = i;
            }
        pw_ranking *rk = n_ok ? malloc(sizeof *rk) : NULL;
        if (rk && pw_rank_fits(ok, n_ok, rk) == PW_OK && rk->n > 0) {
            best = map[rk->rows[0].index];
            snprintf(chosen_because, sizeof chosen_because, "rank 1 by the rule of fit --model all: %s",
                     pw_rank_rule_text(rk));
        } else if (n_ok)
            best = map[0];
        free(rk);
    }
    model_fit *chosen = &fits[best];
    if (chosen->rc != 0) {
        rc = cli_fail(CMD, &chosen->err);
        goto out;
    }

    /* 3. the column, 4. its uncertainty */
    step("solving the column", 3);
    cli_column_args_from(&a.opts, chosen->path, &ra, &err);
    ra.components = a.components;
    cli_column_run run;
    if ((rc = cli_column_compute(&ra, &run, &err)) != PW_OK) {
        rc = cli_fail(CMD, &err);
        goto out;
    }
    step(a.uncertainty ? "propagating the uncertainty" : "no uncertainty asked for", 4);
    cli_column_uncert unc;
    memset(&unc, 0, sizeof unc);
    if (ra.unc.on || ra.n_compare) {
        if ((rc = cli_column_uncert_run(&ra, &run, &unc, &err)) != PW_OK) {
            cli_column_run_free(&run);
            rc = cli_fail(CMD, &err);
            goto out;
        }
    }
    run.with_uncertainty = a.uncertainty;

    /* 5. azeotropes at the data's condition and at the column pressure */
    step("finding the azeotropes", 5);
    const pw_fit_result *f = &run.fit;
    bool iso = f->kind == PW_DATA_ISOTHERMAL;
    study_az az_data, az_col; /* pw_azeotrope_search: the azeotrope command's search */
    az_search(&f->sys, iso ? PW_AZ_ISOTHERMAL : PW_AZ_ISOBARIC, iso ? f->T_fixed_K : f->P_fixed_Pa,
              &az_data);
    az_search(&f->sys, PW_AZ_ISOBARIC, run.P_Pa, &az_col);

    /* 6. the report, with the other models side by side */
    step("writing the report", 6);
    char report_path[PW_PATH_MAX];
    {
        const char *base = strrchr(a.data, '/');
        base = base ? base + 1 : a.data;
        char stem[PW_PATH_MAX];
        snprintf(stem, sizeof stem, "%s", base);
        char *dot = strrchr(stem, '.');
        if (dot && dot != stem)
            *dot = '\0';
        if (snprintf(report_path, sizeof report_path, "%s/%s.report.html", a.out_dir, stem) >=
            (int)sizeof report_path) {
            cli_column_run_free(&run);
            rc = cli_failf(CMD, PW_EINVAL, "output path too long");
            goto out;
        }
    }
    pw_report_input in = pw_report_default_input();
    in.fit = f;
    in.fit_path = chosen->path;
    in.column = &run.spec;
    in.column_P_Pa = run.P_Pa;
    /* the drawn operating line: 1.3 R_min when among the factors, else the first (as the
     * uncertainty text of reflux) */
    in.operating_factor = ra.opt.n_factors ? ra.opt.factors[0] : 0.0;
    for (size_t k = 0; k < ra.opt.n_factors; k++)
        if (fabs(ra.opt.factors[k] - 1.3) < 1e-12)
            in.operating_factor = 1.3;
    in.uncertainty = a.uncertainty;
    in.units = ra.units;
    const pw_fit_result *others[8];
    size_t n_others = 0;
    for (size_t i = 0; i < n_models && n_others < 8; i++)
        if (i != best && fits[i].rc == 0)
            others[n_others++] = &fits[i].r;
    in.others = others;
    in.n_others = n_others;
    pw_report *rep = NULL;
    st = pw_report_build(&in, &rep, &err);
    if (st == PW_OK)
        st = pw_report_save_html(rep, report_path, a.force, &err);
    pw_report_free(rep);
    if (st != PW_OK) {
        cli_column_run_free(&run);
        rc = cli_fail(CMD, &err);
        goto out;
    }

    cli_column_warn(&run);
    if (a.json) {
        json_t *o = json_object();
        json_object_set_new(o, "dataset", json_string(a.data));
        json_object_set_new(o, "consistent", json_boolean(cr.consistent));
        json_t *ms = json_array();
        for (size_t i = 0; i < n_models; i++) {
            json_t *m = json_object();
            json_object_set_new(m, "model", json_string(fits[i].model->name));
            json_object_set_new(m, "fitted", json_boolean(fits[i].rc == 0));
            if (fits[i].rc == 0) {
                json_object_set_new(m, "converged", json_boolean(fits[i].r.converged));
                json_object_set_new(m, "liquid_split", json_boolean(fits[i].r.split));
                json_object_set_new(m, "aicc", cli_json_num(fits[i].r.aicc));
                json_object_set_new(m, "fit_file", json_string(fits[i].path));
            } else {
                json_object_set_new(m, "error", json_string(fits[i].err.msg));
            }
            json_object_set_new(m, "chosen", json_boolean(i == best));
            json_array_append_new(ms, m);
        }
        json_object_set_new(o, "models", ms);
        json_object_set_new(o, "chosen_model", json_string(chosen->model->name));
        json_object_set_new(o, "chosen_because",
                            json_string(only ? "named with --model" : chosen_because));
        json_object_set_new(o, "azeotropes_at_data_condition",
                            pw_rank_az_json(az_data.az, az_data.n, az_data.ok));
        json_object_set_new(o, "azeotropes_at_column_pressure",
                            pw_rank_az_json(az_col.az, az_col.n, az_col.ok));
        json_t *rj = cli_column_json(&run);
        if (ra.unc.on || ra.n_compare)
            cli_column_uncert_json(&unc, rj);
        json_object_set_new(o, "reflux", rj);
        json_object_set_new(o, "report", json_string(report_path));
        rc = cli_print_json(o);
    } else {
        printf("study of %s (%s / %s), written to %s\n", a.data, f->sys.comp[0].name,
               f->sys.comp[1].name, a.out_dir);
        printf("  data                  %s by the consistency tests\n",
               cr.consistent ? "consistent" : "NOT SHOWN CONSISTENT");
        printf("  models                ");
        for (size_t i = 0; i < n_models; i++) {
            if (fits[i].rc == 0)
                printf("%s%s AICc %.4g%s%s", i ? ", " : "", fits[i].model->name, fits[i].r.aicc,
                       fits[i].r.converged ? "" : " (not converged)",
                       !fits[i].r.split                  ? ""
                       : pw_rank_split_allowed(&fits[i].r) ? " (predicts a liquid split, allowed: "
                                                             "two liquids measured)"
                                                           : " (predicts a liquid split)");
            else
                printf("%s%s failed", i ? ", " : "", fits[i].model->name);
        }
        printf("\n  chosen                %s (%s)\n", chosen->model->name,
               only ? "named with --model" : chosen_because);
        az_text("at the data's condition", &az_data, &ra.units);
        az_text("at the column pressure", &az_col, &ra.units);
        const pw_column_result *c = &run.col;
        char why[PW_REASON_MAX + 64];
        if (!c->feasible) {
            printf("  column                NOT FEASIBLE by simple distillation: %s\n",
                   pw_units_display_text(&ra.units, c->reason, why, sizeof why));
        } else {
            printf("  minimum reflux        R_min %.5g, %s pinch in the %s section at x = %.4f\n",
                   c->r_min, c->pinch.kind == PW_PINCH_FEED ? "feed" : "tangent",
                   c->pinch.section == PW_SECTION_RECTIFYING ? "rectifying" : "stripping",
                   c->pinch.x);
            /* the design rows are pw_reflux_design's (run.design), as reflux prints them */
            const pw_design_table *dt = &run.design;
            printf("  stages                %.3f at total reflux", c->n_min);
            for (size_t i = 0; i < dt->n; i++) {
                const pw_design_case *d = &dt->row[i];
                if (d->reachable)
                    printf("; %.3f at %.3g R_min (feed stage %d)", d->stages, d->factor,
                           d->feed_stage);
                else
                    printf("; none at %.3g R_min (%s)", d->factor, pw_strerror(d->why));
            }
            printf("\n");
        }
        if (ra.unc.on || ra.n_compare)
            cli_column_uncert_print(&unc, &run);
        printf("  report                %s\n", report_path);
        printf("\n  Screening estimate only: verify with rigorous simulation and pilot data; size\n"
               "  equipment and relief per local codes under licensed engineering review.\n");
        rc = fflush(stdout) ? PW_EIO : 0;
    }
    if (rc == PW_OK && a.exit_verdict && (!run.col.feasible || !cr.consistent))
        rc = PW_EINFEASIBLE;
    cli_column_run_free(&run);
out:
    for (size_t i = 0; i < n_models; i++)
        if (fits[i].rc == 0)
            pw_fit_result_free(&fits[i].r);
    free(fits);
    pw_consistency_result_free(&cr);
    pw_complib_free(&lib);
    return rc;
}
