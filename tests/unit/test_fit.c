/* Regression module: round trips on generated data (identity checks) and the analytic Jacobian
 * against finite differences. Published-data fits are in test_fit_published.c. */
#include "pw_test.h"

#include "fit/fit_internal.h"

#include <math.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Antoine constants of Smith, Van Ness & Abbott, 7th ed., Table B.2: ln(P/kPa) = A - B/(t/C + C).
 * Methanol from memory (this project's methods brief, section 2.5, tags it [M]); water [S]. */
static pw_component antoine(const char *name, double A, double B, double C)
{
    return pw_test_antoine(name, A, B, C, PW_LN, "kPa", "C", 250.0, 450.0);
}

static pw_component methanol(void) { return antoine("methanol", 16.5785, 3638.27, 239.500); }
static pw_component water(void) { return antoine("water", 16.3872, 3885.70, 230.170); }

/* Invented round-trip data: points generated without noise from known parameters. */
static void make_dataset(pw_dataset *ds, const pw_system *s, pw_data_kind kind, bool has_y,
                         size_t n)
{
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "generated.csv");
    snprintf(ds->names[0], sizeof ds->names[0], "%s", s->comp[0].name);
    snprintf(ds->names[1], sizeof ds->names[1], "%s", s->comp[1].name);
    ds->kind = kind;
    ds->has_y = has_y;
    ds->P_fixed_Pa = kind == PW_DATA_ISOBARIC ? 101325.0 : NAN;
    ds->T_fixed_K = kind == PW_DATA_ISOTHERMAL ? 333.15 : NAN;
    ds->sigma_T_K = 0.1, ds->sigma_P_rel = 1e-3, ds->sigma_P_abs_Pa = NAN, ds->sigma_y = 0.004;
    ds->sigma_x = 0.001;
    ds->pts = calloc(n, sizeof *ds->pts);
    ds->n = n;
    for (size_t i = 0; i < n; i++) {
        double x = (double)(i + 1) / (double)(n + 1);
        pw_eq_point e;
        pw_status st = kind == PW_DATA_ISOBARIC ? pw_bubble_T(s, 101325.0, x, &e)
                                                : pw_bubble_P(s, 333.15, x, &e);
        assert_int_equal(st, PW_OK);
        ds->pts[i].x1 = x;
        ds->pts[i].y1 = has_y ? e.y1 : NAN;
        ds->pts[i].T_K = e.T_K;
        ds->pts[i].P_Pa = e.P_Pa;
        ds->pts[i].line = (long)i + 5;
    }
}

typedef struct rt_case {
    const char *model;
    double params[PW_MAX_PARAMS];
    bool fit_alpha;
} rt_case;

/* Parameter sets of the size met for alcohol/water-like systems (invented for the round trip). */
static const rt_case cases[] = {
    {"margules", {0.80, 0.45}, false},
    {"vanlaar", {0.85, 0.50}, false},
    {"wilson", {150.0, 250.0, 0.45}, false},
    {"nrtl", {-120.0, 420.0, 0.30}, false},
    {"nrtl", {-120.0, 420.0, 0.35}, true},
};

static void round_trip_one(const rt_case *c, pw_data_kind kind, bool has_y)
{
    const pw_model_type *m = pw_model_find(c->model);
    assert_non_null(m);
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = methanol();
    s.comp[1] = water();
    s.model = m;
    memcpy(s.params, c->params, sizeof s.params);
    s.T_ref_K = 345.0;
    pw_dataset ds;
    /* The fit takes the mean measured T as T_ref of the Margules/van Laar temperature form, so
     * generate at the fixed point T_ref = mean T of the generated data. */
    make_dataset(&ds, &s, kind, has_y, 15);
    for (int it = 0; it < 30 && kind == PW_DATA_ISOBARIC; it++) {
        double Tmean = 0.0;
        for (size_t i = 0; i < ds.n; i++)
            Tmean += ds.pts[i].T_K / (double)ds.n;
        pw_dataset_free(&ds);
        s.T_ref_K = Tmean;
        make_dataset(&ds, &s, kind, has_y, 15);
    }
    if (kind == PW_DATA_ISOTHERMAL) {
        s.T_ref_K = 333.15;
        pw_dataset_free(&ds);
        make_dataset(&ds, &s, kind, has_y, 15);
    }
    pw_fit_options o = pw_fit_default_options();
    o.fit_alpha = c->fit_alpha;
    o.alpha = c->params[2];
    if (!strcmp(c->model, "wilson"))
        o.V2_V1 = c->params[2];
    o.n_starts = 8;
    pw_fit_result r;
    pw_error err;
    pw_status st = pw_fit_run(&ds, &s.comp[0], &s.comp[1], m, &o, &r, &err);
    assert_int_equal(st, PW_OK);
    assert_true(r.converged);
    char label[128];
    for (size_t k = 0; k < m->n_params; k++) {
        snprintf(label, sizeof label, "%s %s kind %d y %d", c->model, m->param_names[k], kind, has_y);
        pw_assert_close(r.sys.params[k], c->params[k], 1e-6, 1e-9, label);
    }
    assert_true(r.dev_T_K.aad < 1e-6 || kind == PW_DATA_ISOTHERMAL);
    pw_fit_result_free(&r);
    pw_dataset_free(&ds);
}

