/* test_terminal_speeds.c: terminal fall speeds of water drops and of a skydiver-sized body.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources:
 *  - Gunn, R. & Kinzer, G. D. (1949), "The terminal velocity of fall for water droplets in stagnant
 *    air", J. Meteorology 6:243-248, Table 2 (20 deg C, 1013 mb). Values verified in stored copies.
 *    The authors state an accuracy of better than 1 %. Air at those conditions: rho = p/(R T) =
 *    101300 / (287.053 * 293.15) = 1.2038 kg/m^3, mu from Sutherland's law = 1.8134e-5 Pa s.
 *  - Clift, Grace & Weber (1978), Bubbles, Drops, and Particles, Table 5.2 (the drag law under test);
 *    its pieces fit measured sphere drag to a few per cent, which moves a terminal speed by the same
 *    few per cent (between half and all of the Cd error, from Newton to Stokes regime). With the 1 %
 *    of the data, 4 % is the honest band for rigid spheres.
 *  - Drops of 2 mm and more flatten in fall (Pruppacher, H. R. & Klett, J. D. 1997, Microphysics of
 *    Clouds and Precipitation, section 10.3.2; recalled), so a rigid-sphere law must overestimate
 *    their speed: asserted as a direction, not a match.
 *  - Schiller, L. & Naumann, A. (1933), Z. Ver. Dtsch. Ing. 77:318: Cd = 24/Re (1 + 0.15 Re^0.687),
 *    an independent law for the smallest drop.
 */
#include "check.h"
#include "helpers.h"

#define G0 9.80665
#define RHO_AIR_20C 1.2038
#define RHO_WATER_20C 998.2 /* kg/m^3 at 20 deg C (e.g. CRC Handbook of Chemistry and Physics; recalled) */

static double drop_speed(double d)
{
    dragarc_scenario s;
    make_scenario(&s, RHO_AIR_20C, RHO_WATER_20C * PI * d * d * d / 6.0, d, 10.0, 0.0, 0.0, G0, 1e-8);
    s.atmosphere.viscosity = dragarc_air_viscosity(293.15);
    s.projectile.drag.model = DRAGARC_DRAG_SPHERE;
    double vt = NAN;
    CHECK(dragarc_terminal_speed(&s, 10.0, &vt, NULL) == DRAGARC_OK);
    return vt;
}

TEST(sphere_law_drops_match_gunn_kinzer_from_0_2_to_1_6_mm)
{
    const double d_mm[] = {0.2, 0.3, 0.5, 1.0, 1.4, 1.6};
    const double v[] = {0.72, 1.17, 2.06, 4.03, 5.17, 5.65};
    for (size_t i = 0; i < sizeof v / sizeof v[0]; i++) {
        double vt = drop_speed(d_mm[i] * 1e-3);
        printf("  D %.1f mm: model %.4f m/s, Gunn & Kinzer %.2f m/s (%+.1f %%)\n", d_mm[i], vt, v[i],
               100.0 * (vt - v[i]) / v[i]);
        CHECK_REL(vt, v[i], 0.04);
    }
}

TEST(rigid_sphere_law_overestimates_flattened_large_drops)
{
    const double d_mm[] = {2.0, 3.0, 5.8};
    const double v[] = {6.49, 8.06, 9.17};
    for (size_t i = 0; i < sizeof v / sizeof v[0]; i++) {
        double vt = drop_speed(d_mm[i] * 1e-3);
        printf("  D %.1f mm: model %.4f m/s, Gunn & Kinzer %.2f m/s (%+.1f %%)\n", d_mm[i], vt, v[i],
               100.0 * (vt - v[i]) / v[i]);
        CHECK(vt > v[i]);
    }
}

TEST(smallest_drop_agrees_with_schiller_naumann_law)
{
    /* At D = 0.1 mm (Re ~ 1.7) both laws are fits to the same sphere data in their overlap; they differ
     * there by about 1.2 % in (1 + correction), so 2 % on speed. Gunn & Kinzer print 0.27 m/s, about
     * 8 % above both laws: recorded in docs/validation.md, not used as a check. */
    double d = 1e-4, mu = dragarc_air_viscosity(293.15);
    double v = (RHO_WATER_20C - RHO_AIR_20C) * G0 * d * d / (18.0 * mu); /* Stokes, buoyancy included */
    for (int it = 0; it < 200; it++) {
        double re = RHO_AIR_20C * v * d / mu;
        v = (RHO_WATER_20C - RHO_AIR_20C) * G0 * d * d / (18.0 * mu * (1.0 + 0.15 * pow(re, 0.687)));
    }
    CHECK_REL(drop_speed(d), v, 0.02);
}

