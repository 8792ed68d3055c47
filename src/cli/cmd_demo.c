/* cmd_demo.c: `dragarc demo`: built-in scenarios of our own invention, one for each kind of user, one ball driven
 * at two invented venues, and a fit to an invented track, flown and explained. The numbers are illustrative, not
 * measurements of any real product.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "cli/cli.h"
#include "dragarc/aim.h"
#include "dragarc/cautions.h"
#include "dragarc/drift.h"
#include "dragarc/fit.h"
#include "dragarc/footprint.h"
#include "dragarc/sprinkler.h"
#include "dragarc/output.h"
#include "dragarc/plot.h"
#include "dragarc/report.h"
#include "dragarc/sweep.h"
#include "demo_examples.h" /* DEMO_LAUNCHER_BALL_JSON and _TRACK: docs/examples' files, built in (CMakeLists.txt) */

static const char HELP[] =
    "usage: dragarc demo [--out FOLDER | --no-files]\n"
    "\n"
    "Fly built-in example scenarios (a practice ball in a breeze, a sprinkler droplet, a fragment shed at\n"
    "3 km, one spinning ball driven at two venues, a garden sprinkler, a boom sprayer, a rocket's debris,\n"
    "and a launcher ball's drag and lift fitted to its tracked flight) and explain what each shows.\n"
    "Their pictures (SVG) and two HTML reports go into a folder: dragarc-demo\n"
    "in the current folder unless --out names another (made if missing; files of the same names in it\n"
    "are replaced, each written whole or not at all). No file is read.\n"
    "\n"
    "  --out FOLDER   write the pictures and the report into FOLDER (default dragarc-demo)\n"
    "  --no-files     write nothing; only the explanations on standard output\n";

/* Where the demo's pictures and report go, and what it has written there. */
typedef struct demo_files {
    const char *dir; /* NULL: write nothing */
    size_t count;
    char names[16][48];
} demo_files;

/* The path of file `name` in the demo's folder, into buf; NULL when the demo writes no files. */
static const char *demo_path(const demo_files *o, const char *name, char *buf, size_t n)
{
    if (!o->dir)
        return NULL;
    snprintf(buf, n, "%s/%s", o->dir, name);
    return buf;
}

/* Record a file written, or report the failure to write it (exit status 2: the folder is the user's choice). */
static int demo_wrote(demo_files *o, const char *name, int rc, dragarc_error *err)
{
    if (rc != DRAGARC_OK) {
        err->field[0] = '\0';
        return cli_report("demo --out", err);
    }
    if (o->count < sizeof o->names / sizeof o->names[0])
        snprintf(o->names[o->count++], sizeof o->names[0], "%s", name);
    return EXIT_OK;
}

/* The picture (report 0) or the fly report (report 1) of flight f of scenario s as `name`, from the flight flown
 * again with about 600 samples, as `fly --plot` does. */
static int demo_flight_file(demo_files *o, const char *name, int report, const dragarc_scenario *s,
                            const dragarc_flight *f)
{
    char path[4200];
    if (!demo_path(o, name, path, sizeof path))
        return EXIT_OK;
    cli_fly_options fo;
    memset(&fo, 0, sizeof fo);
    dragarc_flight sampled;
    dragarc_error err;
    dragarc_report *r = NULL;
    int rc = cli_fly_sampled(s, f, &fo, &sampled, &err);
    if (rc == DRAGARC_OK && !report)
        rc = dragarc_flight_plot(path, s, &sampled, NULL, NULL, &err);
    if (rc == DRAGARC_OK && report && (rc = dragarc_report_new(&r, s->name, "fly", &err)) == DRAGARC_OK &&
        (rc = dragarc_report_fly(r, "dragarc demo", s, f, &sampled, NULL, NULL, &err)) == DRAGARC_OK)
        rc = dragarc_report_write_html(r, path, &err);
    dragarc_report_free(r);
    dragarc_flight_clear(&sampled);
    return demo_wrote(o, name, rc, &err);
}

typedef struct demo_case {
    const char *title;
    const char *json;
    const char *explain;
} demo_case;

