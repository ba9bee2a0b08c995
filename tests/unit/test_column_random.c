/* Seeded randomised minimum-reflux check over at least 2,000 specifications: random activity
 * models (two-parameter Margules, van Laar, Wilson, NRTL, written out here from the textbook forms,
 * not the library's), random vapour-pressure ratios, with and without azeotropes, products drawn
 * anywhere inside a region where y* > x and often right beside an azeotrope (1e-2 ... 3e-6 away),
 * random q in [-0.3, 1.5]. For every specification the library limits by a pinch, the operating
 * path at R_min (1 + 1e-6) must stay on or below the curve on a 100,001-point grid of [xb, xd],
 * and at R_min (1 - 1e-4) it must cross it (grid plus the q-line point and the reported pinch).
 * This is the identity that defines minimum reflux (McCabe & Thiele 1925), checked outside the
 * library. Specifications limited by a flow (no reflux or no boil-up needed) are counted apart.
 *
 * Curves: isothermal modified Raoult's law, y = x g1 r / (x g1 r + (1 - x) g2), r = P1sat/P2sat.
 * Activity models (Prausnitz, Lichtenthaler & de Azevedo, Molecular Thermodynamics of
 * Fluid-Phase Equilibria, 3rd ed., ch. 6-7; from memory): Margules
 * ln g1 = x2^2 [A12 + 2 (A21 - A12) x1]; van Laar ln g1 = A12 (1 + A12 x1/(A21 x2))^-2; Wilson
 * ln g1 = -ln(x1 + L12 x2) + x2 [L12/(x1 + L12 x2) - L21/(x2 + L21 x1)]; NRTL
 * ln g1 = x2^2 [t21 (G21/(x1 + x2 G21))^2 + t12 G12/(x2 + x1 G12)^2], G = exp(-a t); and the
 * mirror images for component 2. */
#include "pw_test.h"

#include "column_envelope.h"

#include <math.h>
#include <pinchwise/column.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>

#define GRID_N 100000
#define N_SPECS 2000
#define MAX_TRIES 40000

typedef enum { M_MARGULES, M_VANLAAR, M_WILSON, M_NRTL } model_kind;

typedef struct rand_curve {
    model_kind kind;
    double p1, p2, p3, r;
} rand_curve;

static void ln_gamma(const rand_curve *c, double x1, double *l1, double *l2)
{
    double x2 = 1.0 - x1;
    switch (c->kind) {
    case M_MARGULES:
        *l1 = x2 * x2 * (c->p1 + 2.0 * (c->p2 - c->p1) * x1);
        *l2 = x1 * x1 * (c->p2 + 2.0 * (c->p1 - c->p2) * x2);
        return;
    case M_VANLAAR: {
        double d = c->p1 * x1 + c->p2 * x2;
        *l1 = c->p1 * (c->p2 * x2 / d) * (c->p2 * x2 / d);
        *l2 = c->p2 * (c->p1 * x1 / d) * (c->p1 * x1 / d);
        return;
    }
    case M_WILSON: {
        double d1 = x1 + c->p1 * x2, d2 = x2 + c->p2 * x1;
        double t = c->p1 / d1 - c->p2 / d2;
        *l1 = -log(d1) + x2 * t;
        *l2 = -log(d2) - x1 * t;
        return;
    }
    case M_NRTL: {
        double t12 = c->p1, t21 = c->p2, G12 = exp(-c->p3 * t12), G21 = exp(-c->p3 * t21);
        double a = x1 + x2 * G21, b = x2 + x1 * G12;
        *l1 = x2 * x2 * (t21 * (G21 / a) * (G21 / a) + t12 * G12 / (b * b));
        *l2 = x1 * x1 * (t12 * (G12 / b) * (G12 / b) + t21 * G21 / (a * a));
        return;
    }
    }
}

static double curve_y(const void *ctx, double x)
{
    const rand_curve *c = ctx;
    double l1, l2;
    ln_gamma(c, x, &l1, &l2);
    double k1 = x * exp(l1) * c->r, k2 = (1.0 - x) * exp(l2);
    return k1 / (k1 + k2);
}

