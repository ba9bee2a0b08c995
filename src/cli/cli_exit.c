/* The program's exit codes: the one table (documented in docs/exit-codes.md, which lists the
 * same rows). The library reports a pw_status; only the program turns it into an exit code. */
#include "cli.h"

int pw_status_exit_code(pw_status status)
{
    switch (status) {
    case PW_OK:
        return PW_EXIT_OK;
    case PW_EINVAL:
        return PW_EXIT_USAGE;
    case PW_EPARSE:
    case PW_ENOTFOUND:
    case PW_ETOOFEW:
        return PW_EXIT_INPUT;
    case PW_EIO:
    case PW_EEXIST:
        return PW_EXIT_FILE;
    case PW_ENOMEM:
        return PW_EXIT_MEMORY;
    case PW_EDOM:
    case PW_ERANGE:
    case PW_ENOBRACKET:
    case PW_EMAXITER:
    case PW_ENOCONV:
    case PW_ESINGULAR:
        return PW_EXIT_NUMERIC;
    case PW_EINFEASIBLE:
        return PW_EXIT_INFEASIBLE;
    case PW_STATUS_COUNT:
        break;
    }
    return PW_EXIT_OTHER;
}
