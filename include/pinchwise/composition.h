/* Compositions by mass: converting mass fractions of component 1 to mole fractions with both
 * components' molar masses (the component file's optional column M_g_mol).
 *
 *     x1 = (w1 / M1) / (w1 / M1 + (1 - w1) / M2)
 *
 * The library works in mole fractions throughout; mass fractions are converted where they enter
 * (the dataset's w1 and wy1 columns, command-line targets written with "wt" or "wt%"). A component
 * without a molar mass is refused with a message naming it and the column to add. */
#ifndef PINCHWISE_COMPOSITION_H
#define PINCHWISE_COMPOSITION_H

#include <pinchwise/component.h>
#include <pinchwise/dataset.h>
#include <pinchwise/units.h>

#ifdef __cplusplus
extern "C" {
#endif

/* value on basis b (a fraction of component 1 in [0, 1]) as a mole fraction of component 1.
 * PW_OK at once for PW_BASIS_MOLE; for PW_BASIS_MASS both molar masses are required
 * (PW_ENOTFOUND naming the component and M_g_mol otherwise). */
pw_status pw_composition_to_mole(const pw_component *c1, const pw_component *c2, double value,
                                 pw_basis b, double *x1, pw_error *err);

/* The mole fraction x1 as a mass fraction of component 1 (for display). PW_ENOTFOUND as above. */
pw_status pw_composition_to_mass(const pw_component *c1, const pw_component *c2, double x1,
                                 double *w1, pw_error *err);

/* Converts the mass-fraction columns of a dataset read from w1 / wy1 (ds->mass_x, ds->mass_y) to
 * mole fractions in place and clears the flags; does nothing for a dataset in mole fractions.
 * On failure (a molar mass unknown) ds is unchanged and err names the file, the header line, the
 * column and the component. */
pw_status pw_dataset_to_mole(pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                             pw_error *err);

#ifdef __cplusplus
}
#endif
#endif
