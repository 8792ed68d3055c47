#!/usr/bin/env python3
# check_campaign.py: `dragarc campaign` end to end on docs/examples/campaign-ascent.json: every case's files, each
# case's summary.json byte for byte what `dragarc footprint --json` prints for the scenario changed here by the
# case's merge patch (IETF RFC 7386, 2014, section 2, applied by this script's own few lines, apart from dragarc's),
# the combined CSV and JSON against the cases' summaries number for number, the HTML report's parts, the printed
# summary and its cautions;
# bad campaigns and cases refused before anything is flown or written.
# SPDX-License-Identifier: GPL-3.0-or-later
#
# Usage: check_campaign.py DRAGARC_BINARY SOURCE_DIR WORK_DIR
# Prints "ok NAME" or "FAIL NAME: why", then "N passed, M failed"; exits 1 if any failed.
import csv
import json
import math
import os
import shutil
import subprocess
import sys

passed = failed = 0


def check(ok, name, why=""):
    global passed, failed
    if ok:
        passed += 1
        print(f"ok   {name}")
    else:
        failed += 1
        print(f"FAIL {name}: {why}")


def merge_patch(target, patch):
    """RFC 7386, section 2 (the MergePatch function, as its pseudocode says)."""
    if not isinstance(patch, dict):
        return patch
    if not isinstance(target, dict):
        target = {}
    for k, v in patch.items():
        if v is None:
            target.pop(k, None)
        else:
            target[k] = merge_patch(target.get(k), v)
    return target


