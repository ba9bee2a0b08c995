/* Command-line units and compositions; see cli_units.h. */
#include "cli_units.h"

#include "cli.h"

#include <math.h>
#include <pinchwise/composition.h>
#include <pinchwise/fit_minimum.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

pw_status cli_uncertainty_opt(const char *opt, const char *text, double *T_K, double *P_rel,
                                 double *P_abs_Pa, pw_error *err)
{
    pw_status st;
    pw_error inner;
    pw_error_clear(&inner);
    if (!strcmp(opt, "--sigma-T")) {
        st = pw_units_parse_temperature_difference(text, T_K, &inner);
    } else {
        double v, r = NAN, a = NAN;
        char unit[8];
        if (pw_units_split(text, &v, unit, sizeof unit) == PW_SPLIT_NO_UNIT && v > 0.0) {
            r = v / 100.0; /* a bare number: percent, as the option always read it */
            st = PW_OK;
        } else {
            st = pw_units_parse_pressure_uncertainty(text, &r, &a, &inner);
        }
        if (st == PW_OK)
            *P_rel = r, *P_abs_Pa = a;
    }
    if (st != PW_OK)
        return pw_error_set(err, st, NULL, 0, "%s %s: %s", opt, text, inner.msg);
    return PW_OK;
}

pw_status cli_composition(const char *opt, const char *text, double *value, pw_basis *b, pw_error *err)
{
    pw_error inner;
    pw_error_clear(&inner);
    if (pw_units_parse_composition(text, value, b, &inner) != PW_OK) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: %s", opt, text, inner.msg);
        return PW_EINVAL;
    }
    return PW_OK;
}

pw_status cli_composition_to_mole(const char *opt, double *x, pw_basis b, const pw_system *sys,
                                     pw_error *err)
{
    if (b == PW_BASIS_MOLE)
        return PW_OK;
    pw_error inner;
    pw_error_clear(&inner);
    pw_status st = pw_composition_to_mole(&sys->comp[0], &sys->comp[1], *x, b, x, &inner);
    if (st != PW_OK)
        return pw_error_set(err, st, NULL, 0, "%s by mass needs both molar masses: %s", opt,
                            inner.msg);
    return PW_OK;
}

pw_status cli_targets_to_mole(double *xd, double *xb, double *zf, const pw_basis basis[3],
                                 const pw_system *sys, pw_error *err)
{
    static const char *const opts[3] = {"--xd", "--xb", "--zf"};
    double *x[3] = {xd, xb, zf};
    for (int i = 0; i < 3; i++) {
        if (!x[i] || isnan(*x[i]))
            continue;
        pw_status st = cli_composition_to_mole(opts[i], x[i], basis[i], sys, err);
        if (st != PW_OK)
            return st;
    }
    return PW_OK;
}

pw_status cli_apply_minimum(const char *cmd, const char *fit_path, pw_fit_result *fit,
                            const char *text, size_t *chosen, pw_error *err)
{
    *chosen = 0;
    if (!text)
        return PW_OK;
    double n;
    if (cli_number("--minimum", text, &n, err) != PW_OK)
        return PW_EINVAL;
    if (!(n >= 1.0 && n <= 1000.0) || n != floor(n))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "--minimum %s: expected a whole number from 1 (the lowest chi-square)",
                            text);
    bool was = false;
    size_t k = (size_t)n;
    if (k <= fit->n_minima)
        was = !memcmp(fit->minima[k - 1].params, fit->sys.params, sizeof fit->sys.params);
    pw_status st = pw_fit_use_minimum(fit, k, err);
    if (st == PW_EINVAL && err && fit_path) /* a minimum the file does not record */
        snprintf(err->file, sizeof err->file, "%s", fit_path);
    if (st != PW_OK)
        return st;
    *chosen = k;
    if (!was)
        cli_warnf(cmd, "using minimum %zu of %zu (chi-square %.6g), not the one the fit chose%s",
                     k, fit->n_minima, fit->chi2, fit->split ? "; it predicts a liquid split" : "");
    return PW_OK;
}

pw_status cli_read_fit_at(const char *cmd, const char *path, const char *components,
                          const char *minimum_text, pw_fit_result *fit, size_t *chosen,
                          pw_error *err)
{
    *chosen = 0;
    pw_status st = cli_read_fit(cmd, path, components, fit, err);
    if (st != PW_OK)
        return st;
    st = cli_apply_minimum(cmd, path, fit, minimum_text, chosen, err);
    if (st != PW_OK)
        pw_fit_result_free(fit);
    return st;
}
