/* Three-phase (two liquids and vapor) equilibrium and heterogeneous azeotropes
 * (src/thermo/three_phase.c, src/analysis/azeotrope_het.c).
 *
 * Checks, with their sources:
 *  - closed form (derived in METHODS2 3.3 and re-derived here): symmetric Margules A = 3 gives
 *    layers x and 1 - x with a1 = a2, so y3 = P1sat/(P1sat + P2sat) exactly;
 *  - the near-immiscible limit as an identity: with mutual solubilities ~1e-9 the three-phase
 *    temperature solves P1sat(T) + P2sat(T) = P (solved here independently by GSL Brent) and
 *    y3 = P1sat/P;
 *  - handbook heterogeneous azeotropes of benzene/water (69.25 C, 91.2 wt% benzene) and
 *    toluene/water (84.1 C, 80.4 wt% toluene) at 1 atm (Horsley / CRC azeotrope tables, from
 *    memory, as quoted in METHODS2 3.3), which the near-immiscible limit meets to about 0.3 K;
 *  - the worked NRTL 1-butanol/water case of METHODS2 4.5 (computed there by its authors:
 *    T3 = 365.8298 K, layers 0.019001 / 0.387724, y3 = 0.243893), and its T3 against the
 *    handbook azeotrope 92.4 C (CRC 44th / Lange's 10th azeotrope table, per METHODS2 3.5) and
 *    92.7 C (Horsley, from memory) within 0.5 K;
 *  - the bubble point of either layer equals the three-phase point (an identity);
 *  - a split held entirely near a pure end (NRTL with a large tau12: the region where
 *    d2(Gmix/RT)/dx2 < 0 lies within 2e-3 of x1 = 1, between the points of a uniform 499-point
 *    scan): the three-phase search at fixed P finds it, and the state found satisfies its
 *    defining equations (equal activities, P = a1 P1sat + a2 P2sat, tangent plane) checked
 *    here; with a layer beyond the 1e-12 floor it is refused (PW_ERANGE), not "no split".
 *    The parameters are a model case, not data. */
#include "pw_test.h"

#include <float.h>
#include <gsl/gsl_errno.h>
#include <gsl/gsl_roots.h>
#include <math.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/lle.h>
#include <string.h>

static pw_complib lib;

static pw_component comp(const char *name)
{
    const pw_component *c = pw_complib_find(&lib, name);
    assert_non_null(c);
    return *c;
}

static pw_system margules(pw_component c1, pw_component c2, double A12, double A21)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = c1;
    s.comp[1] = c2;
    s.model = &pw_model_margules;
    s.params[0] = A12;
    s.params[1] = A21;
    s.T_ref_K = 350.0;
    return s;
}

/* A component with a constant vapor pressure P kPa (Antoine with B = 0). */
static pw_component flat(const char *name, double P_kPa)
{
    return pw_test_antoine(name, log(P_kPa), 0.0, 0.0, PW_LN, "kPa", "K", NAN, NAN);
}

