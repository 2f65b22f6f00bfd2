#!/usr/bin/env python3
# SPDX-License-Identifier: GPL-3.0-or-later
"""arcwright-cli sweep as a user runs it (suite 'sweep').

Reads the CSV back with Python's csv module (an RFC 4180 reader independent of the program),
compares it with the JSON output of the same sweep, checks that LC_ALL=de_DE.UTF-8 does not change
a byte, that the thread count does not change a byte, and that bad options get exit code 2 and one
line naming the option. Prints TAP.
"""
import csv
import io
import json
import locale
import math
import os
import subprocess
import sys
import tempfile

CLI = os.environ.get("AW_CLI") or sys.argv[1]
results = []


def check(name, ok, detail=""):
    results.append((name, bool(ok), detail))


def run(args, lc_all="C.UTF-8"):
    env = dict(os.environ)
    env["LC_ALL"] = lc_all
    env.pop("LANGUAGE", None)
    p = subprocess.run([CLI, "sweep"] + args, capture_output=True, env=env, timeout=300)
    return p.returncode, p.stdout.decode("utf-8"), p.stderr.decode("utf-8")


def number(text):
    return float("nan") if text == "" else float(text)


def same(a, b):
    return (math.isnan(a) and math.isnan(b)) or a == b


MAP = ["--vary", "mass-g:0.20:0.40:5", "--vary2", "energy-j:0.9:1.5:3", "--energy-j", "1.0"]

# ---- CSV through the csv module, against the JSON of the same sweep ----
rc, out_csv, err = run(MAP + ["--metric", "all", "--energy-limit-j", "1.14"])
check("csv exit code 0", rc == 0, err)
check("csv lines end with CRLF",
      out_csv.endswith("\r\n") and "\n" not in out_csv.replace("\r\n", ""))
check("energy metrics print the caution on stderr", "eye protection" in err, err)
rows = list(csv.reader(io.StringIO(out_csv, newline="")))
header = rows[0]
check("header names the inputs and metrics with units",
      header[:4] == ["setup", "mass_g", "energy_j", "band_range_m"] and header[-1] == "status"
      and "time_at_30m_s" in header and "compliance_pct" in header, repr(header))
check("one row per point", len(rows) == 1 + 5 * 3, str(len(rows)))

rc, out_json, err = run(MAP + ["--metric", "all", "--energy-limit-j", "1.14", "--format", "json"])
check("json exit code 0", rc == 0, err)
doc = json.loads(out_json)
check("json has both axes",
      doc["vary"]["input"] == "mass-g" and doc["vary2"]["input"] == "energy-j")
check("json carries the caution", "caution" in doc)
names = [m["name"] for m in doc["metrics"]]
ok = True
detail = ""
for r in rows[1:]:
    mass, energy = float(r[1]), float(r[2])
    i = doc["vary"]["values"].index(mass)
    j = doc["vary2"]["values"].index(energy)
    for k, name in enumerate(names):
        v_json = doc["setups"][0]["values"][k][j][i]
        v_json = float("nan") if v_json is None else float(v_json)
        if not same(number(r[3 + k]), v_json):
            ok = False
            detail = f"{name} at {mass} g, {energy} J: csv {r[3 + k]} json {v_json}"
    if r[-1] != doc["setups"][0]["status"][j][i]:
        ok = False
        detail = "status differs"
check("csv values equal the json values", ok, detail)
# E = ½·m·v² (closed form): the muzzle energy column is the map's energy value
k_e = header.index("muzzle_energy_j")
check("muzzle energy column equals the energy input",
      all(abs(float(r[k_e]) - float(r[2])) <= 1e-12 for r in rows[1:]))
# band range grows with energy at a fixed BB (more speed, more reach; common practice, no source)
k_b = header.index("band_range_m")
by_mass = {}
for r in rows[1:]:
    by_mass.setdefault(r[1], []).append((float(r[2]), float(r[k_b])))
check("band range grows with energy at every mass",
      all(all(b2 > b1 for (_, b1), (_, b2) in zip(v, v[1:])) for v in by_mass.values()))

# ---- the locale and the thread count do not change a byte ----
try:
    locale.setlocale(locale.LC_ALL, "de_DE.UTF-8")
    locale.setlocale(locale.LC_ALL, "C")
    have_de = True
except locale.Error:
    have_de = False
check("the de_DE.UTF-8 locale exists (generate it: sed -i 's/^# *de_DE.UTF-8/de_DE.UTF-8/' "
      "/etc/locale.gen && locale-gen)", have_de)
