/* Output sets: several files written all or none, never over an input (see fileio.h).
 *
 * Each file is first written to a temporary file beside its target ("<target>.tmpXXXXXX",
 * created with O_EXCL and mode 0666 so that the umask applies, then fsync'd). Commit moves them
 * into place one by one: a new target by link() (which refuses to replace a file that appeared
 * meanwhile), an existing one (with force) by rename() after keeping the old file as a hard link
 * "<target>.tmpXXXXXX", so that a later failure can put every replaced file back. */
#include <pinchwise/fileio.h>

#include <errno.h>
#include <fcntl.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <time.h>
#include <unistd.h>

#define EXISTS_MSG "file exists (pass --force to replace it, or choose another output name)"

typedef struct out_entry {
    char *target;
    char *tmp;    /* the new text, until moved into place */
    char *backup; /* during commit: a hard link to the file the target replaced */
    bool placed, replaced;
} out_entry;

typedef struct protected_input {
    dev_t dev;
    ino_t ino;
    char *path;
} protected_input;

struct pw_outset {
    bool force, committed;
    const pw_tmp_hooks *hooks;
    out_entry *e;
    size_t n, cap;
    protected_input *in;
    size_t n_in, cap_in;
    char **dirs; /* folders this set created */
    size_t n_dirs, cap_dirs;
    uint64_t rng;
};

static bool grow(void **p, size_t *cap, size_t need, size_t elem)
{
    if (need <= *cap)
        return true;
    size_t n = *cap ? 2 * *cap : 4;
    while (n < need)
        n *= 2;
    void *q = realloc(*p, n * elem);
    if (!q)
        return false;
    *p = q;
    *cap = n;
    return true;
}

static char *dup_str(const char *s)
{
    size_t n = strlen(s) + 1;
    char *d = malloc(n);
    if (d)
        memcpy(d, s, n);
    return d;
}

static void hook_made(const pw_outset *s, const char *p)
{
    if (s->hooks && s->hooks->made)
        s->hooks->made(s->hooks->ctx, p);
}

static void hook_gone(const pw_outset *s, const char *p)
{
    if (s->hooks && s->hooks->gone)
        s->hooks->gone(s->hooks->ctx, p);
}

/* splitmix64: only for unpredictable-enough temporary names; O_EXCL guarantees uniqueness. */
static uint64_t next_random(pw_outset *s)
{
    uint64_t z = (s->rng += 0x9E3779B97F4A7C15ull);
    z = (z ^ (z >> 30)) * 0xBF58476D1CE4E5B9ull;
    z = (z ^ (z >> 27)) * 0x94D049BB133111EBull;
    return z ^ (z >> 31);
}

/* "<base>.tmpXXXXXX" in a fresh malloc'd string, or NULL. */
static char *temp_name(pw_outset *s, const char *base)
{
    static const char chars[] = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789";
    size_t n = strlen(base);
    char *t = malloc(n + 11);
    if (!t)
        return NULL;
    memcpy(t, base, n);
    memcpy(t + n, ".tmp", 4);
    uint64_t r = next_random(s);
    for (int i = 0; i < 6; i++) {
        t[n + 4 + (size_t)i] = chars[r % 62];
        r /= 62;
    }
    t[n + 10] = '\0';
    return t;
}

pw_status pw_outset_new(bool force, const pw_tmp_hooks *hooks, pw_outset **out, pw_error *err)
{
    *out = NULL;
    pw_outset *s = calloc(1, sizeof *s);
    if (!s)
        return pw_error_set(err, PW_ENOMEM, NULL, 0, "out of memory");
    s->force = force;
    s->hooks = hooks;
    struct timespec ts;
    clock_gettime(CLOCK_REALTIME, &ts);
    s->rng = (uint64_t)ts.tv_nsec ^ ((uint64_t)ts.tv_sec << 20) ^ ((uint64_t)getpid() << 40) ^
             (uint64_t)(uintptr_t)s;
    *out = s;
    return PW_OK;
}

pw_status pw_outset_protect(pw_outset *s, const char *input_path, pw_error *err)
{
    struct stat st;
    if (!input_path || stat(input_path, &st) != 0)
        return PW_OK;
    if (!grow((void **)&s->in, &s->cap_in, s->n_in + 1, sizeof *s->in))
        return pw_error_set(err, PW_ENOMEM, input_path, 0, "out of memory");
    char *p = dup_str(input_path);
    if (!p)
        return pw_error_set(err, PW_ENOMEM, input_path, 0, "out of memory");
    s->in[s->n_in++] = (protected_input){.dev = st.st_dev, .ino = st.st_ino, .path = p};
    return PW_OK;
}

