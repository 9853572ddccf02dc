#!/usr/bin/env python3
"""Writes the demo tank folders of sample-inspections/.

Every number here is INVENTED for the demo: the site (Kestrel Reach, a fictional
terminal), the tanks, their history and every reading. The patterns follow what
inspectors commonly see (common practice, not measured data): the fastest loss in the
bottom course near the floor, where water and sludge settle, and in the top course in
the vapour space; slower general loss elsewhere; a gauge that reads to 0.01 mm
(0.001 in) with a scatter of about +/-0.1 mm.

Run from the repository root:  python3 tests/tools/make-sample-inspections.py
The output is deterministic (fixed generator state), so re-running it rewrites the
same files.
"""
import datetime as dt
import math
import os
import random

HERE = os.path.join(os.path.dirname(os.path.abspath(__file__)), "..", "..", "sample-inspections")


def years(a, b):
    return (b - a).days / 365.25


def write(path, text):
    os.makedirs(os.path.dirname(path), exist_ok=True)
    with open(path, "w", newline="") as f:
        f.write(text)


# ---------------------------------------------------------------------------------
# KR-T12: SI, crude oil, five surveys over twenty years, bottom course near t_min.
# ---------------------------------------------------------------------------------
def tank_t12():
    rng = random.Random(1212)
    root = os.path.join(HERE, "kestrel-t12")
    write(os.path.join(root, "tank.toml"), """\
# INVENTED DEMO DATA: a fictional tank at the fictional Kestrel Reach terminal.
# Every value and reading in this folder was made up to show what strake does.
id = "KR-T12"
name = "Kestrel Reach tank 12, crude oil (demo)"
units = "SI"
diameter = 36.0
max_fill_height = 13.8
specific_gravity = 0.90
construction = "welded"
joint_efficiency = 1.0
in_service_since = 1996-04-15

[assessment]
thickness_basis = "minimum"
rate_basis = "conservative"

[[course]]
height = 2.4
nominal_thickness = 16.0
material = "A36"

[[course]]
height = 2.4
nominal_thickness = 13.5
material = "A36"

[[course]]
height = 2.4
nominal_thickness = 11.0
material = "A36"

[[course]]
height = 2.4
nominal_thickness = 9.0
material = "A36"

[[course]]
height = 2.4
nominal_thickness = 8.0
material = "A36"

[[course]]
height = 2.4
nominal_thickness = 8.0
material = "A36"
""")
    service = dt.date(1996, 4, 15)
    surveys = [dt.date(2006, 5, 9), dt.date(2011, 6, 14), dt.date(2016, 5, 24),
               dt.date(2021, 6, 8), dt.date(2026, 5, 19)]
    nominal = [16.0, 13.5, 11.0, 9.0, 8.0, 8.0]
    drops = [0, 45, 90, 135, 180, 225, 270, 315]
    # (level name, height above course bottom in m)
    levels = [("L", 0.15), ("M", 1.2), ("U", 2.25)]
    points = []
    for d_i, az in enumerate(drops):
        for c in range(6):
            for lv, z in levels:
                elev = round(c * 2.4 + z, 2)
                # General loss 0.010-0.020 mm/y; near the floor up to 0.09 mm/y
                # (worst at the water draw-off side, 180 deg); vapour space in the
                # top course 0.05 mm/y.
                rate = rng.uniform(0.010, 0.020)
                if c == 0 and lv == "L":
                    rate = 0.055 + 0.035 * math.cos(math.radians(az - 180)) ** 2 * (az % 180 == 0 or az in (135, 225))
                    rate *= rng.uniform(0.9, 1.1)
                elif c == 0 and lv == "M":
                    rate = rng.uniform(0.02, 0.03)
                elif c == 5:
                    rate = rng.uniform(0.045, 0.06) if lv != "L" else rng.uniform(0.03, 0.04)
                mill = rng.uniform(0.0, 0.25)  # plates arrive slightly over nominal
                points.append({
                    "id": f"D{d_i + 1}-C{c + 1}-{lv}",
                    "course": c + 1, "elev": elev, "az": az,
                    "t0": nominal[c] + mill, "rate": rate,
                })
    rows_by_survey = {}
    for s in surveys:
        rows = []
        for p in points:
            t = p["t0"] - p["rate"] * years(service, s) + rng.gauss(0.0, 0.05)
            rows.append((s.isoformat(), p["course"], p["id"], f"{p['elev']:.2f}", p["az"], f"{t:.2f}", ""))
        rows_by_survey[s] = rows
    # One reading through a thick coating patch in 2011 (flagged as suspect, kept).
    r2011 = rows_by_survey[surveys[1]]
    for i, r in enumerate(r2011):
        if r[2] == "D3-C5-M":
            r2011[i] = r[:5] + ("9.05", "reading taken over coating repair")
    for s in surveys:
        lines = ["date,course,point,elevation_m,azimuth,thickness_mm,note"]
        for r in rows_by_survey[s]:
            note = r[6]
            if "," in note:
                note = '"' + note + '"'
            lines.append(f"{r[0]},{r[1]},{r[2]},{r[3]},{r[4]},{r[5]},{note}")
        write(os.path.join(root, "surveys", f"{s.year}-ut-survey.csv"), "\r\n".join(lines) + "\r\n")


