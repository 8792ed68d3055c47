/* units.c: values with units at the interface, read with UDUNITS-2.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A value is a number followed by an optional unit expression in UDUNITS-2's grammar ("89.5 mph",
 * "1.2e3 ft", "9.81 m/s2", "20 degC"). It is converted to the quantity's interface unit by UDUNITS-2's
 * converter: x_SI = cv(x), or for a temperature difference x_SI = x times the converter's slope, so that the
 * offset of a Celsius or Fahrenheit scale drops out ("18 degF" is 10 K). Angles convert to degrees, the interface unit
 * of angles; UDUNITS counts the radian as dimensionless, so an angle's unit must be built on the radian
 * (degree, rad, arcmin, revolution), not merely be a pure number.
 *
 * Symbols added or corrected here, each with its exact definition (NIST Special Publication 811, 2008
 * edition, appendix B.8 and B.9, "Factors for units listed alphabetically"):
 *   mph  mile per hour      0.44704 m/s exactly   (UDUNITS reads "mph" as milli-phot)
 *   kph  kilometre per hour 1/3.6 m/s             (UDUNITS reads "kph" as kilo-phot)
 *   nmi  nautical mile      1852 m exactly        (UDUNITS reads "nmi" as nano-mile)
 *   kn   knot               1852/3600 m/s         (absent; "kt" and "knot" are UDUNITS's own)
 *   fps  foot per second    0.3048 m/s exactly    (absent)
 *   gal  US gallon          3.785411784e-3 m^3    (UDUNITS reads "gal" as the galileo, 0.01 m/s^2)
 *   gpm  US gallon a minute                       (absent)
 *   oz   avoirdupois ounce  0.028349523125 kg     (UDUNITS reads "oz" as the fluid ounce, a volume)
 *   lbm  pound (mass)       0.45359237 kg         (absent; UDUNITS's "lb" is the same pound)
 *   deg  degree of arc      pi/180 rad            (absent)
 *   rev  revolution         2 pi rad              (absent)
 *   cP   centipoise         1e-3 Pa s             (absent)
 */
#include <ctype.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <udunits2.h>

#include "dragarc/units.h"

static const struct {
    const char *symbol, *definition;
} ADDED[] = {
    {"mph", "mile/hour"},    {"kph", "km/hour"},     {"nmi", "1852 m"},          {"kn", "1852 m/hour"},
    {"fps", "0.3048 m/s"},   {"gal", "3.785411784e-3 m3"}, {"gpm", "3.785411784e-3 m3/minute"},
    {"oz", "0.028349523125 kg"}, {"lbm", "0.45359237 kg"}, {"deg", "degree"}, {"rev", "revolution"},
    {"cP", "1e-3 Pa.s"},
};

struct dragarc_units {
    ut_system *sys;
    ut_unit *target[DRAGARC_Q_COUNT]; /* NULL for pure numbers */
    ut_unit *radian;
};

void dragarc_units_free(dragarc_units *u)
{
    if (!u)
        return;
    for (int q = 0; q < DRAGARC_Q_COUNT; q++)
        ut_free(u->target[q]);
    ut_free(u->radian);
    if (u->sys)
        ut_free_system(u->sys);
    free(u);
}

