/* Thermodynamic consistency tests of measured binary VLE data (see docs/consistency.md).
 *
 * Input: a pw_dataset and its two components (the vapor pressures, in the dataset's order).
 * Phase equilibrium is modified Raoult's law (ideal vapor): y_i P = x_i gamma_i P_i^sat(T),
 * with the same vapor pressures the fit uses. Tests:
 *   rk_area          Redlich & Kister (1948) area test, isothermal data with y
 *   herington        Herington (1947, 1951) D - J, isobaric data with y
 *   legendre_point   Van Ness, Byer & Gibbs (1973) point test with the Legendre G^E of
 *                    Fredenslund, Gmehling & Rasmussen (1977), fitted by Barker's method to
 *                    P-x or T-x alone; mean |y_calc - y_exp| < 0.01, or below the 99 % bound
 *                    the stated sigma_y implies (the smaller)
 *   point_scatter    with stated uncertainties: the point test's residuals in y and in T (P)
 *                    against them, chi-square at 99 % (docs/consistency.md)
 *   kojima_dilution  Kojima, Moon & Ochi (1990) infinite-dilution test, I1 and I2 < 30
 *   kojima_slope     Kojima et al. (1990) slope point test, mean deviation < 5 (isothermal)
 *   pure_endpoints   measured pure-component P (or T) against the vapor-pressure correlation
 * plus per-point residuals, robust (MAD-based) outlier flags, a evidence score (weighting after Kang et al.)
 * (Kang et al. 2010, J. Chem. Eng. Data 55:3631) and an overall verdict with reasons.
 * Everything is a plain value owned by the caller; the result's arrays are freed with
 * pw_consistency_result_free. The library never prints. */
#ifndef PINCHWISE_CONSISTENCY_H
#define PINCHWISE_CONSISTENCY_H

#include <pinchwise/component.h>
#include <pinchwise/dataset.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum {
    PW_CTEST_AREA = 0,     /* rk_area */
    PW_CTEST_HERINGTON,    /* herington */
    PW_CTEST_POINT,        /* legendre_point */
    PW_CTEST_DILUTION,     /* kojima_dilution */
    PW_CTEST_SLOPE,        /* kojima_slope */
    PW_CTEST_ENDPOINT,     /* pure_endpoints */
    PW_CTEST_SCATTER,      /* point_scatter */
    PW_CTEST_COUNT
} pw_ctest_id;

typedef enum {
    PW_LEGENDRE_BY_AICC = 0,     /* lowest corrected Akaike criterion (default) */
    PW_LEGENDRE_BY_RESIDUAL = 1  /* lowest residual sum of squares */
} pw_legendre_choice;

