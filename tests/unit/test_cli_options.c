/* The command-line option parser (src/cli/cli_options.c), table-driven: every form of option the
 * parser accepts or refuses, with the message it gives; and the help text made from the tables
 * lists every option, alias and metavar. Identities of the parser's own contract (cli_options.h);
 * the unit conversion behind --p is checked against the definition 1 atm = 101325 Pa (ISO 80000-4). */
#include "pw_test.h"

#include "cli/cli_options.h"

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static pw_status check_even(cli_value *v, pw_error *err)
{
    if ((long long)v->num % 2 != 0)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "%s %s: expected an even number", v->spelt,
                            v->text);
    return PW_OK;
}

static const cli_option test_options[] = {
    {.name = "--x", .kind = CLI_NUMBER, .metavar = "X", .help = "a number"},
    {.name = "--flag", .kind = CLI_FLAG, .help = "a flag"},
    {.name = "--name", .alias = "--nom", .kind = CLI_STRING, .metavar = "TEXT",
     .help = "a name\nover two lines"},
    {.name = "--many", .kind = CLI_STRING, .metavar = "FILE", .repeatable = true,
     .help = "repeatable"},
    {.name = "--p", .kind = CLI_QUANTITY, .unit = PW_QTY_PRESSURE, .metavar = "P",
     .help = "a pressure"},
    {.name = "--frac", .kind = CLI_FRACTION, .metavar = "X", .help = "a composition"},
    {.name = "--n", .kind = CLI_INTEGER, .metavar = "N", .lo = 1.0, .hi = 10.0,
     .help = "a whole number"},
    {.name = "--r", .kind = CLI_NUMBER, .metavar = "R", .lo = 0.5, .hi = 2.0, .what = "a ratio",
     .help = "a ranged number"},
    {.name = "--list", .kind = CLI_LIST, .metavar = "F,F", .help = "numbers"},
    {.name = "--even", .kind = CLI_NUMBER, .metavar = "E", .check = check_even,
     .help = "an even number (a check callback)"},
    {.name = "--a-very-long-option-name", .kind = CLI_STRING, .metavar = "VALUE",
     .help = "the help starts on the next line"},
    CLI_END,
};

static const cli_option *const test_blocks[] = {test_options, cli_block_uncertainty, NULL};

static const cli_spec spec = {
    .cmd = "demo",
    .synopsis = "usage: pinchwise demo FILE [options]\n\nA paragraph above the options.\n",
    .blocks = test_blocks,
    .footer = "A footer.\n",
    .max_positional = 1,
    .positional = "one file",
};

typedef struct parse_case {
    const char *argv[8];
    pw_status want;
    const char *fragment; /* in the error message (failures) or NULL */
} parse_case;

