/* scenario.c: defaults, validation and ownership of a scenario record.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/scenario.h"

void dragarc_scenario_default(dragarc_scenario *s)
{
    memset(s, 0, sizeof *s);
    s->gravity = DRAGARC_ISA_G0;
    dragarc_atmosphere_default(&s->atmosphere);
    dragarc_wind_default(&s->wind);
    dragarc_earth_default(&s->earth);
    s->solver.rtol = 1e-8;
    s->solver.atol = 1e-6;
    s->solver.max_time = 3600.0;
    s->solver.max_steps = 1000000;
    s->solver.method = DRAGARC_METHOD_AUTO;
    /* When the bouncing stops: numerical settings, not physics (docs/models.md): a rebound that would rise
     * less than 5 mm, or the 50th impact, ends in the roll-out. */
    s->bounce.min_height = 0.005;
    s->bounce.max_bounces = 50;
}

int dragarc_scenario_check(const dragarc_scenario *s, dragarc_error *err)
{
    int rc = dragarc_projectile_check(&s->projectile, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "projectile");
        return rc;
    }
    const dragarc_launch *l = &s->launch;
    if (!(l->speed >= 0.0 && l->speed <= 2.0e4))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.speed", "must be between 0 and 20000 m/s (got %g)",
                                 l->speed);
    if (!(fabs(l->elevation) <= 0.5 * DRAGARC_PI + 1e-12))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.elevation",
                                 "must be between -90 and 90 degrees (got %g)", l->elevation / DRAGARC_DEG);
    if (!isfinite(l->azimuth))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.azimuth", "must be a finite angle in degrees");
    if (!isfinite(l->height))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.height", "must be a finite height in m");
    if (!(l->spin_rate >= 0.0 && l->spin_rate <= 60000.0 * 2.0 * DRAGARC_PI / 60.0)) /* the reader's rpm arithmetic */
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.rate", "must be between 0 and 60000 rpm (got %g)",
                                 l->spin_rate * 60.0 / (2.0 * DRAGARC_PI));
    if (!(fabs(l->spin_tilt) <= DRAGARC_PI + 1e-12))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.tilt", "must be between -180 and 180 degrees");
    if (l->spin_axis_given && !(fabs(hypot(hypot(l->spin_axis[0], l->spin_axis[1]), l->spin_axis[2]) - 1.0) < 1e-9))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.vector", "the spin axis must be a unit vector");
    if (!(l->spin_decay_time == 0.0 || (l->spin_decay_time > 0.0 && isfinite(l->spin_decay_time))))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.decay_time", "must be positive, in s (got %g)",
                                 l->spin_decay_time);
    if (l->spin_decay_time > 0.0 && s->projectile.spin_decay_coefficient > 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.spin.decay_time",
                                 "give either this or projectile.spin_decay_coefficient, not both");
    if (s->projectile.evaporation.enabled && s->atmosphere.model != DRAGARC_ATMOSPHERE_LOCAL)
        return dragarc_error_set(err, DRAGARC_EINVAL, "projectile.evaporation",
                                 "needs environment.atmosphere.model \"local\": the air's temperature and relative "
                                 "humidity drive the evaporation");
    if (s->ground_surface_given) {
        if ((rc = dragarc_surface_check(&s->surface, err)) != DRAGARC_OK) {
            dragarc_error_prefix(err, "ground.surface");
            return rc;
        }
        if ((rc = dragarc_bounce_limits_check(&s->bounce, err)) != DRAGARC_OK) {
            dragarc_error_prefix(err, "ground.bounce");
            return rc;
        }
    }
    if (!isfinite(s->ground_elevation))
        return dragarc_error_set(err, DRAGARC_EINVAL, "ground.elevation", "must be a finite height in m");
    /* A launch below the impact plane (a throw up onto a terrace or roof) must climb through it. */
    if (l->height < s->ground_elevation && !(l->speed > 0.0 && l->elevation > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.height",
                                 "%g m is below ground.elevation (%g m) and the launch does not climb: the flight "
                                 "would never come down onto the ground plane",
                                 l->height, s->ground_elevation);
    if (l->height == s->ground_elevation && !(l->speed > 0.0 && l->elevation > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "launch.height",
                                 "the projectile starts on the ground without climbing: raise launch.height "
                                 "or launch upward");
    if (!(s->gravity > 0.0 && s->gravity <= 300.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "environment.gravity",
                                 "must be positive and at most 300 m/s^2 (got %g)", s->gravity);
    rc = dragarc_atmosphere_check(&s->atmosphere, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "environment.atmosphere");
        return rc;
    }
    if ((rc = dragarc_earth_check(&s->earth, err)) != DRAGARC_OK) {
        dragarc_error_prefix(err, "environment.earth");
        return rc;
    }
    if (s->earth.model == DRAGARC_EARTH_SPHERICAL && s->ground_surface_given)
        return dragarc_error_set(err, DRAGARC_EINVAL, "ground.surface",
                                 "bouncing and rolling are modelled on a flat Earth only: remove ground.surface or use "
                                 "environment.earth.model \"flat\"");
    if (s->atmosphere.model == DRAGARC_ATMOSPHERE_ISA) {
        double top = s->atmosphere.site_elevation + l->height, bottom = s->atmosphere.site_elevation + s->ground_elevation;
        if (top > DRAGARC_ISA_Z_MAX)
            return dragarc_error_set(err, DRAGARC_EINVAL, "launch.height",
                                     "the launch point is at %g m altitude, above the 86000 m top of the U.S. "
                                     "Standard Atmosphere 1976 model",
                                     top);
        if (bottom < DRAGARC_ISA_Z_MIN)
            return dragarc_error_set(err, DRAGARC_EINVAL, "ground.elevation",
                                     "the ground is at %g m altitude, below the -5000 m bottom of the U.S. "
                                     "Standard Atmosphere 1976 model",
                                     bottom);
    }
    if (s->atmosphere.model == DRAGARC_ATMOSPHERE_LOCAL) {
        if (l->height > DRAGARC_LOCAL_Z_MAX)
            return dragarc_error_set(err, DRAGARC_EINVAL, "launch.height",
                                     "%g m is above the 11000 m top of the 'local' atmosphere model", l->height);
        if (s->ground_elevation < DRAGARC_LOCAL_Z_MIN)
            return dragarc_error_set(err, DRAGARC_EINVAL, "ground.elevation",
                                     "%g m is below the -1000 m bottom of the 'local' atmosphere model",
                                     s->ground_elevation);
    }
    rc = dragarc_wind_check(&s->wind, err);
    if (rc != DRAGARC_OK) {
        dragarc_error_prefix(err, "environment.wind");
        return rc;
    }
    const dragarc_solver_options *o = &s->solver;
    if (!(o->rtol >= 1e-14 && o->rtol <= 1e-2))
        return dragarc_error_set(err, DRAGARC_EINVAL, "solver.rtol", "must be between 1e-14 and 1e-2 (got %g)", o->rtol);
    if (!(o->atol >= 1e-14 && o->atol <= 1.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "solver.atol", "must be between 1e-14 and 1 (got %g)", o->atol);
    if (!(o->max_time > 0.0 && o->max_time <= 1e7))
        return dragarc_error_set(err, DRAGARC_EINVAL, "solver.max_time",
                                 "must be positive and at most 1e7 s (got %g)", o->max_time);
    if (!(o->max_steps >= 10 && o->max_steps <= 100000000L))
        return dragarc_error_set(err, DRAGARC_EINVAL, "solver.max_steps", "must be between 10 and 1e8 (got %ld)",
                                 o->max_steps);
    return DRAGARC_OK;
}

int dragarc_scenario_set_latitude(dragarc_scenario *s, double latitude, dragarc_error *err)
{
    if (!(fabs(latitude) <= 0.5 * DRAGARC_PI + 1e-12))
        return dragarc_error_set(err, DRAGARC_EINVAL, "environment.earth.latitude",
                                 "must be between -90 and 90 degrees (got %g)", latitude / DRAGARC_DEG);
    s->earth.latitude = latitude;
    s->earth.latitude_given = 1;
    return DRAGARC_OK;
}

int dragarc_scenario_copy(dragarc_scenario *dst, const dragarc_scenario *src, dragarc_error *err)
{
    *dst = *src;
    dst->projectile.drag.x = dst->projectile.drag.u = dst->projectile.drag.y = NULL;
    dst->projectile.drag.interp = NULL;
    dst->wind.layers = NULL;
    dst->wind.nlayers = 0;
    int rc = dragarc_projectile_copy(&dst->projectile, &src->projectile, err);
    if (rc == DRAGARC_OK)
        rc = dragarc_wind_copy(&dst->wind, &src->wind, err);
    if (rc != DRAGARC_OK)
        dragarc_scenario_clear(dst);
    return rc;
}

void dragarc_scenario_clear(dragarc_scenario *s)
{
    if (!s)
        return;
    dragarc_projectile_clear(&s->projectile);
    dragarc_wind_clear(&s->wind);
    dragarc_scenario_default(s);
}
