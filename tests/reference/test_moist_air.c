/* test_moist_air.c: moist air by CIPM-2007 and the "local" atmosphere model built on it.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources. The equation: Picard, A., Davis, R. S., Glaser, M. & Fujii, K. (2008), Revised formula for the
 * density of moist air (CIPM-2007), Metrologia 45:149-155, Appendix A1. The paper's own check values could
 * not be found in the reference material available here (only its first page was), so no test below
 * reproduces them; the equation's pieces are checked against other published values instead:
 *   - the saturation vapour pressure against IAPWS-IF97's verification value (Table 35) and the measured
 *     triple point of water;
 *   - dry air against the ideal gas with the paper's molar mass and compressibility, and against the
 *     U.S. Standard Atmosphere 1976's sea-level density and speed of sound;
 *   - humid air against the mixture's molar mass: water vapour is lighter than air.
 * Each check gives its tolerance and why. The local model is checked against the barometric formula
 * written out here independently.
 */
#include "check.h"
#include "dragarc/atmosphere.h"
#include "dragarc/flight.h"
#include "dragarc/moist_air.h"
#include "dragarc/scenario.h"

/* The paper's constants, typed again here from its Appendix A1 (as printed by implementations citing it). */
#define R_CIPM 8.314472
#define M_VAPOUR 18.01528e-3
#define M_DRY 28.96546e-3 /* at x_CO2 = 0.0004 */

static dragarc_moist_air air(double t, double p, double h)
{
    dragarc_moist_air m;
    int rc = dragarc_moist_air_eval(t, p, h, DRAGARC_CIPM_X_CO2, &m, NULL);
    CHECK(rc == DRAGARC_OK);
    return m;
}

static dragarc_atmosphere local(double t, double p, double h)
{
    dragarc_atmosphere a;
    dragarc_atmosphere_default(&a);
    a.model = DRAGARC_ATMOSPHERE_LOCAL;
    a.temperature = t;
    a.pressure = p;
    a.relative_humidity = h;
    return a;
}

TEST(saturation_vapour_pressure_matches_iapws_if97_at_300_K)
{
    /* IAPWS (2007), Revised Release on the IAPWS Industrial Formulation 1997 for the Thermodynamic Properties
     * of Water and Steam, Table 35: p_s(300 K) = 0.353658941e-2 MPa (9 figures; verified against stored
     * copies of the table in several public test suites). 300 K lies inside the CIPM equation's range.
     * The CIPM fit is not IF97, so the tolerance is not the printed rounding but what matters downstream:
     * 5e-5 in p_sv moves the density by under 1e-6 (x_v (1 - M_v/M_a) < 0.02 at 300 K). */
    CHECK_REL(dragarc_cipm_saturation_vapour_pressure(300.0), 3536.58941, 5e-5);
}

TEST(saturation_vapour_pressure_matches_the_triple_point_of_water)
{
    /* Triple point of water, 273.16 K and 611.657 Pa: Guildner, L. A., Johnson, D. P. & Jones, F. E. (1976),
     * Vapor pressure of water at its triple point, J. Res. Natl. Bur. Stand. 80A:505 (value verified in
     * stored copies; its uncertainty of 0.010 Pa is recalled). 273.16 K is below the CIPM range: this
     * shows the fit still holds at 0 degC. Tolerance: the measurement's 0.010 Pa. */
    CHECK_ABS(dragarc_cipm_saturation_vapour_pressure(273.16), 611.657, 0.010);
}

TEST(dry_air_is_the_ideal_gas_over_the_compressibility)
{
    /* h = 0: rho = p M_a / (Z R T) with Z = 1 - (p/T)(a0 + a1 t + a2 t^2) + (p/T)^2 d (the paper's
     * equation with x_v = 0), written out here. Same arithmetic in another order: 1e-14. */
    const double cases[][2] = {{288.15, 101325.0}, {293.15, 100000.0}, {263.15, 70000.0}, {318.15, 106000.0}};
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        double t = cases[i][0], p = cases[i][1], tc = t - 273.15;
        double z = 1.0 - p / t * (1.58123e-6 - 2.9331e-8 * tc + 1.1043e-10 * tc * tc) + p * p / (t * t) * 1.83e-11;
        dragarc_moist_air m = air(t, p, 0.0);
        CHECK(m.vapour_fraction == 0.0);
        CHECK_REL(m.compressibility, z, 1e-14);
        CHECK_REL(m.density, p * M_DRY / (z * R_CIPM * t), 1e-14);
        /* Air near the ground is slightly more compressible than an ideal gas: Z a few 1e-4 below 1. */
        CHECK(z < 1.0 && z > 0.999);
    }
}

