#include "analysis_common.h"

#include "cli.h"

#include <math.h>

void cli_warn_T_range(const char *cmd, const pw_fit_result *fit, double T_lo_K, double T_hi_K,
                         const char *what)
{
    if (!isfinite(T_lo_K) || !isfinite(T_hi_K))
        return;
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &fit->sys.comp[i];
        double lo = pw_component_range_excess_K(c, T_lo_K);
        double hi = pw_component_range_excess_K(c, T_hi_K);
        if (lo < 0.0)
            cli_warnf(cmd, "%s reach %.2f K, %.1f K below the vapor-pressure range of %s "
                         "(%.2f-%.2f K): extrapolated",
                         what, T_lo_K, -lo, c->name, c->T_min_K, c->T_max_K);
        if (hi > 0.0)
            cli_warnf(cmd, "%s reach %.2f K, %.1f K above the vapor-pressure range of %s "
                         "(%.2f-%.2f K): extrapolated",
                         what, T_hi_K, hi, c->name, c->T_min_K, c->T_max_K);
    }
    if (isfinite(fit->T_min_K) && isfinite(fit->T_max_K) &&
        (T_lo_K < fit->T_min_K - 1.0 || T_hi_K > fit->T_max_K + 1.0))
        cli_warnf(cmd, "%s span %.2f-%.2f K, outside the fitted data's %.2f-%.2f K: the model "
                     "parameters are extrapolated in temperature",
                     what, T_lo_K, T_hi_K, fit->T_min_K, fit->T_max_K);
}

void cli_warn_fit(const char *cmd, const pw_fit_result *fit)
{
    if (!fit->converged)
        cli_warnf(cmd, "the fit in this file did not converge; do not design with it");
    cli_warn_vapor_association(cmd, &fit->sys);
    if (fit->split)
        cli_warnf(cmd, "the fitted model predicts a liquid-liquid split (x1 = %.3f at %.1f K); "
                     "homogeneous results may be wrong there",
                     fit->split_x, fit->split_T_K);
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
