/* optimize.h: the launch that carries farthest. Maximise the carry (range to the first landing) or the total
 * distance (to where the ball comes to rest) over one to five scenario parameters within bounds, and report
 * how sensitive the result is to each of them.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every trial is a full flight (dragarc_flight_run); no approximation of the trajectory is used. One
 * variable: a scan, then GSL's Brent minimiser; several: GSL's Nelder-Mead simplex (nmsimplex2) on the
 * bounded variables mapped onto the unbounded line, from the best points of a coarse grid. The method,
 * its tolerances and the finite differences are in src/numerics/optimize.c and docs/optimize.md.
 */
#ifndef DRAGARC_OPTIMIZE_H
#define DRAGARC_OPTIMIZE_H

#include <stddef.h>

#include "dragarc/dragarc.h"
#include "dragarc/flight.h"
#include "dragarc/scenario.h"
#include "dragarc/sweep.h"

#ifdef __cplusplus
extern "C" {
#endif

#define DRAGARC_OPTIMIZE_MAX_VARS 5

typedef enum dragarc_optimize_objective {
    DRAGARC_OPTIMIZE_CARRY = 0, /* dragarc_flight.range: launch point to the first landing */
    DRAGARC_OPTIMIZE_TOTAL      /* dragarc_flight.total_distance: launch point to where it comes to rest */
} dragarc_optimize_objective;

/* One varied parameter and its bounds, in the parameter's own units (degrees, rpm, SI: sweep.h). */
typedef struct dragarc_optimize_var {
    const dragarc_scenario_param *param; /* static storage */
    double lo, hi;                       /* lo < hi */
} dragarc_optimize_var;

typedef struct dragarc_optimize_request {
    dragarc_optimize_objective objective;
    size_t nvars; /* 1 .. DRAGARC_OPTIMIZE_MAX_VARS */
    dragarc_optimize_var vars[DRAGARC_OPTIMIZE_MAX_VARS];
    double size_tolerance; /* stop when Brent's interval, as a fraction of the bound width, or the simplex size
                              in the mapped variables (radians of the map, see optimize.c) is below it */
    int max_iterations;    /* of the minimiser, per start */
    double fd_step;        /* the slope's finite-difference step, as a fraction of each bound width (the
                              curvature's is 10 times it), above 0 and at most 0.025 */
} dragarc_optimize_request;

/* Defaults: carry, no variables yet, size tolerance 1e-7, 500 iterations, finite-difference step 1e-3. */
void dragarc_optimize_request_default(dragarc_optimize_request *r);

/* The default bounds of parameter `name` for scenario s, in its units: elevation 0 to 80 degrees; speed the
 * scenario's +-20 %; spin_rate 0 to twice the scenario's (0 to 6000 rpm when it has none; at most 60000);
 * spin_tilt -45 to 45 degrees; azimuth the scenario's (taken within -180..180) +-45 degrees; those made from a
 * scenario value rounded to 12 significant digits. DRAGARC_EINVAL, err->field the key path, for other
 * parameters (they need bounds given) and for a speed of 0. */
int dragarc_optimize_default_bounds(const dragarc_scenario *s, const char *name, double *lo, double *hi,
                                    dragarc_error *err);

/* Append parameter `name` with bounds lo..hi to r. DRAGARC_EINVAL (err->field the key path, "" for an
 * unknown name) for an unknown or repeated name, bounds that are not finite or not lo < hi, or more than
 * DRAGARC_OPTIMIZE_MAX_VARS variables. */
int dragarc_optimize_add(dragarc_optimize_request *r, const char *name, double lo, double hi, dragarc_error *err);

typedef struct dragarc_optimize_result {
    double x[DRAGARC_OPTIMIZE_MAX_VARS];         /* the optimum of each variable, in its units */
    int bound[DRAGARC_OPTIMIZE_MAX_VARS];        /* -1 on its lower bound, +1 on its upper bound, 0 inside */
    double slope[DRAGARC_OPTIMIZE_MAX_VARS];     /* d objective / d x, m per unit of the variable; NaN when a
                                                    difference flight failed */
    double curvature[DRAGARC_OPTIMIZE_MAX_VARS]; /* d2 objective / d x2, m per unit squared; NaN likewise */
    double step[DRAGARC_OPTIMIZE_MAX_VARS];      /* the slope's finite-difference step, in the variable's units */
    double curvature_step[DRAGARC_OPTIMIZE_MAX_VARS]; /* the curvature's: 10 step */
    double objective;       /* m, the carry or total distance at the optimum */
    dragarc_flight flight;  /* the flight at the optimum; owned: dragarc_optimize_clear */
    const char *method;     /* "brent" or "nmsimplex2"; static storage */
    size_t starts;          /* minimiser runs (grid points it started from) */
    size_t grid;            /* points of the scan (one variable) or the grid (several) */
    int iterations;         /* minimiser iterations of the run that found the optimum */
    int converged;          /* 1 when the size tolerance was met (or the optimum is on a bound, one variable) */
    double size;            /* the final interval (fraction of the width) or simplex size (radians of the map) */
    char note[160];         /* why not converged, or "" */
    long flights;           /* trial flights flown, the differences included */
    long failed;            /* trial flights that failed: each counted as worse than any flight that lands */
} dragarc_optimize_result;

/* Find the launch of scenario s that maximises req->objective over req's variables (borrows s, which is
 * only read). Fills *out (caller frees with dragarc_optimize_clear, also after failure). A trial flight that
 * fails counts as worse than every flight that lands. Errors: DRAGARC_EINVAL (a bad request; a scenario
 * that fails its check; a bound the scenario check refuses; parameters that change nothing, as
 * dragarc_scenario_params_check), DRAGARC_ENOSOLUTION when every trial flight failed to come down (the
 * message gives the first reason), another code when every trial failed for that reason (e.g.
 * DRAGARC_ESOLVER), DRAGARC_ENOMEM. */
int dragarc_optimize_solve(const dragarc_scenario *s, const dragarc_optimize_request *req,
                           dragarc_optimize_result *out, dragarc_error *err);

/* Set the variables of req to the values x (their units) in s, e.g. a shallow copy of the scenario that
 * was optimised, to describe the launch at the optimum. Errors as dragarc_scenario_set. */
int dragarc_optimize_apply(dragarc_scenario *s, const dragarc_optimize_request *req, const double *x,
                           dragarc_error *err);

/* "carry" or "total"; and back (DRAGARC_EINVAL for another name). */
const char *dragarc_optimize_objective_name(dragarc_optimize_objective o);
int dragarc_optimize_objective_from_name(const char *name, dragarc_optimize_objective *out);

/* Free the flight and zero the record. Safe on a zeroed record and NULL. */
void dragarc_optimize_clear(dragarc_optimize_result *r);

#ifdef __cplusplus
}
#endif
#endif
