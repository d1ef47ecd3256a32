#!/usr/bin/env bash
# Build the demo calc package PDF end to end (installs what it needs first).
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/bootstrap.sh"
cd "$ROOT"
exec "$VENV/bin/splicecalc" demo --out "$ROOT/out" "$@"
