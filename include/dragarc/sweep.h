/* sweep.h: tables of flights: one scenario flown again for every combination of a few varied parameters.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A parameter is named by its scenario key path ("launch.speed") or a short alias ("speed"), and its
 * values are given in the units of the scenario file: degrees for angles, SI otherwise. An axis is a
 * range START:STOP:STEP of one parameter; a sweep flies the base scenario once per combination of the
 * axes' values (the first axis varies slowest), in parallel with OpenMP. Rows never depend on the
 * number of threads: each row flies its own copy of the scenario and writes only its own record.
 */
#ifndef DRAGARC_SWEEP_H
#define DRAGARC_SWEEP_H

#include <stddef.h>

#include "dragarc/dragarc.h"
#include "dragarc/quantity.h"
#include "dragarc/scenario.h"

#ifdef __cplusplus
extern "C" {
#endif

#define DRAGARC_SWEEP_MAX_AXES 3         /* parameters varied at once */
#define DRAGARC_SWEEP_MAX_VALUES 100000  /* values on one axis */
#define DRAGARC_SWEEP_MAX_ROWS 1000000   /* rows of a whole table */

/* A scenario parameter that can be set by name. Static storage: never free. */
typedef struct dragarc_scenario_param {
    const char *path;  /* canonical scenario key path, "launch.speed" */
    const char *alias; /* short name, "speed" */
    const char *unit;  /* unit of its values: "m/s", "degree", ...; "" for a pure number */
    dragarc_quantity quantity; /* what its values measure (for values with units at the interface) */
} dragarc_scenario_param;

/* All settable parameters, in a fixed order; *count receives how many. */
const dragarc_scenario_param *dragarc_scenario_params(size_t *count);

/* The parameter called `name` (its key path or its alias), or NULL when there is none. */
const dragarc_scenario_param *dragarc_scenario_param_find(const char *name);

/* The canonical key path for `name` ("wind_speed" -> "environment.wind.speed"), or NULL. */
const char *dragarc_scenario_param_path(const char *name);

/* Set parameter `name` of s to `value` (degrees for launch.elevation, launch.azimuth, launch.spin.tilt and
 * environment.wind.from, which are stored in radians; rpm for launch.spin.rate, stored in rad/s; SI
 * otherwise). Changes scalars only: never
 * allocates or frees, so it is safe on a shallow copy that shares its drag table and wind layers.
 * Rules: a new diameter scales area by (d/d0)^2 and volume by (d/d0)^3 (geometric similarity; with no
 * positive d0 they become pi d^2/4 and pi d^3/6) and, when projectile.density > 0, sets
 * mass = density * volume; a new mass clears projectile.density. cd needs the constant drag model;
 * wind speed and direction need a constant, power or log wind (for power and log, the speed is the
 * one at ref_height); on a wind of model none either makes it a constant wind (speed 0 and from 0
 * until set). temperature_offset needs the isa atmosphere, site_elevation isa or exponential; spin_tilt
 * needs a spin given by rate and tilt (not launch.spin.vector).
 * Values must be finite, and angles other than the elevation within -360..360 degrees; every other
 * range is left to dragarc_scenario_check. Errors: DRAGARC_EINVAL with err->field the key path (for an
 * unknown name, "" and a message listing the accepted names); s is unchanged on error. */
int dragarc_scenario_set(dragarc_scenario *s, const char *name, double value, dragarc_error *err);

/* Read parameter `name` of s in the same units as dragarc_scenario_set (a wind of model none reads
 * as speed 0). Errors as dragarc_scenario_set for unknown names and models without the parameter. */
int dragarc_scenario_get(const dragarc_scenario *s, const char *name, double *value, dragarc_error *err);

/* Check that the n parameters can be varied together in base: each one applies to its models (as
 * dragarc_scenario_set), and varying them changes the flight: a wind direction over a scenario without wind
 * needs the wind speed varied too, a spin rate or tilt needs a lift model, and a tilt alone needs a spin
 * rate in the scenario. DRAGARC_EINVAL with err->field the key path concerned. */
int dragarc_scenario_params_check(const dragarc_scenario *base, const dragarc_scenario_param *const *params, size_t n,
                                  dragarc_error *err);

/* One varied parameter: values start, start + step, ... up to stop, in the parameter's units. */
typedef struct dragarc_sweep_axis {
    const dragarc_scenario_param *param; /* static storage */
    double start, stop, step;
    size_t count; /* number of values, 1 .. DRAGARC_SWEEP_MAX_VALUES */
} dragarc_sweep_axis;

/* Make an axis of parameter `name` from start to stop by step. Stop is included when it lies within
 * 1e-9 |step| of a whole number of steps from start (widened by 4 ulps of max(|start|, |stop|), the
 * rounding of the numbers themselves, when they are large against the step). step must not be 0 and
 * must point from start to stop (any sign when start == stop). DRAGARC_EINVAL with err->field the
 * parameter's key path ("" for an unknown name), also when there would be more than
 * DRAGARC_SWEEP_MAX_VALUES values. */
int dragarc_sweep_axis_init(dragarc_sweep_axis *axis, const char *name, double start, double stop, double step,
                            dragarc_error *err);

/* Parse "NAME=START:STOP:STEP" (three finite numbers in the C locale) into an axis, as
 * dragarc_sweep_axis_init. The message does not repeat `spec`: the caller says where it came from. */
int dragarc_sweep_axis_parse(dragarc_sweep_axis *axis, const char *spec, dragarc_error *err);

/* Value i (0 .. count-1) of an axis: start + i step, rounded to 15 significant digits of the range's
 * magnitude so that 0:1:0.1 gives 0.3 and not 0.30000000000000004; the last value is stop itself
 * when stop is included, and value 0 is start itself. */
double dragarc_sweep_axis_value(const dragarc_sweep_axis *axis, size_t i);

/* One flight of a table. */
typedef struct dragarc_sweep_row {
    double values[DRAGARC_SWEEP_MAX_AXES]; /* the varied parameters' values, in their own units */
    int status;            /* DRAGARC_OK, or the negative code of this row's failure */
    dragarc_error *error;  /* owned: why the row failed; NULL when it flew (or, out of memory, not known) */
    /* the flight summary (see dragarc_flight); NaN when the row failed */
    double range;          /* m */
    double downrange;      /* m */
    double crossrange;     /* m, positive to the right of the launch azimuth */
    double time_of_flight; /* s */
    double apex_height;    /* m above the site datum */
    double impact_speed;   /* m/s */
    double impact_angle;   /* rad below horizontal */
    double impact_energy;  /* J */
    double terminal_speed; /* m/s, NaN when there is none */
    unsigned notes;        /* DRAGARC_NOTE_* of the flight */
} dragarc_sweep_row;

/* A computed table. */
typedef struct dragarc_sweep {
    char scenario[128]; /* the base scenario's name */
    size_t naxes;
    dragarc_sweep_axis axes[DRAGARC_SWEEP_MAX_AXES];
    size_t nrows;
    dragarc_sweep_row *rows; /* owned: dragarc_sweep_clear */
    size_t nfailed;          /* rows with status != DRAGARC_OK */
    unsigned notes;          /* union of the notes of the rows that flew */
} dragarc_sweep;

/* Check the axes of a planned table on their own: 1 .. DRAGARC_SWEEP_MAX_AXES axes made by
 * dragarc_sweep_axis_init, of distinct parameters, at most DRAGARC_SWEEP_MAX_ROWS rows in all (*nrows
 * receives the number; may be NULL). DRAGARC_EINVAL, err->field the key path concerned. */
int dragarc_sweep_axes_check(const dragarc_sweep_axis *axes, size_t naxes, size_t *nrows, dragarc_error *err);

/* Check a planned table before flying it: the axes as dragarc_sweep_axes_check, a valid base
 * scenario, and its parameters as dragarc_scenario_params_check (e.g. cd only with the constant drag
 * model; not the wind direction alone over a scenario without wind). DRAGARC_EINVAL, err->field the
 * key path concerned. */
int dragarc_sweep_check(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes,
                        size_t *nrows, dragarc_error *err);

/* Fly base once per combination of the axes' values (copies the axes; borrows base, which is only
 * read, also by the threads). Row r varies the last axis fastest. A row whose flight fails keeps its
 * status and error and does not stop the others; out->nfailed counts them. Fills *out (caller frees
 * with dragarc_sweep_clear, also after failure). Errors: those of dragarc_sweep_check,
 * DRAGARC_ENOMEM when the rows cannot be allocated. */
int dragarc_sweep_run(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes,
                      dragarc_sweep *out, dragarc_error *err);

/* dragarc_sweep_run with a progress callback: when progress is not NULL it is called with the rows done and the
 * total, every 16 rows and once at the end (for a progress bar), from one thread at a time (any of the sweep's
 * threads). It must not call into dragarc; the rows do not depend on it. */
int dragarc_sweep_run_progress(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes,
                               void (*progress)(size_t done, size_t total, void *user), void *user,
                               dragarc_sweep *out, dragarc_error *err);

/* The table of base over axes with its rows allocated (zeroed) but not flown, its name and axes copied, nfailed and
 * notes 0: to be filled by dragarc_sweep_run_range (by one process, or part by part by several) and counted by
 * dragarc_sweep_tally. Errors as dragarc_sweep_run; the caller frees *out with dragarc_sweep_clear (also after
 * failure). */
int dragarc_sweep_init(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes, dragarc_sweep *out,
                       dragarc_error *err);

/* Fly rows r0, r0 + step, r0 + 2 step, ... below r1 of the table of base over axes into rows[0], rows[1], ...
 * ((r1 - r0 + step - 1) / step of them; the caller allocates; any contents are overwritten). Row r depends on
 * nothing but base, the axes and r, so rows[i] is bit for bit row r0 + i step of dragarc_sweep_run's table: parts
 * flown apart (by other processes) and put back at their row numbers make exactly the whole table. A failed row's
 * error is malloc'ed and owned by the row (free() it, or let dragarc_sweep_clear do it once the row is in a table).
 * `progress` counts the rows of this range. Errors those of dragarc_sweep_check, and DRAGARC_EINVAL when r0 > r1,
 * r1 is past the table's rows or step is 0. */
int dragarc_sweep_run_range(const dragarc_scenario *base, const dragarc_sweep_axis *axes, size_t naxes, size_t r0,
                            size_t r1, size_t step, dragarc_sweep_row *rows,
                            void (*progress)(size_t done, size_t total, void *user), void *user, dragarc_error *err);

/* Count the failed rows of t into t->nfailed and join the notes of the rows that flew into t->notes. */
void dragarc_sweep_tally(dragarc_sweep *t);

/* The memory (bytes) a table of nrows rows takes: nrows dragarc_sweep_row (pure arithmetic). A row that fails
 * adds its dragarc_error, not counted here. */
double dragarc_sweep_memory_estimate(size_t nrows);

/* Free the rows and their errors and zero the record. Safe on a zeroed record and NULL. */
void dragarc_sweep_clear(dragarc_sweep *t);

/* "FIELD: MESSAGE" (or the message alone, or the status name when the error is not known) of a failed
 * row into buf; "" for a row that flew. */
void dragarc_sweep_row_message(const dragarc_sweep_row *row, char *buf, size_t size);

#ifdef __cplusplus
}
#endif
#endif
