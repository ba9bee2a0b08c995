/* Binodal scans, critical solution temperatures, three-phase (L-L-V) states and the bubble point
 * of a liquid inside the two-liquid region. See include/pinchwise/lle.h, docs/heterogeneous.md. */
#include <pinchwise/lle.h>

#include "thermo_internal.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <string.h>

#define T3_STEP_K 1.0
#define T3_BELOW_K 80.0
#define TPD_QUICK 1000

/* Sign test for the critical point: true when D < 0 somewhere (the model splits at T). */
static pw_status splits_at(const pw_system *s, double T, bool *split, double *x_min_D)
{
    pw_lle_result r;
    pw_status st = pw_lle_solve_n(s, T, TPD_QUICK, &r);
    /* min_D is set before any later failure of the pair search */
    if (!isfinite(r.min_D))
        return st == PW_OK ? PW_EDOM : st;
    *split = r.min_D < 0.0;
    *x_min_D = r.x_min_D;
    return PW_OK;
}

pw_status pw_lle_scan(const pw_system *s, double T_from, double T_to, size_t n,
                      pw_lle_scan_point *points, pw_lle_critical *crit, size_t *n_crit)
{
    if (!s || !s->model || !points || n < 2 || !n_crit)
        return PW_EINVAL;
    if (!(T_from > 0.0) || !(T_to > 0.0) || !isfinite(T_from) || !isfinite(T_to))
        return PW_EDOM;
    *n_crit = 0;
    for (size_t k = 0; k < n; k++) {
        double T = T_from + (T_to - T_from) * (double)k / (double)(n - 1);
        pw_lle_result r;
        pw_status st = pw_lle_solve(s, T, &r);
        /* a layer beyond the solubility floor: two liquids, one practically pure */
        bool beyond = st == PW_ERANGE;
        if (st != PW_OK && !beyond)
            return st;
        points[k].T_K = T;
        points[k].split = r.split || beyond;
        points[k].beyond_floor = beyond;
        points[k].x[0] = r.x[0];
        points[k].x[1] = r.x[1];
        points[k].x2[0] = r.x2[0];
        points[k].x2[1] = r.x2[1];
        if (k == 0 || points[k].split == points[k - 1].split || !crit
            || *n_crit >= PW_LLE_MAX_CRITICAL)
            continue;
        /* bisection on the sign of min D between the two temperatures */
        double a = points[k - 1].T_K, b = T, xc = NAN;
        bool sa = points[k - 1].split;
        for (int it = 0; it < 100 && fabs(b - a) > 1e-7; it++) {
            double m = 0.5 * (a + b), xm;
            bool sm;
            st = splits_at(s, m, &sm, &xm);
            if (st != PW_OK)
                return st;
            if (sm == sa)
                a = m;
            else
                b = m;
            xc = xm;
        }
        double Tc = 0.5 * (a + b);
        bool sm;
        double xm;
        if (splits_at(s, Tc, &sm, &xm) == PW_OK)
            xc = xm;
        /* split below and not above: an upper critical solution temperature */
        bool upper = (T_to > T_from) ? sa : !sa;
        crit[(*n_crit)++] = (pw_lle_critical){Tc, xc, upper};
    }
    return PW_OK;
}


static pw_status three_phase_T(const pw_system *s, double T_K, size_t tpd, pw_three_phase *out);

pw_status pw_three_phase_at_T(const pw_system *s, double T_K, pw_three_phase *out)
{
    return three_phase_T(s, T_K, 20000, out);
}

