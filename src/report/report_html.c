/* The report page: header, provenance, plots, tables and cautions, with an inline stylesheet
 * (screen and print). Every string that comes from data is escaped. */
#include "report/report_internal.h"

#include <math.h>
#include <pinchwise/column_direction.h>
#include <pinchwise/azeotrope.h>
#include <pinchwise/curve.h>
#include <pinchwise/fitjson.h>
#include <stdlib.h>
#include <stdio.h>
#include <string.h>

#include "pinchwise_version.h"

static const char *const STYLE =
    ":root{--ink:#1e2430;--muted:#56606e;--rule:#d5d9df;--band:#17324d;--paper:#ffffff;"
    "--tint:#f3f1ec;--warn:#8c2d19}\n"
    "*{box-sizing:border-box}\n"
    "body{margin:0;background:#e9e7e1;color:var(--ink);font:15px/1.5 'DejaVu Sans','Liberation Sans',"
    "Arial,sans-serif}\n"
    "main{max-width:1060px;margin:0 auto;background:var(--paper);padding:0 40px 40px}\n"
    "header.pw-head{background:var(--band);color:#fff;margin:0 -40px 24px;padding:26px 40px 20px;"
    "border-bottom:6px solid #e08e2b}\n"
    "header.pw-head h1{margin:0 0 4px;font-size:25px;font-weight:600;letter-spacing:.2px}\n"
    "header.pw-head p{margin:0;color:#cdd6e2;font-size:14px}\n"
    "h2{font-size:19px;margin:34px 0 10px;padding-bottom:4px;border-bottom:2px solid var(--ink)}\n"
    "h3{font-size:16px;margin:22px 0 8px}\n"
    "p.note{color:var(--muted);font-size:13.5px;margin:6px 0}\n"
    "table{border-collapse:collapse;margin:8px 0 14px;font-size:14px}\n"
    "th,td{padding:4px 10px;border-bottom:1px solid var(--rule);text-align:left;vertical-align:top}\n"
    "th{background:var(--tint);font-weight:600}\n"
    "td.num{text-align:right;font-variant-numeric:tabular-nums;white-space:nowrap}\n"
    "table.kv th{width:15em}\n"
    "code,.mono{font-family:'DejaVu Sans Mono','Liberation Mono',monospace;font-size:12.5px;"
    "word-break:break-all}\n"
    ".verdict-pass::before{content:'\\2713\\00a0'}\n"
    ".verdict-fail{color:var(--warn);font-weight:600}\n"
    ".verdict-fail::before{content:'\\2717\\00a0'}\n"
    ".verdict-skip{color:var(--muted)}\n"
    ".verdict-skip::before{content:'\\2013\\00a0'}\n"
    "aside.pw-caution{border:2px solid var(--warn);border-left-width:10px;background:#fbf3ef;"
    "padding:10px 18px;margin:18px 0}\n"
    "aside.pw-caution h2{border:0;margin:6px 0;font-size:17px;color:var(--warn)}\n"
    "aside.pw-caution li{margin:4px 0}\n"
    "figure{margin:18px 0 26px;break-inside:avoid;page-break-inside:avoid}\n"
    "figure svg{width:100%;max-width:100%;height:auto;display:block;border:1px solid var(--rule)}\n"
    "section#answers{border:2px solid var(--band);background:var(--tint);padding:4px 20px 10px;"
    "margin:0 0 18px}\n"
    "section#answers h2{border:0;margin:10px 0 6px}\n"
    "dl.answers{display:grid;grid-template-columns:11em 1fr;gap:4px 16px;margin:0}\n"
    "dl.answers dt{font-weight:600}dl.answers dd{margin:0}\n"
    "figure.pw-small svg{max-width:560px}\n"
    "figcaption{font-size:13.5px;color:var(--muted);margin-top:6px;max-width:640px}\n"
    ".pw-grid2{display:flex;flex-wrap:wrap;gap:10px 28px}\n"
    "footer{margin-top:34px;color:var(--muted);font-size:12.5px;border-top:1px solid var(--rule);"
    "padding-top:8px}\n"
    "@media print{body{background:#fff;font-size:11pt}main{max-width:none;padding:0}"
    "header.pw-head{margin:0 0 14pt;padding:10pt 0;background:#fff;color:#000;border-bottom:3pt solid "
    "#000}header.pw-head p{color:#333}"
    "table,figure,aside{break-inside:avoid;page-break-inside:avoid}h2{break-after:avoid;"
    "page-break-after:avoid}figure svg{border:0;max-width:16cm}@page{margin:16mm 14mm}}\n";

static void esc(pw_sbuf *b, const char *s)
{
    pw_sbuf_escape(b, s);
}

/* A library reason or warning: its marked temperatures and pressures in the page's units
 * (pw_units_display_text), then escaped. */
static void esc_text(pw_sbuf *b, const pw_report_curves *c, const char *s)
{
    char buf[1024];
    pw_sbuf_escape(b, pw_units_display_text(&c->units, s, buf, sizeof buf));
}

/* A number cell: %.*g, or an en dash for a missing value. */
static void num(pw_sbuf *b, double v, int digits)
{
    if (isfinite(v))
        pw_sbuf_printf(b, "<td class=\"num\">%.*g</td>", digits, v);
    else
        pw_sbuf_puts(b, "<td class=\"num\">\xe2\x80\x93</td>");
}

static void kv(pw_sbuf *b, const char *k, const char *v, bool mono)
{
    pw_sbuf_puts(b, "<tr><th>");
    esc(b, k);
    pw_sbuf_puts(b, mono ? "</th><td class=\"mono\">" : "</th><td>");
    esc(b, v && v[0] ? v : "\xe2\x80\x93");
    pw_sbuf_puts(b, "</td></tr>\n");
}

static const char *base_name(const char *p)
{
    const char *s = strrchr(p, '/');
    return s ? s + 1 : p;
}

static void provenance(pw_sbuf *b, const pw_fit_result *r, const pw_report_input *in)
{
    char t[PW_PATH_MAX + 64];
    pw_sbuf_puts(b, "<section id=\"provenance\"><h2>Where these numbers come from</h2>\n"
                    "<table class=\"kv\">\n");
    kv(b, "Data file", r->dataset_path[0] ? base_name(r->dataset_path) : "", false);
    kv(b, "Data file SHA-256", r->dataset_sha256, true);
    kv(b, "Data source (as stated in the file)", r->source, false);
    kv(b, "Fit file", in->fit_path ? base_name(in->fit_path) : "", false);
    snprintf(t, sizeof t, "pinchwise %s, %s", r->version[0] ? r->version : "?", r->created);
    kv(b, "Fitted with", t, false);
    snprintf(t, sizeof t, "pinchwise %s", PINCHWISE_VERSION_STRING);
    kv(b, "Report made with", t, false);
    kv(b, "Report made on (UTC)", in->date_utc, false);
    pw_sbuf_puts(b, "</table></section>\n");
}

static void cautions(pw_sbuf *b)
{
    pw_sbuf_puts(
        b,
        "<aside class=\"pw-caution\" id=\"cautions\"><h2>Read before using these results</h2><ul>\n"
        "<li>These are <strong>screening results</strong> from an activity-coefficient model fitted "
        "to a limited set of measurements, with an ideal vapor phase and constant molal overflow. "
        "They are not a design.</li>\n"
        "<li>Verify with rigorous simulation and with plant, pilot or laboratory data before any "
        "decision; stage counts near minimum reflux, and above all near a tangent pinch, are very "
        "sensitive to the model. Do not extrapolate beyond the measured temperature range.</li>\n"
        "<li>The solvents may be flammable and toxic: consult the safety data sheet (SDS) of every "
        "substance and mixture for flash points, explosion limits, exposure limits and "
        "handling.</li>\n"
        "<li>Pressure relief, vessels, piping and all equipment must be designed to the local codes "
        "and reviewed by licensed, qualified engineers.</li>\n"
        "<li>A formal hazard review (for example a HAZOP) is needed before anything is built or "
        "operated.</li>\n"
        "</ul></aside>\n");
}

