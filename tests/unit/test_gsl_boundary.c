/* The GSL boundary (docs/hardening.md): this program keeps GSL's default error handler, which
 * aborts the process, and never calls gsl_set_error_handler_off (nor pw_test_init, which does).
 * It feeds hostile input to the column solve, the azeotrope search, the bubble point, the
 * stability scan and the 1-D drivers themselves: curves that fail after N evaluations, curves
 * that answer NaN or infinity, NaN and huge model parameters, a model whose evaluation fails
 * after N calls. Every call must come back with a status; an abort fails the test. */
#include "pw_test.h"

#include "base/solve1d.h"
#include "column_curves.h"

#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/column.h>
#include <pinchwise/curve.h>
#include <pinchwise/equilibrium.h>
#include <pinchwise/model.h>
#include <string.h>

typedef enum { FAIL_STATUS, FAIL_NAN, FAIL_INF } fail_mode;

typedef struct failing_curve {
    tc_alpha inner;
    long left; /* evaluations before the failures start */
    fail_mode mode;
    long calls;
} failing_curve;

static pw_status failing_fn(void *ctx, double x, double *y)
{
    failing_curve *f = ctx;
    f->calls++;
    if (f->left-- > 0) {
        *y = tc_alpha_y(&f->inner, x);
        return PW_OK;
    }
    switch (f->mode) {
    case FAIL_STATUS:
        return PW_ESINGULAR; /* a status no other path of the solve produces */
    case FAIL_NAN:
        *y = NAN;
        return PW_OK;
    case FAIL_INF:
        *y = INFINITY;
        return PW_OK;
    }
    return PW_EINVAL;
}

/* A curve failing at every possible point of a solve: the status comes back (or, when the failure
 * hits a design row or the total-reflux stepping, that row carries it); nothing aborts. */
static void column_curve_fails_after_n(void **state)
{
    (void)state;
    const tc_alpha curves[] = {{2.5, 0.0}, {2.0, 1.2}, {1.5, -0.8}};
    const pw_column_spec specs[] = {{.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = 0.5},
                                    {.xd = 0.7879, .xb = 0.02, .zf = 0.35, .q = 1.0},
                                    {.xd = 0.98, .xb = 0.2475, .zf = 0.64, .q = 1.3}};
    for (size_t k = 0; k < 3; k++) {
        failing_curve probe = {curves[k], 1L << 40, FAIL_STATUS, 0};
        pw_curve pc = {failing_fn, &probe};
        pw_column_result r;
        assert_int_equal(pw_column_solve(&pc, &specs[k], NULL, &r), PW_OK);
        const long total = probe.calls;
        assert_true(total > 50);
        for (int mode = FAIL_STATUS; mode <= FAIL_INF; mode++)
            for (long n = 0; n < total; n += (n < 260 ? 1 : 7)) {
                failing_curve f = {curves[k], n, (fail_mode)mode, 0};
                pw_curve c = {failing_fn, &f};
                pw_status st = pw_column_solve(&c, &specs[k], NULL, &r);
                const pw_status want = mode == FAIL_STATUS ? PW_ESINGULAR : PW_EDOM;
                bool in_rows = false;
                for (size_t i = 0; st == PW_OK && i < r.n_design; i++)
                    in_rows |= r.design[i].status == want;
                if (!(st == want || (st == PW_OK && in_rows)))
                    fail_msg("curve %zu mode %d fails after %ld: status %d", k, mode, n, (int)st);
            }
    }
}

/* Components from SVNA Table B.2 (confirmed rows: water, 1-propanol). */
static pw_system water_propanol(double a12, double a21)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = pw_test_svna("1-propanol");
    s.comp[1] = pw_test_svna("water");
    s.model = &pw_model_margules;
    s.params[0] = a12;
    s.params[1] = a21;
    s.T_ref_K = 360.0;
    return s;
}

