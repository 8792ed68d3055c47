/* geodesy.h: local offsets on the ground (metres east and north of an origin) and WGS84 latitude and longitude,
 * through geodesics on the WGS84 ellipsoid (PROJ's geodesic routines, Karney's algorithms).
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A local offset (east, north) from an origin means the point reached by the geodesic of length
 * hypot(east, north) leaving the origin at azimuth atan2(east, north) (clockwise from north): the
 * azimuthal-equidistant meaning, exact in distance and bearing from the origin at every range. Equations,
 * its difference from a tangent plane and the sources are in docs/models.md ("Geodesy and GeoJSON").
 * Angles are in degrees here (latitude, longitude and azimuth are edge values); distances in metres.
 * Pure computation: nothing here reads or writes files, and there is no shared state (thread-safe).
 */
#ifndef DRAGARC_GEODESY_H
#define DRAGARC_GEODESY_H

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* The WGS84 ellipsoid: semi-major axis (m) and flattening (NIMA TR8350.2, 3rd edition, 2000, Table 3.1). */
#define DRAGARC_WGS84_A 6378137.0
#define DRAGARC_WGS84_F (1.0 / 298.257223563)

/* The longest local offset accepted (m): a quarter of the way round the Earth. Within it the geodesic from the
 * origin is the shortest path, so dragarc_geo_to_local inverts dragarc_geo_from_local. */
#define DRAGARC_GEO_MAX_OFFSET 1.0e7

/* A longitude in degrees brought into [-180, 180). NaN stays NaN. */
double dragarc_geo_normalize_longitude(double lon_deg);

/* The rules for one position: latitude finite and within [-90, 90], longitude finite (any value: it is
 * normalised). DRAGARC_EINVAL with field "latitude" or "longitude" and the bad value; callers prefix the
 * field with where the position sits ("breakup.latitude"). */
int dragarc_geo_check_position(double lat_deg, double lon_deg, dragarc_error *err);

/* The point (lat, lon) in degrees, longitude in [-180, 180), at offset (east_m, north_m) from the origin
 * (lat0, lon0), in the azimuthal-equidistant meaning above. The offset must be finite and at most
 * DRAGARC_GEO_MAX_OFFSET from the origin. At a pole, "north" is the direction of meridian lon0 + 180 and
 * "east" that of lon0 + 90 (PROJ's convention for azimuths at a pole). DRAGARC_EINVAL with field "latitude",
 * "longitude" (the origin), "east" or "north". */
int dragarc_geo_from_local(double lat0_deg, double lon0_deg, double east_m, double north_m, double *lat_deg,
                           double *lon_deg, dragarc_error *err);

/* The offset (east, north) in m of the point (lat, lon) from the origin (lat0, lon0): the inverse of
 * dragarc_geo_from_local for points within DRAGARC_GEO_MAX_OFFSET. DRAGARC_EINVAL with field
 * "origin.latitude", "origin.longitude", "latitude" or "longitude". */
int dragarc_geo_to_local(double lat0_deg, double lon0_deg, double lat_deg, double lon_deg, double *east_m,
                         double *north_m, dragarc_error *err);

/* The direct geodesic problem: from (lat1, lon1) along azimuth azi1 (degrees clockwise from north) for
 * distance s12 (m, finite, may be negative: backwards): the end point (lat2, lon2), longitude in [-180, 180),
 * and the forward azimuth there azi2 (degrees, [-180, 180]); NULL outputs are skipped. DRAGARC_EINVAL with
 * field "latitude", "longitude", "azimuth" or "distance". */
int dragarc_geo_direct(double lat1_deg, double lon1_deg, double azi1_deg, double s12_m, double *lat2_deg,
                       double *lon2_deg, double *azi2_deg, dragarc_error *err);

/* The inverse geodesic problem: the shortest geodesic from (lat1, lon1) to (lat2, lon2): its length s12 (m),
 * the azimuth at the start azi1 and the forward azimuth at the end azi2 (degrees, [-180, 180]); NULL outputs
 * are skipped. DRAGARC_EINVAL with field "latitude1", "longitude1", "latitude2" or "longitude2". */
int dragarc_geo_inverse(double lat1_deg, double lon1_deg, double lat2_deg, double lon2_deg, double *s12_m,
                        double *azi1_deg, double *azi2_deg, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
