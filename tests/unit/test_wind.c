/* test_wind.c: wind profiles and the meteorological direction convention.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Checks are the defining formulas (exact): log law u_ref ln(h/z0)/ln(h_ref/z0) (Stull 1988, An
 * Introduction to Boundary Layer Meteorology, section 9.7), power law u_ref (h/h_ref)^alpha, and the
 * WMO convention that wind direction is where the wind comes from (WMO-No. 8, Guide to Instruments and
 * Methods of Observation, ch. 5; recalled).
 */
#include "check.h"
#include "helpers.h"
#include "dragarc/wind.h"

TEST(wind_from_the_west_blows_toward_the_east)
{
    dragarc_wind w;
    dragarc_wind_default(&w);
    w.model = DRAGARC_WIND_CONSTANT;
    w.speed = 5.0;
    w.from = 270.0 * DEG;
    double v[3];
    dragarc_wind_eval(&w, 3.0, v);
    CHECK_ABS(v[0], 5.0, 1e-12);
    CHECK_ABS(v[1], 0.0, 1e-12);
    w.from = 0.0; /* from the north: toward -y */
    dragarc_wind_eval(&w, 3.0, v);
    CHECK_ABS(v[1], -5.0, 1e-12);
}

TEST(log_law_gives_reference_speed_at_reference_height_and_zero_at_roughness)
{
    dragarc_wind w;
    dragarc_wind_default(&w);
    w.model = DRAGARC_WIND_LOG;
    w.speed = 8.0;
    w.from = 180.0 * DEG;
    w.ref_height = 10.0;
    w.roughness = 0.03;
    double v[3];
    dragarc_wind_eval(&w, 10.0, v);
    CHECK_ABS(v[1], 8.0, 1e-12);
    dragarc_wind_eval(&w, 2.0, v);
    CHECK_ABS(v[1], 8.0 * log(2.0 / 0.03) / log(10.0 / 0.03), 1e-12);
    dragarc_wind_eval(&w, 0.01, v);
    CHECK_ABS(v[1], 0.0, 0.0);
    CHECK(dragarc_wind_check(&w, NULL) == DRAGARC_OK);
    w.ref_height = 0.02;
    dragarc_error e;
    CHECK(dragarc_wind_check(&w, &e) == DRAGARC_EINVAL && strcmp(e.field, "ref_height") == 0);
}

TEST(power_law_scales_with_height)
{
    dragarc_wind w;
    dragarc_wind_default(&w);
    w.model = DRAGARC_WIND_POWER;
    w.speed = 6.0;
    w.from = 270.0 * DEG;
    w.ref_height = 10.0;
    w.exponent = 0.14;
    double v[3];
    dragarc_wind_eval(&w, 40.0, v);
    CHECK_ABS(v[0], 6.0 * pow(4.0, 0.14), 1e-12);
    dragarc_wind_eval(&w, -1.0, v);
    CHECK_ABS(v[0], 0.0, 0.0);
}

TEST(layered_wind_interpolates_speed_and_turns_the_short_way)
{
    dragarc_wind w;
    dragarc_wind_default(&w);
    w.model = DRAGARC_WIND_LAYERED;
    dragarc_wind_layer rows[] = {{0.0, 2.0, 350.0 * DEG}, {100.0, 6.0, 10.0 * DEG}, {1000.0, 10.0, 90.0 * DEG}};
    w.layers = rows;
    w.nlayers = 3;
    CHECK(dragarc_wind_check(&w, NULL) == DRAGARC_OK);
    double v[3];
    dragarc_wind_eval(&w, 50.0, v); /* halfway: 4 m/s from 0 degrees (north), not from 180 */
    CHECK_ABS(v[0], 0.0, 1e-12);
    CHECK_ABS(v[1], -4.0, 1e-12);
    dragarc_wind_eval(&w, 5000.0, v); /* held above the top row: 10 m/s from the east */
    CHECK_ABS(v[0], -10.0, 1e-12);
    dragarc_wind_eval(&w, -5.0, v); /* held below the first row */
    CHECK_ABS(hypot(v[0], v[1]), 2.0, 1e-12);
    rows[2].height = 50.0;
    dragarc_error e;
    CHECK(dragarc_wind_check(&w, &e) == DRAGARC_EINVAL && strcmp(e.field, "layers[2].height") == 0);
}

int main(void)
{
    RUN(wind_from_the_west_blows_toward_the_east);
    RUN(log_law_gives_reference_speed_at_reference_height_and_zero_at_roughness);
    RUN(power_law_scales_with_height);
    RUN(layered_wind_interpolates_speed_and_turns_the_short_way);
    return check_summary();
}
