/* --uncertainty, --samples, --seed on the azeotrope command: intervals of each azeotrope's
 * composition and temperature (fixed P) or pressure (fixed T) from the fit's covariance. */
#ifndef CLI_AZEO_UNCERT_H
#define CLI_AZEO_UNCERT_H

#include <jansson.h>

#include "cli_options.h"
#include <pinchwise/uncertainty.h>

typedef struct cli_azeo_uncert {
    bool on;
    pw_unc_options opt;
    size_t n;
    pw_unc_result res[PW_AZ_MAX];
    bool het;               /* the heterogeneous azeotrope was propagated into res_het */
    pw_az_mode het_mode;
    pw_unc_result res_het;
} cli_azeo_uncert;

/* The uncertainty block's options of p (cli_block_uncertainty) into u. */
void cli_azeo_uncert_from(const cli_args *p, cli_azeo_uncert *u);

/* Propagates every azeotrope of r. PW_OK or the status with err. */
pw_status cli_azeo_uncert_run(const pw_fit_result *fit, const pw_az_result *r, cli_azeo_uncert *u,
                       pw_error *err);

/* Propagates the heterogeneous azeotrope at (mode, fixed) into u->res_het; a status, with err. */
pw_status cli_azeo_uncert_run_het(const pw_fit_result *fit, pw_az_mode mode, double fixed,
                                 cli_azeo_uncert *u, pw_error *err);

/* Text lines for a heterogeneous azeotrope's or a decanter's result (decanter true: the two
 * minimum boil-ups too; cooled true: a cooled decanter's own layers too). */
void cli_het_uncert_print(const pw_unc_result *res, const pw_unc_options *opt, pw_az_mode mode,
                          bool decanter, bool cooled, const pw_display_units *u);

/* Adds x1_ci95 and T_K_ci95 / P_kPa_ci95 (CONTRACT) and an "uncertainty" object to each element
 * of the azeotrope list. */
void cli_azeo_uncert_json(const cli_azeo_uncert *u, const pw_az_result *r, json_t *list);

/* Text lines after the azeotrope table. */
void cli_azeo_uncert_print(const cli_azeo_uncert *u, const pw_az_result *r,
                           const pw_display_units *units);

#endif
