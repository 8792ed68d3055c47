/* test_units.c: values with units read by UDUNITS-2 (src/io/units.c).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Conversion factors are checked against their exact definitions in NIST Special Publication 811 (Thompson &
 * Taylor 2008, "Guide for the Use of the International System of Units", appendix B.8 and B.9): 1 ft =
 * 0.3048 m, 1 in = 0.0254 m, 1 yd = 0.9144 m, 1 mi = 1609.344 m, 1 mph = 0.44704 m/s, 1 knot = 1852/3600
 * m/s, 1 nautical mile = 1852 m, 1 lb = 0.45359237 kg, 1 oz (avoirdupois) = 0.028349523125 kg, 1 bar =
 * 1e5 Pa, 1 US gallon = 3.785411784e-3 m^3, 1 cP = 1e-3 Pa s, t/degC = T/K - 273.15 and t/degF =
 * 1.8 t/degC + 32 (exact by definition). NIST lists 1 psi = 6.894 757 E+03 Pa (7 digits, the rest of the
 * digits depend on the standard acceleration of gravity and the inch): checked to the digits printed.
 * Exact factors are held to 2 ulp of the result (one rounding in UDUNITS's factor, one in the product).
 */
#include <math.h>
#include <string.h>

#include "check.h"
#include "dragarc/units.h"

static dragarc_units *U;

static double si(const char *text, dragarc_quantity q)
{
    double v = NAN;
    dragarc_error e;
    if (dragarc_units_parse(U, text, q, &v, &e) != DRAGARC_OK)
        printf("  %s: %s\n", text, e.message);
    return v;
}

/* The message of a failed parse, or "" when it did not fail. */
static const char *fails(const char *text, dragarc_quantity q)
{
    static dragarc_error e;
    double v;
    memset(&e, 0, sizeof e);
    if (dragarc_units_parse(U, text, q, &v, &e) == DRAGARC_OK)
        return "";
    return e.message;
}

#define ULP2(x) (4.5e-16 * fabs(x))

TEST(lengths_match_their_exact_definitions)
{
    CHECK_ABS(si("1 ft", DRAGARC_Q_LENGTH), 0.3048, ULP2(0.3048));
    CHECK_ABS(si("5280 ft", DRAGARC_Q_LENGTH), 1609.344, ULP2(1609.344));
    CHECK_ABS(si("12 in", DRAGARC_Q_LENGTH), 0.3048, ULP2(0.3048));
    CHECK_ABS(si("150 yd", DRAGARC_Q_LENGTH), 137.16, ULP2(137.16));
    CHECK_ABS(si("1 mi", DRAGARC_Q_LENGTH), 1609.344, ULP2(1609.344));
    CHECK_ABS(si("1 nmi", DRAGARC_Q_LENGTH), 1852.0, ULP2(1852.0));
    CHECK_ABS(si("35 kft", DRAGARC_Q_LENGTH), 10668.0, ULP2(10668.0));
    CHECK_ABS(si("250 um", DRAGARC_Q_LENGTH), 250e-6, ULP2(250e-6));
    CHECK_ABS(si("250 µm", DRAGARC_Q_LENGTH), 250e-6, ULP2(250e-6));
    CHECK_ABS(si("-3 ft", DRAGARC_Q_LENGTH), -0.9144, ULP2(0.9144));
}

TEST(speeds_match_their_exact_definitions)
{
    CHECK_ABS(si("1 mph", DRAGARC_Q_SPEED), 0.44704, ULP2(0.44704));
    CHECK_ABS(si("89.5 mph", DRAGARC_Q_SPEED), 89.5 * 0.44704, ULP2(40.0));
    CHECK_ABS(si("1 knot", DRAGARC_Q_SPEED), 1852.0 / 3600.0, ULP2(0.5));
    CHECK_ABS(si("1 kt", DRAGARC_Q_SPEED), 1852.0 / 3600.0, ULP2(0.5));
    CHECK_ABS(si("1 kn", DRAGARC_Q_SPEED), 1852.0 / 3600.0, ULP2(0.5));
    CHECK_ABS(si("36 km/h", DRAGARC_Q_SPEED), 10.0, ULP2(10.0));
    CHECK_ABS(si("36 kph", DRAGARC_Q_SPEED), 10.0, ULP2(10.0));
    CHECK_ABS(si("100 fps", DRAGARC_Q_SPEED), 30.48, ULP2(30.48));
    CHECK_ABS(si("100 ft/s", DRAGARC_Q_SPEED), 30.48, ULP2(30.48));
    CHECK_ABS(si("40", DRAGARC_Q_SPEED), 40.0, 0.0);
}

