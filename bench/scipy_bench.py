#!/usr/bin/python3
# SPDX-License-Identifier: GPL-3.0-or-later
# Copyright (C) 2026 the dragarc developers.
#
# scipy_bench.py: the four bench problems of bench_flight.c flown with SciPy's solve_ivp, timed.
#
# The problems are read from the JSON file bench_flight writes (its parameters in SI units and
# radians, dragarc's range, and dragarc's own Cd at points between the table's); the physics here is
# written again from the equations and shares no code with dragarc:
#   dx/dt = v,  dv/dt = -g z^ + (rho V g / m) z^ - (D / m) (v - w(z - z_ground))
#   table drag  D = 1/2 rho Cd(x) A |v - w|, x = log10(Re) or Mach, Cd by Steffen's monotone cubic
#               (M. Steffen 1990, "A simple method for monotonic interpolation in one dimension",
#               Astron. Astrophys. 239:443, eqs. 2-11, with the "simplest possibility" end slopes of
#               section 2.2; linear for two points), held constant beyond the ends
#   sphere drag D = 12 A mu / d * (Cd Re / 24), Cd of Clift, Grace & Weber (1978), "Bubbles, Drops, and
#               Particles", Table 5.2 (the pieces quoted in src/physics/drag.c's comment)
#   ISA         U.S. Standard Atmosphere 1976 (NASA-TM-X-74335) below 80 km: geopotential altitude,
#               linear molecular-scale temperature in layers, eqs. 33a/33b, 42, 50, 51
#   wind        constant, or layered: speed linear in height, direction along the shorter arc
# Steffen's method is used (not SciPy's PCHIP, which chooses other slopes) so that the equations are
# the same; the interpolation is checked against dragarc's Cd values to 1e-12 before anything is timed.
#
# Each method's range must agree with dragarc's to 1e-6 relative, or the script says so and exits 3.
# Usage: /usr/bin/python3 scipy_bench.py PROBLEMS_JSON OUT_JSON [--loop SECONDS] [--repeats N] [--check]
# --check: the agreement checks only (each method flown once, nothing timed); run by ctest.

import json
import math
import statistics
import sys
import time

from scipy.integrate import solve_ivp

RANGE_RTOL = 1e-6

# ---- U.S. Standard Atmosphere 1976 ----
G0 = 9.80665
R0_EARTH = 6356766.0
R_STAR = 8314.32
M0 = 28.9644
GAMMA = 1.4
P0 = 101325.0
SUTH_BETA = 1.458e-6
SUTH_S = 110.4
H_BASE = [0.0, 11000.0, 20000.0, 32000.0, 47000.0, 51000.0, 71000.0]
T_BASE = [288.15, 216.65, 216.65, 228.65, 270.65, 270.65, 214.65]
LAPSE = [-0.0065, 0.0, 0.001, 0.0028, 0.0, -0.0028, -0.002]
GMR = G0 * M0 / R_STAR


def _pressure(i, pb, h):
    if LAPSE[i] == 0.0:
        return pb * math.exp(-GMR * (h - H_BASE[i]) / T_BASE[i])
    t = T_BASE[i] + LAPSE[i] * (h - H_BASE[i])
    return pb * (T_BASE[i] / t) ** (GMR / LAPSE[i])


P_BASE = [P0]
for _i in range(len(H_BASE) - 1):
    P_BASE.append(_pressure(_i, P_BASE[-1], H_BASE[_i + 1]))


def isa(z, dT):
    """(density, speed of sound, viscosity) at geometric altitude z (m), below 80 km."""
    if not (-5000.0 <= z <= 80000.0):
        raise ValueError("altitude %g m outside the range treated here" % z)
    h = R0_EARTH * z / (R0_EARTH + z)
    i = len(H_BASE) - 1
    while i > 0 and h < H_BASE[i]:
        i -= 1
    p = _pressure(i, P_BASE[i], h)
    t = T_BASE[i] + LAPSE[i] * (h - H_BASE[i]) + dT
    return p * M0 / (R_STAR * t), math.sqrt(GAMMA * R_STAR / M0 * t), SUTH_BETA * t ** 1.5 / (t + SUTH_S)


