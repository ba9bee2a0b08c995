/* pinchwise decanter: placeholder replaced below. */
#include "cli.h"
int pw_cli_decanter(int argc, char **argv)
{
    (void)argc;
    (void)argv;
    return pw_cli_failf("decanter", 2, "not yet available");
}
