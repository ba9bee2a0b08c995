/* Safe output files. */
#ifndef PINCHWISE_FILEIO_H
#define PINCHWISE_FILEIO_H

#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Writes len bytes of text to path atomically (temporary file beside it, fsync, then move into
 * place). Without force an existing path is never replaced: PW_EEXIST. On any failure nothing
 * is left behind and err names the path. */
pw_status pw_atomic_write(const char *path, const char *text, size_t len, bool force,
                          pw_error *err);

/* Reads a whole file into a NUL-terminated malloc'd buffer (*len without the NUL); the caller
 * frees *buf. Refuses files larger than max_bytes with PW_EINVAL. */
pw_status pw_read_file(const char *path, size_t max_bytes, char **buf, size_t *len, pw_error *err);

#ifdef __cplusplus
}
#endif
#endif
