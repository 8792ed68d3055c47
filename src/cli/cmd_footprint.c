/* cmd_footprint.c: `dragarc footprint SCENARIO`: where the fragments of a breakup land, how hard, and the
 * expected casualties, by Monte Carlo.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "cli/cli_mpi.h"
#include "core/constants.h"
#include "dragarc/cautions.h"
#include "dragarc/footprint.h"
#include "dragarc/geodesy.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"
#include "dragarc/resources.h"

static const char HELP[] =
    "usage: dragarc footprint SCENARIO [--samples N] [--seed S] [--json] [--points FILE.csv] [--grid FILE.csv]\n"
    "                                  [--geojson FILE] [--plot FILE.svg|png|pdf] [--quiet]\n"
    "\n"
    "Fly every fragment class of a breakup (its place, altitude and velocity with their spreads, each class's\n"
    "ballistic coefficient, drag law and the velocity the breakup gives it, through the scenario's air and wind;\n"
    "see docs/footprint.md) N times each, and print where the pieces land: the mean impact, the 1, 2 and 3 sigma\n"
    "ellipses, the downrange and crossrange extents, the areas holding 90 %, 99 % and 99.9 % of the fragments,\n"
    "impact speeds and energies, the share above the hazard energy and, with a population, the expected number\n"
    "of casualties, with the published criteria it can be compared with and cautions. SI units.\n"
    "\n"
    "  --samples N      samples per class (default the scenario's footprint.samples, else 1000)\n"
    "  --seed S         the run's seed (default the scenario's footprint.seed, else 1): the same seed gives the\n"
    "                   same result on any number of threads\n"
    "  --json           print one JSON object instead of the summary\n"
    "  --points FILE    every sample's impact as CSV; --grid FILE the density of impacts on the grid as CSV;\n"
    "                   --geojson FILE the footprint as GeoJSON (RFC 7946); each written whole or not at all\n"
    "  --plot FILE      draw the impact points (those at or above the hazard energy marked apart), the 1 and 3\n"
    "                   sigma ellipses and the density of fragments with its 90/99/99.9 % contours, east and\n"
    "                   north of the point below the breakup, into FILE, an .svg, .png or .pdf file\n"
    "                   (docs/plots.md); drawn first, so that a plot that fails leaves no other file\n"
    "  --quiet          no progress bar (it shows only when stderr is a terminal)\n"
    "  -h, --help       this help\n"
    "\n"
    "Under MPI (a build with DRAGARC_MPI, 'mpirun -n P'), the flights are shared among the processes, with the\n"
    "same results (docs/cluster.md).\n";

static int write_points(FILE *fp, const void *ctx, dragarc_error *err)
{
    const void *const *c = ctx;
    return dragarc_footprint_write_csv(fp, c[0], c[1], err);
}

static int write_grid(FILE *fp, const void *ctx, dragarc_error *err)
{
    const void *const *c = ctx;
    return dragarc_footprint_write_grid_csv(fp, c[0], c[1], err);
}

static int write_json(FILE *fp, const void *ctx, dragarc_error *err)
{
    const void *const *c = ctx;
    char *text = dragarc_footprint_json(c[0], c[1], c[2]);
    if (!text)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory writing JSON");
    int ok = fputs(text, fp) >= 0 && fputc('\n', fp) != EOF;
    free(text);
    return ok ? DRAGARC_OK : dragarc_error_set(err, DRAGARC_EIO, "", "write failed");
}

int cli_footprint_write(const cli_footprint_files *f, int by_path, const dragarc_footprint_spec *spec,
                        const dragarc_impact *im, const dragarc_footprint_summary *sum)
{
    dragarc_error err;
    int status = EXIT_OK;
    /* the plot first: a plot that cannot be drawn (a driver, a folder) then leaves none of the other files */
    if (f->plot && dragarc_footprint_plot(f->plot, spec, im, sum, NULL, &err) != DRAGARC_OK) {
        if (!by_path)
            return cli_plot_failed(&err);
        err.field[0] = '\0';
        return cli_report(f->plot, &err);
    }
    const void *points[2] = {spec, im}, *grid[2] = {spec, sum}, *doc[3] = {spec, im, sum};
    if (f->points)
        status = cli_write_output(by_path ? f->points : "--points", f->points, write_points, points);
    if (status == EXIT_OK && f->grid)
        status = cli_write_output(by_path ? f->grid : "--grid", f->grid, write_grid, grid);
    if (status == EXIT_OK && f->geojson && dragarc_footprint_write_geojson(f->geojson, spec, im, sum, &err) != DRAGARC_OK)
        status = cli_report(by_path ? f->geojson : "--geojson", &err);
    if (status == EXIT_OK && f->json)
        status = cli_write_output(f->json, f->json, write_json, doc);
    return status;
}

