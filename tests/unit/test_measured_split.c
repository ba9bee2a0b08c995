/* Two liquids that the data show but the model cannot represent (docs/heterogeneous.md section 3,
 * "Two liquids the model cannot represent"), and the range check every command renders.
 *  - pw_fit_measured_split: the points flagged three_phase (left out or not), their x range and
 *    mean condition; the shipped 1-butanol/water set at 1 atm (Stockhardt & Hull 1931) fitted by
 *    Wilson's equation records its seven three-phase points (x1 0.018 to 0.448, the plateau at
 *    365.85-366.15 K; the same seven test_fit_lle.c finds), also after a write and a read of the
 *    fit file.
 *  - pw_column_solve_system with a model that cannot split: seeded random targets and measured
 *    ranges, refused exactly when the targets' closed interval meets the range (an independent
 *    interval test written here), and otherwise the same answer, to the bit, as without the
 *    measured range; pw_screen_run calls such a split infeasible with its own reason.
 *  - pw_fit_range_check against hand-computed distances from the ranges; pw_decanter_solve's
 *    temperatures are the three-phase temperature and the bottoms' bubble points, computed here
 *    independently with pw_bubble_T.
 * Systems: invented components of constant relative volatility 3 (tests/unit/design_systems.h);
 * Wilson with Lambda12 = Lambda21 = 1 is the ideal solution (Wilson 1964). */
#include "design_systems.h"

#include <pinchwise/decanter.h>
#include <pinchwise/fit.h>
#include <pinchwise/lle.h>
#include <pinchwise/screen.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#define P_PA 101325.0

static pw_complib lib;

static pw_system wilson_ideal(void)
{
    pw_system s = design_ideal_system(3.0);
    s.model = &pw_model_wilson;
    s.params[0] = s.params[1] = 0.0; /* Lambda_ij = exp(-dl_ij/T) = 1: the ideal solution */
    s.params[2] = 1.0;
    assert_int_equal(s.model->check(s.params), PW_OK);
    return s;
}

static pw_measured_split range(double lo, double hi)
{
    pw_measured_split m = {.n = 5, .x_lo = lo, .x_hi = hi, .T_K = 366.0, .P_Pa = P_PA};
    return m;
}

/* a small seeded generator (no global state) */
static double unif(unsigned long long *s)
{
    *s = *s * 6364136223846793005ULL + 1442695040888963407ULL;
    return (double)(*s >> 11) / 9007199254740992.0;
}

static void measured_from_points(void **state)
{
    (void)state;
    pw_fit_result r;
    memset(&r, 0, sizeof r);
    pw_fit_point pts[5];
    memset(pts, 0, sizeof pts);
    const double x[5] = {0.01, 0.2, 0.3, 0.25, 0.9};
    const double T[5] = {370.0, 366.0, 366.2, 365.9, 380.0};
    for (int i = 0; i < 5; i++) {
        pts[i].meas.x1 = x[i];
        pts[i].meas.T_K = T[i];
        pts[i].meas.P_Pa = P_PA;
    }
    r.pts = pts;
    r.n_pts = 5;
    pw_measured_split m = pw_fit_measured_split(&r);
    assert_int_equal(m.n, 0); /* none flagged */
    pts[1].three_phase = pts[2].three_phase = pts[3].three_phase = true;
    pts[2].excluded = true; /* left out by a model that cannot split: still measured */
    m = pw_fit_measured_split(&r);
    assert_int_equal(m.n, 3);
    assert_true(m.x_lo == 0.2 && m.x_hi == 0.3);
    pw_assert_close(m.T_K, (366.0 + 366.2 + 365.9) / 3.0, 1e-15, 0, "mean T");
    pw_assert_close(m.P_Pa, P_PA, 1e-15, 0, "mean P");
    r.pts = NULL;
    r.n_pts = 0;
    m = pw_fit_measured_split(&r);
    assert_int_equal(m.n, 0);
}

