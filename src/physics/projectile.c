/* projectile.c: checks and ownership of a projectile record.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <string.h>

#include "dragarc/projectile.h"

int dragarc_projectile_check(const dragarc_projectile *p, dragarc_error *err)
{
    if (!(p->mass > 0.0 && isfinite(p->mass)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "mass", "must be positive, in kg (got %g)", p->mass);
    if (!(p->diameter > 0.0 && isfinite(p->diameter)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "diameter", "must be positive, in m (got %g)", p->diameter);
    if (!(p->area > 0.0 && isfinite(p->area)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "area", "must be positive, in m^2 (got %g)", p->area);
    if (!(p->volume >= 0.0 && isfinite(p->volume)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "volume", "must be zero or positive, in m^3 (got %g)",
                                 p->volume);
    /* Smits & Smith's coefficient for a golf ball is about 2e-5 (recalled): 1e-2 would stop the spin within
     * a few ball diameters of flight, far beyond any ball's. */
    if (!(p->spin_decay_coefficient >= 0.0 && p->spin_decay_coefficient <= 1e-2))
        return dragarc_error_set(err, DRAGARC_EINVAL, "spin_decay_coefficient", "must be between 0 and 0.01 (got %g)",
                                 p->spin_decay_coefficient);
    if (!(p->inertia_factor == 0.0 || (p->inertia_factor > 0.0 && p->inertia_factor <= DRAGARC_INERTIA_FACTOR_MAX)))
        return dragarc_error_set(err, DRAGARC_EINVAL, "inertia_factor",
                                 "must be above 0 and at most 0.667 (2/3, a thin shell) (got %g)", p->inertia_factor);
    int rc = dragarc_evaporation_check(&p->evaporation, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "evaporation");
        return rc;
    }
    if (p->evaporation.enabled && !(p->density > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "evaporation",
                                 "needs the drop's density (projectile.density) rather than a mass: the mass follows "
                                 "the shrinking volume");
    rc = dragarc_lift_check(&p->lift, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "lift");
        return rc;
    }
    rc = dragarc_drag_check(&p->drag, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, "drag");
    return rc;
}

void dragarc_projectile_clear(dragarc_projectile *p)
{
    if (!p)
        return;
    dragarc_drag_clear(&p->drag);
    dragarc_lift_clear(&p->lift);
    memset(p, 0, sizeof *p);
}

int dragarc_projectile_copy(dragarc_projectile *dst, const dragarc_projectile *src, dragarc_error *err)
{
    *dst = *src;
    dst->lift.s = dst->lift.c = NULL;
    dst->lift.interp = NULL;
    int rc = dragarc_drag_copy(&dst->drag, &src->drag, err);
    if (rc == DRAGARC_OK && (rc = dragarc_lift_copy(&dst->lift, &src->lift, err)) != DRAGARC_OK)
        dragarc_drag_clear(&dst->drag);
    return rc;
}
