/* The one option parser of the command-line program; see cli_options.h. */
#include "cli_options.h"

#include "cli.h"
#include "cli_units.h"

#include <math.h>
#include <stdlib.h>
#include <string.h>

/* ---- the shared blocks ------------------------------------------------------------------- */

const cli_option cli_block_json[] = {
    {.name = "--json", .kind = CLI_FLAG, .help = "print one JSON object on stdout"},
    CLI_END,
};

const cli_option cli_block_components[] = {
    {.name = "--components", .kind = CLI_STRING, .metavar = "FILE",
     .help = "component rows (vapor pressure, molar mass, ...) that\n"
             "take precedence over the ones otherwise used: the shipped\n"
             "library's when reading data, the fit file's recorded rows when\n"
             "reading a fit"},
    CLI_END,
};

const cli_option cli_block_minimum[] = {
    {.name = "--minimum", .kind = CLI_STRING, .metavar = "N",
     .help = "use the fit's N-th distinct minimum (1 = lowest chi-square; the fit\n"
             "file lists them under \"minima\") instead of the one the fit chose"},
    CLI_END,
};

const cli_option cli_block_verdict[] = {
    {.name = "--exit-verdict", .kind = CLI_FLAG,
     .help = "exit with status 7 when the verdict is negative (see README)"},
    CLI_END,
};

/* The plausible ranges are cli_quantity's (docs/inputs.md). */
const cli_option cli_block_pressure[] = {
    {.name = "--pressure", .kind = CLI_QUANTITY, .unit = PW_QTY_PRESSURE, .metavar = "P",
     .help = "column pressure with its unit, e.g. 101.325kPa, 1atm, \"2 bar\""},
    CLI_END,
};

const cli_option cli_block_products[] = {
    {.name = "--xd", .kind = CLI_FRACTION, .metavar = "X",
     .help = "distillate composition of component 1: a mole fraction, or with\n"
             "mol%, wt or wt% (e.g. 99.5wt%)"},
    {.name = "--xb", .kind = CLI_FRACTION, .metavar = "X",
     .help = "bottoms composition of component 1 (as --xd); either direction:\n"
             "xb < zf < xd, or xd < zf < xb when component 1 leaves with the\n"
             "bottoms"},
    CLI_END,
};

/* q from -10 (very hot vapor) to 10 (very cold liquid) covers every real feed. */
const cli_option cli_block_feed[] = {
    {.name = "--zf", .kind = CLI_FRACTION, .metavar = "X",
     .help = "feed composition of component 1: a mole fraction, or with mol%,\n"
             "wt or wt% (e.g. 40wt%)"},
    {.name = "--q", .kind = CLI_NUMBER, .metavar = "Q", .lo = -10.0, .hi = 10.0,
     .what = "the feed's liquid fraction q",
     .help = "feed liquid fraction (1 saturated liquid, 0 saturated vapor,\n"
             "> 1 subcooled, < 0 superheated; default 1)"},
    CLI_END,
};

/* Design reflux ratios: above R_min, and at most 100 R_min (docs/inputs.md). */
static pw_status check_factors(cli_value *v, pw_error *err)
{
    for (size_t i = 0; i < v->n_list; i++)
        if (!(v->list[i] > 1.0 && v->list[i] <= 100.0))
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "%s %s: expected multiples of R_min above 1 and at most 100, "
                                "e.g. 1.2,1.3,1.5",
                                v->spelt, v->text);
    return PW_OK;
}

const cli_option cli_block_factors[] = {
    {.name = "--factors", .alias = "--operating-factor", .kind = CLI_LIST, .metavar = "F,F,...",
     .check = check_factors,
     .help = "design reflux as multiples of R_min (default 1.2,1.3,1.5)"},
    CLI_END,
};

const cli_option cli_block_uncertainty[] = {
    {.name = "--uncertainty", .kind = CLI_FLAG,
     .help = "propagate the fit's parameter covariance to the results: 95 %\n"
             "intervals (linearised and sampled) and the risk that the answer\n"
             "changes"},
    {.name = "--samples", .kind = CLI_INTEGER, .metavar = "N", .lo = 0.0, .hi = 100000.0,
     .help = "parameter sets drawn for --uncertainty (default 400; implies it)"},
    {.name = "--seed", .kind = CLI_INTEGER, .metavar = "N", .lo = 0.0, .hi = 4294967295.0,
     .help = "random seed of the draws (default 1; implies --uncertainty)"},
    CLI_END,
};

