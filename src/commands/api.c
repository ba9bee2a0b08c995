/* The flat interface of pinchwise/api.h: each function runs what the command runs and returns
 * the document that pinchwise/commands.h builds for the command line too. */
#include <gsl/gsl_errno.h>
#include <math.h>
#include <pinchwise/api.h>
#include <pinchwise/commands.h>
#include <pinchwise/composition.h>
#include <pinchwise/design_doc.h>
#include <pinchwise/fitjson.h>
#include <pinchwise/hetcheck.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "pinchwise_version.h"

void pw_api_init(void)
{
    gsl_set_error_handler_off();
}

const char *pw_api_version(void)
{
    return PINCHWISE_VERSION_STRING;
}

void pw_api_free(char *text)
{
    free(text);
}

size_t pw_api_error_size(void)
{
    return sizeof(pw_error);
}

/* Serialises doc (stolen) into *out. */
static pw_status finish(json_t *doc, char **out, pw_error *err)
{
    *out = pw_json_text(doc);
    json_decref(doc);
    return *out ? PW_OK : pw_error_set(err, PW_ENOMEM, NULL, 0, "out of memory");
}

static pw_status need(const void *p, const char *what, pw_error *err)
{
    return p ? PW_OK : pw_error_set(err, PW_EINVAL, NULL, 0, "%s is required", what);
}

/* A quantity argument with its unit; the message names the argument like an option. */
static pw_status quantity(pw_quantity q, const char *arg, const char *text, double *si,
                          pw_error *err)
{
    pw_status st = pw_units_parse_quantity(q, text, si, err);
    if (st != PW_OK && err) {
        char inner[PW_ERROR_MSG_MAX];
        snprintf(inner, sizeof inner, "%s", err->msg);
        pw_error_set(err, st, NULL, 0, "%s %s: %s", arg, text, inner);
    }
    return st;
}

/* A quantity argument that must be given: "<what> is required", else read as quantity() does. */
static pw_status required(pw_quantity q, const char *arg, const char *what, const char *text,
                          double *si, pw_error *err)
{
    pw_status st = need(text, what, err);
    return st == PW_OK ? quantity(q, arg, text, si, err) : st;
}

/* Every function's first step: a place for the document, emptied. */
static pw_status doc_slot(char **doc, pw_error *err)
{
    if (!doc)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "no place for the document (doc is NULL)");
    *doc = NULL;
    return PW_OK;
}

static pw_status read_fit(const char *fit_path, const char *fit_text, const char *name,
                          const char *components, pw_fit_result *fit, pw_error *err)
{
    pw_status st;
    if (fit_path)
        return pw_fitfile_load(fit_path, components, fit, NULL, err);
    if (fit_text)
        st = pw_fitfile_parse(fit_text, strlen(fit_text), name ? name : "fit", fit, err);
    else
        return pw_error_set(err, PW_EINVAL, NULL, 0, "a fit file (or a fit's text) is required");
    if (st != PW_OK)
        return st;
    st = pw_fit_replace_components(fit, components, NULL, err);
    if (st != PW_OK)
        pw_fit_result_free(fit);
    return st;
}

/* The uncertainty options of the command line: on when asked or when samples or seed is given. */
static pw_status unc_options(int uncertainty, long samples, long seed, bool *on, pw_unc_options *o,
                             pw_error *err)
{
    *o = pw_unc_default_options();
    *on = uncertainty != 0 || samples >= 0 || seed >= 0;
    if (samples > 100000)
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "samples %ld: expected a whole number from 0 to 100000", samples);
    if (seed > 4294967295L)
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "seed %ld: expected a whole number from 0 to 4294967295", seed);
    if (samples >= 0)
        o->samples = (size_t)samples;
    if (seed >= 0)
        o->seed = (unsigned long)seed;
    return PW_OK;
}

/* true when both paths name one existing file (an output must never replace an input) */
static bool same_file(const char *a, const char *b)
{
    struct stat sa, sb;
    return stat(a, &sa) == 0 && stat(b, &sb) == 0 && sa.st_dev == sb.st_dev
           && sa.st_ino == sb.st_ino;
}

static const char *fit_where(const char *fit_path, const char *name)
{
    return fit_path ? fit_path : name ? name : "fit";
}

/* Reads the data file and finds its two components in the shipped library (plus components, may be
 * NULL); mass-fraction columns are converted to mole fractions. On failure nothing is left to free. */
