#!/usr/bin/env bash
# Runs each fuzz target for SECONDS (default 600), one after the other, with one job
# (the machines have 2 cores). Usage:
#   fuzz/run.sh [SECONDS] [TARGET...]        targets: survey_csv tank_file scan_csv
# Needs cargo-fuzz (`cargo install cargo-fuzz`). Only a stable toolchain exists here;
# RUSTC_BOOTSTRAP=1 lets it use the nightly-only flags that cargo-fuzz passes.
# Starting corpus: the sample tanks and the bad-input corpus (tests/corpus). Crashing inputs are
# left in fuzz/artifacts/TARGET/; keep each as a regression test (tests/it/fuzz_found.rs).
set -uo pipefail
cd "$(dirname "$0")/.."

secs="${1:-600}"
shift || true
targets=("$@")
[ "${#targets[@]}" -eq 0 ] && targets=(survey_csv tank_file scan_csv)

prime_corpus() {
  local target="$1" dir="fuzz/corpus/$1"
  mkdir -p "$dir"
  case "$target" in
    survey_csv)
      # The first byte chooses the context (0 no tank, 1 SI tank, 2 USC tank).
      for f in sample-inspections/*/surveys/*.csv tests/corpus/*/surveys/*.csv tests/corpus/*/*.csv; do
        [ -f "$f" ] || continue
        local prefix='\001'
        case "$f" in *kestrel-t03*) prefix='\002' ;; esac
        { printf "$prefix"; head -c 16000 "$f"; } > "$dir/start-$(echo "$f" | tr '/' '_')"
      done ;;
    tank_file)
      for f in sample-inspections/*/tank.toml tests/corpus/*/tank.toml; do
        [ -f "$f" ] && cp "$f" "$dir/start-$(echo "$f" | tr '/' '_')"
      done ;;
    scan_csv)
      # The first byte chooses the tank (0 none, 1 the SI sample kestrel-t12, 2 the USC
      # sample kestrel-t03): the sample scan with each, and a small USC grid.
      for n in 0 1; do
        { printf "\\00$n"; cat sample-inspections/kestrel-t12/scans/*.csv; } > "$dir/start-si-$n"
      done
      printf '\002# course = 1\n# date = 2024-06-01\n# bottom_elevation = 0.5\n# row_pitch = 2\n# column_pitch = 2\n# pit_threshold = 0.2\n0.31,0.30,\n0.29,0.15,0.30\n0.31,0.30,0.32\n' > "$dir/start-usc" ;;
  esac
}

status=0
for t in "${targets[@]}"; do
  prime_corpus "$t"
  echo "== fuzz $t for $secs s (started $(date -u +%H:%M:%S) UTC)"
  RUSTC_BOOTSTRAP=1 cargo fuzz run -O "$t" "fuzz/corpus/$t" -- \
    -max_total_time="$secs" -max_len=16384 -timeout=10 -rss_limit_mb=2048 -print_final_stats=1 \
    || { echo "== $t: FOUND A CRASH (see fuzz/artifacts/$t/)"; status=1; }
  echo "== $t done $(date -u +%H:%M:%S) UTC"
done
exit "$status"
