/* main.c: the dragarc command-line program: dispatch to one command, decide the exit status.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#define _POSIX_C_SOURCE 200809L
#include <signal.h>
#include <stdio.h>
#include <string.h>
#include <unistd.h>

#include "cli/cli.h"
#include "cli/cli_mpi.h"
#include "dragarc/output.h"

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
    "  fit SCENARIO TRACK.csv --estimate NAME[,NAME...]\n"
    "                        fit drag, lift, wind or launch to a measured track, with standard errors\n"
    "  atmosphere ALT...     U.S. Standard Atmosphere 1976 at geometric altitudes in metres, or the\n"
    "                        day's weather at a site (--temperature, --pressure, --relative-humidity)\n"
    "  sprinkler SCENARIO    a sprinkler's drops: where each size lands, the application-rate pattern (mm/h)\n"
    "  drift SCENARIO        spray drift: the deposit per metre downwind, the airborne share, drift distances\n"
    "  footprint SCENARIO    a breakup's debris by Monte Carlo: impact ellipses, contours, energies, casualty\n"
    "                        expectation; JSON, CSV points, GeoJSON, plot\n"
    "  uniformity CATCH.csv  how evenly a catch-can test was watered: Christiansen's CU, the\n"
    "                        low-quarter DU, CV\n"
    "  campaign CAMPAIGN.json --out FOLDER\n"
    "                        many footprint cases (breakups along a trajectory, say): each case's outputs\n"
    "                        and one combined report\n"
    "  report SCENARIO -o FILE.html [--command KIND]\n"
    "                        one self-contained HTML page: inputs, results, figures, cautions, sources\n"
    "  demo                  fly built-in example scenarios and explain what they show\n"
    "\n"
    "options:\n"
    "  -h, --help            this help; 'dragarc COMMAND --help' for a command's own\n"
    "  -V, --version         print the version\n"
    "\n"
    "exit status: 0 success, 1 no solution (aim: target out of reach; optimize: no launch lands; fit: the\n"
    "iterations ran out),\n"
    "2 bad usage or input, 3 the computation (or a table row) failed; stopped by SIGINT, SIGTERM or SIGHUP:\n"
    "the run ends by that signal (a shell shows 128 + its number) and leaves no partial file.\n"
    "Under MPI (a DRAGARC_MPI build, 'mpirun -n P dragarc ...'), footprint, table and campaign share their\n"
    "flights among the processes with the same results; the other commands run on the first process alone\n"
    "(docs/cluster.md).\n"
    "Scenario files, models and sources: see docs/ in the source tree.\n";

static int run(int argc, char **argv);

/* SIGINT, SIGTERM, SIGHUP, SIGPIPE: remove the temporary files of the outputs still being written, say so, and
 * end by the same signal with its default action, so that the caller sees how the run ended (a shell reports
 * 128 + the signal's number) and no partial file is left. Only async-signal-safe calls. */
static void on_stop_signal(int sig)
{
    dragarc_output_remove_pending();
    static const char msg[] = "dragarc: stopped by a signal; files not yet complete were removed\n";
    if (sig != SIGPIPE)
        (void)!write(STDERR_FILENO, msg, sizeof msg - 1);
    signal(sig, SIG_DFL);
    raise(sig);
}

static void catch_stop_signals(void)
{
    static const int sigs[] = {SIGINT, SIGTERM, SIGHUP, SIGPIPE};
    struct sigaction sa;
    memset(&sa, 0, sizeof sa);
    sa.sa_handler = on_stop_signal;
    sigemptyset(&sa.sa_mask);
    for (size_t i = 0; i < sizeof sigs / sizeof sigs[0]; i++)
        sigaddset(&sa.sa_mask, sigs[i]); /* one handler at a time */
    for (size_t i = 0; i < sizeof sigs / sizeof sigs[0]; i++) {
        struct sigaction old;
        /* a signal the parent chose to ignore (nohup's SIGHUP, a shell's background SIGINT) stays ignored */
        if (sigaction(sigs[i], NULL, &old) == 0 && old.sa_handler == SIG_IGN)
            continue;
        sigaction(sigs[i], &sa, NULL);
    }
}

/* A result that did not reach standard output (a full disk, a closed pipe) is a failure, not success. */
int main(int argc, char **argv)
{
    cli_mpi_start(&argc, &argv);
    catch_stop_signals();
    int status = run(argc, argv);
    cli_units_release();
    if (fflush(stdout) != 0 || ferror(stdout)) {
        fputs("dragarc: cannot write to standard output\n", stderr);
        status = EXIT_FAILED;
    }
    return cli_mpi_finish(status);
}

/* The commands that share their work among MPI processes (cli_mpi.h); the others run on rank 0 alone. */
static int distributed(const char *cmd)
{
    return strcmp(cmd, "footprint") == 0 || strcmp(cmd, "table") == 0 || strcmp(cmd, "campaign") == 0;
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
    if (!distributed(cmd) && cli_mpi_solo())
        return EXIT_OK; /* not rank 0: it runs the command alone, and this process exits with its status */
    if (strcmp(cmd, "fly") == 0)
        return cmd_fly(argc - 1, argv + 1);
    if (strcmp(cmd, "aim") == 0)
        return cmd_aim(argc - 1, argv + 1);
    if (strcmp(cmd, "table") == 0)
        return cmd_table(argc - 1, argv + 1);
    if (strcmp(cmd, "optimize") == 0)
        return cmd_optimize(argc - 1, argv + 1);
    if (strcmp(cmd, "fit") == 0)
        return cmd_fit(argc - 1, argv + 1);
    if (strcmp(cmd, "atmosphere") == 0)
        return cmd_atmosphere(argc - 1, argv + 1);
    if (strcmp(cmd, "uniformity") == 0)
        return cmd_uniformity(argc - 1, argv + 1);
    if (strcmp(cmd, "report") == 0)
        return cmd_report(argc - 1, argv + 1);
    if (strcmp(cmd, "demo") == 0)
        return cmd_demo(argc - 1, argv + 1);
    if (strcmp(cmd, "sprinkler") == 0)
        return cmd_sprinkler(argc - 1, argv + 1);
    if (strcmp(cmd, "drift") == 0)
        return cmd_drift(argc - 1, argv + 1);
    if (strcmp(cmd, "footprint") == 0)
        return cmd_footprint(argc - 1, argv + 1);
    if (strcmp(cmd, "campaign") == 0)
        return cmd_campaign(argc - 1, argv + 1);
    fprintf(stderr, "dragarc: unknown command '%s' (see 'dragarc --help')\n", cmd);
    return EXIT_BAD_INPUT;
}