static const demo_case CASES[] = {
    {"1. Practice ball on a warm afternoon at a hill-top field",
     "{\"name\": \"hill-top practice ball\","
     " \"projectile\": {\"mass\": 0.16, \"diameter\": 0.072, \"drag\": {\"model\": \"constant\", \"cd\": 0.38}},"
     " \"launch\": {\"speed\": 38.0, \"elevation\": 32.0, \"azimuth\": 20.0, \"height\": 1.8},"
     " \"environment\": {\"atmosphere\": {\"model\": \"isa\", \"site_elevation\": 450.0, \"temperature_offset\": \"8 K\"},"
     "   \"wind\": {\"model\": \"log\", \"speed\": 6.0, \"from\": 290.0, \"ref_height\": 10.0, \"roughness\": 0.03}},"
     " \"ground\": {\"elevation\": 0.0}}",
     "Drag takes a large share of the vacuum range away, and the breeze from the west-north-west, "
     "stronger aloft than at head height (log-law profile), pushes the ball to the right of its line."},
    {"2. A 0.6 mm droplet leaving a sprinkler nozzle",
     "{\"name\": \"sprinkler droplet 0.6 mm\","
     " \"projectile\": {\"density\": 998.2, \"diameter\": \"0.6 mm\", \"drag\": {\"model\": \"sphere\"}},"
     " \"launch\": {\"speed\": 12.0, \"elevation\": 25.0, \"azimuth\": 90.0, \"height\": 0.8},"
     " \"environment\": {\"atmosphere\": {\"model\": \"isa\", \"site_elevation\": 120.0, \"temperature_offset\": 5.0},"
     "   \"wind\": {\"model\": \"log\", \"speed\": 3.0, \"from\": 0.0, \"ref_height\": 10.0, \"roughness\": 0.05}}}",
     "A small drop loses its launch speed within a fraction of a second and then falls near its terminal "
     "speed while the wind carries it: a throw of a few metres and a sideways drift that grows "
     "as the drop gets smaller."},
    {"3. A small fragment shed at 3 km",
     "{\"name\": \"fragment shed at 3 km\","
     " \"projectile\": {\"mass\": 0.04, \"diameter\": 0.03, \"area\": 0.0009, \"volume\": 1.5e-5,"
     "   \"drag\": {\"model\": \"constant\", \"cd\": 1.1}},"
     " \"launch\": {\"speed\": \"233 kt\", \"elevation\": 5.0, \"azimuth\": 135.0, \"height\": \"3 km\"},"
     " \"environment\": {\"wind\": {\"model\": \"layered\", \"layers\": ["
     "   {\"height\": 0, \"speed\": 4, \"from\": 200}, {\"height\": 1000, \"speed\": 9, \"from\": 230},"
     "   {\"height\": 3000, \"speed\": 15, \"from\": 250}]}},"
     " \"solver\": {\"max_time\": 600}}",
     "The fragment's forward speed is gone within seconds; it then falls at a terminal speed that shrinks as "
     "the air thickens toward the ground, and the layered wind, veering with height, decides where it lands."},
    /* The same invented ball and launch at two invented venues: only the day's air and the ground differ. */
    {"4. A spinning ball driven at Saltmarsh Links (sea level, a cool damp morning, soft wet grass)",
     "{\"name\": \"driven ball at Saltmarsh Links\","
     " \"projectile\": {\"name\": \"demo ball (invented)\", \"mass\": 0.0459, \"diameter\": 0.0427,"
     "   \"drag\": {\"model\": \"constant\", \"cd\": 0.25},"
     "   \"lift\": {\"model\": \"table\", \"points\": [[0, 0], [0.05, 0.12], [0.1, 0.18], [0.2, 0.25], [0.3, 0.29]]},"
     "   \"spin_decay_coefficient\": 2e-5, \"inertia_factor\": 0.4},"
     " \"launch\": {\"speed\": 70.0, \"elevation\": 11.0, \"azimuth\": 0.0, \"spin\": {\"rate\": 2700, \"tilt\": 4}},"
     " \"environment\": {\"atmosphere\": {\"model\": \"local\", \"temperature\": \"12 degC\", \"pressure\": \"1021 hPa\","
     "   \"relative_humidity\": 0.85}, \"wind\": {\"model\": \"log\", \"speed\": 3.0, \"from\": 200.0, \"ref_height\": 10.0,"
     "   \"roughness\": 0.03}},"
     " \"ground\": {\"surface\": \"example-soft-wet-grass\"}}",
     "Backspin lift keeps the ball up far longer than drag alone would; the tilt of its spin axis curves it "
     "right. Dense, cool air costs carry, and the soft ground stops it within a few bounces."},
    {"5. The same ball and launch at High Mesa Range (1900 m, a hot dry afternoon, firm turf)",
     "{\"name\": \"driven ball at High Mesa Range\","
     " \"projectile\": {\"name\": \"demo ball (invented)\", \"mass\": 0.0459, \"diameter\": 0.0427,"
     "   \"drag\": {\"model\": \"constant\", \"cd\": 0.25},"
     "   \"lift\": {\"model\": \"table\", \"points\": [[0, 0], [0.05, 0.12], [0.1, 0.18], [0.2, 0.25], [0.3, 0.29]]},"
     "   \"spin_decay_coefficient\": 2e-5, \"inertia_factor\": 0.4},"
     " \"launch\": {\"speed\": 70.0, \"elevation\": 11.0, \"azimuth\": 0.0, \"spin\": {\"rate\": 2700, \"tilt\": 4}},"
     " \"environment\": {\"atmosphere\": {\"model\": \"local\", \"temperature\": \"29 degC\", \"pressure\": \"810 hPa\","
     "   \"relative_humidity\": 0.15}, \"wind\": {\"model\": \"log\", \"speed\": 3.0, \"from\": 200.0, \"ref_height\": 10.0,"
     "   \"roughness\": 0.03}},"
     " \"ground\": {\"surface\": \"example-firm-turf\"}}",
     "Thin, warm air means less drag and less lift: the drag saving wins, so the ball carries farther, lands "
     "faster and runs on across firm ground."},
};

