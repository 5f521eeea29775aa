#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Times `sqfc fredholm` (issue 4): the bordered Green function to 10^4, the closed-form Green
# statistics to 10^7 and, when the binary offers it, the FLINT cross-check at 2000; checks
# every answer and writes data_out/bench/fredholm_<date>.csv.
#
# Usage: tests/bench/bench_fredholm.sh [options] [BUILD_DIR]
#   --build-dir DIR     build tree (default build-bench); also accepted as the one positional argument
#   --no-build          use the tree as it is (it must be Release and hold the sqfc target)
#   --to-bordered N     last n of the bordered run (default 1e4)
#   --to-closed N       last n of the closed-form run (default 1e7)
#   --flint-n N         n of the FLINT cross-check (default 2000)
#   --repeats R         runs of each measurement (default 3); the median wall time is reported
#   --threads T         passed to sqfc fredholm (default: its own, every hardware thread)
#   --out-dir DIR       where the CSV goes (default data_out/bench)
#
# What runs, interleaved so that every measurement sees the same machine state:
#   (a) sqfc fredholm --to N_b --method bordered --log 1 --green-stats --quiet --out FILE
#   (b) sqfc fredholm --to N_c --method closed   --log 1 --green-stats --quiet --out FILE
#   (c) sqfc fredholm --to N_f --at N_f --method flint --quiet --out FILE, only when
#       `sqfc fredholm --help` lists flint as a --method; otherwise skipped with a note
# each under GNU time -v for the peak resident set (see bench_common.sh for the fallback), and
# once, untimed, the closed form at N_b so that the two methods can be compared.
#
# Checks (any failure: exit 1): every run exits 0 and its manifest reports checks_passed = true;
# no row's checks column holds a FAIL; each run's last row is n = N; on every row (the powers of
# ten up to N, and N itself): vertices = Q(n) - 1, energy = 1 - M(n) (energy theorem, published
# 2017/2019), fredholm = prod over squarefree k in [2, n] of -mu(k) = (-1)^((Q+M)/2 - 1)
# (unimodularity of connection graphs, published 2016), even_faces = (Q - M)/2, odd_faces =
# (Q + M)/2 - 1, and for the bordered run positive/negative eigenvalues = even/odd faces
# (published 2017). Q and M at powers of ten are the published values (OEIS A071172, A084237:
# at 10^4 energy 24, at 10^7 energy -1036); at any other n <= 10^6 a sieve of mu in awk here,
# sharing nothing with sqfc. The bordered and closed rows at N_b agree on every shared column.
# Targets (exit 3 when missed, answers right), judged only at the default sizes:
# (a) median <= 120 s and peak <= 1 GiB, (b) median <= 60 s, (c) median <= 30 s.
# Exit 2: bad usage or build failure.
#
# CSV rows: what, method, n, median_seconds, min_seconds, peak_mib, target_seconds, target_mib,
# verdict (PASS, FAIL, n/a when the target does not apply to this n, skipped).
set -euo pipefail
SELF="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)/$(basename "${BASH_SOURCE[0]}")"
# shellcheck source=tests/bench/bench_common.sh
source "$(dirname "$SELF")/bench_common.sh"
cd "$BENCH_REPO_ROOT"

BUILD_DIR=build-bench
BUILD=1
NB_TEXT=1e4
NC_TEXT=1e7
NF_TEXT=2000
REPEATS=3
THREADS=""
OUT_DIR=data_out/bench
positional=0
while (($#)); do
  case "$1" in
    --build-dir) BUILD_DIR="${2:?--build-dir needs a value}"; shift 2 ;;
    --no-build) BUILD=0; shift ;;
    --to-bordered) NB_TEXT="${2:?--to-bordered needs a value}"; shift 2 ;;
    --to-closed) NC_TEXT="${2:?--to-closed needs a value}"; shift 2 ;;
    --flint-n) NF_TEXT="${2:?--flint-n needs a value}"; shift 2 ;;
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
NB="$(bench_to_int "$NB_TEXT")" || bench_die "--to-bordered $NB_TEXT is not a number"
NC="$(bench_to_int "$NC_TEXT")" || bench_die "--to-closed $NC_TEXT is not a number"
NF="$(bench_to_int "$NF_TEXT")" || bench_die "--flint-n $NF_TEXT is not a number"
((NB >= 1 && NC >= 1 && NF >= 1)) || bench_die "sizes must be at least 1"

