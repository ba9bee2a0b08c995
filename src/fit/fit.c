/* Multistart trust-region Levenberg-Marquardt regression (GSL gsl_multifit_nlinear).
 * See docs/fitting.md for the objectives, weights, starts, minima clustering and statistics. */
#include "fit_internal.h"

#include <float.h>
#include <gsl/gsl_cdf.h>
#include <gsl/gsl_multifit_nlinear.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "pinchwise_version.h"

#define PENALTY_RESIDUAL 1e8 /* stands in for a residual where the model cannot be evaluated */
#define RUNAWAY_LIMIT 100.0  /* internal units: 100 for A_ij, 10 000 K for energies */

pw_fit_options pw_fit_default_options(void)
{
    pw_fit_options o;
    memset(&o, 0, sizeof o);
    o.fit_alpha = false;
    o.alpha = 0.3; /* Renon & Prausnitz (1968): typical value for most mixtures */
    o.V2_V1 = NAN;
    o.n_starts = 32;
    o.seed = 1;
    o.sigma_T_K = NAN;
    o.sigma_P_rel = NAN;
    o.sigma_P_abs_Pa = NAN;
    o.sigma_y = NAN;
    o.max_iter = 200;
    o.xtol = pow(DBL_EPSILON, 0.6);       /* about 4e-10 relative step */
    o.gtol = pow(DBL_EPSILON, 2.0 / 3.0); /* about 4e-11 scaled gradient */
    return o;
}

static bool is_excluded(const pw_fit_options *o, long line)
{
    for (size_t i = 0; i < o->n_exclude; i++)
        if (o->exclude_lines[i] == line)
            return true;
    return false;
}

/* Scale of a parameter's internal unknown: energies in K are fitted in units of 100 K. */
static double param_scale(const pw_model_type *m, size_t k)
{
    return strcmp(m->param_units[k], "K") == 0 ? 100.0 : 1.0;
}

/* Start ranges per model and parameter, wide enough to reach the branches met in practice
 * (METHODS-style multistart: tau in about [-3, 10] for NRTL). */
static void start_range(const pw_model_type *m, size_t k, double *lo, double *hi)
{
    const char *n = m->param_names[k];
    if (!strcmp(n, "alpha")) {
        *lo = 0.1, *hi = 0.6;
    } else if (!strcmp(m->param_units[k], "K")) {
        *lo = -700.0, *hi = 2500.0;
    } else {
        *lo = -2.5, *hi = 3.0;
    }
}

typedef struct lm_ctx {
    const fit_problem *fp;
    double *J_cache;
    double u_cache[PW_MAX_PARAMS];
    bool cache_ok;
    size_t n_fev, n_jev;
} lm_ctx;

static int lm_f(const gsl_vector *u, void *data, gsl_vector *f)
{
    lm_ctx *c = data;
    const fit_problem *fp = c->fp;
    double params[PW_MAX_PARAMS];
    fit_unpack(fp, u->data, params);
    c->n_fev++;
    pw_status st = fit_eval(fp, params, f->data, c->J_cache);
    if (st != PW_OK) {
        for (size_t i = 0; i < fp->n_res; i++)
            gsl_vector_set(f, i, PENALTY_RESIDUAL);
        c->cache_ok = false;
        return GSL_SUCCESS;
    }
    memcpy(c->u_cache, u->data, sizeof(double) * fp->n_fit);
    c->cache_ok = true;
    return GSL_SUCCESS;
}

static int lm_df(const gsl_vector *u, void *data, gsl_matrix *J)
{
    lm_ctx *c = data;
    const fit_problem *fp = c->fp;
    c->n_jev++;
    bool same = c->cache_ok && memcmp(c->u_cache, u->data, sizeof(double) * fp->n_fit) == 0;
    if (!same) {
        double params[PW_MAX_PARAMS];
        fit_unpack(fp, u->data, params);
        double *f = malloc(sizeof(double) * fp->n_res);
        pw_status st = f ? fit_eval(fp, params, f, c->J_cache) : PW_ENOMEM;
        free(f);
        if (st != PW_OK)
            return GSL_EDOM;
    }
    for (size_t i = 0; i < fp->n_res; i++)
        for (size_t j = 0; j < fp->n_fit; j++)
            gsl_matrix_set(J, i, j, c->J_cache[i * fp->n_fit + j]);
    return GSL_SUCCESS;
}

