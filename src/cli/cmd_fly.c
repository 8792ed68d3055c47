/* cmd_fly.c: `dragarc fly SCENARIO [--json] [--trajectory FILE.csv] [--dt SECONDS] [--plot FILE.svg|png|pdf]`.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <stdio.h>
#include <math.h>
#include <string.h>

#include "cli/cli.h"

static const char HELP[] =
    "usage: dragarc fly SCENARIO [--json] [--trajectory FILE.csv] [--dt SECONDS] [--plot FILE.svg|png|pdf]\n"
    "                            [--plot-scale equal|free] [--units si|us] [--unit KEY=UNIT ...]\n"
    "\n"
    "Fly the scenario file SCENARIO (JSON, see docs/scenario.md) from launch to ground impact and print\n"
    "range (the carry), downrange and crossrange (the lateral deviation), time of flight, apex, impact\n"
    "speed, angle (the descent angle) and energy, the spin at landing, the still-air terminal speed and\n"
    "the vacuum range, with cautions.\n"
    "\n"
    "  --json               print one JSON object instead of the summary\n"
    "  --trajectory FILE    write t,x,y,z,vx,vy,vz,speed,mach,reynolds,spin,spin_factor,cl,cd (units in the\n"
    "                       column names) every --dt seconds, plus the exact impact row; written whole or\n"
    "                       not at all\n"
    "  --dt SECONDS         sampling interval for --trajectory (default 0.05; or with a unit, \"50 ms\") and\n"
    "                       --plot (default: about 600 points)\n"
    "  --plot FILE          draw the side view (with the vacuum path), the plan view (with the wind) and\n"
    "                       the speed against time into FILE, an .svg, .png or .pdf file (docs/plots.md)\n"
    "  --plot-scale equal|free  equal: the side view's axes share one scale (default); free: each fits\n"
    "  --units si|us        the units of every output: SI (default) or US customary (ft, mph, lb, ft.lbf)\n"
    "  --unit KEY=UNIT      one quantity (length=yd, speed=kt, energy=J) or one field (range=yd,\n"
    "                       impact_speed=mph) in a unit of its own; repeat for more (docs/units.md)\n"
    "  -h, --help           this help\n"
    "\n"
    "Numeric values in the scenario may carry units (\"89.5 mph\", \"3 ft\"): see docs/units.md.\n"
    "Profiles named in a scenario are searched in $DRAGARC_PROFILE_PATH, then the built-in folders.\n"
    "exit status: 0 success, 2 bad usage or input, 3 the computation failed (solver failure,\n"
    "no impact within solver.max_time, atmosphere left).\n";

int cmd_fly(int argc, char **argv)
{
    cli_fly_options o = {.json = 0, .trajectory = NULL, .dt = 0.05, .plot = NULL};
    cli_common c = {0};
    int st;
    int dt_given = 0, scale_given = 0;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (cli_help_asked(a, HELP)) {
            return EXIT_OK;
        } else if (strcmp(a, "--json") == 0) {
            o.json = 1;
        } else if (strcmp(a, "--trajectory") == 0) {
            if (++i >= argc)
                return cli_usage_error("fly", "--trajectory needs a file name");
            o.trajectory = argv[i];
            if (strcmp(o.trajectory, "-") == 0)
                return cli_usage_error("fly", "--trajectory needs a file name: standard output carries the summary");
        } else if ((st = cli_plot_option("fly", argc, argv, &i, &o.plot)) >= 0) {
            if (st != 0)
                return st;
        } else if (strcmp(a, "--plot-scale") == 0) {
            if (++i >= argc || (strcmp(argv[i], "equal") != 0 && strcmp(argv[i], "free") != 0))
                return cli_usage_error("fly", "--plot-scale needs 'equal' or 'free'");
            o.plot_free_scale = strcmp(argv[i], "free") == 0;
            scale_given = 1;
        } else if (strcmp(a, "--dt") == 0) {
            char why[256] = "";
            if (++i >= argc || cli_parse_value(argv[i], DRAGARC_Q_TIME, &o.dt, why, sizeof why) != 0 || !(o.dt > 0.0))
                return why[0] ? cli_usage_error("fly", "--dt %s", why)
                              : cli_usage_error("fly", "--dt needs a positive number of seconds");
            dt_given = 1;
        } else if ((st = cli_common_argument("fly", argc, argv, &i, &c)) != 0) {
            return st;
        }
    }
    if (!c.file || !*c.file)
        return cli_usage_error("fly", "needs a scenario file");
    if (dt_given && !o.trajectory && !o.plot)
        return cli_usage_error("fly", "--dt sets the --trajectory and --plot interval; give either too");
    if (scale_given && !o.plot)
        return cli_usage_error("fly", "--plot-scale shapes the --plot picture; give --plot FILE too");
    if (o.plot && o.trajectory && strcmp(o.plot, o.trajectory) == 0)
        return cli_usage_error("fly", "--plot and --trajectory name the same file '%s'", o.plot);
    o.dt_given = dt_given;
    dragarc_scenario s;
    if ((st = cli_common_load("fly", &c, &o.display, &s)) != 0)
        return st;
    int status = cli_fly_scenario(c.file, &s, &o);
    dragarc_scenario_clear(&s);
    return status;
}