pw_status pw_outset_check(const pw_outset *s, const char *path, pw_error *err)
{
    if (!path || !path[0])
        return pw_error_set(err, PW_EINVAL, NULL, 0, "empty output file name");
    for (size_t i = 0; i < s->n; i++)
        if (!strcmp(s->e[i].target, path))
            return pw_error_set(err, PW_EINVAL, path, 0, "the same output file is named twice");
    struct stat lst, st;
    if (lstat(path, &lst) != 0)
        return PW_OK; /* a new file (a missing folder is reported when writing) */
    if (stat(path, &st) == 0) {
        for (size_t i = 0; i < s->n_in; i++)
            if (st.st_dev == s->in[i].dev && st.st_ino == s->in[i].ino)
                return strcmp(path, s->in[i].path) == 0
                           ? pw_error_set(err, PW_EINVAL, path, 0,
                                          "is an input of this command; refusing to write over "
                                          "an input, with or without --force")
                           : pw_error_set(err, PW_EINVAL, path, 0,
                                          "is the input %s under another name (a hard or symbolic "
                                          "link); refusing to write over an input, with or "
                                          "without --force",
                                          s->in[i].path);
        if (S_ISDIR(st.st_mode))
            return pw_error_set(err, PW_EINVAL, path, 0,
                                "is a folder (expected the name of a file to write)");
    }
    if (!s->force)
        return pw_error_set(err, PW_EEXIST, path, 0, EXISTS_MSG);
    return PW_OK;
}

pw_status pw_outset_mkdir(pw_outset *s, const char *dir, pw_error *err)
{
    struct stat st;
    if (stat(dir, &st) == 0)
        return S_ISDIR(st.st_mode) ? PW_OK
                                   : pw_error_set(err, PW_EIO, dir, 0,
                                                  "exists and is not a folder (expected a folder)");
    if (!grow((void **)&s->dirs, &s->cap_dirs, s->n_dirs + 1, sizeof *s->dirs))
        return pw_error_set(err, PW_ENOMEM, dir, 0, "out of memory");
    char *copy = dup_str(dir);
    if (!copy)
        return pw_error_set(err, PW_ENOMEM, dir, 0, "out of memory");
    hook_made(s, copy); /* hooks may remove it (an empty folder) if interrupted */
    if (mkdir(dir, 0777) != 0) {
        int e = errno;
        hook_gone(s, copy);
        free(copy);
        if (e == EEXIST && stat(dir, &st) == 0 && S_ISDIR(st.st_mode))
            return PW_OK;
        return pw_error_set(err, PW_EIO, dir, 0, "cannot create the folder: %s", strerror(e));
    }
    s->dirs[s->n_dirs++] = copy;
    return PW_OK;
}

static pw_status write_all(int fd, const char *text, size_t len)
{
    size_t done = 0;
    while (done < len) {
        ssize_t w = write(fd, text + done, len - done);
        if (w < 0 && errno == EINTR)
            continue;
        if (w <= 0) {
            if (w == 0)
                errno = EIO;
            return PW_EIO;
        }
        done += (size_t)w;
    }
    return PW_OK;
}

/* Removes a temporary file of the set and tells the hooks; frees the name. */
static void drop_temp(const pw_outset *s, char **name)
{
    if (!*name)
        return;
    unlink(*name);
    hook_gone(s, *name);
    free(*name);
    *name = NULL;
}

/* Where a producer's pieces go: a buffer in front of the temporary file, so that many small
 * pieces cost few system calls and no piece is kept after it was written. */
#define SINK_BUF 65536

typedef struct file_sink {
    int fd;
    char *buf;
    size_t n;
    int saved; /* errno of the first failed write */
} file_sink;

static pw_status sink_flush(file_sink *k)
{
    if (k->n == 0)
        return PW_OK;
    pw_status st = write_all(k->fd, k->buf, k->n);
    if (st != PW_OK)
        k->saved = errno;
    k->n = 0;
    return st;
}

