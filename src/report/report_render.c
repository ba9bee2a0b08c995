/* The report's plots and CSV tables, rendered from the computed curves into memory files. */
#include "report/plots.h"
#include "report/report_internal.h"

#include <csv.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void pw_report_condition(const pw_fit_result *r, char *buf, size_t len)
{
    if (r->kind == PW_DATA_ISOTHERMAL)
        snprintf(buf, len, "%.2f K (%.2f \xc2\xb0" "C)", r->T_fixed_K, r->T_fixed_K - 273.15);
    else
        snprintf(buf, len, "%.4g kPa", r->P_fixed_Pa / 1000.0);
}

static pw_report_file *new_file(pw_report_file *files, size_t *n, const char *name, const char *title)
{
    if (*n >= PW_REPORT_MAX_FILES)
        return NULL;
    pw_report_file *f = &files[(*n)++];
    snprintf(f->name, sizeof f->name, "%s", name);
    snprintf(f->title, sizeof f->title, "%s", title);
    pw_sbuf_init(&f->text);
    return f;
}

/* Per-point arrays for the plots (PW_NAN where a quantity is missing). */
typedef struct pts_view {
    size_t n;
    double *x, *y, *v, *ry, *rv, *e1, *e2;        /* used points */
    double *xe, *rye, *rve;                        /* excluded points */
    size_t ne;
    double *block;
} pts_view;

static pw_status pts_make(pts_view *p, const pw_fit_result *r, bool isothermal)
{
    memset(p, 0, sizeof *p);
    size_t n = r->n_pts ? r->n_pts : 1;
    p->block = malloc(10 * n * sizeof *p->block);
    if (!p->block)
        return PW_ENOMEM;
    double *b = p->block;
    p->x = b; p->y = b + n; p->v = b + 2 * n; p->ry = b + 3 * n; p->rv = b + 4 * n;
    p->e1 = b + 5 * n; p->e2 = b + 6 * n; p->xe = b + 7 * n; p->rye = b + 8 * n; p->rve = b + 9 * n;
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_fit_point *q = &r->pts[i];
        double v = isothermal ? q->meas.P_Pa / 1000.0 : q->meas.T_K;
        double rv = isothermal ? (q->P_calc_Pa - q->meas.P_Pa) / 1000.0 : q->T_calc_K - q->meas.T_K;
        double ry = r->has_y ? q->y_calc - q->meas.y1 : PW_NAN;
        if (q->excluded) {
            p->xe[p->ne] = q->meas.x1;
            p->rye[p->ne] = ry;
            p->rve[p->ne++] = rv;
            continue;
        }
        p->x[p->n] = q->meas.x1;
        p->y[p->n] = r->has_y ? q->meas.y1 : PW_NAN;
        p->v[p->n] = v;
        p->ry[p->n] = ry;
        p->rv[p->n] = rv;
        p->e1[p->n] = q->lngamma_exp[0];
        p->e2[p->n++] = q->lngamma_exp[1];
    }
    /* excluded points are still measurements: show them on the phase diagram too */
    return PW_OK;
}

static pw_xyset set(const double *x, const double *y, size_t n)
{
    pw_xyset s = {x, y, n};
    return s;
}

/* The band of equilibrium curves drawn from the fit's covariance around the pinch, with the
 * operating lines at R_min and the pinch marked. */
