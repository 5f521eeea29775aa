#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Measures what checkpointing into a run store costs, and what 2 MPI ranks gain, with
# baselines measured in the same session; writes data_out/bench/store_<date>.csv.
#
# Usage: tests/bench/bench_store.sh [options] [BUILD_DIR]
#   --build-dir DIR   build tree (default build-bench); also accepted as the one positional argument
#   --no-build        use the tree as it is (it must be Release and hold the benchmark targets)
#   --to N            last n of the store comparison (default 1e10)
#   --repeats R       runs of each kind (default 3); medians are reported
#   --mpi-to N        last n of the MPI comparison (default 4e9); 0 skips it
#   --threads T       threads of the store comparison (default: sqfc's default, every hardware thread)
#   --out-dir DIR     where the CSV goes (default data_out/bench)
#   --no-targets      check the answers only (for smoke runs at sizes where timings mean nothing)
#
# 1. Store cost, alternating so both kinds see the same machine state:
#      sqfc table --to N --log 10 --events FILE --quiet --out FILE              (plain)
#      sqfc table --to N --log 10 --events FILE --quiet --out FILE --store S    (new store each run)
#    cost = median(store) / median(plain) - 1 of wall time; target <= 3 %. The same ratio of CPU
#    time (user + system, from GNU time) is reported too: on a shared machine it is the steadier figure.
# 2. MPI (when the build has SQFC_ENABLE_MPI): one process with --threads 1 against
#      mpirun -np 2 sqfc table --threads 1 ...   (same --log 10 --events run to --mpi-to)
#    speed-up = median(single) / median(2 ranks); target >= 1.8.
# Checks (exit 1 when one fails): every run exits 0; each run's table and events files are
# byte-identical to the first plain run's. Exit 3: answers right, a target missed. Exit 2: usage.
set -euo pipefail
SELF="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)/$(basename "${BASH_SOURCE[0]}")"
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$SELF")/bench_common.sh"
cd "$BENCH_REPO_ROOT"

BUILD_DIR=build-bench
BUILD=1
TO_TEXT=1e10
REPEATS=3
MPI_TEXT=4e9
THREADS=""
OUT_DIR=data_out/bench
TARGETS=1
positional=0
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --to) TO_TEXT="${2:?--to needs a value}"; shift 2 ;;
    --repeats) REPEATS="${2:?--repeats needs a value}"; shift 2 ;;
    --mpi-to) MPI_TEXT="${2:?--mpi-to needs a value}"; shift 2 ;;
    --threads) THREADS="${2:?--threads needs a value}"; shift 2 ;;
    --out-dir) OUT_DIR="${2:?--out-dir needs a value}"; shift 2 ;;
    --no-targets) TARGETS=0; shift ;;
    -h|--help) sed -n '3,/^set -euo/p' "$SELF" | sed '$d; s/^# \{0,1\}//'; exit 0 ;;
    -*) bench_die "unknown option $1 (see --help)" ;;
    *) ((positional == 0)) || bench_die "more than one build directory given"
       BUILD_DIR="$1"; positional=1; shift ;;
  esac
done
TO="$(bench_to_int "$TO_TEXT")" || bench_die "--to: not a number: $TO_TEXT"
MPI_TO="$(bench_to_int "$MPI_TEXT")" || bench_die "--mpi-to: not a number: $MPI_TEXT"
[[ "$REPEATS" =~ ^[1-9][0-9]*$ ]] || bench_die "--repeats must be a positive integer"
if ((BUILD)); then bench_build "$BUILD_DIR" || exit 2; else bench_check_release "$BUILD_DIR" || exit 2; fi
SQFC="$BUILD_DIR/bin/sqfc"
[ -x "$SQFC" ] || bench_die "$SQFC not found (build the sqfc target)"
MPI_ON="$(bench_cache_value "$BUILD_DIR" SQFC_ENABLE_MPI)"
MPIRUN="$(bench_cache_value "$BUILD_DIR" MPIEXEC_EXECUTABLE)"

mkdir -p "$OUT_DIR"
WORK="$(mktemp -d)"
trap 'rm -rf "$WORK"' EXIT
FAILED=0
fail() { echo "bench_store: FAIL: $*" >&2; FAILED=1; }
threads_args=()
[ -n "$THREADS" ] && threads_args=(--threads "$THREADS")
log=()

# run_kind KIND N DIR CMD...: one timed run in DIR; its outputs are compared with DIR/../ref.*
run_kind() {
  local kind="$1" n="$2" dir="$3"
  shift 3
  rm -rf "$dir" && mkdir -p "$dir"
  pushd "$dir" >/dev/null
  bench_measure stdout "$@"
  popd >/dev/null
  log+=("$kind n=$n wall=${BENCH_WALL}s cpu=${BENCH_CPU:-?}s rc=$BENCH_RC load=$(bench_load)")
  ((BENCH_RC == 0)) || fail "$kind run exited $BENCH_RC"
  local ref="$WORK/ref-$n"
  if [ ! -d "$ref" ]; then cp -r "$dir" "$ref"; fi
  cmp -s "$dir/t.csv" "$ref/t.csv" || fail "$kind: table differs from the first run's"
  cmp -s "$dir/e.csv" "$ref/e.csv" || fail "$kind: events differ from the first run's"
}

