/* cmd_report.c: `dragarc report SCENARIO -o FILE.html [--command KIND] [options of that command]`.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * One self-contained HTML page for one job (report.h). Each report kind is one entry of KINDS: a function that
 * takes the command's own options, computes, and fills the report with the library's dragarc_report_<kind>
 * (DEVELOPERS.md, "How to add a report kind"). This file decides the output, the date and the scratch folder.
 */
#define _POSIX_C_SOURCE 200809L
#include <errno.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <time.h>

#include "cli/cli.h"
#include "dragarc/plot.h"
#include "dragarc/report.h"

static const char HELP[] =
    "usage: dragarc report SCENARIO -o FILE.html [--command KIND] [options of that command]\n"
    "\n"
    "Run one command on the scenario file SCENARIO and write one self-contained HTML page: the scenario's\n"
    "main inputs, the results tables, the figures, the cautions, the models used with their sources, the\n"
    "dragarc version and the date. CSS and SVG are inline: no scripts, no external files; it prints to PDF\n"
    "from a browser (docs/report.md).\n"
    "\n"
    "  -o, --output FILE    the HTML file (.html or .htm), written whole or not at all\n"
    "  --command KIND       the command to report on: fly (the default), aim, sprinkler, drift, footprint\n"
    "                       or fit\n"
    "  -h, --help           this help\n"
    "\n"
    "fly options:\n"
    "  --dt SECONDS         sampling interval of the figure and the table along the flight (default: about\n"
    "                       600 points over the flight)\n"
    "  --plot-scale equal|free  the side view's axes share one scale (default) or each fits its data\n"
    "  --units si|us        the units of every value shown: SI (default) or US customary\n"
    "  --unit KEY=UNIT      one quantity or one field in a unit of its own; repeat for more (docs/units.md)\n"
    "\n"
    "aim options, as for `dragarc aim` (--range is required):\n"
    "  --range METRES  --height METRES  --crossrange METRES  --solve elevation|speed  --keep-azimuth\n"
    "  --units si|us  --unit KEY=UNIT\n"
    "\n"
    "sprinkler options:\n"
    "  --quiet              no progress bar (it shows only when stderr is a terminal)\n"
    "drift: no options. The sprinkler and drift reports are in SI units, as those commands print them.\n"
    "footprint options, as for `dragarc footprint`:\n"
    "  --samples N  --seed S  --quiet      (SI units, as `dragarc footprint` prints them)\n"
    "\n"
    "fit options, as for `dragarc fit` (--track and --estimate are required):\n"
    "  --track TRACK.csv    the measured track (the file `dragarc fit` takes after the scenario)\n"
    "  --estimate NAME[,NAME...]  --start auto|scenario  --geodesic auto|on|off  --max-iterations N\n"
    "                       (SI units, angles in degrees)\n"
    "\n"
    "The date is the current time in UTC, or SOURCE_DATE_EPOCH (seconds since 1970) when that is set, for\n"
    "reports that come out the same byte for byte. Figures are drawn for a moment in $TMPDIR, else beside FILE.\n"
    "exit status: 0 success, 1 aim: the target is out of reach (no report); fit: the iterations ran out (the\n"
    "report is written, with the warning), 2 bad usage or input, 3 the computation failed.\n";

typedef struct report_kind report_kind;

/* What every kind is given: its own arguments (the scenario file among them) and where the report is written. */
typedef struct report_job {
    const report_kind *kind;
    int argc;
    char **argv;   /* argv[0] is "report" */
    const char *scratch; /* folder for the figures' temporary files */
    time_t date;
    int *written_status; /* the exit status once the report is written, EXIT_OK unless the kind sets it (fit: 1
                          * when the iterations ran out) */
} report_job;

/* Parse the kind's options, compute, and fill a new report into *out (freed by the caller, also on failure).
 * Returns an exit status; on failure the error has been printed. */
typedef int (*report_kind_fn)(const report_job *job, dragarc_report **out);

static int kind_fly(const report_job *job, dragarc_report **out);
static int kind_aim(const report_job *job, dragarc_report **out);
static int kind_sprinkler(const report_job *job, dragarc_report **out);
static int kind_drift(const report_job *job, dragarc_report **out);
static int kind_footprint(const report_job *job, dragarc_report **out);
static int kind_fit(const report_job *job, dragarc_report **out);

struct report_kind {
    const char *name;
    report_kind_fn run;
    const char *const *options; /* the options it takes, NULL-terminated: others' options are refused by name */
};