TEST(terminal_speed_from_the_solver_is_reached_in_a_long_fall)
{
    /* Self-consistency of two independent routes: the Brent balance and the integrated fall of a
     * 0.5 mm drop from 30 m in still constant air must agree once the fall is steady (the relaxation
     * time v_t/g is 0.2 s, 50 of them pass before impact), to the integration tolerance. */
    double d = 5e-4;
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, RHO_AIR_20C, RHO_WATER_20C * PI * d * d * d / 6.0, d, 30.0, 0.0, 0.0, G0, 1e-10);
    s.atmosphere.viscosity = dragarc_air_viscosity(293.15);
    s.projectile.drag.model = DRAGARC_DRAG_SPHERE;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    CHECK_REL(f.impact_speed, f.terminal_speed, 1e-8);
    dragarc_flight_clear(&f);
}

TEST(skydiver_sized_body_falls_at_about_200_km_per_hour)
{
    /* Belly-to-earth free fall near the ground is about 200 km/h (common practice, no source). Body of our
     * own choosing: 85 kg with gear, drag area Cd A = 0.7 * 0.6 m^2, leaving an aircraft at 4000 m and
     * 40 m/s. The band 180-230 km/h is the rule of thumb's spread. */
    dragarc_scenario s;
    dragarc_flight f;
    make_scenario(&s, 0.0, 85.0, 0.5, 4000.0, 40.0, 0.0, G0, 1e-8);
    s.atmosphere.model = DRAGARC_ATMOSPHERE_ISA;
    s.atmosphere.site_elevation = 0.0;
    s.projectile.area = 0.6;
    s.projectile.volume = 0.085; /* about a body's volume: buoyancy is 0.1 % of the weight */
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.7;
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    double vt0 = NAN;
    CHECK(dragarc_terminal_speed(&s, 0.0, &vt0, NULL) == DRAGARC_OK);
    printf("  terminal speed at sea level %.1f km/h, at 4000 m %.1f km/h; impact (no canopy) %.1f km/h\n",
           vt0 * 3.6, f.terminal_speed * 3.6, f.impact_speed * 3.6);
    CHECK(vt0 * 3.6 > 180.0 && vt0 * 3.6 < 230.0);
    /* After a 4 km fall the speed has relaxed to the terminal speed near the ground (within 1 %: the
     * last relaxation time, v_t/g = 6 s, covers 340 m over which density changes 4 %, so the body lags
     * its local terminal speed by under half of that). */
    CHECK_REL(f.impact_speed, vt0, 0.01);
    /* With constant Cd, v_t scales as 1/sqrt(rho): the ratio between 4000 m and sea level is
     * sqrt(1.22500 / 0.819347) from the 1976 standard's Table I (rho at 4 km recalled), to 1e-3 for
     * the slight change of buoyancy with height. */
    CHECK_REL(f.terminal_speed / vt0, sqrt(1.22500 / 0.819347), 1e-3);
    dragarc_flight_clear(&f);
}

TEST(a_body_that_barely_falls_has_a_terminal_speed_of_zero_not_an_error)
{
    /* Found while fuzzing the fly pipeline (an extreme seed): with gravity 1e-100 m/s^2 the balance of drag and
     * weight lies near 1e-49 m/s (quadratic drag: v = sqrt(2 m g / (rho A Cd))), below the bracket search's floor,
     * where Brent's relative test never converged and the flight failed. It is 0 to within the bracket left, under
     * 4e-12 m/s. */
    dragarc_scenario s;
    make_scenario(&s, RHO_AIR_20C, 0.145, 0.074, 1.0, 0.0, 0.0, 1e-100, 1e-8);
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.35;
    double vt = NAN;
    CHECK(dragarc_terminal_speed(&s, 0.0, &vt, NULL) == DRAGARC_OK);
    CHECK(vt >= 0.0 && vt < 4e-12);
    /* just above the floor the solver still converges: g = 1e-22 gives v = sqrt(2 (m - rho V) g / (rho A Cd))
     * (weight less buoyancy against quadratic drag: Halliday, Resnick and Walker, Fundamentals of Physics, drag
     * force and terminal speed; recalled), about 2.4e-11 m/s, to the solver's 1e-13 relative tolerance (1e-9
     * leaves room for rounding) */
    s.gravity = 1e-22;
    CHECK(dragarc_terminal_speed(&s, 0.0, &vt, NULL) == DRAGARC_OK);
    double area = 0.25 * PI * 0.074 * 0.074, buoyant = 0.145 - RHO_AIR_20C * PI * pow(0.074, 3) / 6.0;
    CHECK_REL(vt, sqrt(2.0 * buoyant * 1e-22 / (RHO_AIR_20C * area * 0.35)), 1e-9);
    dragarc_scenario_clear(&s);
}

int main(void)
{
    dragarc_init();
    RUN(sphere_law_drops_match_gunn_kinzer_from_0_2_to_1_6_mm);
    RUN(rigid_sphere_law_overestimates_flattened_large_drops);
    RUN(smallest_drop_agrees_with_schiller_naumann_law);
    RUN(terminal_speed_from_the_solver_is_reached_in_a_long_fall);
    RUN(skydiver_sized_body_falls_at_about_200_km_per_hour);
    RUN(a_body_that_barely_falls_has_a_terminal_speed_of_zero_not_an_error);
    return check_summary();
}
