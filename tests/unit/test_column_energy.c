/* The energy-balance column (Ponchon 1921; Savarit 1922) and the enthalpy model, checked as
 * identities:
 *  - equal heats of vaporization, no heat capacities and H^E = 0: the constant-molal-overflow
 *    results (R_min against Underwood 1948 and against the column module's own search, stages
 *    against its stepping), also for seeded random specifications;
 *  - unequal heats with no heat capacities and H^E = 0: constant overflow holds exactly in
 *    "pseudo-moles" weighted by the heats (METHODS2 5.4(b), derived), so R_min is Underwood's in
 *    the transformed compositions;
 *  - the overall energy balance and every stage's mass and energy balances close;
 *  - H^E of every model against finite differences of G^E/RT in T (Gibbs-Helmholtz);
 *  - the pure vapor enthalpy's implied latent heat follows Kirchhoff's law (METHODS2 5.1). */
#include "design_systems.h"

#include <pinchwise/curve.h>
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

static void solve_ok(const pw_system *sys, const pw_heat_data *h, pw_column_spec s,
                     pw_energy_result *r, pw_design_table *t)
{
    assert_int_equal(pw_energy_column_solve(sys, h, P_PA, &s, NULL, r, t), PW_OK);
    if (!r->feasible)
        fail_msg("infeasible: %s", r->reason);
}

/* (a) Equal heats, no heat capacities, ideal liquid: Underwood's R_min, the CMO stages. */
static void test_equal_heats_constant_alpha(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(2.5);
    const double lam = 30000.0;
    pw_heat_data h = heats(&sys, lam, lam, 0, 0, 0, 0);
    const double qs[] = {1.0, 0.0, 0.5, 1.4, -0.2};
    for (size_t i = 0; i < sizeof qs / sizeof qs[0]; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = qs[i]};
        pw_energy_result r;
        pw_design_table t;
        solve_ok(&sys, &h, s, &r, &t);
        double ru;
        assert_int_equal(pw_underwood_rmin(2.5, s.zf, s.xd, s.q, &ru), PW_OK);
        pw_assert_close(r.r_min, ru, 1e-7, 0, "R_min = Underwood (1948)");
        assert_int_equal(r.pinch.kind, PW_PINCH_FEED);
        pw_design_table cmo;
        assert_int_equal(pw_design_cmo(&sys, P_PA, &s, ru, r.n_min, NULL, &cmo), PW_OK);
        const double D = 0.5;
        for (size_t k = 0; k < t.n; k++) {
            assert_true(t.row[k].reachable);
            pw_assert_close(t.row[k].stages, cmo.row[k].stages, 1e-5, 0, "stages = CMO");
            assert_int_equal(t.row[k].feed_stage, cmo.row[k].feed_stage);
            pw_assert_close(t.row[k].boilup, cmo.row[k].boilup, 1e-6, 0, "boil-up = CMO");
            pw_assert_close(t.row[k].Q_C, (t.row[k].R + 1.0) * D * lam, 1e-12, 0, "Q_C");
            pw_assert_close(t.row[k].Q_R, t.row[k].Q_C - (1.0 - s.q) * lam, 1e-9, 1e-9, "Q_R");
            assert_true(t.row[k].Q_C > 0.0 && t.row[k].Q_R > 0.0);
        }
        pw_design_table_free(&t);
        pw_design_table_free(&cmo);
    }
}

/* A non-ideal liquid without H^E: Wilson with a12 = a21 = 0 and a volume ratio of 4 (G^E/RT
 * independent of T). Invented parameters. */
static pw_system wilson_athermal(void)
{
    pw_system s = design_ideal_system(2.0);
    s.model = &pw_model_wilson;
    s.params[0] = 0.0;
    s.params[1] = 0.0;
    s.params[2] = 4.0;
    return s;
}

/* (a) on seeded random specifications and two curves: against the column module's search, an
 * independent implementation (slopes of straight operating lines, not difference points). */
