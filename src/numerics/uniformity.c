/* uniformity.c: how evenly a sprinkler system (or a sprayer) applies water: statistics of catches, and one
 * sprinkler's pattern overlapped on a layout.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Catches x_i with areas a_i (equal areas: a_i = 1), A = sum a_i, mean m = sum a_i x_i / A:
 *   Christiansen's uniformity coefficient  CU = 100 (1 - sum a_i |x_i - m| / sum a_i x_i),
 *     with equal areas 100 (1 - sum |x_i - m| / (n m))  (Christiansen, J. E. 1942, Irrigation by sprinkling,
 *     University of California Agricultural Experiment Station Bulletin 670);
 *   low-quarter distribution uniformity  DU_lq = 100 m_lq / m, m_lq the mean of the lowest quarter of the
 *     catches (recalled: Merriam, J. L. and Keller, J. 1978, Farm irrigation system evaluation: a guide for
 *     management, Utah State University; Burt, C. M. et al. 1997, Irrigation performance measures:
 *     efficiency and uniformity, J. Irrig. Drain. Eng. 123(6), 423-442).
 *     The lowest quarter is taken by area: the catches sorted from the driest, each adds its area until a
 *     quarter of A is reached, the one that crosses it adding only the part of its area that completes the
 *     quarter. With equal areas that is the lowest n/4 catches, the boundary catch with weight frac(n/4) (n = 10:
 *     (x_1 + x_2 + x_3 / 2) / 2.5). Common practice, no source: the published definition is stated for
 *     equal-area cans and says nothing about an n that is not a multiple of 4; this reading is continuous in
 *     the data and gives the same answer as splitting every can into four equal parts.
 *   sd: the sample standard deviation (GSL gsl_stats_sd, divisor n - 1; with areas gsl_stats_wsd, which is the
 *     same for equal areas), CV = sd / m.
 *
 * The overlap: the combined rate at a point is the sum over every sprinkler of the layout within reach of
 * the pattern evaluated at the point's offset from it. Catch points sit at the centres of an nx x ny split of
 * one representative cell, a region that tiles the field under the layout's translations, so the mean rate
 * over the points is the midpoint-rule estimate of (pattern's flow) / (area per sprinkler).
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_errno.h>
#include <gsl/gsl_interp.h>
#include <gsl/gsl_interp2d.h>
#include <gsl/gsl_sort.h>
#include <gsl/gsl_statistics_double.h>

#include "dragarc/uniformity.h"

/* ---- uniformity of a set of catches ---------------------------------------------------------------- */