static pw_status sink_emit(void *sink, const char *text, size_t len)
{
    file_sink *k = sink;
    if (k->saved)
        return PW_EIO;
    if (k->n + len > SINK_BUF) {
        if (sink_flush(k) != PW_OK)
            return PW_EIO;
        if (len >= SINK_BUF) { /* a large piece goes straight through */
            if (write_all(k->fd, text, len) != PW_OK) {
                k->saved = errno;
                return PW_EIO;
            }
            return PW_OK;
        }
    }
    memcpy(k->buf + k->n, text, len);
    k->n += len;
    return PW_OK;
}

typedef struct whole_text {
    const char *text;
    size_t len;
} whole_text;

static pw_status emit_whole(void *ctx, pw_outset_emit emit, void *sink)
{
    const whole_text *w = ctx;
    return emit(sink, w->text, w->len);
}

pw_status pw_outset_add(pw_outset *s, const char *path, const char *text, size_t len,
                        pw_error *err)
{
    whole_text w = {text, len};
    return pw_outset_add_stream(s, path, emit_whole, &w, err);
}

pw_status pw_outset_add_stream(pw_outset *s, const char *path, pw_outset_producer produce,
                               void *ctx, pw_error *err)
{
    pw_status st = pw_outset_check(s, path, err);
    if (st != PW_OK)
        return st;
    if (strlen(path) >= PW_PATH_MAX)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "output path too long (at most %d bytes)",
                            PW_PATH_MAX - 1);
    if (!grow((void **)&s->e, &s->cap, s->n + 1, sizeof *s->e))
        return pw_error_set(err, PW_ENOMEM, path, 0, "out of memory");
    out_entry e = {.target = dup_str(path)};
    if (!e.target)
        return pw_error_set(err, PW_ENOMEM, path, 0, "out of memory");
    int fd = -1, saved = 0;
    for (int attempt = 0; attempt < 100 && fd < 0; attempt++) {
        e.tmp = temp_name(s, path);
        if (!e.tmp) {
            free(e.target);
            return pw_error_set(err, PW_ENOMEM, path, 0, "out of memory");
        }
        hook_made(s, e.tmp); /* before it exists: an interruption from here on can remove it */
        fd = open(e.tmp, O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC | O_NOFOLLOW, 0666);
        if (fd < 0) {
            saved = errno;
            hook_gone(s, e.tmp);
            free(e.tmp);
            e.tmp = NULL;
            if (saved != EEXIST)
                break;
        }
    }
    if (fd < 0) {
        free(e.target);
        return pw_error_set(err, PW_EIO, path, 0, "cannot create a file beside it: %s",
                            strerror(saved));
    }
    file_sink k = {.fd = fd, .buf = malloc(SINK_BUF)};
    st = k.buf ? produce(ctx, sink_emit, &k) : PW_ENOMEM;
    if (st == PW_OK)
        st = sink_flush(&k);
    free(k.buf);
    saved = k.saved;
    if (st == PW_OK && fsync(fd) != 0) {
        st = PW_EIO;
        saved = errno;
    }
    if (close(fd) != 0 && st == PW_OK) {
        st = PW_EIO;
        saved = errno;
    }
    if (st != PW_OK) {
        drop_temp(s, &e.tmp);
        free(e.target);
        if (st == PW_EIO && saved)
            return pw_error_set(err, PW_EIO, path, 0, "write failed: %s", strerror(saved));
        return pw_error_set(err, st, path, 0, "%s",
                            st == PW_ENOMEM ? "out of memory" : pw_strerror(st));
    }
    s->e[s->n++] = e;
    return PW_OK;
}

/* Puts back what commit did to entries [0, upto), newest first. */
static void roll_back(pw_outset *s, size_t upto)
{
    for (size_t k = upto; k-- > 0;) {
        out_entry *e = &s->e[k];
        if (!e->placed)
            continue;
        if (e->backup) {
            if (rename(e->backup, e->target) == 0) {
                hook_gone(s, e->backup);
                free(e->backup);
                e->backup = NULL;
            }
        } else if (!e->replaced) {
            unlink(e->target);
        } /* else: replaced on a file system without hard links; the old text is gone */
        e->placed = false;
    }
}

static bool no_hard_links(int e)
{
    return e == EPERM || e == ENOTSUP || e == EOPNOTSUPP || e == ENOSYS || e == EXDEV;
}

