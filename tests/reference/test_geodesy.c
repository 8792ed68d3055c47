/* test_geodesy.c: local offsets and WGS84 latitude and longitude (geodesy.h) against Karney's worked examples, the
 * GeodTest set and a meridian arc integrated by SciPy; round trips; the GeoJSON builder (geojson.h) against the
 * rules of RFC 7946; each validation rule.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources:
 *  - Karney, C. F. F. 2013, "Algorithms for geodesics", J. Geodesy 87:43-55: the direct example (Table 2) and the
 *    inverse examples (Table 3, short line; Tables 4-6, nearly antipodal points). Verified: the digits below
 *    appear alike in two independent public test suites that transcribe these tables (not read from the paper
 *    itself).
 *  - GeodTest, Karney's published test set of geodesics on WGS84 (the first five lines, as carried in the C test
 *    of GeographicLib, geodtest.c, array testcases: lat1, lon1, azi1, lat2, lon2, azi2, s12). Verified from that
 *    file.
 *  - The meridian arc, integrated apart from PROJ by tests/reference/meridian_arc.py (SciPy quad of
 *    M = a (1 - e^2) / (1 - e^2 sin^2 phi)^(3/2), Brent's method for the latitude); the ctest meridian_arc
 *    checks that the MERIDIAN_* values below are what it computes.
 *  - Butler, H. et al. 2016, "The GeoJSON Format", IETF RFC 7946, sections 3.1.1, 3.1.6 and 3.1.9.
 *
 * Tolerances: Karney's tables print 11 decimals of a degree and 6 of a metre (the short line: 6 decimals of a
 * degree), so half a unit in the last place is the precision of the source: 1e-11 degree, 1e-6 m, 1e-6 degree.
 * GeodTest is exact to about 1e-15 relative (computed in high precision); geodtest.c holds PROJ's routines to
 * 1e-13 degree and 1e-8 m, which we keep. PROJ's geodesics are accurate to 15 nm (Karney 2013, section 9), i.e.
 * 1.4e-13 degree of latitude: the meridian arcs are held to 1e-12 degree (0.11 um), the SciPy value being good to
 * 1e-13 degree; round trips, which add two such errors and a sine and cosine of the azimuth at 500 km (2.2e-16
 * relative, 1.1e-10 m), to 1e-6 m.
 */
#define _POSIX_C_SOURCE 200809L
#include <math.h>
#include <stdlib.h>
#include <unistd.h>

#include <cjson/cJSON.h>

#include "check.h"
#include "dragarc/geodesy.h"
#include "dragarc/geojson.h"
#include "dragarc/output.h"

/* SciPy's latitudes after going due north (tests/reference/meridian_arc.py; the ctest meridian_arc compares). */
#define MERIDIAN_10KM_FROM_EQUATOR_DEG 0.090436946950862449
#define MERIDIAN_10KM_FROM_60N_DEG 60.089756092533584
#define MERIDIAN_200KM_FROM_30S_DEG -28.195555397637328

/* Longitudes differ by d degrees, whatever multiple of 360 lies between them. */
static double lon_diff(double a, double b) { return dragarc_geo_normalize_longitude(a - b); }

/* ---- Karney 2013 and GeodTest ------------------------------------------------------------------------------ */

/* Table 2: from 40 N along azimuth 30 for 10 000 km: 41.79331020506 N, 137.84490004377 E, azimuth 149.09016931807. */
TEST(karney_table_2_direct_example_is_reproduced)
{
    double lat2, lon2, azi2;
    CHECK(dragarc_geo_direct(40.0, 0.0, 30.0, 10e6, &lat2, &lon2, &azi2, NULL) == DRAGARC_OK);
    CHECK_ABS(lat2, 41.79331020506, 1e-11);
    CHECK_ABS(lon2, 137.84490004377, 1e-11);
    CHECK_ABS(azi2, 149.09016931807, 1e-11);
}

/* Tables 4-6: from 30 S to 29.9 N, 179.8 degrees of longitude apart: azimuths 161.89052473633 and 18.09073724574,
 * length 19 989 832.827610 m. */
TEST(karney_nearly_antipodal_inverse_example_is_reproduced)
{
    double s12, azi1, azi2;
    CHECK(dragarc_geo_inverse(-30.0, 0.0, 29.9, 179.8, &s12, &azi1, &azi2, NULL) == DRAGARC_OK);
    CHECK_ABS(azi1, 161.89052473633, 1e-11);
    CHECK_ABS(azi2, 18.09073724574, 1e-11);
    CHECK_ABS(s12, 19989832.827610, 1e-6);
}

/* Table 3: from 30.12345 S to 30.12344 S, 0.00005 degree apart: azimuths 77.043533 and 77.043508, 4.944208 m. */
TEST(karney_table_3_short_inverse_example_is_reproduced)
{
    double s12, azi1, azi2;
    CHECK(dragarc_geo_inverse(-30.12345, 0.0, -30.12344, 0.00005, &s12, &azi1, &azi2, NULL) == DRAGARC_OK);
    CHECK_ABS(azi1, 77.043533, 1e-6);
    CHECK_ABS(azi2, 77.043508, 1e-6);
    CHECK_ABS(s12, 4.944208, 1e-6);
}

