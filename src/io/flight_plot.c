/* flight_plot.c: the pictures of one flight (`dragarc fly --plot`), drawn through plot.c.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Three panels from the flight's samples:
 *   side view   height above the ground plane against downrange, x_d = x sin(az) + y cos(az), h = z - z_ground;
 *               with the vacuum path of the same launch (below), the apex and the (first) impact marked;
 *   plan view   crossrange (to the right of the launch line, x_c = x cos(az) - y sin(az)) against downrange, drawn
 *               as seen from above (right of the line downward), with the wind at the launch height as an arrow;
 *   speed       the ground-relative speed against time.
 * The vacuum path is the closed form of a point mass under constant gravity g alone over flat ground,
 *   x_d(t) = v cos(e) t,   h(t) = h0 + v sin(e) t - g t^2 / 2,   0 <= t <= T = (v sin(e) + sqrt(v^2 sin^2(e) + 2 g h0)) / g,
 * (e.g. Halliday, Resnick and Walker, "Fundamentals of Physics", projectile motion; recalled), the same law as
 * dragarc_vacuum_range. The apex is placed at the flight's apex height, downrange interpolated between the samples
 * around the apex time.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "dragarc/plot.h"

size_t dragarc_vacuum_path(const dragarc_scenario *s, size_t n, double *downrange, double *height)
{
    const dragarc_launch *l = &s->launch;
    double vh = l->speed * cos(l->elevation), vz = l->speed * sin(l->elevation), g = s->gravity;
    double h0 = l->height - s->ground_elevation, disc = vz * vz + 2.0 * g * h0;
    if (n < 2 || !(disc >= 0.0) || !(g > 0.0))
        return 0;
    double T = (vz + sqrt(disc)) / g;
    if (!(T >= 0.0))
        return 0;
    for (size_t i = 0; i < n; i++) {
        double t = T * (double)i / (double)(n - 1);
        downrange[i] = vh * t;
        height[i] = i + 1 == n ? 0.0 : h0 + vz * t - 0.5 * g * t * t; /* the last point on the ground exactly */
    }
    return n;
}

/* downrange and crossrange (m) of east, north offsets (m) for launch azimuth az */
static void along_across(double az, double east, double north, double *down, double *cross)
{
    *down = east * sin(az) + north * cos(az);
    *cross = east * cos(az) - north * sin(az);
}

enum { NVACUUM = 241 };

