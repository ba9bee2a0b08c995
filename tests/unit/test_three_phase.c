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
 *    scan; pw_stability_min's geometric tails see it): the three-phase search at fixed P finds
 *    it, and the state found satisfies its
 *    defining equations (equal activities, P = a1 P1sat + a2 P2sat, tangent plane) checked
 *    here; with a layer beyond the 1e-12 floor it is refused (PW_ERANGE), not "no split".
 *    The parameters are a model case, not data;
 *  - a critical solution temperature between two temperatures of the search's 1 K grid:
 *    symmetric Margules splits exactly while A(T) > 2 (A(T) = A Tref/T: an upper critical
 *    temperature Tc = A Tref/2; A(T) = A T/Tref, a model written here: a lower one, Tc = 2 Tref/A),
 *    its layers are x and 1 - x with a1 = a2 = a, so P3 = a (P1sat + P2sat) (METHODS2 3.3, as
 *    above). T3 is solved here independently (the layer from ln[x/(1-x)] = A(2x - 1) and then
 *    a (P1sat + P2sat) = P, both by GSL Brent) for Tc moved in steps of 0.05 K across 1.2 K around
 *    the temperature where the critical liquid boils at P: the search must find the state exactly
 *    when it exists, however Tc falls between its grid points. */
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

/* A root of f on [lo, hi] by GSL Brent, to the given interval tolerances. */
static double brent(double (*f)(double, void *), void *c, double lo, double hi, double epsabs,
                    double epsrel)
{
    gsl_function F = {f, c};
    gsl_root_fsolver *rs = gsl_root_fsolver_alloc(gsl_root_fsolver_brent);
    assert_non_null(rs);
    assert_int_equal(gsl_root_fsolver_set(rs, &F, lo, hi), GSL_SUCCESS);
    double r = NAN;
    for (int it = 0; it < 400; it++) {
        gsl_root_fsolver_iterate(rs);
        r = gsl_root_fsolver_root(rs);
        if (gsl_root_test_interval(gsl_root_fsolver_x_lower(rs), gsl_root_fsolver_x_upper(rs),
                                   epsabs, epsrel) == GSL_SUCCESS)
            break;
    }
    gsl_root_fsolver_free(rs);
    return r;
}

