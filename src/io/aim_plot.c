/* aim_plot.c: the picture of the launches that land on a target (`dragarc aim --plot`), drawn through plot.c.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * One side view: every solution flown again with samples (dragarc_aim_solution_fly, ending on the target plane as
 * the solver's flights do), drawn as height above the scenario's ground, h = z - z_ground, against downrange along
 * the nominal launch azimuth psi0, x_d = x sin(psi0) + y cos(psi0) -- the line the target's --range is measured
 * along, so the target sits at x_d = range whatever the azimuth correction. The launch point and the target are
 * marked. Nothing here is computed that the solver did not: the flights are the solutions' own.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/plot.h"

enum { NSAMPLES = 600 }; /* samples a flight, about: smooth at any size the page is drawn */

/* "12.34°" for an angle in degrees (rad: radians, in the display's unit), "31.2 m/s" for a speed. */
static void angle_text(char *buf, size_t n, const dragarc_unit_out *ua, double rad)
{
    double v = dragarc_display_value(ua, rad / DRAGARC_DEG);
    if (strcmp(ua->symbol, "degree") == 0)
        snprintf(buf, n, "%.2f\u00b0", v);
    else
        snprintf(buf, n, "%.4g %s", v, ua->symbol);
}

int dragarc_aim_plot(const char *path, const dragarc_scenario *s, const dragarc_aim_request *req,
                     const dragarc_aim_result *r, const dragarc_display *d, const char *title, dragarc_error *err)
{
    if (!r || r->nsolutions == 0 || r->nsolutions > DRAGARC_AIM_MAX_SOLUTIONS)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "an aim plot needs at least one solution");
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    const dragarc_unit_out *ul = dragarc_display_unit(d, NULL, DRAGARC_Q_LENGTH);
    const dragarc_unit_out *ua = dragarc_display_unit(d, NULL, DRAGARC_Q_ANGLE);
    const dragarc_unit_out *uv = dragarc_display_unit(d, "launch_speed", DRAGARC_Q_SPEED);
    size_t ns = r->nsolutions;
    dragarc_plot_series series[DRAGARC_AIM_MAX_SOLUTIONS + 2];
    char labels[DRAGARC_AIM_MAX_SOLUTIONS][96];
    double *xy[DRAGARC_AIM_MAX_SOLUTIONS] = {0};
    double az = s->launch.azimuth, zg = s->ground_elevation;
    int rc = DRAGARC_OK;
    for (size_t k = 0; k < ns && rc == DRAGARC_OK; k++) {
        const dragarc_aim_solution *q = &r->solutions[k];
        double dt = q->time_of_flight / NSAMPLES;
        dragarc_flight f;
        rc = dragarc_aim_solution_fly(s, req, q, dt > 0.0 ? dt : 1e-3, &f, err);
        if (rc == DRAGARC_OK && !(xy[k] = malloc(2 * f.npoints * sizeof *xy[k])))
            rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
        if (rc == DRAGARC_OK) {
            double *x = xy[k], *y = x + f.npoints;
            for (size_t i = 0; i < f.npoints; i++) {
                const double *p = f.points[i].pos;
                x[i] = dragarc_display_value(ul, p[0] * sin(az) + p[1] * cos(az));
                y[i] = dragarc_display_value(ul, p[2] - zg);
            }
            char value[48], branch[32];
            if (req->mode == DRAGARC_AIM_ELEVATION)
                angle_text(value, sizeof value, ua, q->elevation);
            else
                snprintf(value, sizeof value, "%.4g %s", dragarc_display_value(uv, q->speed), uv->symbol);
            if (req->mode == DRAGARC_AIM_ELEVATION && ns == 2)
                snprintf(branch, sizeof branch, "%s, ", k == 0 ? "direct" : "lofted");
            else if (ns > 1)
                snprintf(branch, sizeof branch, "solution %zu, ", k + 1);
            else
                branch[0] = '\0';
            snprintf(labels[k], sizeof labels[k], "%s%s %s", branch,
                     req->mode == DRAGARC_AIM_ELEVATION ? "elevation" : "speed", value);
            series[k] = (dragarc_plot_series){.label = labels[k], .x = x, .y = y, .n = f.npoints};
            dragarc_plot_family_look(k, &series[k]);
        }
        dragarc_flight_clear(&f);
    }
    if (rc == DRAGARC_OK) {
        double plane = isnan(req->height) ? zg : req->height;
        double launch_x = 0.0, launch_y = dragarc_display_value(ul, s->launch.height - zg);
        double target_x = dragarc_display_value(ul, req->range), target_y = dragarc_display_value(ul, plane - zg);
        series[ns] = (dragarc_plot_series){.label = "launch", .x = &launch_x, .y = &launch_y, .n = 1,
                                           .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                           .marker = DRAGARC_PLOT_SQUARE};
        series[ns + 1] = (dragarc_plot_series){.label = "target", .x = &target_x, .y = &target_y, .n = 1,
                                               .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_BLACK,
                                               .marker = DRAGARC_PLOT_CIRCLE};
        const char *name = title ? title : s->name[0] ? s->name : "aim";
        char head[256], xl[96], yl[96], cross[64] = "";
        if (req->crossrange != 0.0)
            snprintf(cross, sizeof cross, ", %.4g %s %s", fabs(dragarc_display_value(ul, req->crossrange)), ul->symbol,
                     req->crossrange > 0.0 ? "right" : "left");
        snprintf(head, sizeof head, "%s: onto the target at %.4g %s%s", name, target_x, ul->symbol, cross);
        snprintf(xl, sizeof xl, "downrange (%s)", ul->symbol);
        snprintf(yl, sizeof yl, "height above the ground (%s)", ul->symbol);
        dragarc_plot_panel panel = {.title = head, .xlabel = xl, .ylabel = yl, .series = series, .nseries = ns + 2};
        dragarc_plot_figure fig = {.panels = &panel, .npanels = 1, .page_height = 520.0};
        rc = dragarc_plot_write(path, &fig, err);
    }
    for (size_t k = 0; k < ns; k++)
        free(xy[k]);
    return rc;
}
