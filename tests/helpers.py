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
