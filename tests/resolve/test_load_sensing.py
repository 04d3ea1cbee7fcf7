"""A load-sensing supply resolved through the whole pipeline (specgen/resolve/load_sensing.py).

The rig: hoist needs 210 bar at 60 L/min, slew 90 bar at 30 L/min (motors at efficiency 1, no back
pressure: dp = 2*pi*T/Vg, q = Vg*n), dp_LS 20 bar, pump 100 L/min, eta_t 0.85, relief 250 bar.
Hoist 100 cm^3 at 600 rpm: q = 100e-6 * 10 = 1e-3 m^3/s = 60 L/min; T = 100e-6 * 210e5 / (2*pi)
= 334.22538 N*m. Slew 50 cm^3 at 600 rpm: 30 L/min; T = 50e-6 * 90e5 / (2*pi) = 71.619724 N*m.
Relations: primer section 14 (textbook LS pump relations); the sharing rules are common practice,
no source. Every expected number below is a hand calculation.
"""

import copy

import pytest

BAR, L_MIN = 1e5, 1e-3 / 60

MOTOR = {"kind": "axial_piston", "efficiency": {"volumetric": 1.0, "hydromechanical": 1.0, "starting": 1.0},
         "rating": {"continuous_pressure": "300 bar", "peak_pressure": "350 bar", "max_speed": "3000 rpm"}}


def rig(q_max="100 L/min", valves="post_compensated", **pump) -> dict:
    return copy.deepcopy({
        "format": 1,
        "machine": {"id": "ls-rig", "title": "Load-sensing rig", "revision": "A"},
        "supplies": {"main": {
            "pump": {"delivery": q_max, "overall_efficiency": 0.85, "control": "load_sensing",
                     "ls_margin": "20 bar", **pump},
            "ls_valves": valves, "relief_setting": "250 bar"}},
        "drives": {
            "hoist": {"supply": "main", "motor": {**MOTOR, "displacement": "100 cm^3"}, "load_holding": "brake_valve",
                      "duty_points": {"lift": {"torque": "334.22538 N*m", "speed": "600 rpm"},
                                      "lower": {"torque": "100 N*m", "speed": "300 rpm",
                                                "direction": "overrunning"}}},
            "slew": {"supply": "main", "motor": {**MOTOR, "displacement": "50 cm^3"},
                     "duty_points": {"turn": {"torque": "71.619724 N*m", "speed": "600 rpm"}}}},
        "modes": {"work": {"drives": {"hoist": "lift", "slew": "turn"}},
                  "lowering": {"drives": {"hoist": "lower"}}},
    })


def mode(data: dict, mode_id: str = "work"):
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", data, b"")).results.supply_mode("main", mode_id)


def test_worked_example_pressure_flow_and_throttling():
    r = mode(rig())
    assert r["pump_pressure"] / BAR == pytest.approx(230.0, rel=1e-6)  # 210 + 20
    assert r["pump_delivered_flow"] / L_MIN == pytest.approx(90.0, rel=1e-6)  # 60 + 30
    # hoist 20 bar * 60 L/min = 2.0 kW; slew 140 bar * 30 L/min = 7.0 kW
    assert r.drive_value("hoist", "throttling_loss").value == pytest.approx(2000.0, rel=1e-5)
    assert r.drive_value("slew", "throttling_loss").value == pytest.approx(7000.0, rel=1e-5)
    assert r["heat_throttling"] == pytest.approx(9000.0, rel=1e-5)
    # P_in = 230e5 * 1.5e-3 / 0.85 = 40 588.2 W
    assert r["pump_input_power"] == pytest.approx(40588.2, rel=1e-5)
    # shaft 21 000 + 4 500 W; heat = 40 588.2 - 25 500 = 15 088.2 W = pump loss 6 088.2 + throttling 9 000
    assert r["heat_load"] == pytest.approx(15088.2, rel=1e-5)
    assert r["heat_pump_loss"] == pytest.approx(6088.2, rel=1e-4)
    assert r["heat_drive_loss"] == pytest.approx(0.0, abs=0.01)
    assert r.drive_value("hoist", "reached_speed").value * 60 == pytest.approx(600.0)
    assert "set by hoist" in r.values["pump_pressure"].note


def test_pump_input_torque_follows_the_ls_power():
    d = rig(q_max=None)
    pump = d["supplies"]["main"]["pump"]
    del pump["delivery"]
    pump.update(displacement="100 cm^3", shaft_speed="1000 rpm", volumetric_efficiency=1.0)
    r = mode(d)
    # T = P_in / (2*pi*n) = 40 588.2 / (2*pi*16.667) = 387.59 N*m
    assert r["pump_input_torque"] == pytest.approx(387.59, rel=1e-4)


