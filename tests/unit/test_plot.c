/* test_plot.c: the plotting layer (formats by extension, files written whole or not at all, PLplot's failures as
 * return codes) and the vacuum path the side view compares with, against the closed forms of projectile motion.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Source of the closed forms: a point mass under constant gravity g alone, launched at speed v and elevation e from
 * the ground, lands at R = v^2 sin(2e) / g after T = 2 v sin(e) / g, and climbs to H = v^2 sin^2(e) / (2 g) at T / 2
 * (e.g. Halliday, Resnick and Walker, "Fundamentals of Physics", projectile motion; recalled). Tolerances: the
 * path is a few double operations from these, so 1e-12 relative is round-off with a wide margin.
 */
#define _POSIX_C_SOURCE 200809L
#include <dirent.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "check.h"
#include "dragarc/flight.h"
#include "dragarc/footprint.h"
#include "dragarc/plot.h"
#include "helpers.h"


static char dir[64]; /* a fresh folder for this run's files */

/* How many entries the folder holds (besides . and ..). */
static int entries(void)
{
    return folder_entries(dir);
}

/* The first bytes of a file, and its size (-1 when it cannot be read). */
static long head(const char *path, unsigned char *buf, size_t n)
{
    FILE *f = fopen(path, "rb");
    if (!f)
        return -1;
    size_t got = fread(buf, 1, n, f);
    fseek(f, 0, SEEK_END);
    long size = ftell(f);
    fclose(f);
    return got == n ? size : -1;
}

/* A drawing that succeeded (rc, e) and left an SVG file of plausible size at path. */
static void check_svg_written(int rc, const dragarc_error *e, const char *path)
{
    CHECK(rc == DRAGARC_OK);
    if (rc != DRAGARC_OK)
        printf("  %s\n", e->message);
    unsigned char buf[5];
    long size = head(path, buf, 5);
    CHECK(size > 5000 && size < 5000000 && memcmp(buf, "<?xml", 5) == 0);
}

TEST(formats_follow_the_extension_in_any_case)
{
    dragarc_plot_format f = DRAGARC_PLOT_PDF;
    dragarc_error e;
    CHECK(dragarc_plot_format_from_path("out.svg", &f, &e) == DRAGARC_OK && f == DRAGARC_PLOT_SVG);
    CHECK(dragarc_plot_format_from_path("a/b.c/OUT.PNG", &f, &e) == DRAGARC_OK && f == DRAGARC_PLOT_PNG);
    CHECK(dragarc_plot_format_from_path("x.Pdf", &f, &e) == DRAGARC_OK && f == DRAGARC_PLOT_PDF);
    CHECK_ERROR(dragarc_plot_format_from_path("out.gif", &f, &e), DRAGARC_EINVAL, e, "",
                "'out.gif' ends in '.gif': a plot is drawn into an .svg, .png or .pdf file");
    CHECK_ERROR(dragarc_plot_format_from_path("a.svg/plot", &f, &e), DRAGARC_EINVAL, e, "", "has no extension");
    CHECK_ERROR(dragarc_plot_format_from_path(".svg", &f, &e), DRAGARC_EINVAL, e, "", "has no extension");
}

TEST(the_palette_is_okabe_and_ito)
{
    /* Okabe and Ito 2008, Color Universal Design: orange 230/159/0, blue 0/114/178, vermillion 213/94/0 (recalled) */
    const unsigned char *o = dragarc_plot_palette(DRAGARC_PLOT_ORANGE), *b = dragarc_plot_palette(DRAGARC_PLOT_BLUE);
    const unsigned char *v = dragarc_plot_palette(DRAGARC_PLOT_VERMILLION);
    CHECK(o && o[0] == 230 && o[1] == 159 && o[2] == 0);
    CHECK(b && b[0] == 0 && b[1] == 114 && b[2] == 178);
    CHECK(v && v[0] == 213 && v[1] == 94 && v[2] == 0);
    CHECK(dragarc_plot_palette(DRAGARC_PLOT_NCOLOURS) == NULL);
}

