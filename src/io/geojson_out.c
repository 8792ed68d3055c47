/* geojson_out.c: GeoJSON FeatureCollections in WGS84 (RFC 7946) from geometry in local metres, built with cJSON.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Source: Butler, H. et al. 2016, "The GeoJSON Format", IETF RFC 7946: positions longitude first (section 3.1.1),
 * linear rings closed with four or more positions and the right-hand rule (3.1.6), cutting at the antimeridian
 * (3.1.9), no "crs" member (WGS84 only, section 4).
 *
 * Each vertex goes from local metres to latitude and longitude by dragarc_geo_from_local (geodesy.c). Along a
 * ring or line the longitudes are unwrapped (each within 180 degrees of the one before), so the geometry is a
 * plain figure in the (longitude, latitude) plane even where it crosses +-180. There
 *   - the orientation is the sign of the shoelace area  A = 1/2 sum (x_i y_(i+1) - x_(i+1) y_i)  (> 0:
 *     counter-clockwise), and a ring with the wrong one is reversed;
 *   - a ring whose longitudes wind by 360 degrees on the way round encloses a pole and is refused;
 *   - the figure is cut into the strips [-180 + 360 j, 180 + 360 j] by Sutherland-Hodgman clipping against
 *     the two sides of each strip (Sutherland, I. E. and Hodgman, G. W. 1974, "Reentrant polygon clipping",
 *     Comm. ACM 17(1):32-42), and each piece shifted by -360 j. Clipping keeps orientation and holes. A concave
 *     ring that crosses the antimeridian more than twice gives pieces joined by a seam along the meridian (the
 *     area stays right); dragarc's footprints are far smaller than that.
 * Degrees are rounded to 7 decimals, altitudes to 1 mm, before the orientation is worked out, so the rounding
 * cannot turn a ring over.
 */
#include <limits.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include <cjson/cJSON.h>

#include "dragarc/geodesy.h"
#include "dragarc/geojson.h"
#include "dragarc/output.h"

static double round_to(double v, double scale)
{
    double r = round(v * scale) / scale;
    return r == 0.0 ? 0.0 : r; /* no -0 */
}

static double round_deg(double v) { return round_to(v, 1e7); } /* DRAGARC_GEOJSON_DECIMALS */

/* ---- a list of positions -------------------------------------------------------------------------------- */

/* Vertices of one ring (open: the closing position is not repeated) or one line; x the unwrapped longitude. */
typedef struct path {
    double *x, *y; /* degrees */
    size_t n, cap;
} path;

static void path_free(path *p)
{
    free(p->x);
    free(p->y);
    memset(p, 0, sizeof *p);
}

static int path_push(path *p, double x, double y)
{
    if (p->n == p->cap) {
        size_t cap = p->cap ? 2 * p->cap : 16;
        double *nx = realloc(p->x, cap * sizeof *nx);
        if (!nx)
            return DRAGARC_ENOMEM;
        p->x = nx;
        double *ny = realloc(p->y, cap * sizeof *ny);
        if (!ny)
            return DRAGARC_ENOMEM;
        p->y = ny;
        p->cap = cap;
    }
    p->x[p->n] = x;
    p->y[p->n] = y;
    p->n++;
    return DRAGARC_OK;
}

static int nomem(dragarc_error *err)
{
    return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory building GeoJSON");
}

/* Twice the signed area of a closed ring (> 0: counter-clockwise), about its first vertex for precision. */
static double twice_area(const path *p)
{
    double s = 0.0;
    for (size_t i = 0; i < p->n; i++) {
        size_t k = (i + 1) % p->n;
        double x0 = p->x[i] - p->x[0], y0 = p->y[i] - p->y[0];
        double x1 = p->x[k] - p->x[0], y1 = p->y[k] - p->y[0];
        s += x0 * y1 - x1 * y0;
    }
    return s;
}

static void reverse(path *p)
{
    for (size_t i = 0, k = p->n - 1; i < k; i++, k--) {
        double tx = p->x[i], ty = p->y[i];
        p->x[i] = p->x[k];
        p->y[i] = p->y[k];
        p->x[k] = tx;
        p->y[k] = ty;
    }
}

