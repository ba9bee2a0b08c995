/* The `azeotrope --json` document (moved from src/cli/cmd_azeotrope.c and
 * src/cli/analysis_common.c). */
#include <pinchwise/commands.h>

json_t *pw_azeotrope_entry_json(const pw_azeotrope *az)
{
    json_t *o = json_object();
    json_object_set_new(o, "x1", pw_json_num(az->x1));
    json_object_set_new(o, "T_K", pw_json_num(az->T_K));
    json_object_set_new(o, "P_kPa", pw_json_num(az->P_Pa / 1000.0));
    json_object_set_new(o, "kind", json_string(pw_az_kind_name(az->kind)));
    json_object_set_new(o, "gamma", json_pack("[o,o]", pw_json_num(az->gamma[0]),
                                              pw_json_num(az->gamma[1])));
    json_object_set_new(o, "slope_ln_alpha", pw_json_num(az->slope));
    json_object_set_new(o, "tangential", json_boolean(az->tangential));
    return o;
}

static json_t *result_json(const pw_az_result *r)
{
    json_t *list = json_array();
    for (size_t i = 0; i < r->n; i++)
        json_array_append_new(list, pw_azeotrope_entry_json(&r->az[i]));
    return list;
}

static json_t *touch_json(const pw_az_result *r)
{
    json_t *list = json_array();
    for (size_t i = 0; i < r->n_touch; i++)
        json_array_append_new(list, json_pack("{s:o,s:o,s:o,s:o}", "x1",
                                              pw_json_num(r->touch[i].x1), "ln_alpha",
                                              pw_json_num(r->touch[i].ln_alpha), "T_K",
                                              pw_json_num(r->touch[i].T_K), "P_kPa",
                                              pw_json_num(r->touch[i].P_Pa / 1000.0)));
    return list;
}

static json_t *scan_json(const pw_az_scan *sc)
{
    bool isP = sc->mode == PW_AZ_ISOBARIC;
    json_t *o = json_object(), *pts = json_array(), *bnd = json_array();
    json_object_set_new(o, "variable", json_string(isP ? "P_kPa" : "T_K"));
    for (size_t k = 0; k < sc->n_points; k++) {
        json_t *p = json_object();
        json_object_set_new(p, isP ? "P_kPa" : "T_K",
                            pw_json_num(isP ? sc->at[k] / 1000.0 : sc->at[k]));
        json_object_set_new(p, "azeotropes", result_json(&sc->points[k]));
        json_array_append_new(pts, p);
    }
    for (size_t k = 0; k < sc->n_boundaries; k++) {
        const pw_az_boundary *b = &sc->boundaries[k];
        json_array_append_new(
            bnd, json_pack("{s:o,s:i,s:o,s:o,s:s}", isP ? "P_kPa" : "T_K",
                           pw_json_num(isP ? b->at / 1000.0 : b->at), "end", b->end, "T_K_end",
                           pw_json_num(b->T_K), "P_kPa_end", pw_json_num(b->P_Pa / 1000.0),
                           "present", b->present_above ? "above" : "below"));
    }
    json_object_set_new(o, "points", pts);
    json_object_set_new(o, "boundaries", bnd);
    json_object_set_new(o, "x1_shift", pw_json_num(sc->x1_shift));
    return o;
}

json_t *pw_azeotrope_doc(const pw_system *sys, pw_az_mode mode, double fixed,
                         const pw_az_result *r, const pw_az_scan *sc)
{
    json_t *o = json_object();
    json_t *list = result_json(r);
    json_object_set_new(o, "azeotropes", list);
    json_object_set_new(o, "mode", json_string(mode == PW_AZ_ISOBARIC ? "isobaric"
                                                                        : "isothermal"));
    if (mode == PW_AZ_ISOBARIC)
        json_object_set_new(o, "P_kPa", pw_json_num(fixed / 1000.0));
    else
        json_object_set_new(o, "T_K", pw_json_num(fixed));
    json_object_set_new(o, "components", json_pack("[s,s]", sys->comp[0].name,
                                                   sys->comp[1].name));
    json_object_set_new(o, "model", json_string(sys->model->name));
    json_object_set_new(o, "near_tangential", touch_json(r));
    json_object_set_new(o, "ln_alpha_ends", json_pack("[o,o]", pw_json_num(r->ln_alpha_end[0]),
                                                      pw_json_num(r->ln_alpha_end[1])));
    json_object_set_new(o, "scan", sc ? scan_json(sc) : json_null());
    json_object_set_new(o, "caution", json_string(pw_caution_text()));
    return o;
}
