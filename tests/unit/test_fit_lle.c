/* Fitting with tie lines and three-phase points (fit --lle; src/fit/objective_het.c,
 * src/data/lle_data.c, src/data/three_phase_detect.c).
 *
 *  - the LLE file reader: columns in any order, the documented sigma_x default, swapped
 *    components, and errors naming file and line; mass-fraction columns converted with the
 *    molar masses;
 *  - the analytic Jacobian rows of three-phase points (isobaric and isothermal) and of tie lines
 *    against central differences (an identity of the implicit-function theorem);
 *  - a noise-free round trip on INVENTED data generated from a known NRTL set (the METHODS2 4.5
 *    1-butanol/water parameters): homogeneous bubble points, three-phase points and tie lines
 *    computed by the library; the fit recovers the parameters;
 *  - detection of the three-phase plateau in the shipped 1-butanol/water set, none in the
 *    homogeneous shipped sets; and Wilson refused with tie lines. */
#include "pw_test.h"

#include "fit/fit_internal.h"

#include <math.h>
#include <pinchwise/lle.h>
#include <pinchwise/lledata.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static pw_complib lib;

static void reader(void **state)
{
    (void)state;
    pw_lle_dataset d;
    pw_error err;
    const char *ok = "# components: 1-butanol, water\n# source: test\nx1_II,T[C],x1_I,note\n"
                     "0.488,25,0.019,a\n0.47,50,0.018,b\n";
    assert_int_equal(pw_lle_dataset_parse(ok, strlen(ok), "t.csv", &d, &err), PW_OK);
    assert_int_equal(d.n, 2);
    pw_assert_close(d.rows[0].T_K, 298.15, 0.0, 1e-12, "T in C");
    pw_assert_close(d.rows[0].x_I, 0.019, 0.0, 0.0, "x_I by header");
    assert_int_equal(d.rows[1].line, 5);
    pw_assert_close(d.sigma_x, PW_LLE_SIGMA_X_DEFAULT, 0.0, 0.0, "default sigma_x");
    assert_false(d.sigma_x_given);
    assert_true(isnan(d.P_Pa));
    pw_lle_dataset_swap(&d);
    assert_string_equal(d.names[0], "water");
    pw_assert_close(d.rows[0].x_I, 0.512, 0.0, 1e-15, "swapped x_I");
    pw_assert_close(d.rows[0].x_II, 0.981, 0.0, 1e-15, "swapped x_II");
    pw_lle_dataset_free(&d);
    /* a spreadsheet export: ';' fields and decimal commas, as dataset files accept */
    const char *semi = "# components: 1-butanol; water\nT[C];x1_I;x1_II\n25,5;0,019;0,488\n";
    assert_int_equal(pw_lle_dataset_parse(semi, strlen(semi), "s.csv", &d, &err), PW_OK);
    assert_int_equal(d.n, 1);
    pw_assert_close(d.rows[0].T_K, 298.65, 0.0, 1e-12, "T with a decimal comma");
    pw_assert_close(d.rows[0].x_I, 0.019, 0.0, 0.0, "x_I with a decimal comma");
    pw_assert_close(d.rows[0].x_II, 0.488, 0.0, 0.0, "x_II with a decimal comma");
    assert_string_equal(d.names[1], "water");
    pw_lle_dataset_free(&d);
    const char *sig = "# components: a, b\n# pressure: 1 bar\n# sigma_x: 0.002\nT[K],x1_I,x1_II\n"
                      "300,0.1,0.9\n";
    assert_int_equal(pw_lle_dataset_parse(sig, strlen(sig), "s.csv", &d, &err), PW_OK);
    pw_assert_close(d.sigma_x, 0.002, 0.0, 0.0, "given sigma_x");
    pw_assert_close(d.P_Pa, 1e5, 0.0, 1e-9, "pressure");
    pw_lle_dataset_free(&d);
    static const struct {
        const char *text;
        long line;
        const char *needle;
    } bad[] = {
        {"T[K],x1_I,x1_II\n300,0.1,0.9\n", 1, "components"},
        {"# components: a, b\nT[K],x1_I,x1_II\n300,0.1,0.9\n300,0.9,0.1\n", 4, "below"},
        {"# components: a, b\nT[K],x1_I\n300,0.1\n", 2, "x1_II"},
        {"# components: a, b\nT,x1_I,x1_II\n300,0.1,0.9\n", 2, "unit"},
        {"# components: a, b\nT[K],x1_I,x1_II\n300,0,0.9\n", 3, "between 0 and 1"},
        {"# components: a, b\nT[K],x1_I,x1_II\n300,abc,0.9\n", 3, "number"},
        {"# components: a, b\nT[K],x1_I,x1_II\n", 0, "no tie lines"},
    };
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++) {
        pw_error_clear(&err);
        assert_int_not_equal(pw_lle_dataset_parse(bad[i].text, strlen(bad[i].text), "b.csv", &d,
                                                  &err),
                             PW_OK);
        assert_int_equal(err.line, bad[i].line);
        if (!strstr(err.msg, bad[i].needle))
            fail_msg("case %zu: message '%s' lacks '%s'", i, err.msg, bad[i].needle);
        assert_string_equal(err.file, "b.csv");
    }
}

