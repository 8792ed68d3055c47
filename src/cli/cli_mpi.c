/* cli_mpi.c: the MPI glue of the command-line program (cli_mpi.h): start and end, shares of work, agreeing on a
 * status, putting the shares back in order on rank 0. Built with MPI only when DRAGARC_MPI is on; otherwise one process, rank 0 of
 * 1, and nothing here talks to anyone.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * Why the results are the same bit for bit for any number of processes: a flight (or a table row) depends only on
 * its global index (its random stream is seeded from it), process r of P flies the indices r, r + P, r + 2P, ...,
 * and rank 0 puts every record, as raw bytes, back at its index in one array. Rank 0 thus holds exactly the array a
 * single process fills, and summarises it with the same code in the same order: means, quantiles, density grids,
 * contours and E_c cannot differ. Nothing is summed across processes (no MPI_Reduce of doubles, whose order would
 * depend on the number of processes). The indices are dealt every P-th rather than cut in blocks because the cost
 * of a flight changes along them: a footprint's classes follow one another (a light panel flies far longer than a
 * heavy case) and a table's first axis varies slowest; blocks would leave one process with the slow end.
 */
#define _POSIX_C_SOURCE 200809L
#include "cli/cli_mpi.h"

#include <stdlib.h>
#include <string.h>

#include "cli/cli.h"

void cli_mpi_share(size_t n, size_t *first, size_t *step, size_t *count)
{
    size_t p = (size_t)cli_mpi_size(), r = (size_t)cli_mpi_rank();
    *first = r;
    *step = p;
    *count = n > r ? (n - r + p - 1) / p : 0;
}

/* cli_mpi_gather_any on one process: a copy of its own items. */
static int gather_alone(const void *mine, size_t nmine, size_t size, void **all, size_t *nall)
{
    *all = NULL;
    *nall = 0;
    if (nmine == 0)
        return EXIT_OK;
    if (!(*all = malloc(nmine * size)))
        return EXIT_FAILED;
    memcpy(*all, mine, nmine * size);
    *nall = nmine;
    return EXIT_OK;
}

#ifdef DRAGARC_MPI

#include <fcntl.h>
#include <limits.h>
#include <mpi.h>
#include <stdio.h>
#include <time.h>
#include <unistd.h>

static int world_rank = 0, world_size = 1, solo = 0;
static FILE *captured = NULL;  /* standard error of a process other than rank 0 */
static long forwarded = 0;     /* how much of it cli_mpi_agree has dealt with */

void cli_mpi_start(int *argc, char ***argv)
{
    MPI_Init(argc, argv);
    MPI_Comm_rank(MPI_COMM_WORLD, &world_rank);
    MPI_Comm_size(MPI_COMM_WORLD, &world_size);
    if (world_rank == 0)
        return;
    int null = open("/dev/null", O_WRONLY);
    if (null >= 0) {
        dup2(null, STDOUT_FILENO);
        close(null);
    }
    captured = tmpfile();
    if (captured) {
        fflush(stderr);
        dup2(fileno(captured), STDERR_FILENO);
    }
}

int cli_mpi_rank(void)
{
    return solo ? 0 : world_rank;
}

int cli_mpi_size(void)
{
    return solo ? 1 : world_size;
}

int cli_mpi_solo(void)
{
    if (world_rank != 0)
        return 1;
    solo = 1;
    return 0;
}

int cli_mpi_test_fault(void)
{
    const char *r = getenv("DRAGARC_MPI_TEST_FAULT");
    return world_size > 1 && !solo && r && *r && atoi(r) == world_rank;
}

/* This process's standard error written since the last call, at most n - 1 bytes, into buf. */
static void take_captured(char *buf, size_t n)
{
    buf[0] = '\0';
    if (!captured)
        return;
    fflush(stderr);
    long end = lseek(fileno(captured), 0, SEEK_END);
    size_t len = end > forwarded ? (size_t)(end - forwarded) : 0;
    if (len > n - 1)
        len = n - 1;
    ssize_t got = pread(fileno(captured), buf, len, forwarded);
    buf[got > 0 ? got : 0] = '\0';
    forwarded = end > forwarded ? end : forwarded;
}

