/* Private to the azeotrope and screen modules: the evaluation context shared by the search and
 * the scan. Not installed. */
#ifndef PW_AZ_INTERNAL_H
#define PW_AZ_INTERNAL_H

#include <pinchwise/azeotrope.h>

typedef struct pw_az_ctx {
    const pw_system *s;
    pw_az_mode mode;
    double fixed;
    pw_az_options opt;
    pw_status status;   /* first evaluation failure, kept because GSL callbacks return double */
    double fail_x1;
    double sign;        /* +1 or -1: which side of zero the minimiser works on */
    double T_lo_K, T_hi_K;
    size_t n_evals;
    double T_warm_K;    /* isobaric: the last bubble temperature, where the next Newton starts
                         * (0: none); the same roots, fewer steps (pw_bubble_T_from) */
} pw_az_ctx;

/* ln alpha12 at x1 through the context (counts evaluations, keeps the first failure). */
pw_status pw_az_ctx_eval(pw_az_ctx *c, double x1, double *f, pw_eq_point *eq);

/* Brent root of ln alpha12 on [a, b] (a sign change is required). */
pw_status pw_az_brent_root(pw_az_ctx *c, double a, double b, double *root);

/* ln alpha12 at the pure end x1 = end (0 or 1): infinite dilution of the other component, at
 * the pure component's boiling point (isobaric) or at the fixed T. T_K, P_Pa may be NULL. */
pw_status pw_az_end_ln_alpha(const pw_system *s, pw_az_mode mode, double fixed, int end,
                             double *ln_alpha, double *T_K, double *P_Pa);

/* Drops the roots of r whose liquid lies inside the two-liquid region at its own temperature,
 * adding their count to *n_removed (may be NULL). All or nothing: on a failure (of
 * pw_lle_solve) r and *n_removed are left as they were. */
pw_status pw_az_drop_inside(const pw_system *s, pw_az_result *r, size_t *n_removed);

/* Resets a result to "nothing found" (NAN for unknown numbers). */
void pw_az_result_clear(pw_az_result *out, pw_az_mode mode, double fixed);

#endif