TEST(dry_air_at_standard_sea_level_is_the_1976_density_corrected_for_constants_and_z)
{
    /* U.S. Standard Atmosphere 1976, Table I: rho = 1.22500 kg/m^3 at 288.15 K and 101325 Pa, an ideal gas
     * with M0 = 28.9644 kg/kmol and R* = 8314.32 J/(kmol K) (verified in tests/reference/test_isa_1976.c).
     * CIPM-2007 differs by its heavier dry air, its R and Z: rho = 1.225 (M_a/M0)(R* / R)/Z. Tolerance: the
     * table's 6 printed figures (4e-6) plus 1e-6. Measured: CIPM's dry air is 4.3e-4 denser. */
    dragarc_moist_air m = air(288.15, 101325.0, 0.0);
    CHECK_REL(m.density, 1.225 * (M_DRY / 28.9644e-3) * (8.31432 / R_CIPM) / m.compressibility, 5e-6);
    CHECK_REL(m.density, 1.225, 5e-4);
}

TEST(humidity_lowers_the_density)
{
    /* Water vapour (18.015 g/mol) replaces dry air (28.965 g/mol) at the same pressure, so at fixed T and p
     * the density falls by x_v (1 - M_v/M_a) relative (the paper's density equation). The compressibility's
     * vapour terms, about (p/T)(b0 + c0 x_v) x_v, shift this by at most 2.3 % of itself at 45 degC saturated:
     * tolerance 3 %. Measured: 0.7 % (-10 degC) to 1.1 % (45 degC). */
    const double temps[] = {263.15, 288.15, 303.15, 318.15};
    for (size_t i = 0; i < sizeof temps / sizeof temps[0]; i++) {
        double t = temps[i], p = 101325.0;
        dragarc_moist_air dry = air(t, p, 0.0), half = air(t, p, 0.5), wet = air(t, p, 1.0);
        CHECK(half.density < dry.density);
        CHECK(wet.density < half.density);
        CHECK_REL(wet.vapour_fraction,
                  dragarc_cipm_enhancement_factor(p, t) * dragarc_cipm_saturation_vapour_pressure(t) / p, 1e-15);
        CHECK_REL(1.0 - wet.density / dry.density, wet.vapour_fraction * (1.0 - M_VAPOUR / M_DRY), 0.03);
    }
}

TEST(speed_of_sound_of_dry_air_is_the_1976_value_with_cipm_constants)
{
    /* U.S. Standard Atmosphere 1976, Table I: a = 340.294 m/s at 288.15 K, sqrt(gamma R* T / M0) with
     * gamma = 1.4. Here R/M_a is the CIPM's, 1.8e-5 smaller, so a is scaled by sqrt of the ratio.
     * Tolerance: half a unit in the printed third decimal (1.5e-6) plus 1e-6. */
    dragarc_moist_air m = air(288.15, 101325.0, 0.0);
    CHECK_REL(m.speed_of_sound, 340.294 * sqrt((R_CIPM / M_DRY) / (8314.32 / 28.9644)), 2.5e-6);
}

TEST(humid_air_carries_sound_faster)
{
    /* Ideal-gas mixture (common practice, no source): a^2 = gamma R T / M; vapour lowers M more than it
     * lowers gamma (from 1.4 toward 4/3). Written out here; 1e-14. Measured at 20 degC saturated: +0.37 %. */
    dragarc_moist_air dry = air(293.15, 101325.0, 0.0), wet = air(293.15, 101325.0, 1.0);
    double x = wet.vapour_fraction, cv = 2.5 * (1.0 - x) + 3.0 * x;
    double m = (1.0 - x) * M_DRY + x * M_VAPOUR;
    CHECK(wet.speed_of_sound > dry.speed_of_sound);
    CHECK_REL(wet.speed_of_sound, sqrt((cv + 1.0) / cv * R_CIPM * 293.15 / m), 1e-14);
    printf("  20 degC saturated: speed of sound %+.3f %% against dry air\n",
           100.0 * (wet.speed_of_sound / dry.speed_of_sound - 1.0));
}

TEST(viscosity_is_sutherlands_for_dry_air)
{
    /* Humidity is ignored for the viscosity (docs/models.md); the value is the dry-air law's. */
    CHECK(air(303.15, 100000.0, 0.9).viscosity == dragarc_air_viscosity(303.15));
}

