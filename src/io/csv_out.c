/* csv_out.c: trajectory samples as CSV (C locale, '.' decimal separator, 17 significant digits max), in the
 * units of a display, named in the column names.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <errno.h>
#include <math.h>
#include <string.h>

#include "core/constants.h"
#include "dragarc/drift.h"
#include "dragarc/footprint.h"
#include "dragarc/geodesy.h"
#include "dragarc/output.h"
#include "dragarc/sprinkler.h"

void dragarc_unit_column_suffix(const char *symbol, char *out, size_t n)
{
    size_t k = 0;
    for (const char *c = symbol; *c && k + 1 < n; c++) {
        if (*c == '(' || *c == ')')
            continue;
        out[k++] = (*c == '/' || *c == '.' || *c == ' ' || *c == '^') ? '_' : *c;
    }
    if (n > 0)
        out[k] = '\0';
}

int dragarc_flight_write_csv(FILE *fp, const dragarc_flight *f, const dragarc_display *d, dragarc_error *err)
{
    dragarc_display si;
    if (!d) {
        dragarc_display_si(&si);
        d = &si;
    }
    const dragarc_unit_out *ut = dragarc_display_unit(d, NULL, DRAGARC_Q_TIME);
    const dragarc_unit_out *ul = dragarc_display_unit(d, NULL, DRAGARC_Q_LENGTH);
    const dragarc_unit_out *uv = dragarc_display_unit(d, NULL, DRAGARC_Q_SPEED);
    const dragarc_unit_out *uw = dragarc_display_unit(d, "spin_rate", DRAGARC_Q_ANGULAR_SPEED);
    char st[32], sl[32], sv[32], sw[32];
    dragarc_unit_column_suffix(ut->symbol, st, sizeof st);
    dragarc_unit_column_suffix(ul->symbol, sl, sizeof sl);
    dragarc_unit_column_suffix(uv->symbol, sv, sizeof sv);
    dragarc_unit_column_suffix(uw->symbol, sw, sizeof sw);
    fprintf(fp, "t_%s,x_%s,y_%s,z_%s,vx_%s,vy_%s,vz_%s,speed_%s,mach,reynolds,spin_%s,spin_factor,cl,cd,diameter_%s\n", st,
            sl, sl, sl, sv, sv, sv, sv, sw, sl);
    enum { NCOL = 15 };
    for (size_t i = 0; i < f->npoints; i++) {
        const dragarc_flight_point *p = &f->points[i];
        double v[NCOL] = {dragarc_display_value(ut, p->t),      dragarc_display_value(ul, p->pos[0]),
                          dragarc_display_value(ul, p->pos[1]), dragarc_display_value(ul, p->pos[2]),
                          dragarc_display_value(uv, p->vel[0]), dragarc_display_value(uv, p->vel[1]),
                          dragarc_display_value(uv, p->vel[2]), dragarc_display_value(uv, p->speed),
                          p->mach,                              p->reynolds,
                          dragarc_display_value(uw, p->spin * 60.0 / (2.0 * DRAGARC_PI)),
                          p->spin_factor,                       p->lift_coefficient,
                          p->drag_coefficient,                  dragarc_display_value(ul, p->diameter)};
        for (int k = 0; k < NCOL; k++) {
            if (k)
                fputc(',', fp);
            dragarc_number_write(fp, v[k]); /* an empty cell for NaN or inf */
        }
        fputc('\n', fp);
    }
    if (ferror(fp))
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed: %s", strerror(errno));
    return DRAGARC_OK;
}

static int csv_done(FILE *fp, dragarc_error *err)
{
    if (ferror(fp))
        return dragarc_error_set(err, DRAGARC_EIO, "", "write failed: %s", strerror(errno));
    return DRAGARC_OK;
}

static void csv_row(FILE *fp, const double *v, int n)
{
    for (int k = 0; k < n; k++) {
        if (k)
            fputc(',', fp);
        dragarc_number_write(fp, v[k]);
    }
    fputc('\n', fp);
}

int dragarc_sprinkler_write_profile_csv(FILE *fp, const dragarc_sprinkler_result *r, double ring_width,
                                        dragarc_error *err)
{
    fputs("r_inner_m,r_outer_m,rate_mm_h\n", fp);
    for (size_t k = 0; k < r->nrings; k++) {
        double v[3] = {k * ring_width, (k + 1) * ring_width, r->ring_rate[k]};
        csv_row(fp, v, 3);
    }
    return csv_done(fp, err);
}

