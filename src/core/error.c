/* error.c: status codes, the error record and library set-up.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#include <gsl/gsl_errno.h>

#include "dragarc/dragarc.h"

const char *dragarc_version(void) { return DRAGARC_VERSION_STRING; }

void dragarc_init(void) { gsl_set_error_handler_off(); }

int dragarc_error_set(dragarc_error *err, int code, const char *field, const char *fmt, ...)
{
    if (err) {
        err->code = code;
        snprintf(err->field, sizeof err->field, "%s", field ? field : "");
        va_list ap;
        va_start(ap, fmt);
        vsnprintf(err->message, sizeof err->message, fmt, ap);
        va_end(ap);
    }
    return code;
}

void dragarc_error_prefix(dragarc_error *err, const char *prefix)
{
    if (!err || !prefix || !*prefix)
        return;
    char joined[2 * sizeof err->field + 2];
    const char *sep = err->field[0] == '\0' || err->field[0] == '[' ? "" : ".";
    int n = snprintf(joined, sizeof joined, "%s%s%s", prefix, sep, err->field);
    size_t len = n < 0 ? 0 : (size_t)n;
    if (len >= sizeof err->field)
        len = sizeof err->field - 1; /* keep the start of the path: it says where to look */
    memcpy(err->field, joined, len);
    err->field[len] = '\0';
}

const char *dragarc_status_name(int code)
{
    switch (code) {
    case DRAGARC_OK: return "success";
    case DRAGARC_EINVAL: return "bad input";
    case DRAGARC_ENOMEM: return "out of memory";
    case DRAGARC_ESOLVER: return "solver failure";
    case DRAGARC_ENOLAND: return "no ground impact";
    case DRAGARC_EIO: return "input/output error";
    case DRAGARC_ERANGE: return "outside the model's range";
    case DRAGARC_ENOSOLUTION: return "no solution";
    default: return "unknown status";
    }
}