#define MULTISTART_MIN 4   /* LM runs before the stopping rule may act */
#define MULTISTART_STALL 4 /* runs in a row without a new minimum or a lower chi2 */

typedef struct start_cand {
    double p[PW_MAX_PARAMS];
    double chi2; /* at the start; -1 for the model's default start so that it runs first */
} start_cand;

static int cmp_cand(const void *a, const void *b)
{
    double ca = ((const start_cand *)a)->chi2, cb = ((const start_cand *)b)->chi2;
    return (ca > cb) - (ca < cb);
}

typedef struct run_result {
    double params[PW_MAX_PARAMS];
    double chi2;
    pw_stop_reason stop;
    size_t iterations;
} run_result;

static pw_stop_reason map_stop(int status, int info)
{
    if (status == GSL_SUCCESS)
        return info == 2 ? PW_STOP_GRADIENT : PW_STOP_STEP;
    if (status == GSL_EMAXITER)
        return PW_STOP_MAXITER;
    return PW_STOP_FAILED;
}

/* One LM run from the full parameter vector start. */
static void run_lm(gsl_multifit_nlinear_workspace *w, gsl_multifit_nlinear_fdf *fdf, lm_ctx *c,
                   const double *start, const pw_fit_options *o, run_result *out)
{
    const fit_problem *fp = c->fp;
    double u0[PW_MAX_PARAMS];
    for (size_t j = 0; j < fp->n_fit; j++)
        u0[j] = start[fp->idx[j]] / fp->scale[j];
    gsl_vector_view x0 = gsl_vector_view_array(u0, fp->n_fit);
    out->stop = PW_STOP_FAILED;
    out->chi2 = INFINITY;
    out->iterations = 0;
    memcpy(out->params, start, sizeof out->params);
    if (gsl_multifit_nlinear_init(&x0.vector, fdf, w) != GSL_SUCCESS)
        return;
    int info = 0;
    int status = gsl_multifit_nlinear_driver(o->max_iter, o->xtol, o->gtol, 0.0, NULL, NULL,
                                             &info, w);
    out->stop = map_stop(status, info);
    out->iterations = gsl_multifit_nlinear_niter(w);
    fit_unpack(fp, gsl_multifit_nlinear_position(w)->data, out->params);
    double *work = malloc(sizeof(double) * fp->n_res);
    out->chi2 = work ? fit_chi2(fp, out->params, work) : (double)INFINITY;
    free(work);
    if (!isfinite(out->chi2))
        out->stop = PW_STOP_FAILED;
}

static bool same_minimum(const fit_problem *fp, const double *a, const double *b)
{
    for (size_t j = 0; j < fp->n_fit; j++) {
        size_t k = fp->idx[j];
        double tol = 0.01 * fmax(fabs(a[k]), fabs(b[k])) + 1e-4 * fp->scale[j];
        if (fabs(a[k] - b[k]) > tol)
            return false;
    }
    return true;
}

/* Fills the problem's used points and weights from r (which holds all points). The caller
 * frees *used. */
static pw_status build_problem(const pw_fit_result *r, fit_problem *fp, pw_point **used)
{
    memset(fp, 0, sizeof *fp);
    fp->sys = r->sys;
    fp->objective = r->objective;
    fp->sigma_T_K = r->sigma_T_K;
    fp->sigma_P_rel = r->sigma_P_rel;
    fp->sigma_P_abs_Pa = NAN;
    fp->sigma_y = r->sigma_y;
    fp->P_fixed_Pa = r->P_fixed_Pa;
    fp->T_fixed_K = r->T_fixed_K;
    for (size_t k = 0; k < r->sys.model->n_params; k++)
        if (r->fitted[k]) {
            fp->idx[fp->n_fit] = k;
            fp->scale[fp->n_fit] = param_scale(r->sys.model, k);
            fp->n_fit++;
        }
    *used = malloc(sizeof(pw_point) * (r->n_pts ? r->n_pts : 1));
    if (!*used)
        return PW_ENOMEM;
    size_t n = 0;
    for (size_t i = 0; i < r->n_pts; i++)
        if (!r->pts[i].excluded && !fit_is_pure(&r->pts[i].meas))
            (*used)[n++] = r->pts[i].meas;
    fp->pts = *used;
    fp->n_pts = n;
    fp->n_res = n * fit_residuals_per_point(fp->objective);
    return PW_OK;
}

