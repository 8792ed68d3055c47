/* cli_util.c: error reporting, option parsing and human output shared by the commands.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <errno.h>
#include <math.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "cli/cli.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"
#include "dragarc/resources.h"
#include "dragarc/sweep.h"
#include "dragarc/units.h"

#ifndef DRAGARC_PROFILE_DIRS
#define DRAGARC_PROFILE_DIRS "profiles"
#endif

#define DEG (180.0 / 3.14159265358979323846)
#define RPM (60.0 / (2.0 * 3.14159265358979323846)) /* rpm per rad/s */

int cli_emit_json(char *text, const char *where)
{
    if (!text) {
        dragarc_error err;
        dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory writing JSON");
        return cli_report(where, &err);
    }
    puts(text);
    free(text);
    return EXIT_OK;
}

int cli_report(const char *where, const dragarc_error *err)
{
    fputs("dragarc: ", stderr);
    if (where && *where)
        fprintf(stderr, "%s: ", where);
    if (err->field[0])
        fprintf(stderr, "%s: ", err->field);
    fprintf(stderr, "%s\n", err->message);
    switch (err->code) {
    case DRAGARC_EINVAL:
    case DRAGARC_EIO: return EXIT_BAD_INPUT;
    case DRAGARC_ENOSOLUTION: return EXIT_NO_SOLUTION;
    default: return EXIT_FAILED;
    }
}

int cli_usage_error(const char *cmd, const char *fmt, ...)
{
    fprintf(stderr, "dragarc: %s%s", cmd ? cmd : "", cmd ? ": " : "");
    va_list ap;
    va_start(ap, fmt);
    vfprintf(stderr, fmt, ap);
    va_end(ap);
    fprintf(stderr, " (see 'dragarc %s%s--help')\n", cmd ? cmd : "", cmd ? " " : "");
    return EXIT_BAD_INPUT;
}

int cli_help_asked(const char *a, const char *help)
{
    if (strcmp(a, "-h") != 0 && strcmp(a, "--help") != 0)
        return 0;
    fputs(help, stdout);
    return 1;
}

int cli_file_argument(const char *cmd, const char *what, const char *a, const char **file)
{
    if (a[0] == '-' && a[1] != '\0')
        return cli_usage_error(cmd, "unknown option '%s'", a);
    if (*file)
        return cli_usage_error(cmd, "only one %s, got '%s' and '%s'", what, *file, a);
    *file = a;
    return 0;
}

int cli_parse_double(const char *text, double *out)
{
    if (!text || !*text)
        return -1;
    char *end = NULL;
    double v = strtod(text, &end);
    if (*end != '\0' || !isfinite(v))
        return -1;
    *out = v;
    return 0;
}

/* The units database, loaded the first time a value carries a unit; the CLI runs one command on one thread. */
static dragarc_units *cli_units;

int cli_parse_value(const char *text, dragarc_quantity q, double *out, char *why, size_t n)
{
    if (n > 0)
        why[0] = '\0';
    if (cli_parse_double(text, out) == 0)
        return 0;
    char *end = NULL;
    if (!text || (strtod(text, &end), end == text) || *end == '\0')
        return -1; /* no number, or a number alone that is not finite: the caller's own message */
    dragarc_error err;
    if (!cli_units && dragarc_units_new(&cli_units, &err) != DRAGARC_OK) {
        snprintf(why, n, "%s", err.message);
        return -1;
    }
    if (dragarc_units_parse(cli_units, text, q, out, &err) == DRAGARC_OK)
        return 0;
    if (!strstr(err.message, "does not start with a number"))
        snprintf(why, n, "%s", err.message);
    return -1;
}

void cli_units_release(void)
{
    dragarc_units_free(cli_units);
    cli_units = NULL;
}

