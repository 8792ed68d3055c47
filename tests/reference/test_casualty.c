/* test_casualty.c: the casualty area of a fragment and a standing person against hand arithmetic from the
 * published equation; the casualty expectation on a uniform density (closed form) and on a small grid (by
 * hand); sheltering; the hazardous-energy threshold; the population grid reader and each of its refusals.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources: the basic casualty area A_C = pi (R_P + R_F)^2 = (sqrt(A_P) + sqrt(A_F))^2 of a fragment falling
 * on a standing person, the person 1 ft in radius and 6 ft tall (recalled: Range Commanders Council, Common
 * Risk Criteria Standards for National Test Ranges, RCC 321, Supplement; FAA, Flight Safety Analysis
 * Handbook, version 1.0, 2011); the oblique term 2 (R_P + R_F) H_P cot(gamma) is plane geometry (the disc of
 * radius R_P + R_F swept by the run H_P cot(gamma); docs/models.md). The hazard threshold 11 ft lbf: 14 CFR
 * 417.107(c)(1) ("kinetic energy of 11 ft-lbs or greater", verified in the 2018 edition of the CFR); the
 * conversion 1 ft lbf = 1.355818 J: NIST SP 811, 2008, Appendix B.9 (recalled). 15 J: the threshold NASA
 * applies to reentering debris (NASA-STD-8719.14, requirement 4.7-1, recalled; also quoted by Argentina's
 * SINAGIR page on space debris, verified).
 *
 * Tolerances: the hand values are products and sums of a few decimal numbers; the library reaches them in a
 * handful of double operations, each within 2^-53 = 1.1e-16 relative, so 1e-12 relative catches any wrong
 * term with a wide margin. The NIST factor has 7 significant digits, so the 11 ft lbf default is checked to
 * 1e-6 relative.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "dragarc/casualty.h"
#include "dragarc/population.h"

#define PI 3.14159265358979323846
#define EXACT 1e-12

static const dragarc_person PERSON = {DRAGARC_PERSON_RADIUS, DRAGARC_PERSON_HEIGHT};

/* ---- casualty area ------------------------------------------------------------------------------ */

/* A 10 cm x 10 cm plate, A_F = 0.01 m^2, on the default person (R_P = 0.3048 m, H_P = 1.8288 m):
 *   R_F = sqrt(0.01 / pi) = 0.0564189584 m,  R = R_P + R_F = 0.3612189584 m,  R^2 = 0.1304791359 m^2
 *   straight down:  A_C = pi R^2 = 0.4099122947 m^2
 *   the other form: sqrt(A_P) = 0.3048 sqrt(pi) = 0.5402439338 m,  (0.5402439338 + 0.1)^2 = 0.4099122947 m^2
 *   45 degrees:     + 2 R H_P cot(45) = 2 x 0.3612189584 x 1.8288 = 1.3211944621 m^2,  A_C = 1.7311067568 m^2
 *   30 degrees:     + 2 R H_P sqrt(3) = 2.2883759350 m^2,  A_C = 2.6982882297 m^2 */
TEST(a_plate_on_the_default_person_has_its_hand_casualty_area)
{
    CHECK(dragarc_person_check(&PERSON, NULL) == DRAGARC_OK);
    CHECK_REL(dragarc_fragment_radius(0.01), 0.0564189584, 1e-9);
    double down = dragarc_casualty_area(0.01, &PERSON, 0.5 * PI);
    CHECK_REL(down, 0.4099122947, 1e-9); /* 10 digits by hand */
    CHECK_REL(down, pow(0.3048 * sqrt(PI) + 0.1, 2.0), EXACT);
    CHECK_REL(dragarc_casualty_area(0.01, &PERSON, 0.25 * PI), 1.7311067568, 1e-9);
    CHECK_REL(dragarc_casualty_area(0.01, &PERSON, PI / 6.0), 2.6982882297, 1e-9);
    /* a point fragment leaves the person's own disc: pi 0.3048^2 = 0.2918635 m^2 */
    CHECK_REL(dragarc_casualty_area(0.0, &PERSON, 0.5 * PI), PI * 0.3048 * 0.3048, EXACT);
}

/* NASA's person of 0.36 m^2 seen from above (recalled, NASA-STD-8719.14) is a disc of radius sqrt(0.36 / pi);
 * with the same plate (sqrt(0.36) + sqrt(0.01))^2 = (0.6 + 0.1)^2 = 0.49 m^2. */
