/* cli.h: shared pieces of the dragarc command-line program.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_CLI_H
#define DRAGARC_CLI_H

#include <stdio.h>
#include <time.h>

#include "dragarc/aim.h"
#include "dragarc/dragarc.h"
#include "dragarc/drift.h"
#include "dragarc/fit.h"
#include "dragarc/footprint.h"
#include "dragarc/population.h"
#include "dragarc/sprinkler.h"
#include "dragarc/flight.h"
#include "dragarc/quantity.h"
#include "dragarc/units.h"
#include "dragarc/scenario.h"

/* Exit statuses (documented in docs/cli.md). */
enum { EXIT_OK = 0, EXIT_NO_SOLUTION = 1, EXIT_BAD_INPUT = 2, EXIT_FAILED = 3 };

/* Print "dragarc: WHERE: field: message" on stderr (WHERE and field omitted when empty) and return
 * the exit status that goes with err->code. */
int cli_report(const char *where, const dragarc_error *err);

/* Print a JSON document on stdout and free it; NULL (out of memory while building it) is reported against
 * `where`. Returns the exit status. */
int cli_emit_json(char *text, const char *where);

/* Print "dragarc: message" for a usage error and return EXIT_BAD_INPUT. */
int cli_usage_error(const char *cmd, const char *fmt, ...) __attribute__((format(printf, 2, 3)));

/* 1, after printing help on standard output, when a is -h or --help; otherwise 0. */
int cli_help_asked(const char *a, const char *help);

/* An argument that is none of the command's options: the one file the command takes, into *file. 0, or the
 * exit status of the usage error printed ("unknown option '--x'", "only one WHAT, got 'a' and 'b'"). A lone
 * "-" is a file name. */
int cli_file_argument(const char *cmd, const char *what, const char *a, const char **file);

/* Parse a finite double from an option value; 0 on success. */
int cli_parse_double(const char *text, double *out);

/* A command-line value of quantity q: a plain number in the quantity's interface unit (metres, m/s,
 * degrees, kelvin, ...) or a number with a unit ("150 yd", "35 kft", "18 degF"), read by UDUNITS-2 (loaded
 * on first use). 0 on success; otherwise -1, with why holding the reason when the text has a number
 * (an unknown unit, a unit of another quantity) and empty when it is no number at all. */
int cli_parse_value(const char *text, dragarc_quantity q, double *out, char *why, size_t n);

/* Free the units database cli_parse_value loaded, if it did. */
void cli_units_release(void);

/* The ':'-separated profile folders: $DRAGARC_PROFILE_PATH first, then the built-in ones. The
 * returned string is static storage in the CLI. */
const char *cli_profile_path(void);

/* Print the human summary of a flight to fp in the units of d (NULL: SI), and its cautions when cautions_too. */
void cli_print_flight(FILE *fp, const char *label, const dragarc_scenario *s, const dragarc_flight *f,
                      const dragarc_display *d, int cautions_too);

/* If argv[*i] is --units or --unit, take its value (advancing *i) into *system or specs[*nspecs] (at most
 * max) and return 0, or the exit status of a usage error; -1 when argv[*i] is neither. */
int cli_units_option(const char *cmd, int argc, char **argv, int *i, const char **system, const char **specs,
                     size_t *nspecs, size_t max);

/* The output units from --units SYSTEM (NULL: si) and --unit KEY=UNIT options, into *d. 0 on success, else
 * the exit status of the usage error printed. */
int cli_display_options(const char *cmd, const char *system, const char *const *specs, size_t nspecs,
                        dragarc_display *d);


/* What the scenario commands share on their command lines: the scenario file and the output units. */
typedef struct cli_common {
    const char *file;   /* NULL until given */
    const char *system; /* --units, or NULL */
    const char *specs[DRAGARC_DISPLAY_MAX_FIELDS + DRAGARC_Q_COUNT]; /* --unit KEY=UNIT */
    size_t nspecs;
} cli_common;