/* An invented garden sprinkler and an invented boom sprayer (smaller than docs/examples' so that the demo stays
 * quick, also under valgrind). */
static const char GARDEN[] =
    "{\"name\": \"garden sprinkler (invented)\", \"sprinkler\": {"
    " \"nozzle\": {\"diameter\": \"4 mm\", \"pressure\": \"2.5 bar\", \"velocity_coefficient\": 0.95,"
    "   \"discharge_coefficient\": 0.9},"
    " \"height\": \"0.5 m\", \"elevation\": 23, \"directions\": 24,"
    " \"spectrum\": {\"form\": \"rosin_rammler\", \"dv50\": \"1.1 mm\", \"spread\": 2.3, \"classes\": 16},"
    " \"layout\": {\"kind\": \"triangular\", \"spacing\": \"10 m\"}},"
    " \"environment\": {\"atmosphere\": {\"model\": \"local\", \"temperature\": \"27 degC\", \"pressure\": \"1008 hPa\","
    "   \"relative_humidity\": 0.4},"
    "   \"wind\": {\"model\": \"log\", \"speed\": 2.0, \"from\": 250, \"ref_height\": 10.0, \"roughness\": 0.03}}}";
static const char BOOM[] =
    "{\"name\": \"boom sprayer (invented)\", \"drift\": {"
    " \"release\": {\"height\": \"0.5 m\", \"pressure\": \"3 bar\", \"velocity_coefficient\": 0.9},"
    " \"travel\": {\"speed\": \"8 km/h\", \"direction\": 0},"
    " \"spectrum\": {\"form\": \"log_normal\", \"dv50\": \"260 um\", \"span\": 1.2, \"classes\": 20},"
    " \"nonvolatile_fraction\": 0.02, \"buffer\": \"2 m\"},"
    " \"environment\": {\"atmosphere\": {\"model\": \"local\", \"temperature\": \"22 degC\", \"pressure\": \"1012 hPa\","
    "   \"relative_humidity\": 0.55},"
    "   \"wind\": {\"model\": \"log\", \"speed\": 3.0, \"from\": 270, \"ref_height\": 2.0, \"roughness\": 0.05}}}";

