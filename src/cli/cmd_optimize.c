/* cmd_optimize.c: `dragarc optimize SCENARIO --maximize carry|total [--vary NAME[=LO:HI]] ... [--json]
 * [--units si|us] [--unit KEY=UNIT]`: the launch within bounds that carries farthest, and its sensitivities.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "dragarc/cautions.h"
#include "dragarc/optimize.h"
#include "dragarc/output.h"

static const char HELP[] =
    "usage: dragarc optimize SCENARIO --maximize carry|total [--vary NAME[=LO:HI]] ... [--json]\n"
    "                        [--units si|us] [--unit KEY=UNIT]\n"
    "\n"
    "Find the launch, within bounds, that carries farthest: the values of one to five varied parameters that\n"
    "maximise the carry (the range to the first landing) or the total distance (to where the ball comes to\n"
    "rest; the carry when the scenario has no ground surface). Every trial is a full flight. One parameter:\n"
    "a scan of 33 points, then GSL's Brent minimiser; several: GSL's Nelder-Mead simplex from the best\n"
    "points of a grid. Then the slope and curvature of the objective against each varied parameter at the\n"
    "optimum, by finite differences, and the flight there, as 'dragarc fly' prints it.\n"
    "\n"
    "  --maximize WHAT      carry or total (required)\n"
    "  --vary NAME[=LO:HI]  vary NAME between LO and HI (in its unit below, or each with a unit of its own,\n"
    "                       \"speed=30 mph:60 mph\"); without =LO:HI the default bounds: elevation 0 to 80 deg,\n"
    "                       speed the scenario's +-20 %, spin_rate 0 to twice the scenario's (0 to 6000 rpm\n"
    "                       without spin), spin_tilt -45 to 45 deg, azimuth the scenario's +-45 deg; other\n"
    "                       parameters need bounds. Repeat for more, up to 5. Default: --vary elevation\n"
    "  --json               print one JSON object instead of the summary\n"
    "  --units si|us        the units of every output: SI (default) or US customary (ft, mph, lb, ft.lbf)\n"
    "  --unit KEY=UNIT      a quantity (length=yd) or a field (range=yd) in a unit of its own; repeatable\n"
    "  -h, --help           this help\n"
    "\n"
    "parameters (short name, scenario key path, unit):\n";

static const char HELP_TAIL[] =
    "\n"
    "A trial flight that fails (never lands, a value the scenario refuses) counts as worse than every flight\n"
    "that lands. The optimum is that of one modelled flight: see the cautions, and docs/optimize.md.\n"
    "exit status: 0 found, 1 no launch within the bounds lands, 2 bad usage or input, 3 the computation\n"
    "failed.\n";

static void print_help(void)
{
    fputs(HELP, stdout);
    cli_print_params(stdout);
    fputs(HELP_TAIL, stdout);
}

/* One --vary as given. */
typedef struct vary_spec {
    const char *text;
    int bounds_given;
} vary_spec;

/* --vary NAME[=LO:HI] into r (bounds 0:1 stand in for the default ones until the scenario is read). 0 on
 * success, else the exit status of the usage error printed. */