int dragarc_units_new(dragarc_units **out, dragarc_error *err)
{
    *out = NULL;
    ut_set_error_message_handler(ut_ignore); /* UDUNITS would print to stderr; the library never prints */
    dragarc_units *u = calloc(1, sizeof *u);
    if (!u)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the units database");
    u->sys = ut_read_xml(NULL);
    if (!u->sys) {
        const char *path = getenv("UDUNITS2_XML_PATH");
        dragarc_units_free(u);
        return dragarc_error_set(err, DRAGARC_EINVAL, "",
                                 "the UDUNITS-2 units database could not be read (%s); is Debian's libudunits2-data "
                                 "installed?",
                                 path ? path : "the installed default");
    }
    for (size_t i = 0; i < sizeof ADDED / sizeof ADDED[0]; i++) {
        ut_unit *v = ut_parse(u->sys, ADDED[i].definition, UT_ASCII);
        ut_unmap_symbol_to_unit(u->sys, ADDED[i].symbol, UT_ASCII);
        ut_unmap_name_to_unit(u->sys, ADDED[i].symbol, UT_ASCII); /* "gal" is the galileo's name */
        int st = v ? ut_map_symbol_to_unit(ADDED[i].symbol, UT_ASCII, v) : UT_PARSE;
        ut_free(v);
        if (st != UT_SUCCESS) {
            dragarc_units_free(u);
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "units: could not define \"%s\" as %s (UDUNITS status %d)",
                                     ADDED[i].symbol, ADDED[i].definition, (int)st);
        }
    }
    for (int q = 1; q < DRAGARC_Q_COUNT; q++) {
        u->target[q] = ut_parse(u->sys, dragarc_quantity_unit(q), UT_ASCII);
        if (!u->target[q]) {
            dragarc_units_free(u);
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "units: UDUNITS-2 does not know \"%s\"", dragarc_quantity_unit(q));
        }
    }
    u->radian = ut_parse(u->sys, "rad", UT_ASCII);
    if (!u->radian) {
        dragarc_units_free(u);
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "units: UDUNITS-2 does not know the radian");
    }
    *out = u;
    return DRAGARC_OK;
}

/* Convertible as the same dimension: UDUNITS-2 also converts between reciprocal units (Hz and s, rpm and
 * s/rad), through x -> k/x, which would read "10 Hz" as a time of 0.1 s; such a converter sends 0 to
 * infinity, and is refused here. */
static int convertible(const ut_unit *from, const ut_unit *to)
{
    if (!ut_are_convertible(from, to))
        return 0;
    cv_converter *cv = ut_get_converter((ut_unit *)from, (ut_unit *)to);
    if (!cv)
        return 0;
    int linear = isfinite(cv_convert_double(cv, 0.0));
    cv_free(cv);
    return linear;
}

/* The unit's definition is built on the radian (an angle, an angular speed), not on a pure number. */
static int mentions_radian(const ut_unit *unit)
{
    char def[256];
    int n = ut_format(unit, def, sizeof def, UT_ASCII | UT_DEFINITION);
    return n > 0 && (size_t)n < sizeof def && strstr(def, "rad") != NULL;
}

/* An angle's unit is a multiple of the radian: its definition names "rad" (UDUNITS treats the radian as
 * dimensionless, so convertibility alone would let any pure number through). */
static int is_angle_unit(const dragarc_units *u, const ut_unit *unit)
{
    return convertible(unit, u->radian) && mentions_radian(unit);
}

/* A unit of quantity q itself: the same dimension, an angle built on the radian ("30 deg" is no pure number,
 * even though UDUNITS would convert it), and an angular speed that says what turns ("40 Hz" is a frequency). */
static int measures_quantity(const dragarc_units *u, const ut_unit *unit, dragarc_quantity q)
{
    if (q == DRAGARC_Q_ANGLE)
        return is_angle_unit(u, unit);
    if (!convertible(unit, u->target[q]))
        return 0;
    if (is_angle_unit(u, unit) && !is_angle_unit(u, u->target[q]))
        return 0;
    return q != DRAGARC_Q_ANGULAR_SPEED || mentions_radian(unit);
}

/* The slope of a linear converter, taken over a wide interval so that an offset (the hundreds of kelvin
 * between degF or degC and K) cancels to round-off of the slope itself. */
static double converter_slope(const cv_converter *cv)
{
    return (cv_convert_double(cv, 1e6) - cv_convert_double(cv, -1e6)) / 2e6;
}

/* Which quantity a unit measures, for the message when it is not the one expected. */
static const char *measures(const dragarc_units *u, const ut_unit *unit)
{
    if (is_angle_unit(u, unit))
        return dragarc_quantity_name(DRAGARC_Q_ANGLE);
    for (int q = 1; q < DRAGARC_Q_COUNT; q++) {
        if (q == DRAGARC_Q_ANGLE || q == DRAGARC_Q_TEMPERATURE_DIFFERENCE || !convertible(unit, u->target[q]))
            continue;
        if (q == DRAGARC_Q_ANGULAR_SPEED && !mentions_radian(unit))
            return "a frequency";
        return dragarc_quantity_name(q);
    }
    ut_unit *one = ut_get_dimensionless_unit_one(u->sys);
    int dimensionless = one && convertible(unit, one);
    ut_free(one);
    return dimensionless ? "a pure number" : NULL;
}

