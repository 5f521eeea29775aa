#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Times the identity suite `sqfc check --to N` against `sqfc table --to N --every 1` (the engine
# pass that the suite contains, writing every row) measured in the same session, checks both
# answers, and writes data_out/bench/check_<date>.csv.
#
# Usage: tests/bench/bench_check.sh [options] [BUILD_DIR]
#   --build-dir DIR   build tree (default build-bench); also accepted as the one positional argument
#   --no-build        use the tree as it is (it must be Release and hold the sqfc target)
#   --to N            range of the suite and of the baseline table (default 1e6)
#   --repeats R       runs of each (default 3); the median wall time is reported
#   --threads T       passed to both commands (default: their own default, every hardware thread)
#   --out-dir DIR     where the CSV goes (default data_out/bench)
#
# What runs, interleaved check/table so that both see the same machine state:
#   sqfc check --to N --quiet --out FILE.json                 (every identity, default sub-ranges)
#   sqfc table --to N --every 1 --quiet --out FILE.csv        (baseline)
# each under GNU time -v for the peak resident set (see bench_common.sh for the fallback).
#
# Checks (any failure: exit 1): every run exits 0; the suite's JSON says "passed": true with 20
# checks, none failed; its text report ends in "verdict: PASS"; the table has N rows and, at a
# power of ten, its last row holds the published M(N) (OEIS A084237). Target for N = 10^6
# (exit 3 when missed, answers right): median wall of the suite <= 60 s. Exit 2: bad usage or
# build failure. The sub-ranges of the expensive checks are printed from the report.
#
# CSV rows: what, n, median_seconds, min_seconds, peak_mib, ratio_vs_baseline (suite median /
# table median; the baseline row has 1).
set -euo pipefail
SELF="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)/$(basename "${BASH_SOURCE[0]}")"
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$SELF")/bench_common.sh"
cd "$BENCH_REPO_ROOT"

BUILD_DIR=build-bench
BUILD=1
TO_TEXT=1e6
REPEATS=3
THREADS=""
OUT_DIR=data_out/bench
positional=0
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --to) TO_TEXT="${2:?--to needs a value}"; shift 2 ;;
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
TO="$(bench_to_int "$TO_TEXT")" || bench_die "--to $TO_TEXT is not a number"
((TO >= 1 && TO <= 100000000)) || bench_die "--to must lie in [1, 10^8] (the suite's range)"

# Published M(10^k), OEIS A084237.
declare -A PUB_M=([1]=1 [10]=-1 [100]=1 [1000]=2 [10000]=-23 [100000]=-48 [1000000]=212 [10000000]=1037
                  [100000000]=1928)

if ((BUILD)); then
  echo "bench_check: building $BUILD_DIR (Release, SQFC_BUILD_BENCHMARKS=ON)"
  bench_build "$BUILD_DIR" || exit 2
else
  bench_check_release "$BUILD_DIR" || exit 2
fi
SQFC="$BUILD_DIR/bin/sqfc"
[ -x "$SQFC" ] || bench_die "$SQFC not found (build the sqfc target)"

WORK="$(mktemp -d "${TMPDIR:-/tmp}/sqfc-bench-check.XXXXXX")"
trap 'rm -rf "$WORK"' EXIT
mkdir -p "$OUT_DIR"
STAMP="$(date -u +%Y-%m-%dT%H%M%SZ)"
CSV="$OUT_DIR/check_${STAMP}.csv"

check_cmd=("$SQFC" check --to "$TO" --quiet --out "$WORK/check.json")
table_cmd=("$SQFC" table --to "$TO" --every 1 --quiet --out "$WORK/table.csv")
if [ -n "$THREADS" ]; then check_cmd+=(--threads "$THREADS"); table_cmd+=(--threads "$THREADS"); fi

failures=()
check_walls=(); check_peaks=(); table_walls=(); table_peaks=(); notes=()
load_start="$(bench_load)"
echo "bench_check: load average at start: $load_start ($(nproc) cores)"

check_suite() {
  local r="$1" checks failed
  if ! grep -q '"passed": true' "$WORK/check.json" 2>/dev/null; then
    failures+=("check run $r: the JSON does not say passed = true"); return
  fi
  checks="$(grep -c '"identity_title"' "$WORK/check.json" || true)"
  failed="$(grep -c '"verdict": "FAIL"' "$WORK/check.json" || true)"
  if [ "$checks" != 20 ] || [ "$failed" != 0 ]; then failures+=("check run $r: $checks checks, $failed failed (expected 20, 0)"); fi
  if ! tail -n 1 "$WORK/check.out" | grep -qx 'verdict: PASS'; then failures+=("check run $r: report does not end in 'verdict: PASS'"); fi
}

check_table() {
  local r="$1" rows last
  rows="$(($(wc -l <"$WORK/table.csv") - 1))"
  ((rows == TO)) || failures+=("table run $r: $rows rows, expected $TO")
  if [ -n "${PUB_M[$TO]:-}" ]; then
    last="$(awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) c[$i] = i; next } { m = $c["mertens"] } END { print m }' "$WORK/table.csv")"
    [ "$last" = "${PUB_M[$TO]}" ] || failures+=("table run $r: M($TO) = $last, published ${PUB_M[$TO]}")
  fi
}

