/* Azeotrope composition and temperature (or pressure) as a propagation function. A parameter set
 * is matched to the azeotrope of the estimate by kind and nearest composition; a set without an
 * azeotrope of that kind is an outcome ("absent"), counted like an infeasible split. */
#include <pinchwise/uncertainty.h>

#include <math.h>
#include <string.h>

pw_unc_azeo_ctx pw_unc_azeo_ctx_make(pw_az_mode mode, double fixed, const pw_az_options *opt,
                                     const pw_azeotrope *az)
{
    pw_unc_azeo_ctx c;
    memset(&c, 0, sizeof c);
    c.mode = mode;
    c.fixed = fixed;
    c.opt = opt ? *opt : pw_azeotrope_default_options();
    c.x_ref = az ? az->x1 : 0.5;
    c.kind = az ? az->kind : PW_AZ_MINIMUM_BOILING;
    return c;
}

pw_status pw_unc_azeo_fn(void *ctx, const pw_system *sys, double *out)
{
    const pw_unc_azeo_ctx *c = ctx;
    if (!c || !sys || !out)
        return PW_EINVAL;
    pw_az_result r;
    pw_status st = pw_azeotrope_find(sys, c->mode, c->fixed, &c->opt, &r);
    if (st != PW_OK)
        return st;
    size_t best = r.n;
    for (size_t i = 0; i < r.n; i++)
        if (r.az[i].kind == c->kind &&
            (best == r.n || fabs(r.az[i].x1 - c->x_ref) < fabs(r.az[best].x1 - c->x_ref)))
            best = i;
    if (best == r.n)
        return PW_EINFEASIBLE;
    out[PW_UNC_AZ_X1] = r.az[best].x1;
    out[PW_UNC_AZ_TP] = c->mode == PW_AZ_ISOBARIC ? r.az[best].T_K : r.az[best].P_Pa / 1e3;
    return PW_OK;
}

pw_status pw_unc_azeo_assess(const pw_fit_result *fit, const pw_az_result *r,
                             const pw_unc_options *opt, pw_unc_result res[PW_AZ_MAX],
                             size_t *failed)
{
    if (!fit || !r || !res || r->n > PW_AZ_MAX)
        return PW_EINVAL;
    for (size_t i = 0; i < r->n; i++) {
        pw_unc_azeo_ctx c = pw_unc_azeo_ctx_make(r->mode, r->fixed, NULL, &r->az[i]);
        pw_unc_problem pb;
        pw_status st = pw_unc_problem_from_fit(&pb, fit, pw_unc_azeo_fn, &c, PW_UNC_AZ_NOUT);
        if (st == PW_OK)
            st = pw_unc_propagate(&pb, opt, &res[i]);
        if (st != PW_OK) {
            if (failed)
                *failed = i;
            return st;
        }
    }
    return PW_OK;
}