/* Tie lines as mass fractions (w1_I, w1_II): read as such, converted by
 * pw_fit_attach_tie_lines_ex with the components' molar masses, x1 = (w1/M1) / (w1/M1 +
 * (1 - w1)/M2) written out here, in either component order of the dataset. */
static void mass_fractions(void **state)
{
    (void)state;
    pw_lle_dataset d;
    pw_error err;
    const char *w = "# components: 1-butanol, water\nT[C],w1_II,w1_I\n25,0.796,0.073\n";
    assert_int_equal(pw_lle_dataset_parse(w, strlen(w), "w.csv", &d, &err), PW_OK);
    assert_true(d.mass);
    assert_int_equal(d.header_line, 2);
    const pw_component *bu = pw_complib_find(&lib, "1-butanol"), *wa = pw_complib_find(&lib, "water");
    assert_non_null(bu);
    assert_non_null(wa);
    double M1 = bu->prop[PW_PROP_M], M2 = wa->prop[PW_PROP_M];
    assert_true(M1 > 0.0 && M2 > 0.0);
    double xI = (0.073 / M1) / (0.073 / M1 + 0.927 / M2);
    double xII = (0.796 / M1) / (0.796 / M1 + 0.204 / M2);
    pw_dataset ds;
    memset(&ds, 0, sizeof ds);
    snprintf(ds.path, sizeof ds.path, "%s", "vle.csv");
    for (int order = 0; order < 2; order++) {
        snprintf(ds.names[0], sizeof ds.names[0], "%s", order ? "water" : "1-butanol");
        snprintf(ds.names[1], sizeof ds.names[1], "%s", order ? "1-butanol" : "water");
        const pw_component *c1 = order ? wa : bu, *c2 = order ? bu : wa;
        pw_fit_options fo = pw_fit_default_options();
        pw_tie_line *copy = NULL;
        assert_int_equal(pw_fit_attach_tie_lines_ex(&d, &ds, c1, c2, &fo, &copy, &err), PW_OK);
        assert_non_null(copy);
        assert_true(fo.tie_lines == copy && fo.n_tie_lines == 1);
        pw_assert_close(copy[0].x_I, order ? 1.0 - xII : xI, 1e-14, 0.0, "lean layer, mole");
        pw_assert_close(copy[0].x_II, order ? 1.0 - xI : xII, 1e-14, 0.0, "rich layer, mole");
        pw_assert_close(copy[0].T_K, 298.15, 0.0, 1e-12, "T");
        free(copy);
        /* without the components: refused, naming the header line */
        assert_int_equal(pw_fit_attach_tie_lines(&d, &ds, &fo, &copy, &err), PW_EINVAL);
        assert_null(copy);
        assert_int_equal(err.line, 2);
        assert_non_null(strstr(err.msg, "mass fractions"));
        /* a component without a molar mass: refused, naming it */
        pw_component nom = *c1;
        nom.prop[PW_PROP_M] = NAN;
        assert_int_equal(pw_fit_attach_tie_lines_ex(&d, &ds, &nom, c2, &fo, &copy, &err),
                         PW_ENOTFOUND);
        assert_null(copy);
        assert_string_equal(err.file, "w.csv");
        assert_non_null(strstr(err.msg, "molar mass"));
    }
    pw_lle_dataset_free(&d);
    /* mole fractions in the dataset's order: no copy */
    const char *x = "# components: 1-butanol, water\nT[C],x1_I,x1_II\n25,0.019,0.488\n";
    assert_int_equal(pw_lle_dataset_parse(x, strlen(x), "x.csv", &d, &err), PW_OK);
    assert_false(d.mass);
    snprintf(ds.names[0], sizeof ds.names[0], "%s", "1-butanol");
    snprintf(ds.names[1], sizeof ds.names[1], "%s", "water");
    pw_fit_options fo = pw_fit_default_options();
    pw_tie_line *copy = NULL;
    assert_int_equal(pw_fit_attach_tie_lines_ex(&d, &ds, bu, wa, &fo, &copy, &err), PW_OK);
    assert_null(copy);
    assert_true(fo.tie_lines == d.rows);
    pw_lle_dataset_free(&d);
    /* both kinds in one header, and percent instead of fractions */
    const char *mixed = "# components: a, b\nT[K],x1_I,w1_II\n300,0.1,0.9\n";
    assert_int_not_equal(pw_lle_dataset_parse(mixed, strlen(mixed), "m.csv", &d, &err), PW_OK);
    assert_int_equal(err.line, 2);
    assert_non_null(strstr(err.msg, "keep one"));
    const char *pct = "# components: a, b\nT[K],w1_I,w1_II\n300,7.3,79.6\n";
    assert_int_not_equal(pw_lle_dataset_parse(pct, strlen(pct), "p.csv", &d, &err), PW_OK);
    assert_int_equal(err.line, 3);
    assert_non_null(strstr(err.msg, "mass percent"));
}

