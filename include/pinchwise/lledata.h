/* Measured liquid-liquid tie lines of a binary (the LLE file of `fit --lle`).
 *
 * CSV (libcsv) with the dataset file's "# key: value" metadata lines before the header row:
 * "# components: NAME1, NAME2" is required; "# pressure: VALUE UNIT" is optional and only
 * informational; "# source:" optional; "# sigma_x: VALUE" is the standard uncertainty of a layer
 * mole fraction (default PW_LLE_SIGMA_X_DEFAULT). Header row: T[UNIT], x1_I, x1_II in any order
 * (further columns ignored); each row one tie line, x1_I < x1_II mole fractions of NAME1 in the
 * two layers, strictly between 0 and 1. Instead of x1_I and x1_II the columns w1_I and w1_II give
 * mass fractions of NAME1 (solubility tables often do): the dataset is then marked `mass`, and
 * pw_fit_attach_tie_lines_ex converts them with the components' molar masses (x1 = (w1/M1) /
 * (w1/M1 + (1 - w1)/M2), which keeps the order of the layers). sigma_x is a mole-fraction
 * uncertainty either way. Errors name the file and line. */
#ifndef PINCHWISE_LLEDATA_H
#define PINCHWISE_LLEDATA_H

#include <pinchwise/component.h>
#include <pinchwise/dataset.h>
#include <pinchwise/status.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

/* Default sigma_x of a tie-line composition: 0.005, the upper end of the 0.002-0.005 METHODS2
 * 2.9 suggests (a suggestion of that brief, not a published rule). */
#define PW_LLE_SIGMA_X_DEFAULT 0.005
#define PW_LLE_MAX_ROWS 10000

typedef struct pw_tie_line {
    double T_K, x_I, x_II;
    long line;
} pw_tie_line;

typedef struct pw_lle_dataset {
    char path[PW_PATH_MAX];
    char names[2][PW_NAME_MAX];
    long components_line;      /* the '# components:' line (0: none) */
    double P_Pa;               /* NAN when not given */
    double sigma_x;
    bool sigma_x_given;
    char source[PW_SOURCE_MAX];
    pw_tie_line *rows;
    size_t n;
    bool mass;                 /* the rows hold mass fractions (w1_I, w1_II columns) */
    long header_line;          /* the header row's line */
} pw_lle_dataset;

pw_status pw_lle_dataset_read(const char *path, pw_lle_dataset *out, pw_error *err);
pw_status pw_lle_dataset_parse(const char *buf, size_t len, const char *name, pw_lle_dataset *out,
                               pw_error *err);
/* Swaps the components (x -> 1 - x, layers exchanged), for a file written in the other order. */
void pw_lle_dataset_swap(pw_lle_dataset *d);
void pw_lle_dataset_free(pw_lle_dataset *d);

/* Three-phase points of a VLE set (METHODS2 3.7: a plateau of equal T, or P, and equal y over a
 * range of x): a run of at least 3 mixture points, consecutive in x and spanning at least 0.1
 * (or of 2 points at least 0.3 apart),
 * whose T (isobaric; P relative when isothermal) and y each have a range within 3 sigma
 * (sigma = the stated uncertainty, at least 0.05 K, 0.01 %, 0.002) and show no trend in x beyond
 * the noise (least-squares slope of T or P within 2 standard errors of zero, of y not above 1.645
 * standard errors). Flagged points get flags[i] true. Needs y (returns 0 without). Returns how many
 * points were flagged. Rule, reasons and measured error rates: docs/heterogeneous.md 4. */
size_t pw_three_phase_detect(const pw_point *pts, size_t n, bool isobaric, bool has_y,
                             double sigma_T_K, double sigma_P_rel, double sigma_y, bool *flags);

#ifdef __cplusplus
}
#endif
#endif
