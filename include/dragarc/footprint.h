/* footprint.h: where the pieces of a vehicle that breaks up in flight come down: Monte Carlo impact points.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A breakup happens above a point on the ground (latitude, longitude) at an altitude, with a velocity. Each
 * fragment class (count, mass, reference area or ballistic coefficient beta = m / (C_D A), a drag law) is flown
 * `samples` times from a breakup state drawn about the nominal one, with its own beta drawn about the nominal
 * (log-normal), plus the velocity the breakup imparts (Delta V: fixed, uniform or Maxwellian in magnitude,
 * isotropic or in a cone in direction), through a wind drawn about the nominal profile (a speed scale and a
 * turn) or picked from a set of profiles. Frame: the flight's local one, x east and y north of the point below
 * the breakup, z up, over the scenario's Earth (earth.h: flat by default, or a sphere turning about the breakup's
 * latitude; docs/footprint.md says when each is adequate).
 *
 * Random numbers: each sample has its own stream, a GSL MT19937 generator seeded from the run's seed, the class
 * and the sample index (SplitMix64 mixing, 32 bits used by the generator), and draws the same numbers in the same
 * order whatever it needs; so a sample's flight depends on nothing but those three, and the result is the same
 * bit for bit for any number of threads.
 */
#ifndef DRAGARC_FOOTPRINT_H
#define DRAGARC_FOOTPRINT_H

#include <stddef.h>
#include <stdint.h>

#include "dragarc/casualty.h"
#include "dragarc/drag.h"
#include "dragarc/dragarc.h"
#include "dragarc/population.h"
#include "dragarc/scatter.h"
#include "dragarc/scenario.h"
#include "dragarc/wind.h"

