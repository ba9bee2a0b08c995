/* The component library: reading component files (libcsv), lookup and name suggestions.
 * Format and validation rules: include/pinchwise/component.h and docs/inputs.md. */
#include "data/complib_io.h"
#include "data/csvrows.h"

#include <ctype.h>
#include <math.h>
#include <pinchwise/dataset.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

static const char *const required_cols[] = {"name", "A", "B", "C", "log", "P_unit",
                                            "T_unit", "T_min", "T_max", "source"};
enum { N_REQUIRED = 10 };
/* Optional columns: equation, V_L, Pc_bar (an older spelling of Pc_kPa), then one per
 * pw_comp_prop in the order of that enum (names from pw_comp_prop_column). */
enum { COL_EQUATION, COL_VL, COL_PC_BAR, COL_PROP0, N_OPTIONAL = COL_PROP0 + PW_PROP_COUNT };

static const char *optional_col(int k)
{
    static const char *const fixed[COL_PROP0] = {"equation", "V_L", "Pc_bar"};
    return k < COL_PROP0 ? fixed[k] : pw_comp_prop_column((pw_comp_prop)(k - COL_PROP0));
}

typedef struct {
    const char *name;
    bool header_seen;
    size_t ncols;
    long opt[N_OPTIONAL]; /* column index of each optional column, -1 when absent */
    long aliases_col;     /* column index of "aliases" (other names, ";"-separated), -1 if none */
    pw_component *rows;
    long *lines;
    size_t n, cap;
} reader;

static pw_status add_row(reader *rd, const pw_component *c, long line, pw_error *err)
{
    if (rd->n == rd->cap) {
        size_t cap = rd->cap ? 2 * rd->cap : 64;
        pw_component *r = realloc(rd->rows, cap * sizeof *r);
        if (!r)
            return pw_error_set(err, PW_ENOMEM, rd->name, line, "out of memory");
        rd->rows = r;
        long *l = realloc(rd->lines, cap * sizeof *l);
        if (!l)
            return pw_error_set(err, PW_ENOMEM, rd->name, line, "out of memory");
        rd->lines = l;
        rd->cap = cap;
    }
    rd->rows[rd->n] = *c;
    snprintf(rd->rows[rd->n].origin, sizeof rd->rows[rd->n].origin, "%s", rd->name ? rd->name : "");
    rd->rows[rd->n].origin_line = line;
    if (pw_component_prepare(&rd->rows[rd->n]) != PW_OK)
        return pw_error_set(err, PW_EPARSE, rd->name, line, "unknown unit");
    rd->lines[rd->n] = line;
    rd->n++;
    return PW_OK;
}

static pw_status header_row(reader *rd, char **f, size_t n, long line, pw_error *err)
{
    bool ok = n >= N_REQUIRED;
    for (size_t i = 0; ok && i < N_REQUIRED; i++)
        ok = strcmp(f[i], required_cols[i]) == 0;
    if (!ok)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "not a component file header (expected the row "
                            "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source, then optional "
                            "columns)");
    for (size_t k = 0; k < N_OPTIONAL; k++)
        rd->opt[k] = -1;
    for (size_t i = N_REQUIRED; i < n; i++) {
        for (size_t k = 0; k < N_OPTIONAL; k++) {
            if (strcmp(f[i], optional_col((int)k)) != 0)
                continue;
            if (rd->opt[k] >= 0)
                return pw_error_set(err, PW_EPARSE, rd->name, line,
                                    "column '%s' appears twice (expected it at most once)",
                                    optional_col((int)k));
            rd->opt[k] = (long)i;
        }
    }
    if (rd->opt[COL_PC_BAR] >= 0 && rd->opt[COL_PROP0 + PW_PROP_PC] >= 0)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "columns Pc_bar and Pc_kPa both given (expected one of them)");
    rd->aliases_col = -1;
    for (size_t i = N_REQUIRED; i < n; i++)
        if (strcmp(f[i], "aliases") == 0) {
            if (rd->aliases_col >= 0)
                return pw_error_set(err, PW_EPARSE, rd->name, line,
                                    "column 'aliases' appears twice (expected it at most once)");
            rd->aliases_col = (long)i;
        }
    rd->ncols = n;
    rd->header_seen = true;
    return PW_OK;
}

