/* test_evaporation.c: an evaporating water drop: the wet bulb, the mass-transfer law, the residue.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "check.h"
#include "dragarc/evaporation.h"
#include "dragarc/moist_air.h"
#include "helpers.h"

TEST(the_wet_bulb_matches_a_published_example)
{
    /* Stull, R. (2011), "Wet-bulb temperature from relative humidity and air temperature", J. Appl. Meteor.
     * Climatol. 50:2267, abstract: at T = 20 degC and RH = 50 % (sea-level pressure) T_w = 13.7 degC (recalled).
     * Stull's is an empirical fit to psychrometric data with errors of a few tenths of a kelvin, and the example
     * is printed to 0.1 K, so the psychrometer equation here must agree within 0.3 K. */
    double tw;
    CHECK(dragarc_wet_bulb_temperature(293.15, 101325.0, 0.5, &tw, NULL) == DRAGARC_OK);
    printf("  wet bulb at 20 degC, 50 %%: %.3f degC (Stull 2011: 13.7 degC)\n", tw - 273.15);
    CHECK_ABS(tw - 273.15, 13.7, 0.3);
    /* saturated air: the wet bulb is the air itself; dry air: far below it */
    CHECK(dragarc_wet_bulb_temperature(293.15, 101325.0, 1.0, &tw, NULL) == DRAGARC_OK && tw == 293.15);
    CHECK(dragarc_wet_bulb_temperature(303.15, 101325.0, 0.0, &tw, NULL) == DRAGARC_OK && tw < 290.0);
    /* the psychrometer residual vanishes there */
    CHECK(dragarc_wet_bulb_temperature(298.15, 90000.0, 0.35, &tw, NULL) == DRAGARC_OK);
    CHECK_ABS(dragarc_psychrometer_residual(tw, 298.15, 90000.0, 0.35), 0.0, 1e-9);
}

TEST(a_drop_at_rest_evaporates_at_maxwells_rate)
{
    /* At Re = 0 the Ranz-Marshall Sherwood number is 2 and the rate is Maxwell's, dm/dt = -2 pi d D_v drho
     * (closed form; e.g. Fuchs 1959). With ventilation Sh = 2 + 0.6 Re^(1/2) Sc^(1/3) (Ranz & Marshall 1952). */
    const double d = 100e-6, dv = 2.5e-5, drho = 3e-3, rho = 1.2, mu = 1.8e-5;
    CHECK_REL(dragarc_evaporation_rate(d, 0.0, rho, mu, dv, drho), -2.0 * PI * d * dv * drho, 1e-15);
    double sc = mu / (rho * dv);
    CHECK_REL(dragarc_evaporation_rate(d, 4.0, rho, mu, dv, drho),
              -PI * d * dv * (2.0 + 0.6 * 2.0 * cbrt(sc)) * drho, 1e-15);
    /* Pruppacher & Klett's diffusivity at 0 degC and 1 atm is its coefficient, 2.11e-5 m^2/s (the formula) */
    CHECK_REL(dragarc_vapour_diffusivity(273.15, 101325.0), 2.11e-5, 1e-15);
}

/* The relative humidity at which the psychrometer's wet bulb lies dt below air at T and 1 atm (bisection: the
 * depression falls as the humidity rises). */
static double humidity_for_depression(double t, double dt)
{
    double lo = 0.0, hi = 1.0, tw;
    for (int i = 0; i < 100; i++) {
        double h = 0.5 * (lo + hi);
        dragarc_wet_bulb_temperature(t, 101325.0, h, &tw, NULL);
        if (t - tw > dt)
            lo = h;
        else
            hi = h;
    }
    return 0.5 * (lo + hi);
}