/* lat1, lon1, azi1, lat2, lon2, azi2, s12: GeodTest lines 1-5 (geodtest.c, testcases[0..4]). */
static const double GEODTEST[5][7] = {
    {35.60777, -139.44815, 111.098748429560326, -11.17491, -69.95921, 129.289270889708762, 8935244.5604818305},
    {55.52454, 106.05087, 22.020059880982801, 77.03196, 197.18234, 109.112041110671519, 4105086.1713924406},
    {-21.97856, 142.59065, -32.44456876433189, 41.84138, 98.56635, -41.84359951440466, 8394328.894657671},
    {-66.99028, 112.2363, 173.73491240878403, -12.70631, 285.90344, 2.512956620913668, 11150344.2312080241},
    {-17.42761, 173.34268, -159.033557661192928, -15.84784, 5.93557, -20.787484651536988, 16076603.1631180673},
};

TEST(geodtest_lines_solve_both_ways)
{
    for (int i = 0; i < 5; i++) {
        const double *t = GEODTEST[i];
        double lat2, lon2, azi2, s12, azi1;
        CHECK(dragarc_geo_direct(t[0], t[1], t[2], t[6], &lat2, &lon2, &azi2, NULL) == DRAGARC_OK);
        CHECK_ABS(lat2, t[3], 1e-13);
        CHECK_ABS(lon_diff(lon2, t[4]), 0.0, 1e-13);
        CHECK(lon2 >= -180.0 && lon2 < 180.0);
        CHECK_ABS(azi2, t[5], 1e-13);
        CHECK(dragarc_geo_inverse(t[0], t[1], t[3], t[4], &s12, &azi1, &azi2, NULL) == DRAGARC_OK);
        CHECK_ABS(s12, t[6], 1e-8);
        CHECK_ABS(azi1, t[2], 1e-13);
        CHECK_ABS(azi2, t[5], 1e-13);
    }
}

/* ---- local offsets ------------------------------------------------------------------------------------------ */

TEST(ten_km_north_of_the_equator_is_the_latitude_of_a_10_km_meridian_arc)
{
    double lat, lon;
    CHECK(dragarc_geo_from_local(0.0, 0.0, 0.0, 10000.0, &lat, &lon, NULL) == DRAGARC_OK);
    CHECK_ABS(lat, MERIDIAN_10KM_FROM_EQUATOR_DEG, 1e-12);
    CHECK(lon == 0.0);
    CHECK(dragarc_geo_from_local(60.0, -75.5, 0.0, 10000.0, &lat, &lon, NULL) == DRAGARC_OK);
    CHECK_ABS(lat, MERIDIAN_10KM_FROM_60N_DEG, 1e-12);
    CHECK_ABS(lon, -75.5, 1e-13);
    CHECK(dragarc_geo_from_local(-30.0, 120.0, 0.0, 200000.0, &lat, &lon, NULL) == DRAGARC_OK);
    CHECK_ABS(lat, MERIDIAN_200KM_FROM_30S_DEG, 1e-12);
    /* and back: due north, the distance the arc was integrated over */
    double e, n;
    CHECK(dragarc_geo_to_local(0.0, 0.0, MERIDIAN_10KM_FROM_EQUATOR_DEG, 0.0, &e, &n, NULL) == DRAGARC_OK);
    CHECK_ABS(n, 10000.0, 1e-6);
    CHECK(e == 0.0);
}

/* The azimuthal-equidistant meaning: the geodesic from the origin has length hypot(e, n) and azimuth atan2(e, n). */
TEST(a_local_offset_is_the_geodesic_distance_and_bearing_from_the_origin)
{
    const double offsets[4][2] = {{3000.0, 4000.0}, {-120000.0, 50000.0}, {-7.0, -24.0}, {250000.0, -400000.0}};
    for (int i = 0; i < 4; i++) {
        double lat, lon, s, azi1;
        CHECK(dragarc_geo_from_local(35.0, 139.0, offsets[i][0], offsets[i][1], &lat, &lon, NULL) == DRAGARC_OK);
        CHECK(dragarc_geo_inverse(35.0, 139.0, lat, lon, &s, &azi1, NULL, NULL) == DRAGARC_OK);
        CHECK_ABS(s, hypot(offsets[i][0], offsets[i][1]), 1e-6);
        /* the bearing, as the sideways miss it makes at that distance (m) */
        double miss = s * (azi1 * 3.14159265358979323846 / 180.0 - atan2(offsets[i][0], offsets[i][1]));
        CHECK_ABS(miss, 0.0, 1e-6);
    }
}

