/* drift.h: how far spray drops of each size drift downwind, and where the spray's volume comes down.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Each size class of a nozzle's spectrum is flown from the release point (a boom nozzle's height, its jet speed
 * and angle, plus the sprayer's travel velocity) through the scenario's wind profile, evaporating in the day's
 * air. Its volume comes down spread between the landing distances of its neighbours, giving the deposit per metre
 * downwind; what evaporates, or is still in the air when the flight-time limit ends it, is airborne. Deposited +
 * evaporated + aloft = emitted.
 */
#ifndef DRAGARC_DRIFT_H
#define DRAGARC_DRIFT_H

#include <stddef.h>

#include "dragarc/scenario.h"
#include "dragarc/spectrum.h"

#ifdef __cplusplus
extern "C" {
#endif

/* How a class's flight ended. */
enum { DRAGARC_DRIFT_LANDED = 0, DRAGARC_DRIFT_EVAPORATED, DRAGARC_DRIFT_ALOFT, DRAGARC_DRIFT_FAILED };

typedef struct dragarc_drift_class {
    double diameter, fraction; /* m; volume fraction of the spray */
    int outcome;               /* DRAGARC_DRIFT_* */
    double downwind;           /* m, along the wind at the release height, where it landed or vanished */
    double crosswind;          /* m, to the right of the wind */
    double time;               /* s aloft */
    double water_left;         /* share of its volume that reached the ground */
} dragarc_drift_class;

typedef struct dragarc_drift_result {
    double wind_toward;          /* rad clockwise from north: the downwind direction used */
    size_t nclasses;
    dragarc_drift_class *classes; /* owned */
    double bin_width;            /* m */
    double first_bin;            /* m downwind where bin 0 starts (may be negative: upwind) */
    size_t nbins;
    double *deposit;             /* per bin: fraction of the emitted volume per metre downwind (owned) */
    double *class_deposit;       /* nclasses x nbins: the same per class (owned) */
    double deposited_fraction, evaporated_fraction, aloft_fraction, failed_fraction;
    double distance90, distance99;   /* m downwind within which 90 % / 99 % of the emitted volume deposits (NaN:
                                      * less than that deposits at all) */
    double buffer;                   /* m: the buffer distance asked about */
    double beyond_buffer;            /* share of the emitted volume not deposited before the buffer distance */
    double diameter_at_buffer;       /* m: drops smaller than this come down beyond the buffer (NaN: none do, or all) */
    unsigned notes;
} dragarc_drift_result;

/* Fly each class of classes[0..n) from `base` (the drop: water with sphere drag, evaporating in a local
 * atmosphere; launch.speed, elevation, azimuth and height: the nozzle's jet; `travel` (m/s, east and north) is
 * added to every drop's launch velocity) and collect the deposit in bins of bin_width metres. Fills *out (caller
 * frees with dragarc_drift_clear, also after failure). */
int dragarc_drift_run(const dragarc_scenario *base, const double travel[2], const dragarc_spectrum_class *classes,
                      size_t n, double bin_width, double buffer, dragarc_drift_result *out, dragarc_error *err);

void dragarc_drift_clear(dragarc_drift_result *r);

/* The share of the emitted volume that r deposits before x m downwind: the deposit per metre integrated from the
 * first bin to x (a bin that x cuts counts in proportion). 0 before the first bin; r->deposited_fraction beyond
 * the last; r->beyond_buffer is 1 minus this at r->buffer. */
double dragarc_drift_deposited_within(const dragarc_drift_result *r, double x);

/* A drift scenario file as read (src/io/scenario_json.c; docs/drift.md). */
typedef struct dragarc_drift_spec {
    dragarc_scenario base;   /* owned: the drop, the nozzle's jet as the launch, the air, wind, ground, solver */
    double travel[2];        /* m/s, east and north: the sprayer's velocity, added to every drop's */
    dragarc_spectrum spectrum; /* owned */
    size_t nclasses;
    dragarc_spectrum_spacing spacing;
    double bin_width, buffer; /* m */
} dragarc_drift_spec;

int dragarc_drift_spec_read(const char *path, dragarc_drift_spec *out, dragarc_error *err);
int dragarc_drift_spec_parse(const char *json, dragarc_drift_spec *out, dragarc_error *err);
void dragarc_drift_spec_clear(dragarc_drift_spec *spec);

/* Discretise the spectrum into classes (caller's array of spec->nclasses) and fly them. */
int dragarc_drift_spec_run(const dragarc_drift_spec *spec, dragarc_spectrum_class *classes, dragarc_drift_result *out,
                           dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
