#include "pw_test.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_multiroots.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void pw_assert_close_impl(double got, double want, double rtol, double atol, const char *label,
                          const char *file, int line)
{
    int ok;
    if (isnan(want) || isnan(got))
        ok = isnan(want) && isnan(got);
    else if (isinf(want) || isinf(got))
        ok = got == want;
    else
        ok = fabs(got - want) <= rtol * fabs(want) + atol;
    if (!ok) {
        print_error("%s:%d: %s: got %.17g, want %.17g (rtol %g, atol %g, diff %.3g)\n", file, line,
                    label ? label : "value", got, want, rtol, atol, got - want);
        _fail(file, line);
    }
}

const char *pw_test_path(char *buf, size_t len, const char *relative)
{
    const char *root = getenv("PW_SOURCE_DIR");
#ifdef PW_SOURCE_DIR
    if (!root)
        root = PW_SOURCE_DIR;
#endif
    snprintf(buf, len, "%s/%s", root ? root : ".", relative);
    return buf;
}

void pw_test_init(void) { gsl_set_error_handler_off(); }

pw_component pw_test_antoine(const char *name, double A, double B, double C, pw_log_base log,
                             const char *P_unit, const char *T_unit, double T_min_K,
                             double T_max_K)
{
    pw_component c;
    memset(&c, 0, sizeof c);
    snprintf(c.name, sizeof c.name, "%s", name);
    c.equation = PW_PSAT_ANTOINE;
    c.A = A;
    c.B = B;
    c.C = C;
    c.log = log;
    snprintf(c.P_unit, sizeof c.P_unit, "%s", P_unit);
    snprintf(c.T_unit, sizeof c.T_unit, "%s", T_unit);
    c.T_min_K = T_min_K;
    c.T_max_K = T_max_K;
    c.V_L_cm3mol = NAN;
    pw_component_prepare(&c);
    return c;
}

pw_component pw_test_svna(const char *name)
{
    static const struct {
        const char *name;
        double A, B, C;
    } rows[] = {
        {"water", 16.3872, 3885.70, 230.170},
        {"1-propanol", 16.1154, 3483.67, 205.807},
        {"acetone", 14.3145, 2756.22, 228.060},
        {"methanol", 16.5785, 3638.27, 239.500},
    };
    for (size_t i = 0; i < sizeof rows / sizeof rows[0]; i++)
        if (!strcmp(rows[i].name, name))
            return pw_test_antoine(name, rows[i].A, rows[i].B, rows[i].C, PW_LN, "kPa", "C", NAN,
                                   NAN);
    print_error("pw_test_svna: no Table B.2 row for %s\n", name);
    fail();
    return pw_test_antoine(name, NAN, NAN, NAN, PW_LN, "kPa", "C", NAN, NAN);
}

int pw_test_read_complib(pw_complib *lib)
{
    char path[1024];
    pw_error err;
    pw_complib_init(lib);
    if (pw_complib_read(lib, pw_test_path(path, sizeof path, "datasets/components.csv"), &err) ==
        PW_OK)
        return 0;
    print_error("pw_test_read_complib: %s\n", err.msg);
    pw_complib_free(lib);
    return -1;
}

void pw_test_invented_isobaric(pw_dataset *ds, const pw_system *s, size_t n)
{
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "invented.csv");
    snprintf(ds->names[0], sizeof ds->names[0], "%s", s->comp[0].name);
    snprintf(ds->names[1], sizeof ds->names[1], "%s", s->comp[1].name);
    ds->kind = PW_DATA_ISOBARIC;
    ds->has_y = true;
    ds->P_fixed_Pa = 101325.0;
    ds->T_fixed_K = NAN;
    ds->sigma_T_K = 0.1, ds->sigma_P_rel = 1e-3, ds->sigma_P_abs_Pa = NAN, ds->sigma_y = 0.004;
    ds->sigma_x = 0.001;
    ds->pts = calloc(n, sizeof *ds->pts);
    assert_non_null(ds->pts);
    ds->n = n;
    for (size_t i = 0; i < n; i++) {
        double x = 0.05 + 0.9 * (double)i / (double)(n - 1);
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(s, 101325.0, x, &e), PW_OK);
        ds->pts[i] = (pw_point){.x1 = x,
                                .y1 = e.y1 + 0.003 * sin(3.1 * (double)i),
                                .T_K = e.T_K + 0.08 * cos(1.7 * (double)i),
                                .P_Pa = 101325.0,
                                .line = (long)i + 4};
    }
}

void pw_test_nrtl_ln_gamma(double tau12, double tau21, double alpha, double x1, double lg[2])
{
    double x2 = 1.0 - x1;
    double G12 = exp(-alpha * tau12), G21 = exp(-alpha * tau21);
    double D1 = x1 + x2 * G21, D2 = x2 + x1 * G12;
    lg[0] = x2 * x2 * (tau21 * G21 * G21 / (D1 * D1) + tau12 * G12 / (D2 * D2));
    lg[1] = x1 * x1 * (tau12 * G12 * G12 / (D2 * D2) + tau21 * G21 / (D1 * D1));
}

typedef struct nrtl_layers {
    double x_I, x_II, alpha;
} nrtl_layers;

static int nrtl_equal_activities(const gsl_vector *v, void *p, gsl_vector *f)
{
    const nrtl_layers *l = p;
    double t12 = gsl_vector_get(v, 0), t21 = gsl_vector_get(v, 1), a[2], b[2];
    pw_test_nrtl_ln_gamma(t12, t21, l->alpha, l->x_I, a);
    pw_test_nrtl_ln_gamma(t12, t21, l->alpha, l->x_II, b);
    gsl_vector_set(f, 0, log(l->x_I) + a[0] - log(l->x_II) - b[0]);
    gsl_vector_set(f, 1, log1p(-l->x_I) + a[1] - log1p(-l->x_II) - b[1]);
    return GSL_SUCCESS;
}

void pw_test_nrtl_tau_from_layers(double x_I, double x_II, double alpha, double tau[2])
{
    nrtl_layers l = {x_I, x_II, alpha};
    gsl_multiroot_function F = {nrtl_equal_activities, 2, &l};
    gsl_multiroot_fsolver *s = gsl_multiroot_fsolver_alloc(gsl_multiroot_fsolver_hybrids, 2);
    gsl_vector *x0 = gsl_vector_alloc(2);
    assert_true(s && x0);
    gsl_vector_set(x0, 0, -log1p(-x_II));
    gsl_vector_set(x0, 1, -log(x_I));
    gsl_multiroot_fsolver_set(s, &F, x0);
    int status = GSL_CONTINUE;
    for (int it = 0; it < 500 && status == GSL_CONTINUE; it++) {
        if (gsl_multiroot_fsolver_iterate(s) != GSL_SUCCESS)
            break;
        status = gsl_multiroot_test_residual(s->f, 1e-13);
    }
    assert_int_equal(status, GSL_SUCCESS);
    tau[0] = gsl_vector_get(s->x, 0);
    tau[1] = gsl_vector_get(s->x, 1);
    gsl_vector_free(x0);
    gsl_multiroot_fsolver_free(s);
}