TEST(offsets_up_to_500_km_round_trip_to_a_micrometre_anywhere)
{
    const double lats[] = {0.0, 45.0, -60.0, 89.9, -89.99, 90.0, -90.0};
    const double lons[] = {0.0, 179.9, -179.95, 10.0};
    const double dists[] = {1.0, 1000.0, 50000.0, 500000.0};
    double worst = 0.0;
    int bad_lon = 0, n = 0;
    for (size_t a = 0; a < sizeof lats / sizeof *lats; a++)
        for (size_t b = 0; b < sizeof lons / sizeof *lons; b++)
            for (size_t d = 0; d < sizeof dists / sizeof *dists; d++)
                for (int k = 0; k < 12; k++) {
                    double az = (30.0 * k + 7.0) * 3.14159265358979323846 / 180.0;
                    double e0 = dists[d] * sin(az), n0 = dists[d] * cos(az), lat, lon, e1, n1;
                    int rc = dragarc_geo_from_local(lats[a], lons[b], e0, n0, &lat, &lon, NULL);
                    rc = rc ? rc : dragarc_geo_to_local(lats[a], lons[b], lat, lon, &e1, &n1, NULL);
                    CHECK(rc == DRAGARC_OK);
                    bad_lon += !(lon >= -180.0 && lon < 180.0);
                    worst = fmax(worst, hypot(e1 - e0, n1 - n0));
                    n++;
                }
    printf("  %d round trips, worst %.3g m\n", n, worst);
    CHECK_ABS(worst, 0.0, 1e-6);
    CHECK(bad_lon == 0);
}

/* A pole has no east or north of its own: PROJ's convention takes them as seen from just off the pole on meridian
 * lon0, so north crosses to meridian lon0 + 180 and east goes down meridian lon0 + 90. */
TEST(at_a_pole_north_and_east_follow_the_origin_longitude)
{
    double lat, lon;
    CHECK(dragarc_geo_from_local(90.0, 20.0, 0.0, 1000.0, &lat, &lon, NULL) == DRAGARC_OK);
    CHECK_ABS(lon, -160.0, 1e-9);
    CHECK(lat < 90.0 && lat > 89.99);
    CHECK(dragarc_geo_from_local(90.0, 20.0, 1000.0, 0.0, &lat, &lon, NULL) == DRAGARC_OK);
    CHECK_ABS(lon, 110.0, 1e-9);
}

TEST(an_offset_across_the_antimeridian_gives_a_normalised_longitude)
{
    double lat, lon, e, n;
    CHECK(dragarc_geo_from_local(0.0, 179.99, 5000.0, 0.0, &lat, &lon, NULL) == DRAGARC_OK);
    CHECK(lon >= -180.0 && lon < -179.9);
    CHECK_ABS(lon_diff(lon, 179.99), 5000.0 / 111319.49079327357, 1e-9); /* a dlon on the equator: a pi / 180 */
    CHECK(dragarc_geo_to_local(0.0, 179.99, lat, lon, &e, &n, NULL) == DRAGARC_OK);
    CHECK_ABS(e, 5000.0, 1e-6);
}

TEST(longitudes_are_brought_into_minus_180_to_180)
{
    CHECK(dragarc_geo_normalize_longitude(180.0) == -180.0);
    CHECK(dragarc_geo_normalize_longitude(-180.0) == -180.0);
    CHECK(dragarc_geo_normalize_longitude(540.0) == -180.0);
    CHECK(dragarc_geo_normalize_longitude(-190.0) == 170.0);
    CHECK(dragarc_geo_normalize_longitude(720.25) == 0.25);
    /* just below -180: lon + 180 is a tiny negative number, whose fmod + 360 rounds to 360 */
    double below = nextafter(-180.0, -200.0), x = dragarc_geo_normalize_longitude(below);
    CHECK(x >= -180.0 && x < 180.0 && fabs(lon_diff(x, below)) < 1e-12);
    CHECK(signbit(dragarc_geo_normalize_longitude(-360.0)) == 0);
    CHECK(isnan(dragarc_geo_normalize_longitude(NAN)));
}

static void check_error(int rc, const dragarc_error *err, const char *field, const char *message)
{
    CHECK(rc == DRAGARC_EINVAL);
    CHECK(err->code == DRAGARC_EINVAL);
    if (strcmp(err->field, field) != 0 || (message && strcmp(err->message, message) != 0))
        printf("  got %s: %s\n", err->field, err->message);
    CHECK(strcmp(err->field, field) == 0);
    CHECK(!message || strcmp(err->message, message) == 0);
}

