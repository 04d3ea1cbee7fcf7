"""Fuzzing: mutated specs end in a result or a clean, located SpecError, never anything else.

Starts from the demo specs and mutates their data (drop keys, replace values with random scalars,
text, quantities in right and wrong units, negatives, NaN, swap types) and their bytes (duplicate,
delete or cut lines, insert tabs and odd bytes, truncate). CI runs the "ci" profile from
conftest.py; a longer search: HYPOTHESIS_PROFILE=long python -m pytest tests/test_fuzz.py
"""

from __future__ import annotations

import copy
from pathlib import Path

import pytest
import yaml
from hypothesis import given, strategies as st

from helpers import EXAMPLE, ROOT, example_data, value_paths
from specgen.errors import SpecError
from specgen.intake.read import load_text
from specgen.pipeline import evaluate
from specgen.present import json_out, text

# The demo, and a second demo with series circuits, load models and a parts file (named by its
# real path, so the parts file beside it is found and its own handling is fuzzed too).
SECOND = ROOT / "example_specs" / "log_deck.yaml"
BASES = [(str(EXAMPLE), example_data(), EXAMPLE.read_bytes())]
if SECOND.exists():
    BASES.append((str(SECOND), yaml.safe_load(SECOND.read_text(encoding="utf-8")), SECOND.read_bytes()))

UNITS = ["bar", "psi", "MPa", "Pa", "kPa", "cm^3", "in^3/rev", "cm^3/rev", "L/min", "gpm", "m^3/s", "rpm",
         "rev/s", "rad/s", "Hz", "1/min", "N*m", "kN*m", "lbf*ft", "J", "kW", "hp", "W", "degC", "degF", "K",
         "kg/m^3", "%", "m", "s", "kg", "", "furlong", "bar^2", "m^3^3", "bar**9**9", "(bar)^2", "degC*m"]
NUMBERS = st.one_of(
    st.floats(allow_nan=True, allow_infinity=True),
    st.integers(min_value=-10**6, max_value=10**6),
    st.sampled_from([0, -0.0, 1e-300, 1e300, 1e-13, 1e13, -1, 0.5, 1.0000001, 100, 10**400]),
)
QUANTITIES = st.builds(lambda n, u, sep: f"{n}{sep}{u}", NUMBERS, st.sampled_from(UNITS), st.sampled_from([" ", "", "  "]))
SCALARS = st.one_of(st.none(), st.booleans(), NUMBERS, st.text(max_size=30), QUANTITIES,
                    st.sampled_from(["", " ", "%", "nan bar", "inf rpm", "-5 bar", "0 cm^3", "1e999 bar", "9**9**9 bar",
                                     "none", "driving", "overrunning", "main", "aux", "vane", "<b>x</b>"]))
VALUES = st.recursive(SCALARS, lambda inner: st.one_of(st.lists(inner, max_size=3),
                                                       st.dictionaries(st.text(max_size=8), inner, max_size=3)),
                      max_leaves=6)


def evaluate_text(raw: bytes, name: str):
    return evaluate(load_text(raw, name))


def get(node, path):
    for part in path:
        node = node[part]
    return node


@st.composite
def mutated_data(draw):
    name, base, _ = draw(st.sampled_from(BASES))
    data = copy.deepcopy(base)
    for _ in range(draw(st.integers(min_value=1, max_value=4))):
        everywhere = list(value_paths(data))[1:]
        if not everywhere:
            break
        path = draw(st.sampled_from(everywhere))
        parent, key = get(data, path[:-1]), path[-1]
        action = draw(st.sampled_from(["drop", "replace", "quantity", "wrap_list", "wrap_dict", "to_text", "rename"]))
        if action == "drop":
            del parent[key]
        elif action == "replace":
            parent[key] = draw(VALUES)
        elif action == "quantity":  # keeps the schema happy more often, so the computation is reached
            parent[key] = draw(st.one_of(QUANTITIES, NUMBERS))
        elif action == "wrap_list":
            parent[key] = [parent[key]]
        elif action == "wrap_dict":
            parent[key] = {"value": parent[key]}
        elif action == "to_text":
            parent[key] = str(parent[key])
        elif action == "rename" and isinstance(parent, dict):
            parent[draw(st.text(min_size=1, max_size=10))] = parent.pop(key)
    return name, yaml.safe_dump(data, sort_keys=False, allow_unicode=True).encode("utf-8")


@st.composite
def mutated_bytes(draw):
    name, _, text = draw(st.sampled_from(BASES))
    lines = text.splitlines(keepends=True)
    for _ in range(draw(st.integers(min_value=1, max_value=3))):
        i = draw(st.integers(min_value=0, max_value=len(lines) - 1))
        action = draw(st.sampled_from(["duplicate", "delete", "tab", "insert", "indent", "cut"]))
        if action == "duplicate":  # duplicate keys, repeated list items
            lines.insert(i, lines[i])
        elif action == "delete":
            del lines[i]
        elif action == "tab":
            lines[i] = lines[i].replace(b"  ", b"\t", 1)
        elif action == "insert":
            lines.insert(i, draw(st.binary(max_size=12)) + draw(st.sampled_from([b"", b"\n"])))
        elif action == "indent":
            lines[i] = b" " * draw(st.integers(min_value=1, max_value=5)) + lines[i]
        elif action == "cut":
            lines[i] = lines[i][: draw(st.integers(min_value=0, max_value=len(lines[i])))]
        if not lines:
            break
    raw = b"".join(lines)
    return name, raw[: draw(st.integers(min_value=0, max_value=len(raw)))] if draw(st.booleans()) else raw


def outcome_or_clean_error(name: str, raw: bytes) -> None:
    try:
        outcome = evaluate_text(raw, name)
    except SpecError as exc:
        assert exc.problems, "a SpecError must carry at least one problem"
        for p in exc.problems:
            line = str(p)
            assert p.location.file and p.message and "\n" not in line, line
            assert p.location.line >= 0 and p.location.column >= 0
        return
    # a spec that computes must also present: every number shown is finite and has its unit
    assert outcome.results.verdict in ("pass", "warn", "fail")
    assert text.render(outcome)
    assert "NaN" not in json_out.render([outcome]) and "Infinity" not in json_out.render([outcome])


@given(mutated_data())
def test_mutated_data_gives_result_or_clean_error(case):
    outcome_or_clean_error(*case)


@given(mutated_bytes())
def test_mutated_bytes_give_result_or_clean_error(case):
    outcome_or_clean_error(*case)


@given(st.binary(max_size=200))
def test_random_bytes_give_result_or_clean_error(raw):
    outcome_or_clean_error("random.yaml", raw)


@pytest.mark.parametrize("name, data, text", BASES, ids=[Path(b[0]).name for b in BASES])
def test_unmutated_demo_computes(name, data, text):
    """The fuzzer's starting points are valid, so mutations explore near a working spec."""
    assert evaluate_text(text, name).results.verdict in ("pass", "warn", "fail")
