/* What each command computes and prints, as library calls.
 *
 * The JSON document that `pinchwise COMMAND --json` prints is built here, by one function per
 * command, and the command-line program and the Python module (through pinchwise/api.h) both
 * call it: their outputs agree by construction. Builders return a new jansson reference that
 * the caller owns (json_decref), or NULL when out of memory. Nothing here prints. */
#ifndef PINCHWISE_COMMANDS_H
#define PINCHWISE_COMMANDS_H

#include <jansson.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/column.h>
#include <pinchwise/component.h>
#include <pinchwise/consistency.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fit.h>
#include <pinchwise/screen.h>
#include <pinchwise/uncertainty.h>
#include <stdbool.h>

#ifdef __cplusplus
extern "C" {
#endif

/* ---- shared ---- */

/* A JSON number, or null when v is not finite. New reference. */
json_t *pw_json_num(double v);

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

/* For commands that read a fit file: replaces the vapor-pressure data of each of sys's
 * components that the component file at path names. changed[i] (may be NULL) tells whether
 * component i's correlation differs from the fit file's own (the caller may warn: the activity
 * parameters were fitted with the fit file's). PW_OK without change when path is NULL. */
pw_status pw_system_override_components(pw_system *sys, const char *path, bool changed[2],
                                        pw_error *err);

/* ---- fit ---- */

/* The `fit --json` document: the fit file without its data and component blocks, plus
 * "fit_file" (fit_file may be NULL: then null, for a fit that was not written). */
json_t *pw_fit_doc(const pw_fit_result *r, const char *fit_file);

/* ---- check ---- */

/* The `check --json` document of a consistency result. strict: the verdict rule used. */
json_t *pw_check_doc(const pw_dataset *ds, const pw_consistency_result *r, bool strict);

/* The cautions the check document carries; *n receives how many. Static strings. */
const char *const *pw_check_cautions(size_t *n);

/* ---- azeotrope ---- */

/* One azeotrope with the keys x1, T_K, P_kPa, kind and more. */
json_t *pw_azeotrope_entry_json(const pw_azeotrope *az);

/* The `azeotrope --json` document for sys at the fixed condition (P in Pa or T in K by mode);
 * sc may be NULL (no scan: "scan" is null). */
json_t *pw_azeotrope_doc(const pw_system *sys, pw_az_mode mode, double fixed, const pw_az_result *r,
                         const pw_az_scan *sc);

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

#ifdef __cplusplus
}
#endif
#endif
