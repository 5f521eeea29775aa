#!/usr/bin/env bash
# SPDX-License-Identifier: MIT
# Sets up, builds and runs the worked scenario into data_out/demo/.
set -euo pipefail
cd "$(dirname "$0")/.."
scripts/setup.sh build
build/bin/sqfc demo "$@"