TEST(bad_positions_and_offsets_are_refused_naming_the_field)
{
    dragarc_error err;
    double lat, lon, e, n;
    check_error(dragarc_geo_from_local(91.0, 0.0, 0.0, 0.0, &lat, &lon, &err), &err, "latitude",
                "must be between -90 and 90 degrees (got 91)");
    dragarc_error_prefix(&err, "breakup");
    CHECK(strcmp(err.field, "breakup.latitude") == 0);
    check_error(dragarc_geo_from_local(-90.5, 0.0, 0.0, 0.0, &lat, &lon, &err), &err, "latitude",
                "must be between -90 and 90 degrees (got -90.5)");
    check_error(dragarc_geo_from_local(NAN, 0.0, 0.0, 0.0, &lat, &lon, &err), &err, "latitude", NULL);
    check_error(dragarc_geo_from_local(0.0, INFINITY, 0.0, 0.0, &lat, &lon, &err), &err, "longitude", NULL);
    check_error(dragarc_geo_from_local(0.0, 0.0, NAN, 0.0, &lat, &lon, &err), &err, "east", NULL);
    check_error(dragarc_geo_from_local(0.0, 0.0, 0.0, -INFINITY, &lat, &lon, &err), &err, "north", NULL);
    check_error(dragarc_geo_from_local(0.0, 0.0, 3e6, -1.2e7, &lat, &lon, &err), &err, "north", NULL);
    CHECK(dragarc_geo_from_local(0.0, 0.0, 0.0, 1e7, &lat, &lon, NULL) == DRAGARC_OK); /* the limit itself */
    check_error(dragarc_geo_to_local(0.0, NAN, 0.0, 0.0, &e, &n, &err), &err, "origin.longitude", NULL);
    check_error(dragarc_geo_to_local(0.0, 0.0, 90.0001, 0.0, &e, &n, &err), &err, "latitude", NULL);
    check_error(dragarc_geo_direct(0.0, 0.0, NAN, 1.0, &lat, &lon, NULL, &err), &err, "azimuth", NULL);
    check_error(dragarc_geo_direct(0.0, 0.0, 0.0, INFINITY, &lat, &lon, NULL, &err), &err, "distance", NULL);
    check_error(dragarc_geo_inverse(0.0, 0.0, -91.0, 0.0, &e, NULL, NULL, &err), &err, "latitude2", NULL);
    check_error(dragarc_geo_check_position(0.0, NAN, &err), &err, "longitude", NULL);
    CHECK(dragarc_geo_check_position(-90.0, 1e6, &err) == DRAGARC_OK);
}

/* ---- GeoJSON ------------------------------------------------------------------------------------------------ */

static const cJSON *feature(const cJSON *fc, int i)
{
    return cJSON_GetArrayItem(cJSON_GetObjectItemCaseSensitive(fc, "features"), i);
}

static const char *geometry_type(const cJSON *f)
{
    const cJSON *t = cJSON_GetObjectItemCaseSensitive(cJSON_GetObjectItemCaseSensitive(f, "geometry"), "type");
    return cJSON_IsString(t) ? t->valuestring : "";
}

static const cJSON *coordinates(const cJSON *f)
{
    return cJSON_GetObjectItemCaseSensitive(cJSON_GetObjectItemCaseSensitive(f, "geometry"), "coordinates");
}

static double coord(const cJSON *pos, int k) { return cJSON_GetArrayItem(pos, k)->valuedouble; }

/* Twice the shoelace area of a GeoJSON ring in (longitude, latitude): > 0 counter-clockwise. */
static double ring_area2(const cJSON *ring)
{
    int n = cJSON_GetArraySize(ring);
    double s = 0.0;
    for (int i = 0; i + 1 < n; i++) {
        const cJSON *p = cJSON_GetArrayItem(ring, i), *q = cJSON_GetArrayItem(ring, i + 1);
        s += coord(p, 0) * coord(q, 1) - coord(q, 0) * coord(p, 1);
    }
    return s;
}

/* RFC 7946 3.1.6: at least 4 positions, the last equal to the first; every longitude within [-180, 180]. */
static int ring_is_closed_and_in_range(const cJSON *ring)
{
    int n = cJSON_GetArraySize(ring), ok = n >= 4;
    const cJSON *first = cJSON_GetArrayItem(ring, 0), *last = cJSON_GetArrayItem(ring, n - 1);
    ok = ok && coord(first, 0) == coord(last, 0) && coord(first, 1) == coord(last, 1);
    for (int i = 0; ok && i < n; i++) {
        double lon = coord(cJSON_GetArrayItem(ring, i), 0);
        ok = lon >= -180.0 && lon <= 180.0;
    }
    return ok;
}

/* A square of half-side h m about (cx, cy) m, counter-clockwise (ccw) or clockwise, open. */
static void square(double cx, double cy, double h, int ccw, double e[4], double n[4])
{
    const double ue[4] = {-1, 1, 1, -1}, un[4] = {-1, -1, 1, 1};
    for (int i = 0; i < 4; i++) {
        int k = ccw ? i : 3 - i;
        e[i] = cx + h * ue[k];
        n[i] = cy + h * un[k];
    }
}