# Published values at 10^k: M from OEIS A084237, Q from OEIS A071172 (M(1) = Q(1) = 1).
declare -A PUB_M=([1]=1 [10]=-1 [100]=1 [1000]=2 [10000]=-23 [100000]=-48 [1000000]=212 [10000000]=1037
                  [100000000]=1928)
declare -A PUB_Q=([1]=1 [10]=7 [100]=61 [1000]=608 [10000]=6083 [100000]=60794 [1000000]=607926
                  [10000000]=6079291 [100000000]=60792694)
for n in "$NB" "$NC" "$NF"; do
  if [ -z "${PUB_M[$n]:-}" ] && ((n > 1000000)); then
    bench_die "$n: beyond 10^6 only powers of ten up to 10^8 can be checked (published M, Q)"
  fi
done

if ((BUILD)); then
  echo "bench_fredholm: building $BUILD_DIR (Release, SQFC_BUILD_BENCHMARKS=ON)"
  bench_build "$BUILD_DIR" || exit 2
else
  bench_check_release "$BUILD_DIR" || exit 2
fi
SQFC="$BUILD_DIR/bin/sqfc"
[ -x "$SQFC" ] || bench_die "$SQFC not found (build the sqfc target)"

WORK="$(mktemp -d "${TMPDIR:-/tmp}/sqfc-bench-fredholm.XXXXXX")"
trap 'rm -rf "$WORK"' EXIT
mkdir -p "$OUT_DIR"
STAMP="$(date -u +%Y-%m-%dT%H%M%SZ)"
CSV="$OUT_DIR/fredholm_${STAMP}.csv"

# Q(n) and M(n) for the n that are not published powers of ten, by a sieve of mu in awk
# (mu = product of -1 over the primes dividing n, 0 when a square of a prime divides it).
# Prints "n Q M" per requested n.
sieve_facts() {
  local limit="$1"
  shift
  awk -v limit="$limit" -v wanted="$*" 'BEGIN {
    split(wanted, w, " "); for (i in w) want[w[i]] = 1
    for (k = 1; k <= limit; k++) mu[k] = 1
    for (p = 2; p <= limit; p++) {
      if (p in composite) continue
      for (k = p; k <= limit; k += p) { if (k > p) composite[k] = 1; mu[k] = -mu[k] }
      if (p <= limit / p) for (k = p * p; k <= limit; k += p * p) mu[k] = 0
    }
    q = 0; m = 0
    for (k = 1; k <= limit; k++) { m += mu[k]; if (mu[k] != 0) q++; if (k in want) print k, q, m }
  }'
}

