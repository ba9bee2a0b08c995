/* pinchwise fit: one dataset (one model or all), or a folder of datasets (batch). */
#include "cli.h"
#include "cli_units.h"
#include "fit_batch.h"
#include "fit_common.h"

#include <math.h>
#include <pinchwise/fitjson.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>

static void usage(FILE *f)
{
    fprintf(f,
            "usage: pinchwise fit DATA.csv --model MODEL [options]\n"
            "       pinchwise fit DIR --model MODEL --out-dir OUTDIR [options]   (every *.csv in DIR)\n"
            "\n"
            "MODEL: margules, vanlaar, wilson, nrtl (any case), or all (fit every model, rank by\n"
            "AICc; with a folder, every model of every file; with one file, --out-dir not --out)\n"
            "Every option may also be written --option=value.\n"
            PW_CLI_HELP_COMPONENTS
            "  --out FIT.json        fit file to write (default fits/<stem>.<model>.json)\n"
            "  --out-dir DIR         folder for the fit files (batch, or --model all)\n"
            "  --force               replace an existing fit file\n"
            "  --alpha A             NRTL non-randomness when fixed (default 0.3)\n"
            "  --fit-alpha           NRTL: fit alpha as well\n"
            "  --starts N            candidate starts screened (default 32)\n"
            "  --seed N              seed of the start points (default 1)\n"
            "  --sigma-T DT          temperature uncertainty, e.g. 0.05K (default: file or 0.1 K)\n"
            "  --sigma-P DP          pressure uncertainty, 0.2%% or 0.05kPa, as in the file's\n"
            "                        sigma_P (a bare number is percent; default: file or 0.1%%)\n"
            "  --sigma-y DY          vapor mole fraction uncertainty (default: file or 0.004)\n"
            "  --exclude LINES       file line numbers to leave out, e.g. 12,15-17\n"
            "  --exclude-reason TEXT why they are left out (recorded in the fit file)\n"
            "  --json                print one JSON object on stdout\n");
}

static int parse_lines(const char *text, pw_fit_options *o, pw_error *err)
{
    const char *p = text;
    while (*p) {
        char *end;
        long a = strtol(p, &end, 10), b = a;
        if (end == p || a <= 0)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "--exclude %s: expected line numbers such as 12,15-17", text);
        p = end;
        if (*p == '-') {
            b = strtol(p + 1, &end, 10);
            if (end == p + 1 || b < a)
                return pw_error_set(err, PW_EINVAL, NULL, 0,
                                    "--exclude %s: a range must read FIRST-LAST", text);
            p = end;
        }
        for (long l = a; l <= b; l++) {
            if (o->n_exclude == PW_FIT_MAX_EXCLUDE)
                return pw_error_set(err, PW_EINVAL, NULL, 0, "--exclude: at most %d lines",
                                    PW_FIT_MAX_EXCLUDE);
            o->exclude_lines[o->n_exclude++] = l;
        }
        if (*p == ',')
            p++;
        else if (*p)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "--exclude %s: expected line numbers such as 12,15-17", text);
    }
    return PW_OK;
}

static void print_table(const pw_fit_result *r, const char *path)
{
    const pw_model_type *m = r->sys.model;
    printf("%s fit of %s (1) / %s (2), %s data, %zu points\n", m->name, r->sys.comp[0].name,
           r->sys.comp[1].name, r->kind == PW_DATA_ISOBARIC ? "isobaric" : "isothermal", r->n_pts);
    printf("  converged: %s (%s), %zu LM iterations over the starts\n", r->converged ? "yes" : "NO",
           pw_fit_stop_name(r->stop), r->iterations);
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
                   fabs(r->corr[idx[a]][idx[b]]) > 0.95 ? "  (poorly identifiable)" : "");
    printf("  ln gamma_inf at %.2f K: %.4f (1 in 2), %.4f (2 in 1)\n", r->sys.T_ref_K,
           r->lngamma_inf[0], r->lngamma_inf[1]);
    if (r->has_y)
        printf("  y:  AAD %.4f  bias %+.4f  max %.4f (line %ld)\n", r->dev_y.aad, r->dev_y.bias,
               r->dev_y.max_abs, r->dev_y.max_line);
    if (r->kind == PW_DATA_ISOBARIC)
        printf("  T:  AAD %.3f K  bias %+.3f K  max %.3f K (line %ld)\n", r->dev_T_K.aad,
               r->dev_T_K.bias, r->dev_T_K.max_abs, r->dev_T_K.max_line);
    else
        printf("  P:  AAD %.4f kPa  bias %+.4f kPa  max %.4f kPa (line %ld)\n",
               r->dev_P_Pa.aad / 1e3, r->dev_P_Pa.bias / 1e3, r->dev_P_Pa.max_abs / 1e3,
               r->dev_P_Pa.max_line);
    printf("  chi2/dof %.4g, AICc %.4g\n", r->chi2_red, r->aicc);
    if (r->n_minima > 1)
        printf("  %zu distinct local minima found by the multistart (best chi2 %.4g, next %.4g)\n",
               r->n_minima, r->minima[0].chi2, r->minima[1].chi2);
    printf("  fit file: %s\n", path);
}

