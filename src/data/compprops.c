/* Optional pure-component constants: their component-file columns, units and plausible ranges.
 * One table, used by the component-file reader, the fit-file writer and reader, and every
 * calculation that needs a constant (through pw_component_require). */
#include <math.h>
#include <pinchwise/component.h>

typedef struct {
    const char *column; /* component-file column, which names the unit */
    double to_si;       /* column unit -> SI */
    double lo, hi;      /* plausible range in the column's unit (exclusive) */
} prop_info;

/* The ranges only catch typing slips (a value in the wrong unit, a misplaced decimal point);
 * they span every organic solvent and water by a wide margin. */
static const prop_info props[PW_PROP_COUNT] = {
    [PW_PROP_M] = {"M_g_mol", 1e-3, 1.0, 2000.0},
    [PW_PROP_TC] = {"Tc_K", 1.0, 5.0, 2000.0},
    [PW_PROP_PC] = {"Pc_kPa", 1e3, 10.0, 1e5},
    [PW_PROP_OMEGA] = {"omega", 1.0, -1.0, 2.0},
    [PW_PROP_ZC] = {"Zc", 1.0, 0.05, 1.0},
    [PW_PROP_VC] = {"Vc_cm3_mol", 1e-6, 5.0, 5000.0},
    [PW_PROP_DHVAP] = {"dHvap_kJ_mol", 1e3, 0.05, 200.0},
    [PW_PROP_CPL] = {"cpL_J_molK", 1.0, 1.0, 2000.0},
    [PW_PROP_CPV] = {"cpV_J_molK", 1.0, 1.0, 2000.0},
    [PW_PROP_R] = {"r", 1.0, 0.05, 100.0},
    [PW_PROP_Q] = {"q", 1.0, 0.05, 100.0},
    [PW_PROP_TS_A] = {"tsonopoulos_a", 1.0, -1.0, 1.0},
    [PW_PROP_TS_B] = {"tsonopoulos_b", 1.0, -1.0, 1.0},
};

void pw_component_props_clear(pw_component *c)
{
    for (int p = 0; p < PW_PROP_COUNT; p++)
        c->prop[p] = NAN;
}

const char *pw_comp_prop_column(pw_comp_prop p)
{
    return (unsigned)p < PW_PROP_COUNT ? props[p].column : NULL;
}

double pw_comp_prop_to_si(pw_comp_prop p)
{
    return (unsigned)p < PW_PROP_COUNT ? props[p].to_si : 0.0;
}

void pw_comp_prop_range(pw_comp_prop p, double *lo, double *hi)
{
    bool ok = (unsigned)p < PW_PROP_COUNT;
    if (lo)
        *lo = ok ? props[p].lo : 0.0;
    if (hi)
        *hi = ok ? props[p].hi : 0.0;
}

pw_status pw_component_require(const pw_component *c, pw_comp_prop p, double *si, pw_error *err)
{
    if (!c || (unsigned)p >= PW_PROP_COUNT)
        return pw_error_set(err, PW_EINVAL, NULL, 0, "no component or unknown constant");
    /* Known means finite and inside the plausible range: a component built with memset (0 in
     * every field) then counts as unknown for every constant whose range excludes 0. */
    double v = c->prop[p], scale = props[p].to_si;
    if (!(v > props[p].lo * scale && v < props[p].hi * scale))
        return pw_error_set(err, PW_ENOTFOUND, c->origin[0] ? c->origin : NULL,
                            c->origin[0] ? c->origin_line : 0,
                            "component '%s' has no %s (expected a value in that column of the "
                            "component library, or of a --components file)",
                            c->name, props[p].column);
    if (si)
        *si = v;
    return PW_OK;
}
