/* Benchmark of the design-grade column (not a test; run by tools/bench.sh):
 *   pw-bench-design [REPS]
 * prints median seconds per call of pw_energy_column_solve (with its design rows), of
 * pw_design_cmo, of pw_rate_cmo and of pw_rate_energy on methanol/water at 101.325 kPa: NRTL with
 * the parameters of Smith, Van Ness & Abbott 7th ed. (from memory, as in METHODS2 5.6), the
 * shipped vapor-pressure rows, the heats of METHODS2 5.6. */
#include <gsl/gsl_errno.h>
#include <math.h>
#include <pinchwise/design.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

static double now(void)
{
    struct timespec ts;
    clock_gettime(CLOCK_MONOTONIC, &ts);
    return (double)ts.tv_sec + 1e-9 * (double)ts.tv_nsec;
}

static int cmp_d(const void *a, const void *b)
{
    double x = *(const double *)a, y = *(const double *)b;
    return (x > y) - (x < y);
}

#define MAX_REPS 200

int main(int argc, char **argv)
{
    gsl_set_error_handler_off();
    int reps = argc > 1 ? atoi(argv[1]) : 10;
    if (reps < 1 || reps > MAX_REPS)
        reps = 10;
    pw_complib lib;
    pw_complib_init(&lib);
    pw_error err;
    if (pw_complib_read(&lib, PW_BENCH_COMPONENTS, &err) != PW_OK) {
        fprintf(stderr, "pw-bench-design: %s\n", err.msg);
        return 1;
    }
    pw_system s;
    memset(&s, 0, sizeof s);
    const pw_component *m = pw_complib_find(&lib, "methanol"), *w = pw_complib_find(&lib, "water");
    if (!m || !w)
        return 1;
    s.comp[0] = *m;
    s.comp[1] = *w;
    s.model = &pw_model_nrtl;
    s.params[0] = -253.88 / 1.987;
    s.params[1] = 845.21 / 1.987;
    s.params[2] = 0.2994;
    s.T_ref_K = 350.0;
    pw_heat_data h = {.dHvap = {35210.0, 40660.0}, .cpL = {81.1, 75.3}, .cpV = {44.1, 33.6}};
    pw_tsat(&s.comp[0], 101325.0, &h.Tb_K[0]);
    pw_tsat(&s.comp[1], 101325.0, &h.Tb_K[1]);
    pw_column_spec spec = {0.95, 0.05, 0.5, 1.0};
    double t[4][MAX_REPS];
    for (int r = 0; r < reps; r++) {
        double t0 = now();
        pw_energy_result er;
        pw_design_table dt;
        if (pw_energy_column_solve(&s, &h, 101325.0, &spec, NULL, &er, &dt) != PW_OK)
            return 1;
        pw_design_table_free(&dt);
        double t1 = now();
        if (pw_design_cmo(&s, 101325.0, &spec, 0.58916, 5.0, NULL, &dt) != PW_OK)
            return 1;
        pw_design_table_free(&dt);
        double t2 = now();
        pw_rate_spec rs = {30, 15, 1.0, 0.5, 1.0, 0.5};
        pw_rate_result rr;
        if (pw_rate_cmo(&s, 101325.0, &rs, &rr, &err) != PW_OK)
            return 1;
        pw_rate_result_free(&rr);
        double t3 = now();
        double qc, qr;
        size_t nr;
        if (pw_rate_energy(&s, &h, 101325.0, &rs, &rr, &qc, &qr, &nr, &err) != PW_OK)
            return 1;
        pw_rate_result_free(&rr);
        double t4 = now();
        t[0][r] = t1 - t0;
        t[1][r] = t2 - t1;
        t[2][r] = t3 - t2;
        t[3][r] = t4 - t3;
    }
    const char *names[4] = {"energy R_min + 3 design rows", "CMO design rows (3)",
                            "rate CMO, 30 stages", "rate energy, 30 stages"};
    for (int k = 0; k < 4; k++) {
        qsort(t[k], (size_t)reps, sizeof t[k][0], cmp_d);
        printf("%-32s median %.4f s over %d\n", names[k], t[k][reps / 2], reps);
    }
    pw_complib_free(&lib);
    return 0;
}
