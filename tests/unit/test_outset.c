/* Output sets and input files (pinchwise/fileio.h): all or none, never over an input (by
 * identity), the umask, temporary files announced to the hooks and never left behind, folders
 * removed when not committed, non-regular inputs refused at once; a failed allocation in the fit
 * is an error; libcsv fields longer than its growth step survive every chunking. The checks are
 * identities of the file system (POSIX.1-2017 link(), rename(), stat()), no published values. */
#include "pw_test.h"

#include "data/csvrows.h"

#include <dirent.h>
#include <fcntl.h>
#include <pinchwise/dataset.h>
#include <pinchwise/fileio.h>
#include <pinchwise/fit.h>
#include <pinchwise/model.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

typedef struct hook_count {
    int made, gone, live, max_live;
} hook_count;

static void on_made(void *ctx, const char *p)
{
    (void)p;
    hook_count *h = ctx;
    h->made++;
    if (++h->live > h->max_live)
        h->max_live = h->live;
}

static void on_gone(void *ctx, const char *p)
{
    (void)p;
    hook_count *h = ctx;
    h->gone++;
    h->live--;
}

static char dir[256];

static int setup(void **state)
{
    (void)state;
    snprintf(dir, sizeof dir, "/tmp/pw_outset_XXXXXX");
    return mkdtemp(dir) ? 0 : -1;
}

static int teardown(void **state)
{
    (void)state;
    char cmd[300];
    snprintf(cmd, sizeof cmd, "rm -rf '%s'", dir);
    return system(cmd) == 0 ? 0 : -1;
}

static const char *at(char *buf, const char *name)
{
    snprintf(buf, 512, "%s/%s", dir, name);
    return buf;
}

static void put(const char *name, const char *text)
{
    char p[512];
    FILE *f = fopen(at(p, name), "w");
    assert_non_null(f);
    fputs(text, f);
    fclose(f);
}

static char *get(const char *name)
{
    static char buf[256];
    char p[512];
    FILE *f = fopen(at(p, name), "r");
    if (!f)
        return NULL;
    size_t n = fread(buf, 1, sizeof buf - 1, f);
    buf[n] = '\0';
    fclose(f);
    return buf;
}

/* Entries of the folder whose name holds ".tmp" (temporary files of the sets). */
static int temps_left(const char *d)
{
    DIR *h = opendir(d);
    assert_non_null(h);
    int n = 0;
    struct dirent *e;
    while ((e = readdir(h)))
        n += strstr(e->d_name, ".tmp") != NULL;
    closedir(h);
    return n;
}

static void commit_writes_every_file_with_the_umask(void **state)
{
    (void)state;
    mode_t old = umask(027);
    hook_count h = {0};
    pw_tmp_hooks hooks = {on_made, on_gone, &h};
    pw_outset *s = NULL;
    char a[512], b[512];
    assert_int_equal(pw_outset_new(false, &hooks, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, at(a, "a.txt"), "alpha", 5, NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, at(b, "b.txt"), "beta", 4, NULL), PW_OK);
    assert_int_equal(h.live, 2); /* both temporaries exist and are announced */
    assert_null(get("a.txt"));   /* nothing in place before commit */
    assert_int_equal(pw_outset_commit(s, NULL), PW_OK);
    pw_outset_free(s);
    umask(old);
    assert_string_equal(get("a.txt"), "alpha");
    assert_string_equal(get("b.txt"), "beta");
    struct stat st;
    assert_int_equal(stat(a, &st), 0);
    assert_int_equal(st.st_mode & 0777, 0640);
    assert_int_equal(h.live, 0);
    assert_int_equal(h.made, h.gone);
    assert_int_equal(temps_left(dir), 0);
    /* a one-file write obeys the umask as well */
    old = umask(077);
    assert_int_equal(pw_atomic_write(at(a, "c.txt"), "c", 1, false, NULL), PW_OK);
    umask(old);
    assert_int_equal(stat(a, &st), 0);
    assert_int_equal(st.st_mode & 0777, 0600);
}

