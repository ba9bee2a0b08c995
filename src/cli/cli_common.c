#include "cli.h"
#include "cli_units.h"

#include <pinchwise/jsontext.h>

#include <errno.h>
#include <math.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <unistd.h>

int pw_cli_fail(const char *cmd, const pw_error *err)
{
    char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 32];
    fprintf(stderr, "pinchwise %s: %s\n", cmd, pw_error_format(err, buf, sizeof buf));
    int code = err ? pw_status_exit_code(err->status) : 1;
    return code ? code : 1;
}

int pw_cli_failf(const char *cmd, int code, const char *fmt, ...)
{
    va_list ap;
    fprintf(stderr, "pinchwise %s: ", cmd);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
    return code ? code : 1;
}

void pw_cli_warnf(const char *cmd, const char *fmt, ...)
{
    va_list ap;
    fprintf(stderr, "pinchwise %s: warning: ", cmd);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
}

pw_status pw_cli_load_components(pw_complib *lib, const char *extra_path, pw_error *err)
{
    const char *candidates[3] = {getenv("PINCHWISE_COMPONENTS"), PW_DEFAULT_COMPONENTS,
                                 PW_INSTALLED_COMPONENTS};
    const char *found = NULL;
    for (size_t i = 0; i < 3 && !found; i++)
        if (candidates[i] && candidates[i][0] && access(candidates[i], R_OK) == 0)
            found = candidates[i];
    pw_complib_init(lib);
    if (!found)
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

pw_status pw_cli_quantity(pw_quantity q, const char *opt, const char *text, double *si,
                          pw_error *err)
{
    pw_status st = pw_units_parse_quantity(q, text, si, err);
    if (st != PW_OK && err) {
        char inner[PW_ERROR_MSG_MAX];
        snprintf(inner, sizeof inner, "%s", err->msg);
        pw_error_set(err, st, NULL, 0, "%s %s: %s", opt, text, inner);
    }
    return st;
}

pw_status pw_cli_number(const char *opt, const char *text, double *value, pw_error *err)
{
    char *end = NULL;
    errno = 0;
    double v = strtod(text, &end);
    if (end == text || *end != '\0' || errno == ERANGE || !isfinite(v))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: not a finite number", opt, text);
    *value = v;
    return PW_OK;
}

int pw_cli_print_json(json_t *obj)
{
    char *full = json_dumps(obj, JSON_INDENT(2) | JSON_REAL_PRECISION(17) | JSON_PRESERVE_ORDER);
    json_decref(obj);
    char *text = pw_json_shortest_reals(full); /* 0.8, not 0.80000000000000004 */
    free(full);
    if (!text)
        return pw_status_exit_code(PW_ENOMEM);
    int rc = fputs(text, stdout) == EOF ? -1 : 0;
    free(text);
    if (rc != 0 || fputc('\n', stdout) == EOF || fflush(stdout) != 0)
        return pw_status_exit_code(PW_EIO);
    return 0;
}

json_t *pw_cli_json_num(double v)
{
    return isfinite(v) ? json_real(v) : json_null();
}

bool pw_cli_opt(int argc, char **argv, int *i, const char *name, const char **value, bool *missing)
{
    if (strcmp(argv[*i], name) != 0)
        return false;
    if (missing)
        *missing = false;
    if (value) {
        if (*i + 1 >= argc) {
            if (missing)
                *missing = true;
            return true;
        }
        *value = argv[++*i];
    }
    return true;
}

pw_status pw_cli_override_components(const char *cmd, pw_system *sys, const char *path,
                                     pw_error *err)
{
    if (!path)
        return PW_OK;
    pw_complib lib;
    pw_complib_init(&lib);
    pw_status st = pw_complib_read(&lib, path, err);
    if (st != PW_OK)
        return st;
    for (int i = 0; i < 2; i++) {
        const pw_component *c = pw_complib_find(&lib, sys->comp[i].name);
        if (!c)
            continue;
        const pw_component *o = &sys->comp[i];
        bool same = c->equation == o->equation && c->A == o->A && c->B == o->B && c->C == o->C &&
                    c->log == o->log && !strcmp(c->P_unit, o->P_unit) &&
                    !strcmp(c->T_unit, o->T_unit);
        sys->comp[i] = *c;
        if (same)
            continue;
        pw_cli_warnf(cmd, "vapor pressure of %s taken from %s; the activity parameters were fitted "
                     "with the fit file's own correlation", c->name, path);
    }
    pw_complib_free(&lib);
    return PW_OK;
}

bool pw_cli_progress_wanted(void)
{
    return isatty(STDERR_FILENO) != 0;
}

static void progress_print(const char *cmd, const char *what, size_t done, size_t total,
                           bool end_line)
{
    if (!pw_cli_progress_wanted())
        return;
    /* \r and the erase-to-end sequence rewrite the line in place on a terminal */
    fprintf(stderr, "\rpinchwise %s: %zu/%zu %s\x1b[K%s", cmd, done, total, what ? what : "",
            end_line ? "\n" : "");
    fflush(stderr);
}

void pw_cli_progress(const char *cmd, const char *what, size_t done, size_t total)
{
    progress_print(cmd, what, done, total, done >= total);
}

void pw_cli_progress_line(const char *cmd, const char *what, size_t done, size_t total)
{
    progress_print(cmd, what, done, total, true);
}

pw_status pw_cli_progress_tenths(void *ctx, size_t done, size_t total)
{
    const pw_cli_progress_ctx *c = ctx;
    if (!c || total == 0)
        return PW_OK;
    if (done == 1 || done >= total || (10 * done) / total != (10 * (done - 1)) / total)
        pw_cli_progress(c->cmd, c->what, done, total);
    return PW_OK;
}

void pw_cli_warn_vapor_association(const char *cmd, const pw_system *sys)
{
    for (int i = 0; i < 2; i++) {
        const char *n = sys->comp[i].name;
        bool acid = false;
        for (const char *p = n; *p && !acid; p++)
            acid = strncasecmp(p, "acid", 4) == 0;
        if (acid)
            pw_cli_warnf(cmd, "%s dimerises in the vapor; the ideal-vapor model used here can be off "
                         "by tens of percent even at 1 atm (chemical theory: Marek & Standart 1954; "
                         "Hayden & O'Connell 1975): treat the results as rough",
                         n);
    }
}

int pw_cli_fraction(const char *opt, const char *text, double *out, pw_error *err)
{
    if (pw_cli_number(opt, text, out, err) != PW_OK)
        return PW_EXIT_USAGE;
    if (!(*out >= 0.0 && *out <= 1.0)) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: a mole fraction must lie in [0, 1]", opt,
                     text);
        return PW_EXIT_USAGE;
    }
    return 0;
}