static pw_status three_phase_T(const pw_system *s, double T_K, size_t tpd, pw_three_phase *out)
{
    if (!s || !s->model || !out)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->T_K = T_K;
    out->P_Pa = out->y1 = NAN;
    out->x[0] = out->x[1] = NAN;
    pw_lle_result r;
    pw_status st = pw_lle_solve_n(s, T_K, tpd, &r);
    if (st == PW_ERANGE) { /* refused, but the pair is described: keep it for the caller */
        out->x[0] = r.x[0];
        out->x[1] = r.x[1];
        out->a[0] = r.a[0];
        out->a[1] = r.a[1];
    }
    if (st != PW_OK)
        return st;
    if (!r.split)
        return PW_OK;
    for (int i = 0; i < 2; i++) {
        st = pw_psat(&s->comp[i], T_K, &out->Psat_Pa[i], NULL);
        if (st != PW_OK)
            return st;
    }
    double p1 = r.a[0] * out->Psat_Pa[0], p2 = r.a[1] * out->Psat_Pa[1];
    out->exists = true;
    out->P_Pa = p1 + p2;
    out->y1 = p1 / out->P_Pa;
    out->x[0] = r.x[0];
    out->x[1] = r.x[1];
    out->a[0] = r.a[0];
    out->a[1] = r.a[1];
    out->heterogeneous_azeotrope = out->x[0] < out->y1 && out->y1 < out->x[1];
    return PW_OK;
}

/* f(T) = P3(T) - P where the model splits; *split false where it does not. */
static pw_status p3_minus(const pw_system *s, double P, double T, double *f, bool *split,
                          pw_three_phase *tp, bool prune)
{
    /* Where the split bound proves the liquid stable (src/thermo/split_bound.c) the liquid-
     * liquid solve is skipped; everywhere else it decides, so "no split" here is exactly
     * pw_lle_solve's answer (its graded grid down to the solubility floor and its scan beyond
     * it). A coarser stability scan used to stand in front of it; it looked neither near the
     * pure ends nor beyond the floor and, measured, saved nothing. */
    if (prune && pw_thermo_split_excluded(s, T, T)) {
        *split = false;
        *f = (double)NAN;
        memset(tp, 0, sizeof *tp);
        tp->T_K = T;
        tp->P_Pa = tp->y1 = tp->x[0] = tp->x[1] = (double)NAN;
        return PW_OK;
    }
    pw_status st = three_phase_T(s, T, TPD_QUICK, tp);
    if (st == PW_ERANGE) {
        /* a layer beyond the solubility floor: the split exists and its activities are
         * known (the refused pair is described; a_i = 1 if it could not be), enough to bracket
         * (the final state is solved exactly, or refused) */
        double p1, p2;
        if (pw_psat(&s->comp[0], T, &p1, NULL) != PW_OK || pw_psat(&s->comp[1], T, &p2, NULL) != PW_OK)
            return st;
        double a1 = isfinite(tp->a[0]) ? tp->a[0] : 1.0, a2 = isfinite(tp->a[1]) ? tp->a[1] : 1.0;
        *split = true;
        *f = a1 * p1 + a2 * p2 - P;
        return PW_OK;
    }
    if (st != PW_OK)
        return st;
    *split = tp->exists;
    *f = tp->exists ? tp->P_Pa - P : (double)NAN;
    return PW_OK;
}

#define BOUND_SAMPLES 15

/* An upper bound of the three-phase pressure a1 P1sat + a2 P2sat at T, should the liquid split
 * there. The common tangent of a stable split, u x + v (1 - x) with u = ln a1, v = ln a2, lies
 * below Gmix/RT everywhere: at the pure ends (u, v <= 0) and at the sample points x_k (each a
 * half-plane in (u, v)). The largest P1sat e^u + P2sat e^v over that polygon (a convex function:
 * its maximum over a polygon bounded above is at a vertex) bounds P3 from above, without solving
 * the split. Fewer constraints than the true ones only loosen the bound. INFINITY when the model
 * cannot be evaluated. */