static void closed_form_symmetric(void **state)
{
    (void)state;
    pw_system s = margules(flat("one", 150.0), flat("two", 100.0), 3.0, 3.0);
    s.T_ref_K = 300.0;
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_T(&s, 300.0, &tp), PW_OK);
    assert_true(tp.exists);
    /* METHODS2 3.3 (computed): x_I = 0.0707202, a = 0.943328, P3 = 235.832 kPa, y3 = 0.6 */
    pw_assert_close(tp.x[0], 0.0707202, 0.0, 1e-7, "x_I");
    pw_assert_close(tp.x[1], 1.0 - tp.x[0], 0.0, 1e-12, "x_II = 1 - x_I");
    pw_assert_close(tp.a[0], tp.a[1], 0.0, 1e-12, "a1 = a2");
    pw_assert_close(tp.a[0], 0.943328, 0.0, 1e-6, "a1");
    pw_assert_close(tp.P_Pa, 235832.0, 0.0, 1.0, "P3");
    pw_assert_close(tp.y1, 0.6, 0.0, 1e-12, "y3 = P1sat/(P1sat + P2sat)");
    assert_true(tp.heterogeneous_azeotrope);
    /* a vapor outside the layers: heterogeneous non-azeotrope (METHODS2 3.2) */
    s = margules(flat("one", 1000.0), flat("two", 10.0), 3.0, 3.0);
    s.T_ref_K = 300.0;
    assert_int_equal(pw_three_phase_at_T(&s, 300.0, &tp), PW_OK);
    assert_true(tp.exists);
    pw_assert_close(tp.y1, 1000.0 / 1010.0, 0.0, 1e-12, "y3");
    assert_false(tp.heterogeneous_azeotrope);
    pw_az_result r;
    memset(&r, 0, sizeof r);
    assert_int_equal(pw_azeotrope_heterogeneous(&s, PW_AZ_ISOTHERMAL, 300.0, &r, &tp, NULL), PW_OK);
    assert_true(tp.exists && !tp.heterogeneous_azeotrope);
    /* bubble pressure of an overall liquid inside the gap is the three-phase pressure */
    pw_eq_point e;
    bool three;
    assert_int_equal(pw_bubble_P_het(&s, 300.0, 0.5, &e, &three), PW_OK);
    assert_true(three);
    pw_assert_close(e.P_Pa, tp.P_Pa, 1e-14, 0.0, "P inside the gap");
    assert_int_equal(pw_bubble_P_het(&s, 300.0, 0.99, &e, &three), PW_OK);
    assert_false(three);
}

typedef struct sum_ctx {
    const pw_component *c1, *c2;
    double P;
} sum_ctx;

static double psat_sum(double T, void *p)
{
    sum_ctx *c = p;
    double p1, p2;
    if (pw_psat(c->c1, T, &p1, NULL) != PW_OK || pw_psat(c->c2, T, &p2, NULL) != PW_OK)
        return GSL_NAN;
    return p1 + p2 - c->P;
}

/* Independent root of P1sat + P2sat = P by GSL Brent. */
static double immiscible_T(const pw_component *c1, const pw_component *c2, double P)
{
    sum_ctx c = {c1, c2, P};
    gsl_function F = {psat_sum, &c};
    gsl_root_fsolver *s = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    gsl_root_fsolver_set(s, &F, 280.0, 372.0);
    double T = NAN;
    for (int i = 0; i < 200; i++) {
        gsl_root_fsolver_iterate(s);
        T = gsl_root_fsolver_root(s);
        if (gsl_root_test_interval(gsl_root_fsolver_x_lower(s), gsl_root_fsolver_x_upper(s), 1e-12,
                                   0.0) == GSL_SUCCESS)
            break;
    }
    gsl_root_fsolver_free(s);
    return T;
}

static void immiscible_limit(void **state)
{
    (void)state;
    static const struct {
        const char *name;
        double M, T_C, wt, T3_C_brief, y3_brief;
    } rows[] = {
        /* handbook azeotrope (from memory, METHODS2 3.3); brief's computed limit (METHODS2 3.3) */
        {"benzene", 78.11, 69.25, 91.2, 69.05, 0.7046},
        {"toluene", 92.14, 84.1, 80.4, 84.30, 0.4443},
    };
    const double P = 101325.0;
    for (size_t i = 0; i < 2; i++) {
        pw_component o = comp(rows[i].name), w = comp("water");
        pw_system s = margules(o, w, 16.0, 16.0); /* solubilities ~ exp(-16) = 1e-7 */
        s.T_ref_K = 350.0;
        pw_three_phase tp;
        assert_int_equal(pw_three_phase_at_P(&s, P, &tp), PW_OK);
        assert_true(tp.exists && tp.heterogeneous_azeotrope);
        double T = immiscible_T(&o, &w, P), p1;
        assert_int_equal(pw_psat(&o, T, &p1, NULL), PW_OK);
        pw_assert_close(tp.T_K, T, 0.0, 1e-5, "T3 = root of P1sat + P2sat = P");
        pw_assert_close(tp.y1, p1 / P, 0.0, 1e-6, "y3 = P1sat/P");
        pw_assert_close(tp.T_K - 273.15, rows[i].T3_C_brief, 0.0, 0.01, "METHODS2 3.3 computed T3");
        pw_assert_close(tp.y1, rows[i].y3_brief, 0.0, 1e-4, "METHODS2 3.3 computed y3");
        /* handbook: within 0.3 K and 1 wt% (METHODS2 3.3: the limit holds to about 0.3 K) */
        pw_assert_close(tp.T_K - 273.15, rows[i].T_C, 0.0, 0.3, "handbook azeotrope T");
        double wt = 100.0 * tp.y1 * rows[i].M / (tp.y1 * rows[i].M + (1.0 - tp.y1) * 18.015);
        pw_assert_close(wt, rows[i].wt, 0.0, 1.0, "handbook azeotrope wt%");
    }
}

