/* The fit file's "convergence" object (docs/fit-file.md): read and checked against
 * "converged", kept apart from fitfile_read.c so that the class logic lives in one place. */
#include "fitfile_internal.h"

#include <math.h>
#include <stdio.h>
#include <string.h>

static bool class_converged(pw_fit_class c)
{
    return c == PW_FIT_MINIMUM || c == PW_FIT_EXACT || c == PW_FIT_UNIDENTIFIABLE;
}

bool pw_fitfile_read_convergence(const json_t *root, pw_fit_result *r, char *why, size_t n)
{
    const pw_model_type *m = r->sys.model;
    for (size_t k = 0; k < PW_MAX_PARAMS; k++)
        r->stderr_meaningful[k] = r->fitted[k] && isfinite(r->stderr_[k]);
    r->runaway_param = -1;
    r->runaway_chi2 = NAN;
    r->n_runaway_runs = 0;
    r->identifiable = true;
    r->sv_ratio = NAN;
    const json_t *c = json_object_get(root, "convergence");
    if (!c || json_is_null(c)) {
        r->fit_class = r->converged                 ? PW_FIT_MINIMUM
                       : r->stop == PW_STOP_MAXITER ? PW_FIT_MAXITER
                                                    : PW_FIT_FAILED;
        return true;
    }
    if (!json_is_object(c)) {
        snprintf(why, n, "key \"convergence\" must be an object (class, identifiable, ...)");
        return false;
    }
    const json_t *cls = json_object_get(c, "class");
    int k = json_is_string(cls) ? pw_fit_class_from_name(json_string_value(cls)) : -1;
    if (k < 0 || k == PW_FIT_NOT_RUN) {
        snprintf(why, n,
                 "key \"convergence.class\" must be one of minimum, exact, "
                 "not-identifiable, runaway, iteration-limit, failed");
        return false;
    }
    r->fit_class = (pw_fit_class)k;
    if (class_converged(r->fit_class) != r->converged) {
        snprintf(why, n, "key \"convergence.class\" (%s) contradicts \"converged\": %s",
                 pw_fit_class_name(r->fit_class), r->converged ? "true" : "false");
        return false;
    }
    const json_t *id = json_object_get(c, "identifiable");
    if (!json_is_boolean(id)) {
        snprintf(why, n, "key \"convergence.identifiable\" must be true or false");
        return false;
    }
    r->identifiable = json_is_true(id);
    if (r->fit_class == PW_FIT_UNIDENTIFIABLE && r->identifiable) {
        snprintf(why, n,
                 "key \"convergence.identifiable\" must be false for class "
                 "not-identifiable");
        return false;
    }
    const json_t *sv = json_object_get(c, "singular_value_ratio");
    if (json_is_number(sv))
        r->sv_ratio = json_number_value(sv);
    else if (sv && !json_is_null(sv)) {
        snprintf(why, n, "key \"convergence.singular_value_ratio\" must be a number or null");
        return false;
    }
    const json_t *weak = json_object_get(c, "weak_direction");
    if (json_is_object(weak)) {
        for (size_t j = 0; j < m->n_params; j++)
            r->weak_dir[j] = 0.0;
        const char *key;
        const json_t *v;
        json_object_foreach((json_t *)weak, key, v) {
            int j = pw_model_param_lookup(m, key);
            if (j < 0) {
                snprintf(why, n, "key \"convergence.weak_direction.%s\" is not a parameter of model %s",
                         key, m->name);
                return false;
            }
            if (!(json_is_number(v) && isfinite(json_number_value(v)) &&
                  fabs(json_number_value(v)) <= 1.0 + 1e-12)) {
                snprintf(why, n,
                         "key \"convergence.weak_direction.%s\" must be a number in "
                         "[-1, 1]",
                         key);
                return false;
            }
            r->weak_dir[j] = json_number_value(v);
        }
    } else if (weak && !json_is_null(weak)) {
        snprintf(why, n, "key \"convergence.weak_direction\" must be an object or null");
        return false;
    }
    const json_t *nr = json_object_get(c, "runaway_runs");
    if (nr && !(json_is_integer(nr) && json_integer_value(nr) >= 0)) {
        snprintf(why, n, "key \"convergence.runaway_runs\" must be a non-negative integer");
        return false;
    }
    r->n_runaway_runs = nr ? (size_t)json_integer_value(nr) : 0;
    const json_t *rc = json_object_get(c, "runaway_best_chi2");
    r->runaway_chi2 = json_is_number(rc) ? json_number_value(rc) : (double)NAN;
    if (rc && !json_is_null(rc) && !(json_is_number(rc) && json_number_value(rc) >= 0.0)) {
        snprintf(why, n, "key \"convergence.runaway_best_chi2\" must be a number >= 0 or null");
        return false;
    }
    const json_t *rp = json_object_get(c, "runaway_parameter");
    if (json_is_string(rp)) {
        int idx = pw_model_param_index(m, json_string_value(rp));
        if (idx < 0) {
            snprintf(why, n, "key \"convergence.runaway_parameter\" names no parameter of %s",
                     m->name);
            return false;
        }
        r->runaway_param = idx;
    }
    return true;
}
