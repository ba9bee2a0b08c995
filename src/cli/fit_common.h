/* Shared pieces of the fit command (single, all models, batch). */
#ifndef CLI_FIT_COMMON_H
#define CLI_FIT_COMMON_H

#include <jansson.h>
#include <pinchwise/component.h>
#include <pinchwise/fit.h>
#include <pinchwise/fit_diagnostics.h>
#include <pinchwise/lledata.h>
#include <pinchwise/units.h>
#include <stdbool.h>
#include <stddef.h>

typedef struct cli_fit_opts {
    pw_fit_options fit;
    const pw_complib *lib;
    bool force, json;
    bool quiet; /* no warnings on stderr (batch workers collect them instead) */
    bool no_range_warning; /* data-range warnings already given (--model all: once, not per model) */
    const pw_lle_dataset *lle; /* --lle: tie lines fitted with the VLE data (NULL: none) */
    const char *inputs[4]; /* files read besides the dataset (component files): never written */
    size_t n_inputs;
    pw_fit_diags *diags; /* when not NULL, receives the fit's diagnostics (batch workers) */
    pw_display_units units; /* --show-in: the text output's and the warnings' units */
} cli_fit_opts;

/* Prints the diagnostics on stderr as warnings, each prefixed with input (and the data line);
 * ranges false leaves out the data-range ones (--model all: given once, not per model). */
void cli_fit_print_diags(const char *input, const pw_fit_diags *d, bool ranges,
                         const pw_display_units *u);

/* Reads input, fits model, writes the fit file (out, else out_dir/<stem>.<model>.json, else
 * fits/<stem>.<model>.json) and leaves the result in r (caller frees) and its path in path.
 * Returns PW_OK, or the status with err filled (nothing written then). */
pw_status cli_fit_one(const char *input, const pw_model_type *model, const char *out, const char *out_dir,
               const cli_fit_opts *co, pw_fit_result *r, char *path, size_t path_len,
               pw_error *err);

/* The --json object of one fit: the fit file without the data and component blocks, plus
 * "fit_file". New reference. */
json_t *cli_fit_json(const pw_fit_result *r, const char *path);

/* --model all: fits every model, ranks them by AICc, prints table or JSON. Returns PW_OK or the
 * status of the failure (already reported). */
pw_status cli_fit_all_models(const char *input, const char *out_dir, const cli_fit_opts *co);

#endif
