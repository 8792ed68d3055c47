/* fuzz_drift_spec.c: the drift scenario reader (dragarc_drift_spec_parse) on any text.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include "dragarc/drift.h"
#include "fuzz.h"

int LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
    char *text = fuzz_text(data, size);
    if (!text)
        return 0;
    dragarc_drift_spec spec;
    dragarc_error err;
    (void)dragarc_drift_spec_parse(text, &spec, &err);
    dragarc_drift_spec_clear(&spec); /* also after a failure: the reader's partial work must be freeable */
    free(text);
    return 0;
}
