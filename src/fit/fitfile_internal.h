/* Private interface of the fit-file module. */
#ifndef PW_FITFILE_INTERNAL_H
#define PW_FITFILE_INTERNAL_H

#include <jansson.h>
#include <pinchwise/fit.h>

#define PW_FITFILE_FORMAT "pinchwise-fit"
#define PW_FITFILE_VERSION 1

#endif
