/* fuzz.h: what every fuzz harness shares: the libFuzzer entry point and a NUL-terminated copy of the input.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * libFuzzer's bytes are not a C string: the readers take one, so each harness copies the input and ends it with
 * a NUL (a reader that ran past the end would be caught by AddressSanitizer on the copy's exact size). The same
 * sources are built with replay.c as main() to replay tests/fuzz/regressions/ in the ordinary build.
 */
#ifndef DRAGARC_FUZZ_H
#define DRAGARC_FUZZ_H

#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

/* A malloc'ed copy of data[0..size) with a NUL after it; NULL when out of memory (the input is then skipped). */
static inline char *fuzz_text(const uint8_t *data, size_t size)
{
    char *text = malloc(size + 1);
    if (text) {
        if (size)
            memcpy(text, data, size);
        text[size] = '\0';
    }
    return text;
}

#endif
