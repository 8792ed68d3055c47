/* footprint_geojson.c: a footprint as an RFC 7946 FeatureCollection (geojson.h builds and writes it).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <math.h>
#include <stdlib.h>

#include <cjson/cJSON.h>

#include "core/constants.h"
#include "dragarc/footprint.h"
#include "dragarc/geojson.h"
#include "dragarc/output.h"

#define ELLIPSE_VERTICES 72

static cJSON *props(const char *kind, const char *name)
{
    cJSON *p = cJSON_CreateObject();
    cJSON_AddStringToObject(p, "kind", kind);
    if (name)
        cJSON_AddStringToObject(p, "class", name);
    return p;
}

static int add_ellipses(cJSON *fc, dragarc_geo_origin o, const dragarc_footprint_group *g, const char *name,
                        dragarc_error *err)
{
    if (!g->ellipses_ok)
        return DRAGARC_OK;
    double xy[2 * (ELLIPSE_VERTICES + 1)], e[ELLIPSE_VERTICES + 1], n[ELLIPSE_VERTICES + 1];
    for (int k = 0; k < 3; k += 2) { /* 1 and 3 sigma */
        dragarc_scatter_ellipse_ring(&g->ellipse[k], ELLIPSE_VERTICES, xy);
        for (int i = 0; i <= ELLIPSE_VERTICES; i++)
            e[i] = xy[2 * i], n[i] = xy[2 * i + 1];
        dragarc_geo_ring ring = {e, n, ELLIPSE_VERTICES + 1};
        cJSON *p = props("ellipse", name);
        cJSON_AddNumberToObject(p, "sigma", g->ellipse[k].k_sigma);
        cJSON_AddNumberToObject(p, "probability", g->ellipse[k].probability);
        int rc = dragarc_geojson_add_polygon_local(fc, o, &ring, 1, p, err);
        if (rc != DRAGARC_OK)
            return rc;
    }
    return DRAGARC_OK;
}

/* The rings of a scatter polygon as two coordinate arrays each, in geo_ring form (points into buf). */
static int add_region(cJSON *fc, dragarc_geo_origin o, const dragarc_scatter_region *r, dragarc_error *err)
{
    size_t nrings = 0, npts = 0;
    for (size_t p = 0; p < r->npolygons; p++) {
        nrings += 1 + r->polygons[p].nholes;
        npts += r->polygons[p].exterior.n;
        for (size_t h = 0; h < r->polygons[p].nholes; h++)
            npts += r->polygons[p].holes[h].n;
    }
    dragarc_geo_polygon *polys = malloc((r->npolygons + 1) * sizeof *polys);
    dragarc_geo_ring *rings = malloc((nrings + 1) * sizeof *rings);
    double *coords = malloc((2 * npts + 1) * sizeof *coords);
    if (!polys || !rings || !coords) {
        free(polys), free(rings), free(coords);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the contours");
    }
    size_t ri = 0, ci = 0;
    for (size_t p = 0; p < r->npolygons; p++) {
        polys[p].rings = rings + ri;
        polys[p].n = 1 + r->polygons[p].nholes;
        for (size_t h = 0; h <= r->polygons[p].nholes; h++) {
            const dragarc_scatter_ring *s = h == 0 ? &r->polygons[p].exterior : &r->polygons[p].holes[h - 1];
            double *e = coords + ci, *n = coords + ci + s->n;
            for (size_t i = 0; i < s->n; i++)
                e[i] = s->xy[2 * i], n[i] = s->xy[2 * i + 1];
            rings[ri++] = (dragarc_geo_ring){e, n, s->n};
            ci += 2 * s->n;
        }
    }
    cJSON *pr = props("contour", NULL);
    cJSON_AddNumberToObject(pr, "probability", r->probability);
    cJSON_AddNumberToObject(pr, "fraction", r->fraction);
    cJSON_AddNumberToObject(pr, "area_m2", r->area);
    int rc = dragarc_geojson_add_multipolygon_local(fc, o, polys, r->npolygons, pr, err);
    free(polys), free(rings), free(coords);
    return rc;
}

int dragarc_footprint_write_geojson(const char *path, const dragarc_footprint_spec *spec,
                                    const dragarc_impact *impacts, const dragarc_footprint_summary *s,
                                    dragarc_error *err)
{
    cJSON *fc = dragarc_geojson_new();
    if (!fc)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the GeoJSON");
    dragarc_geo_origin o = {spec->breakup.latitude, spec->breakup.longitude};
    cJSON *p = props("breakup", NULL);
    cJSON_AddStringToObject(p, "scenario", spec->base.name);
    cJSON_AddStringToObject(p, "dragarc_version", DRAGARC_VERSION_STRING);
    int rc = dragarc_geojson_add_point_local(fc, o, 0.0, 0.0, &spec->breakup.altitude, p, err);
    /* the impact points, evenly taken when there are more than the cap */
    const size_t total = spec->nclasses * spec->samples;
    size_t landed = 0;
    for (size_t k = 0; k < total; k++)
        landed += impacts[k].status == DRAGARC_OK;
    size_t step = landed > DRAGARC_FOOTPRINT_GEOJSON_POINTS
                      ? (landed + DRAGARC_FOOTPRINT_GEOJSON_POINTS - 1) / DRAGARC_FOOTPRINT_GEOJSON_POINTS
                      : 1;
    for (size_t k = 0, seen = 0; k < total && rc == DRAGARC_OK; k++) {
        const dragarc_impact *im = &impacts[k];
        if (im->status != DRAGARC_OK || seen++ % step != 0)
            continue;
        cJSON *q = props("impact", spec->classes[im->cls].name);
        cJSON_AddNumberToObject(q, "class_index", im->cls + 1);
        cJSON_AddNumberToObject(q, "sample", im->sample + 1);
        cJSON_AddNumberToObject(q, "impact_speed_m_s", im->speed);
        cJSON_AddNumberToObject(q, "energy_j", im->energy);
        cJSON_AddNumberToObject(q, "fragments", im->weight);
        rc = dragarc_geojson_add_point_local(fc, o, im->east, im->north, NULL, q, err);
    }
    for (size_t g = 0; g < s->ngroups && rc == DRAGARC_OK; g++)
        rc = add_ellipses(fc, o, &s->groups[g], g < spec->nclasses ? spec->classes[g].name : "all", err);
    for (int k = 0; k < DRAGARC_FOOTPRINT_NREGIONS && s->grid_ok && rc == DRAGARC_OK; k++)
        rc = add_region(fc, o, &s->region[k], err);
    if (rc == DRAGARC_OK)
        rc = dragarc_geojson_write(path, fc, err);
    cJSON_Delete(fc);
    return rc;
}
