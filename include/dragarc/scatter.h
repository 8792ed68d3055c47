/* scatter.h: statistics of a cloud of impact points (Monte Carlo samples) on a local flat ground: weighted
 * mean and covariance, dispersion ellipses and their containment, downrange and crossrange percentiles, a
 * density grid, highest-density regions traced as polygons, and weighted statistics of a value per point.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Pure computation: nothing here reads or writes files. Points are (east, north) in metres in the local frame;
 * each may carry a weight: the number of real fragments (or any frequency) one sample stands for; a NULL weight
 * array means every weight is 1. Weights are finite and >= 0, their total > 0; points of weight 0 count for
 * nothing. Angles are radians, azimuths clockwise from north. The estimators and conventions are in
 * docs/models.md, "Impact statistics".
 */
#ifndef DRAGARC_SCATTER_H
#define DRAGARC_SCATTER_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- moments ------------------------------------------------------------------------------------------- */

/* The weighted mean (m) and the unbiased covariance with frequency weights (m^2) of n points:
 *   mean = sum w_i x_i / W,  cov = sum w_i (x_i - mean)(x_i - mean)^T / (W - 1),  W = sum w_i,
 * the sample covariance of the points each repeated w_i times. cov = {ee, en, nn}. Borrows the arrays.
 * DRAGARC_EINVAL naming "east[i]", "north[i]" or "weight[i]" and the value, or "weight" when n = 0 or W <= 1
 * (the covariance needs more than one fragment). All points at one place give cov = 0, not an error. */
int dragarc_scatter_moments(size_t n, const double *east, const double *north, const double *weight,
                            double mean[2], double cov[3], dragarc_error *err);

/* ---- dispersion ellipses ------------------------------------------------------------------------------- */

/* The k-sigma ellipse of a 2-D normal with the given mean and covariance: the points at Mahalanobis distance
 * <= k from the centre. */
typedef struct dragarc_scatter_ellipse {
    double centre[2];              /* m, east and north */
    double semi_major, semi_minor; /* m, k sqrt(lambda_1), k sqrt(lambda_2), lambda the covariance's eigenvalues */
    double azimuth;                /* rad in [0, pi), of the major axis, clockwise from north (0 for a circle) */
    double k_sigma;                /* k */
    double probability;            /* containment of a 2-D normal, 1 - exp(-k^2/2): 39.3 %, 86.5 %, 98.9 % at 1, 2, 3 */
} dragarc_scatter_ellipse;

/* The k-sigma ellipse (k finite, > 0) of mean (m) and cov = {ee, en, nn} (m^2). DRAGARC_EINVAL naming "k",
 * "mean" or "cov" for a non-finite value, a covariance that is not positive semi-definite, a zero covariance
 * (every point at one place), or a singular one: lambda_2 <= 1e-10 lambda_1, the points on a line, for which
 * no ellipse (and no Mahalanobis distance) exists; the message gives the line's azimuth. */
int dragarc_scatter_ellipse_of(const double mean[2], const double cov[3], double k, dragarc_scatter_ellipse *ell,
                               dragarc_error *err);

/* k for a containment probability (0 < probability < 1) of a 2-D normal: k = sqrt(-2 ln(1 - probability)),
 * 2.146 for 90 %, 3.035 for 99 %. DRAGARC_EINVAL naming "probability". */
int dragarc_scatter_ellipse_k(double probability, double *k, dragarc_error *err);

/* m points on the ellipse (m >= 3) into ring_xy[0 .. 2(m+1) - 1] as (east, north) pairs, m at equal steps of
 * the eccentric angle starting at the end of the major axis, counter-clockwise, the first point repeated at
 * the end (closed). */
void dragarc_scatter_ellipse_ring(const dragarc_scatter_ellipse *ell, size_t m, double *ring_xy);

/* The weighted fraction of the n points inside the ellipse, boundary included: Mahalanobis distance <= k,
 * i.e. (u / semi_major)^2 + (v / semi_minor)^2 <= 1 along the axes. Borrows the arrays. DRAGARC_EINVAL naming
 * "east[i]", "north[i]", "weight[i]", "weight" (n = 0, total 0) or "ellipse" (semi-axes not > 0). */
