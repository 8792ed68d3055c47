/* earth.c: the Earth models: checks, the rotation vector, heights on a sphere and points reported on it.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Local frame x east, y north, z up at the origin; on the sphere of radius R the centre is at (0, 0, -R), so the
 * position from the centre is r = (x, y, z + R) and the height h = |r| - R. The Earth turns about the axis
 * through the centre toward the north pole, which at geodetic latitude phi points north and up:
 * Omega = w (0, cos phi, sin phi) (e.g. Landau, L. D. & Lifshitz, E. M. 1976, Mechanics, 3rd ed., section 39,
 * problem 1, which takes the same components; recalled). The geodetic latitude stands in for the geocentric one
 * (they differ by up to 0.19 degrees on the WGS84 ellipsoid), a change of Omega's direction far below what the
 * spherical model itself neglects.
 *
 * A point is reported by the great circle from the origin to the point below it: the angle at the centre
 * theta = atan2(sqrt(x^2 + y^2), z + R), the arc s = R theta and the azimuth at the origin atan2(x, y). The
 * offsets (s sin az, s cos az) are those of the azimuthal-equidistant projection about the origin (Snyder, J. P.
 * 1987, "Map Projections: A Working Manual", USGS Professional Paper 1395, chapter 25, the sphere's formulas;
 * recalled), which is what geodesy.h takes east and north offsets to mean. A velocity is carried to the
 * point by the rotation that takes the origin's up to the point's: about k = z^ x r / |z^ x r| by theta
 * (Rodrigues' formula).
 */
#include <math.h>

#include "core/constants.h"
#include "dragarc/earth.h"

void dragarc_earth_default(dragarc_earth *e)
{
    e->model = DRAGARC_EARTH_FLAT;
    e->rotation = 1;
    e->latitude_given = 0;
    e->latitude = 0.0;
    e->radius = DRAGARC_EARTH_RADIUS;
    e->rotation_rate = DRAGARC_EARTH_ROTATION_RATE;
}

int dragarc_earth_check(const dragarc_earth *e, dragarc_error *err)
{
    if (e->model != DRAGARC_EARTH_FLAT && e->model != DRAGARC_EARTH_SPHERICAL)
        return dragarc_error_set(err, DRAGARC_EINVAL, "model", "unknown Earth model %d", (int)e->model);
    if (e->model == DRAGARC_EARTH_FLAT)
        return DRAGARC_OK;
    if (!(e->radius >= 1000.0 && e->radius <= 1e8))
        return dragarc_error_set(err, DRAGARC_EINVAL, "radius", "must be between 1000 m and 1e8 m (got %g)", e->radius);
    if (!(e->rotation_rate >= 0.0 && e->rotation_rate <= 0.01))
        return dragarc_error_set(err, DRAGARC_EINVAL, "rotation_rate", "must be between 0 and 0.01 rad/s (got %g)",
                                 e->rotation_rate);
    if (e->latitude_given && !(fabs(e->latitude) <= 0.5 * DRAGARC_PI + 1e-12))
        return dragarc_error_set(err, DRAGARC_EINVAL, "latitude", "must be between -90 and 90 degrees (got %g)",
                                 e->latitude / DRAGARC_DEG);
    if (e->rotation && !e->latitude_given)
        return dragarc_error_set(err, DRAGARC_EINVAL, "latitude",
                                 "is required with rotation (the Earth's rotation vector depends on it): give the "
                                 "launch point's latitude, or \"rotation\": false");
    return DRAGARC_OK;
}

void dragarc_earth_omega(const dragarc_earth *e, double omega[3])
{
    omega[0] = omega[1] = omega[2] = 0.0;
    if (e->model != DRAGARC_EARTH_SPHERICAL || !e->rotation)
        return;
    omega[1] = e->rotation_rate * cos(e->latitude);
    omega[2] = e->rotation_rate * sin(e->latitude);
}

double dragarc_earth_height(double radius, const double pos[3])
{
    const double x = pos[0], y = pos[1], z = pos[2];
    double rn = sqrt(x * x + y * y + (z + radius) * (z + radius));
    return (x * x + y * y + z * z + 2.0 * radius * z) / (rn + radius);
}

double dragarc_earth_climb(double radius, const double pos[3], const double vel[3])
{
    double r[3] = {pos[0], pos[1], pos[2] + radius};
    double rn = sqrt(r[0] * r[0] + r[1] * r[1] + r[2] * r[2]);
    return (r[0] * vel[0] + r[1] * vel[1] + r[2] * vel[2]) / rn;
}

void dragarc_earth_report(double radius, const double pos[3], const double vel[3], double out[6])
{
    const double x = pos[0], y = pos[1], zc = pos[2] + radius;
    const double rho = hypot(x, y), theta = atan2(rho, zc);
    const double s = radius * theta;
    out[2] = dragarc_earth_height(radius, pos);
    if (!(rho > 0.0)) { /* straight above the origin: nothing turns */
        out[0] = out[1] = 0.0;
        out[3] = vel[0], out[4] = vel[1], out[5] = vel[2];
        return;
    }
    out[0] = s * x / rho;
    out[1] = s * y / rho;
    /* v' = R(-theta) v about k = (-y, x, 0) / rho: v cos(theta) - (k x v) sin(theta) + k (k . v)(1 - cos(theta)) */
    const double k[3] = {-y / rho, x / rho, 0.0};
    const double c = cos(theta), sn = sin(theta);
    const double kxv[3] = {k[1] * vel[2] - k[2] * vel[1], k[2] * vel[0] - k[0] * vel[2], k[0] * vel[1] - k[1] * vel[0]};
    const double kv = k[0] * vel[0] + k[1] * vel[1] + k[2] * vel[2];
    for (int i = 0; i < 3; i++)
        out[3 + i] = vel[i] * c - kxv[i] * sn + k[i] * kv * (1.0 - c);
}