static void now_iso8601(char *buf, size_t len)
{
    time_t t = time(NULL);
    struct tm tm;
    gmtime_r(&t, &tm);
    strftime(buf, len, "%Y-%m-%dT%H:%M:%SZ", &tm);
}

/* Sets up r from the dataset and options: points, objective, fitted mask, fixed values. */
static pw_status init_result(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                             const pw_model_type *model, const pw_fit_options *o, pw_fit_result *r,
                             pw_error *err)
{
    memset(r, 0, sizeof *r);
    r->sys.comp[0] = *c1;
    r->sys.comp[1] = *c2;
    r->sys.model = model;
    for (size_t k = 0; k < model->n_params; k++) {
        r->sys.params[k] = model->defaults[k];
        r->fitted[k] = model->fitted_default[k];
    }
    int ia = pw_model_param_index(model, "alpha");
    if (ia >= 0) {
        r->sys.params[ia] = o->alpha;
        r->fitted[ia] = o->fit_alpha;
    }
    int iv = pw_model_param_index(model, "V2_V1");
    if (iv >= 0) {
        double v = o->V2_V1;
        if (!isfinite(v) && isfinite(c1->V_L_cm3mol) && isfinite(c2->V_L_cm3mol) &&
            c1->V_L_cm3mol > 0.0)
            v = c2->V_L_cm3mol / c1->V_L_cm3mol;
        r->sys.params[iv] = isfinite(v) && v > 0.0 ? v : 1.0;
    }
    for (size_t k = 0; k < model->n_params; k++)
        r->n_fitted += r->fitted[k];
    r->kind = ds->kind;
    r->has_y = ds->has_y;
    r->P_fixed_Pa = ds->P_fixed_Pa;
    r->T_fixed_K = ds->T_fixed_K;
    r->objective = ds->kind == PW_DATA_ISOBARIC ? (ds->has_y ? PW_OBJ_TXY : PW_OBJ_TX)
                                                : (ds->has_y ? PW_OBJ_PXY : PW_OBJ_PX);
    r->sigma_T_K = isfinite(o->sigma_T_K) ? o->sigma_T_K : ds->sigma_T_K;
    r->sigma_y = isfinite(o->sigma_y) ? o->sigma_y : ds->sigma_y;
    /* an option overrides the file: relative first, then absolute */
    double sP_abs = isfinite(o->sigma_P_abs_Pa) ? o->sigma_P_abs_Pa : ds->sigma_P_abs_Pa;
    r->sigma_P_rel = isfinite(o->sigma_P_rel)      ? o->sigma_P_rel
                     : isfinite(o->sigma_P_abs_Pa) ? (double)NAN
                                                   : ds->sigma_P_rel;
    if (!isfinite(r->sigma_P_rel) && isfinite(sP_abs) && isfinite(ds->P_fixed_Pa))
        r->sigma_P_rel = sP_abs / ds->P_fixed_Pa;
    if (!isfinite(r->sigma_P_rel)) {
        /* absolute sigma_P on isothermal data: express relative to the mean measured P */
        double Pm = 0.0;
        for (size_t i = 0; i < ds->n; i++)
            Pm += ds->pts[i].P_Pa / (double)ds->n;
        r->sigma_P_rel = isfinite(sP_abs) ? sP_abs / Pm : 1e-3;
    }
    if (!(r->sigma_T_K > 0.0) || !(r->sigma_y > 0.0) || !(r->sigma_P_rel > 0.0))
        return pw_error_set(err, PW_EINVAL, ds->path, 0,
                            "measurement uncertainties must be positive (sigma_T %g K, sigma_y %g, "
                            "sigma_P %g relative)", r->sigma_T_K, r->sigma_y, r->sigma_P_rel);
    r->pts = calloc(ds->n ? ds->n : 1, sizeof *r->pts);
    if (!r->pts)
        return pw_error_set(err, PW_ENOMEM, ds->path, 0, "out of memory");
    r->n_pts = ds->n;
    double Tsum = 0.0;
    size_t nT = 0, n_binary = 0;
    r->T_min_K = INFINITY;
    r->T_max_K = -INFINITY;
    for (size_t i = 0; i < ds->n; i++) {
        r->pts[i].meas = ds->pts[i];
        r->pts[i].excluded = is_excluded(o, ds->pts[i].line);
        if (r->pts[i].excluded)
            continue;
        Tsum += ds->pts[i].T_K;
        nT++;
        r->T_min_K = fmin(r->T_min_K, ds->pts[i].T_K);
        r->T_max_K = fmax(r->T_max_K, ds->pts[i].T_K);
        n_binary += !fit_is_pure(&ds->pts[i]);
    }
    for (size_t e = 0; e < o->n_exclude; e++) {
        bool found = false;
        for (size_t i = 0; i < ds->n && !found; i++)
            found = ds->pts[i].line == o->exclude_lines[e];
        if (!found)
            return pw_error_set(err, PW_EINVAL, ds->path, o->exclude_lines[e],
                                "--exclude names line %ld, which holds no data point",
                                o->exclude_lines[e]);
    }
    size_t per = fit_residuals_per_point(r->objective);
    if (n_binary * per < r->n_fitted + 1 || n_binary < 2)
        return pw_error_set(err, PW_ETOOFEW, ds->path, 0,
                            "too few mixture points for %s: %zu usable (x1 strictly between 0 and "
                            "1, not excluded), need at least %zu",
                            model->name, n_binary,
                            (r->n_fitted + per) / per > 2 ? (r->n_fitted + per) / per : 2);
    r->sys.T_ref_K = ds->kind == PW_DATA_ISOTHERMAL ? ds->T_fixed_K : Tsum / (double)nT;
    snprintf(r->exclude_reason, sizeof r->exclude_reason, "%s", o->exclude_reason);
    snprintf(r->dataset_path, sizeof r->dataset_path, "%s", ds->path);
    pw_sha256_hex(ds->sha256, r->dataset_sha256);
    snprintf(r->source, sizeof r->source, "%s", ds->source);
    snprintf(r->version, sizeof r->version, "%s", PINCHWISE_VERSION_STRING);
    now_iso8601(r->created, sizeof r->created);
    return PW_OK;
}

