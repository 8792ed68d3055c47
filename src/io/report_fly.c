/* report_fly.c: the `fly` report kind: one flight's inputs, results, figure, cautions and models with sources.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Fills a dragarc_report (report.h) from a scenario and its flight. Values are shown in the units of the display
 * the user chose (--units, --unit), as the `fly` summary shows them; the cautions are the ones `fly` prints
 * (cautions.c); the sources are those docs/models.md gives for each model the scenario uses.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "dragarc/cautions.h"
#include "dragarc/report.h"
#include "io/report_kind.h"

#define DEG REPORT_DEG
#define SHOW REPORT_SHOW
#define RPM (60.0 / (2.0 * REPORT_PI)) /* rpm per rad/s */

static int summary(dragarc_report *r, const dragarc_scenario *s, const dragarc_flight *f, const dragarc_display *d,
                   dragarc_error *err)
{
    report_pairs p = {.n = 0};
    double cross = report_shown(d, "crossrange", DRAGARC_Q_LENGTH, f->crossrange);
    report_add(&p, "range (carry)", "%.2f %s", SHOW("range", DRAGARC_Q_LENGTH, f->range));
    report_add(&p, "downrange", "%.2f %s", SHOW("downrange", DRAGARC_Q_LENGTH, f->downrange));
    report_add(&p, "crossrange", "%.2f %s %s", fabs(cross), report_unit(d, "crossrange", DRAGARC_Q_LENGTH),
        cross >= -0.005 ? "right" : "left");
    report_add(&p, "time of flight", "%.3f %s", SHOW("time_of_flight", DRAGARC_Q_TIME, f->time_of_flight));
    report_add(&p, "apex height", "%.2f %s at %.3f %s", SHOW("apex_height", DRAGARC_Q_LENGTH, f->apex_height),
        SHOW("apex_time", DRAGARC_Q_TIME, f->apex_time));
    report_add(&p, "impact speed", "%.2f %s", SHOW("impact_speed", DRAGARC_Q_SPEED, f->impact_speed));
    report_add(&p, "impact angle", "%.1f %s below horizontal", SHOW("impact_angle", DRAGARC_Q_ANGLE, f->impact_angle * DEG));
    report_add(&p, "impact energy", "%.3g %s", SHOW("impact_energy", DRAGARC_Q_ENERGY, f->impact_energy));
    if (f->evaporated)
        report_add(&p, "evaporated", "before landing: the impact values are where the drop vanished");
    if (s->launch.spin_rate > 0.0)
        report_add(&p, "spin at landing", "%.4g %s", SHOW("spin_rate", DRAGARC_Q_ANGULAR_SPEED, f->impact[6] * RPM));
    if (s->ground_surface_given) {
        report_add(&p, "bounces", "%d", f->bounces);
        report_add(&p, "roll", "%.2f %s", SHOW("roll_distance", DRAGARC_Q_LENGTH, f->roll_distance));
        report_add(&p, "total distance", "%.2f %s at rest after %.3f %s",
            SHOW("total_distance", DRAGARC_Q_LENGTH, f->total_distance), SHOW("rest_time", DRAGARC_Q_TIME, f->rest_time));
    }
    if (isfinite(f->terminal_speed))
        report_add(&p, "terminal speed", "%.3f %s in still air at the launch height",
            SHOW("terminal_speed", DRAGARC_Q_SPEED, f->terminal_speed));
    else
        report_add(&p, "terminal speed", "none (no drag, or the body does not sink)");
    if (isfinite(f->vacuum_range))
        report_add(&p, "vacuum range", "%.2f %s for the same launch without air",
            SHOW("vacuum_range", DRAGARC_Q_LENGTH, f->vacuum_range));
    report_add(&p, "solver", "%s, %ld steps", dragarc_method_name(f->method), f->steps);
    return report_pairs_emit(r, "Summary", &p, err);
}

