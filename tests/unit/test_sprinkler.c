/* test_sprinkler.c: a sprinkler's drops and the water they lay down: nozzle laws, symmetry, part circles,
 * conservation of the water, and the physics of throw.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <stdlib.h>

#include "check.h"
#include "dragarc/sprinkler.h"
#include "helpers.h"

/* An invented garden sprinkler: 4 mm nozzle at 2.5 bar, 0.6 m up, 25 deg, drops 0.3 to 3 mm. */
static void base_drop(dragarc_scenario *s, double wind, int evaporate)
{
    make_scenario(s, 1.2, 998.2 * PI * 1e-9 / 6.0, 1e-3, 0.6, 0.0, 25.0, 9.80665, 1e-9);
    s->projectile.density = 998.2;
    s->projectile.drag.model = DRAGARC_DRAG_SPHERE;
    s->atmosphere.model = DRAGARC_ATMOSPHERE_LOCAL;
    s->atmosphere.temperature = 300.15;
    s->atmosphere.pressure = 100000.0;
    s->atmosphere.relative_humidity = 0.35;
    s->projectile.evaporation.enabled = evaporate;
    s->projectile.evaporation.nonvolatile_fraction = 0.0;
    if (wind > 0.0) {
        s->wind.model = DRAGARC_WIND_CONSTANT;
        s->wind.speed = wind;
        s->wind.from = 270.0 * DEG;
    }
}

static double D[10], F[10];

static void request(dragarc_sprinkler_request *q, double arc_deg, size_t ndir)
{
    for (int i = 0; i < 10; i++)
        D[i] = 0.3e-3 * pow(10.0, i / 9.0), F[i] = 0.1;
    memset(q, 0, sizeof *q);
    q->nozzle = (dragarc_nozzle){4e-3, 2.5e5, 0.95, 0.9, 998.2};
    q->arc_from = 0.0;
    q->arc_to = arc_deg * DEG;
    q->ndirections = ndir;
    q->nclasses = 10;
    q->diameters = D;
    q->fractions = F;
    q->ring_width = 0.25;
    q->cell = 0.5;
}

TEST(the_nozzle_follows_bernoulli_and_the_orifice_equation)
{
    /* v = C_v sqrt(2 dp / rho), Q = C_d A sqrt(2 dp / rho) (closed forms of any hydraulics text) */
    dragarc_nozzle n = {4e-3, 2.5e5, 0.95, 0.9, 998.2};
    double vj = sqrt(2.0 * 2.5e5 / 998.2);
    CHECK_REL(dragarc_nozzle_exit_speed(&n), 0.95 * vj, 1e-15);
    CHECK_REL(dragarc_nozzle_flow(&n), 0.9 * PI * 4e-6 * vj, 1e-15);
    dragarc_error e;
    n.discharge_coefficient = 0.97;
    CHECK(dragarc_nozzle_check(&n, &e) == DRAGARC_EINVAL && strcmp(e.field, "discharge_coefficient") == 0);
}

TEST(a_still_air_pattern_is_round_and_conserves_the_water)
{
    dragarc_scenario s;
    dragarc_sprinkler_request q;
    dragarc_sprinkler_result r;
    base_drop(&s, 0.0, 0);
    request(&q, 360.0, 36);
    CHECK(dragarc_sprinkler_run(&s, &q, &r, NULL) == DRAGARC_OK);
    /* every direction throws a class equally far (rotational symmetry of still air). The error control weighs
     * each component by its own size, so turning the launch changes the steps: the throws agree to the global
     * error of rtol 1e-9 over about a hundred steps, 1e-7 relative. */
    for (size_t i = 0; i < 10; i++)
        for (size_t j = 1; j < 36; j++)
            CHECK_ABS(r.drops[i * 36 + j].distance, r.drops[i * 36].distance, 1e-7 * r.drops[i * 36].distance);
    /* larger drops carry farther from the same nozzle (drag per unit mass falls as 1/d) */
    for (size_t i = 1; i < 10; i++)
        CHECK(r.drops[i * 36].distance > r.drops[(i - 1) * 36].distance);
    /* nothing evaporates here: all the water lands, to round-off */
    CHECK_ABS(r.deposited_fraction, 1.0, 1e-12);
    CHECK(r.evaporated_fraction == 0.0 && r.nfailed == 0);
    /* the radial profile holds the whole flow: sum of rate x ring area = Q */
    double q_back = 0.0;
    for (size_t k = 0; k < r.nrings; k++)
        q_back += r.ring_rate[k] / 3.6e6 * PI * (2.0 * k + 1.0) * 0.25 * 0.25;
    CHECK_REL(q_back, r.flow, 1e-12);
    double g_back = 0.0;
    for (size_t k = 0; k < r.nx * r.ny; k++)
        g_back += r.grid_rate[k] / 3.6e6 * r.cell * r.cell;
    CHECK_REL(g_back, r.flow, 1e-12);
    printf("  jet %.3f m/s, %.3f L/min; throw %.2f m (0.3 mm) to %.2f m (3 mm); wetted radius %.2f m\n", r.exit_speed,
           r.flow * 6e4, r.drops[0].distance, r.drops[9 * 36].distance, r.wetted_radius);
    CHECK(r.wetted_radius > r.drops[0].distance && r.wetted_radius <= r.drops[9 * 36].distance + 0.5);
    dragarc_sprinkler_clear(&r);
}

