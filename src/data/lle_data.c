/* LLE (tie-line) files: metadata lines as in dataset files (dataset_meta.c), rows through libcsv.
 * Format: include/pinchwise/lledata.h. */
#include "data/csvrows.h"
#include "data/dataset_meta.h"

#include <math.h>
#include <pinchwise/lledata.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

typedef struct lle_reader {
    pw_ds_reader meta;
    pw_lle_dataset *d;
    size_t cap;
    bool header_seen, mass;
    long col_T, col_a, col_b, header_line;
    char T_unit[PW_UNIT_MAX];
} lle_reader;

static pw_status on_line(void *ctx, const char *text, size_t len, long line, bool *is_csv,
                         pw_error *err)
{
    lle_reader *r = ctx;
    if (text[0] != '#') {
        *is_csv = true;
        return PW_OK;
    }
    return pw_ds_meta_line(&r->meta, text, len, line, err);
}

/* A number of the file, its decimal comma made a point where the file uses ';' fields. */
static bool number(const lle_reader *r, const char *text, double *out)
{
    char num[64];
    return pw_ds_decimal_point(&r->meta, text, num, sizeof num) && pw_csvrows_number(num, out);
}

static pw_status header(lle_reader *r, char **f, size_t n, long line, pw_error *err)
{
    const char *name = r->meta.name;
    if (!r->meta.have_components)
        return pw_error_set(err, PW_EPARSE, name, line,
                            "no '# components: NAME1, NAME2' line before the header row");
    r->col_T = r->col_a = r->col_b = -1;
    bool by_mole = false, by_mass = false;
    for (size_t i = 0; i < n; i++) {
        long *slot = NULL;
        bool w = !strcasecmp(f[i], "w1_I") || !strcasecmp(f[i], "w1_II");
        if (w || !strcasecmp(f[i], "x1_I") || !strcasecmp(f[i], "x1_II")) {
            if (w ? by_mole : by_mass)
                return pw_error_set(err, PW_EPARSE, name, line,
                                    "column '%s': the layers are given both as mole fractions "
                                    "(x1_I, x1_II) and as mass fractions (w1_I, w1_II); keep one",
                                    f[i]);
            by_mass |= w;
            by_mole |= !w;
            bool lean = !strcasecmp(f[i] + 2, "_I");
            slot = lean ? &r->col_a : &r->col_b;
        } else if ((f[i][0] == 'T' || f[i][0] == 't') && f[i][1] == '[') {
            size_t len = strlen(f[i]);
            if (f[i][len - 1] != ']' || len - 3 >= sizeof r->T_unit || len < 4)
                return pw_error_set(err, PW_EPARSE, name, line,
                                    "column '%s': expected T[UNIT], e.g. T[C] or T[K]", f[i]);
            memcpy(r->T_unit, f[i] + 2, len - 3);
            r->T_unit[len - 3] = '\0';
            double probe;
            if (pw_units_to_si(PW_QTY_TEMPERATURE, 300.0, r->T_unit, &probe) != PW_OK)
                return pw_error_set(err, PW_EPARSE, name, line,
                                    "column '%s': unknown temperature unit '%s' (expected K, C or F)",
                                    f[i], r->T_unit);
            slot = &r->col_T;
        } else if (!strcasecmp(f[i], "T")) {
            return pw_error_set(err, PW_EPARSE, name, line,
                                "column 'T' has no unit (expected T[UNIT] with UNIT K, C or F)");
        }
        if (slot) {
            if (*slot >= 0)
                return pw_error_set(err, PW_EPARSE, name, line, "column '%s' appears twice", f[i]);
            *slot = (long)i;
        }
    }
    const char *ca = by_mass ? "w1_I" : "x1_I", *cb = by_mass ? "w1_II" : "x1_II";
    if (r->col_T < 0 || r->col_a < 0 || r->col_b < 0)
        return pw_error_set(err, PW_EPARSE, name, line,
                            "the header row needs the columns T[UNIT], x1_I and x1_II (or w1_I "
                            "and w1_II for mass fractions; got %zu columns without %s)",
                            n, r->col_T < 0 ? "T[UNIT]" : r->col_a < 0 ? ca : cb);
    r->mass = by_mass;
    r->header_line = line;
    r->header_seen = true;
    return PW_OK;
}