# ---- drag ----
def steffen(xs, ys):
    """Steffen's monotone cubic through (xs, ys), clamped beyond the ends; linear for two points."""
    n = len(xs)
    if n == 2:
        def lin(u):
            if u <= xs[0]:
                return ys[0]
            if u >= xs[1]:
                return ys[1]
            return ys[0] + (ys[1] - ys[0]) * (u - xs[0]) / (xs[1] - xs[0])
        return lin
    hs = [xs[i + 1] - xs[i] for i in range(n - 1)]
    ss = [(ys[i + 1] - ys[i]) / hs[i] for i in range(n - 1)]
    sign = lambda v: -1.0 if v < 0.0 else 1.0  # noqa: E731  (sign of 0 taken as +1)
    yp = [ss[0]] + [0.0] * (n - 2) + [ss[-1]]
    for i in range(1, n - 1):
        p = (ss[i - 1] * hs[i] + ss[i] * hs[i - 1]) / (hs[i - 1] + hs[i])  # eq. 8
        yp[i] = (sign(ss[i - 1]) + sign(ss[i])) * min(abs(ss[i - 1]), abs(ss[i]), 0.5 * abs(p))  # eq. 11
    coef = []
    for i in range(n - 1):  # eqs. 2-5
        coef.append(((yp[i] + yp[i + 1] - 2 * ss[i]) / hs[i] ** 2, (3 * ss[i] - 2 * yp[i] - yp[i + 1]) / hs[i],
                     yp[i], ys[i]))

    def f(u):
        if u <= xs[0]:
            return ys[0]
        if u >= xs[-1]:
            return ys[-1]
        lo, hi = 0, n - 1
        while hi - lo > 1:
            mid = (lo + hi) // 2
            if xs[mid] <= u:
                lo = mid
            else:
                hi = mid
        a, b, c, d = coef[lo]
        du = u - xs[lo]
        return d + du * (c + du * (b + du * a))
    return f


def sphere_cd_re24(re):
    if re <= 0.01:
        return 1.0 + 3.0 / 16.0 * re / 24.0
    w = math.log10(re)
    if re <= 20.0:
        return 1.0 + 0.1315 * re ** (0.82 - 0.05 * w)
    if re <= 260.0:
        return 1.0 + 0.1935 * re ** 0.6305
    if re <= 1.5e3:
        cd = 10.0 ** (1.6435 - 1.1242 * w + 0.1558 * w * w)
    elif re <= 1.2e4:
        cd = 10.0 ** (-2.4571 + 2.5558 * w - 0.9295 * w * w + 0.1049 * w ** 3)
    elif re <= 4.4e4:
        cd = 10.0 ** (-1.9181 + 0.6370 * w - 0.0636 * w * w)
    elif re <= 3.38e5:
        cd = 10.0 ** (-4.3390 + 1.5809 * w - 0.1546 * w * w)
    elif re <= 4e5:
        cd = 29.78 - 5.3 * w
    elif re <= 1e6:
        cd = 0.1 * w - 0.49
    else:
        cd = 0.19 - 8e4 / re
    return cd * re / 24.0


def table_cd(drag):
    """Cd as a function of the table's own variable (Re or Mach)."""
    if drag["axis"] == "reynolds":
        f = steffen([math.log10(x) for x in drag["x"]], drag["cd"])
        return lambda re: f(math.log10(re)) if re > 0.0 else drag["cd"][0]
    if drag["axis"] == "mach":
        return steffen(drag["x"], drag["cd"])
    raise ValueError("axis %s not used by the bench" % drag["axis"])


# ---- the equations of motion ----
def make_rhs(p):
    m, d, area, vol, g, zg = p["mass"], p["diameter"], p["area"], p["volume"], p["gravity"], p["ground_elevation"]
    atm, wind, drag = p["atmosphere"], p["wind"], p["drag"]
    if atm["model"] == "isa":
        site, dT = atm["site_elevation"], atm["temperature_offset"]
        air = lambda z: isa(site + z, dT)  # noqa: E731
    else:
        const = (atm["density"], math.sqrt(GAMMA * R_STAR / M0 * atm["temperature"]), atm["viscosity"])
        air = lambda z: const  # noqa: E731
    if wind["model"] == "constant":
        we, wn = -wind["speed"] * math.sin(wind["from"]), -wind["speed"] * math.cos(wind["from"])
        wfun = lambda h: (we, wn)  # noqa: E731
    else:
        rows = wind["layers"]

        def wfun(h):
            if h <= rows[0][0]:
                sp, fr = rows[0][1], rows[0][2]
            elif h >= rows[-1][0]:
                sp, fr = rows[-1][1], rows[-1][2]
            else:
                i = 0
                while rows[i + 1][0] <= h:
                    i += 1
                s = (h - rows[i][0]) / (rows[i + 1][0] - rows[i][0])
                sp = rows[i][1] + s * (rows[i + 1][1] - rows[i][1])
                fr = rows[i][2] + s * math.remainder(rows[i + 1][2] - rows[i][2], 2.0 * math.pi)
            return -sp * math.sin(fr), -sp * math.cos(fr)
    if drag["model"] == "sphere":
        def dfac(speed, rho, a, mu):
            return 12.0 * area * mu / d * sphere_cd_re24(rho * speed * d / mu) if rho > 0.0 else 0.0
    elif drag["model"] == "table":
        cd = table_cd(drag)
        if drag["axis"] == "reynolds":
            def dfac(speed, rho, a, mu):
                return 0.5 * rho * cd(rho * speed * d / mu) * area * speed
        else:
            def dfac(speed, rho, a, mu):
                return 0.5 * rho * cd(speed / a) * area * speed
    else:
        raise ValueError("drag model %s not used by the bench" % drag["model"])

    def rhs(t, y):
        rho, a, mu = air(y[2])
        we_, wn_ = wfun(y[2] - zg)
        rx, ry, rz = y[3] - we_, y[4] - wn_, y[5]
        speed = math.sqrt(rx * rx + ry * ry + rz * rz)
        k = dfac(speed, rho, a, mu) / m
        return [y[3], y[4], y[5], -k * rx, -k * ry, -g + rho * vol * g / m - k * rz]
    return rhs