TEST(the_vacuum_path_meets_the_closed_forms)
{
    dragarc_scenario s;
    dragarc_scenario_default(&s);
    s.launch.speed = 20.0, s.launch.elevation = 50.0 * PI / 180.0, s.launch.height = 0.0;
    enum { N = 241 }; /* odd: the middle point is at T / 2, the apex */
    double x[N], h[N];
    CHECK(dragarc_vacuum_path(&s, N, x, h) == N);
    double v = 20.0, e = 50.0 * PI / 180.0, g = s.gravity;
    double R = v * v * sin(2.0 * e) / g, H = v * v * sin(e) * sin(e) / (2.0 * g);
    CHECK_REL(x[N - 1], R, 1e-12);
    CHECK_REL(x[N - 1], dragarc_vacuum_range(&s), 1e-12); /* flight.c works it out apart */
    CHECK_ABS(h[N - 1], 0.0, 0.0);
    CHECK_REL(h[N / 2], H, 1e-12);
    CHECK_REL(x[N / 2], R / 2.0, 1e-12);
    double top = 0.0;
    for (int i = 0; i < N; i++)
        top = fmax(top, h[i]);
    CHECK(top == h[N / 2]);
    /* from a height above the ground plane: lands where h0 + v sin(e) t - g t^2 / 2 = 0 */
    s.launch.height = 12.0, s.ground_elevation = 2.0;
    CHECK(dragarc_vacuum_path(&s, N, x, h) == N);
    CHECK_ABS(h[0], 10.0, 1e-12);
    double T = (v * sin(e) + sqrt(v * v * sin(e) * sin(e) + 2.0 * g * 10.0)) / g;
    CHECK_REL(x[N - 1], v * cos(e) * T, 1e-12);
    CHECK_REL(x[N - 1], dragarc_vacuum_range(&s), 1e-12);
    /* thrown down from below the ground plane: it never reaches it */
    s.launch.height = -1.0, s.ground_elevation = 0.0, s.launch.elevation = -0.5;
    CHECK(dragarc_vacuum_path(&s, N, x, h) == 0);
    dragarc_scenario_clear(&s);
}

/* A small figure: two panels, a line, a dashed line, markers and an arrow. */
static double fx[50], fy[50], gy[50], mx = 20.0, my = 5.0;
static dragarc_plot_series two[3], one[1];
static dragarc_plot_arrow arrow = {.dx = 1.0, .dy = -1.0, .label = "wind", .colour = DRAGARC_PLOT_BLACK};
static dragarc_plot_panel panels[2];

static dragarc_plot_figure small_figure(void)
{
    for (int i = 0; i < 50; i++)
        fx[i] = i, fy[i] = 10.0 * sin(PI * i / 49.0), gy[i] = 12.0 * sin(PI * i / 49.0);
    two[0] = (dragarc_plot_series){.label = "a", .x = fx, .y = fy, .n = 50, .colour = DRAGARC_PLOT_BLUE};
    two[1] = (dragarc_plot_series){.label = "b", .x = fx, .y = gy, .n = 50, .style = DRAGARC_PLOT_DASHED,
                                   .colour = DRAGARC_PLOT_VERMILLION};
    two[2] = (dragarc_plot_series){.label = "c", .x = &mx, .y = &my, .n = 1, .style = DRAGARC_PLOT_MARKERS,
                                   .marker = DRAGARC_PLOT_DIAMOND};
    one[0] = (dragarc_plot_series){.x = fx, .y = gy, .n = 50, .style = DRAGARC_PLOT_DOTTED};
    panels[0] = (dragarc_plot_panel){.title = "first", .xlabel = "x (m)", .ylabel = "y (m)", .series = two,
                                     .nseries = 3, .equal_scale = 1};
    panels[1] = (dragarc_plot_panel){.title = "second", .xlabel = "x", .ylabel = "y", .series = one, .nseries = 1,
                                     .y_reversed = 1, .arrow = &arrow};
    return (dragarc_plot_figure){.panels = panels, .npanels = 2};
}

TEST(each_format_is_written_whole_with_its_signature)
{
    dragarc_plot_figure fig = small_figure();
    static const char *const ext[3] = {"svg", "png", "pdf"};
    static const char *const magic[3] = {"<?xml", "\x89PNG\r\n\x1a\n", "%PDF-"};
    for (int k = 0; k < 3; k++) {
        char path[128];
        snprintf(path, sizeof path, "%s/figure.%s", dir, ext[k]);
        dragarc_error e;
        int rc = dragarc_plot_write(path, &fig, &e);
        CHECK(rc == DRAGARC_OK);
        if (rc != DRAGARC_OK)
            printf("  %s\n", e.message);
        unsigned char buf[8];
        long size = head(path, buf, strlen(magic[k]));
        CHECK(size > 5000 && size < 5000000); /* a page of lines and text, not empty, not runaway */
        CHECK(size > 0 && memcmp(buf, magic[k], strlen(magic[k])) == 0);
        CHECK(entries() == k + 1); /* no temporary file left beside it */
    }
    for (int k = 0; k < 3; k++) {
        char path[128];
        snprintf(path, sizeof path, "%s/figure.%s", dir, ext[k]);
        remove(path);
    }
}

