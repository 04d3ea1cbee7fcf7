"""Wrong passes the pressure budget removes: series drives at their own inlet and from rest, one
pressure limit per drive, starting from a load that acts at standstill, braking drives that draw
no pump power. Every number is a hand calculation shown beside it (motor relations of the
fluid-power textbook: T = Vg*dp*eta/(2*pi), dp = 2*pi*T/(Vg*eta); gear stage T_m = T_L/(i*eta_g))."""

import math

import pytest

from helpers import minimal, spec_check, spec_checks


def results(data: dict):
    from specgen.intake.read import Source
    from specgen.pipeline import evaluate

    return evaluate(Source("mem.yaml", data, b"")).results


def series(start_torque: str | None = "450 N*m") -> dict:
    """Two 200 cm^3 motors in series at about 150 bar each; relief 330 bar, return 5 bar, continuous
    rating 250 bar. T for 150 bar: 200e-6 * 150e5 * 0.9 / (2*pi) = 429.718 N*m."""
    d = minimal()
    d["supplies"]["main"].update({"circuit": "series", "relief_setting": "330 bar", "prime_mover_power": "90 kW"})
    d["supplies"]["main"]["pump"]["displacement"] = "60 cm^3"
    motor = {"kind": "radial_piston", "displacement": "200 cm^3",
             "efficiency": {"volumetric": 0.95, "hydromechanical": 0.9, "starting": 0.8},
             "rating": {"continuous_pressure": "250 bar", "peak_pressure": "350 bar", "max_speed": "500 rpm"}}
    duty = {"torque": "429.718 N*m", "speed": "100 rpm"}
    if start_torque:
        duty["starting_torque"] = start_torque
    d["drives"] = {"upstream": {"supply": "main", "motor": dict(motor), "duty_points": {"run": dict(duty)}},
                   "downstream": {"supply": "main", "motor": dict(motor), "duty_points": {"run": dict(duty)}}}
    d["modes"] = {"work": {"drives": {"upstream": "run", "downstream": "run"}}}
    return d


def test_series_upstream_inlet_fails_continuous_rating():
    # upstream inlet = 5 + 150 + 150 = 305 bar > 250 bar (before: its own 155 bar passed)
    c = spec_check(series(), "continuous_pressure", drive="upstream", mode="work")
    assert c.value / 1e5 == pytest.approx(305.0, abs=1e-3)
    assert c.status == "fail"
    assert "305.0 bar" in c.message
    c = spec_check(series(), "continuous_pressure", drive="downstream", mode="work")
    assert c.value / 1e5 == pytest.approx(155.0, abs=1e-3) and c.status == "pass"


def test_series_breakaway_with_downstream_starting():
    # downstream starting differential 2*pi*450 / (200e-6 * 0.8) = 176.715 bar; upstream outlet at
    # start 5 + 176.715 = 181.715 bar; upstream breakaway 200e-6 * (330 - 181.715)e5 * 0.8 / (2*pi)
    # = 377.60 N*m < 450 N*m: fail (before: 200e-6 * 325e5 * 0.8 / (2*pi) = 827.6 N*m, pass)
    c = spec_check(series(), "breakaway", drive="upstream", mode="work")
    assert c.value == pytest.approx(200e-6 * (330e5 - 181.7146e5) * 0.8 / (2 * math.pi), rel=1e-5)
    assert c.value == pytest.approx(377.60, abs=0.01)
    assert c.status == "fail"
    # the downstream motor has only the return at its outlet: 200e-6*325e5*0.8/(2*pi) = 827.6 N*m
    c = spec_check(series(), "breakaway", drive="downstream", mode="work")
    assert c.value == pytest.approx(827.606, abs=0.01) and c.status == "pass"


def test_series_torque_at_limit_uses_series_outlet():
    # upstream outlet running = downstream inlet 155 bar: T = 200e-6*(330-155)e5*0.9/(2*pi) = 501.34 N*m
    sm = results(series()).supply_mode("main", "work")
    assert sm.drive_value("upstream", "relief_torque").value == pytest.approx(501.338, abs=0.01)


def compensated(comp: str = "240 bar") -> dict:
    d = minimal()
    d["supplies"]["main"]["pump"].update({"control": "pressure_compensated", "compensator_setting": comp})
    d["drives"]["hoist"]["duty_points"]["lift"]["starting_torque"] = "330 N*m"
    return d


