/* Private header of the command-line program. */
#ifndef PW_CLI_H
#define PW_CLI_H

#include <pinchwise/status.h>

#define PW_EXIT_USAGE 2

typedef struct pw_cli_command {
    const char *name;
    const char *summary;
    int (*run)(int argc, char **argv);
} pw_cli_command;

int pw_cli_fit(int argc, char **argv);

#endif
