/* Measured one-liquid points inside the fitted model's own two-liquid region (fit diagnostic
 * "liquid-inside-layers", include/pinchwise/fit_diagnostics.h, docs/heterogeneous.md section 4).
 *  - The shipped 1-butanol/water set at 1 atm (Stockhardt & Hull 1931) fitted by NRTL: data
 *    lines 22 and 23 (x1 = 0.494 and 0.504, boiling at 366.55 and 366.65 K, not three-phase
 *    points) lie between the model's layers at its three-phase temperature; the record names
 *    exactly those lines, its layers and temperature agree with an independent liquid-liquid
 *    solve (pw_lle_solve) at that temperature whose pressure is the data's, and no flagged point
 *    is a three-phase point. The record survives a write and a read of the fit file.
 *  - The objective those points enter: with three-phase points in the data, a one-liquid point
 *    inside the model's layers is scored by the three-phase state, the model's stable
 *    prediction. The fit's chi2 is recomputed here point by point from pw_bubble_T_het (which
 *    decides by itself whether the liquid splits) and the three-phase state, and must equal the
 *    fit's; the metastable one-liquid scoring must not (so the check can tell them apart). A fit
 *    file without "inside_layers_scored" (written before) is read as it was fitted.
 *  - Measurement planning (fit_design.c) values and weights a planned point inside the layers
 *    as the objective does: two such points carry the same information.
 *  - Tie lines alone (the set's three-phase lines excluded, the 25 C tie line fitted) also make
 *    the fit score points inside the layers by the three-phase state (chi2 recomputed).
 *  - Counter-cases: Wilson's equation cannot split (Wilson 1964), so the same data give no
 *    record; methanol/water at 1 atm (miscible) fitted by NRTL gives none.
 *  - Seeded random cases: random points (random x1, three-phase and excluded flags, two
 *    pressures or two temperatures) on the fitted NRTL system, the flagged set compared with a
 *    direct computation here (layers by pw_lle_solve at the three-phase temperature, the interval
 *    test written out) and, for one point per case, with pw_bubble_T_het / pw_bubble_P_het. */
#include "pw_test.h"

#include "fit/fit_design.h"

#include <math.h>
#include <pinchwise/fit.h>
#include <pinchwise/fit_diagnostics.h>
#include <pinchwise/lle.h>
#include <pinchwise/lledata.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#define P_ATM 101325.0

static pw_complib lib;

static void fit_file(const char *rel, const char *c1, const char *c2, const pw_model_type *m,
                     pw_fit_result *r)
{
    char path[1024];
    pw_dataset ds;
    pw_error err;
    pw_test_path(path, sizeof path, rel);
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    const pw_component *a = pw_complib_find(&lib, c1), *b = pw_complib_find(&lib, c2);
    assert_non_null(a);
    assert_non_null(b);
    pw_fit_options o = pw_fit_default_options();
    assert_int_equal(pw_fit_run(&ds, a, b, m, &o, r, &err), PW_OK);
    pw_dataset_free(&ds);
}

static const pw_fit_diag *find_gap(const pw_fit_diags *d)
{
    const pw_fit_diag *g = NULL;
    for (size_t i = 0; i < d->n; i++)
        if (d->items[i].kind == PW_DIAG_LIQUID_IN_GAP) {
            assert_null(g); /* one record at most */
            g = &d->items[i];
        }
    return g;
}

/* The layers at the three-phase state of s at P, independently: the three-phase temperature
 * from pw_three_phase_at_P, the layers re-solved there by pw_lle_solve (the full tangent-plane
 * check), and the three-phase pressure a1 P1sat + a2 P2sat checked against P. */
static void layers_at_P(const pw_system *s, double P, double *xI, double *xII, double *T3)
{
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(s, P, &tp), PW_OK);
    assert_true(tp.exists);
    pw_lle_result l;
    assert_int_equal(pw_lle_solve(s, tp.T_K, &l), PW_OK);
    assert_true(l.split);
    double p1, p2;
    assert_int_equal(pw_psat(&s->comp[0], tp.T_K, &p1, NULL), PW_OK);
    assert_int_equal(pw_psat(&s->comp[1], tp.T_K, &p2, NULL), PW_OK);
    pw_assert_close(l.a[0] * p1 + l.a[1] * p2, P, 1e-6, 0, "three-phase pressure");
    *xI = l.x[0];
    *xII = l.x[1];
    *T3 = tp.T_K;
}

