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

#ifdef __cplusplus
}
#endif
#endif
