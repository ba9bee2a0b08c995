/* pinchwise reflux: minimum reflux with the limiting pinch, stages at total reflux, and the design
 * table at 1.2, 1.3 and 1.5 times R_min, for a fitted model at a pressure. */
#include "cli.h"
#include "cli_units.h"
#include "reflux_common.h"
#include "reflux_uncert.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

static void usage(FILE *f)
{
    fprintf(f,
            "usage: pinchwise reflux FIT.json --pressure P --xd X --xb X --zf X [--q Q] [options]\n"
            "\n"
            "Binary column, constant molal overflow, total condenser, partial reboiler.\n"
            "  --pressure P        column pressure with its unit, e.g. 101.325kPa, 1atm, 2bar\n"
            "  --xd, --xb, --zf    distillate, bottoms, feed compositions of component 1: a mole\n"
            "                      fraction, or with mol%%, wt or wt%% (e.g. 99.5wt%%); either\n"
            "                      direction: xb < zf < xd, or xd < zf < xb when component 1\n"
            "                      leaves with the bottoms\n"
            "  --q Q               feed liquid fraction (1 saturated liquid, 0 saturated vapor,\n"
            "                      > 1 subcooled, < 0 superheated; default 1)\n"
            "  --factors F,F,...   design reflux as multiples of R_min (default 1.2,1.3,1.5;\n"
            "                      --operating-factor F is the same with one value)\n"
            "  --uncertainty       intervals of R_min, boil-up and stages from the fit's parameter\n"
            "                      covariance, feasibility risk, where to measure next\n"
            "  --samples N         parameter sets drawn for --uncertainty (default 400)\n"
            "  --seed N            random seed of the draws (default 1)\n"
            "  --compare FIT.json  another model's fit of the same data (repeatable): R_min\n"
            "                      side by side, ranked by AICc\n"
            PW_CLI_HELP_COMPONENTS
            PW_CLI_HELP_MINIMUM
            PW_CLI_HELP_EXIT_VERDICT
            "  --json              print one JSON object on stdout\n");
}

static const char *pinch_kind(pw_pinch_kind k) { return k == PW_PINCH_FEED ? "feed" : "tangent"; }
static const char *section(pw_section s)
{
    return s == PW_SECTION_RECTIFYING ? "rectifying" : "stripping";
}

json_t *pw_reflux_json(const pw_reflux_run *run)
{
    const pw_column_result *c = &run->col;
    json_t *o = json_object();
    json_object_set_new(o, "feasible", json_boolean(c->feasible));
    json_object_set_new(o, "reason", c->feasible ? json_null() : json_string(c->reason));
    json_object_set_new(o, "r_min", c->feasible ? pw_cli_json_num(c->r_min) : json_null());
    if (c->feasible && !c->reflux_limited) {
        json_t *p = json_object();
        json_object_set_new(p, "kind", json_string(pinch_kind(c->pinch.kind)));
        json_object_set_new(p, "section", json_string(section(c->pinch.section)));
        json_object_set_new(p, "x", pw_cli_json_num(c->pinch.x));
        json_object_set_new(p, "y", pw_cli_json_num(c->pinch.y));
        json_object_set_new(o, "pinch", p);
    } else {
        json_object_set_new(o, "pinch", json_null());
    }
    json_object_set_new(o, "n_min", c->feasible ? pw_cli_json_num(c->n_min) : json_null());
    json_object_set_new(o, "limit",
                        !c->feasible ? json_null()
                        : c->reflux_limited
                            ? json_string("no reflux needed: at R = 0 the operating lines clear the "
                                          "equilibrium curve (a stripping column with the feed on "
                                          "top makes the distillate); no pinch limits")
                        : c->boilup_limited && c->pinch.kind == PW_PINCH_FEED
                            ? json_string("zero boil-up: the feed's vapor is all the rectifying "
                                          "section gets; the operating lines meet on the q-line "
                                          "at xb")
                            : json_string("pinch"));
    json_object_set_new(o, "boilup_min", c->feasible ? pw_cli_json_num(c->s_min) : json_null());
    json_object_set_new(o, "r_min_feed_point_only", c->feasible ? pw_cli_json_num(c->r_feed) : json_null());
    json_object_set_new(o, "q_line_point", json_pack("{s:o,s:o}", "x", pw_cli_json_num(c->x_q), "y",
                                                     pw_cli_json_num(c->y_q)));
    json_object_set_new(o, "n_fenske", c->feasible ? pw_cli_json_num(c->n_fenske) : json_null());
    json_object_set_new(o, "alpha_top", pw_cli_json_num(c->alpha_top));
    json_object_set_new(o, "alpha_bottom", pw_cli_json_num(c->alpha_bottom));
    json_t *d = json_array();
    for (size_t i = 0; c->feasible && i < c->n_design; i++) {
        const pw_design_row *r = &c->design[i];
        json_t *row = json_object();
        json_object_set_new(row, "factor", pw_cli_json_num(r->factor));
        json_object_set_new(row, "R", pw_cli_json_num(r->R));
        json_object_set_new(row, "boilup", pw_cli_json_num(r->boilup));
        json_object_set_new(row, "stages", pw_cli_json_num(r->stages));
        json_object_set_new(row, "feed_stage", json_integer(r->feed_stage));
        json_object_set_new(row, "gilliland_stages", pw_cli_json_num(r->gilliland_stages));
        json_array_append_new(d, row);
    }
    json_object_set_new(o, "design", d);
    json_object_set_new(o, "stage_convention",
                        json_string("equilibrium stages counted from the top, the partial reboiler "
                                    "as one stage, last step fractional"));
    json_object_set_new(o, "gilliland_form", json_string("Molokanov et al. (1972)"));
    json_object_set_new(o, "design_factor_basis",
                        json_string("operating reflux of 1.2-1.5 times R_min (common practice)"));
    json_t *spec = json_object();
    json_object_set_new(spec, "P_kPa", pw_cli_json_num(run->P_Pa / 1e3));
    json_object_set_new(spec, "xd", pw_cli_json_num(run->spec.xd));
    json_object_set_new(spec, "xb", pw_cli_json_num(run->spec.xb));
    json_object_set_new(spec, "zf", pw_cli_json_num(run->spec.zf));
    json_object_set_new(spec, "q", pw_cli_json_num(run->spec.q));
    json_object_set_new(o, "spec", spec);
    json_object_set_new(o, "T_top_K", pw_cli_json_num(run->T_top_K));
    json_object_set_new(o, "T_bottom_K", pw_cli_json_num(run->T_bottom_K));
    json_object_set_new(o, "caution",
                        json_string("Screening estimate (constant molal overflow, fitted model). "
                                    "Stage counts near R_min, above all near a tangent pinch, are "
                                    "very sensitive to the model. Verify with rigorous simulation "
                                    "and pilot data; design per local codes under licensed review."));
    return o;
}

