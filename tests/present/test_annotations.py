"""GitHub Actions workflow commands for failing and warning checks (present/annotations.py).

The command syntax (``::error file=...,line=...,title=...::message``, and the escapes of ``%``,
CR, LF in the message plus ``:`` and ``,`` in properties) is GitHub's documented "workflow
commands" format.
"""

import json
import re

from helpers import EXAMPLE, minimal, run_cli, write_spec
from specgen.present import annotations
from specgen.present.annotations import command, data, prop

COMMAND = re.compile(r"^::(error|warning|notice)( [^:]*)?::.*$")


def test_every_line_is_a_command_and_warnings_sit_at_their_duty_point_line():
    code, out, _ = run_cli("check", "--format", "github", EXAMPLE)
    assert code == 0
    lines = out.splitlines()
    assert all(COMMAND.match(line) for line in lines)
    # one warning command for each warning of the demo harvester (as its JSON output counts them), one of
    # them found at its worn corner; the first sits at the line of track_left's climb duty point
    _, doc, _ = run_cli("check", "--format", "json", EXAMPLE)
    warnings = [line for line in lines if line.startswith("::warning") and "[variant " not in line]
    assert len(warnings) == json.loads(doc)["counts"]["warn"] >= 1
    # a design variant adds only what the base design does not say: bigger_aux's heat-load warning
    assert [line.split("title=")[1].split("::")[0] for line in lines if "[variant " in line] == [
        "heat_load (mode transit) [at corner worn] [variant bigger_aux]"]
    assert sum("[at corner worn]" in w for w in warnings) == 1
    text = EXAMPLE.read_text(encoding="utf-8").splitlines()
    first = warnings[0]
    line = int(re.search(r",line=(\d+),", first).group(1))
    assert text[line - 1].strip() == "climb:"
    assert "title=pressure_margin (drive track_left%2C duty point climb)" in first
    assert "(margin 6.1%25)" in first
    assert lines[-1].startswith("::notice title=caution::Design aid only")


def test_a_failing_check_is_an_error_and_fails_the_run(tmp_path):
    data_ = minimal()
    # 600 N*m on 100 cm^3 needs about 600 * 2 pi / 100e-6 / 0.9 = 419 bar, over the 250 bar relief
    data_["drives"]["hoist"]["duty_points"]["lift"]["torque"] = "600 N*m"
    spec = write_spec(tmp_path, data_)
    code, out, _ = run_cli("check", "--format", "github", spec)
    assert code == 1
    errors = [line for line in out.splitlines() if line.startswith("::error")]
    assert errors and all(f"file={prop(str(spec))}" in e for e in errors)
    src = spec.read_text(encoding="utf-8").splitlines()
    lifted = [e for e in errors if "duty point lift" in e]
    line = int(re.search(r",line=(\d+),", lifted[0]).group(1))
    assert src[line - 1].strip().startswith("lift:")


def test_escapes_follow_the_command_syntax():
    assert data("50% at 3\r\n") == "50%25 at 3\\r\\n"  # line breaks made visible, never passed through
    assert prop("a:b,c%") == "a%3Ab%2Cc%25"
    forged = command("warning", "spec.yaml", 3, "t", "x\n::error file=other.yaml::forged\n::add-mask::secret")
    assert "\n" not in forged and forged.count("\r") == 0
    assert forged.startswith("::warning file=spec.yaml,line=3,title=t::")


def test_spec_text_cannot_forge_a_command_or_a_property():
    class C:
        id, status, drive, duty, supply, mode = "pressure_margin", "fail", "d,line=1", None, None, None
        where = "drive d,line=1::x"
        name = "pressure_margin (drive d,line=1::x)"
        message = "::stop-commands::tok"

    class Src:
        name = "a,b:c.yaml"

        def location(self, path):
            from specgen.errors import Location
            return Location(self.name, 7, 1)

    class R:
        checks = (C(),)

    class O:
        results, source = R(), Src()

    [line] = annotations.lines(O())
    assert line == ("::error file=a%2Cb%3Ac.yaml,line=7,title=pressure_margin (drive d%2Cline=1%3A%3Ax)::"
                    "\\x3a:stop-commands::tok")
