/* footprint_plot.c: the pictures of a debris footprint (`dragarc footprint --plot`), drawn through plot.c.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Two maps of the ground, east and north of the point below the breakup (the frame of the run, of --points and of
 * the printed mean impact), at equal scales, with a scale bar and a north arrow, and the same limits so that they
 * compare at a glance:
 *   impacts   every landed sample (or every k-th when there are more than DRAGARC_FOOTPRINT_PLOT_POINTS), those
 *             at or above the hazard energy with their own marker and colour (dragarc_fragment_is_hazardous:
 *             the run computes no hazard area, only which fragments are hazardous); the 1 and 3 sigma ellipses of
 *             all fragments and, when there are at most four classes, the 3 sigma ellipse of each; the point
 *             below the breakup and the mean impact;
 *   density   the fragments per km^2 of the summary's grid as a colour map, in log10 (a footprint's density spans
 *             orders of magnitude between its core and its fringe; a linear scale shows only the core), with the
 *             90, 99 and 99.9 % highest-density contours.
 * Nothing here changes the summary or the impacts: it only reads them.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "dragarc/casualty.h"
#include "dragarc/footprint.h"
#include "dragarc/plot.h"

#define ELLIPSE_VERTICES 96
#define MAX_CLASS_ELLIPSES 4 /* more than this many 3 sigma ellipses of classes would hide each other */
#define POINT_MM 0.45        /* an impact point's marker radius on the page */

/* the classes' ellipses: apart from the hazardous points' vermillion */
static const dragarc_plot_colour CLASS_COLOUR[MAX_CLASS_ELLIPSES] = {
    DRAGARC_PLOT_BLUE, DRAGARC_PLOT_BLUISH_GREEN, DRAGARC_PLOT_REDDISH_PURPLE, DRAGARC_PLOT_ORANGE};

/* The k-sigma ring of ellipse e into x, y (ELLIPSE_VERTICES + 1 points), times scale. */
static void ellipse_ring(const dragarc_scatter_ellipse *e, double scale, double *x, double *y)
{
    double xy[2 * (ELLIPSE_VERTICES + 1)];
    dragarc_scatter_ellipse_ring(e, ELLIPSE_VERTICES, xy);
    for (int i = 0; i <= ELLIPSE_VERTICES; i++)
        x[i] = scale * xy[2 * i], y[i] = scale * xy[2 * i + 1];
}

/* Widen lim (xmin, xmax, ymin, ymax) to the finite points of x, y. */
static void enclose(double lim[4], const double *x, const double *y, size_t n)
{
    for (size_t i = 0; i < n; i++)
        if (isfinite(x[i]) && isfinite(y[i]))
            lim[0] = fmin(lim[0], x[i]), lim[1] = fmax(lim[1], x[i]), lim[2] = fmin(lim[2], y[i]),
            lim[3] = fmax(lim[3], y[i]);
}

/* "1st", "2nd", "3rd", "4th", ... */
static const char *ordinal_suffix(size_t k)
{
    if (k % 100 >= 11 && k % 100 <= 13)
        return "th";
    return k % 10 == 1 ? "st" : k % 10 == 2 ? "nd" : k % 10 == 3 ? "rd" : "th";
}