static pw_status read_data(const char *data, const char *components, pw_dataset *ds,
                           pw_component found[2], pw_error *err)
{
    pw_complib lib;
    pw_status st = pw_complib_load_default(&lib, components, err);
    if (st != PW_OK)
        return st;
    st = pw_dataset_read(data, ds, err);
    if (st != PW_OK) {
        pw_complib_free(&lib);
        return st;
    }
    st = pw_dataset_components(&lib, ds, found, err);
    if (st == PW_OK)
        st = pw_dataset_to_mole(ds, &found[0], &found[1], err); /* w1, wy1 columns */
    pw_complib_free(&lib);
    if (st != PW_OK)
        pw_dataset_free(ds);
    return st;
}

pw_status pw_api_fit(const char *data, const char *model, const char *components, const char *out,
                     int force, char **doc, char **fit_file, pw_error *err)
{
    return pw_api_fit_lle(data, model, components, NULL, out, force, doc, fit_file, err);
}

pw_status pw_api_fit_lle(const char *data, const char *model, const char *components,
                         const char *lle, const char *out, int force, char **doc, char **fit_file,
                         pw_error *err)
{
    if (doc_slot(doc, err) != PW_OK)
        return PW_EINVAL;
    if (fit_file)
        *fit_file = NULL;
    pw_status st = need(data, "a dataset file", err);
    if (st == PW_OK)
        st = need(model, "a model", err);
    if (st != PW_OK)
        return st;
    const pw_model_type *m = pw_model_find(model);
    if (!m) {
        char names[160];
        return pw_error_set(err, PW_EINVAL, NULL, 0, "unknown model '%s' (expected one of: %s)",
                            model, pw_model_names(names, sizeof names));
    }
    pw_dataset ds;
    pw_component found[2];
    st = read_data(data, components, &ds, found, err);
    if (st != PW_OK)
        return st;
    pw_fit_result r;
    memset(&r, 0, sizeof r);
    pw_fit_options o = pw_fit_default_options();
    pw_lle_dataset ties;
    memset(&ties, 0, sizeof ties);
    pw_tie_line *swapped = NULL;
    if (lle) /* tie lines: same components, in either order; never written over */
        st = out && same_file(out, lle)
                 ? pw_error_set(err, PW_EINVAL, out, 0, "the output would replace the LLE file")
                 : pw_lle_dataset_read(lle, &ties, err);
    if (st == PW_OK && lle)
        st = pw_fit_attach_tie_lines_ex(&ties, &ds, &found[0], &found[1], &o, &swapped, err);
    if (st == PW_OK)
        st = pw_fit_run(&ds, &found[0], &found[1], m, &o, &r, err);
    free(swapped);
    if (lle)
        pw_lle_dataset_free(&ties);
    pw_dataset_free(&ds);
    if (st != PW_OK)
        return st;
    if (out)
        st = pw_fitfile_write(out, &r, force != 0, err);
    if (st == PW_OK && fit_file) {
        json_t *whole = pw_fitfile_to_json(&r);
        *fit_file =
            whole
                ? json_dumps(whole, JSON_INDENT(1) | JSON_REAL_PRECISION(17) | JSON_PRESERVE_ORDER)
                : NULL;
        json_decref(whole);
        if (!*fit_file)
            st = pw_error_set(err, PW_ENOMEM, NULL, 0, "out of memory");
    }
    if (st == PW_OK)
        st = finish(pw_fit_doc(&r, out), doc, err);
    if (st != PW_OK && fit_file) {
        free(*fit_file);
        *fit_file = NULL;
    }
    pw_fit_result_free(&r);
    return st;
}

pw_status pw_api_check(const char *data, const char *components, int strict, char **doc,
                       pw_error *err)
{
    if (doc_slot(doc, err) != PW_OK)
        return PW_EINVAL;
    pw_status st = need(data, "a dataset file", err);
    if (st != PW_OK)
        return st;
    pw_dataset ds;
    pw_component found[2];
    st = read_data(data, components, &ds, found, err);
    if (st != PW_OK)
        return st;
    pw_consistency_result r;
    memset(&r, 0, sizeof r);
    pw_consistency_options o = pw_consistency_default_options();
    o.strict_verdict = strict != 0;
    /* points inside the two-liquid region: out of the one-liquid tests */
    pw_het_check het;
    st = pw_check_data(&ds, &found[0], &found[1], &o, &het, &r, err);
    if (st == PW_OK) {
        st = finish(pw_check_doc(&ds, &r, strict != 0, &het), doc, err);
        pw_het_check_free(&het, NULL);
    }
    pw_consistency_result_free(&r);
    pw_dataset_free(&ds);
    return st;
}

