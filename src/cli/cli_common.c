#include "cli.h"
#include "cli_units.h"

#include <pinchwise/jsontext.h>

#include <pinchwise/dataset.h>
#include <pinchwise/fit_diagnostics.h>

#include <errno.h>
#include <math.h>
#include <stdarg.h>
#include <stdatomic.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <unistd.h>

pw_status cli_fail(const char *cmd, const pw_error *err)
{
    char buf[PW_PATH_MAX + PW_ERROR_MSG_MAX + 32];
    fprintf(stderr, "pinchwise %s: %s\n", cmd, pw_error_format(err, buf, sizeof buf));
    return err && err->status != PW_OK ? err->status : PW_EINVAL;
}

pw_status cli_failf(const char *cmd, pw_status st, const char *fmt, ...)
{
    va_list ap;
    fprintf(stderr, "pinchwise %s: ", cmd);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
    return st != PW_OK ? st : PW_EINVAL;
}

void cli_warnf(const char *cmd, const char *fmt, ...)
{
    va_list ap;
    fprintf(stderr, "pinchwise %s: warning: ", cmd);
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fputc('\n', stderr);
}

pw_status cli_load_components(pw_complib *lib, const char *extra_path, pw_error *err)
{
    return pw_complib_load_default(lib, extra_path, err);
}

pw_status cli_quantity(pw_quantity q, const char *opt, const char *text, double *si,
                          pw_error *err)
{
    pw_status st = pw_units_parse_quantity(q, text, si, err);
    if (st != PW_OK && err) {
        char inner[PW_ERROR_MSG_MAX];
        snprintf(inner, sizeof inner, "%s", err->msg);
        pw_error_set(err, st, NULL, 0, "%s %s: %s", opt, text, inner);
    }
    /* the plausible ranges of the data files (docs/inputs.md) */
    bool isT = q == PW_QTY_TEMPERATURE;
    double lo = isT ? PW_DATASET_T_MIN_K : PW_DATASET_P_MIN_PA;
    double hi = isT ? PW_DATASET_T_MAX_K : PW_DATASET_P_MAX_PA;
    if (st == PW_OK && !(*si >= lo && *si <= hi))
        st = pw_error_set(err, PW_EINVAL, NULL, 0,
                          "%s %s: outside the plausible range %g to %g %s", opt, text, lo, hi,
                          isT ? "K" : "Pa");
    return st;
}

pw_status cli_number(const char *opt, const char *text, double *value, pw_error *err)
{
    char *end = NULL;
    errno = 0;
    double v = strtod(text, &end);
    /* plain decimals only, as in the data files: no hexadecimal ("0x10"), no blanks */
    bool decimal = text[strspn(text, "0123456789+-.eE")] == '\0';
    if (!decimal || end == text || *end != '\0' || errno == ERANGE || !isfinite(v))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: not a finite number", opt, text);
    *value = v;
    return PW_OK;
}

/* Set when an allocation of jansson failed: a JSON object built then may lack keys silently
 * (json_object_set_new ignores a NULL value), so it must not be printed as a result. */
static atomic_bool json_alloc_failed;

static void *json_alloc(size_t n)
{
    void *p = malloc(n);
    if (!p)
        atomic_store(&json_alloc_failed, true);
    return p;
}

void cli_watch_json_allocations(void)
{
    json_set_alloc_funcs(json_alloc, free);
}

pw_status cli_print_json(json_t *obj)
{
    /* the whole text first (the library's text, the same as the Python module's): a failure
     * half-way through must not leave half an object on stdout */
    char *text = obj ? pw_json_text(obj) : NULL;
    json_decref(obj);
    if (!text || atomic_load(&json_alloc_failed)) {
        free(text);
        fprintf(stderr, "pinchwise: out of memory while building the JSON output (nothing "
                        "printed)\n");
        return PW_ENOMEM;
    }
    bool bad = fputs(text, stdout) == EOF || fputc('\n', stdout) == EOF || fflush(stdout) != 0;
    free(text);
    return bad ? PW_EIO : PW_OK;
}

json_t *cli_json_num(double v)
{
    return pw_json_num(v);
}

bool cli_progress_wanted(void)
{
    return isatty(STDERR_FILENO) != 0;
}

