/* pinchwise lle: the two coexisting liquid layers a fitted model predicts at a temperature, and
 * optionally the binodal over a range of temperatures with its critical solution temperatures.
 * Parses, calls src/thermo/lle.c and prints; computes nothing itself. */
#include "analysis_common.h"
#include "cli.h"
#include "cli_units.h"
#include "cli_options.h"

#include <math.h>
#include <pinchwise/commands.h>
#include <pinchwise/lle.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define CMD "lle"

static const cli_option lle_options[] = {
    {.name = "--temperature", .kind = CLI_QUANTITY, .unit = PW_QTY_TEMPERATURE, .metavar = "T",
     .help = "temperature with its unit, e.g. 25C, 298.15K"},
    {.name = "--scan", .kind = CLI_STRING, .metavar = "FROM:TO:N",
     .help = "also the layers at N temperatures from FROM to TO (linear) and\n"
             "the critical solution temperatures between them"},
    CLI_END,
};

static const cli_option *const lle_blocks[] = {
    lle_options, cli_block_components, cli_block_minimum, cli_block_show_in, cli_block_json, NULL,
};

static const cli_spec lle_spec = {
    .cmd = CMD,
    .synopsis =
        "usage: pinchwise lle FIT.json --temperature T [--scan FROM:TO:N] [options]\n"
        "       pinchwise lle FIT.json --scan FROM:TO:N [options]   (the layers at FROM first)\n"
        "\n"
        "Liquid-liquid split of the fitted model: the two layers with equal activities of\n"
        "both components (common tangent of Gmix/RT), checked by the tangent-plane test.\n"
        "Wilson's equation can never split: a Wilson fit always answers 'no split'.\n",
    .blocks = lle_blocks,
    .max_positional = 1,
    .positional = "one fit file",
};

typedef struct args {
    bool help; /* --help was asked for: nothing else is set */
    const char *fit_path, *components, *scan_text, *minimum;
    double T, from, to;
    size_t n;
    bool have_T, json;
    pw_display_units units; /* --show-in */
} args;

/* A layer's x1 for the text output; near pure component 1 as 1 - x2, which keeps its digits. */
static const char *layer_text(double x1, double x2, char *buf, size_t n)
{
    if (x2 < 1e-4)
        snprintf(buf, n, "1 - %.4g", x2);
    else
        snprintf(buf, n, "%.6g", x1);
    return buf;
}

static pw_status parse_scan(const char *text, args *a, pw_error *err)
{
    char buf[256];
    snprintf(buf, sizeof buf, "%s", text);
    char *c1 = strchr(buf, ':'), *c2 = c1 ? strchr(c1 + 1, ':') : NULL;
    if (!c1 || !c2 || strchr(c2 + 1, ':')) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--scan %s: expected FROM:TO:N, e.g. 20C:120C:11",
                     text);
        return PW_EINVAL;
    }
    *c1 = *c2 = '\0';
    double n;
    if (cli_quantity(PW_QTY_TEMPERATURE, "--scan FROM", buf, &a->from, err) != PW_OK
        || cli_quantity(PW_QTY_TEMPERATURE, "--scan TO", c1 + 1, &a->to, err) != PW_OK
        || cli_number("--scan N", c2 + 1, &n, err) != PW_OK)
        return PW_EINVAL;
    if (!(n >= 2.0 && n <= 1000.0) || n != floor(n) || a->from == a->to) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "--scan %s: N must be a whole number from 2 to 1000 and FROM differ from TO",
                     text);
        return PW_EINVAL;
    }
    a->n = (size_t)n;
    return PW_OK;
}

/* PW_OK (a->help set when --help was asked for), or PW_EINVAL with err filled. */
static pw_status parse(int argc, char **argv, args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    cli_args p;
    if (cli_parse(&lle_spec, argc, argv, &p, err) != PW_OK)
        return PW_EINVAL;
    if ((a->help = p.help))
        return PW_OK;
    a->json = cli_has(&p, "--json");
    a->components = cli_text(&p, "--components");
    a->minimum = cli_text(&p, "--minimum");
    a->units = cli_show_in_get(&p);
    a->scan_text = cli_text(&p, "--scan");
    const cli_value *T = cli_get(&p, "--temperature");
    if (T)
        a->T = T->num, a->have_T = true;
    a->fit_path = p.n_pos ? p.pos[0] : NULL;
    if (!a->fit_path || (!a->have_T && !a->scan_text)) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "a fit file and --temperature (or --scan FROM:TO:N) are required");
        return PW_EINVAL;
    }
    if (!a->scan_text)
        return PW_OK;
    pw_status st = parse_scan(a->scan_text, a, err);
    if (st == PW_OK && !a->have_T) /* a scan alone: its first temperature is the one reported */
        a->T = a->from;
    return st;
}

