#!/usr/bin/python3
# SPDX-License-Identifier: GPL-3.0-or-later
# Copyright (C) 2026 the dragarc developers.
#
# scipy_earth.py: an independent reference check of dragarc flights over a spherical, rotating Earth.
#
# What it checks
#   The equations of motion of a point mass with quadratic drag relative to a log-law wind, buoyancy and
#   the U.S. Standard Atmosphere 1976 (all three taken from scipy_wind_isa.py, which checks them against
#   the standard's tables), in the local frame of the launch point (x east, y north, z up) with the Earth's
#   centre at (0, 0, -R), inverse-square gravitation and the Coriolis and centrifugal accelerations of the
#   turning frame, are written again here from their definitions and integrated with SciPy's DOP853. The
#   impact is reported as dragarc's docs/models.md says: the great-circle arc from the origin to the point
#   below it, split into east and north by the azimuth at the origin, and the velocity turned into the
#   local frame there (here by scipy.spatial.transform.Rotation, not by a formula shared with dragarc).
#   Two scenarios of our own invention are then flown by `DRAGARC fly SCENARIO --json` and the summaries
#   compared. First the reference itself is held to a closed form: a vacuum drop on the turning Earth.
#
# Sources
#   [LL76]  L. D. Landau, E. M. Lifshitz, "Mechanics", 3rd ed., Pergamon, 1976, section 39: the equation of
#           motion in a frame turning at constant Omega, dv/dt = -grad U / m - 2 Omega x v - Omega x (Omega x r)
#           (eq. 39.7, recalled), and problem 1, the eastward deflection (1/3) w g t^3 cos(phi) of a falling body.
#   [GRS80] H. Moritz, "Geodetic Reference System 1980", J. Geodesy 74 (2000) 128: mean radius R1 = 6371008.7714
#           m (recalled); [WGS84] NIMA TR8350.2, 3rd ed., 2000, Table 3.1: w = 7.292115e-5 rad/s (recalled).
#   [Snyder87] J. P. Snyder, "Map Projections: A Working Manual", USGS Prof. Paper 1395, 1987, chapter 25: the
#           azimuthal-equidistant projection of the sphere (distance R theta along the azimuth; recalled).
#   The atmosphere, wind and drag: see scipy_wind_isa.py ([USSA76], [Stull88], [Newton] there).
#
# Usage
#   /usr/bin/python3 scipy_earth.py PATH_TO_DRAGARC_BINARY WORKDIR
# The last line printed is "N passed, M failed"; the exit status is 0 only when M == 0.

import json
import math
import os
import subprocess
import sys

import numpy as np
from scipy.integrate import solve_ivp
from scipy.spatial.transform import Rotation

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from scipy_wind_isa import Tally, isa_density, log_wind, summary_value  # noqa: E402

R_EARTH = 6371008.8     # m [GRS80], dragarc's default
OMEGA = 7.292115e-5     # rad/s [WGS84], dragarc's default


