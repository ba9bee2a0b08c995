#include "cli.h"

#include <stdio.h>

int pw_cli_fit(int argc, char **argv)
{
    (void)argc;
    (void)argv;
    fprintf(stderr, "pinchwise fit: not built yet\n");
    return 1;
}