/* Drop a vertex equal to the one before it (and a last equal to the first, in a ring). */
static void drop_repeats(path *p, int ring)
{
    size_t m = 0;
    for (size_t i = 0; i < p->n; i++) {
        if (m > 0 && p->x[i] == p->x[m - 1] && p->y[i] == p->y[m - 1])
            continue;
        p->x[m] = p->x[i];
        p->y[m] = p->y[i];
        m++;
    }
    while (ring && m > 1 && p->x[m - 1] == p->x[0] && p->y[m - 1] == p->y[0])
        m--;
    p->n = m;
}

/* ---- local metres to unwrapped degrees ------------------------------------------------------------------- */

/* The n vertices (east[i], north[i]) as rounded degrees with unwrapped longitudes, the first within 180 degrees
 * of the origin's normalised longitude; `label` names vertex i in errors ("rings[1]" gives "rings[1][i].east", "vertices" gives
 * "vertices[i].east"). The origin has been checked. */
static int to_degrees(dragarc_geo_origin o, const double *east, const double *north, size_t n, const char *label,
                      path *out, dragarc_error *err)
{
    double prev = dragarc_geo_normalize_longitude(o.longitude); /* an origin at 1e300 degrees keeps its digits */
    for (size_t i = 0; i < n; i++) {
        double lat, lon;
        int rc = dragarc_geo_from_local(o.latitude, o.longitude, east[i], north[i], &lat, &lon, err);
        if (rc != DRAGARC_OK) {
            char where[96];
            snprintf(where, sizeof where, "%s[%zu]", label, i);
            dragarc_error_prefix(err, where);
            return rc;
        }
        prev += dragarc_geo_normalize_longitude(lon - prev);
        if (path_push(out, round_deg(prev), round_deg(lat)) != DRAGARC_OK)
            return nomem(err);
    }
    return DRAGARC_OK;
}

/* One ring in degrees, checked and turned to `ccw` (1: counter-clockwise, 0: clockwise). */
static int ring_degrees(dragarc_geo_origin o, const dragarc_geo_ring *r, const char *label, int ccw, path *out,
                        dragarc_error *err)
{
    if (!r->east || !r->north || r->n < 3)
        return dragarc_error_set(err, DRAGARC_EINVAL, label, "a ring needs at least 3 vertices (got %zu)", r->n);
    int rc = to_degrees(o, r->east, r->north, r->n, label, out, err);
    if (rc != DRAGARC_OK)
        return rc;
    /* The closing step back to the first vertex: a ring that winds once round a pole gains 360 degrees. */
    double wind = out->x[out->n - 1] + dragarc_geo_normalize_longitude(out->x[0] - out->x[out->n - 1]) - out->x[0];
    if (fabs(wind) > 180.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, label,
                                 "the ring goes round a pole, which longitude and latitude cannot show as one area");
    drop_repeats(out, 1);
    double a = out->n >= 3 ? twice_area(out) : 0.0;
    if (a == 0.0)
        return dragarc_error_set(err, DRAGARC_EINVAL, label,
                                 "the ring has no area at 1e-7 degree (about 1 cm): its vertices are on one line or "
                                 "fewer than 3 distinct");
    if ((a > 0.0) != (ccw != 0))
        reverse(out);
    return DRAGARC_OK;
}

/* ---- cutting at the antimeridian -------------------------------------------------------------------------- */

/* Strip j holds longitudes [-180 + 360 j, 180 + 360 j]. */
static void strips(const path *p, int *jlo, int *jhi)
{
    double lo = p->x[0], hi = p->x[0];
    for (size_t i = 1; i < p->n; i++) {
        lo = fmin(lo, p->x[i]);
        hi = fmax(hi, p->x[i]);
    }
    *jlo = (int)floor((lo + 180.0) / 360.0);
    *jhi = (int)ceil((hi - 180.0) / 360.0);
    if (*jhi < *jlo) /* a figure touching no boundary */
        *jhi = *jlo;
}

/* Sutherland-Hodgman: the part of ring `in` on one side of the meridian x = b (keep_west: x <= b). */
static int clip_side(const path *in, double b, int keep_west, path *out)
{
    out->n = 0;
    for (size_t i = 0; i < in->n; i++) {
        size_t k = (i + in->n - 1) % in->n;
        double x0 = in->x[k], y0 = in->y[k], x1 = in->x[i], y1 = in->y[i];
        int in0 = keep_west ? x0 <= b : x0 >= b, in1 = keep_west ? x1 <= b : x1 >= b;
        if (in0 != in1 && path_push(out, b, round_deg(y0 + (b - x0) / (x1 - x0) * (y1 - y0))) != DRAGARC_OK)
            return DRAGARC_ENOMEM;
        if (in1 && path_push(out, x1, y1) != DRAGARC_OK)
            return DRAGARC_ENOMEM;
    }
    return DRAGARC_OK;
}