TEST(a_half_circle_lays_twice_the_depth_on_half_the_ground)
{
    /* The same flow over half the arc: the same throws, every ring's rate doubled (the water per ring is the
     * same, the wetted area half). */
    dragarc_scenario s;
    dragarc_sprinkler_request q;
    dragarc_sprinkler_result full, half;
    base_drop(&s, 0.0, 0);
    request(&q, 360.0, 24);
    CHECK(dragarc_sprinkler_run(&s, &q, &full, NULL) == DRAGARC_OK);
    request(&q, 180.0, 13);
    CHECK(dragarc_sprinkler_run(&s, &q, &half, NULL) == DRAGARC_OK);
    CHECK(full.nrings == half.nrings);
    for (size_t k = 0; k < full.nrings && k < half.nrings; k++)
        CHECK_ABS(half.ring_rate[k], 2.0 * full.ring_rate[k], 1e-9 * (1.0 + full.ring_rate[k]));
    /* all of a half circle's water lands east of the north-south line (arc 0 to 180 deg) */
    double west = 0.0;
    for (size_t j = 0; j < half.ny; j++)
        for (size_t i = 0; i < half.nx; i++)
            if (half.x0 + (i + 1) * half.cell <= -half.cell)
                west += half.grid_rate[j * half.nx + i];
    CHECK(west == 0.0);
    dragarc_sprinkler_clear(&full);
    dragarc_sprinkler_clear(&half);
}

TEST(wind_carries_the_pattern_downwind_and_evaporation_is_accounted)
{
    dragarc_scenario s;
    dragarc_sprinkler_request q;
    dragarc_sprinkler_result calm, windy;
    base_drop(&s, 0.0, 1);
    request(&q, 360.0, 36);
    CHECK(dragarc_sprinkler_run(&s, &q, &calm, NULL) == DRAGARC_OK);
    base_drop(&s, 4.0, 1);
    CHECK(dragarc_sprinkler_run(&s, &q, &windy, NULL) == DRAGARC_OK);
    /* the water's centre of mass: at the sprinkler in calm air, downwind (east, the wind is from the west) in wind */
    double cx[2] = {0, 0}, tot[2] = {0, 0};
    dragarc_sprinkler_result *rr[2] = {&calm, &windy};
    for (int k = 0; k < 2; k++)
        for (size_t j = 0; j < rr[k]->ny; j++)
            for (size_t i = 0; i < rr[k]->nx; i++) {
                double w = rr[k]->grid_rate[j * rr[k]->nx + i];
                cx[k] += w * (rr[k]->x0 + (i + 0.5) * rr[k]->cell), tot[k] += w;
            }
    printf("  centre of the water: calm %.3f m, 4 m/s wind %.3f m east; evaporated %.4f %% and %.4f %% of the flow\n",
           cx[0] / tot[0], cx[1] / tot[1], 100.0 * calm.evaporated_fraction, 100.0 * windy.evaporated_fraction);
    CHECK_ABS(cx[0] / tot[0], 0.0, 0.05);
    CHECK(cx[1] / tot[1] > 0.5);
    /* deposited + evaporated = emitted, to round-off */
    CHECK_ABS(calm.deposited_fraction + calm.evaporated_fraction, 1.0, 1e-12);
    CHECK_ABS(windy.deposited_fraction + windy.evaporated_fraction, 1.0, 1e-12);
    CHECK(calm.evaporated_fraction > 0.0 && calm.evaporated_fraction < 0.05);
    dragarc_sprinkler_clear(&calm);
    dragarc_sprinkler_clear(&windy);
}