TEST(failures_leave_no_file)
{
    dragarc_plot_figure fig = small_figure();
    dragarc_error e;
    char path[128];
    snprintf(path, sizeof path, "%s/no/such/folder/figure.svg", dir);
    CHECK_ERROR(dragarc_plot_write(path, &fig, &e), DRAGARC_EIO, e, "", "No such file or directory");
    snprintf(path, sizeof path, "%s/figure.gif", dir);
    CHECK_ERROR(dragarc_plot_write(path, &fig, &e), DRAGARC_EINVAL, e, "", "ends in '.gif'");
    CHECK_ERROR(dragarc_plot_write("-", &fig, &e), DRAGARC_EINVAL, e, "", "has no extension");
    /* a panel with nothing finite to draw */
    double nan = NAN;
    dragarc_plot_series bad = {.x = &nan, .y = &nan, .n = 1};
    dragarc_plot_panel p = {.title = "empty", .series = &bad, .nseries = 1};
    dragarc_plot_figure empty = {.panels = &p, .npanels = 1};
    snprintf(path, sizeof path, "%s/figure.png", dir);
    CHECK_ERROR(dragarc_plot_write(path, &empty, &e), DRAGARC_EINVAL, e, "", "panel 1 ('empty') has no finite point");
    dragarc_plot_figure none = {.panels = NULL, .npanels = 0};
    CHECK_ERROR(dragarc_plot_write(path, &none, &e), DRAGARC_EINVAL, e, "", "a figure needs 1 to");
    CHECK(entries() == 0);
}

TEST(a_file_in_place_is_replaced_only_when_the_new_one_is_complete)
{
    char path[128];
    snprintf(path, sizeof path, "%s/kept.pdf", dir);
    FILE *f = fopen(path, "w");
    CHECK(f != NULL);
    if (!f)
        return;
    fputs("old", f);
    fclose(f);
    double nan = NAN;
    dragarc_plot_series bad = {.x = &nan, .y = &nan, .n = 1};
    dragarc_plot_panel p = {.title = "empty", .series = &bad, .nseries = 1};
    dragarc_plot_figure empty = {.panels = &p, .npanels = 1};
    CHECK(dragarc_plot_write(path, &empty, NULL) == DRAGARC_EINVAL);
    unsigned char buf[3];
    CHECK(head(path, buf, 3) == 3 && memcmp(buf, "old", 3) == 0);
    dragarc_plot_figure fig = small_figure();
    CHECK(dragarc_plot_write(path, &fig, NULL) == DRAGARC_OK);
    unsigned char pdf[5];
    CHECK(head(path, pdf, 5) > 5000 && memcmp(pdf, "%PDF-", 5) == 0);
    CHECK(entries() == 1);
    remove(path);
}

TEST(a_flight_plot_needs_samples)
{
    dragarc_scenario s;
    dragarc_scenario_default(&s);
    dragarc_flight f;
    memset(&f, 0, sizeof f);
    dragarc_error e;
    char path[128];
    snprintf(path, sizeof path, "%s/flight.svg", dir);
    CHECK_ERROR(dragarc_flight_plot(path, &s, &f, NULL, NULL, &e), DRAGARC_EINVAL, e, "", "needs a sampled flight");
    CHECK(entries() == 0);
    dragarc_scenario_clear(&s);
}

TEST(spray_plots_need_a_result_with_something_to_draw)
{
    dragarc_sprinkler_spec sp;
    dragarc_sprinkler_result sr;
    dragarc_drift_spec dp;
    dragarc_drift_result dr;
    memset(&sp, 0, sizeof sp), memset(&sr, 0, sizeof sr), memset(&dp, 0, sizeof dp), memset(&dr, 0, sizeof dr);
    dragarc_error e;
    char path[128];
    snprintf(path, sizeof path, "%s/spray.svg", dir);
    CHECK_ERROR(dragarc_sprinkler_plot(path, &sp, &sr, NULL, &e), DRAGARC_EINVAL, e, "", "needs a computed pattern");
    CHECK_ERROR(dragarc_drift_plot(path, &dp, NULL, &dr, NULL, &e), DRAGARC_EINVAL, e, "", "nothing deposits");
    CHECK(entries() == 0);
}

