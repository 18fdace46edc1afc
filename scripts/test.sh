#!/usr/bin/env bash
# `npm test`: install what is missing, then typecheck, unit, integration and end-to-end tests.
set -euo pipefail
cd "$(dirname "$0")/.."
export CHAINPROOF_NEEDS_BROWSER=1
source scripts/ensure-deps.sh
exec node_modules/.bin/tsx scripts/test.ts "$@"
