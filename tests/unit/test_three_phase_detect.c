/* The plateau (three-phase point) detector, src/data/three_phase_detect.c, both ways.
 *
 *  - Published data: the 1-butanol/water set at 1 atm (Stockhardt & Hull 1931, shipped in
 *    datasets/) has its seven points at 365.85-366.15 K, y1 0.242-0.252 flagged, and no other;
 *    ethanol/water at 1 atm (Perry's, shipped), flat in T near its homogeneous azeotrope, has
 *    none; nor have the other shipped homogeneous sets.
 *  - Seeded simulated data against the model that made them (an independent judgement: the
 *    model's own liquid-liquid split at the plateau temperature):
 *      true plateaus: NRTL 1-butanol/water (the METHODS2 4.5 parameters), 30 liquids evenly in x,
 *      at T3 and y3 inside the model's gap, the one-liquid bubble point outside it (agreeing with
 *      pw_bubble_T_het, checked), noise sigma_T 0.1 K,
 *      sigma_y 0.004: in at least 95 % of 200 seeded sets a plateau is found, and every flagged
 *      point lies inside the model's gap (within 0.01);
 *      single liquids near a split: NRTL acetone/methanol b12 = 20 i K, b21 = 300 - 5 i K,
 *      alpha 0.3, for i = 20..30 (the model does not split at 300-340 K; checked here), with the
 *      same noise: for i = 20..26 (min D at 320 K from 0.87 down to 0.54) at most 8 of 140
 *      seeded sets flagged; for i = 27..30 the rate is printed, not asserted (see
 *      docs/heterogeneous.md 4: near a critical solution point no rule on data alone can tell).
 *    These are invented data (only the parameters of a model), used for the rule's error rates,
 *    not as a check of the thermodynamics. */
#include "pw_test.h"

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/dataset.h>
#include <pinchwise/lle.h>
#include <pinchwise/lledata.h>
#include <stdlib.h>
#include <string.h>

static pw_complib lib;

static size_t detect_file(const char *file, bool butanol_plateau, size_t *n_out)
{
    char path[1024];
    pw_dataset ds;
    pw_error err;
    pw_test_path(path, sizeof path, file);
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    bool *flags = calloc(ds.n, sizeof *flags);
    assert_non_null(flags);
    size_t got = pw_three_phase_detect(ds.pts, ds.n, ds.kind == PW_DATA_ISOBARIC, ds.has_y,
                                       ds.sigma_T_K, ds.sigma_P_rel, ds.sigma_y, flags);
    if (butanol_plateau) {
        for (size_t i = 0; i < ds.n; i++) {
            bool on = ds.pts[i].T_K >= 365.8 && ds.pts[i].T_K <= 366.2 && ds.pts[i].y1 >= 0.240
                      && ds.pts[i].y1 <= 0.255;
            if (flags[i] != on)
                fail_msg("%s: x1 = %g flagged %d, expected %d", file, ds.pts[i].x1, flags[i], on);
        }
    }
    if (n_out)
        *n_out = ds.n;
    free(flags);
    pw_dataset_free(&ds);
    return got;
}

static void published_sets(void **state)
{
    (void)state;
    size_t n;
    assert_int_equal(detect_file("datasets/butanol_water_1atm.csv", true, &n), 7);
    /* the two rows at 3.716 kPa, x1 0.0188 and 0.4876: the two layers boiling together, a pair
     * far enough apart in x (Butler et al. 1933, shipped) */
    assert_int_equal(detect_file("datasets/butanol_water_25C.csv", false, &n), 2);
    static const char *none[] = {
        "datasets/ethanol_water_1atm.csv", "datasets/methanol_water_1atm.csv",
        "datasets/mek_toluene_50C_pxy.csv", "datasets/demo_acetone_water.csv",
    };
    for (size_t k = 0; k < sizeof none / sizeof none[0]; k++) {
        size_t got = detect_file(none[k], false, NULL);
        if (got)
            fail_msg("%s: %zu three-phase points, expected none", none[k], got);
    }
}

