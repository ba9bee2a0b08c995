/* Dataset metadata: "# key: value" lines before the header row. Keys are case-insensitive;
 * each may appear once. Known keys: components, pressure, temperature, source, sigma_T, sigma_P,
 * sigma_y, sigma_x; other keys are accepted and ignored. */
#include "data/csvrows.h"
#include "data/dataset_io.h"
#include "data/dataset_meta.h"

#include <ctype.h>
#include <math.h>
#include <pinchwise/units.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

void pw_ds_reader_init(pw_ds_reader *rd, const char *name)
{
    memset(rd, 0, sizeof *rd);
    rd->name = name;
    rd->ds.P_fixed_Pa = NAN;
    rd->ds.T_fixed_K = NAN;
    rd->ds.sigma_T_K = 0.1;
    rd->ds.sigma_P_rel = 0.001;
    rd->ds.sigma_P_abs_Pa = NAN;
    rd->ds.sigma_y = 0.004;
    rd->ds.sigma_x = 0.001;
    rd->col_x = rd->col_y = rd->col_m = -1;
    rd->delim = ',';
}

bool pw_ds_decimal_point(const pw_ds_reader *rd, const char *text, char *out, size_t cap)
{
    if (strlen(text) >= cap) {
        out[0] = '\0'; /* too long for a number: nothing that reads as one */
        return false;
    }
    snprintf(out, cap, "%s", text);
    for (char *p = out; rd->decimal_comma && *p; p++)
        if (*p == ',')
            *p = '.';
    return true;
}

void pw_ds_reader_free(pw_ds_reader *rd)
{
    free(rd->ds.pts);
    free(rd->keys);
    memset(rd, 0, sizeof *rd);
}

bool pw_dataset_split_quantity(const char *text, double *value, char *unit, size_t unit_cap)
{
    return pw_units_split(text, value, unit, unit_cap) == PW_SPLIT_OK;
}

typedef struct {
    char names[2][PW_NAME_MAX];
    size_t n;
    bool too_long;
} names_ctx;

static pw_status names_row(void *ctx, char **f, size_t n, long line, pw_error *err)
{
    (void)line;
    (void)err;
    names_ctx *nc = ctx;
    nc->n = n;
    for (size_t i = 0; i < n && i < 2; i++) {
        if (strlen(f[i]) >= PW_NAME_MAX)
            nc->too_long = true;
        else
            memcpy(nc->names[i], f[i], strlen(f[i]) + 1);
    }
    return PW_OK;
}

static pw_status components(pw_ds_reader *rd, const char *value, long line, pw_error *err)
{
    names_ctx nc;
    memset(&nc, 0, sizeof nc);
    pw_csvrows r;
    pw_error inner;
    pw_error_clear(&inner);
    pw_status st = pw_csvrows_init(&r, rd->name, NULL, names_row, &nc, &inner);
    if (st == PW_OK && rd->delim != ',' && strchr(value, rd->delim))
        pw_csvrows_set_delim(&r, rd->delim);
    if (st == PW_OK)
        st = pw_csvrows_feed(&r, value, strlen(value));
    if (st == PW_OK)
        st = pw_csvrows_finish(&r);
    pw_csvrows_free(&r);
    if (st == PW_ENOMEM)
        return pw_error_set(err, st, rd->name, line, "out of memory");
    if (st != PW_OK)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "components: %s (expected NAME1, NAME2; quote a name that holds a "
                            "comma)",
                            inner.msg);
    if (nc.n != 2 || nc.names[0][0] == '\0' || nc.names[1][0] == '\0')
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "components: found %zu name%s (expected exactly two non-empty names: "
                            "NAME1, NAME2)",
                            nc.n, nc.n == 1 ? "" : "s");
    if (nc.too_long)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "components: a name is too long (expected at most %d characters)",
                            PW_NAME_MAX - 1);
    if (strcasecmp(nc.names[0], nc.names[1]) == 0)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "components: '%s' is given twice (expected two different components)",
                            nc.names[0]);
    memcpy(rd->ds.names, nc.names, sizeof rd->ds.names);
    rd->ds.components_line = line;
    rd->have_components = true;
    return PW_OK;
}

