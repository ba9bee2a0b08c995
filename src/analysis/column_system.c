/* The single column for a fitted system at a pressure: the one place where every command that
 * solves the single-liquid column (reflux, screen, report, study, the uncertainty draws) learns
 * that it does not apply. The column module steps on y*(x), the vapor of a bubble point of ONE
 * liquid; inside the two-liquid region at the column pressure that liquid is metastable (it would
 * split into the layers x_I, x_II, which boil together at the three-phase temperature), its
 * bubble temperature lies below the three-phase temperature and its y*(x) is not the column's.
 * So a split whose liquids, between the products, reach into the open interval (x_I, x_II) is
 * refused with a reason naming the layers and the decanter scheme, before any stepping. See
 * docs/heterogeneous.md ("The single column and the two-liquid region"). A model that cannot
 * split (Wilson's equation) sees no layers at all: there the two liquids the fitted data show
 * (s->measured, their three-phase points) stand in for them, and targets that overlap that range
 * are refused the same way ("Two liquids the model cannot represent"). */
#include <pinchwise/column_direction.h>
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>
#include <pinchwise/units.h>

#include <math.h>
#include <stdio.h>
#include <string.h>

/* A refused single column: nothing computed, reason given. */
static void refuse(pw_column_result *out, const char *why)
{
    memset(out, 0, sizeof *out);
    out->x_q = out->y_q = out->r_min = out->s_min = out->r_feed = NAN;
    out->pinch.x = out->pinch.y = NAN;
    out->n_min = out->n_fenske = out->alpha_top = out->alpha_bottom = NAN;
    out->feasible = false;
    snprintf(out->reason, sizeof out->reason, "%s", why);
}

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
        /* the decanter scheme needs a heterogeneous azeotrope; beside a heterogeneous
         * non-azeotrope (vapor outside the layers) it does not apply either */
        if (tp->heterogeneous_azeotrope)
            snprintf(reason, len,
                     "the liquids between the products (x1 %.4g to %.4g) reach into the two-liquid "
                     "region at this pressure (layers x1 = %.4f and %.4f, boiling together at "
                     "%.2f K): a single-liquid column does not apply there; decant the two layers "
                     "(decanter scheme: pinchwise decanter)",
                     lo, hi, tp->x[0], tp->x[1], tp->T_K);
        else
            snprintf(reason, len,
                     "the products (x1 %.4g to %.4g) reach into the two-liquid region (layers "
                     "x1 = %.4f and %.4f at %.2f K; vapor x1 = %.4f lies outside them, so no "
                     "decanter scheme): trays there hold two liquids, which this single-liquid "
                     "column does not model; keep the products outside the layers",
                     lo, hi, tp->x[0], tp->x[1], tp->T_K, tp->y1);
    }
    return PW_OK;
}

bool pw_system_split_unmodelled(const pw_system *s)
{
    return s && s->model && s->measured.n > 0 && !pw_model_can_split(s->model);
}

bool pw_measured_split_overlaps(const pw_measured_split *m, double x_a, double x_b)
{
    return m && m->n > 0 && fmin(x_a, x_b) <= m->x_hi && fmax(x_a, x_b) >= m->x_lo;
}

pw_status pw_column_measured_split_block(const pw_system *s, double x_a, double x_b,
                                         bool *blocked, char *reason, size_t len)
{
    if (!s || !blocked || !reason || len == 0)
        return PW_EINVAL;
    *blocked = false;
    reason[0] = '\0';
    if (!pw_system_split_unmodelled(s) || !pw_measured_split_overlaps(&s->measured, x_a, x_b))
        return PW_OK;
    /* the models that can split, from the model table */
    char names[96] = "";
    size_t n_all, used = 0;
    const pw_model_type *const *all = pw_model_all(&n_all);
    size_t n_can = 0, k_can = 0;
    for (size_t k = 0; k < n_all; k++)
        n_can += pw_model_can_split(all[k]);
    for (size_t k = 0; k < n_all && used < sizeof names; k++)
        if (pw_model_can_split(all[k])) {
            k_can++;
            used += (size_t)snprintf(names + used, sizeof names - used, "%s%s",
                                     k_can == 1 ? "" : k_can == n_can ? " or " : ", ",
                                     all[k]->name);
        }
    *blocked = true;
    const pw_measured_split *m = &s->measured;
    snprintf(reason, len,
             "the data show two liquids between x1 = %.4g and %.4g (at " PW_TEXT_T(".2f") ", "
             PW_TEXT_P(".6g") ") that the %s model cannot represent: a one-liquid column is not "
             "valid there; refit with %s (fit --lle) and use the decanter scheme (pinchwise "
             "decanter)",
             m->x_lo, m->x_hi, m->T_K, m->P_Pa, s->model->name, names);
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
    bool unmodelled = false;
    char why_data[PW_REASON_MAX];
    if (pw_column_direction_of(spec) != PW_DIRECTION_NONE) {
        st = pw_column_measured_split_block(s, spec->xb, spec->xd, &unmodelled, why_data,
                                            sizeof why_data);
        if (st != PW_OK)
            return st;
    }
    if (unmodelled) {
        if (tp_out)
            *tp_out = tp;
        refuse(out, why_data);
        out->measured_split = true;
        return PW_OK;
    }
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
            refuse(out, why);
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
