/* Equilibrium curves for the column module built from a fitted binary system.
 *
 * pw_system_curve holds a copy of a pw_system and a fixed pressure; pw_system_curve_bind turns it
 * into a pw_curve whose y*(x) is the vapour of the bubble point at that pressure (pw_bubble_T,
 * modified Raoult's law with the system's activity model). The pw_curve borrows the
 * pw_system_curve: keep it alive (and do not move it) while the curve is used. Nothing is
 * allocated; nothing needs freeing. Not thread-safe per object (it counts evaluations); use one
 * pw_system_curve per thread. */
#ifndef PINCHWISE_CURVE_H
#define PINCHWISE_CURVE_H

#include <pinchwise/column.h>
#include <pinchwise/equilibrium.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef struct pw_system_curve {
    pw_system sys;          /* a copy: later changes to the caller's system do not reach it */
    double P_Pa;            /* fixed pressure, Pa */
    unsigned long n_eval;   /* bubble-point solves so far */
    pw_status last_status;  /* status of the most recent solve */
    double last_x, last_T_K; /* the most recent bubble point, to start the next one from */
} pw_system_curve;

/* Fills sc for system sys at pressure P_Pa. PW_EINVAL for NULL arguments, a system without a
 * model, or P_Pa not finite and positive. */
pw_status pw_system_curve_init(pw_system_curve *sc, const pw_system *sys, double P_Pa);

/* The column callback: y* at liquid x (mole fraction of component 1) by pw_bubble_T; forwards
 * pw_bubble_T's status (PW_EDOM for x outside [0,1]). ctx is a pw_system_curve. */
pw_status pw_system_curve_y(void *ctx, double x, double *y);

/* y* and its slope dy* / dx at x (pw_bubble_T_slope_from; the same y as pw_system_curve_y, to
 * the bit): a pw_curve_dy_fn. PW_EINVAL for a system with the virial vapor, whose slope is not
 * exact (the column then works without slopes). */
pw_status pw_system_curve_y_dy(void *ctx, double x, double *y, double *dydx);

/* The slope function for sc: pw_system_curve_y_dy, or NULL where it does not apply (virial vapor). */
pw_curve_dy_fn pw_system_curve_dy(const pw_system_curve *sc);

/* A pw_curve that evaluates sc (borrowed, see above). */
pw_curve pw_system_curve_bind(pw_system_curve *sc);

#ifdef __cplusplus
}
#endif
#endif
