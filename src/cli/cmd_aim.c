/* cmd_aim.c: `dragarc aim SCENARIO --range M [--height M] [--crossrange M] [--solve elevation|speed]
 * [--keep-azimuth] [--json] [--plot FILE.svg|png|pdf]`.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "dragarc/aim.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"

#define DEG (180.0 / 3.14159265358979323846)

static const char HELP[] =
    "usage: dragarc aim SCENARIO --range METRES [--height METRES] [--crossrange METRES]\n"
    "                   [--solve elevation|speed] [--keep-azimuth] [--json] [--plot FILE.svg|png|pdf]\n"
    "                   [--units si|us] [--unit KEY=UNIT]\n"
    "\n"
    "Find every launch that lands on a target: by default keep launch.speed and find the elevations\n"
    "(the low, direct one and the high, lofted one), or with --solve speed keep launch.elevation and find\n"
    "the speed. The target lies --range metres along the scenario's launch azimuth and --crossrange\n"
    "metres to its right, on the plane at --height metres above the site datum (default: the scenario's\n"
    "ground). With wind or a crossrange the azimuth is turned onto the target too, and the aim\n"
    "correction is reported. Every solution is verified by flying it; its miss is below 1 mm.\n"
    "\n"
    "  --range METRES        target distance along the launch azimuth (required, > 0)\n"
    "  --height METRES       height of the target plane above the site datum\n"
    "  --crossrange METRES   target offset to the right of the launch azimuth (default 0)\n"
    "  --solve WHAT          elevation (default) or speed\n"
    "  --keep-azimuth        do not turn the azimuth (the miss is then measured along the line)\n"
    "  --json                print one JSON object instead of the summary\n"
    "  --plot FILE           draw every solution's flight, the launch point and the target, side on, into\n"
    "                        FILE, an .svg, .png or .pdf file (docs/plots.md); none when out of reach\n"
    "  --units si|us         the units of every output: SI (default) or US customary (ft, mph, lb, ft.lbf)\n"
    "  --unit KEY=UNIT       a quantity (length=yd) or a field (range=yd) in a unit of its own; repeatable\n"
    "  -h, --help            this help\n"
    "\n"
    "Lengths may carry a unit, read by UDUNITS-2: --range \"150 yd\" --height \"3 ft\" (docs/units.md).\n"
    "exit status: 0 solved, 1 the target is out of reach (the maximum range is printed; no plot is drawn),\n"
    "2 bad usage or input (also a --plot file that cannot be written), 3 the computation failed.\n";

static const char *branch_name(size_t i, size_t n, dragarc_aim_mode mode)
{
    if (mode != DRAGARC_AIM_ELEVATION || n != 2)
        return "";
    return i == 0 ? " (direct)" : " (lofted)";
}

int cli_aim_option(const char *cmd, int argc, char **argv, int *i, dragarc_aim_request *req, int *have_range)
{
    const char *a = argv[*i];
    double *target = NULL;
    if (strcmp(a, "--keep-azimuth") == 0) {
        req->solve_azimuth = 0;
        return 0;
    } else if (strcmp(a, "--range") == 0) {
        target = &req->range;
        *have_range = 1;
    } else if (strcmp(a, "--height") == 0) {
        target = &req->height;
    } else if (strcmp(a, "--crossrange") == 0) {
        target = &req->crossrange;
    } else if (strcmp(a, "--solve") == 0) {
        if (++*i >= argc)
            return cli_usage_error(cmd, "--solve needs 'elevation' or 'speed'");
        if (strcmp(argv[*i], "elevation") == 0)
            req->mode = DRAGARC_AIM_ELEVATION;
        else if (strcmp(argv[*i], "speed") == 0)
            req->mode = DRAGARC_AIM_SPEED;
        else
            return cli_usage_error(cmd, "--solve needs 'elevation' or 'speed', not '%s'", argv[*i]);
        return 0;
    } else {
        return -1;
    }
    char why[256];
    if (++*i >= argc)
        return cli_usage_error(cmd, "%s needs a number of metres", a);
    if (cli_parse_value(argv[*i], DRAGARC_Q_LENGTH, target, why, sizeof why) != 0)
        return why[0] ? cli_usage_error(cmd, "%s %s", a, why) : cli_usage_error(cmd, "%s needs a number of metres", a);
    return 0;
}

int cli_aim_load(const char *cmd, const cli_common *c, const dragarc_aim_request *req, int have_range,
                 dragarc_display *d, dragarc_scenario *s, dragarc_aim_result *r)
{
    int st;
    if (!c->file || !*c->file)
        return cli_usage_error(cmd, "needs a scenario file");
    if (!have_range)
        return cli_usage_error(cmd, "needs --range METRES");
    if (!(req->range > 0.0))
        return cli_usage_error(cmd, "--range must be positive (got %g)", req->range);
    if ((st = cli_common_load(cmd, c, d, s)) != 0)
        return st;
    dragarc_error err;
    if (dragarc_aim_solve(s, req, r, &err) == DRAGARC_OK)
        return 0;
    if (strcmp(err.field, "range") == 0 || strcmp(err.field, "height") == 0 || strcmp(err.field, "crossrange") == 0) {
        char opt[32];
        snprintf(opt, sizeof opt, "--%s", err.field);
        err.field[0] = '\0';
        st = cli_report(opt, &err);
    } else {
        st = cli_report(c->file, &err);
    }
    dragarc_scenario_clear(s);
    return st;
}

int cmd_aim(int argc, char **argv)
{
    dragarc_aim_request req;
    dragarc_aim_request_default(&req);
    cli_common c = {0};
    int st;
    int json = 0, have_range = 0;
    const char *plot = NULL;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (strcmp(a, "-h") == 0 || strcmp(a, "--help") == 0) {
            fputs(HELP, stdout);
            return EXIT_OK;
        } else if (strcmp(a, "--json") == 0) {
            json = 1;
        } else if ((st = cli_plot_option("aim", argc, argv, &i, &plot)) >= 0) {
            if (st != 0)
                return st;
        } else if ((st = cli_aim_option("aim", argc, argv, &i, &req, &have_range)) >= 0) {
            if (st != 0)
                return st;
        } else if ((st = cli_common_argument("aim", argc, argv, &i, &c)) != 0) {
            return st;
        }
    }
    dragarc_display d;
    dragarc_scenario s;
    dragarc_aim_result r;
    if ((st = cli_aim_load("aim", &c, &req, have_range, &d, &s, &r)) != 0)
        return st;
    dragarc_error err;
    int rc;
    /* The picture first: when it cannot be drawn nothing is printed, as with a failed solve. */
    if (plot && (rc = dragarc_aim_plot(plot, &s, &req, &r, &d, NULL, &err)) != DRAGARC_OK) {
        dragarc_scenario_clear(&s);
        return cli_plot_failed(&err);
    }
    if (json) {
        char *text = dragarc_aim_json(&s, &req, &r, &d);
        if (!text) {
            dragarc_scenario_clear(&s);
            fputs("dragarc: aim: out of memory\n", stderr);
            return EXIT_FAILED;
        }
        puts(text);
        free(text);
        dragarc_scenario_clear(&s);
        return EXIT_OK;
    }
    double h = isnan(req.height) ? s.ground_elevation : req.height;
