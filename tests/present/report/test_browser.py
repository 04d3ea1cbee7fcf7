"""The example report in a real browser: headless Chromium loads it from the file system without a
console message, takes a screenshot and prints it to a paged PDF with "page N of M" footers.

Needs Debian's ``chromium`` package (``.ci/run`` installs it); skipped, saying so, where no
Chromium binary is on PATH.
"""

from __future__ import annotations

import html as htmllib
import re
import shutil
import subprocess
from pathlib import Path

import pytest

from helpers import EXAMPLE, run_cli

BROWSER = next((b for b in (shutil.which("chromium"), shutil.which("chromium-browser")) if b), None)
pytestmark = pytest.mark.skipif(BROWSER is None, reason="no Chromium browser on PATH (Debian: apt-get install chromium)")

TIMEOUT_S = 60
# Any message the page sends to the console: the report has no script, so a message means a blocked
# load, a policy violation or a parse problem.
CONSOLE = re.compile(r":CONSOLE[:(]")


def chromium(profile: Path, *args: str) -> subprocess.CompletedProcess:
    flags = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
             "--disable-background-networking", "--disable-component-update", "--disable-sync",
             "--disable-extensions", "--hide-scrollbars", f"--user-data-dir={profile}",
             "--enable-logging=stderr", "--v=0"]
    return subprocess.run([BROWSER, *flags, *args], capture_output=True, text=True, timeout=TIMEOUT_S, check=False)


def console_messages(stderr: str) -> list[str]:
    return [line for line in stderr.splitlines() if CONSOLE.search(line)]


@pytest.fixture(scope="module")
def rendered(tmp_path_factory):
    out = tmp_path_factory.mktemp("browser")
    assert run_cli("report", EXAMPLE, "-o", out / "report")[0] == 0
    return out


def test_console_scan_catches_a_broken_page(tmp_path):
    """The scan below can fail: a page with a blocked image and a script does log to the console."""
    page = tmp_path / "probe.html"
    page.write_text("<!DOCTYPE html><html><head><meta http-equiv=\"Content-Security-Policy\" "
                    "content=\"default-src 'none'\"></head><body><img src=\"missing.png\" alt=\"\">"
                    "<script>console.error('probe')</script></body></html>")
    done = chromium(tmp_path / "profile", f"--screenshot={tmp_path / 'p.png'}", "--window-size=400,300",
                    page.as_uri())
    assert len(console_messages(done.stderr)) >= 1


def test_report_loads_cleanly_and_looks_like_a_document(rendered):
    from PIL import Image

    shot = rendered / "screen.png"
    done = chromium(rendered / "profile-shot", f"--screenshot={shot}", "--window-size=1100,1600",
                    (rendered / "report" / "index.html").as_uri())
    assert done.returncode == 0, done.stderr[-2000:]
    assert console_messages(done.stderr) == []
    image = Image.open(shot).convert("L")
    assert image.size == (1100, 1600)
    # not a blank or error page: the title block's dark ink and the white paper are both there
    histogram = image.histogram()
    dark, light = sum(histogram[:80]), sum(histogram[230:])
    assert dark > 2000 and light > 0.5 * 1100 * 1600


def test_report_prints_to_a_paged_pdf_with_footers(rendered):
    pypdf = pytest.importorskip("pypdf")
    pdf = rendered / "print.pdf"
    done = chromium(rendered / "profile-pdf", f"--print-to-pdf={pdf}", "--no-pdf-header-footer",
                    (rendered / "report" / "index.html").as_uri())
    assert done.returncode == 0 and pdf.is_file(), done.stderr[-2000:]
    assert console_messages(done.stderr) == []
    pages = pypdf.PdfReader(pdf).pages
    # A document an engineer reads and signs: the demo (six drives, two supplies, seven modes, 116
    # checks) fits in at most 20 A4 pages, and is more than a summary page.
    assert 10 <= len(pages) <= 20
    assert abs(float(pages[0].mediabox.width) - 595.3) < 2  # the example's page size is A4 (210 mm)
    for k in (0, len(pages) // 2, len(pages) - 1):
        text = pages[k].extract_text()
        assert f"page {k + 1} of {len(pages)}" in text
        assert "RH-4" in text and "file SHA-256" in text


def _headings(page: str) -> set[str]:
    """The text of every heading, visible caption and table head of the page, as pypdf reads a line."""
    def flat(html: str) -> str:
        return " ".join(htmllib.unescape(re.sub(r"<[^>]+>", " ", html)).split())

    out = {flat(h) for h in re.findall(r"<h[1-6][^>]*>(.*?)</h[1-6]>", page, re.S)}
    out |= {flat(c) for c in re.findall(r"<caption>(.*?)</caption>", page, re.S)}
    for head in re.findall(r"<thead>(.*?)</thead>", page, re.S):
        out.add(flat(head))
    return {h for h in out if h}


def test_printed_demo_is_at_most_20_pages_and_no_page_ends_on_a_heading(rendered):
    """Print rules: a heading, caption or table head goes over with what it names; the sign-off
    never stands alone on the last page."""
    pypdf = pytest.importorskip("pypdf")
    pdf = rendered / "rules.pdf"
    done = chromium(rendered / "profile-rules", f"--print-to-pdf={pdf}", "--no-pdf-header-footer",
                    (rendered / "report" / "index.html").as_uri())
    assert done.returncode == 0 and pdf.is_file(), done.stderr[-2000:]
    page = (rendered / "report" / "index.html").read_text(encoding="utf-8")
    heads = _headings(page)
    assert "Checklist" in heads and "Quantity Relation Unit harvest transit climb" in heads  # the scan can hit
    pages = pypdf.PdfReader(pdf).pages
    assert len(pages) <= 20
    texts = [p.extract_text() for p in pages]
    for k, text in enumerate(texts[:-1], start=1):
        last = " ".join(text.strip().splitlines()[-1].split())
        assert last not in heads, f"page {k} ends on the heading {last!r}"
    last_page = texts[-1]
    assert "Sign-off" in last_page and "Manual review items" in last_page  # signatures under the items
    assert "Fluid under pressure" in texts[0] + texts[1]  # the cautions on page 1 or 2
