/* pinchwise azeotrope: every azeotrope of a fitted model at a pressure or a temperature, and
 * optionally a scan over pressures (or temperatures) for the pressure-swing question. */
#include "analysis_common.h"
#include "azeo_uncert.h"
#include "cli.h"
#include "cli_units.h"
#include "cli_options.h"

#include <math.h>
#include <pinchwise/lle.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define CMD "azeotrope"

static const cli_option azeo_options[] = {
    {.name = "--pressure", .kind = CLI_QUANTITY, .unit = PW_QTY_PRESSURE, .metavar = "P",
     .help = "fixed pressure with its unit, e.g. 101.325kPa, \"1 atm\""},
    {.name = "--temperature", .kind = CLI_QUANTITY, .unit = PW_QTY_TEMPERATURE, .metavar = "T",
     .help = "fixed temperature with its unit, e.g. 50C, 350K\n"
             "(neither: the condition of the fit's own data)"},
    {.name = "--sweep", .alias = "--scan", .kind = CLI_STRING, .metavar = "FROM:TO[:N]",
     .help = "also solve at N values (default 12) from FROM to TO (pressures\n"
             "when the condition is a pressure, geometric; temperatures,\n"
             "linear) and report where the azeotrope reaches a pure end\n"
             "and where it turns from heterogeneous to homogeneous"},
    CLI_END,
};

static const cli_option *const azeo_blocks[] = {
    azeo_options, cli_block_uncertainty, cli_block_components, cli_block_minimum,
    cli_block_show_in, cli_block_json, NULL,
};

static const cli_spec azeo_spec = {
    .cmd = CMD,
    .synopsis =
        "usage: pinchwise azeotrope FIT.json [--pressure P | --temperature T] [--sweep FROM:TO[:N]]\n"
        "                           [options]\n"
        "\n"
        "Azeotropes of the fitted model: where y1 = x1. Every part of the composition range is\n"
        "shown to hold none or exactly one (under a curvature bound checked where the search\n"
        "samples; docs/azeotrope.md), each refined by Brent's method and classified from the\n"
        "extremum of the bubble curve. With\n"
        "--uncertainty: 95 % intervals of each azeotrope from the fit's parameter covariance\n"
        "(linearised and sampled).\n",
    .blocks = azeo_blocks,
    .max_positional = 1,
    .positional = "one fit file",
};

typedef struct args {
    bool help; /* --help was asked for: nothing else is set */
    const char *fit_path;
    pw_az_mode mode;
    bool have_fixed, json, scan;
    double fixed, from, to;
    size_t n;
    cli_azeo_uncert unc;
    const char *components;
    pw_display_units units; /* --show-in */
    const char *scan_text; /* --sweep (or --scan) as given */
    const char *scan_opt;  /* which of the two spellings was used, for the messages */
    const char *minimum;   /* --minimum N as given */
} args;

static pw_status parse_scan(const char *text, pw_quantity q, args *a, pw_error *err)
{
    const char *o = a->scan_opt ? a->scan_opt : "--sweep";
    char buf[256], what[3][32];
    snprintf(what[0], sizeof what[0], "%s FROM", o);
    snprintf(what[1], sizeof what[1], "%s TO", o);
    snprintf(what[2], sizeof what[2], "%s N", o);
    snprintf(buf, sizeof buf, "%s", text);
    char *c1 = strchr(buf, ':'), *c2 = c1 ? strchr(c1 + 1, ':') : NULL;
    if (!c1 || (c2 && strchr(c2 + 1, ':'))) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "%s %s: expected FROM:TO[:N], e.g. 10kPa:500kPa:12", o, text);
        return PW_EINVAL;
    }
    *c1 = '\0';
    if (c2)
        *c2 = '\0';
    double n = 12.0; /* default number of points */
    if (cli_quantity(q, what[0], buf, &a->from, err) != PW_OK ||
        cli_quantity(q, what[1], c1 + 1, &a->to, err) != PW_OK ||
        (c2 && cli_number(what[2], c2 + 1, &n, err) != PW_OK))
        return PW_EINVAL;
    if (!(n >= 2.0 && n <= 1000.0) || n != floor(n) || a->from == a->to) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "%s %s: N must be a whole number from 2 to 1000 and FROM differ from TO",
                     o, text);
        return PW_EINVAL;
    }
    a->n = (size_t)n;
    a->scan = true;
    return PW_OK;
}