TEST(a_person_of_0_36_square_metres_gives_0_49_with_the_plate)
{
    const dragarc_person nasa = {sqrt(0.36 / PI), DRAGARC_PERSON_HEIGHT};
    CHECK_REL(dragarc_casualty_area(0.01, &nasa, 0.5 * PI), 0.49, EXACT);
}

TEST(casualty_areas_outside_their_domain_are_nan_and_bad_people_are_refused)
{
    CHECK(isnan(dragarc_casualty_area(-0.01, &PERSON, 0.5 * PI)));
    CHECK(isnan(dragarc_casualty_area(NAN, &PERSON, 0.5 * PI)));
    CHECK(isnan(dragarc_casualty_area(0.01, &PERSON, 0.0)));
    CHECK(isnan(dragarc_casualty_area(0.01, &PERSON, 0.6 * PI)));
    dragarc_error err;
    const dragarc_person flat = {0.3, 0.0}, none = {-1.0, 1.8};
    CHECK(dragarc_person_check(&flat, &err) == DRAGARC_EINVAL && strcmp(err.field, "height") == 0);
    CHECK(dragarc_person_check(&none, &err) == DRAGARC_EINVAL && strcmp(err.field, "radius") == 0);
}

/* ---- energy ------------------------------------------------------------------------------------- */

/* 11 ft lbf = 11 x 0.3048 m x 4.4482216152605 N = 14.913997 J; NIST SP 811: 11 x 1.355818 J = 14.913998 J. */
TEST(the_default_threshold_is_11_foot_pounds_force)
{
    CHECK_REL(DRAGARC_HAZARD_ENERGY_DEFAULT, 11.0 * 1.355818, 1e-6);
    CHECK_REL(dragarc_kinetic_energy(0.2, 12.2), 14.884, EXACT); /* 0.5 x 0.2 x 148.84 */
    CHECK(!dragarc_fragment_is_hazardous(dragarc_kinetic_energy(0.2, 12.2), DRAGARC_HAZARD_ENERGY_DEFAULT));
    CHECK(dragarc_fragment_is_hazardous(DRAGARC_HAZARD_ENERGY_DEFAULT, DRAGARC_HAZARD_ENERGY_DEFAULT));
    CHECK(!dragarc_fragment_is_hazardous(nextafter(DRAGARC_HAZARD_ENERGY_DEFAULT, 0.0),
                                         DRAGARC_HAZARD_ENERGY_DEFAULT));
}

/* 15 J set by the user: 1.875 kg at 4 m/s carries 0.5 x 1.875 x 16 = 15 J exactly and counts ("or
 * greater"); 1.875 kg at 3.999 m/s carries 0.9375 x 15.992001 = 14.9925009375 J and does not. */
TEST(fifteen_joules_is_hazardous_at_a_15_joule_threshold_and_just_below_is_not)
{
    CHECK(dragarc_kinetic_energy(1.875, 4.0) == 15.0);
    CHECK(dragarc_fragment_is_hazardous(dragarc_kinetic_energy(1.875, 4.0), 15.0));
    CHECK_REL(dragarc_kinetic_energy(1.875, 3.999), 14.9925009375, EXACT);
    CHECK(!dragarc_fragment_is_hazardous(dragarc_kinetic_energy(1.875, 3.999), 15.0));
}

/* ---- casualty expectation ----------------------------------------------------------------------- */

/* Uniform 250 people/km^2 = 2.5e-4 per m^2, three hazardous points:
 *   E_c = 2.5e-4 (0.25 x 0.41 + 1.5 x 2 + 3 x 0.8) = 2.5e-4 x 5.5025 = 1.375625e-3 */
TEST(on_a_uniform_density_e_c_is_the_density_times_the_weighted_casualty_areas)
{
    dragarc_population pop;
    CHECK(dragarc_population_uniform(&pop, 250.0, NULL) == DRAGARC_OK);
    const dragarc_impact_point pts[3] = {
        {10.0, -3.0, 0.25, 0.41, 100.0}, {-2000.0, 5e4, 1.5, 2.0, 15.0}, {0.0, 0.0, 3.0, 0.8, 1e6}};
    const dragarc_casualty_options opt = DRAGARC_CASUALTY_OPTIONS_DEFAULT;
    dragarc_casualty_result r;
    double each[3];
    CHECK(dragarc_casualty_expectation(pts, 3, &pop, &opt, each, &r, NULL) == DRAGARC_OK);
    CHECK_REL(r.expected_casualties, 1.375625e-3, EXACT);
    CHECK_REL(each[0], 2.5e-4 * 0.1025, EXACT);
    CHECK_REL(each[1], 2.5e-4 * 3.0, EXACT);
    CHECK_REL(each[2], 2.5e-4 * 2.4, EXACT);
    CHECK_REL(r.fragments, 4.75, EXACT);
    CHECK(r.hazardous_fragments == r.fragments && r.hazardous_share == 1.0);
    dragarc_population_clear(&pop);
}