int dragarc_units_parse(dragarc_units *u, const char *text, dragarc_quantity q, double *out, dragarc_error *err)
{
    if (!text || (unsigned)q >= DRAGARC_Q_COUNT)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "no value");
    char *end = NULL;
    double v = strtod(text, &end);
    if (end == text)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\" does not start with a number", text);
    while (*end && isspace((unsigned char)*end))
        end++;
    char unit_text[128];
    size_t len = strlen(end);
    while (len > 0 && isspace((unsigned char)end[len - 1]))
        len--;
    if (len >= sizeof unit_text)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\": the unit is too long", text);
    memcpy(unit_text, end, len);
    unit_text[len] = '\0';
    if (!isfinite(v))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\" is not a finite number", text);
    if (len == 0) { /* a number alone is in the quantity's own unit */
        *out = v;
        return DRAGARC_OK;
    }
    if (q == DRAGARC_Q_NUMBER)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\": this is a pure number and takes no unit", text);
    ut_unit *unit = ut_parse(u->sys, unit_text, UT_UTF8);
    if (!unit)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\": unknown unit \"%s\"", text, unit_text);
    if (!measures_quantity(u, unit, q)) {
        const char *what = measures(u, unit);
        int hz = q == DRAGARC_Q_ANGULAR_SPEED && what && strcmp(what, "a frequency") == 0;
        int rc = what ? dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\" is %s, expected %s%s", text, what,
                                          dragarc_quantity_name(q), hz ? " (say what turns: rpm, rps, rad/s)" : "")
                      : dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\" is not %s (in %s)", text, dragarc_quantity_name(q),
                                          dragarc_quantity_unit(q));
        ut_free(unit);
        return rc;
    }
    cv_converter *cv = ut_get_converter(unit, u->target[q]);
    ut_free(unit);
    if (!cv)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\": no conversion to %s", text, dragarc_quantity_unit(q));
    double si = cv_convert_double(cv, v);
    double zero = cv_convert_double(cv, 0.0);
    if (q == DRAGARC_Q_TEMPERATURE_DIFFERENCE && zero != 0.0) {
        si = converter_slope(cv) * v; /* a difference on a scale with an offset: only the slope counts */
    }
    cv_free(cv);
    if (!isfinite(si))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\" is out of range in %s", text, dragarc_quantity_unit(q));
    *out = si;
    return DRAGARC_OK;
}

/* ---- output units ---------------------------------------------------------------------------------- */

/* Output fields that may have a unit of their own (docs/units.md, "Output units"). */
static const dragarc_output_field FIELDS[] = {
    {"range", DRAGARC_Q_LENGTH},           {"downrange", DRAGARC_Q_LENGTH},
    {"crossrange", DRAGARC_Q_LENGTH},      {"apex_height", DRAGARC_Q_LENGTH},
    {"vacuum_range", DRAGARC_Q_LENGTH},    {"impact_position", DRAGARC_Q_LENGTH},
    {"launch_height", DRAGARC_Q_LENGTH},   {"diameter", DRAGARC_Q_LENGTH},
    {"altitude", DRAGARC_Q_LENGTH},        {"time_of_flight", DRAGARC_Q_TIME},
    {"apex_time", DRAGARC_Q_TIME},         {"relaxation_time", DRAGARC_Q_TIME},
    {"impact_speed", DRAGARC_Q_SPEED},     {"terminal_speed", DRAGARC_Q_SPEED},
    {"launch_speed", DRAGARC_Q_SPEED},     {"impact_velocity", DRAGARC_Q_SPEED},
    {"speed_of_sound", DRAGARC_Q_SPEED},   {"impact_energy", DRAGARC_Q_ENERGY},
    {"launch_energy", DRAGARC_Q_ENERGY},   {"mass", DRAGARC_Q_MASS},
    {"impact_angle", DRAGARC_Q_ANGLE},     {"pressure", DRAGARC_Q_PRESSURE},
    {"density", DRAGARC_Q_DENSITY},        {"temperature", DRAGARC_Q_TEMPERATURE},
    {"viscosity", DRAGARC_Q_VISCOSITY},    {"height", DRAGARC_Q_LENGTH},
    {"max_range", DRAGARC_Q_LENGTH},       {"miss", DRAGARC_Q_LENGTH},
    {"temperature_offset", DRAGARC_Q_TEMPERATURE_DIFFERENCE},
    {"spin_rate", DRAGARC_Q_ANGULAR_SPEED},
};

