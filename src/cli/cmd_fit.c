/* cmd_fit.c: `dragarc fit SCENARIO TRACK.csv --estimate NAME[,NAME...] [--json] [--residuals FILE.csv]
 * [--plot FILE] [--start auto|scenario] [--geodesic auto|on|off] [--max-iterations N]`: drag, lift, wind or launch fitted to a track.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "dragarc/cautions.h"
#include "dragarc/fit.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"

static const char HELP[] =
    "usage: dragarc fit SCENARIO TRACK.csv --estimate NAME[,NAME...] [--json] [--residuals FILE.csv]\n"
    "                   [--plot FILE.svg|png|pdf] [--start auto|scenario] [--geodesic auto|on|off]\n"
    "                   [--max-iterations N]\n"
    "\n"
    "Fit parameters of the scenario file SCENARIO to a measured flight: the values that make the modelled\n"
    "flight pass closest to the track's points, by weighted nonlinear least squares (GSL's Levenberg-\n"
    "Marquardt), each trial a full flight. Prints the estimates with standard errors and 95 % intervals,\n"
    "their correlations, the residuals and warnings when the track cannot tell the estimates apart.\n"
    "\n"
    "TRACK.csv has a header row naming its columns: t, x, y, z (seconds since launch; metres east, north\n"
    "and up in the scenario's frame), optionally vx, vy, vz (m/s), and standard deviations: sd or sd_x,\n"
    "sd_y, sd_z for the positions, sd_v or sd_vx, sd_vy, sd_vz for the velocities (needed with them).\n"
    "Without standard deviations the fit is unweighted and they are estimated from the residuals.\n"
    "\n"
    "  --estimate NAMES     what to fit, comma-separated, starting from the scenario's values (launch values\n"
    "                       from the track's first points instead, when those fit better):\n"
    "                         cd            a constant drag coefficient (replaces the drag law)\n"
    "                         cd_scale      a factor on the drag law's C_D curve (drag.cd_scale)\n"
    "                         bc            the ballistic coefficient m / (C_D A), kg/m^2 (sets cd_scale)\n"
    "                         cl            a constant lift coefficient (the ball must spin)\n"
    "                         wind.speed, wind.from (m/s, deg; the scenario must give a wind to start from)\n"
    "                         launch.speed, launch.elevation, launch.azimuth, launch.height\n"
    "                         launch.east, launch.north, or position for both: where the launch was\n"
    "  --json               print one JSON object instead of the summary\n"
    "  --residuals FILE     write the residuals (measured - fitted) at each point as CSV\n"
    "  --plot FILE          draw the track and the fitted flight (side and plan views) and the residuals\n"
    "                       against time into FILE, an .svg, .png or .pdf file\n"
    "  --start MODE         auto (default): launch estimates start from the track's first points when\n"
    "                       those fit better than the scenario's values; scenario: always the scenario's\n"
    "  --geodesic MODE      auto (default): Levenberg-Marquardt, again with geodesic acceleration if it\n"
    "                       stalls; on: with acceleration from the start; off: never\n"
    "  --max-iterations N   per attempt (default 200)\n"
    "  -h, --help           this help\n"
    "\n"
    "Estimates are shown in SI units, angles in degrees. The method is in docs/fit.md.\n"
    "exit status: 0 converged, 1 not converged: the iterations ran out or an estimate ended against a limit\n"
    "(the last values are printed, with a warning),\n"
    "2 bad usage or input, 3 the computation failed.\n";

typedef struct outputs {
    const char *scenario_file, *track_file;
    const dragarc_scenario *fitted;
    const dragarc_track *track;
    const dragarc_fit_result *r;
} outputs;

static int write_residuals(FILE *fp, const void *ctx, dragarc_error *err)
{
    const outputs *o = ctx;
    return dragarc_fit_write_residuals_csv(fp, o->track, o->r, err);
}

static int draw_plot(const char *path, const void *ctx, dragarc_error *err)
{
    const outputs *o = ctx;
    return dragarc_fit_plot(path, o->fitted, o->track, o->r, err);
}

/* The summary: the estimates, their correlations, the residuals, warnings and cautions. */
static void print_summary(const char *track_file, const dragarc_scenario *s, const dragarc_track *t,
                          const dragarc_fit_result *r)
{
    printf("dragarc fit%s%s: %s\n", s->name[0] ? ": " : "", s->name, track_file);
    printf("  track         %zu points from t = %.4g s to %.4g s, %zu residuals%s\n", r->npoints, t->t[0],
           t->t[t->n - 1], r->nresiduals, t->vel ? " (positions and velocities)" : "");
    printf("  method        Levenberg-Marquardt%s: %s after %d iterations, %ld flights\n",
           r->accel_used ? " with geodesic acceleration" : "", r->converged ? "converged" : "NOT converged",
           r->iterations, r->flights);
    printf("  start         %s\n", r->start_from_track ? "the scenario's values, with the launch read off the track's first points"
                                                             : "the scenario's values");
    if (r->weighted)
        printf("  weights       the track's standard deviations: chi-square %.4g on %zu degrees of freedom "
               "(p = %.3g)\n", r->chisq, r->dof, r->chisq_p);
    else
        printf("  weights       none given: residual standard deviation %.4g m on %zu degrees of freedom\n",
               r->sigma, r->dof);
    printf("\n  %-22s %12s %14s %12s   %s\n", "estimate", "start", "value", "std error", "95 % interval");
    for (int k = 0; k < r->np; k++) {
        const int p = r->param[k];
        char name[48];
        const char *u = dragarc_fit_param_unit(p);
        snprintf(name, sizeof name, u[0] ? "%s (%s)" : "%s", dragarc_fit_param_name(r->param[k]), u);
        const double se = dragarc_fit_param_shown(p, r->se[k]);
        const int d = dragarc_fit_decimals(se);
        printf("  %-22s %12.*f %14.*f %12.2g   ", name, d < 4 ? 4 : d, dragarc_fit_param_shown(p, r->start[k]), d,
               dragarc_fit_param_shown(p, r->value[k]), se);
        if (r->at_limit & (1u << k))
            printf("none: held at a limit\n");
        else
            printf("%.*f to %.*f\n", d, dragarc_fit_param_shown(p, r->lower[k]), d,
                   dragarc_fit_param_shown(p, r->upper[k]));
    }
    if (r->np > 1) {
        printf("\n  correlation\n");
        for (int i = 0; i < r->np; i++) {
            printf("  %-22s", dragarc_fit_param_name(r->param[i]));
            for (int j = 0; j <= i; j++)
                printf(" %7.3f", r->corr[i * r->np + j]);
            printf("\n");
        }
    }
    printf("\n  residual RMS  %.4g m (east %.4g, north %.4g, up %.4g)\n", r->rms_pos[3], r->rms_pos[0], r->rms_pos[1],
           r->rms_pos[2]);
    if (t->vel)
        printf("                %.4g m/s in velocity (east %.4g, north %.4g, up %.4g)\n", r->rms_vel[3],
               r->rms_vel[0], r->rms_vel[1], r->rms_vel[2]);
    printf("  conditioning  reciprocal condition number %.3g of the scaled Jacobian\n", r->rcond);
    char warn[8][512];
    size_t nw = dragarc_fit_warnings(r, warn, 8);
    if (nw) {
        printf("\nWarnings:\n");
        for (size_t i = 0; i < nw; i++)
            dragarc_text_wrap(stdout, "  - ", 4, 100, warn[i]);
    }
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_fit(cautions, DRAGARC_CAUTIONS_MAX);
    printf("\n");
    dragarc_cautions_print_list(stdout, cautions, nc, 100);
}