static void parameters(pw_sbuf *b, const pw_fit_result *r, const pw_display_units *u)
{
    char tb[48], tb2[48];
    const pw_model_type *m = r->sys.model;
    pw_sbuf_puts(b, "<section id=\"parameters\"><h2>Fitted model</h2>\n<p>");
    esc(b, m ? m->title : "unknown model");
    pw_report_T(u, r->sys.T_ref_K, 2, tb, sizeof tb);
    pw_sbuf_printf(b, "; reference temperature T_ref = %s.</p>\n", tb);
    pw_sbuf_puts(b, "<table><tr><th>Parameter</th><th>Unit</th><th>Value</th><th>Standard error</th>"
                    "<th>95 % interval, low</th><th>high</th><th>Role</th></tr>\n");
    size_t np = m ? m->n_params : 0;
    for (size_t i = 0; i < np; i++) {
        pw_sbuf_puts(b, "<tr><td>");
        esc(b, m->param_names[i]);
        pw_sbuf_puts(b, "</td><td>");
        esc(b, m->param_units[i]);
        pw_sbuf_puts(b, "</td>");
        num(b, r->sys.params[i], 6);
        num(b, r->fitted[i] ? r->stderr_[i] : PW_NAN, 3);
        num(b, r->fitted[i] ? r->ci95[i][0] : PW_NAN, 6);
        num(b, r->fitted[i] ? r->ci95[i][1] : PW_NAN, 6);
        pw_sbuf_printf(b, "<td>%s</td></tr>\n", r->fitted[i] ? "fitted" : "held fixed");
    }
    pw_sbuf_puts(b, "</table>\n");
    if (r->n_fitted >= 2) {
        pw_sbuf_puts(b, "<h3>Correlation of the fitted parameters</h3><table><tr><th></th>");
        for (size_t j = 0; j < np; j++)
            if (r->fitted[j]) {
                pw_sbuf_puts(b, "<th>");
                esc(b, m->param_names[j]);
                pw_sbuf_puts(b, "</th>");
            }
        pw_sbuf_puts(b, "</tr>\n");
        for (size_t i = 0; i < np; i++) {
            if (!r->fitted[i])
                continue;
            pw_sbuf_puts(b, "<tr><th>");
            esc(b, m->param_names[i]);
            pw_sbuf_puts(b, "</th>");
            for (size_t j = 0; j < np; j++)
                if (r->fitted[j])
                    num(b, r->corr[i][j], 3);
            pw_sbuf_puts(b, "</tr>\n");
        }
        pw_sbuf_puts(b, "</table>\n<p class=\"note\">Correlations near \xc2\xb1" "1 mean the data fix "
                        "a combination of the parameters better than each one alone.</p>\n");
    }
    pw_sbuf_puts(b, "<h3>Regression</h3><table class=\"kv\">\n");
    char t[400];
    snprintf(t, sizeof t, "%s (%s; %s)", r->converged ? "yes" : "NO", pw_fit_class_name(r->fit_class),
             pw_fit_stop_name(r->stop));
    kv(b, "Converged", t, false);
    snprintf(t, sizeof t,
             "%zu LM runs of the multistart, %zu iterations, %zu residual and %zu Jacobian "
             "evaluations",
             r->n_runs, r->iterations, r->n_fev, r->n_jev);
    kv(b, "Work", t, false);
    snprintf(t, sizeof t, "%.4g over %zu residuals, %zu degrees of freedom (%.3g per degree)", r->chi2,
             r->n_residuals, r->dof, r->chi2_red);
    kv(b, "Weighted sum of squares", t, false);
    snprintf(t, sizeof t, "AIC %.4g, AICc %.4g, BIC %.4g", r->aic, r->aicc, r->bic);
    kv(b, "Information criteria", t, false);
    size_t ex = 0;
    for (size_t i = 0; i < r->n_pts; i++)
        ex += r->pts[i].excluded;
    snprintf(t, sizeof t, "%zu measured, %zu left out%s%s", r->n_pts, ex, ex && r->exclude_reason[0] ? ": " : "",
             ex ? r->exclude_reason : "");
    kv(b, "Points", t, false);
    pw_report_T(u, r->T_min_K, 2, tb, sizeof tb);
    pw_report_T(u, r->T_max_K, 2, tb2, sizeof tb2);
    snprintf(t, sizeof t, "%s to %s", tb, tb2);
    kv(b, "Temperature range of the data", t, false);
    pw_sbuf_puts(b, "</table></section>\n");
}

static void dev_row(pw_sbuf *b, const char *name, const pw_fit_stat *s, double scale)
{
    if (!isfinite(s->aad))
        return;
    pw_sbuf_puts(b, "<tr><td>");
    esc(b, name);
    pw_sbuf_puts(b, "</td>");
    num(b, s->aad * scale, 3);
    num(b, s->bias * scale, 3);
    num(b, s->max_abs * scale, 3);
    pw_sbuf_printf(b, "<td class=\"num\">%ld</td></tr>\n", s->max_line);
}

static void deviations(pw_sbuf *b, const pw_fit_result *r, const pw_display_units *u)
{
    char tb[48], lab[96];
    pw_sbuf_puts(b, "<section id=\"deviations\"><h2>How closely the model follows the data</h2>\n"
                    "<table><tr><th>Quantity (calculated \xe2\x88\x92 measured)</th><th>Mean |deviation|"
                    "</th><th>Mean deviation (bias)</th><th>Largest |deviation|</th><th>at file line</th>"
                    "</tr>\n");
    dev_row(b, "vapor mole fraction y\xe2\x82\x81 / (mol/mol)", &r->dev_y, 1.0);
    snprintf(lab, sizeof lab, "bubble temperature / %s", pw_units_display_T_symbol(u));
    dev_row(b, lab, &r->dev_T_K, pw_units_display_dT(u, 1.0));
    snprintf(lab, sizeof lab, "bubble pressure / %s", pw_units_display_P_symbol(u));
    dev_row(b, lab, &r->dev_P_Pa, pw_units_display_P(u, 1.0));
    pw_sbuf_puts(b, "</table>\n");
    if (r->n_tie_lines) {
        pw_sbuf_printf(b, "<h3>Tie lines fitted with the data</h3>\n<p>%zu tie line%s, weighted "
                          "by Ï<sub>x</sub> = %.3g; mean |deviation| of the layers %.4g.</p>\n",
                       r->n_tie_lines, r->n_tie_lines == 1 ? "" : "s", r->sigma_x_lle,
                       r->aad_x_lle);
        if (r->ties) {
            pw_sbuf_puts(b, "<table><tr><th>File line</th><th>T</th><th>Layer I xâ "
                            "measured</th><th>calculated</th><th>Layer II xâ measured</th>"
                            "<th>calculated</th></tr>\n");
            for (size_t i = 0; i < r->n_tie_lines; i++) {
                const pw_fit_tie *t = &r->ties[i];
                pw_report_T(u, t->T_K, 2, tb, sizeof tb);
                pw_sbuf_printf(b, "<tr><td class=\"num\">%ld</td><td>%s</td>", t->line, tb);
                num(b, t->x_I, 4);
                num(b, t->calc_I, 4);
                num(b, t->x_II, 4);
                num(b, t->calc_II, 4);
                pw_sbuf_puts(b, "</tr>\n");
            }
            pw_sbuf_puts(b, "</table>\n");
        }
    }
    pw_report_T(u, r->sys.T_ref_K, 2, tb, sizeof tb);
    pw_sbuf_printf(b, "<h3>Infinite dilution (at T_ref = %s)</h3>\n<table><tr><th>Limit</th>"
                      "<th>ln \xce\xb3\xe2\x88\x9e</th><th>\xce\xb3\xe2\x88\x9e</th></tr>\n",
                   tb);
    const char *lim[2] = {"ln \xce\xb3\xe2\x82\x81 as x\xe2\x82\x81 \xe2\x86\x92 0",
                          "ln \xce\xb3\xe2\x82\x82 as x\xe2\x82\x81 \xe2\x86\x92 1"};
    for (int i = 0; i < 2; i++) {
        pw_sbuf_printf(b, "<tr><td>%s (", lim[i]);
        esc(b, r->sys.comp[i].name);
        pw_sbuf_puts(b, " dilute)</td>");
        num(b, r->lngamma_inf[i], 4);
        num(b, exp(r->lngamma_inf[i]), 4);
        pw_sbuf_puts(b, "</tr>\n");
    }
    pw_sbuf_puts(b, "</table>\n<h3>Liquid-liquid split screen</h3><p>");
    pw_report_T(u, r->split_T_K, 2, tb, sizeof tb);
    if (r->split)
        pw_sbuf_printf(b, "<span class=\"verdict-fail\">The fitted parameters predict two liquid "
                          "phases</span> (d\xc2\xb2(\xce\x94G/RT)/dx\xc2\xb2 = %.3g at x\xe2\x82\x81 = %.3f, "
                          "T = %s). %s",
                       r->split_min_D, r->split_x, tb,
                       r->n_three_phase || r->n_tie_lines
                           ? "The data show two liquids too; their three-phase points and tie "
                             "lines were fitted as such (docs/heterogeneous.md)."
                           : "A model fitted to vapor-liquid data alone is not reliable for "
                             "liquid-liquid behaviour; check for a split experimentally.");
    else
        pw_sbuf_printf(b, "<span class=\"verdict-pass\">No liquid-liquid split predicted</span> "
                          "(smallest d\xc2\xb2(\xce\x94G/RT)/dx\xc2\xb2 = %.3g at x\xe2\x82\x81 = %.3f, "
                          "T = %s).",
                       r->split_min_D, r->split_x, tb);
    pw_sbuf_puts(b, "</p>\n<h3>Distinct minima found by the multistart</h3>\n<table><tr><th>#</th>");
    const pw_model_type *m = r->sys.model;
    for (size_t j = 0; m && j < m->n_params; j++)
        if (r->fitted[j]) {
            pw_sbuf_puts(b, "<th>");
            esc(b, m->param_names[j]);
            pw_sbuf_puts(b, "</th>");
        }
    pw_sbuf_puts(b, "<th>Weighted sum of squares</th><th>Starts ending here</th></tr>\n");
    for (size_t k = 0; k < r->n_minima; k++) {
        pw_sbuf_printf(b, "<tr><td class=\"num\">%zu</td>", k + 1);
        for (size_t j = 0; m && j < m->n_params; j++)
            if (r->fitted[j])
                num(b, r->minima[k].params[j], 6);
        num(b, r->minima[k].chi2, 5);
        pw_sbuf_printf(b, "<td class=\"num\">%zu</td></tr>\n", r->minima[k].hits);
    }
    pw_sbuf_puts(b, "</table>\n");
    if (r->n_minima > 1)
        pw_sbuf_puts(b, "<p class=\"note\">More than one minimum: the parameters are not unique; "
                        "compare the predictions of each before relying on one.</p>\n");
    pw_sbuf_puts(b, "</section>\n");
}

/* The fit's diagnostics: the same list `fit` prints on the terminal. */
static void diagnostics_section(pw_sbuf *b, const pw_report_curves *c)
{
    pw_sbuf_puts(b, "<section id=\"diagnostics\"><h2>Fit diagnostics</h2>\n");
    if (c->diag_status != PW_OK) {
        pw_sbuf_puts(b, "<p>Not available: ");
        esc(b, pw_strerror(c->diag_status));
        pw_sbuf_puts(b, "</p>\n</section>\n");
        return;
    }
    if (c->diags.n == 0)
        pw_sbuf_puts(b, "<p>None: nothing in the fit or its data calls for a second look.</p>\n");
    else
        pw_sbuf_puts(b, "<table><tr><th>Severity</th><th>File line</th><th>Finding</th></tr>\n");
    for (size_t i = 0; i < c->diags.n; i++) {
        const pw_fit_diag *g = &c->diags.items[i];
        pw_sbuf_printf(b, "<tr><td class=\"%s\">%s</td>",
                       g->severity == PW_DIAG_NOTE ? "verdict-skip" : "verdict-fail",
                       pw_fit_diag_severity_name(g->severity));
        if (g->line > 0)
            pw_sbuf_printf(b, "<td class=\"num\">%ld</td><td>", g->line);
        else
            pw_sbuf_puts(b, "<td></td><td>");
        esc_text(b, c, g->message);
        pw_sbuf_puts(b, "</td></tr>\n");
    }
    if (c->diags.n)
        pw_sbuf_puts(b, "</table>\n");
    pw_sbuf_puts(b, "</section>\n");
}

