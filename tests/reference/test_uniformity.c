/* test_uniformity.c: Christiansen's CU, the low-quarter DU and the statistics of catches against hand
 * arithmetic; one sprinkler's pattern overlapped on square, rectangular and triangular layouts against
 * closed forms; mass conservation; each validation rule.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources: CU = 100 (1 - sum |x_i - m| / (n m)), Christiansen, J. E. 1942, Irrigation by sprinkling, University
 * of California Agricultural Experiment Station Bulletin 670 (the formula as commonly quoted; recalled).
 * DU_lq = 100 (mean of the lowest quarter) / (mean), Merriam, J. L. and Keller, J. 1978, Farm irrigation
 * system evaluation (recalled); the fractional boundary catch when n is not a multiple of 4 is this
 * library's convention (common practice, no source; docs/uniformity.md). The sample standard deviation
 * (n - 1) and GSL's weighted form: GSL Reference Manual, Statistics, gsl_stats_sd and gsl_stats_wsd.
 *
 * Tolerances: the hand values are exact rationals (or their square roots); the library reaches them in a few
 * dozen double operations, each within 2^-53 = 1.1e-16 relative, so 1e-12 relative (or absolute on values
 * of order 1 to 100) leaves a wide margin and still catches any wrong term.
 */
#include <math.h>
#include <stdlib.h>

#include "check.h"
#include "dragarc/catch_data.h"
#include "dragarc/uniformity.h"

#define PI 3.14159265358979323846
#define EXACT 1e-12

/* ---- CU, DU and statistics against hand arithmetic ------------------------------------------------- */

/* Hand values of one set of catches (NAN: not worked out for this set). */
typedef struct hand {
    double mean, cu, low_quarter_mean, du_lq, sd;
} hand;

/* The uniformity of x (areas a, or NULL) against the hand values, each to EXACT (relative above 1); CV
 * against sd / mean. */
static void check_hand(const double *x, const double *a, size_t n, hand want, dragarc_uniformity *u)
{
    CHECK(dragarc_uniformity_compute(x, a, n, u, NULL) == DRAGARC_OK);
    const double got[5] = {u->mean, u->cu, u->low_quarter_mean, u->du_lq, u->sd};
    const double wanted[5] = {want.mean, want.cu, want.low_quarter_mean, want.du_lq, want.sd};
    static const char *const names[5] = {"mean", "cu", "low_quarter_mean", "du_lq", "sd"};
    for (int k = 0; k < 5; k++) {
        if (isnan(wanted[k]))
            continue;
        if (fabs(got[k] - wanted[k]) > EXACT * fmax(1.0, fabs(wanted[k])))
            printf("  %s = %.15g, want %.15g\n", names[k], got[k], wanted[k]);
        CHECK(fabs(got[k] - wanted[k]) <= EXACT * fmax(1.0, fabs(wanted[k])));
    }
    if (!isnan(want.sd) && !isnan(want.mean))
        CHECK_ABS(u->cv, want.sd / want.mean, EXACT);
}

/* 8 catches 10, 12, 8, 14, 10, 6, 12, 8.
 *   sum 80, n 8, mean m = 10
 *   |x - m| = 0, 2, 2, 4, 0, 4, 2, 2: sum 16;  CU = 100 (1 - 16 / 80) = 80
 *   sorted 6, 8, 8, 10, 10, 12, 12, 14; lowest quarter (n/4 = 2): 6, 8, mean 7;  DU = 100 * 7 / 10 = 70
 *   (x - m)^2 = 0, 4, 4, 16, 0, 16, 4, 4: sum 48;  sd = sqrt(48 / 7) = 2.6186146828;  CV = sd / 10 */
TEST(eight_catches_give_cu_80_and_du_70)
{
    const double x[8] = {10, 12, 8, 14, 10, 6, 12, 8};
    dragarc_uniformity u;
    check_hand(x, NULL, 8, (hand){10.0, 80.0, 7.0, 70.0, sqrt(48.0 / 7.0)}, &u);
    CHECK(u.n == 8 && u.total_area == 8.0 && u.min == 6.0 && u.max == 14.0);
}

