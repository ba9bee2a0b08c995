/* JSON and text of the design-grade column's results (design rows with stage profiles, energy
 * balance summary, stage profiles of a rated column), shared by reflux and rate. Renders only. */
#ifndef PW_CLI_DESIGN_OUT_H
#define PW_CLI_DESIGN_OUT_H

#include <jansson.h>
#include <pinchwise/design.h>

/* [{"stage": 1, "x1": v, "y1": v, "T_K": v, "L": v, "V": v}, ...]. New reference. */
json_t *pw_cli_profile_json(const pw_profile *p);

/* The "design" array: one object per row with factor, R, boilup, stages, feed_stage,
 * reachable, profile (and the duties in kJ per mol feed for the energy balance). */
json_t *pw_cli_design_json(const pw_design_table *t);

/* The "energy" object of reflux --energy. r_min_cmo: constant molal overflow's R_min. */
json_t *pw_cli_energy_json(const pw_energy_result *e, double r_min_cmo);

/* The design table as text on stdout. */
void pw_cli_design_print(const pw_design_table *t);

/* A stage profile as text on stdout. */
void pw_cli_profile_print(const pw_profile *p);

#endif
