/* The library's range checks that the commands render (src/fit/fit_ranges.c, pw_az_T_range in
 * src/analysis/az_scan.c): the temperature spans of a data set, a stage profile and an
 * azeotrope search, the vapor-pressure ranges without a fit, the data range with a margin and a
 * column's two ends.
 *
 * Checks, with their sources: every expected value is an identity of the definitions in
 * include/pinchwise/fit.h (a distance below a range is T_min - T, above it T - T_max, zero
 * inside and on the bounds; the data range is left when T_lo < T_min - margin or
 * T_hi > T_max + margin), computed here by hand at temperatures exact in binary, so the
 * comparisons are exact; a seeded random loop checks the same definitions at random
 * temperatures against a computation written here, not the library's. The components and
 * temperatures are invented model cases, not data. */
#include "pw_test.h"

#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/dataset.h>
#include <pinchwise/design.h>
#include <pinchwise/fit.h>
#include <string.h>

/* Component a's vapor-pressure range is [300, 400] K, b's [320, 450] K; the data 340 to 360 K. */
static void make_fit(pw_fit_result *r)
{
    memset(r, 0, sizeof *r);
    r->sys.comp[0] = pw_test_antoine("a (invented)", 14.0, 3000.0, -50.0, PW_LN, "kPa", "K", 300.0,
                                     400.0);
    r->sys.comp[1] = pw_test_antoine("b (invented)", 14.0, 3000.0, -50.0, PW_LN, "kPa", "K", 320.0,
                                     450.0);
    r->T_min_K = 340.0;
    r->T_max_K = 360.0;
}

static void expect_distances(const pw_range_check *c, double b0, double b1, double a0, double a1)
{
    assert_true(c->below_K[0] == b0);
    assert_true(c->below_K[1] == b1);
    assert_true(c->above_K[0] == a0);
    assert_true(c->above_K[1] == a1);
}

static void dataset_range(void **state)
{
    (void)state;
    pw_point pts[4] = {{.x1 = 0.1, .T_K = 350.5}, {.x1 = 0.2, .T_K = 340.25},
                       {.x1 = 0.3, .T_K = NAN}, {.x1 = 0.4, .T_K = 360.0}};
    pw_dataset ds;
    memset(&ds, 0, sizeof ds);
    ds.pts = pts;
    ds.n = 4;
    double lo = 0.0, hi = 0.0;
    assert_int_equal(pw_dataset_T_range(&ds, &lo, &hi), PW_OK);
    assert_true(lo == 340.25 && hi == 360.0); /* the point without a temperature passed over */
    ds.n = 1;
    assert_int_equal(pw_dataset_T_range(&ds, &lo, &hi), PW_OK);
    assert_true(lo == 350.5 && hi == 350.5);
    /* empty, or no finite temperature: no range, outputs untouched */
    lo = hi = -1.0;
    ds.n = 0;
    assert_int_equal(pw_dataset_T_range(&ds, &lo, &hi), PW_EINVAL);
    ds.pts = pts + 2;
    ds.n = 1;
    assert_int_equal(pw_dataset_T_range(&ds, &lo, &hi), PW_EINVAL);
    assert_true(lo == -1.0 && hi == -1.0);
    assert_int_equal(pw_dataset_T_range(NULL, &lo, &hi), PW_EINVAL);
    assert_int_equal(pw_dataset_T_range(&ds, NULL, &hi), PW_EINVAL);
    ds.pts = NULL; /* points claimed but none there */
    assert_int_equal(pw_dataset_T_range(&ds, &lo, &hi), PW_EINVAL);
}

static void profile_range(void **state)
{
    (void)state;
    /* the hottest stage is not the last: no order assumed */
    pw_stage st[4] = {{.T_K = 351.0}, {.T_K = 349.5}, {.T_K = 372.75}, {.T_K = 370.0}};
    pw_profile p = {.stage = st, .n = 4, .cap = 4};
    double lo, hi;
    assert_int_equal(pw_profile_T_range(&p, &lo, &hi), PW_OK);
    assert_true(lo == 349.5 && hi == 372.75);
    st[1].T_K = NAN;
    assert_int_equal(pw_profile_T_range(&p, &lo, &hi), PW_OK);
    assert_true(lo == 351.0 && hi == 372.75);
    p.n = 0;
    assert_int_equal(pw_profile_T_range(&p, &lo, &hi), PW_EINVAL);
    p.n = 2;
    st[0].T_K = INFINITY;
    assert_int_equal(pw_profile_T_range(&p, &lo, &hi), PW_EINVAL);
    assert_int_equal(pw_profile_T_range(NULL, &lo, &hi), PW_EINVAL);
}

