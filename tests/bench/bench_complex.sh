#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Times the divisibility-graph export (issue 7: `sqfc complex 1e6 --object divisibility
# --format edges` at >= 10^7 edges per second), checks the edge count against the formula
# count (`--count`, identity 8 of design.md) and writes data_out/bench/complex_<date>.csv.
#
# Usage: tests/bench/bench_complex.sh [--build-dir DIR] [--no-build] [--to N] [--repeats R]
# Exit: 0 pass, 1 wrong answer or failed run, 2 usage/build error, 3 right answers but target missed.
set -euo pipefail
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$0")/bench_common.sh"

BUILD_DIR="$BENCH_REPO_ROOT/build-bench"
BUILD=1
N_TEXT="1e6"
REPEATS=3
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --to) N_TEXT="${2:?--to needs a value}"; shift 2 ;;
    --repeats) REPEATS="${2:?--repeats needs a value}"; shift 2 ;;
    *) echo "bench_complex: unknown argument '$1'" >&2; exit 2 ;;
  esac
done
N="$(bench_to_int "$N_TEXT")" || { echo "bench_complex: --to $N_TEXT is not a number" >&2; exit 2; }
if ((BUILD)); then bench_build "$BUILD_DIR" || exit 2; else bench_check_release "$BUILD_DIR" || exit 2; fi
SQFC="$BUILD_DIR/bin/sqfc"
WORK="$(mktemp -d)"
trap 'rm -rf "$WORK"' EXIT

# The formula count (no enumeration): n,object,vertices,edges.
"$SQFC" complex "$N" --object divisibility --count >"$WORK/count.csv"
expected_edges="$(tail -n 1 "$WORK/count.csv" | cut -d, -f4)"
[[ "$expected_edges" =~ ^[0-9]+$ ]] || { echo "bench_complex: could not read the edge count" >&2; exit 1; }

walls=()
peak=0
load_start="$(bench_load)"
for ((r = 1; r <= REPEATS; ++r)); do
  bench_measure "$WORK/stdout" "$SQFC" complex "$N" --object divisibility --format edges --out "$WORK/edges.txt"
  ((BENCH_RC == 0)) || { echo "bench_complex: run $r failed with exit status $BENCH_RC" >&2; exit 1; }
  got="$(grep -vc '^#' "$WORK/edges.txt" || true)"
  if [ "$got" != "$expected_edges" ]; then
    echo "bench_complex: run $r wrote $got edges, the formula says $expected_edges" >&2
    exit 1
  fi
  walls+=("$BENCH_WALL")
  ((BENCH_PEAK_KIB > peak)) && peak=$BENCH_PEAK_KIB
  echo "bench_complex: run $r: ${BENCH_WALL} s, peak ${BENCH_PEAK_KIB} KiB, $got edges"
done
median="$(bench_median "${walls[@]}")"
rate="$(awk -v e="$expected_edges" -v t="$median" 'BEGIN { printf "%.0f", e / t }')"
mkdir -p "$BENCH_REPO_ROOT/data_out/bench"
csv="$BENCH_REPO_ROOT/data_out/bench/complex_$(date -u +%Y-%m-%dT%H%M%SZ).csv"
{
  echo "# sqfc benchmark: divisibility-graph export (edge list), whole process wall time"
  bench_header "$BUILD_DIR"
  echo "# load average: start $load_start, end $(bench_load)"
  echo "what,n,edges,median_seconds,min_seconds,peak_mib,edges_per_second,target_edges_per_second"
  echo "divisibility_edges,$N,$expected_edges,$median,$(bench_min "${walls[@]}"),$(awk -v k="$peak" 'BEGIN { printf "%.1f", k / 1024 }'),$rate,10000000"
} >"$csv"
echo "bench_complex: median ${median} s for ${expected_edges} edges = ${rate} edges/s (target 1e7); wrote $csv"
if ((rate < 10000000)); then echo "bench_complex: target missed" >&2; exit 3; fi
