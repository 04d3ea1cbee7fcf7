"""The fast ways of specgen.units give the values the full reading gives, and never fail a run.

Two shortcuts: pint's disk cache of its parsed definitions, and one cached scale per unit and
kind so "2.6 kN*m" is 2.6 times the SI value of "1 kN*m". Reference values are exact by the SI
definitions (1 L = 1e-3 m^3; T/K = t/degC + 273.15) and NIST SP 811 (1 psi = 6894.757 Pa).
"""

from __future__ import annotations

import os
import subprocess
import sys

import pytest
from helpers import ROOT
from hypothesis import given
from hypothesis import strategies as st

from specgen import units

CODE = ("from specgen import units; print(units.parse('3625 psi', 'pressure'), units.parse('45 L/min', 'flow'), "
        "units.parse('55 degC', 'temperature'), units.parse('1500 rpm', 'speed'))")


def _values(tmp_path, cache: str | None) -> list[float]:
    env = {k: v for k, v in os.environ.items() if k != units.UNIT_CACHE_ENV}
    env.update(PYTHONPATH=str(ROOT), XDG_CACHE_HOME=str(tmp_path / "xdg"))
    if cache is not None:
        env[units.UNIT_CACHE_ENV] = cache
    p = subprocess.run([sys.executable, "-c", CODE], env=env, capture_output=True, text=True, cwd=ROOT)
    assert p.returncode == 0 and not p.stderr, p.stderr
    psi, flow, kelvin, speed = (float(x) for x in p.stdout.split())
    assert psi == pytest.approx(3625 * 6894.757, rel=1e-6)  # NIST SP 811
    assert (flow, kelvin, speed) == (pytest.approx(45e-3 / 60), pytest.approx(328.15), pytest.approx(25.0))
    return [psi, flow, kelvin, speed]


def test_cache_is_written_once_then_read(tmp_path):
    folder = tmp_path / "cache"
    first = _values(tmp_path, str(folder))
    pickles = sorted(folder.glob("*.pickle"))
    assert pickles
    stamps = [p.stat().st_mtime_ns for p in pickles]
    assert _values(tmp_path, str(folder)) == first
    assert [p.stat().st_mtime_ns for p in pickles] == stamps  # read, not rewritten


def test_default_cache_is_pints_own_folder_and_off_uses_none(tmp_path):
    _values(tmp_path, "off")
    assert not (tmp_path / "xdg" / "pint").exists()
    _values(tmp_path, None)
    assert list((tmp_path / "xdg" / "pint").glob("*.pickle"))


@pytest.mark.parametrize("damage", ["short", "garbage"])
def test_damaged_cache_falls_back_to_the_definitions(tmp_path, damage):
    # A run killed while pint wrote its pickle leaves a short file; pint still finds the name and
    # tries to read it.
    folder = tmp_path / "cache"
    good = _values(tmp_path, str(folder))
    for p in folder.glob("*.pickle"):
        raw = p.read_bytes()
        p.write_bytes(raw[: len(raw) // 2] if damage == "short" else b"not a pickle at all")
    assert _values(tmp_path, str(folder)) == good


def test_cache_folder_that_cannot_be_made_falls_back(tmp_path):
    blocker = tmp_path / "a-file"
    blocker.write_text("a file where the cache folder's parent should be", encoding="utf-8")
    _values(tmp_path, str(blocker / "cache"))


UNITS = [("bar", "pressure"), ("psi", "pressure"), ("MPa", "pressure"), ("cm^3", "displacement"),
         ("cm^3/rev", "displacement"), ("in^3/rev", "displacement"), ("L/min", "flow"), ("gpm", "flow"),
         ("rpm", "speed"), ("rev/s", "speed"), ("rad/s", "speed"), ("kN*m", "torque"), ("lbf*ft", "torque"),
         ("N * m", "torque"), ("kW", "power"), ("hp", "power"), ("%", "ratio"), ("kg/m^3", "density"),
         ("mm", "length"), ("m/s^2", "acceleration"), ("mm^2/s", "viscosity"), ("deg", "angle"),
         ("kg*m**2", "inertia"), ("t", "mass")]


@given(st.sampled_from(UNITS), st.floats(min_value=0, max_value=1e6, allow_nan=False),
       st.sampled_from(["{x} {u}", "{x}{u}", " {x}  {u} "]))
def test_number_times_cached_scale_equals_the_full_reading(unit_kind, x, form):
    unit, kind = unit_kind
    text = form.format(x=repr(x), u=unit)
    k = units.KINDS[kind]
    assert units.parse(text, kind) == units._read(text, k, *units._split(text, k))  # to the last bit


@pytest.mark.parametrize("text, kind, words", [
    ("250 rpm", "pressure", "'250 rpm' is speed; expected pressure such as '250 bar'"),
    ("250 barr", "pressure", "'250 barr' cannot be read as a quantity"),
    ("25 Hz", "speed", "'25 Hz' gives no turns or angle per time"),
    ("1.8 kJ", "torque", "'1.8 kJ' reads as energy"),
    ("1e308 bar", "pressure", "'1e308 bar' is not a finite number"),
])
def test_refusals_name_the_text_as_written(text, kind, words):
    with pytest.raises(units.UnitProblem, match=words.replace("(", r"\(")):
        units.parse(text, kind)


def test_only_a_plain_scale_is_cached():
    assert units._unit_factor("kN*m", "torque") == pytest.approx(1000.0)
    assert units._unit_factor("rpm", "pressure") is None  # wrong kind: the full reading explains
    assert units._unit_factor("degC", "temperature") is None  # an offset, not a scale
