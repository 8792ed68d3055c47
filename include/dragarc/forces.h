/* forces.h: the equations of motion of a point mass in a moving fluid.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * State y = (x, y, z, vx, vy, vz, w, m), local frame x east, y north, z up (m, m/s), the spin rate w (rad/s)
 * about an axis w^ fixed in space, and the mass of an evaporating drop as a fraction of its launch mass, m / m0
 * (evaporation.h; a fraction, so that the error control sees it at the scale of the other values):
 *   m dv/dt = -m g z^ + rho_f V g z^ - D(|v_rel|) v_rel + F_L,   v_rel = v - u(z - z_ground)
 *   dw/dt   = -w / tau  (launch.spin.decay_time)  or  -k w |v_rel| / r  (projectile.spin_decay_coefficient)
 *   dm/dt   = -pi d D_v Sh drho  while any water is left (projectile.evaporation); d, area and volume follow m
 * gravity, buoyancy (Archimedes), drag (D is the drag factor of drag.h, u the wind) and, for a spinning body
 * with a lift model, the lift F_L = 1/2 rho C_L(S) A |v_rel|^2 (w^ x v_rel) / |w^ x v_rel| (Magnus; lift.h).
 * On a spherical Earth (dragarc_forces_earth; earth.h) the weight is m g0 (R/|r|)^2 toward the centre, r = (x, y,
 * z + R), the Earth's turning adds -2 m Omega x v - m Omega x (Omega x r), the buoyancy is the displaced air's
 * share of gravitation and centrifugal acceleration, and the air and wind are those at the height h = |r| - R;
 * the wind blows horizontally in the frame of the origin.
 */
#ifndef DRAGARC_FORCES_H
#define DRAGARC_FORCES_H

#include "dragarc/atmosphere.h"
#include "dragarc/earth.h"
#include "dragarc/projectile.h"
#include "dragarc/wind.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Values in a state: position (3), velocity (3), spin rate, mass fraction. */
#define DRAGARC_STATE_DIM 8

/* What the right-hand side needs; borrows every pointer. Set it up with dragarc_forces_init, or set the
 * fields and leave `prepared` zero (then what init works out once is worked out on every call). */
typedef struct dragarc_forces {
    const dragarc_projectile *projectile;
    const dragarc_atmosphere *atmosphere;
    const dragarc_wind *wind;
    double gravity;          /* m/s^2 */
    double ground_elevation; /* m above the datum: wind heights are measured from here */
    int prepared;            /* the fields below are valid for the parts borrowed */
    double wind_toward[2];   /* unit vector (east, north) the wind blows toward */
    double inv_mass;         /* 1/kg */
    double spin_axis[3];     /* unit vector of the spin (east, north, up); zero when there is no spin */
    double spin_decay_rate;  /* 1/s: 1 / launch.spin.decay_time, or 0 */
    int evaporating;         /* the body is a water drop whose mass is the state's eighth value */
    double residue_volume;   /* m^3: what stays when the water is gone */
    double relative_humidity; /* of the air around an evaporating drop, 0 to 1 */
    int spherical;           /* a spherical Earth (dragarc_forces_earth); 0: flat, gravity -g z^ */
    double earth_radius;     /* m, the sphere's */
    double omega[3];         /* rad/s, the Earth's rotation (east, north, up); zero when it does not turn */
    double height_cap;       /* m: on the sphere, heights above this see the air and wind there (INFINITY: none) */
} dragarc_forces;

/* What the right-hand side saw at one state, for diagnostics and output. */
typedef struct dragarc_flow {
    dragarc_air air;
    double wind[3];     /* m/s */
    double airspeed;    /* |v_rel|, m/s */
    double mach;
    double reynolds;
    double drag_factor; /* kg/s */
    double drag_coefficient; /* C_D = 2 D / (rho A |v_rel|); NaN where undefined (no air, at rest) */
    double spin_factor;      /* S = r w_perp / |v_rel|; 0 without spin */
    double lift_coefficient; /* C_L(S); 0 without spin or lift model */
    double diameter;         /* m: the projectile's, or an evaporating drop's at this moment */
} dragarc_flow;

/* Borrow the parts and work out once what every evaluation would repeat; call again after changing any. */
void dragarc_forces_init(dragarc_forces *f, const dragarc_projectile *projectile, const dragarc_atmosphere *atmosphere,
                         const dragarc_wind *wind, double gravity, double ground_elevation);

/* The spin axis of a launch with tilt (rad) at azimuth (rad), into axis[3]: with no tilt the axis is
 * horizontal, to the right of the launch direction (backspin: the lift points up); a positive tilt turns it
 * so that the lift leans to the right. */
void dragarc_spin_axis(double tilt, double azimuth, double axis[3]);

/* Spin about the unit vector axis (east, north, up; NULL or zero: no spin), decaying exponentially with
 * e-folding time decay_time (s; 0: not so). The rate itself is the state's seventh value. */
void dragarc_forces_spin(dragarc_forces *f, const double axis[3], double decay_time);

/* An evaporating water drop (projectile.evaporation) in air of this relative humidity (0 to 1; held with height):
 * at each evaluation its temperature from its heat balance in the local air, the vapour density excess at its
 * surface from that, and its residue (evaporation.h). */
void dragarc_forces_evaporation(dragarc_forces *f, double relative_humidity);

/* Fly over this Earth (earth.h; borrowed values are copied): flat changes nothing; on a sphere, gravity falls off
 * with the distance from the centre, the rotation (if any) adds the Coriolis and centrifugal terms, and the air
 * and wind are taken at the height above the sphere, held at `ceiling` (m above the datum; INFINITY: not held)
 * for the trial states of a step that poke above the top of the atmosphere model. */
void dragarc_forces_earth(dragarc_forces *f, const dragarc_earth *earth, double ceiling);

/* dy/dt at state y (DRAGARC_STATE_DIM values) into dydt (as many); fills *flow if not NULL. Returns
 * DRAGARC_OK, or the atmosphere's error (e.g. DRAGARC_ERANGE above 86 km) with err filled. Pure: no I/O, no
 * state. Without spin, y[6] is ignored and dydt[6] = 0; unless the drop evaporates, y[7] is ignored and
 * dydt[7] = 0. */
int dragarc_forces_eval(const dragarc_forces *f, const double y[DRAGARC_STATE_DIM], double dydt[DRAGARC_STATE_DIM],
                        dragarc_flow *flow, dragarc_error *err);

/* Weight less buoyancy at height z (N; positive when the body sinks). */
int dragarc_forces_net_weight(const dragarc_forces *f, double z, double *out, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
