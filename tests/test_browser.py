"""The job form in a real browser: JupyterLab on 127.0.0.1, Debian's Chromium driven by Playwright.

What a person does with a calc package open in JupyterLab, step by step, with a
screenshot of each step kept as a test artefact (the folder is printed; set
``SPLICECALC_ARTEFACTS`` to keep them somewhere of your choosing):

1. the package is built from the command line while the notebook is open: the
   notebook is not rewritten (saving it raises no "file changed" dialog) and the
   form says the printed PDF (``beam_splice.pdf``) matches the job file;
2. every tab of the form is shown (every load's boxes visible, the measured
   existing member shown, the summary covering the whole job);
3. bad input: a banner naming the field, Save writes nothing;
4. save: the job file keeps its comments, only the edited value changes;
5. reload after another program changed the file;
6. export from JupyterLab's menu (label ``Calc_package_PDF``): refused while the
   notebook's results are older than the saved job file, printed after a re-run,
   without the form's own text.

The references are the job loader (what the file holds), pdftotext (what the PDF
says) and the screenshots. Marked ``browser``; skipped where Chromium or
Playwright is missing. No browser is downloaded: Playwright drives /usr/bin/chromium.
"""

from __future__ import annotations

import contextlib
import os
import re
import shutil
import socket
import subprocess
import sys
import time
import urllib.request
from pathlib import Path

import pytest

pytestmark = [pytest.mark.browser, pytest.mark.pdf]

ROOT = Path(__file__).resolve().parents[1]
TOKEN = "splicecalc-browser-test"
CHROMIUM_FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
                  "--disable-background-networking", "--disable-component-update", "--disable-sync"]
LONG = 240_000      # ms: a kernel start and a whole calc on a shared 2-core machine


def _chromium() -> str:
    for c in (os.environ.get("SPLICECALC_CHROMIUM", ""), "/usr/bin/chromium", shutil.which("chromium") or "",
              shutil.which("chromium-browser") or ""):
        if c and Path(c).is_file():
            return c
    pytest.skip("no Chromium installed (scripts/bootstrap.sh installs Debian's chromium when root)")


def _free_port() -> int:
    with socket.socket() as s:
        s.bind(("127.0.0.1", 0))
        return s.getsockname()[1]


#: the plant-room example with the end B column measured on site (a measured existing member)
MEASURED = 'existing_member = { h = "254.1 mm", b = "254.6 mm", tw = "8.6 mm", tf = "14.2 mm", r = "12.7 mm" }  # measured on site'


def _job_text() -> str:
    text = (ROOT / "examples" / "plant_room_trimmer.toml").read_text(encoding="utf-8")
    # slip-resistant splice bolts (a bearing-type splice's slip fails the deflection checks, and a
    # build with a failing check exits 1)
    text = text.replace('category = "A"', 'category = "B"\nfriction_class = "B"')
    i = text.rfind('existing_member = "254x254x73 UKC"')
    return text[:i] + MEASURED + text[i + len('existing_member = "254x254x73 UKC"'):]


@pytest.fixture(scope="module")
def artefacts(tmp_path_factory) -> Path:
    d = Path(os.environ["SPLICECALC_ARTEFACTS"]) if os.environ.get("SPLICECALC_ARTEFACTS") else \
        tmp_path_factory.mktemp("browser-artefacts")
    d.mkdir(parents=True, exist_ok=True)
    print(f"\nbrowser test screenshots: {d}")
    return d


def make_package(root: Path) -> Path:
    """A fresh beam_splice package in ``root/pkg`` (the plant-room example, end B measured)."""
    from splicecalc.workflow.package import new_package
    job = root / "source.toml"
    job.write_text(_job_text(), encoding="utf-8")
    new_package("beam_splice", root / "pkg", job=job)
    job.unlink()
    return root / "pkg"


