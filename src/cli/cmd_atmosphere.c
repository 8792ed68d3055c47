/* cmd_atmosphere.c: `dragarc atmosphere ALTITUDE... [--temperature-offset K] [--json]`, or HEIGHT... above a
 * site with the day's weather (--temperature, --pressure, --relative-humidity: the local model).
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
    "       dragarc atmosphere HEIGHT... --temperature T --pressure P --relative-humidity H [--json] ...\n"
    "\n"
    "U.S. Standard Atmosphere 1976 at each geometric ALTITUDE (metres, -5000 to 86000): temperature,\n"
    "pressure, density, speed of sound and dynamic viscosity. With the day's weather at a site instead, the\n"
    "local model at each HEIGHT above the site (metres, -1000 to 11000): moist air by CIPM-2007, the\n"
    "standard lapse rate of -6.5 K/km above and below the site.\n"
    "\n"
    "  --temperature-offset K  shift every temperature by K kelvin; pressure stays standard\n"
    "  --temperature T         air temperature at the site, 180 to 340 K (\"18 degC\")\n"
    "  --pressure P            air pressure at the site, 30000 to 110000 Pa (\"1013 hPa\")\n"
    "  --relative-humidity H   relative humidity at the site, a fraction from 0 to 1 (0.55 for 55 %)\n"
    "  --json                  print {\"levels\": [...]} instead of a table\n"
    "  --units si|us           output units: SI (default) or US customary (ft, degF, psi, lb/ft3, mph)\n"
    "  --unit KEY=UNIT         a quantity (pressure=hPa) or a column (altitude=kft) in a unit of its own\n"
    "  -h, --help              this help\n"
    "\n"
    "Values may carry a unit, read by UDUNITS-2: \"35 kft\", --temperature-offset \"-9 degF\" (a difference:\n"
    "-5 K). See docs/units.md.\n";

/* The value of option argv[*i], of quantity q, into *out: 0, or the exit status after the message (`what`
 * says what the option needs). */
static int option_value(int argc, char **argv, int *i, dragarc_quantity q, const char *what, double *out)
{
    const char *name = argv[*i];
    char why[256] = "";
    if (++*i < argc && cli_parse_value(argv[*i], q, out, why, sizeof why) == 0)
        return 0;
    return *i < argc && why[0] ? cli_usage_error("atmosphere", "%s %s", name, why)
                               : cli_usage_error("atmosphere", "%s needs %s", name, what);
}

/* The site's weather: which of the three were given (bits 1, 2, 4) and the atmosphere they make. */
static int local_weather(unsigned given, int offset_given, dragarc_atmosphere *atm)
{
    if (given != 7)
        return cli_usage_error("atmosphere", "--temperature, --pressure and --relative-humidity go together: the "
                                             "local model needs all three");
    if (offset_given)
        return cli_usage_error("atmosphere", "--temperature-offset shifts the standard atmosphere; the local weather "
                                             "(--temperature, --pressure, --relative-humidity) takes none");
    atm->model = DRAGARC_ATMOSPHERE_LOCAL;
    dragarc_error e;
    if (dragarc_atmosphere_check(atm, &e) != DRAGARC_OK) {
        for (char *c = e.field; *c; c++)
            if (*c == '_')
                *c = '-';
        return cli_usage_error("atmosphere", "--%s %s", e.field, e.message);
    }
    return 0;
}

int cmd_atmosphere(int argc, char **argv)
{
    int json = 0, offset_given = 0;
    double offset = 0.0;
    unsigned weather = 0; /* --temperature, --pressure, --relative-humidity given: bits 1, 2, 4 */
    dragarc_atmosphere atm;
    dragarc_atmosphere_default(&atm);
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
            }
        } else if (strcmp(a, "--temperature-offset") == 0) {
            if ((status = option_value(argc, argv, &i, DRAGARC_Q_TEMPERATURE_DIFFERENCE, "a number of kelvin",
                                       &offset)) != 0)
                goto done;
            offset_given = 1;
        } else if (strcmp(a, "--temperature") == 0) {
            if ((status = option_value(argc, argv, &i, DRAGARC_Q_TEMPERATURE, "a temperature", &atm.temperature)) != 0)
                goto done;
            weather |= 1;
        } else if (strcmp(a, "--pressure") == 0) {
            if ((status = option_value(argc, argv, &i, DRAGARC_Q_PRESSURE, "a pressure", &atm.pressure)) != 0)
                goto done;
            weather |= 2;
        } else if (strcmp(a, "--relative-humidity") == 0) {
            if ((status = option_value(argc, argv, &i, DRAGARC_Q_NUMBER, "a fraction from 0 to 1",
                                       &atm.relative_humidity)) != 0)
                goto done;
            weather |= 4;
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
    if (weather && (status = local_weather(weather, offset_given, &atm)) != 0)
        goto done;
    if (!(offset >= -100.0 && offset <= 100.0)) {
        status = cli_usage_error("atmosphere", "--temperature-offset must be between -100 and 100 K");
        goto done;
    }
    atm.temperature_offset = offset;
    if ((status = cli_display_options("atmosphere", system, specs, nspecs, &d)) != 0)
        goto done;
    for (size_t i = 0; i < n; i++) {
        dragarc_error err;
        int rc = weather ? dragarc_atmosphere_eval(&atm, alt[i], &lev[i], &err)
                         : dragarc_isa_eval(alt[i], offset, &lev[i], &err);
        if (rc != DRAGARC_OK) {
            err.code = DRAGARC_EINVAL; /* a height out of range is bad input here */
            err.field[0] = '\0';      /* the option, not the scenario key */
            status = cli_report("atmosphere", &err);
            goto done;
        }
    }
    if (json) {
        char *text = dragarc_atmosphere_json(&atm, alt, lev, n, &d);
        if (!text) {
            fputs("dragarc: atmosphere: out of memory\n", stderr);
            status = EXIT_FAILED;
            goto done;
        }
        puts(text);
        free(text);
    } else {
        const dragarc_unit_out *u[6] = {
            dragarc_display_unit(&d, weather ? "height" : "altitude", DRAGARC_Q_LENGTH),
            dragarc_display_unit(&d, "temperature", DRAGARC_Q_TEMPERATURE),
            dragarc_display_unit(&d, "pressure", DRAGARC_Q_PRESSURE),
            dragarc_display_unit(&d, "density", DRAGARC_Q_DENSITY),
            dragarc_display_unit(&d, "speed_of_sound", DRAGARC_Q_SPEED),
            dragarc_display_unit(&d, "viscosity", DRAGARC_Q_VISCOSITY),
        };
        const dragarc_unit_out *ud = dragarc_display_unit(&d, "temperature_offset", DRAGARC_Q_TEMPERATURE_DIFFERENCE);
        const char *const names[6] = {weather ? "height" : "altitude", "T", "p", "rho", "a", "mu"};
        char head[6][48];
        for (int k = 0; k < 6; k++) {
            char suffix[32];
            dragarc_unit_column_suffix(u[k]->symbol, suffix, sizeof suffix);
            snprintf(head[k], sizeof head[k], "%s_%s", names[k], suffix);
        }
        if (weather)
            printf("Local weather at the site: %g %s, %g %s, relative humidity %g (CIPM-2007 moist air; "
                   "-6.5 K/km above and below; heights above the site)\n",
                   dragarc_display_value(u[1], atm.temperature), u[1]->symbol,
                   dragarc_display_value(u[2], atm.pressure), u[2]->symbol, atm.relative_humidity);
        else
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