static void hostile_parameters(void **state)
{
    (void)state;
    const double bad[] = {NAN, INFINITY, -INFINITY, 1e300, -1e300, 1e15};
    for (size_t i = 0; i < sizeof bad / sizeof bad[0]; i++)
        for (int which = 0; which < 2; which++) {
            pw_system s = water_propanol(which ? 1.0 : bad[i], which ? bad[i] : 1.0);
            pw_eq_point eq;
            pw_status st = pw_bubble_T(&s, 101325.0, 0.4, &eq);
            assert_true(st == PW_OK || st != PW_OK); /* reached: no abort */
            (void)pw_bubble_P(&s, 360.0, 0.4, &eq);
            (void)pw_dew_T(&s, 101325.0, 0.4, &eq);
            double d, xm;
            (void)pw_stability_min(&s, 360.0, &d, &xm);
            pw_az_result az;
            (void)pw_azeotrope_find(&s, PW_AZ_ISOBARIC, 101325.0, NULL, &az);
            (void)pw_azeotrope_find(&s, PW_AZ_ISOTHERMAL, 360.0, NULL, &az);
            pw_system_curve sc;
            if (pw_system_curve_init(&sc, &s, 101325.0) == PW_OK) {
                pw_curve c = pw_system_curve_bind(&sc);
                pw_column_spec spec = {.xd = 0.4, .xb = 0.02, .zf = 0.2, .q = 0.5};
                pw_column_result r;
                (void)pw_column_solve(&c, &spec, NULL, &r);
            }
            double rm;
            pw_status su = pw_underwood_rmin(bad[i], 0.5, 0.9, 1.0, &rm);
            if (!(bad[i] > 1.0 && isfinite(bad[i])))
                assert_int_equal(su, PW_EINVAL);
        }
    /* the NaN case must be refused, not answered */
    pw_system s = water_propanol(NAN, 1.0);
    pw_eq_point eq;
    assert_int_not_equal(pw_bubble_T(&s, 101325.0, 0.4, &eq), PW_OK);
}

/* A model whose evaluation fails after N calls, wrapped around the library's Margules. The
 * counter is test state (one thread). */
static long model_calls_left;

static pw_status failing_eval(const double *p, double T_ref_K, double x1, double T_K,
                              pw_activity *out)
{
    if (model_calls_left-- <= 0)
        return PW_ESINGULAR;
    return pw_model_margules.eval(p, T_ref_K, x1, T_K, out);
}

static void model_fails_after_n(void **state)
{
    (void)state;
    pw_model_type failing = pw_model_margules;
    failing.eval = failing_eval;
    pw_system s = water_propanol(1.2, 1.6);
    s.model = &failing;
    for (long n = 0; n < 400; n += 3) {
        pw_eq_point eq;
        model_calls_left = n;
        pw_status st = pw_bubble_T(&s, 101325.0, 0.3, &eq);
        assert_true(st == PW_OK || st == PW_ESINGULAR);
        model_calls_left = n;
        double d, xm;
        st = pw_stability_min(&s, 360.0, &d, &xm);
        assert_true(st == PW_OK || st == PW_ESINGULAR);
        model_calls_left = 20 * n;
        pw_az_result az;
        st = pw_azeotrope_find(&s, PW_AZ_ISOBARIC, 101325.0, NULL, &az);
        assert_true(st == PW_OK || st == PW_ESINGULAR);
        model_calls_left = 20 * n;
        pw_system_curve sc;
        assert_int_equal(pw_system_curve_init(&sc, &s, 101325.0), PW_OK);
        pw_curve c = pw_system_curve_bind(&sc);
        pw_column_spec spec = {.xd = 0.35, .xb = 0.02, .zf = 0.2, .q = 1.0};
        pw_column_result r;
        st = pw_column_solve(&c, &spec, NULL, &r);
        assert_true(st == PW_OK || st == PW_ESINGULAR);
    }
}

/* The drivers themselves: every precondition GSL would report to its handler. */
typedef struct drv_fn {
    long left;
    int kind; /* 0 status, 1 NaN, 2 inf */
} drv_fn;

