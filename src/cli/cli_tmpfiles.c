/* The program's registry of temporary output files (and of the folders made for outputs), so that an interrupted run (SIGINT, SIGTERM,
 * SIGHUP) leaves none behind. The library tells the registry about every temporary file through
 * the pw_tmp_hooks it is given (see pinchwise/fileio.h); the registry belongs to the program, not
 * to the library, which keeps no global state.
 *
 * The signal handler only reads lock-free atomics, calls unlink(), restores the default action
 * and raises the signal again: all async-signal-safe (POSIX.1-2017, 2.4.3). A slot is published
 * (state READY) only after its path is complete, and withdrawn before it is reused. */
#include "cli.h"

#include <signal.h>
#include <stdatomic.h>
#include <string.h>
#include <unistd.h>

/* More than any command holds at once: a report with --force has at most 2 * (1 + 2 * 12)
 * temporary files (page, plots and curves, each with the kept old file) and two folders. */
#define TMP_SLOTS 256
#define TMP_PATH (PW_PATH_MAX + 32)

enum { SLOT_FREE, SLOT_BUSY, SLOT_READY };

typedef struct tmp_slot {
    atomic_int state;
    char path[TMP_PATH];
} tmp_slot;

static tmp_slot slots[TMP_SLOTS];

static void made(void *ctx, const char *path)
{
    (void)ctx;
    size_t n = strlen(path);
    if (n >= TMP_PATH)
        return; /* cannot happen: output paths are shorter than PW_PATH_MAX */
    for (size_t i = 0; i < TMP_SLOTS; i++) {
        int expect = SLOT_FREE;
        if (atomic_compare_exchange_strong(&slots[i].state, &expect, SLOT_BUSY)) {
            memcpy(slots[i].path, path, n + 1);
            atomic_store(&slots[i].state, SLOT_READY);
            return;
        }
    }
    /* more than TMP_SLOTS temporary files at once: this one is not covered */
}

static void gone(void *ctx, const char *path)
{
    (void)ctx;
    for (size_t i = 0; i < TMP_SLOTS; i++) {
        if (atomic_load(&slots[i].state) != SLOT_READY || strcmp(slots[i].path, path) != 0)
            continue;
        int expect = SLOT_READY;
        if (atomic_compare_exchange_strong(&slots[i].state, &expect, SLOT_BUSY)) {
            slots[i].path[0] = '\0';
            atomic_store(&slots[i].state, SLOT_FREE);
            return;
        }
    }
}

static const pw_tmp_hooks hooks = {.made = made, .gone = gone, .ctx = NULL};

const pw_tmp_hooks *cli_tmp_hooks(void)
{
    return &hooks;
}

static void on_signal(int sig)
{
    /* files first, then the folders an output set created (empty once their files are gone) */
    for (size_t i = 0; i < TMP_SLOTS; i++)
        if (atomic_load(&slots[i].state) == SLOT_READY)
            unlink(slots[i].path);
    for (size_t i = TMP_SLOTS; i-- > 0;)
        if (atomic_load(&slots[i].state) == SLOT_READY)
            rmdir(slots[i].path);
    signal(sig, SIG_DFL);
    raise(sig);
}

void cli_install_signal_cleanup(void)
{
    static const int sigs[] = {SIGINT, SIGTERM, SIGHUP};
    for (size_t i = 0; i < sizeof sigs / sizeof sigs[0]; i++) {
        struct sigaction old;
        /* keep a signal the invoking shell set to be ignored (e.g. nohup) ignored */
        if (sigaction(sigs[i], NULL, &old) == 0 && old.sa_handler == SIG_IGN)
            continue;
        struct sigaction sa;
        memset(&sa, 0, sizeof sa);
        sa.sa_handler = on_signal;
        sigemptyset(&sa.sa_mask);
        for (size_t k = 0; k < sizeof sigs / sizeof sigs[0]; k++)
            sigaddset(&sa.sa_mask, sigs[k]);
        sigaction(sigs[i], &sa, NULL);
    }
}
