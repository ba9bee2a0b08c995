/* Temperature and pressure units. Conversions: K = C + 273.15 (ITS-90 convention),
 * K = (F + 459.67) * 5/9; 1 atm = 101325 Pa exactly, 1 bar = 1e5 Pa, 1 mmHg = 101325/760 Pa
 * (the conventional millimetre of mercury taken as 1/760 atm, i.e. the torr), 1 psi =
 * 0.45359237 kg * 9.80665 m/s2 / (0.0254 m)^2 = 6894.757293168... Pa
 * (NIST SP 811, Appendix B.8). */
#include <pinchwise/units.h>

#include "base/decimal_internal.h"

#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdbool.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

typedef struct {
    const char *name;
    double scale, offset; /* si = (value + offset) * scale */
} unit_def;

/* Each table lists the canonical spelling first and its other spellings after it, each alias with
 * the canonical name it stands for (pw_units_canonical). */
typedef struct {
    const char *alias, *canonical;
} unit_alias;

static const unit_def temperature_units[] = {
    {"K", 1.0, 0.0},
    {"C", 1.0, 273.15},
    {"F", 5.0 / 9.0, 459.67},
};

static const unit_def pressure_units[] = {
    {"Pa", 1.0, 0.0},          {"kPa", 1e3, 0.0},
    {"MPa", 1e6, 0.0},         {"bar", 1e5, 0.0},
    {"atm", 101325.0, 0.0},    {"mmHg", 101325.0 / 760.0, 0.0},
    {"psia", 0.45359237 * 9.80665 / (0.0254 * 0.0254), 0.0}, /* lbf/in2, exact */
};

/* Other spellings: degree signs (U+00B0 followed by the letter; U+2103 and U+2109 as single
 * characters), "deg" prefixes, the torr (taken as 1/760 atm, the same as mmHg above), psi read as
 * absolute (psia), and bara as bar (absolute). Gauge pressures are not accepted. */
static const unit_alias temperature_aliases[] = {
    {"degC", "C"}, {"\xc2\xb0" "C", "C"}, {"\xe2\x84\x83", "C"},
    {"degF", "F"}, {"\xc2\xb0" "F", "F"}, {"\xe2\x84\x89", "F"},
};

static const unit_alias pressure_aliases[] = {
    {"torr", "mmHg"},
    {"psi", "psia"},
    {"bara", "bar"},
};

static const unit_def *find_unit_exact(pw_quantity q, const char *unit);

static const unit_def *find_unit(pw_quantity q, const char *unit)
{
    const unit_def *u = find_unit_exact(q, unit);
    if (u || !unit)
        return u;
    const unit_alias *al = q == PW_QTY_TEMPERATURE ? temperature_aliases : pressure_aliases;
    size_t na = q == PW_QTY_TEMPERATURE ? sizeof temperature_aliases / sizeof *temperature_aliases
                                        : sizeof pressure_aliases / sizeof *pressure_aliases;
    for (size_t i = 0; i < na; i++)
        if (strcasecmp(al[i].alias, unit) == 0)
            return find_unit_exact(q, al[i].canonical);
    return NULL;
}

static const unit_def *find_unit_exact(pw_quantity q, const char *unit)
{
    const unit_def *table = q == PW_QTY_TEMPERATURE ? temperature_units : pressure_units;
    size_t n = q == PW_QTY_TEMPERATURE ? sizeof temperature_units / sizeof *temperature_units
                                       : sizeof pressure_units / sizeof *pressure_units;
    if (!unit || !unit[0])
        return NULL;
    /* The first letter settles most candidates before the full comparison (this sits on the
     * vapor-pressure hot path). */
    int c0 = tolower((unsigned char)unit[0]);
    for (size_t i = 0; i < n; i++)
        if (tolower((unsigned char)table[i].name[0]) == c0 && strcasecmp(table[i].name, unit) == 0)
            return &table[i];
    return NULL;
}

pw_status pw_units_affine(pw_quantity q, const char *unit, double *scale, double *offset)
{
    const unit_def *u = find_unit(q, unit);
    if (!u)
        return PW_EINVAL;
    *scale = u->scale;
    *offset = u->offset;
    return PW_OK;
}

