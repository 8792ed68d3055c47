/* constants.h: private mathematical constants (C17 without extensions has no M_PI).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_CORE_CONSTANTS_H
#define DRAGARC_CORE_CONSTANTS_H

#define DRAGARC_PI 3.14159265358979323846
#define DRAGARC_DEG (DRAGARC_PI / 180.0) /* radians per degree */

#endif
