/* geojson.h: a FeatureCollection in WGS84 longitude and latitude (RFC 7946) built from points, lines and areas given
 * in local metres east and north of an origin, and written whole or not at all.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Guarantees of every document built here (docs/models.md, "Geodesy and GeoJSON"):
 *  - positions are [longitude, latitude] or [longitude, latitude, altitude], in degrees on WGS84 and metres,
 *    longitudes within [-180, 180];
 *  - degrees are rounded to DRAGARC_GEOJSON_DECIMALS decimals (1e-7 degree: 1.1 cm or less on the ground),
 *    altitudes to millimetres;
 *  - polygon rings are closed (the last position repeats the first), have at least 4 positions and follow the
 *    right-hand rule: exterior rings counter-clockwise, holes clockwise (RFC 7946, section 3.1.6), whichever way
 *    they were given;
 *  - a geometry that crosses the antimeridian is cut there into a MultiPolygon or MultiLineString (RFC 7946,
 *    section 3.1.9); an area that encloses a pole is refused;
 *  - no NaN or infinity: a value that is not finite is an error naming where it sits, never written.
 * Edges are straight lines in longitude and latitude (RFC 7946, section 3.1.1): give vertices closely enough
 * (a kilometre apart or less: the edge then stays within 2 cm of the geodesic at 45 degrees) for that to follow the
 * curve meant.
 *
 * The collection is a cJSON tree (cJSON is a public dependency of dragarc): create it with dragarc_geojson_new,
 * free it with cJSON_Delete. Every add_* function takes the `properties` object (a cJSON object, or NULL for an
 * empty one) in all cases: it becomes the feature's on success and is deleted on failure. On failure the
 * collection is unchanged.
 */
#ifndef DRAGARC_GEOJSON_H
#define DRAGARC_GEOJSON_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

struct cJSON;

/* Decimals of the degrees written: 1e-7 degree is 1.11 cm of latitude, and no more of longitude. */
#define DRAGARC_GEOJSON_DECIMALS 7

/* Where local offsets are measured from: the point on the ground (WGS84, degrees). */
typedef struct dragarc_geo_origin {
    double latitude;  /* degrees, [-90, 90] */
    double longitude; /* degrees, any finite value */
} dragarc_geo_origin;

/* A ring (or a line) of n vertices in metres east and north of the origin. A ring may be given closed (the last
 * vertex repeating the first) or open; it needs 3 distinct vertices and some area. Borrowed. */
typedef struct dragarc_geo_ring {
    const double *east;  /* m, n values */
    const double *north; /* m, n values */
    size_t n;
} dragarc_geo_ring;

/* A polygon: rings[0] the exterior, rings[1..n-1] its holes (inside the exterior, not checked). Borrowed. */
typedef struct dragarc_geo_polygon {
    const dragarc_geo_ring *rings;
    size_t n;
} dragarc_geo_polygon;

/* An empty FeatureCollection {"type": "FeatureCollection", "features": []}; the caller frees it with
 * cJSON_Delete. NULL when out of memory. */
struct cJSON *dragarc_geojson_new(void);

/* A Point feature at (lon, lat) degrees, with altitude (m) when `altitude` is not NULL. DRAGARC_EINVAL naming
 * "latitude", "longitude", "altitude" or the property ("properties.x[2]") that is not finite; DRAGARC_ENOMEM. */
int dragarc_geojson_add_point(struct cJSON *fc, double lon_deg, double lat_deg, const double *altitude_m,
                              struct cJSON *properties, dragarc_error *err);

/* A Point feature at (east, north) m from the origin (dragarc_geo_from_local), with altitude as above.
 * DRAGARC_EINVAL naming "origin.latitude", "origin.longitude", "east", "north", "altitude" or a property. */
int dragarc_geojson_add_point_local(struct cJSON *fc, dragarc_geo_origin origin, double east_m, double north_m,
                                    const double *altitude_m, struct cJSON *properties, dragarc_error *err);

/* A LineString feature through n >= 2 vertices (east[i], north[i]) m from the origin; a MultiLineString when it
 * crosses the antimeridian. DRAGARC_EINVAL naming "vertices" (too few), "vertices[i].east", "vertices[i].north",
 * the origin or a property. */
int dragarc_geojson_add_line_local(struct cJSON *fc, dragarc_geo_origin origin, const double *east_m,
                                   const double *north_m, size_t n, struct cJSON *properties, dragarc_error *err);

/* A Polygon feature of n >= 1 rings (the exterior, then holes) in metres from the origin; a MultiPolygon when it
 * crosses the antimeridian. DRAGARC_EINVAL naming "rings" (none), "rings[k]" (too few vertices, no area, or
 * around a pole), "rings[k][i].east" or ".north", the origin or a property; DRAGARC_ENOMEM. */
int dragarc_geojson_add_polygon_local(struct cJSON *fc, dragarc_geo_origin origin, const dragarc_geo_ring *rings,
                                      size_t n, struct cJSON *properties, dragarc_error *err);

/* A MultiPolygon feature of n >= 1 polygons, each as for dragarc_geojson_add_polygon_local; errors name
 * "polygons[p].rings[k]..." the same way. */
int dragarc_geojson_add_multipolygon_local(struct cJSON *fc, dragarc_geo_origin origin,
                                           const dragarc_geo_polygon *polygons, size_t n, struct cJSON *properties,
                                           dragarc_error *err);

/* The collection as text (indented JSON). Checks first that fc is a FeatureCollection and that no number in it
 * (properties added by hand included) is NaN or infinite: DRAGARC_EINVAL naming where ("features[3].properties.
 * mass"). The caller frees the text with free(); NULL on failure (DRAGARC_ENOMEM when out of memory). */
char *dragarc_geojson_print(const struct cJSON *fc, dragarc_error *err);

/* Write the collection to `path` ("-": standard output) through a temporary file renamed into place only when
 * complete (dragarc_output_open / commit). Borrows fc. Errors of dragarc_geojson_print, or DRAGARC_EIO. */
int dragarc_geojson_write(const char *path, const struct cJSON *fc, dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
