/* Diagnostics of a fit as a list of records (include/pinchwise/fit_diagnostics.h): detection
 * and wording in one place, for the command line, batch fits, the JSON documents and the report.
 * The sentences name no file and no program option: callers prefix the data file. */
#include "fit_internal.h"

#include <math.h>
#include <pinchwise/lle.h>
#include <pinchwise/units.h>
#include <pinchwise/fit_diagnostics.h>
#include <pinchwise/fitjson.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>

static const char *const kind_names[PW_DIAG_KIND_COUNT] = {
    [PW_DIAG_RANGE_BELOW] = "range-below",
    [PW_DIAG_RANGE_ABOVE] = "range-above",
    [PW_DIAG_PURE_MISS] = "pure-point-miss",
    [PW_DIAG_SWAPPED] = "components-swapped",
    [PW_DIAG_DUPLICATES] = "duplicated-points",
    [PW_DIAG_VAPOR_ASSOCIATION] = "vapor-association",
    [PW_DIAG_RUNAWAY] = "runaway",
    [PW_DIAG_NOT_CONVERGED] = "not-converged",
    [PW_DIAG_EXACT] = "exact",
    [PW_DIAG_UNIDENTIFIABLE] = "not-identifiable",
    [PW_DIAG_HETEROGENEOUS] = "partly-miscible",
    [PW_DIAG_LIQUID_SPLIT] = "liquid-split",
    [PW_DIAG_COMPETING_MINIMA] = "competing-minima",
    [PW_DIAG_CORRELATED] = "correlated-parameters",
    [PW_DIAG_TIES_DISAGREE] = "tie-lines-disagree",
    [PW_DIAG_LIQUID_IN_GAP] = "liquid-inside-layers",
};

const char *pw_fit_diag_kind_name(pw_fit_diag_kind k)
{
    return (int)k >= 0 && k < PW_DIAG_KIND_COUNT ? kind_names[k] : "unknown";
}

const char *pw_fit_diag_severity_name(pw_fit_diag_severity s)
{
    switch (s) {
    case PW_DIAG_NOTE:
        return "note";
    case PW_DIAG_WARNING:
        return "warning";
    case PW_DIAG_SEVERE:
        return "severe";
    }
    return "unknown";
}

bool pw_component_vapor_associates(const pw_component *c)
{
    if (!c)
        return false;
    for (const char *p = c->name; *p; p++)
        if (strncasecmp(p, "acid", 4) == 0)
            return true;
    return false;
}

/* A new record of kind k, every field "none"; NULL when the list is full. */
static pw_fit_diag *add(pw_fit_diags *d, pw_fit_diag_kind k, pw_fit_diag_severity s)
{
    if (d->n >= PW_FIT_DIAG_MAX)
        return NULL;
    pw_fit_diag *g = &d->items[d->n++];
    memset(g, 0, sizeof *g);
    g->kind = k;
    g->severity = s;
    g->comp = g->param = g->param2 = -1;
    g->value = g->value2 = g->value3 = NAN;
    g->value_unit = "";
    return g;
}

