/* What to draw, part 1: the model's curves at the data's condition and at a column pressure, the
 * azeotropes on them, the three-phase line and the binodal, the saturated enthalpies. See
 * include/pinchwise/drawing.h. */
#include <pinchwise/curve.h>
#include <pinchwise/drawing.h>
#include <pinchwise/enthalpy.h>

#include <math.h>
#include <string.h>

static const double PI = 3.14159265358979323846;

double pw_draw_grid_x(size_t k)
{
    if (k == 0)
        return 0.0;
    if (k >= PW_DRAW_GRID - 1)
        return 1.0;
    return 0.5 * (1.0 - cos(PI * (double)k / (double)(PW_DRAW_GRID - 1)));
}

static bool fixed_ok(double v)
{
    return isfinite(v) && v > 0.0;
}

/* The azeotropes at one condition (drawing.h): the module's search, then the heterogeneous
 * correction for a model that can split. */
static void azeotropes(const pw_system *s, bool isothermal, double fixed, const pw_az_result *known,
                       const pw_three_phase *known_tp, pw_draw_azeotropes *a)
{
    memset(a, 0, sizeof *a);
    a->three_phase.exists = false;
    pw_az_mode mode = isothermal ? PW_AZ_ISOTHERMAL : PW_AZ_ISOBARIC;
    if (known) { /* pw_azeotrope_search's: already checked against the two-liquid region */
        a->status = PW_OK;
        a->found = *known;
        a->three_phase = *known_tp;
    } else { /* the azeotrope command's search (no three-phase state for a model that cannot
              * split) */
        pw_three_phase tp;
        bool het_failed;
        a->status = pw_azeotrope_search(s, mode, fixed, &a->found, &tp, NULL, &het_failed);
        if (a->status == PW_OK)
            a->three_phase = tp;
        else if (het_failed) /* the one-liquid roots without the two-liquid region */
            a->status = PW_OK;
    }
    if (a->status != PW_OK)
        return;
    for (size_t i = 0; i < a->found.n && a->n < PW_DRAW_MAX_AZ; i++) {
        const pw_azeotrope *z = &a->found.az[i];
        a->az[a->n++] = (pw_draw_az){z->x1, z->T_K, z->P_Pa, z->kind == PW_AZ_MINIMUM_BOILING,
                                     z->tangential, false};
    }
    const pw_three_phase *tp = &a->three_phase;
    if (tp->exists && tp->heterogeneous_azeotrope && a->n < PW_DRAW_MAX_AZ)
        a->az[a->n++] = (pw_draw_az){tp->y1, tp->T_K, tp->P_Pa, true, false, true};
}

/* The binodal below the three-phase temperature (isobaric diagrams): PW_DRAW_BINODAL
 * temperatures from T3 down by 30 K or to 20 K above absolute zero's neighbourhood. */
static void binodal(const pw_system *s, pw_draw_phase *o)
{
    const pw_three_phase *tp = &o->az.three_phase;
    o->n_binodal = 0;
    if (o->isothermal || !tp->exists)
        return;
    double T_lo = fmax(tp->T_K - 30.0, 0.5 * tp->T_K);
    for (size_t i = 0; i < PW_DRAW_BINODAL; i++) {
        double T = tp->T_K - (tp->T_K - T_lo) * (double)i / (double)(PW_DRAW_BINODAL - 1);
        pw_lle_result r;
        o->bin_T[i] = T;
        o->bin_x[0][i] = o->bin_x[1][i] = NAN;
        if (i == 0) { /* the three-phase layers themselves, so the two drawings meet */
            o->bin_x[0][i] = tp->x[0];
            o->bin_x[1][i] = tp->x[1];
        } else if (pw_lle_solve(s, T, &r) == PW_OK && r.split) {
            o->bin_x[0][i] = r.x[0];
            o->bin_x[1][i] = r.x[1];
        } else {
            o->n_failed++;
        }
    }
    o->n_binodal = PW_DRAW_BINODAL;
}

/* A dew point whose liquid would split into two layers is no stable state (the vapor condenses
 * to a layer at another temperature): left out of the drawn dew curve. Checked by the LLE at the
 * dew temperature only for liquids between the three-phase layers. */