/* MPI_Allreduce of one int that waits without spinning: a process that waits here (for rank 0 to finish a command
 * it runs alone, or to summarise and write a run) would otherwise keep a core busy polling, taking it from the
 * threads of the processes still working on the same machine. It looks every millisecond. */
static int allreduce_int(int mine, MPI_Op op)
{
    int out = mine, done = 0;
    MPI_Request req;
    MPI_Iallreduce(&mine, &out, 1, MPI_INT, op, MPI_COMM_WORLD, &req);
    MPI_Test(&req, &done, MPI_STATUS_IGNORE);
    while (!done) {
        struct timespec ms = {0, 1000000};
        nanosleep(&ms, NULL);
        MPI_Test(&req, &done, MPI_STATUS_IGNORE);
    }
    return out;
}

int cli_mpi_agree(int status)
{
    if (cli_mpi_size() == 1)
        return status;
    int worst = allreduce_int(status, MPI_MAX);
    char msg[4096];
    int who = allreduce_int(status != 0 ? world_rank : world_size, MPI_MIN);
    if (worst == 0 || who == 0) {
        take_captured(msg, sizeof msg); /* rank 0 said it already, or all went well: nothing to bring */
        return worst;
    }
    if (world_rank == who) {
        take_captured(msg, sizeof msg);
        MPI_Send(msg, (int)strlen(msg) + 1, MPI_CHAR, 0, 0, MPI_COMM_WORLD);
    } else if (world_rank == 0) {
        MPI_Recv(msg, (int)sizeof msg, MPI_CHAR, who, 0, MPI_COMM_WORLD, MPI_STATUS_IGNORE);
        msg[sizeof msg - 1] = '\0';
        if (msg[0])
            fputs(msg, stderr);
        else
            fprintf(stderr, "dragarc: process %d of %d failed (exit status %d)\n", who, world_size, worst);
    } else {
        take_captured(msg, sizeof msg);
    }
    return worst;
}

int cli_mpi_finish(int status)
{
    solo = 0;
    status = cli_mpi_agree(status);
    MPI_Finalize();
    if (captured)
        fclose(captured);
    /* mpirun ends with the status of the first process that exits with one other than 0, and stops the processes
     * still running then: were every process to exit with the agreed status, the first to exit would stop rank 0
     * in its last steps. So rank 0 alone carries the status, and mpirun returns it. */
    return world_rank == 0 ? status : 0;
}

/* One of `size` bytes as an MPI type, so that counts are items, not bytes (a share of 2^31 bytes is common). */
static int item_type(size_t size, MPI_Datatype *t)
{
    if (size > INT_MAX)
        return -1;
    MPI_Type_contiguous((int)size, MPI_BYTE, t);
    MPI_Type_commit(t);
    return 0;
}

static int too_large(void)
{
    fputs("dragarc: a share of work is too large to gather between processes: use more processes\n", stderr);
    return EXIT_FAILED;
}