/* PW_OK (a->help set when --help was asked for), or PW_EINVAL with err filled. */
static pw_status parse(int argc, char **argv, args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    cli_args p;
    if (cli_parse(&azeo_spec, argc, argv, &p, err) != PW_OK)
        return PW_EINVAL;
    if ((a->help = p.help))
        return PW_OK;
    a->json = cli_has(&p, "--json");
    cli_azeo_uncert_from(&p, &a->unc);
    const cli_value *P = cli_get(&p, "--pressure"), *T = cli_get(&p, "--temperature");
    if (P && T) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "give one of --pressure or --temperature, once");
        return PW_EINVAL;
    }
    if (P || T) {
        a->mode = P ? PW_AZ_ISOBARIC : PW_AZ_ISOTHERMAL;
        a->fixed = P ? P->num : T->num;
        a->have_fixed = true;
    }
    const cli_value *sw = cli_get(&p, "--sweep");
    if (sw) {
        a->scan_opt = sw->spelt;
        a->scan_text = sw->text; /* parsed once the condition is known (it may be the fit's own) */
    }
    a->minimum = cli_text(&p, "--minimum");
    a->components = cli_text(&p, "--components");
    a->units = cli_show_in_get(&p);
    a->fit_path = p.n_pos ? p.pos[0] : NULL;
    if (!a->fit_path) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "a fit file is required");
        return PW_EINVAL;
    }
    return PW_OK;
}

/* Without --pressure or --temperature: the condition of the fit's own data. Then the sweep. */
static pw_status settle_condition(args *a, const pw_fit_result *fit, pw_error *err)
{
    if (!a->have_fixed) {
        bool isobaric = fit->kind == PW_DATA_ISOBARIC;
        a->mode = isobaric ? PW_AZ_ISOBARIC : PW_AZ_ISOTHERMAL;
        a->fixed = isobaric ? fit->P_fixed_Pa : fit->T_fixed_K;
        if (!(isfinite(a->fixed) && a->fixed > 0.0)) {
            pw_error_set(err, PW_EINVAL, a->fit_path, 0,
                         "the fit file records no %s of its data: give --pressure or --temperature",
                         isobaric ? "pressure" : "temperature");
            return PW_EINVAL;
        }
        a->have_fixed = true;
    }
    if (a->scan_text)
        return parse_scan(a->scan_text, a->mode == PW_AZ_ISOBARIC ? PW_QTY_PRESSURE
                                                                  : PW_QTY_TEMPERATURE, a, err);
    return PW_OK;
}

/* Every point of the scan: the scan's progress callback. */
static pw_status scan_progress(void *ctx, size_t done, size_t total)
{
    (void)ctx;
    cli_progress(CMD, "scan points", done, total);
    return PW_OK;
}

static void print_table(const pw_az_result *r, const pw_three_phase *tp, const pw_display_units *u)
{
    char b1[48], b2[48];
    if (tp->exists)
        printf("  three-phase line (two liquids and vapor) at T = %s, P = %s: layers x1 = %.6f and %.6f,"
               " vapor y1 = %.6f\n  -> %s\n",
               pw_units_display_value(u, PW_SHOW_T, ".3f", tp->T_K, b1, sizeof b1),
               pw_units_display_value(u, PW_SHOW_P, ".6g", tp->P_Pa, b2, sizeof b2), tp->x[0],
               tp->x[1], tp->y1,
               tp->heterogeneous_azeotrope
                   ? "a heterogeneous (minimum-boiling) azeotrope: the vapor lies between the layers"
                   : "no azeotrope on it: the vapor lies outside the layers (heterogeneous "
                     "non-azeotrope)");
    if (r->n == 0 && tp->exists && tp->heterogeneous_azeotrope)
        return;
    if (r->n == 0) {
        printf("  no azeotrope in 0 < x1 < 1\n");
        return;
    }
    snprintf(b1, sizeof b1, "T [%s]", pw_units_display_T_symbol(u));
    snprintf(b2, sizeof b2, "P [%s]", pw_units_display_P_symbol(u));
    printf("  %-10s %-*s %-11s %-16s %s\n", "x1", cli_width(10, b1), b1, b2, "kind",
           "gamma1, gamma2");
    for (size_t i = 0; i < r->n; i++) {
        const pw_azeotrope *z = &r->az[i];
        printf("  %-10.6f %-10.3f %-11.6g %-16s %.4f, %.4f%s\n", z->x1,
               pw_units_display_T(u, z->T_K), pw_units_display_P(u, z->P_Pa),
               pw_az_kind_name(z->kind), z->gamma[0], z->gamma[1],
               z->tangential ? "  (tangential: a double root)" : "");
    }
}

