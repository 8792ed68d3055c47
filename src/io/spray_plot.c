/* spray_plot.c: the pictures of a sprinkler's pattern (`dragarc sprinkler --plot`) and of a spray's drift
 * (`dragarc drift --plot`), drawn through plot.c.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Nothing here computes a new number: the panels draw the result's own profile, grid, deposit bins and classes,
 * converted only in unit (fractions to per cent, metres to micrometres).
 *   sprinkler  the radial profile as steps over its rings (ring k spans [k w, (k+1) w)); the grid of cells as a
 *              colour map, cell for cell (it is already square, east and north of the sprinkler: no resampling);
 *              with a layout, the combined rates at the catch points over the layout's cell (dragarc_sprinkler_overlap,
 *              the numbers behind the reported CU and DU) as a second colour map, the sprinklers at its corners.
 *   drift      the deposit per metre as steps over its bins; the share deposited before x, a running sum over the
 *              bins, linear within each (as dragarc_drift_deposited_within); the spectrum's F(d) sampled evenly
 *              in d between the end classes' bounds, with its Dv10, Dv50, Dv90 (dragarc_spectrum_summarise).
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "dragarc/plot.h"

/* Steps over n bins of width w from x0 with heights v[k] * scale, down to 0 at both ends: 2 n + 2 points. */
static size_t steps(double x0, double w, const double *v, size_t n, double scale, double *x, double *y)
{
    size_t m = 0;
    x[m] = x0, y[m++] = 0.0;
    for (size_t k = 0; k < n; k++) {
        x[m] = x0 + k * w, y[m++] = v[k] * scale;
        x[m] = x0 + (k + 1) * w, y[m++] = v[k] * scale;
    }
    x[m] = x0 + n * w, y[m++] = 0.0;
    return m;
}

static const char *scenario_name(const char *title, const char *name, const char *fallback)
{
    return title ? title : name[0] ? name : fallback;
}