/* v for printing with no decimals: what rounds to zero prints as 0, never -0 */
static double whole(double v)
{
    return fabs(v) < 0.5 ? 0.0 : v;
}

static void print_group(const char *name, const dragarc_footprint_group *g, int hazard)
{
    char landed[24], mean[32] = "-", ell[40] = "-", v50[16] = "-", e50[16] = "-", share[16] = "-";
    snprintf(landed, sizeof landed, "%zu/%zu", g->landed, g->flights);
    if (g->moments_ok)
        snprintf(mean, sizeof mean, "%.0f, %.0f", whole(g->mean[0]), whole(g->mean[1]));
    if (g->ellipses_ok)
        snprintf(ell, sizeof ell, "%.0f x %.0f, %.0f", g->ellipse[0].semi_major, g->ellipse[0].semi_minor,
                 fmod(g->ellipse[0].azimuth / DRAGARC_DEG + 360.0, 180.0));
    if (g->landed > 0) {
        snprintf(v50, sizeof v50, "%.1f", g->speed_median);
        snprintf(e50, sizeof e50, "%.3g", g->energy_median);
        snprintf(share, sizeof share, "%.1f %%", 100.0 * g->hazardous_share);
    }
    printf("  %-16.16s %9.4g %13s %17s %19s %7s %9s %8s", name, g->fragments, landed, mean, ell, v50, e50, share);
    if (hazard)
        printf(" %9.2e", g->expected_casualties);
    putchar('\n');
}

static void print_summary(const dragarc_footprint_spec *sp, const dragarc_footprint_summary *s)
{
    const dragarc_breakup *b = &sp->breakup;
    const double *v = b->velocity;
    double vh = hypot(v[0], v[1]);
    printf("dragarc footprint%s%s\n", sp->base.name[0] ? ": " : "", sp->base.name);
    printf("  breakup         %.5f%s %.5f%s at %.0f m, %.1f m/s at %.1f deg, heading %.0f deg\n", fabs(b->latitude),
           b->latitude >= 0 ? "N" : "S", fabs(dragarc_geo_normalize_longitude(b->longitude)),
           dragarc_geo_normalize_longitude(b->longitude) >= 0 ? "E" : "W", b->altitude, hypot(vh, v[2]),
           atan2(v[2], vh) / DRAGARC_DEG, fmod(s->azimuth / DRAGARC_DEG + 360.0, 360.0));
    const dragarc_footprint_group *all = &s->groups[sp->nclasses];
    printf("  samples         %zu per class, seed %llu: %zu flights, %zu landed\n", sp->samples,
           (unsigned long long)sp->seed, all->flights, all->landed);
    printf("  %-16s %9s %13s %17s %19s %7s %9s %8s%s\n", "class", "fragments", "landed", "mean E, N m",
           "1 sigma a x b m, az", "v50 m/s", "E50 J", "hazard", s->casualty_done ? "       E_c" : "");
    for (size_t i = 0; i < sp->nclasses; i++) {
        char name[32];
        snprintf(name, sizeof name, "%zu %s", i + 1, sp->classes[i].name);
        print_group(name, &s->groups[i], s->casualty_done);
    }
    print_group("all", all, s->casualty_done);
    if (all->landed > 0) {
        printf("  downrange       99 %% between %.0f and %.0f m, 99.9 %% between %.0f and %.0f m (along %.0f deg)\n",
               whole(all->down[1]), whole(all->down[5]), whole(all->down[0]), whole(all->down[6]),
               fmod(s->azimuth / DRAGARC_DEG + 360.0, 360.0));
        printf("  crossrange      99 %% between %.0f and %.0f m, 99.9 %% between %.0f and %.0f m (right positive)\n",
               whole(all->cross[1]), whole(all->cross[5]), whole(all->cross[0]), whole(all->cross[6]));
        printf("  impacts         speed up to %.1f m/s, energy up to %.4g J; %.1f %% of the fragments land with %.3g J "
               "or more\n", all->speed_max, all->energy_max, 100.0 * all->hazardous_share, sp->hazard.energy_threshold);
    }
    if (s->grid_ok) {
        printf("  contours       ");
        for (int k = 0; k < DRAGARC_FOOTPRINT_NREGIONS; k++)
            printf(" %g %%: %.4g km2 in %zu piece%s%s", 100.0 * s->region[k].probability, s->region[k].area * 1e-6,
                   s->region[k].npolygons, s->region[k].npolygons == 1 ? "" : "s",
                   k + 1 < DRAGARC_FOOTPRINT_NREGIONS ? ";" : "");
        printf(" (cells of %.4g m)\n", s->grid.cell);
    }
    if (s->note[0])
        printf("  note            %s\n", s->note);
    if (s->casualty_done) {
        const dragarc_hazard_options *h = &sp->hazard;
        printf("  casualties      E_c = %.3e expected (", s->casualty.expected_casualties);
        if (h->population_file[0])
            printf("population from %s", h->population_file);
        else
            printf("%g people/km2 everywhere", h->density);
        printf(h->sheltered_share > 0.0 ? ", %.0f %% sheltered at %.0f %% protection)\n" : ", everyone in the open)\n",
               100.0 * h->sheltered_share, 100.0 * h->shelter_protection);
        if (h->criterion > 0.0)
            printf("  criterion       %.3g given: E_c is %s it\n", h->criterion,
                   s->casualty.expected_casualties <= h->criterion ? "within" : "ABOVE");
    } else {
        printf("  casualties      not estimated: the scenario gives no hazard.population\n");
    }
    cli_print_debris_notes();
}