def reference_flight(sc, rtol, atol, vacuum=False):
    """Integrate the scenario dict `sc` over the sphere; returns the summary quantities."""
    pr, la, env = sc["projectile"], sc["launch"], sc["environment"]
    m, d, cd = pr["mass"], pr["diameter"], pr["drag"]["cd"]
    area, vol = math.pi * d * d / 4.0, math.pi * d ** 3 / 6.0
    g0 = env["gravity"]
    atm, wind, earth = env["atmosphere"], env["wind"], env["earth"]
    site, dT = atm["site_elevation"], atm["temperature_offset"]
    ground = sc["ground"]["elevation"]
    R = earth.get("radius", R_EARTH)
    phi = math.radians(earth["latitude"])
    om = OMEGA * np.array([0.0, math.cos(phi), math.sin(phi)])  # the pole is north and up [LL76]

    def centre_vector(s):
        return np.array([s[0], s[1], s[2] + R])

    def height(s):
        return float(np.linalg.norm(centre_vector(s))) - R

    def rhs(t, s):
        r, v = centre_vector(s), s[3:6]
        rn = float(np.linalg.norm(r))
        grav = -g0 * R * R / rn ** 3 * r
        centrifugal = -np.cross(om, np.cross(om, r))
        acc = grav + centrifugal - 2.0 * np.cross(om, v)
        if not vacuum:
            h = rn - R
            rho = isa_density(site + h, dT)
            w = log_wind(h - ground, wind["speed"], wind["ref_height"], wind["roughness"], wind["from"])
            rel = v - w
            speed = float(np.linalg.norm(rel))
            acc = acc - rho * vol / m * (grav + centrifugal)       # buoyancy of air at rest on the turning Earth
            acc = acc - 0.5 * rho * cd * area * speed / m * rel   # drag [Newton]
        return np.concatenate((v, acc))

    def hit_ground(t, s):
        return height(s) - ground
    hit_ground.terminal = True
    hit_ground.direction = -1

    def apex(t, s):
        return float(np.dot(centre_vector(s), s[3:6]))   # r . v: the height's rate, times |r|
    apex.direction = -1

    el, az, v0 = math.radians(la["elevation"]), math.radians(la["azimuth"]), la["speed"]
    s0 = [0.0, 0.0, la["height"], v0 * math.cos(el) * math.sin(az), v0 * math.cos(el) * math.cos(az),
          v0 * math.sin(el)]
    sol = solve_ivp(rhs, (0.0, sc["solver"]["max_time"]), s0, method="DOP853", rtol=rtol, atol=atol,
                    events=(hit_ground, apex))
    if sol.status != 1 or len(sol.t_events[0]) != 1:
        raise RuntimeError("reference flight did not reach the ground: %s" % sol.message)
    s = sol.y_events[0][0]
    r = centre_vector(s)
    theta = math.atan2(math.hypot(r[0], r[1]), r[2])       # angle at the centre
    azi = math.atan2(r[0], r[1])                             # azimuth of the great circle at the origin
    east, north = R * theta * math.sin(azi), R * theta * math.cos(azi)    # [Snyder87]
    k = np.cross([0.0, 0.0, 1.0], r)
    k = k / np.linalg.norm(k)
    vloc = Rotation.from_rotvec(-theta * k).apply(s[3:6])   # the velocity in the local frame at the point
    vh = math.hypot(vloc[0], vloc[1])
    apex_h = max([la["height"]] + [height(e) for e in sol.y_events[1]])
    return {
        "range": math.hypot(east, north),
        "downrange": east * math.sin(az) + north * math.cos(az),
        "crossrange": east * math.cos(az) - north * math.sin(az),
        "time_of_flight": sol.t_events[0][0],
        "apex_height": apex_h,
        "impact_speed": float(np.linalg.norm(vloc)),
        "impact_angle": math.degrees(math.atan2(-vloc[2], vh)),
        "east": east, "north": north,
    }


BASE = {
    "projectile": {"mass": 4.0, "diameter": 0.12, "drag": {"model": "constant", "cd": 0.8}},
    "environment": {
        "gravity": 9.80665,
        "atmosphere": {"model": "isa", "site_elevation": 0.0, "temperature_offset": 0.0},
        "wind": {"model": "log", "speed": 12.0, "from": 290.0, "ref_height": 10.0, "roughness": 0.05},
    },
    "ground": {"elevation": 0.0},
    "solver": {"rtol": 1e-12, "atol": 1e-10, "max_time": 5000},
}

# 1. A dense fragment shed at 30 km, 900 m/s climbing at 35 degrees toward 060, at 35 N: it rises to some 50 km
#    and comes down about 90 km away, deflected to the right by the Coriolis term.
SC_CLIMB = json.loads(json.dumps(BASE))
SC_CLIMB["name"] = "reference: fragment over a turning sphere at 35 N"
SC_CLIMB["launch"] = {"speed": 900.0, "elevation": 35.0, "azimuth": 60.0, "height": 30000.0}
SC_CLIMB["environment"]["earth"] = {"model": "spherical", "latitude": 35.0}

# 2. A denser one shed at 60 km, 2500 m/s level toward 170, at 20 S on a warm day: some 300 km of great circle,
#    where the flat Earth's errors are large.
SC_LONG = json.loads(json.dumps(BASE))
SC_LONG["name"] = "reference: long flight over a turning sphere at 20 S"
SC_LONG["projectile"] = {"mass": 40.0, "diameter": 0.2, "drag": {"model": "constant", "cd": 1.0}}
SC_LONG["launch"] = {"speed": 2500.0, "elevation": 0.0, "azimuth": 170.0, "height": 60000.0}
SC_LONG["environment"]["atmosphere"]["temperature_offset"] = 8.0
SC_LONG["environment"]["earth"] = {"model": "spherical", "latitude": -20.0}

SCENARIOS = [("climb", SC_CLIMB), ("long", SC_LONG)]
KEYS = ["range", "downrange", "crossrange", "time_of_flight", "apex_height", "impact_speed", "impact_angle"]

