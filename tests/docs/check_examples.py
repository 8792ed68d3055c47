#!/usr/bin/env python3
# check_examples.py: run the shell examples in docs/*.md and compare their printed output.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# A fenced block whose first line starts with "$ " and names dragarc is an example: its "$ " lines are
# commands, run in order by bash from the repository root with the built dragarc first on PATH; the other
# lines are the output they print (stdout and stderr). Blocks holding "..." show only part of the output
# and are skipped, and so are blocks right after a line "<!-- example not run: WHY -->" (they need files
# made by hand). --fix rewrites the blocks with the output of this build.
#
# Usage: check_examples.py BUILD_DIR [--fix] [FILE.md ...]
import os
import re
import subprocess
import sys

ROOT = os.path.dirname(os.path.dirname(os.path.dirname(os.path.abspath(__file__))))


def blocks(text):
    """(start, end, lines) of each fenced example block; start..end spans the lines inside the fence."""
    lines = text.split("\n")
    i = 0
    while i < len(lines):
        if lines[i].startswith("```"):
            j = i + 1
            while j < len(lines) and not lines[j].startswith("```"):
                j += 1
            body = lines[i + 1:j]
            marked = i > 0 and "<!-- example not run" in lines[i - 1]
            if body and body[0].startswith("$ ") and "dragarc" in body[0] and not marked:
                yield i + 1, j, body
            i = j + 1
        else:
            i += 1


def run(body, build):
    out = []
    env = dict(os.environ, PATH=os.path.abspath(build) + os.pathsep + os.environ.get("PATH", ""),
               LC_ALL="C", COLUMNS="100")
    env.pop("DRAGARC_PROFILE_PATH", None)
    cwd = ROOT
    for line in body:
        if not line.startswith("$ "):
            continue
        cmd = line[2:]
        out.append(line)
        # a leading "cd DIR && " moves the shell for the rest of the block, as in a terminal
        m = re.match(r"cd (\S+) && (.*)", cmd)
        if m:
            cwd = os.path.join(cwd, m.group(1))
            cmd = m.group(2)
        p = subprocess.run(["bash", "-c", cmd], cwd=cwd, env=env, capture_output=True, text=True, timeout=600)
        text = p.stdout + p.stderr
        out.extend(text.rstrip("\n").split("\n") if text else [])
    return out


def main(argv):
    build, fix = argv[1], "--fix" in argv
    files = [a for a in argv[2:] if a.endswith(".md")] or \
        [os.path.join(ROOT, "docs", f) for f in sorted(os.listdir(os.path.join(ROOT, "docs"))) if f.endswith(".md")]
    bad = good = skipped = 0
    for path in files:
        text = open(path).read()
        lines = text.split("\n")
        edits = []
        for start, end, body in blocks(text):
            if any(l.strip() == "..." or l.strip().endswith("...") for l in body):
                skipped += 1
                continue
            got = run(body, build)
            if got == body:
                good += 1
                continue
            bad += 1
            print("DIFFERS %s:%d: %s" % (os.path.relpath(path, ROOT), start + 1, body[0]))
            for a, b in zip(body, got):
                if a != b:
                    print("    doc: %s\n    now: %s" % (a, b))
                    break
            edits.append((start, end, got))
        if fix and edits:
            for start, end, got in reversed(edits):
                lines[start:end] = got
            open(path, "w").write("\n".join(lines))
    print("%d passed, %d failed (%d partial examples skipped)" % (good, bad, skipped))
    return 1 if bad and not fix else 0


if __name__ == "__main__":
    sys.exit(main(sys.argv))