pw_status pw_api_azeotrope(const char *fit_path, const char *fit_text, const char *name,
                           const char *components, const char *pressure, const char *temperature,
                           int uncertainty, long samples, long seed, char **doc, pw_error *err)
{
    if (doc_slot(doc, err) != PW_OK)
        return PW_EINVAL;
    if (pressure && temperature)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "give a pressure or a temperature, not both");
    pw_fit_result fit;
    pw_status st = read_fit(fit_path, fit_text, name, components, &fit, err);
    if (st != PW_OK)
        return st;
    pw_az_mode mode;
    double fixed;
    if (pressure) {
        mode = PW_AZ_ISOBARIC;
        st = quantity(PW_QTY_PRESSURE, "pressure", pressure, &fixed, err);
    } else if (temperature) {
        mode = PW_AZ_ISOTHERMAL;
        st = quantity(PW_QTY_TEMPERATURE, "temperature", temperature, &fixed, err);
    } else { /* the condition of the fit's own data */
        mode = fit.kind == PW_DATA_ISOBARIC ? PW_AZ_ISOBARIC : PW_AZ_ISOTHERMAL;
        fixed = mode == PW_AZ_ISOBARIC ? fit.P_fixed_Pa : fit.T_fixed_K;
    }
    pw_az_result r;
    pw_three_phase tp;
    memset(&tp, 0, sizeof tp);
    if (st == PW_OK)
        st = pw_azeotrope_solve(&fit.sys, mode, fixed, fit_where(fit_path, name), &r, &tp, NULL,
                                err);
    bool unc = false;
    pw_unc_options uo;
    pw_unc_result res[PW_AZ_MAX];
    if (st == PW_OK)
        st = unc_options(uncertainty, samples, seed, &unc, &uo, err);
    if (st == PW_OK && unc)
        st = pw_azeotrope_unc_run(&fit, &r, &uo, res, err);
    bool het = unc && tp.exists && tp.heterogeneous_azeotrope;
    pw_unc_result res_het;
    if (st == PW_OK && het) {
        pw_unc_het_ctx hc = pw_unc_het_azeo_ctx(mode, fixed);
        st = pw_het_unc_run(&fit, &hc, &uo, &res_het, err);
    }
    if (st == PW_OK) {
        json_t *o = pw_azeotrope_doc(&fit.sys, mode, fixed, &r, NULL, &tp, NULL);
        if (o && unc)
            pw_azeotrope_unc_doc(json_object_get(o, "azeotropes"), &r, res, r.n, uo.seed);
        if (o && het) /* the heterogeneous entry follows the homogeneous ones */
            pw_het_azeo_unc_doc(json_array_get(json_object_get(o, "azeotropes"), r.n), &res_het,
                                mode, uo.seed);
        st = finish(o, doc, err);
    }
    pw_fit_result_free(&fit);
    return st;
}

pw_status pw_api_reflux(const char *fit_path, const char *fit_text, const char *name,
                        const char *components, const char *pressure, double xd, double xb,
                        double zf, double q, int uncertainty, long samples, long seed, char **doc,
                        pw_error *err)
{
    return pw_api_reflux_ex(fit_path, fit_text, name, components, pressure, xd, xb, zf, q,
                            uncertainty, samples, seed, 0, doc, err);
}

