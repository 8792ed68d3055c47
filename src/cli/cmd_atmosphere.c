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
    "usage: dragarc atmosphere ALTITUDE... [--temperature-offset K] [--json]\n"
    "\n"
    "U.S. Standard Atmosphere 1976 at each geometric ALTITUDE (metres, -5000 to 86000): temperature,\n"
    "pressure, density, speed of sound and dynamic viscosity.\n"
    "\n"
    "  --temperature-offset K  shift every temperature by K kelvin; pressure stays standard\n"
    "  --json                  print {\"levels\": [...]} instead of a table\n"
    "  -h, --help              this help\n"
    "\n"
    "Values may carry a unit, read by UDUNITS-2: \"35 kft\", --temperature-offset \"-9 degF\" (a difference:\n"
    "-5 K). See docs/units.md.\n";

int cmd_atmosphere(int argc, char **argv)
{
    int json = 0;
    double offset = 0.0;
    size_t n = 0;
    double *alt = malloc((size_t)argc * sizeof *alt);
    dragarc_air *lev = malloc((size_t)argc * sizeof *lev);
    int status = EXIT_OK;
    if (!alt || !lev) {
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
        } else if (strcmp(a, "--temperature-offset") == 0) {
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
    for (size_t i = 0; i < n; i++) {
        dragarc_error err;
        if (dragarc_isa_eval(alt[i], offset, &lev[i], &err) != DRAGARC_OK) {
            err.code = DRAGARC_EINVAL; /* an altitude out of range is bad input here */
            status = cli_report("atmosphere", &err);
            goto done;
        }
    }
    if (json) {
        char *text = dragarc_atmosphere_json(alt, lev, n, offset);
        if (!text) {
            fputs("dragarc: atmosphere: out of memory\n", stderr);
            status = EXIT_FAILED;
            goto done;
        }
        puts(text);
        free(text);
    } else {
        printf("U.S. Standard Atmosphere 1976%s\n", offset != 0.0 ? " with a temperature offset" : "");
        if (offset != 0.0)
            printf("temperature offset %+g K (pressure as standard, density from the shifted temperature)\n", offset);
        printf("%12s %10s %13s %13s %10s %12s\n", "altitude_m", "T_K", "p_Pa", "rho_kg_m3", "a_m_s", "mu_Pa_s");
        for (size_t i = 0; i < n; i++)
            printf("%12.1f %10.3f %13.6g %13.6g %10.3f %12.5g\n", alt[i], lev[i].temperature, lev[i].pressure,
                   lev[i].density, lev[i].speed_of_sound, lev[i].viscosity);
    }
done:
    free(alt);
    free(lev);
    return status;
}
