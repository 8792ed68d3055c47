/* test_footprint.c: Monte Carlo fragment flights: reproducible streams, and the scatter of impacts against the
 * linearised propagation of the breakup's uncertainty.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <omp.h>
#include <stdlib.h>
#include <string.h>

#include "check.h"
#include "dragarc/footprint.h"
#include "helpers.h"

/* An invented breakup: a 2 kg plate (C_D 1, 0.02 m^2: beta 100 kg/m^2) shed at 10 km, 300 m/s climbing at 20
 * degrees toward 060, in the standard atmosphere without wind. */
static const char *SCENARIO =
    "{\"name\": \"test breakup\", \"breakup\": {\"latitude\": 35.0, \"longitude\": -110.0, \"altitude\": \"10 km\","
    " \"speed\": 300, \"flight_path_angle\": 20, \"heading\": 60, \"spread\": {\"position\": [%g, %g, %g],"
    " \"speed\": %g, \"flight_path_angle\": %g, \"heading\": %g}},"
    " \"fragments\": [{\"name\": \"plate\", \"count\": 10, \"mass\": 2, \"area\": 0.02,"
    " \"drag\": {\"model\": \"constant\", \"cd\": 1.0}%s}],"
    " \"footprint\": {\"samples\": %d, \"seed\": %d}}";

static int load(dragarc_footprint_spec *sp, const double sd[6], const char *extra, int samples, int seed)
{
    char text[2048];
    snprintf(text, sizeof text, SCENARIO, sd[0], sd[1], sd[2], sd[3], sd[4], sd[5], extra, samples, seed);
    dragarc_error e;
    int rc = dragarc_footprint_spec_parse(text, sp, &e);
    if (rc != DRAGARC_OK)
        printf("  %s: %s\n", e.field, e.message);
    return rc;
}

static dragarc_impact *fly(const dragarc_footprint_spec *sp)
{
    dragarc_impact *o = calloc(sp->nclasses * sp->samples, sizeof *o);
    CHECK(o && dragarc_footprint_run(sp, o, NULL, NULL, NULL) == DRAGARC_OK);
    return o;
}

TEST(the_same_seed_gives_the_same_impacts_on_any_thread_count)
{
    const double sd[6] = {50, 50, 30, 5, 1, 1};
    dragarc_footprint_spec sp;
    CHECK(load(&sp, sd, ", \"beta_spread\": 0.2, \"delta_v\": {\"distribution\": \"maxwellian\", \"speed\": 10}",
               64, 11) == DRAGARC_OK);
    omp_set_num_threads(1);
    dragarc_impact *a = fly(&sp);
    omp_set_num_threads(2);
    dragarc_impact *b = fly(&sp);
    CHECK(memcmp(a, b, sp.samples * sizeof *a) == 0);
    dragarc_footprint_spec_clear(&sp);
    CHECK(load(&sp, sd, ", \"beta_spread\": 0.2, \"delta_v\": {\"distribution\": \"maxwellian\", \"speed\": 10}",
               64, 12) == DRAGARC_OK);
    dragarc_impact *c = fly(&sp);
    int same = 0;
    for (size_t i = 0; i < sp.samples; i++)
        same += a[i].east == c[i].east;
    CHECK(same == 0);
    /* the streams' seeds differ between neighbouring samples, classes and runs */
    CHECK(dragarc_footprint_stream_seed(1, 0, 0) != dragarc_footprint_stream_seed(1, 0, 1));
    CHECK(dragarc_footprint_stream_seed(1, 0, 1) != dragarc_footprint_stream_seed(1, 1, 0));
    CHECK(dragarc_footprint_stream_seed(1, 0, 0) != dragarc_footprint_stream_seed(2, 0, 0));
    free(a), free(b), free(c);
    dragarc_footprint_spec_clear(&sp);
}

