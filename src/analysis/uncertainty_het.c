/* The heterogeneous azeotrope and the decanter scheme as propagation functions
 * (include/pinchwise/uncertainty.h; methods: docs/uncertainty.md, docs/heterogeneous.md 5).
 * A parameter set drawn from the fit's uncertainty whose model no longer splits at the
 * three-phase condition, whose three-phase vapor leaves the gap, or whose scheme cannot make the
 * products is an outcome (PW_EINFEASIBLE), counted by pw_unc_propagate, never a failure. */
#include <pinchwise/lle.h>
#include <pinchwise/uncertainty.h>

#include <string.h>

pw_unc_het_ctx pw_unc_het_azeo_ctx(pw_az_mode mode, double fixed)
{
    pw_unc_het_ctx c;
    memset(&c, 0, sizeof c);
    c.mode = mode;
    c.fixed = fixed;
    c.opt = pw_column_default_options();
    return c;
}

pw_unc_het_ctx pw_unc_decanter_ctx(const pw_decanter_spec *spec, const pw_column_options *opt)
{
    pw_unc_het_ctx c;
    memset(&c, 0, sizeof c);
    c.decanter = true;
    c.mode = PW_AZ_ISOBARIC;
    if (spec) {
        c.spec = *spec;
        c.fixed = spec->P_Pa;
    }
    c.opt = opt ? *opt : pw_column_default_options();
    c.opt.n_factors = 0; /* only the minima are propagated: no design stepping per draw */
    return c;
}

static void put_three_phase(const pw_three_phase *tp, bool isobaric, double *out)
{
    out[PW_UNC_HET_TP] = isobaric ? tp->T_K : tp->P_Pa / 1e3;
    out[PW_UNC_HET_Y] = tp->y1;
    out[PW_UNC_HET_XI] = tp->x[0];
    out[PW_UNC_HET_XII] = tp->x[1];
}

pw_status pw_unc_het_fn(void *ctx, const pw_system *sys, double *out)
{
    const pw_unc_het_ctx *c = ctx;
    if (!c || !sys || !out)
        return PW_EINVAL;
    if (!pw_model_can_split(sys->model))
        return PW_EINFEASIBLE;
    if (c->decanter) {
        pw_decanter_result r;
        pw_status st = pw_decanter_solve(sys, &c->spec, &c->opt, &r);
        if (st != PW_OK)
            return st;
        if (!r.feasible)
            return PW_EINFEASIBLE;
        put_three_phase(&r.decanter, true, out);
        out[PW_UNC_DEC_SA] = r.col[0].boilup_min;
        out[PW_UNC_DEC_SB] = r.col[1].boilup_min;
        out[PW_UNC_DEC_TOP_LEAN] = r.top_x1[1]; /* the decanter's layers (cooled or not) */
        out[PW_UNC_DEC_TOP_RICH] = r.top_x1[0];
        return PW_OK;
    }
    bool isobaric = c->mode == PW_AZ_ISOBARIC;
    pw_three_phase tp;
    pw_status st = isobaric ? pw_three_phase_at_P(sys, c->fixed, &tp)
                            : pw_three_phase_at_T(sys, c->fixed, &tp);
    if (st != PW_OK)
        return st;
    if (!tp.exists || !tp.heterogeneous_azeotrope)
        return PW_EINFEASIBLE;
    put_three_phase(&tp, isobaric, out);
    return PW_OK;
}

pw_status pw_unc_het_assess(const pw_fit_result *fit, const pw_unc_het_ctx *ctx,
                            const pw_unc_options *opt, pw_unc_result *res)
{
    if (!fit || !ctx || !res)
        return PW_EINVAL;
    pw_unc_problem pb;
    pw_status st = pw_unc_problem_from_fit(&pb, fit, pw_unc_het_fn, (void *)ctx,
                                           ctx->decanter ? PW_UNC_DEC_NOUT : PW_UNC_HET_NOUT);
    if (st != PW_OK)
        return st;
    return pw_unc_propagate(&pb, opt, res);
}