/* Lines 22 and 23 of datasets/butanol_water_1atm.csv hold x1 = 0.494 and 0.504: read here
 * from the file, not assumed. */
static void butanol_water_nrtl_flags_lines_22_23(void **state)
{
    (void)state;
    pw_fit_result r;
    fit_file("datasets/butanol_water_1atm.csv", "1-butanol", "water", &pw_model_nrtl, &r);
    pw_fit_diags d;
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    const pw_fit_diag *g = find_gap(&d);
    assert_non_null(g);
    assert_int_equal(g->severity, PW_DIAG_WARNING);
    assert_int_equal(g->count, 2);
    assert_int_equal(g->line, 22);
    assert_int_equal(g->line2, 23);
    assert_string_equal(pw_fit_diag_kind_name(g->kind), "liquid-inside-layers");
    assert_non_null(strstr(g->message, "lines 22 and 23"));
    assert_non_null(strstr(g->message, "three-phase state"));
    assert_non_null(strstr(g->message, "(docs/heterogeneous.md)")); /* not cut short */

    double xI, xII, T3;
    pw_assert_close(r.P_fixed_Pa, 101330.0, 1e-12, 0, "the file's '# pressure: 101.33 kPa'");
    layers_at_P(&r.sys, r.P_fixed_Pa, &xI, &xII, &T3);
    /* the three-phase search polishes its final layers with a coarser tangent-plane check; they
     * agree with the full solve to a few 1e-7 (measured 3.5e-7), far inside the data's 1e-3 */
    pw_assert_close(g->value, xI, 0, 1e-5, "rich-in-water layer");
    pw_assert_close(g->value2, xII, 0, 1e-5, "rich-in-butanol layer");
    pw_assert_close(g->value3, T3, 0, 1e-6, "three-phase temperature");
    size_t inside = 0;
    for (size_t i = 0; i < r.n_pts; i++) {
        const pw_fit_point *p = &r.pts[i];
        if (p->three_phase || p->excluded || !(p->meas.x1 > xI && p->meas.x1 < xII))
            continue;
        inside++;
        assert_true(p->meas.line == 22 || p->meas.line == 23);
        /* measured above T3 as one liquid; the model's value is the three-phase state */
        assert_true(p->meas.T_K > T3);
        assert_true(p->in_layers);
        pw_assert_close(p->T_calc_K, T3, 0, 1e-6, "calculated T of a point inside the layers");
    }
    assert_int_equal(inside, 2);
    for (size_t i = 0; i < r.n_pts; i++)
        if (r.pts[i].meas.line == 22)
            assert_true(r.pts[i].meas.x1 == 0.494 && !r.pts[i].three_phase);
        else if (r.pts[i].meas.line == 23)
            assert_true(r.pts[i].meas.x1 == 0.504 && !r.pts[i].three_phase);

    /* the fit file read back gives the same record */
    char tmpl[] = "/tmp/pw_gap_XXXXXX";
    int fd = mkstemp(tmpl);
    assert_true(fd >= 0);
    close(fd);
    unlink(tmpl); /* outputs are never written over */
    pw_error err;
    assert_int_equal(pw_fitfile_write(tmpl, &r, false, &err), PW_OK);
    pw_fit_result back;
    assert_int_equal(pw_fitfile_read(tmpl, &back, &err), PW_OK);
    unlink(tmpl);
    pw_fit_diags d2;
    assert_int_equal(pw_fit_diagnose(&back, &d2), PW_OK);
    const pw_fit_diag *g2 = find_gap(&d2);
    assert_non_null(g2);
    assert_int_equal(g2->count, 2);
    assert_int_equal(g2->line, 22);
    assert_int_equal(g2->line2, 23);
    pw_assert_close(g2->value2, g->value2, 0, 1e-7, "layer after reading");
    assert_true(back.layers_scored);
    assert_non_null(strstr(g2->message, "three-phase state"));

    /* a fit file written before the objective scored those points by the three-phase state
     * (no "inside_layers_scored" key): read as it was fitted, one-liquid values, and the record
     * says so */
    {
        assert_int_equal(pw_fitfile_write(tmpl, &r, false, &err), PW_OK); /* removed above */
        FILE *fi = fopen(tmpl, "r");
        assert_non_null(fi);
        char *buf = calloc(1u << 22, 1);
        assert_non_null(buf);
        size_t len = fread(buf, 1, (1u << 22) - 1, fi);
        fclose(fi);
        char *k = strstr(buf, "\"inside_layers_scored\": true,");
        assert_non_null(k);
        size_t cut = strlen("\"inside_layers_scored\": true,");
        memmove(k, k + cut, len - (size_t)(k - buf) - cut + 1);
        fi = fopen(tmpl, "w");
        assert_non_null(fi);
        fputs(buf, fi);
        fclose(fi);
        free(buf);
        pw_fit_result old;
        assert_int_equal(pw_fitfile_read(tmpl, &old, &err), PW_OK);
        unlink(tmpl);
        assert_false(old.layers_scored);
        for (size_t i = 0; i < old.n_pts; i++)
            assert_false(old.pts[i].in_layers);
        assert_int_equal(pw_fit_diagnose(&old, &d2), PW_OK);
        const pw_fit_diag *g3 = find_gap(&d2);
        assert_non_null(g3);
        assert_int_equal(g3->count, 2);
        assert_non_null(strstr(g3->message, "cannot produce"));
        pw_fit_result_free(&old);
    }

    /* the same points excluded: nothing left to report */
    pw_fit_result u = r;
    u.pts = malloc(r.n_pts * sizeof *u.pts);
    assert_non_null(u.pts);
    memcpy(u.pts, r.pts, r.n_pts * sizeof *u.pts);
    for (size_t i = 0; i < u.n_pts; i++)
        if (u.pts[i].meas.line == 22 || u.pts[i].meas.line == 23)
            u.pts[i].excluded = true;
    assert_int_equal(pw_fit_diagnose(&u, &d2), PW_OK);
    assert_null(find_gap(&d2));
    free(u.pts);
    pw_fit_result_free(&back);
    pw_fit_result_free(&r);
}

