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
    dragarc_quantity quantity;
} aim_column;

static const aim_column COLS[] = {
    {"elevation", "degree", "deg", "elev", 2, 1, DRAGARC_Q_ANGLE},
    {"aim", "degree", "deg", "aim", 2, 1, DRAGARC_Q_ANGLE},
    {"time_of_flight", "s", "s", "time", 2, 1, DRAGARC_Q_TIME},
    {"apex_height", "m", "m", "apex", 1, 0, DRAGARC_Q_LENGTH},
    {"impact_speed", "m/s", "m_s", "impact", 1, 1, DRAGARC_Q_SPEED},
    {"impact_angle", "degree", "deg", "angle", 1, 0, DRAGARC_Q_ANGLE},
    {"impact_energy", "J", "J", "energy", 1, 0, DRAGARC_Q_ENERGY},
    {"miss", "m", "m", "miss", 6, 0, DRAGARC_Q_LENGTH},
};

/* The output unit of a field (NULL display: SI, and NULL here). */
static const dragarc_unit_out *unit_of(const dragarc_display *d, const char *field, dragarc_quantity q)
{
    return d ? dragarc_display_unit(d, field, q) : NULL;
}

static double in_unit(const dragarc_unit_out *u, double v) { return u ? dragarc_display_value(u, v) : v; }

static const char *symbol(const dragarc_unit_out *u, const char *si)
{
    const char *sym = u ? u->symbol : si;
    return strcmp(sym, "degree") == 0 ? "deg" : sym;
}

/* A target range in the output unit as the user gave it ("10 yd" is 10 again, not 10.000000000000002). */
static double range_shown(const dragarc_unit_out *u, double v) { return u ? dragarc_display_value_as_given(u, v) : v; }

static void csv_name(FILE *fp, const char *prefix, const char *name, const dragarc_unit_out *u, const char *si_suffix)
{
    char suffix[32];
    if (u)
        dragarc_unit_column_suffix(strcmp(u->symbol, "degree") == 0 ? "deg" : u->symbol, suffix, sizeof suffix);
    fprintf(fp, "%s%s_%s", prefix, name, u ? suffix : si_suffix);
}
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

static void write_csv(FILE *fp, const dragarc_aim_table_row *rows, size_t n, const dragarc_display *d)
{
    const dragarc_unit_out *ur = unit_of(d, "range", DRAGARC_Q_LENGTH), *um = unit_of(d, "max_range", DRAGARC_Q_LENGTH),
                           *ua = unit_of(d, NULL, DRAGARC_Q_ANGLE), *uc[NCOLS];
    for (int c = 0; c < NCOLS; c++)
        uc[c] = unit_of(d, COLS[c].name, COLS[c].quantity);
    csv_name(fp, "", "range", ur, "m");
    for (int b = 0; b < 2; b++)
        for (int c = 0; c < NCOLS; c++) {
            fputc(',', fp);
            csv_name(fp, b ? "high_" : "low_", COLS[c].name, uc[c], COLS[c].csv_unit);
        }
    fputc(',', fp);
    csv_name(fp, "", "max_range", um, "m");
    fputc(',', fp);
    csv_name(fp, "", "max_range_elevation", ua, "deg");
    fputs(",status,message\n", fp);
    for (size_t i = 0; i < n; i++) {
        const dragarc_aim_table_row *r = &rows[i];
        dragarc_number_write(fp, range_shown(ur, r->range));
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++) {
                fputc(',', fp);
                dragarc_number_write(fp, in_unit(uc[c], value_of(b ? &r->high : &r->low, c)));
            }
        fputc(',', fp);
        dragarc_number_write(fp, in_unit(um, r->max_range));
        fputc(',', fp);
        dragarc_number_write(fp, in_unit(ua, r->max_range_elevation / DRAGARC_DEG));
        fprintf(fp, ",%s,", status_word(r->status));
        dragarc_csv_text(fp, r->message);
        fputc('\n', fp);
    }
}

static void write_json(FILE *fp, const char *scenario, double height, const dragarc_aim_table_row *rows, size_t n,
                       const dragarc_display *d)
{
    const dragarc_unit_out *ur = unit_of(d, "range", DRAGARC_Q_LENGTH), *um = unit_of(d, "max_range", DRAGARC_Q_LENGTH),
                           *ua = unit_of(d, NULL, DRAGARC_Q_ANGLE), *uh = unit_of(d, "height", DRAGARC_Q_LENGTH),
                           *uc[NCOLS];
    for (int c = 0; c < NCOLS; c++)
        uc[c] = unit_of(d, COLS[c].name, COLS[c].quantity);
    fputs("{\n  \"scenario\": ", fp);
    dragarc_json_text(fp, scenario);
    fputs(",\n  \"dragarc_version\": \"" DRAGARC_VERSION_STRING "\",\n  \"target_height\": ", fp);
    dragarc_json_number(fp, in_unit(uh, height));
    fputs(",\n  \"rows\": [", fp);
    for (size_t i = 0; i < n; i++) {
        const dragarc_aim_table_row *r = &rows[i];
        fprintf(fp, "%s\n    {\"range\": ", i ? "," : "");
        dragarc_json_number(fp, range_shown(ur, r->range));
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
                dragarc_json_number(fp, in_unit(uc[c], value_of(q, c)));
            }
            fputc('}', fp);
        }
        fputs(", \"max_range\": ", fp);
        dragarc_json_number(fp, in_unit(um, r->max_range));
        fputs(", \"max_range_elevation\": ", fp);
        dragarc_json_number(fp, in_unit(ua, r->max_range_elevation / DRAGARC_DEG));
        fputc('}', fp);
    }
    fprintf(fp, "\n  ],\n  \"units\": {\"range\": \"%s\", \"target_height\": \"%s\", \"max_range\": \"%s\", "
                "\"max_range_elevation\": \"%s\"",
            ur ? ur->symbol : "m", uh ? uh->symbol : "m", um ? um->symbol : "m", ua ? ua->symbol : "degree");
    for (int c = 0; c < NCOLS; c++)
        fprintf(fp, ", \"%s\": \"%s\"", COLS[c].name, uc[c] ? uc[c]->symbol : COLS[c].unit);
    fputs("},\n  \"cautions\": [", fp);
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(all_notes(rows, n), cautions, DRAGARC_CAUTIONS_MAX);
    for (size_t i = 0; i < nc; i++) {
        fputs(i ? ",\n    " : "\n    ", fp);
        dragarc_json_text(fp, cautions[i]);
    }
    fputs("\n  ]\n}\n", fp);
}