static void existing_target_without_force_changes_nothing(void **state)
{
    (void)state;
    put("keep.txt", "old");
    pw_outset *s = NULL;
    pw_error err;
    char p[512];
    assert_int_equal(pw_outset_new(false, NULL, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_check(s, at(p, "keep.txt"), &err), PW_EEXIST);
    assert_int_equal(pw_outset_add(s, at(p, "keep.txt"), "new", 3, &err), PW_EEXIST);
    assert_non_null(strstr(err.msg, "file exists"));
    pw_outset_free(s);
    assert_string_equal(get("keep.txt"), "old");
    assert_int_equal(temps_left(dir), 0);
}

static void failed_commit_puts_every_file_back(void **state)
{
    (void)state;
    hook_count h = {0};
    pw_tmp_hooks hooks = {on_made, on_gone, &h};
    put("one.txt", "old one");
    pw_outset *s = NULL;
    pw_error err;
    char p[512];
    /* with force: one.txt is replaced, two.txt is new, three.txt turns into a folder after
     * staging, so its move fails: one.txt must hold its old text again, two.txt must be gone */
    assert_int_equal(pw_outset_new(true, &hooks, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, at(p, "one.txt"), "new one", 7, NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, at(p, "two.txt"), "new two", 7, NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, at(p, "three.txt"), "new three", 9, NULL), PW_OK);
    assert_int_equal(mkdir(at(p, "three.txt"), 0700), 0);
    assert_int_not_equal(pw_outset_commit(s, &err), PW_OK);
    assert_non_null(strstr(err.msg, "is a folder"));
    pw_outset_free(s);
    assert_string_equal(get("one.txt"), "old one");
    assert_null(get("two.txt"));
    assert_int_equal(temps_left(dir), 0);
    assert_int_equal(h.live, 0);
    assert_int_equal(h.made, h.gone);
    assert_int_equal(rmdir(at(p, "three.txt")), 0);

    /* without force: a target that appears between staging and commit stops the commit, and the
     * file already placed is removed again; the file that appeared is left as it is */
    assert_int_equal(pw_outset_new(false, &hooks, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, at(p, "four.txt"), "new four", 8, NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, at(p, "five.txt"), "new five", 8, NULL), PW_OK);
    put("five.txt", "someone else's");
    assert_int_equal(pw_outset_commit(s, &err), PW_EEXIST);
    pw_outset_free(s);
    assert_null(get("four.txt"));
    assert_string_equal(get("five.txt"), "someone else's");
    assert_int_equal(temps_left(dir), 0);
    assert_int_equal(h.live, 0);
}

static void inputs_are_refused_by_identity(void **state)
{
    (void)state;
    put("input.csv", "measured data");
    char in[512], hard[512], sym[512], other[512];
    assert_int_equal(link(at(in, "input.csv"), at(hard, "hard.json")), 0);
    assert_int_equal(symlink(at(in, "input.csv"), at(sym, "sym.json")), 0);
    for (int force = 0; force < 2; force++) {
        pw_outset *s = NULL;
        pw_error err;
        assert_int_equal(pw_outset_new(force, NULL, &s, NULL), PW_OK);
        assert_int_equal(pw_outset_protect(s, in, NULL), PW_OK);
        assert_int_equal(pw_outset_protect(s, at(other, "does-not-exist.csv"), NULL), PW_OK);
        assert_int_equal(pw_outset_protect(s, NULL, NULL), PW_OK);
        const char *targets[] = {in, hard, sym};
        for (int k = 0; k < 3; k++) {
            assert_int_equal(pw_outset_check(s, targets[k], &err), PW_EINVAL);
            assert_non_null(strstr(err.msg, "refusing to write over an input"));
            assert_int_equal(pw_outset_add(s, targets[k], "fit", 3, &err), PW_EINVAL);
        }
        /* the same target twice in one set */
        assert_int_equal(pw_outset_add(s, at(other, "x.json"), "x", 1, NULL), PW_OK);
        assert_int_equal(pw_outset_add(s, other, "y", 1, &err), PW_EINVAL);
        pw_outset_free(s);
    }
    assert_string_equal(get("input.csv"), "measured data");
    struct stat st;
    assert_int_equal(lstat(sym, &st), 0);
    assert_true(S_ISLNK(st.st_mode));
    assert_int_equal(temps_left(dir), 0);
}

static void folders_made_go_unless_committed(void **state)
{
    (void)state;
    hook_count h = {0};
    pw_tmp_hooks hooks = {on_made, on_gone, &h};
    char d[512], f[512];
    pw_outset *s = NULL;
    assert_int_equal(pw_outset_new(false, &hooks, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_mkdir(s, at(d, "plots"), NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, at(f, "plots/a.svg"), "<svg/>", 6, NULL), PW_OK);
    pw_outset_free(s); /* not committed */
    struct stat st;
    assert_int_not_equal(stat(d, &st), 0);
    assert_int_equal(h.live, 0);
    assert_int_equal(pw_outset_new(false, &hooks, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_mkdir(s, d, NULL), PW_OK);
    assert_int_equal(pw_outset_add(s, f, "<svg/>", 6, NULL), PW_OK);
    assert_int_equal(pw_outset_commit(s, NULL), PW_OK);
    pw_outset_free(s);
    assert_int_equal(stat(f, &st), 0);
    assert_int_equal(h.live, 0);
    /* a file where a folder is wanted */
    put("notdir", "x");
    assert_int_equal(pw_outset_new(false, NULL, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_mkdir(s, at(d, "notdir"), NULL), PW_EIO);
    assert_int_equal(pw_outset_commit(s, NULL), PW_OK); /* an empty set */
    pw_outset_free(s);
}

static void non_regular_inputs_are_refused_at_once(void **state)
{
    (void)state;
    char fifo[512];
    assert_int_equal(mkfifo(at(fifo, "pipe.csv"), 0600), 0);
    char *buf = NULL;
    size_t len = 0;
    pw_error err;
    /* a FIFO without a writer: open() would block without O_NONBLOCK (ctest's timeout) */
    assert_int_equal(pw_read_file(fifo, 1000, &buf, &len, &err), PW_EIO);
    assert_non_null(strstr(err.msg, "not a regular file"));
    assert_int_equal(pw_read_file(dir, 1000, &buf, &len, &err), PW_EIO);
    assert_non_null(strstr(err.msg, "a folder"));
    pw_dataset ds;
    assert_int_equal(pw_dataset_read(fifo, &ds, &err), PW_EIO);
    pw_fit_result r;
    assert_int_equal(pw_fitfile_read(fifo, &r, &err), PW_EIO);
    assert_null(buf);
}

static void start_allocation_failure_is_an_error(void **state)
{
    (void)state;
    char p[512];
    pw_dataset ds;
    assert_int_equal(pw_dataset_read(pw_test_path(p, sizeof p, "datasets/demo_acetone_water.csv"),
                                     &ds, NULL),
                     PW_OK);
    pw_component c1 = pw_test_svna("acetone"), c2 = pw_test_svna("water");
    pw_fit_options o = pw_fit_default_options();
    o.n_starts = (size_t)-1; /* cannot be allocated: sizeof(start) * n overflows */
    pw_fit_result r;
    pw_error err;
    assert_int_equal(pw_fit_run(&ds, &c1, &c2, pw_model_find("nrtl"), &o, &r, &err), PW_ENOMEM);
    pw_dataset_free(&ds);
}

static pw_status keep_row(void *ctx, char **f, size_t n, long line, pw_error *err)
{
    (void)err;
    char **rows = ctx;
    static char tag[64];
    snprintf(tag, sizeof tag, "%ld:%zu:%zu:%c%c", line, n, strlen(f[n - 1]), f[n - 1][0],
             f[n - 1][strlen(f[n - 1]) ? strlen(f[n - 1]) - 1 : 0]);
    size_t used = strlen(*rows);
    snprintf(*rows + used, 512 - used, "%s|", tag);
    return PW_OK;
}

/* A quoted field of 3 MiB with a doubled quote and a newline inside it, around the 1 MiB steps in
 * which csvrows grows libcsv's buffer: the same rows and line numbers at every chunking. */
static void long_fields_survive_every_chunking(void **state)
{
    (void)state;
    size_t big = 3u << 20;
    char *text = malloc(big + 64);
    assert_non_null(text);
    size_t n = (size_t)sprintf(text, "a,b\n1,\"");
    for (size_t i = 0; i < big; i++)
        text[n + i] = 'x';
    text[n + (1u << 20)] = '\n';                     /* a newline inside the field */
    memcpy(text + n + (1u << 20) + 5, "\"\"", 2);    /* an escaped quote */
    text[n + big - 1] = 'y';
    n += big;
    n += (size_t)sprintf(text + n, "\"\n3,4\n");
    char want[512] = "", got[512];
    const size_t chunks[] = {0, 7, (1u << 20) - 1, 1u << 20, (1u << 20) + 1, 3u << 20};
    for (size_t k = 0; k < sizeof chunks / sizeof chunks[0]; k++) {
        got[0] = '\0';
        char *g = got;
        pw_csvrows r;
        assert_int_equal(pw_csvrows_init(&r, "long.csv", NULL, keep_row, &g, NULL), PW_OK);
        assert_int_equal(pw_csvrows_feed_all(&r, text, n, chunks[k]), PW_OK);
        pw_csvrows_free(&r);
        if (k == 0) {
            /* header on line 1; the long row on line 2 (3 MiB - 1 characters once the doubled
             * quote is one); the last row on line 4, after the newline inside the field */
            snprintf(want, sizeof want, "1:2:1:bb|2:2:%zu:xy|4:2:1:44|", big - 1);
            assert_string_equal(got, want);
        }
        assert_string_equal(got, want);
    }
    free(text);
}

/* A file made piece by piece: small pieces, one larger than the writer's buffer, empty ones;
 * the file is their concatenation, byte for byte. */
typedef struct pieces {
    const char *text;
    size_t len;
    const size_t *cuts; /* piece lengths, in order, summing to len */
    size_t n_cuts;
    pw_status fail; /* returned after the second piece when not PW_OK */
} pieces;

static pw_status produce_pieces(void *ctx, pw_outset_emit emit, void *sink)
{
    const pieces *p = ctx;
    size_t at = 0;
    for (size_t k = 0; k < p->n_cuts; k++) {
        pw_status st = emit(sink, p->text + at, p->cuts[k]);
        if (st != PW_OK)
            return st;
        at += p->cuts[k];
        if (k == 1 && p->fail != PW_OK)
            return p->fail;
    }
    return PW_OK;
}

static void streamed_file_is_the_concatenation(void **state)
{
    (void)state;
    size_t len = 200000;
    char *text = malloc(len);
    assert_non_null(text);
    for (size_t i = 0; i < len; i++)
        text[i] = (char)('a' + (i * 7 + i / 13) % 26);
    const size_t cuts[] = {1, 0, 65535, 1, 2, 100000, 34461}; /* sum 200000 */
    pieces p = {text, len, cuts, sizeof cuts / sizeof cuts[0], PW_OK};
    pw_outset *s = NULL;
    char a[512];
    assert_int_equal(pw_outset_new(false, NULL, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_add_stream(s, at(a, "s.txt"), produce_pieces, &p, NULL), PW_OK);
    assert_int_equal(pw_outset_commit(s, NULL), PW_OK);
    pw_outset_free(s);
    char *back = NULL;
    size_t n = 0;
    assert_int_equal(pw_read_file(a, len + 1, &back, &n, NULL), PW_OK);
    assert_int_equal(n, len);
    assert_memory_equal(back, text, len);
    free(back);
    free(text);
}

/* A producer that fails leaves no file, no temporary, and its status is returned. */
static void failing_producer_leaves_nothing(void **state)
{
    (void)state;
    const size_t cuts[] = {3, 3, 3};
    pieces p = {"abcdefghi", 9, cuts, 3, PW_ENOMEM};
    pw_outset *s = NULL;
    char a[512];
    pw_error err;
    assert_int_equal(pw_outset_new(false, NULL, &s, NULL), PW_OK);
    assert_int_equal(pw_outset_add_stream(s, at(a, "f.txt"), produce_pieces, &p, &err),
                     PW_ENOMEM);
    assert_non_null(strstr(err.msg, "out of memory"));
    assert_int_equal(temps_left(dir), 0);
    assert_int_equal(pw_outset_commit(s, NULL), PW_OK);
    pw_outset_free(s);
    assert_null(get("f.txt"));
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test_setup_teardown(commit_writes_every_file_with_the_umask, setup, teardown),
        cmocka_unit_test_setup_teardown(existing_target_without_force_changes_nothing, setup,
                                        teardown),
        cmocka_unit_test_setup_teardown(failed_commit_puts_every_file_back, setup, teardown),
        cmocka_unit_test_setup_teardown(inputs_are_refused_by_identity, setup, teardown),
        cmocka_unit_test_setup_teardown(folders_made_go_unless_committed, setup, teardown),
        cmocka_unit_test_setup_teardown(non_regular_inputs_are_refused_at_once, setup, teardown),
        cmocka_unit_test(start_allocation_failure_is_an_error),
        cmocka_unit_test(long_fields_survive_every_chunking),
        cmocka_unit_test_setup_teardown(streamed_file_is_the_concatenation, setup, teardown),
        cmocka_unit_test_setup_teardown(failing_producer_leaves_nothing, setup, teardown),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