const char *cli_profile_path(void)
{
    static char buf[8192];
    const char *env = getenv("DRAGARC_PROFILE_PATH");
    if (env && *env)
        snprintf(buf, sizeof buf, "%s:%s", env, DRAGARC_PROFILE_DIRS);
    else
        snprintf(buf, sizeof buf, "%s", DRAGARC_PROFILE_DIRS);
    return buf;
}

static void describe_drag(char *buf, size_t n, const dragarc_drag *d)
{
    switch (d->model) {
    case DRAGARC_DRAG_CONSTANT: snprintf(buf, n, "constant Cd %.4g", d->cd); break;
    case DRAGARC_DRAG_LINEAR: snprintf(buf, n, "linear, k %.4g N s/m", d->k); break;
    case DRAGARC_DRAG_QUADRATIC: snprintf(buf, n, "quadratic, c %.4g kg/m", d->c); break;
    case DRAGARC_DRAG_SPHERE: snprintf(buf, n, "smooth sphere Cd(Re)"); break;
    case DRAGARC_DRAG_TABLE:
        snprintf(buf, n, "table of Cd against %s (%zu points)", dragarc_drag_axis_name(d->axis), d->npoints);
        break;
    case DRAGARC_DRAG_SPIN_TABLE:
        snprintf(buf, n, "table of Cd against Reynolds number and spin factor (%zu x %zu)", d->npoints, d->ns);
        break;
    default: snprintf(buf, n, "none"); break;
    }
    const double scale = dragarc_drag_scale(d);
    size_t len = strlen(buf);
    if (scale != 1.0 && d->model != DRAGARC_DRAG_NONE && len < n)
        snprintf(buf + len, n - len, ", times cd_scale %.4g", scale);
}

void cli_print_flight(FILE *fp, const char *label, const dragarc_scenario *s, const dragarc_flight *f,
                      const dragarc_display *d, int cautions_too)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
