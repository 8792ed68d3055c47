#!/usr/bin/env python3
# check_report.py: `dragarc report` end to end, rendered by a real browser (Debian's chromium, headless).
# SPDX-License-Identifier: GPL-3.0-or-later
#
# usage: check_report.py DRAGARC_BINARY TESTS_DATA_DIR
#
# Builds the fly report of ball-in-wind.json, then checks the file (one page, no <script>, no external reference:
# no http: or https:, no src=, no href= outside the page; every id unique, every url(#..) and href="#.." pointing at
# one of them), the page chromium renders (--dump-dom: the figure's <svg> and the tables are in the DOM, no
# console error logged), a screenshot (a PNG of the asked size) and a print to PDF (its signature, a plausible size
# and page count). Also: the same SOURCE_DATE_EPOCH gives the same bytes; usage errors exit 2 with one line and
# leave no file. The other kinds (aim, sprinkler, drift, footprint, fit) are checked as files and screenshots; the fit
# report also as chromium's DOM, against the numbers `dragarc fit --json` gives for the same inputs, and through a fit
# whose iterations run out (exit 1, the report written with its warning). Exits 77 (ctest's skip) when chromium is
# not installed; CI installs it.
import collections
import json
import math
import os
import re
import shutil
import struct
import subprocess
import sys
import tempfile

passed = failed = 0


def check(ok, what):
    global passed, failed
    if ok:
        passed += 1
    else:
        failed += 1
        print("FAIL", what)


def main():
    if len(sys.argv) != 3:
        print("usage: check_report.py DRAGARC_BINARY TESTS_DATA_DIR", file=sys.stderr)
        return 2
    dragarc, data = sys.argv[1], sys.argv[2]
    browser = shutil.which("chromium") or shutil.which("chromium-browser")
    work = tempfile.mkdtemp(prefix="dragarc-report-")
    try:
        return run(dragarc, data, browser, work)
    finally:
        shutil.rmtree(work, ignore_errors=True)


def dragarc_run(dragarc, args, work, env_extra=None):
    env = dict(os.environ, SOURCE_DATE_EPOCH="1767225600", TMPDIR=work)
    env.update(env_extra or {})
    return subprocess.run([dragarc] + args, cwd=work, env=env, capture_output=True, text=True, timeout=60)


def chromium(browser, work, args):
    """Start headless chromium with a profile of its own; the caller waits (the three runs overlap)."""
    profile = tempfile.mkdtemp(prefix="profile-", dir=work)
    cmd = [browser, "--headless", "--no-sandbox", "--disable-gpu", "--disable-dev-shm-usage", "--no-first-run",
           "--disable-extensions", "--disable-background-networking", "--disable-component-update",
           "--disable-sync", "--hide-scrollbars", "--enable-logging=stderr", "--v=0",
           "--user-data-dir=" + profile] + args
    return subprocess.Popen(cmd, cwd=work, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)


def finish(proc):
    try:
        out, err = proc.communicate(timeout=90)
    except subprocess.TimeoutExpired:
        proc.kill()
        out, err = proc.communicate()
    return subprocess.CompletedProcess(proc.args, proc.returncode, out, err)


def check_page(html, kind, tables):
    """The file: one page, nothing outside it, unique ids, the footer, one figure, its tables, the cautions."""
    check(html.startswith("<!DOCTYPE html>"), kind + ": doctype")
    check("<script" not in html.lower(), "no <script>")
    check(not re.search(r"https?:", html), "no http: or https: reference")
    check(not re.search(r"\ssrc\s*=", html, re.I), "no src= attribute")
    hrefs = re.findall(r"href\s*=\s*[\"']([^\"']*)", html)
    # inside the page: an id, or an image inlined as a data: URI (the cairo driver's colour maps)
    check(hrefs and all(h.startswith("#") or h.startswith("data:image/png;base64,") for h in hrefs),
          kind + ": every href points inside the page")
    check("@import" not in html and "url(" not in re.sub(r"url\(#[^)]*\)", "", html), "no url() outside the page")
    ids = re.findall(r"\sid\s*=\s*[\"']([^\"']*)", html)
    dup = sorted(i for i, n in collections.Counter(ids).items() if n > 1)
    check(ids and not dup, "%d ids, duplicated: %s" % (len(ids), dup[:5]))
    refs = set(re.findall(r"url\(#([^)]*)\)", html)) | {h[1:] for h in hrefs if h.startswith("#")}
    check(refs and refs <= set(ids), "references without their id: %s" % sorted(refs - set(ids))[:5])
    check(re.search(r"<footer>\n<p>Made by dragarc [0-9.]+ on 2026-01-01 00:00 UTC\.", html), "footer: version, date")
    check(html.count("<svg ") == 1 and html.count("<figure>") == 1, kind + ": one figure")
    check(html.count("<table class=\"data\">") + html.count("<table class=\"pairs\">") == tables,
          "%s: %d tables, want %d" % (kind, html.count("<table class="), tables))
    check("Read before acting" in html, kind + ": cautions")