/* --show-in: checked while parsing, so cli_show_in_get cannot fail. */
static pw_status check_show_in(cli_value *v, pw_error *err)
{
    pw_display_units u;
    pw_error inner;
    pw_error_clear(&inner);
    if (pw_units_display_parse(v->text, &u, &inner) != PW_OK)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "%s: %s", v->spelt, inner.msg);
    return PW_OK;
}

const cli_option cli_block_show_in[] = {
    {.name = "--show-in", .kind = CLI_STRING, .metavar = "UNITS", .check = check_show_in,
     .help = "temperature and/or pressure unit of the text output, e.g. C,bar\n"
             "or degF,psia (default K,kPa; --json output and CSV files stay in\n"
             "K and kPa)"},
    CLI_END,
};

pw_display_units cli_show_in_get(const cli_args *a)
{
    pw_display_units u = pw_units_display_default();
    const char *t = cli_text(a, "--show-in");
    if (t && pw_units_display_parse(t, &u, NULL) != PW_OK)
        u = pw_units_display_default(); /* not reached: check_show_in refused it */
    return u;
}

/* ---- lookup ------------------------------------------------------------------------------ */

static const cli_option *find(const cli_spec *spec, const char *name, size_t len)
{
    for (const cli_option *const *b = spec->blocks; b && *b; b++)
        for (const cli_option *o = *b; o->name; o++) {
            if (strlen(o->name) == len && !strncmp(o->name, name, len))
                return o;
            if (o->alias && strlen(o->alias) == len && !strncmp(o->alias, name, len))
                return o;
        }
    return NULL;
}

/* Levenshtein distance of a and b, capped at 99 (names are short). */
static size_t edit_distance(const char *a, const char *b)
{
    size_t la = strlen(a), lb = strlen(b);
    if (la > 63 || lb > 63)
        return 99;
    size_t row[64];
    for (size_t j = 0; j <= lb; j++)
        row[j] = j;
    for (size_t i = 1; i <= la; i++) {
        size_t diag = row[0];
        row[0] = i;
        for (size_t j = 1; j <= lb; j++) {
            size_t up = row[j];
            size_t sub = diag + (a[i - 1] != b[j - 1]);
            size_t best = up + 1 < row[j - 1] + 1 ? up + 1 : row[j - 1] + 1;
            row[j] = sub < best ? sub : best;
            diag = up;
        }
    }
    return row[lb];
}

const char *cli_nearest(const cli_spec *spec, const char *word)
{
    const char *best = NULL;
    size_t best_d = 99;
    for (const cli_option *const *b = spec->blocks; b && *b; b++)
        for (const cli_option *o = *b; o->name; o++)
            for (int k = 0; k < 2; k++) {
                const char *n = k ? o->alias : o->name;
                if (!n)
                    continue;
                size_t d = edit_distance(word, n);
                /* a prefix of a longer name ("--unc" for "--uncertainty") is a likely typo too */
                if (strlen(word) > 3 && !strncmp(n, word, strlen(word)))
                    d = 1;
                if (d < best_d)
                    best_d = d, best = n;
            }
    /* near enough: at most a third of the name's letters (after "--") differ, at least one */
    size_t letters = strlen(word) > 2 ? strlen(word) - 2 : 1;
    size_t limit = letters / 3 > 1 ? letters / 3 : 1;
    return best && best_d <= limit ? best : NULL;
}

/* ---- values -------------------------------------------------------------------------------- */

static pw_status parse_list(cli_value *v, pw_error *err)
{
    const char *p = v->text;
    v->n_list = 0;
    while (*p) {
        const char *comma = strchr(p, ',');
        size_t len = comma ? (size_t)(comma - p) : strlen(p);
        char buf[64];
        if (len == 0 || len >= sizeof buf)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "%s %s: expected comma-separated numbers", v->spelt, v->text);
        memcpy(buf, p, len);
        buf[len] = '\0';
        double d;
        if (cli_number(v->spelt, buf, &d, NULL) != PW_OK)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "%s %s: expected comma-separated numbers", v->spelt, v->text);
        if (v->n_list == CLI_LIST_MAX)
            return pw_error_set(err, PW_EINVAL, NULL, 0, "%s: at most %d values", v->spelt,
                                CLI_LIST_MAX);
        v->list[v->n_list++] = d;
        p += len;
        if (*p == ',' && *++p == '\0')
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "%s %s: expected comma-separated numbers", v->spelt, v->text);
    }
    if (v->n_list == 0)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "%s: no values", v->spelt);
    return PW_OK;
}