static double p3_upper_bound(const pw_system *s, double T, double p1, double p2)
{
    /* constraint rows: a u + b v <= c */
    double a[BOUND_SAMPLES + 2], b[BOUND_SAMPLES + 2], c[BOUND_SAMPLES + 2];
    size_t m = 0;
    a[m] = 1.0, b[m] = 0.0, c[m++] = 0.0;
    a[m] = 0.0, b[m] = 1.0, c[m++] = 0.0;
    for (int k = 1; k <= BOUND_SAMPLES; k++) {
        double x = (double)k / (BOUND_SAMPLES + 1), g;
        if (pw_lle_gmix(s, T, x, &g, NULL) != PW_OK || !isfinite(g))
            return (double)INFINITY;
        a[m] = x, b[m] = 1.0 - x, c[m++] = g + 1e-8 * (1.0 + fabs(g)); /* rounding slack */
    }
    double best = -(double)INFINITY;
    for (size_t i = 0; i < m; i++)
        for (size_t j = i + 1; j < m; j++) {
            double det = a[i] * b[j] - a[j] * b[i];
            if (fabs(det) < 1e-12)
                continue;
            double u = (c[i] * b[j] - c[j] * b[i]) / det, v = (a[i] * c[j] - a[j] * c[i]) / det;
            bool ok = true;
            for (size_t k = 0; k < m && ok; k++)
                ok = a[k] * u + b[k] * v <= c[k] + 1e-12 * (1.0 + fabs(c[k]));
            if (ok)
                best = fmax(best, p1 * exp(u) + p2 * exp(v));
        }
    return best > -(double)INFINITY ? best : (double)INFINITY;
}

/* False when the three-phase pressure at grid point k is surely below P (see the scan). */
static bool grid_live(const pw_system *s, double P_Pa, double T_lo, double T_hi, size_t k)
{
    double T = fmin(T_lo + (double)k * T3_STEP_K, T_hi), p1, p2;
    if (pw_psat(&s->comp[0], T, &p1, NULL) != PW_OK || pw_psat(&s->comp[1], T, &p2, NULL) != PW_OK)
        return true; /* the scan itself reports it */
    if ((p1 + p2) * (1.0 + 1e-6) < P_Pa)
        return false; /* a_i <= 1 */
    return !(p3_upper_bound(s, T, p1, p2) * (1.0 + 1e-6) < P_Pa);
}

typedef struct near_ctx {
    const pw_system *s;
    double P;
    pw_status st;
    bool lost; /* the split vanished at a trial temperature */
    bool prune; /* p3_minus may use the split proof */
    bool floor; /* a trial temperature's split had a layer beyond PW_LLE_X_MIN (a1 = a2 = 1 may
                 * have stood in for its activities) */
} near_ctx;

static double near_fn(double T, void *p)
{
    near_ctx *c = p;
    pw_three_phase tp;
    double f;
    bool split;
    pw_status st = p3_minus(c->s, c->P, T, &f, &split, &tp, c->prune);
    c->floor = c->floor || (st == PW_OK && split && !tp.exists);
    if (st != PW_OK || !split) {
        if (st != PW_OK && c->st == PW_OK)
            c->st = st;
        c->lost = c->lost || !split;
        return GSL_NAN;
    }
    return f;
}

static pw_status scan_at_P(const pw_system *s, double P_Pa, pw_three_phase *out, bool prune);

pw_status pw_three_phase_at_P(const pw_system *s, double P_Pa, pw_three_phase *out)
{
    return scan_at_P(s, P_Pa, out, true);
}

pw_status pw_thermo_three_phase_at_P_full(const pw_system *s, double P_Pa, pw_three_phase *out)
{
    return scan_at_P(s, P_Pa, out, false);
}

/* GSL Brent on a bracket [a, b] of split temperatures with P3 - P changing sign (the split holds
 * at both ends and cannot vanish inside: PW_ENOCONV if it does), to a width of 1e-13 relative,
 * then the state at Brent's last estimate (inside the bracket). The tight width matters to the
 * fit, whose objective holds T3 (fit/objective_het.c): a looser T3 is noise in the residuals
 * that the Levenberg-Marquardt step test then stops on. */
