#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Times `sqfc table` against a plain linear sieve of mu measured in the same session, checks
# both answers, and writes data_out/bench/table_<date>.csv.
#
# Usage: tests/bench/bench_table.sh [options] [BUILD_DIR]
#   --build-dir DIR       build tree (default build-bench); also accepted as the one positional argument
#   --no-build            use the tree as it is (it must be Release and hold the benchmark targets)
#   --to N                last n of the table run (default 1e10); a power of ten 10^1 .. 10^10
#   --repeats R           table runs (default 3); the median wall time is reported
#   --baseline-to N       N of the baseline (default 1e9); a power of ten 10^1 .. 10^9
#   --baseline-repeats R  baseline runs (default: same as --repeats)
#   --threads T           passed to sqfc table (default: its own default, every hardware thread)
#   --out-dir DIR         where the CSV goes (default data_out/bench)
#
# What runs, interleaved table/baseline so that both see the same machine state:
#   sqfc table --to N --log 10 --events FILE --quiet --out FILE     (all columns, the default)
#   baseline_linear_mu N_base
# each under GNU time -v for the peak resident set (see bench_common.sh for the fallback).
#
# Checks (any failure: exit 1): every run exits 0; the table's last row is n = N with
# M(N) and Q(N) equal to the published values (M: OEIS A084237, Q: OEIS A071172), and its
# manifest says every built-in identity check passed; the baseline prints the published
# M(N_base), Q(N_base). Targets for the 10^10 run (exit 3 when missed, answers right):
# median wall <= 30 s and peak resident set <= 128 MiB. Exit 2: bad usage or build failure.
#
# CSV rows: what, n, median_seconds, peak_mib, integers_per_second, ratio_vs_baseline, where
# peak_mib is the largest peak over the repeats, integers_per_second = n / median_seconds and
# ratio_vs_baseline = integers_per_second / that of the baseline (the baseline row has 1).
set -euo pipefail
SELF="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)/$(basename "${BASH_SOURCE[0]}")"
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$SELF")/bench_common.sh"
cd "$BENCH_REPO_ROOT"

BUILD_DIR=build-bench
BUILD=1
TO_TEXT=1e10
REPEATS=3
BASE_TEXT=1e9
BASE_REPEATS=""
THREADS=""
OUT_DIR=data_out/bench
positional=0
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --to) TO_TEXT="${2:?--to needs a value}"; shift 2 ;;
    --repeats) REPEATS="${2:?--repeats needs a value}"; shift 2 ;;
    --baseline-to) BASE_TEXT="${2:?--baseline-to needs a value}"; shift 2 ;;
    --baseline-repeats) BASE_REPEATS="${2:?--baseline-repeats needs a value}"; shift 2 ;;
    --threads) THREADS="${2:?--threads needs a value}"; shift 2 ;;
    --out-dir) OUT_DIR="${2:?--out-dir needs a value}"; shift 2 ;;
    -h|--help) sed -n '3,/^set -euo/p' "$SELF" | sed '$d; s/^# \{0,1\}//'; exit 0 ;;
    -*) bench_die "unknown option $1 (see --help)" ;;
    *) ((positional == 0)) || bench_die "more than one build directory given"
       BUILD_DIR="$1"; positional=1; shift ;;
  esac
done
: "${BASE_REPEATS:=$REPEATS}"
[[ "$REPEATS" =~ ^[1-9][0-9]*$ ]] || bench_die "--repeats must be a positive integer"
[[ "$BASE_REPEATS" =~ ^[0-9]+$ ]] || bench_die "--baseline-repeats must be a non-negative integer"
TO="$(bench_to_int "$TO_TEXT")" || bench_die "--to $TO_TEXT is not a number"
BASE_N="$(bench_to_int "$BASE_TEXT")" || bench_die "--baseline-to $BASE_TEXT is not a number"

# Published values at 10^k: M from OEIS A084237, Q from OEIS A071172.
declare -A PUB_M=([10]=-1 [100]=1 [1000]=2 [10000]=-23 [100000]=-48 [1000000]=212 [10000000]=1037
                  [100000000]=1928 [1000000000]=-222 [10000000000]=-33722)
declare -A PUB_Q=([10]=7 [100]=61 [1000]=608 [10000]=6083 [100000]=60794 [1000000]=607926
                  [10000000]=6079291 [100000000]=60792694 [1000000000]=607927124 [10000000000]=6079270942)
[ -n "${PUB_M[$TO]:-}" ] || bench_die "--to must be a power of ten from 10 to 10^10 (published M, Q known)"
if [ -z "${PUB_M[$BASE_N]:-}" ] || ((BASE_N > 1000000000)); then
  bench_die "--baseline-to must be a power of ten from 10 to 10^9"
fi

if ((BUILD)); then
  echo "bench_table: building $BUILD_DIR (Release, SQFC_BUILD_BENCHMARKS=ON)"
  bench_build "$BUILD_DIR" || exit 2
