/* The measured data set again from a fit result (include/pinchwise/fit.h), so that what reads a
 * fit file can run the consistency tests exactly as `check` runs them on the data file. */
#include <pinchwise/fit.h>

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

pw_status pw_fit_dataset(const pw_fit_result *r, pw_dataset *ds)
{
    if (!r || !ds)
        return PW_EINVAL;
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "%s", r->dataset_path[0] ? r->dataset_path : "(fit file)");
    snprintf(ds->names[0], sizeof ds->names[0], "%s", r->sys.comp[0].name);
    snprintf(ds->names[1], sizeof ds->names[1], "%s", r->sys.comp[1].name);
    ds->kind = r->kind;
    ds->P_fixed_Pa = r->P_fixed_Pa;
    ds->T_fixed_K = r->T_fixed_K;
    ds->has_y = r->has_y;
    snprintf(ds->source, sizeof ds->source, "%s", r->source);
    if (r->data_sigma_known) {
        ds->sigma_T_K = r->data_sigma_T_K;
        ds->sigma_P_rel = r->data_sigma_P_rel;
        ds->sigma_P_abs_Pa = r->data_sigma_P_abs_Pa;
        ds->sigma_y = r->data_sigma_y;
        ds->sigma_x = r->data_sigma_x;
        ds->sigma_y_stated = r->data_sigma_y_stated;
        ds->sigma_x_stated = r->data_sigma_x_stated;
    } else { /* an older fit file: the weights, nothing stated, the reader's sigma_x default */
        ds->sigma_T_K = r->sigma_T_K;
        ds->sigma_P_rel = r->sigma_P_rel;
        ds->sigma_P_abs_Pa = (double)NAN;
        ds->sigma_y = r->sigma_y;
        ds->sigma_x = 0.001;
    }
    snprintf(ds->T_unit, sizeof ds->T_unit, "K");
    snprintf(ds->P_unit, sizeof ds->P_unit, "Pa");
    ds->pts = malloc((r->n_pts ? r->n_pts : 1) * sizeof *ds->pts);
    if (!ds->pts)
        return PW_ENOMEM;
    for (size_t i = 0; i < r->n_pts; i++)
        ds->pts[i] = r->pts[i].meas;
    ds->n = r->n_pts;
    return PW_OK;
}