static void say(pw_fit_diag *g, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

static void say(pw_fit_diag *g, const char *fmt, ...)
{
    va_list ap;
    va_start(ap, fmt);
    vsnprintf(g->message, sizeof g->message, fmt, ap);
    va_end(ap);
}

static void ranges(const pw_fit_result *r, pw_fit_diags *d)
{
    for (int i = 0; i < 2; i++) {
        const pw_component *c = &r->sys.comp[i];
        double lo = isfinite(r->T_min_K) ? pw_component_range_excess_K(c, r->T_min_K) : 0.0;
        double hi = isfinite(r->T_max_K) ? pw_component_range_excess_K(c, r->T_max_K) : 0.0;
        pw_fit_diag *g;
        if (lo < 0.0 && (g = add(d, PW_DIAG_RANGE_BELOW, PW_DIAG_WARNING))) {
            g->comp = i;
            g->value = -lo;
            g->value_unit = "K";
            say(g, "the data reach " PW_TEXT_DT(".1f") " below the vapor-pressure range of %s",
                -lo, c->name);
        }
        if (hi > 0.0 && (g = add(d, PW_DIAG_RANGE_ABOVE, PW_DIAG_WARNING))) {
            g->comp = i;
            g->value = hi;
            g->value_unit = "K";
            say(g, "the data reach " PW_TEXT_DT(".1f") " above the vapor-pressure range of %s", hi,
                c->name);
        }
    }
}

/* How far a pure-component point lies from component comp's vapor-pressure correlation: in K
 * (isobaric) or in % of P (isothermal); NAN when the correlation cannot be evaluated. */
static double pure_miss(const pw_fit_result *r, const pw_point *m, int comp)
{
    const pw_component *c = &r->sys.comp[comp];
    if (r->kind == PW_DATA_ISOBARIC) {
        double T;
        return pw_tsat(c, m->P_Pa, &T) == PW_OK ? fabs(T - m->T_K) : (double)NAN;
    }
    double P;
    return pw_psat(c, m->T_K, &P, NULL) == PW_OK ? fabs(log(P / m->P_Pa)) * 100.0 : (double)NAN;
}

/* Pure-component points (x1 = 0 or 1) against the vapor-pressure correlations: a large miss at
 * the ends that vanishes when the names are exchanged means the components are listed in the
 * wrong order. */
static void pure_points(const pw_fit_result *r, pw_fit_diags *d)
{
    double miss = 0.0, exchanged = 0.0; /* largest miss as labelled / with names exchanged */
    long line = 0;
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_point *m = &r->pts[i].meas;
        if (m->x1 > 0.0 && m->x1 < 1.0)
            continue;
        int comp = m->x1 >= 1.0 ? 0 : 1;
        double a = pure_miss(r, m, comp), b = pure_miss(r, m, 1 - comp);
        if (isfinite(a) && a > miss) {
            miss = a;
            line = m->line;
        }
        if (isfinite(b))
            exchanged = fmax(exchanged, b);
    }
    bool isobaric = r->kind == PW_DATA_ISOBARIC;
    double limit = isobaric ? PW_DIAG_PURE_MISS_K : PW_DIAG_PURE_MISS_PCT;
    if (!(miss > limit))
        return;
    bool swapped = exchanged < PW_DIAG_SWAP_RATIO * miss;
    pw_fit_diag *g = add(d, swapped ? PW_DIAG_SWAPPED : PW_DIAG_PURE_MISS, PW_DIAG_WARNING);
    if (!g)
        return;
    g->line = line;
    g->value = miss;
    g->value2 = exchanged;
    g->value_unit = isobaric ? "K" : "%";
    say(g, "a pure-component point misses the vapor pressure by %.1f %s%s", miss, g->value_unit,
        swapped ? "; the components look swapped (x1 must be the mole fraction of the first "
                  "name in '# components:')"
                : "; check the component names and their vapor-pressure constants");
}

/* Points sorted by (x1, T, P, y1, line): exact repeats become neighbours. */
static int cmp_point(const void *a, const void *b)
{
    const pw_point *p = *(const pw_point *const *)a, *q = *(const pw_point *const *)b;
    double d[4] = {p->x1 - q->x1, p->T_K - q->T_K, p->P_Pa - q->P_Pa,
                   (isnan(p->y1) ? -1.0 : p->y1) - (isnan(q->y1) ? -1.0 : q->y1)};
    for (int k = 0; k < 4; k++)
        if (d[k] != 0.0)
            return d[k] < 0.0 ? -1 : 1;
    return (p->line > q->line) - (p->line < q->line);
}

static bool same_point(const pw_point *p, const pw_point *q)
{
    return p->x1 == q->x1 && p->T_K == q->T_K && p->P_Pa == q->P_Pa &&
           (p->y1 == q->y1 || (isnan(p->y1) && isnan(q->y1)));
}

/* Points that repeat another exactly are kept and fitted as replicate measurements. */
static pw_status duplicates(const pw_fit_result *r, pw_fit_diags *d)
{
    if (r->n_pts < 2)
        return PW_OK;
    const pw_point **s = malloc(r->n_pts * sizeof *s);
    if (!s)
        return PW_ENOMEM;
    for (size_t i = 0; i < r->n_pts; i++)
        s[i] = &r->pts[i].meas;
    qsort(s, r->n_pts, sizeof *s, cmp_point);
    size_t dup = 0;
    long first = 0, of = 0;
    for (size_t i = 1; i < r->n_pts; i++)
        if (same_point(s[i - 1], s[i]) && dup++ == 0) {
            first = s[i]->line;
            of = s[i - 1]->line;
        }
    free(s);
    pw_fit_diag *g = dup ? add(d, PW_DIAG_DUPLICATES, PW_DIAG_NOTE) : NULL;
    if (g) {
        g->line = first;
        g->line2 = of;
        g->count = dup;
        say(g,
            "%zu duplicated point%s (line %ld repeats line %ld); fitted as replicate "
            "measurements, each with full weight",
            dup, dup == 1 ? "" : "s", first, of);
    }
    return PW_OK;
}