int pw_units_known(pw_quantity q, const char *unit) { return find_unit(q, unit) != NULL; }

const char *pw_units_list(pw_quantity q)
{
    return q == PW_QTY_TEMPERATURE ? "K, C, F (also degC, \xc2\xb0" "C, degF, \xc2\xb0" "F)"
                                   : "Pa, kPa, MPa, bar, atm, mmHg, psia (also bara, torr, psi)";
}

const char *pw_units_canonical(pw_quantity q, const char *unit)
{
    const unit_def *u = find_unit(q, unit);
    return u ? u->name : NULL;
}

pw_status pw_units_to_si(pw_quantity q, double value, const char *unit, double *si)
{
    const unit_def *u = find_unit(q, unit);
    if (!u)
        return PW_EINVAL;
    double v = (value + u->offset) * u->scale;
    if (!isfinite(v) || v <= 0.0)
        return PW_EDOM;
    *si = v;
    return PW_OK;
}

pw_status pw_units_from_si(pw_quantity q, double si, const char *unit, double *value)
{
    const unit_def *u = find_unit(q, unit);
    if (!u)
        return PW_EINVAL;
    *value = si / u->scale - u->offset;
    return PW_OK;
}

bool pw_decimal_syntax_ok(const char *text)
{
    const char *p = text;
    bool digits = false;
    if (!p)
        return false;
    if (*p == '+' || *p == '-')
        p++;
    while (isdigit((unsigned char)*p))
        p++, digits = true;
    if (*p == '.') {
        p++;
        while (isdigit((unsigned char)*p))
            p++, digits = true;
    }
    if (!digits)
        return false;
    if (*p == 'e' || *p == 'E') {
        p++;
        if (*p == '+' || *p == '-')
            p++;
        if (!isdigit((unsigned char)*p))
            return false;
        while (isdigit((unsigned char)*p))
            p++;
    }
    return *p == '\0';
}

/* Strict decimal number (pw_decimal_syntax_ok), finite and not under- or overflowing. */
static bool strict_number(const char *text, double *out)
{
    if (!pw_decimal_syntax_ok(text))
        return false;
    errno = 0;
    double v = strtod(text, NULL);
    if (!isfinite(v) || errno == ERANGE)
        return false;
    *out = v;
    return true;
}

static bool exponent_at(const char *s)
{
    if (*s != 'e' && *s != 'E')
        return false;
    s++;
    if (*s == '+' || *s == '-')
        s++;
    return isdigit((unsigned char)*s);
}

pw_units_split_result pw_units_split(const char *text, double *value, char *unit, size_t unit_cap)
{
    if (!text)
        return PW_SPLIT_NO_NUMBER;
    while (isspace((unsigned char)*text))
        text++;
    size_t i = 0;
    while (text[i] && !isspace((unsigned char)text[i]) && text[i] != '%' &&
           (unsigned char)text[i] < 0x80 && !(isalpha((unsigned char)text[i]) && !exponent_at(text + i)))
        i++;
    char num[64];
    if (i == 0 || i >= sizeof num)
        return PW_SPLIT_NO_NUMBER;
    memcpy(num, text, i);
    num[i] = '\0';
    if (!strict_number(num, value))
        return PW_SPLIT_NO_NUMBER;
    const char *u = text + i;
    while (isspace((unsigned char)*u))
        u++;
    size_t ul = strlen(u);
    while (ul && isspace((unsigned char)u[ul - 1]))
        ul--;
    if (ul == 0)
        return PW_SPLIT_NO_UNIT;
    if (ul >= unit_cap)
        return PW_SPLIT_BAD_UNIT;
    for (size_t k = 0; k < ul; k++)
        if (isspace((unsigned char)u[k]))
            return PW_SPLIT_BAD_UNIT;
    memcpy(unit, u, ul);
    unit[ul] = '\0';
    return PW_SPLIT_OK;
}

