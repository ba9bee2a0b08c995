/* Rating with energy balances: with equal heats, no heat capacities and H^E = 0 it gives the
 * constant-overflow products (seeded random columns, two curves); a column designed by stepping
 * with energy balances, rated with its stages, feed stage and R, gives back its products; every
 * stage's mass and energy balance and the overall energy balance close. */
#include "design_systems.h"

#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
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

static pw_system wilson_athermal(void)
{
    pw_system s = design_ideal_system(2.0);
    s.model = &pw_model_wilson;
    s.params[2] = 4.0; /* a12 = a21 = 0: G^E/RT independent of T, H^E = 0 (invented) */
    return s;
}

static void test_equal_heats_is_cmo(void **state)
{
    (void)state;
    srand(777u);
    pw_system systems[2] = {design_ideal_system(2.2), wilson_athermal()};
    int n = 0;
    for (int t = 0; t < 16; t++) {
        const pw_system *sys = &systems[t % 2];
        pw_heat_data h = heats(sys, 32000.0, 32000.0, 0, 0, 0, 0);
        pw_rate_spec s;
        s.n_stages = 2 + rand() % 15;
        s.feed_stage = 1 + rand() % s.n_stages;
        s.zf = 0.1 + 0.8 * rand() / (double)RAND_MAX;
        s.d_frac = 0.1 + 0.8 * rand() / (double)RAND_MAX;
        s.q = 0.0 + 1.3 * rand() / (double)RAND_MAX;
        s.R = 0.5 + 4.0 * rand() / (double)RAND_MAX;
        if (!((s.R + 1.0) * s.d_frac - (1.0 - s.q) > 0.05))
            continue;
        pw_rate_result a, b;
        pw_error err;
        double qc, qr;
        size_t roots;
        assert_int_equal(pw_rate_cmo(sys, P_PA, &s, &a, &err), PW_OK);
        if (pw_rate_energy(sys, &h, P_PA, &s, &b, &qc, &qr, &roots, &err) != PW_OK)
            fail_msg("energy rating: %s", err.msg);
        assert_int_equal((int)roots, 1);
        pw_assert_close(b.xd, a.xd, 0, 1e-8, "xd = constant overflow");
        pw_assert_close(b.xb, a.xb, 0, 1e-8, "xb = constant overflow");
        pw_assert_close(qc, (s.R + 1.0) * s.d_frac * 32000.0, 1e-12, 0, "Q_C = (R + 1) D lambda");
        for (size_t k = 0; k < a.profile.n; k++) {
            pw_assert_close(b.profile.stage[k].L, a.profile.stage[k].L, 1e-7, 1e-9, "L");
            pw_assert_close(b.profile.stage[k].V, a.profile.stage[k].V, 1e-7, 1e-9, "V");
        }
        pw_rate_result_free(&a);
        pw_rate_result_free(&b);
        n++;
    }
    assert_true(n >= 8);
}

/* An invented non-ideal liquid with H^E and invented heat data. */
static pw_system nrtl_system(void)
{
    pw_system s = design_ideal_system(3.0);
    s.model = &pw_model_nrtl;
    s.params[0] = 150.0;
    s.params[1] = 100.0;
    s.params[2] = 0.3;
    return s;
}

typedef struct dctx {
    const pw_system *sys;
    const pw_heat_data *h;
    pw_column_spec s;
    double R, N;
    int feed;
} dctx;

static double stages_minus_N(double xb, void *p)
{
    dctx *c = p;
    c->s.xb = xb;
    pw_profile prof;
    if (pw_energy_profile(c->sys, c->h, P_PA, &c->s, c->R, 500, &prof, NULL, NULL) != PW_OK)
        return GSL_NAN;
    c->feed = prof.feed_stage;
    double v = prof.stages - c->N;
    pw_profile_free(&prof);
    return v;
}

static double hl(const pw_system *s, const pw_heat_data *h, double x, double T)
{
    double v;
    assert_int_equal(pw_enthalpy_liquid(s, h, x, T, &v), PW_OK);
    return v;
}

