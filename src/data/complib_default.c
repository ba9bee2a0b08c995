/* Finding the shipped component library: the environment, the installed copy beside the code,
 * the source tree the code was built from, the configured install location. */
#define _GNU_SOURCE /* dladdr */
#include <dlfcn.h>
#include <pinchwise/component.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#ifndef PW_DEFAULT_COMPONENTS
#define PW_DEFAULT_COMPONENTS ""
#endif
#ifndef PW_INSTALLED_COMPONENTS
#define PW_INSTALLED_COMPONENTS ""
#endif
#ifndef PW_COMPONENTS_FROM_LIBDIR
#define PW_COMPONENTS_FROM_LIBDIR "../share/pinchwise/components.csv"
#endif
#ifndef PW_COMPONENTS_FROM_BINDIR
#define PW_COMPONENTS_FROM_BINDIR "../share/pinchwise/components.csv"
#endif

/* Any object of this file: its address tells dladdr which file holds the code. */
static const char anchor = 0;

static bool readable(const char *p)
{
    return p && p[0] && access(p, R_OK) == 0;
}

/* path = folder of the file holding this code (the shared library, or the program it is linked
 * into) + "/" + rel. */
static bool beside_code(const char *rel, char *path, size_t len)
{
    Dl_info info;
    if (!dladdr(&anchor, &info) || !info.dli_fname || !strchr(info.dli_fname, '/'))
        return false;
    const char *slash = strrchr(info.dli_fname, '/');
    char joined[PW_PATH_MAX], *canon;
    int n = snprintf(joined, sizeof joined, "%.*s/%s", (int)(slash - info.dli_fname),
                     info.dli_fname, rel);
    if (n <= 0 || (size_t)n >= sizeof joined || !readable(joined) ||
        !(canon = realpath(joined, NULL)))
        return false;
    n = snprintf(path, len, "%s", canon);
    free(canon);
    return n > 0 && (size_t)n < len;
}

bool pw_complib_default_path(char *path, size_t len)
{
    const char *env = getenv("PINCHWISE_COMPONENTS");
    const char *fixed[2] = {PW_DEFAULT_COMPONENTS, PW_INSTALLED_COMPONENTS};
    if (readable(env))
        return snprintf(path, len, "%s", env) < (int)len;
    if (beside_code(PW_COMPONENTS_FROM_LIBDIR, path, len) ||
        beside_code(PW_COMPONENTS_FROM_BINDIR, path, len))
        return true;
    for (int i = 0; i < 2; i++)
        if (readable(fixed[i]))
            return snprintf(path, len, "%s", fixed[i]) < (int)len;
    return false;
}

pw_status pw_complib_load_default(pw_complib *lib, const char *extra_path, pw_error *err)
{
    char found[PW_PATH_MAX];
    pw_complib_init(lib);
    if (!pw_complib_default_path(found, sizeof found))
        return pw_error_set(err, PW_ENOTFOUND, NULL, 0,
                            "the component library components.csv was not found (set "
                            "PINCHWISE_COMPONENTS to its path)");
    pw_status st = pw_complib_read(lib, found, err);
    if (st == PW_OK && extra_path)
        st = pw_complib_read(lib, extra_path, err);
    if (st != PW_OK)
        pw_complib_free(lib);
    return st;
}