static void print_text(const pw_fit_result *fit, const args *a, const pw_az_result *r,
                       const pw_three_phase *tp, size_t n_removed, const pw_az_scan *sc,
                       const pw_three_phase *tps)
{
    const pw_system *s = &fit->sys;
    const pw_display_units *u = &a->units;
    char b1[48], b2[48];
    bool fixedP = a->mode == PW_AZ_ISOBARIC;
    printf("Azeotropes of %s (1) / %s (2), %s model, at %s\n", s->comp[0].name, s->comp[1].name,
           s->model->name,
           pw_units_display_value(u, fixedP ? PW_SHOW_P : PW_SHOW_T, fixedP ? ".6g" : ".6g",
                                  a->fixed, b1, sizeof b1));
    print_table(r, tp, u);
    if (n_removed)
        printf("  %zu crossing(s) of y1 = x1 inside the two-liquid region ignored: not azeotropes\n",
               n_removed);
    for (size_t i = 0; i < r->n_touch; i++)
        printf("  near-tangential: alpha12 reaches within %.2g of 1 at x1 = %.6f without crossing\n",
               fabs(expm1(r->touch[i].ln_alpha)), r->touch[i].x1);
    printf("  relative volatility at the pure ends: alpha12(x1 -> 0) = %.5g, alpha12(x1 -> 1) = "
           "%.5g\n",
           exp(r->ln_alpha_end[0]), exp(r->ln_alpha_end[1]));
    if (sc) {
        bool isP = sc->mode == PW_AZ_ISOBARIC;
        snprintf(b1, sizeof b1, "T [%s]", pw_units_display_T_symbol(u));
        snprintf(b2, sizeof b2, "P [%s]", pw_units_display_P_symbol(u));
        printf("\nScan over %s:\n  %-*s %-10s %-*s %s\n", isP ? "pressure" : "temperature",
               cli_width(12, isP ? b2 : b1), isP ? b2 : b1, "x1", cli_width(10, isP ? b1 : b2),
               isP ? b1 : b2, "kind");
        for (size_t k = 0; k < sc->n_points; k++) {
            const pw_az_result *p = &sc->points[k];
            double v = isP ? pw_units_display_P(u, sc->at[k]) : pw_units_display_T(u, sc->at[k]);
            bool het = tps && tps[k].exists && tps[k].heterogeneous_azeotrope;
            if (p->n == 0 && !het)
                printf("  %-12.5g %s\n", v, "none");
            if (het)
                printf("  %-12.5g %-10.6f %-10.5g %s, heterogeneous (layers %.4f, %.4f)\n", v,
                       tps[k].y1,
                       isP ? pw_units_display_T(u, tps[k].T_K) : pw_units_display_P(u, tps[k].P_Pa),
                       "minimum-boiling",
                       tps[k].x[0], tps[k].x[1]);
            for (size_t i = 0; i < p->n; i++)
                printf("  %-12.5g %-10.6f %-10.5g %s\n", v, p->az[i].x1,
                       isP ? pw_units_display_T(u, p->az[i].T_K)
                           : pw_units_display_P(u, p->az[i].P_Pa),
                       pw_az_kind_name(p->az[i].kind));
        }
        for (size_t k = 0; k < sc->n_boundaries; k++) {
            const pw_az_boundary *b = &sc->boundaries[k];
            pw_units_display_value(u, isP ? PW_SHOW_P : PW_SHOW_T, ".8g", b->at, b1, sizeof b1);
            if (b->kind == PW_AZ_BOUNDARY_PURE_END) {
                pw_units_display_value(u, isP ? PW_SHOW_P : PW_SHOW_T, ".5g", b->at, b1,
                                       sizeof b1);
                printf("  the azeotrope reaches x1 = %d at %s = %s; it exists %s that\n", b->end,
                       isP ? "P" : "T", b1, b->present_above ? "above" : "below");
                continue;
            }
            if (b->kind == PW_AZ_BOUNDARY_NOT_LOCATED) {
                printf("  the azeotrope is heterogeneous %s and not %s a value of %s between ",
                       b->present_above ? "above" : "below", b->present_above ? "below" : "above",
                       isP ? "P" : "T");
                printf("%s and ", pw_units_display_value(u, isP ? PW_SHOW_P : PW_SHOW_T, ".8g",
                                                         b->bracket[0], b2, sizeof b2));
                printf("%s, not located further: the three-phase search failed there (%s)\n",
                       pw_units_display_value(u, isP ? PW_SHOW_P : PW_SHOW_T, ".8g",
                                              b->bracket[1], b2, sizeof b2),
                       pw_strerror(b->status));
                continue;
            }
            printf("  the azeotrope is heterogeneous %s %s = %s and not %s (",
                   b->present_above ? "above" : "below", isP ? "P" : "T", b1,
                   b->present_above ? "below" : "above");
            if (isP)
                printf("T = %s there)",
                       pw_units_display_value(u, PW_SHOW_T, ".3f", b->T_K, b2, sizeof b2));
            else
                printf("P = %s there)",
                       pw_units_display_value(u, PW_SHOW_P, ".6g", b->P_Pa, b2, sizeof b2));
            if (b->kind == PW_AZ_BOUNDARY_VAPOR_AT_LAYER)
                printf(":\n    the three-phase vapor reaches the layer %s in %s (y1 = x1 = %.6f, "
                       "other layer %.6f); beyond it an azeotrope is homogeneous\n",
                       b->layer == 0 ? "poorer" : "richer", s->comp[0].name, b->y3,
                       b->x_layers[b->layer == 0 ? 1 : 0]);
            else if (b->kind == PW_AZ_BOUNDARY_LINE_ENDS)
                printf(":\n    the three-phase line ends with the vapor between the layers "
                       "(y1 = %.6f, layers %.6f and %.6f): they merge, or no three-phase state "
                       "is found beyond\n",
                       b->y3, b->x_layers[0], b->x_layers[1]);
            else
                printf(":\n    the three-phase state jumps to another line (y1 = %.6f, layers "
                       "%.6f and %.6f on the heterogeneous side)\n",
                       b->y3, b->x_layers[0], b->x_layers[1]);
            double half = 0.5 * (b->bracket[1] - b->bracket[0]);
            printf("    located to +/- %.2g %s\n",
                   isP ? pw_units_display_P(u, half) - pw_units_display_P(u, 0.0)
                       : pw_units_display_T(u, half) - pw_units_display_T(u, 0.0),
                   isP ? pw_units_display_P_symbol(u) : pw_units_display_T_symbol(u));
        }
        bool any_het = false;
        for (size_t k = 0; tps && k < sc->n_points; k++)
            any_het = any_het || (tps[k].exists && tps[k].heterogeneous_azeotrope);
        if (isfinite(sc->x1_shift))
            printf("  the azeotrope moves by %.4f in x1 over the scan (pressure swing is worth a look "
                   "from about 0.05-0.10: rule of thumb, common practice)\n",
                   sc->x1_shift);
        if (any_het)
            printf("  where it is heterogeneous, the decanter scheme crosses it at one pressure "
                   "(pinchwise decanter); no pressure swing is needed for that\n");
    }
    cli_print_caution(stdout);
}