static int demo_sprinkler(unsigned *notes, demo_files *o)
{
    dragarc_sprinkler_spec sp;
    dragarc_error err;
    if (dragarc_sprinkler_spec_parse(GARDEN, &sp, &err) != DRAGARC_OK)
        return cli_report("demo", &err);
    dragarc_spectrum_class cl[16];
    dragarc_sprinkler_result r;
    int rc = dragarc_sprinkler_spec_run(&sp, cl, NULL, NULL, &r, &err);
    if (rc == DRAGARC_OK) {
        dragarc_sprinkler_class_stats fine, coarse;
        dragarc_sprinkler_class_summary(&r, 0, &fine);
        dragarc_sprinkler_class_summary(&r, r.nclasses - 1, &coarse);
        puts("6. A garden sprinkler on a warm afternoon (dragarc sprinkler; docs/sprinkler.md)");
        printf("  jet %.1f m/s, %.1f L/min; %zu drop sizes in %zu directions:\n"
               "  the finest (%.2f mm) travel %.1f m, the coarsest (%.2f mm) %.1f m\n",
               r.exit_speed, r.flow * 6e4, r.nclasses, r.ndirections, cl[0].diameter * 1e3, fine.distance,
               cl[r.nclasses - 1].diameter * 1e3, coarse.distance);
        printf("  wetted radius %.1f m; %.2f %% of the water evaporates on the way;\n"
               "  sprinklers on a 10 m triangle: CU %.0f %%, DU %.0f %%, %.1f mm/h\n",
               r.wetted_radius, 100.0 * r.evaporated_fraction, r.layout_stats.cu, r.layout_stats.du_lq,
               r.layout_stats.mean);
        dragarc_text_wrap(stdout, "  What it shows: ", 4, 100,
                          "Big drops carry to the edge of the pattern and small ones fall near the sprinkler or "
                          "evaporate; overlapping neighbours evens out the depth that one sprinkler lays down.");
        putchar('\n');
        *notes |= r.notes | DRAGARC_NOTE_IRRIGATION;
        char path[4200];
        if (demo_path(o, "6-garden-sprinkler.svg", path, sizeof path))
            rc = demo_wrote(o, "6-garden-sprinkler.svg", dragarc_sprinkler_plot(path, &sp, &r, NULL, &err), &err);
    } else {
        rc = cli_report("demo", &err);
    }
    dragarc_sprinkler_clear(&r);
    dragarc_sprinkler_spec_clear(&sp);
    return rc == DRAGARC_OK ? EXIT_OK : rc;
}

static int demo_drift(unsigned *notes, demo_files *o)
{
    dragarc_drift_spec sp;
    dragarc_error err;
    if (dragarc_drift_spec_parse(BOOM, &sp, &err) != DRAGARC_OK)
        return cli_report("demo", &err);
    dragarc_spectrum_class cl[20];
    dragarc_drift_result r;
    int rc = dragarc_drift_spec_run(&sp, cl, &r, &err);
    if (rc == DRAGARC_OK) {
        puts("7. A boom sprayer in a breeze (dragarc drift; docs/drift.md)");
        printf("  %.1f %% of the spray deposits, 90 %% of it within %.2f m downwind;\n"
               "  %.2f %% is not deposited within the %.0f m buffer",
               100.0 * r.deposited_fraction, r.distance90, 100.0 * r.beyond_buffer, r.buffer);
        if (isfinite(r.diameter_at_buffer))
            printf(" (drops under %.0f um land beyond it)", r.diameter_at_buffer * 1e6);
        puts("");
        dragarc_text_wrap(stdout, "  What it shows: ", 4, 100,
                          "The finest drops of a spray slow at once, then drift with the wind and shrink as they "
                          "evaporate; they carry the share that leaves the target. This model has no turbulence, "
                          "so real drift is larger.");
        putchar('\n');
        *notes |= r.notes | DRAGARC_NOTE_SPRAY_DRIFT;
        char path[4200];
        if (demo_path(o, "7-boom-sprayer-drift.svg", path, sizeof path))
            rc = demo_wrote(o, "7-boom-sprayer-drift.svg", dragarc_drift_plot(path, &sp, cl, &r, NULL, &err), &err);
    } else {
        rc = cli_report("demo", &err);
    }
    dragarc_drift_clear(&r);
    dragarc_drift_spec_clear(&sp);
    return rc == DRAGARC_OK ? EXIT_OK : rc;
}

static const char BREAKUP[] =
    "{\"name\": \"sounding-rocket breakup (invented)\", \"breakup\": {\"latitude\": 34.5, \"longitude\": -106.5,"
    " \"altitude\": \"12 km\", \"speed\": \"450 m/s\", \"flight_path_angle\": 60, \"heading\": 20,"
    " \"spread\": {\"position\": [100, 100, 80], \"speed\": 10, \"flight_path_angle\": 1, \"heading\": 1}},"
    " \"fragments\": [{\"name\": \"motor case\", \"count\": 1, \"mass\": \"20 kg\", \"ballistic_coefficient\": 700,"
    "   \"drag\": {\"model\": \"constant\", \"cd\": 0.9}, \"beta_spread\": 0.1},"
    "  {\"name\": \"panel\", \"count\": 20, \"mass\": \"0.2 kg\", \"area\": \"0.02 m^2\","
    "   \"drag\": {\"model\": \"constant\", \"cd\": 1.3}, \"beta_spread\": 0.3,"
    "   \"delta_v\": {\"distribution\": \"uniform\", \"speed\": 15}}],"
    " \"uncertainty\": {\"wind\": {\"speed\": 0.2, \"direction\": 10}},"
    " \"footprint\": {\"samples\": 300, \"seed\": 5}, \"hazard\": {\"population\": {\"density\": 10}},"
    " \"environment\": {\"wind\": {\"model\": \"layered\", \"layers\": [{\"height\": 0, \"speed\": 5, \"from\": 250},"
    "   {\"height\": 10000, \"speed\": 25, \"from\": 270}]}}}";

