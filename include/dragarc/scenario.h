/* scenario.h: one flight problem, as read from a scenario file, in SI units and radians.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Frame: x east, y north, z up, metres, origin on the site datum below the launch point.
 * The reader (dragarc_scenario_read*) converts degrees to radians and fills defaults; the file
 * format is documented in docs/scenario.md.
 */
#ifndef DRAGARC_SCENARIO_H
#define DRAGARC_SCENARIO_H

#include <stddef.h>

#include "dragarc/atmosphere.h"
#include "dragarc/bounce.h"
#include "dragarc/dragarc.h"
#include "dragarc/earth.h"
#include "dragarc/projectile.h"
#include "dragarc/wind.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum dragarc_method {
    DRAGARC_METHOD_AUTO = 0, /* dop853 unless the drag relaxation time is short against the flight */
    DRAGARC_METHOD_ADAMS,    /* non-stiff: CVODE variable-order Adams-Moulton, fixed-point iteration */
    DRAGARC_METHOD_BDF,      /* stiff: CVODE BDF with Newton iteration and a dense linear solver */
    DRAGARC_METHOD_RK8PD,    /* non-stiff: GSL's explicit Runge-Kutta-Prince-Dormand 8(9) */
    DRAGARC_METHOD_DOP853    /* non-stiff: Dormand-Prince 8(5,3) with a continuous extension (dop853.c) */
} dragarc_method;

typedef struct dragarc_launch {
    double speed;     /* m/s, >= 0 */
    double elevation; /* rad above horizontal, [-pi/2, pi/2] */
    double azimuth;   /* rad clockwise from north */
    double height;    /* m above the site datum */
    double spin_rate; /* rad/s, >= 0: 0 for no spin */
    double spin_tilt; /* rad, [-pi, pi]: 0 pure backspin, positive tilts the lift to the right */
    int spin_axis_given;   /* 1: spin_axis holds the axis (a 3-D spin vector was given), tilt unused */
    double spin_axis[3];   /* unit vector (east, north, up) when spin_axis_given */
    double spin_decay_time; /* s, e-folding time of the spin; 0: no exponential decay */
} dragarc_launch;

typedef struct dragarc_solver_options {
    double rtol;      /* relative tolerance (default 1e-8) */
    double atol;      /* absolute tolerance, m and m/s (default 1e-6) */
    double max_time;  /* s, flight-time limit (default 3600) */
    long max_steps;   /* integrator steps allowed in all (default 1000000) */
    dragarc_method method;
} dragarc_solver_options;

typedef struct dragarc_scenario {
    char name[128];
    dragarc_projectile projectile; /* owned */
    dragarc_launch launch;
    double gravity;                /* m/s^2, > 0 (default 9.80665); on a spherical Earth the gravitation at its surface */
    dragarc_earth earth;           /* environment.earth (default flat) */
    dragarc_atmosphere atmosphere;
    dragarc_wind wind;             /* owned */
    double ground_elevation;       /* m above the site datum: the impact plane */
    int ground_surface_given;      /* 1: the ball bounces and rolls on `surface` after landing */
    dragarc_surface surface;       /* ground.surface */
    dragarc_bounce_limits bounce;  /* ground.bounce: when the bouncing stops (defaults 5 mm, 50) */
    dragarc_solver_options solver;
} dragarc_scenario;

/* Fill every field with its documented default (no projectile: mass and diameter 0). */
void dragarc_scenario_default(dragarc_scenario *s);

/* Validate a whole scenario; err->field is the full path ("launch.elevation"). */
int dragarc_scenario_check(const dragarc_scenario *s, dragarc_error *err);

/* Set the geodetic latitude (rad) of the frame's origin, which a turning spherical Earth needs (e.g. per breakup
 * of a footprint); DRAGARC_EINVAL (field "environment.earth.latitude") outside [-pi/2, pi/2]. */
int dragarc_scenario_set_latitude(dragarc_scenario *s, double latitude, dragarc_error *err);

/* Deep copy. */
int dragarc_scenario_copy(dragarc_scenario *dst, const dragarc_scenario *src, dragarc_error *err);

/* Free what the scenario owns and reset it to defaults. */
void dragarc_scenario_clear(dragarc_scenario *s);

/* Parse a scenario from JSON text into *out (caller clears it with dragarc_scenario_clear).
 * `base_dir` resolves a projectile given as a relative path; `profile_path` is a ':'-separated list
 * of folders searched for a projectile given by profile name (either may be NULL). On failure *out is
 * left cleared and err names the field path. */
int dragarc_scenario_parse(const char *json, const char *base_dir, const char *profile_path,
                           dragarc_scenario *out, dragarc_error *err);

/* Read and parse a scenario file; the base directory is the file's own. */
int dragarc_scenario_read(const char *path, const char *profile_path, dragarc_scenario *out,
                          dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
