#!/usr/bin/env bash
# Installs Debian's chromium for the browser test of the HTML report (playwright-core drives it;
# it never downloads a browser of its own). Idempotent: does nothing when chromium is present.
set -euo pipefail
if [ -x /usr/bin/chromium ]; then
  echo "chromium present: $(/usr/bin/chromium --version 2>/dev/null || echo unknown version)"
  exit 0
fi
SUDO=""
if [ "$(id -u)" -ne 0 ]; then SUDO="sudo"; fi
export DEBIAN_FRONTEND=noninteractive
$SUDO apt-get update -qq
$SUDO apt-get install -y -qq --no-install-recommends chromium
/usr/bin/chromium --version