static void butanol_water_nrtl(void **state)
{
    (void)state;
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = comp("1-butanol");
    s.comp[1] = comp("water");
    s.model = &pw_model_nrtl;
    s.params[0] = 360.0;
    s.params[1] = 1296.0;
    s.params[2] = 0.47;
    s.T_ref_K = 360.0;
    const double P = 101325.0;
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&s, P, &tp), PW_OK);
    assert_true(tp.exists && tp.heterogeneous_azeotrope);
    pw_assert_close(tp.T_K, 365.8298, 0.0, 2e-4, "METHODS2 4.5 T3");
    pw_assert_close(tp.x[0], 0.019001, 0.0, 2e-6, "METHODS2 4.5 x_I");
    pw_assert_close(tp.x[1], 0.387724, 0.0, 2e-6, "METHODS2 4.5 x_II");
    pw_assert_close(tp.y1, 0.243893, 0.0, 2e-6, "METHODS2 4.5 y3");
    pw_assert_close(tp.T_K - 273.15, 92.55, 0.0, 0.5, "handbook 92.4 C (table) / 92.7 C (Horsley)");
    /* the bubble point of either layer is the three-phase point */
    for (int k = 0; k < 2; k++) {
        pw_eq_point e;
        assert_int_equal(pw_bubble_T(&s, P, tp.x[k], &e), PW_OK);
        pw_assert_close(e.T_K, tp.T_K, 0.0, 1e-6, "bubble T of a layer");
        pw_assert_close(e.y1, tp.y1, 0.0, 1e-7, "bubble y of a layer");
    }
    /* overall liquid inside the gap boils at T3 with the three-phase vapor */
    pw_eq_point e;
    bool three;
    assert_int_equal(pw_bubble_T_het(&s, P, 0.2, &e, &three), PW_OK);
    assert_true(three);
    pw_assert_close(e.T_K, tp.T_K, 0.0, 1e-9, "T inside the gap");
    assert_int_equal(pw_bubble_T_het(&s, P, 0.7, &e, &three), PW_OK);
    assert_false(three);
    assert_true(e.T_K > tp.T_K);
    /* the homogeneous search crosses y = x inside the gap: not an azeotrope */
    pw_az_result r;
    assert_int_equal(pw_azeotrope_find(&s, PW_AZ_ISOBARIC, P, NULL, &r), PW_OK);
    size_t inside = 0;
    for (size_t i = 0; i < r.n; i++)
        if (r.az[i].x1 > tp.x[0] && r.az[i].x1 < tp.x[1])
            inside++;
    size_t removed;
    assert_int_equal(pw_azeotrope_heterogeneous(&s, PW_AZ_ISOBARIC, P, &r, &tp, &removed), PW_OK);
    assert_true(inside >= 1);
    assert_true(removed >= inside);
    for (size_t i = 0; i < r.n; i++)
        assert_false(r.az[i].x1 > tp.x[0] && r.az[i].x1 < tp.x[1]);
    /* fixed T: P3 from the LLE at T3 reproduces 1 atm */
    pw_three_phase tq;
    assert_int_equal(pw_three_phase_at_T(&s, tp.T_K, &tq), PW_OK);
    pw_assert_close(tq.P_Pa, P, 1e-7, 0.0, "P3 at T3");
}