/* A position [x, y] (and z when not NULL) as a cJSON array. */
static cJSON *position(double x, double y, const double *z)
{
    cJSON *a = cJSON_CreateArray();
    if (!a || !cJSON_AddItemToArray(a, cJSON_CreateNumber(x)) || !cJSON_AddItemToArray(a, cJSON_CreateNumber(y)) ||
        (z && !cJSON_AddItemToArray(a, cJSON_CreateNumber(*z)))) {
        cJSON_Delete(a);
        return NULL;
    }
    return a;
}

/* Append the position [x, y] to array a; 0 when out of memory. */
static int append_position(cJSON *a, double x, double y)
{
    cJSON *p = position(x, y, NULL);
    if (!p || !cJSON_AddItemToArray(a, p)) {
        cJSON_Delete(p);
        return 0;
    }
    return 1;
}

/* A new empty array appended to array a; NULL when out of memory. */
static cJSON *append_array(cJSON *a)
{
    cJSON *r = cJSON_CreateArray();
    if (!r || !cJSON_AddItemToArray(a, r)) {
        cJSON_Delete(r);
        return NULL;
    }
    return r;
}

/* Append ring p shifted by `shift` degrees, closed, to the array `rings`. */
static int add_ring(cJSON *rings, const path *p, double shift)
{
    cJSON *r = append_array(rings);
    for (size_t i = 0; r && i <= p->n; i++) {
        size_t k = i % p->n; /* the last position repeats the first, exactly */
        if (!append_position(r, round_deg(p->x[k] + shift), p->y[k]))
            return DRAGARC_ENOMEM;
    }
    return r ? DRAGARC_OK : DRAGARC_ENOMEM;
}

/* The pieces of the polygon of rings ring[0..n-1] (oriented) in each strip, appended to the MultiPolygon
 * coordinates `polys`. */
static int add_pieces(cJSON *polys, const path *ring, size_t n)
{
    int jlo, jhi;
    strips(&ring[0], &jlo, &jhi);
    path west = {0}, piece = {0};
    int rc = DRAGARC_OK;
    for (int j = jlo; j <= jhi && rc == DRAGARC_OK; j++) {
        cJSON *rings = NULL;
        for (size_t k = 0; k < n && rc == DRAGARC_OK; k++) {
            const path *use = &ring[k];
            if (jlo != jhi) { /* cut: keep what lies in strip j */
                if (clip_side(&ring[k], 180.0 + 360.0 * j, 1, &west) != DRAGARC_OK ||
                    clip_side(&west, -180.0 + 360.0 * j, 0, &piece) != DRAGARC_OK) {
                    rc = DRAGARC_ENOMEM;
                    break;
                }
                drop_repeats(&piece, 1);
                if (piece.n < 3 || twice_area(&piece) == 0.0) {
                    if (k == 0)
                        break; /* the exterior misses this strip: so do its holes */
                    continue;
                }
                use = &piece;
            }
            if (!rings && !(rings = append_array(polys))) {
                rc = DRAGARC_ENOMEM;
                break;
            }
            rc = add_ring(rings, use, -360.0 * j);
        }
    }
    path_free(&west);
    path_free(&piece);
    return rc;
}

/* ---- features ---------------------------------------------------------------------------------------------- */

/* Where the first number that is not finite sits in `item` (path so far in path[0..len)): DRAGARC_EINVAL. */
static int check_finite(const cJSON *item, char *path_buf, size_t len, size_t cap, dragarc_error *err)
{
    if (cJSON_IsNumber(item) && !isfinite(item->valuedouble))
        return dragarc_error_set(err, DRAGARC_EINVAL, path_buf, "must be a finite number (got %g): JSON has no NaN "
                                 "or infinity", item->valuedouble);
    if (!cJSON_IsArray(item) && !cJSON_IsObject(item))
        return DRAGARC_OK;
    size_t k = 0;
    for (const cJSON *c = item->child; c; c = c->next, k++) {
        int m = cJSON_IsArray(item) ? snprintf(path_buf + len, cap - len, "[%zu]", k)
                                    : snprintf(path_buf + len, cap - len, "%s%s", len ? "." : "",
                                               c->string ? c->string : "");
        size_t next = len + (m < 0 ? 0 : (size_t)m);
        if (next >= cap)
            next = cap - 1;
        int rc = check_finite(c, path_buf, next, cap, err);
        path_buf[len] = '\0';
        if (rc != DRAGARC_OK)
            return rc;
    }
    return DRAGARC_OK;
}

