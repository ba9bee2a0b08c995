/* pinchwise check DATA.csv [--components FILE] [--strict] [--sigma-y S] [--json]
 * Runs the consistency tests of the library (pinchwise/consistency.h) and prints a table or
 * one JSON object. Exit 0 when the check ran, whatever the verdict. */
#include "cli.h"

#include <math.h>
#include <pinchwise/consistency.h>
#include <pinchwise/dataset.h>
#include <stdio.h>
#include <string.h>


static void usage(FILE *f)
{
    fprintf(f, "usage: pinchwise check DATA.csv [--components FILE] [--strict] [--sigma-y S] [--json]\n"
               "  thermodynamic consistency tests of a measured binary VLE data file\n"
               "  --components FILE  extra component file (its rows take precedence)\n"
               "  --strict           every test that ran must pass for a 'consistent' verdict\n"
               "  --sigma-y S        standard uncertainty of y1 (0 < S < 1), overriding the file's\n"
               "                     '# sigma_y:'; with either, the point test's limit follows it\n"
               "                     (docs/consistency.md); without, the classic 0.01 applies\n"
               "  --json             print one JSON object on stdout\n");
}

static void print_text(const pw_dataset *ds, const pw_consistency_result *r)
{
    printf("Consistency of %s\n  %s (1) / %s (2), %s, %zu rows\n\n", ds->path, ds->names[0],
           ds->names[1],
           ds->kind == PW_DATA_ISOTHERMAL ? "isothermal" : "isobaric", ds->n);
    printf("  %-16s %12s %10s  %-7s %s\n", "test", "value", "limit", "result", "role");
    for (int i = 0; i < PW_CTEST_COUNT; i++) {
        const pw_ctest *t = &r->tests[i];
        if (t->ran)
            printf("  %-16s %12.4g %10.4g  %-7s %s\n", t->name, t->value, t->limit,
                   t->pass ? "pass" : "FAIL", r->primary[i] ? "decides" : "supports");
    }
    for (int i = 0; i < PW_CTEST_COUNT; i++)
        if (!r->tests[i].ran)
            printf("  %-16s not run: %s\n", r->tests[i].name, r->tests[i].why_not);
    if (r->uncertainty_based)
        printf("  limits from the stated uncertainties: sigma_y %.3g, sigma_x %.3g, %s %.3g%s\n",
               r->sigma_y_used, r->sigma_x_used,
               r->kind == PW_DATA_ISOTHERMAL ? "sigma_P" : "sigma_T",
               r->kind == PW_DATA_ISOTHERMAL ? 100.0 * r->sigma_P_used_rel : r->sigma_T_used_K,
               r->kind == PW_DATA_ISOTHERMAL ? " %" : " K");
    else
        printf("  no sigma_y stated: the point test uses the classic limit (docs/consistency.md)\n");
    printf("\n  => %s\n", r->consistent ? "CONSISTENT" : "NOT SHOWN CONSISTENT");
    for (size_t i = 0; i < r->n_reasons; i++)
        printf("     - %s\n", r->reasons[i]);
    if (r->legendre_terms)
        printf("\n  Legendre G^E by Barker's method: %zu terms, Van Ness index %d (rms d ln(g1/g2) %.3g)\n",
               r->legendre_terms, r->van_ness_index, r->rms_dlnratio);
    if (r->quality.ran)
        printf("  Kang-type quality factor Q = %.3f  (area %.3f, point %.3f, slope %.3g, dilution %.3f; "
               "pure %.3f)\n", r->quality.Q, r->quality.F_area, r->quality.F_point,
               r->quality.F_slope, r->quality.F_dilution, r->quality.F_pure);
    if (r->tests[PW_CTEST_POINT].ran) {
        printf("\n  %6s %8s %8s %8s %9s %10s %10s\n", "line", "x1", "y1", "y1 calc", "dy",
               "dln(g1/g2)", ds->kind == PW_DATA_ISOTHERMAL ? "dP/P" : "dT [K]");
        for (size_t i = 0; i < r->n_pts; i++) {
            const pw_cpoint *p = &r->pts[i];
            printf("  %6ld %8.4f %8.4f %8.4f %+9.4f %+10.4f %+10.3g%s\n", p->line, p->x1, p->y_exp,
                   p->y_calc, p->dy, p->dlnratio,
                   ds->kind == PW_DATA_ISOTHERMAL ? p->dP_rel : p->dT_K, p->flagged ? "  <-" : "");
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

int pw_cli_check(int argc, char **argv)
{
    const char *data = NULL, *comp_file = NULL;
    const char *sigma_y = NULL;
    bool json = false, strict = false, missing = false;
    for (int i = 1; i < argc; i++) {
        if (!strcmp(argv[i], "--help") || !strcmp(argv[i], "-h")) {
            usage(stdout);
            return 0;
        } else if (pw_cli_opt(argc, argv, &i, "--components", &comp_file, &missing)) {
            if (missing)
                return pw_cli_failf("check", PW_EXIT_USAGE, "--components needs a file name");
        } else if (pw_cli_opt(argc, argv, &i, "--json", NULL, NULL)) {
            json = true;
        } else if (pw_cli_opt(argc, argv, &i, "--strict", NULL, NULL)) {
            strict = true;
        } else if (pw_cli_opt(argc, argv, &i, "--sigma-y", &sigma_y, &missing)) {
            if (missing)
                return pw_cli_failf("check", PW_EXIT_USAGE, "--sigma-y needs a value");
        } else if (argv[i][0] == '-' && argv[i][1] != '\0') {
            return pw_cli_failf("check", PW_EXIT_USAGE, "unknown option '%s'", argv[i]);
        } else if (data) {
            return pw_cli_failf("check", PW_EXIT_USAGE, "more than one data file ('%s' and '%s')",
                                data, argv[i]);
        } else {
            data = argv[i];
        }
    }
    if (!data) {
        return pw_cli_failf("check", PW_EXIT_USAGE, "no data file given");
    }
    pw_error err;
    pw_error_clear(&err);
    pw_complib lib;
    pw_dataset ds;
    memset(&ds, 0, sizeof ds);
    if (pw_cli_load_components(&lib, comp_file, &err) != PW_OK)
        return pw_cli_fail("check", &err);
    if (pw_dataset_read(data, &ds, &err) != PW_OK) {
        pw_complib_free(&lib);
        return pw_cli_fail("check", &err);
    }
    pw_component found[2];
    const pw_component *c[2] = {&found[0], &found[1]};
    pw_status st = pw_dataset_components(&lib, &ds, found, &err);
    pw_consistency_result r;
    memset(&r, 0, sizeof r);
    pw_consistency_options o = pw_consistency_default_options();
    o.strict_verdict = strict;
    if (sigma_y) {
        double v = NAN;
        if (pw_cli_number("--sigma-y", sigma_y, &v, &err) != PW_OK)
            return pw_cli_fail("check", &err);
        if (!(v > 0.0 && v < 1.0))
            return pw_cli_failf("check", PW_EXIT_USAGE,
                                "--sigma-y %s: expected a mole-fraction uncertainty between 0 and 1 "
                                "(e.g. 0.002)", sigma_y);
        o.sigma_y = v;
    }
    if (st == PW_OK)
        st = pw_consistency_run(&ds, c[0], c[1], &o, &r, &err);
    int code = 0;
    if (st != PW_OK) {
        code = pw_cli_fail("check", &err);
    } else {
        for (int i = 0; i < 2; i++) {
            double Tlo = INFINITY, Thi = -INFINITY;
            for (size_t k = 0; k < ds.n; k++)
                Tlo = fmin(Tlo, ds.pts[k].T_K), Thi = fmax(Thi, ds.pts[k].T_K);
            if (pw_component_range_excess_K(c[i], Tlo) != 0.0 || pw_component_range_excess_K(c[i], Thi) != 0.0)
                pw_cli_warnf("check", "%s: the data's temperatures %.2f-%.2f K leave the validity "
                             "range %.2f-%.2f K of the %s vapor-pressure correlation", ds.path, Tlo,
                             Thi, c[i]->T_min_K, c[i]->T_max_K, c[i]->name);
        }
        if (json)
            code = pw_cli_print_json(pw_check_doc(&ds, &r, strict));
        else
            print_text(&ds, &r);
    }
    pw_consistency_result_free(&r);
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
    return code;
}