static pw_system butanol_water(void)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *pw_complib_find(&lib, "1-butanol");
    s.comp[1] = *pw_complib_find(&lib, "water");
    s.model = &pw_model_nrtl;
    s.params[0] = 360.0; /* METHODS2 4.5: not a published set */
    s.params[1] = 1296.0;
    s.params[2] = 0.47;
    s.T_ref_K = 365.0;
    return s;
}

/* Central-difference check of every row of J. */
static void check_jacobian(const fit_problem *fp, const char *what)
{
    size_t n = fp->n_res, p = fp->n_fit;
    double *f = calloc(n, sizeof *f), *J = calloc(n * p, sizeof *J);
    double *fa = calloc(n, sizeof *fa), *fb = calloc(n, sizeof *fb);
    double params[PW_MAX_PARAMS], u[PW_MAX_PARAMS];
    for (size_t j = 0; j < p; j++)
        u[j] = fp->sys.params[fp->idx[j]] / fp->scale[j];
    fit_unpack(fp, u, params);
    assert_int_equal(fit_eval(fp, params, f, J), PW_OK);
    for (size_t j = 0; j < p; j++) {
        double h = 1e-5 * fmax(1.0, fabs(u[j])), ua[PW_MAX_PARAMS], ub[PW_MAX_PARAMS];
        memcpy(ua, u, sizeof ua);
        memcpy(ub, u, sizeof ub);
        ua[j] += h;
        ub[j] -= h;
        double pa[PW_MAX_PARAMS], pb[PW_MAX_PARAMS];
        fit_unpack(fp, ua, pa);
        fit_unpack(fp, ub, pb);
        assert_int_equal(fit_eval(fp, pa, fa, NULL), PW_OK);
        assert_int_equal(fit_eval(fp, pb, fb, NULL), PW_OK);
        for (size_t i = 0; i < n; i++) {
            double fd = (fa[i] - fb[i]) / (2.0 * h);
            if (fabs(fd - J[i * p + j]) > 2e-5 * fmax(1.0, fabs(fd)))
                fail_msg("%s: row %zu, parameter %zu: analytic %.10g, central difference %.10g",
                         what, i, j, J[i * p + j], fd);
        }
    }
    free(f);
    free(J);
    free(fa);
    free(fb);
}

