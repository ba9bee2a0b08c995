/* Atomic output files: a temporary file in the target's folder, fsync, then link (refusing to
 * replace an existing file) or rename (replacing it). A reader never sees a half-written file and
 * a failure leaves nothing behind. */
#include <pinchwise/fileio.h>

#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

/* Writes text to a temporary file next to path, then moves it into place. */
pw_status pw_atomic_write(const char *path, const char *text, size_t len, bool force, pw_error *err)
{
    if (!force && access(path, F_OK) == 0)
        return pw_error_set(err, PW_EEXIST, path, 0,
                            "file exists (pass --force to replace it, or choose another --out)");
    char tmp[PW_PATH_MAX + 16];
    int n = snprintf(tmp, sizeof tmp, "%s.tmpXXXXXX", path);
    if (n < 0 || (size_t)n >= sizeof tmp)
        return pw_error_set(err, PW_EINVAL, path, 0, "path too long");
    int fd = mkstemp(tmp);
    if (fd < 0)
        return pw_error_set(err, PW_EIO, path, 0, "cannot create a file beside it: %s",
                            strerror(errno));
    size_t done = 0;
    while (done < len) {
        ssize_t w = write(fd, text + done, len - done);
        if (w < 0 && errno == EINTR)
            continue;
        if (w <= 0) {
            int e = errno;
            close(fd);
            unlink(tmp);
            return pw_error_set(err, PW_EIO, path, 0, "write failed: %s", strerror(e));
        }
        done += (size_t)w;
    }
    if (fsync(fd) != 0 || close(fd) != 0) {
        unlink(tmp);
        return pw_error_set(err, PW_EIO, path, 0, "write failed: %s", strerror(errno));
    }
    chmod(tmp, 0644);
    int rc;
    if (force) {
        rc = rename(tmp, path);
    } else {
        rc = link(tmp, path); /* fails if path appeared meanwhile: never clobber */
        unlink(tmp);
        if (rc != 0 && errno == EEXIST) {
            return pw_error_set(err, PW_EEXIST, path, 0,
                                "file exists (pass --force to replace it, or choose another --out)");
        }
    }
    if (rc != 0) {
        int e = errno;
        unlink(tmp);
        return pw_error_set(err, PW_EIO, path, 0, "cannot move the new file into place: %s",
                            strerror(e));
    }
    return PW_OK;
}


pw_status pw_read_file(const char *path, size_t max_bytes, char **buf, size_t *len, pw_error *err)
{
    *buf = NULL;
    *len = 0;
    FILE *f = fopen(path, "rb");
    if (!f)
        return pw_error_set(err, PW_EIO, path, 0, "cannot open: %s", strerror(errno));
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
