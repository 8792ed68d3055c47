/* test_optimize.c: the launch that carries farthest, against closed forms, against `aim`'s own maximum-range
 * search, and against grid searches around it; the bounds, the sensitivities and the failure paths.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Sources (closed forms, exact):
 *  - vacuum, level ground: R(theta) = v^2 sin(2 theta) / g, greatest at theta = 45 deg with R = v^2 / g,
 *    where R'' = -4 v^2 / g per rad^2;
 *  - vacuum, launch from height h above the landing plane: the best elevation is
 *    theta* = asin(1 / sqrt(2 + 2 g h / v^2)) and reaches Rmax = (v / g) sqrt(v^2 + 2 g h) (Lichtenberg, D. B. &
 *    Wills, J. G. 1978, "Maximizing the range of the shot put", Am. J. Phys. 46:546); Rmax grows with v and h.
 * Tolerances. Vacuum flights at rtol = atol = 1e-10 are polynomials the integrator follows to rounding, and
 * their ranges agree with the closed form to 1e-8 relative (test_closed_forms.c, test_sweep.c), which is
 * asked here of the optimum range. The optimum's position is only as good as the range near a flat
 * maximum allows: a range error dR moves the arg-max by sqrt(2 dR / |R''|), about 1e-8 rad for dR = 1e-13 R
 * (the vacuum flights) and 3e-7 rad for dR = 1e-10 R; Brent stops on an interval of 1e-7 of the 80 degree
 * width (1.4e-7 rad), so the 1e-6 rad asked of the elevation leaves a margin of 3 or more.
 */
#include "check.h"
#include "helpers.h"
#include "dragarc/aim.h"
#include "dragarc/optimize.h"

#define G 9.81

static int solve(const dragarc_scenario *s, dragarc_optimize_request *q, dragarc_optimize_result *r)
{
    dragarc_error e;
    int rc = dragarc_optimize_solve(s, q, r, &e);
    if (rc != DRAGARC_OK)
        printf("  optimize: %s: %s\n", e.field, e.message);
    else
        for (size_t i = 0; i < q->nvars; i++)
            printf("  %s = %.10g (bound %d), slope %.3g, curvature %.6g; objective %.12g m, %s, %d iterations, %s, "
                   "%ld flights (%ld failed)\n",
                   q->vars[i].param->alias, r->x[i], r->bound[i], r->slope[i], r->curvature[i], r->objective,
                   r->method, r->iterations, r->converged ? "converged" : r->note, r->flights, r->failed);
    return rc;
}

static void add(dragarc_optimize_request *q, const char *name, double lo, double hi)
{
    dragarc_error e;
    int rc = dragarc_optimize_add(q, name, lo, hi, &e);
    if (rc != DRAGARC_OK)
        printf("  add %s: %s: %s\n", name, e.field, e.message);
    CHECK(rc == DRAGARC_OK);
}

/* A baseball-sized ball (145 g, 74 mm, Cd 0.35) with backspin and the Sawicki et al. (2003) lift fit, from
 * 1 m at 45 m/s, flown at rtol = atol = 1e-10. Invented numbers, not a measured ball. */
static int spinning_ball(dragarc_scenario *s, double rpm)
{
    char text[640];
    snprintf(text, sizeof text,
             "{\"projectile\": {\"mass\": 0.145, \"diameter\": 0.074,"
             " \"drag\": {\"model\": \"constant\", \"cd\": 0.35},"
             " \"lift\": {\"model\": \"sawicki2003\"}},"
             " \"launch\": {\"speed\": 45, \"elevation\": 25, \"height\": 1, \"spin\": {\"rate\": %.17g}},"
             " \"solver\": {\"rtol\": 1e-10, \"atol\": 1e-10}}",
             rpm);
    dragarc_error e;
    int rc = dragarc_scenario_parse(text, NULL, NULL, s, &e);
    if (rc != DRAGARC_OK)
        printf("  scenario: %s: %s\n", e.field, e.message);
    return rc;
}

/* Optimise s over the one parameter `name` within lo..hi, into a fresh request *q and *r. */
static int solve1(const dragarc_scenario *s, const char *name, double lo, double hi, dragarc_optimize_request *q,
                  dragarc_optimize_result *r)
{
    dragarc_optimize_request_default(q);
    add(q, name, lo, hi);
    return solve(s, q, r);
}

