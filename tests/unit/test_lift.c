/* test_lift.c: the lift laws of a spinning ball: the published fit, tables, checks and ownership.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <stdlib.h>

#include "check.h"
#include "dragarc/lift.h"

TEST(sawicki_fit_reproduces_its_two_pieces)
{
    /* Sawicki, Hubbard & Stronge (2003), Am. J. Phys. 71:1152, the fit used for baseball lift: C_L = 1.5 S
     * for S < 0.1 and 0.09 + 0.6 S above (recalled, medium confidence; the two pieces meet at S = 0.1,
     * C_L = 0.15, which the check at 0.1 confirms). Exact arithmetic: tolerance of a few round-offs. */
    dragarc_lift l = {.model = DRAGARC_LIFT_SAWICKI2003};
    const double S[] = {0.0, 0.05, 0.0999999, 0.1, 0.2, 0.3, 0.5};
    const double want[] = {0.0, 0.075, 0.14999985, 0.15, 0.21, 0.27, 0.39};
    for (size_t i = 0; i < sizeof S / sizeof *S; i++)
        CHECK_ABS(dragarc_lift_coefficient(&l, S[i]), want[i], 4e-16);
    dragarc_error e;
    CHECK(dragarc_lift_check(&l, &e) == DRAGARC_OK);
}

TEST(constant_lift_ignores_the_spin_factor)
{
    dragarc_lift l = {.model = DRAGARC_LIFT_CONSTANT, .cl = 0.15};
    CHECK(dragarc_lift_coefficient(&l, 0.01) == 0.15 && dragarc_lift_coefficient(&l, 0.6) == 0.15);
    l.cl = 1.2;
    dragarc_error e;
    CHECK(dragarc_lift_check(&l, &e) == DRAGARC_EINVAL && strcmp(e.field, "cl") == 0);
}

TEST(a_lift_table_passes_through_its_points_and_holds_its_ends)
{
    /* Steffen's interpolation (Steffen 1990, Astron. Astrophys. 239:443) passes through every point and is
     * monotone between monotone points; outside the table the end values hold. */
    dragarc_lift l = {0};
    const double s[] = {0.0, 0.1, 0.2, 0.3, 0.45};
    const double c[] = {0.0, 0.12, 0.19, 0.24, 0.28};
    dragarc_error e;
    CHECK(dragarc_lift_table_set(&l, s, c, 5, &e) == DRAGARC_OK);
    for (int i = 0; i < 5; i++)
        CHECK_ABS(dragarc_lift_coefficient(&l, s[i]), c[i], 1e-15);
    CHECK(dragarc_lift_coefficient(&l, 0.9) == 0.28);
    double prev = -1.0;
    for (double x = 0.0; x <= 0.45; x += 0.005) {
        double v = dragarc_lift_coefficient(&l, x);
        CHECK(v >= prev);
        prev = v;
    }
    dragarc_lift copy;
    CHECK(dragarc_lift_copy(&copy, &l, &e) == DRAGARC_OK);
    CHECK(copy.s != l.s && dragarc_lift_coefficient(&copy, 0.25) == dragarc_lift_coefficient(&l, 0.25));
    dragarc_lift_clear(&l);
    CHECK(l.model == DRAGARC_LIFT_NONE && l.s == NULL);
    dragarc_lift_clear(&copy);
    /* two points: a straight line */
    const double s2[] = {0.0, 0.4}, c2[] = {0.0, 0.3};
    CHECK(dragarc_lift_table_set(&l, s2, c2, 2, &e) == DRAGARC_OK);
    CHECK_ABS(dragarc_lift_coefficient(&l, 0.1), 0.075, 1e-16);
    dragarc_lift_clear(&l);
}

TEST(bad_lift_tables_are_refused_naming_the_point)
{
    dragarc_lift l = {0};
    dragarc_error e;
    const double s[] = {0.0, 0.2, 0.1}, c[] = {0.0, 0.1, 0.2}, cbad[] = {0.0, 1.5, 0.2}, sneg[] = {-0.1, 0.1, 0.2};
    CHECK(dragarc_lift_table_set(&l, s, c, 1, &e) == DRAGARC_EINVAL && strcmp(e.field, "points") == 0);
    CHECK(dragarc_lift_table_set(&l, s, c, 3, &e) == DRAGARC_EINVAL && strcmp(e.field, "points[2]") == 0);
    CHECK(dragarc_lift_table_set(&l, s, cbad, 2, &e) == DRAGARC_EINVAL && strcmp(e.field, "points[1]") == 0);
    CHECK(dragarc_lift_table_set(&l, sneg, c, 3, &e) == DRAGARC_EINVAL && strcmp(e.field, "points[0]") == 0);
    CHECK(l.model == DRAGARC_LIFT_NONE && l.s == NULL); /* untouched */
}

TEST(model_names_read_both_ways)
{
    const char *names[] = {"constant", "sawicki2003", "table"};
    for (int i = 0; i < 3; i++) {
        dragarc_lift_model m;
        CHECK(dragarc_lift_model_from_name(names[i], &m) == DRAGARC_OK);
        CHECK(strcmp(dragarc_lift_model_name(m), names[i]) == 0);
    }
    dragarc_lift_model m;
    CHECK(dragarc_lift_model_from_name("magnus", &m) == DRAGARC_EINVAL);
    CHECK(dragarc_lift_model_name((dragarc_lift_model)99) == NULL);
}

int main(void)
{
    RUN(sawicki_fit_reproduces_its_two_pieces);
    RUN(constant_lift_ignores_the_spin_factor);
    RUN(a_lift_table_passes_through_its_points_and_holds_its_ends);
    RUN(bad_lift_tables_are_refused_naming_the_point);
    RUN(model_names_read_both_ways);
    return check_summary();
}