int dragarc_sprinkler_write_grid_csv(FILE *fp, const dragarc_sprinkler_result *r, dragarc_error *err)
{
    fputs("x_m,y_m,rate_mm_h\n", fp);
    for (size_t j = 0; j < r->ny; j++)
        for (size_t i = 0; i < r->nx; i++) {
            double v[3] = {r->x0 + (i + 0.5) * r->cell, r->y0 + (j + 0.5) * r->cell, r->grid_rate[j * r->nx + i]};
            csv_row(fp, v, 3);
        }
    return csv_done(fp, err);
}

int dragarc_drift_write_csv(FILE *fp, const dragarc_drift_result *r, dragarc_error *err)
{
    fputs("from_m,to_m,deposit_per_m", fp);
    for (size_t i = 0; i < r->nclasses; i++)
        fprintf(fp, ",d%.6g_um", r->classes[i].diameter * 1e6);
    fputc('\n', fp);
    for (size_t b = 0; b < r->nbins; b++) {
        double v[3] = {r->first_bin + b * r->bin_width, r->first_bin + (b + 1) * r->bin_width, r->deposit[b]};
        for (int k = 0; k < 3; k++) {
            if (k)
                fputc(',', fp);
            dragarc_number_write(fp, v[k]);
        }
        for (size_t i = 0; i < r->nclasses; i++) {
            fputc(',', fp);
            dragarc_number_write(fp, r->class_deposit[i * r->nbins + b]);
        }
        fputc('\n', fp);
    }
    return csv_done(fp, err);
}


int dragarc_footprint_write_csv(FILE *fp, const dragarc_footprint_spec *spec, const dragarc_impact *impacts,
                                dragarc_error *err)
{
    fputs("class,sample,outcome,east_m,north_m,longitude,latitude,impact_speed_m_s,impact_angle_deg,energy_j,time_s,"
          "fragments\n", fp);
    const size_t total = spec->nclasses * spec->samples;
    for (size_t k = 0; k < total; k++) {
        const dragarc_impact *o = &impacts[k];
        const char *outcome = o->status == DRAGARC_OK ? "landed" : o->status == DRAGARC_ENOLAND ? "aloft" : "failed";
        double lat = NAN, lon = NAN;
        if (o->status == DRAGARC_OK &&
            dragarc_geo_from_local(spec->breakup.latitude, spec->breakup.longitude, o->east, o->north, &lat, &lon,
                                   NULL) != DRAGARC_OK)
            lat = lon = NAN;
        fprintf(fp, "%u,%u,%s", (unsigned)o->cls + 1, (unsigned)o->sample + 1, outcome);
        double landed = o->status == DRAGARC_OK ? 1.0 : NAN;
        double v[9] = {o->east * landed, o->north * landed, lon, lat, o->speed * landed,
                       o->angle / DRAGARC_DEG * landed, o->energy * landed, o->time * landed, o->weight};
        for (int i = 0; i < 9; i++) {
            fputc(',', fp);
            dragarc_number_write(fp, v[i]);
        }
        fputc('\n', fp);
    }
    return csv_done(fp, err);
}

int dragarc_footprint_write_grid_csv(FILE *fp, const dragarc_footprint_spec *spec, const dragarc_footprint_summary *s,
                                     dragarc_error *err)
{
    fputs("east_m,north_m,longitude,latitude,fragments_per_km2,probability_per_km2\n", fp);
    const dragarc_scatter_grid *g = &s->grid;
    for (size_t j = 0; s->grid_ok && j < g->ny; j++)
        for (size_t i = 0; i < g->nx; i++) {
            double e = g->x0 + (i + 0.5) * g->cell, n = g->y0 + (j + 0.5) * g->cell, lat = NAN, lon = NAN;
            if (dragarc_geo_from_local(spec->breakup.latitude, spec->breakup.longitude, e, n, &lat, &lon, NULL) !=
                DRAGARC_OK)
                lat = lon = NAN;
            double v = g->value[j * g->nx + i];
            double row[6] = {e, n, lon, lat, v, g->total_weight > 0.0 ? v / g->total_weight : NAN};
            for (int k = 0; k < 6; k++) {
                if (k)
                    fputc(',', fp);
                dragarc_number_write(fp, row[k]);
            }
            fputc('\n', fp);
        }
    return csv_done(fp, err);
}