TEST(a_drop_at_rest_lives_about_as_long_as_published_lifetimes)
{
    /* Published: d^2 = d0^2 - lambda t with lambda = 80 dT um^2/s, dT the wet-bulb depression in kelvin, so a
     * 100 um drop of water lives about 57 s at dT = 2.2 K and 16 s at dT = 7.7 K (Amsden, R. C. 1962, "Reducing
     * the evaporation of sprays", Agricultural Aviation 4:88, as reproduced in Matthews, G. A., Pesticide
     * Application Methods; recalled). At rest (Re = 0, Sh = Nu = 2) the model's d^2 falls linearly at lambda =
     * 8 D_v drho(T_s) / rho_l = 8 k (T - T_s) / (L rho_l): heat-limited, the published form, with the drop's own
     * depression T - T_s. Two checks at 20 degC, 1 atm, rho_l = 1000 kg/m^3:
     * (1) lambda / (T - T_s) against the published 80 um^2/s/K within 6.25 %: the figure is printed as "80",
     *     between 75 and 85 at the precision given, and recalled.
     * (2) The lifetimes at the published wet-bulb depressions within 15 %: a free drop sits further below the air
     *     than a ventilated wet-bulb thermometer, by the factor (s + gamma) / (s + k / (L D_v)) (s the slope of
     *     the saturation vapour density, gamma the psychrometer's constant as a vapour density; derived from the
     *     two balances, printed below: about 1.10), on top of (1)'s 6.25 %: 1.10 x 1.0625 = 1.17 at most; 15 % was
     *     set from this estimate after the first comparison was seen (docs/validation.md says so). */
    const double t = 293.15, p = 101325.0, rho_l = 1000.0, d0 = 100e-6;
    const double dts[2] = {2.2, 7.7}, published[2] = {57.0, 16.0};
    for (int i = 0; i < 2; i++) {
        double h = humidity_for_depression(t, dts[i]), tw, ts;
        CHECK(dragarc_wet_bulb_temperature(t, p, h, &tw, NULL) == DRAGARC_OK);
        CHECK(dragarc_drop_temperature(t, p, h, 1.0, &ts, NULL) == DRAGARC_OK);
        double drho = dragarc_vapour_density_excess(ts, t, h), dv = dragarc_vapour_diffusivity(t, p);
        double lambda = 8.0 * dv * drho / rho_l;
        /* the balance holds at the root: the diffusion-limited and the heat-limited forms agree */
        CHECK_REL(lambda, 8.0 * dragarc_air_conductivity(t) * (t - ts) / (dragarc_latent_heat(ts) * rho_l), 1e-9);
        /* and the rate at rest is that lambda: d(d^2)/dt = 2 d dd/dt = (4 / (pi rho_l d)) dm/dt */
        CHECK_REL(-4.0 / (PI * rho_l * d0) * dragarc_evaporation_rate(d0, 0.0, 1.2, 1.8e-5, dv, drho), lambda, 1e-12);
        double life = d0 * d0 / lambda, per_k = lambda / (t - ts) * 1e12;
        printf("  RH %.1f %%: wet bulb %.2f K below the air, a drop at rest %.2f K below (ratio %.3f); lambda %.1f "
               "um^2/s per K of the drop's depression (published 80); 100 um lives %.1f s (published %.0f s, %+.1f %%)\n",
               100.0 * h, t - tw, t - ts, (t - ts) / (t - tw), per_k, life, published[i],
               100.0 * (life / published[i] - 1.0));
        CHECK_REL(per_k, 80.0, 0.0625);
        CHECK_REL(life, published[i], 0.15);
    }
    /* a drop in saturated air sits at the air's temperature and does not evaporate */
    double ts;
    CHECK(dragarc_drop_temperature(t, p, 1.0, 1.0, &ts, NULL) == DRAGARC_OK && ts == t);
    /* ventilation warms the drop a little toward the air: Nu / Sh > 1 (Pr^(1/3) > Sc^(1/3), Ranz & Marshall) */
    double ratio = dragarc_heat_to_mass_ratio(100.0, 1.2, 1.81e-5, t, dragarc_vapour_diffusivity(t, p)), ts_fast;
    CHECK(ratio > 1.0 && ratio < 1.1);
    CHECK(dragarc_drop_temperature(t, p, 0.3, 1.0, &ts, NULL) == DRAGARC_OK);
    CHECK(dragarc_drop_temperature(t, p, 0.3, ratio, &ts_fast, NULL) == DRAGARC_OK && ts_fast > ts);
    CHECK_ABS(dragarc_drop_heat_residual(ts_fast, t, p, 0.3, ratio), 0.0, 1e-9);
}