int dragarc_uniformity_check_catch(double depth, double area, dragarc_error *err)
{
    if (!isfinite(depth))
        return dragarc_error_set(err, DRAGARC_EINVAL, "depth", "must be a finite number (got %g)", depth);
    if (depth < 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "depth", "must not be negative (got %g): a can catches 0 or more",
                                 depth);
    if (!isnan(area) && !(isfinite(area) && area > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "area", "must be a positive finite number (got %g)", area);
    return DRAGARC_OK;
}

/* Mean of the lowest quarter of the area, the boundary catch counted by the part of its area that completes it. */
static int low_quarter_mean(const double *depth, const double *area, size_t n, double total, double *out,
                            dragarc_error *err)
{
    size_t *order = malloc(n * sizeof *order);
    if (!order)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory sorting %zu catches", n);
    gsl_sort_index(order, depth, 1, n);
    double quarter = 0.25 * total, taken = 0.0, sum = 0.0;
    for (size_t k = 0; k < n && taken < quarter; k++) {
        size_t i = order[k];
        double w = fmin(area ? area[i] : 1.0, quarter - taken);
        sum += w * depth[i];
        taken += w;
    }
    free(order);
    *out = sum / quarter;
    return DRAGARC_OK;
}

int dragarc_uniformity_compute(const double *depth, const double *area, size_t n, dragarc_uniformity *u,
                               dragarc_error *err)
{
    memset(u, 0, sizeof *u);
    if (n < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "depth", "needs at least 2 catches (got %zu)", n);
    double total = 0.0;
    for (size_t i = 0; i < n; i++) {
        int rc = dragarc_uniformity_check_catch(depth[i], area ? area[i] : NAN, err);
        if (rc != DRAGARC_OK) {
            if (err) {
                char name[32];
                snprintf(name, sizeof name, "%s[%zu]", err->field, i);
                snprintf(err->field, sizeof err->field, "%s", name);
            }
            return rc;
        }
        total += area ? area[i] : 1.0;
    }
    u->n = n;
    u->total_area = total;
    u->mean = area ? gsl_stats_wmean(area, 1, depth, 1, n) : gsl_stats_mean(depth, 1, n);
    if (!(u->mean > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "depth",
                                 "every catch is 0: with a mean of 0, CU and DU are undefined");
    gsl_stats_minmax(&u->min, &u->max, depth, 1, n);
    u->sd = area ? gsl_stats_wsd(area, 1, depth, 1, n) : gsl_stats_sd(depth, 1, n);
    u->cv = u->sd / u->mean;
    double dev = 0.0, caught = 0.0;
    for (size_t i = 0; i < n; i++) {
        double a = area ? area[i] : 1.0;
        dev += a * fabs(depth[i] - u->mean);
        caught += a * depth[i];
    }
    u->cu = 100.0 * (1.0 - dev / caught);
    int rc = low_quarter_mean(depth, area, n, total, &u->low_quarter_mean, err);
    if (rc != DRAGARC_OK)
        return rc;
    u->du_lq = 100.0 * u->low_quarter_mean / u->mean;
    return DRAGARC_OK;
}

/* ---- one sprinkler's pattern ----------------------------------------------------------------------- */

struct dragarc_spray_pattern {
    int grid;      /* 0: radial profile, 1: grid */
    size_t nx, ny; /* points (radial: nx, ny = 1) */
    double *x;     /* radial: r; grid: x of each column */
    double *y;     /* grid: y of each row */
    double *rate;  /* radial: rate[i]; grid: rate[j * nx + i] */
    double reach;  /* m */
    gsl_interp *ip;
    gsl_interp2d *ip2;
};

void dragarc_spray_pattern_free(dragarc_spray_pattern *p)
{
    if (!p)
        return;
    gsl_interp_free(p->ip);
    gsl_interp2d_free(p->ip2);
    free(p->x);
    free(p->y);
    free(p->rate);
    free(p);
}

/* Every rate finite and >= 0. */
static int check_rates(const double *rate, size_t n, dragarc_error *err)
{
    for (size_t i = 0; i < n; i++)
        if (!isfinite(rate[i]) || rate[i] < 0.0)
            return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.rate",
                                     "rate[%zu] must be a finite number >= 0 (got %g)", i, rate[i]);
    return DRAGARC_OK;
}

/* A pattern holding a copy of the nx * ny rates, with room for nx x values (and ny y values on a grid);
 * NULL when out of memory. */
static dragarc_spray_pattern *pattern_new(int grid, size_t nx, size_t ny, const double *rate)
{
    dragarc_spray_pattern *p = calloc(1, sizeof *p);
    if (!p)
        return NULL;
    p->grid = grid;
    p->nx = nx;
    p->ny = ny;
    p->x = malloc(nx * sizeof *p->x);
    p->y = grid ? malloc(ny * sizeof *p->y) : NULL;
    p->rate = malloc(nx * ny * sizeof *p->rate);
    if (!p->x || (grid && !p->y) || !p->rate) {
        dragarc_spray_pattern_free(p);
        return NULL;
    }
    memcpy(p->rate, rate, nx * ny * sizeof *rate);
    return p;
}

/* Hand the pattern over once GSL's interpolation is allocated and set up (status), or free it. */
static int pattern_done(dragarc_spray_pattern *p, int allocated, int status, dragarc_spray_pattern **out,
                        dragarc_error *err)
{
    if (allocated && status == GSL_SUCCESS) {
        *out = p;
        return DRAGARC_OK;
    }
    dragarc_spray_pattern_free(p);
    if (!allocated)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "pattern", "out of memory for the pattern's interpolation");
    return dragarc_error_set(err, DRAGARC_EINVAL, "pattern", "GSL could not set up the interpolation (%s)",
                             gsl_strerror(status));
}

int dragarc_spray_pattern_radial(const double *r, const double *rate, size_t n, dragarc_spray_pattern **out,
                                 dragarc_error *err)
{
    *out = NULL;
    if (n < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.r", "needs at least 2 points (got %zu)", n);
    if (r[0] != 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.r",
                                 "r[0] must be 0, the sprinkler itself (got %g): give the rate there", r[0]);
    for (size_t i = 1; i < n; i++)
        if (!isfinite(r[i]) || !(r[i] > r[i - 1]))
            return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.r",
                                     "r[%zu] must be finite and above r[%zu] (got %g after %g)", i, i - 1, r[i],
                                     r[i - 1]);
    int rc = check_rates(rate, n, err);
    if (rc != DRAGARC_OK)
        return rc;
    dragarc_spray_pattern *p = pattern_new(0, n, 1, rate);
    if (!p)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "pattern", "out of memory for a %zu-point profile", n);
    memcpy(p->x, r, n * sizeof *r);
    p->reach = r[n - 1];
    p->ip = gsl_interp_alloc(gsl_interp_linear, n);
    return pattern_done(p, p->ip != NULL, p->ip ? gsl_interp_init(p->ip, p->x, p->rate, n) : GSL_ENOMEM, out, err);
}

