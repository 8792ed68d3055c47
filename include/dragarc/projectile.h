/* projectile.h: the body in flight: mass, size and drag law.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_PROJECTILE_H
#define DRAGARC_PROJECTILE_H

#include "dragarc/drag.h"
#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Lift of a spinning body (docs/models.md): F_L = 1/2 rho C_L A |v_rel|^2 along (w x v_rel)/|w x v_rel|. */
typedef enum dragarc_lift_model {
    DRAGARC_LIFT_NONE = 0,
    DRAGARC_LIFT_CONSTANT /* C_L = cl whenever the spin rate is not zero */
} dragarc_lift_model;

typedef struct dragarc_lift {
    dragarc_lift_model model;
    double cl; /* constant model, 0 to 1 */
} dragarc_lift;

typedef struct dragarc_projectile {
    char name[64];      /* profile name or "" */
    double mass;        /* kg, > 0 */
    double diameter;    /* m, > 0: the length in the Reynolds number */
    double area;        /* m^2, reference area for Cd (default pi d^2 / 4) */
    double volume;      /* m^3, for buoyancy (default pi d^3 / 6) */
    double density;     /* kg/m^3 when the mass was given as density x volume, else 0 */
    dragarc_drag drag;  /* owned (tables) */
    dragarc_lift lift;  /* none by default */
} dragarc_projectile;

/* Check mass, diameter, area, volume and drag; err->field relative to the projectile object. */
int dragarc_projectile_check(const dragarc_projectile *p, dragarc_error *err);

/* Free what the projectile owns (its drag table). */
void dragarc_projectile_clear(dragarc_projectile *p);

/* Deep copy; dst is overwritten without being cleared. */
int dragarc_projectile_copy(dragarc_projectile *dst, const dragarc_projectile *src, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
