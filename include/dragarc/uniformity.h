/* uniformity.h: how evenly water (or spray) lands: Christiansen's uniformity coefficient, the low-quarter
 * distribution uniformity and plain statistics of catch-can depths, and the combined application rate of one
 * sprinkler's pattern overlapped on a square, rectangular or triangular layout.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Pure computation: nothing here reads or writes files. The formulas, their sources and the conventions
 * chosen (the low quarter when the count is not a multiple of 4, area weights) are in docs/uniformity.md.
 */
#ifndef DRAGARC_UNIFORMITY_H
#define DRAGARC_UNIFORMITY_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* ---- uniformity of a set of catches ---------------------------------------------------------------- */

/* The uniformity of n catches. Depths (or volumes, or rates) are in any one unit: the mean, min, max and
 * sd carry it, the other values are ratios. With areas, every statistic weights each catch by its area. */
typedef struct dragarc_uniformity {
    size_t n;                /* catches */
    double total_area;       /* sum of the areas; n when the areas are equal (not given) */
    double mean;             /* area-weighted mean depth */
    double min, max;         /* smallest and largest depth */
    double sd;               /* sample standard deviation (n - 1 divisor; GSL's weighted form with areas) */
    double cv;               /* coefficient of variation sd / mean, a fraction */
    double cu;               /* Christiansen's uniformity coefficient, % (may be negative for very uneven catches) */
    double low_quarter_mean; /* mean depth of the lowest quarter of the area */
    double du_lq;            /* low-quarter distribution uniformity 100 low_quarter_mean / mean, % */
} dragarc_uniformity;

/* The uniformity of depth[0..n-1] (finite, >= 0, not all 0), each catch with area area[i] (finite, > 0; NULL:
 * equal areas); n >= 2. Borrows the arrays. DRAGARC_EINVAL naming "depth[i]" or "area[i]" and the value, or
 * "depth" when every catch is 0 (CU and DU are undefined); DRAGARC_ENOMEM. */
int dragarc_uniformity_compute(const double *depth, const double *area, size_t n, dragarc_uniformity *u,
                               dragarc_error *err);

/* The rules for one catch, as dragarc_uniformity_compute applies them: DRAGARC_EINVAL with field "depth" or
 * "area" and the bad value, for readers that say where the value came from. area NaN: not given. */
int dragarc_uniformity_check_catch(double depth, double area, dragarc_error *err);

/* ---- one sprinkler's application pattern ----------------------------------------------------------- */

/* The application rate (mm/h, or any unit: the overlap keeps it) at an offset from one sprinkler: a radial
 * profile for still air, or a grid of rates for a pattern the wind has pushed off centre. Opaque. */
typedef struct dragarc_spray_pattern dragarc_spray_pattern;

/* A radial profile: rate[i] at distance r[i] (m) from the sprinkler, r[0] = 0 < r[1] < ... (n >= 2), rates
 * finite and >= 0; linear in r between points (GSL interp), 0 beyond r[n-1]. Copies the arrays; the caller
 * frees *out with dragarc_spray_pattern_free. DRAGARC_EINVAL naming "pattern.r[i]" or "pattern.rate[i]",
 * DRAGARC_ENOMEM. */
int dragarc_spray_pattern_radial(const double *r, const double *rate, size_t n, dragarc_spray_pattern **out,
                                 dragarc_error *err);

/* A grid of rates: rate[j * nx + i] at (x0 + i dx, y0 + j dy) m from the sprinkler (x along the layout's
 * spacing S, y along its rows), nx, ny >= 2, dx, dy > 0; bilinear between the points (GSL interp2d), 0
 * outside the grid. Copies the rates; caller frees with dragarc_spray_pattern_free. DRAGARC_EINVAL naming
 * "pattern.<field>", DRAGARC_ENOMEM. */
int dragarc_spray_pattern_grid(double x0, double y0, double dx, double dy, size_t nx, size_t ny, const double *rate,
                               dragarc_spray_pattern **out, dragarc_error *err);

