/* Measured binary VLE data sets (the dataset CSV format of the project's interface).
 *
 * Lines before the header row that start with '#' are metadata "# key: value" (keys are
 * case-insensitive). Required: "components: NAME1, NAME2" and exactly one of
 * "pressure: VALUE UNIT" (isobaric T-x-y) or "temperature: VALUE UNIT" (isothermal P-x-y, P-x).
 * Optional: "source: text"; pinchwise also reads the uncertainty keys
 *     sigma_T: VALUE UNIT      (temperature difference, K or C; default 0.1 K)
 *     sigma_P: VALUE UNIT|%    (absolute pressure or percent of P; default 0.1 %)
 *     sigma_y: VALUE           (vapor mole fraction; default 0.004)
 *     sigma_x: VALUE           (liquid mole fraction; default 0.001)
 * Header row: x1, optional y1, and T[UNIT] (isobaric) or P[UNIT] (isothermal), in any order;
 * further columns are ignored. Instead of x1 and y1, w1 and wy1 give mass fractions of component 1
 * (converted later with pw_dataset_to_mole). T and P columns may also be written "T [UNIT]",
 * "T (UNIT)" as spreadsheets export them. A UTF-8 byte-order mark and CRLF line ends are accepted. */
#ifndef PINCHWISE_DATASET_H
#define PINCHWISE_DATASET_H

#include <pinchwise/component.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef enum { PW_DATA_ISOBARIC = 0, PW_DATA_ISOTHERMAL = 1 } pw_data_kind;

/* One measured point. Both T_K and P_Pa are filled: the measured one from the row, the fixed
 * one from the metadata. y1 is NAN when the data set has no y column. */
typedef struct pw_point {
    double x1, y1, T_K, P_Pa;
    long line; /* line number in the file (1-based), the row number users quote */
} pw_point;

typedef struct pw_dataset {
    char path[PW_PATH_MAX];
    char names[2][PW_NAME_MAX];
    pw_data_kind kind;
    double P_fixed_Pa; /* isobaric: the pressure; isothermal: NAN */
    double T_fixed_K;  /* isothermal: the temperature; isobaric: NAN */
    bool has_y;
    char source[PW_SOURCE_MAX];
    double sigma_T_K, sigma_P_rel, sigma_P_abs_Pa, sigma_y, sigma_x; /* sigma_P: one is NAN */
    bool sigma_y_stated, sigma_x_stated; /* the file's metadata gave them (else defaults) */
    char T_unit[PW_UNIT_MAX], P_unit[PW_UNIT_MAX]; /* units the file used for the column */
    pw_point *pts;
    size_t n;
    unsigned char sha256[32]; /* of the file's bytes */
    /* Composition columns given by mass (w1, wy1): pts hold mass fractions of component 1 until
     * pw_dataset_to_mole (composition.h) converts them with the molar masses; the fitting and
     * consistency code refuses a dataset with either flag still set. */
    bool mass_x, mass_y;
    long composition_line; /* the header line, for messages about the composition columns */
    long components_line;  /* the '# components:' line, for messages about the names (0: none) */
} pw_dataset;

/* Limits of the reader (see docs/inputs.md): a dataset file holds at most PW_DATASET_MAX_POINTS
 * data rows and PW_DATASET_MAX_BYTES bytes; a measured T lies in [PW_DATASET_T_MIN_K,
 * PW_DATASET_T_MAX_K] and a measured or fixed P in [PW_DATASET_P_MIN_PA, PW_DATASET_P_MAX_PA].
 * The text must be valid UTF-8. Larger or stranger files are refused with a message. */
#define PW_DATASET_MAX_POINTS 100000
#define PW_DATASET_MAX_BYTES (64u * 1024u * 1024u)
#define PW_DATASET_T_MIN_K 1.0
#define PW_DATASET_T_MAX_K 5000.0
#define PW_DATASET_P_MIN_PA 1e-6
#define PW_DATASET_P_MAX_PA 1e10

/* Reads and validates a dataset file. On failure ds is left empty (nothing to free) and err
 * says "what is wrong (what was expected)" with file and line. Rejects: mole fractions outside
 * [0,1], y on some rows only, non-positive or non-finite T/P, NaN/Inf, duplicate or unknown
 * required columns, unknown units, missing or contradictory metadata, no data rows, invalid
 * UTF-8, and anything beyond the limits above. */
pw_status pw_dataset_read(const char *path, pw_dataset *ds, pw_error *err);

/* Same from a buffer; name is used as the file name in messages and in ds->path. */
pw_status pw_dataset_parse(const char *buf, size_t len, const char *name, pw_dataset *ds,
                           pw_error *err);

/* Frees the points; ds is left empty. Accepts NULL. */
void pw_dataset_free(pw_dataset *ds);

/* The lowest and highest temperature of ds's points (points whose T is not finite are passed
 * over). PW_EINVAL for NULL arguments or a data set without a finite temperature (empty).
 * In src/fit/fit_ranges.c with the other range checks. */
pw_status pw_dataset_T_range(const pw_dataset *ds, double *T_lo_K, double *T_hi_K);

/* The SHA-256 of a buffer (libmd) as 32 bytes, and as 64 lowercase hex chars + NUL. */
void pw_sha256(const void *buf, size_t len, unsigned char out[32]);
void pw_sha256_hex(const unsigned char digest[32], char out[65]);

#ifdef __cplusplus
}
#endif
#endif
