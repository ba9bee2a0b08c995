/* The design-grade column in the commands' JSON documents (see commands.h): the reflux
 * command's design rows with stage profiles (constant molal overflow or energy balances), the
 * energy-balance headline and summary, a rated column's stages, and screen's energy summary.
 * Shared by the command-line program and the Python module. Builders return a new jansson
 * reference (NULL when out of memory); nothing here prints. */
#ifndef PINCHWISE_DESIGN_DOC_H
#define PINCHWISE_DESIGN_DOC_H

#include <jansson.h>
#include <pinchwise/design.h>

#ifdef __cplusplus
extern "C" {
#endif

/* The reflux command's design rows for col (pw_column_solve's result, computed without its own
 * design table): with heat == NULL, constant molal overflow (pw_design_cmo at col's R_min); else
 * the energy-balance column (pw_energy_column_solve), whose answer goes to *energy. An
 * infeasible split gives an empty table (and energy->reason). Errors as those functions. */
pw_status pw_reflux_design(const pw_system *sys, double P_Pa, const pw_column_spec *spec,
                           const pw_column_options *opt, const pw_column_result *col,
                           const pw_heat_data *heat, pw_design_table *design,
                           pw_energy_result *energy);

/* col with the energy balance's headline numbers (feasible, reason, R_min, pinch, flow
 * limits; boil-up and the feed-point-only R undefined), or col itself when e is NULL. */
pw_column_result pw_energy_headline(const pw_column_result *col, const pw_energy_result *e);

/* [{"stage", "x1", "y1", "T_K", "L", "V"}, ...]; an empty array for p == NULL. */
json_t *pw_profile_doc(const pw_profile *p);

/* The "design" array (docs/column.md section 8). */
json_t *pw_design_doc(const pw_design_table *t);

/* The "energy" object of reflux --energy; r_min_cmo is constant molal overflow's R_min. */
json_t *pw_energy_doc(const pw_energy_result *e, double r_min_cmo);

/* The `reflux --json` document with the design rows and "balance" (and with e != NULL the
 * energy balance's headline, "energy" and its caution): pw_reflux_doc extended. What the command
 * prints is pw_reflux_command_doc. */
json_t *pw_reflux_design_doc(const pw_column_result *col, const pw_design_table *t,
                             const pw_energy_result *e, double P_Pa, const pw_column_spec *spec,
                             double T_top_K, double T_bottom_K);

/* The "overflow_check" object: {"latent_heat_mismatch": |dHvap1 - dHvap2| / min (null without
 * heat data), "limit": PW_CMO_MISMATCH_MAX, "doubtful": whether constant molal overflow was
 * used (cmo_used) and the mismatch exceeds the limit, "basis": "common practice"}; reflux
 * (cmo_used: without an energy balance) and decanter (always) carry it. */
json_t *pw_overflow_check_doc(const pw_system *sys, bool cmo_used);

/* The whole `reflux --json` document (without --uncertainty's keys): pw_reflux_design_doc and
 * "overflow_check" for sys. */
json_t *pw_reflux_command_doc(const pw_system *sys, const pw_column_result *col,
                              const pw_design_table *t, const pw_energy_result *e, double P_Pa,
                              const pw_column_spec *spec, double T_top_K, double T_bottom_K);

/* The "energy" object of screen --energy. */
json_t *pw_screen_energy_doc(const pw_energy_result *e, double r_min_cmo);

/* Why a design row was not reached, in words. */
const char *pw_design_unreachable_text(pw_status why);

#ifdef __cplusplus
}
#endif
#endif