ESTIMATES = "cd,cl,launch.speed,launch.elevation"


def escape(text):
    """As the page writes text: & < > " ' escaped."""
    return (text.replace("&", "&amp;").replace("<", "&lt;").replace(">", "&gt;").replace('"', "&quot;")
            .replace("'", "&#39;"))


def decimals(se):
    """dragarc_fit_decimals: two significant figures of the standard error."""
    if not (se > 0) or not math.isfinite(se):
        return 6
    return max(0, min(12, 1 - math.floor(math.log10(se))))


def check_fit(dragarc, work, examples, track, html):
    """The fit report against `dragarc fit --json` of the same inputs; the same bytes twice; a fit whose iterations
    run out gives exit 1 and a report that says so."""
    scenario = os.path.join(examples, "launcher-ball.json")
    r = dragarc_run(dragarc, ["fit", scenario, track, "--estimate", ESTIMATES, "--json"], work)
    check(r.returncode == 0, "fit --json: exit %d, %r" % (r.returncode, r.stderr))
    doc = json.loads(r.stdout) if r.returncode == 0 else {"estimates": [], "correlation": []}
    for e in doc["estimates"]:
        d = decimals(e["std_error"])
        row = ("<tr><td>%s</td><td>%s</td><td class=\"num\">%.*f</td><td class=\"num\">%.*f</td>"
               "<td class=\"num\">%.2g</td><td class=\"num\">%.*f</td><td class=\"num\">%.*f</td></tr>"
               % (e["name"], e["unit"], max(d, 4), e["start"], d, e["value"], e["std_error"], d, e["lower_95"], d,
                  e["upper_95"]))
        check(row in html, "fit: the row of %s as fit --json gives it: %s" % (e["name"], row))
    check(len(doc["estimates"]) == 4, "fit --json: four estimates")
    for i, row in enumerate(doc["correlation"]):
        cells = "".join("<td class=\"num\">%s</td>" % ("%.3f" % v if j <= i else "") for j, v in enumerate(row))
        check("<tr><td>%s</td>%s</tr>" % (doc["estimates"][i]["name"], cells) in html,
              "fit: correlation row %d" % i)
    check("chi-square</th><td>%.4g on %d degrees of freedom (p = %.3g)" % (doc.get("chi_square", 0),
                                                                            doc.get("degrees_of_freedom", 0),
                                                                            doc.get("chi_square_p", 0)) in html,
          "fit: chi-square as fit --json gives it")
    rms = doc.get("rms_residual", {}).get("position", {})
    check("residual RMS, positions</th><td>%.4g m (east %.4g, north %.4g, up %.4g)</td>"
          % (rms.get("all", 0), rms.get("east", 0), rms.get("north", 0), rms.get("up", 0)) in html,
          "fit: residual RMS as fit --json gives it")
    check("converged after %d iterations, %d flights" % (doc.get("iterations", 0), doc.get("flights", 0)) in html,
          "fit: iterations and flights")
    check("<p>No warnings: the fit converged" in html and not doc.get("warnings"), "fit: no warnings")
    box = html[html.find("class=\"cautions\""):]
    box = box[:box.find("</ul>")]
    check(box.count("<li>") == 3 and all(escape(c) in box for c in doc.get("cautions", [])),
          "fit: exactly the cautions fit --json gives")
    for name in ("Mor\u00e9, J. J. (1978)", "Transtrum, M. K. &amp; Sethna, J. P. (2012)",
                 "Seber, G. A. F. &amp; Wild, C. J. (1989)"):
        check(name in html, "fit: source %s" % name)
    args = ["report", scenario, "--command", "fit", "--track", track, "--estimate", ESTIMATES]
    r = dragarc_run(dragarc, args + ["-o", "fit-again.html"], work)
    again = os.path.join(work, "fit-again.html")
    check(r.returncode == 0 and os.path.exists(again) and open(again, encoding="utf-8").read() == html,
          "fit: the same SOURCE_DATE_EPOCH gives the same page")
    if os.path.exists(again):
        os.remove(again)
    r = dragarc_run(dragarc, args + ["--max-iterations", "1", "-o", "fit-short.html"], work)
    short = os.path.join(work, "fit-short.html")
    text = open(short, encoding="utf-8").read() if os.path.exists(short) else ""
    check(r.returncode == 1 and r.stderr == "" and r.stdout == "", "fit out of iterations: exit %d, %r"
          % (r.returncode, r.stderr))
    check("<p>Warning: The fit did not converge in 1 iteration:" in text and "NOT converged" in text,
          "fit out of iterations: the report says so")
    if os.path.exists(short):
        os.remove(short)


