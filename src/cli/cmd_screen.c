#include "cli.h"

/* Placeholder until the screen command lands: refuses to run rather than print anything. */
int pw_cli_screen(int argc, char **argv)
{
    (void)argc;
    (void)argv;
    return pw_cli_failf("screen", 1, "this command is not available in this build yet");
}
