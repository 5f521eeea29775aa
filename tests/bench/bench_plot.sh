#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Times `sqfc plot` of a large run's envelope, and the cost of building the envelope during
# `sqfc table`, against a run without it in the same session; checks the answers and writes
# data_out/bench/plot_<date>.csv.
#
# Usage: tests/bench/bench_plot.sh [options] [BUILD_DIR]
#   --build-dir DIR     build tree (default build-bench); also accepted as the one positional argument
#   --no-build          use the tree as it is (it must be Release and hold the sqfc target)
#   --to N              N of the run whose envelope is plotted (default 1e10; a power of ten 10^6 .. 10^10)
#   --overhead-to N     N of the overhead comparison (default 1e9; a power of ten 10^6 .. 10^9)
#   --repeats R         repeats of each timed command (default 3); medians are reported
#   --out-dir DIR       where the CSV goes (default data_out/bench)
#
# What runs:
#   1. once: sqfc table --to N --log 1 --events E --envelope-betti --plot png --quiet --out T
#      (makes T's envelope with every series, and four pictures)
#   2. R times: sqfc plot ENVELOPE --format png --out P                        (all five kinds)
#      and R times: sqfc plot ENVELOPE --kind mertens --events E --format png  (one picture)
#   3. R times each, interleaved: sqfc table --to N' --log 10 --quiet --out A
#                                 ... --envelope B.env                    (M, M/sqrt(n), Q, D, f_d)
#                                 ... --envelope C.env --plot-log-x       (the same, log columns)
#                                 ... --envelope D.env --envelope-betti   (every series, b_d too)
# Checks (exit 1 on a failure): every run exits 0; M(N) and M(N') in the last rows and the last
# envelope column equal the published values (OEIS A084237); the largest and smallest M over
# all envelope columns of run 1, and their first positions, equal the last record high and low
# in its events file (two independent computations of the same extremes). Target (exit 3 when
# missed, answers right): median of step 2 (all five pictures) <= 2 s for N = 10^10.
set -euo pipefail
SELF="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)/$(basename "${BASH_SOURCE[0]}")"
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$SELF")/bench_common.sh"
cd "$BENCH_REPO_ROOT"

BUILD_DIR=build-bench
BUILD=1
TO_TEXT=1e10
OVER_TEXT=1e9
REPEATS=3
OUT_DIR=data_out/bench
positional=0
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --to) TO_TEXT="${2:?--to needs a value}"; shift 2 ;;
    --overhead-to) OVER_TEXT="${2:?--overhead-to needs a value}"; shift 2 ;;
    --repeats) REPEATS="${2:?--repeats needs a value}"; shift 2 ;;
    --out-dir) OUT_DIR="${2:?--out-dir needs a value}"; shift 2 ;;
    -h|--help) sed -n '3,/^set -euo/p' "$SELF" | sed '$d; s/^# \{0,1\}//'; exit 0 ;;
    -*) bench_die "unknown option $1 (see --help)" ;;
    *) ((positional == 0)) || bench_die "more than one build directory given"
       BUILD_DIR="$1"; positional=1; shift ;;
  esac
done
[[ "$REPEATS" =~ ^[1-9][0-9]*$ ]] || bench_die "--repeats must be a positive integer"
TO="$(bench_to_int "$TO_TEXT")" || bench_die "--to $TO_TEXT is not a number"
OVER="$(bench_to_int "$OVER_TEXT")" || bench_die "--overhead-to $OVER_TEXT is not a number"
# Published M(10^k), OEIS A084237.
declare -A PUB_M=([1000000]=212 [10000000]=1037 [100000000]=1928 [1000000000]=-222 [10000000000]=-33722)
[ -n "${PUB_M[$TO]:-}" ] || bench_die "--to must be a power of ten from 10^6 to 10^10"
{ [ -n "${PUB_M[$OVER]:-}" ] && ((OVER <= 1000000000)); } || bench_die "--overhead-to must be a power of ten from 10^6 to 10^9"