static double sq(double v)
{
    return v * v;
}

/* The NRTL fit of the shipped 1 atm set and its three-phase state at the data's pressure. */
static void butanol_nrtl_at_T3(pw_fit_result *r, pw_three_phase *tp)
{
    fit_file("datasets/butanol_water_1atm.csv", "1-butanol", "water", &pw_model_nrtl, r);
    assert_int_equal(pw_three_phase_at_P(&r->sys, r->P_fixed_Pa, tp), PW_OK);
    assert_true(tp->exists);
}

/* The fit's chi2 at its optimum, recomputed from the stable prediction of every used point. */
static void objective_scores_the_stable_prediction(void **state)
{
    (void)state;
    pw_fit_result r;
    pw_three_phase tp;
    butanol_nrtl_at_T3(&r, &tp);
    double S = 0.0, S_meta = 0.0;
    size_t n_in = 0, n_used = 0;
    for (size_t i = 0; i < r.n_pts; i++) {
        const pw_fit_point *p = &r.pts[i];
        const pw_point *m = &p->meas;
        if (p->excluded || m->x1 <= 0.0 || m->x1 >= 1.0)
            continue;
        n_used++;
        double T = tp.T_K, y = tp.y1, T_meta = tp.T_K, y_meta = tp.y1;
        if (!p->three_phase) {
            pw_eq_point eq, one;
            bool three = false;
            assert_int_equal(pw_bubble_T_het(&r.sys, r.P_fixed_Pa, m->x1, &eq, &three), PW_OK);
            assert_int_equal(pw_bubble_T(&r.sys, r.P_fixed_Pa, m->x1, &one), PW_OK);
            assert_true(three == p->in_layers);
            n_in += three;
            T = eq.T_K;
            y = eq.y1;
            T_meta = one.T_K;
            y_meta = one.y1;
            pw_assert_close(p->T_calc_K, T, 0, 1e-6, "calculated T");
            pw_assert_close(p->y_calc, y, 0, 1e-8, "calculated y");
        }
        S += sq((T - m->T_K) / r.sigma_T_K) + sq((y - m->y1) / r.sigma_y);
        S_meta += sq((T_meta - m->T_K) / r.sigma_T_K) + sq((y_meta - m->y1) / r.sigma_y);
    }
    assert_int_equal(n_in, 2); /* lines 22 and 23 */
    assert_int_equal(r.n_residuals, 2 * n_used);
    pw_assert_close(r.chi2, S, 1e-6, 0, "chi2 from the stable predictions");
    assert_true(fabs(S_meta - S) > 1e-3 * S); /* the metastable scoring is another number */
    pw_fit_result_free(&r);
}

