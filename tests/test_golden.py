"""The example specs' text and JSON output, committed, so a change of any number shows in review.

Regenerate after an intended change:  python -m pytest tests/test_golden.py --update-golden
"""

from __future__ import annotations

from pathlib import Path

import pytest

from helpers import ROOT, run_cli

GOLDEN = Path(__file__).resolve().parent / "golden"
SPECS = ["reed_harvester", "log_deck", "yard_loader"]


@pytest.mark.parametrize("fmt, ext", [("text", "txt"), ("json", "json")])
@pytest.mark.parametrize("name", SPECS)
def test_example_output_matches_golden(name, fmt, ext, request, monkeypatch):
    monkeypatch.chdir(ROOT)  # file names in the output are as given on the command line
    code, out, err = run_cli("check", "--format", fmt, f"example_specs/{name}.yaml")
    assert err == ""
    assert code == 0, out
    golden = GOLDEN / f"{name}.{ext}"
    if request.config.getoption("--update-golden"):
        golden.write_text(out, encoding="utf-8")
        return
    assert golden.exists(), f"{golden} is missing: run with --update-golden once"
    expected = golden.read_text(encoding="utf-8")
    if out != expected:
        import difflib

        diff = "".join(difflib.unified_diff(expected.splitlines(True), out.splitlines(True),
                                            f"golden/{name}.{ext}", "now", n=1))
        pytest.fail(f"output differs from tests/golden/{name}.{ext} (rerun with --update-golden if meant):\n"
                    + diff[:6000])