if ((BUILD)); then
  echo "bench_plot: building $BUILD_DIR (Release, SQFC_BUILD_BENCHMARKS=ON)"
  bench_build "$BUILD_DIR" || exit 2
else
  bench_check_release "$BUILD_DIR" || exit 2
fi
SQFC="$BUILD_DIR/bin/sqfc"
[ -x "$SQFC" ] || bench_die "$SQFC not found (build the sqfc target)"
command -v gnuplot >/dev/null || bench_die "gnuplot not found (Debian package gnuplot-nox)"

WORK="$(mktemp -d "${TMPDIR:-/tmp}/sqfc-bench-plot.XXXXXX")"
trap 'rm -rf "$WORK"' EXIT
mkdir -p "$OUT_DIR"
STAMP="$(date -u +%Y-%m-%dT%H%M%SZ)"
CSV="$OUT_DIR/plot_${STAMP}.csv"
failures=()
notes=()
load_start="$(bench_load)"
echo "bench_plot: load average at start: $load_start ($(nproc) cores)"

# The last row's M of a table file (columns found by name).
last_mertens() { awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) c[$i] = i; next } { m = $c["mertens"] } END { print m }' "$1"; }
# The last envelope column's M and the extremes over all columns: "last max max_n min min_n".
envelope_mertens() {
  awk -F, '/^#/ { next } !h { for (i = 1; i <= NF; i++) c[$i] = i; h = 1; next }
    { last = $c["mertens_last"]
      if (!seen || $c["mertens_max"] + 0 > mx) { mx = $c["mertens_max"] + 0; mxn = $c["mertens_max_n"] }
      if (!seen || $c["mertens_min"] + 0 < mn) { mn = $c["mertens_min"] + 0; mnn = $c["mertens_min_n"] }
      seen = 1 }
    END { print last, mx, mxn, mn, mnn }' "$1"
}

# 1. The large run with its envelope and pictures.
big_cmd=("$SQFC" table --to "$TO" --log 1 --events "$WORK/big-events.csv" --envelope-betti --plot png --quiet --out "$WORK/big.csv")
bench_measure "$WORK/big.out" "${big_cmd[@]}"
BIG_WALL="$BENCH_WALL"
if ((BENCH_RC != 0)); then
  failures+=("table --plot run: exit status $BENCH_RC")
else
  read -r e_last e_max e_max_n e_min e_min_n <<<"$(envelope_mertens "$WORK/big.envelope.csv")"
  t_last="$(last_mertens "$WORK/big.csv")"
  r_high="$(awk -F, '$1 == "mertens_high" { n = $2; v = $3 } END { print v, n }' "$WORK/big-events.csv")"
  r_low="$(awk -F, '$1 == "mertens_low" { n = $2; v = $3 } END { print v, n }' "$WORK/big-events.csv")"
  [ "$t_last" = "${PUB_M[$TO]}" ] || failures+=("table --plot run: M($TO) = $t_last, published ${PUB_M[$TO]}")
  [ "$e_last" = "${PUB_M[$TO]}" ] || failures+=("envelope: last column M = $e_last, published ${PUB_M[$TO]}")
  [ "$e_max $e_max_n" = "$r_high" ] || failures+=("envelope max of M $e_max at $e_max_n, events record high $r_high")
  [ "$e_min $e_min_n" = "$r_low" ] || failures+=("envelope min of M $e_min at $e_min_n, events record low $r_low")
  ENVELOPE_NOTE="M($TO) = $e_last; max $e_max at n = $e_max_n, min $e_min at n = $e_min_n (equal to the last records in the events file)"
  SCANNED="$(sed -n 's/.*"envelope_scanned_values": \([0-9]*\).*/\1/p' "$WORK/big.csv.manifest.json")"
  COLUMNS="$(sed -n 's/.*"envelope_columns": \([0-9]*\).*/\1/p' "$WORK/big.csv.manifest.json")"
