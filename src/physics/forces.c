/* forces.c: gravity, buoyancy and drag on a point mass in a moving fluid.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   dx/dt = v
 *   dv/dt = -g z^ + (rho_f V g / m) z^ - (D / m) (v - u) + F_L / m
 *   dw/dt = -w / tau - k w |v - u| / r
 * Newton's second law with Archimedes' buoyancy; D is the drag factor (drag.h) at |v - u|, u the wind. The
 * lift of a spinning body, F_L = 1/2 rho C_L A |v_rel|^2 along (w x v_rel)/|w x v_rel|, is perpendicular to
 * the relative velocity, on the side toward which the spin carries the air's boundary layer (the Magnus
 * effect; e.g. Nathan, A. M. 2008, "The effect of spin on the flight of a baseball", Am. J. Phys. 76:119,
 * eq. 1, where the same form defines C_L). C_L depends on the spin factor S = r w_perp / |v_rel| (lift.h).
 * The spin axis stays fixed in space (the ball is a gyroscope: aerodynamic torques about other axes are
 * neglected); the rate decays exponentially (an e-folding time tau) or by the air's friction torque,
 * dw/dt = -k w v / r (Smits, A. J. & Smith, D. R. 1994, "A new aerodynamic model of a golf ball in flight",
 * Science and Golf II, 340-347, k about 2e-5 for a golf ball, as used by Penner, A. R. 2001, "The physics of
 * golf: the optimum loft of a driver", Am. J. Phys. 69:563; recalled). No added mass or Basset history force in
 * this model (see docs/models.md).
 * On a spherical Earth (earth.h), with r = (x, y, z + R) from the centre and Omega the Earth's rotation in the local
 * frame (zero when it does not turn):
 *   dv/dt = (1 - rho_f V / m) (-g0 R^2 r / |r|^3 - Omega x (Omega x r)) - 2 Omega x v - (D / m)(v - u) + F_L / m
 * the equation of motion in a frame turning at the constant rate Omega about the Earth's centre (Landau, L. D. &
 * Lifshitz, E. M. 1976, Mechanics, 3rd ed., Pergamon, section 39, eq. 39.7; recalled), v the velocity relative
 * to the Earth. The buoyancy is that of air at rest on the turning Earth, whose pressure gradient balances both the
 * gravitation and the centrifugal acceleration; the air's state and the wind u are those at h = |r| - R.
 */
#include <math.h>

#include "core/constants.h"
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
    f->spherical = 0;
    f->earth_radius = 0.0;
    f->omega[0] = f->omega[1] = f->omega[2] = 0.0;
    f->height_cap = INFINITY;
    f->prepared = 1;
}

void dragarc_forces_earth(dragarc_forces *f, const dragarc_earth *earth, double ceiling)
{
    f->spherical = earth->model == DRAGARC_EARTH_SPHERICAL;
    f->earth_radius = f->spherical ? earth->radius : 0.0;
    dragarc_earth_omega(earth, f->omega);
    f->height_cap = f->spherical ? ceiling : INFINITY;
}

void dragarc_spin_axis(double tilt, double azimuth, double axis[3])
{
    /* r: horizontal, to the right of the launch direction d = (sin az, cos az, 0); r x d = z^, so spin
     * about r with the body moving along d lifts it. Tilting by t: w^ = cos t r - sin t z^, whose lift
     * (w^ x d) = cos t z^ + sin t r leans to the right for t > 0. */
    double r[3] = {cos(azimuth), -sin(azimuth), 0.0};
    axis[0] = cos(tilt) * r[0];
    axis[1] = cos(tilt) * r[1];
    axis[2] = -sin(tilt);
}

void dragarc_forces_spin(dragarc_forces *f, const double axis[3], double decay_time)
{
    for (int i = 0; i < 3; i++)
        f->spin_axis[i] = axis ? axis[i] : 0.0;
    f->spin_decay_rate = decay_time > 0.0 ? 1.0 / decay_time : 0.0;
}

void dragarc_forces_evaporation(dragarc_forces *f, double relative_humidity)
{
    const dragarc_projectile *p = f->projectile;
    f->evaporating = 1;
    f->relative_humidity = relative_humidity;
    f->residue_volume = p->evaporation.nonvolatile_fraction * p->volume;
}

