/* The report's answers first: one block at the top of the page that states the data verdict, the
 * model, the azeotropes, the column's minimum reflux with its pinch, the stages at the operating
 * factor, the feasibility, the "how sure" numbers and the main warnings, each with a link to the
 * section that shows the evidence. Presentation only: every number was computed before (report
 * curves, consistency, column, uncertainty). */
#include "report/report_internal.h"

#include <stdio.h>
#include <string.h>

static void esc(pw_sbuf *b, const char *s)
{
    for (; s && *s; s++) {
        switch (*s) {
        case '<':
            pw_sbuf_puts(b, "&lt;");
            break;
        case '>':
            pw_sbuf_puts(b, "&gt;");
            break;
        case '&':
            pw_sbuf_puts(b, "&amp;");
            break;
        case '"':
            pw_sbuf_puts(b, "&quot;");
            break;
        default:
            pw_sbuf_printf(b, "%c", *s);
            break;
        }
    }
}

static void row_start(pw_sbuf *b, const char *what, const char *anchor)
{
    pw_sbuf_printf(b, "<tr><th><a href=\"#%s\">", anchor);
    esc(b, what);
    pw_sbuf_puts(b, "</a></th><td>");
}

static void az_list(pw_sbuf *b, const pw_report_az *az, size_t n, bool isothermal)
{
    if (n == 0) {
        pw_sbuf_puts(b, "none");
        return;
    }
    for (size_t i = 0; i < n; i++)
        if (isothermal)
            pw_sbuf_printf(b, "%s%s at x\xe2\x82\x81 = %.3f, P = %.4g kPa", i ? "; " : "",
                           az[i].min_boiling ? "minimum-boiling" : "maximum-boiling", az[i].x1,
                           az[i].P_Pa / 1000.0);
        else /* kelvin and degrees Celsius (K = C + 273.15) */
            pw_sbuf_printf(b,
                           "%s%s at x\xe2\x82\x81 = %.3f, T = %.2f K (%.2f \xc2\xb0"
                           "C)",
                           i ? "; " : "", az[i].min_boiling ? "minimum-boiling" : "maximum-boiling",
                           az[i].x1, az[i].T_K, az[i].T_K - 273.15);
}

