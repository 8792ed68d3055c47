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

void dragarc_text_wrap(FILE *fp, const char *prefix, int indent, int width, const char *text)
{
    int col = fprintf(fp, "%s", prefix);
    int first = 1;
    for (const char *p = text; *p;) {
        while (*p == ' ')
            p++;
        const char *w = p;
        while (*p && *p != ' ')
            p++;
        int len = (int)(p - w);
        if (len == 0)
            break;
        if (!first && col + 1 + len > width) {
            fprintf(fp, "\n%*s", indent, "");
            col = indent;
        } else if (!first) {
            fputc(' ', fp);
            col++;
        }
        fprintf(fp, "%.*s", len, w);
        col += len;
        first = 0;
    }
    fputc('\n', fp);
}

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

/* Decimals (0 to 6) that print the largest finite |v[i]| with `digits` significant digits; 0 when no
 * value is finite. */
static int decimals_for(const double *v, size_t n, int digits)
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

static const dragarc_sweep_column_info COLUMNS[DRAGARC_SWEEP_NCOLUMNS] = {
    {"range", "range_m", "range", "range", "m", DRAGARC_Q_LENGTH},
    {"downrange", "downrange_m", "downrange", "downrange", "m", DRAGARC_Q_LENGTH},
    {"crossrange", "crossrange_m", "crossrange", "crossrange", "m", DRAGARC_Q_LENGTH},
    {"time_of_flight", "time_of_flight_s", "time of flight", "time", "s", DRAGARC_Q_TIME},
    {"apex_height", "apex_height_m", "apex height", "apex", "m", DRAGARC_Q_LENGTH},
    {"impact_speed", "impact_speed_m_s", "impact speed", "impact", "m/s", DRAGARC_Q_SPEED},
    {"impact_angle", "impact_angle_deg", "impact angle", "angle", "degree", DRAGARC_Q_ANGLE},
    {"impact_energy", "impact_energy_J", "impact energy", "energy", "J", DRAGARC_Q_ENERGY},
    {"terminal_speed", "terminal_speed_m_s", "terminal speed", "terminal", "m/s", DRAGARC_Q_SPEED},
};

enum { NC = DRAGARC_SWEEP_NCOLUMNS };

const dragarc_sweep_column_info *dragarc_sweep_column_about(dragarc_sweep_column c)
{
    return (unsigned)c < NC ? &COLUMNS[c] : NULL;
}

double dragarc_sweep_column_value(const dragarc_sweep_row *r, dragarc_sweep_column c)
{
    switch (c) {
    case DRAGARC_SWEEP_RANGE: return r->range;
    case DRAGARC_SWEEP_DOWNRANGE: return r->downrange;
    case DRAGARC_SWEEP_CROSSRANGE: return r->crossrange;
    case DRAGARC_SWEEP_TIME_OF_FLIGHT: return r->time_of_flight;
    case DRAGARC_SWEEP_APEX_HEIGHT: return r->apex_height;
    case DRAGARC_SWEEP_IMPACT_SPEED: return r->impact_speed;
    case DRAGARC_SWEEP_IMPACT_ANGLE: return r->impact_angle / DRAGARC_DEG;
    case DRAGARC_SWEEP_IMPACT_ENERGY: return r->impact_energy;
    case DRAGARC_SWEEP_TERMINAL_SPEED: return r->terminal_speed;
    default: return NAN;
    }
}

double dragarc_sweep_shown(const dragarc_display *d, const dragarc_sweep_row *r, dragarc_sweep_column c)
{
    double v = dragarc_sweep_column_value(r, c);
    if (!d || (unsigned)c >= NC)
        return v;
    return dragarc_display_value(dragarc_display_unit(d, COLUMNS[c].key, COLUMNS[c].quantity), v);
}

const char *dragarc_sweep_column_unit(const dragarc_display *d, dragarc_sweep_column c)
{
    if ((unsigned)c >= NC)
        return "";
    return d ? dragarc_display_unit(d, COLUMNS[c].key, COLUMNS[c].quantity)->symbol : COLUMNS[c].unit;
}

