/* libFuzzer target: the fit-file reader (pw_fitfile_parse) on arbitrary bytes. A file that
 * parses is then evaluated again (pw_fit_evaluate), as the analysis commands do. */
#include <gsl/gsl_errno.h>
#include <pinchwise/fit.h>
#include <stdint.h>
#include <stdlib.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    gsl_set_error_handler_off();
    pw_fit_result r;
    pw_error err;
    pw_error_clear(&err);
    pw_status st = pw_fitfile_parse((const char *)data, size, "fuzz.json", &r, &err);
    if (st == PW_OK) {
        (void)pw_fit_evaluate(&r);
        pw_fit_result_free(&r);
    } else if (err.msg[0] == '\0') {
        abort();
    }
    return 0;
}