/* A map: a colour map with a cell left blank, two rings in one series separated by NaN, a filled area, markers, a
 * scale bar and a north arrow, on a page of its own height. */
TEST(a_map_with_a_colour_map_rings_and_a_filled_area)
{
    enum { NX = 24, NY = 16 };
    static double z[NX * NY], rx[2 * 41 + 1], ry[2 * 41 + 1];
    for (int j = 0; j < NY; j++)
        for (int i = 0; i < NX; i++)
            z[j * NX + i] = (i == 2 && j == 2) ? NAN : (double)(i + j);
    int k = 0;
    for (int ring = 1; ring <= 2; ring++) {
        for (int i = 0; i <= 40; i++, k++)
            rx[k] = 30.0 * ring * cos(2.0 * PI * i / 40.0), ry[k] = 20.0 * ring * sin(2.0 * PI * i / 40.0);
        if (ring == 1)
            rx[k] = ry[k] = NAN, k++;
    }
    double hx[4] = {-40, 40, 40, -40}, hy[4] = {-70, -70, -50, -50}, px = 5.0, py = 5.0;
    dragarc_plot_series s[3] = {
        {.label = "rings", .x = rx, .y = ry, .n = (size_t)k, .style = DRAGARC_PLOT_DASHED, .colour = DRAGARC_PLOT_VERMILLION},
        {.label = "area", .x = hx, .y = hy, .n = 4, .style = DRAGARC_PLOT_FILLED, .colour = DRAGARC_PLOT_ORANGE},
        {.label = "point", .x = &px, .y = &py, .n = 1, .style = DRAGARC_PLOT_MARKERS},
    };
    dragarc_plot_raster r = {.z = z, .nx = NX, .ny = NY, .x0 = -120, .x1 = 120, .y0 = -80, .y1 = 80,
                             .label = "value (units)"};
    dragarc_plot_panel p = {.title = "map", .xlabel = "east (m)", .ylabel = "north (m)", .series = s, .nseries = 3,
                            .equal_scale = 1, .raster = &r, .scale_bar_unit = "m", .north_arrow = 1};
    dragarc_plot_figure fig = {.panels = &p, .npanels = 1, .page_height = 560.0};
    char path[128];
    snprintf(path, sizeof path, "%s/map.svg", dir);
    dragarc_error e;
    int rc = dragarc_plot_write(path, &fig, &e);
    check_svg_written(rc, &e, path);
    /* the page is 600 x 560 points, as asked */
    FILE *f = fopen(path, "r");
    char text[4096] = "";
    if (f) {
        size_t got = fread(text, 1, sizeof text - 1, f);
        text[got] = '\0';
        fclose(f);
    }
    CHECK(strstr(text, "width=\"600pt\"") != NULL && strstr(text, "height=\"560pt\"") != NULL);
    remove(path);
    /* refused: a page out of bounds, a raster with no cells or reversed limits */
    fig.page_height = 100.0;
    CHECK_ERROR(dragarc_plot_write(path, &fig, &e), DRAGARC_EINVAL, e, "", "a page is 200 to 3000 points high");
    fig.page_height = 0.0;
    r.nx = 0;
    CHECK_ERROR(dragarc_plot_write(path, &fig, &e), DRAGARC_EINVAL, e, "", "the colour map needs cells");
    r.nx = NX, r.x1 = r.x0;
    CHECK_ERROR(dragarc_plot_write(path, &fig, &e), DRAGARC_EINVAL, e, "", "the colour map needs cells");
    CHECK(entries() == 0);
}

TEST(a_family_of_curves_never_repeats_a_look_within_eighteen)
{
    dragarc_plot_series a, b;
    for (size_t k = 0; k < 18; k++) {
        dragarc_plot_family_look(k, &a);
        CHECK(a.style != DRAGARC_PLOT_MARKERS && a.style != DRAGARC_PLOT_FILLED);
        CHECK(a.colour != DRAGARC_PLOT_BLACK && a.colour != DRAGARC_PLOT_YELLOW);
        for (size_t j = 0; j < k; j++) {
            dragarc_plot_family_look(j, &b);
            CHECK(a.colour != b.colour || a.style != b.style);
            if (j + 1 == k)
                CHECK(a.colour != b.colour && a.style != b.style); /* neighbours differ in both */
        }
    }
}