TEST(masses_pressures_volumes_and_viscosities_match_their_definitions)
{
    CHECK_ABS(si("1 lb", DRAGARC_Q_MASS), 0.45359237, ULP2(0.45));
    CHECK_ABS(si("1 lbm", DRAGARC_Q_MASS), 0.45359237, ULP2(0.45));
    CHECK_ABS(si("5.125 oz", DRAGARC_Q_MASS), 5.125 * 0.028349523125, ULP2(0.15));
    CHECK_ABS(si("145 g", DRAGARC_Q_MASS), 0.145, ULP2(0.145));
    CHECK_ABS(si("2.5 bar", DRAGARC_Q_PRESSURE), 2.5e5, ULP2(2.5e5));
    CHECK_ABS(si("1013.25 hPa", DRAGARC_Q_PRESSURE), 101325.0, ULP2(101325.0));
    CHECK_ABS(si("1 psi", DRAGARC_Q_PRESSURE), 6894.757, 0.0005); /* NIST's 7 digits */
    CHECK_ABS(si("1 gal", DRAGARC_Q_VOLUME), 3.785411784e-3, ULP2(3.8e-3));
    CHECK_ABS(si("1 L", DRAGARC_Q_VOLUME), 1e-3, ULP2(1e-3));
    CHECK_ABS(si("1.8 cP", DRAGARC_Q_VISCOSITY), 1.8e-3, ULP2(1.8e-3));
    CHECK_ABS(si("1.2 g/L", DRAGARC_Q_DENSITY), 1.2, ULP2(1.2));
    CHECK_ABS(si("32.174 ft/s2", DRAGARC_Q_ACCELERATION), 32.174 * 0.3048, ULP2(9.8));
    CHECK_ABS(si("2 min", DRAGARC_Q_TIME), 120.0, ULP2(120.0));
    CHECK_ABS(si("3 N.s/m", DRAGARC_Q_LINEAR_DRAG), 3.0, ULP2(3.0));
    CHECK_ABS(si("0.002 N.s2/m2", DRAGARC_Q_QUADRATIC_DRAG), 0.002, ULP2(0.002));
}

TEST(temperatures_are_absolute_and_offsets_are_differences)
{
    CHECK_ABS(si("20 degC", DRAGARC_Q_TEMPERATURE), 293.15, ULP2(293.15));
    CHECK_ABS(si("68 degF", DRAGARC_Q_TEMPERATURE), 293.15, 1e-12); /* (68 - 32) / 1.8 + 273.15 */
    CHECK_ABS(si("288.15 K", DRAGARC_Q_TEMPERATURE), 288.15, 0.0);
    /* A difference: 18 degF is 10 K, 10 degC is 10 K, whatever the scales' zero points. */
    CHECK_ABS(si("18 degF", DRAGARC_Q_TEMPERATURE_DIFFERENCE), 10.0, ULP2(10.0));
    CHECK_ABS(si("10 degC", DRAGARC_Q_TEMPERATURE_DIFFERENCE), 10.0, ULP2(10.0));
    CHECK_ABS(si("-9 degF", DRAGARC_Q_TEMPERATURE_DIFFERENCE), -5.0, ULP2(5.0));
    CHECK_ABS(si("-5 K", DRAGARC_Q_TEMPERATURE_DIFFERENCE), -5.0, 0.0);
}

TEST(angles_are_read_in_degrees)
{
    CHECK_ABS(si("30", DRAGARC_Q_ANGLE), 30.0, 0.0);
    CHECK_ABS(si("30 deg", DRAGARC_Q_ANGLE), 30.0, 1e-13);
    CHECK_ABS(si("30 degree", DRAGARC_Q_ANGLE), 30.0, 1e-13);
    CHECK_ABS(si("0.5 rad", DRAGARC_Q_ANGLE), 0.5 * 180.0 / 3.14159265358979323846, 1e-13);
    CHECK_ABS(si("0.25 rev", DRAGARC_Q_ANGLE), 90.0, 1e-13);
    CHECK_ABS(si("90 arcmin", DRAGARC_Q_ANGLE), 1.5, 1e-13);
}

