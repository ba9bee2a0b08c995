#include "cli.h"

/* Placeholder until the reflux command lands: refuses to run rather than print anything. */
int pw_cli_reflux(int argc, char **argv)
{
    (void)argc;
    (void)argv;
    return pw_cli_failf("reflux", 1, "this command is not available in this build yet");
}