def test_saturation_with_flow_sharing():
    r = mode(rig(q_max="75 L/min"))
    # each drive gets 75/90 = 0.8333 of its demand: hoist 50, slew 25 L/min, both at 500 rpm
    assert r.drive_value("hoist", "reached_flow").value / L_MIN == pytest.approx(50.0, rel=1e-6)
    assert r.drive_value("slew", "reached_flow").value / L_MIN == pytest.approx(25.0, rel=1e-6)
    assert r.drive_value("slew", "reached_speed").value * 60 == pytest.approx(500.0, rel=1e-6)
    assert r["pump_delivered_flow"] / L_MIN == pytest.approx(75.0, rel=1e-6)
    # throttling at the reached flows: hoist 20e5 * 50/60000 = 1666.7 W, slew 140e5 * 25/60000 = 5833.3 W
    assert r.drive_value("hoist", "throttling_loss").value == pytest.approx(1666.67, rel=1e-5)
    assert r.drive_value("slew", "throttling_loss").value == pytest.approx(5833.33, rel=1e-5)


def test_saturation_with_pre_compensated_valves():
    r = mode(rig(q_max="75 L/min", valves="pre_compensated"))
    # the slew (90 bar) gets its 30 L/min; the hoist what is left, 45 of its 60: 450 rpm
    assert r.drive_value("slew", "reached_flow").value / L_MIN == pytest.approx(30.0, rel=1e-6)
    assert r.drive_value("hoist", "reached_flow").value / L_MIN == pytest.approx(45.0, rel=1e-6)
    assert r.drive_value("hoist", "reached_speed").value * 60 == pytest.approx(450.0, rel=1e-6)


def test_priority_drive_is_served_first():
    d = rig(q_max="75 L/min")
    d["supplies"]["main"]["priority"] = ["hoist"]
    r = mode(d)
    # hoist (priority) gets its 60 L/min; the slew the 15 left
    assert r.drive_value("hoist", "reached_flow").value / L_MIN == pytest.approx(60.0, rel=1e-6)
    assert r.drive_value("slew", "reached_flow").value / L_MIN == pytest.approx(15.0, rel=1e-6)


def test_power_limiter_destrokes_the_pump():
    r = mode(rig(input_power_limit="40 kW"))
    # q_avail = 40 000 * 0.85 / 230e5 = 1.47826e-3 m^3/s = 88.696 L/min < 90: shared 0.98551 each
    assert r["pump_available_flow"] / L_MIN == pytest.approx(88.696, rel=1e-4)
    assert r.drive_value("hoist", "reached_flow").value / L_MIN == pytest.approx(60 * 88.696 / 90, rel=1e-4)
    # the pump takes exactly its limit: 230e5 * 1.47826e-3 / 0.85 = 40 000 W
    assert r["pump_input_power"] == pytest.approx(40000.0, rel=1e-6)


def test_torque_limiter_at_the_pump_shaft_speed():
    d = rig(input_torque_limit="250 N*m")
    pump = d["supplies"]["main"]["pump"]
    del pump["delivery"]
    pump.update(displacement="100 cm^3", shaft_speed="1000 rpm", volumetric_efficiency=1.0)
    r = mode(d)
    # P = 2*pi*16.6667*250 = 26 179.9 W; q = 26 179.9 * 0.85 / 230e5 = 9.6752e-4 m^3/s = 58.051 L/min
    assert r["pump_power_limit"] == pytest.approx(26179.9, rel=1e-5)
    assert r["pump_available_flow"] / L_MIN == pytest.approx(58.051, rel=1e-4)
    assert r["pump_input_torque"] == pytest.approx(250.0, rel=1e-6)


def test_relief_caps_the_pump_pressure_and_the_margin():
    d = rig()
    d["supplies"]["main"]["relief_setting"] = "220 bar"
    r = mode(d)
    # 210 + 20 > 220: capped; 10 bar of margin left: flow sharing scales both by sqrt(10/20) = 0.70711
    assert r["pump_pressure"] / BAR == pytest.approx(220.0)
    assert "capped by the relief setting" in r.values["pump_pressure"].note
    assert r.drive_value("hoist", "reached_flow").value / L_MIN == pytest.approx(60 * 0.707107, rel=1e-5)
    assert r.drive_value("slew", "reached_flow").value / L_MIN == pytest.approx(30 * 0.707107, rel=1e-5)
    # relief open: the pump strokes to 100 L/min; (100 - 63.640) L/min over 220 bar = 13 332 W
    assert r["pump_delivered_flow"] / L_MIN == pytest.approx(100.0)
    assert r["heat_surplus_loss"] == pytest.approx((100 - 90 * 0.707107) * L_MIN * 220 * BAR, rel=1e-5)


