/* The report's plots and CSV tables, rendered from the computed curves into memory files. */
#include "report/plots.h"
#include "report/report_internal.h"

#include <csv.h>
#include <pinchwise/jsontext.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

void pw_report_T(const pw_display_units *u, double T_K, int decimals, char *buf, size_t len)
{
    snprintf(buf, len, "%.*f %s", decimals, pw_units_display_T(u, T_K), pw_units_display_T_symbol(u));
}

void pw_report_P(const pw_display_units *u, double P_Pa, int digits, char *buf, size_t len)
{
    snprintf(buf, len, "%.*g %s", digits, pw_units_display_P(u, P_Pa), pw_units_display_P_symbol(u));
}

void pw_report_condition(const pw_fit_result *r, const pw_display_units *u, char *buf, size_t len)
{
    if (r->kind == PW_DATA_ISOTHERMAL)
        pw_report_T(u, r->T_fixed_K, 2, buf, len);
    else
        pw_report_P(u, r->P_fixed_Pa, 4, buf, len);
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

static pw_status pts_make(pts_view *p, const pw_fit_result *r, bool isothermal,
                          const pw_display_units *u)
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
        double v = isothermal ? pw_units_display_P(u, q->meas.P_Pa) : pw_units_display_T(u, q->meas.T_K);
        double rv = isothermal ? pw_units_display_P(u, q->P_calc_Pa - q->meas.P_Pa)
                               : pw_units_display_dT(u, q->T_calc_K - q->meas.T_K);
        /* a pure component has y = x = 0 or 1 by definition: its zero y deviation says nothing */
        bool pure = q->meas.x1 <= 0.0 || q->meas.x1 >= 1.0;
        double ry = r->has_y && !pure ? q->y_calc - q->meas.y1 : PW_NAN;
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

/* The symbol of the quantity the phase diagram draws (T or P) in the display units. */
static const char *pin_unit(const pw_report_curves *c)
{
    return c->isothermal ? pw_units_display_P_symbol(&c->units) : pw_units_display_T_symbol(&c->units);
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
    double R = c->dc.col.r_min;
    double mx[1] = {c->dc.col.pinch.x}, my[1] = {c->dc.col.pinch.y};
    char title[PW_SVG_LABEL_MAX], xl[PW_SVG_LABEL_MAX], yl[PW_SVG_LABEL_MAX],
        ll[PW_SVG_LABEL_MAX], ml[PW_SVG_LABEL_MAX], pc[48];
    pw_report_P(&c->units, c->P_col_Pa, 4, pc, sizeof pc);
    snprintf(title, sizeof title, "Equilibrium curves near the pinch, column at %s", pc);
    snprintf(xl, sizeof xl, "x\xe2\x82\x81, liquid mole fraction of %s / (mol/mol)", n1);
    snprintf(yl, sizeof yl, "y\xe2\x82\x81, vapor mole fraction of %s / (mol/mol)", n1);
    snprintf(ll, sizeof ll, "operating lines at R_min = %.3g", R);
    snprintf(ml, sizeof ml, "%s pinch x = %.3f",
             c->dc.col.pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed", c->dc.col.pinch.x);
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
    bi.line = set(c->dc.op_min_x, c->dc.op_min_y, 3);
    bi.line_label = ll;
    pw_report_file *f = new_file(rep->svg, &rep->n_svg, "pinch_band.svg",
                                 "Equilibrium curves near the pinch under the fit's uncertainty");
    pw_status st = f ? pw_plot_band(&f->text, &bi) : PW_ENOMEM;
    free(curves);
    return st;
}

/* The enthalpy-composition diagram from the library's curves (pw_draw_enthalpy), kJ/mol. */
static pw_status enthalpy_plot(struct pw_report *rep, const pw_report_curves *c, const char *n1)
{
    double hl[PW_REPORT_GRID], hv[PW_REPORT_GRID];
    for (size_t i = 0; i < PW_REPORT_GRID; i++) {
        hl[i] = c->en.h_liquid[i] / 1e3;
        hv[i] = c->en.h_vapor[i] / 1e3;
    }
    const pw_energy_result *e = &c->energy_res;
    double fx[1] = {c->spec.zf}, fy[1] = {e->h_F / 1e3};
    /* The limiting tie line: from the liquid where the limit is reached to its vapor, drawn
     * between the two curves' grid points nearest those compositions. */
    double tx[2] = {e->pinch.x, e->pinch.y}, ty[2] = {PW_NAN, PW_NAN};
    for (int k = 0; k < 2; k++) {
        size_t best = 0;
        for (size_t i = 1; i < PW_REPORT_GRID; i++)
            if (fabs(c->en.x[i] - tx[k]) < fabs(c->en.x[best] - tx[k]))
                best = i;
        tx[k] = c->en.x[best];
        ty[k] = (k == 0 ? hl : hv)[best];
    }
    char cond[80], tl[PW_SVG_LABEL_MAX], pc[48];
    pw_report_P(&c->units, c->P_col_Pa, 4, pc, sizeof pc);
    snprintf(cond, sizeof cond, "at %s", pc);
    snprintf(tl, sizeof tl, "tie line that limits R_min = %.3g (%s pinch)", e->r_min,
             e->pinch.kind == PW_PINCH_TANGENT ? "tangent" : "feed");
    bool tie = !e->reflux_limited && !e->boilup_limited && isfinite(ty[0]) && isfinite(ty[1]);
    pw_plot_enthalpy_in in = {n1, cond, set(c->en.x, hl, PW_REPORT_GRID),
                              set(c->en.x, hv, PW_REPORT_GRID), set(fx, fy, 1),
                              set(tx, ty, tie ? 2 : 0), tl};
    pw_report_file *f = new_file(rep->svg, &rep->n_svg, "enthalpy.svg",
                                 "Enthalpy and composition (energy balances)");
    return f ? pw_plot_enthalpy(&f->text, &in) : PW_ENOMEM;
}

/* The column construction of c on an x-y plot (the full square or the window near the pinch). */
static void xy_column(pw_plot_xy_in *xy, const pw_report_curves *c)
{
    const pw_draw_column *d = &c->dc;
    xy->column = true;
    xy->spec = c->spec;
    xy->feasible = d->drawn;
    xy->r_min = d->col.r_min;
    xy->r_op = d->r_op;
    xy->factor = c->factor;
    xy->pinch = d->col.pinch;
    xy->qline = set(d->qline_x, d->qline_y, 2);
    xy->op_min = set(d->op_min_x, d->op_min_y, 3);
    xy->op = set(d->op_x, d->op_y, 3);
    xy->steps = set(d->stairs.x, d->stairs.y, d->stairs.n);
    xy->stages = d->stairs.stages;
    const pw_draw_decanter *k = &d->decanter;
    if (d->hetero_blocked && k->status == PW_OK && k->res.feasible) {
        xy->decanter = true;
        xy->layers[0] = k->res.decanter.x[0];
        xy->layers[1] = k->res.decanter.x[1];
        xy->y3 = k->res.decanter.y1;
        for (int i = 0; i < 2; i++) {
            xy->dec_op[i] = set(k->op_x[i], k->op_y[i], 2);
            xy->dec_steps[i] = set(k->stairs[i].x, k->stairs[i].y, k->stairs[i].n);
            xy->dec_boilup[i] = k->boilup[i];
            xy->dec_stages[i] = k->stairs[i].stages;
        }
    }
}

pw_status pw_report_render_plots(struct pw_report *rep, const pw_report_curves *c)
{
    const pw_fit_result *r = c->fit;
    const pw_display_units *u = &c->units;
    const pw_draw_phase *ph = &c->phase;
    const char *n1 = r->sys.comp[0].name, *n2 = r->sys.comp[1].name;
    char cond[64], cond_at[80], lab[160];
    pw_report_condition(r, u, cond, sizeof cond);
    snprintf(cond_at, sizeof cond_at, "at %s", cond);
    pts_view p;
    pw_status st = pts_make(&p, r, c->isothermal, u);
    if (st != PW_OK)
        return st;
    double az_x[PW_REPORT_MAX_AZ], az_y[PW_REPORT_MAX_AZ], az_v[PW_REPORT_MAX_AZ];
    pw_report_file *f;

    /* 1. x-y diagram (at the column pressure when a column is asked for) */
    pw_plot_xy_in xy;
    memset(&xy, 0, sizeof xy);
    xy.name1 = n1;
    bool same_P = !c->column || (!c->isothermal && fabs(c->P_col_Pa - r->P_fixed_Pa) <= 0.005 * r->P_fixed_Pa);
    char colcond[64];
    if (c->column) {
        pw_report_P(u, c->P_col_Pa, 4, colcond, sizeof colcond);
        xy.condition = colcond;
        xy.curve = set(c->xy.x, c->xy.stable_y, PW_REPORT_GRID);
        if (c->xy.az.three_phase.exists)
            xy.three_phase = set(c->xy.x, c->xy.three_y, PW_REPORT_GRID);
        for (size_t i = 0; i < c->xy.az.n; i++)
            az_x[i] = c->xy.az.az[i].x1;
        xy.azeotropes = set(az_x, az_x, c->xy.az.n);
        xy_column(&xy, c);
    } else {
        xy.condition = cond;
        xy.curve = set(ph->x, ph->bub_y, PW_REPORT_GRID);
        for (size_t i = 0; i < ph->az.n; i++)
            az_x[i] = ph->az.az[i].x1;
        xy.azeotropes = set(az_x, az_x, ph->az.n);
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

    /* 1b. the staircase near the pinch, enlarged */
    if (st == PW_OK && c->column && c->dc.drawn) {
        pw_plot_xy_in z = xy;
        z.id = "plot-xy-pinch";
        z.zoom = true;
        memcpy(z.win_x, c->dc.zoom_x, sizeof z.win_x);
        memcpy(z.win_y, c->dc.zoom_y, sizeof z.win_y);
        f = new_file(rep->svg, &rep->n_svg, "xy_pinch.svg", "The staircase near the pinch, enlarged");
        st = f ? pw_plot_xy(&f->text, &z) : PW_ENOMEM;
    }

    /* 1c. each decanter column's staircase, enlarged (the library's windows) */
    for (int k = 0; st == PW_OK && xy.decanter && k < 2; k++) {
        const pw_draw_decanter *dk = &c->dc.decanter;
        if (!(isfinite(dk->zoom_x[k][0]) && dk->zoom_x[k][1] > dk->zoom_x[k][0] &&
              dk->zoom_y[k][1] > dk->zoom_y[k][0]))
            continue;
        pw_plot_xy_in z = xy;
        z.id = k == 0 ? "plot-xy-decanter-a" : "plot-xy-decanter-b";
        z.zoom = true;
        z.dec_only = k + 1;
        z.title = k == 0 ? "Column A (rich layer), enlarged" : "Column B (lean layer), enlarged";
        memcpy(z.win_x, dk->zoom_x[k], sizeof z.win_x);
        memcpy(z.win_y, dk->zoom_y[k], sizeof z.win_y);
        f = new_file(rep->svg, &rep->n_svg, k == 0 ? "xy_decanter_a.svg" : "xy_decanter_b.svg",
                     k == 0 ? "Decanter column A's staircase, enlarged"
                            : "Decanter column B's staircase, enlarged");
        st = f ? pw_plot_xy(&f->text, &z) : PW_ENOMEM;
    }

    /* 2. T-x-y or P-x-y, in the display units */
    double bub_v[PW_REPORT_GRID], dew_v[PW_REPORT_GRID];
    double bin_v[PW_DRAW_BINODAL], lay_x[2], lay_v[2];
    if (st == PW_OK) {
        pw_plot_phase_in pin;
        memset(&pin, 0, sizeof pin);
        pin.name1 = n1;
        pin.condition = cond_at;
        pin.isothermal = c->isothermal;
        pin.unit = c->isothermal ? pw_units_display_P_symbol(u) : pw_units_display_T_symbol(u);
        for (size_t i = 0; i < PW_REPORT_GRID; i++) {
            bub_v[i] = c->isothermal ? pw_units_display_P(u, ph->bub_P[i]) : pw_units_display_T(u, ph->bub_T[i]);
            dew_v[i] = c->isothermal ? pw_units_display_P(u, ph->dew_P[i]) : pw_units_display_T(u, ph->dew_T[i]);
        }
        pin.bubble = set(ph->x, bub_v, PW_REPORT_GRID);
        pin.dew = set(ph->x, dew_v, PW_REPORT_GRID);
        pin.meas_liquid = set(p.x, p.v, p.n);
        if (r->has_y)
            pin.meas_vapor = set(p.y, p.v, p.n);
        for (size_t i = 0; i < ph->az.n; i++) {
            az_y[i] = ph->az.az[i].x1;
            az_v[i] = c->isothermal ? pw_units_display_P(u, ph->az.az[i].P_Pa)
                                    : pw_units_display_T(u, ph->az.az[i].T_K);
        }
        pin.azeotropes = set(az_y, az_v, ph->az.n);
        const pw_three_phase *tp = &ph->az.three_phase;
        if (tp->exists) {
            lay_x[0] = tp->x[0];
            lay_x[1] = tp->x[1];
            lay_v[0] = lay_v[1] = c->isothermal ? pw_units_display_P(u, tp->P_Pa)
                                                : pw_units_display_T(u, tp->T_K);
            pin.layers = set(lay_x, lay_v, 2);
        }
        if (ph->n_binodal) {
            for (size_t i = 0; i < ph->n_binodal; i++)
                bin_v[i] = pw_units_display_T(u, ph->bin_T[i]);
            pin.binodal[0] = set(ph->bin_x[0], bin_v, ph->n_binodal);
            pin.binodal[1] = set(ph->bin_x[1], bin_v, ph->n_binodal);
        }
        f = new_file(rep->svg, &rep->n_svg, c->isothermal ? "pxy.svg" : "txy.svg",
                     c->isothermal ? "Pressure-composition diagram" : "Temperature-composition diagram");
        st = f ? pw_plot_phase(&f->text, &pin) : PW_ENOMEM;
    }

    /* 2b. every fitted model on one plot */
    if (st == PW_OK && c->n_models > 1) {
        pw_plot_models_in mi;
        memset(&mi, 0, sizeof mi);
        mi.name1 = n1;
        mi.condition = cond_at;
        mi.isothermal = c->isothermal;
        mi.unit = pin_unit(c);
        double *vals = malloc(sizeof *vals * 2 * PW_REPORT_GRID * PW_PLOT_MAX_MODELS);
        if (!vals)
            st = PW_ENOMEM;
        for (size_t k = 0; st == PW_OK && k < c->n_models && k < PW_PLOT_MAX_MODELS; k++) {
            const pw_draw_phase *m = &c->model_phase[k];
            double *bv = vals + 2 * k * PW_REPORT_GRID, *dv = bv + PW_REPORT_GRID;
            for (size_t i = 0; i < PW_REPORT_GRID; i++) {
                bv[i] = c->isothermal ? pw_units_display_P(u, m->bub_P[i]) : pw_units_display_T(u, m->bub_T[i]);
                dv[i] = c->isothermal ? pw_units_display_P(u, m->dew_P[i]) : pw_units_display_T(u, m->dew_T[i]);
            }
            mi.bubble[k] = set(m->x, bv, PW_REPORT_GRID);
            mi.dew[k] = set(m->x, dv, PW_REPORT_GRID);
            mi.label[k] = c->model_fit[k]->sys.model->name;
            mi.n = k + 1;
        }
        mi.meas_liquid = set(p.x, p.v, p.n);
        if (r->has_y)
            mi.meas_vapor = set(p.y, p.v, p.n);
        if (st == PW_OK) {
            f = new_file(rep->svg, &rep->n_svg, "models.svg", "Every fitted model on one plot");
            st = f ? pw_plot_models(&f->text, &mi) : PW_ENOMEM;
        }
        free(vals);
    }

    /* 3. residuals of y (pure-component rows left out: y = x there by definition) */
    if (st == PW_OK && r->has_y) {
        pw_plot_resid_in rs = {"plot-residual-y", "Deviations of the vapor composition",
                               "y\xe2\x82\x81(calc) \xe2\x88\x92 y\xe2\x82\x81(meas) / (mol/mol)", n1,
                               set(p.x, p.ry, p.n), set(p.xe, p.rye, p.ne), r->sigma_y};
        f = new_file(rep->svg, &rep->n_svg, "residual_y.svg", "Vapor composition deviations");
        st = f ? pw_plot_residuals(&f->text, &rs) : PW_ENOMEM;
    }
    /* 4. residuals of T or P */
    if (st == PW_OK) {
        double band = pw_units_display_dT(u, r->sigma_T_K);
        if (c->isothermal) {
            double mean = 0.0;
            for (size_t i = 0; i < p.n; i++)
                mean += p.v[i] / (double)p.n;
            band = r->sigma_P_rel * mean;
        }
        char yl[PW_SVG_LABEL_MAX];
        snprintf(yl, sizeof yl, "%s(calc) \xe2\x88\x92 %s(meas) / %s", c->isothermal ? "P" : "T",
                 c->isothermal ? "P" : "T", pin_unit(c));
        pw_plot_resid_in rs = {c->isothermal ? "plot-residual-p" : "plot-residual-t",
                               c->isothermal ? "Deviations of the bubble pressure" :
                                               "Deviations of the bubble temperature",
                               yl, n1, set(p.x, p.rv, p.n), set(p.xe, p.rve, p.ne), band};
        f = new_file(rep->svg, &rep->n_svg, c->isothermal ? "residual_P.svg" : "residual_T.svg",
                     c->isothermal ? "Bubble pressure deviations" : "Bubble temperature deviations");
        st = f ? pw_plot_residuals(&f->text, &rs) : PW_ENOMEM;
    }
    /* 5. ln gamma */
    if (st == PW_OK) {
        pw_plot_lngamma_in lg = {n1, n2, cond_at, set(ph->x, ph->lngamma[0], PW_REPORT_GRID),
                                 set(ph->x, ph->lngamma[1], PW_REPORT_GRID), set(p.x, p.e1, p.n),
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
        if (isfinite(v[i])) {
            char num[40];
            pw_sbuf_puts(b, pw_format_g17(v[i], num, sizeof num));
        }
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
        const pw_draw_phase *ph = &c->phase;
        double v[9] = {ph->x[i], ph->bub_y[i], ph->bub_T[i], ph->bub_P[i] / 1000.0,
                       ph->lngamma[0][i], ph->lngamma[1][i], ph->x[i], ph->dew_T[i],
                       ph->dew_P[i] / 1000.0};
        csv_row(&f->text, v, 9);
    }
    f = new_file(rep->csv, &rep->n_csv, "points.csv", "Measured points with the model's values");
    if (!f)
        return PW_ENOMEM;
    /* three_phase, inside_layers: the points whose model values are the three-phase state */
    static const char *const hp[] = {"line",          "x1",          "y1",           "T_K",
                                     "P_kPa",         "y1_calc",     "T_calc_K",     "P_calc_kPa",
                                     "ln_gamma1_exp", "ln_gamma2_exp", "excluded",   "three_phase",
                                     "inside_layers"};
    csv_header(&f->text, hp, 13);
    for (size_t i = 0; i < r->n_pts; i++) {
        const pw_fit_point *q = &r->pts[i];
        double v[13] = {(double)q->meas.line, q->meas.x1, q->meas.y1, q->meas.T_K,
                        q->meas.P_Pa / 1000.0, q->y_calc, q->T_calc_K, q->P_calc_Pa / 1000.0,
                        q->lngamma_exp[0], q->lngamma_exp[1], q->excluded ? 1.0 : 0.0,
                        q->three_phase ? 1.0 : 0.0, q->in_layers ? 1.0 : 0.0};
        csv_row(&f->text, v, 13);
    }
    if (c->column) {
        f = new_file(rep->csv, &rep->n_csv, "column_curve.csv",
                     "Equilibrium curve at the column pressure");
        if (!f)
            return PW_ENOMEM;
        static const char *const hc[] = {"x1", "y1"};
        csv_header(&f->text, hc, 2);
        for (size_t i = 0; i < PW_REPORT_GRID; i++) {
            double v[2] = {c->xy.x[i], c->xy.y[i]};
            csv_row(&f->text, v, 2);
        }
        f = new_file(rep->csv, &rep->n_csv, "column_lines.csv",
                     "Operating lines, q-line and stage steps");
        if (!f)
            return PW_ENOMEM;
        static const char *const hl[] = {"item", "R", "x", "y"};
        csv_header(&f->text, hl, 4);
        const pw_draw_column *d = &c->dc;
        if (d->drawn) {
            const double Rs[2] = {d->col.r_min, d->r_op};
            const double *lx[2] = {d->op_min_x, d->op_x}, *ly[2] = {d->op_min_y, d->op_y};
            const char *names[2] = {"operating_lines_at_r_min", "operating_lines_at_r"};
            for (int k = 0; k < 2; k++)
                for (int j = 0; j < 3; j++) {
                    double v[3] = {Rs[k], lx[k][j], ly[k][j]};
                    pw_sbuf_printf(&f->text, "%s,", names[k]);
                    csv_row(&f->text, v, 3);
                }
            for (int j = 0; j < 2; j++) {
                double q[3] = {PW_NAN, d->qline_x[j], d->qline_y[j]};
                pw_sbuf_puts(&f->text, "q_line,");
                csv_row(&f->text, q, 3);
            }
            double pin[3] = {d->col.r_min, d->col.pinch.x, d->col.pinch.y};
            pw_sbuf_puts(&f->text, d->col.pinch.kind == PW_PINCH_TANGENT ? "pinch_tangent," : "pinch_feed,");
            csv_row(&f->text, pin, 3);
            for (size_t i = 0; i < d->stairs.n; i++) {
                double v[3] = {d->r_op, d->stairs.x[i], d->stairs.y[i]};
                pw_sbuf_puts(&f->text, "stage_steps,");
                csv_row(&f->text, v, 3);
            }
        }
        const pw_draw_decanter *k = &d->decanter;
        if (d->hetero_blocked && k->status == PW_OK && k->res.feasible) {
            const char *nm[2] = {"decanter_column_a_steps,", "decanter_column_b_steps,"};
            for (int j = 0; j < 2; j++)
                for (size_t i = 0; i < k->stairs[j].n; i++) {
                    double v[3] = {PW_NAN, k->stairs[j].x[i], k->stairs[j].y[i]};
                    pw_sbuf_puts(&f->text, nm[j]);
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
