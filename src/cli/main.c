/* main.c: the dragarc command-line program: dispatch to one command, decide the exit status.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <stdio.h>
#include <string.h>

#include "cli/cli.h"

static const char USAGE[] =
    "usage: dragarc COMMAND [ARGS...]\n"
    "\n"
    "Predicts where things launched, sprayed or shed through the air come down.\n"
    "\n"
    "commands:\n"
    "  fly SCENARIO          fly one scenario file to ground impact; summary, JSON, trajectory CSV, plot\n"
    "  aim SCENARIO --range M  find the launch elevations (or speed) that land on a target\n"
    "  table SCENARIO --vary NAME=START:STOP:STEP ...\n"
    "                        fly it for every combination of varied values; text, CSV, JSON, Markdown\n"
    "  optimize SCENARIO --maximize carry|total [--vary NAME[=LO:HI]] ...\n"
    "                        the launch within bounds that carries farthest, with its sensitivities\n"
    "  atmosphere ALT...     U.S. Standard Atmosphere 1976 at geometric altitudes in metres, or the\n"
    "                        day's weather at a site (--temperature, --pressure, --relative-humidity)\n"
    "  sprinkler SCENARIO    a sprinkler's drops: where each size lands, the application-rate pattern (mm/h)\n"
    "  drift SCENARIO        spray drift: the deposit per metre downwind, the airborne share, drift distances\n"
    "  footprint SCENARIO    a breakup's debris by Monte Carlo: impact ellipses, contours, energies, casualty\n"
    "                        expectation; JSON, CSV points, GeoJSON, plot\n"
    "  uniformity CATCH.csv  how evenly a catch-can test was watered: Christiansen's CU, the\n"
    "                        low-quarter DU, CV\n"
    "  demo                  fly built-in example scenarios and explain what they show\n"
    "\n"
    "options:\n"
    "  -h, --help            this help; 'dragarc COMMAND --help' for a command's own\n"
    "  -V, --version         print the version\n"
    "\n"
    "exit status: 0 success, 1 no solution (aim: target out of reach; optimize: no launch lands),\n"
    "2 bad usage or input, 3 the computation (or a table row) failed.\n"
    "Scenario files, models and sources: see docs/ in the source tree.\n";

static int run(int argc, char **argv);

/* A result that did not reach standard output (a full disk, a closed pipe) is a failure, not success. */
int main(int argc, char **argv)
{
    int status = run(argc, argv);
    cli_units_release();
    if (fflush(stdout) != 0 || ferror(stdout)) {
        fputs("dragarc: cannot write to standard output\n", stderr);
        return EXIT_FAILED;
    }
    return status;
}

static int run(int argc, char **argv)
{
    dragarc_init();
    if (argc < 2) {
        fputs("dragarc: missing command (see 'dragarc --help')\n", stderr);
        return EXIT_BAD_INPUT;
    }
    const char *cmd = argv[1];
    if (strcmp(cmd, "-h") == 0 || strcmp(cmd, "--help") == 0 || strcmp(cmd, "help") == 0) {
        fputs(USAGE, stdout);
        return EXIT_OK;
    }
    if (strcmp(cmd, "-V") == 0 || strcmp(cmd, "--version") == 0) {
        printf("dragarc %s\n", dragarc_version());
        return EXIT_OK;
    }
    if (strcmp(cmd, "fly") == 0)
        return cmd_fly(argc - 1, argv + 1);
    if (strcmp(cmd, "aim") == 0)
        return cmd_aim(argc - 1, argv + 1);
    if (strcmp(cmd, "table") == 0)
        return cmd_table(argc - 1, argv + 1);
    if (strcmp(cmd, "optimize") == 0)
        return cmd_optimize(argc - 1, argv + 1);
    if (strcmp(cmd, "atmosphere") == 0)
        return cmd_atmosphere(argc - 1, argv + 1);
    if (strcmp(cmd, "uniformity") == 0)
        return cmd_uniformity(argc - 1, argv + 1);
    if (strcmp(cmd, "demo") == 0)
        return cmd_demo(argc - 1, argv + 1);
    if (strcmp(cmd, "sprinkler") == 0)
        return cmd_sprinkler(argc - 1, argv + 1);
    if (strcmp(cmd, "drift") == 0)
        return cmd_drift(argc - 1, argv + 1);
    if (strcmp(cmd, "footprint") == 0)
        return cmd_footprint(argc - 1, argv + 1);
    fprintf(stderr, "dragarc: unknown command '%s' (see 'dragarc --help')\n", cmd);
    return EXIT_BAD_INPUT;
}
