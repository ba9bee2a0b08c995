/* Private interface of the fit-file module. */
#ifndef PW_FITFILE_INTERNAL_H
#define PW_FITFILE_INTERNAL_H

#include <jansson.h>
#include <pinchwise/fit.h>

#define PW_FITFILE_FORMAT "pinchwise-fit"
#define PW_FITFILE_VERSION 1

/* The strict second pass of the reader (fitfile_check.c): ranges, types and sizes of every field
 * of root, whose values read_body has put into r. PW_EPARSE naming name and the key. */
pw_status pw_fitfile_check(const json_t *root, const pw_fit_result *r, const char *name,
                           pw_error *err);

#endif