/* Take argv[*i], which none of the command's own options matched: --units or --unit with its value
 * (advancing *i), else an unknown option or the one scenario file. 0 when taken, else the exit status of the
 * usage error printed. */
int cli_common_argument(const char *cmd, int argc, char **argv, int *i, cli_common *c);

/* The output units of c into *d, then the scenario file c->file into *s (caller clears it). 0 on success, else
 * the exit status of the error printed (nothing to clear). */
int cli_common_load(const char *cmd, const cli_common *c, dragarc_display *d, dragarc_scenario *s);

/* Print the parameters that can be set by name, one a line: short name, key path, unit. */
void cli_print_params(FILE *fp);

/* Fly a scenario and write its outputs; shared by `fly` and `demo`. */
typedef struct cli_fly_options {
    int json;
    const char *trajectory; /* CSV path or NULL */
    double dt;              /* s, sampling interval for the trajectory (and the plot) */
    int dt_given;           /* 1: --dt was given (else the plot samples about 600 points of its own) */
    const char *plot;       /* SVG, PNG or PDF path, or NULL */
    int plot_free_scale;    /* 1: --plot-scale free */
    dragarc_display display; /* output units */
} cli_fly_options;
int cli_fly_scenario(const char *where, const dragarc_scenario *s, const cli_fly_options *o);

/* Scenario s flown again for the samples of a figure of its flight f: every o->dt when o->dt_given, else about 600
 * samples over the flight (to rest on a ground surface). Fills *out as dragarc_flight_run does (caller clears). */
int cli_fly_sampled(const dragarc_scenario *s, const dragarc_flight *f, const cli_fly_options *o, dragarc_flight *out,
                    dragarc_error *err);

/* Write the file at path whole or not at all with w(fp, ctx, err); on failure report it under `option` and return
 * the exit status, else EXIT_OK. */
int cli_write_output(const char *option, const char *path, int (*w)(FILE *fp, const void *ctx, dragarc_error *err),
                     const void *ctx);

/* The arguments of a command that reads one scenario file and writes --json or files: the scenario into *path,
 * --json into *json, --quiet into *quiet (NULL: the command has no --quiet), and the value of each option named in
 * file_opts (NULL-terminated, e.g. "--csv") into files[k]. A "--plot" among them must name an .svg, .png or .pdf
 * file, and no two may name the same file. Returns -1 to go on, or the exit status to return (help printed, or a
 * usage error reported). */
int cli_scenario_args(const char *cmd, const char *help, int argc, char **argv, const char *const *file_opts,
                      const char **files, int *json, int *quiet, const char **path);

/* One output file of a command: its option ("--csv"), its path (NULL: not asked for) and what writes it. */
typedef struct cli_output_file {
    const char *option, *path;
    int (*write)(FILE *fp, const void *ctx, dragarc_error *err);
} cli_output_file;
#define CLI_MAX_OUTPUTS 8

/* Write files[0..n) (at most CLI_MAX_OUTPUTS) whole, each to a temporary file, then draw the plot into plot_path
 * (when plot and plot_path are given), and only then rename the files into place: a failure of any leaves none of
 * them behind. On failure the error is reported under the failing option and its exit status returned. */
int cli_write_outputs(const cli_output_file *files, size_t n, const void *ctx,
                      int (*plot)(const char *path, const void *ctx, dragarc_error *err), const char *plot_path);

/* If argv[*i] is --plot, take its value (advancing *i) into *path, checked to end in .svg, .png or .pdf, and return
 * 0, or the exit status of the usage error printed; -1 when argv[*i] is not --plot. */
int cli_plot_option(const char *cmd, int argc, char **argv, int *i, const char **path);

/* Report a failed plot (err from the library's plot functions) against --plot and return the exit status. */
int cli_plot_failed(dragarc_error *err);

