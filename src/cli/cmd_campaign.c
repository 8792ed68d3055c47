/* cmd_campaign.c: `dragarc campaign CAMPAIGN.json --out FOLDER`: many footprint cases (the breakups of one vehicle
 * along its trajectory, say), each case's outputs in a folder of its own and one combined report.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "cli/cli.h"
#include "cli/cli_mpi.h"
#include "core/constants.h"
#include "dragarc/campaign.h"
#include "dragarc/output.h"
#include "dragarc/report.h"

static const char HELP[] =
    "usage: dragarc campaign CAMPAIGN.json --out FOLDER [--samples N] [--seed S] [--json] [--quiet]\n"
    "\n"
    "Run every footprint case of a campaign file (docs/cluster.md): a footprint scenario (docs/footprint.md) with\n"
    "changes, such as the breakup's state at one time along a trajectory, and its own samples and seed if given.\n"
    "Each case writes summary.json (what 'dragarc footprint --json' prints) into a folder of its own in FOLDER,\n"
    "and points.csv, grid.csv, footprint.geojson and a plot when the campaign's outputs ask for them.\n"
    "FOLDER/campaign.json and FOLDER/campaign.csv hold one row per case (the breakup, the mean impact, the 1 sigma\n"
    "ellipse, the hazardous share, E_c), FOLDER/campaign.html is the report of them all with a map (also drawn\n"
    "into FOLDER/campaign.svg when the outputs ask for plots), and the summary printed is their table with the\n"
    "cautions. Every case is read and checked before the first one is flown. Under MPI each case's flights are\n"
    "shared among the processes, with the same results.\n"
    "\n"
    "  --out FOLDER     where the outputs go (made when missing; files of the same names are replaced)\n"
    "  --samples N      samples per class of every case (instead of the campaign's and the scenarios')\n"
    "  --seed S         the seed of every case\n"
    "  --json           print the combined report (campaign.json) instead of the summary\n"
    "  --quiet          no progress bar\n"
    "  -h, --help       this help\n"
    "\n"
    "exit status: 0 every case ran, 2 bad usage, campaign or scenario (nothing flown, no file written),\n"
    "3 a case failed (the cases before it keep their files; no combined report).\n";

/* "CAMPAIGN: cases[i] (SCENARIO)": where a case's errors are reported */
static void case_where(char *buf, size_t n, const char *path, size_t i, const dragarc_campaign_case *c)
{
    snprintf(buf, n, "%s: cases[%zu] (%s)", path, i, c->scenario);
}

/* Read and check case i's scenario into *spec, with its samples and seed (the command line's first). */
static int load_case(const char *path, size_t i, const dragarc_campaign_case *c, double samples, double seed,
                     dragarc_footprint_spec *spec)
{
    dragarc_error err;
    char where[4300];
    case_where(where, sizeof where, path, i, c);
    if (dragarc_footprint_spec_read_patched(c->scenario, c->patch, spec, &err) != DRAGARC_OK)
        return cli_report(where, &err);
    /* the case's outputs (its plot's title, its summary.json) name the case too */
    char name[sizeof spec->base.name];
    snprintf(name, sizeof name, "%s%s%s", spec->base.name, spec->base.name[0] ? ", " : "", c->name);
    memcpy(spec->base.name, name, sizeof name);
    double n = samples > 0.0 ? samples : c->samples;
    double s = seed >= 0.0 ? seed : c->seed;
    if (n > 0.0)
        spec->samples = (size_t)n;
    if (s >= 0.0)
        spec->seed = (uint64_t)s;
    if (dragarc_footprint_check(spec, &err) != DRAGARC_OK)
        return cli_report(where, &err);
    size_t first, step, count;
    cli_mpi_share(spec->nclasses * spec->samples, &first, &step, &count);
    const double share = (double)count * sizeof(dragarc_impact);
    return cli_memory_check(where, "footprint.samples",
                            cli_mpi_rank() != 0 ? share
                                                : dragarc_footprint_memory_estimate(spec) + (step > 1 ? share : 0.0));
}

/* Make folder `path` unless it is one already. */
static int make_folder(const char *path)
{
    struct stat st;
    if (mkdir(path, 0777) == 0 || (errno == EEXIST && stat(path, &st) == 0 && S_ISDIR(st.st_mode)))
        return EXIT_OK;
    dragarc_error err;
    dragarc_error_set(&err, DRAGARC_EIO, "", "cannot make the folder %s: %s", path,
                      errno == EEXIST ? "a file has that name" : strerror(errno));
    return cli_report("--out", &err);
}

