/* Derived data never stale: a fit file read with replaced components (pw_fitfile_load,
 * pw_fit_replace_components) gives the same per-point values as a system built from scratch
 * with those components and the fitted parameters, including the fixed parameters taken from
 * component data (Wilson's V2_V1 from V_L, UNIQUAC's r and q). The data and the replacement
 * constants are invented; the Antoine constants of the fits are Smith, Van Ness & Abbott,
 * 7th ed., Table B.2 (methanol from memory). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

static char dir[64];

static int setup(void **state)
{
    (void)state;
    snprintf(dir, sizeof dir, "/tmp/pw_fitcomp_XXXXXX");
    return mkdtemp(dir) ? 0 : -1;
}

static void path_in(char *buf, size_t n, const char *name)
{
    snprintf(buf, n, "%s/%s", dir, name);
}

static void write_text(const char *path, const char *text)
{
    FILE *f = fopen(path, "w");
    assert_non_null(f);
    fputs(text, f);
    assert_int_equal(fclose(f), 0);
}

static pw_component comp(const char *name, double A, double B, double C, double V_L, double r,
                         double q)
{
    pw_component c = pw_test_antoine(name, A, B, C, PW_LN, "kPa", "C", 250.0, 450.0);
    c.V_L_cm3mol = V_L;
    c.prop[PW_PROP_R] = r;
    c.prop[PW_PROP_Q] = q;
    return c;
}

/* methanol and water: V_L near 25 C (CRC, from memory), r and q of Abrams & Prausnitz (1975)
 * (from memory; the shipped library's values) */
static pw_component methanol(void)
{
    return comp("methanol", 16.5785, 3638.27, 239.500, 40.73, 1.4311, 1.432);
}
static pw_component water(void)
{
    return comp("water", 16.3872, 3885.70, 230.170, 18.07, 0.92, 1.40);
}

/* Replacement rows (invented): methanol's Antoine A and every constant changed, water's
 * correlation unchanged but its V_L, r and q changed. */
static const char *const REPLACEMENT =
    "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,V_L,r,q\n"
    "Methanol,16.61,3638.27,239.500,ln,kPa,C,-20,180,invented,42.5,1.52,1.47\n"
    "water,16.3872,3885.70,230.170,ln,kPa,C,0,200,invented,18.3,0.95,1.36\n";
/* The same without r and q. */
static const char *const REPLACEMENT_NO_RQ =
    "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source,V_L\n"
    "methanol,16.61,3638.27,239.500,ln,kPa,C,-20,180,invented,42.5\n";

/* Vapor pressures only (no constants): what a row does not state stays the fit file's own. */
static const char *const REPLACEMENT_PSAT_ONLY =
    "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source\n"
    "methanol,16.61,3638.27,239.500,ln,kPa,C,-20,180,invented\n";


/* Fits model to invented data of c1, c2 and writes the fit file; returns its path in buf. */
static void fit_file(const pw_model_type *m, const double *truth, const pw_fit_options *o,
                     const char *name, char *buf, size_t n)
{
    pw_component c1 = methanol(), c2 = water();
    pw_system s = {.comp = {c1, c2}, .model = m, .T_ref_K = 350.0};
    memcpy(s.params, truth, sizeof s.params);
    pw_dataset ds;
    pw_test_invented_isobaric(&ds, &s, 11);
    pw_fit_result r;
    pw_error err;
    if (pw_fit_run(&ds, &c1, &c2, m, o, &r, &err) != PW_OK)
        fail_msg("fit: %s", err.msg);
    path_in(buf, n, name);
    unlink(buf);
    assert_int_equal(pw_fitfile_write(buf, &r, true, &err), PW_OK);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

/* The per-point values of r against a system built from scratch: components from the file at
 * comps_path, the fitted parameters of r, the fixed ones given. */
static void same_as_scratch(const pw_fit_result *r, const char *comps_path, const double *fixed,
                            size_t n_fixed_from)
{
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    assert_int_equal(pw_complib_read(&lib, comps_path, &err), PW_OK);
    pw_system s = {.model = r->sys.model, .T_ref_K = r->sys.T_ref_K, .vapor = r->sys.vapor};
    for (int i = 0; i < 2; i++) {
        const pw_component *c = pw_complib_find(&lib, r->sys.comp[i].name);
        s.comp[i] = c ? *c : r->sys.comp[i];
    }
    memcpy(s.params, r->sys.params, sizeof s.params);
    for (size_t k = n_fixed_from; k < r->sys.model->n_params; k++)
        s.params[k] = fixed[k - n_fixed_from];
    for (size_t k = 0; k < r->sys.model->n_params; k++)
        pw_assert_close(r->sys.params[k], s.params[k], 1e-15, 0, "parameter");
    char label[64];
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_point *m = &r->pts[i].meas;
        snprintf(label, sizeof label, "point at line %ld", m->line);
        pw_eq_point e;
        assert_int_equal(pw_bubble_T_from(&s, m->P_Pa, m->x1, m->T_K, &e), PW_OK);
        pw_assert_close(r->pts[i].T_calc_K, e.T_K, 1e-13, 0, label);
        pw_assert_close(r->pts[i].y_calc, e.y1, 1e-12, 1e-15, label);
        /* experimental ln gamma from the new vapor pressures (modified Raoult's law) */
        double P1, P2;
        assert_int_equal(pw_psat(&s.comp[0], m->T_K, &P1, NULL), PW_OK);
        assert_int_equal(pw_psat(&s.comp[1], m->T_K, &P2, NULL), PW_OK);
        pw_assert_close(r->pts[i].lngamma_exp[0], log(m->y1 * m->P_Pa / (m->x1 * P1)), 1e-12, 1e-14,
                        label);
        pw_assert_close(r->pts[i].lngamma_exp[1], log((1 - m->y1) * m->P_Pa / ((1 - m->x1) * P2)),
                        1e-12, 1e-14, label);
    }
    /* infinite dilution at T_ref from the new parameters */
    pw_activity a0;
    assert_int_equal(pw_system_activity(&s, 0.0, s.T_ref_K, &a0), PW_OK);
    pw_assert_close(r->lngamma_inf[0], a0.lngamma[0], 1e-13, 1e-15, "ln gamma1 inf");
    pw_complib_free(&lib);
}