TEST(a_unit_of_another_quantity_is_named_in_the_error)
{
    CHECK(strcmp(fails("3 kg", DRAGARC_Q_SPEED), "\"3 kg\" is a mass, expected a speed") == 0);
    CHECK(strcmp(fails("40 mph", DRAGARC_Q_LENGTH), "\"40 mph\" is a speed, expected a length") == 0);
    CHECK(strcmp(fails("30 deg", DRAGARC_Q_LENGTH), "\"30 deg\" is an angle, expected a length") == 0);
    CHECK(strcmp(fails("5 %", DRAGARC_Q_ANGLE), "\"5 %\" is a pure number, expected an angle") == 0);
    CHECK(strcmp(fails("2 bar", DRAGARC_Q_TEMPERATURE), "\"2 bar\" is a pressure, expected a temperature") == 0);
    CHECK(strstr(fails("3 kg.m", DRAGARC_Q_SPEED), "\"3 kg.m\" is not a speed") != NULL);
    /* UDUNITS-2 converts reciprocal units (10 Hz to 0.1 s); a value must have the dimension itself. */
    CHECK(strcmp(fails("10 Hz", DRAGARC_Q_TIME), "\"10 Hz\" is a frequency, expected a time") == 0);
    CHECK(strcmp(fails("3000 rpm", DRAGARC_Q_SPEED), "\"3000 rpm\" is an angular speed, expected a speed") == 0);
    CHECK(strcmp(fails("40 Hz", DRAGARC_Q_ANGULAR_SPEED),
                 "\"40 Hz\" is a frequency, expected an angular speed (say what turns: rpm, rps, rad/s)") == 0);
    CHECK_ABS(si("45 rps", DRAGARC_Q_ANGULAR_SPEED), 2700.0, 1e-9);
    CHECK_ABS(si("2700", DRAGARC_Q_ANGULAR_SPEED), 2700.0, 0.0);
    CHECK_ABS(si("100 rad/s", DRAGARC_Q_ANGULAR_SPEED), 100.0 * 60.0 / (2.0 * 3.14159265358979323846), 1e-9);
}

TEST(malformed_values_are_refused)
{
    CHECK(strstr(fails("mph", DRAGARC_Q_SPEED), "does not start with a number") != NULL);
    CHECK(strstr(fails("", DRAGARC_Q_SPEED), "does not start with a number") != NULL);
    CHECK(strstr(fails("40 blorps", DRAGARC_Q_SPEED), "unknown unit \"blorps\"") != NULL);
    CHECK(strstr(fails("0.35 m", DRAGARC_Q_NUMBER), "pure number and takes no unit") != NULL);
    CHECK(strstr(fails("1e999 m", DRAGARC_Q_LENGTH), "not a finite number") != NULL);
    CHECK(strstr(fails("nan m", DRAGARC_Q_LENGTH), "not a finite number") != NULL);
    CHECK(strstr(fails("1e306 Mft", DRAGARC_Q_LENGTH), "out of range") != NULL);
}

TEST(quantities_have_names_and_units)
{
    CHECK(strcmp(dragarc_quantity_name(DRAGARC_Q_SPEED), "a speed") == 0);
    CHECK(strcmp(dragarc_quantity_unit(DRAGARC_Q_ANGLE), "degree") == 0);
    CHECK(strcmp(dragarc_quantity_unit(DRAGARC_Q_NUMBER), "") == 0);
    CHECK(strcmp(dragarc_quantity_name((dragarc_quantity)99), "an unknown quantity") == 0);
}

/* Output units: a value in SI shown in the display's unit; the exact factors are the inverses of the
 * NIST SP 811 definitions above (1 ft.lbf = 0.3048 m x 4.4482216152605 N = 1.3558179483314004 J; 4.4482216152605 N
 * is the pound-force, 0.45359237 kg x 9.80665 m/s^2, exact). */
static double shown(const dragarc_display *d, const char *field, dragarc_quantity q, double v)
{
    return dragarc_display_value(dragarc_display_unit(d, field, q), v);
}