/* 16 catches, 15 of 8 and one dry can (0).
 *   sum 120, mean 7.5
 *   |x - m| = 15 x 0.5 + 7.5 = 15;  CU = 100 (1 - 15 / 120) = 87.5
 *   lowest quarter (4 cans): 0, 8, 8, 8, mean 6;  DU = 100 * 6 / 7.5 = 80
 *   (x - m)^2 = 15 x 0.25 + 56.25 = 60;  sd = sqrt(60 / 15) = 2 exactly;  CV = 2 / 7.5 = 0.2666... (known CV) */
TEST(one_dry_can_among_sixteen_lowers_cu_to_87_5_and_du_to_80)
{
    double x[16];
    for (int i = 0; i < 16; i++)
        x[i] = 8.0;
    x[11] = 0.0;
    dragarc_uniformity u;
    check_hand(x, NULL, 16, (hand){7.5, 87.5, 6.0, 80.0, 2.0}, &u);
    CHECK(u.min == 0.0);
    CHECK_ABS(u.cv, 2.0 / 7.5, EXACT); /* the known CV */
}

/* Equal catches: every |x - m| is 0 (CU = 100), the low quarter equals the mean (DU = 100), sd = CV = 0. */
TEST(equal_catches_give_cu_100_and_du_100)
{
    double x[16];
    for (int i = 0; i < 16; i++)
        x[i] = 5.0;
    dragarc_uniformity u;
    check_hand(x, NULL, 16, (hand){5.0, 100.0, 5.0, 100.0, 0.0}, &u);
}

/* n = 10, catches 10, 9, ..., 1 (in falling order, so the sort matters).
 *   mean 5.5;  |x - m| = 2 (4.5 + 3.5 + 2.5 + 1.5 + 0.5) = 25;  CU = 100 (1 - 25 / 55) = 600 / 11
 *   lowest quarter: n/4 = 2.5 cans, 1 and 2 whole and half of 3: (1 + 2 + 1.5) / 2.5 = 1.8 (the
 *   library's convention, docs/uniformity.md);  DU = 100 * 1.8 / 5.5 = 360 / 11
 *   (x - m)^2 = 2 (20.25 + 12.25 + 6.25 + 2.25 + 0.25) = 82.5;  sd = sqrt(82.5 / 9) */
TEST(ten_catches_take_half_of_the_third_driest_into_the_low_quarter)
{
    double x[10];
    for (int i = 0; i < 10; i++)
        x[i] = 10.0 - i;
    dragarc_uniformity u;
    check_hand(x, NULL, 10, (hand){5.5, 600.0 / 11.0, 1.8, 360.0 / 11.0, sqrt(82.5 / 9.0)}, &u);
}

/* A very uneven set: 0, 0, 0, 12. mean 3; |x - m| = 3 + 3 + 3 + 9 = 18; CU = 100 (1 - 18 / 12) = -50: CU
 * can fall below 0 (the formula allows it). Lowest quarter: one can, 0; DU = 0. */
TEST(cu_goes_negative_when_the_mean_deviation_exceeds_the_mean)
{
    const double x[4] = {0, 12, 0, 0};
    dragarc_uniformity u;
    check_hand(x, NULL, 4, (hand){3.0, -50.0, 0.0, 0.0, NAN}, &u);
}

/* Areas weight every value as if each can were split into pieces of equal area: catches 4 and 8 standing for
 * areas 3 and 1 give the mean, CU and DU of 4, 4, 4, 8:
 *   mean (3*4 + 8) / 4 = 5;  sum a |x - m| = 3*1 + 3 = 6 over sum a x = 20: CU = 70
 *   a quarter of the area is 1, all from the catch of 4: DU = 100 * 4 / 5 = 80.
 * The sd is GSL's weighted estimator (GSL manual, gsl_stats_wvariance):
 *   sum w / ((sum w)^2 - sum w^2) * sum w (x - m)^2 = 4 / (16 - 10) * (3*1 + 1*9) = 8, sd = sqrt(8)
 * (not the sd of 4, 4, 4, 8, which is 2: the areas are weights, not counts of cans). */
TEST(areas_weight_each_catch_like_that_many_equal_cans)
{
    const double x[2] = {4, 8}, a[2] = {3, 1}, same[4] = {4, 4, 4, 8};
    dragarc_uniformity u, v;
    check_hand(x, a, 2, (hand){5.0, 70.0, 4.0, 80.0, sqrt(8.0)}, &u);
    CHECK_ABS(u.total_area, 4.0, EXACT);
    check_hand(same, NULL, 4, (hand){5.0, 70.0, 4.0, 80.0, 2.0}, &v);
}