static pw_status parse_value(cli_value *v, pw_error *err)
{
    const cli_option *o = v->opt;
    pw_status st = PW_OK;
    switch (o->kind) {
    case CLI_FLAG:
    case CLI_STRING:
        break;
    case CLI_NUMBER:
        if (o->lo < o->hi)
            st = cli_ranged(v->spelt, v->text, o->lo, o->hi, o->what ? o->what : "a number",
                               &v->num, err)
                     ? PW_EINVAL
                     : PW_OK;
        else
            st = cli_number(v->spelt, v->text, &v->num, err);
        break;
    case CLI_INTEGER:
        st = cli_whole(v->spelt, v->text, o->lo, o->hi, &v->whole, err) ? PW_EINVAL : PW_OK;
        v->num = (double)v->whole;
        break;
    case CLI_FRACTION:
        st = cli_composition(v->spelt, v->text, &v->num, &v->basis, err) ? PW_EINVAL : PW_OK;
        break;
    case CLI_QUANTITY:
        st = cli_quantity(o->unit, v->spelt, v->text, &v->num, err);
        break;
    case CLI_LIST:
        st = parse_list(v, err);
        break;
    }
    if (st == PW_OK && o->check)
        st = o->check(v, err);
    return st;
}

/* ---- the parser ---------------------------------------------------------------------------- */

pw_status cli_parse(const cli_spec *spec, int argc, char **argv, cli_args *out,
                       pw_error *err)
{
    memset(out, 0, sizeof *out);
    out->spec = spec;
    /* help first: "--help" after a mistake still shows the help */
    for (int i = 1; i < argc && strcmp(argv[i], "--"); i++)
        if (!strcmp(argv[i], "--help") || !strcmp(argv[i], "-h")) {
            out->help = true;
            return PW_OK;
        }
    bool options_done = false;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (!options_done && !strcmp(a, "--")) {
            options_done = true;
            continue;
        }
        if (options_done || a[0] != '-' || a[1] == '\0') { /* "-" alone is a positional */
            if (out->n_pos == spec->max_positional || out->n_pos == CLI_MAX_POSITIONAL)
                return pw_error_set(err, PW_EINVAL, NULL, 0, "unexpected argument %s (%s)", a,
                                    spec->positional ? spec->positional : "no file expected");
            out->pos[out->n_pos++] = a;
            continue;
        }
        const char *eq = a[1] == '-' ? strchr(a, '=') : NULL;
        size_t len = eq ? (size_t)(eq - a) : strlen(a);
        const cli_option *o = a[1] == '-' ? find(spec, a, len) : NULL;
        if (!o) {
            char word[128];
            snprintf(word, sizeof word, "%.*s", (int)(len < 100 ? len : 100), a);
            const char *near = cli_nearest(spec, word);
            if (near)
                return pw_error_set(err, PW_EINVAL, NULL, 0,
                                    "unknown option %s (did you mean %s? see pinchwise %s --help)",
                                    word, near, spec->cmd);
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "unknown option %s (see pinchwise %s --help)", word, spec->cmd);
        }
        if (out->n == CLI_MAX_VALUES)
            return pw_error_set(err, PW_EINVAL, NULL, 0, "too many options (at most %d)",
                                CLI_MAX_VALUES);
        cli_value *v = &out->v[out->n];
        memset(v, 0, sizeof *v);
        v->opt = o;
        v->spelt = !strncmp(o->name, a, len) && strlen(o->name) == len ? o->name : o->alias;
        if (!o->repeatable && cli_get(out, o->name))
            return pw_error_set(err, PW_EINVAL, NULL, 0, "%s given more than once", v->spelt);
        if (o->kind == CLI_FLAG) {
            if (eq)
                return pw_error_set(err, PW_EINVAL, NULL, 0, "%s takes no value (got %s)",
                                    v->spelt, a);
        } else if (eq) {
            v->text = eq + 1;
        } else if (i + 1 < argc) {
            v->text = argv[++i];
        } else {
            return pw_error_set(err, PW_EINVAL, NULL, 0, "%s needs a value (%s)", v->spelt,
                                o->metavar ? o->metavar : "a value");
        }
        pw_status st = parse_value(v, err);
        if (st != PW_OK) {
            if (err)
                err->status = PW_EINVAL;
            return PW_EINVAL;
        }
        out->n++;
    }
    return PW_OK;
}