static double max_T_shift(const pw_fit_result *a, const pw_fit_result *b)
{
    double d = 0.0;
    for (size_t i = 0; i < a->n_pts; i++)
        d = fmax(d, fabs(a->pts[i].T_calc_K - b->pts[i].T_calc_K));
    return d;
}

static void wilson_volumes_and_vapor_pressures(void **state)
{
    (void)state;
    char fpath[128], cpath[128];
    const double truth[PW_MAX_PARAMS] = {150.0, 450.0, 18.07 / 40.73};
    pw_fit_options o = pw_fit_default_options();
    fit_file(&pw_model_wilson, truth, &o, "w.json", fpath, sizeof fpath);
    path_in(cpath, sizeof cpath, "new.csv");
    write_text(cpath, REPLACEMENT);

    pw_fit_result plain, loaded, replaced;
    pw_error err;
    bool changed[2] = {true, true};
    assert_int_equal(pw_fitfile_read(fpath, &plain, &err), PW_OK);
    pw_assert_close(plain.sys.params[2], 18.07 / 40.73, 1e-15, 0, "V2_V1 from the fit's data");
    assert_int_equal(pw_fitfile_load(fpath, cpath, &loaded, changed, &err), PW_OK);
    assert_true(changed[0]);                                  /* methanol's A differs */
    assert_false(changed[1]);                                 /* water's correlation is the same */
    assert_string_equal(loaded.sys.comp[0].name, "methanol"); /* the fit's spelling */
    const double fixed[] = {18.3 / 42.5};
    same_as_scratch(&loaded, cpath, fixed, 2);
    /* the replacement moved the values: the comparison above could fail */
    assert_true(max_T_shift(&plain, &loaded) > 0.05);
    /* the fit's own chi2 is kept */
    pw_assert_close(loaded.chi2, plain.chi2, 0, 0, "chi2");

    /* replacing in a result already read gives the same as loading with the file */
    assert_int_equal(pw_fit_result_copy(&replaced, &plain), PW_OK);
    assert_int_equal(pw_fit_replace_components(&replaced, cpath, changed, &err), PW_OK);
    assert_true(changed[0] && !changed[1]);
    same_as_scratch(&replaced, cpath, fixed, 2);
    for (size_t i = 0; i < loaded.n_pts; i++) {
        assert_true(replaced.pts[i].T_calc_K == loaded.pts[i].T_calc_K);
        assert_true(replaced.pts[i].y_calc == loaded.pts[i].y_calc);
    }
    assert_true(replaced.dev_T_K.aad == loaded.dev_T_K.aad);
    assert_true(replaced.minima[0].params[2] == 18.3 / 42.5);

    /* no component file: nothing changes */
    pw_fit_result same;
    assert_int_equal(pw_fit_result_copy(&same, &plain), PW_OK);
    assert_int_equal(pw_fit_replace_components(&same, NULL, changed, &err), PW_OK);
    assert_false(changed[0] || changed[1]);
    assert_true(same.pts[0].T_calc_K == plain.pts[0].T_calc_K);
    pw_fit_result_free(&same);
    /* a missing component file is the reader's error, naming it */
    char missing[160];
    path_in(missing, sizeof missing, "none.csv");
    assert_int_equal(pw_fitfile_load(fpath, missing, &same, changed, &err), PW_EIO);
    assert_non_null(strstr(err.file, "none.csv"));

    pw_fit_result_free(&plain);
    pw_fit_result_free(&loaded);
    pw_fit_result_free(&replaced);
    pw_fit_result_free(&same);
}