/* Quantity keywords for --unit, in quantity order (NULL: not settable). */
static const char *const QUANTITY_KEYS[DRAGARC_Q_COUNT] = {
    [DRAGARC_Q_LENGTH] = "length",
    [DRAGARC_Q_SPEED] = "speed",
    [DRAGARC_Q_MASS] = "mass",
    [DRAGARC_Q_TIME] = "time",
    [DRAGARC_Q_TEMPERATURE] = "temperature",
    [DRAGARC_Q_TEMPERATURE_DIFFERENCE] = "temperature_difference",
    [DRAGARC_Q_PRESSURE] = "pressure",
    [DRAGARC_Q_DENSITY] = "density",
    [DRAGARC_Q_VISCOSITY] = "viscosity",
    [DRAGARC_Q_ACCELERATION] = "acceleration",
    [DRAGARC_Q_AREA] = "area",
    [DRAGARC_Q_VOLUME] = "volume",
    [DRAGARC_Q_ANGLE] = "angle",
    [DRAGARC_Q_LINEAR_DRAG] = "linear_drag",
    [DRAGARC_Q_QUADRATIC_DRAG] = "quadratic_drag",
    [DRAGARC_Q_ENERGY] = "energy",
    [DRAGARC_Q_ANGULAR_SPEED] = "angular_speed",
};

/* US customary units for each quantity (NIST SP 811 names; ft.lbf for energy, lb/ft3 for density). */
static const char *const US_UNITS[DRAGARC_Q_COUNT] = {
    [DRAGARC_Q_LENGTH] = "ft",
    [DRAGARC_Q_SPEED] = "mph",
    [DRAGARC_Q_MASS] = "lb",
    [DRAGARC_Q_TIME] = "s",
    [DRAGARC_Q_TEMPERATURE] = "degF",
    [DRAGARC_Q_TEMPERATURE_DIFFERENCE] = "degF",
    [DRAGARC_Q_PRESSURE] = "psi",
    [DRAGARC_Q_DENSITY] = "lb/ft3",
    [DRAGARC_Q_VISCOSITY] = "lb/(ft.s)",
    [DRAGARC_Q_ACCELERATION] = "ft/s2",
    [DRAGARC_Q_AREA] = "ft2",
    [DRAGARC_Q_VOLUME] = "ft3",
    [DRAGARC_Q_ANGLE] = "degree",
    [DRAGARC_Q_LINEAR_DRAG] = "lb/s",
    [DRAGARC_Q_QUADRATIC_DRAG] = "lb/ft",
    [DRAGARC_Q_ENERGY] = "ft.lbf",
    [DRAGARC_Q_ANGULAR_SPEED] = "rpm",
};

const dragarc_output_field *dragarc_display_fields(size_t *count)
{
    if (count)
        *count = sizeof FIELDS / sizeof FIELDS[0];
    return FIELDS;
}

static void unit_identity(dragarc_unit_out *o, const char *symbol)
{
    snprintf(o->symbol, sizeof o->symbol, "%s", symbol);
    o->scale = 1.0;
    o->offset = 0.0;
}

void dragarc_display_si(dragarc_display *d)
{
    memset(d, 0, sizeof *d);
    for (int q = 0; q < DRAGARC_Q_COUNT; q++)
        unit_identity(&d->quantity[q], dragarc_quantity_unit((dragarc_quantity)q));
}

/* "a mass" -> "mass", "an angle" -> "angle" */
static const char *bare(const char *name)
{
    return strncmp(name, "an ", 3) == 0 ? name + 3 : strncmp(name, "a ", 2) == 0 ? name + 2 : name;
}