def test_one_pressure_limit_per_drive():
    # relief 250 bar, compensator 240 bar: the limit is 240 bar. Breakaway
    # 100e-6 * (240 - 5)e5 * 0.85 / (2*pi) = 317.912 N*m < 330 N*m: fail (at the relief: 331.44, pass)
    r = results(compensated())
    assert r.drive_result("hoist")["pressure_limit"] == pytest.approx(240e5)
    assert "compensator" in r.drive_result("hoist").values["pressure_limit"].note
    assert r.duty("hoist", "lift")["relief_torque"] == pytest.approx(100e-6 * 235e5 * 0.9 / (2 * math.pi))
    c = spec_check(compensated(), "breakaway", drive="hoist")
    assert c.value == pytest.approx(317.912, abs=0.001) and c.status == "fail"
    assert "compensator setting 240.0 bar" in c.message


def test_port_relief_governs_the_limit_and_the_peak_check():
    d = minimal()
    d["supplies"]["main"]["relief_setting"] = "380 bar"   # above the 350 bar peak rating
    d["drives"]["hoist"]["port_relief"] = "230 bar"
    r = results(d)
    assert r.drive_result("hoist")["pressure_limit"] == pytest.approx(230e5)
    c = spec_check(d, "peak_pressure", drive="hoist")
    assert c.value == pytest.approx(230e5) and c.status == "pass"   # the motor never sees the 380 bar
    del d["drives"]["hoist"]["port_relief"]
    assert spec_check(d, "peak_pressure", drive="hoist").status == "fail"
    # pressure margin against 230 bar: inlet 205 bar, (230 - 205)/230 = 10.87 %: pass
    d["drives"]["hoist"]["port_relief"] = "230 bar"
    c = spec_check(d, "pressure_margin", drive="hoist")
    assert c.margin == pytest.approx((230 - 205.0) / 230, abs=1e-4)


def winch(start_eff=None) -> dict:
    """30 kN on a 400 mm effective drum (390 mm drum, 10 mm rope, layer 1: 0.39 + 0.01 = 0.40 m)
    through 5:1 at 0.95; a 400 cm^3 motor, eta_start 0.80, relief 250 bar over a 5 bar return."""
    d = minimal()
    h = d["drives"]["hoist"]
    h["motor"].update({"displacement": "400 cm^3"})
    h["motor"]["efficiency"]["starting"] = 0.8
    h["gear_stage"] = {"ratio": 5, "efficiency": 0.95}
    if start_eff is not None:
        h["gear_stage"]["starting_efficiency"] = start_eff
    h["duty_points"] = {"hoist": {"load": {"winch": {"line_pull": "30 kN", "line_speed": "0.2 m/s",
                                                      "drum_diameter": "390 mm", "rope_diameter": "10 mm",
                                                      "layer": 1}}}}
    d["modes"]["work"]["drives"] = {"hoist": "hoist"}
    return d


def test_winch_start_from_rest_fails():
    # need 30000 * 0.2 / (5 * 0.95) = 1263.16 N*m; have 400e-6 * 245e5 * 0.8 / (2*pi) = 1247.77 N*m: fail
    c = spec_check(winch(), "breakaway", drive="hoist")
    assert c.limit == pytest.approx(1263.158, abs=0.001)
    assert c.value == pytest.approx(1247.775, abs=0.001)
    assert c.status == "fail"
    need = results(winch()).duty("hoist", "hoist").values["starting_torque_motor"]
    assert any(i.assumed for i in need.inputs)  # the running gear efficiency taken from rest


def test_gear_starting_efficiency_is_used():
    # 0.90 from rest: 6000 / (5 * 0.90) = 1333.33 N*m needed
    c = spec_check(winch(0.9), "breakaway", drive="hoist")
    assert c.limit == pytest.approx(1333.333, abs=0.001)


def test_explicit_starting_torque_wins_where_larger():
    d = winch()
    d["drives"]["hoist"]["duty_points"]["hoist"]["starting_torque"] = "7 kN*m"  # 7000/(5*0.95) = 1473.68
    assert spec_check(d, "breakaway", drive="hoist").limit == pytest.approx(1473.684, abs=0.001)
    d["drives"]["hoist"]["duty_points"]["hoist"]["starting_torque"] = "5 kN*m"  # the static 6000 N*m governs
    assert spec_check(d, "breakaway", drive="hoist").limit == pytest.approx(1263.158, abs=0.001)


