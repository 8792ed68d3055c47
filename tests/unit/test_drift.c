/* test_drift.c: spray drift: conservation of the spray's volume, and drift that rises with wind and release height
 * and falls with drop size (the physics, checked numerically).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "check.h"
#include "dragarc/drift.h"
#include "helpers.h"

/* An invented boom nozzle: 0.5 m up, a 15 m/s jet straight down, drops of a log-normal spectrum, 25 degC, 45 %. */
static void boom(dragarc_scenario *s, double wind, double height)
{
    make_scenario(s, 1.2, 998.2 * PI * 1e-12 / 6.0, 1e-4, height, 15.0, -90.0, 9.80665, 1e-8);
    s->projectile.density = 998.2;
    s->projectile.drag.model = DRAGARC_DRAG_SPHERE;
    s->projectile.evaporation.enabled = 1;
    s->projectile.evaporation.nonvolatile_fraction = 0.01;
    s->atmosphere.model = DRAGARC_ATMOSPHERE_LOCAL;
    s->atmosphere.temperature = 298.15;
    s->atmosphere.pressure = 100000.0;
    s->atmosphere.relative_humidity = 0.45;
    s->wind.model = DRAGARC_WIND_LOG;
    s->wind.speed = wind;
    s->wind.from = 270.0 * DEG;
    s->wind.ref_height = 2.0;
    s->wind.roughness = 0.05;
    s->solver.max_time = 600.0;
}

static dragarc_spectrum_class CL[30];

static void spectrum(void)
{
    dragarc_spectrum sp = {0};
    CHECK(dragarc_spectrum_log_normal_span(&sp, 250e-6, 1.2, NULL) == DRAGARC_OK);
    CHECK(dragarc_spectrum_discretise(&sp, 30, DRAGARC_SPECTRUM_GEOMETRIC, CL, NULL) == DRAGARC_OK);
    dragarc_spectrum_clear(&sp);
}

static double run(double wind, double height, dragarc_drift_result *r)
{
    dragarc_scenario s;
    boom(&s, wind, height);
    const double travel[2] = {0.0, 2.0};
    CHECK(dragarc_drift_run(&s, travel, CL, 30, 0.5, 5.0, r, NULL) == DRAGARC_OK);
    return r->distance90;
}

TEST(the_spray_volume_is_conserved)
{
    /* deposited + evaporated + aloft + failed = emitted, and the deposit per metre integrates to the deposited
     * share (round-off: 1e-12) */
    dragarc_drift_result r;
    run(3.0, 0.5, &r);
    CHECK_ABS(r.deposited_fraction + r.evaporated_fraction + r.aloft_fraction + r.failed_fraction, 1.0, 1e-12);
    double sum = 0.0;
    for (size_t b = 0; b < r.nbins; b++)
        sum += r.deposit[b] * r.bin_width;
    CHECK_ABS(sum, r.deposited_fraction, 1e-12);
    double per_class = 0.0;
    for (size_t k = 0; k < r.nbins * r.nclasses; k++)
        per_class += r.class_deposit[k] * r.bin_width;
    CHECK_ABS(per_class, r.deposited_fraction, 1e-12);
    printf("  3 m/s: deposited %.4f, evaporated %.4f, aloft %.4f; 90 %% within %.2f m, 99 %% within %.2f m; "
           "%.4f beyond 5 m; drops under %.0f um land beyond it\n",
           r.deposited_fraction, r.evaporated_fraction, r.aloft_fraction, r.distance90, r.distance99, r.beyond_buffer,
           r.diameter_at_buffer * 1e6);
    CHECK(r.failed_fraction == 0.0);
    dragarc_drift_clear(&r);
}

TEST(the_volume_deposited_within_a_distance_runs_from_nothing_to_the_deposited_share)
{
    /* The running integral of the deposit: 0 before the first bin, the deposited share beyond the last, 90 % of the
     * emitted volume at distance90 (both interpolate linearly within a bin: round-off, 1e-12), the complement of
     * beyond_buffer at the buffer (the same sum), and never falling. */
    dragarc_drift_result r;
    run(3.0, 0.5, &r);
    CHECK(dragarc_drift_deposited_within(&r, r.first_bin - 1.0) == 0.0);
    CHECK_ABS(dragarc_drift_deposited_within(&r, r.first_bin + (r.nbins + 1) * r.bin_width), r.deposited_fraction,
              1e-12);
    CHECK(isfinite(r.distance90));
    CHECK_ABS(dragarc_drift_deposited_within(&r, r.distance90), 0.9, 1e-12);
    CHECK(dragarc_drift_deposited_within(&r, r.buffer) == 1.0 - r.beyond_buffer);
    double last = 0.0;
    int rising = 1;
    for (double x = r.first_bin; x < r.first_bin + r.nbins * r.bin_width; x += 0.1 * r.bin_width) {
        double v = dragarc_drift_deposited_within(&r, x);
        rising = rising && v >= last;
        last = v;
    }
    CHECK(rising);
    dragarc_drift_clear(&r);
}

TEST(drift_rises_with_wind_and_height_and_falls_with_drop_size)
{
    dragarc_drift_result a, b, c;
    run(2.0, 0.5, &a);
    run(5.0, 0.5, &b);
    run(2.0, 1.0, &c);
    printf("  beyond 5 m: %.4f (2 m/s, 0.5 m), %.4f (5 m/s), %.4f (1 m up)\n", a.beyond_buffer, b.beyond_buffer,
           c.beyond_buffer);
    CHECK(b.beyond_buffer > a.beyond_buffer && c.beyond_buffer > a.beyond_buffer);
    CHECK(b.distance90 > a.distance90 && c.distance90 > a.distance90);
    /* among the drops that land, a larger one lands nearer (in this wind, from this boom) */
    for (size_t i = 1; i < 30; i++)
        if (b.classes[i].outcome == DRAGARC_DRIFT_LANDED && b.classes[i - 1].outcome == DRAGARC_DRIFT_LANDED)
            CHECK(b.classes[i].downwind < b.classes[i - 1].downwind);
    dragarc_drift_clear(&a);
    dragarc_drift_clear(&b);
    dragarc_drift_clear(&c);
}

int main(void)
{
    dragarc_init();
    spectrum();
    RUN(the_spray_volume_is_conserved);
    RUN(the_volume_deposited_within_a_distance_runs_from_nothing_to_the_deposited_share);
    RUN(drift_rises_with_wind_and_height_and_falls_with_drop_size);
    return check_summary();
}