/* The spinning ball at `rpm`, optimised over `name` within lo..hi. */
static int spinning_solve1(double rpm, const char *name, double lo, double hi, dragarc_scenario *s,
                           dragarc_optimize_request *q, dragarc_optimize_result *r)
{
    int rc = spinning_ball(s, rpm);
    return rc == DRAGARC_OK ? solve1(s, name, lo, hi, q, r) : rc;
}

static double carry_at(const dragarc_scenario *s, const dragarc_optimize_request *q, const double *x)
{
    dragarc_scenario t = *s;
    dragarc_flight f;
    double v = -INFINITY;
    if (dragarc_optimize_apply(&t, q, x, NULL) == DRAGARC_OK && dragarc_flight_run(&t, 0.0, &f, NULL) == DRAGARC_OK)
        v = f.range;
    dragarc_flight_clear(&f);
    return v;
}

TEST(vacuum_from_the_ground_carries_farthest_at_45_degrees)
{
    dragarc_scenario s;
    const double v = 30.0;
    make_scenario(&s, 0.0, 0.2, 0.05, 0.0, v, 10.0, G, 1e-10);
    dragarc_optimize_request q;
    dragarc_optimize_request_default(&q);
    double lo, hi;
    CHECK(dragarc_optimize_default_bounds(&s, "elevation", &lo, &hi, NULL) == DRAGARC_OK && lo == 0.0 && hi == 80.0);
    add(&q, "elevation", lo, hi);
    dragarc_optimize_result r;
    CHECK(solve(&s, &q, &r) == DRAGARC_OK);
    CHECK_ABS(r.x[0] * DEG, 0.25 * PI, 1e-6);
    CHECK_REL(r.objective, v * v / G, 1e-8);
    CHECK(r.objective == r.flight.range && r.bound[0] == 0 && r.converged && strcmp(r.method, "brent") == 0);
    /* The launch at 0 deg from the ground cannot start: it counts as a failed trial, not an error. */
    CHECK(r.failed >= 1 && r.flights > r.failed);
    /* Curvature: R'' = -4 v^2 / g per rad^2, and the central second difference of sin 2 theta with step H
     * (here 0.8 deg) is exactly R'' (sin H / H)^2, 6.5e-5 below it. The flights' rounding (1e-13 of 92 m)
     * over H^2 adds 2e-11 m/deg^2, and the arg-max error (1e-8 rad) changes R'' by a second-order amount
     * (R''' = 0 at 45 deg): 1e-6 relative is asked of the difference's closed form. The slope is zero at the
     * maximum; its difference (h = 0.08 deg) is off by R''' h^2 / 6 = 0 plus the rounding 1e-11 m / h, and
     * the arg-max error 1e-8 rad costs R'' x 6e-7 deg = 7e-8 m/deg: 1e-6 m/deg is asked. */
    const double H = r.curvature_step[0] * DEG;
    CHECK_REL(r.curvature[0], -4.0 * v * v / G * DEG * DEG * (sin(H) / H) * (sin(H) / H), 1e-6);
    CHECK_REL(r.curvature[0], -4.0 * v * v / G * DEG * DEG, 1e-4);
    CHECK_ABS(r.slope[0], 0.0, 1e-6);
    CHECK(r.step[0] == 1e-3 * 80.0 && r.curvature_step[0] == 10.0 * r.step[0]);
    dragarc_optimize_clear(&r);
    CHECK(r.flight.points == NULL);
    dragarc_optimize_clear(&r); /* twice is harmless */
    dragarc_optimize_clear(NULL);
}

TEST(vacuum_from_a_height_matches_lichtenberg_and_wills)
{
    const double cases[][2] = {{14.0, 2.0}, {10.0, 20.0}, {50.0, 1.0}}; /* v m/s, h m */
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        const double v = cases[i][0], h = cases[i][1];
        dragarc_scenario s;
        make_scenario(&s, 0.0, 7.26, 0.12, h, v, 40.0, G, 1e-10);
        dragarc_optimize_request q;
        dragarc_optimize_result r;
        CHECK(solve1(&s, "elevation", 0.0, 80.0, &q, &r) == DRAGARC_OK);
        CHECK_ABS(r.x[0] * DEG, asin(1.0 / sqrt(2.0 + 2.0 * G * h / (v * v))), 1e-6);
        CHECK_REL(r.objective, v / G * sqrt(v * v + 2.0 * G * h), 1e-8);
        CHECK(r.bound[0] == 0 && r.converged);
        dragarc_optimize_clear(&r);
    }
}

