/* aim_table_out.c: aim tables (the low and high launch for each target range) as text, CSV, JSON and
 * Markdown. Forms documented in docs/table.md; numbers in CSV and JSON round-trip (dragarc_number_format).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/aim.h"
#include "dragarc/cautions.h"
#include "dragarc/output.h"

typedef struct aim_column {
    const char *name;  /* JSON key and, with the branch prefix, CSV and Markdown name */
    const char *unit;  /* SI unit or "degree" */
    const char *csv_unit;
    const char *brief; /* header of the text table */
    int decimals;      /* text and Markdown */
    int in_text;       /* shown in the 100-column text table */
} aim_column;

static const aim_column COLS[] = {
    {"elevation", "degree", "deg", "elev", 2, 1},        {"aim", "degree", "deg", "aim", 2, 1},
    {"time_of_flight", "s", "s", "time", 2, 1},          {"apex_height", "m", "m", "apex", 1, 0},
    {"impact_speed", "m/s", "m_s", "impact", 1, 1},      {"impact_angle", "degree", "deg", "angle", 1, 0},
    {"impact_energy", "J", "J", "energy", 1, 0},         {"miss", "m", "m", "miss", 6, 0},
};
enum { NCOLS = sizeof COLS / sizeof COLS[0] };

static double value_of(const dragarc_aim_solution *q, int c)
{
    switch (c) {
    case 0: return q->elevation / DRAGARC_DEG;
    case 1: return q->azimuth_correction / DRAGARC_DEG;
    case 2: return q->time_of_flight;
    case 3: return q->apex_height;
    case 4: return q->impact_speed;
    case 5: return q->impact_angle / DRAGARC_DEG;
    case 6: return q->impact_energy;
    default: return q->miss;
    }
}

static unsigned all_notes(const dragarc_aim_table_row *rows, size_t n)
{
    unsigned notes = 0;
    for (size_t i = 0; i < n; i++)
        notes |= rows[i].low.notes | rows[i].high.notes;
    return notes;
}

static const char *status_word(int status) { return status == DRAGARC_OK ? "ok" : dragarc_status_name(status); }

static int finish(FILE *fp, dragarc_error *err)
{
    if (ferror(fp))
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed: %s", strerror(errno));
    return DRAGARC_OK;
}

static void write_csv(FILE *fp, const dragarc_aim_table_row *rows, size_t n)
{
    fputs("range_m", fp);
    for (int b = 0; b < 2; b++)
        for (int c = 0; c < NCOLS; c++)
            fprintf(fp, ",%s_%s_%s", b ? "high" : "low", COLS[c].name, COLS[c].csv_unit);
    fputs(",max_range_m,max_range_elevation_deg,status,message\n", fp);
    for (size_t i = 0; i < n; i++) {
        const dragarc_aim_table_row *r = &rows[i];
        dragarc_number_write(fp, r->range);
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++) {
                fputc(',', fp);
                dragarc_number_write(fp, value_of(b ? &r->high : &r->low, c));
            }
        fputc(',', fp);
        dragarc_number_write(fp, r->max_range);
        fputc(',', fp);
        dragarc_number_write(fp, r->max_range_elevation / DRAGARC_DEG);
        fprintf(fp, ",%s,", status_word(r->status));
        dragarc_csv_text(fp, r->message);
        fputc('\n', fp);
    }
}

static void write_json(FILE *fp, const char *scenario, double height, const dragarc_aim_table_row *rows, size_t n)
{
    fputs("{\n  \"scenario\": ", fp);
    dragarc_json_text(fp, scenario);
    fputs(",\n  \"dragarc_version\": \"" DRAGARC_VERSION_STRING "\",\n  \"target_height\": ", fp);
    dragarc_json_number(fp, height);
    fputs(",\n  \"rows\": [", fp);
    for (size_t i = 0; i < n; i++) {
        const dragarc_aim_table_row *r = &rows[i];
        fprintf(fp, "%s\n    {\"range\": ", i ? "," : "");
        dragarc_json_number(fp, r->range);
        fprintf(fp, ", \"status\": \"%s\"", status_word(r->status));
        if (r->status != DRAGARC_OK) {
            fputs(", \"message\": ", fp);
            dragarc_json_text(fp, r->message);
        }
        for (int b = 0; b < 2; b++) {
            const dragarc_aim_solution *q = b ? &r->high : &r->low;
            fprintf(fp, ", \"%s\": ", b ? "high" : "low");
            if (!isfinite(q->elevation)) {
                fputs("null", fp);
                continue;
            }
            for (int c = 0; c < NCOLS; c++) {
                fprintf(fp, "%s\"%s\": ", c ? ", " : "{", COLS[c].name);
                dragarc_json_number(fp, value_of(q, c));
            }
            fputc('}', fp);
        }
        fputs(", \"max_range\": ", fp);
        dragarc_json_number(fp, r->max_range);
        fputs(", \"max_range_elevation\": ", fp);
        dragarc_json_number(fp, r->max_range_elevation / DRAGARC_DEG);
        fputc('}', fp);
    }
    fputs("\n  ],\n  \"units\": {\"range\": \"m\", \"target_height\": \"m\", \"max_range\": \"m\", "
          "\"max_range_elevation\": \"degree\"",
          fp);
    for (int c = 0; c < NCOLS; c++)
        fprintf(fp, ", \"%s\": \"%s\"", COLS[c].name, COLS[c].unit);
    fputs("},\n  \"cautions\": [", fp);
    const char *cautions[8];
    size_t nc = dragarc_cautions_notes(all_notes(rows, n), cautions, 8);
    for (size_t i = 0; i < nc; i++) {
        fputs(i ? ",\n    " : "\n    ", fp);
        dragarc_json_text(fp, cautions[i]);
    }
    fputs("\n  ]\n}\n", fp);
}