/* The grid of tests/data/population/grid.csv (invented): centres east 0, 100, 200 and north 0, 50, so cells
 * [-50, 50) x [-25, 25) and so on; densities (people/km^2)
 *      north 50:  4000   12.5   800
 *      north  0:  1000   250    0
 * Points (east, north, weight, A_C):
 *   (10, 5, 2, 1.5)        cell (0, 0), 1000:  2 x 1e-3 x 1.5      = 3e-3
 *   (149.9, 60, 4, 2)      cell (1, 1), 12.5:  4 x 1.25e-5 x 2     = 1e-4
 *   (150, 25, 0.5, 3)      on two edges, the cell east and north of them (2, 1), 800:  0.5 x 8e-4 x 3 = 1.2e-3
 *   (250, 0, 1, 1)         on the grid's east edge: outside, background 0:            0
 *   (-50, -25, 1, 0.5)     on its south-west corner: inside, cell (0, 0), 1000:  1e-3 x 0.5 = 5e-4
 *   E_c = 3e-3 + 1e-4 + 1.2e-3 + 0 + 5e-4 = 4.8e-3; with a background of 10 people/km^2 the fourth point
 *   adds 1 x 1e-5 x 1 = 1e-5: 4.81e-3. */
TEST(on_the_example_grid_each_point_takes_its_cells_density_by_hand)
{
    dragarc_population pop;
    dragarc_error err;
    int rc = dragarc_population_read(DATA_DIR "/population/grid.csv", &pop, &err);
    CHECK(rc == DRAGARC_OK);
    if (rc != DRAGARC_OK) {
        printf("  %s: %s\n", err.field, err.message);
        return;
    }
    CHECK(pop.nx == 3 && pop.ny == 2 && pop.dx == 100.0 && pop.dy == 50.0 && pop.east0 == 0.0 && pop.north0 == 0.0);
    CHECK(pop.background == 0.0);
    const dragarc_impact_point pts[5] = {{10.0, 5.0, 2.0, 1.5, 20.0},
                                         {149.9, 60.0, 4.0, 2.0, 20.0},
                                         {150.0, 25.0, 0.5, 3.0, 20.0},
                                         {250.0, 0.0, 1.0, 1.0, 20.0},
                                         {-50.0, -25.0, 1.0, 0.5, 20.0}};
    const double want[5] = {3e-3, 1e-4, 1.2e-3, 0.0, 5e-4};
    const dragarc_casualty_options opt = DRAGARC_CASUALTY_OPTIONS_DEFAULT;
    dragarc_casualty_result r;
    double each[5];
    CHECK(dragarc_casualty_expectation(pts, 5, &pop, &opt, each, &r, NULL) == DRAGARC_OK);
    CHECK_REL(r.expected_casualties, 4.8e-3, EXACT);
    for (int i = 0; i < 5; i++)
        CHECK_ABS(each[i], want[i], EXACT * 1e-3);
    CHECK(dragarc_population_set_background(&pop, 10.0, NULL) == DRAGARC_OK);
    CHECK(dragarc_casualty_expectation(pts, 5, &pop, &opt, NULL, &r, NULL) == DRAGARC_OK);
    CHECK_REL(r.expected_casualties, 4.81e-3, EXACT);
    CHECK(dragarc_population_density(&pop, 1e300, NAN) == 10.0);
    CHECK(dragarc_population_set_background(&pop, -1.0, &err) == DRAGARC_EINVAL &&
          strcmp(err.field, "background") == 0);
    dragarc_population_clear(&pop);
    CHECK(pop.density == NULL && pop.nx == 0);
    dragarc_population_clear(NULL);
}

/* 60 % of the people under a roof that protects 3 in 4 of them: the density is scaled by 1 - 0.6 x 0.75 =
 * 0.55, and E_c with it. */
