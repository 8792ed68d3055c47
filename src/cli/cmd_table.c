/* cmd_table.c: `dragarc table SCENARIO --vary NAME=START:STOP:STEP [--vary ...] [--csv | --json |
 * --markdown] [-o FILE] [--plot FILE [--plot-column NAME]] [--quiet]`: one flight per combination of the varied
 * values, as a table (or an aim table with --ranges).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"
#include "cli/cli_mpi.h"
#include "dragarc/aim.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"
#include "dragarc/sweep.h"

#define WIDTH 100 /* columns of the human table's wrapped text */

static const char HELP_HEAD[] =
    "usage: dragarc table SCENARIO --vary NAME=START:STOP:STEP [--vary ...] [--csv | --json | --markdown]\n"
    "                     [-o FILE] [--plot FILE.svg|png|pdf [--plot-column NAME]] [--quiet]\n"
    "       dragarc table SCENARIO --ranges START:STOP:STEP [--height METRES] [--csv | --json | --markdown]\n"
    "                     [-o FILE] [--plot FILE.svg|png|pdf]\n"
    "\n"
    "Fly the scenario file SCENARIO once for every combination of the varied parameters' values and print\n"
    "one row per flight: the values, range, crossrange, time of flight, apex height, impact speed, angle\n"
    "and energy, then the cautions. Up to 3 parameters, 100000 values each, 1000000 rows. Rows are flown\n"
    "in parallel (OMP_NUM_THREADS threads); the numbers do not depend on the number of threads.\n"
    "\n"
    "  --vary NAME=START:STOP:STEP  values START, START+STEP, ... up to STOP (included), in the unit below\n"
    "                       or each with a unit of its own (\"speed=60 mph:100 mph:10 mph\", docs/units.md);\n"
    "                       the first --vary varies slowest\n"
    "  --csv                CSV: a header row with the units in the column names, every number exact;\n"
    "                       data only, so no cautions\n"
    "  --json               one JSON object: varied, rows, units and cautions\n"
    "  --markdown           a Markdown table with the cautions\n"
    "  -o, --output FILE    write to FILE, whole or not at all, instead of standard output\n"
    "  --plot FILE          also draw the range against the first --vary parameter, one curve per value of\n"
    "                       the second (at most 9; no third), into FILE, an .svg, .png or .pdf file; for an\n"
    "                       aim table, the low and high elevations against the range (docs/plots.md)\n"
    "  --plot-column NAME   draw this column instead of the range: downrange, crossrange, time_of_flight,\n"
    "                       apex_height, impact_speed, impact_angle, impact_energy or terminal_speed\n"
    "  --quiet              no progress bar (it shows on stderr, only when that is a terminal)\n"
    "  --ranges START:STOP:STEP  an aim table instead: for each target range (m, or with a unit) along\n"
    "                       the launch azimuth, the low and high elevations at the scenario's speed that\n"
    "                       land on it, with the azimuth turned for the wind (see 'dragarc aim'); at most\n"
    "                       10000 ranges\n"
    "  --height METRES      the aim table's target plane above the site datum (default: the ground)\n"
    "  --units si|us        the units of the table: SI (default) or US customary (ft, mph, ft.lbf)\n"
    "  --unit KEY=UNIT      a quantity (length=yd) or a column (range=yd) in a unit of its own; repeatable\n"
    "  -h, --help           this help\n"
    "\n"
    "parameters (short name, scenario key path, unit):\n";

static const char HELP_TAIL[] =
    "\n"
    "A new diameter scales area and volume (and a mass given as density); see docs/table.md.\n"
    "A row whose flight fails (a value out of range, no impact, ...) stays in the table with its reason.\n"
    "exit status: 0 every row flew, 1 (aim table) a range is out of reach, 2 bad usage, scenario or --vary,\n"
    "3 a row or the computation failed (the table is still written).\n"
    "Under MPI (a build with DRAGARC_MPI, 'mpirun -n P'), the rows of --vary are shared among the processes,\n"
    "with the same results (docs/cluster.md).\n";

static void print_help(void)
{
    fputs(HELP_HEAD, stdout);
    cli_print_params(stdout);
    fputs(HELP_TAIL, stdout);
}

/* ---- the human table ------------------------------------------------------------------------------ */

