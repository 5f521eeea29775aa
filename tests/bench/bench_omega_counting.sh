#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Times arith::count_by_omega (squarefree counts by omega at one x, by counting over primes: the
# face counts and Betti numbers of K_x) at x = 10^9 .. 10^12 (10^13, 10^14 on request), against
# the segmented sieve counting the same numbers over [1, x] on the same threads in the same
# session, checks every answer, and writes data_out/bench/omega_counting_<date>.csv.
#
# Usage: tests/bench/bench_omega_counting.sh [options]
#   --build-dir DIR     build tree (default build-bench)
#   --no-build          use the tree as it is (Release, with the benchmark targets built)
#   --x LIST            x for counting, comma-separated powers of ten 10^1 .. 10^14 (default 1e9,1e10,1e11,1e12)
#   --baseline-x LIST   x for the sieve baseline, powers of ten (default 1e9,1e10); each must also be in --x
#   --repeats R         runs per x and method (default 3); the median wall time is reported
#   --threads T         threads for both methods (default: every hardware thread)
#   --out-dir DIR       where the CSV goes (default data_out/bench)
#   --smoke             --x 1e6,1e7 --baseline-x 1e6 --repeats 1, no target judged (the CTest entry)
#
# Each run is one process of build-bench/bin/bench_omega_counting (tests/bench/bench_omega_counting.cpp)
# under GNU time -v for the peak resident set; wall time is the monotonic clock around the process.
# Checks (exit 1 when one fails): every run exits 0; at every x the total equals Q(x) (OEIS
# A071172) and faces[0] equals pi(x) (OEIS A006880); all repeats give the same line; at each
# baseline x the sieve gives the same faces, odd counts and Betti numbers as the counting.
# Target (exit 3 when missed, answers right): at 10^12, median wall <= 60 s (issue 3).
#
# CSV rows: method, x, threads, median_seconds, min_seconds, peak_mib, ratio_sieve_over_counting
# (at the baseline x: median sieve time / median counting time; otherwise empty), then one
# comment line per x with the faces and Betti numbers.
set -euo pipefail
SELF="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)/$(basename "${BASH_SOURCE[0]}")"
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$SELF")/bench_common.sh"
cd "$BENCH_REPO_ROOT"

BUILD_DIR=build-bench
BUILD=1
X_TEXT=1e9,1e10,1e11,1e12
BASE_TEXT=1e9,1e10
REPEATS=3
THREADS="$(nproc)"
OUT_DIR=data_out/bench
SMOKE=0
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --x) X_TEXT="${2:?--x needs a value}"; shift 2 ;;
    --baseline-x) BASE_TEXT="${2:?--baseline-x needs a value}"; shift 2 ;;
    --repeats) REPEATS="${2:?--repeats needs a value}"; shift 2 ;;
    --threads) THREADS="${2:?--threads needs a value}"; shift 2 ;;
    --out-dir) OUT_DIR="${2:?--out-dir needs a value}"; shift 2 ;;
    --smoke) SMOKE=1; X_TEXT=1e6,1e7; BASE_TEXT=1e6; REPEATS=1; shift ;;
    -h|--help) sed -n '3,/^set -euo/p' "$SELF" | sed '$d; s/^# \{0,1\}//'; exit 0 ;;
    *) bench_die "unknown option $1 (see --help)" ;;
  esac
done
[[ "$REPEATS" =~ ^[1-9][0-9]*$ ]] || bench_die "--repeats must be a positive integer"
[[ "$THREADS" =~ ^[1-9][0-9]*$ ]] || bench_die "--threads must be a positive integer"

# Published values at 10^k: Q from OEIS A071172, pi from OEIS A006880 (both from memory; the
# same values as tests/data/squarefree_powers_of_ten.csv and prime_counts_powers_of_ten.csv).
declare -A PUB_Q=([10]=7 [100]=61 [1000]=608 [10000]=6083 [100000]=60794 [1000000]=607926
                  [10000000]=6079291 [100000000]=60792694 [1000000000]=607927124 [10000000000]=6079270942
                  [100000000000]=60792710280 [1000000000000]=607927102274 [10000000000000]=6079271018294
                  [100000000000000]=60792710185947)
