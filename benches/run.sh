#!/usr/bin/env bash
# The fleet benchmark, side by side in one run (README, "Speed"):
#   1. generate synthetic fleets (benches/fleetgen.rs, deterministic: the same bytes every time):
#      4M  = 2,000 tanks x 5 surveys x 400 readings  (4 million rows)
#      16M = 2,000 tanks x 20 surveys x 400 readings (16 million rows: 4x the readings
#            of the same tanks and points, so memory must not follow the rows)
#   2. on each, RUNS times, alternating: (a) the floor, the csv crate's ByteRecord loop
#      over the same files and nothing else (benches/csv_floor.rs), (b) `strake fleet`
#      (release build, CSV to /dev/null, no reports); both with the same number of rayon
#      threads: one, then every core; wall time, CPU time and peak memory from
#      /usr/bin/time;
#   3. when valgrind is installed, instructions counted by callgrind for both on a
#      100-tank fleet on one thread (a count that does not depend on the machine's load);
#   4. the pandas script (benches/fleet_pandas.py) once on the 4M fleet, and its table
#      compared with strake's;
#   5. one sample tank with its whole report (`assess kestrel-t12 --out`), RUNS times.
# Medians are printed, and the fastest run of each against the other's (the run least
# disturbed by whatever else the machine is doing). Needs: cargo, /usr/bin/time (Debian
# package `time`), python3 with pandas (pip install pandas); valgrind is optional.
# Timings are never asserted anywhere: this only measures.
#
# Usage: benches/run.sh [WORK_DIR] (default /tmp/strake-bench; about 1 GB of files)
set -euo pipefail
cd "$(dirname "$0")/.."
WORK=${1:-/tmp/strake-bench}
RUNS=${RUNS:-5}
mkdir -p "$WORK"

cargo build --release --locked --quiet
exe() {
  cargo bench --locked --quiet --bench "$1" --no-run --message-format=json 2>/dev/null |
    python3 -c 'import json,sys
for line in sys.stdin:
    m = json.loads(line)
    if m.get("executable") and "bench" in m["target"]["kind"]: print(m["executable"])'
}
GEN=$(exe fleetgen)
FLOOR=$(exe csv_floor)
STRAKE=target/release/strake

[ -d "$WORK/fleet-4m" ] || "$GEN" "$WORK/fleet-4m" --tanks 2000 --surveys 5 --readings 400
[ -d "$WORK/fleet-16m" ] || "$GEN" "$WORK/fleet-16m" --tanks 2000 --surveys 20 --readings 400
[ -d "$WORK/fleet-100" ] || "$GEN" "$WORK/fleet-100" --tanks 100 --surveys 5 --readings 400

# One measurement: prints "wall_s cpu_s peak_kb".
measure() {
  /usr/bin/time -f "%e %U %S %M" -o "$WORK/time.txt" "$@" > /dev/null 2> "$WORK/stderr.txt" || {
    echo "failed: $* ($(head -c 300 "$WORK/stderr.txt"))" >&2
    exit 1
  }
  awk '{ printf "%s %.2f %s\n", $1, $2 + $3, $4 }' "$WORK/time.txt"
}
median() { sort -n | awk '{ a[NR] = $1 } END { print a[int((NR + 1) / 2)] }'; }

