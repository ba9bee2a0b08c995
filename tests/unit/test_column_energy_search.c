/* The energy-balance column's minimum-reflux search (the column module's branch and bound on the
 * tie-line values, docs/column.md section 9) against computations that share none of its code:
 *  - seeded random specifications on four invented liquids with H^E, heat capacities and unequal
 *    heats (tangent pinches in both sections, products close to an azeotrope):
 *    stepping at R_min (1 + 1e-6) reaches the bottoms, stepping at R_min (1 - 1e-4) cannot
 *    (geometry: the staircase cannot pass a point where the operating curve touches the
 *    equilibrium curve);
 *  - the same R_min from an independent dense evaluation: the tie lines on 4001 points of each
 *    section through the public bubble-point and enthalpy functions, the best refined by golden
 *    section search, the feed liquid by bisection;
 *  - the identity: with no enthalpy effects (equal heats, no heat capacities, H^E = 0) R_min,
 *    the pinch kind and its place equal the constant-overflow column's, including products
 *    within 1e-3 of an azeotrope.
 * All liquids and specifications are invented for the tests. */
#include "design_systems.h"

#include <pinchwise/curve.h>
#include <pinchwise/design.h>
#include <stdlib.h>

#define P_PA 101325.0

static pw_heat_data heats(const pw_system *sys, double l1, double l2, double cpL1, double cpL2,
                          double cpV1, double cpV2)
{
    pw_heat_data h = {.dHvap = {l1, l2}, .cpL = {cpL1, cpL2}, .cpV = {cpV1, cpV2}};
    for (int i = 0; i < 2; i++)
        assert_int_equal(pw_tsat(&sys->comp[i], P_PA, &h.Tb_K[i]), PW_OK);
    return h;
}

static double urand(double a, double b)
{
    return a + (b - a) * rand() / (double)RAND_MAX;
}

/* Wilson with a volume ratio of 4 (invented): athermal (H^E = 0) for a12 = a21 = 0. */
static pw_system wilson(double alpha, double a12, double a21)
{
    pw_system s = design_ideal_system(alpha);
    s.model = &pw_model_wilson;
    s.params[0] = a12;
    s.params[1] = a21;
    s.params[2] = 4.0;
    return s;
}

static pw_system nrtl(double alpha, double b12, double b21)
{
    pw_system s = design_ideal_system(alpha);
    s.model = &pw_model_nrtl;
    s.params[0] = b12;
    s.params[1] = b21;
    s.params[2] = 0.3;
    return s;
}

/* The azeotrope of a liquid, by bisection on y* - x after a scan; NAN when there is none. */
static double azeotrope(const pw_system *sys)
{
    double xa = 0.001, fa = NAN;
    for (int i = 0; i <= 200; i++) {
        double x = 0.001 + 0.998 * i / 200.0;
        pw_eq_point p;
        assert_int_equal(pw_bubble_T(sys, P_PA, x, &p), PW_OK);
        double f = p.y1 - x;
        if (i > 0 && (f > 0.0) != (fa > 0.0)) {
            double lo = xa, hi = x, flo = fa;
            for (int k = 0; k < 100; k++) {
                double m = 0.5 * (lo + hi);
                assert_int_equal(pw_bubble_T(sys, P_PA, m, &p), PW_OK);
                if ((p.y1 - m > 0.0) == (flo > 0.0)) {
                    lo = m;
                    flo = p.y1 - m;
                } else {
                    hi = m;
                }
            }
            return 0.5 * (lo + hi);
        }
        xa = x;
        fa = f;
    }
    return NAN;
}

/* ---- the independent dense computation ---- */

typedef struct tieval {
    double y, hL, HV;
} tieval;

static tieval tie_at(const pw_system *sys, const pw_heat_data *h, double x)
{
    pw_eq_point p;
    assert_int_equal(pw_bubble_T(sys, P_PA, x, &p), PW_OK);
    tieval t = {p.y1, 0.0, pw_enthalpy_vapor(h, p.y1, p.T_K)};
    assert_int_equal(pw_enthalpy_liquid(sys, h, x, p.T_K, &t.hL), PW_OK);
    return t;
}

/* The tie line at x extended to x = xe. */
static double extended(const pw_system *sys, const pw_heat_data *h, double x, double xe)
{
    tieval t = tie_at(sys, h, x);
    return t.hL + (t.HV - t.hL) * (xe - x) / (t.y - x);
}

/* max of sign * extended over [a, b]: 4001 points, golden section around the best. */
static double dense_extremum(const pw_system *sys, const pw_heat_data *h, double a, double b,
                             double xe, double sign)
{
    const int n = 4001;
    double best = -INFINITY;
    int jb = 0;
    for (int j = 0; j < n; j++) {
        double x = a + (b - a) * j / (double)(n - 1);
        double v = sign * extended(sys, h, x, xe);
        if (v > best) {
            best = v;
            jb = j;
        }
    }
    double lo = a + (b - a) * fmax(0, jb - 1) / (double)(n - 1);
    double hi = a + (b - a) * fmin(n - 1, jb + 1) / (double)(n - 1);
    const double gr = 0.5 * (sqrt(5.0) - 1.0);
    for (int k = 0; k < 80; k++) {
        double x1 = hi - gr * (hi - lo), x2 = lo + gr * (hi - lo);
        double v1 = sign * extended(sys, h, x1, xe), v2 = sign * extended(sys, h, x2, xe);
        best = fmax(best, fmax(v1, v2));
        if (v1 > v2)
            hi = x2;
        else
            lo = x1;
    }
    return sign * best;
}