static pw_status curve_fn(void *ctx, double x, double *y)
{
    *y = curve_y(ctx, x);
    return PW_OK;
}

/* xorshift64*: a fixed, platform-independent sequence. */
static uint64_t rng_state = 0x9E3779B97F4A7C15ull;
static double unif(void)
{
    rng_state ^= rng_state >> 12;
    rng_state ^= rng_state << 25;
    rng_state ^= rng_state >> 27;
    return (double)((rng_state * 0x2545F4914F6CDD1Dull) >> 11) * 0x1.0p-53;
}
static double unif_in(double a, double b)
{
    return a + (b - a) * unif();
}

static void draw_curve(rand_curve *c)
{
    c->kind = (model_kind)(unif() * 4.0);
    c->r = exp(unif_in(log(1.05), log(8.0)));
    switch (c->kind) {
    case M_MARGULES:
        c->p1 = unif_in(-1.5, 2.0);
        c->p2 = unif_in(-1.5, 2.0);
        break;
    case M_VANLAAR: {
        double sg = unif() < 0.7 ? 1.0 : -1.0;
        c->p1 = sg * unif_in(0.1, 2.0);
        c->p2 = sg * unif_in(0.1, 2.0);
        break;
    }
    case M_WILSON:
        c->p1 = exp(unif_in(log(0.1), log(2.5)));
        c->p2 = exp(unif_in(log(0.1), log(2.5)));
        break;
    case M_NRTL:
        c->p1 = unif_in(-1.0, 2.5);
        c->p2 = unif_in(-1.0, 2.5);
        c->p3 = unif_in(0.2, 0.47);
        break;
    }
    c->p3 = c->kind == M_NRTL ? c->p3 : 0.0;
}

/* a root of y - x between a and b (sign change) by bisection */
static double bisect_az(const rand_curve *c, double a, double b)
{
    double fa = curve_y(c, a) - a;
    for (int i = 0; i < 200; i++) {
        double m = 0.5 * (a + b), fm = curve_y(c, m) - m;
        if (m == a || m == b)
            break;
        if ((fm > 0.0) == (fa > 0.0)) {
            a = m;
            fa = fm;
        } else {
            b = m;
        }
    }
    return 0.5 * (a + b);
}

/* Picks a region of [0, 1] where y* > x, and products inside it. false: none usable. */
static bool draw_spec(const rand_curve *c, pw_column_spec *s, int *beside, bool *azeotropic)
{
    enum { NS = 2000 };
    double lo[8], hi[8];
    int nreg = 0;
    double prev_x = 1e-6, prev_y = curve_y(c, prev_x);
    double start = (prev_y > prev_x) ? 0.0 : NAN;
    for (int i = 1; i <= NS; i++) {
        double x = i == NS ? 1.0 - 1e-6 : (double)i / NS, y = curve_y(c, x);
        if (!(y > prev_y))
            return false; /* not increasing: outside what a column on this curve means */
        bool up = y > x, was = prev_y > prev_x;
        if (up != was) {
            double az = bisect_az(c, prev_x, x);
            if (up)
                start = az;
            else if (nreg < 8) {
                lo[nreg] = start;
                hi[nreg++] = az;
            }
        }
        prev_x = x;
        prev_y = y;
    }
    if (prev_y > prev_x && nreg < 8) {
        lo[nreg] = start;
        hi[nreg++] = 1.0;
    }
    if (nreg == 0)
        return false;
    *azeotropic = nreg > 1 || lo[0] > 0.0 || hi[0] < 1.0;
    int k = (int)(unif() * nreg);
    double a = lo[k], b = hi[k];
    if (!(b - a > 0.05))
        return false;
    *beside = 0;
    bool az_top = (b < 1.0);
    bool az_bot = (a > 0.0);
    if (az_top && unif() < 0.5) {
        s->xd = b - pow(10.0, unif_in(-5.5, -2.0));
        (*beside)++;
    } else {
        s->xd = b - unif_in(0.002, 0.3) * (b - a);
    }
    if (az_bot && unif() < 0.5) {
        s->xb = a + pow(10.0, unif_in(-5.5, -2.0));
        (*beside)++;
    } else {
        s->xb = a + unif_in(0.002, 0.3) * (b - a);
    }
    if (!(s->xd - s->xb > 0.02))
        return false;
    s->zf = s->xb + unif_in(0.15, 0.85) * (s->xd - s->xb);
    s->q = unif_in(-0.3, 1.5);
    return true;
}

