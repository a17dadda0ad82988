#!/usr/bin/env bash
# Installs Debian's redis-server for the queue backend's tests (issue 20). Idempotent: does
# nothing when redis-server is present.
set -euo pipefail
if command -v redis-server >/dev/null 2>&1; then
  echo "redis-server present: $(redis-server --version)"
  exit 0
fi
SUDO=""
if [ "$(id -u)" -ne 0 ]; then SUDO="sudo"; fi
export DEBIAN_FRONTEND=noninteractive
$SUDO apt-get update -qq
$SUDO apt-get install -y -qq --no-install-recommends redis-server
redis-server --version
