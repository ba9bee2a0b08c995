#include <pinchwise/status.h>
#include <pinchwise/units.h>

#include <stdarg.h>
#include <stdio.h>
#include <string.h>

static const char *const messages[] = {
#define PW_STATUS_MSG(name, msg) msg,
    PW_STATUS_LIST(PW_STATUS_MSG)
#undef PW_STATUS_MSG
};

const char *pw_strerror(pw_status status)
{
    if ((int)status < 0 || status >= PW_STATUS_COUNT)
        return "unknown status";
    return messages[status];
}

void pw_error_clear(pw_error *err)
{
    if (!err)
        return;
    err->status = PW_OK;
    err->file[0] = '\0';
    err->line = 0;
    err->msg[0] = '\0';
}

pw_status pw_error_set(pw_error *err, pw_status status, const char *file, long line,
                       const char *fmt, ...)
{
    if (!err)
        return status;
    err->status = status;
    snprintf(err->file, sizeof err->file, "%s", file ? file : "");
    err->line = line;
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(err->msg, sizeof err->msg, fmt, ap);
    va_end(ap);
    /* a library reason quoted in an error: its marked quantities in K and kPa (errors carry no
     * display units; pinchwise/units.h) */
    if (strchr(err->msg, '\x1e')) {
        char tmp[sizeof err->msg];
        pw_units_display_text(NULL, err->msg, tmp, sizeof tmp);
        memcpy(err->msg, tmp, sizeof tmp);
    }
    return status;
}

const char *pw_error_format(const pw_error *err, char *buf, size_t len)
{
    if (!buf || len == 0)
        return buf;
    if (!err) {
        snprintf(buf, len, "unknown error");
        return buf;
    }
    const char *msg = err->msg[0] ? err->msg : pw_strerror(err->status);
    if (err->file[0] && err->line > 0)
        snprintf(buf, len, "%s:%ld: %s", err->file, err->line, msg);
    else if (err->file[0])
        snprintf(buf, len, "%s: %s", err->file, msg);
    else
        snprintf(buf, len, "%s", msg);
    return buf;
}
