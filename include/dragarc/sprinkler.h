/* sprinkler.h: where a sprinkler's drops land and what depth of water they lay down.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A rotating sprinkler throws a jet (nozzle.h) that breaks into drops of many sizes. Each size class is flown
 * (with the scenario's air, wind and evaporation) in each of a number of directions spread evenly over the
 * sprinkler's arc; each flight carries its class's share of the flow for that direction's share of the time.
 * The water that lands is spread over the landing pattern: in still air as a radial application-rate profile
 * (mm/h against distance), and always on a square grid of cells (mm/h on each cell). Water that evaporates is
 * counted as lost; nothing else is lost, so deposited + evaporated = emitted.
 */
#ifndef DRAGARC_SPRINKLER_H
#define DRAGARC_SPRINKLER_H

#include <stddef.h>

#include "dragarc/nozzle.h"
#include "dragarc/scenario.h"
#include "dragarc/spectrum.h"
#include "dragarc/uniformity.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The application rate (mm/h) that marks the edge of the wetted area: 0.26 mm/h, the threshold of sprinkler
 * test practice for sprinklers above 75 L/h (ISO 15886-3 / ASABE S398.1; recalled). */
#define DRAGARC_WETTED_RATE 0.26

typedef struct dragarc_sprinkler_request {
    dragarc_nozzle nozzle;
    double arc_from, arc_to; /* rad clockwise from north: the arc the sprinkler turns through (to > from; a full
                              * circle is to - from = 2 pi) */
    size_t ndirections;      /* directions flown over the arc, 1 to 3600 */
    size_t nclasses;         /* drop size classes, 1 to 1000 */
    const double *diameters; /* m, one per class, increasing */
    const double *fractions; /* volume fraction of the flow in each class; they sum to 1 */
    double ring_width;       /* m: the radial profile's bins */
    double cell;             /* m: the grid's cell size */
    /* NULL, or called every 16 flights and at the last, on one thread at a time, with the flights done (rising) and
     * the total, for a progress bar; it must not call into dragarc. Reporting never changes the results. */
    void (*progress)(size_t done, size_t total, void *user);
    void *progress_user;
} dragarc_sprinkler_request;

/* One size class flown in one direction. */
typedef struct dragarc_sprinkler_drop {
    int status;             /* DRAGARC_OK, or the flight's error code (the drop then carries no water) */
    int evaporated;         /* evaporated completely in the air */
    double x, y;            /* m, east and north of the sprinkler where it landed (or vanished) */
    double distance;        /* m, horizontal */
    double time;            /* s in the air */
    double water_left;      /* fraction of its launched water volume that reached the ground */
} dragarc_sprinkler_drop;

typedef struct dragarc_sprinkler_result {
    double exit_speed;         /* m/s */
    double flow;               /* m^3/s */
    size_t nclasses, ndirections;
    dragarc_sprinkler_drop *drops;  /* nclasses x ndirections, class by class (owned) */
    size_t nfailed;                 /* flights that failed */
    double deposited_fraction;      /* of the flow, landed on the ground */
    double evaporated_fraction;     /* of the flow, evaporated in the air */
    size_t nrings;                  /* radial profile (meaningful in still air): ring k spans [k w, (k+1) w) */
    double *ring_rate;              /* mm/h over the arc's part of each ring (owned) */
    double wetted_radius;           /* m: the outer edge of the rings at or above DRAGARC_WETTED_RATE */
    size_t nx, ny;                  /* the grid: cell (i, j) has its lower-left corner at (x0 + i c, y0 + j c) */
    double x0, y0, cell;
    double *grid_rate;              /* mm/h, nx * ny, row j = north (owned) */
    unsigned notes;                 /* DRAGARC_NOTE_* of all the flights */
    int layout_done;                /* the pattern was overlapped on the spec's layout (dragarc_sprinkler_spec_run) */
    dragarc_layout layout;
    size_t layout_points;           /* catch points along each side of the layout's cell */
    double cell_width, cell_height; /* m, the layout's representative cell */
    dragarc_uniformity layout_stats; /* of the combined rates (mm/h) at the catch points: mean, CU, DU, CV */
} dragarc_sprinkler_result;