static const char *const FLY_OPTIONS[] = {"--dt", "--plot-scale", "--units", "--unit", NULL};
static const char *const AIM_OPTIONS[] = {"--range", "--height", "--crossrange", "--solve", "--keep-azimuth",
                                          "--units", "--unit", NULL};
static const char *const SPRINKLER_OPTIONS[] = {"--quiet", NULL};
static const char *const DRIFT_OPTIONS[] = {NULL};
static const char *const FOOTPRINT_OPTIONS[] = {"--samples", "--seed", "--quiet", NULL};
static const char *const FIT_OPTIONS[] = {"--track", "--estimate", "--start", "--geodesic", "--max-iterations", NULL};

/* The kinds that exist. A kind is added with one line here and one function (DEVELOPERS.md). */
static const report_kind KINDS[] = {
    {"fly", kind_fly, FLY_OPTIONS},
    {"aim", kind_aim, AIM_OPTIONS},
    {"sprinkler", kind_sprinkler, SPRINKLER_OPTIONS},
    {"drift", kind_drift, DRIFT_OPTIONS},
    {"footprint", kind_footprint, FOOTPRINT_OPTIONS},
    {"fit", kind_fit, FIT_OPTIONS},
};
#define NKINDS (sizeof KINDS / sizeof KINDS[0])

static const report_kind *kind_named(const char *name)
{
    for (size_t i = 0; i < NKINDS; i++)
        if (strcmp(KINDS[i].name, name) == 0)
            return &KINDS[i];
    return NULL;
}

static void list_kinds(char *buf, size_t n)
{
    buf[0] = '\0';
    for (size_t i = 0; i < NKINDS; i++)
        snprintf(buf + strlen(buf), n - strlen(buf), "%s%s", i ? ", " : "", KINDS[i].name);
}

static int takes(const report_kind *k, const char *option)
{
    for (const char *const *o = k->options; *o; o++)
        if (strcmp(*o, option) == 0)
            return 1;
    return 0;
}

/* argv[*i], which none of the kind's own options took: an option of another kind is refused by name ("--range is an
 * option of the aim report, not of the fly report"); otherwise as cli_common_argument (--units and --unit only for
 * kinds that take them, the scenario file). 0 when taken, else the exit status of the usage error printed. */
static int other_argument(const report_job *job, int *i, cli_common *c)
{
    const char *a = job->argv[*i];
    if (a[0] == '-' && a[1] == '-' && !takes(job->kind, a)) {
        for (size_t k = 0; k < NKINDS; k++)
            if (takes(&KINDS[k], a)) {
                if (strcmp(a, "--units") == 0 || strcmp(a, "--unit") == 0)
                    return cli_usage_error("report", "%s: the %s report takes no units: it is in SI units, as "
                                           "`dragarc %s` prints them", a, job->kind->name, job->kind->name);
                return cli_usage_error("report", "%s is an option of the %s report, not of the %s report", a,
                                       KINDS[k].name, job->kind->name);
            }
    }
    return cli_common_argument("report", job->argc, job->argv, i, c);
}

/* A new report titled with scenario `name` (else the file's base name), for the kind of job, its scratch folder set. */
static int new_report(const report_job *job, const char *file, const char *name, dragarc_report **out,
                      dragarc_error *err)
{
    const char *base = strrchr(file, '/') ? strrchr(file, '/') + 1 : file;
    int rc = dragarc_report_new(out, name[0] ? name : base, job->kind->name, err);
    return rc == DRAGARC_OK ? dragarc_report_set_scratch_dir(*out, job->scratch, err) : rc;
}

