#include "cli.h"

/* Placeholder until the check command lands: refuses to run rather than print anything. */
int pw_cli_check(int argc, char **argv)
{
    (void)argc;
    (void)argv;
    return pw_cli_failf("check", 1, "this command is not available in this build yet");
}