/* About a dozen rows of the sampled flight, evenly in time, the last one the impact (or where the ball rests). */
#define TRACK_ROWS 13
#define TRACK_COLS 5
static int track(dragarc_report *r, const dragarc_scenario *s, const dragarc_flight *g, const dragarc_display *d,
                 dragarc_error *err)
{
    if (g->npoints < 2)
        return DRAGARC_OK;
    char head[TRACK_COLS][64], cell[TRACK_ROWS][TRACK_COLS][32];
    const char *hp[TRACK_COLS], *cp[TRACK_ROWS * TRACK_COLS];
    snprintf(head[0], sizeof head[0], "time (%s)", report_unit(d, "time_of_flight", DRAGARC_Q_TIME));
    snprintf(head[1], sizeof head[1], "downrange (%s)", report_unit(d, "downrange", DRAGARC_Q_LENGTH));
    snprintf(head[2], sizeof head[2], "crossrange, right + (%s)", report_unit(d, "crossrange", DRAGARC_Q_LENGTH));
    snprintf(head[3], sizeof head[3], "height above ground (%s)", report_unit(d, "apex_height", DRAGARC_Q_LENGTH));
    snprintf(head[4], sizeof head[4], "speed (%s)", report_unit(d, "impact_speed", DRAGARC_Q_SPEED));
    int numeric[TRACK_COLS] = {1, 1, 1, 1, 1};
    size_t rows = g->npoints < TRACK_ROWS ? g->npoints : TRACK_ROWS;
    double t_end = g->points[g->npoints - 1].t, az = s->launch.azimuth;
    size_t k = 0;
    for (size_t i = 0; i < rows; i++) {
        /* the sample nearest each of `rows` evenly spaced times (the first and the last exactly) */
        double want = t_end * (double)i / (double)(rows - 1);
        while (k + 1 < g->npoints && fabs(g->points[k + 1].t - want) <= fabs(g->points[k].t - want))
            k++;
        const dragarc_flight_point *q = &g->points[k];
        double down = q->pos[0] * sin(az) + q->pos[1] * cos(az), cross = q->pos[0] * cos(az) - q->pos[1] * sin(az);
        report_number(cell[i][0], 3, report_shown(d, "time_of_flight", DRAGARC_Q_TIME, q->t));
        report_number(cell[i][1], 2, report_shown(d, "downrange", DRAGARC_Q_LENGTH, down));
        report_number(cell[i][2], 2, report_shown(d, "crossrange", DRAGARC_Q_LENGTH, cross));
        report_number(cell[i][3], 2, report_shown(d, "apex_height", DRAGARC_Q_LENGTH, q->pos[2] - s->ground_elevation));
        report_number(cell[i][4], 2, report_shown(d, "impact_speed", DRAGARC_Q_SPEED, q->speed));
        for (size_t j = 0; j < TRACK_COLS; j++)
            cp[i * TRACK_COLS + j] = cell[i][j];
    }
    for (size_t j = 0; j < TRACK_COLS; j++)
        hp[j] = head[j];
    return dragarc_report_table(r, "Along the flight", TRACK_COLS, hp, numeric, rows, cp, err);
}

typedef struct plot_job {
    const dragarc_scenario *s;
    const dragarc_flight *f;
    const dragarc_display *d;
    const dragarc_flight_plot_options *po;
} plot_job;

static int draw_flight(const char *path, const void *ctx, dragarc_error *err)
{
    const plot_job *j = ctx;
    return dragarc_flight_plot(path, j->s, j->f, j->d, j->po, err);
}

int dragarc_report_fly(dragarc_report *r, const char *where, const dragarc_scenario *s, const dragarc_flight *f,
                       const dragarc_flight *sampled, const dragarc_display *d,
                       const dragarc_flight_plot_options *po, dragarc_error *err)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    char line[4200];
    snprintf(line, sizeof line, "Scenario file %s: one flight from launch to ground impact.", where ? where : "");
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_flight(s, f, cautions, DRAGARC_CAUTIONS_MAX);
    plot_job job = {s, sampled, d, po};
    int rc;
    if ((rc = dragarc_report_subtitle(r, line, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Inputs", err)) != DRAGARC_OK || (rc = report_scenario_inputs(r, s, d, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Results", err)) != DRAGARC_OK ||
        (rc = summary(r, s, f, d, err)) != DRAGARC_OK || (rc = track(r, s, sampled, d, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Figures", err)) != DRAGARC_OK ||
        (rc = dragarc_report_figure_draw(r,
                                         "Side view (height against downrange, with the path the same launch would "
                                         "take without air), plan view (crossrange against downrange, with the wind "
                                         "at the launch height) and the speed over ground against time.",
                                         draw_flight, &job, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cautions", err)) != DRAGARC_OK ||
        (rc = dragarc_report_cautions(r, nc, cautions, err)) != DRAGARC_OK)
        return rc;
    return report_flight_sources(r, s, f->method, err);
}
