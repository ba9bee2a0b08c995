/* Seeded randomised checks of the fit and of the minimum-reflux search over 500 generated
 * datasets (INVENTED data: random parameters within physical ranges for each model, Gaussian
 * noise, real components from datasets/components.csv).
 *
 * 1. A fit reported converged sits at a minimum of the objective documented in
 *    include/pinchwise/fit.h, recomputed here from pw_bubble_T / pw_bubble_P (not from the
 *    fit's own residual code): the central-difference gradient in each fitted parameter,
 *    measured in standard errors, is ~0, and chi2 is not lower at +-0.1 standard error in any
 *    parameter. A fit cut off after two iterations from one start must say it did not converge
 *    (or, when it did stop on a convergence test, pass the same minimum test).
 * 2. On the fitted isobaric curves, at R = R_min (1 + 1e-6) the operating lines, written here
 *    from the mass balances of docs/column.md section 1, stay on or below y*(x) on [xb, xd];
 *    at R = R_min (1 - 1e-3) they cross it somewhere (identity of the definition of R_min).
 * The seed is fixed, so a failure repeats; the case number is printed. */
#include "pw_test.h"

#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/column.h>
#include <pinchwise/curve.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#define N_DATASETS 500
#define GRID 4000

#ifndef M_PI
#define M_PI 3.14159265358979323846
#endif

/* Component pairs (first the more volatile one at 1 atm) from the shipped library. */
static const char *const pairs[][2] = {
    {"methanol", "water"},  {"ethanol", "water"},      {"acetone", "water"},
    {"benzene", "toluene"}, {"n-hexane", "n-heptane"}, {"acetone", "methanol"},
    {"methanol", "ethanol"}, {"ethyl acetate", "ethanol"}, {"2-butanone", "toluene"},
    {"chloroform", "acetone"},
};

typedef struct gen_case {
    const pw_model_type *model;
    double params[PW_MAX_PARAMS];
    bool isobaric;
    double fixed; /* P in Pa or T in K */
    double sigma_T, sigma_P_rel, sigma_y;
} gen_case;

static pw_complib lib;

static void draw_params(gsl_rng *r, gen_case *g)
{
    const pw_model_type *m = g->model;
    for (size_t k = 0; k < m->n_params; k++)
        g->params[k] = m->defaults[k];
    if (m == &pw_model_margules) {
        g->params[0] = gsl_ran_flat(r, -0.8, 1.6);
        g->params[1] = gsl_ran_flat(r, -0.8, 1.6);
    } else if (m == &pw_model_vanlaar) {
        g->params[0] = gsl_ran_flat(r, 0.15, 1.6);
        g->params[1] = gsl_ran_flat(r, 0.15, 1.6);
    } else if (m == &pw_model_wilson) {
        g->params[0] = gsl_ran_flat(r, -250.0, 700.0);
        g->params[1] = gsl_ran_flat(r, -250.0, 700.0);
    } else {
        g->params[0] = gsl_ran_flat(r, -200.0, 700.0);
        g->params[1] = gsl_ran_flat(r, -200.0, 700.0);
    }
}

/* Builds an INVENTED data set; false when the draw is unusable (split, failed solves). */
static bool make_dataset(gsl_rng *r, const gen_case *g, const pw_component *c1,
                         const pw_component *c2, size_t n, pw_dataset *ds)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = *c1;
    s.comp[1] = *c2;
    s.model = g->model;
    memcpy(s.params, g->params, sizeof s.params);
    s.T_ref_K = 340.0;
    if (g->model->check(s.params) != PW_OK)
        return false;
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "generated");
    snprintf(ds->names[0], sizeof ds->names[0], "%s", c1->name);
    snprintf(ds->names[1], sizeof ds->names[1], "%s", c2->name);
    ds->kind = g->isobaric ? PW_DATA_ISOBARIC : PW_DATA_ISOTHERMAL;
    ds->P_fixed_Pa = g->isobaric ? g->fixed : NAN;
    ds->T_fixed_K = g->isobaric ? NAN : g->fixed;
    if (!g->isobaric)
        s.T_ref_K = g->fixed;
    ds->has_y = true;
    ds->sigma_T_K = g->sigma_T;
    ds->sigma_P_rel = g->sigma_P_rel;
    ds->sigma_P_abs_Pa = NAN;
    ds->sigma_y = g->sigma_y;
    ds->sigma_x = 0.001;
    snprintf(ds->T_unit, sizeof ds->T_unit, "K");
    snprintf(ds->P_unit, sizeof ds->P_unit, "kPa");
    ds->pts = calloc(n, sizeof *ds->pts);
    if (!ds->pts)
        return false;
    for (size_t i = 0; i < n; i++) {
        double x = 0.5 - 0.5 * cos(M_PI * (double)(i + 1) / (double)(n + 1));
        pw_eq_point e;
        pw_status st = g->isobaric ? pw_bubble_T(&s, g->fixed, x, &e) : pw_bubble_P(&s, g->fixed, x, &e);
        double D = 0.0, xm = 0.0;
        if (st != PW_OK || pw_stability_min(&s, e.T_K, &D, &xm) != PW_OK || D <= 0.05) {
            pw_dataset_free(ds);
            return false;
        }
        pw_point *p = &ds->pts[i];
        p->x1 = x;
        p->y1 = fmin(1.0, fmax(0.0, e.y1 + gsl_ran_gaussian(r, g->sigma_y)));
        p->T_K = g->isobaric ? e.T_K + gsl_ran_gaussian(r, g->sigma_T) : g->fixed;
        p->P_Pa = g->isobaric ? g->fixed : e.P_Pa * (1.0 + gsl_ran_gaussian(r, g->sigma_P_rel));
        p->line = (long)i + 5;
    }
    ds->n = n;
    return true;
}

