"""The report page's content: every value from the Results in its trace, as entered beside as used,
checklist, summary, cautions, assumed values, escaping and sanitising, structure, sign-off, units."""

from __future__ import annotations

import html as htmllib
import math
import re

from helpers import example_data, minimal, write_spec
from page_html import FIXED, Outline, block, case_values, esc, table_of
from specgen.cautions import CAUTIONS
from specgen.pipeline import run_file
from specgen.present import report
from specgen.present.report.values import show, typeset
from specgen.units import format_si


def test_every_duty_and_supply_value_is_shown_in_its_trace(example):
    """Each value of each duty point and mode is in its own column of the grouped trace (or in its
    one-case trace), with the unit the report prints."""
    o, page = example
    system = o.machine.display_units
    for r in o.results.duties:
        shown = case_values(page, f"duty-{r.drive}-{r.duty}")
        for v in r.values.values():
            assert show(v.value, v.kind, system, v.symbol, v.label) in shown, (r.drive, r.duty, v.key)
    for r in o.results.supply_modes:
        shown = case_values(page, f"mode-{r.supply}-{r.mode}")
        for v in r.values.values():
            assert show(v.value, v.kind, system, v.symbol, v.label) in shown, (r.supply, r.mode, v.key)

def test_hand_checked_numbers_appear(tmp_path):
    o = run_file(write_spec(tmp_path, minimal()))
    page = report.render(o, fp=FIXED)
    lift = block(page, "duty-hoist-lift")  # one duty point: its full trace
    # dp = 2*pi*T/(Vg*eta_hm) = 2*pi*286.5/(100e-6*0.9) = 200.0 bar; p_in = dp + 5 bar = 205.0 bar
    # q = Vg*n/eta_v = 100 cm^3 * 500 rpm / 0.95 = 52.63 L/min (motor relations, fluid-power textbook;
    # hand calculation)
    for text in ("200.0 bar", "205.0 bar", "52.63 L/min"):
        assert text in lift, text
    assert format_si(o.results.duty("hoist", "lift")["inlet_pressure"], "pressure", "SI") == "205.0 bar"
    # q_p = Vp*n*eta_v = 40 cm^3 * 1500 rpm * 0.95 = 57.00 L/min (pump delivery relation; hand calculation)
    assert "57.00 L/min" in case_values(page, "mode-main-work")
    # the substitution shows the values used, with units typeset, in place of the symbols
    assert "dp = 2*pi*(286.5 N\u00b7m) / ((100.0 cm\u00b3/rev) * 0.9000)" in htmllib.unescape(lift)

def test_spec_values_are_shown_as_entered_and_as_used(example):
    o, page = example
    drive = block(page, "drive-track_left")
    data = example_data()["drives"]["track_left"]
    for raw in (data["motor"]["displacement"], data["motor"]["rating"]["peak_pressure"],
                data["motor"]["rating"]["max_speed"], data["case_pressure"]):
        assert f">{raw}<" in drive, raw
    d = o.machine.drive("track_left")
    assert f">{typeset(format_si(d.motor.displacement_max, 'displacement', 'SI'))}<" in drive
    assert f">{typeset(format_si(d.motor.rating.peak_pressure, 'pressure', 'SI'))}<" in drive
    supply = block(page, "supply-aux")
    assert ">90 %<" in supply and ">90.00 %<" in supply  # written as a percentage, used as 0.90

