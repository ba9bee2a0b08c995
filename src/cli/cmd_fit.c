/* pinchwise fit: one dataset (one model or all), or a folder of datasets (batch). */
#include "cli.h"
#include "cli_options.h"
#include "cli_units.h"
#include "fit_batch.h"
#include "fit_common.h"

#include <errno.h>
#include <math.h>
#include <pinchwise/fitjson.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>

#define FIT_MAX_STARTS 10000.0

/* --exclude 12,15-17: file line numbers (a file of at most 64 MiB has fewer than 1e9 lines). */
#define EXCLUDE_MAX_LINE 1000000000L

static int parse_lines(const char *text, pw_fit_options *o, pw_error *err)
{
    const char *p = text;
    while (*p) {
        char *end = (char *)(uintptr_t)p; /* "nothing read" unless strtol runs */
        errno = 0;
        long a = (*p >= '0' && *p <= '9') ? strtol(p, &end, 10) : 0, b = a;
        if (end == p || a <= 0 || a > EXCLUDE_MAX_LINE || errno == ERANGE)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "--exclude %s: expected line numbers from 1 to %ld such as 12,15-17",
                                text, EXCLUDE_MAX_LINE);
        p = end;
        if (*p == '-') {
            errno = 0;
            end = (char *)(uintptr_t)(p + 1);
            b = (p[1] >= '0' && p[1] <= '9') ? strtol(p + 1, &end, 10) : 0;
            if (end == p + 1 || b < a || b > EXCLUDE_MAX_LINE || errno == ERANGE)
                return pw_error_set(err, PW_EINVAL, NULL, 0,
                                    "--exclude %s: a range must read FIRST-LAST (line numbers from 1 "
                                    "to %ld)",
                                    text, EXCLUDE_MAX_LINE);
            p = end;
        }
        if ((size_t)(b - a) >= (size_t)PW_FIT_MAX_EXCLUDE - o->n_exclude)
            return pw_error_set(err, PW_EINVAL, NULL, 0, "--exclude: at most %d lines",
                                PW_FIT_MAX_EXCLUDE);
        for (long l = a; l <= b; l++)
            o->exclude_lines[o->n_exclude++] = l;
        if (*p == ',')
            p++;
        else if (*p)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "--exclude %s: expected line numbers such as 12,15-17", text);
    }
    return PW_OK;
}

/* --sigma-T and --sigma-P with the data file's syntax (cli_uncertainty_opt) within the ranges
 * of docs/inputs.md ("Command-line numbers"): a temperature difference from 0.0001 to 50 K; a
 * pressure uncertainty from 0.0001 to 50 % or a positive absolute one up to 1 MPa. */
static pw_status sigma_opt(const char *opt, const char *text, pw_fit_options *fo, pw_error *err)
{
    bool isT = !strcmp(opt, "--sigma-T");
    double T = NAN, rel = NAN, abs_Pa = NAN;
    pw_error inner;
    pw_error_clear(&inner);
    pw_status st = strpbrk(text, "xX") ? PW_EINVAL /* no hexadecimal numbers */
                                       : cli_uncertainty_opt(opt, text, &T, &rel, &abs_Pa,
                                                                &inner);
    bool ok = st == PW_OK &&
              (isT ? (isfinite(T) && T >= 1e-4 && T <= 50.0)
                   : (isfinite(rel) ? rel >= 1e-6 && rel <= 0.5
                                    : isfinite(abs_Pa) && abs_Pa > 0.0 && abs_Pa <= 1e6));
    if (!ok)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: expected %s%s%s%s", opt, text,
                            isT ? "a temperature difference from 0.0001 to 50 K with its unit "
                                  "(K, C, F), e.g. 0.05K"
                                : "a pressure uncertainty from 0.0001 to 50 % (a bare number is "
                                  "percent) or an absolute one with its unit, e.g. 0.2% or 0.05kPa",
                            inner.msg[0] ? " (" : "", inner.msg, inner.msg[0] ? ")" : "");
    if (isT) {
        fo->sigma_T_K = T;
    } else {
        fo->sigma_P_rel = rel;
        fo->sigma_P_abs_Pa = abs_Pa;
    }
    return PW_OK;
}