int cli_fit_option(const char *cmd, int argc, char **argv, int *i, dragarc_fit_options *o, const char **estimate)
{
    const char *a = argv[*i];
    if (strcmp(a, "--estimate") == 0) {
        if (++*i >= argc || !argv[*i][0])
            return cli_usage_error(cmd, "--estimate needs a comma-separated list of names (cd, launch.speed, ...)");
        if (*estimate)
            return cli_usage_error(cmd, "--estimate is given twice: list every name in one, comma-separated");
        *estimate = argv[*i];
    } else if (strcmp(a, "--geodesic") == 0) {
        if (++*i >= argc)
            return cli_usage_error(cmd, "--geodesic needs auto, on or off");
        if (strcmp(argv[*i], "auto") == 0)
            o->accel = DRAGARC_FIT_ACCEL_AUTO;
        else if (strcmp(argv[*i], "on") == 0)
            o->accel = DRAGARC_FIT_ACCEL_ON;
        else if (strcmp(argv[*i], "off") == 0)
            o->accel = DRAGARC_FIT_ACCEL_OFF;
        else
            return cli_usage_error(cmd, "--geodesic needs auto, on or off (got '%s')", argv[*i]);
    } else if (strcmp(a, "--start") == 0) {
        if (++*i >= argc || (strcmp(argv[*i], "auto") != 0 && strcmp(argv[*i], "scenario") != 0))
            return cli_usage_error(cmd, "--start needs auto or scenario");
        o->scenario_start = strcmp(argv[*i], "scenario") == 0;
    } else if (strcmp(a, "--max-iterations") == 0) {
        double n;
        ++*i;
        int st = cli_count_argument(cmd, "--max-iterations", *i < argc ? argv[*i] : NULL, 1, 100000, &n);
        if (st != 0)
            return st;
        o->max_iterations = (int)n;
    } else {
        return -1;
    }
    return 0;
}

