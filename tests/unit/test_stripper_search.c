/* The stripping column's minimum boil-up (pw_stripper_solve, src/analysis/decanter.c), found by the
 * single column's proved section search (docs/column.md section 3, docs/heterogeneous.md 5),
 * against an independent computation written here:
 *
 *  - dense: S_min = max over x in (xB, x_top] of (x - xB)/(y*(x) - x) on 200,001 equally spaced
 *    points (20,001 for the fitted model's curve), every local maximum of that table refined by a
 *    golden-section search written here (no GSL), the top included; infeasible when y* - x has the
 *    wrong sign anywhere on the table;
 *  - seeded random specifications on closed-form curves: smooth ones, tangent pinches (an
 *    interior near-touch of the curve and the operating line), bottoms and tops right beside a
 *    homogeneous azeotrope (and across one: refused), both column orientations (bottoms rich or
 *    lean in component 1);
 *  - the NRTL 1-butanol/water curve (METHODS2 4.5's parameters, not a published set) with tops on
 *    the decanter layers and bottoms from 1e-7 to 0.2 beside them, for the parameters of 4.5 and
 *    for random perturbations of them that still give a heterogeneous azeotrope;
 *  - identities for every case: the ratio at the reported pinch equals S_min; stepping reaches the
 *    bottoms at S_min (1 + 1e-6) and does not at S_min (1 - 1e-4); the answer is the same for
 *    coarse tables of 16 to 5,000 points (the table only seeds the search). */
#include "pw_test.h"

#include <float.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>
#include <pinchwise/lle.h>
#include <stdlib.h>
#include <string.h>

/* ---- closed-form curves ---- */

/* y = x + x (1 - x) (a (x - m)^2 + b) [+ a Gaussian dip of depth d, width w at m2]: above the
 * diagonal on (0, 1) while the bracket stays positive; small b or a deep dip gives a tangent
 * pinch. flip: the mirror image 1 - f(1 - x) (a column whose bottoms is rich in 1). */
typedef struct bump {
    double a, m, b, d, m2, w;
    bool flip;
} bump;

static double bump_raw(const bump *c, double x)
{
    double g = c->a * (x - c->m) * (x - c->m) + c->b;
    if (c->d > 0.0)
        g -= c->d * exp(-((x - c->m2) / c->w) * ((x - c->m2) / c->w));
    return x + x * (1.0 - x) * g;
}

static pw_status bump_y(void *ctx, double x, double *y)
{
    const bump *c = ctx;
    *y = c->flip ? 1.0 - bump_raw(c, 1.0 - x) : bump_raw(c, x);
    return PW_OK;
}

/* A homogeneous azeotrope at x = az: y = x + k x (1 - x)(x - az) (y > x above az, y < x below). */
typedef struct azc {
    double k, az;
} azc;

static pw_status az_y(void *ctx, double x, double *y)
{
    const azc *c = ctx;
    *y = x + c->k * x * (1.0 - x) * (x - c->az);
    return PW_OK;
}

/* A valid equilibrium curve on [0, 1]: 0 <= y <= 1 and rising (a binary at fixed pressure where
 * one liquid is stable), checked on 10,001 points; random curves failing it are drawn again. */
static bool valid_curve(const pw_curve *c)
{
    double prev = -1.0;
    for (int k = 0; k <= 10000; k++) {
        double y;
        if (c->y_of_x(c->ctx, k / 10000.0, &y) != PW_OK || !(y >= 0.0 && y <= 1.0) || !(y > prev))
            return false;
        prev = y;
    }
    return true;
}

/* ---- the independent computation ---- */

static double ratio(const pw_curve *c, double xB, double x, bool *bad)
{
    double y;
    if (c->y_of_x(c->ctx, x, &y) != PW_OK || !isfinite(y)) {
        *bad = true;
        return NAN;
    }
    double d = (y - x) * (xB > x ? -1.0 : 1.0); /* > 0: the vapor leans away from the bottoms */
    if (!(d > 0.0))
        *bad = true;
    return (x - xB) / (y - x);
}

