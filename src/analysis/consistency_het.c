/* Three-phase points taken out of the one-liquid consistency tests (include/pinchwise/hetcheck.h). */
#include <math.h>
#include <pinchwise/hetcheck.h>
#include <stdlib.h>
#include <string.h>

pw_status pw_het_check_run(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                           pw_dataset *one_liquid, pw_het_check *out)
{
    if (!ds || !c1 || !c2 || !one_liquid || !out)
        return PW_EINVAL;
    memset(out, 0, sizeof *out);
    *one_liquid = *ds;
    one_liquid->pts = NULL;
    one_liquid->n = 0;
    out->max_bound = NAN;
    out->bound_ok = true;
    size_t cap = ds->n ? ds->n : 1;
    bool *flags = calloc(cap, sizeof *flags);
    one_liquid->pts = malloc(cap * sizeof *one_liquid->pts);
    out->pts = malloc(cap * sizeof *out->pts);
    if (!flags || !one_liquid->pts || !out->pts) {
        free(flags);
        pw_het_check_free(out, one_liquid);
        return PW_ENOMEM;
    }
    double sT = ds->sigma_T_K;
    double sP = isfinite(ds->sigma_P_rel) ? ds->sigma_P_rel
                : (isfinite(ds->sigma_P_abs_Pa) && ds->n ? ds->sigma_P_abs_Pa / ds->pts[0].P_Pa
                                                          : (double)NAN);
    pw_three_phase_detect(ds->pts, ds->n, ds->kind == PW_DATA_ISOBARIC, ds->has_y, sT, sP,
                          ds->sigma_y, flags);
    const pw_component *c[2] = {c1, c2};
    for (size_t i = 0; i < ds->n; i++) {
        const pw_point *p = &ds->pts[i];
        if (!flags[i]) {
            one_liquid->pts[one_liquid->n++] = *p;
            continue;
        }
        pw_het_point *h = &out->pts[out->n++];
        h->line = p->line;
        h->x1 = p->x1;
        h->y1 = p->y1;
        h->T_K = p->T_K;
        h->P_Pa = p->P_Pa;
        double y[2] = {p->y1, 1.0 - p->y1};
        for (int k = 0; k < 2; k++) {
            double Ps;
            h->bound[k] = pw_psat(c[k], p->T_K, &Ps, NULL) == PW_OK ? y[k] * p->P_Pa / Ps : (double)NAN;
            if (isfinite(h->bound[k])) {
                out->max_bound = isfinite(out->max_bound) ? fmax(out->max_bound, h->bound[k])
                                                          : h->bound[k];
                if (h->bound[k] > 1.005)
                    out->bound_ok = false;
            }
        }
    }
    free(flags);
    return PW_OK;
}

void pw_het_check_free(pw_het_check *out, pw_dataset *one_liquid)
{
    if (out) {
        free(out->pts);
        out->pts = NULL;
        out->n = 0;
    }
    if (one_liquid) {
        free(one_liquid->pts);
        one_liquid->pts = NULL;
        one_liquid->n = 0;
    }
}

pw_status pw_check_data(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                        const pw_consistency_options *o, pw_het_check *het,
                        pw_consistency_result *r, pw_error *err)
{
    memset(het, 0, sizeof *het);
    memset(r, 0, sizeof *r);
    pw_dataset one;
    memset(&one, 0, sizeof one);
    if (pw_het_check_run(ds, c1, c2, &one, het) != PW_OK)
        return pw_error_set(err, PW_ENOMEM, ds->path, 0, "out of memory");
    pw_consistency_options use = o ? *o : pw_consistency_default_options();
    if (het->n) { /* the area tests bridge the gap the three-phase points span */
        use.gap_x1[0] = use.gap_x1[1] = het->pts[0].x1;
        use.gap_T_K[0] = use.gap_T_K[1] = het->pts[0].T_K;
        for (size_t i = 1; i < het->n; i++) {
            use.gap_x1[0] = fmin(use.gap_x1[0], het->pts[i].x1);
            use.gap_x1[1] = fmax(use.gap_x1[1], het->pts[i].x1);
            use.gap_T_K[0] = fmin(use.gap_T_K[0], het->pts[i].T_K);
            use.gap_T_K[1] = fmax(use.gap_T_K[1], het->pts[i].T_K);
        }
    }
    pw_status st = pw_consistency_run(het->n ? &one : ds, c1, c2, &use, r, err);
    pw_het_check_free(NULL, &one);
    if (st != PW_OK)
        pw_het_check_free(het, NULL);
    return st;
}