TEST(us_output_units_convert_by_the_exact_factors)
{
    dragarc_display d;
    dragarc_error e;
    CHECK(dragarc_display_system(&d, U, "us", &e) == DRAGARC_OK);
    CHECK_ABS(shown(&d, "range", DRAGARC_Q_LENGTH, 0.3048), 1.0, ULP2(1.0));
    CHECK_ABS(shown(&d, NULL, DRAGARC_Q_SPEED, 0.44704), 1.0, ULP2(1.0));
    CHECK_ABS(shown(&d, NULL, DRAGARC_Q_MASS, 0.45359237), 1.0, ULP2(1.0));
    CHECK_ABS(shown(&d, NULL, DRAGARC_Q_ENERGY, 0.3048 * 0.45359237 * 9.80665), 1.0, 4.0 * ULP2(1.0));
    CHECK_ABS(shown(&d, NULL, DRAGARC_Q_TEMPERATURE, 293.15), 68.0, 1e-12);
    CHECK_ABS(shown(&d, NULL, DRAGARC_Q_TEMPERATURE_DIFFERENCE, 5.0), 9.0, ULP2(9.0));
    CHECK_ABS(shown(&d, NULL, DRAGARC_Q_ANGLE, 30.0), 30.0, 0.0);
    CHECK_ABS(shown(&d, NULL, DRAGARC_Q_TIME, 2.5), 2.5, 0.0);
    CHECK(strcmp(dragarc_display_unit(&d, "range", DRAGARC_Q_LENGTH)->symbol, "ft") == 0);
    CHECK(strcmp(dragarc_display_unit(&d, NULL, DRAGARC_Q_ENERGY)->symbol, "ft.lbf") == 0);
}

TEST(a_field_override_beats_its_quantity_and_the_system)
{
    dragarc_display d;
    dragarc_error e;
    CHECK(dragarc_display_system(&d, U, "us", &e) == DRAGARC_OK);
    CHECK(dragarc_display_set(&d, U, "range", "yd", &e) == DRAGARC_OK);
    CHECK(dragarc_display_set(&d, U, "speed", "kt", &e) == DRAGARC_OK);
    CHECK_ABS(shown(&d, "range", DRAGARC_Q_LENGTH, 0.9144), 1.0, ULP2(1.0));
    CHECK_ABS(shown(&d, "downrange", DRAGARC_Q_LENGTH, 0.3048), 1.0, ULP2(1.0)); /* still feet */
    CHECK_ABS(shown(&d, "impact_speed", DRAGARC_Q_SPEED, 1852.0 / 3600.0), 1.0, ULP2(1.0));
    CHECK(dragarc_display_set(&d, U, "range", "m", &e) == DRAGARC_OK); /* set again: replaced */
    CHECK_ABS(shown(&d, "range", DRAGARC_Q_LENGTH, 2.0), 2.0, 0.0);
    CHECK(d.nfields == 1);
    dragarc_display si;
    dragarc_display_si(&si);
    CHECK_ABS(shown(&si, "range", DRAGARC_Q_LENGTH, 2.0), 2.0, 0.0);
    CHECK(strcmp(dragarc_display_unit(&si, NULL, DRAGARC_Q_ANGLE)->symbol, "degree") == 0);
}

TEST(output_units_of_the_wrong_quantity_are_refused)
{
    dragarc_display d;
    dragarc_error e;
    dragarc_display_si(&d);
    CHECK(dragarc_display_set(&d, U, "range", "kg", &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.message, "\"kg\" is a unit of mass, not of length") == 0);
    CHECK(dragarc_display_set(&d, U, "energy", "W", &e) == DRAGARC_EINVAL);
    CHECK(strstr(e.message, "\"W\" is not a unit of energy") != NULL);
    CHECK(dragarc_display_set(&d, U, "angle", "%", &e) == DRAGARC_EINVAL);
    CHECK(dragarc_display_set(&d, U, "colour", "m", &e) == DRAGARC_EINVAL);
    CHECK(strstr(e.message, "neither a quantity") != NULL);
    CHECK(dragarc_display_system(&d, U, "metric", &e) == DRAGARC_EINVAL);
    CHECK(strstr(e.message, "unknown unit system") != NULL);
    CHECK(dragarc_display_set(&d, U, "range", "blorp", &e) == DRAGARC_EINVAL);
}

int main(void)
{
    dragarc_error e;
    if (dragarc_units_new(&U, &e) != DRAGARC_OK) {
        printf("could not load the units database: %s\n", e.message);
        return 1;
    }
    RUN(lengths_match_their_exact_definitions);
    RUN(speeds_match_their_exact_definitions);
    RUN(masses_pressures_volumes_and_viscosities_match_their_definitions);
    RUN(temperatures_are_absolute_and_offsets_are_differences);
    RUN(angles_are_read_in_degrees);
    RUN(a_unit_of_another_quantity_is_named_in_the_error);
    RUN(malformed_values_are_refused);
    RUN(quantities_have_names_and_units);
    RUN(us_output_units_convert_by_the_exact_factors);
    RUN(a_field_override_beats_its_quantity_and_the_system);
    RUN(output_units_of_the_wrong_quantity_are_refused);
    dragarc_units_free(U);
    return check_summary();
}
