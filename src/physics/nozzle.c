/* nozzle.c: jet speed and flow of an orifice (Bernoulli's equation and the orifice equation).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   v = C_v sqrt(2 dp / rho),   Q = C_d A sqrt(2 dp / rho),   A = pi d^2 / 4
 */
#include <math.h>

#include "core/constants.h"
#include "dragarc/nozzle.h"

int dragarc_nozzle_check(const dragarc_nozzle *n, dragarc_error *err)
{
    if (!(n->diameter > 0.0 && n->diameter <= 0.1))
        return dragarc_error_set(err, DRAGARC_EINVAL, "diameter", "must be above 0 and at most 0.1 m (got %g)",
                                 n->diameter);
    if (!(n->pressure > 0.0 && n->pressure <= 2e7))
        return dragarc_error_set(err, DRAGARC_EINVAL, "pressure", "must be above 0 and at most 200 bar (got %g Pa)",
                                 n->pressure);
    if (!(n->velocity_coefficient > 0.0 && n->velocity_coefficient <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "velocity_coefficient", "must be above 0 and at most 1 (got %g)",
                                 n->velocity_coefficient);
    if (!(n->discharge_coefficient > 0.0 && n->discharge_coefficient <= n->velocity_coefficient))
        return dragarc_error_set(err, DRAGARC_EINVAL, "discharge_coefficient",
                                 "must be above 0 and at most the velocity coefficient %g (C_d = C_c C_v) (got %g)",
                                 n->velocity_coefficient, n->discharge_coefficient);
    if (!(n->liquid_density > 0.0 && isfinite(n->liquid_density)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "liquid_density", "must be positive (got %g)", n->liquid_density);
    return DRAGARC_OK;
}

double dragarc_nozzle_exit_speed(const dragarc_nozzle *n)
{
    return n->velocity_coefficient * sqrt(2.0 * n->pressure / n->liquid_density);
}

double dragarc_nozzle_flow(const dragarc_nozzle *n)
{
    return n->discharge_coefficient * 0.25 * DRAGARC_PI * n->diameter * n->diameter *
           sqrt(2.0 * n->pressure / n->liquid_density);
}
