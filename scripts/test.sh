#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Sets up, builds and runs the whole test suite, the `slow` label included (about a minute on
# two cores). Pass `--quick` to leave the slow checks out.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/setup.sh build
LABEL_FILTER=()
if [ "${1:-}" = "--quick" ]; then LABEL_FILTER=(-LE slow); fi
ctest --test-dir build --output-on-failure --no-tests=error -j "$(nproc)" "${LABEL_FILTER[@]}"
