/* Multistart trust-region Levenberg-Marquardt regression (GSL gsl_multifit_nlinear).
 * See docs/fitting.md for the objectives, weights, starts, minima clustering and statistics. */
#include "fit_internal.h"

#include <float.h>
#include <gsl/gsl_cdf.h>
#include <gsl/gsl_multifit_nlinear.h>
#include <gsl/gsl_rng.h>
#include <math.h>
#include <pinchwise/fit_minimum.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "pinchwise_version.h"

#define PENALTY_RESIDUAL 1e8 /* stands in for a residual where the model cannot be evaluated */

pw_fit_options pw_fit_default_options(void)
{
    pw_fit_options o;
    memset(&o, 0, sizeof o);
    o.fit_alpha = false;
    o.alpha = 0.3; /* Renon & Prausnitz (1968): typical value for most mixtures */
    o.V2_V1 = NAN;
    o.n_starts = 8;
    o.seed = 1;
    o.sigma_T_K = NAN;
    o.sigma_P_rel = NAN;
    o.sigma_P_abs_Pa = NAN;
    o.sigma_y = NAN;
    o.max_iter = 200;
    o.xtol = pow(DBL_EPSILON, 0.6);       /* about 4e-10 relative step */
    o.gtol = pow(DBL_EPSILON, 2.0 / 3.0); /* about 4e-11 scaled gradient */
    o.sigma_x_lle = NAN;
    o.three_phase_points = true;
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

/* Start ranges per model and parameter: the model's descriptor gives them (pw_model_type). */
static void start_range(const pw_model_type *m, size_t k, double *lo, double *hi)
{
    *lo = m->start_range ? m->start_range[k][0] : -1.0;
    *hi = m->start_range ? m->start_range[k][1] : 1.0;
}

typedef struct lm_ctx {
    const fit_problem *fp;
    double *J_cache;
    double u_cache[PW_MAX_PARAMS];
    bool cache_ok;
    size_t n_fev, n_jev;
    bool fitted_mask[PW_MAX_PARAMS];
} lm_ctx;

static int lm_f(const gsl_vector *u, void *data, gsl_vector *f)
{
    lm_ctx *c = data;
    const fit_problem *fp = c->fp;
    double params[PW_MAX_PARAMS];
    fit_unpack(fp, u->data, params);
    c->n_fev++;
    /* With kept roots the Jacobian waits for lm_df (rejected trial steps never need it);
     * three-phase points and tie lines compute it with the residuals. */
    pw_status st = fit_eval(fp, params, f->data, fp->roots ? NULL : c->J_cache);
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
    if (same && fp->roots) { /* at the roots lm_f just found */
        double params[PW_MAX_PARAMS];
        fit_unpack(fp, u->data, params);
        if (fit_jacobian_at_roots(fp, params, c->J_cache) != PW_OK)
            return GSL_EDOM;
    } else if (!same) {
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

typedef struct start_cand {
    double p[PW_MAX_PARAMS];
    double chi2; /* at the start; -1 for the fixed starts (default, ideal) so that they run first */
} start_cand;

static int cmp_cand(const void *a, const void *b)
{
    double ca = ((const start_cand *)a)->chi2, cb = ((const start_cand *)b)->chi2;
    return (ca > cb) - (ca < cb);
}

/* How one LM run ended, after our own checks (docs/fitting.md, "Convergence classes"). */
typedef enum {
    RUN_FAILED = 0,  /* GSL error, a model evaluation failure, or no progress off a non-minimum */
    RUN_RUNAWAY,     /* ended beyond a runaway bound, whatever GSL said */
    RUN_MAXITER,     /* bounded, iteration limit */
    RUN_STATIONARY   /* bounded, a GSL convergence test (or our gradient test, or an exact fit) */
} run_class;

typedef struct run_result {
    double params[PW_MAX_PARAMS];
    double chi2;
    pw_stop_reason stop;
    run_class cls;
    bool exact;
    size_t iterations;
    int basin; /* >= 0: stopped early in the basin of this known minimum (r->minima index) */
} run_result;

static bool same_minimum(const fit_problem *fp, const double *a, const double *b);

/* GSL's codes, every one explicitly (gsl_multifit_nlinear_driver, GSL 2.7): status GSL_SUCCESS
 * with info 1 (step test, xtol), 2 (gradient test, gtol), 3 (ftol test; compiled out in GSL but
 * mapped) or GSL_ETOLX/ETOLG/ETOLF (tolerance below machine precision); GSL_EMAXITER with info
 * GSL_ENOPROG (no step lowers the cost from the start: the driver returns at once) or with the
 * iteration limit reached; anything else (GSL_EBADFUNC, GSL_EDOM, GSL_ESING, ...) is a failure. */
static pw_stop_reason map_stop(int status, int info)
{
    switch (status) {
    case GSL_SUCCESS:
        switch (info) {
        case 1: return PW_STOP_STEP;
        case 2: return PW_STOP_GRADIENT;
        case 3: return PW_STOP_STEP;
        case GSL_ETOLX:
        case GSL_ETOLG:
        case GSL_ETOLF: return PW_STOP_MACHINE;
        default: return PW_STOP_FAILED;
        }
    case GSL_EMAXITER:
        return info == GSL_ENOPROG ? PW_STOP_NOPROG : PW_STOP_MAXITER;
    case GSL_ENOPROG:
        return PW_STOP_NOPROG;
    default:
        return PW_STOP_FAILED;
    }
}

/* GSL's gradient test (multifit_nlinear/convergence.c) evaluated by us at params:
 * max_j |g_j| max(|u_j|, 1) <= gtol max(f.f/2, 1), g = J^T f in the internal unknowns u. Used
 * where GSL stopped without testing (no progress on the first iteration). */
static bool gradient_small(const fit_problem *fp, const double *params, double gtol)
{
    double *f = malloc(sizeof(double) * fp->n_res * (1 + fp->n_fit));
    if (!f)
        return false;
    double *J = f + fp->n_res;
    bool ok = fit_eval(fp, params, f, J) == PW_OK;
    double ff = 0.0, gmax = 0.0;
    for (size_t i = 0; ok && i < fp->n_res; i++)
        ff += f[i] * f[i];
    for (size_t j = 0; ok && j < fp->n_fit; j++) {
        double g = 0.0;
        for (size_t i = 0; i < fp->n_res; i++)
            g += J[i * fp->n_fit + j] * f[i];
        double u = params[fp->idx[j]] / fp->scale[j];
        gmax = fmax(gmax, fabs(g) * fmax(fabs(u), 1.0));
    }
    free(f);
    return ok && isfinite(gmax) && gmax <= gtol * fmax(0.5 * ff, 1.0);
}

static bool chi2_exact(double chi2, size_t n_res)
{
    return n_res > 0 && isfinite(chi2) && chi2 <= (double)n_res * PW_FIT_EXACT_RMS * PW_FIT_EXACT_RMS;
}

/* The known minimum (index into known->minima) whose neighbourhood the current LM iterate has
 * entered, or -1: every fitted parameter within the clustering tolerance of same_minimum() and
 * the objective not below the minimum's (docs/fitting.md, "Multistart", known basins). */
static int known_basin(const fit_problem *fp, const pw_fit_result *known,
                       gsl_multifit_nlinear_workspace *w)
{
    if (!known || known->n_minima == 0)
        return -1;
    double p[PW_MAX_PARAMS];
    fit_unpack(fp, gsl_multifit_nlinear_position(w)->data, p);
    const gsl_vector *f = gsl_multifit_nlinear_residual(w);
    double chi2 = 0.0;
    for (size_t i = 0; i < f->size; i++)
        chi2 += f->data[i] * f->data[i];
    if (!isfinite(chi2))
        return -1;
    for (size_t i = 0; i < known->n_minima; i++)
        if (chi2 >= known->minima[i].chi2 && same_minimum(fp, p, known->minima[i].params))
            return (int)i;
    return -1;
}

/* GSL 2.7's gsl_multifit_nlinear_driver (multifit_nlinear/fdf.c) step by step, with the same
 * tests in the same order and the same status and info, so that a run given no known minima
 * ends exactly where the driver ends. After each iteration that did not converge, a run stops
 * early when its iterate lies in the basin of a known minimum (*basin set, else -1). */
static int lm_drive(gsl_multifit_nlinear_workspace *w, const fit_problem *fp,
                    const pw_fit_result *known, const pw_fit_options *o, int *info, int *basin)
{
    size_t iter = 0;
    int status;
    *basin = -1;
    do {
        status = gsl_multifit_nlinear_iterate(w);
        if (status == GSL_ENOPROG && iter == 0) { /* no step lowers the cost from the start */
            *info = status;
            return GSL_EMAXITER;
        }
        ++iter;
        status = gsl_multifit_nlinear_test(o->xtol, o->gtol, 0.0, info, w);
        if (status == GSL_CONTINUE && (*basin = known_basin(fp, known, w)) >= 0)
            return GSL_CONTINUE;
    } while (status == GSL_CONTINUE && iter < o->max_iter);
    if (status == GSL_ETOLF || status == GSL_ETOLX || status == GSL_ETOLG) {
        *info = status; /* converged to within machine precision */
        status = GSL_SUCCESS;
    }
    if (iter >= o->max_iter && status != GSL_SUCCESS)
        status = GSL_EMAXITER;
    return status;
}

/* chi2 from the residual vector GSL holds at its position, summed as fit_chi2 sums; false when
 * that vector is lm_f's penalty (the model could not be evaluated there) or not finite. */
static bool residual_at_position(gsl_multifit_nlinear_workspace *w, double *chi2)
{
    const gsl_vector *f = gsl_multifit_nlinear_residual(w);
    double s = 0.0;
    for (size_t i = 0; i < f->size; i++) {
        double v = gsl_vector_get(f, i);
        if (v == PENALTY_RESIDUAL)
            return false;
        s += v * v;
    }
    if (!isfinite(s))
        return false;
    *chi2 = s;
    return true;
}

/* One LM run from the full parameter vector start; known (NULL: none) holds the minima found
 * so far, whose basins end the run early (out->basin). */
static void run_lm(gsl_multifit_nlinear_workspace *w, gsl_multifit_nlinear_fdf *fdf, lm_ctx *c,
                   const double *start, const pw_fit_options *o, const pw_fit_result *known,
                   run_result *out)
{
    const fit_problem *fp = c->fp;
    double u0[PW_MAX_PARAMS];
    for (size_t j = 0; j < fp->n_fit; j++)
        u0[j] = start[fp->idx[j]] / fp->scale[j];
    gsl_vector_view x0 = gsl_vector_view_array(u0, fp->n_fit);
    out->stop = PW_STOP_FAILED;
    out->cls = RUN_FAILED;
    out->exact = false;
    out->chi2 = INFINITY;
    out->iterations = 0;
    out->basin = -1;
    memcpy(out->params, start, sizeof out->params);
    fit_roots_reset(fp);
    c->cache_ok = false;
    if (gsl_multifit_nlinear_init(&x0.vector, fdf, w) != GSL_SUCCESS)
        return;
    int info = 0;
    int status = lm_drive(w, fp, known, o, &info, &out->basin);
    out->iterations = gsl_multifit_nlinear_niter(w);
    if (out->basin >= 0) /* it would end at that minimum: no further evaluation */
        return;
    out->stop = map_stop(status, info);
    fit_unpack(fp, gsl_multifit_nlinear_position(w)->data, out->params);
    if (fp->roots && residual_at_position(w, &out->chi2)) {
        /* The residuals GSL holds at its position are fit_eval's at these parameters, which
         * depend on nothing else (each Newton solve starts from the measured values): chi2 is
         * summed from them in fit_chi2's order, the same number without a new evaluation. */
    } else {
        double *work = malloc(sizeof(double) * fp->n_res);
        if (fp->T3_warm_K) /* the run's chi2 from the canonical three-phase start */
            *fp->T3_warm_K = NAN;
        fit_roots_reset(fp);
        out->chi2 = work ? fit_chi2(fp, out->params, work) : (double)INFINITY;
        free(work);
    }
    if (!isfinite(out->chi2)) {
        out->stop = PW_STOP_FAILED;
        return;
    }
    out->exact = chi2_exact(out->chi2, fp->n_res);
    bool stationary = out->stop == PW_STOP_STEP || out->stop == PW_STOP_GRADIENT ||
                      out->stop == PW_STOP_MACHINE || out->exact ||
                      (out->stop == PW_STOP_NOPROG && gradient_small(fp, out->params, o->gtol));
    if (pw_fit_runaway_param(fp->sys.model, c->fitted_mask, out->params, fp->sys.T_ref_K) >= 0)
        out->cls = RUN_RUNAWAY;
    else if (stationary)
        out->cls = RUN_STATIONARY;
    else if (out->stop == PW_STOP_MAXITER)
        out->cls = RUN_MAXITER;
    else
        out->cls = RUN_FAILED;
}

/* Is run a better answer than best? Bounded stationary points first, then bounded runs that hit
 * the iteration limit, then runaways, then failures; within a class the lower chi2. A runaway is
 * therefore never chosen over a bounded minimum, whatever its chi2. */
static bool run_better(const run_result *run, const run_result *best)
{
    if (run->cls != best->cls)
        return run->cls > best->cls;
    return run->chi2 < best->chi2;
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
pw_status fit_build_problem(const pw_fit_result *r, fit_problem *fp, pw_point **used)
{
    memset(fp, 0, sizeof *fp);
    fp->sys = r->sys;
    pw_thermo_kernel_init(&fp->sys, &fp->kern);
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
    /* one block: the used points, then their three-phase flags (freed together) */
    size_t cap = r->n_pts ? r->n_pts : 1;
    *used = malloc(sizeof(pw_point) * cap + sizeof(bool) * cap);
    if (!*used)
        return PW_ENOMEM;
    bool *tp = (bool *)(*used + cap);
    size_t n = 0;
    for (size_t i = 0; i < r->n_pts; i++)
        if (!r->pts[i].excluded && !fit_is_pure(&r->pts[i].meas)) {
            tp[n] = r->pts[i].three_phase;
            (*used)[n++] = r->pts[i].meas;
        }
    fp->pts = *used;
    fp->n_pts = n;
    /* the three-phase state, computed in every evaluation where it enters (fit_het_plan_of) */
    fit_het_plan plan = fit_het_plan_of(r);
    fp->three_phase = plan.state ? tp : NULL;
    fp->T3_guess_K = plan.T3_guess_K;
    fp->one_liquid_inside = !plan.inside;
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
    r->layers_scored = true; /* the objective of objective.c */
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
    /* parameters from component data (Wilson's volume ratio, UNIQUAC's r and q) */
    if (model->from_components) {
        pw_status st = model->from_components(c1, c2, r->sys.params, err);
        if (st != PW_OK)
            return st;
    }
    int iv = pw_model_param_index(model, "V2_V1");
    if (iv >= 0 && isfinite(o->V2_V1) && o->V2_V1 > 0.0)
        r->sys.params[iv] = o->V2_V1;
    r->sys.vapor = o->vapor;
    pw_status vst = pw_vapor_check(o->vapor, c1, c2, err);
    if (vst != PW_OK) {
        char why[PW_ERROR_MSG_MAX];
        snprintf(why, sizeof why, "%s", err ? err->msg : "");
        return pw_error_set(err, vst, ds->path, 0, "--vapor %s needs critical data: %s",
                            pw_vapor_name(o->vapor), why);
    }
    for (size_t k = 0; k < model->n_params; k++)
        r->n_fitted += r->fitted[k];
    r->kind = ds->kind;
    r->has_y = ds->has_y;
    r->P_fixed_Pa = ds->P_fixed_Pa;
    r->T_fixed_K = ds->T_fixed_K;
    r->objective = ds->kind == PW_DATA_ISOBARIC ? (ds->has_y ? PW_OBJ_TXY : PW_OBJ_TX)
                                                : (ds->has_y ? PW_OBJ_PXY : PW_OBJ_PX);
    r->data_sigma_known = true;
    r->data_sigma_T_K = ds->sigma_T_K;
    r->data_sigma_P_rel = ds->sigma_P_rel;
    r->data_sigma_P_abs_Pa = ds->sigma_P_abs_Pa;
    r->data_sigma_y = ds->sigma_y;
    r->data_sigma_x = ds->sigma_x;
    r->data_sigma_y_stated = ds->sigma_y_stated;
    r->data_sigma_x_stated = ds->sigma_x_stated;
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

/* Records a converged run among the distinct minima (sorted by chi2 on output). */
static void add_minimum(pw_fit_result *r, const fit_problem *fp, const run_result *run)
{
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
    bool same_sign = r->sys.model->starts_same_sign;
    double sign = gsl_rng_uniform(rng) < 0.5 ? -1.0 : 1.0;
    for (size_t j = 0; j < fp->n_fit; j++) {
        size_t k = fp->idx[j];
        double lo, hi;
        start_range(r->sys.model, k, &lo, &hi);
        double v = lo + (hi - lo) * gsl_rng_uniform(rng);
        if (same_sign) /* all fitted constants of one sign, away from zero */
            v = sign * (0.05 + fabs(v));
        start[k] = v;
    }
}

typedef struct screen_item {
    size_t c;     /* index into cand */
    size_t next;  /* points summed so far */
    double sum;   /* their sum of squares */
} screen_item;

static int cmp_screen(const void *a, const void *b)
{
    double sa = ((const screen_item *)a)->sum, sb = ((const screen_item *)b)->sum;
    return (sa > sb) - (sa < sb);
}

#define SCREEN_FIRST_POINTS 4

/* Draws n_draw starts after cand[n_fixed - 1] and screens them; returns the new count of
 * candidates. Only the best n_runs - n_fixed draws will run, so a draw needs its full chi2 only
 * while it can be among them. Every draw first sums its first SCREEN_FIRST_POINTS points; then,
 * in the order of those partial sums (the promising draws first), each sum is carried on and
 * stops once it exceeds the (n_runs - n_fixed)-th best full chi2 so far: such a draw cannot be
 * among the best, and keeps its partial sum, above every kept draw's chi2. The kept draws,
 * their chi2 (to the bit: the same sums in the same order) and so their order are those of
 * the full screen; draws that cannot be evaluated are dropped, as there. */
static size_t screen_draws(const pw_fit_result *out, const fit_problem *fp, gsl_rng *rng,
                           size_t n_draw, size_t n_runs, size_t n_fixed, start_cand *cand,
                           double *work, size_t *n_fev)
{
    size_t n_cand = n_fixed, n_items = 0;
    screen_item *it = malloc(sizeof *it * (n_draw ? n_draw : 1));
    size_t n_keep = n_runs > n_fixed ? n_runs - n_fixed : 0, n_best = 0;
    double *best = malloc(sizeof(double) * (n_keep ? n_keep : 1));
    for (size_t s = 1; s <= n_draw; s++) {
        make_start(out, fp, rng, s, cand[n_cand].p);
        if (out->sys.model->check(cand[n_cand].p) != PW_OK)
            continue;
        (*n_fev)++;
        cand[n_cand].chi2 = NAN;
        if (it)
            it[n_items++] = (screen_item){.c = n_cand, .next = 0, .sum = 0.0};
        n_cand++;
    }
    if (!it || !best) { /* no memory for the order: every sum in full */
        for (size_t c = n_fixed; c < n_cand; c++) {
            size_t next = 0;
            double sum = 0.0;
            cand[c].chi2 = fit_chi2_continue(fp, cand[c].p, fp->n_pts, INFINITY, &next, &sum, work)
                               ? sum : (double)INFINITY;
        }
    } else {
        for (size_t i = 0; i < n_items; i++)
            if (!fit_chi2_continue(fp, cand[it[i].c].p, SCREEN_FIRST_POINTS, INFINITY,
                                   &it[i].next, &it[i].sum, work))
                it[i].sum = INFINITY;
        qsort(it, n_items, sizeof *it, cmp_screen);
        for (size_t i = 0; i < n_items; i++) {
            start_cand *cd = &cand[it[i].c];
            if (!isfinite(it[i].sum)) {
                cd->chi2 = INFINITY;
                continue;
            }
            double cap = n_keep && n_best == n_keep ? best[n_keep - 1] : (double)INFINITY;
            if (!fit_chi2_continue(fp, cd->p, fp->n_pts, cap, &it[i].next, &it[i].sum, work)) {
                cd->chi2 = INFINITY;
                continue;
            }
            cd->chi2 = it[i].sum;
            if (!n_keep || it[i].sum > cap)
                continue;
            size_t at = n_best < n_keep ? n_best++ : n_keep - 1; /* insert, dropping the largest */
            while (at > 0 && best[at - 1] > it[i].sum) {
                best[at] = best[at - 1];
                at--;
            }
            best[at] = it[i].sum;
        }
    }
    free(it);
    free(best);
    /* drop the draws that could not be evaluated, keeping the draw order */
    size_t kept = n_fixed;
    for (size_t c = n_fixed; c < n_cand; c++)
        if (isfinite(cand[c].chi2))
            cand[kept++] = cand[c];
    return kept;
}

pw_status pw_fit_run(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                     const pw_model_type *model, const pw_fit_options *opt, pw_fit_result *out,
                     pw_error *err)
{
    pw_fit_options o = opt ? *opt : pw_fit_default_options();
    if (!ds || !c1 || !c2 || !model || !out)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "missing argument to the fit");
    if (o.max_iter < 1)
        return pw_error_set(err, PW_EINVAL, ds->path, 0, "the iteration limit must be at least 1");
    if (ds->mass_x || ds->mass_y)
        return pw_error_set(err, PW_EINVAL, ds->path, ds->composition_line,
                            "the dataset's compositions are mass fractions (convert them with "
                            "pw_dataset_to_mole first)");
    pw_status st = init_result(ds, c1, c2, model, &o, out, err);
    if (st == PW_OK)
        st = fit_het_setup(ds, &o, out, err);
    if (st != PW_OK) {
        pw_fit_result_free(out);
        return st;
    }
    fit_problem fp;
    pw_point *used = NULL;
    st = fit_build_problem(out, &fp, &used);
    if (st == PW_OK && o.n_tie_lines) {
        fp.ties = o.tie_lines;
        fp.n_ties = o.n_tie_lines;
        fp.sigma_x_lle = out->sigma_x_lle;
        fp.n_res += 2 * o.n_tie_lines;
    }
    double *J = st == PW_OK ? malloc(sizeof(double) * fp.n_res * fp.n_fit) : NULL;
    fit_root *roots = NULL;
    if (st == PW_OK && !fp.three_phase && !fp.n_ties) {
        roots = calloc(fp.n_pts ? fp.n_pts : 1, sizeof *roots);
        if (!roots)
            st = PW_ENOMEM;
    }
    fp.roots = roots;
    gsl_rng *rng = gsl_rng_alloc(gsl_rng_mt19937);
    gsl_multifit_nlinear_parameters params = gsl_multifit_nlinear_default_parameters();
    params.trs = gsl_multifit_nlinear_trs_lm;
    params.scale = gsl_multifit_nlinear_scale_more;
    params.solver = gsl_multifit_nlinear_solver_qr;
    gsl_multifit_nlinear_workspace *w =
        J ? gsl_multifit_nlinear_alloc(gsl_multifit_nlinear_trust, &params, fp.n_res, fp.n_fit)
          : NULL;
    /* Starts (docs/fitting.md): the model's default start, the ideal-solution point, then the
     * best of 4 n_starts seeded draws, each screened by one evaluation; LM runs from exactly
     * n_starts of them (fewer only when fewer draws can be evaluated at all). */
    size_t n_runs = o.n_starts ? o.n_starts : 1;
    size_t n_draw = n_runs > 1 ? 4 * n_runs : 0;
    if (n_runs > ((size_t)-1) / (8 * sizeof(start_cand)))
        n_runs = n_draw = 0, st = st == PW_OK ? PW_ENOMEM : st;
    start_cand *cand = st == PW_OK ? malloc(sizeof *cand * (n_draw + 2)) : NULL;
    double *work = st == PW_OK ? malloc(sizeof(double) * fp.n_res) : NULL;
    if (st == PW_OK && (!J || !rng || !w || !cand || !work))
        st = PW_ENOMEM;
    if (st != PW_OK) {
        free(used);
        free(J);
        free(roots);
        free(cand);
        free(work);
        gsl_rng_free(rng);
        if (w)
            gsl_multifit_nlinear_free(w);
        pw_fit_result_free(out);
        return pw_error_set(err, st, ds->path, 0, "%s (%zu starts requested)", pw_strerror(st),
                            o.n_starts);
    }
    gsl_rng_set(rng, o.seed);
    double T3_warm = NAN;
    fp.T3_warm_K = &T3_warm;
    lm_ctx ctx = {.fp = &fp, .J_cache = J};
    memcpy(ctx.fitted_mask, out->fitted, sizeof ctx.fitted_mask);
    gsl_multifit_nlinear_fdf fdf = {.f = lm_f, .df = lm_df, .fvv = NULL, .n = fp.n_res,
                                    .p = fp.n_fit, .params = &ctx};
    size_t n_fixed = 0;
    memcpy(cand[n_fixed].p, out->sys.params, sizeof cand[0].p);
    cand[n_fixed++].chi2 = -2.0;
    if (n_runs > 1 && fit_ideal_point(&out->sys, cand[n_fixed].p)) {
        bool same = memcmp(cand[n_fixed].p, cand[0].p, sizeof cand[0].p) == 0;
        if (!same)
            cand[n_fixed++].chi2 = -1.0;
    }
    size_t n_cand = n_fixed;
    if (fp.three_phase || fp.n_ties) {
        for (size_t s = 1; s <= n_draw; s++) {
            make_start(out, &fp, rng, s, cand[n_cand].p);
            if (model->check(cand[n_cand].p) != PW_OK)
                continue;
            T3_warm = NAN;
            cand[n_cand].chi2 = fit_chi2(&fp, cand[n_cand].p, work);
            ctx.n_fev++;
            if (isfinite(cand[n_cand].chi2))
                n_cand++;
        }
    } else {
        n_cand = screen_draws(out, &fp, rng, n_draw, n_runs, n_fixed, cand, work, &ctx.n_fev);
    }
    free(work);
    qsort(cand, n_cand, sizeof *cand, cmp_cand);
    if (n_cand > n_runs)
        n_cand = n_runs;
    run_result best = {.chi2 = INFINITY, .stop = PW_STOP_NONE, .cls = RUN_FAILED};
    out->runaway_chi2 = NAN;
    memcpy(best.params, out->sys.params, sizeof best.params);
    for (size_t c = 0; c < n_cand; c++) {
        run_result run;
        T3_warm = NAN;
        run_lm(w, &fdf, &ctx, cand[c].p, &o, o.exhaustive_starts ? NULL : out, &run);
        out->iterations += run.iterations;
        out->n_runs++;
        if (run.basin >= 0) { /* a known minimum, confirmed once more */
            out->minima[run.basin].hits++;
            continue;
        }
        if (run.cls == RUN_STATIONARY)
            add_minimum(out, &fp, &run);
        if (run.cls == RUN_RUNAWAY) {
            out->n_runaway_runs++;
            if (!(run.chi2 >= out->runaway_chi2))
                out->runaway_chi2 = run.chi2;
        }
        if (out->n_runs == 1 || run_better(&run, &best))
            best = run;
    }
    free(cand);
    out->n_fev = ctx.n_fev;
    out->n_jev = ctx.n_jev;
    qsort(out->minima, out->n_minima, sizeof out->minima[0], cmp_minima);
    /* Among minima as good as the best (METHODS 3.5: S <= 1.01 S_best or delta-AICc < 2), take
     * the first that predicts no liquid split over the data's temperature range. */
    out->n_residuals = fp.n_res;
    /* (not for partly miscible data, where the split is measured: pw_fit_default_minimum) */
    out->minimum_default = 0;
    out->minimum_split_skipped = 0;
    if (best.cls == RUN_STATIONARY) {
        size_t k = pw_fit_default_minimum(out, &out->minimum_split_skipped);
        if (k > 1) {
            memcpy(best.params, out->minima[k - 1].params, sizeof best.params);
            best.chi2 = out->minima[k - 1].chi2;
            best.exact = chi2_exact(best.chi2, fp.n_res);
        }
        out->minimum_default = k;
    }
    memcpy(out->sys.params, best.params, sizeof best.params);
    out->stop = best.stop;
    out->chi2 = best.chi2;
    out->dof = fp.n_res > fp.n_fit ? fp.n_res - fp.n_fit : 0;
    out->runaway_param = pw_fit_runaway_param(model, out->fitted, best.params, out->sys.T_ref_K);
    switch (best.cls) {
    case RUN_STATIONARY: out->fit_class = best.exact ? PW_FIT_EXACT : PW_FIT_MINIMUM; break;
    case RUN_RUNAWAY: out->fit_class = PW_FIT_RUNAWAY; break;
    case RUN_MAXITER: out->fit_class = PW_FIT_MAXITER; break;
    case RUN_FAILED: out->fit_class = PW_FIT_FAILED; break;
    }
    out->identifiable = true;
    out->sv_ratio = NAN;

    /* Covariance, standard errors, confidence intervals, correlation at the chosen optimum.
     * An exact fit has chi2/dof at rounding level, which says nothing about the measurement
     * error; its covariance uses the a-priori variance factor 1 (the stated uncertainties). */
    for (size_t k = 0; k < PW_MAX_PARAMS; k++) {
        out->stderr_[k] = NAN;
        out->ci95[k][0] = out->ci95[k][1] = NAN;
        out->stderr_meaningful[k] = false;
    }
    double *f = malloc(sizeof(double) * fp.n_res);
    fp.T3_warm_K = NULL;
    fit_roots_reset(&fp);
    pw_status cst = f ? fit_eval(&fp, out->sys.params, f, J) : PW_ENOMEM;
    free(f);
    if (cst == PW_OK && out->dof > 0) {
        double s2 = out->fit_class == PW_FIT_EXACT ? 1.0 : out->chi2 / (double)out->dof;
        fit_info info;
        double t = gsl_cdf_tdist_Pinv(0.975, (double)out->dof);
        cst = fit_identify(&fp, J, fp.n_res, s2, t, &info);
        if (cst == PW_OK) {
            fit_store_identify(out, &fp, &info, t);
        } else {
            out->identifiable = false;
        }
    }
    if (out->fit_class == PW_FIT_MINIMUM && !out->identifiable)
        out->fit_class = PW_FIT_UNIDENTIFIABLE;
    out->converged = out->fit_class == PW_FIT_MINIMUM || out->fit_class == PW_FIT_EXACT ||
                     out->fit_class == PW_FIT_UNIDENTIFIABLE;
    fit_het_finish(&fp, out);
    free(used);
    free(J);
    free(roots);
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
