#include "reflux_common.h"

#include "cli.h"
#include "cli_units.h"

#include <math.h>
#include <pinchwise/curve.h>
#include <pinchwise/decanter.h>
#include <pinchwise/design_doc.h>
#include <pinchwise/column_direction.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static int parse_factors(const char *text, pw_column_options *o, pw_error *err)
{
    o->n_factors = 0;
    const char *p = text;
    while (*p) {
        char *end;
        double f = strtod(p, &end);
        bool decimal = strspn(p, "0123456789+-.eE") == (size_t)(end - p); /* no hex, no blanks */
        if (end == p || !decimal || !isfinite(f) || f <= 1.0 || f > 100.0)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "--factors %s: expected multiples of R_min above 1 and at most 100, "
                                "e.g. 1.2,1.3,1.5",
                                text);
        if (o->n_factors == PW_COLUMN_MAX_FACTORS)
            return pw_error_set(err, PW_EINVAL, NULL, 0, "--factors: at most %d values",
                                PW_COLUMN_MAX_FACTORS);
        o->factors[o->n_factors++] = f;
        p = end;
        if (*p == ',')
            p++;
        else if (*p)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "--factors %s: expected comma-separated numbers", text);
    }
    return o->n_factors ? 0 : pw_error_set(err, PW_EINVAL, NULL, 0, "--factors: no values");
}

int pw_reflux_parse_args(int argc, char **argv, pw_reflux_args *a, pw_error *err)
{
    memset(a, 0, sizeof *a);
    a->opt = pw_column_default_options();
    pw_cli_targets tg = {.q = 1.0};
    for (int i = 1; i < argc; i++) {
        const char *v = NULL;
        bool missing = false;
        if (!strcmp(argv[i], "--help") || !strcmp(argv[i], "-h"))
            return -1;
        if (pw_cli_opt(argc, argv, &i, "--json", NULL, NULL)) {
            a->json = true;
            continue;
        }
        if (pw_cli_opt(argc, argv, &i, "--energy", NULL, NULL)) {
            a->energy = true;
            continue;
        }
        if (pw_cli_opt(argc, argv, &i, "--uncertainty", NULL, NULL)) {
            a->uncertainty = true;
            continue;
        }
        if (pw_cli_opt(argc, argv, &i, "--exit-verdict", NULL, NULL)) {
            a->exit_verdict = true;
            continue;
        }
        if (!strncmp(argv[i], "--", 2)) {
            const char *opt = argv[i];
            if (!(pw_cli_opt(argc, argv, &i, opt, &v, &missing)) || missing) {
                pw_error_set(err, PW_EINVAL, NULL, 0, "%s needs a value", opt);
                return PW_EXIT_USAGE;
            }
            int rc = 0, trc;
            if ((trc = pw_cli_target_opt(opt, v, &tg, err)) >= 0) {
                int k = !strcmp(opt, "--xd")   ? 0
                        : !strcmp(opt, "--xb") ? 1
                        : !strcmp(opt, "--zf") ? 2
                                               : -1;
                if (k >= 0)
                    a->given[k] = v;
                rc = trc; /* --pressure, --xd, --xb, --zf, --q: parsed into tg */
            } else if (!strcmp(opt, "--components")) {
                a->components = v;
            } else if (!strcmp(opt, "--minimum")) {
                a->minimum = v;
            } else if (!strcmp(opt, "--factors") || !strcmp(opt, "--operating-factor")) {
                rc = parse_factors(v, &a->opt, err) ? PW_EXIT_USAGE : 0;
            } else if (!strcmp(opt, "--samples") || !strcmp(opt, "--seed") ||
                       !strcmp(opt, "--compare")) {
                /* options of the uncertainty extension: kept for it to read */
                if (a->n_extra + 2 > (int)(sizeof a->extra / sizeof a->extra[0])) {
                    pw_error_set(err, PW_EINVAL, NULL, 0, "too many options");
                    return PW_EXIT_USAGE;
                }
                a->extra[a->n_extra++] = opt;
                a->extra[a->n_extra++] = v;
            } else {
                pw_error_set(err, PW_EINVAL, NULL, 0, "unknown option %s", opt);
                return PW_EXIT_USAGE;
            }
            if (rc)
                return rc;
            continue;
        }
        if (a->fit_path) {
            pw_error_set(err, PW_EINVAL, NULL, 0, "unexpected argument %s (one fit file)", argv[i]);
            return PW_EXIT_USAGE;
        }
        a->fit_path = argv[i];
    }
    a->P_Pa = tg.P_Pa;
    a->spec = (pw_column_spec){.xd = tg.xd, .xb = tg.xb, .zf = tg.zf, .q = tg.q};
    a->have_P = tg.have_P, a->have_xd = tg.have_xd, a->have_xb = tg.have_xb;
    a->have_zf = tg.have_zf;
    if (!a->fit_path || !a->have_P || !a->have_xd || !a->have_xb || !a->have_zf) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "a fit file and --pressure, --xd, --xb, --zf are required");
        return PW_EXIT_USAGE;
    }
    memcpy(a->basis, tg.basis, sizeof a->basis);
    return 0;
}

/* The targets in mole fractions: xb < zf < xd, or xd < zf < xb (component 1 to the bottoms). */
static int check_targets(const pw_column_spec *s, pw_error *err)
{
    if (!((s->xb < s->zf && s->zf < s->xd) || (s->xd < s->zf && s->zf < s->xb))) {
        pw_error_set(err, PW_EINVAL, NULL, 0,
                     "the feed must lie between the products: xb < zf < xd (component 1 goes "
                     "overhead) or xd < zf < xb (component 1 leaves with the bottoms); got xb %g, "
                     "zf %g, xd %g as mole fractions of component 1",
                     s->xb, s->zf, s->xd);
        return PW_EXIT_USAGE;
    }
    return 0;
}