pw_status pw_units_parse_quantity(pw_quantity q, const char *text, double *si, pw_error *err)
{
    const char *what = q == PW_QTY_TEMPERATURE ? "temperature" : "pressure";
    if (!text || !*text)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "empty %s (expected a number with a unit: %s)",
                            what, pw_units_list(q));
    double v;
    char unit[32];
    switch (pw_units_split(text, &v, unit, sizeof unit)) {
    case PW_SPLIT_OK:
        break;
    case PW_SPLIT_NO_UNIT:
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "'%s' has no unit (write the unit after the number; units: %s)", text,
                            pw_units_list(q));
    case PW_SPLIT_BAD_UNIT:
        return pw_error_set(err, PW_EINVAL, NULL, 0, "unknown %s unit in '%s' (units: %s)", what,
                            text, pw_units_list(q));
    case PW_SPLIT_NO_NUMBER:
    default:
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "'%s' is not a %s (expected a plain decimal number with a unit, e.g. "
                            "%s; units: %s)",
                            text, what, q == PW_QTY_TEMPERATURE ? "350K or 50C" : "101.325kPa or 1atm",
                            pw_units_list(q));
    }
    if (!find_unit(q, unit))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "unknown %s unit '%s' in '%s' (units: %s)",
                            what, unit, text, pw_units_list(q));
    pw_status st = pw_units_to_si(q, v, unit, si);
    if (st != PW_OK)
        return pw_error_set(err, st, NULL, 0, "%s '%s' is not above absolute zero", what, text);
    return PW_OK;
}

pw_status pw_units_parse_temperature_difference(const char *text, double *K, pw_error *err)
{
    double v;
    char unit[32];
    const unit_def *u = NULL;
    if (pw_units_split(text, &v, unit, sizeof unit) == PW_SPLIT_OK)
        u = find_unit(PW_QTY_TEMPERATURE, unit);
    if (!u && pw_units_split(text, &v, unit, sizeof unit) == PW_SPLIT_OK)
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "unknown unit '%s' in '%s' (expected a temperature difference in %s)",
                            unit, text, pw_units_list(PW_QTY_TEMPERATURE));
    if (!u || !(v > 0.0))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "'%s' is not a temperature difference (expected a positive number with "
                            "its unit, e.g. 0.05K or 0.1 C; units: %s)",
                            text ? text : "", pw_units_list(PW_QTY_TEMPERATURE));
    *K = v * u->scale; /* a difference: only the size of the degree counts, not the offset */
    return PW_OK;
}

pw_status pw_units_parse_pressure_uncertainty(const char *text, double *rel, double *abs_Pa,
                                              pw_error *err)
{
    double v;
    char unit[32];
    pw_units_split_result r = pw_units_split(text, &v, unit, sizeof unit);
    const unit_def *u = r == PW_SPLIT_OK ? find_unit(PW_QTY_PRESSURE, unit) : NULL;
    bool percent = r == PW_SPLIT_OK && strcmp(unit, "%") == 0;
    if (r == PW_SPLIT_OK && !u && !percent)
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "unknown unit '%s' in '%s' (expected %% or one of %s)", unit, text,
                            pw_units_list(PW_QTY_PRESSURE));
    if ((!u && !percent) || !(v > 0.0))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "'%s' is not a pressure uncertainty (expected a positive number with %% "
                            "or a pressure unit, e.g. 0.2%% or 0.05kPa; units: %%, %s)",
                            text ? text : "", pw_units_list(PW_QTY_PRESSURE));
    if (percent) {
        *rel = v / 100.0;
        *abs_Pa = NAN;
    } else {
        *rel = NAN;
        *abs_Pa = v * u->scale;
    }
    return PW_OK;
}