/* Add a Feature of `geometry` (NULL: out of memory) and `properties` (NULL: {}) to fc. Takes both, in all
 * cases. */
static int add_feature(cJSON *fc, cJSON *geometry, cJSON *properties, dragarc_error *err)
{
    cJSON *features = cJSON_GetObjectItemCaseSensitive(fc, "features"), *f = NULL;
    char where[128] = "properties";
    int rc = DRAGARC_OK;
    if (!cJSON_IsArray(features))
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "", "not a FeatureCollection from dragarc_geojson_new");
    else if (!geometry)
        rc = nomem(err);
    else if (properties && !cJSON_IsObject(properties))
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "properties", "must be a JSON object");
    else if (properties)
        rc = check_finite(properties, where, strlen(where), sizeof where, err);
    if (rc == DRAGARC_OK) {
        if (!properties)
            properties = cJSON_CreateObject();
        f = cJSON_CreateObject();
        if (!properties || !f || !cJSON_AddStringToObject(f, "type", "Feature") ||
            !cJSON_AddItemToObject(f, "geometry", geometry))
            rc = nomem(err);
        else
            geometry = NULL; /* f's now */
        if (rc == DRAGARC_OK && !cJSON_AddItemToObject(f, "properties", properties))
            rc = nomem(err);
        else if (rc == DRAGARC_OK)
            properties = NULL;
        if (rc == DRAGARC_OK && cJSON_AddItemToArray(features, f))
            return DRAGARC_OK;
        if (rc == DRAGARC_OK)
            rc = nomem(err);
    }
    cJSON_Delete(f);
    cJSON_Delete(geometry);
    cJSON_Delete(properties);
    return rc;
}

/* A geometry {"type": type, "coordinates": coords}; takes coords; NULL when out of memory. */
static cJSON *make_geometry(const char *type, cJSON *coords)
{
    cJSON *g = coords ? cJSON_CreateObject() : NULL;
    if (!g || !cJSON_AddStringToObject(g, "type", type) || !cJSON_AddItemToObject(g, "coordinates", coords)) {
        cJSON_Delete(g);
        cJSON_Delete(coords);
        return NULL;
    }
    return g;
}

static int check_origin(dragarc_geo_origin o, dragarc_error *err)
{
    int rc = dragarc_geo_check_position(o.latitude, o.longitude, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, "origin");
    return rc;
}

cJSON *dragarc_geojson_new(void)
{
    cJSON *fc = cJSON_CreateObject();
    if (!fc || !cJSON_AddStringToObject(fc, "type", "FeatureCollection") || !cJSON_AddArrayToObject(fc, "features")) {
        cJSON_Delete(fc);
        return NULL;
    }
    return fc;
}

int dragarc_geojson_add_point(cJSON *fc, double lon_deg, double lat_deg, const double *altitude_m,
                              cJSON *properties, dragarc_error *err)
{
    int rc = dragarc_geo_check_position(lat_deg, lon_deg, err);
    if (rc == DRAGARC_OK && altitude_m && !isfinite(*altitude_m))
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "altitude", "must be a finite number of metres (got %g)",
                               *altitude_m);
    if (rc != DRAGARC_OK) {
        cJSON_Delete(properties);
        return rc;
    }
    double z = altitude_m ? round_to(*altitude_m, 1e3) : 0.0;
    /* Rounding may carry 179.99999996 up to 180, which is -180. */
    double lon = round_deg(dragarc_geo_normalize_longitude(lon_deg));
    if (lon == 180.0)
        lon = -180.0;
    cJSON *point = position(lon, round_deg(lat_deg), altitude_m ? &z : NULL);
    return add_feature(fc, make_geometry("Point", point), properties, err);
}

