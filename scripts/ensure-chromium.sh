#!/usr/bin/env bash
# The browser test drives Debian's Chromium (package `chromium`, /usr/bin/chromium). Install it with apt-get when it
# is missing and this user may; never a browser download. Without it, the browser test skips with a message
# (outside CI) or fails (in CI).
set -uo pipefail
[ -x /usr/bin/chromium ] && exit 0
command -v apt-get >/dev/null 2>&1 || { echo "reflap tests: /usr/bin/chromium is missing and apt-get is not available; the browser test will skip" >&2; exit 0; }
as_root=""
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then as_root="sudo -n"; else
    echo "reflap tests: /usr/bin/chromium is missing; install Debian's chromium package (apt-get install chromium) to run the browser test" >&2
    exit 0
  fi
fi
echo "reflap tests: installing Debian's chromium package for the browser test" >&2
export DEBIAN_FRONTEND=noninteractive
$as_root apt-get update -qq >/dev/null && $as_root apt-get install -y -qq chromium >/dev/null \
  || echo "reflap tests: could not install chromium; the browser test will skip outside CI" >&2
exit 0
