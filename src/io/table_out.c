/* table_out.c: number formatting shared by the text outputs, and tables of flights as CSV, JSON and
 * Markdown (the forms are documented in docs/table.md).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * CSV and JSON numbers round-trip: the shortest of "%.10g" ... "%.17g" that strtod reads back to the
 * same double. Markdown rounds each column to one decimal point for reading. CSV (RFC 4180) stays pure
 * data, so it carries no cautions: a comment line would break readers that follow the RFC. JSON is
 * written as it goes rather than built as a cJSON tree, which for a million rows would take about a
 * gigabyte.
 */
#include <errno.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"

void dragarc_number_format(char *buf, size_t size, double v)
{
    if (size == 0)
        return;
    if (!isfinite(v)) {
        buf[0] = '\0'; /* never "nan" or "inf" */
        return;
    }
    for (int prec = 10; prec <= 17; prec++) {
        snprintf(buf, size, "%.*g", prec, v);
        if (strtod(buf, NULL) == v)
            break;
    }
}

int dragarc_number_decimals(const double *v, size_t n, int digits)
{
    double big = 0.0;
    int any = 0;
    for (size_t i = 0; i < n; i++)
        if (isfinite(v[i])) {
            big = fmax(big, fabs(v[i]));
            any = 1;
        }
    if (!any)
        return 0;
    int d = digits - 1 - (big > 0.0 ? (int)floor(log10(big)) : 0);
    return d < 0 ? 0 : d > 6 ? 6 : d;
}

/* The summary columns of every table, in order. */
enum { C_RANGE, C_DOWNRANGE, C_CROSSRANGE, C_TIME, C_APEX, C_IMPACT_SPEED, C_IMPACT_ANGLE, C_ENERGY, C_TERMINAL, C_COUNT };

static const struct {
    const char *key;   /* JSON key */
    const char *csv;   /* CSV column name, with the unit */
    const char *label; /* Markdown header */
    const char *unit;
} COLUMNS[C_COUNT] = {
    {"range", "range_m", "range (m)", "m"},
    {"downrange", "downrange_m", "downrange (m)", "m"},
    {"crossrange", "crossrange_m", "crossrange (m)", "m"},
    {"time_of_flight", "time_of_flight_s", "time of flight (s)", "s"},
    {"apex_height", "apex_height_m", "apex height (m)", "m"},
    {"impact_speed", "impact_speed_m_s", "impact speed (m/s)", "m/s"},
    {"impact_angle", "impact_angle_deg", "impact angle (deg)", "degree"},
    {"impact_energy", "impact_energy_J", "impact energy (J)", "J"},
    {"terminal_speed", "terminal_speed_m_s", "terminal speed (m/s)", "m/s"},
};

/* Column c of a row in the units of the outputs (degrees for the angle). */
static double column(const dragarc_sweep_row *r, int c)
{
    switch (c) {
    case C_RANGE: return r->range;
    case C_DOWNRANGE: return r->downrange;
    case C_CROSSRANGE: return r->crossrange;
    case C_TIME: return r->time_of_flight;
    case C_APEX: return r->apex_height;
    case C_IMPACT_SPEED: return r->impact_speed;
    case C_IMPACT_ANGLE: return r->impact_angle / DRAGARC_DEG;
    case C_ENERGY: return r->impact_energy;
    case C_TERMINAL: return r->terminal_speed;
    default: return NAN;
    }
}

/* "degree" -> "deg"; other units as they are. */
static const char *short_unit(const char *unit) { return strcmp(unit, "degree") == 0 ? "deg" : unit; }

/* A unit fit for a CSV column name: m/s -> m_s, m/s^2 -> m_s2, degree -> deg. */
static void csv_unit(char *buf, size_t size, const char *unit)
{
    const char *u = short_unit(unit);
    size_t k = 0;
    for (; *u && k + 1 < size; u++)
        if (*u != '^')
            buf[k++] = *u == '/' ? '_' : *u;
    buf[k] = '\0';
}

static int write_status(FILE *fp, dragarc_error *err)
{
    if (ferror(fp))
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed: %s", strerror(errno));
    return DRAGARC_OK;
}

static void put_num(FILE *fp, double v)
{
    char buf[40];
    dragarc_number_format(buf, sizeof buf, v);
    fputs(buf, fp);
}

static const char *status_word(const dragarc_sweep_row *r)
{
    return r->status == DRAGARC_OK ? "ok" : dragarc_status_name(r->status);
}

/* ---- CSV ------------------------------------------------------------------------------------------ */

