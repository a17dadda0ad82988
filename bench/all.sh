#!/usr/bin/env bash
# `pnpm bench`: the search reference problems, then the 200-mark schedule. Figures only.
set -euo pipefail
cd "$(dirname "$0")/.."
node --conditions=@platesmith/source --import tsx bench/run.ts "$@"
node --conditions=@platesmith/source --import tsx bench/schedule.ts "$@"
