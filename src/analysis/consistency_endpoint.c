/* Pure-component (endpoint) test: the rows with x1 = 0 or x1 = 1 against the vapor-pressure
 * correlation of the component that is pure there.
 *   isothermal: dev = (P_meas - P_sat(T)) / P_sat(T), limit |dev| < 0.005
 *   isobaric:   dev = T_meas - T_sat(P) [K],          limit |dev| < 0.2 K
 * The limits are METHODS 4.7 screening thresholds (common practice, not from a source). */
#include "consistency_internal.h"

#include <math.h>

pw_status pw_cs_endpoint_test(const cs_data *d, pw_consistency_result *r)
{
    pw_ctest *t = &r->tests[PW_CTEST_ENDPOINT];
    bool iso_T = d->ds->kind == PW_DATA_ISOTHERMAL;
    t->limit = iso_T ? d->opt->endpoint_P_rel_max : d->opt->endpoint_T_max_K;
    r->endpoint_dev[0] = r->endpoint_dev[1] = NAN;
    double worst = 0.0;
    size_t n_pure = 0;
    for (size_t i = 0; i < d->ds->n; i++) {
        const pw_point *p = &d->ds->pts[i];
        if (p->x1 != 0.0 && p->x1 != 1.0)
            continue;
        int end = p->x1 == 1.0;               /* 0: pure component 2, 1: pure component 1 */
        const pw_component *c = d->comp[end ? 0 : 1];
        double dev;
        pw_status st;
        if (iso_T) {
            double Ps;
            st = pw_psat(c, p->T_K, &Ps, NULL);
            dev = (p->P_Pa - Ps) / Ps;
        } else {
            double Ts;
            st = pw_tsat(c, p->P_Pa, &Ts);
            dev = p->T_K - Ts;
        }
        if (st != PW_OK) {
            pw_cs_not_run(t, "the vapor pressure of %s cannot be evaluated at line %ld (%s)",
                          c->name, p->line, pw_strerror(st));
            return PW_OK;
        }
        if (!isfinite(r->endpoint_dev[end]) || fabs(dev) > fabs(r->endpoint_dev[end]))
            r->endpoint_dev[end] = dev;
        worst = fmax(worst, fabs(dev));
        n_pure++;
    }
    if (n_pure == 0) {
        pw_cs_not_run(t, "the data set has no pure-component rows (x1 = 0 or x1 = 1)");
        return PW_OK;
    }
    t->ran = true;
    t->value = worst;
    t->pass = worst < t->limit;
    return PW_OK;
}