static void test_equal_heats_random(void **state)
{
    (void)state;
    srand(424242u);
    pw_system systems[2] = {design_ideal_system(1.6), wilson_athermal()};
    int compared = 0, tangent = 0;
    for (int t = 0; t < 24; t++) {
        const pw_system *sys = &systems[t % 2];
        pw_heat_data h = heats(sys, 35000.0, 35000.0, 0, 0, 0, 0);
        pw_column_spec s;
        s.xb = 0.01 + 0.2 * rand() / (double)RAND_MAX;
        s.xd = 0.75 + 0.24 * rand() / (double)RAND_MAX;
        s.zf = s.xb + (s.xd - s.xb) * (0.15 + 0.7 * rand() / (double)RAND_MAX);
        s.q = -0.2 + 1.6 * rand() / (double)RAND_MAX;
        pw_system_curve sc;
        assert_int_equal(pw_system_curve_init(&sc, sys, P_PA), PW_OK);
        pw_curve c = pw_system_curve_bind(&sc);
        pw_column_result col;
        pw_column_options o = pw_column_default_options();
        o.n_factors = 0;
        assert_int_equal(pw_column_solve(&c, &s, &o, &col), PW_OK);
        pw_energy_result r;
        assert_int_equal(pw_energy_column_solve(sys, &h, P_PA, &s, &o, &r, NULL), PW_OK);
        assert_int_equal(r.feasible, col.feasible);
        if (!col.feasible || col.reflux_limited || col.boilup_limited || !r.feasible)
            continue;
        pw_assert_close(r.r_min, col.r_min, 1e-6, 1e-9, "R_min = column module's");
        assert_int_equal(r.pinch.kind, col.pinch.kind);
        compared++;
        if (col.pinch.kind == PW_PINCH_TANGENT) {
            tangent++;
            assert_int_equal(r.pinch.section, col.pinch.section);
            pw_assert_close(r.pinch.x, col.pinch.x, 0, 1e-4, "tangent pinch location");
        }
    }
    print_message("equal heats: %d random specifications compared, %d tangent pinches\n", compared,
                  tangent);
    assert_true(compared >= 16);
}

/* (a) where a flow, not a pinch, limits: a dilute vapor-rich feed whose tie line falls below xb
 * (zero reboiler duty limits, as zero boil-up does with constant overflow), a cold feed rich in
 * component 1 (no reflux needed), and rectifying tangent pinches above such feeds. */
static void test_equal_heats_flow_limits(void **state)
{
    (void)state;
    pw_system systems[2] = {design_ideal_system(4.0), wilson_athermal()};
    struct {
        double xd, xb, zf, q;
    } c[] = {
        {0.9, 0.02, 0.05, 0.5}, {0.9, 0.02, 0.05, 0.0}, {0.9, 0.02, 0.05, -0.3},
        {0.98, 0.3, 0.95, 3.0}, {0.98, 0.3, 0.9, 6.0},  {0.9, 0.02, 0.05, 1.0},
    };
    int flow_limited = 0;
    for (int k = 0; k < 2; k++) {
        pw_heat_data h = heats(&systems[k], 30000.0, 30000.0, 0, 0, 0, 0);
        for (size_t i = 0; i < sizeof c / sizeof c[0]; i++) {
            pw_column_spec s = {c[i].xd, c[i].xb, c[i].zf, c[i].q};
            pw_system_curve sc;
            assert_int_equal(pw_system_curve_init(&sc, &systems[k], P_PA), PW_OK);
            pw_curve cv = pw_system_curve_bind(&sc);
            pw_column_result col;
            pw_column_options o = pw_column_default_options();
            o.n_factors = 0;
            assert_int_equal(pw_column_solve(&cv, &s, &o, &col), PW_OK);
            pw_energy_result r;
            assert_int_equal(pw_energy_column_solve(&systems[k], &h, P_PA, &s, &o, &r, NULL),
                             PW_OK);
            assert_int_equal(r.feasible, col.feasible);
            if (!col.feasible)
                continue;
            pw_assert_close(r.r_min, col.r_min, 1e-6, 1e-9, "R_min = column module's");
            assert_int_equal(r.reflux_limited, col.reflux_limited);
            if (col.boilup_limited && col.pinch.kind == PW_PINCH_FEED)
                assert_true(r.boilup_limited);
            flow_limited += r.boilup_limited || r.reflux_limited;
        }
    }
    assert_true(flow_limited >= 4);
}

/* (b) Unequal heats, no heat capacities, H^E = 0: CMO in pseudo-moles x' = k x/(k x + 1 - x),
 * k = l1/l2 (METHODS2 5.4(b), derived): R_min = Underwood(alpha, z', xd', q). The brief's numbers
 * for alpha 2.5, z 0.5, xd 0.95, xb 0.05, l = 30 and 40 kJ/mol: 1.262295 (q = 1), 2.557377
 * (q = 0); at 1.2 R_min with q = 1, Q_C/F = Q_R/F = 38.35 kJ/mol (computed). */
