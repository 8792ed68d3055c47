/* test_track_csv.c: the measured-track reader (fit.h): columns, standard deviations, velocities, and the errors
 * that name the line and column.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "check.h"
#include "dragarc/fit.h"

TEST(positions_alone_make_an_unweighted_track)
{
    dragarc_track t;
    dragarc_error e;
    CHECK(dragarc_track_parse("t,x,y,z\n0.0,0,0,1\n0.1, 1.5 ,0.2,1.4\n\n0.2,3,0.4,1.6\n", &t, &e) == DRAGARC_OK);
    CHECK(t.n == 3 && !t.vel && !t.pos_sd && !t.vel_sd);
    CHECK(t.t[2] == 0.2 && t.pos[3] == 1.5 && t.pos[8] == 1.6);
    dragarc_track_clear(&t);
    CHECK(t.n == 0 && t.t == NULL);
}

TEST(columns_in_any_order_and_case_with_bom_and_crlf)
{
    dragarc_track t;
    dragarc_error e;
    const char text[] = "\xef\xbb\xbf" "Z,sd,X,T,Y\r\n1,0.05,0,0,0\r\n2,0.05,1,0.5,0\r\n";
    CHECK(dragarc_track_parse(text, &t, &e) == DRAGARC_OK);
    CHECK(t.n == 2 && t.pos_sd && t.pos_sd[5] == 0.05);
    CHECK(t.t[1] == 0.5 && t.pos[3] == 1.0 && t.pos[5] == 2.0);
    dragarc_track_clear(&t);
}

TEST(velocities_come_with_standard_deviations_for_both)
{
    dragarc_track t;
    dragarc_error e;
    CHECK(dragarc_track_parse("t,x,y,z,vx,vy,vz,sd_x,sd_y,sd_z,sd_v\n0,0,0,1,10,0,5,0.1,0.1,0.2,0.3\n", &t, &e) ==
          DRAGARC_OK);
    CHECK(t.vel && t.vel[2] == 5.0 && t.pos_sd[2] == 0.2 && t.vel_sd[1] == 0.3);
    dragarc_track_clear(&t);
    CHECK_ERROR(dragarc_track_parse("t,x,y,z,vx,vy,vz\n0,0,0,1,1,1,1\n", &t, &e), DRAGARC_EINVAL, e, "line 1",
                "need standard deviations");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z,vx,vy,vz,sd\n0,0,0,1,1,1,1,1\n", &t, &e), DRAGARC_EINVAL, e, "line 1",
                "need standard deviations");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z,vx,vy,sd,sd_v\n0,0,0,1,1,1,1,1\n", &t, &e), DRAGARC_EINVAL, e, "line 1",
                "vx, vy and vz come together");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z,sd_v\n0,0,0,1,1\n", &t, &e), DRAGARC_EINVAL, e, "line 1",
                "without vx, vy, vz");
    CHECK(t.n == 0 && t.t == NULL);
}

TEST(bad_rows_are_named_by_line_and_column)
{
    dragarc_track t;
    dragarc_error e;
    CHECK_ERROR(dragarc_track_parse("t,x,y,z\n0,0,0,1\n0.2,1,0,1\n0.1,2,0,1\n", &t, &e), DRAGARC_EINVAL, e,
                "line 4: t", "times must increase");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z\n0,0,0,1\n0,1,0,1\n", &t, &e), DRAGARC_EINVAL, e, "line 3: t",
                "times must increase");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z\n-0.1,0,0,1\n", &t, &e), DRAGARC_EINVAL, e, "line 2: t", ">= 0");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z\n0,nan,0,1\n", &t, &e), DRAGARC_EINVAL, e, "line 2: x", "not a number");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z\n0,0,,1\n", &t, &e), DRAGARC_EINVAL, e, "line 2: y", "not a number");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z,sd\n0,0,0,1,0\n", &t, &e), DRAGARC_EINVAL, e, "line 2: sd",
                "must be positive");
    CHECK_ERROR(dragarc_track_parse("t,x,y\n0,0,0\n", &t, &e), DRAGARC_EINVAL, e, "line 1", "no z column");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z,w\n0,0,0,1,1\n", &t, &e), DRAGARC_EINVAL, e, "line 1", "unknown");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z,sd,sd_x,sd_y,sd_z\n0,0,0,1,1,1,1,1\n", &t, &e), DRAGARC_EINVAL, e,
                "line 1", "not both");
    CHECK_ERROR(dragarc_track_parse("", &t, &e), DRAGARC_EINVAL, e, "", "the file is empty");
    CHECK_ERROR(dragarc_track_parse("t,x,y,z\n", &t, &e), DRAGARC_EINVAL, e, "", "no points");
    CHECK(t.n == 0 && t.t == NULL);
}

int main(void)
{
    RUN(positions_alone_make_an_unweighted_track);
    RUN(columns_in_any_order_and_case_with_bom_and_crlf);
    RUN(velocities_come_with_standard_deviations_for_both);
    RUN(bad_rows_are_named_by_line_and_column);
    return check_summary();
}