static const char *verdict_cls(const pw_ctest *t)
{
    return !t->ran ? "verdict-skip" : t->pass ? "verdict-pass" : "verdict-fail";
}

/* The tests of include/pinchwise/consistency.h, run on the points the fit file carries. */
static void consistency_section(pw_sbuf *b, const pw_report_curves *c)
{
    pw_sbuf_puts(b, "<section id=\"consistency\"><h2>Thermodynamic consistency of the measurements"
                    "</h2>\n");
    if (!c->cons_ran) {
        pw_sbuf_puts(b, "<p>The tests could not be run: ");
        esc(b, c->cons_error);
        pw_sbuf_puts(b, "</p></section>\n");
        return;
    }
    const pw_consistency_result *k = &c->cons;
    pw_sbuf_printf(b, "<p><strong>Verdict: <span class=\"%s\" data-consistent=\"%d\">%s</span>"
                      "</strong></p>\n",
                   k->consistent ? "verdict-pass" : "verdict-fail", k->consistent ? 1 : 0,
                   k->consistent ? "consistent" : "not shown to be consistent");
    const pw_het_check *h = &c->cons_het;
    if (h->n) {
        pw_sbuf_printf(b, "<p>%zu three-phase point(s) (line", h->n);
        for (size_t i = 0; i < h->n; i++)
            pw_sbuf_printf(b, "%s %ld", i ? "," : "", h->pts[i].line);
        pw_sbuf_puts(b, "): ");
        esc(b, pw_het_check_reason());
        if (isfinite(h->max_bound))
            pw_sbuf_printf(b, ". Largest apparent activity y<sub>i</sub>P/P<sub>i</sub><sup>sat</sup>: "
                              "%.4f (%s).</p>\n",
                           h->max_bound, h->bound_ok ? "within the bound 1"
                                                     : "above 1: y, T or P of these points is doubtful");
        else
            pw_sbuf_puts(b, ". Their apparent activity could not be evaluated (a vapor pressure "
                            "failed there).</p>\n");
    }
    pw_sbuf_puts(b, "<table><tr><th>Test</th><th>Value</th><th>Limit</th><th>Result</th>"
                    "<th>Published source</th></tr>\n");
    for (int i = 0; i < PW_CTEST_COUNT; i++) {
        const pw_ctest *t = &k->tests[i];
        /* the exact numbers as data attributes, for machine comparison with `check --json` */
        if (t->ran)
            pw_sbuf_printf(b, "<tr data-test=\"%s\" data-value=\"%.17g\" data-limit=\"%.17g\" "
                              "data-pass=\"%d\"><td>",
                           t->name, t->value, t->limit, t->pass ? 1 : 0);
        else
            pw_sbuf_printf(b, "<tr data-test=\"%s\" data-ran=\"0\"><td>", t->name);
        esc(b, t->title);
        if (k->primary[i])
            pw_sbuf_puts(b, " <em>(verdict rests on it)</em>");
        pw_sbuf_puts(b, "</td>");
        num(b, t->ran ? t->value : PW_NAN, 4);
        num(b, t->ran ? t->limit : PW_NAN, 4);
        pw_sbuf_printf(b, "<td class=\"%s\">", verdict_cls(t));
        if (t->ran)
            pw_sbuf_puts(b, t->pass ? "passes" : "fails");
        else {
            pw_sbuf_puts(b, "not run: ");
            esc(b, t->why_not);
        }
        pw_sbuf_puts(b, "</td><td>");
        esc(b, t->source);
        pw_sbuf_puts(b, "</td></tr>\n");
    }
    pw_sbuf_puts(b, "</table>\n");
    if (isfinite(k->gap_bridge))
        pw_sbuf_printf(b, "<p class=\"note\" id=\"gap-bridge\">The area test bridges the "
                          "two-liquid gap between x<sub>1</sub> = %.4g and %.4g by the step of "
                          "G<sup>E</sup>/RT there (%.4g; exact at constant temperature); each "
                          "liquid branch is smoothed on its own (docs/consistency.md).</p>\n",
                       k->gap_bridge_x1[0], k->gap_bridge_x1[1], k->gap_bridge);
    if (k->n_reasons) {
        pw_sbuf_puts(b, "<ul>\n");
        for (size_t i = 0; i < k->n_reasons; i++) {
            pw_sbuf_puts(b, "<li>");
            esc_text(b, c, k->reasons[i]);
            pw_sbuf_puts(b, "</li>\n");
        }
        pw_sbuf_puts(b, "</ul>\n");
    }
    if (k->n_flagged)
        pw_sbuf_printf(b, "<p class=\"note\">%zu point(s) flagged as possible outliers by the "
                          "point test.</p>\n",
                       k->n_flagged);
    pw_sbuf_puts(b, "</section>\n");
}

/* "low to high", or an en dash when the interval is missing. */
static void interval_cell(pw_sbuf *b, const double ci[2], int digits)
{
    if (isfinite(ci[0]) && isfinite(ci[1]) && digits < 0) /* -digits decimals */
        pw_sbuf_printf(b, "<td class=\"num\">%.*f \xe2\x80\x93 %.*f</td>", -digits, ci[0],
                       -digits, ci[1]);
    else if (isfinite(ci[0]) && isfinite(ci[1]))
        pw_sbuf_printf(b, "<td class=\"num\">%.*g \xe2\x80\x93 %.*g</td>", digits, ci[0], digits,
                       ci[1]);
    else
        pw_sbuf_puts(b, "<td class=\"num\">\xe2\x80\x93</td>");
}

/* Which interval is quoted, and why (the rule of include/pinchwise/uncertainty.h). */
static const char *interval_source(const pw_unc_output *o)
{
    if (!isfinite(o->ci[0]))
        return "none (too few usable draws)";
    if (!o->ci_sampled)
        return "linearised (the two agree)";
    return o->lin_ok ? "sampled (the linearised one differs by more than 25 % of its width)"
                     : "sampled (no linearised interval)";
}

/* unc: intervals of each row (NULL: none); tp_isP: the second interval is a pressure (kPa as the
 * uncertainty module gives it), else a temperature in K. Shown in the display units. */
static void az_table(pw_sbuf *b, const pw_report_curves *c, const pw_draw_az *az, size_t n,
                     const char *where, const pw_unc_result *unc, bool tp_isP)
{
    const pw_display_units *u = &c->units;
    const char *Ts = pw_units_display_T_symbol(u), *Ps = pw_units_display_P_symbol(u);
    pw_sbuf_puts(b, "<h3>");
    esc(b, where);
    pw_sbuf_puts(b, "</h3>\n");
    if (n == 0) {
        pw_sbuf_puts(b, "<p>None predicted for 0 &lt; x\xe2\x82\x81 &lt; 1.</p>\n");
        return;
    }
    pw_sbuf_printf(b, "<table><tr><th>x\xe2\x82\x81 = y\xe2\x82\x81</th><th>T / %s</th><th>P / %s</th>"
                      "<th>Kind</th>", Ts, Ps);
    if (unc)
        pw_sbuf_printf(b, "<th>x\xe2\x82\x81, 95 %% interval</th><th>%s / %s, 95 %% interval</th>"
                          "<th>Interval quoted</th>",
                       tp_isP ? "P" : "T", tp_isP ? Ps : Ts);
    pw_sbuf_puts(b, "</tr>\n");
    for (size_t i = 0; i < n; i++) {
        pw_sbuf_puts(b, "<tr>");
        num(b, az[i].x1, 4);
        pw_sbuf_printf(b, "<td class=\"num\">%.2f</td>", pw_units_display_T(u, az[i].T_K));
        num(b, pw_units_display_P(u, az[i].P_Pa), 5);
        pw_sbuf_printf(b, "<td>%s%s%s", az[i].min_boiling ? "minimum-boiling" : "maximum-boiling",
                       az[i].heterogeneous ? ", heterogeneous (two liquid layers, vapor between "
                                             "them; x\xe2\x82\x81 is the vapor's)" : "",
                       az[i].tangential ? " (near-tangential: a double root, sensitive to the model)" : "");
        /* intervals belong to the azeotrope module's roots, listed first; a heterogeneous one
         * has none */
        bool has = unc && !az[i].heterogeneous;
        if (has && unc[i].n_infeasible && isfinite(unc[i].p_feasible))
            pw_sbuf_printf(b, "; absent in %.0f %% of the parameter sets drawn",
                           100.0 * (1.0 - unc[i].p_feasible));
        pw_sbuf_puts(b, "</td>");
        if (has) {
            interval_cell(b, unc[i].out[PW_UNC_AZ_X1].ci, 4);
            const double *ci = unc[i].out[PW_UNC_AZ_TP].ci;
            double shown[2];
            for (int k = 0; k < 2; k++)
                shown[k] = tp_isP ? pw_units_display_P(u, ci[k] * 1e3) : pw_units_display_T(u, ci[k]);
            interval_cell(b, shown, tp_isP ? 5 : -2); /* T: 0.01 of a degree */
            pw_sbuf_puts(b, "<td>");
            esc(b, interval_source(&unc[i].out[PW_UNC_AZ_X1]));
            pw_sbuf_puts(b, "</td>");
        } else if (unc) {
            pw_sbuf_puts(b, "<td colspan=\"3\">\xe2\x80\x93</td>");
        }
        pw_sbuf_puts(b, "</tr>\n");
    }
    pw_sbuf_puts(b, "</table>\n");
}

/* True when the azeotropes at the column pressure are the ones at the data's condition as the
 * page prints them (the same pressure, or one so close that every shown digit agrees): one table
 * then, not two identical ones. */