/* Fly and spread the sprinkler described by `base` (its projectile is the drop: density, sphere drag and
 * optionally evaporation; launch.height and launch.elevation are the nozzle's; launch.speed and launch.azimuth
 * are replaced) and `req`. Flights run in parallel (OpenMP). Fills *out (caller frees with
 * dragarc_sprinkler_clear, also after failure). Errors: DRAGARC_EINVAL naming the request's field
 * ("nozzle.pressure", "fractions", "arc"), DRAGARC_ENOMEM. Single failed flights are counted, not errors,
 * unless every flight fails. */
int dragarc_sprinkler_run(const dragarc_scenario *base, const dragarc_sprinkler_request *req,
                          dragarc_sprinkler_result *out, dragarc_error *err);

void dragarc_sprinkler_clear(dragarc_sprinkler_result *r);

/* One class over the directions that flew: how many, the mean, least and greatest distance (m), the mean time
 * aloft (s) and the mean share of its water that landed. NaN (and flown 0) when none flew. */
typedef struct dragarc_sprinkler_class_stats {
    size_t flown;
    double distance, distance_min, distance_max, time, water_left;
} dragarc_sprinkler_class_stats;
void dragarc_sprinkler_class_summary(const dragarc_sprinkler_result *r, size_t i, dragarc_sprinkler_class_stats *out);

/* A sprinkler scenario file as read (src/io/scenario_json.c): the nozzle and its drops, and the air, wind, ground
 * and solver as in any scenario. */
typedef struct dragarc_sprinkler_spec {
    dragarc_scenario base;         /* owned: the drop (water, sphere drag, evaporating in a local atmosphere), the
                                    * nozzle's height and elevation, the air, wind, ground and solver */
    dragarc_nozzle nozzle;
    double arc_from, arc_to;       /* rad */
    size_t ndirections;
    dragarc_spectrum spectrum;     /* owned */
    size_t nclasses;
    dragarc_spectrum_spacing spacing;
    double ring_width, cell;       /* m */
    int layout_given;              /* overlap the pattern on `layout` and report its uniformity */
    dragarc_layout layout;
    size_t layout_points;          /* catch points along each side of the cell (default 20) */
} dragarc_sprinkler_spec;

/* Read a sprinkler scenario file (docs/sprinkler.md). Fills *out (caller frees with dragarc_sprinkler_spec_clear,
 * also after failure); errors name the field ("sprinkler.nozzle.pressure: ..."). */
int dragarc_sprinkler_spec_read(const char *path, dragarc_sprinkler_spec *out, dragarc_error *err);
int dragarc_sprinkler_spec_parse(const char *json, dragarc_sprinkler_spec *out, dragarc_error *err);
void dragarc_sprinkler_spec_clear(dragarc_sprinkler_spec *spec);

/* The most memory (bytes) a run of spec takes (pure arithmetic): per flight (classes x directions) a
 * dragarc_sprinkler_drop and its notes; the grid and the rings at their largest (4e6 cells and 1e6 rings, a double
 * each); per class its diameter, fraction and dragarc_spectrum_class; the layout's catch points. */
double dragarc_sprinkler_memory_estimate(const dragarc_sprinkler_spec *spec);

/* Discretise spec's spectrum and fly it: dragarc_sprinkler_run with the spec's request, and progress (NULL: none)
 * as its progress callback. The classes are written to classes (caller's array of spec->nclasses). */
int dragarc_sprinkler_spec_run(const dragarc_sprinkler_spec *spec, dragarc_spectrum_class *classes,
                               void (*progress)(size_t done, size_t total, void *user), void *user,
                               dragarc_sprinkler_result *out, dragarc_error *err);

/* Pattern r's grid overlapped with its neighbours on layout l, at points x points catch points over the
 * representative cell (dragarc_overlap_run on the grid's cell centres): what dragarc_sprinkler_spec_run reports as
 * layout_stats, and the rates behind them. Fills *o (caller frees with dragarc_overlap_clear, also after failure).
 * Errors as dragarc_overlap_run. */
int dragarc_sprinkler_overlap(const dragarc_sprinkler_result *r, const dragarc_layout *l, size_t points,
                              dragarc_overlap *o, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