TEST(a_new_collection_is_an_empty_feature_collection)
{
    cJSON *fc = dragarc_geojson_new();
    CHECK(fc != NULL);
    CHECK(strcmp(cJSON_GetObjectItemCaseSensitive(fc, "type")->valuestring, "FeatureCollection") == 0);
    CHECK(cJSON_GetArraySize(cJSON_GetObjectItemCaseSensitive(fc, "features")) == 0);
    CHECK(cJSON_GetObjectItemCaseSensitive(fc, "crs") == NULL); /* RFC 7946 section 4: no crs member */
    cJSON_Delete(fc);
}

TEST(points_are_longitude_first_rounded_to_7_decimals)
{
    cJSON *fc = dragarc_geojson_new();
    dragarc_geo_origin o = {0.0, 10.0};
    cJSON *props = cJSON_CreateObject();
    cJSON_AddNumberToObject(props, "mass", 2.5);
    CHECK(dragarc_geojson_add_point_local(fc, o, 10000.0, 0.0, NULL, props, NULL) == DRAGARC_OK);
    double alt = 12.34567;
    CHECK(dragarc_geojson_add_point(fc, 12.345678912, -0.1234567891, &alt, NULL, NULL) == DRAGARC_OK);
    CHECK(dragarc_geojson_add_point(fc, 179.99999996, 0.0, NULL, NULL, NULL) == DRAGARC_OK);
    const cJSON *f0 = feature(fc, 0), *p0 = coordinates(f0);
    CHECK(strcmp(cJSON_GetObjectItemCaseSensitive(f0, "type")->valuestring, "Feature") == 0);
    CHECK(strcmp(geometry_type(f0), "Point") == 0);
    CHECK(cJSON_GetArraySize(p0) == 2);
    /* 10 km east along the equator: 10000 / (a pi / 180) degrees of longitude, latitude 0 */
    CHECK_ABS(coord(p0, 0), 10.0 + 10000.0 / 111319.49079327357, 5e-8);
    CHECK(coord(p0, 1) == 0.0);
    CHECK(cJSON_GetObjectItemCaseSensitive(cJSON_GetObjectItemCaseSensitive(f0, "properties"), "mass")->valuedouble ==
          2.5);
    const cJSON *p1 = coordinates(feature(fc, 1));
    CHECK(cJSON_GetArraySize(p1) == 3);
    CHECK(coord(p1, 0) == 12.3456789 && coord(p1, 1) == -0.1234568 && coord(p1, 2) == 12.346);
    CHECK(coord(coordinates(feature(fc, 2)), 0) == -180.0); /* rounds up to 180, which is -180 */
    CHECK(cJSON_IsObject(cJSON_GetObjectItemCaseSensitive(feature(fc, 1), "properties")));
    cJSON_Delete(fc);
}

TEST(a_clockwise_ring_is_turned_counter_clockwise_and_closed)
{
    cJSON *fc = dragarc_geojson_new();
    dragarc_geo_origin o = {-33.9, 18.4};
    double e[5], n[5], he[4], hn[4];
    square(0.0, 0.0, 2000.0, 0, e, n); /* clockwise exterior */
    e[4] = e[0], n[4] = n[0];          /* given closed: still 5 positions out, not 6 */
    square(0.0, 0.0, 500.0, 1, he, hn); /* counter-clockwise hole */
    dragarc_geo_ring rings[2] = {{e, n, 5}, {he, hn, 4}};
    CHECK(dragarc_geojson_add_polygon_local(fc, o, rings, 2, NULL, NULL) == DRAGARC_OK);
    const cJSON *f = feature(fc, 0), *c = coordinates(f);
    CHECK(strcmp(geometry_type(f), "Polygon") == 0);
    CHECK(cJSON_GetArraySize(c) == 2);
    const cJSON *ext = cJSON_GetArrayItem(c, 0), *hole = cJSON_GetArrayItem(c, 1);
    CHECK(cJSON_GetArraySize(ext) == 5 && cJSON_GetArraySize(hole) == 5);
    CHECK(ring_is_closed_and_in_range(ext) && ring_is_closed_and_in_range(hole));
    CHECK(ring_area2(ext) > 0.0);  /* exterior counter-clockwise */
    CHECK(ring_area2(hole) < 0.0); /* hole clockwise */
    /* longitude first: Cape Town's square has longitudes near 18.4 and latitudes near -33.9 */
    const cJSON *p = cJSON_GetArrayItem(ext, 0);
    CHECK(fabs(coord(p, 0) - 18.4) < 0.05 && fabs(coord(p, 1) + 33.9) < 0.05);
    /* a counter-clockwise exterior keeps its order */
    square(0.0, 0.0, 2000.0, 1, e, n);
    rings[0].n = 4;
    CHECK(dragarc_geojson_add_polygon_local(fc, o, rings, 1, NULL, NULL) == DRAGARC_OK);
    const cJSON *ext2 = cJSON_GetArrayItem(coordinates(feature(fc, 1)), 0);
    double lat, lon;
    CHECK(dragarc_geo_from_local(o.latitude, o.longitude, e[1], n[1], &lat, &lon, NULL) == DRAGARC_OK);
    CHECK_ABS(coord(cJSON_GetArrayItem(ext2, 1), 0), lon, 5e-8);
    CHECK_ABS(coord(cJSON_GetArrayItem(ext2, 1), 1), lat, 5e-8);
    CHECK(ring_area2(ext2) > 0.0);
    cJSON_Delete(fc);
}

