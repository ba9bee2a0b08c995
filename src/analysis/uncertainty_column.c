/* Column results as a propagation function (R_min, boil-up at R_min, stages at the operating
 * reflux), and the feasibility risk in words. */
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>
#include <pinchwise/design.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/uncertainty.h>

#include <math.h>
#include <stdio.h>
#include <string.h>

pw_unc_column_ctx pw_unc_column_ctx_make(double P_Pa, const pw_column_spec *spec)
{
    pw_unc_column_ctx c;
    memset(&c, 0, sizeof c);
    c.P_Pa = P_Pa;
    if (spec)
        c.spec = *spec;
    c.opt = pw_column_default_options();
    c.factor = 1.3; /* common practice: R = 1.2-1.5 R_min */
    return c;
}

/* The same outputs with energy balances (column_energy.c); the boil-up at R_min is not defined
 * there without stepping, so it is NAN. */
static pw_status energy_fn(const pw_unc_column_ctx *c, const pw_system *sys,
                           const pw_column_options *o, double *out)
{
    pw_energy_result r;
    pw_design_table t;
    pw_status st = pw_energy_column_solve(sys, c->heat, c->P_Pa, &c->spec, o, &r, &t);
    if (st == PW_OK && !r.feasible)
        st = PW_EINFEASIBLE;
    if (st == PW_OK) {
        out[PW_UNC_RMIN] = r.r_min;
        out[PW_UNC_SMIN] = NAN;
        out[PW_UNC_STAGES] = t.n > 0 && t.row[0].reachable ? t.row[0].stages : (double)NAN;
    }
    pw_design_table_free(&t);
    return st;
}

pw_status pw_unc_column_fn(void *ctx, const pw_system *sys, double *out)
{
    const pw_unc_column_ctx *c = ctx;
    if (!c || !sys || !out || !(c->factor > 1.0))
        return PW_EINVAL;
    pw_column_options o = c->opt;
    o.factors[0] = c->factor;
    o.n_factors = 1;
    if (c->heat)
        return energy_fn(c, sys, &o, out);
    pw_column_result r;
    /* a draw whose liquids reach into its two-liquid region is infeasible for the single column */
    pw_status st = pw_column_solve_system(sys, c->P_Pa, &c->spec, &o, &r, NULL, NULL);
    /* An infeasible split is an outcome; so is a split no pinch limits (PW_ERANGE with a
     * reason): both mean the design basis does not hold for this parameter set. */
    if ((st == PW_OK && !r.feasible) || (st == PW_ERANGE && r.reason[0]))
        return PW_EINFEASIBLE;
    if (st != PW_OK)
        return st;
    out[PW_UNC_RMIN] = r.r_min;
    out[PW_UNC_SMIN] = r.s_min;
    out[PW_UNC_STAGES] = r.n_design > 0 ? r.design[0].stages : (double)NAN;
    return PW_OK;
}

const char *pw_unc_risk_words(const pw_unc_result *r, char *buf, size_t len)
{
    if (!buf || len == 0)
        return buf;
    buf[0] = '\0';
    if (!r)
        return buf;
    size_t decided = r->n_feasible + r->n_infeasible;
    if (decided == 0) {
        snprintf(buf, len, "no parameter sets were drawn, so the feasibility risk is unknown");
        return buf;
    }
    double share = 100.0 * (double)r->n_infeasible / (double)decided;
    const char *failed = r->n_failed ? " (draws whose calculation failed are left out)" : "";
    if (r->n_infeasible == 0)
        snprintf(buf, len,
                 "in all %zu parameter sets drawn from the fit's uncertainty the split can be "
                 "made%s",
                 decided, failed);
    else if (r->n_feasible == 0)
        snprintf(buf, len,
                 "in none of the %zu parameter sets drawn from the fit's uncertainty can the "
                 "split be made%s",
                 decided, failed);
    else
        snprintf(buf, len,
                 "in %.0f %% of parameter sets drawn from the fit's uncertainty (%zu of %zu) the "
                 "split cannot be made: within the data's uncertainty the equilibrium curve may "
                 "meet the diagonal (an azeotrope) or lose its driving force between xb and xd, "
                 "so a design at these purities rests on the fitted model alone%s",
                 share < 1.0 ? ceil(share) : (share > 99.0 ? floor(share) : round(share)),
                 r->n_infeasible, decided, failed);
    return buf;
}

pw_status pw_unc_column_assess(const pw_fit_result *fit, const pw_unc_column_ctx *col,
                               const pw_unc_options *opt, size_t plan_bins, size_t plan_points,
                               pw_unc_column_assessment *out)
{
    if (!fit || !col || !out)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    out->plan_status = PW_EINVAL;
    pw_unc_column_ctx c = *col;
    pw_unc_problem pb;
    pw_status st = pw_unc_problem_from_fit(&pb, fit, pw_unc_column_fn, &c, PW_UNC_COLUMN_NOUT);
    if (st == PW_OK)
        st = pw_unc_propagate(&pb, opt, &out->res);
    if (st != PW_OK)
        return st;
    if (out->res.out[PW_UNC_RMIN].lin_ok)
        out->plan_status = pw_unc_plan_measurements(fit, out->res.out[PW_UNC_RMIN].grad, plan_bins,
                                                    plan_points, &out->plan);
    return PW_OK;
}
