/* A flat interface for other languages (the Python module calls it through ctypes): plain
 * strings and numbers in, the command's JSON document as text out.
 *
 * Each pw_api_<command> does what `pinchwise <command> ... --json` does and returns the very
 * text that command prints (pinchwise/commands.h builds both), so a binding that parses it gets
 * the same keys and values as the command line. Quantities are strings with their unit
 * ("101.325kPa", "1atm", "350K"); compositions are mole fractions of component 1.
 *
 * Every function returns a pw_status; on failure err (caller-owned, may be NULL) carries file,
 * line and what is wrong, and *doc is NULL (doc itself must not be NULL: PW_EINVAL). On success *doc is malloc'd text that the caller
 * releases with pw_api_free. Nothing is printed; nothing is written except the fit file that
 * pw_api_fit is asked to write (atomically). Threads: the functions keep no state and may run
 * at the same time on different inputs, once pw_api_init has run. */
#ifndef PINCHWISE_API_H
#define PINCHWISE_API_H

#include <pinchwise/status.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Prepares the process for library calls: switches GSL's aborting error handler off (a
 * process-wide GSL setting; pinchwise checks every GSL status itself). Call once, before other
 * threads use GSL. Idempotent. */
void pw_api_init(void);

/* The library's version ("0.1.0"). Static string. */
const char *pw_api_version(void);

/* Frees text returned by the functions below. Accepts NULL. */
void pw_api_free(char *text);

/* The size of a pw_error, for bindings that allocate it as raw memory. */
size_t pw_api_error_size(void);

/* `fit DATA --model MODEL [--components FILE] [--out OUT] [--force] --json`. out may be NULL:
 * then no fit file is written and the document's "fit_file" is null. fit_file (may be NULL)
 * receives the whole fit file's text (what would be written), to pass to the functions below
 * as fit_text. MODEL: the name of any model of pw_model_all (pw_model_names lists them). */
pw_status pw_api_fit(const char *data, const char *model, const char *components, const char *out,
                     int force, char **doc, char **fit_file, pw_error *err);

/* As pw_api_fit, with the tie lines of the LLE file lle (may be NULL: none) fitted together with
 * the VLE data, as `fit DATA --lle LLE`; an out that names the LLE file is refused. */
pw_status pw_api_fit_lle(const char *data, const char *model, const char *components,
                         const char *lle, const char *out, int force, char **doc, char **fit_file,
                         pw_error *err);

/* `check DATA [--components FILE] [--strict] --json`. */
pw_status pw_api_check(const char *data, const char *components, int strict, char **doc,
                       pw_error *err);

/* The fit is fit_path (a fit file) or, when fit_path is NULL, fit_text (a fit file's text, as
 * pw_api_fit returns it; name is used in messages). components: as --components. */

/* Uncertainty (--uncertainty --samples N --seed N): uncertainty 0 for none; samples and seed
 * below 0 for the defaults (400 draws, seed 1); samples 0..100000, seed 0..4294967295. Giving
 * samples or seed switches the propagation on, as on the command line. */

/* `azeotrope FIT (--pressure P | --temperature T) [--uncertainty ...] --json`; both NULL: the
 * condition of the fit's own data. */
pw_status pw_api_azeotrope(const char *fit_path, const char *fit_text, const char *name,
                           const char *components, const char *pressure, const char *temperature,
                           int uncertainty, long samples, long seed, char **doc, pw_error *err);

/* `reflux FIT --pressure P --xd X --xb X --zf X --q Q [--uncertainty ...] --json`. */
pw_status pw_api_reflux(const char *fit_path, const char *fit_text, const char *name,
                        const char *components, const char *pressure, double xd, double xb,
                        double zf, double q, int uncertainty, long samples, long seed, char **doc,
                        pw_error *err);

/* `reflux ... [--energy] --json`: pw_api_reflux with energy != 0 for energy balances on every
 * stage (the heat data of the fit file, or of components) instead of constant molal overflow. */
pw_status pw_api_reflux_ex(const char *fit_path, const char *fit_text, const char *name,
                           const char *components, const char *pressure, double xd, double xb,
                           double zf, double q, int uncertainty, long samples, long seed,
                           int energy, char **doc, pw_error *err);

/* `screen FIT --pressure P --xd X --xb X [--zf X] --json`; zf NAN: the default feed. */
pw_status pw_api_screen(const char *fit_path, const char *fit_text, const char *name,
                        const char *components, const char *pressure, double xd, double xb,
                        double zf, char **doc, pw_error *err);

/* `lle FIT --temperature T [--scan FROM:TO:N] --json`: the liquid-liquid split at temperature.
 * scan_from, scan_to (temperatures with their unit) and scan_n (2..1000): the binodal at scan_n
 * temperatures; all NULL and 0 for none. */
pw_status pw_api_lle(const char *fit_path, const char *fit_text, const char *name,
                     const char *components, const char *temperature, const char *scan_from,
                     const char *scan_to, long scan_n, char **doc, pw_error *err);

/* `decanter FIT --pressure P --zf X --x1-rich X --x1-lean X --q Q --json`: the decanter and two
 * stripping columns of a heterogeneous binary. zf in (0, 1); x1_rich, x1_lean in [0, 1]; q in
 * [-10, 10]. An impossible specification is PW_OK with "feasible": false. */
pw_status pw_api_decanter(const char *fit_path, const char *fit_text, const char *name,
                          const char *components, const char *pressure, double zf, double x1_rich,
                          double x1_lean, double q, char **doc, pw_error *err);

/* `decanter ... [--uncertainty --samples N --seed N] --json`: pw_api_decanter with the fit's
 * covariance carried into the decanter and both minimum boil-ups (uncertainty, samples, seed as
 * for pw_api_reflux; nothing is propagated when the scheme is infeasible at the estimate, as on
 * the command line). */
pw_status pw_api_decanter_ex(const char *fit_path, const char *fit_text, const char *name,
                             const char *components, const char *pressure, double zf,
                             double x1_rich, double x1_lean, double q, int uncertainty,
                             long samples, long seed, char **doc, pw_error *err);

/* `decanter ... [--decanter-temperature T]`: pw_api_decanter_ex with a cooled decanter at
 * decanter_temperature (a temperature with its unit, e.g. "30C"; NULL or "" for the three-phase
 * temperature). */
pw_status pw_api_decanter_ex2(const char *fit_path, const char *fit_text, const char *name,
                              const char *components, const char *pressure, double zf,
                              double x1_rich, double x1_lean, double q, int uncertainty,
                              long samples, long seed, const char *decanter_temperature,
                              char **doc, pw_error *err);

/* `rate FIT --pressure P --stages N --feed-stage K --reflux R --zf X --distillate D --q Q
 * [--energy] --json`: the products of a given column. stages, feed_stage 1..100000; zf in
 * [0, 1]; q in [-10, 10]; energy != 0: energy balances (adds the duties). */
pw_status pw_api_rate(const char *fit_path, const char *fit_text, const char *name,
                      const char *components, const char *pressure, long stages, long feed_stage,
                      double reflux, double zf, double distillate, double q, int energy, char **doc,
                      pw_error *err);

#ifdef __cplusplus
}
#endif
#endif