static pw_status band_plot(struct pw_report *rep, const pw_report_curves *c)
{
    const char *n1 = c->fit->sys.comp[0].name;
    pw_xyset *curves = malloc(sizeof *curves * c->band_n);
    if (!curves)
        return PW_ENOMEM;
    for (size_t k = 0; k < c->band_n; k++)
        curves[k] = set(c->band_x, c->band_y + k * PW_REPORT_BAND_NX, PW_REPORT_BAND_NX);
    const pw_column_spec *sp = &c->spec;
    double R = c->col.r_min;
    double xi = ((R + 1.0) * sp->zf + (sp->q - 1.0) * sp->xd) / (R + sp->q);
    double yi = (R * xi + sp->xd) / (R + 1.0);
    double lx[3] = {sp->xd, xi, sp->xb}, ly[3] = {sp->xd, yi, sp->xb};
    double mx[1] = {c->col.pinch.x}, my[1] = {c->col.pinch.y};
    char title[PW_SVG_LABEL_MAX], xl[PW_SVG_LABEL_MAX], yl[PW_SVG_LABEL_MAX],
        ll[PW_SVG_LABEL_MAX], ml[PW_SVG_LABEL_MAX];
    snprintf(title, sizeof title, "Equilibrium curves near the pinch, column at %.4g kPa",
             c->P_col_Pa / 1000.0);
    snprintf(xl, sizeof xl, "x\xe2\x82\x81, liquid mole fraction of %s / (mol/mol)", n1);
    snprintf(yl, sizeof yl, "y\xe2\x82\x81, vapor mole fraction of %s / (mol/mol)", n1);
    snprintf(ll, sizeof ll, "operating lines at R_min = %.3g", R);
    snprintf(ml, sizeof ml, "%s pinch x = %.3f",
             c->col.pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed", c->col.pinch.x);
    /* the widest spread of the draws about the best fit, so a band thinner than a line is
     * still stated */
    double spread = 0.0;
    for (size_t j = 0; j < PW_REPORT_BAND_NX; j++)
        for (size_t k = 0; k < c->band_n; k++) {
            double d = fabs(c->band_y[k * PW_REPORT_BAND_NX + j] - c->band_best[j]);
            if (isfinite(d) && d > spread)
                spread = d;
        }
    char cl[PW_SVG_LABEL_MAX];
    snprintf(cl, sizeof cl, "%zu sampled curves (up to %.2g from the best fit in y)", c->band_n,
             spread);
    pw_plot_band_in bi;
    memset(&bi, 0, sizeof bi);
    bi.curves_label = cl;
    bi.id = "plot-pinch-band";
    bi.title = title;
    bi.xlabel = xl;
    bi.ylabel = yl;
    bi.curves = curves;
    bi.n_curves = c->band_n;
    bi.central = set(c->band_x, c->band_best, PW_REPORT_BAND_NX);
    bi.x_lo = c->band_lo;
    bi.x_hi = c->band_hi;
    bi.y_lo = bi.y_hi = PW_NAN;
    bi.marks = set(mx, my, 1);
    bi.mark_label = ml;
    bi.line = set(lx, ly, 3);
    bi.line_label = ll;
    pw_report_file *f = new_file(rep->svg, &rep->n_svg, "pinch_band.svg",
                                 "Equilibrium curves near the pinch under the fit's uncertainty");
    pw_status st = f ? pw_plot_band(&f->text, &bi) : PW_ENOMEM;
    free(curves);
    return st;
}

/* The enthalpy-composition diagram from the curves computed in report_curves.c (kJ/mol). */
static pw_status enthalpy_plot(struct pw_report *rep, const pw_report_curves *c, const char *n1)
{
    double hl[PW_REPORT_GRID], hv[PW_REPORT_GRID];
    for (size_t i = 0; i < PW_REPORT_GRID; i++) {
        hl[i] = c->en_hL[i] / 1e3;
        hv[i] = c->en_HV[i] / 1e3;
    }
    const pw_energy_result *e = &c->energy_res;
    double fx[1] = {c->spec.zf}, fy[1] = {e->h_F / 1e3};
    /* The limiting tie line: from the liquid where the limit is reached to its vapor; its
     * enthalpies are those of the curves at those compositions, interpolated on the grid. */
    double tx[2] = {e->pinch.x, e->pinch.y}, ty[2] = {PW_NAN, PW_NAN};
    for (size_t i = 0; i + 1 < PW_REPORT_GRID; i++) {
        for (int k = 0; k < 2; k++) {
            if (tx[k] >= c->x[i] && tx[k] <= c->x[i + 1]) {
                const double *h = k == 0 ? hl : hv, t = (tx[k] - c->x[i]) / (c->x[i + 1] - c->x[i]);
                ty[k] = h[i] + t * (h[i + 1] - h[i]);
            }
        }
    }
    char cond[80], tl[PW_SVG_LABEL_MAX];
    snprintf(cond, sizeof cond, "at %.4g kPa", c->P_col_Pa / 1e3);
    snprintf(tl, sizeof tl, "tie line that limits R_min = %.3g (%s pinch)", e->r_min,
             e->pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed");
    bool tie = !e->reflux_limited && !e->boilup_limited && isfinite(ty[0]) && isfinite(ty[1]);
    pw_plot_enthalpy_in in = {n1, cond, set(c->x, hl, PW_REPORT_GRID), set(c->x, hv, PW_REPORT_GRID),
                              set(fx, fy, 1), set(tx, ty, tie ? 2 : 0), tl};
    pw_report_file *f = new_file(rep->svg, &rep->n_svg, "enthalpy.svg",
                                 "Enthalpy and composition (energy balances)");
    return f ? pw_plot_enthalpy(&f->text, &in) : PW_ENOMEM;
}

pw_status pw_report_render_plots(struct pw_report *rep, const pw_report_curves *c)
{
    const pw_fit_result *r = c->fit;
    const char *n1 = r->sys.comp[0].name, *n2 = r->sys.comp[1].name;
    char cond[64], cond_at[80], lab[160];
    pw_report_condition(r, cond, sizeof cond);
    snprintf(cond_at, sizeof cond_at, "at %s", cond);
    pts_view p;
    pw_status st = pts_make(&p, r, c->isothermal);
    if (st != PW_OK)
        return st;
    double vapor_v[PW_REPORT_GRID], az_x[PW_REPORT_MAX_AZ], az_y[PW_REPORT_MAX_AZ],
        az_v[PW_REPORT_MAX_AZ];
    pw_report_file *f;

    /* 1. x-y diagram (at the column pressure when a column is asked for) */
    pw_plot_xy_in xy;
    memset(&xy, 0, sizeof xy);
    xy.name1 = n1;
    bool same_P = !c->column || (!c->isothermal && fabs(c->P_col_Pa - r->P_fixed_Pa) <= 0.005 * r->P_fixed_Pa);
    char colcond[64];
    if (c->column) {
        snprintf(colcond, sizeof colcond, "%.4g kPa", c->P_col_Pa / 1000.0);
        xy.condition = colcond;
        xy.curve = set(c->x, c->col_y, PW_REPORT_GRID);
        for (size_t i = 0; i < c->n_col_az; i++)
            az_x[i] = c->col_az[i].x1;
        xy.azeotropes = set(az_x, az_x, c->n_col_az);
        xy.column = true;
        xy.spec = c->spec;
        xy.feasible = c->col_status == PW_OK && c->col.feasible;
        xy.r_min = c->col.r_min;
        xy.r_op = c->r_op;
        xy.factor = c->factor;
        xy.pinch = c->col.pinch;
        xy.x_q = c->col.x_q;
        xy.y_q = c->col.y_q;
        xy.steps = set(c->step_x, c->step_y, c->n_step);
        xy.stages = c->stages_op;
    } else {
        xy.condition = cond;
        xy.curve = set(c->x, c->bub_y, PW_REPORT_GRID);
        for (size_t i = 0; i < c->n_az; i++)
            az_x[i] = c->az[i].x1;
        xy.azeotropes = set(az_x, az_x, c->n_az);
    }
    if (r->has_y) {
        xy.measured = set(p.x, p.y, p.n);
        if (same_P)
            snprintf(lab, sizeof lab, "measured (%zu points)", p.n);
        else
            snprintf(lab, sizeof lab, "measured at %s (data)", cond);
        xy.measured_label = lab;
    }
    f = new_file(rep->svg, &rep->n_svg, "xy.svg", "Vapor-liquid composition diagram");
    st = f ? pw_plot_xy(&f->text, &xy) : PW_ENOMEM;

    /* 2. T-x-y or P-x-y */
    if (st == PW_OK) {
        pw_plot_phase_in ph;
        memset(&ph, 0, sizeof ph);
        ph.name1 = n1;
        ph.condition = cond_at;
        ph.isothermal = c->isothermal;
        double bub_v[PW_REPORT_GRID];
        for (size_t i = 0; i < PW_REPORT_GRID; i++) {
            bub_v[i] = c->isothermal ? c->bub_P[i] / 1000.0 : c->bub_T[i];
            vapor_v[i] = c->isothermal ? c->dew_P[i] / 1000.0 : c->dew_T[i];
        }
        ph.bubble = set(c->x, bub_v, PW_REPORT_GRID);
        ph.dew = set(c->dew_y, vapor_v, PW_REPORT_GRID);
        ph.meas_liquid = set(p.x, p.v, p.n);
        if (r->has_y)
            ph.meas_vapor = set(p.y, p.v, p.n);
        for (size_t i = 0; i < c->n_az; i++) {
            az_y[i] = c->az[i].x1;
            az_v[i] = c->isothermal ? c->az[i].P_Pa / 1000.0 : c->az[i].T_K;
        }
        ph.azeotropes = set(az_y, az_v, c->n_az);
        f = new_file(rep->svg, &rep->n_svg, c->isothermal ? "pxy.svg" : "txy.svg",
                     c->isothermal ? "Pressure-composition diagram" : "Temperature-composition diagram");
        st = f ? pw_plot_phase(&f->text, &ph) : PW_ENOMEM;
    }

    /* 3. residuals of y */
    if (st == PW_OK && r->has_y) {
        pw_plot_resid_in rs = {"plot-residual-y", "Deviations of the vapor composition",
                               "y\xe2\x82\x81(calc) \xe2\x88\x92 y\xe2\x82\x81(meas) / (mol/mol)", n1,
                               set(p.x, p.ry, p.n), set(p.xe, p.rye, p.ne), r->sigma_y};
        f = new_file(rep->svg, &rep->n_svg, "residual_y.svg", "Vapor composition deviations");
        st = f ? pw_plot_residuals(&f->text, &rs) : PW_ENOMEM;
    }
    /* 4. residuals of T or P */
    if (st == PW_OK) {
        double band = r->sigma_T_K;
        if (c->isothermal) {
            double mean = 0.0;
            for (size_t i = 0; i < p.n; i++)
                mean += p.v[i] / (double)p.n;
            band = r->sigma_P_rel * mean;
        }
        pw_plot_resid_in rs = {c->isothermal ? "plot-residual-p" : "plot-residual-t",
                               c->isothermal ? "Deviations of the bubble pressure" :
                                               "Deviations of the bubble temperature",
                               c->isothermal ? "P(calc) \xe2\x88\x92 P(meas) / kPa" :
                                               "T(calc) \xe2\x88\x92 T(meas) / K",
                               n1, set(p.x, p.rv, p.n), set(p.xe, p.rve, p.ne), band};
        f = new_file(rep->svg, &rep->n_svg, c->isothermal ? "residual_P.svg" : "residual_T.svg",
                     c->isothermal ? "Bubble pressure deviations" : "Bubble temperature deviations");
        st = f ? pw_plot_residuals(&f->text, &rs) : PW_ENOMEM;
    }
    /* 5. ln gamma */
    if (st == PW_OK) {
        pw_plot_lngamma_in lg = {n1, n2, cond_at, set(c->x, c->lg1, PW_REPORT_GRID),
                                 set(c->x, c->lg2, PW_REPORT_GRID), set(p.x, p.e1, p.n),
                                 set(p.x, p.e2, p.n)};
        f = new_file(rep->svg, &rep->n_svg, "lngamma.svg", "Activity coefficients");
        st = f ? pw_plot_lngamma(&f->text, &lg) : PW_ENOMEM;
    }
    /* 5b. with --energy: the enthalpy-composition diagram */
    if (st == PW_OK && c->energy && c->energy_status == PW_OK && c->energy_res.feasible)
        st = enthalpy_plot(rep, c, n1);
    /* 6. with --uncertainty and a feasible column: sampled curves near the limiting pinch */
    if (st == PW_OK && c->band_status == PW_OK)
        st = band_plot(rep, c);
    free(p.block);
    return st;
}

/* ---- CSV ---- */

/* One header field; quoted by libcsv's writer when it holds a comma, quote or line break. */
static void csv_field(pw_sbuf *b, const char *s, bool first)
{
    char out[256];
    if (!first)
        pw_sbuf_puts(b, ",");
    if (!strpbrk(s, ",\"\r\n")) {
        pw_sbuf_puts(b, s);
        return;
    }
    size_t need = csv_write(out, sizeof out, s, strlen(s));
    if (need <= sizeof out)
        pw_sbuf_putn(b, out, need);
    else
        b->failed = true;
}

static void csv_header(pw_sbuf *b, const char *const *names, size_t n)
{
    for (size_t i = 0; i < n; i++)
        csv_field(b, names[i], i == 0);
    pw_sbuf_puts(b, "\n");
}

/* Numbers with 17 significant digits; an empty field for a missing value. */
static void csv_row(pw_sbuf *b, const double *v, size_t n)
{
    for (size_t i = 0; i < n; i++) {
        if (i)
            pw_sbuf_puts(b, ",");
        if (isfinite(v[i]))
            pw_sbuf_printf(b, "%.17g", v[i]);
    }
    pw_sbuf_puts(b, "\n");
}

pw_status pw_report_render_csv(struct pw_report *rep, const pw_report_curves *c)
{
    const pw_fit_result *r = c->fit;
    pw_report_file *f = new_file(rep->csv, &rep->n_csv, "model_curves.csv",
                                 "Model curves at the data's condition");
    if (!f)
        return PW_ENOMEM;
    static const char *const hm[] = {"x1", "y1_bubble", "T_bubble_K", "P_bubble_kPa", "ln_gamma1",
                                     "ln_gamma2", "y1_dew", "T_dew_K", "P_dew_kPa"};
    csv_header(&f->text, hm, 9);
    for (size_t i = 0; i < PW_REPORT_GRID; i++) {
        double v[9] = {c->x[i], c->bub_y[i], c->bub_T[i], c->bub_P[i] / 1000.0, c->lg1[i],
                       c->lg2[i], c->dew_y[i], c->dew_T[i], c->dew_P[i] / 1000.0};
        csv_row(&f->text, v, 9);
    }
    f = new_file(rep->csv, &rep->n_csv, "points.csv", "Measured points with the model's values");
    if (!f)
        return PW_ENOMEM;
    static const char *const hp[] = {"line", "x1", "y1", "T_K", "P_kPa", "y1_calc", "T_calc_K",
                                     "P_calc_kPa", "ln_gamma1_exp", "ln_gamma2_exp", "excluded"};
    csv_header(&f->text, hp, 11);
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_fit_point *q = &r->pts[i];
        double v[11] = {(double)q->meas.line, q->meas.x1, q->meas.y1, q->meas.T_K,
                        q->meas.P_Pa / 1000.0, q->y_calc, q->T_calc_K, q->P_calc_Pa / 1000.0,
                        q->lngamma_exp[0], q->lngamma_exp[1], q->excluded ? 1.0 : 0.0};
        csv_row(&f->text, v, 11);
    }
    if (c->column) {
        f = new_file(rep->csv, &rep->n_csv, "column_curve.csv",
                     "Equilibrium curve at the column pressure");
        if (!f)
            return PW_ENOMEM;
        static const char *const hc[] = {"x1", "y1"};
        csv_header(&f->text, hc, 2);
        for (size_t i = 0; i < PW_REPORT_GRID; i++) {
            double v[2] = {c->x[i], c->col_y[i]};
            csv_row(&f->text, v, 2);
        }
        f = new_file(rep->csv, &rep->n_csv, "column_lines.csv",
                     "Operating lines, q-line and stage steps");
        if (!f)
            return PW_ENOMEM;
        static const char *const hl[] = {"item", "R", "x", "y"};
        csv_header(&f->text, hl, 4);
        if (c->col_status == PW_OK && c->col.feasible) {
            const pw_column_spec *sp = &c->spec;
            double Rs[2] = {c->col.r_min, c->r_op};
            const char *names[2] = {"operating_lines_at_r_min", "operating_lines_at_r"};
            for (int k = 0; k < 2; k++) {
                double R = Rs[k];
                double xi = ((R + 1.0) * sp->zf + (sp->q - 1.0) * sp->xd) / (R + sp->q);
                double yi = (R * xi + sp->xd) / (R + 1.0);
                double px[3] = {sp->xd, xi, sp->xb}, py[3] = {sp->xd, yi, sp->xb};
                for (int j = 0; j < 3; j++) {
                    double v[3] = {R, px[j], py[j]};
                    pw_sbuf_printf(&f->text, "%s,", names[k]);
                    csv_row(&f->text, v, 3);
                }
            }
            double q0[3] = {PW_NAN, sp->zf, sp->zf}, q1[3] = {PW_NAN, c->col.x_q, c->col.y_q};
            pw_sbuf_puts(&f->text, "q_line,");
            csv_row(&f->text, q0, 3);
            pw_sbuf_puts(&f->text, "q_line,");
            csv_row(&f->text, q1, 3);
            double pin[3] = {c->col.r_min, c->col.pinch.x, c->col.pinch.y};
            pw_sbuf_puts(&f->text, c->col.pinch.kind == PW_PINCH_TANGENT ? "pinch_tangent," : "pinch_feed,");
            csv_row(&f->text, pin, 3);
            for (size_t i = 0; i < c->n_step; i++) {
                double v[3] = {c->r_op, c->step_x[i], c->step_y[i]};
                pw_sbuf_puts(&f->text, "stage_steps,");
                csv_row(&f->text, v, 3);
            }
        }
    }
    if (c->band_status == PW_OK) {
        f = new_file(rep->csv, &rep->n_csv, "pinch_band.csv",
                     "Equilibrium curves near the pinch: best fit and sampled parameter sets");
        if (!f)
            return PW_ENOMEM;
        csv_field(&f->text, "x1", true);
        csv_field(&f->text, "y1_best_fit", false);
        for (size_t k = 0; k < c->band_n; k++)
            pw_sbuf_printf(&f->text, ",y1_draw_%zu", k + 1);
        pw_sbuf_puts(&f->text, "\n");
        double *row = malloc(sizeof *row * (c->band_n + 2));
        if (!row)
            return PW_ENOMEM;
        for (size_t j = 0; j < PW_REPORT_BAND_NX; j++) {
            row[0] = c->band_x[j];
            row[1] = c->band_best[j];
            for (size_t k = 0; k < c->band_n; k++)
                row[k + 2] = c->band_y[k * PW_REPORT_BAND_NX + j];
            csv_row(&f->text, row, c->band_n + 2);
        }
        free(row);
    }
    for (size_t i = 0; i < rep->n_csv; i++)
        if (pw_sbuf_status(&rep->csv[i].text) != PW_OK)
            return PW_ENOMEM;
    return PW_OK;
}
