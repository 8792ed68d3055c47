/* campaign_plot.c: the map of a campaign (campaign.h): every case's breakup point, mean impact and 1 sigma ellipse
 * in one frame, east and north of the first case's breakup point.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The points come from each case's latitude and longitude through WGS 84 geodesics (geodesy.h: the azimuthal
 * equidistant offsets from the first breakup point). Each ellipse keeps the axes and azimuth of its own case's frame:
 * over the tens of kilometres between breakup points the frames' north differs by well under a degree (the
 * meridians' convergence, about the longitude difference times the sine of the latitude), which the drawing cannot
 * show.
 */
#include <math.h>
#include <stdlib.h>

#include "core/constants.h"
#include "dragarc/campaign.h"
#include "dragarc/geodesy.h"
#include "dragarc/plot.h"

#define RING 73 /* points of an ellipse, the first repeated, and a NaN to end it */
#define NAMED 8 /* up to this many cases, each ellipse is a series of its own, named in the legend */

int dragarc_campaign_plot(const char *path, const dragarc_campaign *c, const dragarc_campaign_row *rows, size_t n,
                          dragarc_error *err)
{
    if (n == 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a campaign map needs at least one case");
    double *bx = malloc(n * sizeof *bx), *by = malloc(n * sizeof *by), *mx = malloc(n * sizeof *mx),
           *my = malloc(n * sizeof *my), *ex = malloc(n * (RING + 1) * sizeof *ex),
           *ey = malloc(n * (RING + 1) * sizeof *ey), *lx = malloc(3 * n * sizeof *lx), *ly = malloc(3 * n * sizeof *ly);
    dragarc_plot_series *s = malloc((NAMED + 3) * sizeof *s);
    int rc = DRAGARC_OK;
    if (!bx || !by || !mx || !my || !ex || !ey || !lx || !ly || !s) {
        rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the campaign's map");
        goto done;
    }
    const double lat0 = rows[0].latitude, lon0 = rows[0].longitude;
    for (size_t i = 0; i < n; i++) {
        const dragarc_campaign_row *r = &rows[i];
        double e = NAN, no = NAN;
        if (dragarc_geo_to_local(lat0, lon0, r->latitude, r->longitude, &e, &no, NULL) != DRAGARC_OK)
            e = no = NAN;
        bx[i] = e / 1e3, by[i] = no / 1e3;
        e = no = NAN;
        if (r->mean_ok && isfinite(r->mean_latitude) &&
            dragarc_geo_to_local(lat0, lon0, r->mean_latitude, r->mean_longitude, &e, &no, NULL) != DRAGARC_OK)
            e = no = NAN;
        mx[i] = e / 1e3, my[i] = no / 1e3;
        /* breakup point to mean impact, a NaN between cases */
        lx[3 * i] = bx[i], ly[3 * i] = by[i], lx[3 * i + 1] = mx[i], ly[3 * i + 1] = my[i];
        lx[3 * i + 2] = ly[3 * i + 2] = NAN;
        double *x = ex + i * (RING + 1), *y = ey + i * (RING + 1);
        for (int k = 0; k < RING; k++) {
            double t = 2.0 * DRAGARC_PI * k / (RING - 1), u = r->semi_major * cos(t), v = r->semi_minor * sin(t);
            double sa = sin(r->azimuth), ca = cos(r->azimuth); /* major axis along (sin az, cos az) */
            x[k] = r->ellipse_ok ? mx[i] + (u * sa + v * ca) / 1e3 : NAN;
            y[k] = r->ellipse_ok ? my[i] + (u * ca - v * sa) / 1e3 : NAN;
        }
        x[RING] = y[RING] = NAN;
    }
    size_t ns = 0;
    s[ns++] = (dragarc_plot_series){.label = "to the mean impact", .x = lx, .y = ly, .n = 3 * n,
                                    .style = DRAGARC_PLOT_DOTTED, .colour = DRAGARC_PLOT_BLACK};
    if (n <= NAMED) {
        for (size_t i = 0; i < n; i++) {
            s[ns] = (dragarc_plot_series){.label = rows[i].name, .x = ex + i * (RING + 1), .y = ey + i * (RING + 1),
                                          .n = RING + 1};
            dragarc_plot_family_look(i, &s[ns]);
            s[ns].style = s[ns].style == DRAGARC_PLOT_MARKERS ? DRAGARC_PLOT_SOLID : s[ns].style;
            ns++;
        }
    } else {
        s[ns++] = (dragarc_plot_series){.label = "1 sigma ellipses", .x = ex, .y = ey, .n = n * (RING + 1),
                                        .style = DRAGARC_PLOT_SOLID, .colour = DRAGARC_PLOT_BLUE};
    }
    s[ns++] = (dragarc_plot_series){.label = "below the breakup", .x = bx, .y = by, .n = n,
                                    .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                    .marker = DRAGARC_PLOT_DIAMOND};
    s[ns++] = (dragarc_plot_series){.label = "mean impact", .x = mx, .y = my, .n = n, .style = DRAGARC_PLOT_MARKERS,
                                    .colour = DRAGARC_PLOT_VERMILLION, .marker = DRAGARC_PLOT_SQUARE};
    dragarc_plot_panel panel = {.title = c->name[0] ? c->name : "campaign", .xlabel = "east of the first case's breakup point (km)",
                                .ylabel = "north (km)", .series = s, .nseries = ns, .equal_scale = 1,
                                .scale_bar_unit = "km", .north_arrow = 1,
                                .note = "An estimate from point-mass fragments: hazard areas are set by the safety "
                                        "authority."};
    dragarc_plot_figure fig = {.panels = &panel, .npanels = 1, .page_height = 520.0};
    rc = dragarc_plot_write(path, &fig, err);
done:
    free(bx), free(by), free(mx), free(my), free(ex), free(ey), free(lx), free(ly), free(s);
    return rc;
}
