/* The lle command's computation and its `--json` document (moved from src/cli/cmd_lle.c). */
#include <math.h>
#include <pinchwise/commands.h>
#include <stdio.h>
#include <stdlib.h>

pw_status pw_lle_run(const pw_system *sys, double T_K, const char *where, pw_lle_result *r,
                     pw_error *err)
{
    pw_status st = pw_lle_solve(sys, T_K, r);
    if (st == PW_ERANGE && isfinite(r->x[0]) && isfinite(r->x2[1])) {
        /* the refused pair, each layer as x1 or, near pure component 1, as 1 - x2 */
        char l[2][48];
        for (int i = 0; i < 2; i++) {
            if (r->x2[i] < 1e-4)
                snprintf(l[i], sizeof l[i], "1 - %.3g", r->x2[i]);
            else
                snprintf(l[i], sizeof l[i], "%.6g", r->x[i]);
        }
        pw_error_set(err, st, where, 0,
                     "liquid-liquid solve at %.3f K refused: %s (the layers are x1 = %s and "
                     "x1 = %s; a layer within %.0e of a pure component is beyond what the "
                     "solver resolves: practically immiscible)",
                     T_K, pw_strerror(st), l[0], l[1], PW_LLE_X_MIN);
    } else if (st != PW_OK) {
        pw_error_set(err, st, where, 0, "liquid-liquid solve at %.3f K failed: %s%s", T_K,
                     pw_strerror(st),
                     st == PW_ERANGE ? " (a layer is within 1e-12 of a pure component: "
                                       "practically immiscible)"
                                     : "");
    }
    return st;
}

pw_status pw_lle_scan_run(const pw_system *sys, double T_from_K, double T_to_K, size_t n,
                          const char *where, pw_lle_scan_point *pts, pw_lle_critical *crit,
                          size_t *n_crit, pw_error *err)
{
    pw_status st = pw_lle_scan(sys, T_from_K, T_to_K, n, pts, crit, n_crit);
    if (st != PW_OK)
        pw_error_set(err, st, where, 0, "binodal scan failed: %s", pw_strerror(st));
    return st;
}

static json_t *pair_json(bool split, const double *x)
{
    return split ? json_pack("[o,o]", pw_json_num(x[0]), pw_json_num(x[1])) : json_null();
}

json_t *pw_lle_doc(const pw_system *s, double T_K, const pw_lle_result *r,
                   const pw_lle_scan_point *pts, size_t n_pts, const pw_lle_critical *crit,
                   size_t n_crit)
{
    bool can = pw_model_can_split(s->model);
    json_t *o = json_object();
    json_object_set_new(o, "split", json_boolean(r->split));
    json_object_set_new(o, "x1", pair_json(r->split, r->x));
    json_object_set_new(o, "T_K", pw_json_num(T_K));
    json_object_set_new(o, "components", json_pack("[s,s]", s->comp[0].name, s->comp[1].name));
    json_object_set_new(o, "model", json_string(s->model->name));
    json_object_set_new(o, "model_can_split", json_boolean(can));
    json_object_set_new(o, "activities",
                        r->split ? json_pack("[o,o]", pw_json_num(r->a[0]), pw_json_num(r->a[1]))
                                 : json_null());
    json_object_set_new(o, "min_tangent_plane_distance", pw_json_num(r->min_tpd));
    json_object_set_new(o, "min_d2G_dx2", pw_json_num(r->min_D));
    if (r->n_pairs > 1) {
        json_t *more = json_array();
        for (size_t p = 0; p < r->n_pairs; p++)
            json_array_append_new(more, pair_json(true, r->pairs[p]));
        json_object_set_new(o, "all_splits", more);
    }
    if (pts) {
        json_t *sc = json_array(), *cr = json_array();
        for (size_t k = 0; k < n_pts; k++) {
            json_t *pt = json_pack("{s:o,s:b,s:o}", "T_K", pw_json_num(pts[k].T_K), "split",
                                   pts[k].split, "x1",
                                   pair_json(pts[k].split && isfinite(pts[k].x[0])
                                                 && isfinite(pts[k].x[1]),
                                             pts[k].x));
            if (pt && pts[k].beyond_floor) /* a layer within 1e-12 of a pure component */
                json_object_set_new(pt, "beyond_floor", json_true());
            json_array_append_new(sc, pt);
        }
        for (size_t k = 0; k < n_crit; k++)
            json_array_append_new(cr, json_pack("{s:o,s:o,s:s}", "T_K", pw_json_num(crit[k].T_K),
                                                "x1", pw_json_num(crit[k].x1), "kind",
                                                crit[k].upper ? "upper" : "lower"));
        json_object_set_new(o, "scan", sc);
        json_object_set_new(o, "critical", cr);
    }
    return o;
}
