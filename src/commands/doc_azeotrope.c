/* The `azeotrope --json` document (moved from src/cli/cmd_azeotrope.c and
 * src/cli/analysis_common.c). */
#include <pinchwise/commands.h>
#include <pinchwise/lle.h>
#include <string.h>

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

/* The azeotropes of r (homogeneous), then the heterogeneous one of tp (the three-phase line with
 * the vapor between the layers) when there is one: x1 is then the vapor's composition, T_K and
 * P_kPa the three-phase condition, x1_liquids the layers. */
json_t *pw_azeotrope_list_json(const pw_az_result *r, const pw_three_phase *tp)
{
    json_t *list = json_array();
    for (size_t i = 0; i < r->n; i++) {
        json_t *e = pw_azeotrope_entry_json(&r->az[i]);
        json_object_set_new(e, "heterogeneous", json_false());
        json_array_append_new(list, e);
    }
    if (tp && tp->exists && tp->heterogeneous_azeotrope)
        json_array_append_new(
            list, json_pack("{s:o,s:o,s:o,s:s,s:b,s:[o,o]}", "x1", pw_json_num(tp->y1), "T_K",
                            pw_json_num(tp->T_K), "P_kPa", pw_json_num(tp->P_Pa / 1000.0),
                            "kind", "minimum-boiling", "heterogeneous", 1, "x1_liquids",
                            pw_json_num(tp->x[0]), pw_json_num(tp->x[1])));
    return list;
}