static void jacobian(void **state)
{
    (void)state;
    pw_system s = butanol_water();
    pw_point pts[3] = {{0.005, 0.10, 368.0, 101325.0, 1}, {0.2, 0.24, 365.8, 101325.0, 2},
                       {0.7, 0.32, 375.0, 101325.0, 3}};
    bool tp[3] = {false, true, false};
    pw_tie_line ties[2] = {{300.0, 0.007, 0.37, 4}, {340.0, 0.012, 0.39, 5}};
    fit_problem fp;
    memset(&fp, 0, sizeof fp);
    fp.sys = s;
    fp.objective = PW_OBJ_TXY;
    fp.pts = pts;
    fp.n_pts = 3;
    fp.idx[0] = 0;
    fp.idx[1] = 1;
    fp.scale[0] = fp.scale[1] = 100.0;
    fp.n_fit = 2;
    fp.sigma_T_K = 0.1;
    fp.sigma_y = 0.005;
    fp.sigma_P_rel = 1e-3;
    fp.sigma_P_abs_Pa = NAN;
    fp.P_fixed_Pa = 101325.0;
    fp.T_fixed_K = NAN;
    fp.three_phase = tp;
    fp.T3_guess_K = 365.8;
    fp.ties = ties;
    fp.n_ties = 2;
    fp.sigma_x_lle = 0.005;
    fp.n_res = 3 * 2 + 2 * 2;
    check_jacobian(&fp, "isobaric, three-phase point and tie lines");
    /* a one-liquid point inside the layers (x1 = 0.3; layers 0.019 / 0.388 at T3): scored, with
     * its Jacobian rows, by the three-phase state, as the three-phase point beside it */
    pw_point pin[3] = {{0.005, 0.10, 368.0, 101325.0, 1}, {0.2, 0.24, 365.8, 101325.0, 2},
                       {0.3, 0.26, 366.4, 101325.0, 3}};
    fp.pts = pin;
    fp.n_ties = 0;
    fp.n_res = 3 * 2;
    check_jacobian(&fp, "isobaric, one-liquid point inside the layers");
    {
        double f[6], J[12];
        assert_int_equal(fit_eval(&fp, fp.sys.params, f, J), PW_OK);
        pw_three_phase t3;
        assert_int_equal(pw_three_phase_at_P(&fp.sys, 101325.0, &t3), PW_OK);
        assert_true(t3.exists && t3.x[0] < 0.3 && 0.3 < t3.x[1]);
        pw_assert_close(f[4], (t3.T_K - 366.4) / 0.1, 0.0, 1e-7, "T residual from T3");
        pw_assert_close(f[5], (t3.y1 - 0.26) / 0.005, 0.0, 1e-7, "y residual from y3");
        for (int k = 0; k < 4; k++) /* the same rows as the three-phase point's */
            pw_assert_close(J[8 + k], J[4 + k], 0.0, 1e-12, "rows of the point inside");
    }
    fp.pts = pts;
    /* isothermal three-phase point */
    pw_point q[2] = {{0.2, 0.25, 350.0, 40000.0, 1}, {0.8, 0.3, 350.0, 30000.0, 2}};
    bool tq[2] = {true, false};
    fp.objective = PW_OBJ_PXY;
    fp.pts = q;
    fp.n_pts = 2;
    fp.three_phase = tq;
    fp.P_fixed_Pa = NAN;
    fp.T_fixed_K = 350.0;
    fp.n_ties = 0;
    fp.n_res = 4;
    check_jacobian(&fp, "isothermal three-phase point");
    /* isothermal, a one-liquid point inside the layers (x1 = 0.3 at 350 K): P3 and y3 */
    pw_point qin[3] = {{0.2, 0.25, 350.0, 40000.0, 1}, {0.8, 0.3, 350.0, 30000.0, 2},
                       {0.3, 0.26, 350.0, 41000.0, 3}};
    bool tqin[3] = {true, false, false};
    fp.pts = qin;
    fp.n_pts = 3;
    fp.three_phase = tqin;
    fp.n_res = 6;
    check_jacobian(&fp, "isothermal, one-liquid point inside the layers");
    {
        double f[6], J[12];
        assert_int_equal(fit_eval(&fp, fp.sys.params, f, J), PW_OK);
        pw_three_phase t3;
        assert_int_equal(pw_three_phase_at_T(&fp.sys, 350.0, &t3), PW_OK);
        assert_true(t3.exists && t3.x[0] < 0.3 && 0.3 < t3.x[1] && t3.x[1] < 0.8);
        pw_assert_close(f[4], (t3.P_Pa - 41000.0) / (1e-3 * 41000.0), 0.0, 1e-7, "P residual from P3");
        pw_assert_close(f[5], (t3.y1 - 0.26) / 0.005, 0.0, 1e-7, "y residual from y3");
    }
}

