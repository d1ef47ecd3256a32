# Sourced by scripts/demo.sh and scripts/test.sh: make the machine ready, idempotently.
#  1. TeX Live (XeTeX) + pandoc + poppler from Debian packages when missing
#     (installed with apt-get when we are root, otherwise we stop with the exact command);
#  2. a virtual environment in .venv with splicecalc and its test extras installed.
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
VENV="$ROOT/.venv"
PYTHON_BIN="${PYTHON:-python3}"

# Debian packages the PDF build and the PDF tests need.
APT_PACKAGES="texlive-xetex texlive-latex-recommended texlive-latex-extra texlive-fonts-recommended lmodern fonts-dejavu-core pandoc poppler-utils"
# Debian packages only the browser test needs (tests/test_browser.py, skipped without them):
# installed when we are root, otherwise only mentioned.
APT_PACKAGES_BROWSER="chromium"

_missing_system() {
    local missing=0
    command -v xelatex >/dev/null 2>&1 || missing=1
    command -v pandoc >/dev/null 2>&1 || missing=1
    command -v pdftotext >/dev/null 2>&1 || missing=1
    command -v pdftoppm >/dev/null 2>&1 || missing=1
    if command -v kpsewhich >/dev/null 2>&1; then
        for sty in fontspec.sty fancyhdr.sty lastpage.sty xcolor.sty booktabs.sty longtable.sty tabularx.sty hyperref.sty amsmath.sty fancyvrb.sty; do
            [ -n "$(kpsewhich "$sty" 2>/dev/null)" ] || missing=1
        done
    fi
    return $((1 - missing))
}

ensure_system_packages() {
    if _missing_system; then
        if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
            echo "splicecalc: installing TeX Live (XeTeX), pandoc and poppler from Debian packages ..." >&2
            export DEBIAN_FRONTEND=noninteractive
            apt-get update -qq
            # shellcheck disable=SC2086
            apt-get install -y -qq --no-install-recommends $APT_PACKAGES >/dev/null
        else
            echo "splicecalc: TeX Live / pandoc / poppler are missing. Install them with:" >&2
            echo "  sudo apt-get update && sudo apt-get install -y --no-install-recommends $APT_PACKAGES" >&2
            exit 1
        fi
    fi
}

ensure_browser() {
    command -v chromium >/dev/null 2>&1 && return 0
    if [ "$(id -u)" = "0" ] && command -v apt-get >/dev/null 2>&1; then
        echo "splicecalc: installing Chromium (Debian package) for the browser test ..." >&2
        export DEBIAN_FRONTEND=noninteractive
        # shellcheck disable=SC2086
        if ! apt-get install -y -qq --no-install-recommends $APT_PACKAGES_BROWSER >/dev/null 2>&1; then
            apt-get update -qq && apt-get install -y -qq --no-install-recommends $APT_PACKAGES_BROWSER >/dev/null \
                || echo "splicecalc: warning: Chromium could not be installed; the browser test will be skipped" >&2
        fi
    else
        echo "splicecalc: note: no Chromium, so the browser test is skipped (install: sudo apt-get install -y $APT_PACKAGES_BROWSER)" >&2
    fi
}

ensure_venv() {
    if ! "$PYTHON_BIN" -c 'import sys; sys.exit(0 if sys.version_info >= (3, 11) else 1)' 2>/dev/null; then
        echo "splicecalc: Python >= 3.11 is needed (found: $("$PYTHON_BIN" --version 2>&1)). Set PYTHON=/path/to/python3.11" >&2
        exit 1
    fi
    if [ ! -x "$VENV/bin/python" ]; then
        echo "splicecalc: creating the virtual environment in .venv ..." >&2
        "$PYTHON_BIN" -m venv "$VENV"
    fi
    # Reinstall only when pyproject.toml changed since the last install.
    local stamp="$VENV/.splicecalc-installed"
    local want
    want="$(sha256sum "$ROOT/pyproject.toml" | cut -d' ' -f1)"
    if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
        echo "splicecalc: installing splicecalc and its dependencies into .venv ..." >&2
        "$VENV/bin/python" -m pip install -q --disable-pip-version-check -e "$ROOT[test]"
        echo "$want" > "$stamp"
    fi
    # byte-compile our own sources as a regular (non-editable) install does: every calc kernel
    # imports them, and an environment with PYTHONDONTWRITEBYTECODE would otherwise compile them
    # on every build (only changed files are compiled again)
    "$VENV/bin/python" -m compileall -q "$ROOT/splicecalc" \
        || echo "splicecalc: warning: byte-compiling splicecalc/ failed (see above); builds will be slower" >&2
}

ensure_system_packages
ensure_venv
export MPLBACKEND=Agg