static bool column_at_data_pressure(const pw_report_curves *c)
{
    if (!c->column || c->isothermal)
        return false;
    if (fabs(c->P_col_Pa - c->fit->P_fixed_Pa) <= 1e-9 * c->fit->P_fixed_Pa)
        return true;
    const pw_draw_azeotropes *a = &c->phase.az, *z = &c->xy.az;
    if (a->status != z->status || a->n != z->n ||
        fabs(c->P_col_Pa - c->fit->P_fixed_Pa) > 0.005 * c->fit->P_fixed_Pa)
        return false;
    for (size_t i = 0; i < a->n; i++)
        if (fabs(a->az[i].x1 - z->az[i].x1) >= 5e-5 || fabs(a->az[i].T_K - z->az[i].T_K) >= 5e-3 ||
            a->az[i].heterogeneous != z->az[i].heterogeneous)
            return false;
    return true;
}

/* Azeotropes from the azeotrope module (include/pinchwise/azeotrope.h). */
static void azeotropes(pw_sbuf *b, const pw_report_curves *c, const char *cond)
{
    char where[320], pc[48];
    pw_report_P(&c->units, c->P_col_Pa, 4, pc, sizeof pc);
    pw_sbuf_puts(b, "<section id=\"azeotropes\"><h2>Azeotropes of the model</h2>\n");
    snprintf(where, sizeof where, "At the data's condition, %s", cond);
    bool u1 = c->unc && c->unc_az_status == PW_OK, u2 = c->unc && c->unc_col_az_status == PW_OK;
    if (column_at_data_pressure(c))
        snprintf(where, sizeof where, "At the data's condition, %s, and the column pressure, %s "
                 "(the same azeotropes to every digit shown)", cond, pc);
    az_table(b, c, c->phase.az.az, c->phase.az.n, where, u1 ? c->unc_az : NULL, c->isothermal);
    if (c->column && !column_at_data_pressure(c)) {
        snprintf(where, sizeof where, "At the column pressure, %s", pc);
        az_table(b, c, c->xy.az.az, c->xy.az.n, where, u2 ? c->unc_col_az : NULL, false);
    }
    if (c->unc && (c->phase.az.n || (c->column && c->xy.az.n))) {
        if ((c->phase.az.n && !u1) || (c->column && c->xy.az.n && !u2))
            pw_sbuf_printf(b, "<p class=\"verdict-fail\">No interval for some azeotropes: %s.</p>\n",
                           pw_strerror(c->phase.az.n && !u1 ? c->unc_az_status : c->unc_col_az_status));
        pw_sbuf_printf(b, "<p class=\"note\">95 %% intervals from the fit's parameter covariance: "
                          "linearised (delta method) and from %zu parameter sets drawn with seed %lu "
                          "(percentiles, JCGM 101:2008); see docs/uncertainty.md. They cover the "
                          "scatter of the fitted data only, not the choice of model.</p>\n",
                       c->unc_opt.samples, c->unc_opt.seed);
    }
    if (c->az_from_module)
        pw_sbuf_puts(b, "<p class=\"note\">Roots of ln \xce\xb1\xe2\x82\x81\xe2\x82\x82 = 0 at "
                        "the model's bubble points (Brent's method), classified by the extremum of "
                        "the bubble curve; see docs/azeotrope.md.</p></section>\n");
    else
        pw_sbuf_puts(b, "<p class=\"verdict-fail\">The azeotrope search did not complete at one of "
                        "these conditions: no azeotrope is shown there, which does not mean there is "
                        "none.</p></section>\n");
}

/* The energy-balance column beside the constant-overflow one (computed in report_curves.c). */
static void energy_section(pw_sbuf *b, const pw_report_curves *c)
{
    const pw_energy_result *e = &c->energy_res;
    pw_sbuf_puts(b, "<h3>With energy balances</h3>\n");
    if (c->energy_status != PW_OK) {
        pw_sbuf_puts(b, "<p class=\"verdict-fail\">Not computed: ");
        esc_text(b, c, c->energy_error[0] ? c->energy_error : pw_strerror(c->energy_status));
        pw_sbuf_puts(b, "</p>\n");
        return;
    }
    if (!e->feasible) {
        pw_sbuf_puts(b, "<p class=\"verdict-fail\">");
        esc_text(b, c, e->reason);
        pw_sbuf_puts(b, "</p>\n");
        return;
    }
    char t[256];
    pw_sbuf_puts(b, "<table>\n");
    snprintf(t, sizeof t, "%.5g (constant molal overflow %.5g)", e->r_min, c->dc.col.r_min);
    kv(b, "Minimum reflux R_min", t, false);
    if (e->reflux_limited)
        snprintf(t, sizeof t, "none: no reflux is needed");
    else if (e->boilup_limited)
        snprintf(t, sizeof t, "zero reboiler duty (the feed brings the heat)");
    else
        snprintf(t, sizeof t, "%s pinch in the %s section at liquid x = %.4f",
                 e->pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed",
                 e->pinch.section == PW_SECTION_STRIPPING ? "stripping" : "rectifying",
                 e->pinch.x);
    kv(b, "Limit", t, false);
    snprintf(t, sizeof t, "feed %.1f, distillate %.1f, bottoms %.1f J/mol (liquids at 298.15 K = 0)",
             e->h_F, e->h_D, e->h_B);
    kv(b, "Enthalpies", t, false);
    pw_sbuf_puts(b, "</table>\n<table><tr><th>R / R_min</th><th>R</th><th>Stages, stepped</th>"
                    "<th>Feed stage</th><th>Condenser kJ per mol feed</th><th>Reboiler kJ per "
                    "mol feed</th></tr>\n");
    for (size_t i = 0; i < c->energy_design.n; i++) {
        const pw_design_case *d = &c->energy_design.row[i];
        pw_sbuf_puts(b, "<tr>");
        num(b, d->factor, 3);
        num(b, d->R, 4);
        if (d->reachable) {
            num(b, d->stages, 3);
            pw_sbuf_printf(b, "<td class=\"num\">%d</td>", d->feed_stage);
            num(b, d->Q_C / 1e3, 4);
            num(b, d->Q_R / 1e3, 4);
        } else {
            pw_sbuf_puts(b, "<td colspan=\"4\">not reached at this reflux</td>");
        }
        pw_sbuf_puts(b, "</tr>\n");
    }
    pw_sbuf_puts(b, "</table>\n<p class=\"note\">Stage-to-stage energy and mass balances "
                    "(Ponchon 1921; Savarit 1922) with constant heat capacities, ideal-gas vapor "
                    "enthalpies and the model's H<sup>E</sup>, which VLE data fix poorly. "
                    "Duties are for equilibrium stages without heat losses; size equipment "
                    "per local codes under licensed review.</p>\n");
}

/* A note when constant molal overflow is doubtful for these components (pw_cmo_doubtful);
 * remedy says what the reader can do instead. */
static void cmo_note(pw_sbuf *b, const pw_report_curves *c, const char *remedy)
{
    const pw_system *s = &c->fit->sys;
    if (!pw_cmo_doubtful(s))
        return;
    pw_sbuf_puts(b, "<p class=\"note\" id=\"overflow-doubt\">The heats of vaporization of ");
    esc(b, s->comp[0].name);
    pw_sbuf_puts(b, " and ");
    esc(b, s->comp[1].name);
    pw_sbuf_printf(b, " differ by %.0f %%: constant molal overflow is doubtful above about %.0f %% "
                      "(common practice). ",
                   100.0 * pw_latent_heat_mismatch(s), 100.0 * PW_CMO_MISMATCH_MAX);
    pw_sbuf_puts(b, remedy);
    pw_sbuf_puts(b, "</p>\n");
}

/* The decanter scheme (pinchwise/decanter.h) drawn when a heterogeneous azeotrope blocks the
 * single column. */