static void round_trip(void **state)
{
    (void)state;
    pw_system s = butanol_water();
    const double P = 101325.0;
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&s, P, &tp), PW_OK);
    assert_true(tp.exists);
    /* INVENTED noise-free data from the known set */
    static const double xs[] = {0.002, 0.006, 0.012, 0.5, 0.6, 0.7, 0.8, 0.9, 0.95};
    pw_point pts[16];
    size_t n = 0;
    for (size_t i = 0; i < sizeof xs / sizeof xs[0]; i++) {
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(&s, P, xs[i], &e), PW_OK);
        pts[n] = (pw_point){xs[i], e.y1, e.T_K, P, (long)(10 + n)};
        n++;
    }
    static const double x3[] = {0.05, 0.15, 0.3};
    for (size_t i = 0; i < 3; i++) {
        pts[n] = (pw_point){x3[i], tp.y1, tp.T_K, P, (long)(10 + n)};
        n++;
    }
    pw_tie_line ties[3];
    static const double Tt[] = {300.0, 330.0, 355.0};
    for (size_t i = 0; i < 3; i++) {
        pw_lle_result r;
        assert_int_equal(pw_lle_solve(&s, Tt[i], &r), PW_OK);
        ties[i] = (pw_tie_line){Tt[i], r.x[0], r.x[1], (long)(2 + i)};
    }
    pw_dataset ds;
    memset(&ds, 0, sizeof ds);
    snprintf(ds.path, sizeof ds.path, "invented.csv");
    snprintf(ds.names[0], sizeof ds.names[0], "1-butanol");
    snprintf(ds.names[1], sizeof ds.names[1], "water");
    ds.kind = PW_DATA_ISOBARIC;
    ds.P_fixed_Pa = P;
    ds.T_fixed_K = NAN;
    ds.has_y = true;
    ds.sigma_T_K = 0.1;
    ds.sigma_P_rel = 1e-3;
    ds.sigma_P_abs_Pa = NAN;
    ds.sigma_y = 0.005;
    ds.sigma_x = 0.001;
    ds.pts = pts;
    ds.n = n;
    pw_fit_options o = pw_fit_default_options();
    o.alpha = 0.47;
    o.tie_lines = ties;
    o.n_tie_lines = 3;
    o.n_starts = 8;
    pw_fit_result r;
    pw_error err;
    assert_int_equal(pw_fit_run(&ds, &s.comp[0], &s.comp[1], &pw_model_nrtl, &o, &r, &err), PW_OK);
    assert_true(r.converged);
    assert_int_equal(r.n_three_phase, 3);
    assert_int_equal(r.n_tie_lines, 3);
    pw_assert_close(r.sys.params[0], 360.0, 1e-5, 0.0, "b12 recovered");
    pw_assert_close(r.sys.params[1], 1296.0, 1e-5, 0.0, "b21 recovered");
    assert_true(r.aad_x_lle < 1e-7);
    pw_assert_close(r.dev_T_K.aad, 0.0, 0.0, 1e-6, "T deviations");
    /* T_ref stays the mean T of the VLE data */
    double Tm = 0.0;
    for (size_t i = 0; i < n; i++)
        Tm += pts[i].T_K / (double)n;
    pw_assert_close(r.sys.T_ref_K, Tm, 1e-14, 0.0, "T_ref = mean VLE T");
    for (size_t i = 0; i < n; i++)
        assert_true(r.pts[i].three_phase == (i >= 9));
    pw_fit_result_free(&r);
    /* Wilson cannot split: refused with tie lines */
    pw_error_clear(&err);
    assert_int_equal(pw_fit_run(&ds, &s.comp[0], &s.comp[1], &pw_model_wilson, &o, &r, &err),
                     PW_EINVAL);
    assert_non_null(strstr(err.msg, "cannot"));
}

static void detection(void **state)
{
    (void)state;
    static const struct {
        const char *file;
        size_t want;
    } sets[] = {
        {"datasets/butanol_water_1atm.csv", 7}, /* the plateau at 365.85-366.15 K, y1 0.242-0.252 */
        {"datasets/butanol_water_25C.csv", 2},  /* the two rows at 3.716 kPa */
        {"datasets/ethanol_water_1atm.csv", 0}, {"datasets/methanol_water_1atm.csv", 0},
        {"datasets/mek_toluene_50C_pxy.csv", 0}, {"datasets/demo_acetone_water.csv", 0},
    };
    for (size_t k = 0; k < sizeof sets / sizeof sets[0]; k++) {
        char path[1024];
        pw_dataset ds;
        pw_error err;
        pw_test_path(path, sizeof path, sets[k].file);
        assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
        bool *flags = calloc(ds.n, sizeof *flags);
        size_t got = pw_three_phase_detect(ds.pts, ds.n, ds.kind == PW_DATA_ISOBARIC, ds.has_y,
                                           ds.sigma_T_K, ds.sigma_P_rel, ds.sigma_y, flags);
        if (got != sets[k].want)
            fail_msg("%s: %zu three-phase points, expected %zu", sets[k].file, got, sets[k].want);
        free(flags);
        pw_dataset_free(&ds);
    }
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
        cmocka_unit_test(reader),
        cmocka_unit_test(mass_fractions),
        cmocka_unit_test(jacobian),
        cmocka_unit_test(round_trip),
        cmocka_unit_test(detection),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