for ((r = 1; r <= REPEATS; r++)); do
  load="$(bench_load)"
  rm -f "$WORK/check.json" "$WORK/check.json.manifest.json"
  bench_measure "$WORK/check.out" "${check_cmd[@]}"
  if ((BENCH_RC != 0)); then failures+=("check run $r: exit status $BENCH_RC"); else check_suite "$r"; fi
  check_walls+=("$BENCH_WALL"); check_peaks+=("$BENCH_PEAK_KIB")
  notes+=("check run $r: ${BENCH_WALL} s, peak ${BENCH_PEAK_KIB} KiB, load before: $load")
  echo "bench_check: ${notes[-1]}"

  load="$(bench_load)"
  rm -f "$WORK/table.csv" "$WORK/table.csv.manifest.json"
  bench_measure "$WORK/table.out" "${table_cmd[@]}"
  if ((BENCH_RC != 0)); then failures+=("table run $r: exit status $BENCH_RC"); else check_table "$r"; fi
  table_walls+=("$BENCH_WALL"); table_peaks+=("$BENCH_PEAK_KIB")
  notes+=("table run $r: ${BENCH_WALL} s, peak ${BENCH_PEAK_KIB} KiB, load before: $load")
  echo "bench_check: ${notes[-1]}"
done
load_end="$(bench_load)"

max_of() { printf '%s\n' "$@" | sort -g | tail -n 1; }
c_med="$(bench_median "${check_walls[@]}")"; c_min="$(bench_min "${check_walls[@]}")"
t_med="$(bench_median "${table_walls[@]}")"; t_min="$(bench_min "${table_walls[@]}")"
c_peak="$(awk -v k="$(max_of "${check_peaks[@]}")" 'BEGIN { printf "%.1f", k / 1024 }')"
t_peak="$(awk -v k="$(max_of "${table_peaks[@]}")" 'BEGIN { printf "%.1f", k / 1024 }')"
ratio="$(awk -v a="$c_med" -v b="$t_med" 'BEGIN { printf "%.2f", (b > 0 ? a / b : 0) }')"
# The sub-ranges of the expensive checks, from the last report.
subranges="$(sed -n '/^smaller ranges/,/^$/p' "$WORK/check.out" | sed '1d; /^$/d')"

{
  echo "# sqfc benchmark: the identity suite (sqfc check) against sqfc table --every 1, measured in the same session"
  bench_header "$BUILD_DIR"
  echo "# command: ${check_cmd[*]/#$WORK/<tmp>}"
  echo "# baseline: ${table_cmd[*]/#$WORK/<tmp>}"
  echo "# threads: ${THREADS:-sqfc default = $(nproc) hardware threads}"
  echo "# repeats: $REPEATS each, interleaved; median wall time, peak = largest over repeats"
  echo "# wall time: monotonic clock around each process; peak: GNU time -v maximum resident set ($BENCH_TIME_TOOL)"
  echo "# load average (1/5/15 min): start $load_start, end $load_end"
  for note in "${notes[@]}"; do echo "# $note"; done
  while IFS= read -r line; do [ -n "$line" ] && echo "# sub-range:$line"; done <<<"$subranges"
  if ((${#failures[@]})); then echo "# checks: FAIL: ${failures[*]}"; else echo "# checks: pass"; fi
  echo "what,n,median_seconds,min_seconds,peak_mib,ratio_vs_baseline"
  echo "check,$TO,$c_med,$c_min,$c_peak,$ratio"
  echo "table_every_1,$TO,$t_med,$t_min,$t_peak,1.00"
} >"$CSV"

status=0
echo
echo "bench_check summary ($(lscpu 2>/dev/null | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores; load $load_start -> $load_end)"
printf '  %-28s n=%-10s median %8s s  min %8s s  peak %8s MiB  ratio %s\n' "sqfc check" "$TO" "$c_med" "$c_min" "$c_peak" "$ratio"
printf '  %-28s n=%-10s median %8s s  min %8s s  peak %8s MiB\n' "sqfc table --every 1" "$TO" "$t_med" "$t_min" "$t_peak"
echo "  sub-ranges of the expensive checks:"
echo "${subranges:-    (none)}"
if ((${#failures[@]})); then
  echo "  answers: FAIL"
  for f in "${failures[@]}"; do echo "    $f"; done
  status=1
else
  echo "  answers: PASS (20 checks passed; table rows and published M)"
fi
if ((TO == 1000000)); then
  ok="$(awk -v s="$c_med" 'BEGIN { print (s <= 60 ? "PASS" : "FAIL") }')"
  echo "  target median wall <= 60 s at 10^6: $ok ($c_med s)"
  if ((status == 0)) && [ "$ok" != PASS ]; then status=3; fi
else
  echo "  target (<= 60 s): n/a, it applies to --to 1e6"
fi
echo "  wrote $CSV"
exit "$status"