/* Sum of |area| over the pieces of a MultiPolygon's exteriors minus holes, in square degrees. */
static double multipolygon_area(const cJSON *polys)
{
    double s = 0.0;
    for (int p = 0; p < cJSON_GetArraySize(polys); p++) {
        const cJSON *rings = cJSON_GetArrayItem(polys, p);
        for (int k = 0; k < cJSON_GetArraySize(rings); k++)
            s += 0.5 * ring_area2(cJSON_GetArrayItem(rings, k)); /* holes are clockwise: negative */
    }
    return s;
}

TEST(an_area_across_the_antimeridian_is_cut_into_a_multipolygon)
{
    cJSON *fc = dragarc_geojson_new();
    double e[4], n[4], he[4], hn[4];
    square(0.0, 0.0, 20000.0, 0, e, n);
    square(0.0, 0.0, 10000.0, 0, he, hn); /* 0.09 degree wide about 179.95: it straddles too */
    dragarc_geo_ring rings[2] = {{e, n, 4}, {he, hn, 4}};
    dragarc_geo_origin across = {-15.0, 179.95}, away = {-15.0, 0.0};
    CHECK(dragarc_geojson_add_polygon_local(fc, across, rings, 2, NULL, NULL) == DRAGARC_OK);
    CHECK(dragarc_geojson_add_polygon_local(fc, away, rings, 2, NULL, NULL) == DRAGARC_OK);
    const cJSON *f = feature(fc, 0), *polys = coordinates(f);
    CHECK(strcmp(geometry_type(f), "MultiPolygon") == 0);
    CHECK(cJSON_GetArraySize(polys) == 2);
    double min_lon = 360.0, max_lon = -360.0;
    for (int p = 0; p < cJSON_GetArraySize(polys); p++) {
        const cJSON *rs = cJSON_GetArrayItem(polys, p);
        CHECK(cJSON_GetArraySize(rs) == 2); /* a part of the hole in each piece */
        CHECK(ring_area2(cJSON_GetArrayItem(rs, 0)) > 0.0 && ring_area2(cJSON_GetArrayItem(rs, 1)) < 0.0);
        for (int k = 0; k < 2; k++) {
            const cJSON *r = cJSON_GetArrayItem(rs, k);
            CHECK(ring_is_closed_and_in_range(r));
            for (int i = 0; i < cJSON_GetArraySize(r); i++) {
                min_lon = fmin(min_lon, coord(cJSON_GetArrayItem(r, i), 0));
                max_lon = fmax(max_lon, coord(cJSON_GetArrayItem(r, i), 0));
            }
        }
    }
    CHECK(min_lon == -180.0 && max_lon == 180.0);
    /* The same figure away from the antimeridian (the ellipsoid is the same at every longitude) has the same area:
     * each position moves by at most 5e-8 degree in rounding, so the areas (about 0.13 square degree, perimeter
     * 1.5 degree) agree to 1.5 * 5e-8 * 2 = 1.5e-7 square degree; 1e-6 relative. */
    const cJSON *one = coordinates(feature(fc, 1));
    CHECK(strcmp(geometry_type(feature(fc, 1)), "Polygon") == 0);
    double a_away = 0.5 * (ring_area2(cJSON_GetArrayItem(one, 0)) + ring_area2(cJSON_GetArrayItem(one, 1)));
    CHECK_REL(multipolygon_area(polys), a_away, 1e-6);
    cJSON_Delete(fc);
}

TEST(a_line_across_the_antimeridian_is_cut_into_a_multilinestring)
{
    cJSON *fc = dragarc_geojson_new();
    const double e[3] = {-5000.0, 0.0, 5000.0}, n[3] = {0.0, 1000.0, 2000.0};
    dragarc_geo_origin across = {10.0, 179.99}, away = {10.0, 100.0};
    CHECK(dragarc_geojson_add_line_local(fc, across, e, n, 3, NULL, NULL) == DRAGARC_OK);
    CHECK(dragarc_geojson_add_line_local(fc, away, e, n, 3, NULL, NULL) == DRAGARC_OK);
    const cJSON *parts = coordinates(feature(fc, 0));
    CHECK(strcmp(geometry_type(feature(fc, 0)), "MultiLineString") == 0);
    CHECK(cJSON_GetArraySize(parts) == 2);
    const cJSON *a = cJSON_GetArrayItem(parts, 0), *b = cJSON_GetArrayItem(parts, 1);
    const cJSON *a_end = cJSON_GetArrayItem(a, cJSON_GetArraySize(a) - 1), *b_start = cJSON_GetArrayItem(b, 0);
    CHECK(coord(a_end, 0) == 180.0 && coord(b_start, 0) == -180.0);
    CHECK(coord(a_end, 1) == coord(b_start, 1)); /* one crossing point, seen from both sides */
    CHECK(cJSON_GetArraySize(a) + cJSON_GetArraySize(b) == 5);
    CHECK(strcmp(geometry_type(feature(fc, 1)), "LineString") == 0);
    CHECK(cJSON_GetArraySize(coordinates(feature(fc, 1))) == 3);
    /* an origin longitude given as 100 + 3 x 360 is the same place: the same line */
    CHECK(dragarc_geojson_add_line_local(fc, (dragarc_geo_origin){10.0, 1180.0}, e, n, 3, NULL, NULL) == DRAGARC_OK);
    CHECK(cJSON_Compare(coordinates(feature(fc, 2)), coordinates(feature(fc, 1)), 1));
    cJSON_Delete(fc);
}