# ---------------------------------------------------------------------------------
# KR-T12 scan: a grid over a thin patch of the bottom course found beside the water
# draw-off, between drops D5 (180 deg) and D6 (225 deg), at the 2026 survey. INVENTED:
# a broad corroded patch (about 1.5 mm deeper than the course around it, in the bottom
# metre where water settles), three isolated pits and three cells that could not be
# read. Its own generator state, so the survey files above do not change.
# ---------------------------------------------------------------------------------
def scan_t12():
    rng = random.Random(1213)
    root = os.path.join(HERE, "kestrel-t12")
    rows, cols = 20, 12
    pitch_mm = 50.0
    bottom_m = 0.10
    pit_threshold = 10.0
    pits = {(4, 2): 8.62, (12, 8): 9.35, (7, 10): 9.71}
    missing = {(19, 0), (19, 1), (18, 0)}
    grid = []
    for r in range(rows):
        z = bottom_m + r * pitch_mm / 1000.0
        # The course around the patch: thinnest at the floor, thicker upward.
        base = 13.60 + 1.40 * (z - bottom_m) / 0.95
        line = []
        for c in range(cols):
            if (r, c) in missing:
                line.append("")
                continue
            if (r, c) in pits:
                line.append(f"{pits[(r, c)]:.2f}")
                continue
            depth = 1.45 * math.exp(-((r - 7.0) / 8.0) ** 2 - ((c - 5.0) / 4.0) ** 2)
            t = base - depth + rng.gauss(0.0, 0.05)
            line.append(f"{t:.2f}")
        grid.append(",".join(line))
    header = [
        "# INVENTED DEMO DATA: a made-up grid scan of the fictional tank KR-T12.",
        "# Thin patch of course 1 beside the water draw-off, about 195 deg (between drops D5 and D6).",
        "# Rows go up from the bottom row at 50 mm; columns go clockwise at 50 mm; readings in mm.",
        "# Three cells behind a bracket could not be read and are left empty.",
        "# course = 1",
        "# date = 2026-05-19",
        f"# bottom_elevation = {bottom_m:.2f}",
        f"# row_pitch = {pitch_mm:.0f}",
        f"# column_pitch = {pitch_mm:.0f}",
        f"# pit_threshold = {pit_threshold:.1f}",
    ]
    write(os.path.join(root, "scans", "2026-c1-draw-off-patch.csv"), "\n".join(header + grid) + "\n")