#ifdef __cplusplus
extern "C" {
#endif

#define DRAGARC_FOOTPRINT_MAX_CLASSES 100000
#define DRAGARC_FOOTPRINT_MAX_SAMPLES 10000000 /* per class */
#define DRAGARC_FOOTPRINT_MAX_FLIGHTS 20000000 /* classes x samples */

typedef enum dragarc_dv_distribution {
    DRAGARC_DV_NONE = 0,   /* no velocity from the breakup */
    DRAGARC_DV_FIXED,      /* |Delta V| = speed */
    DRAGARC_DV_UNIFORM,    /* |Delta V| uniform on [0, speed] */
    DRAGARC_DV_MAXWELLIAN  /* each component normal with sd = speed: |Delta V| Maxwell-distributed, mean 2 a sqrt(2/pi) */
} dragarc_dv_distribution;

typedef struct dragarc_fragment_class {
    char name[64];
    double count;            /* real fragments of this class (> 0; a whole number in practice) */
    double mass;             /* kg */
    double area;             /* m^2, the reference area of the drag law (from beta when beta was given) */
    dragarc_drag drag;       /* owned: a constant C_D or a table against Mach number (or any drag.h law) */
    double beta_sd;          /* sd of ln beta: the log-normal spread of the ballistic coefficient; 0: none */
    dragarc_dv_distribution dv;
    double dv_speed;         /* m/s: the fixed magnitude, the uniform maximum, or the Maxwellian sd per component */
    double cone_half_angle;  /* rad, (0, pi]: pi is isotropic */
    int cone_axis_given;     /* 0: the cone is about the breakup velocity */
    double cone_axis[3];     /* unit vector east, north, up */
} dragarc_fragment_class;

typedef struct dragarc_breakup {
    double latitude, longitude; /* deg, of the point on the ground below the breakup (the frame's origin) */
    double altitude;            /* m above the site datum */
    double velocity[3];         /* m/s, east, north, up */
    /* spreads (1 sd), used when covariance_given is 0 */
    double sd_position[3];      /* m east, north, up */
    double sd_speed;            /* m/s */
    double sd_path_angle;       /* rad, of the flight-path angle */
    double sd_heading;          /* rad */
    int covariance_given;
    double covariance[36];      /* 6 x 6, row-major, of (east, north, up, v_east, v_north, v_up), SI */
} dragarc_breakup;

typedef struct dragarc_wind_spread {
    double speed_sd;            /* sd of a factor 1 + z sd on every speed of the profile (0: none) */
    double direction_sd;        /* rad, sd of a turn of the whole profile */
    size_t nprofiles;           /* > 0: each sample picks one of these at random instead of the nominal */
    dragarc_wind *profiles;     /* owned */
} dragarc_wind_spread;

/* What the scenario's `hazard` object asks (docs/footprint.md); the casualty model is casualty.h's. */
typedef struct dragarc_hazard_options {
    double energy_threshold;    /* J: fragments landing with less are not counted as hazardous */
    int population_given;       /* 0: no casualty expectation */
    double density;             /* people per km^2, uniform (when no file) */
    char population_file[1024]; /* a CSV grid of people per km^2 (resolved against the scenario's folder), or "" */
    double background;          /* people per km^2 outside the file's grid */
    double sheltered_share;     /* 0 to 1 */
    double shelter_protection;  /* 0 to 1 */
    double criterion;           /* the user's E_c criterion to compare with; 0: none */
} dragarc_hazard_options;

typedef struct dragarc_footprint_spec {
    dragarc_scenario base;      /* environment, ground and solver; the projectile and launch are set per sample */
    dragarc_breakup breakup;
    size_t nclasses;
    dragarc_fragment_class *classes; /* owned */
    dragarc_wind_spread wind_spread;
    size_t samples;             /* per class */
    uint64_t seed;
    double cell;                /* m, the density grid's cell; 0: chosen from the scatter */
    dragarc_hazard_options hazard;
} dragarc_footprint_spec;

/* One Monte Carlo flight. */
typedef struct dragarc_impact {
    uint32_t cls;               /* class index */
    uint32_t sample;            /* sample index within the class */
    int status;                 /* DRAGARC_OK, DRAGARC_ENOLAND (still aloft at solver.max_time) or another error */
    double weight;              /* real fragments this sample stands for: count / samples */
    double east, north;         /* m, impact point in the frame (breakup position offset included) */
    double time;                /* s after the breakup */
    double speed;               /* m/s, ground-relative, at impact */
    double angle;               /* rad below horizontal */
    double energy;              /* J, 1/2 m v^2 */
    double beta;                /* kg/m^2, this sample's ballistic coefficient (C_D at Mach 0.5) */
    double area;                /* m^2, this sample's reference area (the class's, scaled by the beta draw) */
} dragarc_impact;

/* The distribution named "none", "fixed", "uniform" or "maxwellian" ("" is none); DRAGARC_EINVAL otherwise. */
int dragarc_dv_distribution_from_name(const char *name, dragarc_dv_distribution *out);

/* Check one fragment class; err->field relative to it ("mass", "drag.cd"). */
int dragarc_fragment_class_check(const dragarc_fragment_class *c, dragarc_error *err);

/* A named drag law that catalogue rows may refer to (the scenario's `drag_laws`). */
typedef struct dragarc_named_drag {
    char name[64];
    dragarc_drag drag; /* borrowed */
} dragarc_named_drag;

/* A fragment catalogue as CSV (docs/footprint.md): a header naming mass, drag and one of area or
 * ballistic_coefficient, and optionally name, count, beta_spread, dv_distribution, dv_speed, cone (degrees); one
 * class a row, at most DRAGARC_FOOTPRINT_MAX_CLASSES. `drag` is a number (a constant C_D) or the name of one of
 * the laws[0..nlaws). The text is modified in place. On success *classes (n of them; the caller frees each
 * class's drag with dragarc_drag_clear, then the array) is filled; errors name "line N: column". */
int dragarc_fragment_catalogue_parse(char *text, const dragarc_named_drag *laws, size_t nlaws,
                                     dragarc_fragment_class **classes, size_t *n, dragarc_error *err);

/* Check the spec (the base scenario, breakup, classes, spreads, sample counts); err->field is its path in the
 * scenario file ("breakup.altitude", "fragments[2].mass"). */
int dragarc_footprint_check(const dragarc_footprint_spec *spec, dragarc_error *err);

/* The most memory (bytes) a run of spec takes, from the sizes of its arrays (pure arithmetic): per flight the
 * dragarc_impact, the summary's columns (six doubles, a dragarc_impact_point and a casualty contribution) and the
 * weighted quantiles' sort buffers (four doubles and an index); per class a dragarc_footprint_group; and the
 * density grid at its largest (about 1003 x 1003 cells with the automatic cell, DRAGARC_SCATTER_GRID_MAX_CELLS with
 * a given one). A population file adds its grid (8 bytes a cell), not counted here. */
double dragarc_footprint_memory_estimate(const dragarc_footprint_spec *spec);

/* Fly every sample of every class into out (nclasses x samples entries, class-major; the caller allocates).
 * Runs in parallel with OpenMP; the result does not depend on the thread count. A failed flight is recorded in
 * its entry's status and does not stop the run. `progress`, when not NULL, is called every 64 flights and at the
 * last, on one thread at a time, with the flights done (rising) and the total (for a progress bar); it must not call
 * into dragarc. */
int dragarc_footprint_run(const dragarc_footprint_spec *spec, dragarc_impact *out,
                          void (*progress)(size_t done, size_t total, void *user), void *user, dragarc_error *err);

/* Fly the flights of global indices k0, k0 + step, k0 + 2 step, ... below k1 (index k = class x samples + sample,
 * the order of dragarc_footprint_run's out) into out[0], out[1], ... ((k1 - k0 + step - 1) / step of them; the
 * caller allocates). Each flight's random stream comes from its own (class, sample), so out[i] is bit for bit the
 * entry k0 + i step of the whole run: parts flown apart (by other processes, on other machines) and put back at
 * their indices make exactly the whole run's array. dragarc_footprint_run is the range [0, nclasses x samples) with
 * step 1; MPI processes take every P-th flight (docs/cluster.md). `progress` counts the flights of this range.
 * DRAGARC_EINVAL when k0 > k1, k1 is past the run's flights or step is 0. */
int dragarc_footprint_run_range(const dragarc_footprint_spec *spec, size_t k0, size_t k1, size_t step,
                                dragarc_impact *out, void (*progress)(size_t done, size_t total, void *user),
                                void *user, dragarc_error *err);

/* The nominal C_D of a drag law, the one a ballistic coefficient refers to: at Mach 0.5, Re 1e6 (170 m/s for a
 * table against speed). */
double dragarc_fragment_nominal_cd(const dragarc_drag *drag);

/* The ballistic coefficient m / (C_D A) of a class, C_D the nominal one. */
double dragarc_fragment_beta(const dragarc_fragment_class *c);

/* The stream seed of one sample (SplitMix64 of the run seed, class and sample; Steele, Lea & Flood 2014). */
uint64_t dragarc_footprint_stream_seed(uint64_t seed, uint32_t cls, uint32_t sample);

/* ---- the summary --------------------------------------------------------------------------------------- */

/* Probabilities of the downrange and crossrange quantiles: the central 90 %, 99 % and 99.9 % and the median. */
#define DRAGARC_FOOTPRINT_NQ 7
extern const double dragarc_footprint_quantile_probs[DRAGARC_FOOTPRINT_NQ]; /* 0.0005, 0.005, 0.05, 0.5, ... */
/* Probabilities of the impact speed and energy quantiles. */
#define DRAGARC_FOOTPRINT_NVQ 4
extern const double dragarc_footprint_value_probs[DRAGARC_FOOTPRINT_NVQ]; /* 0.05, 0.5, 0.95, 0.99 */
/* The contours: the highest-density regions holding these shares of the fragments. */
#define DRAGARC_FOOTPRINT_NREGIONS 3
extern const double dragarc_footprint_region_probs[DRAGARC_FOOTPRINT_NREGIONS]; /* 0.9, 0.99, 0.999 */

/* One fragment class, or all of them together. Statistics are weighted by the real fragments each sample stands
 * for and taken over the flights that landed. */
typedef struct dragarc_footprint_group {
    size_t flights, landed;      /* samples flown, and landed (the rest failed or stayed aloft) */
    double fragments;            /* real fragments landed (sum of weights) */
    int moments_ok;              /* mean and covariance computed (needs a total weight above 1) */
    double mean[2], cov[3];      /* m, m^2: east, north; ee, en, nn */
    int ellipses_ok;             /* 0 when the covariance is singular (points on a line or at one place) */
    dragarc_scatter_ellipse ellipse[3]; /* 1, 2 and 3 sigma */
    double inside[3];            /* the weighted share of the impacts inside each ellipse */
    double down[DRAGARC_FOOTPRINT_NQ], cross[DRAGARC_FOOTPRINT_NQ]; /* m, along the breakup heading and right of it */
    double speed_median, speed_max;   /* m/s */
    double speed_q[DRAGARC_FOOTPRINT_NVQ], energy_q[DRAGARC_FOOTPRINT_NVQ]; /* m/s, J: weighted quantiles */
    double energy_mean, energy_median, energy_max; /* J */
    double time_median;          /* s */
    double hazardous_share;      /* of the landed fragments, at or above the hazard energy */
    double expected_casualties;  /* E_c of this class (0 without a population) */
} dragarc_footprint_group;

typedef struct dragarc_footprint_summary {
    double azimuth;              /* rad, downrange: the breakup heading (north when it falls straight down) */
    size_t ngroups;              /* classes + 1: the last is all fragments together */
    dragarc_footprint_group *groups; /* owned */
    int grid_ok;
    dragarc_scatter_grid grid;   /* fragments per km^2, all classes */
    dragarc_scatter_region region[DRAGARC_FOOTPRINT_NREGIONS];
    int casualty_done;
    dragarc_casualty_result casualty; /* over all classes */
    char note[256];              /* why something was left out (a singular covariance, too few landings), or "" */
} dragarc_footprint_summary;

/* Summarise the impacts (nclasses x samples, from dragarc_footprint_run). pop may be NULL: no E_c. The person is
 * the default of casualty.h. Fills *out (free with dragarc_footprint_summary_clear, also after failure). */
int dragarc_footprint_summarise(const dragarc_footprint_spec *spec, const dragarc_impact *impacts,
                                const dragarc_population *pop, dragarc_footprint_summary *out, dragarc_error *err);
void dragarc_footprint_summary_clear(dragarc_footprint_summary *s);

void dragarc_footprint_spec_clear(dragarc_footprint_spec *spec);

/* A footprint scenario file (docs/footprint.md; src/io/scenario_json.c). */
int dragarc_footprint_spec_read(const char *path, dragarc_footprint_spec *out, dragarc_error *err);
int dragarc_footprint_spec_parse(const char *json, dragarc_footprint_spec *out, dragarc_error *err);
/* dragarc_footprint_spec_read of the file at path changed first by `patch`, a JSON object applied as a JSON Merge
 * Patch (RFC 7386: members replace the scenario's, objects merge member by member, null removes a member), e.g.
 * {"breakup": {"altitude": "12 km", "speed": 480}}; NULL changes nothing. File names in the scenario still resolve
 * against its folder. Errors as dragarc_footprint_spec_read, their fields those of the changed scenario. */
int dragarc_footprint_spec_read_patched(const char *path, const char *patch, dragarc_footprint_spec *out,
                                        dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