/* Independent root of P1sat + P2sat = P by GSL Brent. */
static double immiscible_T(const pw_component *c1, const pw_component *c2, double P)
{
    sum_ctx c = {c1, c2, P};
    return brent(psat_sum, &c, 280.0, 372.0, 1e-12, 0.0);
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
        /* the split lies between the points of an even 499-point scan (D > 0 at all of them,
         * computed here); the stability scan's geometric tails see it */
        double min_even = INFINITY;
        for (int k = 1; k <= 499; k++) {
            pw_activity a;
            assert_int_equal(pw_system_activity(&s, k / 500.0, tp.T_K, &a), PW_OK);
            min_even = fmin(min_even, 1.0 / (k / 500.0 * (1.0 - k / 500.0)) + a.d2gE_dx2);
        }
        assert_true(min_even > 0.0);
        double min_D, x_min;
        assert_int_equal(pw_stability_min(&s, tp.T_K, &min_D, &x_min), PW_OK);
        assert_true(min_D < 0.0 && x_min > 0.998);
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

/* Symmetric Margules with A(T) = A T / T_ref: splits above Tc = 2 T_ref / A (a lower critical
 * solution temperature), written here as a model of its own. */
static pw_status lcst_check(const double *p)
{
    return isfinite(p[0]) ? PW_OK : PW_EDOM;
}

static pw_status lcst_eval(const double *p, double T_ref_K, double x1, double T_K, pw_activity *out)
{
    if (!out || !(x1 >= 0.0 && x1 <= 1.0) || !(T_K > 0.0))
        return PW_EDOM;
    memset(out, 0, sizeof *out);
    double x2 = 1.0 - x1, A = p[0] * T_K / T_ref_K;
    out->lngamma[0] = A * x2 * x2;
    out->lngamma[1] = A * x1 * x1;
    out->gE_RT = A * x1 * x2;
    out->d2gE_dx2 = -2.0 * A;
    out->dlngamma_dx1[0] = x2 * out->d2gE_dx2;
    out->dlngamma_dx1[1] = -x1 * out->d2gE_dx2;
    out->dlngamma_dT[0] = out->lngamma[0] / T_K;
    out->dlngamma_dT[1] = out->lngamma[1] / T_K;
    out->dlngamma_dp[0][0] = T_K / T_ref_K * x2 * x2;
    out->dlngamma_dp[1][0] = T_K / T_ref_K * x1 * x1;
    out->hE_Jmol = -PW_GAS_CONSTANT * T_K * T_K
                   * (x1 * out->dlngamma_dT[0] + x2 * out->dlngamma_dT[1]);
    return PW_OK;
}

static const char *const lcst_names[] = {"A"};
static const char *const lcst_units[] = {"-"};
static const double lcst_defaults[] = {0.0};
static const bool lcst_fitted[] = {true};
static const double lcst_starts[][2] = {{0.0, 3.0}};
static const pw_model_type lcst_model = {
    .name = "test-lcst",
    .title = "symmetric Margules with A(T) = A T/T_ref (test model)",
    .n_params = 1,
    .param_names = lcst_names,
    .param_units = lcst_units,
    .defaults = lcst_defaults,
    .fitted_default = lcst_fitted,
    .check = lcst_check,
    .eval = lcst_eval,
    .start_range = lcst_starts,
};

typedef struct {
    double A; /* A(T) of the symmetric split */
    const pw_system *s;
    double P, A0;
    bool lower; /* A(T) = A0 T/Tref, else A0 Tref/T */
} sym_ctx;

static double layer_eq(double x, void *vp)
{
    const sym_ctx *c = vp;
    return log(x / (1.0 - x)) - c->A * (2.0 * x - 1.0);
}

/* a of the symmetric split at A > 2 (independent of the library's LLE solver) */
static double sym_activity(double A)
{
    sym_ctx c = {.A = A};
    /* the lower layer lies in (0, 1/2): g < 0 near 0, g > 0 just below the inflection */
    double hi = 0.5 - sqrt(3.0 * (A - 2.0) / (2.0 * A * A * A)) * 0.5, lo = 1e-300;
    while (layer_eq(hi, &c) <= 0.0)
        hi = 0.5 * (hi + 0.5);
    double x = brent(layer_eq, &c, lo, hi, 0.0, 1e-15);
    return x * exp(A * (1.0 - x) * (1.0 - x));
}

static double sym_A(const sym_ctx *c, double T)
{
    return c->lower ? c->A0 * T / c->s->T_ref_K : c->A0 * c->s->T_ref_K / T;
}

static double sum_psat(const pw_system *s, double T)
{
    double p1, p2;
    assert_int_equal(pw_psat(&s->comp[0], T, &p1, NULL), PW_OK);
    assert_int_equal(pw_psat(&s->comp[1], T, &p2, NULL), PW_OK);
    return p1 + p2;
}

static double p3_minus_P(double T, void *vp)
{
    const sym_ctx *c = vp;
    double A = sym_A(c, T);
    double a = A > 2.0 ? sym_activity(A) : 0.5 * exp(0.5); /* the critical liquid at A = 2 */
    return a * sum_psat(c->s, T) - c->P;
}

static void critical_point_in_grid_cell(void **state)
{
    (void)state;
    const double P = 101325.0;
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = comp("ethanol");
    s.comp[1] = comp("water");
    s.T_ref_K = 300.0;
    /* T*: the critical liquid (A = 2, a = e^0.5 / 2) boils at P: 0.5 e^0.5 (P1sat + P2sat) = P */
    double Tstar = immiscible_T(&s.comp[0], &s.comp[1], P / (0.5 * exp(0.5)));
    size_t found_u = 0, none_u = 0, found_l = 0, none_l = 0;
    for (int k = -6; k <= 18; k++) {
        for (int lower = 0; lower <= 1; lower++) {
            /* upper critical point: Tc from T* - 0.3 K up; lower: from T* + 0.3 K down */
            double Tc = lower ? Tstar + 0.3 - 0.05 * (k + 6) : Tstar - 0.3 + 0.05 * (k + 6);
            sym_ctx c = {.s = &s, .P = P, .lower = lower != 0};
            if (lower) {
                s.model = &lcst_model;
                c.A0 = 2.0 * s.T_ref_K / Tc;
                s.params[0] = c.A0;
            } else {
                s.model = &pw_model_margules;
                c.A0 = 2.0 * Tc / s.T_ref_K;
                s.params[0] = s.params[1] = c.A0;
            }
            /* the independent answer: P3 rises with T on the split side; a state exists when P
             * lies between P3 at the critical point and P3 5 K into the split */
            double Tin = lower ? Tc + 1e-9 : Tc - 1e-9, Tfar = lower ? Tc + 5.0 : Tc - 5.0;
            double fin = p3_minus_P(Tin, &c), ffar = p3_minus_P(Tfar, &c);
            bool exists = lower ? (fin < 0.0 && ffar > 0.0) : (fin > 0.0 && ffar < 0.0);
            pw_three_phase tp;
            pw_status st = pw_three_phase_at_P(&s, P, &tp);
            if (st != PW_OK || tp.exists != exists)
                fail_msg("%s critical point at T* %+.2f K: status %d, exists %d, expected %d",
                         lower ? "lower" : "upper", Tc - Tstar, st, tp.exists, exists);
            if (!exists) {
                if (lower)
                    none_l++;
                else
                    none_u++;
                continue;
            }
            if (lower)
                found_l++;
            else
                found_u++;
            double T3 = brent(p3_minus_P, &c, fmin(Tin, Tfar), fmax(Tin, Tfar), 1e-10, 0.0);
            pw_assert_close(tp.T_K, T3, 0.0, 1e-6, "T3 against the closed form");
            double p1, p2;
            assert_int_equal(pw_psat(&s.comp[0], T3, &p1, NULL), PW_OK);
            assert_int_equal(pw_psat(&s.comp[1], T3, &p2, NULL), PW_OK);
            pw_assert_close(tp.y1, p1 / (p1 + p2), 0.0, 1e-6, "y3 = P1sat/(P1sat + P2sat)");
            pw_assert_close(tp.x[0] + tp.x[1], 1.0, 0.0, 1e-6, "symmetric layers");
        }
    }
    /* both outcomes on both sides, so the grid cells with a critical point were exercised */
    print_message("upper: %zu found, %zu none; lower: %zu found, %zu none\n", found_u, none_u, found_l, none_l);
    assert_true(found_u >= 10 && none_u >= 5 && found_l >= 10 && none_l >= 5);
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
        cmocka_unit_test(critical_point_in_grid_cell),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
