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

/* The lean bubble-point kernel of the fit (docs/fitting.md, "Lean bubble-point kernel"): the
 * Antoine constants of the two components with their unit maps, set once per system by
 * pw_thermo_kernel_init (components with prepared units; others, and IAPWS-IF97, take
 * pw_psat). */
typedef struct pw_kernel_antoine {
    double A, B, C, base, Ts, To, Ps, Po;
} pw_kernel_antoine;

typedef struct pw_thermo_kernel {
    bool antoine[2];
    pw_kernel_antoine an[2];
} pw_thermo_kernel;

void pw_thermo_kernel_init(const pw_system *s, pw_thermo_kernel *k);


/* What the fit needs of a bubble point: T (isobaric) or P (isothermal), y1, and
 * d ln P_i^sat/dT at the root. */
typedef struct pw_bubble_lean {
    double T_K, P_Pa, y1;
    double dlnPs[2];
    int iterations;
} pw_bubble_lean;

/* pw_bubble_T_from with the lean evaluation in its Newton steps (the model's eval_lean, the
 * kernel's vapor pressures: no parameter derivatives, the same values); the same Newton
 * iteration, tests and Brent fallback, so the same root, y1 and slopes to the bit. The virial
 * vapor takes the full path. s->params must have passed the model's check (the fit checks each
 * parameter vector once). One difference by design: where eval would fail only on a quantity the
 * lean evaluation does not compute (a parameter derivative, H^E), the lean Newton step goes on
 * where the full one would fall back to Brent (not met on the 1,035 fits of pw-bench minima). */
pw_status pw_thermo_bubble_T_lean(const pw_system *s, const pw_thermo_kernel *k, double P_Pa,
                                  double x1, double T_guess_K, pw_bubble_lean *out);

/* pw_bubble_P with the lean evaluation. */
pw_status pw_thermo_bubble_P_lean(const pw_system *s, const pw_thermo_kernel *k, double T_K,
                                  double x1, pw_bubble_lean *out);

#endif