static pw_status fixed_state(pw_ds_reader *rd, bool is_T, const char *value, long line,
                             pw_error *err)
{
    const char *key = is_T ? "temperature" : "pressure";
    pw_quantity q = is_T ? PW_QTY_TEMPERATURE : PW_QTY_PRESSURE;
    if ((is_T && rd->have_pressure) || (!is_T && rd->have_temperature))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "both '# pressure:' and '# temperature:' are given (expected exactly "
                            "one: pressure for T-x-y data, temperature for P-x-y data)");
    double v, si;
    char unit[32];
    if (!pw_dataset_split_quantity(value, &v, unit, sizeof unit))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s: '%s' is not a number with a unit (expected e.g. %s; units: %s)%s",
                            key, value, is_T ? "50 C" : "101.325 kPa", pw_units_list(q),
                            strchr(value, ',') ? "; a decimal comma is read only in files whose "
                                                 "fields are separated by ';'"
                                               : "");
    if (!pw_units_known(q, unit))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s: unknown unit '%s' (expected one of %s)", key, unit,
                            pw_units_list(q));
    if (pw_units_to_si(q, v, unit, &si) != PW_OK)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s: %s is not positive (expected an absolute %s above zero)", key,
                            value, key);
    /* the same plausible ranges as measured values (docs/inputs.md, "Limits") */
    if (is_T ? !(si >= PW_DATASET_T_MIN_K && si <= PW_DATASET_T_MAX_K)
             : !(si >= PW_DATASET_P_MIN_PA && si <= PW_DATASET_P_MAX_PA))
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s: %s is outside the plausible range %g to %g %s", key, value,
                            is_T ? PW_DATASET_T_MIN_K : PW_DATASET_P_MIN_PA,
                            is_T ? PW_DATASET_T_MAX_K : PW_DATASET_P_MAX_PA, is_T ? "K" : "Pa");
    snprintf(unit, sizeof unit, "%s", pw_units_canonical(q, unit));
    if (strlen(unit) >= PW_UNIT_MAX)
        return pw_error_set(err, PW_EPARSE, rd->name, line, "%s: unit '%s' is too long", key, unit);
    memcpy(rd->fixed_unit, unit, strlen(unit) + 1);
    if (is_T) {
        rd->ds.kind = PW_DATA_ISOTHERMAL;
        rd->ds.T_fixed_K = si;
        memcpy(rd->ds.T_unit, unit, strlen(unit) + 1);
        rd->have_temperature = true;
    } else {
        rd->ds.kind = PW_DATA_ISOBARIC;
        rd->ds.P_fixed_Pa = si;
        memcpy(rd->ds.P_unit, unit, strlen(unit) + 1);
        rd->have_pressure = true;
    }
    return PW_OK;
}

static pw_status sigma(pw_ds_reader *rd, const char *key, const char *value, long line,
                       pw_error *err)
{
    double v;
    const char *shown = strcmp(key, "sigma_t") == 0   ? "sigma_T"
                        : strcmp(key, "sigma_p") == 0 ? "sigma_P"
                                                      : key;
    bool fraction = strcasecmp(key, "sigma_y") == 0 || strcasecmp(key, "sigma_x") == 0;
    if (fraction) {
        if (!pw_csvrows_number(value, &v) || !(v > 0.0 && v < 1.0))
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "%s: '%s' (expected a mole-fraction uncertainty, a number "
                                "between 0 and 1 without unit, e.g. 0.004)",
                                shown, value);
        *(strcasecmp(key, "sigma_y") == 0 ? &rd->ds.sigma_y : &rd->ds.sigma_x) = v;
        *(strcasecmp(key, "sigma_y") == 0 ? &rd->ds.sigma_y_stated : &rd->ds.sigma_x_stated) = true;
        return PW_OK;
    }
    bool is_T = strcasecmp(key, "sigma_T") == 0;
    pw_error inner;
    pw_error_clear(&inner);
    pw_status st = is_T ? pw_units_parse_temperature_difference(value, &rd->ds.sigma_T_K, &inner)
                        : pw_units_parse_pressure_uncertainty(value, &rd->ds.sigma_P_rel,
                                                              &rd->ds.sigma_P_abs_Pa, &inner);
    if (st != PW_OK)
        return pw_error_set(err, PW_EPARSE, rd->name, line, "%s: %s", shown, inner.msg);
    return PW_OK;
}

static pw_status remember_key(pw_ds_reader *rd, const char *key, long line, pw_error *err)
{
    for (size_t i = 0; i < rd->nkeys; i++)
        if (strcmp(rd->keys[i].key, key) == 0)
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "metadata key '%s' is given twice (first on line %ld; expected "
                                "once)",
                                key, rd->keys[i].line);
    if (rd->nkeys == rd->keys_cap) {
        size_t cap = rd->keys_cap ? 2 * rd->keys_cap : 16;
        pw_ds_key *k = realloc(rd->keys, cap * sizeof *k);
        if (!k)
            return pw_error_set(err, PW_ENOMEM, rd->name, line, "out of memory");
        rd->keys = k;
        rd->keys_cap = cap;
    }
    snprintf(rd->keys[rd->nkeys].key, PW_DS_KEY_MAX, "%s", key);
    rd->keys[rd->nkeys].line = line;
    rd->nkeys++;
    return PW_OK;
}