TEST(quadratic_drag_optimum_is_below_45_degrees_where_aim_finds_its_maximum_range)
{
    /* Source: `dragarc aim` (src/numerics/aim.c) refines the elevation of greatest range by its own scan and
     * Brent minimiser; the two searches of the same function must agree. Both are flown at rtol = atol =
     * 1e-12 so that the range's own error (1e-12 of 145 m) moves the flat maximum by at most 1e-8 rad; the
     * searches stop on intervals of 1e-10 rad (aim) and 1.4e-7 rad (here): 1e-6 rad is asked. */
    const double cs[] = {1e-3, 5e-3};
    for (size_t i = 0; i < sizeof cs / sizeof cs[0]; i++) {
        dragarc_scenario s;
        make_scenario(&s, 0.0, 1.0, 0.05, 0.0, 40.0, 10.0, G, 1e-12);
        s.projectile.drag.model = DRAGARC_DRAG_QUADRATIC;
        s.projectile.drag.c = cs[i];
        dragarc_aim_request aq;
        dragarc_aim_request_default(&aq);
        aq.range = 10.0;
        dragarc_aim_result ar;
        CHECK(dragarc_aim_solve(&s, &aq, &ar, NULL) == DRAGARC_OK);
        dragarc_optimize_request q;
        dragarc_optimize_result r;
        CHECK(solve1(&s, "elevation", 0.0, 80.0, &q, &r) == DRAGARC_OK);
        CHECK(r.x[0] < 45.0); /* drag lowers the best elevation (Warburton & Wang 2004, fig. 3) */
        CHECK_ABS(r.x[0] * DEG, ar.max_range_elevation, 1e-6);
        CHECK_REL(r.objective, ar.max_range, 1e-10); /* the same flights near the same flat maximum */
        dragarc_optimize_clear(&r);
    }
}

TEST(a_spinning_ball_optimum_is_interior_in_elevation_with_zero_slope_and_no_better_point_around_it)
{
    dragarc_scenario s;
    CHECK(spinning_ball(&s, 2000.0) == DRAGARC_OK);
    dragarc_optimize_request q;
    dragarc_optimize_request_default(&q);
    double lo, hi;
    CHECK(dragarc_optimize_default_bounds(&s, "spin_rate", &lo, &hi, NULL) == DRAGARC_OK && lo == 0.0 && hi == 4000.0);
    add(&q, "elevation", 0.0, 80.0);
    add(&q, "spin_rate", lo, hi);
    dragarc_optimize_result r;
    CHECK(solve(&s, &q, &r) == DRAGARC_OK);
    CHECK(strcmp(r.method, "nmsimplex2") == 0 && r.converged && r.grid == 121 && r.starts >= 1);
    /* With a lift that grows with the spin factor (Sawicki et al. 2003) and a drag that does not, more spin
     * carries farther: the spin stops at its bound, and the carry still rises there. */
    CHECK(r.bound[1] == 1 && r.x[1] == 4000.0 && r.slope[1] > 0.0);
    /* Interior in elevation: below the drag-free 45 deg, inside the bounds, with a maximum's curvature. */
    CHECK(r.bound[0] == 0 && r.x[0] > 5.0 && r.x[0] < 45.0 && r.curvature[0] < 0.0);
    /* Zero slope: the Newton step -F'/F'' from the reported derivatives says how far the true maximum lies.
     * The central difference (h = 0.08 deg) is off by F''' h^2 / 6, about |F''| h^2 / 6 rad = 2e-5 deg of
     * that step, and the simplex stops within (80 deg / 2) x 1e-7: 1e-3 deg is asked. */
    CHECK_ABS(r.slope[0] / r.curvature[0], 0.0, 1e-3);
    /* No better point on a grid around the optimum (+-1 deg by 0.05 deg, spin from the bound down by 10 rpm
     * steps to 400 rpm below it): no flight longer by more than 1e-8 relative, the flights' own accuracy. */
    double worst = -INFINITY;
    for (int i = -20; i <= 20; i++)
        for (int j = 0; j <= 40; j++) {
            double x[2] = {r.x[0] + 0.05 * i, r.x[1] - 10.0 * j};
            worst = fmax(worst, carry_at(&s, &q, x) - r.objective);
        }
    printf("  the best grid point is %.3g m beyond the optimum\n", worst);
    CHECK(worst <= 1e-8 * r.objective);
    dragarc_optimize_clear(&r);
    dragarc_scenario_clear(&s);
}