static int demo_footprint(unsigned *notes, demo_files *o)
{
    dragarc_footprint_spec sp;
    dragarc_error err;
    if (dragarc_footprint_spec_parse(BREAKUP, &sp, &err) != DRAGARC_OK)
        return cli_report("demo", &err);
    dragarc_impact *im = malloc(sp.nclasses * sp.samples * sizeof *im);
    dragarc_population pop;
    dragarc_footprint_summary s;
    memset(&pop, 0, sizeof pop);
    memset(&s, 0, sizeof s);
    int rc = im ? dragarc_population_uniform(&pop, sp.hazard.density, &err)
                : dragarc_error_set(&err, DRAGARC_ENOMEM, "", "out of memory");
    if (rc == DRAGARC_OK)
        rc = dragarc_footprint_run(&sp, im, NULL, NULL, &err);
    if (rc == DRAGARC_OK)
        rc = dragarc_footprint_summarise(&sp, im, &pop, &s, &err);
    if (rc == DRAGARC_OK) {
        const dragarc_footprint_group *all = &s.groups[sp.nclasses];
        puts("8. Debris from an invented sounding-rocket breakup at 12 km (dragarc footprint; docs/footprint.md)");
        printf("  %zu flights of %zu fragment classes: the motor case lands %.1f km out, the panels %.1f km\n"
               "  (the wind carries them east); 99 %% of all fragments within a %.1f km2 area; %.0f %% of them land\n"
               "  with %.0f J or more; over %.0f people/km2 the expected casualties are %.1e\n",
               all->flights, sp.nclasses, hypot(s.groups[0].mean[0], s.groups[0].mean[1]) * 1e-3,
               hypot(s.groups[1].mean[0], s.groups[1].mean[1]) * 1e-3, s.grid_ok ? s.region[1].area * 1e-6 : NAN,
               100.0 * all->hazardous_share, sp.hazard.energy_threshold, sp.hazard.density,
               s.casualty.expected_casualties);
        dragarc_text_wrap(stdout, "  What it shows: ", 4, 100,
                          "The dense motor case coasts on along the flight path and falls fast; the light panels "
                          "slow at once, and the wind, blowing through their long fall, carries them farther. "
                          "Range-safety authorities, not this estimate, set hazard areas.");
        putchar('\n');
        *notes |= DRAGARC_NOTE_DEBRIS;
        char path[4200];
        if (demo_path(o, "8-debris-footprint.svg", path, sizeof path))
            rc = demo_wrote(o, "8-debris-footprint.svg", dragarc_footprint_plot(path, &sp, im, &s, NULL, &err), &err);
        if (rc == EXIT_OK && demo_path(o, "report-debris-footprint.html", path, sizeof path)) {
            dragarc_report *rep = NULL;
            int w = dragarc_report_new(&rep, sp.base.name, "footprint", &err);
            if (w == DRAGARC_OK && (w = dragarc_report_footprint(rep, "dragarc demo", &sp, im, &s, &err)) == DRAGARC_OK)
                w = dragarc_report_write_html(rep, path, &err);
            dragarc_report_free(rep);
            rc = demo_wrote(o, "report-debris-footprint.html", w, &err);
        }
    } else {
        rc = cli_report("demo", &err);
    }
    dragarc_footprint_summary_clear(&s);
    dragarc_population_clear(&pop);
    free(im);
    dragarc_footprint_spec_clear(&sp);
    return rc == DRAGARC_OK ? EXIT_OK : rc;
}

/* The launcher-ball test of docs/fit.md: drag, lift and launch fitted to a tracked flight. The track was made by
 * flying the scenario with these values and adding 3 cm of Gaussian noise (docs/fit.md says how). */
static const char FIT_ESTIMATES[] = "cd,cl,launch.speed,launch.elevation";
static const double FIT_TRUTH[] = {0.55, 0.18, 30.0, 15.0}; /* in the order above, as shown (degrees) */

