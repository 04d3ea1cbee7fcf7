"""Small helpers shared by the spine tests: build spec text, run the CLI in-process."""

from __future__ import annotations

import copy
import io
from contextlib import redirect_stderr, redirect_stdout
from pathlib import Path

import yaml

ROOT = Path(__file__).resolve().parent.parent
EXAMPLE = ROOT / "example_specs" / "reed_harvester.yaml"


def example_data() -> dict:
    return yaml.safe_load(EXAMPLE.read_text(encoding="utf-8"))


def minimal() -> dict:
    """One supply, one drive, one mode: small enough to compute by hand."""
    return copy.deepcopy({
        "format": 1,
        "machine": {"id": "bench-rig", "title": "Test rig", "revision": "A"},
        "supplies": {"main": {
            "pump": {"displacement": "40 cm^3", "shaft_speed": "1500 rpm",
                     "volumetric_efficiency": 0.95, "overall_efficiency": 0.85},
            "relief_setting": "250 bar", "return_pressure": "5 bar", "prime_mover_power": "30 kW"}},
        "drives": {"hoist": {
            "supply": "main",
            "motor": {"kind": "axial_piston", "displacement": "100 cm^3",
                      "efficiency": {"volumetric": 0.95, "hydromechanical": 0.9, "starting": 0.85},
                      "rating": {"continuous_pressure": "280 bar", "peak_pressure": "350 bar",
                                 "max_speed": "3000 rpm"}},
            "duty_points": {"lift": {"torque": "286.5 N*m", "speed": "500 rpm"}}}},
        "modes": {"work": {"drives": {"hoist": "lift"}}},
    })


def write_spec(tmp_path: Path, data: dict | str, name: str = "spec.yaml") -> Path:
    p = tmp_path / name
    p.write_text(data if isinstance(data, str) else yaml.safe_dump(data, sort_keys=False), encoding="utf-8")
    return p


def run_cli(*args: str) -> tuple[int, str, str]:
    from specgen.cli import main

    out, err = io.StringIO(), io.StringIO()
    with redirect_stdout(out), redirect_stderr(err):
        code = main([str(a) for a in args])
    return code, out.getvalue(), err.getvalue()


def value_paths(node, prefix: tuple = ()):
    """Every path to a value in a loaded spec tree (dict keys, list indexes), parents first."""
    yield prefix
    if isinstance(node, dict):
        for k, v in node.items():
            yield from value_paths(v, prefix + (k,))
    elif isinstance(node, list):
        for i, v in enumerate(node):
            yield from value_paths(v, prefix + (i,))


def spec_checks(data: dict, check_id: str, **where) -> list:
    """Run a spec given as a dict through the whole pipeline and return the checks with ``check_id``
    whose drive/duty/supply/mode match ``where`` (a key given as None must be None on the check)."""
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    checks = evaluate(Source("mem.yaml", data, b"")).results.checks
    return [c for c in checks if c.id == check_id and all(getattr(c, k) == v for k, v in where.items())]


def spec_check(data: dict, check_id: str, **where):
    """The one check with ``check_id`` at ``where``; fails the test when there is none or several."""
    found = spec_checks(data, check_id, **where)
    assert len(found) == 1, f"expected one {check_id} check at {where}, found {len(found)}"
    return found[0]


# A value exactly at its limit fails under the status rule every check shares ("fail" at or past
# the limit). Tests of checks that still pass or warn there carry this strict mark: they report
# the gap now and turn red as soon as the check fails at its limit, when the mark goes.


# A motor efficiency table (invented figures, plausible for an axial piston motor) on the minimal rig.
EFFICIENCY_TABLE = {"pressure_differential": ["100 bar", "200 bar", "300 bar"], "speed": ["100 rpm", "1000 rpm"],
                    "volumetric": [[0.94, 0.96], [0.92, 0.95], [0.90, 0.94]],
                    "hydromechanical": [[0.86, 0.88], [0.89, 0.91], [0.90, 0.92]],
                    "starting": [0.78, 0.80, 0.82]}


def with_efficiency_table(table=EFFICIENCY_TABLE, **duty) -> dict:
    """The minimal rig whose motor reads its efficiencies from ``table``; ``duty`` edits its duty point."""
    d = minimal()
    d["drives"]["hoist"]["motor"]["efficiency_table"] = table
    d["drives"]["hoist"]["duty_points"]["lift"].update(duty)
    return d


def hoist_lift(d):
    """The minimal rig's one duty result."""
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", d, b"")).results.duty("hoist", "lift")


def markdown_tables(md: str) -> int:
    """How many tables ``md`` holds, each asserted whole: a blank line before it, a header, a
    separator of dashes, and every row (``|`` escaped inside cells) ending " |" with the header's width."""
    import re

    def cells(line: str) -> list[str]:
        assert line.startswith("|") and line.endswith("|"), line
        return re.split(r"(?<!\\)\|", line[1:-1])

    lines, i, tables = md.splitlines(), 0, 0
    while i < len(lines):
        if lines[i].startswith("|"):
            block = []
            while i < len(lines) and lines[i].startswith("|"):
                block.append(lines[i])
                i += 1
            assert i - len(block) == 0 or lines[i - len(block) - 1] == ""  # a blank line before each table
            width = len(cells(block[0]))
            assert re.fullmatch(r"\|(---\|)+", block[1]) and len(cells(block[1])) == width
            assert all(r.endswith(" |") and len(cells(r)) == width for r in block[:1] + block[2:])
            tables += 1
        i += 1
    return tables


def closed_loop() -> dict:
    """One closed loop small enough to compute by hand: a 100 cm^3 pump at 2000 rpm (eta_v 0.95, eta_t 0.874,
    so eta_hm 0.92) and a 100 cm^3 motor (eta_v 0.95, eta_hm 0.93) at 902.5 rpm needing 95 L/min, with
    407.04 N*m giving 275 bar across it above a 25 bar charge pressure (p_H 300 bar); a 20 cm^3 charge pump
    (eta_v 0.90, eta_t 0.80) gives 36 L/min; flushing 10 L/min. ``drive`` overruns at the same torque."""
    return copy.deepcopy({
        "format": 1,
        "machine": {"id": "loop-rig", "title": "Closed-loop rig", "revision": "A"},
        "supplies": {"loop": {
            "circuit": "closed_loop",
            "pump": {"displacement": "100 cm^3", "shaft_speed": "2000 rpm",
                     "volumetric_efficiency": 0.95, "overall_efficiency": 0.874},
            "relief_setting": "420 bar", "prime_mover_power": "60 kW",
            "closed_loop": {"charge": {"displacement": "20 cm^3", "pressure": "25 bar",
                                       "volumetric_efficiency": 0.9, "overall_efficiency": 0.8},
                            "flushing_flow": "10 L/min"}}},
        "drives": {"wheel": {
            "supply": "loop", "load_holding": "spring_applied_brake",
            "motor": {"kind": "axial_piston", "displacement": "100 cm^3",
                      "efficiency": {"volumetric": 0.95, "hydromechanical": 0.93, "starting": 0.9},
                      "rating": {"continuous_pressure": "420 bar", "peak_pressure": "450 bar",
                                 "max_speed": "4000 rpm"}},
            "duty_points": {"drive": {"torque": "407.04 N*m", "speed": "902.5 rpm"},
                            "brake": {"torque": "407.04 N*m", "speed": "902.5 rpm", "direction": "overrunning"}}}},
        "modes": {"driving": {"drives": {"wheel": "drive"}}, "braking": {"drives": {"wheel": "brake"}}},
    })