/* Edges: fewer than 3 points, a plateau too narrow in x, a trend inside the band. */
static void edges(void **state)
{
    (void)state;
    pw_point p[20];
    bool f[20];
    memset(p, 0, sizeof p);
    for (int i = 0; i < 6; i++) {
        p[i].x1 = 0.1 + 0.15 * i;
        p[i].y1 = 0.4;
        p[i].T_K = 350.0;
        p[i].P_Pa = 101325.0;
    }
    assert_int_equal(pw_three_phase_detect(p, 6, true, true, 0.1, NAN, 0.004, f), 6);
    assert_int_equal(pw_three_phase_detect(p, 6, true, false, 0.1, NAN, 0.004, f), 0);
    /* two points 0.15 apart: not enough; 0.3 apart: both layers boiling together */
    assert_int_equal(pw_three_phase_detect(p, 2, true, true, 0.1, NAN, 0.004, f), 0);
    assert_int_equal(pw_three_phase_detect(p + 1, 2, true, true, 0.1, NAN, 0.004, f), 0);
    pw_point pair[2] = {p[0], p[2]};
    assert_int_equal(pw_three_phase_detect(pair, 2, true, true, 0.1, NAN, 0.004, f), 2);
    /* isothermal: constant P and y */
    assert_int_equal(pw_three_phase_detect(p, 6, false, true, 0.1, 0.001, 0.004, f), 6);
    /* 20 points over x 0.05-0.90 with y rising steadily by 0.0064 in all: inside the band of
     * 2 sigma_y = 0.008, but a slope of 0.0075 against its standard error 0.004/sqrt(Sxx) =
     * 0.0030 (Sxx = 665 * 0.045^2): a trend 0.004 noise cannot explain */
    for (int i = 0; i < 20; i++) {
        p[i].x1 = 0.05 + 0.045 * i;
        p[i].y1 = 0.4 + 0.0064 * i / 19.0;
        p[i].T_K = 350.0;
        p[i].P_Pa = 101325.0;
    }
    assert_int_equal(pw_three_phase_detect(p, 20, true, true, 0.1, NAN, 0.004, f), 0);
    /* the same with a stated sigma_y of 0.01: the noise explains it */
    assert_int_equal(pw_three_phase_detect(p, 20, true, true, 0.1, NAN, 0.01, f), 20);
    /* three points spanning less than 0.1 in x */
    for (int i = 0; i < 3; i++) {
        p[i].x1 = 0.5 + 0.04 * i;
        p[i].y1 = 0.4;
    }
    assert_int_equal(pw_three_phase_detect(p, 3, true, true, 0.1, NAN, 0.004, f), 0);
}

static pw_system nrtl(const char *a, const char *b, double b12, double b21, double alpha)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *pw_complib_find(&lib, a);
    s.comp[1] = *pw_complib_find(&lib, b);
    s.model = &pw_model_nrtl;
    s.params[0] = b12;
    s.params[1] = b21;
    s.params[2] = alpha;
    s.T_ref_K = 330.0;
    return s;
}

#define NPTS 30

/* Exact (noise-free) bubble points of 30 liquids at x = (k + 0.5)/30 at 1 atm: inside the
 * model's gap at T3 with y3 (three-phase), outside it the one-liquid bubble point. */
static void exact_points(const pw_system *s, pw_eq_point *ex)
{
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(s, 101325.0, &tp), PW_OK);
    for (int k = 0; k < NPTS; k++) {
        double x = (k + 0.5) / NPTS;
        if (tp.exists && x > tp.x[0] && x < tp.x[1]) {
            ex[k].x1 = x;
            ex[k].y1 = tp.y1;
            ex[k].T_K = tp.T_K;
        } else {
            assert_int_equal(pw_bubble_T(s, 101325.0, x, &ex[k]), PW_OK);
        }
    }
}