TEST(sheltering_scales_e_c_by_one_minus_share_times_protection)
{
    dragarc_population pop;
    CHECK(dragarc_population_uniform(&pop, 1000.0, NULL) == DRAGARC_OK);
    const dragarc_impact_point pts[2] = {{0.0, 0.0, 2.0, 0.5, 50.0}, {5.0, 5.0, 1.0, 1.0, 50.0}};
    dragarc_casualty_options opt = DRAGARC_CASUALTY_OPTIONS_DEFAULT;
    dragarc_casualty_result open, sheltered;
    CHECK(dragarc_casualty_expectation(pts, 2, &pop, &opt, NULL, &open, NULL) == DRAGARC_OK);
    CHECK_REL(open.expected_casualties, 1e-3 * 2.0, EXACT); /* 1e-3 x (2 x 0.5 + 1 x 1) */
    opt.sheltering = (dragarc_sheltering){0.6, 0.75};
    CHECK_REL(dragarc_sheltering_factor(&opt.sheltering), 0.55, EXACT);
    CHECK(dragarc_casualty_expectation(pts, 2, &pop, &opt, NULL, &sheltered, NULL) == DRAGARC_OK);
    CHECK_REL(sheltered.expected_casualties, 0.55 * 2e-3, EXACT);
    /* a roof that protects no one changes nothing */
    opt.sheltering = (dragarc_sheltering){1.0, 0.0};
    CHECK(dragarc_casualty_expectation(pts, 2, &pop, &opt, NULL, &sheltered, NULL) == DRAGARC_OK);
    CHECK(sheltered.expected_casualties == open.expected_casualties);
}

/* Two soft fragments (14.9 J, below 11 ft lbf; 0 J) add nothing; the hazardous share is by weight:
 * (1 + 3) / (1 + 2 + 3 + 0.5) = 4 / 6.5. With the threshold at 0 every point counts. */
TEST(fragments_below_the_hazard_energy_add_nothing)
{
    dragarc_population pop;
    CHECK(dragarc_population_uniform(&pop, 500.0, NULL) == DRAGARC_OK);
    const dragarc_impact_point pts[4] = {
        {0.0, 0.0, 1.0, 1.0, 30.0}, {0.0, 0.0, 2.0, 1.0, 14.9}, {0.0, 0.0, 3.0, 2.0, 14.914}, {0.0, 0.0, 0.5, 4.0, 0}};
    dragarc_casualty_options opt = DRAGARC_CASUALTY_OPTIONS_DEFAULT;
    dragarc_casualty_result r;
    double each[4];
    CHECK(dragarc_casualty_expectation(pts, 4, &pop, &opt, each, &r, NULL) == DRAGARC_OK);
    CHECK_REL(r.expected_casualties, 5e-4 * (1.0 + 6.0), EXACT);
    CHECK(each[1] == 0.0 && each[3] == 0.0);
    CHECK_REL(r.hazardous_share, 4.0 / 6.5, EXACT);
    opt.hazard_energy = 0.0;
    CHECK(dragarc_casualty_expectation(pts, 4, &pop, &opt, NULL, &r, NULL) == DRAGARC_OK);
    CHECK_REL(r.expected_casualties, 5e-4 * (1.0 + 2.0 + 6.0 + 2.0), EXACT);
    CHECK(r.hazardous_share == 1.0);
    /* no points: E_c 0, share 0 */
    CHECK(dragarc_casualty_expectation(pts, 0, &pop, &opt, NULL, &r, NULL) == DRAGARC_OK);
    CHECK(r.expected_casualties == 0.0 && r.hazardous_share == 0.0);
}

TEST(bad_points_and_options_are_refused_naming_the_field)
{
    dragarc_population pop;
    dragarc_error err;
    CHECK(dragarc_population_uniform(&pop, NAN, &err) == DRAGARC_EINVAL && strcmp(err.field, "density") == 0);
    CHECK(dragarc_population_uniform(&pop, 100.0, NULL) == DRAGARC_OK);
    dragarc_impact_point pts[3] = {{0, 0, 1, 1, 20}, {0, 0, 1, 1, 20}, {0, 0, 1, 1, 20}};
    dragarc_casualty_options opt = DRAGARC_CASUALTY_OPTIONS_DEFAULT;
    dragarc_casualty_result r;
    pts[2].weight = -1.0;
    CHECK(dragarc_casualty_expectation(pts, 3, &pop, &opt, NULL, &r, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "points[2].weight") == 0 && strstr(err.message, "not negative (got -1)"));
    pts[2].weight = 1.0;
    pts[1].north = INFINITY;
    CHECK(dragarc_casualty_expectation(pts, 3, &pop, &opt, NULL, &r, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "points[1].north") == 0);
    pts[1].north = 0.0;
    pts[0].casualty_area = NAN;
    CHECK(dragarc_casualty_expectation(pts, 3, &pop, &opt, NULL, &r, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "points[0].casualty_area") == 0);
    pts[0].casualty_area = 1.0;
    opt.hazard_energy = -1.0;
    CHECK(dragarc_casualty_expectation(pts, 3, &pop, &opt, NULL, &r, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "hazard_energy") == 0);
    opt.hazard_energy = 15.0;
    opt.sheltering.protection = 1.5;
    CHECK(dragarc_casualty_expectation(pts, 3, &pop, &opt, NULL, &r, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "sheltering.protection") == 0 && strstr(err.message, "within 0 to 1 (got 1.5)"));
}

