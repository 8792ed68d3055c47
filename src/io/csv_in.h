/* csv_in.h: reading plain CSV as spreadsheets export it, shared by the CSV readers of src/io (private).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Fields separated by commas, spaces around a field ignored, a field may sit in double quotes, a UTF-8
 * byte-order mark and CR LF line ends accepted, blank lines skipped; column names matched without regard to
 * case. Everything works in place on a caller's writable copy of the text.
 */
#ifndef DRAGARC_IO_CSV_IN_H
#define DRAGARC_IO_CSV_IN_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#define DRAGARC_CSV_MAX_FIELDS 64 /* columns in one row */

/* text past a UTF-8 byte-order mark, if it starts with one. */
const char *dragarc_csv_skip_bom(const char *text);

/* The next line that is not blank, cut in place (its line end becomes NUL), or NULL at the end of the text.
 * *cursor starts at the text and is advanced; *line counts every line passed, blank ones too (from 0). */
char *dragarc_csv_next_line(char **cursor, size_t *line);

/* One line's fields, cut in place (the commas and the closing quotes become NULs) into field[0..]. Returns the
 * count, or DRAGARC_CSV_MAX_FIELDS + 1 when there are more. */
size_t dragarc_csv_split(char *line, char **field);

/* Whether name equals lower (a lowercase column name) without regard to case. */
int dragarc_csv_same_name(const char *name, const char *lower);

/* A finite number from a field of the row on `line` in column `name`; else DRAGARC_EINVAL with field
 * "line N: name" and the message "not a number ('text')". */
int dragarc_csv_number(const char *text, size_t line, const char *name, double *out, dragarc_error *err);

/* The columns a reader takes: their lowercase names, and the list in words for messages ("depth, and
 * optionally x and y, area"). */
typedef struct dragarc_csv_columns {
    const char *const *names;
    int count;
    const char *known;
} dragarc_csv_columns;

/* What a reader does with the header (where[k]: the field of column k, -1 when absent; at: "line N") and with
 * each data row (its fields, and the line it is on). */
typedef int (*dragarc_csv_header_fn)(const int *where, const char *at, void *ctx, dragarc_error *err);
typedef int (*dragarc_csv_row_fn)(char **field, const int *where, size_t line, void *ctx, dragarc_error *err);

/* Read text (modified in place) a line at a time: the first line the header, mapped to cols (an unknown or
 * repeated name refused), then each data row with as many fields as the header, handed to row. *header_seen
 * tells whether there was a header at all. Stops at the first error, which names the line. */
int dragarc_csv_read(char *text, const dragarc_csv_columns *cols, dragarc_csv_header_fn header,
                     dragarc_csv_row_fn row, void *ctx, int *header_seen, dragarc_error *err);

#endif
