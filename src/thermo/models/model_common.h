/* Private helpers shared by the activity-model files (src/thermo/models). */
#ifndef PW_THERMO_MODEL_COMMON_H
#define PW_THERMO_MODEL_COMMON_H

#include <pinchwise/model.h>

#include <stdbool.h>

/* True when 0 <= x1 <= 1 and T is finite and positive. */
bool pw_model_state_ok(double x1, double T_K);

/* True when the first n entries of p are finite. */
bool pw_model_params_finite(const double *p, size_t n);

/* Completes out from lngamma[], dlngamma_dT[], gE_RT and d2gE_dx2, which the model has set:
 *   dln(gamma1)/dx1 = x2 g'',  dln(gamma2)/dx1 = -x1 g''   (from ln gamma1 = g + x2 g',
 *   ln gamma2 = g - x1 g' at constant T), and H^E = -R T^2 (x1 dln gamma1/dT + x2 dln gamma2/dT).
 * Returns PW_EDOM when any field is not finite. */
pw_status pw_model_finish(pw_activity *out, double x1, double T_K);

/* The end of every eval_lean: PW_OK when ln gamma_i and d ln gamma_i/dT are finite, else PW_EDOM. */
pw_status pw_model_lean_finish(const double lngamma[2], const double dlngamma_dT[2]);

#endif
