/* pinchwise screen: quick feasibility verdict for a split by simple distillation. */
#include "analysis_common.h"
#include "cli.h"
#include "cli_units.h"
#include "cli_options.h"
#include "column_uncert.h"

#include <math.h>
#include <pinchwise/design_doc.h>
#include <pinchwise/screen.h>
#include <stdio.h>
#include <string.h>

#define CMD "screen"

static const cli_option screen_options[] = {
    {.name = "--sweep", .alias = "--swing-range", .kind = CLI_STRING, .metavar = "FROM:TO[:N]",
     .help = "pressures of the azeotrope-shift scan (default 20kPa:500kPa:9)"},
    {.name = "--energy", .kind = CLI_FLAG,
     .help = "R_min of the rough column also with energy balances (needs\n"
             "heat data in the component rows)"},
    CLI_END,
};

static const cli_option *const screen_blocks[] = {
    cli_block_pressure, cli_block_products, cli_block_feed, screen_options,
    cli_block_uncertainty, cli_block_components, cli_block_minimum,
    cli_block_verdict, cli_block_show_in, cli_block_json, NULL,
};

static const cli_spec screen_spec = {
    .cmd = "screen",
    .synopsis =
        "usage: pinchwise screen FIT.json --pressure P --xd X --xb X [--zf X] [options]\n"
        "\n"
        "Verdict (feasible / difficult / infeasible by simple distillation) with its reasons:\n"
        "lowest relative volatility on [xb, xd], azeotrope barrier, azeotrope shift over\n"
        "20-500 kPa, rough minimum reflux and stages at total reflux. The feed composition\n"
        "defaults to 0.5, or (xb+xd)/2 when 0.5 is not between the products; --q is the feed\n"
        "of the rough column.\n",
    .blocks = screen_blocks,
    .max_positional = 1,
    .positional = "one fit file",
};

typedef struct args {
    bool help; /* --help was asked for: nothing else is set */
    const char *fit_path;
    double P_Pa, xd, xb, zf;
    bool have_P, have_xd, have_xb, json;
    pw_basis basis[3]; /* of xd, xb, zf as given */
    bool uncertainty, exit_verdict;
    bool energy; /* --energy: R_min of the rough column also with energy balances */
    const char *components, *minimum;
    pw_display_units units; /* --show-in */
    cli_uncertainty unc; /* --uncertainty, --samples, --seed */
    pw_screen_options opt;
} args;

/* --sweep FROM:TO[:N] (also spelt --swing-range): the pressures of the azeotrope-shift scan. */
static pw_status swing_range(const char *text, args *a, pw_error *err)
{
    char buf[128];
    snprintf(buf, sizeof buf, "%s", text);
    char *c = strchr(buf, ':');
    if (!c) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--sweep %s: expected FROM:TO[:N], e.g. 20kPa:5bar",
                     text);
        return PW_EINVAL;
    }
    *c = '\0';
    char *c2 = strchr(c + 1, ':');
    if (c2) {
        *c2 = '\0';
        double n;
        if (cli_number("--sweep N", c2 + 1, &n, err) != PW_OK)
            return PW_EINVAL;
        if (!(n >= 2.0 && n <= 200.0) || n != floor(n)) {
            pw_error_set(err, PW_EINVAL, NULL, 0, "--sweep %s: N must be a whole number from 2 to 200",
                         text);
            return PW_EINVAL;
        }
        a->opt.scan_points = (size_t)n;
    }
    if (cli_quantity(PW_QTY_PRESSURE, "--swing-range LO", buf, &a->opt.P_lo_Pa, err) != PW_OK ||
        cli_quantity(PW_QTY_PRESSURE, "--swing-range HI", c + 1, &a->opt.P_hi_Pa, err) != PW_OK)
        return PW_EINVAL;
    if (!(a->opt.P_hi_Pa > a->opt.P_lo_Pa)) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "--swing-range %s: HI must exceed LO", text);
        return PW_EINVAL;
    }
    return PW_OK;
}