pw_status pw_api_reflux_ex(const char *fit_path, const char *fit_text, const char *name,
                           const char *components, const char *pressure, double xd, double xb,
                           double zf, double q, int uncertainty, long samples, long seed,
                           int energy, char **doc, pw_error *err)
{
    if (doc_slot(doc, err) != PW_OK)
        return PW_EINVAL;
    double P_Pa = 0.0;
    pw_status st = required(PW_QTY_PRESSURE, "pressure", "a pressure", pressure, &P_Pa, err);
    if (st != PW_OK)
        return st;
    pw_fit_result fit;
    st = read_fit(fit_path, fit_text, name, components, &fit, err);
    if (st != PW_OK)
        return st;
    pw_column_spec spec = {.xd = xd, .xb = xb, .zf = zf, .q = q};
    pw_column_options opt = pw_column_default_options();
    pw_column_options opt_col = opt;
    opt_col.n_factors = 0; /* the design rows come from pw_reflux_design, as in the CLI */
    pw_column_result col;
    double T_top_K, T_bottom_K;
    st = pw_reflux_solve(&fit.sys, P_Pa, &spec, &opt_col, fit_where(fit_path, name), &col,
                         &T_top_K, &T_bottom_K, err);
    /* --energy: the heat data of the fit file (or of components), as the command line */
    pw_heat_data heat;
    pw_energy_result eres;
    memset(&heat, 0, sizeof heat);
    memset(&eres, 0, sizeof eres);
    if (st == PW_OK && energy && (st = pw_heat_data_from_system(&fit.sys, &heat, err)) != PW_OK &&
        err) {
        char msg[PW_ERROR_MSG_MAX];
        snprintf(msg, sizeof msg, "%s", err->msg);
        pw_error_set(err, st, fit_where(fit_path, name), 0, "--energy: %s", msg);
    }
    pw_design_table design;
    memset(&design, 0, sizeof design);
    if (st == PW_OK && (st = pw_reflux_design(&fit.sys, P_Pa, &spec, &opt, &col,
                                              energy ? &heat : NULL, &design, &eres)) != PW_OK)
        pw_error_set(err, st, fit_where(fit_path, name), 0, "design rows: %s%s%s", pw_strerror(st),
                     eres.reason[0] ? ": " : "", eres.reason);
    bool unc = false;
    pw_unc_options uo;
    pw_unc_column_ctx uc;
    pw_unc_column_assessment as;
    if (st == PW_OK)
        st = unc_options(uncertainty, samples, seed, &unc, &uo, err);
    if (st == PW_OK && unc) {
        uc = pw_unc_column_ctx_make(P_Pa, &spec);
        uc.opt = opt;
        if (energy)
            uc.heat = &heat; /* energy balances in every draw */
        st = pw_reflux_unc_run(&fit, &uc, &uo, fit_where(fit_path, name), &as, err);
    }
    if (st == PW_OK) {
        json_t *o = pw_reflux_command_doc(&fit.sys, &col, &design, energy ? &eres : NULL, P_Pa,
                                          &spec, T_top_K, T_bottom_K);
        if (o && unc)
            pw_reflux_unc_doc(o, &as.res, &uo, uc.factor, as.plan_status, &as.plan);
        st = finish(o, doc, err);
    }
    pw_design_table_free(&design);
    pw_fit_result_free(&fit);
    return st;
}

pw_status pw_api_screen(const char *fit_path, const char *fit_text, const char *name,
                        const char *components, const char *pressure, double xd, double xb,
                        double zf, char **doc, pw_error *err)
{
    if (doc_slot(doc, err) != PW_OK)
        return PW_EINVAL;
    double P_Pa = 0.0;
    pw_status st = required(PW_QTY_PRESSURE, "pressure", "a pressure", pressure, &P_Pa, err);
    if (st != PW_OK)
        return st;
    pw_fit_result fit;
    st = read_fit(fit_path, fit_text, name, components, &fit, err);
    if (st != PW_OK)
        return st;
    pw_screen_options opt = pw_screen_default_options();
    pw_screen_result r;
    st = pw_screen_run(&fit.sys, P_Pa, xd, xb, zf, &opt, &r);
    if (st != PW_OK)
        pw_error_set(err, st, fit_where(fit_path, name), 0, "screen failed: %s", pw_strerror(st));
    else
        st = finish(pw_screen_doc(&fit.sys, &r, &opt), doc, err);
    pw_fit_result_free(&fit);
    return st;
}

/* A number argument: finite, and within [lo, hi]. */
static pw_status ranged(const char *arg, double v, double lo, double hi, pw_error *err)
{
    if (isfinite(v) && v >= lo && v <= hi)
        return PW_OK;
    return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %g: expected a number from %g to %g", arg, v,
                        lo, hi);
}

/* A mole fraction argument in [0, 1]. */
static pw_status fraction(const char *arg, double v, pw_error *err)
{
    if (isfinite(v) && v >= 0.0 && v <= 1.0)
        return PW_OK;
    return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %g: a mole fraction must lie in [0, 1]", arg,
                        v);
}