/* Case i's files in out/FOLDER, from its run. */
static int write_case(const dragarc_campaign *camp, size_t i, const char *out, const dragarc_footprint_spec *spec,
                      const dragarc_impact *im, const dragarc_footprint_summary *sum)
{
    const dragarc_campaign_case *c = &camp->cases[i];
    char dir[4200], json[4300], points[4300], grid[4300], geojson[4300], plot[4300];
    snprintf(dir, sizeof dir, "%s/%s", out, c->folder);
    snprintf(json, sizeof json, "%s/summary.json", dir);
    snprintf(points, sizeof points, "%s/points.csv", dir);
    snprintf(grid, sizeof grid, "%s/grid.csv", dir);
    snprintf(geojson, sizeof geojson, "%s/footprint.geojson", dir);
    snprintf(plot, sizeof plot, "%s/footprint.%s", dir, camp->plot_format);
    cli_footprint_files f = {camp->outputs & DRAGARC_CAMPAIGN_PLOT ? plot : NULL,
                             camp->outputs & DRAGARC_CAMPAIGN_POINTS ? points : NULL,
                             camp->outputs & DRAGARC_CAMPAIGN_GRID ? grid : NULL,
                             camp->outputs & DRAGARC_CAMPAIGN_GEOJSON ? geojson : NULL, json};
    int status = make_folder(dir);
    return status == EXIT_OK ? cli_footprint_write(&f, 1, spec, im, sum) : status;
}

static int write_csv(FILE *fp, const void *ctx, dragarc_error *err)
{
    const void *const *c = ctx;
    return dragarc_campaign_write_csv(fp, c[0], *(const size_t *)c[1], err);
}

static int write_json(FILE *fp, const void *ctx, dragarc_error *err)
{
    if (fputs(ctx, fp) < 0 || fputc('\n', fp) == EOF)
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed");
    return DRAGARC_OK;
}

/* The combined report as HTML, out/campaign.html, its figures drawn for a moment in out. */
static int write_report(const char *path, const char *out, const dragarc_campaign *camp,
                        const dragarc_campaign_row *rows, time_t when)
{
    dragarc_report *r = NULL;
    dragarc_error err;
    char file[4200];
    snprintf(file, sizeof file, "%s/campaign.html", out);
    int rc = dragarc_report_new(&r, camp->name[0] ? camp->name : path, "campaign", &err);
    if (rc == DRAGARC_OK) {
        dragarc_report_set_date(r, when);
        rc = dragarc_report_set_scratch_dir(r, out, &err);
    }
    if (rc == DRAGARC_OK)
        rc = dragarc_report_campaign(r, path, camp, rows, camp->ncases, &err);
    if (rc == DRAGARC_OK)
        rc = dragarc_report_write_html(r, file, &err);
    dragarc_report_free(r);
    if (rc == DRAGARC_OK)
        return EXIT_OK;
    err.field[0] = '\0';
    return cli_report(file, &err);
}

static void print_summary(const dragarc_campaign *camp, const dragarc_campaign_row *rows, const char *out)
{
    printf("dragarc campaign%s%s\n", camp->name[0] ? ": " : "", camp->name);
    printf("  cases           %zu; outputs in %s (campaign.json, campaign.csv and a folder for each case)\n",
           camp->ncases, out);
    printf("  %-16s %9s %8s %13s %17s %19s %8s %9s %8s\n", "case", "alt m", "v m/s", "landed", "mean E, N m",
           "1 sigma a x b m, az", "hazard", "E_c", "E_c vs");
    for (size_t i = 0; i < camp->ncases; i++) {
        const dragarc_campaign_row *r = &rows[i];
        char landed[24], mean[32] = "-", ell[40] = "-", share[16] = "-", ec[16] = "-";
        snprintf(landed, sizeof landed, "%zu/%zu", r->landed, r->flights);
        if (r->mean_ok)
            snprintf(mean, sizeof mean, "%.0f, %.0f", fabs(r->mean_east) < 0.5 ? 0.0 : r->mean_east,
                     fabs(r->mean_north) < 0.5 ? 0.0 : r->mean_north);
        if (r->ellipse_ok)
            snprintf(ell, sizeof ell, "%.0f x %.0f, %.0f", r->semi_major, r->semi_minor,
                     fmod(r->azimuth / DRAGARC_DEG + 360.0, 180.0));
        if (r->landed > 0)
            snprintf(share, sizeof share, "%.1f %%", 100.0 * r->hazardous_share);
        if (r->casualty_done)
            snprintf(ec, sizeof ec, "%.2e", r->expected_casualties);
        const char *vs = !r->casualty_done || !(r->criterion > 0.0) ? "-"
                         : r->expected_casualties <= r->criterion  ? "within"
                                                                   : "ABOVE";
        printf("  %-16.16s %9.0f %8.1f %13s %17s %19s %8s %9s %8s\n", r->name, r->altitude, r->speed, landed, mean, ell,
               share, ec, vs);
    }
    for (size_t i = 0; i < camp->ncases; i++)
        if (rows[i].note[0])
            printf("  note            %s: %s\n", rows[i].name, rows[i].note);
    printf("  mean impacts east and north of the point below each case's breakup; 'E_c vs': against the case's\n"
           "  hazard.criterion\n");
    cli_print_debris_notes();
}

