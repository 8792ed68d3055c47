/* fuzz_footprint_spec.c: the footprint scenario reader (dragarc_footprint_spec_parse) and its check.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/footprint.h"
#include "fuzz.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_footprint_spec spec;
    dragarc_error err;
    if (dragarc_footprint_spec_parse(text, &spec, &err) == DRAGARC_OK)
        (void)dragarc_footprint_check(&spec, &err);
    dragarc_footprint_spec_clear(&spec); /* also after a failure: the reader's partial work must be freeable */
    free(text);
    return 0;
}