/* Measurement planning on the same fit: a planned point inside the model's layers is the
 * three-phase state (its value and its Jacobian rows do not depend on where in the layers it
 * lies), so two such points carry the same information; one outside carries other information. */
static void planned_points_inside_the_layers(void **state)
{
    (void)state;
    pw_fit_result r;
    pw_three_phase tp;
    butanol_nrtl_at_T3(&r, &tp);
    assert_true(tp.x[0] < 0.2 && 0.45 < tp.x[1]);
    pw_point a, b, c;
    assert_int_equal(fit_hypothetical_point(&r, 0.2, &a), PW_OK);
    assert_int_equal(fit_hypothetical_point(&r, 0.45, &b), PW_OK);
    assert_int_equal(fit_hypothetical_point(&r, 0.8, &c), PW_OK);
    pw_assert_close(a.T_K, tp.T_K, 0.0, 1e-6, "planned point inside: T3");
    pw_assert_close(a.y1, tp.y1, 0.0, 1e-8, "planned point inside: y3");
    double ia[PW_MAX_PARAMS][PW_MAX_PARAMS], ib[PW_MAX_PARAMS][PW_MAX_PARAMS],
        ic[PW_MAX_PARAMS][PW_MAX_PARAMS];
    assert_int_equal(fit_information(&r, &a, 1, ia), PW_OK);
    assert_int_equal(fit_information(&r, &b, 1, ib), PW_OK);
    assert_int_equal(fit_information(&r, &c, 1, ic), PW_OK);
    for (int i = 0; i < 2; i++)
        for (int j = 0; j < 2; j++)
            pw_assert_close(ia[i][j], ib[i][j], 1e-8, 0.0, "same information inside the layers");
    assert_true(fabs(ic[0][0] - ia[0][0]) > 1e-3 * fabs(ia[0][0]));
    pw_fit_result_free(&r);
}

/* Tie lines say the liquids split too: the shipped 1 atm set without its seven three-phase
 * points (lines 15-21 excluded) fitted with the 25 C tie line. The one-liquid points inside the
 * model's layers are scored by the three-phase state (found by the full search, no measured T3
 * to start from): chi2 recomputed from pw_bubble_T_het and the tie lines' stored layers. */