static pw_status drv_cubic(void *ctx, double x, double *f)
{
    drv_fn *d = ctx;
    if (d->left-- <= 0) {
        if (d->kind == 0)
            return PW_ESINGULAR;
        *f = d->kind == 1 ? NAN : INFINITY;
        return PW_OK;
    }
    *f = x * x * x - 2.0;
    return PW_OK;
}

static pw_status drv_parabola(void *ctx, double x, double *f)
{
    pw_status st = drv_cubic(ctx, x, f);
    if (st == PW_OK && isfinite(*f))
        *f = (x - 1.3) * (x - 1.3);
    return st;
}

static void drivers(void **state)
{
    (void)state;
    pw_solve1d_opts o = pw_solve1d_default_opts();
    double r, xm, fm;
    drv_fn ok = {1L << 40, 0};
    assert_int_equal(pw_root1d(drv_cubic, &ok, 0.0, 2.0, NAN, NAN, &o, &r, NULL), PW_OK);
    pw_assert_close(r, cbrt(2.0), 1e-14, 0, "cube root of 2");
    assert_int_equal(pw_root1d(drv_cubic, &ok, 2.0, 0.0, NAN, NAN, &o, &r, NULL), PW_EINVAL);
    assert_int_equal(pw_root1d(drv_cubic, &ok, 2.0, 3.0, NAN, NAN, &o, &r, NULL), PW_ENOBRACKET);
    assert_int_equal(pw_root1d(drv_cubic, &ok, NAN, 3.0, NAN, NAN, &o, &r, NULL), PW_EINVAL);
    assert_int_equal(pw_root1d(drv_cubic, &ok, 0.0, 2.0, NAN, INFINITY, &o, &r, NULL), PW_EDOM);
    for (int kind = 0; kind < 3; kind++)
        for (long n = 0; n < 40; n++) {
            drv_fn d = {n, kind};
            pw_status st = pw_root1d(drv_cubic, &d, 0.0, 2.0, NAN, NAN, &o, &r, NULL);
            assert_true(st == PW_OK || st == (kind == 0 ? PW_ESINGULAR : PW_EDOM));
            drv_fn e = {n, kind};
            st = pw_min1d(drv_parabola, &e, 0.0, 1.0, 3.0, NAN, NAN, NAN, &o, &xm, &fm, NULL);
            assert_true(st == PW_OK || st == (kind == 0 ? PW_ESINGULAR : PW_EDOM));
        }
    /* a triple that does not enclose a minimum, one given out of order; a minimum is known to
     * about sqrt(DBL_EPSILON) only, so the minimiser gets an absolute tolerance */
    o.xtol_abs = 1e-7;
    assert_int_equal(pw_min1d(drv_parabola, &ok, 1.5, 2.0, 3.0, NAN, NAN, NAN, &o, &xm, &fm, NULL),
                     PW_ENOBRACKET);
    assert_int_equal(pw_min1d(drv_parabola, &ok, 3.0, 1.0, 0.0, NAN, NAN, NAN, &o, &xm, &fm, NULL),
                     PW_EINVAL);
    assert_int_equal(pw_min1d(drv_parabola, &ok, 0.0, 1.0, 3.0, NAN, NAN, NAN, &o, &xm, &fm, NULL),
                     PW_OK);
    pw_assert_close(xm, 1.3, 0, 1e-7, "parabola minimum");
    o.max_iter = 2;
    assert_int_equal(pw_root1d(drv_cubic, &ok, 0.0, 2.0, NAN, NAN, &o, &r, NULL), PW_EMAXITER);
    o.xtol_rel = -1.0;
    assert_int_equal(pw_root1d(drv_cubic, &ok, 0.0, 2.0, NAN, NAN, &o, &r, NULL), PW_EINVAL);
}

int main(void)
{
    /* deliberately no pw_test_init(): GSL's default, aborting, handler stays installed */
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(drivers),
        cmocka_unit_test(column_curve_fails_after_n),
        cmocka_unit_test(hostile_parameters),
        cmocka_unit_test(model_fails_after_n),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
