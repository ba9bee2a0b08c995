/* Private: the dataset reader with a chosen chunk size, so that tests can replay a file split
 * at every position (STYLE.md habit 18) and check that the result does not change. */
#ifndef PW_DATA_DATASET_IO_H
#define PW_DATA_DATASET_IO_H

#include <pinchwise/dataset.h>

/* As pw_dataset_parse, feeding the reader chunk bytes at a time (chunk 0 = all at once). */
pw_status pw_dataset_parse_chunked(const char *buf, size_t len, const char *name, size_t chunk,
                                   pw_dataset *ds, pw_error *err);

/* Parses "VALUE UNIT" or "VALUEUNIT" (blanks between them optional) into its number and its
 * unit text (copied to unit, at most unit_cap - 1 characters). False when either part is
 * missing, the number is not a plain finite decimal, or the unit does not fit. */
bool pw_dataset_split_quantity(const char *text, double *value, char *unit, size_t unit_cap);

#endif