static int demo_fit(demo_files *o, const char **cautions, size_t *ncautions)
{
    dragarc_scenario s, fitted;
    dragarc_track track;
    dragarc_fit_options opt;
    dragarc_fit_result r;
    dragarc_error err;
    memset(&r, 0, sizeof r);
    dragarc_scenario_default(&fitted);
    dragarc_fit_options_default(&opt);
    if (dragarc_scenario_parse((const char *)DEMO_LAUNCHER_BALL_JSON, NULL, cli_profile_path(), &s, &err) != DRAGARC_OK)
        return cli_report("demo", &err);
    int rc = dragarc_track_parse((const char *)DEMO_LAUNCHER_BALL_TRACK, &track, &err);
    if (rc == DRAGARC_OK)
        rc = dragarc_fit_params_parse(FIT_ESTIMATES, &opt.estimate, &err);
    if (rc == DRAGARC_OK)
        rc = dragarc_fit_run(&s, &track, &opt, &r, &fitted, &err);
    if (rc == DRAGARC_OK) {
        puts("9. A launcher ball's drag and lift measured from its tracked flight (dragarc fit; docs/fit.md)");
        printf("  %zu camera positions from %.2f s to %.2f s, standard deviation %.2f m; %s %s\n"
               "  after %d iterations (%ld flights). Fitted, against the values the track was made with:\n",
               r.npoints, track.t[0], track.t[track.n - 1], track.pos_sd ? track.pos_sd[0] : NAN,
               r.accel_used ? "Levenberg-Marquardt with geodesic acceleration" : "Levenberg-Marquardt",
               r.converged ? "converged" : "did NOT converge", r.iterations, r.flights);
        printf("    %-24s %9s %10s %10s %10s\n", "estimate", "start", "fitted", "std error", "made with");
        double worst = 0.0; /* the largest miss of the truth, in standard errors */
        int kcd = -1, kspeed = -1;
        for (int k = 0; k < r.np && k < (int)(sizeof FIT_TRUTH / sizeof *FIT_TRUTH); k++) {
            const int p = r.param[k];
            const char *u = dragarc_fit_param_unit(p);
            char name[48];
            snprintf(name, sizeof name, u[0] ? "%s (%s)" : "%s", dragarc_fit_param_name(r.param[k]), u);
            const double v = dragarc_fit_param_shown(p, r.value[k]), se = dragarc_fit_param_shown(p, r.se[k]);
            const int d = dragarc_fit_decimals(se);
            printf("    %-24s %9.4g %10.*f %10.2g %10g\n", name, dragarc_fit_param_shown(p, r.start[k]), d, v, se,
                   FIT_TRUTH[k]);
            worst = fmax(worst, fabs(v - FIT_TRUTH[k]) / se);
            kcd = p == DRAGARC_FIT_CD ? k : kcd;
            kspeed = p == DRAGARC_FIT_LAUNCH_SPEED ? k : kspeed;
        }
        printf("  residual RMS %.3f m; chi-square %.1f on %zu degrees of freedom (p = %.2f); every estimate\n"
               "  within %.1f standard errors of the truth; cd and launch.speed correlate at %.2f\n",
               r.rms_pos[3], r.chisq, r.dof, r.chisq_p, worst, kcd >= 0 && kspeed >= 0 ? r.corr[kcd * r.np + kspeed] : NAN);
        dragarc_text_wrap(stdout, "  What it shows: ", 4, 100,
                          "Flying the scenario again and again, the fit moves drag, lift and the launch until the "
                          "modelled flight passes closest to the camera's points, and says how well the track pins "
                          "each value. Drag and a faster launch trade against each other (both change how quickly "
                          "the ball covers ground), so their errors are linked: a shorter track pins them far less "
                          "well.");
        putchar('\n');
        *ncautions = dragarc_cautions_fit(cautions, DRAGARC_CAUTIONS_MAX);
        char path[4200];
        if (demo_path(o, "9-launcher-ball-fit.svg", path, sizeof path))
            rc = demo_wrote(o, "9-launcher-ball-fit.svg", dragarc_fit_plot(path, &fitted, &track, &r, &err), &err);
    } else {
        rc = cli_report("demo", &err);
    }
    dragarc_fit_result_clear(&r);
    dragarc_scenario_clear(&fitted);
    dragarc_track_clear(&track);
    dragarc_scenario_clear(&s);
    return rc == DRAGARC_OK ? EXIT_OK : rc;
}