int pw_cli_fit(int argc, char **argv)
{
    const char *input = NULL, *model_name = NULL, *components = NULL, *out = NULL, *out_dir = NULL;
    bool json = false;
    pw_fit_cli_opts co = {.force = false};
    co.fit = pw_fit_default_options();
    pw_error err;
    pw_error_clear(&err);
    for (int i = 1; i < argc; i++) {
        const char *v = NULL;
        bool missing = false;
        if (!strcmp(argv[i], "--help") || !strcmp(argv[i], "-h")) {
            usage(stdout);
            return 0;
        } else if (pw_cli_opt(argc, argv, &i, "--json", NULL, NULL)) {
            json = true;
        } else if (pw_cli_opt(argc, argv, &i, "--force", NULL, NULL)) {
            co.force = true;
        } else if (pw_cli_opt(argc, argv, &i, "--fit-alpha", NULL, NULL)) {
            co.fit.fit_alpha = true;
        } else if (pw_cli_opt(argc, argv, &i, "--model", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--components", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--out", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--out-dir", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--alpha", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--starts", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--seed", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--sigma-T", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--sigma-P", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--sigma-y", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--exclude", &v, &missing) ||
                   pw_cli_opt(argc, argv, &i, "--exclude-reason", &v, &missing)) {
            const char *opt = argv[missing ? i : i - 1];
            if (missing)
                return pw_cli_failf("fit", PW_EXIT_USAGE, "%s needs a value", opt);
            double d = 0.0;
            pw_status st = PW_OK;
            if (!strcmp(opt, "--model"))
                model_name = v;
            else if (!strcmp(opt, "--components"))
                components = v;
            else if (!strcmp(opt, "--out"))
                out = v;
            else if (!strcmp(opt, "--out-dir"))
                out_dir = v;
            else if (!strcmp(opt, "--exclude-reason"))
                snprintf(co.fit.exclude_reason, sizeof co.fit.exclude_reason, "%s", v);
            else if (!strcmp(opt, "--exclude"))
                st = parse_lines(v, &co.fit, &err);
            else if (!strcmp(opt, "--sigma-T") || !strcmp(opt, "--sigma-P")) {
                st = pw_cli_uncertainty_opt(opt, v, &co.fit.sigma_T_K, &co.fit.sigma_P_rel,
                                            &co.fit.sigma_P_abs_Pa, &err);
            } else {
                st = pw_cli_number(opt, v, &d, &err);
                if (st == PW_OK && !(d > 0.0))
                    st = pw_error_set(&err, PW_EINVAL, NULL, 0, "%s %s: must be positive", opt, v);
                if (st == PW_OK) {
                    if (!strcmp(opt, "--alpha"))
                        co.fit.alpha = d;
                    else if (!strcmp(opt, "--starts"))
                        co.fit.n_starts = (size_t)d;
                    else if (!strcmp(opt, "--seed"))
                        co.fit.seed = (unsigned long)d;
                    else if (!strcmp(opt, "--sigma-y"))
                        co.fit.sigma_y = d;
                }
            }
            if (st != PW_OK)
                return pw_cli_fail("fit", &err);
        } else if (argv[i][0] == '-' && argv[i][1] != '\0') {
            return pw_cli_failf("fit", PW_EXIT_USAGE, "unknown option %s", argv[i]);
        } else if (!input) {
            input = argv[i];
        } else {
            return pw_cli_failf("fit", PW_EXIT_USAGE, "unexpected argument %s (one dataset or folder)",
                                argv[i]);
        }
    }
    if (!input || !model_name) {
        return pw_cli_failf("fit", PW_EXIT_USAGE, "a dataset (or folder) and --model are required");
    }
    bool all = !strcasecmp(model_name, "all");
    const pw_model_type *model = all ? NULL : pw_model_find(model_name);
    if (!all && !model)
        return pw_cli_failf("fit", PW_EXIT_USAGE,
                            "unknown model '%s' (expected margules, vanlaar, wilson, nrtl or all)",
                            model_name);
    struct stat sb;
    if (stat(input, &sb) != 0)
        return pw_cli_failf("fit", pw_status_exit_code(PW_EIO), "%s: no such file or folder", input);
    pw_complib lib;
    if (pw_cli_load_components(&lib, components, &err) != PW_OK)
        return pw_cli_fail("fit", &err);
    co.lib = &lib;
    co.json = json;
    int rc;
    if (S_ISDIR(sb.st_mode)) {
        if (!out_dir) {
            pw_complib_free(&lib);
            return pw_cli_failf("fit", PW_EXIT_USAGE, "fitting a folder needs --out-dir OUTDIR");
        }
        rc = pw_fit_batch(input, out_dir, model, &co); /* model NULL: every model */
    } else if (all && out) {
        rc = pw_cli_failf("fit", PW_EXIT_USAGE,
                          "--out names one fit file, but --model all writes one per model "
                          "(<stem>.<model>.json): give --out-dir DIR instead");
    } else if (all) {
        rc = pw_fit_all_models(input, out_dir, &co);
    } else {
        pw_fit_result r;
        char path[PW_PATH_MAX];
        rc = pw_fit_one(input, model, out, out_dir, &co, &r, path, sizeof path, &err);
        if (rc == 0) {
            if (json) {
                json_t *o = pw_fit_cli_json(&r, path);
                rc = pw_cli_print_json(o);
            } else {
                print_table(&r, path);
            }
            pw_fit_result_free(&r);
        } else {
            rc = pw_cli_fail("fit", &err);
        }
    }
    pw_complib_free(&lib);
    return rc;
}