static pw_status number_field(reader *rd, char **f, size_t col, const char *what, long line,
                              double *out, pw_error *err)
{
    if (f[col][0] == '\0')
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "column %s is empty (expected a decimal number)", what);
    if (!pw_csvrows_number(f[col], out))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "column %s: '%s' is not a number (expected a finite decimal number "
                            "such as 16.3872)",
                            what, f[col]);
    return PW_OK;
}

static pw_status copy_text(reader *rd, char *dst, size_t cap, const char *src, const char *what,
                           long line, pw_error *err)
{
    size_t len = strlen(src);
    if (len >= cap)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s is %zu characters long (expected at most %zu)", what, len,
                            cap - 1);
    memcpy(dst, src, len + 1);
    return PW_OK;
}

static pw_status optional_number(reader *rd, char **f, int k, long line, double *out,
                                 pw_error *err)
{
    *out = NAN;
    if (rd->opt[k] < 0 || f[rd->opt[k]][0] == '\0')
        return PW_OK;
    return number_field(rd, f, (size_t)rd->opt[k], optional_col(k), line, out, err);
}

/* The optional constants of one row, converted to SI and checked against their plausible ranges. */
static pw_status component_props(reader *rd, char **f, long line, pw_component *c, pw_error *err)
{
    pw_component_props_clear(c);
    pw_status st;
    for (int p = 0; p < PW_PROP_COUNT; p++) {
        int k = COL_PROP0 + p;
        double scale = 1.0;
        if (p == PW_PROP_PC && rd->opt[k] < 0) {
            k = COL_PC_BAR;
            scale = 100.0; /* bar -> kPa */
        }
        double v;
        if ((st = optional_number(rd, f, k, line, &v, err)))
            return st;
        if (isnan(v))
            continue;
        v *= scale;
        double lo, hi;
        pw_comp_prop_range((pw_comp_prop)p, &lo, &hi);
        if (!(v > lo && v < hi))
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "%s = %g is outside the plausible range (expected %g to %g, or "
                                "empty when unknown)",
                                pw_comp_prop_column((pw_comp_prop)p), v, lo, hi);
        c->prop[p] = v * pw_comp_prop_to_si((pw_comp_prop)p);
    }
    return PW_OK;
}

static pw_status component_row(reader *rd, char **f, size_t n, long line, pw_error *err)
{
    pw_component c;
    memset(&c, 0, sizeof c);
    pw_status st;
    if (n != rd->ncols)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "row has %zu fields (expected %zu, as in the header)", n, rd->ncols);
    if (f[0][0] == '\0')
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "component name is empty (expected a name)");
    if ((st = copy_text(rd, c.name, sizeof c.name, f[0], "component name", line, err)))
        return st;
    for (size_t i = 0; i < rd->n; i++)
        if (strcasecmp(rd->rows[i].name, c.name) == 0)
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "component '%s' is listed twice in this file (first on line %ld; "
                                "expected each name once)",
                                c.name, rd->lines[i]);
    if ((st = number_field(rd, f, 1, "A", line, &c.A, err)) ||
        (st = number_field(rd, f, 2, "B", line, &c.B, err)) ||
        (st = number_field(rd, f, 3, "C", line, &c.C, err)))
        return st;
    if (!(c.B > 0.0))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "B = %g (expected B > 0: vapor pressure rises with temperature)", c.B);
    if (strcasecmp(f[4], "log10") == 0)
        c.log = PW_LOG10;
    else if (strcasecmp(f[4], "ln") == 0)
        c.log = PW_LN;
    else
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "log is '%s' (expected log10 or ln)", f[4]);
    if (!pw_units_known(PW_QTY_PRESSURE, f[5]))
        return pw_error_set(err, PW_EPARSE, rd->name, line, "unknown P_unit '%s' (expected %s)",
                            f[5], pw_units_list(PW_QTY_PRESSURE));
    if (!pw_units_known(PW_QTY_TEMPERATURE, f[6]))
        return pw_error_set(err, PW_EPARSE, rd->name, line, "unknown T_unit '%s' (expected %s)",
                            f[6], pw_units_list(PW_QTY_TEMPERATURE));
    if ((st = copy_text(rd, c.P_unit, sizeof c.P_unit, f[5], "P_unit", line, err)) ||
        (st = copy_text(rd, c.T_unit, sizeof c.T_unit, f[6], "T_unit", line, err)))
        return st;
    double tmin, tmax;
    if ((st = number_field(rd, f, 7, "T_min", line, &tmin, err)) ||
        (st = number_field(rd, f, 8, "T_max", line, &tmax, err)))
        return st;
    if (!(tmin < tmax))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "T_min = %g is not below T_max = %g (expected T_min < T_max)", tmin,
                            tmax);
    if (pw_units_to_si(PW_QTY_TEMPERATURE, tmin, c.T_unit, &c.T_min_K) != PW_OK ||
        pw_units_to_si(PW_QTY_TEMPERATURE, tmax, c.T_unit, &c.T_max_K) != PW_OK)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "T_min = %g %s is not above absolute zero (expected a real "
                            "temperature)",
                            tmin, c.T_unit);
    if (!(tmin + c.C > 0.0))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "T_min + C = %g %s: the validity range reaches the Antoine pole "
                            "(expected T + C > 0 over the whole range)",
                            tmin + c.C, c.T_unit);
    if ((st = copy_text(rd, c.source, sizeof c.source, f[9], "source", line, err)))
        return st;
    c.equation = PW_PSAT_ANTOINE;
    if (rd->opt[COL_EQUATION] >= 0) {
        const char *e = f[rd->opt[COL_EQUATION]];
        if (e[0] == '\0' || strcasecmp(e, "antoine") == 0)
            c.equation = PW_PSAT_ANTOINE;
        else if (strcasecmp(e, "iapws-if97") == 0)
            c.equation = PW_PSAT_IAPWS_IF97;
        else
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "equation is '%s' (expected antoine or iapws-if97)", e);
    }
    if ((st = optional_number(rd, f, COL_VL, line, &c.V_L_cm3mol, err)))
        return st;
    if (!isnan(c.V_L_cm3mol) && !(c.V_L_cm3mol > 0.0))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "V_L = %g (expected a positive molar volume in cm3/mol, or empty)",
                            c.V_L_cm3mol);
    if (rd->aliases_col >= 0 &&
        (st = copy_text(rd, c.aliases, sizeof c.aliases, f[rd->aliases_col], "aliases", line, err)))
        return st;
    if ((st = component_props(rd, f, line, &c, err)))
        return st;
    return add_row(rd, &c, line, err);
}

