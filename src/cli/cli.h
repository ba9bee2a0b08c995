/* Private header of the command-line program: the command table and shared helpers.
 * Every command lives in its own src/cli/cmd_<name>.c and is listed in main.c. */
#ifndef CLI_H
#define CLI_H

#include <jansson.h>
#include <pinchwise/commands.h>
#include <pinchwise/component.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/fileio.h>
#include <pinchwise/fit.h>
#include <pinchwise/status.h>
#include <pinchwise/units.h>
#include <stdbool.h>

typedef struct cli_command {
    const char *name;
    const char *summary;
    /* argv[0] is the command name. Returns PW_OK, or the status of the failure (already
     * reported on stderr); PW_EINFEASIBLE for a negative verdict under --exit-verdict. main alone
     * turns a status into an exit code. */
    pw_status (*run)(int argc, char **argv);
} cli_command;

pw_status cli_fit(int argc, char **argv);
pw_status cli_check(int argc, char **argv);
pw_status cli_azeotrope(int argc, char **argv);
pw_status cli_reflux(int argc, char **argv);
pw_status cli_screen(int argc, char **argv);
pw_status cli_report(int argc, char **argv);
pw_status cli_lle(int argc, char **argv);
pw_status cli_decanter(int argc, char **argv);
pw_status cli_rate(int argc, char **argv);
pw_status cli_study(int argc, char **argv);

/* Prints "pinchwise CMD: file:line: message" as one line on stderr and returns err->status
 * (PW_EINVAL when err holds no failure). */
pw_status cli_fail(const char *cmd, const pw_error *err);

/* Prints "pinchwise CMD: message" (printf format) on stderr; returns st. */
pw_status cli_failf(const char *cmd, pw_status st, const char *fmt, ...) __attribute__((format(printf, 3, 4)));

/* Prints a warning line "pinchwise CMD: warning: ..." on stderr (never on stdout). */
void cli_warnf(const char *cmd, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

/* The printf field width that shows s (UTF-8, such as "T [\u00b0C]") in w columns: w plus the
 * bytes beyond one per character. */
int cli_width(int w, const char *s);

/* Loads the shipped component library, then extra_path (may be NULL) whose rows take precedence.
 * The shipped library is found at $PINCHWISE_COMPONENTS, then beside the source tree the
 * program was built from, then the installed data directory. */
pw_status cli_load_components(pw_complib *lib, const char *extra_path, pw_error *err);

/* For commands that read a fit file: when path is not NULL, reads that component file and replaces
 * the vapor-pressure data of each of the system's components that it names (a warning on stderr
 * says so, since the activity parameters were fitted with the fit file's own). */
pw_status cli_override_components(const char *cmd, pw_system *sys, const char *path,
                                     pw_error *err);

/* Warns on stderr when a component associates in the vapor (a carboxylic acid): modified
 * Raoult's law, which pinchwise uses, is then unreliable even at 1 atm. */
void cli_warn_vapor_association(const char *cmd, const pw_system *sys);
/* Warns when constant molal overflow is doubtful for sys (pw_cmo_doubtful); remedy, appended
 * to the message, says what to do instead ("" for nothing). */
void cli_warn_cmo(const char *cmd, const pw_system *sys, const char *remedy);

/* Reads a fit file and, when components is not NULL, applies cli_override_components. On
 * failure fit is left freed and err filled. */
pw_status cli_read_fit(const char *cmd, const char *path, const char *components,
                          pw_fit_result *fit, pw_error *err);

/* Parses a command-line quantity with its unit ("101.325kPa") for option opt; on failure fills
 * err with a message that names the option and lists the units. */
pw_status cli_quantity(pw_quantity q, const char *opt, const char *text, double *si,
                          pw_error *err);

/* Parses a plain number (a mole fraction, q, a factor) for option opt; rejects trailing junk,
 * NaN and Inf. */
pw_status cli_number(const char *opt, const char *text, double *value, pw_error *err);

/* Column targets as given with the shared option blocks (cli_targets_get, cli_options.h). */
typedef struct cli_targets {
    double P_Pa;
    double xd, xb, zf, q; /* q defaults to 1 */
    bool have_P, have_xd, have_xb, have_zf;
    pw_basis basis[3]; /* of xd, xb, zf as given (mole unless "wt"/"wt%"); see cli_units.h */
} cli_targets;

/* Converts xd, xb, zf given by mass (basis[]) to mole fractions of sys's component 1. */
pw_status cli_targets_to_mole(double *xd, double *xb, double *zf, const pw_basis basis[3],
                                 const pw_system *sys, pw_error *err);

/* Writes obj to stdout as one JSON object followed by a newline (17 significant digits);
 * steals the reference. PW_OK, or PW_EIO; prints nothing and returns PW_ENOMEM
 * when obj is NULL or any jansson allocation has failed (see
 * cli_watch_json_allocations), since such an object may lack keys. */
pw_status cli_print_json(json_t *obj);

/* A JSON number, or null when v is not finite. New reference. */
json_t *cli_json_num(double v);

/* True when stderr is a terminal: only then is progress shown. */
bool cli_progress_wanted(void);

/* Progress of long work on stderr, only when stderr is a terminal (silent otherwise): rewrites
 * the line "pinchwise CMD: DONE/TOTAL WHAT" in place and ends it when done == total. */
void cli_progress(const char *cmd, const char *what, size_t done, size_t total);

/* The same, but each call ends its line (one line per finished unit, e.g. per model). */
void cli_progress_line(const char *cmd, const char *what, size_t done, size_t total);

/* Context of cli_progress_tenths. */
typedef struct cli_progress_ctx {
    const char *cmd, *what;
} cli_progress_ctx;

/* A pw_progress_fn for library calls (ctx is a cli_progress_ctx): cli_progress at the
 * first unit, at every tenth of total and at the end. Always PW_OK. */
pw_status cli_progress_tenths(void *ctx, size_t done, size_t total);

/* Hooks cli_progress_tenths with pc into a library call's progress fields when progress is
 * wanted (stderr is a terminal); clears them otherwise. */
void cli_progress_attach(pw_progress_fn *fn, void **ctx, cli_progress_ctx *pc);

/* Temporary output files (cli_tmpfiles.c): hooks for pw_outset_new that register every
 * temporary file, and handlers for SIGINT, SIGTERM and SIGHUP (installed once by main) that
 * remove the registered files before the program ends with that signal. */
const pw_tmp_hooks *cli_tmp_hooks(void);
void cli_install_signal_cleanup(void);

/* Routes jansson's allocations through a wrapper that remembers a failure (main calls it once,
 * before any JSON is built); cli_print_json then refuses to print. */
void cli_watch_json_allocations(void);

/* A whole number for option opt in [lo, hi] (hi at most 2^53): digits only, optionally in
 * exponent form ("1e3"); a fraction, a sign where lo >= 0, NaN or a value out of range is refused
 * with a message naming the option and the range. PW_OK or PW_EINVAL with err. */
pw_status cli_whole(const char *opt, const char *text, double lo, double hi, unsigned long long *out,
                 pw_error *err);

/* A number for option opt in [lo, hi]; the message names the option, the range and what it is
 * (e.g. "a multiple of R_min"). PW_OK or PW_EINVAL with err. */
pw_status cli_ranged(const char *opt, const char *text, double lo, double hi, const char *what,
                  double *out, pw_error *err);

/* Checks that stdout took everything written to it; prints "pinchwise CMD: cannot write to
 * standard output: REASON" and returns PW_EIO when not, else PW_OK. */
pw_status cli_finish_stdout(const char *cmd);

#endif