def run(dragarc, data, browser, work):
    scenario = os.path.join(data, "ball-in-wind.json")
    page = os.path.join(work, "fly.html")

    # usage errors: one line, exit 2, no file
    examples = os.path.join(os.path.dirname(os.path.dirname(data)), "docs", "examples")
    track = os.path.join(examples, "launcher-ball-track.csv")
    fit = ["--command", "fit", "-o", "x.html"]
    for args, text in [(["--command", "frobnicate"], "available: fly, aim, sprinkler, drift, footprint, fit"),
                       (fit + ["--estimate", "cd"], "the fit report needs --track TRACK.csv"),
                       (fit + ["--track", track], "needs --estimate NAME[,NAME...]"),
                       (fit + ["--track"], "--track needs the track file (CSV)"),
                       (fit + ["--track", track, "--track", track, "--estimate", "cd"], "only one --track"),
                       (fit + ["--track", track, "--estimate", "cd,drag"], "--estimate: unknown estimate 'drag'"),
                       (fit + ["--track", track, "--estimate", "cd", "--geodesic", "maybe"],
                        "--geodesic needs auto, on or off (got 'maybe')"),
                       (fit + ["--track", track, "--estimate", "cd", "--max-iterations", "0"],
                        "--max-iterations must be a whole number from 1 to"),
                       (fit + ["--track", track, "--estimate", "cd", "--range", "60"],
                        "--range is an option of the aim report, not of the fit report"),
                       (fit + ["--track", track, "--estimate", "cd", "--units", "us"],
                        "--units: the fit report takes no units"),
                       (fit + ["--track", track, "--estimate", "cd", "--residuals", "r.csv"],
                        "unknown option '--residuals'"),
                       (["-o", "x.html", "--track", track], "--track is an option of the fit report, not of the fly"),
                       (["--command", "aim", "-o", "x.html", "--range", "60", "--estimate", "cd"],
                        "--estimate is an option of the fit report, not of the aim report"),
                       (["--command", "footprint", "-o", "x.html", "--geodesic", "on"],
                        "--geodesic is an option of the fit report, not of the footprint report"),
                       (["--command", "aim", "-o", "x.html"], "needs --range METRES"),
                       (["--command", "aim", "-o", "x.html", "--range", "-3"], "--range must be positive"),
                       (["--command", "aim", "-o", "x.html", "--range", "60", "--solve", "spin"],
                        "--solve needs 'elevation' or 'speed', not 'spin'"),
                       (["-o", "x.html", "--range", "60"], "--range is an option of the aim report, not of the fly"),
                       (["--command", "aim", "-o", "x.html", "--range", "60", "--dt", "1"],
                        "--dt is an option of the fly report, not of the aim report"),
                       (["--command", "drift", "-o", "x.html", "--units", "us"],
                        "--units: the drift report takes no units"),
                       (["--command", "footprint", "-o", "x.html", "--samples", "0"],
                        "--samples must be a whole number from 1 to"),
                       (["--command", "sprinkler", "-o", "x.html", "--plot-scale", "free"],
                        "--plot-scale is an option of the fly report, not of the sprinkler report"),
                       ([], "needs the output file: -o FILE.html"),
                       (["-o", "bad.txt"], "name it FILE.html"),
                       (["-o", "x.html", "--plot-scale", "tilted"], "--plot-scale needs 'equal' or 'free'")]:
        r = dragarc_run(dragarc, ["report", scenario] + args, work)
        lines = r.stderr.splitlines()
        check(r.returncode == 2 and len(lines) == 1 and text in lines[0] and not r.stdout,
              "report %s: exit %d, stderr %r" % (" ".join(args), r.returncode, r.stderr))
    r = dragarc_run(dragarc, ["report", scenario, "-o", "x.html"], work, {"SOURCE_DATE_EPOCH": "soon"})
    check(r.returncode == 2 and "SOURCE_DATE_EPOCH" in r.stderr, "a bad SOURCE_DATE_EPOCH: %r" % r.stderr)
    r = dragarc_run(dragarc, ["report", os.path.join(data, "missing-profile.json"), "-o", "x.html"], work)
    check(r.returncode == 2 and r.stderr.count("\n") == 1 and "missing-profile.json" in r.stderr,
          "a bad scenario: %r" % r.stderr)
    r = dragarc_run(dragarc, ["report", scenario, "--command", "aim", "--range", "900", "-o", "x.html"], work)
    check(r.returncode == 1 and r.stderr.count("\n") == 1 and "out of reach" in r.stderr, "aim out of reach: %r" % r.stderr)
    r = dragarc_run(dragarc, ["report", scenario, "--command", "drift", "-o", "x.html"], work)
    check(r.returncode == 2 and r.stderr.count("\n") == 1 and "unknown key" in r.stderr, "a fly scenario to drift")
    r = dragarc_run(dragarc, ["report", scenario, "--command", "fit", "--track", "missing.csv", "--estimate", "cd",
                              "-o", "x.html"], work)
    check(r.returncode == 2 and r.stderr.startswith("dragarc: missing.csv: ") and r.stderr.count("\n") == 1,
          "a missing track: %r" % r.stderr)
    check(sorted(os.listdir(work)) == [], "files left by failed runs: %s" % os.listdir(work))

    # the report, twice with the same date: the same bytes
    r = dragarc_run(dragarc, ["report", scenario, "-o", page], work)
    check(r.returncode == 0 and r.stdout == "" and r.stderr == "", "report: exit %d, %r" % (r.returncode, r.stderr))
    html = open(page, encoding="utf-8").read()
    r2 = dragarc_run(dragarc, ["report", scenario, "-o", "again.html", "--command", "fly"], work)
    check(r2.returncode == 0 and open(os.path.join(work, "again.html"), encoding="utf-8").read() == html,
          "the same SOURCE_DATE_EPOCH gives the same page")
    check(sorted(os.listdir(work)) == ["again.html", "fly.html"], "scratch files left: %s" % os.listdir(work))

    check_page(html, "fly", 3)
    check(html.count("<svg ") == 1 and html.count("<table") == 3, "one figure, three tables")
    check("Read before acting" in html and html.count("<li>") >= 3, "cautions")

    # the other kinds: the page as for fly, their own tables (pairs and data), the command's numbers
    others = []
    for kind, args, tables, size, text in [
            ("aim", [scenario, "--command", "aim", "--range", "60"], 4, (1000, 2300), "<td>2 (lofted)</td>"),
            ("sprinkler", [os.path.join(examples, "sprinkler-garden.json"), "--command", "sprinkler", "--quiet"], 5,
             (1000, 3900), "wetted radius</th><td>10.00 m"),
            ("drift", [os.path.join(examples, "drift-boom.json"), "--command", "drift"], 4, (1000, 2700),
             "90 % deposits</th><td>within 0.47 m downwind"),
            ("footprint", [os.path.join(examples, "footprint-rocket.json"), "--command", "footprint", "--samples",
                           "300", "--quiet"], 5, (1000, 3600), "samples</th><td>300 per class, 900 flights, seed 42"),
            ("fit", [os.path.join(examples, "launcher-ball.json"), "--command", "fit", "--track", track, "--estimate",
                     ESTIMATES], 7, (1000, 4100), "points</th><td>97, from t = 0.02 s to 1.94 s after launch")]:
        page_k = os.path.join(work, kind + ".html")
        r = dragarc_run(dragarc, ["report"] + args + ["-o", page_k], work)
        check(r.returncode == 0 and r.stdout == "" and r.stderr == "", "%s: exit %d, %r" % (kind, r.returncode, r.stderr))
        html_k = open(page_k, encoding="utf-8").read() if os.path.exists(page_k) else ""
        check_page(html_k, kind, tables)
        check(text in html_k, "%s: %r in the page" % (kind, text))
        others.append((kind, page_k, os.path.join(work, kind + ".png"), size))
    fit_page = os.path.join(work, "fit.html")
    check_fit(dragarc, work, examples, track, open(fit_page, encoding="utf-8").read() if os.path.exists(fit_page) else "")

    if not browser:
        print("%d passed, %d failed (chromium not installed: the browser checks were skipped)" % (passed, failed))
        return 1 if failed else 77

    # the DOM chromium builds and its console, a screenshot, a print to PDF: three browsers at once, and one
    # screenshot of each other kind's report (its console checked too), all at once
    shot, pdf = os.path.join(work, "shot.png"), os.path.join(work, "fly.pdf")
    kind_procs = [(kind, shot_k, size, chromium(browser, work, ["--screenshot=" + shot_k, "--window-size=%d,%d" % size,
                                                                 "file://" + page_k]))
                  for kind, page_k, shot_k, size in others]
    fit_dom = chromium(browser, work, ["--dump-dom", "file://" + fit_page])
    procs = [chromium(browser, work, ["--dump-dom", "file://" + page]),
             chromium(browser, work, ["--screenshot=" + shot, "--window-size=1000,1400", "file://" + page]),
             chromium(browser, work, ["--print-to-pdf=" + pdf, "--no-pdf-header-footer", "file://" + page])]
    r, r_shot, r_pdf = [finish(p) for p in procs]

    dom = r.stdout
    check(r.returncode == 0 and "<svg" in dom, "chromium --dump-dom: exit %d" % r.returncode)
    check(dom.count("<svg") == 1 and dom.count("<figure>") == 1, "the figure's <svg> in the DOM")
    check(dom.count("<table") == 3 and dom.count("<th scope=\"col\"") == 5, "the tables in the DOM")
    check("<script" not in dom, "no script in the DOM")
    console = [l for l in r.stderr.splitlines() if "CONSOLE" in l]
    check(not console, "console messages: %s" % console[:3])

    png = open(shot, "rb").read() if os.path.exists(shot) else b""
    check(r_shot.returncode == 0 and png[:8] == b"\x89PNG\r\n\x1a\n", "screenshot is a PNG")
    if len(png) > 24:
        w, h = struct.unpack(">II", png[16:24])
        check((w, h) == (1000, 1400) and len(png) > 20000, "screenshot %dx%d, %d bytes" % (w, h, len(png)))

    body = open(pdf, "rb").read() if os.path.exists(pdf) else b""
    pages = len(re.findall(rb"/Type\s*/Page[^s]", body))
    check(r_pdf.returncode == 0 and body[:5] == b"%PDF-" and b"%%EOF" in body[-1024:], "PDF signature")
    check(len(body) > 20000 and 2 <= pages <= 8, "PDF of %d bytes, %d pages" % (len(body), pages))
    r = finish(fit_dom)
    dom = r.stdout
    check(r.returncode == 0 and dom.count("<svg") == 1 and dom.count("<figure>") == 1, "fit: the figure in the DOM")
    check(dom.count("<table") == 7 and "<script" not in dom, "fit: the tables in the DOM, no script")
    ids = re.findall(r"\sid=\"([^\"]*)\"", dom)
    check(len(ids) > 10 and len(ids) == len(set(ids)), "fit: %d ids in the DOM, all unique" % len(ids))
    for kind, shot_k, size, proc in kind_procs:
        r = finish(proc)
        console = [l for l in r.stderr.splitlines() if "CONSOLE" in l]
        check(r.returncode == 0 and not console, "%s: chromium exit %d, console %s" % (kind, r.returncode, console[:3]))
        png = open(shot_k, "rb").read() if os.path.exists(shot_k) else b""
        check(png[:8] == b"\x89PNG\r\n\x1a\n" and len(png) > 24 and struct.unpack(">II", png[16:24]) == size
              and len(png) > 50000, "%s: screenshot of %d bytes" % (kind, len(png)))
    if os.environ.get("DRAGARC_REPORT_KEEP"):  # a folder to keep the screenshots and the PDF in, for a look
        for f in (shot, pdf, page):
            shutil.copy(f, os.environ["DRAGARC_REPORT_KEEP"])
        shutil.copy(shot, os.path.join(os.environ["DRAGARC_REPORT_KEEP"], "report-fly.png"))
        for kind, shot_k, size, proc in kind_procs:
            shutil.copy(shot_k, os.path.join(os.environ["DRAGARC_REPORT_KEEP"], "report-%s.png" % kind))

    print("%d passed, %d failed" % (passed, failed))
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