pw_status pw_units_parse_composition(const char *text, double *value, pw_basis *basis,
                                     pw_error *err)
{
    double v;
    char unit[32];
    pw_units_split_result r = pw_units_split(text, &v, unit, sizeof unit);
    double scale = 1.0;
    pw_basis b = PW_BASIS_MOLE;
    if (r == PW_SPLIT_NO_UNIT) {
        /* a bare number: a mole fraction */
    } else if (r == PW_SPLIT_OK && (!strcasecmp(unit, "mol") || !strcasecmp(unit, "mol%"))) {
        scale = unit[3] ? 0.01 : 1.0;
    } else if (r == PW_SPLIT_OK && (!strcasecmp(unit, "wt") || !strcasecmp(unit, "wt%"))) {
        scale = unit[2] ? 0.01 : 1.0;
        b = PW_BASIS_MASS;
    } else if (r == PW_SPLIT_OK && !strcmp(unit, "%")) {
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "'%s': say which percent (write mol%% for mole percent or wt%% for mass "
                            "percent)",
                            text);
    } else {
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "'%s' is not a composition (expected a mole fraction such as 0.95, or a "
                            "number with mol%%, wt or wt%%, e.g. 95mol%%, 0.98wt, 99.5wt%%)",
                            text ? text : "");
    }
    v *= scale;
    if (!(v >= 0.0 && v <= 1.0)) {
        bool pct_hint = r == PW_SPLIT_NO_UNIT && v > 1.0 && v <= 100.0;
        return pw_error_set(err, PW_EINVAL, NULL, 0, "'%s' is outside [0, 1] as a %s fraction%s",
                            text, b == PW_BASIS_MASS ? "mass" : "mole",
                            pct_hint ? " (looks like a percentage: write mol% or wt% after it, or "
                                       "divide by 100)"
                                     : "");
    }
    *value = v;
    *basis = b;
    return PW_OK;
}

double pw_units_mass_to_mole(double w, double M1, double M2)
{
    if (w <= 0.0)
        return 0.0;
    if (w >= 1.0)
        return 1.0;
    double n1 = w / M1, n2 = (1.0 - w) / M2;
    return n1 / (n1 + n2);
}

double pw_units_mole_to_mass(double x, double M1, double M2)
{
    if (x <= 0.0)
        return 0.0;
    if (x >= 1.0)
        return 1.0;
    double m1 = x * M1, m2 = (1.0 - x) * M2;
    return m1 / (m1 + m2);
}

/* ---- display units ---- */

pw_display_units pw_units_display_default(void)
{
    pw_display_units u = {"K", "kPa"};
    return u;
}

pw_status pw_units_display_parse(const char *text, pw_display_units *out, pw_error *err)
{
    pw_display_units u = pw_units_display_default();
    bool have_T = false, have_P = false;
    if (!text || !out)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "no display units given");
    const char *p = text;
    for (;;) {
        size_t n = strcspn(p, ",");
        char item[32];
        size_t a = 0, b = n;
        while (a < b && isspace((unsigned char)p[a]))
            a++;
        while (b > a && isspace((unsigned char)p[b - 1]))
            b--;
        if (b == a || b - a >= sizeof item)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "display units \"%s\": expected a temperature unit and/or a "
                                "pressure unit separated by a comma, such as C,bar",
                                text);
        memcpy(item, p + a, b - a);
        item[b - a] = '\0';
        const char *t = pw_units_canonical(PW_QTY_TEMPERATURE, item);
        const char *q = t ? NULL : pw_units_canonical(PW_QTY_PRESSURE, item);
        if (!t && !q)
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "display units \"%s\": \"%s\" is neither a temperature unit (%s) "
                                "nor a pressure unit (%s)",
                                text, item, pw_units_list(PW_QTY_TEMPERATURE),
                                pw_units_list(PW_QTY_PRESSURE));
        if ((t && have_T) || (q && have_P))
            return pw_error_set(err, PW_EINVAL, NULL, 0,
                                "display units \"%s\": two %s units", text,
                                t ? "temperature" : "pressure");
        if (t) {
            snprintf(u.T, sizeof u.T, "%s", t);
            have_T = true;
        } else {
            snprintf(u.P, sizeof u.P, "%s", q);
            have_P = true;
        }
        if (p[n] != ',')
            break;
        p += n + 1;
    }
    *out = u;
    return PW_OK;
}

double pw_units_display_T(const pw_display_units *u, double T_K)
{
    double v;
    return pw_units_from_si(PW_QTY_TEMPERATURE, T_K, u->T, &v) == PW_OK ? v : T_K;
}

double pw_units_display_dT(const pw_display_units *u, double dT_K)
{
    double scale, offset;
    if (pw_units_affine(PW_QTY_TEMPERATURE, u->T, &scale, &offset) != PW_OK)
        return dT_K;
    return dT_K / scale;
}