static void decanter_section(pw_sbuf *b, const pw_report_curves *c)
{
    const pw_draw_decanter *d = &c->dc.decanter;
    const pw_decanter_result *r = &d->res;
    const pw_three_phase *tp = &r->decanter;
    char t[320], t1[48];
    pw_sbuf_printf(b, "<h3 id=\"decanter\">The decanter scheme</h3>\n<p>Fresh feed and both "
                      "condensed overhead vapors enter one decanter %s; the layer rich in component "
                      "1 tops stripping column A (bottoms x<sub>1</sub> = ",
                   r->cooled ? "cooled below the three-phase temperature, each layer reheated to "
                               "its bubble point before it tops its column"
                             : "at the three-phase temperature");
    pw_sbuf_printf(b, "%.4g), the other layer tops stripping column B (bottoms x<sub>1</sub> = %.4g). "
                      "Each column has a partial reboiler and no condenser of its own; constant "
                      "molal overflow.</p>\n",
                   fmax(c->spec.xd, c->spec.xb), fmin(c->spec.xd, c->spec.xb));
    cmo_note(b, c, "The first-law residual of the flows (with the duties, where the components' "
                   "heat data are known) shows how far they are from an energy balance.");
    if (d->status != PW_OK || !r->feasible) {
        pw_sbuf_puts(b, "<p class=\"verdict-fail\">Not sized: ");
        esc_text(b, c, d->status != PW_OK ? pw_strerror(d->status) : r->reason);
        pw_sbuf_puts(b, "</p>\n");
        return;
    }
    pw_sbuf_puts(b, "<table class=\"kv\">\n");
    pw_report_T(&c->units, tp->T_K, 2, t1, sizeof t1);
    snprintf(t, sizeof t, "%s; layers x\xe2\x82\x81 = %.4f and %.4f; vapor y\xe2\x82\x81 = %.4f", t1,
             tp->x[0], tp->x[1], tp->y1);
    kv(b, r->cooled ? "Three-phase state (boiling layers)" : "Decanter (three-phase state)", t,
       false);
    if (r->cooled) {
        pw_report_T(&c->units, r->T_decanter_K, 2, t1, sizeof t1);
        snprintf(t, sizeof t, "%s; layers x\xe2\x82\x81 = %.4f and %.4f", t1, r->top_x1[1],
                 r->top_x1[0]);
        kv(b, "Decanter (cooled)", t, false);
    }
    snprintf(t, sizeof t, "A %.4g, B %.4g mol per mol of feed (mass balance closes to %.1e)",
             r->bottoms_per_mol_feed[0], r->bottoms_per_mol_feed[1], r->closure);
    kv(b, "Bottoms flows", t, false);
    if (d->duties) {
        snprintf(t, sizeof t, "%.4g kJ per mol of feed (both overhead vapors and the feed, "
                              "condensed into the decanter)", r->condenser_J[d->duty_row] / 1e3);
        kv(b, "Condenser duty", t, false);
    }
    pw_sbuf_printf(b, "</table>\n<table><tr><th>Column</th><th>Top (layer) x\xe2\x82\x81</th>"
                      "<th>Bottoms x\xe2\x82\x81</th><th>Minimum boil-up V/B</th><th>Limit</th>"
                      "<th>N<sub>min</sub></th><th>Drawn at V/B</th><th>Stages there</th>"
                      "<th>Vapor per mol feed</th><th>Layer per mol feed</th>%s</tr>\n",
                   d->duties ? (r->cooled ? "<th>Reboiler kJ per mol feed</th><th>Reheat kJ per "
                                            "mol feed</th>"
                                          : "<th>Reboiler kJ per mol feed</th>")
                             : "");
    const char *nm[2] = {"A", "B"};
    const double bottoms[2] = {fmax(c->spec.xd, c->spec.xb), fmin(c->spec.xd, c->spec.xb)};
    for (int i = 0; i < 2; i++) {
        const pw_stripper_result *k = &r->col[i];
        pw_sbuf_printf(b, "<tr><td>%s</td>", nm[i]);
        num(b, r->top_x1[i], 4);
        num(b, bottoms[i], 4);
        num(b, k->boilup_min, 4);
        pw_sbuf_printf(b, "<td>%s pinch at x\xe2\x82\x81 = %.4f</td>",
                       k->tangent ? "tangent" : "top", k->x_pinch);
        num(b, k->n_min, 3);
        num(b, d->boilup[i], 4);
        if (d->stairs[i].status == PW_OK)
            num(b, d->stairs[i].stages, 3);
        else
            pw_sbuf_printf(b, "<td>not reached: %s</td>", pw_strerror(d->stairs[i].status));
        num(b, d->vapor[i], 4);
        num(b, d->layer[i], 4);
        if (d->duties)
            num(b, r->reboiler_J[i][d->duty_row] / 1e3, 4);
        if (d->duties && r->cooled)
            num(b, r->reheat_J[i][d->duty_row] / 1e3, 4);
        pw_sbuf_puts(b, "</tr>\n");
    }
    pw_sbuf_printf(b, "</table>\n<p class=\"note\">Each column is drawn and stepped at %.2g times its "
                      "minimum boil-up (the operating factor); stages include the partial reboiler, "
                      "with a fractional last step. Vapor: the column's boil-up, condensed into the "
                      "decanter; layer: the decanter layer returned to its top.%s See docs/heterogeneous.md for the method.</p>\n",
                   d->factor,
                   d->duties ? " Duties from the components' heat data on these "
                               "constant-molal-overflow flows: screening values." : "");
}

static void column_section(pw_sbuf *b, const pw_report_curves *c)
{
    const pw_column_spec *sp = &c->spec;
    const pw_column_result *k = &c->dc.col;
    pw_sbuf_puts(b, "<section id=\"column\"><h2>Column targets: reflux and stages</h2>\n");
    char pc[48], t1[48], t2[48], t3[48], t4[48];
    pw_report_P(&c->units, c->P_col_Pa, 4, pc, sizeof pc);
    pw_sbuf_printf(b, "<p>Binary column with total condenser and partial reboiler at %s: "
                      "x<sub>D</sub> = %.4g, z<sub>F</sub> = %.4g, x<sub>B</sub> = %.4g, q = %.3g "
                      "(mole fractions of ",
                   pc, sp->xd, sp->zf, sp->xb, sp->q);
    esc(b, c->fit->sys.comp[0].name);
    pw_sbuf_puts(b, "); constant molal overflow.</p>\n");
    if (!c->energy)
        cmo_note(b, c, "The report's --energy option adds the column with energy balances on every "
                       "stage.");
    if (c->dc.status != PW_OK) {
        pw_sbuf_puts(b, "<p class=\"verdict-fail\">The column analysis failed: ");
        esc(b, pw_strerror(c->dc.status));
        if (k->reason[0]) {
            pw_sbuf_puts(b, ": ");
            esc_text(b, c, k->reason);
        }
        pw_sbuf_puts(b, "</p></section>\n");
        return;
    }
    if (!k->feasible) {
        pw_sbuf_puts(b, "<p><strong class=\"verdict-fail\">This split cannot be made by ordinary "
                        "distillation at this pressure:</strong> ");
        esc_text(b, c, k->reason);
        pw_sbuf_puts(b, "</p>\n");
        if (c->dc.hetero_blocked)
            decanter_section(b, c);
        pw_sbuf_puts(b, "</section>\n");
        return;
    }
    pw_sbuf_puts(b, "<table class=\"kv\">\n");
    char t[320];
    snprintf(t, sizeof t, "%.4g (boil-up ratio %.4g)", k->r_min, k->s_min);
    kv(b, "Minimum reflux ratio R_min = L/D", t, false);
    snprintf(t, sizeof t, "%s pinch in the %s section at x = %.4f, y = %.4f",
             k->pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed",
             k->pinch.section == PW_SECTION_STRIPPING ? "stripping" : "rectifying", k->pinch.x,
             k->pinch.y);
    kv(b, "Limiting pinch", t, false);
    snprintf(t, sizeof t, "x = %.4f, y = %.4f", k->x_q, k->y_q);
    kv(b, "q-line meets the equilibrium curve", t, false);
    if (k->pinch.kind == PW_PINCH_TANGENT) {
        snprintf(t, sizeof t, "%.4g (would underestimate R_min)", k->r_feed);
        kv(b, "R from the feed point alone", t, false);
    }
    if (k->n_min_status != PW_OK)
        snprintf(t, sizeof t, "not reached by stepping (%s)", pw_strerror(k->n_min_status));
    else
        snprintf(t, sizeof t, "%.3g stepped on the curve (partial reboiler counted)", k->n_min);
    kv(b, "Minimum stages N_min (total reflux)", t, false);
    snprintf(t, sizeof t, "%.3g with \xce\xb1 = \xe2\x88\x9a(%.3g \xc3\x97 %.3g) (Fenske 1932)", k->n_fenske,
             k->alpha_top, k->alpha_bottom);
    kv(b, "Fenske estimate", t, false);
    pw_report_T(&c->units, c->dc.T_top_K, 2, t1, sizeof t1);
    pw_report_T(&c->units, c->dc.T_bottom_K, 2, t2, sizeof t2);
    pw_report_T(&c->units, c->fit->T_min_K, 2, t3, sizeof t3);
    pw_report_T(&c->units, c->fit->T_max_K, 2, t4, sizeof t4);
    snprintf(t, sizeof t, "top %s, bottom %s (data span %s to %s)", t1, t2, t3, t4);
    kv(b, "Bubble temperatures", t, false);
    pw_sbuf_puts(b, "</table>\n");
    /* the same check and margin as the reflux command's warning (pw_fit_range_check_ends) */
    pw_range_check ends[2], span;
    if (pw_fit_range_check_ends(c->fit, c->dc.T_top_K, c->dc.T_bottom_K, PW_RANGE_COLUMN_MARGIN_K,
                                ends, &span) == PW_OK && span.outside_data)
        pw_sbuf_puts(b, "<p class=\"verdict-fail\">The column runs outside the temperature range of "
                        "the data: the model is extrapolated.</p>\n");
    pw_sbuf_puts(b, "<h3>Design table</h3><table><tr><th>R / R_min</th><th>R</th><th>Boil-up "
                    "V\xcc\x84/B</th><th>Stages, stepped</th><th>Feed stage (from top)</th>"
                    "<th>Stages, Gilliland (Molokanov form)</th></tr>\n");
    for (size_t i = 0; i < k->n_design; i++) {
        const pw_design_row *d = &k->design[i];
        pw_sbuf_puts(b, "<tr>");
        num(b, d->factor, 3);
        num(b, d->R, 4);
        num(b, d->boilup, 4);
        if (d->status != PW_OK) {
            pw_sbuf_printf(b, "<td colspan=\"2\">not reached: %s</td>", pw_strerror(d->status));
        } else {
            num(b, d->stages, 3);
            pw_sbuf_printf(b, "<td class=\"num\">%d</td>", d->feed_stage);
        }
        num(b, d->gilliland_stages, 3);
        pw_sbuf_puts(b, "</tr>\n");
    }
    pw_sbuf_puts(b, "</table>\n<p class=\"note\">Stages are equilibrium stages including the partial "
                    "reboiler, with a fractional last step; Gilliland's correlation (Molokanov et al. "
                    "1972) is a shortcut check on the stepped count. Add tray efficiency before "
                    "thinking of real trays.</p>\n");
    const pw_profile *p = &c->profile_op;
    if (p->n) {
        pw_sbuf_printf(b, "<h3>Stage profile at %.3g R_min (R = %.4g)</h3><table><tr><th>Stage"
                          "</th><th>x1</th><th>y1</th><th>T / %s</th><th>L / F</th><th>V / F</th>"
                          "<th></th></tr>\n",
                       c->factor, c->dc.r_op, pw_units_display_T_symbol(&c->units));
        for (size_t i = 0; i < p->n; i++) {
            const pw_stage *g = &p->stage[i];
            pw_sbuf_printf(b, "<tr><td class=\"num\">%zu</td>", i + 1);
            num(b, g->x, 5);
            num(b, g->y, 5);
            pw_sbuf_printf(b, "<td class=\"num\">%.2f</td>", pw_units_display_T(&c->units, g->T_K));
            num(b, g->L, 4);
            num(b, g->V, 4);
            pw_sbuf_printf(b, "<td>%s</td></tr>\n",
                           (int)i + 1 == p->feed_stage ? "feed"
                           : i + 1 == p->n            ? "partial reboiler"
                                                      : "");
        }
        pw_sbuf_puts(b, "</table>\n<p class=\"note\">Liquid and vapor leaving each equilibrium "
                        "stage, counted from the top (total condenser not counted), constant "
                        "molal overflow; flows per mole of feed. The last stage's liquid is the "
                        "step that reaches the bottoms composition.</p>\n");
    }
    if (c->energy)
        energy_section(b, c);
    pw_sbuf_puts(b, "</section>\n");
}

