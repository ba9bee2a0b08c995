/* Detection of three-phase points in a VLE set (include/pinchwise/lledata.h; the rule and its
 * reasons: docs/heterogeneous.md 4).
 *
 * At fixed P (or T) every overall liquid between the two layers boils at the same T3 (P3) with
 * the same vapor y3, so the three-phase points of a data set are a run of points, consecutive in
 * x, whose T (P) and y are constant within their measurement uncertainty. A single stable liquid
 * can look almost as flat near a homogeneous azeotrope (T stationary) or just short of a liquid
 * split (T and y both nearly stationary), but there y still rises with x (the vapor of a stable
 * liquid gets richer as the liquid does). The rule therefore asks for:
 *   1. at least 3 points whose x spans at least X_SPAN_MIN (0.1: narrower two-liquid gaps lie
 *      near a critical solution point, where a flat single liquid looks the same), or exactly
 *      2 points at least PAIR_SPAN_MIN apart in x (the two layers boiling together, as some
 *      isothermal sets report them: equal P and y over a third of the composition range is
 *      no single liquid's, whose y rises with x);
 *   2. constant T (P) and y: the range of each within BAND_SIGMAS = 3 sigma (sigma the stated
 *      uncertainty, not below the rounding floors below; 3 sigma keeps about 95 % of true
 *      plateaus of ~10 points whole, 2 sigma only two thirds: measured in the test);
 *   3. no trend the noise cannot explain: the least-squares slope of T (P) against x within
 *      SLOPE_Z standard errors of zero, and the slope of y not significantly positive (one-sided
 *      SLOPE_Z1); standard error sigma/sqrt(Sxx), sigma known.
 * Runs are grown from each point (in x order) to the longest run satisfying 2, then tested for 1
 * and 3; a run inside one that failed 3 is not tried again; flagged runs do not overlap.
 * Measured error rates (seeded, tests/unit/test_three_phase_detect.c): 192 of 200 simulated
 * true plateaus found; 7 of 140 near-split single liquids flagged, 28 of 80 closer to the split. */
#include <math.h>
#include <pinchwise/lledata.h>
#include <stdlib.h>

#define X_SPAN_MIN 0.10  /* see the header comment and docs/heterogeneous.md 4 */
#define MIN_POINTS 3
#define PAIR_SPAN_MIN 0.3 /* two points only when this far apart in x (both layers boiling) */
#define BAND_SIGMAS 3.0  /* range of T (P) and of y within a run, in sigmas */
#define SLOPE_Z 2.0      /* T (P) slope within two standard errors of zero (about 95 %) */
#define SLOPE_Z1 1.645   /* y slope: one-sided 95 % normal quantile */
#define FLOOR_T_K 0.05   /* rounding level of temperatures recorded to 0.1 K */
#define FLOOR_P_REL 1e-4
#define FLOOR_Y 0.002    /* rounding level of y recorded to three decimals */

typedef struct key {
    double x;
    size_t i;
} key;

static int by_x(const void *a, const void *b)
{
    const key *p = a, *q = b;
    return p->x < q->x ? -1 : p->x > q->x ? 1 : (p->i > q->i) - (p->i < q->i);
}

/* The least-squares slope of v on x over ks[a..b] is not significantly different from zero
 * (two-sided: |slope| <= SLOPE_Z se) or, for y, not significantly positive (one-sided: slope <=
 * SLOPE_Z1 se: a stable single liquid's y rises with x, a plateau's does not);
 * se = sigma / sqrt(Sxx). */
