#!/usr/bin/env bash
# The browser test drives Debian's Chromium (package `chromium`, /usr/bin/chromium): installed with apt-get when
# it is missing and this user may; never a browser download.
exec bash "$(dirname "$0")/ensure-debian-package.sh" chromium /usr/bin/chromium "the browser test"