static double pseudo(double k, double x)
{
    return k * x / (k * x + 1.0 - x);
}

static void test_unequal_heats_pseudo_moles(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(2.5);
    pw_heat_data h = heats(&sys, 30000.0, 40000.0, 0, 0, 0, 0);
    const double k = 0.75, want[2] = {1.262295, 2.557377}, qs[2] = {1.0, 0.0};
    for (int i = 0; i < 2; i++) {
        pw_column_spec s = {.xd = 0.95, .xb = 0.05, .zf = 0.5, .q = qs[i]};
        pw_energy_result r;
        pw_design_table t;
        solve_ok(&sys, &h, s, &r, &t);
        double ru;
        assert_int_equal(pw_underwood_rmin(2.5, pseudo(k, s.zf), pseudo(k, s.xd), s.q, &ru), PW_OK);
        pw_assert_close(r.r_min, ru, 1e-7, 0, "R_min = Underwood in pseudo-moles");
        pw_assert_close(r.r_min, want[i], 0, 1e-6, "R_min (METHODS2 5.4(b))");
        if (i == 0) {
            pw_assert_close(t.row[0].Q_C / 1e3, 38.35, 0, 0.005, "Q_C/F at 1.2 R_min");
            pw_assert_close(t.row[0].Q_R / 1e3, 38.35, 0, 0.005, "Q_R/F at 1.2 R_min");
        }
        pw_design_table_free(&t);
    }
}

/* (b) on seeded random specifications and a non-ideal (athermal Wilson) curve, tangent pinches
 * included: the energy column with unequal heats equals the column module's constant-overflow
 * search on the curve mapped to pseudo-moles, y'(x') = p(y*(p^-1(x'))), p(x) = k x/(k x + 1 - x)
 * (METHODS2 5.4(b): exact for q = 1 and q = 0, which keep their q). */
typedef struct pseudo_curve {
    pw_system_curve sc;
    double k;
} pseudo_curve;

static pw_status pseudo_y(void *ctx, double xp, double *yp)
{
    pseudo_curve *c = ctx;
    double x = xp / (c->k - c->k * xp + xp), y;
    pw_status st = pw_system_curve_y(&c->sc, x, &y);
    if (st == PW_OK)
        *yp = pseudo(c->k, y);
    return st;
}

static void test_unequal_heats_random(void **state)
{
    (void)state;
    srand(99991u);
    pw_system sys = wilson_athermal();
    const double l1 = 30000.0, l2 = 40000.0, k = l1 / l2;
    pw_heat_data h = heats(&sys, l1, l2, 0, 0, 0, 0);
    pseudo_curve pc = {.k = k};
    assert_int_equal(pw_system_curve_init(&pc.sc, &sys, P_PA), PW_OK);
    pw_curve cv = {pseudo_y, &pc};
    int compared = 0, tangent = 0;
    for (int t = 0; t < 20; t++) {
        pw_column_spec s;
        s.xb = 0.01 + 0.2 * rand() / (double)RAND_MAX;
        s.xd = 0.75 + 0.24 * rand() / (double)RAND_MAX;
        s.zf = s.xb + (s.xd - s.xb) * (0.15 + 0.7 * rand() / (double)RAND_MAX);
        s.q = t % 2 ? 1.0 : 0.0;
        pw_column_spec sp = {pseudo(k, s.xd), pseudo(k, s.xb), pseudo(k, s.zf), s.q};
        pw_column_options o = pw_column_default_options();
        o.n_factors = 0;
        pw_column_result col;
        assert_int_equal(pw_column_solve(&cv, &sp, &o, &col), PW_OK);
        pw_energy_result r;
        assert_int_equal(pw_energy_column_solve(&sys, &h, P_PA, &s, &o, &r, NULL), PW_OK);
        assert_int_equal(r.feasible, col.feasible);
        if (!col.feasible || col.reflux_limited || col.boilup_limited)
            continue;
        pw_assert_close(r.r_min, col.r_min, 1e-6, 1e-9, "R_min = CMO in pseudo-moles");
        assert_int_equal(r.pinch.kind, col.pinch.kind);
        if (col.pinch.kind == PW_PINCH_TANGENT) {
            double x = col.pinch.x / (k - k * col.pinch.x + col.pinch.x);
            pw_assert_close(r.pinch.x, x, 0, 1e-4, "tangent pinch liquid");
            tangent++;
        }
        compared++;
    }
    print_message("unequal heats: %d random specifications compared, %d tangent pinches\n",
                  compared, tangent);
    assert_true(compared >= 14 && tangent >= 2);
}