/* The rate at offset (x, y) m from the sprinkler; 0 out of reach. Safe from several threads at once. */
double dragarc_spray_pattern_eval(const dragarc_spray_pattern *p, double x, double y);

/* The farthest distance (m) at which the pattern can be non-zero: r[n-1], or the grid's farthest corner. */
double dragarc_spray_pattern_reach(const dragarc_spray_pattern *p);

/* Free a pattern; NULL is fine. */
void dragarc_spray_pattern_free(dragarc_spray_pattern *p);

/* ---- layouts and the overlap ----------------------------------------------------------------------- */

typedef enum dragarc_layout_kind {
    DRAGARC_LAYOUT_SQUARE = 0,  /* sprinklers at (i S, j S) */
    DRAGARC_LAYOUT_RECTANGULAR, /* at (i S, j L): S along the rows (x), L between rows (y) */
    DRAGARC_LAYOUT_TRIANGULAR   /* equilateral: rows S sqrt(3)/2 apart, every other row shifted by S/2 */
} dragarc_layout_kind;

typedef struct dragarc_layout {
    dragarc_layout_kind kind;
    double spacing;     /* m, S: between sprinklers in a row (the side of the triangles) */
    double row_spacing; /* m, L: between rows; used only by the rectangular layout */
} dragarc_layout;

/* The most catch points along one side of the cell, and the farthest reach, in spacings, the overlap takes. */
#define DRAGARC_OVERLAP_MAX_POINTS 2000
#define DRAGARC_OVERLAP_MAX_REACH 50.0

/* Check a layout: spacings finite and > 0. DRAGARC_EINVAL naming "layout.spacing" or "layout.row_spacing". */
int dragarc_layout_check(const dragarc_layout *l, dragarc_error *err);

/* The representative cell [0, *width] x [0, *height] (m): S x S, S x L, or S x S sqrt(3)/2 for the triangular
 * layout, whose cell holds the area of one sprinkler (sprinklers at its corners (0,0), (S,0) and at (S/2,
 * height) on its top edge). */
void dragarc_layout_cell(const dragarc_layout *l, double *width, double *height);

/* The combined rate at (x, y) m: the sum of the pattern at the offset from every sprinkler of the layout
 * within its reach (a sprinkler at the origin). NaN when the layout fails dragarc_layout_check, the pattern
 * reaches more than DRAGARC_OVERLAP_MAX_REACH spacings, or x or y is not finite. */
double dragarc_overlap_rate_at(const dragarc_spray_pattern *p, const dragarc_layout *l, double x, double y);

/* The overlap on a grid of catch points over the representative cell: nx x ny points at the centres of
 * equal sub-cells, point (i, j) at ((i + 1/2) width / nx, (j + 1/2) height / ny). */
typedef struct dragarc_overlap {
    size_t nx, ny;            /* catch points along x and y */
    double width, height;     /* m, the representative cell */
    double *rate;             /* rate[j * nx + i], owned: the combined rate at point (i, j), the pattern's unit */
    dragarc_uniformity stats; /* of the rates, equal areas: mean rate, CU, DU, ... */
} dragarc_overlap;

/* Overlap pattern p on layout l at nx x ny catch points (1 to DRAGARC_OVERLAP_MAX_POINTS each, nx ny >= 2);
 * fills *o, which the caller frees with dragarc_overlap_clear (also after a failure). DRAGARC_EINVAL naming
 * "layout.*", "points" or "pattern" (a reach above DRAGARC_OVERLAP_MAX_REACH spacings; nothing lands: every
 * rate 0), DRAGARC_ENOMEM. */
int dragarc_overlap_run(const dragarc_spray_pattern *p, const dragarc_layout *l, size_t nx, size_t ny,
                        dragarc_overlap *o, dragarc_error *err);

/* Free what dragarc_overlap_run allocated; the struct may then be reused. NULL is fine. */
void dragarc_overlap_clear(dragarc_overlap *o);

#ifdef __cplusplus
}
#endif
#endif
