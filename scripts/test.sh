#!/usr/bin/env bash
# Run the whole splicecalc test suite on this machine, installing what it needs first.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/bootstrap.sh"
ensure_browser    # Chromium for tests/test_browser.py (installed when root; the test skips without it)
cd "$ROOT"
exec "$VENV/bin/python" -m pytest "$@"
