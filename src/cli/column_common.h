/* The column part of the command line, shared by reflux, screen and study: the column's options
 * (reflux's own spec and parser are here too), the analysis run through the library, its warnings
 * and JSON. No command owns this file; each command file calls it. */
#ifndef CLI_COLUMN_COMMON_H
#define CLI_COLUMN_COMMON_H

#include <jansson.h>
#include <pinchwise/column.h>
#include <pinchwise/design.h>
#include <pinchwise/fit.h>
#include <pinchwise/units.h>
#include <stdbool.h>

#include "cli_options.h"

#define CLI_MAX_COMPARE 8

typedef struct cli_column_args {
    const char *fit_path;
    const char *components; /* --components FILE: replaces vapor-pressure rows */
    double P_Pa;
    pw_column_spec spec;
    pw_column_options opt;
    bool json;
    bool energy; /* --energy: energy balances instead of constant molal overflow */
    bool have_P, have_xd, have_xb, have_zf;
    pw_basis basis[3]; /* of xd, xb, zf as given; converted to mole fractions in cli_column_compute */
    const char *given[3]; /* xd, xb, zf as typed, for the text output */
    /* the uncertainty block (--uncertainty, --samples, --seed; samples or seed imply it) and the
     * fits of the same data given with --compare */
    cli_uncertainty unc;
    size_t n_compare;
    const char *compare[CLI_MAX_COMPARE];
    bool uncertainty; /* --uncertainty itself was given (the warnings then do not suggest it) */
    bool exit_verdict; /* --exit-verdict: status 7 for an infeasible split */
    const char *minimum; /* --minimum N as given, or NULL */
    pw_display_units units; /* --show-in (text output and warnings) */
    bool help;           /* --help was asked for: nothing else is set */
} cli_column_args;

typedef struct cli_column_run {
    pw_fit_result fit;
    double P_Pa;
    pw_column_spec spec;
    pw_column_result col;       /* constant molal overflow (feasibility, n_min, R_min) */
    pw_design_table design;     /* the design rows with stage profiles, of the balance used */
    bool energy;                /* --energy: energy_res holds the energy-balance answer */
    pw_energy_result energy_res;
    pw_heat_data heat;          /* with energy: the heat data used */
    double T_top_K, T_bottom_K;
    bool with_uncertainty; /* --uncertainty given: the warnings do not suggest it */
    size_t minimum;        /* --minimum N applied (0: the fit's own choice) */
    const char *given[3];  /* xd, xb, zf as typed when any was given by mass, else NULL */
    pw_display_units units; /* --show-in (text output and warnings) */
} cli_column_run;

/* Frees what cli_column_compute allocated (the fit and the design table). */
void cli_column_run_free(cli_column_run *run);

/* The reflux command's options (its --help is made from them). */
extern const cli_spec cli_reflux_spec;

/* Parses the reflux command's argv (cli_reflux_spec) into a; a->help when --help was asked for.
 * PW_OK or PW_EINVAL with err. */
pw_status cli_reflux_parse_args(int argc, char **argv, cli_column_args *a, pw_error *err);

/* The column arguments of parsed options p (any spec that holds the reflux options it uses:
 * those it lacks are simply absent) and fit_path into a. PW_OK or PW_EINVAL with err when a
 * required one is missing. */
pw_status cli_column_args_from(const cli_args *p, const char *fit_path, cli_column_args *a,
                              pw_error *err);

/* Reads the fit file and runs the column analysis. PW_OK or the status with err. The caller
 * frees run->fit. */
pw_status cli_column_compute(const cli_column_args *a, cli_column_run *run, pw_error *err);

/* Warnings on stderr: temperatures outside a component's vapor-pressure range or the fit's data
 * range, non-converged fit, predicted liquid split. */
void cli_column_warn(const cli_column_run *run);

/* The --json object of CONTRACT.md plus the design table. New reference. */
json_t *cli_column_json(const cli_column_run *run);

#endif