static void progress_print(const char *cmd, const char *what, size_t done, size_t total,
                           bool end_line)
{
    if (!cli_progress_wanted())
        return;
    /* \r and the erase-to-end sequence rewrite the line in place on a terminal */
    fprintf(stderr, "\rpinchwise %s: %zu/%zu %s\x1b[K%s", cmd, done, total, what ? what : "",
            end_line ? "\n" : "");
    fflush(stderr);
}

void cli_progress(const char *cmd, const char *what, size_t done, size_t total)
{
    progress_print(cmd, what, done, total, done >= total);
}

void cli_progress_line(const char *cmd, const char *what, size_t done, size_t total)
{
    progress_print(cmd, what, done, total, true);
}

pw_status cli_progress_tenths(void *ctx, size_t done, size_t total)
{
    const cli_progress_ctx *c = ctx;
    if (!c || total == 0)
        return PW_OK;
    if (done == 1 || done >= total || (10 * done) / total != (10 * (done - 1)) / total)
        cli_progress(c->cmd, c->what, done, total);
    return PW_OK;
}

void cli_progress_attach(pw_progress_fn *fn, void **ctx, cli_progress_ctx *pc)
{
    const bool on = cli_progress_wanted();
    *fn = on ? cli_progress_tenths : NULL;
    *ctx = on ? pc : NULL;
}

void cli_warn_vapor_association(const char *cmd, const pw_system *sys)
{
    for (int i = 0; i < 2; i++)
        if (pw_component_vapor_associates(&sys->comp[i]))
            cli_warnf(cmd, "%s dimerises in the vapor; the ideal-vapor model used here can be off "
                         "by tens of percent even at 1 atm (chemical theory: Marek & Standart 1954; "
                         "Hayden & O'Connell 1975): treat the results as rough",
                         sys->comp[i].name);
}

void cli_warn_cmo(const char *cmd, const pw_system *sys, const char *remedy)
{
    if (pw_cmo_doubtful(sys))
        cli_warnf(cmd, "the heats of vaporization of %s and %s differ by %.0f %%: constant molal "
                       "overflow is doubtful above about %.0f %% (common practice)%s",
                  sys->comp[0].name, sys->comp[1].name, 100.0 * pw_latent_heat_mismatch(sys),
                  100.0 * PW_CMO_MISMATCH_MAX, remedy);
}

pw_status cli_read_fit(const char *cmd, const char *path, const char *components,
                          pw_fit_result *fit, pw_error *err)
{
    bool changed[2];
    pw_status st = pw_fitfile_load(path, components, fit, changed, err);
    for (int i = 0; st == PW_OK && i < 2; i++)
        if (changed[i])
            cli_warnf(cmd, "vapor pressure of %s taken from %s; the activity parameters were "
                         "fitted with the fit file's own correlation", fit->sys.comp[i].name,
                         components);
    return st;
}

pw_status cli_whole(const char *opt, const char *text, double lo, double hi, unsigned long long *out,
                 pw_error *err)
{
    double v;
    bool digits = text[0] >= '0' && text[0] <= '9';
    if (!digits || cli_number(opt, text, &v, NULL) != PW_OK || v != floor(v) || v < lo ||
        v > hi) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: expected a whole number from %.0f to %.0f",
                     opt, text, lo, hi);
        return PW_EINVAL;
    }
    *out = (unsigned long long)v;
    return PW_OK;
}

pw_status cli_ranged(const char *opt, const char *text, double lo, double hi, const char *what,
                  double *out, pw_error *err)
{
    double v = NAN;
    if (cli_number(opt, text, &v, NULL) != PW_OK || !(v >= lo && v <= hi)) {
        pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: expected %s from %g to %g", opt, text, what,
                     lo, hi);
        return PW_EINVAL;
    }
    *out = v;
    return PW_OK;
}

pw_status cli_finish_stdout(const char *cmd)
{
    errno = 0;
    int bad = fflush(stdout) != 0;
    int e = errno;
    bad = bad || ferror(stdout);
    if (!bad)
        return PW_OK;
    fprintf(stderr, "pinchwise %s: cannot write to standard output: %s\n", cmd,
            e ? strerror(e) : "write error");
    return PW_EIO;
}

int cli_width(int w, const char *s)
{
    int extra = 0;
    for (const unsigned char *p = (const unsigned char *)s; *p; p++)
        extra += (*p & 0xC0) == 0x80; /* a continuation byte */
    return w + extra;
}
