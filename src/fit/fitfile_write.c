/* Fit files: JSON documents (jansson) that hold everything needed to compute the phase
 * equilibrium again, the measured points with their residuals, and the provenance.
 * The layout is described in docs/fit-file.md. Writes are atomic: a temporary file in the same
 * folder, fsync, then link (no clobber) or rename (with force). */
#include "fitfile_internal.h"

#include <pinchwise/fileio.h>
#include <pinchwise/jsontext.h>
#include <pinchwise/fitjson.h>

#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

static json_t *num(double v) { return isfinite(v) ? json_real(v) : json_null(); }

static const char *objective_name(pw_objective o)
{
    switch (o) {
    case PW_OBJ_TXY: return "T-x-y";
    case PW_OBJ_PXY: return "P-x-y";
    case PW_OBJ_PX: return "P-x (Barker)";
    case PW_OBJ_TX: return "T-x (Barker)";
    }
    return "unknown";
}

const char *pw_fit_stop_name(pw_stop_reason s)
{
    switch (s) {
    case PW_STOP_NONE: return "not run";
    case PW_STOP_STEP: return "step below tolerance";
    case PW_STOP_GRADIENT: return "gradient below tolerance";
    case PW_STOP_MAXITER: return "iteration limit reached";
    case PW_STOP_FAILED: return "model evaluation failed";
    case PW_STOP_NOPROG: return "no progress from the start point";
    case PW_STOP_MACHINE: return "tolerance at machine precision";
    }
    return "unknown";
}

static json_t *component_json(const pw_component *c)
{
    json_t *o = json_object();
    json_object_set_new(o, "name", json_string(c->name));
    json_object_set_new(o, "equation",
                        json_string(c->equation == PW_PSAT_IAPWS_IF97 ? "iapws-if97" : "antoine"));
    json_object_set_new(o, "A", num(c->A));
    json_object_set_new(o, "B", num(c->B));
    json_object_set_new(o, "C", num(c->C));
    json_object_set_new(o, "log", json_string(c->log == PW_LN ? "ln" : "log10"));
    json_object_set_new(o, "P_unit", json_string(c->P_unit));
    json_object_set_new(o, "T_unit", json_string(c->T_unit));
    json_object_set_new(o, "T_min_K", num(c->T_min_K));
    json_object_set_new(o, "T_max_K", num(c->T_max_K));
    json_object_set_new(o, "V_L_cm3mol", num(c->V_L_cm3mol));
    json_object_set_new(o, "source", json_string(c->source));
    /* the optional constants it was fitted with, in the component file's columns and units */
    json_t *props = json_object();
    for (int p = 0; p < PW_PROP_COUNT; p++)
        if (pw_component_require(c, (pw_comp_prop)p, NULL, NULL) == PW_OK)
            json_object_set_new(props, pw_comp_prop_column((pw_comp_prop)p),
                                num(c->prop[p] / pw_comp_prop_to_si((pw_comp_prop)p)));
    json_object_set_new(o, "constants", props);
    return o;
}

static json_t *stat_json(const pw_fit_stat *s, double scale)
{
    json_t *o = json_object();
    json_object_set_new(o, "aad", num(s->aad * scale));
    json_object_set_new(o, "bias", num(s->bias * scale));
    json_object_set_new(o, "max_abs", num(s->max_abs * scale));
    json_object_set_new(o, "max_line", s->max_line ? json_integer(s->max_line) : json_null());
    return o;
}

static json_t *param_object(const pw_fit_result *r, const double *v, bool fitted_only)
{
    json_t *o = json_object();
    for (size_t k = 0; k < r->sys.model->n_params; k++)
        if (!fitted_only || r->fitted[k])
            json_object_set_new(o, r->sys.model->param_names[k], num(v[k]));
    return o;
}

