/* Convergence classes of a fit, the models' runaway bounds and their ideal-solution points
 * (docs/fitting.md, "Convergence classes"). */
#include "fit_internal.h"

#include <math.h>
#include <string.h>

static const char *const class_names[] = {
    [PW_FIT_NOT_RUN] = "not-run", [PW_FIT_MINIMUM] = "minimum",
    [PW_FIT_EXACT] = "exact",     [PW_FIT_UNIDENTIFIABLE] = "not-identifiable",
    [PW_FIT_RUNAWAY] = "runaway", [PW_FIT_MAXITER] = "iteration-limit",
    [PW_FIT_FAILED] = "failed",
};

const char *pw_fit_class_name(pw_fit_class c)
{
    if ((size_t)c < sizeof class_names / sizeof class_names[0])
        return class_names[c];
    return "unknown";
}

int pw_fit_class_from_name(const char *name)
{
    for (size_t c = 0; name && c < sizeof class_names / sizeof class_names[0]; c++)
        if (!strcmp(name, class_names[c]))
            return (int)c;
    return -1;
}

static bool is_energy(const pw_model_type *m, size_t k)
{
    return strcmp(m->param_units[k], "K") == 0;
}

/* Bounds (this project's choice, stated in docs/fitting.md): a dimensionless interaction
 * constant or an energy divided by T_ref contributes about its own size to ln gamma at infinite
 * dilution, and |ln gamma_inf| > 30 (gamma_inf > 1e13) lies far beyond any measured liquid
 * mixture; NRTL's alpha is bounded by the model's own domain check. van Laar's theory makes
 * A12/A21 the ratio of the two components' size parameters (van Laar 1910; SVNA 7th ed.
 * section 12.2), which for real liquids stays within a factor of ten or so: a ratio beyond 100
 * is the degenerate edge A21 -> 0 (or A12 -> 0), where the model reproduces any ideal-looking
 * data while its ln gamma_inf is undetermined. */
int pw_fit_runaway_param(const pw_model_type *m, const bool *fitted, const double *params,
                         double T_ref_K)
{
    double T = T_ref_K > 0.0 && isfinite(T_ref_K) ? T_ref_K : 298.15;
    for (size_t k = 0; k < m->n_params; k++) {
        if (!fitted[k] || !strcmp(m->param_names[k], "alpha"))
            continue;
        double v = is_energy(m, k) ? params[k] / T : params[k];
        if (!isfinite(v) || fabs(v) > PW_FIT_BOUND_LNGAMMA)
            return (int)k;
    }
    if (!strcmp(m->name, "vanlaar") && fitted[0] && fitted[1]) {
        double a = fabs(params[0]), b = fabs(params[1]);
        if (a > 0.0 || b > 0.0) {
            if (a > PW_FIT_BOUND_VANLAAR_RATIO * b)
                return 1;
            if (b > PW_FIT_BOUND_VANLAAR_RATIO * a)
                return 0;
        }
    }
    return -1;
}

bool fit_ideal_point(const pw_system *s, double *params)
{
    const pw_model_type *m = s->model;
    memcpy(params, s->params, sizeof(double) * PW_MAX_PARAMS);
    int iv = pw_model_param_index(m, "V2_V1");
    double lnV = iv >= 0 && s->params[iv] > 0.0 ? log(s->params[iv]) : 0.0;
    bool any = false;
    for (size_t k = 0; k < m->n_params; k++) {
        const char *n = m->param_names[k];
        if (!strcmp(n, "alpha") || !strcmp(n, "V2_V1"))
            continue;
        if (iv >= 0 && is_energy(m, k)) {
            /* Wilson: Lambda12 = V2_V1 exp(-a12/T) = 1 and Lambda21 = exp(-a21/T)/V2_V1 = 1 */
            bool first = strstr(n, "12") != NULL;
            params[k] = (first ? 1.0 : -1.0) * s->T_ref_K * lnV;
        } else {
            params[k] = 0.0;
        }
        any = true;
    }
    return any && m->check(params) == PW_OK;
}