def main():
    binary, src, work = sys.argv[1:4]
    shutil.rmtree(work, ignore_errors=True)
    os.makedirs(work)
    examples = os.path.join(src, "docs", "examples")
    camp_file = os.path.join(examples, "campaign-ascent.json")
    camp = json.load(open(camp_file))
    samples = "40"

    def run(args, cwd=work):
        return subprocess.run([binary] + args, capture_output=True, text=True, cwd=cwd, timeout=300)

    out = os.path.join(work, "out")
    r = run(["campaign", camp_file, "--out", out, "--samples", samples, "--quiet"])
    check(r.returncode == 0 and r.stderr == "", "the campaign runs", f"exit {r.returncode}: {r.stderr[-300:]}")
    names = [c["name"] for c in camp["cases"]]
    check(all(n in r.stdout for n in names) and "Cautions:" in r.stdout and "published criteria" in r.stdout,
          "the summary names every case, the criteria and the cautions", r.stdout[-500:])
    for c in camp["cases"]:
        d = os.path.join(out, c["folder"])
        want = {"summary.json", "footprint.geojson", "footprint.svg"}
        got = set(os.listdir(d)) if os.path.isdir(d) else set()
        check(got == want, f"{c['name']}: its folder holds {sorted(want)}", sorted(got))
        # the same case by hand: the scenario changed by the patch, its name the case's, flown by `footprint`
        base = os.path.join(examples, camp["scenario"])
        scen = merge_patch(json.load(open(base)), c.get("set", {}))
        scen["name"] = f"{scen['name']}, {c['name']}"
        # written here: the example scenario refers to no other file
        own = os.path.join(work, f"case-{c['folder']}.json")
        json.dump(scen, open(own, "w"))
        ref = run(["footprint", own, "--samples", samples, "--seed", str(camp["seed"]), "--json"])
        summ = open(os.path.join(d, "summary.json")).read() if "summary.json" in got else ""
        check(ref.returncode == 0 and ref.stdout == summ, f"{c['name']}: summary.json is what footprint --json prints "
              "for the patched scenario", ref.stderr[-300:])

    check(sorted(os.listdir(out)) == ["campaign.csv", "campaign.html", "campaign.json", "campaign.svg"] +
          sorted(c["folder"] for c in camp["cases"]), "the campaign's folder: the combined files, the map and a folder "
          "per case", sorted(os.listdir(out)))
    html = open(os.path.join(out, "campaign.html")).read() if os.path.exists(os.path.join(out, "campaign.html")) else ""
    check(html.count("<svg") == 1 and "<script" not in html and all(f">{n}<" in html for n in names) and
          "Read before acting" in html and "RFC 7386" in html and "Published criteria" in html,
          "campaign.html: the cases' table, one map, the criteria, the cautions and the sources, no script")
    rows = list(csv.DictReader(open(os.path.join(out, "campaign.csv"))))
    doc = json.load(open(os.path.join(out, "campaign.json")))
    check(len(rows) == len(names) and [x["case"] for x in rows] == names, "campaign.csv has a row per case, in order",
          [x.get("case") for x in rows])
    check([x["name"] for x in doc["cases"]] == names and len(doc.get("cautions", [])) >= 3 and
          doc.get("published_criteria"), "campaign.json has a case per case, the criteria and the cautions")
    for row, case, c in zip(rows, doc["cases"], camp["cases"]):
        s = json.load(open(os.path.join(out, c["folder"], "summary.json")))
        a, e = s["all"], s["all"]["ellipses"][0]
        pairs = [("mean east", float(row["mean_east_m"]), a["mean_impact"]["east"], case["mean_impact"]["east"]),
                 ("mean latitude", float(row["mean_latitude"]), a["mean_impact"]["latitude"],
                  case["mean_impact"]["latitude"]),
                 ("1 sigma major", float(row["ellipse_1sigma_major_m"]), e["semi_major"],
                  case["ellipse_1sigma"]["semi_major"]),
                 ("1 sigma minor", float(row["ellipse_1sigma_minor_m"]), e["semi_minor"],
                  case["ellipse_1sigma"]["semi_minor"]),
                 ("hazardous share", float(row["hazardous_share"]), a["hazardous_share"], case["hazardous_share"]),
                 ("E_c", float(row["expected_casualties"]), s["summary"]["expected_casualties"],
                  case["expected_casualties"]),
                 ("landed", float(row["landed"]), a["landed"], case["landed"]),
                 ("altitude", float(row["breakup_altitude_m"]), s["breakup"]["altitude"], case["breakup"]["altitude"])]
        # numbers written with 17 significant digits (CSV) or read back exactly (JSON): equal, not close
        bad = [p for p in pairs if not (p[1] == p[2] == p[3])]
        check(not bad, f"{c['name']}: the CSV and JSON rows are its summary's numbers exactly", bad)
        az = (e["azimuth"] + 360.0) % 180.0
        check(math.isclose(float(row["ellipse_azimuth_deg"]), az, rel_tol=1e-12), f"{c['name']}: ellipse azimuth")
        want = "yes" if s["summary"]["within_criterion"] else "no"
        check(row["within_criterion"] == want and case["within_criterion"] == s["summary"]["within_criterion"],
              f"{c['name']}: against the criterion")
    r = run(["campaign", camp_file, "--out", os.path.join(work, "again"), "--samples", samples, "--json"])
    check(r.returncode == 0 and r.stdout == open(os.path.join(out, "campaign.json")).read(),
          "--json prints campaign.json")

    # refused before anything is flown or written: no output folder at all
    def refused(name, text, args, field):
        f = os.path.join(work, "bad.json")
        with open(f, "w") as fp:
            fp.write(text)
        o = os.path.join(work, "bad-out")
        shutil.rmtree(o, ignore_errors=True)
        r = run(["campaign", f, "--out", o] + args)
        lines = r.stderr.splitlines()
        check(r.returncode == 2 and len(lines) == 1 and field in lines[0] and not os.path.exists(o) and not r.stdout,
              f"refused: {name}", f"exit {r.returncode}, {lines}")

    bad_case = dict(camp, scenario=os.path.join(examples, camp["scenario"]),
                    cases=camp["cases"][:1] + [{"name": "low", "set": {"breakup": {"altitude": -5}}}])
    refused("an unknown key", json.dumps(dict(camp, case=[])), [], "bad.json: unknown key \"case\"")
    refused("a case's bad breakup, before the first case flies", json.dumps(bad_case), [],
            "bad.json: cases[1] (")
    refused("a case's bad breakup names the field", json.dumps(bad_case), [], "): breakup.altitude: ")
    refused("a missing scenario", json.dumps(dict(bad_case, cases=[{"scenario": "nowhere.json"}])), [],
            "cases[0] (")
    refused("two cases in one folder", json.dumps(dict(camp, cases=[{"folder": "a"}, {"folder": "a"}])), [],
            "cases[1].folder")
    refused("not JSON", "{", [], "not valid JSON")
    r = run(["campaign", camp_file])
    check(r.returncode == 2 and "--out" in r.stderr, "refused: no --out", r.stderr)
    r = subprocess.run([binary, "campaign", camp_file, "--out", os.path.join(work, "dated")], capture_output=True,
                       text=True, env=dict(os.environ, SOURCE_DATE_EPOCH="yesterday"))
    check(r.returncode == 2 and "SOURCE_DATE_EPOCH" in r.stderr and not os.path.exists(os.path.join(work, "dated")),
          "refused: a SOURCE_DATE_EPOCH that is no number", r.stderr)
    blocker = os.path.join(work, "a-file")
    open(blocker, "w").write("x")
    r = run(["campaign", camp_file, "--out", blocker, "--samples", "5"])
    check(r.returncode == 2 and len(r.stderr.splitlines()) == 1 and "cannot make the folder" in r.stderr,
          "refused: --out names a file", r.stderr)
    print(f"{passed} passed, {failed} failed")
    return 1 if failed else 0


if __name__ == "__main__":
    sys.exit(main())
