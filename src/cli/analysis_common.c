#include "analysis_common.h"

#include "cli.h"

#include <math.h>

void cli_warn_T_range(const char *cmd, const pw_fit_result *fit, double T_lo_K, double T_hi_K,
                         const char *what, const pw_display_units *u)
{
    if (!isfinite(T_lo_K) || !isfinite(T_hi_K))
        return;
    char a[48], b[48], c1[48], c2[48], d[48];
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &fit->sys.comp[i];
        double lo = pw_component_range_excess_K(c, T_lo_K);
        double hi = pw_component_range_excess_K(c, T_hi_K);
        pw_units_display_value(u, PW_SHOW_T, ".2f", c->T_min_K, c1, sizeof c1);
        pw_units_display_value(u, PW_SHOW_T, ".2f", c->T_max_K, c2, sizeof c2);
        if (lo < 0.0)
            cli_warnf(cmd, "%s reach %s, %s below the vapor-pressure range of %s "
                         "(%s to %s): extrapolated",
                         what, pw_units_display_value(u, PW_SHOW_T, ".2f", T_lo_K, a, sizeof a),
                         pw_units_display_value(u, PW_SHOW_DT, ".1f", -lo, d, sizeof d), c->name,
                         c1, c2);
        if (hi > 0.0)
            cli_warnf(cmd, "%s reach %s, %s above the vapor-pressure range of %s "
                         "(%s to %s): extrapolated",
                         what, pw_units_display_value(u, PW_SHOW_T, ".2f", T_hi_K, a, sizeof a),
                         pw_units_display_value(u, PW_SHOW_DT, ".1f", hi, d, sizeof d), c->name,
                         c1, c2);
    }
    if (isfinite(fit->T_min_K) && isfinite(fit->T_max_K) &&
        (T_lo_K < fit->T_min_K - 1.0 || T_hi_K > fit->T_max_K + 1.0))
        cli_warnf(cmd, "%s span %s to %s, outside the fitted data's %s to %s: the model "
                     "parameters are extrapolated in temperature",
                     what, pw_units_display_value(u, PW_SHOW_T, ".2f", T_lo_K, a, sizeof a),
                     pw_units_display_value(u, PW_SHOW_T, ".2f", T_hi_K, b, sizeof b),
                     pw_units_display_value(u, PW_SHOW_T, ".2f", fit->T_min_K, c1, sizeof c1),
                     pw_units_display_value(u, PW_SHOW_T, ".2f", fit->T_max_K, c2, sizeof c2));
}

void cli_warn_fit(const char *cmd, const pw_fit_result *fit, const pw_display_units *u)
{
    if (!fit->converged)
        cli_warnf(cmd, "the fit in this file did not converge; do not design with it");
    cli_warn_vapor_association(cmd, &fit->sys);
    char t[48];
    if (fit->split)
        cli_warnf(cmd, "the fitted model predicts a liquid-liquid split (x1 = %.3f at %s); "
                     "homogeneous results may be wrong there",
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
