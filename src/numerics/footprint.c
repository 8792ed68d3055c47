/* footprint.c: Monte Carlo flights of the fragments of a breakup (footprint.h).
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Each sample draws, in this order and always all of them: 6 normals for the breakup state, 1 normal for the
 * ballistic coefficient, 1 uniform and 3 normals for the magnitude of Delta V, 2 uniforms for its direction, 2
 * normals and 1 uniform for the wind. The draws come from the sample's own MT19937 stream (Matsumoto & Nishimura
 * 1998, ACM TOMACS 8:3, as GSL's gsl_rng_mt19937), normals by GSL's gsl_ran_gaussian_ziggurat (Marsaglia & Tsang
 * 2000). Breakup covariances are factored by GSL's symmetric eigensolver, so a covariance with zero variances
 * (a component known exactly) is accepted: x = x0 + V sqrt(Lambda) z.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include <gsl/gsl_eigen.h>
#include <gsl/gsl_randist.h>
#include <gsl/gsl_rng.h>

#include "core/constants.h"
#include "dragarc/flight.h"
#include "dragarc/footprint.h"
#include "numerics/progress.h"


uint64_t dragarc_footprint_stream_seed(uint64_t seed, uint32_t cls, uint32_t sample)
{
    /* SplitMix64's finaliser (Steele, Lea & Flood 2014, "Fast splittable pseudorandom number generators", OOPSLA),
     * applied twice over the run seed and the (class, sample) pair. */
    uint64_t z = seed + 0x9e3779b97f4a7c15ULL * (((uint64_t)cls << 32 | sample) + 1);
    for (int i = 0; i < 2; i++) {
        z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
        z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
        z ^= z >> 31;
    }
    return z;
}

double dragarc_fragment_nominal_cd(const dragarc_drag *drag)
{
    return dragarc_drag_cd(drag, 1e6, 0.5, 170.0);
}

double dragarc_fragment_beta(const dragarc_fragment_class *c)
{
    return c->mass / (dragarc_fragment_nominal_cd(&c->drag) * c->area);
}

void dragarc_footprint_spec_clear(dragarc_footprint_spec *spec)
{
    if (!spec)
        return;
    for (size_t i = 0; i < spec->nclasses && spec->classes; i++)
        dragarc_drag_clear(&spec->classes[i].drag);
    free(spec->classes);
    for (size_t i = 0; i < spec->wind_spread.nprofiles && spec->wind_spread.profiles; i++)
        dragarc_wind_clear(&spec->wind_spread.profiles[i]);
    free(spec->wind_spread.profiles);
    dragarc_scenario_clear(&spec->base);
    memset(spec, 0, sizeof *spec);
}

int dragarc_dv_distribution_from_name(const char *name, dragarc_dv_distribution *out)
{
    static const char *const NAMES[] = {"none", "fixed", "uniform", "maxwellian"};
    if (!name[0]) {
        *out = DRAGARC_DV_NONE;
        return DRAGARC_OK;
    }
    for (int k = 0; k < 4; k++)
        if (strcmp(name, NAMES[k]) == 0) {
            *out = (dragarc_dv_distribution)k;
            return DRAGARC_OK;
        }
    return DRAGARC_EINVAL;
}

