/* pinchwise check DATA.csv [--components FILE] [--strict] [--sigma-y S] [--json]
 * Runs the consistency tests of the library (pinchwise/consistency.h) and prints a table or
 * one JSON object. Exit 0 when the check ran, whatever the verdict. */
#include "cli.h"
#include "cli_options.h"
#include "cli_units.h"

#include <pinchwise/composition.h>

#include <pinchwise/hetcheck.h>

#include <math.h>
#include <pinchwise/consistency.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <string.h>


static const cli_option check_options[] = {
    {.name = "--strict", .kind = CLI_FLAG,
     .help = "every test that ran must pass for a 'consistent' verdict"},
    {.name = "--sigma-y", .kind = CLI_STRING, .metavar = "S",
     .help = "standard uncertainty of y1 (0 < S < 1), overriding the file's\n"
             "'# sigma_y:'; with either, the point test's limit follows it\n"
             "(docs/consistency.md); without, the classic 0.01 applies"},
    CLI_END,
};

static const cli_option check_verdict[] = {
    {.name = "--exit-verdict", .kind = CLI_FLAG,
     .help = "exit with status 7 when the data are not shown consistent"},
    CLI_END,
};

static const cli_option *const check_blocks[] = {
    check_options, cli_block_components, check_verdict, cli_block_show_in, cli_block_json, NULL,
};

static const cli_spec check_spec = {
    .cmd = "check",
    .synopsis = "usage: pinchwise check DATA.csv [options]\n"
                "\n"
                "Thermodynamic consistency tests of a measured binary VLE data file.\n",
    .blocks = check_blocks,
    .max_positional = 1,
    .positional = "one data file",
};

/* What each test's value is and its unit, for the table (the JSON carries the criterion). */
static void value_words(const pw_ctest *t, bool isothermal, const char **what, const char **unit,
                        double *scale)
{
    *scale = 1.0;
    switch (t->id) {
    case PW_CTEST_AREA:
        *what = "D: imbalance of the ln(gamma1/gamma2) areas above and below zero";
        *unit = "%";
        break;
    case PW_CTEST_HERINGTON:
        *what = "D - J: area imbalance D less the allowance J for heats of mixing";
        *unit = "% points";
        break;
    case PW_CTEST_POINT:
        *what = "mean |y calculated - y measured|";
        *unit = "mole fraction";
        break;
    case PW_CTEST_DILUTION:
        *what = "max(I1, I2): disagreement of the two infinite-dilution extrapolations";
        *unit = "%";
        break;
    case PW_CTEST_SLOPE:
        *what = "mismatch of the G^E slope and ln(gamma1/gamma2), summed over the points";
        *unit = "%";
        break;
    case PW_CTEST_ENDPOINT:
        *what = isothermal ? "largest |P measured - P sat| / P sat at a pure-component row"
                           : "largest |T measured - T sat| at a pure-component row";
        *unit = isothermal ? "%" : "K";
        *scale = isothermal ? 100.0 : 1.0;
        break;
    case PW_CTEST_SCATTER:
        *what = "sqrt(chi2/dof) of the point test's residuals in units of the stated "
                "uncertainties (1 = scatter as stated)";
        *unit = "x stated";
        break;
    default:
        *what = "";
        *unit = "";
        break;
    }
}

/* "v unit", or "not applicable, because why" when v is not a number. */
static const char *with_unit(double v, bool fixed3, const char *unit, const char *why,
                             char *buf, size_t cap)
{
    if (!isfinite(v)) {
        snprintf(buf, cap, "not applicable, because %s", why && why[0] ? why : "it could not be computed");
        return buf;
    }
    int n = fixed3 ? snprintf(buf, cap, "%.3f", v) : snprintf(buf, cap, "%.4g", v);
    if (n > 0 && (size_t)n < cap && unit && unit[0])
        snprintf(buf + n, cap - (size_t)n, " %s", unit);
    return buf;
}