/* The columns it shows; downrange and terminal speed are left to the other formats for width. */
static const dragarc_sweep_column SHOWN[] = {DRAGARC_SWEEP_RANGE,         DRAGARC_SWEEP_CROSSRANGE,
                                             DRAGARC_SWEEP_TIME_OF_FLIGHT, DRAGARC_SWEEP_APEX_HEIGHT,
                                             DRAGARC_SWEEP_IMPACT_SPEED,   DRAGARC_SWEEP_IMPACT_ANGLE,
                                             DRAGARC_SWEEP_IMPACT_ENERGY};
enum { NSHOWN = sizeof SHOWN / sizeof SHOWN[0] };

static int max_int(int a, int b) { return a > b ? a : b; }

static int print_human(FILE *fp, const dragarc_sweep *t, const dragarc_display *d)
{
    int decimals[NSHOWN], wv[DRAGARC_SWEEP_MAX_AXES], wr[NSHOWN];
    char cell[64];
    for (size_t k = 0; k < t->naxes; k++)
        wv[k] = max_int((int)strlen(t->axes[k].param->alias),
                        (int)strlen(dragarc_unit_abbrev(dragarc_sweep_axis_unit(d, &t->axes[k]))));
    for (int c = 0; c < NSHOWN; c++) {
        const dragarc_sweep_column_info *about = dragarc_sweep_column_about(SHOWN[c]);
        decimals[c] = dragarc_sweep_column_decimals(t, SHOWN[c], d);
        wr[c] = max_int((int)strlen(about->brief), (int)strlen(dragarc_unit_abbrev(dragarc_sweep_column_unit(d, SHOWN[c]))));
    }
    for (size_t i = 0; i < t->nrows; i++) {
        const dragarc_sweep_row *r = &t->rows[i];
        for (size_t k = 0; k < t->naxes; k++) {
            dragarc_number_format(cell, sizeof cell, dragarc_sweep_axis_shown(d, &t->axes[k], r->values[k]));
            wv[k] = max_int(wv[k], (int)strlen(cell));
        }
        for (int c = 0; r->status == DRAGARC_OK && c < NSHOWN; c++) {
            dragarc_sweep_cell_format(cell, sizeof cell, r, SHOWN[c], decimals[c], d);
            wr[c] = max_int(wr[c], (int)strlen(cell));
        }
    }

    char text[sizeof(dragarc_error)], lead[256];
    fprintf(fp, "dragarc table%s%s\n", t->scenario[0] ? ": " : "", t->scenario);
    int walias = 0;
    for (size_t k = 0; k < t->naxes; k++)
        walias = max_int(walias, (int)strlen(t->axes[k].param->alias));
    for (size_t k = 0; k < t->naxes; k++) {
        dragarc_sweep_axis_describe(text, sizeof text, &t->axes[k], d);
        fprintf(fp, "  %-*s  %s %s (%zu values)\n", walias, t->axes[k].param->alias, t->axes[k].param->path, text,
                t->axes[k].count);
    }
    fprintf(fp, "  %zu rows, %zu failed\n\n", t->nrows, t->nfailed);
    for (int line = 0; line < 2; line++) {
        for (size_t k = 0; k < t->naxes; k++)
            fprintf(fp, "  %*s", wv[k],
                    line ? dragarc_unit_abbrev(dragarc_sweep_axis_unit(d, &t->axes[k])) : t->axes[k].param->alias);
        for (int c = 0; c < NSHOWN; c++) {
            const dragarc_sweep_column_info *about = dragarc_sweep_column_about(SHOWN[c]);
            fprintf(fp, "  %*s", wr[c], line ? dragarc_unit_abbrev(dragarc_sweep_column_unit(d, SHOWN[c])) : about->brief);
        }
        fputc('\n', fp);
    }
    for (size_t i = 0; i < t->nrows; i++) {
        const dragarc_sweep_row *r = &t->rows[i];
        size_t len = 0;
        for (size_t k = 0; k < t->naxes; k++) {
            dragarc_number_format(cell, sizeof cell, dragarc_sweep_axis_shown(d, &t->axes[k], r->values[k]));
            int n = snprintf(lead + len, sizeof lead - len, "  %*s", wv[k], cell);
            len += n > 0 && (size_t)n < sizeof lead - len ? (size_t)n : 0;
        }
        if (r->status != DRAGARC_OK) {
            /* the reason in place of the results, wrapped under them */
            dragarc_sweep_row_message(r, text, sizeof text);
            snprintf(lead + len, sizeof lead - len, "  failed: ");
            dragarc_text_wrap(fp, lead, (int)len + 2, WIDTH, text);
            continue;
        }
        fputs(lead, fp);
        for (int c = 0; c < NSHOWN; c++) {
            dragarc_sweep_cell_format(cell, sizeof cell, r, SHOWN[c], decimals[c], d);
            fprintf(fp, "  %*s", wr[c], cell);
        }
        fputc('\n', fp);
    }
    dragarc_cautions_print(fp, t->notes, WIDTH);
    fputs("Downrange, terminal speed and every digit: --csv or --json.\n", fp);
    return ferror(fp) ? -1 : 0;
}