/* PW_OK (a->help set when --help was asked for), or PW_EINVAL with err filled. */
static pw_status parse(int argc, char **argv, args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    a->zf = NAN;
    a->opt = pw_screen_default_options();
    cli_args p;
    if (cli_parse(&screen_spec, argc, argv, &p, err) != PW_OK)
        return PW_EINVAL;
    if ((a->help = p.help))
        return PW_OK;
    a->json = cli_has(&p, "--json");
    a->energy = cli_has(&p, "--energy");
    a->exit_verdict = cli_has(&p, "--exit-verdict");
    a->components = cli_text(&p, "--components");
    a->minimum = cli_text(&p, "--minimum");
    a->units = cli_show_in_get(&p);
    a->unc = cli_uncertainty_get(&p);
    a->uncertainty = a->unc.on;
    cli_targets tg;
    cli_targets_get(&p, &tg, NULL);
    a->P_Pa = tg.P_Pa, a->have_P = tg.have_P;
    a->xd = tg.xd, a->have_xd = tg.have_xd;
    a->xb = tg.xb, a->have_xb = tg.have_xb;
    if (tg.have_zf)
        a->zf = tg.zf;
    memcpy(a->basis, tg.basis, sizeof a->basis);
    if (cli_has(&p, "--q"))
        a->opt.q = tg.q;
    const char *sw = cli_text(&p, "--sweep");
    if (sw && swing_range(sw, a, err))
        return PW_EINVAL;
    a->fit_path = p.n_pos ? p.pos[0] : NULL;
    if (!a->fit_path || !a->have_P || !a->have_xd || !a->have_xb) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "a fit file and --pressure, --xd, --xb are required");
        return PW_EINVAL;
    }
    return PW_OK;
}

/* After the conversion to mole fractions: the feed between the products, in either direction. */
static pw_status check_targets(const args *a, pw_error *err)
{
    double lo = fmin(a->xb, a->xd), hi = fmax(a->xb, a->xd);
    if (!(lo < hi) || (!isnan(a->zf) && !(lo < a->zf && a->zf < hi))) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "the targets must satisfy xb < zf < xd (component 1 goes overhead) or "
                     "xd < zf < xb (component 1 leaves with the bottoms); got xb %g, zf %g, xd %g "
                     "as mole fractions of component 1",
                     a->xb, a->zf, a->xd);
        return PW_EINVAL;
    }
    return PW_OK;
}

static void print_text(const pw_fit_result *fit, const pw_screen_result *r,
                       const pw_display_units *u)
{
    char b[PW_REASON_MAX + 64];
    printf("Split screen: %s (1) / %s (2), %s model, at %s\n", fit->sys.comp[0].name,
           fit->sys.comp[1].name, fit->sys.model->name,
           pw_units_display_value(u, PW_SHOW_P, ".6g", r->P_Pa, b, sizeof b));
    printf("  targets: xd = %.4g, xb = %.4g, zf = %.4g%s\n", r->xd, r->xb, r->zf,
           r->zf_default ? " (default)" : "");
    printf("  verdict: %s\n", pw_verdict_name(r->verdict));
    for (size_t i = 0; i < r->n_reasons; i++)
        printf("   - %s\n", pw_units_display_text(u, r->reasons[i].text, b, sizeof b));
    if (isnan(r->alpha_min))
        printf("  relative volatility: not computed: every point between the targets lies inside "
               "the liquid layers\n");
    else
        printf("  relative volatility: lowest %.4f at x1 = %.4f; %.4f at xd, %.4f at xb\n",
               r->alpha_min, r->x_alpha_min, r->alpha_top, r->alpha_bottom);
    if (r->alpha_points_in_layers)
        printf("  (%zu profile points inside the liquid layers left out%s)\n",
               r->alpha_points_in_layers,
               isnan(r->alpha_top) || isnan(r->alpha_bottom)
                   ? "; nan: that product is two liquids, with no one-liquid volatility"
                   : "");
    if (r->column_ran && r->column.feasible)
        printf("  rough minimum reflux (q = 1): %.4g (%s pinch); stages at total reflux %.3g\n",
               r->column.r_min, r->column.pinch.kind == PW_PINCH_FEED ? "feed" : "tangent",
               r->column.n_min);
    if (isfinite(r->r_min_underwood))
        printf("  with the mean alpha %.4f: Underwood R_min %.4g, Fenske N_min %.3g\n",
               r->alpha_mean, r->r_min_underwood, r->n_fenske);
    printf("  thresholds: alpha below 1.1 is difficult (common practice); an azeotrope shift of\n"
           "  0.05-0.10 in x1 makes pressure swing worth a look (rule of thumb, common practice)\n");
    cli_print_caution(stdout);
}

