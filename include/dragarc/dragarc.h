/* dragarc.h: version, status codes and the error record shared by every dragarc call.
 *
 * Copyright (C) 2026 the dragarc developers. SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Every fallible call returns an int status: DRAGARC_OK (0) on success, a negative DRAGARC_E* code on
 * failure, and fills an optional dragarc_error (pass NULL to ignore it). The library never prints,
 * exits or aborts; the stand-alone program decides what to say and which exit status to use.
 */
#ifndef DRAGARC_DRAGARC_H
#define DRAGARC_DRAGARC_H

#ifdef __cplusplus
extern "C" {
#endif

#define DRAGARC_VERSION_MAJOR 0
#define DRAGARC_VERSION_MINOR 1
#define DRAGARC_VERSION_PATCH 0
#define DRAGARC_VERSION_STRING "0.1.0"

enum {
    DRAGARC_OK = 0,
    DRAGARC_EINVAL = -1,  /* bad input: a value out of range, a missing or unknown field */
    DRAGARC_ENOMEM = -2,  /* an allocation failed */
    DRAGARC_ESOLVER = -3, /* the integrator or a root finder failed */
    DRAGARC_ENOLAND = -4, /* the flight did not reach the ground within the time limit */
    DRAGARC_EIO = -5,     /* a file could not be read or written */
    DRAGARC_ERANGE = -6,  /* a model was evaluated outside its domain (e.g. ISA above 86 km) */
    DRAGARC_ENOSOLUTION = -7 /* a solver found that no launch meets the request (out of reach) */
};

/* One error: the status code, the field path it concerns ("launch.elevation", or "" when none) and a
 * message that states the bad value and the rule it broke. Plain storage: nothing to free. */
typedef struct dragarc_error {
    int code;
    char field[128];
    char message[384];
} dragarc_error;

/* Library version as "MAJOR.MINOR.PATCH". */
const char *dragarc_version(void);

/* Process-wide set-up to call once before other calls: switches GSL's aborting error handler off so
 * that GSL failures come back as return codes. Idempotent. */
void dragarc_init(void);
/* Text in and out (scenario files, JSON, CSV, GeoJSON, reports) is read and written with the C library's number
 * functions, whose decimal separator follows the LC_NUMERIC locale of the calling thread. The dragarc program
 * never calls setlocale, so it runs in the "C" locale whatever the environment says (tests/cli/check_locale.py). A
 * program that embeds the library and sets another LC_NUMERIC must call dragarc's text functions with "C" in force
 * for the thread (uselocale(newlocale(LC_NUMERIC_MASK, "C", 0)) around them), or numbers are written with its
 * decimal comma. */

/* Fill err (if not NULL) with code, field path and a printf-style message; returns code, so that a
 * failing function can `return dragarc_error_set(err, DRAGARC_EINVAL, "launch.speed", "...")`. */
int dragarc_error_set(dragarc_error *err, int code, const char *field, const char *fmt, ...)
    __attribute__((format(printf, 4, 5)));

/* Prefix err->field with "prefix." (or set it to prefix when it is empty); used by readers that
 * validate a nested object and then say where it sits. Safe with NULL. */
void dragarc_error_prefix(dragarc_error *err, const char *prefix);

/* Short English name of a status code ("bad input", "solver failure", ...). */
const char *dragarc_status_name(int code);

#ifdef __cplusplus
}
#endif
#endif
