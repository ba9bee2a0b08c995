/* Uncertainty of the heterogeneous azeotrope and of the decanter scheme
 * (src/analysis/uncertainty_het.c).
 *
 *  - A split that disappears, against a closed form: symmetric Margules ln gamma1 = A x2^2 splits
 *    exactly when A > 2 (the critical point of G = x ln x + (1-x) ln(1-x) + A x (1-x); any text on
 *    liquid-liquid equilibrium, e.g. Prausnitz et al., Molecular Thermodynamics of Fluid-Phase
 *    Equilibria, 3rd ed., ch. 12, from memory). With equal invented vapor pressures at fixed T the
 *    three-phase vapor is y3 = 1/2, inside every split, so a draw of A has a heterogeneous
 *    azeotrope iff A > 2. A ~ N(2.05, 0.1^2): the share of draws with one must match
 *    Phi(0.5) = 0.691462 (binomial tolerance), the others counted as infeasible, none failed.
 *  - The NRTL 1-butanol/water case of METHODS2 4.5 (computed there, [H]): the point values are the
 *    three-phase state and the minimum boil-ups given there; every 95 % interval contains its point
 *    value; the linearised standard deviation of T3 equals the delta method computed here from an
 *    independent central difference of pw_three_phase_at_P; the same seed gives the same sampled
 *    interval, another seed another one.
 *  - A decanter whose column A bottoms sits just above the rich layer: draws that move the layer
 *    past it make the scheme infeasible, counted, not an error.
 *  - A cooled decanter (30 C) on the NRTL set of test_decanter.c whose layers widen on cooling:
 *    its own layers' point values are pw_lle_solve's at 30 C, and their linearised standard
 *    deviations equal the delta method from an independent central difference of pw_lle_solve;
 *    without cooling they are the boiling layers. */
#include "pw_test.h"

#include <gsl/gsl_cdf.h>
#include <math.h>
#include <pinchwise/lle.h>
#include <pinchwise/uncertainty.h>
#include <string.h>

static pw_complib lib;

#define T_FIX 350.0

static pw_component invented(const char *name, double P_kPa)
{
    return pw_test_antoine(name, log(P_kPa) + 3000.0 / (T_FIX - 50.0), 3000.0, -50.0, PW_LN,
                           "kPa", "K", 250.0, 500.0);
}

static void split_disappears(void **state)
{
    (void)state;
    pw_unc_problem pb;
    memset(&pb, 0, sizeof pb);
    pb.sys.comp[0] = invented("first (invented)", 100.0);
    pb.sys.comp[1] = invented("second (invented)", 100.0);
    pb.sys.model = &pw_model_margules;
    pb.sys.T_ref_K = T_FIX;
    const double A = 2.05, sd = 0.1;
    pb.sys.params[0] = pb.sys.params[1] = A;
    pb.fitted[0] = pb.fitted[1] = true;
    for (int i = 0; i < 2; i++)
        for (int j = 0; j < 2; j++)
            pb.cov[i][j] = sd * sd; /* one parameter A = A12 = A21 */
    pb.dof = 0.0;                   /* normal draws */
    pw_unc_het_ctx c = pw_unc_het_azeo_ctx(PW_AZ_ISOTHERMAL, T_FIX);
    pb.fn = pw_unc_het_fn;
    pb.ctx = &c;
    pb.n_out = PW_UNC_HET_NOUT;
    pw_unc_options o = pw_unc_default_options();
    o.samples = 1000;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    assert_int_equal(r.point_status, PW_OK);
    pw_assert_close(r.out[PW_UNC_HET_Y].value, 0.5, 0.0, 1e-9, "y3 = 1/2 by symmetry");
    /* P3 = a1 P1sat + a2 P2sat = 200 kPa x_I exp(A x_II^2) (a1 = a2 by symmetry) */
    double xI = r.out[PW_UNC_HET_XI].value, xII = r.out[PW_UNC_HET_XII].value;
    pw_assert_close(r.out[PW_UNC_HET_TP].value, 200.0 * xI * exp(A * xII * xII), 1e-6, 0.0,
                    "P3 [kPa]");
    assert_int_equal(r.n_samples, 1000);
    assert_int_equal(r.n_failed, 0);
    assert_int_equal(r.n_feasible + r.n_infeasible, 1000);
    double p = gsl_cdf_ugaussian_P((A - 2.0) / sd);
    double tol = 4.0 * sqrt(p * (1.0 - p) / 1000.0);
    pw_assert_close(r.p_feasible, p, 0.0, tol, "share of draws that still split");
    /* layers of the symmetric model: x and 1 - x, so x_I + x_II = 1 in every feasible draw */
    pw_assert_close(r.out[PW_UNC_HET_XI].value + r.out[PW_UNC_HET_XII].value, 1.0, 0.0, 1e-9,
                    "symmetric layers");
    print_message("split kept in %zu of 1000 draws (expected %.1f)\n", r.n_feasible, 1000.0 * p);
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
    s.T_ref_K = 360.0;
    return s;
}