static json_t *three_phase_json(const pw_three_phase *tp)
{
    if (!tp || !tp->exists)
        return json_null();
    return json_pack("{s:o,s:o,s:[o,o],s:o,s:b}", "T_K", pw_json_num(tp->T_K), "P_kPa",
                     pw_json_num(tp->P_Pa / 1000.0), "x1_liquids", pw_json_num(tp->x[0]),
                     pw_json_num(tp->x[1]), "y1", pw_json_num(tp->y1),
                     "heterogeneous_azeotrope", tp->heterogeneous_azeotrope);
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

static json_t *scan_json(const pw_az_scan *sc, const pw_three_phase *tps)
{
    bool isP = sc->mode == PW_AZ_ISOBARIC;
    json_t *o = json_object(), *pts = json_array(), *bnd = json_array();
    json_object_set_new(o, "variable", json_string(isP ? "P_kPa" : "T_K"));
    for (size_t k = 0; k < sc->n_points; k++) {
        json_t *p = json_object();
        json_object_set_new(p, isP ? "P_kPa" : "T_K",
                            pw_json_num(isP ? sc->at[k] / 1000.0 : sc->at[k]));
        json_object_set_new(p, "azeotropes", pw_azeotrope_list_json(&sc->points[k], tps ? &tps[k] : NULL));
        json_array_append_new(pts, p);
    }
    json_t *het = json_array();
    const double scale = isP ? 1e-3 : 1.0;
    for (size_t k = 0; k < sc->n_boundaries; k++) {
        const pw_az_boundary *b = &sc->boundaries[k];
        if (b->kind == PW_AZ_BOUNDARY_PURE_END) {
            json_array_append_new(
                bnd, json_pack("{s:o,s:i,s:o,s:o,s:s}", isP ? "P_kPa" : "T_K",
                               pw_json_num(b->at * scale), "end", b->end, "T_K_end",
                               pw_json_num(b->T_K), "P_kPa_end", pw_json_num(b->P_Pa / 1000.0),
                               "present", b->present_above ? "above" : "below"));
            continue;
        }
        const char *kind = b->kind == PW_AZ_BOUNDARY_VAPOR_AT_LAYER ? "vapor-at-layer"
                           : b->kind == PW_AZ_BOUNDARY_LINE_ENDS    ? "three-phase-line-ends"
                           : b->kind == PW_AZ_BOUNDARY_LINE_JUMPS   ? "three-phase-line-jumps"
                                                                    : "not-located";
        json_array_append_new(
            het, json_pack("{s:o,s:s,s:[o,o],s:o,s:o,s:o,s:[o,o],s:o,s:s}",
                           isP ? "P_kPa" : "T_K", pw_json_num(b->at * scale), "kind", kind,
                           "bracket", pw_json_num(b->bracket[0] * scale),
                           pw_json_num(b->bracket[1] * scale), "layer",
                           b->layer >= 0 ? json_integer(b->layer) : json_null(), "T_K_3",
                           pw_json_num(b->T_K), "P_kPa_3", pw_json_num(b->P_Pa / 1000.0),
                           "x1_liquids", pw_json_num(b->x_layers[0]),
                           pw_json_num(b->x_layers[1]), "y1", pw_json_num(b->y3),
                           "heterogeneous", b->present_above ? "above" : "below"));
        json_object_set_new(json_array_get(het, json_array_size(het) - 1), "error",
                            b->status == PW_OK ? json_null() : json_string(pw_strerror(b->status)));
    }
    json_object_set_new(o, "points", pts);
    json_object_set_new(o, "boundaries", bnd);
    json_object_set_new(o, "heterogeneous_boundaries", het);
    json_object_set_new(o, "x1_shift", pw_json_num(sc->x1_shift));
    return o;
}

json_t *pw_azeotrope_doc(const pw_system *sys, pw_az_mode mode, double fixed,
                         const pw_az_result *r, const pw_az_scan *sc, const pw_three_phase *tp,
                         const pw_three_phase *tps)
{
    json_t *o = json_object();
    json_t *list = pw_azeotrope_list_json(r, tp);
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
    json_object_set_new(o, "scan", sc ? scan_json(sc, tps) : json_null());
    json_object_set_new(o, "three_phase", three_phase_json(tp));
    json_object_set_new(o, "caution", json_string(pw_caution_text()));
    return o;
}

pw_status pw_azeotrope_solve(const pw_system *sys, pw_az_mode mode, double fixed,
                             const char *where, pw_az_result *r, pw_three_phase *tp,
                             size_t *n_removed, pw_error *err)
{
    bool het_failed = false;
    pw_status st = pw_azeotrope_search(sys, (int)mode, fixed, r, tp, n_removed, &het_failed);
    if (st == PW_ERANGE && !het_failed) /* a bubble point without a vapor pressure */
        return pw_error_set(err, st, where, 0,
                            "azeotrope search failed near x1 = %.4g: no bubble point there at "
                            "%s %.6g %s: it would lie outside the range of water's IAPWS-IF97 "
                            "vapor pressure (273.15 to 647.096 K, the critical point), the one "
                            "vapor-pressure equation that is not extrapolated; this condition "
                            "is too far from the data",
                            r->fail_x1, mode == PW_AZ_ISOBARIC ? "P =" : "T =",
                            mode == PW_AZ_ISOBARIC ? fixed / 1000.0 : fixed,
                            mode == PW_AZ_ISOBARIC ? "kPa" : "K");
    if (st != PW_OK && !het_failed)
        return pw_error_set(err, st, where, 0, "azeotrope search failed near x1 = %.4g: %s",
                            r->fail_x1, pw_strerror(st));
    if (st != PW_OK)
        return pw_error_set(err, st, where, 0,
                            "three-phase (two liquids and vapor) search failed: %s",
                            pw_strerror(st));
    return PW_OK;
}

json_t *pw_rank_az_json(const pw_rank_az *az, size_t n, bool ok)
{
    if (!ok)
        return json_null();
    json_t *arr = json_array();
    for (size_t i = 0; i < n; i++)
        json_array_append_new(arr, json_pack("{s:o,s:o,s:o,s:s,s:b}", "x1", pw_json_num(az[i].x1),
                                             "T_K", pw_json_num(az[i].T_K), "P_kPa",
                                             pw_json_num(az[i].P_Pa / 1000.0), "kind",
                                             pw_az_kind_name(az[i].kind), "heterogeneous",
                                             az[i].heterogeneous));
    return arr;
}
