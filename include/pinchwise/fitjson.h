/* JSON views of a fit result (jansson json_t; the caller owns the returned reference). */
#ifndef PINCHWISE_FITJSON_H
#define PINCHWISE_FITJSON_H

#include <jansson.h>
#include <pinchwise/fit.h>
#include <pinchwise/fit_diagnostics.h>

#ifdef __cplusplus
extern "C" {
#endif

/* The keys every consumer relies on: model, converged, components, parameters, stderr, fixed,
 * ln_gamma_inf, T_ref_K, aad_y, aad_T_K, aad_P_kPa. NULL on allocation failure. */
json_t *pw_fitfile_summary_json(const pw_fit_result *r);

/* The whole fit file (summary plus statistics, covariance, data, components, provenance). */
json_t *pw_fitfile_to_json(const pw_fit_result *r);

/* The fit's diagnostics (pw_fit_diagnose, include/pinchwise/fit_diagnostics.h) as an array of
 * objects {"kind", "severity", "line", "other_line", "component", "parameters", "count",
 * "value", "unit", "message"} (null where a record has none). NULL on failure. */
json_t *pw_fit_diagnostics_json(const pw_fit_result *r);
/* The same array from a list already made; sys gives the component and parameter names. */
json_t *pw_fit_diags_json(const pw_fit_diags *d, const pw_system *sys);

/* Words for a stop reason ("step below tolerance", "iteration limit reached", ...). */
const char *pw_fit_stop_name(pw_stop_reason s);

#ifdef __cplusplus
}
#endif
#endif