static void test_round_trip_and_balances(void **state)
{
    (void)state;
    pw_system sys = nrtl_system();
    pw_heat_data h = heats(&sys, 36000.0, 41000.0, 110.0, 76.0, 60.0, 34.0);
    const double qs[] = {1.0, 0.5};
    for (int k = 0; k < 2; k++) {
        dctx c = {&sys, &h, {.xd = 0.95, .xb = 0.02, .zf = 0.45, .q = qs[k]}, 3.0, 0.0, 0};
        pw_profile prof;
        assert_int_equal(pw_energy_profile(&sys, &h, P_PA, &c.s, c.R, 500, &prof, NULL, NULL),
                         PW_OK);
        c.N = ceil(prof.stages);
        pw_profile_free(&prof);
        gsl_root_fsolver *rs = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
        gsl_function F = {stages_minus_N, &c};
        assert_true(stages_minus_N(1e-4, &c) > 0.0 && stages_minus_N(0.02, &c) < 0.0);
        assert_int_equal(gsl_root_fsolver_set(rs, &F, 1e-4, 0.02), GSL_SUCCESS);
        double xb = NAN;
        for (int it = 0; it < 200; it++) {
            gsl_root_fsolver_iterate(rs);
            double a = gsl_root_fsolver_x_lower(rs), b = gsl_root_fsolver_x_upper(rs);
            if (gsl_root_test_interval(a, b, 1e-15, 1e-13) == GSL_SUCCESS) {
                xb = gsl_root_fsolver_root(rs);
                break;
            }
        }
        gsl_root_fsolver_free(rs);
        assert_true(isfinite(xb));
        stages_minus_N(xb, &c);
        const double D = (c.s.zf - xb) / (c.s.xd - xb), B = 1.0 - D;
        pw_rate_spec spec = {(int)c.N, c.feed, c.R, c.s.zf, c.s.q, D};
        pw_rate_result r;
        pw_error err;
        double qc, qr;
        size_t roots;
        if (pw_rate_energy(&sys, &h, P_PA, &spec, &r, &qc, &qr, &roots, &err) != PW_OK)
            fail_msg("%s", err.msg);
        pw_assert_close(r.xd, c.s.xd, 0, 1e-7, "rated xd = designed xd");
        pw_assert_close(r.xb, xb, 0, 1e-7, "rated xb = designed xb");
        /* Balances of the rated column. */
        double hF, hD, hB, TD, TB;
        assert_int_equal(pw_enthalpy_feed(&sys, &h, P_PA, spec.zf, spec.q, &hF), PW_OK);
        assert_int_equal(pw_enthalpy_sat_liquid(&sys, &h, P_PA, r.xd, &hD, &TD), PW_OK);
        assert_int_equal(pw_enthalpy_sat_liquid(&sys, &h, P_PA, r.xb, &hB, &TB), PW_OK);
        pw_assert_close(hF + qr, D * hD + B * hB + qc, 1e-8, 1e-6, "overall energy balance");
        const pw_profile *p = &r.profile;
        assert_int_equal((int)p->n, spec.n_stages);
        for (size_t n = 0; n < p->n; n++) {
            const pw_stage *g = &p->stage[n];
            double Lin = n == 0 ? spec.R * D : p->stage[n - 1].L;
            double xin = n == 0 ? r.xd : p->stage[n - 1].x;
            double hin = n == 0 ? hD : hl(&sys, &h, p->stage[n - 1].x, p->stage[n - 1].T_K);
            double Vin = n + 1 < p->n ? p->stage[n + 1].V : 0.0;
            double yin = n + 1 < p->n ? p->stage[n + 1].y : 0.0;
            double Hin = n + 1 < p->n ? pw_enthalpy_vapor(&h, yin, p->stage[n + 1].T_K) : 0.0;
            double F = (int)n + 1 == spec.feed_stage ? 1.0 : 0.0;
            double Q = n + 1 == p->n ? qr : 0.0;
            double out_h =
                g->L * hl(&sys, &h, g->x, g->T_K) + g->V * pw_enthalpy_vapor(&h, g->y, g->T_K);
            pw_assert_close(Lin + Vin + F, g->L + g->V, 1e-9, 1e-11, "stage total");
            pw_assert_close(Lin * xin + Vin * yin + F * spec.zf, g->L * g->x + g->V * g->y, 1e-7,
                            1e-9, "stage component");
            pw_assert_close(Lin * hin + Vin * Hin + F * hF + Q, out_h, 1e-6, 1e-3, "stage energy");
        }
        pw_rate_result_free(&r);
    }
}