int dragarc_fragment_class_check(const dragarc_fragment_class *c, dragarc_error *err)
{
    if (!(c->count > 0.0 && c->count <= 1e9))
        return dragarc_error_set(err, DRAGARC_EINVAL, "count", "must be above 0 and at most 1e9 (got %g)", c->count);
    if (!(c->mass > 0.0 && c->mass <= 1e6))
        return dragarc_error_set(err, DRAGARC_EINVAL, "mass", "must be above 0 and at most 1e6 kg (got %g)", c->mass);
    if (!(c->area > 0.0 && c->area <= 1e4))
        return dragarc_error_set(err, DRAGARC_EINVAL, "area", "must be above 0 and at most 10000 m^2 (got %g)",
                                 c->area);
    if (!(c->beta_sd >= 0.0 && c->beta_sd <= 3.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "beta_spread", "must be 0 to 3 (the sd of ln beta; got %g)",
                                 c->beta_sd);
    if (!(c->dv_speed >= 0.0 && c->dv_speed <= 1e4))
        return dragarc_error_set(err, DRAGARC_EINVAL, "delta_v.speed", "must be 0 to 10000 m/s (got %g)",
                                 c->dv_speed);
    if (!(c->cone_half_angle > 0.0 && c->cone_half_angle <= DRAGARC_PI + 1e-12))
        return dragarc_error_set(err, DRAGARC_EINVAL, "delta_v.cone", "must be above 0 and at most 180 degrees (got %g)",
                                 c->cone_half_angle / DRAGARC_DEG);
    if (c->cone_axis_given && !(fabs(hypot(hypot(c->cone_axis[0], c->cone_axis[1]), c->cone_axis[2]) - 1.0) < 1e-9))
        return dragarc_error_set(err, DRAGARC_EINVAL, "delta_v.axis", "must be a unit vector");
    int rc = dragarc_drag_check(&c->drag, err);
    if (rc != DRAGARC_OK)
        dragarc_error_prefix(err, "drag");
    return rc;
}

int dragarc_footprint_check(const dragarc_footprint_spec *spec, dragarc_error *err)
{
    const dragarc_breakup *b = &spec->breakup;
    if (!(b->latitude >= -90.0 && b->latitude <= 90.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.latitude", "must be between -90 and 90 degrees (got %g)",
                                 b->latitude);
    if (!(b->longitude >= -180.0 && b->longitude <= 360.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.longitude",
                                 "must be between -180 and 360 degrees (got %g)", b->longitude);
    if (!(b->altitude > spec->base.ground_elevation && b->altitude <= 86000.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.altitude",
                                 "must be above the ground (at %g m) and at most 86 km, the top of the standard "
                                 "atmosphere (got %g m)", spec->base.ground_elevation, b->altitude);
    for (int i = 0; i < 3; i++)
        if (!(isfinite(b->velocity[i]) && fabs(b->velocity[i]) <= 2e4))
            return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.velocity", "components must be finite and at most "
                                     "20 km/s (got %g m/s)", b->velocity[i]);
    for (int i = 0; i < 3; i++)
        if (!(b->sd_position[i] >= 0.0 && b->sd_position[i] <= 1e5))
            return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.spread.position", "must be 0 to 100 km (got %g m)",
                                     b->sd_position[i]);
    if (!(b->sd_speed >= 0.0 && b->sd_speed <= 1e4))
        return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.spread.speed", "must be 0 to 10000 m/s (got %g)",
                                 b->sd_speed);
    if (!(b->sd_path_angle >= 0.0 && b->sd_path_angle <= DRAGARC_PI / 2.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.spread.flight_path_angle",
                                 "must be 0 to 90 degrees (got %g)", b->sd_path_angle / DRAGARC_DEG);
    if (!(b->sd_heading >= 0.0 && b->sd_heading <= DRAGARC_PI))
        return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.spread.heading", "must be 0 to 180 degrees (got %g)",
                                 b->sd_heading / DRAGARC_DEG);
    if (b->covariance_given)
        for (int i = 0; i < 6; i++)
            for (int j = 0; j < 6; j++) {
                double c = b->covariance[6 * i + j];
                if (!isfinite(c) || c != b->covariance[6 * j + i] || (i == j && c < 0.0))
                    return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.covariance",
                                             "must be a symmetric 6 x 6 matrix of finite numbers with a non-negative "
                                             "diagonal (row %d, column %d: %g)", i + 1, j + 1, c);
            }
    if (spec->nclasses < 1 || spec->nclasses > DRAGARC_FOOTPRINT_MAX_CLASSES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "fragments", "must hold 1 to %d classes (got %zu)",
                                 DRAGARC_FOOTPRINT_MAX_CLASSES, spec->nclasses);
    for (size_t i = 0; i < spec->nclasses; i++) {
        int rc = dragarc_fragment_class_check(&spec->classes[i], err);
        if (rc != DRAGARC_OK) {
            char f[48];
            snprintf(f, sizeof f, "fragments[%zu]", i);
            dragarc_error_prefix(err, f);
            return rc;
        }
    }
    if (spec->samples < 1 || spec->samples > DRAGARC_FOOTPRINT_MAX_SAMPLES)
        return dragarc_error_set(err, DRAGARC_EINVAL, "footprint.samples", "must be 1 to %d per class (got %zu)",
                                 DRAGARC_FOOTPRINT_MAX_SAMPLES, spec->samples);
    if ((double)spec->samples * (double)spec->nclasses > DRAGARC_FOOTPRINT_MAX_FLIGHTS)
        return dragarc_error_set(err, DRAGARC_EINVAL, "footprint.samples",
                                 "%zu samples of %zu classes is more than %d flights", spec->samples, spec->nclasses,
                                 DRAGARC_FOOTPRINT_MAX_FLIGHTS);
    const dragarc_wind_spread *w = &spec->wind_spread;
    if (!(w->speed_sd >= 0.0 && w->speed_sd <= 2.0))
        return dragarc_error_set(err, DRAGARC_EINVAL, "uncertainty.wind.speed", "must be 0 to 2 (a fraction; got %g)",
                                 w->speed_sd);
    if (!(w->direction_sd >= 0.0 && w->direction_sd <= DRAGARC_PI))
        return dragarc_error_set(err, DRAGARC_EINVAL, "uncertainty.wind.direction",
                                 "must be 0 to 180 degrees (got %g)", w->direction_sd / DRAGARC_DEG);
    return DRAGARC_OK;
}