static int parse_vary(const char *spec, dragarc_optimize_request *r, vary_spec *v)
{
    char name[64];
    const char *eq = strchr(spec, '=');
    size_t len = eq ? (size_t)(eq - spec) : strlen(spec);
    if (len == 0 || len >= sizeof name)
        return cli_usage_error("optimize", "--vary needs NAME or NAME=LO:HI, not '%s'", spec);
    memcpy(name, spec, len);
    name[len] = '\0';
    dragarc_error err;
    const dragarc_scenario_param *p = dragarc_scenario_param_find(name);
    double lo = 0.0, hi = 1.0;
    v->text = spec;
    v->bounds_given = eq != NULL;
    if (p && eq) {
        const char *colon = strchr(eq + 1, ':');
        char part[2][128], why[256] = "";
        size_t n0 = colon ? (size_t)(colon - eq - 1) : 0;
        if (!colon || n0 == 0 || n0 >= sizeof part[0] || strchr(colon + 1, ':') || !colon[1] ||
            strlen(colon + 1) >= sizeof part[1])
            return cli_usage_error("optimize", "--vary %s: %s: the bounds must be LO:HI, two numbers (got '%s')", spec,
                                   p->path, eq + 1);
        memcpy(part[0], eq + 1, n0);
        part[0][n0] = '\0';
        snprintf(part[1], sizeof part[1], "%s", colon + 1);
        if (cli_parse_value(part[0], p->quantity, &lo, why, sizeof why) != 0 ||
            cli_parse_value(part[1], p->quantity, &hi, why, sizeof why) != 0)
            return why[0] ? cli_usage_error("optimize", "--vary %s: %s: %s", spec, p->path, why)
                          : cli_usage_error("optimize", "--vary %s: %s: the bounds must be LO:HI, two numbers "
                                                        "(got '%s')",
                                            spec, p->path, eq + 1);
    }
    if (dragarc_optimize_add(r, name, lo, hi, &err) != DRAGARC_OK)
        return err.field[0] ? cli_usage_error("optimize", "--vary %s: %s: %s", spec, err.field, err.message)
                            : cli_usage_error("optimize", "--vary: %s", err.message);
    return 0;
}

static void print_human(const dragarc_scenario *at, const dragarc_optimize_request *req,
                        const dragarc_optimize_result *r, const dragarc_display *d)
{
    const dragarc_unit_out *uf = dragarc_optimize_objective_unit(d, req->objective);
    printf("dragarc optimize%s%s\n", at->name[0] ? ": " : "", at->name);
    printf("  maximize        %s: %.2f %s\n",
           req->objective == DRAGARC_OPTIMIZE_CARRY ? "carry (the range to the first landing)"
                                                    : "total distance (to where the ball comes to rest)",
           dragarc_display_value(uf, r->objective), uf->symbol);
    for (size_t i = 0; i < req->nvars; i++) {
        const dragarc_optimize_var *v = &req->vars[i];
        const char *unit = dragarc_unit_abbrev(dragarc_scenario_param_unit(d, v->param));
        const char *sp = unit[0] ? " " : "";
        char lo[32], hi[32], su[64], cu[64];
        dragarc_number_format(lo, sizeof lo, dragarc_scenario_param_shown(d, v->param, v->lo, 1));
        dragarc_number_format(hi, sizeof hi, dragarc_scenario_param_shown(d, v->param, v->hi, 1));
        printf("  %-15s %.6g%s%s, ", v->param->alias, dragarc_scenario_param_shown(d, v->param, r->x[i], 0), sp, unit);
        if (r->bound[i])
            printf("on the %s bound of %s to %s%s%s: a constrained optimum\n", r->bound[i] < 0 ? "lower" : "upper", lo,
                   hi, sp, unit);
        else
            printf("inside %s to %s%s%s\n", lo, hi, sp, unit);
        double slope =
            dragarc_optimize_derivative_shown(d, req->objective, v->param, r->slope[i], 1, 1, su, sizeof su);
        double curv =
            dragarc_optimize_derivative_shown(d, req->objective, v->param, r->curvature[i], 2, 1, cu, sizeof cu);
        if (isfinite(slope))
            printf("                  slope %.3g %s, curvature %.3g %s\n", slope, su, curv, cu);
        else
            fputs("                  slope and curvature unknown: a flight beside the optimum failed (the\n"
                  "                  optimum may be the edge of the launches that land, not a maximum)\n",
                  stdout);
    }
    const char *done = r->converged ? "converged" : "not converged";
    if (strcmp(r->method, "brent") != 0)
        printf("  search          Nelder-Mead simplex (GSL nmsimplex2) from %zu point%s of a %zu-point grid\n"
               "                  %d iterations, %s\n",
               r->starts, r->starts == 1 ? "" : "s", r->grid, r->iterations, done);
    else if (r->iterations == 0 && r->converged)
        printf("  search          a %zu-point scan: its best is on a bound, and a launch just inside is worse\n",
               r->grid);
    else
        printf("  search          Brent minimiser (GSL) after a %zu-point scan: %d iterations, %s\n", r->grid,
               r->iterations, done);
    printf("  flights flown   %ld (%ld failed)\n", r->flights, r->failed);
    if (!r->converged)
        printf("  note            %s\n", r->note);
    cli_print_flight(stdout, "flight at the optimum", at, &r->flight, d, 0);
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t n = dragarc_cautions_optimum(r->flight.notes, cautions, DRAGARC_CAUTIONS_MAX);
    dragarc_cautions_print_list(stdout, cautions, n, 100);
}

