/* Private to the thermodynamics module and its tests. */
#ifndef PW_THERMO_INTERNAL_H
#define PW_THERMO_INTERNAL_H

#include <pinchwise/equilibrium.h>
#include <pinchwise/lle.h>

/* pw_bubble_T without the Newton fast path: bracket (checked, widened) and GSL Brent only.
 * Same statuses and output as pw_bubble_T; exists so that tests reach the fallback. */
pw_status pw_thermo_bubble_T_brent(const pw_system *s, double P_Pa, double x1, pw_eq_point *out);

/* True when the model provably cannot split at any temperature in [T_a, T_b]: d2(Gmix/RT)/dx^2
 * is shown positive on the whole box (0, 1) x [T_a, T_b] by branch and bound on interval bounds
 * of the model's own formula (src/thermo/split_bound.c; Wilson's equation always). False means
 * "not proven" (a split may exist): run the full search. */
bool pw_thermo_split_excluded(const pw_system *s, double T_a, double T_b);

/* The proof's lower bound of D over one box [x_a, x_b] x [T_a, T_b] (NAN when the model has no
 * bound, or for Wilson's equation, which needs none); for tests: on a box of one point it is D
 * there, and it never exceeds D at a point of the box. */
double pw_thermo_split_D_lower(const pw_system *s, double x_a, double x_b, double T_a, double T_b);

/* pw_three_phase_at_P without its shortcuts (every grid temperature solved, no split proof):
 * the reference the tests compare the fast search with. */
pw_status pw_thermo_three_phase_at_P_full(const pw_system *s, double P_Pa, pw_three_phase *out);

#endif