json_t *pw_fitfile_summary_json(const pw_fit_result *r)
{
    const pw_model_type *m = r->sys.model;
    json_t *o = json_object();
    json_object_set_new(o, "model", json_string(m->name));
    json_object_set_new(o, "converged", json_boolean(r->converged));
    json_t *names = json_array();
    json_array_append_new(names, json_string(r->sys.comp[0].name));
    json_array_append_new(names, json_string(r->sys.comp[1].name));
    json_object_set_new(o, "components", names);
    json_object_set_new(o, "parameters", param_object(r, r->sys.params, false));
    json_object_set_new(o, "stderr", param_object(r, r->stderr_, false));
    json_t *fixed = json_array();
    for (size_t k = 0; k < m->n_params; k++)
        if (!r->fitted[k])
            json_array_append_new(fixed, json_string(m->param_names[k]));
    json_object_set_new(o, "fixed", fixed);
    json_t *lgi = json_array();
    json_array_append_new(lgi, num(r->lngamma_inf[0]));
    json_array_append_new(lgi, num(r->lngamma_inf[1]));
    json_object_set_new(o, "ln_gamma_inf", lgi);
    json_object_set_new(o, "T_ref_K", num(r->sys.T_ref_K));
    json_object_set_new(o, "vapor", json_string(pw_vapor_name(r->sys.vapor)));
    json_object_set_new(o, "aad_y", r->has_y ? num(r->dev_y.aad) : json_null());
    json_object_set_new(o, "aad_T_K", r->kind == PW_DATA_ISOBARIC ? num(r->dev_T_K.aad) : json_null());
    json_object_set_new(o, "aad_P_kPa",
                        r->kind == PW_DATA_ISOTHERMAL ? num(r->dev_P_Pa.aad / 1000.0) : json_null());
    return o;
}

/* The convergence class with what the data do not fix (docs/fit-file.md). */
static json_t *convergence_json(const pw_fit_result *r)
{
    const pw_model_type *m = r->sys.model;
    json_t *c = json_object();
    json_object_set_new(c, "class", json_string(pw_fit_class_name(r->fit_class)));
    json_object_set_new(c, "identifiable", json_boolean(r->identifiable));
    json_object_set_new(c, "singular_value_ratio", num(r->sv_ratio));
    json_t *weak = json_null(), *unfixed = json_array();
    if (!r->identifiable) {
        weak = json_object();
        for (size_t k = 0; k < m->n_params; k++)
            if (r->fitted[k])
                json_object_set_new(weak, m->param_names[k], num(r->weak_dir[k]));
    }
    for (size_t k = 0; k < m->n_params; k++)
        if (r->fitted[k] && !r->stderr_meaningful[k])
            json_array_append_new(unfixed, json_string(m->param_names[k]));
    json_object_set_new(c, "weak_direction", weak);
    json_object_set_new(c, "stderr_not_meaningful", unfixed);
    json_object_set_new(c, "runaway_runs", json_integer((json_int_t)r->n_runaway_runs));
    json_object_set_new(c, "runaway_best_chi2", num(r->runaway_chi2));
    json_object_set_new(c, "runaway_parameter",
                        r->runaway_param >= 0 && (size_t)r->runaway_param < m->n_params
                            ? json_string(m->param_names[r->runaway_param])
                            : json_null());
    return c;
}

/* The data points' array stands as this string in the document that fitfile_emit dumps. */
#define POINTS_MARK "(the points are written here)"

static json_t *point_json(const pw_fit_point *p)
{
    json_t *pj = json_object();
    json_object_set_new(pj, "line", json_integer(p->meas.line));
    json_object_set_new(pj, "x1", num(p->meas.x1));
    json_object_set_new(pj, "y1", num(p->meas.y1));
    json_object_set_new(pj, "T_K", num(p->meas.T_K));
    json_object_set_new(pj, "P_Pa", num(p->meas.P_Pa));
    json_object_set_new(pj, "excluded", json_boolean(p->excluded));
    if (p->three_phase)
        json_object_set_new(pj, "three_phase", json_true());
    if (p->in_layers)
        json_object_set_new(pj, "inside_layers", json_true());
    json_object_set_new(pj, "T_calc_K", num(p->T_calc_K));
    json_object_set_new(pj, "P_calc_Pa", num(p->P_calc_Pa));
    json_object_set_new(pj, "y1_calc", num(p->y_calc));
    json_object_set_new(pj, "ln_gamma1_exp", num(p->lngamma_exp[0]));
    json_object_set_new(pj, "ln_gamma2_exp", num(p->lngamma_exp[1]));
    return pj;
}

