# SPDX-License-Identifier: MIT
# shellcheck shell=bash disable=SC2034  # BENCH_* are read by the scripts that source this
# Shared helpers for the tests/bench/*.sh scripts (sourced, not run): building the benchmark
# tree, the CSV header block, timing a command with its peak memory, and number parsing.
# Needs bash 4. Every function reports errors on stderr and returns non-zero.

# Repository root (this file lives in tests/bench/).
BENCH_REPO_ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"

bench_die() {
  echo "$(basename "$0"): error: $*" >&2
  exit 2
}

# bench_to_int TEXT: prints TEXT as an integer; accepts digits, 1e9 (mantissa e exponent) and
# 10^9 / 2^40, like the sqfc command line. Fails on anything else or on 64-bit overflow.
bench_to_int() {
  local t="$1" m e v i
  if [[ "$t" =~ ^[0-9]+$ ]]; then
    m="$t"; e=0; v=1
  elif [[ "$t" =~ ^([0-9]+)[eE]([0-9]+)$ ]]; then
    m="${BASH_REMATCH[1]}"; e="${BASH_REMATCH[2]}"; v=10
  elif [[ "$t" =~ ^([0-9]+)\^([0-9]+)$ ]]; then
    m=1; v="${BASH_REMATCH[1]}"; e="${BASH_REMATCH[2]}"
  else
    return 1
  fi
  ((${#m} <= 18 && e <= 63)) || return 1
  m=$((10#$m))
  for ((i = 0; i < e; i++)); do
    ((m <= 9223372036854775807 / v)) || return 1
    m=$((m * v))
  done
  echo "$m"
}

# bench_build BUILD_DIR: configures (Release, benchmarks on) and builds the benchmark targets.
# An existing tree keeps its settings, except that SQFC_BUILD_BENCHMARKS is switched on; a
# tree that is not Release is refused, since its timings would mean nothing.
bench_build() {
  local dir="$1"
  if [ -f "$dir/CMakeCache.txt" ]; then
    cmake -S "$BENCH_REPO_ROOT" -B "$dir" -DSQFC_BUILD_BENCHMARKS=ON >"$dir/bench_configure.log" 2>&1 ||
      { cat "$dir/bench_configure.log" >&2; return 1; }
  else
    mkdir -p "$dir"
    cmake -S "$BENCH_REPO_ROOT" -B "$dir" -DCMAKE_BUILD_TYPE=Release -DSQFC_BUILD_BENCHMARKS=ON \
      >"$dir/bench_configure.log" 2>&1 || { cat "$dir/bench_configure.log" >&2; return 1; }
  fi
  bench_check_release "$dir" || return 1
  cmake --build "$dir" -j "$(nproc)" --target sqfc_benchmarks >"$dir/bench_build.log" 2>&1 ||
    { tail -n 40 "$dir/bench_build.log" >&2; return 1; }
}

# bench_cache_value BUILD_DIR NAME: a variable of the CMake cache (empty when unset).
bench_cache_value() {
  sed -n "s/^$2:[A-Z]*=//p" "$1/CMakeCache.txt" 2>/dev/null | head -n 1
}

bench_check_release() {
  local type
  type="$(bench_cache_value "$1" CMAKE_BUILD_TYPE)"
  if [ "$type" != "Release" ]; then
    echo "$(basename "$0"): error: $1 is a '$type' build; benchmarks need CMAKE_BUILD_TYPE=Release" >&2
    return 1
  fi
}

# bench_header BUILD_DIR: prints the comment block every data_out/bench CSV starts with.
bench_header() {
  local dir="$1" cxx commit dirty=""
  cxx="$(bench_cache_value "$dir" CMAKE_CXX_COMPILER)"
  commit="$(git -C "$BENCH_REPO_ROOT" rev-parse HEAD 2>/dev/null || echo unknown)"
  if [ -n "$(git -C "$BENCH_REPO_ROOT" status --porcelain --untracked-files=no 2>/dev/null)" ]; then
    dirty=" (working tree has uncommitted changes)"
  fi
  echo "# commit: ${commit}${dirty}"
  if [ -n "$dirty" ]; then
    # What was built is the working tree: name the changed library files and fingerprint the diff.
    local changed
    changed="$(git -C "$BENCH_REPO_ROOT" diff --name-only HEAD -- src include 2>/dev/null | tr '\n' ' ')"
    echo "# library changes not in the commit: ${changed:-none} (diff sha256" \
         "$(git -C "$BENCH_REPO_ROOT" diff HEAD -- src include 2>/dev/null | sha256sum | cut -c 1-16))"
  fi
  cxx="${cxx:-g++}"
  echo "# compiler: $cxx ($(readlink -f "$(command -v "$cxx")" 2>/dev/null)): $("$cxx" --version 2>/dev/null | head -n 1)"
  echo "# flags: CMAKE_BUILD_TYPE=$(bench_cache_value "$dir" CMAKE_BUILD_TYPE)" \
       "CMAKE_CXX_FLAGS='$(bench_cache_value "$dir" CMAKE_CXX_FLAGS)'" \
       "CMAKE_CXX_FLAGS_RELEASE='$(bench_cache_value "$dir" CMAKE_CXX_FLAGS_RELEASE)'" \
       "SQFC_ENABLE_NATIVE=$(bench_cache_value "$dir" SQFC_ENABLE_NATIVE)"
  echo "# cpu: $(lscpu 2>/dev/null | sed -n 's/^Model name: *//p' | head -n 1), $(nproc) cores available"
  echo "# date: $(date -u +%Y-%m-%dT%H:%M:%SZ)"
  echo "# host: $(uname -srm)"
}

# Peak-memory measurement: GNU time (Debian package `time`) when present; otherwise try to
# install it the way scripts/setup.sh installs packages; otherwise poll /proc/PID/status
# (every 50 ms, so a peak reached in the last moments can be missed). SQFC_BENCH_TIME_TOOL=proc
# forces the fallback, to test it.
BENCH_TIME_TOOL="${SQFC_BENCH_TIME_TOOL:-}"
bench_find_time_tool() {
  if [ -x /usr/bin/time ] && /usr/bin/time -v true >/dev/null 2>&1; then
    BENCH_TIME_TOOL=gnu
    return
  fi
  if command -v apt-get >/dev/null 2>&1; then
    local sudo=""
    [ "$(id -u)" -ne 0 ] && sudo="sudo"
    echo "$(basename "$0"): installing the Debian package 'time'" >&2
    if { $sudo apt-get update -qq && DEBIAN_FRONTEND=noninteractive $sudo apt-get install -y -qq \
         --no-install-recommends time; } >/dev/null 2>&1 && [ -x /usr/bin/time ]; then
      BENCH_TIME_TOOL=gnu
      return
    fi
  fi
  echo "$(basename "$0"): warning: GNU time unavailable; polling /proc/PID/status for the peak (VmHWM)" >&2
  BENCH_TIME_TOOL=proc
}

# bench_measure STDOUT_FILE CMD...: runs CMD with its stdout in STDOUT_FILE (stderr passes
# through) and sets BENCH_WALL (seconds, from the monotonic clock around the command),
# BENCH_PEAK_KIB (peak resident set, KiB), BENCH_CPU (user + system seconds of the command and
# its children; only with GNU time, otherwise empty) and BENCH_RC (exit status).
bench_measure() {
  local out="$1"
  shift
  [ -n "$BENCH_TIME_TOOL" ] || bench_find_time_tool
  local tfile t0 t1
  tfile="$(mktemp)"
  BENCH_PEAK_KIB=0
  BENCH_CPU=""
  t0="$(date +%s%N)"
  if [ "$BENCH_TIME_TOOL" = gnu ]; then
    BENCH_RC=0
    /usr/bin/time -v -o "$tfile" "$@" >"$out" || BENCH_RC=$?
    t1="$(date +%s%N)"
    BENCH_PEAK_KIB="$(sed -n 's/^[[:space:]]*Maximum resident set size (kbytes): *//p' "$tfile")"
    BENCH_CPU="$(awk -F': ' '/User time|System time/ { s += $2 } END { printf "%.3f", s }' "$tfile")"
  else
    "$@" >"$out" &
    local pid=$! hwm
    while kill -0 "$pid" 2>/dev/null; do
      hwm="$(sed -n 's/^VmHWM:[[:space:]]*\([0-9]*\) kB/\1/p' "/proc/$pid/status" 2>/dev/null)"
      if [ -n "$hwm" ] && ((hwm > BENCH_PEAK_KIB)); then BENCH_PEAK_KIB=$hwm; fi
      sleep 0.05
    done
    BENCH_RC=0
    wait "$pid" || BENCH_RC=$?
    t1="$(date +%s%N)"
  fi
  rm -f "$tfile"
  BENCH_WALL="$(awk -v a="$t0" -v b="$t1" 'BEGIN { printf "%.3f", (b - a) / 1e9 }')"
  : "${BENCH_PEAK_KIB:=0}"
}

# bench_median X...: the median of the numbers (mean of the middle two for an even count).
bench_median() {
  printf '%s\n' "$@" | sort -g | awk '{ v[NR] = $1 } END {
    if (NR == 0) { print "nan"; exit }
    if (NR % 2) printf "%.3f\n", v[(NR + 1) / 2]; else printf "%.3f\n", (v[NR / 2] + v[NR / 2 + 1]) / 2 }'
}

bench_min() {
  printf '%s\n' "$@" | sort -g | head -n 1
}

# bench_load: the 1-, 5- and 15-minute load averages.
bench_load() {
  cut -d ' ' -f 1-3 /proc/loadavg
}