double dragarc_footprint_memory_estimate(const dragarc_footprint_spec *spec)
{
    const double flights = (double)spec->samples * (double)spec->nclasses;
    const double per_flight = sizeof(dragarc_impact) + 6.0 * sizeof(double) + sizeof(dragarc_impact_point) +
                              sizeof(double) + 4.0 * sizeof(double) + sizeof(size_t);
    /* the automatic cell is at least 1/1000 of the longer side, plus one empty cell each side and the rounding */
    const double cells = spec->cell > 0.0 ? (double)DRAGARC_SCATTER_GRID_MAX_CELLS : 1003.0 * 1003.0;
    return flights * per_flight + ((double)spec->nclasses + 1.0) * sizeof(dragarc_footprint_group) +
           dragarc_scatter_grid_memory((size_t)cells);
}

/* A unit vector in the cone of half-angle th about the unit axis a, from two uniforms: cos of the angle from the
 * axis uniform on [cos th, 1] (uniform over the cap's area) and the turn about it uniform on [0, 2 pi). */
static void cone_direction(const double a[3], double th, double u1, double u2, double out[3])
{
    double c = 1.0 - u1 * (1.0 - cos(th)), s = sqrt(fmax(0.0, 1.0 - c * c)), ph = 2.0 * DRAGARC_PI * u2;
    /* two unit vectors across the axis */
    double p[3] = {0.0, 0.0, 0.0};
    int k = fabs(a[0]) < 0.6 ? 0 : fabs(a[1]) < 0.6 ? 1 : 2;
    p[k] = 1.0;
    double d = p[0] * a[0] + p[1] * a[1] + p[2] * a[2];
    for (int i = 0; i < 3; i++)
        p[i] -= d * a[i];
    double n = sqrt(p[0] * p[0] + p[1] * p[1] + p[2] * p[2]);
    for (int i = 0; i < 3; i++)
        p[i] /= n;
    double q[3] = {a[1] * p[2] - a[2] * p[1], a[2] * p[0] - a[0] * p[2], a[0] * p[1] - a[1] * p[0]};
    for (int i = 0; i < 3; i++)
        out[i] = c * a[i] + s * (cos(ph) * p[i] + sin(ph) * q[i]);
}

typedef struct run_ctx {
    const dragarc_footprint_spec *spec;
    double factor[36]; /* V sqrt(Lambda) of the breakup covariance */
} run_ctx;