/* Text (aligned, 100 columns) or Markdown: the columns marked in_text (all of them in Markdown). */
static void write_grid(FILE *fp, int markdown, const char *scenario, double height, const dragarc_aim_table_row *rows,
                       size_t n)
{
    const int w = 8;
    if (!markdown) {
        fprintf(fp, "dragarc table%s%s\n", scenario[0] ? ": " : "", scenario);
        fprintf(fp, "  aim table: the low (direct) and high (lofted) launch onto each target range, on the plane at "
                    "%g m\n  aim = azimuth correction, degrees to the right (negative: left)\n\n",
                height);
        fprintf(fp, "%8s", "range");
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++)
                if (COLS[c].in_text)
                    fprintf(fp, "  %*s", w, COLS[c].brief);
        fprintf(fp, "\n%8s", "m");
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++)
                if (COLS[c].in_text)
                    fprintf(fp, "  %*s", w, strcmp(COLS[c].unit, "degree") == 0 ? "deg" : COLS[c].unit);
        fprintf(fp, "\n%8s  %-*s  %-*s\n", "", 4 * (w + 2) - 2, "--- low (direct) ---", 4 * (w + 2) - 2,
                "--- high (lofted) ---");
    } else {
        fputs("| range (m) |", fp);
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++)
                fprintf(fp, " %s %s (%s) |", b ? "high" : "low", COLS[c].name,
                        strcmp(COLS[c].unit, "degree") == 0 ? "deg" : COLS[c].unit);
        fputs("\n|---:|", fp);
        for (int k = 0; k < 2 * NCOLS; k++)
            fputs("---:|", fp);
        fputc('\n', fp);
    }
    for (size_t i = 0; i < n; i++) {
        const dragarc_aim_table_row *r = &rows[i];
        fprintf(fp, markdown ? "| %.3f |" : "%8.2f", r->range);
        if (r->status != DRAGARC_OK) {
            char why[96];
            if (r->status == DRAGARC_ENOSOLUTION && isfinite(r->max_range))
                snprintf(why, sizeof why, "out of reach: the maximum range is %.2f m", r->max_range);
            else
                snprintf(why, sizeof why, "failed: %s", dragarc_status_name(r->status));
            fprintf(fp, markdown ? " %s |\n" : "  %s\n", why);
            continue;
        }
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++) {
                if (!markdown && !COLS[c].in_text)
                    continue;
                double v = value_of(b ? &r->high : &r->low, c);
                if (markdown && isfinite(v))
                    fprintf(fp, " %.*f |", COLS[c].decimals, v);
                else if (markdown)
                    fputs(" |", fp);
                else if (isfinite(v))
                    fprintf(fp, "  %*.*f", w, COLS[c].decimals, v);
                else
                    fprintf(fp, "  %*s", w, "-");
            }
        fputc('\n', fp);
    }
    if (!markdown) {
        dragarc_cautions_print(fp, all_notes(rows, n), 100);
        return;
    }
    const char *cautions[8];
    size_t nc = dragarc_cautions_notes(all_notes(rows, n), cautions, 8);
    fputs("\nCautions:\n\n", fp);
    for (size_t i = 0; i < nc; i++)
        fprintf(fp, "- %s\n", cautions[i]);
}

int dragarc_aim_table_write(FILE *fp, dragarc_table_format format, const char *scenario, double height,
                            const dragarc_aim_table_row *rows, size_t n, dragarc_error *err)
{
    switch (format) {
    case DRAGARC_TABLE_CSV: write_csv(fp, rows, n); break;
    case DRAGARC_TABLE_JSON: write_json(fp, scenario, height, rows, n); break;
    case DRAGARC_TABLE_MARKDOWN: write_grid(fp, 1, scenario, height, rows, n); break;
    default: write_grid(fp, 0, scenario, height, rows, n); break;
    }
    return finish(fp, err);
}