TEST(the_elevation_optimum_is_the_best_of_a_fine_table_with_lift)
{
    /* The scan exists because lift can give range against elevation more than one local maximum: whatever
     * the shape, the optimum must be no worse than every elevation of a 0.1 deg table (to the flights'
     * accuracy, 1e-8 relative) and lie within one table step of the table's best. */
    dragarc_scenario s;
    dragarc_optimize_request q;
    dragarc_optimize_result r;
    CHECK(spinning_solve1(3000.0, "elevation", 0.0, 80.0, &s, &q, &r) == DRAGARC_OK);
    double best = -INFINITY, at = NAN;
    for (int i = 0; i <= 800; i++) {
        double x = 0.1 * i, v = carry_at(&s, &q, &x);
        if (v > best)
            best = v, at = x;
    }
    CHECK(best <= r.objective * (1.0 + 1e-8));
    CHECK_ABS(r.x[0], at, 0.1);
    dragarc_optimize_clear(&r);
    dragarc_scenario_clear(&s);
}

TEST(a_spin_rate_capped_low_gives_a_constrained_optimum_on_its_bound)
{
    dragarc_scenario s;
    dragarc_optimize_request q;
    dragarc_optimize_result r;
    CHECK(spinning_solve1(2000.0, "spin_rate", 0.0, 1000.0, &s, &q, &r) == DRAGARC_OK);
    CHECK(r.bound[0] == 1 && r.x[0] == 1000.0 && r.converged);
    /* the carry still rises at the cap: the one-sided slope is positive, and the carry there is the bound's */
    CHECK(r.slope[0] > 0.0);
    double x = 1000.0;
    CHECK(r.objective == carry_at(&s, &q, &x));
    dragarc_optimize_clear(&r);
    /* the same with the elevation free too: the spin stays on its bound */
    add(&q, "elevation", 0.0, 80.0);
    CHECK(solve(&s, &q, &r) == DRAGARC_OK);
    CHECK(r.bound[0] == 1 && r.x[0] == 1000.0 && r.bound[1] == 0);
    dragarc_optimize_clear(&r);
    /* a lower bound: with the spin kept between 3000 and 4000 rpm at a fixed 60 deg elevation, the lofted
     * ball balloons and less spin carries farther */
    s.launch.elevation = 60.0 * DEG;
    CHECK(solve1(&s, "spin_rate", 3000.0, 4000.0, &q, &r) == DRAGARC_OK);
    CHECK(r.bound[0] == -1 && r.x[0] == 3000.0 && r.slope[0] < 0.0);
    dragarc_optimize_clear(&r);
    dragarc_scenario_clear(&s);
}

