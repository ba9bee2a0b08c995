#include "pw_test.h"

#include <gsl/gsl_errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>

void pw_assert_close_impl(double got, double want, double rtol, double atol, const char *label,
                          const char *file, int line)
{
    int ok;
    if (isnan(want) || isnan(got))
        ok = isnan(want) && isnan(got);
    else if (isinf(want) || isinf(got))
        ok = got == want;
    else
        ok = fabs(got - want) <= rtol * fabs(want) + atol;
    if (!ok) {
        print_error("%s:%d: %s: got %.17g, want %.17g (rtol %g, atol %g, diff %.3g)\n", file, line,
                    label ? label : "value", got, want, rtol, atol, got - want);
        _fail(file, line);
    }
}

const char *pw_test_path(char *buf, size_t len, const char *relative)
{
    const char *root = getenv("PW_SOURCE_DIR");
#ifdef PW_SOURCE_DIR
    if (!root)
        root = PW_SOURCE_DIR;
#endif
    snprintf(buf, len, "%s/%s", root ? root : ".", relative);
    return buf;
}

void pw_test_init(void) { gsl_set_error_handler_off(); }