static void fly_sample(const run_ctx *ctx, gsl_rng *r, uint32_t ci, uint32_t si, dragarc_impact *o)
{
    const dragarc_footprint_spec *spec = ctx->spec;
    const dragarc_breakup *b = &spec->breakup;
    const dragarc_fragment_class *c = &spec->classes[ci];
    gsl_rng_set(r, (unsigned long)(dragarc_footprint_stream_seed(spec->seed, ci, si) & 0xffffffffUL));
    double z[6], u[3], zn[3], zb, zw[2], uw;
    for (int i = 0; i < 6; i++)
        z[i] = gsl_ran_gaussian_ziggurat(r, 1.0);
    zb = gsl_ran_gaussian_ziggurat(r, 1.0);
    u[0] = gsl_rng_uniform(r);
    for (int i = 0; i < 3; i++)
        zn[i] = gsl_ran_gaussian_ziggurat(r, 1.0);
    u[1] = gsl_rng_uniform(r), u[2] = gsl_rng_uniform(r);
    zw[0] = gsl_ran_gaussian_ziggurat(r, 1.0), zw[1] = gsl_ran_gaussian_ziggurat(r, 1.0);
    uw = gsl_rng_uniform(r);

    /* the breakup state */
    double pos[3] = {0.0, 0.0, b->altitude}, vel[3] = {b->velocity[0], b->velocity[1], b->velocity[2]};
    if (b->covariance_given) {
        for (int i = 0; i < 6; i++) {
            double x = 0.0;
            for (int j = 0; j < 6; j++)
                x += ctx->factor[6 * i + j] * z[j];
            if (i < 3)
                pos[i] += x;
            else
                vel[i - 3] += x;
        }
    } else {
        for (int i = 0; i < 3; i++)
            pos[i] += b->sd_position[i] * z[i];
        double vh = hypot(vel[0], vel[1]), v = hypot(vh, vel[2]);
        double gam = atan2(vel[2], vh) + b->sd_path_angle * z[4], psi = atan2(vel[0], vel[1]) + b->sd_heading * z[5];
        v = fmax(0.0, v + b->sd_speed * z[3]);
        vel[0] = v * cos(gam) * sin(psi), vel[1] = v * cos(gam) * cos(psi), vel[2] = v * sin(gam);
    }
    /* the velocity the breakup imparts */
    double mag = 0.0;
    switch (c->dv) {
    case DRAGARC_DV_NONE:
        break;
    case DRAGARC_DV_FIXED:
        mag = c->dv_speed;
        break;
    case DRAGARC_DV_UNIFORM:
        mag = c->dv_speed * u[0];
        break;
    case DRAGARC_DV_MAXWELLIAN:
        mag = c->dv_speed * sqrt(zn[0] * zn[0] + zn[1] * zn[1] + zn[2] * zn[2]);
        break;
    }
    if (mag > 0.0) {
        double axis[3] = {0.0, 0.0, 1.0}, dir[3];
        double vn = sqrt(b->velocity[0] * b->velocity[0] + b->velocity[1] * b->velocity[1] + b->velocity[2] * b->velocity[2]);
        if (c->cone_axis_given)
            memcpy(axis, c->cone_axis, sizeof axis);
        else if (vn > 0.0)
            for (int i = 0; i < 3; i++)
                axis[i] = b->velocity[i] / vn;
        cone_direction(axis, c->cone_half_angle, u[1], u[2], dir);
        for (int i = 0; i < 3; i++)
            vel[i] += mag * dir[i];
    }
    /* the fragment and its flight */
    dragarc_scenario s = spec->base; /* shallow: tables and wind rows are only read */
    double area = c->area * exp(-c->beta_sd * zb);
    s.projectile.mass = c->mass;
    s.projectile.area = area;
    s.projectile.diameter = sqrt(4.0 * area / DRAGARC_PI);
    s.projectile.volume = 0.0;
    s.projectile.density = 0.0;
    s.projectile.drag = c->drag;
    o->beta = c->mass / (dragarc_fragment_nominal_cd(&c->drag) * area);
    o->area = area;
    const dragarc_wind_spread *ws = &spec->wind_spread;
    const dragarc_wind *wsrc = &spec->base.wind;
    if (ws->nprofiles > 0)
        wsrc = &ws->profiles[(size_t)fmin((double)ws->nprofiles - 1, floor(uw * (double)ws->nprofiles))];
    s.wind = *wsrc;
    double scale = fmax(0.0, 1.0 + ws->speed_sd * zw[0]), turn = ws->direction_sd * zw[1];
    dragarc_wind_layer small[64], *rows = NULL;
    if (s.wind.model == DRAGARC_WIND_LAYERED && (scale != 1.0 || turn != 0.0)) {
        rows = s.wind.nlayers <= 64 ? small : malloc(s.wind.nlayers * sizeof *rows);
        if (!rows) {
            o->status = DRAGARC_ENOMEM;
            return;
        }
        for (size_t k = 0; k < s.wind.nlayers; k++) {
            rows[k] = wsrc->layers[k];
            rows[k].speed *= scale;
            rows[k].from += turn;
        }
        s.wind.layers = rows;
    } else {
        s.wind.speed *= scale;
        s.wind.from += turn;
    }
    double vh = hypot(vel[0], vel[1]);
    s.launch.speed = hypot(vh, vel[2]);
    s.launch.elevation = atan2(vel[2], vh);
    s.launch.azimuth = vh > 0.0 ? atan2(vel[0], vel[1]) : 0.0;
    s.launch.height = pos[2];
    s.launch.spin_rate = 0.0;
    if (!(s.launch.height > s.ground_elevation)) {
        o->status = DRAGARC_EINVAL; /* a breakup drawn below the ground */
    } else {
        dragarc_flight f;
        dragarc_error e;
        o->status = dragarc_flight_run(&s, 0.0, &f, &e);
        if (o->status == DRAGARC_OK) {
            o->east = pos[0] + f.impact[0];
            o->north = pos[1] + f.impact[1];
            o->time = f.time_of_flight;
            o->speed = f.impact_speed;
            o->angle = f.impact_angle;
            o->energy = f.impact_energy;
        }
        dragarc_flight_clear(&f);
    }
    if (rows && rows != small)
        free(rows);
}