/* ---- the command ---------------------------------------------------------------------------------- */

typedef enum { FORMAT_TEXT, FORMAT_CSV, FORMAT_JSON, FORMAT_MARKDOWN } table_format;

static int write_table(FILE *fp, table_format format, const dragarc_sweep *t, const dragarc_display *d,
                       dragarc_error *err)
{
    switch (format) {
    case FORMAT_CSV: return dragarc_sweep_write_csv(fp, t, d, err);
    case FORMAT_JSON: return dragarc_sweep_write_json(fp, t, d, err);
    case FORMAT_MARKDOWN: return dragarc_sweep_write_markdown(fp, t, d, err);
    default:
        if (print_human(fp, t, d) != 0)
            return dragarc_error_set(err, DRAGARC_EIO, "", "write failed");
        return DRAGARC_OK;
    }
}

/* "START:STOP:STEP", each a value of quantity q (a number, or a number with a unit), into v[3]. 0 on success;
 * -1 when malformed, with why naming a unit problem (empty when a part is no number). */
static int parse_triple(const char *spec, dragarc_quantity q, double v[3], char *why, size_t n)
{
    why[0] = '\0';
    const char *p = spec;
    for (int k = 0; k < 3; k++) {
        const char *colon = k < 2 ? strchr(p, ':') : NULL;
        if (k < 2 && !colon)
            return -1;
        size_t len = colon ? (size_t)(colon - p) : strlen(p);
        char part[128];
        if (len == 0 || len >= sizeof part || (k == 2 && strchr(p, ':')))
            return -1;
        memcpy(part, p, len);
        part[len] = '\0';
        if (cli_parse_value(part, q, &v[k], why, n) != 0)
            return -1;
        p = colon ? colon + 1 : p + len;
    }
    return 0;
}

/* "START:STOP:STEP" into at most `max` target ranges; returns how many, or 0 when malformed (why says why
 * when it is a unit). */
static size_t parse_ranges(const char *spec, double *out, size_t max, char *why, size_t nwhy)
{
    double v[3];
    if (parse_triple(spec, DRAGARC_Q_LENGTH, v, why, nwhy) != 0)
        return 0;
    if (!(v[2] > 0.0) || v[1] < v[0])
        return 0;
    size_t n = 0;
    while (v[0] + (double)n * v[2] <= v[1] + 1e-9 * v[2]) {
        if (n == max)
            return 0; /* too many */
        out[n] = v[0] + (double)n * v[2];
        n++;
    }
    return n;
}

/* --vary NAME=START:STOP:STEP where the values may carry units of the parameter's quantity. 0 on success;
 * otherwise the exit status of the usage error printed. */
static int parse_vary(const char *spec, dragarc_sweep_axis *axis)
{
    dragarc_error err;
    if (dragarc_sweep_axis_parse(axis, spec, &err) == DRAGARC_OK)
        return 0;
    const char *eq = strchr(spec, '=');
    char name[64];
    size_t nlen = eq ? (size_t)(eq - spec) : 0;
    const dragarc_scenario_param *p = NULL;
    if (eq && nlen > 0 && nlen < sizeof name) {
        memcpy(name, spec, nlen);
        name[nlen] = '\0';
        p = dragarc_scenario_param_find(name);
    }
    double v[3];
    char why[256];
    if (p && parse_triple(eq + 1, p->quantity, v, why, sizeof why) == 0) {
        if (dragarc_sweep_axis_init(axis, p->path, v[0], v[1], v[2], &err) == DRAGARC_OK)
            return 0;
    } else if (p && why[0]) {
        return cli_usage_error("table", "--vary %s: %s: %s", spec, p->path, why);
    }
    return cli_usage_error("table", "--vary %s: %s%s%s", spec, err.field, err.field[0] ? ": " : "", err.message);
}

