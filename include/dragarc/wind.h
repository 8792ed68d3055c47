/* wind.h: the wind as a function of height above the ground.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Horizontal wind only. Directions follow the meteorological convention: `from` is the direction the
 * wind blows from, clockwise from north, so a wind from 270 degrees (west) blows toward +x (east).
 * Stored in radians; degrees are converted by the scenario reader.
 *   constant   u(h) = speed
 *   layered    speed and direction tabulated against height, linear in speed and along the shorter
 *              arc in direction between rows, held constant beyond the first and last row
 *   power      u(h) = u_ref (h / h_ref)^alpha for h > 0, 0 below
 *   log        u(h) = u_ref ln(h / z0) / ln(h_ref / z0) for h > z0, 0 below (neutral surface layer)
 */
#ifndef DRAGARC_WIND_H
#define DRAGARC_WIND_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum dragarc_wind_model {
    DRAGARC_WIND_NONE = 0,
    DRAGARC_WIND_CONSTANT,
    DRAGARC_WIND_LAYERED,
    DRAGARC_WIND_POWER,
    DRAGARC_WIND_LOG
} dragarc_wind_model;

/* One row of a layered wind. */
typedef struct dragarc_wind_layer {
    double height; /* m above ground */
    double speed;  /* m/s */
    double from;   /* rad, clockwise from north, direction the wind comes from */
} dragarc_wind_layer;

/* A wind field. A layered wind owns its rows (free with dragarc_wind_clear). */
typedef struct dragarc_wind {
    dragarc_wind_model model;
    double speed;      /* m/s: constant speed, or u_ref at ref_height for power and log */
    double from;       /* rad */
    double ref_height; /* m above ground (power, log) */
    double exponent;   /* power-law alpha (power) */
    double roughness;  /* m, roughness length z0 (log) */
    size_t nlayers;
    dragarc_wind_layer *layers; /* owned, heights strictly increasing */
} dragarc_wind;

/* No wind. */
void dragarc_wind_default(dragarc_wind *wind);

/* Check parameters; err->field is relative to the wind object ("speed", "layers[2].height", ...). */
int dragarc_wind_check(const dragarc_wind *wind, dragarc_error *err);

/* Deep copy; dst is overwritten without being cleared. */
int dragarc_wind_copy(dragarc_wind *dst, const dragarc_wind *src, dragarc_error *err);

/* Free owned rows and reset to no wind. */
void dragarc_wind_clear(dragarc_wind *wind);

/* Wind velocity (m/s, out[0] east, out[1] north, out[2] = 0) at height h (m) above ground. */
void dragarc_wind_eval(const dragarc_wind *wind, double h, double out[3]);

/* The same with toward = the unit vector of dragarc_wind_toward(wind->from) worked out beforehand (used by
 * every model but layered, whose direction changes with height; NULL: work it out here). */
void dragarc_wind_eval_toward(const dragarc_wind *wind, double h, const double toward[2], double out[3]);

/* Heights above ground (m) where the profile's slope jumps: every row of a layered wind, the ground for
 * the power law, the roughness length for the log law. Writes at most max, returns how many there are. */
size_t dragarc_wind_breaks(const dragarc_wind *wind, double *out, size_t max);

/* Unit vector (east, north) toward which a wind `from` (rad) blows. */
void dragarc_wind_toward(double from, double *east, double *north);

#ifdef __cplusplus
}
#endif
#endif