/* A CSV field, quoted (with doubled quotes) when it holds a comma, a quote or a line break. */
static void csv_text(FILE *fp, const char *s)
{
    if (!strpbrk(s, ",\"\r\n")) {
        fputs(s, fp);
        return;
    }
    fputc('"', fp);
    for (; *s; s++) {
        if (*s == '"')
            fputc('"', fp);
        fputc(*s == '\r' || *s == '\n' ? ' ' : *s, fp);
    }
    fputc('"', fp);
}

int dragarc_sweep_write_csv(FILE *fp, const dragarc_sweep *t, dragarc_error *err)
{
    for (size_t k = 0; k < t->naxes; k++) {
        char u[32];
        csv_unit(u, sizeof u, t->axes[k].param->unit);
        fprintf(fp, "%s%s%s,", t->axes[k].param->path, u[0] ? "_" : "", u);
    }
    for (int c = 0; c < C_COUNT; c++)
        fprintf(fp, "%s,", COLUMNS[c].csv);
    fputs("status,message\n", fp);
    char msg[sizeof(dragarc_error)];
    for (size_t i = 0; i < t->nrows; i++) {
        const dragarc_sweep_row *r = &t->rows[i];
        for (size_t k = 0; k < t->naxes; k++) {
            put_num(fp, r->values[k]);
            fputc(',', fp);
        }
        for (int c = 0; c < C_COUNT; c++) {
            put_num(fp, column(r, c));
            fputc(',', fp);
        }
        dragarc_sweep_row_message(r, msg, sizeof msg);
        csv_text(fp, status_word(r));
        fputc(',', fp);
        csv_text(fp, msg);
        fputc('\n', fp);
    }
    return write_status(fp, err);
}

/* ---- JSON ----------------------------------------------------------------------------------------- */

static void json_text(FILE *fp, const char *s)
{
    fputc('"', fp);
    for (const unsigned char *p = (const unsigned char *)s; *p; p++) {
        if (*p == '"' || *p == '\\')
            fprintf(fp, "\\%c", *p);
        else if (*p < 0x20)
            fprintf(fp, "\\u%04x", *p);
        else
            fputc(*p, fp);
    }
    fputc('"', fp);
}

static void json_num(FILE *fp, double v)
{
    if (isfinite(v))
        put_num(fp, v);
    else
        fputs("null", fp);
}

int dragarc_sweep_write_json(FILE *fp, const dragarc_sweep *t, dragarc_error *err)
{
    fputs("{\n  \"scenario\": ", fp);
    json_text(fp, t->scenario);
    fputs(",\n  \"dragarc_version\": \"" DRAGARC_VERSION_STRING "\",\n  \"varied\": [", fp);
    for (size_t k = 0; k < t->naxes; k++) {
        const dragarc_sweep_axis *a = &t->axes[k];
        fprintf(fp, "%s\n    {\"name\": \"%s\", \"alias\": \"%s\", \"unit\": \"%s\", \"start\": ", k ? "," : "",
                a->param->path, a->param->alias, a->param->unit);
        json_num(fp, a->start);
        fputs(", \"stop\": ", fp);
        json_num(fp, a->stop);
        fputs(", \"step\": ", fp);
        json_num(fp, a->step);
        fprintf(fp, ", \"count\": %zu}", a->count);
    }
    fputs("\n  ],\n  \"rows\": [", fp);
    for (size_t i = 0; i < t->nrows; i++) {
        const dragarc_sweep_row *r = &t->rows[i];
        fputs(i ? ",\n    {" : "\n    {", fp);
        for (size_t k = 0; k < t->naxes; k++) {
            fprintf(fp, "\"%s\": ", t->axes[k].param->path);
            json_num(fp, r->values[k]);
            fputs(", ", fp);
        }
        fputs("\"status\": ", fp);
        json_text(fp, status_word(r));
        for (int c = 0; c < C_COUNT; c++) {
            fprintf(fp, ", \"%s\": ", COLUMNS[c].key);
            json_num(fp, column(r, c));
        }
        if (r->status != DRAGARC_OK) {
            fputs(", \"error\": {\"field\": ", fp);
            json_text(fp, r->error ? r->error->field : "");
            fputs(", \"message\": ", fp);
            json_text(fp, r->error ? r->error->message : dragarc_status_name(r->status));
            fputc('}', fp);
        }
        fputc('}', fp);
    }
    fprintf(fp, "%s],\n  \"failed_rows\": %zu,\n  \"units\": {", t->nrows ? "\n  " : "", t->nfailed);
    for (size_t k = 0; k < t->naxes; k++)
        fprintf(fp, "\"%s\": \"%s\", ", t->axes[k].param->path, t->axes[k].param->unit);
    for (int c = 0; c < C_COUNT; c++)
        fprintf(fp, "%s\"%s\": \"%s\"", c ? ", " : "", COLUMNS[c].key, COLUMNS[c].unit);
    fputs("},\n  \"cautions\": [", fp);
    const char *cautions[8];
    size_t nc = dragarc_cautions_notes(t->notes, cautions, 8);
    for (size_t i = 0; i < nc; i++) {
        fputs(i ? ",\n    " : "\n    ", fp);
        json_text(fp, cautions[i]);
    }
    fputs("\n  ]\n}\n", fp);
    return write_status(fp, err);
}

