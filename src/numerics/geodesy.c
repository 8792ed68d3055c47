/* geodesy.c: local offsets on the ground and WGS84 latitude and longitude, through geodesics on the ellipsoid.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The ellipsoid is WGS84, a = 6378137 m, f = 1/298.257223563 (NIMA TR8350.2, 3rd edition, 2000, Table 3.1).
 * Geodesics are PROJ's geodesic routines (geodesic.h), the C form of Karney, C. F. F. 2013, "Algorithms for
 * geodesics", J. Geodesy 87:43-55, accurate to about 15 nm on the Earth at any distance.
 *
 * A local offset (e, n) from the origin O is the azimuthal-equidistant point
 *     s = hypot(e, n),   alpha = atan2(e, n)   (azimuth clockwise from north),
 *     P = geod_direct(O, alpha, s)
 * and its inverse is geod_inverse(O, P) = (s, alpha), e = s sin(alpha), n = s cos(alpha). Distances and
 * bearings from the origin are exact; across the line of sight the map stretches lengths by about
 * 1 + s^2 / (6 R^2) (1 + 1.0e-5 at 50 km), which is the whole difference from the plane the flight was
 * computed on. docs/models.md compares it with a tangent plane.
 */
#include <math.h>
#include <stddef.h>

#include <geodesic.h>

#include "dragarc/geodesy.h"

#define DEG (3.14159265358979323846 / 180.0)

/* A geodesic record for WGS84. geod_init only fills the record from a and f, so one per call costs little and
 * keeps the module free of shared state. */
static void wgs84(struct geod_geodesic *g) { geod_init(g, DRAGARC_WGS84_A, DRAGARC_WGS84_F); }

/* Three results to the outputs the caller asked for (NULL: skipped). */
static void put3(double *a, double va, double *b, double vb, double *c, double vc)
{
    if (a)
        *a = va;
    if (b)
        *b = vb;
    if (c)
        *c = vc;
}

double dragarc_geo_normalize_longitude(double lon_deg)
{
    if (!isfinite(lon_deg))
        return lon_deg;
    double x = fmod(lon_deg + 180.0, 360.0);
    if (x < 0.0)
        x += 360.0;
    x -= 180.0;
    /* x + 360 may round up to 360 for a tiny negative x: keep the half-open range. */
    if (x >= 180.0)
        x -= 360.0;
    return x == 0.0 ? 0.0 : x; /* no -0 */
}

/* The rules of one position, with the fields named by the caller. */
static int check_position(double lat, double lon, const char *lat_field, const char *lon_field, dragarc_error *err)
{
    if (!isfinite(lat) || lat < -90.0 || lat > 90.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, lat_field, "must be between -90 and 90 degrees (got %.17g)",
                                 lat);
    if (!isfinite(lon))
        return dragarc_error_set(err, DRAGARC_EINVAL, lon_field, "must be a finite number of degrees (got %g)", lon);
    return DRAGARC_OK;
}

int dragarc_geo_check_position(double lat_deg, double lon_deg, dragarc_error *err)
{
    return check_position(lat_deg, lon_deg, "latitude", "longitude", err);
}

int dragarc_geo_direct(double lat1_deg, double lon1_deg, double azi1_deg, double s12_m, double *lat2_deg,
                       double *lon2_deg, double *azi2_deg, dragarc_error *err)
{
    int rc = dragarc_geo_check_position(lat1_deg, lon1_deg, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!isfinite(azi1_deg))
        return dragarc_error_set(err, DRAGARC_EINVAL, "azimuth", "must be a finite number of degrees (got %g)",
                                 azi1_deg);
    if (!isfinite(s12_m))
        return dragarc_error_set(err, DRAGARC_EINVAL, "distance", "must be a finite number of metres (got %g)",
                                 s12_m);
    struct geod_geodesic g;
    wgs84(&g);
    double lat2, lon2, azi2;
    geod_direct(&g, lat1_deg, lon1_deg, azi1_deg, s12_m, &lat2, &lon2, &azi2);
    put3(lat2_deg, lat2, lon2_deg, dragarc_geo_normalize_longitude(lon2), azi2_deg, azi2);
    return DRAGARC_OK;
}