int dragarc_forces_eval(const dragarc_forces *f, const double y[DRAGARC_STATE_DIM], double dydt[DRAGARC_STATE_DIM],
                        dragarc_flow *flow, dragarc_error *err)
{
    const dragarc_projectile *p = f->projectile;
    dragarc_air air;
    double z = y[2]; /* the height the air and wind are taken at */
    if (f->spherical)
        z = fmin(dragarc_earth_height(f->earth_radius, y), f->height_cap);
    int rc = dragarc_atmosphere_eval(f->atmosphere, z, &air, err);
    if (rc != DRAGARC_OK)
        return rc;
    double w[3];
    dragarc_wind_eval_toward(f->wind, z - f->ground_elevation, f->prepared ? f->wind_toward : NULL, w);
    double rel[3] = {y[3] - w[0], y[4] - w[1], y[5] - w[2]};
    double speed = sqrt(rel[0] * rel[0] + rel[1] * rel[1] + rel[2] * rel[2]);
    double inv_m = f->prepared ? f->inv_mass : 1.0 / p->mass;
    double diameter = p->diameter, area = p->area, volume = p->volume, dmass = 0.0;
    if (f->evaporating) {
        /* The drop keeps its density (water and residue alike): its size follows its mass. */
        /* y[7]: the mass as a fraction of the launch mass. The step that ends the evaporation (where dm/dt drops to
         * 0) may leave it below the residue by about the integration tolerance; the drop is never smaller. */
        volume = fmax(y[7] * p->volume, f->residue_volume);
        diameter = cbrt(6.0 / DRAGARC_PI * volume);
        area = 0.25 * DRAGARC_PI * diameter * diameter;
        inv_m = 1.0 / (volume * p->density);
        if (volume > f->residue_volume) {
            /* the drop's temperature from its heat balance in the air around it, then the vapour it loses */
            double re = air.density * speed * diameter / air.viscosity, ts;
            double dv = dragarc_vapour_diffusivity(air.temperature, air.pressure);
            double ratio = dragarc_heat_to_mass_ratio(re, air.density, air.viscosity, air.temperature, dv);
            if ((rc = dragarc_drop_temperature(air.temperature, air.pressure, f->relative_humidity, ratio, &ts, err)) !=
                DRAGARC_OK)
                return rc;
            dmass = dragarc_evaporation_rate(diameter, re, air.density, air.viscosity, dv,
                                             dragarc_vapour_density_excess(ts, air.temperature, f->relative_humidity));
        }
    }
    /* The spin first: the spin factor S sets the lift and may set the drag (a spin_table). */
    const double *a = f->spin_axis, spin = y[6];
    double S = 0.0, cl = 0.0, lift_k = 0.0, c[3] = {0.0, 0.0, 0.0}, dspin = 0.0;
    if ((a[0] != 0.0 || a[1] != 0.0 || a[2] != 0.0) && spin > 0.0) {
        const double radius = 0.5 * diameter;
        dspin = -spin * (f->spin_decay_rate + p->spin_decay_coefficient * speed / radius);
        if (speed > 0.0) {
            c[0] = a[1] * rel[2] - a[2] * rel[1], c[1] = a[2] * rel[0] - a[0] * rel[2], c[2] = a[0] * rel[1] - a[1] * rel[0];
            double cn = sqrt(c[0] * c[0] + c[1] * c[1] + c[2] * c[2]);
            if (cn > 1e-12 * speed) { /* no lift, and no S, when the spin axis lies along the relative velocity */
                S = radius * spin * cn / (speed * speed); /* r w_perp / |v_rel|, w_perp = w |w^ x v_rel^| */
                if (p->lift.model != DRAGARC_LIFT_NONE) {
                    cl = dragarc_lift_coefficient(&p->lift, S);
                    lift_k = 0.5 * air.density * cl * area * speed * speed * inv_m / cn;
                }
            }
        }
    }
    double dfac = dragarc_drag_factor_spin(&p->drag, speed, &air, diameter, area, S);
    double dm = dfac * inv_m;
    double buoy = air.density * volume * f->gravity * inv_m;
    dydt[0] = y[3];
    dydt[1] = y[4];
    dydt[2] = y[5];
    if (!f->spherical) {
        dydt[3] = -dm * rel[0] + lift_k * c[0];
        dydt[4] = -dm * rel[1] + lift_k * c[1];
        dydt[5] = -f->gravity + buoy - dm * rel[2] + lift_k * c[2];
    } else {
        const double R = f->earth_radius, *om = f->omega, *v = y + 3;
        const double r[3] = {y[0], y[1], y[2] + R};
        const double rn2 = r[0] * r[0] + r[1] * r[1] + r[2] * r[2], rn = sqrt(rn2);
        const double gk = -f->gravity * R * R / (rn2 * rn);    /* gravitation gk r */
        const double om2 = om[0] * om[0] + om[1] * om[1] + om[2] * om[2];
        const double omr = om[0] * r[0] + om[1] * r[1] + om[2] * r[2];
        const double cor[3] = {-2.0 * (om[1] * v[2] - om[2] * v[1]), -2.0 * (om[2] * v[0] - om[0] * v[2]),
                               -2.0 * (om[0] * v[1] - om[1] * v[0])};
        const double sink = 1.0 - air.density * volume * inv_m; /* weight less buoyancy, per unit weight */
        for (int i = 0; i < 3; i++) {
            double cf = om2 * r[i] - om[i] * omr; /* -Omega x (Omega x r) */
            dydt[3 + i] = sink * (gk * r[i] + cf) + cor[i] - dm * rel[i] + lift_k * c[i];
        }
    }
    dydt[6] = dspin;
    dydt[7] = dmass / p->mass;
    if (flow) {
        flow->air = air;
        flow->wind[0] = w[0], flow->wind[1] = w[1], flow->wind[2] = w[2];
        flow->airspeed = speed;
        flow->mach = speed / air.speed_of_sound;
        flow->reynolds = air.density * speed * diameter / air.viscosity;
        flow->drag_factor = dfac;
        flow->drag_coefficient = air.density > 0.0 && speed > 0.0 ? 2.0 * dfac / (air.density * area * speed) : NAN;
        flow->diameter = diameter;
        flow->spin_factor = S;
        flow->lift_coefficient = cl;
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