#define SHOW(field, q, v) dragarc_display_value(dragarc_display_unit(d, field, q), v)
#define UNIT(field, q) dragarc_display_unit(d, field, q)->symbol
    const dragarc_projectile *p = &s->projectile;
    char drag[96];
    describe_drag(drag, sizeof drag, &p->drag);
    fprintf(fp, "%s%s%s\n", label, s->name[0] ? ": " : "", s->name);
    fprintf(fp, "  projectile      %s%s%.4g %s, diameter %.4g %s, drag %s\n", p->name, p->name[0] ? ", " : "",
            SHOW("mass", DRAGARC_Q_MASS, p->mass), UNIT("mass", DRAGARC_Q_MASS),
            SHOW("diameter", DRAGARC_Q_LENGTH, p->diameter), UNIT("diameter", DRAGARC_Q_LENGTH), drag);
    const char *angle = UNIT(NULL, DRAGARC_Q_ANGLE);
    if (strcmp(angle, "degree") == 0)
        angle = "deg";
    fprintf(fp, "  launch          %.4g %s at %.4g %s elevation, azimuth %.4g %s, from %.4g %s\n",
            SHOW("launch_speed", DRAGARC_Q_SPEED, s->launch.speed), UNIT("launch_speed", DRAGARC_Q_SPEED),
            SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.elevation * DEG), angle,
            SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.azimuth * DEG), angle,
            SHOW("launch_height", DRAGARC_Q_LENGTH, s->launch.height), UNIT("launch_height", DRAGARC_Q_LENGTH));
    if (s->launch.spin_rate > 0.0) {
        char lift[96], how[64] = "", decay[64] = "no decay";
        switch (p->lift.model) {
        case DRAGARC_LIFT_CONSTANT: snprintf(lift, sizeof lift, "lift constant CL %.4g", p->lift.cl); break;
        case DRAGARC_LIFT_SAWICKI2003: snprintf(lift, sizeof lift, "lift CL(S) of Sawicki et al. 2003"); break;
        case DRAGARC_LIFT_TABLE: snprintf(lift, sizeof lift, "lift CL(S) table, %zu points", p->lift.npoints); break;
        default: snprintf(lift, sizeof lift, "no lift model: the spin has no effect"); break;
        }
        if (s->launch.spin_axis_given)
            snprintf(how, sizeof how, "axis (%.3f, %.3f, %.3f) east-north-up", s->launch.spin_axis[0],
                     s->launch.spin_axis[1], s->launch.spin_axis[2]);
        else
            snprintf(how, sizeof how, "tilt %.4g %s", SHOW(NULL, DRAGARC_Q_ANGLE, s->launch.spin_tilt * DEG), angle);
        if (s->launch.spin_decay_time > 0.0)
            snprintf(decay, sizeof decay, "decay time %.4g %s",
                     SHOW("spin_decay_time", DRAGARC_Q_TIME, s->launch.spin_decay_time),
                     UNIT("spin_decay_time", DRAGARC_Q_TIME));
        else if (p->spin_decay_coefficient > 0.0)
            snprintf(decay, sizeof decay, "air-torque decay k %.3g", p->spin_decay_coefficient);
        fprintf(fp, "  spin            %.4g %s, %s (%s; %s)\n",
                SHOW("spin_rate", DRAGARC_Q_ANGULAR_SPEED, s->launch.spin_rate * RPM),
                UNIT("spin_rate", DRAGARC_Q_ANGULAR_SPEED), how, lift, decay);
    }
    double cross = SHOW("crossrange", DRAGARC_Q_LENGTH, f->crossrange);
    fprintf(fp, "  range           %.2f %s (downrange %.2f %s, crossrange %.2f %s %s)\n",
            SHOW("range", DRAGARC_Q_LENGTH, f->range), UNIT("range", DRAGARC_Q_LENGTH),
            SHOW("downrange", DRAGARC_Q_LENGTH, f->downrange), UNIT("downrange", DRAGARC_Q_LENGTH), fabs(cross),
            UNIT("crossrange", DRAGARC_Q_LENGTH), cross >= -0.005 ? "right" : "left"); /* no "0.00 m left" */
    fprintf(fp, "  time of flight  %.3f %s\n", SHOW("time_of_flight", DRAGARC_Q_TIME, f->time_of_flight),
            UNIT("time_of_flight", DRAGARC_Q_TIME));
    fprintf(fp, "  apex height     %.2f %s at %.3f %s\n", SHOW("apex_height", DRAGARC_Q_LENGTH, f->apex_height),
            UNIT("apex_height", DRAGARC_Q_LENGTH), SHOW("apex_time", DRAGARC_Q_TIME, f->apex_time),
            UNIT("apex_time", DRAGARC_Q_TIME));
    const char *iangle = UNIT("impact_angle", DRAGARC_Q_ANGLE);
    fprintf(fp, "  impact          %.2f %s at %.1f %s below horizontal, %.3g %s\n",
            SHOW("impact_speed", DRAGARC_Q_SPEED, f->impact_speed), UNIT("impact_speed", DRAGARC_Q_SPEED),
            SHOW("impact_angle", DRAGARC_Q_ANGLE, f->impact_angle * DEG), strcmp(iangle, "degree") == 0 ? "deg" : iangle,
            SHOW("impact_energy", DRAGARC_Q_ENERGY, f->impact_energy), UNIT("impact_energy", DRAGARC_Q_ENERGY));
    if (p->evaporation.enabled) {
        double v_end = fmax(f->impact[7] * p->volume, p->evaporation.nonvolatile_fraction * p->volume), v_res = p->evaporation.nonvolatile_fraction * p->volume;
        fprintf(fp, "  droplet         %.4g %s at launch, %.4g %s %s; %.1f %% of its water evaporated (drop at rest %.1f %s)\n",
                SHOW("diameter", DRAGARC_Q_LENGTH, p->diameter), UNIT("diameter", DRAGARC_Q_LENGTH),
                SHOW("diameter", DRAGARC_Q_LENGTH, cbrt(6.0 / 3.14159265358979323846 * v_end)),
                UNIT("diameter", DRAGARC_Q_LENGTH), f->evaporated ? "when it vanished" : "at landing",
                100.0 * (p->volume - v_end) / (p->volume - v_res),
                SHOW("drop_temperature", DRAGARC_Q_TEMPERATURE, f->drop_temperature),
                UNIT("drop_temperature", DRAGARC_Q_TEMPERATURE));
        if (f->evaporated)
            fprintf(fp, "  evaporated      before landing, %.2f %s above the ground: the impact lines give where it "
                    "vanished\n",
                    SHOW("apex_height", DRAGARC_Q_LENGTH, f->impact[2] - s->ground_elevation),
                    UNIT("apex_height", DRAGARC_Q_LENGTH));
    }
    if (s->ground_surface_given) {
        double rest_cross = f->rest_position[0] * cos(s->launch.azimuth) - f->rest_position[1] * sin(s->launch.azimuth);
        double shown = SHOW("crossrange", DRAGARC_Q_LENGTH, rest_cross);
        fprintf(fp, "  after landing   %d bounce%s, then %.2f %s of roll; at rest %.2f %s from launch (%.2f %s %s) "
                "after %.3f %s\n",
                f->bounces, f->bounces == 1 ? "" : "s", SHOW("roll_distance", DRAGARC_Q_LENGTH, f->roll_distance),
                UNIT("roll_distance", DRAGARC_Q_LENGTH), SHOW("total_distance", DRAGARC_Q_LENGTH, f->total_distance),
                UNIT("total_distance", DRAGARC_Q_LENGTH), fabs(shown), UNIT("crossrange", DRAGARC_Q_LENGTH),
                shown >= -0.005 ? "right" : "left", SHOW("rest_time", DRAGARC_Q_TIME, f->rest_time),
                UNIT("rest_time", DRAGARC_Q_TIME));
    }
    if (s->launch.spin_rate > 0.0)
        fprintf(fp, "  spin at landing %.4g %s\n", SHOW("spin_rate", DRAGARC_Q_ANGULAR_SPEED, f->impact[6] * RPM),
                UNIT("spin_rate", DRAGARC_Q_ANGULAR_SPEED));
    if (isfinite(f->terminal_speed))
        fprintf(fp, "  terminal speed  %.3f %s (still air at launch height)\n",
                SHOW("terminal_speed", DRAGARC_Q_SPEED, f->terminal_speed), UNIT("terminal_speed", DRAGARC_Q_SPEED));
    else
        fprintf(fp, "  terminal speed  none (no drag, or the body does not sink)\n");
    if (isfinite(f->vacuum_range))
        fprintf(fp, "  vacuum range    %.2f %s (same launch without air)\n",
                SHOW("vacuum_range", DRAGARC_Q_LENGTH, f->vacuum_range), UNIT("vacuum_range", DRAGARC_Q_LENGTH));
    fprintf(fp, "  solver          %s, %ld steps, rtol %.1e, atol %.1e\n", dragarc_method_name(f->method), f->steps,
            s->solver.rtol, s->solver.atol);