TEST(local_model_at_the_datum_is_the_cipm_air)
{
    /* At z = 0 the model is the CIPM equation at the given weather, bit for bit. */
    dragarc_atmosphere a = local(291.15, 101300.0, 0.62);
    dragarc_air out;
    CHECK(dragarc_atmosphere_check(&a, NULL) == DRAGARC_OK);
    CHECK(dragarc_atmosphere_eval(&a, 0.0, &out, NULL) == DRAGARC_OK);
    dragarc_moist_air m = air(291.15, 101300.0, 0.62);
    CHECK(out.temperature == 291.15);
    CHECK(out.pressure == 101300.0);
    CHECK(out.density == m.density);
    CHECK(out.speed_of_sound == m.speed_of_sound);
    CHECK(out.viscosity == m.viscosity);
}

TEST(local_model_at_1000_m_follows_the_barometric_formula)
{
    /* U.S. Standard Atmosphere 1976, eq. 33a with the site as the layer base and the first layer's lapse
     * rate L = -6.5 K/km: T = T0 + L z, p = p0 (T/T0)^(-g0 M0 / (R* L)), g0 = 9.80665 m/s^2,
     * M0 = 28.9644 kg/kmol, R* = 8314.32 J/(kmol K); the relative humidity held. Written out here: 1e-13. */
    const double t0 = 299.15, p0 = 95000.0, h = 0.7;
    const double expo = 9.80665 * 28.9644 / (8314.32 * 0.0065);
    dragarc_atmosphere a = local(t0, p0, h);
    const double heights[] = {1000.0, -500.0, 250.0};
    for (size_t i = 0; i < sizeof heights / sizeof heights[0]; i++) {
        double z = heights[i], t = t0 - 0.0065 * z, p = p0 * pow(t / t0, expo);
        dragarc_air out;
        CHECK(dragarc_atmosphere_eval(&a, z, &out, NULL) == DRAGARC_OK);
        CHECK_REL(out.temperature, t, 1e-15);
        CHECK_REL(out.pressure, p, 1e-13);
        CHECK_REL(out.density, air(t, p, h).density, 1e-13);
    }
    /* The exponent g0 M0 / (R* |L|) = 5.25588 (the 1976 standard's first-layer exponent). */
    CHECK_ABS(expo, 5.25588, 5e-6);
}

TEST(local_model_with_the_standard_sea_level_weather_is_the_1976_troposphere)
{
    /* Dry air at 288.15 K and 101325 Pa: T and p are the standard's at geopotential height H = z (the model
     * takes z as geopotential), i.e. at geometric altitude r0 z / (r0 - z). Same formula, same constants: 1e-12. */
    dragarc_atmosphere a = local(288.15, 101325.0, 0.0);
    const double heights[] = {500.0, 3000.0, 10999.0};
    for (size_t i = 0; i < sizeof heights / sizeof heights[0]; i++) {
        double z = heights[i];
        dragarc_air out, isa;
        CHECK(dragarc_atmosphere_eval(&a, z, &out, NULL) == DRAGARC_OK);
        CHECK(dragarc_isa_eval(DRAGARC_ISA_R_EARTH * z / (DRAGARC_ISA_R_EARTH - z), 0.0, &isa, NULL) == DRAGARC_OK);
        CHECK_REL(out.temperature, isa.temperature, 1e-12);
        CHECK_REL(out.pressure, isa.pressure, 1e-12);
    }
}

TEST(local_model_ends_11_km_above_and_1_km_below_the_site)
{
    dragarc_atmosphere a = local(288.15, 101325.0, 0.5);
    dragarc_air out;
    dragarc_error e;
    CHECK(dragarc_atmosphere_eval(&a, 11000.0, &out, &e) == DRAGARC_OK);
    CHECK(dragarc_atmosphere_eval(&a, -1000.0, &out, &e) == DRAGARC_OK);
    CHECK(dragarc_atmosphere_eval(&a, 11000.5, &out, &e) == DRAGARC_ERANGE);
    CHECK(strcmp(e.field, "environment.atmosphere") == 0);
    CHECK(strstr(e.message, "11000") != NULL && strstr(e.message, "'local'") != NULL);
    CHECK(dragarc_atmosphere_eval(&a, -1000.5, &out, &e) == DRAGARC_ERANGE);
    CHECK(dragarc_atmosphere_eval(&a, NAN, &out, &e) == DRAGARC_ERANGE);
    CHECK(dragarc_atmosphere_ceiling(&a) == 11000.0);
    CHECK(dragarc_atmosphere_breaks(&a, NULL, 0) == 0); /* one lapse rate: no kinks */
    /* Hot, thin, saturated air: 1 km below the site the vapour would exceed the pressure. */
    dragarc_atmosphere steam = local(340.0, 30000.0, 1.0);
    CHECK(dragarc_atmosphere_eval(&steam, -1000.0, &out, &e) == DRAGARC_ERANGE);
    CHECK(strcmp(e.field, "environment.atmosphere.relative_humidity") == 0);
}

