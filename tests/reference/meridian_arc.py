#!/usr/bin/env python3
"""The latitude reached by going due north a given distance on the WGS84 ellipsoid, worked out apart from PROJ:
the meridian arc  s(phi) = integral from phi0 to phi of M(t) dt,  with the meridian radius of curvature
    M(phi) = a (1 - e^2) / (1 - e^2 sin^2 phi)^(3/2),   e^2 = f (2 - f)
(the standard formula of geodesy texts, e.g. Torge, W. and Mueller, J. 2012, Geodesy, 4th ed., chapter 4;
recalled), integrated by SciPy's
quad (QUADPACK) and inverted by Brent's method.

Usage: meridian_arc.py [TEST_SOURCE]
Prints the latitudes for each case. With TEST_SOURCE (tests/reference/test_geodesy.c), also checks that the
values written there as MERIDIAN_* defines agree with these to 1e-12 degree (0.1 um), and exits 1 if not.
SPDX-License-Identifier: GPL-3.0-or-later
"""
import math
import re
import sys
import warnings

from scipy.integrate import quad
from scipy.optimize import brentq

A = 6378137.0
F = 1.0 / 298.257223563
E2 = F * (2.0 - F)

# (define name in the C test, start latitude in degrees, distance north in metres)
CASES = [
    ("MERIDIAN_10KM_FROM_EQUATOR_DEG", 0.0, 10000.0),
    ("MERIDIAN_10KM_FROM_60N_DEG", 60.0, 10000.0),
    ("MERIDIAN_200KM_FROM_30S_DEG", -30.0, 200000.0),
]


def meridian_radius(phi):
    return A * (1.0 - E2) / (1.0 - E2 * math.sin(phi) ** 2) ** 1.5


def arc(phi0, phi):
    value, abserr = quad(meridian_radius, phi0, phi, epsabs=1e-9, epsrel=1e-13, limit=200)
    assert abserr < 1e-8, abserr  # metres: 1e-8 m is 1e-13 degree of latitude
    return value


def latitude_after(phi0_deg, s):
    phi0 = math.radians(phi0_deg)
    guess = s / meridian_radius(phi0)
    phi = brentq(lambda p: arc(phi0, p) - s, phi0, phi0 + 2.0 * guess, xtol=1e-16, rtol=4 * sys.float_info.epsilon,
                 maxiter=200)
    return math.degrees(phi)


def main():
    warnings.simplefilter("error")  # a quad that cannot reach its tolerance fails the check
    results = {}
    for name, phi0, s in CASES:
        results[name] = latitude_after(phi0, s)
        print(f"{name} {results[name]:.17g}  (from {phi0} deg, {s:g} m north)")
    if len(sys.argv) > 1:
        with open(sys.argv[1], encoding="utf-8") as f:
            text = f.read()
        bad = 0
        for name, want in results.items():
            m = re.search(r"#define\s+" + name + r"\s+([-+0-9.eE]+)", text)
            if not m:
                print(f"FAIL {name}: not defined in {sys.argv[1]}")
                bad += 1
                continue
            got = float(m.group(1))
            ok = abs(got - want) <= 1e-12
            print(f"{'ok  ' if ok else 'FAIL'} {name}: test file {got!r}, SciPy {want!r}, off by {got - want:.3g}")
            bad += 0 if ok else 1
        print(f"{len(results) - bad} passed, {bad} failed")
        sys.exit(1 if bad else 0)


if __name__ == "__main__":
    main()
