/* Private header of the consistency module: the prepared data shared by the tests, the
 * Legendre G^E model (internal pw_model_type) and small numeric helpers. */
#ifndef PW_CONSISTENCY_INTERNAL_H
#define PW_CONSISTENCY_INTERNAL_H

#include <pinchwise/consistency.h>
#include <pinchwise/model.h>

/* One interior measured point (0 < x1 < 1) with the quantities every test uses.
 * lng[] and lnratio are NAN when the point has no usable y (no y column, or y at 0 or 1). */
typedef struct cs_point {
    long line;
    double x1, y1, T_K, P_Pa;
    double Psat_Pa[2], dlnPsat_dT[2]; /* at the measured (or fixed) T */
    double lng[2];                    /* ln gamma_i = ln(y_i P / (x_i P_i^sat)) */
    double lnratio;                   /* ln(gamma1/gamma2) */
    double gE;                        /* x1 ln gamma1 + x2 ln gamma2 */
} cs_point;

typedef struct cs_data {
    const pw_dataset *ds;
    const pw_component *comp[2];
    const pw_consistency_options *opt;
    cs_point *in;      /* interior points, in file order */
    size_t n_in;
    size_t n_gamma;    /* how many of them have finite lng */
} cs_data;

/* Fills d from the dataset; PW_EDOM (err names file and line) when a vapor pressure fails. */
pw_status pw_cs_prepare(cs_data *d, const pw_dataset *ds, const pw_component *c1,
                        const pw_component *c2, const pw_consistency_options *opt, pw_error *err);
void pw_cs_release(cs_data *d);

/* Arrays x1 and lnratio (or g/(x1 x2)) of the points with finite gammas; caller frees. */
pw_status pw_cs_gamma_arrays(const cs_data *d, double **x, double **lnratio, double **g_x1x2,
                             size_t *n);

/* Least-squares polynomial c[0] + c[1] x + ... + c[deg] x^deg (GSL gsl_multifit_linear).
 * PW_ETOOFEW when n <= deg, PW_ESINGULAR when GSL fails. */
pw_status pw_cs_polyfit(const double *x, const double *y, size_t n, int deg, double *c);
double pw_cs_polyval(const double *c, int deg, double x);

/* Degree used for smoothing n points: 4 for n >= 8, 3 for n >= 5, else -1 (too few). */
int pw_cs_smoothing_degree(size_t n);

/* The tests; each fills its pw_ctest (ran/why_not included) and its detail fields of r. */
pw_status pw_cs_area_test(const cs_data *d, pw_consistency_result *r);
pw_status pw_cs_herington_test(const cs_data *d, pw_consistency_result *r);
pw_status pw_cs_point_test(const cs_data *d, pw_consistency_result *r);
pw_status pw_cs_dilution_tests(const cs_data *d, pw_consistency_result *r);
pw_status pw_cs_endpoint_test(const cs_data *d, pw_consistency_result *r);
void pw_cs_quality(const cs_data *d, pw_consistency_result *r);

/* The stated-uncertainty part of the point test (consistency_scatter.c): runs after
 * pw_cs_point_test, tightens the legendre_point limit and fills point_scatter. */
pw_status pw_cs_scatter_test(const cs_data *d, pw_consistency_result *r);

/* y1 and the bubble quantity (P in Pa, isothermal; T in K, isobaric) of the Legendre series
 * with `terms` coefficients a at point q with its x1 replaced by x1 (consistency_point.c). */
pw_status pw_cs_legendre_bubble(const cs_data *d, size_t terms, const double *a,
                                const cs_point *q, double x1, double *y1, double *calc);

/* Rounding level of a sum of |values| whose largest magnitude is vmax, over n values:
 * 1000 n DBL_EPSILON (1 + vmax). Below it a ratio of such sums is noise (ideal data). */
double pw_cs_rounding_level(size_t n, double vmax);
void pw_cs_outliers(const cs_data *d, pw_consistency_result *r);

/* Signed area of the polynomial over [0, 1]: A = integral of its positive part, B = |integral
 * of its negative part| (real roots from gsl_poly_complex_solve). */
pw_status pw_cs_poly_areas(const double *c, int deg, double *A, double *B);
/* The same over [a, b]. */
pw_status pw_cs_poly_areas_on(const double *c, int deg, double a, double b, double *A, double *B);

/* Legendre series G^E/RT = x1 x2 sum_k a_k L_k(2 x1 - 1), temperature-independent (H^E = 0),
 * with 1..PW_CONSISTENCY_MAX_TERMS terms: pw_cs_legendre_model(n) is the descriptor with n
 * parameters a0..a_{n-1}, NULL outside 1..5. */
const pw_model_type *pw_cs_legendre_model(size_t n_terms);
/* Reference temperature of the series' 1/T form on isobaric data: the coefficients are G^E/RT
 * at this temperature (docs/consistency.md). */
#define PW_CS_LEGENDRE_T_REF_K 350.0

/* Median and the robust standard deviation 1.4826 * MAD of the finite values (NAN if none). */
void pw_cs_robust(const double *v, size_t n, double *median, double *sd);

/* Sets a test's static strings. */
void pw_cs_test_init(pw_ctest *t, pw_ctest_id id);
void pw_cs_not_run(pw_ctest *t, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

#endif