static void print_table(const pw_reflux_run *run)
{
    const pw_column_result *c = &run->col;
    printf("column at %.4g kPa: xd %.4g, xb %.4g, zf %.4g, q %.4g (%s / %s)\n", run->P_Pa / 1e3,
           run->spec.xd, run->spec.xb, run->spec.zf, run->spec.q, run->fit.sys.comp[0].name,
           run->fit.sys.comp[1].name);
    if (run->given[0] && run->given[1] && run->given[2])
        printf("  (as given: xd %s, xb %s, zf %s; by mass converted with the molar masses of the\n"
               "  fit file's components; every composition below is a mole fraction)\n",
               run->given[0], run->given[1], run->given[2]);
    if (!c->feasible) {
        printf("  NOT FEASIBLE by simple distillation: %s\n", c->reason);
        return;
    }
    printf("  minimum reflux R_min      %.6g  (minimum boil-up Vbar/B %.6g)\n", c->r_min, c->s_min);
    if (c->reflux_limited)
        printf("  no reflux needed          at R = 0 the operating lines clear the curve: a\n"
               "                            stripping column with the feed on top makes this\n"
               "                            distillate; no pinch limits, no design table\n");
    else if (c->boilup_limited && c->pinch.kind == PW_PINCH_FEED)
        printf("  limited by zero boil-up   the q-line meets the curve below xb: the feed brings\n"
               "                            more vapor than the rectifying section needs, so R\n"
               "                            cannot fall below this without cooling the feed\n");
    else
        printf("  limiting pinch            %s pinch in the %s section at x = %.5f, y = %.5f\n",
               pinch_kind(c->pinch.kind), section(c->pinch.section), c->pinch.x, c->pinch.y);
    if (c->pinch.kind == PW_PINCH_TANGENT && !c->boilup_limited)
        printf("  (a search at the q-line alone would give R = %.6g: %.0f %% too low)\n", c->r_feed,
               100.0 * (c->r_min - c->r_feed) / c->r_min);
    printf("  stages at total reflux    %.3f stepped (Fenske %.3f, alpha top %.3f, bottom %.3f)\n",
           c->n_min, c->n_fenske, c->alpha_top, c->alpha_bottom);
    printf("\n  %-8s %9s %9s %9s %6s %12s\n", "R/R_min", "R", "Vbar/B", "stages", "feed",
           "Gilliland*");
    for (size_t i = 0; i < c->n_design; i++) {
        const pw_design_row *r = &c->design[i];
        printf("  %-8.3g %9.4f %9.4f %9.3f %6d %12.2f\n", r->factor, r->R, r->boilup, r->stages,
               r->feed_stage, r->gilliland_stages);
    }
    printf("  stages include the partial reboiler; feed stage counted from the top.\n"
           "  * Molokanov et al. (1972) form of the Gilliland correlation, for comparison only.\n"
           "  Design reflux of 1.2-1.5 R_min is common practice.\n");
    printf("\n  Screening estimate only: verify with rigorous simulation and pilot data; size\n"
           "  equipment and relief per local codes under licensed engineering review.\n");
}

int pw_cli_reflux(int argc, char **argv)
{
    pw_reflux_args a;
    pw_error err;
    pw_error_clear(&err);
    int rc = pw_reflux_parse_args(argc, argv, &a, &err);
    if (rc == -1) {
        usage(stdout);
        return 0;
    }
    if (rc != 0)
        return pw_cli_fail("reflux", &err);
    pw_reflux_run run;
    rc = pw_reflux_compute(&a, &run, &err);
    if (rc != 0)
        return pw_cli_fail("reflux", &err);
    pw_reflux_uncert unc;
    bool with_unc = a.uncertainty || a.n_extra;
    if (with_unc && (rc = pw_reflux_uncert_run(&a, &run, &unc, &err)) != 0) {
        pw_fit_result_free(&run.fit);
        return pw_cli_fail("reflux", &err);
    }
    run.with_uncertainty = a.uncertainty;
    pw_reflux_warn(&run);
    if (a.json) {
        json_t *o = pw_reflux_json(&run);
        if (run.minimum)
            json_object_set_new(o, "minimum", json_integer((json_int_t)run.minimum));
        if (with_unc)
            pw_reflux_uncert_json(&unc, o);
        rc = pw_cli_print_json(o);
    } else {
        print_table(&run);
        if (with_unc)
            pw_reflux_uncert_print(&unc, &run);
    }
    pw_fit_result_free(&run.fit);
    if (rc == 0 && a.exit_verdict && !run.col.feasible)
        rc = PW_CLI_EXIT_VERDICT;
    return rc;
}
