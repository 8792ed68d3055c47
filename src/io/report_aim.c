/* report_aim.c: the `aim` report kind: the launches that land on a target, with the inputs, the solutions' table,
 * the figure of their flights, the cautions and the models with their sources.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Fills a dragarc_report (report.h) from a scenario, an aim request and its result (aim.h). Values are shown in the
 * units of the display the user chose (--units, --unit), as `aim` prints them; the cautions are the ones `aim`
 * prints (those of the solutions' flights); the sources are those docs/models.md and docs/aim.md give.
 */
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "dragarc/cautions.h"
#include "dragarc/report.h"
#include "io/report_kind.h"

#define DEG REPORT_DEG
#define SHOW REPORT_SHOW

/* " (direct)" and " (lofted)" for the two elevations of one speed, as `aim` names them. */
static const char *branch(size_t i, size_t n, dragarc_aim_mode mode)
{
    if (mode != DRAGARC_AIM_ELEVATION || n != 2)
        return "";
    return i == 0 ? " (direct)" : " (lofted)";
}

static int request_inputs(dragarc_report *r, const dragarc_scenario *s, const dragarc_aim_request *q,
                          const dragarc_display *d, dragarc_error *err)
{
    report_pairs p = {.n = 0};
    double h = isnan(q->height) ? s->ground_elevation : q->height;
    double cross = report_shown(d, "crossrange", DRAGARC_Q_LENGTH, q->crossrange);
    report_add(&p, "range", "%.2f %s along the launch azimuth %.4g %s", SHOW("range", DRAGARC_Q_LENGTH, q->range),
               SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.azimuth * DEG));
    report_add(&p, "crossrange", "%.2f %s %s", fabs(cross), report_unit(d, "crossrange", DRAGARC_Q_LENGTH),
               q->crossrange >= 0 ? "right" : "left");
    report_add(&p, "target plane", "%.2f %s above the datum%s", SHOW("height", DRAGARC_Q_LENGTH, h),
               isnan(q->height) ? " (the scenario's ground)" : "");
    if (q->mode == DRAGARC_AIM_ELEVATION)
        report_add(&p, "solve for", "the elevation, keeping the launch speed %.4g %s",
                   SHOW("launch_speed", DRAGARC_Q_SPEED, s->launch.speed));
    else
        report_add(&p, "solve for", "the launch speed, keeping the elevation %.4g %s",
                   SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.elevation * DEG));
    report_add(&p, "azimuth", "%s", q->solve_azimuth == 0   ? "kept (the miss is measured along the line)"
                                    : q->solve_azimuth == 1 ? "turned onto the target"
                                                            : "turned onto the target when there is wind or a crossrange");
    report_add(&p, "miss accepted", "below %.3g mm, every solution verified by flying it", q->miss_tolerance * 1e3);
    return report_pairs_emit(r, "Target", &p, err);
}

static int summary(dragarc_report *r, const dragarc_scenario *s, const dragarc_aim_request *q,
                   const dragarc_aim_result *a, const dragarc_display *d, dragarc_error *err)
{
    report_pairs p = {.n = 0};
    report_add(&p, "solutions", "%zu", a->nsolutions);
    if (q->mode == DRAGARC_AIM_ELEVATION)
        report_add(&p, "maximum range", "%.2f %s at %.3f %s elevation, at the launch speed %.4g %s",
                   SHOW("max_range", DRAGARC_Q_LENGTH, a->max_range),
                   SHOW(NULL, DRAGARC_Q_ANGLE, a->max_range_elevation * DEG),
                   SHOW("launch_speed", DRAGARC_Q_SPEED, s->launch.speed));
    report_add(&p, "flights flown", "%ld", a->flights);
    return report_pairs_emit(r, "Summary", &p, err);
}