#undef SHOW
#undef UNIT
    if (!cautions_too)
        return;
    dragarc_cautions_print(fp, f->notes, 100);
}

int cli_units_option(const char *cmd, int argc, char **argv, int *i, const char **system, const char **specs,
                     size_t *nspecs, size_t max)
{
    const char *a = argv[*i];
    if (strcmp(a, "--units") == 0) {
        if (++*i >= argc)
            return cli_usage_error(cmd, "--units needs si or us");
        *system = argv[*i];
        return 0;
    }
    if (strcmp(a, "--unit") != 0)
        return -1;
    if (++*i >= argc)
        return cli_usage_error(cmd, "--unit needs KEY=UNIT, such as range=yd or speed=mph");
    if (*nspecs == max)
        return cli_usage_error(cmd, "too many --unit options");
    specs[(*nspecs)++] = argv[*i];
    return 0;
}

int cli_display_options(const char *cmd, const char *system, const char *const *specs, size_t nspecs,
                        dragarc_display *d)
{
    dragarc_display_si(d);
    if (!system && nspecs == 0)
        return 0;
    dragarc_error err;
    if (!cli_units && dragarc_units_new(&cli_units, &err) != DRAGARC_OK)
        return cli_report(cmd, &err);
    if (system && dragarc_display_system(d, cli_units, system, &err) != DRAGARC_OK)
        return cli_usage_error(cmd, "--units: %s", err.message);
    for (size_t i = 0; i < nspecs; i++) {
        const char *eq = strchr(specs[i], '=');
        char key[64];
        size_t n = eq ? (size_t)(eq - specs[i]) : 0;
        if (!eq || n == 0 || n >= sizeof key || !eq[1])
            return cli_usage_error(cmd, "--unit needs KEY=UNIT, such as range=yd or speed=mph, not '%s'", specs[i]);
        memcpy(key, specs[i], n);
        key[n] = '\0';
        if (dragarc_display_set(d, cli_units, key, eq + 1, &err) != DRAGARC_OK)
            return cli_usage_error(cmd, "--unit %s: %s", specs[i], err.message);
    }
    return 0;
}