/* Golden-section maximum of the ratio on [a, b] (written here; not GSL). */
static double golden(const pw_curve *c, double xB, double a, double b, double *x_at, bool *bad)
{
    const double g = 0.5 * (sqrt(5.0) - 1.0);
    double x1 = b - g * (b - a), x2 = a + g * (b - a);
    double f1 = ratio(c, xB, x1, bad), f2 = ratio(c, xB, x2, bad);
    for (int it = 0; it < 200 && fabs(b - a) > 1e-15 * fmax(1.0, fabs(a)); it++) {
        if (f1 < f2) {
            a = x1;
            x1 = x2;
            f1 = f2;
            x2 = a + g * (b - a);
            f2 = ratio(c, xB, x2, bad);
        } else {
            b = x2;
            x2 = x1;
            f2 = f1;
            x1 = b - g * (b - a);
            f1 = ratio(c, xB, x1, bad);
        }
    }
    *x_at = f1 > f2 ? x1 : x2;
    return fmax(f1, f2);
}

/* Dense maximum of (x - xB)/(y* - x) over (xB, x_top]; *feasible false when y* - x has the wrong
 * sign at a table point. */
static double dense_max(const pw_curve *c, double x_top, double xB, int n, bool *feasible,
                        double *x_at)
{
    double *r = malloc((size_t)(n + 1) * sizeof *r);
    assert_non_null(r);
    bool bad = false;
    r[0] = 0.0;
    for (int k = 1; k <= n; k++)
        r[k] = ratio(c, xB, k == n ? x_top : xB + (x_top - xB) * k / (double)n, &bad);
    *feasible = !bad;
    double best = r[n];
    *x_at = x_top;
    for (int k = 1; k <= n && !bad; k++) {
        bool peak = r[k] >= r[k - 1] && (k == n || r[k] >= r[k + 1]);
        if (!peak)
            continue;
        double lo = xB + (x_top - xB) * (k - 1) / (double)n;
        double hi = k == n ? x_top : xB + (x_top - xB) * (k + 1) / (double)n;
        double xa, v = golden(c, xB, fmin(lo, hi), fmax(lo, hi), &xa, &bad);
        if (v > best) {
            best = v;
            *x_at = xa;
        }
        if (r[k] > best) {
            best = r[k];
            *x_at = xB + (x_top - xB) * k / (double)n;
        }
    }
    free(r);
    return best;
}

/* Checks one specification against the dense computation and the identities. Returns whether
 * the pinch was tangent (for counting). */
static bool check_spec(const pw_curve *c, const pw_stripper_spec *sp, int n_dense, const char *what,
                       int t)
{
    pw_column_options o = pw_column_default_options();
    o.n_factors = 0;
    o.max_stages = 2000000;
    pw_stripper_result r;
    pw_status st = pw_stripper_solve(c, sp, &o, &r);
    if (st != PW_OK)
        fail_msg("%s %d: status %d (top %.9g, bottoms %.9g)", what, t, (int)st, sp->x_top,
                 sp->x_bottom);
    bool dense_ok;
    double x_at, want = dense_max(c, sp->x_top, sp->x_bottom, n_dense, &dense_ok, &x_at);
    if (!dense_ok) {
        if (r.feasible)
            fail_msg("%s %d: the dense table sees y* - x of the wrong sign, the search says "
                     "feasible (S_min %.12g)",
                     what, t, r.boilup_min);
        assert_non_null(strstr(r.reason, "y = x"));
        return false;
    }
    if (!r.feasible)
        fail_msg("%s %d: refused (%s); dense S_min %.12g", what, t, r.reason, want);
    /* cannot miss: not below any attained value; not above the refined dense maximum. Beyond
     * 1e-9 the comparison allows for rounding: a curve value carries ~DBL_EPSILON, which is a
     * relative error of DBL_EPSILON/(y* - x) in the ratio (large when the pinch lies right beside
     * an azeotrope). */
    double yw;
    assert_int_equal(c->y_of_x(c->ctx, x_at, &yw), PW_OK);
    double cond = 8.0 * DBL_EPSILON / fabs(yw - x_at);
    if (r.boilup_min < want * (1.0 - 1e-9 - cond) || r.boilup_min > want * (1.0 + 1e-8 + cond))
        fail_msg("%s %d: S_min %.15g, dense %.15g (top %.9g, bottoms %.9g, pinch at %.9g)", what,
                 t, r.boilup_min, want, sp->x_top, sp->x_bottom, x_at);
    /* the ratio at the reported pinch is S_min */
    double rp = (r.x_pinch - sp->x_bottom) / (r.y_pinch - r.x_pinch);
    if (fabs(rp - r.boilup_min) > (1e-8 + cond) * r.boilup_min)
        fail_msg("%s %d: ratio at the pinch %.15g, S_min %.15g", what, t, rp, r.boilup_min);
    if (!r.tangent && r.x_pinch != sp->x_top)
        fail_msg("%s %d: a top pinch away from the top", what, t);
    /* stepping: reaches at S_min (1 + 1e-6), not at S_min (1 - 1e-4) */
    double n;
    st = pw_stripper_stages(c, sp, r.boilup_min * (1.0 + 1e-6), o.max_stages, &n);
    if (st != PW_OK)
        fail_msg("%s %d: stepping at S_min (1 + 1e-6) gave status %d", what, t, (int)st);
    st = pw_stripper_stages(c, sp, r.boilup_min * (1.0 - 1e-4), o.max_stages, &n);
    if (st != PW_EINFEASIBLE && st != PW_EMAXITER)
        fail_msg("%s %d: stepping at S_min (1 - 1e-4) gave status %d (%g stages)", what, t,
                 (int)st, n);
    return r.tangent;
}

