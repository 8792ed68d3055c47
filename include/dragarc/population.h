/* population.h: where people are: a population density field over the local ground plane, uniform or a
 * regular grid of cells read from a CSV file.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Positions are east and north in metres in the scenario's local frame; densities are people per km^2 (as
 * census grids give them; dragarc_casualty_expectation turns them into people per m^2). A grid is piecewise
 * constant: a point takes the density of the cell it lies in, each cell the half-open rectangle
 * [centre - size/2, centre + size/2) in each direction, so a point on the edge between two cells belongs to the
 * one east (north) of it. Outside the grid the density is the background: 0 unless set (a user's estimate of
 * the people around the mapped area). The CSV format is in docs/models.md, "Casualty expectation".
 */
#ifndef DRAGARC_POPULATION_H
#define DRAGARC_POPULATION_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* A density field. Uniform when nx = ny = 0 (the background everywhere). */
typedef struct dragarc_population {
    double background;      /* people/km^2 outside the grid, or everywhere for a uniform field */
    size_t nx, ny;          /* cells east and north; 0 for a uniform field */
    double east0, north0;   /* m, centre of the south-west cell */
    double dx, dy;          /* m, cell size east and north */
    double *density;        /* nx * ny people/km^2, density[j * nx + i] for the i-th cell east, j-th north; owned */
} dragarc_population;

/* Most cells read from one file. */
#define DRAGARC_POPULATION_MAX_CELLS 4000000u
/* Largest population file read, bytes (4 million rows of about 60 characters). */
#define DRAGARC_POPULATION_MAX_BYTES (256u << 20)

/* A uniform field of per_km2 people/km^2 (finite, not negative; else DRAGARC_EINVAL, field "density"). Owns
 * nothing, but dragarc_population_clear may be called on it. */
int dragarc_population_uniform(dragarc_population *p, double per_km2, dragarc_error *err);

/* Set the density outside a grid (finite, not negative; else DRAGARC_EINVAL, field "background"). */
int dragarc_population_set_background(dragarc_population *p, double per_km2, dragarc_error *err);

/* Parse CSV text: a header naming the columns east_m, north_m, people_per_km2 (any order, any case), then one
 * cell centre a row in any order. The centres must fill a regular grid (at least 2 x 2 cells, at most
 * DRAGARC_POPULATION_MAX_CELLS): each cell once, none missing. DRAGARC_EINVAL with field "line N: column" (or
 * "line N", or "" for the file as a whole) and a message quoting the bad text; DRAGARC_ENOMEM. The background
 * is 0. Caller frees with dragarc_population_clear, also after a failure. */
int dragarc_population_parse(const char *text, dragarc_population *p, dragarc_error *err);

/* Read and parse the file at path. On failure the field starts with the path ("grid.csv: line 7:
 * people_per_km2"), so that the message names the file, the line and the column by itself; DRAGARC_EIO when
 * the file cannot be read. */
int dragarc_population_read(const char *path, dragarc_population *p, dragarc_error *err);

/* Free the grid; the struct is then a uniform field of 0. NULL is fine. */
void dragarc_population_clear(dragarc_population *p);

/* The density at (east, north), people/km^2: the cell's, or the background outside the grid. */
double dragarc_population_density(const dragarc_population *p, double east, double north);

#ifdef __cplusplus
}
#endif
#endif
