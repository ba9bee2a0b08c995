/* pinchwise report: one self-contained HTML page of a fit (and a column), optionally the plots
 * as separate SVG files and the curves behind them as CSV. */
#include "azeo_uncert.h"
#include "cli.h"
#include "cli_units.h"

#include <math.h>
#include <pinchwise/enthalpy.h>
#include <pinchwise/fileio.h>
#include <pinchwise/report.h>
#include <stdio.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

static void usage(FILE *f)
{
    fprintf(f,
            "usage: pinchwise report FIT.json --out REPORT.html [options]\n"
            "\n"
            "Writes one self-contained HTML page (inline SVG plots, no scripts, nothing fetched).\n"
            "  --out FILE              the page to write (refused if it exists, unless --force)\n"
            "  --pressure P --xd X --xb X --zf X [--q Q]\n"
            "                          add the column section: x-y construction at pressure P\n"
            "                          (with its unit, e.g. 1atm), compositions of component 1\n"
            "                          (mole fraction, or with mol%%, wt, wt%%), either direction\n"
            "                          (xd < zf < xb: component 1 leaves with the bottoms)\n"
            "  --factors F             R / R_min of the drawn operating line (default 1.3; one\n"
            "                          value; also spelt --operating-factor)\n"
            "  --energy                with the column: also the energy-balance column (needs heat\n"
            "                          data in the component rows)\n"
            "  --uncertainty           add the fit's parameter uncertainty: azeotrope intervals,\n"
            "                          and with the column a \"how sure\" table and a band of\n"
            "                          sampled equilibrium curves near the pinch\n"
            "  --samples N             parameter sets drawn (default 400); --seed N (default 1)\n"
            "  --show-in UNITS         temperature and/or pressure unit of the page, e.g. C,bar\n"
            "                          (default K,kPa; --json output and CSV files unchanged)\n"
            "  --svg DIR               also write each plot as DIR/<name>.svg\n"
            "  --csv DIR               also write the curves behind the plots as DIR/<name>.csv\n"
            PW_CLI_HELP_COMPONENTS
            PW_CLI_HELP_MINIMUM
            "  --compare FIT.json      another model of the same data for the side-by-side table\n"
            "                          (repeatable; default: the <stem>.<model>.json files beside\n"
            "                          FIT.json that `fit --model all` writes)\n"
            "  --force                 replace existing output files\n"
            "  --json                  print {\"report\": path, \"plots\": N} on stdout\n");
}

typedef struct report_args {
    const char *fit, *out, *svg, *csv, *components, *minimum;
    pw_display_units units;  /* --show-in */
    bool json, force, energy;
    bool have_P, have_xd, have_xb, have_zf;
    double P_Pa, factor;
    pw_column_spec spec;
    pw_basis basis[3];    /* of xd, xb, zf as given */
    pw_azeo_uncert unc;   /* --uncertainty, --samples, --seed (parsed as the azeotrope command) */
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
        if (pw_fitfile_read(paths[i], &out[n], &err) != PW_OK) {
            char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 8];
            pw_cli_warnf("report", "%s", pw_error_format(&err, buf, sizeof buf));
            continue;
        }
        if (strcmp(out[n].dataset_sha256, fit->dataset_sha256) != 0) {
            pw_cli_warnf("report", "%s was fitted to other data (dataset SHA-256 differs): left out",
                         paths[i]);
            pw_fit_result_free(&out[n]);
            continue;
        }
        n++;
    }
    return n;
}

