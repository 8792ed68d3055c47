# SPDX-License-Identifier: GPL-3.0-or-later
# The fuzz harnesses, each tests/fuzz/fuzz_<name>.c with its corpus in corpus/<name>/ and its regressions in
# regressions/<name>/. Add a name here to add a harness (DEVELOPERS.md).
set(DRAGARC_FUZZ_HARNESSES scenario footprint_spec sprinkler_spec drift_spec fragment_catalogue catches population fly track campaign)
set(DRAGARC_FUZZ_HARNESSES_TARGETS)
foreach(h IN LISTS DRAGARC_FUZZ_HARNESSES)
  list(APPEND DRAGARC_FUZZ_HARNESSES_TARGETS fuzz_${h})
endforeach()