/* with_points false: the points' array is the string POINTS_MARK. */
static json_t *fitfile_json(const pw_fit_result *r, bool with_points)
{
    const pw_model_type *m = r->sys.model;
    json_t *o = pw_fitfile_summary_json(r);
    json_object_set_new(o, "format", json_string(PW_FITFILE_FORMAT));
    json_object_set_new(o, "format_version", json_integer(PW_FITFILE_VERSION));
    json_object_set_new(o, "objective", json_string(objective_name(r->objective)));
    json_object_set_new(o, "stop_reason", json_string(pw_fit_stop_name(r->stop)));
    json_object_set_new(o, "convergence", convergence_json(r));

    json_t *ci = json_object();
    for (size_t k = 0; k < m->n_params; k++)
        if (r->fitted[k]) {
            json_t *pair = json_array();
            json_array_append_new(pair, num(r->ci95[k][0]));
            json_array_append_new(pair, num(r->ci95[k][1]));
            json_object_set_new(ci, m->param_names[k], pair);
        }
    json_object_set_new(o, "ci95", ci);
    json_t *cov = json_array(), *cor = json_array();
    for (size_t a = 0; a < m->n_params; a++) {
        json_t *rc = json_array(), *rr = json_array();
        for (size_t b = 0; b < m->n_params; b++) {
            json_array_append_new(rc, num(r->cov[a][b]));
            json_array_append_new(rr, num(r->corr[a][b]));
        }
        json_array_append_new(cov, rc);
        json_array_append_new(cor, rr);
    }
    json_object_set_new(o, "covariance", cov);
    json_object_set_new(o, "correlation", cor);

    json_t *st = json_object();
    json_object_set_new(st, "chi2", num(r->chi2));
    json_object_set_new(st, "chi2_per_dof", num(r->chi2_red));
    json_object_set_new(st, "residuals", json_integer((json_int_t)r->n_residuals));
    json_object_set_new(st, "dof", json_integer((json_int_t)r->dof));
    json_object_set_new(st, "aic", num(r->aic));
    json_object_set_new(st, "aicc", num(r->aicc));
    json_object_set_new(st, "bic", num(r->bic));
    json_object_set_new(st, "iterations", json_integer((json_int_t)r->iterations));
    json_object_set_new(st, "function_evaluations", json_integer((json_int_t)r->n_fev));
    json_object_set_new(st, "jacobian_evaluations", json_integer((json_int_t)r->n_jev));
    json_object_set_new(st, "lm_runs", json_integer((json_int_t)r->n_runs));
    json_object_set_new(st, "deviation_y", stat_json(&r->dev_y, 1.0));
    json_object_set_new(st, "deviation_T_K", stat_json(&r->dev_T_K, 1.0));
    json_object_set_new(st, "deviation_P_kPa", stat_json(&r->dev_P_Pa, 1e-3));
    json_object_set_new(o, "statistics", st);

    json_t *sig = json_object();
    json_object_set_new(sig, "T_K", num(r->sigma_T_K));
    json_object_set_new(sig, "P_relative", num(r->sigma_P_rel));
    json_object_set_new(sig, "y", num(r->sigma_y));
    json_object_set_new(o, "sigmas", sig);

    json_t *mins = json_array();
    for (size_t i = 0; i < r->n_minima; i++) {
        json_t *mi = json_object();
        json_object_set_new(mi, "parameters", param_object(r, r->minima[i].params, true));
        json_object_set_new(mi, "chi2", num(r->minima[i].chi2));
        json_object_set_new(mi, "starts", json_integer((json_int_t)r->minima[i].hits));
        json_array_append_new(mins, mi);
    }
    json_object_set_new(o, "minima", mins);
    /* which of them the fit chose, and why (pw_fit_default_minimum; docs/fitting.md) */
    if (r->minimum_default > 0) {
        char why[320];
        if (r->minimum_split_skipped)
            snprintf(why, sizeof why,
                     "minima 1 to %zu predict a liquid-liquid split over the data's temperatures; "
                     "minimum %zu fits as well (chi-square within a factor max(1.01, exp(2/n)) of "
                     "the lowest, n = %zu residuals) and predicts none",
                     r->minimum_split_skipped, r->minimum_default, r->n_residuals);
        else
            snprintf(why, sizeof why, "the lowest chi-square%s",
                     r->n_minima > 1 && r->minimum_default == 1 && r->split
                         ? " (no minimum as good predicts no liquid-liquid split)"
                         : "");
        json_object_set_new(o, "minimum_choice",
                            json_pack("{s:I,s:I,s:s}", "minimum", (json_int_t)r->minimum_default,
                                      "split_skipped", (json_int_t)r->minimum_split_skipped,
                                      "because", why));
    }

    json_t *split = json_object();
    json_object_set_new(split, "predicted", json_boolean(r->split));
    json_object_set_new(split, "min_D", num(r->split_min_D));
    json_object_set_new(split, "x1_at_min", num(r->split_x));
    json_object_set_new(split, "T_K_at_min", num(r->split_T_K));
    json_object_set_new(o, "liquid_split", split);
    json_object_set_new(o, "three_phase_points", json_integer((json_int_t)r->n_three_phase));
    json_object_set_new(o, "inside_layers_scored", json_boolean(r->layers_scored));
    if (r->n_tie_lines) {
        json_t *lle = json_pack("{s:I,s:o,s:o}", "tie_lines", (json_int_t)r->n_tie_lines,
                                "sigma_x", num(r->sigma_x_lle), "aad_x", num(r->aad_x_lle));
        if (r->ties) { /* the measured and calculated layers of every tie line */
            json_t *rows = json_array();
            for (size_t i = 0; i < r->n_tie_lines; i++) {
                const pw_fit_tie *t = &r->ties[i];
                json_array_append_new(
                    rows, json_pack("{s:I,s:o,s:[o,o],s:[o,o]}", "line", (json_int_t)t->line,
                                    "T_K", num(t->T_K), "x1", num(t->x_I), num(t->x_II),
                                    "x1_calc", num(t->calc_I), num(t->calc_II)));
            }
            json_object_set_new(lle, "rows", rows);
        }
        json_object_set_new(o, "lle", lle);
    }

    json_t *range = json_object();
    json_object_set_new(range, "T_min_K", num(r->T_min_K));
    json_object_set_new(range, "T_max_K", num(r->T_max_K));
    json_object_set_new(o, "data_range", range);

    json_t *comps = json_array();
    json_array_append_new(comps, component_json(&r->sys.comp[0]));
    json_array_append_new(comps, component_json(&r->sys.comp[1]));
    json_object_set_new(o, "component_data", comps);

    json_t *data = json_object();
    json_object_set_new(data, "kind", json_string(r->kind == PW_DATA_ISOBARIC ? "isobaric" : "isothermal"));
    json_object_set_new(data, "P_fixed_Pa", num(r->P_fixed_Pa));
    json_object_set_new(data, "T_fixed_K", num(r->T_fixed_K));
    json_object_set_new(data, "has_y", json_boolean(r->has_y));
    if (r->data_sigma_known) /* the dataset's own metadata, for the consistency tests */
        json_object_set_new(
            data, "uncertainties",
            json_pack("{s:o,s:o,s:o,s:o,s:o,s:b,s:b}", "sigma_T_K", num(r->data_sigma_T_K),
                      "sigma_P_relative", num(r->data_sigma_P_rel), "sigma_P_abs_Pa",
                      num(r->data_sigma_P_abs_Pa), "sigma_y", num(r->data_sigma_y), "sigma_x",
                      num(r->data_sigma_x), "sigma_y_stated", r->data_sigma_y_stated,
                      "sigma_x_stated", r->data_sigma_x_stated));
    json_t *pts = with_points ? json_array() : json_string(POINTS_MARK);
    for (size_t i = 0; with_points && i < r->n_pts; i++)
        json_array_append_new(pts, point_json(&r->pts[i]));
    json_object_set_new(data, "points", pts);
    json_object_set_new(o, "data", data);

    json_t *ex = json_object();
    json_t *lines = json_array();
    for (size_t i = 0; i < r->n_pts; i++)
        if (r->pts[i].excluded)
            json_array_append_new(lines, json_integer(r->pts[i].meas.line));
    json_object_set_new(ex, "lines", lines);
    json_object_set_new(ex, "reason", json_string(r->exclude_reason));
    json_object_set_new(o, "excluded", ex);

    json_t *prov = json_object();
    json_object_set_new(prov, "dataset", json_string(r->dataset_path));
    json_object_set_new(prov, "dataset_sha256", json_string(r->dataset_sha256));
    json_object_set_new(prov, "source", json_string(r->source));
    json_object_set_new(prov, "program", json_string("pinchwise"));
    json_object_set_new(prov, "version", json_string(r->version));
    json_object_set_new(prov, "created", json_string(r->created));
    json_object_set_new(o, "provenance", prov);
    json_object_set_new(o, "caution",
                        json_string("Screening estimate from a correlation fitted to laboratory data. "
                                    "Verify with rigorous simulation and plant or pilot data; design "
                                    "equipment and relief per local codes under licensed engineering "
                                    "review."));
    return o;
}

