/* Replacing the components of a fit (commands that read a fit file with a component file
 * beside it) and recomputing everything derived from them, in one call: nothing that depends on
 * the vapor pressures or the component constants is left from the old components. */
#include "fit_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

/* Equal to within rounding of a value written to a fit file and read back (17 significant
 * digits round-trip exactly; a relative 1e-12 also covers values written by older versions
 * with fewer digits of a ratio). */
static bool same_value(double a, double b)
{
    return a == b || fabs(a - b) <= 1e-12 * fmax(fabs(a), fabs(b));
}

static bool same_psat(const pw_component *a, const pw_component *b)
{
    return a->equation == b->equation && a->A == b->A && a->B == b->B && a->C == b->C &&
           a->log == b->log && !strcmp(a->P_unit, b->P_unit) && !strcmp(a->T_unit, b->T_unit);
}

pw_status fit_swap_components(pw_fit_result *r, const pw_complib *lib, bool changed[2])
{
    if (changed)
        changed[0] = changed[1] = false;
    const pw_model_type *m = r->sys.model;
    pw_component next[2] = {r->sys.comp[0], r->sys.comp[1]};
    bool any = false;
    for (int i = 0; i < 2; i++) {
        const pw_component *c = pw_complib_find(lib, r->sys.comp[i].name);
        if (!c)
            continue;
        next[i] = *c;
        /* keep the fit's spelling of the name (the file may list it as an alias) */
        snprintf(next[i].name, sizeof next[i].name, "%s", r->sys.comp[i].name);
        if (changed)
            changed[i] = !same_psat(&r->sys.comp[i], c);
        any = true;
    }
    if (!any)
        return PW_OK;
    /* Fixed parameters taken from component data: a fixed parameter that equals what the old
     * components give came from them and is taken from the new ones, as a fit with the new
     * components would take it; one set otherwise (an explicit Wilson volume ratio) is kept.
     * When the new components lack the data the model needs (UNIQUAC without r, q), the fit
     * file's values are kept. */
    if (m && m->from_components) {
        double was[PW_MAX_PARAMS], now[PW_MAX_PARAMS];
        memcpy(was, r->sys.params, sizeof was);
        memcpy(now, r->sys.params, sizeof now);
        bool old_ok = m->from_components(&r->sys.comp[0], &r->sys.comp[1], was, NULL) == PW_OK;
        /* the fixed parameters from what the new rows state; a constant a row leaves blank (a
         * file of vapor pressures only) is taken as the fit file's, not as unknown, so that
         * such a row does not turn a Wilson volume ratio into 1 */
        pw_component basis[2] = {next[0], next[1]};
        for (int i = 0; i < 2; i++) {
            if (!isfinite(basis[i].V_L_cm3mol))
                basis[i].V_L_cm3mol = r->sys.comp[i].V_L_cm3mol;
            for (size_t k = 0; k < PW_PROP_COUNT; k++)
                if (!isfinite(basis[i].prop[k]))
                    basis[i].prop[k] = r->sys.comp[i].prop[k];
        }
        bool new_ok = m->from_components(&basis[0], &basis[1], now, NULL) == PW_OK;
        for (size_t k = 0; old_ok && new_ok && k < m->n_params; k++)
            if (!r->fitted[k] && same_value(was[k], r->sys.params[k]))
                r->sys.params[k] = now[k];
        /* the minima the multistart found carry the same fixed values */
        for (size_t j = 0; old_ok && new_ok && j < r->n_minima; j++)
            for (size_t k = 0; k < m->n_params; k++)
                if (!r->fitted[k] && same_value(was[k], r->minima[j].params[k]))
                    r->minima[j].params[k] = now[k];
    }
    r->sys.comp[0] = next[0];
    r->sys.comp[1] = next[1];
    return PW_OK;
}

static pw_status derive(pw_fit_result *r, const char *name, bool read, pw_error *err)
{
    /* chi2 is the fit's own record (of the objective at the fit): kept */
    double chi2 = r->chi2;
    bool reused;
    pw_status st = read ? fit_evaluate_reusing_screen(r, &reused) : pw_fit_evaluate(r);
    r->chi2 = chi2;
    /* a point whose bubble point fails is NAN in the tables, not a failure of the whole fit */
    if (st != PW_OK && st != PW_ENOBRACKET && st != PW_EMAXITER && st != PW_ENOCONV)
        return pw_error_set(err, st, name, 0, "the fitted model cannot be evaluated: %s",
                            pw_strerror(st));
    return PW_OK;
}

pw_status fit_derive(pw_fit_result *r, const char *name, pw_error *err)
{
    return derive(r, name, false, err);
}

pw_status fit_derive_read(pw_fit_result *r, const char *name, pw_error *err)
{
    return derive(r, name, true, err);
}

pw_status pw_fit_replace_components(pw_fit_result *r, const char *path, bool changed[2],
                                    pw_error *err)
{
    if (changed)
        changed[0] = changed[1] = false;
    if (!r || !r->sys.model)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "no fit to replace components in");
    if (!path)
        return PW_OK;
    pw_complib lib;
    pw_complib_init(&lib);
    pw_status st = pw_complib_read(&lib, path, err);
    if (st == PW_OK)
        st = fit_swap_components(r, &lib, changed);
    pw_complib_free(&lib);
    if (st == PW_OK)
        st = fit_derive(r, path, err);
    return st;
}