pw_status pw_report_summary_html(pw_sbuf *b, const pw_report_curves *c)
{
    const pw_fit_result *r = c->fit;
    const char *n1 = r->sys.comp[0].name;
    pw_sbuf_puts(b, "<section id=\"summary\"><h2>Summary</h2>\n<table class=\"summary\">\n");

    row_start(b, "Data", "consistency");
    if (c->cons_ran)
        pw_sbuf_printf(b, "%s by the consistency tests (%zu points)",
                       c->cons.consistent ? "consistent" : "<strong>not shown consistent</strong>",
                       r->n_pts);
    else {
        pw_sbuf_puts(b, "consistency not tested: ");
        esc(b, c->cons_error[0] ? c->cons_error : "the tests could not run");
    }
    pw_sbuf_puts(b, "</td></tr>\n");

    row_start(b, "Model", "parameters");
    esc(b, r->sys.model ? r->sys.model->name : "?");
    pw_sbuf_printf(b, ", the model of this fit file; %s",
                   r->converged ? "converged"
                                : "<strong>did "
                                  "not converge</strong>");
    if (isfinite(r->dev_y.aad))
        pw_sbuf_printf(b, "; mean |\xce\x94y| %.4f", r->dev_y.aad);
    if (isfinite(r->dev_T_K.aad))
        pw_sbuf_printf(b, "; mean |\xce\x94T| %.3f K", r->dev_T_K.aad);
    if (isfinite(r->dev_P_Pa.aad))
        pw_sbuf_printf(b, "; mean |\xce\x94P| %.4g kPa", r->dev_P_Pa.aad / 1000.0);
    pw_sbuf_puts(b, " (the side-by-side table ranks the other models)</td></tr>\n");

    row_start(b, "Azeotropes at the data's condition", "azeotropes");
    az_list(b, c->az, c->n_az, c->isothermal);
    pw_sbuf_puts(b, "</td></tr>\n");

    if (c->column) {
        const pw_column_spec *s = &c->spec;
        row_start(b, "Column targets", "column");
        pw_sbuf_printf(b,
                       "%.4g kPa, x<sub>D</sub> %.4g, z<sub>F</sub> %.4g, x<sub>B</sub> %.4g, "
                       "q %.3g (mole fractions of ",
                       c->P_col_Pa / 1000.0, s->xd, s->zf, s->xb, s->q);
        esc(b, n1);
        pw_sbuf_printf(b, ", which goes %s)</td></tr>\n",
                       s->xd > s->xb ? "overhead" : "to the bottoms");
        row_start(b, "Azeotropes at the column pressure", "azeotropes");
        az_list(b, c->col_az, c->n_col_az, false);
        pw_sbuf_puts(b, "</td></tr>\n");
        row_start(b, "Feasibility", "column");
        if (c->col_status != PW_OK)
            pw_sbuf_printf(b, "<strong>the column could not be solved</strong> (%s)",
                           pw_strerror(c->col_status));
        else if (!c->col.feasible) {
            pw_sbuf_puts(b, "<strong>not feasible by simple distillation</strong>: ");
            esc(b, c->col.reason);
        } else
            pw_sbuf_puts(b, "feasible by simple distillation at this pressure");
        pw_sbuf_puts(b, "</td></tr>\n");
        if (c->col_status == PW_OK && c->col.feasible) {
            row_start(b, "Minimum reflux", "column");
            pw_sbuf_printf(b,
                           "R<sub>min</sub> = %.4g, set by a %s pinch in the %s section at x = "
                           "%.4f",
                           c->col.r_min, c->col.pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed",
                           c->col.pinch.section == PW_SECTION_RECTIFYING ? "rectifying"
                                                                         : "stripping",
                           c->col.pinch.x);
            pw_sbuf_puts(b, "</td></tr>\n");
            row_start(b, "Stages", "column");
            pw_sbuf_printf(b, "%.3g at total reflux; ", c->col.n_min);
            if (isfinite(c->stages_op))
                pw_sbuf_printf(b,
                               "%.3g at R = %.3g (%.3g R<sub>min</sub>), feed on stage %d from "
                               "the top",
                               c->stages_op, c->r_op, c->factor, c->feed_stage_op);
            else
                pw_sbuf_printf(b, "not stepped at %.3g R<sub>min</sub>", c->factor);
            pw_sbuf_puts(b, " (equilibrium stages, partial reboiler counted)</td></tr>\n");
            if (isfinite(c->T_top_K) && isfinite(c->T_bottom_K)) {
                row_start(b, "Temperatures", "column");
                pw_sbuf_printf(b,
                               "top %.2f K (%.2f \xc2\xb0"
                               "C), bottom %.2f K (%.2f \xc2\xb0"
                               "C), bubble points of the products",
                               c->T_top_K, c->T_top_K - 273.15, c->T_bottom_K,
                               c->T_bottom_K - 273.15);
                pw_sbuf_puts(b, "</td></tr>\n");
            }
        }
        if (c->unc && c->unc_col_status == PW_OK) {
            const pw_unc_result *u = &c->unc_col.res;
            row_start(b, "How sure", "how-sure");
            const pw_unc_output *o = &u->out[PW_UNC_RMIN];
            if (isfinite(o->ci[0]) && isfinite(o->ci[1]))
                pw_sbuf_printf(b, "R<sub>min</sub> 95 %% interval %.4g to %.4g; ", o->ci[0],
                               o->ci[1]);
            if (isfinite(u->p_feasible))
                pw_sbuf_printf(b,
                               "the split can be made in %.0f %% of the parameter sets drawn from "
                               "the fit's uncertainty",
                               100.0 * u->p_feasible);
            pw_sbuf_puts(b, "</td></tr>\n");
        }
    }

    /* the main warnings, in words */
    size_t nw = 0;
    char w[6][240];
    if (!r->converged)
        snprintf(w[nw++], sizeof w[0], "the fit did not converge: do not design with it");
    if (r->split)
        snprintf(w[nw++], sizeof w[0],
                 "the fitted model predicts two liquid phases (near x1 = %.3f at %.1f K)",
                 r->split_x, r->split_T_K);
    if (c->cons_ran && !c->cons.consistent)
        snprintf(w[nw++], sizeof w[0], "the data are not shown consistent: see the tests below");
    if (c->column && c->col_status == PW_OK && c->col.feasible &&
        c->col.pinch.kind == PW_PINCH_TANGENT)
        snprintf(w[nw++], sizeof w[0],
                 "tangent pinch: stage counts near R_min are very sensitive to the model%s",
                 c->unc ? "" : " (run with --uncertainty for intervals)");
    for (int i = 0; i < 2 && c->column; i++) {
        const pw_component *comp = &r->sys.comp[i];
        double Ts[2] = {c->T_top_K, c->T_bottom_K};
        for (int k = 0; k < 2 && nw < 6; k++)
            if (isfinite(Ts[k]) && pw_component_range_excess_K(comp, Ts[k]) != 0.0) {
                snprintf(w[nw++], sizeof w[0],
                         "the column %s (%.1f K) lies outside the vapor-pressure range of %s",
                         k == 0 ? "top" : "bottom", Ts[k], comp->name);
                break;
            }
    }
    row_start(b, "Warnings", "cautions");
    if (nw == 0)
        pw_sbuf_puts(b, "none beyond the general cautions at the end");
    for (size_t i = 0; i < nw; i++) {
        pw_sbuf_puts(b, i ? "; " : "");
        esc(b, w[i]);
    }
    pw_sbuf_puts(b, "</td></tr>\n</table></section>\n");
    return pw_sbuf_status(b);
}
