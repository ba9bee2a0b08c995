/* What each command computes and prints, as library calls.
 *
 * The JSON document that `pinchwise COMMAND --json` prints is built here, by one function per
 * command, and the command-line program and the Python module (through pinchwise/api.h) both
 * call it: their outputs agree by construction. Builders return a new jansson reference that
 * the caller owns (json_decref), or NULL when out of memory. Nothing here prints. */
#ifndef PINCHWISE_COMMANDS_H
#define PINCHWISE_COMMANDS_H

#include <jansson.h>
#include <pinchwise/assess.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/column.h>
#include <pinchwise/component.h>
#include <pinchwise/consistency.h>
#include <pinchwise/dataset.h>
#include <pinchwise/decanter.h>
#include <pinchwise/design.h>
#include <pinchwise/fit.h>
#include <pinchwise/lle.h>
#include <pinchwise/screen.h>
#include <pinchwise/uncertainty.h>
#include <stdbool.h>

#ifdef __cplusplus
extern "C" {
#endif

/* ---- shared ---- */

/* A JSON number, or null when v is not finite. New reference. */
json_t *pw_json_num(double v);

/* A JSON string of a library reason or warning, its marked quantities written in K and kPa
 * (pw_units_display_text with no display units): the documents never change with --show-in.
 * New reference. */
json_t *pw_json_reason(const char *text);

/* The text of doc exactly as the command-line program prints it (two-space indent, 17
 * significant digits, keys in insertion order), without a final newline. malloc'd: the caller
 * frees it with free(); NULL when out of memory. */
char *pw_json_text(const json_t *doc);

/* The screening caution carried by the azeotrope and screen documents. Static string. */
const char *pw_caution_text(void);

/* The two components of ds from lib, each keeping the dataset's spelling of its name. When one
 * is missing: PW_ENOTFOUND, err naming the dataset file and suggesting near names. */
pw_status pw_dataset_components(const pw_complib *lib, const pw_dataset *ds, pw_component out[2],
                                pw_error *err);

/* ---- fit ---- */

/* The `fit --json` document: the fit file without its data and component blocks, plus
 * "fit_file" (fit_file may be NULL: then null, for a fit that was not written). */
json_t *pw_fit_doc(const pw_fit_result *r, const char *fit_file);

/* ---- check ---- */

/* The `check --json` document of a consistency result. strict: the verdict rule used. */
struct pw_het_check;
/* het (may be NULL): the three-phase points left out of the tests ("three_phase_points"). */
json_t *pw_check_doc(const pw_dataset *ds, const pw_consistency_result *r, bool strict,
                     const struct pw_het_check *het);

/* The cautions the check document carries; *n receives how many. Static strings. */
const char *const *pw_check_cautions(size_t *n);

/* ---- azeotrope ---- */

/* The azeotrope command's computation at one condition (P in Pa or T in K by mode): the
 * homogeneous azeotropes (pw_azeotrope_find) into r, then the heterogeneous check
 * (pw_azeotrope_heterogeneous) into tp, which drops crossings inside the two-liquid region from r
 * and counts them in *n_removed (may be NULL). On failure err names where (file, may be NULL)
 * and which search failed. */
pw_status pw_azeotrope_solve(const pw_system *sys, pw_az_mode mode, double fixed,
                             const char *where, pw_az_result *r, pw_three_phase *tp,
                             size_t *n_removed, pw_error *err);

/* One azeotrope with the keys x1, T_K, P_kPa, kind and more. */
json_t *pw_azeotrope_entry_json(const pw_azeotrope *az);

/* The azeotrope list of `azeotrope --json`: the homogeneous azeotropes of r (each with
 * "heterogeneous": false), then the heterogeneous one of tp (may be NULL) when its vapor lies
 * between the layers (x1 the vapor, T_K and P_kPa the three-phase condition, x1_liquids). */
json_t *pw_azeotrope_list_json(const pw_az_result *r, const pw_three_phase *tp);

/* The azeotropes of a ranking row or a study (pw_rank_az_list) as a JSON array of
 * {x1, T_K, P_kPa, kind, heterogeneous}; ok false: null (the search failed). */
json_t *pw_rank_az_json(const pw_rank_az *az, size_t n, bool ok);

/* The `azeotrope --json` document for sys at the fixed condition (P in Pa or T in K by mode):
 * the homogeneous azeotropes of r (as left by pw_azeotrope_heterogeneous) and the heterogeneous
 * one of tp, each entry with "heterogeneous"; "three_phase" from tp (NULL: null). sc may be NULL
 * (no scan: "scan" is null); tps, when not NULL, holds the three-phase state at each scan point. */
json_t *pw_azeotrope_doc(const pw_system *sys, pw_az_mode mode, double fixed, const pw_az_result *r,
                         const pw_az_scan *sc, const pw_three_phase *tp, const pw_three_phase *tps);

/* ---- reflux ---- */

/* The column of the reflux command: pw_column_solve on the model's curve at P_Pa, and the
 * bubble temperatures at xd and xb (NAN when they cannot be found). On failure err names where
 * (the fit file) and the solver's reason. */
pw_status pw_reflux_solve(const pw_system *sys, double P_Pa, const pw_column_spec *spec,
                          const pw_column_options *opt, const char *where, pw_column_result *col,
                          double *T_top_K, double *T_bottom_K, pw_error *err);

/* The `reflux --json` document (CONTRACT keys plus the design table and the spec). */
json_t *pw_reflux_doc(const pw_column_result *c, double P_Pa, const pw_column_spec *spec,
                      double T_top_K, double T_bottom_K);

/* ---- screen ---- */

/* The `screen --json` document. */
json_t *pw_screen_doc(const pw_system *sys, const pw_screen_result *r, const pw_screen_options *o);

/* ---- lle ---- */

/* The lle command's split at T_K (pw_lle_solve). On failure err names where (the fit file) and
 * the solver's reason. */
pw_status pw_lle_run(const pw_system *sys, double T_K, const char *where, pw_lle_result *r,
                     pw_error *err);

/* The lle command's binodal (--scan FROM:TO:N, pw_lle_scan): n points from T_from_K to T_to_K
 * into pts (n entries), the critical solution temperatures into crit (PW_LLE_MAX_CRITICAL
 * entries) and *n_crit. On failure err names where and the reason. */
pw_status pw_lle_scan_run(const pw_system *sys, double T_from_K, double T_to_K, size_t n,
                          const char *where, pw_lle_scan_point *pts, pw_lle_critical *crit,
                          size_t *n_crit, pw_error *err);

/* The `lle --json` document at T_K; pts NULL: no scan (no "scan" and "critical" keys), else
 * n_pts scan points and n_crit critical solution temperatures. */
json_t *pw_lle_doc(const pw_system *sys, double T_K, const pw_lle_result *r,
                   const pw_lle_scan_point *pts, size_t n_pts, const pw_lle_critical *crit,
                   size_t n_crit);

/* ---- decanter ---- */

/* The decanter command's scheme (pw_decanter_solve). An impossible specification is PW_OK
 * with r->feasible false. On failure err names where (the fit file) and the reason. */
pw_status pw_decanter_run(const pw_system *sys, const pw_decanter_spec *spec,
                          const pw_column_options *opt, const char *where, pw_decanter_result *r,
                          pw_error *err);

/* The `decanter --json` document (CONTRACT keys, each column's pinch, q and the caution); what
 * the command prints is pw_decanter_command_doc. */
json_t *pw_decanter_doc(const pw_decanter_result *r, const pw_decanter_spec *spec);

/* The whole `decanter --json` document (without --uncertainty's keys): pw_decanter_doc and
 * "overflow_check" for sys (pw_overflow_check_doc, design_doc.h; both columns use constant
 * molal overflow). */
json_t *pw_decanter_command_doc(const pw_system *sys, const pw_decanter_result *r,
                                const pw_decanter_spec *spec);

/* ---- rate ---- */

/* The duties of rate --energy. */
typedef struct pw_rate_energy_out {
    double Q_C, Q_R; /* condenser and reboiler duties, J per mol feed (NAN without energy) */
    size_t n_roots;  /* steady states found (the one with the lowest distillate purity is r) */
} pw_rate_energy_out;

/* The rate command's column: pw_rate_energy with the heat data of sys when energy, else
 * pw_rate_cmo. The caller frees r with pw_rate_result_free (also after a failure). On failure
 * err names where (the fit file) and the reason. */
pw_status pw_rate_run(const pw_system *sys, double P_Pa, const pw_rate_spec *spec, bool energy,
                      const char *where, pw_rate_result *r, pw_rate_energy_out *en, pw_error *err);

/* The `rate --json` document; en is read only when energy. */
json_t *pw_rate_doc(const pw_system *sys, double P_Pa, const pw_rate_spec *spec, bool energy,
                    const pw_rate_result *r, const pw_rate_energy_out *en);

/* ---- --uncertainty (reflux, azeotrope) ---- */

/* [a, b] as a JSON array, or null when either is not finite. */
json_t *pw_json_pair(const double v[2]);

/* One propagated output: value, ci95 (and where from), both intervals, sds, disagreement. */
json_t *pw_unc_output_doc(const pw_unc_output *o);

/* The reflux command's propagation: pw_unc_column_assess with its measurement plan (10 bins of
 * 5 points). On failure err names where (the fit file). */
pw_status pw_reflux_unc_run(const pw_fit_result *fit, const pw_unc_column_ctx *col,
                            const pw_unc_options *opt, const char *where,
                            pw_unc_column_assessment *out, pw_error *err);

/* Adds r_min_ci95, feasible_probability and the "uncertainty" object to a reflux document;
 * factor is the operating factor of the stage count propagated. */
void pw_reflux_unc_doc(json_t *doc, const pw_unc_result *r, const pw_unc_options *opt,
                       double factor, pw_status plan_status, const pw_unc_plan *plan);

/* The azeotrope command's propagation: one pw_unc_azeo_assess per azeotrope of r, into
 * res[0 .. r->n - 1] (res holds at least r->n results). */
pw_status pw_azeotrope_unc_run(const pw_fit_result *fit, const pw_az_result *r,
                               const pw_unc_options *opt, pw_unc_result *res,
                               pw_error *err);

/* Adds x1_ci95, T_K_ci95 (fixed P) or P_kPa_ci95 (fixed T) and an "uncertainty" object to each
 * of the first n entries of the document's "azeotropes" list. */
void pw_azeotrope_unc_doc(json_t *list, const pw_az_result *r, const pw_unc_result *res, size_t n,
                          unsigned long seed);

/* The heterogeneous azeotrope's and the decanter scheme's propagation (pw_unc_het_assess), with
 * an error naming the fit's data set. */
pw_status pw_het_unc_run(const pw_fit_result *fit, const pw_unc_het_ctx *ctx,
                         const pw_unc_options *opt, pw_unc_result *res, pw_error *err);

/* Adds to the heterogeneous azeotrope's entry of the azeotrope document: x1_ci95 (of the vapor,
 * the azeotrope's composition), T_K_ci95 (fixed P) or P_kPa_ci95 (fixed T), x1_liquids_ci95
 * ([[lo, hi], [lo, hi]]) and an "uncertainty" object with every output and the draw counts
 * ("split_lost": draws whose model no longer gives a heterogeneous azeotrope). */
void pw_het_azeo_unc_doc(json_t *entry, const pw_unc_result *res, pw_az_mode mode,
                         unsigned long seed);

/* Adds an "uncertainty" object to a decanter document: the decanter temperature, vapor and
 * layers, each column's minimum boil-up (boilup_min_ci95 also on each column), the share of
 * draws for which the scheme is feasible and the draw counts. */
void pw_decanter_unc_doc(json_t *doc, const pw_unc_result *res, unsigned long seed);

#ifdef __cplusplus
}
#endif
#endif