def test_wheel_start_on_a_grade():
    # 8000 kg, c_rr 0.08, 18 %: F = 8000*9.80665*(0.08*0.984183 + 0.177153) = 20075.2 N at rest;
    # per track on a 0.3 m sprocket: 20075.2 * 0.3 / 2 = 3011.28 N*m
    d = minimal()
    d["drives"]["hoist"]["duty_points"] = {"climb": {"load": {"wheel": {
        "vehicle_mass": "8 t", "rolling_resistance": 0.08, "grade": "18 %", "rolling_radius": "300 mm",
        "driven_wheels": 2, "travel_speed": "0.05 m/s"}}}}
    d["modes"]["work"]["drives"] = {"hoist": "climb"}
    assert spec_check(d, "breakaway", drive="hoist").limit == pytest.approx(3011.28, abs=0.05)


def test_fan_load_has_nothing_to_start():
    # a speed-squared load puts no torque on the shaft at rest: the check runs with nothing needed
    d = minimal()
    d["drives"]["hoist"]["duty_points"] = {"fan": {"load": {"speed_squared": {
        "reference_torque": "30 N*m", "reference_speed": "2000 rpm", "speed": "1000 rpm"}}}}
    d["modes"]["work"]["drives"] = {"hoist": "fan"}
    c = spec_check(d, "breakaway", drive="hoist")
    assert c.limit == 0.0 and c.status == "pass"
    # a direct torque with no starting torque gives no load to start from: no check
    assert spec_checks(minimal(), "breakaway") == []


def test_sizing_meets_the_start():
    # target 200 bar: the running motor torque is 6000/(5*0.95) = 1263.16 N*m ->
    # Vg = 2*pi*1263.16/((200-5)e5*0.9) = 452.2 cm^3; from rest at the
    # 250 bar limit with eta_start 0.8: 2*pi*1263.16/((250-5)e5*0.8) = 404.9 cm^3 (running governs).
    # With eta_start 0.6: 2*pi*1263.16/(245e5*0.6) = 539.91 cm^3 governs.
    d = winch()
    del d["drives"]["hoist"]["motor"]["displacement"]
    d["drives"]["hoist"]["motor"]["target_pressure"] = "200 bar"
    r = results(d).drive_result("hoist")
    assert r["minimum_displacement"] * 1e6 == pytest.approx(452.23, abs=0.01)
    d["drives"]["hoist"]["motor"]["efficiency"]["starting"] = 0.6
    r = results(d).drive_result("hoist")
    assert r["minimum_displacement"] * 1e6 == pytest.approx(539.909, abs=0.01)


def test_duration_picks_the_rating_step():
    d = minimal()   # inlet 205 bar
    d["drives"]["hoist"]["motor"]["rating"].update({"continuous_pressure": "200 bar",
                                                    "intermittent_pressure": "230 bar",
                                                    "intermittent_share": "10 %"})
    assert spec_check(d, "continuous_pressure", drive="hoist").status == "fail"
    d["drives"]["hoist"]["duty_points"]["lift"]["duration"] = "intermittent"
    c = spec_check(d, "continuous_pressure", drive="hoist")
    assert c.status == "pass" and c.limit == pytest.approx(230e5) and "10%" in c.message
    del d["drives"]["hoist"]["motor"]["rating"]["intermittent_pressure"]   # falls back: stricter
    assert spec_check(d, "continuous_pressure", drive="hoist").status == "fail"
    d["drives"]["hoist"]["duty_points"]["lift"]["duration"] = "peak"
    assert spec_check(d, "continuous_pressure", drive="hoist").limit == pytest.approx(350e5)


def test_directional_valve_drops_follow_the_square_of_flow():
    # q = 100 cm^3 * 500 rpm / 0.95 = 52.632 L/min; at 60 L/min the drops are 8 and 6 bar:
    # to motor 8 * (52.632/60)^2 = 6.156 bar, to tank 6 * (52.632/60)^2 = 4.617 bar (orifice law)
    d = minimal()
    d["drives"]["hoist"]["directional_valve"] = {"rated_flow": "60 L/min", "drop_to_motor": "8 bar",
                                                 "drop_to_tank": "6 bar"}
    r = results(d).duty("hoist", "lift")
    ratio = (100 * 500 / 0.95 / 1000 / 60) ** 2
    assert r["valve_drop_to_motor"] == pytest.approx(8e5 * ratio)
    assert r["back_pressure"] == pytest.approx(5e5 + 6e5 * ratio)
    assert r["supply_pressure_required"] == pytest.approx(r["inlet_pressure"] + 8e5 * ratio)
    assert r["inlet_pressure"] == pytest.approx(200e5 + 5e5 + 6e5 * ratio, rel=1e-4)