/* Criteria and tunables. Every limit is a pass threshold "value < limit". */
typedef struct pw_consistency_options {
    double area_D_max;          /* rk_area D [%] (default 10, common choice, METHODS 4.1) */
    double herington_max;       /* herington D - J (default 10, Herington 1947/1951) */
    double point_dy_max;        /* legendre_point mean |dy| (default 0.01, Fredenslund 1977) */
    double dilution_I_max;      /* kojima_dilution I1, I2 [%] (default 30, Kojima 1990) */
    double slope_d_max;         /* kojima_slope mean deviation [%] (default 5, Kojima 1990) */
    double endpoint_P_rel_max;  /* pure_endpoints |dP|/P (default 0.005, screening threshold) */
    double endpoint_T_max_K;    /* pure_endpoints |dT| [K] (default 0.2, screening threshold) */
    size_t legendre_terms_min;  /* 3..5 terms (defaults 3 and 5); at most PW_CONSISTENCY_MAX_TERMS */
    size_t legendre_terms_max;
    pw_legendre_choice legendre_choice;
    double outlier_k;           /* flag beyond k robust standard deviations (default 3) */
    double outlier_floor_y;     /* smallest robust SD used for dy (default 0.001) */
    double outlier_floor_lnratio; /* ... for d ln(gamma1/gamma2) (default 0.01) */
    double outlier_floor_T_K;   /* ... for the Barker T residual (default 0.05 K) */
    double outlier_floor_P_rel; /* ... for the Barker relative P residual (default 5e-4) */
    double dilution_min_lngamma; /* below this |ln gamma_inf| the dilution test is not run
                                    (ill-conditioned division; default 0.05) */
    /* Stated standard uncertainties (docs/consistency.md, "Stated uncertainties"). NAN (default):
     * sigma_y and sigma_x from the dataset when its metadata state them, sigma_T and sigma_P
     * from the dataset (stated or its defaults). Without a sigma_y (neither here nor stated in
     * the file) the point test keeps the classic limit point_dy_max and point_scatter does not
     * run; without a sigma_x, x is taken as exact. */
    double sigma_y, sigma_x, sigma_T_K, sigma_P_rel;
    double point_confidence;    /* one-sided confidence of the uncertainty-based limits (0.99) */
    /* The x1 range that three-phase points spanned, left out of the data (pw_check_data sets
     * it): the area tests then smooth each liquid branch on its own and bridge the gap by the
     * step of G^E/RT between the one-liquid points beside it (docs/consistency.md). NAN
     * (default): no gap, one polynomial over [0, 1]. */
    double gap_x1[2];
    /* The temperatures of those three-phase points (lowest, highest; NAN: none): Herington's
     * theta spans the whole system's boiling range, the three-phase line included. */
    double gap_T_K[2];
    bool strict_verdict;        /* false (default): the verdict rests on legendre_point and
                                   pure_endpoints (the area and Kojima tests when the point test
                                   cannot run), other failures are warnings; true: every test that
                                   ran must pass */
} pw_consistency_options;

/* The defaults above. */
pw_consistency_options pw_consistency_default_options(void);

#define PW_CONSISTENCY_MAX_TERMS 5
#define PW_CONSISTENCY_REASON_MAX 400
#define PW_CONSISTENCY_MAX_REASONS 12

/* One test. name, title, source, criterion and meaning are static strings. */
typedef struct pw_ctest {
    pw_ctest_id id;
    const char *name;      /* machine name, e.g. "rk_area" */
    const char *title;     /* e.g. "Redlich-Kister area test" */
    const char *source;    /* the published description the test follows */
    const char *criterion; /* e.g. "D < limit" */
    const char *meaning;   /* what a failure usually means, in words */
    bool ran;
    char why_not[PW_CONSISTENCY_REASON_MAX]; /* when !ran: why the data do not allow it */
    double value, limit;   /* NAN when !ran */
    bool pass;             /* false when !ran */
} pw_ctest;

/* Per-point residuals of the point test (interior points, 0 < x1 < 1). */
typedef struct pw_cpoint {
    long line;             /* line in the dataset file */
    double x1, y_exp, y_calc;
    double dy;             /* y_calc - y_exp (NAN without y) */
    double dlnratio;       /* ln(gamma1/gamma2)_calc - ln(gamma1/gamma2)_exp */
    double dT_K;           /* isobaric: T_calc - T (K); NAN for isothermal data */
    double dP_rel;         /* isothermal: (P_calc - P)/P; NAN for isobaric data */
    bool flagged;
    char why[PW_CONSISTENCY_REASON_MAX];
} pw_cpoint;

/* evidence score (weighting after Kang et al.). Structure Q = F_pure x (F1 + F2 + F3 + F4) from Kang et al. (2010);
 * the individual factor formulas are this implementation's reading (docs/consistency.md). */
typedef struct pw_cquality {
    bool ran;
    double F_area, F_point, F_slope, F_dilution, F_pure, Q;
    bool slope_used;       /* false for isobaric data: the sum is then scaled by 4/3 */
    char note[PW_CONSISTENCY_REASON_MAX];
} pw_cquality;

