#!/usr/bin/env bash
# `npm start`: install what is missing, then hand over to the TypeScript orchestrator.
set -euo pipefail
cd "$(dirname "$0")/.."
source scripts/ensure-deps.sh
exec node_modules/.bin/tsx scripts/start.ts "$@"
