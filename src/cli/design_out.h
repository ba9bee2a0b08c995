/* Text of the design-grade column's results (design rows, stage profiles), shared by reflux
 * and rate. Renders only; the JSON documents are the library's (pinchwise/design_doc.h). */
#ifndef CLI_DESIGN_OUT_H
#define CLI_DESIGN_OUT_H

#include <pinchwise/design.h>
#include <pinchwise/units.h>

/* The design table as text on stdout. */
void cli_design_print(const pw_design_table *t);

/* A stage profile as text on stdout, temperatures in the display units u. */
void cli_profile_print(const pw_profile *p, const pw_display_units *u);

#endif
