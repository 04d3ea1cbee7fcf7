"""The review report: content from the Results, escaping, sanitising, determinism, atomic writing, CLI."""

from __future__ import annotations

import hashlib
import html as htmllib
import os
import re
import sys
from html.parser import HTMLParser
from pathlib import Path

import markupsafe
import pytest

from revisions import commit, make_repo
from helpers import EXAMPLE, example_data, minimal, run_cli, write_spec
from specgen.cautions import CAUTIONS
from specgen.fingerprint import Fingerprint, fingerprint
from specgen.pipeline import run_file
from specgen.present import charts, report
from specgen.present.values import assumed_inputs
from specgen.units import format_si

FIXED = Fingerprint("0" * 64)


def esc(text: str) -> str:
    """Text as the templates write it (Jinja2 autoescape via markupsafe)."""
    return str(markupsafe.escape(text))


@pytest.fixture(scope="module")
def example():
    o = run_file(EXAMPLE)
    return o, report.render(o, fp=FIXED)


def block(page: str, anchor: str) -> str:
    """The HTML of the trace block, section or table row with id ``anchor``."""
    m = re.search(rf'<(div|section|tr)\b[^>]*\bid="{re.escape(anchor)}"', page)
    assert m, f"no element with id {anchor}"
    tag = m.group(1)
    end = page.index(f"</{tag}>", m.end()) if tag != "section" else page.index("</section>", m.end())
    if tag == "div":  # trace blocks hold a table, then close
        end = page.index("</table>", m.end())
    return page[m.start():end]


def test_every_duty_and_supply_value_is_shown_in_its_trace(example):
    o, page = example
    system = o.machine.display_units
    for r in o.results.duties:
        text = block(page, f"duty-{r.drive}-{r.duty}")
        for v in r.values.values():
            if v.kind != "ratio":
                assert format_si(v.value, v.kind, system) in text, (r.drive, r.duty, v.key)
    for r in o.results.supply_modes:
        text = block(page, f"mode-{r.supply}-{r.mode}")
        for v in r.values.values():
            assert format_si(v.value, v.kind, system) in text, (r.supply, r.mode, v.key)


def test_hand_checked_numbers_appear(tmp_path):
    o = run_file(write_spec(tmp_path, minimal()))
    page = report.render(o, fp=FIXED)
    lift = block(page, "duty-hoist-lift")
    # dp = 2*pi*T/(Vg*eta_hm) = 2*pi*286.5/(100e-6*0.9) = 200.0 bar; p_in = dp + 5 bar = 205.0 bar
    # q = Vg*n/eta_v = 100 cm^3 * 500 rpm / 0.95 = 52.63 L/min (motor relations, fluid-power textbook;
    # hand calculation)
    for text in ("200.0 bar", "205.0 bar", "52.63 L/min"):
        assert text in lift, text
    assert format_si(o.results.duty("hoist", "lift")["inlet_pressure"], "pressure", "SI") == "205.0 bar"
    # q_p = Vp*n*eta_v = 40 cm^3 * 1500 rpm * 0.95 = 57.00 L/min (pump delivery relation; hand calculation)
    assert "57.00 L/min" in block(page, "mode-main-work")
    # the substitution shows the values used, with units, in place of the symbols
    assert "dp = 2*pi*(286.5 N*m) / ((100.0 cm^3/rev) * 0.9000)" in htmllib.unescape(lift)


def test_spec_values_are_shown_as_entered_and_as_used(example):
    o, page = example
    drive = block(page, "drive-track_left")
    data = example_data()["drives"]["track_left"]
    for raw in (data["motor"]["displacement"], data["motor"]["rating"]["peak_pressure"],
                data["motor"]["rating"]["max_speed"], data["case_pressure"]):
        assert f">{raw}<" in drive, raw
    d = o.machine.drive("track_left")
    assert f">{format_si(d.motor.displacement_max, 'displacement', 'SI')}<" in drive
    assert f">{format_si(d.motor.rating.peak_pressure, 'pressure', 'SI')}<" in drive
    supply = block(page, "supply-aux")
    assert ">90 %<" in supply and ">90.00 %<" in supply  # written as a percentage, used as 0.90


def test_every_check_is_in_the_checklist_with_anchor_and_where(example):
    o, page = example
    assert len(o.results.checks) > 50
    for n, c in enumerate(o.results.checks, start=1):
        row = block(page, f"check-{n}")
        assert c.id in row and esc(c.where) in row and esc(c.message) in row
        assert {"pass": "PASS", "warn": "WARN", "fail": "FAIL"}[c.status] in row