static pw_status on_row(void *ctx, char **f, size_t n, long line, pw_error *err)
{
    reader *rd = ctx;
    if (!rd->header_seen)
        return header_row(rd, f, n, line, err);
    return component_row(rd, f, n, line, err);
}

pw_status pw_complib_parse_chunked(pw_complib *lib, const char *buf, size_t len, const char *name,
                                   size_t chunk, pw_error *err)
{
    if (!lib || (!buf && len))
        return pw_error_set(err, PW_EINVAL, name, 0, "no library or no buffer given");
    reader rd;
    memset(&rd, 0, sizeof rd);
    rd.name = name ? name : "(components)";
    pw_status ust = pw_check_utf8(buf, len, rd.name, err);
    if (ust != PW_OK)
        return ust;
    pw_csvrows r;
    pw_status st = pw_csvrows_init(&r, rd.name, NULL, on_row, &rd, err);
    if (st == PW_OK)
        st = pw_csvrows_feed_all(&r, buf, len, chunk);
    long last_line = r.line;
    pw_csvrows_free(&r);
    if (st == PW_OK && !rd.header_seen)
        st = pw_error_set(err, PW_EPARSE, rd.name, 0,
                          "the file is empty (expected the header row "
                          "name,A,B,C,log,P_unit,T_unit,T_min,T_max,source)");
    else if (st == PW_OK && rd.n == 0)
        st = pw_error_set(err, PW_EPARSE, rd.name, last_line,
                          "no component rows after the header (expected at least one)");
    if (st == PW_OK && lib->n + rd.n > lib->cap) {
        size_t cap = lib->cap ? lib->cap : 64;
        while (cap < lib->n + rd.n)
            cap *= 2;
        pw_component *items = realloc(lib->items, cap * sizeof *items);
        if (!items)
            st = pw_error_set(err, PW_ENOMEM, rd.name, 0, "out of memory");
        else {
            lib->items = items;
            lib->cap = cap;
        }
    }
    if (st == PW_OK) {
        memcpy(lib->items + lib->n, rd.rows, rd.n * sizeof *rd.rows);
        lib->n += rd.n;
    }
    free(rd.rows);
    free(rd.lines);
    return st;
}

void pw_complib_init(pw_complib *lib)
{
    if (lib)
        memset(lib, 0, sizeof *lib);
}

pw_status pw_complib_parse(pw_complib *lib, const char *buf, size_t len, const char *name,
                           pw_error *err)
{
    return pw_complib_parse_chunked(lib, buf, len, name, 0, err);
}