/* The inverse question for the first case: which launches put the ball on a spot `range` metres out? */
static int demo_aim(const dragarc_scenario *s, double range, demo_files *o)
{
    dragarc_aim_request q;
    dragarc_aim_request_default(&q);
    q.range = range;
    dragarc_aim_result r;
    dragarc_error err;
    if (dragarc_aim_solve(s, &q, &r, &err) != DRAGARC_OK)
        return cli_report("demo", &err);
    printf("  Aim (dragarc aim --range %g): at %.4g m/s the ball reaches at most %.1f m (elevation %.1f deg);\n", range,
           s->launch.speed, r.max_range, r.max_range_elevation * 57.29577951308232);
    for (size_t i = 0; i < r.nsolutions; i++)
        printf("    %s: elevation %.2f deg, aim %.2f deg %s of the line, %.2f s in the air, lands at %.1f m/s\n",
               r.nsolutions != 2 ? "solution" : i == 0 ? "direct" : "lofted", r.solutions[i].elevation * 57.29577951308232,
               fabs(r.solutions[i].azimuth_correction) * 57.29577951308232,
               r.solutions[i].azimuth_correction >= 0 ? "right" : "left", r.solutions[i].time_of_flight,
               r.solutions[i].impact_speed);
    char path[4200];
    if (demo_path(o, "1-practice-ball-aim.svg", path, sizeof path))
        return demo_wrote(o, "1-practice-ball-aim.svg", dragarc_aim_plot(path, s, &q, &r, NULL, NULL, &err), &err);
    return EXIT_OK;
}

/* A table for the second case: how far drops of each size carry and drift from the same nozzle. */
static int demo_table(const dragarc_scenario *s, demo_files *o)
{
    dragarc_sweep_axis axis;
    dragarc_error err;
    dragarc_sweep t;
    if (dragarc_sweep_axis_init(&axis, "diameter", 0.0002, 0.0016, 0.0002, &err) != DRAGARC_OK)
        return cli_report("demo", &err);
    if (dragarc_sweep_run(s, &axis, 1, &t, &err) != DRAGARC_OK) {
        dragarc_sweep_clear(&t);
        return cli_report("demo", &err);
    }
    puts("  Table (dragarc table --vary diameter=0.0002:0.0016:0.0002): the same nozzle, other drop sizes:");
    puts("    diameter   throw    drift   time aloft   impact speed");
    for (size_t i = 0; i < t.nrows; i++) {
        const dragarc_sweep_row *r = &t.rows[i];
        if (r->status != DRAGARC_OK)
            continue;
        printf("    %5.1f mm  %5.2f m  %5.2f m  %7.2f s  %8.2f m/s\n", r->values[0] * 1e3, r->downrange,
               fabs(r->crossrange), r->time_of_flight, r->impact_speed);
    }
    puts("    Small drops lose their speed at once and drift furthest; large ones carry.");
    int rc = EXIT_OK;
    char path[4200];
    if (demo_path(o, "2-droplet-sizes.svg", path, sizeof path))
        rc = demo_wrote(o, "2-droplet-sizes.svg", dragarc_sweep_plot(path, &t, DRAGARC_SWEEP_RANGE, NULL, NULL, &err),
                        &err);
    dragarc_sweep_clear(&t);
    return rc;
}

/* The pictures of the cases flown in the loop below, by case number; NULL: none. */
static const char *const CASE_PICTURE[] = {"1-practice-ball.svg", NULL, "3-fragment-from-3-km.svg",
                                           "4-saltmarsh-links.svg", "5-high-mesa-range.svg"};