static const cli_option fit_options[] = {
    {.name = "--model", .kind = CLI_STRING, .metavar = "MODEL",
     .help = "the activity model (see above; any case), or all"},
    {.name = "--out", .kind = CLI_STRING, .metavar = "FIT.json",
     .help = "fit file to write (default fits/<stem>.<model>.json)"},
    {.name = "--out-dir", .kind = CLI_STRING, .metavar = "DIR",
     .help = "folder for the fit files (batch, or --model all)"},
    {.name = "--force", .kind = CLI_FLAG, .help = "replace an existing fit file"},
    {.name = "--alpha", .kind = CLI_NUMBER, .metavar = "A", .lo = 0.001, .hi = 1.0,
     .what = "an NRTL non-randomness", .help = "NRTL non-randomness when fixed (default 0.3)"},
    {.name = "--fit-alpha", .kind = CLI_FLAG, .help = "NRTL: fit alpha as well"},
    {.name = "--vapor", .kind = CLI_STRING, .metavar = "MODEL",
     .help = "ideal (default) or virial (Tsonopoulos second virial\n"
             "coefficients; needs Tc_K, Pc_kPa, omega, Zc, Vc_cm3_mol)"},
    {.name = "--starts", .kind = CLI_INTEGER, .metavar = "N", .lo = 1.0, .hi = FIT_MAX_STARTS,
     .help = "LM runs, each from its own start, 1 to 10000 (default 8)"},
    {.name = "--seed", .kind = CLI_INTEGER, .metavar = "N", .lo = 0.0, .hi = 4294967295.0,
     .help = "seed of the start points, 0 to 4294967295 (default 1)"},
    {.name = "--sigma-T", .kind = CLI_STRING, .metavar = "DT",
     .help = "temperature uncertainty, e.g. 0.05K (default: file or 0.1 K)"},
    {.name = "--sigma-P", .kind = CLI_STRING, .metavar = "DP",
     .help = "pressure uncertainty, 0.2% or 0.05kPa, as in the file's\n"
             "sigma_P (a bare number is percent; default: file or 0.1%)"},
    {.name = "--sigma-y", .kind = CLI_NUMBER, .metavar = "DY", .lo = 1e-6, .hi = 0.5,
     .what = "a mole-fraction uncertainty",
     .help = "vapor mole fraction uncertainty (default: file or 0.004)"},
    {.name = "--exclude", .kind = CLI_STRING, .metavar = "LINES", .repeatable = true,
     .help = "file line numbers to leave out, e.g. 12,15-17"},
    {.name = "--exclude-reason", .kind = CLI_STRING, .metavar = "TEXT",
     .help = "why they are left out (recorded in the fit file)"},
    {.name = "--lle", .kind = CLI_STRING, .metavar = "LLE.csv",
     .help = "measured tie lines (T[UNIT], x1_I, x1_II; or w1_I, w1_II as mass\n"
             "fractions) fitted together with the VLE data (not with wilson,\n"
             "which cannot split)"},
    CLI_END,
};

static const cli_option *const fit_blocks[] = {
    fit_options, cli_block_components, cli_block_show_in, cli_block_json, NULL,
};

static void usage(FILE *f, const cli_spec *spec)
{
    char names[256];
    fprintf(f,
            "usage: pinchwise fit DATA.csv --model MODEL [options]\n"
            "       pinchwise fit DIR --model MODEL --out-dir OUTDIR [options]   (every *.csv in DIR)\n"
            "\n"
            "MODEL: %s (any case), or all (fit every\n"
            "model, rank by AICc; with a folder, every model of every file; with one file,\n"
            "--out-dir not --out)\n",
            pw_model_names(names, sizeof names));
    cli_help(spec, f);
}

static const cli_spec fit_spec = {
    .cmd = "fit",
    .synopsis = "", /* the model names are printed by usage() above it */
    .blocks = fit_blocks,
    .max_positional = 1,
    .positional = "one dataset or folder",
};

