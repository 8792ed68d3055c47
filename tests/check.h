/* check.h: a minimal test harness. Each test file is one program: CHECK_* macros count results and
 * print a line for each failure; check_summary() prints "N passed, M failed" and gives the exit code.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_TESTS_CHECK_H
#define DRAGARC_TESTS_CHECK_H

#include <math.h>
#include <stdio.h>
#include <string.h>

static int check_passed, check_failed;
static const char *check_current = "";

#define TEST(name) static void name(void)
#define RUN(name)                                                                                              \
    do {                                                                                                       \
        check_current = #name;                                                                                 \
        int before_ = check_failed;                                                                            \
        name();                                                                                                \
        printf("%s %s\n", check_failed == before_ ? "ok  " : "FAIL", #name);                                  \
    } while (0)

static inline void check_record(int ok, const char *file, int line, const char *what)
{
    if (ok) {
        check_passed++;
    } else {
        check_failed++;
        printf("  %s:%d: in %s: %s\n", file, line, check_current, what);
    }
}

#define CHECK(cond) check_record((cond) ? 1 : 0, __FILE__, __LINE__, #cond)

/* |got - want| <= tol */
#define CHECK_ABS(got, want, tol)                                                                              \
    do {                                                                                                       \
        double g_ = (got), w_ = (want), t_ = (tol);                                                            \
        char m_[256];                                                                                          \
        snprintf(m_, sizeof m_, "%s = %.12g, want %.12g +- %.3g (off by %.3g)", #got, g_, w_, t_, g_ - w_);      \
        check_record(fabs(g_ - w_) <= t_, __FILE__, __LINE__, m_);                                              \
    } while (0)

/* |got - want| <= rel |want| */
#define CHECK_REL(got, want, rel)                                                                              \
    do {                                                                                                       \
        double g_ = (got), w_ = (want), r_ = (rel);                                                            \
        char m_[256];                                                                                          \
        snprintf(m_, sizeof m_, "%s = %.12g, want %.12g within %.3g relative (off by %.3g)", #got, g_, w_, r_,   \
                 (g_ - w_) / w_);                                                                              \
        check_record(fabs(g_ - w_) <= r_ * fabs(w_), __FILE__, __LINE__, m_);                                   \
    } while (0)

/* A call refused with status `code`, its error naming the field want_field exactly and its message holding
 * want_text; prints what came instead. Needs the dragarc_error e filled when rc is not 0. */
static inline void check_refused_(int rc, int code, const char *field, const char *message, const char *want_field,
                                  const char *want_text, const char *file, int line)
{
    int ok = rc == code && strcmp(field, want_field) == 0 && strstr(message, want_text) != NULL;
    char m_[1024];
    snprintf(m_, sizeof m_, "got status %d, field '%s', message '%s'; want %d, '%s', '%s'", rc, rc ? field : "",
             rc ? message : "", code, want_field, want_text);
    check_record(ok, file, line, m_);
}
#define CHECK_ERROR(rc, code, e, want_field, want_text)                                                       \
    check_refused_((rc), (code), (e).field, (e).message, (want_field), (want_text), __FILE__, __LINE__)

static inline int check_summary(void)
{
    printf("%d passed, %d failed\n", check_passed, check_failed);
    return check_failed ? 1 : 0;
}

#endif