static void random_closed_forms(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 1414UL);
    int tangent = 0, top = 0;
    int redrawn = 0;
    for (int t = 0; t < 240; t++) {
        bump b;
        pw_curve c = {bump_y, &b};
        do {
            b = (bump){8.0 * gsl_rng_uniform(rng), 0.05 + 0.6 * gsl_rng_uniform(rng), 0.0, 0.0,
                       0.0, 1.0, t % 2 == 1};
            /* a third of the cases with b down to 1e-3: near-touching, tangent pinches */
            b.b = t % 3 == 0 ? pow(10.0, -3.0 + 2.0 * gsl_rng_uniform(rng))
                             : 0.005 + 0.5 * gsl_rng_uniform(rng);
            if (t % 5 == 0) { /* a dip 0.05 to 0.2 wide that nearly touches the diagonal */
                b.m2 = 0.1 + 0.6 * gsl_rng_uniform(rng);
                b.w = 0.05 + 0.15 * gsl_rng_uniform(rng);
                b.d = (b.a * (b.m2 - b.m) * (b.m2 - b.m) + b.b)
                      * (1.0 - pow(10.0, -1.0 - 2.0 * gsl_rng_uniform(rng)));
            }
        } while (!valid_curve(&c) && ++redrawn < 100000);
        double xt = 0.1 + 0.7 * gsl_rng_uniform(rng);
        double xb = xt * (t % 7 == 0 ? pow(10.0, -6.0 * gsl_rng_uniform(rng))
                                     : 0.8 * gsl_rng_uniform(rng));
        if (xb <= 0.0)
            xb = 1e-9;
        pw_stripper_spec sp = b.flip ? (pw_stripper_spec){1.0 - xt, 1.0 - xb}
                                     : (pw_stripper_spec){xt, xb};
        if (check_spec(&c, &sp, 200000, "closed form", t))
            tangent++;
        else
            top++;
    }
    /* the random set exercises both kinds of pinch */
    assert_true(tangent >= 40);
    assert_true(top >= 40);
    gsl_rng_free(rng);
}

static void beside_an_azeotrope(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 2718UL);
    int refused = 0;
    for (int t = 0; t < 90; t++) {
        azc a = {0.0, 0.2 + 0.5 * gsl_rng_uniform(rng)};
        /* k below 1/az and 1/(1 - az): y' > 0 at both ends, and y' is concave: a valid curve */
        a.k = (0.2 + 0.7 * gsl_rng_uniform(rng)) * fmin(1.0 / a.az, 1.0 / (1.0 - a.az));
        pw_curve c = {az_y, &a};
        assert_true(valid_curve(&c));
        double d = pow(10.0, -7.0 + 5.0 * gsl_rng_uniform(rng));
        pw_stripper_spec sp;
        switch (t % 3) {
        case 0: /* bottoms just above the azeotrope */
            sp.x_bottom = a.az + d;
            sp.x_top = sp.x_bottom + (0.95 - sp.x_bottom) * (0.05 + 0.95 * gsl_rng_uniform(rng));
            break;
        case 1: /* top just above the azeotrope: a top pinch with a large boil-up */
            sp.x_top = a.az + d;
            sp.x_bottom = a.az + d * gsl_rng_uniform(rng) * 0.999 + 1e-3 * d;
            break;
        default: /* the azeotrope between bottoms and top: refused */
            sp.x_bottom = a.az - d;
            sp.x_top = a.az + 0.3 * gsl_rng_uniform(rng) + 1e-3;
            break;
        }
        pw_stripper_result r;
        if (t % 3 == 2) {
            assert_int_equal(pw_stripper_solve(&c, &sp, NULL, &r), PW_OK);
            if (r.feasible)
                fail_msg("azeotrope %d crossed: S_min %.12g", t, r.boilup_min);
            assert_non_null(strstr(r.reason, "y = x"));
            refused++;
            continue;
        }
        check_spec(&c, &sp, 200000, "beside an azeotrope", t);
    }
    assert_int_equal(refused, 30);
    gsl_rng_free(rng);
}