int cmd_demo(int argc, char **argv)
{
    demo_files files = {.dir = "dragarc-demo"};
    int no_files = 0, out_given = 0;
    for (int i = 1; i < argc; i++) {
        if (strcmp(argv[i], "-h") == 0 || strcmp(argv[i], "--help") == 0) {
            fputs(HELP, stdout);
            return EXIT_OK;
        }
        if (strcmp(argv[i], "--no-files") == 0) {
            no_files = 1;
        } else if (strcmp(argv[i], "--out") == 0) {
            if (++i >= argc || !*argv[i])
                return cli_usage_error("demo", "--out needs a folder");
            files.dir = argv[i];
            out_given = 1;
        } else {
            return cli_usage_error("demo", "unknown option '%s'", argv[i]);
        }
    }
    if (no_files && out_given)
        return cli_usage_error("demo", "--out and --no-files: choose one");
    if (no_files) {
        files.dir = NULL;
    } else if (mkdir(files.dir, 0755) != 0 && errno != EEXIST) {
        fprintf(stderr, "dragarc: demo --out: cannot make folder %s: %s\n", files.dir, strerror(errno));
        return EXIT_BAD_INPUT;
    } else {
        struct stat st;
        if (stat(files.dir, &st) != 0 || !S_ISDIR(st.st_mode)) {
            fprintf(stderr, "dragarc: demo --out: %s is not a folder\n", files.dir);
            return EXIT_BAD_INPUT;
        }
    }
    puts("dragarc demo: invented scenarios, one for each kind of user, and one ball at two venues.\n");
    int status_extra;
    double carry[2] = {0.0, 0.0}, total[2] = {0.0, 0.0};
    unsigned notes = 0;
    const char *fit_cautions[DRAGARC_CAUTIONS_MAX];
    size_t nfit = 0;
    dragarc_scenario last;
    int have_last = 0;
    for (size_t k = 0; k < sizeof CASES / sizeof CASES[0]; k++) {
        dragarc_scenario s;
        dragarc_error err;
        if (dragarc_scenario_parse(CASES[k].json, NULL, cli_profile_path(), &s, &err) != DRAGARC_OK)
            return cli_report("demo", &err);
        dragarc_flight f;
        int rc = dragarc_flight_run(&s, 0.0, &f, &err);
        if (rc != DRAGARC_OK) {
            dragarc_flight_clear(&f);
            dragarc_scenario_clear(&s);
            return cli_report("demo", &err);
        }
        cli_print_flight(stdout, CASES[k].title, &s, &f, NULL, 0);
        if (isfinite(f.vacuum_range) && f.vacuum_range > 0.0)
            printf(f.range <= f.vacuum_range ? "  drag shortened the range to %.0f %% of the vacuum range\n"
                                             : "  spin lift carried it to %.0f %% of the vacuum range\n",
                   100.0 * f.range / f.vacuum_range);
        if (isfinite(f.relaxation_time))
            printf("  drag relaxation time %.3g s (terminal speed / g) against a %.3g s flight: %s method\n",
                   f.relaxation_time, f.time_of_flight, dragarc_method_name(f.method));
        dragarc_text_wrap(stdout, "  What it shows: ", 4, 100, CASES[k].explain);
        int st = EXIT_OK;
        if (k < sizeof CASE_PICTURE / sizeof CASE_PICTURE[0] && CASE_PICTURE[k])
            st = demo_flight_file(&files, CASE_PICTURE[k], 0, &s, &f);
        if (st == EXIT_OK && k == 0)
            st = demo_aim(&s, 70.0, &files);
        if (st == EXIT_OK && k == 1)
            st = demo_table(&s, &files);
        if (st == EXIT_OK && k == 3)
            st = demo_flight_file(&files, "report-saltmarsh-links.html", 1, &s, &f);
        if (st != EXIT_OK) {
            dragarc_flight_clear(&f);
            dragarc_scenario_clear(&s);
            if (have_last)
                dragarc_scenario_clear(&last);
            return st;
        }
        if (k >= 3) {
            carry[k - 3] = f.range, total[k - 3] = f.total_distance;
            if (k == 4)
                printf("  The two venues: the same shot carries %.1f m farther (%+.1f %%) and finishes %.1f m farther "
                       "at High Mesa Range.\n",
                       carry[1] - carry[0], 100.0 * (carry[1] / carry[0] - 1.0), total[1] - total[0]);
        }
        putchar('\n');
        notes |= f.notes;
        if (have_last)
            dragarc_scenario_clear(&last);
        last = s;
        have_last = 1;
        dragarc_flight_clear(&f);
    }
    if ((status_extra = demo_sprinkler(&notes, &files)) != EXIT_OK ||
        (status_extra = demo_drift(&notes, &files)) != EXIT_OK ||
        (status_extra = demo_footprint(&notes, &files)) != EXIT_OK ||
        (status_extra = demo_fit(&files, fit_cautions, &nfit)) != EXIT_OK) {
        dragarc_scenario_clear(&last);
        return status_extra;
    }
    /* One list of cautions for the whole demo: the model limits plus whatever any case called for, then the fit's. */
    const char *cautions[2 * DRAGARC_CAUTIONS_MAX];
    size_t nc = dragarc_cautions_notes(notes, cautions, DRAGARC_CAUTIONS_MAX);
    for (size_t i = 0; i < nfit; i++)
        cautions[nc++] = fit_cautions[i];
    dragarc_cautions_print_list(stdout, cautions, nc, 100);
    if (files.dir) {
        printf("\nPictures and reports, written into %s/ (open the .html files in a browser):\n", files.dir);
        for (size_t i = 0; i < files.count; i++)
            printf("  %s\n", files.names[i]);
    }
    puts("\nNext: 'dragarc fly SCENARIO' with a scenario file of your own (docs/scenario.md).");
    dragarc_scenario_clear(&last);
    return EXIT_OK;
}