/* One validation rule: the atmosphere is refused, naming field, with want in the message. */
static void refused(dragarc_atmosphere a, const char *field, const char *want)
{
    dragarc_error e;
    int rc = dragarc_atmosphere_check(&a, &e);
    CHECK(rc == DRAGARC_EINVAL);
    CHECK(rc != DRAGARC_OK && strcmp(e.field, field) == 0);
    CHECK(rc != DRAGARC_OK && strstr(e.message, want) != NULL);
    if (rc != DRAGARC_OK && (strcmp(e.field, field) != 0 || !strstr(e.message, want)))
        printf("  got %s: %s\n", e.field, e.message);
}

TEST(local_model_refuses_each_bad_site_value)
{
    refused(local(179.9, 101325.0, 0.5), "temperature", "must be between 180 and 340 K (got 179.9)");
    refused(local(340.1, 101325.0, 0.5), "temperature", "(got 340.1)");
    refused(local(18.0, 101325.0, 0.5), "temperature", "(got 18): for degrees Celsius write the unit, \"18 degC\"");
    refused(local(NAN, 101325.0, 0.5), "temperature", "must be between");
    refused(local(288.15, 29999.0, 0.5), "pressure", "must be between 30000 and 110000 Pa (got 29999)");
    refused(local(288.15, 110001.0, 0.5), "pressure", "(got 110001)");
    refused(local(288.15, 1013.0, 0.5), "pressure", "(got 1013): for hectopascals write the unit, \"1013 hPa\"");
    refused(local(288.15, NAN, 0.5), "pressure", "must be between");
    refused(local(288.15, 101325.0, -0.01), "relative_humidity", "must be between 0 and 1 (got -0.01)");
    refused(local(288.15, 101325.0, 1.01), "relative_humidity", "must be between 0 and 1 (got 1.01)");
    refused(local(288.15, 101325.0, 55.0), "relative_humidity",
            "must be between 0 and 1 (got 55): a fraction, so 55 % is 0.55");
    refused(local(288.15, 101325.0, NAN), "relative_humidity", "must be between 0 and 1");
    /* the ends of each range are accepted */
    dragarc_atmosphere lo = local(180.0, 30000.0, 0.0), hi = local(340.0, 110000.0, 1.0);
    CHECK(dragarc_atmosphere_check(&lo, NULL) == DRAGARC_OK);
    CHECK(dragarc_atmosphere_check(&hi, NULL) == DRAGARC_OK);
}

TEST(moist_air_refuses_each_bad_argument)
{
    dragarc_moist_air m;
    dragarc_error e;
    CHECK(dragarc_moist_air_eval(0.0, 101325.0, 0.5, 0.0004, &m, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "temperature") == 0);
    CHECK(dragarc_moist_air_eval(INFINITY, 101325.0, 0.5, 0.0004, &m, &e) == DRAGARC_EINVAL);
    CHECK(dragarc_moist_air_eval(293.15, -1.0, 0.5, 0.0004, &m, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "pressure") == 0);
    CHECK(dragarc_moist_air_eval(293.15, 101325.0, 1.5, 0.0004, &m, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "relative_humidity") == 0);
    CHECK(dragarc_moist_air_eval(293.15, 101325.0, NAN, 0.0004, &m, &e) == DRAGARC_EINVAL);
    CHECK(dragarc_moist_air_eval(293.15, 101325.0, 0.5, 0.02, &m, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "co2_fraction") == 0);
    /* Saturated air at 100 degC and 900 hPa: the vapour pressure exceeds the total pressure. */
    CHECK(dragarc_moist_air_eval(373.15, 90000.0, 1.0, 0.0004, &m, &e) == DRAGARC_ERANGE);
    CHECK(strcmp(e.field, "relative_humidity") == 0);
    /* More CO2 makes dry air heavier: M_a grows by 12.011e-3 kg/mol per unit fraction (the paper's M_a). */
    CHECK_REL(dragarc_cipm_dry_molar_mass(0.0014) - dragarc_cipm_dry_molar_mass(0.0004), 12.011e-6, 1e-9);
}