static void overlap_edges(void **state)
{
    (void)state;
    pw_measured_split m = range(0.2, 0.4);
    assert_true(pw_measured_split_overlaps(&m, 0.1, 0.9)); /* both sides */
    assert_true(pw_measured_split_overlaps(&m, 0.9, 0.1)); /* either order */
    assert_true(pw_measured_split_overlaps(&m, 0.25, 0.3)); /* inside */
    assert_true(pw_measured_split_overlaps(&m, 0.3, 0.9));  /* one inside */
    assert_true(pw_measured_split_overlaps(&m, 0.4, 0.9));  /* at a measured point */
    assert_true(pw_measured_split_overlaps(&m, 0.01, 0.2));
    assert_false(pw_measured_split_overlaps(&m, 0.41, 0.9));
    assert_false(pw_measured_split_overlaps(&m, 0.01, 0.19));
    m.n = 0;
    assert_false(pw_measured_split_overlaps(&m, 0.1, 0.9));
    pw_system s = wilson_ideal();
    assert_false(pw_system_split_unmodelled(&s));
    s.measured = range(0.2, 0.4);
    assert_true(pw_system_split_unmodelled(&s));
    s.model = &pw_model_nrtl; /* a model that can split answers with its own layers */
    assert_false(pw_system_split_unmodelled(&s));
}

static void column_refused_exactly_on_overlap(void **state)
{
    (void)state;
    pw_system s = wilson_ideal();
    pw_system plain = s;
    s.measured = range(0.3, 0.45);
    /* the case of the brief: targets on both sides, the reason names range, model and remedy */
    pw_column_spec across = {.xd = 0.95, .xb = 0.02, .zf = 0.5, .q = 1};
    pw_column_result col;
    assert_int_equal(pw_column_solve_system(&s, P_PA, &across, NULL, &col, NULL, NULL), PW_OK);
    assert_false(col.feasible);
    assert_true(col.measured_split);
    assert_true(isnan(col.r_min) && isnan(col.n_min));
    assert_non_null(strstr(col.reason, "two liquids between x1 = 0.3 and 0.45"));
    assert_non_null(strstr(col.reason, "wilson model cannot represent"));
    assert_non_null(strstr(col.reason, "nrtl"));
    assert_non_null(strstr(col.reason, "fit --lle"));
    assert_non_null(strstr(col.reason, "decanter"));
    /* without the measured range the same targets are an easy split */
    assert_int_equal(pw_column_solve_system(&plain, P_PA, &across, NULL, &col, NULL, NULL), PW_OK);
    assert_true(col.feasible);
    assert_false(col.measured_split);

    unsigned long long seed = 20261203ULL;
    size_t refused = 0, solved = 0;
    for (int k = 0; k < 120; k++) {
        double a = 0.02 + 0.96 * unif(&seed), b = 0.02 + 0.96 * unif(&seed);
        double lo = 0.05 + 0.8 * unif(&seed), hi = lo + 0.15 * unif(&seed);
        if (fabs(a - b) < 0.02)
            continue;
        s.measured = range(lo, hi);
        pw_column_spec sp = {.xd = fmax(a, b), .xb = fmin(a, b), .q = 1};
        if (k % 2) { /* component 1 to the bottoms */
            sp.xd = fmin(a, b);
            sp.xb = fmax(a, b);
        }
        sp.zf = 0.5 * (a + b);
        /* independent: two closed intervals meet unless one ends before the other begins */
        bool meets = !(fmax(a, b) < lo || fmin(a, b) > hi);
        pw_column_result got, ref;
        assert_int_equal(pw_column_solve_system(&s, P_PA, &sp, NULL, &got, NULL, NULL), PW_OK);
        if (meets != got.measured_split || (meets && got.feasible))
            fail_msg("targets %g, %g against [%g, %g]: meets %d, feasible %d", sp.xb, sp.xd, lo, hi,
                     meets, got.feasible);
        if (meets) {
            refused++;
            continue;
        }
        /* clear of the range: exactly the answer without it (component 1, the lighter one,
         * sent to the bottoms is refused there for its own reason) */
        solved++;
        assert_int_equal(pw_column_solve_system(&plain, P_PA, &sp, NULL, &ref, NULL, NULL), PW_OK);
        assert_int_equal(got.feasible, ref.feasible);
        assert_string_equal(got.reason, ref.reason);
        assert_true(ref.feasible == (sp.xd > sp.xb));
        if (ref.feasible)
            assert_true(got.r_min == ref.r_min && got.n_min == ref.n_min);
    }
    if (refused < 20 || solved < 20)
        fail_msg("draw too one-sided: %zu refused, %zu solved", refused, solved);
}

static bool has_code(const pw_screen_result *r, pw_screen_reason_code c)
{
    for (size_t i = 0; i < r->n_reasons; i++)
        if (r->reasons[i].code == c)
            return true;
    return false;
}