double dragarc_scenario_param_shown(const dragarc_display *d, const dragarc_scenario_param *p, double v, int as_given)
{
    if (!d || p->quantity == DRAGARC_Q_NUMBER)
        return v;
    const dragarc_unit_out *u = dragarc_display_unit(d, NULL, p->quantity);
    return as_given ? dragarc_display_value_as_given(u, v) : dragarc_display_value(u, v);
}

const char *dragarc_scenario_param_unit(const dragarc_display *d, const dragarc_scenario_param *p)
{
    if (!d || p->quantity == DRAGARC_Q_NUMBER)
        return p->unit;
    return dragarc_display_unit(d, NULL, p->quantity)->symbol;
}

double dragarc_sweep_axis_shown(const dragarc_display *d, const dragarc_sweep_axis *a, double v)
{
    return dragarc_scenario_param_shown(d, a->param, v, 1);
}

const char *dragarc_sweep_axis_unit(const dragarc_display *d, const dragarc_sweep_axis *a)
{
    return dragarc_scenario_param_unit(d, a->param);
}

int dragarc_sweep_column_decimals(const dragarc_sweep *t, dragarc_sweep_column c, const dragarc_display *d)
{
    if (c == DRAGARC_SWEEP_IMPACT_ANGLE)
        return 1;
    double *col = malloc((t->nrows ? t->nrows : 1) * sizeof *col);
    if (!col)
        return 3; /* a fair default when even this fails */
    size_t m = 0;
    for (size_t i = 0; i < t->nrows; i++)
        if (t->rows[i].status == DRAGARC_OK)
            col[m++] = dragarc_sweep_shown(d, &t->rows[i], c);
    int dec = decimals_for(col, m, 5);
    free(col);
    return dec;
}

void dragarc_sweep_cell_format(char *buf, size_t size, const dragarc_sweep_row *r, dragarc_sweep_column c,
                               int decimals, const dragarc_display *d)
{
    double v = dragarc_sweep_shown(d, r, c);
    if (r->status != DRAGARC_OK)
        snprintf(buf, size, "%s", ""); /* the status says why */
    else if (!isfinite(v))
        snprintf(buf, size, "none");
    else if (c == DRAGARC_SWEEP_IMPACT_ENERGY)
        snprintf(buf, size, "%.3g", v);
    else
        snprintf(buf, size, "%.*f", decimals, v);
}

const char *dragarc_unit_abbrev(const char *unit) { return strcmp(unit, "degree") == 0 ? "deg" : unit; }

void dragarc_sweep_axis_describe(char *buf, size_t size, const dragarc_sweep_axis *a, const dragarc_display *d)
{
    char v[3][40];
    const char *unit = dragarc_sweep_axis_unit(d, a);
    /* The step is a difference: no zero-point offset (degF steps of degF values, say). */
    double zero = dragarc_sweep_axis_shown(d, a, 0.0);
    dragarc_number_format(v[0], sizeof v[0], dragarc_sweep_axis_shown(d, a, a->start));
    dragarc_number_format(v[1], sizeof v[1], dragarc_sweep_axis_shown(d, a, a->stop));
    dragarc_number_format(v[2], sizeof v[2], dragarc_sweep_axis_shown(d, a, a->step) - zero);
    snprintf(buf, size, "from %s to %s by %s%s%s", v[0], v[1], v[2], unit[0] ? " " : "", dragarc_unit_abbrev(unit));
}

/* A unit fit for a CSV column name: m/s -> m_s, m/s^2 -> m_s2, degree -> deg. */
static void csv_unit(char *buf, size_t size, const char *unit)
{
    char tmp[64];
    size_t k = 0;
    for (const char *u = dragarc_unit_abbrev(unit); *u && k + 1 < sizeof tmp; u++)
        if (*u != '^')
            tmp[k++] = *u;
    tmp[k] = '\0';
    dragarc_unit_column_suffix(tmp, buf, size);
}

