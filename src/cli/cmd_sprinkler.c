/* cmd_sprinkler.c: `dragarc sprinkler SCENARIO [--json] [--csv FILE] [--grid FILE] [--plot FILE] [--quiet]`: where a
 * sprinkler's drops land and the water they lay down.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"
#include "dragarc/sprinkler.h"

static const char HELP[] =
    "usage: dragarc sprinkler SCENARIO [--json] [--csv FILE] [--grid FILE] [--plot FILE.svg|png|pdf] [--quiet]\n"
    "\n"
    "Fly every drop size of a sprinkler (its nozzle, pressure, height, elevation, arc and drop-size spectrum, in\n"
    "the scenario's air and wind; see docs/sprinkler.md) in every direction of its arc, and print the jet, where\n"
    "each size class lands, the radial application-rate profile (mm/h), the wetted radius, and the shares of the\n"
    "flow that land and that evaporate, with cautions. SI units.\n"
    "\n"
    "  --json        print one JSON object instead of the summary\n"
    "  --csv FILE    write the radial profile (r_inner_m,r_outer_m,rate_mm_h); written whole or not at all\n"
    "  --grid FILE   write the application rate on the grid of cells (x_m,y_m,rate_mm_h at cell centres)\n"
    "  --plot FILE   draw the radial profile, the pattern as a colour map and, with a layout, the overlapped\n"
    "                pattern over one cell into FILE, an .svg, .png or .pdf file (docs/plots.md)\n"
    "  --quiet       no progress bar (it shows only when stderr is a terminal)\n"    "  -h, --help    this help\n";

typedef struct outputs {
    const dragarc_sprinkler_result *r;
    const dragarc_sprinkler_spec *spec;
} outputs;

static int write_profile(FILE *fp, const void *ctx, dragarc_error *err)
{
    const outputs *o = ctx;
    return dragarc_sprinkler_write_profile_csv(fp, o->r, o->spec->ring_width, err);
}

static int write_grid(FILE *fp, const void *ctx, dragarc_error *err)
{
    return dragarc_sprinkler_write_grid_csv(fp, ((const outputs *)ctx)->r, err);
}

static int draw_plot(const char *path, const void *ctx, dragarc_error *err)
{
    const outputs *o = ctx;
    return dragarc_sprinkler_plot(path, o->spec, o->r, NULL, err);
}

static void print_summary(const dragarc_sprinkler_spec *sp, const dragarc_spectrum_class *cl,
                          const dragarc_sprinkler_result *r)
{
    const double deg = 180.0 / 3.14159265358979323846;
    printf("dragarc sprinkler%s%s\n", sp->base.name[0] ? ": " : "", sp->base.name);
    printf("  nozzle          %.4g mm at %.4g kPa: jet %.3f m/s, flow %.3f L/min (%.4g m3/h), from %.3g m at %.3g deg\n",
           sp->nozzle.diameter * 1e3, sp->nozzle.pressure * 1e-3, r->exit_speed, r->flow * 6e4, r->flow * 3600.0,
           sp->base.launch.height, sp->base.launch.elevation * deg);
    printf("  arc             %.4g to %.4g deg, %zu directions; %zu drop classes (%s)\n", sp->arc_from * deg,
           sp->arc_to * deg, r->ndirections, r->nclasses, dragarc_spectrum_spacing_name(sp->spacing));
    puts("  class  diameter   volume   throw (min-max)         time   water landing");
    for (size_t i = 0; i < r->nclasses; i++) {
        dragarc_sprinkler_class_stats st;
        dragarc_sprinkler_class_summary(r, i, &st);
        if (!st.flown) {
            printf("  %5zu  %6.3f mm  %5.2f %%  (every flight failed)\n", i + 1, cl[i].diameter * 1e3,
                   100.0 * cl[i].fraction);
            continue;
        }
        printf("  %5zu  %6.3f mm  %5.2f %%  %6.2f m (%6.2f-%6.2f)  %6.2f s  %6.2f %%\n", i + 1, cl[i].diameter * 1e3,
               100.0 * cl[i].fraction, st.distance, st.distance_min, st.distance_max, st.time, 100.0 * st.water_left);
    }
    /* the profile in steps of about a metre, as the rings' mean */
    size_t step = (size_t)fmax(1.0, floor(1.0 / sp->ring_width + 0.5));
    puts("  application rate by distance (mm/h, averaged round the arc; the whole pattern in still air):");
    for (size_t k = 0; k < r->nrings; k += step) {
        double a = 0.0, w = 0.0;
        for (size_t m = k; m < k + step && m < r->nrings; m++) {
            double area = (2.0 * m + 1.0);
            a += r->ring_rate[m] * area, w += area;
        }
        printf("    %6.2f-%6.2f m  %8.3f\n", k * sp->ring_width, fmin(k + step, r->nrings) * sp->ring_width, a / w);
    }
    printf("  wetted radius   %.2f m (to the last ring at %.2f mm/h or more)\n", r->wetted_radius, DRAGARC_WETTED_RATE);
    printf("  water           %.3f %% lands, %.3f %% evaporates in the air%s\n", 100.0 * r->deposited_fraction,
           100.0 * r->evaporated_fraction,
           sp->base.projectile.evaporation.enabled ? "" : " (no evaporation: the atmosphere is not the local model)");
    if (r->layout_done) {
        static const char *const KIND[] = {"square", "rectangular", "triangular"};
        const dragarc_uniformity *u = &r->layout_stats;
        printf("  layout          %s, %.4g m spacing", KIND[r->layout.kind], r->layout.spacing);
        if (r->layout.kind == DRAGARC_LAYOUT_RECTANGULAR)
            printf(" x %.4g m between rows", r->layout.row_spacing);
        printf(": mean %.3f mm/h over a %.4g x %.4g m cell (%zu x %zu points); CU %.1f %%, DU_lq %.1f %%, CV %.3f\n",
               u->mean, r->cell_width, r->cell_height, r->layout_points, r->layout_points, u->cu, u->du_lq, u->cv);
    }
    if (r->nfailed)
        printf("  failed flights  %zu of %zu (their water is not counted as landed)\n", r->nfailed,
               r->nclasses * r->ndirections);
    dragarc_cautions_print(stdout, r->notes | DRAGARC_NOTE_IRRIGATION, 100);
}