/* The options of `aim` that say what to solve (--range, --height, --crossrange, --solve, --keep-azimuth), shared
 * by `aim` and `report --command aim`. If argv[*i] is one, take it and its value (advancing *i) into *req (--range
 * also sets *have_range) and return 0, or the exit status of the usage error printed; -1 when it is none of them. */
int cli_aim_option(const char *cmd, int argc, char **argv, int *i, dragarc_aim_request *req, int *have_range);

/* Check the request (a scenario file, --range given and positive), load the scenario and the units of c into *s and
 * *d, and solve req into *r. 0 (the caller clears *s), or the exit status of the error printed (nothing to clear):
 * 1 when the target is out of reach. */
int cli_aim_load(const char *cmd, const cli_common *c, const dragarc_aim_request *req, int have_range,
                 dragarc_display *d, dragarc_scenario *s, dragarc_aim_result *r);

/* The options of `fit` that say what to fit and how (--estimate, --start, --geodesic, --max-iterations), shared by `fit` and
 * `report --command fit`. If argv[*i] is one, take it and its value (advancing *i) into *o (the --estimate list,
 * unparsed, into *estimate) and return 0, or the exit status of the usage error printed; -1 when it is none. */
int cli_fit_option(const char *cmd, int argc, char **argv, int *i, dragarc_fit_options *o, const char **estimate);

/* Check --estimate (given, every name known) into o->estimate, read the scenario and the track files into *s and
 * *track, and fit them into *r and *fitted (dragarc_fit_run). EXIT_OK, or the exit status of the error printed
 * (against the file or option at fault); either way the caller clears *s, *track, *r and *fitted. */
int cli_fit_load(const char *cmd, const char *scenario_file, const char *track_file, const char *estimate,
                 dragarc_fit_options *o, dragarc_scenario *s, dragarc_track *track, dragarc_fit_result *r,
                 dragarc_scenario *fitted);

/* Read the sprinkler (drift) scenario file at path into *spec, cut its spectrum into *classes (allocated; the caller
 * frees it) and run it into *r, with a progress bar unless quiet: shared by `sprinkler` (`drift`) and `report`.
 * EXIT_OK, or the exit status of the error printed; either way the caller clears *spec and *r and frees *classes. */
int cli_sprinkler_load(const char *path, int quiet, dragarc_sprinkler_spec *spec, dragarc_spectrum_class **classes,
                       dragarc_sprinkler_result *r);
int cli_drift_load(const char *path, dragarc_drift_spec *spec, dragarc_spectrum_class **classes, dragarc_drift_result *r);

/* A whole number from lo to hi given to option opt of cmd (text NULL: missing) into *out: 0, or the exit status of
 * the usage error printed ("--samples must be a whole number from 1 to 10000000 (got 'x')"). */
int cli_count_argument(const char *cmd, const char *opt, const char *text, double lo, double hi, double *out);

/* The options of a footprint run shared by `footprint` and `campaign`: --json, --quiet, --samples N and --seed S. If
 * argv[*i] is one, take it (and its value, advancing *i) and return 0, or the exit status of the usage error printed;
 * -1 when it is none of them. */
int cli_run_option(const char *cmd, int argc, char **argv, int *i, int *json, int *quiet, double *samples,
                   double *seed);

/* Read the footprint scenario at path (with --samples and --seed when > 0 and >= 0), check it and its memory need,
 * read its population, fly it with a progress bar unless quiet, and summarise it into *sum: shared by `footprint`
 * and `report`. EXIT_OK, or the exit status of the error printed; either way the caller clears *spec, *pop and *sum
 * and frees *impacts. */
int cli_footprint_load(const char *path, double samples, double seed, int quiet, dragarc_footprint_spec *spec,
                       dragarc_population *pop, dragarc_impact **impacts, dragarc_footprint_summary *sum);
/* cli_footprint_load of a spec already read into *spec (a campaign's case): from the --samples and --seed on. Under
 * MPI every process calls it, each flies its share, and only rank 0 receives the whole *impacts and the summary
 * (cli_mpi.h). */