/* What --plot draws of a table of flights: the column named (default: the range), against at most two varied
 * parameters with at most DRAGARC_PLOT_MAX_CURVES values on the second. 0, or the exit status of the usage error. */
static int plot_choice(const char *name, const dragarc_sweep_axis *axes, size_t naxes, dragarc_sweep_column *column)
{
    if (naxes > 2)
        return cli_usage_error("table", "--plot draws one or two --vary parameters (the first along the axis, one "
                                        "curve per value of the second), not %zu",
                               naxes);
    if (naxes == 2 && axes[1].count > DRAGARC_PLOT_MAX_CURVES)
        return cli_usage_error("table", "--plot draws one curve per value of the second --vary, at most %d: %s has %zu "
                                        "(swap the two --vary, or take a larger step)",
                               DRAGARC_PLOT_MAX_CURVES, axes[1].param->alias, axes[1].count);
    if (!name)
        return 0;
    for (int c = 0; c < DRAGARC_SWEEP_NCOLUMNS; c++)
        if (strcmp(name, dragarc_sweep_column_about((dragarc_sweep_column)c)->key) == 0) {
            *column = (dragarc_sweep_column)c;
            return 0;
        }
    char known[256] = "";
    for (int c = 0; c < DRAGARC_SWEEP_NCOLUMNS; c++) {
        size_t len = strlen(known);
        snprintf(known + len, sizeof known - len, "%s%s", c == 0 ? "" : c + 1 < DRAGARC_SWEEP_NCOLUMNS ? ", " : " or ",
                 dragarc_sweep_column_about((dragarc_sweep_column)c)->key);
    }
    return cli_usage_error("table", "--plot-column: no column '%s'; choose %s", name, known);
}

#define MAX_RANGES 10000

static int aim_table(const char *file, const char *spec, double height, table_format format, const char *output,
                     const char *plot, const dragarc_display *d)
{
    static double ranges[MAX_RANGES];
    char why[256];
    size_t n = parse_ranges(spec, ranges, MAX_RANGES, why, sizeof why);
    if (n == 0 && why[0])
        return cli_usage_error("table", "--ranges %s", why);
    if (n == 0)
        return cli_usage_error("table", "--ranges needs START:STOP:STEP with 0 < START <= STOP, STEP > 0 and at most "
                                        "%d values, not '%s'",
                               MAX_RANGES, spec);
    dragarc_scenario s;
    dragarc_error err;
    if (dragarc_scenario_read(file, cli_profile_path(), &s, &err) != DRAGARC_OK)
        return cli_report(file, &err);
    dragarc_aim_request req;
    dragarc_aim_request_default(&req);
    req.height = height;
    dragarc_aim_table_row *rows = malloc(n * sizeof *rows);
    if (!rows) {
        dragarc_scenario_clear(&s);
        fputs("dragarc: table: out of memory\n", stderr);
        return EXIT_FAILED;
    }
    int rc = dragarc_aim_table(&s, &req, ranges, n, rows, &err);
    double plane = isnan(height) ? s.ground_elevation : height;
    if (rc != DRAGARC_OK) {
        free(rows);
        dragarc_scenario_clear(&s);
        return cli_report(file, &err);
    }
    /* The picture first: when it cannot be drawn, the table is not written either. */
    if (plot && (rc = dragarc_aim_table_plot(plot, s.name, rows, n, d, &err)) != DRAGARC_OK) {
        free(rows);
        dragarc_scenario_clear(&s);
        return cli_plot_failed(&err);
    }
    static const dragarc_table_format FORMS[] = {DRAGARC_TABLE_TEXT, DRAGARC_TABLE_CSV, DRAGARC_TABLE_JSON,
                                                 DRAGARC_TABLE_MARKDOWN};
    dragarc_output out;
    rc = dragarc_output_open(&out, output ? output : "-", &err);
    if (rc == DRAGARC_OK) {
        rc = dragarc_aim_table_write(out.fp, FORMS[format], s.name, plane, rows, n, d, &err);
        if (rc == DRAGARC_OK)
            rc = dragarc_output_commit(&out, &err);
        else
            dragarc_output_abort(&out);
    }
    dragarc_scenario_clear(&s);
    if (rc != DRAGARC_OK) {
        free(rows);
        err.field[0] = '\0';
        return cli_report(output ? "-o" : "table", &err);
    }
    size_t unreachable = 0, failed = 0, first = n;
    for (size_t i = 0; i < n; i++) {
        if (rows[i].status == DRAGARC_OK)
            continue;
        if (first == n)
            first = i;
        if (rows[i].status == DRAGARC_ENOSOLUTION)
            unreachable++;
        else
            failed++;
    }
    int status = EXIT_OK;
    if (first < n) {
        fprintf(stderr, "dragarc: %s: %zu of %zu ranges out of reach, %zu failed (first, %g m: %s)\n", file, unreachable,
                n, failed, rows[first].range, rows[first].message);
        status = failed ? EXIT_FAILED : EXIT_NO_SOLUTION;
    }
    free(rows);
    return status;
}

