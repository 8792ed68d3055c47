/* forces.c: gravity, buoyancy and drag on a point mass in a moving fluid.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   dx/dt = v
 *   dv/dt = -g z^ + (rho_f V g / m) z^ - (D / m) (v - w) + F_L / m
 * Newton's second law with Archimedes' buoyancy; D is the drag factor (drag.h) at |v - w|. The lift of a
 * spinning body, F_L = 1/2 rho C_L A |v_rel|^2 along (w x v_rel)/|w x v_rel|, is perpendicular to the
 * relative velocity, on the side toward which the spin carries the air's boundary layer (the Magnus
 * effect; e.g. Nathan, A. M. 2008, "The effect of spin on the flight of a baseball", Am. J. Phys.
 * 76:119, eq. 1, where the same form defines C_L). No added mass, Basset history force or Earth
 * rotation in this model (see docs/models.md).
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
    f->spin_axis[0] = f->spin_axis[1] = f->spin_axis[2] = 0.0;
    f->prepared = 1;
}

void dragarc_forces_spin(dragarc_forces *f, double rate, double tilt, double azimuth)
{
    if (!(rate > 0.0)) {
        f->spin_axis[0] = f->spin_axis[1] = f->spin_axis[2] = 0.0;
        return;
    }
    /* r: horizontal, to the right of the launch direction d = (sin az, cos az, 0); r x d = z^, so spin
     * about r with the body moving along d lifts it. Tilting by t: w^ = cos t r - sin t z^, whose lift
     * (w^ x d) = cos t z^ + sin t r leans to the right for t > 0. */
    double r[3] = {cos(azimuth), -sin(azimuth), 0.0};
    f->spin_axis[0] = cos(tilt) * r[0];
    f->spin_axis[1] = cos(tilt) * r[1];
    f->spin_axis[2] = -sin(tilt);
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
    const double *a = f->spin_axis;
    if (p->lift.model == DRAGARC_LIFT_CONSTANT && (a[0] != 0.0 || a[1] != 0.0 || a[2] != 0.0) && speed > 0.0) {
        double c[3] = {a[1] * rel[2] - a[2] * rel[1], a[2] * rel[0] - a[0] * rel[2], a[0] * rel[1] - a[1] * rel[0]};
        double cn = sqrt(c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
        if (cn > 1e-12 * speed) { /* no lift when the spin axis lies along the relative velocity */
            double k = 0.5 * air.density * p->lift.cl * p->area * speed * speed * inv_m / cn;
            dydt[3] += k * c[0];
            dydt[4] += k * c[1];
            dydt[5] += k * c[2];
        }
    }
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