static void components_only(void **state)
{
    (void)state;
    pw_fit_result r;
    make_fit(&r);
    const pw_component *a = &r.sys.comp[0], *b = &r.sys.comp[1];
    pw_range_check c;
    /* inside both */
    assert_int_equal(pw_component_range_check(a, b, 330.0, 390.0, &c), PW_OK);
    expect_distances(&c, 0.0, 0.0, 0.0, 0.0);
    assert_false(pw_range_check_any(&c));
    assert_false(c.outside_data);
    assert_true(isnan(c.data_T_min_K) && isnan(c.data_T_max_K));
    assert_true(c.T_lo_K == 330.0 && c.T_hi_K == 390.0);
    /* below b's range only */
    assert_int_equal(pw_component_range_check(a, b, 310.0, 330.0, &c), PW_OK);
    expect_distances(&c, 0.0, 10.0, 0.0, 0.0);
    assert_true(pw_range_check_any(&c));
    /* above a's range only */
    assert_int_equal(pw_component_range_check(a, b, 350.0, 420.0, &c), PW_OK);
    expect_distances(&c, 0.0, 0.0, 20.0, 0.0);
    /* both sides of both ranges */
    assert_int_equal(pw_component_range_check(a, b, 290.0, 460.0, &c), PW_OK);
    expect_distances(&c, 10.0, 30.0, 60.0, 10.0);
    /* the bounds belong to the range */
    assert_int_equal(pw_component_range_check(a, b, 320.0, 400.0, &c), PW_OK);
    expect_distances(&c, 0.0, 0.0, 0.0, 0.0);
    /* one temperature */
    assert_int_equal(pw_component_range_check(a, b, 310.0, 310.0, &c), PW_OK);
    expect_distances(&c, 0.0, 10.0, 0.0, 0.0);
    /* a component without a stated range is never left */
    pw_component open = *a;
    open.T_min_K = open.T_max_K = NAN;
    assert_int_equal(pw_component_range_check(&open, b, 100.0, 900.0, &c), PW_OK);
    expect_distances(&c, 0.0, 220.0, 0.0, 450.0);
    /* bad ranges */
    assert_int_equal(pw_component_range_check(a, b, 360.0, 350.0, &c), PW_EINVAL);
    assert_int_equal(pw_component_range_check(a, b, NAN, 350.0, &c), PW_EINVAL);
    assert_int_equal(pw_component_range_check(a, b, 300.0, INFINITY, &c), PW_EINVAL);
    assert_int_equal(pw_component_range_check(NULL, b, 300.0, 350.0, &c), PW_EINVAL);
    assert_int_equal(pw_component_range_check(a, b, 300.0, 350.0, NULL), PW_EINVAL);
}

static void data_margin(void **state)
{
    (void)state;
    pw_fit_result r;
    make_fit(&r);
    pw_range_check c;
    /* margin 5 K: [335, 365] is the edge, inclusive */
    assert_int_equal(pw_fit_range_check_margin(&r, 335.0, 365.0, 5.0, &c), PW_OK);
    assert_false(c.outside_data);
    assert_int_equal(pw_fit_range_check_margin(&r, 334.75, 350.0, 5.0, &c), PW_OK);
    assert_true(c.outside_data);
    assert_int_equal(pw_fit_range_check_margin(&r, 350.0, 365.25, 5.0, &c), PW_OK);
    assert_true(c.outside_data);
    assert_int_equal(pw_fit_range_check_margin(&r, 330.0, 370.0, 5.0, &c), PW_OK);
    assert_true(c.outside_data && pw_range_check_any(&c));
    assert_true(c.data_T_min_K == 340.0 && c.data_T_max_K == 360.0);
    /* margin 0: the data range itself */
    assert_int_equal(pw_fit_range_check_margin(&r, 340.0, 360.0, 0.0, &c), PW_OK);
    assert_false(c.outside_data);
    assert_int_equal(pw_fit_range_check_margin(&r, 339.75, 360.0, 0.0, &c), PW_OK);
    assert_true(c.outside_data);
    /* pw_fit_range_check is the margin PW_RANGE_DATA_MARGIN_K = 1 K */
    assert_true(PW_RANGE_DATA_MARGIN_K == 1.0);
    assert_int_equal(pw_fit_range_check(&r, 339.0, 361.0, &c), PW_OK);
    assert_false(c.outside_data);
    assert_int_equal(pw_fit_range_check(&r, 338.75, 361.0, &c), PW_OK);
    assert_true(c.outside_data);
    /* the vapor-pressure distances do not depend on the margin */
    assert_int_equal(pw_fit_range_check_margin(&r, 310.0, 420.0, 100.0, &c), PW_OK);
    expect_distances(&c, 0.0, 10.0, 20.0, 0.0);
    assert_false(c.outside_data);
    /* bad margins and ranges */
    assert_int_equal(pw_fit_range_check_margin(&r, 340.0, 350.0, -0.5, &c), PW_EINVAL);
    assert_int_equal(pw_fit_range_check_margin(&r, 340.0, 350.0, NAN, &c), PW_EINVAL);
    assert_int_equal(pw_fit_range_check_margin(&r, 340.0, 350.0, INFINITY, &c), PW_EINVAL);
    assert_int_equal(pw_fit_range_check_margin(&r, 350.0, 340.0, 1.0, &c), PW_EINVAL);
    assert_int_equal(pw_fit_range_check_margin(NULL, 340.0, 350.0, 1.0, &c), PW_EINVAL);
    /* an unknown data range is never left */
    r.T_min_K = r.T_max_K = NAN;
    assert_int_equal(pw_fit_range_check_margin(&r, 100.0, 900.0, 0.0, &c), PW_OK);
    assert_false(c.outside_data);
}