/* The table only seeds the search: the same answer from 16 to 5,000 points. */
static void grid_independent(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 31UL);
    const size_t grids[] = {16, 37, 200, 5000};
    for (int t = 0; t < 40; t++) {
        bump b;
        pw_curve c = {bump_y, &b};
        do
            b = (bump){8.0 * gsl_rng_uniform(rng), 0.05 + 0.6 * gsl_rng_uniform(rng),
                       pow(10.0, -3.0 + 2.0 * gsl_rng_uniform(rng)), 0.0, 0.0, 1.0, t % 2 == 0};
        while (!valid_curve(&c));
        double xt = 0.2 + 0.6 * gsl_rng_uniform(rng), xb = xt * 0.5 * gsl_rng_uniform(rng);
        pw_stripper_spec sp = b.flip ? (pw_stripper_spec){1.0 - xt, 1.0 - xb}
                                     : (pw_stripper_spec){xt, xb};
        double first = NAN;
        for (size_t g = 0; g < sizeof grids / sizeof grids[0]; g++) {
            pw_column_options o = pw_column_default_options();
            o.grid = grids[g];
            o.n_factors = 0;
            o.max_stages = 100000;
            pw_stripper_result r;
            assert_int_equal(pw_stripper_solve(&c, &sp, &o, &r), PW_OK);
            assert_true(r.feasible);
            if (g == 0)
                first = r.boilup_min;
            else if (fabs(r.boilup_min - first) > 1e-9 * first)
                fail_msg("case %d: grid %zu gives %.15g, grid 16 %.15g", t, grids[g],
                         r.boilup_min, first);
        }
    }
    gsl_rng_free(rng);
}

static pw_complib lib;

static void butanol_water_beside_the_layers(void **state)
{
    (void)state;
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *pw_complib_find(&lib, "1-butanol");
    s.comp[1] = *pw_complib_find(&lib, "water");
    s.model = &pw_model_nrtl;
    s.T_ref_K = 360.0;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_rng_set(rng, 4UL);
    int cases = 0;
    for (int t = 0; t < 12; t++) {
        /* METHODS2 4.5's parameters (t = 0), then perturbed by up to 5 % */
        double f = t == 0 ? 0.0 : 1.0;
        s.params[0] = 360.0 * (1.0 + f * 0.1 * (gsl_rng_uniform(rng) - 0.5));
        s.params[1] = 1296.0 * (1.0 + f * 0.1 * (gsl_rng_uniform(rng) - 0.5));
        s.params[2] = 0.47 * (1.0 + f * 0.1 * (gsl_rng_uniform(rng) - 0.5));
        pw_three_phase tp;
        assert_int_equal(pw_three_phase_at_P(&s, 101325.0, &tp), PW_OK);
        if (!tp.exists || !tp.heterogeneous_azeotrope)
            continue;
        pw_system_curve sc;
        assert_int_equal(pw_system_curve_init(&sc, &s, 101325.0), PW_OK);
        pw_curve c = pw_system_curve_bind(&sc);
        for (int side = 0; side < 2; side++) {
            double d = pow(10.0, -7.0 + 6.3 * gsl_rng_uniform(rng));
            pw_stripper_spec sp = side == 0 ? (pw_stripper_spec){tp.x[1], fmin(tp.x[1] + d, 0.999)}
                                            : (pw_stripper_spec){tp.x[0], tp.x[0] - d * tp.x[0]};
            check_spec(&c, &sp, 20000, side == 0 ? "butanol-water A" : "butanol-water B", t);
            cases++;
        }
    }
    assert_true(cases >= 16);
    gsl_rng_free(rng);
}

static int setup(void **state)
{
    (void)state;
    return pw_test_read_complib(&lib);
}

static int teardown(void **state)
{
    (void)state;
    pw_complib_free(&lib);
    return 0;
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(random_closed_forms),
        cmocka_unit_test(beside_an_azeotrope),
        cmocka_unit_test(grid_independent),
        cmocka_unit_test(butanol_water_beside_the_layers),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