static void test_random_specifications(void **state)
{
    (void)state;
    double *ytab = malloc((GRID_N + 1) * sizeof *ytab);
    assert_non_null(ytab);
    int checked = 0, tries = 0, flow = 0, beside_az = 0, tangent = 0, skipped = 0, with_az = 0;
    while (checked < N_SPECS && tries < MAX_TRIES) {
        tries++;
        rand_curve c;
        draw_curve(&c);
        pw_column_spec s;
        int beside;
        bool azeotropic;
        if (!draw_spec(&c, &s, &beside, &azeotropic))
            continue;
        /* the dense table: the margin y* - x must be clear of the library's feasibility floor */
        double f_lo = INFINITY;
        for (int i = 0; i <= GRID_N; i++) {
            double x = s.xb + (s.xd - s.xb) * i / GRID_N;
            ytab[i] = curve_y(&c, x);
            f_lo = fmin(f_lo, ytab[i] - x);
        }
        if (!(f_lo > 1e-9)) {
            skipped++;
            continue;
        }
        pw_curve cv = {curve_fn, &c};
        pw_column_result r;
        pw_status st = pw_column_solve(&cv, &s, NULL, &r);
        char label[300];
        snprintf(label, sizeof label,
                 "spec %d: model %d p %.17g %.17g %.17g r %.17g xd %.17g xb %.17g zf %.17g q %.17g",
                 checked, (int)c.kind, c.p1, c.p2, c.p3, c.r, s.xd, s.xb, s.zf, s.q);
        if (st == PW_ERANGE && r.reason[0]) {
            flow++; /* the q-line meets the curve outside (xb, xd): refused in words */
            continue;
        }
        if (st != PW_OK || !r.feasible)
            fail_msg("%s: status %d feasible %d %s", label, (int)st, (int)r.feasible, r.reason);
        if (r.boilup_limited || r.reflux_limited || !(r.r_min > 0.0)) {
            flow++;
            continue;
        }
        double lo_R = r.r_min * (1.0 - 1e-4);
        double D = (s.zf - s.xb) / (s.xd - s.xb), B = 1.0 - D;
        if (!(((lo_R + 1.0) * D - (1.0 - s.q)) / B > 0.0)) {
            flow++; /* a hair below R_min the boil-up vanishes: a flow, not a pinch, is near */
            continue;
        }
        double extra[2] = {r.pinch.x, isfinite(r.x_q) ? r.x_q : r.pinch.x};
        double above =
            env_path_gap(curve_y, &c, &s, r.r_min * (1.0 + 1e-6), GRID_N, extra, 2, ytab);
        double below = env_path_gap(curve_y, &c, &s, lo_R, GRID_N, extra, 2, ytab);
        if (!(above >= -1e-14) || !(below < 0.0))
            fail_msg("%s: R_min %.17g gap %.3g at R_min(1+1e-6), %.3g at R_min(1-1e-4)", label,
                     r.r_min, above, below);
        checked++;
        beside_az += beside > 0;
        with_az += azeotropic;
        tangent += r.pinch.kind == PW_PINCH_TANGENT;
    }
    free(ytab);
    print_message("%d specifications checked (%d on curves with an azeotrope, %d beside one, %d "
                  "tangent pinches), %d flow-limited, %d too close to the feasibility floor, %d "
                  "draws\n",
                  checked, with_az, beside_az, tangent, flow, skipped, tries);
    assert_int_equal(checked, N_SPECS);
    assert_true(beside_az >= N_SPECS / 5);
    assert_true(with_az >= N_SPECS / 5 && N_SPECS - with_az >= N_SPECS / 5);
    assert_true(tangent >= N_SPECS / 10);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_random_specifications),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
