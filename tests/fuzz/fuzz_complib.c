/* libFuzzer target: the component-file reader (pw_complib_parse) on arbitrary bytes, followed
 * by a lookup and a vapor-pressure evaluation of every row read. */
#include <gsl/gsl_errno.h>
#include <pinchwise/component.h>
#include <stdint.h>
#include <stdlib.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    gsl_set_error_handler_off();
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    pw_error_clear(&err);
    pw_status st = pw_complib_parse(&lib, (const char *)data, size, "fuzz.csv", &err);
    if (st == PW_OK) {
        for (size_t i = 0; i < lib.n; i++) {
            const pw_component *c = &lib.items[i];
            if (pw_complib_find(&lib, c->name) == NULL)
                abort();
            double P, dlnP, T;
            (void)pw_psat(c, 350.0, &P, &dlnP);
            (void)pw_tsat(c, 101325.0, &T);
        }
        const char *near[3];
        (void)pw_complib_suggest(&lib, "ethanol", near, 3);
    } else if (lib.n != 0 || err.msg[0] == '\0') {
        abort(); /* on failure nothing is appended and the error says why */
    }
    pw_complib_free(&lib);
    return 0;
}