#define SOL_COLS 11
static int solutions(dragarc_report *r, const dragarc_aim_request *q, const dragarc_aim_result *a,
                     const dragarc_display *d, dragarc_error *err)
{
    char head[SOL_COLS][64];
    const char *hp[SOL_COLS];
    const char *deg = report_unit(d, NULL, DRAGARC_Q_ANGLE);
    snprintf(head[0], sizeof head[0], "#");
    snprintf(head[1], sizeof head[1], "elevation (%s)", deg);
    snprintf(head[2], sizeof head[2], "speed (%s)", report_unit(d, "launch_speed", DRAGARC_Q_SPEED));
    snprintf(head[3], sizeof head[3], "azimuth (%s)", deg);
    snprintf(head[4], sizeof head[4], "aim, right + (%s)", deg);
    snprintf(head[5], sizeof head[5], "time (%s)", report_unit(d, "time_of_flight", DRAGARC_Q_TIME));
    snprintf(head[6], sizeof head[6], "apex (%s)", report_unit(d, "apex_height", DRAGARC_Q_LENGTH));
    snprintf(head[7], sizeof head[7], "impact speed (%s)", report_unit(d, "impact_speed", DRAGARC_Q_SPEED));
    snprintf(head[8], sizeof head[8], "impact angle (%s)", report_unit(d, "impact_angle", DRAGARC_Q_ANGLE));
    snprintf(head[9], sizeof head[9], "impact energy (%s)", report_unit(d, "impact_energy", DRAGARC_Q_ENERGY));
    snprintf(head[10], sizeof head[10], "miss (mm)");
    int numeric[SOL_COLS] = {0, 1, 1, 1, 1, 1, 1, 1, 1, 1, 1};
    for (size_t j = 0; j < SOL_COLS; j++)
        hp[j] = head[j];
    report_grid g;
    int rc = report_grid_init(&g, a->nsolutions, SOL_COLS, err);
    for (size_t i = 0; rc == DRAGARC_OK && i < a->nsolutions; i++) {
        const dragarc_aim_solution *o = &a->solutions[i];
        report_grid_set(&g, i, 0, "%zu%s", i + 1, branch(i, a->nsolutions, q->mode));
        report_grid_number(&g, i, 1, 4, report_shown(d, NULL, DRAGARC_Q_ANGLE, o->elevation * DEG));
        report_grid_number(&g, i, 2, 4, report_shown(d, "launch_speed", DRAGARC_Q_SPEED, o->speed));
        report_grid_number(&g, i, 3, 4, report_shown(d, NULL, DRAGARC_Q_ANGLE, o->azimuth * DEG));
        report_grid_number(&g, i, 4, 4, report_shown(d, NULL, DRAGARC_Q_ANGLE, o->azimuth_correction * DEG));
        report_grid_number(&g, i, 5, 3, report_shown(d, "time_of_flight", DRAGARC_Q_TIME, o->time_of_flight));
        report_grid_number(&g, i, 6, 2, report_shown(d, "apex_height", DRAGARC_Q_LENGTH, o->apex_height));
        report_grid_number(&g, i, 7, 2, report_shown(d, "impact_speed", DRAGARC_Q_SPEED, o->impact_speed));
        report_grid_number(&g, i, 8, 1, report_shown(d, "impact_angle", DRAGARC_Q_ANGLE, o->impact_angle * DEG));
        report_grid_set(&g, i, 9, "%.3g", report_shown(d, "impact_energy", DRAGARC_Q_ENERGY, o->impact_energy));
        report_grid_set(&g, i, 10, "%.3g", o->miss * 1e3);
    }
    if (rc == DRAGARC_OK)
        rc = report_grid_emit(r, "Solutions, lowest elevation (or speed) first; time of flight, apex above the datum, aim "
                              "correction from the launch azimuth", &g, hp, numeric, err);
    report_grid_free(&g);
    return rc;
}

typedef struct plot_job {
    const dragarc_scenario *s;
    const dragarc_aim_request *q;
    const dragarc_aim_result *a;
    const dragarc_display *d;
} plot_job;

static int draw_aim(const char *path, const void *ctx, dragarc_error *err)
{
    const plot_job *j = ctx;
    return dragarc_aim_plot(path, j->s, j->q, j->a, j->d, NULL, err);
}

int dragarc_report_aim(dragarc_report *r, const char *where, const dragarc_scenario *s, const dragarc_aim_request *q,
                       const dragarc_aim_result *a, const dragarc_display *d, dragarc_error *err)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    char line[4200];
    snprintf(line, sizeof line, "Scenario file %s: every launch that lands on the target.", where ? where : "");
    unsigned notes = 0;
    for (size_t i = 0; i < a->nsolutions; i++)
        notes |= a->solutions[i].notes;
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(notes, cautions, DRAGARC_CAUTIONS_MAX);
    plot_job job = {s, q, a, d};
    int rc;
    if ((rc = dragarc_report_subtitle(r, line, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Inputs", err)) != DRAGARC_OK ||
        (rc = request_inputs(r, s, q, d, err)) != DRAGARC_OK ||
        (rc = report_scenario_inputs(r, s, d, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Results", err)) != DRAGARC_OK ||
        (rc = summary(r, s, q, a, d, err)) != DRAGARC_OK || (rc = solutions(r, q, a, d, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Figures", err)) != DRAGARC_OK ||
        (rc = dragarc_report_figure_draw(r,
                                         "Side view of every solution's flight (height above the ground against "
                                         "downrange along the launch azimuth), the launch point and the target.",
                                         draw_aim, &job, err)) != DRAGARC_OK ||
        (rc = dragarc_report_section(r, "Cautions", err)) != DRAGARC_OK ||
        (rc = dragarc_report_cautions(r, nc, cautions, err)) != DRAGARC_OK ||
        (rc = report_flight_sources(r, s, s->solver.method, err)) != DRAGARC_OK)
        return rc;
    return dragarc_report_source(r, "aim solver",
                                 "a scan of the elevations (or speeds), each sign change of the miss refined by Brent's "
                                 "root finder, each range maximum by Brent's minimiser; the azimuth turned onto the "
                                 "target by moving the aim point by the miss",
                                 "Brent, R. P. (1973), Algorithms for Minimization without Derivatives, Prentice-Hall; "
                                 "docs/aim.md",
                                 err);
}
