/* Command-line values with units, compositions by mass or mole, and the uncertainty options: the
 * same syntax as the data files (the parsing itself is the library's, pinchwise/units.h). */
#ifndef CLI_UNITS_H
#define CLI_UNITS_H

#include <pinchwise/equilibrium.h>
#include <pinchwise/fit.h>
#include <pinchwise/status.h>
#include <pinchwise/units.h>

/* --sigma-T (a temperature difference: 0.05K, 0.1 C) sets *T_K; --sigma-P (0.2%, 0.05kPa, or a
 * bare number read as percent, the older form) sets *P_rel or *P_abs_Pa and the other to NAN.
 * err names the option. */
pw_status cli_uncertainty_opt(const char *opt, const char *text, double *T_K, double *P_rel,
                                 double *P_abs_Pa, pw_error *err);

/* A composition for option opt: a mole fraction, or a number with mol%, wt or wt% (basis in *b;
 * mass fractions are converted with cli_composition_to_mole once the components are known).
 * PW_OK or PW_EINVAL with err. */
pw_status cli_composition(const char *opt, const char *text, double *value, pw_basis *b,
                       pw_error *err);

/* Converts *x (on basis b, given for option opt) to a mole fraction of the system's component 1;
 * a missing molar mass is refused naming the option, the component and the column. */
pw_status cli_composition_to_mole(const char *opt, double *x, pw_basis b, const pw_system *sys,
                                     pw_error *err);

/* --exit-verdict (cli_block_verdict): a negative verdict (a split that cannot be made, data
 * not shown consistent, an infeasible screen) makes the command return PW_EINFEASIBLE, which main
 * turns into exit status 7, for scripts; without the option such a verdict is a result and the
 * status is PW_OK. */

/* --minimum N on a command that reads a fit file: makes the fit's N-th distinct minimum (1 = the
 * lowest chi-square) its parameters, covariance recomputed (pw_fit_use_minimum), and says so on
 * stderr. text NULL: nothing. *chosen is N, or 0 when not given. A minimum the fit does not
 * record is refused naming fit_path, the file the user gave. */
pw_status cli_apply_minimum(const char *cmd, const char *fit_path, pw_fit_result *fit,
                            const char *text, size_t *chosen, pw_error *err);

/* cli_read_fit, then cli_apply_minimum with minimum_text (NULL: none); frees the fit on failure. */
pw_status cli_read_fit_at(const char *cmd, const char *path, const char *components,
                          const char *minimum_text, pw_fit_result *fit, size_t *chosen,
                          pw_error *err);
#endif
