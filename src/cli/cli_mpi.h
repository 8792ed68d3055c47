/* cli_mpi.h: running `footprint`, `table` and `campaign` on several processes (MPI), docs/cluster.md.
 * SPDX-License-Identifier: GPL-3.0-or-later
 *
 * The only MPI in dragarc is behind these functions, in the command-line program (src/cli/cli_mpi.c, built with
 * DRAGARC_MPI): the library stays free of it and offers ranges of work instead (dragarc_footprint_run_range,
 * dragarc_sweep_run_range). Without DRAGARC_MPI there is one process, rank 0 of 1, and every function here is a
 * no-op: the commands run exactly as they always did.
 *
 * How a distributed command goes: every process reads and checks the same input, each flies its share of the
 * global flight (or row) indices (every P-th one), the processes agree on a status (cli_mpi_agree) before any
 * gathering so that a failure on one never leaves the others waiting, the shares are put back at their indices on
 * rank 0 (cli_mpi_gather), and rank 0 alone summarises and writes. Rank 0 then holds exactly the array one process
 * would have made, so every statistic computed from it is the same bit for bit whatever the number of processes.
 */
#ifndef DRAGARC_CLI_MPI_H
#define DRAGARC_CLI_MPI_H

#include <stddef.h>

/* Start MPI (MPI_Init). On every process but rank 0, standard output goes to /dev/null and standard error to a
 * temporary file of its own: a message from there reaches rank 0's standard error only when that process fails
 * and rank 0 does not (cli_mpi_agree), so a run prints each message once. */
void cli_mpi_start(int *argc, char ***argv);

/* Agree on the exit status (cli_mpi_agree), end MPI (MPI_Finalize) and return the status to exit with: the agreed
 * one on rank 0, 0 on the others, so that mpirun exits with the agreed status (it takes the first process that
 * exits with another status than 0, and stops those still running). */
int cli_mpi_finish(int status);

/* This process's rank (0 .. size-1) and the number of processes (1 without MPI, or when running solo). */
int cli_mpi_rank(void);
int cli_mpi_size(void);

/* For a command that is not distributed: 1 on the processes other than rank 0, which skip it (and exit with rank
 * 0's status); 0 on rank 0, which runs it as if it were alone. */
int cli_mpi_solo(void);

/* This process's share of n items (flights, rows), dealt like cards: the items first, first + step, first + 2 step,
 * ..., *count of them, with first the rank and step the number of processes (0, 1, n for one process). Dealt rather
 * than cut in blocks, so that work whose cost changes along the index (a footprint's classes, a table's first
 * axis) falls on every process alike. */
void cli_mpi_share(size_t n, size_t *first, size_t *step, size_t *count);

/* Collective: the worst (largest) of every process's exit status, returned on all of them. When some process
 * failed and rank 0 did not, the first failing process's standard error since the last agreement (its one-line
 * message) is printed on rank 0's standard error, or, when it printed nothing, a line naming the process. */
int cli_mpi_agree(int status);

/* Collective: put every process's share (cli_mpi_share) of n items of `size` bytes back at their indices in all[0 ..
 * n) on rank 0: rank 0 copies its own from mine, the others send theirs (all ignored). With one process it does
 * nothing: that process flies straight into all. Returns an exit status: EXIT_FAILED (after a message) when n is
 * too large for MPI's int counts. */
int cli_mpi_gather(void *all, const void *mine, size_t size, size_t n);

/* Collective: gather every process's nmine items of `size` bytes (any counts) to rank 0, in rank order, into a new
 * array *all (caller frees; NULL when there are none) of *nall items. Elsewhere *all is NULL and *nall 0. Returns
 * an exit status, as cli_mpi_gather (and EXIT_FAILED when out of memory). */
int cli_mpi_gather_any(const void *mine, size_t nmine, size_t size, void **all, size_t *nall);

/* For the tests only: 1 on the process whose rank the environment variable DRAGARC_MPI_TEST_FAULT names (an MPI
 * build run on more than one process), which then fails its share as a flight that cannot be computed would; 0
 * everywhere else. It lets tests/cli/check_mpi.py check that a failure on one process ends every process with one
 * message and no file. */
int cli_mpi_test_fault(void);

#endif