TEST(a_layout_spreads_the_flow_over_its_cell)
{
    /* Sprinklers on a square of side S each water one S x S cell on average, so the mean rate over the cell is
     * Q (deposited share) / S^2 (conservation of the water). The overlap samples the pattern at 20 x 20 points
     * of the cell, bilinear between the grid's 0.5 m cells: a midpoint rule on a pattern that varies over about
     * a metre, whose error (about (0.5 m / S)^2 of the rate's second differences) stays well under 1 %. */
    dragarc_sprinkler_spec sp;
    memset(&sp, 0, sizeof sp);
    base_drop(&sp.base, 0.0, 1);
    sp.nozzle = (dragarc_nozzle){4e-3, 2.5e5, 0.95, 0.9, 998.2};
    sp.arc_from = 0.0, sp.arc_to = 2.0 * PI, sp.ndirections = 36;
    CHECK(dragarc_spectrum_rosin_rammler(&sp.spectrum, 1.1e-3, 2.3, NULL) == DRAGARC_OK);
    sp.nclasses = 20, sp.spacing = DRAGARC_SPECTRUM_GEOMETRIC;
    sp.ring_width = 0.25, sp.cell = 0.5;
    sp.layout_given = 1, sp.layout = (dragarc_layout){DRAGARC_LAYOUT_SQUARE, 9.0, 9.0}, sp.layout_points = 20;
    dragarc_spectrum_class cl[20];
    dragarc_sprinkler_result r;
    CHECK(dragarc_sprinkler_spec_run(&sp, cl, NULL, NULL, &r, NULL) == DRAGARC_OK);
    double want = r.flow * r.deposited_fraction / 81.0 * 3.6e6;
    printf("  square 9 m: mean %.4f mm/h against Q / S^2 = %.4f mm/h; CU %.1f %%, DU %.1f %%\n", r.layout_stats.mean,
           want, r.layout_stats.cu, r.layout_stats.du_lq);
    CHECK(r.layout_done);
    CHECK_REL(r.layout_stats.mean, want, 1e-2);
    CHECK(r.layout_stats.cu > 0.0 && r.layout_stats.cu <= 100.0);
    /* the overlap behind those statistics, as the plot draws it: the same numbers exactly */
    dragarc_overlap ov;
    CHECK(dragarc_sprinkler_overlap(&r, &sp.layout, sp.layout_points, &ov, NULL) == DRAGARC_OK);
    CHECK(ov.nx == 20 && ov.ny == 20 && ov.width == 9.0 && ov.height == 9.0);
    CHECK(memcmp(&ov.stats, &r.layout_stats, sizeof ov.stats) == 0);
    dragarc_overlap_clear(&ov);
    dragarc_sprinkler_clear(&r);
    dragarc_spectrum_clear(&sp.spectrum);
}

typedef struct seen {
    size_t calls, last_done, last_total;
} seen;
static void count(size_t done, size_t total, void *user)
{
    seen *s = user;
    s->calls++, s->last_done = done, s->last_total = total;
}

TEST(a_progress_callback_sees_every_flight_and_changes_nothing)
{
    /* the same flights with and without the callback: bit for bit the same drops, rings and cells */
    dragarc_scenario s;
    dragarc_sprinkler_request q;
    dragarc_sprinkler_result a, b;
    base_drop(&s, 2.0, 0);
    request(&q, 360.0, 36);
    CHECK(dragarc_sprinkler_run(&s, &q, &a, NULL) == DRAGARC_OK);
    seen got = {0, 0, 0};
    q.progress = count, q.progress_user = &got;
    CHECK(dragarc_sprinkler_run(&s, &q, &b, NULL) == DRAGARC_OK);
    CHECK(got.calls >= 1 && got.last_done == 360 && got.last_total == 360);
    CHECK(a.nx == b.nx && a.ny == b.ny && a.nrings == b.nrings);
    CHECK(memcmp(a.drops, b.drops, 360 * sizeof *a.drops) == 0);
    CHECK(memcmp(a.grid_rate, b.grid_rate, a.nx * a.ny * sizeof *a.grid_rate) == 0);
    CHECK(memcmp(a.ring_rate, b.ring_rate, a.nrings * sizeof *a.ring_rate) == 0);
    dragarc_sprinkler_clear(&a);
    dragarc_sprinkler_clear(&b);
    dragarc_scenario_clear(&s);
}

TEST(bad_requests_name_the_field)
{
    dragarc_scenario s;
    dragarc_sprinkler_request q;
    dragarc_sprinkler_result r;
    dragarc_error e;
    base_drop(&s, 0.0, 0);
    request(&q, 360.0, 36);
    F[3] = 0.2;
    CHECK(dragarc_sprinkler_run(&s, &q, &r, &e) == DRAGARC_EINVAL && strcmp(e.field, "fractions") == 0);
    dragarc_sprinkler_clear(&r);
    request(&q, 0.0, 36);
    CHECK(dragarc_sprinkler_run(&s, &q, &r, &e) == DRAGARC_EINVAL && strcmp(e.field, "arc") == 0);
    dragarc_sprinkler_clear(&r);
    request(&q, 360.0, 36);
    q.nozzle.pressure = -1.0;
    CHECK(dragarc_sprinkler_run(&s, &q, &r, &e) == DRAGARC_EINVAL && strcmp(e.field, "nozzle.pressure") == 0);
    dragarc_sprinkler_clear(&r);
}

int main(void)
{
    dragarc_init();
    RUN(the_nozzle_follows_bernoulli_and_the_orifice_equation);
    RUN(a_still_air_pattern_is_round_and_conserves_the_water);
    RUN(a_half_circle_lays_twice_the_depth_on_half_the_ground);
    RUN(wind_carries_the_pattern_downwind_and_evaporation_is_accounted);
    RUN(a_layout_spreads_the_flow_over_its_cell);
    RUN(a_progress_callback_sees_every_flight_and_changes_nothing);
    RUN(bad_requests_name_the_field);
    return check_summary();
}