/* The low quarter by area with a boundary catch: depths 6, 2, 4 on areas 2.5, 0.5, 1 (total 4, a quarter 1):
 * the driest, 2, gives its 0.5, the next, 4, the remaining 0.5: (0.5*2 + 0.5*4) / 1 = 3.
 * mean (15 + 1 + 4) / 4 = 5: DU = 60. */
TEST(the_low_quarter_by_area_takes_part_of_the_boundary_catch)
{
    const double x[3] = {6, 2, 4}, a[3] = {2.5, 0.5, 1};
    dragarc_uniformity u;
    check_hand(x, a, 3, (hand){5.0, NAN, 3.0, 60.0, NAN}, &u);
}

/* The example catch-can file of the docs (invented numbers, tests/data/catch-cans.csv):
 * 12.4 10.9 9.6 11.8 / 11.1 8.7 7.9 10.2 / 10.4 8.2 8.8 11.5 / 12.9 10.6 9.9 13.1
 *   sum 168.0, mean 10.5
 *   |x - m| = 1.9 .4 .9 1.3 .6 1.8 2.6 .3 .1 2.3 1.7 1.0 2.4 .1 .6 2.6: sum 20.6;  CU = 100 * 147.4 / 168
 *   lowest quarter 7.9 8.2 8.7 8.8: mean 8.4;  DU = 100 * 8.4 / 10.5 = 80
 *   (x - m)^2 sum 38.80;  sd = sqrt(38.8 / 15);  grid x and y 1.5 to 10.5 */
TEST(the_example_catch_file_reads_and_gives_its_hand_values)
{
    dragarc_catches c;
    dragarc_error err;
    int rc = dragarc_catches_read(DATA_DIR "/catch-cans.csv", &c, &err);
    CHECK(rc == DRAGARC_OK);
    if (rc != DRAGARC_OK) {
        printf("  %s: %s\n", err.field, err.message);
        return;
    }
    CHECK(c.n == 16 && c.area == NULL && c.x && c.y);
    dragarc_uniformity u;
    check_hand(c.depth, c.area, c.n, (hand){10.5, 100.0 * 147.4 / 168.0, 8.4, 80.0, sqrt(38.8 / 15.0)}, &u);
    double ext[4];
    CHECK(dragarc_catches_extent(&c, ext) == 0);
    CHECK(ext[0] == 1.5 && ext[1] == 10.5 && ext[2] == 1.5 && ext[3] == 10.5);
    dragarc_catches_clear(&c);
}

/* ---- every rule of the catches --------------------------------------------------------------------- */

TEST(bad_catches_are_refused_naming_the_value)
{
    dragarc_uniformity u;
    dragarc_error err;
    const double one[1] = {3};
    CHECK(dragarc_uniformity_compute(one, NULL, 1, &u, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "depth") == 0 && strstr(err.message, "at least 2 catches (got 1)"));
    const double neg[3] = {3, -0.5, 2};
    CHECK(dragarc_uniformity_compute(neg, NULL, 3, &u, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "depth[1]") == 0 && strstr(err.message, "-0.5"));
    const double nan[2] = {3, NAN};
    CHECK(dragarc_uniformity_compute(nan, NULL, 2, &u, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "depth[1]") == 0 && strstr(err.message, "finite"));
    const double ok[3] = {1, 2, 3}, area[3] = {1, 0, 1};
    CHECK(dragarc_uniformity_compute(ok, area, 3, &u, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "area[1]") == 0 && strstr(err.message, "got 0"));
    const double dry[4] = {0, 0, 0, 0};
    CHECK(dragarc_uniformity_compute(dry, NULL, 4, &u, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "depth") == 0 && strstr(err.message, "every catch is 0"));
    CHECK(dragarc_uniformity_compute(dry, NULL, 4, &u, NULL) == DRAGARC_EINVAL); /* no error record: fine */
    CHECK(dragarc_uniformity_check_catch(1.0, NAN, &err) == DRAGARC_OK);
    CHECK(dragarc_uniformity_check_catch(1.0, INFINITY, &err) == DRAGARC_EINVAL && strcmp(err.field, "area") == 0);
}