def fly(p, rhs, method):
    la = p["launch"]
    ch = math.cos(la["elevation"])
    y0 = [0.0, 0.0, la["height"], la["speed"] * ch * math.sin(la["azimuth"]),
          la["speed"] * ch * math.cos(la["azimuth"]), la["speed"] * math.sin(la["elevation"])]
    zg = p["ground_elevation"]

    def ground(t, y):
        return y[2] - zg
    ground.terminal = True
    ground.direction = -1
    sol = solve_ivp(rhs, (0.0, p["max_time"]), y0, method=method, rtol=p["rtol"], atol=p["atol"], events=ground)
    if sol.status != 1 or len(sol.y_events[0]) == 0:
        raise RuntimeError("%s: no ground impact (%s)" % (method, sol.message))
    yi = sol.y_events[0][0]
    return math.hypot(yi[0], yi[1]), sol.t_events[0][0], sol.nfev, sol.t.size - 1


def main():
    args = sys.argv[1:]
    if len(args) < 2:
        sys.stderr.write("usage: scipy_bench.py PROBLEMS_JSON OUT_JSON [--loop SECONDS] [--repeats N]\n")
        return 2
    loop, repeats = 0.5, 3
    check = "--check" in args
    if "--loop" in args:
        loop = float(args[args.index("--loop") + 1])
    if "--repeats" in args:
        repeats = int(args[args.index("--repeats") + 1])
    with open(args[0]) as f:
        problems = json.load(f)["problems"]
    out = {"problems": []}
    status = 0
    if not check:
        print("%-9s %-7s %12s %8s %8s %16s" % ("problem", "method", "ms/flight", "steps", "nfev", "range m"))
    for p in problems:
        drag = p["drag"]
        if drag["model"] == "table":  # the same Cd as dragarc's before anything is flown
            cd = table_cd(drag)
            for x, want in drag["check"]:
                got = cd(x)
                if abs(got - want) > 1e-12 * abs(want):
                    sys.stderr.write("scipy_bench: %s: Cd(%g) = %.15g here, %.15g in dragarc\n" % (p["name"], x, got,
                                                                                                  want))
                    return 3
        rhs = make_rhs(p)
        want = p["dragarc"]["range"]
        # The explicit methods are left out on the fine drop: stability holds their steps to about a relaxation
        # time (1.2 ms against an 80 s flight), some 10^4 steps and seconds per flight in Python.
        if p["name"] == "fine_drop":
            methods = ["LSODA", "Radau", "BDF"]
        else:
            methods = ["DOP853", "RK45", "LSODA"] + (["Radau", "BDF"] if p["name"] == "drop" else [])
        rows = []
        for meth in methods:
            rng, tof, nfev, nsteps = fly(p, rhs, meth)
            rel = abs(rng - want) / abs(want)
            if not rel <= RANGE_RTOL:
                sys.stderr.write("scipy_bench: %s: %s range %.12g m differs from dragarc's %.12g m by %.3g relative "
                                 "(more than %g)\n" % (p["name"], meth, rng, want, rel, RANGE_RTOL))
                status = 3
                continue
            if check:
                print("%-9s %-7s agrees with dragarc to %.1e (%d steps, %d evaluations)" % (p["name"], meth, rel, nsteps,
                                                                                       nfev))
                continue
            t0 = time.perf_counter()
            fly(p, rhs, meth)
            est = time.perf_counter() - t0
            n = max(1, round(loop / est))
            times = []
            for _ in range(repeats):
                t0 = time.perf_counter()
                for _ in range(n):
                    fly(p, rhs, meth)
                times.append((time.perf_counter() - t0) / n)
            per = statistics.median(times)
            print("%-9s %-7s %12.3f %8d %8d %16.9f" % (p["name"], meth, 1e3 * per, nsteps, nfev, rng))
            rows.append({"method": meth, "seconds_per_flight": per, "loop_flights": n, "steps": nsteps, "nfev": nfev,
                         "range": rng, "time_of_flight": tof, "range_rel_diff": rel})
        out["problems"].append({"name": p["name"], "methods": rows})
    with open(args[1], "w") as f:
        json.dump(out, f, indent=1)
    return status


if __name__ == "__main__":
    sys.exit(main())
