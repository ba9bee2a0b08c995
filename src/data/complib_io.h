/* Private: the component-file reader with a chosen chunk size, so that tests can replay a file
 * split at every position (libcsv must give the same result however the input is cut). */
#ifndef PW_DATA_COMPLIB_IO_H
#define PW_DATA_COMPLIB_IO_H

#include <pinchwise/component.h>

/* As pw_complib_parse, feeding libcsv chunk bytes at a time (chunk 0 = all at once). */
pw_status pw_complib_parse_chunked(pw_complib *lib, const char *buf, size_t len, const char *name,
                                   size_t chunk, pw_error *err);

#endif