TEST(ranges_flown_apart_and_put_back_are_the_whole_run)
{
    /* what an MPI run relies on (docs/cluster.md): flight k depends on its global index only, whatever range or
     * step it is flown in; two classes, so that ranges cross the class boundary */
    const double sd[6] = {50, 50, 30, 5, 1, 1};
    dragarc_footprint_spec sp;
    CHECK(load(&sp, sd, ", \"beta_spread\": 0.2, \"delta_v\": {\"distribution\": \"uniform\", \"speed\": 20}", 37,
               5) == DRAGARC_OK);
    CHECK(sp.nclasses == 1);
    dragarc_impact *whole = fly(&sp);
    const size_t cuts[][2] = {{0, 37}, {0, 1}, {5, 19}, {19, 37}, {36, 37}, {37, 37}};
    dragarc_impact part[37];
    for (size_t c = 0; c < sizeof cuts / sizeof cuts[0]; c++) {
        size_t k0 = cuts[c][0], k1 = cuts[c][1];
        CHECK(dragarc_footprint_run_range(&sp, k0, k1, 1, part, NULL, NULL, NULL) == DRAGARC_OK);
        CHECK(k1 == k0 || memcmp(part, whole + k0, (k1 - k0) * sizeof *part) == 0);
    }
    /* a two-class run dealt to 3 "processes", every 3rd flight each, on one thread or two, put back in place */
    const size_t n = sp.samples;
    sp.classes = realloc(sp.classes, 2 * sizeof *sp.classes);
    sp.classes[1] = sp.classes[0];
    CHECK(dragarc_drag_copy(&sp.classes[1].drag, &sp.classes[0].drag, NULL) == DRAGARC_OK);
    sp.classes[1].mass = 7.0;
    sp.nclasses = 2;
    dragarc_impact *two = fly(&sp), *dealt = calloc(2 * n, sizeof *dealt);
    for (size_t r = 0; r < 3; r++) {
        omp_set_num_threads(1 + (int)(r % 2));
        size_t count = (2 * n - r + 2) / 3;
        CHECK(dragarc_footprint_run_range(&sp, r, 2 * n, 3, part, NULL, NULL, NULL) == DRAGARC_OK);
        for (size_t j = 0; j < count; j++)
            dealt[r + 3 * j] = part[j];
    }
    CHECK(memcmp(dealt, two, 2 * n * sizeof *two) == 0);
    CHECK(dealt[40].cls == 1 && dealt[40].sample == 3 && dealt[40].weight == 10.0 / 37.0);
    dragarc_error e;
    CHECK_ERROR(dragarc_footprint_run_range(&sp, 5, 4, 1, part, NULL, NULL, &e), DRAGARC_EINVAL, e, "", "not within");
    CHECK_ERROR(dragarc_footprint_run_range(&sp, 0, 2 * n + 1, 1, part, NULL, NULL, &e), DRAGARC_EINVAL, e, "",
                "not within the run's 74");
    CHECK_ERROR(dragarc_footprint_run_range(&sp, 0, 3, 0, part, NULL, NULL, &e), DRAGARC_EINVAL, e, "", "by 0");
    free(whole), free(two), free(dealt);
    dragarc_footprint_spec_clear(&sp);
}

/* The impact point (east, north) of the nominal breakup moved by dx (east, north, up m; speed m/s; path angle,
 * heading deg), flown once without spreads. */
static void impact_of(const double dx[6], double out[2])
{
    const double zero[6] = {0, 0, 0, 0, 0, 0};
    dragarc_footprint_spec sp;
    CHECK(load(&sp, zero, "", 1, 1) == DRAGARC_OK);
    double *v = sp.breakup.velocity;
    double vh = hypot(v[0], v[1]), speed = hypot(vh, v[2]) + dx[3];
    double gam = atan2(v[2], vh) + dx[4] * DEG, psi = atan2(v[0], v[1]) + dx[5] * DEG;
    v[0] = speed * cos(gam) * sin(psi), v[1] = speed * cos(gam) * cos(psi), v[2] = speed * sin(gam);
    sp.breakup.altitude += dx[2];
    dragarc_impact o;
    CHECK(dragarc_footprint_run(&sp, &o, NULL, NULL, NULL) == DRAGARC_OK && o.status == DRAGARC_OK);
    out[0] = o.east + dx[0], out[1] = o.north + dx[1];
    dragarc_footprint_spec_clear(&sp);
}