static void column_ends(void **state)
{
    (void)state;
    pw_fit_result r;
    make_fit(&r);
    pw_range_check e[2], s;
    /* the 5 K column margin: the ends just inside it, in either order */
    assert_true(PW_RANGE_COLUMN_MARGIN_K == 5.0);
    assert_int_equal(pw_fit_range_check_ends(&r, 335.0, 365.0, PW_RANGE_COLUMN_MARGIN_K, e, &s),
                     PW_OK);
    assert_false(s.outside_data);
    assert_true(s.T_lo_K == 335.0 && s.T_hi_K == 365.0);
    assert_int_equal(pw_fit_range_check_ends(&r, 365.0, 335.0, PW_RANGE_COLUMN_MARGIN_K, e, &s),
                     PW_OK);
    assert_false(s.outside_data);
    assert_true(s.T_lo_K == 335.0 && s.T_hi_K == 365.0);
    assert_true(e[0].T_lo_K == 365.0 && e[1].T_lo_K == 335.0);
    assert_int_equal(pw_fit_range_check_ends(&r, 335.5, 366.0, PW_RANGE_COLUMN_MARGIN_K, e, &s),
                     PW_OK);
    assert_true(s.outside_data);
    /* per end: the top at 310 K lies 10 K below b's range, the bottom at 420 K 20 K above a's;
     * neither end is both below and above */
    assert_int_equal(pw_fit_range_check_ends(&r, 310.0, 420.0, PW_RANGE_COLUMN_MARGIN_K, e, &s),
                     PW_OK);
    expect_distances(&e[0], 0.0, 10.0, 0.0, 0.0);
    expect_distances(&e[1], 0.0, 0.0, 20.0, 0.0);
    expect_distances(&s, 0.0, 10.0, 20.0, 0.0);
    assert_true(s.outside_data);
    /* a failed end: zeroed, the span from the other alone */
    assert_int_equal(pw_fit_range_check_ends(&r, NAN, 420.0, PW_RANGE_COLUMN_MARGIN_K, e, &s),
                     PW_OK);
    assert_true(isnan(e[0].T_lo_K) && !pw_range_check_any(&e[0]));
    expect_distances(&e[1], 0.0, 0.0, 20.0, 0.0);
    assert_true(s.T_lo_K == 420.0 && s.T_hi_K == 420.0 && s.outside_data);
    assert_int_equal(pw_fit_range_check_ends(&r, 350.0, NAN, PW_RANGE_COLUMN_MARGIN_K, e, &s),
                     PW_OK);
    assert_false(pw_range_check_any(&s));
    assert_int_equal(pw_fit_range_check_ends(&r, NAN, NAN, PW_RANGE_COLUMN_MARGIN_K, e, &s),
                     PW_EINVAL);
    assert_int_equal(pw_fit_range_check_ends(&r, 350.0, 355.0, -1.0, e, &s), PW_EINVAL);
    assert_int_equal(pw_fit_range_check_ends(&r, 350.0, 355.0, 5.0, NULL, &s), PW_EINVAL);
}

