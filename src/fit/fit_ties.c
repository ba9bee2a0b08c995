/* fit --lle: the tie lines of an LLE file matched to the dataset's component order and, from
 * w1_I / w1_II columns, converted to mole fractions (moved from src/cli so that the command line
 * and the API share it). */
#include <pinchwise/composition.h>
#include <pinchwise/fit.h>
#include <pinchwise/lledata.h>

#include <stdlib.h>
#include <strings.h>

pw_status pw_fit_attach_tie_lines_ex(const pw_lle_dataset *lle, const pw_dataset *ds,
                                     const pw_component *c1, const pw_component *c2,
                                     pw_fit_options *fo, pw_tie_line **copy, pw_error *err)
{
    *copy = NULL;
    bool same = !strcasecmp(lle->names[0], ds->names[0]) && !strcasecmp(lle->names[1], ds->names[1]);
    bool rev = !strcasecmp(lle->names[0], ds->names[1]) && !strcasecmp(lle->names[1], ds->names[0]);
    if (!same && !rev)
        return pw_error_set(err, PW_EPARSE, lle->path, lle->components_line,
                            "components '%s, %s' differ from the dataset's '%s, %s' (%s; expected "
                            "tie lines of the same two components)",
                            lle->names[0], lle->names[1], ds->names[0], ds->names[1], ds->path);
    if (lle->mass && (!c1 || !c2))
        return pw_error_set(err, PW_EINVAL, lle->path, lle->header_line,
                            "the tie lines are mass fractions (w1_I, w1_II), which need the "
                            "components' molar masses (pw_fit_attach_tie_lines_ex)");
    fo->tie_lines = lle->rows;
    fo->n_tie_lines = lle->n;
    fo->sigma_x_lle = lle->sigma_x;
    if (same && !lle->mass)
        return PW_OK;
    *copy = malloc((lle->n ? lle->n : 1) * sizeof **copy);
    if (!*copy)
        return pw_error_set(err, PW_ENOMEM, lle->path, 0, "out of memory");
    /* the LLE file's own first component, for the molar masses */
    const pw_component *a = same ? c1 : c2, *b = same ? c2 : c1;
    for (size_t i = 0; i < lle->n; i++) {
        pw_tie_line t = lle->rows[i];
        if (lle->mass) { /* w -> x keeps the order of the layers */
            pw_error inner;
            pw_error_clear(&inner);
            pw_status st = pw_composition_to_mole(a, b, lle->rows[i].x_I, PW_BASIS_MASS, &t.x_I,
                                                  &inner);
            if (st == PW_OK)
                st = pw_composition_to_mole(a, b, lle->rows[i].x_II, PW_BASIS_MASS, &t.x_II,
                                            &inner);
            if (st != PW_OK) {
                free(*copy);
                *copy = NULL;
                return pw_error_set(err, st, lle->path, lle->header_line,
                                    "columns w1_I, w1_II hold mass fractions, which need both "
                                    "molar masses: %s",
                                    inner.msg);
            }
        }
        if (rev) {
            double xI = t.x_I;
            t.x_I = 1.0 - t.x_II;
            t.x_II = 1.0 - xI;
        }
        (*copy)[i] = t;
    }
    fo->tie_lines = *copy;
    return PW_OK;
}

pw_status pw_fit_attach_tie_lines(const pw_lle_dataset *lle, const pw_dataset *ds,
                                  pw_fit_options *fo, pw_tie_line **swapped, pw_error *err)
{
    return pw_fit_attach_tie_lines_ex(lle, ds, NULL, NULL, fo, swapped, err);
}
