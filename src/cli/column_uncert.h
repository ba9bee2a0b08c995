/* --uncertainty, --samples, --seed and --compare on the reflux command (and on commands built on
 * it): the library's propagation, feasibility risk, measurement plan and model comparison, as
 * JSON keys and as text. */
#ifndef CLI_COLUMN_UNCERT_H
#define CLI_COLUMN_UNCERT_H

#include "column_common.h"

#include <jansson.h>
#include <pinchwise/uncertainty.h>


typedef struct cli_column_uncert {
    bool propagate;          /* --uncertainty (or --samples / --seed) given */
    pw_unc_options opt;
    pw_unc_column_ctx col;
    pw_unc_result res;
    pw_status plan_status;
    pw_unc_plan plan;
    size_t n_compare;        /* fit files given with --compare */
    const char *compare_paths[CLI_MAX_COMPARE];
    pw_unc_models models;    /* row 0 is the main fit, then the --compare ones */
    char paths[CLI_MAX_COMPARE + 1][PW_PATH_MAX];
} cli_column_uncert;

/* Runs what a's uncertainty options and --compare fits ask for. PW_OK or the
 * status with err filled. */
pw_status cli_column_uncert_run(const cli_column_args *a, const cli_column_run *run, cli_column_uncert *u,
                         pw_error *err);

/* Adds the CONTRACT keys r_min_ci95 and feasible_probability (with --uncertainty) and the
 * "uncertainty" and "model_comparison" objects to o. */
void cli_column_uncert_json(const cli_column_uncert *u, json_t *o);

/* [a, b] as a JSON array, or null when either is not finite. New reference. */
json_t *cli_json_pair(const double v[2]);

/* One propagated output: value, ci95 (and where from), both intervals, sds, disagreement. */
json_t *cli_unc_output_json(const pw_unc_output *o);

/* The same as text on stdout. */
void cli_column_uncert_print(const cli_column_uncert *u, const cli_column_run *run);

#endif
