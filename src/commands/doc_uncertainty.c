/* The keys --uncertainty adds to the reflux and azeotrope documents, and what they are computed
 * from (moved from src/cli/reflux_uncert.c and src/cli/azeo_uncert.c). */
#include <math.h>
#include <pinchwise/commands.h>
#include <stdio.h>

#define PLAN_BINS 10
#define PLAN_POINTS 5

json_t *pw_json_pair(const double v[2])
{
    if (!isfinite(v[0]) || !isfinite(v[1]))
        return json_null();
    return json_pack("[o,o]", pw_json_num(v[0]), pw_json_num(v[1]));
}

json_t *pw_unc_output_doc(const pw_unc_output *o)
{
    json_t *j = json_object();
    json_object_set_new(j, "value", pw_json_num(o->value));
    json_object_set_new(j, "ci95", pw_json_pair(o->ci));
    json_object_set_new(j, "ci95_from", json_string(!isfinite(o->ci[0]) ? "none"
                                                    : o->ci_sampled    ? "sampled"
                                                                       : "linearised"));
    json_object_set_new(j, "ci95_linearised", o->lin_ok ? pw_json_pair(o->ci_lin) : json_null());
    json_object_set_new(j, "sd_linearised", o->lin_ok ? pw_json_num(o->sd_lin) : json_null());
    json_object_set_new(j, "ci95_sampled", o->mc_ok ? pw_json_pair(o->ci_mc) : json_null());
    json_object_set_new(j, "sd_sampled", o->mc_ok ? pw_json_num(o->sd_mc) : json_null());
    json_object_set_new(j, "intervals_disagree", json_boolean(o->disagree));
    return j;
}

void pw_reflux_unc_doc(json_t *o, const pw_unc_result *r, const pw_unc_options *opt, double factor,
                       pw_status plan_status, const pw_unc_plan *plan)
{
    json_object_set_new(o, "r_min_ci95", pw_json_pair(r->out[PW_UNC_RMIN].ci));
    json_object_set_new(o, "feasible_probability", pw_json_num(r->p_feasible));
    json_t *j = json_object();
    json_object_set_new(j, "r_min", pw_unc_output_doc(&r->out[PW_UNC_RMIN]));
    json_object_set_new(j, "boilup_min", pw_unc_output_doc(&r->out[PW_UNC_SMIN]));
    json_t *st = pw_unc_output_doc(&r->out[PW_UNC_STAGES]);
    json_object_set_new(st, "reflux_factor", pw_json_num(factor));
    /* feasible draws whose column needs more than the stage limit at this reflux: reported,
     * left out of the stage interval */
    size_t counted = r->out[PW_UNC_STAGES].n_mc;
    json_object_set_new(st, "draws_not_reached",
                        json_integer((json_int_t)(r->n_feasible > counted ? r->n_feasible - counted
                                                                          : 0)));
    json_object_set_new(j, "stages_operating", st);
    json_object_set_new(j, "draws", json_pack("{s:I,s:I,s:I,s:I,s:I,s:I,s:s}",
        "requested", (json_int_t)opt->samples, "evaluated", (json_int_t)r->n_samples,
        "feasible", (json_int_t)r->n_feasible, "infeasible", (json_int_t)r->n_infeasible,
        "failed", (json_int_t)r->n_failed, "redrawn_outside_domain", (json_int_t)r->n_redrawn,
        "factor", r->sampler_eigen ? "eigen-decomposition" : "Cholesky"));
    json_object_set_new(j, "seed", json_integer((json_int_t)opt->seed));
    char words[PW_REASON_MAX * 2];
    json_object_set_new(j, "feasibility_risk", json_string(pw_unc_risk_words(r, words,
                                                                            sizeof words)));
    if (plan_status == PW_OK) {
        const pw_unc_plan_bin *b = &plan->bins[plan->best];
        json_object_set_new(j, "next_measurements", json_pack("{s:o,s:I,s:o,s:s}",
            "x1_range", pw_json_pair((const double[2]){b->x_lo, b->x_hi}),
            "points", (json_int_t)plan->points_per_bin,
            "r_min_sd_reduction", pw_json_num(b->reduction),
            "advice", pw_unc_plan_words(plan, "R_min", words, sizeof words)));
    } else {
        json_object_set_new(j, "next_measurements", json_null());
    }
    json_object_set_new(j, "method",
                        json_string("fitted-parameter covariance: delta method with central "
                                    "differences, and Monte Carlo with 2.5/97.5 % percentiles "
                                    "(JCGM 101:2008); sampled interval quoted when the two "
                                    "disagree by more than 25 % of its width"));
    json_object_set_new(j, "scope",
                        json_string("covers the scatter of the fitted data only, not the "
                                    "choice of model, the vapor-pressure constants or the "
                                    "constant-molal-overflow assumption"));
    json_object_set_new(o, "uncertainty", j);
}

