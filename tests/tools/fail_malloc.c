/* Test helper, preloaded into the program (LD_PRELOAD) by tests/cli/test_files.sh: once the
 * program has called fsync() (that is, once its output file is written) and then made
 * $PW_TEST_MALLOC_GRACE more allocations (default 0), every malloc, calloc and realloc fails;
 * with $PW_TEST_MALLOC_ONLY_ONE set, only that one allocation fails and later ones succeed. The program must then report the failure instead of printing a JSON object
 * that lacks keys. glibc only (__libc_malloc and friends); not for sanitizer builds. */
#define _GNU_SOURCE
#include <stdatomic.h>
#include <stddef.h>
#include <stdlib.h>
#include <sys/syscall.h>
#include <unistd.h>

extern void *__libc_malloc(size_t);
extern void *__libc_calloc(size_t, size_t);
extern void *__libc_realloc(void *, size_t);

static atomic_bool armed;
static atomic_long grace;
static atomic_bool only_one;

int fsync(int fd)
{
    long rc = syscall(SYS_fsync, fd);
    if (!atomic_load(&armed)) {
        const char *g = getenv("PW_TEST_MALLOC_GRACE");
        atomic_store(&grace, g ? strtol(g, NULL, 10) : 0);
        atomic_store(&only_one, getenv("PW_TEST_MALLOC_ONLY_ONE") != NULL);
        atomic_store(&armed, 1);
    }
    return (int)rc;
}

static int fail_now(void)
{
    if (!atomic_load(&armed))
        return 0;
    long left = atomic_fetch_sub(&grace, 1);
    return atomic_load(&only_one) ? left == 0 : left <= 0;
}

void *malloc(size_t n)
{
    return fail_now() ? NULL : __libc_malloc(n);
}

void *calloc(size_t n, size_t m)
{
    return fail_now() ? NULL : __libc_calloc(n, m);
}

void *realloc(void *p, size_t n)
{
    return fail_now() ? NULL : __libc_realloc(p, n);
}