json_t *pw_fitfile_to_json(const pw_fit_result *r)
{
    return fitfile_json(r, true);
}

json_t *pw_fitfile_json_without_points(const pw_fit_result *r)
{
    return fitfile_json(r, false);
}

/* The file's text is the dump of pw_fitfile_to_json (indent 1, reals in their shortest round
 * trip: 0.8, not 0.80000000000000004) with a final newline. The points are most of it (about 300
 * bytes each, and ten times that as a jansson tree), so they are not built as a tree: the rest is
 * dumped with a marker in their place, and the points are formatted one at a time straight into
 * the file, in the same layout (tests/unit/test_fitfile_stream.c compares the two). */

static size_t put(char *buf, size_t n, const char *s)
{
    size_t k = strlen(s);
    memcpy(buf + n, s, k);
    return n + k;
}

static size_t put_spaces(char *buf, size_t n, size_t k)
{
    memset(buf + n, ' ', k);
    return n + k;
}

/* ",\n<pad>\"key\": " (without the comma for the first key) */
static size_t put_key(char *buf, size_t n, size_t pad, const char *key, bool first)
{
    n = put(buf, n, first ? "\n" : ",\n");
    n = put_spaces(buf, n, pad);
    n = put(buf, n, "\"");
    n = put(buf, n, key);
    return put(buf, n, "\": ");
}

