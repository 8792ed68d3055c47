/* fuzz_sprinkler_spec.c: the sprinkler scenario reader (dragarc_sprinkler_spec_parse) on any text.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/sprinkler.h"
#include "fuzz.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_sprinkler_spec spec;
    dragarc_error err;
    (void)dragarc_sprinkler_spec_parse(text, &spec, &err);
    dragarc_sprinkler_spec_clear(&spec); /* also after a failure: the reader's partial work must be freeable */
    free(text);
    return 0;
}