int dragarc_scatter_fraction_inside(size_t n, const double *east, const double *north, const double *weight,
                                    const dragarc_scatter_ellipse *ell, double *fraction, dragarc_error *err);

/* ---- weighted quantiles -------------------------------------------------------------------------------- */

/* Weighted quantiles of value[0..n-1] at probs[0..nprob-1] (each in [0, 1]) into q[0..nprob-1]. Definition:
 * equal values are merged (their weights summed), points of weight 0 dropped; the distinct values v_1 < ... <
 * v_m with weights W_k and cumulative weights C_k sit at plotting positions P_k = (C_k - W_k / 2) / W; the
 * quantile is linear in p between them, v_1 below P_1, v_m above P_m. With equal weights and no ties this is
 * Hyndman and Fan's definition 5 (P_k = (k - 1/2) / n); a point of weight 3 gives the same quantiles as three
 * points of weight 1 at the same place. DRAGARC_EINVAL naming "value[i]", "weight[i]", "weight", "probs[k]";
 * DRAGARC_ENOMEM. */
int dragarc_scatter_quantiles(size_t n, const double *value, const double *weight, const double *probs, size_t nprob,
                              double *q, dragarc_error *err);

/* Downrange and crossrange quantiles (m): each point projected on the axis of azimuth (rad, clockwise from
 * north) through the origin, down = e sin az + n cos az, and on its perpendicular, cross = e cos az - n sin az
 * (positive to the right of downrange); the quantiles of each as dragarc_scatter_quantiles, into down[] and
 * cross[] (nprob each). Errors as dragarc_scatter_quantiles, "east[i]", "north[i]", "azimuth". */
int dragarc_scatter_extent(size_t n, const double *east, const double *north, const double *weight, double azimuth,
                           const double *probs, size_t nprob, double *down, double *cross, dragarc_error *err);

/* ---- a value per point (impact energy, speed, ...) ---------------------------------------------------- */

/* The weighted mean of value[0..n-1]. DRAGARC_EINVAL naming "value[i]", "weight[i]" or "weight". */
int dragarc_scatter_mean(size_t n, const double *value, const double *weight, double *mean, dragarc_error *err);

/* The weighted fraction of the points whose value is strictly above threshold (e.g. the share of fragments
 * that land with more than 15 J). DRAGARC_EINVAL naming "value[i]", "weight[i]", "weight" or "threshold". */
int dragarc_scatter_fraction_above(size_t n, const double *value, const double *weight, double threshold,
                                   double *fraction, dragarc_error *err);

/* ---- density grid -------------------------------------------------------------------------------------- */

/* The largest grid dragarc_scatter_grid_build makes, and dragarc_scatter_region_of accepts (cells). */
#define DRAGARC_SCATTER_GRID_MAX_CELLS 4000000

typedef enum dragarc_scatter_density {
    DRAGARC_SCATTER_WEIGHT_PER_KM2 = 0, /* sum of the weights in a cell / cell area: fragments per km^2 */
    DRAGARC_SCATTER_PROBABILITY_PER_KM2 /* the same divided by the total weight: impact probability per km^2 */
} dragarc_scatter_density;

/* Square cells of side `cell`; cell (i, j) is [x0 + i cell, x0 + (i+1) cell) x [y0 + j cell, y0 + (j+1) cell). */
typedef struct dragarc_scatter_grid {
    double x0, y0;                   /* m, east and north of the south-west corner of cell (0, 0) */
    double cell;                     /* m, the side of a cell */
    size_t nx, ny;                   /* cells east and north */
    double *value;                   /* value[j * nx + i], owned: the density of cell (i, j), per km^2 */
    dragarc_scatter_density density; /* what value holds */
    double total_weight;             /* sum of the weights of the points */
} dragarc_scatter_grid;

