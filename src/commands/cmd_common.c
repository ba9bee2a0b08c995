/* Pieces shared by the command documents: numbers, the printed text, the caution, component
 * lookup for a dataset. Moved from src/cli/ so that the
 * program and the Python module share them. */
#include <math.h>
#include <pinchwise/commands.h>
#include <pinchwise/jsontext.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

json_t *pw_json_num(double v)
{
    return isfinite(v) ? json_real(v) : json_null();
}

json_t *pw_json_reason(const char *text)
{
    char buf[2048];
    return json_string(pw_units_display_text(NULL, text, buf, sizeof buf));
}

char *pw_json_text(const json_t *doc)
{
    char *full = doc ? json_dumps(doc, JSON_INDENT(2) | JSON_REAL_PRECISION(17) | JSON_PRESERVE_ORDER)
                     : NULL;
    char *text = pw_json_shortest_reals(full); /* 0.8, not 0.80000000000000004 */
    free(full);
    return text;
}

const char *pw_caution_text(void)
{
    return "Screening estimate from a correlation fitted to limited laboratory data, not a design. "
           "Verify with rigorous simulation and laboratory or pilot data; many solvents here are "
           "flammable or toxic (see the Safety Data Sheet); pressure equipment and relief must follow "
           "local codes and regulations; any design must be reviewed by a qualified, licensed "
           "engineer.";
}

static pw_status find_component(const pw_complib *lib, const pw_dataset *ds, int i,
                                pw_component out[2], const pw_component **c, pw_error *err)
{
    *c = pw_complib_find(lib, ds->names[i]);
    if (*c) {
        /* Keep the dataset's spelling (it may be an alias or differ in case): the fit file and
         * every later output then name the components as the user did. */
        out[i] = **c;
        snprintf(out[i].name, sizeof out[i].name, "%s", ds->names[i]);
        *c = &out[i];
        return PW_OK;
    }
    const char *sugg[3];
    size_t n = pw_complib_suggest(lib, ds->names[i], sugg, 3);
    char hint[300] = "";
    if (n > 0) {
        size_t len = (size_t)snprintf(hint, sizeof hint, "; did you mean ");
        for (size_t k = 0; k < n && len < sizeof hint; k++)
            len += (size_t)snprintf(hint + len, sizeof hint - len, "%s'%s'",
                                    k == 0 ? "" : (k + 1 == n ? " or " : ", "), sugg[k]);
        if (len < sizeof hint)
            snprintf(hint + len, sizeof hint - len, "?");
    }
    return pw_error_set(err, PW_ENOTFOUND, ds->path, ds->components_line,
                        "component '%s' is not in the component library (add it with --components "
                        "FILE%s)",
                        ds->names[i], hint);
}

pw_status pw_dataset_components(const pw_complib *lib, const pw_dataset *ds, pw_component out[2],
                                pw_error *err)
{
    const pw_component *c;
    pw_status st = find_component(lib, ds, 0, out, &c, err);
    if (st == PW_OK)
        st = find_component(lib, ds, 1, out, &c, err);
    return st;
}