pw_status cli_lle(int argc, char **argv)
{
    args a;
    pw_error err;
    pw_error_clear(&err);
    if (parse(argc, argv, &a, &err) != PW_OK)
        return cli_fail(CMD, &err);
    if (a.help) {
        cli_help(&lle_spec, stdout);
        return PW_OK;
    }
    pw_status rc = PW_OK;
    pw_fit_result fit;
    memset(&fit, 0, sizeof fit);
    size_t minimum = 0;
    pw_status st = cli_read_fit_at(CMD, a.fit_path, a.components, a.minimum, &fit, &minimum, &err);
    if (st != PW_OK)
        return cli_fail(CMD, &err);
    const pw_system *s = &fit.sys;
    pw_lle_result r;
    st = pw_lle_run(s, a.T, a.fit_path, &r, &err);
    if (st != PW_OK) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    pw_lle_scan_point *pts = NULL;
    pw_lle_critical crit[PW_LLE_MAX_CRITICAL];
    size_t n_crit = 0;
    if (a.scan_text) {
        pts = calloc(a.n, sizeof *pts);
        st = pts ? pw_lle_scan_run(s, a.from, a.to, a.n, a.fit_path, pts, crit, &n_crit, &err)
                 : pw_error_set(&err, PW_ENOMEM, a.fit_path, 0, "binodal scan failed: %s",
                                pw_strerror(PW_ENOMEM));
        if (st != PW_OK) {
            free(pts);
            pw_fit_result_free(&fit);
            return cli_fail(CMD, &err);
        }
    }
    bool can = pw_model_can_split(s->model);
    /* no vapor pressure enters the layers: the fitted data's range only */
    double Tlo = a.T, Thi = a.T;
    if (a.scan_text) {
        Tlo = fmin(Tlo, fmin(a.from, a.to));
        Thi = fmax(Thi, fmax(a.from, a.to));
    }
    cli_warn_data_T_range(CMD, &fit, Tlo, Thi, a.scan_text ? "the temperatures asked for"
                                                           : "the temperature asked for", &a.units);
    cli_warn_measured_split(CMD, &fit, NULL, &a.units);
    cli_warn_layers_contradicted(CMD, &fit, &a.units);
    if (a.json) {
        json_t *doc = pw_lle_doc(s, a.T, &r, pts, a.n, crit, n_crit);
        if (doc && minimum) /* the minimum used, as azeotrope records it */
            json_object_set_new(doc, "minimum", json_integer((json_int_t)minimum));
        rc = cli_print_json(doc);
    } else {
        const pw_display_units *u = &a.units;
        char b1[48];
        printf("Liquid-liquid equilibrium of %s (1) / %s (2), %s model, at %s\n", s->comp[0].name,
               s->comp[1].name, s->model->name,
               pw_units_display_value(u, PW_SHOW_T, ".3f", a.T, b1, sizeof b1));
        if (!can)
            printf("  the %s model cannot predict two liquids for any parameters; use NRTL, "
                   "UNIQUAC, Margules or van Laar for partly miscible liquids\n",
                   s->model->name);
        if (r.split) {
            char l0[48], l1[48];
            printf("  two liquids: x1 = %s (layer I) and %s (layer II)\n",
                   layer_text(r.x[0], r.x2[0], l0, sizeof l0),
                   layer_text(r.x[1], r.x2[1], l1, sizeof l1));
            printf("  activities a1 = %.6g, a2 = %.6g; tangent-plane check: min distance %.2g\n",
                   r.a[0], r.a[1], r.min_tpd);
            for (size_t p = 1; p < r.n_pairs; p++)
                printf("  another two-liquid region: %.6g and %.6g\n", r.pairs[p][0],
                       r.pairs[p][1]);
        } else {
            printf("  one liquid at every composition (smallest d2(Gmix/RT)/dx1^2 = %.4g at x1 = "
                   "%.4f)\n",
                   r.min_D, r.x_min_D);
        }
        if (pts) {
            snprintf(b1, sizeof b1, "T [%s]", pw_units_display_T_symbol(u));
            printf("\n  %-*s %-12s %s\n", cli_width(10, b1), b1, "x1 layer I", "x1 layer II");
            for (size_t k = 0; k < a.n; k++) {
                double T = pw_units_display_T(u, pts[k].T_K);
                char l0[48], l1[48];
                if (pts[k].split)
                    printf("  %-10.3f %-12s %s%s\n", T,
                           layer_text(pts[k].x[0], pts[k].x2[0], l0, sizeof l0),
                           layer_text(pts[k].x[1], pts[k].x2[1], l1, sizeof l1),
                           pts[k].beyond_floor ? " (a layer within 1e-12 of a pure component: "
                                                 "practically immiscible)"
                                               : "");
                else
                    printf("  %-10.3f one liquid\n", T);
            }
            for (size_t k = 0; k < n_crit; k++)
                printf("  %s critical solution temperature %s at x1 = %.5f\n",
                       crit[k].upper ? "upper" : "lower",
                       pw_units_display_value(u, PW_SHOW_T, ".4f", crit[k].T_K, b1, sizeof b1),
                       crit[k].x1);
        }
        if (fit.n_tie_lines)
            printf("  Layers from a fit with %zu measured tie line%s: away from the tie lines'\n"
                   "  temperatures they can still be far from measured solubilities.\n",
                   fit.n_tie_lines, fit.n_tie_lines == 1 ? "" : "s");
        else
            printf("  Layers predicted from a fit to vapor-liquid data can be far from measured "
                   "solubilities, above all away from the fitted temperatures; check against\n"
                   "  measured tie lines before sizing a decanter.\n");
        cli_print_caution(stdout);
        rc = fflush(stdout) ? PW_EIO : PW_OK;
    }
    free(pts);
    pw_fit_result_free(&fit);
    return rc;
}
