/* atomic_file.c: whole-file reads, and writes that land whole or not at all (temporary file + rename).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#define _POSIX_C_SOURCE 200809L
#include <errno.h>
#include <stdatomic.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "dragarc/output.h"

int dragarc_text_file_read(const char *path, size_t max_bytes, char **out, dragarc_error *err)
{
    *out = NULL;
    FILE *f = fopen(path, "rb");
    if (!f)
        return dragarc_error_set(err, DRAGARC_EIO, "", "cannot open: %s", strerror(errno));
    size_t cap = 4096, len = 0;
    char *buf = malloc(cap);
    int rc = DRAGARC_OK;
    if (!buf) {
        fclose(f);
        return dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory reading the file");
    }
    for (;;) {
        if (len + 1 >= cap) {
            if (cap > max_bytes) {
                rc = dragarc_error_set(err, DRAGARC_EIO, "", "the file is larger than %zu bytes", max_bytes);
                break;
            }
            char *nb = realloc(buf, cap * 2);
            if (!nb) {
                rc = dragarc_error_set(err, DRAGARC_ENOMEM, "", "out of memory reading the file");
                break;
            }
            buf = nb;
            cap *= 2;
        }
        size_t got = fread(buf + len, 1, cap - 1 - len, f);
        len += got;
        if (got == 0) {
            if (ferror(f))
                rc = dragarc_error_set(err, DRAGARC_EIO, "", "cannot read: %s", strerror(errno));
            break;
        }
    }
    fclose(f);
    if (rc == DRAGARC_OK && len > max_bytes)
        rc = dragarc_error_set(err, DRAGARC_EIO, "", "the file is larger than %zu bytes", max_bytes);
    if (rc == DRAGARC_OK && memchr(buf, '\0', len))
        rc = dragarc_error_set(err, DRAGARC_EIO, "", "contains a NUL byte: not a text file");
    if (rc != DRAGARC_OK) {
        free(buf);
        return rc;
    }
    buf[len] = '\0';
    *out = buf;
    return DRAGARC_OK;
}

/* The temporary files of the outputs open now, for dragarc_output_remove_pending: a slot holds a pointer to an open
 * output's tmp_path (which lives as long as the output is open). Pointers are lock-free atomics on the platforms
 * we build for (checked below), so a signal handler may read them at any moment. */
static _Atomic(const char *) g_pending[DRAGARC_OUTPUT_PENDING_MAX];
#if ATOMIC_POINTER_LOCK_FREE != 2
#error "dragarc_output_remove_pending needs lock-free atomic pointers"
#endif

static void pending_add(const char *tmp)
{
    for (int i = 0; i < DRAGARC_OUTPUT_PENDING_MAX; i++) {
        const char *none = NULL;
        if (atomic_compare_exchange_strong(&g_pending[i], &none, tmp))
            return;
    }
}

static void pending_drop(const char *tmp)
{
    for (int i = 0; i < DRAGARC_OUTPUT_PENDING_MAX; i++) {
        const char *mine = tmp;
        if (atomic_compare_exchange_strong(&g_pending[i], &mine, NULL))
            return;
    }
}

void dragarc_output_remove_pending(void)
{
    for (int i = 0; i < DRAGARC_OUTPUT_PENDING_MAX; i++) {
        const char *tmp = atomic_load(&g_pending[i]);
        if (tmp && tmp[0])
            unlink(tmp);
    }
}

int dragarc_output_open(dragarc_output *o, const char *path, dragarc_error *err)
{
    memset(o, 0, sizeof *o);
    if (strcmp(path, "-") == 0) {
        o->fp = stdout;
        snprintf(o->path, sizeof o->path, "-");
        return DRAGARC_OK;
    }
    if (strlen(path) + 16 >= sizeof o->tmp_path)
        return dragarc_error_set(err, DRAGARC_EIO, "", "output path is too long: %s", path);
    /* a folder fails here, not at the rename: a command writing several files commits them after drawing its plot,
     * which would otherwise be left in place beside an error */
    struct stat st;
    if (stat(path, &st) == 0 && S_ISDIR(st.st_mode))
        return dragarc_error_set(err, DRAGARC_EIO, "", "cannot write %s: %s", path, strerror(EISDIR));
    snprintf(o->path, sizeof o->path, "%s", path);
    snprintf(o->tmp_path, sizeof o->tmp_path, "%s.tmp-XXXXXX", path);
    /* tracked before the file exists, so that a signal arriving just after mkstemp made it still removes it (before
     * that, the handler only unlinks a name that does not exist) */
    pending_add(o->tmp_path);
    int fd = mkstemp(o->tmp_path);
    if (fd < 0) {
        int e = errno;
        pending_drop(o->tmp_path);
        o->tmp_path[0] = '\0';
        return dragarc_error_set(err, DRAGARC_EIO, "", "cannot write %s: %s", path, strerror(e));
    }
    /* mkstemp makes the file private (0600); results are ordinary documents, readable by others. */
    (void)fchmod(fd, 0644);
    o->fp = fdopen(fd, "w");
    if (!o->fp) {
        int e = errno;
        close(fd);
        pending_drop(o->tmp_path);
        unlink(o->tmp_path);
        o->tmp_path[0] = '\0';
        return dragarc_error_set(err, DRAGARC_EIO, "", "cannot write %s: %s", path, strerror(e));
    }
    return DRAGARC_OK;
}

int dragarc_output_commit(dragarc_output *o, dragarc_error *err)
{
    if (!o->fp)
        return dragarc_error_set(err, DRAGARC_EIO, "", "output %s is not open", o->path);
    if (o->fp == stdout) {
        o->fp = NULL;
        if (fflush(stdout) != 0)
            return dragarc_error_set(err, DRAGARC_EIO, "", "cannot write to standard output: %s", strerror(errno));
        return DRAGARC_OK;
    }
    int bad = ferror(o->fp) || fflush(o->fp) != 0 || fsync(fileno(o->fp)) != 0;
    int e = errno;
    if (fclose(o->fp) != 0 && !bad) {
        bad = 1;
        e = errno;
    }
    o->fp = NULL;
    if (!bad && rename(o->tmp_path, o->path) != 0) {
        bad = 1;
        e = errno;
    }
    pending_drop(o->tmp_path); /* renamed, or about to be removed */
    if (bad) {
        unlink(o->tmp_path);
        o->tmp_path[0] = '\0';
        return dragarc_error_set(err, DRAGARC_EIO, "", "cannot write %s: %s", o->path, strerror(e));
    }
    o->tmp_path[0] = '\0';
    return DRAGARC_OK;
}

void dragarc_output_abort(dragarc_output *o)
{
    if (o->fp && o->fp != stdout)
        fclose(o->fp);
    o->fp = NULL;
    if (o->tmp_path[0]) {
        unlink(o->tmp_path);
        pending_drop(o->tmp_path);
    }
    o->tmp_path[0] = '\0';
}