static void add_noise(const pw_eq_point *ex, gsl_rng *rng, pw_point *p)
{
    for (int k = 0; k < NPTS; k++) {
        memset(&p[k], 0, sizeof p[k]);
        p[k].x1 = ex[k].x1;
        p[k].y1 = fmin(1.0, fmax(0.0, ex[k].y1 + gsl_ran_gaussian(rng, 0.004)));
        p[k].T_K = ex[k].T_K + gsl_ran_gaussian(rng, 0.1);
        p[k].P_Pa = 101325.0;
    }
}

static void seeded_both_ways(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    pw_point p[NPTS];
    bool f[NPTS];
    /* true plateaus */
    pw_system bw = nrtl("1-butanol", "water", 360.0, 1296.0, 0.47);
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&bw, 101325.0, &tp), PW_OK);
    assert_true(tp.exists);
    int found = 0;
    pw_eq_point ex[NPTS];
    exact_points(&bw, ex);
    /* the three-phase-aware bubble point agrees with the split construction used here */
    for (int k = 0; k < NPTS; k += 7) {
        pw_eq_point e;
        bool three;
        assert_int_equal(pw_bubble_T_het(&bw, 101325.0, ex[k].x1, &e, &three), PW_OK);
        pw_assert_close(e.T_K, ex[k].T_K, 0.0, 1e-6, "T");
        pw_assert_close(e.y1, ex[k].y1, 0.0, 1e-6, "y");
    }
    for (unsigned long seed = 1; seed <= 200; seed++) {
        gsl_rng_set(rng, seed);
        add_noise(ex, rng, p);
        size_t got = pw_three_phase_detect(p, NPTS, true, true, 0.1, NAN, 0.004, f);
        if (got >= 3)
            found++;
        /* a flagged point outside the gap must be one whose exact T and y lie within 4 sigma of
         * the three-phase values (indistinguishable from them by the data) */
        for (int k = 0; k < NPTS; k++)
            if (f[k] && !(p[k].x1 > tp.x[0] && p[k].x1 < tp.x[1])
                && !(fabs(ex[k].T_K - tp.T_K) <= 0.4 && fabs(ex[k].y1 - tp.y1) <= 0.016))
                fail_msg("seed %lu: x1 = %g flagged outside the gap (%g, %g), T %g y %g", seed,
                         p[k].x1, tp.x[0], tp.x[1], ex[k].T_K, ex[k].y1);
    }
    if (found < 190)
        fail_msg("true plateaus found in %d of 200 sets (want >= 190)", found);
    /* single liquids near a split */
    int flagged = 0, flagged_close = 0;
    for (int i = 20; i <= 30; i++) {
        pw_system am = nrtl("acetone", "methanol", 20.0 * i, 300.0 - 5.0 * i, 0.3);
        for (double T = 300.0; T <= 340.0; T += 10.0) {
            pw_lle_result l;
            assert_int_equal(pw_lle_solve(&am, T, &l), PW_OK);
            assert_false(l.split);
        }
        exact_points(&am, ex);
        for (unsigned long seed = 1; seed <= 20; seed++) {
            gsl_rng_set(rng, 1000 * (unsigned long)i + seed);
            add_noise(ex, rng, p);
            if (pw_three_phase_detect(p, NPTS, true, true, 0.1, NAN, 0.004, f)) {
                if (i <= 26)
                    flagged++;
                else
                    flagged_close++;
            }
        }
    }
    if (flagged > 8)
        fail_msg("single-liquid sets flagged: %d of 140 (want <= 8, about 6 %%)", flagged);
    /* closer to the split (i = 27..30, min D 0.48 down to 0.32) the data cannot tell a flat
     * single liquid from a narrow plateau: reported, documented, not asserted */
    print_message("plateau detector: %d of 200 true plateaus found; single liquids flagged: %d "
                  "of 140 (i = 20..26), %d of 80 closer to a split (i = 27..30)\n", found,
                  flagged, flagged_close);
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
        cmocka_unit_test(published_sets),
        cmocka_unit_test(edges),
        cmocka_unit_test(seeded_both_ways),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
