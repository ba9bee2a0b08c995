/* Outlier diagnostics on the point-test residuals. For each residual series (dy,
 * d ln(gamma1/gamma2), and the Barker residual dT or dP/P) the median m and the robust
 * standard deviation s = 1.4826 MAD are computed; a point is flagged when |r - m| > k s with
 * k = 3 by default. s is bounded below by a floor per series (options), so that noise-free
 * data do not flag rounding noise. */
#include "consistency_internal.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

typedef struct series {
    const char *label;
    size_t offset; /* of the double in pw_cpoint */
    double floor;
} series;

void pw_cs_outliers(const cs_data *d, pw_consistency_result *r)
{
    const pw_consistency_options *o = d->opt;
    r->n_flagged = 0;
    if (r->n_pts == 0 || !r->tests[PW_CTEST_POINT].ran)
        return;
    bool iso_T = d->ds->kind == PW_DATA_ISOTHERMAL;
    const series all[3] = {
        {"dy", offsetof(pw_cpoint, dy), o->outlier_floor_y},
        {"d ln(gamma1/gamma2)", offsetof(pw_cpoint, dlnratio), o->outlier_floor_lnratio},
        iso_T ? (series){"dP/P (Barker fit)", offsetof(pw_cpoint, dP_rel), o->outlier_floor_P_rel}
              : (series){"dT [K] (Barker fit)", offsetof(pw_cpoint, dT_K), o->outlier_floor_T_K},
    };
    double *v = malloc(r->n_pts * sizeof *v);
    if (!v)
        return;
    for (int s = 0; s < 3; s++) {
        for (size_t i = 0; i < r->n_pts; i++)
            memcpy(&v[i], (const char *)&r->pts[i] + all[s].offset, sizeof(double));
        double med, sd;
        pw_cs_robust(v, r->n_pts, &med, &sd);
        if (!isfinite(med))
            continue;
        sd = fmax(sd, all[s].floor);
        for (size_t i = 0; i < r->n_pts; i++) {
            if (!isfinite(v[i]) || fabs(v[i] - med) <= o->outlier_k * sd)
                continue;
            pw_cpoint *p = &r->pts[i];
            size_t len = strlen(p->why);
            snprintf(p->why + len, sizeof p->why - len, "%s%s = %+.3g is %.1f robust SD from the "
                     "median %.3g (limit %g)", len ? "; " : "", all[s].label, v[i],
                     fabs(v[i] - med) / sd, med, o->outlier_k);
            p->flagged = true;
        }
    }
    free(v);
    for (size_t i = 0; i < r->n_pts; i++)
        r->n_flagged += r->pts[i].flagged;
}
