#!/usr/bin/env bash
# `pnpm bench`: the search reference problems, then the 200-mark schedule. Figures only.
# The figures are those of the compiled packages (what a deployment runs, without the TypeScript
# loader in the workers): the packages are built first, and the workspace resolves to the build.
set -euo pipefail
cd "$(dirname "$0")/.."
for p in catalogue actions checks search schema schedule; do
  npx tsc -p "packages/$p/tsconfig.build.json"
done
node --import tsx bench/run.ts "$@"
node --import tsx bench/schedule.ts "$@"