/* R_min by the dense computation; NAN when the feed's tie line leaves (xb, xd) (not compared). */
static double dense_rmin(const pw_system *sys, const pw_heat_data *h, const pw_column_spec *s)
{
    double hF, hD, HV, hB, T;
    assert_int_equal(pw_enthalpy_feed(sys, h, P_PA, s->zf, s->q, &hF), PW_OK);
    assert_int_equal(pw_enthalpy_sat_liquid(sys, h, P_PA, s->xd, &hD, &T), PW_OK);
    assert_int_equal(pw_enthalpy_sat_liquid(sys, h, P_PA, s->xb, &hB, &T), PW_OK);
    assert_int_equal(pw_enthalpy_sat_vapor(sys, h, P_PA, s->xd, &HV, &T), PW_OK);
    /* the feed's tie line: its liquid by bisection of (h_F - h_L)(y - x) - (H_V - h_L)(z - x)
     * over the whole column */
    double lo = s->xb, hi = s->xd;
#define FEED_G(x)                                                                                  \
    ({                                                                                             \
        tieval t_ = tie_at(sys, h, (x));                                                           \
        (hF - t_.hL) * (t_.y - (x)) - (t_.HV - t_.hL) * (s->zf - (x));                             \
    })
    double glo = FEED_G(lo), ghi = FEED_G(hi);
    if ((glo > 0.0) == (ghi > 0.0))
        return NAN;
    for (int k = 0; k < 200 && hi - lo > 1e-15; k++) {
        double m = 0.5 * (lo + hi), gm = FEED_G(m);
        if ((gm > 0.0) == (glo > 0.0)) {
            lo = m;
            glo = gm;
        } else {
            hi = m;
        }
    }
#undef FEED_G
    const double xf = 0.5 * (lo + hi);
    const double vr = dense_extremum(sys, h, xf, s->xd, s->xd, 1.0);
    const double vs = dense_extremum(sys, h, s->xb, xf, s->xb, -1.0);
    const double r_rect = (vr - HV) / (HV - hD);
    const double hdD = hF + (hF - vs) * (s->xd - s->zf) / (s->zf - s->xb);
    const double r_strip = (hdD - HV) / (HV - hD);
    double r = fmax(r_rect, r_strip);
    /* the reboiler duty's floor (zero) */
    const double hdD0 = hF + (hF - hB) * (s->xd - s->zf) / (s->zf - s->xb);
    return fmax(r, (hdD0 - HV) / (HV - hD));
}

/* ---- the tests ---- */

