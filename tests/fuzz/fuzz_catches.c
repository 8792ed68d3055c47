/* fuzz_catches.c: the catch-can CSV reader (dragarc_catches_parse) on any text, then the grid's extent.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/catch_data.h"
#include "fuzz.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_catches c;
    memset(&c, 0, sizeof c);
    dragarc_error err;
    if (dragarc_catches_parse(text, &c, &err) == DRAGARC_OK) {
        double ext[4];
        (void)dragarc_catches_extent(&c, ext);
    }
    dragarc_catches_clear(&c); /* also after a failure */
    free(text);
    return 0;
}