int pw_cli_target_opt(const char *opt, const char *value, pw_cli_targets *t, pw_error *err)
{
    if (!strcmp(opt, "--pressure")) {
        if (pw_cli_quantity(PW_QTY_PRESSURE, opt, value, &t->P_Pa, err) != PW_OK)
            return PW_EXIT_USAGE;
        t->have_P = true;
        return 0;
    }
    if (!strcmp(opt, "--xd")) {
        t->have_xd = true;
        return pw_cli_composition(opt, value, &t->xd, &t->basis[0], err);
    }
    if (!strcmp(opt, "--xb")) {
        t->have_xb = true;
        return pw_cli_composition(opt, value, &t->xb, &t->basis[1], err);
    }
    if (!strcmp(opt, "--zf")) {
        t->have_zf = true;
        return pw_cli_composition(opt, value, &t->zf, &t->basis[2], err);
    }
    if (!strcmp(opt, "--q"))
        return pw_cli_number(opt, value, &t->q, err) == PW_OK ? 0 : PW_EXIT_USAGE;
    return -1;
}

pw_status pw_cli_read_fit(const char *cmd, const char *path, const char *components,
                          pw_fit_result *fit, pw_error *err)
{
    pw_status st = pw_fitfile_read(path, fit, err);
    if (st != PW_OK)
        return st;
    st = pw_cli_override_components(cmd, &fit->sys, components, err);
    if (st != PW_OK)
        pw_fit_result_free(fit);
    return st;
}