TEST(several_variables_in_vacuum_go_to_their_bounds_and_the_elevation_to_lichtenberg_and_wills)
{
    /* Lichtenberg & Wills (1978): Rmax grows with v and h, so with speed and height bounded the optimum takes
     * both upper bounds, and the elevation is theta*(v_max, h_max). Nelder-Mead in the mapped variables stops
     * on a simplex of 1e-7 rad of the map, so the elevation is within 40 deg x 1e-7 = 7e-8 rad of its
     * optimum plus the flat maximum's 1e-8 rad: 1e-6 rad is asked, and 1e-8 of the range. */
    dragarc_scenario s;
    make_scenario(&s, 0.0, 7.26, 0.12, 1.0, 12.0, 40.0, G, 1e-10);
    dragarc_optimize_request q;
    dragarc_optimize_request_default(&q);
    add(&q, "speed", 10.0, 14.0);
    add(&q, "elevation", 0.0, 80.0);
    add(&q, "height", 0.0, 2.0);
    dragarc_optimize_result r;
    CHECK(solve(&s, &q, &r) == DRAGARC_OK);
    const double v = 14.0, h = 2.0;
    CHECK(r.grid == 216 && r.converged);
    CHECK(r.bound[0] == 1 && r.x[0] == v && r.bound[2] == 1 && r.x[2] == h && r.bound[1] == 0);
    CHECK_ABS(r.x[1] * DEG, asin(1.0 / sqrt(2.0 + 2.0 * G * h / (v * v))), 1e-6);
    CHECK_REL(r.objective, v / G * sqrt(v * v + 2.0 * G * h), 1e-8);
    /* The slopes on the bounds are the partial derivatives at the optimal elevation, which equal the
     * derivatives of Rmax itself (the envelope theorem): dRmax/dh = v / sqrt(v^2 + 2 g h) and
     * dRmax/dv = 2 (v^2 + g h) / (g sqrt(v^2 + 2 g h)). The backward differences are O(h_fd^2) (h_fd = 0.002 m
     * and 0.004 m/s), and the elevation's 1e-6 rad moves them by a second-order amount: 1e-5 relative. */
    CHECK_REL(r.slope[2], v / sqrt(v * v + 2.0 * G * h), 1e-5);
    CHECK_REL(r.slope[0], 2.0 * (v * v + G * h) / (G * sqrt(v * v + 2.0 * G * h)), 1e-5);
    dragarc_optimize_clear(&r);
}

TEST(slopes_and_curvatures_hold_at_the_default_flight_tolerances)
{
    /* The same optimum flown at the default tolerances (rtol 1e-8, atol 1e-6) and at 1e-11. The flights'
     * error, about rtol x 140 m = 1.4e-6 m, enters the curvature as 4 x 1.4e-6 / H^2: 9e-6 m/deg^2 for the
     * elevation (H = 0.8 deg; 7e-5 of it) and 9e-9 m/rpm^2 for the spin (H = 25 rpm; 1 % of it), and the
     * one-sided slope on the spin bound as 4 x 1.4e-6 / h (h = 2.5 rpm): 2.2e-6 m/rpm, 4e-4 of it. Asked:
     * 1e-3, 2e-2 and 1e-3 relative. */
    dragarc_optimize_result r[2];
    for (int k = 0; k < 2; k++) {
        dragarc_scenario s;
        CHECK(spinning_ball(&s, 2000.0) == DRAGARC_OK);
        s.solver.rtol = k ? 1e-11 : 1e-8;
        s.solver.atol = k ? 1e-11 : 1e-6;
        dragarc_optimize_request q;
        dragarc_optimize_request_default(&q);
        add(&q, "elevation", 0.0, 80.0);
        add(&q, "spin_rate", 0.0, 2500.0);
        CHECK(solve(&s, &q, &r[k]) == DRAGARC_OK);
        dragarc_scenario_clear(&s);
    }
    CHECK(r[0].bound[1] == 1 && r[1].bound[1] == 1);
    CHECK_REL(r[0].curvature[0], r[1].curvature[0], 1e-3);
    CHECK_REL(r[0].curvature[1], r[1].curvature[1], 2e-2);
    CHECK_REL(r[0].slope[1], r[1].slope[1], 1e-3);
    dragarc_optimize_clear(&r[0]);
    dragarc_optimize_clear(&r[1]);
}

TEST(total_distance_is_the_carry_without_a_ground_surface)
{
    /* dragarc_flight: without ground.surface the ball rests where it lands, total_distance = range. */
    dragarc_scenario s;
    CHECK(spinning_ball(&s, 2000.0) == DRAGARC_OK);
    dragarc_optimize_request q;
    dragarc_optimize_request_default(&q);
    add(&q, "elevation", 0.0, 80.0);
    dragarc_optimize_result carry, total;
    CHECK(solve(&s, &q, &carry) == DRAGARC_OK);
    q.objective = DRAGARC_OPTIMIZE_TOTAL;
    CHECK(solve(&s, &q, &total) == DRAGARC_OK);
    CHECK(total.x[0] == carry.x[0] && total.objective == carry.objective);
    CHECK(total.flight.total_distance == total.objective);
    dragarc_optimize_objective o;
    CHECK(dragarc_optimize_objective_from_name("total", &o) == DRAGARC_OK && o == DRAGARC_OPTIMIZE_TOTAL);
    CHECK(dragarc_optimize_objective_from_name("carry", &o) == DRAGARC_OK && o == DRAGARC_OPTIMIZE_CARRY);
    CHECK(dragarc_optimize_objective_from_name("height", &o) == DRAGARC_EINVAL);
    CHECK(strcmp(dragarc_optimize_objective_name(DRAGARC_OPTIMIZE_TOTAL), "total") == 0);
    dragarc_optimize_clear(&carry);
    dragarc_optimize_clear(&total);
    dragarc_scenario_clear(&s);
}

