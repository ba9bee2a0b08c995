/* The GSL boundary of the regression and consistency paths (docs/hardening.md): like
 * test_gsl_boundary, this program keeps GSL's default error handler, which aborts the process, and
 * never switches it off. It feeds the least-squares fit and the consistency tests hostile data
 * built in memory (not through the readers, which refuse them): non-finite and absurd
 * temperatures, pressures and compositions, too few points, repeated points, and every model.
 * Every call must come back with a status (or a result that says it did not converge); an abort
 * fails the test. Components: SVNA 7th ed. Table B.2 Antoine rows (pw_test_svna). */
#include "pw_test.h"

#include <math.h>
#include <pinchwise/consistency.h>
#include <pinchwise/fit.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

/* Invented points: an acetone/water-like T-x-y set, then spoiled by `spoil`. */
static void make(pw_dataset *ds, size_t n, int spoil)
{
    memset(ds, 0, sizeof *ds);
    snprintf(ds->path, sizeof ds->path, "hostile.csv");
    snprintf(ds->names[0], sizeof ds->names[0], "acetone");
    snprintf(ds->names[1], sizeof ds->names[1], "water");
    ds->kind = PW_DATA_ISOBARIC;
    ds->has_y = true;
    ds->P_fixed_Pa = 101325.0;
    ds->T_fixed_K = NAN;
    ds->sigma_T_K = 0.1, ds->sigma_P_rel = 1e-3, ds->sigma_P_abs_Pa = NAN, ds->sigma_y = 0.004;
    ds->sigma_x = 0.001;
    ds->pts = calloc(n ? n : 1, sizeof *ds->pts);
    ds->n = n;
    for (size_t i = 0; i < n; i++) {
        double x = (double)(i + 1) / (double)(n + 1);
        ds->pts[i].x1 = x;
        ds->pts[i].y1 = x + 0.6 * x * (1 - x);
        ds->pts[i].T_K = 373.15 - 40.0 * sqrt(x);
        ds->pts[i].P_Pa = 101325.0;
        ds->pts[i].line = (long)i + 5;
        switch (spoil) {
        case 1: ds->pts[i].T_K = i % 2 ? NAN : ds->pts[i].T_K; break;
        case 2: ds->pts[i].T_K = 1e6; break;
        case 3: ds->pts[i].P_Pa = i % 3 ? 1e-300 : 1e300; break;
        case 4: ds->pts[i].y1 = i % 2 ? INFINITY : -1.0; break;
        case 5: ds->pts[i] = ds->pts[0]; break;            /* every point the same */
        case 6: ds->pts[i].x1 = 0.5; ds->pts[i].y1 = 0.5; break;
        case 7: ds->pts[i].T_K = 1e-300; break;
        default: break;
        }
    }
}

static void fit_survives_hostile_data(void **state)
{
    (void)state;
    pw_component c1 = pw_test_svna("acetone"), c2 = pw_test_svna("water");
    size_t nm;
    const pw_model_type *const *models = pw_model_all(&nm);
    static const size_t sizes[] = {0, 1, 2, 3, 12};
    size_t calls = 0;
    for (int spoil = 0; spoil <= 7; spoil++)
        for (size_t si = 0; si < sizeof sizes / sizeof sizes[0]; si++)
            for (size_t m = 0; m < nm; m++) {
                if (models[m]->from_components && strcmp(models[m]->name, "wilson") != 0)
                    continue; /* needs r and q, which these test rows do not carry */
                pw_dataset ds;
                make(&ds, sizes[si], spoil);
                pw_fit_options o = pw_fit_default_options();
                o.n_starts = 3;
                pw_fit_result r;
                pw_error err;
                pw_status st = pw_fit_run(&ds, &c1, &c2, models[m], &o, &r, &err);
                if (st == PW_OK) {
                    /* a result on garbage must not claim a sound answer with NaN numbers */
                    assert_true(!r.converged || isfinite(r.chi2));
                    pw_fit_result_free(&r);
                }
                pw_dataset_free(&ds);
                calls++;
            }
    assert_true(calls > 100);
}

static void consistency_survives_hostile_data(void **state)
{
    (void)state;
    pw_component c1 = pw_test_svna("acetone"), c2 = pw_test_svna("water");
    static const size_t sizes[] = {0, 1, 2, 3, 4, 12};
    for (int spoil = 0; spoil <= 7; spoil++)
        for (size_t si = 0; si < sizeof sizes / sizeof sizes[0]; si++)
            for (int strict = 0; strict < 2; strict++) {
                pw_dataset ds;
                make(&ds, sizes[si], spoil);
                pw_consistency_options o = pw_consistency_default_options();
                o.strict_verdict = strict;
                pw_consistency_result r;
                memset(&r, 0, sizeof r);
                pw_error err;
                if (pw_consistency_run(&ds, &c1, &c2, &o, &r, &err) == PW_OK)
                    pw_consistency_result_free(&r);
                pw_dataset_free(&ds);
            }
}

int main(void)
{
    /* deliberately no pw_test_init(): GSL's aborting handler stays installed */
    const struct CMUnitTest tests[] = {
        cmocka_unit_test(fit_survives_hostile_data),
        cmocka_unit_test(consistency_survives_hostile_data),
    };
    return cmocka_run_group_tests(tests, NULL, NULL);
}
