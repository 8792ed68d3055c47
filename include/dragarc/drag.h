/* drag.h: drag laws. The force is F = -D(|v_rel|, air) v_rel, where v_rel is the velocity relative
 * to the air and D (kg/s) is the "drag factor" that every model reduces to.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   none       D = 0
 *   linear     D = k                      (k in N s/m: the low-speed, Stokes-like law)
 *   quadratic  D = c |v_rel|              (c in kg/m)
 *   constant   D = 1/2 rho Cd A |v_rel|
 *   sphere     D = 1/2 rho Cd(Re) A |v_rel|, Cd(Re) of a smooth sphere (Clift, Grace & Weber 1978)
 *   table      D = 1/2 rho Cd(x) A |v_rel|, Cd tabulated against Reynolds number, Mach number or speed
 *   spin_table D = 1/2 rho Cd(Re, S) A |v_rel|, Cd tabulated against Reynolds number and spin factor S
 *              (a spinning ball's drag rises with S; S as in lift.h)
 *
 * Every law's D is multiplied by its `scale` (the scenario's drag.cd_scale): a ball whose C_D curve has the
 * shape of a published one but sits higher or lower, as a fit to a measured flight finds (fit.h).
 *
 * Re = rho |v_rel| d / mu with d the diameter; Mach = |v_rel| / a.
 */
#ifndef DRAGARC_DRAG_H
#define DRAGARC_DRAG_H

#include <stddef.h>

#include "dragarc/atmosphere.h"
#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum dragarc_drag_model {
    DRAGARC_DRAG_NONE = 0,
    DRAGARC_DRAG_CONSTANT,
    DRAGARC_DRAG_LINEAR,
    DRAGARC_DRAG_QUADRATIC,
    DRAGARC_DRAG_SPHERE,
    DRAGARC_DRAG_TABLE,
    DRAGARC_DRAG_SPIN_TABLE
} dragarc_drag_model;

typedef enum dragarc_drag_axis {
    DRAGARC_AXIS_REYNOLDS = 0, /* interpolated in log(Re) */
    DRAGARC_AXIS_MACH,         /* interpolated in Mach number */
    DRAGARC_AXIS_SPEED         /* interpolated in air-relative speed, m/s */
} dragarc_drag_axis;

/* A drag law. Tables own their arrays and an interpolation object: create a table with
 * dragarc_drag_table_set and release it with dragarc_drag_clear; copy with dragarc_drag_copy. */
typedef struct dragarc_drag {
    dragarc_drag_model model;
    double cd; /* constant */
    double k;  /* N s/m, linear */
    double c;  /* kg/m, quadratic */
    dragarc_drag_axis axis;
    size_t npoints;
    double *x;    /* table abscissae as given (Re, Mach or m/s), strictly increasing */
    double *u;    /* interpolation abscissae: ln(x) for Reynolds, x otherwise */
    double *y;    /* Cd values */
    void *interp; /* gsl_interp *, owned (table); gsl_interp2d *, owned (spin_table) */
    size_t ns;    /* spin_table: spin factors, from 0 up, strictly increasing, in s */
    double *s;    /* spin_table: y holds Cd at (x[i], s[j]) as y[j * npoints + i], GSL's order */
    double scale; /* factor on the law's drag (its C_D, k or c), > 0; 0 is read as 1, so a zeroed drag is unscaled */
} dragarc_drag;

/* Names used in scenario files: "none", "constant", ...; NULL for an unknown value. */
const char *dragarc_drag_model_name(dragarc_drag_model model);
int dragarc_drag_model_from_name(const char *name, dragarc_drag_model *out);
const char *dragarc_drag_axis_name(dragarc_drag_axis axis);
int dragarc_drag_axis_from_name(const char *name, dragarc_drag_axis *out);

/* The factor a drag law's D is multiplied by: its scale, or 1 when the scale is 0 (unset). */
double dragarc_drag_scale(const dragarc_drag *drag);

/* Make `drag` a table model (keeping its scale); copies x and y (n >= 2, x strictly increasing and positive for a
 * Reynolds axis, y positive). Monotone (Steffen) interpolation for n >= 3, linear for n = 2, clamped
 * at the ends. On failure the drag is left untouched and err->field names "points[i]". */
int dragarc_drag_table_set(dragarc_drag *drag, dragarc_drag_axis axis, const double *x, const double *y,
                           size_t n, dragarc_error *err);

/* Make `drag` a spin_table model: copies nre >= 2 Reynolds numbers (positive, strictly increasing), ns >= 2
 * spin factors (from 0 to 10, strictly increasing) and Cd values cd[i * ns + j] at (re[i], s[j]) (positive).
 * Bilinear interpolation in (ln Re, S) (GSL's gsl_interp2d_bilinear), clamped at the edges. On failure the
 * drag is left untouched and err->field names "reynolds[i]", "spin_factor[j]" or "cd[i][j]". */
int dragarc_drag_spin_table_set(dragarc_drag *drag, const double *re, size_t nre, const double *s, size_t ns,
                                const double *cd, dragarc_error *err);

/* Deep copy src into dst (dst is overwritten without being cleared). */
int dragarc_drag_copy(dragarc_drag *dst, const dragarc_drag *src, dragarc_error *err);

/* Free a table's storage and reset to model none. Safe on any drag. */
void dragarc_drag_clear(dragarc_drag *drag);

/* Check a drag law's parameters; err->field is relative to the drag object ("cd", "k", ...). */
int dragarc_drag_check(const dragarc_drag *drag, dragarc_error *err);

/* Cd of the smooth-sphere correlation of Clift, Grace & Weber (1978), Table 5.2, at Reynolds
 * number re >= 0 (returns +inf at 0). */
double dragarc_sphere_cd(double re);

/* Cd * Re / 24 of the same correlation: finite as Re -> 0, where it tends to 1 (Stokes' law). */
double dragarc_sphere_cd_re24(double re);

/* Drag coefficient of a Cd-based model at the given flow (constant, sphere, table), times its scale; NaN for
 * the models that are not written with a Cd (none, linear, quadratic). */
double dragarc_drag_cd(const dragarc_drag *drag, double reynolds, double mach, double speed);

/* The drag factor D (kg/s) at air-relative speed `speed` (m/s), for a body of diameter d (m) and
 * reference area (m^2), not spinning (S = 0). Finite for speed = 0. */
double dragarc_drag_factor(const dragarc_drag *drag, double speed, const dragarc_air *air, double diameter,
                           double area);

/* The same at spin factor S >= 0 (only the spin_table model depends on it). */
double dragarc_drag_factor_spin(const dragarc_drag *drag, double speed, const dragarc_air *air, double diameter,
                                double area, double spin_factor);

#ifdef __cplusplus
}
#endif
#endif
