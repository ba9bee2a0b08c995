/* The `screen --json` document (moved from src/cli/cmd_screen.c). */
#include <pinchwise/commands.h>

json_t *pw_screen_doc(const pw_system *sys, const pw_screen_result *r, const pw_screen_options *o)
{
    json_t *j = json_object(), *reasons = json_array();
    json_object_set_new(j, "verdict", json_string(pw_verdict_name(r->verdict)));
    for (size_t i = 0; i < r->n_reasons; i++)
        json_array_append_new(reasons, json_pack("{s:s,s:o}", "key",
                                                 pw_screen_reason_key(r->reasons[i].code), "text",
                                                 pw_json_reason(r->reasons[i].text)));
    json_object_set_new(j, "reasons", reasons);
    json_object_set_new(
        j, "thresholds",
        json_pack("{s:{s:o,s:s},s:{s:[o,o],s:s}}", "alpha_difficult", "value",
                  pw_json_num(o->alpha_difficult), "origin", "common practice",
                  "azeotrope_shift_for_pressure_swing", "value", pw_json_num(o->shift_low),
                  pw_json_num(o->shift_high), "origin",
                  "rule of thumb (common practice), see docs/screen.md"));
    json_object_set_new(j, "components", json_pack("[s,s]", sys->comp[0].name,
                                                   sys->comp[1].name));
    json_object_set_new(j, "P_kPa", pw_json_num(r->P_Pa / 1000.0));
    json_object_set_new(j, "xd", pw_json_num(r->xd));
    json_object_set_new(j, "xb", pw_json_num(r->xb));
    json_object_set_new(j, "zf", pw_json_num(r->zf));
    json_object_set_new(j, "zf_default", json_boolean(r->zf_default));
    json_object_set_new(j, "q", pw_json_num(o->q));
    json_object_set_new(j, "alpha_min", pw_json_num(r->alpha_min));
    json_object_set_new(j, "x_alpha_min", pw_json_num(r->x_alpha_min));
    json_object_set_new(j, "alpha_top", pw_json_num(r->alpha_top));
    json_object_set_new(j, "alpha_bottom", pw_json_num(r->alpha_bottom));
    json_object_set_new(j, "alpha_points_in_layers",
                        json_integer((json_int_t)r->alpha_points_in_layers));
    json_object_set_new(j, "azeotropes", pw_azeotrope_list_json(&r->az, &r->het));
    json_object_set_new(j, "barrier_x1", pw_json_num(r->x_barrier));
    json_object_set_new(
        j, "pressure_shift",
        r->scanned ? json_pack("{s:o,s:o,s:o,s:o,s:o,s:o}", "P_lo_kPa",
                               pw_json_num(r->P_lo_Pa / 1000.0), "P_hi_kPa",
                               pw_json_num(r->P_hi_Pa / 1000.0), "x1_at_lo",
                               pw_json_num(r->x_az_lo), "x1_at_hi", pw_json_num(r->x_az_hi),
                               "shift", pw_json_num(r->shift), "vanishes_at_kPa",
                               pw_json_num(r->P_vanish_Pa / 1000.0))
                   : json_null());
    bool col = r->column_ran && r->column.feasible;
    json_object_set_new(j, "r_min", col ? pw_json_num(r->column.r_min) : json_null());
    json_object_set_new(j, "pinch_kind", col ? json_string(r->column.pinch.kind == PW_PINCH_FEED
                                                               ? "feed"
                                                               : "tangent")
                                             : json_null());
    json_object_set_new(j, "n_min", col ? pw_json_num(r->column.n_min) : json_null());
    json_object_set_new(j, "r_min_underwood_mean_alpha", pw_json_num(r->r_min_underwood));
    json_object_set_new(j, "n_fenske_mean_alpha", pw_json_num(r->n_fenske));
    json_object_set_new(j, "caution", json_string(pw_caution_text()));
    return j;
}