int cli_footprint_fly(const char *path, double samples, double seed, int quiet, dragarc_footprint_spec *spec,
                      dragarc_population *pop, dragarc_impact **impacts, dragarc_footprint_summary *sum);
/* The files of a footprint run (NULL: not asked for): the plot, every sample's impact, the density grid, the
 * GeoJSON file and the JSON document. */
typedef struct cli_footprint_files {
    const char *plot, *points, *grid, *geojson, *json;
} cli_footprint_files;

/* Write the files of f: the plot first (a plot that cannot be drawn then leaves no other file), then each other file
 * whole (temporary file and rename). Errors are reported against the option (--points, ...), or against the file's
 * path when by_path. Returns the exit status. */
int cli_footprint_write(const cli_footprint_files *f, int by_path, const dragarc_footprint_spec *spec,
                        const dragarc_impact *im, const dragarc_footprint_summary *sum);

/* The date a report's footer gives: $SOURCE_DATE_EPOCH (seconds since 1970, for reproducible files) when set, else
 * now. 0, or the exit status of the usage error printed (under cmd) when the variable is no such number. */
int cli_report_date(const char *cmd, time_t *when);

/* The published casualty criteria (for comparison only) and the debris cautions, on standard output. */
void cli_print_debris_notes(void);

/* The machine's physical memory in bytes (sysconf _SC_PHYS_PAGES x _SC_PAGESIZE; 0 when unknown). */
double cli_physical_memory(void);

/* Refuse, before any work, a run that needs more than the machine's physical memory (dragarc_memory_check): 0, or
 * the exit status (2) after "dragarc: WHERE: FIELD: the run needs about ... of memory, more than ...". */
int cli_memory_check(const char *where, const char *field, double need);

int cmd_fly(int argc, char **argv);
int cmd_report(int argc, char **argv);
int cmd_aim(int argc, char **argv);
int cmd_atmosphere(int argc, char **argv);
int cmd_demo(int argc, char **argv);
int cmd_table(int argc, char **argv);
int cmd_sprinkler(int argc, char **argv);
int cmd_drift(int argc, char **argv);
int cmd_footprint(int argc, char **argv);
int cmd_optimize(int argc, char **argv);
int cmd_fit(int argc, char **argv);
int cmd_uniformity(int argc, char **argv);
int cmd_campaign(int argc, char **argv);

/* A progress bar on stderr for long runs: shown only when stderr is a terminal and `quiet` is 0, first after a
 * second of work, with the share done and an estimate of the time left; cli_progress_end clears its line. `unit`
 * names what is counted ("flights", "rows"). cli_progress_tick has the signature of the library's progress
 * callbacks (user: the cli_progress); it may be called from one thread at a time.
 * A big run (more than CLI_BIG_RUN flights or rows) first gets one line of its own, above the bar, when the bar
 * first shows: "dragarc: 2400000 flights, about 1.1 GB, about 11 min on 2 threads", the time measured on the run's
 * own first second (nothing is flown twice, and the results do not depend on it) and the memory from `bytes`
 * (the command's memory estimate; 0 leaves it out). */
#define CLI_BIG_RUN 20000
typedef struct cli_progress {
    const char *unit;
    struct timespec start;
    double bytes;
    size_t whole; /* > 0: the run's count, of which this process flies a share (cli_progress_share) */
    int procs;    /* processes sharing the run */
    int enabled, shown;
} cli_progress;
void cli_progress_begin(cli_progress *p, const char *unit, int quiet);
void cli_progress_plan(cli_progress *p, double bytes);
/* A run of `whole` flights or rows shared by procs processes (MPI), this one flying its share: the bar and the big
 * run's line show the whole run, its progress taken from this share's (the shares are dealt alike). */
void cli_progress_share(cli_progress *p, size_t whole, int procs);
void cli_progress_tick(size_t done, size_t total, void *user);
void cli_progress_end(cli_progress *p);

#endif