TEST(small_spreads_scatter_as_the_linearised_propagation_says)
{
    /* First-order propagation of uncertainty: for small input spreads the impact covariance is J S J^T, J the
     * Jacobian of the impact point with respect to the inputs, S their covariance (JCGM 100:2008, Guide to the
     * expression of uncertainty in measurement, section 5.1.2; the matrix form in JCGM 102:2011, section 6.2).
     * J by central differences of the nominal flight (steps of one sd: the impact is smooth in the inputs, and the
     * truncation error, about (sd)^2 f''' / 6, is far below the statistical tolerance). The sample mean and
     * covariance of N = 4000 Monte Carlo impacts must match within 4 standard errors: for a covariance element
     * se = sqrt((s_ii s_jj + s_ij^2) / (N - 1)) (normal samples; e.g. Anderson 2003, An Introduction to
     * Multivariate Statistical Analysis, 3rd ed., section 7.2), for the mean sqrt(s_ii / N). Four standard
     * errors: a false failure about once in 16000 per check (normal tails). */
    const double sd[6] = {20, 20, 20, 15, 2, 2};
    const int n = 4000;
    double J[2][6], nominal[2];
    const double zero[6] = {0, 0, 0, 0, 0, 0};
    impact_of(zero, nominal);
    for (int k = 0; k < 6; k++) {
        double dp[6] = {0, 0, 0, 0, 0, 0}, dm[6] = {0, 0, 0, 0, 0, 0}, ip[2], im[2];
        dp[k] = sd[k], dm[k] = -sd[k];
        impact_of(dp, ip);
        impact_of(dm, im);
        for (int r = 0; r < 2; r++)
            J[r][k] = (ip[r] - im[r]) / (2.0 * sd[k]);
    }
    double pred[3] = {0, 0, 0}; /* ee, en, nn */
    for (int k = 0; k < 6; k++) {
        pred[0] += J[0][k] * J[0][k] * sd[k] * sd[k];
        pred[1] += J[0][k] * J[1][k] * sd[k] * sd[k];
        pred[2] += J[1][k] * J[1][k] * sd[k] * sd[k];
    }
    dragarc_footprint_spec sp;
    CHECK(load(&sp, sd, "", n, 3) == DRAGARC_OK);
    dragarc_impact *o = fly(&sp);
    double m[2] = {0, 0}, c[3] = {0, 0, 0};
    for (int i = 0; i < n; i++)
        CHECK(o[i].status == DRAGARC_OK), m[0] += o[i].east / n, m[1] += o[i].north / n;
    for (int i = 0; i < n; i++) {
        double a = o[i].east - m[0], b = o[i].north - m[1];
        c[0] += a * a / (n - 1), c[1] += a * b / (n - 1), c[2] += b * b / (n - 1);
    }
    printf("  nominal impact %.2f m east, %.2f m north; sample mean %.2f, %.2f\n", nominal[0], nominal[1], m[0], m[1]);
    printf("  covariance ee %.2f en %.2f nn %.2f m^2; linearised %.2f %.2f %.2f\n", c[0], c[1], c[2], pred[0], pred[1],
           pred[2]);
    CHECK_ABS(m[0], nominal[0], 4.0 * sqrt(pred[0] / n));
    CHECK_ABS(m[1], nominal[1], 4.0 * sqrt(pred[2] / n));
    CHECK_ABS(c[0], pred[0], 4.0 * sqrt(2.0 * pred[0] * pred[0] / (n - 1)));
    CHECK_ABS(c[1], pred[1], 4.0 * sqrt((pred[0] * pred[2] + pred[1] * pred[1]) / (n - 1)));
    CHECK_ABS(c[2], pred[2], 4.0 * sqrt(2.0 * pred[2] * pred[2] / (n - 1)));
    free(o);
    dragarc_footprint_spec_clear(&sp);
}

