/* resources.c: a run's memory need against the machine's, and the thread count.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Plain arithmetic: the commands estimate their need from the sizes of their result arrays (footprint.c,
 * sweep.c, sprinkler.c) and the CLI reads the machine's physical memory; this file compares the two and says so in
 * one line.
 */
#include <stdio.h>

#ifdef _OPENMP
#include <omp.h>
#endif

#include "dragarc/resources.h"

void dragarc_bytes_format(double bytes, char *buf, size_t size)
{
    static const char *const unit[] = {"B", "kB", "MB", "GB", "TB", "PB"};
    int k = 0;
    while (bytes >= 999.5 && k < 5)
        bytes /= 1000.0, k++;
    /* one decimal below 10, none above: "1.1 GB", "25 GB", "420 MB" */
    snprintf(buf, size, k > 0 && bytes < 9.95 ? "%.1f %s" : "%.0f %s", bytes, unit[k]);
}

int dragarc_memory_check(double need, double physical, const char *field, dragarc_error *err)
{
    if (!(physical > 0.0) || need <= physical)
        return DRAGARC_OK;
    char a[32], b[32];
    dragarc_bytes_format(need, a, sizeof a);
    dragarc_bytes_format(physical, b, sizeof b);
    return dragarc_error_set(err, DRAGARC_EINVAL, field,
                             "the run needs about %s of memory, more than the %s this machine has; make it smaller or "
                             "split it (docs/limits.md)", a, b);
}

int dragarc_threads(void)
{
#ifdef _OPENMP
    return omp_get_max_threads();
#else
    return 1;
#endif
}
