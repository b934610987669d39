#!/usr/bin/env bash
# The browser tests drive Debian's Chromium (Playwright's own browser download is not used).
# Install it when missing and we are root on a Debian-like machine; otherwise say how.
set -euo pipefail
CHROMIUM="${CHROMIUM_PATH:-/usr/bin/chromium}"
if [ -x "$CHROMIUM" ]; then exit 0; fi
if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null; then
  echo "==> Installing Chromium from the distribution's packages"
  apt-get update -qq
  DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium >/dev/null
  exit 0
fi
echo "Chromium was not found at $CHROMIUM. Install it (Debian/Ubuntu: sudo apt-get install chromium) or set CHROMIUM_PATH." >&2
exit 1