static void unc_row(pw_sbuf *b, const char *label, const pw_unc_output *o)
{
    pw_sbuf_puts(b, "<tr><td>");
    esc(b, label);
    pw_sbuf_puts(b, "</td>");
    num(b, o->value, 4);
    num(b, o->ci[0], 4);
    num(b, o->ci[1], 4);
    pw_sbuf_puts(b, "<td>");
    esc(b, interval_source(o));
    pw_sbuf_puts(b, "</td>");
    if (o->lin_ok)
        interval_cell(b, o->ci_lin, 4);
    else
        pw_sbuf_puts(b, "<td class=\"num\">\xe2\x80\x93</td>");
    if (o->mc_ok)
        interval_cell(b, o->ci_mc, 4);
    else
        pw_sbuf_puts(b, "<td class=\"num\">\xe2\x80\x93</td>");
    pw_sbuf_puts(b, "</tr>\n");
}

/* "How sure": the column results under the fit's parameter uncertainty. */
static void how_sure_section(pw_sbuf *b, const pw_report_curves *c)
{
    pw_sbuf_puts(b, "<section id=\"how-sure\"><h2>How sure: the column under the fit's "
                    "uncertainty</h2>\n");
    if (c->unc_col_status != PW_OK) {
        pw_sbuf_puts(b, "<p class=\"verdict-fail\">The uncertainty could not be propagated: ");
        esc(b, pw_strerror(c->unc_col_status));
        pw_sbuf_puts(b, c->unc_col_status == PW_EINVAL ? " (is the fit's covariance available?)"
                                                      : "");
        pw_sbuf_puts(b, ".</p></section>\n");
        return;
    }
    const pw_unc_result *r = &c->unc_col.res;
    char words[PW_REASON_MAX * 2], label[64];
    pw_sbuf_printf(b, "<p>The fitted parameters were drawn %zu times from their covariance (seed "
                      "%lu) and the column solved again for each set; the linearised interval "
                      "comes from the gradient of each result (delta method).</p>\n",
                   r->n_samples, c->unc_opt.seed);
    if (r->point_status == PW_OK) {
        pw_sbuf_puts(b, "<table id=\"how-sure-table\"><tr><th>Result</th><th>Value</th>"
                        "<th>95 % interval, low</th><th>high</th><th>Interval quoted</th>"
                        "<th>Linearised</th><th>Sampled</th></tr>\n");
        unc_row(b, "Minimum reflux ratio R_min", &r->out[PW_UNC_RMIN]);
        unc_row(b, "Minimum boil-up ratio V\xcc\x84/B", &r->out[PW_UNC_SMIN]);
        snprintf(label, sizeof label, "Stages at %.2g R_min", c->unc_factor);
        unc_row(b, label, &r->out[PW_UNC_STAGES]);
        pw_sbuf_puts(b, "</table>\n");
    }
    pw_sbuf_puts(b, "<table class=\"kv\">\n");
    kv(b, "Can the split be made?", pw_unc_risk_words(r, words, sizeof words), false);
    if (c->unc_col.plan_status == PW_OK)
        kv(b, "Where to measure next",
           pw_unc_plan_words(&c->unc_col.plan, "R_min", words, sizeof words), false);
    else
        kv(b, "Where to measure next", "no recommendation (R_min has no linearised gradient)",
           false);
    if (r->n_redrawn) {
        snprintf(words, sizeof words, "%zu (outside the model's parameter domain, drawn again)",
                 r->n_redrawn);
        kv(b, "Draws rejected", words, false);
    }
    pw_sbuf_puts(b, "</table>\n");
    if (c->band_status != PW_OK && r->point_status == PW_OK)
        pw_sbuf_printf(b, "<p class=\"note\">The band of curves near the pinch could not be drawn: "
                          "%s.</p>\n",
                       pw_strerror(c->band_status));
    pw_sbuf_puts(b, "<p class=\"note\">Interval rule: the linearised interval is quoted unless it "
                    "and the sampled one (2.5 and 97.5 % percentiles of the draws, JCGM 101:2008) "
                    "differ at either end by more than 25 % of the sampled width; then the result "
                    "is not linear in the parameters over their uncertainty and the sampled one is "
                    "quoted. These intervals cover the scatter of the fitted data only, not the "
                    "choice of model, the vapor-pressure constants or constant molal overflow. "
                    "Operating reflux of 1.2\xe2\x80\x93" "1.5 R_min is common practice.</p>"
                    "</section>\n");
}

static void figure(pw_sbuf *b, const pw_report_file *f, const char *caption)
{
    /* the enlarged view is a small plot: shown at its own size, not the column's width */
    bool small = !strcmp(f->name, "xy_pinch.svg") || !strncmp(f->name, "xy_decanter_", 12);
    pw_sbuf_puts(b, small ? "<figure class=\"pw-small\">\n" : "<figure>\n");
    pw_sbuf_puts(b, pw_sbuf_str(&f->text));
    pw_sbuf_puts(b, "<figcaption>");
    esc(b, caption);
    pw_sbuf_puts(b, "</figcaption></figure>\n");
}

static const char *caption_for(const char *name, const pw_report_curves *c)
{
    bool column = c->column;
    bool decanter = column && c->dc.hetero_blocked && c->dc.decanter.status == PW_OK
                    && c->dc.decanter.res.feasible;
    bool sized = c->dc.status == PW_OK && c->dc.col.feasible;
    if (!strcmp(name, "xy.svg") && column && !decanter && !sized)
        return "Equilibrium curve at the column pressure with the measured points and the "
               "targets. No construction is drawn: the column was not sized (the reason is under "
               "\"Column targets\").";
    if (!strcmp(name, "xy.svg") && decanter)
        return "Equilibrium curve at the column pressure (flat over the two-liquid region, shaded) "
               "with the decanter scheme: each stripping column's operating line and stage steps "
               "from its decanter layer to its bottoms.";
    if (!strcmp(name, "xy_pinch.svg"))
        return "The same construction enlarged around the limiting pinch, where the stage steps "
               "crowd: every step drawn is one the column module counted.";
    if (!strncmp(name, "xy_decanter_", 12))
        return name[12] == 'a'
                   ? "Column A of the decanter scheme enlarged: from the layer rich in component 1 "
                     "down to its bottoms, its operating line and every stage step counted."
                   : "Column B of the decanter scheme enlarged: from the layer lean in component 1 "
                     "down to its bottoms, where the steps crowd near the pure end.";
    if (!strcmp(name, "models.svg"))
        return "Every model fitted to these data, each in its own colour and dash, over the "
               "measured points: where the curves part, the choice of model matters.";
    if (!strcmp(name, "xy.svg"))
        return column ? "Equilibrium curve at the column pressure with the construction: q-line, "
                        "operating lines at minimum reflux (dashed) and at the operating reflux "
                        "(solid), stage steps, and the limiting pinch (star)."
                      : "Equilibrium curve of the fitted model with the measured points.";
    if (!strcmp(name, "pinch_band.svg"))
        return "Equilibrium curves at the column pressure near the limiting pinch for parameter "
               "sets drawn from the fit's covariance (thin), the best fit (thick), the operating "
               "lines at minimum reflux of the best fit (dashed) and the pinch (star). Where the "
               "thin curves cross the dashed line, that parameter set needs more reflux.";
    if ((!strcmp(name, "txy.svg") || !strcmp(name, "pxy.svg")) && c->phase.az.three_phase.exists)
        return "Bubble (solid) and dew (dashed) curves of the model with the measured liquid "
               "(filled circles) and vapor (open triangles) compositions. The liquids split: the "
               "bubble curve is flat at the three-phase condition between the two layers "
               "(squares), and the dotted lines below it bound the two-liquid region.";
    if (!strcmp(name, "txy.svg") || !strcmp(name, "pxy.svg"))
        return "Bubble (solid) and dew (dashed) curves of the model with the measured liquid "
               "(filled circles) and vapor (open triangles) compositions.";
    if (!strncmp(name, "residual", 8))
        return "Calculated minus measured at each point; the shaded band is one assumed "
               "measurement standard deviation either side of zero.";
    return "ln \xce\xb3 of the model (lines) and from each measured point (markers), from "
           "y P = x \xce\xb3 P\xcb\xa2\xe1\xb5\x83\xe1\xb5\x97.";
}

/* Model comparison: every fit of the same data as ranked by the library (pw_rank_assess), with
 * the design numbers beside the deviations, since equal deviations can hide different azeotropes. */