# ---------------------------------------------------------------------------------
# KR-T03: USC, gasoline, two surveys in one file, average basis.
# ---------------------------------------------------------------------------------
def tank_t03():
    rng = random.Random(303)
    root = os.path.join(HERE, "kestrel-t03")
    write(os.path.join(root, "tank.toml"), """\
# INVENTED DEMO DATA: a fictional tank at the fictional Kestrel Reach terminal.
# Every value and reading in this folder was made up to show what strake does.
id = "KR-T03"
name = "Kestrel Reach tank 3, gasoline (demo)"
units = "USC"
diameter = 80.0
max_fill_height = 37.5
specific_gravity = 0.74
construction = "welded"
joint_efficiency = 0.85
in_service_since = 1974-06-01

[assessment]
thickness_basis = "average"
rate_basis = "conservative"

[[course]]
height = 8.0
nominal_thickness = 0.375
material = "A283 Grade C"

[[course]]
height = 8.0
nominal_thickness = 0.3125
material = "A283 Grade C"

[[course]]
height = 8.0
nominal_thickness = 0.25
material = "A283 Grade C"

[[course]]
height = 8.0
nominal_thickness = 0.25
material = "A283 Grade C"

[[course]]
height = 8.0
nominal_thickness = 0.25
material = "A283 Grade C"
""")
    service = dt.date(1974, 6, 1)
    surveys = [dt.date(2015, 9, 22), dt.date(2025, 10, 7)]
    nominal = [0.375, 0.3125, 0.25, 0.25, 0.25]
    drops = [0, 90, 180, 270]
    levels = [("L", 0.5), ("M", 4.0), ("U", 7.5)]
    points = []
    for d_i, az in enumerate(drops):
        for c in range(5):
            for lv, z in levels:
                rate = rng.uniform(0.0002, 0.0005)  # in/y
                if c == 0 and lv == "L":
                    rate = rng.uniform(0.0008, 0.0012)
                elif c == 4:
                    rate = rng.uniform(0.0007, 0.0010)
                points.append({
                    "id": f"T3-{d_i + 1}{c + 1}{lv}", "course": c + 1,
                    "elev": c * 8.0 + z, "az": az,
                    "t0": nominal[c] + rng.uniform(0.0, 0.010), "rate": rate,
                })
    lines = ["Date,Course,Point,Elevation_ft,Azimuth,Thickness_in"]
    for s in surveys:
        for p in points:
            t = p["t0"] - p["rate"] * years(service, s) + rng.gauss(0.0, 0.002)
            lines.append(f"{s.isoformat()},{p['course']},{p['id']},{p['elev']:.1f},{p['az']},{t:.3f}")
    write(os.path.join(root, "surveys", "shell-ut-2015-2025.csv"), "\n".join(lines) + "\n")


# ---------------------------------------------------------------------------------
# KR-T07: SI, riveted fire-water tank, one survey from a contractor whose gauge
# software writes semicolons and decimal commas; the rate assumes nominal when new.
# ---------------------------------------------------------------------------------
def tank_t07():
    rng = random.Random(707)
    root = os.path.join(HERE, "kestrel-t07")
    write(os.path.join(root, "tank.toml"), """\
# INVENTED DEMO DATA: a fictional tank at the fictional Kestrel Reach terminal.
# Every value and reading in this folder was made up to show what strake does.
id = "KR-T07"
name = "Kestrel Reach tank 7, fire water (demo)"
units = "SI"
diameter = 12.0
max_fill_height = 8.7
specific_gravity = 1.0
construction = "riveted"
in_service_since = 1961-09-01

[[course]]
height = 1.8
nominal_thickness = 9.5

[[course]]
height = 1.8
nominal_thickness = 8.0

[[course]]
height = 1.8
nominal_thickness = 6.5

[[course]]
height = 1.8
nominal_thickness = 6.5

[[course]]
height = 1.8
nominal_thickness = 6.5
""")
    service = dt.date(1961, 9, 1)
    survey = dt.date(2023, 8, 30)
    nominal = [9.5, 8.0, 6.5, 6.5, 6.5]
    lines = ["date;course;point;elevation;thickness"]
    for d in range(1, 7):
        for c in range(5):
            for lv, z in (("L", 0.2), ("U", 1.5)):
                rate = rng.uniform(0.010, 0.020)
                if c == 0 and lv == "L":
                    rate = rng.uniform(0.035, 0.045)
                t = nominal[c] - rate * years(service, survey) + rng.gauss(0.0, 0.05)
                elev = c * 1.8 + z
                lines.append(f"{survey.isoformat()};{c + 1};W{d}-{c + 1}{lv};"
                             f"{elev:.2f}".replace(".", ",") + ";" + f"{t:.2f}".replace(".", ","))
    write(os.path.join(root, "surveys", "2023-contractor-export.csv"), "\n".join(lines) + "\n")


if __name__ == "__main__":
    tank_t12()
    scan_t12()
    tank_t03()
    tank_t07()
