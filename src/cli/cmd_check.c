/* pinchwise check DATA.csv [--components FILE] [--strict] [--json]
 * Runs the consistency tests of the library (pinchwise/consistency.h) and prints a table or
 * one JSON object. Exit 0 when the check ran, whatever the verdict. */
#include "cli.h"
#include "cli_units.h"

#include <pinchwise/composition.h>

#include <math.h>
#include <pinchwise/consistency.h>
#include <pinchwise/dataset.h>
#include <stdio.h>
#include <string.h>

static const char *const cautions[] = {
    "Screening only: consistency tests judge measured data, not a design. Verify any design with "
    "rigorous simulation, validated property methods and pilot or laboratory data.",
    "A failed test means the data (or the vapor pressures used) carry errors; a model fitted to "
    "them may give wrong azeotropes, pinches and stage counts.",
    "Designs based on these results must follow local codes and be reviewed by a qualified "
    "(licensed where required) engineer; consult each chemical's Safety Data Sheet.",
};

static void usage(FILE *f)
{
    fprintf(f, "usage: pinchwise check DATA.csv [--components FILE] [--strict] [--json]\n"
               "  thermodynamic consistency tests of a measured binary VLE data file\n"
               PW_CLI_HELP_COMPONENTS
               "  --exit-verdict     exit with status 7 when the data are not shown consistent\n"
               "  --strict           every test that ran must pass for a 'consistent' verdict\n"
               "  --json             print one JSON object on stdout\n");
}

static pw_status find_component(const pw_complib *lib, const pw_dataset *ds, int i,
                                const pw_component **out, pw_error *err)
{
    *out = pw_complib_find(lib, ds->names[i]);
    if (*out)
        return PW_OK;
    const char *near[4];
    size_t n = pw_complib_suggest(lib, ds->names[i], near, 4);
    char list[400] = "";
    size_t len = 0;
    for (size_t k = 0; k < n && len < sizeof list; k++)
        len += (size_t)snprintf(list + len, sizeof list - len, "%s'%s'", k ? ", " : "", near[k]);
    return pw_error_set(err, PW_ENOTFOUND, ds->path, 0,
                        "component '%s' is not in the component library%s%s%s (add it with "
                        "--components FILE)", ds->names[i], n ? " (did you mean " : "", list,
                        n ? "?)" : "");
}

static json_t *test_details(const pw_consistency_result *r, const pw_ctest *t)
{
    json_t *d = json_object();
    switch (t->id) {
    case PW_CTEST_AREA:
        json_object_set_new(d, "area_above", pw_cli_json_num(r->area_A));
        json_object_set_new(d, "area_below", pw_cli_json_num(r->area_B));
        json_object_set_new(d, "smoothing_degree", json_integer(r->area_degree));
        break;
    case PW_CTEST_HERINGTON:
        json_object_set_new(d, "D", pw_cli_json_num(r->herington_D));
        json_object_set_new(d, "J", pw_cli_json_num(r->herington_J));
        json_object_set_new(d, "theta_K", pw_cli_json_num(r->herington_theta_K));
        json_object_set_new(d, "T_min_K", pw_cli_json_num(r->herington_Tmin_K));
        json_object_set_new(d, "area_above", pw_cli_json_num(r->area_A));
        json_object_set_new(d, "area_below", pw_cli_json_num(r->area_B));
        break;
    case PW_CTEST_POINT:
        json_object_set_new(d, "legendre_terms", json_integer((json_int_t)r->legendre_terms));
        json_object_set_new(d, "rms_dln_gamma_ratio", pw_cli_json_num(r->rms_dlnratio));
        json_object_set_new(d, "van_ness_index", json_integer(r->van_ness_index));
        break;
    case PW_CTEST_DILUTION:
        json_object_set_new(d, "I1", pw_cli_json_num(r->I1));
        json_object_set_new(d, "I2", pw_cli_json_num(r->I2));
        json_object_set_new(d, "ln_gamma1_inf", pw_cli_json_num(r->lngamma1_inf));
        json_object_set_new(d, "ln_gamma2_inf", pw_cli_json_num(r->lngamma2_inf));
        break;
    case PW_CTEST_ENDPOINT:
        json_object_set_new(d, "deviation_at_x1_0", pw_cli_json_num(r->endpoint_dev[0]));
        json_object_set_new(d, "deviation_at_x1_1", pw_cli_json_num(r->endpoint_dev[1]));
        json_object_set_new(d, "deviation_unit",
                            json_string(r->kind == PW_DATA_ISOTHERMAL ? "relative P" : "K"));
        break;
    default:
        break;
    }
    return d;
}