/* A drag-free ball from the ground, 20 m/s, g = 9.81: the target at R = 30 m is reached at the two elevations of
 * sin(2e) = g R / v^2 (e = 23.71 and 66.29 degrees; the closed form of the vacuum range, e.g. Halliday, Resnick and
 * Walker, "Fundamentals of Physics", projectile motion; recalled). The picture's flights are flown again from the
 * solutions: they must land on the target as the solver's did (its miss is below 1 mm, the integration's
 * tolerance 1e-10 adds nothing near that), and climb to the closed-form apex v^2 sin^2(e) / (2 g) (1e-6 m: the
 * solver's elevation is good to far better than the 1 mm miss allows, 1e-6 rad moves the apex ~1e-5 m; 1e-4 m). */
TEST(an_aim_plot_draws_each_solution_flown_onto_the_target)
{
    dragarc_scenario s;
    make_scenario(&s, 0.0, 0.1, 0.05, 0.0, 20.0, 45.0, 9.81, 1e-10);
    dragarc_aim_request req;
    dragarc_aim_request_default(&req);
    req.range = 30.0;
    dragarc_aim_result r;
    dragarc_error e;
    CHECK(dragarc_aim_solve(&s, &req, &r, &e) == DRAGARC_OK && r.nsolutions == 2);
    double e1 = 0.5 * asin(9.81 * 30.0 / 400.0);
    for (size_t k = 0; k < r.nsolutions && r.nsolutions == 2; k++) {
        double want = k == 0 ? e1 : 0.5 * PI - e1;
        CHECK(fabs(r.solutions[k].elevation - want) < 1e-5);
        dragarc_flight f;
        CHECK(dragarc_aim_solution_fly(&s, &req, &r.solutions[k], r.solutions[k].time_of_flight / 100.0, &f, &e) ==
              DRAGARC_OK);
        CHECK(f.npoints >= 100);
        CHECK(fabs(f.impact[1] - 30.0) < 1e-3 && fabs(f.impact[0]) < 1e-3 && fabs(f.impact[2]) < 1e-9);
        double apex = 400.0 * pow(sin(r.solutions[k].elevation), 2) / (2.0 * 9.81);
        CHECK(fabs(f.apex_height - apex) < 1e-4);
        dragarc_flight_clear(&f);
    }
    /* a raised target plane: the flights end on it, not on the ground */
    dragarc_aim_request up = req;
    up.height = 2.0;
    dragarc_aim_result ru;
    CHECK(dragarc_aim_solve(&s, &up, &ru, &e) == DRAGARC_OK && ru.nsolutions == 2);
    dragarc_flight f;
    CHECK(dragarc_aim_solution_fly(&s, &up, &ru.solutions[1], 0.01, &f, &e) == DRAGARC_OK);
    CHECK(fabs(f.impact[2] - 2.0) < 1e-9 && fabs(f.impact[1] - 30.0) < 1e-3);
    dragarc_flight_clear(&f);

    char path[128];
    snprintf(path, sizeof path, "%s/aim.svg", dir);
    CHECK(dragarc_aim_plot(path, &s, &req, &r, NULL, "vacuum lob", &e) == DRAGARC_OK);
    CHECK(entries() == 1);
    remove(path);
    dragarc_aim_result none = r;
    none.nsolutions = 0;
    CHECK_ERROR(dragarc_aim_plot(path, &s, &req, &none, NULL, NULL, &e), DRAGARC_EINVAL, e, "", "at least one solution");
    CHECK(entries() == 0);
    dragarc_scenario_clear(&s);
}

