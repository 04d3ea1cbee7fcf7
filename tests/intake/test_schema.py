"""The schemas read once: inlining the local references changes no verdict and no message (JSON
Schema 2020-12: a "$ref" beside other keywords applies together with them, as "allOf" does); each
field's kind and example come from the schema."""

from __future__ import annotations

import copy

import jsonschema
from helpers import example_data, value_paths
from hypothesis import given, settings
from hypothesis import strategies as st

from specgen.intake import schema as schemas
from specgen.intake.schema import inline_local_refs, schema


def test_refs_are_replaced_and_siblings_kept_beside_them():
    s = {"$defs": {"p": {"type": "string"}, "a~b/c": {"minimum": 0}},
         "properties": {"x": {"$ref": "#/$defs/p"}, "y": {"$ref": "#/$defs/p", "description": "why"},
                        "z": {"$ref": "#/$defs/a~0b~1c"}, "w": {"enum": [{"$ref": "#/$defs/p"}]}}}
    out = inline_local_refs(s)
    assert out["properties"]["x"] == {"type": "string"}
    assert out["properties"]["y"] == {"allOf": [{"type": "string"}], "description": "why"}
    assert out["properties"]["z"] == {"minimum": 0}  # RFC 6901 escapes
    assert out["properties"]["w"] == {"enum": [{"$ref": "#/$defs/p"}]}  # data, not a schema
    assert s["properties"]["x"] == {"$ref": "#/$defs/p"}  # the original is left alone


def test_recursive_ref_is_kept_and_still_validates():
    s = {"$defs": {"node": {"type": "object", "properties": {"next": {"$ref": "#/$defs/node"}},
                            "additionalProperties": False}},
         "$ref": "#/$defs/node"}
    out = inline_local_refs(s)
    assert out["allOf"][0]["properties"]["next"] == {"$ref": "#/$defs/node"}  # inside itself: kept
    v = jsonschema.Draft202012Validator(out)
    assert v.is_valid({"next": {"next": {}}}) and not v.is_valid({"next": {"other": 1}})


_ORIGINAL = jsonschema.Draft202012Validator(schema())
_INLINED = jsonschema.Draft202012Validator(inline_local_refs(schema()))
_BAD = [None, 12, -1, 0.5, True, "x", "12 furlongs", [], {}, {"zz": 1}, [1, "a"]]


_DEMO = example_data()
_ALL = [p for p in value_paths(_DEMO) if p]


def _messages(validator, data) -> list[tuple]:
    """check_schema's sentences as they come from ``validator`` (its schema is the one they read)."""
    return sorted((tuple(map(str, path)), message)
                  for path, message in (schemas.message(e, validator.schema) for e in validator.iter_errors(data)))


@settings(max_examples=150)
@given(st.lists(st.tuples(st.sampled_from(_ALL), st.sampled_from(_BAD + ["delete"])), min_size=1, max_size=3))
def test_inlined_schema_gives_the_same_problems_as_the_original(edits):
    data = copy.deepcopy(_DEMO)
    for path, bad in edits:
        parent = data
        try:
            for part in path[:-1]:
                parent = parent[part]
            if bad == "delete":
                del parent[path[-1]]
            else:
                parent[path[-1]] = copy.deepcopy(bad)
        except (KeyError, IndexError, TypeError):
            continue  # an earlier edit removed or replaced this path
    assert _messages(_INLINED, data) == _messages(_ORIGINAL, data)


def test_demo_is_valid_under_both():
    assert _messages(_ORIGINAL, _DEMO) == _messages(_INLINED, _DEMO) == []


def test_fields_take_their_kind_from_the_schema_definitions():
    data = {"supplies": {"main": {"relief_setting": "250 bar", "pump": {"volumetric_efficiency": "92 %"}}},
            "drives": {"hoist": {"motor": {"displacement": {"min": "40 cm^3", "max": "100 cm^3"}},
                                 "duty_points": {"lift": {"load": {"wheel": {"grade": "8 %"}}}}}}}
    f = schemas.fields(data)
    assert f[("supplies", "main", "relief_setting")].kind == "pressure"
    assert f[("supplies", "main", "pump", "volumetric_efficiency")].kind == "ratio"  # efficiency refs ratio
    assert f[("drives", "hoist", "motor", "displacement", "min")].kind == "displacement"  # the {min, max} shape
    grade = f[("drives", "hoist", "duty_points", "lift", "load", "wheel", "grade")]
    assert grade.kind is None and grade.quantity  # percent or angle: no single kind
    assert f[("drives", "hoist")].noun == "drive" and f[("drives", "hoist", "duty_points", "lift")].noun == "duty point"


def test_a_number_without_its_unit_is_answered_with_the_fields_example():
    data = copy.deepcopy(_DEMO)
    data["supplies"][next(iter(data["supplies"]))]["relief_setting"] = 250
    (error,) = list(schemas.validator().iter_errors(data))
    path, message = schemas.message(error)
    assert path[-1] == "relief_setting"
    assert message == f"'250' has no unit; write it with its unit, e.g. '{schemas.example(error.schema_path)}'"
    assert schemas.example(error.schema_path).endswith(" bar")


def test_each_schema_is_read_once():
    assert schema() is schema() and schemas.parts_schema() is schemas.parts_schema()
    assert schemas.validator() is schemas.validator() and schemas.parts_validator() is schemas.parts_validator()
    assert schemas.parts_validator().is_valid({"format": 1, "motors": {"orbital": ["80 cm^3"]}})
    assert not schemas.parts_validator().is_valid({"format": 1, "motors": {"orbital": [80]}})
