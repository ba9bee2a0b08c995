/* Private to the design-grade column (design rows, stage profiles, energy balance, rating):
 * equilibrium at a fixed pressure through a fitted system, with the inverse x*(y) solved to
 * round-off, and growable stage profiles. Not installed. */
#ifndef PW_ANALYSIS_DESIGN_INTERNAL_H
#define PW_ANALYSIS_DESIGN_INTERNAL_H

#include <pinchwise/design.h>

typedef struct pw_eqp {
    const pw_system *sys;
    double P_Pa;
    double T_last; /* the latest bubble temperature: Newton's next start */
    double x_last, y_last; /* the latest bubble point (NAN: none): the inverse's seed */
    double slope_last;     /* dy/dx of y*(x) where the latest fast inverse ended (NAN: none) */
    double x_end, curv_last; /* where it ended, and y*'' estimated from the last two ends' slopes */
    unsigned long n_bubble;
} pw_eqp;

pw_status pw_eqp_init(pw_eqp *e, const pw_system *sys, double P_Pa);
void pw_eqp_free(pw_eqp *e);

/* y*(x) and the bubble temperature. */
pw_status pw_eqp_bubble(pw_eqp *e, double x, double *y, double *T_K);

/* x*(y): the liquid in equilibrium with vapor y (y in [0,1]) and its temperature; the bubble
 * curve is increasing for a stable liquid, so the root is unique; solved to about 1e-15. */
pw_status pw_eqp_x_of_y(pw_eqp *e, double y, double *x, double *T_K);

/* Validates a rating specification (both balances); err says what is impossible. */
pw_status pw_rate_check_spec(const pw_rate_spec *s, pw_error *err);

/* Appends a stage to a profile (grows the array). PW_ENOMEM on failure. */
pw_status pw_profile_push(pw_profile *p, const pw_stage *s);

#endif