fi
notes+=("table --plot run to $TO: $BIG_WALL s, envelope of ${COLUMNS:-?} columns, ${SCANNED:-?} n visited by targeted scans")
echo "bench_plot: ${notes[-1]}"

# 2. sqfc plot of that envelope.
plot_all=(); plot_one=()
for ((r = 1; r <= REPEATS; r++)); do
  rm -rf "$WORK/p"
  bench_measure "$WORK/plot.out" "$SQFC" plot "$WORK/big.envelope.csv" --format png --out "$WORK/p/all" --quiet
  ((BENCH_RC == 0)) || failures+=("plot run $r: exit status $BENCH_RC")
  [ "$(find "$WORK/p" -name 'all-*.png' -size +1k | wc -l)" = 5 ] || failures+=("plot run $r: not five pictures")
  plot_all+=("$BENCH_WALL")
  bench_measure "$WORK/plot.out" "$SQFC" plot "$WORK/big.envelope.csv" --kind mertens --events "$WORK/big-events.csv" \
    --format png --out "$WORK/p/one" --quiet
  ((BENCH_RC == 0)) || failures+=("plot (mertens) run $r: exit status $BENCH_RC")
  plot_one+=("$BENCH_WALL")
  notes+=("plot run $r: all five kinds ${plot_all[-1]} s, mertens with events ${plot_one[-1]} s")
  echo "bench_plot: ${notes[-1]}"
done

# 3. Envelope overhead on a table run, interleaved.
plain=(); linear=(); logx=(); betti=(); plain_cpu=(); linear_cpu=(); logx_cpu=(); betti_cpu=()
for ((r = 1; r <= REPEATS; r++)); do
  for variant in plain linear logx betti; do
    rm -f "$WORK/o.csv" "$WORK/o.csv.manifest.json" "$WORK/o.env"
    cmd=("$SQFC" table --to "$OVER" --log 10 --quiet --out "$WORK/o.csv")
    [ "$variant" = plain ] || cmd+=(--envelope "$WORK/o.env")
    [ "$variant" = logx ] && cmd+=(--plot-log-x)
    [ "$variant" = betti ] && cmd+=(--envelope-betti)
    bench_measure "$WORK/o.out" bash -c 'TIMEFORMAT="%U %S"; { time "$@" ; } 2>"$0"' "$WORK/o.cpu" "${cmd[@]}"
    ((BENCH_RC == 0)) || failures+=("overhead $variant run $r: exit status $BENCH_RC")
    m="$(last_mertens "$WORK/o.csv")"
    [ "$m" = "${PUB_M[$OVER]}" ] || failures+=("overhead $variant run $r: M($OVER) = $m, published ${PUB_M[$OVER]}")
    if [ "$variant" != plain ]; then
      read -r e_last _ <<<"$(envelope_mertens "$WORK/o.env")"
      [ "$e_last" = "${PUB_M[$OVER]}" ] || failures+=("overhead $variant run $r: envelope last M = $e_last")
    fi
    cpu="$(awk '{ print $1 + $2 }' "$WORK/o.cpu" 2>/dev/null || echo nan)"
    case "$variant" in
      plain) plain+=("$BENCH_WALL"); plain_cpu+=("$cpu") ;; linear) linear+=("$BENCH_WALL"); linear_cpu+=("$cpu") ;;
      logx) logx+=("$BENCH_WALL"); logx_cpu+=("$cpu") ;; betti) betti+=("$BENCH_WALL"); betti_cpu+=("$cpu") ;;
    esac
    notes+=("table to $OVER, $variant, run $r: $BENCH_WALL s wall, $cpu s CPU (user + system), peak $BENCH_PEAK_KIB KiB")
    echo "bench_plot: ${notes[-1]}"
  done
done
load_end="$(bench_load)"