def test_relief_cap_with_pre_compensated_valves_slows_only_the_highest():
    d = rig(valves="pre_compensated")
    d["supplies"]["main"]["relief_setting"] = "220 bar"
    r = mode(d)
    # slew has 130 bar across its section: full 30 L/min; hoist 10 bar: 60 * sqrt(0.5) = 42.426 L/min
    assert r.drive_value("slew", "reached_flow").value / L_MIN == pytest.approx(30.0, rel=1e-6)
    assert r.drive_value("hoist", "reached_flow").value / L_MIN == pytest.approx(42.426, rel=1e-4)


def test_flow_divider_split_and_loss():
    d = rig(q_max="120 L/min")
    d["supplies"]["main"]["flow_divider"] = {"drives": ["hoist", "slew"], "ratio": 0.6, "pressure_drop": "10 bar"}
    r = mode(d)
    # inlet max(60/0.6, 30/0.4) = 100 L/min at max(210, 90) + 10 = 220 bar; pump 240 bar
    assert r["flow_divider_demand"] / L_MIN == pytest.approx(100.0, rel=1e-6)
    assert r["flow_divider_pressure"] / BAR == pytest.approx(220.0, rel=1e-6)
    assert r["pump_pressure"] / BAR == pytest.approx(240.0, rel=1e-6)
    # legs 60 and 40 L/min: the slew runs faster, 600 * 40/30 = 800 rpm
    assert r.drive_value("slew", "reached_flow").value / L_MIN == pytest.approx(40.0, rel=1e-6)
    assert r.drive_value("slew", "reached_speed").value * 60 == pytest.approx(800.0, rel=1e-6)
    # divider: 10e5 * 100/60000 + 120e5 * 40/60000 = 1666.67 + 8000 = 9666.67 W
    assert r["flow_divider_loss"] == pytest.approx(9666.67, rel=1e-5)
    # throttling: hoist 30e5 * 1e-3 = 3000 W, slew 150e5 * 40/60000 = 10 000 W (the divider's loss inside)
    assert r.drive_value("hoist", "throttling_loss").value == pytest.approx(3000.0, rel=1e-5)
    assert r.drive_value("slew", "throttling_loss").value == pytest.approx(10000.0, rel=1e-5)


def test_standby_pressure_when_nothing_takes_flow():
    d = rig(standby_pressure="25 bar")
    r = mode(d, "lowering")
    assert r["pump_pressure"] / BAR == pytest.approx(25.0)
    assert r["pump_input_power"] == 0.0
    # not given: the margin, marked assumed
    r = mode(rig(), "lowering")
    assert r["pump_pressure"] / BAR == pytest.approx(20.0)
    assert r.values["pump_pressure"].assumed


def test_a_corner_moves_the_margin():
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    d = rig()
    d["supplies"]["main"]["prime_mover_power"] = "41 kW"
    d["corners"] = {"high_margin": {"title": "Margin at the top of its tolerance", "scale": {
        "supplies.main.pump.ls_margin": "+50 %"}}}
    r = evaluate(Source("mem.yaml", d, b"")).results
    # nominal: 230 bar, P_in 40 588 W against 41 kW: (41 000 - 40 588)/41 000 = 1.0 %, a warning;
    # at the corner dp_LS 30 bar: 240e5 * 1.5e-3 / 0.85 = 42 353 W > 41 kW: fail, reported at the corner
    assert r.supply_mode("main", "work")["pump_pressure"] / BAR == pytest.approx(230.0, rel=1e-6)
    c = next(c for c in r.checks if c.id == "prime_mover_power" and c.mode == "work")
    assert (c.status, c.corner) == ("fail", "high_margin")
    assert c.value == pytest.approx(42352.9, rel=1e-5)


@pytest.mark.parametrize("q_max, valves, relief, limit", [
    ("100 L/min", "post_compensated", "250 bar", None), ("75 L/min", "pre_compensated", "250 bar", None),
    ("100 L/min", "post_compensated", "220 bar", None), ("100 L/min", "pre_compensated", "220 bar", "30 kW"),
])
def test_heat_terms_add_up_to_the_heat_load(q_max, valves, relief, limit):
    # first law: P_in - P_shaft = pump loss + throttling + flow over relief + lines, valve drops and motors
    d = rig(q_max=q_max, valves=valves, **({"input_power_limit": limit} if limit else {}))
    d["supplies"]["main"]["relief_setting"] = relief
    r = mode(d)
    parts = sum(r.values[k].value for k in ("heat_pump_loss", "heat_throttling", "heat_surplus_loss",
                                            "heat_drive_loss") if k in r.values)
    assert parts == pytest.approx(r["heat_load"], rel=1e-9)
    assert r["heat_load"] == pytest.approx(r["pump_input_power"] - r["useful_shaft_power"], rel=1e-9)
    assert r["pump_delivered_flow"] <= r["pump_available_flow"] * (1 + 1e-12)