double pw_units_display_P(const pw_display_units *u, double P_Pa)
{
    double v;
    return pw_units_from_si(PW_QTY_PRESSURE, P_Pa, u->P, &v) == PW_OK ? v : P_Pa / 1e3;
}

const char *pw_units_display_T_symbol(const pw_display_units *u)
{
    const char *t = pw_units_canonical(PW_QTY_TEMPERATURE, u->T);
    if (!t)
        return "K";
    if (!strcmp(t, "C"))
        return "\xc2\xb0" "C";
    if (!strcmp(t, "F"))
        return "\xc2\xb0" "F";
    return "K";
}

const char *pw_units_display_P_symbol(const pw_display_units *u)
{
    const char *p = pw_units_canonical(PW_QTY_PRESSURE, u->P);
    return p ? p : "kPa";
}

const char *pw_units_display_dT_symbol(const pw_display_units *u)
{
    const char *t = pw_units_canonical(PW_QTY_TEMPERATURE, u->T);
    return t && !strcmp(t, "F") ? "\xc2\xb0" "F" : "K";
}

/* A printf spec of the form [.digits](f|g|e), at most 4 characters. */
static bool spec_ok(const char *spec)
{
    size_t n = strlen(spec), i = 0;
    if (n < 1 || n > 4)
        return false;
    if (spec[0] == '.') {
        i = 1;
        if (!isdigit((unsigned char)spec[i]))
            return false;
        while (isdigit((unsigned char)spec[i]))
            i++;
    }
    return i == n - 1 && strchr("fge", spec[i]) != NULL;
}

char *pw_units_display_value(const pw_display_units *u, pw_show_kind kind, const char *spec,
                             double si, char *out, size_t n)
{
    if (!out || n == 0)
        return out;
    const pw_display_units d = pw_units_display_default();
    if (!u)
        u = &d;
    if (!spec || !spec_ok(spec)) {
        snprintf(out, n, "?");
        return out;
    }
    double v;
    const char *sym;
    switch (kind) {
    case PW_SHOW_T:
        v = pw_units_display_T(u, si);
        sym = pw_units_display_T_symbol(u);
        break;
    case PW_SHOW_DT:
        v = pw_units_display_dT(u, si);
        sym = pw_units_display_dT_symbol(u);
        break;
    default:
        v = pw_units_display_P(u, si);
        sym = pw_units_display_P_symbol(u);
        break;
    }
    char fmt[16];
    snprintf(fmt, sizeof fmt, "%%%s %%s", spec);
#if defined(__GNUC__)
#pragma GCC diagnostic push
#pragma GCC diagnostic ignored "-Wformat-nonliteral"
#endif
    snprintf(out, n, fmt, v, sym);
#if defined(__GNUC__)
#pragma GCC diagnostic pop
#endif
    return out;
}

char *pw_units_display_text(const pw_display_units *u, const char *text, char *out, size_t n)
{
    if (!out || n == 0)
        return out;
    size_t o = 0;
    out[0] = '\0';
    if (!text)
        return out;
    for (const char *p = text; *p && o + 1 < n;) {
        if (*p != '\x1e') {
            out[o++] = *p++;
            continue;
        }
        /* a mark: kind, spec, 0x1f, value, 0x1d; a mark cut short ends the text */
        const char *sep = strchr(p, '\x1f'), *end = sep ? strchr(sep, '\x1d') : NULL;
        if (!sep || !end || sep - p < 3 || sep - p > 6)
            break;
        char spec[8], num[40];
        memcpy(spec, p + 2, (size_t)(sep - p - 2));
        spec[sep - p - 2] = '\0';
        size_t len = (size_t)(end - sep - 1);
        if (len >= sizeof num)
            break;
        memcpy(num, sep + 1, len);
        num[len] = '\0';
        char *tail;
        double si = strtod(num, &tail);
        if (tail == num || *tail)
            break;
        pw_show_kind kind = p[1] == 'T' ? PW_SHOW_T : p[1] == 'D' ? PW_SHOW_DT : PW_SHOW_P;
        char val[64];
        pw_units_display_value(u, kind, spec, si, val, sizeof val);
        for (const char *v = val; *v && o + 1 < n; v++)
            out[o++] = *v;
        p = end + 1;
    }
    out[o] = '\0';
    return out;
}