/* chi2 of fit.h's objective at params, from the public bubble-point solvers. */
static double chi2_at(const pw_fit_result *r, const double *params)
{
    pw_system s = r->sys;
    memcpy(s.params, params, sizeof s.params);
    if (s.model->check(s.params) != PW_OK)
        return INFINITY;
    double sum = 0.0;
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_point *m = &r->pts[i].meas;
        if (r->pts[i].excluded || m->x1 <= 0.0 || m->x1 >= 1.0)
            continue;
        pw_eq_point e;
        double d;
        if (r->kind == PW_DATA_ISOBARIC) {
            if (pw_bubble_T(&s, m->P_Pa, m->x1, &e) != PW_OK)
                return INFINITY;
            d = (e.T_K - m->T_K) / r->sigma_T_K;
        } else {
            if (pw_bubble_P(&s, m->T_K, m->x1, &e) != PW_OK)
                return INFINITY;
            d = (e.P_Pa - m->P_Pa) / (r->sigma_P_rel * m->P_Pa);
        }
        sum += d * d;
        if (r->has_y) {
            d = (e.y1 - m->y1) / r->sigma_y;
            sum += d * d;
        }
    }
    return sum;
}

typedef struct min_check {
    double worst_grad;  /* max over parameters of the distance to the minimum along that
                           parameter, |g| / sqrt(2 s^2 H), in conditional standard errors */
    double worst_drop;  /* max relative decrease of chi2 at +-0.1 conditional standard error */
} min_check;

/* Along each fitted parameter k: H = d2chi2/dp2 and g = dchi2/dp by central differences, the
 * conditional standard error sc = sqrt(2 s^2 / H) (the others held; s^2 = chi2/dof), and the
 * distance of the one-dimensional minimum |g|/H expressed in sc. The marginal standard errors
 * of the fit can be far larger when parameters are correlated, so they only set the first
 * step. */
static min_check check_minimum(const pw_fit_result *r)
{
    min_check mc = {0.0, 0.0};
    double c0 = chi2_at(r, r->sys.params);
    double s2 = r->dof > 0 ? fmax(r->chi2 / (double)r->dof, 1e-12) : 1.0;
    for (size_t k = 0; k < r->sys.model->n_params; k++) {
        if (!r->fitted[k])
            continue;
        double se = r->stderr_[k];
        if (!(se > 0.0) || !isfinite(se))
            se = 1e-3 * fmax(fabs(r->sys.params[k]), 1.0);
        double p[PW_MAX_PARAMS];
        memcpy(p, r->sys.params, sizeof p);
        double h = 0.01 * se, H = 0.0;
        for (int pass = 0; pass < 3; pass++) {
            p[k] = r->sys.params[k] + h;
            double cp = chi2_at(r, p);
            p[k] = r->sys.params[k] - h;
            double cm = chi2_at(r, p);
            H = (cp - 2.0 * c0 + cm) / (h * h);
            if (!(H > 0.0) || !isfinite(H)) {
                mc.worst_grad = INFINITY; /* not a minimum along k */
                break;
            }
            double sc = sqrt(2.0 * s2 / H);
            if (pass == 2) {
                double g = (cp - cm) / (2.0 * h);
                mc.worst_grad = fmax(mc.worst_grad, fabs(g) / sqrt(2.0 * s2 * H));
                for (int sgn = -1; sgn <= 1; sgn += 2) {
                    p[k] = r->sys.params[k] + sgn * 0.1 * sc;
                    double c = chi2_at(r, p);
                    mc.worst_drop = fmax(mc.worst_drop, (c0 - c) / fmax(c0, 1e-300));
                }
            }
            h = 0.05 * sc;
        }
    }
    return mc;
}

