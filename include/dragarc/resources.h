/* resources.h: what a big run needs before it starts: memory against what the machine has, and the threads.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The estimates of each command's memory are in its own header (dragarc_footprint_memory_estimate,
 * dragarc_sweep_memory_estimate, dragarc_sprinkler_memory_estimate): pure arithmetic on the sizes of the result
 * arrays. The machine's memory is the caller's to find (the library asks the system for nothing); docs/limits.md
 * lists every limit and the memory per flight, row and cell.
 */
#ifndef DRAGARC_RESOURCES_H
#define DRAGARC_RESOURCES_H

#include <stddef.h>

#include "dragarc/dragarc.h"

#ifdef __cplusplus
extern "C" {
#endif

/* Refuse a run that needs `need` bytes when the machine has `physical` bytes (0: unknown, nothing refused):
 * DRAGARC_EINVAL with err->field `field` (the option or key that makes the run big) and a message giving both
 * sizes, e.g. "the run needs about 5.2 GB of memory, more than the 4 GB this machine has; ...". */
int dragarc_memory_check(double need, double physical, const char *field, dragarc_error *err);

/* bytes as "512 B", "3.4 kB", "420 MB", "1.1 GB" (decimal units; one decimal below 10) into buf. */
void dragarc_bytes_format(double bytes, char *buf, size_t size);

/* The threads a parallel run uses (OpenMP's omp_get_max_threads; 1 without OpenMP). */
int dragarc_threads(void);

#ifdef __cplusplus
}
#endif
#endif
