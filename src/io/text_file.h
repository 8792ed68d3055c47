/* text_file.h: reading a scenario-like file together with its folder, private to src/io (scenario_json.c,
 * campaign_json.c).
 * SPDX-License-Identifier: GPL-3.0-or-later
 */
#ifndef DRAGARC_IO_TEXT_FILE_H
#define DRAGARC_IO_TEXT_FILE_H

#include <stddef.h>

#include "dragarc/dragarc.h"

/* Read the file at path (at most 16 MiB) into *text (caller frees) and its folder into dir, n bytes ("." for a bare
 * name): the folder that the file names in it are resolved against. */
int dragarc_io_read_file_and_folder(const char *path, char **text, char *dir, size_t n, dragarc_error *err);

#endif
