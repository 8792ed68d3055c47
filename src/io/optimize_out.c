/* optimize_out.c: the units an optimum is shown in (the objective, and its derivatives by each parameter).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A slope dF/dx given in m per unit of x becomes (a_F / a_x) dF/dx in display units, and a curvature
 * (a_F / a_x^2) d2F/dx2, a_F and a_x being the scales of the two display units (no offsets: the varied
 * parameters are lengths, speeds, angles, differences, never absolute temperatures).
 */
#include <stdio.h>

#include "dragarc/output.h"

const dragarc_unit_out *dragarc_optimize_objective_unit(const dragarc_display *d, dragarc_optimize_objective o)
{
    return dragarc_display_unit(d, o == DRAGARC_OPTIMIZE_CARRY ? "range" : NULL, DRAGARC_Q_LENGTH);
}

double dragarc_optimize_derivative_shown(const dragarc_display *d, dragarc_optimize_objective o,
                                         const dragarc_scenario_param *p, double value, int order, int abbrev,
                                         char *unit, size_t n)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    const dragarc_unit_out *uf = dragarc_optimize_objective_unit(d, o);
    const char *ux = dragarc_scenario_param_unit(d, p);
    double ax = p->quantity == DRAGARC_Q_NUMBER ? 1.0 : dragarc_display_unit(d, NULL, p->quantity)->scale;
    if (!ux[0])
        snprintf(unit, n, "%s", uf->symbol);
    else
        snprintf(unit, n, "%s/%s%s", uf->symbol, abbrev ? dragarc_unit_abbrev(ux) : ux, order == 2 ? "^2" : "");
    return value * uf->scale / (order == 2 ? ax * ax : ax);
}