static pw_status solve_bracket(const pw_system *s, double P_Pa, double a, double b, bool prune,
                               pw_three_phase *out)
{
    near_ctx c = {s, P_Pa, PW_OK, false, prune, false};
    gsl_root_fsolver *rs = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    if (!rs)
        return PW_ENOMEM;
    gsl_function F = {near_fn, &c};
    pw_status st = PW_OK;
    if (gsl_root_fsolver_set(rs, &F, a, b) != GSL_SUCCESS)
        st = PW_ENOCONV;
    double root = 0.5 * (a + b);
    for (int it = 0; st == PW_OK && it < 100 && b - a > 1e-13 * b; it++) {
        if (gsl_root_fsolver_iterate(rs) != GSL_SUCCESS)
            st = PW_ENOCONV;
        a = gsl_root_fsolver_x_lower(rs);
        b = gsl_root_fsolver_x_upper(rs);
        root = gsl_root_fsolver_root(rs);
    }
    if (!(root >= a && root <= b))
        root = 0.5 * (a + b);
    gsl_root_fsolver_free(rs);
    if (c.st != PW_OK)
        return c.st;
    if (c.lost || st != PW_OK)
        return PW_ENOCONV;
    st = pw_three_phase_at_T(s, root, out);
    if (st != PW_OK)
        return st;
    /* A bracket end refused beyond the solubility floor whose pair could not be described
     * enters with a1 = a2 = 1; a "root" at the edge of the refused range is then no three-phase
     * state: the true one lies in the refused range (PW_ERANGE). Without the floor, a "root"
     * that is none is a jump of P3(T): with two separate two-liquid regions the widest pair,
     * which the search follows, changes there (docs/heterogeneous.md section 2), and the
     * pressure lies inside the jump: no state of that pair, PW_ENOCONV. */
    if (!out->exists || !(fabs(out->P_Pa - P_Pa) <= 1e-6 * P_Pa))
        return c.floor || !out->exists ? PW_ERANGE : PW_ENOCONV;
    out->P_Pa = P_Pa; /* y1 from a1 P1sat / P3 equals it to the bisection tolerance */
    return PW_OK;
}

#define EDGE_TOL_K 1e-9

/* Where the split ends between T_in (splits, P3 - P = f_in) and T_out (does not split), either
 * order: bisection on "splits" down to EDGE_TOL_K. *T_edge is the split temperature nearest the
 * end found and *f_edge its P3 - P. */
static pw_status split_edge(const pw_system *s, double P_Pa, double T_in, double f_in,
                            double T_out, bool prune, double *T_edge, double *f_edge)
{
    double a = T_in, fa = f_in, b = T_out;
    while (fabs(b - a) > EDGE_TOL_K) {
        double m = 0.5 * (a + b), f;
        bool split;
        pw_three_phase tp;
        pw_status st = p3_minus(s, P_Pa, m, &f, &split, &tp, prune);
        if (st != PW_OK)
            return st;
        if (split) {
            a = m;
            fa = f;
        } else {
            b = m;
        }
    }
    *T_edge = a;
    *f_edge = fa;
    return PW_OK;
}