/* An invented non-ideal liquid with H^E (NRTL b12 = 150 K, b21 = 100 K, alpha 0.3) and
 * invented heat data of the size of an alcohol and water. */
static pw_system nrtl_system(void)
{
    pw_system s = design_ideal_system(3.0);
    s.model = &pw_model_nrtl;
    s.params[0] = 150.0;
    s.params[1] = 100.0;
    s.params[2] = 0.3;
    return s;
}

static double liquid_h(const pw_system *sys, const pw_heat_data *h, double x, double T)
{
    double v;
    assert_int_equal(pw_enthalpy_liquid(sys, h, x, T, &v), PW_OK);
    return v;
}

/* Overall balance F h_F + Q_R = D h_D + B h_B + Q_C, and every stage's mass and energy balance
 * (liquid from above, vapor from below, the feed on its stage) along the stepped profile. */
static void test_balances_close(void **state)
{
    (void)state;
    pw_system sys = nrtl_system();
    pw_heat_data h = heats(&sys, 36000.0, 41000.0, 110.0, 76.0, 60.0, 34.0);
    const double qs[] = {1.0, 0.3, 1.2};
    for (size_t i = 0; i < 3; i++) {
        pw_column_spec s = {.xd = 0.9, .xb = 0.03, .zf = 0.4, .q = qs[i]};
        pw_energy_result r;
        pw_design_table t;
        solve_ok(&sys, &h, s, &r, &t);
        double hF;
        assert_int_equal(pw_enthalpy_feed(&sys, &h, P_PA, s.zf, s.q, &hF), PW_OK);
        pw_assert_close(r.h_F, hF, 1e-9, 1e-6, "h_F = H_V - q (H_V - h_L)");
        const double D = (s.zf - s.xb) / (s.xd - s.xb), B = 1.0 - D;
        for (size_t k = 0; k < t.n; k++) {
            const pw_design_case *c = &t.row[k];
            assert_true(c->reachable && c->Q_C > 0.0 && c->Q_R > 0.0);
            pw_assert_close(hF + c->Q_R, D * r.h_D + B * r.h_B + c->Q_C, 1e-9, 1e-9,
                            "overall energy balance");
            pw_assert_close(c->Q_C, (c->R + 1.0) * D * (r.H_top - r.h_D), 1e-12, 0, "Q_C");
            const pw_profile *p = &c->profile;
            for (size_t n = 0; n + 1 < p->n; n++) {
                const pw_stage *g = &p->stage[n], *below = &p->stage[n + 1];
                double Lin = n == 0 ? c->R * D : p->stage[n - 1].L;
                double xin = n == 0 ? s.xd : p->stage[n - 1].x;
                double hin =
                    n == 0 ? r.h_D : liquid_h(&sys, &h, p->stage[n - 1].x, p->stage[n - 1].T_K);
                double F = (int)n + 1 == p->feed_stage ? 1.0 : 0.0;
                double Hb = pw_enthalpy_vapor(&h, below->y, below->T_K);
                double Hg = pw_enthalpy_vapor(&h, g->y, g->T_K);
                double hg = liquid_h(&sys, &h, g->x, g->T_K);
                pw_assert_close(Lin + below->V + F, g->L + g->V, 1e-10, 1e-12, "stage total");
                pw_assert_close(Lin * xin + below->V * below->y + F * s.zf,
                                g->L * g->x + g->V * g->y, 1e-9, 1e-11, "stage component");
                pw_assert_close(Lin * hin + below->V * Hb + F * hF, g->L * hg + g->V * Hg, 1e-7,
                                1e-4, "stage energy");
            }
        }
        pw_design_table_free(&t);
    }
}

/* With heat capacities, unequal heats and H^E, on seeded random specifications: the R_min of the
 * tie-line search against the stepping itself, a separate code path (difference-point lines, no
 * tie-line extension): at 1.001 R_min the staircase reaches xb, at 0.999 R_min it cannot (a pinch
 * stops it, or it creeps past any stage limit). Geometry, not a recalled value. */
