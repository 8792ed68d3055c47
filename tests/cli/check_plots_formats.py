# check_plots_formats.py: the file signatures the plot tests check (check_plots.py, check_plots_spray.py).
# SPDX-License-Identifier: GPL-3.0-or-later
#
# SVG is XML whose root is <svg> in the SVG namespace (W3C, Scalable Vector Graphics 1.1, 2011); PNG opens with the
# 8-byte signature 89 50 4E 47 0D 0A 1A 0A and then the IHDR chunk holding the width and height (W3C/ISO 15948, PNG
# specification, sections 5.2 and 11.2.2); PDF opens with "%PDF-" and ends with "%%EOF" and an optional end of line
# (ISO 32000-1:2008, 7.5.2 and 7.5.5). Each returns (ok, why).

import struct
import xml.etree.ElementTree as ET


def valid_svg(path):
    try:
        root = ET.parse(path).getroot()
    except ET.ParseError as e:
        return False, f"not XML: {e}"
    return root.tag == "{http://www.w3.org/2000/svg}svg", f"root element {root.tag}"


def valid_png(path):
    with open(path, "rb") as f:
        b = f.read(33)
    if b[:8] != b"\x89PNG\r\n\x1a\n":
        return False, "no PNG signature"
    length, kind = struct.unpack(">I4s", b[8:16])
    if kind != b"IHDR" or length != 13:
        return False, "no IHDR chunk first"
    w, h = struct.unpack(">II", b[16:24])
    return 300 <= w <= 4000 and 300 <= h <= 4000, f"{w} x {h} pixels"


def valid_pdf(path):
    with open(path, "rb") as f:
        b = f.read()
    return b.startswith(b"%PDF-") and b.rstrip(b"\r\n").endswith(b"%%EOF"), "no %PDF- header or %%EOF trailer"