pw_status pw_reflux_unc_run(const pw_fit_result *fit, const pw_unc_column_ctx *col,
                            const pw_unc_options *opt, const char *where,
                            pw_unc_column_assessment *out, pw_error *err)
{
    pw_status st = pw_unc_column_assess(fit, col, opt, PLAN_BINS, PLAN_POINTS, out);
    if (st != PW_OK)
        return pw_error_set(err, st, where, 0, "uncertainty propagation failed: %s%s",
                            pw_strerror(st),
                            st == PW_EINVAL ? " (is the fit's covariance available?)" : "");
    return PW_OK;
}

void pw_azeotrope_unc_doc(json_t *list, const pw_az_result *r, const pw_unc_result *res_all,
                          size_t n, unsigned long seed)
{
    bool isP = r->mode == PW_AZ_ISOBARIC;
    for (size_t i = 0; i < n && i < json_array_size(list); i++) {
        json_t *az = json_array_get(list, i);
        const pw_unc_result *res = &res_all[i];
        json_object_set_new(az, "x1_ci95", pw_json_pair(res->out[PW_UNC_AZ_X1].ci));
        json_object_set_new(az, isP ? "T_K_ci95" : "P_kPa_ci95",
                            pw_json_pair(res->out[PW_UNC_AZ_TP].ci));
        json_t *j = json_object();
        json_object_set_new(j, "x1", pw_unc_output_doc(&res->out[PW_UNC_AZ_X1]));
        json_object_set_new(j, isP ? "T_K" : "P_kPa",
                            pw_unc_output_doc(&res->out[PW_UNC_AZ_TP]));
        json_object_set_new(j, "present_probability", pw_json_num(res->p_feasible));
        json_object_set_new(j, "draws", json_pack("{s:I,s:I,s:I,s:I,s:I}",
            "evaluated", (json_int_t)res->n_samples, "present", (json_int_t)res->n_feasible,
            "absent", (json_int_t)res->n_infeasible, "failed", (json_int_t)res->n_failed,
            "redrawn_outside_domain", (json_int_t)res->n_redrawn));
        json_object_set_new(j, "seed", json_integer((json_int_t)seed));
        json_object_set_new(az, "uncertainty", j);
    }
}

pw_status pw_azeotrope_unc_run(const pw_fit_result *fit, const pw_az_result *r,
                               const pw_unc_options *opt, pw_unc_result *res,
                               pw_error *err)
{
    for (size_t i = 0; i < r->n; i++) {
        pw_az_result one = *r;
        one.n = 1;
        one.az[0] = r->az[i];
        pw_status st = pw_unc_azeo_assess(fit, &one, opt, &res[i], NULL);
        if (st != PW_OK)
            return pw_error_set(err, st, fit->dataset_path[0] ? fit->dataset_path : NULL, 0,
                                "uncertainty of the azeotrope at x1 = %.4f failed: %s", r->az[i].x1,
                                pw_strerror(st));
    }
    return PW_OK;
}