const cli_value *cli_next(const cli_args *a, const char *name, const cli_value *prev)
{
    size_t start = prev ? (size_t)(prev - a->v) + 1 : 0;
    for (size_t i = start; i < a->n; i++)
        if (!strcmp(a->v[i].opt->name, name))
            return &a->v[i];
    return NULL;
}

const cli_value *cli_get(const cli_args *a, const char *name)
{
    for (size_t i = a->n; i-- > 0;)
        if (!strcmp(a->v[i].opt->name, name))
            return &a->v[i];
    return NULL;
}

bool cli_has(const cli_args *a, const char *name)
{
    return cli_get(a, name) != NULL;
}

const char *cli_text(const cli_args *a, const char *name)
{
    const cli_value *v = cli_get(a, name);
    return v ? v->text : NULL;
}

/* ---- help -------------------------------------------------------------------------------- */

#define HELP_COLUMN 22

static void help_lines(FILE *f, const char *text, bool first_on_line)
{
    const char *p = text;
    while (p && *p) {
        const char *nl = strchr(p, '\n');
        int len = nl ? (int)(nl - p) : (int)strlen(p);
        if (!first_on_line)
            fprintf(f, "%*s", HELP_COLUMN, "");
        fprintf(f, "%.*s\n", len, p);
        first_on_line = false;
        p = nl ? nl + 1 : NULL;
    }
}

void cli_help(const cli_spec *spec, FILE *f)
{
    fputs(spec->synopsis, f);
    fputs("\noptions:\n", f);
    for (const cli_option *const *b = spec->blocks; b && *b; b++)
        for (const cli_option *o = *b; o->name; o++) {
            char lhs[96];
            snprintf(lhs, sizeof lhs, "  %s%s%s", o->name, o->metavar ? " " : "",
                     o->metavar ? o->metavar : "");
            size_t n = strlen(lhs);
            if (n < HELP_COLUMN)
                fprintf(f, "%-*s", HELP_COLUMN, lhs);
            else
                fprintf(f, "%s\n%*s", lhs, HELP_COLUMN, "");
            help_lines(f, o->help ? o->help : "", true);
            if (o->alias)
                fprintf(f, "%*s(also spelt %s)\n", HELP_COLUMN, "", o->alias);
            if (o->repeatable)
                fprintf(f, "%*s(may be given more than once)\n", HELP_COLUMN, "");
        }
    fprintf(f, "  -h, --help          this text\n");
    if (spec->footer) {
        fputc('\n', f);
        fputs(spec->footer, f);
    }
}

/* ---- readers of the shared blocks ---------------------------------------------------------- */

void cli_targets_get(const cli_args *a, cli_targets *t, const char *given[3])
{
    memset(t, 0, sizeof *t);
    t->q = 1.0;
    const cli_value *v;
    if ((v = cli_get(a, "--pressure")))
        t->P_Pa = v->num, t->have_P = true;
    static const char *const names[3] = {"--xd", "--xb", "--zf"};
    double *x[3] = {&t->xd, &t->xb, &t->zf};
    bool *have[3] = {&t->have_xd, &t->have_xb, &t->have_zf};
    for (int k = 0; k < 3; k++) {
        v = cli_get(a, names[k]);
        if (given)
            given[k] = v ? v->text : NULL;
        if (v)
            *x[k] = v->num, *have[k] = true, t->basis[k] = v->basis;
    }
    if ((v = cli_get(a, "--q")))
        t->q = v->num;
}

cli_uncertainty cli_uncertainty_get(const cli_args *a)
{
    cli_uncertainty u = {.on = cli_has(a, "--uncertainty")};
    const cli_value *v;
    if ((v = cli_get(a, "--samples")))
        u.samples = v->whole, u.have_samples = u.on = true;
    if ((v = cli_get(a, "--seed")))
        u.seed = v->whole, u.have_seed = u.on = true;
    return u;
}