/* Seeded random ranges: the distances and the data flag from the definitions, written here. */
static void random_against_definitions(void **state)
{
    (void)state;
    gsl_rng *g = gsl_rng_alloc(gsl_rng_mt19937);
    assert_non_null(g);
    gsl_rng_set(g, 20261203UL);
    pw_fit_result r;
    make_fit(&r);
    for (int it = 0; it < 20000; it++) {
        for (int i = 0; i < 2; i++) {
            double lo = 250.0 + 150.0 * gsl_rng_uniform(g);
            r.sys.comp[i].T_min_K = lo;
            r.sys.comp[i].T_max_K = lo + 200.0 * gsl_rng_uniform(g);
        }
        r.T_min_K = 280.0 + 120.0 * gsl_rng_uniform(g);
        r.T_max_K = r.T_min_K + 60.0 * gsl_rng_uniform(g);
        double Ta = 200.0 + 400.0 * gsl_rng_uniform(g), Tb = 200.0 + 400.0 * gsl_rng_uniform(g);
        double margin = 10.0 * gsl_rng_uniform(g);
        double lo = Ta < Tb ? Ta : Tb, hi = Ta < Tb ? Tb : Ta;
        pw_range_check e[2], s;
        assert_int_equal(pw_fit_range_check_ends(&r, Ta, Tb, margin, e, &s), PW_OK);
        for (int i = 0; i < 2; i++) {
            const pw_component *c = &r.sys.comp[i];
            double below = lo < c->T_min_K ? c->T_min_K - lo : 0.0;
            double above = hi > c->T_max_K ? hi - c->T_max_K : 0.0;
            assert_true(s.below_K[i] == below && s.above_K[i] == above);
            double T[2] = {Ta, Tb};
            for (int k = 0; k < 2; k++) {
                assert_true(e[k].below_K[i] == (T[k] < c->T_min_K ? c->T_min_K - T[k] : 0.0));
                assert_true(e[k].above_K[i] == (T[k] > c->T_max_K ? T[k] - c->T_max_K : 0.0));
                assert_false(e[k].below_K[i] > 0.0 && e[k].above_K[i] > 0.0);
            }
        }
        bool out = lo < r.T_min_K - margin || hi > r.T_max_K + margin;
        assert_true(s.outside_data == out);
        pw_range_check c;
        assert_int_equal(pw_component_range_check(&r.sys.comp[0], &r.sys.comp[1], lo, hi, &c),
                         PW_OK);
        assert_true(memcmp(c.below_K, s.below_K, sizeof c.below_K) == 0);
        assert_true(memcmp(c.above_K, s.above_K, sizeof c.above_K) == 0);
    }
    gsl_rng_free(g);
}

static void azeotrope_range(void **state)
{
    (void)state;
    pw_az_result r, pts[3];
    memset(&r, 0, sizeof r);
    memset(pts, 0, sizeof pts);
    r.T_lo_K = 350.0;
    r.T_hi_K = 360.0;
    double lo, hi;
    assert_int_equal(pw_az_T_range(&r, NULL, &lo, &hi), PW_OK);
    assert_true(lo == 350.0 && hi == 360.0);
    pts[0].T_lo_K = 345.5, pts[0].T_hi_K = 355.0;
    pts[1].T_lo_K = NAN, pts[1].T_hi_K = NAN;
    pts[2].T_lo_K = 352.0, pts[2].T_hi_K = 372.25;
    pw_az_scan sc;
    memset(&sc, 0, sizeof sc);
    sc.points = pts;
    sc.n_points = 3;
    assert_int_equal(pw_az_T_range(&r, &sc, &lo, &hi), PW_OK);
    assert_true(lo == 345.5 && hi == 372.25);
    /* the single search without temperatures: the scan's alone */
    r.T_lo_K = r.T_hi_K = NAN;
    assert_int_equal(pw_az_T_range(&r, &sc, &lo, &hi), PW_OK);
    assert_true(lo == 345.5 && hi == 372.25);
    assert_int_equal(pw_az_T_range(&r, NULL, &lo, &hi), PW_EINVAL);
    sc.points = NULL;
    assert_int_equal(pw_az_T_range(&r, &sc, &lo, &hi), PW_EINVAL);
    assert_int_equal(pw_az_T_range(NULL, NULL, &lo, &hi), PW_EINVAL);
}

int main(void)
{
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(dataset_range),
        cmocka_unit_test(profile_range),
        cmocka_unit_test(components_only),
        cmocka_unit_test(data_margin),
        cmocka_unit_test(column_ends),
        cmocka_unit_test(random_against_definitions),
        cmocka_unit_test(azeotrope_range),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