/* ---- the overlap of one pattern on a layout -------------------------------------------------------- */

static dragarc_spray_pattern *radial2(double r1, double rate0, double rate1)
{
    const double r[2] = {0.0, r1}, rate[2] = {rate0, rate1};
    dragarc_spray_pattern *p = NULL;
    dragarc_error err;
    if (dragarc_spray_pattern_radial(r, rate, 2, &p, &err) != DRAGARC_OK)
        printf("  %s: %s\n", err.field, err.message);
    return p;
}

/* A triangular profile (p at the sprinkler, falling linearly to 0 at R) on square spacing S = R/sqrt(2); by
 * the triangle's formula rate(d) = p (1 - d/R) for d <= R:
 *   cell centre (S/2, S/2): four sprinklers at S/sqrt(2) = R/2, each p/2: 2p; the next ones are at
 *     S sqrt(10)/2 = 1.118 R, out of reach;
 *   a sprinkler (0, 0): itself, p, and four at S = R/sqrt(2): p + 4 p (1 - 1/sqrt(2)) = p (5 - 2 sqrt(2));
 *     the diagonal ones are at S sqrt(2) = R, rate 0;
 *   edge middle (S/2, 0): two at S/2 = R/(2 sqrt(2)), four at S sqrt(5)/2 = R sqrt(5/8), two at 3S/2 > R:
 *     2 p (1 - 1/(2 sqrt(2))) + 4 p (1 - sqrt(5/8)) = 1.29289322 p + 0.83772234 p = 2.13061556 p. */
TEST(a_triangle_profile_on_square_spacing_sums_its_neighbours_by_hand)
{
    const double R = 12.0, p = 6.0, S = R / sqrt(2.0);
    dragarc_spray_pattern *pat = radial2(R, p, 0.0);
    CHECK(pat != NULL);
    if (!pat)
        return;
    dragarc_layout sq = {DRAGARC_LAYOUT_SQUARE, S, 0.0};
    CHECK_REL(dragarc_overlap_rate_at(pat, &sq, S / 2, S / 2), 2.0 * p, EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &sq, 0.0, 0.0), p * (5.0 - 2.0 * sqrt(2.0)), EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &sq, S / 2, 0.0),
              2.0 * p * (1.0 - 1.0 / (2.0 * sqrt(2.0))) + 4.0 * p * (1.0 - sqrt(5.0 / 8.0)), EXACT);
    /* the layout repeats: a point one spacing over (and in a far cell) gets the same */
    CHECK_REL(dragarc_overlap_rate_at(pat, &sq, S / 2 + 7 * S, S / 2 - 3 * S), 2.0 * p, EXACT);
    CHECK_ABS(dragarc_spray_pattern_eval(pat, 0.6 * R, 0.8 * R), 0.0, EXACT); /* d = R exactly */
    CHECK_ABS(dragarc_spray_pattern_eval(pat, R, 0.1), 0.0, 0.0);           /* beyond its last point */
    /* an odd catch grid has a point on the centre of the cell */
    dragarc_overlap o;
    CHECK(dragarc_overlap_run(pat, &sq, 5, 5, &o, NULL) == DRAGARC_OK);
    CHECK(o.nx == 5 && o.ny == 5 && o.width == S && o.height == S);
    CHECK_REL(o.rate[2 * 5 + 2], 2.0 * p, EXACT);
    dragarc_overlap_clear(&o);
    dragarc_spray_pattern_free(pat);
}

/* A uniform disc (rate p out to R = 1.2 S) on square spacing S: the count of sprinklers within 1.2 S:
 *   centre (S/2, S/2): four at 0.707 S (the next at 1.58 S): 4p;  a sprinkler: itself and four at S (the
 *   diagonals at 1.41 S are out): 5p;  edge middle (S/2, 0): two at S/2 and four at 1.118 S (the next at
 *   1.5 S): 6p. */
TEST(a_disc_pattern_on_square_spacing_counts_the_sprinklers_in_reach)
{
    const double S = 10.0, p = 4.0;
    dragarc_spray_pattern *pat = radial2(1.2 * S, p, p);
    CHECK(pat != NULL);
    if (!pat)
        return;
    dragarc_layout sq = {DRAGARC_LAYOUT_SQUARE, S, 0.0};
    CHECK_REL(dragarc_overlap_rate_at(pat, &sq, S / 2, S / 2), 4.0 * p, EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &sq, 0.0, 0.0), 5.0 * p, EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &sq, S / 2, 0.0), 6.0 * p, EXACT);
    dragarc_spray_pattern_free(pat);
}

