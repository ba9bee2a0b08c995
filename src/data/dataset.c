/* Dataset files (measured binary VLE): reading and validation with libcsv.
 * Format and rules: include/pinchwise/dataset.h and docs/inputs.md. Metadata lines are taken
 * whole (see dataset_meta.c); from the header row on, everything goes through libcsv. */
#include "data/csvrows.h"
#include "data/dataset_io.h"
#include "data/dataset_meta.h"

#include <math.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

static pw_status on_line(void *ctx, const char *text, size_t len, long line, bool *is_csv,
                         pw_error *err)
{
    pw_ds_reader *rd = ctx;
    if (text[0] == '"' && text[1] == '#') {
        /* a spreadsheet cell holding the line, quoted because it holds the separator:
         * "# components: a, b";; -> # components: a, b */
        char buf[PW_ERROR_MSG_MAX];
        size_t n = 0;
        for (size_t i = 1; i < len && n + 1 < sizeof buf; i++) {
            if (text[i] == '"' && i + 1 < len && text[i + 1] == '"')
                buf[n++] = text[i++];
            else if (text[i] == '"')
                break;
            else
                buf[n++] = text[i];
        }
        buf[n] = '\0';
        return pw_ds_meta_line(rd, buf, n, line, err);
    }
    if (text[0] != '#') {
        *is_csv = true;
        return PW_OK;
    }
    return pw_ds_meta_line(rd, text, len, line, err);
}

/* Header column "T[UNIT]" or "P[UNIT]", also spelt with blanks or parentheses as spreadsheets
 * export them ("T [C]", "T (C)", "T(\u00b0C)"): returns 'T' or 'P' and copies the unit as written,
 * 't' or 'p' for a bare T or P (no unit), 0 for any other column. */
static char tp_column(const char *f, char *unit, size_t cap)
{
    char c = f[0];
    if (c != 'T' && c != 't' && c != 'P' && c != 'p')
        return 0;
    bool is_T = c == 'T' || c == 't';
    const char *p = f + 1;
    while (*p == ' ')
        p++;
    if (*p == '\0')
        return is_T ? 't' : 'p'; /* a bare T or P: no unit */
    char close = *p == '[' ? ']' : *p == '(' ? ')' : 0;
    size_t len = strlen(p);
    if (!close || len < 2 || p[len - 1] != close)
        return 0;
    const char *u = p + 1;
    size_t ul = len - 2;
    while (ul && *u == ' ')
        u++, ul--;
    while (ul && u[ul - 1] == ' ')
        ul--;
    if (ul >= cap)
        return 0;
    memcpy(unit, u, ul);
    unit[ul] = '\0';
    return is_T ? 'T' : 'P';
}