static bool dew_unstable(const pw_system *s, const pw_three_phase *tp, const pw_eq_point *e)
{
    if (!tp->exists || !(e->x1 > tp->x[0] && e->x1 < tp->x[1]))
        return false;
    pw_lle_result r;
    return pw_lle_solve(s, e->T_K, &r) == PW_OK && r.split && e->x1 > r.x[0] && e->x1 < r.x[1];
}

/* A start for the dew point of vapor y: the liquid and temperature interpolated on the tabulated
 * bubble curve where its y brackets y - only when exactly one cell of one liquid does (else NAN:
 * the dew solver's own start, so that no other root is chosen than without the table). */
static void dew_seed(const pw_draw_phase *o, const pw_three_phase *tp, double y, double *xg,
                     double *Tg)
{
    *xg = *Tg = NAN;
    size_t found = 0;
    for (size_t j = 0; j + 1 < PW_DRAW_GRID; j++) {
        double y0 = o->bub_y[j], y1 = o->bub_y[j + 1];
        if (!isfinite(y0) || !isfinite(y1) || y0 == y1 || !((y0 - y) * (y1 - y) <= 0.0))
            continue;
        if (tp->exists && o->x[j + 1] > tp->x[0] && o->x[j] < tp->x[1])
            continue; /* flat: the three-phase line, not a one-liquid bubble curve */
        if (++found > 1) {
            *xg = *Tg = NAN;
            return;
        }
        double t = (y - y0) / (y1 - y0);
        *xg = o->x[j] + t * (o->x[j + 1] - o->x[j]);
        *Tg = o->bub_T[j] + t * (o->bub_T[j + 1] - o->bub_T[j]);
    }
}

pw_status pw_draw_phase_compute(const pw_system *s, bool isothermal, double fixed,
                                pw_draw_phase *o)
{
    return pw_draw_phase_compute_known(s, isothermal, fixed, NULL, NULL, o);
}

pw_status pw_draw_phase_compute_known(const pw_system *s, bool isothermal, double fixed,
                                      const pw_az_result *known, const pw_three_phase *known_tp,
                                      pw_draw_phase *o)
{
    if (!s || !s->model || !o || !fixed_ok(fixed) || (!known != !known_tp))
        return PW_EINVAL;
    memset(o, 0, sizeof *o);
    o->isothermal = isothermal;
    o->fixed = fixed;
    azeotropes(s, isothermal, fixed, known, known_tp, &o->az);
    /* an overall liquid inside the two-liquid region boils at the three-phase condition: the
     * bubble curve is flat there (docs/heterogeneous.md) */
    const pw_three_phase *tp = &o->az.three_phase;
    if (o->az.status != PW_OK && pw_model_can_split(s->model)) {
        pw_three_phase t3;
        pw_status st = isothermal ? pw_three_phase_at_T(s, fixed, &t3)
                                  : pw_three_phase_at_P(s, fixed, &t3);
        if (st == PW_OK && t3.exists)
            o->az.three_phase = t3;
    }
    double T_prev = NAN; /* each bubble Newton starts at the previous point's temperature */
    for (size_t i = 0; i < PW_DRAW_GRID; i++) {
        double x = pw_draw_grid_x(i);
        o->x[i] = x;
        o->bub_T[i] = o->bub_P[i] = o->bub_y[i] = NAN;
        o->dew_T[i] = o->dew_P[i] = NAN;
        o->lngamma[0][i] = o->lngamma[1][i] = NAN;
        pw_eq_point e;
        if (tp->exists && x > tp->x[0] && x < tp->x[1]) {
            o->bub_T[i] = tp->T_K;
            o->bub_P[i] = tp->P_Pa;
            o->bub_y[i] = tp->y1;
        } else if ((isothermal ? pw_bubble_P(s, fixed, x, &e)
                               : pw_bubble_T_from(s, fixed, x, T_prev, &e)) == PW_OK) {
            T_prev = e.T_K;
            o->bub_T[i] = e.T_K;
            o->bub_P[i] = e.P_Pa;
            o->bub_y[i] = e.y1;
        } else {
            o->n_failed++;
        }
        double T = isothermal ? fixed : o->bub_T[i];
        pw_activity act;
        if (isfinite(T) && pw_system_activity(s, x, T, &act) == PW_OK) {
            o->lngamma[0][i] = act.lngamma[0];
            o->lngamma[1][i] = act.lngamma[1];
        }
    }
    for (size_t i = 0; i < PW_DRAW_GRID; i++) {
        double xg, Tg;
        dew_seed(o, tp, o->x[i], &xg, &Tg);
        pw_eq_point e;
        if ((isothermal ? pw_dew_P_from(s, fixed, o->x[i], xg, &e)
                        : pw_dew_T_from(s, fixed, o->x[i], xg, Tg, &e)) == PW_OK) {
            if (!dew_unstable(s, tp, &e)) {
                o->dew_T[i] = e.T_K;
                o->dew_P[i] = e.P_Pa;
            }
        } else {
            o->n_failed++;
        }
    }
    binodal(s, o);
    return PW_OK;
}