static int write_status(FILE *fp, dragarc_error *err)
{
    if (ferror(fp))
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed: %s", strerror(errno));
    return DRAGARC_OK;
}

void dragarc_number_write(FILE *fp, double v)
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
void dragarc_csv_text(FILE *fp, const char *s)
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

int dragarc_sweep_write_csv(FILE *fp, const dragarc_sweep *t, const dragarc_display *d, dragarc_error *err)
{
    for (size_t k = 0; k < t->naxes; k++) {
        char u[32];
        csv_unit(u, sizeof u, dragarc_sweep_axis_unit(d, &t->axes[k]));
        fprintf(fp, "%s%s%s,", t->axes[k].param->path, u[0] ? "_" : "", u);
    }
    for (int c = 0; c < NC; c++) {
        char u[32];
        csv_unit(u, sizeof u, dragarc_sweep_column_unit(d, (dragarc_sweep_column)c));
        fprintf(fp, "%s_%s,", COLUMNS[c].key, u);
    }
    fputs("status,message\n", fp);
    char msg[sizeof(dragarc_error)];
    for (size_t i = 0; i < t->nrows; i++) {
        const dragarc_sweep_row *r = &t->rows[i];
        for (size_t k = 0; k < t->naxes; k++) {
            dragarc_number_write(fp, dragarc_sweep_axis_shown(d, &t->axes[k], r->values[k]));
            fputc(',', fp);
        }
        for (int c = 0; c < NC; c++) {
            dragarc_number_write(fp, dragarc_sweep_shown(d, r, c));
            fputc(',', fp);
        }
        dragarc_sweep_row_message(r, msg, sizeof msg);
        dragarc_csv_text(fp, status_word(r));
        fputc(',', fp);
        dragarc_csv_text(fp, msg);
        fputc('\n', fp);
    }
    return write_status(fp, err);
}

/* ---- JSON ----------------------------------------------------------------------------------------- */

void dragarc_json_text(FILE *fp, const char *s)
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

void dragarc_json_number(FILE *fp, double v)
{
    if (isfinite(v))
        dragarc_number_write(fp, v);
    else
        fputs("null", fp);
}