# dragarc runs at rtol 1e-12, atol 1e-10; the reference at 1e-13 must agree with itself at 1e-11 to a hundredth
# of the tolerance against dragarc. That tolerance is 1e-7 relative: the flights take some hundreds to thousands
# of steps, each within rtol 1e-12, and drag damps the errors rather than amplifying them, so a global error of
# 1e-9 relative is expected; 1e-7 leaves room for the impact's root finding and the dense interpolation of the
# apex. The floors (1e-4 m, 1e-7 s, 1e-7 m/s, 1e-7 deg) are the same 1e-7 relative on scales of 1 km, 1 s,
# 1 m/s and 1 deg, for quantities that may be near zero.
REL_TOL = 1e-7
ABS_FLOOR = {"range": 1e-4, "downrange": 1e-4, "crossrange": 1e-4, "apex_height": 1e-4, "time_of_flight": 1e-7,
             "impact_speed": 1e-7, "impact_angle": 1e-7, "east": 1e-4, "north": 1e-4}


def tolerance(key, ref):
    return max(ABS_FLOOR[key], REL_TOL * abs(ref))


def check_vacuum_drop(tally):
    """The reference against [LL76] section 39 problem 1, worked for the plumb line as in test_earth.c: a body dropped
    from rest from 100 m at the equator lands (1/3) w sqrt(8 h^3 / g_e) east, g_e = g0 - w^2 R; 1e-4 relative covers
    the neglected terms (the gravitation's growth over the fall, about h / R = 1.6e-5; (w t)^2 = 1e-7)."""
    sc = json.loads(json.dumps(SC_CLIMB))
    sc["launch"] = {"speed": 0.0, "elevation": 0.0, "azimuth": 0.0, "height": 100.0}
    sc["environment"]["earth"]["latitude"] = 0.0
    r = reference_flight(sc, 1e-13, 1e-13, vacuum=True)
    ge = 9.80665 - OMEGA * OMEGA * R_EARTH
    want = OMEGA * math.sqrt(8.0 * 100.0 ** 3 / ge) / 3.0
    tally.check("reference vacuum drop: east deflection [LL76]", r["east"], want, 1e-4 * want)


def run_dragarc(tally, binary, workdir, label, sc, ref):
    path = os.path.join(workdir, "scipy_earth_%s.json" % label)
    with open(path, "w") as f:
        json.dump(sc, f, indent=2)
        f.write("\n")
    for method in ("dop853", "rk8pd", "adams", "bdf"):
        sc["solver"]["method"] = method
        with open(path, "w") as f:
            json.dump(sc, f, indent=2)
        try:
            proc = subprocess.run([binary, "fly", path, "--json"], capture_output=True, text=True, timeout=300)
        except (OSError, subprocess.TimeoutExpired) as e:
            tally.fail("%s %s dragarc run" % (label, method), str(e))
            continue
        if proc.returncode != 0:
            tally.fail("%s %s dragarc run" % (label, method), "exit %d: %s" % (proc.returncode, proc.stderr))
            continue
        doc = json.loads(proc.stdout)
        summary = doc["summary"]
        for k in KEYS:
            tally.check("%s %s %s" % (label, method, k), summary_value(summary, k), ref[k], tolerance(k, ref[k]),
                        "dragarc", "scipy")
        pos = summary["impact_position"]
        for k, key in (("x", "east"), ("y", "north")):
            v = pos[k]["value"] if isinstance(pos[k], dict) else pos[k]
            tally.check("%s %s impact %s" % (label, method, key), float(v), ref[key], tolerance(key, ref[key]),
                        "dragarc", "scipy")
        if "rotating Earth" not in doc["cautions"][0]:
            tally.fail("%s %s caution" % (label, method), "the model limits do not name the rotating Earth")


def main(argv):
    if len(argv) != 3:
        sys.stderr.write("usage: %s DRAGARC_BINARY WORKDIR\n" % argv[0])
        return 2
    tally = Tally()
    check_vacuum_drop(tally)
    binary, workdir = argv[1], argv[2]
    os.makedirs(workdir, exist_ok=True)
    for label, sc in SCENARIOS:
        fine = reference_flight(sc, 1e-13, 1e-13)
        coarse = reference_flight(sc, 1e-11, 1e-11)
        for k in KEYS:
            tally.check("%s reference converged %s" % (label, k), coarse[k], fine[k], 0.01 * tolerance(k, fine[k]),
                        "rtol1e-11", "rtol1e-13")
        print("     %s: reference %s" % (label, ", ".join("%s=%.12g" % (k, fine[k]) for k in KEYS)))
        run_dragarc(tally, binary, workdir, label, sc, fine)
    print("%d passed, %d failed" % (tally.passed, tally.failed))
    return 0 if tally.failed == 0 else 1


if __name__ == "__main__":
    sys.exit(main(sys.argv))