static void butanol_problem(pw_unc_problem *pb, pw_unc_het_ctx *c, size_t n_out)
{
    memset(pb, 0, sizeof *pb);
    pb->sys = butanol_water();
    pb->fitted[0] = pb->fitted[1] = true; /* alpha held */
    pb->cov[0][0] = 15.0 * 15.0;
    pb->cov[1][1] = 25.0 * 25.0;
    pb->cov[0][1] = pb->cov[1][0] = -0.5 * 15.0 * 25.0;
    pb->dof = 20.0;
    pb->fn = pw_unc_het_fn;
    pb->ctx = c;
    pb->n_out = n_out;
}

static void contains(const pw_unc_result *r, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        const pw_unc_output *o = &r->out[i];
        if (!(o->ci[0] <= o->value && o->value <= o->ci[1]))
            fail_msg("output %zu: %g outside its interval [%g, %g]", i, o->value, o->ci[0],
                     o->ci[1]);
        assert_true(o->lin_ok && o->mc_ok);
    }
}

static void butanol_azeotrope(void **state)
{
    (void)state;
    pw_unc_het_ctx c = pw_unc_het_azeo_ctx(PW_AZ_ISOBARIC, 101325.0);
    pw_unc_problem pb;
    butanol_problem(&pb, &c, PW_UNC_HET_NOUT);
    pw_unc_options o = pw_unc_default_options();
    o.samples = 60;
    pw_unc_result r, r2, r3;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    /* METHODS2 4.5 (computed there) */
    pw_assert_close(r.out[PW_UNC_HET_TP].value, 365.8298, 0.0, 2e-4, "T3");
    pw_assert_close(r.out[PW_UNC_HET_XI].value, 0.019001, 0.0, 2e-6, "x_I");
    pw_assert_close(r.out[PW_UNC_HET_XII].value, 0.387724, 0.0, 2e-6, "x_II");
    pw_assert_close(r.out[PW_UNC_HET_Y].value, 0.243893, 0.0, 2e-6, "y3");
    contains(&r, PW_UNC_HET_NOUT);
    assert_int_equal(r.n_infeasible, 0);
    /* delta method from an independent central difference of T3 (steps 0.5 K in b12, b21) */
    double g[2];
    for (int k = 0; k < 2; k++) {
        pw_system s = butanol_water();
        pw_three_phase tp, tm;
        s.params[k] += 0.5;
        assert_int_equal(pw_three_phase_at_P(&s, 101325.0, &tp), PW_OK);
        s.params[k] -= 1.0;
        assert_int_equal(pw_three_phase_at_P(&s, 101325.0, &tm), PW_OK);
        g[k] = (tp.T_K - tm.T_K) / 1.0;
    }
    double var = g[0] * g[0] * pb.cov[0][0] + 2.0 * g[0] * g[1] * pb.cov[0][1]
                 + g[1] * g[1] * pb.cov[1][1];
    pw_assert_close(r.out[PW_UNC_HET_TP].sd_lin, sqrt(var), 0.02, 0.0, "sd of T3 (delta method)");
    /* seeded reproducibility */
    assert_int_equal(pw_unc_propagate(&pb, &o, &r2), PW_OK);
    for (int i = 0; i < PW_UNC_HET_NOUT; i++) {
        assert_true(r.out[i].ci_mc[0] == r2.out[i].ci_mc[0]);
        assert_true(r.out[i].ci_mc[1] == r2.out[i].ci_mc[1]);
    }
    o.seed = 2;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r3), PW_OK);
    assert_true(r3.out[PW_UNC_HET_TP].ci_mc[0] != r.out[PW_UNC_HET_TP].ci_mc[0]);
}

