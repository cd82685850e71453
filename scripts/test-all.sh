#!/usr/bin/env bash
# Every check of the project: types, lint, unit/property tests (vitest), end-to-end tests (Playwright).
# Ends with one line "N passed, N failed" and a non-zero exit on any failure.
set -u
cd "$(dirname "$0")/.."
mkdir -p reports
fail=0
echo "== typecheck (the app, and the core without the DOM library)"; npm run -s typecheck || fail=1
echo "== lint"; npx eslint --max-warnings 0 --no-error-on-unmatched-pattern src tests e2e || fail=1
echo "== unit and property tests"
npx vitest run --reporter=default --reporter=json --outputFile=reports/vitest.json || fail=1
echo "== end-to-end tests"
PW_JSON=reports/playwright.json npx playwright test || fail=1
node scripts/summarize.mjs reports/vitest.json reports/playwright.json "$fail"
