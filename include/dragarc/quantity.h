/* quantity.h: what a numeric input measures, and the unit a plain number is taken in.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Data only, no dependencies: the scenario reader, the table parameters and the command line share it;
 * units.h reads values with units for each quantity.
 */
#ifndef DRAGARC_QUANTITY_H
#define DRAGARC_QUANTITY_H

#ifdef __cplusplus
extern "C" {
#endif

/* What an input measures, and so which units it accepts. */
typedef enum dragarc_quantity {
    DRAGARC_Q_NUMBER = 0,            /* a pure number: no unit string accepted */
    DRAGARC_Q_LENGTH,                /* m */
    DRAGARC_Q_SPEED,                 /* m/s */
    DRAGARC_Q_MASS,                  /* kg */
    DRAGARC_Q_TIME,                  /* s */
    DRAGARC_Q_TEMPERATURE,           /* K, absolute */
    DRAGARC_Q_TEMPERATURE_DIFFERENCE,/* K, a difference */
    DRAGARC_Q_PRESSURE,              /* Pa */
    DRAGARC_Q_DENSITY,               /* kg/m^3 */
    DRAGARC_Q_VISCOSITY,             /* Pa s, dynamic */
    DRAGARC_Q_ACCELERATION,          /* m/s^2 */
    DRAGARC_Q_AREA,                  /* m^2 */
    DRAGARC_Q_VOLUME,                /* m^3 */
    DRAGARC_Q_ANGLE,                 /* degree (the interface unit of angles) */
    DRAGARC_Q_LINEAR_DRAG,           /* kg/s = N s/m */
    DRAGARC_Q_QUADRATIC_DRAG,        /* kg/m = N s^2/m^2 */
    DRAGARC_Q_ENERGY,                /* J */
    DRAGARC_Q_ANGULAR_SPEED,         /* rpm (the interface unit of spin rates) */
    DRAGARC_Q_COUNT
} dragarc_quantity;

/* "a speed", "a length", ...: for messages. */
const char *dragarc_quantity_name(dragarc_quantity q);

/* The unit a plain number is taken in: "m/s", "degree", "K", "" for pure numbers. */
const char *dragarc_quantity_unit(dragarc_quantity q);

#ifdef __cplusplus
}
#endif
#endif