int dragarc_geojson_add_point_local(cJSON *fc, dragarc_geo_origin origin, double east_m, double north_m,
                                    const double *altitude_m, cJSON *properties, dragarc_error *err)
{
    double lat, lon;
    int rc = check_origin(origin, err);
    if (rc == DRAGARC_OK)
        rc = dragarc_geo_from_local(origin.latitude, origin.longitude, east_m, north_m, &lat, &lon, err);
    if (rc != DRAGARC_OK) {
        cJSON_Delete(properties);
        return rc;
    }
    return dragarc_geojson_add_point(fc, lon, lat, altitude_m, properties, err);
}

int dragarc_geojson_add_line_local(cJSON *fc, dragarc_geo_origin origin, const double *east_m,
                                   const double *north_m, size_t n, cJSON *properties, dragarc_error *err)
{
    path p = {0};
    int rc = check_origin(origin, err);
    if (rc == DRAGARC_OK && (n < 2 || !east_m || !north_m))
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "vertices", "a line needs at least 2 vertices (got %zu)", n);
    if (rc == DRAGARC_OK)
        rc = to_degrees(origin, east_m, north_m, n, "vertices", &p, err);
    if (rc != DRAGARC_OK) {
        path_free(&p);
        cJSON_Delete(properties);
        return rc;
    }
    /* Split each segment where it crosses a meridian 180 + 360 k; each piece goes to the line of its strip. */
    cJSON *parts = cJSON_CreateArray(), *cur = NULL;
    int cur_j = INT_MIN, ok = parts != NULL;
    for (size_t i = 0; ok && i + 1 < p.n; i++) {
        double x0 = p.x[i], y0 = p.y[i], x1 = p.x[i + 1], y1 = p.y[i + 1];
        double cut[8][2]; /* the segment's ends and up to 6 crossings, in the order travelled */
        size_t m = 0;
        cut[m][0] = x0, cut[m][1] = y0, m++;
        double step = x1 > x0 ? 360.0 : -360.0;
        double b = x1 > x0 ? 180.0 + 360.0 * floor((x0 - 180.0) / 360.0 + 1.0)
                           : 180.0 + 360.0 * ceil((x0 - 180.0) / 360.0 - 1.0);
        for (; m < 7 && (x1 > x0 ? b < x1 : b > x1); b += step)
            if (b != x0)
                cut[m][0] = b, cut[m][1] = round_deg(y0 + (b - x0) / (x1 - x0) * (y1 - y0)), m++;
        cut[m][0] = x1, cut[m][1] = y1, m++;
        for (size_t s = 0; ok && s + 1 < m; s++) {
            int j = (int)floor((0.5 * (cut[s][0] + cut[s + 1][0]) + 180.0) / 360.0);
            if (j != cur_j) {
                cur_j = j;
                ok = (cur = append_array(parts)) && append_position(cur, round_deg(cut[s][0] - 360.0 * j), cut[s][1]);
            }
            ok = ok && append_position(cur, round_deg(cut[s + 1][0] - 360.0 * j), cut[s + 1][1]);
        }
    }
    if (!ok) {
        cJSON_Delete(parts);
        parts = NULL;
    }
    path_free(&p);
    if (!parts)
        return add_feature(fc, NULL, properties, err);
    if (cJSON_GetArraySize(parts) == 1) {
        cJSON *only = cJSON_DetachItemFromArray(parts, 0);
        cJSON_Delete(parts);
        return add_feature(fc, make_geometry("LineString", only), properties, err);
    }
    return add_feature(fc, make_geometry("MultiLineString", parts), properties, err);
}

/* The rings of polygon `poly` oriented, cut into strips and appended to the MultiPolygon coordinates `polys`;
 * errors name "<label>rings[k]...". */
static int polygon_to(cJSON *polys, dragarc_geo_origin origin, const dragarc_geo_ring *rings, size_t n,
                      const char *label, dragarc_error *err)
{
    char where[96];
    if (!rings || n == 0) {
        snprintf(where, sizeof where, "%srings", label);
        return dragarc_error_set(err, DRAGARC_EINVAL, where, "a polygon needs an exterior ring");
    }
    path *deg = calloc(n, sizeof *deg);
    if (!deg)
        return nomem(err);
    int rc = DRAGARC_OK;
    for (size_t k = 0; k < n && rc == DRAGARC_OK; k++) {
        snprintf(where, sizeof where, "%srings[%zu]", label, k);
        rc = ring_degrees(origin, &rings[k], where, k == 0, &deg[k], err);
    }
    if (rc == DRAGARC_OK && add_pieces(polys, deg, n) != DRAGARC_OK)
        rc = nomem(err);
    for (size_t k = 0; k < n; k++)
        path_free(&deg[k]);
    free(deg);
    return rc;
}

