/* population.c: a population density field, uniform or piecewise constant on a regular grid of cells.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The cell of a point: i = floor((x - x_0) / dx + 1/2), j = floor((y - y_0) / dy + 1/2), with (x_0, y_0) the
 * centre of the south-west cell; inside the grid when 0 <= i < nx and 0 <= j < ny, else the background.
 * The reader of grid files is src/io/population_csv.c.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "dragarc/population.h"

static int check_density(double per_km2, const char *field, dragarc_error *err)
{
    if (!(per_km2 >= 0.0 && isfinite(per_km2)))
        return dragarc_error_set(err, DRAGARC_EINVAL, field, "must be a finite number of people per km^2, not "
                                 "negative (got %g)", per_km2);
    return DRAGARC_OK;
}

int dragarc_population_uniform(dragarc_population *p, double per_km2, dragarc_error *err)
{
    memset(p, 0, sizeof *p);
    int rc = check_density(per_km2, "density", err);
    if (rc == DRAGARC_OK)
        p->background = per_km2;
    return rc;
}

int dragarc_population_set_background(dragarc_population *p, double per_km2, dragarc_error *err)
{
    int rc = check_density(per_km2, "background", err);
    if (rc == DRAGARC_OK)
        p->background = per_km2;
    return rc;
}

void dragarc_population_clear(dragarc_population *p)
{
    if (!p)
        return;
    free(p->density);
    memset(p, 0, sizeof *p);
}

double dragarc_population_density(const dragarc_population *p, double east, double north)
{
    if (p->nx == 0 || p->ny == 0 || !p->density)
        return p->background;
    double u = floor((east - p->east0) / p->dx + 0.5), v = floor((north - p->north0) / p->dy + 0.5);
    /* compared as doubles first, so that a point far away (or NaN) never overflows the conversion */
    if (!(u >= 0.0 && u < (double)p->nx && v >= 0.0 && v < (double)p->ny))
        return p->background;
    return p->density[(size_t)v * p->nx + (size_t)u];
}