/* Rectangular spacing S = 10 m along the rows, L = 14 m between them, a triangle profile to R = 12 m:
 *   centre (5, 7): four at sqrt(25 + 49) = sqrt(74) = 8.60 m (the next at 16.6 m): 4 p (1 - sqrt(74)/12);
 *   (5, 0): two at 5 m: 2 p (1 - 5/12) = 7p/6 (those of the next rows are at sqrt(25 + 196) = 14.9 m > R).
 *   With S and L swapped, (7, 0) would get 2 p (1 - 7/12) = 5p/6 instead: the test tells the two apart. */
TEST(a_rectangular_layout_puts_rows_l_apart)
{
    const double p = 3.0;
    dragarc_spray_pattern *pat = radial2(12.0, p, 0.0);
    CHECK(pat != NULL);
    if (!pat)
        return;
    dragarc_layout rect = {DRAGARC_LAYOUT_RECTANGULAR, 10.0, 14.0};
    CHECK_REL(dragarc_overlap_rate_at(pat, &rect, 5.0, 7.0), 4.0 * p * (1.0 - sqrt(74.0) / 12.0), EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &rect, 5.0, 0.0), 7.0 * p / 6.0, EXACT);
    dragarc_layout swapped = {DRAGARC_LAYOUT_RECTANGULAR, 14.0, 10.0};
    CHECK_REL(dragarc_overlap_rate_at(pat, &swapped, 7.0, 0.0), 5.0 * p / 6.0, EXACT);
    double w, h;
    dragarc_layout_cell(&rect, &w, &h);
    CHECK(w == 10.0 && h == 14.0);
    dragarc_spray_pattern_free(pat);
}

/* Equilateral triangular spacing S with a triangle profile to R = S; rows h = S sqrt(3)/2 apart:
 *   the centroid of a triangle (S/2, h/3) is S/sqrt(3) from its three corners (the next sprinklers are at
 *   2S/sqrt(3) = 1.15 S > R): 3 p (1 - 1/sqrt(3)) = p (3 - sqrt(3));
 *   a sprinkler: itself, its six neighbours at S = R give 0: p;
 *   (S/2, h), on the shifted row above, is a sprinkler too: p;
 *   (S/2, 0) between two sprinklers of a row: two at S/2 (p/2 each) and one above and one below at h:
 *   p + 2 p (1 - sqrt(3)/2) = p (3 - sqrt(3)). */
TEST(a_triangular_layout_shifts_every_other_row_by_half_a_spacing)
{
    const double S = 9.0, p = 5.0, h = S * sqrt(3.0) / 2.0;
    dragarc_spray_pattern *pat = radial2(S, p, 0.0);
    CHECK(pat != NULL);
    if (!pat)
        return;
    dragarc_layout tri = {DRAGARC_LAYOUT_TRIANGULAR, S, 0.0};
    CHECK_REL(dragarc_overlap_rate_at(pat, &tri, S / 2, h / 3), p * (3.0 - sqrt(3.0)), EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &tri, 0.0, 0.0), p, EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &tri, S / 2, h), p, EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &tri, S / 2, 0.0), p * (3.0 - sqrt(3.0)), EXACT);
    CHECK_REL(dragarc_overlap_rate_at(pat, &tri, S / 2, -h), p, EXACT); /* the odd row below is shifted too */
    /* far away, on an odd row: the centroid of a triangle of row 1001 (shifted by S/2) and 1000 spacings over;
     * coordinates near 1000 S carry rounding of about 1000 x 1.1e-16 of S, so 1e-9 */
    CHECK_REL(dragarc_overlap_rate_at(pat, &tri, S + 1000 * S, 1001 * h + h / 3), p * (3.0 - sqrt(3.0)), 1e-9);
    CHECK(isfinite(dragarc_overlap_rate_at(pat, &tri, 1e300, -1e300)));
    CHECK(isnan(dragarc_overlap_rate_at(pat, &tri, NAN, 0.0)));
    double w, hh;
    dragarc_layout_cell(&tri, &w, &hh);
    CHECK(w == S);
    CHECK_REL(hh, h, EXACT);
    dragarc_spray_pattern_free(pat);
}

