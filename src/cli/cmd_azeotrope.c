#include "cli.h"

/* Placeholder until the azeotrope command lands: refuses to run rather than print anything. */
int pw_cli_azeotrope(int argc, char **argv)
{
    (void)argc;
    (void)argv;
    return pw_cli_failf("azeotrope", 1, "this command is not available in this build yet");
}
