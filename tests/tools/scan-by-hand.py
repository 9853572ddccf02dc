#!/usr/bin/env python3
"""An independent calculation of one grid scan, written straight from the published
rules (API 653 4.3.2 and the local form of 4.3.3.1, as methods.md s.3-s.5 state them),
without reading strake's code. It prints the numbers strake's JSON `areas` records
hold, so the two can be compared by eye or with --compare.

Usage (from the repository root):
  python3 tests/tools/scan-by-hand.py SCAN.csv --units SI --diameter 36 --sg 0.9 \
      --stress 171.6 --efficiency 1.0 --fill 13.8 --rate 0.0970764 --years 4.73926
  python3 tests/tools/scan-by-hand.py ... --compare result.json   (strake assess --format json)

Conventions are the ones the README states: rows bottom first; a window is k =
floor(L / row pitch) + 1 consecutive rows of one column (the whole column when the
grid is shorter), skipped when under half its cells are valid; z of a window is its
lowest row; pit length along a column = pit cells x row pitch over every run of
ceil(span / row pitch) rows.
"""
import argparse
import json
import math
import sys


def read_scan(path):
    keys, rows = {}, []
    with open(path, encoding="utf-8-sig") as f:
        for raw in f:
            line = raw.strip()
            if not line:
                continue
            if line.startswith("#"):
                if "=" in line:
                    k, v = line[1:].split("=", 1)
                    keys[k.strip().lower()] = v.strip()
                continue
            delim = ";" if ";" in line else ("\t" if "\t" in line else ",")
            cells = [c.strip() for c in line.split(delim)]
            rows.append([float(c.replace(",", ".")) if c else None for c in cells])
    return keys, rows


def main():
    ap = argparse.ArgumentParser()
    ap.add_argument("scan")
    ap.add_argument("--units", choices=["SI", "USC"], required=True)
    ap.add_argument("--diameter", type=float, required=True)
    ap.add_argument("--sg", type=float, required=True)
    ap.add_argument("--stress", type=float, required=True)
    ap.add_argument("--efficiency", type=float, default=1.0)
    ap.add_argument("--fill", type=float, required=True)
    ap.add_argument("--rate", type=float, default=0.0)
    ap.add_argument("--years", type=float, default=0.0)
    ap.add_argument("--compare", help="strake's JSON output to compare with")
    a = ap.parse_args()

    si = a.units == "SI"
    c = 4.9 if si else 2.6              # API 653 4.3.3.1
    floor = 2.5 if si else 0.1          # API 653 4.3.3.1
    per_len = 1000.0 if si else 12.0    # mm per m, in per ft
    keys, grid = read_scan(a.scan)
    z0 = float(keys["bottom_elevation"].replace(",", "."))
    pitch = float(keys["row_pitch"].replace(",", "."))
    pit = float(keys["pit_threshold"].replace(",", ".")) if "pit_threshold" in keys else None
    nrows, ncols = len(grid), len(grid[0])
    is_pit = lambda v: pit is not None and v < pit
    valid = lambda r, col: grid[r][col] if grid[r][col] is not None and not is_pit(grid[r][col]) else None
    z = lambda r: z0 + r * pitch / per_len
    loss = a.rate * a.years

    def tmin(zz):
        h = max(a.fill - zz, 0.0)
        return max(c * a.diameter * h * a.sg / (a.stress * a.efficiency), floor)

    def level(t, f, zz):
        if t < f * floor:
            return zz
        return a.stress * a.efficiency * t / (f * c * a.diameter * a.sg) + zz

    t2 = min(v for r in range(nrows) for col in range(ncols) if (v := valid(r, col)) is not None)
    pits = [grid[r][col] for r in range(nrows) for col in range(ncols)
            if grid[r][col] is not None and is_pit(grid[r][col])]
    d = a.diameter * 1000.0 if si else a.diameter
    coef = 1.068 if si else 3.7
    cap = 1000.0 if si else 40.0
    L = min(coef * math.sqrt(d * t2), cap)
    k = int(math.floor(L / pitch)) + 1
    n = min(k, nrows)
    wins = []
    for col in range(ncols):
        for r0 in range(nrows - n + 1):
            vals = [valid(r, col) for r in range(r0, r0 + n)]
            vals = [v for v in vals if v is not None]
            if len(vals) * 2 < n:
                continue
            wins.append((sum(vals) / len(vals), col, r0))
    t1 = min(wins) if wins else None
    crit = min(wins, key=lambda w: w[0] - (tmin(z(w[2])) + loss)) if wins else None
    span, limit = (200.0, 50.0) if si else (8.0, 2.0)
    m = min(math.ceil(span / pitch - 1e-9), nrows)
    worst = 0
    for col in range(ncols):
        for r0 in range(nrows - m + 1):
            cnt = sum(1 for r in range(r0, r0 + m)
                      if grid[r][col] is not None and is_pit(grid[r][col]))
            worst = max(worst, cnt)
    out = {
        "t2": t2,
        "averaging_length": L,
        "window_rows": k,
        "t1": t1[0] if t1 else None,
        "t1_column": t1[1] + 1 if t1 else None,
        "t1_first_row": t1[2] + 1 if t1 else None,
        "t1_rule_t_min": tmin(z(crit[2])) if crit else None,
        "t1_rule_required": tmin(z(crit[2])) + loss if crit else None,
        "t1_rule_pass": (crit[0] >= tmin(z(crit[2])) + loss) if crit else None,
        "t2_rule_t_min": tmin(z0),
        "t2_rule_required": 0.6 * tmin(z0) + loss,
        "t2_rule_pass": t2 >= 0.6 * tmin(z0) + loss,
        "least_pit": min(pits) if pits else None,
        "pit_depth_rule_required": 0.5 * tmin(z0) + loss if pits else None,
        "pit_depth_rule_pass": (min(pits) >= 0.5 * tmin(z0) + loss) if pits else None,
        "pit_spacing_worst_length": worst * pitch,
        "pit_spacing_pass": worst * pitch <= limit,
    }
    levels_now = [level(w[0], 1.0, z(w[2])) for w in wins] + [level(t2, 0.6, z0)]
    levels_next = [level(w[0] - loss, 1.0, z(w[2])) for w in wins] + [level(t2 - loss, 0.6, z0)]
    if pits:
        levels_now.append(level(min(pits), 0.5, z0))
        levels_next.append(level(min(pits) - loss, 0.5, z0))
    out["max_fill_height"] = min(levels_now)
    out["max_fill_height_next"] = min(levels_next)
    for key, v in out.items():
        print(f"{key:28} {v}")
    if a.compare:
        with open(a.compare) as f:
            doc = json.load(f)
        area = next(x for x in doc["areas"] if x["file"].endswith(a.scan.split("/")[-1]))
        flat = dict(area)
        for rule in ("t1_rule", "t2_rule", "pit_depth_rule", "pit_spacing_rule"):
            for kk, vv in (area.get(rule) or {}).items():
                flat[f"{rule}_{kk}"] = vv
        flat["pit_spacing_worst_length"] = flat.get("pit_spacing_rule_worst_length")
        flat["pit_spacing_pass"] = flat.get("pit_spacing_rule_pass")
        bad = 0
        for key, v in out.items():
            theirs = flat.get(key)
            same = (v == theirs if isinstance(v, (bool, type(None)))
                    else theirs is not None and abs(v - theirs) <= 1e-5 * max(1.0, abs(v)))
            print(f"{'ok ' if same else 'DIFF'} {key:28} by hand {v}  strake {theirs}")
            bad += not same
        sys.exit(1 if bad else 0)


if __name__ == "__main__":
    main()
