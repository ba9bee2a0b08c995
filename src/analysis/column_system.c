/* The single column for a fitted system at a pressure: the one place where every command that
 * solves the single-liquid column (reflux, screen, report, study, the uncertainty draws) learns
 * that it does not apply. The column module steps on y*(x), the vapor of a bubble point of ONE
 * liquid; inside the two-liquid region at the column pressure that liquid is metastable (it would
 * split into the layers x_I, x_II, which boil together at the three-phase temperature), its
 * bubble temperature lies below the three-phase temperature and its y*(x) is not the column's.
 * So a split whose liquids, between the products, reach into the open interval (x_I, x_II) is
 * refused with a reason naming the layers and the decanter scheme, before any stepping. See
 * docs/heterogeneous.md ("The single column and the two-liquid region"). */
#include <pinchwise/column_direction.h>
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>

#include <math.h>
#include <stdio.h>
#include <string.h>

pw_status pw_column_two_liquid_block(const pw_system *s, double P_Pa, double x_a, double x_b,
                                     pw_three_phase *tp, bool *blocked, char *reason, size_t len)
{
    if (!s || !tp || !blocked || !reason || len == 0)
        return PW_EINVAL;
    /* a heterogeneous azeotrope between the targets: its own, more specific reason */
    pw_status st = pw_column_hetero_block(s, P_Pa, x_a, x_b, tp, blocked, reason, len);
    if (st != PW_OK || *blocked || !tp->exists)
        return st;
    const double lo = fmin(x_a, x_b), hi = fmax(x_a, x_b);
    if (lo < tp->x[1] && hi > tp->x[0]) {
        *blocked = true;
        snprintf(reason, len,
                 "the liquids between the products (x1 %.4g to %.4g) reach into the two-liquid "
                 "region at this pressure (layers x1 = %.4f and %.4f, boiling together at "
                 "%.2f K): a single-liquid column does not apply there; decant the two layers "
                 "(decanter scheme: pinchwise decanter)",
                 lo, hi, tp->x[0], tp->x[1], tp->T_K);
    }
    return PW_OK;
}

pw_status pw_column_solve_system(const pw_system *s, double P_Pa, const pw_column_spec *spec,
                                 const pw_column_options *opt, pw_column_result *out,
                                 pw_three_phase *tp_out, bool *hetero_az)
{
    if (!s || !spec || !out)
        return PW_EINVAL;
    if (hetero_az)
        *hetero_az = false;
    pw_three_phase tp;
    memset(&tp, 0, sizeof tp);
    pw_status st;
    if (pw_model_can_split(s->model) && pw_column_direction_of(spec) != PW_DIRECTION_NONE) {
        bool blocked = false;
        char why[PW_REASON_MAX];
        st = pw_column_two_liquid_block(s, P_Pa, spec->xb, spec->xd, &tp, &blocked, why,
                                        sizeof why);
        if (tp_out)
            *tp_out = tp;
        if (st != PW_OK)
            return st;
        if (blocked) {
            memset(out, 0, sizeof *out);
            out->x_q = out->y_q = out->r_min = out->s_min = out->r_feed = NAN;
            out->pinch.x = out->pinch.y = NAN;
            out->n_min = out->n_fenske = out->alpha_top = out->alpha_bottom = NAN;
            out->feasible = false;
            memcpy(out->reason, why, sizeof why);
            if (hetero_az)
                *hetero_az = tp.heterogeneous_azeotrope && fmin(spec->xb, spec->xd) < tp.y1
                             && tp.y1 < fmax(spec->xb, spec->xd);
            return PW_OK;
        }
    } else if (tp_out) {
        *tp_out = tp;
    }
    pw_system_curve sc;
    st = pw_system_curve_init(&sc, s, P_Pa);
    if (st != PW_OK)
        return st;
    pw_curve curve = pw_system_curve_bind(&sc);
    return pw_column_solve_any_dy(&curve, pw_system_curve_dy(&sc), spec, opt, out);
}