int cli_sprinkler_load(const char *path, int quiet, dragarc_sprinkler_spec *spec, dragarc_spectrum_class **classes,
                       dragarc_sprinkler_result *r)
{
    dragarc_error err;
    memset(r, 0, sizeof *r);
    *classes = NULL;
    if (dragarc_sprinkler_spec_read(path, spec, &err) != DRAGARC_OK)
        return cli_report(path, &err);
    const double need = dragarc_sprinkler_memory_estimate(spec);
    int st = cli_memory_check(path, "sprinkler.directions", need);
    if (st != EXIT_OK)
        return st;
    *classes = calloc(spec->nclasses, sizeof **classes);
    if (!*classes) {
        dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory");
        return cli_report(path, &err);
    }
    cli_progress bar;
    cli_progress_begin(&bar, "flights", quiet);
    cli_progress_plan(&bar, need);
    int rc = dragarc_sprinkler_spec_run(spec, *classes, bar.enabled ? cli_progress_tick : NULL, &bar, r, &err);
    cli_progress_end(&bar);
    return rc == DRAGARC_OK ? EXIT_OK : cli_report(path, &err);
}

int cmd_sprinkler(int argc, char **argv)
{
    static const char *const opts[] = {"--csv", "--grid", "--plot", NULL};
    const char *path, *files[3] = {NULL, NULL, NULL};
    int json, quiet, st = cli_scenario_args("sprinkler", HELP, argc, argv, opts, files, &json, &quiet, &path);
    if (st >= 0)
        return st;
    dragarc_sprinkler_spec spec;
    dragarc_spectrum_class *classes = NULL;
    dragarc_sprinkler_result r;
    int status = cli_sprinkler_load(path, quiet, &spec, &classes, &r);
    const outputs o = {&r, &spec};
    const cli_output_file out[2] = {{"--csv", files[0], write_profile}, {"--grid", files[1], write_grid}};
    if (status == EXIT_OK)
        status = cli_write_outputs(out, 2, &o, draw_plot, files[2]);
    if (status == EXIT_OK && json)
        status = cli_emit_json(dragarc_sprinkler_json(&spec, classes, &r), path);
    else if (status == EXIT_OK) {
        print_summary(&spec, classes, &r);
    }
    dragarc_sprinkler_clear(&r);
    free(classes);
    dragarc_sprinkler_spec_clear(&spec);
    return status;
}
