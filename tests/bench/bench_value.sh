#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Times `sqfc value` for M(x) at x = 10^12 .. 10^MAX and Q(10^18), checks every answer against
# published values, fits the growth exponent of M's time, and writes data_out/bench/value_<date>.csv.
#
# Usage: tests/bench/bench_value.sh [options] [BUILD_DIR]
#   --build-dir DIR   build tree (default build-bench); also accepted as the one positional argument
#   --no-build        use the tree as it is (it must be Release and hold the sqfc target)
#   --max K           largest M argument 10^K, 12 <= K <= 19 (default 16; 17 adds about 5 minutes,
#                     18 about 30 more, 19 about 125 more: the check of the top of M's range); 0 skips the M rows
#   --repeats R       runs per size (default 1); the median wall time is reported
#   --threads T       passed to sqfc value (default: its own default, every hardware thread)
#   --out-dir DIR     where the CSV goes (default data_out/bench)
#
# What runs, each under GNU time -v for the peak resident set:
#   sqfc value 10^k --what mertens --format csv --quiet --out FILE     k = 12 .. K
#   sqfc value 10^18 --what squarefree --quiet --out FILE
#   sqfc table --to 10^10 --columns mertens --every 10^10 --quiet --out FILE  (the sieve, as baseline)
# Checks (any failure: exit 1): M(10^k) equals the published value (OEIS A084237; 10^16 also
# Deléglise–Rivat 1996), Q(10^18) equals OEIS A071172, the baseline M(10^10) = -33722.
# Targets (exit 3 when missed, answers right): M(10^16) <= 60 s with peak <= 1 GiB, Q(10^18) <= 2 s.
#
# CSV rows: what, x, median_seconds, peak_mib, ratio_vs_baseline where ratio_vs_baseline is
# (x / median_seconds) / (10^10 / baseline seconds), i.e. how many times faster per unit of x
# than sieving; a last comment line holds the least-squares exponent b of seconds ~ x^b over
# the M rows with x >= 10^13 (smaller runs are dominated by start-up).
set -euo pipefail
SELF="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)/$(basename "${BASH_SOURCE[0]}")"
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$SELF")/bench_common.sh"
cd "$BENCH_REPO_ROOT"

BUILD_DIR=build-bench
BUILD=1
MAX=16
REPEATS=1
THREADS=""
OUT_DIR=data_out/bench
positional=0
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --max) MAX="${2:?--max needs a value}"; shift 2 ;;
    --repeats) REPEATS="${2:?--repeats needs a value}"; shift 2 ;;
    --threads) THREADS="${2:?--threads needs a value}"; shift 2 ;;
    --out-dir) OUT_DIR="${2:?--out-dir needs a value}"; shift 2 ;;
    -h|--help) sed -n '3,/^set -euo/p' "$SELF" | sed '$d; s/^# \{0,1\}//'; exit 0 ;;
    -*) bench_die "unknown option $1 (see --help)" ;;
    *) ((positional == 0)) || bench_die "more than one build directory given"
       BUILD_DIR="$1"; positional=1; shift ;;
  esac
done
[[ "$REPEATS" =~ ^[1-9][0-9]*$ ]] || bench_die "--repeats must be a positive integer"
[[ "$MAX" =~ ^(1[2-9]|0)$ ]] || bench_die "--max must be 12 .. 19, or 0"

# M(10^k): OEIS A084237 (12..15, 17 and 18 from memory, each also reproduced by this code);
# 10^16: M. Deléglise, J. Rivat, Experimental Mathematics 5 (1996), abstract.
declare -A PUB_M=([12]=62366 [13]=599582 [14]=-875575 [15]=-3216373 [16]=-3195437 [17]=-21830254 [18]=-46758740 [19]=899990187)
PUB_Q18=607927101854022750  # OEIS A071172 (from memory)

if ((BUILD)); then
  echo "bench_value: building $BUILD_DIR (Release)"
  bench_build "$BUILD_DIR" || exit 2
  cmake --build "$BUILD_DIR" -j "$(nproc)" --target sqfc >"$BUILD_DIR/bench_build_sqfc.log" 2>&1 || exit 2
else
  bench_check_release "$BUILD_DIR" || exit 2
fi
SQFC="$BUILD_DIR/bin/sqfc"
[ -x "$SQFC" ] || bench_die "$SQFC not found (build the sqfc target)"
THREAD_ARGS=()
[ -n "$THREADS" ] && THREAD_ARGS=(--threads "$THREADS")

WORK="$(mktemp -d "${TMPDIR:-/tmp}/sqfc-bench-value.XXXXXX")"
trap 'rm -rf "$WORK"' EXIT
mkdir -p "$OUT_DIR"
STAMP="$(date -u +%Y-%m-%dT%H%M%SZ)"
CSV="$OUT_DIR/value_${STAMP}.csv"
failures=()
missed=()
echo "bench_value: load average at start: $(bench_load) ($(nproc) cores)"