static size_t put_num(char *buf, size_t n, double v)
{
    char tok[40];
    return put(buf, n, isfinite(v) ? pw_json_format_real(v, tok, sizeof tok) : "null");
}

#define POINT_MAX_INDENT 64
#define POINT_BUF 2048 /* 12 keys of at most 16 characters, 9 reals of at most 25, indents */

/* One point as jansson dumps it at the depth whose lines start with pad + 1 spaces ("{" with
 * its keys at pad + 2 and its "}" at pad + 1; pad is the indent of the "points" key). */
static size_t point_text(char *buf, const pw_fit_point *p, size_t pad)
{
    char tok[32];
    size_t n = put(buf, 0, "{");
    n = put_key(buf, n, pad + 2, "line", true);
    snprintf(tok, sizeof tok, "%" JSON_INTEGER_FORMAT, (json_int_t)p->meas.line);
    n = put(buf, n, tok);
    n = put_num(buf, put_key(buf, n, pad + 2, "x1", false), p->meas.x1);
    n = put_num(buf, put_key(buf, n, pad + 2, "y1", false), p->meas.y1);
    n = put_num(buf, put_key(buf, n, pad + 2, "T_K", false), p->meas.T_K);
    n = put_num(buf, put_key(buf, n, pad + 2, "P_Pa", false), p->meas.P_Pa);
    n = put(buf, put_key(buf, n, pad + 2, "excluded", false), p->excluded ? "true" : "false");
    if (p->three_phase)
        n = put(buf, put_key(buf, n, pad + 2, "three_phase", false), "true");
    if (p->in_layers)
        n = put(buf, put_key(buf, n, pad + 2, "inside_layers", false), "true");
    n = put_num(buf, put_key(buf, n, pad + 2, "T_calc_K", false), p->T_calc_K);
    n = put_num(buf, put_key(buf, n, pad + 2, "P_calc_Pa", false), p->P_calc_Pa);
    n = put_num(buf, put_key(buf, n, pad + 2, "y1_calc", false), p->y_calc);
    n = put_num(buf, put_key(buf, n, pad + 2, "ln_gamma1_exp", false), p->lngamma_exp[0]);
    n = put_num(buf, put_key(buf, n, pad + 2, "ln_gamma2_exp", false), p->lngamma_exp[1]);
    n = put(buf, n, "\n");
    n = put_spaces(buf, n, pad + 1);
    return put(buf, n, "}");
}