int cmd_optimize(int argc, char **argv)
{
    dragarc_optimize_request req;
    dragarc_optimize_request_default(&req);
    vary_spec vary[DRAGARC_OPTIMIZE_MAX_VARS];
    const char *maximize = NULL;
    cli_common c = {0};
    int st, json = 0;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (strcmp(a, "-h") == 0 || strcmp(a, "--help") == 0) {
            print_help();
            return EXIT_OK;
        } else if (strcmp(a, "--json") == 0) {
            json = 1;
        } else if (strcmp(a, "--maximize") == 0) {
            if (++i >= argc)
                return cli_usage_error("optimize", "--maximize needs 'carry' or 'total'");
            maximize = argv[i];
            if (dragarc_optimize_objective_from_name(maximize, &req.objective) != DRAGARC_OK)
                return cli_usage_error("optimize", "--maximize needs 'carry' or 'total', not '%s'", maximize);
        } else if (strcmp(a, "--vary") == 0) {
            if (++i >= argc)
                return cli_usage_error("optimize", "--vary needs NAME or NAME=LO:HI");
            size_t k = req.nvars;
            if ((st = parse_vary(argv[i], &req, &vary[k < DRAGARC_OPTIMIZE_MAX_VARS ? k : 0])) != 0)
                return st;
        } else if ((st = cli_common_argument("optimize", argc, argv, &i, &c)) != 0) {
            return st;
        }
    }
    if (!c.file || !*c.file)
        return cli_usage_error("optimize", "needs a scenario file");
    if (!maximize)
        return cli_usage_error("optimize", "needs --maximize carry or --maximize total");
    if (req.nvars == 0 && (st = parse_vary("elevation", &req, &vary[0])) != 0)
        return st;
    dragarc_display d;
    dragarc_scenario s;
    if ((st = cli_common_load("optimize", &c, &d, &s)) != 0)
        return st;
    dragarc_error err;
    for (size_t k = 0; k < req.nvars; k++) {
        dragarc_optimize_var *v = &req.vars[k];
        if (!vary[k].bounds_given &&
            dragarc_optimize_default_bounds(&s, v->param->path, &v->lo, &v->hi, &err) != DRAGARC_OK) {
            dragarc_scenario_clear(&s);
            return cli_usage_error("optimize", "--vary %s: %s: %s", vary[k].text, err.field, err.message);
        }
    }
    dragarc_optimize_result r;
    int rc = dragarc_optimize_solve(&s, &req, &r, &err);
    if (rc != DRAGARC_OK) {
        dragarc_optimize_clear(&r);
        dragarc_scenario_clear(&s);
        return cli_report(c.file, &err);
    }
    dragarc_scenario at = s; /* shallow: shares the tables, changes the varied scalars; not cleared */
    rc = dragarc_optimize_apply(&at, &req, r.x, &err);
    if (rc == DRAGARC_OK && json) {
        char *text = dragarc_optimize_json(&at, &req, &r, &d);
        if (text) {
            puts(text);
            free(text);
        } else {
            rc = dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory writing JSON");
        }
    } else if (rc == DRAGARC_OK) {
        print_human(&at, &req, &r, &d);
    }
    dragarc_optimize_clear(&r);
    dragarc_scenario_clear(&s);
    return rc == DRAGARC_OK ? EXIT_OK : cli_report("optimize", &err);
}