TEST(failed_trials_count_as_worst_and_all_failed_is_no_solution)
{
    dragarc_scenario s;
    make_scenario(&s, 0.0, 0.2, 0.05, 0.0, 30.0, 10.0, G, 1e-10);
    dragarc_optimize_request q;
    dragarc_optimize_request_default(&q);
    add(&q, "elevation", -60.0, 60.0); /* from the ground, every launch at or below 0 deg fails */
    dragarc_optimize_result r;
    CHECK(solve(&s, &q, &r) == DRAGARC_OK);
    CHECK_ABS(r.x[0] * DEG, 0.25 * PI, 1e-6);
    CHECK(r.failed >= 16);
    dragarc_optimize_clear(&r);

    /* nothing lands: every trial launched downward from the ground */
    dragarc_optimize_request_default(&q);
    add(&q, "elevation", -60.0, -10.0);
    dragarc_error e;
    CHECK(dragarc_optimize_solve(&s, &q, &r, &e) == DRAGARC_ENOSOLUTION);
    CHECK(strcmp(e.field, "launch.height") == 0 && strstr(e.message, "all 33 trial flights failed") != NULL);
    CHECK(r.flights == 33 && r.failed == 33 && isnan(r.objective) && r.flight.points == NULL);
    dragarc_optimize_clear(&r);

    /* nothing lands in time: the same */
    s.solver.max_time = 0.1;
    dragarc_optimize_request_default(&q);
    add(&q, "elevation", 10.0, 80.0);
    CHECK(dragarc_optimize_solve(&s, &q, &r, &e) == DRAGARC_ENOSOLUTION && strcmp(e.field, "solver.max_time") == 0);
    dragarc_optimize_clear(&r);
}