/* A run that drifted to an asymptote (an energy of tens of thousands of kelvin, a Lambda or G
 * of essentially zero) has not found a minimum but a flat plateau of the objective. */
static bool runaway(const fit_problem *fp, const double *params)
{
    for (size_t j = 0; j < fp->n_fit; j++)
        if (fabs(params[fp->idx[j]]) > RUNAWAY_LIMIT * fp->scale[j])
            return true;
    return false;
}

/* Records a converged run among the distinct minima (sorted by chi2 on output). */
static void add_minimum(pw_fit_result *r, const fit_problem *fp, const run_result *run)
{
    if (runaway(fp, run->params))
        return;
    for (size_t i = 0; i < r->n_minima; i++)
        if (same_minimum(fp, r->minima[i].params, run->params)) {
            r->minima[i].hits++;
            if (run->chi2 < r->minima[i].chi2) {
                r->minima[i].chi2 = run->chi2;
                memcpy(r->minima[i].params, run->params, sizeof run->params);
            }
            return;
        }
    size_t slot = r->n_minima;
    if (slot == PW_FIT_MAX_MINIMA) {
        /* keep the best ones: replace the worst if this one is better */
        size_t worst = 0;
        for (size_t i = 1; i < r->n_minima; i++)
            if (r->minima[i].chi2 > r->minima[worst].chi2)
                worst = i;
        if (run->chi2 >= r->minima[worst].chi2)
            return;
        slot = worst;
    } else {
        r->n_minima++;
    }
    memcpy(r->minima[slot].params, run->params, sizeof run->params);
    r->minima[slot].chi2 = run->chi2;
    r->minima[slot].hits = 1;
}

static int cmp_minima(const void *a, const void *b)
{
    double ca = ((const pw_fit_minimum *)a)->chi2, cb = ((const pw_fit_minimum *)b)->chi2;
    return (ca > cb) - (ca < cb);
}