else
  bench_check_release "$BUILD_DIR" || exit 2
fi
SQFC="$BUILD_DIR/bin/sqfc"
BASELINE="$BUILD_DIR/bin/baseline_linear_mu"
[ -x "$SQFC" ] || bench_die "$SQFC not found (build the sqfc target)"
[ -x "$BASELINE" ] || bench_die "$BASELINE not found (configure with -DSQFC_BUILD_BENCHMARKS=ON)"

WORK="$(mktemp -d "${TMPDIR:-/tmp}/sqfc-bench-table.XXXXXX")"
trap 'rm -rf "$WORK"' EXIT
mkdir -p "$OUT_DIR"
STAMP="$(date -u +%Y-%m-%dT%H%M%SZ)"
CSV="$OUT_DIR/table_${STAMP}.csv"

failures=()
table_walls=(); table_peaks=(); base_walls=(); base_peaks=(); notes=()
load_start="$(bench_load)"
echo "bench_table: load average at start: $load_start ($(nproc) cores)"

table_cmd=("$SQFC" table --to "$TO" --log 10 --events "$WORK/events.csv" --quiet --out "$WORK/table.csv")
[ -n "$THREADS" ] && table_cmd+=(--threads "$THREADS")

check_table() {
  local r="$1" last n m q
  if [ ! -s "$WORK/table.csv" ]; then failures+=("table run $r: no table written"); return; fi
  # Columns are found by name in the header row (docs/output-formats.md).
  last="$(awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) c[$i] = i; next }
                   { row = $c["n"] " " $c["mertens"] " " $c["squarefree"] } END { print row }' "$WORK/table.csv")"
  read -r n m q <<<"$last"
  if [ "$n" != "$TO" ] || [ "$m" != "${PUB_M[$TO]}" ] || [ "$q" != "${PUB_Q[$TO]}" ]; then
    failures+=("table run $r: last row n=$n M=$m Q=$q, expected n=$TO M=${PUB_M[$TO]} Q=${PUB_Q[$TO]}")
  fi
  if ! grep -q '"checks_passed": true' "$WORK/table.csv.manifest.json" 2>/dev/null; then
    failures+=("table run $r: the manifest does not report checks_passed = true")
  fi
  TABLE_LAST="n=$n M=$m Q=$q"
  TABLE_ROWS="$(($(wc -l <"$WORK/table.csv") - 1))"
  TABLE_EVENTS="$(if [ -f "$WORK/events.csv" ]; then echo $(($(wc -l <"$WORK/events.csv") - 1)); else echo 0; fi)"
}

check_baseline() {
  local r="$1" line
  line="$(grep '^baseline_linear_mu ' "$WORK/baseline.out" || true)"
  if [[ "$line" =~ N=([0-9]+)\ M=(-?[0-9]+)\ Q=([0-9]+) ]]; then
    local n="${BASH_REMATCH[1]}" m="${BASH_REMATCH[2]}" q="${BASH_REMATCH[3]}"
    if [ "$n" != "$BASE_N" ] || [ "$m" != "${PUB_M[$BASE_N]}" ] || [ "$q" != "${PUB_Q[$BASE_N]}" ]; then
      failures+=("baseline run $r: N=$n M=$m Q=$q, expected N=$BASE_N M=${PUB_M[$BASE_N]} Q=${PUB_Q[$BASE_N]}")
    fi
    BASE_LAST="N=$n M=$m Q=$q"
    BASE_INTERNAL="$(sed -n 's/.*sieve_seconds=\([0-9.]*\) total_seconds=\([0-9.]*\).*/sieve \1 s, total \2 s/p' <<<"$line")"
  else
    failures+=("baseline run $r: no result line in its output")
  fi
}

rounds=$((REPEATS > BASE_REPEATS ? REPEATS : BASE_REPEATS))
for ((r = 1; r <= rounds; r++)); do
  if ((r <= REPEATS)); then
    load="$(bench_load)"
    rm -f "$WORK/table.csv" "$WORK/events.csv" "$WORK/table.csv.manifest.json"
    bench_measure "$WORK/table.out" "${table_cmd[@]}"
    if ((BENCH_RC != 0)); then failures+=("table run $r: exit status $BENCH_RC"); else check_table "$r"; fi
    table_walls+=("$BENCH_WALL"); table_peaks+=("$BENCH_PEAK_KIB")
    notes+=("table run $r: ${BENCH_WALL} s, peak ${BENCH_PEAK_KIB} KiB, load before: $load")
    echo "bench_table: ${notes[-1]}"
  fi
  if ((r <= BASE_REPEATS)); then
    load="$(bench_load)"
    bench_measure "$WORK/baseline.out" "$BASELINE" "$BASE_N"
    if ((BENCH_RC != 0)); then failures+=("baseline run $r: exit status $BENCH_RC"); fi
    check_baseline "$r"
    base_walls+=("$BENCH_WALL"); base_peaks+=("$BENCH_PEAK_KIB")
    notes+=("baseline run $r: ${BENCH_WALL} s, peak ${BENCH_PEAK_KIB} KiB (${BASE_INTERNAL:-?}), load before: $load")
    echo "bench_table: ${notes[-1]}"
  fi
