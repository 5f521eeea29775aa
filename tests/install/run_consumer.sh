#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Installs the build tree into a temporary prefix and builds and runs the consumer against it.
set -euo pipefail
BUILD_DIR="$1"; SOURCE_DIR="$2"
WORK="$(mktemp -d)"; trap 'rm -rf "$WORK"' EXIT
cmake --install "$BUILD_DIR" --prefix "$WORK/prefix" > /dev/null
cmake -S "$SOURCE_DIR/tests/install/consumer" -B "$WORK/build" -DCMAKE_PREFIX_PATH="$WORK/prefix" \
      -DCMAKE_BUILD_TYPE=Release > /dev/null
cmake --build "$WORK/build" > /dev/null
"$WORK/build/consumer"