/* The start points: the model defaults, then seeded uniform draws in the start ranges. */
static void make_start(const pw_fit_result *r, const fit_problem *fp, gsl_rng *rng, size_t s,
                       double *start)
{
    memcpy(start, r->sys.params, sizeof(double) * PW_MAX_PARAMS);
    if (s == 0)
        return;
    bool vanlaar = !strcmp(r->sys.model->name, "vanlaar");
    double sign = gsl_rng_uniform(rng) < 0.5 ? -1.0 : 1.0;
    for (size_t j = 0; j < fp->n_fit; j++) {
        size_t k = fp->idx[j];
        double lo, hi;
        start_range(r->sys.model, k, &lo, &hi);
        double v = lo + (hi - lo) * gsl_rng_uniform(rng);
        if (vanlaar) /* both constants of one sign, away from zero */
            v = sign * (0.05 + fabs(v));
        start[k] = v;
    }
}

pw_status pw_fit_run(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                     const pw_model_type *model, const pw_fit_options *opt, pw_fit_result *out,
                     pw_error *err)
{
    pw_fit_options o = opt ? *opt : pw_fit_default_options();
    if (!ds || !c1 || !c2 || !model || !out)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "missing argument to the fit");
    if (ds->mass_x || ds->mass_y)
        return pw_error_set(err, PW_EINVAL, ds->path, ds->composition_line,
                            "the dataset's compositions are mass fractions (convert them with "
                            "pw_dataset_to_mole first)");
    pw_status st = init_result(ds, c1, c2, model, &o, out, err);
    if (st != PW_OK) {
        pw_fit_result_free(out);
        return st;
    }
    fit_problem fp;
    pw_point *used = NULL;
    st = build_problem(out, &fp, &used);
    double *J = st == PW_OK ? malloc(sizeof(double) * fp.n_res * fp.n_fit) : NULL;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_multifit_nlinear_parameters params = gsl_multifit_nlinear_default_parameters();
    params.trs = gsl_multifit_nlinear_trs_lm;
    params.scale = gsl_multifit_nlinear_scale_more;
    params.solver = gsl_multifit_nlinear_solver_qr;
    gsl_multifit_nlinear_workspace *w =
        J ? gsl_multifit_nlinear_alloc(gsl_multifit_nlinear_trust, &params, fp.n_res, fp.n_fit)
          : NULL;
    if (st == PW_OK && (!J || !rng || !w))
        st = PW_ENOMEM;
    if (st != PW_OK) {
        free(used);
        free(J);
        gsl_rng_free(rng);
        if (w)
            gsl_multifit_nlinear_free(w);
        pw_fit_result_free(out);
        return pw_error_set(err, st, ds->path, 0, "%s", pw_strerror(st));
    }
    gsl_rng_set(rng, o.seed);
    lm_ctx ctx = {.fp = &fp, .J_cache = J};
    gsl_multifit_nlinear_fdf fdf = {.f = lm_f, .df = lm_df, .fvv = NULL, .n = fp.n_res,
                                    .p = fp.n_fit, .params = &ctx};
    run_result best = {.chi2 = INFINITY, .stop = PW_STOP_NONE};
    /* Multistart with screening: every candidate start costs one objective evaluation; LM then
     * runs from the candidates in order of increasing chi2 and stops once MULTISTART_STALL runs
     * in a row found neither a new minimum nor a lower chi2 (after at least MULTISTART_MIN runs).
     * The default start always runs. See docs/fitting.md. */
    size_t n_starts = o.n_starts ? o.n_starts : 1;
    start_cand *cand = malloc(sizeof *cand * n_starts);
    double *work = malloc(sizeof(double) * fp.n_res);
    size_t n_cand = 0;
    for (size_t s = 0; cand && work && s < n_starts; s++) {
        make_start(out, &fp, rng, s, cand[n_cand].p);
        if (model->check(cand[n_cand].p) != PW_OK)
            continue;
        cand[n_cand].chi2 = s == 0 ? -1.0 : fit_chi2(&fp, cand[n_cand].p, work);
        if (isfinite(cand[n_cand].chi2))
            n_cand++;
    }
    ctx.n_fev += n_starts;
    if (cand)
        qsort(cand, n_cand, sizeof *cand, cmp_cand);
    size_t stall = 0;
    for (size_t c = 0; c < n_cand; c++) {
        if (c >= MULTISTART_MIN && stall >= MULTISTART_STALL)
            break;
        run_result run;
        run_lm(w, &fdf, &ctx, cand[c].p, &o, &run);
        out->iterations += run.iterations;
        out->n_runs++;
        bool conv = (run.stop == PW_STOP_STEP || run.stop == PW_STOP_GRADIENT) &&
                    !runaway(&fp, run.params);
        size_t before = out->n_minima;
        if (conv)
            add_minimum(out, &fp, &run);
        /* prefer converged runs; among equals the lower chi2 */
        bool best_conv = best.stop == PW_STOP_STEP || best.stop == PW_STOP_GRADIENT;
        bool better = (conv && !best_conv) ||
                      (conv == best_conv && run.chi2 < best.chi2 * (1.0 - 1e-9));
        if (better || (conv == best_conv && run.chi2 < best.chi2))
            best = run;
        stall = (better || out->n_minima > before) ? 0 : stall + 1;
    }
    free(cand);
    free(work);
    out->n_fev = ctx.n_fev;
    out->n_jev = ctx.n_jev;
    qsort(out->minima, out->n_minima, sizeof out->minima[0], cmp_minima);
    /* Among minima as good as the best (METHODS 3.5: S <= 1.01 S_best or delta-AICc < 2), take
     * the first that predicts no liquid split over the data's temperature range. */
    out->n_residuals = fp.n_res;
    size_t competing = pw_fit_competing_minima(out);
    for (size_t i = 0; competing > 1 && i < competing; i++) {
        pw_system s = out->sys;
        memcpy(s.params, out->minima[i].params, sizeof s.params);
        double D, x, T;
        fit_stability_screen(&s, out->T_min_K, out->T_max_K, &D, &x, &T);
        if (!(D < 0.0)) {
            memcpy(best.params, out->minima[i].params, sizeof best.params);
            best.chi2 = out->minima[i].chi2;
            break;
        }
    }
    memcpy(out->sys.params, best.params, sizeof best.params);
    out->stop = best.stop;
    out->converged = best.stop == PW_STOP_STEP || best.stop == PW_STOP_GRADIENT;
    out->chi2 = best.chi2;
    out->dof = fp.n_res > fp.n_fit ? fp.n_res - fp.n_fit : 0;

    /* Covariance, standard errors, confidence intervals, correlation at the chosen optimum. */
    for (size_t k = 0; k < PW_MAX_PARAMS; k++) {
        out->stderr_[k] = NAN;
        out->ci95[k][0] = out->ci95[k][1] = NAN;
    }
    double *f = malloc(sizeof(double) * fp.n_res);
    pw_status cst = f ? fit_eval(&fp, out->sys.params, f, J) : PW_ENOMEM;
    free(f);
    if (cst == PW_OK && out->dof > 0) {
        double s2 = out->chi2 / (double)out->dof;
        cst = fit_covariance(&fp, J, fp.n_res, s2, out->cov);
        if (cst == PW_OK) {
            double t = gsl_cdf_tdist_Pinv(0.975, (double)out->dof);
            for (size_t j = 0; j < fp.n_fit; j++) {
                size_t k = fp.idx[j];
                out->stderr_[k] = sqrt(out->cov[k][k]);
                out->ci95[k][0] = out->sys.params[k] - t * out->stderr_[k];
                out->ci95[k][1] = out->sys.params[k] + t * out->stderr_[k];
            }
            for (size_t a = 0; a < fp.n_fit; a++)
                for (size_t b = 0; b < fp.n_fit; b++) {
                    size_t ka = fp.idx[a], kb = fp.idx[b];
                    double d = out->stderr_[ka] * out->stderr_[kb];
                    out->corr[ka][kb] = d > 0.0 ? out->cov[ka][kb] / d : (ka == kb ? 1.0 : 0.0);
                }
        }
    }
    free(used);
    free(J);
    gsl_rng_free(rng);
    gsl_multifit_nlinear_free(w);
    st = pw_fit_evaluate(out);
    if (st != PW_OK) {
        /* No start gave parameters the model accepts (for instance with absurd data). */
        pw_fit_result_free(out);
        return pw_error_set(err, st, ds->path, 0,
                            "the %s model cannot be evaluated with the fitted parameters: %s "
                            "(check the data's temperatures and pressures)",
                            model->name, pw_strerror(st));
    }
    return PW_OK;
}
