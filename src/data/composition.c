/* Mass fractions to mole fractions with the components' molar masses; see composition.h. */
#include <math.h>
#include <pinchwise/composition.h>
#include <stdio.h>

static pw_status molar_masses(const pw_component *c1, const pw_component *c2, double M[2],
                              pw_error *err)
{
    pw_status st = pw_component_require(c1, PW_PROP_M, &M[0], err);
    if (st == PW_OK)
        st = pw_component_require(c2, PW_PROP_M, &M[1], err);
    return st;
}

pw_status pw_composition_to_mole(const pw_component *c1, const pw_component *c2, double value,
                                 pw_basis b, double *x1, pw_error *err)
{
    if (!(value >= 0.0 && value <= 1.0))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "composition %g is outside [0, 1] (expected a fraction)", value);
    if (b == PW_BASIS_MOLE) {
        *x1 = value;
        return PW_OK;
    }
    double M[2];
    pw_status st = molar_masses(c1, c2, M, err);
    if (st != PW_OK)
        return st;
    *x1 = pw_units_mass_to_mole(value, M[0], M[1]);
    return PW_OK;
}

pw_status pw_composition_to_mass(const pw_component *c1, const pw_component *c2, double x1,
                                 double *w1, pw_error *err)
{
    double M[2];
    pw_status st = molar_masses(c1, c2, M, err);
    if (st != PW_OK)
        return st;
    *w1 = pw_units_mole_to_mass(x1, M[0], M[1]);
    return PW_OK;
}

pw_status pw_dataset_to_mole(pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                             pw_error *err)
{
    if (!ds->mass_x && !ds->mass_y)
        return PW_OK;
    double M[2];
    pw_error inner;
    pw_error_clear(&inner);
    if (molar_masses(c1, c2, M, &inner) != PW_OK)
        return pw_error_set(err, PW_ENOTFOUND, ds->path, ds->composition_line,
                            "column %s holds mass fractions, which need both molar masses: %s",
                            ds->mass_x ? "w1" : "wy1", inner.msg);
    for (size_t i = 0; i < ds->n; i++) {
        if (ds->mass_x)
            ds->pts[i].x1 = pw_units_mass_to_mole(ds->pts[i].x1, M[0], M[1]);
        if (ds->mass_y && isfinite(ds->pts[i].y1))
            ds->pts[i].y1 = pw_units_mass_to_mole(ds->pts[i].y1, M[0], M[1]);
    }
    ds->mass_x = ds->mass_y = false;
    return PW_OK;
}