int cli_mpi_gather(void *all, const void *mine, size_t size, size_t n)
{
    int p = cli_mpi_size();
    if (p == 1)
        return EXIT_OK;
    if (n > INT_MAX || size > INT_MAX / (size_t)p)
        return too_large(); /* counts are ints of items; every process sees the same n and size */
    size_t first, step, count;
    cli_mpi_share(n, &first, &step, &count);
    MPI_Datatype item, spaced;
    MPI_Type_contiguous((int)size, MPI_BYTE, &item);
    MPI_Type_commit(&item);
    if (world_rank != 0) {
        MPI_Send(mine, (int)count, item, 0, 0, MPI_COMM_WORLD);
        MPI_Type_free(&item);
        return EXIT_OK;
    }
    /* rank 0: item j of process q goes to index q + j p, so the items received lie p items apart */
    MPI_Type_create_resized(item, 0, (MPI_Aint)size * p, &spaced);
    MPI_Type_commit(&spaced);
    for (size_t j = 0; j < count; j++)
        memcpy((char *)all + j * (size_t)p * size, (const char *)mine + j * size, size);
    for (int q = 1; q < p; q++) {
        size_t cq = n > (size_t)q ? (n - (size_t)q + (size_t)p - 1) / (size_t)p : 0;
        MPI_Recv((char *)all + (size_t)q * size, (int)cq, spaced, q, 0, MPI_COMM_WORLD, MPI_STATUS_IGNORE);
    }
    MPI_Type_free(&spaced);
    MPI_Type_free(&item);
    return EXIT_OK;
}

int cli_mpi_gather_any(const void *mine, size_t nmine, size_t size, void **all, size_t *nall)
{
    int p = cli_mpi_size();
    if (p == 1)
        return gather_alone(mine, nmine, size, all, nall);
    *all = NULL;
    *nall = 0;
    MPI_Datatype t;
    if (item_type(size, &t) != 0)
        return too_large();
    long long n = (long long)nmine;
    long long *each = world_rank == 0 ? calloc((size_t)p, sizeof *each) : NULL;
    int *counts = world_rank == 0 ? malloc((size_t)p * sizeof *counts) : NULL;
    int *displs = world_rank == 0 ? malloc((size_t)p * sizeof *displs) : NULL;
    int ok = world_rank != 0 || (each && counts && displs);
    MPI_Bcast(&ok, 1, MPI_INT, 0, MPI_COMM_WORLD);
    if (ok)
        MPI_Gather(&n, 1, MPI_LONG_LONG, each, 1, MPI_LONG_LONG, 0, MPI_COMM_WORLD);
    long long total = 0;
    if (ok && world_rank == 0) {
        for (int r = 0; r < p; r++) {
            if (each[r] > INT_MAX || total > INT_MAX - each[r])
                ok = 0;
            counts[r] = ok ? (int)each[r] : 0;
            displs[r] = ok ? (int)total : 0;
            total += each[r];
        }
        if (ok && total > 0 && !(*all = malloc((size_t)total * size)))
            ok = 0;
    }
    MPI_Bcast(&ok, 1, MPI_INT, 0, MPI_COMM_WORLD);
    if (ok)
        MPI_Gatherv(mine, (int)nmine, t, *all, counts, displs, t, 0, MPI_COMM_WORLD);
    free(each), free(counts), free(displs);
    MPI_Type_free(&t);
    if (!ok) {
        free(*all);
        *all = NULL;
        if (world_rank == 0)
            fputs("dragarc: out of memory gathering the results\n", stderr);
        return EXIT_FAILED;
    }
    if (world_rank == 0)
        *nall = (size_t)total;
    return EXIT_OK;
}

#else /* one process: rank 0 of 1 */

void cli_mpi_start(int *argc, char ***argv)
{
    (void)argc, (void)argv;
}

int cli_mpi_finish(int status)
{
    return status;
}

int cli_mpi_rank(void)
{
    return 0;
}

int cli_mpi_size(void)
{
    return 1;
}

int cli_mpi_solo(void)
{
    return 0;
}

int cli_mpi_agree(int status)
{
    return status;
}

int cli_mpi_test_fault(void)
{
    return 0;
}

int cli_mpi_gather(void *all, const void *mine, size_t size, size_t n)
{
    (void)all, (void)mine, (void)size, (void)n;
    return EXIT_OK;
}

int cli_mpi_gather_any(const void *mine, size_t nmine, size_t size, void **all, size_t *nall)
{
    return gather_alone(mine, nmine, size, all, nall);
}

#endif
