/* cmd_uniformity.c: `dragarc uniformity CATCH.csv [--json]`: how evenly a catch-can test was watered:
 * Christiansen's CU, the low-quarter DU and plain statistics of the catches.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "dragarc/cautions.h"
#include "dragarc/catch_data.h"
#include "dragarc/output.h"
#include "dragarc/uniformity.h"

#define WIDTH 100 /* columns of the wrapped cautions */

static const char HELP[] =
    "usage: dragarc uniformity CATCH.csv [--json]\n"
    "\n"
    "How evenly a catch-can test was watered: the count, mean, smallest and largest catch, Christiansen's\n"
    "uniformity coefficient CU, the low-quarter distribution uniformity DU_lq and the coefficient of\n"
    "variation CV, then the cautions.\n"
    "\n"
    "CATCH.csv has a header row and one can a row: a depth column; optionally x and y (the can's position:\n"
    "the grid's extent is reported) and area (the area each can stands for: every value is then weighted by\n"
    "it; without it the cans stand for equal areas). Depths may be in any unit (mm, inches, mL caught by\n"
    "equal cans) as long as every can uses the same one: CU, DU and CV are ratios. See docs/uniformity.md.\n"
    "\n"
    "  --json      print one JSON object instead of the summary\n"
    "  -h, --help  this help\n"
    "\n"
    "exit status: 0 success, 2 bad usage or a file that cannot be read or used.\n";

static void print_human(const char *file, const dragarc_catches *c, const dragarc_uniformity *u)
{
    printf("dragarc uniformity: %s\n", file);
    printf("  catches         %zu cans %s", u->n, c->area ? "weighted by their areas" : "of equal area");
    double ext[4];
    if (dragarc_catches_extent(c, ext) == 0)
        printf(", at x %g to %g, y %g to %g", ext[0], ext[1], ext[2], ext[3]);
    printf("\n  mean            %.4g (in the file's depth unit)\n", u->mean);
    printf("  min, max        %.4g, %.4g\n", u->min, u->max);
    printf("  CU              %.1f %% (Christiansen)\n", u->cu);
    printf("  DU_lq           %.1f %% (mean of the lowest quarter %.4g)\n", u->du_lq, u->low_quarter_mean);
    printf("  CV              %.3f (standard deviation %.4g)\n", u->cv, u->sd);
    dragarc_cautions_print_uniformity(stdout, WIDTH);
}

int cmd_uniformity(int argc, char **argv)
{
    const char *file = NULL;
    int json = 0, st;
    for (int i = 1; i < argc; i++) {
        if (cli_help_asked(argv[i], HELP))
            return EXIT_OK;
        if (strcmp(argv[i], "--json") == 0)
            json = 1;
        else if ((st = cli_file_argument("uniformity", "catch file", argv[i], &file)) != 0)
            return st;
    }
    if (!file)
        return cli_usage_error("uniformity", "needs a catch-can CSV file");

    char where[4200];
    snprintf(where, sizeof where, "uniformity: %s", file);
    dragarc_catches c;
    dragarc_uniformity u;
    dragarc_error err;
    int rc = dragarc_catches_read(file, &c, &err);
    if (rc == DRAGARC_OK)
        rc = dragarc_uniformity_compute(c.depth, c.area, c.n, &u, &err);
    if (rc != DRAGARC_OK) {
        dragarc_catches_clear(&c);
        return cli_report(where, &err);
    }
    int status = EXIT_OK;
    if (json) {
        char *text = dragarc_uniformity_json(file, &c, &u);
        if (text)
            puts(text);
        else
            status = cli_report("uniformity", &(dragarc_error){DRAGARC_ENOMEM, "", "out of memory"});
        free(text);
    } else {
        print_human(file, &c, &u);
    }
    dragarc_catches_clear(&c);
    return status;
}
