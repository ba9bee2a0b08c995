#include "analysis_common.h"

#include "cli.h"

#include <math.h>
#include <pinchwise/decanter.h>
#include <pinchwise/fit_diagnostics.h>
#include <stdlib.h>

/* Renders pw_fit_range_check's findings; vapor false leaves out the vapor-pressure ranges (a
 * calculation that uses no vapor pressure). */
static void warn_range(const char *cmd, const pw_fit_result *fit, double T_lo_K, double T_hi_K,
                       const char *what, const pw_display_units *u, bool vapor)
{
    pw_range_check rc;
    if (pw_fit_range_check(fit, T_lo_K, T_hi_K, &rc) != PW_OK)
        return;
    char a[48], b[48], c1[48], c2[48], d[48];
    for (int i = 0; vapor && i < 2; i++) {
        const pw_component *c = &fit->sys.comp[i];
        pw_units_display_value(u, PW_SHOW_T, ".2f", c->T_min_K, c1, sizeof c1);
        pw_units_display_value(u, PW_SHOW_T, ".2f", c->T_max_K, c2, sizeof c2);
        if (rc.below_K[i] > 0.0)
            cli_warnf(cmd, "%s reach %s, %s below the vapor-pressure range of %s "
                         "(%s to %s): extrapolated",
                         what, pw_units_display_value(u, PW_SHOW_T, ".2f", T_lo_K, a, sizeof a),
                         pw_units_display_value(u, PW_SHOW_DT, ".1f", rc.below_K[i], d, sizeof d),
                         c->name, c1, c2);
        if (rc.above_K[i] > 0.0)
            cli_warnf(cmd, "%s reach %s, %s above the vapor-pressure range of %s "
                         "(%s to %s): extrapolated",
                         what, pw_units_display_value(u, PW_SHOW_T, ".2f", T_hi_K, a, sizeof a),
                         pw_units_display_value(u, PW_SHOW_DT, ".1f", rc.above_K[i], d, sizeof d),
                         c->name, c1, c2);
    }
    if (rc.outside_data && T_lo_K == T_hi_K)
        cli_warnf(cmd, "%s, %s: outside the fitted data's %s to %s; the model parameters "
                     "are extrapolated in temperature",
                     what, pw_units_display_value(u, PW_SHOW_T, ".2f", T_lo_K, a, sizeof a),
                     pw_units_display_value(u, PW_SHOW_T, ".2f", rc.data_T_min_K, c1, sizeof c1),
                     pw_units_display_value(u, PW_SHOW_T, ".2f", rc.data_T_max_K, c2, sizeof c2));
    else if (rc.outside_data)
        cli_warnf(cmd, "%s span %s to %s, outside the fitted data's %s to %s: the model "
                     "parameters are extrapolated in temperature",
                     what, pw_units_display_value(u, PW_SHOW_T, ".2f", T_lo_K, a, sizeof a),
                     pw_units_display_value(u, PW_SHOW_T, ".2f", T_hi_K, b, sizeof b),
                     pw_units_display_value(u, PW_SHOW_T, ".2f", rc.data_T_min_K, c1, sizeof c1),
                     pw_units_display_value(u, PW_SHOW_T, ".2f", rc.data_T_max_K, c2, sizeof c2));
}

void cli_warn_T_range(const char *cmd, const pw_fit_result *fit, double T_lo_K, double T_hi_K,
                      const char *what, const pw_display_units *u)
{
    warn_range(cmd, fit, T_lo_K, T_hi_K, what, u, true);
}

void cli_warn_data_T_range(const char *cmd, const pw_fit_result *fit, double T_lo_K,
                           double T_hi_K, const char *what, const pw_display_units *u)
{
    warn_range(cmd, fit, T_lo_K, T_hi_K, what, u, false);
}

void cli_warn_measured_split(const char *cmd, const pw_fit_result *fit, const pw_az_result *az,
                             const pw_display_units *u)
{
    const pw_system *s = &fit->sys;
    if (!pw_system_split_unmodelled(s))
        return;
    const pw_measured_split *m = &s->measured;
    char t[48], p[48];
    cli_warnf(cmd, "the data show two liquids between x1 = %.4g and %.4g (%zu three-phase point%s "
                 "at %s, %s) that the %s model cannot represent (it never splits): its one-liquid "
                 "results across that range are not valid; refit with a model that can split "
                 "(fit --lle) and use the decanter scheme (docs/heterogeneous.md)",
                 m->x_lo, m->x_hi, m->n, m->n == 1 ? "" : "s",
                 pw_units_display_value(u, PW_SHOW_T, ".2f", m->T_K, t, sizeof t),
                 pw_units_display_value(u, PW_SHOW_P, ".6g", m->P_Pa, p, sizeof p),
                 s->model->name);
    for (size_t i = 0; az && i < az->n; i++)
        if (pw_measured_split_overlaps(m, az->az[i].x1, az->az[i].x1))
            cli_warnf(cmd, "the %s azeotrope at x1 = %.4f lies in that range: a one-liquid "
                         "answer where the data show two liquids",
                         pw_az_kind_name(az->az[i].kind), az->az[i].x1);
}

void cli_warn_fit(const char *cmd, const pw_fit_result *fit, const pw_display_units *u)
{
    if (!fit->converged)
        cli_warnf(cmd, "the fit in this file did not converge; do not design with it");
    cli_warn_vapor_association(cmd, &fit->sys);
    char t[48];
    if (fit->split)
        cli_warnf(cmd, "the fitted model predicts two liquid phases (least stable liquid at "
                     "x1 = %.3f, %s; the layers: pinchwise lle)",
                     fit->split_x,
                     pw_units_display_value(u, PW_SHOW_T, ".1f", fit->split_T_K, t, sizeof t));
}

const char *cli_caution_text(void)
{
    return pw_caution_text();
}

void cli_print_caution(FILE *f)
{
    fprintf(f,
            "\nCaution: screening estimate from a correlation fitted to limited laboratory data,\n"
            "not a design. Verify with rigorous simulation and laboratory or pilot data. Many\n"
            "solvents are flammable or toxic (see the Safety Data Sheet). Pressure equipment and\n"
            "relief follow local codes and regulations; defer to licensed engineering review.\n");
}

json_t *cli_azeotrope_json(const pw_azeotrope *az)
{
    return pw_azeotrope_entry_json(az);
}

void cli_warn_layers_contradicted(const char *cmd, const pw_fit_result *fit,
                                  const pw_display_units *u)
{
    pw_fit_diags *d = malloc(sizeof *d);
    if (!d || pw_fit_diagnose_liquid_in_gap(fit, d) != PW_OK) {
        free(d);
        return;
    }
    for (size_t i = 0; i < d->n; i++) {
        char msg[PW_FIT_DIAG_MSG_MAX + 64];
        cli_warnf(cmd, "%s: %s; the layers used here come from that model", fit->dataset_path,
                  pw_units_display_text(u, d->items[i].message, msg, sizeof msg));
    }
    free(d);
}