def test_every_check_is_in_the_checklist_with_anchor_and_where(example):
    o, page = example
    assert len(o.results.checks) > 50
    checklist = page[page.index('id="checklist"'):page.index('id="manual"')]
    for n, c in enumerate(o.results.checks, start=1):
        assert f'id="check-{n}"' in checklist
        if c.status == "pass":  # one place of its check's row: where and margin
            row = checklist[checklist.index(f'id="check-{n}"'):]
            place = row[:row.index("</span>")]
            where = " / ".join(x for x in (c.drive, c.supply, c.cycle, c.duty, c.mode) if x) or "machine"
            assert esc(where) in place
            if c.margin is None:
                assert show(c.value, c.kind, "SI") in place or esc(typeset(c.message)) in place
            elif math.isfinite(c.margin):
                assert show(c.margin, "ratio", "SI") in place
            else:  # breakaway of the fan: no torque needed at rest, so no finite margin
                assert "unbounded" in place
            group = checklist[checklist.rindex("<tr>", 0, checklist.index(f'id="check-{n}"')):]
            assert c.id in group[:group.index("</tr>")]
        else:  # warnings and failures in full
            row = block(page, f"check-{n}")
            assert c.id in row and esc(c.where) in row and esc(typeset(c.message)) in row
            assert {"warn": "WARN", "fail": "FAIL"}[c.status] in row

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
    listed = [".".join(i.where) for i in o.results.assumed()]
    section = block(page, "assumed").replace("<wbr>", "")
    # the typical 100 degC viscosity of the demo's ISO VG grade is an assumption like any default
    assert "fluid.viscosity_100c" in listed
    for where in listed:
        assert where in section
    # the bale winch motor efficiencies are defaults: its traces say so beside the values
    winch = table_of(page, "duty-bale_winch-hoist")
    assert winch.count('class="assumed"') >= 3
    # a drive whose motor data is all given carries no mark
    assert 'class="assumed"' not in table_of(page, "duty-track_left-climb")

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
    # torque and speed for each drive with a warning (track_right is the same drive as track_left and
    # shown as it), flow and power per supply, the margin overview, the oil temperature of each cycle
    warned = {c.drive for c in o.results.checks if c.status != "pass" and c.drive} - {"track_right"}
    assert warned == {"track_left", "bale_winch"}
    assert page.count('class="chart-pair"') == len(warned)
    cycles = sum(1 for c in o.results.cycles if c.series)
    assert len(parsed.figures) == 2 * len(warned) + 2 * len(o.machine.supplies) + 1 + cycles
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
    assert "[psi]" in page and "[lbf\u00b7in]" in page and "[gpm]" in page  # chart axes in the display units


def test_a_supply_left_out_of_a_mode_has_no_column_for_it(tmp_path):
    from specgen import bench

    # 13 drives in 3 groups on 3 copies of the demo's supplies; mode 0 runs group 0 only, so the
    # supplies of groups 1 and 2 have no result in mode 0 (bench.generate's docstring)
    o = run_file(bench.write_spec(tmp_path / "g.yaml", bench.generate(example_data(), 13, 3)))
    pairs = {(x.supply, x.mode) for x in o.results.supply_modes}
    assert ("main_001", "mode_000") not in pairs and ("main_000", "mode_000") in pairs
    page = report.render(o, fp=FIXED)
    assert 'id="mode-main_000-mode_000"' in page and 'id="mode-main_001-mode_000"' not in page


def test_thermal_section_with_chart_steps_and_linked_checks():
    from helpers import ROOT

    o = run_file(ROOT / "tests" / "specs" / "harbour_crane.yaml")
    page = report.render(o, fp=FIXED)
    section = page[page.index('<section id="thermal"'):]
    section = section[:section.index("</section>")]
    assert "Duty cycles and oil temperature" in section and "period 150.0 s" in section
    assert "<code>hoisting</code> 30.00 s" in section  # 20 % of 150 s
    assert section.count("<svg") == 1 and "oil limit 70.00 \u00b0C" in section
    assert 'id="cycle-container_moves"' in section  # the trace block the checks link to
    assert 'href="#cycle-container_moves"' in page
    plain = report.render(run_file(ROOT / "example_specs" / "log_deck.yaml"), fp=FIXED)
    assert 'id="thermal"' not in plain


def _printed_text(page: str) -> str:
    """The page less what the user typed (as-entered cells, the description) and the relations,
    which are written in the ASCII the spec and the formulas use."""
    body = page[page.index("<body>"):]
    body = re.sub(r'<(td|span) class="(num )?entered-text">.*?</\1>', "", body, flags=re.S)
    body = re.sub(r"<code[^>]*>.*?</code>", "", body, flags=re.S)
    body = re.sub(r'<section id="description".*?</section>', "", body, flags=re.S)
    return htmllib.unescape(body)