/* Parse a footprint scenario whose breakup is the small fixed one below and whose fragments are `fragments`;
 * returns the status and leaves the field in e. */
static int parse_with(const char *fragments, double latitude, dragarc_footprint_spec *sp, dragarc_error *e)
{
    char text[1024];
    snprintf(text, sizeof text, "{\"breakup\": {\"latitude\": %g, \"longitude\": 0, \"altitude\": 1000, \"speed\": 10}, "
             "\"fragments\": [%s]}", latitude, fragments);
    return dragarc_footprint_spec_parse(text, sp, e);
}

TEST(bad_footprint_scenarios_name_the_field)
{
    dragarc_footprint_spec sp;
    dragarc_error e;
    const char *plate = "{\"mass\": 1, \"area\": 0.1, \"drag\": {\"model\": \"constant\", \"cd\": 1}}";
    CHECK(parse_with(plate, 91.0, &sp, &e) == DRAGARC_EINVAL && strcmp(e.field, "breakup.latitude") == 0);
    CHECK(parse_with("{\"mass\": 1, \"area\": 0.1, \"ballistic_coefficient\": 3, \"drag\": {\"model\": "
                     "\"constant\", \"cd\": 1}}", 1.0, &sp, &e) == DRAGARC_EINVAL &&
          strcmp(e.field, "fragments[0].area") == 0);
    CHECK(parse_with("{\"mass\": -1, \"area\": 0.1, \"drag\": {\"model\": \"constant\", \"cd\": 1}}", 1.0, &sp,
                     &e) == DRAGARC_EINVAL && strcmp(e.field, "fragments[0].mass") == 0);
    /* beta = m / (C_D A): a ballistic coefficient sets the area */
    CHECK(parse_with("{\"mass\": 4, \"ballistic_coefficient\": 50, \"drag\": {\"model\": \"constant\", \"cd\": 0.8}}",
                     1.0, &sp, &e) == DRAGARC_OK);
    CHECK_REL(sp.classes[0].area, 4.0 / (0.8 * 50.0), 1e-15);
    CHECK_REL(dragarc_fragment_beta(&sp.classes[0]), 50.0, 1e-15);
    dragarc_footprint_spec_clear(&sp);
}

TEST(a_csv_catalogue_flies_as_the_same_classes_in_the_scenario)
{
    /* The same two classes (one with a drag law named in drag_laws) from a CSV file and from the scenario's own
     * array: the same classes, so the same impacts bit for bit. */
    dragarc_footprint_spec a, b;
    dragarc_error e;
    CHECK(dragarc_footprint_spec_read(DATA_DIR "/footprint-catalogue.json", &a, &e) == DRAGARC_OK);
    CHECK(dragarc_footprint_spec_read(DATA_DIR "/footprint-array.json", &b, &e) == DRAGARC_OK);
    CHECK(a.nclasses == 2 && b.nclasses == 2 && strcmp(a.classes[1].name, "case") == 0);
    CHECK(a.classes[1].cone_half_angle == b.classes[1].cone_half_angle && a.classes[0].dv == DRAGARC_DV_MAXWELLIAN);
    dragarc_impact *ia = fly(&a), *ib = fly(&b);
    CHECK(memcmp(ia, ib, a.nclasses * a.samples * sizeof *ia) == 0);
    free(ia), free(ib);
    dragarc_footprint_spec_clear(&a);
    dragarc_footprint_spec_clear(&b);
    /* a bad row is named by file, line and column */
    char text[] = "mass,area,drag\n1,0.1,1\n-2,0.1,1\n";
    dragarc_fragment_class *c = NULL;
    size_t n = 0;
    CHECK(dragarc_fragment_catalogue_parse(text, NULL, 0, &c, &n, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "line 3: mass") == 0);
    char text2[] = "mass,area,drag\n1,0.1,steel\n";
    CHECK(dragarc_fragment_catalogue_parse(text2, NULL, 0, &c, &n, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "line 2: drag") == 0);
}