int dragarc_sweep_write_json(FILE *fp, const dragarc_sweep *t, const dragarc_display *d, dragarc_error *err)
{
    fputs("{\n  \"scenario\": ", fp);
    dragarc_json_text(fp, t->scenario);
    fputs(",\n  \"dragarc_version\": \"" DRAGARC_VERSION_STRING "\",\n  \"varied\": [", fp);
    for (size_t k = 0; k < t->naxes; k++) {
        const dragarc_sweep_axis *a = &t->axes[k];
        fprintf(fp, "%s\n    {\"name\": \"%s\", \"alias\": \"%s\", \"unit\": \"%s\", \"start\": ", k ? "," : "",
                a->param->path, a->param->alias, dragarc_sweep_axis_unit(d, a));
        dragarc_json_number(fp, dragarc_sweep_axis_shown(d, a, a->start));
        fputs(", \"stop\": ", fp);
        dragarc_json_number(fp, dragarc_sweep_axis_shown(d, a, a->stop));
        fputs(", \"step\": ", fp);
        dragarc_json_number(fp, dragarc_sweep_axis_shown(d, a, a->step) - dragarc_sweep_axis_shown(d, a, 0.0));
        fprintf(fp, ", \"count\": %zu}", a->count);
    }
    fputs("\n  ],\n  \"rows\": [", fp);
    for (size_t i = 0; i < t->nrows; i++) {
        const dragarc_sweep_row *r = &t->rows[i];
        fputs(i ? ",\n    {" : "\n    {", fp);
        for (size_t k = 0; k < t->naxes; k++) {
            fprintf(fp, "\"%s\": ", t->axes[k].param->path);
            dragarc_json_number(fp, dragarc_sweep_axis_shown(d, &t->axes[k], r->values[k]));
            fputs(", ", fp);
        }
        fputs("\"status\": ", fp);
        dragarc_json_text(fp, status_word(r));
        for (int c = 0; c < NC; c++) {
            fprintf(fp, ", \"%s\": ", COLUMNS[c].key);
            dragarc_json_number(fp, dragarc_sweep_shown(d, r, c));
        }
        if (r->status != DRAGARC_OK) {
            fputs(", \"error\": {\"field\": ", fp);
            dragarc_json_text(fp, r->error ? r->error->field : "");
            fputs(", \"message\": ", fp);
            dragarc_json_text(fp, r->error ? r->error->message : dragarc_status_name(r->status));
            fputc('}', fp);
        }
        fputc('}', fp);
    }
    fprintf(fp, "%s],\n  \"failed_rows\": %zu,\n  \"units\": {", t->nrows ? "\n  " : "", t->nfailed);
    for (size_t k = 0; k < t->naxes; k++)
        fprintf(fp, "\"%s\": \"%s\", ", t->axes[k].param->path, dragarc_sweep_axis_unit(d, &t->axes[k]));
    for (int c = 0; c < NC; c++)
        fprintf(fp, "%s\"%s\": \"%s\"", c ? ", " : "", COLUMNS[c].key,
                dragarc_sweep_column_unit(d, (dragarc_sweep_column)c));
    fputs("},\n  \"cautions\": [", fp);
    const char *cautions[8];
    size_t nc = dragarc_cautions_notes(t->notes, cautions, 8);
    for (size_t i = 0; i < nc; i++) {
        fputs(i ? ",\n    " : "\n    ", fp);
        dragarc_json_text(fp, cautions[i]);
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

int dragarc_sweep_write_markdown(FILE *fp, const dragarc_sweep *t, const dragarc_display *d, dragarc_error *err)
{
    int decimals[NC];
    for (int c = 0; c < NC; c++)
        decimals[c] = dragarc_sweep_column_decimals(t, (dragarc_sweep_column)c, d);
    char text[sizeof(dragarc_error)];
    fputs("**", fp);
    md_text(fp, t->scenario[0] ? t->scenario : "dragarc table");
    fputs("**: ", fp);
    for (size_t k = 0; k < t->naxes; k++) {
        dragarc_sweep_axis_describe(text, sizeof text, &t->axes[k], d);
        fprintf(fp, "%s`%s` %s", k ? "; " : "", t->axes[k].param->path, text);
    }
    fprintf(fp, " (%zu rows, %zu failed)\n\n|", t->nrows, t->nfailed);
    for (size_t k = 0; k < t->naxes; k++) {
        const char *u = dragarc_unit_abbrev(dragarc_sweep_axis_unit(d, &t->axes[k]));
        fprintf(fp, " %s%s%s%s |", t->axes[k].param->path, u[0] ? " (" : "", u, u[0] ? ")" : "");
    }
    for (int c = 0; c < NC; c++)
        fprintf(fp, " %s (%s) |", COLUMNS[c].label, dragarc_unit_abbrev(dragarc_sweep_column_unit(d, (dragarc_sweep_column)c)));
    fputs(" status |\n|", fp);
    for (size_t k = 0; k < t->naxes + NC; k++)
        fputs(" ---: |", fp);
    fputs(" --- |\n", fp);
    for (size_t i = 0; i < t->nrows; i++) {
        const dragarc_sweep_row *r = &t->rows[i];
        fputc('|', fp);
        for (size_t k = 0; k < t->naxes; k++) {
            fputc(' ', fp);
            dragarc_number_write(fp, dragarc_sweep_axis_shown(d, &t->axes[k], r->values[k]));
            fputs(" |", fp);
        }
        for (int c = 0; c < NC; c++) {
            dragarc_sweep_cell_format(text, sizeof text, r, (dragarc_sweep_column)c, decimals[c], d);
            fprintf(fp, " %s |", text);
        }
        fputc(' ', fp);
        if (r->status == DRAGARC_OK) {
            fputs("ok", fp);
        } else {
            dragarc_sweep_row_message(r, text, sizeof text);
            fprintf(fp, "%s: ", status_word(r));
            md_text(fp, text);
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
