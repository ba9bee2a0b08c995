/* One option parser for every command: each command declares its options in static tables
 * (cli_option), the parser reads argv against them and the --help text is printed from the
 * same tables, so an option cannot be accepted without being listed, nor listed without being
 * accepted.
 *
 * What the parser accepts (GNU long options):
 *   --name VALUE and --name=VALUE (an option that takes a value always takes the next argument,
 *   even when it starts with '-', so "--q -0.2" works); a flag given a value ("--json=1") is
 *   refused; "--" ends the options (everything after it is positional); -h and --help anywhere
 *   ask for the help text; an unknown option is refused with the nearest known name suggested; a
 *   non-repeatable option given twice is refused.
 * Values are checked by kind (cli_kind) with messages that name the option as typed; the
 * parsed value is kept beside the text. Errors are PW_EINVAL with err filled (no file, no line).
 * Nothing here prints except cli_help. */
#ifndef CLI_OPTIONS_H
#define CLI_OPTIONS_H

#include <pinchwise/status.h>
#include <pinchwise/units.h>
#include <stdbool.h>
#include <stddef.h>
#include <stdio.h>

typedef enum cli_kind {
    CLI_FLAG,     /* no value */
    CLI_STRING,   /* any text: a path, a name, a range; the command (or check) reads it */
    CLI_NUMBER,   /* a finite plain decimal; in [lo, hi] when lo < hi ("what" in the message) */
    CLI_INTEGER,  /* a whole number in [lo, hi] (value in .whole and .num) */
    CLI_FRACTION, /* a composition of component 1: a mole fraction in [0, 1], or a number with
                      * mol%, wt or wt% (.num and .basis; cli_composition) */
    CLI_QUANTITY, /* a number with its unit of kind .unit, in SI units in .num */
    CLI_LIST,     /* comma-separated finite numbers, at most CLI_LIST_MAX (.list, .n_list) */
} cli_kind;

#define CLI_LIST_MAX 16

struct cli_value;

typedef struct cli_option {
    const char *name;     /* "--pressure" */
    const char *alias;    /* another accepted spelling, or NULL; listed in the help */
    cli_kind kind;
    const char *metavar;  /* "P", "FILE"; NULL for a flag */
    const char *help;     /* one or more lines separated by '\n', no trailing newline */
    pw_quantity unit;     /* CLI_QUANTITY: the kind of quantity */
    double lo, hi;        /* CLI_NUMBER (when lo < hi), CLI_INTEGER */
    const char *what;     /* CLI_NUMBER with a range: what the value is, for the message */
    bool repeatable;      /* may be given more than once (every occurrence is kept) */
    /* Further check after the kind's own (may be NULL): returns PW_OK or fills err naming the
     * option as typed (value->spelt). */
    pw_status (*check)(struct cli_value *value, pw_error *err);
} cli_option;

/* The end of an option table. */
#define CLI_END {0}

/* A command's interface: its synopsis, its option tables (the shared blocks below and its
 * own), and how many positional arguments it takes. */
typedef struct cli_spec {
    const char *cmd;      /* "reflux" */
    const char *synopsis; /* "usage: ..." and the paragraphs above the option list; '\n' ended */
    const cli_option *const *blocks; /* NULL-terminated list of tables, each CLI_END-ended */
    const char *footer;   /* text after the option list (may be NULL); '\n' ended */
    size_t max_positional;     /* more is refused */
    const char *positional;    /* what they are, for that message: "one fit file" */
} cli_spec;

/* One option as given. */
typedef struct cli_value {
    const cli_option *opt;
    const char *spelt; /* the name as typed (the alias when that was used) */
    const char *text;  /* the value as typed; NULL for a flag */
    double num;        /* NUMBER, INTEGER, FRACTION, QUANTITY (SI) */
    unsigned long long whole; /* INTEGER */
    pw_basis basis;    /* FRACTION */
    double list[CLI_LIST_MAX];
    size_t n_list;     /* LIST */
} cli_value;

#define CLI_MAX_VALUES 64
#define CLI_MAX_POSITIONAL 8

/* What the parser found; the strings point into argv. */
typedef struct cli_args {
    const cli_spec *spec;
    bool help; /* -h or --help was given: nothing else was checked */
    cli_value v[CLI_MAX_VALUES];
    size_t n;
    const char *pos[CLI_MAX_POSITIONAL];
    size_t n_pos;
} cli_args;

/* Parses argv[1..argc-1] (argv[0] is the command's name) against spec into out. PW_OK, or
 * PW_EINVAL with err naming the option and the problem. */
pw_status cli_parse(const cli_spec *spec, int argc, char **argv, cli_args *out,
                       pw_error *err);

/* Prints the command's help: the synopsis, "options:" and one entry per option of every table
 * (name, metavar, help lines, alias), then the footer. */
void cli_help(const cli_spec *spec, FILE *f);

/* The last occurrence of the option named name (its main name), or NULL when not given. */
const cli_value *cli_get(const cli_args *a, const char *name);

/* The next occurrence after prev (NULL: the first), for repeatable options; NULL at the end. */
const cli_value *cli_next(const cli_args *a, const char *name, const cli_value *prev);

/* True when the flag (or option) named name was given. */
bool cli_has(const cli_args *a, const char *name);

/* The value text of the last occurrence, or NULL. */
const char *cli_text(const cli_args *a, const char *name);

/* The known option name (or alias) of spec nearest to word by edit distance, or NULL when none
 * is near enough to be a likely typo. */
const char *cli_nearest(const cli_spec *spec, const char *word);

/* Shared option blocks, one meaning each, used by every command that takes them. */
extern const cli_option cli_block_json[];        /* --json */
extern const cli_option cli_block_components[];  /* --components FILE */
extern const cli_option cli_block_minimum[];     /* --minimum N */
extern const cli_option cli_block_verdict[];     /* --exit-verdict */
extern const cli_option cli_block_pressure[];    /* --pressure P (a column's) */
extern const cli_option cli_block_products[];    /* --xd X --xb X */
extern const cli_option cli_block_feed[];        /* --zf X --q Q */
extern const cli_option cli_block_factors[];     /* --factors F,F,... (--operating-factor) */
extern const cli_option cli_block_uncertainty[]; /* --uncertainty --samples N --seed N */
extern const cli_option cli_block_show_in[];     /* --show-in UNITS */

/* The display units of --show-in (K and kPa when not given). */
pw_display_units cli_show_in_get(const cli_args *a);

/* The column targets given with the pressure, products and feed blocks, into t (q 1 unless
 * given; given[] the compositions as typed, xd xb zf, NULL when absent). */
struct cli_targets;
void cli_targets_get(const cli_args *a, struct cli_targets *t, const char *given[3]);

/* The uncertainty block: *on when any of its options was given (--samples and --seed imply
 * --uncertainty); *samples and *seed their values, or 0 and false in *have when absent. */
typedef struct cli_uncertainty {
    bool on, have_samples, have_seed;
    unsigned long long samples, seed;
} cli_uncertainty;
cli_uncertainty cli_uncertainty_get(const cli_args *a);

#endif