static void print_text(const pw_dataset *ds, const pw_consistency_result *r,
                       const pw_display_units *u)
{
    bool iso = ds->kind == PW_DATA_ISOTHERMAL;
    printf("Consistency of %s\n  %s (1) / %s (2), %s, %zu rows\n\n", ds->path, ds->names[0],
           ds->names[1], iso ? "isothermal" : "isobaric", ds->n);
    printf("  %-16s %-22s %-20s %-7s %s\n", "test", "value", "pass below", "result", "role");
    for (int i = 0; i < PW_CTEST_COUNT; i++) {
        const pw_ctest *t = &r->tests[i];
        if (!t->ran)
            continue;
        const char *what, *unit;
        double sc;
        value_words(t, iso, &what, &unit, &sc);
        if (!strcmp(unit, "K")) { /* a temperature difference */
            sc = pw_units_display_dT(u, 1.0);
            unit = pw_units_display_dT_symbol(u);
        }
        char v[64], l[64];
        printf("  %-16s %-22s %-20s %-7s %s\n", t->name,
               with_unit(t->value * sc, false, unit, NULL, v, sizeof v),
               with_unit(t->limit * sc, false, unit, NULL, l, sizeof l),
               t->pass ? "pass" : "FAIL", r->primary[i] ? "decides" : "supports");
        printf("  %-16s   value: %s\n", "", what);
        if (t->id == PW_CTEST_HERINGTON) /* the allowance's formula needs kelvin: always K */
            printf("  %-16s   D = %.4g %%, J = %.4g %% (J = 150 x %.4g K / %.4g K)\n", "",
                   r->herington_D, r->herington_J, r->herington_theta_K, r->herington_Tmin_K);
        if ((t->id == PW_CTEST_HERINGTON || t->id == PW_CTEST_AREA) && isfinite(r->gap_bridge))
            printf("  %-16s   two-liquid gap bridged between x1 = %.4g and %.4g by the step of "
                   "G^E/RT, %.4g;\n  %-16s   each liquid branch smoothed on its own (degrees %d "
                   "and %d)\n", "", r->gap_bridge_x1[0], r->gap_bridge_x1[1], r->gap_bridge, "",
                   r->area_degree, r->area_degree_upper);
    }
    for (int i = 0; i < PW_CTEST_COUNT; i++)
        if (!r->tests[i].ran)
            printf("  %-16s not run, because %s\n", r->tests[i].name, r->tests[i].why_not);
    if (r->uncertainty_based)
        printf("  limits from the stated uncertainties: sigma_y %.3g, sigma_x %.3g, %s %.3g %s\n",
               r->sigma_y_used, r->sigma_x_used,
               r->kind == PW_DATA_ISOTHERMAL ? "sigma_P" : "sigma_T",
               r->kind == PW_DATA_ISOTHERMAL ? 100.0 * r->sigma_P_used_rel
                                             : pw_units_display_dT(u, r->sigma_T_used_K),
               r->kind == PW_DATA_ISOTHERMAL ? "%" : pw_units_display_dT_symbol(u));
    else
        printf("  no sigma_y stated: the point test uses the classic limit (docs/consistency.md)\n");
    printf("\n  => %s\n", r->consistent ? "CONSISTENT" : "NOT SHOWN CONSISTENT");
    for (size_t i = 0; i < r->n_reasons; i++) {
        char why[PW_CONSISTENCY_REASON_MAX + 64];
        printf("     - %s\n", pw_units_display_text(u, r->reasons[i], why, sizeof why));
    }
    if (r->legendre_terms)
        printf("\n  Legendre G^E by Barker's method: %zu terms, Van Ness index %d (rms of d ln(g1/g2) "
               "%.3g, dimensionless)\n",
               r->legendre_terms, r->van_ness_index, r->rms_dlnratio);
    if (r->quality.ran) {
        const pw_cquality *q = &r->quality;
        char a[200], b[200], c[200], d[200], e[200];
        printf("  evidence score S = %.3f (0 to 1, dimensionless, 1 best; weighting after Kang et\n"
               "  al. 2010) = pure-component part x (sum of the four others):\n"
               "    area %s; point %s;\n    slope %s;\n    dilution %s; pure components %s\n",
               q->Q, with_unit(q->F_area, true, "", r->tests[PW_CTEST_AREA].why_not, a, sizeof a),
               with_unit(q->F_point, true, "", r->tests[PW_CTEST_POINT].why_not, b, sizeof b),
               with_unit(q->F_slope, true, "", r->tests[PW_CTEST_SLOPE].why_not, c, sizeof c),
               with_unit(q->F_dilution, true, "", r->tests[PW_CTEST_DILUTION].why_not, d, sizeof d),
               with_unit(q->F_pure, true, "", r->tests[PW_CTEST_ENDPOINT].why_not, e, sizeof e));
    }
    if (r->tests[PW_CTEST_POINT].ran) {
        char dT_head[24];
        snprintf(dT_head, sizeof dT_head, "dT [%s]", pw_units_display_dT_symbol(u));
        printf("\n  %6s %8s %8s %8s %9s %10s %*s\n", "line", "x1", "y1", "y1 calc", "dy",
               "dln(g1/g2)", cli_width(10, ds->kind == PW_DATA_ISOTHERMAL ? "dP/P" : dT_head),
               ds->kind == PW_DATA_ISOTHERMAL ? "dP/P" : dT_head);
        for (size_t i = 0; i < r->n_pts; i++) {
            const pw_cpoint *p = &r->pts[i];
            printf("  %6ld %8.4f %8.4f %8.4f %+9.4f %+10.4f %+10.3g%s\n", p->line, p->x1, p->y_exp,
                   p->y_calc, p->dy, p->dlnratio,
                   ds->kind == PW_DATA_ISOTHERMAL ? p->dP_rel : pw_units_display_dT(u, p->dT_K),
                   p->flagged ? "  <-" : "");
        }
        for (size_t i = 0; i < r->n_pts; i++)
            if (r->pts[i].flagged)
                printf("  line %ld: %s\n", r->pts[i].line, r->pts[i].why);
    }
    printf("\n");
    size_t n_cautions;
    const char *const *cautions = pw_check_cautions(&n_cautions);
    for (size_t i = 0; i < n_cautions; i++)
        printf("  Caution: %s\n", cautions[i]);
}