static const pw_component *comp(const char *name)
{
    const pw_component *c = pw_complib_find(&lib, name);
    assert_non_null(c);
    return c;
}

/* Operating lines of docs/column.md section 1 at reflux R (per unit feed). */
static double op_line(const pw_column_spec *sp, double R, double x)
{
    double D = (sp->zf - sp->xb) / (sp->xd - sp->xb), B = 1.0 - D;
    double L = R * D, V = (R + 1.0) * D;
    double Lb = L + sp->q, Vb = V - (1.0 - sp->q);
    double m = L / V, s = Lb / Vb;
    double xi = ((1.0 - m) * sp->xd + (s - 1.0) * sp->xb) / (s - m);
    (void)B;
    return x >= xi ? m * x + (1.0 - m) * sp->xd : s * x - (s - 1.0) * sp->xb;
}

typedef struct col_stats {
    size_t tested, tangent, infeasible, skipped;
} col_stats;

/* Returns false on a violated identity (the message is printed). */
static bool check_column(const pw_fit_result *r, size_t icase, gsl_rng *rng, col_stats *cs,
                         double *ygrid, double *xgrid)
{
    pw_system_curve sc;
    if (pw_system_curve_init(&sc, &r->sys, r->P_fixed_Pa) != PW_OK) {
        cs->skipped++;
        return true;
    }
    pw_curve curve = pw_system_curve_bind(&sc);
    static const double qs[] = {1.0, 0.5, 1.2, 0.0};
    pw_column_spec sp = {.xd = gsl_ran_flat(rng, 0.85, 0.97), .xb = gsl_ran_flat(rng, 0.02, 0.1),
                         .zf = gsl_ran_flat(rng, 0.3, 0.6), .q = qs[icase % 4]};
    pw_column_options opt = pw_column_default_options();
    pw_column_result res;
    pw_status st = pw_column_solve(&curve, &sp, &opt, &res);
    if (st != PW_OK) {
        cs->skipped++;
        return true;
    }
    if (!res.feasible) {
        cs->infeasible++;
        return true;
    }
    /* y* on a dense grid of [xb, xd], plus the pinch and the q-line point */
    size_t n = 0;
    for (size_t i = 0; i <= GRID; i++)
        xgrid[n++] = sp.xb + (sp.xd - sp.xb) * (double)i / GRID;
    xgrid[n++] = res.pinch.x;
    xgrid[n++] = res.x_q;
    for (size_t i = 0; i < n; i++)
        if (pw_system_curve_y(&sc, xgrid[i], &ygrid[i]) != PW_OK) {
            cs->skipped++;
            return true;
        }
    double worst_above = -INFINITY, best_cross = -INFINITY;
    for (size_t i = 0; i < n; i++) {
        worst_above = fmax(worst_above, op_line(&sp, res.r_min * (1.0 + 1e-6), xgrid[i]) - ygrid[i]);
        best_cross = fmax(best_cross, op_line(&sp, res.r_min * (1.0 - 1e-3), xgrid[i]) - ygrid[i]);
    }
    cs->tested++;
    cs->tangent += res.pinch.kind == PW_PINCH_TANGENT;
    if (worst_above > 1e-9) {
        printf("case %zu: at 1.000001 R_min = %.9g the operating line lies %.3g above y*\n", icase,
               res.r_min, worst_above);
        return false;
    }
    /* R_min = 0 (no reflux needed): nothing below it to cross; the lines at R = 0 were checked
     * to stay on or below the curve just above. */
    if (!(best_cross > 0.0) && !res.reflux_limited) {
        printf("case %zu: at 0.999 R_min = %.9g the operating line does not cross y* (%.3g)\n",
               icase, res.r_min, best_cross);
        return false;
    }
    return true;
}