static int kind_fly(const report_job *job, dragarc_report **out)
{
    cli_fly_options o = {.dt = 0.05};
    cli_common c = {0};
    int st;
    for (int i = 1; i < job->argc; i++) {
        const char *a = job->argv[i];
        if (strcmp(a, "--plot-scale") == 0) {
            if (++i >= job->argc || (strcmp(job->argv[i], "equal") != 0 && strcmp(job->argv[i], "free") != 0))
                return cli_usage_error("report", "--plot-scale needs 'equal' or 'free'");
            o.plot_free_scale = strcmp(job->argv[i], "free") == 0;
        } else if (strcmp(a, "--dt") == 0) {
            char why[256] = "";
            if (++i >= job->argc || cli_parse_value(job->argv[i], DRAGARC_Q_TIME, &o.dt, why, sizeof why) != 0 ||
                !(o.dt > 0.0))
                return why[0] ? cli_usage_error("report", "--dt %s", why)
                              : cli_usage_error("report", "--dt needs a positive number of seconds");
            o.dt_given = 1;
        } else if ((st = other_argument(job, &i, &c)) != 0) {
            return st;
        }
    }
    if (!c.file || !*c.file)
        return cli_usage_error("report", "needs a scenario file");
    dragarc_scenario s;
    if ((st = cli_common_load("report", &c, &o.display, &s)) != 0)
        return st;
    dragarc_flight f, sampled;
    memset(&sampled, 0, sizeof sampled);
    dragarc_error err;
    int rc = dragarc_flight_run(&s, 0.0, &f, &err);
    if (rc == DRAGARC_OK && (rc = cli_fly_sampled(&s, &f, &o, &sampled, &err)) != DRAGARC_OK &&
        strcmp(err.field, "dt") == 0) {
        err.field[0] = '\0';
        st = cli_report("--dt", &err);
    } else if (rc != DRAGARC_OK) {
        st = cli_report(c.file, &err);
    }
    if (rc == DRAGARC_OK) {
        dragarc_flight_plot_options po = {.title = NULL, .free_scale = o.plot_free_scale};
        if ((rc = new_report(job, c.file, s.name, out, &err)) == DRAGARC_OK)
            rc = dragarc_report_fly(*out, c.file, &s, &f, &sampled, &o.display, &po, &err);
        if (rc != DRAGARC_OK) {
            err.field[0] = '\0';
            st = cli_report("report", &err);
        } else {
            dragarc_report_set_date(*out, job->date);
        }
    }
    dragarc_flight_clear(&sampled);
    dragarc_flight_clear(&f);
    dragarc_scenario_clear(&s);
    return rc == DRAGARC_OK ? EXIT_OK : st;
}

/* The library's error from filling the report, printed; the exit status. */
static int fill_failed(dragarc_error *err)
{
    err->field[0] = '\0';
    return cli_report("report", err);
}

static int kind_aim(const report_job *job, dragarc_report **out)
{
    dragarc_aim_request req;
    dragarc_aim_request_default(&req);
    cli_common c = {0};
    int st, have_range = 0;
    for (int i = 1; i < job->argc; i++) {
        if ((st = cli_aim_option("report", job->argc, job->argv, &i, &req, &have_range)) > 0)
            return st;
        if (st < 0 && (st = other_argument(job, &i, &c)) != 0)
            return st;
    }
    dragarc_display d;
    dragarc_scenario s;
    dragarc_aim_result a;
    if ((st = cli_aim_load("report", &c, &req, have_range, &d, &s, &a)) != 0)
        return st;
    dragarc_error err;
    int rc = new_report(job, c.file, s.name, out, &err);
    if (rc == DRAGARC_OK)
        rc = dragarc_report_aim(*out, c.file, &s, &req, &a, &d, &err);
    st = rc == DRAGARC_OK ? EXIT_OK : fill_failed(&err);
    if (st == EXIT_OK)
        dragarc_report_set_date(*out, job->date);
    dragarc_scenario_clear(&s);
    return st;
}

/* The scenario file of a kind that takes no options but --quiet (quiet: NULL when it takes none). */
static int spray_arguments(const report_job *job, int *quiet, const char **file)
{
    cli_common c = {0};
    int st;
    for (int i = 1; i < job->argc; i++) {
        if (quiet && strcmp(job->argv[i], "--quiet") == 0)
            *quiet = 1;
        else if ((st = other_argument(job, &i, &c)) != 0)
            return st;
    }
    if (!c.file || !*c.file)
        return cli_usage_error("report", "needs a scenario file");
    *file = c.file;
    return 0;
}

static int kind_sprinkler(const report_job *job, dragarc_report **out)
{
    const char *path = NULL;
    int quiet = 0, st = spray_arguments(job, &quiet, &path);
    if (st != 0)
        return st;
    dragarc_sprinkler_spec spec;
    dragarc_spectrum_class *classes;
    dragarc_sprinkler_result r;
    dragarc_error err;
    if ((st = cli_sprinkler_load(path, quiet, &spec, &classes, &r)) == EXIT_OK) {
        if (new_report(job, path, spec.base.name, out, &err) != DRAGARC_OK ||
            dragarc_report_sprinkler(*out, path, &spec, classes, &r, &err) != DRAGARC_OK)
            st = fill_failed(&err);
        else
            dragarc_report_set_date(*out, job->date);
    }
    dragarc_sprinkler_clear(&r);
    free(classes);
    dragarc_sprinkler_spec_clear(&spec);
    return st;
}

