/* Temperature and pressure units. Conversions: K = C + 273.15 (ITS-90 convention),
 * K = (F + 459.67) * 5/9; 1 atm = 101325 Pa exactly, 1 bar = 1e5 Pa, 1 mmHg = 101325/760 Pa
 * (the conventional millimetre of mercury taken as 1/760 atm, i.e. the torr), 1 psi =
 * 0.45359237 kg * 9.80665 m/s2 / (0.0254 m)^2 = 6894.757293168... Pa
 * (NIST SP 811, Appendix B.8). */
#include <pinchwise/units.h>

#include <ctype.h>
#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

typedef struct {
    const char *name;
    double scale, offset; /* si = (value + offset) * scale */
} unit_def;

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

static const unit_def *find_unit(pw_quantity q, const char *unit)
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
    return q == PW_QTY_TEMPERATURE ? "K, C, F" : "Pa, kPa, MPa, bar, atm, mmHg, psia";
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

pw_status pw_units_parse_quantity(pw_quantity q, const char *text, double *si, pw_error *err)
{
    const char *what = q == PW_QTY_TEMPERATURE ? "temperature" : "pressure";
    if (!text || !*text)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "empty %s (expected a number with a unit: %s)",
                            what, pw_units_list(q));
    char *end = NULL;
    errno = 0;
    double v = strtod(text, &end);
    if (end == text || errno == ERANGE || !isfinite(v) || isspace((unsigned char)*text))
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "'%s' is not a %s (expected a number with a unit, e.g. %s; units: %s)",
                            text, what, q == PW_QTY_TEMPERATURE ? "350K or 50C" : "101.325kPa or 1atm",
                            pw_units_list(q));
    /* Guard against strtod's hexadecimal and infinity spellings. */
    if (strpbrk(text, "xX") || strncasecmp(text, "in", 2) == 0 || strncasecmp(text, "nan", 3) == 0)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "'%s' is not a plain decimal number", text);
    if (*end == '\0')
        return pw_error_set(err, PW_EINVAL, NULL, 0,
                            "'%s' has no unit (write the unit straight after the number; units: %s)",
                            text, pw_units_list(q));
    if (!find_unit(q, end))
        return pw_error_set(err, PW_EINVAL, NULL, 0, "unknown %s unit '%s' in '%s' (units: %s)",
                            what, end, text, pw_units_list(q));
    pw_status st = pw_units_to_si(q, v, end, si);
    if (st != PW_OK)
        return pw_error_set(err, st, NULL, 0, "%s '%s' is not above absolute zero", what, text);
    return PW_OK;
}