#define GRID_MAX_SIDE 100000 /* points along one side of a grid pattern */

int dragarc_spray_pattern_grid(double x0, double y0, double dx, double dy, size_t nx, size_t ny, const double *rate,
                               dragarc_spray_pattern **out, dragarc_error *err)
{
    *out = NULL;
    if (nx < 2 || ny < 2 || nx > GRID_MAX_SIDE || ny > GRID_MAX_SIDE)
        return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.nx",
                                 "the grid needs 2 to %d points each way (got %zu x %zu)", GRID_MAX_SIDE, nx, ny);
    if (!(isfinite(dx) && dx > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.dx", "must be a positive finite number (got %g)", dx);
    if (!(isfinite(dy) && dy > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.dy", "must be a positive finite number (got %g)", dy);
    double x1 = x0 + (double)(nx - 1) * dx, y1 = y0 + (double)(ny - 1) * dy;
    if (!isfinite(x0) || !isfinite(x1))
        return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.x0", "the grid's x must stay finite (x0 %g)", x0);
    if (!isfinite(y0) || !isfinite(y1))
        return dragarc_error_set(err, DRAGARC_EINVAL, "pattern.y0", "the grid's y must stay finite (y0 %g)", y0);
    int rc = check_rates(rate, nx * ny, err);
    if (rc != DRAGARC_OK)
        return rc;
    dragarc_spray_pattern *p = pattern_new(1, nx, ny, rate);
    if (!p)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "pattern", "out of memory for a %zu x %zu grid", nx, ny);
    for (size_t i = 0; i < nx; i++)
        p->x[i] = x0 + (double)i * dx;
    for (size_t j = 0; j < ny; j++)
        p->y[j] = y0 + (double)j * dy;
    p->reach = fmax(fmax(hypot(x0, y0), hypot(x1, y0)), fmax(hypot(x0, y1), hypot(x1, y1)));
    p->ip2 = gsl_interp2d_alloc(gsl_interp2d_bilinear, nx, ny);
    return pattern_done(p, p->ip2 != NULL,
                        p->ip2 ? gsl_interp2d_init(p->ip2, p->x, p->y, p->rate, nx, ny) : GSL_ENOMEM, out, err);
}

double dragarc_spray_pattern_eval(const dragarc_spray_pattern *p, double x, double y)
{
    if (!p->grid) {
        double r = hypot(x, y);
        return r <= p->reach ? gsl_interp_eval(p->ip, p->x, p->rate, r, NULL) : 0.0;
    }
    if (!(x >= p->x[0] && x <= p->x[p->nx - 1] && y >= p->y[0] && y <= p->y[p->ny - 1]))
        return 0.0;
    return gsl_interp2d_eval(p->ip2, p->x, p->y, p->rate, x, y, NULL, NULL);
}

double dragarc_spray_pattern_reach(const dragarc_spray_pattern *p) { return p->reach; }

/* ---- layouts and the overlap ----------------------------------------------------------------------- */

int dragarc_layout_check(const dragarc_layout *l, dragarc_error *err)
{
    if (l->kind != DRAGARC_LAYOUT_SQUARE && l->kind != DRAGARC_LAYOUT_RECTANGULAR &&
        l->kind != DRAGARC_LAYOUT_TRIANGULAR)
        return dragarc_error_set(err, DRAGARC_EINVAL, "layout.kind",
                                 "unknown layout %d (square, rectangular, triangular)", (int)l->kind);
    if (!(isfinite(l->spacing) && l->spacing > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "layout.spacing",
                                 "must be a positive finite number of metres (got %g)", l->spacing);
    if (l->kind == DRAGARC_LAYOUT_RECTANGULAR && !(isfinite(l->row_spacing) && l->row_spacing > 0.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "layout.row_spacing",
                                 "must be a positive finite number of metres (got %g)", l->row_spacing);
    return DRAGARC_OK;
}

void dragarc_layout_cell(const dragarc_layout *l, double *width, double *height)
{
    *width = l->spacing;
    switch (l->kind) {
    case DRAGARC_LAYOUT_RECTANGULAR: *height = l->row_spacing; break;
    case DRAGARC_LAYOUT_TRIANGULAR: *height = l->spacing * sqrt(3.0) / 2.0; break;
    default: *height = l->spacing; break;
    }
}

/* The reach in spacings (of the closer of the two directions) must stay bounded: the sum visits every
 * sprinkler in a box of side 2 reach around the point. */
static int reach_ok(const dragarc_spray_pattern *p, const dragarc_layout *l)
{
    double w, h;
    dragarc_layout_cell(l, &w, &h);
    return p->reach <= DRAGARC_OVERLAP_MAX_REACH * fmin(w, h);
}

double dragarc_overlap_rate_at(const dragarc_spray_pattern *p, const dragarc_layout *l, double x, double y)
{
    if (dragarc_layout_check(l, NULL) != DRAGARC_OK || !reach_ok(p, l) || !isfinite(x) || !isfinite(y))
        return NAN;
    double s, h, reach = p->reach, sum = 0.0;
    dragarc_layout_cell(l, &s, &h);
    /* The layout repeats: move the point into the cell by a step from one sprinkler to another (row j of the
     * triangular layout is shifted by S/2 when j is odd), so that the loops below stay short and exact. */
    double row = floor(y / h);
    y -= row * h;
    x -= l->kind == DRAGARC_LAYOUT_TRIANGULAR && fmod(row, 2.0) != 0.0 ? 0.5 * s : 0.0;
    x -= floor(x / s) * s;
    /* one row and one column more each side than the reach needs: rounding must not drop a sprinkler at the
     * reach's edge, and one farther out adds 0 */
    long j0 = (long)floor((y - reach) / h) - 1, j1 = (long)ceil((y + reach) / h) + 1;
    for (long j = j0; j <= j1; j++) {
        double shift = l->kind == DRAGARC_LAYOUT_TRIANGULAR && j % 2 != 0 ? 0.5 * s : 0.0;
        double sy = (double)j * h;
        long i0 = (long)floor((x - shift - reach) / s) - 1, i1 = (long)ceil((x - shift + reach) / s) + 1;
        for (long i = i0; i <= i1; i++)
            sum += dragarc_spray_pattern_eval(p, x - ((double)i * s + shift), y - sy);
    }
    return sum;
}

void dragarc_overlap_clear(dragarc_overlap *o)
{
    if (!o)
        return;
    free(o->rate);
    memset(o, 0, sizeof *o);
}

int dragarc_overlap_run(const dragarc_spray_pattern *p, const dragarc_layout *l, size_t nx, size_t ny,
                        dragarc_overlap *o, dragarc_error *err)
{
    memset(o, 0, sizeof *o);
    int rc = dragarc_layout_check(l, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (nx < 1 || ny < 1 || nx > DRAGARC_OVERLAP_MAX_POINTS || ny > DRAGARC_OVERLAP_MAX_POINTS || nx * ny < 2)
        return dragarc_error_set(err, DRAGARC_EINVAL, "points",
                                 "needs 1 to %d catch points each way, at least 2 in all (got %zu x %zu)",
                                 DRAGARC_OVERLAP_MAX_POINTS, nx, ny);
    if (!reach_ok(p, l))
        return dragarc_error_set(err, DRAGARC_EINVAL, "pattern",
                                 "reaches %g m, more than %g times the layout's spacing: check the units", p->reach,
                                 DRAGARC_OVERLAP_MAX_REACH);
    o->nx = nx;
    o->ny = ny;
    dragarc_layout_cell(l, &o->width, &o->height);
    o->rate = malloc(nx * ny * sizeof *o->rate);
    if (!o->rate)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "points", "out of memory for %zu x %zu catch points", nx, ny);
    for (size_t j = 0; j < ny; j++)
        for (size_t i = 0; i < nx; i++)
            o->rate[j * nx + i] = dragarc_overlap_rate_at(p, l, ((double)i + 0.5) * o->width / (double)nx,
                                                          ((double)j + 0.5) * o->height / (double)ny);
    rc = dragarc_uniformity_compute(o->rate, NULL, nx * ny, &o->stats, err);
    if (rc == DRAGARC_EINVAL)
        return dragarc_error_set(err, rc, "pattern", "nothing lands in the cell: every combined rate is 0");
    return rc;
}
