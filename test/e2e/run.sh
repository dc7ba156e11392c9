#!/usr/bin/env bash
# `npm run test:e2e`: build, package the extension, install what the end-to-end tests need when it
# is missing (test/e2e/install.sh), then run them. Ends with the line "N passed, N failed".
# With VITRINE_VSIX=path/to.vsix set, the build and package steps are skipped and that file is tested.
set -uo pipefail
cd "$(dirname "$0")/../.."

given_up() { echo "$1"; echo "0 passed, 1 failed"; exit "${2:-1}"; }

if [ -z "${VITRINE_VSIX:-}" ]; then
  npm run --silent build || given_up "e2e: the build failed"
  npm run --silent package || given_up "e2e: \`npm run package\` failed (no .vsix to test)"
fi
bash test/e2e/install.sh
status=$?
[ "$status" = 0 ] || given_up "e2e: test/e2e/install.sh exited $status (its message is above)" "$status"
exec npx mocha --exit 'test/e2e/**/*.e2e.ts'