static void test_random_against_stepping_and_dense(void **state)
{
    (void)state;
    srand(20261202u);
    pw_system sys[4] = {nrtl(3.0, 150.0, 100.0), nrtl(1.3, -150.0, -150.0), wilson(2.0, 0.0, 0.0),
                        wilson(2.0, 250.0, 400.0)};
    const double az = azeotrope(&sys[3]); /* minimum-boiling: y* < x above it */
    assert_true(isfinite(az) && az > 0.85 && az < 0.95);
    const double az_max = azeotrope(&sys[1]); /* maximum-boiling: y* < x below it */
    assert_true(isfinite(az_max) && az_max > 0.2 && az_max < 0.5);
    int checked = 0, tangent = 0, near_az = 0, stripping = 0;
    for (int t = 0; t < 32; t++) {
        const int k = t % 4;
        const pw_system *s_ = &sys[k];
        pw_heat_data h =
            heats(s_, urand(28000.0, 44000.0), urand(28000.0, 44000.0), urand(60.0, 160.0),
                  urand(60.0, 110.0), urand(30.0, 90.0), urand(30.0, 50.0));
        pw_column_spec s;
        if (k == 3) { /* distillate close below the azeotrope: a tangent pinch beside it */
            s.xd = az - pow(10.0, urand(-5.0, -3.0));
            s.xb = urand(0.01, 0.12);
        } else if (k == 1) { /* bottoms above the maximum-boiling azeotrope */
            s.xb = az_max + pow(10.0, urand(-3.0, -1.5));
            s.xd = urand(0.93, 0.995);
        } else {
            s.xb = urand(0.01, 0.12);
            s.xd = urand(0.8, 0.99);
        }
        s.zf = s.xb + (s.xd - s.xb) * urand(0.2, 0.8);
        s.q = urand(0.1, 1.3);
        pw_column_options o = pw_column_default_options();
        o.n_factors = 0;
        pw_energy_result r;
        assert_int_equal(pw_energy_column_solve(s_, &h, P_PA, &s, &o, &r, NULL), PW_OK);
        if (!r.feasible)
            fail_msg("case %d: infeasible: %s", t, r.reason);
        if (r.reflux_limited)
            continue;
        /* the dense computation */
        double rd = dense_rmin(s_, &h, &s);
        if (isfinite(rd)) {
            if (!(r.r_min >= rd - 1e-9 * fmax(1.0, rd)))
                fail_msg("case %d: the search's R_min %.12g is below a dense value %.12g", t,
                         r.r_min, rd);
            pw_assert_close(r.r_min, rd, 2e-7, 1e-9, "R_min = dense computation");
        }
        /* the stepping */
        pw_profile p;
        pw_status above =
            pw_energy_profile(s_, &h, P_PA, &s, r.r_min * (1.0 + 1e-6), 200000, &p, NULL, NULL);
        pw_profile_free(&p);
        if (above != PW_OK)
            fail_msg("case %d: stepping at R_min (1 + 1e-6) = %.10g stopped (status %d)", t,
                     r.r_min * (1.0 + 1e-6), above);
        if (!r.boilup_limited) {
            pw_status below =
                pw_energy_profile(s_, &h, P_PA, &s, r.r_min * (1.0 - 1e-4), 4000, &p, NULL, NULL);
            pw_profile_free(&p);
            if (below != PW_EINFEASIBLE && below != PW_EMAXITER)
                fail_msg("case %d: stepping at R_min (1 - 1e-4) = %.10g reached xb (status %d)", t,
                         r.r_min * (1.0 - 1e-4), below);
        }
        if (getenv("PW_TEST_VERBOSE"))
            print_message("case %d k %d xd %.6f xb %.6f q %.3f: R_min %.8g %s %s x %.6f\n", t, k,
                          s.xd, s.xb, s.q, r.r_min,
                          r.pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed",
                          r.pinch.section == PW_SECTION_STRIPPING ? "strip" : "rect", r.pinch.x);
        checked++;
        tangent += r.pinch.kind == PW_PINCH_TANGENT;
        stripping += r.pinch.kind == PW_PINCH_TANGENT && r.pinch.section == PW_SECTION_STRIPPING;
        near_az += k == 3 && r.pinch.kind == PW_PINCH_TANGENT;
    }
    print_message("energy R_min search: %d specifications, %d tangent pinches (%d stripping, %d "
                  "beside an azeotrope)\n",
                  checked, tangent, stripping, near_az);
    assert_true(checked >= 28 && tangent >= 8 && stripping >= 3 && near_az >= 4);
}

/* No enthalpy effects: the constant-overflow column's R_min and pinch, on random specifications
 * of an athermal Wilson liquid (H^E = 0) near and far from its maximum-boiling azeotrope. */
static void test_identity_constant_overflow(void **state)
{
    (void)state;
    srand(77u);
    pw_system sys[2] = {wilson(1.12, 0.0, 0.0), wilson(2.0, 0.0, 0.0)};
    const double az = azeotrope(&sys[0]);
    assert_true(isfinite(az));
    int compared = 0, tangent = 0;
    for (int t = 0; t < 32; t++) {
        const pw_system *s_ = &sys[t % 2];
        const double lam = urand(25000.0, 45000.0);
        pw_heat_data h = heats(s_, lam, lam, 0, 0, 0, 0);
        pw_column_spec s;
        if (t % 2 == 0) {
            s.xb = az + pow(10.0, urand(-3.0, -1.5));
            s.xd = urand(0.93, 0.995);
        } else {
            s.xb = urand(0.01, 0.2);
            s.xd = urand(0.75, 0.99);
        }
        s.zf = s.xb + (s.xd - s.xb) * urand(0.15, 0.85);
        s.q = urand(-0.2, 1.4);
        pw_system_curve sc;
        assert_int_equal(pw_system_curve_init(&sc, s_, P_PA), PW_OK);
        pw_curve c = pw_system_curve_bind(&sc);
        pw_column_options o = pw_column_default_options();
        o.n_factors = 0;
        pw_column_result col;
        assert_int_equal(pw_column_solve(&c, &s, &o, &col), PW_OK);
        pw_energy_result r;
        assert_int_equal(pw_energy_column_solve(s_, &h, P_PA, &s, &o, &r, NULL), PW_OK);
        assert_int_equal(r.feasible, col.feasible);
        if (!col.feasible || col.reflux_limited || col.boilup_limited)
            continue;
        pw_assert_close(r.r_min, col.r_min, 1e-8, 1e-10, "R_min = constant overflow");
        assert_int_equal(r.pinch.kind, col.pinch.kind);
        if (col.pinch.kind == PW_PINCH_TANGENT) {
            assert_int_equal(r.pinch.section, col.pinch.section);
            pw_assert_close(r.pinch.x, col.pinch.x, 0, 1e-4, "tangent pinch location");
            tangent++;
        }
        compared++;
    }
    print_message("no enthalpy effects: %d specifications = constant overflow, %d tangent\n",
                  compared, tangent);
    assert_true(compared >= 24 && tangent >= 6);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_random_against_stepping_and_dense),
        cmocka_unit_test(test_identity_constant_overflow),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