int dragarc_footprint_run(const dragarc_footprint_spec *spec, dragarc_impact *out,
                          void (*progress)(size_t done, size_t total, void *user), void *user, dragarc_error *err)
{
    return dragarc_footprint_run_range(spec, 0, spec->nclasses * spec->samples, 1, out, progress, user, err);
}

int dragarc_footprint_run_range(const dragarc_footprint_spec *spec, size_t k0, size_t k1, size_t step,
                                dragarc_impact *out, void (*progress)(size_t done, size_t total, void *user),
                                void *user, dragarc_error *err)
{
    int rc = dragarc_footprint_check(spec, err);
    if (rc != DRAGARC_OK)
        return rc;
    if (!(k0 <= k1 && k1 <= spec->nclasses * spec->samples && step >= 1))
        return dragarc_error_set(err, DRAGARC_EINVAL, "", "flights %zu to %zu by %zu are not within the run's %zu", k0,
                                 k1, step, spec->nclasses * spec->samples);
    run_ctx ctx = {spec, {0}};
    if (spec->breakup.covariance_given) {
        gsl_matrix *m = gsl_matrix_alloc(6, 6), *v = gsl_matrix_alloc(6, 6);
        gsl_vector *l = gsl_vector_alloc(6);
        gsl_eigen_symmv_workspace *w = gsl_eigen_symmv_alloc(6);
        if (!m || !v || !l || !w) {
            gsl_matrix_free(m), gsl_matrix_free(v), gsl_vector_free(l), gsl_eigen_symmv_free(w);
            return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the breakup covariance");
        }
        for (int i = 0; i < 36; i++)
            m->data[(i / 6) * m->tda + i % 6] = spec->breakup.covariance[i];
        int st = gsl_eigen_symmv(m, l, v, w);
        double lmax = 0.0;
        for (int j = 0; j < 6; j++)
            lmax = fmax(lmax, gsl_vector_get(l, j));
        for (int j = 0; j < 6 && st == 0; j++)
            if (gsl_vector_get(l, j) < -1e-9 * lmax)
                st = -1;
        for (int i = 0; i < 6; i++)
            for (int j = 0; j < 6; j++)
                ctx.factor[6 * i + j] = gsl_matrix_get(v, i, j) * sqrt(fmax(0.0, gsl_vector_get(l, j)));
        gsl_matrix_free(m), gsl_matrix_free(v), gsl_vector_free(l), gsl_eigen_symmv_free(w);
        if (st != 0)
            return dragarc_error_set(err, DRAGARC_EINVAL, "breakup.covariance",
                                     "is not positive semi-definite (an eigenvalue below zero)");
    }
    const size_t count = (k1 - k0 + step - 1) / step;
    progress_count prog = progress_start(progress, user, count, 64);
    int nomem = 0;
#pragma omp parallel default(none) shared(ctx, out, spec, k0, step, count, prog, nomem, gsl_rng_mt19937)
    {
        gsl_rng *r = gsl_rng_alloc(gsl_rng_mt19937);
        if (!r) {
#pragma omp atomic write
            nomem = 1;
        }
#pragma omp for schedule(dynamic, 8)
        for (size_t i = 0; i < count; i++) {
            /* the global index k names the sample, and so its stream: the flight is the same in any range */
            const size_t k = k0 + i * step;
            dragarc_impact *o = &out[i];
            memset(o, 0, sizeof *o);
            o->cls = (uint32_t)(k / spec->samples), o->sample = (uint32_t)(k % spec->samples);
            o->weight = spec->classes[o->cls].count / (double)spec->samples;
            if (!r) {
                o->status = DRAGARC_ENOMEM;
                continue;
            }
            fly_sample(&ctx, r, o->cls, o->sample, o);
            progress_step(&prog);
        }
        gsl_rng_free(r);
    }
    if (nomem)
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory for the random number generators");
    return DRAGARC_OK;
}
