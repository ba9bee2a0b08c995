#include "cli.h"

/* Placeholder until the report command lands: refuses to run rather than print anything. */
int pw_cli_report(int argc, char **argv)
{
    (void)argc;
    (void)argv;
    return pw_cli_failf("report", 1, "this command is not available in this build yet");
}