int dragarc_footprint_plot(const char *path, const struct dragarc_footprint_spec *spec,
                           const struct dragarc_impact *impacts, const struct dragarc_footprint_summary *s,
                           const dragarc_footprint_plot_options *o, dragarc_error *err)
{
    const size_t total = spec->nclasses * spec->samples;
    size_t landed = 0;
    double extent = 0.0; /* m, the largest distance of an impact from the origin */
    for (size_t k = 0; k < total; k++)
        if (impacts[k].status == DRAGARC_OK)
            landed++, extent = fmax(extent, fmax(fabs(impacts[k].east), fabs(impacts[k].north)));
    if (landed == 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "no fragment landed: there is nothing to plot");
    const dragarc_footprint_group *all = &s->groups[spec->nclasses];
    if (all->ellipses_ok)
        extent = fmax(extent, fabs(all->mean[0]) + all->ellipse[2].semi_major);
    const int km = extent > 2500.0; /* maps wider than 5 km read better in km */
    const double scale = km ? 1e-3 : 1.0;
    const char *unit = km ? "km" : "m";
    size_t step = landed > DRAGARC_FOOTPRINT_PLOT_POINTS
                      ? (landed + DRAGARC_FOOTPRINT_PLOT_POINTS - 1) / DRAGARC_FOOTPRINT_PLOT_POINTS
                      : 1;
    size_t ncls_ell = spec->nclasses >= 2 && spec->nclasses <= MAX_CLASS_ELLIPSES ? spec->nclasses : 0;
    size_t nring = ELLIPSE_VERTICES + 1, nout[DRAGARC_FOOTPRINT_NREGIONS] = {0}, nouts = 0;
    for (int k = 0; k < DRAGARC_FOOTPRINT_NREGIONS && s->grid_ok; k++)
        nouts += nout[k] = dragarc_scatter_region_outline(&s->region[k], scale, NULL, NULL, 0);
    size_t ngrid = s->grid_ok ? s->grid.nx * s->grid.ny : 0;
    double *buf = malloc((4 * (landed / step + 1) + 2 * nring * (2 + ncls_ell) + 2 * nouts + ngrid + 1) * sizeof *buf);
    if (!buf)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
    double *px = buf, *py = px + landed / step + 1, *hx = py + landed / step + 1, *hy = hx + landed / step + 1;
    double *ex = hy + landed / step + 1, *ey = ex + nring * (2 + ncls_ell), *cx = ey + nring * (2 + ncls_ell);
    double *cy = cx + nouts, *z = cy + nouts;

    /* the impact points, split by the hazard energy */
    size_t np = 0, nh = 0;
    for (size_t k = 0, seen = 0; k < total; k++) {
        const dragarc_impact *im = &impacts[k];
        if (im->status != DRAGARC_OK || seen++ % step != 0)
            continue;
        if (dragarc_fragment_is_hazardous(im->energy, spec->hazard.energy_threshold))
            hx[nh] = scale * im->east, hy[nh++] = scale * im->north;
        else
            px[np] = scale * im->east, py[np++] = scale * im->north;
    }
    double lim[4] = {0.0, 0.0, 0.0, 0.0}; /* the origin is always on the map */
    enclose(lim, px, py, np);
    enclose(lim, hx, hy, nh);

    char lab_below[96], lab_above[96], lab_cls[MAX_CLASS_ELLIPSES][96];
    snprintf(lab_below, sizeof lab_below, "impact, below %.3g J", spec->hazard.energy_threshold);
    snprintf(lab_above, sizeof lab_above, "impact, %.3g J or more", spec->hazard.energy_threshold);
    dragarc_plot_series map[5 + MAX_CLASS_ELLIPSES + 2];
    size_t nmap = 0;
    /* a kind of impact that does not occur is left out of the legend */
    map[nmap++] = (dragarc_plot_series){.label = np ? lab_below : NULL, .x = px, .y = py, .n = np,
                                        .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_SKY_BLUE,
                                        .marker = DRAGARC_PLOT_CIRCLE, .marker_size = POINT_MM};
    map[nmap++] = (dragarc_plot_series){.label = nh ? lab_above : NULL, .x = hx, .y = hy, .n = nh,
                                        .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_VERMILLION,
                                        .marker = DRAGARC_PLOT_CROSS, .marker_size = 1.3 * POINT_MM};
    if (all->ellipses_ok) {
        static const char *const name[2] = {"1 sigma, all", "3 sigma, all"};
        for (int k = 0; k < 2; k++) {
            ellipse_ring(&all->ellipse[2 * k], scale, ex + k * nring, ey + k * nring);
            enclose(lim, ex + k * nring, ey + k * nring, nring);
            map[nmap++] = (dragarc_plot_series){.label = name[k], .x = ex + k * nring, .y = ey + k * nring, .n = nring,
                                                .style = k ? DRAGARC_PLOT_DASHED : DRAGARC_PLOT_SOLID,
                                                .colour = DRAGARC_PLOT_BLACK};
        }
    }
    for (size_t c = 0; c < ncls_ell; c++) {
        const dragarc_footprint_group *g = &s->groups[c];
        if (!g->ellipses_ok)
            continue;
        double *x = ex + (2 + c) * nring, *y = ey + (2 + c) * nring;
        ellipse_ring(&g->ellipse[2], scale, x, y);
        enclose(lim, x, y, nring);
        const char *cname = spec->classes[c].name[0] ? spec->classes[c].name : "class";
        snprintf(lab_cls[c], sizeof lab_cls[c], "3 sigma, %.60s", cname);
        map[nmap++] = (dragarc_plot_series){.label = lab_cls[c], .x = x, .y = y, .n = nring,
                                            .style = DRAGARC_PLOT_DOTTED, .colour = CLASS_COLOUR[c]};
    }
    double zero = 0.0, mean[2] = {scale * all->mean[0], scale * all->mean[1]};
    map[nmap++] = (dragarc_plot_series){.label = "below the breakup", .x = &zero, .y = &zero, .n = 1,
                                        .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                        .marker = DRAGARC_PLOT_DIAMOND};
    if (all->moments_ok)
        map[nmap++] = (dragarc_plot_series){.label = "mean impact", .x = &mean[0], .y = &mean[1], .n = 1,
                                            .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                            .marker = DRAGARC_PLOT_SQUARE};

    /* the density map: log10 of fragments per km^2, the empty cells left white; the contours over it */
    dragarc_plot_raster raster;
    dragarc_plot_series dens[DRAGARC_FOOTPRINT_NREGIONS + 1];
    size_t ndens = 0;
    char lab_reg[DRAGARC_FOOTPRINT_NREGIONS][48];
    if (s->grid_ok) {
        const dragarc_scatter_grid *g = &s->grid;
        double lo = INFINITY, hi = -INFINITY;
        for (size_t k = 0; k < ngrid; k++) {
            z[k] = g->value[k] > 0.0 ? log10(g->value[k]) : NAN;
            if (isfinite(z[k]))
                lo = fmin(lo, z[k]), hi = fmax(hi, z[k]);
        }
        if (!(hi > lo))
            lo = hi - 1.0;
        raster = (dragarc_plot_raster){.z = z, .nx = g->nx, .ny = g->ny, .x0 = scale * g->x0,
                                       .x1 = scale * (g->x0 + g->cell * (double)g->nx), .y0 = scale * g->y0,
                                       .y1 = scale * (g->y0 + g->cell * (double)g->ny), .zmin = lo, .zmax = hi,
                                       .label = "fragments per km\xc2\xb2, log10"};
        static const dragarc_plot_style style[DRAGARC_FOOTPRINT_NREGIONS] = {DRAGARC_PLOT_SOLID, DRAGARC_PLOT_DASHED,
                                                                            DRAGARC_PLOT_DOTTED};
        size_t at = 0;
        for (int k = 0; k < DRAGARC_FOOTPRINT_NREGIONS; k++) {
            dragarc_scatter_region_outline(&s->region[k], scale, cx + at, cy + at, nout[k]);
            enclose(lim, cx + at, cy + at, nout[k]);
            snprintf(lab_reg[k], sizeof lab_reg[k], "%g %% contour", 100.0 * s->region[k].probability);
            dens[ndens++] = (dragarc_plot_series){.label = lab_reg[k], .x = cx + at, .y = cy + at, .n = nout[k],
                                                  .style = style[k], .colour = DRAGARC_PLOT_VERMILLION};
            at += nout[k];
        }
    }
    dens[ndens++] = (dragarc_plot_series){.label = "below the breakup", .x = &zero, .y = &zero, .n = 1,
                                          .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                          .marker = DRAGARC_PLOT_DIAMOND};

    /* both maps over the same ground: everything drawn, 6 % to spare, at least a metre (or so) across */
    double span = fmax(fmax(lim[1] - lim[0], lim[3] - lim[2]), km ? 1e-3 : 1.0);
    for (int a = 0; a < 4; a += 2)
        lim[a] -= 0.06 * span, lim[a + 1] += 0.06 * span;

    const char *name = o && o->title ? o->title : spec->base.name[0] ? spec->base.name : "footprint";
    char title[2][256], xl[96], yl[96], thinned[96] = "";
    if (step > 1)
        snprintf(thinned, sizeof thinned, ", every %zu%s drawn", step, ordinal_suffix(step));
    snprintf(title[0], sizeof title[0], "%s: %zu impacts%s", name, landed, thinned);
    snprintf(title[1], sizeof title[1], "%s: fragments per km\xc2\xb2 and the contours", name);
    snprintf(xl, sizeof xl, "east of the point below the breakup (%s)", unit);
    snprintf(yl, sizeof yl, "north of the point below the breakup (%s)", unit);
    dragarc_plot_panel panels[2] = {
        {.title = title[0], .xlabel = xl, .ylabel = yl, .series = map, .nseries = nmap, .equal_scale = 1,
         .limits_given = 1, .xmin = lim[0], .xmax = lim[1], .ymin = lim[2], .ymax = lim[3], .scale_bar_unit = unit,
         .north_arrow = 1},
        {.title = title[1], .xlabel = xl, .ylabel = yl, .series = dens, .nseries = ndens, .equal_scale = 1,
         .limits_given = 1, .xmin = lim[0], .xmax = lim[1], .ymin = lim[2], .ymax = lim[3],
         .raster = s->grid_ok ? &raster : NULL, .scale_bar_unit = unit, .north_arrow = 1,
         .note = "An estimate from point-mass fragments: hazard areas are set by the safety authority."},
    };
    dragarc_plot_figure fig = {.panels = panels, .npanels = 2, .page_height = 1080.0};
    int rc = dragarc_plot_write(path, &fig, err);
    free(buf);
    return rc;
}