@contextlib.contextmanager
def serve_lab(root: Path):
    """JupyterLab on 127.0.0.1 serving ``root``; yields its base URL (token :data:`TOKEN`)."""
    # every cell stays in the page (no virtual scrolling of off-screen cells); no news pop-up
    settings = root / ".settings"
    for rel, text in (("@jupyterlab/notebook-extension/tracker.jupyterlab-settings", '{"windowingMode": "none"}'),
                      ("@jupyterlab/apputils-extension/notification.jupyterlab-settings",
                       '{"fetchNews": "false", "checkForUpdates": false}')):
        (settings / rel).parent.mkdir(parents=True, exist_ok=True)
        (settings / rel).write_text(text, encoding="utf-8")
    port = _free_port()
    env = {**os.environ, "JUPYTER_CONFIG_DIR": str(root / ".cfg"), "JUPYTER_RUNTIME_DIR": str(root / ".rt"),
           "MPLBACKEND": "Agg"}
    env.pop("SPLICECALC_HEADLESS", None)
    log = open(root / ".server.log", "w")
    server = subprocess.Popen(
        [sys.executable, "-m", "jupyter", "lab", "--no-browser", "--ServerApp.ip=127.0.0.1",
         f"--ServerApp.port={port}", "--ServerApp.port_retries=0", f"--IdentityProvider.token={TOKEN}",
         f"--ServerApp.root_dir={root}", "--LabApp.expose_app_in_browser=True",
         f"--LabApp.user_settings_dir={settings}", f"--LabApp.workspaces_dir={root / '.ws'}",
         "--LabApp.news_url=", "--LabApp.check_for_updates_class=jupyterlab.NeverCheckForUpdate",
         "--LabApp.extension_manager=readonly", *(["--allow-root"] if os.geteuid() == 0 else [])],
        cwd=root, env=env, stdout=log, stderr=subprocess.STDOUT)
    base = f"http://127.0.0.1:{port}"
    try:
        deadline = time.monotonic() + 180
        while True:
            try:
                with urllib.request.urlopen(f"{base}/api/status?token={TOKEN}", timeout=5) as r:
                    if r.status == 200:
                        break
            except OSError:
                pass
            if server.poll() is not None or time.monotonic() > deadline:
                log.flush()
                raise RuntimeError("JupyterLab did not start:\n" + (root / ".server.log").read_text()[-3000:])
            time.sleep(0.5)
        yield base
    finally:
        server.terminate()
        try:
            server.wait(timeout=30)
        except subprocess.TimeoutExpired:
            server.kill()
        log.close()


@contextlib.contextmanager
def chromium_page(chromium: str, profile: Path):
    """A Playwright page in Debian's Chromium (headless, a fresh user-data-dir ``profile``)."""
    from playwright.sync_api import sync_playwright
    with sync_playwright() as p:
        ctx = p.chromium.launch_persistent_context(
            str(profile), executable_path=chromium, headless=True, args=CHROMIUM_FLAGS,
            viewport={"width": 1400, "height": 1400}, accept_downloads=True)
        ctx.set_default_timeout(60_000)
        try:
            yield ctx.pages[0] if ctx.pages else ctx.new_page()
        finally:
            ctx.close()


@pytest.fixture(scope="module")
def lab(tmp_path_factory):
    """(base URL, root folder, chromium) of a JupyterLab serving a fresh beam_splice package in ``root/pkg``."""
    chromium = _chromium()
    pytest.importorskip("playwright.sync_api")
    pytest.importorskip("jupyterlab")
    for tool in ("xelatex", "pandoc", "pdftotext"):
        if shutil.which(tool) is None:
            pytest.skip(f"{tool} is not installed")
    root = tmp_path_factory.mktemp("lab")
    make_package(root)
    with serve_lab(root) as base:
        yield base, root, chromium


@pytest.fixture(scope="module")
def page(lab, tmp_path_factory):
    with chromium_page(lab[2], tmp_path_factory.mktemp("chromium-profile")) as pg:
        yield pg


class Shots:
    def __init__(self, folder: Path, page) -> None:
        self.folder, self.page, self.n = folder, page, 0

    def __call__(self, name: str, locator=None) -> Path:
        self.n += 1
        path = self.folder / f"{self.n:02d}-{name}.png"
        (locator or self.page).screenshot(path=str(path))
        return path


def _form(page):
    return page.locator(".widget-vbox", has=page.locator("button", has_text="Save job file")).first


def _text_box(form, label: str):
    return form.locator(".widget-text", has=form.page.locator("label", has_text=re.compile("^" + re.escape(label) + "$"))).locator("input")


def _tab(form, title: str) -> None:
    form.locator(".lm-TabBar-tab", has_text=re.compile("^" + re.escape(title) + "$")).click()