static pw_status header_row(pw_ds_reader *rd, char **f, size_t n, long line, pw_error *err)
{
    /* a tie-line (LLE) file given where VLE data are expected */
    for (size_t i = 0; i < n; i++)
        if (!strcasecmp(f[i], "x1_I") || !strcasecmp(f[i], "x1_II"))
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "the header row has the tie-line column '%.20s': this is a "
                                "liquid-liquid (LLE) file, not vapor-liquid data; give it to "
                                "fit with --lle beside a VLE data file",
                                f[i]);
    pw_status st = pw_ds_meta_complete(rd, line, err);
    if (st != PW_OK)
        return st;
    bool isobaric = rd->ds.kind == PW_DATA_ISOBARIC;
    rd->col_x = rd->col_y = rd->col_m = -1;
    for (size_t i = 0; i < n; i++) {
        char unit[32] = "";
        char tp = tp_column(f[i], unit, sizeof unit);
        long *slot = NULL;
        bool mass_x = strcasecmp(f[i], "w1") == 0, mass_y = strcasecmp(f[i], "wy1") == 0;
        if (strcasecmp(f[i], "x1") == 0 || mass_x) {
            if (rd->col_x >= 0 && strcasecmp(f[rd->col_x], f[i]) != 0)
                return pw_error_set(err, PW_EPARSE, rd->name, line,
                                    "columns '%s' and '%s' both give the liquid composition "
                                    "(expected one: x1 for mole fractions or w1 for mass fractions)",
                                    f[rd->col_x], f[i]);
            slot = &rd->col_x;
            rd->ds.mass_x = mass_x;
        } else if (strcasecmp(f[i], "y1") == 0 || mass_y) {
            if (rd->col_y >= 0 && strcasecmp(f[rd->col_y], f[i]) != 0)
                return pw_error_set(err, PW_EPARSE, rd->name, line,
                                    "columns '%s' and '%s' both give the vapor composition "
                                    "(expected one: y1 for mole fractions or wy1 for mass "
                                    "fractions)",
                                    f[rd->col_y], f[i]);
            slot = &rd->col_y;
            rd->ds.mass_y = mass_y;
        }
        else if (tp == 't' || tp == 'p')
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "column '%s' has no unit (expected %s[UNIT] with UNIT one of %s)",
                                f[i], tp == 't' ? "T" : "P",
                                pw_units_list(tp == 't' ? PW_QTY_TEMPERATURE : PW_QTY_PRESSURE));
        else if (tp == 'T' || tp == 'P') {
            bool is_T = tp == 'T';
            pw_quantity q = is_T ? PW_QTY_TEMPERATURE : PW_QTY_PRESSURE;
            if (!pw_units_known(q, unit))
                return pw_error_set(err, PW_EPARSE, rd->name, line,
                                    "unknown %s unit '%s' in column '%s' (expected one of %s)",
                                    is_T ? "temperature" : "pressure", unit, f[i],
                                    pw_units_list(q));
            if (is_T != isobaric)
                return pw_error_set(
                    err, PW_EPARSE, rd->name, line,
                    "column '%s' contradicts the metadata: the %s is fixed by '# %s:' (expected "
                    "a %s column; use '# %s:' instead for %s data)",
                    f[i], is_T ? "temperature" : "pressure", is_T ? "temperature" : "pressure",
                    is_T ? "P[UNIT]" : "T[UNIT]", is_T ? "pressure" : "temperature",
                    is_T ? "T-x-y" : "P-x-y");
            slot = &rd->col_m;
            snprintf(is_T ? rd->ds.T_unit : rd->ds.P_unit, PW_UNIT_MAX, "%s",
                     pw_units_canonical(q, unit));
        }
        if (!slot)
            continue; /* further columns are allowed and ignored */
        if (*slot >= 0)
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "column '%s' appears twice (columns %ld and %zu; expected once)",
                                f[i], *slot + 1, i + 1);
        *slot = (long)i;
    }
    if (rd->col_x < 0 || rd->col_m < 0) {
        /* say what was found: a spreadsheet may have used another separator or spelling */
        char found[160] = "";
        size_t used = 0;
        for (size_t i = 0; i < n && used + 1 < sizeof found; i++) {
            int w = snprintf(found + used, sizeof found - used, "%s'%.40s'", i ? ", " : "", f[i]);
            used += w > 0 ? (size_t)w : 0;
        }
        if (rd->col_x < 0)
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "no x1 column in the header row (found %zu column%s: %s; expected "
                                "x1 or w1, optional y1 or wy1, and %s, separated by ',' or ';')",
                                n, n == 1 ? "" : "s", found, isobaric ? "T[UNIT]" : "P[UNIT]");
    }
    rd->ds.composition_line = line;
    if (rd->col_m < 0)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "no %s column in the header row (expected one for %s data, as the "
                            "metadata fixes the %s; spellings T[C], T [C], T (C))",
                            isobaric ? "T[UNIT]" : "P[UNIT]",
                            isobaric ? "isobaric T-x-y" : "isothermal P-x-y",
                            isobaric ? "pressure" : "temperature");
    rd->ncols = n;
    rd->header_line = line;
    rd->header_seen = true;
    return PW_OK;
}

/* A field as quoted in a message: at most 40 characters, longer ones cut with "...". */
static const char *shown(const char *text, char buf[48])
{
    if (strlen(text) <= 40)
        return text;
    snprintf(buf, 48, "%.37s...", text);
    return buf;
}

