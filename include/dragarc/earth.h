/* earth.h: the Earth a flight is flown over: flat with constant gravity, or a sphere with inverse-square gravity,
 * turning or not.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Both models use the same local Cartesian frame: x east, y north, z up at the origin, the origin on the site
 * datum below the launch point. On the sphere the Earth's centre is at (0, 0, -R); the height of a point is
 * h = |r| - R with r = (x, y, z + R), and the gravitation is g0 (R / |r|)^2 toward the centre. Turning, the
 * frame rotates with the Earth at Omega = w (0, cos phi, sin phi) (east, north, up at geodetic latitude phi),
 * which adds the Coriolis acceleration -2 Omega x v and the centrifugal -Omega x (Omega x r) (Landau, L. D. &
 * Lifshitz, E. M. 1976, Mechanics, 3rd ed., Pergamon, section 39, eq. 39.7). docs/models.md says when each
 * model is adequate and how a point on the sphere is reported (the azimuthal-equidistant offsets below).
 */
#ifndef DRAGARC_EARTH_H
#define DRAGARC_EARTH_H

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The mean radius of the Earth, R1 = (2a + b) / 3 of the Geodetic Reference System 1980, which the IUGG adopted
 * (Moritz, H. 2000, "Geodetic Reference System 1980", Journal of Geodesy 74:128, R1 = 6371008.7714 m; recalled),
 * rounded to 0.1 m. */
#define DRAGARC_EARTH_RADIUS 6371008.8
/* The Earth's mean angular velocity (NIMA TR8350.2, 3rd edition, 2000, "Department of Defense World Geodetic
 * System 1984", Table 3.1, w = 7292115e-11 rad/s; the same value as the IERS Conventions 2010, Petit, G. &
 * Luzum, B., IERS Technical Note 36, Table 1.1; recalled). */
#define DRAGARC_EARTH_ROTATION_RATE 7.2921150e-5

typedef enum dragarc_earth_model {
    DRAGARC_EARTH_FLAT = 0,  /* a plane with constant gravity -g0 z^, not turning (the default) */
    DRAGARC_EARTH_SPHERICAL  /* a sphere of radius R, gravitation g0 (R/|r|)^2, turning when `rotation` is set */
} dragarc_earth_model;

typedef struct dragarc_earth {
    dragarc_earth_model model;
    int rotation;         /* spherical: 1 adds the Coriolis and centrifugal accelerations */
    int latitude_given;   /* 1: latitude holds the origin's latitude (needed with rotation) */
    double latitude;      /* rad, geodetic latitude of the frame's origin, [-pi/2, pi/2] */
    double radius;        /* m, the sphere's radius (default DRAGARC_EARTH_RADIUS) */
    double rotation_rate; /* rad/s, the Earth's angular velocity (default DRAGARC_EARTH_ROTATION_RATE) */
} dragarc_earth;

/* Flat, with the spherical model's defaults filled in (radius, rotation rate; rotation on, no latitude). */
void dragarc_earth_default(dragarc_earth *e);

/* Check the fields; err->field is relative to the earth object ("latitude", "radius", ...). A spherical,
 * turning Earth needs the latitude. */
int dragarc_earth_check(const dragarc_earth *e, dragarc_error *err);

/* The Earth's angular velocity in the local frame (east, north, up; rad/s): w (0, cos phi, sin phi) on a
 * turning sphere, zero otherwise. */
void dragarc_earth_omega(const dragarc_earth *e, double omega[3]);

/* Height above the sphere of radius R of the point pos (local frame, m): |r| - R with r = pos + R z^, written
 * (|pos|^2 + 2 R z) / (|r| + R) so that it keeps its digits near the ground. */
double dragarc_earth_height(double radius, const double pos[3]);

/* Rate of change of that height (m/s) at pos moving with velocity vel: (r . v) / |r|. */
double dragarc_earth_climb(double radius, const double pos[3], const double vel[3]);

/* A state of the local frame (position pos, velocity vel) as it is reported on the sphere of radius R:
 * out[0], out[1] the east and north offsets of the point below it on the sphere in the azimuthal-equidistant
 * sense (the arc R theta from the origin along the great circle, theta the angle at the centre, split by the
 * great circle's azimuth at the origin), out[2] its height h; out[3..5] the velocity in the frame carried
 * along that great circle to the point (up is the local vertical there; east and north are those of the
 * origin turned with the great circle). */
void dragarc_earth_report(double radius, const double pos[3], const double vel[3], double out[6]);

#ifdef __cplusplus
}
#endif
#endif