static void association(const pw_fit_result *r, pw_fit_diags *d)
{
    for (int i = 0; i < 2; i++) {
        pw_fit_diag *g;
        if (pw_component_vapor_associates(&r->sys.comp[i]) &&
            (g = add(d, PW_DIAG_VAPOR_ASSOCIATION, PW_DIAG_WARNING))) {
            g->comp = i;
            say(g,
                "%s dimerises in the vapor; the ideal-vapor model used here can be off by "
                "tens of percent even at 1 atm (chemical theory: Marek & Standart 1954; "
                "Hayden & O'Connell 1975): treat the results as rough",
                r->sys.comp[i].name);
        }
    }
}

static void convergence(const pw_fit_result *r, pw_fit_diags *d)
{
    const pw_model_type *m = r->sys.model;
    pw_fit_diag *g;
    if (r->fit_class == PW_FIT_RUNAWAY) {
        if ((g = add(d, PW_DIAG_RUNAWAY, PW_DIAG_SEVERE))) {
            g->param = r->runaway_param;
            say(g,
                "the %s fit did NOT converge: %s ran beyond its physical bound "
                "(docs/fitting.md) and no bounded minimum was found; do not design with it",
                m->name,
                r->runaway_param >= 0 && (size_t)r->runaway_param < m->n_params
                    ? m->param_names[r->runaway_param]
                    : "a parameter");
        }
    } else if (!r->converged && (g = add(d, PW_DIAG_NOT_CONVERGED, PW_DIAG_SEVERE))) {
        say(g, "the %s fit did NOT converge (%s, %s); do not design with it", m->name,
            pw_fit_class_name(r->fit_class), pw_fit_stop_name(r->stop));
    }
    if (r->fit_class == PW_FIT_EXACT && (g = add(d, PW_DIAG_EXACT, PW_DIAG_NOTE)))
        say(g,
            "the %s model reproduces the data to rounding level (noise-free or generated "
            "data?); standard errors are those the stated uncertainties imply",
            m->name);
    if (r->converged && !r->identifiable && (g = add(d, PW_DIAG_UNIDENTIFIABLE, PW_DIAG_WARNING))) {
        char combo[256] = "";
        size_t len = 0;
        for (size_t k = 0; k < m->n_params && len < sizeof combo - 40; k++)
            if (r->fitted[k] && fabs(r->weak_dir[k]) > 1e-3)
                len += (size_t)snprintf(combo + len, sizeof combo - len, "%s%s%.3g %s",
                                        len ? (r->weak_dir[k] < 0 ? " - " : " + ") : "",
                                        len == 0 && r->weak_dir[k] < 0 ? "-" : "",
                                        fabs(r->weak_dir[k]), m->param_names[k]);
        g->value = r->sv_ratio;
        say(g,
            "the data do not fix the parameter combination along (%s): moving the parameters "
            "that way leaves the fit unchanged; the standard errors of the parameters it "
            "involves are not meaningful (null)",
            combo);
    }
}

/* Two tie lines at the same temperature (within 0.05 K) must give the same layers: a binary at
 * one temperature has one pair (phase rule). Layers further apart than 3 sigma_x point at a typing
 * error or a mislabelled row. Reported once, for the most distant such pair. */