/* ---- Markdown ------------------------------------------------------------------------------------- */

/* Text for a table cell: '|' escaped, line breaks as spaces. */
static void md_text(FILE *fp, const char *s)
{
    for (; *s; s++) {
        if (*s == '|')
            fputs("\\|", fp);
        else
            fputc(*s == '\r' || *s == '\n' ? ' ' : *s, fp);
    }
}

/* How the Markdown table prints column c: "%.*f" with decimals[c], or %.3g for energy, which spans
 * many orders of magnitude between a droplet and a fragment. */
static void md_cell(FILE *fp, const dragarc_sweep_row *r, int c, int decimals)
{
    double v = column(r, c);
    if (r->status != DRAGARC_OK)
        return; /* the status column says why */
    if (!isfinite(v))
        fputs("none", fp); /* no terminal speed */
    else if (c == C_ENERGY)
        fprintf(fp, "%.3g", v);
    else
        fprintf(fp, "%.*f", decimals, v);
}

int dragarc_sweep_write_markdown(FILE *fp, const dragarc_sweep *t, dragarc_error *err)
{
    int decimals[C_COUNT];
    double *col = malloc((t->nrows ? t->nrows : 1) * sizeof *col);
    if (!col)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory writing the table");
    for (int c = 0; c < C_COUNT; c++) {
        for (size_t i = 0; i < t->nrows; i++)
            col[i] = column(&t->rows[i], c);
        decimals[c] = c == C_IMPACT_ANGLE ? 1 : dragarc_number_decimals(col, t->nrows, 5);
    }
    free(col);

    fputs("**", fp);
    md_text(fp, t->scenario[0] ? t->scenario : "dragarc table");
    fputs("**: ", fp);
    for (size_t k = 0; k < t->naxes; k++) {
        const dragarc_sweep_axis *a = &t->axes[k];
        char v[3][40];
        dragarc_number_format(v[0], sizeof v[0], a->start);
        dragarc_number_format(v[1], sizeof v[1], a->stop);
        dragarc_number_format(v[2], sizeof v[2], a->step);
        fprintf(fp, "%s`%s` from %s to %s by %s%s%s", k ? "; " : "", a->param->path, v[0], v[1], v[2],
                a->param->unit[0] ? " " : "", short_unit(a->param->unit));
    }
    fprintf(fp, " (%zu rows, %zu failed)\n\n|", t->nrows, t->nfailed);
    for (size_t k = 0; k < t->naxes; k++) {
        const char *u = short_unit(t->axes[k].param->unit);
        fprintf(fp, " %s%s%s%s |", t->axes[k].param->path, u[0] ? " (" : "", u, u[0] ? ")" : "");
    }
    for (int c = 0; c < C_COUNT; c++)
        fprintf(fp, " %s |", COLUMNS[c].label);
    fputs(" status |\n|", fp);
    for (size_t k = 0; k < t->naxes + C_COUNT; k++)
        fputs(" ---: |", fp);
    fputs(" --- |\n", fp);
    char msg[sizeof(dragarc_error)];
    for (size_t i = 0; i < t->nrows; i++) {
        const dragarc_sweep_row *r = &t->rows[i];
        fputc('|', fp);
        for (size_t k = 0; k < t->naxes; k++) {
            fputc(' ', fp);
            put_num(fp, r->values[k]);
            fputs(" |", fp);
        }
        for (int c = 0; c < C_COUNT; c++) {
            fputc(' ', fp);
            md_cell(fp, r, c, decimals[c]);
            fputs(" |", fp);
        }
        fputc(' ', fp);
        if (r->status == DRAGARC_OK) {
            fputs("ok", fp);
        } else {
            dragarc_sweep_row_message(r, msg, sizeof msg);
            fprintf(fp, "%s: ", status_word(r));
            md_text(fp, msg);
        }
        fputs(" |\n", fp);
    }
    const char *cautions[8];
    size_t nc = dragarc_cautions_notes(t->notes, cautions, 8);
    fputs("\nCautions:\n\n", fp);
    for (size_t i = 0; i < nc; i++)
        fprintf(fp, "- %s\n", cautions[i]);
    return write_status(fp, err);
}