static void test_rmin_against_stepping(void **state)
{
    (void)state;
    srand(31337u);
    pw_system systems[3] = {nrtl_system(), wilson_athermal(), wilson_athermal()};
    systems[1].params[0] = 250.0; /* Wilson with H^E: a12 = 250 K, a21 = 400 K (invented) */
    systems[1].params[1] = 400.0;
    int checked = 0, tangent = 0;
    for (int t = 0; t < 18; t++) {
        const pw_system *sys = &systems[t % 3]; /* the third: tangent pinches */
        pw_heat_data h =
            heats(sys, 30000.0 + 12000.0 * rand() / (double)RAND_MAX,
                  30000.0 + 12000.0 * rand() / (double)RAND_MAX, 110.0, 76.0, 60.0, 34.0);
        pw_column_spec s;
        s.xb = 0.02 + 0.1 * rand() / (double)RAND_MAX;
        s.xd = 0.8 + 0.19 * rand() / (double)RAND_MAX;
        s.zf = s.xb + (s.xd - s.xb) * (0.2 + 0.6 * rand() / (double)RAND_MAX);
        s.q = 0.2 + 1.0 * rand() / (double)RAND_MAX;
        pw_energy_result r;
        pw_column_options o = pw_column_default_options();
        o.n_factors = 0;
        assert_int_equal(pw_energy_column_solve(sys, &h, P_PA, &s, &o, &r, NULL), PW_OK);
        if (!r.feasible || r.reflux_limited || r.boilup_limited)
            continue;
        pw_profile p;
        assert_int_equal(
            pw_energy_profile(sys, &h, P_PA, &s, 1.001 * r.r_min, 5000, &p, NULL, NULL), PW_OK);
        pw_profile_free(&p);
        pw_status below =
            pw_energy_profile(sys, &h, P_PA, &s, 0.999 * r.r_min, 3000, &p, NULL, NULL);
        pw_profile_free(&p);
        if (below != PW_EINFEASIBLE && below != PW_EMAXITER)
            fail_msg("case %d: stepping at 0.999 R_min = %g reached xb (status %d)", t,
                     0.999 * r.r_min, below);
        checked++;
        tangent += r.pinch.kind == PW_PINCH_TANGENT;
    }
    print_message("energy R_min against stepping: %d specifications, %d tangent pinches\n", checked,
                  tangent);
    assert_true(checked >= 12 && tangent >= 2);
}

/* Gibbs-Helmholtz: H^E = -R T^2 d(G^E/RT)/dT, against central differences (invented parameters
 * for each model). */
static void test_hE_gibbs_helmholtz(void **state)
{
    (void)state;
    struct {
        const pw_model_type *m;
        double p[3];
    } cases[] = {
        {&pw_model_margules, {0.8, 1.3, 0}},
        {&pw_model_vanlaar, {1.1, 0.7, 0}},
        {&pw_model_wilson, {250.0, 400.0, 2.2}},
        {&pw_model_nrtl, {-120.0, 420.0, 0.3}},
    };
    for (size_t i = 0; i < 4; i++) {
        pw_system s = design_ideal_system(2.0);
        s.model = cases[i].m;
        for (int j = 0; j < 3; j++)
            s.params[j] = cases[i].p[j];
        for (double x = 0.1; x < 0.95; x += 0.2)
            for (double T = 300.0; T < 420.0; T += 40.0) {
                pw_activity a, ap, am;
                const double dT = 1e-3;
                assert_int_equal(pw_system_activity(&s, x, T, &a), PW_OK);
                assert_int_equal(pw_system_activity(&s, x, T + dT, &ap), PW_OK);
                assert_int_equal(pw_system_activity(&s, x, T - dT, &am), PW_OK);
                double fd = -PW_GAS_CONSTANT * T * T * (ap.gE_RT - am.gE_RT) / (2.0 * dT);
                pw_assert_close(a.hE_Jmol, fd, 1e-6, 1e-6, cases[i].m->name);
                pw_heat_data h = heats(&s, 30000.0, 40000.0, 100.0, 80.0, 50.0, 30.0);
                double hl = liquid_h(&s, &h, x, T);
                pw_assert_close(hl, (x * 100.0 + (1.0 - x) * 80.0) * (T - 298.15) + a.hE_Jmol,
                                1e-12, 1e-9, "h_L = sum x cpL (T - T0) + H^E");
            }
    }
}

/* Kirchhoff: H_i^V(T) - cpL_i (T - T0) = dHvap_i + (cpV_i - cpL_i)(T - Tb_i) (METHODS2 5.1), the
 * latent heat at Tb is dHvap, and Tb is where the component's own equation gives 101.325 kPa. */
