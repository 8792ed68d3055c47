#!/usr/bin/env python3
"""A GeoJSON file written by dragarc read by Python's own json module and held to RFC 7946 (Butler, H. et al.
2016, "The GeoJSON Format", IETF RFC 7946): a FeatureCollection of Features; positions [longitude, latitude(,
altitude)] with longitudes in [-180, 180] and latitudes in [-90, 90]; linear rings closed with 4 or more positions,
exteriors counter-clockwise and holes clockwise (section 3.1.6); no NaN or Infinity (not JSON, RFC 8259).

Usage: check_geojson.py FILE
SPDX-License-Identifier: GPL-3.0-or-later
"""
import json
import sys

passed = failed = 0


def check(ok, what):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print(f"FAIL {what}")


def reject_constant(name):
    raise ValueError(f"{name} is not JSON")


def position_ok(p):
    return (len(p) in (2, 3) and all(isinstance(v, (int, float)) for v in p)
            and -180.0 <= p[0] <= 180.0 and -90.0 <= p[1] <= 90.0)


def twice_area(ring):
    return sum(p[0] * q[1] - q[0] * p[1] for p, q in zip(ring, ring[1:]))


def check_polygon(rings, where):
    check(len(rings) >= 1, f"{where}: a polygon with no ring")
    for k, ring in enumerate(rings):
        check(len(ring) >= 4, f"{where}[{k}]: {len(ring)} positions, fewer than 4")
        check(ring[0] == ring[-1], f"{where}[{k}]: not closed")
        check(all(position_ok(p) for p in ring), f"{where}[{k}]: a bad position")
        a = twice_area(ring)
        check(a > 0 if k == 0 else a < 0, f"{where}[{k}]: {'exterior' if k == 0 else 'hole'} turns the wrong way")


def main():
    with open(sys.argv[1], encoding="utf-8") as f:
        doc = json.load(f, parse_constant=reject_constant)
    check(doc.get("type") == "FeatureCollection", "type is not FeatureCollection")
    check("crs" not in doc, "a crs member (RFC 7946 section 4 has none)")
    features = doc.get("features", [])
    check(len(features) > 0, "no features")
    for i, feat in enumerate(features):
        where = f"features[{i}]"
        check(feat.get("type") == "Feature", f"{where}: not a Feature")
        check("properties" in feat, f"{where}: no properties member")
        g = feat["geometry"]
        c = g["coordinates"]
        if g["type"] == "Point":
            check(position_ok(c), f"{where}: bad point {c}")
        elif g["type"] == "LineString":
            check(len(c) >= 2 and all(position_ok(p) for p in c), f"{where}: bad line")
        elif g["type"] == "MultiLineString":
            check(all(len(l) >= 2 and all(position_ok(p) for p in l) for l in c), f"{where}: bad lines")
        elif g["type"] == "Polygon":
            check_polygon(c, where)
        elif g["type"] == "MultiPolygon":
            for p, poly in enumerate(c):
                check_polygon(poly, f"{where}[{p}]")
        else:
            check(False, f"{where}: unexpected geometry {g['type']}")
    print(f"{passed} passed, {failed} failed")
    sys.exit(1 if failed else 0)


if __name__ == "__main__":
    main()
