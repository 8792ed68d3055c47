/* test_catch_csv.c: the catch-can CSV reader: what it accepts, and every rule it refuses by, with the line,
 * the column and the bad text.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdlib.h>

#include "check.h"
#include "dragarc/catch_data.h"

/* Parse text, expecting failure with this field and a message containing `text` (one check). */
static void refused(const char *csv, const char *field, const char *text)
{
    dragarc_catches c;
    dragarc_error err;
    int rc = dragarc_catches_parse(csv, &c, &err);
    dragarc_catches_clear(&c);
    CHECK_ERROR(rc, DRAGARC_EINVAL, err, field, text);
}

TEST(a_plain_depth_column_reads_one_can_a_row)
{
    dragarc_catches c;
    CHECK(dragarc_catches_parse("depth\n3.5\n4\n0\n", &c, NULL) == DRAGARC_OK);
    CHECK(c.n == 3 && c.area == NULL && c.x == NULL && c.y == NULL);
    CHECK(c.depth[0] == 3.5 && c.depth[1] == 4.0 && c.depth[2] == 0.0);
    double ext[4];
    CHECK(dragarc_catches_extent(&c, ext) == -1);
    dragarc_catches_clear(&c);
    dragarc_catches_clear(NULL);
}

/* What spreadsheets write: a byte-order mark, CR LF, names in any case and order, spaces, quotes, blank lines. */
TEST(spreadsheet_exports_read_as_well)
{
    dragarc_catches c;
    const char *csv = "\xEF\xBB\xBF Area , Y,\"X\",DEPTH\r\n"
                      "\r\n"
                      "0.5, 2, 1, \"7.25\"\r\n"
                      "  1.5 ,4,-3,6\r\n"
                      "\n";
    dragarc_error err;
    int rc = dragarc_catches_parse(csv, &c, &err);
    CHECK(rc == DRAGARC_OK);
    if (rc != DRAGARC_OK) {
        printf("  %s: %s\n", err.field, err.message);
        return;
    }
    CHECK(c.n == 2 && c.area && c.x && c.y);
    CHECK(c.depth[0] == 7.25 && c.depth[1] == 6.0);
    CHECK(c.area[0] == 0.5 && c.area[1] == 1.5);
    CHECK(c.x[0] == 1.0 && c.x[1] == -3.0 && c.y[0] == 2.0 && c.y[1] == 4.0);
    double ext[4];
    CHECK(dragarc_catches_extent(&c, ext) == 0);
    CHECK(ext[0] == -3.0 && ext[1] == 1.0 && ext[2] == 2.0 && ext[3] == 4.0);
    dragarc_catches_clear(&c);
}

TEST(many_rows_grow_the_columns)
{
    size_t n = 1000;
    char *csv = malloc(16 + n * 8);
    CHECK(csv != NULL);
    if (!csv)
        return;
    char *p = csv + sprintf(csv, "depth,x,y\n");
    for (size_t i = 0; i < n; i++)
        p += sprintf(p, "%zu,%zu,0\n", i % 10, i);
    dragarc_catches c;
    CHECK(dragarc_catches_parse(csv, &c, NULL) == DRAGARC_OK);
    CHECK(c.n == n && c.depth[999] == 9.0 && c.x[999] == 999.0);
    dragarc_catches_clear(&c);
    free(csv);
}

TEST(the_file_as_a_whole_is_refused_when_it_holds_no_catches)
{
    refused("", "", "the file is empty");
    refused(" \n\r\n\t\n", "", "the file is empty");
    refused("depth\n\n", "", "no catches: the header row is followed by no data rows");
}

/* A refused text, the field the error names, and text its message must hold. */
typedef struct refusal {
    const char *csv, *field, *text;
} refusal;

/* The header must name depth, and known columns once; every value is checked with its line and column. */
TEST(each_refusal_names_the_line_the_column_and_the_text)
{
    char wide[400] = "depth";
    for (int i = 0; i < 70; i++)
        strcat(wide, ",x");
    const refusal cases[] = {
        /* the header */
        {"x,y\n1,2\n", "line 1", "no depth column"},
        {"\n\ndpeth\n1\n", "line 3", "unknown column 'dpeth'"},
        {"depth,can\n1,a\n", "line 1", "unknown column 'can'"},
        {"depth,Depth\n1,2\n", "line 1", "column 'depth' appears twice"},
        {"depth,x\n1,2\n", "line 1", "x without y"},
        {"y,depth\n1,2\n", "line 1", "y without x"},
        {wide, "line 1", "more than 64 fields"},
        /* the values */
        {"depth\n1\nabc\n", "line 3: depth", "not a number ('abc')"},
        {"depth\n1\n\"\"\n", "line 3: depth", "not a number ('')"},
        {"depth,x,y\n1,2,\n", "line 2: y", "not a number ('')"},
        {"depth\nnan\n", "line 2: depth", "not a number ('nan')"},
        {"depth\n1e999\n", "line 2: depth", "not a number ('1e999')"},
        {"depth\n12 mm\n", "line 2: depth", "not a number ('12 mm')"},
        {"depth\n2\n-1.5\n", "line 3: depth", "must not be negative (got -1.5)"},
        {"depth,area\n2,0\n", "line 2: area", "must be a positive finite number (got 0)"},
        {"depth,area\n2,1\n3,-2\n", "line 3: area", "got -2"},
        {"depth,x,y\n1,2,3\n4,5\n", "line 3", "2 fields, but the header names 3 columns"},
        {"depth\n1,5\n", "line 2", "1 column (a decimal comma? write 1.5, not 1,5)"},
    };
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++)
        refused(cases[i].csv, cases[i].field, cases[i].text);
}

TEST(a_missing_file_is_an_input_error_with_the_reason)
{
    dragarc_catches c;
    dragarc_error err;
    CHECK(dragarc_catches_read("/nonexistent-dir/catch.csv", &c, &err) == DRAGARC_EIO);
    CHECK(strstr(err.message, "No such file or directory") != NULL);
    CHECK(c.n == 0 && c.depth == NULL);
}

int main(void)
{
    dragarc_init();
    RUN(a_plain_depth_column_reads_one_can_a_row);
    RUN(spreadsheet_exports_read_as_well);
    RUN(many_rows_grow_the_columns);
    RUN(the_file_as_a_whole_is_refused_when_it_holds_no_catches);
    RUN(each_refusal_names_the_line_the_column_and_the_text);
    RUN(a_missing_file_is_an_input_error_with_the_reason);
    return check_summary();
}