done
load_end="$(bench_load)"

max_of() { printf '%s\n' "$@" | sort -g | tail -n 1; }
t_med="$(bench_median "${table_walls[@]}")"
t_min="$(bench_min "${table_walls[@]}")"
t_peak_mib="$(awk -v k="$(max_of "${table_peaks[@]}")" 'BEGIN { printf "%.1f", k / 1024 }')"
t_rate="$(awk -v n="$TO" -v s="$t_med" 'BEGIN { printf "%.0f", (s > 0 ? n / s : 0) }')"
if ((BASE_REPEATS > 0)); then
  b_med="$(bench_median "${base_walls[@]}")"
  b_min="$(bench_min "${base_walls[@]}")"
  b_peak_mib="$(awk -v k="$(max_of "${base_peaks[@]}")" 'BEGIN { printf "%.1f", k / 1024 }')"
  b_rate="$(awk -v n="$BASE_N" -v s="$b_med" 'BEGIN { printf "%.0f", (s > 0 ? n / s : 0) }')"
  ratio="$(awk -v a="$t_rate" -v b="$b_rate" 'BEGIN { printf "%.3f", (b > 0 ? a / b : 0) }')"
else
  b_med=nan; b_min=nan; b_peak_mib=nan; b_rate=nan; ratio=nan
fi

{
  echo "# sqfc benchmark: sqfc table against a plain linear sieve of mu, measured in the same session"
  bench_header "$BUILD_DIR"
  echo "# command: ${table_cmd[*]/#$WORK/<tmp>}"
  echo "# baseline: $BASELINE $BASE_N (single thread, one int8 array of N+1 and a prime list)"
  echo "# threads: ${THREADS:-sqfc default = $(nproc) hardware threads}; baseline 1 thread"
  echo "# repeats: table $REPEATS, baseline $BASE_REPEATS; median wall time, peak = largest over repeats"
  echo "# wall time: monotonic clock around each process; peak: GNU time -v maximum resident set ($BENCH_TIME_TOOL)"
  echo "# load average (1/5/15 min): start $load_start, end $load_end"
  for note in "${notes[@]}"; do echo "# $note"; done
  echo "# minimum wall: table $t_min s, baseline $b_min s"
  echo "# answers: table ${TABLE_LAST:-none}, baseline ${BASE_LAST:-none}; published M (OEIS A084237), Q (OEIS A071172)"
  if ((${#failures[@]})); then echo "# checks: FAIL: ${failures[*]}"; else echo "# checks: pass"; fi
  echo "what,n,median_seconds,peak_mib,integers_per_second,ratio_vs_baseline"
  echo "table,$TO,$t_med,$t_peak_mib,$t_rate,$ratio"
  if ((BASE_REPEATS > 0)); then echo "baseline_linear_mu,$BASE_N,$b_med,$b_peak_mib,$b_rate,1.000"; fi
} >"$CSV"

status=0
echo
echo "bench_table summary ($(lscpu 2>/dev/null | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores; load $load_start -> $load_end)"
printf '  %-20s n=%-12s median %8s s  peak %8s MiB  %12s integers/s  ratio %s\n' \
  "sqfc table" "$TO" "$t_med" "$t_peak_mib" "$t_rate" "$ratio"
if ((BASE_REPEATS > 0)); then
  printf '  %-20s n=%-12s median %8s s  peak %8s MiB  %12s integers/s\n' \
    "baseline_linear_mu" "$BASE_N" "$b_med" "$b_peak_mib" "$b_rate"
fi
echo "  table: ${TABLE_ROWS:-?} rows, ${TABLE_EVENTS:-?} events, last row ${TABLE_LAST:-none}"
if ((${#failures[@]})); then
  echo "  answers: FAIL"
  for f in "${failures[@]}"; do echo "    $f"; done
  status=1
else
  echo "  answers: PASS (published M and Q; sqfc identity checks)"
fi
if ((TO == 10000000000)); then
  wall_ok="$(awk -v s="$t_med" 'BEGIN { print (s <= 30 ? "PASS" : "FAIL") }')"
  mem_ok="$(awk -v m="$t_peak_mib" 'BEGIN { print (m <= 128 ? "PASS" : "FAIL") }')"
  echo "  target wall <= 30 s: $wall_ok ($t_med s)"
  echo "  target peak <= 128 MiB: $mem_ok ($t_peak_mib MiB)"
  if ((status == 0)) && [ "$wall_ok$mem_ok" != PASSPASS ]; then status=3; fi
else
  echo "  targets (<= 30 s, <= 128 MiB): n/a, they apply to --to 1e10"
fi
echo "  wrote $CSV"
exit "$status"