static void tie_lines_alone_say_the_liquids_split(void **state)
{
    (void)state;
    char path[1024];
    pw_dataset ds;
    pw_lle_dataset ties;
    pw_error err;
    pw_test_path(path, sizeof path, "datasets/butanol_water_1atm.csv");
    assert_int_equal(pw_dataset_read(path, &ds, &err), PW_OK);
    pw_test_path(path, sizeof path, "datasets/lle/butanol_water_25C_ties.csv");
    assert_int_equal(pw_lle_dataset_read(path, &ties, &err), PW_OK);
    const pw_component *a = pw_complib_find(&lib, "1-butanol"), *b = pw_complib_find(&lib, "water");
    pw_fit_options o = pw_fit_default_options();
    for (long l = 15; l <= 21; l++)
        o.exclude_lines[o.n_exclude++] = l;
    pw_tie_line *copy = NULL;
    assert_int_equal(pw_fit_attach_tie_lines_ex(&ties, &ds, a, b, &o, &copy, &err), PW_OK);
    pw_fit_result r;
    assert_int_equal(pw_fit_run(&ds, a, b, &pw_model_nrtl, &o, &r, &err), PW_OK);
    free(copy);
    assert_int_equal(r.n_three_phase, 0);
    assert_int_equal(r.n_tie_lines, 1);
    pw_three_phase tp;
    assert_int_equal(pw_three_phase_at_P(&r.sys, r.P_fixed_Pa, &tp), PW_OK);
    assert_true(tp.exists);
    double S = 0.0;
    size_t n_in = 0, n_used = 0;
    for (size_t i = 0; i < r.n_pts; i++) {
        const pw_fit_point *p = &r.pts[i];
        const pw_point *m = &p->meas;
        if (p->excluded || m->x1 <= 0.0 || m->x1 >= 1.0)
            continue;
        n_used++;
        pw_eq_point eq;
        bool three = false;
        assert_int_equal(pw_bubble_T_het(&r.sys, r.P_fixed_Pa, m->x1, &eq, &three), PW_OK);
        assert_true(three == p->in_layers);
        n_in += three;
        S += sq((eq.T_K - m->T_K) / r.sigma_T_K) + sq((eq.y1 - m->y1) / r.sigma_y);
    }
    assert_true(n_in >= 2); /* lines 22 and 23 at least */
    assert_non_null(r.ties);
    S += sq((r.ties[0].calc_I - r.ties[0].x_I) / r.sigma_x_lle) +
         sq((r.ties[0].calc_II - r.ties[0].x_II) / r.sigma_x_lle);
    assert_int_equal(r.n_residuals, 2 * n_used + 2);
    pw_assert_close(r.chi2, S, 1e-6, 0, "chi2 with tie lines and points inside the layers");
    pw_fit_result_free(&r);
    pw_lle_dataset_free(&ties);
    pw_dataset_free(&ds);
}

static void wilson_and_miscible_data_give_none(void **state)
{
    (void)state;
    pw_fit_result r;
    pw_fit_diags d;
    fit_file("datasets/butanol_water_1atm.csv", "1-butanol", "water", &pw_model_wilson, &r);
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    assert_null(find_gap(&d));
    pw_fit_result_free(&r);

    fit_file("datasets/methanol_water_1atm.csv", "methanol", "water", &pw_model_nrtl, &r);
    assert_int_equal(pw_fit_diagnose(&r, &d), PW_OK);
    assert_null(find_gap(&d));
    pw_three_phase tp; /* the fitted model is miscible at 1 atm: nothing to be inside */
    assert_int_equal(pw_three_phase_at_P(&r.sys, P_ATM, &tp), PW_OK);
    assert_false(tp.exists);
    pw_fit_result_free(&r);
}

static double uniform(unsigned *seed)
{
    *seed = *seed * 1103515245u + 12345u;
    return ((*seed >> 8) & 0xffffffu) / 16777216.0;
}

/* Random points on the fitted NRTL system: the record's count and first/last lines against the
 * interval test on independently solved layers. */