int cli_fit_load(const char *cmd, const char *scenario_file, const char *track_file, const char *estimate,
                 dragarc_fit_options *o, dragarc_scenario *s, dragarc_track *track, dragarc_fit_result *r,
                 dragarc_scenario *fitted)
{
    dragarc_scenario_default(s);
    dragarc_scenario_default(fitted);
    memset(track, 0, sizeof *track);
    memset(r, 0, sizeof *r);
    if (!estimate)
        return cli_usage_error(cmd, "needs --estimate NAME[,NAME...] (cd, cd_scale, bc, cl, wind.speed, "
                                    "wind.from, launch.speed, launch.elevation, launch.azimuth, launch.height, "
                                    "position)");
    dragarc_error err;
    if (dragarc_fit_params_parse(estimate, &o->estimate, &err) != DRAGARC_OK) {
        err.field[0] = '\0';
        return cli_report("--estimate", &err);
    }
    if (dragarc_scenario_read(scenario_file, cli_profile_path(), s, &err) != DRAGARC_OK)
        return cli_report(scenario_file, &err);
    if (dragarc_track_read(track_file, track, &err) != DRAGARC_OK)
        return cli_report(track_file, &err);
    if (dragarc_fit_run(s, track, o, r, fitted, &err) == DRAGARC_OK)
        return EXIT_OK;
    /* a track the fit cannot use is the track file's fault; the rest is the scenario's or the estimate's */
    const char *where = strcmp(err.field, "track") == 0      ? track_file
                        : strcmp(err.field, "estimate") == 0 ? "--estimate"
                                                             : scenario_file;
    if (strcmp(err.field, "track") == 0 || strcmp(err.field, "estimate") == 0)
        err.field[0] = '\0';
    return cli_report(where, &err);
}

int cmd_fit(int argc, char **argv)
{
    const char *files[2] = {NULL, NULL}, *residuals = NULL, *plot = NULL, *estimate = NULL;
    int json = 0, st;
    dragarc_fit_options o;
    dragarc_fit_options_default(&o);
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (cli_help_asked(a, HELP)) {
            return EXIT_OK;
        } else if (strcmp(a, "--json") == 0) {
            json = 1;
        } else if ((st = cli_fit_option("fit", argc, argv, &i, &o, &estimate)) >= 0) {
            if (st != 0)
                return st;
        } else if (strcmp(a, "--residuals") == 0) {
            if (++i >= argc || !argv[i][0])
                return cli_usage_error("fit", "--residuals needs a file name");
            residuals = argv[i];
            if (strcmp(residuals, "-") == 0)
                return cli_usage_error("fit", "--residuals needs a file name: standard output carries the summary");
        } else if ((st = cli_plot_option("fit", argc, argv, &i, &plot)) >= 0) {
            if (st != 0)
                return st;
        } else if (a[0] == '-' && a[1] != '\0') {
            return cli_usage_error("fit", "unknown option '%s'", a);
        } else if (!files[0]) {
            files[0] = a;
        } else if (!files[1]) {
            files[1] = a;
        } else {
            return cli_usage_error("fit", "takes a scenario file and a track file, got a third: '%s'", a);
        }
    }
    if (!files[0] || !*files[0])
        return cli_usage_error("fit", "needs a scenario file and a track file (CSV)");
    if (!files[1] || !*files[1])
        return cli_usage_error("fit", "needs a track file (CSV) after the scenario file");
    if (plot && residuals && strcmp(plot, residuals) == 0)
        return cli_usage_error("fit", "--plot and --residuals name the same file '%s'", plot);
    dragarc_scenario s, fitted;
    dragarc_track track;
    dragarc_fit_result r;
    int status = cli_fit_load("fit", files[0], files[1], estimate, &o, &s, &track, &r, &fitted);
    if (status != EXIT_OK)
        goto done;
    outputs out = {files[0], files[1], &fitted, &track, &r};
    cli_output_file csv[1] = {{"--residuals", residuals, write_residuals}};
    if ((status = cli_write_outputs(csv, 1, &out, draw_plot, plot)) != EXIT_OK)
        goto done;
    if (json)
        status = cli_emit_json(dragarc_fit_json(s.name, files[1], &track, &r), files[0]);
    else
        print_summary(files[1], &s, &track, &r);
    if (status == EXIT_OK && !r.converged)
        status = EXIT_NO_SOLUTION;
done:
    dragarc_scenario_clear(&fitted);
    dragarc_fit_result_clear(&r);
    dragarc_track_clear(&track);
    dragarc_scenario_clear(&s);
    return status;
}
