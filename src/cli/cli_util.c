/* cli_util.c: error reporting, option parsing and human output shared by the commands.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdarg.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"
#include "dragarc/units.h"

#ifndef DRAGARC_PROFILE_DIRS
#define DRAGARC_PROFILE_DIRS "profiles"
#endif

#define DEG (180.0 / 3.14159265358979323846)

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
    default: snprintf(buf, n, "none"); break;
    }
}

void cli_print_flight(FILE *fp, const char *label, const dragarc_scenario *s, const dragarc_flight *f, int cautions_too)
{
    const dragarc_projectile *p = &s->projectile;
    char drag[96];
    describe_drag(drag, sizeof drag, &p->drag);
    fprintf(fp, "%s%s%s\n", label, s->name[0] ? ": " : "", s->name);
    fprintf(fp, "  projectile      %s%s%.4g kg, diameter %.4g m, drag %s\n", p->name, p->name[0] ? ", " : "",
            p->mass, p->diameter, drag);
    fprintf(fp, "  launch          %.4g m/s at %.4g deg elevation, azimuth %.4g deg, from %.4g m\n",
            s->launch.speed, s->launch.elevation * DEG, s->launch.azimuth * DEG, s->launch.height);
    fprintf(fp, "  range           %.2f m (downrange %.2f m, crossrange %.2f m %s)\n", f->range, f->downrange,
            fabs(f->crossrange), f->crossrange >= -0.005 ? "right" : "left"); /* no "0.00 m left" */
    fprintf(fp, "  time of flight  %.3f s\n", f->time_of_flight);
    fprintf(fp, "  apex height     %.2f m at %.3f s\n", f->apex_height, f->apex_time);
    fprintf(fp, "  impact          %.2f m/s at %.1f deg below horizontal, %.3g J\n", f->impact_speed,
            f->impact_angle * DEG, f->impact_energy);
    if (isfinite(f->terminal_speed))
        fprintf(fp, "  terminal speed  %.3f m/s (still air at launch height)\n", f->terminal_speed);
    else
        fprintf(fp, "  terminal speed  none (no drag, or the body does not sink)\n");
    if (isfinite(f->vacuum_range))
        fprintf(fp, "  vacuum range    %.2f m (same launch without air)\n", f->vacuum_range);
    fprintf(fp, "  solver          %s, %ld steps, rtol %.1e, atol %.1e\n", dragarc_method_name(f->method), f->steps,
            s->solver.rtol, s->solver.atol);
    if (!cautions_too)
        return;
    dragarc_cautions_print(fp, f->notes, 100);
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
    if (o->trajectory) {
        dragarc_output out;
        rc = dragarc_output_open(&out, o->trajectory, &err);
        if (rc == DRAGARC_OK) {
            rc = dragarc_flight_write_csv(out.fp, &f, &err);
            if (rc == DRAGARC_OK)
                rc = dragarc_output_commit(&out, &err);
            else
                dragarc_output_abort(&out);
        }
        if (rc != DRAGARC_OK) {
            dragarc_flight_clear(&f);
            err.field[0] = '\0';
            return cli_report("--trajectory", &err);
        }
    }
    if (o->json) {
        char *text = dragarc_flight_json(s, &f);
        if (!text) {
            dragarc_flight_clear(&f);
            dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory writing JSON");
            return cli_report(where, &err);
        }
        puts(text);
        free(text);
    } else {
        cli_print_flight(stdout, "dragarc fly", s, &f, 1);
    }
    dragarc_flight_clear(&f);
    return EXIT_OK;
}
