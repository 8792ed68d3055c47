/* flight_track.h: a flight sampled at a measured track's times (private: for fit.c, and fit_plot.c in src/io).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_NUMERICS_FLIGHT_TRACK_H
#define DRAGARC_NUMERICS_FLIGHT_TRACK_H

#include <stddef.h>

#include "dragarc/dragarc.h"
#include "dragarc/scenario.h"

/* The state (position m, velocity m/s) of scenario s's flight at each of the n listed times (s since launch,
 * increasing, >= 0) into states[6 i .. 6 i + 5]. The flight goes on through the ground plane, as if the ground were
 * not there (the wind and air still measure heights from it), to the last time (or solver.max_time, if that comes
 * first: then the flight fails as dragarc_flight_run does without an impact); it has no bounces. Errors as dragarc_flight_run, and DRAGARC_EINVAL (field "track") when the flight ends before the
 * last time (an evaporating drop that vanishes). */
int dragarc_flight_track(const dragarc_scenario *s, const double *times, size_t n, double *states,
                         dragarc_error *err);

#endif