int cmd_campaign(int argc, char **argv)
{
    const char *path = NULL, *out = NULL;
    int json = 0, quiet = 0, st;
    double samples = -1.0, seed = -1.0;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        if (cli_help_asked(a, HELP))
            return EXIT_OK;
        if ((st = cli_run_option("campaign", argc, argv, &i, &json, &quiet, &samples, &seed)) >= 0) {
            if (st != 0)
                return st;
        } else if (strcmp(a, "--out") == 0) {
            if (++i >= argc || !*argv[i])
                return cli_usage_error("campaign", "--out needs a folder");
            out = argv[i];
        } else if ((st = cli_file_argument("campaign", "campaign file", a, &path)) != 0) {
            return st;
        }
    }
    if (!path)
        return cli_usage_error("campaign", "needs a campaign file");
    if (!out)
        return cli_usage_error("campaign", "needs --out FOLDER for the outputs");
    time_t when;
    if ((st = cli_report_date("campaign", &when)) != 0)
        return st;

    dragarc_campaign camp;
    dragarc_error err;
    dragarc_footprint_spec *specs = NULL;
    dragarc_campaign_row *rows = NULL;
    const int root = cli_mpi_rank() == 0;
    int status = EXIT_OK;
    if (dragarc_campaign_read(path, &camp, &err) != DRAGARC_OK)
        status = cli_report(path, &err);
    else if (!(specs = calloc(camp.ncases, sizeof *specs)) || !(rows = calloc(camp.ncases, sizeof *rows))) {
        dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory for %zu cases", camp.ncases);
        status = cli_report(path, &err);
    }
    /* every case read and checked before anything is flown or written */
    for (size_t i = 0; status == EXIT_OK && i < camp.ncases; i++)
        status = load_case(path, i, &camp.cases[i], samples, seed, &specs[i]);
    if ((status = cli_mpi_agree(status)) == EXIT_OK)
        status = cli_mpi_agree(root ? make_folder(out) : EXIT_OK);
    for (size_t i = 0; status == EXIT_OK && i < camp.ncases; i++) {
        dragarc_population pop;
        dragarc_impact *im = NULL;
        dragarc_footprint_summary sum;
        char where[4300];
        case_where(where, sizeof where, path, i, &camp.cases[i]);
        memset(&pop, 0, sizeof pop);
        memset(&sum, 0, sizeof sum);
        status = cli_footprint_fly(where, -1.0, -1.0, quiet, &specs[i], &pop, &im, &sum);
        if (status == EXIT_OK && root) {
            status = write_case(&camp, i, out, &specs[i], im, &sum);
            dragarc_campaign_row_fill(&rows[i], &camp.cases[i], &specs[i], &sum);
        }
        status = cli_mpi_agree(status); /* rank 0's writing may fail: the others stop with it */
        dragarc_footprint_summary_clear(&sum);
        dragarc_population_clear(&pop);
        free(im);
    }
    if (status == EXIT_OK && root) {
        char *doc = dragarc_campaign_json(&camp, rows, camp.ncases);
        char file[4200];
        const void *ctx[2] = {rows, &camp.ncases};
        snprintf(file, sizeof file, "%s/campaign.csv", out);
        if (!doc) {
            dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory writing JSON");
            status = cli_report(path, &err);
        }
        if (status == EXIT_OK && (camp.outputs & DRAGARC_CAMPAIGN_PLOT)) {
            char map[4200];
            snprintf(map, sizeof map, "%s/campaign.%s", out, camp.plot_format);
            if (dragarc_campaign_plot(map, &camp, rows, camp.ncases, &err) != DRAGARC_OK) {
                err.field[0] = '\0';
                status = cli_report(map, &err);
            }
        }
        if (status == EXIT_OK)
            status = write_report(path, out, &camp, rows, when);
        if (status == EXIT_OK)
            status = cli_write_output(file, file, write_csv, ctx);
        snprintf(file, sizeof file, "%s/campaign.json", out);
        if (status == EXIT_OK)
            status = cli_write_output(file, file, write_json, doc);
        if (status == EXIT_OK && json)
            fputs(doc, stdout), putchar('\n');
        else if (status == EXIT_OK)
            print_summary(&camp, rows, out);
        free(doc);
    }
    for (size_t i = 0; specs && i < camp.ncases; i++)
        dragarc_footprint_spec_clear(&specs[i]);
    free(specs);
    free(rows);
    dragarc_campaign_clear(&camp);
    return status;
}