int cli_common_argument(const char *cmd, int argc, char **argv, int *i, cli_common *c)
{
    const char *a = argv[*i];
    int st = cli_units_option(cmd, argc, argv, i, &c->system, c->specs, &c->nspecs,
                              sizeof c->specs / sizeof c->specs[0]);
    if (st >= 0)
        return st;
    if (a[0] == '-' && a[1] != '\0')
        return cli_usage_error(cmd, "unknown option '%s'", a);
    if (c->file)
        return cli_usage_error(cmd, "only one scenario file, got '%s' and '%s'", c->file, a);
    c->file = a;
    return 0;
}

int cli_common_load(const char *cmd, const cli_common *c, dragarc_display *d, dragarc_scenario *s)
{
    int st = cli_display_options(cmd, c->system, c->specs, c->nspecs, d);
    if (st != 0)
        return st;
    dragarc_error err;
    if (dragarc_scenario_read(c->file, cli_profile_path(), s, &err) != DRAGARC_OK)
        return cli_report(c->file, &err);
    return 0;
}

void cli_print_params(FILE *fp)
{
    size_t n;
    const dragarc_scenario_param *p = dragarc_scenario_params(&n);
    for (size_t i = 0; i < n; i++)
        fprintf(fp, "  %-20s %s%s%s%s\n", p[i].alias, p[i].path, p[i].unit[0] ? " (" : "", p[i].unit,
                p[i].unit[0] ? ")" : "");
}

int cli_fly_sampled(const dragarc_scenario *s, const dragarc_flight *f, const cli_fly_options *o, dragarc_flight *out,
                    dragarc_error *err)
{
    double span = s->ground_surface_given ? f->rest_time : f->time_of_flight;
    double dt = o->dt_given ? o->dt : span / 600.0;
    if (!(dt > 0.0))
        dt = 1e-3; /* a flight that ends where it starts: launch and impact rows suffice */
    return dragarc_flight_run(s, dt, out, err);
}

/* 0 when path names a plot format (.svg, .png, .pdf), else the exit status of the usage error printed. */
static int plot_path_check(const char *cmd, const char *path)
{
    dragarc_plot_format fmt;
    dragarc_error err;
    if (dragarc_plot_format_from_path(path, &fmt, &err) != DRAGARC_OK)
        return cli_usage_error(cmd, "--plot: %s", err.message);
    return 0;
}