/* The output unit `symbol` for quantity q: its scale and offset from the SI (degree) unit, by UDUNITS-2. */
static int unit_for(dragarc_units *u, dragarc_quantity q, const char *symbol, dragarc_unit_out *o, dragarc_error *err)
{
    if (strlen(symbol) >= sizeof o->symbol)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\": the unit is too long", symbol);
    if (q == DRAGARC_Q_NUMBER)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\": a pure number takes no unit", symbol);
    ut_unit *unit = ut_parse(u->sys, symbol, UT_UTF8);
    if (!unit)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "unknown unit \"%s\"", symbol);
    if (!measures_quantity(u, unit, q)) {
        const char *what = measures(u, unit);
        ut_free(unit);
        return what ? dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\" is a unit of %s, not of %s", symbol, bare(what),
                                        bare(dragarc_quantity_name(q)))
                    : dragarc_error_set(err, DRAGARC_EINVAL, "", "\"%s\" is not a unit of %s", symbol,
                                        bare(dragarc_quantity_name(q)));
    }
    cv_converter *cv = ut_get_converter(u->target[q], unit);
    ut_free(unit);
    if (!cv)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "no conversion from %s to \"%s\"", dragarc_quantity_unit(q),
                                 symbol);
    snprintf(o->symbol, sizeof o->symbol, "%s", symbol);
    o->offset = cv_convert_double(cv, 0.0);
    if (o->offset == 0.0)
        o->scale = cv_convert_double(cv, 1.0);
    else
        o->scale = converter_slope(cv);
    if (q == DRAGARC_Q_TEMPERATURE_DIFFERENCE)
        o->offset = 0.0; /* a difference has no zero point */
    cv_free(cv);
    return DRAGARC_OK;
}

int dragarc_display_system(dragarc_display *d, dragarc_units *u, const char *name, dragarc_error *err)
{
    dragarc_display_si(d);
    if (strcmp(name, "si") == 0)
        return DRAGARC_OK;
    if (strcmp(name, "us") != 0)
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "unknown unit system \"%s\" (si, us)", name);
    for (int q = 1; q < DRAGARC_Q_COUNT; q++) {
        int rc = unit_for(u, (dragarc_quantity)q, US_UNITS[q], &d->quantity[q], err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    return DRAGARC_OK;
}

int dragarc_display_set(dragarc_display *d, dragarc_units *u, const char *key, const char *unit, dragarc_error *err)
{
    for (int q = 1; q < DRAGARC_Q_COUNT; q++)
        if (QUANTITY_KEYS[q] && strcmp(key, QUANTITY_KEYS[q]) == 0)
            return unit_for(u, (dragarc_quantity)q, unit, &d->quantity[q], err);
    for (size_t i = 0; i < sizeof FIELDS / sizeof FIELDS[0]; i++) {
        if (strcmp(key, FIELDS[i].name) != 0)
            continue;
        size_t k = 0;
        while (k < d->nfields && strcmp(d->fields[k].name, key) != 0)
            k++;
        if (k == DRAGARC_DISPLAY_MAX_FIELDS)
            return dragarc_error_set(err, DRAGARC_EINVAL, "", "too many fields with units of their own");
        dragarc_unit_out o;
        int rc = unit_for(u, FIELDS[i].q, unit, &o, err);
        if (rc != DRAGARC_OK)
            return rc;
        snprintf(d->fields[k].name, sizeof d->fields[k].name, "%s", key);
        d->fields[k].q = FIELDS[i].q;
        d->fields[k].unit = o;
        if (k == d->nfields)
            d->nfields++;
        return DRAGARC_OK;
    }
    return dragarc_error_set(err, DRAGARC_EINVAL, "",
                             "\"%s\" is neither a quantity (length, speed, mass, time, energy, angle, temperature, "
                             "pressure, ...) nor an output field (range, impact_speed, ...)",
                             key);
}

const dragarc_unit_out *dragarc_display_unit(const dragarc_display *d, const char *field, dragarc_quantity q)
{
    for (size_t k = 0; field && k < d->nfields; k++)
        if (strcmp(d->fields[k].name, field) == 0)
            return &d->fields[k].unit;
    return &d->quantity[(unsigned)q < DRAGARC_Q_COUNT ? q : 0];
}

double dragarc_display_value(const dragarc_unit_out *u, double si)
{
    return u->scale * si + u->offset;
}

double dragarc_display_value_as_given(const dragarc_unit_out *u, double si)
{
    if (u->scale == 1.0 && u->offset == 0.0)
        return si;
    char buf[40];
    snprintf(buf, sizeof buf, "%.15g", dragarc_display_value(u, si));
    return strtod(buf, NULL) + 0.0;
}