static void drop(dragarc_scenario *s, double d, double phi, double rh)
{
    make_scenario(s, 1.2, 998.2 * PI * d * d * d / 6.0, d, 2.0, 0.0, 0.0, 9.80665, 1e-10);
    s->projectile.density = 998.2;
    s->projectile.drag.model = DRAGARC_DRAG_SPHERE;
    s->projectile.evaporation.enabled = 1;
    s->projectile.evaporation.nonvolatile_fraction = phi;
    s->atmosphere.model = DRAGARC_ATMOSPHERE_LOCAL;
    s->atmosphere.temperature = 298.15;
    s->atmosphere.pressure = 101325.0;
    s->atmosphere.relative_humidity = rh;
}

TEST(the_residue_stays_and_saturated_air_takes_nothing)
{
    /* A drop that is all residue, or one in saturated air (drho = 0), keeps its mass; a drop with 50 % residue
     * dropped from 2 m in dry air shrinks toward, never below, the residue's diameter phi^(1/3) d0 (the law). */
    dragarc_scenario s;
    dragarc_flight f;
    drop(&s, 200e-6, 1.0, 0.3);
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    CHECK(f.impact[7] == 1.0 && !f.evaporated);
    dragarc_flight_clear(&f);
    drop(&s, 200e-6, 0.0, 1.0);
    CHECK(dragarc_flight_run(&s, 0.0, &f, NULL) == DRAGARC_OK);
    CHECK_REL(f.impact[7], 1.0, 1e-14);
    dragarc_flight_clear(&f);
    drop(&s, 40e-6, 0.5, 0.0);
    CHECK(dragarc_flight_run(&s, 0.1, &f, NULL) == DRAGARC_OK);
    double d_res = cbrt(0.5) * 40e-6, dmin = 1.0;
    for (size_t i = 0; i < f.npoints; i++)
        dmin = fmin(dmin, f.points[i].diameter);
    printf("  40 um drop, half residue, dry air: %.4g um at landing after %.1f s (residue %.4g um)\n",
           cbrt(f.impact[7]) * 40.0, f.time_of_flight, d_res * 1e6);
    printf("  smallest sampled diameter %.12g um, residue %.12g um\n", dmin * 1e6, d_res * 1e6);
    CHECK(!f.evaporated && dmin >= d_res);
    CHECK_ABS(cbrt(f.impact[7]) * 40e-6, d_res, 1e-3 * d_res);
    dragarc_flight_clear(&f);
}

TEST(the_diameter_shrinks_down_every_sample_and_smaller_drops_go_sooner)
{
    dragarc_scenario s;
    dragarc_flight a, b;
    drop(&s, 80e-6, 0.0, 0.4);
    CHECK(dragarc_flight_run(&s, 0.05, &a, NULL) == DRAGARC_OK);
    for (size_t i = 1; i < a.npoints; i++)
        CHECK(a.points[i].diameter < a.points[i - 1].diameter);
    drop(&s, 60e-6, 0.0, 0.4);
    CHECK(dragarc_flight_run(&s, 0.0, &b, NULL) == DRAGARC_OK);
    printf("  pure water from 2 m at 25 degC, 40 %%: 80 um gone after %.2f s (%d), 60 um after %.2f s (%d)\n",
           a.time_of_flight, a.evaporated, b.time_of_flight, b.evaporated);
    CHECK(a.evaporated && b.evaporated && b.time_of_flight < a.time_of_flight);
    dragarc_flight_clear(&a);
    dragarc_flight_clear(&b);
}

int main(void)
{
    dragarc_init();
    RUN(the_wet_bulb_matches_a_published_example);
    RUN(a_drop_at_rest_evaporates_at_maxwells_rate);
    RUN(a_drop_at_rest_lives_about_as_long_as_published_lifetimes);
    RUN(the_residue_stays_and_saturated_air_takes_nothing);
    RUN(the_diameter_shrinks_down_every_sample_and_smaller_drops_go_sooner);
    return check_summary();
}