TEST(bad_requests_are_refused_before_any_flight)
{
    dragarc_scenario s;
    CHECK(spinning_ball(&s, 0.0) == DRAGARC_OK);
    dragarc_optimize_request q;
    dragarc_optimize_request_default(&q);
    dragarc_error e;
    CHECK(dragarc_optimize_add(&q, "foo", 0.0, 1.0, &e) == DRAGARC_EINVAL);
    CHECK(e.field[0] == '\0' && strstr(e.message, "unknown parameter 'foo'") && strstr(e.message, "spin_rate"));
    CHECK(dragarc_optimize_add(&q, "elevation", 50.0, 40.0, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.elevation") == 0 && strstr(e.message, "lower bound (50) must be below"));
    CHECK(dragarc_optimize_add(&q, "elevation", 40.0, 40.0, &e) == DRAGARC_EINVAL);
    CHECK(dragarc_optimize_add(&q, "elevation", NAN, 40.0, &e) == DRAGARC_EINVAL);
    CHECK(q.nvars == 0);
    dragarc_optimize_result r;
    CHECK(dragarc_optimize_solve(&s, &q, &r, &e) == DRAGARC_EINVAL && strstr(e.message, "1 to 5"));
    add(&q, "elevation", 0.0, 95.0);
    CHECK(dragarc_optimize_add(&q, "launch.elevation", 0.0, 10.0, &e) == DRAGARC_EINVAL && strstr(e.message, "twice"));
    CHECK(dragarc_optimize_solve(&s, &q, &r, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.elevation") == 0 && strstr(e.message, "upper bound of elevation (95 degrees)"));
    CHECK(r.flights == 0);
    /* spin on a ball that does not spin is fine (the rate is varied); its tilt alone is not */
    dragarc_optimize_request_default(&q);
    add(&q, "spin_tilt", -45.0, 45.0);
    CHECK(dragarc_optimize_solve(&s, &q, &r, &e) == DRAGARC_EINVAL && strcmp(e.field, "launch.spin.tilt") == 0);
    s.projectile.lift.model = DRAGARC_LIFT_NONE;
    dragarc_optimize_request_default(&q);
    add(&q, "spin_rate", 0.0, 3000.0);
    CHECK(dragarc_optimize_solve(&s, &q, &r, &e) == DRAGARC_EINVAL && strstr(e.message, "no lift model"));
    dragarc_optimize_request_default(&q);
    static const char *const five[] = {"speed", "elevation", "azimuth", "height", "mass"};
    for (int i = 0; i < 5; i++)
        add(&q, five[i], 1.0, 2.0);
    CHECK(dragarc_optimize_add(&q, "gravity", 9.0, 10.0, &e) == DRAGARC_EINVAL && strstr(e.message, "at most 5"));
    q.fd_step = 0.03;
    CHECK(dragarc_optimize_solve(&s, &q, &r, &e) == DRAGARC_EINVAL && strcmp(e.field, "fd_step") == 0);
    dragarc_scenario_clear(&s);
}

TEST(default_bounds_follow_the_scenario)
{
    dragarc_scenario s;
    CHECK(spinning_ball(&s, 0.0) == DRAGARC_OK);
    s.launch.azimuth = 350.0 * DEG;
    double lo, hi;
    dragarc_error e;
    CHECK(dragarc_optimize_default_bounds(&s, "speed", &lo, &hi, NULL) == DRAGARC_OK);
    CHECK_REL(lo, 36.0, 1e-15);
    CHECK_REL(hi, 54.0, 1e-15);
    CHECK(dragarc_optimize_default_bounds(&s, "spin_rate", &lo, &hi, NULL) == DRAGARC_OK && lo == 0.0 && hi == 6000.0);
    CHECK(dragarc_optimize_default_bounds(&s, "spin_tilt", &lo, &hi, NULL) == DRAGARC_OK && lo == -45.0 && hi == 45.0);
    CHECK(dragarc_optimize_default_bounds(&s, "azimuth", &lo, &hi, NULL) == DRAGARC_OK);
    CHECK_ABS(lo, -55.0, 1e-12);
    CHECK_ABS(hi, 35.0, 1e-12);
    CHECK(dragarc_scenario_set(&s, "spin_rate", 45000.0, NULL) == DRAGARC_OK); /* twice is past the 60000 rpm limit */
    CHECK(dragarc_optimize_default_bounds(&s, "spin_rate", &lo, &hi, NULL) == DRAGARC_OK && hi == 60000.0);
    CHECK(dragarc_optimize_default_bounds(&s, "height", &lo, &hi, &e) == DRAGARC_EINVAL);
    CHECK(strcmp(e.field, "launch.height") == 0 && strstr(e.message, "no default bounds"));
    CHECK(dragarc_optimize_default_bounds(&s, "foo", &lo, &hi, &e) == DRAGARC_EINVAL && strstr(e.message, "'foo'"));
    s.launch.speed = 0.0;
    CHECK(dragarc_optimize_default_bounds(&s, "speed", &lo, &hi, &e) == DRAGARC_EINVAL && strstr(e.message, "is 0"));
    dragarc_scenario_clear(&s);
}

int main(void)
{
    dragarc_init();
    RUN(vacuum_from_the_ground_carries_farthest_at_45_degrees);
    RUN(vacuum_from_a_height_matches_lichtenberg_and_wills);
    RUN(quadratic_drag_optimum_is_below_45_degrees_where_aim_finds_its_maximum_range);
    RUN(a_spinning_ball_optimum_is_interior_in_elevation_with_zero_slope_and_no_better_point_around_it);
    RUN(the_elevation_optimum_is_the_best_of_a_fine_table_with_lift);
    RUN(a_spin_rate_capped_low_gives_a_constrained_optimum_on_its_bound);
    RUN(several_variables_in_vacuum_go_to_their_bounds_and_the_elevation_to_lichtenberg_and_wills);
    RUN(slopes_and_curvatures_hold_at_the_default_flight_tolerances);
    RUN(total_distance_is_the_carry_without_a_ground_surface);
    RUN(failed_trials_count_as_worst_and_all_failed_is_no_solution);
    RUN(bad_requests_are_refused_before_any_flight);
    RUN(default_bounds_follow_the_scenario);
    return check_summary();
}