def test_summary_lists_warnings_and_failures_first_with_links(example):
    o, page = example
    summary = page[page.index('id="summary"'):page.index('id="cautions"')]
    bad = [n for n, c in enumerate(o.results.checks, start=1) if c.status != "pass"]
    assert bad and o.results.verdict == "warn"
    for n in bad:
        assert f'href="#check-{n}"' in summary
    assert "Overall: WARN" in summary
    c = o.results.counts()
    assert f'<td class="num">{c["pass"]}</td>' in summary


def test_cautions_and_design_aid_always_present(example, tmp_path):
    _, page = example
    for title, text in CAUTIONS:
        assert esc(title) in page and esc(text) in page
    assert "design aid" in page
    failing = minimal()
    failing["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"
    failed = report.render(run_file(write_spec(tmp_path, failing)), fp=FIXED)
    assert "Overall: FAIL" in failed
    for title, text in CAUTIONS:
        assert esc(text) in failed


def test_assumed_values_are_marked(example):
    o, page = example
    listed = assumed_inputs(o.machine)
    assert listed
    section = block(page, "assumed")
    for a in listed:
        assert a["where"] in section
    # the bale winch motor efficiencies are defaults: its traces say so beside the values
    hoist = block(page, "duty-bale_winch-hoist")
    assert hoist.count('class="assumed"') >= 3
    # a duty point whose motor data is all given carries no mark
    assert 'class="assumed"' not in block(page, "duty-track_left-climb")


HOSTILE = "<script>alert(1)</script>"


def test_titles_with_script_are_escaped_everywhere(tmp_path):
    d = minimal()
    d["machine"]["title"] = f"Rig {HOSTILE} \"quoted\" </style>"
    d["drives"]["hoist"]["title"] = f"Hoist {HOSTILE}"
    d["supplies"]["main"]["title"] = f"Pump {HOSTILE}"
    d["machine"]["signoff"] = {"prepared_by": HOSTILE}
    page = report.render(run_file(write_spec(tmp_path, d)), fp=FIXED)
    assert "<script" not in page.lower()
    assert "&lt;script&gt;alert(1)&lt;/script&gt;" in page
    # only the page's own stylesheet and each chart's own style element end a style; the title's is text
    assert page.lower().count("</style") == 1 + page.count("<svg") and "&lt;/style&gt;" in page
    # the page footer string in the print stylesheet is hex-escaped CSS, not the raw text
    footer = re.search(r"@bottom-left \{ content: (\"[^\"]*\")", page).group(1)
    assert "<" not in footer and "\\3c " in footer


def test_markdown_description_is_rendered_and_sanitised(tmp_path):
    d = minimal()
    d["machine"]["description"] = (
        "# Overview\n\nA **bold** claim and a [safe link](https://example.org/x).\n\n"
        "<script>alert(1)</script> <img src=x onerror=alert(2)> [bad](javascript:alert(3))\n\n"
        '<a href="javascript:alert(4)" onclick="alert(5)">raw</a> <iframe src="https://example.org"></iframe>\n'
        '<div style="position:fixed">styled</div>\n')
    page = report.render(run_file(write_spec(tmp_path, d)), fp=FIXED)
    desc = page[page.index('id="description"'):page.index('id="margins"')]
    assert "<strong>bold</strong>" in desc and 'href="https://example.org/x"' in desc
    assert "<h3>Overview</h3>" in desc  # its h1 sits under the report's h2
    for bad in ("<script", "javascript:", "onerror", "onclick", "<img", "<iframe", "style=", "<div"):
        assert bad not in desc.lower(), bad


def test_two_runs_give_identical_bytes(tmp_path):
    a, b = tmp_path / "a", tmp_path / "b"
    assert run_cli("report", EXAMPLE, "-o", a)[0] == 0
    assert run_cli("report", EXAMPLE, "-o", b)[0] == 0
    assert (a / "index.html").read_bytes() == (b / "index.html").read_bytes()


def test_no_date_unless_asked(tmp_path, monkeypatch):
    monkeypatch.delenv("SOURCE_DATE_EPOCH", raising=False)
    spec = write_spec(tmp_path, minimal())
    assert run_cli("report", spec, "-o", tmp_path / "plain")[0] == 0
    plain = (tmp_path / "plain" / "index.html").read_text()
    assert re.search(r"Report date</th><td[^>]*><span class=\"absent\">not stated", plain)
    assert not re.search(r"\b20\d\d-\d\d-\d\d\b", plain)
    assert run_cli("report", spec, "-o", tmp_path / "dated", "--date", "2024-03-05")[0] == 0
    assert "<td colspan=\"3\">2024-03-05</td>" in (tmp_path / "dated" / "index.html").read_text()
    monkeypatch.setenv("SOURCE_DATE_EPOCH", "1700000000")  # 2023-11-14T22:13:20Z
    assert run_cli("report", spec, "-o", tmp_path / "epoch")[0] == 0
    assert "<td colspan=\"3\">2023-11-14</td>" in (tmp_path / "epoch" / "index.html").read_text()
    # --date wins over SOURCE_DATE_EPOCH
    assert run_cli("report", spec, "-o", tmp_path / "both", "--date", "2025-01-31")[0] == 0
    assert "2025-01-31" in (tmp_path / "both" / "index.html").read_text()


@pytest.mark.parametrize("option, env", [("2024-13-01", None), ("05/03/2024", None), (None, "yesterday")])
def test_bad_dates_exit_2_with_one_line(tmp_path, monkeypatch, option, env):
    monkeypatch.delenv("SOURCE_DATE_EPOCH", raising=False)
    if env:
        monkeypatch.setenv("SOURCE_DATE_EPOCH", env)
    args = ["report", write_spec(tmp_path, minimal()), "-o", tmp_path / "out"] + (["--date", option] if option else [])
    code, out, err = run_cli(*args)
    assert code == 2 and len(err.strip().splitlines()) == 1 and "Traceback" not in err
    assert not (tmp_path / "out").exists()


def test_failed_render_leaves_the_earlier_report_untouched(tmp_path, monkeypatch):
    out = tmp_path / "rep"
    spec = write_spec(tmp_path, minimal())
    assert run_cli("report", spec, "-o", out)[0] == 0
    before = (out / "index.html").read_bytes()
    (out / "notes.txt").write_text("mine")  # a file of the user's in OUTDIR stays

    calls = []

    def broken(*args, **kwargs):
        calls.append(1)
        raise RuntimeError("chart failed mid-render")

    monkeypatch.setattr(charts, "speed_vs_flow", broken)
    d = minimal()
    d["machine"]["revision"] = "B"
    write_spec(tmp_path, d)
    code, _, err = run_cli("report", spec, "-o", out)
    assert calls and code == 3 and "chart failed mid-render" in err
    assert (out / "index.html").read_bytes() == before
    assert (out / "notes.txt").read_text() == "mine"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["rep", "spec.yaml"]  # no staging folder left


def test_exit_codes_and_report_written_when_checks_fail(tmp_path):
    assert run_cli("report", write_spec(tmp_path, minimal(), "ok.yaml"), "-o", tmp_path / "ok")[0] == 0
    warn = minimal()
    warn["thresholds"] = {"pressure_margin_warn": "30 %"}  # 205 bar of 250 bar: 18 % margin, a warning
    warn_spec = write_spec(tmp_path, warn, "warn.yaml")
    assert run_cli("report", warn_spec, "-o", tmp_path / "warn")[0] == 0  # warnings allowed
    assert run_cli("report", "--strict", warn_spec, "-o", tmp_path / "strict")[0] == 1
    assert "Overall: WARN" in (tmp_path / "strict" / "index.html").read_text()
    d = minimal()
    d["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"
    code, out, _ = run_cli("report", write_spec(tmp_path, d, "fails.yaml"), "-o", tmp_path / "fail")
    assert code == 1 and "FAIL" in out
    assert "Overall: FAIL" in (tmp_path / "fail" / "index.html").read_text()
    bad = minimal()
    bad["supplies"]["main"]["relief_setting"] = "250 kg"
    code, out, err = run_cli("report", write_spec(tmp_path, bad, "bad.yaml"), "-o", tmp_path / "bad")
    assert code == 2 and "bad.yaml:" in err and "relief_setting" in err and "Traceback" not in err
    assert not (tmp_path / "bad").exists()
    with pytest.raises(SystemExit) as stop:  # -o is required: argparse exits 2
        run_cli("report", EXAMPLE)
    assert stop.value.code == 2


def test_several_specs_give_a_folder_each_and_an_index(tmp_path):
    first = write_spec(tmp_path, minimal(), "first.yaml")
    other = minimal()
    other["machine"]["id"], other["machine"]["title"] = "hoist-rig", "Hoist rig <b>"
    other["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "400 N*m"
    spec = write_spec(tmp_path, other, "rig.yaml")
    out = tmp_path / "all"
    code, stdout, _ = run_cli("report", first, spec, "-o", out)
    assert code == 1
    index = (out / "index.html").read_text()
    assert (out / "bench-rig" / "index.html").is_file() and (out / "hoist-rig" / "index.html").is_file()
    rows = re.findall(r"<tr><th scope=\"row\"><a href=\"([^\"]+)\">([^<]+)</a>.*?status-(\w+)", index)
    assert rows == [("bench-rig/index.html", "Test rig", "pass"), ("hoist-rig/index.html", "Hoist rig &lt;b&gt;", "fail")]
    assert "Cautions" in index


def test_pdf_without_the_extra_says_how_and_still_writes_html(tmp_path, monkeypatch):
    monkeypatch.setitem(sys.modules, "weasyprint", None)  # import fails as if not installed
    out = tmp_path / "rep"
    (out).mkdir()
    (out / "report.pdf").write_bytes(b"%PDF- stale")
    code, _, err = run_cli("report", write_spec(tmp_path, minimal()), "-o", out, "--pdf")
    assert code == 0 and "pip install 'specgen[pdf]'" in err
    assert (out / "index.html").is_file()
    assert not (out / "report.pdf").exists()  # an older PDF no longer matches the HTML beside it
    assert "removed" in err


def test_pdf_has_numbered_footers(tmp_path):
    pytest.importorskip("weasyprint", reason="the optional 'pdf' extra (WeasyPrint) is not installed")
    pypdf = pytest.importorskip("pypdf")
    out = tmp_path / "rep"
    assert run_cli("report", write_spec(tmp_path, minimal()), "-o", out, "--pdf")[0] == 0
    pages = pypdf.PdfReader(out / "report.pdf").pages
    assert 4 <= len(pages) <= 12
    sha = hashlib.sha256((tmp_path / "spec.yaml").read_bytes()).hexdigest()[:12]
    for k, page in enumerate(pages, start=1):
        text = page.extract_text()
        assert f"page {k} of {len(pages)}" in text and "Test rig" in text and sha in text
    assert abs(float(pages[0].mediabox.width) - 595.3) < 1  # A4 by default: 210 mm = 595.3 pt


class Outline(HTMLParser):
    def __init__(self):
        super().__init__()
        self.headings, self.ths, self.ids, self.figures, self.stack = [], [], [], [], []

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if re.fullmatch(r"h[1-6]", tag):
            self.headings.append(int(tag[1]))
        if tag == "th":
            self.ths.append(a.get("scope"))
        if "id" in a:
            self.ids.append(a["id"])
        if tag == "figure":
            self.figures.append({"svg": 0, "caption": 0, "alt": 0})
        if self.figures and tag == "svg":
            self.figures[-1]["svg"] += 1
        if self.figures and tag == "figcaption":
            self.figures[-1]["caption"] += 1
        if self.figures and tag == "p" and a.get("class") == "alt":
            self.figures[-1]["alt"] += 1


def test_accessible_structure(example):
    o, page = example
    parsed = Outline()
    parsed.feed(page)
    assert parsed.headings[0] == 1 and parsed.headings.count(1) == 1
    for prev, cur in zip(parsed.headings, parsed.headings[1:]):
        assert cur <= prev + 1, parsed.headings
    assert parsed.ths and all(s in ("col", "row") for s in parsed.ths)
    dupes = {i for i in parsed.ids if parsed.ids.count(i) > 1}
    assert not dupes  # ids stay unique across all the inline SVGs
    # torque and speed per drive, flow and power per supply, and the margin overview
    rows = len(report.margin_rows(o))
    margin_parts = -(-rows // report.MARGIN_ROWS_PER_CHART)
    assert len(parsed.figures) == 2 * len(o.machine.drives) + 2 * len(o.machine.supplies) + margin_parts
    assert all(f == {"svg": 1, "caption": 1, "alt": 1} for f in parsed.figures)
    for m in re.finditer(r'aria-labelledby="(fig\d+-alt)"', page):
        assert f'id="{m.group(1)}"' in page


def test_self_contained_no_script_no_network(example):
    _, page = example
    assert "<script" not in page
    assert not re.search(r"""(src|href)=["']?(https?:)?//""", page)
    assert "default-src 'none'" in page
    assert "@import" not in page and "url(http" not in page


def test_checklist_manual_items_and_signoff(example):
    _, page = example
    checklist = page[page.index('id="checklist"'):page.index('id="signoff"')]
    assert checklist.count('class="tickbox"') == len(report.MANUAL_ITEMS)
    for item in ("relief setting", "brake", "Guarding", "Emergency stop", "ISO 4406", "ISO 4413"):
        assert item in checklist
    assert "main 280.0 bar, aux 190.0 bar" in checklist  # hose ratings against each relief setting
    assert "bale_winch lower" in checklist  # the overrunning duty named for the load-holding item
    signoff = page[page.index('id="signoff"'):]
    assert "A. Designer" in signoff
    assert [r for r in ("Prepared by", "Checked by", "Approved by") if r in signoff] == \
        ["Prepared by", "Checked by", "Approved by"]
    assert signoff.count('<td class="line"></td>') == 8  # signatures and dates left for ink
    assert 'id="reviews"' not in page  # nothing recorded: the block stays empty


def test_recorded_reviews_block(tmp_path):
    o = run_file(write_spec(tmp_path, minimal()))
    page = report.render(o, fp=FIXED, reviews=[{
        "name": "B. Checker", "role": "checking engineer", "date": "2025-03-14", "verdict": "approved",
        "fingerprint": "ab" * 32, "matches_current": True, "remarks": HOSTILE}])
    reviews = page[page.index('id="reviews"'):page.index('id="signoff"')]
    assert "B. Checker" in reviews and "abababababab" in reviews and "&lt;script&gt;" in reviews


def test_fingerprint_hash_and_git_state(tmp_path, monkeypatch):
    raw = EXAMPLE.read_bytes()
    assert fingerprint(raw, None).sha256 == hashlib.sha256(raw).hexdigest()
    repo = make_repo(tmp_path / "repo")
    head = commit(repo, {"m.yaml": "format: 1\n"}, "spec")
    assert fingerprint(b"", repo / "m.yaml") == Fingerprint(hashlib.sha256(b"").hexdigest(), head, "clean")
    (repo / "m.yaml").write_text("format: 1\n# edited\n")
    assert fingerprint(b"", repo / "m.yaml").state == "modified"
    (repo / "new.yaml").write_text("x")
    assert fingerprint(b"", repo / "new.yaml").state == "untracked"
    outside = tmp_path / "loose.yaml"
    outside.write_text("x")
    monkeypatch.setenv("GIT_CEILING_DIRECTORIES", str(tmp_path))
    assert fingerprint(b"x", outside).commit is None
    monkeypatch.setenv("PATH", str(tmp_path / "nothing-here"))  # no git at all: fails soft
    assert fingerprint(b"x", repo / "m.yaml").commit is None


def test_report_shows_fingerprint_and_git_state(tmp_path):
    repo = make_repo(tmp_path / "repo")
    import yaml

    text = yaml.safe_dump(minimal(), sort_keys=False)
    head = commit(repo, {"rig.yaml": text}, "spec")
    out = tmp_path / "rep"
    assert run_cli("report", repo / "rig.yaml", "-o", out)[0] == 0
    page = (out / "index.html").read_text()
    assert hashlib.sha256(text.encode()).hexdigest() in page
    assert head in page and "the spec is <strong>clean</strong>" in page


def test_page_size_from_the_spec(tmp_path):
    d = minimal()
    assert "size: A4;" in report.render(run_file(write_spec(tmp_path, d)), fp=FIXED)
    d["machine"]["page_size"] = "Letter"
    assert "size: Letter;" in report.render(run_file(write_spec(tmp_path, d)), fp=FIXED)


def test_us_units_report(tmp_path):
    d = example_data()
    d["machine"]["display_units"] = "US"
    o = run_file(write_spec(tmp_path, d))
    page = report.render(o, fp=FIXED)
    climb = o.results.duty("track_left", "climb")
    assert format_si(climb["inlet_pressure"], "pressure", "US") in page
    assert "[psi]" in page and "[lbf*in]" in page and "[gpm]" in page  # chart axes in the display units


def test_report_imports_stay_out_of_check(tmp_path):
    import subprocess

    code = ("import sys, specgen.cli as c; c.main(['check', '-q', sys.argv[1]]); "
            "print(sorted(m for m in ('matplotlib', 'jinja2', 'nh3', 'markdown') if m in sys.modules))")
    done = subprocess.run([sys.executable, "-c", code, str(EXAMPLE)], capture_output=True, text=True,
                          cwd=str(Path(__file__).resolve().parent.parent), env={**os.environ})
    assert done.stdout.strip().splitlines()[-1] == "[]"