def _banner_has(page, text: str, timeout: float = 60_000) -> None:
    try:
        page.wait_for_function("t => [...document.querySelectorAll('.widget-html')].some(e => e.innerText.includes(t))",
                               arg=text, timeout=timeout)
    except Exception as err:  # noqa: BLE001 - say what the form showed instead
        shown = page.evaluate("() => [...document.querySelectorAll('.widget-html')].map(e => e.innerText).join('\\n')")
        page.screenshot(path=os.environ.get("SPLICECALC_FAILSHOT", "/tmp/splicecalc-browser-failure.png"))
        pytest.fail(f"the form never showed {text!r} ({type(err).__name__}); it shows:\n{shown[:3000]}")


_PROMPTS = "() => [...document.querySelectorAll('.jp-CodeCell .jp-InputArea-prompt')].map(e => e.innerText.trim())"


def _run_all(page) -> None:
    """Run > Run All Cells, wait until every code cell ran again, then save the notebook."""
    before = max([int(n) for p in page.evaluate(_PROMPTS) for n in re.findall(r"\d+", p)] or [0])
    page.evaluate("() => window.jupyterapp.commands.execute('notebook:run-all-cells')")
    page.wait_for_function(
        "n => { const ps = [...document.querySelectorAll('.jp-CodeCell .jp-InputArea-prompt')]"
        ".map(e => e.innerText.trim()); return ps.length > 0 && ps.every(p => { const m = p.match(/\\[(\\d+)\\]/);"
        " return m && Number(m[1]) > n; }); }", arg=before, timeout=LONG)
    page.evaluate("() => window.jupyterapp.commands.execute('docmanager:save')")
    page.wait_for_function("() => !window.jupyterapp.shell.currentWidget.context.model.dirty", timeout=60_000)


def _export(page, shot=None):
    """Click File > Save and Export Notebook As > Calc_package_PDF: (download or None, error page text, popup)."""
    ctx = page.context
    got: dict = {}

    def watch(p) -> None:      # registered before the click: a download can start as the popup opens
        p.on("download", keep)

    def keep(d) -> None:
        got.setdefault("d", d)

    ctx.on("page", watch)
    page.on("download", keep)        # Chromium credits the opener with a popup's download
    try:
        page.locator(".lm-MenuBar-itemLabel", has_text="File").click()
        page.locator(".lm-Menu-itemLabel", has_text="Save and Export Notebook As").hover()
        item = page.locator(".lm-Menu-itemLabel", has_text=re.compile("^Calc_package_PDF$"))
        item.wait_for()
        item.hover()
        if shot is not None:
            shot("export-menu")
        with ctx.expect_page(timeout=LONG) as popup_info:
            item.click()
        popup = popup_info.value
        deadline = time.monotonic() + LONG / 1000
        while "d" not in got and time.monotonic() < deadline:
            body = ""
            if not popup.is_closed():
                try:
                    body = popup.evaluate("() => document.body ? document.body.innerText : ''")
                except Exception:  # noqa: BLE001 - navigating, or turned into a download
                    body = ""
            if "Error" in body or "error" in body:
                return None, body, popup
            time.sleep(0.5)
        return got.get("d"), "", popup
    finally:
        ctx.remove_listener("page", watch)
        page.remove_listener("download", keep)


