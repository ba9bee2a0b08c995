/* Test helper, preloaded into the program (LD_PRELOAD) by tests/cli/test_files.sh: fsync()
 * first creates the file named by $PW_TEST_FSYNC_MARKER (so that the test knows a temporary
 * output file exists now) and then waits $PW_TEST_FSYNC_DELAY_MS milliseconds, which gives the
 * test time to interrupt the program while its temporary files exist. The first
 * $PW_TEST_FSYNC_SKIP calls (default 0) pass straight through. */
#define _GNU_SOURCE
#include <dlfcn.h>
#include <fcntl.h>
#include <stdlib.h>
#include <time.h>
#include <unistd.h>

int fsync(int fd)
{
    int (*real)(int) = (int (*)(int))dlsym(RTLD_NEXT, "fsync");
    const char *marker = getenv("PW_TEST_FSYNC_MARKER");
    const char *ms = getenv("PW_TEST_FSYNC_DELAY_MS");
    const char *skip = getenv("PW_TEST_FSYNC_SKIP");
    static long calls; /* a test helper: one process, one thread writes */
    if (skip && calls++ < strtol(skip, NULL, 10))
        return real ? real(fd) : 0;
    if (marker) {
        int m = open(marker, O_WRONLY | O_CREAT | O_CLOEXEC, 0600);
        if (m >= 0)
            close(m);
    }
    if (ms) {
        long d = strtol(ms, NULL, 10);
        struct timespec t = {.tv_sec = d / 1000, .tv_nsec = (d % 1000) * 1000000L};
        nanosleep(&t, NULL);
    }
    return real ? real(fd) : 0;
}
