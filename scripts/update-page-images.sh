#!/usr/bin/env bash
# Rewrites the reference images of the report pages (test/browser/page-images/*.png) from the current pages.
# Run it only after a deliberate layout change, and look at the new images before committing them.
set -euo pipefail
cd "$(dirname "$0")/.."
npm run build --silent
REFLAP_UPDATE_PAGE_IMAGES=1 npx vitest run test/browser/report-pages.test.ts -t 'laid out as its reference image'
