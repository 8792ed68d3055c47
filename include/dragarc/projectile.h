/* projectile.h: the body in flight: mass, size and drag law.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_PROJECTILE_H
#define DRAGARC_PROJECTILE_H

#include "dragarc/drag.h"
#include "dragarc/dragarc.h"
#include "dragarc/evaporation.h"
#include "dragarc/lift.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The largest inertia factor accepted: 2/3 (a thin shell, the most a ball's mass can hold away from its
 * centre) written to three digits, so that 0.667 is read as the shell. */
#define DRAGARC_INERTIA_FACTOR_MAX 0.667

typedef struct dragarc_projectile {
    char name[64];      /* profile name or "" */
    double mass;        /* kg, > 0 */
    double diameter;    /* m, > 0: the length in the Reynolds number */
    double area;        /* m^2, reference area for Cd (default pi d^2 / 4) */
    double volume;      /* m^3, for buoyancy (default pi d^3 / 6) */
    double density;     /* kg/m^3 when the mass was given as density x volume, else 0 */
    dragarc_drag drag;  /* owned (tables) */
    dragarc_lift lift;  /* none by default; owned (tables) */
    double spin_decay_coefficient; /* k in dw/dt = -k w |v_rel| / r (Smits & Smith 1994); 0: none */
    double inertia_factor;         /* a in I = a m r^2: 0.4 solid sphere, 2/3 thin shell; 0: not given */
    dragarc_evaporation evaporation; /* a water drop that evaporates in flight (off by default) */
} dragarc_projectile;

/* Check mass, diameter, area, volume, drag, lift and spin decay; err->field relative to the projectile object. */
int dragarc_projectile_check(const dragarc_projectile *p, dragarc_error *err);

/* Free what the projectile owns (its drag and lift tables). */
void dragarc_projectile_clear(dragarc_projectile *p);

/* Deep copy; dst is overwritten without being cleared. */
int dragarc_projectile_copy(dragarc_projectile *dst, const dragarc_projectile *src, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
