/* aim.h: the inverse problem: which launch reaches a target (shooting method).
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The target lies on the scenario's nominal launch azimuth psi0: `range` metres along it and
 * `crossrange` metres to its right, on the horizontal plane at `height` above the site datum. Every
 * candidate launch is flown with dragarc_flight_run; no approximation of the trajectory is used.
 */
#ifndef DRAGARC_AIM_H
#define DRAGARC_AIM_H

#include <stddef.h>

#include "dragarc/dragarc.h"
#include "dragarc/scenario.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum dragarc_aim_mode {
    DRAGARC_AIM_ELEVATION = 0, /* keep launch.speed, find the elevations */
    DRAGARC_AIM_SPEED          /* keep launch.elevation, find the speed */
} dragarc_aim_mode;

typedef struct dragarc_aim_request {
    double range;          /* m, along the nominal azimuth, > 0 */
    double height;         /* m above the datum of the target plane; NaN = the scenario's ground */
    double crossrange;     /* m, to the right of the nominal azimuth line */
    dragarc_aim_mode mode;
    int solve_azimuth;     /* 1 = also turn the azimuth onto the target, 0 = keep it, -1 = when there is
                              wind or a crossrange (default) */
    double miss_tolerance; /* m, largest miss accepted for a solution (default 1e-3) */
} dragarc_aim_request;

/* Defaults: range 0 (must be set), height NaN, crossrange 0, elevation mode, azimuth auto, 1 mm. */
void dragarc_aim_request_default(dragarc_aim_request *r);

#define DRAGARC_AIM_MAX_SOLUTIONS 8

typedef struct dragarc_aim_solution {
    double elevation;          /* rad */
    double azimuth;            /* rad, clockwise from north */
    double azimuth_correction; /* rad, azimuth - nominal azimuth (positive = aim right) */
    double speed;              /* m/s */
    double time_of_flight;     /* s */
    double apex_height;        /* m above the datum */
    double impact_speed;       /* m/s */
    double impact_angle;       /* rad below horizontal */
    double impact_energy;      /* J */
    double miss;               /* m, horizontal distance of the verified impact from the target */
    unsigned notes;            /* DRAGARC_NOTE_* of the verified flight */
} dragarc_aim_solution;

typedef struct dragarc_aim_result {
    size_t nsolutions;                                       /* ordered by elevation, lowest first */
    dragarc_aim_solution solutions[DRAGARC_AIM_MAX_SOLUTIONS];
    double max_range;           /* m, greatest downrange at the scenario's speed and azimuth (elevation mode) */
    double max_range_elevation; /* rad */
    long flights;               /* flights flown in all */
} dragarc_aim_result;

/* Solve. DRAGARC_OK with at least one solution; DRAGARC_ENOSOLUTION when the target is out of reach
 * (the message gives the maximum range, also left in out->max_range); DRAGARC_EINVAL for a bad
 * request or scenario (field "range", "height", "crossrange" or the scenario path); flight failures
 * other than "never reaches the target plane" are passed on. */
int dragarc_aim_solve(const dragarc_scenario *s, const dragarc_aim_request *req, dragarc_aim_result *out,
                      dragarc_error *err);

/* Fly solution sol of request req again, as the solver flew it (its elevation, azimuth and speed, the flight ending
 * at its first landing on the target plane, no bounce or roll), with samples every dt seconds (dt > 0, as
 * dragarc_flight_run), into *f (caller frees with dragarc_flight_clear, also after failure). For pictures of the
 * solutions. Errors: those of dragarc_flight_run. */
struct dragarc_flight;
int dragarc_aim_solution_fly(const dragarc_scenario *s, const dragarc_aim_request *req, const dragarc_aim_solution *sol,
                             double dt, struct dragarc_flight *f, dragarc_error *err);

/* One row of an aim table: the low and the high solution for one target range. */
typedef struct dragarc_aim_table_row {
    double range;              /* m */
    int status;                /* DRAGARC_OK, DRAGARC_ENOSOLUTION (out of reach) or another failure */
    char message[384];         /* why, when status != DRAGARC_OK */
    size_t nsolutions;
    dragarc_aim_solution low;  /* lowest elevation (or speed) */
    dragarc_aim_solution high; /* highest; all NaN when there is only one solution */
    double max_range;          /* m (elevation mode) */
    double max_range_elevation; /* rad */
} dragarc_aim_table_row;

/* Solve `req` for each of the n target ranges (req->range is ignored), in parallel with OpenMP; row i
 * depends only on ranges[i], never on the thread count. A range that cannot be reached, or whose solve
 * fails, keeps its status and message and does not stop the others. rows must hold n records.
 * Returns DRAGARC_OK, or DRAGARC_EINVAL for a bad request or scenario (checked once, before flying). */
int dragarc_aim_table(const dragarc_scenario *s, const dragarc_aim_request *req, const double *ranges, size_t n,
                      dragarc_aim_table_row *rows, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
