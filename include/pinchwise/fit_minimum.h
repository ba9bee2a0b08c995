/* Choosing another of a fit's distinct minima.
 *
 * The multistart records every distinct local minimum it found (pw_fit_result.minima, best chi2
 * first) and chooses one by the rule of docs/fitting.md. pw_fit_use_minimum makes another one the
 * fit's parameters, for example the physical branch of an NRTL fit whose best minimum predicts a
 * liquid split the data do not show: the parameters, chi2, covariance, standard errors, 95 %
 * intervals and correlations are recomputed at that minimum from the fit's own points (the same
 * objective and weights), then the deviations, information criteria and the liquid-stability
 * screen (pw_fit_evaluate). */
#ifndef PINCHWISE_FIT_MINIMUM_H
#define PINCHWISE_FIT_MINIMUM_H

#include <pinchwise/fit.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Makes minimum n (1-based, in the order of r->minima: 1 is the lowest chi2) the fit's parameters.
 * PW_EINVAL naming the range when n is 0 or beyond r->n_minima; the errors of pw_fit_evaluate.
 * The covariance is left zero with NAN standard errors when the Jacobian there is singular. */
pw_status pw_fit_use_minimum(pw_fit_result *r, size_t n, pw_error *err);

/* The default among r->minima (sorted, lowest chi2 first), by the rule of docs/fitting.md: of the
 * minima that fit as well as the best (pw_fit_competing_minima: chi2 within a factor
 * max(1.01, exp(2/n)) of the lowest, n the number of residuals), the first whose parameters
 * predict no liquid-liquid split over the data's temperatures (r->T_min_K to r->T_max_K; r->sys
 * gives the model and components). The lowest when none of them is free of a split, when only one
 * competes, or for partly miscible data (three-phase points or tie lines: the split is measured).
 * Returns the 1-based index (0 when r records no minimum); *n_split_skipped (may be NULL) is how
 * many lower minima were passed over because they predict a split. */
size_t pw_fit_default_minimum(const pw_fit_result *r, size_t *n_split_skipped);

#ifdef __cplusplus
}
#endif
#endif
