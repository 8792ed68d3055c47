/* lift.h: the lift of a spinning ball (the Magnus force) and the spin factor it depends on.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 *   F_L = 1/2 rho C_L A |v_rel|^2  along (w x v_rel) / |w x v_rel|,   S = r w_perp / |v_rel|
 * where w_perp = |w^ x v_rel^| w is the spin about an axis perpendicular to the relative velocity (spin about
 * the direction of flight, "gyrospin", turns no air sideways) and r is the ball's radius. Models:
 *   constant     C_L = cl whenever the ball spins
 *   sawicki2003  C_L = 1.5 S for S < 0.1, 0.09 + 0.6 S above (Sawicki, Hubbard & Stronge 2003, Am. J. Phys.
 *                71:1152, the fit to baseball measurements used there)
 *   table        C_L tabulated against S (monotone Steffen interpolation, held at the end values)
 */
#ifndef DRAGARC_LIFT_H
#define DRAGARC_LIFT_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

typedef enum dragarc_lift_model {
    DRAGARC_LIFT_NONE = 0,
    DRAGARC_LIFT_CONSTANT,    /* C_L = cl whenever the spin rate is not zero */
    DRAGARC_LIFT_SAWICKI2003, /* the baseball fit of Sawicki, Hubbard & Stronge (2003) */
    DRAGARC_LIFT_TABLE        /* C_L against the spin factor S */
} dragarc_lift_model;

/* A lift law. A table owns its arrays and interpolation object: make one with dragarc_lift_table_set, free
 * it with dragarc_lift_clear, copy with dragarc_lift_copy. */
typedef struct dragarc_lift {
    dragarc_lift_model model;
    double cl;      /* constant model, 0 to 1 */
    size_t npoints; /* table */
    double *s;      /* spin factors, from 0 up, strictly increasing */
    double *c;      /* C_L there, 0 to 1 */
    void *interp;   /* gsl_interp *, owned */
} dragarc_lift;

/* "none", "constant", "sawicki2003", "table"; NULL for an unknown value. */
const char *dragarc_lift_model_name(dragarc_lift_model model);
int dragarc_lift_model_from_name(const char *name, dragarc_lift_model *out);

/* Make `lift` a table: copies n >= 2 points (S >= 0 strictly increasing, C_L in [0, 1]). Linear for n = 2,
 * Steffen's monotone cubic for n >= 3. On failure the lift is untouched and err->field names "points[i]". */
int dragarc_lift_table_set(dragarc_lift *lift, const double *s, const double *cl, size_t n, dragarc_error *err);

/* Deep copy (dst overwritten without being cleared); free a table's storage and reset to none. */
int dragarc_lift_copy(dragarc_lift *dst, const dragarc_lift *src, dragarc_error *err);
void dragarc_lift_clear(dragarc_lift *lift);

/* Check the parameters; err->field relative to the lift object ("cl", "points", ...). */
int dragarc_lift_check(const dragarc_lift *lift, dragarc_error *err);

/* C_L at spin factor S >= 0 (0 for the model none). */
double dragarc_lift_coefficient(const dragarc_lift *lift, double spin_factor);

#ifdef __cplusplus
}
#endif
#endif
