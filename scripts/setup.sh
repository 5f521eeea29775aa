#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Installs the Debian packages sqfc needs (when missing), configures and builds.
# Usage: scripts/setup.sh [build-dir]   (default: build)
set -euo pipefail
cd "$(dirname "$0")/.."
BUILD_DIR="${1:-build}"

PACKAGES=(build-essential cmake pkg-config libflint-dev libboost-dev libcli11-dev
          libgtest-dev libbenchmark-dev libpari-dev pari-gp nlohmann-json3-dev gnuplot-nox fonts-dejavu-core
          liblapack-dev libblas-dev python3-networkx python3-scipy libgudhi-dev
          libsqlite3-dev libopenmpi-dev openmpi-bin)
missing=()
for p in "${PACKAGES[@]}"; do
  dpkg-query -W -f='${Status}' "$p" 2>/dev/null | grep -q "install ok installed" || missing+=("$p")
done
if ((${#missing[@]})); then
  echo "setup: installing ${missing[*]}"
  SUDO=""
  if [ "$(id -u)" -ne 0 ]; then SUDO="sudo"; fi
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq --no-install-recommends "${missing[@]}"
fi

cmake -S . -B "$BUILD_DIR" -DCMAKE_BUILD_TYPE=Release -DSQFC_BUILD_TESTS=ON -DSQFC_BUILD_CLI=ON \
      -DSQFC_WARNINGS_AS_ERRORS=ON ${SQFC_CMAKE_ARGS:-}
cmake --build "$BUILD_DIR" -j "$(nproc)"