int dragarc_sprinkler_plot(const char *path, const dragarc_sprinkler_spec *spec, const dragarc_sprinkler_result *r,
                           const char *title, dragarc_error *err)
{
    if (!r || r->nrings == 0 || !r->ring_rate || !r->grid_rate || r->nx * r->ny == 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a sprinkler plot needs a computed pattern");
    const char *name = scenario_name(title, spec->base.name, "sprinkler");
    size_t np = 2 * r->nrings + 2;
    double *px = malloc(2 * np * sizeof *px);
    if (!px)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
    double *py = px + np;
    steps(0.0, spec->ring_width, r->ring_rate, r->nrings, 1.0, px, py);
    double peak = 0.0, gmax = 0.0;
    for (size_t k = 0; k < r->nrings; k++)
        peak = fmax(peak, r->ring_rate[k]);
    for (size_t k = 0; k < r->nx * r->ny; k++)
        gmax = fmax(gmax, r->grid_rate[k]);

    /* the profile, and the wetted radius as an upright line */
    char wet_label[96], titles[2][224], bar_label[96];
    double wx[2] = {r->wetted_radius, r->wetted_radius}, wy[2] = {0.0, peak > 0.0 ? 1.05 * peak : 1.0};
    snprintf(wet_label, sizeof wet_label, "wetted radius %.2f m (%.2f mm/h edge)", r->wetted_radius,
             DRAGARC_WETTED_RATE);
    dragarc_plot_series prof[2] = {
        {.label = "application rate", .x = px, .y = py, .n = np, .style = DRAGARC_PLOT_SOLID,
         .colour = DRAGARC_PLOT_BLUE},
        {.label = wet_label, .x = wx, .y = wy, .n = 2, .style = DRAGARC_PLOT_DASHED, .colour = DRAGARC_PLOT_VERMILLION},
    };
    snprintf(titles[0], sizeof titles[0], "%s: radial profile", name);

    /* the grid as a colour map: cells under the wetted rate left white, the scale from there to the wettest cell */
    snprintf(bar_label, sizeof bar_label, "application rate (mm/h); white: under %.2f", DRAGARC_WETTED_RATE);
    int wet = gmax > DRAGARC_WETTED_RATE;
    dragarc_plot_raster grid = {.z = r->grid_rate, .nx = r->nx, .ny = r->ny, .x0 = r->x0,
                                .x1 = r->x0 + r->nx * r->cell, .y0 = r->y0, .y1 = r->y0 + r->ny * r->cell,
                                .zmin = wet ? DRAGARC_WETTED_RATE : 0.0, .zmax = wet ? gmax : 0.0,
                                .label = bar_label};
    double zero = 0.0;
    dragarc_plot_series at[1] = {{.label = "sprinkler", .x = &zero, .y = &zero, .n = 1, .style = DRAGARC_PLOT_MARKERS,
                                  .colour = DRAGARC_PLOT_BLACK, .marker = DRAGARC_PLOT_TRIANGLE}};
    snprintf(titles[1], sizeof titles[1], "%s: pattern on the ground", name);
    char wind_label[96];
    double w[3];
    dragarc_wind_eval(&spec->base.wind, spec->base.launch.height - spec->base.ground_elevation, w);
    dragarc_plot_arrow arrow = {.dx = w[0], .dy = w[1], .label = wind_label, .colour = DRAGARC_PLOT_BLACK};
    snprintf(wind_label, sizeof wind_label, "wind %.2g m/s", hypot(w[0], w[1]));

    dragarc_plot_panel panels[2] = {
        {.title = titles[0], .xlabel = "distance from the sprinkler (m)", .ylabel = "application rate, mean round the arc (mm/h)",
         .series = prof, .nseries = 2},
        {.title = titles[1], .xlabel = "east of the sprinkler (m)", .ylabel = "north of the sprinkler (m)",
         .series = at, .nseries = 1, .equal_scale = 1, .raster = &grid, .scale_bar_unit = "m", .north_arrow = 1,
         .arrow = hypot(w[0], w[1]) > 0.0 ? &arrow : NULL},
    };
    /* with a layout: the overlap over its representative cell, each catch point a cell of the colour map */
    dragarc_plot_panel all[3] = {panels[0], panels[1]};
    dragarc_overlap ov;
    memset(&ov, 0, sizeof ov);
    size_t npanels = 2;
    char title3[224], bar3[96], xl3[96], yl3[96];
    double hx[4], hy[4];
    dragarc_plot_raster cellmap;
    dragarc_plot_series heads[1];
    int rc = DRAGARC_OK;
    if (r->layout_done) {
        static const char *const KIND[] = {"square", "rectangular", "triangular"};
        rc = dragarc_sprinkler_overlap(r, &r->layout, r->layout_points, &ov, err);
        if (rc == DRAGARC_OK) {
            double cw = ov.width, ch = ov.height;
            int tri = r->layout.kind == DRAGARC_LAYOUT_TRIANGULAR;
            size_t nh = tri ? 3 : 4; /* the sprinklers on the cell: its four corners, or the triangle's three */
            const double cx[4] = {0.0, cw, tri ? 0.5 * cw : cw, 0.0}, cy[4] = {0.0, 0.0, ch, ch};
            for (size_t k = 0; k < nh; k++)
                hx[k] = cx[k], hy[k] = cy[k];
            cellmap = (dragarc_plot_raster){.z = ov.rate, .nx = ov.nx, .ny = ov.ny, .x0 = 0.0, .x1 = cw, .y0 = 0.0,
                                            .y1 = ch, .label = bar3};
            snprintf(bar3, sizeof bar3, "combined application rate (mm/h)");
            heads[0] = (dragarc_plot_series){.label = "sprinklers", .x = hx, .y = hy, .n = nh,
                                             .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                             .marker = DRAGARC_PLOT_TRIANGLE};
            snprintf(title3, sizeof title3, "%s: overlapped, %s %.3g m: CU %.0f %%, DU %.0f %%", name,
                     KIND[r->layout.kind], r->layout.spacing, ov.stats.cu, ov.stats.du_lq);
            snprintf(xl3, sizeof xl3, "along the row (m)");
            snprintf(yl3, sizeof yl3, "across the rows (m)");
            all[2] = (dragarc_plot_panel){.title = title3, .xlabel = xl3, .ylabel = yl3, .series = heads,
                                          .nseries = 1, .equal_scale = 1, .raster = &cellmap};
            npanels = 3;
        }
    }
    if (rc == DRAGARC_OK) {
        dragarc_plot_figure fig = {.panels = all, .npanels = npanels, .page_height = npanels == 3 ? 1220.0 : 820.0};
        rc = dragarc_plot_write(path, &fig, err);
    }
    dragarc_overlap_clear(&ov);
    free(px);
    return rc;
}

/* The four size bands of the drift plot, split at Dv10, Dv50 and Dv90. */
enum { NBANDS = 4, NSPECTRUM = 241 };

int dragarc_drift_plot(const char *path, const dragarc_drift_spec *spec, const dragarc_spectrum_class *classes,
                       const dragarc_drift_result *r, const char *title, dragarc_error *err)
{
    if (!r || r->nbins == 0 || !r->deposit || r->nclasses == 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "nothing deposits: there is no deposit to draw");
    dragarc_spectrum_summary sum;
    int rc = dragarc_spectrum_summarise(&spec->spectrum, &sum, err);
    if (rc != DRAGARC_OK)
        return rc;
    const char *name = scenario_name(title, spec->base.name, "spray");
    const size_t nb = r->nbins, n = r->nclasses, np = 2 * nb + 2;
    const double w = r->bin_width, x0 = r->first_bin;
    /* deposit steps; cumulative curves (total and bands) at the nb + 1 bin edges; the spectrum curve */
    double *buf = malloc((2 * np + (NBANDS + 2) * (nb + 1) + 2 * NSPECTRUM) * sizeof *buf);
    if (!buf)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
    double *dx = buf, *dy = dx + np, *edge = dy + np, *cum = edge + nb + 1, *band = cum + nb + 1;
    double *sd = band + NBANDS * (nb + 1), *sf = sd + NSPECTRUM;
    steps(x0, w, r->deposit, nb, 100.0, dx, dy);

    const double split[NBANDS - 1] = {sum.dv10, sum.dv50, sum.dv90};
    double band_volume[NBANDS] = {0.0};
    for (size_t i = 0; i < n; i++) {
        size_t b = 0;
        while (b < NBANDS - 1 && r->classes[i].diameter >= split[b])
            b++;
        band_volume[b] += r->classes[i].fraction;
    }
    edge[0] = x0, cum[0] = 0.0;
    for (size_t b = 0; b < NBANDS; b++)
        band[b * (nb + 1)] = 0.0;
    for (size_t k = 0; k < nb; k++) {
        edge[k + 1] = x0 + (k + 1) * w;
        cum[k + 1] = cum[k] + 100.0 * r->deposit[k] * w;
        double in[NBANDS] = {0.0};
        for (size_t i = 0; i < n; i++) {
            size_t b = 0;
            while (b < NBANDS - 1 && r->classes[i].diameter >= split[b])
                b++;
            in[b] += r->class_deposit[i * nb + k] * w;
        }
        for (size_t b = 0; b < NBANDS; b++)
            band[b * (nb + 1) + k + 1] = band[b * (nb + 1) + k] + (band_volume[b] > 0.0 ? 100.0 * in[b] / band_volume[b] : 0.0);
    }

    /* panel 1: the deposit per metre, and the buffer */
    char buf_label[64], titles[3][224], band_label[NBANDS][96], d_label[3][64], at_buffer_label[96];
    double top = 0.0;
    for (size_t k = 0; k < nb; k++)
        top = fmax(top, 100.0 * r->deposit[k]);
    double bx[2] = {r->buffer, r->buffer}, by[2] = {0.0, top > 0.0 ? 1.05 * top : 1.0}, cy[2] = {0.0, 100.0};
    snprintf(buf_label, sizeof buf_label, "buffer %.3g m", r->buffer);
    dragarc_plot_series dep[2] = {
        {.label = "all drops", .x = dx, .y = dy, .n = np, .style = DRAGARC_PLOT_SOLID, .colour = DRAGARC_PLOT_BLUE},
        {.label = buf_label, .x = bx, .y = by, .n = 2, .style = DRAGARC_PLOT_DASHED, .colour = DRAGARC_PLOT_BLACK},
    };
    snprintf(titles[0], sizeof titles[0], "%s: deposit downwind", name);

    /* panel 2: the share deposited within each distance, of all drops (of the emitted volume) and of each band */
    static const dragarc_plot_style BAND_STYLE[NBANDS] = {DRAGARC_PLOT_DASHED, DRAGARC_PLOT_DOTTED,
                                                          DRAGARC_PLOT_DASHED, DRAGARC_PLOT_DOTTED};
    static const dragarc_plot_colour BAND_COLOUR[NBANDS] = {DRAGARC_PLOT_VERMILLION, DRAGARC_PLOT_SKY_BLUE,
                                                            DRAGARC_PLOT_BLUISH_GREEN, DRAGARC_PLOT_REDDISH_PURPLE};
    const double um = 1e6;
    snprintf(band_label[0], sizeof band_label[0], "< Dv10 %.0f µm", sum.dv10 * um);
    snprintf(band_label[1], sizeof band_label[1], "to Dv50 %.0f µm", sum.dv50 * um);
    snprintf(band_label[2], sizeof band_label[2], "to Dv90 %.0f µm", sum.dv90 * um);
    snprintf(band_label[3], sizeof band_label[3], "> Dv90");
    dragarc_plot_series within[NBANDS + 4];
    size_t nw = 0;
    within[nw++] = (dragarc_plot_series){.label = "all drops", .x = edge, .y = cum, .n = nb + 1,
                                         .style = DRAGARC_PLOT_SOLID, .colour = DRAGARC_PLOT_BLUE};
    for (size_t b = 0; b < NBANDS; b++)
        if (band_volume[b] > 0.0)
            within[nw++] = (dragarc_plot_series){.label = band_label[b], .x = edge, .y = band + b * (nb + 1),
                                                 .n = nb + 1, .style = BAND_STYLE[b], .colour = BAND_COLOUR[b]};
    double q90[2] = {r->distance90, 90.0}, q99[2] = {r->distance99, 99.0};
    if (isfinite(r->distance90))
        within[nw++] = (dragarc_plot_series){.label = "90 %, 99 %", .x = &q90[0], .y = &q90[1], .n = 1,
                                             .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                             .marker = DRAGARC_PLOT_CIRCLE};
    if (isfinite(r->distance99))
        within[nw++] = (dragarc_plot_series){.label = NULL, .x = &q99[0], .y = &q99[1], .n = 1,
                                             .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                             .marker = DRAGARC_PLOT_CIRCLE};
    within[nw++] = (dragarc_plot_series){.label = NULL, .x = bx, .y = cy, .n = 2, .style = DRAGARC_PLOT_DASHED,
                                         .colour = DRAGARC_PLOT_BLACK};
    snprintf(titles[1], sizeof titles[1], "%s: volume deposited within a distance", name);

    /* panel 3: the spectrum's cumulative volume fraction, its quantiles, the smallest drop landing before the buffer */
    double dlo = classes[0].lower, dhi = classes[n - 1].upper;
    for (size_t k = 0; k < NSPECTRUM; k++) {
        double d = dlo + (dhi - dlo) * (double)k / (NSPECTRUM - 1);
        sd[k] = d * um;
        sf[k] = 100.0 * dragarc_spectrum_fraction_below(&spec->spectrum, d);
    }
    double qd[3] = {sum.dv10 * um, sum.dv50 * um, sum.dv90 * um}, qf[3] = {10.0, 50.0, 90.0};
    static const dragarc_plot_marker QMARK[3] = {DRAGARC_PLOT_TRIANGLE, DRAGARC_PLOT_CIRCLE, DRAGARC_PLOT_SQUARE};
    static const char *const QNAME[3] = {"Dv10", "Dv50", "Dv90"};
    dragarc_plot_series spectrum[5];
    size_t ns = 0;
    spectrum[ns++] = (dragarc_plot_series){.label = "spectrum", .x = sd, .y = sf, .n = NSPECTRUM,
                                           .style = DRAGARC_PLOT_SOLID, .colour = DRAGARC_PLOT_BLUE};
    for (int q = 0; q < 3; q++) {
        snprintf(d_label[q], sizeof d_label[q], "%s %.0f µm", QNAME[q], qd[q]);
        spectrum[ns++] = (dragarc_plot_series){.label = d_label[q], .x = &qd[q], .y = &qf[q], .n = 1,
                                               .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                               .marker = QMARK[q]};
    }
    double ax[2] = {r->diameter_at_buffer * um, r->diameter_at_buffer * um};
    if (isfinite(r->diameter_at_buffer)) {
        snprintf(at_buffer_label, sizeof at_buffer_label, "beyond buffer under %.0f µm", ax[0]);
        spectrum[ns++] = (dragarc_plot_series){.label = at_buffer_label, .x = ax, .y = cy, .n = 2,
                                               .style = DRAGARC_PLOT_DASHED, .colour = DRAGARC_PLOT_VERMILLION};
    }
    snprintf(titles[2], sizeof titles[2], "%s: drop-size spectrum", name);

    dragarc_plot_panel panels[3] = {
        {.title = titles[0], .xlabel = "downwind of the nozzle (m)", .ylabel = "deposit (% of the volume per m)",
         .series = dep, .nseries = 2},
        {.title = titles[1], .xlabel = "downwind of the nozzle (m)", .ylabel = "deposited within (% of the volume)",
         .series = within, .nseries = nw},
        {.title = titles[2], .xlabel = "drop diameter (µm)", .ylabel = "cumulative volume (%)", .series = spectrum,
         .nseries = ns},
    };
    dragarc_plot_figure fig = {.panels = panels, .npanels = 3};
    rc = dragarc_plot_write(path, &fig, err);
    free(buf);
    return rc;
}