static json_t *result_json(const pw_dataset *ds, const pw_consistency_result *r, bool strict)
{
    json_t *o = json_object(), *tests = json_array(), *not_run = json_array();
    for (int i = 0; i < PW_CTEST_COUNT; i++) {
        const pw_ctest *t = &r->tests[i];
        json_t *e = json_object();
        json_object_set_new(e, "name", json_string(t->name));
        if (t->ran) {
            json_object_set_new(e, "value", pw_cli_json_num(t->value));
            json_object_set_new(e, "limit", pw_cli_json_num(t->limit));
            json_object_set_new(e, "pass", json_boolean(t->pass));
            json_object_set_new(e, "source", json_string(t->source));
            json_object_set_new(e, "ran", json_true());
            json_object_set_new(e, "title", json_string(t->title));
            json_object_set_new(e, "criterion", json_string(t->criterion));
            json_object_set_new(e, "meaning", json_string(t->meaning));
            json_object_set_new(e, "primary", json_boolean(r->primary[i]));
            json_object_set_new(e, "details", test_details(r, t));
            json_array_append_new(tests, e);
        } else {
            json_object_set_new(e, "ran", json_false());
            json_object_set_new(e, "reason", json_string(t->why_not));
            json_object_set_new(e, "title", json_string(t->title));
            json_object_set_new(e, "source", json_string(t->source));
            json_array_append_new(not_run, e);
        }
    }
    json_object_set_new(o, "tests", tests);
    json_object_set_new(o, "consistent", json_boolean(r->consistent));
    json_object_set_new(o, "dataset", json_string(ds->path));
    json_object_set_new(o, "components", json_pack("[ss]", ds->names[0], ds->names[1]));
    json_object_set_new(o, "kind", json_string(ds->kind == PW_DATA_ISOTHERMAL ? "isothermal" : "isobaric"));
    json_object_set_new(o, "not_run", not_run);
    json_object_set_new(o, "verdict_rule",
                        json_string(strict ? "strict: every test that ran must pass"
                                           : "primary: legendre_point and pure_endpoints decide "
                                             "(area and Kojima tests when the point test cannot run); "
                                             "other failures are warnings"));
    json_t *reasons = json_array();
    for (size_t i = 0; i < r->n_reasons; i++)
        json_array_append_new(reasons, json_string(r->reasons[i]));
    json_object_set_new(o, "reasons", reasons);

    json_t *leg = json_object(), *coef = json_array(), *aicc = json_object();
    for (size_t k = 0; k < r->legendre_terms; k++)
        json_array_append_new(coef, pw_cli_json_num(r->legendre_a[k]));
    for (size_t k = 1; k <= PW_CONSISTENCY_MAX_TERMS; k++)
        if (isfinite(r->legendre_aicc[k])) {
            char key[8];
            snprintf(key, sizeof key, "%zu", k);
            json_object_set_new(aicc, key, json_real(r->legendre_aicc[k]));
        }
    json_object_set_new(leg, "terms", json_integer((json_int_t)r->legendre_terms));
    json_object_set_new(leg, "coefficients", coef);
    json_object_set_new(leg, "aicc_by_terms", aicc);
    json_object_set_new(leg, "rms_residual", pw_cli_json_num(r->legendre_rms));
    json_object_set_new(leg, "residual_unit", json_string(ds->kind == PW_DATA_ISOTHERMAL ? "relative P" : "K"));
    json_object_set_new(o, "legendre_fit", leg);
    json_object_set_new(o, "van_ness_index", r->van_ness_index ? json_integer(r->van_ness_index) : json_null());

    const pw_cquality *q = &r->quality;
    json_t *qj = json_object();
    json_object_set_new(qj, "Q", pw_cli_json_num(q->Q));
    json_object_set_new(qj, "F_area", pw_cli_json_num(q->F_area));
    json_object_set_new(qj, "F_point", pw_cli_json_num(q->F_point));
    json_object_set_new(qj, "F_slope", pw_cli_json_num(q->F_slope));
    json_object_set_new(qj, "F_dilution", pw_cli_json_num(q->F_dilution));
    json_object_set_new(qj, "F_pure", pw_cli_json_num(q->F_pure));
    json_object_set_new(qj, "note", json_string(q->note));
    json_object_set_new(o, "quality_factor", qj);

    json_t *pts = json_array(), *flagged = json_array();
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_cpoint *p = &r->pts[i];
        json_t *e = json_object();
        json_object_set_new(e, "line", json_integer(p->line));
        json_object_set_new(e, "x1", pw_cli_json_num(p->x1));
        json_object_set_new(e, "y1", pw_cli_json_num(p->y_exp));
        json_object_set_new(e, "y1_calc", pw_cli_json_num(p->y_calc));
        json_object_set_new(e, "dy", pw_cli_json_num(p->dy));
        json_object_set_new(e, "dln_gamma_ratio", pw_cli_json_num(p->dlnratio));
        if (ds->kind == PW_DATA_ISOTHERMAL)
            json_object_set_new(e, "dP_rel", pw_cli_json_num(p->dP_rel));
        else
            json_object_set_new(e, "dT_K", pw_cli_json_num(p->dT_K));
        json_object_set_new(e, "flagged", json_boolean(p->flagged));
        json_array_append_new(pts, e);
        if (p->flagged)
            json_array_append_new(flagged, json_pack("{sI sf ss}", "line", (json_int_t)p->line, "x1",
                                                     p->x1, "why", p->why));
    }
    json_object_set_new(o, "points", pts);
    json_object_set_new(o, "flagged", flagged);
    json_t *cj = json_array();
    for (size_t i = 0; i < sizeof cautions / sizeof cautions[0]; i++)
        json_array_append_new(cj, json_string(cautions[i]));
    json_object_set_new(o, "cautions", cj);
    return o;
}

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