pw_status cli_screen(int argc, char **argv)
{
    args a;
    pw_error err;
    pw_error_clear(&err);
    if (parse(argc, argv, &a, &err) != PW_OK)
        return cli_fail(CMD, &err);
    if (a.help) {
        cli_help(&screen_spec, stdout);
        return PW_OK;
    }
    pw_status rc = PW_OK;
    pw_fit_result fit;
    memset(&fit, 0, sizeof fit);
    if (cli_read_fit(CMD, a.fit_path, a.components, &fit, &err) != PW_OK)
        return cli_fail(CMD, &err);
    size_t minimum = 0;
    if (cli_apply_minimum(CMD, a.fit_path, &fit, a.minimum, &minimum, &err) != PW_OK ||
        cli_targets_to_mole(&a.xd, &a.xb, &a.zf, a.basis, &fit.sys, &err) != PW_OK ||
        check_targets(&a, &err) != 0) {
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    pw_screen_result r;
    pw_status st = pw_screen_run(&fit.sys, a.P_Pa, a.xd, a.xb, a.zf, &a.opt, &r);
    if (st != PW_OK) {
        pw_error_set(&err, st, a.fit_path, 0, "screen failed: %s", pw_strerror(st));
        pw_fit_result_free(&fit);
        return cli_fail(CMD, &err);
    }
    cli_warn_fit(CMD, &fit, &a.units);
    cli_warn_measured_split(CMD, &fit, &r.az, &a.units);
    cli_warn_T_range(CMD, &fit, r.T_lo_K, r.T_hi_K, "the temperatures used", &a.units);
    /* --uncertainty: the reflux command's propagation, for the screen's rough column (q = 1). */
    cli_column_uncert u;
    cli_column_run run;
    memset(&u, 0, sizeof u);
    memset(&run, 0, sizeof run);
    bool unc = a.uncertainty && r.column_ran;
    if (a.uncertainty && !r.column_ran)
        cli_warnf(CMD, "no column was solved for this split, so there is nothing to propagate");
    if (unc) {
        cli_column_args ra;
        memset(&ra, 0, sizeof ra);
        ra.fit_path = a.fit_path;
        ra.P_Pa = a.P_Pa;
        ra.spec = (pw_column_spec){.xd = r.xd, .xb = r.xb, .zf = r.zf, .q = a.opt.q};
        ra.opt = pw_column_default_options();
        ra.uncertainty = true;
        ra.unc = a.unc;
        run.fit = fit; /* borrowed: freed once below */
        run.P_Pa = a.P_Pa;
        run.spec = ra.spec;
        run.col = r.column;
        if ((rc = cli_column_uncert_run(&ra, &run, &u, &err)) != PW_OK) {
            pw_fit_result_free(&fit);
            return cli_fail(CMD, &err);
        }
    }
    /* --energy: the rough column (q = 1) with energy balances, from the library. */
    pw_energy_result en;
    memset(&en, 0, sizeof en);
    bool with_energy = a.energy && r.column_ran && r.column.feasible;
    if (a.energy && !with_energy)
        cli_warnf(CMD, "--energy: no feasible column was solved for this split");
    if (with_energy) {
        pw_heat_data heat;
        pw_column_spec spec = {.xd = r.xd, .xb = r.xb, .zf = r.zf, .q = 1.0};
        st = pw_heat_data_from_system(&fit.sys, &heat, &err);
        if (st == PW_OK)
            st = pw_energy_column_solve(&fit.sys, &heat, a.P_Pa, &spec, &a.opt.column, &en, NULL);
        if (st != PW_OK) {
            char msg[PW_ERROR_MSG_MAX];
            snprintf(msg, sizeof msg, "%s", err.msg[0] ? err.msg : pw_strerror(st));
            pw_error_set(&err, st, a.fit_path, 0, "--energy: %s", msg);
            pw_fit_result_free(&fit);
            return cli_fail(CMD, &err);
        }
    }
    if (a.json) {
        json_t *j = pw_screen_doc(&fit.sys, &r, &a.opt);
        if (with_energy)
            json_object_set_new(j, "energy", pw_screen_energy_doc(&en, r.column.r_min));
        if (minimum)
            json_object_set_new(j, "minimum", json_integer((json_int_t)minimum));
        if (unc)
            cli_column_uncert_json(&u, j);
        rc = cli_print_json(j);
    } else {
        print_text(&fit, &r, &a.units);
        if (with_energy && en.feasible)
            printf("  with energy balances: R_min %.4g (constant molal overflow %.4g), %s pinch\n",
                   en.r_min, r.column.r_min,
                   en.pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed");
        else if (with_energy) {
            char why[PW_REASON_MAX + 64];
            printf("  with energy balances: %s\n",
                   pw_units_display_text(&a.units, en.reason, why, sizeof why));
        }
        if (unc)
            cli_column_uncert_print(&u, &run);
        rc = fflush(stdout) ? PW_EIO : PW_OK;
    }
    pw_fit_result_free(&fit);
    if (rc == PW_OK && a.exit_verdict && r.verdict == PW_VERDICT_INFEASIBLE)
        rc = PW_EINFEASIBLE;
    return rc;
}
