/* Private interface of the fit-file module. */
#ifndef PW_FITFILE_INTERNAL_H
#define PW_FITFILE_INTERNAL_H

#include <jansson.h>
#include <pinchwise/fit.h>

#define PW_FITFILE_FORMAT "pinchwise-fit"
#define PW_FITFILE_VERSION 1

/* Reads the optional "convergence" object into r (fit_class, identifiable, weak_dir,
 * stderr_meaningful, sv_ratio, runaway_param) and checks it against "converged", which r must
 * already hold with the parameters and standard errors. A file without the object (written
 * before it existed) gets the class its "converged" and stop reason imply. false with a
 * message in why (naming the key) when the object is malformed or contradicts "converged". */
bool pw_fitfile_read_convergence(const json_t *root, pw_fit_result *r, char *why, size_t n);

/* The strict second pass of the reader (fitfile_check.c): ranges, types and sizes of every field
 * of root, whose values read_body has put into r. PW_EPARSE naming name and the key. */
pw_status pw_fitfile_check(const json_t *root, const pw_fit_result *r, const char *name,
                           pw_error *err);

/* The fit file's document with a placeholder string where the points' array goes (for
 * documents that leave the "data" block out, and for the writer, which writes the points
 * itself). NULL on allocation failure. */
json_t *pw_fitfile_json_without_points(const pw_fit_result *r);

#endif
