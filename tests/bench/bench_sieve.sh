#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Runs the bench_sieve Google Benchmark (SegmentedSieve over a grid of lo x block size, every
# configuration checking its own answers) and writes data_out/bench/sieve_<date>.csv: the
# comment block of bench_common.sh, then Google Benchmark's CSV.
#
# Usage: tests/bench/bench_sieve.sh [--build-dir DIR] [--no-build] [--out-dir DIR] [ARGS...]
#   ARGS go to bench_sieve as they are: --smoke, --len=N, --benchmark_filter=..., ...
# Exit status: that of bench_sieve (1 when an answer was wrong), 2 on bad usage or a failed build.
set -euo pipefail
SELF="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)/$(basename "${BASH_SOURCE[0]}")"
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$SELF")/bench_common.sh"
cd "$BENCH_REPO_ROOT"

BUILD_DIR=build-bench
BUILD=1
OUT_DIR=data_out/bench
args=()
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --out-dir) OUT_DIR="${2:?--out-dir needs a value}"; shift 2 ;;
    -h|--help) sed -n '3,/^set -euo/p' "$SELF" | sed '$d; s/^# \{0,1\}//'; exit 0 ;;
    *) args+=("$1"); shift ;;
  esac
done

if ((BUILD)); then
  echo "bench_sieve: building $BUILD_DIR (Release, SQFC_BUILD_BENCHMARKS=ON)"
  bench_build "$BUILD_DIR" || exit 2
else
  bench_check_release "$BUILD_DIR" || exit 2
fi
BENCH="$BUILD_DIR/bin/bench_sieve"
[ -x "$BENCH" ] || bench_die "$BENCH not found (configure with -DSQFC_BUILD_BENCHMARKS=ON)"

mkdir -p "$OUT_DIR"
WORK="$(mktemp -d "${TMPDIR:-/tmp}/sqfc-bench-sieve.XXXXXX")"
trap 'rm -rf "$WORK"' EXIT
CSV="$OUT_DIR/sieve_$(date -u +%Y-%m-%dT%H%M%SZ).csv"
load_start="$(bench_load)"
echo "bench_sieve: load average at start: $load_start ($(nproc) cores)"
status=0
"$BENCH" "${args[@]}" --benchmark_out="$WORK/gb.csv" --benchmark_out_format=csv || status=$?
load_end="$(bench_load)"
{
  echo "# sqfc benchmark: arith::SegmentedSieve over [lo, lo + len), values per second"
  bench_header "$BUILD_DIR"
  echo "# command: $BENCH ${args[*]}"
  echo "# threads: 1 (the sieve alone, on the calling thread)"
  echo "# load average (1/5/15 min): start $load_start, end $load_end"
  echo "# checks: $( ((status == 0)) && echo pass || echo "FAIL (bench_sieve exit status $status)")"
  echo "# real_time is in the time_unit column; for the best rate use the _min row: len / real_time"
  # Google Benchmark puts its context (date, CPU, caches, load) above the CSV header row;
  # keep it, as comments.
  if [ -f "$WORK/gb.csv" ]; then awk '/^name,/ { data = 1 } { print (data ? "" : "# ") $0 }' "$WORK/gb.csv"; fi
} >"$CSV"

# Summary: the minimum real time of each configuration and the rate it gives.
if [ -f "$WORK/gb.csv" ]; then
  echo
  echo "bench_sieve summary (best of the repeats; values per second = len / min real time)"
  awk -F, '/^name,/ { for (i = 1; i <= NF; i++) c[$i] = i; header = 1; next }
    !header { next }
    { name = $c["name"]; gsub(/"/, "", name)
      if (name ~ /_(mean|median|stddev|cv)$/) next
      if (name ~ /_min$/) { sub(/_min$/, "", name); best[name] = $c["real_time"]; unit[name] = $c["time_unit"]; order[name] = NR }
      else if (!(name in best)) { best[name] = $c["real_time"]; unit[name] = $c["time_unit"]; order[name] = NR } }
    END { for (n in best) print order[n], n, best[n], unit[n] }' "$WORK/gb.csv" | sort -n |
  while read -r _ name t unit; do
    len="$(sed -n 's/.*len:\([^/]*\).*/\1/p' <<<"$name")"
    lenv="$(bench_to_int "$len" || echo 0)"
    awk -v n="$name" -v t="$t" -v u="$unit" -v len="$lenv" 'BEGIN {
      s = t * (u == "ms" ? 1e-3 : u == "us" ? 1e-6 : u == "ns" ? 1e-9 : 1)
      printf "  %-40s %10.3f %s  %8.1f M values/s\n", n, t, u, (s > 0 ? len / s / 1e6 : 0) }'
  done
fi
echo "  checks: $( ((status == 0)) && echo PASS || echo FAIL)"
echo "  wrote $CSV"
exit "$status"