static void screen_not_feasible(void **state)
{
    (void)state;
    pw_system s = wilson_ideal();
    pw_screen_options o = pw_screen_default_options();
    pw_screen_result *r = malloc(sizeof *r);
    assert_non_null(r);
    assert_int_equal(pw_screen_run(&s, P_PA, 0.95, 0.02, NAN, &o, r), PW_OK);
    assert_int_equal(r->verdict, PW_VERDICT_FEASIBLE);
    assert_false(r->measured_split);
    s.measured = range(0.3, 0.45);
    assert_int_equal(pw_screen_run(&s, P_PA, 0.95, 0.02, NAN, &o, r), PW_OK);
    assert_int_equal(r->verdict, PW_VERDICT_INFEASIBLE);
    assert_true(r->measured_split);
    assert_true(has_code(r, PW_REASON_TWO_LIQUIDS));
    assert_false(has_code(r, PW_REASON_EASY)); /* no "volatility ok" beside the refusal */
    assert_string_equal(pw_screen_reason_key(PW_REASON_TWO_LIQUIDS), "two-liquids-unmodelled");
    /* a split that stays clear of the measured range is screened as before */
    assert_int_equal(pw_screen_run(&s, P_PA, 0.25, 0.02, NAN, &o, r), PW_OK);
    assert_int_equal(r->verdict, PW_VERDICT_FEASIBLE);
    assert_false(r->measured_split);
    free(r);
}

static void range_check(void **state)
{
    (void)state;
    pw_fit_result r;
    memset(&r, 0, sizeof r);
    r.sys.comp[0] = pw_test_antoine("a (invented)", 14.0, 3000.0, -50.0, PW_LN, "kPa", "K", 300.0,
                                    400.0);
    r.sys.comp[1] = pw_test_antoine("b (invented)", 14.0, 3000.0, -50.0, PW_LN, "kPa", "K", 320.0,
                                    450.0);
    r.T_min_K = 340.0;
    r.T_max_K = 360.0;
    pw_range_check c;
    assert_int_equal(pw_fit_range_check(&r, 345.0, 355.0, &c), PW_OK);
    assert_false(pw_range_check_any(&c));
    /* the margin of PW_RANGE_DATA_MARGIN_K on the data range */
    assert_int_equal(pw_fit_range_check(&r, 339.5, 360.9, &c), PW_OK);
    assert_false(c.outside_data);
    assert_int_equal(pw_fit_range_check(&r, 345.0, 361.5, &c), PW_OK);
    assert_true(c.outside_data && pw_range_check_any(&c));
    assert_true(c.data_T_min_K == 340.0 && c.data_T_max_K == 360.0);
    /* 310 K: 10 K below b's range, inside a's; 420 K: 20 K above a's, inside b's */
    assert_int_equal(pw_fit_range_check(&r, 310.0, 420.0, &c), PW_OK);
    pw_assert_close(c.below_K[0], 0.0, 0, 0, "a below");
    pw_assert_close(c.below_K[1], 10.0, 0, 1e-12, "b below");
    pw_assert_close(c.above_K[0], 20.0, 0, 1e-12, "a above");
    pw_assert_close(c.above_K[1], 0.0, 0, 0, "b above");
    assert_true(c.outside_data);
    /* one temperature (the decanter at 5 MPa, say) far above both */
    assert_int_equal(pw_fit_range_check(&r, 518.6, 518.6, &c), PW_OK);
    pw_assert_close(c.above_K[0], 118.6, 0, 1e-9, "a above");
    pw_assert_close(c.above_K[1], 68.6, 0, 1e-9, "b above");
    /* unknown data range: no data warning */
    r.T_min_K = r.T_max_K = NAN;
    assert_int_equal(pw_fit_range_check(&r, 345.0, 600.0, &c), PW_OK);
    assert_false(c.outside_data);
    assert_int_equal(pw_fit_range_check(&r, NAN, 350.0, &c), PW_EINVAL);
    assert_int_equal(pw_fit_range_check(&r, 360.0, 350.0, &c), PW_EINVAL);
    assert_int_equal(pw_fit_range_check(NULL, 340.0, 350.0, &c), PW_EINVAL);
}