static int kind_drift(const report_job *job, dragarc_report **out)
{
    const char *path = NULL;
    int st = spray_arguments(job, NULL, &path);
    if (st != 0)
        return st;
    dragarc_drift_spec spec;
    dragarc_spectrum_class *classes;
    dragarc_drift_result r;
    dragarc_error err;
    if ((st = cli_drift_load(path, &spec, &classes, &r)) == EXIT_OK) {
        if (new_report(job, path, spec.base.name, out, &err) != DRAGARC_OK ||
            dragarc_report_drift(*out, path, &spec, classes, &r, &err) != DRAGARC_OK)
            st = fill_failed(&err);
        else
            dragarc_report_set_date(*out, job->date);
    }
    dragarc_drift_clear(&r);
    free(classes);
    dragarc_drift_spec_clear(&spec);
    return st;
}

static int kind_footprint(const report_job *job, dragarc_report **out)
{
    cli_common c = {0};
    int quiet = 0, st;
    double samples = -1.0, seed = -1.0;
    for (int i = 1; i < job->argc; i++) {
        const char *a = job->argv[i];
        const char *next = i + 1 < job->argc ? job->argv[i + 1] : NULL;
        if (strcmp(a, "--quiet") == 0) {
            quiet = 1;
        } else if (strcmp(a, "--samples") == 0) {
            if ((st = cli_count_argument("report", a, next, 1, DRAGARC_FOOTPRINT_MAX_SAMPLES, &samples)) != 0)
                return st;
            i++;
        } else if (strcmp(a, "--seed") == 0) {
            if ((st = cli_count_argument("report", a, next, 0, 9007199254740992.0, &seed)) != 0)
                return st;
            i++;
        } else if ((st = other_argument(job, &i, &c)) != 0) {
            return st;
        }
    }
    if (!c.file || !*c.file)
        return cli_usage_error("report", "needs a scenario file");
    dragarc_footprint_spec spec;
    dragarc_population pop;
    dragarc_footprint_summary sum;
    dragarc_impact *im = NULL;
    dragarc_error err;
    if ((st = cli_footprint_load(c.file, samples, seed, quiet, &spec, &pop, &im, &sum)) == EXIT_OK) {
        if (new_report(job, c.file, spec.base.name, out, &err) != DRAGARC_OK ||
            dragarc_report_footprint(*out, c.file, &spec, im, &sum, &err) != DRAGARC_OK)
            st = fill_failed(&err);
        else
            dragarc_report_set_date(*out, job->date);
    }
    dragarc_footprint_summary_clear(&sum);
    dragarc_population_clear(&pop);
    free(im);
    dragarc_footprint_spec_clear(&spec);
    return st;
}

/* The fit report: `dragarc fit`'s work with the track given by --track. A fit whose iterations ran out is reported
 * (its warning first among the results) and the exit status is then 1, as `fit` gives. */
static int kind_fit(const report_job *job, dragarc_report **out)
{
    cli_common c = {0};
    const char *track_file = NULL, *estimate = NULL;
    dragarc_fit_options o;
    dragarc_fit_options_default(&o);
    int st;
    for (int i = 1; i < job->argc; i++) {
        if (strcmp(job->argv[i], "--track") == 0) {
            if (++i >= job->argc || !*job->argv[i])
                return cli_usage_error("report", "--track needs the track file (CSV)");
            if (track_file)
                return cli_usage_error("report", "only one --track, got '%s' and '%s'", track_file, job->argv[i]);
            track_file = job->argv[i];
        } else if ((st = cli_fit_option("report", job->argc, job->argv, &i, &o, &estimate)) > 0) {
            return st;
        } else if (st < 0 && (st = other_argument(job, &i, &c)) != 0) {
            return st;
        }
    }
    if (!c.file || !*c.file)
        return cli_usage_error("report", "needs a scenario file");
    if (!track_file)
        return cli_usage_error("report", "the fit report needs --track TRACK.csv, the measured track");
    if (strcmp(c.file, "-") == 0 && strcmp(track_file, "-") == 0)
        return cli_usage_error("report", "the scenario and the track cannot both come from standard input");
    dragarc_scenario s, fitted;
    dragarc_track track;
    dragarc_fit_result r;
    dragarc_error err;
    if ((st = cli_fit_load("report", c.file, track_file, estimate, &o, &s, &track, &r, &fitted)) == EXIT_OK) {
        if (new_report(job, c.file, s.name, out, &err) != DRAGARC_OK ||
            dragarc_report_fit(*out, c.file, track_file, &s, &o, &track, &r, &fitted, &err) != DRAGARC_OK) {
            st = fill_failed(&err);
        } else {
            dragarc_report_set_date(*out, job->date);
            if (!r.converged)
                *job->written_status = EXIT_NO_SOLUTION;
        }
    }
    dragarc_scenario_clear(&fitted);
    dragarc_fit_result_clear(&r);
    dragarc_track_clear(&track);
    dragarc_scenario_clear(&s);
    return st;
}