/* Design -> rate at several reflux ratios, from just above R_min (a staircase pinched near the
 * feed or a tangent) to far above it: the column stepped with energy balances at R down to the
 * xb that takes exactly N stages, rated with N, its feed stage, R and D, gives back its products,
 * and the root enumeration proves that steady state the only one. */
static void test_round_trip_several_reflux(void **state)
{
    (void)state;
    pw_system sys = nrtl_system();
    pw_heat_data h = heats(&sys, 36000.0, 41000.0, 110.0, 76.0, 60.0, 34.0);
    const double qs[] = {1.0, 0.4};
    const double factors[] = {1.05, 1.2, 1.6, 3.0};
    int n = 0;
    unsigned long evals = 0;
    for (int k = 0; k < 2; k++) {
        pw_column_spec s0 = {.xd = 0.95, .xb = 0.02, .zf = 0.45, .q = qs[k]};
        pw_energy_result er;
        assert_int_equal(pw_energy_column_solve(&sys, &h, P_PA, &s0, NULL, &er, NULL), PW_OK);
        assert_true(er.feasible && er.r_min > 0.0);
        for (int f = 0; f < 4; f++) {
            dctx c = {&sys, &h, s0, factors[f] * er.r_min, 0.0, 0};
            pw_profile prof;
            assert_int_equal(
                pw_energy_profile(&sys, &h, P_PA, &c.s, c.R, 500, &prof, NULL, NULL), PW_OK);
            c.N = ceil(prof.stages);
            pw_profile_free(&prof);
            gsl_root_fsolver *rs = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
            gsl_function F = {stages_minus_N, &c};
            const double lo = 0.004, hi = 0.02;
            if (!(stages_minus_N(lo, &c) > 0.0 && stages_minus_N(hi, &c) <= 0.0))
                fail_msg("q %g, factor %g: no xb bracket", qs[k], factors[f]);
            assert_int_equal(gsl_root_fsolver_set(rs, &F, lo, hi), GSL_SUCCESS);
            double xb = NAN;
            for (int it = 0; it < 200; it++) {
                gsl_root_fsolver_iterate(rs);
                double a = gsl_root_fsolver_x_lower(rs), b = gsl_root_fsolver_x_upper(rs);
                if (gsl_root_test_interval(a, b, 1e-15, 1e-13) == GSL_SUCCESS) {
                    xb = gsl_root_fsolver_root(rs);
                    break;
                }
            }
            gsl_root_fsolver_free(rs);
            assert_true(isfinite(xb));
            stages_minus_N(xb, &c);
            const double D = (c.s.zf - xb) / (c.s.xd - xb);
            pw_rate_spec spec = {(int)c.N, c.feed, c.R, c.s.zf, c.s.q, D};
            pw_rate_result r;
            pw_error err;
            double qc, qr;
            size_t roots;
            if (pw_rate_energy(&sys, &h, P_PA, &spec, &r, &qc, &qr, &roots, &err) != PW_OK)
                fail_msg("q %g, factor %g: %s", qs[k], factors[f], err.msg);
            pw_assert_close(r.xd, c.s.xd, 0, 1e-7, "rated xd = designed xd");
            pw_assert_close(r.xb, xb, 0, 1e-7, "rated xb = designed xb");
            assert_int_equal(roots, 1);
            evals += (unsigned long)r.iterations;
            pw_rate_result_free(&r);
            n++;
        }
    }
    print_message("design -> rate at 1.05 to 3 R_min: %d columns, %lu residual evaluations\n", n,
                  evals);
}

static void test_refusals(void **state)
{
    (void)state;
    pw_system sys = nrtl_system();
    pw_heat_data h = heats(&sys, 36000.0, 41000.0, 110.0, 76.0, 60.0, 34.0);
    pw_rate_spec s = {10, 5, 2.0, 0.5, 1.0, 1.3};
    pw_rate_result r;
    pw_error err;
    double qc, qr;
    size_t roots;
    assert_int_equal(pw_rate_energy(&sys, &h, P_PA, &s, &r, &qc, &qr, &roots, &err),
                     PW_EINFEASIBLE);
    assert_non_null(strstr(err.msg, "feed cannot supply"));
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_equal_heats_is_cmo),
        cmocka_unit_test(test_round_trip_and_balances),
        cmocka_unit_test(test_round_trip_several_reflux),
        cmocka_unit_test(test_refusals),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