static void test_random_fits(void **state)
{
    (void)state;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    assert_non_null(rng);
    gsl_rng_set(rng, 20261202);
    const pw_model_type *models[] = {&pw_model_margules, &pw_model_vanlaar, &pw_model_wilson,
                                     &pw_model_nrtl};
    double *ygrid = malloc((GRID + 3) * sizeof *ygrid), *xgrid = malloc((GRID + 3) * sizeof *xgrid);
    assert_non_null(ygrid);
    assert_non_null(xgrid);
    size_t done = 0, converged = 0, not_converged = 0, cut_reported = 0, cut_converged = 0;
    size_t rejected_draws = 0, bad = 0;
    double worst_grad = 0.0, worst_drop = 0.0;
    col_stats cs = {0, 0, 0, 0};
    for (size_t icase = 0; done < N_DATASETS; icase++) {
        assert_true(icase < 20 * N_DATASETS);
        gen_case g;
        g.model = models[icase % 4];
        g.isobaric = gsl_rng_uniform(rng) < 0.7;
        g.fixed = g.isobaric ? 101325.0 : gsl_ran_flat(rng, 313.15, 343.15);
        g.sigma_T = gsl_ran_flat(rng, 0.03, 0.2);
        g.sigma_P_rel = gsl_ran_flat(rng, 0.001, 0.005);
        g.sigma_y = gsl_ran_flat(rng, 0.002, 0.008);
        draw_params(rng, &g);
        size_t ip = gsl_rng_uniform_int(rng, sizeof pairs / sizeof pairs[0]);
        size_t npts = 12 + gsl_rng_uniform_int(rng, 19);
        pw_dataset ds;
        if (!make_dataset(rng, &g, comp(pairs[ip][0]), comp(pairs[ip][1]), npts, &ds)) {
            rejected_draws++;
            continue;
        }
        pw_fit_options opt = pw_fit_default_options();
        opt.seed = icase + 1;
        pw_fit_result r;
        pw_error err;
        pw_status st = pw_fit_run(&ds, comp(pairs[ip][0]), comp(pairs[ip][1]), g.model, &opt, &r, &err);
        if (st != PW_OK) {
            printf("case %zu (%s, %s/%s): fit failed: %s\n", icase, g.model->name, pairs[ip][0],
                   pairs[ip][1], err.msg);
            bad++;
            pw_dataset_free(&ds);
            done++;
            continue;
        }
        done++;
        bool says_conv = r.stop == PW_STOP_STEP || r.stop == PW_STOP_GRADIENT;
        if (r.converged != says_conv) {
            printf("case %zu: converged flag disagrees with the stop reason\n", icase);
            bad++;
        }
        if (r.converged) {
            converged++;
            min_check mc = check_minimum(&r);
            worst_grad = fmax(worst_grad, mc.worst_grad);
            worst_drop = fmax(worst_drop, mc.worst_drop);
            if (mc.worst_grad > 1e-3 || mc.worst_drop > 1e-9) {
                printf("case %zu (%s, %s/%s, %zu pts): converged but not at a minimum: gradient "
                       "%.3g std errors, chi2 drop %.3g\n",
                       icase, g.model->name, pairs[ip][0], pairs[ip][1], npts, mc.worst_grad,
                       mc.worst_drop);
                bad++;
            }
            if (r.kind == PW_DATA_ISOBARIC && !check_column(&r, icase, rng, &cs, ygrid, xgrid))
                bad++;
        } else {
            not_converged++;
        }
        pw_fit_result_free(&r);
        /* Every 5th set again, cut off after two iterations from one start. */
        if (icase % 5 == 0) {
            opt.n_starts = 1;
            opt.max_iter = 2;
            st = pw_fit_run(&ds, comp(pairs[ip][0]), comp(pairs[ip][1]), g.model, &opt, &r, &err);
            if (st == PW_OK) {
                if (!r.converged && (r.stop == PW_STOP_MAXITER || r.stop == PW_STOP_FAILED)) {
                    cut_reported++;
                } else if (r.converged) {
                    cut_converged++;
                    min_check mc = check_minimum(&r);
                    if (mc.worst_grad > 1e-3 || mc.worst_drop > 1e-9) {
                        printf("case %zu: a 2-iteration fit claims convergence off the minimum "
                               "(gradient %.3g std errors)\n", icase, mc.worst_grad);
                        bad++;
                    }
                } else {
                    printf("case %zu: a cut-off fit is neither converged nor says why\n", icase);
                    bad++;
                }
                pw_fit_result_free(&r);
            }
        }
        pw_dataset_free(&ds);
    }
    printf("%zu datasets (%zu draws rejected: split or failed solve): %zu converged, %zu not "
           "converged; worst distance to the minimum %.3g conditional std errors, worst chi2 drop %.3g; cut-off fits: %zu "
           "reported not converged, %zu converged\n",
           done, rejected_draws, converged, not_converged, worst_grad, worst_drop, cut_reported,
           cut_converged);
    printf("column: %zu curves tested (%zu tangent pinches), %zu infeasible specs, %zu skipped\n",
           cs.tested, cs.tangent, cs.infeasible, cs.skipped);
    free(ygrid);
    free(xgrid);
    gsl_rng_free(rng);
    assert_int_equal(bad, 0);
    assert_true(converged >= N_DATASETS * 9 / 10); /* generated data from the model itself */
    assert_true(cut_reported > 0);
    assert_true(cs.tested >= 150);
    assert_true(cs.tangent > 0);
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
    const struct CMUnitTest tests[] = {cmocka_unit_test(test_random_fits)};
    return cmocka_run_group_tests(tests, setup, teardown);
}