static void test_pure_vapor_enthalpy(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(2.0);
    pw_heat_data h = heats(&sys, 35210.0, 40660.0, 81.1, 75.3, 44.1, 33.6);
    pw_heat_data g;
    sys.comp[0].prop[PW_PROP_DHVAP] = 35210.0;
    sys.comp[0].prop[PW_PROP_CPL] = 81.1;
    sys.comp[0].prop[PW_PROP_CPV] = 44.1;
    sys.comp[1].prop[PW_PROP_DHVAP] = 40660.0;
    sys.comp[1].prop[PW_PROP_CPL] = 75.3;
    sys.comp[1].prop[PW_PROP_CPV] = 33.6;
    pw_error err;
    assert_int_equal(pw_heat_data_from_system(&sys, &g, &err), PW_OK);
    for (int i = 0; i < 2; i++) {
        pw_assert_close(g.Tb_K[i], h.Tb_K[i], 1e-14, 0, "Tb");
        double P;
        assert_int_equal(pw_psat(&sys.comp[i], g.Tb_K[i], &P, NULL), PW_OK);
        pw_assert_close(P, 101325.0, 1e-10, 0, "Psat(Tb) = 101.325 kPa");
        pw_assert_close(pw_enthalpy_vapor_pure(&g, i, g.Tb_K[i]) -
                            g.cpL[i] * (g.Tb_K[i] - PW_T0_ENTHALPY_K),
                        g.dHvap[i], 1e-12, 0, "latent heat at Tb");
        for (double T = 300.0; T < 450.0; T += 25.0)
            pw_assert_close(pw_enthalpy_vapor_pure(&g, i, T) - g.cpL[i] * (T - PW_T0_ENTHALPY_K),
                            g.dHvap[i] + (g.cpV[i] - g.cpL[i]) * (T - g.Tb_K[i]), 1e-12, 1e-9,
                            "Kirchhoff");
    }
    pw_assert_close(pw_latent_heat_mismatch(&sys), 5450.0 / 35210.0, 1e-12, 0, "mismatch");
    assert_true(pw_cmo_doubtful(&sys)); /* 15.5 % > 10 % (common practice) */
    {
        pw_system t = sys; /* equal heats: not doubtful; one unknown: not decided */
        t.comp[1].prop[PW_PROP_DHVAP] = t.comp[0].prop[PW_PROP_DHVAP];
        assert_false(pw_cmo_doubtful(&t));
        t.comp[1].prop[PW_PROP_DHVAP] = NAN;
        assert_false(pw_cmo_doubtful(&t));
    }
    sys.comp[1].prop[PW_PROP_CPV] = NAN;
    assert_int_equal(pw_heat_data_from_system(&sys, &g, &err), PW_ENOTFOUND);
    assert_non_null(strstr(err.msg, "heavy (invented)"));
    assert_non_null(strstr(err.msg, "cpV_J_molK"));
}

/* Infeasible splits stay infeasible with a reason; a feed tie line outside (xb, xd) is refused
 * in words. */
static void test_infeasible(void **state)
{
    (void)state;
    pw_system sys = design_ideal_system(3.0);
    sys.model = &pw_model_nrtl;
    sys.params[0] = 300.0;
    sys.params[1] = 150.0;
    sys.params[2] = 0.3; /* an azeotrope near x = 0.93 (invented) */
    pw_heat_data h = heats(&sys, 30000.0, 40000.0, 100.0, 75.0, 50.0, 34.0);
    pw_column_spec s = {.xd = 0.98, .xb = 0.05, .zf = 0.5, .q = 1.0};
    pw_energy_result r;
    assert_int_equal(pw_energy_column_solve(&sys, &h, P_PA, &s, NULL, &r, NULL), PW_OK);
    assert_false(r.feasible);
    assert_true(strlen(r.reason) > 10);
    assert_true(isnan(r.r_min));
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(test_equal_heats_constant_alpha),
        cmocka_unit_test(test_equal_heats_random),
        cmocka_unit_test(test_equal_heats_flow_limits),
        cmocka_unit_test(test_unequal_heats_pseudo_moles),
        cmocka_unit_test(test_unequal_heats_random),
        cmocka_unit_test(test_balances_close),
        cmocka_unit_test(test_rmin_against_stepping),
        cmocka_unit_test(test_hE_gibbs_helmholtz),
        cmocka_unit_test(test_pure_vapor_enthalpy),
        cmocka_unit_test(test_infeasible),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
