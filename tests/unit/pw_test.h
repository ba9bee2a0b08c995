/* Shared helpers for the cmocka unit tests. */
#ifndef PW_TEST_H
#define PW_TEST_H

#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <cmocka.h>
#include <pinchwise/component.h>
#include <pinchwise/dataset.h>
#include <pinchwise/equilibrium.h>

/* Asserts |got - want| <= rtol*|want| + atol. NaN or Inf in either value fails unless both are
 * the same non-finite value. Prints both numbers, the tolerance and the label on failure. */
void pw_assert_close_impl(double got, double want, double rtol, double atol, const char *label,
                          const char *file, int line);
#define pw_assert_close(got, want, rtol, atol, label) \
    pw_assert_close_impl((got), (want), (rtol), (atol), (label), __FILE__, __LINE__)

/* Absolute path of a file under the source tree (static buffer per call site is not used:
 * the caller passes a buffer). Returns buf. */
const char *pw_test_path(char *buf, size_t len, const char *relative);

/* Switches GSL's aborting error handler off; call once at the start of every test main(). */
void pw_test_init(void);

/* An Antoine component as a component file would give it: log base, P and T units as written
 * there, validity range in K (NAN for none). */
pw_component pw_test_antoine(const char *name, double A, double B, double C, pw_log_base log,
                             const char *P_unit, const char *T_unit, double T_min_K,
                             double T_max_K);

/* Smith, Van Ness & Abbott, 7th ed. (2005), Table B.2 rows, ln(P/kPa) = A - B/(t/C + C), for
 * water, 1-propanol (confirmed), acetone and methanol (from memory; methods brief 2.5). Any other
 * name fails the test. No validity range. */
pw_component pw_test_svna(const char *name);

/* Reads the shipped component library (datasets/components.csv) into lib, for a cmocka setup:
 * 0 on success, -1 (lib freed, the reason printed) on failure. */
int pw_test_read_complib(pw_complib *lib);

/* NRTL ln gamma (Renon & Prausnitz 1968) at x1 for tau12, tau21 and alpha, written out here,
 * independently of src/thermo, for tests that need the model outside the library. */
void pw_test_nrtl_ln_gamma(double tau12, double tau21, double alpha, double x1, double lg[2]);

/* tau12, tau21 of the NRTL above with which layers x_I and x_II coexist (equal activities of
 * both components), by GSL's hybrid solver to a residual of 1e-13, started from the nearly
 * immiscible estimate tau21 ~ ln(1/x_I), tau12 ~ ln(1/(1 - x_II)); fails the test otherwise. */
void pw_test_nrtl_tau_from_layers(double x_I, double x_II, double alpha, double tau[2]);

/* Invented isobaric data at 101.325 kPa: n points of system s from x1 0.05 to 0.95 (bubble
 * points, with small deterministic deviations in y and T), stated sigmas, lines 4.. ; for
 * round-trip tests. The caller frees with pw_dataset_free. */
void pw_test_invented_isobaric(pw_dataset *ds, const pw_system *s, size_t n);

#endif