/* NRTL water (1) / 1-butanol (2) with tau12 = b12/T large and tau21 = 0: the term
 * tau12 G12 / (x2 + x1 G12) bends Gmix down only where x2 ~ G12 = exp(-alpha tau12). */
static pw_system end_split(double tau12_at_360, double alpha)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = comp("water");
    s.comp[1] = comp("1-butanol");
    s.model = &pw_model_nrtl;
    s.params[0] = tau12_at_360 * 360.0;
    s.params[1] = 0.0;
    s.params[2] = alpha;
    s.T_ref_K = 360.0;
    return s;
}

static void split_near_pure_end(void **state)
{
    (void)state;
    const double P = 101325.0;
    static const double cases[][2] = {{13, 0.60}, {16, 0.55}, {18, 0.45}, {21, 0.40}};
    for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
        pw_system s = end_split(cases[k][0], cases[k][1]);
        pw_three_phase tp;
        assert_int_equal(pw_three_phase_at_P(&s, P, &tp), PW_OK);
        if (!tp.exists)
            fail_msg("tau12 %g alpha %g: no three-phase state found", cases[k][0], cases[k][1]);
        /* the coarse uniform scan sees a stable liquid here: the split lies between its points */
        double min_D, x_min;
        assert_int_equal(pw_stability_min(&s, tp.T_K, &min_D, &x_min), PW_OK);
        assert_true(min_D > 0.0);
        assert_true(1.0 - tp.x[0] < 2e-2 && tp.x[0] < tp.x[1]);
        /* defining equations, from the model's activities at both layers (the complement of a
         * layer within 1e-8 of x1 = 1 carries the rounding of 1 - x1: eps / x2 relative) */
        pw_activity aI, aII;
        assert_int_equal(pw_system_activity(&s, tp.x[0], tp.T_K, &aI), PW_OK);
        assert_int_equal(pw_system_activity(&s, tp.x[1], tp.T_K, &aII), PW_OK);
        double x2I = 1.0 - tp.x[0], x2II = 1.0 - tp.x[1];
        double la1I = log(tp.x[0]) + aI.lngamma[0], la1II = log(tp.x[1]) + aII.lngamma[0];
        double la2I = log(x2I) + aI.lngamma[1], la2II = log(x2II) + aII.lngamma[1];
        pw_assert_close(la1I, la1II, 0.0, 1e-9, "ln a1 equal in both layers");
        pw_assert_close(la2I, la2II, 0.0, 1e-9 + 4.0 * DBL_EPSILON / x2II, "ln a2 equal");
        double p1, p2;
        assert_int_equal(pw_psat(&s.comp[0], tp.T_K, &p1, NULL), PW_OK);
        assert_int_equal(pw_psat(&s.comp[1], tp.T_K, &p2, NULL), PW_OK);
        double P3 = exp(la1I) * p1 + exp(la2I) * p2;
        pw_assert_close(P3, P, 1e-7, 0.0, "a1 P1sat + a2 P2sat = P");
        pw_assert_close(tp.y1, exp(la1I) * p1 / P3, 1e-7, 0.0, "y3 = a1 P1sat / P");
        double tpd;
        assert_int_equal(pw_lle_tpd_min(&s, tp.T_K, tp.x[0], tp.x[1], 10001, &tpd, NULL), PW_OK);
        assert_true(tpd >= -1e-10);
    }
    /* a layer beyond the floor: refused, never "no three-phase state" */
    pw_system s = end_split(30.0, 0.30);
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&s, P, &tp), PW_ERANGE);
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
        cmocka_unit_test(closed_form_symmetric),
        cmocka_unit_test(immiscible_limit),
        cmocka_unit_test(butanol_water_nrtl),
        cmocka_unit_test(split_near_pure_end),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