static pw_status fraction(pw_ds_reader *rd, const char *text, const char *what, long line,
                          double *out, pw_error *err)
{
    bool mass = what[0] == 'w';
    const char *kind = mass ? "mass fraction" : "mole fraction";
    if (text[0] == '\0')
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s is empty (expected a %s between 0 and 1)", what, kind);
    char sb[48], num[128];
    if (!pw_ds_decimal_point(rd, text, num, sizeof num) || !pw_csvrows_number(num, out))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s = '%s' is not a number (expected a %s between 0 and 1%s)", what,
                            shown(text, sb), kind,
                            strchr(text, ',') ? "; a decimal comma is read only in files whose "
                                                "fields are separated by ';'"
                                              : "");
    if (*out < 0.0 || *out > 1.0)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s = %s is outside [0, 1] (expected a %s%s)", what, text, kind,
                            *out > 1.0 && *out <= 100.0
                                ? (mass ? "; looks like mass percent; divide by 100"
                                        : "; looks like mole percent; divide by 100")
                                : "");
    return PW_OK;
}

static pw_status data_row(pw_ds_reader *rd, char **f, size_t n, long line, pw_error *err)
{
    pw_dataset *ds = &rd->ds;
    pw_point p;
    pw_status st;
    if (f[0][0] == '#')
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "metadata line after the header row (expected '# key: value' lines "
                            "before the header only)");
    if (n != rd->ncols)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "row has %zu fields (expected %zu, as in the header on line %ld)%s", n,
                            rd->ncols, rd->header_line,
                            n > rd->ncols && rd->delim == ','
                                ? "; if the numbers use decimal commas, separate the fields with "
                                  "';' (as spreadsheets export them)"
                                : "");
    if ((st = fraction(rd, f[rd->col_x], ds->mass_x ? "w1" : "x1", line, &p.x1, err)))
        return st;
    p.y1 = NAN;
    if (rd->col_y >= 0) {
        bool given = f[rd->col_y][0] != '\0';
        if (rd->y_first_line == 0) {
            rd->y_given = given;
            rd->y_first_line = line;
        } else if (given != rd->y_given) {
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "y1 is %s here but %s on line %ld (expected y1 on every row or "
                                "on none)",
                                given ? "given" : "empty", given ? "empty" : "given",
                                rd->y_first_line);
        }
        if (given && (st = fraction(rd, f[rd->col_y], ds->mass_y ? "wy1" : "y1", line, &p.y1, err)))
            return st;
    }
    bool isobaric = ds->kind == PW_DATA_ISOBARIC;
    const char *what = isobaric ? "T" : "P";
    const char *unit = isobaric ? ds->T_unit : ds->P_unit;
    const char *text = f[rd->col_m];
    double v, si;
    if (text[0] == '\0')
        return pw_error_set(err, PW_EPARSE, rd->name, line, "%s is empty (expected a number in %s)",
                            what, unit);
    char sb[48], num[128];
    if (!pw_ds_decimal_point(rd, text, num, sizeof num) || !pw_csvrows_number(num, &v))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s = '%s' is not a number (expected a finite decimal number in %s%s)",
                            what, shown(text, sb), unit,
                            strchr(text, ',') ? "; a decimal comma is read only in files whose "
                                                "fields are separated by ';'"
                                              : "");
    if (pw_units_to_si(isobaric ? PW_QTY_TEMPERATURE : PW_QTY_PRESSURE, v, unit, &si) != PW_OK)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s = %s %s is not positive (expected an absolute %s above zero)",
                            what, text, unit, isobaric ? "temperature" : "pressure");
    double lo = isobaric ? PW_DATASET_T_MIN_K : PW_DATASET_P_MIN_PA;
    double hi = isobaric ? PW_DATASET_T_MAX_K : PW_DATASET_P_MAX_PA;
    if (si < lo || si > hi)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s = %s %s is outside the plausible range of measured VLE data "
                            "(expected %g to %g %s)",
                            what, text, unit, lo, hi, isobaric ? "K" : "Pa");
    if (ds->n >= PW_DATASET_MAX_POINTS)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "more than %d data rows (the reader's limit; a measured VLE data set "
                            "has tens to hundreds of points: split or thin the file)",
                            PW_DATASET_MAX_POINTS);
    p.T_K = isobaric ? si : ds->T_fixed_K;
    p.P_Pa = isobaric ? ds->P_fixed_Pa : si;
    p.line = line;
    if (ds->n == rd->cap) {
        size_t cap = rd->cap ? 2 * rd->cap : 32;
        pw_point *pts = realloc(ds->pts, cap * sizeof *pts);
        if (!pts)
            return pw_error_set(err, PW_ENOMEM, rd->name, line, "out of memory");
        ds->pts = pts;
        rd->cap = cap;
    }
    ds->pts[ds->n++] = p;
    return PW_OK;
}