if have_de:
    rc, out_de, err = run(MAP + ["--metric", "all", "--energy-limit-j", "1.14"],
                          lc_all="de_DE.UTF-8")
    check("LC_ALL=de_DE.UTF-8 gives the same CSV", rc == 0 and out_de == out_csv)
    rc, out_de_json, err = run(MAP + ["--metric", "all", "--energy-limit-j", "1.14",
                                      "--format", "json"], lc_all="de_DE.UTF-8")
    check("LC_ALL=de_DE.UTF-8 gives the same JSON", rc == 0 and out_de_json == out_json)
rc1, out1, _ = run(MAP + ["--metric", "band-range", "--threads", "1"])
rc3, out3, _ = run(MAP + ["--metric", "band-range", "--threads", "3"])
check("1 and 3 threads give the same bytes", rc1 == 0 and rc3 == 0 and out1 == out3)

# ---- one-input sweep, --output ----
with tempfile.TemporaryDirectory() as d:
    path = os.path.join(d, "lift.csv")
    rc, out, err = run(["--vary", "lift-ratio:0:3:61", "--metric", "time-at:25", "--output", path])
    check("--output writes the file and nothing to stdout", rc == 0 and out == "", err)
    with open(path, newline="") as f:
        lr = list(csv.reader(f))
    check("lift-ratio sweep: 61 rows, header lift_ratio,time_at_25m_s",
          len(lr) == 62 and lr[0] == ["setup", "lift_ratio", "time_at_25m_s", "status"],
          repr(lr[0]))
    check("lift ratio values 0 … 3 in steps of 0.05",
          all(abs(float(r[1]) - 0.05 * i) < 1e-12 for i, r in enumerate(lr[1:])))

# ---- bad input: exit 2, one line naming the option ----
bad = [
    (["--vary", "mass:0.2:0.4:5"], "--vary"),
    (["--vary", "mass-g:0.2:0.4"], "--vary"),
    (["--vary", "mass-g:0.2:abc:5"], "--vary"),
    (["--vary", "mass-g:0.2:0.4:0"], "--vary"),
    (["--vary", "mass-g:-1:0.4:5"], "--vary"),
    (["--vary", "lift-ratio:0:3:5", "--vary2", "spin-rpm:0:9000:5"], "--vary2"),
    (["--vary", "lift-ratio:0:3:5", "--vary2", "lift-ratio:0:1:5"], "--vary2"),
    (["--vary", "mass-g:0.2:0.4:200", "--vary2", "energy-j:1:2:10000"], "more than"),
    (["--vary", "lift-ratio:0:3:5", "--metric", "range"], "--metric"),
    (["--vary", "lift-ratio:0:3:5", "--metric", "time-at:-5"], "--metric"),
    (["--vary", "lift-ratio:0:3:5", "--threads", "0"], "--threads"),
    (["--vary", "lift-ratio:0:3:5", "--threads", "1.5"], "--threads"),
    (["--vary", "lift-ratio:0:3:5", "--format", "xml"], "--format"),
    (["--vary", "lift-ratio:0:3:5", "--hop", "sometimes"], "--hop"),
    (["--vary", "lift-ratio:0:3:5", "--power", "creep:x"], "--power"),
    (["--vary", "lift-ratio:0:3:5", "--setup", "A"], "--setup"),
    (["--metric", "apex"], "--vary"),
    (["--vary", "lift-ratio:0:3:5", "--project", "/nonexistent/x.arcw"], "/nonexistent/x.arcw"),
    (["--vary", "lift-ratio:0:3:5", "--mass-g", "nan"], "--mass-g"),
]
for args, needle in bad:
    rc, out, err = run(args)
    lines = [l for l in err.splitlines() if l.strip()]
    check(f"bad input {' '.join(args)} names {needle}",
          rc in (1, 2) and out == "" and len(lines) == 1 and needle in lines[0]
          and (rc == 2 or "/nonexistent" in needle), f"rc {rc}: {err.strip()}")

# ---- a project with two setups ----
demo = os.path.join(os.environ.get("AW_DATADIR", ""), "demo.arcw")
if os.path.exists(demo):
    with open(demo, encoding="utf-8") as f:
        setups = [s["name"] for s in json.load(f).get("setups", [])]
    if len(setups) >= 2:
        rc, out, err = run(["--project", demo, "--setup", setups[0], "--setup", setups[1],
                            "--vary", "crosswind-mps:-2:2:5", "--metric", "drift-at:20"])
        rr = list(csv.reader(io.StringIO(out, newline="")))
        check("project sweep: two setups, 5 points each", rc == 0 and len(rr) == 11, err)
        check("project sweep names the setups", {r[0] for r in rr[1:]} == set(setups[:2]))

print(f"TAP version 13\n1..{len(results)}")
for n, (name, ok, detail) in enumerate(results, 1):
    print(f"{'ok' if ok else 'not ok'} {n} - {name}")
    if not ok and detail:
        for line in detail.splitlines():
            print(f"# {line}")
sys.exit(0 if all(ok for _, ok, _ in results) else 1)
