/* pinchwise reflux: minimum reflux with the limiting pinch, stages at total reflux, and the design
 * table at 1.2, 1.3 and 1.5 times R_min, for a fitted model at a pressure. */
#include "cli.h"
#include "cli_units.h"
#include "column_common.h"
#include "column_uncert.h"
#include "design_out.h"

#include <math.h>
#include <pinchwise/design_doc.h>
#include <stdio.h>
#include <string.h>

static const char *pinch_kind(pw_pinch_kind k) { return k == PW_PINCH_FEED ? "feed" : "tangent"; }
static const char *section(pw_section s)
{
    return s == PW_SECTION_RECTIFYING ? "rectifying" : "stripping";
}

/* With --energy the headline numbers are the energy balance's (pw_energy_headline). */
static pw_column_result headline(const cli_column_run *run)
{
    return pw_energy_headline(&run->col, run->energy ? &run->energy_res : NULL);
}

json_t *cli_column_json(const cli_column_run *run)
{
    return pw_reflux_command_doc(&run->fit.sys, &run->col, &run->design,
                                 run->energy ? &run->energy_res : NULL, run->P_Pa, &run->spec,
                                 run->T_top_K, run->T_bottom_K);
}

static void print_table(const cli_column_run *run)
{
    const pw_column_result view = headline(run);
    const pw_column_result *c = &view;
    char b[PW_REASON_MAX + 64];
    printf("column at %s: xd %.4g, xb %.4g, zf %.4g, q %.4g (%s / %s)\n",
           pw_units_display_value(&run->units, PW_SHOW_P, ".4g", run->P_Pa, b, sizeof b),
           run->spec.xd, run->spec.xb, run->spec.zf, run->spec.q, run->fit.sys.comp[0].name,
           run->fit.sys.comp[1].name);
    if (run->given[0] && run->given[1] && run->given[2])
        printf("  (as given: xd %s, xb %s, zf %s; by mass converted with the molar masses of the\n"
               "  fit file's components; every composition below is a mole fraction)\n",
               run->given[0], run->given[1], run->given[2]);
    if (!c->feasible) {
        printf("  NOT FEASIBLE by simple distillation: %s\n",
               pw_units_display_text(&run->units, c->reason, b, sizeof b));
        return;
    }
    if (isfinite(c->s_min))
        printf("  minimum reflux R_min      %.6g  (minimum boil-up Vbar/B %.6g)\n", c->r_min,
               c->s_min);
    else
        printf("  minimum reflux R_min      %.6g\n", c->r_min);
    if (c->reflux_limited)
        printf("  no reflux needed          at R = 0 the operating lines clear the curve: a\n"
               "                            stripping column with the feed on top makes this\n"
               "                            distillate; no pinch limits, no design table\n");
    else if (c->boilup_limited && c->pinch.kind == PW_PINCH_FEED)
        printf("  limited by zero boil-up   the q-line meets the curve below xb: the feed brings\n"
               "                            more vapor than the rectifying section needs, so R\n"
               "                            cannot fall below this without cooling the feed\n"
               "                            (reported point: the reboiler's x = %.5f, y* = %.5f)\n",
               c->pinch.x, c->pinch.y);
    else
        printf("  limiting pinch            %s pinch in the %s section at x = %.5f, y = %.5f\n",
               pinch_kind(c->pinch.kind), section(c->pinch.section), c->pinch.x, c->pinch.y);
    if (c->pinch.kind == PW_PINCH_TANGENT && !c->boilup_limited && isfinite(c->r_feed))
        printf("  (a search at the q-line alone would give R = %.6g: %.0f %% too low)\n", c->r_feed,
               100.0 * (c->r_min - c->r_feed) / c->r_min);
    if (c->n_min_status != PW_OK)
        printf("  stages at total reflux    not reached by stepping (%s; Fenske %.3f)\n",
               pw_strerror(c->n_min_status), c->n_fenske);
    else
        printf("  stages at total reflux    %.3f stepped (Fenske %.3f, alpha top %.3f, bottom "
               "%.3f)\n",
               c->n_min, c->n_fenske, c->alpha_top, c->alpha_bottom);
    if (run->energy)
        printf("  energy balances           R_min %.6g (constant molal overflow %.6g)\n",
               c->r_min, run->col.r_min);
    cli_design_print(&run->design);
    printf("\n  Screening estimate only: verify with rigorous simulation and pilot data; size\n"
           "  equipment and relief per local codes under licensed engineering review.\n");
}

pw_status cli_reflux(int argc, char **argv)
{
    cli_column_args a;
    pw_error err;
    pw_error_clear(&err);
    if (cli_reflux_parse_args(argc, argv, &a, &err) != PW_OK)
        return cli_fail("reflux", &err);
    if (a.help) {
        cli_help(&cli_reflux_spec, stdout);
        return PW_OK;
    }
    pw_status rc;
    cli_column_run run;
    rc = cli_column_compute(&a, &run, &err);
    if (rc != PW_OK)
        return cli_fail("reflux", &err);
    cli_column_uncert unc;
    bool with_unc = a.unc.on || a.n_compare;
    if (with_unc && (rc = cli_column_uncert_run(&a, &run, &unc, &err)) != PW_OK) {
        cli_column_run_free(&run);
        return cli_fail("reflux", &err);
    }
    run.with_uncertainty = a.uncertainty;
    cli_column_warn(&run);
    if (a.json) {
        json_t *o = cli_column_json(&run);
        if (run.minimum)
            json_object_set_new(o, "minimum", json_integer((json_int_t)run.minimum));
        if (with_unc)
            cli_column_uncert_json(&unc, o);
        rc = cli_print_json(o);
    } else {
        print_table(&run);
        if (with_unc)
            cli_column_uncert_print(&unc, &run);
    }
    bool infeasible = !run.col.feasible || (run.energy && !run.energy_res.feasible);
    cli_column_run_free(&run);
    if (rc == PW_OK && a.exit_verdict && infeasible)
        rc = PW_EINFEASIBLE;
    return rc;
}