/* Text (aligned, 100 columns) or Markdown: the columns marked in_text (all of them in Markdown). */
static void write_grid(FILE *fp, int markdown, const char *scenario, double height, const dragarc_aim_table_row *rows,
                       size_t n, const dragarc_display *d)
{
    const int w = 8;
    const dragarc_unit_out *ur = unit_of(d, "range", DRAGARC_Q_LENGTH), *um = unit_of(d, "max_range", DRAGARC_Q_LENGTH),
                           *uh = unit_of(d, "height", DRAGARC_Q_LENGTH), *uc[NCOLS];
    for (int c = 0; c < NCOLS; c++)
        uc[c] = unit_of(d, COLS[c].name, COLS[c].quantity);
    const char *aim_unit = symbol(uc[1], "degree");
    if (!markdown) {
        fprintf(fp, "dragarc table%s%s\n", scenario[0] ? ": " : "", scenario);
        fprintf(fp, "  aim table: the low (direct) and high (lofted) launch onto each target range, on the plane at "
                    "%g %s\n  aim = azimuth correction, %s to the right (negative: left)\n\n",
                in_unit(uh, height), symbol(uh, "m"), strcmp(aim_unit, "deg") == 0 ? "degrees" : aim_unit);
        fprintf(fp, "%8s", "range");
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++)
                if (COLS[c].in_text)
                    fprintf(fp, "  %*s", w, COLS[c].brief);
        fprintf(fp, "\n%8s", symbol(ur, "m"));
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++)
                if (COLS[c].in_text)
                    fprintf(fp, "  %*s", w, symbol(uc[c], COLS[c].unit));
        fprintf(fp, "\n%8s  %-*s  %-*s\n", "", 4 * (w + 2) - 2, "--- low (direct) ---", 4 * (w + 2) - 2,
                "--- high (lofted) ---");
    } else {
        fprintf(fp, "| range (%s) |", symbol(ur, "m"));
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++)
                fprintf(fp, " %s %s (%s) |", b ? "high" : "low", COLS[c].name, symbol(uc[c], COLS[c].unit));
        fputs("\n|---:|", fp);
        for (int k = 0; k < 2 * NCOLS; k++)
            fputs("---:|", fp);
        fputc('\n', fp);
    }
    for (size_t i = 0; i < n; i++) {
        const dragarc_aim_table_row *r = &rows[i];
        fprintf(fp, markdown ? "| %.3f |" : "%8.2f", range_shown(ur, r->range));
        if (r->status != DRAGARC_OK) {
            char why[96];
            if (r->status == DRAGARC_ENOSOLUTION && isfinite(r->max_range))
                snprintf(why, sizeof why, "out of reach: the maximum range is %.2f %s", in_unit(um, r->max_range),
                         symbol(um, "m"));
            else
                snprintf(why, sizeof why, "failed: %s", dragarc_status_name(r->status));
            fprintf(fp, markdown ? " %s |\n" : "  %s\n", why);
            continue;
        }
        for (int b = 0; b < 2; b++)
            for (int c = 0; c < NCOLS; c++) {
                if (!markdown && !COLS[c].in_text)
                    continue;
                double v = in_unit(uc[c], value_of(b ? &r->high : &r->low, c));
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
    const char *cautions[DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(all_notes(rows, n), cautions, DRAGARC_CAUTIONS_MAX);
    fputs("\nCautions:\n\n", fp);
    for (size_t i = 0; i < nc; i++)
        fprintf(fp, "- %s\n", cautions[i]);
}

int dragarc_aim_table_write(FILE *fp, dragarc_table_format format, const char *scenario, double height,
                            const dragarc_aim_table_row *rows, size_t n, const dragarc_display *d, dragarc_error *err)
{
    switch (format) {
    case DRAGARC_TABLE_CSV: write_csv(fp, rows, n, d); break;
    case DRAGARC_TABLE_JSON: write_json(fp, scenario, height, rows, n, d); break;
    case DRAGARC_TABLE_MARKDOWN: write_grid(fp, 1, scenario, height, rows, n, d); break;
    default: write_grid(fp, 0, scenario, height, rows, n, d); break;
    }
    return finish(fp, err);
}
