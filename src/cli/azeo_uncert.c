/* The azeotrope command's uncertainty options. */
#include "azeo_uncert.h"

#include "cli.h"
#include "column_uncert.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

void cli_azeo_uncert_from(const cli_args *p, cli_azeo_uncert *u)
{
    cli_uncertainty g = cli_uncertainty_get(p);
    memset(u, 0, sizeof *u);
    u->opt = pw_unc_default_options();
    u->on = g.on;
    if (g.have_samples)
        u->opt.samples = (size_t)g.samples;
    if (g.have_seed)
        u->opt.seed = (unsigned long)g.seed;
}

pw_status cli_azeo_uncert_run(const pw_fit_result *fit, const pw_az_result *r, cli_azeo_uncert *u,
                       pw_error *err)
{
    u->n = r->n;
    char what[64];
    cli_progress_ctx pc = {"azeotrope", what};
    pw_unc_options o = u->opt;
    for (size_t i = 0; i < r->n; i++) {
        pw_az_result one = *r;
        one.n = 1;
        one.az[0] = r->az[i];
        snprintf(what, sizeof what, "parameter sets sampled (azeotrope %zu of %zu)", i + 1, r->n);
        cli_progress_attach(&o.progress, &o.progress_ctx, &pc);
        /* one azeotrope per call: the progress line names it */
        pw_status st = pw_azeotrope_unc_run(fit, &one, &o, &u->res[i], err);
        if (st != PW_OK)
            return st;
    }
    return PW_OK;
}

pw_status cli_azeo_uncert_run_het(const pw_fit_result *fit, pw_az_mode mode, double fixed,
                                 cli_azeo_uncert *u, pw_error *err)
{
    cli_progress_ctx pc = {"azeotrope", "parameter sets sampled (heterogeneous azeotrope)"};
    pw_unc_options o = u->opt;
    cli_progress_attach(&o.progress, &o.progress_ctx, &pc);
    pw_unc_het_ctx c = pw_unc_het_azeo_ctx(mode, fixed);
    pw_status st = pw_het_unc_run(fit, &c, &o, &u->res_het, err);
    if (st != PW_OK)
        return st;
    u->het = true;
    u->het_mode = mode;
    return PW_OK;
}

void cli_azeo_uncert_json(const cli_azeo_uncert *u, const pw_az_result *r, json_t *list)
{
    pw_azeotrope_unc_doc(list, r, u->res, u->n, u->opt.seed);
    if (u->het) /* the heterogeneous entry follows the homogeneous ones */
        pw_het_azeo_unc_doc(json_array_get(list, r->n), &u->res_het, u->het_mode, u->opt.seed);
}

/* The library's T (K) or P (kPa) output o in the display units. */
static pw_unc_output shown(const pw_unc_output *o, bool isP, const pw_display_units *u)
{
    pw_unc_output s = *o;
    double *v[3] = {&s.value, &s.ci[0], &s.ci[1]};
    for (int i = 0; i < 3; i++)
        *v[i] = isP ? pw_units_display_P(u, *v[i] * 1e3) : pw_units_display_T(u, *v[i]);
    return s;
}

static void print_interval(const char *what, const pw_unc_output *o, const char *unit)
{
    if (!isfinite(o->ci[0]))
        printf("    %-24s %.6g%s%s: no interval\n", what, o->value, *unit ? " " : "", unit);
    else
        printf("    %-24s %.6g, 95 %% interval %.6g to %.6g%s%s (%s)\n", what, o->value, o->ci[0],
               o->ci[1], *unit ? " " : "", unit, o->ci_sampled ? "sampled" : "linearised");
}

void cli_het_uncert_print(const pw_unc_result *res, const pw_unc_options *opt, pw_az_mode mode,
                         bool decanter, bool cooled, const pw_display_units *u)
{
    bool isP = mode == PW_AZ_ISOBARIC;
    printf("\nUncertainty of the %s from the fit's parameter covariance (%zu draws, seed %lu):\n",
           decanter ? "decanter scheme" : "heterogeneous azeotrope", opt->samples, opt->seed);
    pw_unc_output tp = shown(&res->out[PW_UNC_HET_TP], !isP, u);
    print_interval(isP ? "three-phase T" : "three-phase P", &tp,
                   isP ? pw_units_display_T_symbol(u) : pw_units_display_P_symbol(u));
    print_interval("vapor x1", &res->out[PW_UNC_HET_Y], "");
    /* the layers boiling at the three-phase temperature; a cooled decanter's own layers below */
    print_interval(decanter ? "boiling layer lean, x1" : "layer lean in 1, x1",
                   &res->out[PW_UNC_HET_XI], "");
    print_interval(decanter ? "boiling layer rich, x1" : "layer rich in 1, x1",
                   &res->out[PW_UNC_HET_XII], "");
    if (decanter) {
        print_interval("column A minimum V/B", &res->out[PW_UNC_DEC_SA], "");
        print_interval("column B minimum V/B", &res->out[PW_UNC_DEC_SB], "");
        if (cooled) {
            print_interval("cooled layer lean, x1", &res->out[PW_UNC_DEC_TOP_LEAN], "");
            print_interval("cooled layer rich, x1", &res->out[PW_UNC_DEC_TOP_RICH], "");
        }
    }
    if (res->n_infeasible)
        printf("    in %zu of %zu parameter sets drawn (%.0f %%) %s\n", res->n_infeasible,
               res->n_feasible + res->n_infeasible, 100.0 * (1.0 - res->p_feasible),
               decanter ? "the scheme cannot make the products (no split, or a column blocked)"
                        : "the model no longer gives a heterogeneous azeotrope (no split, or the "
                          "vapor outside the layers)");
    if (res->n_failed)
        printf("    %zu draws failed to compute and are left out\n", res->n_failed);
    for (int i = 0; i < (decanter ? PW_UNC_DEC_NOUT : PW_UNC_HET_NOUT); i++)
        if (res->out[i].disagree) {
            printf("    linearised and sampled intervals differ: strongly non-linear here\n");
            break;
        }
}

void cli_azeo_uncert_print(const cli_azeo_uncert *u, const pw_az_result *r,
                           const pw_display_units *units)
{
    bool isP = r->mode == PW_AZ_ISOBARIC;
    if (u->n)
        printf("\nUncertainty from the fit's parameter covariance (%zu draws, seed %lu):\n",
               u->opt.samples, u->opt.seed);
    for (size_t i = 0; i < u->n; i++) {
        const pw_unc_result *res = &u->res[i];
        const pw_unc_output *x = &res->out[PW_UNC_AZ_X1], *t = &res->out[PW_UNC_AZ_TP];
        const pw_unc_output ts = shown(t, !isP, units);
        printf("  azeotrope at x1 = %.4f: 95 %% interval x1 %.4f to %.4f, %s %.5g to %.5g %s (%s)\n",
               x->value, x->ci[0], x->ci[1], isP ? "T" : "P", ts.ci[0], ts.ci[1],
               isP ? pw_units_display_T_symbol(units) : pw_units_display_P_symbol(units),
               x->ci_sampled ? "sampled" : "linearised");
        if (res->n_infeasible)
            printf("    it is absent in %.0f %% of the parameter sets drawn from the fit's "
                   "uncertainty\n", 100.0 * (1.0 - res->p_feasible));
        if (x->disagree || t->disagree)
            printf("    linearised and sampled intervals differ: strongly non-linear here\n");
    }
    if (u->on && u->n == 0 && !u->het)
        printf("\nNo azeotrope at the estimate, so there is no interval to give.\n");
}