static bool no_trend(const key *ks, size_t a, size_t b, const double *v, double sigma,
                     bool one_sided)
{
    double n = (double)(b - a + 1), mx = 0.0, mv = 0.0;
    for (size_t k = a; k <= b; k++) {
        mx += ks[k].x;
        mv += v[k];
    }
    mx /= n;
    mv /= n;
    double sxx = 0.0, sxv = 0.0;
    for (size_t k = a; k <= b; k++) {
        sxx += (ks[k].x - mx) * (ks[k].x - mx);
        sxv += (ks[k].x - mx) * (v[k] - mv);
    }
    if (!(sxx > 0.0))
        return false;
    double slope = sxv / sxx, se = sigma / sqrt(sxx);
    return one_sided ? slope <= SLOPE_Z1 * se : fabs(slope) <= SLOPE_Z * se;
}

size_t pw_three_phase_detect(const pw_point *pts, size_t n, bool isobaric, bool has_y,
                             double sigma_T_K, double sigma_P_rel, double sigma_y, bool *flags)
{
    if (!pts || !flags)
        return 0;
    for (size_t i = 0; i < n; i++)
        flags[i] = false;
    if (!has_y || n < 2)
        return 0;
    key *ks = malloc(n * sizeof *ks);
    double *c = malloc(n * sizeof *c), *y = malloc(n * sizeof *y);
    size_t m = 0, count = 0;
    if (!ks || !c || !y)
        goto done;
    for (size_t i = 0; i < n; i++) {
        const pw_point *p = &pts[i];
        double cond = isobaric ? p->T_K : p->P_Pa;
        if (p->x1 > 0.0 && p->x1 < 1.0 && isfinite(p->y1) && isfinite(cond) && cond > 0.0)
            ks[m++] = (key){p->x1, i};
    }
    if (m < 2)
        goto done;
    qsort(ks, m, sizeof *ks, by_x);
    /* the condition on the scale of its uncertainty: T in K; ln P, whose differences are
     * relative differences of P */
    for (size_t k = 0; k < m; k++) {
        const pw_point *p = &pts[ks[k].i];
        c[k] = isobaric ? p->T_K : log(p->P_Pa);
        y[k] = p->y1;
    }
    double sc = isobaric ? fmax(isfinite(sigma_T_K) ? sigma_T_K : 0.0, FLOOR_T_K)
                         : fmax(isfinite(sigma_P_rel) ? sigma_P_rel : 0.0, FLOOR_P_REL);
    double sy = fmax(isfinite(sigma_y) ? sigma_y : 0.0, FLOOR_Y);
    /* a run inside one that failed the trend test is not tried again: a short stretch of a
     * sloping curve always looks flat */
    bool failed = false;
    size_t failed_end = 0;
    for (size_t a = 0; a + 2 <= m;) {
        /* grow while T (P) and y stay constant within the noise: ranges within BAND_SIGMAS */
        double clo = c[a], chi = c[a], ylo = y[a], yhi = y[a];
        size_t b = a;
        while (b + 1 < m) {
            double nclo = fmin(clo, c[b + 1]), nchi = fmax(chi, c[b + 1]);
            double nylo = fmin(ylo, y[b + 1]), nyhi = fmax(yhi, y[b + 1]);
            if (nchi - nclo > BAND_SIGMAS * sc || nyhi - nylo > BAND_SIGMAS * sy)
                break;
            clo = nclo;
            chi = nchi;
            ylo = nylo;
            yhi = nyhi;
            b++;
        }
        size_t np = b - a + 1;
        double span = ks[b].x - ks[a].x;
        bool enough = np >= MIN_POINTS ? span >= X_SPAN_MIN : np == 2 && span >= PAIR_SPAN_MIN;
        bool plateau = enough
                       && no_trend(ks, a, b, c, sc, false) && no_trend(ks, a, b, y, sy, true);
        if (failed && b <= failed_end)
            plateau = false;
        else if (!plateau && enough) {
            failed = true;
            failed_end = b;
        }
        if (!plateau) {
            a++;
            continue;
        }
        for (size_t k = a; k <= b; k++) {
            flags[ks[k].i] = true;
            count++;
        }
        a = b + 1;
    }
done:
    free(ks);
    free(c);
    free(y);
    return count;
}