/* A grid pattern that is a bilinear "hat" (1 at the sprinkler, 0 at the eight grid points around it, one
 * spacing away): on a layout with the same spacings the hats of all sprinklers add up to exactly 1 everywhere,
 * since the bilinear interpolant of the constant 1 is 1 (the partition of unity of bilinear interpolation).
 * So every catch point gets 1, CU = DU = 100, and the mean rate is flow / area exactly: the hat holds
 * (int (1 - |x|/S) dx)(int (1 - |y|/L) dy) = S L, and the cell is S x L. Shifting the hat (a pattern the wind
 * has moved) changes nothing. Inside one hat, at (S/2, L/4): (1 - 1/2)(1 - 1/4) = 0.375; outside the grid 0. */
TEST(bilinear_hats_on_their_own_spacing_overlap_to_a_perfectly_uniform_rate)
{
    const double S = 8.0, L = 11.0;
    const double hat[9] = {0, 0, 0, 0, 1, 0, 0, 0, 0};
    const double shifts[3] = {0.0, 1.3, -2.9};
    for (int k = 0; k < 3; k++) {
        dragarc_spray_pattern *pat = NULL;
        dragarc_error err;
        CHECK(dragarc_spray_pattern_grid(-S + shifts[k], -L + 0.5 * shifts[k], S, L, 3, 3, hat, &pat, &err) ==
              DRAGARC_OK);
        if (!pat)
            return;
        CHECK_ABS(dragarc_spray_pattern_eval(pat, S / 2 + shifts[k], L / 4 + 0.5 * shifts[k]), 0.375, EXACT);
        CHECK_ABS(dragarc_spray_pattern_eval(pat, 1.01 * S + shifts[k], 0.0), 0.0, 0.0);
        CHECK_REL(dragarc_spray_pattern_reach(pat), hypot(S + fabs(shifts[k]), L + 0.5 * fabs(shifts[k])), EXACT);
        dragarc_layout rect = {DRAGARC_LAYOUT_RECTANGULAR, S, L};
        dragarc_overlap o;
        CHECK(dragarc_overlap_run(pat, &rect, 7, 9, &o, &err) == DRAGARC_OK);
        double worst = 0.0;
        for (size_t i = 0; i < o.nx * o.ny; i++)
            worst = fmax(worst, fabs(o.rate[i] - 1.0));
        CHECK_ABS(worst, 0.0, EXACT);
        CHECK_ABS(o.stats.cu, 100.0, EXACT);
        CHECK_ABS(o.stats.du_lq, 100.0, EXACT);
        CHECK_REL(o.stats.mean * o.width * o.height, S * L, EXACT); /* flow / cell area */
        dragarc_overlap_clear(&o);
        dragarc_spray_pattern_free(pat);
    }
}

/* Mass conservation: the cell tiles the field under the layout's translations, so the catch points of one
 * cell, with every sprinkler, are the midpoints of sub-cells (width/nx by height/ny) tiling the whole
 * plane around one sprinkler, and the mean rate times the cell area is the midpoint rule for the pattern's
 * flow q = int rate dA. The triangle profile is a cone: q = pi p R^2 / 3 (a cone is a third of its cylinder).
 * The midpoint rule's error, bounded cell by cell (hx, hy the sub-cell sides, d = hypot(hx, hy)/2):
 *   cells where the cone is smooth: |error| <= (1/2) max|Hessian| (hx^2 + hy^2)/12 per unit area, with
 *     |Hessian| = p/(R r); summed, <= (hx^2 + hy^2)/24 * (p/R) * 2 * int dA/r (= 2 pi R) = pi p (hx^2+hy^2)/6
 *     (the 2 covers taking each cell's largest 1/r in place of the integral);
 *   cells on the rim r = R (in an annulus of area 8 pi R d) and at the apex (at most 4): the slope is at
 *     most p/R, so each is off by <= (p/R) d hx hy: together <= 8 pi p d^2 + 4 p d hx hy / R.
 * Relative to q: <= [(hx^2+hy^2)/6 + 8 d^2 + 4 d hx hy/(pi R)] * 3 / R^2, second order in the spacing;
 * at 200 x 200 points this is 1.6e-4 on square spacing S = R/sqrt(2), 2.8e-4 on triangular spacing S = R and
 * 1.9e-4 on 0.6 R x 0.9 R (the errors met are far smaller, near 1e-7). A uniform disc has a jump at its rim:
 * only the rim cells are off, each by at most p hx hy, so |error| / q <= 8 d / R, first order and loose: about
 * 1e-2 at 400 x 400 points for errors met near 2e-5. */
