/* Three-phase points in a VLE set before the consistency tests (METHODS2 3.6-3.7).
 *
 * The published consistency tests (area, point, infinite dilution...) assume one liquid. A point
 * inside the two-liquid region (detected by pw_three_phase_detect: a plateau of equal T, or P,
 * and y over a range of x) is taken out of them; for each such point the cheap bound of
 * METHODS2 3.6 is evaluated instead: an activity cannot exceed 1, so y_i P <= P_i^sat(T) for
 * both components (ideal vapor). */
#ifndef PINCHWISE_HETCHECK_H
#define PINCHWISE_HETCHECK_H

#include <pinchwise/consistency.h>
#include <pinchwise/dataset.h>
#include <pinchwise/lledata.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef struct pw_het_point {
    long line;
    double x1, y1, T_K, P_Pa;
    double bound[2];  /* y_i P / P_i^sat(T): the apparent activity, at most 1 */
} pw_het_point;

typedef struct pw_het_check {
    pw_het_point *pts; /* owned */
    size_t n;
    double max_bound;  /* largest bound over points and components (NAN when n = 0) */
    bool bound_ok;     /* every bound <= 1 + 0.005 (a rounding margin of 0.5 %) */
} pw_het_check;

/* Splits ds: out->pts receives its three-phase points, one_liquid (a copy of ds, its own points
 * array) the others. c1, c2 are the dataset's components. The caller frees both with
 * pw_het_check_free. PW_ENOMEM; psat failures leave that bound NAN. */
pw_status pw_het_check_run(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                           pw_dataset *one_liquid, pw_het_check *out);

void pw_het_check_free(pw_het_check *out, pw_dataset *one_liquid);

/* What `check` runs on a data set, the one function for every place that judges data
 * (check, the report): the three-phase points split off into het (pw_het_check_run), then
 * pw_consistency_run on the one-liquid rest (ds itself when there are none) with options o
 * (NULL: the defaults). On PW_OK the caller frees het (pw_het_check_free(het, NULL)) and r
 * (pw_consistency_result_free); on failure nothing is left to free and err says why. */
pw_status pw_check_data(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                        const pw_consistency_options *o, pw_het_check *het,
                        pw_consistency_result *r, pw_error *err);

/* Why three-phase points are left out of the consistency tests, in words (static string). */
const char *pw_het_check_reason(void);

#ifdef __cplusplus
}
#endif
#endif