int cli_plot_option(const char *cmd, int argc, char **argv, int *i, const char **path)
{
    if (strcmp(argv[*i], "--plot") != 0)
        return -1;
    if (++*i >= argc || !*argv[*i])
        return cli_usage_error(cmd, "--plot needs a file name ending in .svg, .png or .pdf");
    int st = plot_path_check(cmd, argv[*i]);
    if (st == 0)
        *path = argv[*i];
    return st;
}

int cli_plot_failed(dragarc_error *err)
{
    err->field[0] = '\0'; /* the option, not the scenario, is at fault */
    return cli_report("--plot", err);
}

/* The --plot file of flight f. Its samples are f's when --trajectory asked for them; otherwise the flight is flown
 * again, sampled every --dt or about 600 times, so that the numbers printed are those of a run without --plot. */
static int fly_plot(const dragarc_scenario *s, const dragarc_flight *f, const cli_fly_options *o)
{
    dragarc_flight sampled;
    memset(&sampled, 0, sizeof sampled);
    const dragarc_flight *use = f;
    dragarc_error err;
    int rc = DRAGARC_OK;
    if (!o->trajectory) {
        rc = cli_fly_sampled(s, f, o, &sampled, &err);
        use = &sampled;
    }
    if (rc == DRAGARC_OK) {
        dragarc_flight_plot_options po = {.title = NULL, .free_scale = o->plot_free_scale};
        rc = dragarc_flight_plot(o->plot, s, use, &o->display, &po, &err);
    }
    dragarc_flight_clear(&sampled);
    if (rc != DRAGARC_OK) {
        const char *where = strcmp(err.field, "dt") == 0 ? "--dt" : "--plot"; /* the option, not the scenario */
        err.field[0] = '\0';
        return cli_report(where, &err);
    }
    return EXIT_OK;
}

int cli_fly_scenario(const char *where, const dragarc_scenario *s, const cli_fly_options *o)
{
    dragarc_flight f;
    dragarc_error err;
    double dt = o->trajectory ? o->dt : 0.0;
    int rc = dragarc_flight_run(s, dt, &f, &err);
    if (rc != DRAGARC_OK) {
        dragarc_flight_clear(&f);
        if (strcmp(err.field, "dt") == 0) { /* the option, not the scenario, is at fault */
            err.field[0] = '\0';
            return cli_report("--dt", &err);
        }
        return cli_report(where, &err);
    }
    /* The trajectory is written to its temporary file and committed only after the plot is drawn: a failure of
     * either leaves neither file behind (nor changed). */
    dragarc_output out;
    if (o->trajectory) {
        rc = dragarc_output_open(&out, o->trajectory, &err);
        if (rc == DRAGARC_OK && (rc = dragarc_flight_write_csv(out.fp, &f, &o->display, &err)) != DRAGARC_OK)
            dragarc_output_abort(&out);
        if (rc != DRAGARC_OK) {
            dragarc_flight_clear(&f);
            err.field[0] = '\0';
            return cli_report("--trajectory", &err);
        }
    }
    if (o->plot && (rc = fly_plot(s, &f, o)) != EXIT_OK) {
        if (o->trajectory)
            dragarc_output_abort(&out);
        dragarc_flight_clear(&f);
        return rc;
    }
    if (o->trajectory && (rc = dragarc_output_commit(&out, &err)) != DRAGARC_OK) {
        dragarc_flight_clear(&f);
        err.field[0] = '\0';
        return cli_report("--trajectory", &err);
    }
    if (o->json) {
        char *text = dragarc_flight_json(s, &f, &o->display);
        if (!text) {
            dragarc_flight_clear(&f);
            dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory writing JSON");
            return cli_report(where, &err);
        }
        puts(text);
        free(text);
    } else {
        cli_print_flight(stdout, "dragarc fly", s, &f, &o->display, 1);
    }
    dragarc_flight_clear(&f);
    return EXIT_OK;
}

