/* helpers.h: small builders shared by the test programs.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_TESTS_HELPERS_H
#define DRAGARC_TESTS_HELPERS_H

#include <dirent.h>
#include <string.h>

#include "dragarc/flight.h"
#include "dragarc/scenario.h"

#define PI 3.14159265358979323846
#define DEG (PI / 180.0)

/* A scenario in vacuum-like still fluid of the given density (0 = vacuum, no buoyancy), with a
 * sphere of mass m and diameter d, launched from height h at speed v and elevation el (degrees)
 * toward north; tolerances rtol = atol = tol. */
static inline void make_scenario(dragarc_scenario *s, double density, double m, double d, double h, double v,
                                 double el_deg, double g, double tol)
{
    dragarc_scenario_default(s);
    s->projectile.mass = m;
    s->projectile.diameter = d;
    s->projectile.area = 0.25 * PI * d * d;
    s->projectile.volume = PI * d * d * d / 6.0;
    s->projectile.drag.model = DRAGARC_DRAG_NONE;
    s->atmosphere.model = DRAGARC_ATMOSPHERE_CONSTANT;
    s->atmosphere.density = density;
    s->atmosphere.viscosity = 1.8e-5;
    s->atmosphere.temperature = 293.15;
    s->launch.speed = v;
    s->launch.elevation = el_deg * DEG;
    s->launch.azimuth = 0.0;
    s->launch.height = h;
    s->gravity = g;
    s->solver.rtol = tol;
    s->solver.atol = tol;
}

/* How many entries a folder holds besides . and .. (-1 when it cannot be opened): the tests that write files check
 * with it that nothing (no temporary file) is left behind. */
static inline int folder_entries(const char *folder)
{
    DIR *d = opendir(folder);
    if (!d)
        return -1;
    int n = 0;
    for (struct dirent *e; (e = readdir(d)) != NULL;)
        if (strcmp(e->d_name, ".") != 0 && strcmp(e->d_name, "..") != 0)
            n++;
    closedir(d);
    return n;
}

#endif