echo "machine: $(nproc) cores, $(awk '/MemTotal/ { printf "%.0f GiB", $2 / 1048576 }' /proc/meminfo), $(grep -m1 'model name' /proc/cpuinfo | cut -d: -f2 | sed 's/^ //')"
echo "load average before: $(cut -d' ' -f1-3 /proc/loadavg)"
for size in 4m 16m; do
  dir="$WORK/fleet-$size"
  rows=$(find "$dir" -name '*.csv' -exec cat {} + | wc -l)
  mb=$(du -sm "$dir" | cut -f1)
  find "$dir" -name '*.csv' -exec cat {} + > /dev/null # warm the page cache
  echo "fleet $size: $rows lines, $mb MB in $(find "$dir" -name '*.csv' | wc -l) files"
  for threads in 1 "$(nproc)"; do
    : > "$WORK/floor.txt"
    : > "$WORK/strake.txt"
    : > "$WORK/ratio.txt"
    for _ in $(seq "$RUNS"); do
      f=$(RAYON_NUM_THREADS=$threads measure "$FLOOR" "$dir")
      s=$(RAYON_NUM_THREADS=$threads measure "$STRAKE" fleet "$dir" --format csv)
      echo "$f" >> "$WORK/floor.txt"
      echo "$s" >> "$WORK/strake.txt"
      echo "$f $s" | awk '{ printf "%.3f\n", $4 / $1 }' >> "$WORK/ratio.txt"
    done
    fw=$(cut -d' ' -f1 "$WORK/floor.txt" | median); fc=$(cut -d' ' -f2 "$WORK/floor.txt" | median)
    fm=$(cut -d' ' -f3 "$WORK/floor.txt" | median)
    sw=$(cut -d' ' -f1 "$WORK/strake.txt" | median); sc=$(cut -d' ' -f2 "$WORK/strake.txt" | median)
    sm=$(cut -d' ' -f3 "$WORK/strake.txt" | median)
    echo "  $threads thread(s):"
    echo "    (a) floor:  wall $fw s, cpu $fc s, peak $((fm / 1024)) MB"
    echo "    (b) strake: wall $sw s, cpu $sc s, peak $((sm / 1024)) MB"
    fmin=$(cut -d' ' -f1 "$WORK/floor.txt" | sort -n | head -1)
    smin=$(cut -d' ' -f1 "$WORK/strake.txt" | sort -n | head -1)
    awk -v a="$fw" -v b="$sw" -v c="$fc" -v d="$sc" -v r="$(median < "$WORK/ratio.txt")" \
      -v fm="$fmin" -v sm="$smin" \
      'BEGIN { printf "    b/a: %.2f wall, %.2f cpu (median of the runs side by side: %.2f; fastest against fastest: %.2f)\n", b / a, d / c, r, sm / fm }'
  done
done

if command -v valgrind > /dev/null; then
  echo "instructions (callgrind, 1 thread, fleet of 100 tanks x 5 surveys x 400 readings):"
  count() {
    RAYON_NUM_THREADS=1 valgrind --tool=callgrind --callgrind-out-file=/dev/null "$@" 2>&1 > /dev/null |
      awk '/Collected/ { print $4 }'
  }
  fi=$(count "$FLOOR" "$WORK/fleet-100")
  si=$(count "$STRAKE" fleet "$WORK/fleet-100" --format csv)
  awk -v a="$fi" -v b="$si" 'BEGIN { printf "  (a) %.1f million, (b) %.1f million: b/a %.2f\n", a / 1e6, b / 1e6, b / a }'
fi

echo "pandas on fleet 4m (once):"
"$STRAKE" fleet "$WORK/fleet-4m" --format csv > "$WORK/strake-4m.csv" || true
/usr/bin/time -f "%e %U %S %M" -o "$WORK/pandas-time.txt" \
  python3 benches/fleet_pandas.py "$WORK/fleet-4m" > "$WORK/pandas-4m.csv"
pw=$(cut -d' ' -f1 "$WORK/pandas-time.txt")
sw4=$(for _ in 1 2 3; do measure "$STRAKE" fleet "$WORK/fleet-4m" --format csv; done |
  cut -d' ' -f1 | median)
echo "  pandas: wall $pw s, peak $(( $(cut -d' ' -f4 "$WORK/pandas-time.txt") / 1024 )) MB; strake: wall $sw4 s"
awk -v p="$pw" -v s="$sw4" 'BEGIN { printf "  strake is %.0fx faster\n", p / s }'
python3 benches/fleet_pandas.py --compare "$WORK/pandas-4m.csv" "$WORK/strake-4m.csv" | sed 's/^/  /'
echo "one tank with its whole report (assess kestrel-t12 --out):"
: > "$WORK/report.txt"
for _ in $(seq "$RUNS"); do
  measure "$STRAKE" assess sample-inspections/kestrel-t12 --out "$WORK/report" >> "$WORK/report.txt"
done
echo "  wall $(cut -d' ' -f1 "$WORK/report.txt" | median) s (median of $RUNS), peak $(( $(cut -d' ' -f3 "$WORK/report.txt" | median) / 1024 )) MB"
echo "load average after: $(cut -d' ' -f1-3 /proc/loadavg)"
