/* test_output.c: files written whole or not at all (src/io/atomic_file.c): the temporary file beside the
 * destination, the rename on commit, the removal on abort, and the removal of every pending temporary file that a
 * signal handler asks for (dragarc_output_remove_pending), which leaves destinations as they were.
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#define _DEFAULT_SOURCE /* mkdtemp */
#include <dirent.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "check.h"
#include "dragarc/output.h"

static char dir[64];

/* Entries in the test folder (not . or ..); `tmp` counts those with ".tmp-" in their names. */
static int entries(int *tmp)
{
    DIR *d = opendir(dir);
    int n = 0;
    *tmp = 0;
    if (!d)
        return -1;
    for (struct dirent *e; (e = readdir(d));) {
        if (strcmp(e->d_name, ".") == 0 || strcmp(e->d_name, "..") == 0)
            continue;
        n++;
        *tmp += strstr(e->d_name, ".tmp-") != NULL;
    }
    closedir(d);
    return n;
}

static void put(const char *path, const char *text)
{
    FILE *f = fopen(path, "w");
    if (f) {
        fputs(text, f);
        fclose(f);
    }
}

static int holds(const char *path, const char *text)
{
    char buf[64] = "";
    FILE *f = fopen(path, "r");
    if (!f)
        return 0;
    size_t n = fread(buf, 1, sizeof buf - 1, f);
    buf[n] = '\0';
    fclose(f);
    return strcmp(buf, text) == 0;
}

TEST(commit_renames_and_abort_removes)
{
    char a[128], b[128];
    snprintf(a, sizeof a, "%s/a.csv", dir);
    snprintf(b, sizeof b, "%s/b.csv", dir);
    put(b, "old");
    dragarc_output oa, ob;
    dragarc_error e;
    CHECK(dragarc_output_open(&oa, a, &e) == DRAGARC_OK);
    CHECK(dragarc_output_open(&ob, b, &e) == DRAGARC_OK);
    fputs("new a", oa.fp);
    fputs("new b", ob.fp);
    int tmp;
    CHECK(entries(&tmp) == 3 && tmp == 2); /* two temporary files and the old b */
    CHECK(dragarc_output_commit(&oa, &e) == DRAGARC_OK);
    dragarc_output_abort(&ob);
    CHECK(entries(&tmp) == 2 && tmp == 0);
    CHECK(holds(a, "new a"));
    CHECK(holds(b, "old"));
    remove(a);
    remove(b);
}

TEST(pending_temporary_files_are_removed_on_request)
{
    enum { N = 5 };
    char path[N][128];
    dragarc_output o[N];
    dragarc_error e;
    snprintf(path[0], sizeof path[0], "%s/kept.json", dir);
    put(path[0], "before");
    for (int i = 0; i < N; i++) {
        if (i > 0)
            snprintf(path[i], sizeof path[i], "%s/out%d.csv", dir, i);
        CHECK(dragarc_output_open(&o[i], path[i], &e) == DRAGARC_OK);
        fputs("partial", o[i].fp);
    }
    /* one is finished before the stop: it stays */
    CHECK(dragarc_output_commit(&o[N - 1], &e) == DRAGARC_OK);
    int tmp;
    /* kept.json, four temporary files, out4.csv */
    CHECK(entries(&tmp) == 1 + (N - 1) + 1 && tmp == N - 1);
    dragarc_output_remove_pending(); /* what the CLI's SIGINT handler calls */
    CHECK(entries(&tmp) == 2 && tmp == 0);
    CHECK(holds(path[0], "before")); /* the destination is as it was */
    CHECK(holds(path[N - 1], "partial"));
    /* the program would now end; here the outputs are closed, and committing one whose file is gone fails */
    CHECK_ERROR(dragarc_output_commit(&o[1], &e), DRAGARC_EIO, e, "", "cannot write");
    for (int i = 0; i < N - 1; i++)
        dragarc_output_abort(&o[i]);
    CHECK(entries(&tmp) == 2 && tmp == 0);
    /* a new output after the stop is tracked again from a free slot */
    CHECK(dragarc_output_open(&o[0], path[0], &e) == DRAGARC_OK);
    dragarc_output_remove_pending();
    CHECK(entries(&tmp) == 2 && tmp == 0);
    dragarc_output_abort(&o[0]);
    remove(path[0]);
    remove(path[N - 1]);
}

int main(void)
{
    snprintf(dir, sizeof dir, "%s/test_output.XXXXXX", getenv("TMPDIR") ? getenv("TMPDIR") : "/tmp");
    if (!mkdtemp(dir)) {
        perror("mkdtemp");
        return 2;
    }
    RUN(commit_renames_and_abort_removes);
    RUN(pending_temporary_files_are_removed_on_request);
    rmdir(dir);
    return check_summary();
}