def test_units_are_typeset_as_engineers_write_them(example):
    """cm^3, degC, N*m, mm^2/s, m/s^2 are printed cm\u00b3, \u00b0C, N\u00b7m, mm\u00b2/s, m/s\u00b2 in the report
    (charts too); the text and JSON outputs keep the ASCII spellings."""
    o, page = example
    printed = _printed_text(page)
    for typeset_unit in ("cm\u00b3/rev", "\u00b0C", "N\u00b7m", "mm\u00b2/s", "L/min", "kW"):
        assert typeset_unit in printed, typeset_unit
    for ascii_unit in ("cm^3", "degC", "N*m", "mm^2/s", "m/s^2", "kg/m^3"):
        assert ascii_unit not in printed, (ascii_unit, printed[max(0, printed.find(ascii_unit) - 80):][:160])
    from specgen.present import text

    assert "cm^3/rev" in text.render(o) and "cm\u00b3" not in text.render(o)


def test_key_paths_break_at_dots_only(example):
    _, page = example
    assert '<th scope="row" class="path" title="Continuous pressure rating">motor.<wbr>rating.<wbr>' \
           'continuous_pressure</th>' in page
    rule = re.search(r"\.path \{[^}]*\}", page).group(0)
    assert "break-all" not in rule  # no break inside a word of a key while a dot is there to break at


def test_page_one_names_both_hashes_and_the_figures_a_reviewer_needs(example):
    o, page = example
    top = page[:page.index('id="cautions"')]
    # the file's bytes and the normalised content, each named for what it is
    assert "File SHA-256" in top and "Content fingerprint" in top
    from specgen.review import spec_fingerprint

    assert o.source.raw and spec_fingerprint(o.source) in top
    assert "Document no." in top and "RH4-HYD-DR-007" in top  # the demo's machine.document_number
    assert f"<strong>{len(o.results.assumed())}</strong> values filled in" in top
    # the smallest margin of any check: breakaway of track_left at climb, 3112 N*m at the compensator
    # setting against 3011 N*m needed: (3112 - 3011) / 3011 = 3.35 %, shown from the check's own margin
    smallest = min((c for c in o.results.checks if c.margin is not None), key=lambda c: c.margin)
    assert smallest.id == "breakaway" and smallest.drive == "track_left"
    assert f"<strong>{show(smallest.margin, 'ratio', 'SI')}</strong>: <a href=" in top
    assert "Review state</th><td><strong>unknown</strong>" in top or "Review state" in top
    signoff = page[page.index('id="signoff"'):]
    assert "file SHA-256" in signoff and "content fingerprint" in signoff


def test_document_number_on_page_one_and_in_every_footer(tmp_path):
    d = minimal()
    d["machine"]["document_number"] = "DR-2026-0142"
    page = report.render(run_file(write_spec(tmp_path, d)), fp=FIXED)
    assert "<strong>DR-2026-0142</strong>" in page[:page.index('id="summary"')]
    footer = re.search(r"@bottom-left \{ content: (\"[^\"]*\")", page).group(1)
    assert "DR" in footer and "2026" in footer


def test_a_large_machine_gives_a_document_not_an_atlas(tmp_path):
    """Drives repeated from the demo are references to the first with their own warnings; drive
    charts only for the drives with warnings, at most MAX_DRIVE_CHARTS; traces of more than seven
    modes split into tables of seven columns; every check still has its anchor."""
    from specgen import bench
    from specgen.present.report import page_context

    data = bench.generate(bench._demo_data(bench.demo_spec()), 48, 12)
    o = run_file(bench.write_spec(tmp_path / "big.yaml", data))
    page = report.render(o, fp=FIXED)
    assert page.count('class="same-as"') >= 24
    twin = page[page.index('class="same-as"'):]
    assert "The same motor, gear stage and duty points as drive" in twin[:twin.index("</p>")]
    pairs = page.count('class="chart-pair"')
    assert 0 < pairs <= page_context.MAX_DRIVE_CHARTS
    for n in range(1, len(o.results.checks) + 1):
        assert f'id="check-{n}"' in page
    for r in o.results.duties:  # a twin's duty anchors stay, so the checklist links land
        assert f'id="duty-{r.drive}-{r.duty}"' in page
    for table in re.findall(r'<table class="trace grouped">.*?</table>', page, re.S):
        assert table.count('class="num case"') <= page_context.MAX_CASE_COLUMNS