static pw_status scan_at_P(const pw_system *s, double P_Pa, pw_three_phase *out, bool prune)
{
    if (!s || !s->model || !out)
        return PW_EINVAL;
    if (!(P_Pa > 0.0) || !isfinite(P_Pa))
        return PW_EDOM;
    memset(out, 0, sizeof *out);
    out->P_Pa = P_Pa;
    out->T_K = out->y1 = NAN;
    out->x[0] = out->x[1] = NAN;
    double Tb[2];
    for (int i = 0; i < 2; i++) {
        pw_status st = pw_tsat(&s->comp[i], P_Pa, &Tb[i]);
        if (st != PW_OK)
            return st;
    }
    double T_lo = fmin(Tb[0], Tb[1]) - T3_BELOW_K, T_hi = fmax(Tb[0], Tb[1]);
    /* start where both vapor pressures can be evaluated */
    double dummy;
    while (T_lo < T_hi && (pw_psat(&s->comp[0], T_lo, &dummy, NULL) != PW_OK
                           || pw_psat(&s->comp[1], T_lo, &dummy, NULL) != PW_OK))
        T_lo += T3_STEP_K;
    size_t n = (size_t)ceil((T_hi - T_lo) / T3_STEP_K);
    /* Grid points that cannot matter are skipped: where P1sat + P2sat < P the three-phase
     * pressure a1 P1sat + a2 P2sat is below P (a_i <= 1 in a stable split: the common tangent
     * lies below Gmix/RT = 0 at both pure ends), so such a point neither ends the search nor
     * closes a bracket; it is needed only as the lower end of a bracket, when its successor can
     * reach P. The points left are those the scan would decide on, so the result is the same. */
    size_t k_first = prune ? n + 1 : 0;
    bool live_next = !prune || grid_live(s, P_Pa, T_lo, T_hi, 0);
    for (size_t k = 0; prune && k <= n && k_first > n; k++) {
        bool live = live_next;
        live_next = k < n && grid_live(s, P_Pa, T_lo, T_hi, k + 1);
        if (live || live_next)
            k_first = k;
    }
    /* No split anywhere from there up (a proof: src/thermo/split_bound.c): none in range. */
    if (prune && (k_first > n
                  || pw_thermo_split_excluded(s, fmin(T_lo + (double)k_first * T3_STEP_K, T_hi), T_hi))) {
        out->exists = false;
        return PW_OK;
    }
    double T_prev = NAN, f_prev = NAN;
    bool split_prev = false, evaluated_prev = false;
    pw_three_phase tp;
    live_next = !prune || grid_live(s, P_Pa, T_lo, T_hi, k_first);
    for (size_t k = k_first; k <= n; k++) {
        double T = fmin(T_lo + (double)k * T3_STEP_K, T_hi), f;
        bool split;
        bool live = live_next;
        live_next = !prune || (k < n && grid_live(s, P_Pa, T_lo, T_hi, k + 1));
        if (!live && !live_next && !split_prev) {
            /* f < 0 here and at the next point: no bracket ends there (after a split point the
             * point is solved all the same: the split may end in between, see below) */
            evaluated_prev = false;
            continue;
        }
        pw_status st = p3_minus(s, P_Pa, T, &f, &split, &tp, prune);
        if (st != PW_OK)
            return st;
        if (split && split_prev && f_prev < 0.0 && f >= 0.0)
            return solve_bracket(s, P_Pa, T_prev, T, prune, out);
        if (split_prev && !split && f_prev < 0.0) { /* (split_prev: evaluated, never skipped) */
            /* the split ends between the grid points (an upper critical solution temperature):
             * the three-phase state lies between them when the split still boils at or above
             * P at its last temperature */
            double T_edge, f_edge;
            st = split_edge(s, P_Pa, T_prev, f_prev, T, prune, &T_edge, &f_edge);
            if (st != PW_OK)
                return st;
            if (f_edge >= 0.0)
                return solve_bracket(s, P_Pa, T_prev, T_edge, prune, out);
        }
        if (evaluated_prev && !split_prev && split && f >= 0.0) {
            /* the split begins between the grid points (a lower critical solution
             * temperature): below P at its first temperature, the state lies above it */
            double T_edge, f_edge;
            st = split_edge(s, P_Pa, T, f, T_prev, prune, &T_edge, &f_edge);
            if (st != PW_OK)
                return st;
            if (f_edge < 0.0)
                return solve_bracket(s, P_Pa, T_edge, T, prune, out);
        }
        if (split && f >= 0.0)
            break; /* the split already boils below the grid start: none in range */
        T_prev = T;
        f_prev = f;
        split_prev = split;
        evaluated_prev = true;
    }
    out->exists = false;
    return PW_OK;
}