declare -A FACT_Q FACT_M
# facts_for N...: fills FACT_Q / FACT_M for every n given.
facts_for() {
  local missing=() n q m max=0
  for n in "$@"; do
    if [ -n "${PUB_M[$n]:-}" ]; then FACT_Q[$n]=${PUB_Q[$n]}; FACT_M[$n]=${PUB_M[$n]}
    elif [ -z "${FACT_M[$n]:-}" ]; then missing+=("$n"); if ((n > max)); then max=$n; fi
    fi
  done
  ((${#missing[@]})) || return 0
  while read -r n q m; do FACT_Q[$n]=$q; FACT_M[$n]=$m; done < <(sieve_facts "$max" "${missing[@]}")
}

# check_run LABEL N CSV_FILE BORDERED: appends to `failures` every wrong answer; sets RUN_LAST.
check_run() {
  local label="$1" n_last="$2" file="$3" bordered="$4" ns=() rows n q m
  if [ ! -s "$file" ]; then failures+=("$label: no table written"); return; fi
  if ! grep -q '"checks_passed": true' "$file.manifest.json" 2>/dev/null; then
    failures+=("$label: the manifest does not report checks_passed = true")
  fi
  # Columns by name (issue 4 output): one line per row with the values the checks need.
  rows="$(awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) c[$i] = i; next }
    { print $c["n"], $c["vertices"], $c["fredholm"], $c["energy"], $c["even_faces"], $c["odd_faces"],
            ($c["positive_eigenvalues"] == "" ? "-" : $c["positive_eigenvalues"]),
            ($c["negative_eigenvalues"] == "" ? "-" : $c["negative_eigenvalues"]),
            ($c["checks"] == "" ? "-" : $c["checks"]) }' "$file")"
  while read -r n _; do ns+=("$n"); done <<<"$rows"
  facts_for "${ns[@]}"
  local v d e ev od pos neg checks last_n=""
  while read -r n v d e ev od pos neg checks; do
    q=${FACT_Q[$n]:-}; m=${FACT_M[$n]:-}
    if [ -z "$q" ]; then failures+=("$label: no reference value for n = $n"); continue; fi
    local want_d=1 want_even=$(((q - m) / 2)) want_odd=$(((q + m) / 2 - 1))
    ((want_odd % 2 == 0)) || want_d=-1
    [ "$v" = "$((q - 1))" ] || failures+=("$label n=$n: vertices $v, expected Q - 1 = $((q - 1))")
    [ "$e" = "$((1 - m))" ] || failures+=("$label n=$n: energy $e, expected 1 - M = $((1 - m))")
    [ "$d" = "$want_d" ] || failures+=("$label n=$n: fredholm $d, expected prod -mu(k) = $want_d")
    [ "$ev" = "$want_even" ] || failures+=("$label n=$n: even_faces $ev, expected $want_even")
    [ "$od" = "$want_odd" ] || failures+=("$label n=$n: odd_faces $od, expected $want_odd")
    if ((bordered)); then
      [ "$pos" = "$want_even" ] || failures+=("$label n=$n: positive eigenvalues $pos, expected $want_even")
      [ "$neg" = "$want_odd" ] || failures+=("$label n=$n: negative eigenvalues $neg, expected $want_odd")
    fi
    [[ "$checks" != *FAIL* ]] || failures+=("$label n=$n: checks $checks")
    last_n="$n"
    RUN_LAST="n=$n vertices=$v fredholm=$d energy=$e"
  done <<<"$rows"
  [ "$last_n" = "$n_last" ] || failures+=("$label: last row n = ${last_n:-none}, expected $n_last")
}

# The shared columns of the last row, for comparing the two methods.
last_shared() {
  awk -F, 'NR == 1 { for (i = 1; i <= NF; i++) c[$i] = i; next }
    { row = $c["n"] "," $c["vertices"] "," $c["edges"] "," $c["fredholm"] "," $c["energy"] "," $c["green_min"] \
            "," $c["green_max"] "," $c["green_distinct"] "," $c["even_faces"] "," $c["odd_faces"] }
    END { print row }' "$1"
}

failures=()
notes=()
walls_a=(); peaks_a=(); walls_b=(); peaks_b=(); walls_c=(); peaks_c=()
load_start="$(bench_load)"
echo "bench_fredholm: load average at start: $load_start ($(nproc) cores)"

thread_args=()
[ -n "$THREADS" ] && thread_args=(--threads "$THREADS")
cmd_a=("$SQFC" fredholm --to "$NB" --method bordered --log 1 --green-stats --quiet --out "$WORK/a.csv" "${thread_args[@]}")
cmd_b=("$SQFC" fredholm --to "$NC" --method closed --log 1 --green-stats --quiet --out "$WORK/b.csv" "${thread_args[@]}")
cmd_c=()
flint_note=""
help_text="$("$SQFC" fredholm --help 2>&1 || true)"
if grep -qi flint <<<"$help_text"; then
  if grep -i -- '--method' <<<"$help_text" | grep -qi flint; then
    cmd_c=("$SQFC" fredholm --to "$NF" --at "$NF" --method flint --quiet --out "$WORK/c.csv" "${thread_args[@]}")
  else
    flint_note="sqfc fredholm --help mentions FLINT only in: $(grep -i flint <<<"$help_text" | tr -s ' ' | head -n 2 | tr '\n' ' ');"
    flint_note+=" this script runs it as --method flint, which is not offered; (c) not measured"
  fi
else
  flint_note="sqfc fredholm --help names no FLINT option; (c) FLINT cross-check at $NF skipped"
fi
if [ -n "$flint_note" ]; then echo "bench_fredholm: note: $flint_note"; fi

for ((r = 1; r <= REPEATS; r++)); do
  load="$(bench_load)"
  rm -f "$WORK"/a.csv*
  bench_measure "$WORK/a.out" "${cmd_a[@]}"
  if ((BENCH_RC != 0)); then failures+=("bordered run $r: exit status $BENCH_RC"); else check_run "bordered run $r" "$NB" "$WORK/a.csv" 1; fi
  LAST_A="${RUN_LAST:-none}"
  walls_a+=("$BENCH_WALL"); peaks_a+=("$BENCH_PEAK_KIB")
  notes+=("bordered run $r (n=$NB): ${BENCH_WALL} s, peak ${BENCH_PEAK_KIB} KiB, load before: $load")
  echo "bench_fredholm: ${notes[-1]}"

  load="$(bench_load)"
  rm -f "$WORK"/b.csv*
  bench_measure "$WORK/b.out" "${cmd_b[@]}"
  if ((BENCH_RC != 0)); then failures+=("closed run $r: exit status $BENCH_RC"); else check_run "closed run $r" "$NC" "$WORK/b.csv" 0; fi
  LAST_B="${RUN_LAST:-none}"
  walls_b+=("$BENCH_WALL"); peaks_b+=("$BENCH_PEAK_KIB")
  notes+=("closed run $r (n=$NC): ${BENCH_WALL} s, peak ${BENCH_PEAK_KIB} KiB, load before: $load")
  echo "bench_fredholm: ${notes[-1]}"

  if ((${#cmd_c[@]})); then
    load="$(bench_load)"
    rm -f "$WORK"/c.csv*
    bench_measure "$WORK/c.out" "${cmd_c[@]}"
    if ((BENCH_RC != 0)); then failures+=("flint run $r: exit status $BENCH_RC"); else check_run "flint run $r" "$NF" "$WORK/c.csv" 0; fi
    LAST_C="${RUN_LAST:-none}"
    walls_c+=("$BENCH_WALL"); peaks_c+=("$BENCH_PEAK_KIB")
    notes+=("flint run $r (n=$NF): ${BENCH_WALL} s, peak ${BENCH_PEAK_KIB} KiB, load before: $load")
    echo "bench_fredholm: ${notes[-1]}"
  fi
done

# Both methods at N_b: the closed form once more (untimed), then the shared columns of the last rows.
agreement="not compared (no bordered table)"
if [ -s "$WORK/a.csv" ]; then
  if "$SQFC" fredholm --to "$NB" --method closed --log 1 --green-stats --quiet --out "$WORK/ab.csv" "${thread_args[@]}" \
       >/dev/null; then
    check_run "closed run at n=$NB" "$NB" "$WORK/ab.csv" 0
    if [ "$(last_shared "$WORK/a.csv")" = "$(last_shared "$WORK/ab.csv")" ]; then
      agreement="bordered = closed at n=$NB: $(last_shared "$WORK/a.csv")"
    else
      failures+=("bordered and closed differ at n=$NB: $(last_shared "$WORK/a.csv") vs $(last_shared "$WORK/ab.csv")")
      agreement="DIFFER"
    fi
  else
    failures+=("closed run at n=$NB: failed")
  fi
fi
load_end="$(bench_load)"

max_of() { printf '%s\n' "$@" | sort -g | tail -n 1; }
mib() { awk -v k="$1" 'BEGIN { printf "%.1f", k / 1024 }'; }
verdict() {  # verdict VALUE LIMIT
  awk -v v="$1" -v l="$2" 'BEGIN { print (v <= l ? "PASS" : "FAIL") }'
}
med_a="$(bench_median "${walls_a[@]}")"; min_a="$(bench_min "${walls_a[@]}")"; peak_a="$(mib "$(max_of "${peaks_a[@]}")")"
med_b="$(bench_median "${walls_b[@]}")"; min_b="$(bench_min "${walls_b[@]}")"; peak_b="$(mib "$(max_of "${peaks_b[@]}")")"
if ((NB == 10000)); then
  va_time="$(verdict "$med_a" 120)"; va_mem="$(verdict "$peak_a" 1024)"
  va="$([ "$va_time$va_mem" = PASSPASS ] && echo PASS || echo FAIL)"
else
  va_time=n/a; va_mem=n/a; va=n/a
fi
if ((NC == 10000000)); then vb="$(verdict "$med_b" 60)"; else vb=n/a; fi
if ((${#cmd_c[@]})); then
  med_c="$(bench_median "${walls_c[@]}")"; min_c="$(bench_min "${walls_c[@]}")"; peak_c="$(mib "$(max_of "${peaks_c[@]}")")"
  if ((NF == 2000)); then vc="$(verdict "$med_c" 30)"; else vc=n/a; fi
else
  med_c=nan; min_c=nan; peak_c=nan; vc=skipped
fi

{
  echo "# sqfc benchmark: sqfc fredholm, bordered Green function, closed-form Green statistics, FLINT cross-check"
  bench_header "$BUILD_DIR"
  echo "# command (a): ${cmd_a[*]/#$WORK/<tmp>}"
  echo "# command (b): ${cmd_b[*]/#$WORK/<tmp>}"
  if ((${#cmd_c[@]})); then echo "# command (c): ${cmd_c[*]/#$WORK/<tmp>}"; else echo "# command (c): none; $flint_note"; fi
  echo "# threads: ${THREADS:-sqfc default = $(nproc) hardware threads}"
  echo "# repeats: $REPEATS; median wall time, peak = largest over repeats"
  echo "# wall time: monotonic clock around each process; peak: maximum resident set ($BENCH_TIME_TOOL)"
  echo "# load average (1/5/15 min): start $load_start, end $load_end"
  for note in "${notes[@]}"; do echo "# $note"; done
  echo "# answers: bordered ${LAST_A:-none}; closed ${LAST_B:-none}; flint ${LAST_C:-none}"
  echo "# references: Q(n) OEIS A071172, M(n) OEIS A084237 at powers of ten, an awk sieve of mu elsewhere;"
  echo "#   energy = 1 - M(n) (published 2017/2019), fredholm = (-1)^((Q+M)/2 - 1) (published 2016)"
  echo "# methods: $agreement"
  if ((${#failures[@]})); then echo "# checks: FAIL: ${failures[*]}"; else echo "# checks: pass"; fi
  echo "what,method,n,median_seconds,min_seconds,peak_mib,target_seconds,target_mib,verdict"
  echo "green_function,bordered,$NB,$med_a,$min_a,$peak_a,120,1024,$va"
  echo "green_statistics,closed,$NC,$med_b,$min_b,$peak_b,60,,$vb"
  echo "determinant_cross_check,flint,$NF,$med_c,$min_c,$peak_c,30,,$vc"
} >"$CSV"

status=0
echo
echo "bench_fredholm summary ($(lscpu 2>/dev/null | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores; load $load_start -> $load_end)"
printf '  %-34s n=%-10s median %8s s  min %8s s  peak %8s MiB\n' "(a) bordered --green-stats" "$NB" "$med_a" "$min_a" "$peak_a"
printf '  %-34s n=%-10s median %8s s  min %8s s  peak %8s MiB\n' "(b) closed --green-stats" "$NC" "$med_b" "$min_b" "$peak_b"
if ((${#cmd_c[@]})); then
  printf '  %-34s n=%-10s median %8s s  min %8s s  peak %8s MiB\n' "(c) flint cross-check" "$NF" "$med_c" "$min_c" "$peak_c"
else
  echo "  (c) flint cross-check: skipped ($flint_note)"
fi
echo "  last rows: bordered ${LAST_A:-none}; closed ${LAST_B:-none}"
echo "  methods: $agreement"
if ((${#failures[@]})); then
  echo "  answers: FAIL"
  for f in "${failures[@]}"; do echo "    $f"; done
  status=1
else
  echo "  answers: PASS (published Q and M, product formula, face parities, sqfc identity checks)"
fi
echo "  target (a) wall <= 120 s: $va_time ($med_a s); peak <= 1 GiB: $va_mem ($peak_a MiB)"
echo "  target (b) wall <= 60 s: $vb ($med_b s)"
echo "  target (c) wall <= 30 s: $vc"
for v in "$va" "$vb" "$vc"; do
  if ((status == 0)) && [ "$v" = FAIL ]; then status=3; fi
done
echo "  wrote $CSV"
exit "$status"
