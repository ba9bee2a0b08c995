/* libFuzzer target: the quantity parser (pw_units_parse_quantity) for temperature and
 * pressure on arbitrary NUL-terminated text. A quantity accepted must be finite and > 0. */
#include <math.h>
#include <pinchwise/units.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = malloc(size + 1);
    if (!text)
        return 0;
    memcpy(text, data, size);
    text[size] = '\0';
    for (int q = 0; q < 2; q++) {
        double si = NAN;
        pw_error err;
        pw_error_clear(&err);
        pw_status st = pw_units_parse_quantity(q ? PW_QTY_PRESSURE : PW_QTY_TEMPERATURE, text,
                                               &si, &err);
        if (st == PW_OK && !(isfinite(si) && si > 0.0))
            abort();
        if (st != PW_OK && err.msg[0] == '\0')
            abort();
    }
    free(text);
    return 0;
}
