/* forces.c: gravity, buoyancy and drag on a point mass in a moving fluid.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   dx/dt = v
 *   dv/dt = -g z^ + (rho_f V g / m) z^ - (D / m) (v - w)
 * Newton's second law with Archimedes' buoyancy; D is the drag factor (drag.h) at |v - w|. No added
 * mass, Basset history force, lift or Earth rotation in this model (see docs/models.md).
 */
#include <math.h>

#include "dragarc/forces.h"

void dragarc_forces_init(dragarc_forces *f, const dragarc_projectile *projectile, const dragarc_atmosphere *atmosphere,
                         const dragarc_wind *wind, double gravity, double ground_elevation)
{
    f->projectile = projectile;
    f->atmosphere = atmosphere;
    f->wind = wind;
    f->gravity = gravity;
    f->ground_elevation = ground_elevation;
    dragarc_wind_toward(wind->from, &f->wind_toward[0], &f->wind_toward[1]);
    f->inv_mass = 1.0 / projectile->mass;
    f->prepared = 1;
}

int dragarc_forces_eval(const dragarc_forces *f, const double y[6], double dydt[6], dragarc_flow *flow,
                        dragarc_error *err)
{
    const dragarc_projectile *p = f->projectile;
    dragarc_air air;
    int rc = dragarc_atmosphere_eval(f->atmosphere, y[2], &air, err);
    if (rc != DRAGARC_OK)
        return rc;
    double w[3];
    dragarc_wind_eval_toward(f->wind, y[2] - f->ground_elevation, f->prepared ? f->wind_toward : NULL, w);
    double rel[3] = {y[3] - w[0], y[4] - w[1], y[5] - w[2]};
    double speed = sqrt(rel[0] * rel[0] + rel[1] * rel[1] + rel[2] * rel[2]);
    double dfac = dragarc_drag_factor(&p->drag, speed, &air, p->diameter, p->area);
    double inv_m = f->prepared ? f->inv_mass : 1.0 / p->mass;
    double dm = dfac * inv_m;
    double buoy = air.density * p->volume * f->gravity * inv_m;
    dydt[0] = y[3];
    dydt[1] = y[4];
    dydt[2] = y[5];
    dydt[3] = -dm * rel[0];
    dydt[4] = -dm * rel[1];
    dydt[5] = -f->gravity + buoy - dm * rel[2];
    if (flow) {
        flow->air = air;
        flow->wind[0] = w[0], flow->wind[1] = w[1], flow->wind[2] = w[2];
        flow->airspeed = speed;
        flow->mach = speed / air.speed_of_sound;
        flow->reynolds = air.density * speed * p->diameter / air.viscosity;
        flow->drag_factor = dfac;
    }
    return DRAGARC_OK;
}

int dragarc_forces_net_weight(const dragarc_forces *f, double z, double *out, dragarc_error *err)
{
    dragarc_air air;
    int rc = dragarc_atmosphere_eval(f->atmosphere, z, &air, err);
    if (rc != DRAGARC_OK)
        return rc;
    *out = (f->projectile->mass - air.density * f->projectile->volume) * f->gravity;
    return DRAGARC_OK;
}
