/* replay.c: main() for a fuzz harness built without libFuzzer: feed it every file named on the command line, or
 * every file in each folder named, once, and say how many. Replays tests/fuzz/regressions/<harness>/ in ctest.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * A file that once crashed, leaked or tripped a sanitizer must now pass through quietly: a crash or (in the
 * sanitizer build) a sanitizer report ends this program with a failure, and so does a file it cannot read.
 */
#include <dirent.h>
#include <stdio.h>
#include <sys/stat.h>

#include "fuzz.h"

static int replay_file(const char *path)
{
    FILE *fp = fopen(path, "rb");
    if (!fp) {
        fprintf(stderr, "replay: %s: cannot open\n", path);
        return 1;
    }
    size_t cap = 4096, n = 0;
    uint8_t *buf = malloc(cap);
    size_t got;
    while (buf && (got = fread(buf + n, 1, cap - n, fp)) > 0) {
        n += got;
        if (n == cap) {
            uint8_t *grown = realloc(buf, cap *= 2);
            if (!grown)
                free(buf);
            buf = grown;
        }
    }
    int bad = ferror(fp) || !buf;
    fclose(fp);
    if (bad) {
        free(buf);
        fprintf(stderr, "replay: %s: cannot read\n", path);
        return 1;
    }
    LLVMFuzzerTestOneInput(buf, n);
    free(buf);
    return 0;
}

int main(int argc, char **argv)
{
    int failed = 0, done = 0;
    for (int i = 1; i < argc; i++) {
        struct stat st;
        if (stat(argv[i], &st) != 0) {
            fprintf(stderr, "replay: %s: no such file or folder\n", argv[i]);
            failed++;
            continue;
        }
        if (!S_ISDIR(st.st_mode)) {
            failed += replay_file(argv[i]);
            done++;
            continue;
        }
        DIR *d = opendir(argv[i]);
        struct dirent *e;
        while (d && (e = readdir(d)) != NULL) {
            if (e->d_name[0] == '.') /* ".", ".." and hidden files such as .gitkeep */
                continue;
            char path[4096];
            snprintf(path, sizeof path, "%s/%s", argv[i], e->d_name);
            failed += replay_file(path);
            done++;
        }
        if (d)
            closedir(d);
        else
            failed++;
    }
    printf("replay: %d passed, %d failed\n", done - failed, failed);
    return failed ? 1 : 0;
}