static const parse_case cases[] = {
    {{"--x=1"}, PW_OK, NULL},
    {{"--x", "1"}, PW_OK, NULL},
    {{"--x", "-0.5"}, PW_OK, NULL}, /* a value may start with '-' */
    {{"--x"}, PW_EINVAL, "--x needs a value (X)"},
    {{"--x="}, PW_EINVAL, "--x : not a finite number"}, /* an empty value, checked by kind */
    {{"--x=abc"}, PW_EINVAL, "--x abc: not a finite number"},
    {{"--x", "0x10"}, PW_EINVAL, "not a finite number"},
    {{"--xx", "1"}, PW_EINVAL, "unknown option --xx (did you mean --x?"},
    {{"--fleg"}, PW_EINVAL, "unknown option --fleg (did you mean --flag?"},
    {{"--uncertanty"}, PW_EINVAL, "did you mean --uncertainty?"},
    {{"--samp", "3"}, PW_EINVAL, "did you mean --samples?"},
    {{"--zzzzzzzzzzzz"}, PW_EINVAL, "unknown option --zzzzzzzzzzzz (see pinchwise demo --help)"},
    {{"-q"}, PW_EINVAL, "unknown option -q"},
    {{"--x", "1", "--x", "2"}, PW_EINVAL, "--x given more than once"},
    {{"--name", "a", "--nom", "b"}, PW_EINVAL, "--nom given more than once"},
    {{"--flag=1"}, PW_EINVAL, "--flag takes no value (got --flag=1)"},
    {{"--flag", "--flag"}, PW_EINVAL, "--flag given more than once"},
    {{"a", "b"}, PW_EINVAL, "unexpected argument b (one file)"},
    {{"--p", "101.325"}, PW_EINVAL, "--p 101.325"},
    {{"--n", "0"}, PW_EINVAL, "--n 0: expected a whole number from 1 to 10"},
    {{"--n=2.5"}, PW_EINVAL, "--n 2.5: expected a whole number from 1 to 10"},
    {{"--r", "3"}, PW_EINVAL, "--r 3: expected a ratio from 0.5 to 2"},
    {{"--frac", "1.5"}, PW_EINVAL, "--frac 1.5"},
    {{"--list=1,,2"}, PW_EINVAL, "--list 1,,2: expected comma-separated numbers"},
    {{"--list=1,"}, PW_EINVAL, "--list 1,: expected comma-separated numbers"},
    {{"--list=1,x"}, PW_EINVAL, "expected comma-separated numbers"},
    {{"--even", "3"}, PW_EINVAL, "--even 3: expected an even number"},
    {{"--samples", "-1"}, PW_EINVAL, "--samples -1: expected a whole number from 0 to 100000"},
    {{"--", "--x"}, PW_OK, NULL},            /* after "--" a positional */
    {{"--bogus", "--help"}, PW_OK, NULL},    /* help wins over a mistake */
    {{"-"}, PW_OK, NULL},                    /* "-" alone is a positional */
};

static pw_status run(const char *const *words, cli_args *out, pw_error *err)
{
    char *argv[10] = {"demo"};
    int argc = 1;
    for (int i = 0; i < 8 && words[i]; i++)
        argv[argc++] = (char *)words[i];
    pw_error_clear(err);
    return cli_parse(&spec, argc, argv, out, err);
}

static void table_of_cases(void **state)
{
    (void)state;
    for (size_t k = 0; k < sizeof cases / sizeof cases[0]; k++) {
        cli_args a;
        pw_error err;
        pw_status st = run(cases[k].argv, &a, &err);
        if (st != cases[k].want || (cases[k].fragment && !strstr(err.msg, cases[k].fragment)))
            fail_msg("case %zu (%s ...): status %d, message '%s', expected status %d with '%s'",
                     k, cases[k].argv[0], (int)st, err.msg, (int)cases[k].want,
                     cases[k].fragment ? cases[k].fragment : "");
        if (st != PW_OK)
            assert_int_equal(err.status, PW_EINVAL);
    }
}