int dragarc_flight_plot(const char *path, const dragarc_scenario *s, const dragarc_flight *f,
                        const dragarc_display *d, const dragarc_flight_plot_options *o, dragarc_error *err)
{
    if (!f || f->npoints < 2 || !f->points)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a flight plot needs a sampled flight (at least two points)");
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    const dragarc_unit_out *ul = dragarc_display_unit(d, NULL, DRAGARC_Q_LENGTH);
    const dragarc_unit_out *uv = dragarc_display_unit(d, NULL, DRAGARC_Q_SPEED);
    const dragarc_unit_out *ut = dragarc_display_unit(d, NULL, DRAGARC_Q_TIME);
    size_t n = f->npoints;
    double *buf = malloc((5 * n + 2 * NVACUUM) * sizeof *buf);
    if (!buf)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
    double *down = buf, *cross = down + n, *height = cross + n, *t = height + n, *speed = t + n;
    double *vdown = speed + n, *vheight = vdown + NVACUUM;
    double az = s->launch.azimuth, zg = s->ground_elevation;
    double apex_down = NAN;
    for (size_t i = 0; i < n; i++) {
        const dragarc_flight_point *p = &f->points[i];
        double dn, cr;
        along_across(az, p->pos[0], p->pos[1], &dn, &cr);
        down[i] = dragarc_display_value(ul, dn);
        cross[i] = dragarc_display_value(ul, cr);
        height[i] = dragarc_display_value(ul, p->pos[2] - zg);
        t[i] = dragarc_display_value(ut, p->t);
        speed[i] = dragarc_display_value(uv, p->speed);
        if (i > 0 && isnan(apex_down) && p->t >= f->apex_time) {
            double t0 = f->points[i - 1].t, w = p->t > t0 ? (f->apex_time - t0) / (p->t - t0) : 1.0;
            apex_down = down[i - 1] + w * (down[i] - down[i - 1]);
        }
    }
    if (isnan(apex_down))
        apex_down = down[0];
    size_t nvac = dragarc_vacuum_path(s, NVACUUM, vdown, vheight);
    for (size_t i = 0; i < nvac; i++) {
        vdown[i] = dragarc_display_value(ul, vdown[i]);
        vheight[i] = dragarc_display_value(ul, vheight[i]);
    }
    double apex_h = dragarc_display_value(ul, f->apex_height - zg);
    double imp_d, imp_c, rest_d, rest_c;
    along_across(az, f->impact[0], f->impact[1], &imp_d, &imp_c);
    along_across(az, f->rest_position[0], f->rest_position[1], &rest_d, &rest_c);
    double imp_h = dragarc_display_value(ul, f->impact[2] - zg), zero = 0.0;
    imp_d = dragarc_display_value(ul, imp_d), imp_c = dragarc_display_value(ul, imp_c);
    rest_d = dragarc_display_value(ul, rest_d), rest_c = dragarc_display_value(ul, rest_c);
    int rolled = s->ground_surface_given && !f->evaporated;
    const char *imp_label = f->evaporated ? "evaporated" : s->ground_surface_given ? "first landing" : "impact";
    double imp_t = dragarc_display_value(ut, f->time_of_flight), imp_v = dragarc_display_value(uv, f->impact_speed);

    /* side view: the flight, the vacuum path, the apex, the impact (and where a ball came to rest) */
    dragarc_plot_series side[5] = {
        {.label = "with air", .x = down, .y = height, .n = n, .style = DRAGARC_PLOT_SOLID, .colour = DRAGARC_PLOT_BLUE},
        {.label = "vacuum", .x = vdown, .y = vheight, .n = nvac, .style = DRAGARC_PLOT_DASHED,
         .colour = DRAGARC_PLOT_VERMILLION},
        {.label = "apex", .x = &apex_down, .y = &apex_h, .n = 1, .style = DRAGARC_PLOT_MARKERS,
         .colour = DRAGARC_PLOT_BLACK, .marker = DRAGARC_PLOT_TRIANGLE},
        {.label = imp_label, .x = &imp_d, .y = &imp_h, .n = 1, .style = DRAGARC_PLOT_MARKERS,
         .colour = DRAGARC_PLOT_BLACK, .marker = DRAGARC_PLOT_CIRCLE},
        {.label = "at rest", .x = &rest_d, .y = &zero, .n = 1, .style = DRAGARC_PLOT_MARKERS,
         .colour = DRAGARC_PLOT_BLUISH_GREEN, .marker = DRAGARC_PLOT_SQUARE},
    };
    /* plan view: the track, the impact, the rest point */
    dragarc_plot_series plan[3] = {
        {.label = "with air", .x = down, .y = cross, .n = n, .style = DRAGARC_PLOT_SOLID, .colour = DRAGARC_PLOT_BLUE},
        {.label = imp_label, .x = &imp_d, .y = &imp_c, .n = 1, .style = DRAGARC_PLOT_MARKERS,
         .colour = DRAGARC_PLOT_BLACK, .marker = DRAGARC_PLOT_CIRCLE},
        {.label = "at rest", .x = &rest_d, .y = &rest_c, .n = 1, .style = DRAGARC_PLOT_MARKERS,
         .colour = DRAGARC_PLOT_BLUISH_GREEN, .marker = DRAGARC_PLOT_SQUARE},
    };
    dragarc_plot_series sp[2] = {
        {.label = "with air", .x = t, .y = speed, .n = n, .style = DRAGARC_PLOT_SOLID, .colour = DRAGARC_PLOT_BLUE},
        {.label = imp_label, .x = &imp_t, .y = &imp_v, .n = 1, .style = DRAGARC_PLOT_MARKERS,
         .colour = DRAGARC_PLOT_BLACK, .marker = DRAGARC_PLOT_CIRCLE},
    };

    const char *name = o && o->title ? o->title : s->name[0] ? s->name : "flight";
    char title[3][192], xl[3][96], yl[3][96], wind_label[96];
    snprintf(title[0], sizeof title[0], "%s: side view", name);
    snprintf(title[1], sizeof title[1], "%s: plan view", name);
    snprintf(title[2], sizeof title[2], "%s: speed", name);
    snprintf(xl[0], sizeof xl[0], "downrange (%s)", ul->symbol);
    snprintf(yl[0], sizeof yl[0], "height (%s)", ul->symbol);
    snprintf(xl[1], sizeof xl[1], "downrange (%s)", ul->symbol);
    snprintf(yl[1], sizeof yl[1], "crossrange, right + (%s)", ul->symbol);
    snprintf(xl[2], sizeof xl[2], "time (%s)", ut->symbol);
    snprintf(yl[2], sizeof yl[2], "speed over ground (%s)", uv->symbol);

    dragarc_plot_panel panels[3] = {
        {.title = title[0], .xlabel = xl[0], .ylabel = yl[0], .series = side, .nseries = rolled ? 5 : 4,
         .equal_scale = !(o && o->free_scale)},
        {.title = title[1], .xlabel = xl[1], .ylabel = yl[1], .series = plan, .nseries = rolled ? 3 : 2,
         .y_reversed = 1},
        {.title = title[2], .xlabel = xl[2], .ylabel = yl[2], .series = sp, .nseries = 2},
    };
    /* the plan view's crossrange axis: symmetric about the launch line, at least 5 % of the downrange span */
    double dmin = 0.0, dmax = 0.0, cmax = 0.0;
    for (size_t i = 0; i < n; i++)
        dmin = fmin(dmin, down[i]), dmax = fmax(dmax, down[i]), cmax = fmax(cmax, fabs(cross[i]));
    double span = dmax - dmin > 0.0 ? dmax - dmin : 1.0;
    cmax = fmax(1.15 * cmax, 0.05 * span);
    panels[1].limits_given = 1;
    panels[1].xmin = dmin - 0.06 * span, panels[1].xmax = dmax + 0.06 * span;
    panels[1].ymin = -cmax, panels[1].ymax = cmax;

    /* the wind at the launch height, as (downrange, crossrange) */
    double w[3];
    dragarc_wind_eval(&s->wind, s->launch.height - zg, w);
    double wd, wc, wspeed = hypot(w[0], w[1]);
    along_across(az, w[0], w[1], &wd, &wc);
    dragarc_plot_arrow arrow = {.dx = wd, .dy = wc, .label = wind_label, .colour = DRAGARC_PLOT_BLACK};
    if (wspeed > 0.0) {
        snprintf(wind_label, sizeof wind_label, "wind %.3g %s at launch height", dragarc_display_value(uv, wspeed),
                 uv->symbol);
        panels[1].arrow = &arrow;
    }

    dragarc_plot_figure fig = {.panels = panels, .npanels = 3};
    int rc = dragarc_plot_write(path, &fig, err);
    free(buf);
    return rc;
}