static pw_status row(void *ctx, char **f, size_t n, long line, pw_error *err)
{
    lle_reader *r = ctx;
    const char *name = r->meta.name;
    if (!r->header_seen)
        return header(r, f, n, line, err);
    long need = r->col_T > r->col_a ? r->col_T : r->col_a;
    need = need > r->col_b ? need : r->col_b;
    if ((long)n <= need)
        return pw_error_set(err, PW_EPARSE, name, line, "%zu fields, expected at least %ld", n,
                            need + 1);
    double T, a, b, TK;
    if (!number(r, f[r->col_T], &T))
        return pw_error_set(err, PW_EPARSE, name, line, "temperature '%.40s' is not a number",
                            f[r->col_T]);
    if (pw_units_to_si(PW_QTY_TEMPERATURE, T, r->T_unit, &TK) != PW_OK || !(TK > 1.0)
        || !(TK < 5000.0))
        return pw_error_set(err, PW_EPARSE, name, line,
                            "temperature %g %s is outside 1-5000 K", T, r->T_unit);
    const char *ca = r->mass ? "w1_I" : "x1_I", *cb = r->mass ? "w1_II" : "x1_II";
    if (!number(r, f[r->col_a], &a) || !number(r, f[r->col_b], &b))
        return pw_error_set(err, PW_EPARSE, name, line,
                            "%s and %s must be numbers (got '%.40s', '%.40s')", ca, cb,
                            f[r->col_a], f[r->col_b]);
    if (!(a > 0.0 && a < 1.0 && b > 0.0 && b < 1.0))
        return pw_error_set(err, PW_EPARSE, name, line,
                            "layer compositions must lie strictly between 0 and 1 (got %g, %g)%s",
                            a, b,
                            (a > 1.0 && a <= 100.0) || (b > 1.0 && b <= 100.0)
                                ? (r->mass ? ": looks like mass percent; divide by 100"
                                           : ": looks like mole percent; divide by 100")
                                : "");
    if (!(a < b))
        return pw_error_set(err, PW_EPARSE, name, line,
                            "%s (%g) must be below %s (%g): the layer lean in component 1 "
                            "first",
                            ca, a, cb, b);
    pw_lle_dataset *d = r->d;
    if (d->n >= PW_LLE_MAX_ROWS)
        return pw_error_set(err, PW_EPARSE, name, line, "more than %d tie lines",
                            PW_LLE_MAX_ROWS);
    if (d->n == r->cap) {
        size_t nc = r->cap ? 2 * r->cap : 16;
        pw_tie_line *p = realloc(d->rows, nc * sizeof *p);
        if (!p)
            return pw_error_set(err, PW_ENOMEM, name, line, "out of memory");
        d->rows = p;
        r->cap = nc;
    }
    d->rows[d->n++] = (pw_tie_line){TK, a, b, line};
    return PW_OK;
}

pw_status pw_lle_dataset_parse(const char *buf, size_t len, const char *name, pw_lle_dataset *out,
                               pw_error *err)
{
    if (!buf || !out)
        return pw_error_set(err, PW_EINVAL, name, 0, "missing argument");
    memset(out, 0, sizeof *out);
    pw_status st = pw_check_utf8(buf, len, name, err);
    if (st != PW_OK)
        return st;
    lle_reader r;
    memset(&r, 0, sizeof r);
    pw_ds_reader_init(&r.meta, name);
    r.d = out;
    /* a spreadsheet export may separate fields with ';' (and then write decimal commas), as in
     * dataset files */
    r.meta.delim = pw_csvrows_detect_delim(buf, len);
    r.meta.decimal_comma = r.meta.delim != ',';
    pw_csvrows rows;
    st = pw_csvrows_init(&rows, name, on_line, row, &r, err);
    pw_csvrows_set_delim(&rows, r.meta.delim);
    if (st == PW_OK)
        st = pw_csvrows_feed_all(&rows, buf, len, 0);
    pw_csvrows_free(&rows);
    if (st == PW_OK && !r.header_seen)
        st = pw_error_set(err, PW_EPARSE, name, 0,
                          "no header row (expected T[UNIT], x1_I, x1_II after the metadata lines)");
    if (st == PW_OK && out->n == 0)
        st = pw_error_set(err, PW_ETOOFEW, name, 0, "no tie lines after the header row");
    if (st == PW_OK) {
        snprintf(out->path, sizeof out->path, "%s", name);
        memcpy(out->names, r.meta.ds.names, sizeof out->names);
        out->components_line = r.meta.ds.components_line;
        snprintf(out->source, sizeof out->source, "%s", r.meta.ds.source);
        out->P_Pa = r.meta.have_pressure ? r.meta.ds.P_fixed_Pa : (double)NAN;
        out->mass = r.mass;
        out->header_line = r.header_line;
        out->sigma_x_given = false;
        for (size_t k = 0; k < r.meta.nkeys; k++)
            if (!strcmp(r.meta.keys[k].key, "sigma_x"))
                out->sigma_x_given = true;
        out->sigma_x = out->sigma_x_given ? r.meta.ds.sigma_x : PW_LLE_SIGMA_X_DEFAULT;
        if (!(out->sigma_x > 0.0))
            st = pw_error_set(err, PW_EPARSE, name, 0, "sigma_x must be positive");
    }
    pw_ds_reader_free(&r.meta);
    if (st != PW_OK)
        pw_lle_dataset_free(out);
    return st;
}

pw_status pw_lle_dataset_read(const char *path, pw_lle_dataset *out, pw_error *err)
{
    char *buf = NULL;
    size_t len = 0;
    if (out)
        memset(out, 0, sizeof *out);
    pw_status st = pw_csvrows_slurp(path, 16u * 1024u * 1024u, &buf, &len, err);
    if (st != PW_OK)
        return st;
    st = pw_lle_dataset_parse(buf, len, path, out, err);
    free(buf);
    return st;
}

void pw_lle_dataset_swap(pw_lle_dataset *d)
{
    if (!d)
        return;
    char t[PW_NAME_MAX];
    memcpy(t, d->names[0], sizeof t);
    memcpy(d->names[0], d->names[1], sizeof t);
    memcpy(d->names[1], t, sizeof t);
    for (size_t i = 0; i < d->n; i++) {
        double a = d->rows[i].x_I, b = d->rows[i].x_II;
        d->rows[i].x_I = 1.0 - b;
        d->rows[i].x_II = 1.0 - a;
    }
}

void pw_lle_dataset_free(pw_lle_dataset *d)
{
    if (!d)
        return;
    free(d->rows);
    d->rows = NULL;
    d->n = 0;
}