TEST(scenario_reads_the_local_model_with_units)
{
    /* "18 degC" is 291.15 K and "1013 hPa" 101300 Pa by the definitions of the units (exact). */
    static const char json[] =
        "{\"projectile\": {\"mass\": 0.145, \"diameter\": 0.074, \"drag\": {\"model\": \"constant\", \"cd\": 0.35}},"
        " \"launch\": {\"speed\": 30, \"elevation\": 30},"
        " \"environment\": {\"atmosphere\": {\"model\": \"local\", \"temperature\": \"18 degC\","
        " \"pressure\": \"1013 hPa\", \"relative_humidity\": 0.6}}}";
    dragarc_scenario s;
    dragarc_error e;
    CHECK(dragarc_scenario_parse(json, NULL, NULL, &s, &e) == DRAGARC_OK);
    CHECK(s.atmosphere.model == DRAGARC_ATMOSPHERE_LOCAL);
    CHECK_ABS(s.atmosphere.temperature, 291.15, 1e-12);
    CHECK_ABS(s.atmosphere.pressure, 101300.0, 1e-9);
    CHECK(s.atmosphere.relative_humidity == 0.6);
    dragarc_scenario_clear(&s);
}

TEST(scenario_refuses_a_launch_or_ground_outside_the_local_model)
{
    dragarc_scenario s;
    dragarc_error e;
    dragarc_scenario_default(&s);
    s.projectile.mass = 0.145;
    s.projectile.diameter = 0.074;
    s.projectile.area = 0.0043;
    s.launch.speed = 30.0;
    s.launch.elevation = 0.5;
    s.atmosphere = local(288.15, 101325.0, 0.5);
    CHECK(dragarc_scenario_check(&s, &e) == DRAGARC_OK);
    s.launch.height = 11500.0;
    CHECK(dragarc_scenario_check(&s, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.height") == 0 && strstr(e.message, "11000") != NULL);
    s.launch.height = 0.0;
    s.ground_elevation = -1500.0;
    CHECK(dragarc_scenario_check(&s, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "ground.elevation") == 0 && strstr(e.message, "-1000") != NULL);
}

TEST(a_flight_above_11_km_leaves_the_local_model_with_an_error)
{
    /* A dense 10 kg sphere at 700 m/s straight up rises well past 11 km; the flight stops there. */
    dragarc_scenario s;
    dragarc_flight f;
    dragarc_error e;
    dragarc_scenario_default(&s);
    s.projectile.mass = 10.0;
    s.projectile.diameter = 0.1;
    s.projectile.area = 0.25 * 3.14159265358979 * 0.01;
    s.projectile.drag.model = DRAGARC_DRAG_CONSTANT;
    s.projectile.drag.cd = 0.1;
    s.launch.speed = 700.0;
    s.launch.elevation = 1.5;
    s.atmosphere = local(288.15, 101325.0, 0.5);
    int rc = dragarc_flight_run(&s, 0.0, &f, &e);
    CHECK(rc == DRAGARC_ERANGE);
    CHECK(rc != DRAGARC_OK && strcmp(e.field, "environment.atmosphere") == 0);
    CHECK(rc != DRAGARC_OK && strstr(e.message, "climbs more than 11000 m above the site datum") != NULL);
    dragarc_flight_clear(&f);
}

int main(void)
{
    dragarc_init();
    RUN(saturation_vapour_pressure_matches_iapws_if97_at_300_K);
    RUN(saturation_vapour_pressure_matches_the_triple_point_of_water);
    RUN(dry_air_is_the_ideal_gas_over_the_compressibility);
    RUN(dry_air_at_standard_sea_level_is_the_1976_density_corrected_for_constants_and_z);
    RUN(humidity_lowers_the_density);
    RUN(speed_of_sound_of_dry_air_is_the_1976_value_with_cipm_constants);
    RUN(humid_air_carries_sound_faster);
    RUN(viscosity_is_sutherlands_for_dry_air);
    RUN(local_model_at_the_datum_is_the_cipm_air);
    RUN(local_model_at_1000_m_follows_the_barometric_formula);
    RUN(local_model_with_the_standard_sea_level_weather_is_the_1976_troposphere);
    RUN(local_model_ends_11_km_above_and_1_km_below_the_site);
    RUN(local_model_refuses_each_bad_site_value);
    RUN(moist_air_refuses_each_bad_argument);
    RUN(scenario_reads_the_local_model_with_units);
    RUN(scenario_refuses_a_launch_or_ground_outside_the_local_model);
    RUN(a_flight_above_11_km_leaves_the_local_model_with_an_error);
    return check_summary();
}
