/* Private: opening input files for the readers (dataset, component library, fit file). */
#ifndef PW_BASE_FILEIO_INTERNAL_H
#define PW_BASE_FILEIO_INTERNAL_H

#include <pinchwise/status.h>
#include <stddef.h>

/* Opens path for reading and hands back a blocking descriptor (caller closes). Refuses at once,
 * without blocking, anything that is not a regular file (a folder, a FIFO, a device, a socket):
 * PW_EIO naming what it is. PW_EPARSE when max_bytes is not 0 and the file is larger. */
pw_status pw_file_open_regular(const char *path, size_t max_bytes, int *fd, pw_error *err);

#endif
