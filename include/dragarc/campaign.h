/* campaign.h: many footprint cases run as one job, e.g. the breakups of a vehicle at times along its trajectory, with
 * one report of them all.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A campaign file (JSON, docs/cluster.md) lists cases; each is a footprint scenario file (footprint.h) with changes
 * applied as a JSON Merge Patch (RFC 7386: typically the breakup state at one time), its own samples and seed if
 * wished, and a folder for its outputs. This header reads the file and makes the combined report (a JSON document
 * and a CSV table, one row per case); flying the cases is dragarc_footprint_run's, case by case.
 */
#ifndef DRAGARC_CAMPAIGN_H
#define DRAGARC_CAMPAIGN_H

#include <stddef.h>
#include <stdint.h>
#include <stdio.h>

#include "dragarc/dragarc.h"
#include "dragarc/footprint.h"

#ifdef __cplusplus
extern "C" {
#endif

#define DRAGARC_CAMPAIGN_MAX_CASES 10000

/* The files each case writes besides its summary.json (the `outputs` list). */
enum {
    DRAGARC_CAMPAIGN_POINTS = 1u << 0,  /* points.csv: every sample's impact */
    DRAGARC_CAMPAIGN_GRID = 1u << 1,    /* grid.csv: the density of impacts */
    DRAGARC_CAMPAIGN_GEOJSON = 1u << 2, /* footprint.geojson */
    DRAGARC_CAMPAIGN_PLOT = 1u << 3     /* footprint.svg, .png or .pdf; and the campaign's map, campaign.svg, ... */
};

typedef struct dragarc_campaign_case {
    char name[128];
    char scenario[4096]; /* the footprint scenario file, resolved against the campaign file's folder */
    char *patch;         /* owned: the `set` object as JSON text (a merge patch over the scenario), or NULL */
    double samples;      /* per class; 0: the campaign's, else the scenario's */
    double seed;         /* -1: the campaign's, else the scenario's */
    char folder[128];    /* the case's output folder inside the campaign's (a plain name) */
} dragarc_campaign_case;

typedef struct dragarc_campaign {
    char name[128];
    size_t ncases;
    dragarc_campaign_case *cases; /* owned */
    unsigned outputs;             /* DRAGARC_CAMPAIGN_* */
    char plot_format[8];          /* "svg" (default), "png" or "pdf" */
} dragarc_campaign;

/* Read a campaign file (at most DRAGARC_CAMPAIGN_MAX_CASES cases). Checks its own keys, names and folders (plain
 * names, distinct); the cases' scenarios are read later (dragarc_footprint_spec_read_patched). Errors name the field
 * ("cases[2].folder"). Fills *out (free with dragarc_campaign_clear, also after failure). */
int dragarc_campaign_read(const char *path, dragarc_campaign *out, dragarc_error *err);
int dragarc_campaign_parse(const char *json, const char *base_dir, dragarc_campaign *out, dragarc_error *err);
void dragarc_campaign_clear(dragarc_campaign *c);

/* One case's line of the combined report, from its run's summary. */
typedef struct dragarc_campaign_row {
    char name[128], folder[128];
    double latitude, longitude, altitude; /* deg, deg, m: the breakup */
    double speed;                         /* m/s, of the breakup */
    size_t samples;
    uint64_t seed;
    size_t flights, landed;
    double fragments;                     /* real fragments landed */
    int mean_ok;
    double mean_east, mean_north;         /* m from the point below the breakup */
    double mean_latitude, mean_longitude; /* deg */
    int ellipse_ok;
    double semi_major, semi_minor;        /* m, the 1 sigma ellipse */
    double azimuth;                       /* rad, of its major axis, clockwise from north */
    double hazardous_share;               /* of the landed fragments, at or above the hazard energy */
    double energy_max;                    /* J */
    int casualty_done;
    double expected_casualties;           /* E_c */
    double criterion;                     /* the user's E_c criterion; 0: none */
    char note[256];
} dragarc_campaign_row;

/* Fill *row from the case, its spec and its run's summary. */
void dragarc_campaign_row_fill(dragarc_campaign_row *row, const dragarc_campaign_case *c,
                               const dragarc_footprint_spec *spec, const dragarc_footprint_summary *s);

/* The combined report as one JSON document: the campaign, one object per case, the published criteria (as
 * references), the units and the debris cautions. Caller frees with free(); NULL when out of memory. */
char *dragarc_campaign_json(const dragarc_campaign *c, const dragarc_campaign_row *rows, size_t n);

/* The combined report as CSV, one row per case (columns in docs/cluster.md; numbers with 17 significant digits,
 * empty where a value is not known). DRAGARC_EIO when the write fails. */
int dragarc_campaign_write_csv(FILE *fp, const dragarc_campaign_row *rows, size_t n, dragarc_error *err);

/* The campaign's map into path (.svg, .png or .pdf; src/io/campaign_plot.c): every case's breakup point, mean impact
 * and 1 sigma ellipse, in km east and north of the first case's breakup point (each case named in the legend when
 * there are at most 8). Errors as dragarc_plot_write, DRAGARC_ENOMEM. */
int dragarc_campaign_plot(const char *path, const dragarc_campaign *c, const dragarc_campaign_row *rows, size_t n,
                          dragarc_error *err);

#ifdef __cplusplus
}
#endif
#endif