pw_status pw_ds_meta_line(pw_ds_reader *rd, const char *text, size_t len, long line,
                          pw_error *err)
{
    (void)len;
    const char *colon = strchr(text, ':');
    if (!colon)
        return PW_OK; /* a free comment */
    const char *k = text + 1;
    while (isspace((unsigned char)*k))
        k++;
    size_t kl = (size_t)(colon - k);
    while (kl && isspace((unsigned char)k[kl - 1]))
        kl--;
    if (kl == 0)
        return PW_OK; /* "#: ..." is a comment too */
    if (kl >= PW_DS_KEY_MAX)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "metadata key is %zu characters long (expected a short key such as "
                            "'pressure'; write free comments without a colon)",
                            kl);
    char key[PW_DS_KEY_MAX];
    for (size_t i = 0; i < kl; i++)
        key[i] = (char)tolower((unsigned char)k[i]);
    key[kl] = '\0';
    const char *v = colon + 1;
    while (isspace((unsigned char)*v))
        v++;
    char value[PW_ERROR_MSG_MAX / 2];
    size_t vl = strlen(v);
    /* blanks, and the empty cells a spreadsheet adds after the one that holds the line */
    while (vl && (isspace((unsigned char)v[vl - 1]) || v[vl - 1] == rd->delim))
        vl--;
    pw_status st = remember_key(rd, key, line, err);
    if (st != PW_OK)
        return st;
    bool known = strcmp(key, "components") == 0 || strcmp(key, "pressure") == 0 ||
                 strcmp(key, "temperature") == 0 || strcmp(key, "source") == 0 ||
                 strncmp(key, "sigma_", 6) == 0;
    if (!known)
        return PW_OK;
    if (strcmp(key, "source") == 0) {
        if (vl >= sizeof rd->ds.source)
            return pw_error_set(err, PW_EPARSE, rd->name, line,
                                "source is %zu characters long (expected at most %zu)", vl,
                                sizeof rd->ds.source - 1);
        memcpy(rd->ds.source, v, vl);
        rd->ds.source[vl] = '\0';
        return PW_OK;
    }
    if (vl == 0)
        return pw_error_set(err, PW_EPARSE, rd->name, line, "%s: the value is empty (expected %s)",
                            key,
                            strcmp(key, "components") == 0 ? "NAME1, NAME2" : "a value");
    if (vl >= sizeof value)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "%s: the value is %zu characters long (expected at most %zu)", key,
                            vl, sizeof value - 1);
    memcpy(value, v, vl);
    value[vl] = '\0';
    if (rd->decimal_comma && strcmp(key, "components") != 0 && strcmp(key, "source") != 0) {
        char tmp[sizeof value];
        (void)pw_ds_decimal_point(rd, value, tmp, sizeof tmp); /* fits: same size */
        memcpy(value, tmp, sizeof value);
    }
    if (strcmp(key, "components") == 0)
        return components(rd, value, line, err);
    if (strcmp(key, "pressure") == 0)
        return fixed_state(rd, false, value, line, err);
    if (strcmp(key, "temperature") == 0)
        return fixed_state(rd, true, value, line, err);
    if (strcmp(key, "sigma_t") == 0 || strcmp(key, "sigma_p") == 0 ||
        strcmp(key, "sigma_y") == 0 || strcmp(key, "sigma_x") == 0)
        return sigma(rd, key, value, line, err);
    return pw_error_set(err, PW_EPARSE, rd->name, line,
                        "unknown uncertainty key '%s' (expected sigma_T, sigma_P, sigma_y or "
                        "sigma_x)",
                        key);
}

pw_status pw_ds_meta_complete(pw_ds_reader *rd, long line, pw_error *err)
{
    if (!rd->have_components)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "no '# components: NAME1, NAME2' line before the header row (it is "
                            "required)");
    if (!rd->have_pressure && !rd->have_temperature)
        return pw_error_set(err, PW_EPARSE, rd->name, line,
                            "neither '# pressure: VALUE UNIT' (T-x-y data) nor '# temperature: "
                            "VALUE UNIT' (P-x-y data) is given before the header row (exactly "
                            "one is required)");
    return PW_OK;
}