/* Returns 0, -1 for --help, or an exit code with err filled. */
static int parse(int argc, char **argv, report_args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    a->units = pw_units_display_default();
    pw_cli_targets tg = {.q = 1.0};
    for (int i = 1; i < argc; i++) {
        const char *v = NULL;
        bool missing = false;
        int rc = 0, trc;
        if (!strcmp(argv[i], "--help") || !strcmp(argv[i], "-h"))
            return -1;
        int urc;
        if (pw_cli_opt(argc, argv, &i, "--json", NULL, NULL)) {
            a->json = true;
        } else if (pw_cli_opt(argc, argv, &i, "--force", NULL, NULL)) {
            a->force = true;
        } else if (pw_cli_opt(argc, argv, &i, "--energy", NULL, NULL)) {
            a->energy = true;
        } else if ((urc = pw_azeo_uncert_opt(argc, argv, &i, &a->unc, err)) != 0) {
            if (urc > 1)
                return urc;
        } else if (!strncmp(argv[i], "--", 2)) {
            const char *opt = argv[i];
            static const char *const known[] = {"--out", "--pressure", "--xd", "--xb", "--zf", "--q",
                                                "--operating-factor", "--factors", "--svg", "--csv",
                                                "--components", "--compare", "--minimum",
                                                "--show-in"};
            bool ok = false;
            for (size_t k = 0; k < sizeof known / sizeof known[0]; k++)
                ok = ok || !strcmp(opt, known[k]);
            if (!ok) {
                pw_error_set(err, PW_EINVAL, NULL, 0, "unknown option %s (see --help)", opt);
                return PW_EXIT_USAGE;
            }
            if (!pw_cli_opt(argc, argv, &i, opt, &v, &missing) || missing) {
                pw_error_set(err, PW_EINVAL, NULL, 0, "%s needs a value", opt);
                return PW_EXIT_USAGE;
            }
            if (!strcmp(opt, "--out"))
                a->out = v;
            else if (!strcmp(opt, "--svg"))
                a->svg = v;
            else if (!strcmp(opt, "--csv"))
                a->csv = v;
            else if (!strcmp(opt, "--components"))
                a->components = v;
            else if (!strcmp(opt, "--minimum"))
                a->minimum = v;
            else if (!strcmp(opt, "--show-in"))
                rc = pw_units_display_parse(v, &a->units, err) == PW_OK ? 0 : PW_EXIT_USAGE;
            else if (!strcmp(opt, "--compare")) {
                if (a->n_compare == REPORT_MAX_OTHERS) {
                    pw_error_set(err, PW_EINVAL, NULL, 0, "--compare: at most %d fit files",
                                 REPORT_MAX_OTHERS);
                    return PW_EXIT_USAGE;
                }
                a->compare[a->n_compare++] = v;
            }
            else if ((trc = pw_cli_target_opt(opt, v, &tg, err)) >= 0) {
                rc = trc; /* --pressure, --xd, --xb, --zf, --q: parsed into tg */
            } else if (!strcmp(opt, "--operating-factor") || !strcmp(opt, "--factors")) {
                if (strchr(v, ',')) {
                    pw_error_set(err, PW_EINVAL, NULL, 0,
                                 "%s %s: the report draws one operating line; give one factor", opt,
                                 v);
                    return PW_EXIT_USAGE;
                }
                rc = pw_cli_number(opt, v, &a->factor, err) == PW_OK ? 0 : PW_EXIT_USAGE;
                if (!rc && !(a->factor > 1.0 && a->factor <= 100.0)) {
                    pw_error_set(err, PW_EINVAL, NULL, 0,
                                 "--operating-factor %s: R / R_min must be greater than 1 and at "
                                 "most 100", v);
                    rc = PW_EXIT_USAGE;
                }
            }
        } else if (a->fit) {
            pw_error_set(err, PW_EINVAL, NULL, 0, "unexpected argument %s (one fit file)", argv[i]);
            return PW_EXIT_USAGE;
        } else {
            a->fit = argv[i];
        }
        if (rc)
            return rc;
    }
    a->P_Pa = tg.P_Pa;
    a->spec = (pw_column_spec){.xd = tg.xd, .xb = tg.xb, .zf = tg.zf, .q = tg.q};
    a->have_P = tg.have_P, a->have_xd = tg.have_xd, a->have_xb = tg.have_xb;
    a->have_zf = tg.have_zf;
    if (!a->fit || !a->out) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "a fit file and --out REPORT.html are required");
        return PW_EXIT_USAGE;
    }
    int n_col = a->have_P + a->have_xd + a->have_xb + a->have_zf;
    if (n_col != 0 && n_col != 4) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "the column section needs all of --pressure, --xd, --xb and --zf");
        return PW_EXIT_USAGE;
    }
    if (a->energy && n_col == 0) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--energy needs the column options");
        return PW_EXIT_USAGE;
    }
    memcpy(a->basis, tg.basis, sizeof a->basis);
    if (a->factor != 0.0 && n_col == 0) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--operating-factor needs the column options");
        return PW_EXIT_USAGE;
    }
    return 0;
}