int cli_write_output(const char *option, const char *path, int (*w)(FILE *fp, const void *ctx, dragarc_error *err),
                     const void *ctx)
{
    dragarc_output out;
    dragarc_error err;
    int rc = dragarc_output_open(&out, path, &err);
    if (rc == DRAGARC_OK) {
        rc = w(out.fp, ctx, &err);
        if (rc == DRAGARC_OK)
            rc = dragarc_output_commit(&out, &err);
        else
            dragarc_output_abort(&out);
    }
    if (rc != DRAGARC_OK) {
        err.field[0] = '\0';
        return cli_report(option, &err);
    }
    return EXIT_OK;
}

int cli_scenario_args(const char *cmd, const char *help, int argc, char **argv, const char *const *file_opts,
                      const char **files, int *json, int *quiet, const char **path)
{
    *path = NULL;
    *json = 0;
    if (quiet)
        *quiet = 0;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        int k = 0, st;
        while (file_opts[k] && strcmp(a, file_opts[k]) != 0)
            k++;
        if (cli_help_asked(a, help)) {
            return EXIT_OK;
        } else if (strcmp(a, "--json") == 0) {
            *json = 1;
        } else if (quiet && strcmp(a, "--quiet") == 0) {
            *quiet = 1;
        } else if (file_opts[k]) {
            if (++i >= argc)
                return cli_usage_error(cmd, "%s needs a file name", a);
            files[k] = argv[i];
        } else if ((st = cli_file_argument(cmd, "scenario file", a, path)) != 0) {
            return st;
        }
    }
    if (!*path)
        return cli_usage_error(cmd, "needs a scenario file");
    for (int k = 0; file_opts[k]; k++) {
        int st = strcmp(file_opts[k], "--plot") == 0 && files[k] ? plot_path_check(cmd, files[k]) : 0;
        if (st != 0)
            return st;
        for (int m = 0; m < k; m++)
            if (files[k] && files[m] && strcmp(files[k], files[m]) == 0 && strcmp(files[k], "-") != 0)
                return cli_usage_error(cmd, "%s and %s name the same file '%s'", file_opts[m], file_opts[k], files[k]);
    }
    return -1;
}

int cli_write_outputs(const cli_output_file *files, size_t n, const void *ctx,
                      int (*plot)(const char *path, const void *ctx, dragarc_error *err), const char *plot_path)
{
    dragarc_output out[CLI_MAX_OUTPUTS];
    dragarc_error err;
    size_t opened = 0;
    const char *option = "";
    int rc = DRAGARC_OK;
    for (size_t k = 0; k < n && k < CLI_MAX_OUTPUTS && rc == DRAGARC_OK; k++) {
        if (!files[k].path)
            continue;
        option = files[k].option;
        rc = dragarc_output_open(&out[opened], files[k].path, &err);
        if (rc != DRAGARC_OK)
            break;
        opened++;
        rc = files[k].write(out[opened - 1].fp, ctx, &err);
    }
    if (rc == DRAGARC_OK && plot && plot_path) {
        option = "--plot";
        rc = plot(plot_path, ctx, &err);
    }
    /* the files are renamed into place only when every one, and the plot, is complete */
    for (size_t k = 0, m = 0; k < n && m < opened; k++) {
        if (!files[k].path)
            continue;
        if (rc == DRAGARC_OK) {
            option = files[k].option;
            rc = dragarc_output_commit(&out[m], &err);
        } else {
            dragarc_output_abort(&out[m]);
        }
        m++;
    }
    if (rc != DRAGARC_OK) {
        err.field[0] = '\0';
        return cli_report(option, &err);
    }
    return EXIT_OK;
}


double cli_physical_memory(void)
{
    long pages = sysconf(_SC_PHYS_PAGES), size = sysconf(_SC_PAGESIZE);
    return pages > 0 && size > 0 ? (double)pages * (double)size : 0.0;
}