# run_value NAME EXPECTED COLUMN ARGS...: median wall and largest peak over the repeats, answer checked.
run_value() {
  local name="$1" expected="$2" column="$3"
  shift 3
  local walls=() peak=0 r got
  for ((r = 1; r <= REPEATS; r++)); do
    rm -f "$WORK/v.csv"
    bench_measure "$WORK/v.out" "$@" --quiet --out "$WORK/v.csv"
    ((BENCH_RC == 0)) || { failures+=("$name run $r: exit $BENCH_RC"); return; }
    got="$(awk -F, -v col="$column" 'NR == 1 { for (i = 1; i <= NF; i++) c[$i] = i; next } { print $c[col] }' "$WORK/v.csv" | tail -n 1)"
    [ "$got" = "$expected" ] || failures+=("$name run $r: got $got, expected $expected")
    walls+=("$BENCH_WALL")
    ((BENCH_PEAK_KIB > peak)) && peak=$BENCH_PEAK_KIB
  done
  RUN_MEDIAN="$(bench_median "${walls[@]}")"
  RUN_PEAK_MIB="$(awk -v k="$peak" 'BEGIN { printf "%.1f", k / 1024 }')"
  echo "bench_value: $name median ${RUN_MEDIAN} s, peak ${RUN_PEAK_MIB} MiB (load $(bench_load))"
}

run_value "baseline sieve M(10^10)" -33722 mertens "$SQFC" table --to 10000000000 --columns mertens --every 10000000000 "${THREAD_ARGS[@]}"
BASE_SECONDS="$RUN_MEDIAN"
rows=("table_sieve_mertens,10000000000,$RUN_MEDIAN,$RUN_PEAK_MIB,1")
fit_points=()
M16_SECONDS=""; M16_PEAK=""
for ((k = 12; MAX > 0 && k <= MAX; k++)); do
  x="1$(printf '%0*d' "$k" 0)"
  run_value "M(10^$k)" "${PUB_M[$k]}" mertens "$SQFC" value "$x" --what mertens "${THREAD_ARGS[@]}"
  ratio="$(awk -v x="$x" -v s="$RUN_MEDIAN" -v b="$BASE_SECONDS" 'BEGIN { printf "%.1f", (x / s) / (1e10 / b) }')"
  rows+=("value_mertens,$x,$RUN_MEDIAN,$RUN_PEAK_MIB,$ratio")
  ((k >= 13)) && fit_points+=("$x $RUN_MEDIAN")
  if ((k == 16)); then M16_SECONDS="$RUN_MEDIAN"; M16_PEAK="$RUN_PEAK_MIB"; fi
done
run_value "Q(10^18)" "$PUB_Q18" squarefree "$SQFC" value 1000000000000000000 --what squarefree "${THREAD_ARGS[@]}"
Q18_SECONDS="$RUN_MEDIAN"
ratio="$(awk -v s="$RUN_MEDIAN" -v b="$BASE_SECONDS" 'BEGIN { printf "%.1f", (1e18 / s) / (1e10 / b) }')"
rows+=("value_squarefree,1000000000000000000,$RUN_MEDIAN,$RUN_PEAK_MIB,$ratio")

exponent="$(printf '%s\n' "${fit_points[@]}" | awk '$2 > 0 { x = log($1); y = log($2); n++; sx += x; sy += y; sxx += x * x; sxy += x * y }
  END { if (n >= 2) printf "%.3f", (n * sxy - sx * sy) / (n * sxx - sx * sx); else print "nan" }')"
{
  bench_header "$BUILD_DIR"
  echo "# load average at end: $(bench_load)"
  echo "what,x,median_seconds,peak_mib,ratio_vs_baseline"
  printf '%s\n' "${rows[@]}"
  echo "# fitted exponent of M seconds ~ x^b over 10^13..10^$MAX: b = $exponent"
} >"$CSV"
echo "bench_value: fitted exponent b = $exponent; wrote $CSV"

if ((${#failures[@]})); then
  printf 'bench_value: FAILED: %s\n' "${failures[@]}" >&2
  exit 1
fi
if [ -n "$M16_SECONDS" ]; then
  awk -v s="$M16_SECONDS" 'BEGIN { exit !(s > 60) }' && missed+=("M(10^16) took $M16_SECONDS s > 60 s")
  awk -v p="$M16_PEAK" 'BEGIN { exit !(p > 1024) }' && missed+=("M(10^16) peak $M16_PEAK MiB > 1024 MiB")
fi
awk -v s="$Q18_SECONDS" 'BEGIN { exit !(s > 2) }' && missed+=("Q(10^18) took $Q18_SECONDS s > 2 s")
if ((${#missed[@]})); then
  printf 'bench_value: target missed: %s\n' "${missed[@]}" >&2
  exit 3
fi
echo "bench_value: all targets met"
