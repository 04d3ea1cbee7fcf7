"""A trace of several cases: each relation once, a column of results a case, numbered relations."""

from __future__ import annotations

from specgen.present.report.grouped import Case, by_source, grouped, number_relations
from specgen.trace import Input, Value


def _v(key, value, formula="q = Vg * n / eta_v", kind="flow", note="", source="motor relations"):
    return Value(key, "Flow demand", "q", value, kind, formula, "displacement times speed",
                 (Input("Vg", "displacement", 1e-4, "displacement"),), source=source, note=note)


def test_each_relation_once_with_a_column_a_case_and_the_unit_once():
    # 1 L/min = 1/60000 m^3/s: 20.50 L/min and 51.25 L/min (hand conversion)
    cases = [Case("harvest", "duty-t-harvest", {"flow_demand": _v("flow_demand", 20.5 / 60000)}),
             Case("transit", "duty-t-transit", {"flow_demand": _v("flow_demand", 51.25 / 60000)})]
    g = grouped("drive-t-duties", "By duty point", cases, "SI", [])
    (row,) = g["rows"]
    assert row["formula"] == "q = Vg * n / eta_v" and row["unit"] == "L/min"
    assert [c["text"] for c in row["cells"]] == ["20.50", "51.25"] and row["span"] is None
    assert [c["anchor"] for c in g["cases"]] == ["duty-t-harvest", "duty-t-transit"]


def test_a_value_the_same_in_every_case_is_written_once_across():
    cases = [Case(m, f"mode-{m}", {"q": _v("q", 1e-3)}) for m in ("a", "b", "c")]
    (row,) = grouped("x", "x", cases, "SI", [])["rows"]
    assert row["span"] == {"text": "60.00", "assumed": False}  # 1e-3 m^3/s = 60.00 L/min


def test_another_branch_of_a_relation_is_its_own_row_and_notes_are_named_by_case():
    cases = [Case("a", "a", {"q": _v("q", 1e-3, note="laminar")}),
             Case("b", "b", {"q": _v("q", 2e-3, formula="q = q_avail", note="turbulent")})]
    rows = grouped("x", "x", cases, "SI", [])["rows"]
    assert [r["formula"] for r in rows] == ["q = Vg * n / eta_v", "q = q_avail"]
    assert rows[0]["cells"][1] is None and rows[1]["cells"][0] is None
    same = grouped("x", "x", [Case("a", "a", {"q": _v("q", 1e-3, note="laminar")}),
                              Case("b", "b", {"q": _v("q", 2e-3, note="turbulent")})], "SI", [])["rows"][0]
    assert same["note"] == "a: laminar; b: turbulent"


def test_checks_split_into_warnings_and_passing():
    checks = [{"target": "a", "status": "warn"}, {"target": "b", "status": "pass"}, {"target": "z", "status": "fail"}]
    g = grouped("x", "x", [Case("a", "a", {"q": _v("q", 1e-3)}), Case("b", "b", {"q": _v("q", 1e-3)})], "SI", checks)
    assert g["problems"] == [checks[0]] and g["passing"] == [checks[1]]


def test_relations_are_numbered_once_in_order_and_listed_under_their_sources():
    a = grouped("x", "x", [Case("a", "a", {"q": _v("q", 1e-3), "p": _v("p", 1.0, "p = dp + p_out", "pressure")})],
                "SI", [])
    b = grouped("y", "y", [Case("b", "b", {"q": _v("q", 2e-3), "g": _v("g", 1.0, "", "pressure", source="")})],
                "SI", [])
    listed = number_relations([a, b])
    assert [x["formula"] for x in listed] == ["q = Vg * n / eta_v", "p = dp + p_out"]
    assert [r["ref"] for r in a["rows"]] == [1, 2] and [r["ref"] for r in b["rows"]] == [1, None]
    assert [g["source"] for g in by_source(listed)] == ["motor relations"]