TEST(a_table_plot_draws_two_parameters_and_refuses_what_it_cannot_show)
{
    dragarc_scenario s;
    make_scenario(&s, 0.0, 0.1, 0.05, 0.0, 20.0, 45.0, 9.81, 1e-8);
    dragarc_sweep_axis ax[3];
    dragarc_error e;
    CHECK(dragarc_sweep_axis_init(&ax[0], "speed", 10.0, 30.0, 5.0, &e) == DRAGARC_OK);
    CHECK(dragarc_sweep_axis_init(&ax[1], "elevation", 15.0, 45.0, 15.0, &e) == DRAGARC_OK);
    CHECK(dragarc_sweep_axis_init(&ax[2], "height", 0.0, 1.0, 1.0, &e) == DRAGARC_OK);
    dragarc_sweep t, t3, wide;
    CHECK(dragarc_sweep_run(&s, ax, 2, &t, &e) == DRAGARC_OK && t.nrows == 15);
    char path[128];
    snprintf(path, sizeof path, "%s/table.png", dir);
    CHECK(dragarc_sweep_plot(path, &t, DRAGARC_SWEEP_RANGE, NULL, NULL, &e) == DRAGARC_OK);
    CHECK(dragarc_sweep_plot(path, &t, DRAGARC_SWEEP_IMPACT_ANGLE, NULL, "angles", &e) == DRAGARC_OK);
    CHECK(entries() == 1);
    remove(path);
    /* a third parameter, too many curves, no such column: refused, no file */
    CHECK(dragarc_sweep_run(&s, ax, 3, &t3, &e) == DRAGARC_OK);
    CHECK_ERROR(dragarc_sweep_plot(path, &t3, DRAGARC_SWEEP_RANGE, NULL, NULL, &e), DRAGARC_EINVAL, e, "", "not 3");
    dragarc_sweep_axis many[2] = {ax[0]};
    CHECK(dragarc_sweep_axis_init(&many[1], "elevation", 10.0, 55.0, 5.0, &e) == DRAGARC_OK && many[1].count == 10);
    CHECK(dragarc_sweep_run(&s, many, 2, &wide, &e) == DRAGARC_OK);
    CHECK_ERROR(dragarc_sweep_plot(path, &wide, DRAGARC_SWEEP_RANGE, NULL, NULL, &e), DRAGARC_EINVAL, e, "",
                "at most 9; elevation has 10");
    CHECK_ERROR(dragarc_sweep_plot(path, &t, DRAGARC_SWEEP_NCOLUMNS, NULL, NULL, &e), DRAGARC_EINVAL, e, "",
                "no table column");
    /* no row flew: nothing to draw */
    for (size_t i = 0; i < t.nrows; i++) {
        t.rows[i].status = DRAGARC_EINVAL;
        t.rows[i].range = NAN;
    }
    CHECK_ERROR(dragarc_sweep_plot(path, &t, DRAGARC_SWEEP_RANGE, NULL, NULL, &e), DRAGARC_EINVAL, e, "",
                "no row of the table flew");
    CHECK(entries() == 0);
    dragarc_sweep_clear(&t);
    dragarc_sweep_clear(&t3);
    dragarc_sweep_clear(&wide);
    dragarc_scenario_clear(&s);
}

TEST(an_aim_table_plot_needs_a_range_reached)
{
    dragarc_scenario s;
    make_scenario(&s, 0.0, 0.1, 0.05, 0.0, 20.0, 45.0, 9.81, 1e-8);
    dragarc_aim_request req;
    dragarc_aim_request_default(&req);
    const double ranges[4] = {10.0, 20.0, 40.0, 50.0}; /* the vacuum maximum is v^2 / g = 40.77 m */
    dragarc_aim_table_row rows[4];
    dragarc_error e;
    CHECK(dragarc_aim_table(&s, &req, ranges, 4, rows, &e) == DRAGARC_OK);
    CHECK(rows[0].status == DRAGARC_OK && rows[3].status == DRAGARC_ENOSOLUTION);
    char path[128];
    snprintf(path, sizeof path, "%s/aim-table.pdf", dir);
    CHECK(dragarc_aim_table_plot(path, s.name, rows, 4, NULL, &e) == DRAGARC_OK);
    CHECK(entries() == 1);
    remove(path);
    CHECK_ERROR(dragarc_aim_table_plot(path, s.name, rows + 3, 1, NULL, &e), DRAGARC_EINVAL, e, "",
                "no range of the aim table was reached");
    CHECK(entries() == 0);
    dragarc_scenario_clear(&s);
}

/* Small markers (a cloud of impact points) are drawn; a marker size that is not a number, or over 20 mm, is
 * refused before anything is written. */