all_med="$(bench_median "${plot_all[@]}")"
one_med="$(bench_median "${plot_one[@]}")"
plain_med="$(bench_median "${plain[@]}")"
linear_med="$(bench_median "${linear[@]}")"
logx_med="$(bench_median "${logx[@]}")"
betti_med="$(bench_median "${betti[@]}")"
plain_cpu_med="$(bench_median "${plain_cpu[@]}")"; linear_cpu_med="$(bench_median "${linear_cpu[@]}")"
logx_cpu_med="$(bench_median "${logx_cpu[@]}")"; betti_cpu_med="$(bench_median "${betti_cpu[@]}")"
ratio() { awk -v a="$1" -v b="$2" 'BEGIN { printf "%.3f", (b > 0 ? a / b : 0) }'; }
{
  echo "# sqfc benchmark: sqfc plot of a large run's envelope, and the envelope's cost in sqfc table (same session)"
  bench_header "$BUILD_DIR"
  echo "# large run: ${big_cmd[*]/#$WORK/<tmp>}"
  echo "# repeats: $REPEATS; median wall times; load average (1/5/15 min): start $load_start, end $load_end"
  echo "# ${ENVELOPE_NOTE:-no envelope}"
  for note in "${notes[@]}"; do echo "# $note"; done
  if ((${#failures[@]})); then echo "# checks: FAIL: ${failures[*]}"; else echo "# checks: pass"; fi
  echo "what,n,median_seconds,ratio_vs_plain_table,median_cpu_seconds,cpu_ratio_vs_plain_table"
  echo "plot_all_five_kinds,$TO,$all_med,,,"
  echo "plot_mertens_with_events,$TO,$one_med,,,"
  echo "table_plain,$OVER,$plain_med,1.000,$plain_cpu_med,1.000"
  echo "table_envelope_linear,$OVER,$linear_med,$(ratio "$linear_med" "$plain_med"),$linear_cpu_med,$(ratio "$linear_cpu_med" "$plain_cpu_med")"
  echo "table_envelope_log_x,$OVER,$logx_med,$(ratio "$logx_med" "$plain_med"),$logx_cpu_med,$(ratio "$logx_cpu_med" "$plain_cpu_med")"
  echo "table_envelope_with_betti,$OVER,$betti_med,$(ratio "$betti_med" "$plain_med"),$betti_cpu_med,$(ratio "$betti_cpu_med" "$plain_cpu_med")"
} >"$CSV"

status=0
echo
echo "bench_plot summary ($(lscpu 2>/dev/null | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores; load $load_start -> $load_end)"
echo "  sqfc plot of the 10^$(( ${#TO} - 1 )) envelope, five kinds: median $all_med s; mertens with events: median $one_med s"
echo "  sqfc table --to $OVER wall: plain $plain_med s, envelope $linear_med s (x $(ratio "$linear_med" "$plain_med")), log-x $logx_med s (x $(ratio "$logx_med" "$plain_med")), with Betti $betti_med s (x $(ratio "$betti_med" "$plain_med"))"
echo "  sqfc table --to $OVER CPU:  plain $plain_cpu_med s, envelope $linear_cpu_med s (x $(ratio "$linear_cpu_med" "$plain_cpu_med")), log-x $logx_cpu_med s (x $(ratio "$logx_cpu_med" "$plain_cpu_med")), with Betti $betti_cpu_med s (x $(ratio "$betti_cpu_med" "$plain_cpu_med"))"
if ((${#failures[@]})); then
  echo "  answers: FAIL"
  for f in "${failures[@]}"; do echo "    $f"; done
  status=1
else
  echo "  answers: PASS (published M, envelope extremes equal the event records)"
fi
if ((TO == 10000000000)); then
  ok="$(awk -v s="$all_med" 'BEGIN { print (s <= 2 ? "PASS" : "FAIL") }')"
  echo "  target sqfc plot <= 2 s: $ok ($all_med s)"
  if ((status == 0)) && [ "$ok" != PASS ]; then status=3; fi
else
  echo "  target (<= 2 s): n/a, it applies to --to 1e10"
fi
echo "  wrote $CSV"
exit "$status"