typedef struct pw_consistency_result {
    pw_data_kind kind;
    pw_ctest tests[PW_CTEST_COUNT]; /* indexed by pw_ctest_id */
    /* details of the tests */
    double area_A, area_B;          /* areas above and below the axis (rk_area or herington) */
    int area_degree;                /* degree of the ln(gamma1/gamma2) smoothing polynomial (of
                                       the branch below a bridged gap) */
    /* A bridged two-liquid gap (options.gap_x1): the one-liquid points beside it, the step
     * g(x_b) - g(x_a) of G^E/RT = x1 ln gamma1 + x2 ln gamma2 measured there, which equals the
     * integral of ln(gamma1/gamma2) over the gap, and the degree of the upper branch's
     * polynomial; gap_bridge NAN and area_degree_upper -1 when no gap was bridged. */
    double gap_bridge_x1[2], gap_bridge;
    int area_degree_upper;
    double herington_D, herington_J, herington_theta_K, herington_Tmin_K;
    size_t legendre_terms;          /* chosen number of Legendre terms (0 when not fitted) */
    double legendre_a[PW_CONSISTENCY_MAX_TERMS];
    double legendre_aicc[PW_CONSISTENCY_MAX_TERMS + 1]; /* by number of terms, NAN if not fitted */
    double legendre_rms;            /* rms of the Barker residuals (K, or relative P) */
    double rms_dlnratio;
    int van_ness_index;             /* Van Ness (1995) index 1..10 from rms d ln; 0 when not run */
    double I1, I2, lngamma1_inf, lngamma2_inf; /* kojima_dilution (from g/(x1 x2)) */
    double endpoint_dev[2];         /* x1 = 0 and x1 = 1 ends: P rel. or T [K]; NAN if absent */
    bool areas_at_rounding;         /* A + B at rounding level: D taken as 0 (ideal data) */
    bool slope_at_rounding;         /* sum |ln(gamma1/gamma2)| at rounding level: d taken as 0 */
    /* stated uncertainties and the point_scatter details (NAN / 0 when not used) */
    bool uncertainty_based;         /* a sigma_y was given: the uncertainty-based limits apply */
    double sigma_y_used, sigma_x_used, sigma_T_used_K, sigma_P_used_rel;
    double point_dy_limit_sigma;    /* the 99 % bound on mean |dy| from the sigmas */
    double scatter_chi2;            /* sum of squared normalised residuals (y and T or P) */
    size_t scatter_dof;
    /* points and outliers */
    pw_cpoint *pts;                 /* owned; n_pts entries */
    size_t n_pts, n_flagged;
    pw_cquality quality;
    bool consistent;                /* verdict, rule as in pw_consistency_options.strict_verdict */
    bool primary[PW_CTEST_COUNT];   /* which tests the verdict rested on */
    char reasons[PW_CONSISTENCY_MAX_REASONS][PW_CONSISTENCY_REASON_MAX];
    size_t n_reasons;
} pw_consistency_result;

/* Runs every test that the data allow. c1, c2 are the dataset's components in its order.
 * opt may be NULL for the defaults. Returns PW_OK when the check ran (whatever the verdict);
 * PW_EINVAL for bad options or arguments, PW_EDOM when a vapor pressure cannot be evaluated at
 * a measured state, PW_ENOMEM. err (may be NULL) names the file and line where there is one.
 * On failure out holds nothing to free. The caller frees out with pw_consistency_result_free. */
pw_status pw_consistency_run(const pw_dataset *ds, const pw_component *c1, const pw_component *c2,
                             const pw_consistency_options *opt, pw_consistency_result *out,
                             pw_error *err);

/* Frees out->pts; accepts NULL. */
void pw_consistency_result_free(pw_consistency_result *out);

/* Van Ness (1995) index from the rms of d ln(gamma1/gamma2): 1 for rms <= 0.025, then one more
 * per 0.025, 10 for rms > 0.225. Returns 0 for a negative or non-finite rms. */
int pw_consistency_van_ness_index(double rms_dlnratio);

#ifdef __cplusplus
}
#endif
#endif
