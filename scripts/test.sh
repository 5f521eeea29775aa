#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Sets up, builds and runs the default test suite (everything but the `slow` label).
# Pass `--all` to include the slow checks.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/setup.sh build
LABEL_FILTER=(-LE slow)
if [ "${1:-}" = "--all" ]; then LABEL_FILTER=(); fi
ctest --test-dir build --output-on-failure --no-tests=error -j "$(nproc)" "${LABEL_FILTER[@]}"
