/* quantity.c: names and interface units of the quantities of quantity.h.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/quantity.h"

static const struct {
    const char *name, *unit;
} QUANTITIES[DRAGARC_Q_COUNT] = {
    [DRAGARC_Q_NUMBER] = {"a pure number", ""},
    [DRAGARC_Q_LENGTH] = {"a length", "m"},
    [DRAGARC_Q_SPEED] = {"a speed", "m/s"},
    [DRAGARC_Q_MASS] = {"a mass", "kg"},
    [DRAGARC_Q_TIME] = {"a time", "s"},
    [DRAGARC_Q_TEMPERATURE] = {"a temperature", "K"},
    [DRAGARC_Q_TEMPERATURE_DIFFERENCE] = {"a temperature difference", "K"},
    [DRAGARC_Q_PRESSURE] = {"a pressure", "Pa"},
    [DRAGARC_Q_DENSITY] = {"a density", "kg/m3"},
    [DRAGARC_Q_VISCOSITY] = {"a dynamic viscosity", "Pa.s"},
    [DRAGARC_Q_ACCELERATION] = {"an acceleration", "m/s2"},
    [DRAGARC_Q_AREA] = {"an area", "m2"},
    [DRAGARC_Q_VOLUME] = {"a volume", "m3"},
    [DRAGARC_Q_ANGLE] = {"an angle", "degree"},
    [DRAGARC_Q_LINEAR_DRAG] = {"a linear drag constant (force per speed)", "kg/s"},
    [DRAGARC_Q_QUADRATIC_DRAG] = {"a quadratic drag constant (force per speed squared)", "kg/m"},
    [DRAGARC_Q_ENERGY] = {"an energy", "J"},
    [DRAGARC_Q_ANGULAR_SPEED] = {"an angular speed", "rpm"},
};

const char *dragarc_quantity_name(dragarc_quantity q)
{
    return (unsigned)q < DRAGARC_Q_COUNT ? QUANTITIES[q].name : "an unknown quantity";
}

const char *dragarc_quantity_unit(dragarc_quantity q)
{
    return (unsigned)q < DRAGARC_Q_COUNT ? QUANTITIES[q].unit : "";
}