SQFC_ABS="$(readlink -f "$SQFC")"
plain=() stored=() plain_cpu=() stored_cpu=()
for ((r = 1; r <= REPEATS; r++)); do
  run_kind plain "$TO" "$WORK/plain" "$SQFC_ABS" table --to "$TO" --log 10 --events e.csv --quiet --out t.csv "${threads_args[@]}"
  plain+=("$BENCH_WALL")
  plain_cpu+=("${BENCH_CPU:-0}")
  run_kind store "$TO" "$WORK/store" "$SQFC_ABS" table --to "$TO" --log 10 --events e.csv --quiet --out t.csv \
    "${threads_args[@]}" --store run.db
  stored+=("$BENCH_WALL")
  stored_cpu+=("${BENCH_CPU:-0}")
done
PLAIN_MED="$(bench_median "${plain[@]}")"
STORE_MED="$(bench_median "${stored[@]}")"
COST="$(awk -v a="$STORE_MED" -v b="$PLAIN_MED" 'BEGIN { printf "%.2f", 100 * (a / b - 1) }')"
# CPU time (user + system) is far less sensitive to other load on a shared machine than wall time.
PLAIN_CPU="$(bench_median "${plain_cpu[@]}")"
STORE_CPU="$(bench_median "${stored_cpu[@]}")"
COST_CPU="$(awk -v a="$STORE_CPU" -v b="$PLAIN_CPU" 'BEGIN { if (b > 0) printf "%.2f", 100 * (a / b - 1); else print "nan" }')"
STORE_BYTES="$(stat -c %s "$WORK/store/run.db")"
MISSED=0
awk -v c="$COST" 'BEGIN { exit !(c <= 3) }' || MISSED=1

SINGLE_MED="" MPI_MED="" SPEEDUP="" SINGLE_CPU="" MPI_CPU=""
if [ "$MPI_ON" = "ON" ] && ((MPI_TO > 0)) && [ -x "$MPIRUN" ]; then
  single=() ranks2=() single_cpu=() ranks2_cpu=()
  for ((r = 1; r <= REPEATS; r++)); do
    run_kind single_rank "$MPI_TO" "$WORK/single" "$SQFC_ABS" table --to "$MPI_TO" --log 10 --events e.csv --quiet \
      --out t.csv --threads 1
    single+=("$BENCH_WALL")
    single_cpu+=("${BENCH_CPU:-0}")
    run_kind mpi_2_ranks "$MPI_TO" "$WORK/mpi" "$MPIRUN" --allow-run-as-root -np 2 "$SQFC_ABS" table --to "$MPI_TO" \
      --log 10 --events e.csv --quiet --out t.csv --threads 1
    ranks2+=("$BENCH_WALL")
    ranks2_cpu+=("${BENCH_CPU:-0}")
  done
  SINGLE_MED="$(bench_median "${single[@]}")"
  MPI_MED="$(bench_median "${ranks2[@]}")"
  SINGLE_CPU="$(bench_median "${single_cpu[@]}")"
  MPI_CPU="$(bench_median "${ranks2_cpu[@]}")"
  SPEEDUP="$(awk -v a="$SINGLE_MED" -v b="$MPI_MED" 'BEGIN { printf "%.3f", a / b }')"
  awk -v s="$SPEEDUP" 'BEGIN { exit !(s >= 1.8) }' || MISSED=1
fi

CSV="$OUT_DIR/store_$(date -u +%Y%m%dT%H%M%SZ).csv"
{
  bench_header "$BUILD_DIR"
  echo "# command: $0 --to $TO_TEXT --repeats $REPEATS --mpi-to $MPI_TEXT ${THREADS:+--threads $THREADS}"
  for line in "${log[@]}"; do echo "# run: $line"; done
  echo "what,n,median_seconds,median_cpu_seconds,integers_per_second,ratio"
  awk -v n="$TO" -v t="$PLAIN_MED" -v c="$PLAIN_CPU" 'BEGIN { printf "table_plain,%d,%s,%s,%.4g,1\n", n, t, c, n / t }'
  awk -v n="$TO" -v t="$STORE_MED" -v c="$STORE_CPU" -v p="$PLAIN_MED" \
    'BEGIN { printf "table_store,%d,%s,%s,%.4g,%.4f\n", n, t, c, n / t, t / p }'
  if [ -n "$SPEEDUP" ]; then
    awk -v n="$MPI_TO" -v t="$SINGLE_MED" -v c="$SINGLE_CPU" 'BEGIN { printf "single_rank_1_thread,%d,%s,%s,%.4g,1\n", n, t, c, n / t }'
    awk -v n="$MPI_TO" -v t="$MPI_MED" -v c="$MPI_CPU" -v s="$SPEEDUP" \
      'BEGIN { printf "mpi_2_ranks_1_thread,%d,%s,%s,%.4g,%s\n", n, t, c, n / t, s }'
  fi
} >"$CSV"
echo "bench_store: plain median ${PLAIN_MED} s, with --store ${STORE_MED} s: checkpoint cost ${COST} % of wall time (target <= 3 %); CPU ${PLAIN_CPU} s vs ${STORE_CPU} s: ${COST_CPU} %; store ${STORE_BYTES} bytes"
if [ -n "$SPEEDUP" ]; then
  echo "bench_store: 1 rank x 1 thread ${SINGLE_MED} s, 2 ranks x 1 thread ${MPI_MED} s: speed-up ${SPEEDUP} (target >= 1.8); CPU ${SINGLE_CPU} s vs ${MPI_CPU} s"
else
  echo "bench_store: MPI comparison skipped (SQFC_ENABLE_MPI=${MPI_ON:-unset} or --mpi-to 0)"
fi
echo "bench_store: wrote $CSV"
((FAILED)) && exit 1
((MISSED && TARGETS)) && { echo "bench_store: a target was missed" >&2; exit 3; }
exit 0