pw_status pw_three_phase_at_P_near(const pw_system *s, double P_Pa, double T_guess_K,
                                   pw_three_phase *out)
{
    if (!s || !s->model || !out)
        return PW_EINVAL;
    if (!(P_Pa > 0.0) || !isfinite(P_Pa) || !(T_guess_K > 0.0) || !isfinite(T_guess_K))
        return PW_EDOM;
    near_ctx c = {s, P_Pa, PW_OK, false, true, false};
    double a = T_guess_K, fa = near_fn(a, &c);
    if (c.st != PW_OK)
        return c.st;
    if (c.lost)
        return pw_three_phase_at_P(s, P_Pa, out);
    double b = a, fb = fa;
    double dir = fa < 0.0 ? 1.0 : -1.0;
    bool found = fa == 0.0;
    for (double step = 1.0; !found && step <= 64.0; step *= 2.0) {
        b = a + dir * step;
        fb = near_fn(b, &c);
        if (c.st != PW_OK)
            return c.st;
        if (c.lost)
            return pw_three_phase_at_P(s, P_Pa, out);
        if ((fa < 0.0) != (fb < 0.0) || fb == 0.0) {
            found = true;
            break;
        }
        a = b;
        fa = fb;
    }
    if (!found)
        return pw_three_phase_at_P(s, P_Pa, out);
    double T = fa == 0.0 ? a : b;
    if (fa != 0.0 && fb != 0.0) {
        gsl_root_fsolver *rs = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
        if (!rs)
            return PW_ENOMEM;
        gsl_function F = {near_fn, &c};
        gsl_root_fsolver_set(rs, &F, fmin(a, b), fmax(a, b));
        pw_status st = PW_EMAXITER;
        for (int it = 0; it < 100; it++) {
            if (gsl_root_fsolver_iterate(rs) != GSL_SUCCESS || c.st != PW_OK || c.lost) {
                st = c.st != PW_OK ? c.st : PW_ENOCONV;
                break;
            }
            if (gsl_root_test_interval(gsl_root_fsolver_x_lower(rs), gsl_root_fsolver_x_upper(rs),
                                       0.0, 1e-14) == GSL_SUCCESS) {
                st = PW_OK;
                break;
            }
        }
        T = gsl_root_fsolver_root(rs);
        gsl_root_fsolver_free(rs);
        if (c.lost)
            return pw_three_phase_at_P(s, P_Pa, out);
        if (st != PW_OK)
            return st;
    }
    pw_status st = three_phase_T(s, T, TPD_QUICK, out);
    if (st == PW_OK && (!out->exists || !(fabs(out->P_Pa - P_Pa) <= 1e-6 * P_Pa)))
        return PW_ERANGE; /* at the edge of a range refused beyond the floor (as above) */
    if (st == PW_OK)
        out->P_Pa = P_Pa;
    return st;
}

pw_status pw_bubble_T_het(const pw_system *s, double P_Pa, double x1, pw_eq_point *out,
                          bool *three_phase)
{
    if (!s || !out || !three_phase)
        return PW_EINVAL;
    *three_phase = false;
    pw_three_phase tp;
    pw_status st = pw_three_phase_at_P(s, P_Pa, &tp);
    if (st != PW_OK)
        return st;
    if (tp.exists && x1 > tp.x[0] && x1 < tp.x[1]) {
        memset(out, 0, sizeof *out);
        out->x1 = x1;
        out->y1 = tp.y1;
        out->T_K = tp.T_K;
        out->P_Pa = P_Pa;
        for (int i = 0; i < 2; i++) {
            out->Psat_Pa[i] = tp.Psat_Pa[i];
            out->gamma[i] = tp.a[i] / (i == 0 ? x1 : 1.0 - x1); /* apparent, of the overall liquid */
        }
        *three_phase = true;
        return PW_OK;
    }
    return pw_bubble_T(s, P_Pa, x1, out);
}

pw_status pw_bubble_P_het(const pw_system *s, double T_K, double x1, pw_eq_point *out,
                          bool *three_phase)
{
    if (!s || !out || !three_phase)
        return PW_EINVAL;
    *three_phase = false;
    pw_three_phase tp;
    pw_status st = pw_three_phase_at_T(s, T_K, &tp);
    if (st != PW_OK)
        return st;
    if (tp.exists && x1 > tp.x[0] && x1 < tp.x[1]) {
        memset(out, 0, sizeof *out);
        out->x1 = x1;
        out->y1 = tp.y1;
        out->T_K = T_K;
        out->P_Pa = tp.P_Pa;
        for (int i = 0; i < 2; i++) {
            out->Psat_Pa[i] = tp.Psat_Pa[i];
            out->gamma[i] = tp.a[i] / (i == 0 ? x1 : 1.0 - x1);
        }
        *three_phase = true;
        return PW_OK;
    }
    return pw_bubble_P(s, T_K, x1, out);
}