int cli_memory_check(const char *where, const char *field, double need)
{
    dragarc_error err;
    if (dragarc_memory_check(need, cli_physical_memory(), field, &err) != DRAGARC_OK)
        return cli_report(where, &err);
    return 0;
}

void cli_progress_begin(cli_progress *p, const char *unit, int quiet)
{
    p->unit = unit;
    timespec_get(&p->start, TIME_UTC); /* C17 has no monotonic clock; a second of drift only skews the estimate */
    p->bytes = 0.0;
    p->whole = 0;
    p->procs = 1;
    p->enabled = !quiet && isatty(STDERR_FILENO);
    p->shown = 0;
}

void cli_progress_plan(cli_progress *p, double bytes)
{
    p->bytes = bytes;
}

void cli_progress_share(cli_progress *p, size_t whole, int procs)
{
    p->whole = procs > 1 ? whole : 0;
    p->procs = procs > 1 ? procs : 1;
}

/* s seconds as "40 s", "11 min" or "2.5 h" */
static void format_duration(double s, char *buf, size_t size)
{
    if (s < 90.0)
        snprintf(buf, size, "%.0f s", s);
    else if (s < 5400.0)
        snprintf(buf, size, "%.0f min", s / 60.0);
    else
        snprintf(buf, size, "%.1f h", s / 3600.0);
}

/* The big run's one line: its size, memory and the whole run's time at the pace of its first el seconds. */
static void print_plan(const cli_progress *p, size_t done, size_t total, double el)
{
    char mem[48] = "", when[32];
    if (p->bytes > 0.0) {
        char b[32];
        dragarc_bytes_format(p->bytes, b, sizeof b);
        snprintf(mem, sizeof mem, ", about %s", b);
    }
    format_duration(el * (double)total / (double)done, when, sizeof when);
    int n = dragarc_threads();
    char procs[48] = "";
    if (p->procs > 1)
        snprintf(procs, sizeof procs, "%d processes of ", p->procs);
    fprintf(stderr, "dragarc: %zu %s%s, about %s on %s%d thread%s\n", total, p->unit, mem, when, procs, n,
            n == 1 ? "" : "s");
}

void cli_progress_tick(size_t done, size_t total, void *user)
{
    cli_progress *p = user;
    if (!p->enabled || total == 0)
        return;
    if (p->whole > 0) { /* this process's block stands for the whole run */
        done = done == total ? p->whole : (size_t)((double)done / (double)total * (double)p->whole);
        total = p->whole;
    }
    struct timespec now;
    timespec_get(&now, TIME_UTC);
    double el = (double)(now.tv_sec - p->start.tv_sec) + 1e-9 * (double)(now.tv_nsec - p->start.tv_nsec);
    if (el < 1.0 && done < total)
        return;
    if (!p->shown && total > CLI_BIG_RUN && done > 0 && done < total)
        print_plan(p, done, total, el);
    double left = done > 0 ? el * (double)(total - done) / (double)done : 0.0;
    int w = 30, f = (int)(w * (double)done / (double)total);
    fprintf(stderr, "\r  [%.*s%*s] %zu/%zu %s, about %.0f s left ", f, "##############################", w - f, "",
            done, total, p->unit, left);
    p->shown = 1;
}

void cli_progress_end(cli_progress *p)
{
    if (p->shown)
        fputs("\r\033[K", stderr);
    p->shown = 0;
}

int cli_report_date(const char *cmd, time_t *when)
{
    const char *env = getenv("SOURCE_DATE_EPOCH");
    if (!env || !*env) {
        *when = time(NULL);
        return 0;
    }
    char *end = NULL;
    errno = 0;
    long long v = strtoll(env, &end, 10);
    if (*end != '\0' || errno != 0 || v < 0 || env[0] < '0' || env[0] > '9')
        return cli_usage_error(cmd, "SOURCE_DATE_EPOCH must be a whole number of seconds since 1970, not '%s'", env);
    *when = (time_t)v;
    return 0;
}
