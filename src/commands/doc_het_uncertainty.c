/* The keys --uncertainty adds to the heterogeneous azeotrope's entry and to the decanter
 * document (computed by src/analysis/uncertainty_het.c). */
#include <math.h>
#include <pinchwise/commands.h>

pw_status pw_het_unc_run(const pw_fit_result *fit, const pw_unc_het_ctx *ctx,
                         const pw_unc_options *opt, pw_unc_result *res, pw_error *err)
{
    pw_status st = pw_unc_het_assess(fit, ctx, opt, res);
    if (st != PW_OK)
        return pw_error_set(err, st, fit->dataset_path[0] ? fit->dataset_path : NULL, 0,
                            "uncertainty of the %s failed: %s%s",
                            ctx->decanter ? "decanter scheme" : "heterogeneous azeotrope",
                            pw_strerror(st),
                            st == PW_EINVAL ? " (is the fit's covariance available?)" : "");
    return PW_OK;
}

static json_t *draws_doc(const pw_unc_result *r, const char *ok, const char *lost)
{
    return json_pack("{s:I,s:I,s:I,s:I,s:I}", "evaluated", (json_int_t)r->n_samples, ok,
                     (json_int_t)r->n_feasible, lost, (json_int_t)r->n_infeasible, "failed",
                     (json_int_t)r->n_failed, "redrawn_outside_domain", (json_int_t)r->n_redrawn);
}

static json_t *three_phase_doc(const pw_unc_result *r, bool isobaric)
{
    json_t *j = json_object();
    json_object_set_new(j, isobaric ? "T_K" : "P_kPa", pw_unc_output_doc(&r->out[PW_UNC_HET_TP]));
    json_object_set_new(j, "vapor_x1", pw_unc_output_doc(&r->out[PW_UNC_HET_Y]));
    json_object_set_new(j, "x1_layers", json_pack("[o,o]",
                                                  pw_unc_output_doc(&r->out[PW_UNC_HET_XI]),
                                                  pw_unc_output_doc(&r->out[PW_UNC_HET_XII])));
    return j;
}

void pw_het_azeo_unc_doc(json_t *entry, const pw_unc_result *res, pw_az_mode mode,
                         unsigned long seed)
{
    if (!entry)
        return;
    bool isP = mode == PW_AZ_ISOBARIC;
    json_object_set_new(entry, "x1_ci95", pw_json_pair(res->out[PW_UNC_HET_Y].ci));
    json_object_set_new(entry, isP ? "T_K_ci95" : "P_kPa_ci95",
                        pw_json_pair(res->out[PW_UNC_HET_TP].ci));
    json_object_set_new(entry, "x1_liquids_ci95",
                        json_pack("[o,o]", pw_json_pair(res->out[PW_UNC_HET_XI].ci),
                                  pw_json_pair(res->out[PW_UNC_HET_XII].ci)));
    json_t *j = three_phase_doc(res, isP);
    json_object_set_new(j, "present_probability", pw_json_num(res->p_feasible));
    json_object_set_new(j, "draws", draws_doc(res, "present", "split_lost"));
    json_object_set_new(j, "seed", json_integer((json_int_t)seed));
    json_object_set_new(entry, "uncertainty", j);
}

void pw_decanter_unc_doc(json_t *doc, const pw_unc_result *res, unsigned long seed)
{
    json_t *j = three_phase_doc(res, true);
    json_object_set_new(j, "boilup_min", json_pack("[o,o]",
                                                   pw_unc_output_doc(&res->out[PW_UNC_DEC_SA]),
                                                   pw_unc_output_doc(&res->out[PW_UNC_DEC_SB])));
    /* the decanter's own layers (a cooled decanter's; else x1_layers again) */
    json_object_set_new(j, "decanter_x1_layers",
                        json_pack("[o,o]", pw_unc_output_doc(&res->out[PW_UNC_DEC_TOP_LEAN]),
                                  pw_unc_output_doc(&res->out[PW_UNC_DEC_TOP_RICH])));
    json_object_set_new(j, "feasible_probability", pw_json_num(res->p_feasible));
    json_object_set_new(j, "draws", draws_doc(res, "feasible", "infeasible"));
    json_object_set_new(j, "seed", json_integer((json_int_t)seed));
    json_object_set_new(doc, "uncertainty", j);
    json_t *cols = json_object_get(doc, "columns");
    for (size_t i = 0; i < 2 && json_is_array(cols) && i < json_array_size(cols); i++)
        json_object_set_new(json_array_get(cols, i), "boilup_min_ci95",
                            pw_json_pair(res->out[PW_UNC_DEC_SA + i].ci));
}
