/* The azeotrope command's uncertainty options. */
#include "azeo_uncert.h"

#include "cli.h"
#include "reflux_uncert.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

void pw_azeo_uncert_from(const pw_cli_args *p, pw_azeo_uncert *u)
{
    pw_cli_uncertainty g = pw_cli_uncertainty_get(p);
    memset(u, 0, sizeof *u);
    u->opt = pw_unc_default_options();
    u->on = g.on;
    if (g.have_samples)
        u->opt.samples = (size_t)g.samples;
    if (g.have_seed)
        u->opt.seed = (unsigned long)g.seed;
}

pw_status pw_azeo_uncert_run(const pw_fit_result *fit, const pw_az_result *r, pw_azeo_uncert *u,
                       pw_error *err)
{
    u->n = r->n;
    char what[64];
    pw_cli_progress_ctx pc = {"azeotrope", what};
    pw_unc_options o = u->opt;
    for (size_t i = 0; i < r->n; i++) {
        pw_az_result one = *r;
        one.n = 1;
        one.az[0] = r->az[i];
        snprintf(what, sizeof what, "parameter sets sampled (azeotrope %zu of %zu)", i + 1, r->n);
        if (pw_cli_progress_wanted()) {
            o.progress = pw_cli_progress_tenths;
            o.progress_ctx = &pc;
        }
        /* one azeotrope per call: the progress line names it */
        pw_status st = pw_azeotrope_unc_run(fit, &one, &o, &u->res[i], err);
        if (st != PW_OK)
            return st;
    }
    return PW_OK;
}

void pw_azeo_uncert_json(const pw_azeo_uncert *u, const pw_az_result *r, json_t *list)
{
    pw_azeotrope_unc_doc(list, r, u->res, u->n, u->opt.seed);
}

void pw_azeo_uncert_print(const pw_azeo_uncert *u, const pw_az_result *r)
{
    bool isP = r->mode == PW_AZ_ISOBARIC;
    if (u->n)
        printf("\nUncertainty from the fit's parameter covariance (%zu draws, seed %lu):\n",
               u->opt.samples, u->opt.seed);
    for (size_t i = 0; i < u->n; i++) {
        const pw_unc_result *res = &u->res[i];
        const pw_unc_output *x = &res->out[PW_UNC_AZ_X1], *t = &res->out[PW_UNC_AZ_TP];
        printf("  azeotrope at x1 = %.4f: 95 %% interval x1 %.4f to %.4f, %s %.5g to %.5g %s (%s)\n",
               x->value, x->ci[0], x->ci[1], isP ? "T" : "P", t->ci[0], t->ci[1],
               isP ? "K" : "kPa", x->ci_sampled ? "sampled" : "linearised");
        if (res->n_infeasible)
            printf("    it is absent in %.0f %% of the parameter sets drawn from the fit's "
                   "uncertainty\n", 100.0 * (1.0 - res->p_feasible));
        if (x->disagree || t->disagree)
            printf("    linearised and sampled intervals differ: strongly non-linear here\n");
    }
    if (u->on && u->n == 0)
        printf("\nNo azeotrope at the estimate, so there is no interval to give.\n");
}
