/* nozzle.h: a water jet from an orifice: exit speed and flow from the operating pressure.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   v = C_v sqrt(2 dp / rho),     Q = C_d (pi d^2 / 4) sqrt(2 dp / rho)
 * Bernoulli's equation for the jet with a velocity coefficient C_v, and the orifice equation with a discharge
 * coefficient C_d = C_c C_v (contraction times velocity), as in any hydraulics text (e.g. Streeter & Wylie,
 * Fluid Mechanics, the orifice; recalled: a sharp-edged orifice has C_v about 0.97 and C_d about 0.62, a
 * well-rounded nozzle C_v and C_d about 0.95 to 0.99).
 */
#ifndef DRAGARC_NOZZLE_H
#define DRAGARC_NOZZLE_H

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef struct dragarc_nozzle {
    double diameter;              /* m, of the orifice */
    double pressure;              /* Pa, operating pressure above the air's (gauge) */
    double velocity_coefficient;  /* C_v, 0 to 1 */
    double discharge_coefficient; /* C_d, 0 to 1, at most C_v */
    double liquid_density;        /* kg/m^3 */
} dragarc_nozzle;

/* Check the fields; err->field names the bad one ("pressure", "discharge_coefficient", ...). */
int dragarc_nozzle_check(const dragarc_nozzle *n, dragarc_error *err);

/* Jet speed at the nozzle exit (m/s) and volume flow (m^3/s). */
double dragarc_nozzle_exit_speed(const dragarc_nozzle *n);
double dragarc_nozzle_flow(const dragarc_nozzle *n);

#ifdef __cplusplus
}
#endif
#endif