static void print_text(const pw_dataset *ds, const pw_consistency_result *r)
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
        char v[64], l[64];
        printf("  %-16s %-22s %-20s %-7s %s\n", t->name,
               with_unit(t->value * sc, false, unit, NULL, v, sizeof v),
               with_unit(t->limit * sc, false, unit, NULL, l, sizeof l),
               t->pass ? "pass" : "FAIL", r->primary[i] ? "decides" : "supports");
        printf("  %-16s   value: %s\n", "", what);
        if (t->id == PW_CTEST_HERINGTON)
            printf("  %-16s   D = %.4g %%, J = %.4g %% (J = 150 x %.4g K / %.4g K)\n", "",
                   r->herington_D, r->herington_J, r->herington_theta_K, r->herington_Tmin_K);
    }
    for (int i = 0; i < PW_CTEST_COUNT; i++)
        if (!r->tests[i].ran)
            printf("  %-16s not run, because %s\n", r->tests[i].name, r->tests[i].why_not);
    printf("\n  => %s\n", r->consistent ? "CONSISTENT" : "NOT SHOWN CONSISTENT");
    for (size_t i = 0; i < r->n_reasons; i++)
        printf("     - %s\n", r->reasons[i]);
    if (r->legendre_terms)
        printf("\n  Legendre G^E by Barker's method: %zu terms, Van Ness index %d (rms of d ln(g1/g2) "
               "%.3g, dimensionless)\n",
               r->legendre_terms, r->van_ness_index, r->rms_dlnratio);
    if (r->quality.ran) {
        const pw_cquality *q = &r->quality;
        char a[200], b[200], c[200], d[200], e[200];
        printf("  quality score Q = %.3f (0 to 1, dimensionless, 1 best) = pure-component part x (sum\n"
               "  of the four others):\n"
               "    area %s; point %s;\n    slope %s;\n    dilution %s; pure components %s\n",
               q->Q, with_unit(q->F_area, true, "", r->tests[PW_CTEST_AREA].why_not, a, sizeof a),
               with_unit(q->F_point, true, "", r->tests[PW_CTEST_POINT].why_not, b, sizeof b),
               with_unit(q->F_slope, true, "", r->tests[PW_CTEST_SLOPE].why_not, c, sizeof c),
               with_unit(q->F_dilution, true, "", r->tests[PW_CTEST_DILUTION].why_not, d, sizeof d),
               with_unit(q->F_pure, true, "", r->tests[PW_CTEST_ENDPOINT].why_not, e, sizeof e));
    }
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
    for (size_t i = 0; i < sizeof cautions / sizeof cautions[0]; i++)
        printf("  Caution: %s\n", cautions[i]);
}

int pw_cli_check(int argc, char **argv)
{
    const char *data = NULL, *comp_file = NULL;
    bool json = false, strict = false, missing = false, exit_verdict = false;
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
        } else if (pw_cli_opt(argc, argv, &i, "--exit-verdict", NULL, NULL)) {
            exit_verdict = true;
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
    const pw_component *c[2] = {NULL, NULL};
    pw_status st = find_component(&lib, &ds, 0, &c[0], &err);
    if (st == PW_OK)
        st = find_component(&lib, &ds, 1, &c[1], &err);
    if (st == PW_OK)
        st = pw_dataset_to_mole(&ds, c[0], c[1], &err); /* w1, wy1 columns */
    pw_consistency_result r;
    memset(&r, 0, sizeof r);
    pw_consistency_options o = pw_consistency_default_options();
    o.strict_verdict = strict;
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
            code = pw_cli_print_json(result_json(&ds, &r, strict));
        else
            print_text(&ds, &r);
        if (code == 0 && exit_verdict && !r.consistent)
            code = PW_CLI_EXIT_VERDICT;
    }
    pw_consistency_result_free(&r);
    pw_dataset_free(&ds);
    pw_complib_free(&lib);
    return code;
}
