/* pinchwise status codes and error detail.
 *
 * Every fallible library function returns a pw_status (PW_OK == 0 is success). Functions that
 * can say more (file, line, what was expected) also fill a caller-owned pw_error. The library
 * never prints and never exits; only the command-line program talks to the user.
 *
 * GSL's error handler (gsl_set_error_handler) is process-wide; the library never installs or
 * changes it. What it expects of it:
 * - the 1-D root and minimum searches (bubble and dew points, the stability scan, the azeotrope
 *   search, the column's pinch search, q-line and stage stepping, Underwood) never reach the
 *   handler: every condition GSL would report is checked first and returned as a pw_status, and
 *   GSL is never handed a non-finite value (docs/hardening.md, "The GSL boundary"; tested with
 *   GSL's default, aborting, handler installed). These work whatever handler the host installed;
 * - the least-squares fits (the model fit, the consistency point test's Barker fit) and the
 *   distribution quantiles check every condition under which GSL's allocators and quantile
 *   functions report an error (too few points, a non-positive degree of freedom) before calling
 *   them; tested on hostile data (non-finite and absurd values, too few and repeated points,
 *   every model) with the aborting handler installed (tests/unit/test_gsl_boundary_fit.c).
 *   Hosts should still call gsl_set_error_handler_off() once at start-up, as the command-line
 *   program, pw_api_init and the tests do: a handler that returns (rather than aborting or
 *   jumping out) is all the library needs, and it costs nothing. */
#ifndef PINCHWISE_STATUS_H
#define PINCHWISE_STATUS_H

#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* The one list of status codes: enum name, message. (The command-line program's exit code for
 * each is the program's business: src/cli/cli_exit.c, docs/exit-codes.md.) */
#define PW_STATUS_LIST(X)                                                          \
    X(PW_OK, "success")                                                            \
    X(PW_EINVAL, "invalid argument")                                               \
    X(PW_EPARSE, "malformed input")                                                \
    X(PW_EIO, "file input/output error")                                           \
    X(PW_ENOTFOUND, "not found")                                                   \
    X(PW_EEXIST, "output file exists")                                             \
    X(PW_ENOMEM, "out of memory")                                                  \
    X(PW_EDOM, "argument outside the domain of the model")                         \
    X(PW_ERANGE, "value outside the validity range")                               \
    X(PW_ETOOFEW, "too few data points")                                           \
    X(PW_ENOBRACKET, "no root inside the search bracket")                          \
    X(PW_EMAXITER, "iteration limit reached before convergence")                   \
    X(PW_ENOCONV, "solver did not converge")                                       \
    X(PW_ESINGULAR, "singular or ill-conditioned matrix")                          \
    X(PW_EINFEASIBLE, "specification cannot be met")

typedef enum {
#define PW_STATUS_ENUM(name, msg) name,
    PW_STATUS_LIST(PW_STATUS_ENUM)
#undef PW_STATUS_ENUM
        PW_STATUS_COUNT
} pw_status;

/* Static message for a status; never NULL, never to be freed. */
const char *pw_strerror(pw_status status);

#define PW_ERROR_MSG_MAX 640
#define PW_PATH_MAX 512

/* Detail of a failure, owned by the caller. line is 0 when there is none. */
typedef struct pw_error {
    pw_status status;
    char file[PW_PATH_MAX];
    long line;
    char msg[PW_ERROR_MSG_MAX]; /* "what is wrong (what was expected)", no file/line prefix */
} pw_error;

/* Progress of long work, reported by the library through a callback the caller installs (the
 * library itself never prints): done of total units are finished, 1 <= done <= total. Return
 * PW_OK to go on; any other status stops the work, which then returns that status. */
typedef pw_status (*pw_progress_fn)(void *ctx, size_t done, size_t total);

/* Clears an error record (status PW_OK, empty strings). Accepts NULL. */
void pw_error_clear(pw_error *err);

/* Fills err (when not NULL) and returns status. file may be NULL, line 0 for none. */
pw_status pw_error_set(pw_error *err, pw_status status, const char *file, long line,
                       const char *fmt, ...) __attribute__((format(printf, 5, 6)));

/* Formats "file:line: msg" (or "file: msg", or "msg") into buf; returns buf. */
const char *pw_error_format(const pw_error *err, char *buf, size_t len);

#ifdef __cplusplus
}
#endif
#endif