static void print_table(const pw_fit_result *r, const char *path, const pw_display_units *u)
{
    char tref[48];
    const pw_model_type *m = r->sys.model;
    printf("%s fit of %s (1) / %s (2), %s data, %zu points\n", m->name, r->sys.comp[0].name,
           r->sys.comp[1].name, r->kind == PW_DATA_ISOBARIC ? "isobaric" : "isothermal", r->n_pts);
    printf("  converged: %s (%s; %s), %zu LM iterations over %zu starts\n",
           r->converged ? "yes" : "NO", pw_fit_class_name(r->fit_class), pw_fit_stop_name(r->stop),
           r->iterations, r->n_runs);
    printf("  %-10s %14s %12s %27s\n", "parameter", "value", "std. error", "95% interval");
    for (size_t k = 0; k < m->n_params; k++) {
        if (r->fitted[k])
            printf("  %-10s %14.6g %12.4g   [%11.6g, %11.6g]\n", m->param_names[k], r->sys.params[k],
                   r->stderr_[k], r->ci95[k][0], r->ci95[k][1]);
        else
            printf("  %-10s %14.6g %12s   (held fixed)\n", m->param_names[k], r->sys.params[k], "-");
    }
    size_t idx[PW_MAX_PARAMS], nf = 0;
    for (size_t k = 0; k < m->n_params; k++)
        if (r->fitted[k])
            idx[nf++] = k;
    for (size_t a = 0; a < nf; a++)
        for (size_t b = a + 1; b < nf; b++)
            printf("  correlation %s/%s: %+.3f%s\n", m->param_names[idx[a]], m->param_names[idx[b]],
                   r->corr[idx[a]][idx[b]],
                   fabs(r->corr[idx[a]][idx[b]]) > PW_DIAG_CORRELATION ? "  (poorly identifiable)"
                                                                       : "");
    printf("  ln gamma_inf at %s: %.4f (1 in 2), %.4f (2 in 1)\n",
           pw_units_display_value(u, PW_SHOW_T, ".2f", r->sys.T_ref_K, tref, sizeof tref),
           r->lngamma_inf[0], r->lngamma_inf[1]);
    if (r->has_y)
        printf("  y:  AAD %.4f  bias %+.4f  max %.4f (line %ld)\n", r->dev_y.aad, r->dev_y.bias,
               r->dev_y.max_abs, r->dev_y.max_line);
    if (r->kind == PW_DATA_ISOBARIC)
        printf("  T:  AAD %.3f %s  bias %+.3f %s  max %.3f %s (line %ld)\n",
               pw_units_display_dT(u, r->dev_T_K.aad), pw_units_display_dT_symbol(u),
               pw_units_display_dT(u, r->dev_T_K.bias), pw_units_display_dT_symbol(u),
               pw_units_display_dT(u, r->dev_T_K.max_abs), pw_units_display_dT_symbol(u),
               r->dev_T_K.max_line);
    else
        printf("  P:  AAD %.4g %s  bias %+.4g %s  max %.4g %s (line %ld)\n",
               pw_units_display_P(u, r->dev_P_Pa.aad), pw_units_display_P_symbol(u),
               pw_units_display_P(u, r->dev_P_Pa.bias), pw_units_display_P_symbol(u),
               pw_units_display_P(u, r->dev_P_Pa.max_abs), pw_units_display_P_symbol(u),
               r->dev_P_Pa.max_line);
    if (r->n_three_phase)
        printf("  three-phase points: %zu, %s\n", r->n_three_phase,
               pw_model_can_split(r->sys.model)
                   ? "modelled as two liquids and vapor"
                   : "left out of the fit (this model cannot split)");
    if (r->n_tie_lines)
        printf("  tie lines: %zu; layers x1 AAD %.4f (sigma_x %.3g)\n", r->n_tie_lines,
               r->aad_x_lle, r->sigma_x_lle);
    printf("  chi2/dof %.4g, AICc %.4g\n", r->chi2_red, r->aicc);
    if (r->n_minima > 1)
        printf("  %zu distinct local minima found by the multistart (best chi2 %.4g, next %.4g)\n",
               r->n_minima, r->minima[0].chi2, r->minima[1].chi2);
    if (r->minimum_split_skipped)
        printf("  chosen: minimum %zu, not the lowest: minima 1 to %zu predict a liquid-liquid split\n"
               "  the data do not show, and minimum %zu fits as well (chi2 within a factor\n"
               "  max(1.01, exp(2/n)) of the lowest; docs/fitting.md); --minimum 1 takes the lowest\n",
               r->minimum_default, r->minimum_split_skipped, r->minimum_default);
    printf("  fit file: %s\n", path);
}