/* The criteria of 14 CFR 450.101 (verified for (a)(1)(i) and (ii)); docs/models.md lists them with wording. */
TEST(the_published_criteria_are_listed_with_their_sources)
{
    size_t n;
    const dragarc_risk_reference *ref = dragarc_casualty_references(&n);
    CHECK(n == 3);
    CHECK(ref[0].limit == 1e-4 && strcmp(ref[0].source, "14 CFR 450.101(a)(1)(i)") == 0);
    CHECK(ref[1].limit == 2e-4 && strstr(ref[1].source, "(a)(1)(ii)"));
    CHECK(ref[2].limit == 1e-6 && strstr(ref[2].quantity, "individual"));
}

/* ---- the population grid reader --------------------------------------------------------------------- */

/* What spreadsheets write, and values written by programs with rounding: a byte-order mark, CR LF, names in
 * any case, quotes, blank lines, 0.1 m steps from 1e5 m. */
TEST(spreadsheet_exports_and_rounded_coordinates_read_as_a_grid)
{
    dragarc_population pop;
    dragarc_error err;
    const char *csv = "\xEF\xBB\xBF People_Per_Km2, \"EAST_M\" ,north_m\r\n"
                      "\r\n"
                      "1, 100000.1, -0.30000000000000004\r\n"
                      "2, 100000.0, -0.3\r\n"
                      "3, 100000.0, -0.2\r\n"
                      "4, 100000.10000000001, -0.2\r\n";
    int rc = dragarc_population_parse(csv, &pop, &err);
    CHECK(rc == DRAGARC_OK);
    if (rc != DRAGARC_OK) {
        printf("  %s: %s\n", err.field, err.message);
        return;
    }
    CHECK(pop.nx == 2 && pop.ny == 2);
    CHECK_REL(pop.dx, 0.1, 1e-6);
    CHECK_REL(pop.dy, 0.1, 1e-9);
    CHECK(dragarc_population_density(&pop, 100000.0, -0.3) == 2.0);
    CHECK(dragarc_population_density(&pop, 100000.1, -0.3) == 1.0);
    CHECK(dragarc_population_density(&pop, 100000.0, -0.2) == 3.0);
    CHECK(dragarc_population_density(&pop, 100000.1, -0.2) == 4.0);
    dragarc_population_clear(&pop);
}

/* A file refused by dragarc_population_read: the field names the file, the line and the column. */
static void refused_file(const char *name, const char *where, const char *text)
{
    char path[512], field[600];
    snprintf(path, sizeof path, "%s/population/%s", DATA_DIR, name);
    snprintf(field, sizeof field, "%s%s%s", path, where[0] ? ": " : "", where);
    dragarc_population pop;
    dragarc_error err;
    int rc = dragarc_population_read(path, &pop, &err);
    dragarc_population_clear(&pop);
    CHECK_ERROR(rc, DRAGARC_EINVAL, err, field, text);
}