/* A whole-number argument from lo to hi. */
static pw_status whole(const char *arg, long v, long lo, long hi, pw_error *err)
{
    if (v >= lo && v <= hi)
        return PW_OK;
    return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %ld: expected a whole number from %ld to %ld",
                        arg, v, lo, hi);
}

pw_status pw_api_lle(const char *fit_path, const char *fit_text, const char *name,
                     const char *components, const char *temperature, const char *scan_from,
                     const char *scan_to, long scan_n, char **doc, pw_error *err)
{
    if (doc_slot(doc, err) != PW_OK)
        return PW_EINVAL;
    double T_K = 0.0, from = 0.0, to = 0.0;
    pw_status st =
        required(PW_QTY_TEMPERATURE, "temperature", "a temperature", temperature, &T_K, err);
    bool scan = scan_from || scan_to || scan_n != 0;
    if (st == PW_OK && scan) { /* as --scan FROM:TO:N */
        if (!scan_from || !scan_to)
            st = pw_error_set(err, PW_EINVAL, NULL, 0,
                              "scan: expected FROM, TO and N, e.g. 20C, 120C, 11");
        if (st == PW_OK)
            st = quantity(PW_QTY_TEMPERATURE, "scan FROM", scan_from, &from, err);
        if (st == PW_OK)
            st = quantity(PW_QTY_TEMPERATURE, "scan TO", scan_to, &to, err);
        if (st == PW_OK && (scan_n < 2 || scan_n > 1000 || from == to))
            st = pw_error_set(err, PW_EINVAL, NULL, 0,
                              "scan %s:%s:%ld: N must be a whole number from 2 to 1000 and FROM "
                              "differ from TO",
                              scan_from, scan_to, scan_n);
    }
    if (st != PW_OK)
        return st;
    pw_fit_result fit;
    st = read_fit(fit_path, fit_text, name, components, &fit, err);
    if (st != PW_OK)
        return st;
    const char *where = fit_where(fit_path, name);
    pw_lle_result r;
    st = pw_lle_run(&fit.sys, T_K, where, &r, err);
    pw_lle_scan_point *pts = NULL;
    pw_lle_critical crit[PW_LLE_MAX_CRITICAL];
    size_t n_crit = 0, n = scan ? (size_t)scan_n : 0;
    if (st == PW_OK && scan) {
        pts = calloc(n, sizeof *pts);
        st = pts ? pw_lle_scan_run(&fit.sys, from, to, n, where, pts, crit, &n_crit, err)
                 : pw_error_set(err, PW_ENOMEM, where, 0, "binodal scan failed: %s",
                                pw_strerror(PW_ENOMEM));
    }
    if (st == PW_OK)
        st = finish(pw_lle_doc(&fit.sys, T_K, &r, pts, n, crit, n_crit), doc, err);
    free(pts);
    pw_fit_result_free(&fit);
    return st;
}

pw_status pw_api_decanter(const char *fit_path, const char *fit_text, const char *name,
                          const char *components, const char *pressure, double zf, double x1_rich,
                          double x1_lean, double q, char **doc, pw_error *err)
{
    return pw_api_decanter_ex(fit_path, fit_text, name, components, pressure, zf, x1_rich,
                              x1_lean, q, 0, -1, -1, doc, err);
}

pw_status pw_api_decanter_ex(const char *fit_path, const char *fit_text, const char *name,
                             const char *components, const char *pressure, double zf,
                             double x1_rich, double x1_lean, double q, int uncertainty,
                             long samples, long seed, char **doc, pw_error *err)
{
    return pw_api_decanter_ex2(fit_path, fit_text, name, components, pressure, zf, x1_rich,
                               x1_lean, q, uncertainty, samples, seed, NULL, doc, err);
}