static void tie_lines_agree(const pw_fit_result *r, pw_fit_diags *d)
{
    if (!r->ties || r->n_tie_lines < 2)
        return;
    double worst = 0.0;
    size_t wi = 0, wj = 0;
    for (size_t i = 0; i < r->n_tie_lines; i++)
        for (size_t j = i + 1; j < r->n_tie_lines; j++) {
            const pw_fit_tie *a = &r->ties[i], *b = &r->ties[j];
            if (fabs(a->T_K - b->T_K) > 0.05)
                continue;
            double dx = fmax(fabs(a->x_I - b->x_I), fabs(a->x_II - b->x_II));
            if (dx > worst) {
                worst = dx;
                wi = i;
                wj = j;
            }
        }
    pw_fit_diag *g;
    if (!(worst > 3.0 * r->sigma_x_lle) || !(g = add(d, PW_DIAG_TIES_DISAGREE, PW_DIAG_WARNING)))
        return;
    g->count = (size_t)(r->ties[wi].line > 0 ? r->ties[wi].line : 0);
    g->count2 = (size_t)(r->ties[wj].line > 0 ? r->ties[wj].line : 0);
    g->value = worst;
    g->value3 = r->ties[wi].T_K;
    say(g,
        "tie lines on lines %zu and %zu of the LLE file are at the same temperature (" PW_TEXT_T(".2f")
        ") but their layers differ by %.3g in x1, more than 3 sigma_x (%.3g): a binary at one "
        "temperature has one pair of layers; check those rows",
        g->count, g->count2, g->value3, worst, 3.0 * r->sigma_x_lle);
}

static void liquids(const pw_fit_result *r, pw_fit_diags *d)
{
    pw_fit_diag *g;
    if (r->n_three_phase || r->n_tie_lines) {
        bool can_split = pw_model_can_split(r->sys.model);
        if ((g = add(d, PW_DIAG_HETEROGENEOUS, can_split ? PW_DIAG_NOTE : PW_DIAG_WARNING))) {
            g->count = r->n_three_phase;
            g->count2 = r->n_tie_lines;
            const char *pl = r->n_three_phase == 1 ? "" : "s";
            if (can_split)
                say(g,
                    "partly miscible liquids: %zu three-phase point%s and %zu tie line%s fitted "
                    "as such (docs/heterogeneous.md)",
                    r->n_three_phase, pl, r->n_tie_lines, r->n_tie_lines == 1 ? "" : "s");
            else
                say(g,
                    "partly miscible liquids: %zu three-phase point%s that the %s model cannot "
                    "represent (it never splits) were left out; its one-liquid results across "
                    "the measured two-liquid region are not valid: fit NRTL, UNIQUAC, Margules "
                    "or van Laar (docs/heterogeneous.md)",
                    r->n_three_phase, pl, r->sys.model->name);
        }
    } else if (r->split && (g = add(d, PW_DIAG_LIQUID_SPLIT, PW_DIAG_WARNING))) {
        g->value = r->split_min_D;
        g->value2 = r->split_x;
        g->value3 = r->split_T_K;
        say(g,
            "the %s parameters predict a liquid-liquid split (d2(Gmix/RT)/dx1^2 = %.3g at "
            "x1 = %.3f, " PW_TEXT_T(".1f") "); if the liquids are known to mix, the fit is spurious",
            r->sys.model->name, r->split_min_D, r->split_x, r->split_T_K);
    }
}

static void minima_and_correlation(const pw_fit_result *r, pw_fit_diags *d)
{
    const pw_model_type *m = r->sys.model;
    pw_fit_diag *g;
    size_t competing = pw_fit_competing_minima(r);
    if (competing > 1 && (g = add(d, PW_DIAG_COMPETING_MINIMA, PW_DIAG_WARNING))) {
        g->count = competing;
        say(g,
            "%zu distinct minima fit the data about equally well (delta-AICc < 2); %s, all are "
            "in the fit file",
            competing,
            r->n_three_phase || r->n_tie_lines
                ? "the data show two liquids, so the lowest chi2 is used"
                : "the one without a liquid split and lowest chi2 is used");
    }
    if (!r->identifiable) /* the correlations are not meaningful then */
        return;
    for (size_t a = 0; a < m->n_params; a++)
        for (size_t b = a + 1; b < m->n_params; b++)
            if (r->fitted[a] && r->fitted[b] && fabs(r->corr[a][b]) > PW_DIAG_CORRELATION &&
                (g = add(d, PW_DIAG_CORRELATED, PW_DIAG_WARNING))) {
                g->param = (int)a;
                g->param2 = (int)b;
                g->value = r->corr[a][b];
                say(g,
                    "parameters %s and %s are correlated (%.3f): poorly identifiable from "
                    "these data",
                    m->param_names[a], m->param_names[b], r->corr[a][b]);
            }
}