static void progress(const char *what)
{
    if (isatty(STDERR_FILENO))
        fprintf(stderr, "pinchwise report: %s\n", what);
}

int pw_cli_report(int argc, char **argv)
{
    report_args a;
    pw_error err;
    pw_error_clear(&err);
    int rc = parse(argc, argv, &a, &err);
    if (rc < 0) {
        usage(stdout);
        return 0;
    }
    if (rc)
        return pw_cli_fail("report", &err);
    /* Every output (page, --svg and --csv files) is written all or none, never over an input
     * (by identity: links count), whatever --force says. The page is checked before the work. */
    pw_outset *set = NULL;
    pw_status st = pw_outset_new(a.force, pw_cli_tmp_hooks(), &set, &err);
    const char *inputs[] = {a.fit, a.components};
    for (size_t k = 0; st == PW_OK && k < 2; k++)
        st = pw_outset_protect(set, inputs[k], &err);
    for (size_t k = 0; st == PW_OK && k < a.n_compare; k++)
        st = pw_outset_protect(set, a.compare[k], &err);
    if (st == PW_OK)
        st = pw_outset_check(set, a.out, &err);
    if (st != PW_OK) {
        pw_outset_free(set);
        return pw_cli_fail("report", &err);
    }

    pw_fit_result fit;
    progress("reading the fit file");
    st = pw_cli_read_fit("report", a.fit, a.components, &fit, &err);
    if (st != PW_OK) {
        pw_outset_free(set);
        return pw_cli_fail("report", &err);
    }
    size_t minimum = 0;
    if (pw_cli_apply_minimum("report", &fit, a.minimum, &minimum, &err) != PW_OK) {
        pw_fit_result_free(&fit);
        pw_outset_free(set);
        return pw_cli_fail("report", &err);
    }
    if (!fit.converged)
        pw_cli_warnf("report", "%s: the fit did not converge; the report says so on every page", a.fit);
    if (a.have_P) {
        /* targets by mass to mole fractions; the feed between the products, either direction */
        st = pw_cli_targets_to_mole(&a.spec.xd, &a.spec.xb, &a.spec.zf, a.basis, &fit.sys, &err);
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
            return pw_cli_fail("report", &err);
        }
    }

    if (a.energy) {
        pw_heat_data heat;
        pw_error herr;
        if (pw_heat_data_from_system(&fit.sys, &heat, &herr) != PW_OK)
            pw_cli_warnf("report", "--energy: %s; the page says so instead of the energy-balance "
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
    }
    pw_cli_progress_ctx pc = {"report", "parameter sets sampled"};
    if (a.unc.on) {
        in.uncertainty = true;
        in.unc = a.unc.opt;
        if (pw_cli_progress_wanted()) {
            in.unc.progress = pw_cli_progress_tenths;
            in.unc.progress_ctx = &pc;
        }
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
        return pw_cli_fail("report", &err);
    }
    progress("writing");
    st = pw_report_stage(rep, set, a.out, a.svg, a.csv, &err);
    if (st == PW_OK)
        st = pw_outset_commit(set, &err);
    pw_outset_free(set);
    size_t plots = pw_report_plot_count(rep);
    pw_report_free(rep);
    if (st != PW_OK)
        return pw_cli_fail("report", &err);
    if (a.json)
        return pw_cli_print_json(a.unc.on ? json_pack("{s:s,s:I,s:b}", "report", a.out, "plots",
                                                      (json_int_t)plots, "uncertainty", 1)
                                          : json_pack("{s:s,s:I}", "report", a.out, "plots",
                                                      (json_int_t)plots));
    progress("done");
    if (!isatty(STDERR_FILENO))
        return 0;
    fprintf(stderr, "pinchwise report: wrote %s with %zu plots\n", a.out, plots);
    return 0;
}