static pw_status emit_points(const pw_fit_result *r, size_t pad, pw_outset_emit emit, void *sink)
{
    if (r->n_pts == 0)
        return emit(sink, "[]", 2);
    char buf[POINT_BUF];
    pw_status st = emit(sink, "[", 1);
    for (size_t i = 0; st == PW_OK && i < r->n_pts; i++) {
        size_t n = put(buf, 0, i ? ",\n" : "\n");
        n = put_spaces(buf, n, pad + 1);
        st = emit(sink, buf, n);
        if (st == PW_OK)
            st = emit(sink, buf, point_text(buf, &r->pts[i], pad));
    }
    if (st != PW_OK)
        return st;
    size_t n = put_spaces(buf, put(buf, 0, "\n"), pad);
    return emit(sink, buf, put(buf, n, "]"));
}

static pw_status fitfile_emit(void *ctx, pw_outset_emit emit, void *sink)
{
    const pw_fit_result *r = ctx;
    json_t *o = pw_fitfile_json_without_points(r);
    char *full = o ? json_dumps(o, JSON_INDENT(1) | JSON_REAL_PRECISION(17) | JSON_PRESERVE_ORDER)
                   : NULL;
    json_decref(o);
    char *text = pw_json_shortest_reals(full);
    free(full);
    if (!text)
        return PW_ENOMEM;
    static const char key[] = "\"points\": \"" POINTS_MARK "\"";
    char *at = strstr(text, key);
    const char *line = at;
    while (line && line > text && line[-1] == ' ')
        line--;
    size_t pad = at ? (size_t)(at - line) : 0;
    pw_status st = PW_OK;
    /* one marker alone on its line, or the layout is not the one assumed here (a bug) */
    if (!at || line == text || line[-1] != '\n' || strstr(at + 1, key) || pad > POINT_MAX_INDENT)
        st = PW_EINVAL;
    if (st == PW_OK)
        st = emit(sink, text, (size_t)(at - text) + strlen("\"points\": "));
    if (st == PW_OK)
        st = emit_points(r, pad, emit, sink);
    if (st == PW_OK) {
        const char *rest = at + strlen(key);
        st = emit(sink, rest, strlen(rest));
    }
    if (st == PW_OK)
        st = emit(sink, "\n", 1);
    free(text);
    return st;
}

pw_status pw_fitfile_stage(struct pw_outset *set, const char *path, const pw_fit_result *r,
                           pw_error *err)
{
    return pw_outset_add_stream(set, path, fitfile_emit, (void *)r, err);
}

pw_status pw_fitfile_write(const char *path, const pw_fit_result *r, bool force, pw_error *err)
{
    pw_outset *s = NULL;
    pw_status st = pw_outset_new(force, NULL, &s, err);
    if (st == PW_OK)
        st = pw_fitfile_stage(s, path, r, err);
    if (st == PW_OK)
        st = pw_outset_commit(s, err);
    pw_outset_free(s);
    return st;
}