static double cone_bound(double hx, double hy, double R)
{
    double d = 0.5 * hypot(hx, hy);
    return ((hx * hx + hy * hy) / 6.0 + 8.0 * d * d + 4.0 * d * hx * hy / (PI * R)) * 3.0 / (R * R);
}

TEST(the_mean_rate_over_a_cell_is_the_flow_over_the_cell_area)
{
    const double R = 10.0, p = 7.0, q_cone = PI * p * R * R / 3.0, q_disc = PI * p * R * R;
    dragarc_spray_pattern *cone = radial2(R, p, 0.0), *disc = radial2(R, p, p);
    CHECK(cone && disc);
    if (!cone || !disc)
        return;
    const dragarc_layout layouts[3] = {{DRAGARC_LAYOUT_SQUARE, R / sqrt(2.0), 0.0},
                                       {DRAGARC_LAYOUT_TRIANGULAR, R, 0.0},
                                       {DRAGARC_LAYOUT_RECTANGULAR, 0.6 * R, 0.9 * R}};
    for (int k = 0; k < 3; k++) {
        const size_t n = 200;
        dragarc_overlap o;
        CHECK(dragarc_overlap_run(cone, &layouts[k], n, n, &o, NULL) == DRAGARC_OK);
        double hx = o.width / n, hy = o.height / n, area = o.width * o.height;
        double bound = cone_bound(hx, hy, R);
        CHECK(bound < 3e-4); /* the values above: the bound is what the comment says */
        CHECK_REL(o.stats.mean * area, q_cone, bound);
        dragarc_overlap_clear(&o);
        CHECK(dragarc_overlap_run(disc, &layouts[k], 2 * n, 2 * n, &o, NULL) == DRAGARC_OK);
        CHECK_REL(o.stats.mean * area, q_disc, 8.0 * 0.5 * hypot(hx / 2, hy / 2) / R);
        dragarc_overlap_clear(&o);
    }
    dragarc_spray_pattern_free(cone);
    dragarc_spray_pattern_free(disc);
}

/* ---- every rule of patterns and layouts ------------------------------------------------------------ */

