"""Numbers as the report shows them and formulas with the numbers put in (present/report/values.py)."""

from __future__ import annotations

from specgen.present.report.values import Segment, plain, show, slug, substitute
from specgen.trace import Input, Value


def _torque() -> Value:
    # hand calculation: T = T_L / (i * eta_g) = 1200 / (30 * 0.94) = 42.55 N*m
    return Value("motor_torque", "Motor torque", "T", 1200 / (30 * 0.94), "torque", "T = T_L / (i * eta_g)", "",
                 (Input("T_L", "load torque", 1200.0, "torque"), Input("i", "gear ratio", 30.0, "ratio"),
                  Input("eta_g", "gear efficiency", 0.94, "ratio", assumed=True)))


def test_formula_gets_each_input_in_place_of_its_symbol_and_marks_assumed_ones():
    parts = substitute(_torque(), "SI")
    assert "".join(p.text for p in parts) == "T = (1200 N\u00b7m) / (30.00 * 0.9400)"
    assert [p.text for p in parts if p.assumed] == ["0.9400"]  # the defaulted gear efficiency


def test_sums_are_written_out_term_by_term():
    q = Value("flow_demand", "Flow demand", "q_sum", 3e-3, "flow", "q_sum = sum(q_i)", "",
              (Input("q_a", "a", 1e-3, "flow"), Input("q_b", "b", 2e-3, "flow")))
    # 1e-3 m^3/s = 60 L/min; 2e-3 m^3/s = 120 L/min (hand calculation)
    assert substitute(q, "SI") == [Segment("q_sum = "), Segment("60.00 L/min"), Segment(" + "),
                                   Segment("120.0 L/min")]


def test_ratios_plain_efficiencies_in_percent_and_numbers_in_display_units():
    assert show(30.0, "ratio", "SI", "i", "gear ratio") == "30.00"
    assert show(0.94, "ratio", "SI", "eta_g", "gear efficiency") == "94.00 %"
    assert show(None, "pressure", "SI") == "-"
    assert abs(plain(25e6, "pressure", "SI") - 250.0) < 1e-9  # 25 MPa = 250 bar
    assert abs(plain(25e6, "pressure", "US") - 3625.94) < 0.01  # 25e6 Pa / 6894.757 Pa/psi (pint)
    assert slug("drive 1/a") == "drive-1-a" and slug("///") == "x"