int dragarc_geo_inverse(double lat1_deg, double lon1_deg, double lat2_deg, double lon2_deg, double *s12_m,
                        double *azi1_deg, double *azi2_deg, dragarc_error *err)
{
    int rc = check_position(lat1_deg, lon1_deg, "latitude1", "longitude1", err);
    if (rc == DRAGARC_OK)
        rc = check_position(lat2_deg, lon2_deg, "latitude2", "longitude2", err);
    if (rc != DRAGARC_OK)
        return rc;
    struct geod_geodesic g;
    wgs84(&g);
    double s12, azi1, azi2;
    geod_inverse(&g, lat1_deg, lon1_deg, lat2_deg, lon2_deg, &s12, &azi1, &azi2);
    put3(s12_m, s12, azi1_deg, azi1, azi2_deg, azi2);
    return DRAGARC_OK;
}

int dragarc_geo_from_local(double lat0_deg, double lon0_deg, double east_m, double north_m, double *lat_deg,
                           double *lon_deg, dragarc_error *err)
{
    int rc = dragarc_geo_check_position(lat0_deg, lon0_deg, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!isfinite(east_m))
        return dragarc_error_set(err, DRAGARC_EINVAL, "east", "must be a finite number of metres (got %g)", east_m);
    if (!isfinite(north_m))
        return dragarc_error_set(err, DRAGARC_EINVAL, "north", "must be a finite number of metres (got %g)", north_m);
    double s = hypot(east_m, north_m);
    if (s > DRAGARC_GEO_MAX_OFFSET)
        return dragarc_error_set(err, DRAGARC_EINVAL, fabs(east_m) >= fabs(north_m) ? "east" : "north",
                                 "the offset (%g, %g) m lies %g m from the origin, beyond the %g m a local offset "
                                 "may reach (a quarter of the way round the Earth)",
                                 east_m, north_m, s, DRAGARC_GEO_MAX_OFFSET);
    /* atan2(0, 0) = 0: the origin itself, whatever the azimuth. */
    return dragarc_geo_direct(lat0_deg, lon0_deg, atan2(east_m, north_m) / DEG, s, lat_deg, lon_deg, NULL, err);
}

int dragarc_geo_to_local(double lat0_deg, double lon0_deg, double lat_deg, double lon_deg, double *east_m,
                         double *north_m, dragarc_error *err)
{
    int rc = check_position(lat0_deg, lon0_deg, "origin.latitude", "origin.longitude", err);
    if (rc == DRAGARC_OK)
        rc = dragarc_geo_check_position(lat_deg, lon_deg, err);
    double s = 0.0, azi1 = 0.0;
    if (rc == DRAGARC_OK) /* checked above with this function's field names, so it cannot fail */
        rc = dragarc_geo_inverse(lat0_deg, lon0_deg, lat_deg, lon_deg, &s, &azi1, NULL, err);
    if (rc != DRAGARC_OK)
        return rc;
    /* sin and cos of an azimuth in degrees: reduce to [-45, 45] first so that due east or north gives an exact 0
     * for the other component (sin(pi) in radians is 1.2e-16, not 0). */
    double q = round(azi1 / 90.0), r = (azi1 - 90.0 * q) * DEG;
    double sr = sin(r), cr = cos(r), sa, ca;
    switch (((int)q % 4 + 4) % 4) {
    case 0: sa = sr; ca = cr; break;
    case 1: sa = cr; ca = -sr; break;
    case 2: sa = -sr; ca = -cr; break;
    default: sa = -cr; ca = sr; break;
    }
    put3(east_m, s * sa, north_m, s * ca, NULL, 0.0);
    return DRAGARC_OK;
}
