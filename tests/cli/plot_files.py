# plot_files.py: what the --plot end-to-end checks share: a tally of named checks and the validators of the three
# formats a plot is drawn in.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# The formats' signatures: SVG is XML whose root is <svg> in the SVG namespace (W3C, Scalable Vector Graphics 1.1,
# 2011); PNG opens with the 8-byte signature 89 50 4E 47 0D 0A 1A 0A and then the IHDR chunk holding the width and
# height (W3C/ISO 15948, PNG specification, sections 5.2 and 11.2.2); PDF opens with "%PDF-" and ends with "%%EOF"
# and an optional end of line (ISO 32000-1:2008, 7.5.2 and 7.5.5).

import struct
import xml.etree.ElementTree as ET

tally = {"passed": 0, "failed": 0}


def check(name, ok, why=""):
    """Print "ok NAME" or "FAIL NAME: why" and count it."""
    tally["passed" if ok else "failed"] += 1
    print(f"ok   {name}" if ok else f"FAIL {name}: {why}")


def png_size(path):
    """(width, height) in pixels of a PNG file, or None when it does not open as one."""
    with open(path, "rb") as f:
        b = f.read(24)
    if b[:8] != b"\x89PNG\r\n\x1a\n" or len(b) < 24:
        return None
    length, kind = struct.unpack(">I4s", b[8:16])
    return struct.unpack(">II", b[16:24]) if kind == b"IHDR" and length == 13 else None


def valid_svg(path):
    root = ET.parse(path).getroot()
    return root.tag == "{http://www.w3.org/2000/svg}svg", f"root element {root.tag}"


def valid_png(path):
    size = png_size(path)
    if size is None:
        return False, "no PNG signature and IHDR chunk first"
    return 300 <= size[0] <= 4000 and 300 <= size[1] <= 4000, f"{size[0]} x {size[1]} pixels"


def valid_pdf(path):
    with open(path, "rb") as f:
        b = f.read()
    return b.startswith(b"%PDF-") and b.rstrip(b"\r\n").endswith(b"%%EOF"), "no %PDF- header or %%EOF trailer"


VALIDATORS = {"svg": valid_svg, "png": valid_png, "pdf": valid_pdf}


def validate(path, ext):
    """(ok, why) of the file at path as format ext, a file that is not XML included."""
    try:
        return VALIDATORS[ext](path)
    except ET.ParseError as e:
        return False, f"not XML: {e}"