def test_job_form_in_jupyterlab(lab, page, artefacts):
    base, root, _ = lab
    pkg = root / "pkg"
    job = pkg / "job.toml"
    nb_file = pkg / "beam_splice.ipynb"
    shot = Shots(artefacts, page)

    page.goto(f"{base}/lab/tree/pkg/beam_splice.ipynb?token={TOKEN}")
    page.wait_for_selector(".jp-Notebook", timeout=LONG)
    page.wait_for_function("() => window.jupyterapp && window.jupyterapp.shell.currentWidget && "
                           "window.jupyterapp.shell.currentWidget.sessionContext.session", timeout=LONG)

    # 1. built from the command line while open: the open notebook is not rewritten
    before = nb_file.read_bytes()
    r = subprocess.run([sys.executable, "-m", "splicecalc.cli.main", "build", "pkg/beam_splice.ipynb", "--quiet"],
                       cwd=root, capture_output=True, text=True, timeout=900)
    assert r.returncode in (0, 3), r.stderr[-3000:]        # 3: built, with NOT CHECKED items (as `run`)
    assert nb_file.read_bytes() == before and (pkg / "beam_splice.pdf").is_file()

    _run_all(page)
    form = _form(page)
    form.wait_for(timeout=LONG)
    form.scroll_into_view_if_needed()
    _banner_has(page, "beam_splice.pdf was printed from the current job file")
    shot("opened", form)
    page.keyboard.press("Control+s")                 # saving the notebook: no "file changed" dialog
    page.wait_for_timeout(1500)
    assert page.locator(".jp-Dialog").count() == 0

    # 2. every tab
    for title in ("Project", "Beam", "Loads", "Splices", "Supports"):
        _tab(form, title)
        page.wait_for_timeout(300)
        shot(f"tab-{title.lower()}", form)
        if title == "Project":
            assert _text_box(form, "Job number").input_value() == "P-0242"
        if title == "Beam":
            assert _text_box(form, "Span").input_value() == "6.6 m"
        if title == "Loads":
            rows = form.locator(".widget-hbox", has=page.locator("button", has_text="remove"))
            assert rows.count() == 3
            for i, kind in enumerate(("udl", "udl", "point")):
                boxes = rows.nth(i).locator("input[type=text]")
                values = [boxes.nth(k) for k in range(boxes.count())]
                visible = [b.input_value() for b in values if b.is_visible()]
                assert visible, f"load row {i + 1}: no box visible"
                assert any(v.endswith("kN/m") or v.endswith("kN") for v in visible), visible
                if kind == "point":
                    assert "4.4 m" in visible
        if title == "Supports":
            members = _text_box(form, "Existing member")
            shown = [members.nth(k).input_value() for k in range(members.count())]
            assert shown[0] == "254x254x73 UKC" and shown[1].startswith("measured: h = 254.1 mm")
    summary = form.locator(".widget-html", has_text="Utilisation summary")
    text = summary.inner_text()
    for part in ("Beam", "Splice S1", "End connection A", "End connection B", "Existing member at end B"):
        assert part in text, part
    shot("summary", summary)

    # 3. bad input: the field is named, nothing is written
    _tab(form, "Beam")
    disk = job.read_bytes()
    span = _text_box(form, "Span")
    span.fill("6.9")
    _banner_has(page, "beam.span")
    shot("bad-input", form)
    form.locator("button", has_text="Save job file").click()
    _banner_has(page, "Not saved")
    assert job.read_bytes() == disk

    # 4. save: comments and layout kept, only the value changed
    span.fill("6.9 m")
    _banner_has(page, "unsaved edits")
    form.locator("button", has_text="Save job file").click()
    _banner_has(page, "Saved job.toml")
    _banner_has(page, "beam_splice.pdf was printed from other inputs")
    shot("saved", form)
    assert job.read_text(encoding="utf-8") == disk.decode("utf-8").replace('span = "6.6 m"', 'span = "6.9 m"')

    # 5. reload after another program changed the file
    job.write_text(job.read_text(encoding="utf-8").replace("level 3", "level 3 (rev)"), encoding="utf-8")
    form.locator("button", has_text="Check files").click()
    _banner_has(page, "changed by another program")
    form.locator("button", has_text="Reload from file").click()
    _tab(form, "Project")
    page.wait_for_function("() => [...document.querySelectorAll('.widget-text input')].some(e => e.value.endsWith('(rev)'))")
    shot("reloaded", form)

    # 6. export: refused while the results are older than the job file, printed after a re-run
    download, body, popup = _export(page, shot)
    assert download is None and "Run all cells again" in body, body[:500]
    popup.screenshot(path=str(artefacts / "refused-export.png"))
    popup.close()
    _run_all(page)
    shot("rerun")
    download, body, popup = _export(page)
    assert download is not None, body[:1000]
    pdf = artefacts / "exported.pdf"
    download.save_as(str(pdf))
    text = subprocess.run(["pdftotext", "-layout", str(pdf), "-"], capture_output=True, text=True, check=True).stdout
    assert "Job form for" not in text and "interactive" not in text
    assert "level 3 (rev)" in text and "6.9" in text
    subprocess.run(["pdftoppm", "-png", "-r", "50", "-f", "1", "-l", "3", str(pdf), str(artefacts / "exported")],
                   check=True)
