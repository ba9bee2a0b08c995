/* libFuzzer target: the dataset reader (pw_dataset_parse) on arbitrary bytes.
 * Any input must give PW_OK with a consistent data set or an error with a message; never a
 * crash, a leak or undefined behaviour. */
#include <gsl/gsl_errno.h>
#include <math.h>
#include <pinchwise/dataset.h>
#include <stdint.h>
#include <stdlib.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    gsl_set_error_handler_off();
    pw_dataset ds;
    pw_error err;
    pw_error_clear(&err);
    pw_status st = pw_dataset_parse((const char *)data, size, "fuzz.csv", &ds, &err);
    if (st == PW_OK) {
        /* The reader's promises: at least one point, fractions in [0,1], finite T and P > 0. */
        if (ds.n == 0 || !ds.pts)
            abort();
        for (size_t i = 0; i < ds.n; i++) {
            const pw_point *p = &ds.pts[i];
            if (!(p->x1 >= 0.0 && p->x1 <= 1.0) || !(p->T_K > 0.0) || !(p->P_Pa > 0.0) ||
                !isfinite(p->T_K) || !isfinite(p->P_Pa))
                abort();
            if (ds.has_y && !(p->y1 >= 0.0 && p->y1 <= 1.0))
                abort();
        }
        pw_dataset_free(&ds);
    } else if (err.msg[0] == '\0') {
        abort(); /* every failure carries a message */
    }
    return 0;
}
