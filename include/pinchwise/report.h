/* Self-contained HTML report of a fit (and optionally a column), with the plots as inline SVG.
 *
 * The report holds: provenance (data file name and SHA-256, program version, date), the plots
 * (x-y diagram, T-x-y or P-x-y, residuals, ln gamma), the fit tables (parameters with standard
 * errors, 95 % intervals and correlations; deviations; ln gamma at infinite dilution; liquid-split
 * screen; distinct minima), the consistency tests of the measured points, the azeotropes of the
 * model, and with a column specification the reflux and stage design table, followed by the
 * cautions. The numbers come from the library (what to draw: pinchwise/drawing.h; the
 * assessments); the report only renders them. The caller passes plain inputs. Nothing in the page is fetched from anywhere. See docs/report.md.
 *
 * Lifecycle: pw_report_build -> pw_report_save_html / _save_svg / _save_csv -> pw_report_free.
 * All files are written atomically (temporary file beside the target, then moved into place);
 * without force an existing file is never replaced (PW_EEXIST). The library never prints. */
#ifndef PINCHWISE_REPORT_H
#define PINCHWISE_REPORT_H

#include <pinchwise/column.h>
#include <pinchwise/fit.h>
#include <pinchwise/status.h>
#include <pinchwise/uncertainty.h>
#include <pinchwise/units.h>
#include <stdbool.h>
#include <stddef.h>

#ifdef __cplusplus
extern "C" {
#endif

typedef struct pw_report_input {
    const pw_fit_result *fit;      /* required; borrowed during pw_report_build only */
    const char *fit_path;          /* the fit file's name as the user gave it (may be NULL) */
    const pw_column_spec *column;  /* NULL: no column section */
    double column_P_Pa;            /* column pressure, Pa (required with column) */
    double operating_factor;       /* R / R_min of the drawn operating line; 0 = 1.3 */
    const char *date_utc;          /* ISO 8601 date shown as "made on"; NULL = now */
    bool uncertainty;              /* add the fit's parameter uncertainty: 95 % intervals of the
                                      azeotropes, and with a column the "how sure" table (R_min,
                                      boil-up, stages at the operating factor, feasibility share,
                                      where to measure next) and the band of sampled equilibrium
                                      curves near the limiting pinch (one more plot) */
    pw_unc_options unc;            /* draws, seed, progress callback (with uncertainty) */
    size_t band_curves;            /* sampled curves in the band plot; 0 = 40 */
    const pw_fit_result *const *others; /* other models fitted to the same data (may be NULL):
                                      the page ranks all by AICc beside their azeotrope and,
                                      with a column, their R_min */
    size_t n_others;
    bool energy;                   /* with a column: add the energy-balance column (R_min, pinch,
                                      design rows with condenser and reboiler duties) from the
                                      fit's heat data; missing data are named in the page */
    double decanter_T_K;           /* with a column whose targets cross a heterogeneous
                                      azeotrope: the decanter scheme's decanter temperature (0:
                                      at the three-phase temperature; a cooled decanter below it,
                                      as decanter --decanter-temperature) */
    pw_display_units units;        /* units of the temperatures and pressures shown (page, plots,
                                      CSV headers say theirs); default K and kPa */
} pw_report_input;

/* Plain defaults: everything NULL/0, unc = pw_unc_default_options(), units K and kPa. */
pw_report_input pw_report_default_input(void);

typedef struct pw_report pw_report;

/* Computes the curves, tables and plots. PW_EINVAL for a missing fit, a column spec without a
 * pressure, an operating factor <= 1, or a spec with the feed not strictly between the
 * products in [0, 1] (either direction: column_direction.h); PW_ENOMEM.
 * Equilibrium solves that fail at single points leave gaps in the curves, not errors; an
 * infeasible column is reported in the page, not as an error. On success *out is owned by the
 * caller (pw_report_free); on failure *out is NULL and err says why. */
pw_status pw_report_build(const pw_report_input *in, pw_report **out, pw_error *err);

/* Number of plots in the report (as in the page and in the --svg folder). */
size_t pw_report_plot_count(const pw_report *rep);

/* The page as text (owned by rep). */
const char *pw_report_html(const pw_report *rep);

/* Writes the page to path. PW_EEXIST when path exists and force is false, PW_EIO otherwise. */
pw_status pw_report_save_html(const pw_report *rep, const char *path, bool force, pw_error *err);

/* Writes each plot as its own standalone .svg file into dir (created if missing; parent must
 * exist). *n_files (may be NULL) receives how many were written. Without force nothing is
 * written when any target exists (PW_EEXIST names it). */
pw_status pw_report_save_svg(const pw_report *rep, const char *dir, bool force, size_t *n_files,
                             pw_error *err);

/* Writes the curves and points behind the plots as CSV files into dir (same rules as _svg). */
pw_status pw_report_save_csv(const pw_report *rep, const char *dir, bool force, size_t *n_files,
                             pw_error *err);

/* Checks, before anything is written, that none of the files the three save functions would
 * write exists (html_path, svg_dir and csv_dir may each be NULL to leave them out): PW_EEXIST
 * naming the first one found. Use it without force so a refusal leaves no partial output. */
pw_status pw_report_check_targets(const pw_report *rep, const char *html_path, const char *svg_dir,
                                  const char *csv_dir, pw_error *err);

/* Adds the page (html_path), the plots (svg_dir/<name>.svg) and the curves (csv_dir/<name>.csv)
 * to an output set (pinchwise/fileio.h); each of the three may be NULL. Nothing is in place
 * before pw_outset_commit, which writes all of them or none; a folder the set created is removed
 * again when not committed. The save functions above are one-set wrappers of this. */
struct pw_outset;
pw_status pw_report_stage(const pw_report *rep, struct pw_outset *set, const char *html_path,
                          const char *svg_dir, const char *csv_dir, pw_error *err);

/* Frees rep; accepts NULL. */
void pw_report_free(pw_report *rep);

/* Convenience: build and save the page in one call; *n_plots (may be NULL) gets the plot count. */
pw_status pw_report_write(const char *path, const pw_report_input *in, bool force, size_t *n_plots,
                          pw_error *err);

#ifdef __cplusplus
}
#endif
#endif