TEST(a_multipolygon_keeps_each_polygon)
{
    cJSON *fc = dragarc_geojson_new();
    double e1[4], n1[4], e2[4], n2[4];
    square(-10000.0, 0.0, 1000.0, 1, e1, n1);
    square(10000.0, 0.0, 1000.0, 0, e2, n2);
    dragarc_geo_ring r1 = {e1, n1, 4}, r2 = {e2, n2, 4};
    dragarc_geo_polygon polys[2] = {{&r1, 1}, {&r2, 1}};
    CHECK(dragarc_geojson_add_multipolygon_local(fc, (dragarc_geo_origin){28.5, -80.6}, polys, 2, NULL, NULL) ==
          DRAGARC_OK);
    const cJSON *c = coordinates(feature(fc, 0));
    CHECK(strcmp(geometry_type(feature(fc, 0)), "MultiPolygon") == 0);
    CHECK(cJSON_GetArraySize(c) == 2);
    for (int p = 0; p < 2; p++) {
        const cJSON *ext = cJSON_GetArrayItem(cJSON_GetArrayItem(c, p), 0);
        CHECK(ring_is_closed_and_in_range(ext) && ring_area2(ext) > 0.0);
    }
    cJSON_Delete(fc);
}

TEST(bad_geometry_and_values_that_are_not_finite_are_refused_naming_where)
{
    cJSON *fc = dragarc_geojson_new();
    dragarc_error err;
    dragarc_geo_origin o = {51.5, -0.1};
    double e[4], n[4];
    square(0.0, 0.0, 100.0, 1, e, n);
    dragarc_geo_ring two = {e, n, 2};
    check_error(dragarc_geojson_add_polygon_local(fc, o, &two, 1, NULL, &err), &err, "rings[0]",
                "a ring needs at least 3 vertices (got 2)");
    const double le[3] = {0.0, 10.0, 20.0}, ln[3] = {0.0, 10.0, 20.0};
    dragarc_geo_ring line = {le, ln, 3};
    check_error(dragarc_geojson_add_polygon_local(fc, o, &line, 1, NULL, &err), &err, "rings[0]", NULL);
    CHECK(strstr(err.message, "no area") != NULL);
    double he[4], hn[4];
    square(0.0, 0.0, 10.0, 1, he, hn);
    hn[2] = NAN;
    dragarc_geo_ring rings[2] = {{e, n, 4}, {he, hn, 4}};
    check_error(dragarc_geojson_add_polygon_local(fc, o, rings, 2, NULL, &err), &err, "rings[1][2].north", NULL);
    dragarc_geo_polygon polys[2] = {{rings, 1}, {rings + 1, 1}};
    check_error(dragarc_geojson_add_multipolygon_local(fc, o, polys, 2, NULL, &err), &err,
                "polygons[1].rings[0][2].north", NULL);
    check_error(dragarc_geojson_add_line_local(fc, o, le, ln, 1, NULL, &err), &err, "vertices", NULL);
    const double far_e[2] = {0.0, 2e7}, far_n[2] = {0.0, 0.0};
    check_error(dragarc_geojson_add_line_local(fc, o, far_e, far_n, 2, NULL, &err), &err, "vertices[1].east", NULL);
    check_error(dragarc_geojson_add_point_local(fc, (dragarc_geo_origin){95.0, 0.0}, 0.0, 0.0, NULL, NULL, &err),
                &err, "origin.latitude", "must be between -90 and 90 degrees (got 95)");
    double alt = NAN;
    check_error(dragarc_geojson_add_point(fc, 0.0, 0.0, &alt, NULL, &err), &err, "altitude", NULL);
    /* properties: taken in every case (ASan sees a leak or a double free) */
    cJSON *props = cJSON_CreateObject();
    cJSON *list = cJSON_AddArrayToObject(props, "masses");
    cJSON_AddItemToArray(list, cJSON_CreateNumber(1.0));
    cJSON_AddItemToArray(list, cJSON_CreateNumber(NAN));
    check_error(dragarc_geojson_add_point(fc, 0.0, 0.0, NULL, props, &err), &err, "properties.masses[1]", NULL);
    check_error(dragarc_geojson_add_point(fc, 0.0, 0.0, NULL, cJSON_CreateNumber(1.0), &err), &err, "properties",
                NULL);
    /* an area round a pole cannot be one polygon in longitude and latitude */
    double ce[24], cn[24];
    for (int i = 0; i < 24; i++) {
        ce[i] = 20000.0 * cos(i * 3.14159265358979323846 / 12.0);
        cn[i] = 20000.0 * sin(i * 3.14159265358979323846 / 12.0);
    }
    dragarc_geo_ring circle = {ce, cn, 24};
    check_error(dragarc_geojson_add_polygon_local(fc, (dragarc_geo_origin){89.95, 0.0}, &circle, 1, NULL, &err),
                &err, "rings[0]", NULL);
    CHECK(strstr(err.message, "pole") != NULL);
    CHECK(cJSON_GetArraySize(cJSON_GetObjectItemCaseSensitive(fc, "features")) == 0); /* nothing half-added */
    cJSON_Delete(fc);
}

