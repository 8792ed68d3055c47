/* fit_plot.c: the picture of a fit to a measured track (`dragarc fit --plot`), drawn through plot.c.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Three panels: the side view (height above the ground against downrange along the fitted launch azimuth) and the
 * plan view (north against east) of the track's points over the fitted flight, and the residuals (measured minus
 * fitted) east, north and up against time. The fitted flight is the fitted scenario flown again at evenly spaced
 * times to the track's last, the way the fit flew it (through the ground plane if the track goes below it), shifted
 * by the fitted launch offsets; nothing is computed here that the fit did not.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "dragarc/fit.h"
#include "dragarc/plot.h"
#include "numerics/flight_track.h"

enum { NSAMPLES = 600 }; /* samples of the fitted flight: smooth at any size the page is drawn */

int dragarc_fit_plot(const char *path, const dragarc_scenario *fitted, const dragarc_track *track,
                     const dragarc_fit_result *r, dragarc_error *err)
{
    if (!track || track->n == 0 || !r || !r->residuals || r->npoints != track->n)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "a fit plot needs a fitted track");
    const size_t n = track->n;
    double off[2] = {0.0, 0.0};
    for (int k = 0; k < r->np; k++)
        if (r->param[k] == DRAGARC_FIT_LAUNCH_EAST || r->param[k] == DRAGARC_FIT_LAUNCH_NORTH)
            off[r->param[k] == DRAGARC_FIT_LAUNCH_EAST ? 0 : 1] = r->value[k];
    /* one block: fitted times and states, then the columns drawn */
    double *times = malloc((NSAMPLES + NSAMPLES * 6 + 4 * NSAMPLES + 4 * n + 4 * n) * sizeof *times);
    if (!times)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory drawing %s", path);
    double *states = times + NSAMPLES, *fx = states + 6 * NSAMPLES, *fz = fx + NSAMPLES, *fe = fz + NSAMPLES,
           *fn = fe + NSAMPLES, *tx = fn + NSAMPLES, *tz = tx + n, *te = tz + n, *tn = te + n, *rt = tn + n,
           *re = rt + n, *rn = re + n, *ru = rn + n;
    const double t_end = track->t[n - 1];
    for (size_t i = 0; i < NSAMPLES; i++)
        times[i] = t_end * (double)(i + 1) / NSAMPLES;
    dragarc_scenario s;
    int rc = dragarc_scenario_copy(&s, fitted, err);
    if (rc == DRAGARC_OK) {
        s.solver.rtol = fmin(s.solver.rtol, 1e-10);
        s.solver.atol = fmin(s.solver.atol, 1e-9);
        rc = dragarc_flight_track(&s, times, NSAMPLES, states, err);
    }
    const double az = fitted->launch.azimuth, zg = fitted->ground_elevation, sa = sin(az), ca = cos(az);
    if (rc == DRAGARC_OK) {
        for (size_t i = 0; i < NSAMPLES; i++) {
            const double *p = states + 6 * i;
            fe[i] = p[0] + off[0], fn[i] = p[1] + off[1];
            fx[i] = fe[i] * sa + fn[i] * ca;
            fz[i] = p[2] - zg;
        }
        for (size_t i = 0; i < n; i++) {
            const double *p = track->pos + 3 * i;
            te[i] = p[0], tn[i] = p[1];
            tx[i] = p[0] * sa + p[1] * ca;
            tz[i] = p[2] - zg;
            rt[i] = track->t[i];
            re[i] = r->residuals[6 * i], rn[i] = r->residuals[6 * i + 1], ru[i] = r->residuals[6 * i + 2];
        }
        const double msize = n > 200 ? 0.5 : 0.9;
        dragarc_plot_series side[2] = {
            {.label = "track", .x = tx, .y = tz, .n = n, .style = DRAGARC_PLOT_MARKERS,
             .colour = DRAGARC_PLOT_VERMILLION, .marker = DRAGARC_PLOT_CIRCLE, .marker_size = msize},
            {.label = "fitted flight", .x = fx, .y = fz, .n = NSAMPLES, .style = DRAGARC_PLOT_SOLID,
             .colour = DRAGARC_PLOT_BLUE}};
        dragarc_plot_series plan[2] = {
            {.label = "track", .x = te, .y = tn, .n = n, .style = DRAGARC_PLOT_MARKERS,
             .colour = DRAGARC_PLOT_VERMILLION, .marker = DRAGARC_PLOT_CIRCLE, .marker_size = msize},
            {.label = "fitted flight", .x = fe, .y = fn, .n = NSAMPLES, .style = DRAGARC_PLOT_SOLID,
             .colour = DRAGARC_PLOT_BLUE}};
        dragarc_plot_series res[3] = {
            {.label = "east", .x = rt, .y = re, .n = n, .style = DRAGARC_PLOT_MARKERS, .colour = DRAGARC_PLOT_ORANGE,
             .marker = DRAGARC_PLOT_CIRCLE, .marker_size = msize},
            {.label = "north", .x = rt, .y = rn, .n = n, .style = DRAGARC_PLOT_MARKERS,
             .colour = DRAGARC_PLOT_SKY_BLUE, .marker = DRAGARC_PLOT_TRIANGLE, .marker_size = msize},
            {.label = "up", .x = rt, .y = ru, .n = n, .style = DRAGARC_PLOT_MARKERS,
             .colour = DRAGARC_PLOT_REDDISH_PURPLE, .marker = DRAGARC_PLOT_SQUARE, .marker_size = msize}};
        const char *name = fitted->name[0] ? fitted->name : "fit";
        char t1[256], t2[256], t3[256];
        snprintf(t1, sizeof t1, "%s: track and fitted flight, side view", name);
        snprintf(t2, sizeof t2, "%s: plan view", name);
        snprintf(t3, sizeof t3, "residuals, measured - fitted (RMS %.3g m)", r->rms_pos[3]);
        dragarc_plot_panel panels[3] = {
            {.title = t1, .xlabel = "downrange along the fitted azimuth (m)", .ylabel = "height above the ground (m)",
             .series = side, .nseries = 2},
            /* no north arrow: the axes say east and north, and a flight heading north-east would end under it */
            {.title = t2, .xlabel = "east (m)", .ylabel = "north (m)", .series = plan, .nseries = 2},
            {.title = t3, .xlabel = "time since launch (s)", .ylabel = "residual (m)", .series = res, .nseries = 3}};
        dragarc_plot_figure fig = {.panels = panels, .npanels = 3};
        rc = dragarc_plot_write(path, &fig, err);
    }
    dragarc_scenario_clear(&s);
    free(times);
    return rc;
}