static void print_het(const pw_het_check *h)
{
    if (!h->n)
        return;
    printf("Three-phase points (lines");
    for (size_t i = 0; i < h->n; i++)
        printf("%s %ld", i ? "," : "", h->pts[i].line);
    printf("): %s.\n", pw_het_check_reason());
    printf("  largest apparent activity y_i P / P_i^sat: %.4f (%s)\n\n", h->max_bound,
           h->bound_ok ? "within the bound 1" : "ABOVE 1: y, T or P of these points is doubtful");
}

pw_status cli_check(int argc, char **argv)
{
    cli_args p;
    pw_error perr;
    if (cli_parse(&check_spec, argc, argv, &p, &perr) != PW_OK)
        return cli_fail("check", &perr);
    if (p.help) {
        cli_help(&check_spec, stdout);
        return PW_OK;
    }
    const char *data = p.n_pos ? p.pos[0] : NULL;
    const char *comp_file = cli_text(&p, "--components");
    const char *sigma_y = cli_text(&p, "--sigma-y");
    bool json = cli_has(&p, "--json"), strict = cli_has(&p, "--strict");
    bool exit_verdict = cli_has(&p, "--exit-verdict");
    const pw_display_units units = cli_show_in_get(&p);
    if (!data) {
        return cli_failf("check", PW_EINVAL, "no data file given");
    }
    pw_error err;
    pw_error_clear(&err);
    pw_complib lib;
    pw_dataset ds;
    memset(&ds, 0, sizeof ds);
    if (cli_load_components(&lib, comp_file, &err) != PW_OK)
        return cli_fail("check", &err);
    if (pw_dataset_read(data, &ds, &err) != PW_OK) {
        pw_complib_free(&lib);
        return cli_fail("check", &err);
    }
    pw_component found[2];
    const pw_component *c[2] = {&found[0], &found[1]};
    pw_status st = pw_dataset_components(&lib, &ds, found, &err);
    if (st == PW_OK)
        st = pw_dataset_to_mole(&ds, c[0], c[1], &err); /* w1, wy1 columns */
    pw_consistency_result r;
    memset(&r, 0, sizeof r);
    pw_consistency_options o = pw_consistency_default_options();
    o.strict_verdict = strict;
    if (sigma_y) {
        double v = NAN;
        if (cli_number("--sigma-y", sigma_y, &v, &err) == PW_OK && !(v > 0.0 && v < 1.0))
            pw_error_set(&err, PW_EINVAL, NULL, 0,
                         "--sigma-y %s: expected a mole-fraction uncertainty between 0 and 1 "
                         "(e.g. 0.002)", sigma_y);
        if (err.status != PW_OK && st == PW_OK)
            st = err.status;
        o.sigma_y = v;
    }
    /* points inside the two-liquid region: out of the one-liquid tests (docs/heterogeneous.md) */
    pw_het_check het;
    memset(&het, 0, sizeof het);
    if (st == PW_OK)
        st = pw_check_data(&ds, c[0], c[1], &o, &het, &r, &err);
    pw_status code = PW_OK;
    if (st != PW_OK) {
        code = cli_fail("check", &err);
    } else {
        double Tlo, Thi;
        pw_range_check range;
        if (pw_dataset_T_range(&ds, &Tlo, &Thi) == PW_OK &&
            pw_component_range_check(c[0], c[1], Tlo, Thi, &range) == PW_OK)
            for (int i = 0; i < 2; i++) {
                if (!(range.below_K[i] > 0.0 || range.above_K[i] > 0.0))
                    continue;
                char b[4][48];
                cli_warnf("check", "%s: the data's temperatures %s to %s leave the validity "
                          "range %s to %s of the %s vapor-pressure correlation", ds.path,
                          pw_units_display_value(&units, PW_SHOW_T, ".2f", Tlo, b[0], 48),
                          pw_units_display_value(&units, PW_SHOW_T, ".2f", Thi, b[1], 48),
                          pw_units_display_value(&units, PW_SHOW_T, ".2f", c[i]->T_min_K, b[2], 48),
                          pw_units_display_value(&units, PW_SHOW_T, ".2f", c[i]->T_max_K, b[3], 48),
                          c[i]->name);
            }
        if (json) {
            code = cli_print_json(pw_check_doc(&ds, &r, strict, &het));
        } else {
            print_het(&het);
            print_text(&ds, &r, &units);
        }
        if (code == PW_OK && exit_verdict && !r.consistent)
            code = PW_EINFEASIBLE;
    }
    pw_het_check_free(&het, NULL);
    pw_consistency_result_free(&r);
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
    return code;
}