/* The model's layers at one condition (the fixed P of an isobaric point, the fixed T of an
 * isothermal one), solved once and kept for the other points there. */
#define GAP_CACHE 8
typedef struct gap_condition {
    double at;  /* P_Pa (isobaric) or T_K (isothermal) */
    bool split; /* a three-phase state with both layers resolved exists there */
    double x[2], T_K;
} gap_condition;

static gap_condition gap_at(const pw_fit_result *r, bool isobaric, double at)
{
    gap_condition c = {.at = at, .split = false, .x = {NAN, NAN}, .T_K = NAN};
    pw_three_phase tp;
    pw_status st = isobaric ? pw_three_phase_at_P(&r->sys, at, &tp)
                            : pw_three_phase_at_T(&r->sys, at, &tp);
    if (st == PW_OK && tp.exists && tp.x[0] < tp.x[1]) {
        c.split = true;
        c.x[0] = tp.x[0];
        c.x[1] = tp.x[1];
        c.T_K = tp.T_K;
    }
    return c;
}

/* Measured one-liquid points inside the model's two-liquid region. A point not flagged
 * three-phase was measured as one liquid boiling alone; when its x1 lies strictly between the
 * layers of the model's three-phase state at the point's own P (isobaric) or T (isothermal),
 * the model says that liquid boils as two liquids at T3 (P3): exactly the test of
 * pw_bubble_T_het / pw_bubble_P_het. The model's layer then contradicts the data, and the
 * one-liquid bubble point the fit compares with the point is a metastable non-solution
 * (docs/heterogeneous.md sections 3 and 4). The layers at the three-phase condition are used,
 * not those at the measured T: an isobaric point's condition is its P, and the measured T is an
 * outcome the model disagrees with. One solve per distinct condition. With three-phase points or
 * tie lines in the data the fit scores such points by the three-phase state, the model's stable prediction
 * (pw_fit_point.in_layers); without, by the one-liquid bubble point. The record says which. */
static void liquid_in_gap(const pw_fit_result *r, pw_fit_diags *d)
{
    if (!pw_model_can_split(r->sys.model) || r->n_pts == 0)
        return;
    bool isobaric = r->kind == PW_DATA_ISOBARIC;
    gap_condition cache[GAP_CACHE];
    size_t n_cache = 0, next = 0, count = 0, n_scored3 = 0;
    long first = 0, last = 0;
    gap_condition shown = {.split = false};
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_fit_point *p = &r->pts[i];
        const pw_point *m = &p->meas;
        if (p->three_phase || p->excluded || !(m->x1 > 0.0 && m->x1 < 1.0))
            continue;
        double at = isobaric ? (isfinite(m->P_Pa) ? m->P_Pa : r->P_fixed_Pa)
                             : (isfinite(m->T_K) ? m->T_K : r->T_fixed_K);
        if (!(isfinite(at) && at > 0.0))
            continue;
        const gap_condition *c = NULL;
        for (size_t k = 0; k < n_cache && !c; k++)
            if (cache[k].at == at)
                c = &cache[k];
        if (!c) {
            size_t slot = n_cache < GAP_CACHE ? n_cache++ : next++ % GAP_CACHE;
            cache[slot] = gap_at(r, isobaric, at);
            c = &cache[slot];
        }
        if (!c->split || !(m->x1 > c->x[0] && m->x1 < c->x[1]))
            continue;
        n_scored3 += p->in_layers;
        if (count++ == 0) {
            first = m->line;
            shown = *c;
        }
        last = m->line;
    }
    pw_fit_diag *g;
    if (!count || !(g = add(d, PW_DIAG_LIQUID_IN_GAP, PW_DIAG_WARNING)))
        return;
    g->count = count;
    g->line = first;
    g->line2 = last;
    g->value = shown.x[0];
    g->value2 = shown.x[1];
    g->value3 = shown.T_K;
    char lines[64];
    if (count == 1)
        snprintf(lines, sizeof lines, "line %ld", first);
    else if (count == 2)
        snprintf(lines, sizeof lines, "lines %ld and %ld", first, last);
    else
        snprintf(lines, sizeof lines, "first line %ld, last line %ld", first, last);
    char mixed[96];
    snprintf(mixed, sizeof mixed,
             "the fit scores %zu of them by the three-phase state, the rest by one-liquid bubble "
             "points",
             n_scored3);
    const char *scored =
        n_scored3 == count ? "the fit scores them by the model's three-phase state"
        : n_scored3 == 0   ? "the calculated values there are one-liquid bubble points the model "
                             "cannot produce"
                           : mixed;
    say(g,
        "%zu measured one-liquid point%s (%s) lie%s inside the %s model's two liquid layers "
        "(x1 = %.4f and %.4f at " PW_TEXT_T(".2f") "): the model's layer contradicts the data, "
        "and %s; fit with measured tie lines, try another model, or check those points "
        "(docs/heterogeneous.md)",
        count, count == 1 ? "" : "s", lines, count == 1 ? "s" : "", r->sys.model->name,
        shown.x[0], shown.x[1], shown.T_K, scored);
}

