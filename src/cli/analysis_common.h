/* Helpers shared by the azeotrope and screen commands: reading the fit file, warnings about
 * temperatures outside the vapor-pressure or fitted range, and the screening caution. */
#ifndef CLI_ANALYSIS_COMMON_H
#define CLI_ANALYSIS_COMMON_H

#include <jansson.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/fit.h>
#include <pinchwise/units.h>
#include <stdio.h>

/* Warns on stderr for each component whose Antoine range does not hold T_lo..T_hi [K] (saying
 * by how much), in the display units u and when that range leaves the fit's data range. what names the use. */
void cli_warn_T_range(const char *cmd, const pw_fit_result *fit, double T_lo_K, double T_hi_K,
                         const char *what, const pw_display_units *u);

/* The same for a calculation that uses no vapor pressure (lle): the fitted data's range only. */
void cli_warn_data_T_range(const char *cmd, const pw_fit_result *fit, double T_lo_K,
                           double T_hi_K, const char *what, const pw_display_units *u);

/* Renders the fit's liquid-inside-layers diagnostic (pw_fit_diagnose_liquid_in_gap): measured
 * one-liquid points inside the model's own layers, so the layers this command uses contradict the
 * data. */
void cli_warn_layers_contradicted(const char *cmd, const pw_fit_result *fit,
                                  const pw_display_units *u);

/* Warns when the fit's data show two liquids its model cannot represent
 * (pw_system_split_unmodelled), naming the range and every azeotrope of az (may be NULL) in it. */
void cli_warn_measured_split(const char *cmd, const pw_fit_result *fit, const pw_az_result *az,
                             const pw_display_units *u);

/* Warns when the fit did not converge or predicts a liquid-liquid split. */
void cli_warn_fit(const char *cmd, const pw_fit_result *fit, const pw_display_units *u);

/* The screening caution (METHODS 8), for the readable output, and as one JSON string. */
void cli_print_caution(FILE *f);
const char *cli_caution_text(void);

/* JSON object of one azeotrope with the CONTRACT keys x1, T_K, P_kPa, kind and more. */
json_t *cli_azeotrope_json(const pw_azeotrope *az);

#endif