pw_status pw_complib_read(pw_complib *lib, const char *path, pw_error *err)
{
    char *buf;
    size_t len;
    pw_status st = pw_csvrows_slurp(path, PW_DATASET_MAX_BYTES, &buf, &len, err);
    if (st != PW_OK)
        return st;
    st = pw_complib_parse(lib, buf, len, path, err);
    free(buf);
    return st;
}

/* True when name is one of the ';'-separated aliases (surrounding blanks ignored, any case). */
static bool is_alias(const char *aliases, const char *name)
{
    size_t nl = strlen(name);
    for (const char *p = aliases; *p;) {
        while (*p == ' ' || *p == ';')
            p++;
        const char *e = p;
        while (*e && *e != ';')
            e++;
        const char *t = e;
        while (t > p && t[-1] == ' ')
            t--;
        if ((size_t)(t - p) == nl && nl > 0 && strncasecmp(p, name, nl) == 0)
            return true;
        p = e;
    }
    return false;
}

const pw_component *pw_complib_find(const pw_complib *lib, const char *name)
{
    if (!lib || !name)
        return NULL;
    for (size_t i = lib->n; i-- > 0;)
        if (strcasecmp(lib->items[i].name, name) == 0)
            return &lib->items[i];
    for (size_t i = lib->n; i-- > 0;)
        if (is_alias(lib->items[i].aliases, name))
            return &lib->items[i];
    return NULL;
}

/* Case-insensitive Levenshtein distance of two strings of at most PW_NAME_MAX - 1 characters. */
static size_t edit_distance(const char *a, const char *b)
{
    size_t la = strlen(a), lb = strlen(b);
    if (la >= PW_NAME_MAX)
        la = PW_NAME_MAX - 1;
    if (lb >= PW_NAME_MAX)
        lb = PW_NAME_MAX - 1;
    size_t prev[PW_NAME_MAX], cur[PW_NAME_MAX];
    for (size_t j = 0; j <= lb; j++)
        prev[j] = j;
    for (size_t i = 1; i <= la; i++) {
        cur[0] = i;
        for (size_t j = 1; j <= lb; j++) {
            size_t sub = prev[j - 1] + (tolower((unsigned char)a[i - 1]) !=
                                        tolower((unsigned char)b[j - 1]));
            size_t del = prev[j] + 1, ins = cur[j - 1] + 1;
            cur[j] = sub < del ? (sub < ins ? sub : ins) : (del < ins ? del : ins);
        }
        memcpy(prev, cur, (lb + 1) * sizeof *prev);
    }
    return prev[lb];
}

static bool contains_ci(const char *hay, const char *needle)
{
    size_t n = strlen(needle);
    if (n == 0)
        return false;
    for (; *hay; hay++)
        if (strncasecmp(hay, needle, n) == 0)
            return true;
    return false;
}

size_t pw_complib_suggest(const pw_complib *lib, const char *name, const char **out, size_t max)
{
    if (!lib || !name || !out || max == 0)
        return 0;
    size_t limit = strlen(name) / 3;
    if (limit < 2)
        limit = 2;
    size_t count = 0;
    size_t score[64];
    if (max > 64)
        max = 64;
    for (size_t i = lib->n; i-- > 0;) {
        const char *cand = lib->items[i].name;
        size_t d = edit_distance(name, cand);
        if (contains_ci(cand, name) || contains_ci(name, cand))
            d = d < 1 ? d : 1;
        if (d > limit)
            continue;
        bool dup = false;
        for (size_t k = 0; k < count && !dup; k++)
            dup = strcasecmp(out[k], cand) == 0;
        if (dup)
            continue;
        /* insertion into the sorted list (by score, then name) */
        size_t pos = count;
        while (pos > 0 && (score[pos - 1] > d ||
                           (score[pos - 1] == d && strcasecmp(out[pos - 1], cand) > 0)))
            pos--;
        if (pos >= max)
            continue;
        size_t last = count < max ? count : max - 1;
        for (size_t k = last; k > pos; k--) {
            out[k] = out[k - 1];
            score[k] = score[k - 1];
        }
        out[pos] = cand;
        score[pos] = d;
        if (count < max)
            count++;
    }
    return count;
}

void pw_complib_free(pw_complib *lib)
{
    if (!lib)
        return;
    free(lib->items);
    memset(lib, 0, sizeof *lib);
}