static void values_are_parsed(void **state)
{
    (void)state;
    cli_args a;
    pw_error err;
    const char *w1[8] = {"file.json", "--x=2.5",  "--p",          "1 atm", "--frac",
                         "50wt%",     "--n=7",    "--list=1.2,1.3"};
    assert_int_equal(run(w1, &a, &err), PW_OK);
    assert_int_equal(a.n_pos, 1);
    assert_string_equal(a.pos[0], "file.json");
    assert_true(cli_get(&a, "--x")->num == 2.5);
    /* 1 atm = 101325 Pa exactly (definition) */
    assert_true(cli_get(&a, "--p")->num == 101325.0);
    assert_true(cli_get(&a, "--frac")->num == 0.5);
    assert_int_equal(cli_get(&a, "--frac")->basis, PW_BASIS_MASS);
    assert_int_equal(cli_get(&a, "--n")->whole, 7);
    const cli_value *l = cli_get(&a, "--list");
    assert_int_equal(l->n_list, 2);
    assert_true(l->list[0] == 1.2 && l->list[1] == 1.3);
    assert_false(cli_has(&a, "--flag"));
    assert_null(cli_text(&a, "--name"));

    const char *w2[8] = {"--nom", "abc", "--many", "a", "--many=b", "--flag", "--", "--x"};
    assert_int_equal(run(w2, &a, &err), PW_OK);
    const cli_value *v = cli_get(&a, "--name");
    assert_string_equal(v->text, "abc");
    assert_string_equal(v->spelt, "--nom");
    const cli_value *m1 = cli_next(&a, "--many", NULL);
    const cli_value *m2 = cli_next(&a, "--many", m1);
    assert_string_equal(m1->text, "a");
    assert_string_equal(m2->text, "b");
    assert_null(cli_next(&a, "--many", m2));
    assert_true(cli_has(&a, "--flag"));
    assert_null(cli_get(&a, "--flag")->text);
    assert_int_equal(a.n_pos, 1);
    assert_string_equal(a.pos[0], "--x");
    assert_false(a.help);

    const char *w3[8] = {"--x", "1", "-h"};
    assert_int_equal(run(w3, &a, &err), PW_OK);
    assert_true(a.help);

    /* the uncertainty block: --samples implies --uncertainty */
    const char *w4[8] = {"--samples", "30", "--seed=5"};
    assert_int_equal(run(w4, &a, &err), PW_OK);
    cli_uncertainty u = cli_uncertainty_get(&a);
    assert_true(u.on && u.have_samples && u.have_seed);
    assert_int_equal(u.samples, 30);
    assert_int_equal(u.seed, 5);
    const char *w5[8] = {"--uncertainty"};
    assert_int_equal(run(w5, &a, &err), PW_OK);
    u = cli_uncertainty_get(&a);
    assert_true(u.on && !u.have_samples && !u.have_seed);
}

static void nearest_names(void **state)
{
    (void)state;
    assert_string_equal(cli_nearest(&spec, "--x"), "--x");
    assert_string_equal(cli_nearest(&spec, "--nomm"), "--nom");
    assert_string_equal(cli_nearest(&spec, "--a-very-long-optoin-name"),
                        "--a-very-long-option-name");
    assert_null(cli_nearest(&spec, "--completely-different"));
}

static void help_lists_every_option(void **state)
{
    (void)state;
    char *text = NULL;
    size_t len = 0;
    FILE *f = open_memstream(&text, &len);
    assert_non_null(f);
    cli_help(&spec, f);
    fclose(f);
    assert_non_null(strstr(text, "usage: pinchwise demo FILE [options]\n\nA paragraph"));
    assert_non_null(strstr(text, "A footer."));
    assert_non_null(strstr(text, "-h, --help"));
    for (const cli_option *const *b = spec.blocks; *b; b++)
        for (const cli_option *o = *b; o->name; o++) {
            char entry[128];
            snprintf(entry, sizeof entry, "\n  %s%s%s", o->name, o->metavar ? " " : "",
                     o->metavar ? o->metavar : "");
            if (!strstr(text, entry))
                fail_msg("help lacks '%s'", entry + 1);
            if (o->alias && !strstr(text, o->alias))
                fail_msg("help lacks the alias %s", o->alias);
            /* every line of the option's help, indented under it */
            char line[256];
            const char *p = o->help;
            while (p && *p) {
                size_t n = strcspn(p, "\n");
                snprintf(line, sizeof line, "%.*s\n", (int)n, p);
                if (!strstr(text, line))
                    fail_msg("help of %s lacks the line '%s'", o->name, line);
                p += n + (p[n] == '\n');
            }
        }
    /* two-line help: the second line indented to the help column */
    assert_non_null(strstr(text, "a name\n                      over two lines\n"));
    /* a long name: its help on the next line */
    assert_non_null(strstr(text, "--a-very-long-option-name VALUE\n                      the help"));
    free(text);
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(table_of_cases),
        cmocka_unit_test(values_are_parsed),
        cmocka_unit_test(nearest_names),
        cmocka_unit_test(help_lists_every_option),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