/* Keeps the file at e->target as a hard link under a temporary name. */
static pw_status keep_old(pw_outset *s, out_entry *e, int *saved)
{
    for (int attempt = 0; attempt < 100; attempt++) {
        char *b = temp_name(s, e->target);
        if (!b) {
            *saved = ENOMEM;
            return PW_ENOMEM;
        }
        hook_made(s, b);
        if (link(e->target, b) == 0) {
            e->backup = b;
            return PW_OK;
        }
        *saved = errno;
        hook_gone(s, b);
        free(b);
        if (*saved != EEXIST)
            return PW_EIO;
    }
    return PW_EIO;
}

static pw_status place(pw_outset *s, out_entry *e, pw_error *err)
{
    struct stat lst;
    int saved = 0;
    if (lstat(e->target, &lst) == 0) {
        pw_status st = pw_outset_check(&(pw_outset){.force = s->force, .in = s->in,
                                                    .n_in = s->n_in},
                                       e->target, err);
        if (st != PW_OK)
            return st;
        st = keep_old(s, e, &saved);
        if (st != PW_OK && !no_hard_links(saved))
            return pw_error_set(err, st, e->target, 0,
                                "cannot keep the old file while replacing it: %s",
                                strerror(saved));
        e->replaced = true;
        /* without hard links the old file cannot be put back if a later file fails */
        if (rename(e->tmp, e->target) != 0) {
            saved = errno;
            if (e->backup) {
                unlink(e->backup);
                hook_gone(s, e->backup);
                free(e->backup);
                e->backup = NULL;
            }
            return pw_error_set(err, PW_EIO, e->target, 0,
                                "cannot move the new file into place: %s", strerror(saved));
        }
        hook_gone(s, e->tmp);
    } else {
        if (link(e->tmp, e->target) != 0) {
            saved = errno;
            if (saved == EEXIST)
                return pw_error_set(err, PW_EEXIST, e->target, 0, EXISTS_MSG);
            if (!no_hard_links(saved) || lstat(e->target, &lst) == 0 ||
                rename(e->tmp, e->target) != 0)
                return pw_error_set(err, PW_EIO, e->target, 0,
                                    "cannot move the new file into place: %s", strerror(saved));
            hook_gone(s, e->tmp);
        } else {
            drop_temp(s, &e->tmp);
        }
    }
    if (e->tmp) {
        free(e->tmp);
        e->tmp = NULL;
    }
    e->placed = true;
    return PW_OK;
}

/* Makes the new names durable: fsync of the folder that holds path (best effort; a folder that
 * cannot be opened or synced changes nothing already done). */
static void sync_folder(const char *path)
{
    char d[PW_PATH_MAX];
    const char *slash = strrchr(path, '/');
    if (!slash)
        snprintf(d, sizeof d, ".");
    else if (slash == path)
        snprintf(d, sizeof d, "/");
    else
        snprintf(d, sizeof d, "%.*s", (int)(slash - path), path);
    int fd = open(d, O_RDONLY | O_DIRECTORY | O_CLOEXEC);
    if (fd >= 0) {
        fsync(fd);
        close(fd);
    }
}

pw_status pw_outset_commit(pw_outset *s, pw_error *err)
{
    for (size_t i = 0; i < s->n; i++) {
        pw_status st = place(s, &s->e[i], err);
        if (st != PW_OK) {
            roll_back(s, i);
            for (size_t k = 0; k < s->n; k++) {
                drop_temp(s, &s->e[k].tmp);
                free(s->e[k].target);
                if (s->e[k].backup) /* could not be renamed back: it holds the old text, keep it */
                    hook_gone(s, s->e[k].backup);
                free(s->e[k].backup);
            }
            s->n = 0;
            return st;
        }
    }
    for (size_t i = 0; i < s->n; i++) {
        drop_temp(s, &s->e[i].backup);
        sync_folder(s->e[i].target);
        free(s->e[i].target);
    }
    s->n = 0;
    s->committed = true;
    return PW_OK;
}

void pw_outset_free(pw_outset *s)
{
    if (!s)
        return;
    for (size_t i = 0; i < s->n; i++) {
        drop_temp(s, &s->e[i].tmp);
        free(s->e[i].backup);
        free(s->e[i].target);
    }
    for (size_t k = s->n_dirs; k-- > 0;) {
        if (!s->committed)
            rmdir(s->dirs[k]);
        hook_gone(s, s->dirs[k]);
        free(s->dirs[k]);
    }
    for (size_t i = 0; i < s->n_in; i++)
        free(s->in[i].path);
    free(s->e);
    free(s->in);
    free(s->dirs);
    free(s);
}
