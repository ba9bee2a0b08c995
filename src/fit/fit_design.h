/* Private: information carried by (real or hypothetical) measurements, for measurement planning.
 * Not installed. */
#ifndef PW_FIT_DESIGN_H
#define PW_FIT_DESIGN_H

#include <pinchwise/fit.h>

/* A hypothetical measurement at liquid x1 under the fit's fixed condition: isobaric points get
 * P = the fit's pressure and T, y from the model's bubble point; isothermal ones T = the fit's
 * temperature and P, y from the bubble pressure. Where the fit scores points inside the model's
 * layers by the three-phase state (r->layers_scored, data with three-phase points), the bubble
 * point is the heterogeneous one (pw_bubble_T_het / pw_bubble_P_het). Forwards its status. */
pw_status fit_hypothetical_point(const pw_fit_result *r, double x1, pw_point *pt);

/* Information matrix J^T J of the points pts (n of them, one-liquid measurements; those inside
 * the model's layers weighted as the fit's objective weights them) for the fit's objective,
 * weighted by the fit's sigmas, at the fit's parameters, in the full parameter space and in the parameters'
 * own units (rows and columns of fixed parameters are zero). The fit's covariance is
 * chi2_red * (J^T J)^-1 over its own used points. Forwards the first failing point's status. */
pw_status fit_information(const pw_fit_result *r, const pw_point *pts, size_t n,
                          double info[PW_MAX_PARAMS][PW_MAX_PARAMS]);

#endif