static int out_of_memory(const char *file)
{
    dragarc_error err;
    dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory for the table's rows");
    return cli_report(file, &err);
}

/* Fly the table of the scenario at `file` over axes (nrows rows) into *t, with a progress bar unless quiet. Under MPI
 * each process flies its share of the rows (every P-th) and rank 0 puts them back in row order into *t, with the
 * errors of the failed ones (the other processes' *t stays empty). Returns the exit status (message printed); the
 * caller clears *t. */
static int sweep_rows(const char *file, const dragarc_sweep_axis *axes, size_t naxes, size_t nrows, int quiet,
                      dragarc_sweep *t)
{
    /* a failed row's error, sent apart from the rows (whose error pointers mean nothing on rank 0) */
    typedef struct row_error {
        size_t row;
        int present;
        dragarc_error e;
    } row_error;
    dragarc_error err;
    const int root = cli_mpi_rank() == 0, alone = cli_mpi_size() == 1;
    size_t first, step, count;
    cli_mpi_share(nrows, &first, &step, &count);
    memset(t, 0, sizeof *t);
    const double share = dragarc_sweep_memory_estimate(count);
    const double need = dragarc_sweep_memory_estimate(nrows) + (root && !alone ? share : 0.0);
    dragarc_sweep_row *mine = NULL; /* this process's share, when it is not flown in place */
    int moved = 0;                  /* rank 0's share (and its errors) now lives in t */
    dragarc_scenario s;
    int have_s = 0, status = cli_memory_check("table", "--vary", root ? need : share);
    if (status == EXIT_OK && dragarc_scenario_read(file, cli_profile_path(), &s, &err) != DRAGARC_OK)
        status = cli_report(file, &err);
    else if (status == EXIT_OK)
        have_s = 1;
    if (status == EXIT_OK && root && dragarc_sweep_init(&s, axes, naxes, t, &err) != DRAGARC_OK)
        status = cli_report(file, &err);
    else if (status == EXIT_OK && !alone && !(mine = calloc(count + 1, sizeof *mine)))
        status = out_of_memory(file);
    /* Each agreement below is reached by every process or by none: statuses are agreed before any gathering. */
    if ((status = cli_mpi_agree(status)) == EXIT_OK) {
        cli_progress bar;
        cli_progress_begin(&bar, "rows", quiet || !root);
        cli_progress_plan(&bar, need);
        cli_progress_share(&bar, nrows, cli_mpi_size());
        int rc = dragarc_sweep_run_range(&s, axes, naxes, first, nrows, step, alone ? t->rows : mine,
                                         bar.enabled ? cli_progress_tick : NULL, &bar, &err);
        if (rc == DRAGARC_OK && cli_mpi_test_fault())
            rc = dragarc_error_set(&err, DRAGARC_ESOLVER, "", "a failure made on purpose (DRAGARC_MPI_TEST_FAULT)");
        if (rc != DRAGARC_OK)
            status = cli_report(file, &err);
        cli_progress_end(&bar);
        status = cli_mpi_agree(status);
    }
    row_error *lost = NULL, *found = NULL;
    size_t nlost = 0, nfound = 0;
    if (status == EXIT_OK && !alone) {
        for (size_t i = 0; !root && i < count; i++)
            nlost += mine[i].status != DRAGARC_OK;
        if (nlost && !(lost = calloc(nlost, sizeof *lost)))
            status = out_of_memory(file);
        for (size_t i = 0, k = 0; lost && i < count; i++)
            if (mine[i].status != DRAGARC_OK) {
                lost[k].row = first + i * step;
                lost[k].present = mine[i].error != NULL;
                if (mine[i].error)
                    lost[k].e = *mine[i].error;
                k++;
            }
        if ((status = cli_mpi_agree(status)) == EXIT_OK &&
            (status = cli_mpi_gather(root ? t->rows : NULL, mine, sizeof *mine, nrows)) == EXIT_OK) {
            moved = root;
            for (size_t r = 0; root && r < nrows; r++) /* the rows of the others: their errors come next */
                if (r % step != 0)
                    t->rows[r].error = NULL;
            status = cli_mpi_gather_any(lost, nlost, sizeof *lost, (void **)&found, &nfound);
        }
    }
    if (status == EXIT_OK && root) {
        for (size_t k = 0; k < nfound; k++) {
            dragarc_sweep_row *row = &t->rows[found[k].row < nrows ? found[k].row : 0];
            if (found[k].present && found[k].row < nrows && (row->error = malloc(sizeof *row->error)))
                *row->error = found[k].e;
        }
        dragarc_sweep_tally(t);
    }
    for (size_t i = 0; mine && !moved && i < count; i++)
        free(mine[i].error);
    free(mine), free(lost), free(found);
    if (have_s)
        dragarc_scenario_clear(&s);
    return status;
}