TEST(markers_take_their_size_and_a_bad_size_is_refused)
{
    double x[3] = {0, 1, 2}, y[3] = {0, 1, 0};
    dragarc_plot_series s = {.label = "dots", .x = x, .y = y, .n = 3, .style = DRAGARC_PLOT_MARKERS,
                             .marker = DRAGARC_PLOT_CROSS, .marker_size = 0.45};
    dragarc_plot_panel p = {.title = "dots", .series = &s, .nseries = 1};
    dragarc_plot_figure fig = {.panels = &p, .npanels = 1};
    char path[128];
    snprintf(path, sizeof path, "%s/dots.png", dir);
    dragarc_error e;
    CHECK(dragarc_plot_write(path, &fig, &e) == DRAGARC_OK);
    CHECK(entries() == 1);
    remove(path);
    s.marker_size = NAN;
    CHECK_ERROR(dragarc_plot_write(path, &fig, &e), DRAGARC_EINVAL, e, "", "a marker size outside 0 to 20 mm");
    s.marker_size = 25.0;
    CHECK_ERROR(dragarc_plot_write(path, &fig, &e), DRAGARC_EINVAL, e, "", "a marker size outside 0 to 20 mm");
    CHECK(entries() == 0);
}

/* The footprint figure of a run made by hand: nothing landed is refused and writes nothing; three landed samples
 * (one above the hazard energy) without ellipses or a grid still make a complete file, and the impacts and the
 * summary are not touched. */
TEST(a_footprint_plot_needs_a_landing_and_changes_nothing)
{
    dragarc_footprint_spec spec;
    memset(&spec, 0, sizeof spec);
    dragarc_fragment_class cls;
    memset(&cls, 0, sizeof cls);
    snprintf(cls.name, sizeof cls.name, "plate");
    spec.classes = &cls, spec.nclasses = 1, spec.samples = 3;
    spec.hazard.energy_threshold = 50.0;
    dragarc_impact im[3];
    memset(im, 0, sizeof im);
    for (int k = 0; k < 3; k++)
        im[k] = (dragarc_impact){.cls = 0, .sample = (uint32_t)k, .status = DRAGARC_ENOLAND, .weight = 1.0,
                                 .east = 100.0 * k, .north = -50.0 * k, .energy = 30.0 * k};
    dragarc_footprint_group groups[2];
    memset(groups, 0, sizeof groups);
    dragarc_footprint_summary sum;
    memset(&sum, 0, sizeof sum);
    sum.ngroups = 2, sum.groups = groups;
    char path[128];
    snprintf(path, sizeof path, "%s/footprint.svg", dir);
    dragarc_error e;
    CHECK_ERROR(dragarc_footprint_plot(path, &spec, im, &sum, NULL, &e), DRAGARC_EINVAL, e, "", "no fragment landed");
    CHECK(entries() == 0);
    for (int k = 0; k < 3; k++)
        im[k].status = DRAGARC_OK;
    dragarc_impact before[3];
    memcpy(before, im, sizeof im);
    dragarc_footprint_plot_options o = {.title = "by hand"};
    int rc = dragarc_footprint_plot(path, &spec, im, &sum, &o, &e);
    check_svg_written(rc, &e, path);
    CHECK(memcmp(before, im, sizeof im) == 0 && sum.ngroups == 2 && !sum.grid_ok);
    CHECK(entries() == 1);
    remove(path);
}

int main(void)
{
    dragarc_init();
    snprintf(dir, sizeof dir, "%s/test_plot.XXXXXX", getenv("TMPDIR") ? getenv("TMPDIR") : "/tmp");
    if (!mkdtemp(dir)) {
        perror("mkdtemp");
        return 2;
    }
    RUN(formats_follow_the_extension_in_any_case);
    RUN(the_palette_is_okabe_and_ito);
    RUN(the_vacuum_path_meets_the_closed_forms);
    RUN(each_format_is_written_whole_with_its_signature);
    RUN(failures_leave_no_file);
    RUN(a_file_in_place_is_replaced_only_when_the_new_one_is_complete);
    RUN(a_flight_plot_needs_samples);
    RUN(spray_plots_need_a_result_with_something_to_draw);
    RUN(a_map_with_a_colour_map_rings_and_a_filled_area);
    RUN(a_family_of_curves_never_repeats_a_look_within_eighteen);
    RUN(an_aim_plot_draws_each_solution_flown_onto_the_target);
    RUN(a_table_plot_draws_two_parameters_and_refuses_what_it_cannot_show);
    RUN(an_aim_table_plot_needs_a_range_reached);
    RUN(markers_take_their_size_and_a_bad_size_is_refused);
    RUN(a_footprint_plot_needs_a_landing_and_changes_nothing);
    rmdir(dir);
    return check_summary();
}
