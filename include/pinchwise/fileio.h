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
 * is left behind and err names the path. The new file's mode is 0666 less the process umask.
 * The same as a pw_outset with one file and no hooks. */
pw_status pw_atomic_write(const char *path, const char *text, size_t len, bool force,
                          pw_error *err);

/* Reads a whole file into a NUL-terminated malloc'd buffer (*len without the NUL); the caller
 * frees *buf. Refuses files larger than max_bytes with PW_EINVAL, and anything that is not a
 * regular file (a folder, a FIFO, a device) with PW_EIO at once, without blocking. */
pw_status pw_read_file(const char *path, size_t max_bytes, char **buf, size_t *len, pw_error *err);

/* Told about every named temporary file an output set creates (before it exists) and about its
 * end (after it was moved into place or removed), and likewise about every folder it creates
 * (until the set is freed), so that a host can remove the leftovers when it is interrupted, e.g.
 * from a SIGINT handler (unlink the files, then rmdir the folders, which are empty by then). The callbacks run in the writing thread and must
 * be thread-safe when several threads write; they may be NULL. The library keeps no list of its
 * own (no global state): without hooks an interrupted process may leave "*.tmpXXXXXX" files. */
typedef struct pw_tmp_hooks {
    void (*made)(void *ctx, const char *tmp_path);
    void (*gone)(void *ctx, const char *tmp_path);
    void *ctx;
} pw_tmp_hooks;

/* A set of output files written all or none (a transaction on the file system):
 *   pw_outset_new -> [pw_outset_protect]* -> [pw_outset_check | _mkdir | _add]* ->
 *   pw_outset_commit -> pw_outset_free.
 * _add writes each file's text to a temporary file beside its target (fsync'd); _commit moves
 * them all into place, and when one move fails puts back every target it already replaced (the
 * old file is kept as a hard link until the end) or created, so that afterwards either every
 * target holds its new text or every target is as before. _free removes whatever was not
 * committed: temporary files and the folders _mkdir created. An interruption during _commit
 * itself (a window of a few system calls) can leave some targets new and some old.
 * Targets are compared with the protected inputs by identity (device and inode, after following
 * symbolic links), so a hard or symbolic link to an input is refused as well, force or not. */
typedef struct pw_outset pw_outset;

/* A new empty set. force: replace existing targets (otherwise PW_EEXIST); hooks may be NULL
 * and must outlive the set. PW_ENOMEM. */
pw_status pw_outset_new(bool force, const pw_tmp_hooks *hooks, pw_outset **out, pw_error *err);

/* Records an input of the command: no target of the set may be this file (PW_EINVAL naming both).
 * A path that does not exist is ignored (PW_OK). NULL path: PW_OK. */
pw_status pw_outset_protect(pw_outset *s, const char *input_path, pw_error *err);

/* Checks path as a target without writing: PW_EINVAL when it is a protected input (or a
 * folder), PW_EEXIST when it exists and the set has no force. Use it before long work. */
pw_status pw_outset_check(const pw_outset *s, const char *path, pw_error *err);

/* Creates the folder dir (mode 0777 less the umask) when missing; the set removes it again
 * unless committed. PW_EIO when it exists and is not a folder or cannot be created. */
pw_status pw_outset_mkdir(pw_outset *s, const char *dir, pw_error *err);

/* Checks path (as _check) and writes text to a temporary file beside it. PW_EIO, PW_ENOMEM. */
pw_status pw_outset_add(pw_outset *s, const char *path, const char *text, size_t len,
                        pw_error *err);

/* The same as _add for a text made piece by piece, so that no whole copy of a large file needs
 * to be held: produce(ctx, emit, sink) is called once and passes its pieces in order to
 * emit(sink, piece, len) (which returns PW_EIO when writing failed; produce should then stop and
 * return it); the file is their concatenation. A status other than PW_OK from produce drops the
 * file and is returned (PW_EIO after a failed write names the system's reason). */
typedef pw_status (*pw_outset_emit)(void *sink, const char *text, size_t len);
typedef pw_status (*pw_outset_producer)(void *ctx, pw_outset_emit emit, void *sink);
pw_status pw_outset_add_stream(pw_outset *s, const char *path, pw_outset_producer produce,
                               void *ctx, pw_error *err);

/* Moves every added file into place, all or none (see above). After a failure the set is as if
 * nothing had been added. Committing an empty set is PW_OK. */
pw_status pw_outset_commit(pw_outset *s, pw_error *err);

/* Removes what was not committed and frees the set. Accepts NULL. */
void pw_outset_free(pw_outset *s);

#ifdef __cplusplus
}
#endif
#endif