/* SOURCE_DATE_EPOCH when set (a whole number of seconds), else now. 0, or the exit status of the error printed. */
/* A file name ending in .html or .htm (any case), or "-". */
static int html_name(const char *path)
{
    const char *dot = strrchr(path, '.');
    return strcmp(path, "-") == 0 ||
           (dot && !strchr(dot, '/') && dot > path && dot[-1] != '/' &&
            (strcasecmp(dot, ".html") == 0 || strcasecmp(dot, ".htm") == 0));
}

int cmd_report(int argc, char **argv)
{
    const char *output = NULL, *command = NULL;
    /* the kind's arguments: everything but -o and --command, in order */
    char **rest = calloc((size_t)argc + 1, sizeof *rest);
    if (!rest) {
        fputs("dragarc: report: out of memory\n", stderr);
        return EXIT_FAILED;
    }
    int nrest = 0, st = -1;
    rest[nrest++] = argv[0];
    for (int i = 1; i < argc && st < 0; i++) {
        const char *a = argv[i];
        if (cli_help_asked(a, HELP)) {
            st = EXIT_OK;
        } else if (strcmp(a, "-o") == 0 || strcmp(a, "--output") == 0) {
            if (++i >= argc || !*argv[i])
                st = cli_usage_error("report", "%s needs a file name ending in .html", a);
            else if (output)
                st = cli_usage_error("report", "only one output file, got '%s' and '%s'", output, argv[i]);
            else
                output = argv[i];
        } else if (strcmp(a, "--command") == 0) {
            if (++i >= argc || !*argv[i])
                st = cli_usage_error("report", "--command needs a kind of report");
            else
                command = argv[i];
        } else {
            rest[nrest++] = argv[i];
        }
    }
    char kinds[256];
    list_kinds(kinds, sizeof kinds);
    const report_kind *kind = command ? kind_named(command) : &KINDS[0];
    if (st < 0 && !kind)
        st = cli_usage_error("report", "--command '%s' has no report yet; available: %s", command, kinds);
    if (st < 0 && !output)
        st = cli_usage_error("report", "needs the output file: -o FILE.html");
    if (st < 0 && !html_name(output))
        st = cli_usage_error("report", "-o '%s': the report is HTML, name it FILE.html", output);
    int written_status = EXIT_OK;
    report_job job = {.kind = kind, .argc = nrest, .argv = rest, .written_status = &written_status};
    if (st < 0 && cli_report_date("report", &job.date) != 0)
        st = EXIT_BAD_INPUT;
    if (st >= 0) {
        free(rest);
        return st;
    }

    /* the scratch folder: $TMPDIR, else the output's own folder */
    char scratch[4096];
    const char *tmp = getenv("TMPDIR");
    const char *slash = strrchr(output, '/');
    if (tmp && *tmp)
        snprintf(scratch, sizeof scratch, "%s", tmp);
    else if (slash && strcmp(output, "-") != 0)
        snprintf(scratch, sizeof scratch, "%.*s", (int)(slash - output) > 0 ? (int)(slash - output) : 1, output);
    else
        snprintf(scratch, sizeof scratch, ".");
    job.scratch = scratch;

    dragarc_report *r = NULL;
    dragarc_error err;
    st = kind->run(&job, &r);
    if (st == EXIT_OK && (st = dragarc_report_write_html(r, output, &err)) != DRAGARC_OK) {
        err.field[0] = '\0';
        st = cli_report("-o", &err);
    }
    if (st == EXIT_OK)
        st = written_status;
    dragarc_report_free(r);
    free(rest);
    return st;
}