static void round_trip_every_model_and_data_type(void **state)
{
    (void)state;
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        round_trip_one(&cases[i], PW_DATA_ISOBARIC, true);
        round_trip_one(&cases[i], PW_DATA_ISOTHERMAL, true);
        round_trip_one(&cases[i], PW_DATA_ISOTHERMAL, false); /* P-x, Barker's method */
    }
}

/* The analytic Jacobian of every objective against central differences of the residuals. */
static void jacobian_matches_finite_differences(void **state)
{
    (void)state;
    for (size_t ci = 0; ci < sizeof cases / sizeof cases[0]; ci++) {
        const rt_case *c = &cases[ci];
        for (int kind = 0; kind < 2; kind++) {
            pw_system s;
            memset(&s, 0, sizeof s);
            s.comp[0] = methanol();
            s.comp[1] = water();
            s.model = pw_model_find(c->model);
            s.T_ref_K = 345.0;
            memcpy(s.params, c->params, sizeof s.params);
            pw_dataset ds;
            make_dataset(&ds, &s, (pw_data_kind)kind, true, 6);
            fit_problem fp;
            memset(&fp, 0, sizeof fp);
            fp.sys = s;
            fp.objective = kind == PW_DATA_ISOBARIC ? PW_OBJ_TXY : PW_OBJ_PXY;
            fp.pts = ds.pts;
            fp.n_pts = ds.n;
            fp.n_res = 2 * ds.n;
            fp.sigma_T_K = 0.1, fp.sigma_y = 0.004, fp.sigma_P_rel = 1e-3, fp.sigma_P_abs_Pa = NAN;
            for (size_t k = 0; k < s.model->n_params; k++) {
                fp.idx[fp.n_fit] = k;
                fp.scale[fp.n_fit] = strcmp(s.model->param_units[k], "K") ? 1.0 : 100.0;
                fp.n_fit++;
            }
            /* perturb away from the generating point so residuals are non-zero */
            double p0[PW_MAX_PARAMS];
            memcpy(p0, s.params, sizeof p0);
            for (size_t j = 0; j < fp.n_fit; j++)
                p0[fp.idx[j]] *= 1.07;
            double f[12], J[12 * PW_MAX_PARAMS], fp_[12], fm[12];
            assert_int_equal(fit_eval(&fp, p0, f, J), PW_OK);
            for (size_t j = 0; j < fp.n_fit; j++) {
                double h = 1e-6 * fp.scale[j], pp[PW_MAX_PARAMS], pm[PW_MAX_PARAMS];
                memcpy(pp, p0, sizeof pp);
                memcpy(pm, p0, sizeof pm);
                pp[fp.idx[j]] += h;
                pm[fp.idx[j]] -= h;
                assert_int_equal(fit_eval(&fp, pp, fp_, NULL), PW_OK);
                assert_int_equal(fit_eval(&fp, pm, fm, NULL), PW_OK);
                for (size_t i = 0; i < fp.n_res; i++) {
                    double fd = (fp_[i] - fm[i]) / (2.0 * h) * fp.scale[j];
                    char label[96];
                    snprintf(label, sizeof label, "%s kind %d dres%zu/dp%zu", c->model, kind, i, j);
                    pw_assert_close(J[i * fp.n_fit + j], fd, 1e-5, 1e-6, label);
                }
            }
            pw_dataset_free(&ds);
        }
    }
}

static void too_few_points_refused(void **state)
{
    (void)state;
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = methanol();
    s.comp[1] = water();
    s.model = &pw_model_nrtl;
    s.params[0] = -120.0, s.params[1] = 420.0, s.params[2] = 0.3;
    pw_dataset ds;
    make_dataset(&ds, &s, PW_DATA_ISOTHERMAL, false, 2); /* P-x, 2 points, 2 parameters */
    pw_fit_result r;
    pw_error err;
    pw_fit_options o = pw_fit_default_options();
    assert_int_equal(pw_fit_run(&ds, &s.comp[0], &s.comp[1], &pw_model_nrtl, &o, &r, &err),
                     PW_ETOOFEW);
    assert_non_null(strstr(err.msg, "too few"));
    pw_dataset_free(&ds);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(jacobian_matches_finite_differences),
        cmocka_unit_test(round_trip_every_model_and_data_type),
        cmocka_unit_test(too_few_points_refused),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
