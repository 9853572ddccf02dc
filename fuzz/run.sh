#!/usr/bin/env bash
# Runs each fuzz target for SECONDS (default 600), one after the other, with one job
# (the machines have 2 cores). Usage:
#   fuzz/run.sh [SECONDS] [TARGET...]        targets: survey_csv tank_file
# Needs cargo-fuzz (`cargo install cargo-fuzz`). Only a stable toolchain exists here;
# RUSTC_BOOTSTRAP=1 lets it use the nightly-only flags that cargo-fuzz passes.
# Seeds: the sample tanks and the bad-input corpus (tests/corpus). Crashing inputs are
# left in fuzz/artifacts/TARGET/; keep each as a regression test (tests/it/fuzz_found.rs).
set -uo pipefail
cd "$(dirname "$0")/.."

secs="${1:-600}"
shift || true
targets=("$@")
[ "${#targets[@]}" -eq 0 ] && targets=(survey_csv tank_file)

seed() {
  local target="$1" dir="fuzz/corpus/$1"
  mkdir -p "$dir"
  case "$target" in
    survey_csv)
      # The first byte chooses the context (0 no tank, 1 SI tank, 2 USC tank).
      for f in sample-inspections/*/surveys/*.csv tests/corpus/*/surveys/*.csv tests/corpus/*/*.csv; do
        [ -f "$f" ] || continue
        local prefix='\001'
        case "$f" in *kestrel-t03*) prefix='\002' ;; esac
        { printf "$prefix"; head -c 16000 "$f"; } > "$dir/seed-$(echo "$f" | tr '/' '_')"
      done ;;
    tank_file)
      for f in sample-inspections/*/tank.toml tests/corpus/*/tank.toml; do
        [ -f "$f" ] && cp "$f" "$dir/seed-$(echo "$f" | tr '/' '_')"
      done ;;
  esac
}

status=0
for t in "${targets[@]}"; do
  seed "$t"
  echo "== fuzz $t for $secs s (started $(date -u +%H:%M:%S) UTC)"
  RUSTC_BOOTSTRAP=1 cargo fuzz run -O "$t" "fuzz/corpus/$t" -- \
    -max_total_time="$secs" -max_len=16384 -timeout=10 -rss_limit_mb=2048 -print_final_stats=1 \
    || { echo "== $t: FOUND A CRASH (see fuzz/artifacts/$t/)"; status=1; }
  echo "== $t done $(date -u +%H:%M:%S) UTC"
done
exit "$status"
