/* cmd_drift.c: `dragarc drift SCENARIO [--json] [--csv FILE] [--plot FILE]`: how far a spray's drops drift, and where its volume
 * comes down.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "dragarc/cautions.h"
#include "dragarc/drift.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"

static const char HELP[] =
    "usage: dragarc drift SCENARIO [--json] [--csv FILE] [--plot FILE.svg|png|pdf]\n"
    "\n"
    "Fly every drop size of a spray nozzle (its release height, jet and the sprayer's travel, in the scenario's\n"
    "air and wind; see docs/drift.md) and print where each size comes down or evaporates, the deposit per metre\n"
    "downwind, the distances within which 90 % and 99 % of the volume deposits, the share not deposited before\n"
    "the buffer distance, and the drop size that reaches it, with cautions. SI units.\n"
    "\n"
    "  --json        print one JSON object instead of the summary\n"
    "  --csv FILE    write the deposit per metre downwind, total and per class; written whole or not at all\n"
    "  --plot FILE   draw the deposit downwind (by drop-size band), the volume deposited within each distance\n"
    "                and the drop-size spectrum into FILE, an .svg, .png or .pdf file (docs/plots.md)\n"    "  -h, --help    this help\n";

typedef struct outputs {
    const dragarc_drift_spec *spec;
    const dragarc_spectrum_class *classes;
    const dragarc_drift_result *r;
} outputs;

static int write_csv(FILE *fp, const void *ctx, dragarc_error *err)
{
    return dragarc_drift_write_csv(fp, ((const outputs *)ctx)->r, err);
}

static int draw_plot(const char *path, const void *ctx, dragarc_error *err)
{
    const outputs *o = ctx;
    return dragarc_drift_plot(path, o->spec, o->classes, o->r, NULL, err);
}

static void print_summary(const dragarc_drift_spec *sp, const dragarc_drift_result *r)
{
    static const char *const OUTCOME[] = {"lands", "evaporates", "still aloft", "failed"};
    printf("dragarc drift%s%s\n", sp->base.name[0] ? ": " : "", sp->base.name);
    printf("  release         %.3g m up, jet %.2f m/s at %.3g deg, sprayer moving %.2f m/s; downwind is %.0f deg\n",
           sp->base.launch.height, sp->base.launch.speed, sp->base.launch.elevation * 57.29577951308232,
           hypot(sp->travel[0], sp->travel[1]), fmod(r->wind_toward * 57.29577951308232 + 360.0, 360.0));
    puts("  class  diameter    volume  outcome      downwind  crosswind     time  water landing");
    for (size_t i = 0; i < r->nclasses; i++) {
        const dragarc_drift_class *c = &r->classes[i];
        if (c->outcome > DRAGARC_DRIFT_EVAPORATED)
            printf("  %5zu  %7.1f um  %6.3f %%  %-11s\n", i + 1, c->diameter * 1e6, 100.0 * c->fraction,
                   OUTCOME[c->outcome]);
        else
            printf("  %5zu  %7.1f um  %6.3f %%  %-11s %7.2f m  %7.2f m  %6.2f s  %6.2f %%\n", i + 1, c->diameter * 1e6,
                   100.0 * c->fraction, OUTCOME[c->outcome], c->downwind, c->crosswind, c->time,
                   c->outcome == DRAGARC_DRIFT_LANDED ? 100.0 * c->water_left : 0.0);
    }
    printf("  volume          %.3f %% deposits, %.3f %% evaporates, %.3f %% still aloft after %g s\n",
           100.0 * r->deposited_fraction, 100.0 * r->evaporated_fraction, 100.0 * r->aloft_fraction,
           sp->base.solver.max_time);
    if (isfinite(r->distance90))
        printf("  90 %% deposits   within %.2f m downwind\n", r->distance90);
    else
        printf("  90 %% deposits   nowhere: less than 90 %% of the volume deposits\n");
    if (isfinite(r->distance99))
        printf("  99 %% deposits   within %.2f m downwind\n", r->distance99);
    else
        printf("  99 %% deposits   nowhere: less than 99 %% of the volume deposits\n");
    printf("  buffer %.3g m    %.3f %% of the volume is not deposited before it", r->buffer, 100.0 * r->beyond_buffer);
    if (isfinite(r->diameter_at_buffer))
        printf("; drops under %.0f um come down beyond it\n", r->diameter_at_buffer * 1e6);
    else
        printf("\n");
    dragarc_cautions_print(stdout, r->notes | DRAGARC_NOTE_SPRAY_DRIFT, 100);
}

int cli_drift_load(const char *path, dragarc_drift_spec *spec, dragarc_spectrum_class **classes, dragarc_drift_result *r)
{
    dragarc_error err;
    memset(r, 0, sizeof *r);
    *classes = NULL;
    if (dragarc_drift_spec_read(path, spec, &err) != DRAGARC_OK)
        return cli_report(path, &err);
    *classes = calloc(spec->nclasses, sizeof **classes);
    if (!*classes) {
        dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory");
        return cli_report(path, &err);
    }
    return dragarc_drift_spec_run(spec, *classes, r, &err) == DRAGARC_OK ? EXIT_OK : cli_report(path, &err);
}

int cmd_drift(int argc, char **argv)
{
    static const char *const opts[] = {"--csv", "--plot", NULL};
    const char *path, *files[2] = {NULL, NULL};
    int json, st = cli_scenario_args("drift", HELP, argc, argv, opts, files, &json, NULL, &path);
    if (st >= 0)
        return st;
    dragarc_drift_spec spec;
    dragarc_spectrum_class *classes = NULL;
    dragarc_drift_result r;
    int status = cli_drift_load(path, &spec, &classes, &r);
    const outputs o = {&spec, classes, &r};
    const cli_output_file out[1] = {{"--csv", files[0], write_csv}};
    if (status == EXIT_OK)
        status = cli_write_outputs(out, 1, &o, draw_plot, files[1]);
    if (status == EXIT_OK && json)
        status = cli_emit_json(dragarc_drift_json(&spec, &r), path);
    else if (status == EXIT_OK) {
        print_summary(&spec, &r);
    }
    dragarc_drift_clear(&r);
    free(classes);
    dragarc_drift_spec_clear(&spec);
    return status;
}