pw_status cli_azeotrope(int argc, char **argv)
{
    args a;
    pw_error err;
    pw_error_clear(&err);
    if (parse(argc, argv, &a, &err) != PW_OK)
        return cli_fail(CMD, &err);
    if (a.help) {
        cli_help(&azeo_spec, stdout);
        return PW_OK;
    }
    pw_status rc = PW_OK;
    pw_fit_result fit;
    memset(&fit, 0, sizeof fit);
    pw_status st = cli_read_fit(CMD, a.fit_path, a.components, &fit, &err);
    if (st != PW_OK)
        return cli_fail(CMD, &err);
    size_t minimum = 0;
    if (cli_apply_minimum(CMD, a.fit_path, &fit, a.minimum, &minimum, &err) != PW_OK) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    if ((rc = settle_condition(&a, &fit, &err)) != PW_OK) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    pw_az_result r;
    pw_az_scan *sc = NULL;
    pw_three_phase tp;
    size_t n_removed = 0;
    pw_three_phase *tps = NULL;
    st = pw_azeotrope_solve(&fit.sys, a.mode, a.fixed, a.fit_path, &r, &tp, &n_removed, &err);
    if (st != PW_OK) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    if (a.unc.on && ((rc = cli_azeo_uncert_run(&fit, &r, &a.unc, &err)) != PW_OK ||
                     (tp.exists && tp.heterogeneous_azeotrope &&
                      (rc = cli_azeo_uncert_run_het(&fit, a.mode, a.fixed, &a.unc, &err)) != PW_OK))) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    if (a.scan) {
        sc = pw_az_scan_alloc(a.n);
        if (sc && cli_progress_wanted()) {
            sc->progress = scan_progress;
            sc->progress_ctx = NULL;
        }
        st = sc ? pw_azeotrope_scan(&fit.sys, a.mode, a.from, a.to, NULL, sc) : PW_ENOMEM;
        if (st != PW_OK) {
            pw_error_set(&err, st, a.fit_path, 0, "azeotrope scan failed: %s", pw_strerror(st));
            pw_az_scan_free(sc);
            pw_fit_result_free(&fit);
            return cli_fail(CMD, &err);
        }
        tps = calloc(a.n, sizeof *tps);
        st = tps ? pw_azeotrope_scan_heterogeneous(&fit.sys, sc, tps) : PW_ENOMEM;
        if (st != PW_OK) {
            pw_error_set(&err, st, a.fit_path, 0, "three-phase search in the scan failed: %s",
                         pw_strerror(st));
            free(tps);
            pw_az_scan_free(sc);
            pw_fit_result_free(&fit);
            return cli_fail(CMD, &err);
        }
    }
    double Tlo, Thi;
    pw_status range_st = pw_az_T_range(&r, sc, &Tlo, &Thi);
    cli_warn_fit(CMD, &fit, &a.units);
    cli_warn_measured_split(CMD, &fit, &r, &a.units);
    if (range_st == PW_OK)
        cli_warn_T_range(CMD, &fit, Tlo, Thi, "the bubble temperatures used", &a.units);
    if (a.json) {
        json_t *o = pw_azeotrope_doc(&fit.sys, a.mode, a.fixed, &r, sc, &tp, tps);
        if (a.unc.on)
            cli_azeo_uncert_json(&a.unc, &r, json_object_get(o, "azeotropes"));
        if (minimum)
            json_object_set_new(o, "minimum", json_integer((json_int_t)minimum));
        rc = cli_print_json(o);
    } else {
        print_text(&fit, &a, &r, &tp, n_removed, sc, tps);
        if (a.unc.on)
            cli_azeo_uncert_print(&a.unc, &r, &a.units);
        if (a.unc.het)
            cli_het_uncert_print(&a.unc.res_het, &a.unc.opt, a.mode, false, false, &a.units);
        rc = fflush(stdout) ? PW_EIO : PW_OK;
    }
    free(tps);
    pw_az_scan_free(sc);
    pw_fit_result_free(&fit);
    return rc;
}
