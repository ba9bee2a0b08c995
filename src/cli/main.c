/* pinchwise command-line front end: dispatches to one file per command. */
#include "cli.h"

#include <gsl/gsl_errno.h>
#include <stdio.h>
#include <string.h>

#include "pinchwise_version.h"

static const cli_command commands[] = {
    {"fit", "fit an activity model to a measured VLE file (or a folder of them)", cli_fit},
    {"check", "thermodynamic consistency tests of a measured VLE file", cli_check},
    {"azeotrope", "azeotropes of a fitted model at a pressure or temperature", cli_azeotrope},
    {"reflux", "minimum reflux, pinch, and stages of a binary column", cli_reflux},
    {"screen", "quick feasibility verdict for a split", cli_screen},
    {"report", "self-contained HTML report of a fit (and a column)", cli_report},
    {"lle", "liquid-liquid split (two layers) of a fitted model at a temperature", cli_lle},
    {"decanter", "decanter and two stripping columns for a partly miscible binary", cli_decanter},
    {"rate", "products and stage profile of a given column", cli_rate},
    {"study", "the whole study of a data file and a split, into one folder", cli_study},
};

/* The exit status of the program: the one table (README, "Exit status", says the same). Every
 * command and helper returns a pw_status; only main turns it into an exit code, here. A status
 * missing from the table (a status added to pinchwise/status.h and forgotten here) exits 1. */
static const struct {
    pw_status status;
    int code;
} exit_codes[] = {
    {PW_OK, 0},
    {PW_EINVAL, 2},      /* usage: an unknown option, a missing or malformed value */
    {PW_EPARSE, 3},      /* an input file is malformed */
    {PW_ENOTFOUND, 3},   /* a component (or a file's part) is not found */
    {PW_ETOOFEW, 3},     /* too few data points */
    {PW_EIO, 4},         /* a file cannot be read or written */
    {PW_EEXIST, 4},      /* an output exists (pass --force) */
    {PW_ENOMEM, 5},      /* out of memory */
    {PW_EDOM, 6},        /* a numerical method failed: outside a model's domain, */
    {PW_ERANGE, 6},      /* outside a validity range, */
    {PW_ENOBRACKET, 6},  /* no root in the bracket, */
    {PW_EMAXITER, 6},    /* iteration limit, */
    {PW_ENOCONV, 6},     /* no convergence, */
    {PW_ESINGULAR, 6},   /* a singular matrix */
    {PW_EINFEASIBLE, 7}, /* --exit-verdict: the verdict is negative (output written as usual) */
};

static int exit_code(pw_status st)
{
    for (size_t i = 0; i < sizeof exit_codes / sizeof exit_codes[0]; i++)
        if (exit_codes[i].status == st)
            return exit_codes[i].code;
    return 1;
}

static void usage(FILE *f)
{
    fprintf(f, "usage: pinchwise COMMAND [ARGS] [--json]\n\ncommands:\n");
    for (size_t i = 0; i < sizeof commands / sizeof commands[0]; i++)
        fprintf(f, "  %-10s %s\n", commands[i].name, commands[i].summary);
    fprintf(f, "\n  pinchwise COMMAND --help   options of one command\n"
               "  pinchwise --version\n");
}

int main(int argc, char **argv)
{
    gsl_set_error_handler_off();
    if (argc < 2) {
        fprintf(stderr, "pinchwise: no command given (see pinchwise --help)\n");
        return exit_code(PW_EINVAL);
    }
    if (!strcmp(argv[1], "--help") || !strcmp(argv[1], "-h") || !strcmp(argv[1], "help")) {
        usage(stdout);
        return exit_code(cli_finish_stdout("help"));
    }
    if (!strcmp(argv[1], "--version")) {
        printf("pinchwise %s\n", PINCHWISE_VERSION_STRING);
        return exit_code(cli_finish_stdout("version"));
    }
    cli_install_signal_cleanup();
    cli_watch_json_allocations();
    for (size_t i = 0; i < sizeof commands / sizeof commands[0]; i++)
        if (!strcmp(argv[1], commands[i].name)) {
            /* every command parses its options with cli_parse (cli_options.h) */
            pw_status rc = commands[i].run(argc - 1, argv + 1);
            pw_status out = cli_finish_stdout(commands[i].name); /* e.g. a full disk */
            return exit_code(rc != PW_OK ? rc : out);
        }
    fprintf(stderr, "pinchwise: unknown command '%s' (expected one of: ", argv[1]);
    for (size_t i = 0; i < sizeof commands / sizeof commands[0]; i++)
        fprintf(stderr, "%s%s", i ? ", " : "", commands[i].name);
    fprintf(stderr, ")\n");
    return exit_code(PW_EINVAL);
}
