/* test_resources.c: the memory a big run needs, worked out before it starts, and the refusal of a run that needs
 * more than the machine has.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The estimates are sums of sizeof over the arrays a run allocates; each expected value below is written out here
 * from the structs' sizes and the counts, apart from the library's own sums, so that a new field in a result
 * struct moves both by the same amount and a dropped term shows.
 */
#include <math.h>
#include <stdint.h>
#include <string.h>

#include "check.h"
#include "dragarc/footprint.h"
#include "dragarc/resources.h"
#include "dragarc/scatter.h"
#include "dragarc/sprinkler.h"
#include "dragarc/sweep.h"

/* bytes per density-grid cell: value + histogram bin + the region's value copy (doubles), its sort order and cell
 * list (size_t), in[] and visited[] (a byte each), comp[] and stack_pos[] (uint32_t), and two boundary paths of
 * at most 4 uint32_t vertices a cell */
static double cell_bytes(void)
{
    return 3 * sizeof(double) + 2 * sizeof(size_t) + 2 * 1 + 2 * sizeof(uint32_t) + 8 * sizeof(uint32_t);
}

TEST(scatter_grid_memory_is_bytes_per_cell_times_cells)
{
    CHECK_ABS(dragarc_scatter_grid_memory(0), 0.0, 0.0);
    CHECK_ABS(dragarc_scatter_grid_memory(1000), 1000 * cell_bytes(), 0.0);
    CHECK_ABS(dragarc_scatter_grid_memory(DRAGARC_SCATTER_GRID_MAX_CELLS), 4e6 * cell_bytes(), 0.0);
}

TEST(footprint_memory_counts_impacts_summary_columns_groups_and_grid)
{
    dragarc_footprint_spec spec;
    memset(&spec, 0, sizeof spec);
    spec.nclasses = 3, spec.samples = 1000, spec.cell = 0.0;
    /* per flight: the impact; the summary's east, north, weight, speed, energy, time columns and its casualty
     * contribution (7 doubles) and impact point; the quantile sort's 4 doubles and an index */
    double per_flight = sizeof(dragarc_impact) + 7 * sizeof(double) + sizeof(dragarc_impact_point) +
                        4 * sizeof(double) + sizeof(size_t);
    double want = 3000 * per_flight + 4 * sizeof(dragarc_footprint_group) + 1003.0 * 1003.0 * cell_bytes();
    CHECK_ABS(dragarc_footprint_memory_estimate(&spec), want, 0.5);
    /* a given cell: the grid at its limit */
    spec.cell = 25.0;
    want += (4e6 - 1003.0 * 1003.0) * cell_bytes();
    CHECK_ABS(dragarc_footprint_memory_estimate(&spec), want, 0.5);
    /* twice the samples: twice the per-flight part, the rest unchanged */
    double before = dragarc_footprint_memory_estimate(&spec);
    spec.samples = 2000;
    CHECK_ABS(dragarc_footprint_memory_estimate(&spec) - before, 3000 * per_flight, 0.5);
}

TEST(footprint_memory_of_the_largest_run_is_a_few_gigabytes)
{
    dragarc_footprint_spec spec;
    memset(&spec, 0, sizeof spec);
    spec.nclasses = 2, spec.samples = DRAGARC_FOOTPRINT_MAX_SAMPLES; /* DRAGARC_FOOTPRINT_MAX_FLIGHTS flights */
    double need = dragarc_footprint_memory_estimate(&spec);
    CHECK(need > 2e7 * sizeof(dragarc_impact));
    CHECK(need > 3e9 && need < 8e9);
}

TEST(sweep_memory_is_rows_times_row_size)
{
    CHECK_ABS(dragarc_sweep_memory_estimate(0), 0.0, 0.0);
    CHECK_ABS(dragarc_sweep_memory_estimate(12345), 12345.0 * sizeof(dragarc_sweep_row), 0.0);
    CHECK_ABS(dragarc_sweep_memory_estimate(DRAGARC_SWEEP_MAX_ROWS), 1e6 * sizeof(dragarc_sweep_row), 0.0);
}

TEST(sprinkler_memory_counts_drops_grid_rings_classes_and_catch_points)
{
    dragarc_sprinkler_spec spec;
    memset(&spec, 0, sizeof spec);
    spec.nclasses = 40, spec.ndirections = 360;
    double want = 40 * 360 * (sizeof(dragarc_sprinkler_drop) + sizeof(unsigned)) + 4e6 * sizeof(double) +
                  1e6 * sizeof(double) + 40 * (2 * sizeof(double) + sizeof(dragarc_spectrum_class));
    CHECK_ABS(dragarc_sprinkler_memory_estimate(&spec), want, 0.5);
    spec.layout_given = 1, spec.layout_points = 20;
    CHECK_ABS(dragarc_sprinkler_memory_estimate(&spec), want + 400 * sizeof(double), 0.5);
}

TEST(memory_check_refuses_a_run_above_physical_memory)
{
    dragarc_error e;
    int rc = dragarc_memory_check(5.2e9, 4e9, "footprint.samples", &e);
    CHECK_ERROR(rc, DRAGARC_EINVAL, e, "footprint.samples",
                "the run needs about 5.2 GB of memory, more than the 4.0 GB this machine has; make it smaller or "
                "split it (docs/limits.md)");
    CHECK(dragarc_memory_check(5.2e9, 64e9, "footprint.samples", &e) == DRAGARC_OK);
    CHECK(dragarc_memory_check(4e9, 4e9, "footprint.samples", &e) == DRAGARC_OK); /* equal: allowed */
    CHECK(dragarc_memory_check(5.2e9, 0.0, "footprint.samples", &e) == DRAGARC_OK); /* unknown: not refused */
}

TEST(memory_check_refuses_the_largest_footprint_on_a_small_machine)
{
    dragarc_footprint_spec spec;
    memset(&spec, 0, sizeof spec);
    spec.nclasses = 4, spec.samples = 5000000;
    dragarc_error e;
    int rc = dragarc_memory_check(dragarc_footprint_memory_estimate(&spec), 2e9, "footprint.samples", &e);
    CHECK_ERROR(rc, DRAGARC_EINVAL, e, "footprint.samples", "more than the 2.0 GB this machine has");
}

TEST(bytes_format_uses_decimal_units)
{
    static const struct {
        double bytes;
        const char *text;
    } cases[] = {{512, "512 B"}, {3400, "3.4 kB"}, {4.2e8, "420 MB"}, {1.1e9, "1.1 GB"}, {25e9, "25 GB"},
                 {999.6e6, "1.0 GB"}};
    for (size_t i = 0; i < sizeof cases / sizeof cases[0]; i++) {
        char b[32];
        dragarc_bytes_format(cases[i].bytes, b, sizeof b);
        CHECK(strcmp(b, cases[i].text) == 0);
    }
}

TEST(threads_is_at_least_one)
{
    CHECK(dragarc_threads() >= 1);
}

int main(void)
{
    RUN(scatter_grid_memory_is_bytes_per_cell_times_cells);
    RUN(footprint_memory_counts_impacts_summary_columns_groups_and_grid);
    RUN(footprint_memory_of_the_largest_run_is_a_few_gigabytes);
    RUN(sweep_memory_is_rows_times_row_size);
    RUN(sprinkler_memory_counts_drops_grid_rings_classes_and_catch_points);
    RUN(memory_check_refuses_a_run_above_physical_memory);
    RUN(memory_check_refuses_the_largest_footprint_on_a_small_machine);
    RUN(bytes_format_uses_decimal_units);
    RUN(threads_is_at_least_one);
    return check_summary();
}