declare -A PUB_PI=([10]=4 [100]=25 [1000]=168 [10000]=1229 [100000]=9592 [1000000]=78498 [10000000]=664579
                   [100000000]=5761455 [1000000000]=50847534 [10000000000]=455052511 [100000000000]=4118054813
                   [1000000000000]=37607912018 [10000000000000]=346065536839 [100000000000000]=3204941750802)
to_list() {
  local item v out=()
  IFS=, read -r -a items <<<"$1"
  for item in "${items[@]}"; do
    v="$(bench_to_int "$item")" || bench_die "$item is not a number"
    [ -n "${PUB_Q[$v]:-}" ] || bench_die "$item: only powers of ten 10^1 .. 10^14 (published Q and pi known)"
    out+=("$v")
  done
  echo "${out[@]}"
}
read -r -a XS <<<"$(to_list "$X_TEXT")"
read -r -a BASE_XS <<<"$(to_list "$BASE_TEXT")"
for b in "${BASE_XS[@]}"; do
  [[ " ${XS[*]} " == *" $b "* ]] || bench_die "baseline x $b is not in --x"
done

if ((BUILD)); then
  echo "bench_omega_counting: building $BUILD_DIR (Release, SQFC_BUILD_BENCHMARKS=ON)"
  bench_build "$BUILD_DIR" || exit 2
else
  bench_check_release "$BUILD_DIR" || exit 2
fi
DRIVER="$BUILD_DIR/bin/bench_omega_counting"
[ -x "$DRIVER" ] || bench_die "$DRIVER not found (configure with -DSQFC_BUILD_BENCHMARKS=ON)"

WORK="$(mktemp -d "${TMPDIR:-/tmp}/sqfc-bench-omega.XXXXXX")"
trap 'rm -rf "$WORK"' EXIT
mkdir -p "$OUT_DIR"
CSV="$OUT_DIR/omega_counting_$(date -u +%Y-%m-%dT%H%M%SZ).csv"
failures=()
notes=()
rows=()
answers=()
declare -A MED LINE
load_start="$(bench_load)"
echo "bench_omega_counting: load average at start: $load_start ($(nproc) cores), threads $THREADS"

field() { sed -n "s/.* $1=\([^ ]*\).*/\1/p" <<<" $2"; }

# run_method METHOD X: R repeats; sets MED[METHOD,X] and LINE[METHOD,X] (the answer, timing removed).
run_method() {
  local method="$1" x="$2" r walls=() peaks=() first="" line answer load
  for ((r = 1; r <= REPEATS; r++)); do
    load="$(bench_load)"
    bench_measure "$WORK/out" "$DRIVER" --method "$method" --x "$x" --threads "$THREADS"
    line="$(cat "$WORK/out")"
    if ((BENCH_RC != 0)); then failures+=("$method x=$x run $r: exit status $BENCH_RC"); fi
    answer="$(sed 's/ seconds=[^ ]*//' <<<"$line")"
    if [ -z "$first" ]; then first="$answer"; elif [ "$answer" != "$first" ]; then
      failures+=("$method x=$x run $r: a different answer from run 1")
    fi
    if [ "$(field squarefree "$line")" != "${PUB_Q[$x]}" ]; then
      failures+=("$method x=$x run $r: Q = $(field squarefree "$line"), published ${PUB_Q[$x]} (OEIS A071172)")
    fi
    if [ "$(field faces "$line" | cut -d, -f1)" != "${PUB_PI[$x]}" ]; then
      failures+=("$method x=$x run $r: f_0 = $(field faces "$line" | cut -d, -f1), published pi = ${PUB_PI[$x]} (OEIS A006880)")
    fi
    walls+=("$BENCH_WALL"); peaks+=("$BENCH_PEAK_KIB")
    notes+=("$method x=$x run $r: ${BENCH_WALL} s (inside: $(field seconds "$line") s), peak ${BENCH_PEAK_KIB} KiB, load before: $load")
    echo "bench_omega_counting: ${notes[-1]}"
  done
  MED[$method,$x]="$(bench_median "${walls[@]}")"
  LINE[$method,$x]="$first"
  local peak_mib
  peak_mib="$(awk -v k="$(printf '%s\n' "${peaks[@]}" | sort -g | tail -n 1)" 'BEGIN { printf "%.1f", k / 1024 }')"
  rows+=("$method,$x,$THREADS,${MED[$method,$x]},$(bench_min "${walls[@]}"),$peak_mib")
}