static void butanol_decanter(void **state)
{
    (void)state;
    pw_decanter_spec sp = {.P_Pa = 101325.0, .zf = 0.2, .q = 1.0, .x_rich = 0.995, .x_lean = 0.001};
    pw_unc_het_ctx c = pw_unc_decanter_ctx(&sp, NULL);
    pw_unc_problem pb;
    butanol_problem(&pb, &c, PW_UNC_DEC_NOUT);
    pw_unc_options o = pw_unc_default_options();
    o.samples = 40;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    /* METHODS2 4.5 (computed there): boil-ups to 1e-4 relative */
    pw_assert_close(r.out[PW_UNC_DEC_SA].value, 4.22216, 1e-4, 0.0, "A boilup_min");
    pw_assert_close(r.out[PW_UNC_DEC_SB].value, 0.08004, 1e-3, 0.0, "B boilup_min");
    contains(&r, PW_UNC_DEC_NOUT);
    assert_int_equal(r.n_infeasible, 0);
    /* column A's bottoms just above the rich layer (0.387724 + 0.003): draws that move the layer
     * past it cannot make the product, counted, not failed */
    sp.x_rich = 0.391;
    c = pw_unc_decanter_ctx(&sp, NULL);
    pb.ctx = &c;
    pw_unc_result r2;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r2), PW_OK);
    assert_int_equal(r2.point_status, PW_OK);
    assert_true(r2.n_infeasible > 0);
    assert_true(r2.n_feasible > 0);
    assert_int_equal(r2.n_failed, 0);
    assert_int_equal(r2.n_feasible + r2.n_infeasible, r2.n_samples);
    print_message("decanter with x_rich = 0.391: feasible in %zu of %zu draws\n", r2.n_feasible,
                  r2.n_samples);
}

static void cooled_decanter_layers(void **state)
{
    (void)state;
    pw_decanter_spec sp = {.P_Pa = 101325.0, .zf = 0.2, .q = 1.0, .x_rich = 0.995, .x_lean = 0.001,
                           .T_decanter_K = 303.15};
    pw_unc_het_ctx c = pw_unc_decanter_ctx(&sp, NULL);
    pw_unc_problem pb;
    butanol_problem(&pb, &c, PW_UNC_DEC_NOUT);
    /* test_decanter.c's set near the NRTL fit with the 25 C tie line */
    pb.sys.params[0] = -23.1;
    pb.sys.params[1] = 1499.4;
    pb.sys.params[2] = 0.3;
    pb.sys.T_ref_K = 370.5;
    pw_unc_options o = pw_unc_default_options();
    o.samples = 40;
    pw_unc_result r;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    assert_int_equal(r.point_status, PW_OK);
    contains(&r, PW_UNC_DEC_NOUT);
    pw_lle_result l;
    assert_int_equal(pw_lle_solve(&pb.sys, 303.15, &l), PW_OK);
    assert_true(l.split);
    pw_assert_close(r.out[PW_UNC_DEC_TOP_LEAN].value, l.x[0], 0.0, 1e-9, "cooled lean layer");
    pw_assert_close(r.out[PW_UNC_DEC_TOP_RICH].value, l.x[1], 0.0, 1e-9, "cooled rich layer");
    /* cooled: not the boiling layers */
    assert_true(fabs(r.out[PW_UNC_DEC_TOP_LEAN].value - r.out[PW_UNC_HET_XI].value) > 1e-3);
    /* delta method from central differences of the layers at 30 C (steps 0.5 K) */
    double g[2][2];
    for (int k = 0; k < 2; k++) {
        pw_system s = pb.sys;
        pw_lle_result lp, lm;
        s.params[k] += 0.5;
        assert_int_equal(pw_lle_solve(&s, 303.15, &lp), PW_OK);
        s.params[k] -= 1.0;
        assert_int_equal(pw_lle_solve(&s, 303.15, &lm), PW_OK);
        for (int j = 0; j < 2; j++)
            g[j][k] = lp.x[j] - lm.x[j];
    }
    for (int j = 0; j < 2; j++) {
        double var = g[j][0] * g[j][0] * pb.cov[0][0] + 2.0 * g[j][0] * g[j][1] * pb.cov[0][1]
                     + g[j][1] * g[j][1] * pb.cov[1][1];
        pw_assert_close(r.out[j == 0 ? PW_UNC_DEC_TOP_LEAN : PW_UNC_DEC_TOP_RICH].sd_lin, sqrt(var),
                        0.02, 0.0, "sd of a cooled layer (delta method)");
    }
    /* not cooled: the decanter's layers are the boiling ones */
    sp.T_decanter_K = 0.0;
    c = pw_unc_decanter_ctx(&sp, NULL);
    pb.ctx = &c;
    o.samples = 10;
    assert_int_equal(pw_unc_propagate(&pb, &o, &r), PW_OK);
    assert_true(r.out[PW_UNC_DEC_TOP_LEAN].value == r.out[PW_UNC_HET_XI].value);
    assert_true(r.out[PW_UNC_DEC_TOP_RICH].value == r.out[PW_UNC_HET_XII].value);
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
        cmocka_unit_test(split_disappears),
        cmocka_unit_test(butanol_azeotrope),
        cmocka_unit_test(butanol_decanter),
        cmocka_unit_test(cooled_decanter_layers),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