static void random_points_against_direct_computation(void **state)
{
    (void)state;
    pw_fit_result r;
    fit_file("datasets/butanol_water_1atm.csv", "1-butanol", "water", &pw_model_nrtl, &r);
    unsigned seed = 20261203u;
    const size_t n = 40;
    size_t flagged[2] = {0, 0}; /* isothermal, isobaric: the cases must reach the record */
    for (int c = 0; c < 6; c++) {
        bool isobaric = c % 2 == 0;
        double cond[2] = {isobaric ? P_ATM : 330.0, isobaric ? 0.6 * P_ATM : 350.0};
        double xI[2], xII[2], T3[2];
        for (int k = 0; k < 2; k++) {
            if (isobaric) {
                layers_at_P(&r.sys, cond[k], &xI[k], &xII[k], &T3[k]);
            } else {
                pw_lle_result l;
                assert_int_equal(pw_lle_solve(&r.sys, cond[k], &l), PW_OK);
                assert_true(l.split);
                xI[k] = l.x[0];
                xII[k] = l.x[1];
                T3[k] = cond[k];
            }
        }
        pw_fit_result u = r;
        u.kind = isobaric ? PW_DATA_ISOBARIC : PW_DATA_ISOTHERMAL;
        u.pts = calloc(n, sizeof *u.pts);
        assert_non_null(u.pts);
        u.n_pts = n;
        size_t want = 0;
        long first = 0, last = 0;
        for (size_t i = 0; i < n; i++) {
            pw_fit_point *p = &u.pts[i];
            int k = uniform(&seed) < 0.5 ? 0 : 1;
            p->meas.line = (long)(5 + 2 * i);
            p->meas.x1 = c == 4 && i == 0 ? xII[k] : uniform(&seed); /* an end exactly: outside */
            p->meas.y1 = NAN;
            p->meas.P_Pa = isobaric ? cond[k] : 1e5;
            p->meas.T_K = isobaric ? 360.0 : cond[k];
            p->three_phase = uniform(&seed) < 0.2;
            p->excluded = uniform(&seed) < 0.1;
            bool in = !p->three_phase && !p->excluded && p->meas.x1 > xI[k] && p->meas.x1 < xII[k];
            if (in && want++ == 0)
                first = p->meas.line;
            if (in)
                last = p->meas.line;
            if (i == 1) { /* one point against the library's heterogeneous bubble point */
                pw_eq_point eq;
                bool three = false;
                assert_int_equal(isobaric
                                     ? pw_bubble_T_het(&r.sys, cond[k], p->meas.x1, &eq, &three)
                                     : pw_bubble_P_het(&r.sys, cond[k], p->meas.x1, &eq, &three),
                                 PW_OK);
                assert_true(three == (p->meas.x1 > xI[k] && p->meas.x1 < xII[k]));
            }
        }
        pw_fit_diags d;
        assert_int_equal(pw_fit_diagnose(&u, &d), PW_OK);
        const pw_fit_diag *g = find_gap(&d);
        flagged[isobaric] += want;
        if (!want) {
            assert_null(g);
        } else {
            assert_non_null(g);
            assert_int_equal(g->count, want);
            assert_int_equal(g->line, first);
            assert_int_equal(g->line2, last);
            assert_non_null(strstr(g->message, want == 1   ? "point (line"
                                               : want == 2 ? "points (lines"
                                                           : "points (first line"));
            /* the layers shown are those of the first flagged point's condition */
            int k = -1;
            for (size_t i = 0; i < n && k < 0; i++)
                if (u.pts[i].meas.line == first)
                    k = (isobaric ? u.pts[i].meas.P_Pa : u.pts[i].meas.T_K) == cond[0] ? 0 : 1;
            pw_assert_close(g->value, xI[k], 0, 1e-5, "x_I");
            pw_assert_close(g->value2, xII[k], 0, 1e-5, "x_II");
            pw_assert_close(g->value3, T3[k], 0, 1e-6, "T");
        }
        free(u.pts);
    }
    assert_true(flagged[0] > 0 && flagged[1] > 0);
    pw_fit_result_free(&r);
}

static int setup(void **state)
{
    (void)state;
    return pw_test_read_complib(&lib);
}

static int teardown(void **state)
{
    (void)state;
    pw_complib_free(&lib);
    return 0;
}

int main(void)
{
    pw_test_init();
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(butanol_water_nrtl_flags_lines_22_23),
        cmocka_unit_test(objective_scores_the_stable_prediction),
        cmocka_unit_test(planned_points_inside_the_layers),
        cmocka_unit_test(tie_lines_alone_say_the_liquids_split),
        cmocka_unit_test(wilson_and_miscible_data_give_none),
        cmocka_unit_test(random_points_against_direct_computation),
    };
    return cmocka_run_group_tests(tests, setup, teardown);
}
