/* fit --lle: the tie lines of an LLE file matched to the dataset's component order (moved from
 * src/cli so that the command line and the API share it). */
#include <pinchwise/fit.h>
#include <pinchwise/lledata.h>

#include <stdlib.h>
#include <strings.h>

pw_status pw_fit_attach_tie_lines(const pw_lle_dataset *lle, const pw_dataset *ds,
                                  pw_fit_options *fo, pw_tie_line **swapped, pw_error *err)
{
    *swapped = NULL;
    bool same = !strcasecmp(lle->names[0], ds->names[0]) && !strcasecmp(lle->names[1], ds->names[1]);
    bool rev = !strcasecmp(lle->names[0], ds->names[1]) && !strcasecmp(lle->names[1], ds->names[0]);
    if (!same && !rev)
        return pw_error_set(err, PW_EPARSE, lle->path, lle->components_line,
                            "components '%s, %s' differ from the dataset's '%s, %s' (%s; expected "
                            "tie lines of the same two components)",
                            lle->names[0], lle->names[1], ds->names[0], ds->names[1], ds->path);
    fo->tie_lines = lle->rows;
    fo->n_tie_lines = lle->n;
    fo->sigma_x_lle = lle->sigma_x;
    if (same)
        return PW_OK;
    *swapped = malloc(lle->n * sizeof **swapped);
    if (!*swapped)
        return pw_error_set(err, PW_ENOMEM, lle->path, 0, "out of memory");
    for (size_t i = 0; i < lle->n; i++) {
        (*swapped)[i] = lle->rows[i];
        (*swapped)[i].x_I = 1.0 - lle->rows[i].x_II;
        (*swapped)[i].x_II = 1.0 - lle->rows[i].x_I;
    }
    fo->tie_lines = *swapped;
    return PW_OK;
}