pw_status pw_api_decanter_ex2(const char *fit_path, const char *fit_text, const char *name,
                              const char *components, const char *pressure, double zf,
                              double x1_rich, double x1_lean, double q, int uncertainty,
                              long samples, long seed, const char *decanter_temperature,
                              char **doc, pw_error *err)
{
    if (doc_slot(doc, err) != PW_OK)
        return PW_EINVAL;
    pw_decanter_spec spec = {.zf = zf, .q = q, .x_rich = x1_rich, .x_lean = x1_lean};
    pw_status st = required(PW_QTY_PRESSURE, "pressure", "a pressure", pressure, &spec.P_Pa, err);
    if (st == PW_OK && decanter_temperature && decanter_temperature[0]) {
        st = quantity(PW_QTY_TEMPERATURE, "decanter_temperature", decanter_temperature,
                      &spec.T_decanter_K, err);
        if (st == PW_OK && !(spec.T_decanter_K > 0.0))
            st = pw_error_set(err, PW_EINVAL, NULL, 0,
                              "decanter_temperature %s: expected a temperature above absolute "
                              "zero", decanter_temperature);
    }
    if (st == PW_OK && !(isfinite(zf) && zf > 0.0 && zf < 1.0))
        st = pw_error_set(err, PW_EINVAL, NULL, 0, "zf %g: must lie strictly between 0 and 1", zf);
    if (st == PW_OK)
        st = fraction("x1_rich", x1_rich, err);
    if (st == PW_OK)
        st = fraction("x1_lean", x1_lean, err);
    if (st == PW_OK)
        st = ranged("q", q, -10.0, 10.0, err);
    bool unc = false;
    pw_unc_options uo;
    if (st == PW_OK)
        st = unc_options(uncertainty, samples, seed, &unc, &uo, err);
    if (st != PW_OK)
        return st;
    pw_fit_result fit;
    st = read_fit(fit_path, fit_text, name, components, &fit, err);
    if (st != PW_OK)
        return st;
    pw_column_options opt = pw_column_default_options();
    pw_decanter_result r;
    st = pw_decanter_run(&fit.sys, &spec, &opt, fit_where(fit_path, name), &r, err);
    unc = unc && st == PW_OK && r.feasible; /* as the command: no interval without a scheme */
    pw_unc_result res;
    if (unc) {
        pw_unc_het_ctx hc = pw_unc_decanter_ctx(&spec, &opt);
        st = pw_het_unc_run(&fit, &hc, &uo, &res, err);
    }
    if (st == PW_OK) {
        json_t *o = pw_decanter_command_doc(&fit.sys, &r, &spec);
        if (o && unc)
            pw_decanter_unc_doc(o, &res, uo.seed);
        st = finish(o, doc, err);
    }
    pw_fit_result_free(&fit);
    return st;
}

pw_status pw_api_rate(const char *fit_path, const char *fit_text, const char *name,
                      const char *components, const char *pressure, long stages, long feed_stage,
                      double reflux, double zf, double distillate, double q, int energy, char **doc,
                      pw_error *err)
{
    if (doc_slot(doc, err) != PW_OK)
        return PW_EINVAL;
    double P_Pa = 0.0;
    pw_status st = required(PW_QTY_PRESSURE, "pressure", "a pressure", pressure, &P_Pa, err);
    if (st == PW_OK)
        st = whole("stages", stages, 1, 100000, err);
    if (st == PW_OK)
        st = whole("feed_stage", feed_stage, 1, 100000, err);
    if (st == PW_OK && !isfinite(reflux))
        st = pw_error_set(err, PW_EINVAL, NULL, 0, "reflux %g: not a finite number", reflux);
    if (st == PW_OK && !isfinite(distillate))
        st =
            pw_error_set(err, PW_EINVAL, NULL, 0, "distillate %g: not a finite number", distillate);
    if (st == PW_OK)
        st = fraction("zf", zf, err);
    if (st == PW_OK)
        st = ranged("q", q, -10.0, 10.0, err);
    if (st != PW_OK)
        return st;
    pw_fit_result fit;
    st = read_fit(fit_path, fit_text, name, components, &fit, err);
    if (st != PW_OK)
        return st;
    pw_rate_spec spec = {.n_stages = (int)stages,
                         .feed_stage = (int)feed_stage,
                         .R = reflux,
                         .zf = zf,
                         .q = q,
                         .d_frac = distillate};
    pw_rate_result r;
    pw_rate_energy_out en;
    st = pw_rate_run(&fit.sys, P_Pa, &spec, energy != 0, fit_where(fit_path, name), &r, &en, err);
    if (st == PW_OK)
        st = finish(pw_rate_doc(&fit.sys, P_Pa, &spec, energy != 0, &r, &en), doc, err);
    pw_rate_result_free(&r);
    pw_fit_result_free(&fit);
    return st;
}
