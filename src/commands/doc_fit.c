/* The `fit --json` document (moved from src/cli/fit_common.c). */
#include <pinchwise/commands.h>
#include <pinchwise/fitjson.h>

#include "fit/fitfile_internal.h"

json_t *pw_fit_doc(const pw_fit_result *r, const char *fit_file)
{
    json_t *o = pw_fitfile_json_without_points(r); /* "data" goes: no need to build the points */
    json_object_del(o, "data");
    json_object_del(o, "component_data");
    json_object_del(o, "format");
    json_object_del(o, "format_version");
    json_object_set_new(o, "diagnostics", pw_fit_diagnostics_json(r));
    json_object_set_new(o, "fit_file", fit_file ? json_string(fit_file) : json_null());
    return o;
}
