/* Test systems for the design-grade column tests. An ideal liquid (Margules with A12 = A21 = 0,
 * so also H^E = 0) whose two Antoine equations share B and C has the constant relative volatility
 * alpha = exp(A1 - A2) at every temperature (closed forms: McCabe-Thiele stepping, Underwood
 * 1948, Fenske 1932). The Antoine constants are invented for the tests. */
#ifndef PW_TEST_DESIGN_SYSTEMS_H
#define PW_TEST_DESIGN_SYSTEMS_H

#include "pw_test.h"

#include <math.h>
#include <pinchwise/equilibrium.h>
#include <string.h>

static inline pw_system design_ideal_system(double alpha)
{
    pw_system s;
    memset(&s, 0, sizeof s);
    s.comp[0] = pw_test_antoine("light (invented)", 14.0 + log(alpha), 3000.0, -50.0, PW_LN, "kPa",
                                "K", 250.0, 500.0);
    s.comp[1] =
        pw_test_antoine("heavy (invented)", 14.0, 3000.0, -50.0, PW_LN, "kPa", "K", 250.0, 500.0);
    s.model = &pw_model_margules;
    s.T_ref_K = 350.0;
    return s;
}

/* y* and its inverse for constant relative volatility. */
static inline double design_crv_y(double a, double x)
{
    return a * x / (1.0 + (a - 1.0) * x);
}
static inline double design_crv_x(double a, double y)
{
    return y / (a - (a - 1.0) * y);
}

#endif
