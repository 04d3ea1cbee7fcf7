"""The markdown review comment (present/diff_markdown.py): cut to fit, whole rows only,
regressions first, the caution kept."""

import re

import yaml
from helpers import markdown_tables

from specgen.bench import _demo_data, demo_spec, generate
from specgen.diff import compare
from specgen.intake.read import load_text
from specgen.pipeline import evaluate
from specgen.present import diff_markdown, diff_out


def outcome(data: dict, name: str):
    return evaluate(load_text(yaml.safe_dump(data, sort_keys=False).encode(), name))


def test_a_long_diff_is_cut_to_fit_with_regressions_kept_first():
    demo = _demo_data(demo_spec())
    old = generate(demo, 120, 12)
    new = yaml.safe_load(yaml.safe_dump(old, sort_keys=False))
    for did in [k for k in new["drives"] if k.startswith("track_")][:30]:
        for dp in new["drives"][did]["duty_points"].values():
            if "torque" in dp:
                number, unit = dp["torque"].split(" ", 1)
                dp["torque"] = f"{float(number) * 1.3:g} {unit}"
    d = compare(outcome(old, "old.yaml"), outcome(new, "new.yaml"))
    full = diff_out.render(d, "markdown", max_chars=0)
    cut = diff_out.render(d, "markdown", max_chars=12_000)
    assert len(full) > 12_000 >= len(cut)
    assert "characters; a comment holds 12,000" in cut and "--max-chars 0" in cut
    assert markdown_tables(cut) >= 1
    first_regression = next(line for line in full.splitlines() if line.startswith("| **pass -> fail**"))
    assert first_regression in cut
    assert re.search(r"_\d+ more rows? not shown here: see the full diff\._", cut)
    assert cut.rstrip().endswith("see the report's cautions._")  # the caution is never cut
    assert diff_out.render(d, "markdown") == full or len(full) > diff_markdown.MAX_CHARS


def test_cells_cannot_break_a_table_or_start_a_block():
    assert diff_markdown._md_cell("a|b\nc <script>") == "a\\|b c &lt;script>"
    assert diff_markdown._md_cell("# heading") == "\\# heading"
    assert diff_markdown._md_cell("@someone see #12") == "@&#8203;someone see #&#8203;12"