TEST(each_bad_file_is_refused_naming_the_file_line_and_column)
{
    refused_file("irregular.csv", "line 4: east_m", "250 is not on the grid: the cells are 100 m apart from "
                 "east_m = 0, and 250 is 2.5 cells from there (irregular spacing)");
    refused_file("duplicate.csv", "line 6", "duplicate cell (east_m 0, north_m 0): line 2 gives it too");
    refused_file("negative.csv", "line 3: people_per_km2", "must not be negative (got -5 people per km^2)");
    refused_file("text-in-number.csv", "line 4: people_per_km2", "not a number ('ten')");
    refused_file("missing-column.csv", "line 1", "no north_m column: the header must name east_m, north_m, "
                 "people_per_km2");
    refused_file("empty.csv", "", "the file is empty: expected a header row naming the columns east_m, north_m, "
                 "people_per_km2, then one cell a row");
    refused_file("missing-cell.csv", "", "no cell at east_m 100, north_m 50: every cell of the 2 x 2 grid (100 m "
                 "east by 50 m north) must be given");
    /* a file that is not there: DRAGARC_EIO, the field the path alone */
    dragarc_population pop;
    dragarc_error err;
    CHECK(dragarc_population_read(DATA_DIR "/population/no-such-file.csv", &pop, &err) == DRAGARC_EIO);
    CHECK(strcmp(err.field, DATA_DIR "/population/no-such-file.csv") == 0 && strstr(err.message, "cannot open"));
}

/* Text refused by dragarc_population_parse, with its field and a part of its message. */
static void refused(const char *csv, const char *field, const char *text)
{
    dragarc_population pop;
    dragarc_error err;
    int rc = dragarc_population_parse(csv, &pop, &err);
    dragarc_population_clear(&pop);
    CHECK_ERROR(rc, DRAGARC_EINVAL, err, field, text);
}

#define HEAD "east_m,north_m,people_per_km2\n"

TEST(every_other_rule_is_refused_with_its_line_and_column)
{
    refused("", "", "the file is empty");
    refused(HEAD, "", "no cells: the header row is followed by no data rows");
    refused("east_m,north_m,people\n", "line 1", "unknown column 'people'");
    refused("east_m,north_m,East_M,people_per_km2\n", "line 1", "column 'east_m' appears twice");
    refused(HEAD "0,0,nan\n", "line 2: people_per_km2", "not a number ('nan')");
    refused(HEAD "0,0,inf\n", "line 2: people_per_km2", "not a number ('inf')");
    refused(HEAD "0,0,1e999\n", "line 2: people_per_km2", "not a number ('1e999')");
    refused(HEAD "0 m,0,1\n", "line 2: east_m", "not a number ('0 m')");
    refused(HEAD "0,,1\n", "line 2: north_m", "not a number ('')");
    refused(HEAD "0,0,1\n0,0\n", "line 3", "2 fields, but the header names 3 columns");
    refused(HEAD "0,0,1,5\n", "line 2", "4 fields, but the header names 3 columns (a decimal comma?");
    refused(HEAD "0,0,1\n0,50,1\n", "", "every cell has east_m = 0: a grid needs at least two cells in each "
            "direction");
    refused(HEAD "0,0,1\n100,0,1\n", "", "every cell has north_m = 0");
    refused(HEAD "0,0,1\n1,0,1\n5000000,0,1\n0,1,1\n", "", "the east_m values 0 to 5e+06 at a spacing of 1 m span "
            "more than 4000000 cells");
    refused(HEAD "0,0,1\n3000,0,1\n0,3000,1\n1,1,1\n", "", "the cells span a grid of 3001 x 3001, more than 4000000");
    refused(HEAD "0,0,1\n100,0,1\n0,100,1\n100,100,1\n200,0,1\n", "", "no cell at east_m 200, north_m 100");
}

int main(void)
{
    dragarc_init();
    RUN(a_plate_on_the_default_person_has_its_hand_casualty_area);
    RUN(a_person_of_0_36_square_metres_gives_0_49_with_the_plate);
    RUN(casualty_areas_outside_their_domain_are_nan_and_bad_people_are_refused);
    RUN(the_default_threshold_is_11_foot_pounds_force);
    RUN(fifteen_joules_is_hazardous_at_a_15_joule_threshold_and_just_below_is_not);
    RUN(on_a_uniform_density_e_c_is_the_density_times_the_weighted_casualty_areas);
    RUN(on_the_example_grid_each_point_takes_its_cells_density_by_hand);
    RUN(sheltering_scales_e_c_by_one_minus_share_times_protection);
    RUN(fragments_below_the_hazard_energy_add_nothing);
    RUN(bad_points_and_options_are_refused_naming_the_field);
    RUN(the_published_criteria_are_listed_with_their_sources);
    RUN(spreadsheet_exports_and_rounded_coordinates_read_as_a_grid);
    RUN(each_bad_file_is_refused_naming_the_file_line_and_column);
    RUN(every_other_rule_is_refused_with_its_line_and_column);
    return check_summary();
}