TEST(bad_patterns_and_layouts_are_refused_naming_the_field)
{
    dragarc_spray_pattern *p = NULL;
    dragarc_error err;
    const double r[3] = {0, 5, 10}, rate[3] = {4, 2, 0};
    CHECK(dragarc_spray_pattern_radial(r, rate, 1, &p, &err) == DRAGARC_EINVAL && !p);
    CHECK(strcmp(err.field, "pattern.r") == 0 && strstr(err.message, "got 1"));
    const double r_off[3] = {0.5, 5, 10};
    CHECK(dragarc_spray_pattern_radial(r_off, rate, 3, &p, &err) == DRAGARC_EINVAL);
    CHECK(strstr(err.message, "r[0] must be 0") && strstr(err.message, "0.5"));
    const double r_back[3] = {0, 5, 5};
    CHECK(dragarc_spray_pattern_radial(r_back, rate, 3, &p, &err) == DRAGARC_EINVAL);
    CHECK(strstr(err.message, "r[2]"));
    const double rate_neg[3] = {4, -1, 0};
    CHECK(dragarc_spray_pattern_radial(r, rate_neg, 3, &p, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "pattern.rate") == 0 && strstr(err.message, "rate[1]") && strstr(err.message, "-1"));
    const double g[4] = {1, 1, 1, NAN};
    CHECK(dragarc_spray_pattern_grid(-1, -1, 2, 2, 2, 2, g, &p, &err) == DRAGARC_EINVAL);
    CHECK(strstr(err.message, "rate[3]"));
    CHECK(dragarc_spray_pattern_grid(-1, -1, 2, 2, 1, 2, g, &p, &err) == DRAGARC_EINVAL);
    CHECK(dragarc_spray_pattern_grid(-1, -1, 0, 2, 2, 2, g, &p, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "pattern.dx") == 0);
    CHECK(dragarc_spray_pattern_grid(-1, -1, 2, -2, 2, 2, g, &p, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "pattern.dy") == 0);
    CHECK(dragarc_spray_pattern_grid(-1, NAN, 2, 2, 2, 2, g, &p, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "pattern.y0") == 0);
    dragarc_spray_pattern_free(NULL);

    CHECK(dragarc_spray_pattern_radial(r, rate, 3, &p, &err) == DRAGARC_OK);
    dragarc_overlap o;
    dragarc_layout bad = {DRAGARC_LAYOUT_SQUARE, 0.0, 0.0};
    CHECK(dragarc_overlap_run(p, &bad, 5, 5, &o, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "layout.spacing") == 0);
    CHECK(isnan(dragarc_overlap_rate_at(p, &bad, 0.0, 0.0)));
    dragarc_layout rect = {DRAGARC_LAYOUT_RECTANGULAR, 5.0, INFINITY};
    CHECK(dragarc_overlap_run(p, &rect, 5, 5, &o, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "layout.row_spacing") == 0);
    dragarc_layout kind = {(dragarc_layout_kind)7, 5.0, 5.0};
    CHECK(dragarc_layout_check(&kind, &err) == DRAGARC_EINVAL && strcmp(err.field, "layout.kind") == 0);
    dragarc_layout sq = {DRAGARC_LAYOUT_SQUARE, 5.0, 0.0};
    CHECK(dragarc_overlap_run(p, &sq, 0, 5, &o, &err) == DRAGARC_EINVAL && strcmp(err.field, "points") == 0);
    CHECK(dragarc_overlap_run(p, &sq, 1, 1, &o, &err) == DRAGARC_EINVAL);
    CHECK(dragarc_overlap_run(p, &sq, DRAGARC_OVERLAP_MAX_POINTS + 1, 5, &o, &err) == DRAGARC_EINVAL);
    dragarc_layout tiny = {DRAGARC_LAYOUT_SQUARE, 0.1, 0.0}; /* a 10 m reach is 100 spacings */
    CHECK(dragarc_overlap_run(p, &tiny, 5, 5, &o, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "pattern") == 0 && strstr(err.message, "more than 50 times"));
    dragarc_overlap_clear(&o);
    dragarc_spray_pattern_free(p);

    /* nothing lands in the cell: a pattern that is 0 everywhere */
    const double zero[2] = {0, 0}, r2[2] = {0, 3};
    CHECK(dragarc_spray_pattern_radial(r2, zero, 2, &p, &err) == DRAGARC_OK);
    CHECK(dragarc_overlap_run(p, &sq, 4, 4, &o, &err) == DRAGARC_EINVAL);
    CHECK(strcmp(err.field, "pattern") == 0 && strstr(err.message, "every combined rate is 0"));
    dragarc_overlap_clear(&o);
    dragarc_spray_pattern_free(p);
}

int main(void)
{
    dragarc_init();
    RUN(eight_catches_give_cu_80_and_du_70);
    RUN(one_dry_can_among_sixteen_lowers_cu_to_87_5_and_du_to_80);
    RUN(equal_catches_give_cu_100_and_du_100);
    RUN(ten_catches_take_half_of_the_third_driest_into_the_low_quarter);
    RUN(cu_goes_negative_when_the_mean_deviation_exceeds_the_mean);
    RUN(areas_weight_each_catch_like_that_many_equal_cans);
    RUN(the_low_quarter_by_area_takes_part_of_the_boundary_catch);
    RUN(the_example_catch_file_reads_and_gives_its_hand_values);
    RUN(bad_catches_are_refused_naming_the_value);
    RUN(a_triangle_profile_on_square_spacing_sums_its_neighbours_by_hand);
    RUN(a_disc_pattern_on_square_spacing_counts_the_sprinklers_in_reach);
    RUN(a_rectangular_layout_puts_rows_l_apart);
    RUN(a_triangular_layout_shifts_every_other_row_by_half_a_spacing);
    RUN(bilinear_hats_on_their_own_spacing_overlap_to_a_perfectly_uniform_rate);
    RUN(the_mean_rate_over_a_cell_is_the_flow_over_the_cell_area);
    RUN(bad_patterns_and_layouts_are_refused_naming_the_field);
    return check_summary();
}