static void ranking(pw_sbuf *b, const pw_report_curves *c)
{
    const pw_ranking *rk = c->rank;
    if (!rk || c->rank_status != PW_OK)
        return;
    pw_sbuf_puts(b, "<section id=\"ranking\"><h2>Models fitted to these data, side by side</h2>\n"
                    "<table><tr><th>Rank</th><th>Model</th><th>\xce\x94" "AICc (0 = best; lower is better)</th>"
                    "<th>Support</th><th>Mean |\xce\x94" "y|"
                    "</th>");
    pw_sbuf_printf(b, "<th>Mean |\xce\x94T| / %s</th><th>Mean |\xce\x94P| / %s</th>",
                   pw_units_display_T_symbol(&c->units), pw_units_display_P_symbol(&c->units));
    pw_sbuf_puts(b, ""
                    "<th>Azeotrope x\xe2\x82\x81 at the data's condition</th>");
    if (c->column)
        pw_sbuf_puts(b, "<th>R_min at the column targets</th>");
    pw_sbuf_puts(b, "<th>Notes</th></tr>\n");
    for (size_t i = 0; i < rk->n; i++) {
        const pw_rank_row *w = &rk->rows[i];
        pw_sbuf_printf(b, "<tr data-model=\"%s\"><td class=\"num\">%zu</td><td>",
                       w->fit->sys.model->name, i + 1);
        esc(b, w->fit->sys.model->name);
        pw_sbuf_puts(b, w->fit == c->fit ? " (this report)</td>" : "</td>");
        num(b, w->delta_aicc, 3);
        pw_sbuf_printf(b, "<td>%s</td>", pw_rank_class_name(w->cls));
        num(b, w->fit->dev_y.aad, 3);
        num(b, pw_units_display_dT(&c->units, w->fit->dev_T_K.aad), 3);
        num(b, pw_units_display_P(&c->units, w->fit->dev_P_Pa.aad), 3);
        /* every azeotrope as the azeotrope command lists it (pw_rank_row.azs) */
        if (w->az_status != PW_OK)
            pw_sbuf_puts(b, "<td>search failed</td>");
        else if (w->n_azs == 0)
            pw_sbuf_puts(b, "<td data-az=\"\">none</td>");
        else {
            pw_sbuf_puts(b, "<td class=\"num\" data-az=\"");
            for (size_t k = 0; k < w->n_azs; k++)
                pw_sbuf_printf(b, "%s%.17g", k ? " " : "", w->azs[k].x1);
            pw_sbuf_puts(b, "\">");
            for (size_t k = 0; k < w->n_azs; k++)
                pw_sbuf_printf(b, "%s%.4f%s", k ? "; " : "", w->azs[k].x1,
                               w->azs[k].heterogeneous ? " (heterogeneous)" : "");
            pw_sbuf_puts(b, "</td>");
        }
        if (c->column) {
            if (w->col_status == PW_OK && w->col.feasible)
                num(b, w->col.r_min, 4);
            else
                pw_sbuf_puts(b, w->col_status == PW_OK ? "<td>infeasible</td>" : "<td>not solved</td>");
        }
        pw_sbuf_printf(b, "<td>%s%s</td></tr>\n", w->fit->converged ? "" : "did not converge. ",
                       !w->fit->split                      ? ""
                       : pw_rank_split_allowed(w->fit) ? "predicts a liquid split (allowed: two "
                                                         "liquids were measured)."
                                                       : "predicts a liquid split.");
    }
    pw_sbuf_puts(b, "</table>\n<p class=\"note\">Ranked by AICc (Hurvich &amp; Tsai 1989): "
                    "\xce\x94" "AICc below 2 means the data cannot tell the models apart, 10 or more "
                    "that a model has essentially no support (Burnham &amp; Anderson 2002). Rule "
                    "applied: ");
    esc(b, pw_rank_rule_text(rk));
    pw_sbuf_puts(b, ". \xce\x94" "AICc is the "
                    "model's AICc minus that of rank 1: positive values fit worse; a negative value "
                    "is a fit with a lower AICc ranked below rank 1 for the reason in its support "
                    "class or notes.");
    if (rk->az_existence_differs)
        pw_sbuf_puts(b, " Models with support disagree on whether an azeotrope exists.");
    else if (rk->az_x_hi > rk->az_x_lo)
        pw_sbuf_printf(b, " Models with support place the azeotrope between x\xe2\x82\x81 = "
                          "%.3f and %.3f.", rk->az_x_lo, rk->az_x_hi);
    if (rk->feasibility_differs)
        pw_sbuf_puts(b, " They disagree on whether the split is feasible.");
    if (rk->rmin_hi > rk->rmin_lo)
        pw_sbuf_printf(b, " Their R_min spans %.4g to %.4g (%.0f %% of the lowest): that spread is "
                          "model risk the parameter intervals do not show.",
                       rk->rmin_lo, rk->rmin_hi, 100.0 * (rk->rmin_hi - rk->rmin_lo) / rk->rmin_lo);
    pw_sbuf_puts(b, "</p>\n</section>\n");
}

/* One line of the answers block: a term, then text the caller writes, closed by answer_end. */
static void answer(pw_sbuf *b, const char *term)
{
    pw_sbuf_puts(b, "<dt>");
    esc(b, term);
    pw_sbuf_puts(b, "</dt><dd>");
}

static void answer_end(pw_sbuf *b) { pw_sbuf_puts(b, "</dd>\n"); }

/* A temperature in the display unit (in kelvin also in degrees Celsius, as engineers read it). */
static void temp(pw_sbuf *b, const pw_display_units *u, double T_K)
{
    if (!strcmp(pw_units_display_T_symbol(u), "K"))
        pw_sbuf_printf(b, "%.2f K (%.2f \xc2\xb0" "C)", T_K, T_K - 273.15);
    else
        pw_sbuf_printf(b, "%.2f %s", pw_units_display_T(u, T_K), pw_units_display_T_symbol(u));
}

static void az_answer(pw_sbuf *b, const pw_report_curves *c, const pw_draw_az *az, size_t n,
                      bool ok, bool isothermal, const pw_unc_result *unc)
{
    if (!ok) {
        pw_sbuf_puts(b, "<span class=\"verdict-fail\">search did not complete</span>");
        return;
    }
    if (n == 0) {
        pw_sbuf_puts(b, "none");
        return;
    }
    for (size_t i = 0; i < n; i++) {
        pw_sbuf_printf(b, "%s%s%s at x\xe2\x82\x81 = %.4f", i ? "; " : "",
                       az[i].min_boiling ? "minimum-boiling" : "maximum-boiling",
                       az[i].heterogeneous ? " heterogeneous" : "", az[i].x1);
        if (unc && !az[i].heterogeneous && unc[i].out[0].ci[0] < unc[i].out[0].ci[1])
            pw_sbuf_printf(b, " (95 %% %.4f to %.4f)", unc[i].out[0].ci[0], unc[i].out[0].ci[1]);
        if (isothermal) {
            pw_sbuf_printf(b, ", %.4g %s", pw_units_display_P(&c->units, az[i].P_Pa),
                           pw_units_display_P_symbol(&c->units));
        } else {
            pw_sbuf_puts(b, ", ");
            temp(b, &c->units, az[i].T_K);
        }
        /* a model that cannot split, inside the two liquids the data show */
        const pw_system *sys = &c->fit->sys;
        if (pw_system_split_unmodelled(sys)
            && pw_measured_split_overlaps(&sys->measured, az[i].x1, az[i].x1))
            pw_sbuf_printf(b, " <span class=\"verdict-fail\">(inside the two liquids the data "
                              "show, xâ %.3f to %.3f, which the %s model cannot "
                              "represent: not valid)</span>",
                           sys->measured.x_lo, sys->measured.x_hi, sys->model->name);
    }
}

/* The answers first: what an engineer opens the page for, each linked to its section below.
 * Every number here is one the sections below show; nothing is computed for this block. */
