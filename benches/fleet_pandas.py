#!/usr/bin/env python3
"""The comparison of the benchmark (benches/run.sh): the fleet calculation written as a
straightforward pandas script, as one would write it in a notebook.

For every tank folder below DIR: read tank.toml (tomllib) and every surveys/*.csv
(pandas.read_csv), take the least reading per course and survey (minimum basis), the
long-term and short-term rates and the conservative rate max(LT, ST) clamped at 0, the
one-foot t_min (API 653 4.3.3.1: S = min(0.80 Y, 0.429 T) for the lower two courses,
min(0.88 Y, 0.472 T) above, T capped; t_min = 4.9 D (H - 0.3) G / (S E) SI or
2.6 D (H - 1) G / (S E) USC, at least 2.5 mm / 0.1 in), remaining life, the API 653 6.3
intervals (UT min(RCA / 2N, 15 y) or 5 y without a rate; external min(RCA / 4N, 5 y)),
due dates, the governing course and the allowable fill height; then one table ordered
by next due date. It covers what the synthetic fleet uses (welded tanks with explicit
strengths, the default bases); it is a yardstick, not a second product.

Usage: python3 benches/fleet_pandas.py DIR > pandas.csv
       python3 benches/fleet_pandas.py --compare pandas.csv strake.csv
"""

import math
import os
import sys
import tomllib

import pandas as pd

DAYS_PER_YEAR = 365.25


def add_years(date, years):
    whole = math.trunc(years)
    days = math.floor((years - whole) * DAYS_PER_YEAR + 0.5)
    return date + pd.DateOffset(months=12 * whole) + pd.Timedelta(days=days)


def assess(folder):
    with open(os.path.join(folder, "tank.toml"), "rb") as f:
        tank = tomllib.load(f)
    usc = tank["units"].upper() == "USC"
    coef, offset, floor, cap = (2.6, 1.0, 0.1, 80000.0) if usc else (4.9, 0.3, 2.5, 552.0)
    survey_dir = os.path.join(folder, "surveys")
    frames = [
        pd.read_csv(os.path.join(survey_dir, name))
        for name in sorted(os.listdir(survey_dir))
        if name.endswith(".csv")
    ]
    df = pd.concat(frames, ignore_index=True)
    df.columns = [c.lower() for c in df.columns]
    if "thickness_mm" in df:
        df["thickness"] = df["thickness_mm"] / (25.4 if usc else 1.0)
    elif "thickness_in" in df:
        df["thickness"] = df["thickness_in"] * (1.0 if usc else 25.4)
    df["date"] = pd.to_datetime(df["date"])
    basis = df.groupby(["course", "date"])["thickness"].min().reset_index()
    latest_survey = df["date"].max()

    d, fill, g = tank["diameter"], tank["max_fill_height"], tank["specific_gravity"]
    shell = sum(c["height"] for c in tank["course"])
    rows = []
    bottom = 0.0
    for i, c in enumerate(tank["course"], start=1):
        y, t = c["yield_strength"], min(c["tensile_strength"], cap)
        s = min(0.80 * y, 0.429 * t) if i <= 2 else min(0.88 * y, 0.472 * t)
        head = max(fill - bottom - offset, 0.0)
        t_min = max(coef * d * head * g / s, floor)
        hist = basis[basis["course"] == i].sort_values("date")
        if len(hist) >= 2:
            t_first, t_prev, t_last = hist["thickness"].iloc[[0, -2, -1]]
            d_first, d_prev, d_last = hist["date"].iloc[[0, -2, -1]]
            lt = (t_first - t_last) / ((d_last - d_first).days / DAYS_PER_YEAR)
            st = (t_prev - t_last) / ((d_last - d_prev).days / DAYS_PER_YEAR)
            rate = max(max(lt, st), 0.0)
            t_act = t_last
            rca = t_act - t_min
            if t_act < t_min:
                life = 0.0
            elif rate > 0:
                life = rca / rate
            else:
                life = math.inf
            if rca <= 0:
                ut, ext = 0.0, 0.0
            elif rate <= 0:
                ut, ext = 15.0, 5.0
            else:
                ut, ext = min(rca / (2 * rate), 15.0), min(rca / (4 * rate), 5.0)
            level = bottom if t_act < floor else s * t_act / (coef * d * g) + offset + bottom
            status = (
                "below-minimum" if t_act < t_min else "monitor" if life < 10 else "ok"
            )
            rows.append((i, life, ut, ext, level, status))
        bottom += c["height"]
    courses = pd.DataFrame(rows, columns=["course", "life", "ut", "ext", "level", "status"])
    gov = courses.sort_values(["life", "course"]).iloc[0]
    ut, ext = courses["ut"].min(), courses["ext"].min()
    next_ut, next_ext = add_years(latest_survey, ut), add_years(latest_survey, ext)
    rank = {"below-minimum": 0, "monitor": 2, "ok": 3}
    status = min(courses["status"], key=rank.get)
    return {
        "tank_id": tank["id"],
        "status": status,
        "next_due": min(next_ut, next_ext).date().isoformat(),
        "next_ut_inspection": next_ut.date().isoformat(),
        "next_external_inspection": next_ext.date().isoformat(),
        "governing_course": int(gov["course"]),
        "remaining_life_years": gov["life"] if math.isfinite(gov["life"]) else None,
        "allowable_fill_height": min(courses["level"].min(), shell),
    }


def main(root):
    folders = sorted(
        dirpath for dirpath, _, files in os.walk(root) if "tank.toml" in files
    )
    table = pd.DataFrame([assess(f) for f in folders])
    table = table.sort_values(["next_due", "tank_id"], kind="stable")
    table.to_csv(sys.stdout, index=False)


def compare(pandas_csv, strake_csv):
    """Rows that disagree between the two tables (dates and course exactly, numbers
    within 1e-4 relative); prints a summary, exits 1 on any disagreement."""
    a = pd.read_csv(pandas_csv).set_index("tank_id")
    b = pd.read_csv(strake_csv).set_index("tank_id").loc[a.index]
    bad = 0
    for col in ["status", "next_due", "next_ut_inspection", "next_external_inspection",
                "governing_course"]:
        n = int((a[col].astype(str) != b[col].astype(str)).sum())
        bad += n
        print(f"{col}: {n} of {len(a)} differ")
    for col in ["remaining_life_years", "allowable_fill_height"]:
        x, y = a[col].astype(float), b[col].astype(float)
        both_nan = x.isna() & y.isna()
        close = ((x - y).abs() <= 1e-4 * y.abs().clip(lower=1e-9)) | both_nan
        n = int((~close).sum())
        bad += n
        print(f"{col}: {n} of {len(a)} differ beyond 1e-4 relative")
    order = list(a.index) == list(pd.read_csv(strake_csv)["tank_id"])
    print(f"same order: {order}")
    sys.exit(0 if bad == 0 and order else 1)


if __name__ == "__main__":
    if len(sys.argv) == 4 and sys.argv[1] == "--compare":
        compare(sys.argv[2], sys.argv[3])
    elif len(sys.argv) == 2:
        main(sys.argv[1])
    else:
        sys.exit(__doc__)