pw_status pw_draw_xy_compute(const pw_system *s, double P_Pa, pw_draw_xy *o)
{
    if (!s || !s->model || !o || !fixed_ok(P_Pa))
        return PW_EINVAL;
    memset(o, 0, sizeof *o);
    o->P_Pa = P_Pa;
    pw_system_curve sc;
    pw_status st = pw_system_curve_init(&sc, s, P_Pa);
    if (st != PW_OK)
        return st;
    pw_curve curve = pw_system_curve_bind(&sc);
    azeotropes(s, false, P_Pa, NULL, NULL, &o->az);
    const pw_three_phase *tp = &o->az.three_phase;
    for (size_t i = 0; i < PW_DRAW_GRID; i++) {
        double x = pw_draw_grid_x(i), y;
        o->x[i] = x;
        o->y[i] = NAN;
        o->three_y[i] = tp->exists && x >= tp->x[0] && x <= tp->x[1] ? tp->y1 : (double)NAN;
        if (curve.y_of_x(curve.ctx, x, &y) == PW_OK && isfinite(y))
            o->y[i] = y;
        else
            o->n_failed++;
        o->stable_y[i] = tp->exists && x > tp->x[0] && x < tp->x[1] ? tp->y1 : o->y[i];
    }
    return PW_OK;
}

pw_status pw_draw_enthalpy_compute(const pw_system *s, double P_Pa, pw_draw_enthalpy *o,
                                   pw_error *err)
{
    if (!s || !s->model || !o || !fixed_ok(P_Pa))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "enthalpy curves need a system and P > 0");
    pw_heat_data heat;
    pw_status st = pw_heat_data_from_system(s, &heat, err);
    if (st != PW_OK)
        return st;
    for (size_t i = 0; i < PW_DRAW_GRID; i++) {
        o->x[i] = pw_draw_grid_x(i);
        if (pw_enthalpy_sat_liquid(s, &heat, P_Pa, o->x[i], &o->h_liquid[i], NULL) != PW_OK)
            o->h_liquid[i] = NAN;
        if (pw_enthalpy_sat_vapor(s, &heat, P_Pa, o->x[i], &o->h_vapor[i], NULL) != PW_OK)
            o->h_vapor[i] = NAN;
    }
    return PW_OK;
}

pw_status pw_draw_curve_window(const pw_system *s, double P_Pa, double x_lo, double x_hi,
                               size_t n, double *x, double *y)
{
    if (!s || !s->model || !x || !y || n < 2 || !fixed_ok(P_Pa) || !(x_lo >= 0.0) ||
        !(x_hi <= 1.0) || !(x_lo < x_hi))
        return PW_EINVAL;
    for (size_t j = 0; j < n; j++) {
        pw_eq_point e;
        x[j] = x_lo + (x_hi - x_lo) * (double)j / (double)(n - 1);
        y[j] = pw_bubble_T(s, P_Pa, x[j], &e) == PW_OK ? e.y1 : (double)NAN;
    }
    return PW_OK;
}
