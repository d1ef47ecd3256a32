#!/usr/bin/env bash
# Build the demo calc package PDF end to end (installs what it needs first).
# `splicecalc demo` exits like `build`: 0 every check passes, 1 a check fails, 2 bad input,
# 3 nothing fails but some checks are NOT CHECKED. The demo job has NOT CHECKED items on purpose
# (they show how the package reports them), so 3 is the demo's normal outcome and this script
# reports it and exits 0; every other code is passed on.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/bootstrap.sh"
cd "$ROOT"
rc=0
"$VENV/bin/splicecalc" demo --out "$ROOT/out" "$@" || rc=$?
if [ "$rc" -eq 3 ]; then
    echo "demo built: no check fails; the NOT CHECKED items listed above are printed first in the package's summary" >&2
    exit 0
fi
exit "$rc"