int pw_reflux_compute(const pw_reflux_args *a, pw_reflux_run *run, pw_error *err)
{
    memset(run, 0, sizeof *run);
    pw_status st = pw_cli_read_fit("reflux", a->fit_path, a->components, &run->fit, err);
    if (st == PW_OK && (st = pw_cli_apply_minimum("reflux", &run->fit, a->minimum, &run->minimum,
                                                  err)) != PW_OK)
        pw_fit_result_free(&run->fit);
    if (st != PW_OK)
        return pw_status_exit_code(st);
    run->P_Pa = a->P_Pa;
    run->spec = a->spec;
    if (a->basis[0] == PW_BASIS_MASS || a->basis[1] == PW_BASIS_MASS ||
        a->basis[2] == PW_BASIS_MASS)
        memcpy(run->given, a->given, sizeof run->given);
    st = pw_cli_targets_to_mole(&run->spec.xd, &run->spec.xb, &run->spec.zf, a->basis,
                                &run->fit.sys, err);
    int rc = st == PW_OK ? check_targets(&run->spec, err) : pw_status_exit_code(st);
    if (rc != 0) {
        pw_fit_result_free(&run->fit);
        return rc;
    }
    /* The design rows come from pw_reflux_design (stage profiles, a row the column cannot
     * reach marked as such), not from pw_column_solve's own table. */
    pw_column_options o = a->opt;
    o.n_factors = 0;
    st = pw_reflux_solve(&run->fit.sys, a->P_Pa, &run->spec, &o, a->fit_path, &run->col,
                         &run->T_top_K, &run->T_bottom_K, err);
    if (st == PW_OK && a->energy) {
        run->energy = true;
        st = pw_heat_data_from_system(&run->fit.sys, &run->heat, err);
        if (st != PW_OK) {
            char msg[PW_ERROR_MSG_MAX];
            snprintf(msg, sizeof msg, "%s", err->msg);
            pw_error_set(err, st, a->fit_path, 0, "--energy: %s", msg);
        }
    }
    if (st == PW_OK) {
        st = pw_reflux_design(&run->fit.sys, a->P_Pa, &run->spec, &a->opt, &run->col,
                              run->energy ? &run->heat : NULL, &run->design, &run->energy_res);
        if (st != PW_OK)
            pw_error_set(err, st, a->fit_path, 0, "%s%s%s", pw_strerror(st),
                         run->energy_res.reason[0] ? ": " : "", run->energy_res.reason);
    }
    if (st != PW_OK) {
        pw_design_table_free(&run->design);
        pw_fit_result_free(&run->fit);
        return pw_status_exit_code(st);
    }
    return 0;
}

void pw_reflux_run_free(pw_reflux_run *run)
{
    pw_design_table_free(&run->design);
    pw_fit_result_free(&run->fit);
}

void pw_reflux_warn(const pw_reflux_run *run)
{
    const pw_fit_result *r = &run->fit;
    double Ts[2] = {run->T_top_K, run->T_bottom_K};
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &r->sys.comp[i];
        for (int k = 0; k < 2; k++) {
            double ex = isfinite(Ts[k]) ? pw_component_range_excess_K(c, Ts[k]) : 0.0;
            if (ex != 0.0)
                pw_cli_warnf("reflux", "the column %s at %.1f K lies %.1f K %s the vapor-pressure "
                             "range of %s",
                             k == 0 ? "top" : "bottom", Ts[k], fabs(ex), ex < 0 ? "below" : "above",
                             c->name);
        }
    }
    if (isfinite(r->T_min_K) && isfinite(run->T_top_K) &&
        (fmin(run->T_top_K, run->T_bottom_K) < r->T_min_K - 5.0 ||
         fmax(run->T_top_K, run->T_bottom_K) > r->T_max_K + 5.0))
        pw_cli_warnf("reflux", "the column runs at %.1f-%.1f K, outside the fitted data's %.1f-%.1f K "
                     "by more than 5 K: the model is extrapolated",
                     fmin(run->T_top_K, run->T_bottom_K), fmax(run->T_top_K, run->T_bottom_K),
                     r->T_min_K, r->T_max_K);
    double mis = pw_latent_heat_mismatch(&r->sys);
    if (!run->energy && mis > 0.10)
        pw_cli_warnf("reflux", "the heats of vaporization of %s and %s differ by %.0f %%: constant "
                     "molal overflow is doubtful above about 10 %% (common practice); consider "
                     "--energy",
                     r->sys.comp[0].name, r->sys.comp[1].name, 100.0 * mis);
    if (!r->converged)
        pw_cli_warnf("reflux", "%s: the fit did not converge; do not design with it", r->dataset_path);
    pw_cli_warn_vapor_association("reflux", &r->sys);
    if (r->split)
        pw_cli_warnf("reflux", "the fitted model predicts a liquid-liquid split (x1 = %.3f at %.1f K)",
                     r->split_x, r->split_T_K);
    if (run->energy ? run->energy_res.feasible && run->energy_res.pinch.kind == PW_PINCH_TANGENT
                    : run->col.feasible && run->col.pinch.kind == PW_PINCH_TANGENT)
        pw_cli_warnf("reflux", "tangent pinch: stage counts near R_min are very sensitive to the "
                     "model%s",
                     run->with_uncertainty ? " (see the intervals below)" : "; consider --uncertainty");
}