static void answers(pw_sbuf *b, const pw_report_curves *c, const char *cond)
{
    const pw_fit_result *r = c->fit;
    pw_sbuf_puts(b, "<section id=\"answers\"><h2>Answers</h2>\n<dl class=\"answers\">\n");
    answer(b, "Measured data");
    if (!c->cons_ran) {
        pw_sbuf_puts(b, "consistency tests could not run: ");
        esc(b, c->cons_error);
    } else {
        size_t run = 0, pass = 0;
        for (int i = 0; i < PW_CTEST_COUNT; i++)
            if (c->cons.tests[i].ran) {
                run++;
                pass += c->cons.tests[i].pass;
            }
        pw_sbuf_printf(b, "<span class=\"%s\">%s</span> (%zu of %zu consistency tests pass) "
                          "<a href=\"#consistency\">details</a>",
                       c->cons.consistent ? "verdict-pass" : "verdict-fail",
                       c->cons.consistent ? "consistent" : "not shown consistent", pass, run);
    }
    answer_end(b);
    answer(b, "Model");
    esc(b, r->sys.model->name);
    pw_sbuf_puts(b, r->converged ? ", converged" : ", <span class=\"verdict-fail\">did not converge</span>");
    if (c->rank && c->rank_status == PW_OK) {
        size_t pos = 0;
        while (pos < c->rank->n && c->rank->rows[pos].fit != r)
            pos++;
        if (pos < c->rank->n) {
            const pw_rank_row *w = &c->rank->rows[pos];
            pw_sbuf_printf(b, "; rank %zu of %zu by AICc (%s", pos + 1, c->rank->n,
                           pw_rank_class_name(w->cls));
            if (pos > 0 && isfinite(w->delta_aicc))
                pw_sbuf_printf(b, ", \xce\x94" "AICc %.2f above the best", w->delta_aicc);
            pw_sbuf_puts(b, ") <a href=\"#ranking\">side by side</a>");
        }
    }
    if (isfinite(r->dev_y.aad))
        pw_sbuf_printf(b, "; mean |\xce\x94y| %.4f", r->dev_y.aad);
    else if (!r->has_y)
        pw_sbuf_puts(b, "; mean |\xce\x94y| not applicable, because the data have no y");
    else
        pw_sbuf_puts(b, "; mean |\xce\x94y| not available (no point was fitted)");
    answer_end(b);
    answer(b, "Azeotropes");
    pw_sbuf_puts(b, "at ");
    esc(b, cond);
    pw_sbuf_puts(b, ": ");
    bool u1 = c->unc && c->unc_az_status == PW_OK, u2 = c->unc && c->unc_col_az_status == PW_OK;
    az_answer(b, c, c->phase.az.az, c->phase.az.n, c->phase.az.status == PW_OK, c->isothermal, u1 ? c->unc_az : NULL);
    if (c->column && !column_at_data_pressure(c)) {
        char pc[48];
        pw_report_P(&c->units, c->P_col_Pa, 4, pc, sizeof pc);
        pw_sbuf_printf(b, "; at the column pressure %s: ", pc);
        az_answer(b, c, c->xy.az.az, c->xy.az.n, c->xy.az.status == PW_OK, false, u2 ? c->unc_col_az : NULL);
    }
    pw_sbuf_puts(b, " <a href=\"#azeotropes\">details</a>");
    answer_end(b);
    if (c->column) {
        const pw_column_result *k = &c->dc.col;
        answer(b, "Split");
        if (c->dc.status != PW_OK) {
            pw_sbuf_puts(b, "<span class=\"verdict-fail\">the column analysis failed: ");
            esc(b, pw_strerror(c->dc.status));
            pw_sbuf_puts(b, "</span>");
        } else if (!k->feasible) {
            pw_sbuf_puts(b, "<span class=\"verdict-fail\">not feasible by ordinary distillation at "
                            "this pressure</span>: ");
            esc_text(b, c, k->reason);
        } else {
            pw_sbuf_printf(b, "<span class=\"verdict-pass\">feasible</span>: x<sub>D</sub> %.4g, "
                              "x<sub>B</sub> %.4g from z<sub>F</sub> %.4g (q = %.3g)",
                           c->spec.xd, c->spec.xb, c->spec.zf, c->spec.q);
        }
        if (c->spec.xd < c->spec.xb) { /* either direction (pinchwise/column_direction.h) */
            pw_sbuf_puts(b, "; component 1, ");
            esc(b, r->sys.comp[0].name);
            pw_sbuf_puts(b, ", is the one which goes to the bottoms");
        }
        answer_end(b);
        const pw_draw_decanter *dk = &c->dc.decanter;
        if (c->dc.hetero_blocked && dk->status == PW_OK && dk->res.feasible) {
            char t1[48];
            pw_report_T(&c->units, dk->res.T_decanter_K, 2, t1, sizeof t1);
            answer(b, "Decanter scheme");
            pw_sbuf_printf(b, "layers x\xe2\x82\x81 = %.4f and %.4f at %s%s; ", dk->res.top_x1[1],
                           dk->res.top_x1[0], t1, dk->res.cooled ? " (cooled)" : "");
            for (int i = 0; i < 2; i++)
                pw_sbuf_printf(b, "%scolumn %s minimum V/B %.4g, %.3g stages at %.2g times it",
                               i ? "; " : "", i ? "B" : "A", dk->res.col[i].boilup_min,
                               dk->stairs[i].stages, dk->factor);
            pw_sbuf_puts(b, " <a href=\"#decanter\">details</a>");
            answer_end(b);
        }
        if (c->dc.status == PW_OK && k->feasible) {
            answer(b, "Minimum reflux");
            pw_sbuf_printf(b, "R<sub>min</sub> = %.4g, %s pinch in the %s section at x = %.4f",
                           k->r_min, k->pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed",
                           k->pinch.section == PW_SECTION_STRIPPING ? "stripping" : "rectifying",
                           k->pinch.x);
            if (k->reflux_limited)
                pw_sbuf_puts(b, " (no reflux is needed)");
            if (c->energy && c->energy_status == PW_OK && c->energy_res.feasible)
                pw_sbuf_printf(b, "; with energy balances R<sub>min</sub> = %.4g",
                               c->energy_res.r_min);
            pw_sbuf_puts(b, " <a href=\"#column\">details</a>");
            answer_end(b);
            answer(b, "Stages");
            if (isfinite(c->dc.stairs.stages))
                pw_sbuf_printf(b, "%.3g equilibrium stages at %.2g R<sub>min</sub> (R = %.4g), feed "
                                  "on stage %d; ",
                               c->dc.stairs.stages, c->factor, c->dc.r_op, c->dc.stairs.feed_stage);
            else
                pw_sbuf_printf(b, "the column cannot be stepped at %.2g R<sub>min</sub>; ", c->factor);
            pw_sbuf_printf(b, "N<sub>min</sub> %.3g at total reflux (partial reboiler counted)",
                           k->n_min);
            answer_end(b);
        }
        if (c->unc) {
            answer(b, "How sure");
            if (c->unc_col_status != PW_OK) {
                pw_sbuf_puts(b, "not propagated: ");
                esc(b, pw_strerror(c->unc_col_status));
            } else {
                const pw_unc_result *u = &c->unc_col.res;
                const pw_unc_output *o = &u->out[PW_UNC_RMIN];
                if (u->point_status == PW_OK && o->ci[0] < o->ci[1])
                    pw_sbuf_printf(b, "R<sub>min</sub> 95 %% interval %.4g to %.4g; ", o->ci[0], o->ci[1]);
                if (isfinite(u->p_feasible))
                    pw_sbuf_printf(b, "the split is feasible for %.1f %% of %zu parameter sets drawn "
                                      "from the fit",
                                   100.0 * u->p_feasible, u->n_samples);
                pw_sbuf_puts(b, " <a href=\"#how-sure\">details</a>");
            }
            answer_end(b);
        }
    }
    /* the warnings that change a decision */
    size_t nw = 0;
    const char *warn[6];
    if (!r->converged)
        warn[nw++] = "the fit did not converge: every number is provisional";
    if (r->split && c->phase.az.three_phase.exists)
        warn[nw++] = "the fitted parameters predict two liquid layers at the boiling point: the page "
                     "draws the three-phase line and the two-liquid region; check the layers "
                     "against measured solubilities";
    else if (r->split)
        warn[nw++] = "the fitted parameters predict a liquid-liquid split: one-liquid results may be wrong";
    if (c->cons_ran && !c->cons.consistent)
        warn[nw++] = "the measured data are not shown consistent: check them before designing";
    if (c->rank && c->rank_status == PW_OK && (c->rank->az_place_differs || c->rank->az_existence_differs))
        warn[nw++] = "models that fit about equally well disagree on the azeotrope";
    if (c->rank && c->rank_status == PW_OK && (c->rank->rmin_differs || c->rank->feasibility_differs))
        warn[nw++] = "models that fit about equally well disagree on R_min or on feasibility";
    if (c->column && c->dc.status == PW_OK && c->dc.col.feasible && c->dc.col.pinch.kind == PW_PINCH_TANGENT)
        warn[nw++] = "tangent pinch: stage counts near minimum reflux are very sensitive to the model";
    answer(b, "Warnings");
    if (nw == 0)
        pw_sbuf_puts(b, "none beyond the cautions at the end");
    for (size_t i = 0; i < nw; i++) {
        pw_sbuf_puts(b, i ? "; " : "<span class=\"verdict-fail\">");
        esc(b, warn[i]);
    }
    if (nw)
        pw_sbuf_puts(b, "</span>");
    answer_end(b);
    pw_sbuf_puts(b, "</dl>\n<p class=\"note\"><strong>Screening only.</strong> Read the "
                    "<a href=\"#cautions\">cautions</a> before using any number on this page.</p>"
                    "\n</section>\n");
}

pw_status pw_report_render_html(struct pw_report *rep, const pw_report_curves *c,
                                const pw_report_input *in)
{
    const pw_fit_result *r = c->fit;
    pw_sbuf *b = &rep->html;
    char cond[64];
    pw_report_condition(r, &c->units, cond, sizeof cond);
    pw_sbuf_puts(b, "<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">\n"
                    "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n"
                    "<meta http-equiv=\"Content-Security-Policy\" content=\"default-src 'none'; "
                    "style-src 'unsafe-inline'; img-src data:\">\n<title>");
    esc(b, r->sys.comp[0].name);
    pw_sbuf_puts(b, " + ");
    esc(b, r->sys.comp[1].name);
    pw_sbuf_puts(b, ": vapor-liquid equilibrium screening report</title>\n<style>\n");
    pw_sbuf_puts(b, STYLE);
    pw_sbuf_puts(b, "</style></head>\n<body><main>\n<header class=\"pw-head\"><h1>");
    esc(b, r->sys.comp[0].name);
    pw_sbuf_puts(b, " + ");
    esc(b, r->sys.comp[1].name);
    pw_sbuf_puts(b, "</h1><p>Vapor-liquid equilibrium screening report \xc2\xb7 ");
    esc(b, r->sys.model ? r->sys.model->name : "?");
    pw_sbuf_puts(b, " model \xc2\xb7 data ");
    pw_sbuf_puts(b, r->kind == PW_DATA_ISOTHERMAL ? "isothermal at " : "isobaric at ");
    esc(b, cond);
    if (c->column)
    {
        char pc[48];
        pw_report_P(&c->units, c->P_col_Pa, 4, pc, sizeof pc);
        pw_sbuf_printf(b, " \xc2\xb7 column at %s", pc);
    }
    pw_sbuf_puts(b, "</p></header>\n");
    answers(b, c, cond);
    provenance(b, r, in);
    if (c->n_failed)
        pw_sbuf_printf(b, "<p class=\"note\">%zu equilibrium solves on the plotted grids did not "
                          "converge; the curves have gaps there.</p>\n",
                       c->n_failed);
    if (!r->converged)
        pw_sbuf_puts(b, "<p class=\"verdict-fail\">The fit did not converge: treat every number "
                        "below as provisional.</p>\n");
    pw_sbuf_puts(b, "<section id=\"plots\"><h2>Plots</h2>\n");
    for (size_t i = 0; i < rep->n_svg; i++)
        figure(b, &rep->svg[i], caption_for(rep->svg[i].name, c));
    pw_sbuf_puts(b, "</section>\n");
    parameters(b, r, &c->units);
    deviations(b, r, &c->units);
    diagnostics_section(b, c);
    ranking(b, c);
    consistency_section(b, c);
    azeotropes(b, c, cond);
    if (c->column)
        column_section(b, c);
    if (c->column && c->unc)
        how_sure_section(b, c);
    cautions(b);
    pw_sbuf_puts(b, "<footer>Made by pinchwise ");
    esc(b, PINCHWISE_VERSION_STRING);
    pw_sbuf_puts(b, ". The page is self-contained: no scripts, no external styles, fonts or "
                    "images.</footer>\n</main></body></html>\n");
    return pw_sbuf_status(b);
}