pw_status pw_fit_diagnose(const pw_fit_result *r, pw_fit_diags *out)
{
    if (!out)
        return PW_EINVAL;
    out->n = 0;
    if (!r || !r->sys.model || (r->n_pts && !r->pts))
        return PW_EINVAL;
    ranges(r, out);
    pure_points(r, out);
    pw_status st = duplicates(r, out);
    if (st != PW_OK)
        return st;
    association(r, out);
    convergence(r, out);
    liquids(r, out);
    minima_and_correlation(r, out);
    tie_lines_agree(r, out);
    liquid_in_gap(r, out);
    return PW_OK;
}

pw_status pw_fit_diagnose_liquid_in_gap(const pw_fit_result *r, pw_fit_diags *out)
{
    if (!out)
        return PW_EINVAL;
    out->n = 0;
    if (!r || !r->sys.model || (r->n_pts && !r->pts))
        return PW_EINVAL;
    liquid_in_gap(r, out);
    return PW_OK;
}

static json_t *num_or_null(double v)
{
    return isfinite(v) ? json_real(v) : json_null();
}

static json_t *line_or_null(long line)
{
    return line > 0 ? json_integer((json_int_t)line) : json_null();
}

json_t *pw_fit_diags_json(const pw_fit_diags *d, const pw_system *sys)
{
    json_t *arr = d && sys && sys->model ? json_array() : NULL;
    if (!arr)
        return NULL;
    const pw_model_type *m = sys->model;
    for (size_t i = 0; i < d->n; i++) {
        const pw_fit_diag *g = &d->items[i];
        json_t *params = json_array();
        for (int k = 0; k < 2; k++) {
            int p = k ? g->param2 : g->param;
            if (p >= 0 && (size_t)p < m->n_params)
                json_array_append_new(params, json_string(m->param_names[p]));
        }
        json_t *o = json_object();
        json_object_set_new(o, "kind", json_string(pw_fit_diag_kind_name(g->kind)));
        json_object_set_new(o, "severity", json_string(pw_fit_diag_severity_name(g->severity)));
        json_object_set_new(o, "line", line_or_null(g->line));
        json_object_set_new(o, "other_line", line_or_null(g->line2));
        json_object_set_new(o, "component",
                            g->comp == 0 || g->comp == 1 ? json_string(sys->comp[g->comp].name)
                                                         : json_null());
        json_object_set_new(o, "parameters", params);
        json_object_set_new(o, "count",
                            g->count ? json_integer((json_int_t)g->count) : json_null());
        json_object_set_new(o, "value", num_or_null(g->value));
        json_object_set_new(o, "unit", json_string(g->value_unit ? g->value_unit : ""));
        char msg[PW_FIT_DIAG_MSG_MAX + 64]; /* marked quantities in K and kPa */
        json_object_set_new(o, "message",
                            json_string(pw_units_display_text(NULL, g->message, msg, sizeof msg)));
        json_array_append_new(arr, o);
    }
    return arr;
}

json_t *pw_fit_diagnostics_json(const pw_fit_result *r)
{
    pw_fit_diags *d = malloc(sizeof *d);
    json_t *arr = d && pw_fit_diagnose(r, d) == PW_OK ? pw_fit_diags_json(d, &r->sys) : NULL;
    free(d);
    return arr;
}
