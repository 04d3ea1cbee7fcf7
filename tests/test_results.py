"""The results object: keyed by id (duty results by drive, per-drive values of a supply mode, heat
by supply), the trace order kept, and the assumed inputs listed once from the traces."""

import pytest

from helpers import EXAMPLE, ROOT, minimal
from specgen.intake.read import Source
from specgen.pipeline import evaluate, run_file
from specgen.results import Check, DutyResult, FluidResult, Results, SupplyModeResult
from specgen.trace import Input, Value

LOG_DECK = ROOT / "example_specs" / "log_deck.yaml"


def outcome(data):
    return evaluate(Source("mem.yaml", data, b""))


def value(key, x, *inputs):
    return Value(key, key, key, x, "pressure", inputs=inputs)


def test_duty_results_are_keyed_by_drive_then_duty_in_spec_order():
    r = run_file(EXAMPLE).results
    by_drive = r.duties_by_drive
    assert [(d, u) for d, duties in by_drive.items() for u in duties] == [(x.drive, x.duty) for x in r.duties]
    first = r.duties[0]
    assert r.drive_duties(first.drive)[first.duty] is first is r.duty(first.drive, first.duty)
    assert r.drive_duties("no such drive") == {}


def test_series_values_sit_under_the_drive_id_and_the_trace_keeps_their_place():
    r = run_file(LOG_DECK).results
    s = next(x for x in r.supply_modes if x.per_drive)
    assert set(s.per_drive) == {c.drive for c in s.contributions}
    for drive, values in s.per_drive.items():
        # inlet and outlet running; torque at the limit at that outlet; from rest where a start is needed
        assert {"outlet_pressure", "inlet_pressure", "relief_torque"} <= set(values) <= {
            "outlet_pressure", "inlet_pressure", "relief_torque", "start_outlet_pressure", "breakaway_torque"}
        assert s.drive_value(drive, "inlet_pressure").value >= s.drive_value(drive, "outlet_pressure").value
    assert not any("[" in k for k in s.values)
    keys = list(s.trace)
    # computed order: the line flow, then each drive's outlet and inlet from the return end and its
    # values at the limit and from rest, then the sum
    assert keys[0] == "flow_demand" and keys.index("working_pressure") == 1 + sum(len(v) for v in s.per_drive.values())
    assert all(isinstance(k, tuple) for k in keys[1:keys.index("working_pressure")])
    assert len(s.trace) == len(s.values) + sum(len(v) for v in s.per_drive.values())


def test_mode_heat_load_keeps_its_parts_by_supply():
    r = run_file(EXAMPLE).results
    for m in r.modes:
        assert m.heat_by_supply and sum(m.heat_by_supply.values()) == pytest.approx(m["heat_load"])
        for supply, heat in m.heat_by_supply.items():
            assert r.supply_mode(supply, m.mode)["heat_load"] == heat


def test_proposed_size_names_its_series_as_a_field():
    d = minimal()
    motor = d["drives"]["hoist"]["motor"]
    del motor["displacement"]
    motor["target_pressure"] = "200 bar"
    dr = outcome(d).results.drive_result("hoist")
    assert dr.proposed_from == "R10"
    (c,) = [c for c in outcome(d).results.checks if c.id == "displacement_choice"]
    assert "(R10)" in c.message


def test_fluid_result_is_a_record_with_values():
    r = run_file(EXAMPLE).results
    assert isinstance(r.fluid, FluidResult)
    assert r.fluid["density"] == r.fluid.values["density"].value
    assert outcome(minimal()).results.fluid.values == {}


def test_assumed_walks_every_input_and_lists_each_once_in_the_spec_order():
    def eta(which, x):
        return Input("eta", which, x, "ratio", True, ("drives", "hoist", "motor", "efficiency", which), "typical")

    gear = Input("eta_g", "gear", 0.95, "ratio", True, ("drives", "hoist", "gear_stage", "efficiency"), "typical")
    pump = Input("eta_t", "pump", 0.85, "ratio", True, ("supplies", "main", "pump", "overall_efficiency"), "typical")
    unnamed = Input("VG", "grade", 46, "number", True)  # marks a value as resting on a listed assumption
    duty = DutyResult("hoist", "lift", "driving", {
        "a": value("a", 1.0, gear, eta("starting", 0.8)),
        "b": value("b", 2.0, eta("volumetric", 0.9), eta("starting", 0.8), unnamed)})
    sm = SupplyModeResult("main", "work", (), {"p": value("p", 3.0, pump)})
    r = Results((duty,), (sm,), fluid=FluidResult({"nu": value("nu", 4.0, unnamed)}))
    assert [i.where[-1] for i in r.assumed()] == ["overall_efficiency", "volumetric", "starting", "efficiency"]


def test_assumed_list_of_the_example_includes_the_typical_viscosity():
    listed = [".".join(i.where) for i in run_file(EXAMPLE).results.assumed()]
    assert "fluid.viscosity_100c" in listed and len(listed) == len(set(listed))
    assert listed.index("fluid.viscosity_100c") == len(listed) - 1  # the fluid after supplies and drives


def test_verdict_is_the_most_severe_status():
    def with_statuses(*statuses):
        return Results((), (), checks=tuple(Check("x", "t", s, None, None, "", "m") for s in statuses))

    assert with_statuses().verdict == "pass"
    assert with_statuses("pass", "warn").verdict == "warn"
    assert with_statuses("warn", "fail", "pass").verdict == "fail"
    assert with_statuses("warn", "fail", "pass").counts() == {"pass": 1, "warn": 1, "fail": 1}