int cmd_table(int argc, char **argv)
{
    const char *output = NULL, *format_option = NULL, *ranges = NULL, *plot = NULL, *plot_column = NULL;
    int quiet = 0;
    cli_common c = {0};
    int st;
    double height = NAN;
    table_format format = FORMAT_TEXT;
    dragarc_sweep_axis axes[DRAGARC_SWEEP_MAX_AXES];
    size_t naxes = 0;
    dragarc_error err;
    for (int i = 1; i < argc; i++) {
        const char *a = argv[i];
        table_format f = FORMAT_TEXT;
        if (strcmp(a, "-h") == 0 || strcmp(a, "--help") == 0) {
            print_help();
            return EXIT_OK;
        } else if (strcmp(a, "--vary") == 0) {
            if (++i >= argc)
                return cli_usage_error("table", "--vary needs NAME=START:STOP:STEP");
            if (naxes == DRAGARC_SWEEP_MAX_AXES)
                return cli_usage_error("table", "at most %d --vary options", DRAGARC_SWEEP_MAX_AXES);
            st = parse_vary(argv[i], &axes[naxes]);
            if (st != 0)
                return st;
            naxes++;
        } else if (strcmp(a, "--csv") == 0 || strcmp(a, "--json") == 0 || strcmp(a, "--markdown") == 0) {
            f = a[2] == 'c' ? FORMAT_CSV : a[2] == 'j' ? FORMAT_JSON : FORMAT_MARKDOWN;
            if (format_option && f != format)
                return cli_usage_error("table", "%s and %s: choose one output format", format_option, a);
            format = f;
            format_option = a;
        } else if ((st = cli_plot_option("table", argc, argv, &i, &plot)) >= 0) {
            if (st != 0)
                return st;
        } else if (strcmp(a, "--plot-column") == 0) {
            if (++i >= argc || !*argv[i])
                return cli_usage_error("table", "--plot-column needs a column name (range, impact_speed, ...)");
            plot_column = argv[i];
        } else if (strcmp(a, "--quiet") == 0) {
            quiet = 1;
        } else if (strcmp(a, "--ranges") == 0) {
            if (++i >= argc)
                return cli_usage_error("table", "--ranges needs START:STOP:STEP");
            ranges = argv[i];
        } else if (strcmp(a, "--height") == 0) {
            char why[256];
            if (++i >= argc || cli_parse_value(argv[i], DRAGARC_Q_LENGTH, &height, why, sizeof why) != 0)
                return i < argc && why[0] ? cli_usage_error("table", "--height %s", why)
                                          : cli_usage_error("table", "--height needs a number of metres");
        } else if (strcmp(a, "-o") == 0 || strcmp(a, "--output") == 0) {
            if (++i >= argc || !*argv[i])
                return cli_usage_error("table", "%s needs a file name", a);
            if (output)
                return cli_usage_error("table", "only one output file, got '%s' and '%s'", output, argv[i]);
            output = argv[i];
        } else if ((st = cli_common_argument("table", argc, argv, &i, &c)) != 0) {
            return st;
        }
    }
    const char *file = c.file;
    if (!file || !*file)
        return cli_usage_error("table", "needs a scenario file");
    if (ranges && naxes > 0)
        return cli_usage_error("table", "--ranges makes an aim table and --vary a table of flights: choose one");
    if (!isnan(height) && !ranges)
        return cli_usage_error("table", "--height sets the aim table's target plane; give --ranges too");
    if (plot_column && !plot)
        return cli_usage_error("table", "--plot-column chooses what --plot draws; give --plot FILE too");
    if (plot_column && ranges)
        return cli_usage_error("table", "--plot-column is for a table of flights: an aim table's plot shows the elevations");
    if (plot && output && strcmp(plot, output) == 0)
        return cli_usage_error("table", "--plot and %s name the same file '%s'", "-o", plot);
    dragarc_display d;
    if ((st = cli_display_options("table", c.system, c.specs, c.nspecs, &d)) != 0)
        return st;
    const dragarc_display *dp = c.system || c.nspecs ? &d : NULL; /* NULL: SI, as the library names it */
    if (ranges) /* an aim table is not shared among MPI processes: rank 0 makes it alone */
        return cli_mpi_rank() == 0 ? aim_table(file, ranges, height, format, output, plot, dp) : EXIT_OK;
    if (naxes == 0)
        return cli_usage_error("table", "needs at least one --vary NAME=START:STOP:STEP");
    size_t nrows;
    if (dragarc_sweep_axes_check(axes, naxes, &nrows, &err) != DRAGARC_OK)
        return cli_usage_error("table", "--vary: %s%s%s", err.field, err.field[0] ? ": " : "", err.message);
    dragarc_sweep_column column = DRAGARC_SWEEP_RANGE;
    if (plot && (st = plot_choice(plot_column, axes, naxes, &column)) != 0)
        return st;
    dragarc_sweep t;
    int rc = sweep_rows(file, axes, naxes, nrows, quiet, &t);
    if (rc != EXIT_OK || cli_mpi_rank() != 0) {
        dragarc_sweep_clear(&t);
        return rc; /* rank 0 alone has the whole table and writes it */
    }
    /* The picture first: when it cannot be drawn, the table is not written either. */
    if (plot && (rc = dragarc_sweep_plot(plot, &t, column, dp, NULL, &err)) != DRAGARC_OK) {
        dragarc_sweep_clear(&t);
        return cli_plot_failed(&err);
    }

    /* The table is complete before anything is written, so a failure leaves no file behind. */
    dragarc_output out;
    rc = dragarc_output_open(&out, output ? output : "-", &err);
    if (rc == DRAGARC_OK) {
        rc = write_table(out.fp, format, &t, dp, &err);
        if (rc == DRAGARC_OK)
            rc = dragarc_output_commit(&out, &err);
        else
            dragarc_output_abort(&out);
    }
    if (rc != DRAGARC_OK) {
        dragarc_sweep_clear(&t);
        err.field[0] = '\0';
        return cli_report(output ? "-o" : "table", &err);
    }
    int status = EXIT_OK;
    if (t.nfailed > 0) {
        size_t first = 0;
        while (t.rows[first].status == DRAGARC_OK)
            first++;
        char msg[sizeof(dragarc_error)];
        dragarc_sweep_row_message(&t.rows[first], msg, sizeof msg);
        fprintf(stderr, "dragarc: %s: %zu of %zu rows failed, the table says why (first, row %zu: %s)\n", file,
                t.nfailed, t.nrows, first + 1, msg);
        status = EXIT_FAILED;
    }
    dragarc_sweep_clear(&t);
    return status;
}