/* A volume ratio given explicitly to the fit is not component data: it stays. */
static void explicit_wilson_ratio_stays(void **state)
{
    (void)state;
    char fpath[128], cpath[128];
    const double truth[PW_MAX_PARAMS] = {150.0, 450.0, 0.6};
    pw_fit_options o = pw_fit_default_options();
    o.V2_V1 = 0.6;
    fit_file(&pw_model_wilson, truth, &o, "w06.json", fpath, sizeof fpath);
    path_in(cpath, sizeof cpath, "new.csv");
    write_text(cpath, REPLACEMENT);
    pw_fit_result r;
    pw_error err;
    assert_int_equal(pw_fitfile_load(fpath, cpath, &r, NULL, &err), PW_OK);
    const double fixed[] = {0.6};
    same_as_scratch(&r, cpath, fixed, 2);
    pw_fit_result_free(&r);
}

/* A row with a vapor pressure and no V_L replaces the fit file's row (the interface: the rows
 * replace the fit file's) but keeps its Wilson ratio (a blank is "not stated", not "no volume":
 * the ratio must not fall back to 1). */
static void vapor_pressure_only_rows_keep_constants(void **state)
{
    (void)state;
    char fpath[128], cpath[128];
    const double truth[PW_MAX_PARAMS] = {150.0, 450.0, 18.07 / 40.73};
    pw_fit_options o = pw_fit_default_options();
    fit_file(&pw_model_wilson, truth, &o, "wp.json", fpath, sizeof fpath);
    path_in(cpath, sizeof cpath, "psat_only.csv");
    write_text(cpath, REPLACEMENT_PSAT_ONLY);
    pw_fit_result plain, r;
    pw_error err;
    bool changed[2];
    assert_int_equal(pw_fitfile_read(fpath, &plain, &err), PW_OK);
    assert_int_equal(pw_fitfile_load(fpath, cpath, &r, changed, &err), PW_OK);
    assert_true(changed[0] && !changed[1]);
    assert_true(r.sys.comp[0].A == 16.61);                    /* the stated correlation */
    assert_true(isnan(r.sys.comp[0].V_L_cm3mol)); /* the row replaces the fit file's row */
    assert_true(r.sys.params[2] == plain.sys.params[2]); /* but not the ratio it does not state */
    assert_true(max_T_shift(&plain, &r) > 0.05); /* the new vapor pressure did act */
    pw_fit_result_free(&plain);
    pw_fit_result_free(&r);
}

static void uniquac_r_and_q(void **state)
{
    (void)state;
    char fpath[128], cpath[128], c2path[128];
    const double truth[PW_MAX_PARAMS] = {-40.0, 250.0, 1.4311, 1.432, 0.92, 1.40};
    pw_fit_options o = pw_fit_default_options();
    fit_file(&pw_model_uniquac, truth, &o, "u.json", fpath, sizeof fpath);
    path_in(cpath, sizeof cpath, "new.csv");
    write_text(cpath, REPLACEMENT);
    pw_fit_result r;
    pw_error err;
    assert_int_equal(pw_fitfile_load(fpath, cpath, &r, NULL, &err), PW_OK);
    const double fixed[] = {1.52, 1.47, 0.95, 1.36};
    same_as_scratch(&r, cpath, fixed, 2);
    pw_fit_result_free(&r);
    /* rows without r and q: the fit file's values stay (a fresh UNIQUAC fit would need them) */
    path_in(c2path, sizeof c2path, "no_rq.csv");
    write_text(c2path, REPLACEMENT_NO_RQ);
    assert_int_equal(pw_fitfile_load(fpath, c2path, &r, NULL, &err), PW_OK);
    const double kept[] = {1.4311, 1.432, 0.92, 1.40};
    same_as_scratch(&r, c2path, kept, 2);
    pw_fit_result_free(&r);
}

static int teardown(void **state)
{
    (void)state;
    char cmd[160];
    snprintf(cmd, sizeof cmd, "rm -rf '%s'", dir);
    return system(cmd) == 0 ? 0 : -1;
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(wilson_volumes_and_vapor_pressures),
        cmocka_unit_test(explicit_wilson_ratio_stays),
        cmocka_unit_test(vapor_pressure_only_rows_keep_constants),
        cmocka_unit_test(uniquac_r_and_q),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