void cli_print_debris_notes(void)
{
    size_t nref = 0;
    const dragarc_risk_reference *refs = dragarc_casualty_references(&nref);
    printf("  published criteria, for comparison only (not an approval):\n");
    for (size_t i = 0; i < nref; i++)
        printf("    - %s: %.3g (%s)\n", refs[i].quantity, refs[i].limit, refs[i].source);
    dragarc_cautions_print(stdout, DRAGARC_NOTE_DEBRIS, 100);
}

int cli_run_option(const char *cmd, int argc, char **argv, int *i, int *json, int *quiet, double *samples,
                   double *seed)
{
    const char *a = argv[*i];
    if (strcmp(a, "--json") == 0)
        *json = 1;
    else if (strcmp(a, "--quiet") == 0)
        *quiet = 1;
    else if (strcmp(a, "--samples") == 0)
        return cli_count_argument(cmd, a, *i + 1 < argc ? argv[++*i] : NULL, 1, DRAGARC_FOOTPRINT_MAX_SAMPLES, samples);
    else if (strcmp(a, "--seed") == 0)
        return cli_count_argument(cmd, a, *i + 1 < argc ? argv[++*i] : NULL, 0, 9007199254740992.0, seed);
    else
        return -1;
    return 0;
}

int cli_count_argument(const char *cmd, const char *opt, const char *text, double lo, double hi, double *out)
{
    double v;
    if (!text)
        return cli_usage_error(cmd, "%s needs a number", opt);
    if (cli_parse_double(text, &v) != 0 || !(v >= lo && v <= hi && v == floor(v)))
        return cli_usage_error(cmd, "%s must be a whole number from %.0f to %.0f (got '%s')", opt, lo, hi, text);
    *out = v;
    return 0;
}

int cli_footprint_load(const char *path, double samples, double seed, int quiet, dragarc_footprint_spec *spec,
                       dragarc_population *pop, dragarc_impact **impacts, dragarc_footprint_summary *sum)
{
    dragarc_error err;
    memset(pop, 0, sizeof *pop);
    memset(sum, 0, sizeof *sum);
    *impacts = NULL;
    int status = EXIT_OK;
    if (dragarc_footprint_spec_read(path, spec, &err) != DRAGARC_OK)
        status = cli_report(path, &err);
    else
        status = cli_footprint_fly(path, samples, seed, quiet, spec, pop, impacts, sum);
    return status;
}