/* A Polygon when polys holds one polygon and single is set, else a MultiPolygon; takes polys. */
static cJSON *polygon_geometry(cJSON *polys, int single)
{
    if (single && cJSON_GetArraySize(polys) == 1) {
        cJSON *only = cJSON_DetachItemFromArray(polys, 0);
        cJSON_Delete(polys);
        return make_geometry("Polygon", only);
    }
    return make_geometry("MultiPolygon", polys);
}

int dragarc_geojson_add_polygon_local(cJSON *fc, dragarc_geo_origin origin, const dragarc_geo_ring *rings,
                                      size_t n, cJSON *properties, dragarc_error *err)
{
    dragarc_geo_polygon one = {rings, n};
    cJSON *polys = cJSON_CreateArray();
    int rc = polys ? check_origin(origin, err) : nomem(err);
    if (rc == DRAGARC_OK)
        rc = polygon_to(polys, origin, one.rings, one.n, "", err);
    if (rc != DRAGARC_OK) {
        cJSON_Delete(polys);
        cJSON_Delete(properties);
        return rc;
    }
    return add_feature(fc, polygon_geometry(polys, 1), properties, err);
}

int dragarc_geojson_add_multipolygon_local(cJSON *fc, dragarc_geo_origin origin,
                                           const dragarc_geo_polygon *polygons, size_t n, cJSON *properties,
                                           dragarc_error *err)
{
    cJSON *polys = cJSON_CreateArray();
    int rc = polys ? check_origin(origin, err) : nomem(err);
    if (rc == DRAGARC_OK && (!polygons || n == 0))
        rc = dragarc_error_set(err, DRAGARC_EINVAL, "polygons", "a MultiPolygon needs at least one polygon");
    for (size_t p = 0; p < n && rc == DRAGARC_OK; p++) {
        char label[48];
        snprintf(label, sizeof label, "polygons[%zu].", p);
        rc = polygon_to(polys, origin, polygons[p].rings, polygons[p].n, label, err);
    }
    if (rc != DRAGARC_OK) {
        cJSON_Delete(polys);
        cJSON_Delete(properties);
        return rc;
    }
    return add_feature(fc, polygon_geometry(polys, 0), properties, err);
}

/* ---- text and files ---------------------------------------------------------------------------------------- */

/* The checked text of fc into *text (caller frees with free()). */
static int print_checked(const cJSON *fc, char **text, dragarc_error *err)
{
    *text = NULL;
    const cJSON *type = cJSON_GetObjectItemCaseSensitive(fc, "type");
    if (!cJSON_IsString(type) || strcmp(type->valuestring, "FeatureCollection") != 0 ||
        !cJSON_IsArray(cJSON_GetObjectItemCaseSensitive(fc, "features")))
        return dragarc_error_set(err, DRAGARC_EINVAL, "type", "not a GeoJSON FeatureCollection");
    char where[128] = "";
    int rc = check_finite(fc, where, 0, sizeof where, err);
    if (rc != DRAGARC_OK)
        return rc;
    *text = cJSON_Print(fc);
    return *text ? DRAGARC_OK : nomem(err);
}

char *dragarc_geojson_print(const cJSON *fc, dragarc_error *err)
{
    char *text;
    print_checked(fc, &text, err);
    return text;
}

int dragarc_geojson_write(const char *path_out, const cJSON *fc, dragarc_error *err)
{
    char *text;
    int rc = print_checked(fc, &text, err);
    if (rc != DRAGARC_OK)
        return rc;
    dragarc_output out;
    rc = dragarc_output_open(&out, path_out, err);
    if (rc == DRAGARC_OK) {
        if (fputs(text, out.fp) < 0 || fputc('\n', out.fp) == EOF) {
            dragarc_output_abort(&out);
            rc = dragarc_error_set(err, DRAGARC_EIO, "", "cannot write %s", path_out);
        } else {
            rc = dragarc_output_commit(&out, err);
        }
    }
    free(text);
    return rc;
}