pw_status cli_fit(int argc, char **argv)
{
    const char *input = NULL, *model_name = NULL, *components = NULL, *out = NULL, *out_dir = NULL;
    const char *lle_path = NULL;
    bool json = false;
    cli_fit_opts co = {.force = false};
    co.fit = pw_fit_default_options();
    pw_error err;
    pw_error_clear(&err);
    cli_args p;
    if (cli_parse(&fit_spec, argc, argv, &p, &err) != PW_OK)
        return cli_fail("fit", &err);
    if (p.help) {
        usage(stdout, &fit_spec);
        return PW_OK;
    }
    input = p.n_pos ? p.pos[0] : NULL;
    model_name = cli_text(&p, "--model");
    components = cli_text(&p, "--components");
    out = cli_text(&p, "--out");
    out_dir = cli_text(&p, "--out-dir");
    lle_path = cli_text(&p, "--lle");
    json = cli_has(&p, "--json");
    co.force = cli_has(&p, "--force");
    co.units = cli_show_in_get(&p);
    co.fit.fit_alpha = cli_has(&p, "--fit-alpha");
    const cli_value *v;
    if ((v = cli_get(&p, "--vapor")) && pw_vapor_parse(v->text, &co.fit.vapor) != PW_OK)
        return cli_failf("fit", PW_EINVAL,
                            "--vapor %s: unknown vapor model (expected ideal or virial)", v->text);
    if ((v = cli_get(&p, "--exclude-reason")))
        snprintf(co.fit.exclude_reason, sizeof co.fit.exclude_reason, "%s", v->text);
    for (v = cli_next(&p, "--exclude", NULL); v; v = cli_next(&p, "--exclude", v))
        if (parse_lines(v->text, &co.fit, &err) != PW_OK)
            return cli_fail("fit", &err);
    static const char *const sigmas[] = {"--sigma-T", "--sigma-P"};
    for (size_t k = 0; k < 2; k++)
        if ((v = cli_get(&p, sigmas[k])) && sigma_opt(sigmas[k], v->text, &co.fit, &err) != PW_OK)
            return cli_fail("fit", &err);
    /* ranges: docs/inputs.md ("Command-line numbers"), checked by the parser */
    if ((v = cli_get(&p, "--starts")))
        co.fit.n_starts = (size_t)v->whole;
    if ((v = cli_get(&p, "--seed")))
        co.fit.seed = (unsigned long)v->whole;
    if ((v = cli_get(&p, "--alpha")))
        co.fit.alpha = v->num;
    if ((v = cli_get(&p, "--sigma-y")))
        co.fit.sigma_y = v->num;
    if (!input || !model_name) {
        return cli_failf("fit", PW_EINVAL, "a dataset (or folder) and --model are required");
    }
    bool all = !strcasecmp(model_name, "all");
    const pw_model_type *model = all ? NULL : pw_model_find(model_name);
    char names[256];
    if (!all && !model)
        return cli_failf("fit", PW_EINVAL, "unknown model '%s' (expected %s or all)",
                            model_name, pw_model_names(names, sizeof names));
    struct stat sb;
    if (stat(input, &sb) != 0)
        return cli_failf("fit", PW_EIO, "%s: no such file or folder", input);
    pw_complib lib;
    if (cli_load_components(&lib, components, &err) != PW_OK)
        return cli_fail("fit", &err);
    co.lib = &lib;
    /* every file read is an input that no output may replace */
    co.inputs[co.n_inputs++] = components;
    char lib_path[PW_PATH_MAX];
    if (pw_complib_default_path(lib_path, sizeof lib_path))
        co.inputs[co.n_inputs++] = lib_path;
    co.json = json;
    pw_lle_dataset lle;
    memset(&lle, 0, sizeof lle);
    if (lle_path) {
        if (pw_lle_dataset_read(lle_path, &lle, &err) != PW_OK) {
            pw_complib_free(&lib);
            return cli_fail("fit", &err);
        }
        co.lle = &lle;
        co.inputs[co.n_inputs++] = lle_path;
    }
    pw_status rc;
    if (S_ISDIR(sb.st_mode)) {
        if (!out_dir) {
            pw_complib_free(&lib);
            return cli_failf("fit", PW_EINVAL, "fitting a folder needs --out-dir OUTDIR");
        }
        rc = cli_fit_batch(input, out_dir, model, &co); /* model NULL: every model */
    } else if (all && out) {
        rc = cli_failf("fit", PW_EINVAL,
                          "--out names one fit file, but --model all writes one per model "
                          "(<stem>.<model>.json): give --out-dir DIR instead");
    } else if (all) {
        rc = cli_fit_all_models(input, out_dir, &co);
    } else {
        pw_fit_result r;
        char path[PW_PATH_MAX];
        rc = cli_fit_one(input, model, out, out_dir, &co, &r, path, sizeof path, &err);
        if (rc == PW_OK) {
            if (json) {
                json_t *o = cli_fit_json(&r, path);
                rc = cli_print_json(o);
            } else {
                print_table(&r, path, &co.units);
            }
            pw_fit_result_free(&r);
        } else {
            rc = cli_fail("fit", &err);
        }
    }
    pw_lle_dataset_free(&lle);
    pw_complib_free(&lib);
    return rc;
}