/* The density grid of n points. cell (m) > 0, or 0 for the automatic size: Scott's rule for a bivariate normal,
 * 3.504 sigma_2 n^(-1/4), sigma_2 = sqrt of the covariance's smaller eigenvalue and n the number of points of
 * positive weight, but never under 1/1000 of the longer side of the points' extent (it needs the covariance:
 * a total weight above 1). The grid is aligned on multiples of the cell and covers the points of positive
 * weight with one empty cell on every side. Fills *g, which the caller frees with dragarc_scatter_grid_clear
 * (also after a failure). DRAGARC_EINVAL naming "east[i]", "north[i]", "weight[i]", "weight", "cell" (not
 * finite, negative, automatic with every point at one place, or a grid over DRAGARC_SCATTER_GRID_MAX_CELLS
 * cells), "density"; DRAGARC_ENOMEM. */
int dragarc_scatter_grid_build(size_t n, const double *east, const double *north, const double *weight, double cell,
                               dragarc_scatter_density density, dragarc_scatter_grid *g, dragarc_error *err);

/* The most memory (bytes) a grid of `cells` cells takes at once while it is built and its regions traced
 * (dragarc_scatter_grid_build, then dragarc_scatter_region_of): its values and the histogram it is counted in, and
 * the region's sorted cells, flags, pieces, vertex marks and boundary paths. Pure arithmetic on sizeof. */
double dragarc_scatter_grid_memory(size_t cells);

/* Free what dragarc_scatter_grid_build allocated; the struct may then be reused. NULL is fine. */
void dragarc_scatter_grid_clear(dragarc_scatter_grid *g);

/* ---- highest-density regions --------------------------------------------------------------------------- */

/* A closed ring: n points (the first repeated as the last), xy[2k] east and xy[2k+1] north, m. */
typedef struct dragarc_scatter_ring {
    size_t n;
    double *xy; /* owned */
} dragarc_scatter_ring;

/* One piece of a region: its exterior ring (counter-clockwise) and its holes (clockwise). */
typedef struct dragarc_scatter_polygon {
    dragarc_scatter_ring exterior;
    size_t nholes;
    dragarc_scatter_ring *holes; /* owned */
    double area;                 /* m^2, the exterior's area less the holes' */
} dragarc_scatter_polygon;

/* The smallest set of cells, taken in decreasing density, whose weight reaches a fraction of the total, and its
 * boundary: the union of the cells exactly, as polygons. Cells that touch only at a corner belong to different
 * polygons; no ring passes through a point twice (a ring that would is cut there into two); rings may touch
 * each other at corners. */
typedef struct dragarc_scatter_region {
    double probability;       /* the fraction asked */
    double fraction;          /* the fraction reached, >= probability */
    double density_threshold; /* the lowest density of a cell in the region, the grid's unit */
    size_t ncells;            /* cells in the region */
    double area;              /* m^2, ncells cell^2 */
    size_t npolygons;
    dragarc_scatter_polygon *polygons; /* owned */
} dragarc_scatter_region;

/* The highest-density region of grid g holding `probability` (0 < probability <= 1) of its weight. Equal
 * densities are taken south row first, then west first. g may be any grid (values finite, >= 0, not all 0; at
 * most DRAGARC_SCATTER_GRID_MAX_CELLS cells); borrows it. Fills *r, which the caller frees with
 * dragarc_scatter_region_clear (also after a failure). DRAGARC_EINVAL naming "probability" or "grid.<field>";
 * DRAGARC_ENOMEM. */
int dragarc_scatter_region_of(const dragarc_scatter_grid *g, double probability, dragarc_scatter_region *r,
                              dragarc_error *err);

/* Free what dragarc_scatter_region_of allocated; the struct may then be reused. NULL is fine. */
void dragarc_scatter_region_clear(dragarc_scatter_region *r);

/* Every ring of region r (each polygon's exterior, then its holes) one after another into x[] and y[], each
 * followed by one NaN point that ends it (the form of plot.h's series), coordinates times scale (1e-3: km).
 * Writes at most cap points (x and y may be NULL when cap is 0); returns how many the whole outline takes, so a
 * first call with cap 0 sizes the arrays. r NULL or empty: 0. */
size_t dragarc_scatter_region_outline(const dragarc_scatter_region *r, double scale, double *x, double *y, size_t cap);

#ifdef __cplusplus
}
#endif
#endif
