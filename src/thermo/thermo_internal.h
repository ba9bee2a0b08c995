/* Private to the thermodynamics module and its tests. */
#ifndef PW_THERMO_INTERNAL_H
#define PW_THERMO_INTERNAL_H

#include <pinchwise/equilibrium.h>

/* pw_bubble_T without the Newton fast path: bracket (checked, widened) and GSL Brent only.
 * Same statuses and output as pw_bubble_T; exists so that tests reach the fallback. */
pw_status pw_thermo_bubble_T_brent(const pw_system *s, double P_Pa, double x1, pw_eq_point *out);

#endif