TEST(a_spherical_earth_turns_about_the_breakup_latitude)
{
    /* A dense body (terminal speed about 400 m/s) let go at rest 10 km up over a turning sphere, the breakup's
     * latitude taken for the Earth's:
     * - it lands east of the point below (Coriolis: Landau & Lifshitz, Mechanics, section 39, problem 1, eastward
     *   in both hemispheres), close to the vacuum value (1/3) w cos(phi) sqrt(8 h^3 / g) = 14.11 m at 50 degrees
     *   (drag lengthens the fall a little and slows its end; within 1 %, printed);
     * - it drifts toward the equator by the centrifugal term's horizontal part, a_h = w^2 R sin(phi) cos(phi),
     *   over the fall: a_h h / g in vacuum (both accelerations constant), 17.03 m; within 2 %: drag acts almost
     *   along the vertical, and inverse-square gravity changes g by 0.3 % over 10 km. The frame's "up" is the
     *   sphere's radius, not the plumb line (docs/footprint.md says what that means for a real Earth);
     * on a flat Earth it lands straight below. */
    const char *fmt = "{\"breakup\": {\"latitude\": %g, \"longitude\": 10, \"altitude\": 10000, \"speed\": 0},"
                      " \"fragments\": [{\"mass\": 50, \"area\": 0.01, \"drag\": {\"model\": \"constant\", "
                      "\"cd\": 0.5}}], \"footprint\": {\"samples\": 1}%s}";
    const double lat[2] = {50.0, -50.0};
    for (int k = 0; k < 2; k++) {
        char text[512];
        dragarc_footprint_spec sp;
        dragarc_error e;
        dragarc_impact o;
        snprintf(text, sizeof text, fmt, lat[k], ", \"environment\": {\"earth\": {\"model\": \"spherical\"}}");
        CHECK(dragarc_footprint_spec_parse(text, &sp, &e) == DRAGARC_OK);
        CHECK_REL(sp.base.earth.latitude, lat[k] * DEG, 1e-15);
        CHECK(dragarc_footprint_run(&sp, &o, NULL, NULL, NULL) == DRAGARC_OK && o.status == DRAGARC_OK);
        double vac = 1.0 / 3.0 * 7.2921150e-5 * cos(lat[k] * DEG) * sqrt(8.0 * 1e12 / 9.80665);
        printf("  dropped from 10 km at %+.0f deg: lands %.3f m east, %.3f m north (vacuum %.3f m east)\n", lat[k],
               o.east, o.north, vac);
        double drift = 7.2921150e-5 * 7.2921150e-5 * 6371008.8 * sin(fabs(lat[k]) * DEG) * cos(lat[k] * DEG) /
                       9.80665 * 1e4;
        CHECK_REL(o.east, vac, 0.01);
        CHECK_REL(-o.north * (lat[k] > 0 ? 1.0 : -1.0), drift, 0.02);
        dragarc_footprint_spec_clear(&sp);
        snprintf(text, sizeof text, fmt, lat[k], "");
        CHECK(dragarc_footprint_spec_parse(text, &sp, &e) == DRAGARC_OK);
        CHECK(dragarc_footprint_run(&sp, &o, NULL, NULL, NULL) == DRAGARC_OK && o.east == 0.0 && o.north == 0.0);
        dragarc_footprint_spec_clear(&sp);
    }
}

int main(void)
{
    dragarc_init();
    RUN(the_same_seed_gives_the_same_impacts_on_any_thread_count);
    RUN(ranges_flown_apart_and_put_back_are_the_whole_run);
    RUN(small_spreads_scatter_as_the_linearised_propagation_says);
    RUN(bad_footprint_scenarios_name_the_field);
    RUN(a_csv_catalogue_flies_as_the_same_classes_in_the_scenario);
    RUN(a_spherical_earth_turns_about_the_breakup_latitude);
    return check_summary();
}