#define SHOW(field, q, v) dragarc_display_value(dragarc_display_unit(&d, field, q), v)
#define UNIT(field, q) dragarc_display_unit(&d, field, q)->symbol
    const char *deg = UNIT(NULL, DRAGARC_Q_ANGLE);
    if (strcmp(deg, "degree") == 0)
        deg = "deg";
    printf("dragarc aim%s%s\n", s.name[0] ? ": " : "", s.name);
    printf("  target          %.2f %s along azimuth %.4g %s, %.2f %s %s, on the plane at %.2f %s\n",
           SHOW("range", DRAGARC_Q_LENGTH, req.range), UNIT("range", DRAGARC_Q_LENGTH),
           SHOW(NULL, DRAGARC_Q_ANGLE, s.launch.azimuth * DEG), deg,
           fabs(SHOW("crossrange", DRAGARC_Q_LENGTH, req.crossrange)), UNIT("crossrange", DRAGARC_Q_LENGTH),
           req.crossrange >= 0 ? "right" : "left", SHOW("height", DRAGARC_Q_LENGTH, h), UNIT("height", DRAGARC_Q_LENGTH));
    if (req.mode == DRAGARC_AIM_ELEVATION) {
        printf("  launch speed    %.4g %s (kept)\n", SHOW("launch_speed", DRAGARC_Q_SPEED, s.launch.speed),
               UNIT("launch_speed", DRAGARC_Q_SPEED));
        printf("  maximum range   %.2f %s at %.3f %s elevation\n", SHOW("max_range", DRAGARC_Q_LENGTH, r.max_range),
               UNIT("max_range", DRAGARC_Q_LENGTH), SHOW(NULL, DRAGARC_Q_ANGLE, r.max_range_elevation * DEG), deg);
    } else {
        printf("  elevation       %.4g %s (kept)\n", SHOW(NULL, DRAGARC_Q_ANGLE, s.launch.elevation * DEG), deg);
    }
    unsigned notes = 0;
    for (size_t i = 0; i < r.nsolutions; i++) {
        const dragarc_aim_solution *q = &r.solutions[i];
        printf("  solution %zu%s: elevation %.4f %s, speed %.4f %s, azimuth %.4f %s (aim %.4f %s %s)\n", i + 1,
               branch_name(i, r.nsolutions, req.mode), SHOW(NULL, DRAGARC_Q_ANGLE, q->elevation * DEG), deg,
               SHOW("launch_speed", DRAGARC_Q_SPEED, q->speed), UNIT("launch_speed", DRAGARC_Q_SPEED),
               SHOW(NULL, DRAGARC_Q_ANGLE, q->azimuth * DEG), deg,
               fabs(SHOW(NULL, DRAGARC_Q_ANGLE, q->azimuth_correction * DEG)), deg,
               q->azimuth_correction >= 0 ? "right" : "left");
        printf("      time of flight %.3f %s, apex %.2f %s, impact %.2f %s at %.1f %s, %.3g %s, miss %.3g mm\n",
               SHOW("time_of_flight", DRAGARC_Q_TIME, q->time_of_flight), UNIT("time_of_flight", DRAGARC_Q_TIME),
               SHOW("apex_height", DRAGARC_Q_LENGTH, q->apex_height), UNIT("apex_height", DRAGARC_Q_LENGTH),
               SHOW("impact_speed", DRAGARC_Q_SPEED, q->impact_speed), UNIT("impact_speed", DRAGARC_Q_SPEED),
               SHOW("impact_angle", DRAGARC_Q_ANGLE, q->impact_angle * DEG), deg,
               SHOW("impact_energy", DRAGARC_Q_ENERGY, q->impact_energy), UNIT("impact_energy", DRAGARC_Q_ENERGY),
               q->miss * 1e3);
        notes |= q->notes;
    }
#undef SHOW
#undef UNIT
    printf("  flights flown   %ld\n", r.flights);
    dragarc_cautions_print(stdout, notes, 100);
    dragarc_scenario_clear(&s);
    return EXIT_OK;
}
