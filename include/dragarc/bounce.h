/* bounce.h: a rigid ball landing on flat, horizontal ground: the bounce and the roll-out.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Local frame x east, y north, z up; the ground is the plane z = ground elevation with normal n = z^.
 * Impact (instantaneous, rigid sphere of radius r and moment of inertia I = alpha m r^2): the normal
 * velocity reverses with restitution e; the horizontal impulse is Coulomb friction against the slip of
 * the contact point u = v_t - r w x n, either sliding throughout (|J_t| = mu (1+e) m |v_z|) or gripping
 * (the slip leaves as -e_t u; e_t = 0: the ball leaves rolling). Roll-out: sliding friction mu g until the
 * contact point stops, then a constant rolling deceleration mu_r g. Equations and sources: src/physics/
 * bounce.c and docs/models.md ("Bounce and roll"). Pure functions on doubles: no I/O, no state.
 */
#ifndef DRAGARC_BOUNCE_H
#define DRAGARC_BOUNCE_H

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* alpha = I / (m r^2) of a uniform solid sphere and of a thin spherical shell (the largest value a
 * sphere whose density depends only on the radius can have: all its mass at r). */
#define DRAGARC_INERTIA_SOLID 0.4
#define DRAGARC_INERTIA_SHELL (2.0 / 3.0)

/* The ground as a bouncing ball sees it. Plain data; nothing to free. */
typedef struct dragarc_surface {
    double restitution;            /* e, 0..1: rebound over incoming normal speed, -v_z'/v_z */
    double friction;               /* mu >= 0: Coulomb coefficient of sliding friction */
    double rolling_resistance;     /* mu_r > 0: a rolling ball decelerates at mu_r g */
    double tangential_restitution; /* e_t, 0..1: contact slip leaves a gripping bounce as -e_t u; 0 = rolling */
} dragarc_surface;

/* The ball: a rigid sphere. Its mass cancels from every result here. */
typedef struct dragarc_sphere {
    double radius;         /* m, > 0 */
    double inertia_factor; /* alpha in I = alpha m r^2, 0 < alpha <= 2/3 (DRAGARC_INERTIA_SOLID, _SHELL) */
} dragarc_sphere;

/* How the contact point moved during an impact. */
typedef enum dragarc_bounce_regime {
    DRAGARC_BOUNCE_SLIDES = 0, /* friction never stopped the slip: |J_t| = mu (1+e) m |v_z| */
    DRAGARC_BOUNCE_GRIPS       /* the slip stopped (and, with e_t > 0, reversed): u' = -e_t u */
} dragarc_bounce_regime;

/* What one impact did. Energies are per unit mass (J/kg): v^2/2 + alpha r^2 |w|^2 / 2. */
typedef struct dragarc_bounce {
    double velocity[3]; /* m/s, after the impact */
    double spin[3];     /* rad/s, after the impact (right-handed about x, y, z) */
    dragarc_bounce_regime regime;
    double slip_before[3]; /* m/s, velocity of the contact point before the impact (horizontal) */
    double slip_after[3];  /* m/s, the same after */
    double energy_before;  /* J/kg */
    double energy_after;   /* J/kg, never above energy_before */
} dragarc_bounce;

/* When the flight driver stops re-launching the ball and lets it roll. */
typedef struct dragarc_bounce_limits {
    double min_height; /* m >= 0: roll when the rebound would rise less than this (v_z'^2 / 2g, in vacuum) */
    int max_bounces;   /* >= 1: roll after this many impacts whatever the rebound */
} dragarc_bounce_limits;

typedef enum dragarc_bounce_next {
    DRAGARC_BOUNCE_AGAIN = 0, /* fly the rebound as a new flight */
    DRAGARC_BOUNCE_ROLL       /* the ball stays on the ground: call dragarc_bounce_roll */
} dragarc_bounce_next;

/* The roll-out on level ground from the state after the last impact. Offsets are (east, north) in m
 * from the point of the last impact. */
typedef struct dragarc_roll {
    double slide_time;      /* s, until the contact point stops (0 when the ball starts rolling) */
    double slide_offset[2]; /* m, displacement while sliding (a parabola when spin and slip disagree) */
    double roll_speed;      /* m/s, speed when pure rolling begins */
    double direction[2];    /* unit vector of the roll (0, 0 when roll_speed is 0) */
    double roll_distance;   /* m, roll_speed^2 / (2 mu_r g) */
    double roll_time;       /* s, roll_speed / (mu_r g) */
    double time;            /* s, slide_time + roll_time */
    double offset[2];       /* m, where the ball comes to rest */
} dragarc_roll;

/* Check a surface; err->field is relative to the surface object ("restitution", "friction", ...) and the
 * message states the rule and the bad value. */
int dragarc_surface_check(const dragarc_surface *surface, dragarc_error *err);

/* Check a sphere; err->field "radius" or "inertia_factor". */
int dragarc_sphere_check(const dragarc_sphere *sphere, dragarc_error *err);

/* Check bounce limits; err->field "min_height" or "max_bounces". */
int dragarc_bounce_limits_check(const dragarc_bounce_limits *limits, dragarc_error *err);

/* One impact of `sphere` moving at velocity (m/s, velocity[2] < 0) with spin (rad/s) on `surface`: fills
 * *out. Borrows everything. DRAGARC_EINVAL (err->field "velocity", "spin", or that of the failed check)
 * for a ball not moving into the ground or a non-finite value. */
int dragarc_bounce_impact(const dragarc_surface *surface, const dragarc_sphere *sphere, const double velocity[3],
                          const double spin[3], dragarc_bounce *out, dragarc_error *err);

/* What the flight driver calls at its `count`-th landing (1 for the first): the impact, then whether the
 * ball flies again or rolls (*next). gravity in m/s^2 (> 0). Errors as dragarc_bounce_impact, and
 * "gravity", "count" or a limits field. */
int dragarc_bounce_land(const dragarc_surface *surface, const dragarc_sphere *sphere,
                        const dragarc_bounce_limits *limits, double gravity, int count, const double velocity[3],
                        const double spin[3], dragarc_bounce *out, dragarc_bounce_next *next, dragarc_error *err);

/* The roll-out from velocity (its horizontal part; m/s) and spin (rad/s) on `surface` under gravity
 * (m/s^2): slide with friction mu g until the contact point stops, then roll to rest at mu_r g. Spin about
 * the vertical is ignored (no pivoting friction). DRAGARC_EINVAL with err->field "friction" when the ball
 * slides on a surface without friction (it would never start to roll). */
int dragarc_bounce_roll(const dragarc_surface *surface, const dragarc_sphere *sphere, double gravity,
                        const double velocity[3], const double spin[3], dragarc_roll *out, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
