/* cmd_atmosphere.c: `dragarc atmosphere ALTITUDE... [--temperature-offset K] [--json]`.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "dragarc/atmosphere.h"
#include "dragarc/output.h"

static const char HELP[] =
    "usage: dragarc atmosphere ALTITUDE... [--temperature-offset K] [--json] [--units si|us] [--unit KEY=UNIT]\n"
    "\n"
    "U.S. Standard Atmosphere 1976 at each geometric ALTITUDE (metres, -5000 to 86000): temperature,\n"
    "pressure, density, speed of sound and dynamic viscosity.\n"
    "\n"
    "  --temperature-offset K  shift every temperature by K kelvin; pressure stays standard\n"
    "  --json                  print {\"levels\": [...]} instead of a table\n"
    "  --units si|us           output units: SI (default) or US customary (ft, degF, psi, lb/ft3, mph)\n"
    "  --unit KEY=UNIT         a quantity (pressure=hPa) or a column (altitude=kft) in a unit of its own\n"
    "  -h, --help              this help\n"
    "\n"
    "Values may carry a unit, read by UDUNITS-2: \"35 kft\", --temperature-offset \"-9 degF\" (a difference:\n"
    "-5 K). See docs/units.md.\n";

int cmd_atmosphere(int argc, char **argv)
{
    int json = 0;
    double offset = 0.0;
    const char *system = NULL;
    const char **specs = malloc((size_t)argc * sizeof *specs);
    size_t nspecs = 0;
    dragarc_display d;
    size_t n = 0;
    double *alt = malloc((size_t)argc * sizeof *alt);
    dragarc_air *lev = malloc((size_t)argc * sizeof *lev);
    int status = EXIT_OK, unit_status;
    if (!alt || !lev || !specs) {
        fputs("dragarc: atmosphere: out of memory\n", stderr);
        status = EXIT_FAILED;
        goto done;
    }
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (strcmp(a, "-h") == 0 || strcmp(a, "--help") == 0) {
            fputs(HELP, stdout);
            goto done;
        } else if (strcmp(a, "--json") == 0) {
            json = 1;
        } else if ((unit_status = cli_units_option("atmosphere", argc, argv, &i, &system, specs, &nspecs,
                                                   (size_t)argc)) >= 0) {
            if (unit_status != 0) {
                status = unit_status;
                goto done;
            }        } else if (strcmp(a, "--temperature-offset") == 0) {
            char why[256];
            if (++i >= argc ||
                cli_parse_value(argv[i], DRAGARC_Q_TEMPERATURE_DIFFERENCE, &offset, why, sizeof why) != 0) {
                status = i < argc && why[0] ? cli_usage_error("atmosphere", "--temperature-offset %s", why)
                                            : cli_usage_error("atmosphere", "--temperature-offset needs a number of kelvin");
                goto done;
            }
        } else {
            char why[256];
            if (a[0] == '-' && !(a[1] == '.' || (a[1] >= '0' && a[1] <= '9'))) {
                status = cli_usage_error("atmosphere", "'%s' is neither an option nor an altitude in metres", a);
                goto done;
            }
            if (cli_parse_value(a, DRAGARC_Q_LENGTH, &alt[n], why, sizeof why) != 0) {
                status = why[0] ? cli_usage_error("atmosphere", "altitude %s", why)
                                : cli_usage_error("atmosphere", "'%s' is neither an option nor an altitude in metres", a);
                goto done;
            }
            n++;
        }
    }
    if (n == 0) {
        status = cli_usage_error("atmosphere", "needs at least one altitude in metres");
        goto done;
    }
    if (!(offset >= -100.0 && offset <= 100.0)) {
        status = cli_usage_error("atmosphere", "--temperature-offset must be between -100 and 100 K");
        goto done;
    }
    if ((status = cli_display_options("atmosphere", system, specs, nspecs, &d)) != 0)
        goto done;
    for (size_t i = 0; i < n; i++) {
        dragarc_error err;
        if (dragarc_isa_eval(alt[i], offset, &lev[i], &err) != DRAGARC_OK) {
            err.code = DRAGARC_EINVAL; /* an altitude out of range is bad input here */
            status = cli_report("atmosphere", &err);
            goto done;
        }
    }
    if (json) {
        char *text = dragarc_atmosphere_json(alt, lev, n, offset, &d);
        if (!text) {
            fputs("dragarc: atmosphere: out of memory\n", stderr);
            status = EXIT_FAILED;
            goto done;
        }
        puts(text);
        free(text);
    } else {
        const dragarc_unit_out *u[6] = {
            dragarc_display_unit(&d, "altitude", DRAGARC_Q_LENGTH),
            dragarc_display_unit(&d, "temperature", DRAGARC_Q_TEMPERATURE),
            dragarc_display_unit(&d, "pressure", DRAGARC_Q_PRESSURE),
            dragarc_display_unit(&d, "density", DRAGARC_Q_DENSITY),
            dragarc_display_unit(&d, "speed_of_sound", DRAGARC_Q_SPEED),
            dragarc_display_unit(&d, "viscosity", DRAGARC_Q_VISCOSITY),
        };
        const dragarc_unit_out *ud = dragarc_display_unit(&d, "temperature_offset", DRAGARC_Q_TEMPERATURE_DIFFERENCE);
        static const char *const names[6] = {"altitude", "T", "p", "rho", "a", "mu"};
        char head[6][48];
        for (int k = 0; k < 6; k++) {
            char suffix[32];
            dragarc_unit_column_suffix(u[k]->symbol, suffix, sizeof suffix);
            snprintf(head[k], sizeof head[k], "%s_%s", names[k], suffix);
        }
        printf("U.S. Standard Atmosphere 1976%s\n", offset != 0.0 ? " with a temperature offset" : "");
        if (offset != 0.0)
            printf("temperature offset %+g %s (pressure as standard, density from the shifted temperature)\n",
                   dragarc_display_value(ud, offset), ud->symbol);
        printf("%12s %10s %13s %13s %10s %12s\n", head[0], head[1], head[2], head[3], head[4], head[5]);
        for (size_t i = 0; i < n; i++)
            printf("%12.1f %10.3f %13.6g %13.6g %10.3f %12.5g\n", dragarc_display_value(u[0], alt[i]),
                   dragarc_display_value(u[1], lev[i].temperature), dragarc_display_value(u[2], lev[i].pressure),
                   dragarc_display_value(u[3], lev[i].density), dragarc_display_value(u[4], lev[i].speed_of_sound),
                   dragarc_display_value(u[5], lev[i].viscosity));
    }
done:
    free(specs);
    free(alt);
    free(lev);
    return status;
}