static pw_status on_row(void *ctx, char **f, size_t n, long line, pw_error *err)
{
    pw_ds_reader *rd = ctx;
    return rd->header_seen ? data_row(rd, f, n, line, err) : header_row(rd, f, n, line, err);
}

pw_status pw_dataset_parse_chunked(const char *buf, size_t len, const char *name, size_t chunk,
                                   pw_dataset *ds, pw_error *err)
{
    if (!ds)
        return pw_error_set(err, PW_EINVAL, name, 0, "no dataset given");
    memset(ds, 0, sizeof *ds);
    if (!buf && len)
        return pw_error_set(err, PW_EINVAL, name, 0, "no buffer given");
    const char *nm = name ? name : "(dataset)";
    if (len > PW_DATASET_MAX_BYTES)
        return pw_error_set(err, PW_EPARSE, nm, 0,
                            "the file has %zu bytes (expected at most %u, the reader's limit)", len,
                            PW_DATASET_MAX_BYTES);
    pw_status ust = pw_check_utf8(buf, len, nm, err);
    if (ust != PW_OK)
        return ust;
    pw_ds_reader rd;
    pw_ds_reader_init(&rd, nm);
    /* a spreadsheet export may separate fields with ';' (and then write decimal commas) */
    rd.delim = pw_csvrows_detect_delim(buf, len);
    rd.decimal_comma = rd.delim != ',';
    pw_csvrows r;
    pw_status st = pw_csvrows_init(&r, rd.name, on_line, on_row, &rd, err);
    pw_csvrows_set_delim(&r, rd.delim);
    if (st == PW_OK)
        st = pw_csvrows_feed_all(&r, buf, len, chunk);
    long last_line = r.line;
    pw_csvrows_free(&r);
    if (st == PW_OK && !rd.header_seen) {
        st = pw_ds_meta_complete(&rd, last_line, err);
        if (st == PW_OK)
            st = pw_error_set(err, PW_EPARSE, rd.name, last_line,
                              "no header row (expected x1, optional y1, and %s after the "
                              "metadata)",
                              rd.ds.kind == PW_DATA_ISOBARIC ? "T[UNIT]" : "P[UNIT]");
    } else if (st == PW_OK && rd.ds.n == 0) {
        st = pw_error_set(err, PW_EPARSE, rd.name, rd.header_line,
                          "no data rows after the header row (expected at least one)");
    }
    if (st != PW_OK) {
        pw_ds_reader_free(&rd);
        return st;
    }
    rd.ds.has_y = rd.col_y >= 0 && rd.y_given;
    snprintf(rd.ds.path, sizeof rd.ds.path, "%s", rd.name);
    pw_sha256(buf, len, rd.ds.sha256);
    *ds = rd.ds;
    rd.ds.pts = NULL;
    pw_ds_reader_free(&rd);
    return PW_OK;
}

pw_status pw_dataset_parse(const char *buf, size_t len, const char *name, pw_dataset *ds,
                           pw_error *err)
{
    return pw_dataset_parse_chunked(buf, len, name, 0, ds, err);
}

pw_status pw_dataset_read(const char *path, pw_dataset *ds, pw_error *err)
{
    if (ds)
        memset(ds, 0, sizeof *ds);
    char *buf;
    size_t len;
    pw_status st = pw_csvrows_slurp(path, PW_DATASET_MAX_BYTES, &buf, &len, err);
    if (st != PW_OK)
        return st;
    st = pw_dataset_parse(buf, len, path, ds, err);
    free(buf);
    return st;
}

void pw_dataset_free(pw_dataset *ds)
{
    if (!ds)
        return;
    free(ds->pts);
    memset(ds, 0, sizeof *ds);
}