static void decanter_temperatures(void **state)
{
    (void)state;
    /* Margules A = 2.4 splits (A > 2), as in test_column_two_liquids.c */
    pw_system s = design_ideal_system(3.0);
    s.params[0] = s.params[1] = 2.4;
    pw_decanter_spec sp = {.P_Pa = P_PA, .zf = 0.5, .q = 1.0, .x_rich = 0.995, .x_lean = 0.005};
    pw_decanter_result *d = malloc(sizeof *d);
    assert_non_null(d);
    assert_int_equal(pw_decanter_solve(&s, &sp, NULL, d), PW_OK);
    assert_true(d->feasible);
    pw_eq_point e0, e1;
    assert_int_equal(pw_bubble_T(&s, P_PA, sp.x_rich, &e0), PW_OK);
    assert_int_equal(pw_bubble_T(&s, P_PA, sp.x_lean, &e1), PW_OK);
    double lo = fmin(d->decanter.T_K, fmin(e0.T_K, e1.T_K));
    double hi = fmax(d->decanter.T_K, fmax(e0.T_K, e1.T_K));
    assert_true(d->T_lo_K == lo && d->T_hi_K == hi);
    /* the decanter boils lowest (a heterogeneous azeotrope is minimum-boiling) */
    assert_true(d->T_lo_K == d->decanter.T_K);
    /* an impossible specification still reports the decanter's temperature */
    pw_decanter_spec bad = sp;
    bad.x_rich = 0.5 * (d->decanter.x[0] + d->decanter.x[1]);
    assert_int_equal(pw_decanter_solve(&s, &bad, NULL, d), PW_OK);
    assert_false(d->feasible);
    assert_true(d->T_lo_K == d->decanter.T_K && d->T_hi_K == d->decanter.T_K);
    /* a model that cannot split: no temperatures */
    pw_system w = wilson_ideal();
    assert_int_equal(pw_decanter_solve(&w, &sp, NULL, d), PW_OK);
    assert_false(d->feasible);
    assert_true(isnan(d->T_lo_K) && isnan(d->T_hi_K));
    free(d);
}

/* The shipped data, fitted by Wilson's equation: the seven three-phase points are left out, yet
 * recorded; the fit file keeps them. */
static void wilson_fit_records_the_plateau(void **state)
{
    (void)state;
    char path[1024];
    pw_dataset ds;
    pw_error err;
    pw_test_path(path, sizeof path, "datasets/butanol_water_1atm.csv");
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    const pw_component *a = pw_complib_find(&lib, "1-butanol"), *b = pw_complib_find(&lib, "water");
    assert_non_null(a);
    assert_non_null(b);
    pw_fit_options o = pw_fit_default_options();
    pw_fit_result r;
    assert_int_equal(pw_fit_run(&ds, a, b, &pw_model_wilson, &o, &r, &err), PW_OK);
    size_t flagged = 0;
    for (size_t i = 0; i < r.n_pts; i++)
        if (r.pts[i].three_phase) {
            flagged++;
            assert_true(r.pts[i].excluded);
        }
    assert_int_equal(flagged, 7);
    const pw_measured_split *m = &r.sys.measured;
    assert_int_equal(m->n, 7);
    assert_true(m->x_lo == 0.018 && m->x_hi == 0.448);
    /* the data file's plateau: 365.95, 366.15, 365.85, 365.95, 366.05, 366.05, 366.05 K */
    pw_assert_close(m->T_K, 2562.05 / 7.0, 1e-12, 0, "plateau T");
    assert_true(pw_system_split_unmodelled(&r.sys));
    char tmpl[] = "/tmp/pw_measured_XXXXXX";
    int fd = mkstemp(tmpl);
    assert_true(fd >= 0);
    close(fd);
    unlink(tmpl);
    assert_int_equal(pw_fitfile_write(tmpl, &r, false, &err), PW_OK);
    pw_fit_result back;
    assert_int_equal(pw_fitfile_read(tmpl, &back, &err), PW_OK);
    unlink(tmpl);
    assert_int_equal(back.n_three_phase, 7);
    assert_int_equal(back.sys.measured.n, 7);
    assert_true(back.sys.measured.x_lo == m->x_lo && back.sys.measured.x_hi == m->x_hi);
    pw_assert_close(back.sys.measured.T_K, m->T_K, 1e-15, 0, "plateau T after reading");
    assert_true(pw_system_split_unmodelled(&back.sys));
    pw_fit_result_free(&back);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
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
        cmocka_unit_test(measured_from_points),
        cmocka_unit_test(overlap_edges),
        cmocka_unit_test(column_refused_exactly_on_overlap),
        cmocka_unit_test(screen_not_feasible),
        cmocka_unit_test(range_check),
        cmocka_unit_test(decanter_temperatures),
        cmocka_unit_test(wilson_fit_records_the_plateau),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
