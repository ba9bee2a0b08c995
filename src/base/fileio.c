/* Atomic output files (one-file output sets, see outset.c) and whole-file input that refuses
 * anything but a regular file. */
#include <pinchwise/fileio.h>

#include "base/fileio_internal.h"

#include <errno.h>
#include <fcntl.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

pw_status pw_atomic_write(const char *path, const char *text, size_t len, bool force, pw_error *err)
{
    pw_outset *s = NULL;
    pw_status st = pw_outset_new(force, NULL, &s, err);
    if (st == PW_OK)
        st = pw_outset_add(s, path, text, len, err);
    if (st == PW_OK)
        st = pw_outset_commit(s, err);
    pw_outset_free(s);
    return st;
}

pw_status pw_file_open_regular(const char *path, size_t max_bytes, int *fd_out, pw_error *err)
{
    *fd_out = -1;
    /* O_NONBLOCK: opening a FIFO for reading would otherwise wait for a writer */
    int fd = open(path, O_RDONLY | O_NONBLOCK | O_CLOEXEC);
    if (fd < 0)
        return pw_error_set(err, PW_EIO, path, 0, "cannot open: %s", strerror(errno));
    struct stat st;
    if (fstat(fd, &st) != 0) {
        int e = errno;
        close(fd);
        return pw_error_set(err, PW_EIO, path, 0, "cannot open: %s", strerror(e));
    }
    if (!S_ISREG(st.st_mode)) {
        close(fd);
        return pw_error_set(err, PW_EIO, path, 0, "is not a regular file (%s; expected a file)",
                            S_ISDIR(st.st_mode)    ? "a folder"
                            : S_ISFIFO(st.st_mode) ? "a pipe"
                            : S_ISCHR(st.st_mode)  ? "a character device"
                            : S_ISBLK(st.st_mode)  ? "a block device"
                            : S_ISSOCK(st.st_mode) ? "a socket"
                                                   : "not a file");
    }
    if (max_bytes && (unsigned long long)st.st_size > (unsigned long long)max_bytes) {
        close(fd);
        return pw_error_set(err, PW_EPARSE, path, 0,
                            "the file is larger than %zu bytes, the reader's limit", max_bytes);
    }
    int fl = fcntl(fd, F_GETFL);
    if (fl != -1)
        fcntl(fd, F_SETFL, fl & ~O_NONBLOCK);
    *fd_out = fd;
    return PW_OK;
}

pw_status pw_read_file(const char *path, size_t max_bytes, char **buf, size_t *len, pw_error *err)
{
    *buf = NULL;
    *len = 0;
    int fd;
    pw_status ost = pw_file_open_regular(path, max_bytes, &fd, err);
    if (ost != PW_OK)
        return ost == PW_EPARSE
                   ? pw_error_set(err, PW_EINVAL, path, 0, "file is larger than %zu bytes", max_bytes)
                   : ost;
    FILE *f = fdopen(fd, "rb");
    if (!f) {
        close(fd);
        return pw_error_set(err, PW_ENOMEM, path, 0, "out of memory");
    }
    size_t cap = 65536, n = 0;
    char *b = malloc(cap + 1);
    while (b) {
        size_t got = fread(b + n, 1, cap - n, f);
        n += got;
        if (n > max_bytes) {
            free(b);
            fclose(f);
            return pw_error_set(err, PW_EINVAL, path, 0, "file is larger than %zu bytes", max_bytes);
        }
        if (got == 0 || n < cap) {
            if (ferror(f)) {
                free(b);
                fclose(f);
                return pw_error_set(err, PW_EIO, path, 0, "read failed");
            }
            if (feof(f))
                break;
        }
        if (n == cap) {
            char *nb = realloc(b, cap * 2 + 1);
            if (!nb)
                free(b);
            b = nb;
            cap *= 2;
        }
    }
    fclose(f);
    if (!b)
        return pw_error_set(err, PW_ENOMEM, path, 0, "out of memory");
    b[n] = '\0';
    *buf = b;
    *len = n;
    return PW_OK;
}
