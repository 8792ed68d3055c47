/* flight.h: fly one scenario from launch to ground impact.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Integrated by DOP853 (explicit, the default for non-stiff flights), GSL's rk8pd, or SUNDIALS CVODE (BDF
 * for stiff flights, Adams-Moulton on request): see src/numerics/flight.c and docs/models.md. Ground impact
 * is where the height (z on a flat Earth, |r| - R on a sphere: earth.h) falls through z_ground, the apex where
 * its rate falls through 0. On a sphere the positions and velocities reported (samples, impact) are those of
 * dragarc_earth_report: east and north along the great circle from the origin, the height, and the velocity in
 * the local frame there; the range, downrange and crossrange follow from those offsets.
 */
#ifndef DRAGARC_FLIGHT_H
#define DRAGARC_FLIGHT_H

#include <stddef.h>

#include "dragarc/dragarc.h"
#include "dragarc/scenario.h"

#ifdef __cplusplus
extern "C" {
#endif

/* One sampled state. */
typedef struct dragarc_flight_point {
    double t;           /* s */
    double pos[3];      /* m */
    double vel[3];      /* m/s, ground-relative */
    double speed;       /* m/s, ground-relative */
    double mach;        /* air-relative speed / speed of sound */
    double reynolds;    /* rho |v_rel| d / mu */
    double spin;        /* rad/s, spin rate */
    double spin_factor; /* S = r w_perp / |v_rel| (0 without spin) */
    double lift_coefficient; /* C_L (0 without lift) */
    double drag_coefficient; /* C_D = 2 D / (rho A |v_rel|); NaN at rest or in vacuum */
    double diameter;    /* m: the projectile's, or an evaporating drop's at this moment */
} dragarc_flight_point;

/* Observations about a flight that the cautions speak of (bit flags). */
enum {
    DRAGARC_NOTE_TABLE_CLAMPED = 1u << 0, /* a drag table was read beyond its first or last point */
    DRAGARC_NOTE_TRANSONIC = 1u << 1,     /* Mach > 0.6 with a drag law that ignores Mach number */
    DRAGARC_NOTE_DENSE_FLUID = 1u << 2,   /* fluid density > 1 % of the body's: added mass ignored */
    DRAGARC_NOTE_DRAG_CRISIS = 1u << 3,   /* sphere model crossed Re 2e5..1e6: Cd drops sharply */
    DRAGARC_NOTE_HIGH_ENERGY = 1u << 4,   /* impact energy >= 15 J */
    DRAGARC_NOTE_BALL = 1u << 5,          /* a spinning or bouncing ball: a sports flight near people */
    DRAGARC_NOTE_IRRIGATION = 1u << 6,    /* a sprinkler's pattern: irrigation design */
    DRAGARC_NOTE_SPRAY_DRIFT = 1u << 7,   /* a spray drift estimate: pesticide and buffer-zone rules */
    DRAGARC_NOTE_DEBRIS = 1u << 8,          /* a debris footprint: range-safety authority and regulations decide */
    DRAGARC_NOTE_SPHERICAL_EARTH = 1u << 9, /* flown over a spherical Earth (environment.earth) */
    DRAGARC_NOTE_ROTATING_EARTH = 1u << 10  /* ... turning: Coriolis and centrifugal terms */
};

/* One landing of a ball on a ground surface (ground.surface): the state just before and just after it. */
typedef struct dragarc_landing {
    double t;          /* s since launch */
    double pos[2];     /* m, east and north of the launch point */
    double speed_in;   /* m/s, ground-relative, before */
    double angle_in;   /* rad below horizontal, before */
    double spin_in;    /* rad/s, before */
    double speed_out;  /* m/s, after */
    double angle_out;  /* rad above horizontal, after */
    double spin_out;   /* rad/s, after */
    int grips;         /* 1 when friction stopped the contact point's slip during the impact */
    int rolls;         /* 1 for the last landing: the ball stays on the ground and rolls out */
} dragarc_landing;

typedef struct dragarc_flight {
    /* summary */
    double range;          /* m, horizontal distance launch -> impact */
    double downrange;      /* m, along the launch azimuth */
    double crossrange;     /* m, to the right of the launch azimuth */
    double time_of_flight; /* s */
    double apex_height;    /* m above the site datum (the launch height when the flight only descends) */
    double apex_time;      /* s */
    double impact_speed;   /* m/s, ground-relative */
    double impact_angle;   /* rad below horizontal */
    double impact_energy;  /* J, 1/2 m v^2 */
    double launch_energy;  /* J */
    double terminal_speed; /* m/s in still air at the launch height; NaN when there is none */
    double vacuum_range;   /* m, same launch without air to the same ground; NaN if it never lands */
    double impact[8];      /* state at (first) impact: position (m), velocity (m/s), spin rate (rad/s), and mass
                            * as a fraction of the launch mass */
    int evaporated;        /* 1: an evaporating drop shrank away (below DRAGARC_EVAPORATED_DIAMETER) before landing;
                            * then impact[] and time_of_flight are where and when, in the air */
    double wet_bulb;       /* K, an evaporating drop's: the wet-bulb temperature of the air at launch (0 otherwise) */
    double drop_temperature; /* K, an evaporating drop's: its temperature at rest in that air (0 otherwise) */
    /* after the first impact (ground.surface): bounces and roll-out. Without a surface the ball stops where
     * it lands: bounces 0, total_distance = range, rest_position = the impact point, rest_time = time_of_flight */
    int bounces;              /* impacts after the first that ended in another flight */
    double total_distance;    /* m, horizontal distance launch -> where the ball comes to rest */
    double rest_position[2];  /* m, east and north of the launch point */
    double rest_time;         /* s, launch -> rest */
    double roll_distance;     /* m, rolled (and slid) on the ground after the last bounce */
    size_t nlandings;         /* landings on the surface (bounces + 1), 0 without a surface */
    dragarc_landing *landings; /* owned: dragarc_flight_clear */
    double max_mach;
    double max_reynolds;
    double relaxation_time; /* s, terminal_speed / g: how fast drag acts; NaN without drag */
    long steps;            /* integrator steps taken */
    dragarc_method method; /* the method actually used */
    unsigned notes;        /* DRAGARC_NOTE_* */
    /* samples at a fixed interval, plus the exact impact row (when dt > 0) */
    size_t npoints;
    dragarc_flight_point *points; /* owned: dragarc_flight_clear */
} dragarc_flight;

/* Fly scenario s. dt > 0 samples the state every dt seconds (plus launch and impact); dt = 0 keeps
 * only launch and impact. Fills *out (caller clears with dragarc_flight_clear, also after failure).
 * Errors: DRAGARC_EINVAL (scenario fails dragarc_scenario_check), DRAGARC_ENOLAND (no impact
 * within solver.max_time), DRAGARC_ESOLVER (the integrator failed or ran out of steps; the message names the
 * method, or the CVODE flag, and t),
 * DRAGARC_ERANGE (the atmosphere model was left, e.g. above 86 km). */
int dragarc_flight_run(const dragarc_scenario *s, double dt, dragarc_flight *out, dragarc_error *err);

/* Fly scenario s as dragarc_flight_run does, sampling at the listed times (s since launch, n of them, finite,
 * >= 0, non-decreasing) instead of at a fixed interval: out->points holds the launch, one row for each listed time
 * before the flight ends (in the order given), and the impact row; with a ground surface also the start of each
 * rebound, and the rest row. Times after the end are not sampled. Errors as dragarc_flight_run, and DRAGARC_EINVAL
 * (field "times[i]") for a bad list. */
int dragarc_flight_run_at(const dragarc_scenario *s, const double *times, size_t n, dragarc_flight *out,
                          dragarc_error *err);

/* Free the samples and zero the record. Safe on a zeroed record. */
void dragarc_flight_clear(dragarc_flight *f);

/* Still-air terminal speed (m/s) at height z of the scenario, where drag balances weight less
 * buoyancy, solved with the drag model's own law (GSL Brent). *vt = NaN when the body does not sink
 * or has no drag; returns an error only when the evaluation itself fails. */
int dragarc_terminal_speed(const dragarc_scenario *s, double z, double *vt, dragarc_error *err);

/* Horizontal range (m) of the same launch in vacuum to the scenario's ground; NaN if never lands. */
double dragarc_vacuum_range(const dragarc_scenario *s);

/* "auto", "dop853", "rk8pd", "adams" or "bdf". */
const char *dragarc_method_name(dragarc_method m);

#ifdef __cplusplus
}
#endif
#endif