TEST(the_file_is_written_whole_and_reads_back)
{
    const char *path = "test_geodesy.geojson";
    cJSON *fc = dragarc_geojson_new();
    dragarc_geo_origin o = {-20.5, 179.97};
    double e[4], n[4];
    square(0.0, 0.0, 4000.0, 0, e, n);
    dragarc_geo_ring ring = {e, n, 4};
    cJSON *props = cJSON_CreateObject();
    cJSON_AddStringToObject(props, "name", "hazard area");
    dragarc_error err;
    CHECK(dragarc_geojson_add_polygon_local(fc, o, &ring, 1, props, &err) == DRAGARC_OK);
    CHECK(dragarc_geojson_add_point_local(fc, o, 100.0, -50.0, NULL, NULL, &err) == DRAGARC_OK);
    CHECK(dragarc_geojson_write(path, fc, &err) == DRAGARC_OK);
    char *text = NULL;
    CHECK(dragarc_text_file_read(path, 1 << 20, &text, &err) == DRAGARC_OK);
    char *printed = dragarc_geojson_print(fc, &err);
    CHECK(text && printed && strncmp(text, printed, strlen(printed)) == 0);
    cJSON *back = text ? cJSON_Parse(text) : NULL;
    CHECK(back != NULL && cJSON_Compare(back, fc, 1));
    cJSON_Delete(back);
    free(text);
    free(printed);

    /* a NaN put in by hand after the checks is still never written: no file, the old one untouched */
    cJSON_AddNumberToObject(cJSON_GetObjectItemCaseSensitive(feature(fc, 1), "properties"), "mass", NAN);
    const char *fresh = "test_geodesy_nan.geojson";
    unlink(fresh);
    check_error(dragarc_geojson_write(fresh, fc, &err), &err, "features[1].properties.mass", NULL);
    CHECK(access(fresh, F_OK) != 0);
    CHECK(dragarc_geojson_print(fc, &err) == NULL);
    cJSON *not_fc = cJSON_CreateObject();
    check_error(dragarc_geojson_write(fresh, not_fc, &err), &err, "type", NULL);
    cJSON_Delete(not_fc);
    cJSON_Delete(fc);

    fc = dragarc_geojson_new();
    CHECK(dragarc_geojson_write("/nonexistent-dir/x.geojson", fc, &err) == DRAGARC_EIO);
    cJSON_Delete(fc);
}

int main(void)
{
    RUN(karney_table_2_direct_example_is_reproduced);
    RUN(karney_nearly_antipodal_inverse_example_is_reproduced);
    RUN(karney_table_3_short_inverse_example_is_reproduced);
    RUN(geodtest_lines_solve_both_ways);
    RUN(ten_km_north_of_the_equator_is_the_latitude_of_a_10_km_meridian_arc);
    RUN(a_local_offset_is_the_geodesic_distance_and_bearing_from_the_origin);
    RUN(offsets_up_to_500_km_round_trip_to_a_micrometre_anywhere);
    RUN(at_a_pole_north_and_east_follow_the_origin_longitude);
    RUN(an_offset_across_the_antimeridian_gives_a_normalised_longitude);
    RUN(longitudes_are_brought_into_minus_180_to_180);
    RUN(bad_positions_and_offsets_are_refused_naming_the_field);
    RUN(a_new_collection_is_an_empty_feature_collection);
    RUN(points_are_longitude_first_rounded_to_7_decimals);
    RUN(a_clockwise_ring_is_turned_counter_clockwise_and_closed);
    RUN(an_area_across_the_antimeridian_is_cut_into_a_multipolygon);
    RUN(a_line_across_the_antimeridian_is_cut_into_a_multilinestring);
    RUN(a_multipolygon_keeps_each_polygon);
    RUN(bad_geometry_and_values_that_are_not_finite_are_refused_naming_where);
    RUN(the_file_is_written_whole_and_reads_back);
    return check_summary();
}