for x in "${XS[@]}"; do
  run_method counting "$x"
  answers+=("x=$x $(field faces "${LINE[counting,$x]}" | sed 's/^/faces=/') $(field betti "${LINE[counting,$x]}" | sed 's/^/betti=/')")
  if [[ " ${BASE_XS[*]} " == *" $x "* ]]; then
    run_method sieve "$x"
    if [ "$(sed 's/^method=[a-z]*//' <<<"${LINE[sieve,$x]}")" != "$(sed 's/^method=[a-z]*//' <<<"${LINE[counting,$x]}")" ]; then
      failures+=("x=$x: the sieve and the counting disagree: '${LINE[sieve,$x]}' vs '${LINE[counting,$x]}'")
    fi
  fi
done
load_end="$(bench_load)"

ratio_of() {
  local x="$1"
  if [ -n "${MED[sieve,$x]:-}" ]; then
    awk -v a="${MED[sieve,$x]}" -v b="${MED[counting,$x]}" 'BEGIN { printf "%.1f", (b > 0 ? a / b : 0) }'
  fi
}

status=0
target_note="not judged (10^12 not in --x)"
if ((!SMOKE)) && [ -n "${MED[counting,1000000000000]:-}" ]; then
  if awk -v t="${MED[counting,1000000000000]}" 'BEGIN { exit !(t <= 60) }'; then
    target_note="PASS: median ${MED[counting,1000000000000]} s at 10^12 <= 60 s"
  else
    target_note="MISSED: median ${MED[counting,1000000000000]} s at 10^12 > 60 s"
    status=3
  fi
fi
((${#failures[@]})) && status=1

{
  echo "# sqfc benchmark: squarefree counts by omega at one x (faces and Betti numbers of K_x), counting over primes against the segmented sieve"
  bench_header "$BUILD_DIR"
  echo "# command: $DRIVER --method counting|sieve --x X --threads $THREADS"
  echo "# threads: $THREADS for both methods; repeats: $REPEATS; median and minimum wall time, peak = largest over repeats"
  echo "# wall time: monotonic clock around each process; peak: GNU time -v maximum resident set ($BENCH_TIME_TOOL)"
  echo "# load average (1/5/15 min): start $load_start, end $load_end"
  for note in "${notes[@]}"; do echo "# $note"; done
  for a in "${answers[@]}"; do echo "# answer: $a"; done
  echo "# published: Q(10^k) OEIS A071172, pi(10^k) OEIS A006880"
  if ((${#failures[@]})); then echo "# checks: FAIL: ${failures[*]}"; else echo "# checks: pass"; fi
  echo "# target: $target_note"
  echo "method,x,threads,median_seconds,min_seconds,peak_mib,ratio_sieve_over_counting"
  for row in "${rows[@]}"; do
    x="$(cut -d, -f2 <<<"$row")"
    if [[ "$row" == counting,* ]]; then echo "$row,$(ratio_of "$x")"; else echo "$row,"; fi
  done
} >"$CSV"

echo
echo "bench_omega_counting summary ($(lscpu 2>/dev/null | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores, $THREADS threads; load $load_start -> $load_end)"
for row in "${rows[@]}"; do
  IFS=, read -r method x _ med min peak <<<"$row"
  extra=""
  [ "$method" = counting ] && [ -n "$(ratio_of "$x")" ] && extra="  sieve / counting = $(ratio_of "$x")"
  printf '  %-9s x=%-16s median %9s s  min %9s s  peak %8s MiB%s\n' "$method" "$x" "$med" "$min" "$peak" "$extra"
done
echo "  checks: $( ((${#failures[@]})) && echo "FAIL: ${failures[*]}" || echo PASS)"
echo "  target: $target_note"
echo "  wrote $CSV"
exit "$status"
