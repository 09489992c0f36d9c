#!/usr/bin/env bash
# Usage: ensure-debian-package.sh PACKAGE BINARY TEST
# Installs Debian's PACKAGE with apt-get when BINARY is missing and this user may (root, or sudo without a
# password); never a download from anywhere else. Without it, TEST skips with a message (outside CI) or fails
# (in CI): this script only says so and always exits 0.
set -uo pipefail
package="$1" binary="$2" test_name="$3"
[ -x "$binary" ] && exit 0
command -v apt-get >/dev/null 2>&1 || { echo "reflap tests: $binary is missing and apt-get is not available; $test_name will skip" >&2; exit 0; }
as_root=""
if [ "$(id -u)" -ne 0 ]; then
  if command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then as_root="sudo -n"; else
    echo "reflap tests: $binary is missing; install Debian's $package package (apt-get install $package) to run $test_name" >&2
    exit 0
  fi
fi
echo "reflap tests: installing Debian's $package package for $test_name" >&2
export DEBIAN_FRONTEND=noninteractive
$as_root apt-get update -qq >/dev/null && $as_root apt-get install -y -qq "$package" >/dev/null \
  || echo "reflap tests: could not install $package; $test_name will skip outside CI" >&2
exit 0