int cli_footprint_fly(const char *path, double samples, double seed, int quiet, dragarc_footprint_spec *spec,
                      dragarc_population *pop, dragarc_impact **impacts, dragarc_footprint_summary *sum)
{
    dragarc_error err;
    if (samples > 0.0)
        spec->samples = (size_t)samples;
    if (seed >= 0.0)
        spec->seed = (uint64_t)seed;
    int status = EXIT_OK;
    const dragarc_hazard_options *h = &spec->hazard;
    /* Under MPI each process flies its share of the flights (every P-th); rank 0 puts them all back in order and
     * summarises, so it alone needs the whole run's memory and the population (cli_mpi.h). One process flies
     * straight into the whole array; with several, rank 0 flies its share into a buffer of its own first. */
    const int root = cli_mpi_rank() == 0, alone = cli_mpi_size() == 1;
    const size_t total = spec->nclasses * spec->samples;
    size_t first, step, count;
    cli_mpi_share(total, &first, &step, &count);
    const double share = (double)count * sizeof **impacts;
    const double need = dragarc_footprint_memory_estimate(spec) + (root && !alone ? share : 0.0);
    dragarc_impact *mine = NULL; /* this process's share, when it is not flown in place */
    if (dragarc_footprint_check(spec, &err) != DRAGARC_OK)
        status = cli_report(path, &err);
    else if ((status = cli_memory_check(path, "footprint.samples", root ? need : share)) != EXIT_OK)
        ; /* reported: nothing is read, allocated or flown */
    else if (root && h->population_given &&
             (h->population_file[0] ? dragarc_population_read(h->population_file, pop, &err)
                                    : dragarc_population_uniform(pop, h->density, &err)) != DRAGARC_OK)
        status = cli_report(h->population_file[0] ? NULL : path, &err);
    else if (root && h->population_file[0] && dragarc_population_set_background(pop, h->background, &err) != DRAGARC_OK)
        status = cli_report(path, &err);
    else if ((root && !(*impacts = malloc(total * sizeof **impacts))) ||
             (!alone && !(mine = malloc((count + 1) * sizeof *mine)))) {
        dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory for %zu flights", root ? total : count);
        status = cli_report(path, &err);
    }
    if ((status = cli_mpi_agree(status)) == EXIT_OK) {
        cli_progress bar;
        cli_progress_begin(&bar, "flights", quiet || !root);
        cli_progress_plan(&bar, need);
        cli_progress_share(&bar, total, cli_mpi_size());
        int rc = dragarc_footprint_run_range(spec, first, total, step, alone ? *impacts : mine,
                                             bar.enabled ? cli_progress_tick : NULL, &bar, &err);
        cli_progress_end(&bar);
        if (rc == DRAGARC_OK && cli_mpi_test_fault())
            rc = dragarc_error_set(&err, DRAGARC_ESOLVER, "", "a failure made on purpose (DRAGARC_MPI_TEST_FAULT)");
        if (rc != DRAGARC_OK)
            status = cli_report(path, &err);
        /* agreed before gathering: a process that failed never leaves the others waiting for its share */
        if ((status = cli_mpi_agree(status)) == EXIT_OK)
            status = cli_mpi_gather(*impacts, mine, sizeof **impacts, total);
    }
    free(mine);
    if (status == EXIT_OK && root &&
        dragarc_footprint_summarise(spec, *impacts, h->population_given ? pop : NULL, sum, &err) != DRAGARC_OK)
        status = cli_report(path, &err);
    return status;
}

int cmd_footprint(int argc, char **argv)
{
    const char *path = NULL, *points = NULL, *geojson = NULL, *grid = NULL, *plot = NULL;
    int json = 0, quiet = 0, st;
    double samples = -1.0, seed = -1.0;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (cli_help_asked(a, HELP))
            return EXIT_OK;
        if ((st = cli_run_option("footprint", argc, argv, &i, &json, &quiet, &samples, &seed)) >= 0) {
            if (st != 0)
                return st;
        } else if (strcmp(a, "--points") == 0 || strcmp(a, "--geojson") == 0 || strcmp(a, "--grid") == 0) {
            if (++i >= argc)
                return cli_usage_error("footprint", "%s needs a file name", a);
            *(a[2] == 'p' ? &points : a[3] == 'e' ? &geojson : &grid) = argv[i];
        } else if ((st = cli_plot_option("footprint", argc, argv, &i, &plot)) >= 0) {
            if (st != 0)
                return st;
        } else if ((st = cli_file_argument("footprint", "scenario file", a, &path)) != 0) {
            return st;
        }
    }
    if (!path)
        return cli_usage_error("footprint", "needs a scenario file");
    const char *files[3] = {points, grid, geojson}, *opts[3] = {"--points", "--grid", "--geojson"};
    for (int k = 0; k < 3 && plot; k++)
        if (files[k] && strcmp(files[k], plot) == 0)
            return cli_usage_error("footprint", "--plot and %s name the same file '%s'", opts[k], plot);
    dragarc_footprint_spec spec;
    dragarc_population pop;
    dragarc_footprint_summary sum;
    dragarc_impact *im = NULL;
    int status = cli_footprint_load(path, samples, seed, quiet, &spec, &pop, &im, &sum);
    if (cli_mpi_rank() != 0)
        goto done; /* rank 0 alone has the whole run and writes (cli_mpi.h) */
    const cli_footprint_files out = {plot, points, grid, geojson, NULL};
    if (status == EXIT_OK)
        status = cli_footprint_write(&out, 0, &spec, im, &sum);
    if (status == EXIT_OK && json)
        status = cli_emit_json(dragarc_footprint_json(&spec, im, &sum), path);
    else if (status == EXIT_OK) {
        print_summary(&spec, &sum);
    }
done:
    dragarc_footprint_summary_clear(&sum);
    dragarc_population_clear(&pop);
    free(im);
    dragarc_footprint_spec_clear(&spec);
    return status;
}
