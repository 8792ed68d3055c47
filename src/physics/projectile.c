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
    if (p->lift.model == DRAGARC_LIFT_CONSTANT && !(p->lift.cl >= 0.0 && p->lift.cl <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "lift.cl", "must be between 0 and 1 (got %g)", p->lift.cl);
    if (p->lift.model != DRAGARC_LIFT_NONE && p->lift.model != DRAGARC_LIFT_CONSTANT)
        return dragarc_error_set(err, DRAGARC_EINVAL, "lift.model", "unknown lift model %d", (int)p->lift.model);
    int rc = dragarc_drag_check(&p->drag, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, "drag");
    return rc;
}

void dragarc_projectile_clear(dragarc_projectile *p)
{
    if (!p)
        return;
    dragarc_drag_clear(&p->drag);
    memset(p, 0, sizeof *p);
}

int dragarc_projectile_copy(dragarc_projectile *dst, const dragarc_projectile *src, dragarc_error *err)
{
    *dst = *src;
    return dragarc_drag_copy(&dst->drag, &src->drag, err);
}
